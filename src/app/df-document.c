/* df-document.c: the open project: spec, surface, loops, measurements, file and undo (see
 * df-document.h). Geometry comes from the core; measuring runs in df-work.c threads. This file
 * has the object, snapshots and undo, loading and saving; a surface change carrying the loops
 * is in df-document-carry.c and the loop list's edits in df-document-loops.c. */
#include <string.h>

#include <math.h>

#include "df-data-import.h"
#include "df-document-private.h"
#include "df-project.h"
#include "df-work-guard.h"
#include "df-work.h"

GParamSpec *_df_document_properties[DF_DOCUMENT_N_PROPS];
guint _df_document_signals[DF_DOCUMENT_N_SIGNALS];

G_DEFINE_FINAL_TYPE (DfDocument, df_document, G_TYPE_OBJECT)

typedef struct
{
  DfDocument *document;
  DfLoopItem *item;
} MeasureJob;

static void
df_document_dispose (GObject *object)
{
  DfDocument *self = DF_DOCUMENT (object);

  if (self->loops != NULL)
    g_list_store_remove_all (self->loops);
  g_clear_object (&self->loops);
  G_OBJECT_CLASS (df_document_parent_class)->dispose (object);
}

static void
df_document_finalize (GObject *object)
{
  DfDocument *self = DF_DOCUMENT (object);

  df_surface_spec_free (self->spec);
  df_surface_free (self->surface);
  df_limits_free (self->limits);
  df_history_free (self->history);
  g_free (self->path);
  g_free (self->saved_snapshot);
  g_free (self->last_label);
  g_free (self->display_name);
  g_free (self->load_skipped);
  df_project_free (self->carried);
  G_OBJECT_CLASS (df_document_parent_class)->finalize (object);
}

static void
df_document_get_property (GObject    *object,
                          guint       prop_id,
                          GValue     *value,
                          GParamSpec *pspec)
{
  DfDocument *self = DF_DOCUMENT (object);

  switch (prop_id)
    {
    case PROP_PATH:
      g_value_set_string (value, self->path);
      break;
    case PROP_MODIFIED:
      g_value_set_boolean (value, self->modified);
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
    }
}

