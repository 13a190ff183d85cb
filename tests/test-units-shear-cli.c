/* test-units-shear-cli.c: runs the built driftframe-cli (DF_CLI_PATH) on what issue 9 left for
 * the core and the CLI: Gaussian curvature in its own unit (--curvature-units on probe and
 * measure, [units] curvature= in report's text, JSON, summary CSV and PDF), the PDF's verdict
 * lines in the display units, and max-shear-deg checked by a drape of each loop (exit 3 past
 * the locking angle, 0 within; the per-loop drape keys read, refused when bad and saved).
 * References outside the project: K = 1/R^2 and |H| = 1/R on a sphere, 1 m = 1000 mm and
 * 1 in = 25.4 mm (by definition), a developable surface drapes without shear (from memory),
 * and `drape` itself for the sphere's shear (the same core: the two must agree). */
#include <math.h>
#include <string.h>

#include <glib/gstdio.h>
#include <json-glib/json-glib.h>

#include "df-glib.h"
#include "df-test.h"

#include "df-test-cli.h"

#define SPHERE_R 100.0

/* A closed chart ellipse of n points round (cu, cv) with half-axes a, b: "u=...\nv=...\n" for a
 * project's [loop N] (';' lists, "%.17g" so that a CSV of the same points is bit for bit the
 * same loop), and optionally that CSV. */
static char *
ellipse_keys (double cu, double cv, double a, double b, int n, GString *csv)
{
  g_autoptr (GString) u = g_string_new ("u=");
  g_autoptr (GString) v = g_string_new ("v=");
  char bu[G_ASCII_DTOSTR_BUF_SIZE], bv[G_ASCII_DTOSTR_BUF_SIZE];

  for (int i = 0; i < n; i++)
    {
      double t = 2 * G_PI * i / n;

      g_ascii_dtostr (bu, sizeof bu, cu + a * cos (t));
      g_ascii_dtostr (bv, sizeof bv, cv + b * sin (t));
      g_string_append_printf (u, "%s%s", i ? ";" : "", bu);
      g_string_append_printf (v, "%s%s", i ? ";" : "", bv);
      if (csv != NULL)
        g_string_append_printf (csv, "%s,%s\n", bu, bv);
    }
  return g_strdup_printf ("%s\n%s\n", u->str, v->str);
}

/* The sphere of radius R (chart t = polar angle) with one ply round the equator at phi = 0,
 * extra text in [limits] and after the loop's points. */
static char *
sphere_project (const char *name, const char *limits, const char *units, const char *loop_extra,
                char **csv_path)
{
  g_autoptr (GString) csv = g_string_new ("u,v\n");
  g_autofree char *keys = ellipse_keys (1.5, 0.0, 0.3, 0.35, 48, csv);
  g_autofree char *text = g_strdup_printf (
    "[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\nt-max=pi\nunits=mm\n"
    "[parameters]\nR=%g\n[limits]\n%s%s[loop 1]\nname=Cap ply\n%s%s", SPHERE_R, limits,
    units != NULL ? units : "", keys, loop_extra != NULL ? loop_extra : "");
  g_autofree char *csv_name = g_strconcat (name, ".csv", NULL);

  if (csv_path != NULL)
    *csv_path = write_tmp (csv_name, csv->str);
  return write_tmp (name, text);
}

/* The verdict of limit `limit` in check's JSON (asserts there is one). */
static JsonObject *
find_verdict (JsonObject *root, const char *limit)
{
  JsonArray *verdicts = json_object_get_array_member (root, "verdicts");

  for (guint i = 0; i < json_array_get_length (verdicts); i++)
    {
      JsonObject *v = json_array_get_object_element (verdicts, i);

      if (g_str_equal (json_object_get_string_member (v, "limit"), limit))
        return v;
    }
  g_assert_not_reached ();
  return NULL;
}

