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
#include <pthread.h>
#include <stdbool.h>
#include <stdint.h>
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
/* Most polynomial pieces of a spline surface across the loop's box, per direction, for which
 * the fast path is tried: a global series of degree FIT_MAX_DEGREE follows a smooth spline
 * over a few dozen pieces, but over more the fit's n^2 evaluations were spent only to fail
 * (a fitted 1000 x 1000 height grid: 27 000 evaluations, an eighth of a loop's time). */
#define FIT_MAX_PIECES 48
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

/* One worker's share of the line integral: its start panels [first, last) of bounds, its
 * own integrand context and stack. Phase 1 applies the rule to each start panel; phase 2
 * bisects them against goal[]. */
typedef struct
{
  line_ctx              lc;
  const double         *bounds;
  size_t                first, last;
  double                goal[2];
  size_t                max_evals;
  panel                *stack;
  size_t                n_stack, cap;
  double                total[2];
  df_green_line_result  res;
  df_diag               diag;
  df_status             st;
} line_worker;

static void
worker_start (line_worker *w)
{
  w->n_stack = 0;
  w->total[0] = w->total[1] = 0.0;
  w->res.reached[0] = w->res.reached[1] = true;
  for (size_t i = w->first; i < w->last; i++)
    {
      panel *pn = &w->stack[w->n_stack++];

      pn->a = w->bounds[i];
      pn->b = w->bounds[i + 1];
      if ((w->st = line_rule (&w->lc, pn->a, pn->b, pn->whole, NULL)) != DF_OK)
        return;
      w->total[0] += pn->whole[0];
      w->total[1] += pn->whole[1];
    }
}

/* Bisection, depth first: a panel is accepted when its two halves agree with the whole, and
 * the halves' sum is kept. The difference estimates the whole's error, so it bounds the
 * halves' error generously: an honest figure for the result. */
static void
worker_bisect (line_worker *w)
{
  const double *goal = w->goal;

  while (w->n_stack > 0 && w->st == DF_OK)
    {
      panel pn = w->stack[--w->n_stack];
      double mid = 0.5 * (pn.a + pn.b), left[2], right[2], diff[2], noise[2] = { 0.0, 0.0 };
      bool ok = true, at_limit;

      if ((w->st = line_rule (&w->lc, pn.a, mid, left, noise)) != DF_OK
          || (w->st = line_rule (&w->lc, mid, pn.b, right, noise)) != DF_OK)
        return;
      /* Where the integrand itself is only known to some error (inner integrals stopped by
       * rounding at a kink), halves and whole cannot agree better than that: twice it is
       * allowed on top, and it is in the caller's error figure already. */
      for (int c = 0; c < 2; c++)
        {
          diff[c] = fabs (left[c] + right[c] - pn.whole[c]);
          ok = ok && diff[c] <= goal[c] * (pn.b - pn.a) + 2 * noise[c];
        }
      at_limit = w->lc.evals >= w->max_evals || !(mid > pn.a && mid < pn.b);
      if (ok || at_limit)
        {
          for (int c = 0; c < 2; c++)
            {
              w->res.value[c] += left[c] + right[c];
              w->res.error[c] += diff[c];
              if (!ok && diff[c] > goal[c] * (pn.b - pn.a) + 2 * noise[c])
                w->res.reached[c] = false;
            }
          continue;
        }
      if (w->n_stack + 2 > w->cap)
        {
          panel *grown = realloc (w->stack, 2 * w->cap * sizeof *w->stack);

          if (grown == NULL)
            {
              w->st = DF_E_NOMEM;
              return;
            }
          w->stack = grown;
          w->cap *= 2;
        }
      w->stack[w->n_stack++] = (panel) { mid, pn.b, { right[0], right[1] } };
      w->stack[w->n_stack++] = (panel) { pn.a, mid, { left[0], left[1] } };
    }
}

static void *
worker_start_main (void *data)
{
  worker_start (data);
  return NULL;
}

static void *
worker_bisect_main (void *data)
{
  worker_bisect (data);
  return NULL;
}

/* Runs phase on every worker: the first on this thread, the others on their own threads
 * (run here too when a thread cannot be started). Each worker writes only its own struct. */
static void
run_workers (line_worker *w, size_t n, void *(*phase) (void *))
{
  pthread_t tid[DF_GREEN_MAX_THREADS];
  bool started[DF_GREEN_MAX_THREADS] = { false };

  for (size_t k = 1; k < n; k++)
    started[k] = pthread_create (&tid[k], NULL, phase, &w[k]) == 0;
  phase (&w[0]);
  for (size_t k = 1; k < n; k++)
    {
      if (started[k])
        pthread_join (tid[k], NULL);
      else
        phase (&w[k]);
    }
}

