/* bench-report.c: benchmark of `driftframe-cli report` at workshop scale: writes a project of
 * 2000 loops (40-point ellipses in (t, phi) spread over the demo's lamp-shade mould) and prints
 * the median time of the whole report process, which measures the loops on two threads.
 * Usage: bench-report [REPEATS [KEEP.dfproj]]: with a second argument the project is also
 * written there, for profiling the report by hand. */
#include <glib.h>
#include <glib/gstdio.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "df-glib.h"

#define N_LOOPS  2000
#define N_POINTS 40

static int
compare_double (const void *a, const void *b)
{
  double x = *(const double *) a, y = *(const double *) b;

  return (x > y) - (x < y);
}

static void
append_list (GString *s, const char *key, const double *v, int n)
{
  g_string_append_printf (s, "%s=", key);
  for (int i = 0; i < n; i++)
    {
      char b[G_ASCII_DTOSTR_BUF_SIZE];

      g_string_append_printf (s, "%s%s", i ? ";" : "", g_ascii_dtostr (b, sizeof b, v[i]));
    }
  g_string_append_c (s, '\n');
}

static char *
make_project (void)
{
  GString *s = g_string_new ("# bench-report: 2000 plies on the lamp-shade mould\n"
                             "[surface]\nkind=revolution\n"
                             "r=rt + (rb - rt)*t/h + bulge*sin(pi*t/h)\nz=h - t\n"
                             "t-min=0\nt-max=h\nunits=mm\n\n"
                             "[parameters]\nrt=60\nrb=110\nbulge=15\nh=180\n");

  for (int k = 0; k < N_LOOPS; k++)
    {
      /* Centres spread over the mould by a low-discrepancy walk, sizes varied. */
      double tc = 40 + 100 * fmod (k * 0.6180339887, 1.0);
      double pc = -G_PI + 2 * G_PI * fmod (k * 0.4142135624, 1.0);
      double a = 10 + 15 * fmod (k * 0.7548776662, 1.0), b = 0.15 + 0.3 * fmod (k * 0.5698, 1.0);
      double u[N_POINTS], v[N_POINTS];

      for (int i = 0; i < N_POINTS; i++)
        {
          double th = 2 * G_PI * i / N_POINTS;

          u[i] = tc + a * cos (th);
          v[i] = pc + b * sin (th);
        }
      g_string_append_printf (s, "\n[loop %d]\nname=Ply %d\ncolour=#3b7dd0\nframes=false\n",
                              k + 1, k + 1);
      append_list (s, "u", u, N_POINTS);
      append_list (s, "v", v, N_POINTS);
    }
  return g_string_free (s, FALSE);
}

int
main (int argc, char **argv)
{
  int repeats = argc > 1 ? atoi (argv[1]) : 5;
  g_autoptr (GError) error = NULL;
  g_autofree char *dir = g_dir_make_tmp ("driftframe-bench-XXXXXX", &error);
  g_autofree char *path = NULL, *text = NULL;
  double *times;

  df_core_init ();
  if (repeats < 1)
    repeats = 1;
  if (dir == NULL)
    g_error ("%s", error->message);
  if (!g_file_test (DF_CLI_PATH, G_FILE_TEST_IS_EXECUTABLE))
    g_error ("%s is not built", DF_CLI_PATH);
  path = g_build_filename (dir, "plies.dfproj", NULL);
  text = make_project ();
  if (!df_write_file_atomic (path, text, -1, &error))
    g_error ("%s", error->message);

  if (argc > 2 && !df_write_file_atomic (argv[2], text, -1, &error))
    g_error ("%s", error->message);
  times = g_new (double, repeats);
  for (int k = 0; k < repeats; k++)
    {
      const char *args[] = { DF_CLI_PATH, "report", "--project", path, "--json", NULL };
      gint64 t0 = g_get_monotonic_time ();
      int status = 0;

      if (!g_spawn_sync (NULL, (char **) args, NULL, G_SPAWN_STDOUT_TO_DEV_NULL, NULL, NULL,
                         NULL, NULL, &status, &error))
        g_error ("%s", error->message);
      if (!g_spawn_check_wait_status (status, &error))
        g_error ("driftframe-cli report: %s", error->message);
      times[k] = (g_get_monotonic_time () - t0) / 1000.0;
    }
  qsort (times, repeats, sizeof *times, compare_double);
  printf ("project: %d loops of %d points on the lamp-shade mould (%.1f MB)\n", N_LOOPS,
          N_POINTS, strlen (text) / 1e6);
  printf ("whole `driftframe-cli report --json` process: median %.0f ms, best %.0f ms, over %d "
          "runs\n", times[repeats / 2], times[0], repeats);
  g_unlink (path);
  g_rmdir (dir);
  g_free (times);
  return 0;
}
