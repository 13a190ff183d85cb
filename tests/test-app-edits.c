/* test-app-edits.c: end-to-end tests of the app's edits beyond sketching (issue 11), driven
 * from outside under Xvfb with xdotool (harness in df-test-app.c): undo and redo of a geodesic
 * and of a surface change that removed it; a path pair read from CSV files and compared; a
 * project with one bad loop opening the rest and naming it; a loop typed into the typed-loop
 * dialog against a sphere cap's closed form; the colour scale of a one-signed quantity; Save
 * As keeping the project's name. Skips
 * (with the reason) when Xvfb or xdotool is missing. */
#include <gio/gio.h>
#include <glib/gstdio.h>
#include <json-glib/json-glib.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "df-glib.h"
#include "df-test.h"
#include "df-test-app.h"

/* The sphere preset (src/core/df-presets.c): R = 100, chart t = polar angle, phi = longitude. */
#define R_SPHERE 100.0

static void
stop_app (GSubprocess *app,
          Xserver     *x)
{
  g_subprocess_force_exit (app);
  g_subprocess_wait (app, NULL, NULL);
  xserver_stop (x);
}

/* Save As from the main window to path (typed into the file chooser): the app's "saved "
 * line (g_free), NULL when none came. */
static char *
save_as (Xserver          *x,
         GDataInputStream *out,
         const char       *path)
{
  focus_main (x);
  open_by_key (x, "ctrl+shift+s", "Save Project");
  xdotool_va (x, "search", "--sync", "--onlyvisible", "--name", "Save Project", "windowfocus",
              "sleep", "1", "key", "ctrl+a", "type", "--delay", "20", path, NULL);
  xdotool_va (x, "sleep", "0.5", "key", "Return", NULL);
  return read_until (out, "saved ");
}

static void
expect_shown (GDataInputStream *out,
              const char       *what)
{
  g_autofree char *line = read_until (out, "extras-shown ");

  g_assert_nonnull (line);
  g_assert_cmpstr (line, ==, what);
}

/* A shot geodesic is part of the project: Ctrl+Z removes it and Ctrl+Shift+Z shoots the same
 * one again; a surface change removes it (its heading is measured from the old chart's X_u)
 * and undoing the change brings it back with the same end. Heading 0 along +t is a meridian,
 * a great circle, so its end is at t0 + L / R (do Carmo sec. 4-4, from memory). */
static void
test_undo_geodesic (void)
{
  Xserver x;
  g_autofree char *dir = g_dir_make_tmp ("df-edits-XXXXXX", NULL);
  g_autofree char *surface = g_build_filename (dir, "big.surface", NULL);
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_auto(GStrv) geometry = NULL;
  g_autoptr(GError) error = NULL;
  char *line;
  double end[3], again[3];

  if (!xserver_start (&x))
    return;
  app = start_app (&x, DF_APP_PATH, &out, "--preset", "sphere", "--tool", "geodesic", NULL);
  geometry = read_view_geometry (out);
  focus_main (&x);
  xdotool_va (&x, "key", "ctrl+t", NULL);
  type_field (&x, "0.6, 0");
  xdotool_va (&x, "key", "Tab", NULL);
  type_field (&x, "0");
  xdotool_va (&x, "key", "Tab", NULL);
  type_field (&x, "50");
  xdotool_va (&x, "key", "Return", NULL);
  line = read_until (out, "geodesic-end ");
  g_assert_nonnull (line);
  parse_three (line, end);
  g_free (line);
  df_assert_close (end[0], 0.6 + 50 / R_SPHERE, 1e-6, 1e-8);

  focus_view (&x, geometry);
  xdotool_va (&x, "key", "ctrl+z", NULL);
  expect_shown (out, "extras-shown 0 0");
  xdotool_va (&x, "key", "ctrl+shift+z", NULL);
  line = read_until (out, "geodesic-end ");
  g_assert_nonnull (line);
  parse_three (line, again);
  g_free (line);
  for (int i = 0; i < 3; i++)
    df_assert_close (again[i], end[i], 1e-12, 1e-12);
  expect_shown (out, "extras-shown 1 0");

  /* Another sphere (R = 150) through Replace Surface: the geodesic is removed, not read on
   * the new chart; Ctrl+Z restores the first sphere and the same geodesic. */
  g_file_set_contents (surface, "[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\n"
                                "t-min=0\nt-max=pi\n[parameters]\nR=150\n", -1, &error);
  g_assert_no_error (error);
  focus_main (&x);
  xdotool_va (&x, "key", "ctrl+r", NULL);
  xdotool_va (&x, "search", "--sync", "--onlyvisible", "--name", "Replace Surface",
              "windowfocus", "sleep", "1", "type", "--delay", "20", surface, NULL);
  xdotool_va (&x, "sleep", "0.5", "key", "Return", NULL);
  expect_shown (out, "extras-shown 0 0");
  focus_view (&x, geometry);
  xdotool_va (&x, "key", "ctrl+z", NULL);
  line = read_until (out, "geodesic-end ");
  g_assert_nonnull (line);
  parse_three (line, again);
  g_free (line);
  for (int i = 0; i < 3; i++)
    df_assert_close (again[i], end[i], 1e-12, 1e-12);

  stop_app (app, &x);
  g_remove (surface);
  g_rmdir (dir);
}