/* probe --units mm --curvature-units m on a sphere of R = 100 mm: K = 1/R^2 = 1e-4 1/mm^2 =
 * 100 1/m^2, principal curvatures 1/R = 10 1/m in magnitude (do Carmo sec. 3-2, from memory;
 * 1 m = 1000 mm), the point still in mm. */
static void
test_probe_curvature_units (void)
{
  g_auto (cli_run) r = { 0 };
  g_auto (cli_run) text = { 0 };
  g_auto (cli_run) bad = { 0 };
  g_autoptr (JsonParser) parser = json_parser_new ();
  JsonObject *o;
  JsonArray *k;
  double R_m = SPHERE_R / 1000.0;

  run_cli (&r, "probe", "--preset", "sphere", "--param", "R=100", "--at", "1.0,0.5", "--units",
           "mm", "--curvature-units", "m", "--json", NULL);
  g_assert_cmpint (r.status, ==, 0);
  o = parse_object (parser, r.out);
  g_assert_cmpstr (json_object_get_string_member (o, "units"), ==, "mm");
  g_assert_cmpstr (json_object_get_string_member (o, "curvature_units"), ==, "1/m^2");
  g_assert_cmpstr (json_object_get_string_member (o, "mean_curvature_units"), ==, "1/m");
  df_assert_close (json_object_get_double_member (o, "gaussian_curvature"), 1 / (R_m * R_m),
                   1e-9, 0.0);
  k = json_object_get_array_member (o, "principal_curvatures");
  df_assert_close (fabs (json_array_get_double_element (k, 0)), 1 / R_m, 1e-9, 0.0);
  df_assert_close (fabs (json_array_get_double_element (k, 1)), 1 / R_m, 1e-9, 0.0);
  /* The point stays in mm: on the sphere, |X| = R. */
  {
    JsonArray *p = json_object_get_array_member (o, "point");
    double x = json_array_get_double_element (p, 0), y = json_array_get_double_element (p, 1),
           z = json_array_get_double_element (p, 2);

    df_assert_close (sqrt (x * x + y * y + z * z), SPHERE_R, 1e-12, 0.0);
  }
  run_cli (&text, "probe", "--preset", "sphere", "--param", "R=100", "--at", "1.0,0.5",
           "--curvature-units", "m", NULL);
  g_assert_cmpint (text.status, ==, 0);
  g_assert_nonnull (strstr (text.out, "Gaussian curvature K:  100 1/m^2"));
  run_cli (&bad, "probe", "--preset", "sphere", "--at", "1.0,0.5", "--curvature-units", "ft",
           NULL);
  g_assert_cmpint (bad.status, ==, 2);
  g_assert_nonnull (strstr (bad.err, "--curvature-units: unknown unit 'ft'"));
}

/* measure --curvature-units m: the disc's mean K (enclosed curvature / area) is 1/R^2 on a
 * sphere, 100 1/m^2 for R = 100 mm, while the lengths stay in mm. */
static void
test_measure_curvature_units (void)
{
  g_autofree char *csv_path = NULL;
  g_autofree char *proj = sphere_project ("measure.dfproj", "", NULL, NULL, &csv_path);
  g_auto (cli_run) r = { 0 };
  g_auto (cli_run) mm = { 0 };
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_autoptr (JsonParser) parser2 = json_parser_new ();
  JsonObject *o, *o2;

  run_cli (&r, "measure", "--surface", proj, "--loop", csv_path, "--curvature-units", "m",
           "--json", NULL);
  g_assert_cmpint (r.status, ==, 0);
  o = parse_object (parser, r.out);
  g_assert_cmpstr (json_object_get_string_member (o, "units"), ==, "mm");
  g_assert_cmpstr (json_object_get_string_member (o, "curvature_units"), ==, "1/m^2");
  df_assert_close (json_object_get_double_member (o, "mean_gaussian_curvature"),
                   1e6 / (SPHERE_R * SPHERE_R), 1e-8, 0.0);
  run_cli (&mm, "measure", "--surface", proj, "--loop", csv_path, "--json", NULL);
  o2 = parse_object (parser2, mm.out);
  g_assert_cmpstr (json_object_get_string_member (o2, "curvature_units"), ==, "1/mm^2");
  df_assert_close (json_object_get_double_member (o2, "mean_gaussian_curvature"),
                   1 / (SPHERE_R * SPHERE_R), 1e-8, 0.0);
  /* Lengths are the same in both runs: only K changed unit. */
  df_assert_close (json_object_get_double_member (o, "length"),
                   json_object_get_double_member (o2, "length"), 0.0, 0.0);
}

