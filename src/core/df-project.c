/* df-project.c: closest surface point to a point in space. A revolution surface reduces to a
 * one-dimensional search along the profile in the point's meridian half-plane; a graph to a
 * two-dimensional one. Both: the best point of a seed grid, then safeguarded Newton steps on
 * the squared distance, clamped to the domain.
 * Plain C + libm; no GLib. */
#include "df-project.h"

#include <math.h>
#include <string.h>

#define SEEDS_1D 1025
#define SEEDS_2D 41
#define NEWTON_STEPS 60

static double
clamp (double x, double lo, double hi)
{
  return x < lo ? lo : x > hi ? hi : x;
}

static double
dist2 (const double a[3], const double b[3])
{
  double d0 = a[0] - b[0], d1 = a[1] - b[1], d2 = a[2] - b[2];

  return d0 * d0 + d1 * d1 + d2 * d2;
}

/* Squared distance with gradient and Hessian in (u, v) from a second-order chart jet. */
static df_status
objective (const df_surface *s, const double p[3], double u, double v, double *f, double g[2],
           double hm[2][2])
{
  df_chart_jet j;
  double d[3];
  df_status st = df_surface_eval (s, u, v, 2, &j, NULL);

  if (st != DF_OK)
    return st;
  for (int k = 0; k < 3; k++)
    d[k] = j.x[k] - p[k];
  *f = d[0] * d[0] + d[1] * d[1] + d[2] * d[2];
  for (int a = 0; a < 2; a++)
    {
      g[a] = 0.0;
      for (int k = 0; k < 3; k++)
        g[a] += 2 * d[k] * j.d1[a][k];
      for (int b = 0; b < 2; b++)
        {
          hm[a][b] = 0.0;
          for (int k = 0; k < 3; k++)
            hm[a][b] += 2 * (j.d1[a][k] * j.d1[b][k] + d[k] * j.d2[a + b][k]);
        }
    }
  return DF_OK;
}

/* Newton with backtracking over the free coordinates (mask), clamped to the box. */
static void
refine (const df_surface *s, const double p[3], const bool mask[2], const double lo[2],
        const double hi[2], double x[2])
{
  for (int it = 0; it < NEWTON_STEPS; it++)
    {
      double f, g[2], hm[2][2], step[2] = { 0, 0 }, det, t = 1.0;
      bool improved = false;

      if (objective (s, p, x[0], x[1], &f, g, hm) != DF_OK)
        return;
      if (!mask[1])
        {
          g[1] = 0;
          hm[0][1] = hm[1][0] = 0;
          hm[1][1] = 1;
        }
      det = hm[0][0] * hm[1][1] - hm[0][1] * hm[1][0];
      if (hm[0][0] > 0 && det > 0)
        {
          step[0] = -(hm[1][1] * g[0] - hm[0][1] * g[1]) / det;
          step[1] = -(hm[0][0] * g[1] - hm[1][0] * g[0]) / det;
        }
      else
        {
          /* Not convex here: a gradient step scaled by the Hessian's size. */
          double sc = fabs (hm[0][0]) + fabs (hm[1][1]) + 1e-300;

          step[0] = -g[0] / sc;
          step[1] = -g[1] / sc;
        }
      if (!mask[1])
        step[1] = 0;
      for (int k = 0; k < 30; k++, t *= 0.5)
        {
          double y[2] = { clamp (x[0] + t * step[0], lo[0], hi[0]),
                          clamp (x[1] + t * step[1], lo[1], hi[1]) };
          double f2, g2[2], h2[2][2];

          if (objective (s, p, y[0], y[1], &f2, g2, h2) == DF_OK && f2 <= f)
            {
              double moved = fabs (y[0] - x[0]) + fabs (y[1] - x[1]);

              x[0] = y[0];
              x[1] = y[1];
              improved = moved > 1e-15 * (fabs (hi[0] - lo[0]) + fabs (hi[1] - lo[1]));
              break;
            }
        }
      if (!improved)
        return;
    }
}

df_status
df_surface_project (const df_surface *s, const double p[3], double max_dist, double *u,
                    double *v, double *dist, df_diag *diag)
{
  double u_min, u_max, v_min, v_max, best = INFINITY, x[2] = { 0, 0 }, lo[2], hi[2];
  bool mask[2] = { true, true };
  df_chart_jet j;

  df_diag_clear (diag);
  if (!isfinite (p[0]) || !isfinite (p[1]) || !isfinite (p[2]))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the point is not finite");
  df_surface_get_domain (s, &u_min, &u_max, &v_min, &v_max);
  lo[0] = u_min;
  hi[0] = u_max;
  if (df_surface_get_kind (s) == DF_SURFACE_REVOLUTION)
    {
      /* The closest point lies in the point's own meridian half-plane. */
      double phi = (p[0] == 0 && p[1] == 0) ? 0.0 : atan2 (p[1], p[0]);

      x[1] = phi;
      lo[1] = hi[1] = phi;
      mask[1] = false;
      for (int i = 0; i < SEEDS_1D; i++)
        {
          double t = u_min + (u_max - u_min) * i / (SEEDS_1D - 1), d;

          if (df_surface_eval (s, t, phi, 0, &j, NULL) != DF_OK)
            continue;
          d = dist2 (j.x, p);
          if (d < best)
            {
              best = d;
              x[0] = t;
            }
        }
    }
  else
    {
      lo[1] = v_min;
      hi[1] = v_max;
      /* The point straight below or above is a good seed on a gently sloped graph. */
      x[0] = clamp (p[0], u_min, u_max);
      x[1] = clamp (p[1], v_min, v_max);
      if (df_surface_eval (s, x[0], x[1], 0, &j, NULL) == DF_OK)
        best = dist2 (j.x, p);
      for (int a = 0; a < SEEDS_2D; a++)
        for (int b = 0; b < SEEDS_2D; b++)
          {
            double xx = u_min + (u_max - u_min) * a / (SEEDS_2D - 1);
            double yy = v_min + (v_max - v_min) * b / (SEEDS_2D - 1), d;

            if (df_surface_eval (s, xx, yy, 0, &j, NULL) != DF_OK)
              continue;
            d = dist2 (j.x, p);
            if (d < best)
              {
                best = d;
                x[0] = xx;
                x[1] = yy;
              }
          }
    }
  if (!isfinite (best))
    return df_diag_fail (diag, DF_E_NOCONVERGE, -1, "no surface point could be evaluated");
  refine (s, p, mask, lo, hi, x);
  if (df_surface_eval (s, x[0], x[1], 0, &j, diag) != DF_OK)
    return DF_E_NOCONVERGE;
  *u = x[0];
  *v = x[1];
  *dist = sqrt (dist2 (j.x, p));
  if (max_dist > 0 && *dist > max_dist)
    return df_diag_fail_at (diag, DF_E_DOMAIN, -1, x[0], x[1],
                            "the point (%.6g, %.6g, %.6g) is %.3g from the surface (more than "
                            "%.3g)", p[0], p[1], p[2], *dist, max_dist);
  return DF_OK;
}
