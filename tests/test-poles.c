/* test-poles.c: loops through and around the poles of surfaces of revolution, where the
 * (t, phi) chart is singular, and cone apices with their concentrated curvature. */
#include <math.h>

#include "df-test.h"

static void
measure (const df_surface *s, const double (*uv)[2], size_t n, df_loop_result *r,
         df_curve_coords *coords)
{
  g_autoptr (df_curve) c = df_test_curve (s, uv, n, true);

  if (coords)
    *coords = df_curve_get_coords (c);
  df_test_measure (c, r);
}

/* n points on the unit sphere's small circle of angular radius rho whose centre lies at polar
 * angle rho on the meridian phi0: the circle runs through the north pole (theta = 0) when
 * north is true, else through the south pole with the centre at polar angle pi - rho. */
static double (*circle_through_pole (double rho, double phi0, size_t n, bool north))[2]
{
  double (*uv)[2] = g_malloc (n * sizeof *uv);
  double ct = north ? rho : G_PI - rho;
  double c[3] = { sin (ct) * cos (phi0), sin (ct) * sin (phi0), cos (ct) };
  double e1[3] = { cos (ct) * cos (phi0), cos (ct) * sin (phi0), -sin (ct) };
  double e2[3] = { -sin (phi0), cos (phi0), 0 };

  for (size_t i = 0; i < n; i++)
    {
      /* Start at the pole: angle pi from e1 on the circle points toward it for north. */
      double a = G_PI + 2 * G_PI * i / n, p[3];

      if (!north)
        a = 2 * G_PI * i / n;
      for (int k = 0; k < 3; k++)
        p[k] = cos (rho) * c[k] + sin (rho) * (cos (a) * e1[k] + sin (a) * e2[k]);
      uv[i][0] = acos (CLAMP (p[2], -1.0, 1.0));
      uv[i][1] = (i == 0) ? phi0 : atan2 (p[1], p[0]);
    }
  return uv;
}

static void
test_circle_through_north_pole (void)
{
  /* A spherical cap of angular radius rho has K-area 2 pi (1 - cos rho) (Archimedes,
   * Gauss-Bonnet; do Carmo sec. 4-5, from memory), wherever it sits: here its rim runs through
   * the pole, where the (t, phi) chart fails. */
  g_autoptr (df_surface) s = df_test_revolution ("sin(t)", "cos(t)", 0, G_PI);
  const double rho = 0.35;
  size_t n = 240;
  g_autofree double (*uv)[2] = circle_through_pole (rho, 0.4, n, true);
  g_auto (df_loop_result) r = { 0 };
  df_curve_coords coords;
  double want = 2 * G_PI * (1 - cos (rho));

  measure (s, (const double (*)[2]) uv, n, &r, &coords);
  g_assert_cmpint (coords, ==, DF_COORDS_POLAR_MIN);
  g_assert_true (r.bounds_disc);
  /* Points, not the exact circle: as close as the spline through 240 points allows. */
  df_assert_close (fabs (r.holonomy_rad), want, 0.0, 1e-7);
  df_assert_close (fabs (r.enclosed_curvature_rad), want, 0.0, 1e-7);
  df_assert_close (r.residual_rad, 0.0, 0.0, 1e-9);
  df_assert_close (r.area, want, 0.0, 1e-7);
  df_assert_close (r.length, 2 * G_PI * sin (rho), 1e-7, 0.0);
  g_assert_cmpfloat (r.norm_drift, <, 1e-9);
}

static void
test_circle_through_south_pole (void)
{
  g_autoptr (df_surface) s = df_test_revolution ("2*sin(t)", "2*cos(t)", 0, G_PI);
  const double rho = 0.5;
  size_t n = 240;
  g_autofree double (*uv)[2] = circle_through_pole (rho, -1.0, n, false);
  g_auto (df_loop_result) r = { 0 };
  df_curve_coords coords;
  double want = 2 * G_PI * (1 - cos (rho));

  measure (s, (const double (*)[2]) uv, n, &r, &coords);
  g_assert_cmpint (coords, ==, DF_COORDS_POLAR_MAX);
  df_assert_close (fabs (r.enclosed_curvature_rad), want, 0.0, 1e-7);
  df_assert_close (r.residual_rad, 0.0, 0.0, 1e-9);
  /* Radius 2: area scales with R^2, curvature does not. */
  df_assert_close (r.area, 4 * want, 1e-7, 0.0);
}