static char *
pdf_text (const char *pdf)
{
  const char *argv[] = { "pdftotext", "-layout", pdf, "-", NULL };
  g_autoptr (GError) error = NULL;
  char *out = NULL;
  int status = 0;

  g_assert_true (g_spawn_sync (NULL, (char **) argv, NULL, G_SPAWN_SEARCH_PATH, NULL, NULL,
                               &out, NULL, &status, &error));
  g_assert_no_error (error);
  g_assert_true (g_spawn_check_wait_status (status, NULL));
  return out;
}

/* report with [units] length=in, curvature=1/m^2: JSON curvature_units and mean K 100 1/m^2
 * (1/R^2, R = 100 mm), the summary CSV's mean_K_per_m2 column, and the PDF: mean K and the
 * picture's legend in 1/m^2 and the verdict lines in inches (1 in = 25.4 mm), the figures `check` gives. */
static void
test_report_units (void)
{
  g_autofree char *proj = sphere_project ("report.dfproj",
                                          "min-steering-radius=1 in\n"
                                          "min-steering-radius-source=test\n",
                                          "[units]\nlength=in\ncurvature=1/m^2\n", NULL, NULL);
  g_autofree char *csv = tmp_path ("report-summary.csv");
  g_autofree char *pdf = tmp_path ("report.pdf");
  g_autofree char *csv_text = NULL;
  g_autofree char *pdf_words = NULL;
  g_autofree char *pdftotext = g_find_program_in_path ("pdftotext");
  g_auto (GStrv) lines = NULL;
  g_auto (cli_run) r = { 0 };
  g_auto (cli_run) j = { 0 };
  g_auto (cli_run) c = { 0 };
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_autoptr (JsonParser) cparser = json_parser_new ();
  JsonObject *o, *loop, *steer;
  double radius_in;

  run_cli (&j, "report", "--project", proj, "--json", NULL);
  g_assert_cmpint (j.status, ==, 0);
  o = parse_object (parser, j.out);
  g_assert_cmpstr (json_object_get_string_member (o, "units"), ==, "in");
  g_assert_cmpstr (json_object_get_string_member (o, "curvature_units"), ==, "1/m^2");
  loop = json_array_get_object_element (json_object_get_array_member (o, "loops"), 0);
  df_assert_close (json_object_get_double_member (loop, "mean_gaussian_curvature"),
                   1e6 / (SPHERE_R * SPHERE_R), 1e-8, 0.0);

  run_cli (&r, "report", "--project", proj, "--summary", csv, NULL);
  g_assert_cmpint (r.status, ==, 0);
  g_assert_nonnull (strstr (r.out, "mean K (enclosed curvature / disc area) in 1/m^2"));
  g_assert_true (g_file_get_contents (csv, &csv_text, NULL, NULL));
  lines = g_strsplit (csv_text, "\n", -1);
  g_assert_true (g_str_has_suffix (g_strchomp (lines[0]), ",note,mean_K_per_m2"));
  {
    const char *last = strrchr (g_strchomp (lines[1]), ',');

    g_assert_nonnull (last);
    df_assert_close (g_ascii_strtod (last + 1, NULL), 1e6 / (SPHERE_R * SPHERE_R), 1e-8, 0.0);
  }

  /* The steering verdict as check gives it, in inches. */
  run_cli (&c, "check", "--project", proj, "--json", NULL);
  steer = find_verdict (parse_object (cparser, c.out), "min-steering-radius");
  g_assert_cmpstr (json_object_get_string_member (steer, "units"), ==, "in");
  radius_in = json_object_get_double_member (steer, "value");
  df_assert_close (json_object_get_double_member (steer, "threshold"), 1.0, 1e-15, 0.0);

  if (pdftotext == NULL)
    {
      g_test_skip ("needs pdftotext (Debian: apt install poppler-utils)");
      return;
    }
  {
    g_auto (cli_run) p = { 0 };
    g_autofree char *want = NULL;
    char *flat;

    run_cli (&p, "report", "--project", proj, "--pdf", pdf, NULL);
    g_assert_cmpint (p.status, ==, 0);
    pdf_words = pdf_text (pdf);
    /* pdftotext breaks lines where the paragraph wraps: join them. */
    for (flat = pdf_words; *flat; flat++)
      if (*flat == '\n')
        *flat = ' ';
    g_test_message ("%s", pdf_words);
    g_assert_nonnull (strstr (pdf_words, "curvature K in 1/m\xc2\xb2"));
    g_assert_nonnull (strstr (pdf_words, "100 1/m\xc2\xb2 (enclosed curvature / area)"));
    /* The picture's K legend too (the sphere's K is 1/R^2 = 100 1/m^2 everywhere). */
    g_assert_nonnull (strstr (pdf_words, "Gaussian curvature K, 1/m\xc2\xb2"));
    want = g_strdup_printf ("Steering radius: within \xe2\x80\x94 worst %.5g in against the "
                            "limit 1 in", radius_in);
    g_assert_nonnull (strstr (pdf_words, want));
    /* Nothing of the verdicts left in the surface's mm: 1 in reads 25.4 mm there. */
    g_assert_null (strstr (pdf_words, "against the limit 25.4 mm"));
  }
}

