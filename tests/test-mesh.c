/* test-mesh.c: the tessellation (df-mesh) against closed-form areas and the Gauss-Bonnet theorem:
 * total area, outward unit normals, integrated Gaussian curvature, the vertex cap, and that no
 * NaN leaves the mesh at poles, cone apices or where a formula fails. */
#include <math.h>
#include <stdlib.h>

#include "df-glib.h"
#include "df-mesh.h"
#include "df-test.h"

static df_surface *
make_revolution (const char *r_text, const char *z_text, double t_min, double t_max,
                 const char *params_text)
{
  static const char *const vars[] = { "t" };
  g_autoptr (df_params) params = df_params_new ();
  g_autoptr (GError) error = NULL;
  g_auto (GStrv) defs = g_strsplit (params_text, ";", -1);
  df_expr *r, *z;
  df_surface *surface = NULL;
  df_diag diag;

  for (guint i = 0; defs[i] != NULL && defs[i][0] != '\0'; i++)
    {
      g_auto (GStrv) kv = g_strsplit (defs[i], "=", 2);
      g_assert_true (df_params_set (params, kv[0], kv[1], &error));
      g_assert_no_error (error);
    }
  r = df_expr_parse (r_text, vars, 1, params, NULL, &error);
  g_assert_no_error (error);
  z = df_expr_parse (z_text, vars, 1, params, NULL, &error);
  g_assert_no_error (error);
  g_assert_cmpint (df_surface_new_revolution (r, z, t_min, t_max, &surface, &diag), ==, DF_OK);
  return surface;
}

static double
triangle_area (const double *p, const uint32_t *tri)
{
  const double *a = &p[3 * tri[0]], *b = &p[3 * tri[1]], *c = &p[3 * tri[2]];
  double e1[3] = { b[0] - a[0], b[1] - a[1], b[2] - a[2] };
  double e2[3] = { c[0] - a[0], c[1] - a[1], c[2] - a[2] };
  double n[3] = { e1[1] * e2[2] - e1[2] * e2[1], e1[2] * e2[0] - e1[0] * e2[2],
                  e1[0] * e2[1] - e1[1] * e2[0] };
  return 0.5 * sqrt (n[0] * n[0] + n[1] * n[1] + n[2] * n[2]);
}

static double
mesh_area (const df_mesh *mesh)
{
  double area = 0;

  for (size_t t = 0; t < df_mesh_n_triangles (mesh); t++)
    area += triangle_area (df_mesh_positions (mesh), &df_mesh_indices (mesh)[3 * t]);
  return area;
}

/* Sum over vertices of K times the vertex's area share (a third of each triangle around it, the
 * barycentric dual cell: common practice, no source); optionally the same with |K|. */
static double
mesh_total_curvature (const df_mesh *mesh, double *total_abs)
{
  const double *k = df_mesh_gaussian (mesh);
  double sum = 0, sum_abs = 0;

  for (size_t t = 0; t < df_mesh_n_triangles (mesh); t++)
    {
      const uint32_t *tri = &df_mesh_indices (mesh)[3 * t];
      double third = triangle_area (df_mesh_positions (mesh), tri) / 3;
      for (int i = 0; i < 3; i++)
        {
          sum += k[tri[i]] * third;
          sum_abs += fabs (k[tri[i]]) * third;
        }
    }
  if (total_abs != NULL)
    *total_abs = sum_abs;
  return sum;
}

static void
assert_all_finite (const df_mesh *mesh)
{
  size_t n = df_mesh_n_vertices (mesh);

  g_assert_cmpuint (n, ==, df_mesh_n_rows (mesh) * df_mesh_n_cols (mesh));
  for (size_t i = 0; i < n; i++)
    {
      const double *x = &df_mesh_positions (mesh)[3 * i], *nrm = &df_mesh_normals (mesh)[3 * i];
      for (int a = 0; a < 3; a++)
        {
          g_assert_true (isfinite (x[a]));
          g_assert_true (isfinite (nrm[a]));
        }
      g_assert_true (isfinite (df_mesh_uv (mesh)[2 * i]));
      g_assert_true (isfinite (df_mesh_uv (mesh)[2 * i + 1]));
      g_assert_true (isfinite (df_mesh_gaussian (mesh)[i]));
      g_assert_true (isfinite (df_mesh_mean (mesh)[i]));
      /* A unit normal: |N| = 1 by definition of N (GEOMETRY.md). */
      df_assert_close (nrm[0] * nrm[0] + nrm[1] * nrm[1] + nrm[2] * nrm[2], 1.0, 0, 1e-9);
    }
  for (size_t t = 0; t < 3 * df_mesh_n_triangles (mesh); t++)
    {
      uint32_t v = df_mesh_indices (mesh)[t];
      g_assert_cmpuint (v, <, n);
      g_assert_true (df_mesh_valid (mesh)[v]);
    }
  g_assert_true (isfinite (df_mesh_max_abs_k (mesh)));
  g_assert_true (isfinite (df_mesh_max_abs_h (mesh)));
}

