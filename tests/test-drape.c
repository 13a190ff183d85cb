/* test-drape.c: the woven-ply drape (df-drape.c) against closed forms: zero shear and the
 * developed outline on the plane and the cylinder; on the sphere, Gauss-Bonnet for every
 * geodesic cell, symmetry about the generators, convergence of the shear, Hazzidakis' formula,
 * and the sum of the cells' excess against `measure` of the block's boundary and of the whole
 * cells' boundary loop (`drape --boundary`). */
#include <glib/gstdio.h>
#include <json-glib/json-glib.h>
#include <math.h>

#include "df-drape.h"
#include "df-drape-out.h"
#include "df-loop-csv.h"
#include "df-test.h"

/* A chart rectangle as the ply outline, n points a side. */
static double (*rect_outline (double u0, double u1, double v0, double v1, int n, size_t *count))[2]
{
  double (*p)[2] = g_malloc_n (4 * (size_t) n, sizeof *p);
  size_t k = 0;

  for (int a = 0; a < n; a++, k++)
    p[k][0] = u0 + (u1 - u0) * a / n, p[k][1] = v0;
  for (int a = 0; a < n; a++, k++)
    p[k][0] = u1, p[k][1] = v0 + (v1 - v0) * a / n;
  for (int a = 0; a < n; a++, k++)
    p[k][0] = u1 - (u1 - u0) * a / n, p[k][1] = v1;
  for (int a = 0; a < n; a++, k++)
    p[k][0] = u0, p[k][1] = v1 - (v1 - v0) * a / n;
  *count = k;
  return p;
}

static df_drape *
drape_or_die (const df_surface *s, const double (*outline)[2], size_t n, double u, double v,
              double warp_deg, double h)
{
  df_drape_options o;
  df_drape *d = NULL;
  df_diag diag;
  df_status st;
  const df_drape_summary *sm;

  df_drape_options_init (&o);
  o.warp_rad = warp_deg * G_PI / 180;
  o.cell = h;
  st = df_drape_new (s, outline, n, u, v, &o, &d, &diag);
  if (st != DF_OK)
    g_error ("drape: %s: %s", df_status_describe (st), diag.detail);
  sm = df_drape_get_summary (d);
  g_test_message ("warp %g deg, h %g: %zu pins, %zu cells (%zu whole), %zu lost (%s), %s x %d "
                  "a segment, max shear %.6g rad, closure %.3g rad, flat area %.10g, %zu "
                  "outline points unmapped", warp_deg, h, sm->n_nodes, sm->n_cells,
                  sm->n_whole_cells, sm->n_nodes_lost, sm->lost_note, sm->stepper, sm->substeps,
                  sm->max_shear_rad, sm->closure_max_residual_rad, sm->flat_area,
                  sm->n_outline_unmapped);
  return d;
}


/* A developable surface and its development: chart point -> flat point (start at 0). */
typedef void (*develop_fn) (const double uv[2], const double start[2], double out[2]);

static void
develop_plane (const double uv[2], const double start[2], double out[2])
{
  out[0] = uv[0] - start[0];
  out[1] = uv[1] - start[1];
}

/* Cylinder r = R = 2, z = -t: (t, phi) -> (t, R phi) is an isometry onto the plane, and the
 * chart is positively oriented about N (N is defined from X_t x X_phi). */
static void
develop_cylinder (const double uv[2], const double start[2], double out[2])
{
  out[0] = uv[0] - start[0];
  out[1] = 2.0 * (uv[1] - start[1]);
}

/* On a developable surface the fishnet net is the square lattice of the development: zero
 * shear everywhere for any warp angle, zero excess in every cell, and the flat outline is the
 * developed outline turned by -warp (an isometry of the plane carries a square net to a
 * square net; closed form, from memory). */
static void
check_developable (const df_surface *s, develop_fn develop, const double start[2],
                   const double (*ol)[2], size_t n, double h)
{
  const double warps[] = { 0, 17, 45, 90, 123 };

  for (gsize w = 0; w < G_N_ELEMENTS (warps); w++)
    {
      g_autoptr (df_drape) d = drape_or_die (s, ol, n, start[0], start[1], warps[w], h);
      const df_drape_summary *sm = df_drape_get_summary (d);
      const double (*flat)[2] = df_drape_get_flat_outline (d);
      const double (*uv)[2] = df_drape_get_outline (d);
      const bool *mapped = df_drape_get_outline_mapped (d);
      double c = cos (warps[w] * G_PI / 180), sn = sin (warps[w] * G_PI / 180), worst = 0;
      size_t checked = 0;

      g_assert_cmpuint (sm->n_outline_unmapped, ==, 0);
      g_assert_cmpuint (sm->n_cells, >, 100);
      for (int j = sm->j_min; j <= sm->j_max; j++)
        for (int i = sm->i_min; i <= sm->i_max; i++)
          {
            df_drape_node nd;
            df_drape_cell cell;
            double dev[2], want[2];

            if (df_drape_get_node (d, i, j, &nd))
              {
                g_assert_cmpfloat (fabs (nd.shear_rad), <, 1e-10);
                /* The pin sits at its lattice point of the development. */
                develop ((double[2]) { nd.u, nd.v }, start, dev);
                want[0] = c * i * h - sn * j * h;
                want[1] = sn * i * h + c * j * h;
                df_assert_close (dev[0], want[0], 0, 1e-9);
                df_assert_close (dev[1], want[1], 0, 1e-9);
                checked++;
              }
            if (df_drape_get_cell (d, i, j, &cell))
              g_assert_cmpfloat (fabs (cell.excess_rad), <, 1e-10);
          }
      g_assert_cmpuint (checked, >, 100);
      for (size_t k = 0; k < sm->n_outline; k++)
        {
          double dev[2];

          g_assert_true (mapped[k]);
          develop (uv[k], start, dev);
          worst = fmax (worst, fabs (flat[k][0] - (c * dev[0] + sn * dev[1])));
          worst = fmax (worst, fabs (flat[k][1] - (-sn * dev[0] + c * dev[1])));
        }
      g_assert_cmpfloat (worst, <, 1e-9);
      g_assert_cmpfloat (fabs (sm->max_shear_rad), <, 1e-10);
      g_assert_cmpfloat (fabs (sm->enclosed_curvature_rad), <, 1e-9);
    }
}

