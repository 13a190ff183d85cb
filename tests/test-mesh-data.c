/* test-mesh-data.c: surfaces fitted to triangle meshes read through assimp: a spherical cap
 * written by this test as binary STL (>= 20 000 triangles), ASCII STL, OBJ and PLY, measured
 * against Gauss-Bonnet; a sphere mesh as a surface of revolution with its departure from
 * symmetry; folds refused; placement and units. The meshes are made here, from the closed form
 * of the sphere, so nothing but assimp and the fit stands between the formula and the figure. */
#include <glib/gstdio.h>
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "df-fit-mesh.h"
#include "df-surface-spec.h"
#include "df-test.h"
#include "df-units.h"

#define R_CAP     100.0
#define CAP_DEG   60.0
#define LOOP_DEG  40.0
/* 0.05 degree: the figure the issue sets for a cap exported as a mesh. */
#define MESH_TOL  (0.05 * G_PI / 180.0)

typedef struct
{
  double (*v)[3];
  guint  (*t)[3];
  size_t  nv, nt;
} tri_mesh;

static void
tri_mesh_clear (tri_mesh *m)
{
  g_free (m->v);
  g_free (m->t);
}

/* A cap of the sphere |X| = radius about +z down to polar angle cap_deg: a pole vertex and
 * rings of `around` vertices at equal polar steps; triangles wound anticlockwise seen from
 * +z. rings * around * 2 - around triangles. */
static tri_mesh
sphere_cap (double radius, double cap_deg, int rings, int around)
{
  tri_mesh m = { 0 };
  size_t k = 0;

  m.nv = 1 + (size_t) rings * around;
  m.nt = (size_t) around * (2 * rings - 1);
  m.v = g_malloc (sizeof (double[3]) * (m.nv));
  m.t = g_malloc (sizeof (guint[3]) * (m.nt));
  m.v[0][0] = m.v[0][1] = 0.0;
  m.v[0][2] = radius;
  for (int i = 1; i <= rings; i++)
    for (int j = 0; j < around; j++)
      {
        double th = cap_deg * G_PI / 180.0 * i / rings, ph = 2 * G_PI * j / around;
        size_t a = 1 + (size_t) (i - 1) * around + j;

        m.v[a][0] = radius * sin (th) * cos (ph);
        m.v[a][1] = radius * sin (th) * sin (ph);
        m.v[a][2] = radius * cos (th);
      }
  for (int j = 0; j < around; j++)
    {
      m.t[k][0] = 0;
      m.t[k][1] = 1 + j;
      m.t[k][2] = 1 + (j + 1) % around;
      k++;
    }
  for (int i = 1; i < rings; i++)
    for (int j = 0; j < around; j++)
      {
        guint a = 1 + (i - 1) * around + j, b = 1 + (i - 1) * around + (j + 1) % around;
        guint c = a + around, d = b + around;

        m.t[k][0] = a;
        m.t[k][1] = c;
        m.t[k][2] = d;
        k++;
        m.t[k][0] = a;
        m.t[k][1] = d;
        m.t[k][2] = b;
        k++;
      }
  g_assert_cmpuint (k, ==, m.nt);
  return m;
}

/* Binary STL, the layout every CAD program writes: 80-byte header, a little-endian uint32
 * count, then per triangle the normal and three corners as float32 and a uint16 (from
 * memory; the format has no published standard). */
static void
write_stl_binary (const tri_mesh *m, const char *path)
{
  FILE *f = fopen (path, "wb");
  char header[80] = "driftframe test cap";
  guint32 n = GUINT32_TO_LE ((guint32) m->nt);

  g_assert_nonnull (f);
  fwrite (header, 1, 80, f);
  fwrite (&n, 4, 1, f);
  for (size_t t = 0; t < m->nt; t++)
    {
      float rec[12] = { 0 };
      guint16 attr = 0;

      for (int c = 0; c < 3; c++)
        for (int k = 0; k < 3; k++)
          rec[3 + 3 * c + k] = (float) m->v[m->t[t][c]][k];
      fwrite (rec, sizeof (float), 12, f);
      fwrite (&attr, 2, 1, f);
    }
  g_assert_cmpint (fclose (f), ==, 0);
}

