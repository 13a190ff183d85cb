/* df-fit.c: the fitted profile (a df_fn of dimension 1 with outputs r, z) and the smoothing
 * search shared with the height fit. The profile is fitted as r(c), z(c) over the cumulative
 * chord length c of the points, then reparametrised exactly by its arc length s: s(c) is
 * tabulated span by span with Gauss-Legendre quadrature and inverted by Newton's method at each
 * evaluation, and the derivatives in s follow from the chain rule, so r'² + z'² = 1 to
 * rounding. Plain C + libm + GSL; no GLib. */
#include "df-fit-private.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "df-bspline.h"

#define MIN_POINTS   8
#define AXIS_REL     1e-6
#define LAMBDA_MIN   1e-9
#define LAMBDA_MAX   1e9
#define GL_NODES     8

/* ---- smoothing search ---- */

df_status
_df_fit_choose_lambda (_df_fit_trial trial, void *ctx, double tolerance, double *lambda,
                       df_diag *diag)
{
  double rms, gcv, lo = log (LAMBDA_MIN), hi = log (LAMBDA_MAX);
  df_status st;

  if (tolerance == 0.0)
    {
      *lambda = LAMBDA_MIN;
      return DF_OK;
    }
  if (tolerance > 0.0)
    {
      if ((st = trial (ctx, exp (lo), 0, &rms, &gcv, diag)) != DF_OK)
        return st;
      if (rms >= tolerance)
        {
          *lambda = exp (lo);
          return DF_OK;
        }
      if ((st = trial (ctx, exp (hi), 0, &rms, &gcv, diag)) != DF_OK)
        return st;
      if (rms <= tolerance)
        {
          *lambda = exp (hi);
          return DF_OK;
        }
      for (int it = 0; it < 60 && hi - lo > 1e-3; it++)
        {
          double mid = 0.5 * (lo + hi);

          if ((st = trial (ctx, exp (mid), 0, &rms, &gcv, diag)) != DF_OK)
            return st;
          if (rms <= tolerance)
            lo = mid;
          else
            hi = mid;
          /* Within 1 % of the tolerance is as close as the tolerance itself is known. */
          if (fabs (rms - tolerance) <= 1e-2 * tolerance)
            break;
        }
      *lambda = exp (lo);
      return DF_OK;
    }
  {
    /* GCV on a coarse grid of log lambda, then golden section around the best node. */
    double best = lo, best_g = INFINITY, a, b, x1, x2, g1, g2;
    const double phi = 0.5 * (sqrt (5.0) - 1.0);

    for (double l = lo; l <= hi + 1e-9; l += log (10.0))
      {
        if ((st = trial (ctx, exp (l), 1, &rms, &gcv, diag)) != DF_OK)
          return st;
        if (gcv < best_g)
          {
            best_g = gcv;
            best = l;
          }
      }
    a = best - log (10.0);
    b = best + log (10.0);
    x1 = b - phi * (b - a);
    x2 = a + phi * (b - a);
    if ((st = trial (ctx, exp (x1), 1, &rms, &g1, diag)) != DF_OK
        || (st = trial (ctx, exp (x2), 1, &rms, &g2, diag)) != DF_OK)
      return st;
    for (int it = 0; it < 20; it++)
      {
        if (g1 < g2)
          {
            b = x2; x2 = x1; g2 = g1;
            x1 = b - phi * (b - a);
            if ((st = trial (ctx, exp (x1), 1, &rms, &g1, diag)) != DF_OK)
              return st;
          }
        else
          {
            a = x1; x1 = x2; g1 = g2;
            x2 = a + phi * (b - a);
            if ((st = trial (ctx, exp (x2), 1, &rms, &g2, diag)) != DF_OK)
              return st;
          }
      }
    *lambda = exp (g1 < g2 ? x1 : x2);
    if (!(fmin (g1, g2) <= best_g))
      *lambda = exp (best);
    return DF_OK;
  }
}

/* ---- the profile function ---- */

typedef struct
{
  df_bspline  b;
  double     *coef;        /* count x 2: r, z over the chord parameter */
  double     *s_knot;      /* arc length at each span start, spans + 1 */
  double      c0;          /* chord parameter of the first point (0) */
  df_fit_info info;
} profile_data;

