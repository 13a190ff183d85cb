/* df-loop.c: loop measurement (holonomy, enclosed curvature by Green's theorem, Gauss-Bonnet
 * residual, geodesic curvature, area, length, steering radius, frame samples) and the
 * comparison of two paths with common ends.
 * The transport gives the holonomy and the quantities along the path; the enclosed curvature
 * and area come from df-green's own adaptive quadrature, independent of the transport's steps:
 * on a surface of revolution from the closed-form H below, on a graph from df-green's inner
 * integrals. Whether the loop crosses itself is df-loop-simple.c's.
 * Plain C + libm + GSL; no GLib. */
#include "df-loop.h"
#include "df-vec3.h"

#include <gsl/gsl_chebyshev.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>
#include <gsl/gsl_odeiv2.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "df-geometry.h"
#include "df-green.h"
#include "df-loop-private.h"

typedef struct
{
  const df_curve   *curve;
  const df_surface *surface;
  bool              revolution;
  bool              green;        /* evaluate the Green integrands */
  double            u_ref;        /* lower limit of the inner integrals */
  double            h_ref;        /* revolution: dr/ds taken at u_ref (1 or -1 at a pole) */
  double            pole_t;       /* polar curve coordinates: the pole's t */
  double            pole_sign;    /* and dt / drho */
  gsl_integration_workspace *ws;  /* revolution: the area's inner integrals */
  gsl_cheb_series *area_fit;      /* revolution: int r ds over the loop's t range, or NULL */
  double            area_fit_base; /* int r ds from u_ref to the fit's lower end */
  bool              prefer_other; /* report the other cap first (the one on the left) */
} line_ctx;

/* Angles this close above -pi are +pi: a half-turn computed from atan2 of values exact up to
 * rounding (a 30 degree cone's apex holds exactly pi) must not flip to -180 degrees. The band
 * is far below the transport's accuracy, so no real distinction is lost. */
#define WRAP_SNAP 1e-12

double
df_wrap_angle (double a)
{
  if (!isfinite (a))
    return a;
  a = fmod (a, 2 * M_PI);
  if (a > M_PI)
    a -= 2 * M_PI;
  else if (a <= -M_PI)
    a += 2 * M_PI;
  /* fmod and the subtraction leave a within an ulp or two of +-pi; the interval is (-pi, pi]. */
  if (a <= -M_PI + WRAP_SNAP || a > M_PI)
    a = M_PI;
  return a;
}

void
df_loop_options_init (df_loop_options *o)
{
  o->rel_tol = 1e-11;
  o->n_samples = 200;
  o->threads = 2;
}

