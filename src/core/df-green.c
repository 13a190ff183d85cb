/* df-green.c: Green's theorem for the enclosed curvature and area, independent of the
 * transport: an adaptive line integral along the curve and, on a graph, the inner integrals
 * H = int K sqrt(g) du and A = int sqrt(g) du from a verified Chebyshev fit or by adaptive
 * Gauss-Kronrod along the chart line (GSL's QAG, CQUAD where QAG gives up).
 * The line integral is our own bisection of Gauss-Legendre panels (GSL's nodes): GSL's QAG
 * takes the C2 knots of a spline loop for rounding and stops short (seen on a 40-point loop:
 * 2e-6 estimated where per-segment quadrature is exact), CQUAD gets there with ten times the
 * evaluations, and neither integrates the curvature and the area in one pass.
 * Everything lives in per-call contexts and workspaces: no globals, so loops can be measured
 * on several threads at once.
 * Plain C + libm + GSL; no GLib. */
#include "df-green.h"

#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "df-cheb2.h"
#include "df-geometry.h"

/* Subintervals of one inner integral: enough to resolve a bump a thousandth of the box wide. */
#define INNER_LIMIT 1000
/* Highest Chebyshev degree tried for the fast path: beyond it the fit costs more surface
 * evaluations (n^2) than direct quadrature along the loop usually does. */
#define FIT_MAX_DEGREE 128
/* Points along the loop where the fit is checked against direct quadrature. */
#define FIT_CHECKS 24

/* --- the adaptive line integral ------------------------------------------------------------ */

/* Gauss-Legendre points per panel half: exact for degree 9, so a smooth integrand's panel
 * converges at the first comparison. */
#define LINE_GL 5
/* Panels the curve starts with: knot-aligned groups of spline segments. */
#define LINE_PANELS 64
/* A bound on the work of the line quadrature with direct inner integrals (each point costs
 * a few hundred surface evaluations, about 0.2 us each): after it the remaining panels are
 * accepted with their error estimates, which then say how far the result got. */
#define DIRECT_MAX_EVALS 20000

typedef struct
{
  double a, b;
  double whole[2];   /* the rule on [a, b] */
} panel;

typedef struct
{
  const df_curve  *curve;
  df_green_line_fn fn;
  void            *user;
  const gsl_integration_glfixed_table *gl;
  size_t           evals;
  df_diag         *diag;
} line_ctx;

/* The Gauss-Legendre rule on [a, b] for both components. */
static df_status
line_rule (line_ctx *lc, double a, double b, double out[2], double noise[2])
{
  out[0] = out[1] = 0.0;
  for (size_t k = 0; k < LINE_GL; k++)
    {
      double tau, w, p[2], dp[2], ddp[2], v[2] = { 0.0, 0.0 }, e[2] = { 0.0, 0.0 };
      df_status st;

      gsl_integration_glfixed_point (a, b, k, &tau, &w, lc->gl);
      df_curve_eval_plane (lc->curve, tau, p, dp, ddp);
      lc->evals++;
      if ((st = lc->fn (tau, p, dp, v, e, lc->user, lc->diag)) != DF_OK)
        return st;
      if (noise)
        for (int c = 0; c < 2; c++)
          noise[c] += w * fabs (e[c]);
      if (!isfinite (v[0]) || !isfinite (v[1]))
        return df_diag_fail_at (lc->diag, DF_E_NONFINITE, -1, p[0], p[1],
                                "the curvature integrand is not finite at tau = %.6g", tau);
      out[0] += w * v[0];
      out[1] += w * v[1];
    }
  return DF_OK;
}

static int
compare_double (const void *x, const void *y)
{
  double a = *(const double *) x, b = *(const double *) y;

  return (a > b) - (a < b);
}

/* The starting panels: the curve's corners, and spline nodes in groups so that no panel
 * straddles more knots than needed (a spline is only C2 there, which costs an adaptive rule
 * many bisections when a knot falls inside a panel; at a panel's end it costs nothing). */
