/* df-verdict-shear.c: max-shear-deg over a loop's enclosed region by a drape of the loop (see
 * df-verdict-shear.h): the start, warp and cell (given or defaulted), the net without its
 * closure check, the worst cell and the cells past the locking angle.
 * Plain C + libm + GSL; no GLib. */
#include "df-verdict-shear.h"
#include "df-polygon.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "df-drape.h"
#include "df-verdict-private.h"

/* Even-odd rule, as the region verdicts use. */
size_t
df_shear_outline (const df_curve *loop, size_t n_points, double (**out)[2])
{
  size_t n_min = 8 * n_points > 2048 ? 8 * n_points : 2048;

  return df_curve_sample_plane (loop, n_min, out);
}

/* The default start: the polygon's area centroid when it lies inside; else its first point
 * moved inward along the inner normal by a small part of the box (halved until inside).
 * False when neither gives a point inside. */
static bool
default_start (const double (*poly)[2], size_t n, double start[2], bool *moved)
{
  double a = 0, cx = 0, cy = 0, lo[2] = { INFINITY, INFINITY }, hi[2] = { -INFINITY, -INFINITY };

  for (size_t i = 0, j = n - 1; i < n; j = i++)
    {
      double cr = poly[j][0] * poly[i][1] - poly[i][0] * poly[j][1];

      a += cr;
      cx += (poly[j][0] + poly[i][0]) * cr;
      cy += (poly[j][1] + poly[i][1]) * cr;
      for (int c = 0; c < 2; c++)
        {
          lo[c] = fmin (lo[c], poly[i][c]);
          hi[c] = fmax (hi[c], poly[i][c]);
        }
    }
  *moved = false;
  if (a != 0 && isfinite (cx) && isfinite (cy))
    {
      start[0] = cx / (3 * a);
      start[1] = cy / (3 * a);
      /* A symmetric loop's centre on an axis comes out as round-off (phi = 9e-18): that is 0,
       * and the start is printed and saved as such. */
      for (int c = 0; c < 2; c++)
        if (fabs (start[c]) < 1e-12 * (hi[c] - lo[c] + fabs (hi[c]) + fabs (lo[c])))
          start[c] = 0;
      if (df_polygon_contains (poly, n, start[0], start[1]))
        return true;
    }
  {
    /* The inner side is on the left of an anticlockwise polygon (a > 0). */
    double tx = poly[1][0] - poly[n - 1][0], ty = poly[1][1] - poly[n - 1][1];
    double len = hypot (tx, ty), side = a > 0 ? 1 : -1;
    double d = 0.02 * fmin (hi[0] - lo[0], hi[1] - lo[1]);

    if (!(len > 0) || !(d > 0))
      return false;
    for (int k = 0; k < 8; k++, d *= 0.5)
      {
        start[0] = poly[0][0] - side * ty / len * d;
        start[1] = poly[0][1] + side * tx / len * d;
        if (df_polygon_contains (poly, n, start[0], start[1]))
          {
            *moved = true;
            return true;
          }
      }
  }
  return false;
}

/* The cell of largest |shear| among those with a corner inside; its centre (mean of its
 * corners in the chart). False when there is none. */
static bool
worst_cell (const df_drape *d, double *shear, double uv[2])
{
  const df_drape_summary *s = df_drape_get_summary (d);
  double best = -1;

  for (int j = s->j_min; j < s->j_max; j++)
    for (int i = s->i_min; i < s->i_max; i++)
      {
        df_drape_cell c;
        df_drape_node nd;
        double cu = 0, cv = 0;
        int ok = 0;

        if (!df_drape_get_cell (d, i, j, &c) || c.corners_inside == 0
            || !(fabs (c.shear_rad) > best))
          continue;
        for (int k = 0; k < 4; k++)
          if (df_drape_get_node (d, i + (k & 1), j + (k >> 1), &nd))
            {
              cu += nd.u;
              cv += nd.v;
              ok++;
            }
        if (ok != 4)
          continue;
        best = fabs (c.shear_rad);
        *shear = c.shear_rad;
        uv[0] = cu / 4;
        uv[1] = cv / 4;
      }
  return best >= 0;
}

