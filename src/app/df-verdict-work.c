/* df-verdict-work.c: the loop check on a GTask thread (see df-verdict-work.h), under the
 * same crash guard as the measurement (df-work-guard.h). The job owns copies of the surface,
 * the points and the limits. */
#include "df-verdict-work.h"

#include <math.h>

#include "df-io-error.h"
#include "df-verdict-region.h"
#include "df-work-guard.h"

/* As `driftframe-cli check` does: enough samples that the range ends refine from close
 * brackets, and smooth plots at panel width. */
#define DF_CHECK_SAMPLES 2000

typedef struct
{
  df_surface *surface;
  double    (*uv)[2];
  gsize       n;
  df_limits  *limits;
  df_shear_setup drape;
} CheckData;

static void
check_data_free (gpointer data)
{
  CheckData *work = data;

  df_surface_free (work->surface);
  g_free (work->uv);
  df_limits_free (work->limits);
  g_free (work);
}

void
df_loop_check_free (DfLoopCheck *check)
{
  if (check == NULL)
    return;
  df_verdict_list_clear (&check->list);
  g_free (check->strain_note);
  g_free (check->shear_note);
  g_free (check->s);
  g_free (check->kg);
  g_free (check->ratio);
  g_free (check->deviation_deg);
  g_free (check->xyz);
  g_free (check->normal);
  g_free (check);
}

typedef struct
{
  GTask       *task;
  DfLoopCheck *check;
  GError      *error;
} Guarded;

/* A region verdict that could not be made costs only itself: its note says why. */
static void
region_failed (df_status      status,
               const df_diag *diag,
               char          *note,
               gsize          note_len,
               bool          *checked)
{
  g_autoptr(GError) error = NULL;

  df_status_to_gerror (status, diag, &error);
  g_snprintf (note, note_len, "not checked: %s", error->message);
  *checked = false;
}

