/* test-writers.c: the writers: loop points, per-sample and summary CSV, geodesic samples and
 * JSON. Output must parse back (CSV per RFC 4180 with CRLF line ends, JSON with json-glib),
 * carry the right header and row count, write no NaN, and keep 17 significant digits. */
#include <math.h>
#include <string.h>

#include <glib/gstdio.h>

#include "df-glib.h"
#include "df-json-out.h"
#include "df-test.h"

static char *tmp_dir;

static char *
tmp_path (const char *name)
{
  return g_build_filename (tmp_dir, name, NULL);
}

/* A small RFC 4180 reader written for the test, independent of the one under test: records
 * end in CRLF; fields may be quoted with "" for a quote. Returns rows of GStrv. */
static GPtrArray *
parse_csv (const char *text)
{
  GPtrArray *rows = g_ptr_array_new_with_free_func ((GDestroyNotify) g_strfreev);
  g_autoptr (GPtrArray) fields = g_ptr_array_new_with_free_func (g_free);
  g_autoptr (GString) field = g_string_new (NULL);
  gboolean quoted = FALSE;

  for (const char *p = text; *p != '\0'; p++)
    {
      if (quoted)
        {
          if (p[0] == '"' && p[1] == '"')
            {
              g_string_append_c (field, '"');
              p++;
            }
          else if (p[0] == '"')
            quoted = FALSE;
          else
            g_string_append_c (field, *p);
        }
      else if (*p == '"')
        quoted = TRUE;
      else if (*p == ',')
        {
          g_ptr_array_add (fields, g_strdup (field->str));
          g_string_truncate (field, 0);
        }
      else if (p[0] == '\r' && p[1] == '\n')
        {
          g_ptr_array_add (fields, g_strdup (field->str));
          g_string_truncate (field, 0);
          g_ptr_array_add (fields, NULL);
          /* steal hands over the strings and leaves fields empty for the next record */
          g_ptr_array_add (rows, g_ptr_array_steal (fields, NULL));
          p++;
        }
      else
        {
          /* A bare LF would break the CRLF promise. */
          g_assert_cmpint (*p, !=, '\n');
          g_string_append_c (field, *p);
        }
    }
  g_assert_false (quoted);
  g_assert_cmpuint (field->len, ==, 0);   /* the last record ends with CRLF too */
  return rows;
}

static double
parse_double (const char *field)
{
  char *end = NULL;
  double x = g_ascii_strtod (field, &end);

  g_assert_true (field[0] != '\0' && *end == '\0');
  g_assert_true (isfinite (x));
  return x;
}

static df_surface *
build_preset (const char *name)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface_spec) spec = df_surface_spec_new_preset (name, &error);
  df_surface *surface = df_surface_spec_build (spec, &error);

  g_assert_no_error (error);
  return surface;
}

/* A latitude circle at polar angle theta on the default sphere (R = 100), measured. */
static void
measure_latitude (const df_surface *sphere, double theta, df_loop_result *out)
{
  double uv[48][2];
  g_autoptr (df_curve) curve = NULL;
  df_loop_options opt;

  for (int i = 0; i < 48; i++)
    {
      uv[i][0] = theta;
      uv[i][1] = -G_PI + 2 * G_PI * i / 48;
    }
  g_assert_true (df_curve_new_through_points (sphere, (const double (*)[2]) uv, 48, true,
                                              &curve, NULL) == DF_OK);
  df_loop_options_init (&opt);
  opt.n_samples = 64;
  g_assert_true (df_loop_measure (curve, &opt, out, NULL) == DF_OK);
}

/* Loop points written and read back are the same doubles: 17 significant digits suffice
 * to round-trip any double (IEEE 754-2008, sec. 5.12.2, from memory). */
static void
test_points_round_trip (void)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface) plane = build_preset ("plane");
  g_autofree char *path = tmp_path ("points.csv");
  g_autofree char *text = NULL;
  g_autofree double (*back)[2] = NULL;
  g_autoptr (GPtrArray) rows = NULL;
  const double uv[4][2] = { { 0.1, 1.0 / 3.0 }, { -G_PI, G_E }, { 1e-300, -99.99999999999999 },
                            { 5e-324, 0.0 } };
  gsize n = 0;

  g_assert_true (df_loop_csv_write_points (path, uv, 4, &error));
  g_assert_no_error (error);
  g_assert_true (g_file_get_contents (path, &text, NULL, &error));
  rows = parse_csv (text);
  g_assert_cmpuint (rows->len, ==, 5);
  g_assert_cmpstr (((char **) rows->pdata[0])[0], ==, "u");
  g_assert_cmpstr (((char **) rows->pdata[0])[1], ==, "v");

  g_assert_true (df_loop_csv_read (path, plane, &back, &n, &error));
  g_assert_no_error (error);
  g_assert_cmpuint (n, ==, 4);
  for (gsize i = 0; i < 4; i++)
    {
      g_assert_true (back[i][0] == uv[i][0]);
      g_assert_true (back[i][1] == uv[i][1]);
    }
}

