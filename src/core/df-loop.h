/* df-loop.h: measurement of a closed loop on a surface: holonomy by parallel transport, the
 * enclosed total curvature computed independently by Green's theorem (GEOMETRY.md), the
 * Gauss-Bonnet residual, total geodesic curvature, area, length and minimum steering radius,
 * with the transported frame at evenly spaced samples. Also the comparison of two paths with
 * common ends.
 * Plain C + libm + GSL; no GLib. */
#pragma once

#include <stdbool.h>
#include <stddef.h>

#include "df-curve.h"
#include "df-transport.h"

typedef struct
{
  double s;             /* arc length from the start */
  double tau;           /* the curve's parameter there (df_curve_eval) */
  double u, v;          /* chart point (v meaningless where at_pole) */
  bool   at_pole;
  double point[3];
  double normal[3];
  double vector[3];     /* carried unit vector */
  double partner[3];    /* N x vector: the frame's second arrow */
  double angle_rad;     /* angle from the path's unit tangent T to the carried vector V about N,
                         * followed continuously from 0 at the start (it changes by -k_g ds):
                         * the fibre angle to the path a straight-laid tow would show */
  double k_g;           /* geodesic curvature of the curve, 1/length, + turning left about N */
  double K;             /* Gaussian curvature, 1/length^2 */
} df_loop_sample;

typedef struct
{
  double rel_tol;       /* transport tolerance, default 1e-11 */
  size_t n_samples;     /* samples to report (>= 8), default 200 */
  int    threads;       /* threads the enclosed curvature's quadrature may share on a graph
                         * (default 2, the machines driftframe is built for; 1 where loops
                         * are already measured in parallel) */
} df_loop_options;

void df_loop_options_init (df_loop_options *options);

typedef struct
{
  double holonomy_rad;            /* wrapped to (-pi, pi], + counter-clockwise about N */
  bool   bounds_disc;             /* the loop bounds a disc on the surface (see disc_note) */
  bool   simple;                  /* no self-intersection found */
  double enclosed_curvature_rad;  /* +/- double integral of K over the disc (see contract) */
  bool   enclosed_available;      /* where bounds_disc: the enclosed curvature and the area were
                                   * computed (false: enclosed_note says why, and they, the
                                   * residual and the other cap are 0) */
  double enclosed_error_rad;      /* the achieved error estimate of enclosed_curvature_rad */
  char   enclosed_note[240];      /* why it is missing, or less accurate than aimed at; or "" */
  double concentrated_rad;        /* cone-apex curvature included in it */
  double area;                    /* of the disc, positive */
  double residual_rad;            /* holonomy - enclosed, wrapped to (-pi, pi] */
  /* The enclosed curvature per unit area of the disc, Omega / area (1/length^2): the disc's
   * mean Gaussian curvature (a cone apex inside counts with its concentrated part). Set with
   * enclosed_available and area > 0; else 0 and has_mean_K false. */
  bool   has_mean_K;
  double mean_K;
  bool   disc_on_left;            /* the disc lies left of the direction of travel */
  /* A simple loop on a closed surface of revolution (a pole at each end) bounds a disc
   * on each side. The second one, signed by the same rule (negative on the right): its value
   * is enclosed -/+ 4 pi, since a closed surface of this kind carries 4 pi in all
   * (Gauss-Bonnet, Euler characteristic 2). */
  bool   has_other_disc;
  double other_enclosed_curvature_rad;
  double other_area;
  double total_geodesic_curvature_rad;  /* closed integral of k_g ds over the smooth pieces */
  double corner_turning_rad;      /* sum of turning angles at corners (exact curves only) */
  double length;
  double max_abs_kg;              /* at the transport's evaluation points and the samples */
  bool   has_steering_radius;     /* false for k_g == 0 everywhere (a geodesic loop) */
  double min_steering_radius;     /* 1 / max |k_g| */
  int    axis_winding;            /* turns around a revolution surface's axis */
  char   disc_note[200];          /* why there is no disc, or which cap is meant */
  size_t rhs_evals;
  double norm_drift;
  size_t n_samples;
  df_loop_sample *samples;        /* owned */
} df_loop_result;

/* Measures a closed curve. Fails with DF_E_INPUT for an open curve. */
df_status df_loop_measure     (const df_curve        *curve,
                               const df_loop_options *options,
                               df_loop_result        *out,
                               df_diag               *diag);

void      df_loop_result_clear (df_loop_result *result);

/* Path dependence: carries the same start vector (in space, projected to the tangent plane;
 * NULL = path A's unit tangent) along two open curves with common ends and returns the rotation from the vector
 * carried along A to the one carried along B at the end, about N, in (-pi, pi].
 * DF_E_INPUT when the ends differ by more than 1e-6 x surface size. */
df_status df_compare_paths    (const df_curve             *path_a,
                               const df_curve             *path_b,
                               const double               *v0,
                               const df_transport_options *options,
                               double                     *angle_rad,
                               df_transport_result        *result_a,   /* optional */
                               df_transport_result        *result_b,   /* optional */
                               df_diag                    *diag);

/* Wraps an angle to (-pi, pi]. */
double    df_wrap_angle       (double angle);
