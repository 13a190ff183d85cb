/* df-window-data.c: the window's side of surfaces from data: the "From measured data" action
 * (surface panel button, File menu, Ctrl+Shift+P), files dropped on the window (a data file, a
 * loop CSV, a project or surface file), the question a mesh or an x,y,z table raises, the fit
 * on a worker thread (df-data-import.c) handed to the document, the fit summary in the
 * surface panel and the data points drawn over the surface. A failed fit keeps the surface
 * the project had and says why. */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "df-document-units.h"
#include "df-data-import.h"
#include "df-fit-summary.h"
#include "df-format.h"
#include "df-surface-view-points.h"
#include "df-window-data.h"

struct _DfWindowData
{
  GCancellable *fit_cancellable;     /* the fit running, if any */
  GCancellable *points_cancellable;  /* the deviations of an opened project's points */
  char         *points_key;          /* which fit the points in the view belong to */
  float        *points;              /* x, y, z, deviation of the points now drawn */
  gsize         n_points;
  gsize         n_data;
  double        max_abs;
  double        range;               /* the colour scale's end: +/- range */
  gint64        fit_start;           /* when the running fit was asked for (--bench-mesh) */
};

static DfFitSummary *
summary (DfWindow *self)
{
  return DF_FIT_SUMMARY (df_surface_panel_get_fit_summary (self->surface_panel));
}

static void
report (DfWindow   *self,
        const char *format,
        ...) G_GNUC_PRINTF (2, 3);

/* One line for test drivers (--report-events). */
static void
report (DfWindow   *self,
        const char *format,
        ...)
{
  va_list args;

  if (!self->startup.report_events)
    return;
  va_start (args, format);
  vprintf (format, args);
  va_end (args);
  putchar ('\n');
  fflush (stdout);
}

/* What identifies a fit: its file, tolerance, placement and checksum. */
static char *
fit_key (const df_surface_spec *spec)
{
  if (spec == NULL || spec->data_key == NULL)
    return NULL;
  return g_strdup_printf ("%d|%s|%s|%s|%s|%s|%s", (int) spec->kind, spec->data_key,
                          spec->data_path, spec->fit_tolerance_text ? spec->fit_tolerance_text
                                                                    : "",
                          spec->placement_rotate_text ? spec->placement_rotate_text : "",
                          spec->placement_offset_text ? spec->placement_offset_text : "",
                          spec->data_sha256 ? spec->data_sha256 : "");
}

/* ---- the points over the surface ----------------------------------------------------------- */

static void
show_points (DfWindow *self)
{
  DfWindowData *d = self->data;
  DfDisplayUnits du;
  g_autofree float *xyz_rgb = NULL;

  df_document_get_display_units (self->document, &du);
  df_fit_summary_set_deviation (summary (self), d->range, d->range < d->max_abs, d->n_points,
                                d->n_data, &du);
  if (d->n_points == 0 || !df_fit_summary_get_show_points (summary (self)))
    {
      df_surface_view_set_points (self->view, NULL, 0);
      return;
    }
  xyz_rgb = g_malloc_n (d->n_points * 6, sizeof (float));
  for (gsize i = 0; i < d->n_points; i++)
    {
      memcpy (xyz_rgb + 6 * i, d->points + 4 * i, 3 * sizeof (float));
      df_deviation_colour (d->range > 0 ? d->points[4 * i + 3] / d->range : 0,
                           xyz_rgb + 6 * i + 3);
    }
  df_surface_view_set_points (self->view, xyz_rgb, d->n_points);
}

/* Takes the points of fit (stolen) as the ones for key. */
static void
take_points (DfWindow  *self,
             DfDataFit *fit)
{
  DfWindowData *d = self->data;

  g_free (d->points);
  g_free (d->points_key);
  d->points_key = fit_key (fit->spec);
  d->points = g_steal_pointer (&fit->points);
  d->n_points = fit->n_points;
  d->n_data = fit->n_data;
  d->max_abs = fit->max_abs;
  /* Scale the colours to three RMS distances, not to the largest: a few outliers would
   * otherwise leave every other point in the colour of zero (the legend says so). */
  {
    double sum = 0;

    for (gsize i = 0; i < d->n_points; i++)
      sum += (double) d->points[4 * i + 3] * d->points[4 * i + 3];
    d->range = d->n_points > 0 ? MIN (d->max_abs, 3 * sqrt (sum / d->n_points)) : 0;
  }
  if (fit->points_error != NULL)
    _df_window_status (self, TRUE, "The data points cannot be drawn: %s", fit->points_error);
  report (self, "data-points %zu %zu %.9g", d->n_points, d->n_data, d->max_abs);
  show_points (self);
}