static void
write_text (const char *path, GString *s)
{
  g_autoptr (GError) error = NULL;

  g_file_set_contents (path, s->str, (gssize) s->len, &error);
  g_assert_no_error (error);
  g_string_free (s, TRUE);
}

static void
write_stl_ascii (const tri_mesh *m, const char *path)
{
  GString *s = g_string_new ("solid cap\n");

  for (size_t t = 0; t < m->nt; t++)
    {
      g_string_append (s, "facet normal 0 0 0\nouter loop\n");
      for (int c = 0; c < 3; c++)
        g_string_append_printf (s, "vertex %.17g %.17g %.17g\n", m->v[m->t[t][c]][0],
                                m->v[m->t[t][c]][1], m->v[m->t[t][c]][2]);
      g_string_append (s, "endloop\nendfacet\n");
    }
  g_string_append (s, "endsolid cap\n");
  write_text (path, s);
}

static void
write_obj (const tri_mesh *m, const char *path)
{
  GString *s = g_string_new ("# cap\n");

  for (size_t i = 0; i < m->nv; i++)
    g_string_append_printf (s, "v %.17g %.17g %.17g\n", m->v[i][0], m->v[i][1], m->v[i][2]);
  for (size_t t = 0; t < m->nt; t++)
    g_string_append_printf (s, "f %u %u %u\n", m->t[t][0] + 1, m->t[t][1] + 1,
                            m->t[t][2] + 1);
  write_text (path, s);
}

static void
write_ply (const tri_mesh *m, const char *path)
{
  GString *s = g_string_new (NULL);

  g_string_append_printf (s, "ply\nformat ascii 1.0\nelement vertex %zu\nproperty double x\n"
                          "property double y\nproperty double z\nelement face %zu\n"
                          "property list uchar int vertex_indices\nend_header\n", m->nv, m->nt);
  for (size_t i = 0; i < m->nv; i++)
    g_string_append_printf (s, "%.17g %.17g %.17g\n", m->v[i][0], m->v[i][1], m->v[i][2]);
  for (size_t t = 0; t < m->nt; t++)
    g_string_append_printf (s, "3 %u %u %u\n", m->t[t][0], m->t[t][1], m->t[t][2]);
  write_text (path, s);
}

/* A surface file naming the mesh; extra lines appended to [surface]. */
static df_surface *
load_surface (const char *dir, const char *kind, const char *mesh, const char *extra,
              GError **error)
{
  g_autofree char *path = g_build_filename (dir, "s.surface", NULL);
  g_autofree char *text = g_strdup_printf ("[surface]\nkind=%s\nmesh=%s\n%s", kind, mesh,
                                           extra != NULL ? extra : "");
  g_autoptr (df_surface_spec) spec = NULL;

  g_file_set_contents (path, text, -1, NULL);
  spec = df_surface_spec_load (path, error);
  if (spec == NULL)
    return NULL;
  return df_surface_spec_build (spec, error);
}

/* The latitude circle at polar angle deg on the graph over xy, anticlockwise seen from +z. */
static double
graph_latitude (const df_surface *s, double radius, double deg, double *enclosed)
{
  size_t m = 120;
  g_autofree double (*uv)[2] = g_malloc (sizeof (double[2]) * (m));
  g_auto (df_loop_result) r = { 0 };
  g_autoptr (df_curve) c = NULL;

  for (size_t i = 0; i < m; i++)
    {
      uv[i][0] = radius * sin (deg * G_PI / 180.0) * cos (2 * G_PI * i / m);
      uv[i][1] = radius * sin (deg * G_PI / 180.0) * sin (2 * G_PI * i / m);
    }
  c = df_test_curve (s, (const double (*)[2]) uv, m, true);
  df_test_measure (c, &r);
  if (enclosed != NULL)
    *enclosed = r.area;
  return r.holonomy_rad;
}

