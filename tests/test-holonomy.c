/* test-holonomy.c: holonomy and enclosed curvature of loops against published results:
 * Gauss-Bonnet on spheres, tori, paraboloids, saddles, cones and bumps, the Foucault
 * pendulum, small-loop limits and the properties every holonomy must have. */
#include <gsl/gsl_sf_bessel.h>
#include <math.h>

#include "df-test.h"

/* Smooth loops given as points agree with the analytic value to this, at default tolerance. */
#define TOL_SMOOTH 1e-8

/* --- helpers --------------------------------------------------------------------------- */

static void
measure_points (const df_surface *s, const double (*uv)[2], size_t n, df_loop_result *r)
{
  g_autoptr (df_curve) c = df_test_curve (s, uv, n, true);

  df_test_measure (c, r);
}

/* n points on the chart ellipse centre (u0, v0), half-axes (a, b); dir = +1 counter-clockwise. */
static double (*ellipse_points (double u0, double v0, double a, double b, size_t n, int dir))[2]
{
  double (*uv)[2] = g_malloc (n * sizeof *uv);

  for (size_t i = 0; i < n; i++)
    {
      double th = dir * 2 * G_PI * i / n;

      uv[i][0] = u0 + a * cos (th);
      uv[i][1] = v0 + b * sin (th);
    }
  return uv;
}

/* Exact circle in the chart, centre c, radius rad: (c + rad(cos tau, sin tau)). */
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

/* Exact chart polygon: straight chart segments between corners, tau = corner index. */
typedef struct { double (*corners)[2]; size_t n; } polygon_data;

static void
polygon_fn (double tau, void *user, double p[2], double dp[2], double ddp[2])
{
  polygon_data *d = user;
  size_t i = (size_t) floor (tau);
  double f;

  if (i >= d->n)
    i = d->n - 1;
  f = tau - i;
  for (int k = 0; k < 2; k++)
    {
      double a = d->corners[i][k], b = d->corners[(i + 1) % d->n][k];

      p[k] = a + f * (b - a);
      dp[k] = b - a;
      ddp[k] = 0.0;
    }
}

static df_curve *
polygon_curve (const df_surface *s, df_curve_coords coords, polygon_data *d)
{
  double *breaks = g_newa (double, d->n);
  df_curve *c = NULL;
  df_diag diag;

  for (size_t i = 1; i < d->n; i++)
    breaks[i - 1] = (double) i;
  g_assert_cmpint (df_curve_new_function (s, coords, 0.0, (double) d->n, breaks, d->n - 1, true,
                                          polygon_fn, d, &c, &diag), ==, DF_OK);
  return c;
}

/* --- sphere ------------------------------------------------------------------------------ */

static void
test_sphere_latitude (void)
{
  /* Radius 2 to show the result does not depend on the size. */
  g_autoptr (df_surface) s = df_test_revolution ("2*sin(t)", "2*cos(t)", 0, G_PI);
  const double thetas[] = { 0.05, 0.3, 0.7, 1.2, G_PI / 2, 2.0, 2.8, 3.1 };

  for (size_t k = 0; k < G_N_ELEMENTS (thetas); k++)
    {
      double theta = thetas[k], want;
      size_t n = 48;
      g_autofree double (*uv)[2] = g_malloc (n * sizeof *uv);
      g_auto (df_loop_result) r = { 0 };

      for (size_t i = 0; i < n; i++)
        {
          uv[i][0] = theta;
          uv[i][1] = 2 * G_PI * i / n;
        }
      measure_points (s, (const double (*)[2]) uv, n, &r);
      /* Latitude circle at polar angle theta encloses K dA = 2 pi (1 - cos theta), the cap on
       * its left: Gauss-Bonnet, do Carmo, Differential Geometry of Curves and Surfaces,
       * sec. 4-5 (from memory). */
      want = 2 * G_PI * (1 - cos (theta));
      g_assert_true (r.bounds_disc);
      g_assert_true (r.disc_on_left);
      df_assert_close (r.enclosed_curvature_rad, want, 0.0, TOL_SMOOTH);
      df_assert_close (df_wrap_angle (r.holonomy_rad - want), 0.0, 0.0, TOL_SMOOTH);
      /* Cap area 2 pi R^2 (1 - cos theta), Archimedes (from memory). */
      df_assert_close (r.area, 2 * G_PI * 4 * (1 - cos (theta)), 1e-9, 0.0);
      /* Circumference 2 pi R sin theta; k_g = cot(theta) / R (from memory). */
      df_assert_close (r.length, 2 * G_PI * 2 * sin (theta), 1e-9, 0.0);
      df_assert_close (r.total_geodesic_curvature_rad, 2 * G_PI * cos (theta), 0.0, TOL_SMOOTH);
      df_assert_close (r.residual_rad, 0.0, 0.0, TOL_SMOOTH);
      g_assert_cmpfloat (r.norm_drift, <, 1e-9);
    }
}

