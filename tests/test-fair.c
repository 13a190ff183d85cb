/* test-fair.c: fairing of noisy closed loops (df_fair_closed_loop): a noisy latitude circle on a
 * sphere and a noisy circle on a plane, faired, give back the circle's steering radius and
 * holonomy; the deviation reported is the one achieved; bad tolerances are refused. */
#include <math.h>

#include <gsl/gsl_randist.h>
#include <gsl/gsl_rng.h>

#include "df-test.h"

/* n points of the circle at polar angle theta on a sphere of radius R, each moved by Gaussian
 * noise of standard deviation sigma in space (GSL's MT19937, fixed seed) and placed back on
 * the surface, as a scan or a stroke would be. */
static double (*noisy_latitude (const df_surface *s, double R, double theta, size_t n,
                                double sigma, unsigned long seed))[2]
{
  gsl_rng *rng = gsl_rng_alloc (gsl_rng_mt19937);
  g_autoptr (df_placer) pl = df_placer_new (s);
  double (*uv)[2] = g_malloc (n * sizeof *uv);

  gsl_rng_set (rng, seed);
  for (size_t i = 0; i < n; i++)
    {
      double phi = 2 * G_PI * i / n, p[3], d;
      df_diag diag;

      p[0] = R * sin (theta) * cos (phi) + gsl_ran_gaussian (rng, sigma);
      p[1] = R * sin (theta) * sin (phi) + gsl_ran_gaussian (rng, sigma);
      p[2] = R * cos (theta) + gsl_ran_gaussian (rng, sigma);
      if (df_placer_place (pl, p, 0.0, &uv[i][0], &uv[i][1], &d, &diag) != DF_OK)
        g_error ("place: %s", diag.detail);
    }
  gsl_rng_free (rng);
  return uv;
}

static void
fair_or_die (const df_surface *s, const double (*uv)[2], size_t n, double tol,
             double (**out)[2], df_fair_info *info)
{
  df_diag diag;
  df_status st = df_fair_closed_loop (s, uv, n, tol, out, info, &diag);

  if (st != DF_OK)
    g_error ("fair: %s: %s", df_status_describe (st), diag.detail);
}

/* The case: a circle round a sphere's pole. Latitude circle at polar angle theta on a
 * sphere of radius R: holonomy 2 pi (1 - cos theta) (Gauss-Bonnet; do Carmo, sec. 4-5), geodesic
 * curvature cot (theta) / R, so the steering radius is R tan theta (do Carmo, sec. 4-4; both
 * from memory). R = 100 mm, theta = 0.39: about 41 mm. Noise 0.1 % of the circle's radius. */
static void
test_sphere_latitude (void)
{
  const double R = 100.0, theta = 0.39, rho = R * sin (theta), sigma = 1e-3 * rho;
  const size_t n = 2000;
  g_autoptr (df_surface) s = df_test_revolution ("100*sin(t)", "100*cos(t)", 0.0, G_PI);
  g_autofree double (*uv)[2] = noisy_latitude (s, R, theta, n, sigma, 20261202);
  g_autofree double (*faired)[2] = NULL;
  g_autoptr (df_curve) raw_c = NULL, fair_c = NULL;
  g_auto (df_loop_result) raw = { 0 }, fr = { 0 };
  df_fair_info info;
  const double tol = 5 * sigma;
  const double want_hol = 2 * G_PI * (1 - cos (theta)), want_radius = R * tan (theta);

  /* Unfaired, the noise is the curvature: the steering radius comes out far too small. */
  raw_c = df_test_curve (s, (const double (*)[2]) uv, n, true);
  df_test_measure (raw_c, &raw);
  g_assert_true (raw.has_steering_radius);
  g_assert_cmpfloat (raw.min_steering_radius, <, 0.5 * want_radius);

  fair_or_die (s, (const double (*)[2]) uv, n, tol, &faired, &info);
  g_assert_cmpuint (info.n_points, ==, n);
  g_assert_true (info.met);
  g_assert_cmpfloat (info.max_deviation, <=, tol);
  g_assert_cmpfloat (info.max_deviation, >, 0.0);
  fair_c = df_test_curve (s, (const double (*)[2]) faired, n, true);
  df_test_measure (fair_c, &fr);
  g_test_message ("faired: lambda %g, max deviation %g (tol %g), steering radius %g (want %g), "
                  "holonomy error %g", info.lambda, info.max_deviation, tol,
                  fr.min_steering_radius, want_radius,
                  remainder (fr.holonomy_rad - want_hol, 2 * G_PI));
  g_assert_true (fr.has_steering_radius);
  df_assert_close (fr.min_steering_radius, want_radius, 0.02, 0.0);
  /* The loop runs with increasing phi: the disc on its left is the southern cap, whose curvature
   * is 2 pi (1 - cos theta) - 4 pi: the same modulo 2 pi. */
  df_assert_close (remainder (fr.holonomy_rad - want_hol, 2 * G_PI), 0.0, 0.0, 1e-4);
}

