/* test-decide-cli.c: runs the built driftframe-cli (DF_CLI_PATH) on the decision commands:
 * `check` (exit status 0, 3 when a limit is exceeded, 2 for bad input; the JSON verdicts),
 * `gores` (JSON keys, SVG at true scale) and `devmap`, against closed forms. */
#include <math.h>
#include <string.h>

#include <glib/gstdio.h>
#include <json-glib/json-glib.h>
#include <cairo.h>

#include "df-glib.h"
#include "df-test.h"

#include "df-test-cli.h"

/* The demo carries limits invented for it; its two small plies bend tighter than the 25 mm
 * minimum steering radius (report: 19.08 and 16.66 mm), so check exits 3. */
static void
test_check_demo (void)
{
  g_auto (cli_run) r = { 0 };
  g_autoptr (JsonParser) parser = json_parser_new ();
  JsonObject *root;
  JsonArray *verdicts;
  guint n_steer_exceeded = 0;

  run_cli (&r, "check", "--project", DF_EXAMPLES_DIR "/demo.dfproj", "--json", NULL);
  g_assert_cmpint (r.status, ==, 3);
  root = parse_object (parser, r.out);
  g_assert_false (json_object_get_boolean_member (root, "within"));
  g_assert_nonnull (strstr (json_object_get_string_member (root, "caution"),
                            "licensed engineering review"));
  verdicts = json_object_get_array_member (root, "verdicts");
  g_assert_cmpuint (json_array_get_length (verdicts), >, 0);
  for (guint i = 0; i < json_array_get_length (verdicts); i++)
    {
      JsonObject *v = json_array_get_object_element (verdicts, i);
      static const char *const keys[] = { "loop", "limit", "value", "threshold", "units",
                                          "source", "within", "where", "caution" };

      for (gsize k = 0; k < G_N_ELEMENTS (keys); k++)
        g_assert_true (json_object_has_member (v, keys[k]));
      g_assert_cmpstr (json_object_get_string_member (v, "source"), ==,
                       "invented for the demo");
      if (g_str_equal (json_object_get_string_member (v, "limit"), "min-steering-radius")
          && !json_object_get_boolean_member (v, "within"))
        {
          JsonArray *where = json_object_get_array_member (v, "where");

          n_steer_exceeded++;
          g_assert_cmpuint (json_array_get_length (where), ==, 2);
          g_assert_cmpfloat (json_object_get_double_member (v, "value"), <, 25.0);
          df_assert_close (json_object_get_double_member (v, "threshold"), 25.0, 1e-15, 0.0);
          g_assert_cmpstr (json_object_get_string_member (v, "units"), ==, "mm");
        }
    }
  /* Each small ply bends too tight on both of its flanks. */
  g_assert_cmpuint (n_steer_exceeded, ==, 4);
}

/* Generous limits: exit 0; the same in inches converts the values (25.4 mm to the inch). */
static void
test_check_within (void)
{
  g_autofree char *demo = NULL;
  g_autofree char *text = NULL;
  g_autofree char *path = NULL;
  g_auto (cli_run) r = { 0 };
  g_autoptr (JsonParser) parser = json_parser_new ();
  JsonObject *root, *v;
  char *cut;

  g_assert_true (g_file_get_contents (DF_EXAMPLES_DIR "/demo.dfproj", &demo, NULL, NULL));
  cut = strstr (demo, "[limits]");
  g_assert_nonnull (cut);
  *cut = '\0';
  text = g_strconcat (demo, "[limits]\nmin-steering-radius=0.5 in\nmin-steering-radius-source="
                      "test\n[units]\nlength=in\n", strstr (cut + 1, "[loop 1]"), NULL);
  path = write_tmp ("within.dfproj", text);
  run_cli (&r, "check", "--project", path, "--json", NULL);
  g_assert_cmpint (r.status, ==, 0);
  root = parse_object (parser, r.out);
  g_assert_true (json_object_get_boolean_member (root, "within"));
  g_assert_cmpstr (json_object_get_string_member (root, "units"), ==, "in");
  /* Belly patch: its tightest radius, 19.08 mm (report), in inches. */
  v = json_array_get_object_element (json_object_get_array_member (root, "verdicts"), 1);
  g_assert_cmpstr (json_object_get_string_member (v, "loop"), ==, "Belly patch");
  df_assert_close (json_object_get_double_member (v, "value"), 19.08 / 25.4, 2e-3, 0.0);
  df_assert_close (json_object_get_double_member (v, "threshold"), 0.5, 1e-15, 0.0);
  g_assert_true (json_object_get_null_member (v, "where"));
}