/* Path B: phi_B(t) = 0.5 sin(2 pi (t - 0.5)) from t = 0.5 to 1, both ends on path A, the
 * meridian phi = 0. */
static double
phi_b (double t)
{
  return 0.5 * sin (2 * G_PI * (t - 0.5));
}

/* Paths A and B from CSV files, typed into the file dialogs: the angle between the directions
 * carried along them is the curvature enclosed between them (Gauss-Bonnet), on the unit-K
 * sphere of radius R: |angle| = int_{0.5}^{1} phi_B(t) sin t dt (K dA = sin t dt dphi; do
 * Carmo sec. 4-5, from memory), integrated here by composite Simpson on 2000 panels. A along
 * the meridian is R * 0.5 long. Ctrl+Z removes the pair, which is part of the project. */
static void
test_paths_from_csv (void)
{
  Xserver x;
  g_autofree char *dir = g_dir_make_tmp ("df-edits-XXXXXX", NULL);
  g_autofree char *a_path = g_build_filename (dir, "a.csv", NULL);
  g_autofree char *b_path = g_build_filename (dir, "b.csv", NULL);
  g_autoptr(GString) a = g_string_new ("u,v\n");
  g_autoptr(GString) b = g_string_new ("u,v\n");
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_auto(GStrv) geometry = NULL;
  g_auto(GStrv) parts = NULL;
  g_autoptr(GError) error = NULL;
  g_autofree char *line = NULL;
  double expected = 0, h = 0.5 / 2000;

  for (int i = 0; i <= 40; i++)
    {
      double t = 0.5 + 0.5 * i / 40;
      char tu[G_ASCII_DTOSTR_BUF_SIZE], pv[G_ASCII_DTOSTR_BUF_SIZE];

      g_string_append_printf (a, "%s,0\n", g_ascii_dtostr (tu, sizeof tu, t));
      g_string_append_printf (b, "%s,%s\n", tu, g_ascii_dtostr (pv, sizeof pv, phi_b (t)));
    }
  for (int i = 0; i <= 2000; i++)
    {
      double t = 0.5 + i * h, w = (i == 0 || i == 2000) ? 1 : (i % 2 ? 4 : 2);
      expected += w * phi_b (t) * sin (t) * h / 3;
    }
  g_file_set_contents (a_path, a->str, -1, &error);
  g_assert_no_error (error);
  g_file_set_contents (b_path, b->str, -1, &error);
  g_assert_no_error (error);

  if (!xserver_start (&x))
    return;
  app = start_app (&x, DF_APP_PATH, &out, "--preset", "sphere", NULL);
  geometry = read_view_geometry (out);
  focus_main (&x);
  open_by_key (&x, "ctrl+alt+a", "Import Path A");
  xdotool_va (&x, "search", "--sync", "--onlyvisible", "--name", "Import Path A",
              "windowfocus", "sleep", "1", "type", "--delay", "20", a_path, NULL);
  xdotool_va (&x, "sleep", "0.5", "key", "Return", NULL);
  focus_main (&x);
  open_by_key (&x, "ctrl+alt+b", "Import Path B");
  xdotool_va (&x, "search", "--sync", "--onlyvisible", "--name", "Import Path B",
              "windowfocus", "sleep", "1", "type", "--delay", "20", b_path, NULL);
  xdotool_va (&x, "sleep", "0.5", "key", "Return", NULL);
  line = read_until (out, "paths-compared ");
  g_assert_nonnull (line);
  parts = g_strsplit (line, " ", -1);
  g_assert_cmpuint (g_strv_length (parts), ==, 4);
  df_assert_close (fabs (g_ascii_strtod (parts[1], NULL)), expected, 1e-5, 1e-7);
  df_assert_close (g_ascii_strtod (parts[2], NULL), 0.5 * R_SPHERE, 1e-8, 1e-8);
  g_assert_cmpfloat (g_ascii_strtod (parts[3], NULL), >, 0.5 * R_SPHERE);

  focus_view (&x, geometry);
  xdotool_va (&x, "key", "ctrl+z", NULL);
  expect_shown (out, "extras-shown 0 0");
  xdotool_va (&x, "key", "ctrl+shift+z", NULL);
  expect_shown (out, "extras-shown 0 1");

  stop_app (app, &x);
  g_remove (a_path);
  g_remove (b_path);
  g_rmdir (dir);
}

