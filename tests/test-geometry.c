/* test-geometry.c: local geometry at a chart point: curvatures of textbook surfaces, Christoffel
 * symbols against closed forms and against the general formula with GSL numerical metric
 * derivatives (gsl_deriv_central), their derivatives, the Riemann tensor (Theorema Egregium,
 * symmetries, Bianchi) and limits at a pole. Surfaces are built from formulas here, so the
 * tests do not depend on the presets. */
#include <gsl/gsl_deriv.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include <string.h>

#include "df-glib.h"
#include "df-test.h"


/* ---- helpers ---- */

static void
geometry_or_die (const df_surface *s, double u, double v, df_point_geometry *geo)
{
  df_diag diag;
  df_status st = df_surface_geometry (s, u, v, geo, &diag);

  if (st != DF_OK)
    g_error ("geometry at (%g, %g): %s: %s", u, v, df_status_describe (st), diag.detail);
  g_assert_true (geo->chart_regular);
}

/* Surfaces used by the tensor checks, with a sampling box inside the domain that leaves room
 * for the numerical derivative's steps. */
typedef struct
{
  const char *name;
  bool        graph;
  const char *a, *b;          /* revolution: r, z; graph: f, unused */
  double      dom[4];         /* construction domain (v range unused for revolution) */
  double      box[4];         /* sampling box */
} surface_case;

static const surface_case cases[] = {
  { "sphere", false, "2*sin(t)", "2*cos(t)", { 0, G_PI, 0, 0 }, { 0.2, G_PI - 0.2, -G_PI, G_PI } },
  { "torus", false, "3 + cos(t)", "-sin(t)", { -G_PI, G_PI, 0, 0 }, { -3, 3, -G_PI, G_PI } },
  { "catenoid", false, "1.3*cosh(t/1.3)", "t", { -2, 2, 0, 0 }, { -1.9, 1.9, -G_PI, G_PI } },
  { "pseudosphere", false, "1.5/cosh(t)", "1.5*(t - tanh(t))", { 0.2, 3, 0, 0 },
    { 0.3, 2.9, -G_PI, G_PI } },
  { "profile", false, "2 + 0.5*sin(t) + 0.1*t^2", "t + 0.3*cos(2*t)", { -1, 2, 0, 0 },
    { -0.9, 1.9, -G_PI, G_PI } },
  { "saddle", true, "x*y", NULL, { -1.5, 1.5, -1.5, 1.5 }, { -1.4, 1.4, -1.4, 1.4 } },
  { "bumps", true, "0.5*sin(x)*cos(y) + 0.2*x*y^2", NULL, { -2, 2, -2, 2 },
    { -1.9, 1.9, -1.9, 1.9 } },
};

static df_surface *
case_surface (const surface_case *c)
{
  if (c->graph)
    return df_test_graph (c->a, c->dom[0], c->dom[1], c->dom[2], c->dom[3]);
  return df_test_revolution (c->a, c->b, c->dom[0], c->dom[1]);
}

static void
case_point (const surface_case *c, GRand *rng, double *u, double *v)
{
  *u = g_rand_double_range (rng, c->box[0], c->box[1]);
  *v = g_rand_double_range (rng, c->box[2], c->box[3]);
}

/* Hand-written derivatives of the "bumps" graph f = 0.5 sin x cos y + 0.2 x y^2
 * (rules of calculus, from memory): fd = f_x, f_y, f_xx, f_xy, f_yy. */
static void
bumps_derivs (double x, double y, double fd[5])
{
  fd[0] = 0.5 * cos (x) * cos (y) + 0.2 * y * y;
  fd[1] = -0.5 * sin (x) * sin (y) + 0.4 * x * y;
  fd[2] = -0.5 * sin (x) * cos (y);
  fd[3] = -0.5 * cos (x) * sin (y) + 0.4 * y;
  fd[4] = -0.5 * sin (x) * cos (y) + 0.4 * x;
}

/* Hand-written profile derivatives of the "profile" case: r, r', r'', z', z''. */
static void
profile_derivs (double t, double pd[5])
{
  pd[0] = 2 + 0.5 * sin (t) + 0.1 * t * t;
  pd[1] = 0.5 * cos (t) + 0.2 * t;
  pd[2] = -0.5 * sin (t) + 0.2;
  pd[3] = 1 - 0.6 * sin (2 * t);
  pd[4] = -1.2 * cos (2 * t);
}

/* Curvatures of a Monge patch z = f(x, y) with N upward (do Carmo, Differential Geometry of
 * Curves and Surfaces, sec. 3-3, from memory):
 * K = (f_xx f_yy - f_xy^2) / W^4, H = ((1 + f_y^2) f_xx - 2 f_x f_y f_xy + (1 + f_x^2) f_yy)
 * / (2 W^3), W = sqrt(1 + f_x^2 + f_y^2). */
