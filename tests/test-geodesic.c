/* test-geodesic.c: geodesics shot from a point and heading, against textbook facts: great circles
 * on a sphere, straight lines on planes, helices on a cylinder, Clairaut's relation on surfaces
 * of revolution, acceleration normal to the surface; and clean stops and input errors.
 * Surfaces are built from formulas here, so the tests do not depend on the presets. */
#include <math.h>
#include <string.h>

#include "df-glib.h"
#include "df-test.h"


/* ---- helpers ---- */

/* Shoots and insists on success; the samples must be finite, evenly spaced in s from 0 and
 * carry unit tangents (df-geodesic.h). */
static void
shoot_or_die (const df_surface *s, double u, double v, double heading, double length,
              size_t n, df_geodesic_result *res)
{
  df_diag diag;
  df_status st = df_geodesic_shoot (s, u, v, heading, length, n, res, &diag);

  if (st != DF_OK)
    g_error ("geodesic from (%g, %g): %s: %s", u, v, df_status_describe (st), diag.detail);
  g_assert_cmpuint (res->n_samples, >=, 2);
  g_assert_nonnull (res->samples);
  df_assert_close (res->samples[0].s, 0.0, 0.0, 0.0);
  df_assert_close (res->samples[0].u, u, 0.0, 0.0);
  for (size_t i = 0; i < res->n_samples; i++)
    {
      const df_geodesic_sample *p = &res->samples[i];

      for (int k = 0; k < 3; k++)
        {
          g_assert_true (isfinite (p->point[k]));
          g_assert_true (isfinite (p->tangent[k]));
        }
      df_assert_close (sqrt (p->tangent[0] * p->tangent[0] + p->tangent[1] * p->tangent[1]
                             + p->tangent[2] * p->tangent[2]), 1.0, 1e-12, 0.0);
      if (!res->stopped_early || i + 1 < res->n_samples)
        df_assert_close (p->s, length * i / (n - 1), 1e-12, 1e-14);
      if (i > 0)
        g_assert_cmpfloat (p->s, >, res->samples[i - 1].s);
    }
  df_assert_close (res->length, res->samples[res->n_samples - 1].s, 0.0, 0.0);
  if (!res->stopped_early)
    {
      g_assert_cmpuint (res->n_samples, ==, n);
      df_assert_close (res->length, length, 1e-12, 0.0);
    }
}

static double
dot3 (const double a[3], const double b[3])
{
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}

static void
cross3 (const double a[3], const double b[3], double out[3])
{
  out[0] = a[1] * b[2] - a[2] * b[1];
  out[1] = a[2] * b[0] - a[0] * b[2];
  out[2] = a[0] * b[1] - a[1] * b[0];
}

static double
dist3 (const double a[3], const double b[3])
{
  double d[3] = { a[0] - b[0], a[1] - b[1], a[2] - b[2] };

  return sqrt (dot3 (d, d));
}

/* ---- sphere ---- */

static void
test_great_circle (void)
{
  const double R = 2.0, t0 = G_PI / 2, phi0 = 0.4, heading = 1.2, L = 2 * G_PI * R;
  const size_t n = 401;
  g_autoptr (df_surface) s = df_test_revolution ("2*sin(t)", "2*cos(t)", 0.0, G_PI);
  g_auto (df_geodesic_result) res = { 0 };
  const df_geodesic_sample *first, *last, *half;
  double plane[3], want_t0[3];

  shoot_or_die (s, t0, phi0, heading, L, n, &res);
  g_assert_false (res.stopped_early);
  first = &res.samples[0];
  last = &res.samples[n - 1];
  half = &res.samples[(n - 1) / 2];

  /* Heading: on the equator X_t/|X_t| = (0, 0, -1) and N = (cos phi, sin phi, 0) outward, so
   * the heading's quarter turn about N is e_phi = (-sin phi, cos phi, 0) (GEOMETRY.md, derived
   * by hand). */
  want_t0[0] = -sin (heading) * sin (phi0);
  want_t0[1] = sin (heading) * cos (phi0);
  want_t0[2] = -cos (heading);
  for (int k = 0; k < 3; k++)
    df_assert_close (first->tangent[k], want_t0[k], 0.0, 1e-12);

  /* Geodesics of a sphere are great circles (do Carmo, Differential Geometry of Curves and
   * Surfaces, sec. 4-4, from memory): every point at distance R from the centre, in the plane
   * through the centre spanned by the start point and direction; after 2 pi R it is back
   * where it started, heading the same way, and half way round at the antipode. */
  cross3 (first->point, first->tangent, plane);
  for (int k = 0; k < 3; k++)
    plane[k] /= R;
  for (size_t i = 0; i < n; i++)
    {
      const df_geodesic_sample *p = &res.samples[i];

      df_assert_close (sqrt (dot3 (p->point, p->point)), R, 1e-9, 0.0);
      df_assert_close (dot3 (p->point, plane), 0.0, 0.0, 1e-8 * R);
      df_assert_close (dot3 (p->tangent, plane), 0.0, 0.0, 1e-8);
    }
  for (int k = 0; k < 3; k++)
    {
      df_assert_close (last->point[k], first->point[k], 0.0, 1e-7 * R);
      df_assert_close (last->tangent[k], first->tangent[k], 0.0, 1e-7);
      df_assert_close (half->point[k], -first->point[k], 0.0, 1e-7 * R);
    }
}

