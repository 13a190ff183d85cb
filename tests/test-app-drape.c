/* test-app-drape.c: end-to-end tests of the app's woven-ply drape (issue 12), driven from
 * outside under a private Xvfb: the drape of a demo loop started at typed values (--drape, the
 * Drape button's path) and at a start pin clicked on the surface, each checked against
 * `driftframe-cli drape --json` on the same input (the app and the CLI share the core, whose
 * result is itself tested against closed forms in tests/test-drape.c), the locking-angle flags
 * when a small max-shear-deg is set, and the window's key. Skips without Xvfb or xdotool. */
#include <gio/gio.h>
#include <glib/gstdio.h>
#include <json-glib/json-glib.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "df-glib.h"
#include "df-test.h"
#include "df-test-app.h"

/* The demo project with max-shear-deg replaced by limit_deg, in a temporary folder, and the
 * loop named "Belly patch" written as a loop CSV (u,v) for the CLI. */
static char *
write_project (const char *dir,
               const char *limit_deg,
               char      **loop_csv)
{
  g_autofree char *demo = g_build_filename (DF_EXAMPLES_DIR, "demo.dfproj", NULL);
  g_autofree char *text = NULL;
  g_autoptr(GError) error = NULL;
  g_autoptr(GKeyFile) kf = g_key_file_new ();
  g_autoptr(GString) csv = g_string_new ("u,v\n");
  g_auto(GStrv) groups = NULL;
  g_autofree char *out = NULL;
  char *path = g_build_filename (dir, "drape.dfproj", NULL);

  g_assert_true (g_file_get_contents (demo, &text, NULL, &error));
  g_assert_no_error (error);
  g_assert_true (g_key_file_load_from_data (kf, text, -1, G_KEY_FILE_KEEP_COMMENTS, &error));
  g_assert_no_error (error);
  g_key_file_set_string (kf, "limits", "max-shear-deg", limit_deg);
  /* The geodesic and paths name no files; the loops carry their points. */
  out = g_key_file_to_data (kf, NULL, NULL);
  g_assert_true (g_file_set_contents (path, out, -1, &error));
  g_assert_no_error (error);

  groups = g_key_file_get_groups (kf, NULL);
  for (guint g = 0; groups[g] != NULL; g++)
    {
      g_autofree char *name = g_key_file_get_string (kf, groups[g], "name", NULL);
      g_auto(GStrv) u = NULL;
      g_auto(GStrv) v = NULL;

      if (!g_str_has_prefix (groups[g], "loop ") || g_strcmp0 (name, "Belly patch") != 0)
        continue;
      u = g_strsplit (g_key_file_get_string (kf, groups[g], "u", NULL), ";", -1);
      v = g_strsplit (g_key_file_get_string (kf, groups[g], "v", NULL), ";", -1);
      g_assert_cmpuint (g_strv_length (u), ==, g_strv_length (v));
      for (guint k = 0; u[k] != NULL; k++)
        g_string_append_printf (csv, "%s,%s\n", u[k], v[k]);
    }
  g_assert_cmpuint (csv->len, >, 10);
  *loop_csv = g_build_filename (dir, "belly.csv", NULL);
  g_assert_true (g_file_set_contents (*loop_csv, csv->str, -1, &error));
  g_assert_no_error (error);
  return path;
}

typedef struct
{
  double cells, max_shear_deg, enclosed_rad, over;
} Drape;

/* "draped CELLS MAX_SHEAR_DEG ENCLOSED_RAD CELLS_OVER_LIMIT" */
static void
parse_draped (const char *line,
              Drape      *d)
{
  g_auto(GStrv) parts = g_strsplit (line, " ", -1);

  g_assert_cmpuint (g_strv_length (parts), ==, 5);
  d->cells = g_ascii_strtod (parts[1], NULL);
  d->max_shear_deg = g_ascii_strtod (parts[2], NULL);
  d->enclosed_rad = g_ascii_strtod (parts[3], NULL);
  d->over = g_ascii_strtod (parts[4], NULL);
}