static void
monge_curvatures (const double fd[5], double *K, double *H)
{
  double w2 = 1 + fd[0] * fd[0] + fd[1] * fd[1];

  *K = (fd[2] * fd[4] - fd[3] * fd[3]) / (w2 * w2);
  *H = ((1 + fd[1] * fd[1]) * fd[2] - 2 * fd[0] * fd[1] * fd[3] + (1 + fd[0] * fd[0]) * fd[4])
       / (2 * w2 * sqrt (w2));
}

static void
check_principal (const df_point_geometry *geo, double ka, double kb)
{
  double hi = MAX (ka, kb), lo = MIN (ka, kb);

  df_assert_close (geo->k1, hi, 1e-9, 1e-9);
  df_assert_close (geo->k2, lo, 1e-9, 1e-9);
  df_assert_close (geo->H, 0.5 * (ka + kb), 1e-9, 1e-10);
  df_assert_close (geo->K, ka * kb, 1e-9, 1e-10);
}

/* ---- curvatures of textbook surfaces ---- */

static void
test_sphere_curvature (void)
{
  const double R = 2.0;
  g_autoptr (df_surface) s = df_test_revolution ("2*sin(t)", "2*cos(t)", 0.0, G_PI);
  g_autoptr (GRand) rng = g_rand_new_with_seed (7);

  for (int i = 0; i < 20; i++)
    {
      double t = g_rand_double_range (rng, 0.05, G_PI - 0.05);
      double phi = g_rand_double_range (rng, -G_PI, G_PI);
      df_point_geometry geo;

      geometry_or_die (s, t, phi, &geo);
      /* Sphere: K = 1/R^2, |H| = 1/R, every point umbilic (do Carmo sec. 3-2, from memory).
       * The profile runs downward, so N points outward (GEOMETRY.md); with II = X_ij . N the
       * normal curvature is then -1/R (do Carmo sec. 3-2: outward normal, k = -1/R). */
      df_assert_close (geo.K, 1 / (R * R), 1e-10, 0.0);
      df_assert_close (fabs (geo.H), 1 / R, 1e-10, 0.0);
      df_assert_close (geo.H, -1 / R, 1e-10, 0.0);
      df_assert_close (geo.k1, -1 / R, 1e-7, 0.0);
      df_assert_close (geo.k2, -1 / R, 1e-7, 0.0);
      /* Outward normal N = X / R, and from X . X = R^2: X_ij . X = -g_ij, so II = -g / R
       * (derived by hand). */
      for (int k = 0; k < 3; k++)
        df_assert_close (geo.normal[k], geo.point[k] / R, 0.0, 1e-12);
      for (int a = 0; a < 2; a++)
        for (int b = 0; b < 2; b++)
          df_assert_close (geo.second_form[a][b], -geo.g[a][b] / R, 0.0, 1e-12);
      /* Metric of the sphere in (t, phi): diag(R^2, R^2 sin^2 t) (from memory). */
      df_assert_close (geo.g[0][0], R * R, 1e-13, 0.0);
      df_assert_close (geo.g[1][1], R * R * sin (t) * sin (t), 1e-12, 0.0);
      df_assert_close (geo.g[0][1], 0.0, 0.0, 1e-13);
      df_assert_close (geo.det_g, R * R * R * R * sin (t) * sin (t), 1e-12, 0.0);
      df_assert_close (geo.ginv[1][1], 1 / (R * R * sin (t) * sin (t)), 1e-12, 0.0);
    }
}

static void
test_cylinder_curvature (void)
{
  const double R = 1.5;
  g_autoptr (df_surface) out = df_test_revolution ("1.5", "-t", -1.0, 1.0);
  g_autoptr (df_surface) in = df_test_revolution ("1.5", "t", -1.0, 1.0);
  df_point_geometry geo;

  /* Cylinder: K = 0, |H| = 1/(2R), principal curvatures 0 and 1/R in size (do Carmo sec. 3-2,
   * from memory). z = -t: N outward, the circle bends away from N, so k1 = 0, k2 = -1/R;
   * z = t: N toward the axis, k1 = 1/R, k2 = 0 (GEOMETRY.md orientation, derived by hand). */
  geometry_or_die (out, 0.3, 1.1, &geo);
  df_assert_close (geo.K, 0.0, 0.0, 1e-12);
  df_assert_close (fabs (geo.H), 1 / (2 * R), 1e-10, 0.0);
  df_assert_close (geo.k1, 0.0, 0.0, 1e-10);
  df_assert_close (geo.k2, -1 / R, 1e-10, 0.0);
  df_assert_close (geo.normal[0], cos (1.1), 0.0, 1e-12);
  df_assert_close (geo.normal[1], sin (1.1), 0.0, 1e-12);
  df_assert_close (geo.normal[2], 0.0, 0.0, 1e-12);

  geometry_or_die (in, -0.6, -2.0, &geo);
  df_assert_close (geo.K, 0.0, 0.0, 1e-12);
  df_assert_close (geo.H, 1 / (2 * R), 1e-10, 0.0);
  df_assert_close (geo.k1, 1 / R, 1e-10, 0.0);
  df_assert_close (geo.k2, 0.0, 0.0, 1e-10);
  df_assert_close (geo.normal[0], -cos (-2.0), 0.0, 1e-12);
  df_assert_close (geo.normal[1], -sin (-2.0), 0.0, 1e-12);
}

