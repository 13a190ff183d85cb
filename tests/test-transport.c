/* test-transport.c: parallel transport itself: the chart and extrinsic forms agree, lengths and
 * angles are preserved, a geodesic's tangent is parallel, failures are clean, and loop input is
 * checked. */
#include <math.h>

#include "df-test.h"

static double (*wobbly_loop (double u0, double v0, double a, size_t n))[2]
{
  double (*uv)[2] = g_malloc (n * sizeof *uv);

  for (size_t i = 0; i < n; i++)
    {
      double th = 2 * G_PI * i / n, r = a * (1 + 0.2 * sin (3 * th));

      uv[i][0] = u0 + r * cos (th);
      uv[i][1] = v0 + 0.8 * r * sin (th);
    }
  return uv;
}

static void
test_forms_agree (void)
{
  /* The chart form dV^k + Gamma^k_ij x'^i V^j = 0 and the extrinsic form dV = -(V . dN) N
   * describe the same Levi-Civita transport of an embedded surface (do Carmo sec. 4-4, from
   * memory): both must carry a vector to the same place. */
  g_autoptr (df_surface) graph = df_test_graph ("0.4*sin(x)*cos(1.2*y) + 0.2*x^2", -3, 3, -3, 3);
  g_autoptr (df_surface) rev = df_test_revolution ("2 + 0.5*cos(t)", "t", -2, 2);
  const df_surface *surfaces[] = { graph, rev };

  for (size_t k = 0; k < G_N_ELEMENTS (surfaces); k++)
    {
      g_autofree double (*uv)[2] = wobbly_loop (0.2, 0.3, 1.0, 60);
      g_autoptr (df_curve) c = df_test_curve (surfaces[k], (const double (*)[2]) uv, 60, true);
      df_transport_options o;
      g_auto (df_transport_result) a = { 0 };
      g_auto (df_transport_result) b = { 0 };
      df_diag diag;

      df_transport_options_init (&o);
      o.form = DF_TRANSPORT_CHART;
      g_assert_cmpint (df_transport_run (c, NULL, &o, &a, &diag), ==, DF_OK);
      o.form = DF_TRANSPORT_EXTRINSIC;
      g_assert_cmpint (df_transport_run (c, NULL, &o, &b, &diag), ==, DF_OK);
      for (int i = 0; i < 3; i++)
        df_assert_close (a.end_vector[i], b.end_vector[i], 0.0, 1e-9);
      g_assert_cmpfloat (a.norm_drift, <, 1e-10);
      g_assert_cmpfloat (b.norm_drift, <, 1e-10);
      /* A non-trivial check: the vector did turn. */
      g_assert_cmpfloat (fabs (df_signed_angle (a.start_vector, a.end_vector, a.start_normal)),
                         >, 1e-3);
      df_assert_close (a.length, b.length, 1e-10, 0.0);
    }
}

static void
test_angles_preserved (void)
{
  /* Levi-Civita transport is an isometry between tangent planes (metric compatibility, from
   * memory): two vectors 60 degrees apart stay 60 degrees apart. */
  g_autoptr (df_surface) s = df_test_graph ("x*y + 0.3*x^3", -2, 2, -2, 2);
  double uv[4][2] = { { -1, -1 }, { 0, -0.2 }, { 0.8, 0.4 }, { 1.2, 1.3 } };
  g_autoptr (df_curve) c = df_test_curve (s, (const double (*)[2]) uv, 4, false);
  g_auto (df_transport_result) a = { 0 };
  g_auto (df_transport_result) b = { 0 };
  df_curve_point cp;
  double tau0, tau1, w[3], n[3], e1[3], e2[3], len;
  df_diag diag;

  df_curve_get_range (c, &tau0, &tau1);
  g_assert_cmpint (df_curve_eval (c, tau0, &cp, &diag), ==, DF_OK);
  memcpy (n, cp.normal, sizeof n);
  len = sqrt (cp.dx[0] * cp.dx[0] + cp.dx[1] * cp.dx[1] + cp.dx[2] * cp.dx[2]);
  for (int k = 0; k < 3; k++)
    e1[k] = cp.dx[k] / len;
  e2[0] = n[1] * e1[2] - n[2] * e1[1];
  e2[1] = n[2] * e1[0] - n[0] * e1[2];
  e2[2] = n[0] * e1[1] - n[1] * e1[0];
  for (int k = 0; k < 3; k++)
    w[k] = cos (G_PI / 3) * e1[k] + sin (G_PI / 3) * e2[k];
  g_assert_cmpint (df_transport_run (c, NULL, NULL, &a, &diag), ==, DF_OK);
  g_assert_cmpint (df_transport_run (c, w, NULL, &b, &diag), ==, DF_OK);
  df_assert_close (df_signed_angle (b.start_vector, a.start_vector, a.start_normal) * -1,
                   G_PI / 3, 0.0, 1e-12);
  df_assert_close (df_signed_angle (a.end_vector, b.end_vector, a.end_normal), G_PI / 3, 0.0,
                   1e-9);
}