/* `driftframe-cli drape --json` with the project's limits. */
static void
cli_drape (const char *project,
           const char *loop_csv,
           double      u,
           double      v,
           const char *warp,
           const char *cell,
           const char *svg,
           Drape      *d)
{
  g_autoptr(GSubprocess) cli = NULL;
  g_autoptr(GError) error = NULL;
  g_autoptr(GBytes) bytes = NULL;
  g_autoptr(JsonParser) parser = json_parser_new ();
  char a[G_ASCII_DTOSTR_BUF_SIZE], b[G_ASCII_DTOSTR_BUF_SIZE];
  g_autofree char *start = NULL;
  JsonObject *o;

  start = g_strdup_printf ("%s,%s", g_ascii_dtostr (a, sizeof a, u),
                           g_ascii_dtostr (b, sizeof b, v));
  cli = g_subprocess_new (G_SUBPROCESS_FLAGS_STDOUT_PIPE, &error, DF_CLI_PATH, "drape",
                          "--project", project, "--loop", loop_csv, "--start", start,
                          "--warp-deg", warp, "--cell", cell, "--json",
                          svg != NULL ? "--svg" : NULL, svg, NULL);
  g_assert_no_error (error);
  g_subprocess_communicate (cli, NULL, NULL, &bytes, NULL, &error);
  g_assert_no_error (error);
  g_assert_cmpint (g_subprocess_get_exit_status (cli), ==, 0);
  json_parser_load_from_data (parser, g_bytes_get_data (bytes, NULL),
                              (gssize) g_bytes_get_size (bytes), &error);
  g_assert_no_error (error);
  o = json_node_get_object (json_parser_get_root (parser));
  d->cells = json_object_get_int_member (o, "cells");
  d->max_shear_deg = json_object_get_double_member (o, "max_shear_deg");
  d->enclosed_rad = json_object_get_double_member (o, "enclosed_curvature_rad");
  d->over = json_object_get_int_member (o, "cells_over_limit");
}

/* The app and the CLI run the same core on the same polygon (df-drape-job.c samples the loop
 * as df-cli-drape.c does), so the numbers agree to rounding of the printed digits. */
static void
assert_same (const Drape *app,
             const Drape *cli)
{
  g_assert_cmpfloat (app->cells, ==, cli->cells);
  g_assert_cmpfloat (app->over, ==, cli->over);
  df_assert_close (app->max_shear_deg, cli->max_shear_deg, 1e-12, 1e-13);
  df_assert_close (app->enclosed_rad, cli->enclosed_rad, 1e-12, 1e-14);
}

/* Typed values: the Belly patch draped from t = 90, phi = 5 degrees (typed in degrees, the
 * CLI takes radians), warp 10 degrees, 4 mm cells; with max-shear-deg 5 (the demo's) and 1. */
static void
test_typed (void)
{
  const char *const limits[] = { "5", "1" };
  g_autofree char *dir = g_dir_make_tmp ("df-drape-XXXXXX", NULL);

  for (guint k = 0; k < G_N_ELEMENTS (limits); k++)
    {
      Xserver x;
          g_autoptr(GSubprocess) app = NULL;
          g_autoptr(GDataInputStream) out = NULL;
      g_autofree char *loop_csv = NULL;
      g_autofree char *project = write_project (dir, limits[k], &loop_csv);
      g_autofree char *start = NULL;
      g_autofree char *line = NULL;
      g_autofree char *flags = NULL;
      Drape a, c;

      if (!xserver_start (&x))
        return;
      app = start_app (&x, DF_APP_PATH, &out, project, "--drape", "Belly patch;90;5;10;4",
                       NULL);
      start = read_until (out, "drape-start ");
      g_assert_nonnull (start);
      line = read_until (out, "draped ");
      g_assert_nonnull (line);
      parse_draped (line, &a);
      flags = read_until (out, "drape-flags ");
      g_assert_nonnull (flags);
      cli_drape (project, loop_csv, 90, 5 * G_PI / 180, "10", "4", NULL, &c);
      assert_same (&a, &c);
      g_assert_cmpfloat (a.cells, >, 100);
      if (k == 0)
        /* The demo's 5 degrees lie above this ply's largest shear (under 2 degrees). */
        g_assert_cmpfloat (a.over, ==, 0);
      else
        {
          /* 1 degree: the cells past it are flagged, and the worst reported is past it. */
          g_auto(GStrv) parts = g_strsplit (flags, " ", -1);

          g_assert_cmpfloat (a.over, >, 0);
          g_assert_cmpfloat (g_ascii_strtod (parts[1], NULL), ==, a.over);
          g_assert_cmpfloat (fabs (g_ascii_strtod (parts[2], NULL)), >, 1.0);
        }
      g_subprocess_force_exit (app);
      g_subprocess_wait (app, NULL, NULL);
      xserver_stop (&x);
      g_remove (loop_csv);
      g_remove (project);
    }
  g_rmdir (dir);
}

