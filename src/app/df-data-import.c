/* df-data-import.c: surfaces from data in the app (see df-data-import.h). The reading and
 * fitting are the core's (df_surface_spec_build, df_surface_spec_read_data_points,
 * df_fit_deviations); this file only picks the file's kind, runs them off the main thread
 * and keeps the data path usable wherever the project text is read back. No widgets. */
#include <math.h>
#include <string.h>

#include "df-data-import.h"
#include "df-fit-deviation.h"
#include "df-mesh-read.h"
#include "df-work-guard.h"

DfDataFileKind
df_data_file_sniff (const char *path,
                    GError    **error)
{
  g_autofree char *lower = g_ascii_strdown (path, -1);
  g_autofree char *data = NULL;
  g_autoptr(GError) local = NULL;
  g_auto(GStrv) lines = NULL;

  if (g_str_has_suffix (lower, ".dfproj"))
    return DF_DATA_FILE_PROJECT;
  if (g_str_has_suffix (lower, ".surface"))
    return DF_DATA_FILE_SURFACE;
  if (df_mesh_data_hint (path) != NULL)
    return DF_DATA_FILE_MESH;
  if (!g_str_has_suffix (lower, ".csv"))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: not a file driftframe takes "
                   "(a project .dfproj, a surface .surface, measured points .csv or a mesh "
                   ".stl, .obj, .ply)", path);
      return DF_DATA_FILE_UNKNOWN;
    }
  if (!g_file_get_contents (path, &data, NULL, &local))
    {
      g_set_error_literal (error, DF_IO_ERROR, DF_IO_ERROR_FILE, local->message);
      return DF_DATA_FILE_UNKNOWN;
    }
  lines = g_strsplit (data, "\n", -1);
  for (guint i = 0; lines[i] != NULL; i++)
    {
      g_autofree char *joined = NULL;
      g_autofree char *header = NULL;
      char *line = g_strstrip (lines[i]);
      g_auto(GStrv) cells = NULL;

      if (*line == '\0' || *line == '#')
        continue;
      /* Spaces around the commas are allowed, as the readers allow them. */
      cells = g_strsplit (line, ",", -1);
      for (guint c = 0; cells[c] != NULL; c++)
        g_strstrip (cells[c]);
      joined = g_strjoinv (",", cells);
      header = g_ascii_strdown (joined, -1);
      if (g_str_equal (header, "r,z"))
        return DF_DATA_FILE_PROFILE;
      if (g_str_equal (header, "x,y,z"))
        return DF_DATA_FILE_XYZ;
      if (g_str_equal (header, "u,v"))
        return DF_DATA_FILE_LOOP_UV;
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s:%u: the header must be 'r,z' "
                   "(a profile), 'x,y,z' (heights or a loop in space) or 'u,v' (a loop), "
                   "found '%.40s'", path, i + 1, line);
      return DF_DATA_FILE_UNKNOWN;
    }
  g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: the file has no header line", path);
  return DF_DATA_FILE_UNKNOWN;
}

void
df_data_fit_free (DfDataFit *fit)
{
  if (fit == NULL)
    return;
  df_surface_spec_free (fit->spec);
  df_surface_free (fit->surface);
  g_free (fit->points);
  g_free (fit->points_error);
  g_free (fit);
}

void
df_data_spec_make_absolute (df_surface_spec *spec)
{
  g_autofree char *path = NULL;

  if (spec == NULL || spec->data_path == NULL)
    return;
  path = df_surface_spec_data_file (spec);
  if (!g_path_is_absolute (path))
    {
      g_autofree char *cwd = g_get_current_dir ();
      char *abs = g_build_filename (cwd, path, NULL);

      g_free (path);
      path = abs;
    }
  g_free (spec->data_path);
  spec->data_path = g_canonicalize_filename (path, NULL);
  g_clear_pointer (&spec->base_dir, g_free);
}

/* ---- the worker -------------------------------------------------------------------------- */

typedef struct
{
  df_surface_spec *spec;
  df_surface      *surface;   /* given (points only) or NULL (fit first) */
  gboolean         fit;
  DfDataFit       *out;
  GError          *error;
} FitJob;

static void
fit_job_free (gpointer data)
{
  FitJob *job = data;

  df_surface_spec_free (job->spec);
  df_surface_free (job->surface);
  df_data_fit_free (job->out);
  g_clear_error (&job->error);
  g_free (job);
}