static const double gl_x[GL_NODES] = { -0.9602898564975363, -0.7966664774136267,
                                       -0.5255324099163290, -0.1834346424956498,
                                       0.1834346424956498,  0.5255324099163290,
                                       0.7966664774136267,  0.9602898564975363 };
static const double gl_w[GL_NODES] = { 0.1012285362903763, 0.2223810344533745,
                                       0.3137066278286366, 0.3626837833783620,
                                       0.3626837833783620, 0.3137066278286366,
                                       0.2223810344533745, 0.1012285362903763 };

/* g and its c-derivatives to nder: g[k][0] = r^(k), g[k][1] = z^(k). */
static void
profile_chord_eval (const profile_data *p, double c, int nder, double g[4][2])
{
  double v[4][DF_BSPLINE_MAX_DEGREE + 1];
  int f = df_bspline_eval_basis (&p->b, c, nder, v);

  for (int k = 0; k <= nder; k++)
    {
      g[k][0] = g[k][1] = 0.0;
      for (int m = 0; m <= p->b.degree; m++)
        {
          g[k][0] += v[k][m] * p->coef[2 * (f + m)];
          g[k][1] += v[k][m] * p->coef[2 * (f + m) + 1];
        }
    }
}

static double
speed_at (const profile_data *p, double c)
{
  double g[4][2];

  profile_chord_eval (p, c, 1, g);
  return hypot (g[1][0], g[1][1]);
}

/* Arc length from c_a to c_b inside one span (the integrand is smooth there). */
static double
arc_piece (const profile_data *p, double ca, double cb)
{
  double sum = 0.0, mid = 0.5 * (ca + cb), half = 0.5 * (cb - ca);

  for (int i = 0; i < GL_NODES; i++)
    sum += gl_w[i] * speed_at (p, mid + half * gl_x[i]);
  return sum * half;
}

/* c with s(c) = s: the span from the table, then Newton (s' = speed > 0). */
static double
chord_of_arc (const profile_data *p, double s)
{
  int lo = 0, hi = p->b.spans - 1;
  double c, ca;

  while (lo < hi)
    {
      int mid = (lo + hi + 1) / 2;

      if (p->s_knot[mid] <= s)
        lo = mid;
      else
        hi = mid - 1;
    }
  ca = p->b.a + lo * p->b.h;
  c = ca + p->b.h * (s - p->s_knot[lo]) / fmax (p->s_knot[lo + 1] - p->s_knot[lo], 1e-300);
  for (int it = 0; it < 30; it++)
    {
      double f = p->s_knot[lo] + arc_piece (p, ca, c) - s;
      double dc = f / speed_at (p, c);

      c -= dc;
      if (fabs (dc) <= 1e-15 * (fabs (c) + p->b.h))
        break;
    }
  return c;
}

static df_status
profile_eval (const void *data, double s, double v, int order, df_fn_jet out, df_diag *diag)
{
  const profile_data *p = data;
  double g[4][2], c = chord_of_arc (p, s), sig, sig1, sig2, c1, c2, c3;

  (void) v;
  profile_chord_eval (p, c, order < 1 ? 0 : order, g);
  for (int k = 0; k < 2; k++)
    out[k][DF_JET_D] = g[0][k];
  if (order < 1)
    return DF_OK;
  sig = hypot (g[1][0], g[1][1]);
  if (!(sig > 0.0))
    return df_diag_fail_at (diag, DF_E_SINGULAR, -1, s, 0.0, "the fitted profile has zero "
                            "speed at t = %.6g", s);
  c1 = 1.0 / sig;
  sig1 = (g[1][0] * g[2][0] + g[1][1] * g[2][1]) / sig;
  sig2 = order >= 3 ? (g[2][0] * g[2][0] + g[2][1] * g[2][1] + g[1][0] * g[3][0]
                       + g[1][1] * g[3][1] - sig1 * sig1) / sig
                    : 0.0;
  c2 = -sig1 / (sig * sig * sig);
  c3 = (-sig2 / (sig * sig * sig) + 3.0 * sig1 * sig1 / (sig * sig * sig * sig)) / sig;
  for (int k = 0; k < 2; k++)
    {
      out[k][DF_JET_DX] = g[1][k] * c1;
      if (order >= 2)
        out[k][DF_JET_DXX] = g[2][k] * c1 * c1 + g[1][k] * c2;
      if (order >= 3)
        out[k][DF_JET_DXXX] = g[3][k] * c1 * c1 * c1 + 3.0 * g[2][k] * c1 * c2 + g[1][k] * c3;
    }
  return DF_OK;
}

