/* df-window-files.c: everything the window reads or writes: open/save projects and surfaces,
 * import loop CSV, export samples/summary CSV (the core's writers, as the CLI uses) and the
 * view as PNG, the unsaved-changes question, error dialogs, and the one-shot exports asked for
 * on the command line. Dialogs are GtkFileChooserNative / GtkMessageDialog (GTK 4.8). */
#include <stdio.h>
#include <string.h>

#include "df-document-units.h"
#include "df-window-private.h"

typedef void (*DfThen) (DfWindow *self);

/* ---- errors ---------------------------------------------------------------------------- */

static gboolean
present_later_cb (gpointer user_data)
{
  gtk_window_present (GTK_WINDOW (user_data));
  g_object_unref (user_data);
  return G_SOURCE_REMOVE;
}

/* Once the parent is on screen, and after it has been stacked, so the dialog comes on top. */
static void
present_after_map (GtkWidget *dialog)
{
  g_timeout_add (300, present_later_cb, g_object_ref (dialog));
}

void
_df_window_show_error (DfWindow     *self,
                       const char   *primary,
                       const GError *error)
{
  const char *detail = error != NULL ? error->message : "unknown error";
  GtkWidget *dialog;

  _df_window_status (self, TRUE, "%s: %s", primary, detail);
  if (self->startup.export_samples != NULL || self->startup.export_summary != NULL
      || self->startup.export_png != NULL || self->startup.export_report != NULL
      || self->startup.bench_orbit)
    {
      /* Nobody is there to close a dialog in a one-shot run. */
      g_printerr ("driftframe: %s: %s\n", primary, detail);
      return;
    }
  dialog = gtk_message_dialog_new (GTK_WINDOW (self),
                                   GTK_DIALOG_MODAL | GTK_DIALOG_DESTROY_WITH_PARENT,
                                   GTK_MESSAGE_ERROR, GTK_BUTTONS_CLOSE, "%s", primary);
  gtk_message_dialog_format_secondary_text (GTK_MESSAGE_DIALOG (dialog), "%s", detail);
  g_signal_connect (dialog, "response", G_CALLBACK (gtk_window_destroy), NULL);
  /* At startup (a file from the command line that does not open) the window is not shown
   * yet: a dialog presented now would end up behind it. */
  if (gtk_widget_get_mapped (GTK_WIDGET (self)))
    gtk_window_present (GTK_WINDOW (dialog));
  else
    g_signal_connect_object (self, "map", G_CALLBACK (present_after_map), dialog,
                             G_CONNECT_SWAPPED);
}

/* ---- open ------------------------------------------------------------------------------ */

gboolean
_df_window_open_path (DfWindow    *self,
                      const char  *path,
                      GError     **error)
{
  g_autofree char *base = g_path_get_basename (path);
  guint n_loops;

  if (!df_document_load (self->document, path, error))
    return FALSE;
  _df_window_add_recent (self, path);
  {
    const df_project *meta = df_document_get_meta (self->document);

    /* A project saved with its view opens as it was left: colouring and direction. */
    if (meta != NULL && meta->extras.view.set)
      {
        g_object_set (self, "shading", meta->extras.view.colouring, NULL);
        df_surface_view_set_angles (self->view, meta->extras.view.yaw_deg,
                                    meta->extras.view.pitch_deg);
      }
  }
  n_loops = g_list_model_get_n_items (df_document_get_loops (self->document));
  if (df_document_get_load_skipped (self->document) != NULL)
    {
      const char *skipped = df_document_get_load_skipped (self->document);
      g_auto(GStrv) lines = g_strsplit (skipped, "\n", -1);
      guint n_bad = g_strv_length (lines);
      g_autoptr(GError) why = g_error_new (DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                                           "%s\n\nThe other %u loop%s opened. Saving writes the "
                                           "project without %s.", skipped, n_loops,
                                           n_loops == 1 ? "" : "s",
                                           n_bad == 1 ? "the loop left out" : "the loops left out");

      if (self->startup.report_events)
        {
          for (guint i = 0; i < n_bad; i++)
            printf ("loop-skipped %s\n", lines[i]);
          printf ("loops-opened %u\n", n_loops);
          fflush (stdout);
        }
      gtk_stack_set_visible_child_name (self->panel_stack, n_loops > 0 ? "loops" : "surface");
      _df_window_show_error (self, n_bad == 1 ? "One loop could not be read and was left out"
                                              : "Some loops could not be read and were left out",
                             why);
      return TRUE;
    }
  if (n_loops > 0)
    {
      gtk_stack_set_visible_child_name (self->panel_stack, "loops");
      _df_window_status (self, FALSE, "Opened %s: %u loop%s, measuring…", base, n_loops,
                         n_loops == 1 ? "" : "s");
    }
  else
    {
      gtk_stack_set_visible_child_name (self->panel_stack, "surface");
      _df_window_status (self, FALSE, "Opened %s.", base);
    }
  return TRUE;
}

