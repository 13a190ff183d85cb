/* bench-xyz.c: the x,y,z case of bench-measure. The shared bench loop (10 000 space points on
 * z = 0.3 sin(1.3x) cos(0.7y) + 0.1xy, ../shared/bench beside the repository; generated here by
 * the same formula when that folder is missing) is read, placed on the surface by continuation
 * and measured: in process, as a whole `driftframe-cli measure` process, and by the SymPy +
 * SciPy reference script in the same run, so the ratio holds while machine speed drifts. Then
 * 10^6 x,y,z rows resampled from the same loop. */
#include "bench-xyz.h"

#include <glib.h>
#include <glib/gstdio.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/resource.h>

#include "df-glib.h"

#define EXPR "0.3*sin(1.3*x)*cos(0.7*y)+0.1*x*y"
#define BIG_ROWS 1000000

static int
compare_double (const void *a, const void *b)
{
  double x = *(const double *) a, y = *(const double *) b;

  return (x > y) - (x < y);
}

static double
median_of (double *v, int n)
{
  qsort (v, n, sizeof *v, compare_double);
  return n % 2 ? v[n / 2] : 0.5 * (v[n / 2 - 1] + v[n / 2]);
}

/* The bench loop of ../shared/bench/make_bench_loop.py: x = 0.1 + rho cos th,
 * y = -0.2 + rho sin th, rho = 1.3 + 0.25 cos 3th + 0.1 sin 5th, z = f(x, y), n points. */
static char *
make_xyz_csv (const df_surface *surface, long n)
{
  GString *s = g_string_sized_new ((gsize) n * 64);

  g_string_append (s, "x,y,z\n");
  for (long i = 0; i < n; i++)
    {
      double th = 2 * G_PI * (double) i / (double) n;
      double rho = 1.3 + 0.25 * cos (3 * th) + 0.1 * sin (5 * th);
      double x = 0.1 + rho * cos (th), y = -0.2 + rho * sin (th);
      char b[3][G_ASCII_DTOSTR_BUF_SIZE];
      df_chart_jet j;

      if (df_surface_eval (surface, x, y, 0, &j, NULL) != DF_OK)
        g_error ("bench loop point %ld is off the surface", i);
      g_string_append_printf (s, "%s,%s,%s\n", g_ascii_dtostr (b[0], sizeof b[0], x),
                              g_ascii_dtostr (b[1], sizeof b[1], y),
                              g_ascii_dtostr (b[2], sizeof b[2], j.x[2]));
    }
  return g_string_free (s, FALSE);
}

/* Reads, places, fits and measures once; returns the wall time in ms. */
static double
measure_in_process (const char *loop_path, const df_surface *surface, double *holonomy,
                    size_t *searched)
{
  gint64 t0 = g_get_monotonic_time ();
  g_autoptr (GError) error = NULL;
  g_autofree double (*uv)[2] = NULL;
  g_autoptr (df_curve) curve = NULL;
  g_auto (df_loop_result) r = { 0 };
  gsize n = 0;
  df_diag diag;
  df_status st;

  if (!df_loop_csv_read (loop_path, surface, &uv, &n, &error))
    g_error ("%s", error->message);
  st = df_curve_new_through_points (surface, (const double (*)[2]) uv, n, true, &curve, &diag);
  if (st == DF_OK)
    st = df_loop_measure (curve, NULL, &r, &diag);
  if (st != DF_OK)
    g_error ("%s: %s", df_status_describe (st), diag.detail);
  *holonomy = r.holonomy_rad;
  if (searched != NULL)
    {
      /* The placement again, alone, to count how often the seed grid was needed. */
      g_autoptr (df_placer) pl = df_placer_new (surface);
      g_autofree char *text = NULL;

      *searched = 0;
      if (pl != NULL && g_file_get_contents (loop_path, &text, NULL, NULL))
        {
          char **lines = g_strsplit (text, "\n", -1);

          for (guint i = 1; lines[i] != NULL; i++)
            {
              double p[3], u, v, d;

              if (sscanf (lines[i], "%lf,%lf,%lf", &p[0], &p[1], &p[2]) == 3)
                df_placer_place (pl, p, 0.0, &u, &v, &d, NULL);
            }
          g_strfreev (lines);
          df_placer_get_counts (pl, NULL, searched);
        }
    }
  return (g_get_monotonic_time () - t0) / 1000.0;
}

