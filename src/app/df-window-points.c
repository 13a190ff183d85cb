/* df-window-points.c: points that come from the keyboard or a file instead of the mouse: paths A
 * and B of "Two paths" from CSV files, and a loop from typed rows. Both go through the core's
 * loop CSV reader (df-loop-csv.h), so a file or a typed row that the CLI refuses is refused
 * here with the same message, and one that it takes means the same points. */
#include <math.h>
#include <string.h>

#include "df-document-units.h"
#include "df-project.h"

#include "df-window-private.h"
#include "df-window-tools-private.h"

/* B's ends farther than this fraction of the surface's size from A's are "away from A's ends"
 * and said so (common practice, no source: about a pencil line on a part a metre across). */
#define DF_PATH_END_TOLERANCE 0.01

/* ---- paths from CSV ---------------------------------------------------------------------- */

gboolean
_df_window_far_apart (DfWindow     *self,
                      const double  p[2],
                      const double  q[2])
{
  const df_surface *surface = df_document_get_surface (self->document);
  double a[3], b[3];

  if (!_df_window_surface_point (self, p[0], p[1], a)
      || !_df_window_surface_point (self, q[0], q[1], b))
    return TRUE;
  return sqrt ((a[0] - b[0]) * (a[0] - b[0]) + (a[1] - b[1]) * (a[1] - b[1])
               + (a[2] - b[2]) * (a[2] - b[2]))
         > DF_PATH_END_TOLERANCE * df_surface_size (surface);
}

gboolean
_df_window_import_path (DfWindow    *self,
                        const char  *path,
                        gboolean     path_b,
                        GError     **error)
{
  const df_surface *surface = df_document_get_surface (self->document);
  g_autofree double (*uv)[2] = NULL;
  g_autofree char *base = g_path_get_basename (path);
  gsize n = 0;

  if (surface == NULL)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "There is no surface to put %s on",
                   base);
      return FALSE;
    }
  if (path_b && self->path_a->len < 2)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                   "Path B runs between path A's ends: import or draw path A first");
      return FALSE;
    }
  if (!df_loop_csv_read (path, surface, &uv, &n, error))
    return FALSE;
  if (self->tool != DF_TOOL_PATHS)
    _df_window_set_tool (self, DF_TOOL_PATHS);
  gtk_stack_set_visible_child_name (self->panel_stack, "paths");
  if (!path_b)
    {
      _df_window_clear_paths (self);
      g_array_set_size (self->path_a, 0);
      for (gsize i = 0; i < n; i++)
        {
          /* No pointer positions: B's ends are then checked in space. */
          StrokePoint p = { uv[i][0], uv[i][1], NAN, NAN };
          g_array_append_val (self->path_a, p);
        }
      _df_window_draw_stroke (self, DF_CURVE_PATH_A, self->path_a, colour_path_a, 3.5f);
      df_compare_panel_set_paths (self->compare_panel, self->path_a->len, 0);
      _df_window_paths_set_stage (self, DF_PATHS_WANT_B);
      _df_window_status (self, FALSE, "Path A from %s: %zu points. Now draw or import path B.",
                         base, n);
      return TRUE;
    }
  {
    g_autofree double (*a)[2] = _df_window_stroke_uv (self->path_a);
    gsize n_a = self->path_a->len;
    gboolean far = _df_window_far_apart (self, a[0], uv[0])
                   || _df_window_far_apart (self, a[n_a - 1], uv[n - 1]);

    _df_window_paths_set (self, (const double (*)[2]) a, n_a, (const double (*)[2]) uv, n, far,
                          TRUE);
    _df_window_status (self, far, "Path B from %s: %zu points, comparing…", base, n);
  }
  return TRUE;
}

static void
import_path_response_cb (GtkNativeDialog *dialog,
                         int              response,
                         DfWindow        *self)
{
  g_autofree char *path = response == GTK_RESPONSE_ACCEPT ? _df_window_chooser_path (dialog)
                                                          : NULL;
  gboolean path_b = GPOINTER_TO_INT (g_object_get_data (G_OBJECT (dialog), "df-path-b"));
  g_autoptr(GError) error = NULL;

  if (path != NULL && !_df_window_import_path (self, path, path_b, &error))
    _df_window_show_error (self, path_b ? "Path B was not imported"
                                        : "Path A was not imported", error);
  g_object_unref (dialog);
}

