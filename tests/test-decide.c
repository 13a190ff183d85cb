/* test-decide.c: the decision layer (units, limits with their source, verdicts, darts and
 * gores, the developability map) against closed forms; each source is named beside its check. */
#include <math.h>
#include <string.h>

#include <glib/gstdio.h>
#include <gsl/gsl_integration.h>

#include "df-decide-out.h"
#include "df-devmap.h"
#include "df-gores.h"
#include "df-limits-file.h"
#include "df-test.h"
#include "df-units.h"
#include "df-verdict.h"
#include "df-verdict-curves.h"
#include "df-verdict-region.h"
#include "df-units-convert.h"

#define R_SPHERE 100.0

static df_surface *
sphere (void)
{
  char r[64], z[64];

  g_snprintf (r, sizeof r, "%g*sin(t)", R_SPHERE);
  g_snprintf (z, sizeof z, "%g*cos(t)", R_SPHERE);
  return df_test_revolution (r, z, 0.0, G_PI);
}

static void
test_units (void)
{
  /* The international inch is 25.4 mm exactly (1959 agreement, from memory). */
  df_assert_close (df_unit_length (1.0, DF_UNIT_IN, DF_UNIT_MM), 25.4, 1e-15, 0.0);
  df_assert_close (df_unit_length (2500.0, DF_UNIT_MM, DF_UNIT_M), 2.5, 1e-15, 0.0);
  df_assert_close (df_unit_area (1.0, DF_UNIT_M, DF_UNIT_MM), 1e6, 1e-15, 0.0);
  /* K = 1e-4 / mm^2 (R = 100 mm) is 100 / m^2 (R = 0.1 m). */
  df_assert_close (df_unit_gaussian (1e-4, DF_UNIT_MM, DF_UNIT_M), 100.0, 1e-14, 0.0);
  df_assert_close (df_unit_curvature (0.01, DF_UNIT_MM, DF_UNIT_IN), 0.254, 1e-14, 0.0);
}

/* A latitude circle at polar angle theta on a sphere of radius R has k_g = cot(theta) / R and
 * k_n = 1 / R in magnitude (do Carmo, sec. 4-4, from memory). */
static void
test_latitude_kg (void)
{
  g_autoptr (df_surface) s = sphere ();
  const double theta = 0.7;
  double uv[64][2];
  g_autoptr (df_curve) c = NULL;
  g_auto (df_loop_result) r = { 0 };
  double want = 1.0 / (tan (theta) * R_SPHERE);

  for (int i = 0; i < 64; i++)
    {
      uv[i][0] = theta;
      uv[i][1] = -G_PI + 2.0 * G_PI * i / 64.0;
    }
  c = df_test_curve (s, (const double (*)[2]) uv, 64, true);
  df_test_measure (c, &r);
  for (size_t i = 0; i < r.n_samples; i += 17)
    {
      double k_g, k_n;

      g_assert_cmpint (df_curve_curvatures (c, r.samples[i].tau, &k_g, &k_n, NULL), ==, DF_OK);
      /* The spline through 64 points carries its interpolation error (about h^4). */
      df_assert_close (fabs (k_g), want, 1e-5, 0.0);
      df_assert_close (fabs (k_n), 1.0 / R_SPHERE, 1e-5, 0.0);
    }
}

/* A helix (a cos phi, a sin phi, b phi) on the cylinder of radius a is a geodesic (k_g = 0)
 * with normal curvature a / (a^2 + b^2), its whole curvature (do Carmo, sec. 1-5 ex. and
 * sec. 4-4, from memory). */
static void
test_helix (void)
{
  const double a = 50.0, b = 12.0;
  g_autoptr (df_surface) s = df_test_revolution ("50", "t", -200.0, 200.0);
  double uv[40][2];
  g_autoptr (df_curve) c = NULL;
  double tau0, tau1;

  for (int i = 0; i < 40; i++)
    {
      double phi = -2.0 + 0.1 * i;

      uv[i][0] = b * phi;
      uv[i][1] = phi;
    }
  c = df_test_curve (s, (const double (*)[2]) uv, 40, false);
  df_curve_get_range (c, &tau0, &tau1);
  for (int k = 0; k <= 10; k++)
    {
      double k_g, k_n;

      g_assert_cmpint (df_curve_curvatures (c, tau0 + (tau1 - tau0) * k / 10.0, &k_g, &k_n,
                                            NULL), ==, DF_OK);
      df_assert_close (k_g, 0.0, 0.0, 1e-10);
      df_assert_close (fabs (k_n), a / (a * a + b * b), 1e-9, 0.0);
    }
}

/* An ellipse x = A cos u, y = B sin u in the plane has curvature
 * k(u) = A B / (A^2 sin^2 u + B^2 cos^2 u)^(3/2) (from memory); it exceeds 1 / R_lim near the
 * ends of the major axis, where the steering radius is B^2 / A. The range ends found from the
 * samples must sit where k = 1 / R_lim, and their arc length must agree with GSL's quadrature of
 * the ellipse's speed (an independent reference). */
static double
ellipse_speed (double u, void *p)
{
  const double *ab = p;

  return hypot (ab[0] * sin (u), ab[1] * cos (u));
}