static void
test_torus_curvature (void)
{
  const double R = 3.0, a = 1.0;
  g_autoptr (df_surface) s = df_test_revolution ("3 + cos(t)", "-sin(t)", -G_PI, G_PI);

  /* Torus r = R + a cos t, z = -a sin t. Arc length s = a t, so with K = -r''(s)/r for a
   * profile in arc length (do Carmo sec. 3-3, from memory) K = cos t / (a (R + a cos t)); the
   * sign of z does not enter. Principal curvatures (derived by hand from II_tt = (r'z'' -
   * z'r'')/|c'|, II_phiphi = r z'/|c'|): meridian -1/a, parallel -cos t/(R + a cos t), both
   * with N = (-z' e_r + r' e_z)/|c'| pointing out of the tube. */
  for (int i = 0; i <= 16; i++)
    {
      double t = -3.1 + 6.2 * i / 16, phi = 0.37 * i - 2.0;
      df_point_geometry geo;

      geometry_or_die (s, t, phi, &geo);
      df_assert_close (geo.K, cos (t) / (a * (R + a * cos (t))), 1e-9, 1e-12);
      check_principal (&geo, -1 / a, -cos (t) / (R + a * cos (t)));
      /* Out of the tube: N = (X - tube centre) / a. */
      {
        double c[3] = { R * cos (phi), R * sin (phi), 0.0 };

        for (int k = 0; k < 3; k++)
          df_assert_close (geo.normal[k], (geo.point[k] - c[k]) / a, 0.0, 1e-12);
      }
    }
}

static void
test_catenoid_curvature (void)
{
  const double c = 1.3;
  g_autoptr (df_surface) s = df_test_revolution ("1.3*cosh(t/1.3)", "t", -2.0, 2.0);

  /* Catenoid r = c cosh(t/c), z = t: K = -1/(c^2 cosh^4(t/c)), a minimal surface H = 0, so
   * k1 = -k2 = 1/(c cosh^2(t/c)) (do Carmo sec. 3-5, from memory). */
  for (int i = 0; i <= 10; i++)
    {
      double t = -1.9 + 3.8 * i / 10, ch = cosh (t / c);
      df_point_geometry geo;

      geometry_or_die (s, t, 0.5 * i, &geo);
      df_assert_close (geo.K, -1 / (c * c * pow (ch, 4)), 1e-9, 0.0);
      df_assert_close (geo.H, 0.0, 0.0, 1e-12);
      df_assert_close (geo.k1, 1 / (c * ch * ch), 1e-9, 0.0);
      df_assert_close (geo.k2, -1 / (c * ch * ch), 1e-9, 0.0);
    }
}

static void
test_pseudosphere_curvature (void)
{
  const double a = 1.5;
  g_autoptr (df_surface) s = df_test_revolution ("1.5/cosh(t)", "1.5*(t - tanh(t))", 0.2, 3.0);

  /* Tractrix of length a about its asymptote: constant K = -1/a^2 (do Carmo sec. 3-3,
   * from memory). */
  for (int i = 0; i <= 10; i++)
    {
      double t = 0.25 + 2.7 * i / 10;
      df_point_geometry geo;

      geometry_or_die (s, t, 1.0 - 0.3 * i, &geo);
      df_assert_close (geo.K, -1 / (a * a), 1e-9, 0.0);
      df_assert_close (geo.k1 * geo.k2, -1 / (a * a), 1e-8, 0.0);
    }
}

