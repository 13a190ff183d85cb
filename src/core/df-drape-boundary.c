/* df-drape-boundary.c: the boundary of a drape's whole cells as one simple closed chart curve
 * (df_drape_whole_boundary in df-drape.h), for writing as a loop that `measure` reads.
 *
 * The whole cells need not form a disc: pins lost at the surface's edge leave holes, a
 * staircase outline can leave two cells touching only at a corner, a narrow waist can cut the
 * ply in two. A loop that `measure` can take must be a simple closed curve, so the region
 * written is made one: the largest edge-connected piece of whole cells; its holes filled (cells
 * the outside cannot reach, the outside taken corner-connected, the dual of edge-connected
 * pieces); then, while two of its cells touch only at a corner with both other cells of that
 * 2 x 2 block outside (the curve would pass the shared pin twice), the one with fewer
 * neighbours in the region is taken out, and the piece and holes are found again. The region
 * shrinks each round, so this ends. The curve follows the thread segments (quintic Hermite
 * curves of the geodesics) with the region on its left, anticlockwise about N.
 * Plain C + libm; no GLib. */
#include "df-drape-private.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

/* The cell grid padded by one empty cell on each side, so the outside is connected round it. */
typedef struct
{
  const df_drape *d;
  int             w, h;        /* padded size */
  unsigned char  *in;          /* region */
  unsigned char  *whole;       /* the drape's whole cells */
  int            *queue;
  unsigned char  *seen;
} grid;

static int
at (const grid *g, int a, int b)
{
  return b * g->w + a;
}

/* Keeps the largest edge-connected piece of the region; returns the number of pieces. */
static size_t
keep_largest (grid *g)
{
  int n = g->w * g->h, best_label = 0;
  size_t pieces = 0, best = 0;
  int *label = calloc ((size_t) n, sizeof *label);

  if (label == NULL)
    return 0;
  for (int s = 0; s < n; s++)
    {
      size_t head = 0, tail = 0;

      if (!g->in[s] || label[s] != 0)
        continue;
      pieces++;
      label[s] = (int) pieces;
      g->queue[tail++] = s;
      while (head < tail)
        {
          int c = g->queue[head++], a = c % g->w, b = c / g->w;
          const int nb[4] = { at (g, a + 1, b), at (g, a - 1, b), at (g, a, b + 1),
                              at (g, a, b - 1) };

          for (int k = 0; k < 4; k++)
            if (g->in[nb[k]] && label[nb[k]] == 0)
              {
                label[nb[k]] = (int) pieces;
                g->queue[tail++] = nb[k];
              }
        }
      if (tail > best)
        {
          best = tail;
          best_label = (int) pieces;
        }
    }
  for (int s = 0; s < n; s++)
    g->in[s] = g->in[s] && label[s] == best_label;
  free (label);
  return pieces;
}

/* Fills the region's holes: every cell the outside (corner-connected, from the padding)
 * cannot reach joins it. */
static void
fill_holes (grid *g)
{
  int n = g->w * g->h;
  size_t head = 0, tail = 0;

  memset (g->seen, 0, (size_t) n);
  g->seen[0] = 1;
  g->queue[tail++] = 0;
  while (head < tail)
    {
      int c = g->queue[head++], a = c % g->w, b = c / g->w;

      for (int db = -1; db <= 1; db++)
        for (int da = -1; da <= 1; da++)
          {
            int x = a + da, y = b + db, k;

            if (x < 0 || y < 0 || x >= g->w || y >= g->h)
              continue;
            k = at (g, x, y);
            if (!g->in[k] && !g->seen[k])
              {
                g->seen[k] = 1;
                g->queue[tail++] = k;
              }
          }
    }
  for (int s = 0; s < n; s++)
    if (!g->seen[s])
      g->in[s] = 1;
}

static int
neighbours_in (const grid *g, int a, int b)
{
  return g->in[at (g, a + 1, b)] + g->in[at (g, a - 1, b)] + g->in[at (g, a, b + 1)]
         + g->in[at (g, a, b - 1)];
}

/* Takes out one cell of each corner-only contact; returns how many were taken out. */
static size_t
cut_pinches (grid *g)
{
  size_t cut = 0;

  for (int b = 0; b + 1 < g->h; b++)
    for (int a = 0; a + 1 < g->w; a++)
      {
        int c00 = at (g, a, b), c10 = at (g, a + 1, b), c01 = at (g, a, b + 1);
        int c11 = at (g, a + 1, b + 1);

        if (g->in[c00] && g->in[c11] && !g->in[c10] && !g->in[c01])
          {
            if (neighbours_in (g, a, b) <= neighbours_in (g, a + 1, b + 1))
              g->in[c00] = 0;
            else
              g->in[c11] = 0;
            cut++;
          }
        else if (g->in[c10] && g->in[c01] && !g->in[c00] && !g->in[c11])
          {
            if (neighbours_in (g, a + 1, b) <= neighbours_in (g, a, b + 1))
              g->in[c10] = 0;
            else
              g->in[c01] = 0;
            cut++;
          }
      }
  return cut;
}

