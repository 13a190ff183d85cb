/* test-surface.c: surface construction and its error reports, poles, bounding box, domain,
 * exact chart derivatives (checked against GSL's numerical derivative gsl_deriv_central),
 * copies and the closest-point projection. Surfaces are built from formulas here, so the
 * tests do not depend on the presets. */
#include <gsl/gsl_deriv.h>
#include <gsl/gsl_errno.h>
#include <math.h>
#include <string.h>

#include "df-glib.h"
#include "df-test.h"

static const char *const var_t[] = { "t" };
static const char *const var_xy[] = { "x", "y" };

/* ---- helpers ---- */

static df_expr *
parse_or_die (const char *text, const char *const *vars, int n_vars)
{
  g_autoptr (GError) error = NULL;
  df_expr *expr = df_expr_parse (text, vars, n_vars, NULL, NULL, &error);

  g_assert_no_error (error);
  g_assert_nonnull (expr);
  return expr;
}

static df_status
try_revolution (const char *r, const char *z, double t_min, double t_max, df_surface **out,
                df_diag *diag)
{
  return df_surface_new_revolution (parse_or_die (r, var_t, 1), parse_or_die (z, var_t, 1),
                                    t_min, t_max, out, diag);
}

static df_status
try_graph (const char *f, double x_min, double x_max, double y_min, double y_max,
           df_surface **out, df_diag *diag)
{
  return df_surface_new_graph (parse_or_die (f, var_xy, 2), x_min, x_max, y_min, y_max, out,
                               diag);
}

static void
eval_or_die (const df_surface *s, double u, double v, int order, df_chart_jet *jet)
{
  df_diag diag;
  df_status st = df_surface_eval (s, u, v, order, jet, &diag);

  if (st != DF_OK)
    g_error ("eval at (%g, %g): %s: %s", u, v, df_status_describe (st), diag.detail);
}

static void
cross3 (const double a[3], const double b[3], double out[3])
{
  out[0] = a[1] * b[2] - a[2] * b[1];
  out[1] = a[2] * b[0] - a[0] * b[2];
  out[2] = a[0] * b[1] - a[1] * b[0];
}

static double
norm3 (const double a[3])
{
  return sqrt (a[0] * a[0] + a[1] * a[1] + a[2] * a[2]);
}

/* Unit normal X_u x X_v / |.| from a chart jet (GEOMETRY.md), computed here rather than taken
 * from the geometry module. */
static void
jet_normal (const df_chart_jet *j, double n[3])
{
  double len;

  cross3 (j->d1[0], j->d1[1], n);
  len = norm3 (n);
  for (int k = 0; k < 3; k++)
    n[k] /= len;
}

/* A failing construction: status, no surface, and a detail that says something. */
static void
check_build_fails (df_status got, df_status want, df_surface *const *s, const df_diag *diag)
{
  g_test_message ("%s: %s", df_status_describe (got), diag->detail);
  g_assert_cmpint (got, ==, want);
  g_assert_null (*s);
  g_assert_cmpuint (strlen (diag->detail), >, 0);
}

/* ---- construction errors ---- */

static void
test_bad_range (void)
{
  df_surface *s = (df_surface *) 1;
  df_diag diag;

  /* An empty or reversed parameter range is malformed input (df-status.h: DF_E_INPUT). */
  check_build_fails (try_revolution ("1", "t", 1.0, 1.0, &s, &diag), DF_E_INPUT, &s, &diag);
  s = (df_surface *) 1;
  check_build_fails (try_revolution ("1", "t", 2.0, 1.0, &s, &diag), DF_E_INPUT, &s, &diag);
  s = (df_surface *) 1;
  check_build_fails (try_revolution ("1", "t", 0.0, INFINITY, &s, &diag), DF_E_INPUT, &s, &diag);
  s = (df_surface *) 1;
  check_build_fails (try_graph ("x*y", 1.0, -1.0, 0.0, 1.0, &s, &diag), DF_E_INPUT, &s, &diag);
  s = (df_surface *) 1;
  check_build_fails (try_graph ("x*y", 0.0, 1.0, 3.0, 3.0, &s, &diag), DF_E_INPUT, &s, &diag);
}