static void
test_generic_revolution_curvature (void)
{
  const surface_case *c = &cases[4];
  g_autoptr (df_surface) s = case_surface (c);

  g_assert_cmpstr (c->name, ==, "profile");
  /* Any profile: with N = (-z' e_r + r' e_z)/|c'|, II_tt = (r'z'' - z'r'')/|c'|,
   * II_phiphi = r z'/|c'|, II_tphi = 0, g = diag(|c'|^2, r^2), so the principal curvatures are
   * (r'z'' - z'r'')/|c'|^3 and z'/(r |c'|) (derived by hand; the unit-speed case is do Carmo
   * sec. 3-3). */
  for (int i = 0; i <= 12; i++)
    {
      double t = -0.95 + 2.9 * i / 12, pd[5], sp;
      df_point_geometry geo;

      profile_derivs (t, pd);
      sp = hypot (pd[1], pd[3]);
      geometry_or_die (s, t, 0.4 * i, &geo);
      check_principal (&geo, (pd[1] * pd[4] - pd[3] * pd[2]) / (sp * sp * sp),
                       pd[3] / (pd[0] * sp));
    }
}

static void
test_graph_curvature (void)
{
  const double a = 1.5;
  g_autoptr (df_surface) paraboloid = df_test_graph ("(x^2 + y^2)/(2*1.5)", -2, 2, -2, 2);
  g_autoptr (df_surface) saddle = df_test_graph ("x*y", -1.5, 1.5, -1.5, 1.5);
  g_autoptr (df_surface) bumps = case_surface (&cases[6]);
  g_autoptr (GRand) rng = g_rand_new_with_seed (11);

  for (int i = 0; i < 20; i++)
    {
      double x = g_rand_double_range (rng, -1.4, 1.4), y = g_rand_double_range (rng, -1.4, 1.4);
      double rho2 = x * x + y * y, w2, fd[5], K, H;
      df_point_geometry geo;

      /* Paraboloid z = (x^2 + y^2)/(2a): the graph formula gives
       * K = (1/a^2) / (1 + rho^2/a^2)^2 (GEOMETRY.md, do Carmo sec. 3-3, from memory). */
      geometry_or_die (paraboloid, x, y, &geo);
      df_assert_close (geo.K, 1 / (a * a) / pow (1 + rho2 / (a * a), 2), 1e-9, 0.0);
      g_assert_cmpfloat (geo.H, >, 0.0);   /* N upward, the bowl curves toward it */

      /* Saddle z = x y: K = -1/(1 + x^2 + y^2)^2, H = -x y/(1 + x^2 + y^2)^(3/2)
       * (Monge patch, do Carmo sec. 3-3, from memory). */
      geometry_or_die (saddle, x, y, &geo);
      w2 = 1 + rho2;
      df_assert_close (geo.K, -1 / (w2 * w2), 1e-9, 0.0);
      df_assert_close (geo.H, -x * y / (w2 * sqrt (w2)), 1e-9, 1e-12);

      /* A graph with no symmetry, against the Monge formulas with hand derivatives; the
       * normal is (-f_x, -f_y, 1)/W. */
      geometry_or_die (bumps, x, y, &geo);
      bumps_derivs (x, y, fd);
      monge_curvatures (fd, &K, &H);
      df_assert_close (geo.K, K, 1e-9, 1e-12);
      df_assert_close (geo.H, H, 1e-9, 1e-12);
      df_assert_close (geo.k1 + geo.k2, 2 * H, 1e-9, 1e-12);
      df_assert_close (geo.k1 * geo.k2, K, 1e-8, 1e-12);
      g_assert_cmpfloat (geo.k1, >=, geo.k2);
      w2 = 1 + fd[0] * fd[0] + fd[1] * fd[1];
      df_assert_close (geo.normal[0], -fd[0] / sqrt (w2), 0.0, 1e-12);
      df_assert_close (geo.normal[1], -fd[1] / sqrt (w2), 0.0, 1e-12);
      df_assert_close (geo.normal[2], 1 / sqrt (w2), 0.0, 1e-12);
    }
}

static void
test_paraboloid_two_charts (void)
{
  /* The same paraboloid as a graph and as a surface of revolution (r = t, z = t^2/(2a), which
   * runs upward, so N points up and inward, as the graph's does): every curvature at the same
   * space point must agree, whatever the chart (K and H are chart-independent: do Carmo
   * sec. 3-3, from memory). */
  g_autoptr (df_surface) graph = df_test_graph ("(x^2 + y^2)/3", -2, 2, -2, 2);
  g_autoptr (df_surface) rev = df_test_revolution ("t", "t^2/3", 0.0, 2.5);

  for (int i = 1; i <= 8; i++)
    {
      double phi = 0.8 * i - 3.0, t = 0.2 * i;
      df_point_geometry gg, gr;

      geometry_or_die (graph, t * cos (phi), t * sin (phi), &gg);
      geometry_or_die (rev, t, phi, &gr);
      for (int k = 0; k < 3; k++)
        {
          df_assert_close (gr.point[k], gg.point[k], 0.0, 1e-14);
          df_assert_close (gr.normal[k], gg.normal[k], 0.0, 1e-12);
        }
      df_assert_close (gr.K, gg.K, 1e-10, 0.0);
      df_assert_close (gr.H, gg.H, 1e-10, 0.0);
      df_assert_close (gr.k1, gg.k1, 1e-8, 0.0);
      df_assert_close (gr.k2, gg.k2, 1e-8, 0.0);
    }
}