static void
df_document_class_init (DfDocumentClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);

  object_class->dispose = df_document_dispose;
  object_class->finalize = df_document_finalize;
  object_class->get_property = df_document_get_property;

  _df_document_properties[PROP_PATH] =
    g_param_spec_string ("path", NULL, NULL, NULL,
                         G_PARAM_READABLE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  _df_document_properties[PROP_MODIFIED] =
    g_param_spec_boolean ("modified", NULL, NULL, FALSE,
                          G_PARAM_READABLE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  g_object_class_install_properties (object_class, DF_DOCUMENT_N_PROPS, _df_document_properties);

  /* The surface was replaced (load, edit, undo): redraw it and re-read every loop. */
  _df_document_signals[SURFACE_CHANGED] =
    g_signal_new ("surface-changed", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0,
                  NULL, NULL, NULL, G_TYPE_NONE, 0);
  /* A loop's measurement finished or failed, or its name or frames switch changed. */
  _df_document_signals[LOOP_CHANGED] =
    g_signal_new ("loop-changed", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0,
                  NULL, NULL, NULL, G_TYPE_NONE, 1, DF_TYPE_LOOP_ITEM);
  _df_document_signals[HISTORY_CHANGED] =
    g_signal_new ("history-changed", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0,
                  NULL, NULL, NULL, G_TYPE_NONE, 0);
  /* Anything that is saved with the project changed (every edit, undo, load, save): the
   * autosave listens to this. */
  _df_document_signals[CHANGED] =
    g_signal_new ("changed", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0,
                  NULL, NULL, NULL, G_TYPE_NONE, 0);
  /* The display units may differ (their edit, load, undo, a surface change): every readout
   * shows its values again; nothing is re-measured (results stay in the surface's units). */
  _df_document_signals[UNITS_CHANGED] =
    g_signal_new ("units-changed", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0,
                  NULL, NULL, NULL, G_TYPE_NONE, 0);
}

static void
df_document_init (DfDocument *self)
{
  self->loops = g_list_store_new (DF_TYPE_LOOP_ITEM);
  self->history = df_history_new (DF_HISTORY_LIMIT);
}

DfDocument *
df_document_new (void)
{
  return g_object_new (DF_TYPE_DOCUMENT, NULL);
}

df_project *
df_document_to_project (DfDocument *self)
{
  df_project *project;
  guint n;

  g_return_val_if_fail (DF_IS_DOCUMENT (self), NULL);
  g_return_val_if_fail (self->spec != NULL, NULL);

  project = df_project_new (df_surface_spec_copy (self->spec));
  if (self->carried != NULL)
    df_project_copy_meta (project, self->carried);
  if (self->limits != NULL)
    {
      df_limits_free (project->limits);
      project->limits = df_limits_copy (self->limits);
    }
  n = g_list_model_get_n_items (G_LIST_MODEL (self->loops));
  for (guint i = 0; i < n; i++)
    {
      g_autoptr(DfLoopItem) item = g_list_model_get_item (G_LIST_MODEL (self->loops), i);
      const double (*uv)[2];
      gsize n_points;

      uv = df_loop_item_get_points (item, &n_points);
      df_project_add_loop (project, df_loop_item_get_name (item), df_loop_item_get_colour (item),
                           df_loop_item_get_show_frames (item), uv, n_points);
      ((df_project_loop *) g_ptr_array_index (project->loops, project->loops->len - 1))->drape
        = *df_loop_item_get_drape (item);
    }
  return project;
}

static char *
snapshot (DfDocument *self)
{
  g_autoptr(df_project) project = NULL;
  g_autoptr(GKeyFile) key_file = NULL;
  g_autofree char *data = NULL;
  gboolean any_off = FALSE;
  guint n;

  if (self->spec == NULL)
    return NULL;
  project = df_document_to_project (self);
  data = df_project_to_data (project);
  n = g_list_model_get_n_items (G_LIST_MODEL (self->loops));
  for (guint i = 0; i < n && !any_off; i++)
    {
      g_autoptr(DfLoopItem) item = g_list_model_get_item (G_LIST_MODEL (self->loops), i);
      any_off = df_loop_item_get_off_surface (item) != NULL;
    }
  if (!any_off)
    return g_steal_pointer (&data);

  /* The off-surface marks ride along as comments, so undo, redo and the autosave keep them. */
  key_file = g_key_file_new ();
  if (!g_key_file_load_from_data (key_file, data, -1, G_KEY_FILE_KEEP_COMMENTS, NULL))
    return g_steal_pointer (&data);
  for (guint i = 0; i < n; i++)
    {
      g_autoptr(DfLoopItem) item = g_list_model_get_item (G_LIST_MODEL (self->loops), i);
      g_autofree char *group = g_strdup_printf ("loop %u", i + 1);
      g_autofree char *comment = NULL;

      if (df_loop_item_get_off_surface (item) == NULL)
        continue;
      comment = g_strdup_printf (" " DF_OFF_SURFACE_COMMENT " %s",
                                 df_loop_item_get_off_surface (item));
      g_key_file_set_comment (key_file, group, NULL, comment, NULL);
    }
  return g_key_file_to_data (key_file, NULL, NULL);
}

/* Sets the off-surface marks that snapshot() wrote into data (NULL: none). */
static void
apply_marks (DfDocument *self,
             const char *data)
{
  g_autoptr(GKeyFile) key_file = g_key_file_new ();
  guint n = g_list_model_get_n_items (G_LIST_MODEL (self->loops));

  if (data == NULL || strstr (data, DF_OFF_SURFACE_COMMENT) == NULL
      || !g_key_file_load_from_data (key_file, data, -1, G_KEY_FILE_KEEP_COMMENTS, NULL))
    return;
  for (guint i = 0; i < n; i++)
    {
      g_autoptr(DfLoopItem) item = g_list_model_get_item (G_LIST_MODEL (self->loops), i);
      g_autofree char *group = g_strdup_printf ("loop %u", i + 1);
      g_autofree char *comment = g_key_file_get_comment (key_file, group, NULL, NULL);
      char *text = comment;

      while (text != NULL && (*text == '#' || *text == ' '))
        text++;
      if (text != NULL && g_str_has_prefix (text, DF_OFF_SURFACE_COMMENT))
        df_loop_item_set_off_surface (item,
                                      g_strstrip (text + strlen (DF_OFF_SURFACE_COMMENT)));
    }
}

/* The modified flag compares the project text with the one last loaded or saved, so an edit
 * undone back to the saved state is not "modified". */
void
_df_document_update_modified (DfDocument *self)
{
  g_autofree char *now = snapshot (self);
  gboolean modified = g_strcmp0 (now, self->saved_snapshot) != 0;

  if (modified != self->modified)
    {
      self->modified = modified;
      g_object_notify_by_pspec (G_OBJECT (self), _df_document_properties[PROP_MODIFIED]);
    }
  g_signal_emit (self, _df_document_signals[CHANGED], 0);
}

static void
set_path (DfDocument *self,
          const char *path)
{
  if (g_strcmp0 (self->path, path) == 0)
    return;
  g_free (self->path);
  self->path = g_strdup (path);
  g_object_notify_by_pspec (G_OBJECT (self), _df_document_properties[PROP_PATH]);
}

static void
measure_done_cb (GObject      *source,
                 GAsyncResult *result,
                 gpointer      user_data)
{
  MeasureJob *job = user_data;
  g_autoptr(GError) error = NULL;
  df_loop_result *measured;

  measured = df_work_measure_loop_finish (result, &error);
  if (measured != NULL)
    {
      df_loop_item_set_result (job->item, measured);
      g_signal_emit (job->document, _df_document_signals[LOOP_CHANGED], 0, job->item);
    }
  else if (!g_error_matches (error, G_IO_ERROR, G_IO_ERROR_CANCELLED))
    {
      df_loop_item_set_failed (job->item, error->message);
      g_signal_emit (job->document, _df_document_signals[LOOP_CHANGED], 0, job->item);
    }
  g_object_unref (job->document);
  g_object_unref (job->item);
  g_free (job);
}

void
_df_document_measure_item (DfDocument *self,
                           DfLoopItem *item)
{
  MeasureJob *job;
  GCancellable *cancellable;
  const double (*uv)[2];
  gsize n;

  cancellable = df_loop_item_restart_cancellable (item);
  df_loop_item_set_pending (item);
  uv = df_loop_item_get_points (item, &n);

  job = g_new0 (MeasureJob, 1);
  job->document = g_object_ref (self);
  job->item = g_object_ref (item);
  df_work_measure_loop_async (self->surface, uv, n, 0, cancellable, measure_done_cb, job);
}

void
_df_document_measure_all (DfDocument *self)
{
  guint n = g_list_model_get_n_items (G_LIST_MODEL (self->loops));

  for (guint i = 0; i < n; i++)
    {
      g_autoptr(DfLoopItem) item = g_list_model_get_item (G_LIST_MODEL (self->loops), i);

      if (df_loop_item_get_off_surface (item) == NULL)
        _df_document_measure_item (self, item);
      else
        g_signal_emit (self, _df_document_signals[LOOP_CHANGED], 0, item);
    }
}

/* Makes project the current state (without touching undo); FALSE and no change when its
 * surface does not build. */
static gboolean
replace_state (DfDocument  *self,
               df_project  *project,
               const char  *data,
               GError     **error)
{
  g_autoptr(df_surface) surface = NULL;
  g_autoptr(GPtrArray) items = g_ptr_array_new_with_free_func (g_object_unref);

  surface = df_surface_spec_build (project->spec, error);
  if (surface == NULL)
    return FALSE;

  df_surface_spec_free (self->spec);
  self->spec = df_surface_spec_copy (project->spec);
  df_data_spec_make_absolute (self->spec);
  df_project_free (self->carried);
  self->carried = df_project_new (df_surface_spec_copy (project->spec));
  df_project_copy_meta (self->carried, project);
  df_surface_free (self->surface);
  self->surface = g_steal_pointer (&surface);
  df_limits_free (self->limits);
  self->limits = df_limits_copy (project->limits);

  for (guint i = 0; i < project->loops->len; i++)
    {
      df_project_loop *loop = g_ptr_array_index (project->loops, i);
      DfLoopItem *item = df_loop_item_new (loop->name, loop->colour, loop->show_frames,
                                           (const double (*)[2]) loop->uv, loop->n);

      df_loop_item_set_drape (item, &loop->drape);
      g_ptr_array_add (items, item);
    }
  g_list_store_splice (self->loops, 0, g_list_model_get_n_items (G_LIST_MODEL (self->loops)),
                       items->pdata, items->len);
  apply_marks (self, data);
  g_signal_emit (self, _df_document_signals[SURFACE_CHANGED], 0);
  g_signal_emit (self, _df_document_signals[UNITS_CHANGED], 0);
  _df_document_measure_all (self);
  return TRUE;
}

/* Records the state before an edit. */
void
_df_document_push_history (DfDocument *self,
                           const char *label)
{
  char *before = snapshot (self);

  if (before != NULL)
    df_history_push (self->history, before, label);
  g_signal_emit (self, _df_document_signals[HISTORY_CHANGED], 0);
}

gboolean
df_document_set_project (DfDocument  *self,
                         df_project  *project,
                         const char  *path,
                         GError     **error)
{
  g_autoptr(df_project) owned = project;

  g_return_val_if_fail (DF_IS_DOCUMENT (self), FALSE);
  g_return_val_if_fail (project != NULL, FALSE);

  if (!replace_state (self, owned, NULL, error))
    return FALSE;
  df_history_clear (self->history);
  g_clear_pointer (&self->display_name, g_free);
  g_clear_pointer (&self->load_skipped, g_free);
  set_path (self, path);
  /* The name went too: titles refresh on "path" even when the path stayed NULL. */
  g_object_notify_by_pspec (G_OBJECT (self), _df_document_properties[PROP_PATH]);
  g_free (self->saved_snapshot);
  /* An unsaved project (from a preset or a .surface) counts as modified only once edited. */
  self->saved_snapshot = snapshot (self);
  _df_document_update_modified (self);
  g_signal_emit (self, _df_document_signals[HISTORY_CHANGED], 0);
  return TRUE;
}

gboolean
df_document_restore (DfDocument  *self,
                     const char  *data,
                     const char  *source,
                     const char  *path,
                     const char  *display_name,
                     GError     **error)
{
  df_project *project;

  g_return_val_if_fail (DF_IS_DOCUMENT (self), FALSE);

  project = df_project_from_data (data, source, error);
  if (project == NULL || !df_document_set_project (self, project, path, error))
    return FALSE;
  apply_marks (self, data);
  if (display_name != NULL && display_name[0] != '\0')
    df_document_set_display_name (self, display_name);
  /* Not what is on disk: unsaved until the user saves it. */
  g_clear_pointer (&self->saved_snapshot, g_free);
  _df_document_update_modified (self);
  return TRUE;
}

gboolean
df_document_load (DfDocument  *self,
                  const char  *path,
                  GError     **error)
{
  g_return_val_if_fail (DF_IS_DOCUMENT (self), FALSE);
  g_return_val_if_fail (path != NULL, FALSE);

  if (g_str_has_suffix (path, ".surface"))
    {
      df_surface_spec *spec = df_surface_spec_load (path, error);

      if (spec == NULL)
        return FALSE;
      return df_document_set_project (self, df_project_new (spec), NULL, error);
    }
  else
    {
      g_autoptr(GPtrArray) skipped = g_ptr_array_new_with_free_func (g_free);
      df_project *project = df_project_load_skipping (path, skipped, error);

      if (project == NULL || !df_document_set_project (self, project, path, error))
        return FALSE;
      if (skipped->len > 0)
        {
          g_ptr_array_add (skipped, NULL);
          self->load_skipped = g_strjoinv ("\n", (char **) skipped->pdata);
          /* What is open is not what the file holds: saving would leave the bad loops out. */
          g_clear_pointer (&self->saved_snapshot, g_free);
          _df_document_update_modified (self);
        }
      return TRUE;
    }
}

gboolean
df_document_save (DfDocument  *self,
                  const char  *path,
                  GError     **error)
{
  g_autofree char *data = NULL;

  g_return_val_if_fail (DF_IS_DOCUMENT (self), FALSE);
  g_return_val_if_fail (path != NULL, FALSE);

  data = snapshot (self);
  if (data == NULL)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE, "There is no surface to save");
      return FALSE;
    }
  /* A data file is named relative to the project in the file (the document keeps it
   * absolute, so undo and autosaves find it from anywhere). */
  {
    g_autofree char *on_disk = df_data_project_text_for (data, path);

    if (!df_write_file_atomic (path, on_disk, -1, error))
      return FALSE;
  }
  set_path (self, path);
  g_free (self->saved_snapshot);
  self->saved_snapshot = g_steal_pointer (&data);
  _df_document_update_modified (self);
  return TRUE;
}

