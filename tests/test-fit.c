/* test-fit.c: surfaces fitted to data (df-fit.h) against closed forms: a sphere given as
 * profile points, a paraboloid given as a height grid (exact and with noise), and the
 * refusals of bad data with the row or place named. */
#include <gsl/gsl_randist.h>
#include <gsl/gsl_linalg.h>
#include <gsl/gsl_rng.h>
#include <math.h>

#include "df-bspline.h"
#include "df-fit.h"
#include "df-test.h"

static df_surface *
profile_surface (const double (*rz)[2], size_t n, double tol, df_fit_info *info)
{
  df_fn *fn = NULL;
  df_surface *s = NULL;
  df_diag diag;
  double dom[4];
  df_status st = df_fit_profile (rz, n, tol, &fn, info, &diag);

  if (st != DF_OK)
    g_error ("profile fit: %s (row %ld)", diag.detail, diag.index);
  g_assert_true (df_fn_get_domain (fn, dom));
  st = df_surface_new_revolution_fn (fn, dom[0], dom[1], &s, &diag);
  if (st != DF_OK)
    g_error ("profile surface: %s", diag.detail);
  return s;
}

static df_surface *
grid_surface (const double (*xyz)[3], size_t n, double tol, df_fit_info *info)
{
  df_fn *fn = NULL;
  df_surface *s = NULL;
  df_diag diag;
  double dom[4];
  df_status st = df_fit_grid (xyz, n, tol, &fn, info, &diag);

  if (st != DF_OK)
    g_error ("grid fit: %s (row %ld)", diag.detail, diag.index);
  g_assert_true (df_fn_get_domain (fn, dom));
  st = df_surface_new_graph_fn (fn, dom[0], dom[1], dom[2], dom[3], &s, &diag);
  if (st != DF_OK)
    g_error ("grid surface: %s", diag.detail);
  return s;
}

static void
measure_loop (const df_surface *s, const double (*uv)[2], size_t n, df_loop_result *r)
{
  g_autoptr (df_curve) c = df_test_curve (s, uv, n, true);

  df_test_measure (c, r);
}

#define R_SPHERE 100.0

static double (*sphere_profile (size_t n))[2]
{
  double (*rz)[2] = g_malloc (n * sizeof *rz);

  for (size_t i = 0; i < n; i++)
    {
      double th = G_PI * i / (n - 1);

      rz[i][0] = i == 0 || i == n - 1 ? 0.0 : R_SPHERE * sin (th);
      rz[i][1] = R_SPHERE * cos (th);
    }
  return rz;
}

static void
test_sphere_profile (void)
{
  const size_t n = 200;
  g_autofree double (*rz)[2] = sphere_profile (n);
  df_fit_info info;
  g_autoptr (df_surface) s = profile_surface ((const double (*)[2]) rz, n, 0.0, &info);
  const double thetas[] = { 0.3, 1.0, G_PI / 2, 2.5 };
  df_pole poles[2];
  double u0, u1;

  /* Both ends are smooth poles; t is arc length, so the profile is G_PI R long. */
  g_assert_cmpint (info.pole[0], ==, 1);
  g_assert_cmpint (info.pole[1], ==, 1);
  df_surface_get_poles (s, poles);
  g_assert_true (poles[0].on_axis && poles[1].on_axis);
  df_assert_close (poles[0].concentrated, 0.0, 0.0, 1e-9);
  df_surface_get_domain (s, &u0, &u1, NULL, NULL);
  df_assert_close (u1 - u0, G_PI * R_SPHERE, 1e-7, 0.0);
  g_assert_cmpfloat (info.rms, <, 1e-6);

  for (size_t k = 0; k < G_N_ELEMENTS (thetas); k++)
    {
      double theta = thetas[k], want;
      size_t m = 64;
      g_autofree double (*uv)[2] = g_malloc (m * sizeof *uv);
      g_auto (df_loop_result) r = { 0 };
      df_chart_jet j;

      for (size_t i = 0; i < m; i++)
        {
          uv[i][0] = R_SPHERE * theta;
          uv[i][1] = 2 * G_PI * i / m;
        }
      /* Unit speed: r'^2 + z'^2 = 1 on the arc-length parametrisation. */
      g_assert_cmpint (df_surface_eval (s, uv[0][0], 0.0, 3, &j, NULL), ==, DF_OK);
      df_assert_close (hypot (j.d1[0][0], j.d1[0][2]), 1.0, 0.0, 1e-12);
      measure_loop (s, (const double (*)[2]) uv, m, &r);
      /* Latitude circle at polar angle theta: holonomy 2 pi (1 - cos theta), Gauss-Bonnet
       * (do Carmo, Differential Geometry of Curves and Surfaces, sec. 4-5; from memory). */
      want = 2 * G_PI * (1 - cos (theta));
      df_assert_close (df_wrap_angle (r.holonomy_rad - want), 0.0, 0.0, 1e-6);
    }
}