/* Latitude circle at polar angle theta on a sphere: it bounds the cap of curvature
 * 2 pi (1 - cos theta) (Gauss-Bonnet; do Carmo, Differential Geometry of Curves and Surfaces,
 * sec. 4-5, from memory), and the holonomy equals it mod 2 pi. */
static double
cap_curvature (double deg)
{
  return 2 * G_PI * (1 - cos (deg * G_PI / 180.0));
}

static char *
tmp_dir (void)
{
  g_autoptr (GError) error = NULL;
  char *dir = g_dir_make_tmp ("df-mesh-XXXXXX", &error);

  g_assert_no_error (error);
  return dir;
}

static void
test_stl_binary_cap (void)
{
  g_autofree char *dir = tmp_dir ();
  g_autofree char *stl = g_build_filename (dir, "cap.stl", NULL);
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface) s = NULL;
  tri_mesh m = sphere_cap (R_CAP, CAP_DEG, 51, 200);
  df_fit_info info;

  g_assert_cmpuint (m.nt, >=, 20000);
  write_stl_binary (&m, stl);
  s = load_surface (dir, "graph", "cap.stl", NULL, &error);
  g_assert_no_error (error);
  g_assert_true (df_fit_get_info (df_surface_get_fn (s), &info));
  /* assimp joins the three copies of each corner: one data point per vertex. */
  g_assert_cmpuint (info.points, ==, m.nv);
  df_assert_close (df_wrap_angle (graph_latitude (s, R_CAP, LOOP_DEG, NULL)
                                  - cap_curvature (LOOP_DEG)), 0.0, 0.0, MESH_TOL);
  tri_mesh_clear (&m);
  df_test_remove_dir (dir);
}

static void
check_format (void (*writer) (const tri_mesh *, const char *), const char *name)
{
  g_autofree char *dir = tmp_dir ();
  g_autofree char *file = g_build_filename (dir, name, NULL);
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface) s = NULL;
  tri_mesh m = sphere_cap (R_CAP, CAP_DEG, 24, 72);

  writer (&m, file);
  s = load_surface (dir, "graph", name, NULL, &error);
  g_assert_no_error (error);
  df_assert_close (df_wrap_angle (graph_latitude (s, R_CAP, LOOP_DEG, NULL)
                                  - cap_curvature (LOOP_DEG)), 0.0, 0.0, MESH_TOL);
  tri_mesh_clear (&m);
  df_test_remove_dir (dir);
}

static void
test_stl_ascii_cap (void)
{
  check_format (write_stl_ascii, "cap.stl");
}

static void
test_obj_cap (void)
{
  check_format (write_obj, "cap.obj");
}

static void
test_ply_cap (void)
{
  check_format (write_ply, "cap.PLY");
}

/* The parallel at chart t of a surface of revolution; its polar angle from the point's z. */
static double
revolution_parallel (const df_surface *s, double t, double radius, double *theta_deg)
{
  size_t m = 120;
  g_autofree double (*uv)[2] = g_malloc (sizeof (double[2]) * (m));
  g_auto (df_loop_result) r = { 0 };
  g_autoptr (df_curve) c = NULL;
  df_chart_jet j;

  for (size_t i = 0; i < m; i++)
    {
      uv[i][0] = t;
      uv[i][1] = 2 * G_PI * i / m;
    }
  g_assert_cmpint (df_surface_eval (s, t, 0.0, 0, &j, NULL), ==, DF_OK);
  *theta_deg = acos (j.x[2] / radius) * 180.0 / G_PI;
  c = df_test_curve (s, (const double (*)[2]) uv, m, true);
  df_test_measure (c, &r);
  return r.holonomy_rad;
}