/* The key opens the window; its "Pick the start" (Alt+I) and a click on the surface inside
 * the ply drape from the clicked point, the same as the CLI from that point. */
static void
test_key_and_pick (void)
{
  Xserver x;
  g_autoptr(GSubprocessLauncher) launcher = NULL;
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GError) error = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_autofree char *dir = g_dir_make_tmp ("df-drape-XXXXXX", NULL);
  g_autofree char *loop_csv = NULL;
  g_autofree char *project = write_project (dir, "1", &loop_csv);
  g_auto(GStrv) geometry = NULL;
  g_auto(GStrv) start = NULL;
  g_autofree char *start_line = NULL;
  g_autofree char *line = NULL;
  g_autofree char *cx = NULL;
  g_autofree char *cy = NULL;
  g_autofree char *app_svg = g_build_filename (dir, "app.svg", NULL);
  g_autofree char *cli_svg = g_build_filename (dir, "cli.svg", NULL);
  g_autofree char *exported = NULL;
  g_autofree char *svg_a = NULL;
  g_autofree char *svg_c = NULL;
  Drape a, c;

  if (!xserver_start (&x))
    return;
  launcher = app_launcher (&x);
  /* Seen from the side the Belly patch (round phi = 0) faces the eye at the view's centre. */
  app = g_subprocess_launcher_spawn (launcher, &error, DF_APP_PATH, project, "--view", "side",
                                     "--report-view-geometry", "--report-events", NULL);
  g_assert_no_error (error);
  out = g_data_input_stream_new (g_subprocess_get_stdout_pipe (app));
  /* The view's place and the loops measured (the window chooses its loop by their results),
   * in either order. */
  for (int seen = 0; seen < 2; seen++)
    {
      g_autofree char *l = read_until_either (out, "view-geometry ",
                                              "loop-measured Belly_patch ");

      g_assert_nonnull (l);
      if (g_str_has_prefix (l, "view-geometry "))
        geometry = g_strsplit (l, " ", -1);
    }
  g_assert_nonnull (geometry);
  g_assert_cmpuint (g_strv_length (geometry), ==, 6);
  focus_main (&x);
  open_by_key (&x, "ctrl+shift+w", "Woven-Ply Drape");
  /* The window shows (search --sync waits for it); moved off the view (no window manager). */
  xdotool_va (&x, "search", "--sync", "--onlyvisible", "--name", "Woven-Ply Drape",
              "windowmove", "1000", "0", "windowfocus", "sleep", "0.5", NULL);
  /* The list's first loop is the Rim band, which winds round the axis and cannot be draped:
   * the window starts on the first that bounds a disc, the Belly patch (compared below with
   * the CLI on that loop's points). The cell field gets 4 mm. */
  xdotool_va (&x, "key", "alt+c", NULL);
  type_field (&x, "4");
  xdotool_va (&x, "key", "alt+i", "sleep", "0.5", NULL);
  cx = g_strdup_printf ("%d", atoi (geometry[2]) + atoi (geometry[4]) / 2);
  cy = g_strdup_printf ("%d", atoi (geometry[3]) + atoi (geometry[5]) / 2);
  xdotool_va (&x, "mousemove", "--window", geometry[1], cx, cy, "sleep", "0.3", "click", "1",
              NULL);
  start_line = read_until (out, "drape-start ");
  g_assert_nonnull (start_line);
  start = g_strsplit (start_line, " ", -1);
  line = read_until (out, "draped ");
  g_assert_nonnull (line);
  parse_draped (line, &a);
  cli_drape (project, loop_csv, g_ascii_strtod (start[1], NULL),
             g_ascii_strtod (start[2], NULL), "0", "4", cli_svg, &c);
  assert_same (&a, &c);
  g_assert_cmpfloat (a.over, >, 0);

  /* The flat pattern exported through the file chooser is the CLI's --svg of the same drape
   * (one writer, df-drape-out.c), byte for byte. */
  xdotool_va (&x, "search", "--sync", "--onlyvisible", "--name", "Woven-Ply Drape",
              "windowfocus", "sleep", "0.5", "key", "alt+s", NULL);
  xdotool_va (&x, "search", "--sync", "--onlyvisible", "--name", "Export Flat Pattern",
              "windowfocus", "sleep", "0.5", NULL);
  type_field (&x, app_svg);
  xdotool_va (&x, "key", "Return", NULL);
  exported = read_until (out, "drape-exported svg ");
  g_assert_nonnull (exported);
  g_assert_cmpstr (exported + strlen ("drape-exported svg "), ==, app_svg);
  g_assert_true (g_file_get_contents (app_svg, &svg_a, NULL, NULL));
  g_assert_true (g_file_get_contents (cli_svg, &svg_c, NULL, NULL));
  g_assert_cmpstr (svg_a, ==, svg_c);
  g_assert_nonnull (strstr (svg_a, "<svg"));

  g_subprocess_force_exit (app);
  g_subprocess_wait (app, NULL, NULL);
  xserver_stop (&x);
  g_remove (loop_csv);
  g_remove (project);
  g_remove (app_svg);
  g_remove (cli_svg);
  g_rmdir (dir);
}