static double
children_cpu_ms (void)
{
  struct rusage ru;

  getrusage (RUSAGE_CHILDREN, &ru);
  return (ru.ru_utime.tv_sec + ru.ru_stime.tv_sec) * 1e3
         + (ru.ru_utime.tv_usec + ru.ru_stime.tv_usec) / 1e3;
}

/* Runs argv once; returns the wall time in ms, or -1 when it could not run or failed; *cpu
 * (may be NULL) gets its CPU time (user + system), which other load on a shared machine
 * disturbs less than the wall time. out (may be NULL) receives stdout. */
static double
time_process (const char *const *argv, char **out, double *cpu)
{
  g_autoptr (GError) error = NULL;
  gint64 t0 = g_get_monotonic_time ();
  double c0 = children_cpu_ms ();
  int status = 0;

  if (!g_spawn_sync (NULL, (char **) argv, NULL,
                     out ? G_SPAWN_DEFAULT : G_SPAWN_STDOUT_TO_DEV_NULL, NULL, NULL, out,
                     NULL, &status, &error))
    return -1;
  if (!g_spawn_check_wait_status (status, NULL))
    return -1;
  if (cpu != NULL)
    *cpu = children_cpu_ms () - c0;
  return (g_get_monotonic_time () - t0) / 1000.0;
}

static double
json_number (const char *json, const char *key)
{
  g_autofree char *pat = g_strdup_printf ("\"%s\"", key);
  const char *p = json ? strstr (json, pat) : NULL;

  if (p == NULL || (p = strchr (p + strlen (pat), ':')) == NULL)
    return NAN;
  return g_ascii_strtod (p + 1, NULL);
}