static void
test_revolution_sphere (void)
{
  g_autofree char *dir = tmp_dir ();
  g_autofree char *stl = g_build_filename (dir, "ball.stl", NULL);
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface) s = NULL;
  tri_mesh m = sphere_cap (R_CAP, 150.0, 60, 90);
  df_fit_info info;
  double dom[4], theta, h;

  write_stl_binary (&m, stl);
  s = load_surface (dir, "revolution", "ball.stl", NULL, &error);
  g_assert_no_error (error);
  g_assert_true (df_fit_get_info (df_surface_get_fn (s), &info));
  g_assert_true (info.has_symmetry);
  /* A sphere is round: what is left is float32 rounding of the STL (~1e-5 of 100 mm). */
  g_assert_cmpfloat (info.symmetry_max, <, 1e-3);
  g_assert_cmpint (info.pole[1], ==, 1);
  g_assert_true (df_fn_get_domain (df_surface_get_fn (s), dom));
  h = revolution_parallel (s, 0.6 * dom[1], R_CAP, &theta);
  /* Either orientation of the parallel: |holonomy| is the smaller cap's curvature. */
  df_assert_close (fabs (df_wrap_angle (h)), cap_curvature (theta), 0.0, MESH_TOL);
  tri_mesh_clear (&m);
  df_test_remove_dir (dir);
}

/* x stretched by 1 + eps: at distance rho from the axis the radius is
 * rho sqrt(1 + (2 eps + eps^2) cos^2 phi) ~ rho (1 + eps/2 + (eps/2) cos 2 phi) (first-order
 * expansion, our own), so the departure from round peaks at eps R / 2 on the equator. */
static void
test_revolution_out_of_round (void)
{
  g_autofree char *dir = tmp_dir ();
  g_autofree char *stl = g_build_filename (dir, "oval.stl", NULL);
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface) s = NULL;
  tri_mesh m = sphere_cap (R_CAP, 150.0, 60, 90);
  const double eps = 0.01;
  df_fit_info info;

  for (size_t i = 0; i < m.nv; i++)
    m.v[i][0] *= 1 + eps;
  write_stl_binary (&m, stl);
  s = load_surface (dir, "revolution", "oval.stl", NULL, &error);
  g_assert_no_error (error);
  g_assert_true (df_fit_get_info (df_surface_get_fn (s), &info));
  df_assert_close (info.symmetry_max, eps * R_CAP / 2, 0.1, 0.0);
  /* The mean of (eps R / 2 cos 2 phi)^2 over phi is half its peak squared; over the sphere's
   * vertices weighted towards the equator the RMS lies below the peak / sqrt 2. */
  g_assert_cmpfloat (info.symmetry_rms, <, info.symmetry_max / sqrt (2.0) * 1.05);
  g_assert_cmpfloat (info.symmetry_rms, >, 0.2 * info.symmetry_max);
  tri_mesh_clear (&m);
  df_test_remove_dir (dir);
}

/* Placement: the cap turned and moved away, brought back by the surface file, measures as the
 * cap did (the same Gauss-Bonnet figure). */
static void
test_placement (void)
{
  g_autofree char *dir = tmp_dir ();
  g_autofree char *stl = g_build_filename (dir, "moved.stl", NULL);
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface) s = NULL;
  tri_mesh m = sphere_cap (R_CAP, CAP_DEG, 30, 120);
  const double ax = 25.0, ay = -40.0, az = 70.0, off[3] = { 12.0, -30.0, 5.0 };

  /* p = Rx^-1 Ry^-1 Rz^-1 (q - off): the file's placement Rz Ry Rx p + off gives q back. */
  for (size_t i = 0; i < m.nv; i++)
    {
      double p[3] = { m.v[i][0] - off[0], m.v[i][1] - off[1], m.v[i][2] - off[2] }, t;
      double c, sn;

      c = cos (-az * G_PI / 180), sn = sin (-az * G_PI / 180);
      t = c * p[0] - sn * p[1], p[1] = sn * p[0] + c * p[1], p[0] = t;
      c = cos (-ay * G_PI / 180), sn = sin (-ay * G_PI / 180);
      t = c * p[0] + sn * p[2], p[2] = -sn * p[0] + c * p[2], p[0] = t;
      c = cos (-ax * G_PI / 180), sn = sin (-ax * G_PI / 180);
      t = c * p[1] - sn * p[2], p[2] = sn * p[1] + c * p[2], p[1] = t;
      memcpy (m.v[i], p, sizeof p);
    }
  write_stl_binary (&m, stl);
  /* Unplaced it folds over seen along z. */
  s = load_surface (dir, "graph", "moved.stl", NULL, &error);
  g_assert_null (s);
  g_assert_nonnull (strstr (error->message, "moved.stl"));
  g_clear_error (&error);
  s = load_surface (dir, "graph", "moved.stl",
                    "placement-rotate-deg=25, -40, 70\nplacement-offset=12,-30,5\n", &error);
  g_assert_no_error (error);
  df_assert_close (df_wrap_angle (graph_latitude (s, R_CAP, LOOP_DEG, NULL)
                                  - cap_curvature (LOOP_DEG)), 0.0, 0.0, MESH_TOL);
  tri_mesh_clear (&m);
  df_test_remove_dir (dir);
}

