/* test-cli.c: runs the built driftframe-cli (DF_CLI_PATH) as a user would: JSON output parsed
 * with json-glib and checked against textbook results, exit codes, and one-line messages on
 * stderr for bad input. */
#include <math.h>
#include <string.h>

#include <glib/gstdio.h>
#include <json-glib/json-glib.h>

#include "df-glib.h"
#include "df-test.h"

#include "df-test-cli.h"

/* A finite number member (JSON has no NaN; null would mean "missing"). */
static double
get_number (JsonObject *o, const char *key)
{
  JsonNode *node = json_object_get_member (o, key);

  g_test_message ("key %s", key);
  g_assert_nonnull (node);
  g_assert_true (JSON_NODE_HOLDS_VALUE (node));
  g_assert_true (json_node_get_value_type (node) == G_TYPE_DOUBLE
                 || json_node_get_value_type (node) == G_TYPE_INT64);
  g_assert_true (isfinite (json_node_get_double (node)));
  return json_node_get_double (node);
}

static double
array_number (JsonArray *a, guint i)
{
  JsonNode *node = json_array_get_element (a, i);

  g_assert_true (JSON_NODE_HOLDS_VALUE (node));
  return json_node_get_double (node);
}

/* A latitude circle t = theta, 48 chart points. */
static char *
write_latitude (const char *name, double theta)
{
  g_autoptr (GString) text = g_string_new ("u,v\n");

  for (int i = 0; i < 48; i++)
    {
      char a[G_ASCII_DTOSTR_BUF_SIZE], b[G_ASCII_DTOSTR_BUF_SIZE];

      g_string_append_printf (text, "%s,%s\n", g_ascii_dtostr (a, sizeof a, theta),
                              g_ascii_dtostr (b, sizeof b, -G_PI + 2 * G_PI * i / 48));
    }
  return write_tmp (name, text->str);
}

/* The same latitude circle of a sphere of radius R = 50 mm measured in mm and in m: length
 * 2 pi R sin(theta) and cap area 2 pi R^2 (1 - cos(theta)) (Archimedes' hat-box theorem) in each
 * unit, so 1000 and 1e6 apart; the holonomy identical (an angle). */
static void
test_measure_units (void)
{
  const double theta = 0.9, R = 50.0;
  g_autofree char *loop = write_latitude ("latitude-units.csv", theta);
  g_autoptr (JsonParser) p1 = json_parser_new ();
  g_autoptr (JsonParser) p2 = json_parser_new ();
  g_auto (cli_run) mm = { 0 };
  g_auto (cli_run) m = { 0 };
  g_auto (cli_run) bad = { 0 };
  JsonObject *a, *b;

  run_cli (&mm, "measure", "--preset", "sphere", "--param", "R=50", "--loop", loop, "--json",
           NULL);
  run_cli (&m, "measure", "--preset", "sphere", "--param", "R=50", "--loop", loop, "--json",
           "--units", "m", NULL);
  g_assert_cmpint (mm.status, ==, 0);
  g_assert_cmpint (m.status, ==, 0);
  a = parse_object (p1, mm.out);
  b = parse_object (p2, m.out);
  g_assert_cmpstr (json_object_get_string_member (a, "units"), ==, "mm");
  g_assert_cmpstr (json_object_get_string_member (b, "units"), ==, "m");
  g_assert_cmpstr (json_object_get_string_member (b, "curvature_units"), ==, "1/m^2");
  df_assert_close (get_number (a, "length"), 2 * G_PI * R * sin (theta), 1e-9, 0.0);
  df_assert_close (get_number (b, "length"), 2 * G_PI * R * sin (theta) / 1000, 1e-9, 0.0);
  df_assert_close (get_number (a, "area"), 2 * G_PI * R * R * (1 - cos (theta)), 1e-9, 0.0);
  df_assert_close (get_number (b, "area"), 2 * G_PI * R * R * (1 - cos (theta)) / 1e6, 1e-9,
                   0.0);
  /* The steering radius R tan(theta) (k_g = cot(theta) / R, do Carmo, from memory). */
  df_assert_close (get_number (b, "min_steering_radius"), R * tan (theta) / 1000, 1e-6, 0.0);
  g_assert_cmpfloat (get_number (a, "holonomy_rad"), ==, get_number (b, "holonomy_rad"));
  run_cli (&bad, "measure", "--preset", "sphere", "--loop", loop, "--units", "ft", NULL);
  g_assert_cmpint (bad.status, ==, 2);
  g_assert_nonnull (strstr (bad.err, "--units: unknown unit 'ft'"));
}

/* A meridian geodesic of a sphere of R = 50 mm traced 0.06 m in --units m: the same 60 mm arc,
 * ending at z = R cos(theta0 + s/R) (a great circle: arc length = R x angle), shown in m. */
static void
test_geodesic_units (void)
{
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_auto (cli_run) r = { 0 };
  JsonObject *o;

  run_cli (&r, "geodesic", "--preset", "sphere", "--param", "R=50", "--from", "0.5,0",
           "--heading", "0", "--length", "0.06", "--units", "m", "--json", NULL);
  g_assert_cmpint (r.status, ==, 0);
  o = parse_object (parser, r.out);
  g_assert_cmpstr (json_object_get_string_member (o, "units"), ==, "m");
  df_assert_close (get_number (o, "requested_length"), 0.06, 1e-15, 0.0);
  df_assert_close (get_number (o, "length"), 0.06, 1e-9, 0.0);
  {
    JsonArray *end = json_object_get_array_member (json_object_get_object_member (o, "end"),
                                                   "point");

    df_assert_close (json_array_get_double_element (end, 2), 0.05 * cos (0.5 + 60.0 / 50.0),
                     1e-7, 0.0);
  }
}

/* compare --units m: path A, a meridian of a sphere of R = 50 mm from theta 0.5 to 1.0, is
 * R x 0.5 long (a great-circle arc), shown in m; the angle between the carried vectors is the
 * same in either unit. */
