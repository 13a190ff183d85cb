/* df-verdict.c: stretches of a measured curve where the user's limits are exceeded (see
 * df-verdict.h). Works on the measured samples; the ends of each stretch are refined between
 * samples so that a coarse sampling does not move them by a whole sample spacing.
 * Plain C + libm; no GLib. */
#include "df-verdict.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "df-vec3.h"
#include "df-verdict-private.h"

/* Beyond this |k_g / k_n| the normal curvature has vanished to rounding: no friction holds. */
#define RATIO_UNBOUNDED 1e12

typedef struct
{
  const df_curve *curve;
  df_limit_id     id;
  double          tiny_kg;   /* |k_g| below this is straight (1e-9 / surface size) */
} quantity_ctx;

df_status
df_curve_curvatures (const df_curve *curve, double tau, double *k_g, double *k_n,
                     df_diag *diag)
{
  df_curve_point cp;
  double speed;
  df_status st = df_curve_eval (curve, tau, &cp, diag);

  if (st != DF_OK)
    return st;
  *k_g = df_geodesic_curvature (cp.dx, cp.ddx, cp.normal, &speed);
  /* x'' = X_ij x'^i x'^j + X_k x''^k; the dot with N keeps II(x', x') only. */
  *k_n = df_dot3 (cp.ddx, cp.normal) / (speed * speed);
  if (!isfinite (*k_g) || !isfinite (*k_n))
    return df_diag_fail (diag, DF_E_NONFINITE, -1, "curvature not finite at tau = %g", tau);
  return DF_OK;
}

static double
ratio (double k_g, double k_n, double tiny_kg)
{
  if (fabs (k_g) <= tiny_kg)
    return 0.0;
  if (fabs (k_n) * RATIO_UNBOUNDED <= fabs (k_g))
    return INFINITY;
  return fabs (k_g) / fabs (k_n);
}

/* The compared quantity at tau (steering: |k_g|; friction: |k_g / k_n|), exact. */
static df_status
quantity_at (const quantity_ctx *ctx, double tau, double *q, df_diag *diag)
{
  double k_g, k_n;
  df_status st = df_curve_curvatures (ctx->curve, tau, &k_g, &k_n, diag);

  if (st != DF_OK)
    return st;
  *q = ctx->id == DF_LIMIT_FRICTION ? ratio (k_g, k_n, ctx->tiny_kg) : fabs (k_g);
  return DF_OK;
}

/* Arc length from tau_a to tau_b (a short piece): 5-point Gauss-Legendre on |x'|
 * (Abramowitz and Stegun 25.4.29, nodes and weights from memory). */
static df_status
arc_length (const df_curve *curve, double tau_a, double tau_b, double *out, df_diag *diag)
{
  static const double x[5] = { 0.0, -0.5384693101056831, 0.5384693101056831,
                               -0.9061798459386640, 0.9061798459386640 };
  static const double w[5] = { 0.5688888888888889, 0.4786286704993665, 0.4786286704993665,
                               0.2369268850561891, 0.2369268850561891 };
  double mid = 0.5 * (tau_a + tau_b), half = 0.5 * (tau_b - tau_a), sum = 0.0;

  for (int k = 0; k < 5; k++)
    {
      df_curve_point cp;
      df_status st = df_curve_eval (curve, mid + half * x[k], &cp, diag);

      if (st != DF_OK)
        return st;
      sum += w[k] * sqrt (df_dot3 (cp.dx, cp.dx));
    }
  *out = sum * half;
  return DF_OK;
}

/* Where between samples a and b (one within, one beyond qlim) the quantity crosses qlim, as an
 * arc length. tau_b and s_b are given unwrapped (past the end of a closed curve when b wrapped
 * round). */
static df_status
crossing (const quantity_ctx *ctx, double tau_a, double s_a, double q_a, double tau_b,
          double s_b, double q_b, double qlim, double *s_out, df_diag *diag)
{
  double lo = tau_a, hi = tau_b, piece;
  bool a_beyond = q_a > qlim;
  df_status st;

  if (ctx->id == DF_LIMIT_MAX_FIBRE_DEVIATION)
    {
      /* The deviation comes from the transport and is known only at the samples: linear. */
      double f = (qlim - q_a) / (q_b - q_a);

      *s_out = s_a + (isfinite (f) ? fmin (fmax (f, 0.0), 1.0) : 0.5) * (s_b - s_a);
      return DF_OK;
    }
  /* Bisection: 50 halvings take the parameter interval far below the samples' rounding. */
  for (int it = 0; it < 50; it++)
    {
      double mid = 0.5 * (lo + hi), q;

      if ((st = quantity_at (ctx, mid, &q, diag)) != DF_OK)
        return st;
      if ((q > qlim) == a_beyond)
        lo = mid;
      else
        hi = mid;
    }
  if ((st = arc_length (ctx->curve, tau_a, 0.5 * (lo + hi), &piece, diag)) != DF_OK)
    return st;
  *s_out = fmin (s_a + piece, s_b);
  return DF_OK;
}

