/* test-green.c: the enclosed curvature by Green's theorem (df-green) on features a single
 * global fit cannot follow: narrow Gaussian bumps up to height/width 10, centred and
 * off-centre, and a C2 piecewise-polynomial graph, each against the closed form for a radial
 * graph; the error estimate against the true error; the regression from issue 6 (a steep bump
 * that made `measure` fail); the wrap of a half-turn holonomy to +pi; and a loop whose
 * enclosed curvature cannot be computed (a hole in the formula inside it) still measuring. */
#include <math.h>
#include <string.h>

#include "df-glib.h"
#include "df-test.h"

/* Closed form for a radial graph z = f(rho): the Gauss map takes the disc of radius rho onto
 * the spherical cap bounded by the rim normal's angle beta, tan beta = |f'(rho)|, covering the
 * folds back and forth with opposite signs, so int K dA = 2 pi (1 - 1 / sqrt(1 + f'(rho)^2))
 * (area of the Gauss image; do Carmo, Differential Geometry of Curves and Surfaces, sec. 3-3,
 * from memory). */
static double
radial_total_curvature (double slope)
{
  return 2 * G_PI * (1 - 1 / sqrt (1 + slope * slope));
}

/* Exact chart circle, centre c, radius rad. */
typedef struct { double c[2], rad; } circle_data;

static void
circle_fn (double tau, void *user, double p[2], double dp[2], double ddp[2])
{
  circle_data *d = user;

  p[0] = d->c[0] + d->rad * cos (tau);
  p[1] = d->c[1] + d->rad * sin (tau);
  dp[0] = -d->rad * sin (tau);
  dp[1] = d->rad * cos (tau);
  ddp[0] = -d->rad * cos (tau);
  ddp[1] = -d->rad * sin (tau);
}

static void
measure_circle (const df_surface *s, double cx, double cy, double rad, df_loop_result *r)
{
  circle_data d = { { cx, cy }, rad };
  g_autoptr (df_curve) c = NULL;
  df_diag diag;

  g_assert_cmpint (df_curve_new_function (s, DF_COORDS_CHART, 0, 2 * G_PI, NULL, 0, true,
                                          circle_fn, &d, &c, &diag), ==, DF_OK);
  df_test_measure (c, r);
}

/* The checks every case shares: the value against the closed form, the estimate honest
 * (not below the true error, allowing for the closed form's own rounding) and small, and
 * Gauss-Bonnet against the independent transport. */
static void
check_enclosed (const df_loop_result *r, double want)
{
  g_assert_true (r->bounds_disc);
  g_assert_true (r->enclosed_available);
  df_assert_close (r->enclosed_curvature_rad, want, 0.0, 1e-9);
  g_assert_cmpfloat (fabs (r->enclosed_curvature_rad - want), <=,
                     10 * r->enclosed_error_rad + 1e-13);
  g_assert_cmpfloat (r->enclosed_error_rad, <, 1e-8);
  df_assert_close (df_wrap_angle (r->holonomy_rad - want), 0.0, 0.0, 1e-8);
  g_assert_cmpstr (r->enclosed_note, ==, "");
}

static void
test_narrow_bump_centred (void)
{
  /* f = A exp(-rho^2 / (2 w^2)), f'(rho) = -(A rho / w^2) exp(-rho^2 / (2 w^2)), w = 0.5 and
   * A / w = 1, 4, 10; circles of 1, 2 and 4 widths: the inner and outer parts of the Gauss
   * image cancel more the further out the circle is. */
  const double w = 0.5, ratios[] = { 1, 4, 10 }, widths[] = { 1, 2, 4 };

  for (size_t i = 0; i < G_N_ELEMENTS (ratios); i++)
    {
      double A = ratios[i] * w;
      g_autofree char *f = g_strdup_printf ("%.17g*exp(-(x^2 + y^2)/(2*%.17g^2))", A, w);
      g_autoptr (df_surface) s = df_test_graph (f, -5, 5, -5, 5);

      for (size_t k = 0; k < G_N_ELEMENTS (widths); k++)
        {
          double rho = widths[k] * w;
          double slope = A * rho / (w * w) * exp (-rho * rho / (2 * w * w));
          g_auto (df_loop_result) r = { 0 };

          g_test_message ("A/w = %g, rho = %g w", ratios[i], widths[k]);
          measure_circle (s, 0, 0, rho, &r);
          check_enclosed (&r, radial_total_curvature (slope));
        }
    }
}