/* A cylinder is developable: a woven ply drapes onto it without shear (from memory), so the
 * worst cell shear is 0 to rounding, within even a locking angle of 1e-3 deg, from a warp of
 * 30 deg given in the loop's own key; exit 0. */
static void
test_shear_developable (void)
{
  g_autofree char *keys = ellipse_keys (100.0, 0.0, 30.0, 0.5, 48, NULL);
  g_autofree char *text = g_strdup_printf ("[surface]\nkind=revolution\nr=50\nz=-t\nt-min=0\n"
                                           "t-max=200\nunits=mm\n[limits]\nmax-shear-deg=0.001\n"
                                           "max-shear-deg-source=test\n[loop 1]\nname=Oval\n%s"
                                           "drape-warp-deg=30\n", keys);
  g_autofree char *proj = write_tmp ("cylinder.dfproj", text);
  g_auto (cli_run) r = { 0 };
  g_autoptr (JsonParser) parser = json_parser_new ();
  JsonObject *v, *drape;

  run_cli (&r, "check", "--project", proj, "--json", NULL);
  g_assert_cmpint (r.status, ==, 0);
  v = find_verdict (parse_object (parser, r.out), "max-shear-deg");
  g_assert_true (json_object_get_boolean_member (v, "within"));
  g_assert_true (json_object_get_boolean_member (v, "region"));
  g_assert_true (json_object_get_null_member (v, "where"));
  g_assert_cmpstr (json_object_get_string_member (v, "units"), ==, "deg");
  g_assert_cmpfloat (fabs (json_object_get_double_member (v, "value")), <, 1e-9);
  g_assert_cmpint (json_object_get_int_member (v, "cells"), >, 20);
  g_assert_cmpint (json_object_get_int_member (v, "cells_over_limit"), ==, 0);
  drape = json_object_get_object_member (v, "drape");
  df_assert_close (json_object_get_double_member (drape, "warp_deg"), 30.0, 0.0, 0.0);
  g_assert_false (json_object_get_boolean_member (drape, "warp_default"));
  g_assert_true (json_object_get_boolean_member (drape, "cell_default"));
}