/* The per-sample CSV of a measured loop: header with units, one row per sample, 13 numbers
 * each, K = 1/R^2 on the sphere (textbook, from memory), the fibre angle wrapped to
 * (-180, 180] beside its unwrapped value (equal modulo 360). */
static void
test_samples_csv (void)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface) sphere = build_preset ("sphere");
  g_auto (df_loop_result) result = { 0 };
  g_autofree char *path = tmp_path ("samples.csv");
  g_autofree char *text = NULL;
  g_autoptr (GPtrArray) rows = NULL;
  g_auto (GStrv) header = g_strsplit ("s_mm,t,phi_rad,x_mm,y_mm,z_mm,vx,vy,vz,angle_deg,"
                                      "angle_unwrapped_deg,k_g_per_mm,K_per_mm2", ",", -1);
  df_csv_context csv = { "mm", DF_SURFACE_REVOLUTION, "preset sphere", NULL };

  measure_latitude (sphere, 1.0, &result);
  g_assert_true (df_loop_samples_write (path, &result, &csv, &error));
  g_assert_no_error (error);
  g_assert_true (g_file_get_contents (path, &text, NULL, &error));
  rows = parse_csv (text);
  g_assert_cmpuint (rows->len, ==, result.n_samples + 1);
  g_assert_true (g_strv_equal ((const char *const *) rows->pdata[0],
                               (const char *const *) header));
  for (guint i = 1; i < rows->len; i++)
    {
      char **row = rows->pdata[i];
      double x, y, z;

      double wrapped, unwrapped;

      g_assert_cmpuint (g_strv_length (row), ==, 13);
      for (int k = 0; k < 13; k++)
        parse_double (row[k]);
      wrapped = parse_double (row[9]);
      unwrapped = parse_double (row[10]);
      g_assert_cmpfloat (wrapped, >, -180.0);
      g_assert_cmpfloat (wrapped, <=, 180.0);
      df_assert_close (remainder (unwrapped - wrapped, 360.0), 0.0, 0.0, 1e-9);
      x = parse_double (row[3]);
      y = parse_double (row[4]);
      z = parse_double (row[5]);
      df_assert_close (sqrt (x * x + y * y + z * z), 100.0, 1e-9, 0.0);
      df_assert_close (parse_double (row[12]), 1.0 / (100.0 * 100.0), 1e-9, 0.0);
    }
}

/* The summary: units in the column names, the surface and normal side as columns; names with a
 * comma and a quote are quoted; a loop with no disc leaves the enclosed curvature, residual and
 * area empty (no "nan"); a loop that was not measured keeps its row with the reason. */
