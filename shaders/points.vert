#version 330 core
// points.vert: measured data points drawn over a fitted surface as small discs, coloured by
// their deviation from the fit. Pulled toward the eye like the lines, so a point on the fit is
// not buried in its flat triangles.

layout (location = 0) in vec3 a_position;
layout (location = 1) in vec3 a_colour;

uniform mat4 u_view;
uniform mat4 u_proj;
uniform float u_bias;
uniform float u_size;           // device pixels across

out vec3 v_colour;

void
main ()
{
  vec4 p = u_view * vec4 (a_position, 1.0);
  p.xyz *= 1.0 - u_bias;
  v_colour = a_colour;
  gl_Position = u_proj * p;
  gl_PointSize = u_size;
}
