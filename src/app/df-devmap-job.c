/* df-devmap-job.c: the developability map on a worker thread (see df-devmap-job.h), under the
 * crash guard of df-work-guard.h. The grid lines follow df_devmap_grid's rule; each disc is
 * the core's df_devmap_at. */
#include "df-devmap-job.h"

#include <stdlib.h>

#include "df-io-error.h"
#include "df-work-guard.h"

struct _DfDevmapJob
{
  df_surface *surface;
  double      a;
  gsize       nu, nv;
  gint        done;         /* points finished (atomic) */
  guint       timeout_id;
  GTask      *task;         /* borrowed */
  void      (*progress) (double fraction, gpointer user_data);
  gpointer    user_data;
};

void
df_devmap_job_map_free (df_devmap *map)
{
  if (map == NULL)
    return;
  df_devmap_clear (map);
  g_free (map);
}

static void
job_free (gpointer data)
{
  DfDevmapJob *job = data;

  g_clear_handle_id (&job->timeout_id, g_source_remove);
  df_surface_free (job->surface);
  g_free (job);
}

typedef struct
{
  GTask     *task;
  df_devmap *map;
  GError    *error;
} Guarded;

static void
map_guarded (gpointer user_data)
{
  Guarded *g = user_data;
  DfDevmapJob *job = g_task_get_task_data (g->task);
  GCancellable *cancellable = g_task_get_cancellable (g->task);
  df_devmap *map = g_new0 (df_devmap, 1);
  double u0, u1, v0, v1;
  df_diag diag;

  df_surface_get_domain (job->surface, &u0, &u1, &v0, &v1);
  map->nu = job->nu;
  map->nv = job->nv;
  map->a = job->a;
  /* malloc: df_devmap_clear frees with free(). */
  map->u = malloc (job->nu * sizeof *map->u);
  map->v = malloc (job->nv * sizeof *map->v);
  map->points = calloc (job->nu * job->nv, sizeof *map->points);
  if (map->u == NULL || map->v == NULL || map->points == NULL)
    {
      df_devmap_job_map_free (map);
      g->error = g_error_new (DF_IO_ERROR, DF_IO_ERROR_GEOMETRY, "Out of memory for the map");
      return;
    }
  /* df_devmap_grid's grid (df-devmap.h): each line half a cell inside the edges. */
  for (gsize i = 0; i < job->nu; i++)
    map->u[i] = u0 + (u1 - u0) * (i + 0.5) / job->nu;
  for (gsize j = 0; j < job->nv; j++)
    map->v[j] = v0 + (v1 - v0) * (j + 0.5) / job->nv;
  for (gsize j = 0; j < job->nv; j++)
    for (gsize i = 0; i < job->nu; i++)
      {
        df_devmap_point *p = &map->points[j * job->nu + i];
        df_status st;

        if (g_cancellable_is_cancelled (cancellable))
          {
            df_devmap_job_map_free (map);
            return;
          }
        df_diag_clear (&diag);
        st = df_devmap_at (job->surface, map->u[i], map->v[j], job->a, NULL, p, &diag);
        if (st != DF_OK)
          {
            df_status_to_gerror (st, &diag, &g->error);
            df_devmap_job_map_free (map);
            return;
          }
        map->n_ok += p->ok;
        g_atomic_int_inc (&job->done);
      }
  g->map = map;
}

static void
map_thread (GTask        *task,
            gpointer      source,
            gpointer      task_data,
            GCancellable *cancellable)
{
  Guarded g = { task, NULL, NULL };

  if (!df_guard_call (map_guarded, &g, "computing the developability map", &g.error))
    g.map = NULL;
  if (g.error != NULL)
    g_task_return_error (task, g.error);
  else if (g.map != NULL)
    g_task_return_pointer (task, g.map, (GDestroyNotify) df_devmap_job_map_free);
  else if (!g_task_return_error_if_cancelled (task))
    g_task_return_new_error (task, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY,
                             "The map could not be computed");
}

static gboolean
progress_cb (gpointer data)
{
  DfDevmapJob *job = data;

  if (job->progress != NULL && !g_cancellable_is_cancelled (g_task_get_cancellable (job->task)))
    job->progress ((double) g_atomic_int_get (&job->done) / (job->nu * job->nv),
                   job->user_data);
  return G_SOURCE_CONTINUE;
}

DfDevmapJob *
df_devmap_job_start (const df_surface   *surface,
                     double              a,
                     gsize               nu,
                     gsize               nv,
                     GCancellable       *cancellable,
                     void              (*progress) (double fraction, gpointer user_data),
                     GAsyncReadyCallback callback,
                     gpointer            user_data)
{
  g_autoptr(GTask) task = NULL;
  DfDevmapJob *job;

  g_return_val_if_fail (surface != NULL && a > 0 && nu >= 2 && nv >= 2, NULL);

  job = g_new0 (DfDevmapJob, 1);
  job->surface = df_surface_copy (surface);
  job->a = a;
  job->nu = nu;
  job->nv = nv;
  job->progress = progress;
  job->user_data = user_data;
  task = g_task_new (NULL, cancellable, callback, user_data);
  job->task = task;
  g_task_set_source_tag (task, df_devmap_job_start);
  g_task_set_task_data (task, job, job_free);
  /* The source goes with the task data, so it never outlives the job. */
  job->timeout_id = g_timeout_add (250, progress_cb, job);
  g_task_run_in_thread (task, map_thread);
  return job;
}

df_devmap *
df_devmap_job_finish (GAsyncResult *result,
                      GError      **error)
{
  g_return_val_if_fail (g_task_is_valid (result, NULL), NULL);
  return g_task_propagate_pointer (G_TASK (result), error);
}
