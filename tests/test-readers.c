/* test-readers.c: the readers: surface key files (and presets), loop CSV and project files.
 * Malformed input must fail with the right error code and a message naming the file and the
 * line, group or key; well-formed input must round-trip exactly. */
#include <math.h>
#include <string.h>

#include <glib/gstdio.h>

#include "df-glib.h"
#include "df-test.h"

/* A directory of this process's own, so parallel test runs never share a file. */
static char *tmp_dir;

static char *
tmp_path (const char *name)
{
  return g_build_filename (tmp_dir, name, NULL);
}

/* Writes text to a file in the temporary directory and returns its path. */
static char *
write_tmp (const char *name, const char *text)
{
  g_autoptr (GError) error = NULL;
  char *path = tmp_path (name);

  g_file_set_contents (path, text, -1, &error);
  g_assert_no_error (error);
  return path;
}

/* Asserts error has the domain and code, and its message contains every needle. */
static void
assert_error_names (const GError *error, int code, const char *needle1, const char *needle2)
{
  g_assert_nonnull (error);
  g_test_message ("message: %s", error->message);
  g_assert_true (error->domain == DF_IO_ERROR);
  g_assert_cmpint (error->code, ==, code);
  if (needle1 != NULL)
    g_assert_nonnull (strstr (error->message, needle1));
  if (needle2 != NULL)
    g_assert_nonnull (strstr (error->message, needle2));
  g_assert_null (strchr (error->message, '\n'));
}

static df_surface *
build_preset (const char *name)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface_spec) spec = df_surface_spec_new_preset (name, &error);
  df_surface *surface;

  g_assert_no_error (error);
  surface = df_surface_spec_build (spec, &error);
  g_assert_no_error (error);
  g_assert_nonnull (surface);
  return surface;
}

/* ---- surface key files ---- */

static void
test_spec_round_trip (void)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface_spec) spec = df_surface_spec_new_preset ("dome", &error);
  g_autoptr (df_surface_spec) back = NULL;
  g_autoptr (df_surface) s1 = NULL;
  g_autoptr (df_surface) s2 = NULL;
  g_autofree char *path = tmp_path ("dome.surface");
  df_chart_jet j1, j2;

  g_assert_no_error (error);
  g_assert_true (df_surface_spec_set_param (spec, "span", "2*150 + 20", &error));
  g_assert_no_error (error);
  g_free (spec->units);
  spec->units = g_strdup ("cm");
  g_assert_true (df_surface_spec_save (spec, path, &error));
  g_assert_no_error (error);

  back = df_surface_spec_load (path, &error);
  g_assert_no_error (error);
  g_assert_cmpint (back->kind, ==, spec->kind);
  g_assert_cmpstr (back->preset, ==, "dome");
  g_assert_cmpstr (back->r_text, ==, spec->r_text);
  g_assert_cmpstr (back->z_text, ==, spec->z_text);
  g_assert_cmpstr (back->range_text[0], ==, spec->range_text[0]);
  g_assert_cmpstr (back->range_text[1], ==, spec->range_text[1]);
  g_assert_cmpstr (back->units, ==, "cm");
  g_assert_cmpuint (df_params_count (back->params), ==, df_params_count (spec->params));
  for (guint i = 0; i < df_params_count (spec->params); i++)
    {
      g_assert_cmpstr (df_params_name (back->params, i), ==, df_params_name (spec->params, i));
      g_assert_cmpstr (df_params_text (back->params, i), ==, df_params_text (spec->params, i));
      g_assert_true (df_params_value (back->params, i) == df_params_value (spec->params, i));
    }

  /* Same text must give the same surface, bit for bit. */
  s1 = df_surface_spec_build (spec, &error);
  g_assert_no_error (error);
  s2 = df_surface_spec_build (back, &error);
  g_assert_no_error (error);
  g_assert_true (df_surface_eval (s1, 0.3, 0.7, 1, &j1, NULL) == DF_OK);
  g_assert_true (df_surface_eval (s2, 0.3, 0.7, 1, &j2, NULL) == DF_OK);
  for (int k = 0; k < 3; k++)
    g_assert_true (j1.x[k] == j2.x[k]);
}