static void
test_verdict_ellipse (void)
{
  const double A = 80.0, B = 40.0, r_lim = 30.0;
  g_autoptr (df_surface) s = df_test_graph ("0", -100, 100, -100, 100);
  enum { N = 400 };
  static double uv[N][2];
  g_autoptr (df_curve) c = NULL;
  g_auto (df_loop_result) r = { 0 };
  g_autoptr (df_limits) lim = df_limits_new ();
  df_verdict_list list = { 0 };
  df_loop_options opt;
  double ab[2] = { A, B }, u_star, s_star, err;
  gsl_integration_workspace *ws = gsl_integration_workspace_alloc (200);
  gsl_function f = { ellipse_speed, ab };

  for (int i = 0; i < N; i++)
    {
      uv[i][0] = A * cos (2.0 * G_PI * i / N);
      uv[i][1] = B * sin (2.0 * G_PI * i / N);
    }
  c = df_test_curve (s, (const double (*)[2]) uv, N, true);
  df_loop_options_init (&opt);
  opt.n_samples = 300;
  g_assert_cmpint (df_loop_measure (c, &opt, &r, NULL), ==, DF_OK);
  df_limits_set (lim, DF_LIMIT_MIN_STEERING_RADIUS, r_lim, false, DF_UNIT_MM, "test");
  df_limits_set (lim, DF_LIMIT_TOW_WIDTH, 6.0, false, DF_UNIT_MM, "test");
  g_assert_cmpint (df_verdicts_measure (c, r.samples, r.n_samples, r.length, lim, &list, NULL),
                   ==, DF_OK);
  g_assert_cmpuint (list.n, ==, 2);
  g_assert_cmpuint (list.n_exceeded, ==, 2);

  /* k(u*) = 1 / r_lim: (A^2 sin^2 + B^2 cos^2)^(3/2) = A B r_lim. */
  u_star = asin (sqrt ((pow (A * B * r_lim, 2.0 / 3.0) - B * B) / (A * A - B * B)));
  gsl_integration_qags (&f, 0.0, u_star, 0.0, 1e-13, 200, ws, &s_star, &err);
  gsl_integration_workspace_free (ws);
  for (size_t k = 0; k < list.n; k++)
    {
      const df_verdict *v = &list.items[k];

      g_assert_false (v->within);
      g_assert_true (v->has_where);
      /* Worst: the vertex of the major axis, radius B^2 / A (from memory). */
      df_assert_close (v->value, B * B / A, 2e-3, 0.0);
      df_assert_close (v->threshold, r_lim, 1e-15, 0.0);
      g_assert_true (v->has_tow);
      df_assert_close (v->tow_compression, 6.0 / (2.0 * v->value), 1e-12, 0.0);
    }
  /* The loop starts at the vertex (A, 0): the first stretch runs through the start, from
   * L - s* to s*; the second is centred on the opposite vertex, L/2 -+ s*. */
  {
    const df_verdict *v0 = &list.items[0], *v1 = &list.items[1];
    const df_verdict *wrap = v0->s0 > v0->s1 ? v0 : v1, *mid = wrap == v0 ? v1 : v0;

    g_assert_true (wrap->s0 > wrap->s1);
    df_assert_close (wrap->s1, s_star, 1e-4, 0.0);
    df_assert_close (wrap->s0, r.length - s_star, 1e-4, 0.0);
    df_assert_close (mid->s0, r.length / 2 - s_star, 1e-4, 0.0);
    df_assert_close (mid->s1, r.length / 2 + s_star, 1e-4, 0.0);
  }
  df_verdict_list_clear (&list);

  /* A limit below the tightest bend: one verdict, within, with the worst radius. */
  df_limits_set (lim, DF_LIMIT_MIN_STEERING_RADIUS, 10.0, false, DF_UNIT_MM, NULL);
  g_assert_cmpint (df_verdicts_measure (c, r.samples, r.n_samples, r.length, lim, &list, NULL),
                   ==, DF_OK);
  g_assert_cmpuint (list.n, ==, 1);
  g_assert_true (list.items[0].within);
  g_assert_false (list.items[0].has_where);
  df_assert_close (list.items[0].value, B * B / A, 2e-3, 0.0);
  df_verdict_list_clear (&list);

  /* On a plane k_n = 0: any steering slips, |k_g / k_n| is unbounded (reported without a
   * value) and exceeded along the whole loop. */
  df_limits_set (lim, DF_LIMIT_FRICTION, 0.2, false, DF_UNIT_MM, NULL);
  g_assert_cmpint (df_verdicts_measure (c, r.samples, r.n_samples, r.length, lim, &list, NULL),
                   ==, DF_OK);
  g_assert_cmpuint (list.n, ==, 2);
  g_assert_true (list.items[1].limit == DF_LIMIT_FRICTION);
  g_assert_false (list.items[1].within);
  g_assert_false (list.items[1].has_value);
  df_assert_close (list.items[1].s1 - list.items[1].s0, r.length, 1e-12, 0.0);
  df_verdict_list_clear (&list);
}

/* A latitude circle whose steering radius R tan(theta) is under the limit everywhere: one
 * stretch, the whole loop. Its |k_g / k_n| = cot(theta) (the two closed forms above). */