static void
test_plane (void)
{
  g_autoptr (df_surface) s = df_test_graph ("0*x*y", -3, 3, -3, 3);
  size_t n;
  g_autofree double (*ol)[2] = rect_outline (-1.2, 0.9, -0.8, 1.1, 30, &n);

  check_developable (s, develop_plane, (double[2]) { 0.1, -0.05 }, (const double (*)[2]) ol, n,
                     0.1);
}

static void
test_cylinder (void)
{
  g_autoptr (df_surface) s = df_test_revolution ("2", "-t", 0, 6);
  size_t n;
  g_autofree double (*ol)[2] = rect_outline (2.0, 4.2, -0.6, 0.5, 30, &n);

  check_developable (s, develop_cylinder, (double[2]) { 3.0, 0.0 }, (const double (*)[2]) ol,
                     n, 0.1);
}

static df_drape *
unit_sphere_drape (const df_surface *s, double warp_deg, double h)
{
  size_t n;
  g_autofree double (*ol)[2] = rect_outline (G_PI / 2 - 0.55, G_PI / 2 + 0.55, -0.55, 0.55, 50,
                                             &n);

  return drape_or_die (s, (const double (*)[2]) ol, n, G_PI / 2, 0, warp_deg, h);
}

/* Gauss-Bonnet for a geodesic quadrilateral: the sum of its interior angles minus 2 pi equals
 * the integral of K dA over it (do Carmo, Differential Geometry of Curves and Surfaces,
 * sec. 4-5, from memory). The integral comes from quadrature of K sqrt(g) over the cell. */
static void
test_sphere_closure (void)
{
  g_autoptr (df_surface) s = df_test_revolution ("sin(t)", "cos(t)", 0, G_PI);
  const double warps[] = { 0, 30 };

  for (gsize w = 0; w < G_N_ELEMENTS (warps); w++)
    {
      g_autoptr (df_drape) d = unit_sphere_drape (s, warps[w], 0.05);
      const df_drape_summary *sm = df_drape_get_summary (d);
      size_t checked = 0;
      double area = 0;

      for (int j = sm->j_min; j < sm->j_max; j++)
        for (int i = sm->i_min; i < sm->i_max; i++)
          {
            df_drape_cell c;

            if (!df_drape_get_cell (d, i, j, &c) || c.corners_inside == 0)
              continue;
            df_assert_close (c.excess_rad, c.k_area_rad, 0, 1e-8);
            /* On the unit sphere K = 1: the integral is the cell's area. */
            df_assert_close (c.k_area_rad, c.area, 1e-12, 1e-15);
            g_assert_cmpfloat (c.excess_rad, >, 0);
            area += c.whole ? c.area : 0;
            checked++;
          }
      g_assert_cmpuint (checked, ==, sm->n_cells);
      g_assert_cmpuint (checked, >, 400);
      g_assert_cmpfloat (sm->closure_max_residual_rad, <, 1e-8);
      df_assert_close (sm->enclosed_curvature_rad, area, 1e-10, 0);
      g_assert_cmpuint (sm->n_outline_unmapped, ==, 0);
    }
}

/* Warp along the meridian at the equator: the net is mirror-symmetric about the warp
 * generator (phi -> -phi takes pin (i, j) to (i, -j)) and about the weft generator, the
 * equator (t -> pi - t takes (i, j) to (-i, j)); a mirror reverses the shear's sign. */
/* A large net (more than 64 cells across) is built in two passes: a coarse net finds which
 * pins the ply needs. The fine net must still cover every outline point, with cells that
 * close, and tile the flat outline. */
static void
test_sphere_two_pass (void)
{
  g_autoptr (df_surface) s = df_test_revolution ("sin(t)", "cos(t)", 0, G_PI);
  const double h = 0.0125;
  g_autoptr (df_drape) d = unit_sphere_drape (s, 30, h);
  const df_drape_summary *sm = df_drape_get_summary (d);

  g_assert_cmpuint (sm->n_outline_unmapped, ==, 0);
  g_assert_cmpfloat (sm->closure_max_residual_rad, <, 1e-8);
  /* The whole cells are the flat outline's squares less a rim one cell wide. */
  g_assert_cmpfloat (sm->n_whole_cells * h * h, <, sm->flat_area);
  g_assert_cmpfloat (sm->n_whole_cells * h * h, >, 0.95 * sm->flat_area);
  g_assert_cmpfloat (sm->n_cells * h * h, >, sm->flat_area);
}

