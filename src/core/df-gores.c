/* df-gores.c: darts and the flat pattern of gores of a surface of revolution (see df-gores.h).
 * Plain C + libm; no GLib. */
#include "df-gores.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#define MAX_COUNT 100000
#define MAX_GORES 10000

/* 5-point Gauss-Legendre on [-1, 1] (Abramowitz and Stegun 25.4.29, from memory). */
static const double gl_x[5] = { 0.0, -0.5384693101056831, 0.5384693101056831,
                                -0.9061798459386640, 0.9061798459386640 };
static const double gl_w[5] = { 0.5688888888888889, 0.4786286704993665, 0.4786286704993665,
                                0.2369268850561891, 0.2369268850561891 };

df_status
df_darts_compute (double omega_rad, double area, int count, df_darts *out, df_diag *diag)
{
  memset (out, 0, sizeof *out);
  if (count < 1 || count > MAX_COUNT)
    return df_diag_fail (diag, DF_E_INPUT, -1, "dart count %d outside [1, %d]", count,
                         MAX_COUNT);
  if (!isfinite (omega_rad) || !(area > 0.0) || !isfinite (area))
    return df_diag_fail (diag, DF_E_INPUT, -1, "darts need a finite curvature and a positive "
                         "area");
  out->omega_rad = omega_rad;
  out->count = count;
  out->gusset = omega_rad < 0.0;
  out->angle_each_rad = fabs (omega_rad) / count;
  out->length = sqrt (area / M_PI);
  return DF_OK;
}

df_status
df_darts_least_count (double omega_rad, double max_angle_rad, int *count, df_diag *diag)
{
  double n;

  *count = 0;
  if (!isfinite (omega_rad) || !(max_angle_rad > 0.0) || !isfinite (max_angle_rad))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the largest dart angle must be positive");
  /* A relative slack of 1e-12 keeps an exact multiple (Omega = 2 x max) from asking one more. */
  n = ceil (fabs (omega_rad) / max_angle_rad * (1.0 - 1e-12));
  if (n > MAX_COUNT)
    return df_diag_fail (diag, DF_E_INPUT, -1, "more than %d darts would be needed", MAX_COUNT);
  *count = (int) n;
  return DF_OK;
}

void
df_gores_clear (df_gores *gores)
{
  if (gores == NULL)
    return;
  free (gores->t);
  free (gores->s);
  free (gores->half_width);
  memset (gores, 0, sizeof *gores);
}

/* r, dr/dt and the profile speed ds/dt at t (on the meridian phi = 0, X = (r, 0, z)). */
static df_status
profile_at (const df_surface *surface, double t, double *r, double *dr, double *speed,
            df_diag *diag)
{
  df_chart_jet jet;
  df_status st = df_surface_eval (surface, t, 0.0, 1, &jet, diag);

  if (st != DF_OK)
    return st;
  *r = jet.x[0];
  *dr = jet.d1[0][0];
  *speed = hypot (jet.d1[0][0], jet.d1[0][2]);
  return DF_OK;
}

df_status
df_gores_compute (const df_surface *surface, double t0, double t1, int count, size_t n_points,
                  df_gores *out, df_diag *diag)
{
  double u_min, u_max, v_min, v_max, area = 0.0, edge = 0.0, w_max = 0.0;
  df_status st = DF_OK;

  memset (out, 0, sizeof *out);
  if (df_surface_get_kind (surface) != DF_SURFACE_REVOLUTION)
    return df_diag_fail (diag, DF_E_INPUT, -1, "gores need a surface of revolution");
  if (count < 1 || count > MAX_GORES)
    return df_diag_fail (diag, DF_E_INPUT, -1, "gore count %d outside [1, %d]", count,
                         MAX_GORES);
  if (n_points < 3)
    return df_diag_fail (diag, DF_E_INPUT, -1, "at least 3 samples of the meridian");
  df_surface_get_domain (surface, &u_min, &u_max, &v_min, &v_max);
  if (!(t0 < t1) || !isfinite (t0) || !isfinite (t1))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the band needs t0 < t1 (got %g, %g)", t0, t1);
  if (!df_surface_contains (surface, t0, 0.0) || !df_surface_contains (surface, t1, 0.0))
    return df_diag_fail (diag, DF_E_DOMAIN, -1, "t0 = %g or t1 = %g lies outside the profile's "
                         "range [%g, %g]", t0, t1, u_min, u_max);

  out->count = count;
  out->t0 = t0;
  out->t1 = t1;
  out->n = n_points;
  out->t = malloc (n_points * sizeof *out->t);
  out->s = malloc (n_points * sizeof *out->s);
  out->half_width = malloc (n_points * sizeof *out->half_width);
  if (out->t == NULL || out->s == NULL || out->half_width == NULL)
    {
      df_gores_clear (out);
      return DF_E_NOMEM;
    }

  for (size_t i = 0; i < n_points; i++)
    {
      double t = i + 1 == n_points ? t1 : t0 + (t1 - t0) * (double) i / (double) (n_points - 1);
      double r, dr, speed;

      if ((st = profile_at (surface, t, &r, &dr, &speed, diag)) != DF_OK)
        goto fail;
      out->t[i] = t;
      /* |r| <= 0: a pole, where a rounding-size negative r would give a negative width. */
      out->half_width[i] = M_PI * fmax (r, 0.0) / count;
      w_max = fmax (w_max, 2.0 * out->half_width[i]);
      out->s[i] = 0.0;
      if (i == 0)
        continue;
      {
        double a = out->t[i - 1], h = 0.5 * (t - a), ds = 0.0;

        for (int k = 0; k < 5; k++)
          {
            double rk, drk, sk;

            if ((st = profile_at (surface, a + h * (1.0 + gl_x[k]), &rk, &drk, &sk, diag))
                != DF_OK)
              goto fail;
            ds += gl_w[k] * h * sk;
            area += gl_w[k] * h * 2.0 * M_PI * fmax (rk, 0.0) * sk / count;
            /* Edge x = pi r / n: dx/dt = pi r' / n, so |edge'| = sqrt (s'^2 + (pi r' / n)^2). */
            edge += gl_w[k] * h * hypot (sk, M_PI * drk / count);
          }
        out->s[i] = out->s[i - 1] + ds;
      }
    }
  out->length = out->s[n_points - 1];
  out->max_width = w_max;
  out->area_each = area;
  out->edge_strain = out->length > 0.0 ? edge / out->length - 1.0 : 0.0;
  if (!isfinite (out->length) || !isfinite (area) || !isfinite (out->edge_strain))
    {
      st = df_diag_fail (diag, DF_E_NONFINITE, -1, "the gore's size is not finite");
      goto fail;
    }
  return DF_OK;

fail:
  df_gores_clear (out);
  return st;
}

