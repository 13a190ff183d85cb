/* df-bspline.h: uniform B-splines of degree up to 5 and the one-dimensional penalised
 * least-squares smoother (P-spline: Eilers & Marx 1996) that the fitted profiles and height
 * maps are built from.
 * Our own basis rather than gsl_bspline: a fitted surface is evaluated millions of times from
 * worker threads, and gsl_bspline needs a mutable workspace per call site; on uniform knots
 * the span is found by one division and the basis by a short recursion on the stack.
 * Plain C + libm + GSL; no GLib. */
#pragma once

#include <gsl/gsl_matrix.h>
#include <stdbool.h>
#include <stddef.h>

#include "df-status.h"

#define DF_BSPLINE_MAX_DEGREE 5

/* Uniform knots: M spans of width h over [a, a + M h]; M + degree basis functions. */
typedef struct
{
  int    degree;
  int    spans;
  double a, h;
} df_bspline;

static inline int
df_bspline_count (const df_bspline *b)
{
  return b->spans + b->degree;
}

/* The degree + 1 basis functions that do not vanish at x and their derivatives to `nder`
 * (0..3) with respect to x: vals[k][m] is the k-th derivative of basis first + m. Points
 * outside [a, a + M h] use the end span's polynomial. Returns first. */
int       df_bspline_eval_basis (const df_bspline *b,
                                 double            x,
                                 int               nder,
                                 double            vals[4][DF_BSPLINE_MAX_DEGREE + 1]);

/* A linear condition on the fitted function: the `deriv`-th derivative at x equals value,
 * for output column `col` (exact constraints, e.g. at a pole). */
typedef struct
{
  double x;
  int    deriv;
  int    col;
  double value;
} df_bspline_constraint;

/* Penalised least squares for ncol columns at once: minimises
 * |y - B c|^2 + lambda |D_q c|^2 (D_q the q-th difference matrix, q = 3) subject to the
 * constraints. x[n], y[n * ncol] (row-major), coef[count * ncol] (row-major). When trace_h is
 * non-NULL it receives tr(H), the effective number of parameters (constraints ignored), for
 * GCV. Banded Cholesky (GSL), plus a small Schur complement for the constraints. */
df_status df_bspline_smooth     (const df_bspline            *b,
                                 size_t                       n,
                                 const double                *x,
                                 const double                *y,
                                 int                          ncol,
                                 double                       lambda,
                                 const df_bspline_constraint *cons,
                                 int                          ncons,
                                 double                      *coef,
                                 double                      *trace_h,
                                 df_diag                     *diag);

/* tr(A^-1 G) for A = L L^T given as its band Cholesky factor l in GSL's layout (l(c, d) =
 * L(c + d, c)) and a symmetric band matrix g in the same layout of A's width (g(i, d) =
 * G(i, i + d)). False when out of memory or not finite. */
bool        df_band_trace_inverse_product (const gsl_matrix *l, const gsl_matrix *g,
                                           double *trace);

/* The banded normal matrix B^T B + lambda D^T D of points x[n], Cholesky-factored in GSL's
 * band layout (count x (degree + 1)), for solving many right-hand sides
 * (gsl_linalg_cholesky_band_svxm); trace_h as above when non-NULL. NULL when singular or out
 * of memory. */
gsl_matrix *df_bspline_factor   (const df_bspline *b,
                                 size_t            n,
                                 const double     *x,
                                 double            lambda,
                                 double           *trace_h);

/* Penalty scale: tr(B^T B) / tr(D^T D), so lambda = 1 weighs the data and the penalty
 * alike whatever the number of points and spans. */
double    df_bspline_lambda_scale (const df_bspline *b, size_t n, const double *x);
