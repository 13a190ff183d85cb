/* df-green.h: the enclosed curvature and area of a loop by Green's theorem, computed
 * independently of the transport and with its own error control (GEOMETRY.md):
 * int_D K dA = closed integral of H dv, H(u, v) = int_{u_ref}^{u} K sqrt(g) du'.
 * The line integral is adaptive Gauss-Kronrod in the curve parameter, split at corners. On a
 * graph the inner integral H comes from a tensor Chebyshev fit of the loop's box where that fit
 * converged and agrees with direct quadrature at points along the loop (the fast path), and
 * otherwise from adaptive Gauss-Kronrod along each chart line, which follows narrow features
 * and the kinks of piecewise-polynomial surfaces. Neither ever fails for want of accuracy: the
 * result carries its achieved error estimate and a note when that is above the tolerance.
 * Plain C + libm + GSL; no GLib. */
#pragma once

#include <stdbool.h>
#include <stddef.h>

#include "df-curve.h"

/* The integrands of a line integral along the curve: values[0] (curvature) and values[1]
 * (area) at the curve's plane point p and its derivative dp at tau, and in errors[] (zeros on
 * entry) a bound on their own error where they come from a quadrature that fell short. */
typedef df_status (*df_green_line_fn) (double tau, const double p[2], const double dp[2],
                                       double *values, double *errors, void *user,
                                       df_diag *diag);

typedef struct
{
  double value[2];    /* the closed integrals of components 0 and 1 */
  double error[2];    /* their error estimates (halves against wholes, summed) */
  bool   reached[2];  /* the quadrature met its tolerance */
  size_t evals;       /* integrand evaluations */
} df_green_line_result;

/* A bound on the line quadrature's points for cheap integrands (a few milliseconds' worth). */
#define DF_GREEN_MAX_EVALS 400000

/* Integrates both components of fn once round the closed curve, each to
 * max(epsabs[c], epsrel |value|), by adaptive bisection of Gauss-Legendre panels that start
 * at the corners and at groups of spline knots, stopping the refinement after max_evals
 * integrand points. Returns DF_OK with the values and their error
 * estimates whether or not the tolerance was met; a failure only when the integrand failed
 * (its status and diag) or out of memory. */
df_status df_green_line_integral (const df_curve          *curve,
                                  df_green_line_fn         fn,
                                  void                    *user,
                                  const double            *epsabs,
                                  const double            *epsrel,
                                  size_t                   max_evals,
                                  df_green_line_result    *out,
                                  df_diag                 *diag);

/* Threads a line integral may share its panels among. */
#define DF_GREEN_MAX_THREADS 4

/* The same with the start panels shared among n_users workers, users[k] the integrand context
 * of worker k (each its own: the workers run at once on their own POSIX threads). The result
 * does not depend on whether the threads could be started. */
df_status df_green_line_integral_shared (const df_curve          *curve,
                                         df_green_line_fn         fn,
                                         void *const             *users,
                                         size_t                   n_users,
                                         const double            *epsabs,
                                         const double            *epsrel,
                                         size_t                   max_evals,
                                         df_green_line_result    *out,
                                         df_diag                 *diag);

typedef struct
{
  double curvature;        /* closed integral of H dv: +int K dA for a disc on the left */
  double area;             /* closed integral of A dv, A = int sqrt(g) du: signed area */
  double curvature_error;  /* achieved error estimates (line quadrature + inner integrals) */
  double area_error;
  bool   used_fit;         /* the Chebyshev fast path served the inner integrals */
  int    fit_degree;       /* its degree, or 0 */
  size_t surface_evals;    /* evaluations of K sqrt(g) and sqrt(g) */
  size_t line_evals;       /* points of the line quadrature */
} df_green_result;

/* Relative accuracy aimed at for the area. */
#define DF_GREEN_AREA_REL 1e-10

/* The enclosed curvature and signed area of a closed curve on a graph, aiming at an absolute
 * error of tol (radians) for the curvature and DF_GREEN_AREA_REL for the area. Fails only
 * when the surface cannot be evaluated inside the loop's box (the status, diag naming the
 * point) or out of memory; otherwise out holds the values with their error estimates.
 * threads (1 .. DF_GREEN_MAX_THREADS) share the direct route's line points. */
df_status df_green_graph   (const df_curve  *curve,
                            double           tol,
                            int              threads,
                            df_green_result *out,
                            df_diag         *diag);
