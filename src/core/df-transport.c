/* df-transport.c: parallel transport along a curve by adaptive Runge-Kutta (GSL odeiv2, rk8pd),
 * in the chart form dV^k/dtau + Gamma^k_ij x'^i V^j = 0 or the extrinsic form
 * dV/dtau = -(V . dN/dtau) N. The integrator restarts at the curve's corners and stops at each
 * output sample, so steps never straddle a kink.
 * Plain C + libm + GSL; no GLib. */
#include "df-transport.h"
#include "df-vec3.h"

#include <gsl/gsl_errno.h>
#include <gsl/gsl_odeiv2.h>
#include <math.h>
#include <stdbool.h>
#include <stdlib.h>
#include <string.h>

#include "df-geometry.h"
#include "df-loop.h"

/* Nodes of a spline path up to this many are integration stops (see below). */
#define NODE_STOPS_MAX 512
/* From this many stops on, the lower-order stepper is used. */
#define MANY_STOPS 64

typedef struct
{
  const df_curve   *curve;
  const df_surface *surface;
  size_t            evals;
  double            max_abs_kg;
  const df_transport_options *options;
  df_diag           fail;      /* where the right-hand side failed */
  df_status         fail_status;
} transport_ctx;

/* The state: the carried vector (2 chart components or 3 space ones), then the arc length,
 * which is as smooth as the vector's right-hand side and so costs no extra steps. */

double
df_signed_angle (const double a[3], const double b[3], const double n[3])
{
  double pa[3], pb[3], c[3], an = df_dot3 (a, n), bn = df_dot3 (b, n);

  for (int k = 0; k < 3; k++)
    {
      pa[k] = a[k] - an * n[k];
      pb[k] = b[k] - bn * n[k];
    }
  df_cross3 (pa, pb, c);
  /* atan2 gives -pi for a negative zero sine: fold that onto pi, so the range is (-pi, pi]. */
  {
    double a = atan2 (df_dot3 (c, n), df_dot3 (pa, pb));

    return a <= -M_PI ? M_PI : a;
  }
}

void
df_transport_options_init (df_transport_options *o)
{
  o->rel_tol = 1e-11;
  o->abs_tol = 1e-12;
  o->form = DF_TRANSPORT_AUTO;
  o->n_out = 0;
  o->n_extra = 0;
  o->extra = NULL;
  o->extra_user = NULL;
}

void
df_transport_result_clear (df_transport_result *r)
{
  if (r == NULL)
    return;
  free (r->samples);
  memset (r, 0, sizeof *r);
}

/* Gauss-Legendre rule of order 10 on [-1, 1] (Abramowitz and Stegun, table 25.4, from
 * memory): the extra integrands are integrated over each accepted step with it, which is as
 * accurate as the step's own eighth-order rule and needs 5 evaluations instead of 13. */
static const double gl5_x[5] = { -0.906179845938664, -0.538469310105683, 0.0, 0.538469310105683,
                                 0.906179845938664 };
static const double gl5_w[5] = { 0.236926885056189, 0.478628670499366, 0.568888888888889,
                                 0.478628670499366, 0.236926885056189 };

static df_status
integrate_extra (transport_ctx *ctx, double a, double b, double *acc)
{
  const df_transport_options *o = ctx->options;
  double half = 0.5 * (b - a), mid = 0.5 * (a + b);

  for (int k = 0; k < 5; k++)
    {
      double tau = mid + half * gl5_x[k], p[2], dp[2], ddp[2], v[DF_TRANSPORT_MAX_EXTRA];
      df_status st;

      df_curve_eval_plane (ctx->curve, tau, p, dp, ddp);
      if ((st = o->extra (tau, p, dp, v, o->extra_user)) != DF_OK)
        return df_diag_fail (&ctx->fail, st, -1, "an integrand along the path failed at tau "
                             "= %.6g", tau);
      for (size_t m = 0; m < o->n_extra; m++)
        acc[m] += half * gl5_w[k] * v[m];
    }
  return DF_OK;
}

static void
note_kg (transport_ctx *ctx, double kg)
{
  if (isfinite (kg) && fabs (kg) > ctx->max_abs_kg)
    ctx->max_abs_kg = fabs (kg);
}

/* Chart form: y = (V^1, V^2, s). One second-order evaluation of the chart gives Gamma, the
 * speed and the geodesic curvature. Returning GSL_EBADFUNC stops the integrator cleanly when
 * the curve leaves the chart. */