/* A project whose second loop is broken (u and v of different lengths) opens with the other
 * two loops, both measured, and names the bad one by file and group. */
static void
test_bad_loop_project (void)
{
  Xserver x;
  g_autofree char *dir = g_dir_make_tmp ("df-edits-XXXXXX", NULL);
  g_autofree char *path = g_build_filename (dir, "part.dfproj", NULL);
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_autoptr(GError) error = NULL;
  g_autofree char *skipped = NULL;
  g_autofree char *opened = NULL;
  g_autofree char *first = NULL;
  g_autofree char *second = NULL;

  g_file_set_contents (path, "[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\n"
                             "t-max=pi\n[parameters]\nR=100\n"
                             "[loop 1]\nname=Good one\nu=0.5;0.5;0.5;0.5\nv=0;1.5;3;4.5\n"
                             "[loop 2]\nname=Broken\nu=0.5;0.6;0.7\nv=0;1\n"
                             "[loop 3]\nname=Good two\nu=0.8;0.8;0.8;0.8\nv=0;1.5;3;4.5\n",
                       -1, &error);
  g_assert_no_error (error);
  if (!xserver_start (&x))
    return;
  app = start_app (&x, DF_APP_PATH, &out, path, NULL);
  skipped = read_until (out, "loop-skipped ");
  g_assert_nonnull (skipped);
  g_assert_nonnull (strstr (skipped, "part.dfproj"));
  g_assert_nonnull (strstr (skipped, "[loop 2]"));
  opened = read_until (out, "loops-opened ");
  g_assert_cmpstr (opened, ==, "loops-opened 2");
  first = read_until (out, "loop-measured Good_");
  second = read_until (out, "loop-measured Good_");
  g_assert_nonnull (first);
  g_assert_nonnull (second);
  g_assert_cmpstr (first, !=, second);
  stop_app (app, &x);
  g_remove (path);
  g_rmdir (dir);
}

