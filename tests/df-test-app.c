/* df-test-app.c: the harness of the app's end-to-end tests (test-app-e2e.c, test-app-edits.c):
 * a private Xvfb server, the app started with isolated folders and read line by line from its
 * --report-events output, xdotool for the mouse and keyboard, CSV and PNG readers. */
#include <gdk-pixbuf/gdk-pixbuf.h>
#include <gio/gio.h>
#include <glib/gstdio.h>
#include <math.h>
#include <stdarg.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#ifdef __linux__
#include <signal.h>
#include <sys/prctl.h>
#endif

#include "df-status.h"
#include "df-test-app.h"

/* XDG_DATA_DIRS before g_test_init isolated it: the app's file dialogs need the system's
 * GSettings schemas and MIME database from there. */
char *system_data_dirs;

/* Children die with the test: a failed assertion aborts the test process, and an orphaned X
 * server or app would keep running (and keep the test harness's output pipes open). */
static void
die_with_parent (gpointer user_data)
{
#ifdef __linux__
  prctl (PR_SET_PDEATHSIG, SIGKILL);
#endif
}

void
xserver_stop (Xserver *x)
{
  if (x->server != NULL)
    {
      g_subprocess_force_exit (x->server);
      g_subprocess_wait (x->server, NULL, NULL);
    }
  g_clear_object (&x->server);
  g_clear_pointer (&x->display, g_free);
}

/* Waits for an async operation's flag with a deadline, iterating the default context. */
gboolean
wait_for (gboolean *done,
          int       seconds)
{
  gint64 deadline = g_get_monotonic_time () + (gint64) seconds * G_USEC_PER_SEC;

  while (!*done && g_get_monotonic_time () < deadline)
    {
      if (!g_main_context_iteration (NULL, FALSE))
        g_usleep (10000);
    }
  return *done;
}

/* Starts Xvfb on a free display (-displayfd writes the number it took). FALSE (with the test
 * skipped) when the tools are missing. */
gboolean
xserver_start (Xserver *x)
{
  g_autofree char *xvfb = g_find_program_in_path ("Xvfb");
  g_autofree char *xdotool = g_find_program_in_path ("xdotool");
  g_autoptr(GSubprocessLauncher) launcher = NULL;
  g_autoptr(GError) error = NULL;
  char buffer[32] = { 0 };
  int fds[2];
  gssize got = 0;

  memset (x, 0, sizeof *x);
  if (xvfb == NULL || xdotool == NULL)
    {
      g_test_skip ("needs Xvfb and xdotool in PATH (Debian: apt install xvfb xdotool)");
      return FALSE;
    }
  g_assert_cmpint (pipe (fds), ==, 0);
  launcher = g_subprocess_launcher_new (G_SUBPROCESS_FLAGS_STDOUT_SILENCE
                                        | G_SUBPROCESS_FLAGS_STDERR_SILENCE);
  g_subprocess_launcher_set_child_setup (launcher, die_with_parent, NULL, NULL);
  g_subprocess_launcher_take_fd (launcher, fds[1], 3);
  x->server = g_subprocess_launcher_spawn (launcher, &error, xvfb, "-displayfd", "3", "-screen",
                                           "0", "1280x800x24", "-nolisten", "tcp", NULL);
  g_assert_no_error (error);
  /* The child has its copy of the write end; a read then ends at its first newline or exit. */
  g_clear_object (&launcher);
  for (gsize len = 0; len < sizeof buffer - 1; len += (gsize) got)
    {
      got = read (fds[0], buffer + len, sizeof buffer - 1 - len);
      if (got <= 0 || memchr (buffer, '\n', len + (gsize) got) != NULL)
        break;
    }
  close (fds[0]);
  if (buffer[0] < '0' || buffer[0] > '9')
    {
      xserver_stop (x);
      g_test_skip ("Xvfb did not start (no display number on -displayfd)");
      return FALSE;
    }
  x->display = g_strdup_printf (":%d", atoi (buffer));
  return TRUE;
}