df_status
df_green_line_integral_shared (const df_curve *curve, df_green_line_fn fn, void *const *users,
                               size_t n_users, const double *epsabs, const double *epsrel,
                               size_t max_evals, df_green_line_result *out, df_diag *diag)
{
  double tau0, tau1, *bounds = NULL, total[2] = { 0.0, 0.0 }, goal[2];
  size_t n_bounds, n_panels, n = n_users < 1 ? 1 : n_users;
  gsl_integration_glfixed_table *gl = gsl_integration_glfixed_table_alloc (LINE_GL);
  line_worker w[DF_GREEN_MAX_THREADS];
  df_status st = DF_OK;

  memset (out, 0, sizeof *out);
  memset (w, 0, sizeof w);
  df_diag_clear (diag);
  if (n > DF_GREEN_MAX_THREADS)
    n = DF_GREEN_MAX_THREADS;
  df_curve_get_range (curve, &tau0, &tau1);
  n_bounds = start_panels (curve, &bounds);
  n_panels = n_bounds > 0 ? n_bounds - 1 : 0;
  if (n > n_panels)
    n = n_panels > 0 ? n_panels : 1;
  /* Consecutive start panels per worker; the partition depends only on n, and the workers'
   * sums are added in worker order, so a result does not depend on which thread ran what. */
  for (size_t k = 0; k < n; k++)
    {
      w[k].lc = (line_ctx) { curve, fn, users[k], gl, 0, &w[k].diag };
      w[k].bounds = bounds;
      w[k].first = n_panels * k / n;
      w[k].last = n_panels * (k + 1) / n;
      w[k].max_evals = max_evals / n;
      w[k].cap = (w[k].last - w[k].first) + 64;
      w[k].stack = malloc (w[k].cap * sizeof *w[k].stack);
      if (w[k].stack == NULL)
        st = DF_E_NOMEM;
    }
  if (gl == NULL || n_bounds == 0 || st != DF_OK)
    {
      st = DF_E_NOMEM;
      goto out;
    }
  run_workers (w, n, worker_start_main);
  for (size_t k = 0; k < n && st == DF_OK; k++)
    if ((st = w[k].st) != DF_OK)
      *diag = w[k].diag;
  if (st != DF_OK)
    goto out;
  for (size_t k = 0; k < n; k++)
    for (int c = 0; c < 2; c++)
      total[c] += w[k].total[c];
  /* Each panel's share of the tolerance is its share of the parameter range. */
  for (int c = 0; c < 2; c++)
    goal[c] = fmax (epsabs[c], epsrel[c] * fabs (total[c])) / (tau1 - tau0);
  for (size_t k = 0; k < n; k++)
    memcpy (w[k].goal, goal, sizeof goal);
  run_workers (w, n, worker_bisect_main);
  out->reached[0] = out->reached[1] = true;
  for (size_t k = 0; k < n; k++)
    {
      if (st == DF_OK && (st = w[k].st) != DF_OK)
        *diag = w[k].diag;
      for (int c = 0; c < 2; c++)
        {
          out->value[c] += w[k].res.value[c];
          out->error[c] += w[k].res.error[c];
          out->reached[c] = out->reached[c] && w[k].res.reached[c];
        }
      out->evals += w[k].lc.evals;
    }
out:
  for (size_t k = 0; k < n; k++)
    free (w[k].stack);
  free (bounds);
  if (gl)
    gsl_integration_glfixed_table_free (gl);
  return st;
}

df_status
df_green_line_integral (const df_curve *curve, df_green_line_fn fn, void *user,
                        const double *epsabs, const double *epsrel, size_t max_evals,
                        df_green_line_result *out, df_diag *diag)
{
  void *users[1] = { user };

  return df_green_line_integral_shared (curve, fn, users, 1, epsabs, epsrel, max_evals, out,
                                        diag);
}

/* --- graphs: the inner integrals ------------------------------------------------------------ */

/* Slots of the per-line memo (a power of two). The curvature and area passes at one line point
 * run QAG on the same interval; their first rule and first bisections fall on the same nodes,
 * and one K sqrt(g) evaluation gives both integrands, so the area pass reads most of its
 * values back (on a fitted 1000 x 1000 height grid this halves the surface evaluations). */
#define MEMO_SLOTS 1024

typedef struct
{
  double   u, ksg, sg;
  unsigned line;     /* the line it belongs to: valid when it is graph_ctx.line */
} memo_slot;

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
  memo_slot        *memo;           /* values along the line at v, or NULL */
  unsigned          line;           /* numbers the lines, from 1 */
} graph_ctx;

static memo_slot *
memo_find (graph_ctx *g, double u)
{
  uint64_t bits;
  size_t k;

  memcpy (&bits, &u, sizeof bits);
  bits ^= bits >> 29;
  bits *= 0xbf58476d1ce4e5b9ULL;
  bits ^= bits >> 32;
  k = (size_t) bits & (MEMO_SLOTS - 1);
  /* Linear probing over a few slots; a full neighbourhood is overwritten (a memo, not a
   * record: a lost value is only evaluated again). */
  for (int probe = 0; probe < 8; probe++)
    {
      memo_slot *m = &g->memo[(k + (size_t) probe) & (MEMO_SLOTS - 1)];

      if (m->line != g->line || m->u == u)
        return m;
    }
  return &g->memo[k];
}