static void
check_guarded (gpointer user_data)
{
  Guarded *g = user_data;
  CheckData *work = g_task_get_task_data (g->task);
  g_autoptr(df_curve) curve = NULL;
  df_loop_options options;
  df_loop_result result = { 0 };
  DfLoopCheck *check;
  df_diag diag;
  df_status status;
  char note[240] = "";
  bool checked = false;

  df_diag_clear (&diag);
  status = df_curve_new_through_points (work->surface, (const double (*)[2]) work->uv, work->n,
                                        true, &curve, &diag);
  df_loop_options_init (&options);
  options.n_samples = DF_CHECK_SAMPLES;
  if (status == DF_OK)
    status = df_loop_measure (curve, &options, &result, &diag);
  check = g_new0 (DfLoopCheck, 1);
  if (status == DF_OK)
    status = df_verdicts_measure (curve, result.samples, result.n_samples, result.length,
                                  work->limits, &check->list, &diag);
  if (status == DF_OK && !g_cancellable_is_cancelled (g_task_get_cancellable (g->task)))
    {
      df_diag strain_diag;
      df_status strain;

      /* A region that cannot be sampled costs only its own verdict: the curve's stand. */
      df_diag_clear (&strain_diag);
      strain = df_verdict_strain (curve, &result, work->limits, 0, NULL, &check->list, &checked,
                                  note, sizeof note, &strain_diag);
      if (strain != DF_OK)
        region_failed (strain, &strain_diag, note, sizeof note, &checked);
    }
  if (status != DF_OK)
    {
      df_status_to_gerror (status, &diag, &g->error);
      df_loop_result_clear (&result);
      df_loop_check_free (check);
      return;
    }
  if (result.bounds_disc && result.enclosed_available && result.area > 0
      && df_darts_compute (result.enclosed_curvature_rad, result.area, 1, &check->darts,
                           NULL) == DF_OK)
    {
      const df_limit *shear = &work->limits->item[DF_LIMIT_MAX_SHEAR];

      check->has_darts = TRUE;
      if (shear->set
          && df_darts_least_count (result.enclosed_curvature_rad,
                                   shear->model_value * G_PI / 180, &check->darts_least,
                                   NULL) == DF_OK
          && check->darts_least > 0
          && df_darts_compute (result.enclosed_curvature_rad, result.area, check->darts_least,
                               &check->darts_each, NULL) != DF_OK)
        check->darts_least = 0;
    }
  check->strain_checked = checked;
  check->strain_note = note[0] != '\0' ? g_strdup (note) : NULL;
  if (work->limits->item[DF_LIMIT_MAX_SHEAR].set
      && !g_cancellable_is_cancelled (g_task_get_cancellable (g->task)))
    {
      /* The woven ply's locking angle, by a drape of the loop as check drapes it. A drape that
       * fails costs only this verdict. */
      char shear_note[240] = "";
      bool shear_checked = false;
      df_diag shear_diag;
      df_status shear;

      df_diag_clear (&shear_diag);
      shear = df_verdict_shear (curve, work->n, &result, work->limits, &work->drape,
                                &check->list, &check->shear, &shear_checked, shear_note,
                                sizeof shear_note, &shear_diag);
      if (shear != DF_OK)
        region_failed (shear, &shear_diag, shear_note, sizeof shear_note, &shear_checked);
      check->shear_checked = shear_checked;
      check->shear_note = shear_note[0] != '\0' ? g_strdup (shear_note) : NULL;
    }
  check->length = result.length;
  check->n = result.n_samples;
  check->s = g_new (double, check->n);
  check->kg = g_new (double, check->n);
  check->ratio = g_new (double, check->n);
  check->deviation_deg = g_new (double, check->n);
  check->xyz = g_malloc_n (check->n, sizeof *check->xyz);
  check->normal = g_malloc_n (check->n, sizeof *check->normal);
  for (gsize i = 0; i < check->n; i++)
    {
      const df_loop_sample *smp = &result.samples[i];
      double k_g = smp->k_g, k_n = 0;

      check->s[i] = smp->s;
      check->kg[i] = smp->k_g;
      /* The verdict's own quantities: |k_g / k_n| from the curve's exact curvatures, the
       * deviation as |wrapped angle| (df-verdict.c). */
      if (df_curve_curvatures (curve, smp->tau, &k_g, &k_n, NULL) == DF_OK && k_n != 0.0
          && isfinite (k_g / k_n))
        check->ratio[i] = fabs (k_g / k_n);
      else
        check->ratio[i] = NAN;
      check->deviation_deg[i] = fabs (df_wrap_angle (smp->angle_rad)) * 180.0 / G_PI;
      for (int k = 0; k < 3; k++)
        {
          check->xyz[i][k] = smp->point[k];
          check->normal[i][k] = smp->normal[k];
        }
    }
  df_loop_result_clear (&result);
  g->check = check;
}

static void
check_thread (GTask        *task,
              gpointer      source,
              gpointer      task_data,
              GCancellable *cancellable)
{
  Guarded g = { task, NULL, NULL };

  if (!df_guard_call (check_guarded, &g, "checking the loop against the limits", &g.error))
    g.check = NULL;
  if (g.error != NULL)
    g_task_return_error (task, g.error);
  else if (g.check != NULL)
    g_task_return_pointer (task, g.check, (GDestroyNotify) df_loop_check_free);
  else if (!g_task_return_error_if_cancelled (task))
    g_task_return_new_error (task, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY,
                             "The loop could not be checked");
}

void
df_work_check_loop_async (const df_surface   *surface,
                          const double      (*uv)[2],
                          gsize               n,
                          const df_limits    *limits,
                          const df_shear_setup *drape,
                          GCancellable       *cancellable,
                          GAsyncReadyCallback callback,
                          gpointer            user_data)
{
  g_autoptr(GTask) task = NULL;
  CheckData *work;

  g_return_if_fail (surface != NULL && limits != NULL);

  work = g_new0 (CheckData, 1);
  work->surface = df_surface_copy (surface);
  work->uv = g_memdup2 (uv, n * sizeof *uv);
  work->n = n;
  work->limits = df_limits_copy (limits);
  if (drape != NULL)
    work->drape = *drape;
  task = g_task_new (NULL, cancellable, callback, user_data);
  g_task_set_source_tag (task, df_work_check_loop_async);
  g_task_set_task_data (task, work, check_data_free);
  g_task_run_in_thread (task, check_thread);
}

DfLoopCheck *
df_work_check_loop_finish (GAsyncResult *result,
                           GError      **error)
{
  g_return_val_if_fail (g_task_is_valid (result, NULL), NULL);
  return g_task_propagate_pointer (G_TASK (result), error);
}
