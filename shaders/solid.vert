#version 330 core
// solid.vert: small lit solids drawn over the surface (arrow heads, the marker ball), with the
// same pull toward the eye as the lines so they sit on the surface rather than in it.

layout (location = 0) in vec3 a_position;
layout (location = 1) in vec3 a_normal;
layout (location = 2) in vec4 a_colour;

uniform mat4 u_view;
uniform mat4 u_proj;
uniform float u_bias;

out vec3 v_normal;
out vec4 v_colour;

void
main ()
{
  vec4 p = u_view * vec4 (a_position, 1.0);
  p.xyz *= 1.0 - u_bias;
  v_normal = mat3 (u_view) * a_normal;
  v_colour = a_colour;
  gl_Position = u_proj * p;
}
