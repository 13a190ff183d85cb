/* bench-fit.c: figures for surfaces from data (prints them; not a test): fitting a
 * 1000 x 1000 height grid (time and peak memory of the process), a 10 000-point loop measured
 * on the fitted graph, the display mesh of the fitted graph, and a 2000-point profile fit.
 * Usage: bench-fit [GRID_SIDE] (default 1000). Wall times are medians of a few runs; on a
 * shared machine compare within one run.
 * bench-fit --mesh [TRIANGLES] (default 1 000 000): writes a binary STL of a smooth panel with
 * that many triangles (as a CAD export would), then reads and fits it through the surface file
 * (assimp, fold checks, scattered fit with GCV) and prints the time and peak memory; run it in
 * its own process so the peak is the mesh's alone. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <sys/resource.h>
#include <glib/gstdio.h>

#include "df-glib.h"
#include "df-mesh.h"
#include "df-surface-spec.h"

static double
now (void)
{
  return (double) g_get_monotonic_time () / 1e6;
}

static long
peak_rss_mb (void)
{
  struct rusage ru;

  getrusage (RUSAGE_SELF, &ru);
  return ru.ru_maxrss / 1024;
}

/* A panel z = 40 sin(x/90) cos(y/70) mm over a side x side grid of quads, two triangles
 * each, as binary STL (float32 corners, little-endian; the layout from memory). */
static int
bench_mesh (long triangles)
{
  int side = (int) ceil (sqrt (triangles / 2.0));
  g_autofree char *dir = g_dir_make_tmp ("bench-mesh-XXXXXX", NULL);
  g_autofree char *stl = g_build_filename (dir, "panel.stl", NULL);
  g_autofree char *surf = g_build_filename (dir, "panel.surface", NULL);
  guint32 count = (guint32) (2L * side * side);
  FILE *f = fopen (stl, "wb");
  char header[80] = "bench panel";
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface_spec) spec = NULL;
  g_autoptr (df_surface) s = NULL;
  df_fit_info info;
  double t0;

  if (f == NULL)
    return 1;
  fwrite (header, 1, 80, f);
  count = GUINT32_TO_LE (count);
  fwrite (&count, 4, 1, f);
  for (int i = 0; i < side; i++)
    for (int j = 0; j < side; j++)
      {
        double x0 = i * 600.0 / side, x1 = (i + 1) * 600.0 / side;
        double y0 = j * 400.0 / side, y1 = (j + 1) * 400.0 / side;
        double q[4][2] = { { x0, y0 }, { x1, y0 }, { x1, y1 }, { x0, y1 } };
        static const int tri[2][3] = { { 0, 1, 2 }, { 0, 2, 3 } };

        for (int t = 0; t < 2; t++)
          {
            float rec[12] = { 0 };
            guint16 attr = 0;

            for (int c = 0; c < 3; c++)
              {
                const double *p = q[tri[t][c]];

                rec[3 + 3 * c] = (float) p[0];
                rec[4 + 3 * c] = (float) p[1];
                rec[5 + 3 * c] = (float) (40.0 * sin (p[0] / 90.0) * cos (p[1] / 70.0));
              }
            fwrite (rec, sizeof (float), 12, f);
            fwrite (&attr, 2, 1, f);
          }
      }
  fclose (f);
  g_file_set_contents (surf, "[surface]\nkind=graph\nmesh=panel.stl\n", -1, NULL);
  printf ("mesh: %u triangles, %d x %d quads, binary STL written\n", GUINT32_FROM_LE (count),
          side, side);
  t0 = now ();
  spec = df_surface_spec_load (surf, &error);
  if (spec != NULL)
    s = df_surface_spec_build (spec, &error);
  if (s == NULL)
    {
      fprintf (stderr, "mesh: %s\n", error->message);
      return 1;
    }
  df_fit_get_info (df_surface_get_fn (s), &info);
  printf ("mesh read (assimp) and fitted (GCV): %.3f s, %zu vertices, rms %.3g mm, max %.3g mm; "
          "peak memory %ld MB\n", now () - t0, info.points, info.rms, info.max, peak_rss_mb ());
  if (g_getenv ("BENCH_KEEP") == NULL)
    g_remove (stl);
  g_remove (surf);
  g_rmdir (dir);
  return 0;
}