df_status
df_gores_least_count (const df_surface *surface, double t0, double t1, double max_strain,
                      int *count, df_diag *diag)
{
  *count = 0;
  if (!(max_strain > 0.0) || !isfinite (max_strain))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the strain limit must be positive");
  /* The edge strain falls monotonically with the count (about (pi r' / n)^2 / 2): bisect on
   * the count after doubling to a bracket. */
  {
    int lo = 0, hi = 1;

    for (;;)
      {
        df_gores g;
        df_status st = df_gores_compute (surface, t0, t1, hi, 201, &g, diag);
        bool ok;

        if (st != DF_OK)
          return st;
        ok = g.edge_strain <= max_strain;
        df_gores_clear (&g);
        if (ok)
          break;
        lo = hi;
        if (hi >= MAX_GORES)
          return df_diag_fail (diag, DF_E_INPUT, -1, "more than %d gores would be needed",
                               MAX_GORES);
        hi = hi * 2 > MAX_GORES ? MAX_GORES : hi * 2;
      }
    while (hi - lo > 1)
      {
        int mid = lo + (hi - lo) / 2;
        df_gores g;
        df_status st = df_gores_compute (surface, t0, t1, mid, 201, &g, diag);
        bool ok;

        if (st != DF_OK)
          return st;
        ok = g.edge_strain <= max_strain;
        df_gores_clear (&g);
        if (ok)
          hi = mid;
        else
          lo = mid;
      }
    *count = hi;
  }
  return DF_OK;
}

df_status
df_gores_outline (const df_gores *gores, double seam, double (**pts)[2], size_t *n_pts,
                  df_diag *diag)
{
  size_t n = gores->n, k = 0;
  double (*p)[2];

  *pts = NULL;
  *n_pts = 0;
  if (n < 2 || !(seam >= 0.0) || !isfinite (seam))
    return df_diag_fail (diag, DF_E_INPUT, -1, "no gore to outline, or a negative seam");
  p = malloc (2 * n * sizeof *p);
  if (p == NULL)
    return DF_E_NOMEM;
  /* Right edge down the centre line, then the left edge back: anticlockwise with y = s. A
   * zero width at an end (a pole) gives one point there, not two. */
  for (size_t i = 0; i < n; i++)
    {
      p[k][0] = gores->half_width[i];
      p[k][1] = gores->s[i];
      k++;
    }
  for (size_t i = n; i-- > 0;)
    {
      if (gores->half_width[i] == 0.0 && (i == 0 || i == n - 1))
        continue;
      p[k][0] = -gores->half_width[i];
      p[k][1] = gores->s[i];
      k++;
    }

  if (seam > 0.0)
    {
      double (*q)[2] = malloc (k * sizeof *q);

      if (q == NULL)
        {
          free (p);
          return DF_E_NOMEM;
        }
      for (size_t i = 0; i < k; i++)
        {
          const double *a = p[(i + k - 1) % k], *b = p[i], *c = p[(i + 1) % k];
          double d1[2] = { b[0] - a[0], b[1] - a[1] }, d2[2] = { c[0] - b[0], c[1] - b[1] };
          double l1 = hypot (d1[0], d1[1]), l2 = hypot (d2[0], d2[1]);
          double n1[2], n2[2], m[2], lm, cos_half, reach;

          if (l1 == 0.0 || l2 == 0.0)
            {
              q[i][0] = b[0];
              q[i][1] = b[1];
              continue;
            }
          /* Outward normals of an anticlockwise polygon: the edge direction turned clockwise. */
          n1[0] = d1[1] / l1;
          n1[1] = -d1[0] / l1;
          n2[0] = d2[1] / l2;
          n2[1] = -d2[0] / l2;
          m[0] = n1[0] + n2[0];
          m[1] = n1[1] + n2[1];
          lm = hypot (m[0], m[1]);
          if (lm < 1e-12)
            {
              m[0] = n1[0];
              m[1] = n1[1];
              lm = 1.0;
            }
          cos_half = lm / 2.0;
          reach = fmin (seam / fmax (cos_half, 1e-12), 3.0 * seam);
          q[i][0] = b[0] + reach * m[0] / lm;
          q[i][1] = b[1] + reach * m[1] / lm;
        }
      free (p);
      p = q;
    }
  *pts = p;
  *n_pts = k;
  return DF_OK;
}