GSubprocessLauncher *
app_launcher (Xserver *x)
{
  GSubprocessLauncher *launcher = g_subprocess_launcher_new (G_SUBPROCESS_FLAGS_STDOUT_PIPE);

  g_subprocess_launcher_set_child_setup (launcher, die_with_parent, NULL, NULL);
  /* The isolated directories of g_test_init, so the app neither reads nor writes the user's
   * remembered state. */
  g_subprocess_launcher_setenv (launcher, "XDG_CONFIG_HOME", g_get_user_config_dir (), TRUE);
  g_subprocess_launcher_setenv (launcher, "XDG_DATA_HOME", g_get_user_data_dir (), TRUE);
  g_subprocess_launcher_setenv (launcher, "XDG_CACHE_HOME", g_get_user_cache_dir (), TRUE);
  g_subprocess_launcher_setenv (launcher, "XDG_STATE_HOME", g_get_user_state_dir (), TRUE);
  g_subprocess_launcher_setenv (launcher, "XDG_DATA_DIRS", system_data_dirs, TRUE);
  g_subprocess_launcher_setenv (launcher, "DISPLAY", x->display, TRUE);
  g_subprocess_launcher_setenv (launcher, "GDK_BACKEND", "x11", TRUE);
  g_subprocess_launcher_setenv (launcher, "LIBGL_ALWAYS_SOFTWARE", "1", TRUE);
  g_subprocess_launcher_setenv (launcher, "NO_AT_BRIDGE", "1", TRUE);
  g_subprocess_launcher_setenv (launcher, "GSETTINGS_BACKEND", "memory", TRUE);
  return launcher;
}

typedef struct
{
  gboolean done;
  char    *line;
} LineWait;

static void
line_ready_cb (GObject      *source,
               GAsyncResult *result,
               gpointer      user_data)
{
  LineWait *wait = user_data;

  wait->line = g_data_input_stream_read_line_finish_utf8 (G_DATA_INPUT_STREAM (source), result,
                                                          NULL, NULL);
  wait->done = TRUE;
}

/* Reads the app's stdout until a line starts with prefix; NULL on end of output or timeout. */
char *
read_until (GDataInputStream *out,
            const char       *prefix)
{
  for (;;)
    {
      LineWait wait = { FALSE, NULL };

      g_data_input_stream_read_line_async (out, G_PRIORITY_DEFAULT, NULL, line_ready_cb, &wait);
      if (!wait_for (&wait.done, STEP_TIMEOUT_S))
        return NULL;
      if (wait.line == NULL)
        return NULL;
      if (g_str_has_prefix (wait.line, prefix))
        return wait.line;
      g_free (wait.line);
    }
}

/* Like read_until, for the first line starting with either prefix. */
char *
read_until_either (GDataInputStream *out,
                   const char       *a,
                   const char       *b)
{
  for (;;)
    {
      LineWait wait = { FALSE, NULL };

      g_data_input_stream_read_line_async (out, G_PRIORITY_DEFAULT, NULL, line_ready_cb, &wait);
      if (!wait_for (&wait.done, STEP_TIMEOUT_S) || wait.line == NULL)
        return NULL;
      if (g_str_has_prefix (wait.line, a) || g_str_has_prefix (wait.line, b))
        return wait.line;
      g_free (wait.line);
    }
}

static void
exited_cb (GObject      *source,
           GAsyncResult *result,
           gpointer      user_data)
{
  g_subprocess_wait_finish (G_SUBPROCESS (source), result, NULL);
  *(gboolean *) user_data = TRUE;
}

/* Waits for the app to quit by itself (it does after its exports); kills it on timeout. */
gboolean
app_wait (GSubprocess *app)
{
  gboolean exited = FALSE;

  g_subprocess_wait_async (app, NULL, exited_cb, &exited);
  if (!wait_for (&exited, STEP_TIMEOUT_S))
    {
      g_subprocess_force_exit (app);
      wait_for (&exited, 10);
      return FALSE;
    }
  return TRUE;
}