void
df_loop_result_clear (df_loop_result *r)
{
  if (r == NULL)
    return;
  free (r->samples);
  memset (r, 0, sizeof *r);
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

/* Surface of revolution: r ds, the area element per dphi (graphs are df-green's). */
static double
inner_integrand (double x, void *data)
{
  inner_ctx *ic = data;
  df_status st;
  double rs = 0.0;

  profile_drds (ic->ctx->surface, x, &rs, NULL, &st);
  return st == DF_OK ? rs : NAN;
}

/* Revolution: the area's inner integral from u_ref to u, int r ds. */
static df_status
inner_integral (line_ctx *ctx, double u, double *out, df_diag *diag)
{
  inner_ctx ic = { ctx, 0.0, true };
  gsl_function f = { inner_integrand, &ic };
  double err;

  if (u == ctx->u_ref)
    {
      *out = 0.0;
      return DF_OK;
    }
  if (ctx->area_fit != NULL && u >= ctx->area_fit->a && u <= ctx->area_fit->b)
    {
      *out = ctx->area_fit_base + gsl_cheb_eval (ctx->area_fit, u);
      return DF_OK;
    }
  /* Gauss-Kronrod 15 with tight tolerances: the profile is smooth, so one or two panels
   * usually suffice; where rounding stops GSL short, its result is still good to about that
   * rounding, so only a non-finite one fails. */
  gsl_integration_qag (&f, ctx->u_ref, u, 1e-15 * fabs (u - ctx->u_ref), 1e-13, 200,
                       GSL_INTEG_GAUSS15, ctx->ws, out, &err);
  if (!isfinite (*out))
    return df_diag_fail_at (diag, DF_E_NONFINITE, -1, u, 0.0,
                            "the area integral along the profile is not finite");
  return DF_OK;
}

/* Surface of revolution: the Green integrands H dv (component 0) and A dv (component 1) at a
 * curve point, integrated along the curve by df-green's adaptive quadrature, independently of
 * the transport. */
static df_status
green_integrand (double tau, const double p[2], const double dp[2], double *values,
                 double *errors, void *user, df_diag *diag)
{
  line_ctx *ctx = user;
  df_curve_coords coords = df_curve_get_coords (ctx->curve);
  double u, h_val, a_val, drds;
  df_status st;

  (void) errors;   /* closed-form H; the area's profile integral is smooth and converges */
  if (coords == DF_COORDS_SPHERE)
    {
      /* Near both poles the plane coordinates are polar about the nearer pole; the reference
       * follows (each half's form H dphi is smooth at its own pole), and df_loop_measure adds
       * the constant difference of the two forms over the southern pieces. The area's fit is
       * made about one reference, so these curves integrate the area directly (area_fit is
       * left NULL for them). */
      double u_min, u_max;
      int e = df_curve_plane_pole (ctx->curve, tau);

      df_surface_get_domain (ctx->surface, &u_min, &u_max, NULL, NULL);
      ctx->u_ref = e ? u_max : u_min;
      ctx->h_ref = e ? -1.0 : 1.0;
      u = e ? u_max - hypot (p[0], p[1]) : u_min + hypot (p[0], p[1]);
    }
  else if (coords == DF_COORDS_CHART)
    u = p[0];
  else
    u = ctx->pole_t + ctx->pole_sign * hypot (p[0], p[1]);
  /* K dA = -r_ss ds dphi: H(t) = dr/ds(u_ref) - dr/ds(t) (GEOMETRY.md). */
  drds = profile_drds (ctx->surface, u, NULL, diag, &st);
  if (st != DF_OK)
    return st;
  h_val = ctx->h_ref - drds;
  if ((st = inner_integral (ctx, u, &a_val, diag)) != DF_OK)
    return st;
  if (coords == DF_COORDS_CHART)
    {
      values[0] = h_val * dp[1];
      values[1] = a_val * dp[1];
    }
  else
    {
      /* dphi = (p x p') / |p|^2 dtau. Near the pole p x p' loses its digits to rounding
       * while H and A vanish like |p|^2, so the quotients H / |p|^2 and A / |p|^2 are
       * formed first: the product then stays bounded instead of amplifying the noise. */
      double rho2 = p[0] * p[0] + p[1] * p[1];
      double pxdp = p[0] * dp[1] - p[1] * dp[0];

      values[0] = rho2 > 0 ? (h_val / rho2) * pxdp : 0.0;
      values[1] = rho2 > 0 ? (a_val / rho2) * pxdp : 0.0;
    }
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
  if (df_curve_tube_winding (c) != 0)
    {
      out->bounds_disc = false;
      snprintf (out->disc_note, sizeof out->disc_note,
                "the loop goes round the closed profile (the tube), so it bounds no disc; its "
                "holonomy is still defined");
      return;
    }

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
  if (df_curve_get_coords (c) == DF_COORDS_SPHERE)
    {
      /* Near both poles (a meridian great circle, a loop from pole to pole): the Green
       * integrand switches reference pole with the picture (green_integrand) and the
       * measurement adds the difference of the two forms (south_correction). */
      snprintf (out->disc_note, sizeof out->disc_note, "the loop comes near both poles; it bounds "
                "a disc on each side, and both are given");
      return;
    }
  if (df_curve_get_coords (c) != DF_COORDS_CHART)
    {
      /* In pole-centred coordinates H dphi = (H / rho^2)(p x p') dtau with the reference at
       * that pole is a smooth form on the whole pole-centred picture (H vanishes like rho^2 at
       * a smooth pole), so Green's theorem gives the region the loop encloses in that picture
       * whether it goes round the pole, passes through it or not (its winding about the pole
       * only decides whether a cone apex's concentrated curvature belongs to it). */
      int e = df_curve_get_coords (c) == DF_COORDS_POLAR_MAX ? 1 : 0;
      double tau0, tau1, rho_min = INFINITY;

      ctx->u_ref = poles[e].t;
      ctx->h_ref = e ? -1.0 : 1.0;
      df_curve_get_range (c, &tau0, &tau1);
      for (int i = 0; i < 4096; i++)
        {
          double p[2], dp[2], ddp[2];

          df_curve_eval_plane (c, tau0 + (tau1 - tau0) * i / 4096, p, dp, ddp);
          rho_min = fmin (rho_min, hypot (p[0], p[1]));
        }
      {
        /* A loop through the pole usually has it as a node. */
        const double *taus;
        size_t n_nodes = df_curve_get_nodes (c, &taus);

        for (size_t i = 0; i < n_nodes; i++)
          {
            double p[2], dp[2], ddp[2];

            df_curve_eval_plane (c, taus[i], p, dp, ddp);
            rho_min = fmin (rho_min, hypot (p[0], p[1]));
          }
      }
      if (rho_min <= 1e-9 * (u_max - u_min))
        {
          if (poles[e].concentrated > 1e-12)
            {
              out->bounds_disc = false;
              snprintf (out->disc_note, sizeof out->disc_note,
                        "the loop runs through the cone apex (t = %.6g), whose concentrated "
                        "curvature belongs to neither side; its holonomy is still defined",
                        poles[e].t);
              return;
            }
          /* Its winding round the axis is not defined (the pole lies on it): reported as 0. */
          out->axis_winding = 0;
          snprintf (out->disc_note, sizeof out->disc_note, "the loop runs through the pole at "
                    "t = %.6g; the disc meant is the region it encloses", poles[e].t);
          return;
        }
      if (w == 0)
        {
          snprintf (out->disc_note, sizeof out->disc_note, "the loop bounds the region it "
                    "encloses without going around the axis");
          return;
        }
      out->concentrated_rad = poles[e].concentrated;
      {
        /* As in the chart: the cap on the left is meant when there is one. */
        int left = w > 0 ? 0 : 1, use = (left != e && poles[left].on_axis) ? left : e;

        ctx->prefer_other = use != e;
        if (ctx->prefer_other)
          out->concentrated_rad = poles[left].concentrated;
        snprintf (out->disc_note, sizeof out->disc_note,
                  "the loop goes around the axis; the disc meant is the cap toward the %s end of "
                  "the profile (t = %.6g)%s", use == 0 ? "t-min" : "t-max", poles[use].t,
                  poles[use].concentrated > 1e-12 ? ", including the cone apex" : "");
      }
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

/* The cap on the other side of a loop round the axis of a closed surface of revolution. */
static df_status
other_cap (line_ctx *ctx, df_loop_result *out)
{
  df_pole poles[2];
  double u_min, u_max, total_area;
  inner_ctx ic = { ctx, 0.0, true };
  gsl_function f = { inner_integrand, &ic };
  double err;

  /* On a closed surface (a pole at each end) every simple loop bounds a disc on each side,
   * whether or not it goes round the axis. */
  df_surface_get_poles (ctx->surface, poles);
  if (!ctx->revolution || !poles[0].on_axis || !poles[1].on_axis)
    return DF_OK;
  df_surface_get_domain (ctx->surface, &u_min, &u_max, NULL, NULL);
  if (gsl_integration_qag (&f, u_min, u_max, 0.0, 1e-12, 200, GSL_INTEG_GAUSS21, ctx->ws,
                           &total_area, &err) != GSL_SUCCESS || !isfinite (total_area))
    return DF_OK;   /* the second cap is extra information: without it the rest stands */
  total_area *= 2 * M_PI;
  out->has_other_disc = true;
  out->other_enclosed_curvature_rad = out->enclosed_curvature_rad
                                      + (out->disc_on_left ? -4 * M_PI : 4 * M_PI);
  out->other_area = fmax (0.0, total_area - out->area);
  if (ctx->prefer_other)
    {
      /* The Green integral gave the cap round the pole of the curve's picture; the one meant is
       * the other (on the left). Its concentrated curvature was counted in the total 4 pi. */
      double k = out->enclosed_curvature_rad, a = out->area;

      out->enclosed_curvature_rad = out->other_enclosed_curvature_rad;
      out->area = out->other_area;
      out->other_enclosed_curvature_rad = k;
      out->other_area = a;
      out->disc_on_left = !out->disc_on_left;
      out->residual_rad = df_wrap_angle (out->holonomy_rad - out->enclosed_curvature_rad);
    }
  return DF_OK;
}

static int
compare_tau (const void *a, const void *b)
{
  double x = *(const double *) a, y = *(const double *) b;

  return (x > y) - (x < y);
}

/* Sphere coordinates: the northern pieces integrate H_N dphi (reference at t-min), the
 * southern H_S dphi (reference at t-max). H_N - H_S = 2 and A_N - A_S = C, the whole profile's
 * integral of r ds, are constants, so the form H_N dphi of the disc away from the pole at
 * t-max is recovered by adding 2 dphi and C dphi over the southern pieces: (2, C) times their
 * change of phi, followed continuously in the southern pole-centred picture. Where the loop
 * runs through that pole phi jumps by pi, and taking +pi or -pi is choosing one disc or the
 * other: both are discs of the loop, and the other one is reported beside it. */
static df_status
south_correction (line_ctx *ctx, double *dk, double *da)
{
  const df_curve *c = ctx->curve;
  const double *breaks, *nodes;
  size_t nb = df_curve_get_breaks (c, &breaks), nn = df_curve_get_nodes (c, &nodes);
  size_t m = 8192, n = 0;
  double tau0, tau1, u_min, u_max, dphi = 0.0, cap_area, *taus;
  df_status st;

  df_curve_get_range (c, &tau0, &tau1);
  df_surface_get_domain (ctx->surface, &u_min, &u_max, NULL, NULL);
  taus = malloc ((m + nb + nn + 1) * sizeof *taus);
  if (taus == NULL)
    return DF_E_NOMEM;
  for (size_t i = 0; i < m; i++)
    taus[n++] = tau0 + (tau1 - tau0) * i / m;
  for (size_t i = 0; i < nb; i++)
    taus[n++] = breaks[i];
  for (size_t i = 0; i < nn; i++)
    if (nodes[i] > tau0 && nodes[i] < tau1)
      taus[n++] = nodes[i];
  qsort (taus, n, sizeof *taus, compare_tau);
  taus[n++] = tau1;
  {
    double prev_angle = 0.0;
    bool have = false;

    for (size_t i = 0; i + 1 < n; i++)
      {
        double a = taus[i], b = taus[i + 1], p[2], dp[2], ddp[2];

        if (!(b > a) || df_curve_plane_pole (c, 0.5 * (a + b)) != 1)
          {
            have = false;
            continue;
          }
        for (int end = 0; end < 2; end++)
          {
            double ang;

            df_curve_eval_plane_about (c, end ? b : a, 1, p, dp, ddp);
            /* On the pole itself phi has no value: the step across it is taken whole. */
            if (hypot (p[0], p[1]) <= 1e-12 * (u_max - u_min))
              continue;
            ang = atan2 (p[1], p[0]);
            if (have)
              {
                double d = ang - prev_angle;

                d -= 2 * M_PI * floor ((d + M_PI) / (2 * M_PI));
                dphi += d;
              }
            prev_angle = ang;
            have = true;
          }
      }
  }
  free (taus);
  ctx->u_ref = u_min;
  if ((st = inner_integral (ctx, u_max, &cap_area, NULL)) != DF_OK)
    return st;
  *dk = 2.0 * dphi;
  *da = cap_area * dphi;
  return DF_OK;
}

/* Revolution: A(t) = int r ds depends on t alone, so one Chebyshev series of it over the
 * loop's t range (GSL's gsl_cheb, integrated term by term) replaces a quadrature per point of
 * the line integral. Kept only where it agrees with direct quadrature at points of the range;
 * otherwise area_fit stays NULL and each point integrates directly. */
static void
prepare_area_fit (line_ctx *ctx)
{
  double (*q)[2] = NULL, lo = INFINITY, hi = -INFINITY, u_min, u_max, pad, worst = 0.0;
  size_t m = df_curve_sample_plane (ctx->curve, 512, &q);
  bool chart = df_curve_get_coords (ctx->curve) == DF_COORDS_CHART;
  inner_ctx ic = { ctx, 0.0, true };
  gsl_function f = { inner_integrand, &ic };
  gsl_cheb_series *cs, *integ;
  df_diag d;

  for (size_t i = 0; i < m; i++)
    {
      double u = chart ? q[i][0] : ctx->pole_t + ctx->pole_sign * hypot (q[i][0], q[i][1]);

      lo = fmin (lo, u);
      hi = fmax (hi, u);
    }
  free (q);
  if (m == 0 || !(hi > lo))
    return;
  df_surface_get_domain (ctx->surface, &u_min, &u_max, NULL, NULL);
  pad = 0.01 * (hi - lo);
  lo -= pad;
  hi += pad;
  if (!df_surface_u_periodic (ctx->surface))
    {
      lo = fmax (lo, u_min);
      hi = fmin (hi, u_max);
    }
  cs = gsl_cheb_alloc (40);
  integ = gsl_cheb_alloc (40);
  if (cs == NULL || integ == NULL || gsl_cheb_init (cs, &f, lo, hi) != GSL_SUCCESS
      || gsl_cheb_calc_integ (integ, cs) != GSL_SUCCESS)
    goto fail;
  ctx->area_fit = NULL;
  if (inner_integral (ctx, lo, &ctx->area_fit_base, &d) != DF_OK)
    goto fail;
  for (int k = 0; k <= 8; k++)
    {
      double u = lo + (hi - lo) * (k + 0.37) / 9.37, direct, fitted;

      if (inner_integral (ctx, u, &direct, &d) != DF_OK)
        goto fail;
      fitted = ctx->area_fit_base + gsl_cheb_eval (integ, u);
      if (!isfinite (fitted))
        goto fail;
      worst = fmax (worst, fabs (fitted - direct) / (fabs (direct) + fabs (ctx->area_fit_base)
                                                     + 1e-300));
    }
  /* The area is aimed at DF_GREEN_AREA_REL; the fit must do ten times better. */
  if (worst > 0.1 * DF_GREEN_AREA_REL)
    goto fail;
  gsl_cheb_free (cs);
  ctx->area_fit = integ;
  return;
fail:
  if (cs)
    gsl_cheb_free (cs);
  if (integ)
    gsl_cheb_free (integ);
  ctx->area_fit = NULL;
}

/* The enclosed curvature and area by Green's theorem (df-green), aiming at ten times the
 * transport's relative tolerance in radians (1e-10 rad at the default): about what the
 * holonomy itself achieves over a loop, and a 10 000-point spline loop's knots cost an honest
 * error estimate many more panels below it. Never fails for accuracy: the achieved error
 * estimate goes with the value, and a note says when it is well above the aim or why there is
 * no value. */
static df_status
enclosed_by_green (line_ctx *ctx, double rel_tol, int threads, df_loop_result *out)
{
  double tol = 10 * rel_tol, size = df_surface_size (ctx->surface);
  double curvature = 0.0, area = 0.0, error = 0.0;
  df_diag d;
  df_status st;

  df_diag_clear (&d);
  if (ctx->revolution)
    {
      double epsabs[2] = { tol, 1e-3 * DF_GREEN_AREA_REL * size * size };
      double epsrel[2] = { tol, DF_GREEN_AREA_REL };
      df_green_line_result lr;

      bool sphere = df_curve_get_coords (ctx->curve) == DF_COORDS_SPHERE;

      if (!sphere)
        prepare_area_fit (ctx);
      st = df_green_line_integral (ctx->curve, green_integrand, ctx, epsabs, epsrel,
                                   DF_GREEN_MAX_EVALS, &lr, &d);
      curvature = lr.value[0];
      area = lr.value[1];
      error = lr.error[0];
      if (st == DF_OK && sphere)
        {
          double dk, da;

          if ((st = south_correction (ctx, &dk, &da)) == DF_OK)
            {
              curvature += dk;
              area += da;
            }
        }
    }
  else
    {
      df_green_result gr;

      st = df_green_graph (ctx->curve, tol, threads, &gr, &d);
      curvature = gr.curvature;
      area = gr.area;
      error = gr.curvature_error;
    }
  if (st == DF_E_NOMEM)
    return st;
  if (st != DF_OK || !isfinite (curvature) || !isfinite (area) || !isfinite (error))
    {
      out->enclosed_available = false;
      if (d.has_point)
        snprintf (out->enclosed_note, sizeof out->enclosed_note,
                  "the enclosed curvature could not be computed: %.150s at (%.6g, %.6g)",
                  d.detail[0] ? d.detail : df_status_describe (st), d.u, d.v);
      else
        snprintf (out->enclosed_note, sizeof out->enclosed_note,
                  "the enclosed curvature could not be computed: %.150s",
                  d.detail[0] ? d.detail : df_status_describe (st));
      return DF_OK;
    }
  out->enclosed_available = true;
  out->disc_on_left = area > 0;
  out->enclosed_curvature_rad = curvature;
  out->enclosed_error_rad = error;
  out->area = fabs (area);
  /* A hundredfold the aim is where the figure starts to mean less than asked for. */
  if (error > 100 * tol)
    snprintf (out->enclosed_note, sizeof out->enclosed_note,
              "the enclosed curvature reached an error estimate of %.2g rad, above the %.2g rad "
              "aimed at", error, tol);
  return DF_OK;
}

df_status
df_loop_measure (const df_curve *curve, const df_loop_options *options, df_loop_result *out,
                 df_diag *diag)
{
  df_loop_options defaults;
  df_transport_options topt;
  df_transport_result tr = { 0 };
  line_ctx ctx = { 0 };
  df_status st;
  double max_abs_kg, u_min, u_max;
  size_t n_s;
  bool chart_coords;

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
  out->axis_winding = df_curve_axis_winding (curve);
  /* The planar picture of the chart cannot show a loop round a torus's tube: such a loop is
   * taken as simple, and it bounds no disc anyway. */
  out->simple = true;
  if (df_curve_tube_winding (curve) == 0 && (st = _df_loop_is_simple (curve, &out->simple)) != DF_OK)
    return st;

  /* Which disc, and the Green integrands' set-up. */
  ctx.curve = curve;
  ctx.surface = df_curve_get_surface (curve);
  ctx.revolution = df_surface_get_kind (ctx.surface) == DF_SURFACE_REVOLUTION;
  df_surface_get_domain (ctx.surface, &u_min, &u_max, NULL, NULL);
  ctx.pole_t = df_curve_get_coords (curve) == DF_COORDS_POLAR_MAX ? u_max : u_min;
  ctx.pole_sign = df_curve_get_coords (curve) == DF_COORDS_POLAR_MAX ? -1.0 : 1.0;
  ctx.ws = gsl_integration_workspace_alloc (200);
  if (ctx.ws == NULL)
    return DF_E_NOMEM;
  choose_disc (curve, out, &ctx);
  ctx.green = out->bounds_disc;

  df_transport_options_init (&topt);
  topt.rel_tol = options->rel_tol;
  topt.abs_tol = options->rel_tol * 0.1;
  topt.n_out = n_s;
  if ((st = df_transport_run (curve, NULL, &topt, &tr, diag)) != DF_OK)
    goto done;
  out->holonomy_rad = df_wrap_angle (df_signed_angle (tr.start_vector, tr.end_vector,
                                                      tr.start_normal));
  out->rhs_evals = tr.rhs_evals;
  out->norm_drift = tr.norm_drift;
  out->length = tr.length;
  out->total_geodesic_curvature_rad = tr.total_kg;
  out->corner_turning_rad = tr.corner_turning;
  max_abs_kg = tr.max_abs_kg;
  if (out->bounds_disc)
    {
      if ((st = enclosed_by_green (&ctx, options->rel_tol, options->threads, out)) != DF_OK)
        goto done;
      if (out->enclosed_available)
        {
          out->residual_rad = df_wrap_angle (out->holonomy_rad - out->enclosed_curvature_rad);
          if ((st = other_cap (&ctx, out)) != DF_OK)
            goto done;
          out->has_mean_K = out->area > 0.0;
          out->mean_K = out->has_mean_K ? out->enclosed_curvature_rad / out->area : 0.0;
        }
    }

  out->samples = calloc (tr.n_samples, sizeof *out->samples);
  if (out->samples == NULL)
    {
      st = DF_E_NOMEM;
      goto done;
    }
  out->n_samples = tr.n_samples;
  chart_coords = df_curve_get_coords (curve) == DF_COORDS_CHART;
  for (size_t i = 0; i < tr.n_samples; i++)
    {
      df_loop_sample *ls = &out->samples[i];
      const df_transport_sample *ts = &tr.samples[i];
      df_curve_point cp;
      df_point_geometry geo;
      double speed, k_sqrt_g, sqrt_g;

      if ((st = df_curve_eval (curve, ts->tau, &cp, diag)) != DF_OK)
        goto done;
      ls->s = ts->s;
      ls->tau = ts->tau;
      ls->u = cp.u;
      ls->v = cp.v;
      ls->at_pole = cp.at_pole;
      memcpy (ls->point, ts->x, sizeof ls->point);
      memcpy (ls->normal, ts->normal, sizeof ls->normal);
      memcpy (ls->vector, ts->vector, sizeof ls->vector);
      df_cross3 (ts->normal, ts->vector, ls->partner);
      ls->angle_rad = ts->angle - tr.samples[0].angle;
      ls->k_g = df_geodesic_curvature (cp.dx, cp.ddx, cp.normal, &speed);
      if (fabs (ls->k_g) > max_abs_kg)
        max_abs_kg = fabs (ls->k_g);
      /* K from the second-order jet where the chart is regular (the full geometry needs a
       * third-order one); near a pole the curve is in polar coordinates and the geometry
       * gives K's limit. */
      if (chart_coords && !cp.at_pole
          && df_surface_k_area (ctx.surface, cp.u, cp.v, &k_sqrt_g, &sqrt_g, NULL) == DF_OK
          && sqrt_g > 0)
        ls->K = k_sqrt_g / sqrt_g;
      else if ((st = df_surface_geometry (ctx.surface, cp.u, cp.v, &geo, diag)) != DF_OK)
        goto done;
      else
        ls->K = geo.K;
    }
  out->max_abs_kg = max_abs_kg;
  /* A geodesic loop (k_g = 0 to rounding) has no steering limit. */
  out->has_steering_radius = max_abs_kg > 1e-9 / df_surface_size (ctx.surface);
  out->min_steering_radius = out->has_steering_radius ? 1.0 / max_abs_kg : 0.0;

done:
  gsl_integration_workspace_free (ctx.ws);
  if (ctx.area_fit)
    gsl_cheb_free (ctx.area_fit);
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
  if (sqrt (df_dot3 (d0, d0)) > 1e-6 * size)
    return df_diag_fail (diag, DF_E_INPUT, 0, "the two paths start at different points "
                         "(%.6g apart)", sqrt (df_dot3 (d0, d0)));
  if (sqrt (df_dot3 (d1, d1)) > 1e-6 * size)
    return df_diag_fail (diag, DF_E_INPUT, -1, "the two paths end at different points "
                         "(%.6g apart)", sqrt (df_dot3 (d1, d1)));
  memcpy (start, v0 ? v0 : a0.dx, sizeof start);
  if ((st = df_transport_run (a, start, options, &ra, diag)) != DF_OK)
    return st;
  if ((st = df_transport_run (b, start, options, &rb, diag)) != DF_OK)
    {
      df_transport_result_clear (&ra);
      return st;
    }
  /* The same (-pi, pi] as the holonomy, a rounded half-turn included. */
  *angle_rad = df_wrap_angle (df_signed_angle (ra.end_vector, rb.end_vector, ra.end_normal));
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