void
_df_window_add_filter (GtkFileChooser *chooser,
                       const char     *name,
                       const char     *pattern)
{
  g_autoptr(GtkFileFilter) filter = gtk_file_filter_new ();

  gtk_file_filter_set_name (filter, name);
  gtk_file_filter_add_pattern (filter, pattern);
  gtk_file_chooser_add_filter (chooser, filter);
}

/* File dialogs start in the project's folder (else the most recent file's), not in the
 * working folder of the process or GTK's "Recent" list. */
void
_df_window_start_in_project_folder (DfWindow       *self,
                                    GtkFileChooser *chooser)
{
  const char *path = df_document_get_path (self->document);
  g_autofree char *dir = NULL;

  if (path == NULL && self->recent != NULL && self->recent[0] != NULL)
    path = self->recent[0];
  dir = path != NULL ? g_path_get_dirname (path) : g_get_current_dir ();
  if (g_file_test (dir, G_FILE_TEST_IS_DIR))
    {
      g_autoptr(GFile) folder = g_file_new_for_path (dir);
      gtk_file_chooser_set_current_folder (chooser, folder, NULL);
    }
}

char *
_df_window_chooser_path (GtkNativeDialog *dialog)
{
  g_autoptr(GFile) file = gtk_file_chooser_get_file (GTK_FILE_CHOOSER (dialog));

  return file != NULL ? g_file_get_path (file) : NULL;
}

static void
open_response_cb (GtkNativeDialog *dialog,
                  int              response,
                  DfWindow        *self)
{
  g_autofree char *path = response == GTK_RESPONSE_ACCEPT ? _df_window_chooser_path (dialog) : NULL;
  g_autoptr(GError) error = NULL;

  if (path != NULL && !_df_window_open_path (self, path, &error))
    _df_window_show_error (self, "Cannot open the file", error);
  g_object_unref (dialog);
}

static void
open_dialog_now (DfWindow *self,
                 gboolean  surface_only)
{
  GtkFileChooserNative *chooser;

  chooser = gtk_file_chooser_native_new (surface_only ? "Open Surface" : "Open Project",
                                         GTK_WINDOW (self), GTK_FILE_CHOOSER_ACTION_OPEN,
                                         "_Open", "_Cancel");
  if (!surface_only)
    {
      g_autoptr(GtkFileFilter) both = gtk_file_filter_new ();

      gtk_file_filter_set_name (both, "Projects and surfaces");
      gtk_file_filter_add_pattern (both, "*.dfproj");
      gtk_file_filter_add_pattern (both, "*.surface");
      gtk_file_chooser_add_filter (GTK_FILE_CHOOSER (chooser), both);
      _df_window_add_filter (GTK_FILE_CHOOSER (chooser), "driftframe projects (*.dfproj)", "*.dfproj");
    }
  _df_window_add_filter (GTK_FILE_CHOOSER (chooser), "Surfaces (*.surface)", "*.surface");
  _df_window_start_in_project_folder (self, GTK_FILE_CHOOSER (chooser));
  gtk_native_dialog_set_modal (GTK_NATIVE_DIALOG (chooser), TRUE);
  g_signal_connect (chooser, "response", G_CALLBACK (open_response_cb), self);
  gtk_native_dialog_show (GTK_NATIVE_DIALOG (chooser));
}