static void
test_sphere_area (void)
{
  const double R = 1.7;
  g_autoptr (df_surface) sphere = make_revolution ("R*sin(t)", "R*cos(t)", 0, G_PI, "R=1.7");
  df_mesh *mesh = NULL;
  df_diag diag;

  g_assert_cmpint (df_mesh_build (sphere, NULL, &mesh, &diag), ==, DF_OK);
  assert_all_finite (mesh);
  g_assert_cmpuint (df_mesh_n_invalid (mesh), ==, 0);
  g_assert_cmpuint (df_mesh_n_vertices (mesh), <=, DF_MESH_DEFAULT_MAX_VERTICES);
  /* Area of a sphere 4 pi R^2 (Archimedes; from memory). An inscribed mesh falls short by a
   * relative amount of order (edge / R)^2; with the default edge of ~1/120 of the box diagonal
   * that is well under 0.5 %. */
  df_assert_close (mesh_area (mesh), 4 * G_PI * R * R, 5e-3, 0);
  g_assert_cmpfloat (mesh_area (mesh), <, 4 * G_PI * R * R);

  /* The coarse index set (every other grid line) is still a closed sphere: Archimedes' area to
   * within the (doubled) chord error, on valid vertices only. */
  {
    size_t n_coarse = 0;
    uint32_t *coarse = df_mesh_coarse_indices (mesh, 2, &n_coarse);
    double area = 0;
    g_assert_nonnull (coarse);
    g_assert_cmpuint (n_coarse, <, df_mesh_n_triangles (mesh) / 3);
    for (size_t t = 0; t < n_coarse; t++)
      {
        for (int i = 0; i < 3; i++)
          g_assert_cmpuint (coarse[3 * t + i], <, df_mesh_n_vertices (mesh));
        area += triangle_area (df_mesh_positions (mesh), &coarse[3 * t]);
      }
    df_assert_close (area, 4 * G_PI * R * R, 2e-2, 0);
    free (coarse);
  }
  df_mesh_free (mesh);
}

static void
test_sphere_normals (void)
{
  const double R = 1.7;
  g_autoptr (df_surface) sphere = make_revolution ("R*sin(t)", "R*cos(t)", 0, G_PI, "R=1.7");
  df_mesh *mesh = NULL;
  df_diag diag;
  const double *x, *n;

  g_assert_cmpint (df_mesh_build (sphere, NULL, &mesh, &diag), ==, DF_OK);
  x = df_mesh_positions (mesh);
  n = df_mesh_normals (mesh);
  for (size_t i = 0; i < df_mesh_n_vertices (mesh); i++)
    {
      /* The outward unit normal of a sphere centred at 0 is X / R, poles included, and
       * K = 1/R^2, |H| = 1/R everywhere (do Carmo, sec. 3-3, from memory). */
      for (int a = 0; a < 3; a++)
        df_assert_close (n[3 * i + a], x[3 * i + a] / R, 0, 1e-7);
      df_assert_close (df_mesh_gaussian (mesh)[i], 1 / (R * R), 1e-7, 0);
      df_assert_close (fabs (df_mesh_mean (mesh)[i]), 1 / R, 1e-7, 0);
    }
  /* Constant K: every quantile is 1/R^2. */
  df_assert_close (df_mesh_abs_quantile (mesh, DF_MESH_GAUSSIAN, 0.5), 1 / (R * R), 1e-7, 0);
  df_assert_close (df_mesh_abs_quantile (mesh, DF_MESH_GAUSSIAN, 0.99), 1 / (R * R), 1e-7, 0);
  /* Triangles wind counter-clockwise about N, so each face normal points outward too. */
  for (size_t t = 0; t < df_mesh_n_triangles (mesh); t++)
    {
      const uint32_t *tri = &df_mesh_indices (mesh)[3 * t];
      const double *a = &x[3 * tri[0]], *b = &x[3 * tri[1]], *c = &x[3 * tri[2]];
      double e1[3] = { b[0] - a[0], b[1] - a[1], b[2] - a[2] };
      double e2[3] = { c[0] - a[0], c[1] - a[1], c[2] - a[2] };
      double fn[3] = { e1[1] * e2[2] - e1[2] * e2[1], e1[2] * e2[0] - e1[0] * e2[2],
                       e1[0] * e2[1] - e1[1] * e2[0] };
      double centre[3] = { a[0] + b[0] + c[0], a[1] + b[1] + c[1], a[2] + b[2] + c[2] };
      double len = sqrt (fn[0] * fn[0] + fn[1] * fn[1] + fn[2] * fn[2]);
      if (len > 1e-12 * R * R)  /* triangles at a pole may be degenerate */
        g_assert_cmpfloat (fn[0] * centre[0] + fn[1] * centre[1] + fn[2] * centre[2], >, 0);
    }
  df_mesh_free (mesh);
}