/* ---- Clairaut ---- */

/* Clairaut's relation: along a geodesic of a surface of revolution r cos(psi) is constant,
 * psi the angle with the parallel (do Carmo sec. 4-4, from memory). With a unit tangent T,
 * r cos(psi) = r (T . e_phi) = (X x T)_z, the signed form. Returns the spread of r along the
 * samples so the caller can insist the path was not a trivial circle. */
static double
check_clairaut (const df_geodesic_result *res, double want)
{
  double r_min = INFINITY, r_max = 0.0;

  for (size_t i = 0; i < res->n_samples; i++)
    {
      const df_geodesic_sample *p = &res->samples[i];
      double r = hypot (p->point[0], p->point[1]);
      double c = p->point[0] * p->tangent[1] - p->point[1] * p->tangent[0];

      df_assert_close (c, want, 1e-8, 1e-10);
      r_min = MIN (r_min, r);
      r_max = MAX (r_max, r);
    }
  return r_max - r_min;
}

static void
test_clairaut_torus (void)
{
  const double R = 3.0, a = 1.0, heading = 1.2;
  g_autoptr (df_surface) s = df_test_revolution ("3 + cos(t)", "-sin(t)", -G_PI, G_PI);
  g_auto (df_geodesic_result) res = { 0 };

  /* From the outer equator (t = 0, r = R + a) where X_t/|X_t| = (0, 0, -1) and N points out
   * of the tube, the heading's quarter turn is e_phi: r cos(psi) = (R + a) sin(heading)
   * (derived by hand). Then r stays in [(R + a) sin(heading), R + a], away from the chart's
   * ends at t = +-pi. */
  shoot_or_die (s, 0.0, 0.5, heading, 40.0, 801, &res);
  g_assert_false (res.stopped_early);
  g_assert_cmpfloat (check_clairaut (&res, (R + a) * sin (heading)), >, 0.1);
}

static void
test_clairaut_catenoid (void)
{
  const double t0 = -1.0, heading = 0.5;
  g_autoptr (df_surface) s = df_test_revolution ("cosh(t)", "t", -2.0, 2.0);
  g_auto (df_geodesic_result) res = { 0 };
  double spread;

  /* z increases with t here, so N points toward the axis; the heading's quarter turn about N
   * is still N x X_t/|X_t| = +e_phi (it is X_phi's part normal to X_t in any right-handed
   * chart), so r cos(psi) = cosh(t0) sin(heading) at the start (derived by hand,
   * GEOMETRY.md). The geodesic crosses the neck r = 1 and climbs the other side. */
  shoot_or_die (s, t0, 0.0, heading, 4.0, 401, &res);
  g_assert_false (res.stopped_early);
  spread = check_clairaut (&res, cosh (t0) * sin (heading));
  g_assert_cmpfloat (spread, >, 0.3);
  g_assert_cmpfloat (res.samples[res.n_samples - 1].u, >, 0.0);
}

/* ---- planes and cylinders ---- */

