/* df-loop-simple.c: whether a loop crosses itself, by segment intersections on a planar
 * picture of it that is regular at the poles (split from df-loop.c, which measures the loop).
 * Plain C + libm; no GLib. */
#include "df-loop-private.h"
#include "df-vec3.h"

#include <math.h>
#include <stdint.h>
#include <stdlib.h>

#include "df-surface.h"

/* --- simplicity: segment intersections on a planar picture of the loop ------------------- */

static bool
segments_cross (const double a[2], const double b[2], const double c[2], const double d[2])
{
  double d1 = (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
  double d2 = (b[0] - a[0]) * (d[1] - a[1]) - (b[1] - a[1]) * (d[0] - a[0]);
  double d3 = (d[0] - c[0]) * (a[1] - c[1]) - (d[1] - c[1]) * (a[0] - c[0]);
  double d4 = (d[0] - c[0]) * (b[1] - c[1]) - (d[1] - c[1]) * (b[0] - c[0]);

  /* Segments whose boxes do not overlap cannot meet; testing that first keeps nearly
   * collinear segments (a meridian in a pole-centred picture, with rounding noise across it)
   * from looking crossed by the sign tests below. Touching counts as crossing: the two
   * segments are not neighbours, so a shared point means the loop meets itself. Collinear
   * segments cross where their boxes overlap. */
  bool boxes = fmax (fmin (a[0], b[0]), fmin (c[0], d[0])) <= fmin (fmax (a[0], b[0]), fmax (c[0], d[0]))
               && fmax (fmin (a[1], b[1]), fmin (c[1], d[1])) <= fmin (fmax (a[1], b[1]), fmax (c[1], d[1]));

  if (!boxes)
    return false;
  if (d1 == 0 && d2 == 0 && d3 == 0 && d4 == 0)
    return true;
  return d1 * d2 <= 0 && d3 * d4 <= 0;
}

/* Spatial hash of segments: a cell a few segments wide, keyed by its integer coordinates, so
 * each segment meets only its neighbours on the curve and the few places where the curve
 * comes back near itself. */
typedef struct
{
  long   cx, cy;
  size_t seg;
  size_t next;     /* next entry in the same bucket, or SIZE_MAX */
} cell_entry;

static size_t
cell_hash (long cx, long cy, size_t mask)
{
  unsigned long long h = (unsigned long long) cx * 0x9E3779B97F4A7C15ULL
                         ^ (unsigned long long) cy * 0xC2B2AE3D27D4EB4FULL;

  return (size_t) (h ^ (h >> 29)) & mask;
}

/* A planar picture of a revolution loop that is regular wherever the surface is: the points
 * (t, phi) are placed as
 * - no pole: on the annulus (1 + (t - t_min) / range) e^(i phi), where going round the axis is
 *   going round the hole;
 * - one pole: on the disc ((t - t_pole) / range) e^(i phi) centred on it (a pole-centred chart,
 *   regular at a smooth pole, where (t, phi) is not);
 * - two poles: on the unit sphere by theta = pi (t - t_min) / range, then projected
 *   stereographically from the one of 14 directions farthest from every point of the loop, so
 *   both poles are regular points of the picture. */
static void
revolution_picture (const df_curve *c, double (*q)[2], size_t n)
{
  const df_surface *s = df_curve_get_surface (c);
  df_curve_coords coords = df_curve_get_coords (c);
  df_pole poles[2];
  double u_min, u_max, range, best = -1.0, centre[3] = { 0, 0, 1 }, e1[3], e2[3];

  df_surface_get_domain (s, &u_min, &u_max, NULL, NULL);
  df_surface_get_poles (s, poles);
  range = u_max - u_min;
  for (size_t i = 0; i < n; i++)
    {
      double t = q[i][0], ph = q[i][1];

      if (coords == DF_COORDS_POLAR_MIN || coords == DF_COORDS_POLAR_MAX)
        {
          double rho = hypot (q[i][0], q[i][1]);

          t = coords == DF_COORDS_POLAR_MAX ? u_max - rho : u_min + rho;
          ph = atan2 (q[i][1], q[i][0]);
        }
      q[i][0] = t;
      q[i][1] = ph;
    }
  if (!poles[0].on_axis || !poles[1].on_axis)
    {
      for (size_t i = 0; i < n; i++)
        {
          double rad = poles[0].on_axis ? (q[i][0] - u_min) / range
                       : poles[1].on_axis ? (u_max - q[i][0]) / range
                                          : 1.0 + (q[i][0] - u_min) / range;
          double ph = q[i][1];

          q[i][0] = rad * cos (ph);
          q[i][1] = rad * sin (ph);
        }
      return;
    }
  {
    /* Candidate centres: the 6 axis directions and the 8 cube diagonals. */
    static const double dirs[14][3] = {
      { 1, 0, 0 }, { -1, 0, 0 }, { 0, 1, 0 }, { 0, -1, 0 }, { 0, 0, 1 }, { 0, 0, -1 },
      { 1, 1, 1 }, { 1, 1, -1 }, { 1, -1, 1 }, { 1, -1, -1 },
      { -1, 1, 1 }, { -1, 1, -1 }, { -1, -1, 1 }, { -1, -1, -1 } };

    for (int d = 0; d < 14; d++)
      {
        double len = sqrt (df_dot3 (dirs[d], dirs[d])), closest = 2.0;

        for (size_t i = 0; i < n; i++)
          {
            double th = M_PI * (q[i][0] - u_min) / range, w[3];

            w[0] = sin (th) * cos (q[i][1]);
            w[1] = sin (th) * sin (q[i][1]);
            w[2] = cos (th);
            closest = fmin (closest, 1.0 - df_dot3 (w, dirs[d]) / len);
          }
        if (closest > best)
          {
            best = closest;
            for (int k = 0; k < 3; k++)
              centre[k] = dirs[d][k] / len;
          }
      }
  }
  /* An orthonormal basis of the plane normal to the centre. */
  {
    double a[3] = { fabs (centre[0]) < 0.9 ? 1.0 : 0.0, fabs (centre[0]) < 0.9 ? 0.0 : 1.0, 0.0 };
    double ac = df_dot3 (a, centre), len;

    for (int k = 0; k < 3; k++)
      e1[k] = a[k] - ac * centre[k];
    len = sqrt (df_dot3 (e1, e1));
    for (int k = 0; k < 3; k++)
      e1[k] /= len;
    df_cross3 (centre, e1, e2);
  }
  for (size_t i = 0; i < n; i++)
    {
      double th = M_PI * (q[i][0] - u_min) / range, w[3], den;

      w[0] = sin (th) * cos (q[i][1]);
      w[1] = sin (th) * sin (q[i][1]);
      w[2] = cos (th);
      den = 1.0 - df_dot3 (w, centre);
      q[i][0] = df_dot3 (w, e1) / den;
      q[i][1] = df_dot3 (w, e2) / den;
    }
}

df_status
_df_loop_is_simple (const df_curve *c, bool *simple)
{
  size_t n, n_buckets = 1, n_entries = 0, cap;
  double (*q)[2] = NULL, total = 0.0, cell;
  size_t *bucket = NULL;
  cell_entry *entries = NULL;
  df_status st = DF_OK;

  *simple = true;
  /* The nodes themselves when there are many (the spline between two close nodes cannot cross
   * anything the polygon misses in practice), subdivided when there are few. */
  n = df_curve_sample_plane (c, 2048, &q);
  if (n == 0)
    return DF_E_NOMEM;
  if (df_surface_get_kind (df_curve_get_surface (c)) == DF_SURFACE_REVOLUTION)
    revolution_picture (c, q, n);
  for (size_t i = 0; i < n; i++)
    total += hypot (q[(i + 1) % n][0] - q[i][0], q[(i + 1) % n][1] - q[i][1]);
  cell = 4.0 * total / n + 1e-300;
  while (n_buckets < 2 * n)
    n_buckets *= 2;
  cap = 2 * n;
  bucket = malloc (n_buckets * sizeof *bucket);
  entries = malloc (cap * sizeof *entries);
  if (!bucket || !entries)
    {
      st = DF_E_NOMEM;
      goto out;
    }
  for (size_t i = 0; i < n_buckets; i++)
    bucket[i] = SIZE_MAX;
  for (size_t i = 0; i < n && *simple; i++)
    {
      const double *a = q[i], *b = q[(i + 1) % n];
      long c0 = (long) floor (fmin (a[0], b[0]) / cell), c1 = (long) floor (fmax (a[0], b[0]) / cell);
      long r0 = (long) floor (fmin (a[1], b[1]) / cell), r1 = (long) floor (fmax (a[1], b[1]) / cell);

      for (long cx = c0; cx <= c1 && *simple; cx++)
        for (long cy = r0; cy <= r1 && *simple; cy++)
          {
            size_t h = cell_hash (cx, cy, n_buckets - 1);

            for (size_t e = bucket[h]; e != SIZE_MAX; e = entries[e].next)
              {
                size_t j = entries[e].seg;

                if (entries[e].cx != cx || entries[e].cy != cy)
                  continue;
                /* Neighbours share an end point: not a crossing. */
                if (j == i || (j + 1) % n == i || (i + 1) % n == j)
                  continue;
                if (segments_cross (a, b, q[j], q[(j + 1) % n]))
                  {
                    *simple = false;
                    break;
                  }
              }
            if (n_entries == cap)
              {
                cell_entry *grown = realloc (entries, 2 * cap * sizeof *entries);

                if (grown == NULL)
                  {
                    st = DF_E_NOMEM;
                    goto out;
                  }
                entries = grown;
                cap *= 2;
              }
            entries[n_entries] = (cell_entry) { cx, cy, i, bucket[h] };
            bucket[h] = n_entries++;
          }
    }
out:
  free (q);
  free (bucket);
  free (entries);
  return st;
}