static void
test_negative_radius (void)
{
  df_surface *s = NULL;
  df_diag diag;

  /* r = 0.4 - t is negative for t > 0.4: the first negative sample lies just past 0.4, and the
   * diagnostic must name it (GEOMETRY.md: r >= 0). */
  check_build_fails (try_revolution ("0.4 - t", "t", 0.0, 1.0, &s, &diag), DF_E_SINGULAR, &s,
                     &diag);
  g_assert_true (diag.has_point);
  g_assert_cmpfloat (diag.u, >, 0.4);
  g_assert_cmpfloat (diag.u, <, 0.41);
  g_assert_nonnull (strstr (diag.detail, "t ="));
}

static void
test_zero_speed (void)
{
  df_surface *s = NULL;
  df_diag diag;

  /* (r, z) = (2 + t^3, t^3): r' = z' = 0 at t = 0, a cusp of the profile where the chart is
   * singular (the tangent plane is undefined there). */
  check_build_fails (try_revolution ("2 + t^3", "t^3", -1.0, 1.0, &s, &diag), DF_E_SINGULAR, &s,
                     &diag);
  g_assert_true (diag.has_point);
  df_assert_close (diag.u, 0.0, 0.0, 1e-3);

  /* A profile that does not move at all. */
  check_build_fails (try_revolution ("1", "2", 0.0, 1.0, &s, &diag), DF_E_SINGULAR, &s, &diag);
}

static void
test_touches_axis (void)
{
  df_surface *s = NULL;
  df_diag diag;

  /* r = t^2 reaches the axis at t = 0 inside [-1, 1]: two sheets meeting at a point. */
  check_build_fails (try_revolution ("t^2", "t", -1.0, 1.0, &s, &diag), DF_E_SINGULAR, &s,
                     &diag);
  g_assert_true (diag.has_point);
  df_assert_close (diag.u, 0.0, 0.0, 1e-3);

  /* A profile lying on the axis everywhere is no surface. */
  check_build_fails (try_revolution ("0", "t", 0.0, 1.0, &s, &diag), DF_E_INPUT, &s, &diag);
}

static void
test_formula_fails (void)
{
  df_surface *s = (df_surface *) 1;
  df_diag diag;
  df_status st;

  /* log(t) is undefined for t <= 0: an error, not a crash and not a NaN surface. */
  st = try_revolution ("log(t) + 3", "t", -1.0, 1.0, &s, &diag);
  g_test_message ("%s: %s", df_status_describe (st), diag.detail);
  g_assert_cmpint (st, !=, DF_OK);
  g_assert_null (s);
  g_assert_nonnull (strstr (diag.detail, "log"));

  s = (df_surface *) 1;
  st = try_revolution ("1", "sqrt(t)", -1.0, 1.0, &s, &diag);
  g_assert_cmpint (st, !=, DF_OK);
  g_assert_null (s);

  s = (df_surface *) 1;
  st = try_graph ("log(x)", -1.0, 1.0, -1.0, 1.0, &s, &diag);
  g_test_message ("%s: %s", df_status_describe (st), diag.detail);
  g_assert_cmpint (st, !=, DF_OK);
  g_assert_null (s);
  g_assert_cmpuint (strlen (diag.detail), >, 0);
}

/* ---- poles ---- */

static void
test_sphere_poles (void)
{
  g_autoptr (df_surface) s = df_test_revolution ("2*sin(t)", "2*cos(t)", 0.0, G_PI);
  df_pole poles[2];

  /* A sphere's profile meets the axis at right angles at both ends: smooth poles with
   * dr/ds = 1 and no concentrated curvature (GEOMETRY.md, cone point with alpha = 90 deg). */
  df_surface_get_poles (s, poles);
  for (int e = 0; e < 2; e++)
    {
      g_assert_true (poles[e].on_axis);
      df_assert_close (poles[e].sin_alpha, 1.0, 0.0, 1e-9);
      df_assert_close (poles[e].concentrated, 0.0, 0.0, 1e-8);
    }
  df_assert_close (poles[0].t, 0.0, 0.0, 1e-15);
  df_assert_close (poles[1].t, G_PI, 1e-15, 0.0);
}