static void
test_plane_line (void)
{
  static const double headings_deg[] = { 0.0, 90.0, 30.0, -135.0 };
  const double x0 = 1.0, y0 = -0.5, L = 3.0;
  const size_t n = 31;
  g_autoptr (df_surface) s = df_test_graph ("0*x", -5.0, 5.0, -5.0, 5.0);

  /* The plane z = 0: N = +z, X_x = e_x; a geodesic is the straight line
   * (x0 + s cos h, y0 + s sin h, 0), heading 0 along +x and 90 deg along +y, counter-clockwise
   * seen from +z (GEOMETRY.md; straight lines are the plane's geodesics, from memory). */
  for (guint m = 0; m < G_N_ELEMENTS (headings_deg); m++)
    {
      double h = headings_deg[m] * G_PI / 180;
      g_auto (df_geodesic_result) res = { 0 };

      shoot_or_die (s, x0, y0, h, L, n, &res);
      g_assert_false (res.stopped_early);
      for (size_t i = 0; i < n; i++)
        {
          const df_geodesic_sample *p = &res.samples[i];

          df_assert_close (p->point[0], x0 + p->s * cos (h), 0.0, 1e-10);
          df_assert_close (p->point[1], y0 + p->s * sin (h), 0.0, 1e-10);
          df_assert_close (p->point[2], 0.0, 0.0, 1e-12);
          df_assert_close (p->tangent[0], cos (h), 0.0, 1e-10);
          df_assert_close (p->tangent[1], sin (h), 0.0, 1e-10);
          df_assert_close (p->u, p->point[0], 0.0, 0.0);
          df_assert_close (p->v, p->point[1], 0.0, 0.0);
        }
    }
}

static void
test_tilted_plane (void)
{
  const double L = 2.5, h = 0.7;
  const size_t n = 26;
  g_autoptr (df_surface) s = df_test_graph ("0.5*x + 0.2*y", -4.0, 4.0, -4.0, 4.0);
  g_auto (df_geodesic_result) res = { 0 };
  const df_geodesic_sample *first, *last;
  double e1[3] = { 1.0, 0.0, 0.5 }, n_up[3] = { -0.5, -0.2, 1.0 }, e2[3], len;

  /* A tilted plane in a non-orthogonal chart: the geodesic is still a straight line of the
   * requested length (from memory), leaving at angle h from X_x/|X_x| counter-clockwise about
   * N = (-f_x, -f_y, 1)/W (GEOMETRY.md). */
  shoot_or_die (s, 0.3, -0.2, h, L, n, &res);
  g_assert_false (res.stopped_early);
  first = &res.samples[0];
  last = &res.samples[n - 1];
  df_assert_close (dist3 (first->point, last->point), L, 1e-10, 0.0);
  for (size_t i = 0; i < n; i++)
    for (int k = 0; k < 3; k++)
      df_assert_close (res.samples[i].point[k], first->point[k] + res.samples[i].s
                       * first->tangent[k], 0.0, 1e-10);

  len = sqrt (dot3 (e1, e1));
  for (int k = 0; k < 3; k++)
    e1[k] /= len;
  len = sqrt (dot3 (n_up, n_up));
  for (int k = 0; k < 3; k++)
    n_up[k] /= len;
  cross3 (n_up, e1, e2);
  df_assert_close (dot3 (first->tangent, e1), cos (h), 0.0, 1e-12);
  df_assert_close (dot3 (first->tangent, e2), sin (h), 0.0, 1e-12);
  df_assert_close (dot3 (first->tangent, n_up), 0.0, 0.0, 1e-12);
}

