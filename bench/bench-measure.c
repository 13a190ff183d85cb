/* bench-measure.c: benchmark of the main job: measure a 10 000-point smooth loop on
 * z = 0.3 sin(1.3x) cos(0.7y) + 0.1xy at the default tolerance. Prints the median time per
 * loop (reading the CSV included), the ODE right-hand-side evaluations and the holonomy, then
 * the median time of the same measurement as a whole `driftframe-cli measure` process.
 * Then the x,y,z case: the shared bench loop (../shared/bench/bench_loop.csv beside the
 * repository, 10 000 space points placed on the surface) in process and as a whole CLI process,
 * beside the SymPy + SciPy reference script timed in the same run, and the ratio; and 10^6
 * x,y,z rows resampled from the same loop (written to a temporary file, never committed).
 * Usage: bench-measure [REPEATS]. */
#include <malloc.h>
#include <glib.h>
#include <glib/gstdio.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>

#include "df-glib.h"
#include "bench-xyz.h"

#define N_POINTS 10000

static int
compare_double (const void *a, const void *b)
{
  double x = *(const double *) a, y = *(const double *) b;

  return (x > y) - (x < y);
}

static double
median (double *v, int n)
{
  qsort (v, n, sizeof *v, compare_double);
  return n % 2 ? v[n / 2] : 0.5 * (v[n / 2 - 1] + v[n / 2]);
}

/* A smooth, wavy loop well inside the domain, as (u, v) = (x, y). */
static char *
make_loop_csv (void)
{
  GString *s = g_string_new ("u,v\n");

  for (int i = 0; i < N_POINTS; i++)
    {
      double th = 2 * G_PI * i / N_POINTS;
      double rad = 2.0 + 0.35 * sin (3 * th) + 0.15 * cos (5 * th);
      char bx[G_ASCII_DTOSTR_BUF_SIZE], by[G_ASCII_DTOSTR_BUF_SIZE];

      g_string_append_printf (s, "%s,%s\n", g_ascii_dtostr (bx, sizeof bx, 0.3 + rad * cos (th)),
                              g_ascii_dtostr (by, sizeof by, -0.2 + 0.8 * rad * sin (th)));
    }
  return g_string_free (s, FALSE);
}

int
main (int argc, char **argv)
{
  int repeats = argc > 1 ? atoi (argv[1]) : 15;
  g_autoptr (GError) error = NULL;
  g_autofree char *dir = g_dir_make_tmp ("driftframe-bench-XXXXXX", &error);
  g_autofree char *loop_path = NULL, *surface_path = NULL, *csv = NULL;
  g_autoptr (df_surface_spec) spec = NULL;
  g_autoptr (df_surface) surface = NULL;
  double *times, *cpu;
  double holonomy = 0, residual = 0;
  size_t evals = 0;

  /* Keep freed blocks in the process: glibc returns large ones to the system at each free, and
   * a fresh page costs more here than the work done on it (a loop of 10 000 points allocates a
   * few megabytes per measurement). */
  mallopt (M_MMAP_THRESHOLD, 64 << 20);
  mallopt (M_TRIM_THRESHOLD, 128 << 20);
  df_core_init ();
  if (repeats < 1)
    repeats = 1;
  if (dir == NULL)
    g_error ("%s", error->message);
  loop_path = g_build_filename (dir, "wavy-loop.csv", NULL);
  surface_path = g_build_filename (dir, "wavy.surface", NULL);
  csv = make_loop_csv ();
  if (!df_write_file_atomic (loop_path, csv, -1, &error))
    g_error ("%s", error->message);
  spec = df_surface_spec_new_graph ("0.3*sin(1.3*x)*cos(0.7*y) + 0.1*x*y", "-4", "4", "-4", "4");
  if (!df_surface_spec_save (spec, surface_path, &error))
    g_error ("%s", error->message);
  surface = df_surface_spec_build (spec, &error);
  if (surface == NULL)
    g_error ("%s", error->message);

  times = g_new (double, repeats);
  cpu = g_new (double, repeats);
  for (int k = 0; k < repeats; k++)
    {
      gint64 t0 = g_get_monotonic_time ();
      struct timespec c0, c1;
      g_autofree double (*uv)[2] = NULL;
      gsize n = 0;
      g_autoptr (df_curve) curve = NULL;
      g_auto (df_loop_result) r = { 0 };
      df_diag diag;
      df_status st;

      clock_gettime (CLOCK_PROCESS_CPUTIME_ID, &c0);
      if (!df_loop_csv_read (loop_path, surface, &uv, &n, &error))
        g_error ("%s", error->message);
      st = df_curve_new_through_points (surface, (const double (*)[2]) uv, n, true, &curve, &diag);
      if (st == DF_OK)
        st = df_loop_measure (curve, NULL, &r, &diag);
      if (st != DF_OK)
        g_error ("%s: %s", df_status_describe (st), diag.detail);
      times[k] = (g_get_monotonic_time () - t0) / 1000.0;
      clock_gettime (CLOCK_PROCESS_CPUTIME_ID, &c1);
      cpu[k] = (c1.tv_sec - c0.tv_sec) * 1e3 + (c1.tv_nsec - c0.tv_nsec) / 1e6;
      holonomy = r.holonomy_rad;
      residual = r.residual_rad;
      evals = r.rhs_evals;
    }
  printf ("loop: %d points on z = 0.3 sin(1.3x) cos(0.7y) + 0.1xy, default tolerance\n", N_POINTS);
  printf ("in-process measure (read CSV + spline + transport + Green + samples): median %.2f ms "
          "wall, %.2f ms CPU, over %d runs\n", median (times, repeats), median (cpu, repeats),
          repeats);
  printf ("transport ODE right-hand-side evaluations: %zu\n", evals);
  printf ("holonomy: %.12f rad (%.9f deg); Gauss-Bonnet residual %.2e rad\n", holonomy,
          holonomy * 180 / G_PI, residual);

  if (g_file_test (DF_CLI_PATH, G_FILE_TEST_IS_EXECUTABLE))
    {
      for (int k = 0; k < repeats; k++)
        {
          const char *args[] = { DF_CLI_PATH, "measure", "--surface", surface_path, "--loop",
                                 loop_path, "--json", NULL };
          gint64 t0 = g_get_monotonic_time ();
          int status = 0;

          if (!g_spawn_sync (NULL, (char **) args, NULL, G_SPAWN_STDOUT_TO_DEV_NULL, NULL, NULL,
                             NULL, NULL, &status, &error))
            g_error ("%s", error->message);
          if (!g_spawn_check_wait_status (status, &error))
            g_error ("driftframe-cli: %s", error->message);
          times[k] = (g_get_monotonic_time () - t0) / 1000.0;
        }
      printf ("whole `driftframe-cli measure --json` process: median %.2f ms over %d runs\n",
              median (times, repeats), repeats);
    }
  bench_xyz_run (repeats, dir);
  g_unlink (loop_path);
  g_unlink (surface_path);
  g_rmdir (dir);
  g_free (times);
  g_free (cpu);
  return 0;
}