static void
test_spec_graph_round_trip (void)
{
  g_autoptr (GError) error = NULL;
  g_autofree char *path = g_build_filename (DF_EXAMPLES_DIR, "canopy-panel.surface", NULL);
  g_autoptr (df_surface_spec) spec = df_surface_spec_load (path, &error);
  g_autoptr (GKeyFile) kf = g_key_file_new ();
  g_autoptr (df_surface_spec) back = NULL;
  double lx;

  g_assert_no_error (error);
  g_assert_cmpint (spec->kind, ==, DF_SURFACE_GRAPH);
  g_assert_true (df_params_lookup (spec->params, "Lx", &lx));
  g_assert_cmpfloat (lx, ==, 300.0);
  df_surface_spec_to_key_file (spec, kf);
  back = df_surface_spec_from_key_file (kf, "memory", &error);
  g_assert_no_error (error);
  g_assert_cmpstr (back->z_text, ==, spec->z_text);
  for (int i = 0; i < 4; i++)
    g_assert_cmpstr (back->range_text[i], ==, spec->range_text[i]);
}

typedef struct
{
  const char *text;
  int         code;
  const char *needle;   /* besides the file name */
} bad_case;

static void
test_spec_malformed (void)
{
  static const bad_case cases[] = {
    { "", DF_IO_ERROR_FORMAT, "empty" },
    { "   \n\n", DF_IO_ERROR_FORMAT, "empty" },
    { "[parameters]\nR=1\n", DF_IO_ERROR_FORMAT, "missing group [surface]" },
    { "[surface]\nkind=cone\nr=t\nz=t\nt-min=0\nt-max=1\n", DF_IO_ERROR_VALUE,
      "kind: unknown kind 'cone'" },
    { "[surface]\nr=t\nz=t\nt-min=0\nt-max=1\n", DF_IO_ERROR_FORMAT, "missing key 'kind'" },
    { "[surface]\nkind=revolution\nz=t\nt-min=0\nt-max=1\n", DF_IO_ERROR_FORMAT,
      "missing key 'r'" },
    { "[surface]\nkind=revolution\nr=t\nz=t\nt-min=0\n", DF_IO_ERROR_FORMAT,
      "missing key 't-max'" },
    { "[surface]\nkind=revolution\nr=1\nz=t\nt-min=2\nt-max=1\n", DF_IO_ERROR_VALUE,
      "t-max: must be greater than t-min" },
    { "[surface]\nkind=revolution\nr=1\nz=t\nt-min=1\nt-max=1\n", DF_IO_ERROR_VALUE,
      "t-max: must be greater than t-min" },
    { "[surface]\nkind=revolution\nr=R*sin(t\nz=t\nt-min=0\nt-max=1\n[parameters]\nR=2\n",
      DF_IO_ERROR_SYNTAX, "[surface] r: column" },
    { "[surface]\nkind=revolution\nr=Q*sin(t)\nz=t\nt-min=0\nt-max=1\n",
      DF_IO_ERROR_UNKNOWN_NAME, "[surface] r:" },
    { "[surface]\nkind=graph\nz=x*y\nx-min=-1\nx-max=1\ny-min=-1\ny-max=1+\n",
      DF_IO_ERROR_SYNTAX, "[surface] y-max:" },
    { "[surface]\nkind=revolution\nr=1\nz=t\nt-min=0\ntmax=1\n", DF_IO_ERROR_FORMAT,
      "unknown key 'tmax'" },
    { "[surface]\nkind=revolution\nr=1\nz=t\nt-min=0\nt-max=1\n[parameters]\nR=2*\n",
      DF_IO_ERROR_SYNTAX, "[parameters] R:" },
    { "[surface]\nkind=revolution\nthis line is junk\nr=1\n", DF_IO_ERROR_FORMAT, ":3:" },
    { "kind=revolution\n[surface]\n", DF_IO_ERROR_FORMAT, ":1:" },
    { "[surface]\nkind=revolution\nr=1\nz=t\nt-min=0\nt-max=1\n[surfase]\na=1\n",
      DF_IO_ERROR_FORMAT, "unknown group [surfase]" },
    { "[surface]\nkind=graph\nz=x\nx-min=0\nx-max=1\ny-min=0\ny-max=1\nt-min=0\n",
      DF_IO_ERROR_FORMAT, "t-min: not a key of a graph" },
    { "[surface]\nkind=graph\nz=\nx-min=0\nx-max=1\ny-min=0\ny-max=1\n", DF_IO_ERROR_FORMAT,
      "z: the formula is empty" },
    { "[surface]\nkind=graph\nz=x\nx-min=0\nx-max=1\ny-min=0\ny-max=1\nt-units=rad\n",
      DF_IO_ERROR_FORMAT, "t-units: only for a surface of revolution" },
    { "[surface]\nkind=revolution\nr=1\nz=t\nt-min=0\nt-max=1\nt-units=\n", DF_IO_ERROR_VALUE,
      "t-units: a short label" },
    { "[surface]\nkind=revolution\nr=1\nz=t\nt-min=0\nt-max=1\nt-units=millimetres of arc\n",
      DF_IO_ERROR_VALUE, "t-units: a short label" },
  };

  for (gsize i = 0; i < G_N_ELEMENTS (cases); i++)
    {
      g_autoptr (GError) error = NULL;
      g_autofree char *path = write_tmp ("bad.surface", cases[i].text);
      g_autoptr (df_surface_spec) spec = df_surface_spec_load (path, &error);

      g_test_message ("case %zu", i);
      g_assert_null (spec);
      assert_error_names (error, cases[i].code, "bad.surface", cases[i].needle);
    }
}