/* A loop typed into the Ctrl+Shift+T dialog: the latitude circle t = theta of the sphere
 * preset, typed as (t, phi) rows with phi increasing, so the north cap (polar angle < theta)
 * lies on its left. Gauss-Bonnet for a cap of a sphere (K = 1/R^2, area 2 pi R^2 (1 - cos
 * theta); do Carmo sec. 4-5, from memory): enclosed curvature 2 pi (1 - cos theta), and the
 * holonomy that angle wrapped to (-pi, pi]. theta = 1.2 makes the cap's 4.006 rad wrap to
 * -2.277 rad, so the test also sees the wrapping. */
static void
test_typed_loop_latitude (void)
{
  const double theta = 1.2;
  const int n = 16;
  Xserver x;
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_auto(GStrv) geometry = NULL;
  g_autofree char *line = NULL;
  double holonomy, enclosed, cap = 2 * G_PI * (1 - cos (theta)), wrapped = cap;

  while (wrapped > G_PI)
    wrapped -= 2 * G_PI;
  if (!xserver_start (&x))
    return;
  app = start_app (&x, DF_APP_PATH, &out, "--preset", "sphere", NULL);
  geometry = read_view_geometry (out);
  focus_main (&x);
  open_by_key (&x, "ctrl+shift+t", "Loop from Typed Points");
  /* The dialog opens with the header "u,v" and the cursor on the next row. */
  xdotool_va (&x, "search", "--sync", "--onlyvisible", "--name", "Loop from Typed Points",
              "windowfocus", "sleep", "1", NULL);
  /* Row by row: xdotool types no line breaks; Return makes each new row. */
  for (int k = 0; k < n; k++)
    {
      char a[G_ASCII_DTOSTR_BUF_SIZE], b[G_ASCII_DTOSTR_BUF_SIZE];
      g_autofree char *row = g_strdup_printf ("%s,%s",
                                              g_ascii_formatd (a, sizeof a, "%.3f", theta),
                                              g_ascii_formatd (b, sizeof b, "%.12f",
                                                               2 * G_PI * k / n));

      xdotool_va (&x, "type", "--delay", "30", row, NULL);
      xdotool_va (&x, "key", "Return", NULL);
    }
  xdotool_va (&x, "sleep", "0.5", "key", "ctrl+Return", NULL);
  line = read_until (out, "loop-measured ");
  g_assert_nonnull (line);
  parse_measured (line, &holonomy, &enclosed);
  df_assert_close (holonomy, wrapped, 1e-7, 1e-7);
  df_assert_close (enclosed, cap, 1e-7, 1e-7);
  stop_app (app, &x);
}

/* The colour scale of a quantity of one sign: the mean curvature of the paraboloid
 * z = c (x^2 + y^2) over [-50, 50]^2 with N up is H = c (2 + 4c^2 r^2) / (1 + 4c^2 r^2)^(3/2)
 * (the graph formula for H, do Carmo sec. 3-3 ex. 5, from memory): 2c at the centre, least at
 * the corners. The legend's span must lie within these (the scale runs over 1 % to 99 % of
 * the vertices) and no longer be forced symmetric about zero, which left one arm of the ramp
 * unused and the shape almost one colour. */
static void
test_one_signed_range (void)
{
  const double c = 0.005, corner = 50 * G_SQRT2;
  const double h_max = 2 * c;
  const double h_min = c * (2 + 4 * c * c * corner * corner)
                       / pow (1 + 4 * c * c * corner * corner, 1.5);
  Xserver x;
  g_autofree char *dir = g_dir_make_tmp ("df-edits-XXXXXX", NULL);
  g_autofree char *surface = g_build_filename (dir, "dish.surface", NULL);
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_autoptr(GError) error = NULL;
  double lo = 0, hi = 0;

  g_file_set_contents (surface, "[surface]\nkind=graph\nz=c*(x^2 + y^2)\nx-min=-50\n"
                                "x-max=50\ny-min=-50\ny-max=50\n[parameters]\nc=0.005\n", -1,
                       &error);
  g_assert_no_error (error);
  if (!xserver_start (&x))
    return;
  app = start_app (&x, DF_APP_PATH, &out, surface, "--colouring", "mean", NULL);
  /* The first report may come before the mesh (an empty range). */
  while (hi == 0)
    {
      g_autofree char *line = read_until (out, "shading-range ");
      g_auto(GStrv) parts = NULL;

      g_assert_nonnull (line);
      parts = g_strsplit (line, " ", -1);
      lo = g_ascii_strtod (parts[1], NULL);
      hi = g_ascii_strtod (parts[2], NULL);
    }
  g_assert_cmpfloat (lo, >, 0);
  g_assert_cmpfloat (lo, >=, h_min * (1 - 1e-9));
  g_assert_cmpfloat (hi, <=, h_max * (1 + 1e-9));
  /* Most of the span shows: the 1 % tails are small corners and the centre. */
  g_assert_cmpfloat (hi - lo, >, 0.5 * (h_max - h_min));
  stop_app (app, &x);
  g_remove (surface);
  g_rmdir (dir);
}

