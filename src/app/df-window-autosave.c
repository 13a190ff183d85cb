/* df-window-autosave.c: never lose work. A few seconds after every change the open project is
 * written (atomically) to $XDG_STATE_HOME/driftframe/autosave-PID-N.dfproj, with a small key
 * file beside it naming the project's file and title; a clean close removes both. At start,
 * copies left by a process that is gone (a crash, a kill, a power cut) are offered back one by
 * one in a dialog. Only copies files; the project format is the core's. */
#include <errno.h>
#include <glib/gstdio.h>
#include <signal.h>
#include <stdio.h>
#include <sys/types.h>
#include <unistd.h>

#include "df-window-private.h"

/* Long enough that a burst of edits (a slider drag) is written once, short enough that little
 * is lost (common practice, no source). */
#define DF_AUTOSAVE_DELAY_MS 2000

static char *
autosave_dir (void)
{
  return g_build_filename (g_get_user_state_dir (), "driftframe", NULL);
}

static char *
info_path_for (const char *project_path)
{
  g_autofree char *stem = g_strndup (project_path, strlen (project_path) - strlen (".dfproj"));

  return g_strconcat (stem, ".ini", NULL);
}

static void
remove_files (const char *project_path)
{
  g_autofree char *info = info_path_for (project_path);

  g_remove (project_path);
  g_remove (info);
}

static void
report (DfWindow   *self,
        const char *event,
        const char *detail)
{
  if (!self->startup.report_events)
    return;
  printf ("%s %s\n", event, detail != NULL ? detail : "");
  fflush (stdout);
}

static gboolean
autosave_now (gpointer user_data)
{
  DfWindow *self = user_data;
  g_autoptr(df_project) project = NULL;
  g_autoptr(GKeyFile) info = NULL;
  g_autoptr(GError) error = NULL;
  g_autofree char *dir = autosave_dir ();
  g_autofree char *data = NULL;
  g_autofree char *info_data = NULL;
  g_autofree char *info_path = NULL;
  g_autofree char *title = NULL;
  const char *path;

  self->autosave_id = 0;
  /* Nothing unsaved: nothing to recover. */
  if (!df_document_get_modified (self->document)
      || df_document_get_spec (self->document) == NULL)
    {
      remove_files (self->autosave_path);
      return G_SOURCE_REMOVE;
    }

  project = df_document_to_project (self->document);
  data = df_project_to_data (project);
  info = g_key_file_new ();
  path = df_document_get_path (self->document);
  title = df_document_get_title (self->document);
  if (path != NULL)
    g_key_file_set_string (info, "autosave", "path", path);
  g_key_file_set_string (info, "autosave", "title", title);
  if (df_document_get_display_name (self->document) != NULL)
    g_key_file_set_string (info, "autosave", "display-name",
                           df_document_get_display_name (self->document));
  g_key_file_set_integer (info, "autosave", "loops",
                          (int) g_list_model_get_n_items (df_document_get_loops (self->document)));
  info_data = g_key_file_to_data (info, NULL, NULL);
  info_path = info_path_for (self->autosave_path);

  if (g_mkdir_with_parents (dir, 0700) != 0)
    {
      _df_window_status (self, TRUE, "Autosave failed: cannot create %s: %s", dir,
                         g_strerror (errno));
      return G_SOURCE_REMOVE;
    }
  if (!df_write_file_atomic (info_path, info_data, -1, &error)
      || !df_write_file_atomic (self->autosave_path, data, -1, &error))
    {
      _df_window_status (self, TRUE, "Autosave failed: %s", error->message);
      return G_SOURCE_REMOVE;
    }
  report (self, "autosaved", self->autosave_path);
  return G_SOURCE_REMOVE;
}

static void
document_changed_cb (DfDocument *document,
                     DfWindow   *self)
{
  if (self->autosave_path == NULL)
    return;
  g_clear_handle_id (&self->autosave_id, g_source_remove);
  self->autosave_id = g_timeout_add (DF_AUTOSAVE_DELAY_MS, autosave_now, self);
}

