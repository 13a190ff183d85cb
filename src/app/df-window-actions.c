/* df-window-actions.c: the window's actions (installed on the class, named in the .ui files)
 * and the one place that enables or disables them, _df_window_actions_update(). Handlers only
 * dispatch to the files, tools and document; logic lives there. */
#include <string.h>

#include "df-window-private.h"

static const char *const tool_names[] = { "look", "sketch", "probe", "geodesic", "paths" };
static const char *const shading_names[] = { "plain", "gaussian", "mean" };
static const char *const view_names[] = { "iso", "top", "front", "side" };

const char *
_df_tool_to_string (DfTool tool)
{
  return tool_names[CLAMP ((int) tool, 0, (int) G_N_ELEMENTS (tool_names) - 1)];
}

gboolean
_df_tool_from_string (const char *name,
                      DfTool     *tool)
{
  for (guint i = 0; name != NULL && i < G_N_ELEMENTS (tool_names); i++)
    if (g_str_equal (name, tool_names[i]))
      {
        *tool = (DfTool) i;
        return TRUE;
      }
  return FALSE;
}

const char *
_df_shading_to_string (DfShading shading)
{
  return shading_names[CLAMP ((int) shading, 0, (int) G_N_ELEMENTS (shading_names) - 1)];
}

gboolean
_df_shading_from_string (const char *name,
                         DfShading  *shading)
{
  for (guint i = 0; name != NULL && i < G_N_ELEMENTS (shading_names); i++)
    if (g_str_equal (name, shading_names[i]))
      {
        *shading = (DfShading) i;
        return TRUE;
      }
  return FALSE;
}

gboolean
_df_view_from_string (const char     *name,
                      DfStandardView *view)
{
  for (guint i = 0; name != NULL && i < G_N_ELEMENTS (view_names); i++)
    if (g_str_equal (name, view_names[i]))
      {
        *view = (DfStandardView) i;
        return TRUE;
      }
  return FALSE;
}

static void
new_project_confirmed (DfWindow *self)
{
  g_autoptr(GError) error = NULL;
  df_surface_spec *spec = df_surface_spec_new_preset ("sphere", &error);

  if (spec == NULL || !df_document_set_project (self->document, df_project_new (spec), NULL,
                                                &error))
    _df_window_show_error (self, "Cannot start a new project", error);
  else
    {
      gtk_stack_set_visible_child_name (self->panel_stack, "surface");
      df_document_set_display_name (self->document, "New project");
      _df_window_status (self, FALSE, "New project: pick a surface in the Surface panel.");
    }
}

static void
new_project_action (GtkWidget  *widget,
                    const char *name,
                    GVariant   *parameter)
{
  _df_window_confirm_discard (DF_WINDOW (widget), G_CALLBACK (new_project_confirmed),
                              "starting a new project");
}

static void
open_action (GtkWidget  *widget,
             const char *name,
             GVariant   *parameter)
{
  _df_window_open_dialog (DF_WINDOW (widget), FALSE);
}

static void
type_values_action (GtkWidget  *widget,
                    const char *name,
                    GVariant   *parameter)
{
  _df_window_focus_typed (DF_WINDOW (widget));
}

static void
replace_surface_action (GtkWidget  *widget,
                        const char *name,
                        GVariant   *parameter)
{
  _df_window_replace_surface_dialog (DF_WINDOW (widget));
}

static void
open_surface_action (GtkWidget  *widget,
                     const char *name,
                     GVariant   *parameter)
{
  _df_window_open_dialog (DF_WINDOW (widget), TRUE);
}

static void
open_recent_confirmed (DfWindow *self)
{
  g_autoptr(GError) error = NULL;
  g_autofree char *path = g_object_steal_data (G_OBJECT (self), "df-pending-recent");

  if (path != NULL && !_df_window_open_path (self, path, &error))
    _df_window_show_error (self, "Cannot open the project", error);
}

static void
open_recent_action (GtkWidget  *widget,
                    const char *name,
                    GVariant   *parameter)
{
  /* Kept on the window until the unsaved-changes question is answered. */
  g_object_set_data_full (G_OBJECT (widget), "df-pending-recent",
                          g_variant_dup_string (parameter, NULL), g_free);
  _df_window_confirm_discard (DF_WINDOW (widget), G_CALLBACK (open_recent_confirmed),
                              "opening another project");
}