static void
test_foucault_pendulum (void)
{
  /* The Earth as a unit sphere with colatitude t. A pendulum's swing plane is carried
   * parallel along the latitude circle in one sidereal day, so relative to the ground it turns
   * by the holonomy 2 pi (1 - sin(lat)) = -2 pi sin(lat) (mod 2 pi): 360 deg sin(lat) per
   * sidereal day. At the Pantheon in Paris (lat 48.846 N) Foucault's 1851 pendulum turned
   * about 11.3 deg per hour, 271 deg a day (physical measurement, figures from memory). */
  g_autoptr (df_surface) s = df_test_revolution ("sin(t)", "cos(t)", 0, G_PI);
  double lat = 48.846 * G_PI / 180, colat = G_PI / 2 - lat;
  size_t n = 64;
  g_autofree double (*uv)[2] = g_malloc (n * sizeof *uv);
  g_auto (df_loop_result) r = { 0 };
  double per_day_deg;

  for (size_t i = 0; i < n; i++)
    {
      uv[i][0] = colat;
      uv[i][1] = 2 * G_PI * i / n;  /* eastward: the Earth's rotation */
    }
  measure_points (s, (const double (*)[2]) uv, n, &r);
  df_assert_close (df_wrap_angle (r.holonomy_rad + 2 * G_PI * sin (lat)), 0.0, 0.0, TOL_SMOOTH);
  /* The swing plane turns clockwise (seen from above) against the ground: -holonomy. */
  per_day_deg = 360.0 - r.holonomy_rad * 180 / G_PI;
  df_assert_close (per_day_deg, 271.0, 0.0, 1.0);
  df_assert_close (per_day_deg / 24.0, 11.3, 0.0, 0.05);
}

/* The octant triangle: north pole, down the meridian phi = 0, a quarter of the equator, back up
 * phi = pi/2. Three right angles, area pi/2 on the unit sphere: holonomy pi/2 (Gauss-Bonnet,
 * do Carmo sec. 4-5, from memory). In polar coordinates about the pole p = t (cos phi, sin phi). */
static void
octant_fn (double tau, void *user, double p[2], double dp[2], double ddp[2])
{
  const double q = G_PI / 2;

  (void) user;
  ddp[0] = ddp[1] = 0.0;
  if (tau <= q)
    {
      p[0] = tau; p[1] = 0; dp[0] = 1; dp[1] = 0;
    }
  else if (tau <= 2 * q)
    {
      double a = tau - q;

      p[0] = q * cos (a); p[1] = q * sin (a);
      dp[0] = -q * sin (a); dp[1] = q * cos (a);
      ddp[0] = -q * cos (a); ddp[1] = -q * sin (a);
    }
  else
    {
      double rho = 3 * q - tau;

      p[0] = 0; p[1] = rho; dp[0] = 0; dp[1] = -1;
    }
}

