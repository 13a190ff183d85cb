/* df-json-out.h: JSON output of measurements through json-glib's JsonBuilder (never printf),
 * shared by the CLI and the app's export. A value that is not finite is written as `null`;
 * doubles carry 17 significant digits, so they read back to the same double.
 * Reader/writer layer: GLib and json-glib allowed. */
#pragma once

#include <glib.h>
#include <json-glib/json-glib.h>

#include "df-geodesic.h"
#include "df-geometry.h"
#include "df-loop.h"

/* Member `name` (inside an open object) with a number, or null when value is not finite. */
void     df_json_add_double         (JsonBuilder *builder, const char *name, double value);
/* Same, null also when present is FALSE (a quantity that does not exist, e.g. no disc). */
void     df_json_add_double_or_null (JsonBuilder *builder, const char *name, gboolean present,
                                     double value);
/* An array element (inside an open array): number or null. */
void     df_json_add_double_value   (JsonBuilder *builder, double value);
/* Member `name` with an array of n numbers (each null when not finite). */
void     df_json_add_vector         (JsonBuilder *builder, const char *name, const double *v,
                                     gsize n);

/* Members of a loop measurement, into the open object: holonomy_deg, holonomy_rad,
 * enclosed_curvature_rad and area (null without a disc), gauss_bonnet_residual_rad (null
 * without a disc), concentrated_curvature_rad, total_geodesic_curvature_rad, length,
 * min_steering_radius (null for a geodesic loop), max_abs_geodesic_curvature, samples (count),
 * bounds_disc, disc_on_left, simple, axis_winding, note, rhs_evaluations, norm_drift. */
/* Member "fit" {points, rms, max, max_at [x, y, z], tolerance, tolerance_chosen} for a surface
 * fitted to data; nothing for a formula surface. */
void     df_json_add_fit            (JsonBuilder *builder, const df_surface *surface);
void     df_json_add_loop_result    (JsonBuilder *builder, const df_loop_result *result);
/* Members of a point's geometry: u, v, chart_regular, point, normal, metric [[g11, g12],
 * [g21, g22]], christoffel [k][i][j] = Gamma^k_ij, riemann [r][s][m][n] = R^r_smn,
 * second_fundamental_form, gaussian_curvature, mean_curvature, principal_curvatures [k1, k2],
 * concentrated_curvature_rad (a cone apex only, else null), note. At a pole the metric and II
 * are the chart's own (degenerate), christoffel and riemann are null and note says why; the
 * curvatures are limits, or null at a cone apex. */
void     df_json_add_point_geometry (JsonBuilder *builder, const df_point_geometry *geometry);
/* Members of a shot geodesic: length, stopped_early, stop_reason (null when it ran its full
 * length), end {u, v, point, tangent}, samples (count). */
void     df_json_add_geodesic       (JsonBuilder *builder, const df_geodesic_result *result);

/* The JSON text of a document (newly allocated, ends in a newline). Works around json-glib
 * 1.6, which appends ".0" to a number such as "1e+20" and so writes invalid JSON. */
char    *df_json_to_string          (JsonNode *root, gboolean pretty);
/* Writes the document atomically (df_write_file_atomic). */
gboolean df_json_write              (const char *path, JsonNode *root, GError **error);
