#version 330 core
// lines.geom: widens each segment into a quad in screen space (the core profile has no wide
// lines), padded by half the width plus a pixel at both ends so that round caps and the
// antialiased rim fit. The fragment shader measures each pixel's distance to the segment.

layout (lines) in;
layout (triangle_strip, max_vertices = 4) out;

in vec4 g_colour[];
in float g_width[];

uniform vec2 u_viewport;        // pixels

flat out vec2 f_a;              // segment ends in window pixels
flat out vec2 f_b;
flat out float f_half_width;
out vec4 f_colour;

vec2
to_window (vec4 clip)
{
  return (clip.xy / clip.w * 0.5 + 0.5) * u_viewport;
}

void
emit (vec2 window, vec4 clip, vec4 colour)
{
  vec2 ndc = window / u_viewport * 2.0 - 1.0;
  gl_Position = vec4 (ndc * clip.w, clip.z, clip.w);
  f_colour = colour;
  EmitVertex ();
}

void
main ()
{
  vec4 c0 = gl_in[0].gl_Position;
  vec4 c1 = gl_in[1].gl_Position;
  vec2 a, b, dir, side;
  float half_width, pad;

  // A segment reaching behind the eye would flip through infinity: drop it.
  if (c0.w <= 0.0 || c1.w <= 0.0)
    return;
  a = to_window (c0);
  b = to_window (c1);
  dir = b - a;
  dir = length (dir) > 1e-4 ? normalize (dir) : vec2 (1.0, 0.0);
  side = vec2 (-dir.y, dir.x);
  half_width = 0.5 * max (g_width[0], 1.0);
  pad = half_width + 1.0;

  f_a = a;
  f_b = b;
  f_half_width = half_width;
  emit (a - dir * pad - side * pad, c0, g_colour[0]);
  f_a = a; f_b = b; f_half_width = half_width;
  emit (a - dir * pad + side * pad, c0, g_colour[0]);
  f_a = a; f_b = b; f_half_width = half_width;
  emit (b + dir * pad - side * pad, c1, g_colour[1]);
  f_a = a; f_b = b; f_half_width = half_width;
  emit (b + dir * pad + side * pad, c1, g_colour[1]);
  EndPrimitive ();
}