static void
test_geodesic_tangent_parallel (void)
{
  /* A geodesic's tangent is parallel along it (definition of a geodesic, from memory). A
   * meridian of a surface of revolution is a geodesic: carried along it, the start tangent
   * ends as the end tangent. */
  g_autoptr (df_surface) s = df_test_revolution ("1.5 + sin(t)", "-cos(t)", 0.3, 2.8);
  double uv[2][2] = { { 0.4, 0.7 }, { 2.7, 0.7 } };
  g_autoptr (df_curve) c = df_test_curve (s, (const double (*)[2]) uv, 2, false);
  g_auto (df_transport_result) r = { 0 };
  df_curve_point end;
  double tau0, tau1, len;
  df_diag diag;

  g_assert_cmpint (df_transport_run (c, NULL, NULL, &r, &diag), ==, DF_OK);
  df_curve_get_range (c, &tau0, &tau1);
  g_assert_cmpint (df_curve_eval (c, tau1, &end, &diag), ==, DF_OK);
  len = sqrt (end.dx[0] * end.dx[0] + end.dx[1] * end.dx[1] + end.dx[2] * end.dx[2]);
  for (int k = 0; k < 3; k++)
    df_assert_close (r.end_vector[k], end.dx[k] / len, 0.0, 1e-9);
  df_assert_close (r.total_kg, 0.0, 0.0, 1e-9);
}

static void
test_latitude_samples (void)
{
  /* On the unit sphere's circle at polar angle theta, k_g = cot(theta) is constant (from
   * memory), so the angle from the tangent to the carried vector falls linearly: -k_g s. */
  g_autoptr (df_surface) s = df_test_revolution ("sin(t)", "cos(t)", 0, G_PI);
  const double theta = 0.9;
  size_t n = 40;
  g_autofree double (*uv)[2] = g_malloc (n * sizeof *uv);
  g_autoptr (df_curve) c = NULL;
  g_auto (df_loop_result) r = { 0 };
  df_loop_options o;
  df_diag diag;

  for (size_t i = 0; i < n; i++)
    {
      uv[i][0] = theta;
      uv[i][1] = 2 * G_PI * i / n;
    }
  c = df_test_curve (s, (const double (*)[2]) uv, n, true);
  df_loop_options_init (&o);
  o.n_samples = 50;
  g_assert_cmpint (df_loop_measure (c, &o, &r, &diag), ==, DF_OK);
  g_assert_cmpuint (r.n_samples, ==, 50);
  for (size_t i = 0; i < r.n_samples; i++)
    {
      const df_loop_sample *sm = &r.samples[i];
      double vn = sm->vector[0] * sm->normal[0] + sm->vector[1] * sm->normal[1]
                  + sm->vector[2] * sm->normal[2];

      df_assert_close (sm->k_g, cos (theta) / sin (theta), 1e-9, 0.0);
      df_assert_close (sm->angle_rad, -sm->k_g * sm->s, 0.0, 1e-8);
      df_assert_close (sm->K, 1.0, 1e-9, 0.0);
      df_assert_close (vn, 0.0, 0.0, 1e-12);   /* the carried vector stays tangent */
    }
  df_assert_close (r.samples[r.n_samples - 1].s, 2 * G_PI * sin (theta), 1e-9, 0.0);
}

