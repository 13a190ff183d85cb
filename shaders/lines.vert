#version 330 core
// lines.vert: one corner of a wide line segment's quad (the core profile has no wide lines).
// Every corner carries both ends of its segment; the ends are pulled a little toward the eye so
// a curve lying on the surface is not buried in the flat triangles that approximate it, taken
// to window pixels, and the corner is placed beyond its end by half the width plus a pixel
// (along and across the segment) so that round caps and the antialiased rim fit.
// lines.frag then measures each pixel's distance to the segment.

layout (location = 0) in vec3 a_start;
layout (location = 1) in vec3 a_end;
layout (location = 2) in vec4 a_colour;     // of this corner's end
layout (location = 3) in float a_width;     // widget pixels
layout (location = 4) in vec2 a_corner;     // x: 0 at the start, 1 at the end; y: side, -1 or 1

uniform mat4 u_view;
uniform mat4 u_proj;
uniform float u_bias;           // fraction of the eye distance to move toward the eye
uniform float u_px_scale;       // device pixels per widget pixel (HiDPI)
uniform vec2 u_viewport;        // pixels

flat out vec2 f_a;              // segment ends in window pixels
flat out vec2 f_b;
flat out float f_half_width;
out vec4 f_colour;

vec4
to_clip (vec3 position)
{
  vec4 p = u_view * vec4 (position, 1.0);
  p.xyz *= 1.0 - u_bias;
  return u_proj * p;
}

vec2
to_window (vec4 clip)
{
  return (clip.xy / clip.w * 0.5 + 0.5) * u_viewport;
}

void
main ()
{
  vec4 c0 = to_clip (a_start);
  vec4 c1 = to_clip (a_end);
  vec2 a, b, dir, side, window;
  vec4 clip;
  float half_width, pad;

  f_colour = a_colour;
  // A segment reaching behind the eye would flip through infinity: put all four corners at
  // one point outside the clip volume, so both triangles are dropped.
  if (c0.w <= 0.0 || c1.w <= 0.0)
    {
      f_a = f_b = vec2 (0.0);
      f_half_width = 0.0;
      gl_Position = vec4 (2.0, 2.0, 2.0, 1.0);
      return;
    }
  a = to_window (c0);
  b = to_window (c1);
  dir = b - a;
  dir = length (dir) > 1e-4 ? normalize (dir) : vec2 (1.0, 0.0);
  side = vec2 (-dir.y, dir.x);
  half_width = 0.5 * max (a_width * u_px_scale, 1.0);
  pad = half_width + 1.0;

  window = (a_corner.x < 0.5 ? a - dir * pad : b + dir * pad) + side * (pad * a_corner.y);
  clip = a_corner.x < 0.5 ? c0 : c1;
  gl_Position = vec4 ((window / u_viewport * 2.0 - 1.0) * clip.w, clip.z, clip.w);
  f_a = a;
  f_b = b;
  f_half_width = half_width;
}