static size_t
start_panels (const df_curve *curve, double **out)
{
  const double *breaks, *taus;
  size_t n_breaks = df_curve_get_breaks (curve, &breaks);
  size_t n_nodes = df_curve_get_nodes (curve, &taus), group, m = 0;
  double tau0, tau1, *b;

  df_curve_get_range (curve, &tau0, &tau1);
  group = n_nodes ? (n_nodes + LINE_PANELS - 1) / LINE_PANELS : 0;
  b = malloc ((n_breaks + LINE_PANELS + 16 + 2) * sizeof *b);
  if (b == NULL)
    return 0;
  b[m++] = tau0;
  b[m++] = tau1;
  for (size_t i = 0; i < n_breaks; i++)
    b[m++] = breaks[i];
  if (n_nodes)
    for (size_t i = group; i < n_nodes; i += group)
      b[m++] = taus[i];
  else
    for (int i = 1; i < 16; i++)
      b[m++] = tau0 + (tau1 - tau0) * i / 16;
  qsort (b, m, sizeof *b, compare_double);
  {
    size_t k = 0;

    for (size_t i = 0; i < m; i++)
      if (b[i] >= tau0 && b[i] <= tau1 && (k == 0 || b[i] > b[k - 1]))
        b[k++] = b[i];
    m = k;
  }
  *out = b;
  return m;
}

df_status
df_green_line_integral (const df_curve *curve, df_green_line_fn fn, void *user,
                        const double *epsabs, const double *epsrel, size_t max_evals,
                        df_green_line_result *out, df_diag *diag)
{
  double tau0, tau1, *bounds = NULL, total[2] = { 0.0, 0.0 }, goal[2];
  size_t n_bounds, n_stack = 0, cap;
  panel *stack = NULL;
  gsl_integration_glfixed_table *gl = gsl_integration_glfixed_table_alloc (LINE_GL);
  line_ctx lc = { curve, fn, user, gl, 0, diag };
  df_status st = DF_OK;

  memset (out, 0, sizeof *out);
  df_diag_clear (diag);
  df_curve_get_range (curve, &tau0, &tau1);
  n_bounds = start_panels (curve, &bounds);
  cap = n_bounds + 64;
  stack = malloc (cap * sizeof *stack);
  if (gl == NULL || n_bounds == 0 || stack == NULL)
    {
      st = DF_E_NOMEM;
      goto out;
    }
  out->reached[0] = out->reached[1] = true;
  for (size_t i = 0; i + 1 < n_bounds; i++)
    {
      panel *pn = &stack[n_stack++];

      pn->a = bounds[i];
      pn->b = bounds[i + 1];
      if ((st = line_rule (&lc, pn->a, pn->b, pn->whole, NULL)) != DF_OK)
        goto out;
      total[0] += pn->whole[0];
      total[1] += pn->whole[1];
    }
  /* Each panel's share of the tolerance is its share of the parameter range. */
  for (int c = 0; c < 2; c++)
    goal[c] = fmax (epsabs[c], epsrel[c] * fabs (total[c])) / (tau1 - tau0);

  /* Bisection, depth first: a panel is accepted when its two halves agree with the whole, and
   * the halves' sum is kept. The difference estimates the whole's error, so it bounds the
   * halves' error generously: an honest figure for the result. */
  while (n_stack > 0)
    {
      panel pn = stack[--n_stack];
      double mid = 0.5 * (pn.a + pn.b), left[2], right[2], diff[2], noise[2] = { 0.0, 0.0 };
      bool ok = true, at_limit;

      if ((st = line_rule (&lc, pn.a, mid, left, noise)) != DF_OK
          || (st = line_rule (&lc, mid, pn.b, right, noise)) != DF_OK)
        goto out;
      /* Where the integrand itself is only known to some error (inner integrals stopped by
       * rounding at a kink), halves and whole cannot agree better than that: twice it is
       * allowed on top, and it is in the caller's error figure already. */
      for (int c = 0; c < 2; c++)
        {
          diff[c] = fabs (left[c] + right[c] - pn.whole[c]);
          ok = ok && diff[c] <= goal[c] * (pn.b - pn.a) + 2 * noise[c];
        }
      at_limit = lc.evals >= max_evals || !(mid > pn.a && mid < pn.b);
      if (ok || at_limit)
        {
          for (int c = 0; c < 2; c++)
            {
              out->value[c] += left[c] + right[c];
              out->error[c] += diff[c];
              if (!ok && diff[c] > goal[c] * (pn.b - pn.a) + 2 * noise[c])
                out->reached[c] = false;
            }
          continue;
        }
      if (n_stack + 2 > cap)
        {
          panel *grown = realloc (stack, 2 * cap * sizeof *stack);

          if (grown == NULL)
            {
              st = DF_E_NOMEM;
              goto out;
            }
          stack = grown;
          cap *= 2;
        }
      stack[n_stack++] = (panel) { mid, pn.b, { right[0], right[1] } };
      stack[n_stack++] = (panel) { pn.a, mid, { left[0], left[1] } };
    }
out:
  out->evals = lc.evals;
  free (bounds);
  free (stack);
  if (gl)
    gsl_integration_glfixed_table_free (gl);
  return st;
}