/* Save As keeps a project's given name as its title (it became the file's name): the saved
 * event names the typed path, and a window titled with the demo's name is still there. */
static void
test_save_as_title (void)
{
  Xserver x;
  g_autofree char *dir = g_dir_make_tmp ("df-edits-XXXXXX", NULL);
  g_autofree char *path = g_build_filename (dir, "shade-copy.dfproj", NULL);
  g_autofree char *expect = g_strdup_printf ("saved %s", path);
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_autofree char *line = NULL;

  if (!xserver_start (&x))
    return;
  app = start_app (&x, DF_APP_PATH, &out, "--demo", NULL);
  g_strfreev (read_view_geometry (out));
  line = save_as (&x, out, path);
  g_assert_cmpstr (line, ==, expect);
  g_assert_true (g_file_test (path, G_FILE_TEST_IS_REGULAR));
  /* Fails (xdotool exits 1) when no window has this title. */
  xdotool_va (&x, "sleep", "0.5", "search", "--onlyvisible", "--name",
              "^Lamp-shade demo — driftframe$", NULL);
  stop_app (app, &x);
  g_remove (path);
  g_rmdir (dir);
}

/* The data import's file dialog takes a typed path (a rough edge: it once did nothing): 41
 * points of a quarter meridian of a sphere of radius 50 (closed form r = R sin θ,
 * z = R cos θ), typed into the dialog, are fitted as a profile with every row read and the
 * points within a micrometre of the fitted surface. */
static void
test_data_import_typed_path (void)
{
  Xserver x;
  g_autofree char *dir = g_dir_make_tmp ("df-edits-XXXXXX", NULL);
  g_autofree char *csv = g_build_filename (dir, "cap-profile.csv", NULL);
  g_autoptr(GString) text = g_string_new ("r,z\n");
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_autoptr(GError) error = NULL;
  g_autofree char *line = NULL;
  g_auto(GStrv) parts = NULL;

  for (int i = 0; i <= 40; i++)
    {
      double theta = G_PI / 2 * i / 40;
      char r[G_ASCII_DTOSTR_BUF_SIZE], z[G_ASCII_DTOSTR_BUF_SIZE];

      g_string_append_printf (text, "%s,%s\n", g_ascii_dtostr (r, sizeof r, 50 * sin (theta)),
                              g_ascii_dtostr (z, sizeof z, 50 * cos (theta)));
    }
  g_file_set_contents (csv, text->str, -1, &error);
  g_assert_no_error (error);

  if (!xserver_start (&x))
    return;
  app = start_app (&x, DF_APP_PATH, &out, "--preset", "sphere", NULL);
  g_free (read_until (out, "view-geometry "));
  focus_main (&x);
  open_by_key (&x, "ctrl+shift+p", "Surface from Measured Data");
  xdotool_va (&x, "search", "--sync", "--onlyvisible", "--name", "Surface from Measured Data",
              "windowfocus", "sleep", "1", "type", "--delay", "20", csv, NULL);
  xdotool_va (&x, "sleep", "0.5", "key", "Return", NULL);
  line = read_until_either (out, "data-fitted ", "data-failed ");
  g_assert_nonnull (line);
  g_assert_true (g_str_has_prefix (line, "data-fitted "));
  parts = g_strsplit (line, " ", -1);
  g_assert_cmpuint (g_strv_length (parts), ==, 10);
  g_assert_cmpstr (parts[1], ==, "cap-profile.csv");
  g_assert_cmpint (g_ascii_strtoll (parts[2], NULL, 10), ==, 41);
  g_assert_cmpfloat (g_ascii_strtod (parts[4], NULL), <, 1e-3);

  stop_app (app, &x);
  g_unlink (csv);
  g_rmdir (dir);
}

