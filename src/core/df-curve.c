/* df-curve.c: curves on a surface: cubic splines through chart points (periodic when closed,
 * not-a-knot when open) parametrised by cumulative chord length in space, or exact curves
 * given by a function; evaluated to the space point, its first two derivatives, the normal and
 * its derivative. Near a pole of a revolution surface the curve lives in pole-centred polar
 * coordinates, a chart regular at a smooth pole.
 * GSL has no not-a-knot spline and keeps a mutable accelerator per spline, so the slopes are
 * solved with GSL's tridiagonal solvers (df-curve-spline.c) and evaluation is a read-only binary search:
 * a curve may be evaluated from several threads.
 * Plain C + libm + GSL; no GLib. */
#include "df-curve.h"
#include "df-curve-private.h"
#include "df-vec3.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

/* Below this distance from the pole (in t) q = r / rho is taken from its Taylor series,
 * where the quotient would lose digits. */
#define POLE_TAYLOR_FRACTION 1e-4
/* A point this close to a pole (fraction of the t range) switches the curve to polar
 * coordinates. */
#define POLE_NEAR_FRACTION 0.1

static df_curve *
curve_alloc (const df_surface *surface)
{
  df_curve *c = calloc (1, sizeof *c);

  if (c == NULL)
    return NULL;
  c->surface = df_surface_copy (surface);
  if (c->surface == NULL)
    {
      free (c);
      return NULL;
    }
  return c;
}

void
df_curve_free (df_curve *c)
{
  if (c == NULL)
    return;
  df_surface_free (c->surface);
  free (c->taus);
  free (c->coef[0]);
  free (c->coef[1]);
  free (c->coef[2]);
  free (c->breaks);
  free (c);
}

/* --- plane coordinates <-> chart ------------------------------------------------------- */

static void
setup_coords (df_curve *c, df_curve_coords coords)
{
  double u_min, u_max;

  df_surface_get_domain (c->surface, &u_min, &u_max, NULL, NULL);
  c->coords = coords;
  c->t_range = u_max - u_min;
  c->pole_t = coords == DF_COORDS_POLAR_MAX ? u_max : u_min;
  c->pole_sign = coords == DF_COORDS_POLAR_MAX ? -1.0 : 1.0;
  if (df_surface_get_kind (c->surface) == DF_SURFACE_REVOLUTION)
    {
      df_pole poles[2];

      df_surface_get_poles (c->surface, poles);
      for (int e = 0; e < 2; e++)
        {
          pole_frame *f = &c->frame[e];
          df_chart_jet j;

          f->t = e ? u_max : u_min;
          f->sign = e ? -1.0 : 1.0;
          if (df_surface_eval (c->surface, f->t, 0.0, 3, &j, NULL) == DF_OK)
            {
              f->r[0] = j.x[0];
              f->r[1] = j.d1[0][0];
              f->r[2] = j.d2[0][0];
              f->r[3] = j.d3[0][0];
            }
          f->smooth = poles[e].sin_alpha > 1.0 - 1e-9;
        }
    }
}

static void
chart_to_plane (const df_curve *c, double u, double v, double p[2])
{
  if (c->coords == DF_COORDS_CHART)
    {
      p[0] = u;
      p[1] = v;
      return;
    }
  {
    double rho = fmax (0.0, c->pole_sign * (u - c->pole_t));

    p[0] = rho * cos (v);
    p[1] = rho * sin (v);
  }
}

size_t
_df_curve_segment_of (const df_curve *c, double tau)
{
  size_t nseg = c->closed ? c->n_nodes : c->n_nodes - 1;
  size_t lo = 0, hi = nseg;

  /* Largest i with taus[i] <= tau, clamped to [0, nseg - 1]. */
  while (hi - lo > 1)
    {
      size_t mid = (lo + hi) / 2;

      if (c->taus[mid] <= tau)
        lo = mid;
      else
        hi = mid;
    }
  return lo;
}

double
_df_curve_wrap_tau (const df_curve *c, double tau, int *laps)
{
  double period = c->tau1 - c->tau0;

  *laps = 0;
  if (c->closed && (tau < c->tau0 || tau > c->tau1))
    {
      double k = floor ((tau - c->tau0) / period);

      *laps = (int) k;
      tau -= k * period;
    }
  if (tau < c->tau0)
    tau = c->tau0;
  if (tau > c->tau1)
    tau = c->tau1;
  return tau;
}

/* The spline's plane point and its first two derivatives in segment i at tau, laps whole
 * periods past the first (no search). */
