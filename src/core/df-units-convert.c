/* df-units-convert.c: a loop's, a geodesic's and a probe's figures in other length units (see
 * df-units-convert.h). Plain C; no GLib. */
#include "df-units-convert.h"

void
df_loop_result_convert (df_loop_result *r, df_unit from, df_unit to)
{
  df_display_units du;

  df_display_units_init (&du, from);
  du.length = du.curvature = to;
  df_loop_result_convert_display (r, &du);
}

void
df_loop_result_convert_display (df_loop_result *r, const df_display_units *du)
{
  df_unit from = du->model, to = du->length, cu = du->curvature;

  if (r == NULL || (from == to && from == cu))
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
      s->K = df_unit_gaussian (s->K, from, cu);
    }
  r->mean_K = df_unit_gaussian (r->mean_K, from, cu);
}

void
df_geodesic_result_convert (df_geodesic_result *r, df_unit from, df_unit to)
{
  if (r == NULL || from == to)
    return;
  r->length = df_unit_length (r->length, from, to);
  for (size_t i = 0; i < r->n_samples; i++)
    {
      r->samples[i].s = df_unit_length (r->samples[i].s, from, to);
      for (int c = 0; c < 3; c++)
        r->samples[i].point[c] = df_unit_length (r->samples[i].point[c], from, to);
    }
}

void
df_point_geometry_convert (df_point_geometry *g, df_unit from, df_unit to)
{
  df_display_units du;

  df_display_units_init (&du, from);
  du.length = du.curvature = to;
  df_point_geometry_convert_display (g, &du);
}

void
df_point_geometry_convert_display (df_point_geometry *g, const df_display_units *du)
{
  df_unit from = du->model, to = du->length, cu = du->curvature;

  if (g == NULL || (from == to && from == cu))
    return;
  for (int c = 0; c < 3; c++)
    g->point[c] = df_unit_length (g->point[c], from, to);
  g->K = df_unit_gaussian (g->K, from, cu);
  g->H = df_unit_curvature (g->H, from, cu);
  g->k1 = df_unit_curvature (g->k1, from, cu);
  g->k2 = df_unit_curvature (g->k2, from, cu);
}

const char *
df_display_units_gaussian_label (const df_display_units *du)
{
  static const char *const labels[DF_N_UNITS] = {
    [DF_UNIT_MM] = "1/mm^2", [DF_UNIT_CM] = "1/cm^2", [DF_UNIT_M] = "1/m^2",
    [DF_UNIT_IN] = "1/in^2",
  };

  return du->curvature < DF_N_UNITS ? labels[du->curvature] : "?";
}

const char *
df_display_units_curvature_label (const df_display_units *du)
{
  static const char *const labels[DF_N_UNITS] = {
    [DF_UNIT_MM] = "1/mm", [DF_UNIT_CM] = "1/cm", [DF_UNIT_M] = "1/m", [DF_UNIT_IN] = "1/in",
  };

  return du->curvature < DF_N_UNITS ? labels[du->curvature] : "?";
}
