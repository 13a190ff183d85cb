/* test-app-decide.c: end-to-end tests of the app's fabrication decisions (issue 9), driven
 * from outside under a private Xvfb: the limits editor moving a ply's steering verdict and the
 * gore pattern's SVG at true scale, a geodesic's exceeded stretch, and the plies' locking-angle
 * verdicts, each against `driftframe-cli check` or `gores` on the same project (another front
 * end over the same core, whose decisions are tested against closed forms in test-decide.c and
 * test-units-shear-cli.c). Skips without Xvfb or xdotool. */
#include <gio/gio.h>
#include <glib/gstdio.h>
#include <json-glib/json-glib.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "df-glib.h"
#include "df-test.h"
#include "df-test-app.h"

/* Reads "verdict LOOP LIMIT within|exceeded" lines until both loops have reported on limit;
 * *a_within, *b_within get their verdicts. */
static void
read_two_verdicts (GDataInputStream *out,
                   const char       *loop_a,
                   const char       *loop_b,
                   const char       *limit,
                   gboolean         *a_within,
                   gboolean         *b_within)
{
  gboolean seen_a = FALSE, seen_b = FALSE;

  while (!seen_a || !seen_b)
    {
      g_autofree char *line = read_until (out, "verdict ");
      g_auto(GStrv) parts = NULL;

      g_assert_nonnull (line);
      parts = g_strsplit (line, " ", -1);
      g_assert_cmpuint (g_strv_length (parts), ==, 4);
      if (!g_str_equal (parts[2], limit))
        continue;
      g_assert_true (g_str_equal (parts[3], "within") || g_str_equal (parts[3], "exceeded"));
      if (g_str_equal (parts[1], loop_a))
        {
          seen_a = TRUE;
          *a_within = g_str_equal (parts[3], "within");
        }
      else if (g_str_equal (parts[1], loop_b))
        {
          seen_b = TRUE;
          *b_within = g_str_equal (parts[3], "within");
        }
    }
}

/* The CLI's `check --json` on a project: is limit within for the loop named name (all its
 * stretches)? */
static gboolean
cli_within (const char *project,
            const char *name,
            const char *limit)
{
  g_autoptr(JsonParser) parser = json_parser_new ();
  JsonArray *verdicts = cli_check_verdicts (DF_CLI_PATH, project, parser);
  gboolean within = TRUE, seen = FALSE;

  for (guint i = 0; i < json_array_get_length (verdicts); i++)
    {
      JsonObject *v = json_array_get_object_element (verdicts, i);

      if (!g_str_equal (json_object_get_string_member (v, "kind"), "loop")
          || !g_str_equal (json_object_get_string_member (v, "loop"), name)
          || !g_str_equal (json_object_get_string_member (v, "limit"), limit))
        continue;
      seen = TRUE;
      within = within && json_object_get_boolean_member (v, "within");
    }
  g_assert_true (seen);
  return within;
}

/* The SVG's width or height attribute: a number followed by its unit. */
static double
svg_length (const char *svg,
            const char *attribute,
            char      **unit)
{
  g_autofree char *key = g_strdup_printf (" %s=\"", attribute);
  const char *p = strstr (svg, key);
  char *end = NULL;
  double value;

  g_assert_nonnull (p);
  p += strlen (key);
  value = g_ascii_strtod (p, &end);
  g_assert_true (end != p);
  *unit = g_strndup (end, strcspn (end, "\""));
  return value;
}

/* The demo's lamp-shade profile (examples/demo.dfproj): r(t) = rt + (rb - rt) t / h +
 * bulge sin(pi t / h), z = h - t, with rt = 60, rb = 110, bulge = 15, h = 180 (mm). */
static double
demo_dr (double t)
{
  return (110.0 - 60.0) / 180.0 + 15.0 * G_PI / 180.0 * cos (G_PI * t / 180.0);
}

/* From the demo a user sets a minimum steering radius, sees where a ply outline goes below
 * it, and exports a gore pattern at true scale (issue 9, "Done when"). */
