/* test-place.c: placement of sequences of space points on a surface (df_placer): continuation
 * from the neighbour's answer against the from-scratch search, against closed forms (sphere,
 * paraboloid), against a brute-force scan where the distance has several local minima, across
 * the seam phi = +-pi of a surface of revolution, and through the x,y,z loop reader. */
#include <math.h>

#include "df-test.h"

static void
eval_or_die (const df_surface *s, double u, double v, int order, df_chart_jet *j)
{
  df_diag diag;
  df_status st = df_surface_eval (s, u, v, order, j, &diag);

  if (st != DF_OK)
    g_error ("eval (%g, %g): %s: %s", u, v, df_status_describe (st), diag.detail);
}

static void
unit_normal (const df_chart_jet *j, double n[3])
{
  const double *a = j->d1[0], *b = j->d1[1];
  double len;

  n[0] = a[1] * b[2] - a[2] * b[1];
  n[1] = a[2] * b[0] - a[0] * b[2];
  n[2] = a[0] * b[1] - a[1] * b[0];
  len = sqrt (n[0] * n[0] + n[1] * n[1] + n[2] * n[2]);
  for (int k = 0; k < 3; k++)
    n[k] /= len;
}

static void
place_or_die (df_placer *pl, const double p[3], double *u, double *v, double *dist)
{
  df_diag diag;
  df_status st = df_placer_place (pl, p, 0.0, u, v, dist, &diag);

  if (st != DF_OK)
    g_error ("place (%g, %g, %g): %s: %s", p[0], p[1], p[2], df_status_describe (st),
             diag.detail);
}

/* Smallest distance from p to the surface on a fine chart grid: an independent, slow
 * reference for "the closest point" (common practice, no source). */
static double
brute_force_distance (const df_surface *s, const double p[3], int n)
{
  double u0, u1, v0, v1, best = INFINITY;

  df_surface_get_domain (s, &u0, &u1, &v0, &v1);
  for (int a = 0; a <= n; a++)
    for (int b = 0; b <= n; b++)
      {
        df_chart_jet j;
        double d2 = 0.0;

        eval_or_die (s, u0 + (u1 - u0) * a / n, v0 + (v1 - v0) * b / n, 0, &j);
        for (int k = 0; k < 3; k++)
          d2 += (j.x[k] - p[k]) * (j.x[k] - p[k]);
        best = MIN (best, sqrt (d2));
      }
  return best;
}

/* A wavy closed loop of feet on a graph, each point moved off the surface along the normal by
 * an offset below the smallest radius of curvature (about 2 here), so its foot is its closest
 * point (from memory). Continuation must find the foot, and agree with the from-scratch search. */
static void
test_graph_loop (void)
{
  g_autoptr (df_surface) s = df_test_graph ("0.3*sin(1.3*x)*cos(0.7*y) + 0.1*x*y", -2, 2, -2, 2);
  g_autoptr (df_placer) pl = df_placer_new (s);
  const int n = 2000;
  size_t continued = 0, searched = 0;

  for (int i = 0; i < n; i++)
    {
      double th = 2 * G_PI * i / n, rho = 1.3 + 0.25 * cos (3 * th) + 0.1 * sin (5 * th);
      double foot[2] = { 0.1 + rho * cos (th), -0.2 + rho * sin (th) };
      double off = 0.05 * sin (7 * th), p[3], nrm[3], u, v, dist, u2, v2, dist2;
      df_chart_jet j;
      df_diag diag;

      eval_or_die (s, foot[0], foot[1], 1, &j);
      unit_normal (&j, nrm);
      for (int k = 0; k < 3; k++)
        p[k] = j.x[k] + off * nrm[k];
      place_or_die (pl, p, &u, &v, &dist);
      df_assert_close (u, foot[0], 0.0, 1e-10);
      df_assert_close (v, foot[1], 0.0, 1e-10);
      df_assert_close (dist, fabs (off), 0.0, 1e-10);
      g_assert_cmpint (df_surface_project (s, p, 0.0, &u2, &v2, &dist2, &diag), ==, DF_OK);
      df_assert_close (u, u2, 0.0, 1e-10);
      df_assert_close (v, v2, 0.0, 1e-10);
    }
  /* The point of the placer: almost every point continues from its neighbour (the offset's
   * sign changes make the distance grow from near zero, which may send a few to the grid). */
  df_placer_get_counts (pl, &continued, &searched);
  g_assert_cmpuint (continued + searched, ==, (size_t) n);
  g_assert_cmpuint (searched, <=, (size_t) n / 100);
}

/* Sphere of radius R: the closest point to p != 0 is R p / |p|, so t = acos (z / |p|),
 * phi = atan2 (y, x), at distance ||p| - R| (from memory). The loop winds round the axis, so it
 * crosses phi = +-pi, and it wanders off the surface radially by up to 0.3 R. */