/* units=m: the same cap in metres measures the same holonomy, and its enclosed area is the
 * millimetre one converted by df-units (1 m^2 = 1e6 mm^2, definition of the metre's prefixes). */
static void
test_units (void)
{
  g_autofree char *dir = tmp_dir ();
  g_autofree char *mm = g_build_filename (dir, "mm.ply", NULL);
  g_autofree char *m_ = g_build_filename (dir, "m.ply", NULL);
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface) s_mm = NULL;
  g_autoptr (df_surface) s_m = NULL;
  tri_mesh a = sphere_cap (R_CAP, CAP_DEG, 24, 72), b = sphere_cap (R_CAP / 1000.0, CAP_DEG, 24, 72);
  double area_mm, area_m, h_mm, h_m;

  write_ply (&a, mm);
  write_ply (&b, m_);
  s_mm = load_surface (dir, "graph", "mm.ply", "units=mm\nfit-tolerance=0.001\n", &error);
  g_assert_no_error (error);
  s_m = load_surface (dir, "graph", "m.ply", "units=m\nfit-tolerance=0.000001\n", &error);
  g_assert_no_error (error);
  h_mm = graph_latitude (s_mm, R_CAP, LOOP_DEG, &area_mm);
  h_m = graph_latitude (s_m, R_CAP / 1000.0, LOOP_DEG, &area_m);
  df_assert_close (h_m, h_mm, 0.0, 1e-6);
  df_assert_close (df_unit_area (area_m, DF_UNIT_M, DF_UNIT_MM), area_mm, 1e-6, 0.0);
  g_clear_pointer (&s_m, df_surface_free);
  s_m = load_surface (dir, "graph", "m.ply", "units=furlong\n", &error);
  g_assert_null (s_m);
  g_assert_nonnull (strstr (error->message, "units"));
  g_assert_nonnull (strstr (error->message, "furlong"));
  tri_mesh_clear (&a);
  tri_mesh_clear (&b);
  df_test_remove_dir (dir);
}

/* A ramp whose x runs forward, back and forward again: the middle third faces the other way
 * seen along z. */
static void
test_fold_refused (void)
{
  int nu = 30, nv = 6;
  tri_mesh m = { 0 };
  df_fit_mesh_input in;
  df_fn *fn = NULL;
  df_diag diag;
  size_t k = 0;

  m.nv = (size_t) (nu + 1) * (nv + 1);
  m.nt = (size_t) nu * nv * 2;
  m.v = g_malloc (sizeof (double[3]) * (m.nv));
  m.t = g_malloc (sizeof (guint[3]) * (m.nt));
  for (int i = 0; i <= nu; i++)
    for (int j = 0; j <= nv; j++)
      {
        double u = 3.0 * i / nu;

        m.v[i * (nv + 1) + j][0] = u - 1.5 * sin (2 * G_PI * u / 3.0);
        m.v[i * (nv + 1) + j][1] = (double) j / nv;
        m.v[i * (nv + 1) + j][2] = u;
      }
  for (int i = 0; i < nu; i++)
    for (int j = 0; j < nv; j++)
      {
        guint a = i * (nv + 1) + j, b = a + 1, c = a + nv + 1, d = c + 1;

        m.t[k][0] = a, m.t[k][1] = c, m.t[k][2] = d, k++;
        m.t[k][0] = a, m.t[k][1] = d, m.t[k][2] = b, k++;
      }
  in = (df_fit_mesh_input) { (const double (*)[3]) m.v, m.nv, (const unsigned (*)[3]) m.t,
                             m.nt, 0, 0 };
  g_assert_cmpint (df_fit_mesh_graph (&in, DF_FIT_TOLERANCE_AUTO, &fn, NULL, &diag), ==,
                   DF_E_INPUT);
  g_assert_null (fn);
  g_assert_nonnull (strstr (diag.detail, "folds over"));
  g_assert_nonnull (strstr (diag.detail, "triangle"));
  g_assert_nonnull (strstr (diag.detail, "(x, y)"));
  tri_mesh_clear (&m);
}

