/* test-app-units.c: end-to-end tests of the app's display units (issue 9, items 6 and 7), driven
 * under Xvfb with --units, xdotool and the app's --report-events lines (harness in
 * df-test-app.c): the demo shown in metres against the CLI's `report --units m` and the exact
 * factor 1000; the choice undone, redone, saved as [units] length=m and read back by the CLI
 * and by the app on reopening; inches (25.4 mm exactly) with Gaussian curvature per square
 * metre, for a loop, a probe and a typed geodesic length. Skips (with the reason) when Xvfb or
 * xdotool is missing. */
#include <gio/gio.h>
#include <glib/gstdio.h>
#include <json-glib/json-glib.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "df-glib.h"
#include "df-test.h"
#include "df-test-app.h"

/* The international inch: 25.4 mm exactly (1959 agreement; NIST SP 811, appendix B). */
#define MM_PER_INCH 25.4

static void
stop_app (GSubprocess *app)
{
  g_subprocess_force_exit (app);
  g_subprocess_wait (app, NULL, NULL);
}

/* The CLI's JSON output of args (NULL-terminated, after the command name), parsed. */
static JsonObject *
cli_json (JsonParser *parser,
          const char *first,
          ...)
{
  g_autoptr(GPtrArray) args = g_ptr_array_new ();
  g_autoptr(GSubprocess) cli = NULL;
  g_autoptr(GError) error = NULL;
  g_autoptr(GBytes) bytes = NULL;
  va_list ap;

  g_ptr_array_add (args, (char *) DF_CLI_PATH);
  va_start (ap, first);
  for (const char *a = first; a != NULL; a = va_arg (ap, const char *))
    g_ptr_array_add (args, (char *) a);
  va_end (ap);
  g_ptr_array_add (args, (char *) "--json");
  g_ptr_array_add (args, NULL);
  cli = g_subprocess_newv ((const char *const *) args->pdata, G_SUBPROCESS_FLAGS_STDOUT_PIPE,
                           &error);
  g_assert_no_error (error);
  g_subprocess_communicate (cli, NULL, NULL, &bytes, NULL, &error);
  g_assert_no_error (error);
  json_parser_load_from_data (parser, g_bytes_get_data (bytes, NULL),
                              (gssize) g_bytes_get_size (bytes), &error);
  g_assert_no_error (error);
  return json_node_get_object (json_parser_get_root (parser));
}

/* The loop named name in `report --json` (with --units unit when not NULL). */
static JsonObject *
cli_report_loop (JsonParser *parser,
                 const char *project,
                 const char *unit,
                 const char *name)
{
  JsonObject *root = unit != NULL
                     ? cli_json (parser, "report", "--project", project, "--units", unit, NULL)
                     : cli_json (parser, "report", "--project", project, NULL);
  JsonArray *loops = json_object_get_array_member (root, "loops");

  for (guint i = 0; i < json_array_get_length (loops); i++)
    {
      JsonObject *loop = json_array_get_object_element (loops, i);

      if (g_str_equal (json_object_get_string_member (loop, "name"), name))
        return loop;
    }
  g_assert_not_reached ();
}

typedef struct
{
  char  *name;
  char  *unit;
  double length, area, steering;
  char  *k_unit;
  double mean_k;
} Shown;

static void
shown_clear (Shown *s)
{
  g_free (s->name);
  g_free (s->unit);
  g_free (s->k_unit);
}

/* "loop-shown NAME UNIT LENGTH AREA STEERING K_UNIT MEAN_K" (the values the details show, in
 * full). */
static void
read_shown (GDataInputStream *out,
            Shown            *s)
{
  g_autofree char *line = read_until (out, "loop-shown ");
  g_auto(GStrv) parts = NULL;

  g_assert_nonnull (line);
  parts = g_strsplit (line, " ", -1);
  g_assert_cmpuint (g_strv_length (parts), ==, 8);
  s->name = g_strdup (parts[1]);
  s->unit = g_strdup (parts[2]);
  s->length = g_ascii_strtod (parts[3], NULL);
  s->area = g_ascii_strtod (parts[4], NULL);
  s->steering = g_ascii_strtod (parts[5], NULL);
  s->k_unit = g_strdup (parts[6]);
  s->mean_k = g_ascii_strtod (parts[7], NULL);
}

static void
expect_line (GDataInputStream *out,
             const char       *prefix,
             const char       *want)
{
  g_autofree char *line = read_until (out, prefix);

  g_assert_nonnull (line);
  g_assert_cmpstr (line, ==, want);
}