static void
open_project_confirmed (DfWindow *self)
{
  open_dialog_now (self, FALSE);
}

static void
open_surface_confirmed (DfWindow *self)
{
  open_dialog_now (self, TRUE);
}

void
_df_window_open_dialog (DfWindow *self,
                        gboolean  surface_only)
{
  _df_window_confirm_discard (self, surface_only ? G_CALLBACK (open_surface_confirmed)
                                                 : G_CALLBACK (open_project_confirmed),
                              "opening another file");
}

/* ---- replace the surface ----------------------------------------------------------------- */

gboolean
_df_window_replace_surface_path (DfWindow    *self,
                                 const char  *path,
                                 GError     **error)
{
  g_autoptr(df_surface_spec) spec = df_surface_spec_load (path, error);
  guint carried = 0, off = 0;
  g_autofree char *dropped = NULL;

  if (spec == NULL || !df_document_set_spec (self->document, spec, error))
    return FALSE;
  df_document_get_last_carry (self->document, &carried, &off);
  dropped = _df_window_dropped_note (self);
  if (carried + off == 0)
    _df_window_status (self, dropped[0] != '\0', "Surface replaced.%s", dropped);
  else
    _df_window_status (self, off > 0 || dropped[0] != '\0', "Surface replaced: %u loop%s "
                       "carried over by their places in space%s%u off the new surface (kept, "
                       "not measured; Ctrl+Z undoes it).%s", carried, carried == 1 ? "" : "s",
                       off > 0 ? ", " : "; ", off, dropped);
  return TRUE;
}

static void
replace_response_cb (GtkNativeDialog *dialog,
                     int              response,
                     DfWindow        *self)
{
  g_autofree char *path = response == GTK_RESPONSE_ACCEPT ? _df_window_chooser_path (dialog) : NULL;
  g_autoptr(GError) error = NULL;

  if (path != NULL && !_df_window_replace_surface_path (self, path, &error))
    _df_window_show_error (self, "The surface was not replaced", error);
  g_object_unref (dialog);
}

void
_df_window_replace_surface_dialog (DfWindow *self)
{
  GtkFileChooserNative *chooser;

  chooser = gtk_file_chooser_native_new ("Replace Surface", GTK_WINDOW (self),
                                         GTK_FILE_CHOOSER_ACTION_OPEN, "_Replace", "_Cancel");
  _df_window_add_filter (GTK_FILE_CHOOSER (chooser), "Surfaces (*.surface)", "*.surface");
  _df_window_start_in_project_folder (self, GTK_FILE_CHOOSER (chooser));
  gtk_native_dialog_set_modal (GTK_NATIVE_DIALOG (chooser), TRUE);
  g_signal_connect (chooser, "response", G_CALLBACK (replace_response_cb), self);
  gtk_native_dialog_show (GTK_NATIVE_DIALOG (chooser));
}

/* ---- save ------------------------------------------------------------------------------ */

typedef struct
{
  DfWindow *self;
  DfThen    then;
} SaveJob;

static gboolean
save_to (DfWindow   *self,
         const char *path)
{
  g_autoptr(GError) error = NULL;
  g_autofree char *base = g_path_get_basename (path);
  double yaw, pitch;

  /* The project keeps the view, so its design record is drawn as the user last saw it. */
  df_surface_view_get_angles (self->view, &yaw, &pitch);
  df_document_set_view (self->document, _df_shading_to_string (self->shading), yaw, pitch);
  if (!df_document_save (self->document, path, &error))
    {
      _df_window_show_error (self, "The project was not saved", error);
      return FALSE;
    }
  _df_window_add_recent (self, path);
  _df_window_status (self, FALSE, "Saved %s.", base);
  if (self->startup.report_events)
    {
      printf ("saved %s\n", path);
      fflush (stdout);
    }
  return TRUE;
}