static void
test_verdict_latitude (void)
{
  g_autoptr (df_surface) s = sphere ();
  const double theta = 0.5;
  double uv[64][2];
  g_autoptr (df_curve) c = NULL;
  g_auto (df_loop_result) r = { 0 };
  g_autoptr (df_limits) lim = df_limits_new ();
  df_verdict_list list = { 0 };

  for (int i = 0; i < 64; i++)
    {
      uv[i][0] = theta;
      uv[i][1] = -G_PI + 2.0 * G_PI * i / 64.0;
    }
  c = df_test_curve (s, (const double (*)[2]) uv, 64, true);
  df_test_measure (c, &r);
  df_limits_set (lim, DF_LIMIT_MIN_STEERING_RADIUS, 60.0, false, DF_UNIT_MM, NULL);
  df_limits_set (lim, DF_LIMIT_FRICTION, 2.5, false, DF_UNIT_MM, NULL);
  g_assert_cmpint (df_verdicts_measure (c, r.samples, r.n_samples, r.length, lim, &list, NULL),
                   ==, DF_OK);
  g_assert_cmpuint (list.n, ==, 2);
  g_assert_false (list.items[0].within);
  df_assert_close (list.items[0].s0, 0.0, 0.0, 1e-12);
  df_assert_close (list.items[0].s1, r.length, 1e-12, 0.0);
  df_assert_close (list.items[0].value, R_SPHERE * tan (theta), 1e-5, 0.0);
  /* cot(0.5) = 1.83 < 2.5: within. */
  g_assert_true (list.items[1].within);
  df_assert_close (list.items[1].value, 1.0 / tan (theta), 1e-5, 0.0);
  df_verdict_list_clear (&list);
}

/* A sphere of R = 100 mm measured, then shown in m: K = 1/R^2 at every sample is 1e-4 / mm^2 and
 * 100 / m^2 (a factor 1e-6 between them), k_g = cot(theta)/R (do Carmo, from memory) 1000 times
 * larger per m, lengths 1000 times smaller, the holonomy untouched. */
static void
test_units_convert_loop (void)
{
  g_autoptr (df_surface) s = sphere ();
  const double theta = 0.6;
  double uv[48][2];
  g_autoptr (df_curve) c = NULL;
  g_auto (df_loop_result) r = { 0 };
  double hol, len;

  for (int i = 0; i < 48; i++)
    {
      uv[i][0] = theta;
      uv[i][1] = -G_PI + 2.0 * G_PI * i / 48.0;
    }
  c = df_test_curve (s, (const double (*)[2]) uv, 48, true);
  df_test_measure (c, &r);
  hol = r.holonomy_rad;
  len = r.length;
  df_assert_close (r.samples[5].K, 1e-4, 1e-9, 0.0);
  df_loop_result_convert (&r, DF_UNIT_MM, DF_UNIT_M);
  df_assert_close (r.samples[5].K, 1.0 / (0.1 * 0.1), 1e-9, 0.0);
  df_assert_close (r.samples[5].k_g, 1.0 / (tan (theta) * 0.1), 1e-6, 0.0);
  df_assert_close (r.length, len / 1000, 1e-15, 0.0);
  df_assert_close (r.samples[5].point[2], 0.1 * cos (theta), 1e-12, 0.0);
  g_assert_cmpfloat (r.holonomy_rad, ==, hol);
}

/* An open latitude arc at polar angle theta of a sphere: k_g = cot(theta) / R (do Carmo,
 * from memory), so a fibre started along it and carried parallel falls behind its tangent by
 * cot(theta) s / R = cos(theta) phi: the path's fibre deviation at the arc's end, and the
 * stretch beyond a limit d starts at s0 = R tan(theta) d (d in radians). */
static void
test_verdict_path_latitude (void)
{
  g_autoptr (df_surface) s = sphere ();
  const double theta = 0.8, dphi = 1.2, d_deg = 10.0;
  double uv[41][2], length = 0.0;
  g_autoptr (df_curve) c = NULL;
  g_autoptr (df_limits) lim = df_limits_new ();
  df_verdict_list list = { 0 };

  for (int i = 0; i <= 40; i++)
    {
      uv[i][0] = theta;
      uv[i][1] = dphi * i / 40.0;
    }
  c = df_test_curve (s, (const double (*)[2]) uv, 41, false);
  df_limits_set (lim, DF_LIMIT_MIN_STEERING_RADIUS, 50.0, false, DF_UNIT_MM, NULL);
  df_limits_set (lim, DF_LIMIT_MAX_FIBRE_DEVIATION, d_deg, false, DF_UNIT_MM, NULL);
  g_assert_cmpint (df_verdicts_path (c, 400, lim, &list, &length, NULL), ==, DF_OK);
  g_assert_cmpint (list.kind, ==, DF_VERDICT_PATH);
  g_assert_cmpstr (df_verdict_curve_name (list.kind), ==, "path");
  df_assert_close (length, R_SPHERE * sin (theta) * dphi, 1e-9, 0.0);
  g_assert_cmpuint (list.n, ==, 2);
  /* R tan(0.8) = 102.96 > 50: within, the radius exact on the arc. */
  g_assert_true (list.items[0].within);
  df_assert_close (list.items[0].value, R_SPHERE * tan (theta), 1e-6, 0.0);
  g_assert_false (list.items[1].within);
  g_assert_cmpint (list.items[1].limit, ==, DF_LIMIT_MAX_FIBRE_DEVIATION);
  df_assert_close (list.items[1].value, cos (theta) * dphi * 180.0 / G_PI, 1e-6, 0.0);
  df_assert_close (list.items[1].s0, R_SPHERE * tan (theta) * d_deg * G_PI / 180.0, 1e-3, 0.0);
  df_assert_close (list.items[1].s1, length, 1e-12, 0.0);
  df_assert_close (list.items[1].s_worst, length, 1e-12, 0.0);
  df_verdict_list_clear (&list);
}