/* ---- Christoffel symbols ---- */

static void
test_christoffel_closed_forms (void)
{
  g_autoptr (df_surface) rev = case_surface (&cases[4]);
  g_autoptr (df_surface) graph = case_surface (&cases[6]);
  g_autoptr (GRand) rng = g_rand_new_with_seed (3);

  for (int i = 0; i < 20; i++)
    {
      double t, phi, x, y, pd[5], fd[5], sp2, w2, gamma[2][2][2];
      double want[2][2][2];
      df_point_geometry geo;

      /* Revolution (GEOMETRY.md): Gamma^t_tt = (r'r'' + z'z'')/(r'^2 + z'^2),
       * Gamma^t_phiphi = -r r'/(r'^2 + z'^2), Gamma^phi_tphi = r'/r, the rest zero. */
      case_point (&cases[4], rng, &t, &phi);
      profile_derivs (t, pd);
      sp2 = pd[1] * pd[1] + pd[3] * pd[3];
      memset (want, 0, sizeof want);
      want[0][0][0] = (pd[1] * pd[2] + pd[3] * pd[4]) / sp2;
      want[0][1][1] = -pd[0] * pd[1] / sp2;
      want[1][0][1] = want[1][1][0] = pd[1] / pd[0];
      geometry_or_die (rev, t, phi, &geo);
      g_assert_cmpint (df_surface_christoffel (rev, t, phi, gamma, NULL), ==, DF_OK);
      for (int k = 0; k < 2; k++)
        for (int a = 0; a < 2; a++)
          for (int b = 0; b < 2; b++)
            {
              df_assert_close (geo.gamma[k][a][b], want[k][a][b], 1e-11, 1e-13);
              df_assert_close (gamma[k][a][b], want[k][a][b], 1e-11, 1e-13);
            }

      /* Graph (GEOMETRY.md): Gamma^k_ij = f_k f_ij / (1 + |grad f|^2). */
      case_point (&cases[6], rng, &x, &y);
      bumps_derivs (x, y, fd);
      w2 = 1 + fd[0] * fd[0] + fd[1] * fd[1];
      geometry_or_die (graph, x, y, &geo);
      g_assert_cmpint (df_surface_christoffel (graph, x, y, gamma, NULL), ==, DF_OK);
      for (int k = 0; k < 2; k++)
        for (int a = 0; a < 2; a++)
          for (int b = 0; b < 2; b++)
            {
              double w = fd[k] * fd[2 + a + b] / w2;

              df_assert_close (geo.gamma[k][a][b], w, 1e-11, 1e-13);
              df_assert_close (gamma[k][a][b], w, 1e-11, 1e-13);
            }
    }
}

typedef struct
{
  const df_surface *surface;
  int    what;     /* 0: g_ab, 1: Gamma^k_ab */
  int    k, a, b;
  int    dir;      /* 0: vary u, 1: vary v */
  double u, v;
} field_fixture;

static double
field_component (double w, void *data)
{
  const field_fixture *fx = data;
  double u = fx->dir == 0 ? w : fx->u, v = fx->dir == 1 ? w : fx->v;

  if (fx->what == 0)
    {
      df_chart_jet jet;

      g_assert_cmpint (df_surface_eval (fx->surface, u, v, 1, &jet, NULL), ==, DF_OK);
      return jet.d1[fx->a][0] * jet.d1[fx->b][0] + jet.d1[fx->a][1] * jet.d1[fx->b][1]
             + jet.d1[fx->a][2] * jet.d1[fx->b][2];
    }
  else
    {
      double gamma[2][2][2];

      g_assert_cmpint (df_surface_christoffel (fx->surface, u, v, gamma, NULL), ==, DF_OK);
      return gamma[fx->k][fx->a][fx->b];
    }
}

/* d/d(u or v) of a field by GSL's five-point central difference. */
static double
numeric_partial (const df_surface *s, int what, int k, int a, int b, int dir, double u,
                 double v)
{
  field_fixture fx = { s, what, k, a, b, dir, u, v };
  gsl_function fn = { field_component, &fx };
  double result = NAN, abserr = NAN;

  g_assert_cmpint (gsl_deriv_central (&fn, dir == 0 ? u : v, 1e-3, &result, &abserr), ==,
                   GSL_SUCCESS);
  g_assert_cmpfloat (abserr, <, 1e-6);
  return result;
}