static void
save_response_cb (GtkNativeDialog *dialog,
                  int              response,
                  SaveJob         *job)
{
  g_autofree char *path = response == GTK_RESPONSE_ACCEPT ? _df_window_chooser_path (dialog) : NULL;

  if (path != NULL)
    {
      /* The project suffix lets the file be recognised when opened again. */
      if (!g_str_has_suffix (path, ".dfproj"))
        {
          char *with = g_strconcat (path, ".dfproj", NULL);
          g_free (path);
          path = with;
        }
      if (save_to (job->self, path) && job->then != NULL)
        job->then (job->self);
    }
  g_object_unref (job->self);
  g_free (job);
  g_object_unref (dialog);
}

static void
save_then (DfWindow *self,
           gboolean  ask_path,
           DfThen    then)
{
  const char *path = df_document_get_path (self->document);
  GtkFileChooserNative *chooser;
  SaveJob *job;

  if (!ask_path && path != NULL && g_str_has_suffix (path, ".dfproj"))
    {
      if (save_to (self, path) && then != NULL)
        then (self);
      return;
    }
  chooser = gtk_file_chooser_native_new ("Save Project", GTK_WINDOW (self),
                                         GTK_FILE_CHOOSER_ACTION_SAVE, "_Save", "_Cancel");
  _df_window_add_filter (GTK_FILE_CHOOSER (chooser), "driftframe projects (*.dfproj)", "*.dfproj");
  if (path != NULL)
    {
      g_autoptr(GFile) file = g_file_new_for_path (path);
      gtk_file_chooser_set_file (GTK_FILE_CHOOSER (chooser), file, NULL);
    }
  else
    {
      g_autofree char *title = df_document_get_title (self->document);
      g_autofree char *name = g_strconcat (title, ".dfproj", NULL);

      _df_window_start_in_project_folder (self, GTK_FILE_CHOOSER (chooser));
      g_strdelimit (name, "/\\", '-');
      gtk_file_chooser_set_current_name (GTK_FILE_CHOOSER (chooser), name);
    }
  gtk_native_dialog_set_modal (GTK_NATIVE_DIALOG (chooser), TRUE);
  job = g_new0 (SaveJob, 1);
  job->self = g_object_ref (self);
  job->then = then;
  g_signal_connect (chooser, "response", G_CALLBACK (save_response_cb), job);
  gtk_native_dialog_show (GTK_NATIVE_DIALOG (chooser));
}

void
_df_window_save (DfWindow *self,
                 gboolean  ask_path)
{
  save_then (self, ask_path, NULL);
}

/* ---- unsaved changes ------------------------------------------------------------------- */

static void
confirm_response_cb (GtkDialog *dialog,
                     int        response,
                     SaveJob   *job)
{
  gtk_window_destroy (GTK_WINDOW (dialog));
  if (response == GTK_RESPONSE_REJECT)
    job->then (job->self);
  else if (response == GTK_RESPONSE_ACCEPT)
    save_then (job->self, FALSE, job->then);
  g_object_unref (job->self);
  g_free (job);
}