/* --units m: the demo's 25 mm minimum radius reads 0.025 m, the stretches scale alike. */
static void
test_check_units (void)
{
  g_auto (cli_run) mm = { 0 };
  g_auto (cli_run) m = { 0 };
  g_autoptr (JsonParser) p1 = json_parser_new ();
  g_autoptr (JsonParser) p2 = json_parser_new ();
  JsonObject *a, *b;

  run_cli (&mm, "check", "--project", DF_EXAMPLES_DIR "/demo.dfproj", "--json", NULL);
  run_cli (&m, "check", "--project", DF_EXAMPLES_DIR "/demo.dfproj", "--units", "m", "--json",
           NULL);
  g_assert_cmpint (m.status, ==, 3);
  a = json_array_get_object_element (
    json_object_get_array_member (parse_object (p1, mm.out), "verdicts"), 3);
  b = json_array_get_object_element (
    json_object_get_array_member (parse_object (p2, m.out), "verdicts"), 3);
  g_assert_cmpstr (json_object_get_string_member (b, "units"), ==, "m");
  df_assert_close (json_object_get_double_member (b, "threshold"), 0.025, 1e-15, 0.0);
  df_assert_close (json_object_get_double_member (b, "value"),
                   json_object_get_double_member (a, "value") / 1000.0, 1e-14, 0.0);
  df_assert_close (json_array_get_double_element (json_object_get_array_member (b, "where"), 1),
                   json_array_get_double_element (json_object_get_array_member (a, "where"), 1)
                     / 1000.0, 1e-14, 0.0);
}

/* A project with no loop: a geodesic on the frustum r = 50 + t drifts from its 70 deg start
 * heading (Clairaut: r sin(psi) constant, do Carmo sec. 4-4, from memory) beyond 3 deg, while
 * a meridian path (a geodesic of a surface of revolution, k_g = 0, do Carmo from memory) stays
 * within: exit 3 from the geodesic alone, its JSON verdict of kind "geodesic". */
static void
test_check_geodesic_only (void)
{
  g_autofree char *path = write_tmp ("geo.dfproj",
                                     "[surface]\nkind=revolution\nr=50 + t\nz=-t\nt-min=0\n"
                                     "t-max=300\nunits=mm\n[limits]\nmax-fibre-deviation-deg=3\n"
                                     "max-fibre-deviation-deg-source=test\n"
                                     "[geodesic 1]\nname=Wind\nstart=20;0\nheading-deg=70\n"
                                     "length=150\n[paths 1]\nname=Meridians\n"
                                     "a-u=10;40;80;120\na-v=0;0;0;0\nb-u=10;40;80;120\n"
                                     "b-v=0.5;0.5;0.5;0.5\n");
  g_autofree char *within = write_tmp ("geo-within.dfproj",
                                       "[surface]\nkind=revolution\nr=50 + t\nz=-t\nt-min=0\n"
                                       "t-max=300\nunits=mm\n[limits]\n"
                                       "max-fibre-deviation-deg=3\n"
                                       "[paths 1]\nname=Meridians\n"
                                       "a-u=10;40;80;120\na-v=0;0;0;0\nb-u=10;40;80;120\n"
                                       "b-v=0.5;0.5;0.5;0.5\n");
  g_auto (cli_run) r = { 0 };
  g_auto (cli_run) r2 = { 0 };
  g_autoptr (JsonParser) parser = json_parser_new ();
  JsonArray *verdicts;
  guint n_geo = 0, n_path = 0;

  run_cli (&r, "check", "--project", path, "--json", NULL);
  g_assert_cmpint (r.status, ==, 3);
  verdicts = json_object_get_array_member (parse_object (parser, r.out), "verdicts");
  for (guint i = 0; i < json_array_get_length (verdicts); i++)
    {
      JsonObject *v = json_array_get_object_element (verdicts, i);
      const char *kind = json_object_get_string_member (v, "kind");

      if (g_str_equal (kind, "geodesic"))
        {
          n_geo++;
          g_assert_cmpstr (json_object_get_string_member (v, "loop"), ==, "Wind");
          g_assert_false (json_object_get_boolean_member (v, "within"));
          g_assert_cmpfloat (json_object_get_double_member (v, "value"), >, 3.0);
          g_assert_cmpuint (json_array_get_length (json_object_get_array_member (v, "where")),
                            ==, 2);
        }
      else
        {
          g_assert_cmpstr (kind, ==, "path");
          n_path++;
          g_assert_cmpstr (json_object_get_string_member (v, "loop"), ==, "Meridians");
          g_assert_true (json_object_get_boolean_member (v, "within"));
          g_assert_cmpfloat (json_object_get_double_member (v, "value"), <, 1e-6);
        }
    }
  g_assert_cmpuint (n_geo, ==, 1);
  g_assert_cmpuint (n_path, ==, 2);
  /* Without the geodesic everything is within: exit 0. */
  run_cli (&r2, "check", "--project", within, NULL);
  g_assert_cmpint (r2.status, ==, 0);
  g_assert_nonnull (strstr (r2.out, "Path Meridians route A"));
}