/* On a sphere the ply shears: check's worst cell shear, cell counts and cells past the limit
 * are what `drape --json` gives on the same loop, start, warp and cell (the same core); exit 3
 * at a locking angle below it, 0 at one above it. */
static void
test_shear_sphere (void)
{
  g_autofree char *csv_path = NULL;
  g_autofree char *tight = sphere_project ("tight.dfproj", "max-shear-deg=0.5\n"
                                           "max-shear-deg-source=test\n", NULL, NULL, &csv_path);
  g_autofree char *loose = sphere_project ("loose.dfproj", "max-shear-deg=60\n"
                                           "max-shear-deg-source=test\n", NULL, NULL, NULL);
  g_auto (cli_run) r = { 0 };
  g_auto (cli_run) ok = { 0 };
  g_auto (cli_run) d = { 0 };
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_autoptr (JsonParser) dparser = json_parser_new ();
  g_autoptr (JsonParser) okparser = json_parser_new ();
  JsonObject *v, *drape, *dj;
  JsonArray *start;
  char start_text[2 * G_ASCII_DTOSTR_BUF_SIZE + 2], a[G_ASCII_DTOSTR_BUF_SIZE],
    b[G_ASCII_DTOSTR_BUF_SIZE], cell[G_ASCII_DTOSTR_BUF_SIZE];
  double shear;

  run_cli (&r, "check", "--project", tight, "--json", NULL);
  g_assert_cmpint (r.status, ==, 3);
  v = find_verdict (parse_object (parser, r.out), "max-shear-deg");
  g_assert_false (json_object_get_boolean_member (v, "within"));
  shear = json_object_get_double_member (v, "value");
  g_assert_cmpfloat (shear, >, 0.5);
  g_assert_cmpint (json_object_get_int_member (v, "cells_over_limit"), >, 0);
  drape = json_object_get_object_member (v, "drape");
  g_assert_cmpstr (json_object_get_string_member (drape, "start_default"), ==,
                   "chart centroid");
  start = json_object_get_array_member (drape, "start");
  /* The chart centroid of an ellipse is its centre. */
  df_assert_close (json_array_get_double_element (start, 0), 1.5, 1e-6, 0.0);
  g_snprintf (start_text, sizeof start_text, "%s,%s",
              g_ascii_dtostr (a, sizeof a, json_array_get_double_element (start, 0)),
              g_ascii_dtostr (b, sizeof b, json_array_get_double_element (start, 1)));
  g_ascii_dtostr (cell, sizeof cell, json_object_get_double_member (drape, "cell"));
  run_cli (&d, "drape", "--project", tight, "--loop", csv_path, "--start", start_text,
           "--warp-deg", "0", "--cell", cell, "--json", NULL);
  g_assert_cmpint (d.status, ==, 0);
  dj = parse_object (dparser, d.out);
  df_assert_close (fabs (json_object_get_double_member (dj, "max_cell_shear_deg")), shear, 1e-12,
                   0.0);
  g_assert_cmpint (json_object_get_int_member (dj, "cells"), ==,
                   json_object_get_int_member (v, "cells"));
  g_assert_cmpint (json_object_get_int_member (dj, "cells_over_limit"), ==,
                   json_object_get_int_member (v, "cells_over_limit"));

  run_cli (&ok, "check", "--project", loose, "--json", NULL);
  g_assert_cmpint (ok.status, ==, 0);
  v = find_verdict (parse_object (okparser, ok.out), "max-shear-deg");
  g_assert_true (json_object_get_boolean_member (v, "within"));
  df_assert_close (json_object_get_double_member (v, "value"), shear, 1e-12, 0.0);
  g_assert_cmpint (json_object_get_int_member (v, "cells_over_limit"), ==, 0);
}

/* The loop's drape keys: a start given is used; bad values end with exit 2 naming the file,
 * the group and the key; a project saved keeps them (df_project_save). */