static void
test_summary_csv (void)
{
  g_autoptr (df_surface) sphere = build_preset ("sphere");
  g_auto (df_loop_result) measured = { 0 };
  df_loop_result no_disc = { 0 };
  const df_loop_result *results[3] = { &measured, &no_disc, NULL };
  const char *names[3] = { "Rim, \"outer\" ply", "Tube loop", "Broken ply" };
  const char *failures[3] = { NULL, NULL, "point 3: repeats point 2" };
  df_csv_context csv = { "in", DF_SURFACE_REVOLUTION, "dome.surface", "N points outward" };
  g_autofree char *text = NULL;
  g_autoptr (GPtrArray) rows = NULL;
  char **row;

  measure_latitude (sphere, 1.0, &measured);
  no_disc.holonomy_rad = 0.5;
  no_disc.bounds_disc = false;
  no_disc.enclosed_curvature_rad = NAN;
  no_disc.length = 10.0;
  no_disc.total_geodesic_curvature_rad = 0.25;

  text = df_loop_summary_to_csv (names, results, failures, 3, &csv);
  g_assert_null (strstr (text, "nan"));
  rows = parse_csv (text);
  g_assert_cmpuint (rows->len, ==, 4);
  {
    g_auto (GStrv) header = g_strsplit ("name,status,surface,normal_side,holonomy_deg,"
                                        "holonomy_rad,enclosed_curvature_rad,"
                                        "gauss_bonnet_residual_rad,total_geodesic_curvature_rad,"
                                        "area_in2,length_in,min_steering_radius_in,bounds_disc,"
                                        "note,mean_K_per_in2", ",", -1);

    g_assert_true (g_strv_equal ((const char *const *) rows->pdata[0],
                                 (const char *const *) header));
  }

  row = rows->pdata[1];
  g_assert_cmpuint (g_strv_length (row), ==, 15);
  g_assert_cmpstr (row[0], ==, names[0]);
  g_assert_cmpstr (row[1], ==, "measured");
  g_assert_cmpstr (row[2], ==, "dome.surface");
  g_assert_cmpstr (row[3], ==, "N points outward");
  df_assert_close (parse_double (row[4]), measured.holonomy_rad * 180.0 / G_PI, 1e-15, 0.0);
  /* Latitude circle at polar angle theta = 1 encloses 2 pi (1 - cos theta): Gauss-Bonnet,
   * do Carmo, Differential Geometry of Curves and Surfaces, sec. 4-5 (from memory). */
  df_assert_close (parse_double (row[6]), 2 * G_PI * (1 - cos (1.0)), 0.0, 1e-8);
  g_assert_cmpstr (row[12], ==, "true");
  /* The disc's mean K: K = 1/R^2 everywhere on the preset's sphere of R = 100. */
  df_assert_close (parse_double (row[14]), 1e-4, 1e-8, 0.0);

  row = rows->pdata[2];
  g_assert_cmpuint (g_strv_length (row), ==, 15);
  g_assert_cmpstr (row[0], ==, names[1]);
  g_assert_cmpstr (row[6], ==, "");
  g_assert_cmpstr (row[7], ==, "");
  g_assert_cmpstr (row[9], ==, "");
  g_assert_cmpstr (row[11], ==, "");   /* no steering radius */
  g_assert_cmpstr (row[12], ==, "false");
  g_assert_cmpstr (row[14], ==, "");   /* no disc, no mean K */
  df_assert_close (parse_double (row[5]), 0.5, 0.0, 0.0);

  row = rows->pdata[3];
  g_assert_cmpuint (g_strv_length (row), ==, 15);
  g_assert_cmpstr (row[0], ==, "Broken ply");
  g_assert_cmpstr (row[1], ==, "not measured");
  g_assert_cmpstr (row[4], ==, "");
  g_assert_cmpstr (row[13], ==, failures[2]);
}

/* Geodesic samples: a geodesic started along the equator of a sphere stays on it (great
 * circles are the sphere's geodesics, do Carmo sec. 4-4, from memory). */
static void
test_geodesic_csv (void)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface) sphere = build_preset ("sphere");
  g_auto (df_geodesic_result) result = { 0 };
  g_autofree char *path = tmp_path ("geodesic.csv");
  g_autofree char *text = NULL;
  g_autoptr (GPtrArray) rows = NULL;
  g_auto (GStrv) header = g_strsplit ("s_mm,t,phi_rad,x_mm,y_mm,z_mm,tx,ty,tz", ",", -1);
  df_csv_context csv = { "mm", DF_SURFACE_REVOLUTION, NULL, NULL };

  g_assert_true (df_geodesic_shoot (sphere, G_PI / 2, 0.0, G_PI / 2, 100.0, 21, &result, NULL)
                 == DF_OK);
  g_assert_true (df_geodesic_samples_write (path, &result, &csv, &error));
  g_assert_no_error (error);
  g_assert_true (g_file_get_contents (path, &text, NULL, &error));
  rows = parse_csv (text);
  g_assert_cmpuint (rows->len, ==, 22);
  g_assert_true (g_strv_equal ((const char *const *) rows->pdata[0],
                               (const char *const *) header));
  for (guint i = 1; i < rows->len; i++)
    {
      char **row = rows->pdata[i];

      g_assert_cmpuint (g_strv_length (row), ==, 9);
      df_assert_close (parse_double (row[5]), 0.0, 0.0, 1e-6);
      df_assert_close (hypot (parse_double (row[3]), parse_double (row[4])), 100.0, 1e-9, 0.0);
    }
}

/* Writes replace the whole file (atomic rename); a write into a missing folder fails with an
 * error instead of leaving anything behind. */