static void
test_cone_poles (void)
{
  const double alpha = G_PI / 6;   /* half-angle 30 degrees */
  g_autofree char *r_up = g_strdup_printf ("t*%.17g", sin (alpha));
  g_autofree char *z_up = g_strdup_printf ("-t*%.17g", cos (alpha));
  g_autofree char *r_dn = g_strdup_printf ("(1 - t)*%.17g", sin (alpha));
  g_autofree char *z_dn = g_strdup_printf ("t*%.17g", cos (alpha));
  g_autoptr (df_surface) apex_first = df_test_revolution (r_up, z_up, 0.0, 1.0);
  g_autoptr (df_surface) apex_last = df_test_revolution (r_dn, z_dn, 0.0, 1.0);
  g_autoptr (df_surface) cylinder = df_test_revolution ("1.5", "t", -1.0, 1.0);
  g_autoptr (df_surface) graph = df_test_graph ("x*y", -1.0, 1.0, -1.0, 1.0);
  df_pole poles[2];

  /* A cone of half-angle alpha unrolls into a sector of angle 2 pi sin alpha, so its apex
   * carries the angle deficit 2 pi (1 - sin alpha) (from memory; e.g. do Carmo, Differential
   * Geometry of Curves and Surfaces, sec. 4-5 exercises). */
  df_surface_get_poles (apex_first, poles);
  g_assert_true (poles[0].on_axis);
  g_assert_false (poles[1].on_axis);
  df_assert_close (poles[0].sin_alpha, sin (alpha), 1e-9, 0.0);
  df_assert_close (poles[0].concentrated, 2 * G_PI * (1 - sin (alpha)), 1e-9, 0.0);

  /* The same cone with the apex at t_max: dr/ds < 0 there, the half-angle is the same. */
  df_surface_get_poles (apex_last, poles);
  g_assert_false (poles[0].on_axis);
  g_assert_true (poles[1].on_axis);
  df_assert_close (poles[1].sin_alpha, sin (alpha), 1e-9, 0.0);
  df_assert_close (poles[1].concentrated, 2 * G_PI * (1 - sin (alpha)), 1e-9, 0.0);

  /* No pole on a cylinder, never one on a graph (df-surface.h). */
  df_surface_get_poles (cylinder, poles);
  g_assert_false (poles[0].on_axis);
  g_assert_false (poles[1].on_axis);
  df_surface_get_poles (graph, poles);
  g_assert_false (poles[0].on_axis);
  g_assert_false (poles[1].on_axis);
}

/* ---- bounding box, domain ---- */

static void
test_bbox (void)
{
  const double R = 2.5;
  g_autofree char *r = g_strdup_printf ("%.17g*sin(t)", R);
  g_autofree char *z = g_strdup_printf ("%.17g*cos(t)", R);
  g_autoptr (df_surface) sphere = df_test_revolution (r, z, 0.0, G_PI);
  g_autoptr (df_surface) saddle = df_test_graph ("x*y", -1.0, 2.0, -1.0, 1.0);
  double lo[3], hi[3];

  /* A sphere of radius R fills the cube [-R, R]^3 exactly; its diagonal is 2 sqrt(3) R
   * (elementary geometry, from memory). */
  df_surface_get_bbox (sphere, lo, hi);
  for (int k = 0; k < 3; k++)
    {
      df_assert_close (lo[k], -R, 1e-6, 0.0);
      df_assert_close (hi[k], R, 1e-6, 0.0);
    }
  df_assert_close (df_surface_size (sphere), 2 * sqrt (3.0) * R, 1e-6, 0.0);

  /* z = x y over [-1, 2] x [-1, 1] ranges over [-2, 2], reached at the corners (2, -1) and
   * (2, 1): a product is extreme at the box's corners (derived by hand); diagonal sqrt(29). */
  df_surface_get_bbox (saddle, lo, hi);
  df_assert_close (lo[0], -1.0, 1e-9, 0.0);
  df_assert_close (hi[0], 2.0, 1e-9, 0.0);
  df_assert_close (lo[1], -1.0, 1e-9, 0.0);
  df_assert_close (hi[1], 1.0, 1e-9, 0.0);
  df_assert_close (lo[2], -2.0, 1e-9, 0.0);
  df_assert_close (hi[2], 2.0, 1e-9, 0.0);
  df_assert_close (df_surface_size (saddle), sqrt (29.0), 1e-9, 0.0);
}