void
_df_window_autosave_finish (DfWindow *self)
{
  g_clear_handle_id (&self->autosave_id, g_source_remove);
  if (self->autosave_path != NULL)
    remove_files (self->autosave_path);
  g_clear_pointer (&self->autosave_path, g_free);
}

/* ---- recovery ---------------------------------------------------------------------------- */

/* The process that wrote name ("autosave-PID-N.dfproj") is gone. */
static gboolean
orphaned (const char *name)
{
  long pid;
  char *end = NULL;

  if (!g_str_has_prefix (name, "autosave-") || !g_str_has_suffix (name, ".dfproj"))
    return FALSE;
  pid = strtol (name + strlen ("autosave-"), &end, 10);
  if (end == NULL || *end != '-' || pid <= 0)
    return FALSE;
  if (pid == (long) getpid ())
    return FALSE;
  return kill ((pid_t) pid, 0) != 0 && errno == ESRCH;
}

/* The newest orphaned copy, or NULL. */
static char *
find_orphan (void)
{
  g_autofree char *dir_path = autosave_dir ();
  g_autoptr(GDir) dir = g_dir_open (dir_path, 0, NULL);
  char *best = NULL;
  gint64 best_time = G_MININT64;
  const char *name;

  while (dir != NULL && (name = g_dir_read_name (dir)) != NULL)
    {
      g_autofree char *path = NULL;
      GStatBuf st;

      if (!orphaned (name))
        continue;
      path = g_build_filename (dir_path, name, NULL);
      if (g_stat (path, &st) != 0)
        continue;
      if ((gint64) st.st_mtime > best_time)
        {
          g_free (best);
          best = g_steal_pointer (&path);
          best_time = st.st_mtime;
        }
    }
  return best;
}

typedef struct
{
  DfWindow *self;
  char     *project_path;
  char     *saved_path;    /* the project's own file, or NULL */
  char     *display_name;
} RestoreJob;

static void
restore_job_free (RestoreJob *job)
{
  g_object_unref (job->self);
  g_free (job->project_path);
  g_free (job->saved_path);
  g_free (job->display_name);
  g_free (job);
}

static void offer_next (DfWindow *self);

static void
restore (RestoreJob *job)
{
  DfWindow *self = job->self;
  g_autoptr(GError) error = NULL;
  g_autofree char *data = NULL;

  if (!g_file_get_contents (job->project_path, &data, NULL, &error)
      || !df_document_restore (self->document, data, job->project_path, job->saved_path,
                               job->display_name, &error))
    {
      g_autofree char *aside = g_strconcat (job->project_path, ".unreadable", NULL);

      /* Kept for a person to look at, but not offered again at every start. */
      g_rename (job->project_path, aside);
      g_prefix_error (&error, "The autosaved copy was moved to %s: ", aside);
      _df_window_show_error (self, "The autosaved work could not be restored", error);
      return;
    }
  /* The copy is now this window's unsaved work: write it under this window's name. */
  remove_files (job->project_path);
  df_surface_view_fit_next_mesh (self->view);
  autosave_now (self);
  _df_window_status (self, FALSE, "Restored the unsaved work on “%s”. Save it to keep it.",
                     job->display_name != NULL ? job->display_name
                                               : job->saved_path != NULL ? job->saved_path
                                                                         : "the project");
  report (self, "restored", job->project_path);
}

static void
restore_response_cb (GtkDialog  *dialog,
                     int         response,
                     RestoreJob *job)
{
  DfWindow *self = job->self;

  gtk_window_destroy (GTK_WINDOW (dialog));
  if (response == GTK_RESPONSE_ACCEPT)
    restore (job);
  else if (response == GTK_RESPONSE_REJECT)
    remove_files (job->project_path);
  else
    {
      /* Closed without an answer: keep the copy for the next start, but do not ask again. */
      restore_job_free (job);
      return;
    }
  restore_job_free (job);
  /* Another crashed window may have left its own copy. Not after a restore: this window holds
   * the restored work now, the rest waits for the next start. */
  if (response == GTK_RESPONSE_REJECT)
    offer_next (self);
}