static void
test_sphere_symmetry (void)
{
  g_autoptr (df_surface) s = df_test_revolution ("sin(t)", "cos(t)", 0, G_PI);
  g_autoptr (df_drape) d = unit_sphere_drape (s, 0, 0.05);
  const df_drape_summary *sm = df_drape_get_summary (d);
  size_t pairs = 0;

  for (int j = sm->j_min; j <= sm->j_max; j++)
    for (int i = sm->i_min; i <= sm->i_max; i++)
      {
        df_drape_node p, q;

        if (!df_drape_get_node (d, i, j, &p) || !p.inside)
          continue;
        if (df_drape_get_node (d, i, -j, &q))
          {
            df_assert_close (q.u, p.u, 0, 1e-11);
            df_assert_close (q.v, -p.v, 0, 1e-11);
            df_assert_close (q.shear_rad, j == 0 ? p.shear_rad : -p.shear_rad, 0, 1e-9);
            pairs++;
          }
        if (df_drape_get_node (d, -i, j, &q))
          {
            df_assert_close (q.u, G_PI - p.u, 0, 1e-11);
            df_assert_close (q.v, p.v, 0, 1e-11);
            df_assert_close (q.shear_rad, i == 0 ? p.shear_rad : -p.shear_rad, 0, 1e-9);
            pairs++;
          }
      }
  g_assert_cmpuint (pairs, >, 400);
}

/* Shear at the pin at net coordinates (x, y) (a multiple of h). */
static double
shear_at (const df_drape *d, double h, double x, double y)
{
  df_drape_node nd;

  g_assert_true (df_drape_get_node (d, (int) lround (x / h), (int) lround (y / h), &nd));
  return nd.shear_rad;
}

/* The discrete net converges to the smooth Chebyshev net as h -> 0 (Chebyshev 1878; the
 * order is not assumed: the successive differences must shrink, and at least linearly). */
static void
test_sphere_convergence (void)
{
  g_autoptr (df_surface) s = df_test_revolution ("sin(t)", "cos(t)", 0, G_PI);
  const double hs[] = { 0.1, 0.05, 0.025 };
  double g[3][2];

  for (int k = 0; k < 3; k++)
    {
      g_autoptr (df_drape) d = unit_sphere_drape (s, 0, hs[k]);

      g[k][0] = shear_at (d, hs[k], 0.4, 0.4);
      g[k][1] = shear_at (d, hs[k], 0.3, -0.2);
    }
  for (int p = 0; p < 2; p++)
    {
      double d1 = fabs (g[0][p] - g[1][p]), d2 = fabs (g[1][p] - g[2][p]);

      g_test_message ("shear %.12g %.12g %.12g: differences %.3g %.3g, order %.2f", g[0][p],
                      g[1][p], g[2][p], d1, d2, log2 (d1 / d2));
      g_assert_cmpfloat (fabs (g[2][p]), >, 0.01);   /* a real shear, not a trivial zero */
      g_assert_cmpfloat (d2, <, 0.55 * d1);
      g_assert_cmpfloat (d2, <, 0.05 * fabs (g[2][p]));
    }
}

/* Hazzidakis: on a Chebyshev net with crossing angle omega, K = -omega_uv / sin omega
 * (Hazzidakis 1879, cited in the issue and GEOMETRY.md; the Brioschi formula for
 * ds^2 = du^2 + 2 cos omega du dv + dv^2 gives it, derived by hand). The pins' crossing
 * angles, differenced over 2h, must give K = 1 on the unit sphere with an error that falls
 * like h. */
static double
hazzidakis_error (const df_drape *d, double h, double x, double y)
{
  int i = (int) lround (x / h), j = (int) lround (y / h);
  df_drape_node n[4], c;
  double om[4], om_uv;

  g_assert_true (df_drape_get_node (d, i + 1, j + 1, &n[0]));
  g_assert_true (df_drape_get_node (d, i + 1, j - 1, &n[1]));
  g_assert_true (df_drape_get_node (d, i - 1, j + 1, &n[2]));
  g_assert_true (df_drape_get_node (d, i - 1, j - 1, &n[3]));
  g_assert_true (df_drape_get_node (d, i, j, &c));
  for (int k = 0; k < 4; k++)
    om[k] = G_PI / 2 - n[k].shear_rad;
  om_uv = (om[0] - om[1] - om[2] + om[3]) / (4 * h * h);
  return -om_uv / sin (G_PI / 2 - c.shear_rad) - 1.0;
}

static void
test_sphere_hazzidakis (void)
{
  g_autoptr (df_surface) s = df_test_revolution ("sin(t)", "cos(t)", 0, G_PI);
  const double hs[] = { 0.05, 0.025 };
  double e[2][2];

  for (int k = 0; k < 2; k++)
    {
      g_autoptr (df_drape) d = unit_sphere_drape (s, 20, hs[k]);

      e[k][0] = hazzidakis_error (d, hs[k], 0.3, 0.3);
      e[k][1] = hazzidakis_error (d, hs[k], -0.2, 0.35);
    }
  for (int p = 0; p < 2; p++)
    {
      g_test_message ("Hazzidakis K - 1: %.3g (h = %g), %.3g (h = %g)", e[0][p], hs[0], e[1][p],
                      hs[1]);
      g_assert_cmpfloat (fabs (e[0][p]), <, 2 * hs[0]);
      g_assert_cmpfloat (fabs (e[1][p]), <, 2 * hs[1]);
      g_assert_cmpfloat (fabs (e[1][p]), <, 0.7 * fabs (e[0][p]) + 1e-6);
    }
}