static void
test_compare_units (void)
{
  g_autofree char *pa = write_tmp ("cmp-a.csv", "u,v\n0.5,0\n0.75,0\n1.0,0\n");
  g_autofree char *pb = write_tmp ("cmp-b.csv", "u,v\n0.5,0\n0.75,0.3\n1.0,0\n");
  g_autoptr (JsonParser) p1 = json_parser_new ();
  g_autoptr (JsonParser) p2 = json_parser_new ();
  g_auto (cli_run) mm = { 0 };
  g_auto (cli_run) m = { 0 };
  JsonObject *a, *b;

  run_cli (&mm, "compare", "--preset", "sphere", "--param", "R=50", "--path-a", pa, "--path-b",
           pb, "--json", NULL);
  run_cli (&m, "compare", "--preset", "sphere", "--param", "R=50", "--path-a", pa, "--path-b",
           pb, "--json", "--units", "m", NULL);
  g_assert_cmpint (mm.status, ==, 0);
  g_assert_cmpint (m.status, ==, 0);
  a = parse_object (p1, mm.out);
  b = parse_object (p2, m.out);
  g_assert_cmpstr (json_object_get_string_member (b, "units"), ==, "m");
  df_assert_close (get_number (a, "length_a"), 25.0, 1e-8, 0.0);
  df_assert_close (get_number (b, "length_a"), 0.025, 1e-8, 0.0);
  df_assert_close (get_number (b, "length_b"), get_number (a, "length_b") / 1000, 1e-14, 0.0);
  g_assert_cmpfloat (get_number (a, "angle_rad"), ==, get_number (b, "angle_rad"));
}

/* probe --units in on a sphere of R = 50 mm: the point R (sin theta, 0, cos theta) and
 * K = 1/R^2, H = -1/R (N outward), all with R = 50 / 25.4 in (the inch is 25.4 mm exactly,
 * by definition); the chart point stays in the chart's own coordinates. */
static void
test_probe_units (void)
{
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_auto (cli_run) r = { 0 };
  g_auto (cli_run) bad = { 0 };
  const double R = 50.0 / 25.4, theta = 0.9;
  JsonObject *o;
  JsonArray *pt;

  run_cli (&r, "probe", "--preset", "sphere", "--param", "R=50", "--at", "0.9,0", "--units",
           "in", "--json", NULL);
  g_assert_cmpint (r.status, ==, 0);
  o = parse_object (parser, r.out);
  g_assert_cmpstr (json_object_get_string_member (o, "units"), ==, "in");
  g_assert_cmpstr (json_object_get_string_member (o, "curvature_units"), ==, "1/in^2");
  df_assert_close (get_number (o, "u"), theta, 1e-15, 0.0);
  pt = json_object_get_array_member (o, "point");
  df_assert_close (json_array_get_double_element (pt, 0), R * sin (theta), 1e-12, 0.0);
  df_assert_close (json_array_get_double_element (pt, 2), R * cos (theta), 1e-12, 0.0);
  df_assert_close (get_number (o, "gaussian_curvature"), 1 / (R * R), 1e-10, 0.0);
  df_assert_close (fabs (get_number (o, "mean_curvature")), 1 / R, 1e-10, 0.0);
  run_cli (&bad, "probe", "--preset", "sphere", "--at", "0.9,0", "--units", "yd", NULL);
  g_assert_cmpint (bad.status, ==, 2);
  g_assert_nonnull (strstr (bad.err, "--units: unknown unit 'yd'"));
}

/* report --units m on the demo project: every loop's length and steering radius a thousandth
 * and its area a millionth of the report in mm (1 m = 1000 mm, by definition), the holonomy
 * the same; the summary CSV names the unit in its header. */
static void
test_report_units (void)
{
  g_autoptr (JsonParser) p1 = json_parser_new ();
  g_autoptr (JsonParser) p2 = json_parser_new ();
  g_auto (cli_run) mm = { 0 };
  g_auto (cli_run) m = { 0 };
  g_autofree char *csv = write_tmp ("report-units.csv", "");
  g_autofree char *text = NULL;
  JsonArray *la, *lb;

  run_cli (&mm, "report", "--project", DF_EXAMPLES_DIR "/demo.dfproj", "--json", "--units", "mm",
           NULL);
  run_cli (&m, "report", "--project", DF_EXAMPLES_DIR "/demo.dfproj", "--json", "--units", "m",
           "--summary", csv, NULL);
  g_assert_cmpint (mm.status, ==, 0);
  g_assert_cmpint (m.status, ==, 0);
  g_assert_cmpstr (json_object_get_string_member (parse_object (p2, m.out), "units"), ==, "m");
  la = json_object_get_array_member (parse_object (p1, mm.out), "loops");
  lb = json_object_get_array_member (json_node_get_object (json_parser_get_root (p2)), "loops");
  g_assert_cmpuint (json_array_get_length (la), ==, json_array_get_length (lb));
  for (guint i = 0; i < json_array_get_length (la); i++)
    {
      JsonObject *a = json_array_get_object_element (la, i), *b = json_array_get_object_element (lb, i);

      df_assert_close (get_number (b, "length"), get_number (a, "length") / 1000, 1e-14, 0.0);
      df_assert_close (get_number (b, "min_steering_radius"),
                       get_number (a, "min_steering_radius") / 1000, 1e-14, 0.0);
      if (json_object_get_boolean_member (a, "bounds_disc"))
        df_assert_close (get_number (b, "area"), get_number (a, "area") / 1e6, 1e-14, 0.0);
      g_assert_cmpfloat (get_number (a, "holonomy_rad"), ==, get_number (b, "holonomy_rad"));
    }
  g_assert_true (g_file_get_contents (csv, &text, NULL, NULL));
  g_assert_nonnull (strstr (text, ",length_m,min_steering_radius_m,"));
}

/* A data surface's fit is reported by probe and report as measure reports it: the JSON
 * object fit with points = the data rows of the file (counted here from the file itself), an
 * RMS no larger than the largest distance, and the text line "Fit:". */
static void
test_fit_in_probe_and_report (void)
{
  g_autofree char *text = NULL;
  g_auto (GStrv) lines = NULL;
  gint64 rows = 0;
  g_autoptr (JsonParser) p1 = json_parser_new ();
  g_autoptr (JsonParser) p2 = json_parser_new ();
  g_auto (cli_run) probe = { 0 };
  g_auto (cli_run) report = { 0 };
  g_auto (cli_run) probe_text = { 0 };
  JsonObject *fits[2];

  g_assert_true (g_file_get_contents (DF_EXAMPLES_DIR "/panel-scan.csv", &text, NULL, NULL));
  lines = g_strsplit (text, "\n", -1);
  for (guint i = 0; lines[i] != NULL; i++)
    if (g_ascii_isdigit (lines[i][0]) || lines[i][0] == '-')
      rows++;
  run_cli (&probe, "probe", "--surface", DF_EXAMPLES_DIR "/panel-scan.surface", "--at", "0,0",
           "--json", NULL);
  run_cli (&report, "report", "--project", DF_EXAMPLES_DIR "/panel-scan.dfproj", "--json", NULL);
  run_cli (&probe_text, "probe", "--surface", DF_EXAMPLES_DIR "/panel-scan.surface", "--at",
           "0,0", NULL);
  g_assert_cmpint (probe.status, ==, 0);
  g_assert_cmpint (report.status, ==, 0);
  g_assert_cmpint (probe_text.status, ==, 0);
  fits[0] = json_object_get_object_member (parse_object (p1, probe.out), "fit");
  fits[1] = json_object_get_object_member (parse_object (p2, report.out), "fit");
  for (int k = 0; k < 2; k++)
    {
      g_assert_nonnull (fits[k]);
      g_assert_cmpint (json_object_get_int_member (fits[k], "points"), ==, rows);
      g_assert_cmpfloat (get_number (fits[k], "rms"), >, 0.0);
      g_assert_cmpfloat (get_number (fits[k], "rms"), <=, get_number (fits[k], "max"));
    }
  g_assert_nonnull (strstr (probe_text.out, "\nFit:     "));
}