/* What t is measured in: stated by t-units, kept through a save, "length" following the
 * surface's units. */
static void
test_spec_t_units (void)
{
  g_autoptr (GError) error = NULL;
  g_autofree char *path = write_tmp ("t.surface", "[surface]\nkind=revolution\nr=2 + sin(t)\n"
                                     "z=t\nt-min=0\nt-max=1\nunits=cm\nt-units=length\n");
  g_autoptr (df_surface_spec) spec = df_surface_spec_load (path, &error);
  g_autoptr (df_surface_spec) back = NULL;
  g_autoptr (df_surface_spec) graph = df_surface_spec_new_preset ("saddle", &error);

  g_assert_no_error (error);
  g_assert_cmpstr (df_surface_spec_t_units (spec), ==, "cm");
  g_free (spec->units);
  spec->units = g_strdup ("in");
  g_assert_cmpstr (df_surface_spec_t_units (spec), ==, "in");
  g_free (spec->t_units);
  spec->t_units = g_strdup ("deg");
  g_assert_true (df_surface_spec_save (spec, path, &error));
  back = df_surface_spec_load (path, &error);
  g_assert_no_error (error);
  g_assert_cmpstr (df_surface_spec_t_units (back), ==, "deg");
  g_assert_null (df_surface_spec_t_units (graph));
}

/* A preset's t unit checked by dimensions (scaling, from memory): doubling every length
 * parameter doubles a t that is a length and leaves an angle or a pure number alone, so the
 * end of the t range doubles exactly when the preset says t is a length. */
static void
test_presets_t_units (void)
{
  const df_preset_info *list = df_presets_list ();

  for (gsize i = 0; list[i].name != NULL; i++)
    {
      g_autoptr (GError) error = NULL;
      g_autoptr (df_surface_spec) spec = df_surface_spec_new_preset (list[i].name, &error);
      g_autoptr (df_surface_spec) big = df_surface_spec_copy (spec);
      g_autoptr (df_surface) s1 = NULL;
      g_autoptr (df_surface) s2 = NULL;
      double u0, u1, v0, v1, w0, w1, unused0, unused1;
      const char *unit;

      g_assert_no_error (error);
      if (spec->kind != DF_SURFACE_REVOLUTION)
        {
          g_assert_null (df_surface_spec_t_units (spec));
          continue;
        }
      for (guint k = 0; k < df_params_count (spec->params); k++)
        {
          const char *name = df_params_name (spec->params, k);
          g_autofree char *text = g_strdup_printf ("%.17g", 2 * df_params_value (spec->params, k));

          /* Derived parameters (the dome's R) follow from the others; the cone's angle is
           * no length. */
          if (g_str_equal (name, "alpha_deg") || (g_str_equal (list[i].name, "dome")
                                                  && g_str_equal (name, "R")))
            continue;
          g_assert_true (df_surface_spec_set_param (big, name, text, &error));
          g_assert_no_error (error);
        }
      s1 = df_surface_spec_build (spec, &error);
      g_assert_no_error (error);
      s2 = df_surface_spec_build (big, &error);
      g_assert_no_error (error);
      df_surface_get_domain (s1, &u0, &u1, &unused0, &unused1);
      df_surface_get_domain (s2, &w0, &w1, &v0, &v1);
      unit = df_surface_spec_t_units (spec);
      g_test_message ("%s: t in %s, range %g..%g -> %g..%g", list[i].name,
                      unit != NULL ? unit : "(no unit)", u0, u1, w0, w1);
      if (g_strcmp0 (unit, spec->units) == 0)
        df_assert_close (w1 - w0, 2 * (u1 - u0), 1e-12, 0.0);
      else
        df_assert_close (w1 - w0, u1 - u0, 1e-12, 0.0);
    }
}