/* A geodesic's deviation from its start heading against the meridians (X_u). Clairaut's
 * relation (do Carmo sec. 4-4, from memory): r sin(psi) is constant along a geodesic of a
 * surface of revolution, psi its angle from the meridian. On a cylinder r is constant: the
 * geodesic (a helix) keeps its heading, no deviation. On the frustum r = 50 + t it drifts to
 * asin(r0 sin(psi0) / r). */
static void
test_verdict_geodesic_clairaut (void)
{
  g_autoptr (df_surface) cyl = df_test_revolution ("40", "-t", 0.0, 300.0);
  g_autoptr (df_surface) cone = df_test_revolution ("50 + t", "-t", 0.0, 300.0);
  g_autoptr (df_limits) lim = df_limits_new ();
  df_geodesic_result g = { 0 };
  df_verdict_list list = { 0 };
  const double psi0 = 70.0 * G_PI / 180.0;
  double r_end, worst = 0.0;

  df_limits_set (lim, DF_LIMIT_MAX_FIBRE_DEVIATION, 3.0, false, DF_UNIT_MM, NULL);
  df_limits_set (lim, DF_LIMIT_FRICTION, 0.1, false, DF_UNIT_MM, NULL);
  g_assert_cmpint (df_geodesic_shoot (cyl, 20.0, 0.0, psi0, 200.0, 400, &g, NULL), ==, DF_OK);
  g_assert_cmpint (df_verdicts_geodesic (cyl, &g, psi0, lim, &list, NULL), ==, DF_OK);
  g_assert_cmpint (list.kind, ==, DF_VERDICT_GEODESIC);
  g_assert_cmpuint (list.n, ==, 2);
  g_assert_true (list.items[0].within);
  g_assert_cmpfloat (list.items[0].value, <, 1e-7);
  /* k_g = 0 on a geodesic: the friction verdict holds by construction. */
  g_assert_true (list.items[1].exact);
  g_assert_cmpfloat (list.items[1].value, ==, 0.0);
  df_verdict_list_clear (&list);
  df_geodesic_result_clear (&g);

  g_assert_cmpint (df_geodesic_shoot (cone, 20.0, 0.0, psi0, 150.0, 400, &g, NULL), ==, DF_OK);
  g_assert_cmpint (df_verdicts_geodesic (cone, &g, psi0, lim, &list, NULL), ==, DF_OK);
  for (size_t i = 0; i < g.n_samples; i++)
    {
      double r = hypot (g.samples[i].point[0], g.samples[i].point[1]);

      worst = fmax (worst, fabs (psi0 - asin (70.0 * sin (psi0) / r)));
    }
  r_end = hypot (g.samples[g.n_samples - 1].point[0], g.samples[g.n_samples - 1].point[1]);
  g_assert_cmpfloat (r_end, >, 80.0);
  g_assert_false (list.items[0].within);
  df_assert_close (list.items[0].value, worst * 180.0 / G_PI, 1e-6, 0.0);
  g_assert_true (list.items[0].has_where);
  df_verdict_list_clear (&list);
  df_geodesic_result_clear (&g);
}

/* max-strain-percent over a loop's region on a sphere: every geodesic circle of radius a has
 * circumference 2 pi R sin(a/R) (Bertrand-Diguet-Puiseux; do Carmo sec. 4-6, from memory), so
 * the rim strain is 1 - sin(a/R)/(a/R) (about K a^2 / 6) wherever the disc lies. Without
 * patch-size, or on a loop that bounds no disc, it is not checked and says why. */
static void
test_verdict_strain_sphere (void)
{
  g_autoptr (df_surface) s = sphere ();
  g_autoptr (df_limits) lim = df_limits_new ();
  g_autoptr (df_curve) c = NULL;
  g_auto (df_loop_result) r = { 0 };
  df_verdict_list list = { 0 };
  double uv[48][2];
  const double a = 15.0, x = a / R_SPHERE;
  bool checked = true;
  char note[240];

  for (int i = 0; i < 48; i++)
    {
      uv[i][0] = G_PI / 2 + 0.4 * cos (2 * G_PI * i / 48);
      uv[i][1] = 0.4 * sin (2 * G_PI * i / 48);
    }
  c = df_test_curve (s, (const double (*)[2]) uv, 48, true);
  df_test_measure (c, &r);
  df_limits_set (lim, DF_LIMIT_MAX_STRAIN, 0.2, false, DF_UNIT_MM, "test");
  g_assert_cmpint (df_verdict_strain (c, &r, lim, 0, NULL, &list, &checked, note, sizeof note,
                                      NULL), ==, DF_OK);
  g_assert_false (checked);
  g_assert_nonnull (strstr (note, "patch-size"));
  g_assert_cmpuint (list.n, ==, 0);
  lim->patch_size = (df_length_setting) { .set = true, .value = a, .model_value = a };
  g_assert_cmpint (df_verdict_strain (c, &r, lim, 5, NULL, &list, &checked, note, sizeof note,
                                      NULL), ==, DF_OK);
  g_assert_true (checked);
  g_assert_cmpuint (list.n, ==, 1);
  g_assert_true (list.items[0].region);
  g_assert_false (list.items[0].has_where);
  df_assert_close (list.items[0].value, 100 * (1 - sin (x) / x), 1e-5, 0.0);
  g_assert_cmpfloat (list.items[0].signed_value, >, 0.0);
  /* 1 - sin(0.15)/0.15 = 0.374 % > 0.2 %. */
  g_assert_false (list.items[0].within);
  g_assert_cmpuint (list.n_exceeded, ==, 1);
  df_verdict_list_clear (&list);
}