static void
test_sphere_octant_exact (void)
{
  g_autoptr (df_surface) s = df_test_revolution ("sin(t)", "cos(t)", 0, G_PI);
  const double breaks[] = { G_PI / 2, G_PI };
  g_autoptr (df_curve) c = NULL;
  g_auto (df_loop_result) r = { 0 };
  df_diag diag;

  g_assert_cmpint (df_curve_new_function (s, DF_COORDS_POLAR_MIN, 0, 3 * G_PI / 2, breaks, 2,
                                          true, octant_fn, NULL, &c, &diag), ==, DF_OK);
  df_test_measure (c, &r);
  df_assert_close (r.holonomy_rad, G_PI / 2, 0.0, TOL_SMOOTH);
  df_assert_close (r.enclosed_curvature_rad, G_PI / 2, 0.0, TOL_SMOOTH);
  df_assert_close (r.area, G_PI / 2, 0.0, 1e-8);
  /* All three sides are geodesics: the turning is the three corners, 3 pi / 2, and
   * int k_g ds = 0 (from memory). */
  df_assert_close (r.total_geodesic_curvature_rad, 0.0, 0.0, 1e-8);
  df_assert_close (r.length, 3 * G_PI / 2, 1e-10, 0.0);
}

static void
test_sphere_octant_points (void)
{
  /* The same triangle given as points: the spline rounds the corners a little, so the
   * result is as close as the interpolation allows; holonomy and enclosed curvature still
   * agree with each other to the tolerance of the method. */
  g_autoptr (df_surface) s = df_test_revolution ("sin(t)", "cos(t)", 0, G_PI);
  size_t n = 0, per = 200;
  g_autofree double (*uv)[2] = g_malloc (3 * per * sizeof *uv);
  g_auto (df_loop_result) r = { 0 };

  for (size_t i = 0; i < per; i++, n++)
    {
      uv[n][0] = G_PI / 2 * i / per;
      uv[n][1] = 0;
    }
  for (size_t i = 0; i < per; i++, n++)
    {
      uv[n][0] = G_PI / 2;
      uv[n][1] = G_PI / 2 * i / per;
    }
  for (size_t i = 0; i < per; i++, n++)
    {
      uv[n][0] = G_PI / 2 * (per - i) / per;
      uv[n][1] = G_PI / 2;
    }
  measure_points (s, (const double (*)[2]) uv, n, &r);
  df_assert_close (r.holonomy_rad, G_PI / 2, 0.0, 1e-4);
  df_assert_close (r.residual_rad, 0.0, 0.0, TOL_SMOOTH);
}

/* --- torus ------------------------------------------------------------------------------ */

static void
test_torus_rectangle (void)
{
  /* r = R + a cos t, z = -a sin t: K = cos t / (a (R + a cos t)) and
   * dA = a (R + a cos t) dt dphi, so K dA = cos t dt dphi (from memory; Gray, Modern
   * Differential Geometry of Curves and Surfaces, torus example). A chart rectangle
   * [t1, t2] x [p1, p2] encloses (sin t2 - sin t1)(p2 - p1). */
  g_autoptr (df_surface) s = df_test_revolution ("3 + cos(t)", "-sin(t)", -G_PI, G_PI);
  double corners[4][2] = { { -0.4, 0.2 }, { 1.1, 0.2 }, { 1.1, 1.5 }, { -0.4, 1.5 } };
  polygon_data d = { corners, 4 };
  g_autoptr (df_curve) c = polygon_curve (s, DF_COORDS_CHART, &d);
  g_auto (df_loop_result) r = { 0 };
  double want = (sin (1.1) - sin (-0.4)) * (1.5 - 0.2);

  df_test_measure (c, &r);
  df_assert_close (r.enclosed_curvature_rad, want, 0.0, TOL_SMOOTH);
  df_assert_close (df_wrap_angle (r.holonomy_rad - want), 0.0, 0.0, TOL_SMOOTH);
  /* Area a (R (t2 - t1) + a (sin t2 - sin t1)) (p2 - p1), from dA above. */
  df_assert_close (r.area, (3 * 1.5 + (sin (1.1) - sin (-0.4))) * 1.3, 1e-9, 0.0);
}