static void
profile_free (void *data)
{
  profile_data *p = data;

  if (p == NULL)
    return;
  free (p->coef);
  free (p->s_knot);
  free (p);
}

static void *
profile_copy (const void *data)
{
  const profile_data *p = data;
  profile_data *c = malloc (sizeof *c);
  size_t count = (size_t) df_bspline_count (&p->b);

  if (c == NULL)
    return NULL;
  *c = *p;
  c->coef = malloc (sizeof (double) * 2 * count);
  c->s_knot = malloc (sizeof (double) * (size_t) (p->b.spans + 1));
  if (c->coef == NULL || c->s_knot == NULL)
    {
      profile_free (c);
      return NULL;
    }
  memcpy (c->coef, p->coef, sizeof (double) * 2 * count);
  memcpy (c->s_knot, p->s_knot, sizeof (double) * (size_t) (p->b.spans + 1));
  return c;
}

const df_fn_type _df_fit_profile_type = {
  "profile spline", profile_eval, NULL, profile_copy, profile_free, NULL
};

/* ---- fitting ---- */

typedef struct
{
  profile_data          *p;
  size_t                 n;
  const double         (*rz)[2];
  double                *c;
  double                 scale;
  df_bspline_constraint  cons[10];
  int                    ncons;
} profile_ctx;

/* Distance of each point from the fit at its own parameter, measured across the fitted
 * tangent (the normal distance to first order). */
static void
profile_residuals (profile_ctx *x, df_fit_info *info)
{
  double sum = 0.0;

  info->max = 0.0;
  for (size_t i = 0; i < x->n; i++)
    {
      double g[4][2], dr, dz, sp, d;

      profile_chord_eval (x->p, x->c[i], 1, g);
      dr = x->rz[i][0] - g[0][0];
      dz = x->rz[i][1] - g[0][1];
      sp = hypot (g[1][0], g[1][1]);
      d = sp > 0 ? fabs (dr * g[1][1] - dz * g[1][0]) / sp : hypot (dr, dz);
      sum += d * d;
      if (d >= info->max)
        {
          info->max = d;
          info->max_at[0] = x->rz[i][0];
          info->max_at[1] = 0.0;
          info->max_at[2] = x->rz[i][1];
        }
    }
  info->rms = sqrt (sum / (double) x->n);
  info->points = x->n;
}

static df_status
profile_trial (void *ctx, double lambda, int want_gcv, double *rms, double *gcv, df_diag *diag)
{
  profile_ctx *x = ctx;
  double tr = 0.0;
  df_status st = df_bspline_smooth (&x->p->b, x->n, x->c, &x->rz[0][0], 2, lambda * x->scale,
                                    x->cons, x->ncons, x->p->coef, want_gcv ? &tr : NULL,
                                    diag);
  df_fit_info info;
  double dof;

  if (st != DF_OK)
    return st;
  profile_residuals (x, &info);
  *rms = info.rms;
  /* Two columns share one smoother: 2n observations, 2 tr H parameters. */
  dof = fmax (2.0 * (double) x->n - 2.0 * tr, 1.0);
  *gcv = 2.0 * (double) x->n * 2.0 * (double) x->n * info.rms * info.rms / (dof * dof);
  return DF_OK;
}

/* Angle of the chord from point a to b against the radial direction (0: perpendicular to the
 * axis). */
static double
chord_angle (const double a[2], const double b[2])
{
  return atan2 (fabs (b[1] - a[1]), fabs (b[0] - a[0]));
}