df_status
df_verdict_shear (const df_curve *loop, size_t n_points, const df_loop_result *result,
                  const df_limits *limits, const df_shear_setup *setup, df_verdict_list *out,
                  df_shear_used *used, bool *checked, char *note, size_t note_len,
                  df_diag *diag)
{
  const df_limit *lim = &limits->item[DF_LIMIT_MAX_SHEAR];
  const df_surface *surface = df_curve_get_surface (loop);
  static const df_shear_setup none = { 0 };
  df_shear_used u = { 0 };
  double (*poly)[2] = NULL;
  df_drape_options opt;
  df_drape *drape = NULL;
  df_diag dd;
  double shear = 0, at[2] = { 0, 0 };
  size_t n;
  df_status st;

  *checked = false;
  note[0] = '\0';
  if (used != NULL)
    memset (used, 0, sizeof *used);
  if (!lim->set)
    return DF_OK;
  if (setup == NULL)
    setup = &none;
  if (df_curve_get_coords (loop) != DF_COORDS_CHART)
    {
      snprintf (note, note_len, "the loop comes near a pole, where the drape's chart is "
                                "singular; drape it in the drape tool from a start of your own");
      return DF_OK;
    }
  if (df_curve_axis_winding (loop) != 0 || df_curve_tube_winding (loop) != 0
      || !result->bounds_disc)
    {
      snprintf (note, note_len, "the loop winds round the surface and bounds no patch to drape");
      return DF_OK;
    }
  n = df_shear_outline (loop, n_points, &poly);
  if (n < 3)
    {
      free (poly);
      return n == 0 ? DF_E_NOMEM : df_diag_fail (diag, DF_E_INPUT, -1, "too few loop points");
    }

  u.start_default = !setup->has_start;
  u.warp_default = !setup->has_warp;
  u.cell_default = !setup->has_cell;
  if (setup->has_start)
    memcpy (u.start, setup->start, sizeof u.start);
  else if (!default_start ((const double (*)[2]) poly, n, u.start, &u.start_moved))
    {
      free (poly);
      snprintf (note, note_len, "no start inside the loop found (its chart centroid lies "
                                "outside and its first point cannot be moved in); give the "
                                "loop a drape-start=U,V");
      return DF_OK;
    }
  u.warp_deg = setup->has_warp ? setup->warp_deg : 0.0;
  u.cell = setup->has_cell ? setup->cell : result->length / DF_SHEAR_CELLS_PER_LENGTH;

  df_drape_options_init (&opt);
  opt.warp_rad = u.warp_deg * M_PI / 180.0;
  opt.cell = u.cell;
  opt.max_shear_rad = lim->model_value * M_PI / 180.0;
  /* The closure check costs as much as the net and the verdict needs only the angles. */
  opt.check_closure = false;
  df_diag_clear (&dd);
  st = df_drape_new (surface, (const double (*)[2]) poly, n, u.start[0], u.start[1], &opt,
                     &drape, &dd);
  free (poly);
  if (st != DF_OK)
    {
      /* A start, warp or cell the user gave is bad input; a default that fails is a note. */
      if (setup->has_start || setup->has_cell || setup->has_warp)
        {
          if (diag != NULL)
            *diag = dd;
          return st;
        }
      snprintf (note, note_len, "the drape from the default start (%.6g, %.6g) with cell %.6g "
                "failed: %s", u.start[0], u.start[1], u.cell, dd.detail);
      return DF_OK;
    }
  {
    const df_drape_summary *s = df_drape_get_summary (drape);

    u.n_cells = s->n_cells;
    u.n_cells_over = s->n_cells_over_limit;
    u.n_nodes_lost = s->n_nodes_lost;
  }
  if (!worst_cell (drape, &shear, at))
    {
      df_drape_free (drape);
      snprintf (note, note_len, "the drape placed no whole cell over the loop (cell %.6g)",
                u.cell);
      if (used != NULL)
        *used = u;
      return DF_OK;
    }
  df_drape_free (drape);
  if (used != NULL)
    *used = u;
  {
    df_verdict v = { .limit = DF_LIMIT_MAX_SHEAR, .region = true, .has_value = true,
                     .value = fabs (shear) * 180.0 / M_PI, .threshold = lim->model_value };
    df_chart_jet jet;

    v.within = !(v.value > v.threshold);
    v.u_worst = at[0];
    v.v_worst = at[1];
    /* > 0: the crossing angle closes there. */
    v.signed_value = shear * 180.0 / M_PI;
    v.n_cells = u.n_cells;
    v.n_cells_over = u.n_cells_over;
    if ((st = df_surface_eval (surface, at[0], at[1], 0, &jet, diag)) != DF_OK)
      return st;
    memcpy (v.point_worst, jet.x, sizeof v.point_worst);
    *checked = true;
    return _df_verdict_push (out, &v);
  }
}