static void
test_measure_sphere (void)
{
  static const char *const numbers[] = { "holonomy_deg", "holonomy_rad", "enclosed_curvature_rad",
                                         "area", "gauss_bonnet_residual_rad",
                                         "total_geodesic_curvature_rad", "length",
                                         "min_steering_radius", "samples", "axis_winding",
                                         "tolerance", "rhs_evaluations", NULL };
  static const char *const strings[] = { "note", "normal_side", "units", "caution", NULL };
  const double theta = 0.9, R = 50.0;
  g_autofree char *loop = write_latitude ("latitude.csv", theta);
  g_autofree char *samples = tmp_path ("samples.csv");
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_auto (cli_run) r = { 0 };
  g_autofree char *csv = NULL;
  g_auto (GStrv) lines = NULL;
  JsonObject *o;

  run_cli (&r, "measure", "--preset", "sphere", "--param", "R=50", "--loop", loop, "--json",
           "--samples", samples, "--count", "50", NULL);
  g_assert_cmpint (r.status, ==, 0);
  g_assert_cmpstr (r.err, ==, "");
  o = parse_object (parser, r.out);
  for (gsize i = 0; numbers[i] != NULL; i++)
    get_number (o, numbers[i]);
  for (gsize i = 0; strings[i] != NULL; i++)
    g_assert_nonnull (json_object_get_string_member (o, strings[i]));
  g_assert_true (json_object_get_boolean_member (o, "bounds_disc"));
  g_assert_true (json_object_get_boolean_member (o, "simple"));
  g_assert_cmpstr (json_object_get_string_member (o, "units"), ==, "mm");
  g_assert_nonnull (strstr (json_object_get_string_member (o, "caution"),
                            "not a material or structural assessment"));

  /* Latitude circle at polar angle theta encloses K dA = 2 pi (1 - cos theta): Gauss-Bonnet,
   * do Carmo, Differential Geometry of Curves and Surfaces, sec. 4-5 (from memory). */
  df_assert_close (get_number (o, "holonomy_rad"), 2 * G_PI * (1 - cos (theta)), 0.0, 1e-8);
  df_assert_close (get_number (o, "enclosed_curvature_rad"), 2 * G_PI * (1 - cos (theta)), 0.0,
                   1e-8);
  df_assert_close (get_number (o, "holonomy_deg"), 360.0 * (1 - cos (theta)), 0.0, 1e-6);
  /* Cap area 2 pi R^2 (1 - cos theta) (Archimedes, from memory); circumference 2 pi R sin. */
  df_assert_close (get_number (o, "area"), 2 * G_PI * R * R * (1 - cos (theta)), 1e-8, 0.0);
  df_assert_close (get_number (o, "length"), 2 * G_PI * R * sin (theta), 1e-8, 0.0);
  /* A latitude circle's geodesic curvature is cot(theta)/R (do Carmo sec. 4-4, from memory). */
  df_assert_close (get_number (o, "min_steering_radius"), R * tan (theta), 1e-6, 0.0);
  g_assert_cmpint ((int) get_number (o, "samples"), ==, 50);

  g_assert_true (g_file_get_contents (samples, &csv, NULL, NULL));
  lines = g_strsplit (csv, "\r\n", -1);
  /* header + 50 rows + the empty piece after the last CRLF */
  g_assert_cmpuint (g_strv_length (lines), ==, 52);
  g_assert_cmpstr (lines[0], ==, "s_mm,t,phi_rad,x_mm,y_mm,z_mm,vx,vy,vz,angle_deg,angle_unwrapped_deg,k_g_per_mm,K_per_mm2");
}

static void
test_measure_text (void)
{
  g_autofree char *loop = write_latitude ("latitude.csv", 0.5);
  g_auto (cli_run) r = { 0 };

  run_cli (&r, "measure", "--preset", "sphere", "--loop", loop, NULL);
  g_assert_cmpint (r.status, ==, 0);
  g_assert_nonnull (strstr (r.out, "Caution: Geometric estimate only, not a material or "
                                   "structural assessment: check against the material "
                                   "supplier's data, local codes and licensed engineering "
                                   "practice."));
  g_assert_nonnull (strstr (r.out, " deg"));
  g_assert_nonnull (strstr (r.out, " rad"));
  g_assert_nonnull (strstr (r.out, " mm"));
  g_assert_nonnull (strstr (r.out, "N points"));
  g_assert_null (strstr (r.out, "nan"));
  g_assert_null (strstr (r.out, "NaN"));
}

/* The example files: a ply patch on the lamp shade bounds a disc and meets Gauss-Bonnet
 * (holonomy = enclosed curvature, do Carmo sec. 4-5, from memory); the band around the open
 * shade bounds none, so the enclosed curvature is null, not a number. */
