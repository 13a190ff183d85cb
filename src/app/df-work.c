/* df-work.c: background loop measurement and path comparison on GTask threads (see
 * df-work.h). Each job owns a copy of the surface and the points, so the main thread may
 * change or free its own at any time. */
#include "df-work-guard.h"
#include "df-work.h"

/* Samples drawn along a compared path: enough for a smooth polyline at screen size. */
#define DF_PATH_SAMPLES 160

typedef struct
{
  df_surface *surface;
  double    (*uv)[2];
  gsize       n;
  double    (*uv_b)[2];
  gsize       n_b;
  gsize       n_samples;
} DfWorkData;

static void
work_data_free (gpointer data)
{
  DfWorkData *work = data;

  df_surface_free (work->surface);
  g_free (work->uv);
  g_free (work->uv_b);
  g_free (work);
}

void
df_work_loop_result_free (df_loop_result *result)
{
  if (result == NULL)
    return;
  df_loop_result_clear (result);
  g_free (result);
}

void
df_work_path_comparison_free (DfPathComparison *comparison)
{
  if (comparison == NULL)
    return;
  df_transport_result_clear (&comparison->a);
  df_transport_result_clear (&comparison->b);
  g_free (comparison);
}

/* One job's outcome, filled inside the crash guard. */
typedef struct
{
  GTask    *task;
  gpointer  data;
  GError   *error;
} DfGuarded;

static void
measure_loop_guarded (gpointer user_data)
{
  DfGuarded *guarded = user_data;
  GTask *task = guarded->task;
  DfWorkData *work = g_task_get_task_data (task);
  g_autoptr(df_curve) curve = NULL;
  df_loop_options options;
  df_loop_result *result;
  df_diag diag;
  df_status status;
  GError *error = NULL;

  df_diag_clear (&diag);
  status = df_curve_new_through_points (work->surface, (const double (*)[2]) work->uv, work->n,
                                        true, &curve, &diag);
  if (status != DF_OK)
    {
      df_status_to_gerror (status, &diag, &error);
      guarded->error = error;
      return;
    }
  if (g_cancellable_is_cancelled (g_task_get_cancellable (task)))
    return;

  df_loop_options_init (&options);
  if (work->n_samples > 0)
    options.n_samples = work->n_samples;
  result = g_new0 (df_loop_result, 1);
  df_diag_clear (&diag);
  status = df_loop_measure (curve, &options, result, &diag);
  if (status != DF_OK)
    {
      df_work_loop_result_free (result);
      df_status_to_gerror (status, &diag, &error);
      guarded->error = error;
      return;
    }
  guarded->data = result;
}

static void
measure_loop_thread (GTask        *task,
                     gpointer      source,
                     gpointer      task_data,
                     GCancellable *cancellable)
{
  DfGuarded guarded = { task, NULL, NULL };

  if (!df_guard_call (measure_loop_guarded, &guarded, "measuring the loop", &guarded.error))
    guarded.data = NULL;
  if (guarded.error != NULL)
    g_task_return_error (task, guarded.error);
  else if (guarded.data != NULL)
    g_task_return_pointer (task, guarded.data, (GDestroyNotify) df_work_loop_result_free);
  else if (!g_task_return_error_if_cancelled (task))
    g_task_return_new_error (task, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY,
                             "The loop could not be measured");
}

void
df_work_measure_loop_async (const df_surface   *surface,
                            const double      (*uv)[2],
                            gsize               n,
                            gsize               n_samples,
                            GCancellable       *cancellable,
                            GAsyncReadyCallback callback,
                            gpointer            user_data)
{
  g_autoptr(GTask) task = NULL;
  DfWorkData *work;

  g_return_if_fail (surface != NULL);
  g_return_if_fail (uv != NULL || n == 0);

  work = g_new0 (DfWorkData, 1);
  work->surface = df_surface_copy (surface);
  work->uv = g_memdup2 (uv, n * sizeof *uv);
  work->n = n;
  work->n_samples = n_samples;

  task = g_task_new (NULL, cancellable, callback, user_data);
  g_task_set_source_tag (task, df_work_measure_loop_async);
  g_task_set_task_data (task, work, work_data_free);
  /* A stale result is of no use once its job was cancelled. */
  g_task_set_return_on_cancel (task, TRUE);
  g_task_run_in_thread (task, measure_loop_thread);
}