/* Reads "draped " lines until one with cells past the limit (flagged) or with none, into d;
 * fails the test when the app ends first. */
static void
read_drape_flagged (GDataInputStream *out,
                    gboolean          flagged,
                    Drape            *d)
{
  do
    {
      g_autofree char *line = read_until (out, "draped ");

      g_assert_nonnull (line);
      parse_draped (line, d);
    }
  while ((d->over > 0) != flagged);
}

/* A shown drape follows the limits: the Belly patch draped at the demo's 5 degrees (no cell
 * past it), then the locking angle set to 1 degree in the limits editor: the drape runs
 * again by itself with the same start, and its flagged cells are the CLI's at 1 degree; set
 * back to 5 degrees, no cell is flagged again. (Undo replaces the whole project and clears
 * the drape instead.) */
static void
test_limits_redrape (void)
{
  Xserver x;
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_autofree char *dir = g_dir_make_tmp ("df-drape-XXXXXX", NULL);
  g_autofree char *loop_csv = NULL;
  g_autofree char *loop_csv_1 = NULL;
  g_autofree char *project = write_project (dir, "5", &loop_csv);
  g_autofree char *dir_1 = g_dir_make_tmp ("df-drape-XXXXXX", NULL);
  g_autofree char *project_1 = write_project (dir_1, "1", &loop_csv_1);
  g_autofree char *line = NULL;
  Drape a, c;

  if (!xserver_start (&x))
    return;
  app = start_app (&x, DF_APP_PATH, &out, project, "--drape", "Belly patch;90;5;10;4", NULL);
  line = read_until (out, "draped ");
  g_assert_nonnull (line);
  parse_draped (line, &a);
  g_assert_cmpfloat (a.over, ==, 0);

  focus_main (&x);
  open_by_key (&x, "ctrl+shift+l", "Material and Process Limits");
  xdotool_va (&x, "search", "--sync", "--onlyvisible", "--name", "Material and Process Limits",
              "windowfocus", "sleep", "0.5", "key", "alt+l", NULL);
  type_field (&x, "1");
  xdotool_va (&x, "key", "Return", NULL);
  /* Other edits may re-run it first (the loops measured after start-up): the first drape
   * with a cell flagged is the one after the change. */
  read_drape_flagged (out, TRUE, &a);
  cli_drape (project_1, loop_csv_1, 90, 5 * G_PI / 180, "10", "4", NULL, &c);
  assert_same (&a, &c);
  g_assert_cmpfloat (a.over, >, 0);

  /* And back to 5 degrees: no cell flagged again. */
  focus_main (&x);
  open_by_key (&x, "ctrl+shift+l", "Material and Process Limits");
  xdotool_va (&x, "search", "--sync", "--onlyvisible", "--name", "Material and Process Limits",
              "windowfocus", "sleep", "0.5", "key", "alt+l", NULL);
  type_field (&x, "5");
  xdotool_va (&x, "key", "Return", NULL);
  read_drape_flagged (out, FALSE, &a);

  g_subprocess_force_exit (app);
  g_subprocess_wait (app, NULL, NULL);
  xserver_stop (&x);
  g_remove (loop_csv);
  g_remove (project);
  g_remove (loop_csv_1);
  g_remove (project_1);
  g_rmdir (dir);
  g_rmdir (dir_1);
}