static void
test_spec_missing_file (void)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface_spec) spec = df_surface_spec_load ("/nonexistent/dir/x.surface", &error);

  g_assert_null (spec);
  assert_error_names (error, DF_IO_ERROR_FILE, "x.surface", NULL);
}

/* The core refuses a profile with r < 0; the message comes from the builder, not a crash. */
static void
test_spec_build_geometry_error (void)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface_spec) spec = df_surface_spec_new_revolution ("t - 1", "-t", "0", "2");
  g_autoptr (df_surface) surface = df_surface_spec_build (spec, &error);

  g_assert_null (surface);
  assert_error_names (error, DF_IO_ERROR_GEOMETRY, NULL, NULL);
}

/* ---- presets ---- */

static void
test_presets_list (void)
{
  static const char *const required[] = { "plane", "sphere", "torus", "catenoid",
                                          "pseudosphere", "cone", "paraboloid", "saddle",
                                          "bump", "cylinder", "spheroid", "hyperboloid", NULL };
  const df_preset_info *list = df_presets_list ();
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface_spec) bad = NULL;

  for (gsize k = 0; required[k] != NULL; k++)
    {
      gboolean found = FALSE;

      for (gsize i = 0; list[i].name != NULL; i++)
        found = found || g_str_equal (list[i].name, required[k]);
      g_assert_true (found);
    }
  bad = df_surface_spec_new_preset ("sphear", &error);
  g_assert_null (bad);
  assert_error_names (error, DF_IO_ERROR_VALUE, "sphear", "sphere");
}

/* Every preset builds, and N points outward. Definition used (common practice, no source):
 * at the profile point farthest from the axis, the outward normal of a body of revolution
 * points away from the axis; a graph's upper side is its outside. */
static void
test_presets_outward (void)
{
  const df_preset_info *list = df_presets_list ();

  for (gsize i = 0; list[i].name != NULL; i++)
    {
      g_autoptr (df_surface) s = build_preset (list[i].name);
      double u0, u1, v0, v1, best_u = 0.0, best_r = -1.0;
      df_point_geometry g;

      g_test_message ("preset %s", list[i].name);
      df_surface_get_domain (s, &u0, &u1, &v0, &v1);
      if (df_surface_get_kind (s) == DF_SURFACE_GRAPH)
        {
          g_assert_true (df_surface_geometry (s, 0.5 * (u0 + u1), 0.5 * (v0 + v1), &g, NULL)
                         == DF_OK);
          g_assert_cmpfloat (g.normal[2], >, 0.0);
          continue;
        }
      for (int k = 0; k <= 200; k++)
        {
          double u = u0 + (u1 - u0) * k / 200.0;
          df_chart_jet jet;

          g_assert_true (df_surface_eval (s, u, 0.0, 0, &jet, NULL) == DF_OK);
          if (hypot (jet.x[0], jet.x[1]) > best_r + 1e-9)
            {
              best_r = hypot (jet.x[0], jet.x[1]);
              best_u = u;
            }
        }
      g_assert_true (df_surface_geometry (s, best_u, 0.0, &g, NULL) == DF_OK);
      /* At v = phi = 0 the direction away from the axis is +x. */
      g_assert_cmpfloat (g.normal[0], >, 0.0);
    }
}

/* Preset formulas against textbook curvatures (do Carmo, Differential Geometry of Curves and
 * Surfaces, sec. 3-3 examples, from memory). */
