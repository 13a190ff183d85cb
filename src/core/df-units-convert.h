/* df-units-convert.h: a measured result expressed in other length units (df-units.h) for
 * display and export: lengths and space points scale by the unit ratio f, areas by f^2,
 * geodesic curvature k_g by 1/f, Gaussian curvature K by 1/f^2. The plain functions convert
 * everything to one unit (K in 1/m^2 when lengths are in m); the _display ones take the user's
 * df_display_units, where the surface's curvatures (K per square of the curvature unit; a
 * probe's H, k1, k2 per curvature unit, so that K = k1 k2 still holds in the figures shown)
 * may be in another unit than the lengths; a curve's k_g stays per length unit, beside the
 * steering radius it is the inverse of. Angles (holonomy, enclosed curvature) and chart
 * coordinates (u, v: the chart's own parameters, read and written as the surface defines them)
 * are left as they are. Plain C; no GLib. */
#pragma once

#include "df-geodesic.h"
#include "df-geometry.h"
#include "df-loop.h"
#include "df-units.h"

/* In place; from == to changes nothing (bit for bit). */
void df_loop_result_convert (df_loop_result *r, df_unit from, df_unit to);
/* From du->model to du's length and curvature units (samples' K, mean_K per curvature^2). */
void df_loop_result_convert_display (df_loop_result *r, const df_display_units *du);
/* A probe's point and curvatures (K per square unit, H, k1, k2 per unit); the metric,
 * Christoffel symbols and Riemann tensor stay in the chart's own coordinates. */
void df_point_geometry_convert (df_point_geometry *g, df_unit from, df_unit to);
/* The point to du->length; K per du->curvature squared, H, k1, k2 per du->curvature. */
void df_point_geometry_convert_display (df_point_geometry *g, const df_display_units *du);
/* A geodesic's length, its samples' s and points. */
void df_geodesic_result_convert (df_geodesic_result *r, df_unit from, df_unit to);

/* "1/m^2": how a Gaussian curvature in du's curvature unit is labelled in text and JSON
 * (JSON `curvature_units`). A static string. */
const char *df_display_units_gaussian_label (const df_display_units *du);
/* "1/m": the label of H, k1, k2 in du's curvature unit. A static string. */
const char *df_display_units_curvature_label (const df_display_units *du);