/* The excess summed over a block of whole cells against `measure` of the block's boundary
 * (df_loop_measure, whose enclosed curvature comes from Green's theorem, independent of the
 * drape's angles): Gauss-Bonnet adds up over cells that share sides. */
static void
test_sphere_block_measure (void)
{
  g_autoptr (df_surface) s = df_test_revolution ("sin(t)", "cos(t)", 0, G_PI);
  g_autoptr (df_drape) d = unit_sphere_drape (s, 25, 0.05);
  const int blocks[][4] = { { -4, 4, -4, 4 }, { -6, 3, -2, 7 }, { 0, 1, 0, 1 } };

  for (gsize b = 0; b < G_N_ELEMENTS (blocks); b++)
    {
      g_autoptr (df_curve) curve = NULL;
      g_autoptr (df_drape_block) block = NULL;
      g_auto (df_loop_result) r = { 0 };
      double excess = df_drape_block_excess (d, blocks[b][0], blocks[b][1], blocks[b][2],
                                             blocks[b][3]);
      df_diag diag;

      g_assert_true (isfinite (excess));
      g_assert_cmpint (df_drape_block_curve (d, blocks[b][0], blocks[b][1], blocks[b][2],
                                             blocks[b][3], &curve, &block, &diag), ==, DF_OK);
      df_test_measure (curve, &r);
      g_assert_true (r.bounds_disc);
      g_assert_true (r.disc_on_left);
      g_test_message ("block %zu: excess %.15g, measure %.15g", b, excess,
                      r.enclosed_curvature_rad);
      df_assert_close (excess, r.enclosed_curvature_rad, 0, 1e-6);
      /* The boundary is a geodesic polygon: its holonomy is the enclosed curvature too. */
      df_assert_close (df_wrap_angle (r.holonomy_rad - excess), 0, 0, 1e-6);
    }
}

/* A polygon through the given corners (offsets from (pi/2, 0) in the chart), each side cut into
 * n points. */
static double (*corner_outline (const double (*c)[2], size_t nc, int n, size_t *count))[2]
{
  double (*p)[2] = g_malloc_n (nc * (size_t) n, sizeof *p);
  size_t k = 0;

  for (size_t a = 0; a < nc; a++)
    for (int q = 0; q < n; q++, k++)
      {
        const double *p0 = c[a], *p1 = c[(a + 1) % nc];

        p[k][0] = G_PI / 2 + p0[0] + (p1[0] - p0[0]) * q / n;
        p[k][1] = p0[1] + (p1[1] - p0[1]) * q / n;
      }
  *count = k;
  return p;
}

/* Measures the boundary loop written as CSV, read back by the loop reader as `measure` does:
 * its enclosed curvature, from Green's theorem (df-green), independent of the cells' angles. */
static double
measure_boundary (const df_surface *s, const df_drape *d, df_drape_boundary_info *info)
{
  g_autofree char *csv = df_drape_boundary_to_csv (d, 64, info);
  g_autofree double (*uv)[2] = NULL;
  g_autoptr (df_curve) curve = NULL;
  g_autoptr (GError) error = NULL;
  g_auto (df_loop_result) r = { 0 };
  gsize n = 0;
  df_diag diag;

  g_assert_nonnull (csv);
  g_assert_true (df_loop_csv_parse (csv, "boundary.csv", s, &uv, &n, &error));
  g_assert_no_error (error);
  g_assert_cmpuint (n, ==, info->n_segments * 64);
  g_assert_cmpint (df_curve_new_through_points (s, (const double (*)[2]) uv, n, true, &curve,
                                                &diag), ==, DF_OK);
  df_test_measure (curve, &r);
  g_assert_true (r.bounds_disc);
  g_assert_true (r.disc_on_left);
  g_test_message ("boundary: %zu cells (%zu whole of %zu, %zu pieces, %zu filled, %zu cut), "
                  "excess %.15g, measure %.15g", info->n_cells,
                  info->n_cells - info->n_cells_filled, info->n_whole_cells, info->n_pieces,
                  info->n_cells_filled, info->n_corner_cuts, info->excess_rad,
                  r.enclosed_curvature_rad);
  return r.enclosed_curvature_rad;
}

/* The boundary loop of the whole cells, read back and measured, encloses the curvature of the
 * cells it bounds (Gauss-Bonnet for each geodesic cell adds up over cells sharing sides; do
 * Carmo, Differential Geometry of Curves and Surfaces, sec. 4-5, from memory). A simply
 * connected set of whole cells is bounded whole; a dumbbell whose neck is narrower than a cell
 * keeps its larger lobe; a ring of whole cells round an outline's slit-open hole has the hole
 * filled, and its cells' excess counts; a ring closed only where two cells touch at a corner is
 * opened there. */