/* The demo project: installed examples first, then the source tree (running uninstalled). */
static char *
find_demo (void)
{
  const char *const dirs[] = { DF_EXAMPLES_INSTALLED, DF_EXAMPLES_SOURCE };

  for (guint i = 0; i < G_N_ELEMENTS (dirs); i++)
    {
      g_autofree char *path = g_build_filename (dirs[i], "demo.dfproj", NULL);

      if (g_file_test (path, G_FILE_TEST_IS_REGULAR))
        return g_steal_pointer (&path);
    }
  return NULL;
}

static void
open_demo_confirmed (DfWindow *self)
{
  g_autoptr(GError) error = NULL;
  g_autofree char *path = find_demo ();
  df_project *project;

  if (path == NULL)
    {
      g_set_error (&error, DF_IO_ERROR, DF_IO_ERROR_FILE,
                   "demo.dfproj is in neither %s nor %s", DF_EXAMPLES_INSTALLED,
                   DF_EXAMPLES_SOURCE);
      _df_window_show_error (self, "Cannot find the demo project", error);
      return;
    }
  /* Opened as an unsaved copy, so that Save asks where instead of writing into the installed
   * examples. */
  project = df_project_load (path, &error);
  if (project == NULL || !df_document_set_project (self->document, project, NULL, &error))
    {
      _df_window_show_error (self, "Cannot open the demo project", error);
      return;
    }
  /* The name only: the title bar's subtitle and the dialogs say that it has no file yet. */
  df_document_set_display_name (self->document, "Lamp-shade demo");
  gtk_stack_set_visible_child_name (self->panel_stack, "loops");
  _df_window_status (self, FALSE, "Demo: a lamp-shade mould with three plies (from %s).", path);
}

static void
open_demo_action (GtkWidget  *widget,
                  const char *name,
                  GVariant   *parameter)
{
  _df_window_confirm_discard (DF_WINDOW (widget), G_CALLBACK (open_demo_confirmed),
                              "opening the demo");
}

static void
save_action (GtkWidget  *widget,
             const char *name,
             GVariant   *parameter)
{
  _df_window_save (DF_WINDOW (widget), FALSE);
}

static void
save_as_action (GtkWidget  *widget,
                const char *name,
                GVariant   *parameter)
{
  _df_window_save (DF_WINDOW (widget), TRUE);
}

static void
import_loop_action (GtkWidget  *widget,
                    const char *name,
                    GVariant   *parameter)
{
  _df_window_import_loop_dialog (DF_WINDOW (widget));
}

/* win.export-samples(s), win.export-summary(s), win.export-png(s): write to the given path
 * without a dialog (the command line's one-shot exports and the end-to-end test use these). */
static void
export_to_path_action (GtkWidget  *widget,
                       const char *name,
                       GVariant   *parameter)
{
  DfWindow *self = DF_WINDOW (widget);
  g_autoptr(GError) error = NULL;
  const char *path = g_variant_get_string (parameter, NULL);
  gboolean ok;

  if (g_str_equal (name, "win.export-samples"))
    ok = _df_window_export_samples (self, path, &error);
  else if (g_str_equal (name, "win.export-summary"))
    ok = _df_window_export_summary (self, path, &error);
  else if (g_str_equal (name, "win.export-report"))
    ok = _df_window_export_report (self, path, self->report_paper, &error);
  else
    ok = _df_window_export_png (self, path, &error);
  if (!ok)
    _df_window_show_error (self, "Export failed", error);
  else
    _df_window_status (self, FALSE, "Exported %s.", path);
}

static void
edit_record_action (GtkWidget  *widget,
                    const char *name,
                    GVariant   *parameter)
{
  _df_window_edit_record (DF_WINDOW (widget));
}

static void
export_dialog_action (GtkWidget  *widget,
                      const char *name,
                      GVariant   *parameter)
{
  /* "win.export-samples-dialog" -> "samples" */
  g_autofree char *what = g_strdup (name + strlen ("win.export-"));

  *strrchr (what, '-') = '\0';
  _df_window_export_dialog (DF_WINDOW (widget), what);
}

static void
undo_action (GtkWidget  *widget,
             const char *name,
             GVariant   *parameter)
{
  DfWindow *self = DF_WINDOW (widget);
  gboolean undo = g_str_equal (name, "win.undo");
  const char *label;

  label = undo ? df_document_undo (self->document) : df_document_redo (self->document);
  if (label != NULL)
    _df_window_status (self, FALSE, "%s: %s.", undo ? "Undone" : "Redone", label);
}

static void
standard_view_action (GtkWidget  *widget,
                      const char *name,
                      GVariant   *parameter)
{
  DfWindow *self = DF_WINDOW (widget);
  DfStandardView view;

  if (_df_view_from_string (g_variant_get_string (parameter, NULL), &view))
    df_surface_view_set_standard_view (self->view, view);
}