const char *
df_document_get_path (DfDocument *self)
{
  g_return_val_if_fail (DF_IS_DOCUMENT (self), NULL);
  return self->path;
}

char *
df_document_get_title (DfDocument *self)
{
  g_return_val_if_fail (DF_IS_DOCUMENT (self), NULL);

  /* A name the project was given (the demo's, a new project's) stays its title through Save
   * As; the file's name is in the window's subtitle (df-window-sync.c). An opened file has no
   * such name (set_project clears it) and is called by its file. */
  if (self->display_name != NULL)
    return g_strdup (self->display_name);
  if (self->path == NULL)
    return g_strdup ("Untitled project");
  return g_path_get_basename (self->path);
}

void
df_document_set_display_name (DfDocument *self,
                              const char *name)
{
  g_return_if_fail (DF_IS_DOCUMENT (self));

  g_free (self->display_name);
  self->display_name = g_strdup (name);
  /* Observers refresh titles on "path". */
  g_object_notify_by_pspec (G_OBJECT (self), _df_document_properties[PROP_PATH]);
}

const char *
df_document_get_display_name (DfDocument *self)
{
  g_return_val_if_fail (DF_IS_DOCUMENT (self), NULL);
  return self->display_name;
}

gboolean
df_document_get_modified (DfDocument *self)
{
  g_return_val_if_fail (DF_IS_DOCUMENT (self), FALSE);
  return self->modified;
}