df_loop_result *
df_work_measure_loop_finish (GAsyncResult *result,
                             GError      **error)
{
  g_return_val_if_fail (g_task_is_valid (result, NULL), NULL);
  return g_task_propagate_pointer (G_TASK (result), error);
}

static void
compare_paths_guarded (gpointer user_data)
{
  DfGuarded *guarded = user_data;
  DfWorkData *work = g_task_get_task_data (guarded->task);
  g_autoptr(df_curve) a = NULL;
  g_autoptr(df_curve) b = NULL;
  df_transport_options options;
  DfPathComparison *comparison;
  df_diag diag;
  df_status status;
  GError *error = NULL;

  df_diag_clear (&diag);
  status = df_curve_new_through_points (work->surface, (const double (*)[2]) work->uv, work->n,
                                        false, &a, &diag);
  if (status != DF_OK)
    {
      df_status_to_gerror (status, &diag, &error);
      g_prefix_error (&error, "Path A: ");
      guarded->error = error;
      return;
    }
  df_diag_clear (&diag);
  status = df_curve_new_through_points (work->surface, (const double (*)[2]) work->uv_b,
                                        work->n_b, false, &b, &diag);
  if (status != DF_OK)
    {
      df_status_to_gerror (status, &diag, &error);
      g_prefix_error (&error, "Path B: ");
      guarded->error = error;
      return;
    }

  df_transport_options_init (&options);
  options.n_out = DF_PATH_SAMPLES;
  comparison = g_new0 (DfPathComparison, 1);
  df_diag_clear (&diag);
  status = df_compare_paths (a, b, NULL, &options, &comparison->angle_rad, &comparison->a,
                             &comparison->b, &diag);
  if (status != DF_OK)
    {
      df_work_path_comparison_free (comparison);
      df_status_to_gerror (status, &diag, &error);
      guarded->error = error;
      return;
    }
  guarded->data = comparison;
}

static void
compare_paths_thread (GTask        *task,
                      gpointer      source,
                      gpointer      task_data,
                      GCancellable *cancellable)
{
  DfGuarded guarded = { task, NULL, NULL };

  if (!df_guard_call (compare_paths_guarded, &guarded, "comparing the paths", &guarded.error))
    guarded.data = NULL;
  if (guarded.error != NULL)
    g_task_return_error (task, guarded.error);
  else
    g_task_return_pointer (task, guarded.data, (GDestroyNotify) df_work_path_comparison_free);
}

void
df_work_compare_paths_async (const df_surface   *surface,
                             const double      (*uv_a)[2],
                             gsize               n_a,
                             const double      (*uv_b)[2],
                             gsize               n_b,
                             GCancellable       *cancellable,
                             GAsyncReadyCallback callback,
                             gpointer            user_data)
{
  g_autoptr(GTask) task = NULL;
  DfWorkData *work;

  g_return_if_fail (surface != NULL);

  work = g_new0 (DfWorkData, 1);
  work->surface = df_surface_copy (surface);
  work->uv = g_memdup2 (uv_a, n_a * sizeof *uv_a);
  work->n = n_a;
  work->uv_b = g_memdup2 (uv_b, n_b * sizeof *uv_b);
  work->n_b = n_b;

  task = g_task_new (NULL, cancellable, callback, user_data);
  g_task_set_source_tag (task, df_work_compare_paths_async);
  g_task_set_task_data (task, work, work_data_free);
  g_task_set_return_on_cancel (task, TRUE);
  g_task_run_in_thread (task, compare_paths_thread);
}

DfPathComparison *
df_work_compare_paths_finish (GAsyncResult *result,
                              GError      **error)
{
  g_return_val_if_fail (g_task_is_valid (result, NULL), NULL);
  return g_task_propagate_pointer (G_TASK (result), error);
}