/* --- graphs: the inner integrals ------------------------------------------------------------ */

typedef struct
{
  const df_surface *surface;
  double            u_ref;          /* lower limit of the inner integrals */
  df_cheb2         *fit;            /* fast path, or NULL */
  gsl_integration_workspace *ws;
  gsl_integration_cquad_workspace *cq;
  double            inner_epsabs[2];
  double            inner_err[2];   /* largest error estimate of a direct inner integral */
  size_t            evals;
  /* the line being integrated */
  double            v;
  int               comp;
  df_status         fail;
  df_diag           fail_diag;
} graph_ctx;

static double
inner_integrand (double u, void *data)
{
  graph_ctx *g = data;
  double ksg = 0.0, sg = 0.0;
  df_status st;

  if (g->fail != DF_OK)
    return 0.0;
  g->evals++;
  st = df_surface_k_area (g->surface, u, g->v, &ksg, &sg, &g->fail_diag);
  if (st == DF_OK && !(isfinite (ksg) && isfinite (sg)))
    st = df_diag_fail_at (&g->fail_diag, DF_E_NONFINITE, -1, u, g->v,
                          "the curvature integrand is not finite");
  if (st != DF_OK)
    {
      g->fail = st;
      return 0.0;
    }
  return g->comp == 0 ? ksg : sg;
}

/* H (comp 0) or A (comp 1) at (u, v) by adaptive Gauss-Kronrod from u_ref. A narrow bump
 * whose positive and negative curvature cancel along the line leaves a result near zero that
 * no relative tolerance can reach; the absolute one, derived from the loop's tolerance, can,
 * and where rounding stops GSL first its result and error estimate are still used. */
static df_status
inner_direct (graph_ctx *g, double u, double v, int comp, double *value, double *error,
              df_diag *diag)
{
  gsl_function f = { inner_integrand, g };
  double e = 0.0;

  *value = 0.0;
  if (error)
    *error = 0.0;
  if (u == g->u_ref)
    return DF_OK;
  g->v = v;
  g->comp = comp;
  g->fail = DF_OK;
  if (gsl_integration_qag (&f, g->u_ref, u, g->inner_epsabs[comp], 1e-13, INNER_LIMIT,
                           GSL_INTEG_GAUSS21, g->ws, value, &e) != GSL_SUCCESS
      && g->fail == DF_OK)
    {
      /* QAG's heuristics read a kink (a piecewise-polynomial surface) as rounding and stop;
       * CQUAD's doubly adaptive Clenshaw-Curtis rule goes on through it. The better of the
       * two estimates is kept. */
      double v2 = 0.0, e2 = 0.0;
      size_t n_ev = 0;

      gsl_integration_cquad (&f, g->u_ref, u, g->inner_epsabs[comp], 1e-13, g->cq, &v2, &e2,
                             &n_ev);
      if (g->fail == DF_OK && isfinite (v2) && e2 < e)
        {
          *value = v2;
          e = e2;
        }
    }
  if (g->fail != DF_OK)
    {
      if (diag)
        *diag = g->fail_diag;
      return g->fail;
    }
  if (!isfinite (*value))
    return df_diag_fail_at (diag, DF_E_NONFINITE, -1, u, v,
                            "the inner curvature integral is not finite");
  if (e > g->inner_err[comp])
    g->inner_err[comp] = e;
  if (error)
    *error = e;
  return DF_OK;
}