/* Gores of a sphere from the pole to the equator: each has length pi R / 2 and flat area
 * 2 pi R^2 / n, the hemisphere's area shared out (Archimedes' hat-box theorem; GEOMETRY.md). */
static void
test_sphere_gores (void)
{
  g_autoptr (df_surface) s = sphere ();
  df_gores g;
  double (*pts)[2] = NULL, shoelace = 0.0, shoelace_seam = 0.0;
  size_t n_pts;
  const int n = 6;

  g_assert_cmpint (df_gores_compute (s, 0.0, G_PI / 2, n, 801, &g, NULL), ==, DF_OK);
  df_assert_close (g.length, G_PI * R_SPHERE / 2, 1e-12, 0.0);
  df_assert_close (g.area_each, 2 * G_PI * R_SPHERE * R_SPHERE / n, 1e-12, 0.0);
  df_assert_close (g.max_width, 2 * G_PI * R_SPHERE / n, 1e-12, 0.0);
  g_assert_cmpfloat (g.edge_strain, >, 0.0);

  /* The drawn outline encloses the same area (to the polygon's chord error). */
  g_assert_cmpint (df_gores_outline (&g, 0.0, &pts, &n_pts, NULL), ==, DF_OK);
  for (size_t i = 0; i < n_pts; i++)
    shoelace += pts[i][0] * pts[(i + 1) % n_pts][1] - pts[(i + 1) % n_pts][0] * pts[i][1];
  free (pts);
  df_assert_close (0.5 * shoelace, g.area_each, 1e-5, 0.0);
  /* A seam allowance d adds about d x perimeter. */
  g_assert_cmpint (df_gores_outline (&g, 2.0, &pts, &n_pts, NULL), ==, DF_OK);
  for (size_t i = 0; i < n_pts; i++)
    shoelace_seam += pts[i][0] * pts[(i + 1) % n_pts][1] - pts[(i + 1) % n_pts][0] * pts[i][1];
  free (pts);
  g_assert_cmpfloat (0.5 * shoelace_seam, >, g.area_each + 2.0 * 2.0 * g.length);
  df_gores_clear (&g);

  /* A graph has no gores. */
  {
    g_autoptr (df_surface) flat = df_test_graph ("0", -1, 1, -1, 1);

    g_assert_cmpint (df_gores_compute (flat, -0.5, 0.5, 4, 11, &g, NULL), ==, DF_E_INPUT);
  }
}

/* A cone of half-angle alpha develops flat into a sector of angle 2 pi sin(alpha) (from
 * memory). Two routes: narrow gores from the apex, each a triangle of apex angle
 * 2 atan(pi sin(alpha) / n), sum to it as n grows; and a loop round the apex encloses the apex's
 * 2 pi (1 - sin alpha), the one dart that leaves 2 pi sin(alpha) of flat sheet. */
static void
test_cone_development (void)
{
  const double alpha = 0.5, sa = sin (alpha);
  char r[64], z[64];
  g_autoptr (df_surface) s = NULL;
  df_gores g;
  const int n = 4000;
  double uv[48][2];
  g_autoptr (df_curve) c = NULL;
  g_auto (df_loop_result) res = { 0 };
  df_darts d;

  g_snprintf (r, sizeof r, "%.17g*t", sa);
  g_snprintf (z, sizeof z, "-%.17g*t", cos (alpha));
  s = df_test_revolution (r, z, 0.0, 100.0);
  g_assert_cmpint (df_gores_compute (s, 0.0, 100.0, n, 11, &g, NULL), ==, DF_OK);
  df_assert_close (g.length, 100.0, 1e-12, 0.0);
  df_assert_close (n * 2.0 * atan (g.half_width[g.n - 1] / g.s[g.n - 1]), 2 * G_PI * sa, 1e-6,
                   0.0);
  /* A cone is developable: gores need no stretch along the edge beyond rounding of the
   * straight edge (sqrt(1 + (pi sin a / n)^2) - 1). */
  df_assert_close (g.edge_strain, sqrt (1 + pow (G_PI * sa / n, 2)) - 1, 1e-6, 1e-15);
  df_gores_clear (&g);

  for (int i = 0; i < 48; i++)
    {
      uv[i][0] = 40.0;
      uv[i][1] = -G_PI + 2.0 * G_PI * i / 48.0;
    }
  c = df_test_curve (s, (const double (*)[2]) uv, 48, true);
  df_test_measure (c, &res);
  g_assert_true (res.bounds_disc);
  g_assert_cmpint (df_darts_compute (res.enclosed_curvature_rad, res.area, 1, &d, NULL), ==,
                   DF_OK);
  g_assert_false (d.gusset);
  df_assert_close (2 * G_PI - d.angle_each_rad, 2 * G_PI * sa, 1e-8, 0.0);
}