static void
test_domain (void)
{
  g_autoptr (df_surface) sphere = df_test_revolution ("2*sin(t)", "2*cos(t)", 0.0, G_PI);
  g_autoptr (df_surface) graph = df_test_graph ("1/(x - 0.123)", 0.5, 1.0, -1.0, 1.0);
  double u0, u1, v0, v1;
  df_chart_jet jet;
  df_diag diag;

  df_surface_get_domain (sphere, &u0, &u1, &v0, &v1);
  df_assert_close (u0, 0.0, 0.0, 0.0);
  df_assert_close (u1, G_PI, 0.0, 0.0);
  /* df-surface.h: phi in [-pi, pi], periodic. */
  df_assert_close (v0, -G_PI, 0.0, 0.0);
  df_assert_close (v1, G_PI, 0.0, 0.0);
  g_assert_true (df_surface_v_periodic (sphere));
  g_assert_cmpint (df_surface_get_kind (sphere), ==, DF_SURFACE_REVOLUTION);
  g_assert_cmpstr (df_surface_kind_name (sphere), ==, "revolution");

  g_assert_true (df_surface_contains (sphere, 1.0, 0.5));
  g_assert_true (df_surface_contains (sphere, 0.0, 0.0));
  g_assert_true (df_surface_contains (sphere, G_PI + 1e-12, 0.0));  /* within the 1e-9 margin */
  g_assert_true (df_surface_contains (sphere, 1.0, 10.0));          /* phi is periodic */
  g_assert_false (df_surface_contains (sphere, -0.01, 0.0));
  g_assert_false (df_surface_contains (sphere, G_PI + 0.01, 0.0));
  g_assert_false (df_surface_contains (sphere, NAN, 0.0));

  g_assert_cmpint (df_surface_eval (sphere, -0.01, 0.0, 2, &jet, &diag), ==, DF_E_DOMAIN);
  g_assert_true (diag.has_point);
  df_assert_close (diag.u, -0.01, 0.0, 0.0);
  g_assert_cmpint (df_surface_eval (sphere, 4.0, 0.0, 0, &jet, NULL), ==, DF_E_DOMAIN);
  g_assert_cmpint (df_surface_eval (sphere, 1.0, 10.0, 0, &jet, NULL), ==, DF_OK);
  /* 10 rad and 10 - 4 pi are the same meridian. */
  df_assert_close (jet.x[0], 2 * sin (1.0) * cos (10.0 - 4 * G_PI), 1e-14, 1e-15);

  g_assert_false (df_surface_v_periodic (graph));
  g_assert_cmpstr (df_surface_kind_name (graph), ==, "graph");
  g_assert_true (df_surface_contains (graph, 0.7, -1.0));
  g_assert_false (df_surface_contains (graph, 0.7, 1.5));
  g_assert_false (df_surface_contains (graph, 0.4, 0.0));
  g_assert_cmpint (df_surface_eval (graph, 0.7, 1.5, 1, &jet, &diag), ==, DF_E_DOMAIN);
  g_assert_cmpint (df_surface_eval (graph, 0.7, 0.0, 1, &jet, &diag), ==, DF_OK);
}

static void
test_formula_fails_inside (void)
{
  /* 1/(x - 0.123) is defined at every sample of the construction check but not at x = 0.123.
   * df-surface.h: df_surface_eval returns DF_E_DOMAIN only outside the chart's domain and
   * DF_E_NONFINITE where a formula fails inside it, so that callers (geodesics stopping at
   * the domain's edge) can tell the two apart. */
  g_autoptr (df_surface) graph = df_test_graph ("1/(x - 0.123)", -1.0, 1.0, -1.0, 1.0);
  df_chart_jet jet;
  df_diag diag;
  df_status st;

  g_assert_true (df_surface_contains (graph, 0.123, 0.2));
  st = df_surface_eval (graph, 0.123, 0.2, 2, &jet, &diag);
  g_test_message ("%s: %s", df_status_describe (st), diag.detail);
  g_assert_cmpint (st, !=, DF_OK);
  g_assert_cmpuint (strlen (diag.detail), >, 0);
  g_assert_cmpint (st, ==, DF_E_NONFINITE);
}

/* ---- chart derivatives against gsl_deriv_central ---- */

typedef struct
{
  const df_surface *surface;
  int    order;   /* 0: X, 1: d1[index], 2: d2[index] */
  int    index;
  int    comp;    /* space component 0..2 */
  int    dir;     /* 0: vary u, 1: vary v */
  double u, v;
} chart_fixture;