static void
test_sphere_boundary_loop (void)
{
  g_autoptr (df_surface) s = df_test_revolution ("sin(t)", "cos(t)", 0, G_PI);
  const double dumbbell[][2] = { { -0.45, -0.2 }, { -0.1, -0.2 }, { -0.1, -0.01 },
                                 { 0.1, -0.01 }, { 0.1, -0.2 }, { 0.5, -0.2 }, { 0.5, 0.2 },
                                 { 0.1, 0.2 }, { 0.1, 0.01 }, { -0.1, 0.01 }, { -0.1, 0.2 },
                                 { -0.45, 0.2 } };
  /* A square ring, open by a slit at 0.01 < v < 0.02 between two rows of pins (v = 0 and
   * 0.05 along the start's weft, the equator), so cells span the slit. */
  const double ring[][2] = { { 0.4, 0.02 }, { 0.4, 0.4 }, { -0.4, 0.4 }, { -0.4, -0.4 },
                             { 0.4, -0.4 }, { 0.4, 0.01 }, { 0.2, 0.01 }, { 0.2, -0.2 },
                             { -0.2, -0.2 }, { -0.2, 0.2 }, { 0.2, 0.2 }, { 0.2, 0.02 } };
  /* In cells (h = 0.04) from the start pin: bars of pins 0..6 x 0..2 (bottom), 4..6 x 0..6
   * (right), 2..6 x 4..6 (top), 0..2 x 0..4 (left), each widened by 0.4 h, slit open at
   * 3.3 < i < 3.4 between two columns of pins. Cells (1, 3) and (2, 4) touch only at pin
   * (2, 4), the hole (2, 3) on one side and (1, 4) outside on the other. */
  const double pinch[][2] = { { 3.4, -0.4 }, { 6.4, -0.4 }, { 6.4, 6.4 }, { 1.6, 6.4 },
                              { 1.6, 4.4 }, { -0.4, 4.4 }, { -0.4, -0.4 }, { 3.3, -0.4 },
                              { 3.3, 2.4 }, { 2.4, 2.4 }, { 2.4, 3.6 }, { 3.6, 3.6 },
                              { 3.6, 2.4 }, { 3.4, 2.4 } };
  df_drape_boundary_info info;

  {
    g_autoptr (df_drape) d = unit_sphere_drape (s, 20, 0.05);
    const df_drape_summary *sm = df_drape_get_summary (d);
    double got = measure_boundary (s, d, &info);

    g_assert_cmpuint (info.n_pieces, ==, 1);
    g_assert_cmpuint (info.n_whole_left_out, ==, 0);
    g_assert_cmpuint (info.n_cells_filled, ==, 0);
    g_assert_cmpuint (info.n_cells, ==, sm->n_whole_cells);
    df_assert_close (info.excess_rad, sm->enclosed_curvature_rad, 1e-14, 0);
    df_assert_close (got, sm->enclosed_curvature_rad, 0, 1e-6);
  }
  {
    size_t n;
    g_autofree double (*ol)[2] = corner_outline (dumbbell, G_N_ELEMENTS (dumbbell), 20, &n);
    g_autoptr (df_drape) d = drape_or_die (s, (const double (*)[2]) ol, n, G_PI / 2, 0, 0, 0.05);
    const df_drape_summary *sm = df_drape_get_summary (d);
    double got = measure_boundary (s, d, &info);

    g_assert_cmpuint (info.n_pieces, ==, 2);
    g_assert_cmpuint (info.n_whole_left_out, >, 0);
    g_assert_cmpuint (info.n_cells + info.n_whole_left_out, ==, sm->n_whole_cells);
    /* The larger lobe (0.4 against 0.35 wide) is kept. */
    g_assert_cmpuint (info.n_cells, >, info.n_whole_left_out);
    g_assert_cmpfloat (info.excess_rad, <, sm->enclosed_curvature_rad);
    df_assert_close (got, info.excess_rad, 0, 1e-6);
  }
  {
    size_t n;
    g_autofree double (*ol)[2] = corner_outline (ring, G_N_ELEMENTS (ring), 20, &n);
    g_autoptr (df_drape) d = drape_or_die (s, (const double (*)[2]) ol, n, G_PI / 2, 0.3, 0,
                                           0.05);
    const df_drape_summary *sm = df_drape_get_summary (d);
    double got = measure_boundary (s, d, &info);

    g_assert_cmpuint (info.n_pieces, ==, 1);
    g_assert_cmpuint (info.n_cells_filled, >, 0);
    g_assert_cmpuint (info.n_cells - info.n_cells_filled, ==, sm->n_whole_cells);
    g_assert_cmpfloat (info.excess_rad, >, sm->enclosed_curvature_rad);
    df_assert_close (got, info.excess_rad, 0, 1e-6);
  }
  {
    const double h = 0.04;
    double scaled[G_N_ELEMENTS (pinch)][2];
    size_t n;
    g_autofree double (*ol)[2] = NULL;

    for (gsize k = 0; k < G_N_ELEMENTS (pinch); k++)
      scaled[k][0] = pinch[k][0] * h, scaled[k][1] = pinch[k][1] * h;
    ol = corner_outline ((const double (*)[2]) scaled, G_N_ELEMENTS (pinch), 20, &n);
    {
      g_autoptr (df_drape) d = drape_or_die (s, (const double (*)[2]) ol, n, G_PI / 2, 0, 0, h);
      const df_drape_summary *sm = df_drape_get_summary (d);
      double got = measure_boundary (s, d, &info);

      /* 12 + 8 + 4 + 4 cells in the bars (less the overlaps), one taken out at the corner
       * contact. */
      g_assert_cmpuint (sm->n_whole_cells, ==, 28);
      g_assert_cmpuint (info.n_pieces, ==, 1);
      g_assert_cmpuint (info.n_corner_cuts, ==, 1);
      g_assert_cmpuint (info.n_cells_filled, ==, 0);
      g_assert_cmpuint (info.n_cells, ==, 27);
      g_assert_cmpuint (info.n_whole_left_out, ==, 1);
      df_assert_close (got, info.excess_rad, 0, 1e-6);
    }
  }
}