static void
test_paraboloid_two_charts (void)
{
  /* The paraboloid z = (x^2 + y^2) / 2 as a graph and as a surface of revolution r = t,
   * z = t^2 / 2 with its pole at t = 0: the same loop round the vertex must measure the same
   * in both charts, 2 pi (1 - 1 / sqrt(1 + rho^2)) for the circle rho (Gauss map area, do
   * Carmo sec. 3-3, from memory). The loop wobbles, so it is not a parallel. */
  g_autoptr (df_surface) rev = df_test_revolution ("t", "t^2/2", 0, 3);
  g_autoptr (df_surface) graph = df_test_graph ("(x^2 + y^2)/2", -3, 3, -3, 3);
  size_t n = 400;
  g_autofree double (*polar)[2] = g_malloc (n * sizeof *polar);
  g_autofree double (*cart)[2] = g_malloc (n * sizeof *cart);
  g_auto (df_loop_result) a = { 0 };
  g_auto (df_loop_result) b = { 0 };
  g_auto (df_loop_result) circle = { 0 };

  for (size_t i = 0; i < n; i++)
    {
      double ph = 2 * G_PI * i / n, rr = 1.2 + 0.3 * cos (2 * ph) + 0.1 * sin (3 * ph);

      polar[i][0] = rr;
      polar[i][1] = ph;
      cart[i][0] = rr * cos (ph);
      cart[i][1] = rr * sin (ph);
    }
  measure (rev, (const double (*)[2]) polar, n, &a, NULL);
  measure (graph, (const double (*)[2]) cart, n, &b, NULL);
  /* The two splines differ (phi vs x, y), so agreement is to the interpolation error. */
  df_assert_close (a.holonomy_rad, b.holonomy_rad, 0.0, 1e-6);
  df_assert_close (a.enclosed_curvature_rad, b.enclosed_curvature_rad, 0.0, 1e-6);
  df_assert_close (a.area, b.area, 1e-6, 0.0);
  for (size_t i = 0; i < n; i++)
    {
      polar[i][0] = 1.1;
      polar[i][1] = 2 * G_PI * i / n;
    }
  measure (rev, (const double (*)[2]) polar, n, &circle, NULL);
  df_assert_close (circle.enclosed_curvature_rad, 2 * G_PI * (1 - 1 / sqrt (1 + 1.1 * 1.1)),
                   0.0, 1e-8);
}

static void
test_cone_apex_outside (void)
{
  /* A loop on a cone that does not go round the apex encloses no curvature: the cone is flat
   * there (it unrolls onto a plane, from memory). */
  g_autoptr (df_surface) s = df_test_revolution ("t*sin(0.5)", "-t*cos(0.5)", 0, 3);
  size_t n = 60;
  g_autofree double (*uv)[2] = g_malloc (n * sizeof *uv);
  g_auto (df_loop_result) r = { 0 };

  for (size_t i = 0; i < n; i++)
    {
      double th = 2 * G_PI * i / n;

      uv[i][0] = 2.0 + 0.5 * cos (th);
      uv[i][1] = 0.3 + 0.4 * sin (th);
    }
  measure (s, (const double (*)[2]) uv, n, &r, NULL);
  g_assert_true (r.bounds_disc);
  df_assert_close (r.concentrated_rad, 0.0, 0.0, 0.0);
  df_assert_close (r.enclosed_curvature_rad, 0.0, 0.0, 1e-10);
  df_assert_close (r.holonomy_rad, 0.0, 0.0, 1e-9);
}