static void
points_done_cb (GObject      *source,
                GAsyncResult *result,
                gpointer      user_data)
{
  DfWindow *self = user_data;
  g_autoptr(GError) error = NULL;
  g_autoptr(DfDataFit) fit = df_data_fit_finish (result, &error);
  g_autofree char *key = NULL;
  g_autofree char *fitted = fit != NULL ? fit_key (fit->spec) : NULL;

  /* A job superseded by a newer one (or the window closing) says nothing. */
  if (g_cancellable_is_cancelled (g_task_get_cancellable (G_TASK (result))))
    {
      g_object_unref (self);
      return;
    }
  g_clear_object (&self->data->points_cancellable);
  key = fit_key (df_document_get_spec (self->document));
  if (fit != NULL && g_strcmp0 (key, fitted) == 0)
    take_points (self, fit);
  else if (error != NULL)
    _df_window_status (self, TRUE, "The data points cannot be drawn: %s", error->message);
  g_object_unref (self);
}

void
_df_window_data_sync (DfWindow *self)
{
  DfWindowData *d = self->data;
  const df_surface_spec *spec = df_document_get_spec (self->document);
  const df_surface *surface = df_document_get_surface (self->document);
  g_autofree char *key = fit_key (spec);
  df_fit_info info;
  DfDisplayUnits du;

  if (key == NULL || surface == NULL)
    {
      g_clear_pointer (&d->points, g_free);
      g_clear_pointer (&d->points_key, g_free);
      d->n_points = d->n_data = 0;
      df_surface_view_set_points (self->view, NULL, 0);
      return;
    }
  df_document_get_display_units (self->document, &du);
  df_fit_summary_set_fit (summary (self), spec,
                          df_fit_get_info (df_surface_get_fn (surface), &info) ? &info : NULL,
                          &du);
  if (g_strcmp0 (key, d->points_key) == 0)
    {
      show_points (self);
      return;
    }
  /* Opened from a project or brought back by undo: the document built the surface; the
   * points and their deviations come from a worker. */
  g_cancellable_cancel (d->points_cancellable);
  g_clear_object (&d->points_cancellable);
  d->points_cancellable = g_cancellable_new ();
  df_surface_view_set_points (self->view, NULL, 0);
  df_data_points_async (spec, surface, d->points_cancellable, points_done_cb,
                        g_object_ref (self));
}

/* ---- the display mesh benchmark ------------------------------------------------------------ */

#define BENCH_MESH_RUNS 7

typedef struct
{
  DfWindow *self;
  gint64    start;
  GArray   *ms;       /* of double */
  gulong    handler;
} MeshBench;

static int
cmp_double (gconstpointer a,
            gconstpointer b)
{
  double x = *(const double *) a, y = *(const double *) b;

  return (x > y) - (x < y);
}

static gboolean bench_next (gpointer user_data);

static void
bench_mesh_ready_cb (DfSurfaceView *view,
                     MeshBench     *bench)
{
  double ms = (g_get_monotonic_time () - bench->start) / 1000.0;

  /* Only the builds this benchmark asked for. */
  if (bench->start == 0)
    return;
  bench->start = 0;
  g_array_append_val (bench->ms, ms);
  /* Let the frame that shows the mesh go by before the next request. */
  g_timeout_add (100, bench_next, bench);
}

static gboolean
bench_next (gpointer user_data)
{
  MeshBench *bench = user_data;
  DfWindow *self = bench->self;

  if (bench->ms->len < BENCH_MESH_RUNS)
    {
      bench->start = g_get_monotonic_time ();
      /* The request the window makes on every surface change: a copy of the surface to the
       * view, the mesh built on its worker thread and installed on this one. */
      df_surface_view_set_surface (self->view, df_document_get_surface (self->document));
      return G_SOURCE_REMOVE;
    }
  g_signal_handler_disconnect (self->view, bench->handler);
  g_array_sort (bench->ms, cmp_double);
  printf ("display mesh: median %.1f ms, min %.1f ms, max %.1f ms over %u builds (request to "
          "mesh in place)\n", g_array_index (bench->ms, double, bench->ms->len / 2),
          g_array_index (bench->ms, double, 0),
          g_array_index (bench->ms, double, bench->ms->len - 1), bench->ms->len);
  fflush (stdout);
  g_array_unref (bench->ms);
  g_free (bench);
  g_application_quit (g_application_get_default ());
  return G_SOURCE_REMOVE;
}