static void
run_cli (const char *const *args, char **out, char **err, int *status)
{
  g_autoptr (GPtrArray) argv = g_ptr_array_new ();
  g_autoptr (GError) error = NULL;
  g_autoptr (GError) exit_error = NULL;
  int wait_status = 0;

  g_ptr_array_add (argv, (char *) DF_CLI_PATH);
  for (const char *const *a = args; *a != NULL; a++)
    g_ptr_array_add (argv, (char *) *a);
  g_ptr_array_add (argv, NULL);
  g_assert_true (g_spawn_sync (NULL, (char **) argv->pdata, NULL, G_SPAWN_DEFAULT, NULL, NULL,
                               out, err, &wait_status, &error));
  g_assert_no_error (error);
  *status = g_spawn_check_wait_status (wait_status, &exit_error) ? 0 : exit_error->code;
  g_test_message ("exit %d\nstdout: %s\nstderr: %s", *status, *out, *err);
}

/* `driftframe-cli drape --json` carries the keys of issue 12, the files are written, and bad
 * input is refused with a message naming the option or key. */
static void
test_cli (void)
{
  g_autofree char *dir = g_dir_make_tmp ("drape-XXXXXX", NULL);
  g_autofree char *loop = g_build_filename (dir, "ply.csv", NULL);
  g_autofree char *svg = g_build_filename (dir, "flat.svg", NULL);
  g_autofree char *nodes = g_build_filename (dir, "pins.csv", NULL);
  g_autofree char *proj = g_build_filename (dir, "bad.dfproj", NULL);
  g_autoptr (GString) csv = g_string_new ("u,v\n");
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_autofree char *out = NULL, *err = NULL, *text = NULL;
  JsonObject *o;
  int status;

  /* A 120 mm x 120 mm patch (chart) round the equator of a sphere of radius 100 mm. */
  for (int k = 0; k < 24; k++)
    {
      double a = 2 * G_PI * k / 24;

      g_string_append_printf (csv, "%.12f,%.12f\n", G_PI / 2 + 0.5 * cos (a), 0.5 * sin (a));
    }
  g_assert_true (g_file_set_contents (loop, csv->str, -1, NULL));
  {
    const char *args[] = { "drape", "--preset", "sphere", "--param", "R=100", "--loop", loop,
                           "--start", "1.5707963267948966,0", "--warp-deg", "10", "--cell", "4",
                           "--max-shear-deg", "3", "--json", "--svg", svg, "--nodes", nodes,
                           NULL };

    run_cli (args, &out, &err, &status);
  }
  g_assert_cmpint (status, ==, 0);
  g_assert_true (json_parser_load_from_data (parser, out, -1, NULL));
  o = json_node_get_object (json_parser_get_root (parser));
  {
    const char *keys[] = { "max_shear_deg", "max_shear_at", "cells", "cells_over_limit",
                           "flat_area", "enclosed_curvature_rad",
                           "cell_closure_max_residual_rad", "caution" };

    for (gsize k = 0; k < G_N_ELEMENTS (keys); k++)
      g_assert_true (json_object_has_member (o, keys[k]));
  }
  g_assert_cmpuint (json_array_get_length (json_object_get_array_member (o, "max_shear_at")), ==,
                    2);
  g_assert_cmpint (json_object_get_int_member (o, "cells"), >, 100);
  g_assert_cmpint (json_object_get_int_member (o, "cells_over_limit"), >, 0);
  g_assert_cmpint (json_object_get_int_member (o, "cells_over_limit"), <,
                   json_object_get_int_member (o, "cells"));
  g_assert_cmpfloat (fabs (json_object_get_double_member (o, "max_shear_deg")), >, 3);
  g_assert_cmpfloat (json_object_get_double_member (o, "flat_area"), >, 0);
  g_assert_cmpfloat (json_object_get_double_member (o, "cell_closure_max_residual_rad"), <,
                     1e-8);
  /* Whole cells cover less than the ply; their curvature is their area / R^2 on a sphere. */
  g_assert_cmpfloat (json_object_get_double_member (o, "enclosed_curvature_rad"), >, 0);
  g_assert_cmpfloat (json_object_get_double_member (o, "enclosed_curvature_rad"), <,
                     json_object_get_double_member (o, "flat_area") / 1e4 * 1.2);
  g_assert_nonnull (strstr (json_object_get_string_member (o, "caution"), "kinematic drape"));
  g_assert_true (g_file_get_contents (svg, &text, NULL, NULL));
  g_assert_nonnull (strstr (text, "mm\" height=\""));
  g_clear_pointer (&text, g_free);
  g_assert_true (g_file_get_contents (nodes, &text, NULL, NULL));
  g_assert_true (g_str_has_prefix (text, "i,j,u,v,x,y,z,inside,shear_deg"));
  g_clear_pointer (&out, g_free);
  g_clear_pointer (&err, g_free);

  {
    const char *args[] = { "drape", "--preset", "sphere", "--loop", loop, "--start",
                           "1.57,0", "--warp-deg", "0", "--cell", "-1", NULL };

    run_cli (args, &out, &err, &status);
    g_assert_cmpint (status, ==, 2);
    g_assert_nonnull (strstr (err, "--cell"));
    g_clear_pointer (&out, g_free);
    g_clear_pointer (&err, g_free);
  }
  g_assert_true (g_file_set_contents (proj, "[limits]\nmax-shear-deg=lots\n", -1, NULL));
  {
    const char *args[] = { "drape", "--preset", "sphere", "--loop", loop, "--start",
                           "1.57,0", "--warp-deg", "0", "--cell", "4", "--project", proj,
                           NULL };

    run_cli (args, &out, &err, &status);
    g_assert_cmpint (status, ==, 2);
    g_assert_nonnull (strstr (err, "[limits] max-shear-deg"));
    g_clear_pointer (&out, g_free);
    g_clear_pointer (&err, g_free);
  }
  {
    const char *args[] = { "drape", "--preset", "sphere", "--loop", loop, "--start",
                           "0.5,0", "--warp-deg", "0", "--cell", "4", NULL };

    run_cli (args, &out, &err, &status);
    g_assert_cmpint (status, ==, 2);
    g_assert_nonnull (strstr (err, "outside the ply outline"));
    g_clear_pointer (&out, g_free);
    g_clear_pointer (&err, g_free);
  }
  {
    /* A cell so small the net could not be stored is refused, not attempted. */
    const char *args[] = { "drape", "--preset", "sphere", "--loop", loop, "--start",
                           "1.57,0", "--warp-deg", "0", "--cell", "1e-4", NULL };

    run_cli (args, &out, &err, &status);
    g_assert_cmpint (status, ==, 2);
    g_assert_nonnull (strstr (err, "cells across"));
  }
  g_remove (loop);
  g_remove (svg);
  g_remove (nodes);
  g_remove (proj);
  g_rmdir (dir);
}