static void
test_torus_around_axis (void)
{
  /* A circle round the torus's axis bounds no disc on the torus, yet its holonomy is defined
   * and fixed by the circle's geodesic curvature. */
  g_autoptr (df_surface) s = df_test_revolution ("3 + cos(t)", "-sin(t)", -G_PI, G_PI);
  size_t n = 40;
  g_autofree double (*uv)[2] = g_malloc (n * sizeof *uv);
  g_auto (df_loop_result) r = { 0 };

  for (size_t i = 0; i < n; i++)
    {
      uv[i][0] = 0.7;
      uv[i][1] = 2 * G_PI * i / n;
    }
  measure_points (s, (const double (*)[2]) uv, n, &r);
  g_assert_false (r.bounds_disc);
  g_assert_cmpint (r.axis_winding, ==, 1);
  g_assert_true (strstr (r.disc_note, "no disc") != NULL);
  /* The tangent of a closed smooth curve comes back to itself, and the carried vector turns
   * by -int k_g ds against it (definition of k_g), so holonomy = -int k_g ds (mod 2 pi). */
  df_assert_close (df_wrap_angle (r.holonomy_rad + r.total_geodesic_curvature_rad), 0.0, 0.0,
                   TOL_SMOOTH);
  /* Parallel circle t0 of the torus: k_g = -sin(t0) / (R + a cos t0) here, so
   * int k_g ds = -2 pi sin t0 (by hand from Liouville's formula for a parallel, from memory). */
  df_assert_close (fabs (r.total_geodesic_curvature_rad), 2 * G_PI * sin (0.7), 0.0, TOL_SMOOTH);
}

static void
test_torus_across_seam (void)
{
  /* The profile r = R + a cos t, z = -a sin t closes up at t = +-pi, the torus's inner equator.
   * A chart disc of radius rho centred there encloses int cos t dt dphi
   * = -2 pi rho J1(rho) (Bessel's integral for the disc, from memory; J1 from GSL). */
  g_autoptr (df_surface) s = df_test_revolution ("3 + cos(t)", "-sin(t)", -G_PI, G_PI);
  const double rho = 0.6;
  circle_data d = { { G_PI, 0.5 }, rho };
  g_autoptr (df_curve) c = NULL;
  g_auto (df_loop_result) r = { 0 };
  double want = -2 * G_PI * rho * gsl_sf_bessel_J1 (rho);
  df_diag diag;

  g_assert_true (df_surface_u_periodic (s));
  g_assert_cmpint (df_curve_new_function (s, DF_COORDS_CHART, 0, 2 * G_PI, NULL, 0, true,
                                          circle_fn, &d, &c, &diag), ==, DF_OK);
  df_test_measure (c, &r);
  g_assert_true (r.bounds_disc);
  df_assert_close (r.enclosed_curvature_rad, want, 0.0, TOL_SMOOTH);
  df_assert_close (df_wrap_angle (r.holonomy_rad - want), 0.0, 0.0, TOL_SMOOTH);
}

static void
test_torus_round_the_tube (void)
{
  /* A meridian circle round the tube bounds no disc on the torus. Meridians of a surface of
   * revolution are geodesics (do Carmo sec. 4-4, from memory), so the carried tangent stays
   * the tangent: holonomy 0. */
  g_autoptr (df_surface) s = df_test_revolution ("3 + cos(t)", "-sin(t)", -G_PI, G_PI);
  size_t n = 48;
  g_autofree double (*uv)[2] = g_malloc (n * sizeof *uv);
  g_auto (df_loop_result) r = { 0 };

  for (size_t i = 0; i < n; i++)
    {
      uv[i][0] = -G_PI + 2 * G_PI * i / n;
      uv[i][1] = 1.0;
    }
  measure_points (s, (const double (*)[2]) uv, n, &r);
  g_assert_false (r.bounds_disc);
  g_assert_true (strstr (r.disc_note, "tube") != NULL);
  df_assert_close (r.holonomy_rad, 0.0, 0.0, TOL_SMOOTH);
  df_assert_close (r.length, 2 * G_PI, 1e-9, 0.0);
}

/* --- graphs: paraboloid, saddle, bump ----------------------------------------------------- */

static void
graph_circle (const df_surface *s, double rad, df_loop_result *r)
{
  circle_data d = { { 0, 0 }, rad };
  g_autoptr (df_curve) c = NULL;
  df_diag diag;

  g_assert_cmpint (df_curve_new_function (s, DF_COORDS_CHART, 0, 2 * G_PI, NULL, 0, true,
                                          circle_fn, &d, &c, &diag), ==, DF_OK);
  df_test_measure (c, r);
}