void
_df_window_confirm_discard (DfWindow   *self,
                            GCallback   then,
                            const char *verb)
{
  g_autofree char *title = NULL;
  GtkWidget *dialog;
  GtkWidget *discard;
  SaveJob *job;

  if (!df_document_get_modified (self->document))
    {
      ((DfThen) then) (self);
      return;
    }
  title = df_document_get_title (self->document);
  dialog = gtk_message_dialog_new (GTK_WINDOW (self),
                                   GTK_DIALOG_MODAL | GTK_DIALOG_DESTROY_WITH_PARENT,
                                   GTK_MESSAGE_QUESTION, GTK_BUTTONS_NONE,
                                   "Save changes to “%s” before %s?", title, verb);
  gtk_window_set_title (GTK_WINDOW (dialog), "Unsaved changes");
  gtk_message_dialog_format_secondary_text (GTK_MESSAGE_DIALOG (dialog),
                                            "Loops and surface edits made since the last save "
                                            "are lost if you don't save them.");
  gtk_dialog_add_button (GTK_DIALOG (dialog), "_Cancel", GTK_RESPONSE_CANCEL);
  discard = gtk_dialog_add_button (GTK_DIALOG (dialog), "_Discard", GTK_RESPONSE_REJECT);
  gtk_widget_add_css_class (discard, "destructive-action");
  gtk_dialog_add_button (GTK_DIALOG (dialog), "_Save", GTK_RESPONSE_ACCEPT);
  gtk_dialog_set_default_response (GTK_DIALOG (dialog), GTK_RESPONSE_ACCEPT);
  job = g_new0 (SaveJob, 1);
  job->self = g_object_ref (self);
  job->then = (DfThen) then;
  g_signal_connect (dialog, "response", G_CALLBACK (confirm_response_cb), job);
  gtk_window_present (GTK_WINDOW (dialog));
}

/* ---- import ---------------------------------------------------------------------------- */

static void
import_response_cb (GtkNativeDialog *dialog,
                    int              response,
                    DfWindow        *self)
{
  g_autofree char *path = response == GTK_RESPONSE_ACCEPT ? _df_window_chooser_path (dialog) : NULL;
  g_autoptr(GError) error = NULL;

  if (path != NULL)
    {
      DfLoopItem *item = df_document_import_loop_csv (self->document, path, &error);

      if (item == NULL)
        _df_window_show_error (self, "The loop was not imported", error);
      else
        {
          df_loops_panel_select (self->loops_panel, item);
          gtk_stack_set_visible_child_name (self->panel_stack, "loops");
          _df_window_status (self, FALSE, "Imported “%s”, measuring…",
                             df_loop_item_get_name (item));
        }
    }
  g_object_unref (dialog);
}

void
_df_window_import_loop_dialog (DfWindow *self)
{
  GtkFileChooserNative *chooser;

  chooser = gtk_file_chooser_native_new ("Import Loop", GTK_WINDOW (self),
                                         GTK_FILE_CHOOSER_ACTION_OPEN, "_Import", "_Cancel");
  _df_window_add_filter (GTK_FILE_CHOOSER (chooser), "Loop CSV (u,v or x,y,z columns)", "*.csv");
  _df_window_start_in_project_folder (self, GTK_FILE_CHOOSER (chooser));
  gtk_native_dialog_set_modal (GTK_NATIVE_DIALOG (chooser), TRUE);
  g_signal_connect (chooser, "response", G_CALLBACK (import_response_cb), self);
  gtk_native_dialog_show (GTK_NATIVE_DIALOG (chooser));
}

/* ---- export ---------------------------------------------------------------------------- */

/* The loop to export: the selected one, else the only or first measured one. */
static DfLoopItem *
export_item (DfWindow *self)
{
  DfLoopItem *item = df_loops_panel_get_selected (self->loops_panel);
  GListModel *loops = df_document_get_loops (self->document);

  if (item != NULL)
    return item;
  for (guint i = 0; i < g_list_model_get_n_items (loops); i++)
    {
      g_autoptr(DfLoopItem) candidate = g_list_model_get_item (loops, i);

      if (df_loop_item_get_result (candidate) != NULL)
        return candidate;  /* the store keeps it alive */
    }
  return NULL;
}

/* What the exported CSV says about itself; label names the project (it must outlive the
 * context). display: in the display unit (the summary, as `report --units --summary`), else
 * in the surface's (the samples, as `measure --samples`, which --units leaves as they are). */