static void
test_cylinder_helix (void)
{
  const double R = 1.5, h = 1.0, L = 15.0;
  const size_t n = 301;
  g_autoptr (df_surface) s = df_test_revolution ("1.5", "t", -20.0, 20.0);
  g_auto (df_geodesic_result) res = { 0 };
  double phi_prev = 0.0, turns = 0.0;

  /* Geodesics of a circular cylinder are helices: z and the polar angle both grow linearly
   * in arc length (do Carmo sec. 4-4, from memory; the cylinder unrolls onto a plane). With
   * z = t, X_t = e_z and N points to the axis, so the heading's quarter turn about N is
   * +e_phi: dz/ds = cos h, R dphi/ds = sin h (derived by hand, GEOMETRY.md). */
  shoot_or_die (s, 0.0, 0.0, h, L, n, &res);
  g_assert_false (res.stopped_early);
  for (size_t i = 0; i < n; i++)
    {
      const df_geodesic_sample *p = &res.samples[i];
      double phi = atan2 (p->point[1], p->point[0]);

      /* Unwrap the polar angle. */
      if (i > 0 && phi - phi_prev < -G_PI)
        turns += 2 * G_PI;
      else if (i > 0 && phi - phi_prev > G_PI)
        turns -= 2 * G_PI;
      phi_prev = phi;

      df_assert_close (hypot (p->point[0], p->point[1]), R, 1e-12, 0.0);
      df_assert_close (p->point[2], p->s * cos (h), 0.0, 1e-9);
      df_assert_close (R * (phi + turns), p->s * sin (h), 0.0, 1e-9);
    }
  /* More than one full turn, so the unwrapping was exercised. */
  g_assert_cmpfloat (turns, >=, 2 * G_PI);
}

/* ---- the defining property, on a general surface ---- */

static void
test_normal_acceleration (void)
{
  const double L = 3.0;
  const size_t n = 301;
  const double ds = L / (n - 1);
  g_autoptr (df_surface) s = df_test_graph ("0.3*sin(x)*cos(y) + 0.1*x*y", -3.0, 3.0, -3.0, 3.0);
  g_auto (df_geodesic_result) res = { 0 };
  double acc_max = 0.0, chords = 0.0;

  /* A geodesic's acceleration (in arc length) is normal to the surface: no tangential part
   * (do Carmo sec. 4-4, from memory). Acceleration by central second differences of the
   * samples, error O(ds^2). And the sum of the chords is the arc length up to O(ds^2). */
  shoot_or_die (s, -0.5, 0.2, 0.5, L, n, &res);
  g_assert_false (res.stopped_early);
  for (size_t i = 1; i + 1 < n; i++)
    {
      const df_geodesic_sample *p = &res.samples[i];
      double acc[3], side[3];
      df_point_geometry geo;

      g_assert_cmpint (df_surface_geometry (s, p->u, p->v, &geo, NULL), ==, DF_OK);
      for (int k = 0; k < 3; k++)
        acc[k] = (res.samples[i + 1].point[k] - 2 * p->point[k] + res.samples[i - 1].point[k])
                 / (ds * ds);
      cross3 (geo.normal, p->tangent, side);
      df_assert_close (dot3 (acc, p->tangent), 0.0, 0.0, 1e-4);
      df_assert_close (dot3 (acc, side), 0.0, 0.0, 1e-4);
      /* The tangent lies in the tangent plane. */
      df_assert_close (dot3 (p->tangent, geo.normal), 0.0, 0.0, 1e-12);
      acc_max = MAX (acc_max, sqrt (dot3 (acc, acc)));
    }
  /* The path really bends in space, so the checks above are not vacuous. */
  g_assert_cmpfloat (acc_max, >, 0.05);
  for (size_t i = 1; i < n; i++)
    chords += dist3 (res.samples[i].point, res.samples[i - 1].point);
  df_assert_close (chords, L, 1e-5, 0.0);
}

/* ---- stops and errors ---- */