/* The shown drape kept for the loop's shear check (Alt+K), then the project saved (Ctrl+S):
 * `driftframe-cli check` on the saved file drapes the Belly patch from the same start, warp
 * and cell, and its verdict is the app's loop verdict (exceeded at 1 degree). */
static void
test_keep_for_check (void)
{
  Xserver x;
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_autoptr(JsonParser) parser = json_parser_new ();
  g_autofree char *dir = g_dir_make_tmp ("df-drape-XXXXXX", NULL);
  g_autofree char *loop_csv = NULL;
  g_autofree char *project = write_project (dir, "1", &loop_csv);
  g_autofree char *line = NULL;
  g_autofree char *kept = NULL;
  g_autofree char *saved = NULL;
  g_auto(GStrv) parts = NULL;
  Drape a;

  if (!xserver_start (&x))
    return;
  app = start_app (&x, DF_APP_PATH, &out, project, "--drape", "Belly patch;90;5;10;4", NULL);
  line = read_until (out, "draped ");
  g_assert_nonnull (line);
  parse_draped (line, &a);
  xdotool_va (&x, "search", "--sync", "--onlyvisible", "--name", "Woven-Ply Drape",
              "windowfocus", "sleep", "0.5", "key", "alt+k", NULL);
  kept = read_until (out, "drape-kept ");
  g_assert_nonnull (kept);
  parts = g_strsplit (kept, " ", -1);
  g_assert_cmpuint (g_strv_length (parts), ==, 5);
  focus_main (&x);
  xdotool_va (&x, "key", "ctrl+s", NULL);
  saved = read_until (out, "saved ");
  g_assert_nonnull (saved);
  g_subprocess_force_exit (app);
  g_subprocess_wait (app, NULL, NULL);
  xserver_stop (&x);

  {
    JsonObject *v = find_verdict (cli_check_verdicts (DF_CLI_PATH, project, parser),
                                  "Belly patch", "max-shear-deg");
    JsonObject *d;
    JsonArray *start;

    g_assert_nonnull (v);
    d = json_object_get_object_member (v, "drape");
    start = json_object_get_array_member (d, "start");
    /* Typed as t = 90, phi = 5 degrees, warp 10 degrees, 4 mm cells. */
    df_assert_close (json_array_get_double_element (start, 0), 90, 1e-12, 0);
    df_assert_close (json_array_get_double_element (start, 1), 5 * G_PI / 180, 1e-12, 0);
    df_assert_close (json_object_get_double_member (d, "warp_deg"), 10, 1e-12, 0);
    df_assert_close (json_object_get_double_member (d, "cell"), 4, 1e-12, 0);
    g_assert_false (json_object_get_boolean_member (d, "warp_default"));
    /* The drape window saw cells past 1 degree; so does check with the same drape. */
    g_assert_cmpfloat (a.over, >, 0);
    g_assert_false (json_object_get_boolean_member (v, "within"));
  }
  g_remove (loop_csv);
  g_remove (project);
  g_rmdir (dir);
}

/* The pins and flat-outline CSVs exported from the app with the display unit m are the CLI's
 * `drape --units m --nodes --flat` of the same drape, byte for byte (one writer); then a new
 * surface (measured data typed into the import dialog) clears the drape. */
