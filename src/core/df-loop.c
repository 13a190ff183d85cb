/* df-loop.c: loop measurement (holonomy, enclosed curvature by Green's theorem, Gauss-Bonnet
 * residual, geodesic curvature, area, length, steering radius, frame samples) and the
 * comparison of two paths with common ends.
 * Line integrals along the curve are integrated as a small ODE system y' = f(tau) with GSL's
 * adaptive rk8pd: an adaptive quadrature of several integrands at once that also yields the
 * running values at the sample points.
 * Plain C + libm + GSL; no GLib. */
#include "df-loop.h"

#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>
#include <gsl/gsl_odeiv2.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "df-geometry.h"

#define N_LINE 4   /* length, closed integral of k_g ds, Green curvature, Green area */

typedef struct
{
  const df_curve   *curve;
  const df_surface *surface;
  bool              revolution;
  bool              green;        /* evaluate the Green integrands */
  double            u_ref;        /* lower limit of the inner integrals */
  double            h_ref;        /* revolution: dr/ds taken at u_ref (1 or -1 at a pole) */
  double            max_abs_kg;
  size_t            evals;
  df_status         fail_status;
  df_diag           fail;
  gsl_integration_workspace *ws;  /* graph inner integrals */
} line_ctx;

static double
dot3 (const double a[3], const double b[3])
{
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}

static void
cross3 (const double a[3], const double b[3], double out[3])
{
  out[0] = a[1] * b[2] - a[2] * b[1];
  out[1] = a[2] * b[0] - a[0] * b[2];
  out[2] = a[0] * b[1] - a[1] * b[0];
}

double
df_wrap_angle (double a)
{
  a = fmod (a, 2 * M_PI);
  if (a > M_PI)
    a -= 2 * M_PI;
  else if (a <= -M_PI)
    a += 2 * M_PI;
  return a;
}

void
df_loop_options_init (df_loop_options *o)
{
  o->rel_tol = 1e-11;
  o->n_samples = 200;
}

void
df_loop_result_clear (df_loop_result *r)
{
  if (r == NULL)
    return;
  free (r->samples);
  memset (r, 0, sizeof *r);
}

/* Geodesic curvature of the curve at a point: x'' . (N x x') / |x'|^3. */
static double
geodesic_curvature (const df_curve_point *cp, double *speed)
{
  double nxt[3];

  *speed = sqrt (dot3 (cp->dx, cp->dx));
  cross3 (cp->normal, cp->dx, nxt);
  return dot3 (cp->ddx, nxt) / (*speed * *speed * *speed);
}

/* dr/ds of the profile at t. */
static double
profile_drds (const df_surface *s, double t, double *r_speed, df_diag *diag, df_status *st)
{
  df_chart_jet j;
  double sp;

  *st = df_surface_eval (s, t, 0.0, 1, &j, diag);
  if (*st != DF_OK)
    return 0.0;
  sp = hypot (j.d1[0][0], j.d1[0][2]);
  if (r_speed)
    *r_speed = j.x[0] * sp;
  return j.d1[0][0] / sp;
}

typedef struct
{
  line_ctx *ctx;
  double    fixed;     /* the other coordinate */
  bool      area;
} inner_ctx;

static double
inner_integrand (double x, void *data)
{
  inner_ctx *ic = data;
  double ksg, sg;

  if (ic->ctx->revolution)
    {
      df_status st;
      double rs = 0.0;

      profile_drds (ic->ctx->surface, x, &rs, NULL, &st);
      return st == DF_OK ? rs : NAN;
    }
  if (df_surface_k_area (ic->ctx->surface, x, ic->fixed, &ksg, &sg, NULL) != DF_OK)
    return NAN;
  return ic->area ? sg : ksg;
}