static void
segment_eval (const df_curve *c, size_t i, double tau, int laps, double p[2], double dp[2],
              double ddp[2])
{
  double dt = tau - c->taus[i];

  for (int k = 0; k < 2; k++)
    {
      const double *q = &c->coef[k][4 * i];

      p[k] = q[0] + dt * (q[1] + dt * (q[2] + dt * q[3]));
      dp[k] = q[1] + dt * (2 * q[2] + dt * 3 * q[3]);
      ddp[k] = 2 * q[2] + 6 * dt * q[3];
      if (c->coords == DF_COORDS_CHART && c->closed)
        {
          p[k] += c->drift[k] * (tau - c->tau0 + laps * (c->tau1 - c->tau0));
          dp[k] += c->drift[k];
        }
    }
}

/* The plane point in segment i; in sphere coordinates, where there is no one plane, the chart
 * point (t, phi) instead. */
static void
segment_plane (const df_curve *c, size_t i, double tau, double p[2])
{
  double dp[2], ddp[2];

  if (c->coords == DF_COORDS_SPHERE)
    {
      int e = _df_curve_sphere_plane (c, tau, -1, p, dp, ddp);
      double rho = hypot (p[0], p[1]), ph = atan2 (p[1], p[0]);

      p[0] = c->frame[e].t + c->frame[e].sign * rho;
      p[1] = ph;
      return;
    }
  segment_eval (c, i, tau, 0, p, dp, ddp);
}

size_t
df_curve_sample_plane (const df_curve *c, size_t n_min, double (**out)[2])
{
  double (*pts)[2];
  size_t n;

  *out = NULL;
  if (c->fn != NULL)
    {
      double dp[2], ddp[2];

      n = n_min < 2 ? 2 : n_min;
      pts = malloc (n * sizeof *pts);
      if (pts == NULL)
        return 0;
      for (size_t i = 0; i < n; i++)
        df_curve_eval_plane (c, c->tau0 + (c->tau1 - c->tau0) * i / (c->closed ? n : n - 1),
                             pts[i], dp, ddp);
    }
  else
    {
      size_t nseg = c->closed ? c->n_nodes : c->n_nodes - 1;
      size_t per = (n_min + nseg - 1) / nseg, k = 0;

      if (per < 1)
        per = 1;
      n = nseg * per + (c->closed ? 0 : 1);
      pts = malloc (n * sizeof *pts);
      if (pts == NULL)
        return 0;
      for (size_t i = 0; i < nseg; i++)
        for (size_t j = 0; j < per; j++)
          segment_plane (c, i, c->taus[i] + (c->taus[i + 1] - c->taus[i]) * j / per, pts[k++]);
      if (!c->closed)
        segment_plane (c, nseg - 1, c->taus[nseg], pts[k++]);
    }
  *out = pts;
  return n;
}

void
df_curve_eval_plane (const df_curve *c, double tau, double p[2], double dp[2], double ddp[2])
{
  int laps;

  if (c->coords == DF_COORDS_SPHERE)
    {
      _df_curve_sphere_plane (c, tau, -1, p, dp, ddp);
      return;
    }
  tau = _df_curve_wrap_tau (c, tau, &laps);
  if (c->fn != NULL)
    {
      c->fn (tau, c->user, p, dp, ddp);
      return;
    }
  segment_eval (c, _df_curve_segment_of (c, tau), tau, laps, p, dp, ddp);
}

/* --- evaluation to space ----------------------------------------------------------------- */

