/* df-loop-csv.h: CSV readers and writers for loops and measurements (RFC 4180, header row),
 * shared by the CLI and the app. Reader layer: GLib allowed.
 *
 * Loop file: header `x,y,z` (space points, each projected to the nearest surface point) or
 * `u,v` (chart coordinates), then one point per row. Blank lines and lines starting with '#'
 * are skipped. Messages name the file and line: "loop.csv:14: expected 2 numbers, found 3". */
#pragma once

#include <glib.h>

#include "df-geodesic.h"
#include "df-loop.h"
#include "df-surface.h"

/* The most points a loop or path file may have (a 10^6-point scan fits); more is refused
 * naming the line. */
#define DF_LOOP_MAX_POINTS 2000000

/* Reads a loop or path file into chart points (g_free *uv_out). Space points are projected;
 * one farther than 1e-3 x surface size from the surface is an error naming its line. */
gboolean df_loop_csv_read        (const char       *path,
                                  const df_surface *surface,
                                  double          (**uv_out)[2],
                                  gsize            *n_out,
                                  GError          **error);
/* Same from text in memory; source names it in messages. */
gboolean df_loop_csv_parse       (const char       *text,
                                  const char       *source,
                                  const df_surface *surface,
                                  double          (**uv_out)[2],
                                  gsize            *n_out,
                                  GError          **error);

/* Writes a loop's chart points as `u,v` CSV (atomic). */
gboolean df_loop_csv_write_points (const char *path, const double (*uv)[2], gsize n,
                                   GError **error);

/* Per-sample CSV of a measured loop: s,u,v,x,y,z,vx,vy,vz,angle_deg,k_g,K (atomic). */
char    *df_loop_samples_to_csv  (const df_loop_result *result);
gboolean df_loop_samples_write   (const char *path, const df_loop_result *result,
                                  GError **error);

/* One row per loop: name,holonomy_deg,holonomy_rad,enclosed_curvature_rad,
 * gauss_bonnet_residual_rad,total_geodesic_curvature_rad,area,length,min_steering_radius,
 * bounds_disc,units. Values that do not exist are empty fields. */
char    *df_loop_summary_to_csv  (const char *const *names, const df_loop_result *const *results,
                                  gsize n, const char *units);
gboolean df_loop_summary_write   (const char *path, const char *const *names,
                                  const df_loop_result *const *results, gsize n,
                                  const char *units, GError **error);

/* Geodesic samples: s,u,v,x,y,z,tx,ty,tz (atomic). */
gboolean df_geodesic_samples_write (const char *path, const df_geodesic_result *result,
                                    GError **error);
