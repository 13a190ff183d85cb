/* df-camera.c: the orbit camera. The eye sits on a sphere about the target at (yaw, pitch); the
 * up vector is the sphere's "north" tangent rather than +z, so looking straight down (a top view)
 * is not degenerate. cglm, float; no GTK. */
#include "df-camera.h"

#include <math.h>

void
df_camera_init (DfCamera *camera)
{
  glm_vec3_zero (camera->target);
  camera->distance = 4;
  camera->yaw = glm_rad (-55);
  camera->pitch = glm_rad (28);
  camera->fov_y = glm_rad (30);
  camera->radius = 1;
  camera->aspect = 1;
  camera->fitted = false;
}

/* Eye direction (target to eye) and the up vector orthogonal to it. */
static void
camera_axes (const DfCamera *camera,
             vec3            back,
             vec3            up)
{
  float cy = cosf (camera->yaw), sy = sinf (camera->yaw);
  float cp = cosf (camera->pitch), sp = sinf (camera->pitch);

  back[0] = cp * cy;
  back[1] = cp * sy;
  back[2] = sp;
  up[0] = -sp * cy;
  up[1] = -sp * sy;
  up[2] = cp;
}

/* Sets target and radius from the box; returns the camera axes. */
static void
fit_box (DfCamera    *camera,
         const float  lo[3],
         const float  hi[3],
         vec3         back,
         vec3         up,
         vec3         right)
{
  vec3 extent;

  for (int i = 0; i < 3; i++)
    {
      camera->target[i] = 0.5f * (lo[i] + hi[i]);
      extent[i] = hi[i] - lo[i];
    }
  camera->radius = 0.5f * glm_vec3_norm (extent);
  if (!(camera->radius > 0) || !isfinite (camera->radius))
    camera->radius = 1;
  camera_axes (camera, back, up);
  glm_vec3_cross (up, back, right);
}

/* A point at (x, y, z) in camera axes (z toward the eye) is inside the frustum when the eye is
 * at least z + |x| / tan_x and z + |y| / tan_y away from the target. */
static float
distance_for (const DfCamera *camera,
              const float     p[3],
              vec3            back,
              vec3            up,
              vec3            right)
{
  float tan_y = tanf (0.5f * camera->fov_y);
  float tan_x = tan_y * (camera->aspect > 0 ? camera->aspect : 1);
  vec3 d = { p[0] - camera->target[0], p[1] - camera->target[1], p[2] - camera->target[2] };
  float z = glm_vec3_dot (d, back);

  return fmaxf (z + fabsf (glm_vec3_dot (d, right)) / tan_x,
                z + fabsf (glm_vec3_dot (d, up)) / tan_y);
}

static void
set_fit_distance (DfCamera *camera,
                  float     distance)
{
  /* 8 % margin; never inside the bounding sphere, where the near plane would cut the scene. */
  camera->distance = fmaxf (1.08f * distance, 1.2f * camera->radius);
  camera->fitted = true;
}

void
df_camera_fit (DfCamera    *camera,
               const float  lo[3],
               const float  hi[3])
{
  vec3 back, up, right;
  float distance = 0;

  fit_box (camera, lo, hi, back, up, right);
  for (int c = 0; c < 8; c++)
    {
      float corner[3];
      for (int i = 0; i < 3; i++)
        corner[i] = (c >> i) & 1 ? hi[i] : lo[i];
      distance = fmaxf (distance, distance_for (camera, corner, back, up, right));
    }
  set_fit_distance (camera, distance);
}

void
df_camera_fit_points (DfCamera    *camera,
                      const float  lo[3],
                      const float  hi[3],
                      const float *points,
                      size_t       n_points,
                      size_t       stride)
{
  vec3 back, up, right;
  float distance = 0;

  fit_box (camera, lo, hi, back, up, right);
  for (size_t i = 0; i < n_points; i++)
    distance = fmaxf (distance, distance_for (camera, &points[i * stride], back, up, right));
  set_fit_distance (camera, distance);
}

void
df_camera_set_angles (DfCamera *camera,
                      float     yaw,
                      float     pitch)
{
  camera->yaw = remainderf (yaw, 2 * GLM_PIf);
  camera->pitch = glm_clamp (pitch, -GLM_PI_2f, GLM_PI_2f);
}

void
df_camera_orbit (DfCamera *camera,
                 float     d_yaw,
                 float     d_pitch)
{
  df_camera_set_angles (camera, camera->yaw + d_yaw, camera->pitch + d_pitch);
}

void
df_camera_zoom (DfCamera *camera,
                float     factor)
{
  if (!(factor > 0) || !isfinite (factor))
    return;
  camera->distance = glm_clamp (camera->distance * factor, camera->radius / 50,
                                camera->radius * 50);
}

void
df_camera_pan (DfCamera *camera,
               float     dx,
               float     dy,
               float     height_px)
{
  vec3 back, up, right;
  float per_px;

  if (!(height_px > 0))
    return;
  camera_axes (camera, back, up);
  glm_vec3_cross (up, back, right);
  /* World units per pixel in the target's plane. */
  per_px = 2 * camera->distance * tanf (0.5f * camera->fov_y) / height_px;
  glm_vec3_muladds (right, -dx * per_px, camera->target);
  glm_vec3_muladds (up, dy * per_px, camera->target);
}

void
df_camera_get_eye (const DfCamera *camera,
                   vec3            eye)
{
  vec3 back, up;

  camera_axes (camera, back, up);
  glm_vec3_copy ((float *) camera->target, eye);
  glm_vec3_muladds (back, camera->distance, eye);
}

void
df_camera_view (const DfCamera *camera,
                mat4            view)
{
  vec3 back, up, eye;

  camera_axes (camera, back, up);
  df_camera_get_eye (camera, eye);
  glm_lookat (eye, (float *) camera->target, up, view);
}

void
df_camera_projection (const DfCamera *camera,
                      float           aspect,
                      mat4            proj)
{
  float near = fmaxf (camera->distance - 1.5f * camera->radius, camera->distance * 0.01f);
  float far = camera->distance + 1.5f * camera->radius;

  glm_perspective (camera->fov_y, aspect > 0 ? aspect : 1, near, far, proj);
}

void
df_camera_ray (const DfCamera *camera,
               float           x,
               float           y,
               float           width,
               float           height,
               vec3            origin,
               vec3            dir)
{
  vec3 back, up, right;
  float half_h = tanf (0.5f * camera->fov_y);
  float half_w = half_h * (height > 0 ? width / height : 1);
  float sx = width > 0 ? 2 * x / width - 1 : 0;
  float sy = height > 0 ? 1 - 2 * y / height : 0;

  camera_axes (camera, back, up);
  glm_vec3_cross (up, back, right);
  df_camera_get_eye (camera, origin);
  glm_vec3_scale (back, -1, dir);
  glm_vec3_muladds (right, sx * half_w, dir);
  glm_vec3_muladds (up, sy * half_h, dir);
  glm_vec3_normalize (dir);
}