/* A circle of radius rho on a plane: geodesic curvature 1/rho, holonomy 0 (from memory). */
static void
test_plane_circle (void)
{
  const double rho = 30.0, sigma = 1e-3 * rho;
  const size_t n = 2000;
  g_autoptr (df_surface) s = df_test_graph ("0", -50, 50, -50, 50);
  g_autofree double (*uv)[2] = g_malloc (n * sizeof *uv);
  g_autofree double (*faired)[2] = NULL;
  g_autoptr (df_curve) c = NULL;
  g_auto (df_loop_result) r = { 0 };
  gsl_rng *rng = gsl_rng_alloc (gsl_rng_mt19937);
  df_fair_info info;

  gsl_rng_set (rng, 7);
  for (size_t i = 0; i < n; i++)
    {
      double a = 2 * G_PI * i / n;

      uv[i][0] = rho * cos (a) + gsl_ran_gaussian (rng, sigma);
      uv[i][1] = rho * sin (a) + gsl_ran_gaussian (rng, sigma);
    }
  gsl_rng_free (rng);
  fair_or_die (s, (const double (*)[2]) uv, n, 5 * sigma, &faired, &info);
  g_assert_true (info.met);
  c = df_test_curve (s, (const double (*)[2]) faired, n, true);
  df_test_measure (c, &r);
  df_assert_close (r.min_steering_radius, rho, 0.02, 0.0);
  df_assert_close (r.holonomy_rad, 0.0, 0.0, 1e-9);
  df_assert_close (r.total_geodesic_curvature_rad, 2 * G_PI, 0.0, 1e-4);
}

/* A tolerance of zero, below zero or not finite, one not small beside the loop, and too few
 * points are refused with DF_E_INPUT and a message (df-fair.h). */
static void
test_bad_input (void)
{
  g_autoptr (df_surface) s = df_test_graph ("0", -5, 5, -5, 5);
  const double uv[5][2] = { { 1, 0 }, { 0, 1 }, { -1, 0 }, { 0, -1 }, { 0.7, -0.7 } };
  const double bad[] = { 0.0, -1.0, NAN, INFINITY, 0.5 };
  double (*out)[2] = NULL;
  df_fair_info info;
  df_diag diag;

  for (guint i = 0; i < G_N_ELEMENTS (bad); i++)
    {
      g_assert_cmpint (df_fair_closed_loop (s, uv, 5, bad[i], &out, &info, &diag), ==,
                       DF_E_INPUT);
      g_assert_null (out);
      g_assert_cmpuint (strlen (diag.detail), >, 0);
    }
  g_assert_cmpint (df_fair_closed_loop (s, uv, 3, 0.01, &out, &info, &diag), ==, DF_E_INPUT);
  g_assert_null (out);
}

int
main (int argc, char **argv)
{
  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);
  g_test_add_func ("/core/fair/sphere-latitude", test_sphere_latitude);
  g_test_add_func ("/core/fair/plane-circle", test_plane_circle);
  g_test_add_func ("/core/fair/bad-input", test_bad_input);
  return g_test_run ();
}