/* `drape --boundary` writes the whole cells' boundary as a loop that `measure` reads; on a
 * sphere the enclosed curvature `measure` gives for it (Green's theorem) equals the drape's
 * enclosed_curvature_rad (the sum of the whole cells' angle excess) to 1e-6 rad: Gauss-Bonnet
 * (do Carmo, Differential Geometry of Curves and Surfaces, sec. 4-5, from memory). */
static void
test_cli_boundary (void)
{
  g_autofree char *dir = g_dir_make_tmp ("drape-XXXXXX", NULL);
  g_autofree char *loop = g_build_filename (dir, "ply.csv", NULL);
  g_autofree char *bnd = g_build_filename (dir, "boundary.csv", NULL);
  g_autoptr (GString) csv = g_string_new ("u,v\n");
  g_autoptr (JsonParser) parser = json_parser_new ();
  g_autoptr (JsonParser) parser2 = json_parser_new ();
  g_autofree char *out = NULL, *err = NULL, *out2 = NULL, *err2 = NULL;
  JsonObject *o, *b, *m;
  double drape_k, measured_k;
  int status;

  /* An ellipse, off the equator, on a sphere of radius 100 mm. */
  for (int k = 0; k < 30; k++)
    {
      double a = 2 * G_PI * k / 30;

      g_string_append_printf (csv, "%.12f,%.12f\n", 1.2 + 0.5 * cos (a), 0.35 * sin (a));
    }
  g_assert_true (g_file_set_contents (loop, csv->str, -1, NULL));
  {
    const char *args[] = { "drape", "--preset", "sphere", "--param", "R=100", "--loop", loop,
                           "--start", "1.25,0.05", "--warp-deg", "25", "--cell", "4", "--json",
                           "--boundary", bnd, NULL };

    run_cli (args, &out, &err, &status);
  }
  g_assert_cmpint (status, ==, 0);
  g_assert_true (json_parser_load_from_data (parser, out, -1, NULL));
  o = json_node_get_object (json_parser_get_root (parser));
  b = json_object_get_object_member (o, "boundary");
  g_assert_nonnull (b);
  g_assert_true (json_object_get_boolean_member (b, "all_whole_cells"));
  g_assert_cmpint (json_object_get_int_member (b, "pieces"), ==, 1);
  g_assert_cmpint (json_object_get_int_member (b, "cells"), >, 200);
  drape_k = json_object_get_double_member (o, "enclosed_curvature_rad");
  g_assert_cmpfloat (drape_k, >, 0.1);
  {
    const char *args[] = { "measure", "--preset", "sphere", "--param", "R=100", "--loop", bnd,
                           "--json", NULL };

    run_cli (args, &out2, &err2, &status);
  }
  g_assert_cmpint (status, ==, 0);
  g_assert_true (json_parser_load_from_data (parser2, out2, -1, NULL));
  m = json_node_get_object (json_parser_get_root (parser2));
  if (json_object_has_member (m, "loops"))
    m = json_array_get_object_element (json_object_get_array_member (m, "loops"), 0);
  measured_k = json_object_get_double_member (m, "enclosed_curvature_rad");
  g_test_message ("drape %.15g, measure %.15g", drape_k, measured_k);
  df_assert_close (measured_k, drape_k, 0, 1e-6);
  g_clear_pointer (&out, g_free);
  g_clear_pointer (&err, g_free);
  {
    /* Cells larger than the ply: no whole cell, so no loop; said naming the file. */
    const char *args[] = { "drape", "--preset", "sphere", "--param", "R=100", "--loop", loop,
                           "--start", "1.25,0.05", "--warp-deg", "25", "--cell", "60",
                           "--boundary", bnd, NULL };

    g_remove (bnd);
    run_cli (args, &out, &err, &status);
    g_assert_cmpint (status, ==, 1);
    g_assert_nonnull (strstr (err, "boundary.csv: the drape has no whole cell"));
    g_assert_false (g_file_test (bnd, G_FILE_TEST_EXISTS));
  }
  g_remove (loop);
  g_rmdir (dir);
}

