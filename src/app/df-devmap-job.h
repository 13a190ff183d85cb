/* df-devmap-job.h: the developability map computed on a GTask thread, point by point so that
 * it can report its progress and be cancelled (a 24 x 24 map of the demo takes seconds). The
 * discs are the core's (df_devmap_at), on the grid df_devmap_grid documents (each line half a
 * cell inside the chart's edges), so the result is a df_devmap the core's CSV writer takes. */
#pragma once

#include <gio/gio.h>

#include "df-devmap.h"
#include "df-glib.h"

G_BEGIN_DECLS

typedef struct _DfDevmapJob DfDevmapJob;

/* Starts the map of surface (copied) for discs of radius a on an nu x nv grid. progress
 * (main thread, may be NULL) is called now and then with the fraction done. */
DfDevmapJob *df_devmap_job_start    (const df_surface   *surface,
                                     double              a,
                                     gsize               nu,
                                     gsize               nv,
                                     GCancellable       *cancellable,
                                     void              (*progress) (double fraction,
                                                                    gpointer user_data),
                                     GAsyncReadyCallback callback,
                                     gpointer            user_data);
/* The map (free with df_devmap_job_map_free), or NULL with error. */
df_devmap   *df_devmap_job_finish   (GAsyncResult *result,
                                     GError      **error);
void         df_devmap_job_map_free (df_devmap *map);
G_DEFINE_AUTOPTR_CLEANUP_FUNC (df_devmap, df_devmap_job_map_free)

G_END_DECLS