/* Column index of name in a CSV header line, or -1. */
int
column_of (char      **header,
           const char *name)
{
  for (int i = 0; header[i] != NULL; i++)
    if (g_str_equal (g_strstrip (header[i]), name))
      return i;
  return -1;
}

/* Splits one RFC 4180 line (quoted fields may hold commas; "" is a quote). */
char **
split_csv_line (const char *line)
{
  GPtrArray *fields = g_ptr_array_new ();
  GString *f = g_string_new (NULL);
  gboolean quoted = FALSE;

  for (const char *p = line;; p++)
    {
      if (*p == '\0' || (*p == ',' && !quoted))
        {
          g_ptr_array_add (fields, g_strdup (f->str));
          g_string_truncate (f, 0);
          if (*p == '\0')
            break;
        }
      else if (*p == '"' && quoted && p[1] == '"')
        g_string_append_c (f, *p++);
      else if (*p == '"')
        quoted = !quoted;
      else if (*p != '\r')
        g_string_append_c (f, *p);
    }
  g_string_free (f, TRUE);
  g_ptr_array_add (fields, NULL);
  return (char **) g_ptr_array_free (fields, FALSE);
}

/* Reads a numeric CSV with a header into rows of fields; fails the test on a bad file. */
GPtrArray *
read_csv (const char *path,
          char     ***header_out)
{
  g_autofree char *text = NULL;
  g_auto(GStrv) lines = NULL;
  g_autoptr(GError) error = NULL;
  GPtrArray *rows = g_ptr_array_new_with_free_func ((GDestroyNotify) g_strfreev);

  g_file_get_contents (path, &text, NULL, &error);
  g_assert_no_error (error);
  lines = g_strsplit (text, "\n", -1);
  g_assert_nonnull (lines[0]);
  *header_out = split_csv_line (lines[0]);
  for (int i = 1; lines[i] != NULL; i++)
    if (lines[i][0] != '\0')
      g_ptr_array_add (rows, split_csv_line (lines[i]));
  return rows;
}

double
field (GPtrArray *rows,
       guint      row,
       int        column)
{
  char **fields = g_ptr_array_index (rows, row);
  char *end = NULL;
  double value;

  g_assert_cmpint (column, >=, 0);
  g_assert_cmpuint (g_strv_length (fields), >, (guint) column);
  value = g_ascii_strtod (fields[column], &end);
  g_assert_true (end != fields[column]);
  return value;
}

/* Runs xdotool with args on the test's display for at most seconds; its exit status (124
 * when it ran out of time), what it ran in *what (g_free). */
static int
xdotool_try (Xserver   *x,
             GPtrArray *args,
             int        seconds,
             char     **what)
{
  g_autoptr(GSubprocessLauncher) xl = g_subprocess_launcher_new (G_SUBPROCESS_FLAGS_NONE);
  g_autoptr(GSubprocess) driver = NULL;
  g_autoptr(GError) error = NULL;

  g_ptr_array_insert (args, 0, g_strdup ("xdotool"));
  g_ptr_array_add (args, NULL);
  *what = g_strjoinv (" ", (char **) args->pdata);
  /* `search --sync` waits for ever for a window that never shows (a key press lost on a
   * loaded machine): coreutils' timeout ends it. */
  g_ptr_array_insert (args, 0, g_strdup_printf ("%d", seconds));
  g_ptr_array_insert (args, 0, g_strdup ("timeout"));
  g_subprocess_launcher_setenv (xl, "DISPLAY", x->display, TRUE);
  driver = g_subprocess_launcher_spawnv (xl, (const char *const *) args->pdata, &error);
  g_assert_no_error (error);
  g_subprocess_wait (driver, NULL, &error);
  g_assert_no_error (error);
  return g_subprocess_get_if_exited (driver) ? g_subprocess_get_exit_status (driver) : -1;
}