/* Inner integral from u_ref to u at fixed v of K sqrt(g) (area = false) or sqrt(g). */
static df_status
inner_integral (line_ctx *ctx, double u, double v, bool area, double *out)
{
  inner_ctx ic = { ctx, v, area };
  gsl_function f = { inner_integrand, &ic };
  double err;
  int rc;

  if (u == ctx->u_ref)
    {
      *out = 0.0;
      return DF_OK;
    }
  /* Gauss-Kronrod 15 with tight tolerances: the integrands are smooth along chart lines, so
   * one or two panels usually suffice. */
  rc = gsl_integration_qag (&f, ctx->u_ref, u, 1e-15 * fabs (u - ctx->u_ref), 1e-13, 200,
                            GSL_INTEG_GAUSS15, ctx->ws, out, &err);
  if (rc != GSL_SUCCESS || !isfinite (*out))
    return DF_E_NOCONVERGE;
  return DF_OK;
}

/* y = (length, int k_g ds, int H dv, int A dv). */
static int
line_rhs (double tau, const double y[], double dydt[], void *data)
{
  line_ctx *ctx = data;
  df_curve_point cp;
  double speed, kg, dv = 0.0;
  df_status st;

  (void) y;
  ctx->evals++;
  st = df_curve_eval (ctx->curve, tau, &cp, &ctx->fail);
  if (st != DF_OK)
    {
      ctx->fail_status = st;
      return GSL_EBADFUNC;
    }
  kg = geodesic_curvature (&cp, &speed);
  if (!isfinite (kg))
    {
      ctx->fail_status = df_diag_fail_at (&ctx->fail, DF_E_SINGULAR, -1, cp.u, cp.v,
                                          "the curve has zero speed");
      return GSL_EBADFUNC;
    }
  if (fabs (kg) > ctx->max_abs_kg)
    ctx->max_abs_kg = fabs (kg);
  dydt[0] = speed;
  dydt[1] = kg * speed;
  dydt[2] = dydt[3] = 0.0;
  if (!ctx->green)
    return GSL_SUCCESS;

  if (ctx->revolution)
    {
      /* K dA = -r_ss ds dphi: H(t) = dr/ds(u_ref) - dr/ds(t) (GEOMETRY.md). In polar curve
       * coordinates dphi/dtau = (p x p') / |p|^2, finite times H, which is O(rho^2) near a
       * smooth pole. */
      double drds = profile_drds (ctx->surface, cp.u, NULL, &ctx->fail, &st);
      double h_val, a_val;

      if (st != DF_OK)
        {
          ctx->fail_status = st;
          return GSL_EBADFUNC;
        }
      h_val = ctx->h_ref - drds;
      if (inner_integral (ctx, cp.u, 0.0, true, &a_val) != DF_OK)
        {
          ctx->fail_status = df_diag_fail_at (&ctx->fail, DF_E_NOCONVERGE, -1, cp.u, cp.v,
                                              "the area integral did not converge");
          return GSL_EBADFUNC;
        }
      if (df_curve_get_coords (ctx->curve) == DF_COORDS_CHART)
        {
          dv = cp.dp[1];
          dydt[2] = h_val * dv;
          dydt[3] = a_val * dv;
        }
      else
        {
          /* dphi = (p x p') / |p|^2 dtau. Near the pole p x p' loses its digits to rounding
           * while H and A vanish like |p|^2, so the quotients H / |p|^2 and A / |p|^2 are
           * formed first: the product then stays bounded instead of amplifying the noise. */
          double rho2 = cp.p[0] * cp.p[0] + cp.p[1] * cp.p[1];
          double pxdp = cp.p[0] * cp.dp[1] - cp.p[1] * cp.dp[0];

          dydt[2] = rho2 > 0 ? (h_val / rho2) * pxdp : 0.0;
          dydt[3] = rho2 > 0 ? (a_val / rho2) * pxdp : 0.0;
        }
    }
  else
    {
      double h_val, a_val;

      dv = cp.dp[1];
      if (inner_integral (ctx, cp.u, cp.v, false, &h_val) != DF_OK
          || inner_integral (ctx, cp.u, cp.v, true, &a_val) != DF_OK)
        {
          ctx->fail_status = df_diag_fail_at (&ctx->fail, DF_E_NOCONVERGE, -1, cp.u, cp.v,
                                              "the enclosed-curvature integral did not converge");
          return GSL_EBADFUNC;
        }
      dydt[2] = h_val * dv;
      dydt[3] = a_val * dv;
    }
  return GSL_SUCCESS;
}

