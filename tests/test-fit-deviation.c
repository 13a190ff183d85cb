/* test-fit-deviation.c: signed distances of data points from a surface (df_fit_deviations),
 * the app's colouring of measured points by their deviation from the fit, and the data
 * points read back as fitted (df_surface_spec_read_data_points: a profile's (r, z) in the
 * half-plane phi = 0, the placement applied). */
#include <glib/gstdio.h>
#include <math.h>
#include <string.h>

#include "df-fit-deviation.h"
#include "df-test.h"

static df_surface *
preset (const char *name, const char *param)
{
  g_autoptr(GError) error = NULL;
  g_autoptr(df_surface_spec) spec = df_surface_spec_new_preset (name, &error);
  df_surface *surface;

  g_assert_no_error (error);
  if (param != NULL)
    g_assert_true (df_surface_spec_set_param (spec, param, NULL, &error));
  g_assert_no_error (error);
  surface = df_surface_spec_build (spec, &error);
  g_assert_no_error (error);
  return surface;
}

/* Points at radius R + d from the centre of a sphere of radius R: their distance from it is
 * |p| - R, positive outside, where the preset's N points (elementary geometry, from memory). */
static void
test_sphere (void)
{
  g_autoptr(df_surface) sphere = preset ("sphere", "R=100");
  const double d[6] = { 0.5, -0.25, 0.0, 2.0, -1.5, 0.01 };
  double xyz[6][3], dev[6];
  bool placed[6];
  size_t n_placed = 0;

  for (int i = 0; i < 6; i++)
    {
      double theta = 0.3 + 0.4 * i, phi = -2.5 + 0.9 * i, r = 100 + d[i];

      xyz[i][0] = r * sin (theta) * cos (phi);
      xyz[i][1] = r * sin (theta) * sin (phi);
      xyz[i][2] = r * cos (theta);
    }
  g_assert_cmpint (df_fit_deviations (sphere, (const double (*)[3]) xyz, 6, dev, placed,
                                      &n_placed, NULL), ==, DF_OK);
  g_assert_cmpuint (n_placed, ==, 6);
  for (int i = 0; i < 6; i++)
    {
      g_assert_true (placed[i]);
      df_assert_close (dev[i], d[i], 0, 1e-7);
    }
}

/* Over a plane z = 0 (a graph, N = X_x x X_y = +z) a point's deviation is its height. */
static void
test_plane (void)
{
  g_autoptr(df_surface) plane = preset ("plane", NULL);
  double xyz[3][3] = { { 1, 2, 0.3 }, { -4, 1, -0.7 }, { 0, 0, 0 } }, dev[3];
  bool placed[3];
  size_t n_placed = 0;

  g_assert_cmpint (df_fit_deviations (plane, (const double (*)[3]) xyz, 3, dev, placed,
                                      &n_placed, NULL), ==, DF_OK);
  g_assert_cmpuint (n_placed, ==, 3);
  for (int i = 0; i < 3; i++)
    df_assert_close (dev[i], xyz[i][2], 0, 1e-12);
}

static void
test_nonfinite (void)
{
  g_autoptr(df_surface) plane = preset ("plane", NULL);
  double xyz[2][3] = { { 0, 0, 1 }, { 0, NAN, 0 } }, dev[2];
  bool placed[2];
  size_t n_placed = 0;
  df_diag diag;

  df_diag_clear (&diag);
  g_assert_cmpint (df_fit_deviations (plane, (const double (*)[3]) xyz, 2, dev, placed,
                                      &n_placed, &diag), ==, DF_E_INPUT);
  g_assert_cmpint (diag.index, ==, 1);
  g_assert_nonnull (strstr (diag.detail, "point 2"));
}

/* The points as the fit sees them: a profile's rows as (r, 0, z); heights moved by the
 * placement offset (placement-offset=, df-surface-spec.h). */
static void
test_read_points (void)
{
  g_autofree char *dir = g_dir_make_tmp ("df-dev-XXXXXX", NULL);
  g_autofree char *profile = g_build_filename (dir, "p.csv", NULL);
  g_autofree char *heights = g_build_filename (dir, "h.csv", NULL);
  g_autoptr(GError) error = NULL;
  g_autofree double (*xyz)[3] = NULL;
  gsize n = 0;

  g_assert_true (g_file_set_contents (profile, "# profile\nr,z\n1,2\n3,4\n", -1, NULL));
  g_assert_true (g_file_set_contents (heights, "x,y,z\n1,2,3\n4,5,6\n", -1, NULL));
  {
    g_autoptr(df_surface_spec) spec = df_surface_spec_new_data (DF_SURFACE_REVOLUTION, profile,
                                                                NULL);

    g_assert_true (df_surface_spec_read_data_points (spec, &xyz, &n, &error));
    g_assert_no_error (error);
    g_assert_cmpuint (n, ==, 2);
    g_assert_cmpfloat (xyz[1][0], ==, 3);
    g_assert_cmpfloat (xyz[1][1], ==, 0);
    g_assert_cmpfloat (xyz[1][2], ==, 4);
    g_clear_pointer (&xyz, g_free);
  }
  {
    g_autoptr(df_surface_spec) spec = df_surface_spec_new_data (DF_SURFACE_GRAPH, heights, NULL);

    spec->placement_offset_text = g_strdup ("10,20,30");
    g_assert_true (df_surface_spec_read_data_points (spec, &xyz, &n, &error));
    g_assert_no_error (error);
    g_assert_cmpuint (n, ==, 2);
    g_assert_cmpfloat (xyz[0][0], ==, 11);
    g_assert_cmpfloat (xyz[0][1], ==, 22);
    g_assert_cmpfloat (xyz[1][2], ==, 36);
    g_clear_pointer (&xyz, g_free);
  }
  {
    g_autoptr(df_surface_spec) spec = df_surface_spec_new_data (DF_SURFACE_GRAPH, "/nonexistent/h.csv",
                                                                NULL);

    g_assert_false (df_surface_spec_read_data_points (spec, &xyz, &n, &error));
    g_assert_nonnull (error);
    g_assert_nonnull (strstr (error->message, "h.csv"));
  }
  g_remove (profile);
  g_remove (heights);
  g_rmdir (dir);
}

int
main (int   argc,
      char *argv[])
{
  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);
  g_test_add_func ("/core/fit-deviation/sphere", test_sphere);
  g_test_add_func ("/core/fit-deviation/plane", test_plane);
  g_test_add_func ("/core/fit-deviation/nonfinite", test_nonfinite);
  g_test_add_func ("/core/fit-deviation/read-points", test_read_points);
  return g_test_run ();
}