/* Runs xdotool with args (NULL-terminated) on the test's display and waits for it; the test
 * fails saying what it ran when xdotool fails or runs past the step timeout. */
void
xdotool_run (Xserver    *x,
             GPtrArray  *args)
{
  g_autofree char *what = NULL;
  int status = xdotool_try (x, args, STEP_TIMEOUT_S, &what);

  if (status != 0)
    g_error ("%s: %s", what, status == 124 ? "timed out" : "failed");
}

void
open_by_key (Xserver    *x,
             const char *key,
             const char *title)
{
  for (int attempt = 0; attempt < 3; attempt++)
    {
      g_autoptr(GPtrArray) args = g_ptr_array_new_with_free_func (g_free);
      g_autofree char *what = NULL;

      focus_main (x);
      xdotool_va (x, "key", key, NULL);
      g_ptr_array_add (args, g_strdup ("search"));
      g_ptr_array_add (args, g_strdup ("--sync"));
      g_ptr_array_add (args, g_strdup ("--onlyvisible"));
      g_ptr_array_add (args, g_strdup ("--name"));
      g_ptr_array_add (args, g_strdup (title));
      if (xdotool_try (x, args, STEP_TIMEOUT_S / 3, &what) == 0)
        return;
      g_test_message ("%s: no window after %s, pressing it again", title, key);
    }
  g_error ("the window \"%s\" did not open on %s", title, key);
}

void
xdotool_va (Xserver    *x,
            const char *first,
            ...)
{
  g_autoptr(GPtrArray) args = g_ptr_array_new_with_free_func (g_free);
  va_list ap;

  va_start (ap, first);
  for (const char *a = first; a != NULL; a = va_arg (ap, const char *))
    g_ptr_array_add (args, g_strdup (a));
  va_end (ap);
  xdotool_run (x, args);
}

/* Answers a dialog of the app (found by its title) with a key, as a user at the keyboard
 * would. Without a window manager the dialog has to be given the focus first. */
void
answer_dialog (Xserver    *x,
               const char *title,
               const char *key)
{
  xdotool_va (x, "search", "--sync", "--onlyvisible", "--name", title, "windowfocus", "sleep", "0.5", "key",
              key, NULL);
}

/* Gives the main window (title "... — driftframe") the keyboard focus, as clicking it would. */
void
focus_main (Xserver *x)
{
  xdotool_va (x, "search", "--sync", "--onlyvisible", "--name", "driftframe$", "windowfocus", "sleep", "0.5",
              NULL);
}

/* Puts the keyboard focus on the 3D view (a click in Look mode changes nothing), so that
 * Ctrl+Z reaches the window and not a text field's own undo. */
void
focus_view (Xserver  *x,
            char    **geometry)
{
  g_autofree char *cx = g_strdup_printf ("%d", atoi (geometry[4]) / 2);
  g_autofree char *cy = g_strdup_printf ("%d", atoi (geometry[5]) - 20);

  focus_main (x);
  xdotool_va (x, "key", "ctrl+1", "sleep", "0.5", "mousemove", "--window", geometry[1], cx, cy,
              "click", "1", "sleep", "0.5", NULL);
}

GSubprocess *
start_app (Xserver           *x,
           const char        *app_path,
           GDataInputStream **out,
           const char        *first,
           ...)
{
  g_autoptr(GSubprocessLauncher) launcher = app_launcher (x);
  g_autoptr(GPtrArray) args = g_ptr_array_new ();
  g_autoptr(GError) error = NULL;
  GSubprocess *app;
  va_list ap;

  g_ptr_array_add (args, (char *) app_path);
  va_start (ap, first);
  for (const char *a = first; a != NULL; a = va_arg (ap, const char *))
    g_ptr_array_add (args, (char *) a);
  va_end (ap);
  g_ptr_array_add (args, (char *) "--report-view-geometry");
  g_ptr_array_add (args, (char *) "--report-events");
  g_ptr_array_add (args, NULL);
  app = g_subprocess_launcher_spawnv (launcher, (const char *const *) args->pdata, &error);
  g_assert_no_error (error);
  *out = g_data_input_stream_new (g_subprocess_get_stdout_pipe (app));
  return app;
}