static df_csv_context
export_csv_context (DfWindow   *self,
                    const char *label,
                    gboolean    display)
{
  const df_surface *surface = df_document_get_surface (self->document);
  DfDisplayUnits du;
  df_csv_context c;

  if (display)
    df_document_get_display_units (self->document, &du);
  else
    df_du_identity (&du, df_document_get_units (self->document));
  c = (df_csv_context) { df_du_length_unit (&du),
                       surface != NULL ? df_surface_get_kind (surface) : DF_SURFACE_GRAPH,
                       label, surface != NULL ? df_surface_normal_side (surface) : NULL };

  return c;
}

gboolean
_df_window_export_samples (DfWindow    *self,
                           const char  *path,
                           GError     **error)
{
  DfLoopItem *item = export_item (self);
  const df_loop_result *result;

  if (item == NULL)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE, "there is no loop to export");
      return FALSE;
    }
  result = df_loop_item_get_result (item);
  if (result == NULL)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE, "loop “%s” is not measured%s%s",
                   df_loop_item_get_name (item),
                   df_loop_item_get_error (item) != NULL ? ": " : " yet",
                   df_loop_item_get_error (item) != NULL ? df_loop_item_get_error (item) : "");
      return FALSE;
    }
  {
    g_autofree char *title = df_document_get_title (self->document);
    df_csv_context csv = export_csv_context (self, title, FALSE);

    /* The samples as the surface defines them (chart points, K per its unit squared), as
     * `measure --samples` writes them whatever --units says. */
    return df_loop_samples_write (path, result, &csv, error);
  }
}

gboolean
_df_window_export_summary (DfWindow    *self,
                           const char  *path,
                           GError     **error)
{
  GListModel *loops = df_document_get_loops (self->document);
  guint n = g_list_model_get_n_items (loops);
  g_autoptr(GPtrArray) names = g_ptr_array_new ();
  g_autoptr(GPtrArray) results = g_ptr_array_new_with_free_func ((GDestroyNotify) df_du_loop_result_free);
  g_autoptr(GPtrArray) failures = g_ptr_array_new ();
  g_autofree char *title = df_document_get_title (self->document);
  df_csv_context csv = export_csv_context (self, title, TRUE);
  guint unmeasured = 0;
  gboolean ok;
  DfDisplayUnits du;

  df_document_get_display_units (self->document, &du);
  /* A loop that is not measured keeps its row, with the reason, so the record is complete. */
  for (guint i = 0; i < n; i++)
    {
      g_autoptr(DfLoopItem) item = g_list_model_get_item (loops, i);
      const df_loop_result *result = df_loop_item_get_result (item);

      g_ptr_array_add (names, (gpointer) df_loop_item_get_name (item));
      g_ptr_array_add (results, result != NULL ? df_du_loop_result_copy (&du, result) : NULL);
      g_ptr_array_add (failures, (gpointer) (result != NULL ? NULL
                                             : df_loop_item_get_error (item) != NULL
                                               ? df_loop_item_get_error (item)
                                               : "not measured yet"));
      unmeasured += result == NULL;
    }
  if (n == 0)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE, "there is no loop to export");
      return FALSE;
    }
  /* mean_K per the curvature unit squared, named as `report --summary` names it. */
  ok = df_loop_summary_write_k (path, (const char *const *) names->pdata,
                                (const df_loop_result *const *) results->pdata,
                                (const char *const *) failures->pdata, n, &csv,
                                du.known && (du.units.curvature != du.units.model
                                             || du.units.length != du.units.model)
                                  ? df_unit_name (du.units.curvature) : NULL, error);
  if (ok && unmeasured > 0)
    _df_window_status (self, TRUE, "Summary written; %u loop%s not measured, listed with the "
                       "reason.", unmeasured, unmeasured == 1 ? " is" : "s are");
  return ok;
}