void
_df_window_data_bench_mesh (DfWindow *self)
{
  MeshBench *bench = g_new0 (MeshBench, 1);

  bench->self = self;
  bench->ms = g_array_new (FALSE, FALSE, sizeof (double));
  bench->handler = g_signal_connect (self->view, "mesh-ready",
                                     G_CALLBACK (bench_mesh_ready_cb), bench);
  /* After the mesh of the surface just set is in place. */
  g_timeout_add (1500, bench_next, bench);
}

/* ---- fitting --------------------------------------------------------------------------- */

static void
fit_done_cb (GObject      *source,
             GAsyncResult *result,
             gpointer      user_data)
{
  DfWindow *self = user_data;
  DfWindowData *d = self->data;
  g_autoptr(GError) error = NULL;
  g_autoptr(DfDataFit) fit = df_data_fit_finish (result, &error);

  if (g_cancellable_is_cancelled (g_task_get_cancellable (G_TASK (result))))
    {
      g_object_unref (self);
      return;
    }
  g_clear_object (&d->fit_cancellable);
  df_fit_summary_set_busy (summary (self), FALSE);
  if (fit != NULL)
    {
      df_surface *surface = g_steal_pointer (&fit->surface);
      g_autofree char *base = g_path_get_basename (fit->spec->data_path);

      /* Points first, so the sync that set_spec_built sets off finds them current. */
      take_points (self, fit);
      if (!df_document_set_spec_built (self->document, fit->spec, surface, &error))
        goto failed;
      df_fit_summary_set_error (summary (self), NULL);
      df_surface_panel_show_error (self->surface_panel, NULL);
      gtk_stack_set_visible_child_name (self->panel_stack, "surface");
      if (fit->has_info)
        {
          DfDisplayUnits du;
          g_autofree char *rms = NULL, *max = NULL;

          df_document_get_display_units (self->document, &du);
          rms = df_du_format_length (&du, fit->info.rms);
          max = df_du_format_length (&du, fit->info.max);

          _df_window_status (self, FALSE, "Fitted %s: %zu points, RMS distance %s, largest %s.",
                             base, fit->info.points, rms, max);
          report (self, "data-fitted %s %zu %.9g %.9g %.9g %.9g %.9g %.9g %s", base,
                  fit->info.points, fit->info.rms, fit->info.max, fit->info.max_at[0],
                  fit->info.max_at[1], fit->info.max_at[2], fit->info.tolerance,
                  fit->info.chosen ? "chosen" : "given");
        }
      else
        _df_window_status (self, FALSE, "Fitted %s.", base);
      if (self->startup.bench_mesh)
        {
          printf ("fit in place: %.0f ms from the request (reading, fitting, %zu points' "
                  "deviations, carrying the loops)\n",
                  (g_get_monotonic_time () - d->fit_start) / 1000.0, fit->n_points);
          _df_window_data_bench_mesh (self);
        }
      g_object_unref (self);
      return;
    }
failed:
  if (self->startup.bench_mesh)
    {
      g_printerr ("driftframe: --bench-mesh: %s\n", error->message);
      g_application_quit (g_application_get_default ());
    }
  /* The document still has the surface it had: say why, where the user looks. */
  df_fit_summary_set_error (summary (self), error->message);
  df_surface_panel_show_error (self->surface_panel, error);
  _df_window_status (self, TRUE, "The data were not used (the surface is unchanged): %s",
                     error->message);
  report (self, "data-failed %s", error->message);
  _df_window_data_sync (self);
  g_object_unref (self);
}