static void
test_cone_profile (void)
{
  /* A cone of half-angle 30 degrees from its apex (on the axis) out to r = 50: the data meet
   * the axis at the cone's angle, so the apex carries 2 pi (1 - sin alpha) (GEOMETRY.md; the
   * angle defect of a cone, from memory). */
  const size_t n = 60;
  g_autofree double (*rz)[2] = g_malloc (n * sizeof *rz);
  double alpha = G_PI / 6;
  df_fit_info info;
  df_pole poles[2];

  for (size_t i = 0; i < n; i++)
    {
      double s = 100.0 * i / (n - 1);

      rz[i][0] = s * sin (alpha);
      rz[i][1] = -s * cos (alpha);
    }
  {
    g_autoptr (df_surface) s = profile_surface ((const double (*)[2]) rz, n, 0.0, &info);

    g_assert_cmpint (info.pole[0], ==, 2);
    df_surface_get_poles (s, poles);
    g_assert_true (poles[0].on_axis);
    df_assert_close (poles[0].sin_alpha, sin (alpha), 0.0, 1e-9);
  }
}

#define A_PARA 0.002

/* z = a (x^2 + y^2) on a 1 mm grid over [-50, 50]^2, in a shuffled order. */
static double (*paraboloid_grid (size_t *n, double noise))[3]
{
  const int m = 101;
  double (*xyz)[3] = g_malloc ((size_t) m * m * sizeof *xyz);
  gsl_rng *rng = gsl_rng_alloc (gsl_rng_mt19937);

  gsl_rng_set (rng, 20261202);
  for (int i = 0; i < m; i++)
    for (int j = 0; j < m; j++)
      {
        /* Column-major rows, so the reader cannot rely on the order. */
        size_t k = (size_t) j * m + i;
        double x = i - 50.0, y = j - 50.0;

        xyz[k][0] = x;
        xyz[k][1] = y;
        xyz[k][2] = A_PARA * (x * x + y * y) + (noise > 0 ? gsl_ran_gaussian (rng, noise) : 0.0);
      }
  gsl_rng_free (rng);
  *n = (size_t) m * m;
  return xyz;
}

static double
paraboloid_circle (const df_surface *s, double rho)
{
  size_t m = 96;
  g_autofree double (*uv)[2] = g_malloc (m * sizeof *uv);
  g_auto (df_loop_result) r = { 0 };

  for (size_t i = 0; i < m; i++)
    {
      uv[i][0] = 3.0 + rho * cos (2 * G_PI * i / m);
      uv[i][1] = -2.0 + rho * sin (2 * G_PI * i / m);
    }
  measure_loop (s, (const double (*)[2]) uv, m, &r);
  return r.holonomy_rad;
}

/* Circle of radius rho about the paraboloid's axis: the Gauss image is a spherical cap of
 * polar angle atan(2 a rho), so the enclosed curvature is 2 pi (1 - 1/sqrt(1 + 4 a^2 rho^2))
 * (Gauss image area; from memory). The test circle is off centre by (3, -2), so the figure
 * uses the cap of the normals along it, computed here on the same closed form by shifting:
 * a paraboloid's normal cone is translation invariant in a only through the gradient, so the
 * loop is centred on the axis instead. */
static double
paraboloid_want (double rho)
{
  return 2 * G_PI * (1 - 1 / sqrt (1 + 4 * A_PARA * A_PARA * rho * rho));
}

static double
centred_circle (const df_surface *s, double rho)
{
  size_t m = 96;
  g_autofree double (*uv)[2] = g_malloc (m * sizeof *uv);
  g_auto (df_loop_result) r = { 0 };

  for (size_t i = 0; i < m; i++)
    {
      uv[i][0] = rho * cos (2 * G_PI * i / m);
      uv[i][1] = rho * sin (2 * G_PI * i / m);
    }
  measure_loop (s, (const double (*)[2]) uv, m, &r);
  return r.holonomy_rad;
}

