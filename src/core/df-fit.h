/* df-fit.h: defining functions fitted to data (df-fn.h implementations): a profile (r, z)
 * from points along it, parametrised by its own arc length, and a height map z = f(x, y) from
 * a full grid of heights. Both are penalised quintic B-splines (df-bspline.h): quintic, so
 * that the surface's fourth derivatives are continuous and with them K, its derivatives and
 * the Riemann tensor's derivatives the transport uses (∂Γ needs third derivatives of X; a
 * cubic would leave them piecewise constant and K's gradient jumping at every knot).
 * Indices in diag are 0-based data rows. Plain C + libm + GSL; no GLib. */
#pragma once

#include <stdbool.h>
#include <stddef.h>

#include "df-fn.h"

/* How good the fit is: distances from the data points to the fitted curve or surface
 * (normal distance to first order, GEOMETRY.md), in the data's units. */
typedef struct
{
  size_t points;
  double rms;
  double max;
  double max_at[3];        /* the data point farthest from the fit, (x, y, z) */
  double tolerance;        /* the RMS asked for (fit-tolerance), or the one GCV chose */
  bool   chosen;           /* tolerance chosen from the data by generalised cross-validation */
  double lambda;           /* the smoothing weight it came to (relative to the data's) */
  /* Profile only: the ends on the axis, 0 none, 1 smooth pole, 2 cone apex. */
  int    pole[2];
  /* A surface of revolution from a mesh (df-fit-mesh.h): how far the part departs from
   * rotational symmetry: each vertex's distance from the fitted profile (in the half-plane
   * through the axis and the vertex, signed outward) less the mean of that distance over the
   * angle at its place along the profile; RMS and max, and the vertex (x, y, z) with the max. */
  bool   has_symmetry;
  double symmetry_rms;
  double symmetry_max;
  double symmetry_max_at[3];
} df_fit_info;

/* Tolerance for "choose from the data" (GCV). 0 asks for the least smoothing (the spline
 * then passes through the points to rounding on smooth data). */
#define DF_FIT_TOLERANCE_AUTO (-1.0)

/* A profile through rz[n] = (r, z), in order along it; t of the result is arc length from the
 * first point. An end with r = 0 (up to 1e-6 of the largest r) is on the axis: a smooth pole
 * when the data meet the axis at a right angle (dz/ds = 0 there and r odd, z even in s to
 * fourth order), else a cone apex at the angle the data show (r = 0 only).
 * DF_E_INPUT with the row for: too few points (8), r < 0, a repeated point, a profile that
 * turns back on itself (points out of order), an interior point on the axis. */
df_status df_fit_profile  (const double (*rz)[2],
                           size_t          n,
                           double          tolerance,
                           df_fn         **out,
                           df_fit_info    *info,
                           df_diag        *diag);

/* A graph over the full lattice xyz[n] (each node once, any order; spacing may vary from
 * column to column). The tensor-product P-spline is solved direction by direction (the array
 * method of Currie, Durban & Eilers 2006, in the separable "sandwich" form whose smoother is
 * the Kronecker product of the two one-dimensional ones), so a 1000 x 1000 grid costs two
 * banded solves per direction. DF_E_INPUT for a lattice with a missing or repeated node
 * (named), fewer than 8 nodes a side, or points all on one line. Points that form no lattice
 * (more than twice as many lattice nodes as points) are fitted as scattered points
 * (df-fit-scattered.c), whose domain leaves out the knot cells without data. */
df_status df_fit_grid     (const double (*xyz)[3],
                           size_t          n,
                           double          tolerance,
                           df_fn         **out,
                           df_fit_info    *info,
                           df_diag        *diag);

/* The fit quality of a fitted function; false for a formula. */
bool      df_fit_get_info (const df_fn *fn, df_fit_info *info);
/* Replaces a fitted function's fit quality (a fit of derived points, such as a mesh's, reports
 * on the original data); false for a formula. */
bool      df_fit_set_info (df_fn *fn, const df_fit_info *info);