static void
test_both_caps (void)
{
  /* A small clockwise circle round the north pole of a sphere of radius 2: the disc on its
   * left is the large southern cap, the one on its right the small northern cap, whose K-area
   * is 2 pi (1 - cos theta) and area 2 pi R^2 (1 - cos theta) (Archimedes, from memory). The
   * two caps together carry 4 pi (Gauss-Bonnet for a closed surface, from memory). */
  g_autoptr (df_surface) s = df_test_revolution ("2*sin(t)", "2*cos(t)", 0, G_PI);
  const double theta = 0.4;
  size_t n = 40;
  g_autofree double (*uv)[2] = g_malloc (n * sizeof *uv);
  g_auto (df_loop_result) r = { 0 };

  for (size_t i = 0; i < n; i++)
    {
      uv[i][0] = theta;
      uv[i][1] = -2 * G_PI * i / n;
    }
  measure (s, (const double (*)[2]) uv, n, &r, NULL);
  g_assert_true (r.disc_on_left);
  g_assert_true (r.has_other_disc);
  df_assert_close (r.enclosed_curvature_rad, 2 * G_PI * (1 + cos (theta)), 0.0, 1e-8);
  df_assert_close (r.other_enclosed_curvature_rad, -2 * G_PI * (1 - cos (theta)), 0.0, 1e-8);
  df_assert_close (r.other_area, 8 * G_PI * (1 - cos (theta)), 1e-9, 0.0);
  df_assert_close (r.area + r.other_area, 16 * G_PI, 1e-9, 0.0);
}

static void
test_near_both_poles (void)
{
  /* A meridian great circle passes both poles and bounds two hemispheres, each carrying 2 pi
   * (half of the closed surface's 4 pi: Gauss-Bonnet, from memory) and, on the unit sphere,
   * area 2 pi; on the spheroid a = 100, c = 60 each half has half the area
   * 2 pi a^2 (1 + (1 - e^2) / e atanh e), e^2 = 1 - c^2/a^2 (the oblate spheroid's area, from
   * memory). A great circle tilted 1e-3 from a meridian passes beside both poles: 2 pi too.
   * A lune between meridians alpha apart carries 2 alpha (area 2 alpha R^2, from memory), to
   * the spline's interpolation error at its corners on the poles. */
  g_autoptr (df_surface) s = df_test_revolution ("sin(t)", "cos(t)", 0, G_PI);
  g_autoptr (df_surface) sph = df_test_revolution ("100*sin(t)", "60*cos(t)", 0, G_PI);
  const double e = 0.8, sph_half = G_PI * 1e4 * (1 + (1 - e * e) / e * atanh (e));
  const size_t n = 80;
  double uv[80][2];

  for (int variant = 0; variant < 4; variant++)
    {
      g_auto (df_loop_result) r = { 0 };
      df_curve_coords coords;

      for (size_t i = 0; i < n; i++)
        {
          if (variant == 2)
            {
              double a = 2 * G_PI * i / n, eps = 1e-3;
              double p[3] = { cos (a) * sin (eps), sin (a), cos (a) * cos (eps) };

              uv[i][0] = acos (CLAMP (p[2], -1.0, 1.0));
              uv[i][1] = atan2 (p[1], p[0]);
            }
          else
            {
              uv[i][0] = i < n / 2 ? G_PI * i / (n / 2) : G_PI * (1.0 - (double) (i - n / 2) / (n / 2));
              uv[i][1] = i < n / 2 ? 0.0 : (variant == 3 ? 1.0 : G_PI);
            }
        }
      measure (variant == 1 ? sph : s, (const double (*)[2]) uv, n, &r, &coords);
      g_assert_cmpint (coords, ==, DF_COORDS_SPHERE);
      g_assert_true (r.simple);
      g_assert_true (r.bounds_disc);
      g_assert_true (r.has_other_disc);
      df_assert_close (r.residual_rad, 0.0, 0.0, 1e-9);
      if (variant == 3)
        {
          df_assert_close (fabs (r.enclosed_curvature_rad), 2.0, 1e-3, 0.0);
          df_assert_close (r.area, 2.0, 1e-3, 0.0);
          continue;
        }
      df_assert_close (fabs (r.enclosed_curvature_rad), 2 * G_PI, 1e-9, 0.0);
      df_assert_close (fabs (r.other_enclosed_curvature_rad), 2 * G_PI, 1e-9, 0.0);
      df_assert_close (r.area, variant == 1 ? sph_half : 2 * G_PI, 1e-9, 0.0);
      if (variant != 1)
        df_assert_close (r.length, 2 * G_PI, 1e-9, 0.0);
    }
}

/* The octant-style loop in pole-centred coordinates about the pole at t-min: down the meridian
 * phi = 0 from the pole to t = T, along the parallel t = T for a quarter turn, back up the
 * meridian phi = pi/2 to the pole. The curve starts at tau = shift x (its length in tau, 3 T
 * pieces of length T... each piece is parametrised on an interval of length 1). */