/* drape --units cm with a 0.4 cm cell is the 4 mm drape shown in cm (1 cm = 10 mm, by
 * definition): the same net (cells, enclosed curvature bit for bit), the flat area a hundredth
 * and the flat size and cell a tenth of the figures in mm. */
static void
test_cli_units (void)
{
  g_autofree char *dir = g_dir_make_tmp ("drape-XXXXXX", NULL);
  g_autofree char *loop = g_build_filename (dir, "ply.csv", NULL);
  g_autoptr (GString) csv = g_string_new ("u,v\n");
  g_autoptr (JsonParser) p_mm = json_parser_new ();
  g_autoptr (JsonParser) p_cm = json_parser_new ();
  g_autofree char *out_mm = NULL, *err_mm = NULL, *out_cm = NULL, *err_cm = NULL;
  JsonObject *mm, *cm;
  JsonArray *size_mm, *size_cm;
  int status;

  for (int k = 0; k < 30; k++)
    {
      double a = 2 * G_PI * k / 30;

      g_string_append_printf (csv, "%.12f,%.12f\n", 1.2 + 0.5 * cos (a), 0.35 * sin (a));
    }
  g_assert_true (g_file_set_contents (loop, csv->str, -1, NULL));
  {
    const char *args[] = { "drape", "--preset", "sphere", "--param", "R=100", "--loop", loop,
                           "--start", "1.25,0.05", "--warp-deg", "25", "--cell", "4", "--json",
                           NULL };

    run_cli (args, &out_mm, &err_mm, &status);
    g_assert_cmpint (status, ==, 0);
  }
  {
    const char *args[] = { "drape", "--preset", "sphere", "--param", "R=100", "--loop", loop,
                           "--start", "1.25,0.05", "--warp-deg", "25", "--cell", "0.4",
                           "--units", "cm", "--json", NULL };

    run_cli (args, &out_cm, &err_cm, &status);
    g_assert_cmpint (status, ==, 0);
  }
  g_assert_true (json_parser_load_from_data (p_mm, out_mm, -1, NULL));
  g_assert_true (json_parser_load_from_data (p_cm, out_cm, -1, NULL));
  mm = json_node_get_object (json_parser_get_root (p_mm));
  cm = json_node_get_object (json_parser_get_root (p_cm));
  g_assert_cmpstr (json_object_get_string_member (cm, "units"), ==, "cm");
  g_assert_cmpint (json_object_get_int_member (cm, "cells"), ==,
                   json_object_get_int_member (mm, "cells"));
  df_assert_close (json_object_get_double_member (cm, "enclosed_curvature_rad"),
                   json_object_get_double_member (mm, "enclosed_curvature_rad"), 0, 1e-14);
  df_assert_close (json_object_get_double_member (cm, "flat_area"),
                   json_object_get_double_member (mm, "flat_area") / 100, 1e-12, 0);
  df_assert_close (json_object_get_double_member (cm, "cell"), 0.4, 1e-14, 0);
  size_mm = json_object_get_array_member (mm, "flat_size");
  size_cm = json_object_get_array_member (cm, "flat_size");
  for (guint k = 0; k < 2; k++)
    df_assert_close (json_array_get_double_element (size_cm, k),
                     json_array_get_double_element (size_mm, k) / 10, 1e-12, 0);
  g_remove (loop);
  g_rmdir (dir);
}

int
main (int argc, char **argv)
{
  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);
  g_test_add_func ("/core/drape/plane", test_plane);
  g_test_add_func ("/core/drape/cylinder", test_cylinder);
  g_test_add_func ("/core/drape/sphere-closure", test_sphere_closure);
  g_test_add_func ("/core/drape/sphere-two-pass", test_sphere_two_pass);
  g_test_add_func ("/core/drape/sphere-symmetry", test_sphere_symmetry);
  g_test_add_func ("/core/drape/sphere-convergence", test_sphere_convergence);
  g_test_add_func ("/core/drape/sphere-hazzidakis", test_sphere_hazzidakis);
  g_test_add_func ("/core/drape/sphere-block-measure", test_sphere_block_measure);
  g_test_add_func ("/core/drape/sphere-boundary-loop", test_sphere_boundary_loop);
  g_test_add_func ("/core/drape/cli", test_cli);
  g_test_add_func ("/core/drape/cli-boundary", test_cli_boundary);
  g_test_add_func ("/core/drape/cli-units", test_cli_units);
  return g_test_run ();
}