static void
test_sphere_closed_form (void)
{
  const double R = 2.0;
  g_autoptr (df_surface) s = df_test_revolution ("2*sin(t)", "2*cos(t)", 0.0, G_PI);
  g_autoptr (df_placer) pl = df_placer_new (s);
  const int n = 1500;
  size_t searched = 0;

  for (int i = 0; i < n; i++)
    {
      double a = 2 * G_PI * i / n, phi = a + G_PI / 3, th = 1.1 + 0.4 * sin (3 * a);
      double rad = R * (1 + 0.3 * sin (5 * a)), p[3], u, v, dist, want_phi;

      p[0] = rad * sin (th) * cos (phi);
      p[1] = rad * sin (th) * sin (phi);
      p[2] = rad * cos (th);
      place_or_die (pl, p, &u, &v, &dist);
      want_phi = atan2 (p[1], p[0]);
      df_assert_close (u, acos (p[2] / sqrt (p[0] * p[0] + p[1] * p[1] + p[2] * p[2])), 0.0,
                       1e-10);
      df_assert_close (v, want_phi, 0.0, 1e-12);
      df_assert_close (dist, fabs (rad - R), 0.0, 1e-10);
    }
  df_placer_get_counts (pl, NULL, &searched);
  g_assert_cmpuint (searched, <=, (size_t) n / 100);
}

/* Paraboloid of revolution r = t, z = t^2. For a point on the axis at height h > 1/2,
 * t^2 + (t^2 - h)^2 is least at t = sqrt (h - 1/2) (derived: 2t + 4t (t^2 - h) = 0); off the
 * axis, a point on the normal of the foot t0 at an offset below the radius of curvature (at
 * least 1/2, at the apex) has that foot as its closest point (from memory). */
static void
test_paraboloid (void)
{
  g_autoptr (df_surface) s = df_test_revolution ("t", "t^2", 0.0, 2.0);
  g_autoptr (df_placer) pl = df_placer_new (s);
  static const double heights[] = { 0.75, 1.0, 2.5 };
  static const double feet[] = { 0.2, 0.6, 1.1, 1.5, 1.2, 0.4 };

  for (guint i = 0; i < G_N_ELEMENTS (heights); i++)
    {
      const double p[3] = { 0.0, 0.0, heights[i] };
      double u, v, dist;
      df_diag diag;

      g_assert_cmpint (df_surface_project (s, p, 0.0, &u, &v, &dist, &diag), ==, DF_OK);
      df_assert_close (u, sqrt (heights[i] - 0.5), 0.0, 1e-9);
      place_or_die (pl, p, &u, &v, &dist);
      df_assert_close (u, sqrt (heights[i] - 0.5), 0.0, 1e-9);
      df_assert_close (dist, sqrt (heights[i] - 0.25), 0.0, 1e-9);
    }
  df_placer_reset (pl);
  for (guint i = 0; i < G_N_ELEMENTS (feet); i++)
    for (int sign = -1; sign <= 1; sign += 2)
      {
        df_chart_jet j;
        double nrm[3], p[3], u, v, dist, phi = 0.7 * i - 2.0;

        eval_or_die (s, feet[i], phi, 1, &j);
        unit_normal (&j, nrm);
        for (int k = 0; k < 3; k++)
          p[k] = j.x[k] + sign * 0.3 * nrm[k];
        place_or_die (pl, p, &u, &v, &dist);
        df_assert_close (u, feet[i], 0.0, 1e-10);
        df_assert_close (remainder (v - phi, 2 * G_PI), 0.0, 0.0, 1e-12);
        df_assert_close (dist, 0.3, 0.0, 1e-10);
      }
}

/* A corrugated sheet, where the distance from a point above it has a local minimum near each
 * crest. A path on the surface that jumps from one end to the other: Newton from the neighbour
 * lands in a wrong basin, the distance grows, and the seed grid must take over. Points above
 * the crests (off the surface by about one wave height) are checked against a brute-force scan,
 * which no local minimum can beat. */
static void
test_jumps_and_local_minima (void)
{
  g_autoptr (df_surface) s = df_test_graph ("0.4*cos(3*x)*cos(y)", -3, 3, -1, 1);
  g_autoptr (df_placer) pl = df_placer_new (s);
  size_t searched = 0;

  for (int i = 0; i < 400; i++)
    {
      /* 200 points on the left, then a jump to the right end and back again. */
      double x = i < 200 ? -2.8 + 0.004 * i : 2.7 - 0.004 * (i - 200);
      double y = 0.5 * sin (0.05 * i), p[3], u, v, dist;
      df_chart_jet j;

      eval_or_die (s, x, y, 0, &j);
      p[0] = j.x[0];
      p[1] = j.x[1];
      p[2] = j.x[2];
      place_or_die (pl, p, &u, &v, &dist);
      df_assert_close (u, x, 0.0, 1e-10);
      df_assert_close (v, y, 0.0, 1e-10);
      df_assert_close (dist, 0.0, 0.0, 1e-10);
    }
  df_placer_get_counts (pl, NULL, &searched);
  g_assert_cmpuint (searched, >=, 2);

  df_placer_reset (pl);
  for (int i = 0; i <= 40; i++)
    {
      const double p[3] = { -2.5 + 5.0 * i / 40, 0.2, 0.75 };
      double u, v, dist, ref = brute_force_distance (s, p, 300);

      place_or_die (pl, p, &u, &v, &dist);
      /* Never worse than the scan, and the scan's grid (spacing 0.02 by 0.007) is close enough
       * to the minimum that it is within 1e-3 of it. */
      g_assert_cmpfloat (dist, <=, ref + 1e-12);
      df_assert_close (dist, ref, 0.0, 1e-3);
    }
}