static void
test_sphere_gauss_bonnet (void)
{
  g_autoptr (df_surface) sphere = make_revolution ("R*sin(t)", "R*cos(t)", 0, G_PI, "R=0.35");
  df_mesh *mesh = NULL;
  df_diag diag;

  g_assert_cmpint (df_mesh_build (sphere, NULL, &mesh, &diag), ==, DF_OK);
  /* Gauss-Bonnet for a closed surface: integral of K dA = 2 pi chi = 4 pi for a sphere
   * (do Carmo, sec. 4-5, from memory). */
  df_assert_close (mesh_total_curvature (mesh, NULL), 4 * G_PI, 5e-3, 0);
  df_mesh_free (mesh);
}

static void
test_torus (void)
{
  const double R = 3.0, a = 1.0;
  g_autoptr (df_surface) torus = make_revolution ("R + a*cos(t)", "a*sin(t)", -G_PI, G_PI,
                                                  "R=3;a=1");
  df_mesh *mesh = NULL;
  df_diag diag;
  double total, total_abs;

  g_assert_cmpint (df_mesh_build (torus, NULL, &mesh, &diag), ==, DF_OK);
  assert_all_finite (mesh);
  /* Area of a torus 4 pi^2 R a (Pappus' theorem; from memory). */
  df_assert_close (mesh_area (mesh), 4 * G_PI * G_PI * R * a, 5e-3, 0);
  /* Gauss-Bonnet: chi = 0, so the positive outer and negative inner curvature cancel, while
   * integral |K| dA = 8 pi (the total absolute curvature of a torus; from memory). */
  total = mesh_total_curvature (mesh, &total_abs);
  df_assert_close (total_abs, 8 * G_PI, 1e-2, 0);
  g_assert_cmpfloat (fabs (total), <, 1e-3 * total_abs);
  /* Largest |K| is on the inner equator: 1 / (a (R - a)) (from K = cos t / (a (R + a cos t)),
   * do Carmo, sec. 3-3, example 4, from memory). */
  df_assert_close (df_mesh_max_abs_k (mesh), 1 / (a * (R - a)), 1e-6, 0);
  df_mesh_free (mesh);
}

static void
test_vertex_cap (void)
{
  g_autoptr (df_surface) torus = make_revolution ("R + a*cos(t)", "a*sin(t)", -G_PI, G_PI,
                                                  "R=3;a=1");
  df_mesh_options options = { .max_vertices = 5000 };
  df_mesh *mesh = NULL;
  df_diag diag;

  /* The cap is this module's contract (a frame-rate budget: common practice, no source). */
  g_assert_cmpint (df_mesh_build (torus, &options, &mesh, &diag), ==, DF_OK);
  g_assert_cmpuint (df_mesh_n_vertices (mesh), <=, 5000);
  g_assert_cmpuint (df_mesh_n_vertices (mesh), >=, 2500);
  /* Still a torus to 3 %: Pappus, as above. */
  df_assert_close (mesh_area (mesh), 4 * G_PI * G_PI * 3.0, 3e-2, 0);
  df_mesh_free (mesh);
}

