/* bench-drape.c: benchmark of the woven-ply drape (issue 12): a 300 mm x 300 mm ply (arc
 * lengths) centred on the equator of a sphere of radius 300 mm, 2 mm cells (150 x 150 =
 * 22 500 cells), warp at 0 deg and at 30 deg. Prints the median wall and CPU time of the net
 * alone (check_closure off, what a view redraws while the start point is dragged) and with
 * the closure check, the cell count and the worst closure residual.
 * Usage: bench-drape [REPEATS]. */
#include <glib.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>

#include "df-drape.h"
#include "df-glib.h"

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

static double
now (clockid_t clock)
{
  struct timespec ts;

  clock_gettime (clock, &ts);
  return ts.tv_sec + 1e-9 * ts.tv_nsec;
}

static void
run (const df_surface *surface, const double (*outline)[2], size_t n, double warp_deg,
     bool closure, int repeats)
{
  double *wall = g_new (double, repeats), *cpu = g_new (double, repeats);
  df_drape_options o;
  df_drape *d = NULL;

  df_drape_options_init (&o);
  o.cell = 2.0;
  o.warp_rad = warp_deg * G_PI / 180;
  o.check_closure = closure;
  for (int r = 0; r < repeats; r++)
    {
      double w0 = now (CLOCK_MONOTONIC), c0 = now (CLOCK_PROCESS_CPUTIME_ID);
      df_diag diag;
      df_status st;

      df_drape_free (d);
      d = NULL;
      st = df_drape_new (surface, outline, n, G_PI / 2, 0.0, &o, &d, &diag);
      if (st != DF_OK)
        {
          fprintf (stderr, "bench-drape: %s: %s\n", df_status_describe (st), diag.detail);
          exit (1);
        }
      wall[r] = now (CLOCK_MONOTONIC) - w0;
      cpu[r] = now (CLOCK_PROCESS_CPUTIME_ID) - c0;
    }
  {
    const df_drape_summary *s = df_drape_get_summary (d);

    printf ("warp %4.0f deg, closure check %-3s: %8.1f ms wall, %8.1f ms CPU (median of %d); "
            "%zu cells (%zu whole), %zu pins placed, %s x %d a segment, %.2f shots and %.1f right-hand sides a pin, max shear %.4f deg, closure residual "
            "%.2g rad, %zu outline points unmapped\n",
            warp_deg, closure ? "on" : "off", 1e3 * median (wall, repeats),
            1e3 * median (cpu, repeats), repeats, s->n_cells, s->n_whole_cells, s->n_nodes,
            s->stepper, s->substeps,
            (double) s->n_shots / s->n_nodes, (double) s->n_rhs / s->n_nodes,
            s->max_shear_rad * 180 / G_PI, s->closure_max_residual_rad, s->n_outline_unmapped);
  }
  df_drape_free (d);
  g_free (wall);
  g_free (cpu);
}

int
main (int argc, char **argv)
{
  int repeats = argc > 1 ? atoi (argv[1]) : 5;
  g_autoptr (df_surface) surface = NULL;
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface_spec) spec = NULL;
  double (*outline)[2];
  size_t n = 0;
  const int side = 400;
  const double half = 0.5;   /* 150 mm of arc on R = 300 mm */

  df_core_init ();
  if (repeats < 1)
    repeats = 1;
  spec = df_surface_spec_new_preset ("sphere", &error);
  if (spec == NULL || !df_surface_spec_set_param (spec, "R=300", NULL, &error)
      || (surface = df_surface_spec_build (spec, &error)) == NULL)
    {
      fprintf (stderr, "bench-drape: %s\n", error->message);
      return 1;
    }
  outline = g_malloc_n (4 * side, sizeof *outline);
  for (int a = 0; a < side; a++)
    {
      double f = -half + 2 * half * a / side;

      outline[n][0] = G_PI / 2 + f, outline[n++][1] = -half;
      outline[n][0] = G_PI / 2 + half, outline[n++][1] = f;
      outline[n][0] = G_PI / 2 - f, outline[n++][1] = half;
      outline[n][0] = G_PI / 2 - half, outline[n++][1] = -f;
    }
  /* The loop above interleaves the four sides; sort them into order round the square. */
  {
    double (*ordered)[2] = g_malloc_n (4 * side, sizeof *ordered);

    for (int s = 0; s < 4; s++)
      for (int a = 0; a < side; a++)
        {
          ordered[s * side + a][0] = outline[4 * a + s][0];
          ordered[s * side + a][1] = outline[4 * a + s][1];
        }
    g_free (outline);
    outline = ordered;
  }
  printf ("Sphere R = 300 mm, ply 300 mm x 300 mm of arc at the equator, cell 2 mm\n");
  run (surface, (const double (*)[2]) outline, n, 0, false, repeats);
  run (surface, (const double (*)[2]) outline, n, 0, true, repeats);
  run (surface, (const double (*)[2]) outline, n, 30, false, repeats);
  run (surface, (const double (*)[2]) outline, n, 30, true, repeats);
  g_free (outline);
  return 0;
}