static void
test_leaves_domain (void)
{
  /* A path whose spline runs off the graph's square: a clean DF_E_DOMAIN, never a NaN. */
  g_autoptr (df_surface) s = df_test_graph ("x*y", -1, 1, -1, 1);
  g_autoptr (df_curve) c = NULL;
  df_diag diag;
  df_status st;

  /* The spline through these points bulges past x = 1 between the last two. */
  double uv2[4][2] = { { 0, 0 }, { 0.999, 0.2 }, { 0.999, 0.4 }, { 0.2, 0.9 } };
  st = df_curve_new_through_points (s, (const double (*)[2]) uv2, 4, false, &c, &diag);
  g_assert_cmpint (st, ==, DF_E_DOMAIN);
  g_assert_true (strstr (diag.detail, "leaves") != NULL);
  g_assert_null (c);
}

static void
test_bad_loops (void)
{
  g_autoptr (df_surface) s = df_test_graph ("x*y", -1, 1, -1, 1);
  double two[2][2] = { { 0, 0 }, { 0.5, 0 } };
  double dup[4][2] = { { 0, 0 }, { 0.5, 0 }, { 0.5, 0 }, { 0, 0.5 } };
  double closing[5][2] = { { 0, 0 }, { 0.5, 0 }, { 0.5, 0.5 }, { 0, 0.5 }, { 0, 0 } };
  double outside[3][2] = { { 0, 0 }, { 1.5, 0 }, { 0, 0.5 } };
  double nan_pt[3][2] = { { 0, 0 }, { NAN, 0 }, { 0, 0.5 } };
  df_curve *c = NULL;
  df_diag diag;

  g_assert_cmpint (df_curve_new_through_points (s, (const double (*)[2]) two, 2, true, &c, &diag),
                   ==, DF_E_INPUT);
  g_assert_true (strstr (diag.detail, "at least 3") != NULL);
  g_assert_cmpint (df_curve_new_through_points (s, (const double (*)[2]) dup, 4, true, &c, &diag),
                   ==, DF_E_INPUT);
  g_assert_cmpint (diag.index, ==, 2);
  g_assert_cmpint (df_curve_new_through_points (s, (const double (*)[2]) outside, 3, true, &c,
                                                &diag), ==, DF_E_DOMAIN);
  g_assert_cmpint (diag.index, ==, 1);
  g_assert_cmpint (df_curve_new_through_points (s, (const double (*)[2]) nan_pt, 3, true, &c,
                                                &diag), ==, DF_E_INPUT);
  g_assert_null (c);
  /* A last point repeating the first closes the loop: it is dropped, not an error. */
  g_assert_cmpint (df_curve_new_through_points (s, (const double (*)[2]) closing, 5, true, &c,
                                                &diag), ==, DF_OK);
  {
    const double *taus;

    g_assert_cmpuint (df_curve_get_nodes (c, &taus), ==, 4);
  }
  df_curve_free (c);
}

int
main (int argc, char **argv)
{
  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);
  g_test_add_func ("/core/transport/forms-agree", test_forms_agree);
  g_test_add_func ("/core/transport/angles-preserved", test_angles_preserved);
  g_test_add_func ("/core/transport/geodesic-tangent-parallel", test_geodesic_tangent_parallel);
  g_test_add_func ("/core/transport/latitude-samples", test_latitude_samples);
  g_test_add_func ("/core/transport/leaves-domain", test_leaves_domain);
  g_test_add_func ("/core/transport/bad-loops", test_bad_loops);
  return g_test_run ();
}