static int
compare_double (const void *a, const void *b)
{
  double x = *(const double *) a, y = *(const double *) b;

  return (x > y) - (x < y);
}

/* Integrates the line integrals over the curve, recording the running values at n_at
 * increasing parameters `at` (may be NULL). */
static df_status
line_integrals (line_ctx *ctx, double rel_tol, const double *at, size_t n_at, double y[N_LINE],
                double (*y_at)[N_LINE], df_diag *diag)
{
  double tau0, tau1, tau, h, *stops;
  const double *breaks;
  size_t n_breaks = df_curve_get_breaks (ctx->curve, &breaks), n_stops = 0, next_at = 0;
  gsl_odeiv2_system sys = { line_rhs, NULL, N_LINE, ctx };
  gsl_odeiv2_step *step = gsl_odeiv2_step_alloc (gsl_odeiv2_step_rk8pd, N_LINE);
  gsl_odeiv2_control *control = gsl_odeiv2_control_y_new (1e-13 * df_surface_size (ctx->surface),
                                                          rel_tol);
  gsl_odeiv2_evolve *evolve = gsl_odeiv2_evolve_alloc (N_LINE);
  df_status st = DF_OK;

  df_curve_get_range (ctx->curve, &tau0, &tau1);
  stops = malloc ((n_breaks + n_at + 1) * sizeof *stops);
  if (!stops || !step || !control || !evolve)
    {
      st = DF_E_NOMEM;
      goto done;
    }
  for (size_t i = 0; i < n_breaks; i++)
    if (breaks[i] > tau0 && breaks[i] < tau1)
      stops[n_stops++] = breaks[i];
  for (size_t i = 0; i < n_at; i++)
    if (at[i] > tau0 && at[i] < tau1)
      stops[n_stops++] = at[i];
  stops[n_stops++] = tau1;
  qsort (stops, n_stops, sizeof *stops, compare_double);

  memset (y, 0, N_LINE * sizeof (double));
  tau = tau0;
  h = (tau1 - tau0) / 64;
  while (next_at < n_at && at[next_at] <= tau0)
    memset (y_at[next_at++], 0, sizeof y_at[0]);
  for (size_t k = 0; k < n_stops; k++)
    {
      while (tau < stops[k])
        {
          int rc = gsl_odeiv2_evolve_apply (evolve, control, step, &sys, &tau, stops[k], &h, y);

          if (rc != GSL_SUCCESS)
            {
              if (ctx->fail_status != DF_OK)
                {
                  st = ctx->fail_status;
                  if (diag)
                    *diag = ctx->fail;
                }
              else
                st = df_diag_fail (diag, df_status_from_gsl (rc), -1,
                                   "the line integrals stopped at tau = %.6g: %s", tau,
                                   gsl_strerror (rc));
              goto done;
            }
        }
      gsl_odeiv2_evolve_reset (evolve);
      while (next_at < n_at && at[next_at] <= tau)
        memcpy (y_at[next_at++], y, sizeof y_at[0]);
    }

done:
  free (stops);
  if (evolve) gsl_odeiv2_evolve_free (evolve);
  if (control) gsl_odeiv2_control_free (control);
  if (step) gsl_odeiv2_step_free (step);
  return st;
}

/* --- simplicity: segment intersections on a planar picture of the loop ------------------- */

