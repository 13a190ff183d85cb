/* df-geometry.h: the local differential geometry of a surface at a chart point: metric,
 * Christoffel symbols and their derivatives, the Riemann tensor, second fundamental form,
 * Gaussian, mean and principal curvatures. Index conventions: ../shared/GEOMETRY.md.
 * Plain C + libm; no GLib. */
#pragma once

#include <stdbool.h>

#include "df-surface.h"

#define DF_DIM 2

typedef struct
{
  double u, v;
  double point[3];
  double normal[3];                         /* unit N = X_u x X_v / |.|; its limit at a pole */
  double xu[3], xv[3];
  double g[DF_DIM][DF_DIM];                 /* g_ij = X_i . X_j */
  double ginv[DF_DIM][DF_DIM];
  double det_g;
  double gamma[DF_DIM][DF_DIM][DF_DIM];     /* gamma[k][i][j] = Gamma^k_ij */
  double dgamma[DF_DIM][DF_DIM][DF_DIM][DF_DIM]; /* dgamma[l][k][i][j] = d_l Gamma^k_ij */
  double riemann[DF_DIM][DF_DIM][DF_DIM][DF_DIM]; /* riemann[r][s][m][n] = R^r_smn */
  double second_form[DF_DIM][DF_DIM];       /* II_ij = X_ij . N */
  double K, H;                              /* Gaussian, mean = (k1 + k2) / 2 */
  double k1, k2;                            /* principal curvatures, k1 >= k2 */
  /* At a chart singularity (a pole) chart_regular is false: g and II are the chart's own
   * (degenerate, e.g. [[1, 0], [0, 0]] for a unit-speed profile), Gamma, dGamma, Riemann and
   * g^-1 are zero and meaningless, and note says why. At a smooth pole K, H, k1, k2 are the
   * exact limits (from the profile's jets); at a cone apex curvature_defined is false and
   * concentrated_rad = 2 pi (1 - sin alpha) is the apex's curvature. */
  bool   chart_regular;
  bool   curvature_defined;
  double concentrated_rad;
  char   note[320];
} df_point_geometry;

/* Fills out at (u, v). At a pole returns DF_OK with chart_regular = false. A chart that is
 * singular (or not finite) away from a pole is DF_E_SINGULAR with the reason; this function
 * never calls itself. */
df_status df_surface_geometry (const df_surface  *surface,
                               double             u,
                               double             v,
                               df_point_geometry *out,
                               df_diag           *diag);

/* Just Gamma^k_ij (and optionally the unit normal) from a second-order evaluation: the hot
 * path of the transport ODE. DF_E_SINGULAR where det g vanishes. */
df_status df_surface_christoffel (const df_surface *surface,
                                  double            u,
                                  double            v,
                                  double            gamma[DF_DIM][DF_DIM][DF_DIM],
                                  df_diag          *diag);

/* Gamma^k_ij from a chart jet of order >= 2 (the transport's hot path evaluates the jet once and
 * uses it for the tangent too). DF_E_SINGULAR where det g vanishes. */
df_status df_chart_jet_christoffel (const df_chart_jet *jet,
                                    double              gamma[DF_DIM][DF_DIM][DF_DIM]);

/* Gaussian curvature times sqrt(det g) at (u, v): the integrand of the enclosed curvature. */
df_status df_surface_k_area   (const df_surface *surface,
                               double            u,
                               double            v,
                               double           *k_sqrt_g,
                               double           *sqrt_g,
                               df_diag          *diag);

/* X, X_i and X_ij (orders 0..2 of the jet; d3 is zero) in the pole-centred chart
 * p = rho (cos phi, sin phi), rho = |t - t_pole|, about the pole at u_min (end = 0) or u_max
 * (end = 1) of a surface of revolution: a chart regular at a smooth pole, where (t, phi) is
 * not. Any |p| up to the t range is accepted. */
df_status df_surface_polar_jet (const df_surface *surface,
                                int               end,
                                const double      p[2],
                                df_chart_jet     *out,
                                df_diag          *diag);