const df_surface_spec *
df_document_get_spec (DfDocument *self)
{
  g_return_val_if_fail (DF_IS_DOCUMENT (self), NULL);
  return self->spec;
}

const df_surface *
df_document_get_surface (DfDocument *self)
{
  g_return_val_if_fail (DF_IS_DOCUMENT (self), NULL);
  return self->surface;
}

const char *
df_document_get_units (DfDocument *self)
{
  g_return_val_if_fail (DF_IS_DOCUMENT (self), "mm");

  if (self->spec == NULL || self->spec->units == NULL || self->spec->units[0] == '\0')
    return "mm";
  return self->spec->units;
}


gboolean
df_document_all_measured (DfDocument *self)
{
  guint n;

  g_return_val_if_fail (DF_IS_DOCUMENT (self), FALSE);

  n = g_list_model_get_n_items (G_LIST_MODEL (self->loops));
  for (guint i = 0; i < n; i++)
    {
      g_autoptr(DfLoopItem) item = g_list_model_get_item (G_LIST_MODEL (self->loops), i);

      if (df_loop_item_get_state (item) == DF_LOOP_PENDING)
        return FALSE;
    }
  return TRUE;
}

gboolean
df_document_can_undo (DfDocument *self)
{
  g_return_val_if_fail (DF_IS_DOCUMENT (self), FALSE);
  return df_history_can_undo (self->history);
}