static void
test_atomic_write (void)
{
  g_autoptr (GError) error = NULL;
  g_autofree char *path = tmp_path ("points.csv");
  g_autofree char *text = NULL;
  const double one[3][2] = { { 1, 2 }, { 3, 4 }, { 5, 6 } };
  const double two[3][2] = { { 7, 8 }, { 9, 10 }, { 11, 12 } };

  g_assert_true (g_file_set_contents (path, "old content that is longer than the new one\n"
                                      "old content that is longer than the new one\n"
                                      "old content that is longer than the new one\n",
                                      -1, NULL));
  g_assert_true (df_loop_csv_write_points (path, one, 3, &error));
  g_assert_true (df_loop_csv_write_points (path, two, 3, &error));
  g_assert_no_error (error);
  g_assert_true (g_file_get_contents (path, &text, NULL, NULL));
  g_assert_cmpstr (text, ==, "u,v\r\n7,8\r\n9,10\r\n11,12\r\n");

  g_assert_false (df_loop_csv_write_points ("/nonexistent-dir/x.csv", one, 3, &error));
  g_assert_nonnull (error);
  g_assert_false (g_file_test ("/nonexistent-dir/x.csv", G_FILE_TEST_EXISTS));
}

static JsonObject *
parse_json_object (const char *text, JsonParser *parser)
{
  g_autoptr (GError) error = NULL;

  g_assert_true (json_parser_load_from_data (parser, text, -1, &error));
  g_assert_no_error (error);
  g_assert_true (JSON_NODE_HOLDS_OBJECT (json_parser_get_root (parser)));
  return json_node_get_object (json_parser_get_root (parser));
}

/* JSON numbers: 17 significant digits read back exactly; non-finite becomes null; numbers
 * like 1e+20, which json-glib 1.6 would print as the invalid "1e+20.0", stay valid. */
static void
test_json_numbers (void)
{
  g_autoptr (JsonBuilder) b = json_builder_new ();
  g_autoptr (JsonNode) root = NULL;
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_autofree char *text = NULL;
  JsonObject *o;
  const double values[] = { 0.1, G_PI, 1e20, 1e-300, -2.0, 1.0 / 3.0, 4e22 };
  const double vec[3] = { 1.0, NAN, -INFINITY };

  json_builder_begin_object (b);
  json_builder_set_member_name (b, "values");
  json_builder_begin_array (b);
  for (gsize i = 0; i < G_N_ELEMENTS (values); i++)
    df_json_add_double_value (b, values[i]);
  json_builder_end_array (b);
  df_json_add_double (b, "quiet", NAN);
  df_json_add_double (b, "huge", INFINITY);
  df_json_add_double_or_null (b, "absent", FALSE, 3.0);
  df_json_add_vector (b, "vec", vec, 3);
  json_builder_set_member_name (b, "text");
  json_builder_add_string_value (b, "keep 1e+20.0 inside strings");
  json_builder_end_object (b);
  root = json_builder_get_root (b);
  text = df_json_to_string (root, TRUE);
  g_test_message ("%s", text);

  o = parse_json_object (text, parser);
  for (guint i = 0; i < G_N_ELEMENTS (values); i++)
    {
      JsonArray *a = json_object_get_array_member (o, "values");

      g_assert_true (json_array_get_double_element (a, i) == values[i]);
    }
  g_assert_true (json_object_get_null_member (o, "quiet"));
  g_assert_true (json_object_get_null_member (o, "huge"));
  g_assert_true (json_object_get_null_member (o, "absent"));
  g_assert_true (json_array_get_null_element (json_object_get_array_member (o, "vec"), 1));
  g_assert_true (json_array_get_null_element (json_object_get_array_member (o, "vec"), 2));
  g_assert_cmpstr (json_object_get_string_member (o, "text"), ==, "keep 1e+20.0 inside strings");
  g_assert_null (strstr (text, "nan"));
  g_assert_null (strstr (text, "inf"));
  g_assert_null (strstr (text, "NaN"));
}