static df_status
push (df_verdict_list *out, const df_verdict *v)
{
  df_verdict *items = realloc (out->items, (out->n + 1) * sizeof *items);

  if (items == NULL)
    return DF_E_NOMEM;
  out->items = items;
  out->items[out->n++] = *v;
  if (!v->within)
    out->n_exceeded++;
  return DF_OK;
}

static void
set_worst (df_verdict *v, const df_loop_sample *smp, double q, const df_limits *limits)
{
  v->s_worst = smp->s;
  v->u_worst = smp->u;
  v->v_worst = smp->v;
  memcpy (v->point_worst, smp->point, sizeof v->point_worst);
  switch (v->limit)
    {
    case DF_LIMIT_MIN_STEERING_RADIUS:
      v->has_value = q > 0.0;
      v->value = q > 0.0 ? 1.0 / q : 0.0;
      if (limits->item[DF_LIMIT_TOW_WIDTH].set)
        {
          v->has_tow = true;
          v->tow_compression = 0.5 * limits->item[DF_LIMIT_TOW_WIDTH].model_value * q;
        }
      break;
    case DF_LIMIT_FRICTION:
      v->has_value = isfinite (q);
      v->value = isfinite (q) ? q : 0.0;
      break;
    default:
      v->has_value = true;
      v->value = q;
      break;
    }
}

static df_status
check_one (const df_curve *curve, bool closed, const df_loop_sample *smp, size_t n,
           double length, const df_limits *limits, df_limit_id id, double size,
           df_verdict_list *out, df_diag *diag)
{
  quantity_ctx ctx = { curve, id, 1e-9 / size };
  /* k_g and k_n are periodic round a closed curve; the deviation restarts at 0 there. */
  bool periodic = closed && id != DF_LIMIT_MAX_FIBRE_DEVIATION;
  size_t m = periodic ? n - 1 : n;   /* the last sample of a closed curve repeats the first */
  double *q = malloc (n * sizeof *q);
  double qlim, tau0, tau1;
  size_t start = 0, worst_all = 0;
  bool any = false, all = true;
  df_status st = DF_OK;

  if (q == NULL)
    return DF_E_NOMEM;
  tau0 = 0.0;
  tau1 = 1.0;
  if (curve != NULL)
    df_curve_get_range (curve, &tau0, &tau1);
  switch (id)
    {
    case DF_LIMIT_MIN_STEERING_RADIUS:
      qlim = 1.0 / limits->item[id].model_value;
      break;
    default:
      qlim = limits->item[id].model_value;
      break;
    }
  for (size_t i = 0; i < n; i++)
    {
      if (id == DF_LIMIT_MAX_FIBRE_DEVIATION)
        q[i] = fabs (df_wrap_angle (smp[i].angle_rad)) * 180.0 / M_PI;
      else
        {
          double k_g, k_n;

          if ((st = df_curve_curvatures (curve, smp[i].tau, &k_g, &k_n, diag)) != DF_OK)
            goto done;
          q[i] = id == DF_LIMIT_FRICTION ? ratio (k_g, k_n, ctx.tiny_kg) : fabs (k_g);
        }
    }
  for (size_t i = 0; i < m; i++)
    {
      if (q[i] > q[worst_all])
        worst_all = i;
      any = any || q[i] > qlim;
      all = all && q[i] > qlim;
    }

  if (!any || all)
    {
      df_verdict v = { .limit = id, .within = !any, .threshold = limits->item[id].model_value };

      set_worst (&v, &smp[worst_all], q[worst_all], limits);
      v.has_where = any;
      v.s0 = 0.0;
      v.s1 = length;
      st = push (out, &v);
      goto done;
    }

  /* Runs of samples beyond the limit. On a periodic curve begin the scan just after a sample
   * within it, so that no run is cut in two by the start. */
  if (periodic)
    while (q[start] > qlim)
      start++;
  for (size_t k = 0; k < m; k++)
    {
      size_t i = (start + k) % m, first, last, worst, j;
      df_verdict v = { .limit = id, .within = false, .has_where = true,
                       .threshold = limits->item[id].model_value };
      size_t prev, next;
      double s_first, s_last, tau_next, s_next, tau_prev, s_prev;

      if (!(q[i] > qlim) || (k > 0 && q[(i + m - 1) % m] > qlim && (periodic || i > 0)))
        continue;
      first = i;
      worst = i;
      last = i;
      for (j = k + 1; j < m || (!periodic && j < n); j++)
        {
          size_t jj = periodic ? (start + j) % m : j;

          if (!(q[jj] > qlim))
            break;
          last = jj;
          if (q[jj] > q[worst])
            worst = jj;
        }
      k = j - 1;

      /* Start of the run. */
      if (!periodic && first == 0)
        v.s0 = 0.0;
      else
        {
          prev = periodic ? (first + m - 1) % m : first - 1;
          tau_prev = smp[prev].tau;
          s_prev = smp[prev].s;
          if (periodic && prev > first)
            {
              /* The previous sample lies before the start: bring it back one period. */
              tau_prev -= tau1 - tau0;
              s_prev -= length;
            }
          if ((st = crossing (&ctx, tau_prev, s_prev, q[prev], smp[first].tau, smp[first].s,
                              q[first], qlim, &s_first, diag)) != DF_OK)
            goto done;
          v.s0 = s_first < 0.0 ? s_first + length : s_first;
        }
      /* End of the run. */
      if (!periodic && last == n - 1)
        v.s1 = length;
      else
        {
          next = periodic ? (last + 1) % m : last + 1;
          tau_next = smp[next].tau;
          s_next = smp[next].s;
          if (periodic && next < last)
            {
              tau_next += tau1 - tau0;
              s_next += length;
            }
          if ((st = crossing (&ctx, smp[last].tau, smp[last].s, q[last], tau_next, s_next,
                              q[next], qlim, &s_last, diag)) != DF_OK)
            goto done;
          v.s1 = s_last > length ? s_last - length : s_last;
        }
      set_worst (&v, &smp[worst], q[worst], limits);
      if ((st = push (out, &v)) != DF_OK)
        goto done;
    }

done:
  free (q);
  return st;
}

