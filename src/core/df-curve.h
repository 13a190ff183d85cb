/* df-curve.h: a curve on a surface: a closed (periodic cubic spline) or open (not-a-knot)
 * interpolant through chart points parametrised by cumulative chord length in space, or an
 * exact curve given by a function. Near a pole of a revolution surface the curve is carried in
 * pole-centred polar coordinates p = (t - t_pole)(cos phi, sin phi), a chart that is regular
 * at a smooth pole, so loops may run through or around it.
 * Plain C + libm + GSL; no GLib. */
#pragma once

#include <stdbool.h>
#include <stddef.h>

#include "df-surface.h"

typedef struct df_curve df_curve;

/* The plane coordinates a curve is interpolated in. */
typedef enum
{
  DF_COORDS_CHART,      /* (u, v) themselves; phi unwrapped continuously */
  DF_COORDS_POLAR_MIN,  /* polar about the pole at u_min: (u - u_min)(cos v, sin v) */
  DF_COORDS_POLAR_MAX,  /* polar about the pole at u_max: (u_max - u)(cos v, sin v) */
  DF_COORDS_SPHERE      /* near both poles: a spline on the unit sphere theta = pi (t - t_min) /
                         * range; the plane coordinates handed on are the polar ones about the
                         * nearer pole (df_curve_plane_pole), and sample_plane gives (t, phi) */
} df_curve_coords;

/* A point of the curve at parameter tau. */
typedef struct
{
  double tau;
  double u, v;          /* chart point; v unwrapped for revolution surfaces */
  bool   at_pole;       /* u is a pole: v is arbitrary there */
  double p[2], dp[2], ddp[2];  /* plane coordinates of the interpolation and d/dtau, d2/dtau2 */
  double x[3], dx[3], ddx[3];  /* space point and d/dtau, d2/dtau2 */
  double normal[3];            /* unit N (its limit at a pole) */
  double dnormal[3];           /* dN/dtau */
} df_curve_point;

/* Exact curve: plane coordinates (see coords) and their first two derivatives at tau. */
typedef void (*df_curve_fn) (double tau, void *user, double p[2], double dp[2], double ddp[2]);

/* Interpolates through n chart points uv[i] = (u, v). On a revolution surface the v step
 * between consecutive points (last to first included when closed) is taken in (-pi, pi];
 * a point on the axis has no meaningful v. A closed curve whose last point lies within
 * 1e-9 x surface size of the first drops the last. Needs >= 3 distinct points closed, >= 2
 * open; consecutive duplicates are an error naming the index. Picks polar coordinates when
 * a point lies on a pole or a step passes one within a tenth of the profile range, sphere
 * coordinates when that happens at both poles. */
df_status df_curve_new_through_points (const df_surface *surface,
                                       const double    (*uv)[2],
                                       size_t            n,
                                       bool              closed,
                                       df_curve        **out,
                                       df_diag          *diag);

/* An exact curve on [tau0, tau1] (closed: the ends coincide). breaks are interior parameter
 * values where the curve has corners; the transport integrator restarts there. The function
 * and user data must outlive the curve. */
df_status df_curve_new_function       (const df_surface *surface,
                                       df_curve_coords   coords,
                                       double            tau0,
                                       double            tau1,
                                       const double     *breaks,
                                       size_t            n_breaks,
                                       bool              closed,
                                       df_curve_fn       fn,
                                       void             *user,
                                       df_curve        **out,
                                       df_diag          *diag);

void      df_curve_free        (df_curve *curve);     /* NULL is a no-op */

/* The surface the curve lies on (the curve keeps its own copy). */
const df_surface *df_curve_get_surface (const df_curve *curve);

bool      df_curve_is_closed   (const df_curve *curve);
df_curve_coords df_curve_get_coords (const df_curve *curve);
void      df_curve_get_range   (const df_curve *curve, double *tau0, double *tau1);
/* Corner parameters (sorted, interior), for integrators that must restart there. */
size_t    df_curve_get_breaks  (const df_curve *curve, const double **breaks);
/* Number of interpolation nodes and their parameters (NULL for an exact curve). */
size_t    df_curve_get_nodes   (const df_curve *curve, const double **taus);

/* Only the plane coordinates and their derivatives: cheap, no surface evaluation. */
void      df_curve_eval_plane  (const df_curve *curve, double tau, double p[2], double dp[2],
                                double ddp[2]);

/* Which pole's polar picture df_curve_eval_plane gives at tau: 0 (u_min), 1 (u_max), -1 for
 * the chart. Changes only at the curve's breaks in sphere coordinates. */
int       df_curve_plane_pole  (const df_curve *curve, double tau);
/* df_curve_eval_plane in the polar picture about the given end (sphere coordinates; otherwise
 * the same as df_curve_eval_plane). */
void      df_curve_eval_plane_about (const df_curve *curve, double tau, int end, double p[2],
                                     double dp[2], double ddp[2]);

/* At least n_min plane points along the curve in order (every interpolation node among them,
 * the segments subdivided evenly; an exact curve evenly in tau; a closed curve without its
 * repeated end), in *out (free() it). Returns the count, 0 on out-of-memory. */
size_t    df_curve_sample_plane (const df_curve *curve, size_t n_min, double (**out)[2]);

/* Evaluates at tau (clamped to the range; wrapped when closed). DF_E_DOMAIN if the point
 * leaves the surface's domain. */
df_status df_curve_eval        (const df_curve *curve, double tau, df_curve_point *out,
                                df_diag *diag);

/* Net turns of v (phi) around a revolution surface's axis along a closed curve: the winding
 * number about the axis; 0 for a graph or an open curve. */
int       df_curve_axis_winding (const df_curve *curve);
/* Net turns of u = t round a closed profile (a torus tube) along a closed curve; else 0. */
int       df_curve_tube_winding (const df_curve *curve);
