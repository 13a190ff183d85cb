/* df-units-convert.c: a loop's measured figures in other length units (see
 * df-units-convert.h). Plain C; no GLib. */
#include "df-units-convert.h"

void
df_loop_result_convert (df_loop_result *r, df_unit from, df_unit to)
{
  if (r == NULL || from == to)
    return;
  r->area = df_unit_area (r->area, from, to);
  r->other_area = df_unit_area (r->other_area, from, to);
  r->length = df_unit_length (r->length, from, to);
  r->min_steering_radius = df_unit_length (r->min_steering_radius, from, to);
  r->max_abs_kg = df_unit_curvature (r->max_abs_kg, from, to);
  for (size_t i = 0; i < r->n_samples; i++)
    {
      df_loop_sample *s = &r->samples[i];

      s->s = df_unit_length (s->s, from, to);
      for (int c = 0; c < 3; c++)
        s->point[c] = df_unit_length (s->point[c], from, to);
      s->k_g = df_unit_curvature (s->k_g, from, to);
      s->K = df_unit_gaussian (s->K, from, to);
    }
}