static void
test_limit_verdict_gores (void)
{
  Xserver x;
  g_autofree char *dir = g_dir_make_tmp ("df-e2e-XXXXXX", NULL);
  g_autofree char *svg_path = g_build_filename (dir, "shade-gores.svg", NULL);
  g_autofree char *project = g_build_filename (dir, "demo-18mm.dfproj", NULL);
  g_autofree char *svg = NULL, *w_unit = NULL, *h_unit = NULL;
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GError) error = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_autofree char *line = NULL;
  g_autofree char *demo_path = g_build_filename (DF_EXAMPLES_DIR, "demo.dfproj", NULL);
  gboolean belly = FALSE, seam = FALSE;
  double y_min = G_MAXDOUBLE, y_max = -G_MAXDOUBLE, x_min = G_MAXDOUBLE, x_max = -G_MAXDOUBLE;
  double length = 0, width, height;
  const char *p;

  if (!xserver_start (&x))
    return;
  app = start_app (&x, DF_APP_PATH, &out, "--demo", NULL);

  /* The demo's 25 mm: both plies bend tighter somewhere. The reference is the CLI's `check`
   * on the demo file (another front end over the same core). */
  read_two_verdicts (out, "Belly_patch", "Top_seam_ply", "min-steering-radius", &belly, &seam);
  g_assert_cmpint (belly, ==, cli_within (demo_path, "Belly patch", "min-steering-radius"));
  g_assert_cmpint (seam, ==, cli_within (demo_path, "Top seam ply", "min-steering-radius"));
  g_assert_false (belly);

  /* The user sets 18 mm in the limits editor (first field) and applies it. */
  focus_main (&x);
  open_by_key (&x, "ctrl+shift+l", "Material and Process Limits");
  xdotool_va (&x, "search", "--sync", "--onlyvisible", "--name", "Material and Process Limits",
              "windowfocus", "sleep", "0.5", NULL);
  type_field (&x, "18 mm");
  xdotool_va (&x, "key", "Return", NULL);
  read_two_verdicts (out, "Belly_patch", "Top_seam_ply", "min-steering-radius", &belly, &seam);

  /* The same limit written into the demo's project text, checked by the CLI. */
  write_demo_with (DF_EXAMPLES_DIR, project, "min-steering-radius=25 mm\n", "min-steering-radius=18 mm\n");
  g_assert_cmpint (belly, ==, cli_within (project, "Belly patch", "min-steering-radius"));
  g_assert_cmpint (seam, ==, cli_within (project, "Top seam ply", "min-steering-radius"));
  /* The limit moved the verdict: one ply now within, the other still beyond it. */
  g_assert_true (belly);
  g_assert_false (seam);

  /* The gore tool on the whole shade (t from 0 to 180, 8 gores, no seam: its defaults) and
   * its SVG export through the file chooser. */
  focus_main (&x);
  open_by_key (&x, "ctrl+shift+g", "Gore Pattern");
  xdotool_va (&x, "search", "--sync", "--onlyvisible", "--name", "Gore Pattern", "windowfocus",
              "sleep", "0.5", "key", "alt+s", NULL);
  xdotool_va (&x, "search", "--sync", "--onlyvisible", "--name", "Export Gore Pattern",
              "windowfocus", "sleep", "0.5", NULL);
  type_field (&x, svg_path);
  xdotool_va (&x, "key", "Return", NULL);
  line = read_until (out, "gores-exported svg ");
  g_assert_nonnull (line);
  g_assert_cmpstr (line + strlen ("gores-exported svg "), ==, svg_path);

  g_file_get_contents (svg_path, &svg, NULL, &error);
  g_assert_no_error (error);
  /* True scale: width and height carry the unit (mm, the demo's), so a browser shows it life
   * size. */
  width = svg_length (svg, "width", &w_unit);
  height = svg_length (svg, "height", &h_unit);
  g_assert_cmpstr (w_unit, ==, "mm");
  g_assert_cmpstr (h_unit, ==, "mm");
  g_assert_cmpfloat (width, >, 0);
  g_assert_cmpfloat (height, >, 0);
  g_assert_nonnull (strstr (svg, "licensed engineering review"));

  /* The outline (the only path without a seam allowance): along the centre line it is as
   * long as the meridian, integral of sqrt(1 + r'(t)^2) dt over [0, 180] (arc length of the
   * profile (r(t), h - t); composite Simpson, 2000 panels, hand derivation); across, its widest
   * is the parallel's arc 2 pi r / n at r = rb = 110 mm (r grows all the way: r' > 0 on
   * [0, 180]) for n = 8. */
  p = strstr (svg, "<path d=\"");
  g_assert_nonnull (p);
  p += strlen ("<path d=\"");
  while (*p == 'M' || *p == 'L')
    {
      char *end = NULL;
      double px = g_ascii_strtod (p + 1, &end), py = g_ascii_strtod (end, &end);

      x_min = fmin (x_min, px);
      x_max = fmax (x_max, px);
      y_min = fmin (y_min, py);
      y_max = fmax (y_max, py);
      p = end;
      while (*p == ' ')
        p++;
    }
  for (int i = 0; i <= 2000; i++)
    {
      double t = 180.0 * i / 2000, w = (i == 0 || i == 2000) ? 1 : (i % 2 ? 4 : 2);

      length += w * sqrt (1 + demo_dr (t) * demo_dr (t));
    }
  length *= 180.0 / 2000 / 3;
  df_assert_close (y_max - y_min, length, 1e-5, 0);
  df_assert_close (x_max - x_min, 2 * G_PI * 110.0 / 8, 1e-5, 0);

  g_subprocess_force_exit (app);
  g_subprocess_wait (app, NULL, NULL);
  xserver_stop (&x);
  g_remove (svg_path);
  g_remove (project);
  g_rmdir (dir);
}

