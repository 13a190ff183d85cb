/* df-camera.h: an orbit camera (turntable about the z axis around a target point) with zoom and
 * pan, as a plain struct; it makes the view and projection matrices and picking rays. cglm, float;
 * no GTK. World z is up, since surfaces of revolution turn about z. */
#pragma once

#include <stdbool.h>
#include <stddef.h>

#include <cglm/cglm.h>

typedef struct
{
  vec3  target;     /* point orbited about and looked at */
  float distance;   /* eye to target */
  float yaw;        /* radians about +z, 0 = eye on +x */
  float pitch;      /* radians above the xy plane, [-pi/2, pi/2] */
  float fov_y;      /* vertical field of view, radians */
  float radius;     /* radius of the scene's bounding sphere: clip planes and zoom limits */
  float aspect;     /* width / height of the view, kept by the owner (for fitting) */
  bool  fitted;     /* df_camera_fit has been called */
} DfCamera;

void df_camera_init        (DfCamera *camera);

/* Aims at the centre of the box [lo, hi] from the distance at which the box's corners, seen at
 * the current angles and aspect, just fit the view with a small margin. Keeps the angles. */
void df_camera_fit         (DfCamera    *camera,
                            const float  lo[3],
                            const float  hi[3]);

/* Like df_camera_fit, but the distance makes the given points (stride floats apart, xyz first)
 * fit rather than the box's corners: a tight fit for round shapes. */
void df_camera_fit_points  (DfCamera    *camera,
                            const float  lo[3],
                            const float  hi[3],
                            const float *points,
                            size_t       n_points,
                            size_t       stride);

/* Adds to the angles (radians); pitch is clamped to the poles, yaw wraps. */
void df_camera_orbit       (DfCamera *camera,
                            float     d_yaw,
                            float     d_pitch);
void df_camera_set_angles  (DfCamera *camera,
                            float     yaw,
                            float     pitch);

/* Multiplies the distance by factor (< 1 comes closer), within 1/50 .. 50 scene radii. */
void df_camera_zoom        (DfCamera *camera,
                            float     factor);

/* Moves the target so the scene follows a pointer drag of (dx, dy) pixels (y down) in a view
 * height_px tall. */
void df_camera_pan         (DfCamera *camera,
                            float     dx,
                            float     dy,
                            float     height_px);

void df_camera_get_eye     (const DfCamera *camera,
                            vec3            eye);
void df_camera_view        (const DfCamera *camera,
                            mat4            view);
/* Perspective with near and far planes around the scene sphere, for depth precision. */
void df_camera_projection  (const DfCamera *camera,
                            float           aspect,
                            mat4            proj);

/* The ray through widget point (x, y) (origin top left) of a width x height view: origin at the
 * eye, unit direction. */
void df_camera_ray         (const DfCamera *camera,
                            float           x,
                            float           y,
                            float           width,
                            float           height,
                            vec3            origin,
                            vec3            dir);