static void
test_darts_counts (void)
{
  int count;
  df_darts d;
  g_autoptr (df_surface) s = sphere ();
  int least;
  df_gores g;

  /* ceil(10 / 3) = 4 darts of 2.5 deg each. */
  g_assert_cmpint (df_darts_least_count (10.0 * G_PI / 180, 3.0 * G_PI / 180, &count, NULL), ==,
                   DF_OK);
  g_assert_cmpint (count, ==, 4);
  g_assert_cmpint (df_darts_least_count (6.0 * G_PI / 180, 3.0 * G_PI / 180, &count, NULL), ==,
                   DF_OK);
  g_assert_cmpint (count, ==, 2);
  g_assert_cmpint (df_darts_compute (-0.2, 100.0, 4, &d, NULL), ==, DF_OK);
  g_assert_true (d.gusset);
  df_assert_close (d.angle_each_rad, 0.05, 1e-15, 0.0);
  df_assert_close (d.length, sqrt (100.0 / G_PI), 1e-15, 0.0);
  g_assert_cmpint (df_darts_compute (0.1, 100.0, 0, &d, NULL), ==, DF_E_INPUT);

  /* The least gore count: its edge strain is within the limit, one fewer's is not. */
  g_assert_cmpint (df_gores_least_count (s, 0.0, G_PI / 2, 0.005, &least, NULL), ==, DF_OK);
  g_assert_cmpint (least, >, 1);
  g_assert_cmpint (df_gores_compute (s, 0.0, G_PI / 2, least, 201, &g, NULL), ==, DF_OK);
  g_assert_cmpfloat (g.edge_strain, <=, 0.005);
  df_gores_clear (&g);
  g_assert_cmpint (df_gores_compute (s, 0.0, G_PI / 2, least - 1, 201, &g, NULL), ==, DF_OK);
  g_assert_cmpfloat (g.edge_strain, >, 0.005);
  df_gores_clear (&g);
}

/* On a sphere of radius R a geodesic circle of radius a has circumference 2 pi R sin(a / R) and
 * encloses K dA = 2 pi (1 - cos(a / R)) (the spherical cap; Archimedes, do Carmo sec. 4-6);
 * for small a the rim strain 1 - sin(x)/x tends to K a^2 / 6 (Bertrand-Diguet-Puiseux). */
static void
test_geodesic_disc (void)
{
  g_autoptr (df_surface) s = sphere ();
  df_devmap_point p;
  const double a = 30.0, x = a / R_SPHERE, small = 2.0;

  g_assert_cmpint (df_devmap_at (s, G_PI / 2, 0.3, a, NULL, &p, NULL), ==, DF_OK);
  g_assert_true (p.ok);
  df_assert_close (p.circumference, 2 * G_PI * R_SPHERE * sin (x), 1e-7, 0.0);
  df_assert_close (p.enclosed_rad, 2 * G_PI * (1 - cos (x)), 1e-6, 0.0);
  df_assert_close (p.gauss_bonnet_rad, 2 * G_PI * (1 - cos (x)), 1e-5, 0.0);
  df_assert_close (p.area, 2 * G_PI * R_SPHERE * R_SPHERE * (1 - cos (x)), 1e-7, 0.0);
  df_assert_close (p.strain, 1 - sin (x) / x, 1e-6, 0.0);

  g_assert_cmpint (df_devmap_at (s, 1.0, -2.0, small, NULL, &p, NULL), ==, DF_OK);
  g_assert_true (p.ok);
  /* 1 - sin x / x = x^2/6 - x^4/120 + ...: the BDP term to x^4. */
  df_assert_close (p.strain, small * small / (6.0 * R_SPHERE * R_SPHERE), 1e-3, 0.0);

  /* A saddle z = (x^2 - y^2) / (2c): K = -1/c^2 at the origin, so the rim stretches: strain
   * about -a^2 / (6 c^2) (BDP with K < 0). */
  {
    g_autoptr (df_surface) saddle = df_test_graph ("(x^2 - y^2)/400", -50, 50, -50, 50);

    g_assert_cmpint (df_devmap_at (saddle, 0.0, 0.0, 2.0, NULL, &p, NULL), ==, DF_OK);
    g_assert_true (p.ok);
    df_assert_close (p.strain, -4.0 / (6.0 * 200.0 * 200.0), 2e-3, 0.0);
    g_assert_cmpfloat (p.enclosed_rad, <, 0.0);
  }

  /* A disc whose geodesics cross the pole: on the whole sphere it is the same cap as anywhere
   * (the geodesics run on through the pole). */
  g_assert_cmpint (df_devmap_at (s, 0.05, 0.0, 30.0, NULL, &p, NULL), ==, DF_OK);
  g_assert_true (p.ok);
  df_assert_close (p.enclosed_rad, 2 * G_PI * (1 - cos (x)), 1e-5, 0.0);

  /* A disc that would leave the surface is no disc (and no error): the plane's edge. */
  {
    g_autoptr (df_surface) plane = df_test_graph ("0", -10, 10, -10, 10);

    g_assert_cmpint (df_devmap_at (plane, 9.0, 0.0, 5.0, NULL, &p, NULL), ==, DF_OK);
    g_assert_false (p.ok);
  }
}