/* (a) The demo (mm) in metres: the selected loop's length and steering radius as the details
 * show them equal the CLI's `report --units m` (another front end over the same conversion)
 * and the CLI's millimetres divided by 1000 (the definition of the millimetre). */
static void
test_demo_in_metres (void)
{
  Xserver x;
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_autoptr(JsonParser) p_m = json_parser_new ();
  g_autoptr(JsonParser) p_mm = json_parser_new ();
  g_autofree char *demo = g_build_filename (DF_EXAMPLES_DIR, "demo.dfproj", NULL);
  JsonObject *m, *mm;
  Shown s = { 0 };

  if (!xserver_start (&x))
    return;
  app = start_app (&x, DF_APP_PATH, &out, "--demo", "--units", "m", NULL);
  /* Opening the project shows it in its own units; --units is then applied as an edit. */
  expect_line (out, "units ", "units mm mm");
  expect_line (out, "units ", "units m m");
  read_shown (out, &s);
  g_assert_cmpstr (s.unit, ==, "m");
  m = cli_report_loop (p_m, demo, "m", "Rim band");
  mm = cli_report_loop (p_mm, demo, NULL, "Rim band");
  g_assert_cmpstr (s.name, ==, "Rim_band");
  df_assert_close (s.length, json_object_get_double_member (m, "length"), 1e-12, 0);
  df_assert_close (s.length, json_object_get_double_member (mm, "length") / 1000, 1e-12, 0);
  df_assert_close (s.steering, json_object_get_double_member (m, "min_steering_radius"), 1e-12, 0);
  df_assert_close (s.steering, json_object_get_double_member (mm, "min_steering_radius") / 1000,
                   1e-12, 0);
  /* The rim band goes round the axis: it bounds no disc, so no area is shown (not a number). */
  g_assert_true (isnan (s.area));
  g_assert_true (json_object_get_null_member (m, "area"));
  shown_clear (&s);
  stop_app (app);
  xserver_stop (&x);
}

/* (b) The choice is an edit: undone and redone, saved as [units] length=m (the key the CLI
 * reads: `check` on the saved file answers in m), and the reopened project shows metres again
 * without being asked. */
static void
test_units_saved (void)
{
  Xserver x;
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_autoptr(GKeyFile) saved = g_key_file_new ();
  g_autoptr(JsonParser) parser = json_parser_new ();
  g_autoptr(GError) error = NULL;
  g_autofree char *dir = g_dir_make_tmp ("df-units-XXXXXX", NULL);
  g_autofree char *path = g_build_filename (dir, "shade.dfproj", NULL);
  g_autofree char *demo_path = g_build_filename (DF_EXAMPLES_DIR, "demo.dfproj", NULL);
  g_autofree char *demo = NULL, *line = NULL, *want = NULL, *length = NULL;
  g_auto(GStrv) geometry = NULL;
  JsonObject *check;
  Shown first = { 0 }, again = { 0 };

  if (!xserver_start (&x))
    return;
  g_file_get_contents (demo_path, &demo, NULL, &error);
  g_assert_no_error (error);
  g_assert_null (strstr (demo, "[units]"));
  g_file_set_contents (path, demo, -1, &error);
  g_assert_no_error (error);

  app = start_app (&x, DF_APP_PATH, &out, path, "--units", "m", NULL);
  expect_line (out, "units ", "units mm mm");
  expect_line (out, "units ", "units m m");
  read_shown (out, &first);
  g_assert_cmpstr (first.unit, ==, "m");
  geometry = read_view_geometry (out);
  focus_view (&x, geometry);
  xdotool_va (&x, "key", "ctrl+z", NULL);
  expect_line (out, "units ", "units mm mm");
  xdotool_va (&x, "key", "ctrl+shift+z", NULL);
  expect_line (out, "units ", "units m m");
  xdotool_va (&x, "key", "ctrl+s", NULL);
  line = read_until (out, "saved ");
  g_assert_nonnull (line);
  g_assert_cmpstr (line + strlen ("saved "), ==, path);
  stop_app (app);
  g_clear_object (&app);
  g_clear_object (&out);

  g_key_file_load_from_file (saved, path, G_KEY_FILE_NONE, &error);
  g_assert_no_error (error);
  length = g_key_file_get_string (saved, "units", "length", &error);
  g_assert_no_error (error);
  g_assert_cmpstr (length, ==, "m");
  /* Curvature follows the lengths: nothing more is written. */
  g_assert_false (g_key_file_has_key (saved, "units", "curvature", NULL));
  check = cli_json (parser, "check", "--project", path, NULL);
  g_assert_cmpstr (json_object_get_string_member (check, "units"), ==, "m");

  app = start_app (&x, DF_APP_PATH, &out, path, NULL);
  expect_line (out, "units ", "units m m");
  read_shown (out, &again);
  g_assert_cmpstr (again.unit, ==, "m");
  g_assert_cmpfloat (again.length, ==, first.length);
  shown_clear (&first);
  shown_clear (&again);
  stop_app (app);
  xserver_stop (&x);
  g_remove (path);
  g_rmdir (dir);
}