static void
test_shear_keys (void)
{
  g_autofree char *given = sphere_project ("given.dfproj", "max-shear-deg=60\n", NULL,
                                           "drape-start=1.45;0.05\ndrape-warp-deg=15\n"
                                           "drape-cell=5\n", NULL);
  g_autofree char *bad_cell = sphere_project ("bad-cell.dfproj", "max-shear-deg=60\n", NULL,
                                              "drape-cell=-2\n", NULL);
  g_autofree char *bad_start = sphere_project ("bad-start.dfproj", "max-shear-deg=60\n", NULL,
                                               "drape-start=1.5\n", NULL);
  g_autofree char *outside = sphere_project ("outside.dfproj", "max-shear-deg=60\n", NULL,
                                             "drape-start=2.5;1.0\n", NULL);
  g_autofree char *saved = tmp_path ("saved.dfproj");
  g_auto (cli_run) r = { 0 };
  g_auto (cli_run) e1 = { 0 };
  g_auto (cli_run) e2 = { 0 };
  g_auto (cli_run) e3 = { 0 };
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_autoptr (GError) error = NULL;
  g_autoptr (df_project) project = NULL;
  g_autoptr (df_project) again = NULL;
  JsonObject *drape;

  run_cli (&r, "check", "--project", given, "--json", NULL);
  g_assert_cmpint (r.status, ==, 0);
  drape = json_object_get_object_member (find_verdict (parse_object (parser, r.out),
                                                       "max-shear-deg"), "drape");
  g_assert_cmpstr (json_object_get_string_member (drape, "start_default"), ==, "given");
  df_assert_close (json_array_get_double_element (json_object_get_array_member (drape, "start"),
                                                  0), 1.45, 0.0, 0.0);
  df_assert_close (json_object_get_double_member (drape, "warp_deg"), 15.0, 0.0, 0.0);
  df_assert_close (json_object_get_double_member (drape, "cell"), 5.0, 0.0, 0.0);

  run_cli (&e1, "check", "--project", bad_cell, NULL);
  g_assert_cmpint (e1.status, ==, 2);
  g_assert_nonnull (strstr (e1.err, "bad-cell.dfproj: [loop 1] drape-cell"));
  run_cli (&e2, "check", "--project", bad_start, NULL);
  g_assert_cmpint (e2.status, ==, 2);
  g_assert_nonnull (strstr (e2.err, "[loop 1] drape-start: expected two numbers"));
  /* A start the user gave outside the ply is bad input, not a silent skip. */
  run_cli (&e3, "check", "--project", outside, NULL);
  g_assert_cmpint (e3.status, ==, 2);
  g_assert_nonnull (strstr (e3.err, "outside.dfproj: [loop 1] 'Cap ply': max-shear-deg"));

  project = df_project_load (given, &error);
  g_assert_no_error (error);
  g_assert_true (df_project_save (project, saved, &error));
  g_assert_no_error (error);
  again = df_project_load (saved, &error);
  g_assert_no_error (error);
  {
    const df_project_loop *a = g_ptr_array_index (project->loops, 0);
    const df_project_loop *b = g_ptr_array_index (again->loops, 0);

    g_assert_true (b->drape.has_start && b->drape.has_warp && b->drape.has_cell);
    g_assert_cmpmem (&a->drape, sizeof a->drape, &b->drape, sizeof b->drape);
  }
}

int
main (int argc, char **argv)
{
  int code;

  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);
  tmp_dir = g_dir_make_tmp ("df-units-shear-XXXXXX", NULL);
  g_test_add_func ("/units-shear/probe-curvature-units", test_probe_curvature_units);
  g_test_add_func ("/units-shear/measure-curvature-units", test_measure_curvature_units);
  g_test_add_func ("/units-shear/report-units", test_report_units);
  g_test_add_func ("/units-shear/shear-developable", test_shear_developable);
  g_test_add_func ("/units-shear/shear-sphere", test_shear_sphere);
  g_test_add_func ("/units-shear/shear-keys", test_shear_keys);
  code = g_test_run ();
  df_test_remove_dir (tmp_dir);
  g_free (tmp_dir);
  return code;
}