static void
test_check_bad (void)
{
  g_autofree char *path = write_tmp ("bad.dfproj",
                                     "[surface]\nkind=revolution\nr=sin(t)\nz=cos(t)\nt-min=0\n"
                                     "t-max=pi\n[limits]\nfriction=-0.2\n");
  g_auto (cli_run) r = { 0 };
  g_auto (cli_run) r2 = { 0 };

  run_cli (&r, "check", "--project", path, NULL);
  g_assert_cmpint (r.status, ==, 2);
  g_assert_nonnull (strstr (r.err, "bad.dfproj: [limits] friction"));
  g_assert_nonnull (g_str_has_suffix (r.err, "\n") ? r.err : NULL);
  run_cli (&r2, "check", NULL);
  g_assert_cmpint (r2.status, ==, 2);
}

/* Sphere gores from the pole to the equator: length pi R / 2, flat area 2 pi R^2 / n each
 * (GEOMETRY.md "Decisions"; Archimedes' cap area). */
static void
test_gores_cli (void)
{
  g_autofree char *svg = tmp_path ("g.svg");
  g_autofree char *csv = tmp_path ("g.csv");
  g_autofree char *text = NULL;
  g_auto (cli_run) r = { 0 };
  g_auto (cli_run) r2 = { 0 };
  g_autoptr (JsonParser) parser = json_parser_new ();
  JsonObject *root;
  const double R = 150.0;

  run_cli (&r, "gores", "--preset", "sphere", "--param", "R=150", "--from", "0", "--to",
           "pi/2", "--count", "6", "--svg", svg, "--csv", csv, "--json", NULL);
  /* "pi/2" is no number for the CLI: bad input. */
  g_assert_cmpint (r.status, ==, 2);
  run_cli (&r2, "gores", "--preset", "sphere", "--param", "R=150", "--from", "0", "--to",
           "1.5707963267948966", "--count", "6", "--svg", svg, "--csv", csv, "--json", NULL);
  g_assert_cmpint (r2.status, ==, 0);
  root = parse_object (parser, r2.out);
  g_assert_cmpint (json_object_get_int_member (root, "count"), ==, 6);
  df_assert_close (json_object_get_double_member (root, "length"), G_PI * R / 2, 1e-10, 0.0);
  df_assert_close (json_object_get_double_member (root, "area_each"), 2 * G_PI * R * R / 6,
                   1e-10, 0.0);
  df_assert_close (json_object_get_double_member (root, "max_width"), 2 * G_PI * R / 6, 1e-10,
                   0.0);
  g_assert_true (json_object_has_member (root, "caution"));
  g_assert_true (g_file_get_contents (svg, &text, NULL, NULL));
  g_assert_nonnull (strstr (text, "mm\" height=\""));
  g_assert_nonnull (strstr (text, "<svg xmlns=\"http://www.w3.org/2000/svg\""));
  g_assert_true (g_file_test (csv, G_FILE_TEST_EXISTS));
}

static void
test_gores_bad (void)
{
  g_auto (cli_run) r = { 0 };
  g_auto (cli_run) r2 = { 0 };

  run_cli (&r, "gores", "--preset", "saddle", "--from", "0", "--to", "1", "--count", "4", NULL);
  g_assert_cmpint (r.status, ==, 2);
  g_assert_nonnull (strstr (r.err, "surface of revolution"));
  run_cli (&r2, "gores", "--preset", "sphere", "--from", "0", "--to", "9", "--count", "4", NULL);
  g_assert_cmpint (r2.status, ==, 2);
  g_assert_null (strstr (r2.err, "nan"));
}

/* The map on a sphere: every rim strain is 1 - sin(a/R)/(a/R) (geodesic circle 2 pi R
 * sin(a/R); do Carmo sec. 4-6, from memory). */