static void
test_paraboloid_grid (void)
{
  size_t n;
  g_autofree double (*xyz)[3] = paraboloid_grid (&n, 0.0);
  df_fit_info info;
  g_autoptr (df_surface) s = grid_surface ((const double (*)[3]) xyz, n, 0.0, &info);

  (void) paraboloid_circle;
  g_assert_cmpuint (info.points, ==, n);
  g_assert_cmpfloat (info.rms, <, 1e-9);
  for (double rho = 10; rho <= 40; rho += 15)
    df_assert_close (centred_circle (s, rho), paraboloid_want (rho), 0.0, 1e-6);
}

/* The enclosed curvature on a spline surface of many pieces (the direct route of Green's
 * theorem, its line points shared among threads): with one thread and with two, the closed
 * form of the paraboloid above to 1e-6 rad, and the two runs alike to rounding (the panels are
 * split the same way whichever thread runs them). */
static void
test_paraboloid_threads (void)
{
  size_t n, m = 400;
  g_autofree double (*xyz)[3] = paraboloid_grid (&n, 0.0);
  g_autofree double (*uv)[2] = g_malloc (m * sizeof *uv);
  df_fit_info info;
  g_autoptr (df_surface) s = grid_surface ((const double (*)[3]) xyz, n, 0.0, &info);
  double enclosed[2];
  const double rho = 45;

  for (size_t i = 0; i < m; i++)
    {
      uv[i][0] = rho * cos (2 * G_PI * i / m);
      uv[i][1] = rho * sin (2 * G_PI * i / m);
    }
  for (int t = 0; t < 2; t++)
    {
      g_autoptr (df_curve) c = df_test_curve (s, (const double (*)[2]) uv, m, true);
      g_auto (df_loop_result) r = { 0 };
      df_loop_options opt;
      df_diag diag;

      df_loop_options_init (&opt);
      opt.threads = t + 1;
      g_assert_cmpint (df_loop_measure (c, &opt, &r, &diag), ==, DF_OK);
      g_assert_true (r.enclosed_available);
      df_assert_close (r.enclosed_curvature_rad, paraboloid_want (rho), 0.0, 1e-6);
      enclosed[t] = r.enclosed_curvature_rad;
    }
  df_assert_close (enclosed[1], enclosed[0], 0.0, 1e-12);
}

/* The smoothing trace tr(A^-1 G) from the band of A^-1 (the selected-inversion recursion)
 * against GSL's dense Cholesky inverse (gsl_linalg_cholesky_invert, a reference library) on a
 * band matrix of the smoother's shape: half-width 5, 60 rows, random entries, made positive
 * definite by its diagonal. */
static void
test_band_trace (void)
{
  const size_t n = 60, p = 5;
  gsl_matrix *ab = gsl_matrix_calloc (n, p + 1), *g = gsl_matrix_calloc (n, p + 1);
  gsl_matrix *a = gsl_matrix_calloc (n, n);
  gsl_rng *rng = gsl_rng_alloc (gsl_rng_mt19937);
  double fast = 0.0, dense = 0.0;

  gsl_rng_set (rng, 7);
  for (size_t i = 0; i < n; i++)
    for (size_t d = 0; d <= p && i + d < n; d++)
      {
        double av = d == 0 ? 8.0 + gsl_rng_uniform (rng) : gsl_rng_uniform (rng) - 0.5;
        double gv = d == 0 ? 1.0 + gsl_rng_uniform (rng) : 0.3 * (gsl_rng_uniform (rng) - 0.5);

        gsl_matrix_set (ab, i, d, av);
        gsl_matrix_set (a, i, i + d, av);
        gsl_matrix_set (a, i + d, i, av);
        gsl_matrix_set (g, i, d, gv);
      }
  g_assert_cmpint (gsl_linalg_cholesky_band_decomp (ab), ==, GSL_SUCCESS);
  g_assert_true (df_band_trace_inverse_product (ab, g, &fast));
  g_assert_cmpint (gsl_linalg_cholesky_decomp1 (a), ==, GSL_SUCCESS);
  g_assert_cmpint (gsl_linalg_cholesky_invert (a), ==, GSL_SUCCESS);
  for (size_t i = 0; i < n; i++)
    for (size_t d = 0; d <= p && i + d < n; d++)
      dense += (d == 0 ? 1.0 : 2.0) * gsl_matrix_get (a, i, i + d) * gsl_matrix_get (g, i, d);
  g_test_message ("band trace %.15g, dense %.15g", fast, dense);
  df_assert_close (fast, dense, 1e-12, 0.0);
  gsl_rng_free (rng);
  gsl_matrix_free (ab);
  gsl_matrix_free (g);
  gsl_matrix_free (a);
}

