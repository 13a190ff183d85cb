#version 330 core
// surface.frag: two-sided lighting (the back of the sheet is lit with its flipped normal and
// drawn a little darker, so the user can tell the side N points to), the diverging colour scale,
// and iso-parameter lines drawn from (u, v) with fwidth() so they stay about one pixel wide at
// any zoom.

in vec3 v_position;
in vec3 v_normal;
in vec2 v_uv;
in float v_value;

uniform int u_shading;
uniform vec3 u_ramp[5];         // colours at -1, -0.5, 0, 0.5, 1 (df_shading_ramp_colour)
uniform vec3 u_plain;
uniform int u_iso;
uniform vec2 u_iso_step;        // chart spacing of the lines in u and v; lines at multiples
uniform float u_back_shade;

out vec4 frag_colour;

vec3
ramp (float s)
{
  float x = clamp ((s + 1.0) * 2.0, 0.0, 4.0);
  int i = int (min (floor (x), 3.0));
  return mix (u_ramp[i], u_ramp[i + 1], x - float (i));
}

// Coverage of a grid line at chart coordinate t (in units of the spacing), antialiased over one
// pixel; fades out where lines crowd closer than a few pixels (near a pole) so they never merge
// into a dark blot.
float
grid_line (float t)
{
  float w = fwidth (t);
  float d = abs (fract (t + 0.5) - 0.5) / max (w, 1e-6);
  float cover = 1.0 - smoothstep (0.4, 1.3, d);
  return cover * (1.0 - smoothstep (0.12, 0.35, w));
}

void
main ()
{
  vec3 n = normalize (v_normal);
  vec3 to_eye = normalize (-v_position);
  bool back = !gl_FrontFacing;
  vec3 base = u_shading == 0 ? u_plain : ramp (v_value);
  // A key light above and to the left of the viewer, plus a head light, plus ambient.
  vec3 key = normalize (vec3 (-0.45, 0.65, 0.6));
  vec3 half_vec;
  float diffuse, spec;
  vec3 colour;

  if (back)
    n = -n;
  diffuse = 0.25 + 0.5 * max (dot (n, key), 0.0) + 0.35 * max (dot (n, to_eye), 0.0);
  half_vec = normalize (key + to_eye);
  spec = 0.16 * pow (max (dot (n, half_vec), 0.0), 40.0);
  colour = base * diffuse + vec3 (spec);
  if (back)
    colour *= u_back_shade;

  if (u_iso != 0)
    {
      vec2 g = v_uv / u_iso_step;
      float line = max (grid_line (g.x), grid_line (g.y));
      colour = mix (colour, colour * 0.35, 0.65 * line);
    }
  frag_colour = vec4 (min (colour, vec3 (1.0)), 1.0);
}