static double
chart_component (double w, void *data)
{
  const chart_fixture *fx = data;
  df_chart_jet jet;

  eval_or_die (fx->surface, fx->dir == 0 ? w : fx->u, fx->dir == 1 ? w : fx->v, fx->order,
               &jet);
  if (fx->order == 0)
    return jet.x[fx->comp];
  if (fx->order == 1)
    return jet.d1[fx->index][fx->comp];
  return jet.d2[fx->index][fx->comp];
}

/* Every first, second and third partial of X at (u, v) against GSL's five-point central
 * difference of the next lower order. The stored index of a derivative is its number of v's,
 * so differentiating entry i of order o along direction m gives entry i + m of order o + 1;
 * each mixed partial is thus reached from both of its lower-order parents. */
static void
check_chart_derivatives (const df_surface *s, double u, double v)
{
  df_chart_jet jet;

  eval_or_die (s, u, v, 3, &jet);
  for (int order = 0; order <= 2; order++)
    for (int index = 0; index <= order; index++)
      for (int dir = 0; dir < 2; dir++)
        for (int comp = 0; comp < 3; comp++)
          {
            chart_fixture fx = { s, order, index, comp, dir, u, v };
            gsl_function fn = { chart_component, &fx };
            double numeric = NAN, abserr = NAN, exact;

            g_assert_cmpint (gsl_deriv_central (&fn, dir == 0 ? u : v, 1e-3, &numeric,
                                                &abserr), ==, GSL_SUCCESS);
            g_assert_cmpfloat (abserr, <, 1e-7);
            if (order == 0)
              exact = jet.d1[dir][comp];
            else if (order == 1)
              exact = jet.d2[index + dir][comp];
            else
              exact = jet.d3[index + dir][comp];
            df_assert_close (exact, numeric, 1e-7, 1e-7);
          }
}

static void
test_revolution_derivatives (void)
{
  /* A profile with no symmetry, so that no derivative vanishes by accident. */
  g_autoptr (df_surface) s = df_test_revolution ("2 + 0.5*sin(t) + 0.1*t^2", "t + 0.3*cos(2*t)",
                                             -1.0, 2.0);
  df_chart_jet jet;

  check_chart_derivatives (s, 0.3, 0.7);
  check_chart_derivatives (s, -0.5, 2.5);
  check_chart_derivatives (s, 1.5, -1.2);

  /* X itself against the convention X = (r cos phi, r sin phi, z) (GEOMETRY.md). */
  eval_or_die (s, 0.3, 0.7, 0, &jet);
  {
    double r = 2 + 0.5 * sin (0.3) + 0.1 * 0.09, z = 0.3 + 0.3 * cos (0.6);

    df_assert_close (jet.x[0], r * cos (0.7), 1e-14, 0.0);
    df_assert_close (jet.x[1], r * sin (0.7), 1e-14, 0.0);
    df_assert_close (jet.x[2], z, 1e-14, 0.0);
  }
}

static void
test_graph_derivatives (void)
{
  g_autoptr (df_surface) s = df_test_graph ("sin(x)*exp(0.5*y) + x^3*y/6 + x*y^2", -2.0, 2.0, -2.0,
                                        2.0);
  df_chart_jet jet;

  check_chart_derivatives (s, 0.3, -0.4);
  check_chart_derivatives (s, 1.1, 0.9);
  check_chart_derivatives (s, -1.5, 0.2);

  /* X = (x, y, f(x, y)) (GEOMETRY.md). */
  eval_or_die (s, 1.1, 0.9, 0, &jet);
  df_assert_close (jet.x[0], 1.1, 0.0, 0.0);
  df_assert_close (jet.x[1], 0.9, 0.0, 0.0);
  df_assert_close (jet.x[2], sin (1.1) * exp (0.45) + 1.331 * 0.9 / 6 + 1.1 * 0.81, 1e-14, 0.0);
}

/* ---- copies ---- */