/* `check --json` on a project (the reference: the CLI reads the file the app wrote) as the
 * max-shear-deg verdict's drape of one loop: warp, cell and start, into out[4]. */
static void
cli_shear_drape (const char *project,
                 const char *loop,
                 double      out[4])
{
  g_autoptr(JsonParser) parser = json_parser_new ();
  JsonObject *v = find_verdict (cli_check_verdicts (DF_CLI_PATH, project, parser), loop,
                                "max-shear-deg");
  JsonObject *d;
  JsonArray *start;

  g_assert_nonnull (v);
  d = json_object_get_object_member (v, "drape");
  start = json_object_get_array_member (d, "start");
  out[0] = json_object_get_double_member (d, "warp_deg");
  out[1] = json_object_get_double_member (d, "cell");
  out[2] = json_array_get_double_element (start, 0);
  out[3] = json_array_get_double_element (start, 1);
}

/* A loop's drape keys (drape-start, drape-warp-deg, drape-cell) survive a save from the app:
 * the saved file gives check's shear verdict the same drape as the file opened. */
static void
test_drape_keys_saved (void)
{
  Xserver x;
  g_autofree char *dir = g_dir_make_tmp ("df-edits-XXXXXX", NULL);
  g_autofree char *opened = g_build_filename (dir, "keys.dfproj", NULL);
  g_autofree char *saved = g_build_filename (dir, "keys-saved.dfproj", NULL);
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_autoptr(GError) error = NULL;
  g_autofree char *line = NULL;
  double before[4], after[4];

  write_demo_with (DF_EXAMPLES_DIR, opened, "name=Belly patch\n",
                   "name=Belly patch\ndrape-start=92;0.05\ndrape-warp-deg=30\ndrape-cell=6\n");
  cli_shear_drape (opened, "Belly patch", before);
  g_assert_cmpfloat (before[0], ==, 30);
  g_assert_cmpfloat (before[1], ==, 6);

  if (!xserver_start (&x))
    return;
  app = start_app (&x, DF_APP_PATH, &out, opened, NULL);
  g_strfreev (read_view_geometry (out));
  line = save_as (&x, out, saved);
  g_assert_nonnull (line);
  stop_app (app, &x);

  cli_shear_drape (saved, "Belly patch", after);
  for (int k = 0; k < 4; k++)
    g_assert_cmpfloat (after[k], ==, before[k]);
  g_remove (opened);
  g_remove (saved);
  g_rmdir (dir);
}

int
main (int   argc,
      char *argv[])
{
  app_test_init (&argc, &argv);

  g_test_add_func ("/app/edits/undo-geodesic", test_undo_geodesic);
  g_test_add_func ("/app/edits/paths-from-csv", test_paths_from_csv);
  g_test_add_func ("/app/edits/bad-loop-project", test_bad_loop_project);
  g_test_add_func ("/app/edits/typed-loop-latitude", test_typed_loop_latitude);
  g_test_add_func ("/app/edits/one-signed-range", test_one_signed_range);
  g_test_add_func ("/app/edits/save-as-title", test_save_as_title);
  g_test_add_func ("/app/edits/data-import-typed-path", test_data_import_typed_path);
  g_test_add_func ("/app/edits/drape-keys-saved", test_drape_keys_saved);
  return g_test_run ();
}