df_status
df_fit_profile (const double (*rz)[2], size_t n, double tolerance, df_fn **out,
                df_fit_info *info, df_diag *diag)
{
  profile_ctx x = { 0 };
  profile_data *p = NULL;
  double r_max = 0.0, len = 0.0, lambda, dom[4];
  df_status st;
  int count;

  *out = NULL;
  df_diag_clear (diag);
  if (n < MIN_POINTS)
    return df_diag_fail (diag, DF_E_INPUT, -1, "%zu profile points: a quintic profile needs at "
                         "least %d", n, MIN_POINTS);
  for (size_t i = 0; i < n; i++)
    {
      if (!isfinite (rz[i][0]) || !isfinite (rz[i][1]))
        return df_diag_fail (diag, DF_E_INPUT, (long) i, "r or z is not a finite number");
      if (rz[i][0] < 0.0)
        return df_diag_fail (diag, DF_E_INPUT, (long) i, "r = %.6g < 0: the profile crosses "
                             "the axis (r is a distance from it)", rz[i][0]);
      r_max = fmax (r_max, rz[i][0]);
    }
  if (!(r_max > 0.0))
    return df_diag_fail (diag, DF_E_INPUT, -1, "every point has r = 0: the profile lies on the "
                         "axis");
  x.c = malloc (sizeof (double) * n);
  if (x.c == NULL)
    return DF_E_NOMEM;
  x.c[0] = 0.0;
  for (size_t i = 1; i < n; i++)
    {
      double d = hypot (rz[i][0] - rz[i - 1][0], rz[i][1] - rz[i - 1][1]);

      len += d;
      x.c[i] = len;
    }
  for (size_t i = 1; i < n; i++)
    {
      double d = x.c[i] - x.c[i - 1];

      if (d <= 1e-9 * len)
        {
          free (x.c);
          return df_diag_fail (diag, DF_E_INPUT, (long) i, "the point repeats the one before "
                               "it (%.6g, %.6g)", rz[i][0], rz[i][1]);
        }
      if (i + 1 < n)
        {
          double ar = rz[i][0] - rz[i - 1][0], az = rz[i][1] - rz[i - 1][1];
          double br = rz[i + 1][0] - rz[i][0], bz = rz[i + 1][1] - rz[i][1];

          /* A turn of more than 120 degrees between neighbouring chords is no measured
           * profile but points out of order (common practice, no source). */
          if (ar * br + az * bz < -0.5 * hypot (ar, az) * hypot (br, bz))
            {
              free (x.c);
              return df_diag_fail (diag, DF_E_INPUT, (long) i + 1, "the profile turns back at "
                                   "this point: are the points out of order along it?");
            }
        }
      if (i + 1 < n && rz[i][0] <= AXIS_REL * r_max)
        {
          free (x.c);
          return df_diag_fail (diag, DF_E_INPUT, (long) i, "an interior point on the axis "
                               "(r = 0): split the profile there");
        }
    }

  p = calloc (1, sizeof *p);
  if (p == NULL)
    {
      free (x.c);
      return DF_E_NOMEM;
    }
  p->b.degree = 5;
  /* About two points a span: enough freedom to follow smooth data to rounding, while the
   * penalty keeps the normal equations well posed between uneven points. */
  p->b.spans = (int) fmin (fmax ((double) (n - 1) / 2.0, 4.0), 2000.0);
  p->b.a = 0.0;
  p->b.h = len / p->b.spans;
  count = df_bspline_count (&p->b);
  p->coef = calloc ((size_t) count * 2, sizeof (double));
  p->s_knot = calloc ((size_t) p->b.spans + 1, sizeof (double));
  if (p->coef == NULL || p->s_knot == NULL)
    {
      free (x.c);
      profile_free (p);
      return DF_E_NOMEM;
    }
  x.p = p;
  x.n = n;
  x.rz = rz;
  x.scale = df_bspline_lambda_scale (&p->b, n, x.c);

  /* Ends on the axis. A smooth pole: the data meet the axis at a right angle, so the first
   * chord is near radial and the next one turns further (on a circle the chord angles grow
   * as 1/2, 3/2, ... of the step); a cone's chords keep one angle. Rule: first chord within
   * 1 degree of radial, or less than 0.6 of the next one's angle (our own rule, no source). */
  for (int e = 0; e < 2; e++)
    {
      size_t i0 = e == 0 ? 0 : n - 1, i1 = e == 0 ? 1 : n - 2, i2 = e == 0 ? 2 : n - 3;
      double c = x.c[i0];

      p->info.pole[e] = 0;
      if (rz[i0][0] > AXIS_REL * r_max)
        continue;
      {
        double a1 = chord_angle (rz[i0], rz[i1]), a2 = chord_angle (rz[i1], rz[i2]);
        bool smooth = a1 <= M_PI / 180.0 || a1 < 0.6 * a2;

        p->info.pole[e] = smooth ? 1 : 2;
        x.cons[x.ncons++] = (df_bspline_constraint) { c, 0, 0, 0.0 };
        if (smooth)
          {
            /* r odd and z even about the pole, to the quintic's fourth derivative. */
            x.cons[x.ncons++] = (df_bspline_constraint) { c, 1, 1, 0.0 };
            x.cons[x.ncons++] = (df_bspline_constraint) { c, 2, 0, 0.0 };
            x.cons[x.ncons++] = (df_bspline_constraint) { c, 3, 1, 0.0 };
          }
      }
    }

  st = _df_fit_choose_lambda (profile_trial, &x, tolerance, &lambda, diag);
  if (st == DF_OK)
    {
      double rms, gcv;

      st = profile_trial (&x, lambda, 0, &rms, &gcv, diag);
    }
  if (st != DF_OK)
    {
      free (x.c);
      profile_free (p);
      return st;
    }
  profile_residuals (&x, &p->info);
  p->info.lambda = lambda;
  p->info.chosen = tolerance < 0.0;
  p->info.tolerance = tolerance < 0.0 ? p->info.rms : tolerance;
  free (x.c);

  for (int k = 0; k < p->b.spans; k++)
    p->s_knot[k + 1] = p->s_knot[k] + arc_piece (p, k * p->b.h, (k + 1) * p->b.h);
  for (int k = 1; k <= p->b.spans; k++)
    if (!(p->s_knot[k] > p->s_knot[k - 1]))
      {
        double at = k * p->b.h;

        profile_free (p);
        return df_diag_fail (diag, DF_E_SINGULAR, -1, "the fitted profile stops (zero speed) "
                             "near chord length %.6g", at);
      }
  dom[0] = 0.0;
  dom[1] = p->s_knot[p->b.spans];
  dom[2] = dom[3] = 0.0;
  if (info != NULL)
    *info = p->info;
  *out = df_fn_new (&_df_fit_profile_type, p, 1, 2, dom);
  return *out != NULL ? DF_OK : DF_E_NOMEM;
}