void
write_demo_with (const char *examples_dir,
                 const char *path,
                 const char *line,
                 const char *replacement)
{
  g_autofree char *demo_path = g_build_filename (examples_dir, "demo.dfproj", NULL);
  g_autofree char *demo = NULL;
  g_autofree char *edited = NULL;
  g_autoptr(GError) error = NULL;
  g_auto(GStrv) halves = NULL;

  g_file_get_contents (demo_path, &demo, NULL, &error);
  g_assert_no_error (error);
  g_assert_nonnull (strstr (demo, line));
  halves = g_strsplit (demo, line, 2);
  edited = g_strconcat (halves[0], replacement, halves[1], NULL);
  g_file_set_contents (path, edited, -1, &error);
  g_assert_no_error (error);
}

void
app_test_init (int    *argc,
               char ***argv)
{
  df_core_init ();
  /* Before g_test_init isolates it; the XDG Base Directory default when unset. */
  system_data_dirs = g_strdup (g_getenv ("XDG_DATA_DIRS") != NULL && g_getenv ("XDG_DATA_DIRS")[0]
                               ? g_getenv ("XDG_DATA_DIRS") : "/usr/local/share:/usr/share");
  g_test_init (argc, argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);
}

JsonArray *
cli_check_verdicts (const char *cli_path,
                    const char *project,
                    JsonParser *parser)
{
  g_autoptr(GSubprocess) cli = NULL;
  g_autoptr(GError) error = NULL;
  g_autoptr(GBytes) stdout_bytes = NULL;

  /* Exit status 3 (a limit exceeded) is an answer here, not a failure. */
  cli = g_subprocess_new (G_SUBPROCESS_FLAGS_STDOUT_PIPE, &error, cli_path, "check",
                          "--project", project, "--json", NULL);
  g_assert_no_error (error);
  g_subprocess_communicate (cli, NULL, NULL, &stdout_bytes, NULL, &error);
  g_assert_no_error (error);
  json_parser_load_from_data (parser, g_bytes_get_data (stdout_bytes, NULL),
                              (gssize) g_bytes_get_size (stdout_bytes), &error);
  g_assert_no_error (error);
  return json_object_get_array_member (json_node_get_object (json_parser_get_root (parser)),
                                       "verdicts");
}

JsonObject *
find_verdict (JsonArray  *verdicts,
              const char *loop,
              const char *limit)
{
  for (guint i = 0; i < json_array_get_length (verdicts); i++)
    {
      JsonObject *v = json_array_get_object_element (verdicts, i);

      if (g_strcmp0 (json_object_get_string_member (v, "loop"), loop) == 0
          && g_strcmp0 (json_object_get_string_member (v, "limit"), limit) == 0)
        return v;
    }
  return NULL;
}

/* The view's geometry line, split: "view-geometry XID X Y WIDTH HEIGHT". */
char **
read_view_geometry (GDataInputStream *out)
{
  g_autofree char *geometry = read_until (out, "view-geometry ");
  char **parts;

  g_assert_nonnull (geometry);
  parts = g_strsplit (geometry, " ", -1);
  g_assert_cmpuint (g_strv_length (parts), ==, 6);
  return parts;
}

/* Drags a counter-clockwise circle (screen y points down) of radius px round the view's
 * centre, with the left button held, in n_steps moves. */