size_t
df_drape_whole_boundary (const df_drape *d, int per_segment, double (**out)[2],
                         df_drape_boundary_info *info)
{
  grid g = { 0 };
  int nci = d->ni - 1, ncj = d->nj - 1, nv, start = -1, n_edges = 0;
  int *next = NULL;   /* per pin of the padded grid: 1 + direction of its outgoing edge */
  size_t total = 0, traced = 0;
  /* Edges of a cell anticlockwise (region on the left): from which corner, in which
   * direction, and the cell across. */
  static const int e_corner[4][2] = { { 0, 0 }, { 1, 0 }, { 1, 1 }, { 0, 1 } };
  static const int e_dir[4] = { DIR_PI, DIR_PJ, DIR_MI, DIR_MJ };
  static const int e_across[4][2] = { { 0, -1 }, { 1, 0 }, { 0, 1 }, { -1, 0 } };

  *out = NULL;
  memset (info, 0, sizeof *info);
  info->excess_rad = NAN;
  if (per_segment < 1 || nci < 1 || ncj < 1)
    return 0;
  g.d = d;
  g.w = nci + 2;
  g.h = ncj + 2;
  g.in = calloc ((size_t) g.w * g.h, 1);
  g.whole = calloc ((size_t) g.w * g.h, 1);
  g.seen = calloc ((size_t) g.w * g.h, 1);
  g.queue = malloc ((size_t) g.w * g.h * sizeof *g.queue);
  nv = (g.w + 1) * (g.h + 1);
  next = calloc ((size_t) nv, sizeof *next);
  if (!g.in || !g.whole || !g.seen || !g.queue || !next)
    goto done;

  for (int b = 0; b < ncj; b++)
    for (int a = 0; a < nci; a++)
      {
        size_t idx = (size_t) b * nci + a;

        if (d->cell_ok[idx] && d->cells[idx].whole)
          {
            g.in[at (&g, a + 1, b + 1)] = g.whole[at (&g, a + 1, b + 1)] = 1;
            info->n_whole_cells++;
          }
      }
  if (info->n_whole_cells == 0)
    goto done;
  info->n_pieces = keep_largest (&g);
  for (;;)
    {
      size_t cut;

      fill_holes (&g);
      cut = cut_pinches (&g);
      if (cut == 0)
        break;
      info->n_corner_cuts += cut;
      keep_largest (&g);
    }

  /* The region's cells, and its boundary edges hung on their start pins. */
  info->excess_rad = 0;
  for (int b = 1; b <= ncj; b++)
    for (int a = 1; a <= nci; a++)
      {
        size_t idx = (size_t) (b - 1) * nci + (a - 1);

        if (!g.in[at (&g, a, b)])
          continue;
        info->n_cells++;
        if (!g.whole[at (&g, a, b)])
          info->n_cells_filled++;
        info->excess_rad += d->cell_ok[idx] ? d->cells[idx].excess_rad : NAN;
        for (int e = 0; e < 4; e++)
          {
            int v;

            if (g.in[at (&g, a + e_across[e][0], b + e_across[e][1])])
              continue;
            v = (b + e_corner[e][1]) * (g.w + 1) + (a + e_corner[e][0]);
            if (next[v] != 0)
              goto done;   /* two edges leave one pin: cannot happen after cut_pinches */
            next[v] = 1 + e_dir[e];
            n_edges++;
            if (start < 0)
              start = v;
          }
      }
  info->n_whole_left_out = info->n_whole_cells - (info->n_cells - info->n_cells_filled);
  if (start < 0 || (*out = malloc ((size_t) n_edges * per_segment * sizeof **out)) == NULL)
    goto done;

  /* Follow the edges from the first pin round to it again. */
  for (int v = start;;)
    {
      int dir = next[v] - 1, a = v % (g.w + 1), b = v / (g.w + 1);
      int i = d->i_min + a - 1, j = d->j_min + b - 1;

      if (dir < 0 || traced == (size_t) n_edges)
        break;
      next[v] = 0;
      /* Points crowd towards the pins, where the curve has corners: a spline through the
       * points (as `measure` runs) rounds a corner over a few point spacings there. */
      for (int q = 0; q < per_segment; q++)
        if (!df_drape_segment_point (d, i, j, dir, 0.5 - 0.5 * cos (M_PI * q / per_segment),
                                     (*out)[traced * per_segment + q]))
          goto done;
      traced++;
      v = (b + dir_dj[dir]) * (g.w + 1) + (a + dir_di[dir]);
      if (v == start)
        break;
    }
  if (traced == (size_t) n_edges)
    total = traced * per_segment;

done:
  if (total == 0)
    {
      free (*out);
      *out = NULL;
    }
  info->n_segments = total / (size_t) (per_segment > 0 ? per_segment : 1);
  free (g.in);
  free (g.whole);
  free (g.seen);
  free (g.queue);
  free (next);
  return total;
}
