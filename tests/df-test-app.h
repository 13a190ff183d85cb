/* df-test-app.h: the harness of the app's end-to-end tests (df-test-app.c). Each test starts
 * its own Xvfb, runs the app with --report-events and reads its lines; helpers fail the test
 * (g_assert) on what cannot go on. */
#pragma once

#include <gdk-pixbuf/gdk-pixbuf.h>
#include <gio/gio.h>
#include <json-glib/json-glib.h>

/* Generous: the software rasterizer and a cold start are slow on a loaded machine. */
#define STEP_TIMEOUT_S 90

/* XDG_DATA_DIRS before g_test_init isolated it (set by main): the app's file dialogs need the
 * system's GSettings schemas and MIME database from there. */
extern char *system_data_dirs;

/* A test program's start: the core, system_data_dirs, then g_test_init with isolated
 * folders. */
void app_test_init (int *argc, char ***argv);

typedef struct
{
  GSubprocess *server;
  char        *display;  /* ":N" */
} Xserver;

void xserver_stop (Xserver *x);
gboolean wait_for (gboolean *done, int seconds);
/* Starts Xvfb on a free display; FALSE (the test skipped) when the tools are missing. */
gboolean xserver_start (Xserver *x);
GSubprocessLauncher *app_launcher (Xserver *x);
/* Runs the app at app_path with the arguments (NULL-terminated) and --report-view-geometry
 * --report-events; *out reads its output. */
GSubprocess *start_app (Xserver *x, const char *app_path, GDataInputStream **out,
                        const char *first, ...) G_GNUC_NULL_TERMINATED;
/* The app's next output line starting with prefix (g_free); NULL at its end or on timeout. */
char *read_until (GDataInputStream *out, const char *prefix);
char *read_until_either (GDataInputStream *out, const char *a, const char *b);
/* Waits for the app to quit by itself; kills it and FALSE on timeout. */
gboolean app_wait (GSubprocess *app);
int column_of (char **header, const char *name);
char **split_csv_line (const char *line);
/* A CSV with a header line into rows of fields (g_strfreev each). */
GPtrArray *read_csv (const char *path, char ***header_out);
double field (GPtrArray *rows, guint row, int column);
void xdotool_run (Xserver *x, GPtrArray *args);
/* Runs xdotool with the NULL-terminated arguments on the test's display. */
void xdotool_va (Xserver *x, const char *first, ...);
/* Presses key in the main window until a window titled title shows (three tries: a key press
 * can be lost on a loaded machine); fails the test when none does. */
void open_by_key (Xserver *x, const char *key, const char *title);
/* Focuses the dialog titled title and presses key. */
void answer_dialog (Xserver *x, const char *title, const char *key);
/* Gives the main window the keyboard focus. */
void focus_main (Xserver *x);
/* Puts the keyboard focus on the 3D view (a click near its bottom in Look mode), so that
 * Ctrl+Z reaches the window and not a text field's own undo. geometry: read_view_geometry's. */
void focus_view (Xserver *x, char **geometry);
/* The demo project (examples_dir/demo.dfproj) written to path with its first occurrence of
 * line (which must be there) replaced by replacement: a limit changed, a key added. */
void write_demo_with (const char *examples_dir, const char *path, const char *line,
                      const char *replacement);
/* `check --json` of the CLI at cli_path on project: its "verdicts" array, owned by parser. */
JsonArray *cli_check_verdicts (const char *cli_path, const char *project, JsonParser *parser);
/* The first verdict of loop against limit in such an array, or NULL. */
JsonObject *find_verdict (JsonArray *verdicts, const char *loop, const char *limit);
/* "view-geometry XID X Y WIDTH HEIGHT", split. */
char **read_view_geometry (GDataInputStream *out);
/* Drags a counter-clockwise circle of radius px round the view's centre. */
void drag_circle (Xserver *x, char **geometry, int radius, int n_steps);
void parse_measured (const char *line, double *holonomy, double *enclosed);
/* Autosave files left in the app's state folder. */
guint count_autosaves (void);
GdkPixbuf *load_png (const char *path);
/* Types text into the focused field, replacing what is there. */
void type_field (Xserver *x, const char *text);
void parse_three (const char *line, double out[3]);