static void
test_measure_examples (void)
{
  g_autofree char *surface = g_build_filename (DF_EXAMPLES_DIR, "lamp-shade.surface", NULL);
  g_autofree char *patch = g_build_filename (DF_EXAMPLES_DIR, "lamp-patch.csv", NULL);
  g_autofree char *seam = g_build_filename (DF_EXAMPLES_DIR, "lamp-seam.csv", NULL);
  g_autofree char *rim = g_build_filename (DF_EXAMPLES_DIR, "lamp-rim.csv", NULL);
  g_autofree char *canopy = g_build_filename (DF_EXAMPLES_DIR, "canopy-panel.surface", NULL);
  g_autofree char *corner = g_build_filename (DF_EXAMPLES_DIR, "canopy-corner.csv", NULL);
  const char *with_disc[][2] = { { surface, patch }, { surface, seam }, { canopy, corner } };

  for (gsize i = 0; i < G_N_ELEMENTS (with_disc); i++)
    {
      g_autoptr (JsonParser) parser = json_parser_new ();
      g_auto (cli_run) r = { 0 };
      JsonObject *o;

      run_cli (&r, "measure", "--surface", with_disc[i][0], "--loop", with_disc[i][1], "--json",
               NULL);
      g_assert_cmpint (r.status, ==, 0);
      o = parse_object (parser, r.out);
      g_assert_true (json_object_get_boolean_member (o, "bounds_disc"));
      df_assert_close (get_number (o, "gauss_bonnet_residual_rad"), 0.0, 0.0, 1e-7);
      g_assert_cmpfloat (fabs (get_number (o, "holonomy_rad")), >, 1e-3);
    }

  {
    g_autoptr (JsonParser) parser = json_parser_new ();
    g_auto (cli_run) r = { 0 };
    JsonObject *o;

    run_cli (&r, "measure", "--surface", surface, "--loop", rim, "--json", NULL);
    g_assert_cmpint (r.status, ==, 0);
    o = parse_object (parser, r.out);
    g_assert_false (json_object_get_boolean_member (o, "bounds_disc"));
    g_assert_true (json_object_get_null_member (o, "enclosed_curvature_rad"));
    g_assert_true (json_object_get_null_member (o, "area"));
    g_assert_cmpint ((int) get_number (o, "axis_winding"), ==, 1);
    get_number (o, "holonomy_rad");
  }
}

/* The data examples: the bowl mould is a sphere crown R = 120 mm, so the ring at t = 60 mm
 * (polar angle 0.5 rad) carries 2 pi (1 - cos 0.5), Gauss-Bonnet (do Carmo sec. 4-5, from
 * memory); the scanned panel reports its fit and the holonomy's sensitivity to it. */
static void
test_measure_data (void)
{
  g_autofree char *mould = g_build_filename (DF_EXAMPLES_DIR, "mould.surface", NULL);
  g_autofree char *ring = g_build_filename (DF_EXAMPLES_DIR, "mould-ring.csv", NULL);
  g_autofree char *panel = g_build_filename (DF_EXAMPLES_DIR, "panel-scan.surface", NULL);
  g_autofree char *patch = g_build_filename (DF_EXAMPLES_DIR, "panel-patch.csv", NULL);

  {
    g_autoptr (JsonParser) parser = json_parser_new ();
    g_auto (cli_run) r = { 0 };
    JsonObject *o, *fit;

    run_cli (&r, "measure", "--surface", mould, "--loop", ring, "--json", NULL);
    g_assert_cmpint (r.status, ==, 0);
    o = parse_object (parser, r.out);
    df_assert_close (get_number (o, "holonomy_rad"), 2 * G_PI * (1 - cos (0.5)), 0.0, 1e-6);
    fit = json_object_get_object_member (o, "fit");
    g_assert_nonnull (fit);
    g_assert_cmpint ((int) get_number (fit, "points"), ==, 121);
    g_assert_cmpfloat (get_number (fit, "rms"), <, 1e-5);
  }
  {
    g_autoptr (JsonParser) parser = json_parser_new ();
    g_auto (cli_run) r = { 0 };
    JsonObject *o, *fit;
    JsonArray *at;

    run_cli (&r, "measure", "--surface", panel, "--loop", patch, "--json", NULL);
    g_assert_cmpint (r.status, ==, 0);
    o = parse_object (parser, r.out);
    fit = json_object_get_object_member (o, "fit");
    g_assert_nonnull (fit);
    g_assert_cmpint ((int) get_number (fit, "points"), ==, 61 * 41);
    /* make-data.py adds Gaussian noise of 0.02 mm; the fit keeps at most that. */
    g_assert_cmpfloat (get_number (fit, "rms"), <=, 0.02 * 1.001);
    g_assert_cmpfloat (get_number (fit, "rms"), >, 0.015);
    g_assert_cmpfloat (get_number (fit, "max"), >=, get_number (fit, "rms"));
    df_assert_close (get_number (fit, "tolerance"), 0.02, 1e-12, 0.0);
    at = json_object_get_array_member (fit, "max_at");
    g_assert_cmpuint (json_array_get_length (at), ==, 3);
    g_assert_cmpfloat (get_number (o, "fit_sensitivity_rad"), <, 1e-2);
    g_assert_cmpfloat (get_number (o, "fit_sensitivity_rad"), >, 0.0);
  }
  {
    g_auto (cli_run) r = { 0 };

    run_cli (&r, "measure", "--surface", mould, "--loop", patch, NULL);
    g_assert_cmpint (r.status, ==, 2);
  }
}

/* Sphere of radius R at polar angle t (do Carmo sec. 4-3, from memory): g = diag(R^2,
 * R^2 sin^2 t), Gamma^t_phiphi = -sin t cos t, Gamma^phi_tphi = cot t, K = 1/R^2, both
 * principal curvatures of magnitude 1/R, R^t_phitphi = K g_phiphi = sin^2 t. */