/* (c) Inches for lengths, K per square metre, on the demo without its rim band (so the belly
 * patch, which bounds a disc, is the loop shown): its length and area are the CLI's
 * millimetres over 25.4 and 25.4², its mean K the CLI's per mm² times 1000² and what
 * `report --units in --curvature-units m` gives; a typed probe's point is in inches and its K
 * and H per m as `probe --units in` and `--curvature-units m` give them; a geodesic length
 * typed as 2 (inches) is shot as 50.8 mm. */
static void
test_inches_curvature_per_m2 (void)
{
  Xserver x;
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_autoptr(JsonParser) p_mm = json_parser_new ();
  g_autoptr(JsonParser) p_in = json_parser_new ();
  g_autoptr(JsonParser) p_m = json_parser_new ();
  g_autoptr(JsonParser) p_shown = json_parser_new ();
  g_autoptr(GKeyFile) key_file = g_key_file_new ();
  g_autoptr(GError) error = NULL;
  g_autofree char *demo_path = g_build_filename (DF_EXAMPLES_DIR, "demo.dfproj", NULL);
  g_autofree char *dir = g_dir_make_tmp ("df-units-XXXXXX", NULL);
  g_autofree char *demo = g_build_filename (dir, "belly.dfproj", NULL);
  g_autofree char *line = NULL;
  g_auto(GStrv) parts = NULL;
  char at[64], v[G_ASCII_DTOSTR_BUF_SIZE];
  JsonObject *mm, *shown, *probe_in, *probe_m;
  JsonArray *point;
  Shown s = { 0 };
  double ended = 0;

  if (!xserver_start (&x))
    return;
  g_key_file_load_from_file (key_file, demo_path, G_KEY_FILE_KEEP_COMMENTS, &error);
  g_assert_no_error (error);
  g_assert_true (g_key_file_remove_group (key_file, "loop 1", &error));
  g_key_file_save_to_file (key_file, demo, &error);
  g_assert_no_error (error);

  app = start_app (&x, DF_APP_PATH, &out, demo, "--units", "in,m", NULL);
  expect_line (out, "units ", "units mm mm");
  expect_line (out, "units ", "units in m");
  read_shown (out, &s);
  g_assert_cmpstr (s.name, ==, "Belly_patch");
  g_assert_cmpstr (s.unit, ==, "in");
  g_assert_cmpstr (s.k_unit, ==, "m");
  mm = cli_report_loop (p_mm, demo, NULL, "Belly patch");
  df_assert_close (s.length, json_object_get_double_member (mm, "length") / MM_PER_INCH, 1e-12,
                   0);
  df_assert_close (s.area, json_object_get_double_member (mm, "area")
                             / (MM_PER_INCH * MM_PER_INCH), 1e-12, 0);
  /* 1/mm² = 10⁶ /m² (the definition of the millimetre). */
  df_assert_close (s.mean_k, json_object_get_double_member (mm, "mean_gaussian_curvature") * 1e6,
                   1e-12, 0);
  {
    JsonObject *root = cli_json (p_shown, "report", "--project", demo, "--units", "in",
                                 "--curvature-units", "m", NULL);

    shown = json_array_get_object_element (json_object_get_array_member (root, "loops"), 0);
    g_assert_cmpstr (json_object_get_string_member (shown, "name"), ==, "Belly patch");
    df_assert_close (s.length, json_object_get_double_member (shown, "length"), 1e-12, 0);
    df_assert_close (s.mean_k, json_object_get_double_member (shown, "mean_gaussian_curvature"),
                     1e-12, 0);
  }
  shown_clear (&s);

  /* Probe at t = 90 mm, phi = 30 degrees (typed as the app takes it). */
  focus_main (&x);
  xdotool_va (&x, "key", "ctrl+3", "sleep", "0.5", "key", "ctrl+t", NULL);
  type_field (&x, "90, 30");
  xdotool_va (&x, "key", "Return", NULL);
  line = read_until (out, "probe-shown ");
  g_assert_nonnull (line);
  parts = g_strsplit (line, " ", -1);
  g_assert_cmpuint (g_strv_length (parts), ==, 8);
  g_assert_cmpstr (parts[1], ==, "in");
  g_assert_cmpstr (parts[2], ==, "m");
  g_snprintf (at, sizeof at, "90,%s", g_ascii_dtostr (v, sizeof v, 30 * G_PI / 180));
  probe_in = cli_json (p_in, "probe", "--surface", demo, "--at", at, "--units", "in", NULL);
  probe_m = cli_json (p_m, "probe", "--surface", demo, "--at", at, "--units", "m", NULL);
  point = json_object_get_array_member (probe_in, "point");
  for (int k = 0; k < 3; k++)
    df_assert_close (g_ascii_strtod (parts[3 + k], NULL),
                     json_array_get_double_element (point, k), 1e-12, 1e-15);
  df_assert_close (g_ascii_strtod (parts[6], NULL),
                   json_object_get_double_member (probe_m, "gaussian_curvature"), 1e-12, 0);
  /* H per the curvature unit (per m), as the CLI's probe --curvature-units m, so that
   * K = k1 k2 holds in the figures shown. */
  df_assert_close (g_ascii_strtod (parts[7], NULL),
                   json_object_get_double_member (probe_m, "mean_curvature"), 1e-12, 0);
  g_clear_pointer (&line, g_free);

  /* A geodesic typed with length 2: the field is in inches. The project's own geodesic (120
   * mm) is shot again at start and after the change of units; the typed one comes after. */
  xdotool_va (&x, "key", "ctrl+4", "sleep", "0.5", "key", "ctrl+t", NULL);
  type_field (&x, "90, 30");
  xdotool_va (&x, "key", "Tab", NULL);
  type_field (&x, "0");
  xdotool_va (&x, "key", "Tab", NULL);
  type_field (&x, "2");
  xdotool_va (&x, "key", "Return", NULL);
  do
    {
      g_auto(GStrv) end = NULL;

      g_clear_pointer (&line, g_free);
      line = read_until (out, "geodesic-end ");
      g_assert_nonnull (line);
      end = g_strsplit (line, " ", -1);
      g_assert_cmpuint (g_strv_length (end), ==, 4);
      ended = g_ascii_strtod (end[3], NULL);
    }
  while (ended == 120);
  df_assert_close (ended, 2 * MM_PER_INCH, 1e-9, 0);
  stop_app (app);
  xserver_stop (&x);
  g_remove (demo);
  g_rmdir (dir);
}