static int
rhs_chart (double tau, const double y[], double dydt[], void *data)
{
  transport_ctx *ctx = data;
  double p[2], dp[2], ddp[2], gamma[2][2][2], dx[3], ddx[3], n[3], len, speed;
  df_chart_jet j;
  df_status st;

  ctx->evals++;
  df_curve_eval_plane (ctx->curve, tau, p, dp, ddp);
  st = df_surface_eval (ctx->surface, p[0], p[1], 2, &j, &ctx->fail);
  if (st == DF_OK && df_chart_jet_christoffel (&j, gamma) != DF_OK)
    st = df_diag_fail_at (&ctx->fail, DF_E_SINGULAR, -1, p[0], p[1], "the chart is singular here");
  if (st != DF_OK)
    {
      ctx->fail_status = st;
      return GSL_EBADFUNC;
    }
  for (int k = 0; k < 2; k++)
    {
      double acc = 0.0;

      for (int a = 0; a < 2; a++)
        for (int b = 0; b < 2; b++)
          acc += gamma[k][a][b] * dp[a] * y[b];
      dydt[k] = -acc;
    }
  for (int k = 0; k < 3; k++)
    {
      dx[k] = j.d1[0][k] * dp[0] + j.d1[1][k] * dp[1];
      ddx[k] = j.d2[0][k] * dp[0] * dp[0] + 2 * j.d2[1][k] * dp[0] * dp[1]
               + j.d2[2][k] * dp[1] * dp[1] + j.d1[0][k] * ddp[0] + j.d1[1][k] * ddp[1];
    }
  df_cross3 (j.d1[0], j.d1[1], n);
  len = sqrt (df_dot3 (n, n));
  for (int k = 0; k < 3; k++)
    n[k] /= len;
  note_kg (ctx, df_geodesic_curvature (dx, ddx, n, &speed));
  dydt[2] = speed;
  return GSL_SUCCESS;
}

/* Extrinsic form: y = (V in space, s). */
static int
rhs_extrinsic (double tau, const double y[], double dydt[], void *data)
{
  transport_ctx *ctx = data;
  df_curve_point cp;
  df_status st;
  double vdn, speed;

  ctx->evals++;
  st = df_curve_eval (ctx->curve, tau, &cp, &ctx->fail);
  if (st != DF_OK)
    {
      ctx->fail_status = st;
      return GSL_EBADFUNC;
    }
  vdn = df_dot3 (y, cp.dnormal);
  for (int k = 0; k < 3; k++)
    dydt[k] = -vdn * cp.normal[k];
  note_kg (ctx, df_geodesic_curvature (cp.dx, cp.ddx, cp.normal, &speed));
  dydt[3] = speed;
  return GSL_SUCCESS;
}

/* Space vector from chart components at a curve point and back (least squares through g). */
static df_status
chart_frame (const df_surface *s, double u, double v, double xu[3], double xv[3], df_diag *diag)
{
  df_chart_jet j;
  df_status st = df_surface_eval (s, u, v, 1, &j, diag);

  if (st != DF_OK)
    return st;
  memcpy (xu, j.d1[0], 3 * sizeof (double));
  memcpy (xv, j.d1[1], 3 * sizeof (double));
  return DF_OK;
}

static df_status
space_to_chart (const double xu[3], const double xv[3], const double w[3], double c[2])
{
  double g11 = df_dot3 (xu, xu), g12 = df_dot3 (xu, xv), g22 = df_dot3 (xv, xv);
  double b1 = df_dot3 (xu, w), b2 = df_dot3 (xv, w), det = g11 * g22 - g12 * g12;

  if (!(det > 0))
    return DF_E_SINGULAR;
  c[0] = (g22 * b1 - g12 * b2) / det;
  c[1] = (g11 * b2 - g12 * b1) / det;
  return DF_OK;
}

static void
chart_to_space (const double xu[3], const double xv[3], const double c[2], double w[3])
{
  for (int k = 0; k < 3; k++)
    w[k] = c[0] * xu[k] + c[1] * xv[k];
}

/* Chart form, after every step and at every sample: the carried vector w in space, the
 * tangent dx, and cp's x and normal all come from X_u and X_v, one first-order evaluation of
 * the chart, where a full curve point would cost a second-order one and the frame another. */