bool
df_fit_get_info (const df_fn *fn, df_fit_info *info)
{
  const profile_data *p = df_fn_get_data (fn, &_df_fit_profile_type);
  const void *g = df_fn_get_data (fn, &_df_fit_grid_type);
  const void *sc = df_fn_get_data (fn, &_df_fit_scattered_type);

  if (p != NULL)
    *info = p->info;
  else if (g != NULL)
    *info = *_df_fit_grid_info (g);
  else if (sc != NULL)
    *info = *_df_fit_scattered_info (sc);
  else
    return false;
  return true;
}

bool
df_fit_set_info (df_fn *fn, const df_fit_info *info)
{
  /* The data belong to fn; the accessors hand them out const for readers only. */
  profile_data *p = (profile_data *) df_fn_get_data (fn, &_df_fit_profile_type);
  const void *gd = df_fn_get_data (fn, &_df_fit_grid_type);
  const void *sd = df_fn_get_data (fn, &_df_fit_scattered_type);
  df_fit_info *g = gd != NULL   ? (df_fit_info *) _df_fit_grid_info (gd)
                   : sd != NULL ? (df_fit_info *) _df_fit_scattered_info (sd)
                                : NULL;

  if (p != NULL)
    p->info = *info;
  else if (g != NULL)
    *g = *info;
  else
    return false;
  return true;
}