df_status
_df_verdicts_from_samples (const df_curve *curve, bool closed, double size,
                           const df_loop_sample *samples, size_t n_samples, double length,
                           const df_limits *limits, const df_limit_id *ids, size_t n_ids,
                           df_verdict_list *out, df_diag *diag)
{
  if (samples == NULL || limits == NULL || n_samples < 8)
    return df_diag_fail (diag, DF_E_INPUT, -1, "verdicts need samples, limits and >= 8 samples");
  if (!(length > 0.0) || !isfinite (length))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the curve has no length");
  for (size_t i = 0; i < n_ids; i++)
    {
      df_status st;

      if (!limits->item[ids[i]].set)
        continue;
      /* Without a curve only the deviation (known at the samples) can be refined. */
      if (curve == NULL && ids[i] != DF_LIMIT_MAX_FIBRE_DEVIATION)
        continue;
      st = check_one (curve, closed, samples, n_samples, length, limits, ids[i], size, out,
                      diag);
      if (st != DF_OK)
        {
          df_verdict_list_clear (out);
          return st;
        }
    }
  return DF_OK;
}

df_status
df_verdicts_measure (const df_curve *curve, const df_loop_sample *samples, size_t n_samples,
                     double length, const df_limits *limits, df_verdict_list *out,
                     df_diag *diag)
{
  static const df_limit_id checked[] = { DF_LIMIT_MIN_STEERING_RADIUS,
                                         DF_LIMIT_MAX_FIBRE_DEVIATION, DF_LIMIT_FRICTION };

  memset (out, 0, sizeof *out);
  if (curve == NULL)
    return df_diag_fail (diag, DF_E_INPUT, -1, "verdicts need a curve");
  out->kind = df_curve_is_closed (curve) ? DF_VERDICT_LOOP : DF_VERDICT_PATH;
  return _df_verdicts_from_samples (curve, df_curve_is_closed (curve),
                                    df_surface_size (df_curve_get_surface (curve)), samples,
                                    n_samples, length, limits, checked,
                                    sizeof checked / sizeof checked[0], out, diag);
}

df_status
_df_verdict_push (df_verdict_list *out, const df_verdict *v)
{
  return push (out, v);
}

const char *
df_verdict_curve_name (df_verdict_curve kind)
{
  switch (kind)
    {
    case DF_VERDICT_GEODESIC:
      return "geodesic";
    case DF_VERDICT_PATH:
      return "path";
    default:
      return "loop";
    }
}

void
df_verdict_list_clear (df_verdict_list *list)
{
  if (list == NULL)
    return;
  df_verdict_curve kind = list->kind;

  free (list->items);
  memset (list, 0, sizeof *list);
  list->kind = kind;
}