typedef struct
{
  double T;
  double shift;   /* where on the loop tau = 0 lies, in pieces (0: at the pole) */
} octant_def;

static void
octant_fn (double tau, void *user, double p[2], double dp[2], double ddp[2])
{
  const octant_def *o = user;
  double x = fmod (tau + o->shift, 3.0), a;

  if (x < 0)
    x += 3.0;
  ddp[0] = ddp[1] = 0.0;
  if (x < 1.0)
    {
      p[0] = o->T * x; p[1] = 0.0;
      dp[0] = o->T; dp[1] = 0.0;
    }
  else if (x < 2.0)
    {
      a = G_PI / 2 * (x - 1.0);
      p[0] = o->T * cos (a); p[1] = o->T * sin (a);
      dp[0] = -o->T * G_PI / 2 * sin (a); dp[1] = o->T * G_PI / 2 * cos (a);
      ddp[0] = -G_PI * G_PI / 4 * p[0]; ddp[1] = -G_PI * G_PI / 4 * p[1];
    }
  else
    {
      p[0] = 0.0; p[1] = o->T * (3.0 - x);
      dp[0] = 0.0; dp[1] = -o->T;
    }
}

static void
measure_octant (const df_surface *s, df_curve_coords coords, double T, double shift,
                df_loop_result *r)
{
  octant_def o = { T, shift };
  double breaks[3];
  size_t nb = 0;
  df_curve *c = NULL;
  df_diag diag;

  /* Corners at the pieces' joins, as seen from this start. */
  for (int k = 1; k <= 3; k++)
    {
      double b = fmod (k - shift + 3.0, 3.0);

      if (b > 1e-12 && b < 3.0 - 1e-12)
        breaks[nb++] = b;
    }
  if (nb > 1 && breaks[0] > breaks[1])
    {
      double t = breaks[0];

      breaks[0] = breaks[1];
      breaks[1] = t;
    }
  g_assert_cmpint (df_curve_new_function (s, coords, 0.0, 3.0, breaks, nb, true, octant_fn, &o,
                                          &c, &diag), ==, DF_OK);
  df_test_measure (c, r);
  df_curve_free (c);
}

static void
test_octant_loops (void)
{
  /* Girard's theorem: a spherical triangle's excess is its area / R^2 (from memory); the
   * octant (three right angles) has excess pi/2, area pi R^2 / 2. On a spheroid the octant is
   * an eighth of a closed surface carrying 4 pi in all (Gauss-Bonnet, from memory, the eight
   * octants congruent by reflection): pi/2. On the paraboloid z = -r^2/(4f) a quarter of the
   * disc r <= T carries a quarter of 2 pi (1 - 1/sqrt(1 + (T/2f)^2)) (the Gauss image's area,
   * do Carmo sec. 3-3, from memory). Starting at the pole, passing through it (started
   * mid-parallel) and at the other (south) pole. */
  g_autoptr (df_surface) sphere = df_test_revolution ("2*sin(t)", "2*cos(t)", 0, G_PI);
  g_autoptr (df_surface) south = df_test_revolution ("2*sin(pi - t)", "-2*cos(pi - t)", 0, G_PI);
  g_autoptr (df_surface) spheroid = df_test_revolution ("100*sin(t)", "60*cos(t)", 0, G_PI);
  g_autoptr (df_surface) par = df_test_revolution ("t", "-t^2/(4*100)", 0, 120);
  const double par_want = 0.25 * 2 * G_PI * (1 - 1 / sqrt (1 + 0.5 * 0.5));
  const double shifts[3] = { 0.0, 1.5, 2.5 };

  for (int k = 0; k < 3; k++)
    {
      g_auto (df_loop_result) a = { 0 };
      g_auto (df_loop_result) b = { 0 };
      g_auto (df_loop_result) c = { 0 };
      g_auto (df_loop_result) d = { 0 };

      measure_octant (sphere, DF_COORDS_POLAR_MIN, G_PI / 2, shifts[k], &a);
      g_assert_true (a.simple);
      g_assert_true (a.bounds_disc);
      df_assert_close (a.holonomy_rad, G_PI / 2, 0.0, 1e-9);
      df_assert_close (a.enclosed_curvature_rad, G_PI / 2, 0.0, 1e-9);
      df_assert_close (a.area, G_PI * 4 / 2, 1e-9, 0.0);
      /* The other disc is the rest of the sphere: 4 pi - pi/2, on the right. */
      g_assert_true (a.has_other_disc);
      df_assert_close (a.other_enclosed_curvature_rad, G_PI / 2 - 4 * G_PI, 0.0, 1e-9);

      /* The mirror image about the equator, round the pole at t-max: the profile runs the
       * other way, so the same picture is traversed with N still outward. */
      measure_octant (south, DF_COORDS_POLAR_MAX, G_PI / 2, shifts[k], &b);
      g_assert_true (b.bounds_disc);
      df_assert_close (fabs (b.enclosed_curvature_rad), G_PI / 2, 0.0, 1e-9);
      df_assert_close (b.residual_rad, 0.0, 0.0, 1e-9);

      measure_octant (spheroid, DF_COORDS_POLAR_MIN, G_PI / 2, shifts[k], &c);
      df_assert_close (c.enclosed_curvature_rad, G_PI / 2, 0.0, 1e-9);
      df_assert_close (c.holonomy_rad, G_PI / 2, 0.0, 1e-9);

      measure_octant (par, DF_COORDS_POLAR_MIN, 100.0, shifts[k], &d);
      g_test_message ("paraboloid: %s", d.disc_note);
      df_assert_close (d.enclosed_curvature_rad, par_want, 0.0, 1e-9);
      df_assert_close (d.holonomy_rad, par_want, 0.0, 1e-9);
      g_assert_false (d.has_other_disc);
    }
}