static void
test_christoffel_general (void)
{
  g_autoptr (GRand) rng = g_rand_new_with_seed (5);

  /* Gamma^k_ij = 1/2 g^kl (d_i g_jl + d_j g_il - d_l g_ij) (GEOMETRY.md; do Carmo sec. 4-3,
   * from memory), with the metric's derivatives taken numerically by gsl_deriv_central. */
  for (guint c = 0; c < G_N_ELEMENTS (cases); c++)
    {
      g_autoptr (df_surface) s = case_surface (&cases[c]);

      g_test_message ("surface %s", cases[c].name);
      for (int i = 0; i < 6; i++)
        {
          double u, v, dg[2][2][2];
          df_point_geometry geo;

          case_point (&cases[c], rng, &u, &v);
          geometry_or_die (s, u, v, &geo);
          for (int m = 0; m < 2; m++)
            for (int a = 0; a < 2; a++)
              for (int b = 0; b < 2; b++)
                dg[m][a][b] = numeric_partial (s, 0, 0, a, b, m, u, v);
          for (int k = 0; k < 2; k++)
            for (int i1 = 0; i1 < 2; i1++)
              for (int j1 = 0; j1 < 2; j1++)
                {
                  double want = 0.0;

                  for (int l = 0; l < 2; l++)
                    want += 0.5 * geo.ginv[k][l]
                            * (dg[i1][j1][l] + dg[j1][i1][l] - dg[l][i1][j1]);
                  df_assert_close (geo.gamma[k][i1][j1], want, 1e-7, 1e-8);
                }
        }
    }
}

static void
test_dgamma (void)
{
  g_autoptr (GRand) rng = g_rand_new_with_seed (9);

  /* dgamma[m][k][i][j] = d_m Gamma^k_ij against gsl_deriv_central of Gamma. */
  for (guint c = 0; c < G_N_ELEMENTS (cases); c++)
    {
      g_autoptr (df_surface) s = case_surface (&cases[c]);

      g_test_message ("surface %s", cases[c].name);
      for (int i = 0; i < 6; i++)
        {
          double u, v;
          df_point_geometry geo;

          case_point (&cases[c], rng, &u, &v);
          geometry_or_die (s, u, v, &geo);
          for (int m = 0; m < 2; m++)
            for (int k = 0; k < 2; k++)
              for (int a = 0; a < 2; a++)
                for (int b = 0; b < 2; b++)
                  df_assert_close (geo.dgamma[m][k][a][b], numeric_partial (s, 1, k, a, b, m, u, v),
                                   1e-6, 1e-7);
        }
    }
}

/* ---- Riemann tensor ---- */

/* R_rsmn = g_rk R^k_smn. */
static double
riemann_lowered (const df_point_geometry *geo, int r, int s, int m, int n)
{
  return geo->g[r][0] * geo->riemann[0][s][m][n] + geo->g[r][1] * geo->riemann[1][s][m][n];
}

static void
test_theorema_egregium (void)
{
  g_autoptr (GRand) rng = g_rand_new_with_seed (13);

  /* Gauss's Theorema Egregium: R_1212 = K (g11 g22 - g12^2), with K from the second
   * fundamental form and R from the metric alone (do Carmo sec. 4-3, from memory). Also the
   * lowered tensor's symmetries R_rsmn = -R_srmn = R_mnrs (from memory). */
  for (guint c = 0; c < G_N_ELEMENTS (cases); c++)
    {
      g_autoptr (df_surface) s = case_surface (&cases[c]);
      double k_min = INFINITY, k_max = -INFINITY;

      g_test_message ("surface %s", cases[c].name);
      for (int i = 0; i < 40; i++)
        {
          double u, v, scale;
          df_point_geometry geo;

          case_point (&cases[c], rng, &u, &v);
          geometry_or_die (s, u, v, &geo);
          scale = fabs (geo.K) * geo.det_g + 1e-12 * geo.det_g;
          df_assert_close (riemann_lowered (&geo, 0, 1, 0, 1), geo.K * geo.det_g, 1e-8,
                           1e-10 * geo.det_g);
          for (int r = 0; r < 2; r++)
            for (int sg = 0; sg < 2; sg++)
              for (int m = 0; m < 2; m++)
                for (int n = 0; n < 2; n++)
                  {
                    double x = riemann_lowered (&geo, r, sg, m, n);

                    df_assert_close (x, -riemann_lowered (&geo, sg, r, m, n), 0.0, 1e-9 * scale);
                    df_assert_close (x, riemann_lowered (&geo, m, n, r, sg), 0.0, 1e-9 * scale);
                  }
          k_min = MIN (k_min, geo.K);
          k_max = MAX (k_max, geo.K);
        }
      /* Not a vacuous check: every surface here has curvature somewhere. */
      g_assert_cmpfloat (MAX (fabs (k_min), fabs (k_max)), >, 0.01);
    }
}