static void
check_copy (df_surface *orig, const double pts[][2], int n)
{
  df_chart_jet a[8], b;
  df_surface *copy = df_surface_copy (orig);
  double lo_a[3], hi_a[3], lo_b[3], hi_b[3], d_a[4], d_b[4];
  df_pole p_a[2], p_b[2];

  g_assert_nonnull (copy);
  g_assert_true (copy != orig);
  g_assert_cmpint (n, <=, 8);
  for (int i = 0; i < n; i++)
    eval_or_die (orig, pts[i][0], pts[i][1], 3, &a[i]);
  df_surface_get_bbox (orig, lo_a, hi_a);
  df_surface_get_domain (orig, &d_a[0], &d_a[1], &d_a[2], &d_a[3]);
  df_surface_get_poles (orig, p_a);
  g_assert_cmpint (df_surface_get_kind (copy), ==, df_surface_get_kind (orig));
  /* The copy must not share the formulas: free the original first. */
  df_surface_free (orig);

  for (int i = 0; i < n; i++)
    {
      eval_or_die (copy, pts[i][0], pts[i][1], 3, &b);
      g_assert_cmpmem (&a[i], sizeof a[i], &b, sizeof b);
    }
  df_surface_get_bbox (copy, lo_b, hi_b);
  df_surface_get_domain (copy, &d_b[0], &d_b[1], &d_b[2], &d_b[3]);
  df_surface_get_poles (copy, p_b);
  g_assert_cmpmem (lo_a, sizeof lo_a, lo_b, sizeof lo_b);
  g_assert_cmpmem (hi_a, sizeof hi_a, hi_b, sizeof hi_b);
  g_assert_cmpmem (d_a, sizeof d_a, d_b, sizeof d_b);
  for (int e = 0; e < 2; e++)
    {
      g_assert_cmpint (p_a[e].on_axis, ==, p_b[e].on_axis);
      df_assert_close (p_b[e].sin_alpha, p_a[e].sin_alpha, 0.0, 0.0);
    }
  df_surface_free (copy);
}

static void
test_copy (void)
{
  static const double rev_pts[][2] = { { 0.0, 0.0 }, { 0.4, 1.0 }, { 0.9, -2.0 }, { 1.0, 3.0 } };
  static const double graph_pts[][2] = { { -1.0, -1.0 }, { 0.2, 0.7 }, { 1.0, -0.3 } };

  check_copy (df_test_revolution ("t*0.5", "-t*0.8", 0.0, 1.0), rev_pts, G_N_ELEMENTS (rev_pts));
  check_copy (df_test_graph ("exp(x)*cos(y)", -1.0, 1.0, -1.0, 1.0), graph_pts,
              G_N_ELEMENTS (graph_pts));
  g_assert_null (df_surface_copy (NULL));
  df_surface_free (NULL);
}

/* ---- closest point ---- */

static void
test_project_sphere (void)
{
  const double R = 2.0;
  const double radii[] = { 0.5, 1.5, 2.0, 3.0, 10.0 };
  g_autoptr (df_surface) s = df_test_revolution ("2*sin(t)", "2*cos(t)", 0.0, G_PI);
  g_autoptr (GRand) rng = g_rand_new_with_seed (20240611);

  /* The closest point of a sphere of radius R centred at 0 to p != 0 is R p / |p|, at
   * distance | |p| - R | (from memory). Directions at random, plus the two axis points. */
  for (int i = 0; i < 14; i++)
    {
      double d[3], len;

      if (i < 2)
        {
          d[0] = d[1] = 0.0;
          d[2] = i == 0 ? 1.0 : -1.0;
        }
      else
        do
          {
            for (int k = 0; k < 3; k++)
              d[k] = g_rand_double_range (rng, -1.0, 1.0);
            len = norm3 (d);
          }
        while (len < 0.1 || len > 1.0);
      len = norm3 (d);
      for (int k = 0; k < 3; k++)
        d[k] /= len;

      for (guint m = 0; m < G_N_ELEMENTS (radii); m++)
        {
          double p[3] = { radii[m] * d[0], radii[m] * d[1], radii[m] * d[2] };
          double u = NAN, v = NAN, dist = NAN;
          df_chart_jet jet;
          df_diag diag;
          df_status st = df_surface_project (s, p, 0.0, &u, &v, &dist, &diag);

          if (st != DF_OK)
            g_error ("project (%g, %g, %g): %s: %s", p[0], p[1], p[2], df_status_describe (st),
                     diag.detail);
          df_assert_close (dist, fabs (radii[m] - R), 0.0, 1e-9);
          eval_or_die (s, u, v, 0, &jet);
          for (int k = 0; k < 3; k++)
            df_assert_close (jet.x[k], R * d[k], 0.0, 1e-7);
        }
    }
}