void
_df_window_import_path_dialog (DfWindow *self,
                               gboolean  path_b)
{
  GtkFileChooserNative *chooser;

  chooser = gtk_file_chooser_native_new (path_b ? "Import Path B" : "Import Path A",
                                         GTK_WINDOW (self), GTK_FILE_CHOOSER_ACTION_OPEN,
                                         "_Import", "_Cancel");
  _df_window_add_filter (GTK_FILE_CHOOSER (chooser), "Path CSV (u,v or x,y,z columns)", "*.csv");
  _df_window_start_in_project_folder (self, GTK_FILE_CHOOSER (chooser));
  g_object_set_data (G_OBJECT (chooser), "df-path-b", GINT_TO_POINTER (path_b));
  gtk_native_dialog_set_modal (GTK_NATIVE_DIALOG (chooser), TRUE);
  g_signal_connect (chooser, "response", G_CALLBACK (import_path_response_cb), self);
  gtk_native_dialog_show (GTK_NATIVE_DIALOG (chooser));
}

/* ---- a loop from typed points ------------------------------------------------------------ */

typedef struct
{
  DfWindow    *self;        /* borrowed: the dialog is destroyed with its parent */
  GtkWindow   *dialog;
  GtkTextView *text;
  GtkLabel    *error;
} TypedLoop;

static void
typed_loop_add (TypedLoop *t)
{
  const df_surface *surface = df_document_get_surface (t->self->document);
  GtkTextBuffer *buffer = gtk_text_view_get_buffer (t->text);
  GtkTextIter start, end;
  g_autofree char *text = NULL;
  g_autofree double (*uv)[2] = NULL;
  g_autoptr(GError) error = NULL;
  DfLoopItem *item;
  gsize n = 0;

  gtk_text_buffer_get_bounds (buffer, &start, &end);
  text = gtk_text_buffer_get_text (buffer, &start, &end, FALSE);
  /* The loop CSV rule exactly: the header row says which coordinates follow, and every
   * message names the row as "typed points:LINE". */
  if (surface == NULL || !df_loop_csv_parse (text, "typed points", surface, &uv, &n, &error))
    {
      gtk_label_set_text (t->error, error != NULL ? error->message : "There is no surface.");
      gtk_widget_set_visible (GTK_WIDGET (t->error), TRUE);
      return;
    }
  item = df_document_add_loop (t->self->document, NULL, (const double (*)[2]) uv, n);
  df_loops_panel_select (t->self->loops_panel, item);
  gtk_stack_set_visible_child_name (t->self->panel_stack, "loops");
  _df_window_status (t->self, FALSE, "Added “%s” from %zu typed points, measuring…",
                     df_loop_item_get_name (item), n);
  gtk_window_destroy (t->dialog);
}

static void
typed_loop_clicked_cb (GtkButton *button,
                       TypedLoop *t)
{
  typed_loop_add (t);
}

static gboolean
typed_loop_shortcut_cb (GtkWidget *widget,
                        GVariant  *args,
                        gpointer   user_data)
{
  typed_loop_add (user_data);
  return TRUE;
}

static void
typed_loop_changed_cb (GtkTextBuffer *buffer,
                       TypedLoop     *t)
{
  /* An error is about the text it was given; editing it makes the message stale. */
  gtk_widget_set_visible (GTK_WIDGET (t->error), FALSE);
}