static void
fit_all_action (GtkWidget  *widget,
                const char *name,
                GVariant   *parameter)
{
  df_surface_view_fit_all (DF_WINDOW (widget)->view);
}

static void
delete_loop_action (GtkWidget  *widget,
                    const char *name,
                    GVariant   *parameter)
{
  DfWindow *self = DF_WINDOW (widget);
  DfLoopItem *item = df_loops_panel_get_selected (self->loops_panel);
  g_autofree char *loop_name = NULL;

  if (item == NULL)
    return;
  loop_name = g_strdup (df_loop_item_get_name (item));
  df_document_remove_loop (self->document, item);
  _df_window_status (self, FALSE, "Deleted “%s” (Ctrl+Z brings it back).", loop_name);
}

static void
rename_loop_action (GtkWidget  *widget,
                    const char *name,
                    GVariant   *parameter)
{
  DfWindow *self = DF_WINDOW (widget);

  gtk_stack_set_visible_child_name (self->panel_stack, "loops");
  df_loops_panel_start_rename (self->loops_panel);
}

static void
import_path_action (GtkWidget  *widget,
                    const char *name,
                    GVariant   *parameter)
{
  _df_window_import_path_dialog (DF_WINDOW (widget), g_str_equal (name, "win.import-path-b"));
}

static void
type_loop_action (GtkWidget  *widget,
                  const char *name,
                  GVariant   *parameter)
{
  _df_window_type_loop_dialog (DF_WINDOW (widget));
}

static void
clear_geodesic_action (GtkWidget  *widget,
                       const char *name,
                       GVariant   *parameter)
{
  DfWindow *self = DF_WINDOW (widget);

  df_document_clear_geodesic (self->document);
  _df_window_show_extras (self);
}

static void
clear_paths_action (GtkWidget  *widget,
                    const char *name,
                    GVariant   *parameter)
{
  DfWindow *self = DF_WINDOW (widget);

  df_document_clear_paths (self->document);
  _df_window_show_extras (self);
}

