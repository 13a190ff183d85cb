/* df-fair.h: fairing of a noisy closed loop (a mouse stroke, a scan): the loop's points on the
 * surface are replaced by a periodic smoothing spline in space that stays within a tolerance of
 * them, resampled and placed back on the surface, so the geodesic curvature and the steering
 * radius show the design rather than the noise.
 * Plain C + libm + GSL; no GLib. */
#pragma once

#include <stdbool.h>
#include <stddef.h>

#include "df-surface.h"

/* What a fairing did. max_deviation is the largest distance from a given point to the faired
 * loop on the surface (to the nearest point of the smoothing spline, placed on the surface). */
typedef struct
{
  double tolerance;       /* asked for, a length */
  double max_deviation;   /* achieved, a length; <= tolerance when met */
  double lambda;          /* the smoothing parameter used (dimensionless) */
  size_t n_points;        /* points of the faired loop (as many as given) */
  bool   met;             /* max_deviation <= tolerance */
} df_fair_info;

/* The method's name for outputs: "periodic cubic smoothing spline (P-spline)". */
const char *df_fair_method_name (void);

/* Fairs the closed loop through the chart points uv[0..n-1] (n >= 4) with tolerance tol > 0
 * (a length in the surface's units). Writes n faired chart points to *uv_out (malloc'd, the
 * caller frees; the first lies near uv[0]) and fills info. DF_E_INPUT for a bad tolerance, too
 * few points, a tolerance not small beside the loop, or a loop of zero length;
 * DF_E_NOCONVERGE when the faired points cannot be placed back on the surface. When even the
 * lightest smoothing deviates more than tol (the points are rougher than that at this
 * spacing), the lightest is returned with info->met false. */
df_status df_fair_closed_loop (const df_surface *surface,
                               const double    (*uv)[2],
                               size_t            n,
                               double            tol,
                               double          (**uv_out)[2],
                               df_fair_info     *info,
                               df_diag          *diag);