void
drag_circle (Xserver     *x,
             char       **geometry,
             int          radius,
             int          n_steps)
{
  g_autoptr(GPtrArray) xdo = g_ptr_array_new_with_free_func (g_free);
  int cx = atoi (geometry[2]) + atoi (geometry[4]) / 2;
  int cy = atoi (geometry[3]) + atoi (geometry[5]) / 2;

  g_ptr_array_add (xdo, g_strdup ("sleep"));
  g_ptr_array_add (xdo, g_strdup ("1"));
  for (int k = 0; k <= n_steps; k++)
    {
      double a = 2 * G_PI * k / n_steps;

      g_ptr_array_add (xdo, g_strdup ("mousemove"));
      g_ptr_array_add (xdo, g_strdup ("--window"));
      g_ptr_array_add (xdo, g_strdup (geometry[1]));
      g_ptr_array_add (xdo, g_strdup_printf ("%d", cx + (int) lround (radius * cos (a))));
      g_ptr_array_add (xdo, g_strdup_printf ("%d", cy - (int) lround (radius * sin (a))));
      if (k == 0)
        {
          g_ptr_array_add (xdo, g_strdup ("mousedown"));
          g_ptr_array_add (xdo, g_strdup ("1"));
        }
      g_ptr_array_add (xdo, g_strdup ("sleep"));
      g_ptr_array_add (xdo, g_strdup ("0.03"));
    }
  g_ptr_array_add (xdo, g_strdup ("mouseup"));
  g_ptr_array_add (xdo, g_strdup ("1"));
  xdotool_run (x, xdo);
}

/* Parses "loop-measured NAME HOLONOMY ENCLOSED". */
void
parse_measured (const char *line,
                double     *holonomy,
                double     *enclosed)
{
  g_auto(GStrv) parts = g_strsplit (line, " ", -1);

  g_assert_cmpuint (g_strv_length (parts), ==, 4);
  *holonomy = g_ascii_strtod (parts[2], NULL);
  *enclosed = g_ascii_strtod (parts[3], NULL);
}

/* Autosave files left in the app's state folder. */
guint
count_autosaves (void)
{
  g_autofree char *path = g_build_filename (g_get_user_state_dir (), "driftframe", NULL);
  g_autoptr(GDir) dir = g_dir_open (path, 0, NULL);
  const char *name;
  guint n = 0;

  while (dir != NULL && (name = g_dir_read_name (dir)) != NULL)
    n += g_str_has_prefix (name, "autosave-") && g_str_has_suffix (name, ".dfproj");
  return n;
}


/* By explicit type: the isolated XDG_DATA_DIRS of the test hide the MIME database that
 * gdk_pixbuf_new_from_file would sniff the format with. */
GdkPixbuf *
load_png (const char *path)
{
  g_autoptr(GdkPixbufLoader) loader = NULL;
  g_autoptr(GError) error = NULL;
  g_autofree char *data = NULL;
  gsize length = 0;
  GdkPixbuf *pixbuf;

  g_file_get_contents (path, &data, &length, &error);
  g_assert_no_error (error);
  loader = gdk_pixbuf_loader_new_with_type ("png", &error);
  g_assert_no_error (error);
  gdk_pixbuf_loader_write (loader, (const guchar *) data, length, &error);
  g_assert_no_error (error);
  gdk_pixbuf_loader_close (loader, &error);
  g_assert_no_error (error);
  pixbuf = gdk_pixbuf_loader_get_pixbuf (loader);
  g_assert_nonnull (pixbuf);
  return g_object_ref (pixbuf);
}

/* Types a value into the focused field, replacing what is there. */
void
type_field (Xserver    *x,
            const char *text)
{
  /* Pauses let a loaded app take each key in turn: xdotool may remap a spare key code for a
   * character, and a change of key map that lands mid-stream can be read with the old one. */
  xdotool_va (x, "sleep", "0.3", "key", "ctrl+a", "sleep", "0.3", "type", "--delay", "60", text,
              NULL);
  /* "type" takes every argument after it as text: the pause is a call of its own. */
  xdotool_va (x, "sleep", "0.3", NULL);
}

void
parse_three (const char *line,
             double      out[3])
{
  g_auto(GStrv) parts = g_strsplit (line, " ", -1);

  g_assert_cmpuint (g_strv_length (parts), ==, 4);
  for (int i = 0; i < 3; i++)
    out[i] = g_ascii_strtod (parts[i + 1], NULL);
}