static void
test_paraboloid_cap (void)
{
  /* z = (x^2 + y^2) / (2 a): the Gauss map takes the disc of radius rho to the spherical cap
   * whose rim normal makes angle beta with the axis, tan beta = rho / a, so
   * int K dA = 2 pi (1 - cos beta) (Gauss map area, do Carmo sec. 3-3, from memory). */
  const double a = 1.5, rho = 2.0;
  g_autoptr (df_surface) s = df_test_graph ("(x^2 + y^2) / (2*1.5)", -3, 3, -3, 3);
  g_auto (df_loop_result) r = { 0 };
  double want = 2 * G_PI * (1 - 1 / sqrt (1 + rho * rho / (a * a)));

  graph_circle (s, rho, &r);
  df_assert_close (r.enclosed_curvature_rad, want, 0.0, TOL_SMOOTH);
  df_assert_close (df_wrap_angle (r.holonomy_rad - want), 0.0, 0.0, TOL_SMOOTH);
  /* Surface area of the paraboloid cap: (2 pi a^2 / 3)((1 + rho^2/a^2)^(3/2) - 1)
   * (calculus of surfaces of revolution, from memory). */
  df_assert_close (r.area, 2 * G_PI * a * a / 3 * (pow (1 + rho * rho / (a * a), 1.5) - 1),
                   1e-9, 0.0);
}

static void
test_saddle_cap (void)
{
  /* z = x y: K = -1 / (1 + x^2 + y^2)^2, dA = sqrt(1 + x^2 + y^2) dx dy; in polar coordinates
   * int K dA = -2 pi (1 - 1 / sqrt(1 + rho^2)) (integrated by hand). */
  const double rho = 1.3;
  g_autoptr (df_surface) s = df_test_graph ("x*y", -2, 2, -2, 2);
  g_auto (df_loop_result) r = { 0 };
  double want = -2 * G_PI * (1 - 1 / sqrt (1 + rho * rho));

  graph_circle (s, rho, &r);
  df_assert_close (r.enclosed_curvature_rad, want, 0.0, TOL_SMOOTH);
  df_assert_close (df_wrap_angle (r.holonomy_rad - want), 0.0, 0.0, TOL_SMOOTH);
}

static void
test_bump_flat_far_out (void)
{
  /* A Gaussian bump h exp(-(x^2+y^2)/(2 s^2)): the Gauss map of a disc of radius rho covers
   * the cap up to the rim normal's angle beta, tan beta = |f'(rho)|, and folds back over the
   * rest: int K dA = 2 pi (1 - cos beta), which tends to 0 as the surface flattens out (Gauss
   * map argument, from memory). At rho = 6 s, beta is tiny. */
  const double h = 0.8, sg = 1.0, rho = 6.0;
  g_autoptr (df_surface) s = df_test_graph ("0.8*exp(-(x^2+y^2)/2)", -7, 7, -7, 7);
  g_auto (df_loop_result) r = { 0 };
  double slope = h * rho / (sg * sg) * exp (-rho * rho / (2 * sg * sg));
  double want = 2 * G_PI * (1 - 1 / sqrt (1 + slope * slope));

  graph_circle (s, rho, &r);
  df_assert_close (r.enclosed_curvature_rad, want, 0.0, TOL_SMOOTH);
  g_assert_cmpfloat (fabs (r.enclosed_curvature_rad), <, 1e-9);
  df_assert_close (df_wrap_angle (r.holonomy_rad), 0.0, 0.0, TOL_SMOOTH);
}

/* --- cone ------------------------------------------------------------------------------- */

