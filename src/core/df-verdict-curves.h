/* df-verdict-curves.h: verdicts for the open curves of a project: path routes ([paths N]) and
 * geodesics ([geodesic N]), beside the loops' (df_verdicts_measure). What each limit means:
 *   - steering radius 1/|k_g| against min-steering-radius (tow compression w/(2R) beside it)
 *     and |k_g / k_n| against friction, as for loops; a geodesic has k_g = 0 by construction,
 *     so its two verdicts are exact (df_verdict.exact): unbounded radius, ratio 0;
 *   - fibre deviation: for a loop and a path, the angle between the curve's tangent and a
 *     fibre that starts along it and is carried parallel (the path started parallel-carried):
 *     how far the curve turns away from fibres laid straight from its start. For a geodesic
 *     that angle is zero by definition (it is the fibre), so the "intended" direction is the
 *     start heading held against the chart's u lines (X_u: the meridian on a surface of
 *     revolution, the x direction on a graph), the layup's reference direction, as the drape's
 *     warp deviation (df-drape.h) is; on a surface of revolution this is the drift of the
 *     winding angle that Clairaut's relation r sin(psi) = const gives. Where X_u has no
 *     direction (a pole) the last value is held.
 * The decision layer; plain C + libm + GSL; no GLib. */
#pragma once

#include "df-geodesic.h"
#include "df-verdict.h"

/* An open curve: carries its start tangent along it (n_samples >= 8 samples, evenly in its
 * parameter), checks the three curve limits; *length gets its arc length (may be NULL). */
df_status df_verdicts_path     (const df_curve        *curve,
                                size_t                 n_samples,
                                const df_limits       *limits,
                                df_verdict_list       *out,
                                double                *length,
                                df_diag               *diag);

/* A shot geodesic (>= 8 samples), started at heading_rad from X_u. */
df_status df_verdicts_geodesic (const df_surface         *surface,
                                const df_geodesic_result *geodesic,
                                double                    heading_rad,
                                const df_limits          *limits,
                                df_verdict_list          *out,
                                df_diag                  *diag);
