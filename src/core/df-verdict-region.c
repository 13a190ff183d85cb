/* df-verdict-region.c: max-strain-percent over a loop's enclosed region (see
 * df-verdict-region.h): a grid over the region's box in the loop's own plane picture, the
 * points inside the polygon of its samples, a geodesic disc at each.
 * Plain C + libm + GSL; no GLib. */
#include "df-verdict-region.h"
#include "df-polygon.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "df-verdict-private.h"

df_status
df_verdict_strain (const df_curve *loop, const df_loop_result *result, const df_limits *limits,
                   size_t grid, const df_devmap_options *devmap, df_verdict_list *out,
                   bool *checked, char *note, size_t note_len, df_diag *diag)
{
  const df_limit *lim = &limits->item[DF_LIMIT_MAX_STRAIN];
  const df_surface *surface = df_curve_get_surface (loop);
  df_curve_coords coords = df_curve_get_coords (loop);
  double (*poly)[2] = NULL, lo[2] = { INFINITY, INFINITY }, hi[2] = { -INFINITY, -INFINITY };
  double u0, u1, v0, v1, worst = -1.0, worst_signed = 0.0;
  double best_u = 0.0, best_v = 0.0;
  size_t n, n_in = 0, n_ok = 0;
  df_status st = DF_OK;

  *checked = false;
  note[0] = '\0';
  if (!lim->set)
    return DF_OK;
  if (!limits->patch_size.set)
    {
      snprintf (note, note_len, "max-strain-percent needs [limits] patch-size (the disc radius "
                                "of the map)");
      return DF_OK;
    }
  if (!result->bounds_disc || !result->enclosed_available)
    {
      snprintf (note, note_len, "the loop bounds no disc (%s)", result->disc_note);
      return DF_OK;
    }
  if (coords == DF_COORDS_SPHERE || (coords == DF_COORDS_CHART && result->axis_winding != 0))
    {
      snprintf (note, note_len, "a loop round the axis or round both poles is not sampled yet; "
                                "see the developability map (devmap) for its cap");
      return DF_OK;
    }
  n = df_curve_sample_plane (loop, 256, &poly);
  if (n < 3)
    {
      free (poly);
      return n == 0 ? DF_E_NOMEM : df_diag_fail (diag, DF_E_INPUT, -1, "too few loop points");
    }
  for (size_t i = 0; i < n; i++)
    for (int c = 0; c < 2; c++)
      {
        lo[c] = fmin (lo[c], poly[i][c]);
        hi[c] = fmax (hi[c], poly[i][c]);
      }
  df_surface_get_domain (surface, &u0, &u1, &v0, &v1);
  if (grid == 0)
    grid = DF_REGION_GRID_DEFAULT;
  if (grid < 2)
    grid = 2;
  for (size_t j = 0; j < grid && st == DF_OK; j++)
    for (size_t i = 0; i < grid && st == DF_OK; i++)
      {
        /* Cell centres, so that no point lies on the loop's box. */
        double x = lo[0] + (hi[0] - lo[0]) * (i + 0.5) / grid;
        double y = lo[1] + (hi[1] - lo[1]) * (j + 0.5) / grid;
        double u = x, v = y, r;
        df_devmap_point p;

        if (!df_polygon_contains ((const double (*)[2]) poly, n, x, y))
          continue;
        if (coords != DF_COORDS_CHART)
          {
            /* Pole-centred picture (df-curve.h): |p| is the distance in t from the pole. */
            r = hypot (x, y);
            u = coords == DF_COORDS_POLAR_MIN ? u0 + r : u1 - r;
            v = atan2 (y, x);
          }
        n_in++;
        if ((st = df_devmap_at (surface, u, v, limits->patch_size.model_value, devmap, &p,
                                diag)) != DF_OK)
          break;
        if (!p.ok)
          continue;
        n_ok++;
        if (fabs (p.strain) > worst)
          {
            worst = fabs (p.strain);
            worst_signed = p.strain;
            best_u = u;
            best_v = v;
          }
      }
  free (poly);
  if (st != DF_OK)
    return st;
  if (n_ok == 0)
    {
      snprintf (note, note_len, "no disc of radius %g fits round the %zu sample point%s inside "
                                "the loop", limits->patch_size.model_value, n_in,
                n_in == 1 ? "" : "s");
      return DF_OK;
    }
  {
    df_verdict v = { .limit = DF_LIMIT_MAX_STRAIN, .region = true, .has_value = true,
                     .value = 100.0 * worst, .threshold = lim->model_value };
    df_chart_jet jet;

    v.within = !(v.value > v.threshold);
    v.u_worst = best_u;
    v.v_worst = best_v;
    if ((st = df_surface_eval (surface, best_u, best_v, 0, &jet, diag)) != DF_OK)
      return st;
    memcpy (v.point_worst, jet.x, sizeof v.point_worst);
    /* The sign says which way: > 0 the flat rim must shrink (K > 0), < 0 stretch. */
    v.signed_value = 100.0 * worst_signed;
    *checked = true;
    return _df_verdict_push (out, &v);
  }
}