static void
test_cone_deficit (void)
{
  /* A cone of half-angle alpha is flat away from its apex, which carries the angle deficit
   * 2 pi (1 - sin alpha): unrolled, the cone is a sector of angle 2 pi sin alpha (from
   * memory). Any loop once round the apex has that holonomy. */
  const double alphas[] = { 15, 30, 60 };

  for (size_t k = 0; k < G_N_ELEMENTS (alphas); k++)
    {
      double al = alphas[k] * G_PI / 180, want = 2 * G_PI * (1 - sin (al));
      g_autofree char *rf = g_strdup_printf ("t*%.17g", sin (al));
      g_autofree char *zf = g_strdup_printf ("-t*%.17g", cos (al));
      g_autoptr (df_surface) s = df_test_revolution (rf, zf, 0, 2);
      size_t n = 40;
      g_autofree double (*uv)[2] = g_malloc (n * sizeof *uv);
      g_auto (df_loop_result) r = { 0 };

      /* A wobbly loop round the apex, not a parallel. */
      for (size_t i = 0; i < n; i++)
        {
          double ph = 2 * G_PI * i / n;

          uv[i][0] = 1.0 + 0.3 * sin (3 * ph);
          uv[i][1] = ph;
        }
      measure_points (s, (const double (*)[2]) uv, n, &r);
      g_assert_true (r.bounds_disc);
      df_assert_close (r.concentrated_rad, want, 1e-12, 0.0);
      df_assert_close (r.enclosed_curvature_rad, want, 0.0, TOL_SMOOTH);
      df_assert_close (df_wrap_angle (r.holonomy_rad - want), 0.0, 0.0, TOL_SMOOTH);
    }
}

/* --- limits and properties -------------------------------------------------------------- */

static void
test_small_loop_limit (void)
{
  /* Holonomy / area -> K at the centre as the loop shrinks (Gauss's characterisation of K,
   * from memory), here on a saddle and a torus, with error O(radius^2). */
  g_autoptr (df_surface) saddle = df_test_graph ("x*y", -2, 2, -2, 2);
  g_autoptr (df_surface) torus = df_test_revolution ("3 + cos(t)", "-sin(t)", -G_PI, G_PI);
  struct { df_surface *s; double u, v; } cases[] = { { saddle, 0.4, -0.3 }, { torus, 0.5, 1.0 } };

  for (size_t k = 0; k < G_N_ELEMENTS (cases); k++)
    {
      df_point_geometry geo;
      double eps = 1e-2;
      circle_data d = { { cases[k].u, cases[k].v }, eps };
      g_autoptr (df_curve) c = NULL;
      g_auto (df_loop_result) r = { 0 };
      df_diag diag;

      g_assert_cmpint (df_surface_geometry (cases[k].s, cases[k].u, cases[k].v, &geo, &diag),
                       ==, DF_OK);
      g_assert_cmpint (df_curve_new_function (cases[k].s, DF_COORDS_CHART, 0, 2 * G_PI, NULL, 0,
                                              true, circle_fn, &d, &c, &diag), ==, DF_OK);
      df_test_measure (c, &r);
      df_assert_close (r.holonomy_rad / r.area, geo.K, 1e-3, 0.0);
    }
}

static void
test_reverse_negates (void)
{
  g_autoptr (df_surface) s = df_test_graph ("0.3*sin(1.3*x)*cos(0.7*y) + 0.1*x*y", -3, 3, -3, 3);
  g_autofree double (*fwd)[2] = ellipse_points (0.2, -0.1, 1.7, 1.1, 120, 1);
  g_autofree double (*back)[2] = ellipse_points (0.2, -0.1, 1.7, 1.1, 120, -1);
  g_auto (df_loop_result) a = { 0 };
  g_auto (df_loop_result) b = { 0 };

  measure_points (s, (const double (*)[2]) fwd, 120, &a);
  measure_points (s, (const double (*)[2]) back, 120, &b);
  /* Reversing a loop inverts its transport map (GEOMETRY.md), so the holonomy and the signed
   * enclosed curvature change sign. */
  g_assert_cmpfloat (fabs (a.holonomy_rad), >, 1e-3);
  df_assert_close (b.holonomy_rad, -a.holonomy_rad, 0.0, TOL_SMOOTH);
  df_assert_close (b.enclosed_curvature_rad, -a.enclosed_curvature_rad, 0.0, TOL_SMOOTH);
  g_assert_true (a.disc_on_left);
  g_assert_false (b.disc_on_left);
  df_assert_close (a.residual_rad, 0.0, 0.0, TOL_SMOOTH);
  df_assert_close (b.residual_rad, 0.0, 0.0, TOL_SMOOTH);
}