static df_status
graph_line_fn (double tau, const double p[2], const double dp[2], double *values,
               double *errors, void *user, df_diag *diag)
{
  graph_ctx *g = user;
  double ha[2], he[2] = { 0.0, 0.0 };
  df_status st;

  (void) tau;
  if (g->fit != NULL)
    df_cheb2_eval_xint (g->fit, p[0], p[1], ha);
  else if ((st = inner_direct (g, p[0], p[1], 0, &ha[0], &he[0], diag)) != DF_OK
           || (st = inner_direct (g, p[0], p[1], 1, &ha[1], &he[1], diag)) != DF_OK)
    return st;
  for (int c = 0; c < 2; c++)
    {
      values[c] = ha[c] * dp[1];
      errors[c] = he[c] * fabs (dp[1]);
    }
  return DF_OK;
}

static df_status
fit_fn (double x, double y, double *values, void *user)
{
  graph_ctx *g = user;

  g->evals++;
  return df_surface_k_area (g->surface, x, y, &values[0], &values[1], NULL);
}

/* The Chebyshev fast path: a fit whose trailing coefficients vanish, checked against direct
 * quadrature at points of the loop. Returns the largest disagreement found per component in
 * disc[], or leaves g->fit NULL when the fit did not converge or disagrees by more than the
 * inner tolerance allows. */
static df_status
try_fit (graph_ctx *g, const double lo[2], const double hi[2], const double (*q)[2], size_t m,
         double total_dv, const double tol[2], double disc[2], df_diag *diag)
{
  df_cheb2 *fit = NULL;
  double mid_ref = g->u_ref;
  df_status st;

  disc[0] = disc[1] = 0.0;
  if (df_cheb2_fit (fit_fn, g, 2, lo[0], hi[0], lo[1], hi[1], 1e-12, FIT_MAX_DEGREE, &fit,
                    NULL) != DF_OK)
    return DF_OK;
  /* The fit integrates from the box's left edge. */
  g->u_ref = lo[0];
  for (size_t k = 0; k < FIT_CHECKS; k++)
    {
      const double *pt = q[(k * m) / FIT_CHECKS + (m / FIT_CHECKS) / 2];
      double ha[2];

      df_cheb2_eval_xint (fit, pt[0], pt[1], ha);
      for (int c = 0; c < 2; c++)
        {
          double direct, err;

          if ((st = inner_direct (g, pt[0], pt[1], c, &direct, &err, diag)) != DF_OK)
            {
              df_cheb2_free (fit);
              return st;
            }
          disc[c] = fmax (disc[c], fabs (ha[c] - direct));
        }
    }
  /* A disagreement of disc in H moves the loop integral by at most disc x int |dv|. */
  if (disc[0] * total_dv <= tol[0] && disc[1] * total_dv <= tol[1])
    g->fit = fit;
  else
    {
      df_cheb2_free (fit);
      g->u_ref = mid_ref;
      disc[0] = disc[1] = 0.0;
    }
  g->inner_err[0] = g->inner_err[1] = 0.0;
  return DF_OK;
}