static void
test_narrow_bump_off_centre (void)
{
  /* The same bumps moved to (1.3, -0.7) with the circle round them (the closed form is
   * translation-invariant), and circles whose centre is off the bump by 0.9 but which hold it
   * with room: at 8 widths from the bump's centre f' is below 1e-11, so the closed form is
   * that of the whole plane, 0 to 1e-21, and the positive cap and the negative ring must
   * cancel to the tolerance. */
  const double w = 0.5, ratios[] = { 4, 10 }, bx = 1.3, by = -0.7;

  for (size_t i = 0; i < G_N_ELEMENTS (ratios); i++)
    {
      double A = ratios[i] * w, rho = 2 * w;
      double slope = A * rho / (w * w) * exp (-rho * rho / (2 * w * w));
      g_autofree char *f = g_strdup_printf ("%.17g*exp(-((x - %.17g)^2 + (y - %.17g)^2)"
                                            "/(2*%.17g^2))", A, bx, by, w);
      g_autoptr (df_surface) s = df_test_graph (f, -8, 8, -8, 8);
      g_auto (df_loop_result) r = { 0 };
      g_auto (df_loop_result) r2 = { 0 };
      double far = 8 * w + 0.9, far_slope = A * 8 / w * exp (-32.0);

      g_test_message ("A/w = %g", ratios[i]);
      measure_circle (s, bx, by, rho, &r);
      check_enclosed (&r, radial_total_curvature (slope));
      g_assert_cmpfloat (far_slope, <, 1e-11);
      measure_circle (s, bx + 0.9 * cos (0.4), by + 0.9 * sin (0.4), far, &r2);
      check_enclosed (&r2, radial_total_curvature (far_slope));
    }
}

static void
test_piecewise_polynomial (void)
{
  /* A C2 piecewise polynomial: f = c max(R^2 - rho^2, 0)^3, written with abs since the formula
   * language has no max; f'(rho) = -6 c rho (R^2 - rho^2)^2 inside, 0 outside. K has a kink on
   * rho = R, inside the loops' boxes. R = 1, c = 2: a cap of height 2. */
  const double R = 1.0, c = 2.0, radii[] = { 0.3, 0.6, 0.85 };
  g_autoptr (df_surface) s = df_test_graph ("2*((1 - x^2 - y^2 + abs(1 - x^2 - y^2))/2)^3",
                                            -2, 2, -2, 2);

  for (size_t k = 0; k < G_N_ELEMENTS (radii); k++)
    {
      double rho = radii[k], slope = 6 * c * rho * pow (R * R - rho * rho, 2);
      g_auto (df_loop_result) r = { 0 };

      g_test_message ("rho = %g", rho);
      measure_circle (s, 0, 0, rho, &r);
      check_enclosed (&r, radial_total_curvature (slope));
    }
  {
    /* Round the whole support, centred and off-centre: f' = 0 at the rim, so 0 exactly. */
    g_auto (df_loop_result) r = { 0 };
    g_auto (df_loop_result) r2 = { 0 };

    measure_circle (s, 0, 0, 1.4, &r);
    check_enclosed (&r, 0.0);
    measure_circle (s, 0.25, -0.15, 1.5, &r2);
    check_enclosed (&r2, 0.0);
  }
}