static void
test_riemann_identities (void)
{
  g_autoptr (GRand) rng = g_rand_new_with_seed (17);

  /* R^r_smn = -R^r_snm and the first Bianchi identity R^r_smn + R^r_mns + R^r_nsm = 0 (from
   * memory; hold for any torsion-free connection). */
  for (guint c = 0; c < G_N_ELEMENTS (cases); c++)
    {
      g_autoptr (df_surface) s = case_surface (&cases[c]);

      for (int i = 0; i < 20; i++)
        {
          double u, v, scale = 0.0;
          df_point_geometry geo;

          case_point (&cases[c], rng, &u, &v);
          geometry_or_die (s, u, v, &geo);
          for (int r = 0; r < 2; r++)
            for (int sg = 0; sg < 2; sg++)
              for (int m = 0; m < 2; m++)
                for (int n = 0; n < 2; n++)
                  scale = MAX (scale, fabs (geo.riemann[r][sg][m][n]));
          scale = MAX (scale, 1e-6);
          for (int r = 0; r < 2; r++)
            for (int sg = 0; sg < 2; sg++)
              for (int m = 0; m < 2; m++)
                for (int n = 0; n < 2; n++)
                  {
                    df_assert_close (geo.riemann[r][sg][m][n], -geo.riemann[r][sg][n][m], 0.0,
                                     1e-12 * scale);
                    df_assert_close (geo.riemann[r][sg][m][n] + geo.riemann[r][m][n][sg]
                                     + geo.riemann[r][n][sg][m], 0.0, 0.0, 1e-9 * scale);
                  }
        }
    }
}

static void
test_sphere_riemann (void)
{
  g_autoptr (df_surface) s = df_test_revolution ("sin(t)", "cos(t)", 0.0, G_PI);

  /* Unit sphere in (t, phi): Gamma^t_phiphi = -sin t cos t, Gamma^phi_tphi = cot t, so
   * R^t_phitphi = d_t Gamma^t_phiphi - Gamma^t_phiphi Gamma^phi_tphi = -cos 2t + cos^2 t
   * = sin^2 t, and R^phi_tphit = g^phiphi R_phitphit = 1 (from memory, checked by hand).
   * Index 0 = t, 1 = phi. */
  for (int i = 1; i < 12; i++)
    {
      double t = G_PI * i / 12;
      df_point_geometry geo;

      geometry_or_die (s, t, 0.3 * i, &geo);
      df_assert_close (geo.riemann[0][1][0][1], sin (t) * sin (t), 1e-10, 1e-13);
      df_assert_close (geo.riemann[0][1][1][0], -sin (t) * sin (t), 1e-10, 1e-13);
      df_assert_close (geo.riemann[1][0][1][0], 1.0, 1e-10, 0.0);
      df_assert_close (geo.riemann[1][0][0][1], -1.0, 1e-10, 0.0);
      df_assert_close (geo.riemann[0][0][0][1], 0.0, 0.0, 1e-12);
      df_assert_close (geo.riemann[1][1][0][1], 0.0, 0.0, 1e-12);
      df_assert_close (geo.gamma[0][1][1], -sin (t) * cos (t), 1e-12, 1e-14);
      df_assert_close (geo.gamma[1][0][1], cos (t) / sin (t), 1e-12, 1e-14);
    }
}

/* ---- poles and the area integrand ---- */