static void
test_paraboloid_noise (void)
{
  size_t n;
  const double noise = 0.01;
  g_autofree double (*xyz)[3] = paraboloid_grid (&n, noise);
  df_fit_info info;
  g_autoptr (df_surface) s = grid_surface ((const double (*)[3]) xyz, n, noise, &info);

  /* Fitted at the noise's own RMS: the residual is the noise (within 20 %), and a loop's
   * holonomy, an integral of the normals, moves by well under 0.1 degree. */
  g_test_message ("noisy grid: rms %.4g, max %.4g, lambda %.3g", info.rms, info.max,
                  info.lambda);
  df_assert_close (info.rms, noise, 0.2, 0.0);
  for (double rho = 10; rho <= 40; rho += 15)
    df_assert_close (centred_circle (s, rho), paraboloid_want (rho), 0.0, 0.1 * G_PI / 180);
}

static void
test_paraboloid_gcv (void)
{
  size_t n;
  g_autofree double (*xyz)[3] = paraboloid_grid (&n, 0.01);
  df_fit_info info;
  g_autoptr (df_surface) s = grid_surface ((const double (*)[3]) xyz, n, DF_FIT_TOLERANCE_AUTO,
                                           &info);

  /* GCV picks a smoothing that keeps roughly the noise as residual (no exact figure: the
   * criterion estimates it; within 30 % here, common practice, no source). */
  g_assert_true (info.chosen);
  g_test_message ("gcv: rms %.4g, lambda %.3g", info.rms, info.lambda);
  df_assert_close (info.rms, 0.01, 0.3, 0.0);
  df_assert_close (centred_circle (s, 30), paraboloid_want (30), 0.0, 0.1 * G_PI / 180);
}

static void
test_domain (void)
{
  size_t n;
  g_autofree double (*xyz)[3] = paraboloid_grid (&n, 0.0);
  g_autoptr (df_surface) s = grid_surface ((const double (*)[3]) xyz, n, 0.0, NULL);
  double uv[4][2] = { { 0, 0 }, { 60, 0 }, { 60, 10 }, { 0, 10 } };
  df_curve *c = NULL;
  df_diag diag;

  /* A loop leaving the data is refused, the place named. */
  g_assert_cmpint (df_curve_new_through_points (s, (const double (*)[2]) uv, 4, true, &c, &diag),
                   !=, DF_OK);
  g_assert_null (c);
  g_assert_nonnull (strstr (diag.detail, "60"));
}

/* Scattered points of the paraboloid (uniform in the square, fixed seed, with a hole round
 * (35, 35)): the same closed form, and a loop through the hole is refused. */
static void
test_paraboloid_scattered (void)
{
  const size_t n = 20000;
  g_autofree double (*xyz)[3] = g_malloc (n * sizeof *xyz);
  gsl_rng *rng = gsl_rng_alloc (gsl_rng_mt19937);
  df_fit_info info;
  size_t k = 0;

  gsl_rng_set (rng, 42);
  while (k < n)
    {
      double x = gsl_rng_uniform (rng) * 100 - 50, y = gsl_rng_uniform (rng) * 100 - 50;

      if (hypot (x - 35, y - 35) < 8)
        continue;
      xyz[k][0] = x;
      xyz[k][1] = y;
      xyz[k][2] = A_PARA * (x * x + y * y);
      k++;
    }
  gsl_rng_free (rng);
  {
    g_autoptr (df_surface) s = grid_surface ((const double (*)[3]) xyz, n, 0.0, &info);
    double uv[4][2] = { { 30, 30 }, { 40, 30 }, { 40, 40 }, { 30, 40 } };
    df_curve *c = NULL;
    df_diag diag;

    g_assert_cmpuint (info.points, ==, n);
    g_assert_cmpfloat (info.rms, <, 1e-8);
    /* A quadratic lies in the penalty's null space: the fit reproduces it to rounding. */
    df_assert_close (centred_circle (s, 30), paraboloid_want (30), 0.0, 1e-6);
    g_assert_cmpint (df_curve_new_through_points (s, (const double (*)[2]) uv, 4, true, &c,
                                                  &diag), !=, DF_OK);
    g_assert_nonnull (strstr (diag.detail, "covered by the data"));
  }
}