static void
test_steep_bump_regression (void)
{
  /* Issue 6: a bump of height 5 and width 0.5 inside a 200-point loop of radius 3 made the
   * measurement fail ("an integrand along the path failed"). Now it gives the closed form
   * above as far as the spline through the points allows. */
  g_autoptr (df_surface) s = df_test_graph ("5*exp(-(x^2 + y^2)/(2*0.5^2))", -10, 10, -10, 10);
  double uv[200][2], slope = 5 * 3 / 0.25 * exp (-18.0);
  g_autoptr (df_curve) c = NULL;
  g_auto (df_loop_result) r = { 0 };

  for (int i = 0; i < 200; i++)
    {
      uv[i][0] = 3 * cos (2 * G_PI * i / 200);
      uv[i][1] = 3 * sin (2 * G_PI * i / 200);
    }
  c = df_test_curve (s, (const double (*)[2]) uv, 200, true);
  df_test_measure (c, &r);
  g_assert_true (r.enclosed_available);
  df_assert_close (r.enclosed_curvature_rad, radial_total_curvature (slope), 0.0, 1e-9);
  df_assert_close (r.residual_rad, 0.0, 0.0, 1e-9);
}

static void
test_green_error_estimate (void)
{
  /* The line integral alone: the closed integral of dv round a 40-point spline loop winding
   * once round a cone's axis is exactly 2 pi (the spline's phi gains one period), a case where
   * GSL's QAG stopped with "roundoff" at 2e-6. */
  g_autoptr (df_surface) s = df_test_revolution ("t*0.5", "-t*0.86602540378443865", 0, 2);
  double uv[40][2];
  g_autoptr (df_curve) c = NULL;
  g_auto (df_loop_result) r = { 0 };

  for (int i = 0; i < 40; i++)
    {
      double ph = 2 * G_PI * i / 40;

      uv[i][0] = 1.0 + 0.3 * sin (3 * ph);
      uv[i][1] = ph;
    }
  c = df_test_curve (s, (const double (*)[2]) uv, 40, true);
  df_test_measure (c, &r);
  /* K = 0 off the apex; the apex of a 30 degree cone carries 2 pi (1 - sin 30) = pi (the
   * unrolled cone is a half disc, from memory). H = 1 - sin(alpha) is constant, so the
   * enclosed value is (1 - sin alpha) times the closed integral of dphi. */
  df_assert_close (r.enclosed_curvature_rad, G_PI, 0.0, 1e-12);
  g_assert_cmpfloat (r.enclosed_error_rad, <, 1e-10);
}

static void
test_wrap_half_turn (void)
{
  /* The documented range is (-pi, pi]: a half-turn is +pi whichever side rounding puts it. */
  g_assert_cmpfloat (df_wrap_angle (-G_PI), ==, G_PI);
  g_assert_cmpfloat (df_wrap_angle (G_PI), ==, G_PI);
  g_assert_cmpfloat (df_wrap_angle (nextafter (-G_PI, 0.0)), ==, G_PI);
  g_assert_cmpfloat (df_wrap_angle (-G_PI + 4e-16), ==, G_PI);
  g_assert_cmpfloat (df_wrap_angle (3 * G_PI), ==, G_PI);
  g_assert_cmpfloat (df_wrap_angle (-3 * G_PI), ==, G_PI);
  g_assert_cmpfloat (df_wrap_angle (nextafter (G_PI, 4.0)), ==, G_PI);
  /* Away from the end nothing moves. */
  g_assert_cmpfloat (df_wrap_angle (-G_PI + 1e-9), ==, -G_PI + 1e-9);
  g_assert_cmpfloat (df_wrap_angle (0.5), ==, 0.5);
  df_assert_close (df_wrap_angle (2 * G_PI + 0.5), 0.5, 0.0, 1e-15);
}