static void
test_octant_points (void)
{
  /* The same octant as points (the case: a CSV loop that starts at the pole, runs down
   * a meridian, along the equator and back up): simple, bounds a disc, with the octant's
   * pi/2 (Girard, from memory) to the spline's interpolation error, whether it starts at the
   * pole, passes through it or uses the south pole. */
  g_autoptr (df_surface) s = df_test_revolution ("sin(t)", "cos(t)", 0, G_PI);
  const size_t m = 100, n = 3 * m;
  g_autofree double (*uv)[2] = g_malloc (n * sizeof *uv);

  for (int variant = 0; variant < 3; variant++)
    {
      g_auto (df_loop_result) r = { 0 };

      for (size_t i = 0; i < n; i++)
        {
          size_t j = (i + (variant == 1 ? m + m / 2 : 0)) % n;
          double f = (double) (j % m) / m, t, ph;

          if (j < m)
            t = G_PI / 2 * f, ph = 0.0;
          else if (j < 2 * m)
            t = G_PI / 2, ph = G_PI / 2 * f;
          else
            t = G_PI / 2 * (1 - f), ph = G_PI / 2;
          if (variant == 2)
            t = G_PI - t;
          uv[i][0] = t;
          uv[i][1] = ph;
        }
      measure (s, (const double (*)[2]) uv, n, &r, NULL);
      g_assert_true (r.simple);
      g_assert_true (r.bounds_disc);
      df_assert_close (fabs (r.enclosed_curvature_rad), G_PI / 2, 1e-3, 0.0);
      df_assert_close (r.residual_rad, 0.0, 0.0, 1e-8);
    }
}

