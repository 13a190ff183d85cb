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

/* What a written CSV says about itself: column names carry the length unit (s_mm, k_g_per_mm,
 * K_per_mm2) and the summary names the surface and the side N points to. units NULL: "mm". */
typedef struct
{
  const char     *units;        /* length unit as the project names it: "mm", "m", "in" */
  df_surface_type kind;         /* chart names: (t, phi_rad) or (u_<unit>, v_<unit>) */
  const char     *surface;      /* the surface file or preset, for the summary */
  const char     *normal_side;  /* df_surface_normal_side */
} df_csv_context;

/* Per-sample CSV of a measured loop (atomic): for units mm on a graph
 * s_mm,u_mm,v_mm,x_mm,y_mm,z_mm,vx,vy,vz,angle_deg,angle_unwrapped_deg,k_g_per_mm,K_per_mm2
 * (a surface of revolution has t,phi_rad for the chart). angle_deg is the fibre angle to the
 * path wrapped to (-180, 180]; angle_unwrapped_deg follows it continuously from 0. */
char    *df_loop_samples_to_csv  (const df_loop_result *result, const df_csv_context *context);
gboolean df_loop_samples_write   (const char *path, const df_loop_result *result,
                                  const df_csv_context *context, GError **error);

/* One row per loop: name,status,surface,normal_side,holonomy_deg,holonomy_rad,
 * enclosed_curvature_rad,gauss_bonnet_residual_rad,total_geodesic_curvature_rad,area_<u>2,
 * length_<u>,min_steering_radius_<u>,bounds_disc,note,mean_K_per_<u>2 (the disc's enclosed
 * curvature / area, last so that readers of the first fourteen columns are undisturbed). A loop whose results[i] is NULL has
 * status "not measured" and failures[i] (may be NULL) as its note; values that do not exist
 * are empty fields. */
char    *df_loop_summary_to_csv  (const char *const *names, const df_loop_result *const *results,
                                  const char *const *failures, gsize n,
                                  const df_csv_context *context);
gboolean df_loop_summary_write   (const char *path, const char *const *names,
                                  const df_loop_result *const *results,
                                  const char *const *failures, gsize n,
                                  const df_csv_context *context, GError **error);
/* The same with mean K per the square of k_units ("m"; NULL: the context's units). The caller
 * converts the figures (df_loop_result_convert_display); this only names them. */
char    *df_loop_summary_to_csv_k (const char *const *names, const df_loop_result *const *results,
                                   const char *const *failures, gsize n,
                                   const df_csv_context *context, const char *k_units);
gboolean df_loop_summary_write_k  (const char *path, const char *const *names,
                                   const df_loop_result *const *results,
                                   const char *const *failures, gsize n,
                                   const df_csv_context *context, const char *k_units,
                                   GError **error);

/* Geodesic samples: s_<u>, the chart pair, x_<u>,y_<u>,z_<u>,tx,ty,tz (atomic). */
gboolean df_geodesic_samples_write (const char *path, const df_geodesic_result *result,
                                    const df_csv_context *context, GError **error);