gboolean
_df_window_export_png (DfWindow    *self,
                       const char  *path,
                       GError     **error)
{
  /* The view with its legend, loop names and caption, at the size chosen in the dialog. */
  return _df_window_export_png_annotated (self, path, self->png_width, self->png_height, error);
}

typedef struct
{
  DfWindow *self;
  char     *what;
} ExportJob;

static void
export_response_cb (GtkNativeDialog *dialog,
                    int              response,
                    ExportJob       *job)
{
  g_autofree char *path = response == GTK_RESPONSE_ACCEPT ? _df_window_chooser_path (dialog) : NULL;

  if (path != NULL)
    {
      g_autofree char *action = g_strdup_printf ("win.export-%s", job->what);
      const char *size = gtk_file_chooser_get_choice (GTK_FILE_CHOOSER (dialog), "size");
      const char *paper = gtk_file_chooser_get_choice (GTK_FILE_CHOOSER (dialog), "paper");

      if (g_str_equal (job->what, "png"))
        {
          int w = 0, h = 0;

          if (size == NULL || sscanf (size, "%dx%d", &w, &h) != 2)
            w = h = 0;
          job->self->png_width = w;
          job->self->png_height = h;
        }
      if (paper != NULL)
        {
          g_free (job->self->report_paper);
          job->self->report_paper = g_strdup (paper);
        }
      gtk_widget_activate_action (GTK_WIDGET (job->self), action, "s", path);
    }
  g_object_unref (job->self);
  g_free (job->what);
  g_free (job);
  g_object_unref (dialog);
}

void
_df_window_export_dialog (DfWindow   *self,
                          const char *what)
{
  GtkFileChooserNative *chooser;
  g_autofree char *title = df_document_get_title (self->document);
  g_autofree char *name = NULL;
  char *dot = strrchr (title, '.');
  ExportJob *job;

  if (dot != NULL && dot != title)
    *dot = '\0';
  chooser = gtk_file_chooser_native_new ("Export", GTK_WINDOW (self),
                                         GTK_FILE_CHOOSER_ACTION_SAVE, "_Export", "_Cancel");
  if (g_str_equal (what, "samples"))
    {
      DfLoopItem *item = export_item (self);

      name = g_strdup_printf ("%s-samples.csv", item != NULL ? df_loop_item_get_name (item)
                                                             : "loop");
      g_strdelimit (name, "/\\", '-');
      gtk_native_dialog_set_title (GTK_NATIVE_DIALOG (chooser), "Export Loop Samples");
      _df_window_add_filter (GTK_FILE_CHOOSER (chooser), "CSV (*.csv)", "*.csv");
    }
  else if (g_str_equal (what, "summary"))
    {
      name = g_strdup_printf ("%s-loops.csv", title);
      gtk_native_dialog_set_title (GTK_NATIVE_DIALOG (chooser), "Export Loops Summary");
      _df_window_add_filter (GTK_FILE_CHOOSER (chooser), "CSV (*.csv)", "*.csv");
    }
  else if (g_str_equal (what, "report"))
    {
      static const char *ids[] = { "a4", "letter", NULL };
      static const char *labels[] = { "A4", "Letter", NULL };

      name = g_strdup_printf ("%s-record.pdf", title);
      gtk_native_dialog_set_title (GTK_NATIVE_DIALOG (chooser), "Export Design Record");
      _df_window_add_filter (GTK_FILE_CHOOSER (chooser), "PDF document (*.pdf)", "*.pdf");
      gtk_file_chooser_add_choice (GTK_FILE_CHOOSER (chooser), "paper", "Paper", ids, labels);
      gtk_file_chooser_set_choice (GTK_FILE_CHOOSER (chooser), "paper",
                                   self->report_paper != NULL ? self->report_paper : "a4");
    }
  else
    {
      static const char *ids[] = { "view", "1280x800", "1920x1200", "3840x2400", NULL };
      static const char *labels[] = { "As shown", "1280 \xc3\x97 800", "1920 \xc3\x97 1200",
                                      "3840 \xc3\x97 2400", NULL };

      name = g_strdup_printf ("%s-view.png", title);
      gtk_native_dialog_set_title (GTK_NATIVE_DIALOG (chooser), "Export View as PNG");
      _df_window_add_filter (GTK_FILE_CHOOSER (chooser), "PNG image (*.png)", "*.png");
      gtk_file_chooser_add_choice (GTK_FILE_CHOOSER (chooser), "size", "Size", ids, labels);
      gtk_file_chooser_set_choice (GTK_FILE_CHOOSER (chooser), "size", "view");
    }
  _df_window_start_in_project_folder (self, GTK_FILE_CHOOSER (chooser));
  gtk_file_chooser_set_current_name (GTK_FILE_CHOOSER (chooser), name);
  gtk_native_dialog_set_modal (GTK_NATIVE_DIALOG (chooser), TRUE);
  job = g_new0 (ExportJob, 1);
  job->self = g_object_ref (self);
  job->what = g_strdup (what);
  g_signal_connect (chooser, "response", G_CALLBACK (export_response_cb), job);
  gtk_native_dialog_show (GTK_NATIVE_DIALOG (chooser));
}

