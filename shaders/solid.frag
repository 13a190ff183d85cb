#version 330 core
// solid.frag: head-light shading for the overlay solids, two-sided since cones are open.

in vec3 v_normal;
in vec4 v_colour;

uniform float u_alpha;

out vec4 frag_colour;

void
main ()
{
  vec3 n = normalize (v_normal);
  float light = 0.45 + 0.55 * abs (n.z);
  frag_colour = vec4 (v_colour.rgb * light, v_colour.a * u_alpha);
}