static void
test_csv_exports_and_surface_change (void)
{
  Xserver x;
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GSubprocess) cli = NULL;
  g_autoptr(GError) error = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_autofree char *dir = g_dir_make_tmp ("df-drape-XXXXXX", NULL);
  g_autofree char *loop_csv = NULL;
  g_autofree char *project = write_project (dir, "5", &loop_csv);
  g_autofree char *app_pins = g_build_filename (dir, "app-pins.csv", NULL);
  g_autofree char *app_flat = g_build_filename (dir, "app-flat.csv", NULL);
  g_autofree char *cli_pins = g_build_filename (dir, "cli-pins.csv", NULL);
  g_autofree char *cli_flat = g_build_filename (dir, "cli-flat.csv", NULL);
  g_autofree char *profile = g_build_filename (dir, "cap.csv", NULL);
  g_autofree char *line = NULL;
  g_autofree char *a_text = NULL, *c_text = NULL, *af_text = NULL, *cf_text = NULL;
  g_autoptr(GString) cap = g_string_new ("r,z\n");
  char start[64];

  for (int i = 0; i <= 20; i++)
    g_string_append_printf (cap, "%.17g,%.17g\n", 50 * sin (G_PI / 2 * i / 20),
                            50 * cos (G_PI / 2 * i / 20));
  g_assert_true (g_file_set_contents (profile, cap->str, -1, NULL));
  if (!xserver_start (&x))
    return;
  /* The cell typed in the display unit: 4 mm = 0.004 m. */
  app = start_app (&x, DF_APP_PATH, &out, project, "--units", "m", "--drape",
                   "Belly patch;90;5;10;0.004", NULL);
  line = read_until (out, "draped ");
  g_assert_nonnull (line);
  for (int k = 0; k < 2; k++)
    {
      const char *key = k == 0 ? "alt+n" : "alt+o";
      const char *title = k == 0 ? "Export Drape Pins" : "Export Flat Outline";
      g_autofree char *exported = NULL;

      xdotool_va (&x, "search", "--sync", "--onlyvisible", "--name", "Woven-Ply Drape",
                  "windowfocus", "sleep", "0.5", "key", key, NULL);
      xdotool_va (&x, "search", "--sync", "--onlyvisible", "--name", title, "windowfocus",
                  "sleep", "0.5", NULL);
      type_field (&x, k == 0 ? app_pins : app_flat);
      xdotool_va (&x, "key", "Return", NULL);
      exported = read_until (out, "drape-exported ");
      g_assert_nonnull (exported);
    }

  g_snprintf (start, sizeof start, "90,%.17g", 5 * G_PI / 180);
  cli = g_subprocess_new (G_SUBPROCESS_FLAGS_STDOUT_SILENCE, &error, DF_CLI_PATH, "drape",
                          "--project", project, "--loop", loop_csv, "--start", start,
                          "--warp-deg", "10", "--cell", "0.004", "--units", "m", "--nodes",
                          cli_pins, "--flat", cli_flat, NULL);
  g_assert_no_error (error);
  g_assert_true (g_subprocess_wait_check (cli, NULL, &error));
  g_assert_true (g_file_get_contents (app_pins, &a_text, NULL, NULL));
  g_assert_true (g_file_get_contents (cli_pins, &c_text, NULL, NULL));
  g_assert_true (g_file_get_contents (app_flat, &af_text, NULL, NULL));
  g_assert_true (g_file_get_contents (cli_flat, &cf_text, NULL, NULL));
  g_assert_cmpuint (strlen (a_text), >, 1000);
  g_assert_cmpstr (a_text, ==, c_text);
  g_assert_cmpstr (af_text, ==, cf_text);

  /* A new surface: the drape goes (its pins were of the old one). */
  open_by_key (&x, "ctrl+shift+p", "Surface from Measured Data");
  xdotool_va (&x, "search", "--sync", "--onlyvisible", "--name", "Surface from Measured Data",
              "windowfocus", "sleep", "1", "type", "--delay", "20", profile, NULL);
  xdotool_va (&x, "sleep", "0.5", "key", "Return", NULL);
  g_free (line);
  line = read_until (out, "drape-cleared ");
  g_assert_cmpstr (line, ==, "drape-cleared surface");

  g_subprocess_force_exit (app);
  g_subprocess_wait (app, NULL, NULL);
  xserver_stop (&x);
  for (const char *const *p = (const char *const[]) { loop_csv, project, app_pins, app_flat,
                                                      cli_pins, cli_flat, profile, NULL };
       *p != NULL; p++)
    g_remove (*p);
  g_rmdir (dir);
}

int
main (int argc, char **argv)
{
  app_test_init (&argc, &argv);
  g_test_add_func ("/app/drape/typed", test_typed);
  g_test_add_func ("/app/drape/key-and-pick", test_key_and_pick);
  g_test_add_func ("/app/drape/limits-redrape", test_limits_redrape);
  g_test_add_func ("/app/drape/keep-for-check", test_keep_for_check);
  g_test_add_func ("/app/drape/csv-exports-surface-change", test_csv_exports_and_surface_change);
  return g_test_run ();
}