static void
offer_next (DfWindow *self)
{
  g_autofree char *path = find_orphan ();
  g_autofree char *info_path = NULL;
  g_autoptr(GKeyFile) info = g_key_file_new ();
  g_autofree char *title = NULL;
  g_autofree char *when = NULL;
  g_autoptr(GDateTime) modified = NULL;
  RestoreJob *job;
  GtkWidget *dialog, *discard, *restore_button;
  GStatBuf st;
  int loops = -1;

  if (path == NULL)
    return;
  info_path = info_path_for (path);
  job = g_new0 (RestoreJob, 1);
  job->self = g_object_ref (self);
  job->project_path = g_strdup (path);
  if (g_key_file_load_from_file (info, info_path, G_KEY_FILE_NONE, NULL))
    {
      job->saved_path = g_key_file_get_string (info, "autosave", "path", NULL);
      job->display_name = g_key_file_get_string (info, "autosave", "display-name", NULL);
      title = g_key_file_get_string (info, "autosave", "title", NULL);
      if (g_key_file_has_key (info, "autosave", "loops", NULL))
        loops = g_key_file_get_integer (info, "autosave", "loops", NULL);
    }
  if (g_stat (path, &st) == 0)
    modified = g_date_time_new_from_unix_local (st.st_mtime);
  when = modified != NULL ? g_date_time_format (modified, "%x %X") : g_strdup ("?");

  dialog = gtk_message_dialog_new (GTK_WINDOW (self),
                                   GTK_DIALOG_MODAL | GTK_DIALOG_DESTROY_WITH_PARENT,
                                   GTK_MESSAGE_QUESTION, GTK_BUTTONS_NONE,
                                   "Restore unsaved work on “%s”?",
                                   title != NULL ? title : "a project");
  gtk_window_set_title (GTK_WINDOW (dialog), "Restore unsaved work");
  if (loops >= 0)
    gtk_message_dialog_format_secondary_text (GTK_MESSAGE_DIALOG (dialog),
                                              "driftframe stopped before it was saved. A copy "
                                              "from %s with %d loop%s was kept%s%s.",
                                              when, loops, loops == 1 ? "" : "s",
                                              job->saved_path != NULL ? "; its file is " : "",
                                              job->saved_path != NULL ? job->saved_path : "");
  else
    gtk_message_dialog_format_secondary_text (GTK_MESSAGE_DIALOG (dialog),
                                              "driftframe stopped before it was saved. A copy "
                                              "from %s was kept.", when);
  discard = gtk_dialog_add_button (GTK_DIALOG (dialog), "_Discard", GTK_RESPONSE_REJECT);
  gtk_widget_add_css_class (discard, "destructive-action");
  restore_button = gtk_dialog_add_button (GTK_DIALOG (dialog), "_Restore",
                                          GTK_RESPONSE_ACCEPT);
  gtk_widget_add_css_class (restore_button, "suggested-action");
  gtk_dialog_set_default_response (GTK_DIALOG (dialog), GTK_RESPONSE_ACCEPT);
  g_signal_connect (dialog, "response", G_CALLBACK (restore_response_cb), job);
  gtk_window_present (GTK_WINDOW (dialog));
  gtk_widget_grab_focus (restore_button);
  report (self, "restore-offered", path);
}

static gboolean
offer_idle (gpointer user_data)
{
  DfWindow *self = user_data;

  offer_next (self);
  g_object_unref (self);
  return G_SOURCE_REMOVE;
}

void
_df_window_autosave_init (DfWindow *self)
{
  static guint serial;
  g_autofree char *dir = autosave_dir ();
  g_autofree char *name = g_strdup_printf ("autosave-%ld-%u.dfproj", (long) getpid (),
                                           ++serial);

  self->autosave_path = g_build_filename (dir, name, NULL);
  g_signal_connect (self->document, "changed", G_CALLBACK (document_changed_cb), self);
  /* After the window is on screen, so the question has its parent. */
  g_idle_add (offer_idle, g_object_ref (self));
}
