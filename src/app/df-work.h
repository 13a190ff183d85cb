/* df-work.h: the app's background work: loop measurement and path comparison run on GTask
 * threads, on copies of the surface and points, with a GCancellable; the results come back to
 * the main thread. All geometry is the core's; this file only moves data between threads. */
#pragma once

#include <gio/gio.h>

#include "df-glib.h"

G_BEGIN_DECLS

/* A finished loop measurement; free with df_work_loop_result_free. */
void            df_work_loop_result_free     (df_loop_result *result);
G_DEFINE_AUTOPTR_CLEANUP_FUNC (df_loop_result, df_work_loop_result_free)

/* Measures the closed loop through uv[0..n-1] (copied). Errors are DF_IO_ERROR GEOMETRY with
 * the core's message. n_samples: frame samples to report (0: the core's default). */
void            df_work_measure_loop_async   (const df_surface   *surface,
                                              const double      (*uv)[2],
                                              gsize               n,
                                              gsize               n_samples,
                                              GCancellable       *cancellable,
                                              GAsyncReadyCallback callback,
                                              gpointer            user_data);
df_loop_result *df_work_measure_loop_finish  (GAsyncResult *result,
                                              GError      **error);

/* Two open paths with common ends, each with the transport along it. */
typedef struct
{
  double              angle_rad;   /* from the vector carried along A to the one along B */
  df_transport_result a;
  df_transport_result b;
} DfPathComparison;

void              df_work_path_comparison_free (DfPathComparison *comparison);
G_DEFINE_AUTOPTR_CLEANUP_FUNC (DfPathComparison, df_work_path_comparison_free)

void              df_work_compare_paths_async  (const df_surface   *surface,
                                                const double      (*uv_a)[2],
                                                gsize               n_a,
                                                const double      (*uv_b)[2],
                                                gsize               n_b,
                                                GCancellable       *cancellable,
                                                GAsyncReadyCallback callback,
                                                gpointer            user_data);
DfPathComparison *df_work_compare_paths_finish (GAsyncResult *result,
                                                GError      **error);

G_END_DECLS