static void
test_cone_half_turn (void)
{
  /* Issue 6: on the 30 degree cone preset a loop round the apex read -180 degrees beside an
   * enclosed +180. The apex holds 2 pi (1 - sin 30 deg) = pi (from memory): the holonomy must
   * read +pi, as the enclosed curvature does. */
  g_autoptr (df_surface) s = df_test_revolution ("t*0.5", "100 - t*0.86602540378443865", 0,
                                                 115.47005383792515);
  double uv[100][2];
  g_autoptr (df_curve) c = NULL;
  g_auto (df_loop_result) r = { 0 };

  for (int i = 0; i < 100; i++)
    {
      uv[i][0] = 50;
      uv[i][1] = 2 * G_PI * i / 100;
    }
  c = df_test_curve (s, (const double (*)[2]) uv, 100, true);
  df_test_measure (c, &r);
  g_assert_cmpfloat (r.holonomy_rad, >, 0.0);
  df_assert_close (r.holonomy_rad, G_PI, 0.0, 1e-9);
  df_assert_close (r.enclosed_curvature_rad, G_PI, 0.0, 1e-9);
  g_assert_cmpfloat (r.holonomy_rad, <=, G_PI);
}

/* The null-with-note path on a genuine input: a graph with a small hole where the formula has
 * no value, z = sqrt(rho^2 - eps^2) for rho < eps, centred between the nodes of the 97 x 97 grid
 * the surface is checked on (spacing 20/96, the hole's centre 0.147 from the nearest node,
 * eps = 0.1), so the surface is accepted; a circle of radius 0.5 round it. The transport only
 * goes along the circle and measures; Green's inner integrals run across the enclosed region
 * and meet the hole, so the enclosed curvature is null with the reason in the note and the
 * measurement still succeeds. The holonomy of a parallel of a surface of revolution is
 * 2 pi - int k_g ds = 2 pi (1 - 1 / sqrt(1 + f'(rho)^2)) (k_g = 1 / (rho sqrt(1 + f'^2)), do
 * Carmo, Differential Geometry of Curves and Surfaces, sec. 4-4, from memory); here
 * f' = rho / sqrt(rho^2 - eps^2). */
static void
test_enclosed_null_with_note (void)
{
  const double eps = 0.1, rho = 0.5, h = 20.0 / 96, cx = 0.5 * h, cy = 1.5 * h;
  g_autofree char *f = g_strdup_printf ("sqrt((x - %.17g)^2 + (y - %.17g)^2 - %.17g^2)", cx, cy,
                                        eps);
  g_autoptr (df_surface) s = df_test_graph (f, -10, 10, -10, 10);
  g_auto (df_loop_result) r = { 0 };
  double slope = rho / sqrt (rho * rho - eps * eps);

  measure_circle (s, cx, cy, rho, &r);
  g_assert_true (r.bounds_disc);
  g_assert_false (r.enclosed_available);
  g_assert_nonnull (strstr (r.enclosed_note, "the enclosed curvature could not be computed"));
  g_assert_nonnull (strstr (r.enclosed_note, "sqrt"));
  df_assert_close (df_wrap_angle (r.holonomy_rad - radial_total_curvature (slope)), 0.0, 0.0,
                   1e-8);
}

int
main (int argc, char **argv)
{
  df_core_init ();
  g_test_init (&argc, &argv, NULL);
  g_test_add_func ("/green/narrow-bump/centred", test_narrow_bump_centred);
  g_test_add_func ("/green/narrow-bump/off-centre", test_narrow_bump_off_centre);
  g_test_add_func ("/green/piecewise-polynomial", test_piecewise_polynomial);
  g_test_add_func ("/green/steep-bump-regression", test_steep_bump_regression);
  g_test_add_func ("/green/line-integral-knots", test_green_error_estimate);
  g_test_add_func ("/green/wrap/half-turn", test_wrap_half_turn);
  g_test_add_func ("/green/wrap/cone-apex", test_cone_half_turn);
  g_test_add_func ("/green/enclosed-null-with-note", test_enclosed_null_with_note);
  return g_test_run ();
}