static void
test_devmap_grid_csv (void)
{
  g_autoptr (df_surface) s = sphere ();
  df_devmap map;
  df_devmap_options opt;
  g_autofree char *dir = g_dir_make_tmp ("df-decide-XXXXXX", NULL);
  g_autofree char *path = g_build_filename (dir, "map.csv", NULL);
  g_autofree char *text = NULL;
  g_autoptr (GError) error = NULL;
  g_auto (GStrv) lines = NULL;

  df_devmap_options_init (&opt);
  opt.n_directions = 16;
  opt.n_steps = 16;
  g_assert_cmpint (df_devmap_grid (s, 10.0, 4, 3, &opt, &map, NULL), ==, DF_OK);
  g_assert_cmpuint (map.n_ok, ==, 12);
  /* Written in m: circumference 2 pi R sin(a/R) mm / 1000. */
  g_assert_true (df_devmap_csv_write (path, s, &map, DF_UNIT_MM, DF_UNIT_M, &error));
  g_assert_no_error (error);
  g_assert_true (g_file_get_contents (path, &text, NULL, NULL));
  lines = g_strsplit (text, "\r\n", -1);
  g_assert_true (g_str_has_prefix (lines[0], "# developability map"));
  g_assert_nonnull (strstr (lines[1], "licensed engineering review"));
  g_assert_cmpstr (lines[2], ==, "u,v,x,y,z,enclosed_deg,strain_percent,circumference,area");
  {
    g_auto (GStrv) f = g_strsplit (lines[3], ",", -1);

    g_assert_cmpuint (g_strv_length (f), ==, 9);
    df_assert_close (g_ascii_strtod (f[7], NULL), 2 * G_PI * 0.1 * sin (0.1), 1e-6, 0.0);
  }
  df_devmap_clear (&map);
  g_remove (path);
  g_rmdir (dir);
}

static void
test_gores_svg (void)
{
  g_autoptr (df_surface) s = sphere ();
  df_gores g;
  g_autofree char *dir = g_dir_make_tmp ("df-decide-XXXXXX", NULL);
  g_autofree char *svg = g_build_filename (dir, "g.svg", NULL);
  g_autofree char *csv = g_build_filename (dir, "g.csv", NULL);
  g_autofree char *text = NULL;
  g_autoptr (GError) error = NULL;
  const char *w, *vb;
  double width, vb_w;

  g_assert_cmpint (df_gores_compute (s, 0.0, G_PI / 2, 8, 101, &g, NULL), ==, DF_OK);
  g_assert_true (df_gores_svg_write (svg, &g, DF_UNIT_MM, DF_UNIT_MM, 5.0, "sphere", &error));
  g_assert_no_error (error);
  g_assert_true (g_file_get_contents (svg, &text, NULL, NULL));
  /* True scale: width and height carry the unit and match the viewBox in user units. */
  w = strstr (text, "width=\"");
  vb = strstr (text, "viewBox=\"0 0 ");
  g_assert_nonnull (w);
  g_assert_nonnull (vb);
  width = g_ascii_strtod (w + 7, (char **) &w);
  g_assert_true (g_str_has_prefix (w, "mm\""));
  g_assert_nonnull (strstr (text, "height=\""));
  vb_w = g_ascii_strtod (vb + 13, NULL);
  df_assert_close (width, vb_w, 1e-12, 0.0);
  g_assert_cmpfloat (width, >, g.max_width);
  g_assert_nonnull (strstr (text, "licensed engineering review"));
  g_clear_pointer (&text, g_free);

  /* In metres SVG has no unit "m": written in cm, 100 cm to the user unit. */
  g_assert_true (df_gores_svg_write (svg, &g, DF_UNIT_MM, DF_UNIT_M, 0.0, "sphere", &error));
  g_assert_true (g_file_get_contents (svg, &text, NULL, NULL));
  w = strstr (text, "width=\"");
  vb = strstr (text, "viewBox=\"0 0 ");
  width = g_ascii_strtod (w + 7, (char **) &w);
  g_assert_true (g_str_has_prefix (w, "cm\""));
  df_assert_close (width, 100.0 * g_ascii_strtod (vb + 13, NULL), 1e-5, 0.0);
  g_clear_pointer (&text, g_free);

  g_assert_true (df_gores_csv_write (csv, &g, DF_UNIT_MM, DF_UNIT_IN, 0.0, &error));
  g_assert_true (g_file_get_contents (csv, &text, NULL, NULL));
  g_assert_nonnull (strstr (text, "outline,x,y\r\nsewing,"));
  g_assert_nonnull (strstr (text, " in^2"));
  df_gores_clear (&g);
  g_remove (svg);
  g_remove (csv);
  g_rmdir (dir);
}

static const char *project_head =
  "[surface]\nkind=revolution\nr=100*sin(t)\nz=100*cos(t)\nt-min=0\nt-max=pi\nunits=mm\n";

static df_project *
project_with (const char *extra, GError **error)
{
  g_autofree char *text = g_strconcat (project_head, extra, NULL);

  return df_project_from_data (text, "part.dfproj", error);
}