/* The demo's seam-line geodesic against a fibre deviation limit of 2 degrees: the app's
 * Geodesic panel gives the same exceeded stretch as `driftframe-cli check` on the same project
 * (another front end over the same core, whose geodesic verdicts are tested against closed
 * forms in test-decide), to 1e-6 mm at both ends. */
static void
test_geodesic_verdicts (void)
{
  Xserver x;
  g_autofree char *dir = g_dir_make_tmp ("df-e2e-XXXXXX", NULL);
  g_autofree char *project = g_build_filename (dir, "demo-2deg.dfproj", NULL);
  g_autofree char *line = NULL;
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(JsonParser) parser = json_parser_new ();
  g_autoptr(GDataInputStream) out = NULL;
  g_auto(GStrv) parts = NULL;
  JsonArray *verdicts;
  double app_s0, app_s1, cli_s0 = -1, cli_s1 = -1;

  write_demo_with (DF_EXAMPLES_DIR, project, "max-fibre-deviation-deg=30\n", "max-fibre-deviation-deg=2\n");

  verdicts = cli_check_verdicts (DF_CLI_PATH, project, parser);
  for (guint i = 0; i < json_array_get_length (verdicts); i++)
    {
      JsonObject *v = json_array_get_object_element (verdicts, i);
      JsonArray *where;

      if (!g_str_equal (json_object_get_string_member (v, "kind"), "geodesic")
          || !g_str_equal (json_object_get_string_member (v, "limit"), "max-fibre-deviation-deg"))
        continue;
      g_assert_false (json_object_get_boolean_member (v, "within"));
      where = json_object_get_array_member (v, "where");
      cli_s0 = json_array_get_double_element (where, 0);
      cli_s1 = json_array_get_double_element (where, 1);
    }
  g_assert_cmpfloat (cli_s1, >, cli_s0);

  if (!xserver_start (&x))
    return;
  app = start_app (&x, DF_APP_PATH, &out, project, NULL);
  /* The project's geodesic is traced, and checked, as the project opens. */
  line = read_until (out, "geodesic-verdict max-fibre-deviation-deg ");
  g_assert_nonnull (line);
  parts = g_strsplit (line, " ", -1);
  g_assert_cmpuint (g_strv_length (parts), ==, 5);
  g_assert_cmpstr (parts[2], ==, "exceeded");
  app_s0 = g_ascii_strtod (parts[3], NULL);
  app_s1 = g_ascii_strtod (parts[4], NULL);
  df_assert_close (app_s0, cli_s0, 0, 1e-6);
  df_assert_close (app_s1, cli_s1, 0, 1e-6);
  g_subprocess_force_exit (app);
  g_subprocess_wait (app, NULL, NULL);
  xserver_stop (&x);
  g_remove (project);
  g_rmdir (dir);
}