static void
test_vertex_near_pole (void)
{
  /* A small circle of angular radius 0.35 on the unit sphere passing the north pole at
   * distances 1e-2 ... 1e-8, one of its 60 points the closest: its cap carries
   * 2 pi (1 - cos 0.35) (Archimedes, from memory) wherever it lies. The spline through 60
   * points is within 1e-6 of it, and nothing crawls (each of these ran 6 s and failed before
   * the pole coordinates were chosen for steps that pass the pole). */
  g_autoptr (df_surface) s = df_test_revolution ("sin(t)", "cos(t)", 0, G_PI);
  const double rho = 0.35, want = 2 * G_PI * (1 - cos (rho));
  const size_t n = 60;

  for (double d = 1e-2; d >= 0.99e-8; d *= 0.1)
    {
      g_autofree double (*uv)[2] = g_malloc (n * sizeof *uv);
      g_auto (df_loop_result) r = { 0 };
      double ct = rho + d, c[3] = { sin (ct), 0, cos (ct) }, e1[3] = { cos (ct), 0, -sin (ct) };

      for (size_t i = 0; i < n; i++)
        {
          double a = G_PI + 2 * G_PI * i / n, p[3];

          for (int k = 0; k < 3; k++)
            p[k] = cos (rho) * c[k] + sin (rho) * (cos (a) * e1[k] + (k == 1 ? sin (a) : 0.0));
          uv[i][0] = acos (CLAMP (p[2], -1.0, 1.0));
          uv[i][1] = atan2 (p[1], p[0]);
        }
      measure (s, (const double (*)[2]) uv, n, &r, NULL);
      g_test_message ("d = %g: %.12g, %zu evaluations", d, r.enclosed_curvature_rad, r.rhs_evals);
      g_assert_true (r.bounds_disc);
      df_assert_close (fabs (r.enclosed_curvature_rad), want, 0.0, 1e-6);
      df_assert_close (r.residual_rad, 0.0, 0.0, 1e-9);
      g_assert_cmpuint (r.rhs_evals, <, 100000);
    }
}

static void
test_vertex_near_paraboloid_vertex (void)
{
  /* On the paraboloid r = t, z = -t^2/400 the pole-centred picture p = t (cos phi, sin phi) is
   * the graph chart (x, y) of z = -(x^2 + y^2)/400 itself, so a loop with a vertex 1e-2 ... 1e-8
   * from the pole, measured on the surface of revolution, must agree with the same loop on the
   * graph, which has no singular point (the graph's own route, an independent chart). */
  g_autoptr (df_surface) rev = df_test_revolution ("t", "-t^2/400", 0, 120);
  g_autoptr (df_surface) graph = df_test_graph ("-(x^2 + y^2)/400", -120, 120, -120, 120);
  const size_t n = 40;

  for (double d = 1e-2; d >= 0.99e-8; d *= 0.1)
    {
      double polar[40][2], cart[40][2];
      g_auto (df_loop_result) a = { 0 };
      g_auto (df_loop_result) b = { 0 };

      for (size_t i = 0; i < n; i++)
        {
          /* A wobbly loop through a point d from the vertex (i = 0), around (30, 10). */
          double th = G_PI + 2 * G_PI * i / n, rr = 31.6227766 * (1 + 0.1 * sin (3 * th) * (i != 0));
          double x = 30 + rr * cos (th + 0.32175055), y = 10 + rr * sin (th + 0.32175055);

          if (i == 0)
            x = d * 0.8, y = d * 0.6;
          cart[i][0] = x;
          cart[i][1] = y;
          polar[i][0] = hypot (x, y);
          polar[i][1] = atan2 (y, x);
        }
      measure (rev, (const double (*)[2]) polar, n, &a, NULL);
      measure (graph, (const double (*)[2]) cart, n, &b, NULL);
      g_test_message ("d = %g: %.12g %.12g", d, a.enclosed_curvature_rad, b.enclosed_curvature_rad);
      g_assert_true (a.bounds_disc);
      df_assert_close (a.enclosed_curvature_rad, b.enclosed_curvature_rad, 0.0, 1e-8);
      df_assert_close (a.holonomy_rad, b.holonomy_rad, 0.0, 1e-8);
      df_assert_close (a.area, b.area, 1e-8, 0.0);
    }
}