static df_status
eval_chart (const df_curve *c, df_curve_point *o, df_diag *diag)
{
  df_chart_jet j;
  double du = o->dp[0], dv = o->dp[1], n[3], len, g[2][2], det, ii[2][2], w[2][2];
  df_status st;

  o->u = o->p[0];
  o->v = o->p[1];
  o->at_pole = false;
  if ((st = df_surface_eval (c->surface, o->u, o->v, 2, &j, diag)) != DF_OK)
    return st;
  for (int k = 0; k < 3; k++)
    {
      o->x[k] = j.x[k];
      o->dx[k] = j.d1[0][k] * du + j.d1[1][k] * dv;
      o->ddx[k] = j.d2[0][k] * du * du + 2 * j.d2[1][k] * du * dv + j.d2[2][k] * dv * dv
                  + j.d1[0][k] * o->ddp[0] + j.d1[1][k] * o->ddp[1];
    }
  df_cross3 (j.d1[0], j.d1[1], n);
  len = sqrt (df_dot3 (n, n));
  for (int a = 0; a < 2; a++)
    for (int b = 0; b < 2; b++)
      g[a][b] = df_dot3 (j.d1[a], j.d1[b]);
  det = g[0][0] * g[1][1] - g[0][1] * g[0][1];
  if (!(len > 0) || !(det > 0))
    return df_diag_fail_at (diag, DF_E_SINGULAR, -1, o->u, o->v,
                            "the curve runs through a singular point of the chart");
  for (int k = 0; k < 3; k++)
    o->normal[k] = n[k] / len;
  ii[0][0] = df_dot3 (j.d2[0], o->normal);
  ii[0][1] = ii[1][0] = df_dot3 (j.d2[1], o->normal);
  ii[1][1] = df_dot3 (j.d2[2], o->normal);
  /* Weingarten: N_i = -II_ij g^jk X_k, so dN/dtau = -(II g^-1)_ik u'^i X_k. */
  {
    double gi[2][2] = { { g[1][1] / det, -g[0][1] / det }, { -g[0][1] / det, g[0][0] / det } };

    for (int a = 0; a < 2; a++)
      for (int b = 0; b < 2; b++)
        w[a][b] = ii[a][0] * gi[0][b] + ii[a][1] * gi[1][b];
  }
  for (int k = 0; k < 3; k++)
    {
      double c0 = -(du * w[0][0] + dv * w[1][0]);
      double c1 = -(du * w[0][1] + dv * w[1][1]);

      o->dnormal[k] = c0 * j.d1[0][k] + c1 * j.d1[1][k];
    }
  return DF_OK;
}

/* Profile values at t: r, z and their first three t-derivatives, from the chart at phi = 0. */
static df_status
profile (const df_curve *c, double t, double r[4], double z[4], df_diag *diag)
{
  df_chart_jet j;
  df_status st = df_surface_eval (c->surface, t, 0.0, 3, &j, diag);

  if (st != DF_OK)
    return st;
  r[0] = j.x[0]; r[1] = j.d1[0][0]; r[2] = j.d2[0][0]; r[3] = j.d3[0][0];
  z[0] = j.x[2]; z[1] = j.d1[0][2]; z[2] = j.d2[0][2]; z[3] = j.d3[0][2];
  return DF_OK;
}

