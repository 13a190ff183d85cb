/* df-drape-job.h: one woven-ply drape (the core's df_drape_new) on a GTask thread under the
 * crash guard, with what the app draws of it made there too: the threads as line vertices for
 * the view coloured by shear, the crosses on the cells past the locking angle, and the worst
 * flagged cell. The core call cannot be interrupted, so a caller superseding a job (a drag)
 * keeps at most one running and starts the newest request when it lands (df-drape-window.c). */
#pragma once

#include <gio/gio.h>

#include "df-drape.h"

G_BEGIN_DECLS

typedef struct
{
  df_drape *drape;
  /* The net for df_surface_view_set_net: pairs of vertices, 8 floats each (position, rgba,
   * width in px). */
  float    *net;
  gsize     n_net;          /* vertices */
  double    range_deg;      /* colour scale: +- this many degrees of shear */
  /* The cell past the locking angle sheared most: its lower corner and chart centre. */
  gboolean  has_worst;
  int       worst_i, worst_j;
  double    worst_shear_rad, worst_u, worst_v;
  double    elapsed_ms;     /* on the worker: the drape and the vertices */
  double    drape_ms;       /* of which the core's df_drape_new */
} DfDrapeResult;

void           df_drape_result_free (DfDrapeResult *result);
G_DEFINE_AUTOPTR_CLEANUP_FUNC (DfDrapeResult, df_drape_result_free)

/* Drapes over the loop through the chart points uv (a closed spline sampled as the CLI does:
 * the same polygon, so the same numbers) from (u, v). surface and uv are copied. Fails with a
 * message when the loop comes near a pole or winds round the surface, or the core refuses. */
void           df_drape_job_start   (const df_surface       *surface,
                                     const double          (*uv)[2],
                                     gsize                   n,
                                     double                  u,
                                     double                  v,
                                     const df_drape_options *options,
                                     GCancellable           *cancellable,
                                     GAsyncReadyCallback     callback,
                                     gpointer                user_data);
DfDrapeResult *df_drape_job_finish  (GAsyncResult *result,
                                     GError      **error);

G_END_DECLS