gboolean
df_document_can_redo (DfDocument *self)
{
  g_return_val_if_fail (DF_IS_DOCUMENT (self), FALSE);
  return df_history_can_redo (self->history);
}

static const char *
step (DfDocument *self,
      gboolean    undo)
{
  g_autofree char *target = NULL;
  g_autoptr(df_project) project = NULL;
  g_autoptr(GError) error = NULL;
  const char *label;

  label = undo ? df_history_undo_label (self->history) : df_history_redo_label (self->history);
  if (label == NULL)
    return NULL;
  g_free (self->last_label);
  self->last_label = g_strdup (label);

  target = undo ? df_history_undo (self->history, snapshot (self))
                : df_history_redo (self->history, snapshot (self));
  project = df_project_from_data (target, "undo history", &error);
  if (project == NULL || !replace_state (self, project, target, &error))
    /* Snapshots were written by this program from a state that built: a failure here is a
     * bug, not bad input. */
    g_warning ("Cannot restore the project from the undo history: %s", error->message);
  _df_document_update_modified (self);
  g_signal_emit (self, _df_document_signals[HISTORY_CHANGED], 0);
  return self->last_label;
}

const char *
df_document_undo (DfDocument *self)
{
  g_return_val_if_fail (DF_IS_DOCUMENT (self), NULL);
  return step (self, TRUE);
}