/* The woven ply's locking angle in the app's loop verdicts, by a drape of each ply as check
 * drapes it: at 1 degree the Belly patch's cells shear past it and the Top seam ply's do not
 * (its worst is about 0.6 degrees), the same verdicts as `driftframe-cli check` on the same
 * project (whose drape is tested against closed forms in test-drape and test-units-shear). */
static void
test_shear_verdicts (void)
{
  Xserver x;
  g_autofree char *dir = g_dir_make_tmp ("df-e2e-XXXXXX", NULL);
  g_autofree char *project = g_build_filename (dir, "demo-1deg.dfproj", NULL);
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  gboolean belly = TRUE, seam = FALSE;

  write_demo_with (DF_EXAMPLES_DIR, project, "max-shear-deg=5\n", "max-shear-deg=1\n");

  if (!xserver_start (&x))
    return;
  app = start_app (&x, DF_APP_PATH, &out, project, NULL);
  read_two_verdicts (out, "Belly_patch", "Top_seam_ply", "max-shear-deg", &belly, &seam);
  g_assert_cmpint (belly, ==, cli_within (project, "Belly patch", "max-shear-deg"));
  g_assert_cmpint (seam, ==, cli_within (project, "Top seam ply", "max-shear-deg"));
  g_assert_false (belly);
  g_assert_true (seam);

  g_subprocess_force_exit (app);
  g_subprocess_wait (app, NULL, NULL);
  xserver_stop (&x);
  g_remove (project);
  g_rmdir (dir);
}

/* With lengths shown in m, a bare number typed in the limits editor is in m: 0.018 is the 18 mm
 * of the test above, so the Belly patch comes within and the Top seam ply stays beyond, as
 * `check` says for 18 mm (0.018 mm would let both pass). */
static void
test_bare_limit_in_display_unit (void)
{
  Xserver x;
  g_autofree char *dir = g_dir_make_tmp ("df-decide-XXXXXX", NULL);
  g_autofree char *project = g_build_filename (dir, "demo-18mm.dfproj", NULL);
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_autofree char *demo_path = g_build_filename (DF_EXAMPLES_DIR, "demo.dfproj", NULL);
  gboolean belly = FALSE, seam = TRUE;

  if (!xserver_start (&x))
    return;
  app = start_app (&x, DF_APP_PATH, &out, demo_path, "--units", "m", NULL);
  read_two_verdicts (out, "Belly_patch", "Top_seam_ply", "min-steering-radius", &belly, &seam);
  g_assert_false (belly);

  open_by_key (&x, "ctrl+shift+l", "Material and Process Limits");
  xdotool_va (&x, "search", "--sync", "--onlyvisible", "--name", "Material and Process Limits",
              "windowfocus", "sleep", "0.5", NULL);
  type_field (&x, "0.018");
  xdotool_va (&x, "key", "Return", NULL);
  read_two_verdicts (out, "Belly_patch", "Top_seam_ply", "min-steering-radius", &belly, &seam);

  write_demo_with (DF_EXAMPLES_DIR, project, "min-steering-radius=25 mm\n",
                   "min-steering-radius=18 mm\n");
  g_assert_cmpint (belly, ==, cli_within (project, "Belly patch", "min-steering-radius"));
  g_assert_cmpint (seam, ==, cli_within (project, "Top seam ply", "min-steering-radius"));
  g_assert_true (belly);
  g_assert_false (seam);

  g_subprocess_force_exit (app);
  g_subprocess_wait (app, NULL, NULL);
  xserver_stop (&x);
  g_remove (project);
  g_rmdir (dir);
}

int
main (int   argc,
      char *argv[])
{
  app_test_init (&argc, &argv);
  g_test_add_func ("/app/decide/limit-verdict-gores", test_limit_verdict_gores);
  g_test_add_func ("/app/decide/geodesic-verdicts", test_geodesic_verdicts);
  g_test_add_func ("/app/decide/shear-verdicts", test_shear_verdicts);
  g_test_add_func ("/app/decide/bare-limit-in-display-unit", test_bare_limit_in_display_unit);
  return g_test_run ();
}