/* A second sheet above part of the first, the footprint widened by a far sliver so that the
 * total area fits the box: found by a vertex over a triangle. */
static void
test_layer_refused (void)
{
  tri_mesh a = sphere_cap (R_CAP, CAP_DEG, 10, 24), m = { 0 };
  df_fit_mesh_input in;
  df_fn *fn = NULL;
  df_diag diag;

  m.nv = a.nv + 3 + 3;
  m.nt = a.nt + 1 + 1;
  m.v = g_malloc (sizeof (double[3]) * (m.nv));
  m.t = g_malloc (sizeof (guint[3]) * (m.nt));
  memcpy (m.v, a.v, sizeof *m.v * a.nv);
  memcpy (m.t, a.t, sizeof *m.t * a.nt);
  /* The layer: a small triangle 5 mm above the pole. */
  memcpy (m.v[a.nv], (double[3]) { -3, -3, R_CAP + 5 }, sizeof *m.v);
  memcpy (m.v[a.nv + 1], (double[3]) { 6, -3, R_CAP + 5 }, sizeof *m.v);
  memcpy (m.v[a.nv + 2], (double[3]) { -3, 6, R_CAP + 5 }, sizeof *m.v);
  /* The sliver, far out. */
  memcpy (m.v[a.nv + 3], (double[3]) { 400, 400, 0 }, sizeof *m.v);
  memcpy (m.v[a.nv + 4], (double[3]) { 401, 400, 0 }, sizeof *m.v);
  memcpy (m.v[a.nv + 5], (double[3]) { 400, 401, 0 }, sizeof *m.v);
  m.t[a.nt][0] = a.nv, m.t[a.nt][1] = a.nv + 1, m.t[a.nt][2] = a.nv + 2;
  m.t[a.nt + 1][0] = a.nv + 3, m.t[a.nt + 1][1] = a.nv + 4, m.t[a.nt + 1][2] = a.nv + 5;
  in = (df_fit_mesh_input) { (const double (*)[3]) m.v, m.nv, (const unsigned (*)[3]) m.t,
                             m.nt, 0, 0 };
  g_assert_cmpint (df_fit_mesh_graph (&in, DF_FIT_TOLERANCE_AUTO, &fn, NULL, &diag), ==,
                   DF_E_INPUT);
  g_assert_nonnull (strstr (diag.detail, "lies over triangle"));
  g_assert_nonnull (strstr (diag.detail, "folds over"));
  tri_mesh_clear (&a);
  tri_mesh_clear (&m);
}

int
main (int argc, char **argv)
{
  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);
  g_test_add_func ("/core/mesh-data/stl-binary-cap", test_stl_binary_cap);
  g_test_add_func ("/core/mesh-data/stl-ascii-cap", test_stl_ascii_cap);
  g_test_add_func ("/core/mesh-data/obj-cap", test_obj_cap);
  g_test_add_func ("/core/mesh-data/ply-cap", test_ply_cap);
  g_test_add_func ("/core/mesh-data/revolution-sphere", test_revolution_sphere);
  g_test_add_func ("/core/mesh-data/revolution-out-of-round", test_revolution_out_of_round);
  g_test_add_func ("/core/mesh-data/placement", test_placement);
  g_test_add_func ("/core/mesh-data/units", test_units);
  g_test_add_func ("/core/mesh-data/fold-refused", test_fold_refused);
  g_test_add_func ("/core/mesh-data/layer-refused", test_layer_refused);
  return g_test_run ();
}