static bool
segments_cross (const double a[2], const double b[2], const double c[2], const double d[2])
{
  double d1 = (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
  double d2 = (b[0] - a[0]) * (d[1] - a[1]) - (b[1] - a[1]) * (d[0] - a[0]);
  double d3 = (d[0] - c[0]) * (a[1] - c[1]) - (d[1] - c[1]) * (a[0] - c[0]);
  double d4 = (d[0] - c[0]) * (b[1] - c[1]) - (d[1] - c[1]) * (b[0] - c[0]);

  /* Touching counts as crossing: the two segments are not neighbours, so a shared point
   * means the loop meets itself. Collinear segments cross where their boxes overlap. */
  if (d1 == 0 && d2 == 0 && d3 == 0 && d4 == 0)
    return fmax (fmin (a[0], b[0]), fmin (c[0], d[0])) <= fmin (fmax (a[0], b[0]), fmax (c[0], d[0]))
           && fmax (fmin (a[1], b[1]), fmin (c[1], d[1])) <= fmin (fmax (a[1], b[1]), fmax (c[1], d[1]));
  return d1 * d2 <= 0 && d3 * d4 <= 0;
}

/* Planar picture: the (x, y) chart; a revolution chart loop on the annulus
 * (1 + (t - t_min) / range)(cos phi, sin phi); a polar loop as it is. */
static void
picture_point (const df_curve *c, double tau, double q[2])
{
  double p[2], dp[2], ddp[2];

  df_curve_eval_plane (c, tau, p, dp, ddp);
  if (df_curve_get_coords (c) == DF_COORDS_CHART
      && df_surface_get_kind (df_curve_get_surface (c)) == DF_SURFACE_REVOLUTION)
    {
      double u_min, u_max, rad;

      df_surface_get_domain (df_curve_get_surface (c), &u_min, &u_max, NULL, NULL);
      rad = 1.0 + (p[0] - u_min) / (u_max - u_min);
      q[0] = rad * cos (p[1]);
      q[1] = rad * sin (p[1]);
      return;
    }
  q[0] = p[0];
  q[1] = p[1];
}

static df_status
loop_is_simple (const df_curve *c, bool *simple)
{
  const double *taus;
  size_t n_nodes = df_curve_get_nodes (c, &taus);
  size_t n = n_nodes ? 3 * n_nodes : 2048, cells;
  double tau0, tau1, (*q)[2], lo[2] = { INFINITY, INFINITY }, hi[2] = { -INFINITY, -INFINITY };
  size_t *head = NULL, *next_in_cell = NULL, *seg_cell = NULL, grid;
  size_t *entries_seg = NULL, n_entries = 0, cap;

  *simple = true;
  if (n > 60000)
    n = 60000;
  df_curve_get_range (c, &tau0, &tau1);
  q = malloc (n * sizeof *q);
  if (q == NULL)
    return DF_E_NOMEM;
  for (size_t i = 0; i < n; i++)
    {
      picture_point (c, tau0 + (tau1 - tau0) * i / n, q[i]);
      for (int k = 0; k < 2; k++)
        {
          lo[k] = fmin (lo[k], q[i][k]);
          hi[k] = fmax (hi[k], q[i][k]);
        }
    }
  /* Uniform grid hashing: each segment goes into every cell its box touches; only segments
   * sharing a cell are compared. */
  grid = (size_t) ceil (sqrt ((double) n));
  cells = grid * grid;
  cap = 8 * n;
  head = malloc (cells * sizeof *head);
  next_in_cell = malloc (cap * sizeof *next_in_cell);
  entries_seg = malloc (cap * sizeof *entries_seg);
  seg_cell = NULL;
  if (!head || !next_in_cell || !entries_seg)
    {
      free (q); free (head); free (next_in_cell); free (entries_seg);
      return DF_E_NOMEM;
    }
  for (size_t i = 0; i < cells; i++)
    head[i] = (size_t) -1;
  for (size_t i = 0; i < n && *simple; i++)
    {
      const double *a = q[i], *b = q[(i + 1) % n];
      double w0 = (hi[0] - lo[0]) / grid + 1e-300, w1 = (hi[1] - lo[1]) / grid + 1e-300;
      size_t c0 = (size_t) fmin (grid - 1, floor ((fmin (a[0], b[0]) - lo[0]) / w0));
      size_t c1 = (size_t) fmin (grid - 1, floor ((fmax (a[0], b[0]) - lo[0]) / w0));
      size_t r0 = (size_t) fmin (grid - 1, floor ((fmin (a[1], b[1]) - lo[1]) / w1));
      size_t r1 = (size_t) fmin (grid - 1, floor ((fmax (a[1], b[1]) - lo[1]) / w1));

      for (size_t cx = c0; cx <= c1 && *simple; cx++)
        for (size_t cy = r0; cy <= r1 && *simple; cy++)
          {
            size_t cell = cy * grid + cx;

            for (size_t e = head[cell]; e != (size_t) -1; e = next_in_cell[e])
              {
                size_t j = entries_seg[e];

                /* Neighbours share an end point: not a crossing. */
                if (j == i || (j + 1) % n == i || (i + 1) % n == j)
                  continue;
                if (segments_cross (a, b, q[j], q[(j + 1) % n]))
                  {
                    *simple = false;
                    break;
                  }
              }
            if (n_entries == cap)
              {
                cap *= 2;
                next_in_cell = realloc (next_in_cell, cap * sizeof *next_in_cell);
                entries_seg = realloc (entries_seg, cap * sizeof *entries_seg);
                if (!next_in_cell || !entries_seg)
                  {
                    free (q); free (head); free (next_in_cell); free (entries_seg);
                    return DF_E_NOMEM;
                  }
              }
            entries_seg[n_entries] = i;
            next_in_cell[n_entries] = head[cell];
            head[cell] = n_entries++;
          }
    }
  free (q);
  free (head);
  free (next_in_cell);
  free (entries_seg);
  free (seg_cell);
  return DF_OK;
}

/* --- the measurement ----------------------------------------------------------------------- */

/* Chooses the reference u for Green's theorem and whether a disc exists (GEOMETRY.md). */
static void
choose_disc (const df_curve *c, df_loop_result *out, line_ctx *ctx)
{
  const df_surface *s = df_curve_get_surface (c);
  df_pole poles[2];
  double u_min, u_max;
  int w = out->axis_winding;

  df_surface_get_domain (s, &u_min, &u_max, NULL, NULL);
  df_surface_get_poles (s, poles);
  ctx->green = true;
  out->bounds_disc = out->simple;
  if (!out->simple)
    {
      snprintf (out->disc_note, sizeof out->disc_note,
                "the loop crosses itself, so it bounds no simple disc; its holonomy is still "
                "defined");
      return;
    }
  if (!ctx->revolution)
    {
      /* Any reference line works; the loop's own middle keeps the inner integrals short. */
      const double *taus;
      size_t n = df_curve_get_nodes (c, &taus);
      double tau0, tau1, sum = 0.0;
      int m = n ? 0 : 64;

      df_curve_get_range (c, &tau0, &tau1);
      if (m == 0)
        m = 64;
      for (int i = 0; i < m; i++)
        {
          double p[2], dp[2], ddp[2];

          df_curve_eval_plane (c, tau0 + (tau1 - tau0) * i / m, p, dp, ddp);
          sum += p[0];
        }
      ctx->u_ref = sum / m;
      snprintf (out->disc_note, sizeof out->disc_note, "the loop bounds the region it encloses "
                "in the (x, y) plane");
      return;
    }
  if (w == 0)
    {
      /* Any reference works for a loop that does not go around the axis; a loop near a pole
       * (polar coordinates) takes that pole, where H vanishes, so that H dphi stays bounded
       * as the loop passes through the pole. */
      df_curve_coords coords = df_curve_get_coords (c);

      ctx->u_ref = coords == DF_COORDS_POLAR_MAX ? u_max : u_min;
      ctx->h_ref = coords == DF_COORDS_POLAR_MAX ? -1.0 : coords == DF_COORDS_POLAR_MIN ? 1.0 : 0.0;
      snprintf (out->disc_note, sizeof out->disc_note, "the loop bounds the region it encloses "
                "without going around the axis");
      return;
    }
  if (abs (w) > 1)
    {
      out->bounds_disc = false;
      snprintf (out->disc_note, sizeof out->disc_note,
                "the loop winds %d times around the axis, so it bounds no simple disc", abs (w));
      return;
    }
  {
    /* Going around the axis with phi increasing, the side toward u_min lies on the left. */
    int left = w > 0 ? 0 : 1, use = -1;

    if (poles[left].on_axis)
      use = left;
    else if (poles[1 - left].on_axis)
      use = 1 - left;
    if (use < 0)
      {
        out->bounds_disc = false;
        snprintf (out->disc_note, sizeof out->disc_note,
                  "the loop goes around the axis and the surface has no cap on either side "
                  "(the profile does not reach the axis), so it bounds no disc; its holonomy "
                  "is still defined");
        return;
      }
    ctx->u_ref = poles[use].t;
    /* dr/ds at the pole of a smooth cap is +1 at u_min and -1 at u_max; taking that value
     * instead of the cone's sin(alpha) adds the apex's concentrated curvature. */
    ctx->h_ref = use == 0 ? 1.0 : -1.0;
    out->concentrated_rad = poles[use].concentrated;
    snprintf (out->disc_note, sizeof out->disc_note,
              "the loop goes around the axis; the disc meant is the cap toward the %s end of the "
              "profile (t = %.6g)%s", use == 0 ? "t-min" : "t-max", poles[use].t,
              poles[use].concentrated > 1e-12 ? ", including the cone apex" : "");
  }
}

df_status
df_loop_measure (const df_curve *curve, const df_loop_options *options, df_loop_result *out,
                 df_diag *diag)
{
  df_loop_options defaults;
  df_transport_options topt;
  df_transport_result tr = { 0 };
  line_ctx ctx = { 0 };
  double y[N_LINE], (*y_at)[N_LINE] = NULL, *at = NULL;
  df_status st;
  size_t n_s;

  memset (out, 0, sizeof *out);
  df_diag_clear (diag);
  if (!df_curve_is_closed (curve))
    return df_diag_fail (diag, DF_E_INPUT, -1, "a loop must be closed");
  if (options == NULL)
    {
      df_loop_options_init (&defaults);
      options = &defaults;
    }
  n_s = options->n_samples < 8 ? 8 : options->n_samples;

  df_transport_options_init (&topt);
  topt.rel_tol = options->rel_tol;
  topt.abs_tol = options->rel_tol * 0.1;
  topt.n_out = n_s;
  if ((st = df_transport_run (curve, NULL, &topt, &tr, diag)) != DF_OK)
    return st;
  out->holonomy_rad = df_signed_angle (tr.start_vector, tr.end_vector, tr.start_normal);
  out->rhs_evals = tr.rhs_evals;
  out->norm_drift = tr.norm_drift;
  out->axis_winding = df_curve_axis_winding (curve);

  if ((st = loop_is_simple (curve, &out->simple)) != DF_OK)
    goto done;

  ctx.curve = curve;
  ctx.surface = df_curve_get_surface (curve);
  ctx.revolution = df_surface_get_kind (ctx.surface) == DF_SURFACE_REVOLUTION;
  ctx.ws = gsl_integration_workspace_alloc (200);
  choose_disc (curve, out, &ctx);
  ctx.green = out->bounds_disc;
  if (ctx.ws == NULL)
    {
      st = DF_E_NOMEM;
      goto done;
    }
  at = malloc (tr.n_samples * sizeof *at);
  y_at = malloc (tr.n_samples * sizeof *y_at);
  if (!at || !y_at)
    {
      st = DF_E_NOMEM;
      goto done;
    }
  for (size_t i = 0; i < tr.n_samples; i++)
    at[i] = tr.samples[i].tau;
  if ((st = line_integrals (&ctx, options->rel_tol, at, tr.n_samples, y, y_at, diag)) != DF_OK)
    goto done;

  out->length = y[0];
  out->total_geodesic_curvature_rad = y[1];
  if (out->bounds_disc)
    {
      double area_signed = y[3];

      out->disc_on_left = area_signed > 0;
      out->enclosed_curvature_rad = y[2];
      out->area = fabs (area_signed);
      out->residual_rad = df_wrap_angle (out->holonomy_rad - out->enclosed_curvature_rad);
    }

  out->samples = calloc (tr.n_samples, sizeof *out->samples);
  if (out->samples == NULL)
    {
      st = DF_E_NOMEM;
      goto done;
    }
  out->n_samples = tr.n_samples;
  for (size_t i = 0; i < tr.n_samples; i++)
    {
      df_loop_sample *ls = &out->samples[i];
      const df_transport_sample *ts = &tr.samples[i];
      df_curve_point cp;
      df_point_geometry geo;
      double speed;

      if ((st = df_curve_eval (curve, ts->tau, &cp, diag)) != DF_OK)
        goto done;
      ls->s = y_at[i][0];
      ls->u = cp.u;
      ls->v = cp.v;
      ls->at_pole = cp.at_pole;
      memcpy (ls->point, ts->x, sizeof ls->point);
      memcpy (ls->normal, ts->normal, sizeof ls->normal);
      memcpy (ls->vector, ts->vector, sizeof ls->vector);
      cross3 (ts->normal, ts->vector, ls->partner);
      ls->angle_rad = -y_at[i][1];
      ls->k_g = geodesic_curvature (&cp, &speed);
      if (fabs (ls->k_g) > ctx.max_abs_kg)
        ctx.max_abs_kg = fabs (ls->k_g);
      if ((st = df_surface_geometry (ctx.surface, cp.u, cp.v, &geo, diag)) != DF_OK)
        goto done;
      ls->K = geo.K;
    }
  out->max_abs_kg = ctx.max_abs_kg;
  /* A geodesic loop (k_g = 0 to rounding) has no steering limit. */
  out->has_steering_radius = ctx.max_abs_kg > 1e-9 / df_surface_size (ctx.surface);
  out->min_steering_radius = out->has_steering_radius ? 1.0 / ctx.max_abs_kg : 0.0;

done:
  if (ctx.ws)
    gsl_integration_workspace_free (ctx.ws);
  free (at);
  free (y_at);
  df_transport_result_clear (&tr);
  if (st != DF_OK)
    df_loop_result_clear (out);
  return st;
}

df_status
df_compare_paths (const df_curve *a, const df_curve *b, const double *v0,
                  const df_transport_options *options, double *angle_rad,
                  df_transport_result *result_a, df_transport_result *result_b, df_diag *diag)
{
  df_transport_result ra = { 0 }, rb = { 0 };
  df_curve_point a0, a1, b0, b1;
  double ta0, ta1, tb0, tb1, size = df_surface_size (df_curve_get_surface (a)), d0[3], d1[3];
  double start[3];
  df_status st;

  df_diag_clear (diag);
  *angle_rad = 0.0;
  df_curve_get_range (a, &ta0, &ta1);
  df_curve_get_range (b, &tb0, &tb1);
  if ((st = df_curve_eval (a, ta0, &a0, diag)) != DF_OK
      || (st = df_curve_eval (a, ta1, &a1, diag)) != DF_OK
      || (st = df_curve_eval (b, tb0, &b0, diag)) != DF_OK
      || (st = df_curve_eval (b, tb1, &b1, diag)) != DF_OK)
    return st;
  for (int k = 0; k < 3; k++)
    {
      d0[k] = a0.x[k] - b0.x[k];
      d1[k] = a1.x[k] - b1.x[k];
    }
  if (sqrt (dot3 (d0, d0)) > 1e-6 * size)
    return df_diag_fail (diag, DF_E_INPUT, 0, "the two paths start at different points "
                         "(%.6g apart)", sqrt (dot3 (d0, d0)));
  if (sqrt (dot3 (d1, d1)) > 1e-6 * size)
    return df_diag_fail (diag, DF_E_INPUT, -1, "the two paths end at different points "
                         "(%.6g apart)", sqrt (dot3 (d1, d1)));
  memcpy (start, v0 ? v0 : a0.dx, sizeof start);
  if ((st = df_transport_run (a, start, options, &ra, diag)) != DF_OK)
    return st;
  if ((st = df_transport_run (b, start, options, &rb, diag)) != DF_OK)
    {
      df_transport_result_clear (&ra);
      return st;
    }
  *angle_rad = df_signed_angle (ra.end_vector, rb.end_vector, ra.end_normal);
  if (result_a)
    *result_a = ra;
  else
    df_transport_result_clear (&ra);
  if (result_b)
    *result_b = rb;
  else
    df_transport_result_clear (&rb);
  return DF_OK;
}