static void
test_limits_file (void)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_project) p = NULL;
  g_autoptr (df_project) again = NULL;
  g_autofree char *saved = NULL;
  static const struct
  {
    const char *text;
    const char *message;
  } bad[] = {
    { "[limits]\nfriction=-1\n", "part.dfproj: [limits] friction: '-1' must be positive" },
    { "[limits]\nfriction=abc\n", "part.dfproj: [limits] friction: 'abc' is not a number" },
    { "[limits]\nmin-steering-radius=nan\n", "[limits] min-steering-radius: 'nan' is not a "
      "finite number" },
    { "[limits]\nmin-steering-radius=20 ft\n", "[limits] min-steering-radius: unknown unit "
      "'ft'" },
    { "[limits]\nmax-shear-deg=30 mm\n", "[limits] max-shear-deg: '30 mm' should be a plain "
      "number" },
    { "[limits]\nmax-fibre-deviation-deg=200\n", "[limits] max-fibre-deviation-deg: '200' must "
      "lie between 0 and 180" },
    { "[limits]\nmax-strain-percent=0\n", "[limits] max-strain-percent: '0' must lie in" },
    { "[limits]\nfriction-source=trial\n", "[limits] friction-source: there is no friction" },
    { "[limits]\nspeed=3\n", "[limits] unknown key 'speed'" },
    { "[units]\nlength=ft\n", "[units] length: unknown unit 'ft'" },
    { "[units]\ncurvature=1/ft^2\n", "[units] curvature: '1/ft^2' is not one of" },
    { "[limits]\npatch-size=-2\n", "[limits] patch-size: '-2' is not a positive length" },
    { "[limits]\npatch-size=2 ft\n", "[limits] patch-size: unknown unit 'ft'" },
  };

  p = project_with ("[limits]\nmin-steering-radius=0.025 m\nmin-steering-radius-source=Trial "
                    "T-7, 2026\ntow-width=0.25 in\nfriction=0.2\npatch-size=2 cm\n[units]\nlength=in\n"
                    "curvature=1/m^2\n", &error);
  g_assert_no_error (error);
  g_assert_true (p->limits->item[DF_LIMIT_MIN_STEERING_RADIUS].set);
  df_assert_close (p->limits->item[DF_LIMIT_MIN_STEERING_RADIUS].model_value, 25.0, 1e-14, 0.0);
  df_assert_close (p->limits->item[DF_LIMIT_TOW_WIDTH].model_value, 6.35, 1e-14, 0.0);
  g_assert_cmpstr (p->limits->item[DF_LIMIT_MIN_STEERING_RADIUS].source, ==, "Trial T-7, 2026");
  g_assert_null (p->limits->item[DF_LIMIT_FRICTION].source);
  g_assert_false (p->limits->item[DF_LIMIT_MAX_SHEAR].set);
  g_assert_true (p->limits->has_length_unit && p->limits->length_unit == DF_UNIT_IN);
  g_assert_true (p->limits->has_curvature_unit && p->limits->curvature_unit == DF_UNIT_M);

  /* Written back as the user wrote it, and read back the same. */
  saved = df_project_to_data (p);
  g_assert_nonnull (strstr (saved, "min-steering-radius=0.025 m\n"));
  g_assert_nonnull (strstr (saved, "min-steering-radius-source=Trial T-7, 2026\n"));
  g_assert_nonnull (strstr (saved, "curvature=1/m^2\n"));
  g_assert_nonnull (strstr (saved, "patch-size=2 cm\n"));
  /* 2 cm in the surface's mm: 20 (10 mm to the cm, by definition). */
  df_assert_close (p->limits->patch_size.model_value, 20.0, 1e-14, 0.0);
  again = df_project_from_data (saved, "saved.dfproj", &error);
  g_assert_no_error (error);
  df_assert_close (again->limits->item[DF_LIMIT_TOW_WIDTH].model_value, 6.35, 1e-14, 0.0);
  g_assert_true (again->limits->has_length_unit);

  for (gsize i = 0; i < G_N_ELEMENTS (bad); i++)
    {
      g_autoptr (GError) e = NULL;
      g_autoptr (df_project) q = project_with (bad[i].text, &e);

      g_assert_null (q);
      g_assert_error (e, DF_IO_ERROR, e->code);
      if (strstr (e->message, bad[i].message) == NULL)
        g_error ("case %zu: message '%s' lacks '%s'", i, e->message, bad[i].message);
      g_assert_nonnull (strstr (e->message, "part.dfproj"));
    }

  /* A length with a unit cannot be related to a surface whose units are only a label. */
  {
    g_autoptr (GError) e = NULL;
    g_autoptr (df_project) q = df_project_from_data (
      "[surface]\nkind=revolution\nr=100*sin(t)\nz=100*cos(t)\nt-min=0\nt-max=pi\nunits=cubits\n"
      "[limits]\nmin-steering-radius=25 mm\n", "part.dfproj", &e);

    g_assert_null (q);
    g_assert_nonnull (strstr (e->message, "cannot be related"));
  }
}

int
main (int argc, char **argv)
{
  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);
  g_test_add_func ("/decide/units", test_units);
  g_test_add_func ("/decide/latitude-kg", test_latitude_kg);
  g_test_add_func ("/decide/helix", test_helix);
  g_test_add_func ("/decide/verdict-ellipse", test_verdict_ellipse);
  g_test_add_func ("/decide/verdict-latitude", test_verdict_latitude);
  g_test_add_func ("/decide/units-convert-loop", test_units_convert_loop);
  g_test_add_func ("/decide/verdict-path-latitude", test_verdict_path_latitude);
  g_test_add_func ("/decide/verdict-geodesic-clairaut", test_verdict_geodesic_clairaut);
  g_test_add_func ("/decide/verdict-strain-sphere", test_verdict_strain_sphere);
  g_test_add_func ("/decide/sphere-gores", test_sphere_gores);
  g_test_add_func ("/decide/cone-development", test_cone_development);
  g_test_add_func ("/decide/darts-counts", test_darts_counts);
  g_test_add_func ("/decide/geodesic-disc", test_geodesic_disc);
  g_test_add_func ("/decide/devmap-grid-csv", test_devmap_grid_csv);
  g_test_add_func ("/decide/gores-svg", test_gores_svg);
  g_test_add_func ("/decide/limits-file", test_limits_file);
  return g_test_run ();
}