static double
inner_integrand (double u, void *data)
{
  graph_ctx *g = data;
  double ksg = 0.0, sg = 0.0;
  df_status st;

  memo_slot *m = NULL;

  if (g->fail != DF_OK)
    return 0.0;
  if (g->memo != NULL)
    {
      m = memo_find (g, u);
      if (m->line == g->line && m->u == u)
        return g->comp == 0 ? m->ksg : m->sg;
    }
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
  if (m != NULL)
    *m = (memo_slot) { u, ksg, sg, g->line };
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
  /* A new line: the memo holds another line's values. */
  if (g->memo != NULL && (v != g->v || comp == 0) && ++g->line == 0)
    {
      memset (g->memo, 0, MEMO_SLOTS * sizeof *g->memo);
      g->line = 1;
    }
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

/* Is the loop's box spanned by few enough pieces of the surface's defining function for the
 * fast path (always, for an analytic one)? */
static bool
few_pieces (const df_surface *s, const double lo[2], const double hi[2])
{
  const df_fn *fn = df_surface_get_fn (s);

  for (int k = 0; fn != NULL && k < 2; k++)
    {
      double w = df_fn_piece_width (fn, k);

      if (w > 0 && (hi[k] - lo[k]) / w > FIT_MAX_PIECES)
        return false;
    }
  return true;
}

df_status
df_green_graph (const df_curve *curve, double tol, int threads, df_green_result *out,
                df_diag *diag)
{
  graph_ctx extra[DF_GREEN_MAX_THREADS];
  void *ctxs[DF_GREEN_MAX_THREADS];
  size_t n_ctx = 1, n_made = 1;
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
  g.memo = calloc (MEMO_SLOTS, sizeof *g.memo);
  if (g.ws == NULL || g.cq == NULL || g.memo == NULL)
    {
      free (q);
      free (g.memo);
      gsl_integration_workspace_free (g.ws);
      if (g.cq)
        gsl_integration_cquad_workspace_free (g.cq);
      return DF_E_NOMEM;
    }
  /* The inner integrals' errors add up to at most their size times int |dv|: a quarter of
   * the budget for them, the rest for the line quadrature. */
  for (int c = 0; c < 2; c++)
    g.inner_epsabs[c] = 0.25 * epsabs[c] / total_dv;
  if (hi[0] > lo[0] && hi[1] > lo[1] && few_pieces (s, lo, hi))
    st = try_fit (&g, lo, hi, (const double (*)[2]) q, m, total_dv, epsabs, disc, diag);
  else
    st = DF_OK;
  free (q);
  /* The direct route costs some hundred surface evaluations a line point: its panels are
   * shared among the threads asked for, each with its own workspaces and memo. The fast path
   * is too cheap a point to be worth a thread. */
  if (threads > DF_GREEN_MAX_THREADS)
    threads = DF_GREEN_MAX_THREADS;
  n_ctx = st == DF_OK && g.fit == NULL && threads > 1 ? (size_t) threads : 1;
  ctxs[0] = &g;
  for (size_t k = 1; k < n_ctx && st == DF_OK; k++)
    {
      extra[k] = g;
      extra[k].ws = gsl_integration_workspace_alloc (INNER_LIMIT);
      extra[k].cq = gsl_integration_cquad_workspace_alloc (200);
      extra[k].memo = calloc (MEMO_SLOTS, sizeof *extra[k].memo);
      extra[k].evals = 0;
      extra[k].line = 0;
      ctxs[k] = &extra[k];
      if (extra[k].ws == NULL || extra[k].cq == NULL || extra[k].memo == NULL)
        st = DF_E_NOMEM;
      n_made = k + 1;
    }
  if (st == DF_OK)
    st = df_green_line_integral_shared (curve, graph_line_fn, ctxs, n_ctx,
                                        (double[2]) { 0.75 * epsabs[0], 0.75 * epsabs[1] },
                                        (double[2]) { tol, DF_GREEN_AREA_REL },
                                        g.fit ? DF_GREEN_MAX_EVALS : DIRECT_MAX_EVALS, &lr, diag);
  for (size_t k = 1; k < n_made; k++)
    {
      g.evals += extra[k].evals;
      for (int c = 0; c < 2; c++)
        g.inner_err[c] = fmax (g.inner_err[c], extra[k].inner_err[c]);
      free (extra[k].memo);
      if (extra[k].ws)
        gsl_integration_workspace_free (extra[k].ws);
      if (extra[k].cq)
        gsl_integration_cquad_workspace_free (extra[k].cq);
    }
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
  free (g.memo);
  gsl_integration_workspace_free (g.ws);
  gsl_integration_cquad_workspace_free (g.cq);
  return st;
}