/* The points shown and their deviations; a failure here leaves the fit standing and says why
 * in points_error (the overlay is an aid, the fit is what counts). */
static void
deviations (DfDataFit *fit)
{
  g_autofree double (*xyz)[3] = NULL;
  g_autofree double (*shown)[3] = NULL;
  g_autofree double *dev = NULL;
  g_autofree bool *placed = NULL;
  g_autoptr(GError) error = NULL;
  gsize n = 0, m, stride, k = 0, n_placed = 0;
  df_diag diag;
  df_status status;

  if (!df_surface_spec_read_data_points (fit->spec, &xyz, &n, &error))
    {
      fit->points_error = g_strdup (error->message);
      return;
    }
  fit->n_data = n;
  /* Every stride-th point in file order keeps the order the placer continues along. */
  stride = MAX ((n + DF_DATA_POINTS_SHOWN - 1) / DF_DATA_POINTS_SHOWN, 1);
  m = (n + stride - 1) / stride;
  shown = g_malloc_n (MAX (m, 1), sizeof (double[3]));
  for (gsize i = 0; i < n && k < m; i += stride)
    memcpy (shown[k++], xyz[i], sizeof (double[3]));
  m = k;
  dev = g_malloc_n (MAX (m, 1), sizeof (double));
  placed = g_malloc_n (MAX (m, 1), sizeof (bool));
  df_diag_clear (&diag);
  status = df_fit_deviations (fit->surface, (const double (*)[3]) shown, m, dev, placed,
                              &n_placed, &diag);
  if (status != DF_OK)
    {
      g_autoptr(GError) e = NULL;

      df_status_to_gerror (status, &diag, &e);
      fit->points_error = g_strdup (e->message);
      return;
    }
  fit->points = g_malloc_n (MAX (n_placed, 1) * 4, sizeof (float));
  fit->max_abs = 0;
  for (gsize i = 0, j = 0; i < m; i++)
    {
      if (!placed[i])
        continue;
      for (int c = 0; c < 3; c++)
        fit->points[4 * j + c] = (float) shown[i][c];
      fit->points[4 * j + 3] = (float) dev[i];
      fit->max_abs = MAX (fit->max_abs, fabs (dev[i]));
      j++;
    }
  fit->n_points = n_placed;
}

static void
fit_guarded (gpointer user_data)
{
  FitJob *job = user_data;
  DfDataFit *fit = g_new0 (DfDataFit, 1);

  fit->spec = df_surface_spec_copy (job->spec);
  if (job->fit)
    {
      g_autofree char *path = df_surface_spec_data_file (fit->spec);

      fit->surface = df_surface_spec_build (fit->spec, &job->error);
      if (fit->surface == NULL)
        {
          df_data_fit_free (fit);
          return;
        }
      /* The checksum of the file as fitted, so the project records what it was made from;
       * a refit of a file that changed since it was recorded is refused, never silently
       * made from other data. */
      {
        g_autofree char *sha = df_data_file_sha256 (path, &job->error);

        if (sha == NULL)
          {
            df_data_fit_free (fit);
            return;
          }
        if (fit->spec->data_sha256 != NULL
            && g_ascii_strcasecmp (sha, fit->spec->data_sha256) != 0)
          {
            g_set_error (&job->error, DF_IO_ERROR, DF_IO_ERROR_FILE, "%s: the file has "
                         "changed since the project recorded it (SHA-256 %s, recorded %s); "
                         "import it again to use the new data", path, sha,
                         fit->spec->data_sha256);
            df_data_fit_free (fit);
            return;
          }
        g_free (fit->spec->data_sha256);
        fit->spec->data_sha256 = g_steal_pointer (&sha);
      }
    }
  else
    fit->surface = df_surface_copy (job->surface);
  fit->has_info = df_fit_get_info (df_surface_get_fn (fit->surface), &fit->info);
  deviations (fit);
  job->out = fit;
}

static void
fit_thread (GTask        *task,
            gpointer      source,
            gpointer      task_data,
            GCancellable *cancellable)
{
  FitJob *job = task_data;

  if (!df_guard_call (fit_guarded, job, "fitting the data", &job->error))
    job->out = NULL;  /* leaked after a crash, as the guard says */
  if (job->error != NULL)
    g_task_return_error (task, g_steal_pointer (&job->error));
  else if (!g_task_return_error_if_cancelled (task))
    g_task_return_pointer (task, g_steal_pointer (&job->out), (GDestroyNotify) df_data_fit_free);
}