static df_status
eval_polar (const df_curve *c, const pole_frame *f, df_curve_point *o, df_diag *diag)
{
  const double sg = f->sign;
  const double tiny = 1e-12 * c->t_range;
  double rho = hypot (o->p[0], o->p[1]);
  double r[4], z[4], q, q1, q2, rho_d, rho_dd, er[2] = { 0, 0 }, er_d[2] = { 0, 0 };
  double sp, sp_t, nr, nz, nr_t, nz_t, nr_over_rho, t;
  const double p1 = sg * f->r[1], p2 = f->r[2], p3 = sg * f->r[3];
  df_status st;

  t = f->t + sg * rho;
  o->u = t;
  o->v = atan2 (o->p[1], o->p[0]);
  o->at_pole = rho <= tiny;
  if ((st = profile (c, t, r, z, diag)) != DF_OK)
    return st;

  /* X = (q p_1, q p_2, z) with q = r / rho. r and z come straight from the formulas, so r / rho
   * keeps its digits; its rho-derivatives lose them as rho -> 0 and are taken from the Taylor
   * series of r about the pole (r(pole) = 0) there. d/drho = sg d/dt. */
  q = rho > tiny ? r[0] / rho : p1;
  if (rho < POLE_TAYLOR_FRACTION * c->t_range)
    {
      q1 = p2 / 2 + p3 * rho / 3;
      q2 = p3 / 3;
    }
  else
    {
      double r_rho = sg * r[1];

      q1 = (r_rho * rho - r[0]) / (rho * rho);
      q2 = (r[2] * rho * rho - 2 * r_rho * rho + 2 * r[0]) / (rho * rho * rho);
    }
  if (rho > tiny)
    {
      rho_d = (o->p[0] * o->dp[0] + o->p[1] * o->dp[1]) / rho;
      rho_dd = (o->dp[0] * o->dp[0] + o->dp[1] * o->dp[1] + o->p[0] * o->ddp[0]
                + o->p[1] * o->ddp[1] - rho_d * rho_d) / rho;
      er[0] = o->p[0] / rho;
      er[1] = o->p[1] / rho;
      er_d[0] = (o->dp[0] - er[0] * rho_d) / rho;
      er_d[1] = (o->dp[1] - er[1] * rho_d) / rho;
    }
  else
    {
      /* On the pole rho is not differentiable; the terms that use rho_d or rho_dd are
       * multiplied by p = 0, or belong to z, which is flat at a smooth pole. */
      rho_d = 0.0;
      rho_dd = 0.0;
    }
  for (int k = 0; k < 2; k++)
    {
      o->x[k] = q * o->p[k];
      o->dx[k] = q1 * rho_d * o->p[k] + q * o->dp[k];
      o->ddx[k] = q2 * rho_d * rho_d * o->p[k] + q1 * rho_dd * o->p[k]
                  + 2 * q1 * rho_d * o->dp[k] + q * o->ddp[k];
    }
  o->x[2] = z[0];
  o->dx[2] = sg * z[1] * rho_d;
  o->ddx[2] = z[2] * rho_d * rho_d + sg * z[1] * rho_dd;
  if (rho <= tiny)
    {
      /* z = z0 + z''/2 rho^2 + ... at a smooth pole: z'' |p'|^2 is its second derivative. */
      o->dx[2] = 0.0;
      o->ddx[2] = z[2] * (o->dp[0] * o->dp[0] + o->dp[1] * o->dp[1]);
    }

  /* N = n_r(t) e_r + n_z(t) e_z with (n_r, n_z) = (-z', r') / |(r', z')|. */
  sp = hypot (r[1], z[1]);
  sp_t = (r[1] * r[2] + z[1] * z[2]) / sp;
  nr = -z[1] / sp;
  nz = r[1] / sp;
  nr_t = -(z[2] * sp - z[1] * sp_t) / (sp * sp);
  nz_t = (r[2] * sp - r[1] * sp_t) / (sp * sp);
  /* n_r vanishes at a smooth pole, so n_r / rho has the limit sg n_r'; at a cone apex it has
   * none (the normal jumps there). */
  nr_over_rho = rho > tiny ? nr / rho : (f->smooth ? sg * nr_t : 0.0);
  if (rho > tiny)
    {
      o->normal[0] = nr * er[0];
      o->normal[1] = nr * er[1];
      o->normal[2] = nz;
    }
  else
    {
      o->normal[0] = o->normal[1] = 0.0;
      o->normal[2] = nz >= 0 ? 1.0 : -1.0;
    }
  /* dN/dtau = n_r' t' e_r + n_r e_r' + n_z' t' e_z, t' = sg rho', e_r' = (p' - e_r rho') / rho. */
  for (int k = 0; k < 2; k++)
    o->dnormal[k] = rho > tiny ? nr_t * sg * rho_d * er[k] + nr_over_rho * rho * er_d[k]
                               : nr_over_rho * o->dp[k];
  o->dnormal[2] = nz_t * sg * rho_d;
  return DF_OK;
}

df_status
df_curve_eval (const df_curve *c, double tau, df_curve_point *o, df_diag *diag)
{
  df_status st;

  memset (o, 0, sizeof *o);
  o->tau = tau;
  df_curve_eval_plane (c, tau, o->p, o->dp, o->ddp);
  if (c->coords == DF_COORDS_SPHERE)
    {
      int e = _df_curve_sphere_plane (c, tau, -1, o->p, o->dp, o->ddp);

      st = eval_polar (c, &c->frame[e], o, diag);
    }
  else
    st = c->coords == DF_COORDS_CHART ? eval_chart (c, o, diag)
                                      : eval_polar (c, &c->frame[c->coords == DF_COORDS_POLAR_MAX],
                                                    o, diag);
  if (st == DF_OK)
    {
      const double *all = o->x;

      for (int k = 0; k < 15; k++)
        if (!isfinite (all[k]))
          return df_diag_fail_at (diag, DF_E_NONFINITE, -1, o->u, o->v,
                                  "the curve's point or derivative is not finite");
    }
  return st;
}

/* --- construction ----------------------------------------------------------------------- */