static void
test_project_graph (void)
{
  /* Principal curvatures of this graph stay below about 0.5, so a point at offset |d| <= 0.3
   * along the normal has its foot as the unique closest point (the offset is below the
   * radius of curvature; from memory). */
  g_autoptr (df_surface) s = df_test_graph ("0.3*sin(x)*cos(y) + 0.1*x*y", -2.0, 2.0, -2.0, 2.0);
  static const double feet[][2] = { { 0.2, 0.3 }, { -1.0, 0.7 }, { 1.3, -1.1 }, { 0.0, -1.6 } };
  static const double offsets[] = { 0.3, -0.25, 0.05 };
  double u = NAN, v = NAN, dist = NAN;
  df_diag diag;

  for (guint i = 0; i < G_N_ELEMENTS (feet); i++)
    for (guint m = 0; m < G_N_ELEMENTS (offsets); m++)
      {
        df_chart_jet jet;
        double n[3], p[3], off[3], c[3];
        df_status st;

        eval_or_die (s, feet[i][0], feet[i][1], 1, &jet);
        jet_normal (&jet, n);
        for (int k = 0; k < 3; k++)
          p[k] = jet.x[k] + offsets[m] * n[k];
        st = df_surface_project (s, p, 0.0, &u, &v, &dist, &diag);
        if (st != DF_OK)
          g_error ("project: %s: %s", df_status_describe (st), diag.detail);
        df_assert_close (u, feet[i][0], 0.0, 1e-7);
        df_assert_close (v, feet[i][1], 0.0, 1e-7);
        df_assert_close (dist, fabs (offsets[m]), 0.0, 1e-9);

        /* At an interior closest point the offset X - p is normal to the surface: the first
         * order condition of the squared distance (from memory). */
        eval_or_die (s, u, v, 1, &jet);
        jet_normal (&jet, n);
        for (int k = 0; k < 3; k++)
          off[k] = jet.x[k] - p[k];
        cross3 (off, n, c);
        df_assert_close (norm3 (c), 0.0, 0.0, 1e-9);
      }

  /* Beyond the edge x = 2: the closest point lies on the edge; farther than max_dist it is
   * refused with DF_E_DOMAIN (df-project.h). */
  {
    const double p[3] = { 5.0, 0.0, 0.0 };

    g_assert_cmpint (df_surface_project (s, p, 0.0, &u, &v, &dist, &diag), ==, DF_OK);
    df_assert_close (u, 2.0, 0.0, 1e-9);
    g_assert_cmpfloat (dist, >=, 3.0);
    g_assert_cmpint (df_surface_project (s, p, 1.0, &u, &v, &dist, &diag), ==, DF_E_DOMAIN);
    g_assert_cmpuint (strlen (diag.detail), >, 0);
  }
  {
    const double p[3] = { NAN, 0.0, 0.0 };

    g_assert_cmpint (df_surface_project (s, p, 0.0, &u, &v, &dist, &diag), ==, DF_E_INPUT);
  }
}

int
main (int argc, char **argv)
{
  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);

  g_test_add_func ("/core/surface/bad-range", test_bad_range);
  g_test_add_func ("/core/surface/negative-radius", test_negative_radius);
  g_test_add_func ("/core/surface/zero-speed", test_zero_speed);
  g_test_add_func ("/core/surface/touches-axis", test_touches_axis);
  g_test_add_func ("/core/surface/formula-fails", test_formula_fails);
  g_test_add_func ("/core/surface/formula-fails-inside", test_formula_fails_inside);
  g_test_add_func ("/core/surface/sphere-poles", test_sphere_poles);
  g_test_add_func ("/core/surface/cone-poles", test_cone_poles);
  g_test_add_func ("/core/surface/bbox", test_bbox);
  g_test_add_func ("/core/surface/domain", test_domain);
  g_test_add_func ("/core/surface/revolution-derivatives", test_revolution_derivatives);
  g_test_add_func ("/core/surface/graph-derivatives", test_graph_derivatives);
  g_test_add_func ("/core/surface/copy", test_copy);
  g_test_add_func ("/core/surface/project-sphere", test_project_sphere);
  g_test_add_func ("/core/surface/project-graph", test_project_graph);

  return g_test_run ();
}