void
bench_xyz_run (int repeats, const char *tmp_dir)
{
  g_autoptr (GError) error = NULL;
  g_autofree char *shared_loop = g_build_filename (DF_SHARED_BENCH_DIR, "bench_loop.csv", NULL);
  g_autofree char *script = g_build_filename (DF_SHARED_BENCH_DIR, "reference_holonomy.py",
                                              NULL);
  g_autofree char *surface_path = g_build_filename (tmp_dir, "wavy-xyz.surface", NULL);
  g_autofree char *gen_loop = g_build_filename (tmp_dir, "bench-loop-xyz.csv", NULL);
  g_autofree char *big_loop = g_build_filename (tmp_dir, "bench-loop-1e6.csv", NULL);
  g_autofree char *ref_out = NULL;
  g_autoptr (df_surface_spec) spec = NULL;
  g_autoptr (df_surface) surface = NULL;
  const char *loop_path = shared_loop;
  double *t = g_new (double, repeats), *c = g_new (double, repeats);
  double hol = NAN, cli_ms = NAN, ref_ms = NAN, cli_cpu = NAN, ref_cpu = NAN;
  size_t searched = 0;
  int ref_runs = repeats < 3 ? repeats : 3;
  gboolean have_ref = FALSE;

  /* The surface of ../shared/bench/wavy.surface. */
  spec = df_surface_spec_new_graph (EXPR, "-2", "2", "-2", "2");
  if (!df_surface_spec_save (spec, surface_path, &error))
    g_error ("%s", error->message);
  surface = df_surface_spec_build (spec, &error);
  if (surface == NULL)
    g_error ("%s", error->message);
  if (!g_file_test (shared_loop, G_FILE_TEST_IS_REGULAR))
    {
      g_autofree char *csv = make_xyz_csv (surface, 10000);

      printf ("\n%s not found: the same loop generated here\n", shared_loop);
      if (!df_write_file_atomic (gen_loop, csv, -1, &error))
        g_error ("%s", error->message);
      loop_path = gen_loop;
    }

  printf ("\nx,y,z loop: %s (10 000 space points placed on the surface by continuation)\n",
          loop_path);
  for (int k = 0; k < repeats; k++)
    t[k] = measure_in_process (loop_path, surface, &hol, k == 0 ? &searched : NULL);
  /* The first run also counted the searches; the median is over all runs. */
  printf ("in-process measure (read CSV + place + spline + transport + Green): median %.2f ms "
          "over %d runs; %zu point%s searched from the seed grid\n", median_of (t, repeats),
          repeats, searched, searched == 1 ? "" : "s");
  printf ("holonomy: %.12f rad (%.9f deg)\n", hol, hol * 180 / G_PI);

  if (g_file_test (DF_CLI_PATH, G_FILE_TEST_IS_EXECUTABLE))
    {
      const char *args[] = { DF_CLI_PATH, "measure", "--surface", surface_path, "--loop",
                             loop_path, "--json", NULL };
      int ok = 0;

      for (int k = 0; k < repeats; k++)
        if ((t[ok] = time_process (args, NULL, &c[ok])) >= 0)
          ok++;
      if (ok > 0)
        {
          cli_ms = median_of (t, ok);
          cli_cpu = median_of (c, ok);
          printf ("whole `driftframe-cli measure --json` process (x,y,z): median %.2f ms wall, "
                  "%.2f ms CPU over %d runs\n", cli_ms, cli_cpu, ok);
        }
    }

  {
    const char *probe[] = { "/usr/bin/python3", "-c", "import numpy, scipy, sympy", NULL };

    have_ref = g_file_test (script, G_FILE_TEST_IS_REGULAR)
               && time_process (probe, NULL, NULL) >= 0;
  }
  if (have_ref)
    {
      const char *args[] = { "/usr/bin/python3", script, "--expr", EXPR, "--loop", loop_path,
                             "--json", NULL };
      int ok = 0;

      for (int k = 0; k < ref_runs; k++)
        {
          g_clear_pointer (&ref_out, g_free);
          if ((t[ok] = time_process (args, &ref_out, &c[ok])) >= 0)
            ok++;
        }
      if (ok > 0)
        {
          ref_ms = median_of (t, ok);
          ref_cpu = median_of (c, ok);
          printf ("reference script (SymPy + SciPy DOP853, rtol 1e-10), same run: median %.0f ms "
                  "wall, %.0f ms CPU over %d runs; its holonomy %.12f rad (ours differs by "
                  "%.1e)\n", ref_ms, ref_cpu, ok, json_number (ref_out, "holonomy_rad"),
                  hol - json_number (ref_out, "holonomy_rad"));
        }
      else
        printf ("reference script: failed to run\n");
    }
  else
    printf ("reference script: skipped (needs %s and /usr/bin/python3 with numpy, scipy and "
            "sympy)\n", script);
  if (isfinite (cli_ms) && isfinite (ref_ms))
    printf ("ratio: the CLI process takes %.2f %% of the reference script's wall time, %.2f %% "
            "of its CPU time (target <= 1 %%)\n", 100.0 * cli_ms / ref_ms,
            100.0 * cli_cpu / ref_cpu);
  else
    printf ("ratio: skipped\n");

  /* 10^6 rows: the same loop resampled. */
  {
    g_autofree char *csv = make_xyz_csv (surface, BIG_ROWS);
    const char *args[] = { DF_CLI_PATH, "measure", "--surface", surface_path, "--loop",
                           big_loop, "--json", NULL };
    int runs = repeats < 3 ? repeats : 3, ok = 0;
    double in_ms;

    if (!df_write_file_atomic (big_loop, csv, -1, &error))
      g_error ("%s", error->message);
    in_ms = measure_in_process (big_loop, surface, &hol, NULL);
    printf ("\n10^6 x,y,z rows (the loop resampled): in process %.0f ms, holonomy %.12f rad\n",
            in_ms, hol);
    if (g_file_test (DF_CLI_PATH, G_FILE_TEST_IS_EXECUTABLE))
      {
        for (int k = 0; k < runs; k++)
          if ((t[ok] = time_process (args, NULL, &c[ok])) >= 0)
            ok++;
        if (ok > 0)
          printf ("whole CLI process on 10^6 rows: median %.0f ms wall, %.0f ms CPU over %d runs "
                  "(target <= 3000 ms)\n", median_of (t, ok), median_of (c, ok), ok);
      }
    g_unlink (big_loop);
  }
  g_unlink (gen_loop);
  g_unlink (surface_path);
  g_free (t);
  g_free (c);
}
