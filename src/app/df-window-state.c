/* df-window-state.c: what the window remembers between runs: size, maximized, side panel
 * width, recent files and the last project, in a GLib key file
 * $XDG_CONFIG_HOME/driftframe/state.ini, written atomically. No GSettings schema is needed,
 * so the app runs uninstalled. */
#include <errno.h>

#include "df-window-private.h"

#define DF_RECENT_MAX 8
#define DF_PANEL_WIDTH_DEFAULT 360

static char *
state_path (void)
{
  return g_build_filename (g_get_user_config_dir (), "driftframe", "state.ini", NULL);
}

static void
rebuild_recent_menu (DfWindow *self)
{
  if (self->recent_menu == NULL)
    return;
  g_menu_remove_all (self->recent_menu);
  for (guint i = 0; self->recent != NULL && self->recent[i] != NULL; i++)
    {
      g_autofree char *base = g_path_get_basename (self->recent[i]);
      g_autoptr(GMenuItem) item = g_menu_item_new (base, NULL);

      g_menu_item_set_action_and_target (item, "win.open-recent", "s", self->recent[i]);
      g_menu_append_item (self->recent_menu, item);
    }
  if (self->recent == NULL || self->recent[0] == NULL)
    {
      g_autoptr(GMenuItem) none = g_menu_item_new ("No recent files", "win.no-recent");
      g_menu_append_item (self->recent_menu, none);
    }
}

/* Places the divider once the paned first knows its width (its "max-position" follows its
 * allocation); afterwards resize-end-child = FALSE keeps the side panel's width as the window
 * is resized, and the user's drags move it. */
static void
paned_width_cb (GtkWidget  *paned,
                GParamSpec *pspec,
                DfWindow   *self)
{
  int width = gtk_widget_get_width (paned);

  if (width <= 0 || self->panel_placed)
    return;
  self->panel_placed = TRUE;
  gtk_paned_set_position (self->paned, MAX (width - self->panel_width, 320));
}

void
_df_window_state_load (DfWindow  *self,
                       gboolean  *first_run,
                       char     **last_project)
{
  g_autoptr(GKeyFile) key_file = g_key_file_new ();
  g_autofree char *path = state_path ();
  g_autoptr(GError) error = NULL;
  int width, height, panel;

  *first_run = FALSE;
  *last_project = NULL;
  self->panel_width = DF_PANEL_WIDTH_DEFAULT;

  if (!g_key_file_load_from_file (key_file, path, G_KEY_FILE_NONE, &error))
    {
      if (!g_error_matches (error, G_FILE_ERROR, G_FILE_ERROR_NOENT))
        g_warning ("%s: %s (using defaults)", path, error->message);
      *first_run = TRUE;
    }
  else
    {
      width = g_key_file_get_integer (key_file, "window", "width", NULL);
      height = g_key_file_get_integer (key_file, "window", "height", NULL);
      panel = g_key_file_get_integer (key_file, "window", "panel-width", NULL);
      if (width >= 400 && height >= 300)
        gtk_window_set_default_size (GTK_WINDOW (self), width, height);
      if (g_key_file_get_boolean (key_file, "window", "maximized", NULL))
        gtk_window_maximize (GTK_WINDOW (self));
      if (panel >= 200)
        self->panel_width = panel;
      g_strfreev (self->recent);
      self->recent = g_key_file_get_string_list (key_file, "files", "recent", NULL, NULL);
      *last_project = g_key_file_get_string (key_file, "files", "last-project", NULL);
    }

  /* The side panel keeps its width; the view takes the rest (resize-end-child is off). */
  gtk_window_get_default_size (GTK_WINDOW (self), &width, &height);
  gtk_paned_set_position (self->paned, MAX (width - self->panel_width, 320));

  g_signal_handlers_disconnect_by_data (self->paned, self);
  /* A GtkPaned has no width signal; its "max-position" changes with its allocation. */
  g_signal_connect (self->paned, "notify::max-position", G_CALLBACK (paned_width_cb), self);
  rebuild_recent_menu (self);
}

void
_df_window_state_save (DfWindow *self)
{
  g_autoptr(GKeyFile) key_file = g_key_file_new ();
  g_autofree char *path = state_path ();
  g_autofree char *dir = g_path_get_dirname (path);
  g_autofree char *data = NULL;
  g_autoptr(GError) error = NULL;
  const char *project = df_document_get_path (self->document);
  int width, height;

  /* GTK 4 keeps the default size in step with the user's resizing (and leaves it alone while
   * maximized), so it is the size to restore. */
  gtk_window_get_default_size (GTK_WINDOW (self), &width, &height);
  g_key_file_set_comment (key_file, NULL, NULL,
                          " driftframe window state, rewritten on every close", NULL);
  g_key_file_set_integer (key_file, "window", "width", width);
  g_key_file_set_integer (key_file, "window", "height", height);
  g_key_file_set_boolean (key_file, "window", "maximized",
                          gtk_window_is_maximized (GTK_WINDOW (self)));
  if (gtk_widget_get_width (GTK_WIDGET (self->paned)) > 0)
    self->panel_width = gtk_widget_get_width (GTK_WIDGET (self->paned))
                        - gtk_paned_get_position (self->paned);
  g_key_file_set_integer (key_file, "window", "panel-width", self->panel_width);
  if (self->recent != NULL)
    g_key_file_set_string_list (key_file, "files", "recent",
                                (const char *const *) self->recent,
                                g_strv_length (self->recent));
  if (project != NULL)
    g_key_file_set_string (key_file, "files", "last-project", project);

  data = g_key_file_to_data (key_file, NULL, NULL);
  if (g_mkdir_with_parents (dir, 0755) != 0
      || !df_write_file_atomic (path, data, -1, &error))
    g_warning ("Cannot remember the window state in %s: %s", path,
               error != NULL ? error->message : g_strerror (errno));
}

void
_df_window_add_recent (DfWindow   *self,
                       const char *path)
{
  g_autoptr(GStrvBuilder) builder = g_strv_builder_new ();
  g_autofree char *absolute = g_canonicalize_filename (path, NULL);
  guint n = 1;

  g_strv_builder_add (builder, absolute);
  for (guint i = 0; self->recent != NULL && self->recent[i] != NULL && n < DF_RECENT_MAX; i++)
    if (!g_str_equal (self->recent[i], absolute))
      {
        g_strv_builder_add (builder, self->recent[i]);
        n++;
      }
  g_strfreev (self->recent);
  self->recent = g_strv_builder_end (builder);
  rebuild_recent_menu (self);
}