static void
expect_profile_error (const double (*rz)[2], size_t n, long row, const char *word)
{
  df_fn *fn = NULL;
  df_diag diag;

  g_assert_cmpint (df_fit_profile (rz, n, 0.0, &fn, NULL, &diag), ==, DF_E_INPUT);
  g_assert_null (fn);
  g_assert_cmpint (diag.index, ==, row);
  if (strstr (diag.detail, word) == NULL)
    g_error ("message '%s' lacks '%s'", diag.detail, word);
}

static void
test_bad_profiles (void)
{
  const size_t n = 20;
  g_autofree double (*rz)[2] = g_malloc (n * sizeof *rz);
  double keep[2];

  for (size_t i = 0; i < n; i++)
    {
      rz[i][0] = 10.0 + i;
      rz[i][1] = 0.5 * i;
    }
  expect_profile_error ((const double (*)[2]) rz, 5, -1, "at least");
  rz[7][1] = NAN;
  expect_profile_error ((const double (*)[2]) rz, n, 7, "finite");
  rz[7][1] = 3.5;
  rz[9][0] = -1.0;
  expect_profile_error ((const double (*)[2]) rz, n, 9, "crosses the axis");
  rz[9][0] = 19.0;
  rz[12][0] = rz[11][0];
  rz[12][1] = rz[11][1];
  expect_profile_error ((const double (*)[2]) rz, n, 12, "repeats");
  rz[12][0] = 22.0;
  rz[12][1] = 6.0;
  keep[0] = rz[13][0];
  keep[1] = rz[13][1];
  rz[13][0] = 15.0;
  rz[13][1] = 3.0;
  expect_profile_error ((const double (*)[2]) rz, n, 13, "out of order");
  rz[13][0] = keep[0];
  rz[13][1] = keep[1];
}

static void
expect_grid_error (const double (*xyz)[3], size_t n, const char *word)
{
  df_fn *fn = NULL;
  df_diag diag;

  g_assert_cmpint (df_fit_grid (xyz, n, 0.0, &fn, NULL, &diag), ==, DF_E_INPUT);
  g_assert_null (fn);
  if (strstr (diag.detail, word) == NULL)
    g_error ("message '%s' lacks '%s'", diag.detail, word);
}

static void
test_bad_grids (void)
{
  size_t n;
  g_autofree double (*xyz)[3] = paraboloid_grid (&n, 0.0);
  double keep[2];

  /* One node given twice, then one missing: a hole, named by its (x, y). */
  keep[0] = xyz[500][0];
  keep[1] = xyz[500][1];
  xyz[500][0] = xyz[501][0];
  xyz[500][1] = xyz[501][1];
  expect_grid_error ((const double (*)[3]) xyz, n, "twice");
  xyz[500][0] = keep[0];
  xyz[500][1] = keep[1];
  expect_grid_error ((const double (*)[3]) xyz + 1, n - 1, "hole");
  for (size_t i = 0; i < n; i++)
    xyz[i][1] = xyz[i][0];
  expect_grid_error ((const double (*)[3]) xyz, n, "line");
  xyz[3][2] = INFINITY;
  expect_grid_error ((const double (*)[3]) xyz, n, "finite");
}

int
main (int argc, char **argv)
{
  df_core_init ();
  g_test_init (&argc, &argv, NULL);
  g_test_add_func ("/core/fit/sphere-profile", test_sphere_profile);
  g_test_add_func ("/core/fit/cone-profile", test_cone_profile);
  g_test_add_func ("/core/fit/paraboloid-grid", test_paraboloid_grid);
  g_test_add_func ("/core/fit/paraboloid-noise", test_paraboloid_noise);
  g_test_add_func ("/core/fit/paraboloid-threads", test_paraboloid_threads);
  g_test_add_func ("/core/fit/band-trace", test_band_trace);
  g_test_add_func ("/core/fit/paraboloid-gcv", test_paraboloid_gcv);
  g_test_add_func ("/core/fit/domain", test_domain);
  g_test_add_func ("/core/fit/paraboloid-scattered", test_paraboloid_scattered);
  g_test_add_func ("/core/fit/bad-profiles", test_bad_profiles);
  g_test_add_func ("/core/fit/bad-grids", test_bad_grids);
  return g_test_run ();
}