void
_df_window_type_loop_dialog (DfWindow *self)
{
  const df_surface *surface = df_document_get_surface (self->document);
  TypedLoop *t;
  GtkWidget *box, *hint, *scroller, *buttons, *cancel, *add;
  GtkShortcutController *keys;
  g_autofree char *hint_text = NULL;
  gboolean revolution;

  if (surface == NULL)
    return;
  revolution = df_surface_get_kind (surface) == DF_SURFACE_REVOLUTION;
  t = g_new0 (TypedLoop, 1);
  t->self = self;
  t->dialog = GTK_WINDOW (gtk_window_new ());
  gtk_window_set_title (t->dialog, "Loop from Typed Points");
  gtk_window_set_transient_for (t->dialog, GTK_WINDOW (self));
  gtk_window_set_modal (t->dialog, TRUE);
  gtk_window_set_destroy_with_parent (t->dialog, TRUE);
  gtk_window_set_default_size (t->dialog, 420, 360);
  g_object_set_data_full (G_OBJECT (t->dialog), "df-typed-loop", t, g_free);

  box = gtk_box_new (GTK_ORIENTATION_VERTICAL, 8);
  gtk_widget_set_margin_start (box, 12);
  gtk_widget_set_margin_end (box, 12);
  gtk_widget_set_margin_top (box, 12);
  gtk_widget_set_margin_bottom (box, 12);
  {
    DfDisplayUnits du;
    g_autofree char *chart = NULL;

    /* The loop CSV's rule: chart coordinates as the surface defines them, t in its own unit. */
    df_document_get_display_units (self->document, &du);
    chart = revolution ? g_strdup_printf ("t%s%s, then φ in radians",
                                          du.t_unit[0] != '\0' ? " in " : "", du.t_unit)
                       : g_strdup ("x, y");
    hint_text = g_strdup_printf ("One point a row, as in a loop CSV file: first the header "
                                 "“u,v” (chart: %s) or “x,y,z” (a point in space in the "
                                 "surface's own units, %s, placed at its closest surface "
                                 "point), then the rows. The loop closes itself. Ctrl+Return "
                                 "adds it.", chart, df_document_get_units (self->document));
  }
  hint = gtk_label_new (hint_text);
  gtk_label_set_wrap (GTK_LABEL (hint), TRUE);
  gtk_label_set_xalign (GTK_LABEL (hint), 0);
  gtk_widget_add_css_class (hint, "df-hint");
  gtk_box_append (GTK_BOX (box), hint);

  t->text = GTK_TEXT_VIEW (gtk_text_view_new ());
  gtk_text_view_set_monospace (t->text, TRUE);
  gtk_text_buffer_set_text (gtk_text_view_get_buffer (t->text), "u,v\n", -1);
  gtk_accessible_update_property (GTK_ACCESSIBLE (t->text), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                  "Points, one a row", -1);
  g_signal_connect (gtk_text_view_get_buffer (t->text), "changed",
                    G_CALLBACK (typed_loop_changed_cb), t);
  scroller = gtk_scrolled_window_new ();
  gtk_widget_set_vexpand (scroller, TRUE);
  gtk_scrolled_window_set_child (GTK_SCROLLED_WINDOW (scroller), GTK_WIDGET (t->text));
  gtk_box_append (GTK_BOX (box), scroller);

  t->error = GTK_LABEL (gtk_label_new (NULL));
  gtk_label_set_wrap (t->error, TRUE);
  gtk_label_set_xalign (t->error, 0);
  gtk_label_set_selectable (t->error, TRUE);
  gtk_widget_set_focusable (GTK_WIDGET (t->error), FALSE);
  gtk_widget_add_css_class (GTK_WIDGET (t->error), "df-error");
  gtk_widget_set_visible (GTK_WIDGET (t->error), FALSE);
  gtk_box_append (GTK_BOX (box), GTK_WIDGET (t->error));

  buttons = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 8);
  gtk_widget_set_halign (buttons, GTK_ALIGN_END);
  cancel = gtk_button_new_with_mnemonic ("_Cancel");
  g_signal_connect_swapped (cancel, "clicked", G_CALLBACK (gtk_window_destroy), t->dialog);
  add = gtk_button_new_with_mnemonic ("_Add Loop");
  gtk_widget_add_css_class (add, "suggested-action");
  g_signal_connect (add, "clicked", G_CALLBACK (typed_loop_clicked_cb), t);
  gtk_box_append (GTK_BOX (buttons), cancel);
  gtk_box_append (GTK_BOX (buttons), add);
  gtk_box_append (GTK_BOX (box), buttons);
  gtk_window_set_child (t->dialog, box);

  /* Return belongs to the text (a new row); Ctrl+Return adds, Escape cancels. */
  keys = GTK_SHORTCUT_CONTROLLER (gtk_shortcut_controller_new ());
  gtk_shortcut_controller_set_scope (keys, GTK_SHORTCUT_SCOPE_GLOBAL);
  /* Before the text view: in the bubble phase it took Ctrl+Return as a new row. */
  gtk_event_controller_set_propagation_phase (GTK_EVENT_CONTROLLER (keys), GTK_PHASE_CAPTURE);
  gtk_shortcut_controller_add_shortcut (keys, gtk_shortcut_new (
      gtk_keyval_trigger_new (GDK_KEY_Return, GDK_CONTROL_MASK),
      gtk_callback_action_new (typed_loop_shortcut_cb, t, NULL)));
  gtk_shortcut_controller_add_shortcut (keys, gtk_shortcut_new (
      gtk_keyval_trigger_new (GDK_KEY_Escape, 0),
      gtk_named_action_new ("window.close")));
  gtk_widget_add_controller (GTK_WIDGET (t->dialog), GTK_EVENT_CONTROLLER (keys));

  gtk_window_present (t->dialog);
  gtk_widget_grab_focus (GTK_WIDGET (t->text));
  {
    GtkTextIter end;
    GtkTextBuffer *buffer = gtk_text_view_get_buffer (t->text);

    gtk_text_buffer_get_end_iter (buffer, &end);
    gtk_text_buffer_place_cursor (buffer, &end);
  }
}