df_status
df_green_graph (const df_curve *curve, double tol, df_green_result *out, df_diag *diag)
{
  const df_surface *s = df_curve_get_surface (curve);
  double lo[2] = { INFINITY, INFINITY }, hi[2] = { -INFINITY, -INFINITY };
  double u_min, u_max, v_min, v_max, total_dv = 0.0, epsabs[2], disc[2] = { 0, 0 };
  double (*q)[2] = NULL;
  size_t m = df_curve_sample_plane (curve, 4096, &q);
  graph_ctx g = { 0 };
  df_green_line_result lr;
  df_status st;

  memset (out, 0, sizeof *out);
  df_diag_clear (diag);
  if (m == 0)
    return DF_E_NOMEM;
  for (size_t i = 0; i < m; i++)
    {
      for (int k = 0; k < 2; k++)
        {
          lo[k] = fmin (lo[k], q[i][k]);
          hi[k] = fmax (hi[k], q[i][k]);
        }
      total_dv += fabs (q[(i + 1) % m][1] - q[i][1]);
    }
  /* A margin for the curve between the sample points, kept inside the domain. */
  df_surface_get_domain (s, &u_min, &u_max, &v_min, &v_max);
  for (int k = 0; k < 2; k++)
    {
      double pad = 0.01 * (hi[k] - lo[k]) + 1e-9 * (fabs (lo[k]) + fabs (hi[k]) + 1e-300);

      lo[k] -= pad;
      hi[k] += pad;
    }
  lo[0] = fmax (u_min, lo[0]);
  hi[0] = fmin (u_max, hi[0]);
  lo[1] = fmax (v_min, lo[1]);
  hi[1] = fmin (v_max, hi[1]);
  total_dv = fmax (total_dv, 1e-9 * (hi[1] - lo[1]));
  /* The curvature to tol in radians; the area, a figure of the loop rather than the check
   * itself, to DF_GREEN_AREA_REL of the box. */
  epsabs[0] = tol;
  epsabs[1] = DF_GREEN_AREA_REL * (hi[0] - lo[0]) * (hi[1] - lo[1]);

  g.surface = s;
  /* Direct inner integrals from the box's middle are half as long on average. */
  g.u_ref = 0.5 * (lo[0] + hi[0]);
  g.ws = gsl_integration_workspace_alloc (INNER_LIMIT);
  g.cq = gsl_integration_cquad_workspace_alloc (200);
  if (g.ws == NULL || g.cq == NULL)
    {
      free (q);
      gsl_integration_workspace_free (g.ws);
      if (g.cq)
        gsl_integration_cquad_workspace_free (g.cq);
      return DF_E_NOMEM;
    }
  /* The inner integrals' errors add up to at most their size times int |dv|: a quarter of
   * the budget for them, the rest for the line quadrature. */
  for (int c = 0; c < 2; c++)
    g.inner_epsabs[c] = 0.25 * epsabs[c] / total_dv;
  if (hi[0] > lo[0] && hi[1] > lo[1])
    st = try_fit (&g, lo, hi, (const double (*)[2]) q, m, total_dv, epsabs, disc, diag);
  else
    st = DF_OK;
  free (q);
  if (st == DF_OK)
    st = df_green_line_integral (curve, graph_line_fn, &g,
                                 (double[2]) { 0.75 * epsabs[0], 0.75 * epsabs[1] },
                                 (double[2]) { tol, DF_GREEN_AREA_REL },
                                 g.fit ? DF_GREEN_MAX_EVALS : DIRECT_MAX_EVALS, &lr, diag);
  if (st == DF_OK)
    {
      out->curvature = lr.value[0];
      out->area = lr.value[1];
      /* Line quadrature's estimate plus what the inner integrals may have contributed. */
      out->curvature_error = lr.error[0] + fmax (g.inner_err[0], disc[0]) * total_dv;
      out->area_error = lr.error[1] + fmax (g.inner_err[1], disc[1]) * total_dv;
      out->used_fit = g.fit != NULL;
      out->fit_degree = g.fit ? df_cheb2_degree (g.fit) : 0;
    }
  out->surface_evals = g.evals;
  out->line_evals = st == DF_OK ? lr.evals : 0;
  df_cheb2_free (g.fit);
  gsl_integration_workspace_free (g.ws);
  gsl_integration_cquad_workspace_free (g.cq);
  return st;
}