void
_df_window_data_fit (DfWindow              *self,
                     const df_surface_spec *spec)
{
  DfWindowData *d = self->data;
  g_autofree char *base = g_path_get_basename (spec->data_path);

  g_cancellable_cancel (d->fit_cancellable);
  g_clear_object (&d->fit_cancellable);
  d->fit_cancellable = g_cancellable_new ();
  df_fit_summary_set_busy (summary (self), TRUE);
  d->fit_start = g_get_monotonic_time ();
  _df_window_status (self, FALSE, "Fitting %s…", base);
  df_data_fit_async (spec, d->fit_cancellable, fit_done_cb, g_object_ref (self));
}

/* A unit the data reader takes (units= of a data surface is checked against df-units). */
static const char *
data_units (DfWindow *self)
{
  static const char *const known[] = { "mm", "cm", "m", "in" };
  const char *units = df_document_get_units (self->document);

  for (guint i = 0; i < G_N_ELEMENTS (known); i++)
    if (g_strcmp0 (units, known[i]) == 0)
      return known[i];
  return "mm";
}

static void
fit_new (DfWindow        *self,
         const char      *path,
         df_surface_type  kind)
{
  g_autoptr(df_surface_spec) spec = df_surface_spec_new_data (kind, path, NULL);

  g_free (spec->units);
  spec->units = g_strdup (data_units (self));
  _df_window_data_fit (self, spec);
}

static void
tolerance_changed_cb (DfFitSummary *fit_summary,
                      const char   *text,
                      DfWindow     *self)
{
  const df_surface_spec *current = df_document_get_spec (self->document);
  g_autoptr(df_surface_spec) spec = NULL;

  if (current == NULL || current->data_key == NULL)
    return;
  spec = df_surface_spec_copy (current);
  g_free (spec->fit_tolerance_text);
  spec->fit_tolerance_text = g_strdup (text);
  _df_window_data_fit (self, spec);
}

static void
show_points_cb (DfFitSummary *fit_summary,
                GParamSpec   *pspec,
                DfWindow     *self)
{
  show_points (self);
}

/* ---- what a file is, and the questions ------------------------------------------------------ */

typedef struct
{
  DfWindow *self;
  char     *path;
  gboolean  mesh;    /* a mesh: graph or revolution; else x,y,z: heights or loop */
} Question;

static void
question_free (Question *q)
{
  g_object_unref (q->self);
  g_free (q->path);
  g_free (q);
}

enum
{
  ANSWER_GRAPH = 1,
  ANSWER_REVOLUTION,
  ANSWER_LOOP
};

static void
import_loop (DfWindow   *self,
             const char *path)
{
  g_autoptr(GError) error = NULL;
  DfLoopItem *item = df_document_import_loop_csv (self->document, path, &error);

  if (item == NULL)
    {
      _df_window_show_error (self, "The loop was not imported", error);
      return;
    }
  df_loops_panel_select (self->loops_panel, item);
  gtk_stack_set_visible_child_name (self->panel_stack, "loops");
  _df_window_status (self, FALSE, "Imported “%s”, measuring…", df_loop_item_get_name (item));
}

static void
question_response_cb (GtkDialog *dialog,
                      int        response,
                      Question  *q)
{
  gtk_window_destroy (GTK_WINDOW (dialog));
  if (response == ANSWER_GRAPH)
    fit_new (q->self, q->path, DF_SURFACE_GRAPH);
  else if (response == ANSWER_REVOLUTION)
    fit_new (q->self, q->path, DF_SURFACE_REVOLUTION);
  else if (response == ANSWER_LOOP)
    import_loop (q->self, q->path);
  question_free (q);
}

static gboolean
present_later_cb (gpointer user_data)
{
  gtk_window_present (GTK_WINDOW (user_data));
  g_object_unref (user_data);
  return G_SOURCE_REMOVE;
}

static void
present_after_map (GtkWidget *dialog)
{
  g_timeout_add (300, present_later_cb, g_object_ref (dialog));
}

