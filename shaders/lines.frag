#version 330 core
// lines.frag: coverage from the pixel's distance to the segment (a capsule, so consecutive
// segments join with round joins), falling off over one pixel at the rim: antialiasing without
// multisampling, which GtkGLArea does not offer.

flat in vec2 f_a;
flat in vec2 f_b;
flat in float f_half_width;
in vec4 f_colour;

uniform float u_alpha;          // 1 for visible parts, less for the ghost of hidden parts

out vec4 frag_colour;

void
main ()
{
  vec2 p = gl_FragCoord.xy;
  vec2 ab = f_b - f_a;
  float t = clamp (dot (p - f_a, ab) / max (dot (ab, ab), 1e-8), 0.0, 1.0);
  float d = length (p - (f_a + t * ab));
  float cover = clamp (f_half_width + 0.5 - d, 0.0, 1.0);

  if (cover <= 0.0)
    discard;
  frag_colour = vec4 (f_colour.rgb, f_colour.a * cover * u_alpha);
}