/* The loops summary exported by the app with --units m has the columns and numbers of the
 * CLI's `report --units m --summary` on the same project (the CLI converts with the same
 * factors; both are checked against the millimetre values times 1/1000 above). */
static void
test_summary_csv_metres (void)
{
  Xserver x;
  g_autoptr(GSubprocessLauncher) launcher = NULL;
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GSubprocess) cli = NULL;
  g_autoptr(GError) error = NULL;
  g_autofree char *dir = g_dir_make_tmp ("df-units-XXXXXX", NULL);
  g_autofree char *app_csv = g_build_filename (dir, "app.csv", NULL);
  g_autofree char *cli_csv = g_build_filename (dir, "cli.csv", NULL);
  g_autofree char *demo = g_build_filename (DF_EXAMPLES_DIR, "demo.dfproj", NULL);
  g_autoptr(GPtrArray) a_rows = NULL;
  g_autoptr(GPtrArray) c_rows = NULL;
  g_auto(GStrv) a_head = NULL;
  g_auto(GStrv) c_head = NULL;
  const char *columns[] = { "length_m", "area_m2", "min_steering_radius_m", "holonomy_rad",
                            "mean_K_per_m2" };

  if (!xserver_start (&x))
    return;
  launcher = app_launcher (&x);
  app = g_subprocess_launcher_spawn (launcher, &error, DF_APP_PATH, "--demo", "--units", "m",
                                     "--export-summary", app_csv, NULL);
  g_assert_no_error (error);
  g_assert_true (app_wait (app));
  g_assert_true (g_subprocess_get_successful (app));
  cli = g_subprocess_new (G_SUBPROCESS_FLAGS_STDOUT_SILENCE, &error, DF_CLI_PATH, "report",
                          "--project", demo, "--units", "m", "--summary", cli_csv, NULL);
  g_assert_no_error (error);
  g_assert_true (g_subprocess_wait_check (cli, NULL, &error));
  g_assert_no_error (error);
  a_rows = read_csv (app_csv, &a_head);
  c_rows = read_csv (cli_csv, &c_head);
  g_assert_cmpuint (g_strv_length (a_head), ==, g_strv_length (c_head));
  for (guint k = 0; a_head[k] != NULL; k++)
    g_assert_cmpstr (a_head[k], ==, c_head[k]);
  g_assert_cmpuint (a_rows->len, ==, c_rows->len);
  g_assert_cmpuint (a_rows->len, ==, 3);
  for (guint r = 0; r < a_rows->len; r++)
    for (guint k = 0; k < G_N_ELEMENTS (columns); k++)
      {
        int col = column_of (a_head, columns[k]);
        char **a_fields = g_ptr_array_index (a_rows, r);
        char **c_fields = g_ptr_array_index (c_rows, r);

        g_assert_cmpint (col, >=, 0);
        /* A value that does not exist (the rim band's area) is an empty field in both. */
        if (c_fields[col][0] == '\0')
          g_assert_cmpstr (a_fields[col], ==, "");
        else
          df_assert_close (field (a_rows, r, col), field (c_rows, r, col), 1e-12, 0);
      }
  xserver_stop (&x);
  g_remove (app_csv);
  g_remove (cli_csv);
  g_rmdir (dir);
}