static void
test_devmap_cli (void)
{
  g_autofree char *csv = tmp_path ("map.csv");
  g_auto (cli_run) r = { 0 };
  g_autoptr (JsonParser) parser = json_parser_new ();
  JsonObject *root;
  const double x = 20.0 / 150.0;

  run_cli (&r, "devmap", "--preset", "sphere", "--param", "R=150", "--radius", "20", "--grid",
           "6,4", "--csv", csv, "--json", NULL);
  g_assert_cmpint (r.status, ==, 0);
  root = parse_object (parser, r.out);
  g_assert_cmpint (json_object_get_int_member (root, "points_with_disc"), ==, 24);
  df_assert_close (json_object_get_double_member (root, "max_strain_percent"),
                   100.0 * (1 - sin (x) / x), 1e-5, 0.0);
  g_assert_true (g_file_test (csv, G_FILE_TEST_EXISTS));
}

/* devmap --png: a PNG of the size asked for, the lamp shade's positive curvature drawn warm
 * (K > 0: the rim of a flat disc must shrink, strain > 0) in more than a few colours, and grey
 * only where no disc fits. Read back with cairo's own PNG reader. */
static void
test_devmap_png (void)
{
  g_autofree char *png = tmp_path ("map.png");
  g_auto (cli_run) r = { 0 };
  g_auto (cli_run) bad = { 0 };
  cairo_surface_t *img;
  g_autoptr (GHashTable) colours = g_hash_table_new (NULL, NULL);
  guint warm = 0, cool = 0;
  int w, h, stride;
  const guint8 *data;

  run_cli (&r, "devmap", "--surface", DF_EXAMPLES_DIR "/lamp-shade.surface", "--radius", "20",
           "--grid", "12,12", "--max-strain-percent", "0.3", "--png", png, "--png-size",
           "600,450", NULL);
  g_assert_cmpint (r.status, ==, 0);
  img = cairo_image_surface_create_from_png (png);
  g_assert_cmpint (cairo_surface_status (img), ==, CAIRO_STATUS_SUCCESS);
  w = cairo_image_surface_get_width (img);
  h = cairo_image_surface_get_height (img);
  g_assert_cmpint (w, ==, 600);
  g_assert_cmpint (h, ==, 450);
  data = cairo_image_surface_get_data (img);
  stride = cairo_image_surface_get_stride (img);
  for (int y = 0; y < h; y++)
    for (int x = 0; x < w; x++)
      {
        guint32 px = *(const guint32 *) (data + y * stride + 4 * x) & 0xffffff;
        int red = (px >> 16) & 0xff, blue = px & 0xff;

        g_hash_table_add (colours, GUINT_TO_POINTER (px));
        warm += red > blue + 40;
        cool += blue > red + 40;
      }
  cairo_surface_destroy (img);
  g_assert_cmpuint (g_hash_table_size (colours), >, 200);
  /* Most of the surface is warm; the only cool pixels are the legend's negative half. */
  g_assert_cmpuint (warm, >, 20 * cool);
  g_assert_cmpuint (warm, >, (guint) (w * h / 10));
  run_cli (&bad, "devmap", "--preset", "sphere", "--radius", "5", "--grid", "4,4", "--png",
           png, "--png-size", "10,10", NULL);
  g_assert_cmpint (bad.status, ==, 2);
  g_assert_nonnull (strstr (bad.err, "--png-size"));
}

int
main (int argc, char **argv)
{
  int code;

  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);
  tmp_dir = g_dir_make_tmp ("df-decide-cli-XXXXXX", NULL);
  g_test_add_func ("/decide-cli/check-demo", test_check_demo);
  g_test_add_func ("/decide-cli/check-within", test_check_within);
  g_test_add_func ("/decide-cli/check-units", test_check_units);
  g_test_add_func ("/decide-cli/check-geodesic-only", test_check_geodesic_only);
  g_test_add_func ("/decide-cli/check-bad", test_check_bad);
  g_test_add_func ("/decide-cli/gores", test_gores_cli);
  g_test_add_func ("/decide-cli/gores-bad", test_gores_bad);
  g_test_add_func ("/decide-cli/devmap", test_devmap_cli);
  g_test_add_func ("/decide-cli/devmap-png", test_devmap_png);
  code = g_test_run ();
  df_test_remove_dir (tmp_dir);
  g_free (tmp_dir);
  return code;
}
