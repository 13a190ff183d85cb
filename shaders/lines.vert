#version 330 core
// lines.vert: one end of a line segment (polyline curves, arrow shafts). The point is pulled a
// little toward the eye so a curve lying on the surface is not buried in the flat triangles
// that approximate it; lines.geom then widens the segment into a screen-space quad.

layout (location = 0) in vec3 a_position;
layout (location = 1) in vec4 a_colour;
layout (location = 2) in float a_width;      // widget pixels

uniform mat4 u_view;
uniform mat4 u_proj;
uniform float u_bias;           // fraction of the eye distance to move toward the eye
uniform float u_px_scale;       // device pixels per widget pixel (HiDPI)

out vec4 g_colour;
out float g_width;

void
main ()
{
  vec4 p = u_view * vec4 (a_position, 1.0);
  p.xyz *= 1.0 - u_bias;
  g_colour = a_colour;
  g_width = a_width * u_px_scale;
  gl_Position = u_proj * p;
}