const char *
df_document_redo (DfDocument *self)
{
  g_return_val_if_fail (DF_IS_DOCUMENT (self), NULL);
  return step (self, FALSE);
}

const char *
df_document_get_load_skipped (DfDocument *self)
{
  g_return_val_if_fail (DF_IS_DOCUMENT (self), NULL);
  return self->load_skipped;
}

const df_project *
df_document_get_meta (DfDocument *self)
{
  g_return_val_if_fail (DF_IS_DOCUMENT (self), NULL);
  return self->carried;
}

void
df_document_set_record (DfDocument *self,
                        const char *key,
                        const char *value)
{
  g_return_if_fail (DF_IS_DOCUMENT (self));
  if (self->carried == NULL || !df_project_set_record (self->carried, key, value))
    return;
  _df_document_update_modified (self);
}

const df_limits *
df_document_get_limits (DfDocument *self)
{
  g_return_val_if_fail (DF_IS_DOCUMENT (self), NULL);
  return self->limits;
}

void
df_document_set_view (DfDocument *self,
                      const char *colouring,
                      double      yaw_deg,
                      double      pitch_deg)
{
  df_project_view *v;

  g_return_if_fail (DF_IS_DOCUMENT (self));
  if (self->carried == NULL || !isfinite (yaw_deg) || !isfinite (pitch_deg))
    return;
  v = &self->carried->extras.view;
  v->set = TRUE;
  g_free (v->colouring);
  v->colouring = g_strdup (colouring != NULL ? colouring : "gaussian");
  /* Pitch within the reader's range; yaw as one turn. */
  v->yaw_deg = remainder (yaw_deg, 360.0);
  v->pitch_deg = fmax (-90.0, fmin (90.0, pitch_deg));
}