static void
test_pole (void)
{
  const double R = 2.0, a = 1.5;
  g_autoptr (df_surface) sphere = df_test_revolution ("2*sin(t)", "2*cos(t)", 0.0, G_PI);
  g_autoptr (df_surface) paraboloid = df_test_revolution ("t", "t^2/(2*1.5)", 0.0, 2.0);
  df_point_geometry geo;
  df_diag diag;
  double gamma[2][2][2];

  /* North pole: the chart is singular but the surface is smooth; N = (0, 0, 1) (outward) and
   * K, H are the limits 1/R^2 and -1/R (df-geometry.h; sphere values as above). */
  g_assert_cmpint (df_surface_geometry (sphere, 0.0, 0.7, &geo, &diag), ==, DF_OK);
  g_assert_false (geo.chart_regular);
  df_assert_close (geo.point[0], 0.0, 0.0, 1e-15);
  df_assert_close (geo.point[2], R, 1e-15, 0.0);
  df_assert_close (geo.normal[0], 0.0, 0.0, 1e-12);
  df_assert_close (geo.normal[1], 0.0, 0.0, 1e-12);
  df_assert_close (geo.normal[2], 1.0, 1e-12, 0.0);
  df_assert_close (geo.K, 1 / (R * R), 1e-6, 0.0);
  df_assert_close (geo.H, -1 / R, 1e-6, 0.0);
  df_assert_close (geo.det_g, 0.0, 0.0, 0.0);

  /* South pole: N = (0, 0, -1). */
  g_assert_cmpint (df_surface_geometry (sphere, G_PI, -1.0, &geo, &diag), ==, DF_OK);
  g_assert_false (geo.chart_regular);
  df_assert_close (geo.normal[2], -1.0, 1e-12, 0.0);
  df_assert_close (geo.K, 1 / (R * R), 1e-6, 0.0);

  /* The Christoffel symbols do blow up there (Gamma^phi_tphi = r'/r): an error, not inf. */
  g_assert_cmpint (df_surface_christoffel (sphere, 0.0, 0.7, gamma, &diag), ==, DF_E_SINGULAR);

  /* Vertex of the paraboloid z = rho^2/(2a): K = 1/a^2, H = 1/a with N up (graph formula at
   * the origin: f_xx = f_yy = 1/a; do Carmo sec. 3-3, from memory). Here K varies with t, so
   * the limit is a real extrapolation. */
  g_assert_cmpint (df_surface_geometry (paraboloid, 0.0, 0.2, &geo, &diag), ==, DF_OK);
  g_assert_false (geo.chart_regular);
  df_assert_close (geo.normal[2], 1.0, 1e-12, 0.0);
  df_assert_close (geo.K, 1 / (a * a), 1e-6, 0.0);
  df_assert_close (geo.H, 1 / a, 1e-6, 0.0);
  df_assert_close (geo.k1, 1 / a, 1e-3, 0.0);
  df_assert_close (geo.k2, 1 / a, 1e-3, 0.0);
}

static void
test_k_area (void)
{
  g_autoptr (GRand) rng = g_rand_new_with_seed (19);

  /* The area integrand: K sqrt(det g) and sqrt(det g) (df-geometry.h), by the definition
   * dA = sqrt(det g) du dv (do Carmo sec. 2-5, from memory), against the full geometry. */
  for (guint c = 0; c < G_N_ELEMENTS (cases); c++)
    {
      g_autoptr (df_surface) s = case_surface (&cases[c]);

      for (int i = 0; i < 10; i++)
        {
          double u, v, ksg = NAN, sg = NAN;
          df_point_geometry geo;

          case_point (&cases[c], rng, &u, &v);
          geometry_or_die (s, u, v, &geo);
          g_assert_cmpint (df_surface_k_area (s, u, v, &ksg, &sg, NULL), ==, DF_OK);
          df_assert_close (sg, sqrt (geo.det_g), 1e-12, 0.0);
          df_assert_close (ksg, geo.K * sqrt (geo.det_g), 1e-9, 1e-13);
        }
    }
}

int
main (int argc, char **argv)
{
  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);

  g_test_add_func ("/core/geometry/sphere-curvature", test_sphere_curvature);
  g_test_add_func ("/core/geometry/cylinder-curvature", test_cylinder_curvature);
  g_test_add_func ("/core/geometry/torus-curvature", test_torus_curvature);
  g_test_add_func ("/core/geometry/catenoid-curvature", test_catenoid_curvature);
  g_test_add_func ("/core/geometry/pseudosphere-curvature", test_pseudosphere_curvature);
  g_test_add_func ("/core/geometry/profile-curvature", test_generic_revolution_curvature);
  g_test_add_func ("/core/geometry/graph-curvature", test_graph_curvature);
  g_test_add_func ("/core/geometry/paraboloid-two-charts", test_paraboloid_two_charts);
  g_test_add_func ("/core/geometry/christoffel-closed-forms", test_christoffel_closed_forms);
  g_test_add_func ("/core/geometry/christoffel-general", test_christoffel_general);
  g_test_add_func ("/core/geometry/dgamma", test_dgamma);
  g_test_add_func ("/core/geometry/theorema-egregium", test_theorema_egregium);
  g_test_add_func ("/core/geometry/riemann-identities", test_riemann_identities);
  g_test_add_func ("/core/geometry/sphere-riemann", test_sphere_riemann);
  g_test_add_func ("/core/geometry/pole", test_pole);
  g_test_add_func ("/core/geometry/k-area", test_k_area);

  return g_test_run ();
}
