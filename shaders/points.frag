#version 330 core
// points.frag: a round disc in the point sprite with a one-pixel soft rim (no multisampling
// in GtkGLArea) and a thin dark ring, so a point reads on any surface colour.

in vec3 v_colour;

uniform float u_size;
uniform float u_alpha;

out vec4 frag_colour;

void
main ()
{
  float r = length (gl_PointCoord - vec2 (0.5)) * u_size;   // pixels from the centre
  float half_size = 0.5 * u_size;
  float cover = clamp (half_size - r, 0.0, 1.0);
  float ring = smoothstep (half_size - 1.6, half_size - 0.6, r);

  if (cover <= 0.0)
    discard;
  frag_colour = vec4 (mix (v_colour, vec3 (0.08), 0.75 * ring), cover * u_alpha);
}