static void
test_runs_off_domain (void)
{
  const size_t n = 101;
  const double L = 5.0, spacing = L / (n - 1);
  g_autoptr (df_surface) plane = df_test_graph ("0*x", -1.0, 1.0, -1.0, 1.0);
  g_autoptr (df_surface) sphere = df_test_revolution ("2*sin(t)", "2*cos(t)", 0.0, G_PI);
  g_autoptr (df_surface) catenoid = df_test_revolution ("cosh(t)", "t", -2.0, 2.0);
  g_auto (df_geodesic_result) res = { 0 };

  /* From the centre of [-1, 1]^2 along +x: the edge is 1 away. The result keeps what was
   * reached, says why it stopped, and holds no NaN (df-geodesic.h). */
  shoot_or_die (plane, 0.0, 0.0, 0.0, L, n, &res);
  g_test_message ("plane: %s", res.stop_reason);
  g_assert_true (res.stopped_early);
  g_assert_cmpuint (strlen (res.stop_reason), >, 0);
  g_assert_cmpfloat (res.length, <, L);
  /* Up to the edge, within the domain's margin of 1e-9 of the range 2 (df-surface.h). */
  g_assert_cmpfloat (res.length, <=, 1.0 + 2.5e-9);
  g_assert_cmpfloat (res.length, >=, 1.0 - 1e-9);
  g_assert_nonnull (strstr (res.stop_reason, "edge"));
  g_assert_cmpuint (res.n_samples, <, n);
  for (size_t i = 0; i < res.n_samples; i++)
    g_assert_true (df_surface_contains (plane, res.samples[i].u, res.samples[i].v));
  df_geodesic_result_clear (&res);

  /* Into a cone's apex (half-angle 30 deg, apex at t = 0, heading pi toward it along a
   * generator, 2 away): a geodesic has no continuation through an apex, so it stops there and
   * says so. */
  {
    g_autoptr (df_surface) cone = df_test_revolution ("t*sin(pi/6)", "-t*cos(pi/6)", 0.0, 3.0);

    shoot_or_die (cone, 2.0, 0.3, G_PI, L, n, &res);
    g_test_message ("cone: %s", res.stop_reason);
    g_assert_true (res.stopped_early);
    g_assert_nonnull (strstr (res.stop_reason, "apex"));
    g_assert_nonnull (strstr (res.stop_reason, "s = "));
    df_assert_close (res.length, 2.0, 0.0, 2 * spacing);
    df_geodesic_result_clear (&res);
  }
  (void) sphere;

  /* Over the catenoid's neck and out at t = 2. */
  shoot_or_die (catenoid, -1.0, 0.0, 0.5, 50.0, 501, &res);
  g_test_message ("catenoid: %s", res.stop_reason);
  g_assert_true (res.stopped_early);
  g_assert_cmpuint (strlen (res.stop_reason), >, 0);
  g_assert_cmpfloat (res.length, <, 50.0);
  df_assert_close (res.samples[res.n_samples - 1].u, 2.0, 0.0, 0.2);
}

/* The great circle from X0 with unit direction d on the sphere of radius R: X(s) =
 * cos(s/R) X0 + R sin(s/R) d (do Carmo sec. 4-4, from memory). */
static void
great_circle_point (double R, double t0, double phi0, double heading, double s, double out[3])
{
  /* Start frame as in test_great_circle: e1 = X_t / |X_t|, e2 = N x e1, N outward. */
  double x0[3] = { R * sin (t0) * cos (phi0), R * sin (t0) * sin (phi0), R * cos (t0) };
  double e1[3] = { cos (t0) * cos (phi0), cos (t0) * sin (phi0), -sin (t0) };
  double n[3] = { x0[0] / R, x0[1] / R, x0[2] / R }, e2[3];

  cross3 (n, e1, e2);
  for (int k = 0; k < 3; k++)
    out[k] = cos (s / R) * x0[k] + R * sin (s / R) * (cos (heading) * e1[k] + sin (heading) * e2[k]);
}

static void
test_long_and_through_poles (void)
{
  /* A 50 000 mm geodesic on a sphere of R = 100 (about 80 laps) runs its full length and ends
   * where the great circle says; so does one of 500 pi R + 70 (250 laps and a bit). One down a
   * meridian runs through both poles again and again; one skims the pole at 1e-3 R (Clairaut:
   * r sin(heading) is constant, so starting on the equator at heading 1e-3 from the meridian it
   * passes at polar angle about 1e-3). */
  const double R = 100.0;
  g_autoptr (df_surface) s = df_test_revolution ("100*sin(t)", "100*cos(t)", 0.0, G_PI);
  const struct { double t0, phi0, heading, L, tol; } cases[] = {
    { 1.0, 0.0, G_PI / 6, 50000.0, 1e-6 },
    { 1.2, 0.5, 2.0, 500 * G_PI * R + 70.0, 1e-5 },
    { 1.0, 0.3, G_PI, 5000.0, 1e-7 },
    { G_PI / 2, 0.0, 1e-3, 3000.0, 1e-7 },
    { G_PI / 2, 0.0, 1e-8, 3000.0, 1e-7 },
  };

  for (size_t c = 0; c < G_N_ELEMENTS (cases); c++)
    {
      g_auto (df_geodesic_result) res = { 0 };
      double want[3];
      const df_geodesic_sample *e;

      shoot_or_die (s, cases[c].t0, cases[c].phi0, cases[c].heading, cases[c].L, 201, &res);
      g_test_message ("case %zu: %s", c, res.stop_reason);
      g_assert_false (res.stopped_early);
      df_assert_close (res.length, cases[c].L, 1e-12, 0.0);
      for (size_t i = 0; i < res.n_samples; i += 20)
        {
          great_circle_point (R, cases[c].t0, cases[c].phi0, cases[c].heading, res.samples[i].s,
                              want);
          for (int k = 0; k < 3; k++)
            df_assert_close (res.samples[i].point[k], want[k], 0.0, cases[c].tol * R);
        }
      e = &res.samples[res.n_samples - 1];
      great_circle_point (R, cases[c].t0, cases[c].phi0, cases[c].heading, e->s, want);
      for (int k = 0; k < 3; k++)
        df_assert_close (e->point[k], want[k], 0.0, cases[c].tol * R);
    }
}