static void
test_presets_curvature (void)
{
  g_autoptr (df_surface) sphere = build_preset ("sphere");
  g_autoptr (df_surface) torus = build_preset ("torus");
  g_autoptr (df_surface) pseudo = build_preset ("pseudosphere");
  g_autoptr (df_surface) catenoid = build_preset ("catenoid");
  g_autoptr (df_surface) saddle = build_preset ("saddle");
  g_autoptr (df_surface) cylinder = build_preset ("cylinder");
  df_point_geometry g;

  /* Sphere of radius R = 100: K = 1/R^2. */
  g_assert_true (df_surface_geometry (sphere, 0.8, 0.3, &g, NULL) == DF_OK);
  df_assert_close (g.K, 1.0 / (100.0 * 100.0), 1e-10, 0.0);
  /* Torus R = 100, a = 40 at the outer equator: K = cos t / (a (R + a cos t)) = 1/(40*140). */
  g_assert_true (df_surface_geometry (torus, 0.0, 0.0, &g, NULL) == DF_OK);
  df_assert_close (g.K, 1.0 / (40.0 * 140.0), 1e-10, 0.0);
  /* ... and at the inner equator 1/(40*(100 - 40)) with a minus sign. */
  g_assert_true (df_surface_geometry (torus, G_PI, 0.0, &g, NULL) == DF_OK);
  df_assert_close (g.K, -1.0 / (40.0 * 60.0), 1e-9, 0.0);
  /* Pseudosphere of radius R = 60: K = -1/R^2 everywhere. */
  g_assert_true (df_surface_geometry (pseudo, 1.3, 0.0, &g, NULL) == DF_OK);
  df_assert_close (g.K, -1.0 / (60.0 * 60.0), 1e-9, 0.0);
  /* Catenoid of neck c = 50: minimal (H = 0), K = -1/c^2 at the neck. */
  g_assert_true (df_surface_geometry (catenoid, 0.0, 0.0, &g, NULL) == DF_OK);
  df_assert_close (g.K, -1.0 / (50.0 * 50.0), 1e-10, 0.0);
  df_assert_close (g.H, 0.0, 0.0, 1e-12);
  /* Saddle z = (x^2 - y^2)/(2R), R = 200, at the origin: K = f_xx f_yy = -1/R^2. */
  g_assert_true (df_surface_geometry (saddle, 0.0, 0.0, &g, NULL) == DF_OK);
  df_assert_close (g.K, -1.0 / (200.0 * 200.0), 1e-10, 0.0);
  /* Cylinder: developable, K = 0; one principal curvature of magnitude 1/R = 1/50. */
  g_assert_true (df_surface_geometry (cylinder, 40.0, 1.0, &g, NULL) == DF_OK);
  df_assert_close (g.K, 0.0, 0.0, 1e-14);
  df_assert_close (MAX (fabs (g.k1), fabs (g.k2)), 1.0 / 50.0, 1e-10, 0.0);
}

static void
test_set_param (void)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface_spec) spec = df_surface_spec_new_preset ("sphere", &error);
  double r = 0.0;

  g_assert_no_error (error);
  g_assert_true (df_surface_spec_set_param (spec, "R=2*60", NULL, &error));
  g_assert_no_error (error);
  g_assert_true (df_params_lookup (spec->params, "R", &r));
  g_assert_cmpfloat (r, ==, 120.0);

  g_assert_false (df_surface_spec_set_param (spec, "r=50", NULL, &error));
  assert_error_names (error, DF_IO_ERROR_UNKNOWN_NAME, "'r'", "R");
  g_clear_error (&error);
  g_assert_false (df_surface_spec_set_param (spec, "R", "(3", &error));
  assert_error_names (error, DF_IO_ERROR_SYNTAX, "R:", "column");
  g_clear_error (&error);
  g_assert_false (df_surface_spec_set_param (spec, "R50", NULL, &error));
  assert_error_names (error, DF_IO_ERROR_SYNTAX, "KEY=VALUE", NULL);
}

/* ---- loop CSV ---- */

static void
test_csv_uv_valid (void)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface) plane = build_preset ("plane");
  g_autofree double (*uv)[2] = NULL;
  gsize n = 0;
  /* BOM, CRLF, a comment, a blank line, upper-case header, quoted fields (RFC 4180). */
  const char *text = "\xEF\xBB\xBF# a comment\r\n U , V \r\n0.5,-1e1\r\n\r\n\"2.25\", 3\r\n"
                     "-4,\"5\"\r\n";

  g_assert_true (df_loop_csv_parse (text, "ok.csv", plane, &uv, &n, &error));
  g_assert_no_error (error);
  g_assert_cmpuint (n, ==, 3);
  g_assert_cmpfloat (uv[0][0], ==, 0.5);
  g_assert_cmpfloat (uv[0][1], ==, -10.0);
  g_assert_cmpfloat (uv[1][0], ==, 2.25);
  g_assert_cmpfloat (uv[1][1], ==, 3.0);
  g_assert_cmpfloat (uv[2][0], ==, -4.0);
  g_assert_cmpfloat (uv[2][1], ==, 5.0);
}