static void
test_resample_invariant (void)
{
  /* The same smooth loop sampled with 300 and 1000 points: the spline converges like h^4, so
   * both measure the same curve to well within the stated accuracy (common practice, no
   * source: interpolation error estimate for cubic splines). */
  g_autoptr (df_surface) s = df_test_graph ("0.3*sin(1.3*x)*cos(0.7*y) + 0.1*x*y", -3, 3, -3, 3);
  g_autofree double (*a)[2] = ellipse_points (-0.3, 0.4, 1.2, 1.6, 300, 1);
  g_autofree double (*b)[2] = ellipse_points (-0.3, 0.4, 1.2, 1.6, 1000, 1);
  g_auto (df_loop_result) ra = { 0 };
  g_auto (df_loop_result) rb = { 0 };

  measure_points (s, (const double (*)[2]) a, 300, &ra);
  measure_points (s, (const double (*)[2]) b, 1000, &rb);
  df_assert_close (ra.holonomy_rad, rb.holonomy_rad, 0.0, TOL_SMOOTH);
  df_assert_close (ra.length, rb.length, 1e-9, 0.0);
  df_assert_close (ra.area, rb.area, 1e-9, 0.0);
}

static void
test_self_intersecting (void)
{
  /* A figure-eight still has a holonomy but bounds no simple disc. */
  g_autoptr (df_surface) s = df_test_graph ("0.2*(x^2 - y^2)", -2, 2, -2, 2);
  size_t n = 80;
  g_autofree double (*uv)[2] = g_malloc (n * sizeof *uv);
  g_auto (df_loop_result) r = { 0 };

  for (size_t i = 0; i < n; i++)
    {
      double th = 2 * G_PI * i / n;

      uv[i][0] = sin (th);
      uv[i][1] = 0.5 * sin (2 * th);
    }
  measure_points (s, (const double (*)[2]) uv, n, &r);
  g_assert_false (r.simple);
  g_assert_false (r.bounds_disc);
  g_assert_true (isfinite (r.holonomy_rad));
}

/* --- path dependence ------------------------------------------------------------------- */

static df_curve *
path_curve (const df_surface *s, df_curve_coords coords, polygon_data *d)
{
  double *breaks = g_newa (double, d->n);
  df_curve *c = NULL;
  df_diag diag;

  for (size_t i = 1; i + 1 < d->n; i++)
    breaks[i - 1] = (double) i;
  g_assert_cmpint (df_curve_new_function (s, coords, 0.0, (double) (d->n - 1), breaks, d->n - 2,
                                          false, polygon_fn, d, &c, &diag), ==, DF_OK);
  return c;
}

static void
test_plane_path_independent (void)
{
  /* On a plane (tilted or not) K = 0 and transport is path independent (from memory). */
  g_autoptr (df_surface) s = df_test_graph ("0.3*x + 0.2*y", -2, 2, -2, 2);
  double a_pts[3][2] = { { -1, -1 }, { 1, -1 }, { 1, 1 } };
  double b_pts[4][2] = { { -1, -1 }, { -1.5, 0.5 }, { 0, 1.5 }, { 1, 1 } };
  polygon_data da = { a_pts, 3 }, db = { b_pts, 4 };
  g_autoptr (df_curve) a = path_curve (s, DF_COORDS_CHART, &da);
  g_autoptr (df_curve) b = path_curve (s, DF_COORDS_CHART, &db);
  double angle = 1.0;
  df_diag diag;

  g_assert_cmpint (df_compare_paths (a, b, NULL, NULL, &angle, NULL, NULL, &diag), ==, DF_OK);
  df_assert_close (angle, 0.0, 0.0, 1e-10);
}