static int
compute_winding (const df_curve *c)
{
  double tau0 = c->tau0, tau1 = c->tau1, total = 0.0, prev;
  double p[2], dp[2], ddp[2];
  const int n = 4096;

  if (!c->closed || df_surface_get_kind (c->surface) != DF_SURFACE_REVOLUTION)
    return 0;
  if (c->coords == DF_COORDS_SPHERE)
    {
      /* phi followed along the curve (segment_plane gives (t, phi) in these coordinates). */
      double q[2];

      segment_plane (c, 0, tau0, q);
      prev = q[1];
      for (int i = 1; i <= n; i++)
        {
          double tau = tau0 + (tau1 - tau0) * i / n, d;

          segment_plane (c, 0, tau, q);
          d = q[1] - prev;
          d -= 2 * M_PI * floor ((d + M_PI) / (2 * M_PI));
          total += d;
          prev = q[1];
        }
      return (int) lround (total / (2 * M_PI));
    }
  if (c->coords == DF_COORDS_CHART)
    {
      double p1[2];

      df_curve_eval_plane (c, tau0, p, dp, ddp);
      df_curve_eval_plane (c, tau1, p1, dp, ddp);
      return (int) lround ((p1[1] - p[1]) / (2 * M_PI));
    }
  df_curve_eval_plane (c, tau0, p, dp, ddp);
  prev = atan2 (p[1], p[0]);
  for (int i = 1; i <= n; i++)
    {
      double a, d;

      df_curve_eval_plane (c, tau0 + (tau1 - tau0) * i / n, p, dp, ddp);
      a = atan2 (p[1], p[0]);
      d = a - prev;
      d -= 2 * M_PI * floor ((d + M_PI) / (2 * M_PI));
      total += d;
      prev = a;
    }
  return (int) lround (total / (2 * M_PI));
}

/* How far a spline segment's point at tau lies from the profile parameter t_apex, in t. */
static double
apex_distance (const df_curve *c, size_t seg, double tau, double t_apex)
{
  double p[2];

  segment_plane (c, seg, tau, p);
  if (c->coords == DF_COORDS_CHART)
    return fabs (p[0] - t_apex);
  return fabs (c->pole_t + c->pole_sign * hypot (p[0], p[1]) - t_apex);
}

