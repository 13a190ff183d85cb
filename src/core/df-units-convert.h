/* df-units-convert.h: a measured result expressed in other length units (df-units.h) for
 * display and export: lengths and space points scale by the unit ratio f, areas by f^2,
 * geodesic curvature k_g by 1/f, Gaussian curvature K by 1/f^2 (curvature follows the length
 * unit here: K in 1/m^2 when lengths are in m). Angles (holonomy, enclosed curvature) and chart
 * coordinates (u, v: the chart's own parameters, read and written as the surface defines them)
 * are left as they are. Plain C; no GLib. */
#pragma once

#include "df-geodesic.h"
#include "df-geometry.h"
#include "df-loop.h"
#include "df-units.h"

/* In place; from == to changes nothing (bit for bit). */
void df_loop_result_convert (df_loop_result *r, df_unit from, df_unit to);
/* A probe's point and curvatures (K per square unit, H, k1, k2 per unit); the metric,
 * Christoffel symbols and Riemann tensor stay in the chart's own coordinates. */
void df_point_geometry_convert (df_point_geometry *g, df_unit from, df_unit to);
/* A geodesic's length, its samples' s and points. */
void df_geodesic_result_convert (df_geodesic_result *r, df_unit from, df_unit to);
