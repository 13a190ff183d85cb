/* df-cheb2.h: two-dimensional Chebyshev fits on a rectangle, integrated once in x: the fast
 * inner integral H(x, y) = int_{x_a}^{x} f(x', y) dx' of Green's theorem over a graph, which
 * otherwise costs a quadrature per point of the loop.
 * Plain C + libm; no GLib. */
#pragma once

#include "df-status.h"

typedef struct df_cheb2 df_cheb2;

/* Fills values[0 .. n_f-1] at (x, y); returns DF_OK or a failure. */
typedef df_status (*df_cheb2_fn) (double x, double y, double *values, void *user);

/* Fits n_f functions on [xa, xb] x [ya, yb] with degrees 16, 24, 36, ... up to max_degree
 * (at most 256; outside 16 .. 256 means 256) until every function's trailing coefficients
 * fall below rel_tol x its largest; DF_E_NOCONVERGE when that is not enough (the caller then
 * integrates directly). */
df_status df_cheb2_fit  (df_cheb2_fn  fn,
                         void        *user,
                         int          n_f,
                         double       xa,
                         double       xb,
                         double       ya,
                         double       yb,
                         double       rel_tol,
                         int          max_degree,
                         df_cheb2   **out,
                         df_diag     *diag);

/* values[k] = int_{xa}^{x} f_k(x', y) dx' for (x, y) in the rectangle (clamped to it). */
void      df_cheb2_eval_xint (const df_cheb2 *fit, double x, double y, double *values);
/* The same for function f alone. */
double    df_cheb2_eval_xint_one (const df_cheb2 *fit, int f, double x, double y);

int       df_cheb2_degree (const df_cheb2 *fit);
void      df_cheb2_free   (df_cheb2 *fit);   /* NULL is a no-op */