static df_status
chart_state (const transport_ctx *ctx, double tau, const double *y, double w[3],
             df_curve_point *cp, double dx[3], df_diag *diag)
{
  double p[2], dp[2], ddp[2], n[3], len;
  df_chart_jet j;
  df_status st;

  df_curve_eval_plane (ctx->curve, tau, p, dp, ddp);
  if ((st = df_surface_eval (ctx->surface, p[0], p[1], 1, &j, diag)) != DF_OK)
    return st;
  df_cross3 (j.d1[0], j.d1[1], n);
  len = sqrt (df_dot3 (n, n));
  if (!(len > 0))
    return df_diag_fail_at (diag, DF_E_SINGULAR, -1, p[0], p[1],
                            "the curve runs through a singular point of the chart");
  for (int k = 0; k < 3; k++)
    {
      n[k] /= len;
      dx[k] = j.d1[0][k] * dp[0] + j.d1[1][k] * dp[1];
    }
  chart_to_space (j.d1[0], j.d1[1], y, w);
  memcpy (cp->x, j.x, sizeof cp->x);
  memcpy (cp->normal, n, sizeof cp->normal);
  return DF_OK;
}

/* The carried vector in space at tau from the state y; cp gets at least x and the normal. */
static df_status
state_to_space (const transport_ctx *ctx, bool chart, double tau, const double *y, double w[3],
                df_curve_point *cp, df_diag *diag)
{
  df_status st;
  double dx[3];

  if (chart)
    return chart_state (ctx, tau, y, w, cp, dx, diag);
  if ((st = df_curve_eval (ctx->curve, tau, cp, diag)) != DF_OK)
    return st;
  memcpy (w, y, 3 * sizeof (double));
  return DF_OK;
}

/* Angle from the unit tangent at tau_t to the carried vector at tau, about N. */
static df_status
tangent_angle (const transport_ctx *ctx, bool chart, double tau, double tau_t, const double *y,
               double *angle, double w[3], df_curve_point *cp, df_diag *diag)
{
  df_curve_point ct;
  df_status st;

  if (chart && tau_t == tau)
    {
      double dx[3];

      if ((st = chart_state (ctx, tau, y, w, cp, dx, diag)) != DF_OK)
        return st;
      *angle = df_signed_angle (dx, w, cp->normal);
      return DF_OK;
    }
  if ((st = state_to_space (ctx, chart, tau, y, w, cp, diag)) != DF_OK)
    return st;
  if (tau_t == tau)
    ct = *cp;
  else if ((st = df_curve_eval (ctx->curve, tau_t, &ct, diag)) != DF_OK)
    return st;
  *angle = df_signed_angle (ct.dx, w, cp->normal);
  return DF_OK;
}

static int
compare_double (const void *a, const void *b)
{
  double x = *(const double *) a, y = *(const double *) b;

  return (x > y) - (x < y);
}

static bool
is_break (const double *breaks, size_t n_breaks, double tau)
{
  for (size_t i = 0; i < n_breaks; i++)
    if (breaks[i] == tau)
      return true;
  return false;
}