/* A torus tube r = 2 + cos t, z = sin t (a closed profile: t wraps round): the closest point
 * to p lies in its meridian half-plane at t = atan2 (z, rho - 2), rho = |p_xy| (the closest
 * point of a circle is along the radius; from memory). A loop round the tube crosses the seam
 * t = +-pi every lap; answers come wrapped into [t_min, t_max]. */
static void
test_torus_seam (void)
{
  g_autoptr (df_surface) s = df_test_revolution ("2 + cos(t)", "sin(t)", -G_PI, G_PI);
  g_autoptr (df_placer) pl = df_placer_new (s);
  const int n = 900;

  g_assert_true (df_surface_u_periodic (s));
  for (int i = 0; i < n; i++)
    {
      double a = 4 * G_PI * i / n + 2.5, phi = 0.3 + 0.2 * sin (a), off = 0.1 * sin (3 * a);
      double rho = 2 + (1 + off) * cos (a), p[3], u, v, dist;

      p[0] = rho * cos (phi);
      p[1] = rho * sin (phi);
      p[2] = (1 + off) * sin (a);
      place_or_die (pl, p, &u, &v, &dist);
      g_assert_cmpfloat (u, >=, -G_PI);
      g_assert_cmpfloat (u, <=, G_PI);
      df_assert_close (remainder (u - atan2 (p[2], rho - 2), 2 * G_PI), 0.0, 0.0, 1e-10);
      df_assert_close (v, phi, 0.0, 1e-12);
      df_assert_close (dist, fabs (off), 0.0, 1e-10);
    }
}

/* The x,y,z loop reader places by continuation: a latitude circle on the unit sphere given as
 * space points, starting at phi = 3 (near the seam), measures the holonomy 2 pi (1 - cos theta)
 * (Gauss-Bonnet; do Carmo, sec. 4-5, from memory) and agrees with the same loop given as
 * chart points. */
static void
test_reader_sphere_latitude (void)
{
  g_autoptr (df_surface) s = df_test_revolution ("sin(t)", "cos(t)", 0.0, G_PI);
  g_autoptr (GString) xyz = g_string_new ("x,y,z\n");
  g_autoptr (GError) error = NULL;
  g_autofree double (*uv)[2] = NULL;
  g_autoptr (df_curve) c = NULL;
  g_auto (df_loop_result) r = { 0 };
  const double theta = 0.9;
  const int n = 3000;
  gsize got = 0;

  for (int i = 0; i < n; i++)
    {
      double phi = 3.0 + 2 * G_PI * i / n;

      g_string_append_printf (xyz, "%.17g,%.17g,%.17g\n", sin (theta) * cos (phi),
                              sin (theta) * sin (phi), cos (theta));
    }
  g_assert_true (df_loop_csv_parse (xyz->str, "latitude.csv", s, &uv, &got, &error));
  g_assert_no_error (error);
  g_assert_cmpuint (got, ==, (gsize) n);
  for (int i = 0; i < n; i++)
    {
      df_assert_close (uv[i][0], theta, 0.0, 1e-12);
      df_assert_close (remainder (uv[i][1] - (3.0 + 2 * G_PI * i / n), 2 * G_PI), 0.0, 0.0,
                       1e-12);
    }
  c = df_test_curve (s, (const double (*)[2]) uv, got, true);
  df_test_measure (c, &r);
  /* Increasing phi on this sphere (N outward) runs clockwise about N seen from outside near
   * the north pole: the disc on the left is the southern cap, -(4 pi - 2 pi (1 - cos theta))
   * = 2 pi (1 - cos theta) - 4 pi, the same modulo 2 pi. */
  df_assert_close (remainder (r.holonomy_rad - 2 * G_PI * (1 - cos (theta)), 2 * G_PI), 0.0,
                   0.0, 1e-8);
}

int
main (int argc, char **argv)
{
  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);
  g_test_add_func ("/core/place/graph-loop", test_graph_loop);
  g_test_add_func ("/core/place/sphere", test_sphere_closed_form);
  g_test_add_func ("/core/place/paraboloid", test_paraboloid);
  g_test_add_func ("/core/place/jumps", test_jumps_and_local_minima);
  g_test_add_func ("/core/place/torus-seam", test_torus_seam);
  g_test_add_func ("/core/place/reader-latitude", test_reader_sphere_latitude);
  return g_test_run ();
}