df_status
df_curve_new_through_points (const df_surface *surface, const double (*uv)[2], size_t n,
                             bool closed, df_curve **out, df_diag *diag)
{
  df_curve *c;
  double (*pts)[2] = NULL, *y = NULL, *slope = NULL, size = df_surface_size (surface);
  double (*xs)[3] = NULL;
  df_pole poles[2];
  bool revolution = df_surface_get_kind (surface) == DF_SURFACE_REVOLUTION;
  bool near[2] = { false, false };
  double u_min, u_max;
  df_status st = DF_OK;
  size_t nseg;

  *out = NULL;
  df_diag_clear (diag);
  if (n < 2)
    return df_diag_fail (diag, DF_E_INPUT, -1, "a path needs at least 2 points, got %zu", n);
  c = curve_alloc (surface);
  if (c == NULL)
    return DF_E_NOMEM;
  c->closed = closed;
  df_surface_get_domain (surface, &u_min, &u_max, NULL, NULL);
  df_surface_get_poles (surface, poles);

  pts = malloc ((n + 1) * sizeof *pts);
  xs = malloc ((n + 1) * sizeof *xs);
  if (pts == NULL || xs == NULL)
    {
      st = DF_E_NOMEM;
      goto fail;
    }
  for (size_t i = 0; i < n; i++)
    {
      df_chart_jet j;

      if (!isfinite (uv[i][0]) || !isfinite (uv[i][1]))
        {
          st = df_diag_fail (diag, DF_E_INPUT, (long) i, "the point is not a finite number");
          goto fail;
        }
      /* A cone apex has no tangent plane: nothing can be carried through it. */
      for (int e = 0; e < 2; e++)
        if (poles[e].on_axis && poles[e].sin_alpha < 1.0 - 1e-9
            && fabs (uv[i][0] - poles[e].t) <= 1e-9 * (u_max - u_min))
          {
            st = df_diag_fail_at (diag, DF_E_SINGULAR, (long) i, uv[i][0], uv[i][1],
                                  "the point lies on the cone apex, where the surface has no "
                                  "tangent plane and no direction can be carried; keep the "
                                  "path off the apex (a loop round it takes its concentrated "
                                  "curvature)");
            goto fail;
          }
      if ((st = df_surface_eval (surface, uv[i][0], uv[i][1], 0, &j, diag)) != DF_OK)
        {
          if (diag)
            diag->index = (long) i;
          goto fail;
        }
      memcpy (xs[i], j.x, sizeof xs[i]);
      pts[i][0] = uv[i][0];
      pts[i][1] = uv[i][1];
      /* A periodic coordinate first comes back to its principal range: the unwrapping below
       * adds steps of less than half a turn, which a value of 1e20 (whose last digit is worth
       * more than a turn) would swallow, making a few points wind thousands of times. */
      if (revolution)
        pts[i][1] = remainder (pts[i][1], 2 * M_PI);
      if (df_surface_u_periodic (surface))
        pts[i][0] = u_min + (pts[i][0] - u_min) - (u_max - u_min)
                              * floor ((pts[i][0] - u_min) / (u_max - u_min));
    }
  /* A closing point that repeats the first is dropped: the curve joins them anyway. */
  if (closed && n > 1)
    {
      double d[3] = { xs[n - 1][0] - xs[0][0], xs[n - 1][1] - xs[0][1], xs[n - 1][2] - xs[0][2] };

      if (sqrt (df_dot3 (d, d)) <= 1e-9 * size)
        n--;
    }
  if (closed && n < 3)
    {
      st = df_diag_fail (diag, DF_E_INPUT, -1, "a loop needs at least 3 distinct points, got %zu",
                         n);
      goto fail;
    }
  for (size_t i = 0; i + 1 < (closed ? n + 1 : n); i++)
    {
      size_t k = (i + 1) % n;
      double d[3] = { xs[k][0] - xs[i][0], xs[k][1] - xs[i][1], xs[k][2] - xs[i][2] };

      if (sqrt (df_dot3 (d, d)) <= 1e-12 * size)
        {
          st = df_diag_fail (diag, DF_E_INPUT, (long) k,
                             "point %zu repeats point %zu: consecutive points must differ",
                             k + 1, i + 1);
          goto fail;
        }
    }

  /* Unwrap phi so each step lies in (-pi, pi]; points on the axis take the next one's phi. */
  if (revolution)
    {
      /* Polar coordinates only where the chart would fail: a point on the pole, or a path
       * that sweeps round the pole in few points (a phi step over a quarter turn). A latitude
       * circle near a pole stays in the chart, where the spline reproduces it exactly. */
      for (size_t i = 0; i < n; i++)
        for (int e = 0; e < 2; e++)
          {
            double dist = fabs (pts[i][0] - poles[e].t), step = 0.0;

            if (n > 1)
              {
                size_t k = (i + 1) % n;

                step = fabs (remainder (pts[k][1] - pts[i][1], 2 * M_PI));
                if (!closed && i + 1 == n)
                  step = 0.0;
              }
            if (n > 1 && step > M_PI / 8)
              {
                /* A step that turns round the axis while the distance to the pole changes by
                 * half or more passes the pole: phi(tau) then has a sharp knee that a chart
                 * spline follows badly and the chart transport crawls through (Gamma^phi_tphi =
                 * r'/r). A latitude-like step (distance kept) stays in the chart. */
                double other = fabs (pts[(i + 1) % n][0] - poles[e].t);

                if (fmax (dist, other) > 1.5 * fmin (dist, other))
                  step = M_PI;
              }
            if (poles[e].on_axis && dist < POLE_NEAR_FRACTION * (u_max - u_min)
                && (dist <= 1e-6 * (u_max - u_min) || step > M_PI / 2))
              near[e] = true;
          }
      if (near[0] && near[1] && (!poles[0].on_axis || !poles[1].on_axis
                                 || poles[0].sin_alpha < 1.0 - 1e-9
                                 || poles[1].sin_alpha < 1.0 - 1e-9))
        {
          st = df_diag_fail (diag, DF_E_INPUT, -1, "the path comes near both ends of the "
                             "profile and one is a cone apex; split it into pieces that each "
                             "stay near one end");
          goto fail;
        }
      for (size_t i = 1; i < n; i++)
        {
          double d = pts[i][1] - pts[i - 1][1];

          d -= 2 * M_PI * floor ((d + M_PI) / (2 * M_PI));
          if (d == -M_PI)
            d = M_PI;
          pts[i][1] = pts[i - 1][1] + d;
          if (df_surface_u_periodic (surface))
            {
              /* A closed profile: t steps by less than half a period, too. */
              double per = u_max - u_min, du = remainder (pts[i][0] - pts[i - 1][0], per);

              pts[i][0] = pts[i - 1][0] + du;
            }
        }
    }
  setup_coords (c, near[0] && near[1] ? DF_COORDS_SPHERE
                  : near[0] ? DF_COORDS_POLAR_MIN : near[1] ? DF_COORDS_POLAR_MAX
                            : DF_COORDS_CHART);

  /* Cumulative chord length in space. */
  nseg = closed ? n : n - 1;
  c->n_nodes = n;
  c->taus = malloc ((n + 1) * sizeof *c->taus);
  c->coef[0] = malloc (4 * nseg * sizeof (double));
  c->coef[1] = malloc (4 * nseg * sizeof (double));
  if (c->coords == DF_COORDS_SPHERE)
    c->coef[2] = malloc (4 * nseg * sizeof (double));
  y = malloc ((n + 1) * sizeof *y);
  slope = malloc ((n + 1) * sizeof *slope);
  if (!c->taus || !c->coef[0] || !c->coef[1] || !y || !slope
      || (c->coords == DF_COORDS_SPHERE && !c->coef[2]))
    {
      st = DF_E_NOMEM;
      goto fail;
    }
  c->taus[0] = 0.0;
  for (size_t i = 0; i < nseg; i++)
    {
      size_t k = (i + 1) % n;
      double d[3] = { xs[k][0] - xs[i][0], xs[k][1] - xs[i][1], xs[k][2] - xs[i][2] };

      c->taus[i + 1] = c->taus[i] + sqrt (df_dot3 (d, d));
    }
  c->tau0 = 0.0;
  c->tau1 = c->taus[nseg];

  if (c->coords == DF_COORDS_CHART && closed && revolution)
    for (int k = 0; k < 2; k++)
      {
        /* The lap's total step in a periodic coordinate: the wrapped last -> first step added
         * to the unwrapped run; it makes the interpolated coordinate grow by a whole period. */
        double period = k == 1 ? 2 * M_PI : u_max - u_min;
        double d, total;

        if (k == 0 && !df_surface_u_periodic (surface))
          continue;
        d = remainder (pts[0][k] - pts[n - 1][k], period);
        if (d == -period / 2)
          d = period / 2;
        total = pts[n - 1][k] + d - pts[0][k];
        c->drift[k] = total / c->tau1;
      }
  for (int k = 0; k < (c->coords == DF_COORDS_SPHERE ? 3 : 2); k++)
    {
      for (size_t i = 0; i < n; i++)
        {
          double p[3];

          if (c->coords == DF_COORDS_SPHERE)
            {
              double th = M_PI * (pts[i][0] - u_min) / (u_max - u_min);

              p[0] = sin (th) * cos (pts[i][1]);
              p[1] = sin (th) * sin (pts[i][1]);
              p[2] = cos (th);
            }
          else
            chart_to_plane (c, pts[i][0], pts[i][1], p);
          y[i] = p[k];
          if (c->coords == DF_COORDS_CHART && closed)
            y[i] -= c->drift[k] * c->taus[i];
        }
      if (_df_curve_spline_slopes (c->taus, y, n, closed, slope) != 0)
        {
          st = df_diag_fail (diag, DF_E_INPUT, -1, "the spline through the points is singular");
          goto fail;
        }
      _df_curve_spline_coefficients (c->taus, y, slope, nseg, n, c->coef[k]);
    }
  c->winding = compute_winding (c);
  if (c->coords == DF_COORDS_CHART && closed && df_surface_u_periodic (surface))
    c->tube_winding = (int) lround (c->drift[0] * c->tau1 / (u_max - u_min));

  if (c->coords == DF_COORDS_SPHERE && (st = _df_curve_sphere_breaks (c)) != DF_OK)
    goto fail;
  /* A cone apex has no tangent plane: a curve that runs through it between its points (the
   * spline passes within a hair of it) cannot be measured, and the transport would crawl
   * towards it for seconds before giving up. Found here from 32 samples a segment. */
  for (int e = 0; e < 2 && c->coords != DF_COORDS_SPHERE; e++)
    {
      double tol = 1e-6 * (u_max - u_min);

      if (!poles[e].on_axis || !(poles[e].sin_alpha < 1.0 - 1e-9))
        continue;
      for (size_t i = 0; i < nseg; i++)
        {
          double t0 = c->taus[i], t1 = c->taus[i + 1], best = INFINITY, best_tau = t0;
          double a, b;

          /* The nearest approach: the best of 32 samples, then golden-section search between
           * its neighbours (the distance is smooth along a spline segment). */
          for (int h = 0; h <= 32; h++)
            {
              double tau = t0 + (t1 - t0) * h / 32.0, d = apex_distance (c, i, tau, poles[e].t);

              if (d < best)
                {
                  best = d;
                  best_tau = tau;
                }
            }
          a = fmax (t0, best_tau - (t1 - t0) / 32.0);
          b = fmin (t1, best_tau + (t1 - t0) / 32.0);
          for (int it = 0; it < 60 && b - a > 1e-15 * (fabs (a) + 1); it++)
            {
              double m1 = b - 0.6180339887498949 * (b - a), m2 = a + 0.6180339887498949 * (b - a);

              if (apex_distance (c, i, m1, poles[e].t) < apex_distance (c, i, m2, poles[e].t))
                b = m2;
              else
                a = m1;
            }
          best = fmin (best, apex_distance (c, i, 0.5 * (a + b), poles[e].t));
          if (best < tol)
            {
              st = df_diag_fail (diag, DF_E_SINGULAR, (long) i,
                                 "the curve between points %zu and %zu runs through the cone "
                                 "apex, where the surface has no tangent plane; keep the path "
                                 "off the apex", i + 1, (i + 1) % n + 1);
              goto fail;
            }
        }
    }
  /* Check the interpolant stays in the domain between the points (plane coordinates only:
   * cheap enough for ten thousand points). Sphere coordinates always do. */
  for (size_t i = 0; i < nseg && c->coords != DF_COORDS_SPHERE; i++)
    for (int h = 1; h < 4; h++)
      {
        double tau = c->taus[i] + (c->taus[i + 1] - c->taus[i]) * h / 4.0, p[2];
        double u, v;

        segment_plane (c, i, tau, p);
        if (c->coords == DF_COORDS_CHART)
          {
            u = p[0];
            v = p[1];
          }
        else
          {
            u = c->pole_t + c->pole_sign * hypot (p[0], p[1]);
            v = atan2 (p[1], p[0]);
          }
        if (!df_surface_contains (c->surface, u, v))
          {
            st = df_diag_fail_at (diag, DF_E_DOMAIN, (long) i, u, v,
                                  "the curve between points %zu and %zu leaves the surface's "
                                  "domain", i + 1, (i + 1) % n + 1);
            goto fail;
          }
      }
  free (pts);
  free (xs);
  free (y);
  free (slope);
  *out = c;
  return DF_OK;

fail:
  free (pts);
  free (xs);
  free (y);
  free (slope);
  df_curve_free (c);
  return st == DF_OK ? DF_E_INTERNAL : st;
}