static void
test_bad_input (void)
{
  g_autoptr (df_surface) sphere = df_test_revolution ("2*sin(t)", "2*cos(t)", 0.0, G_PI);
  df_geodesic_result res;
  df_diag diag;

  /* df-geodesic.h: length > 0; a geodesic cannot start on the axis, where the chart gives no
   * direction; nor off the surface. The result is left empty on failure. */
  memset (&res, 0x5a, sizeof res);
  g_assert_cmpint (df_geodesic_shoot (sphere, 1.0, 0.0, 0.0, 0.0, 10, &res, &diag), ==,
                   DF_E_INPUT);
  g_assert_null (res.samples);
  g_assert_cmpuint (res.n_samples, ==, 0);
  g_assert_cmpuint (strlen (diag.detail), >, 0);
  g_assert_cmpint (df_geodesic_shoot (sphere, 1.0, 0.0, 0.0, -1.0, 10, &res, &diag), ==,
                   DF_E_INPUT);
  g_assert_cmpint (df_geodesic_shoot (sphere, 1.0, 0.0, 0.0, NAN, 10, &res, &diag), ==,
                   DF_E_INPUT);
  g_assert_cmpint (df_geodesic_shoot (sphere, 1.0, 0.0, NAN, 1.0, 10, &res, &diag), ==,
                   DF_E_INPUT);

  g_assert_cmpint (df_geodesic_shoot (sphere, 0.0, 0.0, 0.0, 1.0, 10, &res, &diag), ==,
                   DF_E_SINGULAR);
  g_test_message ("pole: %s", diag.detail);
  g_assert_null (res.samples);
  g_assert_cmpuint (strlen (diag.detail), >, 0);
  g_assert_cmpint (df_geodesic_shoot (sphere, G_PI, 0.0, 0.0, 1.0, 10, &res, &diag), ==,
                   DF_E_SINGULAR);

  g_assert_cmpint (df_geodesic_shoot (sphere, 4.0, 0.0, 0.0, 1.0, 10, &res, &diag), ==,
                   DF_E_DOMAIN);
  g_assert_null (res.samples);
}

int
main (int argc, char **argv)
{
  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);

  g_test_add_func ("/core/geodesic/great-circle", test_great_circle);
  g_test_add_func ("/core/geodesic/clairaut-torus", test_clairaut_torus);
  g_test_add_func ("/core/geodesic/clairaut-catenoid", test_clairaut_catenoid);
  g_test_add_func ("/core/geodesic/plane-line", test_plane_line);
  g_test_add_func ("/core/geodesic/tilted-plane", test_tilted_plane);
  g_test_add_func ("/core/geodesic/cylinder-helix", test_cylinder_helix);
  g_test_add_func ("/core/geodesic/normal-acceleration", test_normal_acceleration);
  g_test_add_func ("/core/geodesic/runs-off-domain", test_runs_off_domain);
  g_test_add_func ("/core/geodesic/long-and-through-poles", test_long_and_through_poles);
  g_test_add_func ("/core/geodesic/bad-input", test_bad_input);

  return g_test_run ();
}