static void
start (const df_surface_spec *spec,
       const df_surface      *surface,
       GCancellable          *cancellable,
       GAsyncReadyCallback    callback,
       gpointer               user_data)
{
  g_autoptr(GTask) task = g_task_new (NULL, cancellable, callback, user_data);
  FitJob *job = g_new0 (FitJob, 1);

  job->spec = df_surface_spec_copy (spec);
  df_data_spec_make_absolute (job->spec);
  job->surface = surface != NULL ? df_surface_copy (surface) : NULL;
  job->fit = surface == NULL;
  g_task_set_source_tag (task, df_data_fit_async);
  g_task_set_task_data (task, job, fit_job_free);
  g_task_run_in_thread (task, fit_thread);
}

void
df_data_fit_async (const df_surface_spec *spec,
                   GCancellable          *cancellable,
                   GAsyncReadyCallback    callback,
                   gpointer               user_data)
{
  g_return_if_fail (spec != NULL && spec->data_key != NULL);
  start (spec, NULL, cancellable, callback, user_data);
}

void
df_data_points_async (const df_surface_spec *spec,
                      const df_surface      *surface,
                      GCancellable          *cancellable,
                      GAsyncReadyCallback    callback,
                      gpointer               user_data)
{
  g_return_if_fail (spec != NULL && spec->data_key != NULL && surface != NULL);
  start (spec, surface, cancellable, callback, user_data);
}

DfDataFit *
df_data_fit_finish (GAsyncResult  *result,
                    GError       **error)
{
  return g_task_propagate_pointer (G_TASK (result), error);
}

/* ---- paths in the saved project ------------------------------------------------------------ */

/* target relative to the folder dir when they share a root folder ("../scans/panel.csv"), else
 * NULL. GLib has no such function (g_file_get_relative_path takes only descendants). */
static char *
relative_path (const char *dir,
               const char *target)
{
  g_auto(GStrv) a = g_strsplit (dir, G_DIR_SEPARATOR_S, -1);
  g_auto(GStrv) b = g_strsplit (target, G_DIR_SEPARATOR_S, -1);
  g_autoptr(GString) out = g_string_new (NULL);
  guint i = 0, na = g_strv_length (a), nb = g_strv_length (b);

  while (i < na && i + 1 < nb && g_str_equal (a[i], b[i]))
    i++;
  /* Only the root in common ("/", i.e. one empty component): an absolute path is clearer. */
  if (i <= 1)
    return NULL;
  for (guint k = i; k < na; k++)
    if (a[k][0] != '\0')
      g_string_append (out, ".." G_DIR_SEPARATOR_S);
  for (guint k = i; k < nb; k++)
    {
      g_string_append (out, b[k]);
      if (k + 1 < nb)
        g_string_append (out, G_DIR_SEPARATOR_S);
    }
  return g_string_free (g_steal_pointer (&out), FALSE);
}

char *
df_data_project_text_for (const char *data,
                          const char *project_path)
{
  static const char *const keys[] = { "profile", "heights", "mesh" };
  g_autoptr(GKeyFile) key_file = g_key_file_new ();
  g_autofree char *abs_project = NULL;
  g_autofree char *dir = NULL;

  if (!g_key_file_load_from_data (key_file, data, -1,
                                  G_KEY_FILE_KEEP_COMMENTS | G_KEY_FILE_KEEP_TRANSLATIONS, NULL))
    return g_strdup (data);
  abs_project = g_canonicalize_filename (project_path, NULL);
  dir = g_path_get_dirname (abs_project);
  for (guint i = 0; i < G_N_ELEMENTS (keys); i++)
    {
      g_autofree char *path = g_key_file_get_string (key_file, "surface", keys[i], NULL);
      g_autofree char *rel = NULL;

      if (path == NULL || !g_path_is_absolute (path))
        continue;
      rel = relative_path (dir, path);
      if (rel == NULL)
        return g_strdup (data);
      g_key_file_set_string (key_file, "surface", keys[i], rel);
      return g_key_file_to_data (key_file, NULL, NULL);
    }
  return g_strdup (data);
}