df_status
df_curve_new_function (const df_surface *surface, df_curve_coords coords, double tau0,
                       double tau1, const double *breaks, size_t n_breaks, bool closed,
                       df_curve_fn fn, void *user, df_curve **out, df_diag *diag)
{
  df_curve *c;

  *out = NULL;
  df_diag_clear (diag);
  if (fn == NULL || !(tau0 < tau1))
    return df_diag_fail (diag, DF_E_INPUT, -1, "an exact curve needs a function and tau0 < tau1");
  if (coords == DF_COORDS_SPHERE)
    return df_diag_fail (diag, DF_E_INPUT, -1, "an exact curve cannot use sphere coordinates");
  if (coords != DF_COORDS_CHART && df_surface_get_kind (surface) != DF_SURFACE_REVOLUTION)
    return df_diag_fail (diag, DF_E_INPUT, -1, "polar coordinates need a surface of revolution");
  c = curve_alloc (surface);
  if (c == NULL)
    return DF_E_NOMEM;
  setup_coords (c, coords);
  c->closed = closed;
  c->tau0 = tau0;
  c->tau1 = tau1;
  c->fn = fn;
  c->user = user;
  if (n_breaks > 0)
    {
      c->breaks = malloc (n_breaks * sizeof *c->breaks);
      if (c->breaks == NULL)
        {
          df_curve_free (c);
          return DF_E_NOMEM;
        }
      memcpy (c->breaks, breaks, n_breaks * sizeof *c->breaks);
      c->n_breaks = n_breaks;
    }
  c->winding = compute_winding (c);
  *out = c;
  return DF_OK;
}

const df_surface *
df_curve_get_surface (const df_curve *c)
{
  return c->surface;
}

bool
df_curve_is_closed (const df_curve *c)
{
  return c->closed;
}

df_curve_coords
df_curve_get_coords (const df_curve *c)
{
  return c->coords;
}

void
df_curve_get_range (const df_curve *c, double *tau0, double *tau1)
{
  *tau0 = c->tau0;
  *tau1 = c->tau1;
}

size_t
df_curve_get_breaks (const df_curve *c, const double **breaks)
{
  *breaks = c->breaks;
  return c->n_breaks;
}

size_t
df_curve_get_nodes (const df_curve *c, const double **taus)
{
  *taus = c->fn ? NULL : c->taus;
  return c->fn ? 0 : c->n_nodes;
}

int
df_curve_axis_winding (const df_curve *c)
{
  return c->winding;
}

int
df_curve_tube_winding (const df_curve *c)
{
  return c->tube_winding;
}