void
_df_window_actions_class_init (GtkWidgetClass *widget_class)
{
  gtk_widget_class_install_action (widget_class, "win.new-project", NULL, new_project_action);
  gtk_widget_class_install_action (widget_class, "win.open", NULL, open_action);
  gtk_widget_class_install_action (widget_class, "win.open-surface", NULL, open_surface_action);
  gtk_widget_class_install_action (widget_class, "win.open-recent", "s", open_recent_action);
  gtk_widget_class_install_action (widget_class, "win.replace-surface", NULL,
                                   replace_surface_action);
  gtk_widget_class_install_action (widget_class, "win.type-values", NULL, type_values_action);
  gtk_widget_class_install_action (widget_class, "win.open-demo", NULL, open_demo_action);
  gtk_widget_class_install_action (widget_class, "win.save", NULL, save_action);
  gtk_widget_class_install_action (widget_class, "win.save-as", NULL, save_as_action);
  gtk_widget_class_install_action (widget_class, "win.import-loop", NULL, import_loop_action);
  gtk_widget_class_install_action (widget_class, "win.type-loop", NULL, type_loop_action);
  gtk_widget_class_install_action (widget_class, "win.import-path-a", NULL, import_path_action);
  gtk_widget_class_install_action (widget_class, "win.import-path-b", NULL, import_path_action);
  gtk_widget_class_install_action (widget_class, "win.export-samples", "s",
                                   export_to_path_action);
  gtk_widget_class_install_action (widget_class, "win.export-summary", "s",
                                   export_to_path_action);
  gtk_widget_class_install_action (widget_class, "win.export-png", "s", export_to_path_action);
  gtk_widget_class_install_action (widget_class, "win.export-report", "s",
                                   export_to_path_action);
  gtk_widget_class_install_action (widget_class, "win.export-report-dialog", NULL,
                                   export_dialog_action);
  gtk_widget_class_install_action (widget_class, "win.edit-record", NULL, edit_record_action);
  gtk_widget_class_install_action (widget_class, "win.export-samples-dialog", NULL,
                                   export_dialog_action);
  gtk_widget_class_install_action (widget_class, "win.export-summary-dialog", NULL,
                                   export_dialog_action);
  gtk_widget_class_install_action (widget_class, "win.export-png-dialog", NULL,
                                   export_dialog_action);
  gtk_widget_class_install_action (widget_class, "win.undo", NULL, undo_action);
  gtk_widget_class_install_action (widget_class, "win.redo", NULL, undo_action);
  gtk_widget_class_install_action (widget_class, "win.standard-view", "s", standard_view_action);
  gtk_widget_class_install_action (widget_class, "win.fit-all", NULL, fit_all_action);
  gtk_widget_class_install_action (widget_class, "win.delete-loop", NULL, delete_loop_action);
  gtk_widget_class_install_action (widget_class, "win.rename-loop", NULL, rename_loop_action);
  gtk_widget_class_install_action (widget_class, "win.clear-geodesic", NULL,
                                   clear_geodesic_action);
  gtk_widget_class_install_action (widget_class, "win.clear-paths", NULL, clear_paths_action);
  gtk_widget_class_install_property_action (widget_class, "win.tool", "tool");
  gtk_widget_class_install_property_action (widget_class, "win.shading", "shading");
  gtk_widget_class_install_property_action (widget_class, "win.iso-lines", "iso-lines");
  gtk_widget_class_install_property_action (widget_class, "win.loop-frames", "loop-frames");

  /* Keys of the window's own commands; app-wide ones are set in df-application.c. */
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_n, GDK_CONTROL_MASK,
                                       "win.new-project", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_o, GDK_CONTROL_MASK, "win.open",
                                       NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_s, GDK_CONTROL_MASK, "win.save",
                                       NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_s,
                                       GDK_CONTROL_MASK | GDK_SHIFT_MASK, "win.save-as", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_r, GDK_CONTROL_MASK,
                                       "win.replace-surface", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_t, GDK_CONTROL_MASK,
                                       "win.type-values", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_i, GDK_CONTROL_MASK,
                                       "win.import-loop", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_T,
                                       GDK_CONTROL_MASK | GDK_SHIFT_MASK, "win.type-loop", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_a, GDK_CONTROL_MASK | GDK_ALT_MASK,
                                       "win.import-path-a", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_b, GDK_CONTROL_MASK | GDK_ALT_MASK,
                                       "win.import-path-b", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_e, GDK_CONTROL_MASK,
                                       "win.export-png-dialog", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_z, GDK_CONTROL_MASK, "win.undo",
                                       NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_z,
                                       GDK_CONTROL_MASK | GDK_SHIFT_MASK, "win.redo", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_Delete, GDK_CONTROL_MASK,
                                       "win.delete-loop", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_F2, 0, "win.rename-loop", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_l, GDK_CONTROL_MASK,
                                       "win.iso-lines", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_0, GDK_ALT_MASK, "win.fit-all",
                                       NULL);
  for (guint i = 0; i < G_N_ELEMENTS (view_names); i++)
    gtk_widget_class_add_binding_action (widget_class, GDK_KEY_1 + i, GDK_ALT_MASK,
                                         "win.standard-view", "s", view_names[i]);
  for (guint i = 0; i < G_N_ELEMENTS (tool_names); i++)
    gtk_widget_class_add_binding_action (widget_class, GDK_KEY_1 + i, GDK_CONTROL_MASK,
                                         "win.tool", "s", tool_names[i]);
}

void
_df_window_actions_update (DfWindow *self)
{
  gboolean has_surface = df_document_get_surface (self->document) != NULL;
  DfLoopItem *selected = df_loops_panel_get_selected (self->loops_panel);
  gboolean measured = selected != NULL && df_loop_item_get_result (selected) != NULL;
  guint n_loops = g_list_model_get_n_items (df_document_get_loops (self->document));

  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.save", has_surface);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.save-as", has_surface);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.import-loop", has_surface);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.type-loop", has_surface);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.import-path-a", has_surface);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.import-path-b", has_surface);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.replace-surface", has_surface);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.export-samples", measured);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.export-samples-dialog", measured);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.export-summary", n_loops > 0);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.export-summary-dialog", n_loops > 0);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.export-png",
                                 gtk_widget_get_realized (GTK_WIDGET (self->view)));
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.export-png-dialog", has_surface);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.export-report",
                                 gtk_widget_get_realized (GTK_WIDGET (self->view)));
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.export-report-dialog", has_surface);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.edit-record", has_surface);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.undo",
                                 df_document_can_undo (self->document));
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.redo",
                                 df_document_can_redo (self->document));
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.delete-loop", selected != NULL);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.rename-loop", selected != NULL);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.loop-frames", selected != NULL);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.fit-all", has_surface);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "win.standard-view", has_surface);
  /* The frames check box shows the selected loop's switch. */
  g_object_notify (G_OBJECT (self), "loop-frames");
}