/* A loop result as JSON: the documented keys, finite numbers, nulls where no disc. */
static void
test_json_loop (void)
{
  static const char *const keys[] = { "holonomy_deg", "holonomy_rad", "enclosed_curvature_rad",
                                      "area", "gauss_bonnet_residual_rad",
                                      "total_geodesic_curvature_rad", "length",
                                      "min_steering_radius", "samples", "bounds_disc", "simple",
                                      "axis_winding", "note", "rhs_evaluations", NULL };
  g_autoptr (df_surface) sphere = build_preset ("sphere");
  g_auto (df_loop_result) result = { 0 };
  g_autoptr (JsonBuilder) b = json_builder_new ();
  g_autoptr (JsonNode) root = NULL;
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_autofree char *path = tmp_path ("loop.json");
  g_autofree char *text = NULL;
  g_autoptr (GError) error = NULL;
  JsonObject *o;

  measure_latitude (sphere, 0.6, &result);
  json_builder_begin_object (b);
  df_json_add_loop_result (b, &result);
  json_builder_end_object (b);
  root = json_builder_get_root (b);
  g_assert_true (df_json_write (path, root, &error));
  g_assert_no_error (error);
  g_assert_true (g_file_get_contents (path, &text, NULL, NULL));

  o = parse_json_object (text, parser);
  for (gsize i = 0; keys[i] != NULL; i++)
    {
      g_test_message ("key %s", keys[i]);
      g_assert_true (json_object_has_member (o, keys[i]));
    }
  g_assert_true (json_object_get_boolean_member (o, "bounds_disc"));
  g_assert_cmpint (json_object_get_int_member (o, "samples"), ==, (gint64) result.n_samples);
  /* Latitude circle at theta = 0.6: 2 pi (1 - cos theta), Gauss-Bonnet (do Carmo, sec. 4-5,
   * from memory). */
  df_assert_close (json_object_get_double_member (o, "holonomy_rad"),
                   2 * G_PI * (1 - cos (0.6)), 0.0, 1e-8);
  df_assert_close (json_object_get_double_member (o, "holonomy_deg"),
                   360.0 * (1 - cos (0.6)), 0.0, 1e-6);
  /* The sphere's area inside the circle: 2 pi R^2 (1 - cos theta) (Archimedes, from memory). */
  df_assert_close (json_object_get_double_member (o, "area"),
                   2 * G_PI * 100.0 * 100.0 * (1 - cos (0.6)), 1e-8, 0.0);
}

/* Point geometry at a pole: the metric-dependent members are null, curvature is not. */
static void
test_json_pole (void)
{
  g_autoptr (df_surface) sphere = build_preset ("sphere");
  g_autoptr (JsonBuilder) b = json_builder_new ();
  g_autoptr (JsonNode) root = NULL;
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_autofree char *text = NULL;
  df_point_geometry g;
  JsonObject *o;

  g_assert_true (df_surface_geometry (sphere, 0.0, 0.0, &g, NULL) == DF_OK);
  json_builder_begin_object (b);
  df_json_add_point_geometry (b, &g);
  json_builder_end_object (b);
  root = json_builder_get_root (b);
  text = df_json_to_string (root, FALSE);
  o = parse_json_object (text, parser);
  g_assert_false (json_object_get_boolean_member (o, "chart_regular"));
  /* The chart's metric exists at the pole, degenerate: [[R^2, 0], [0, 0]] for the sphere
   * r = R sin t (g_tt = R^2, g_phiphi = r^2 = 0; from the definition g_ij = X_i . X_j). */
  {
    JsonArray *m = json_object_get_array_member (o, "metric");
    JsonArray *row = json_array_get_array_element (m, 1);

    df_assert_close (json_array_get_double_element (json_array_get_array_element (m, 0), 0),
                     1e4, 1e-12, 0.0);
    df_assert_close (json_array_get_double_element (row, 1), 0.0, 0.0, 1e-20);
  }
  g_assert_true (json_object_has_member (o, "note"));
  g_assert_true (json_object_get_null_member (o, "christoffel"));
  g_assert_true (json_object_get_null_member (o, "riemann"));
  /* K = 1/R^2 on the sphere, poles included (textbook, from memory). */
  df_assert_close (json_object_get_double_member (o, "gaussian_curvature"), 1e-4, 1e-9, 0.0);
}

int
main (int argc, char **argv)
{
  static const char *const written[] = { "points.csv", "samples.csv", "geodesic.csv",
                                         "loop.json" };
  int status;

  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);

  g_test_add_func ("/io/write/points-round-trip", test_points_round_trip);
  g_test_add_func ("/io/write/samples-csv", test_samples_csv);
  g_test_add_func ("/io/write/summary-csv", test_summary_csv);
  g_test_add_func ("/io/write/geodesic-csv", test_geodesic_csv);
  g_test_add_func ("/io/write/atomic", test_atomic_write);
  g_test_add_func ("/io/write/json-numbers", test_json_numbers);
  g_test_add_func ("/io/write/json-loop", test_json_loop);
  g_test_add_func ("/io/write/json-pole", test_json_pole);

  tmp_dir = g_dir_make_tmp ("df-test-writers-XXXXXX", NULL);
  g_assert_nonnull (tmp_dir);
  status = g_test_run ();
  for (gsize i = 0; i < G_N_ELEMENTS (written); i++)
    {
      g_autofree char *path = tmp_path (written[i]);

      g_remove (path);
    }
  g_rmdir (tmp_dir);
  g_free (tmp_dir);
  return status;
}