/* Space points on a sphere of radius 100 come back as their polar angle and longitude. */
static void
test_csv_xyz_projected (void)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface) sphere = build_preset ("sphere");
  g_autoptr (GString) text = g_string_new ("x,y,z\n");
  g_autofree double (*uv)[2] = NULL;
  const double t[3] = { 0.7, 1.1, 0.9 }, phi[3] = { 0.2, 1.0, 2.5 };
  gsize n = 0;

  for (int i = 0; i < 3; i++)
    {
      char b[3][G_ASCII_DTOSTR_BUF_SIZE];

      g_string_append_printf (text, "%s,%s,%s\n",
                              g_ascii_dtostr (b[0], sizeof b[0], 100 * sin (t[i]) * cos (phi[i])),
                              g_ascii_dtostr (b[1], sizeof b[1], 100 * sin (t[i]) * sin (phi[i])),
                              g_ascii_dtostr (b[2], sizeof b[2], 100 * cos (t[i])));
    }
  g_assert_true (df_loop_csv_parse (text->str, "xyz.csv", sphere, &uv, &n, &error));
  g_assert_no_error (error);
  g_assert_cmpuint (n, ==, 3);
  for (int i = 0; i < 3; i++)
    {
      df_assert_close (uv[i][0], t[i], 0.0, 1e-9);
      df_assert_close (uv[i][1], phi[i], 0.0, 1e-9);
    }
}

static void
test_csv_malformed (void)
{
  static const bad_case cases[] = {
    { "", DF_IO_ERROR_FORMAT, "empty" },
    { "# only a comment\n\n", DF_IO_ERROR_FORMAT, "empty" },
    { "u,v\n", DF_IO_ERROR_FORMAT, "0 points, need at least 3" },
    { "u,v\n0,0\n0.5,0\n", DF_IO_ERROR_FORMAT, "2 points, need at least 3" },
    { "0,0\n0.5,0\n0.5,0.5\n", DF_IO_ERROR_FORMAT, "loop.csv:1: missing header" },
    { "a,b\n0,0\n", DF_IO_ERROR_FORMAT, "loop.csv:1: unknown header" },
    { "u,v,w\n0,0,0\n", DF_IO_ERROR_FORMAT, "loop.csv:1: unknown header" },
    { "u,v\n0,0\n0.5,0\n0.5,0.5,0\n", DF_IO_ERROR_FORMAT,
      "loop.csv:4: expected 2 numbers, found 3" },
    { "x,y,z\n0,0,0\n0,0\n", DF_IO_ERROR_FORMAT, "loop.csv:3: expected 3 numbers, found 2" },
    { "u,v\n\n# note\n0,0\n0.5,abc\n", DF_IO_ERROR_FORMAT, "loop.csv:5: field 2: 'abc'" },
    { "u,v\n0,0\n1e400,0\n", DF_IO_ERROR_FORMAT, "loop.csv:3: field 1: '1e400' is not a finite" },
    { "u,v\n0,nan\n", DF_IO_ERROR_FORMAT, "loop.csv:2: field 2: 'nan' is not a finite" },
    { "u,v\n0,inf\n", DF_IO_ERROR_FORMAT, "loop.csv:2: field 2: 'inf' is not a finite" },
    { "u,v\n0,\n", DF_IO_ERROR_FORMAT, "loop.csv:2: field 2 is empty" },
    { "u,v\n0,0x\n", DF_IO_ERROR_FORMAT, "loop.csv:2: field 2: '0x'" },
    { "u,v\n\"0,0\n", DF_IO_ERROR_FORMAT, "loop.csv:2: column 1: unbalanced quote" },
    /* The plane preset with L = 1 spans x, y in [-1, 1]. */
    { "u,v\n0,0\n2.5,0\n", DF_IO_ERROR_GEOMETRY,
      "loop.csv:3: point (2.5, 0) lies outside the surface (x in [-1, 1])" },
    { "u,v\n0,0\n0,-3\n", DF_IO_ERROR_GEOMETRY, "loop.csv:3: point (0, -3) lies outside the "
                                                 "surface (y in [-1, 1])" },
    /* 0.5 above the plane; the plane's size is its diagonal, 2 sqrt 2, so the limit is
     * 0.0028. */
    { "x,y,z\n0,0,0\n0.5,0,0.5\n", DF_IO_ERROR_GEOMETRY, "loop.csv:3: point (0.5, 0, 0.5) lies" },
  };
  g_autoptr (df_surface_spec) spec = df_surface_spec_new_preset ("plane", NULL);
  g_autoptr (df_surface) plane = NULL;
  g_autoptr (GError) error = NULL;

  g_assert_true (df_surface_spec_set_param (spec, "L", "1", &error));
  plane = df_surface_spec_build (spec, &error);
  g_assert_no_error (error);

  for (gsize i = 0; i < G_N_ELEMENTS (cases); i++)
    {
      g_autoptr (GError) err = NULL;
      g_autofree char *path = write_tmp ("loop.csv", cases[i].text);
      g_autofree double (*uv)[2] = NULL;
      gsize n = 0;

      g_test_message ("case %zu: %s", i, cases[i].text);
      g_assert_false (df_loop_csv_read (path, plane, &uv, &n, &err));
      g_assert_null (uv);
      assert_error_names (err, cases[i].code, "loop.csv", cases[i].needle);
    }
}