static void
test_probe_sphere (void)
{
  const double R = 80.0, t = 0.7;
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_auto (cli_run) r = { 0 };
  JsonObject *o;
  JsonArray *metric, *gamma, *riemann, *k;

  run_cli (&r, "probe", "--preset", "sphere", "--param", "R=80", "--at", "0.7,1.2", "--json",
           NULL);
  g_assert_cmpint (r.status, ==, 0);
  o = parse_object (parser, r.out);
  g_assert_cmpuint (json_array_get_length (json_object_get_array_member (o, "point")), ==, 3);
  g_assert_cmpuint (json_array_get_length (json_object_get_array_member (o, "normal")), ==, 3);
  df_assert_close (get_number (o, "gaussian_curvature"), 1.0 / (R * R), 1e-10, 0.0);
  df_assert_close (fabs (get_number (o, "mean_curvature")), 1.0 / R, 1e-10, 0.0);

  k = json_object_get_array_member (o, "principal_curvatures");
  g_assert_cmpuint (json_array_get_length (k), ==, 2);
  g_assert_cmpfloat (array_number (k, 0), >=, array_number (k, 1));
  /* Every point of a sphere is umbilic (k1 = k2): H +- sqrt(H^2 - K) keeps only about half
   * the digits there, so this check allows 1e-7 relative. */
  df_assert_close (fabs (array_number (k, 0)), 1.0 / R, 1e-7, 0.0);
  df_assert_close (fabs (array_number (k, 1)), 1.0 / R, 1e-7, 0.0);

  metric = json_object_get_array_member (o, "metric");
  df_assert_close (array_number (json_array_get_array_element (metric, 0), 0), R * R, 1e-12, 0.0);
  df_assert_close (array_number (json_array_get_array_element (metric, 0), 1), 0.0, 0.0, 1e-9);
  df_assert_close (array_number (json_array_get_array_element (metric, 1), 1),
                   R * R * sin (t) * sin (t), 1e-12, 0.0);

  /* christoffel[k][i][j] = Gamma^k_ij with 0 = t, 1 = phi */
  gamma = json_object_get_array_member (o, "christoffel");
  df_assert_close (array_number (json_array_get_array_element (
                     json_array_get_array_element (gamma, 0), 1), 1),
                   -sin (t) * cos (t), 1e-10, 0.0);
  df_assert_close (array_number (json_array_get_array_element (
                     json_array_get_array_element (gamma, 1), 0), 1),
                   cos (t) / sin (t), 1e-10, 0.0);
  df_assert_close (array_number (json_array_get_array_element (
                     json_array_get_array_element (gamma, 1), 1), 0),
                   cos (t) / sin (t), 1e-10, 0.0);

  /* riemann[r][s][m][n] = R^r_smn: R^t_phi t phi = sin^2 t, antisymmetric in m, n. */
  riemann = json_object_get_array_member (o, "riemann");
  {
    JsonArray *r0 = json_array_get_array_element (riemann, 0);
    JsonArray *r01 = json_array_get_array_element (r0, 1);

    df_assert_close (array_number (json_array_get_array_element (r01, 0), 1),
                     sin (t) * sin (t), 1e-9, 0.0);
    df_assert_close (array_number (json_array_get_array_element (r01, 1), 0),
                     -sin (t) * sin (t), 1e-9, 0.0);
  }
}

/* At the pole the chart is singular: the metric is the chart's own, degenerate (g_phiphi =
 * r^2 = 0), the connection is null with a note, K is 1/R^2 (sphere, from memory) to 1e-12. */
static void
test_probe_pole (void)
{
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_auto (cli_run) r = { 0 };
  JsonObject *o;

  run_cli (&r, "probe", "--preset", "sphere", "--at", "0,0", "--json", NULL);
  g_assert_cmpint (r.status, ==, 0);
  o = parse_object (parser, r.out);
  g_assert_false (json_object_get_null_member (o, "metric"));
  g_assert_true (json_object_get_null_member (o, "christoffel"));
  g_assert_true (json_object_get_null_member (o, "riemann"));
  g_assert_nonnull (strstr (json_object_get_string_member (o, "note"), "pole"));
  df_assert_close (get_number (o, "gaussian_curvature"), 1e-4, 1e-12, 0.0);
  df_assert_close (get_number (o, "mean_curvature"), -1e-2, 1e-12, 0.0);
}

/* A cone apex: no K, H or principal curvatures, but the concentrated curvature
 * 2 pi (1 - sin 30 deg) = pi (GEOMETRY.md; cone unrolled, from memory). A huge sphere and cylinder
 * whose numbers overflow give a clear error, not a stack overflow. */
static void
test_probe_apex_and_overflow (void)
{
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_auto (cli_run) r = { 0 };
  g_auto (cli_run) big = { 0 };
  g_auto (cli_run) cyl = { 0 };
  JsonObject *o;

  run_cli (&r, "probe", "--preset", "cone", "--at", "0,0", "--json", NULL);
  g_assert_cmpint (r.status, ==, 0);
  o = parse_object (parser, r.out);
  g_assert_true (json_object_get_null_member (o, "gaussian_curvature"));
  g_assert_true (json_object_get_null_member (o, "mean_curvature"));
  g_assert_true (json_object_get_null_member (o, "principal_curvatures"));
  df_assert_close (get_number (o, "concentrated_curvature_rad"), G_PI, 1e-12, 0.0);
  run_cli (&big, "probe", "--preset", "sphere", "--param", "R=1e300", "--at", "1,0", NULL);
  g_assert_cmpint (big.status, ==, 2);
  g_assert_null (strstr (big.err, "inf"));
  g_assert_nonnull (strstr (big.err, "overflows"));
  /* Refused before any geometry by the surface's size check (it overflowed the stack once). */
  run_cli (&cyl, "geodesic", "--preset", "cylinder", "--param", "R=1e13", "--from", "75,0",
           "--heading", "0", "--length", "10", NULL);
  g_assert_cmpint (cyl.status, ==, 2);
  g_assert_null (strstr (cyl.err, "inf"));
  g_assert_nonnull (strstr (cyl.err, "across"));
}

/* Saddle z = (x^2 - y^2)/(2R) at the origin: K = -1/R^2, H = 0, k1 = 1/R, k2 = -1/R
 * (graph formulas, do Carmo sec. 3-3, from memory). */
static void
test_probe_saddle (void)
{
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_auto (cli_run) r = { 0 };
  JsonObject *o;
  JsonArray *k;

  run_cli (&r, "probe", "--preset", "saddle", "--param", "R=250", "--at", "0,0", "--json", NULL);
  g_assert_cmpint (r.status, ==, 0);
  o = parse_object (parser, r.out);
  df_assert_close (get_number (o, "gaussian_curvature"), -1.0 / (250.0 * 250.0), 1e-10, 0.0);
  df_assert_close (get_number (o, "mean_curvature"), 0.0, 0.0, 1e-14);
  k = json_object_get_array_member (o, "principal_curvatures");
  df_assert_close (array_number (k, 0), 1.0 / 250.0, 1e-10, 0.0);
  df_assert_close (array_number (k, 1), -1.0 / 250.0, 1e-10, 0.0);
}

/* Two routes around a latitude circle, the upper half (phi 0 -> pi) and the lower half
 * (phi 0 -> -pi), together make the whole circle: carried along them, one direction arrives
 * turned by the circle's holonomy 2 pi (1 - cos theta) (Gauss-Bonnet, do Carmo sec. 4-5,
 * from memory). Transport along A then back along B gives P_B^-1 P_A = Rot(h), so the
 * vector carried along A is the one carried along B turned by +h: B is -h from A. */