static void
test_cone_apex (void)
{
  /* A cone of half-angle 30 degrees: r = t sin 30, z = -t cos 30 has its apex on the axis at
   * t = 0, where there is no tangent plane. Lateral area pi r s with s = 1 the slant length
   * (from memory). */
  g_autoptr (df_surface) cone = make_revolution ("t*sin(pi/6)", "-t*cos(pi/6)", 0, 1, "");
  df_mesh *mesh = NULL;
  df_diag diag;
  const double *n;

  g_assert_cmpint (df_mesh_build (cone, NULL, &mesh, &diag), ==, DF_OK);
  assert_all_finite (mesh);
  df_assert_close (mesh_area (mesh), G_PI * 0.5 * 1.0, 5e-3, 0);
  /* The apex row's normals are those of the cone next to it: N . e_z = sin 30 in size (the
   * cone's normal makes 90 - 30 degrees with the axis; elementary, from memory). */
  n = df_mesh_normals (mesh);
  for (size_t c = 0; c < df_mesh_n_cols (mesh); c++)
    df_assert_close (fabs (n[3 * c + 2]), 0.5, 1e-4, 0);
  /* |H| = cos(alpha) / (2 r) on a cone (Meusnier: the parallel's curvature 1/r projected on N,
   * from memory) = cot(alpha) / (2 s) at slant distance s; it diverges at the apex. The area
   * beyond s is a share 1 - s^2 of the whole, so the 75 % area quantile of |H| is at s = 0.5:
   * cot 30 = 1.732 (the quantile moves in steps of one grid row, ~2 % there). The 99 % quantile
   * (s = 0.1, 8.66) stays far below the largest vertex value, next to the apex. */
  df_assert_close (df_mesh_abs_quantile (mesh, DF_MESH_MEAN, 0.75), sqrt (3.0), 3e-2, 0);
  df_assert_close (df_mesh_abs_quantile (mesh, DF_MESH_MEAN, 0.99), sqrt (3.0) / 0.2, 0.15, 0);
  g_assert_cmpfloat (df_mesh_max_abs_h (mesh), >, 3 * df_mesh_abs_quantile (mesh, DF_MESH_MEAN,
                                                                             0.99));
  /* K = 0 on the cone's flank (developable; from memory). */
  g_assert_cmpfloat (df_mesh_abs_quantile (mesh, DF_MESH_GAUSSIAN, 1.0), <, 1e-9);
  df_mesh_free (mesh);
}


static void
test_adaptive_rows (void)
{
  static const char *const vars[] = { "x", "y" };
  g_autoptr (GError) error = NULL;
  df_expr *f = df_expr_parse ("0.2*exp(-(x^2 + y^2)/0.01)", vars, 2, NULL, NULL, &error);
  g_autoptr (df_surface) bump = NULL;
  df_mesh *mesh = NULL;
  df_diag diag;
  const double *uv;
  size_t n_cols, mid = 0;
  double gap_mid, gap_edge;

  g_assert_no_error (error);
  g_assert_cmpint (df_surface_new_graph (f, -1, 1, -1, 1, &bump, &diag), ==, DF_OK);
  g_assert_cmpint (df_mesh_build (bump, NULL, &mesh, &diag), ==, DF_OK);
  assert_all_finite (mesh);
  /* Rows crowd where the normal turns (the narrow bump at x = 0) and thin out on the flat rim:
   * a graded mesh puts its budget where the geometry is (common practice, no source). */
  uv = df_mesh_uv (mesh);
  n_cols = df_mesh_n_cols (mesh);
  for (size_t r = 0; r + 1 < df_mesh_n_rows (mesh); r++)
    if (uv[2 * r * n_cols] <= 0)
      mid = r;
  gap_mid = uv[2 * (mid + 1) * n_cols] - uv[2 * mid * n_cols];
  gap_edge = uv[2 * n_cols] - uv[0];
  g_assert_cmpfloat (gap_mid, <, 0.5 * gap_edge);
  df_mesh_free (mesh);
}

int
main (int argc, char **argv)
{
  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);
  g_test_add_func ("/core/mesh/sphere-area", test_sphere_area);
  g_test_add_func ("/core/mesh/sphere-normals", test_sphere_normals);
  g_test_add_func ("/core/mesh/sphere-gauss-bonnet", test_sphere_gauss_bonnet);
  g_test_add_func ("/core/mesh/torus", test_torus);
  g_test_add_func ("/core/mesh/vertex-cap", test_vertex_cap);
  g_test_add_func ("/core/mesh/cone-apex", test_cone_apex);
  g_test_add_func ("/core/mesh/adaptive-rows", test_adaptive_rows);
  return g_test_run ();
}