/* On a graph the chart is the plan: x, y typed with lengths shown in m are in m. The saddle
 * z = (x^2 - y^2) / (2R), R = 200 mm (the preset's closed form), probed at x = 0.05 m,
 * y = 0.02 m: the point shown is (0.05, 0.02, 0.00525) m, and K = -1 / (R^2 (1 + |grad f|^2)^2)
 * (the graph's Gaussian curvature, from memory) per m^2. */
static void
test_graph_plan_typed_in_metres (void)
{
  Xserver x;
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_autofree char *line = NULL;
  g_auto(GStrv) parts = NULL;
  const double R = 200, px = 50, py = 20;
  double fx = px / R, fy = -py / R, w = 1 + fx * fx + fy * fy;

  if (!xserver_start (&x))
    return;
  app = start_app (&x, DF_APP_PATH, &out, "--preset", "saddle", "--units", "m", NULL);
  g_strfreev (read_view_geometry (out));
  focus_main (&x);
  xdotool_va (&x, "key", "ctrl+3", "sleep", "0.5", "key", "ctrl+t", NULL);
  type_field (&x, "0.05, 0.02");
  xdotool_va (&x, "key", "Return", NULL);
  line = read_until (out, "probe-shown ");
  g_assert_nonnull (line);
  parts = g_strsplit (line, " ", -1);
  g_assert_cmpuint (g_strv_length (parts), ==, 8);
  g_assert_cmpstr (parts[1], ==, "m");
  df_assert_close (g_ascii_strtod (parts[3], NULL), px / 1000, 1e-12, 0);
  df_assert_close (g_ascii_strtod (parts[4], NULL), py / 1000, 1e-12, 0);
  df_assert_close (g_ascii_strtod (parts[5], NULL), (px * px - py * py) / (2 * R) / 1000, 1e-12,
                   0);
  /* K per m^2 is 10^6 times K per mm^2 (1 m = 1000 mm). */
  df_assert_close (g_ascii_strtod (parts[6], NULL), -1e6 / (R * R * w * w), 1e-9, 0);
  stop_app (app);
  xserver_stop (&x);
}

int
main (int   argc,
      char *argv[])
{
  app_test_init (&argc, &argv);
  g_test_add_func ("/app/units/demo-in-metres", test_demo_in_metres);
  g_test_add_func ("/app/units/saved", test_units_saved);
  g_test_add_func ("/app/units/inches-curvature-per-m2", test_inches_curvature_per_m2);
  g_test_add_func ("/app/units/summary-csv-metres", test_summary_csv_metres);
  g_test_add_func ("/app/units/graph-plan-typed-in-metres", test_graph_plan_typed_in_metres);
  return g_test_run ();
}