static void
ask (DfWindow   *self,
     const char *path,
     gboolean    mesh)
{
  g_autofree char *base = g_path_get_basename (path);
  Question *q = g_new0 (Question, 1);
  GtkWidget *dialog;

  q->self = g_object_ref (self);
  q->path = g_strdup (path);
  q->mesh = mesh;
  dialog = gtk_message_dialog_new (GTK_WINDOW (self),
                                   GTK_DIALOG_MODAL | GTK_DIALOG_DESTROY_WITH_PARENT,
                                   GTK_MESSAGE_QUESTION, GTK_BUTTONS_NONE,
                                   mesh ? "How should “%s” be fitted?"
                                        : "What does “%s” hold?", base);
  gtk_window_set_title (GTK_WINDOW (dialog), mesh ? "Fit the mesh" : "Points in space");
  gtk_message_dialog_format_secondary_text (
    GTK_MESSAGE_DIALOG (dialog), "%s",
    mesh ? "As heights: the part must be a graph over the xy plane (no two heights at one x, "
           "y). Turned about z: the vertices' distance from the z axis and height are fitted "
           "as a profile, and the fit reports how far the part departs from rotational "
           "symmetry."
         : "Heights: a surface fitted to the points, a grid or scattered (it replaces the "
           "current surface; loops are carried over by their places in space). A loop: the "
           "points placed on the current surface.");
  gtk_dialog_add_button (GTK_DIALOG (dialog), "_Cancel", GTK_RESPONSE_CANCEL);
  if (mesh)
    {
      gtk_dialog_add_button (GTK_DIALOG (dialog), "_Turned About z", ANSWER_REVOLUTION);
      gtk_dialog_add_button (GTK_DIALOG (dialog), "As _Heights", ANSWER_GRAPH);
    }
  else
    {
      gtk_dialog_add_button (GTK_DIALOG (dialog), "A _Loop", ANSWER_LOOP);
      gtk_dialog_add_button (GTK_DIALOG (dialog), "_Heights", ANSWER_GRAPH);
    }
  gtk_dialog_set_default_response (GTK_DIALOG (dialog), mesh ? ANSWER_GRAPH : ANSWER_GRAPH);
  g_signal_connect (dialog, "response", G_CALLBACK (question_response_cb), q);
  /* Asked at start-up (a mesh on the command line), before the window is on screen: a dialog
   * shown now would be stacked behind it. */
  if (gtk_widget_get_mapped (GTK_WIDGET (self)))
    gtk_window_present (GTK_WINDOW (dialog));
  else
    g_signal_connect_object (self, "map", G_CALLBACK (present_after_map), dialog,
                             G_CONNECT_SWAPPED);
}

static void
open_dropped_confirmed (DfWindow *self)
{
  const char *path = g_object_get_data (G_OBJECT (self), "df-dropped-path");
  g_autoptr(GError) error = NULL;

  if (path != NULL && !_df_window_open_path (self, path, &error))
    _df_window_show_error (self, "Cannot open the file", error);
}

gboolean
_df_window_data_take_file (DfWindow   *self,
                           const char *path,
                           gboolean    as_data)
{
  g_autoptr(GError) error = NULL;

  switch (df_data_file_sniff (path, &error))
    {
    case DF_DATA_FILE_PROJECT:
    case DF_DATA_FILE_SURFACE:
      g_object_set_data_full (G_OBJECT (self), "df-dropped-path", g_strdup (path), g_free);
      _df_window_confirm_discard (self, G_CALLBACK (open_dropped_confirmed),
                                  "opening another file");
      return TRUE;
    case DF_DATA_FILE_PROFILE:
      fit_new (self, path, DF_SURFACE_REVOLUTION);
      return TRUE;
    case DF_DATA_FILE_XYZ:
      if (as_data)
        fit_new (self, path, DF_SURFACE_GRAPH);
      else
        ask (self, path, FALSE);
      return TRUE;
    case DF_DATA_FILE_LOOP_UV:
      if (as_data)
        {
          g_set_error (&error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: a u,v table is a loop, "
                       "not measured data (Import Loop CSV takes it)", path);
          break;
        }
      import_loop (self, path);
      return TRUE;
    case DF_DATA_FILE_MESH:
      ask (self, path, TRUE);
      return TRUE;
    case DF_DATA_FILE_UNKNOWN:
    default:
      break;
    }
  df_fit_summary_set_error (summary (self), NULL);
  _df_window_status (self, TRUE, "The file was not used (the surface is unchanged): %s",
                     error->message);
  report (self, "data-failed %s", error->message);
  _df_window_show_error (self, "The file was not used", error);
  return FALSE;
}

/* ---- the dialog, the drop and the action ------------------------------------------------------ */