static void
test_compare_sphere (void)
{
  const double theta = 1.0;
  g_autoptr (GString) a = g_string_new ("u,v\n");
  g_autoptr (GString) b = g_string_new ("u,v\n");
  g_autofree char *pa = NULL;
  g_autofree char *pb = NULL;
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_auto (cli_run) r = { 0 };
  JsonObject *o;

  for (int i = 0; i <= 24; i++)
    {
      g_string_append_printf (a, "1,%.17g\n", G_PI * i / 24);
      g_string_append_printf (b, "1,%.17g\n", -G_PI * i / 24);
    }
  pa = write_tmp ("a.csv", a->str);
  pb = write_tmp ("b.csv", b->str);
  run_cli (&r, "compare", "--preset", "sphere", "--path-a", pa, "--path-b", pb, "--json", NULL);
  g_assert_cmpint (r.status, ==, 0);
  o = parse_object (parser, r.out);
  df_assert_close (get_number (o, "angle_rad"), -2 * G_PI * (1 - cos (theta)), 0.0, 1e-7);
  df_assert_close (get_number (o, "angle_deg"), -360.0 * (1 - cos (theta)), 0.0, 1e-5);
}

/* On a plane, parallel transport does not depend on the route (flat: zero curvature, from
 * memory). */
static void
test_compare_plane (void)
{
  g_autofree char *pa = write_tmp ("a.csv", "u,v\n0,0\n20,0\n40,0\n60,10\n");
  g_autofree char *pb = write_tmp ("b.csv", "u,v\n0,0\n10,30\n40,40\n60,10\n");
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_auto (cli_run) r = { 0 };
  JsonObject *o;

  run_cli (&r, "compare", "--preset", "plane", "--path-a", pa, "--path-b", pb, "--json", NULL);
  g_assert_cmpint (r.status, ==, 0);
  o = parse_object (parser, r.out);
  df_assert_close (get_number (o, "angle_deg"), 0.0, 0.0, 1e-8);
}

/* A geodesic started along the equator of a sphere is the equator (a great circle, do Carmo
 * sec. 4-4, from memory): after a quarter of the circumference it is at phi = pi/2. */
static void
test_geodesic_sphere (void)
{
  g_autofree char *length = g_strdup_printf ("%.17g", 100.0 * G_PI / 2);
  g_autofree char *out = tmp_path ("geo.csv");
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_auto (cli_run) r = { 0 };
  JsonObject *o, *end;

  run_cli (&r, "geodesic", "--preset", "sphere", "--from", "1.5707963267948966,0", "--heading",
           "90", "--length", length, "--json", "--samples", out, NULL);
  g_assert_cmpint (r.status, ==, 0);
  o = parse_object (parser, r.out);
  g_assert_false (json_object_get_boolean_member (o, "stopped_early"));
  df_assert_close (get_number (o, "length"), 100.0 * G_PI / 2, 1e-9, 0.0);
  end = json_object_get_object_member (o, "end");
  df_assert_close (get_number (end, "u"), G_PI / 2, 0.0, 1e-7);
  df_assert_close (get_number (end, "v"), G_PI / 2, 0.0, 1e-7);
  g_assert_true (g_file_test (out, G_FILE_TEST_EXISTS));
}

/* Every loop of the demo project: where a loop bounds a disc, holonomy equals the enclosed
 * curvature (Gauss-Bonnet, do Carmo sec. 4-5, from memory); the summary CSV has one row per
 * loop after its header. */
static void
test_report_demo (void)
{
  g_autofree char *project = g_build_filename (DF_EXAMPLES_DIR, "demo.dfproj", NULL);
  g_autofree char *summary = tmp_path ("summary.csv");
  g_autofree char *csv = NULL;
  g_auto (GStrv) lines = NULL;
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_auto (cli_run) r = { 0 };
  JsonObject *o;
  JsonArray *loops;
  guint with_disc = 0;

  run_cli (&r, "report", "--project", project, "--json", "--summary", summary, NULL);
  g_assert_cmpint (r.status, ==, 0);
  o = parse_object (parser, r.out);
  loops = json_object_get_array_member (o, "loops");
  g_assert_cmpuint (json_array_get_length (loops), >=, 2);
  for (guint i = 0; i < json_array_get_length (loops); i++)
    {
      JsonObject *l = json_array_get_object_element (loops, i);

      get_number (l, "holonomy_rad");
      get_number (l, "length");
      if (json_object_get_boolean_member (l, "bounds_disc"))
        {
          with_disc++;
          df_assert_close (get_number (l, "holonomy_rad"),
                           get_number (l, "enclosed_curvature_rad"), 0.0, 1e-7);
        }
      else
        g_assert_true (json_object_get_null_member (l, "enclosed_curvature_rad"));
    }
  g_assert_cmpuint (with_disc, >=, 1);

  g_assert_true (g_file_get_contents (summary, &csv, NULL, NULL));
  lines = g_strsplit (csv, "\r\n", -1);
  g_assert_cmpuint (g_strv_length (lines), ==, json_array_get_length (loops) + 2);
  g_assert_true (g_str_has_prefix (lines[0], "name,status,surface,normal_side,holonomy_deg,"));
  g_assert_nonnull (strstr (lines[0], ",length_mm,"));
}

static void
test_report_bad (void)
{
  g_autofree char *project = write_tmp ("bad.dfproj",
                                        "[surface]\nkind=revolution\nr=R*sin(t)\n"
                                        "z=R*cos(t)\nt-min=0\nt-max=pi\n[parameters]\nR=10\n"
                                        "[loop 1]\nname=ok\nu=1;1;1\nv=0;2;4\n"
                                        "[loop 2]\nname=short\nu=1;1;1\nv=0;2\n");
  g_auto (cli_run) r = { 0 };

  run_cli (&r, "report", "--project", project, NULL);
  g_assert_cmpint (r.status, ==, 2);
  g_assert_cmpstr (r.out, ==, "");
  g_assert_nonnull (strstr (r.err, "bad.dfproj: [loop 2] u: 3 values but v has 2"));
  g_assert_true (strchr (r.err, '\n') == r.err + strlen (r.err) - 1);
}

static void
test_presets (void)
{
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_auto (cli_run) r = { 0 };
  g_auto (cli_run) text = { 0 };
  JsonObject *o;
  JsonArray *list;

  run_cli (&r, "presets", "--json", NULL);
  g_assert_cmpint (r.status, ==, 0);
  o = parse_object (parser, r.out);
  list = json_object_get_array_member (o, "presets");
  g_assert_cmpuint (json_array_get_length (list), >=, 12);
  for (guint i = 0; i < json_array_get_length (list); i++)
    {
      JsonObject *p = json_array_get_object_element (list, i);

      g_assert_nonnull (json_object_get_string_member (p, "name"));
      g_assert_cmpuint (json_array_get_length (json_object_get_array_member (p, "parameters")),
                        >=, 1);
    }
  run_cli (&text, "presets", NULL);
  g_assert_cmpint (text.status, ==, 0);
  g_assert_nonnull (strstr (text.out, "pseudosphere"));
}