int
main (int argc, char **argv)
{
  int m = argc > 1 ? atoi (argv[1]) : 1000;
  size_t n = (size_t) m * (size_t) m;
  double (*xyz)[3] = g_malloc (n * sizeof *xyz), t0, t1, dom[4];
  df_fn *fn = NULL;
  df_surface *s = NULL;
  df_fit_info info;
  df_diag diag;
  GRand *rand = g_rand_new_with_seed (7);

  df_core_init ();
  if (argc > 1 && g_str_equal (argv[1], "--mesh"))
    return bench_mesh (argc > 2 ? atol (argv[2]) : 1000000L);
  if (m < 16)
    return 2;
  for (int i = 0; i < m; i++)
    for (int j = 0; j < m; j++)
      {
        size_t k = (size_t) i * m + j;
        double x = i * 0.5, y = j * 0.5;

        xyz[k][0] = x;
        xyz[k][1] = y;
        xyz[k][2] = 0.3 * sin (0.013 * x) * cos (0.007 * y) * 100 + g_rand_double_range (rand, -0.01, 0.01);
      }
  printf ("peak memory before the fit: %ld MB (the %d x %d input itself: %.0f MB)\n",
          peak_rss_mb (), m, m, n * 24.0 / 1e6);
  t0 = now ();
  if (df_fit_grid ((const double (*)[3]) xyz, n, 0.01, &fn, &info, &diag) != DF_OK)
    {
      fprintf (stderr, "fit: %s\n", diag.detail);
      return 1;
    }
  t1 = now ();
  printf ("grid fit %d x %d at fit-tolerance 0.01: %.3f s, rms %.4g, max %.4g; peak memory "
          "%ld MB\n", m, m, t1 - t0, info.rms, info.max, peak_rss_mb ());
  t0 = now ();
  {
    df_fn *fn2 = NULL;

    df_fit_grid ((const double (*)[3]) xyz, n, DF_FIT_TOLERANCE_AUTO, &fn2, &info, &diag);
    printf ("grid fit %d x %d, tolerance chosen by GCV: %.3f s, rms %.4g\n", m, m, now () - t0,
            info.rms);
    df_fn_free (fn2);
  }
  g_free (xyz);
  df_fn_get_domain (fn, dom);
  if (df_surface_new_graph_fn (fn, dom[0], dom[1], dom[2], dom[3], &s, &diag) != DF_OK)
    {
      fprintf (stderr, "surface: %s\n", diag.detail);
      return 1;
    }
  {
    size_t np = 10000;
    double (*uv)[2] = g_malloc (np * sizeof *uv), best = INFINITY, hol = 0;

    for (size_t i = 0; i < np; i++)
      {
        double a = 2 * G_PI * i / np;

        double cx = 0.5 * (dom[0] + dom[1]), w = dom[1] - dom[0];

        uv[i][0] = cx + 0.24 * w * cos (a) + 0.02 * w * cos (5 * a);
        uv[i][1] = cx + 0.18 * w * sin (a);
      }
    for (int rep = 0; rep < 7; rep++)
      {
        df_curve *c = NULL;
        df_loop_result r = { 0 };

        t0 = now ();
        if (df_curve_new_through_points (s, (const double (*)[2]) uv, np, true, &c, &diag)
              != DF_OK
            || df_loop_measure (c, NULL, &r, &diag) != DF_OK)
          {
            fprintf (stderr, "loop: %s\n", diag.detail);
            return 1;
          }
        t1 = now ();
        best = fmin (best, t1 - t0);
        hol = r.holonomy_rad;
        df_loop_result_clear (&r);
        df_curve_free (c);
      }
    printf ("10 000-point loop on the fitted graph: %.1f ms (best of 7), holonomy %.9f rad\n",
            best * 1e3, hol);
    g_free (uv);
  }
  {
    df_mesh *mesh = NULL;

    t0 = now ();
    if (df_mesh_build (s, NULL, &mesh, &diag) != DF_OK)
      fprintf (stderr, "mesh: %s\n", diag.detail);
    else
      printf ("display mesh of the fitted graph: %.1f ms, %zu vertices\n", (now () - t0) * 1e3,
              df_mesh_n_vertices (mesh));
    df_mesh_free (mesh);
  }
  {
    size_t np = 2000;
    double (*rz)[2] = g_malloc (np * sizeof *rz);
    df_fn *p = NULL;

    for (size_t i = 0; i < np; i++)
      {
        double th = G_PI * i / (np - 1);

        rz[i][0] = i == 0 || i == np - 1 ? 0 : 100 * sin (th);
        rz[i][1] = 100 * cos (th);
      }
    t0 = now ();
    df_fit_profile ((const double (*)[2]) rz, np, DF_FIT_TOLERANCE_AUTO, &p, &info, &diag);
    printf ("profile fit, 2000 points, GCV: %.1f ms, rms %.3g\n", (now () - t0) * 1e3, info.rms);
    df_fn_free (p);
    g_free (rz);
  }
  printf ("peak memory at the end: %ld MB\n", peak_rss_mb ());
  df_surface_free (s);
  g_rand_free (rand);
  return 0;
}