/* A point in space far from a sphere is refused, naming its line. */
static void
test_csv_off_surface (void)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface) sphere = build_preset ("sphere");
  g_autofree double (*uv)[2] = NULL;
  gsize n = 0;

  g_assert_false (df_loop_csv_parse ("x,y,z\n100,0,0\n0,100,0\n0,0,150\n", "sph.csv", sphere,
                                     &uv, &n, &error));
  assert_error_names (error, DF_IO_ERROR_GEOMETRY, "sph.csv:4:", "from the surface");
}

static void
test_csv_missing_file (void)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface) sphere = build_preset ("sphere");
  g_autofree double (*uv)[2] = NULL;
  gsize n = 0;

  g_assert_false (df_loop_csv_read ("/nonexistent/none.csv", sphere, &uv, &n, &error));
  assert_error_names (error, DF_IO_ERROR_FILE, "none.csv", NULL);
}

/* ---- project files ---- */

static void
test_project_round_trip (void)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_project) project = df_project_new (df_surface_spec_new_preset ("torus", NULL));
  g_autoptr (df_project) back = NULL;
  g_autofree char *path = tmp_path ("ring.dfproj");
  /* Values that need all 17 digits to come back exactly. */
  const double a[4][2] = { { 0.1, 1.0 / 3.0 }, { -G_PI / 7, 2.0 / 3.0 }, { 1e-7, -3.0 },
                           { 0.3, G_PI - 1e-12 } };
  const double b[3][2] = { { 1, 0 }, { 1, 2 }, { 2, 1 } };

  df_project_add_loop (project, "Rim ply, \"A\"", "#112233", TRUE, a, 4);
  df_project_add_loop (project, "Inner; patch", "#abcdef", FALSE, b, 3);
  g_assert_true (df_project_save (project, path, &error));
  g_assert_no_error (error);

  back = df_project_load (path, &error);
  g_assert_no_error (error);
  g_assert_cmpstr (back->spec->preset, ==, "torus");
  g_assert_cmpstr (back->spec->r_text, ==, project->spec->r_text);
  g_assert_cmpuint (back->loops->len, ==, 2);
  for (guint i = 0; i < 2; i++)
    {
      df_project_loop *l0 = g_ptr_array_index (project->loops, i);
      df_project_loop *l1 = g_ptr_array_index (back->loops, i);

      g_assert_cmpstr (l1->name, ==, l0->name);
      g_assert_cmpstr (l1->colour, ==, l0->colour);
      g_assert_cmpint (l1->show_frames, ==, l0->show_frames);
      g_assert_cmpuint (l1->n, ==, l0->n);
      for (gsize k = 0; k < l0->n; k++)
        {
          g_assert_true (l1->uv[k][0] == l0->uv[k][0]);
          g_assert_true (l1->uv[k][1] == l0->uv[k][1]);
        }
    }
}

static void
test_project_example (void)
{
  g_autoptr (GError) error = NULL;
  g_autofree char *path = g_build_filename (DF_EXAMPLES_DIR, "demo.dfproj", NULL);
  g_autoptr (df_project) project = df_project_load (path, &error);

  g_assert_no_error (error);
  g_assert_cmpint (project->spec->kind, ==, DF_SURFACE_REVOLUTION);
  g_assert_cmpuint (project->loops->len, >=, 2);
  g_assert_cmpuint (project->loops->len, <=, 3);
  for (guint i = 0; i < project->loops->len; i++)
    {
      df_project_loop *l = g_ptr_array_index (project->loops, i);

      g_assert_cmpuint (l->n, >=, 3);
      g_assert_cmpuint (strlen (l->name), >, 0);
    }
}