static void
test_help (void)
{
  const char *commands[] = { "measure", "probe", "compare", "geodesic", "report", "presets" };
  g_auto (cli_run) top = { 0 };

  run_cli (&top, "--help", NULL);
  g_assert_cmpint (top.status, ==, 0);
  for (gsize i = 0; i < G_N_ELEMENTS (commands); i++)
    {
      g_auto (cli_run) r = { 0 };

      g_assert_nonnull (strstr (top.out, commands[i]));
      run_cli (&r, commands[i], "--help", NULL);
      g_assert_cmpint (r.status, ==, 0);
      g_assert_nonnull (strstr (r.out, "--json"));
    }
}

typedef struct
{
  const char *args[14];
  const char *needle;
} bad_run;

/* Bad input: exit status 2, nothing on stdout, exactly one line on stderr naming the place. */
static void
test_measure_steep_bump (void)
{
  /* Issue 6: on a bump of height 5 and width 0.5 a 200-point loop of radius 3 made `measure`
   * exit 2 ("an integrand along the path failed"). Now it exits 0 with the enclosed curvature,
   * its error estimate and the holonomy. Closed form for the radial graph: 2 pi (1 - 1 /
   * sqrt(1 + f'(3)^2)) with f'(3) = 60 exp(-18) (Gauss image area; do Carmo, from memory). */
  g_autofree char *surface = write_tmp ("bump.surface",
                                        "[surface]\nkind=graph\nz=5*exp(-(x^2+y^2)/(2*0.5^2))\n"
                                        "x-min=-10\nx-max=10\ny-min=-10\ny-max=10\n");
  g_autoptr (GString) text = g_string_new ("u,v\n");
  g_autofree char *loop = NULL;
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_auto (cli_run) r = { 0 };
  JsonObject *o;
  double slope = 60 * exp (-18.0), want = 2 * G_PI * (1 - 1 / sqrt (1 + slope * slope));

  for (int i = 0; i < 200; i++)
    {
      char a[G_ASCII_DTOSTR_BUF_SIZE], b[G_ASCII_DTOSTR_BUF_SIZE];

      g_string_append_printf (text, "%s,%s\n",
                              g_ascii_dtostr (a, sizeof a, 3 * cos (2 * G_PI * i / 200)),
                              g_ascii_dtostr (b, sizeof b, 3 * sin (2 * G_PI * i / 200)));
    }
  loop = write_tmp ("bump-loop.csv", text->str);
  run_cli (&r, "measure", "--surface", surface, "--loop", loop, "--json", NULL);
  g_assert_cmpint (r.status, ==, 0);
  o = parse_object (parser, r.out);
  df_assert_close (get_number (o, "enclosed_curvature_rad"), want, 0.0, 1e-9);
  g_assert_cmpfloat (get_number (o, "enclosed_curvature_error_rad"), <, 1e-8);
  df_assert_close (get_number (o, "holonomy_rad"), want, 0.0, 1e-9);
}

static void
test_bad_input (void)
{
  g_autofree char *loop = write_latitude ("ok.csv", 1.0);
  g_autofree char *bad_csv = write_tmp ("loop.csv", "u,v\n1,0\n1,1,2\n1,2\n");
  g_autofree char *off = write_tmp ("off.csv", "x,y,z\n100,0,0\n0,100,0\n0,0,130\n");
  g_autofree char *bad_surface = write_tmp ("lamp.surface",
                                            "[surface]\nkind=revolution\nr=60 + * t\nz=-t\n"
                                            "t-min=0\nt-max=100\n");
  g_autofree char *missing = tmp_path ("missing.csv");
  const bad_run cases[] = {
    { { "measure", "--preset", "sphere", NULL }, "--loop is required" },
    { { "measure", "--preset", "sphere", "--loop", missing, NULL }, "missing.csv" },
    { { "measure", "--preset", "sphere", "--loop", bad_csv, NULL },
      "loop.csv:3: expected 2 numbers, found 3" },
    { { "measure", "--preset", "sphere", "--loop", off, NULL }, "off.csv:4: point" },
    { { "measure", "--surface", bad_surface, "--loop", loop, NULL },
      "lamp.surface: [surface] r: column 6" },
    { { "measure", "--preset", "sphear", "--loop", loop, NULL }, "unknown preset 'sphear'" },
    { { "measure", "--preset", "sphere", "--param", "Q=2", "--loop", loop, NULL },
      "--param Q=2: unknown parameter 'Q'" },
    { { "measure", "--preset", "sphere", "--param", "R=-", "--loop", loop, NULL },
      "--param R=-: R: column" },
    { { "measure", "--surface", bad_surface, "--preset", "sphere", "--loop", loop, NULL },
      "not both" },
    { { "measure", "--loop", loop, NULL }, "no surface" },
    { { "measure", "--preset", "sphere", "--loop", loop, "extra", NULL }, "'extra'" },
    { { "probe", "--preset", "sphere", "--at", "5,0", NULL }, "--at: point (5, 0) lies outside" },
    { { "probe", "--preset", "sphere", "--at", "abc", NULL }, "--at: expected two numbers" },
    { { "probe", "--preset", "sphere", "--at", "1,nan", NULL }, "--at: 'nan' is not a finite" },
    { { "probe", "--preset", "sphere", "--bogus", NULL }, "--bogus" },
    { { "bend", NULL }, "unknown command 'bend'" },
    /* Issue 6: --count has a stated cap (DF_CLI_MAX_COUNT, in --help and the README). */
    { { "measure", "--preset", "sphere", "--loop", loop, "--count", "100001", NULL },
      "--count: 100001 is above the cap of 100000 samples" },
    { { "geodesic", "--preset", "sphere", "--from", "1,0", "--heading", "0", "--length", "10",
        "--count", "200000", NULL }, "--count: 200000 is above the cap of 100000 samples" },
    { { "geodesic", "--preset", "sphere", "--from", "1,0", "--heading", "0", "--length", "-5",
        NULL }, "--length: must be positive" },
    { { "geodesic", "--preset", "sphere", "--from", "1,0", "--heading", "north", "--length",
        "5", NULL }, "--heading: 'north' is not a number" },
    { { "compare", "--preset", "sphere", "--path-a", loop, NULL }, "--path-b is required" },
    { { NULL }, "COMMAND" },
  };

  for (gsize i = 0; i < G_N_ELEMENTS (cases); i++)
    {
      const char *const *a = cases[i].args;
      g_auto (cli_run) r = { 0 };
      const char *nl;

      g_test_message ("case %zu", i);
      run_cli (&r, a[0], a[1], a[2], a[3], a[4], a[5], a[6], a[7], a[8], a[9], a[10], a[11],
               a[12], NULL);
      g_assert_cmpint (r.status, ==, 2);
      g_assert_cmpstr (r.out, ==, "");
      g_assert_nonnull (strstr (r.err, cases[i].needle));
      g_assert_null (strstr (r.err, "nan\n"));
      if (a[0] == NULL)
        continue;   /* the bare usage text may have several lines */
      nl = strchr (r.err, '\n');
      g_assert_nonnull (nl);
      g_assert_cmpint (nl[1], ==, '\0');
    }
}

