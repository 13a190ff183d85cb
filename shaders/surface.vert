#version 330 core
// surface.vert: the tessellated surface. Passes the view-space position and normal for lighting,
// the chart (u, v) for iso-parameter lines and the curvature value scaled to [-1, 1] for the
// diverging colour scale.

layout (location = 0) in vec3 a_position;
layout (location = 1) in vec3 a_normal;
layout (location = 2) in vec2 a_uv;
layout (location = 3) in vec2 a_curvature;   // (K, H)

uniform mat4 u_view;
uniform mat4 u_proj;
uniform int u_shading;          // 0 plain, 1 Gaussian, 2 mean
uniform float u_inv_range;      // 1 / max |value| (0 when the range is empty), or 1 / (hi - lo)
uniform float u_offset;         // 0, or the end of a one-signed span nearer zero (df-surface-view-gl.c)

out vec3 v_position;
out vec3 v_normal;
out vec2 v_uv;
out float v_value;

void
main ()
{
  vec4 p = u_view * vec4 (a_position, 1.0);
  float raw = u_shading == 1 ? a_curvature.x : (u_shading == 2 ? a_curvature.y : 0.0);

  v_position = p.xyz;
  // The view matrix is a rotation plus translation, so its 3x3 part maps normals too.
  v_normal = mat3 (u_view) * a_normal;
  v_uv = a_uv;
  v_value = clamp ((raw - u_offset) * u_inv_range, -1.0, 1.0);
  gl_Position = u_proj * p;
}