static void
test_project_malformed (void)
{
  static const char head[] = "[surface]\nkind=graph\nz=x*y\nx-min=-1\nx-max=1\ny-min=-1\n"
                             "y-max=1\n";
  static const bad_case cases[] = {
    { "[loop 1]\nu=0;0.5;0.5\nv=0;0;0.5\n", DF_IO_ERROR_FORMAT, "missing group [surface]" },
    { "[loop 1]\nname=a\nu=0;0.5;0.5\nv=0;0;0.5\n[loop 2]\nu=0;0.5;0.5;0.1\nv=0;0;0.5\n",
      DF_IO_ERROR_FORMAT, "[loop 2] u: 4 values but v has 3" },
    { "[loop 1]\nu=0;0.5;zero\nv=0;0;0.5\n", DF_IO_ERROR_FORMAT,
      "[loop 1] u: value 3 'zero' is not a number" },
    { "[loop 1]\nu=0;0.5;inf\nv=0;0;0.5\n", DF_IO_ERROR_FORMAT,
      "[loop 1] u: value 3 'inf' is not a finite number" },
    { "[loop 1]\nu=0;0.5\nv=0;0\n", DF_IO_ERROR_FORMAT, "[loop 1] u: 2 points" },
    { "[loop 1]\nv=0;0;0.5\n", DF_IO_ERROR_FORMAT, "[loop 1] missing key 'u'" },
    { "[loop 1]\ncolour=red\nu=0;0.5;0.5\nv=0;0;0.5\n", DF_IO_ERROR_VALUE, "[loop 1] colour:" },
    { "[loop 1]\nframes=maybe\nu=0;0.5;0.5\nv=0;0;0.5\n", DF_IO_ERROR_VALUE,
      "[loop 1] frames:" },
    { "[loop 1]\nwidth=3\nu=0;0.5;0.5\nv=0;0;0.5\n", DF_IO_ERROR_FORMAT,
      "[loop 1] unknown key 'width'" },
    { "[loops]\nu=0\n", DF_IO_ERROR_FORMAT, "unknown group [loops]" },
    { "[loop 1]\nu=0;0.5;2.5\nv=0;0;0.5\n", DF_IO_ERROR_GEOMETRY,
      "[loop 1] point 3 (2.5, 0.5) lies outside" },
    { "[loop 1]\nu=0;0.5;0.5\nthis is no key\n", DF_IO_ERROR_FORMAT, ":10:" },
  };

  for (gsize i = 0; i < G_N_ELEMENTS (cases); i++)
    {
      g_autoptr (GError) error = NULL;
      g_autofree char *text = g_strconcat (i == 0 ? "" : head, cases[i].text, NULL);
      g_autoptr (df_project) project = df_project_from_data (text, "part.dfproj", &error);

      g_test_message ("case %zu", i);
      g_assert_null (project);
      assert_error_names (error, cases[i].code, "part.dfproj", cases[i].needle);
    }
}

int
main (int argc, char **argv)
{
  static const char *const written[] = { "bad.surface", "dome.surface", "loop.csv",
                                         "ring.dfproj" };
  int status;

  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);

  g_test_add_func ("/io/spec/round-trip", test_spec_round_trip);
  g_test_add_func ("/io/spec/graph-round-trip", test_spec_graph_round_trip);
  g_test_add_func ("/io/spec/malformed", test_spec_malformed);
  g_test_add_func ("/io/spec/missing-file", test_spec_missing_file);
  g_test_add_func ("/io/spec/t-units", test_spec_t_units);
  g_test_add_func ("/io/presets/t-units", test_presets_t_units);
  g_test_add_func ("/io/spec/geometry-error", test_spec_build_geometry_error);
  g_test_add_func ("/io/presets/list", test_presets_list);
  g_test_add_func ("/io/presets/outward", test_presets_outward);
  g_test_add_func ("/io/presets/curvature", test_presets_curvature);
  g_test_add_func ("/io/presets/set-param", test_set_param);
  g_test_add_func ("/io/csv/uv-valid", test_csv_uv_valid);
  g_test_add_func ("/io/csv/xyz-projected", test_csv_xyz_projected);
  g_test_add_func ("/io/csv/malformed", test_csv_malformed);
  g_test_add_func ("/io/csv/off-surface", test_csv_off_surface);
  g_test_add_func ("/io/csv/missing-file", test_csv_missing_file);
  g_test_add_func ("/io/project/round-trip", test_project_round_trip);
  g_test_add_func ("/io/project/example", test_project_example);
  g_test_add_func ("/io/project/malformed", test_project_malformed);

  tmp_dir = g_dir_make_tmp ("df-test-readers-XXXXXX", NULL);
  g_assert_nonnull (tmp_dir);
  status = g_test_run ();
  /* Remove only the files this program wrote. */
  for (gsize i = 0; i < G_N_ELEMENTS (written); i++)
    {
      g_autofree char *path = tmp_path (written[i]);

      g_remove (path);
    }
  g_rmdir (tmp_dir);
  g_free (tmp_dir);
  return status;
}