/* An output file that cannot be written: exit 1, one line, and no partial file. */
static void
test_output_failure (void)
{
  g_autofree char *loop = write_latitude ("ok.csv", 1.0);
  g_auto (cli_run) r = { 0 };

  run_cli (&r, "measure", "--preset", "sphere", "--loop", loop, "--samples",
           "/nonexistent-dir/s.csv", NULL);
  g_assert_cmpint (r.status, ==, 1);
  g_assert_nonnull (strstr (r.err, "s.csv"));
  g_assert_true (strchr (r.err, '\n') == r.err + strlen (r.err) - 1);
  g_assert_false (g_file_test ("/nonexistent-dir/s.csv", G_FILE_TEST_EXISTS));
}

/* measure --fair: the JSON says which fairing was used and its deviation ("none" without);
 * 48 exact points of a latitude circle, faired, still enclose 2 pi (1 - cos theta)
 * (Gauss-Bonnet, do Carmo sec. 4-5, from memory); a tolerance that is not a positive length
 * is refused. */
static void
test_measure_fair (void)
{
  const double theta = 0.9;
  g_autofree char *loop = write_latitude ("latitude-fair.csv", theta);
  g_autoptr (JsonParser) parser = json_parser_new ();
  JsonObject *o, *f;

  {
    g_auto (cli_run) r = { 0 };

    run_cli (&r, "measure", "--preset", "sphere", "--param", "R=50", "--loop", loop, "--json",
             NULL);
    g_assert_cmpint (r.status, ==, 0);
    o = parse_object (parser, r.out);
    f = json_object_get_object_member (o, "fairing");
    g_assert_nonnull (f);
    g_assert_cmpstr (json_object_get_string_member (f, "method"), ==, "none");
    g_assert_true (json_object_get_null_member (f, "tolerance"));
    df_assert_close (get_number (f, "max_deviation"), 0.0, 0.0, 0.0);
    df_assert_close (get_number (f, "points"), 48.0, 0.0, 0.0);
  }
  {
    g_auto (cli_run) r = { 0 };

    run_cli (&r, "measure", "--preset", "sphere", "--param", "R=50", "--loop", loop, "--json",
             "--fair", "0.05", NULL);
    g_assert_cmpint (r.status, ==, 0);
    o = parse_object (parser, r.out);
    f = json_object_get_object_member (o, "fairing");
    g_assert_nonnull (f);
    g_assert_nonnull (strstr (json_object_get_string_member (f, "method"), "smoothing spline"));
    df_assert_close (get_number (f, "tolerance"), 0.05, 0.0, 1e-15);
    g_assert_cmpfloat (get_number (f, "max_deviation"), <=, 0.05);
    g_assert_true (json_object_get_boolean_member (f, "within_tolerance"));
    df_assert_close (get_number (o, "holonomy_rad"), 2 * G_PI * (1 - cos (theta)), 0.0, 1e-6);
  }
  {
    g_auto (cli_run) r = { 0 };

    run_cli (&r, "measure", "--preset", "sphere", "--param", "R=50", "--loop", loop, "--fair",
             "0.05", NULL);
    g_assert_cmpint (r.status, ==, 0);
    g_assert_nonnull (strstr (r.out, "Fairing: periodic cubic smoothing spline"));
    g_assert_nonnull (strstr (r.out, "largest deviation from the points"));
  }
  {
    g_auto (cli_run) r = { 0 };

    run_cli (&r, "measure", "--preset", "sphere", "--param", "R=50", "--loop", loop, "--fair",
             "0", NULL);
    g_assert_cmpint (r.status, ==, 2);
    g_assert_nonnull (strstr (r.err, "--fair"));
  }
}

int
main (int argc, char **argv)
{
  static const char *const written[] = { "latitude.csv", "samples.csv", "a.csv", "b.csv",
                                         "geo.csv", "ok.csv", "loop.csv", "off.csv",
                                         "lamp.surface", "summary.csv", "bad.dfproj" };
  int status;

  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);

  g_test_add_func ("/cli/measure/sphere-latitude", test_measure_sphere);
  g_test_add_func ("/cli/measure/units", test_measure_units);
  g_test_add_func ("/cli/geodesic/units", test_geodesic_units);
  g_test_add_func ("/cli/compare/units", test_compare_units);
  g_test_add_func ("/cli/probe/units", test_probe_units);
  g_test_add_func ("/cli/report/units", test_report_units);
  g_test_add_func ("/cli/fit-in-probe-and-report", test_fit_in_probe_and_report);
  g_test_add_func ("/cli/measure/text", test_measure_text);
  g_test_add_func ("/cli/measure/examples", test_measure_examples);
  g_test_add_func ("/cli/measure/fair", test_measure_fair);
  g_test_add_func ("/cli/measure/data", test_measure_data);
  g_test_add_func ("/cli/measure/steep-bump", test_measure_steep_bump);
  g_test_add_func ("/cli/probe/sphere", test_probe_sphere);
  g_test_add_func ("/cli/probe/pole", test_probe_pole);
  g_test_add_func ("/cli/probe/apex-and-overflow", test_probe_apex_and_overflow);
  g_test_add_func ("/cli/probe/saddle", test_probe_saddle);
  g_test_add_func ("/cli/compare/sphere", test_compare_sphere);
  g_test_add_func ("/cli/compare/plane", test_compare_plane);
  g_test_add_func ("/cli/geodesic/sphere", test_geodesic_sphere);
  g_test_add_func ("/cli/report/demo", test_report_demo);
  g_test_add_func ("/cli/report/bad", test_report_bad);
  g_test_add_func ("/cli/presets", test_presets);
  g_test_add_func ("/cli/help", test_help);
  g_test_add_func ("/cli/bad-input", test_bad_input);
  g_test_add_func ("/cli/output-failure", test_output_failure);

  tmp_dir = g_dir_make_tmp ("df-test-cli-XXXXXX", NULL);
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