/* ---- one-shot exports from the command line -------------------------------------------- */

static gboolean
run_exports_cb (gpointer user_data)
{
  DfWindow *self = user_data;
  struct { const char *path; const char *action; } jobs[] = {
    { self->startup.export_samples, "win.export-samples" },
    { self->startup.export_summary, "win.export-summary" },
    { self->startup.export_png, "win.export-png" },
    { self->startup.export_report, "win.export-report" },
  };

  self->export_idle_id = 0;
  for (guint i = 0; i < G_N_ELEMENTS (jobs); i++)
    {
      g_autoptr(GError) error = NULL;
      gboolean ok;

      if (jobs[i].path == NULL)
        continue;
      /* Through the same code as the actions the menus use. */
      if (g_str_equal (jobs[i].action, "win.export-samples"))
        ok = _df_window_export_samples (self, jobs[i].path, &error);
      else if (g_str_equal (jobs[i].action, "win.export-summary"))
        ok = _df_window_export_summary (self, jobs[i].path, &error);
      else if (g_str_equal (jobs[i].action, "win.export-report"))
        ok = _df_window_export_report (self, jobs[i].path, self->report_paper, &error);
      else
        ok = _df_window_export_png (self, jobs[i].path, &error);
      if (ok)
        printf ("exported %s\n", jobs[i].path);
      else
        g_printerr ("driftframe: export to %s failed: %s\n", jobs[i].path, error->message);
    }
  fflush (stdout);
  gtk_window_destroy (GTK_WINDOW (self));
  return G_SOURCE_REMOVE;
}

/* Called whenever a mesh or a measurement arrives: once everything the requested exports need
 * is ready, they run (after a short pause so that the view has drawn the latest curves). */
void
_df_window_check_exports (DfWindow *self)
{
  GListModel *loops = df_document_get_loops (self->document);
  gboolean have_measured = FALSE;

  if (!self->exports_pending || self->export_idle_id != 0)
    return;
  if (!gtk_widget_get_realized (GTK_WIDGET (self->view)) || df_surface_view_get_busy (self->view))
    return;
  if (!df_document_all_measured (self->document))
    return;
  for (guint i = 0; i < g_list_model_get_n_items (loops) && !have_measured; i++)
    {
      g_autoptr(DfLoopItem) item = g_list_model_get_item (loops, i);
      have_measured = df_loop_item_get_result (item) != NULL;
    }
  /* Loop exports wait for a loop (for instance one being sketched by a test driver). */
  if ((self->startup.export_samples != NULL || self->startup.export_summary != NULL)
      && !have_measured)
    return;
  self->exports_pending = FALSE;
  self->export_idle_id = g_timeout_add (400, run_exports_cb, self);
}