df_status
df_transport_run (const df_curve *curve, const double *v0_space,
                  const df_transport_options *options, df_transport_result *out,
                  df_diag *diag)
{
  df_transport_options defaults;
  transport_ctx ctx = { curve, df_curve_get_surface (curve), 0, 0.0, NULL, { 0 }, DF_OK };
  bool chart;
  double tau0, tau1, y[4], w0[3], len, psi, psi_acc = 0.0, smooth_acc = 0.0, corners = 0.0;
  df_curve_point cp;
  const double *breaks, *nodes;
  size_t n_breaks, n_nodes, n_stops = 0, n_out, dim, next_out = 0;
  double *stops = NULL;
  gsl_odeiv2_system sys;
  gsl_odeiv2_step *step = NULL;
  gsl_odeiv2_control *control = NULL;
  gsl_odeiv2_evolve *evolve = NULL;
  df_status st = DF_OK;
  double h, tau, eps;

  memset (out, 0, sizeof *out);
  df_diag_clear (diag);
  df_diag_clear (&ctx.fail);
  if (options == NULL)
    {
      df_transport_options_init (&defaults);
      options = &defaults;
    }
  if (options->n_extra > DF_TRANSPORT_MAX_EXTRA || (options->n_extra && !options->extra))
    return df_diag_fail (diag, DF_E_INPUT, -1, "bad extra integrands");
  ctx.options = options;
  chart = options->form == DF_TRANSPORT_CHART
          || (options->form == DF_TRANSPORT_AUTO && df_curve_get_coords (curve) == DF_COORDS_CHART);
  if (chart && df_curve_get_coords (curve) != DF_COORDS_CHART)
    return df_diag_fail (diag, DF_E_INPUT, -1, "the chart form needs a curve in chart coordinates");
  df_curve_get_range (curve, &tau0, &tau1);
  n_breaks = df_curve_get_breaks (curve, &breaks);
  /* Tangents on either side of a corner are taken this far from it. */
  eps = 1e-9 * (tau1 - tau0);

  /* Start vector: tangent-plane part of v0, unit length. */
  if ((st = df_curve_eval (curve, tau0, &cp, diag)) != DF_OK)
    return st;
  memcpy (out->start_normal, cp.normal, sizeof out->start_normal);
  if (v0_space != NULL)
    memcpy (w0, v0_space, sizeof w0);
  else
    memcpy (w0, cp.dx, sizeof w0);
  {
    double wn = df_dot3 (w0, cp.normal);

    for (int k = 0; k < 3; k++)
      w0[k] -= wn * cp.normal[k];
  }
  len = sqrt (df_dot3 (w0, w0));
  if (!(len > 0) || !isfinite (len))
    return df_diag_fail (diag, DF_E_INPUT, 0, "the start vector has no part in the tangent plane");
  for (int k = 0; k < 3; k++)
    w0[k] /= len;
  memcpy (out->start_vector, w0, sizeof w0);
  if (chart)
    {
      double xu[3], xv[3];

      if ((st = chart_frame (ctx.surface, cp.u, cp.v, xu, xv, diag)) != DF_OK)
        return st;
      if (space_to_chart (xu, xv, w0, y) != DF_OK)
        return df_diag_fail_at (diag, DF_E_SINGULAR, 0, cp.u, cp.v,
                                "the chart is singular at the start");
    }
  else
    memcpy (y, w0, sizeof w0);
  dim = chart ? 2 : 3;
  y[dim] = 0.0;
  psi = df_signed_angle (cp.dx, w0, cp.normal);

  /* Stops: corners and output samples, sorted. */
  n_out = options->n_out >= 2 ? options->n_out : 0;
  n_nodes = df_curve_get_nodes (curve, &nodes);
  stops = malloc ((n_breaks + n_nodes + n_out + 1) * sizeof *stops);
  if (n_out)
    out->samples = calloc (n_out, sizeof *out->samples);
  if (stops == NULL || (n_out && out->samples == NULL))
    {
      st = DF_E_NOMEM;
      goto done;
    }
  for (size_t i = 0; i < n_breaks; i++)
    if (breaks[i] > tau0 && breaks[i] < tau1)
      stops[n_stops++] = breaks[i];
  /* A spline path is only C^2 at its nodes, so the right-hand side (which has the path's
   * velocity) has a kink in its second derivative there: a step across a node loses the
   * integrator's order and the step control shrinks the steps around every node. Stopping
   * at the nodes keeps every step on one polynomial piece. */
  /* Dense nodes (a scanned loop) are left out: their kinks are small, and a stop at each of
   * 10^4 nodes would cost more steps than the kinks do. */
  for (size_t i = 0; n_nodes <= NODE_STOPS_MAX && i < n_nodes; i++)
    if (nodes[i] > tau0 && nodes[i] < tau1)
      stops[n_stops++] = nodes[i];
  for (size_t i = 1; i + 1 < n_out; i++)
    stops[n_stops++] = tau0 + (tau1 - tau0) * i / (n_out - 1);
  stops[n_stops++] = tau1;
  qsort (stops, n_stops, sizeof *stops, compare_double);

  sys.function = chart ? rhs_chart : rhs_extrinsic;
  sys.jacobian = NULL;
  sys.dimension = dim + 1;
  sys.params = &ctx;
  /* Many stops bound the step length, not the accuracy: then each stretch takes about one
   * step whatever the order, and Cash-Karp's 6 stages cost less than half of rk8pd's 13 at
   * the same tolerance (measured on the report benchmark: Gauss-Bonnet residuals stay below
   * 1e-12 rad). Few stops leave long smooth stretches where the eighth order pays, and so do
   * dense nodes that are not stops (their kinks cost the fifth order more accuracy). */
  step = gsl_odeiv2_step_alloc (n_stops >= MANY_STOPS && n_nodes <= NODE_STOPS_MAX
                                ? gsl_odeiv2_step_rkck : gsl_odeiv2_step_rk8pd, sys.dimension);
  control = gsl_odeiv2_control_y_new (options->abs_tol, options->rel_tol);
  evolve = gsl_odeiv2_evolve_alloc (sys.dimension);
  if (!step || !control || !evolve)
    {
      st = DF_E_NOMEM;
      goto done;
    }

  if (n_out)
    {
      df_transport_sample *smp = &out->samples[next_out++];

      smp->tau = tau0;
      memcpy (smp->x, cp.x, sizeof smp->x);
      memcpy (smp->normal, cp.normal, sizeof smp->normal);
      memcpy (smp->vector, w0, sizeof w0);
    }
  tau = tau0;
  h = (tau1 - tau0) / 64;
  for (size_t k = 0; k < n_stops; k++)
    {
      double target = stops[k], w[3];
      size_t guard = 0;

      if (target <= tau)
        continue;
      while (tau < target)
        {
          double tau_prev = tau, psi_new, d;
          int rc = gsl_odeiv2_evolve_apply (evolve, control, step, &sys, &tau, target, &h, y);

          if (rc != GSL_SUCCESS)
            {
              if (ctx.fail_status != DF_OK)
                {
                  st = ctx.fail_status;
                  if (diag)
                    *diag = ctx.fail;
                }
              else
                {
                  df_curve_point cp;
                  double u = NAN, v = NAN;

                  /* Not an internal error for the user: the step could not get past a point
                   * where the surface or the path is singular; name where it is. */
                  if (df_curve_eval (curve, tau, &cp, NULL) == DF_OK)
                    {
                      u = cp.u;
                      v = cp.v;
                    }
                  st = df_diag_fail_at (diag, DF_E_NOCONVERGE, -1, u, v,
                                        "the transport could not step past tau = %.6g: "
                                        "the surface or the path is singular there (a cone "
                                        "apex, a cusp or a sharp fold)", tau);
                }
              goto done;
            }
          if (options->n_extra
              && (st = integrate_extra (&ctx, tau_prev, tau, out->extra)) != DF_OK)
            {
              if (diag)
                *diag = ctx.fail;
              goto done;
            }
          if (++guard > 10000000)
            {
              st = df_diag_fail (diag, DF_E_NOCONVERGE, -1, "too many integration steps");
              goto done;
            }
          /* Follow the tangent's turning against the carried vector step by step: the
           * change of angle is -k_g ds, exactly, with no quadrature of k_g (which is only
           * continuous on a spline). At a corner the left-hand tangent is used. */
          if ((st = tangent_angle (&ctx, chart, tau, tau >= target && is_break (breaks, n_breaks,
                                                                                 target)
                                                     ? tau - eps : tau,
                                   y, &psi_new, w, &cp, diag)) != DF_OK)
            goto done;
          d = df_wrap_angle (psi_new - psi);
          psi_acc += d;
          smooth_acc += d;
          psi = psi_new;
        }
      if (is_break (breaks, n_breaks, target))
        {
          /* The turning angle at the corner: from the left tangent to the right one. */
          double psi_right;

          if ((st = tangent_angle (&ctx, chart, tau, tau + eps, y, &psi_right, w, &cp, diag))
              != DF_OK)
            goto done;
          corners += df_wrap_angle (psi - psi_right);
          psi_acc += df_wrap_angle (psi_right - psi);
          psi = psi_right;
          /* A corner is a fresh start for the step size. */
          gsl_odeiv2_evolve_reset (evolve);
          gsl_odeiv2_step_reset (step);
        }
      if (n_out && next_out < n_out
          && fabs (target - (tau0 + (tau1 - tau0) * next_out / (n_out - 1))) <= 1e-12 * (tau1 - tau0))
        {
          df_transport_sample *smp = &out->samples[next_out++];

          if ((st = state_to_space (&ctx, chart, tau, y, w, &cp, diag)) != DF_OK)
            goto done;
          smp->tau = tau;
          memcpy (smp->x, cp.x, sizeof smp->x);
          memcpy (smp->normal, cp.normal, sizeof smp->normal);
          memcpy (smp->vector, w, sizeof w);
          smp->s = y[dim];
          smp->angle = psi_acc;
        }
    }
  {
    double w[3];

    if ((st = state_to_space (&ctx, chart, tau1, y, w, &cp, diag)) != DF_OK)
      goto done;
    memcpy (out->end_vector, w, sizeof w);
    memcpy (out->end_normal, cp.normal, sizeof out->end_normal);
    out->norm_drift = fabs (sqrt (df_dot3 (w, w)) - 1.0);
    for (int k = 0; k < 3; k++)
      if (!isfinite (w[k]))
        st = df_diag_fail (diag, DF_E_NONFINITE, -1, "the carried vector is not finite");
  }
  out->n_samples = next_out;
  out->length = y[dim];
  out->total_kg = -smooth_acc;
  out->corner_turning = corners;
  out->max_abs_kg = ctx.max_abs_kg;

done:
  out->rhs_evals = ctx.evals;
  free (stops);
  if (evolve) gsl_odeiv2_evolve_free (evolve);
  if (control) gsl_odeiv2_control_free (control);
  if (step) gsl_odeiv2_step_free (step);
  if (st != DF_OK)
    {
      size_t evals = out->rhs_evals;

      df_transport_result_clear (out);
      out->rhs_evals = evals;
    }
  return st;
}