static void
test_sphere_two_paths (void)
{
  /* From (equator, phi = 0) to (equator, phi = pi/2): A along the equator, B over the north
   * pole. A then B reversed runs counter-clockwise round the octant triangle (holonomy pi/2,
   * Gauss-Bonnet), so the vector carried along A is the one carried along B turned by +pi/2:
   * from A's to B's the angle is -pi/2 (derived from the octant result, do Carmo sec. 4-5). */
  g_autoptr (df_surface) s = df_test_revolution ("sin(t)", "cos(t)", 0, G_PI);
  const double q = G_PI / 2;
  double b_pts[3][2] = { { q, 0 }, { 0, 0 }, { 0, q } };  /* polar p = t (cos phi, sin phi) */
  polygon_data db = { b_pts, 3 };
  circle_data d = { { 0, 0 }, q };     /* A, the equator arc: p = q (cos tau, sin tau) */
  g_autoptr (df_curve) a = NULL;
  g_autoptr (df_curve) b = path_curve (s, DF_COORDS_POLAR_MIN, &db);
  double angle = 0.0;
  df_diag diag;

  g_assert_cmpint (df_curve_new_function (s, DF_COORDS_POLAR_MIN, 0, q, NULL, 0, false,
                                          circle_fn, &d, &a, &diag), ==, DF_OK);
  g_assert_cmpint (df_compare_paths (a, b, NULL, NULL, &angle, NULL, NULL, &diag), ==, DF_OK);
  df_assert_close (angle, -G_PI / 2, 0.0, TOL_SMOOTH);
}

static void
test_compare_mismatched_ends (void)
{
  g_autoptr (df_surface) s = df_test_graph ("x*y", -2, 2, -2, 2);
  double a_pts[2][2] = { { 0, 0 }, { 1, 0 } };
  double b_pts[2][2] = { { 0, 0 }, { 1, 0.5 } };
  polygon_data da = { a_pts, 2 }, db = { b_pts, 2 };
  g_autoptr (df_curve) a = path_curve (s, DF_COORDS_CHART, &da);
  g_autoptr (df_curve) b = path_curve (s, DF_COORDS_CHART, &db);
  double angle;
  df_diag diag;

  g_assert_cmpint (df_compare_paths (a, b, NULL, NULL, &angle, NULL, NULL, &diag), ==,
                   DF_E_INPUT);
  g_assert_true (strstr (diag.detail, "end") != NULL);
}

int
main (int argc, char **argv)
{
  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);
  g_test_add_func ("/core/holonomy/sphere-latitude", test_sphere_latitude);
  g_test_add_func ("/core/holonomy/foucault-pendulum", test_foucault_pendulum);
  g_test_add_func ("/core/holonomy/sphere-octant-exact", test_sphere_octant_exact);
  g_test_add_func ("/core/holonomy/sphere-octant-points", test_sphere_octant_points);
  g_test_add_func ("/core/holonomy/torus-rectangle", test_torus_rectangle);
  g_test_add_func ("/core/holonomy/torus-around-axis", test_torus_around_axis);
  g_test_add_func ("/core/holonomy/torus-across-seam", test_torus_across_seam);
  g_test_add_func ("/core/holonomy/torus-round-the-tube", test_torus_round_the_tube);
  g_test_add_func ("/core/holonomy/paraboloid-cap", test_paraboloid_cap);
  g_test_add_func ("/core/holonomy/saddle-cap", test_saddle_cap);
  g_test_add_func ("/core/holonomy/bump-flat-far-out", test_bump_flat_far_out);
  g_test_add_func ("/core/holonomy/cone-deficit", test_cone_deficit);
  g_test_add_func ("/core/holonomy/small-loop-limit", test_small_loop_limit);
  g_test_add_func ("/core/holonomy/reverse-negates", test_reverse_negates);
  g_test_add_func ("/core/holonomy/resample-invariant", test_resample_invariant);
  g_test_add_func ("/core/holonomy/self-intersecting", test_self_intersecting);
  g_test_add_func ("/core/holonomy/plane-path-independent", test_plane_path_independent);
  g_test_add_func ("/core/holonomy/sphere-two-paths", test_sphere_two_paths);
  g_test_add_func ("/core/holonomy/compare-mismatched-ends", test_compare_mismatched_ends);
  return g_test_run ();
}