static void
test_pole_probe (void)
{
  /* At a pole the chart's metric is degenerate: the normal and curvatures are limits, exact
   * to rounding. Sphere of radius 3: K = 1/9, k1 = k2 = -1/3 with N outward (from memory). */
  g_autoptr (df_surface) s = df_test_revolution ("3*sin(t)", "3*cos(t)", 0, G_PI);
  /* Spheroid r = a sin t, z = c cos t: the meridian's radius of curvature at the pole is a^2/c
   * (ellipse, from memory), so k = -c/a^2 and K = c^2/a^4. */
  g_autoptr (df_surface) sph = df_test_revolution ("100*sin(t)", "60*cos(t)", 0, G_PI);
  /* Paraboloid z = -r^2/(4f): radius of curvature 2f at the vertex (from memory). */
  g_autoptr (df_surface) par = df_test_revolution ("t", "-t^2/(4*100)", 0, 120);
  df_point_geometry g;
  df_diag diag;

  g_assert_cmpint (df_surface_geometry (s, 0.0, 1.0, &g, &diag), ==, DF_OK);
  g_assert_false (g.chart_regular);
  g_assert_true (g.curvature_defined);
  df_assert_close (g.normal[2], 1.0, 0.0, 1e-12);
  df_assert_close (g.K, 1.0 / 9.0, 1e-12, 0.0);
  df_assert_close (g.H, -1.0 / 3.0, 1e-12, 0.0);
  df_assert_close (g.k1, -1.0 / 3.0, 1e-12, 0.0);
  df_assert_close (g.k2, -1.0 / 3.0, 1e-12, 0.0);
  /* The chart's own metric at the pole: g_tt = 9, g_phiphi = r^2 = 0. */
  df_assert_close (g.g[0][0], 9.0, 1e-12, 0.0);
  df_assert_close (g.g[1][1], 0.0, 0.0, 1e-20);
  g_assert_cmpint (df_surface_geometry (s, G_PI, 1.0, &g, &diag), ==, DF_OK);
  df_assert_close (g.normal[2], -1.0, 0.0, 1e-12);
  df_assert_close (g.K, 1.0 / 9.0, 1e-12, 0.0);
  for (int e = 0; e < 2; e++)
    {
      g_assert_cmpint (df_surface_geometry (sph, e ? G_PI : 0.0, 0.3, &g, &diag), ==, DF_OK);
      df_assert_close (g.K, 60.0 * 60.0 / 1e8, 1e-12, 0.0);
      df_assert_close (g.H, -60.0 / 1e4, 1e-12, 0.0);
    }
  g_assert_cmpint (df_surface_geometry (par, 0.0, 0.0, &g, &diag), ==, DF_OK);
  df_assert_close (g.K, 1.0 / (200.0 * 200.0), 1e-12, 0.0);
  df_assert_close (g.k1, -1.0 / 200.0, 1e-12, 0.0);
  /* The limit agrees with the regular formula beside the pole (continuity of K). */
  {
    df_point_geometry near;

    g_assert_cmpint (df_surface_geometry (sph, 1e-5, 0.3, &near, &diag), ==, DF_OK);
    g_assert_true (near.chart_regular);
    df_assert_close (near.K, 60.0 * 60.0 / 1e8, 1e-8, 0.0);
  }
}

static void
test_apex_probe (void)
{
  /* A cone apex of half-angle 30 deg: no K or H, concentrated curvature 2 pi (1 - sin 30 deg)
   * = pi (GEOMETRY.md; the unrolled cone's angle deficit, from memory). */
  g_autoptr (df_surface) s = df_test_revolution ("t*sin(pi/6)", "-t*cos(pi/6)", 0, 3);
  df_point_geometry g;
  df_diag diag;

  g_assert_cmpint (df_surface_geometry (s, 0.0, 0.0, &g, &diag), ==, DF_OK);
  g_assert_false (g.curvature_defined);
  df_assert_close (g.concentrated_rad, G_PI, 1e-12, 0.0);
  g_assert_nonnull (strstr (g.note, "apex"));
}

int
main (int argc, char **argv)
{
  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);
  g_test_add_func ("/core/poles/circle-through-north-pole", test_circle_through_north_pole);
  g_test_add_func ("/core/poles/circle-through-south-pole", test_circle_through_south_pole);
  g_test_add_func ("/core/poles/paraboloid-two-charts", test_paraboloid_two_charts);
  g_test_add_func ("/core/poles/cone-apex-outside", test_cone_apex_outside);
  g_test_add_func ("/core/poles/both-caps", test_both_caps);
  g_test_add_func ("/core/poles/near-both-poles", test_near_both_poles);
  g_test_add_func ("/core/poles/octant-loops", test_octant_loops);
  g_test_add_func ("/core/poles/octant-points", test_octant_points);
  g_test_add_func ("/core/poles/vertex-near-pole", test_vertex_near_pole);
  g_test_add_func ("/core/poles/vertex-near-paraboloid-vertex", test_vertex_near_paraboloid_vertex);
  g_test_add_func ("/core/poles/pole-probe", test_pole_probe);
  g_test_add_func ("/core/poles/apex-probe", test_apex_probe);
  return g_test_run ();
}