static void
import_response_cb (GtkNativeDialog *dialog,
                    int              response,
                    DfWindow        *self)
{
  g_autoptr(GFile) file = response == GTK_RESPONSE_ACCEPT
                          ? gtk_file_chooser_get_file (GTK_FILE_CHOOSER (dialog)) : NULL;
  g_autofree char *path = file != NULL ? g_file_get_path (file) : NULL;

  if (path != NULL)
    _df_window_data_take_file (self, path, TRUE);
  g_object_unref (dialog);
}

static void
import_data_action (GtkWidget  *widget,
                    const char *action_name,
                    GVariant   *parameter)
{
  DfWindow *self = DF_WINDOW (widget);
  GtkFileChooserNative *chooser;
  g_autoptr(GtkFileFilter) all = gtk_file_filter_new ();

  chooser = gtk_file_chooser_native_new ("Surface from Measured Data", GTK_WINDOW (self),
                                         GTK_FILE_CHOOSER_ACTION_OPEN, "_Fit", "_Cancel");
  gtk_file_filter_set_name (all, "Measured points (CSV: r,z or x,y,z) and meshes (STL, OBJ, PLY)");
  gtk_file_filter_add_pattern (all, "*.csv");
  gtk_file_filter_add_pattern (all, "*.[sS][tT][lL]");
  gtk_file_filter_add_pattern (all, "*.[oO][bB][jJ]");
  gtk_file_filter_add_pattern (all, "*.[pP][lL][yY]");
  gtk_file_chooser_add_filter (GTK_FILE_CHOOSER (chooser), all);
  /* The project's folder, else the last project's or the working folder: never "Recent". */
  _df_window_start_in_project_folder (self, GTK_FILE_CHOOSER (chooser));
  gtk_native_dialog_set_modal (GTK_NATIVE_DIALOG (chooser), TRUE);
  g_signal_connect (chooser, "response", G_CALLBACK (import_response_cb), self);
  gtk_native_dialog_show (GTK_NATIVE_DIALOG (chooser));
}

static gboolean
drop_cb (GtkDropTarget *target,
         const GValue  *value,
         double         x,
         double         y,
         DfWindow      *self)
{
  GSList *files = g_value_get_boxed (value);
  g_autofree char *path = NULL;

  if (files == NULL)
    return FALSE;
  if (files->next != NULL)
    {
      _df_window_status (self, TRUE, "Drop one file at a time (%u were dropped).",
                         g_slist_length (files));
      return FALSE;
    }
  path = g_file_get_path (files->data);
  if (path == NULL)
    {
      _df_window_status (self, TRUE, "Only local files can be dropped here.");
      return FALSE;
    }
  return _df_window_data_take_file (self, path, FALSE);
}

void
_df_window_data_class_init (GtkWidgetClass *widget_class)
{
  gtk_widget_class_install_action (widget_class, "win.import-data", NULL, import_data_action);
  /* Ctrl+Shift+P ("points"): Ctrl+Shift+I, the natural pair of Ctrl+I (import a loop), is
   * GTK's inspector key and never reaches the window, and Ctrl+Shift+M is the developability
   * map's. */
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_p,
                                       GDK_CONTROL_MASK | GDK_SHIFT_MASK, "win.import-data",
                                       NULL);
}

void
_df_window_data_init (DfWindow *self)
{
  GtkDropTarget *target = gtk_drop_target_new (GDK_TYPE_FILE_LIST, GDK_ACTION_COPY);

  self->data = g_new0 (DfWindowData, 1);
  g_signal_connect (target, "drop", G_CALLBACK (drop_cb), self);
  gtk_widget_add_controller (GTK_WIDGET (self), GTK_EVENT_CONTROLLER (target));
  g_signal_connect (summary (self), "tolerance-changed", G_CALLBACK (tolerance_changed_cb),
                    self);
  g_signal_connect (summary (self), "notify::show-points", G_CALLBACK (show_points_cb), self);
}

void
_df_window_data_finalize (DfWindow *self)
{
  DfWindowData *d = self->data;

  if (d == NULL)
    return;
  g_cancellable_cancel (d->fit_cancellable);
  g_cancellable_cancel (d->points_cancellable);
  g_clear_object (&d->fit_cancellable);
  g_clear_object (&d->points_cancellable);
  g_free (d->points_key);
  g_free (d->points);
  g_clear_pointer (&self->data, g_free);
}
