/* df-drape-patch.c: the cells of a woven-ply net (df-drape.c builds the pins): thread
 * segments as quintic Hermite curves of the geodesics, each cell a Coons patch of its four
 * sides, the cell's integral of K dA by adaptive Gauss-Legendre quadrature on it (the closure
 * check, independent of the angles), the outline mapped to the flat fabric through the
 * patches, and blocks of cells as closed curves for measuring.
 * Plain C + libm + GSL; no GLib. */
#include "df-drape-private.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "df-geometry.h"

/* ---- segments as quintic Hermite curves -------------------------------------------------- */

static void
accel (const net_node *nd, const double v[2], double out[2])
{
  for (int k = 0; k < 2; k++)
    out[k] = -(nd->gamma[k][0][0] * v[0] * v[0] + 2 * nd->gamma[k][0][1] * v[0] * v[1]
               + nd->gamma[k][1][1] * v[1] * v[1]);
}

bool
_df_drape_segment_hermite (const df_drape *d, int i, int j, int dir, _df_hermite *hm)
{
  const net_node *a = _df_drape_valid_node (d, i, j), *b = _df_drape_valid_node (d, i + dir_di[dir], j + dir_dj[dir]);
  double h = d->opt.cell, v1[2], acc[2];

  if (a == NULL || b == NULL || !a->has[dir] || !b->has[dir_opp[dir]])
    return false;
  v1[0] = -b->out[dir_opp[dir]][0];
  v1[1] = -b->out[dir_opp[dir]][1];
  for (int k = 0; k < 2; k++)
    {
      hm->p0[k] = a->uv[k];
      hm->p1[k] = b->uv[k];
      hm->m0[k] = h * a->out[dir][k];
      hm->m1[k] = h * v1[k];
    }
  accel (a, a->out[dir], acc);
  hm->a0[0] = h * h * acc[0];
  hm->a0[1] = h * h * acc[1];
  accel (b, v1, acc);
  hm->a1[0] = h * h * acc[0];
  hm->a1[1] = h * h * acc[1];
  return true;
}

/* Value and first two derivatives in f of the quintic Hermite interpolant. */
static void
hermite_eval (const _df_hermite *hm, double f, double p[2], double dp[2], double ddp[2])
{
  double f2 = f * f, f3 = f2 * f, f4 = f3 * f, f5 = f4 * f;
  double b[6] = { 1 - 10 * f3 + 15 * f4 - 6 * f5, f - 6 * f3 + 8 * f4 - 3 * f5,
                  0.5 * f2 - 1.5 * f3 + 1.5 * f4 - 0.5 * f5, 0.5 * f3 - f4 + 0.5 * f5,
                  -4 * f3 + 7 * f4 - 3 * f5, 10 * f3 - 15 * f4 + 6 * f5 };
  double db[6] = { -30 * f2 + 60 * f3 - 30 * f4, 1 - 18 * f2 + 32 * f3 - 15 * f4,
                   f - 4.5 * f2 + 6 * f3 - 2.5 * f4, 1.5 * f2 - 4 * f3 + 2.5 * f4,
                   -12 * f2 + 28 * f3 - 15 * f4, 30 * f2 - 60 * f3 + 30 * f4 };
  double ddb[6] = { -60 * f + 180 * f2 - 120 * f3, -36 * f + 96 * f2 - 60 * f3,
                    1 - 9 * f + 18 * f2 - 10 * f3, 3 * f - 12 * f2 + 10 * f3,
                    -24 * f + 84 * f2 - 60 * f3, 60 * f - 180 * f2 + 120 * f3 };

  for (int k = 0; k < 2; k++)
    {
      double c[6] = { hm->p0[k], hm->m0[k], hm->a0[k], hm->a1[k], hm->m1[k], hm->p1[k] };

      p[k] = dp[k] = 0;
      if (ddp)
        ddp[k] = 0;
      for (int q = 0; q < 6; q++)
        {
          p[k] += b[q] * c[q];
          dp[k] += db[q] * c[q];
          if (ddp)
            ddp[k] += ddb[q] * c[q];
        }
    }
}

bool
df_drape_segment_point (const df_drape *d, int i, int j, int dir, double f, double uv[2])
{
  _df_hermite hm;
  double dp[2];

  if (d == NULL || dir < 0 || dir > 3 || !_df_drape_segment_hermite (d, i, j, dir, &hm))
    return false;
  hermite_eval (&hm, fmin (1.0, fmax (0.0, f)), uv, dp, NULL);
  return true;
}

/* ---- cells: Coons patch of the four sides ------------------------------------------------- */

bool
_df_drape_cell_coons (const df_drape *d, int i, int j, _df_coons *c)
{
  return _df_drape_segment_hermite (d, i, j, DIR_PI, &c->bottom)
         && _df_drape_segment_hermite (d, i, j + 1, DIR_PI, &c->top)
         && _df_drape_segment_hermite (d, i, j, DIR_PJ, &c->left)
         && _df_drape_segment_hermite (d, i + 1, j, DIR_PJ, &c->right);
}

/* Transfinite (Coons) map of the unit square onto the cell: its sides are exactly the four
 * Hermite segments, so the region integrated over is the cell bounded by its geodesics. */
static void
coons_eval (const _df_coons *c, double s, double t, double x[2], double xs[2], double xt[2])
{
  double b[2], bd[2], tp[2], td[2], l[2], ld[2], r[2], rd[2];
  const double *p00 = c->bottom.p0, *p10 = c->bottom.p1, *p01 = c->top.p0, *p11 = c->top.p1;

  hermite_eval (&c->bottom, s, b, bd, NULL);
  hermite_eval (&c->top, s, tp, td, NULL);
  hermite_eval (&c->left, t, l, ld, NULL);
  hermite_eval (&c->right, t, r, rd, NULL);
  for (int k = 0; k < 2; k++)
    {
      x[k] = (1 - t) * b[k] + t * tp[k] + (1 - s) * l[k] + s * r[k]
             - ((1 - s) * (1 - t) * p00[k] + s * (1 - t) * p10[k] + (1 - s) * t * p01[k]
                + s * t * p11[k]);
      xs[k] = (1 - t) * bd[k] + t * td[k] - l[k] + r[k]
              - (-(1 - t) * p00[k] + (1 - t) * p10[k] - t * p01[k] + t * p11[k]);
      xt[k] = -b[k] + tp[k] + (1 - s) * ld[k] + s * rd[k]
              - (-(1 - s) * p00[k] - s * p10[k] + (1 - s) * p01[k] + s * p11[k]);
    }
}

typedef struct
{
  const df_surface *surface;
  const _df_coons      *c;
  gsl_integration_glfixed_table *lo, *hi;
  bool failed;
} quad_ctx;

static void
quad_rule (quad_ctx *q, gsl_integration_glfixed_table *tab, double s0, double s1, double t0,
           double t1, double *k_out, double *a_out)
{
  double ks = 0, as = 0;

  for (size_t a = 0; a < tab->n; a++)
    for (size_t b = 0; b < tab->n; b++)
      {
        double s, t, ws, wt, x[2], xs[2], xt[2], jac, ksg, sg;

        gsl_integration_glfixed_point (s0, s1, a, &s, &ws, tab);
        gsl_integration_glfixed_point (t0, t1, b, &t, &wt, tab);
        coons_eval (q->c, s, t, x, xs, xt);
        jac = fabs (xs[0] * xt[1] - xs[1] * xt[0]);
        if (df_surface_k_area (q->surface, x[0], x[1], &ksg, &sg, NULL) != DF_OK)
          {
            q->failed = true;
            return;
          }
        ks += ws * wt * ksg * jac;
        as += ws * wt * sg * jac;
      }
  *k_out = ks;
  *a_out = as;
}

/* Adaptive: a 3x3 and a 5x5 Gauss-Legendre rule on each square; split in four where they
 * disagree. On a cell of a smooth surface the first level nearly always suffices. */
static void
quad_adapt (quad_ctx *q, double s0, double s1, double t0, double t1, int depth, double *k,
            double *area)
{
  double k3, a3, k5, a5;

  quad_rule (q, q->lo, s0, s1, t0, t1, &k3, &a3);
  if (q->failed)
    return;
  quad_rule (q, q->hi, s0, s1, t0, t1, &k5, &a5);
  if (q->failed)
    return;
  if (depth >= 5 || fabs (k5 - k3) <= 1e-15 + 1e-11 * fabs (k5))
    {
      *k += k5;
      *area += a5;
      return;
    }
  {
    double sm = 0.5 * (s0 + s1), tm = 0.5 * (t0 + t1);

    quad_adapt (q, s0, sm, t0, tm, depth + 1, k, area);
    quad_adapt (q, sm, s1, t0, tm, depth + 1, k, area);
    quad_adapt (q, s0, sm, tm, t1, depth + 1, k, area);
    quad_adapt (q, sm, s1, tm, t1, depth + 1, k, area);
  }
}

bool
_df_drape_cell_integrate (const df_surface *surface, const _df_coons *c,
                          gsl_integration_glfixed_table *lo, gsl_integration_glfixed_table *hi,
                          double *k_area, double *area)
{
  quad_ctx q = { surface, c, lo, hi, false };

  *k_area = *area = 0;
  quad_adapt (&q, 0, 1, 0, 1, 0, k_area, area);
  return !q.failed;
}

/* Inverts the Coons map by Newton's method: (s, t) of chart point q in the cell. */
static bool
coons_invert (const _df_coons *c, const double q[2], double st[2])
{
  st[0] = st[1] = 0.5;
  for (int it = 0; it < 30; it++)
    {
      double x[2], xs[2], xt[2], det, ds, dt, r[2];

      coons_eval (c, st[0], st[1], x, xs, xt);
      r[0] = x[0] - q[0];
      r[1] = x[1] - q[1];
      det = xs[0] * xt[1] - xs[1] * xt[0];
      if (!(fabs (det) > 0))
        return false;
      ds = (-r[0] * xt[1] + r[1] * xt[0]) / det;
      dt = (-xs[0] * r[1] + xs[1] * r[0]) / det;
      st[0] += ds;
      st[1] += dt;
      if (!isfinite (st[0]) || !isfinite (st[1]) || fabs (st[0]) > 3 || fabs (st[1]) > 3)
        return false;
      if (fabs (ds) + fabs (dt) < 1e-14)
        break;
    }
  return st[0] >= -1e-9 && st[0] <= 1 + 1e-9 && st[1] >= -1e-9 && st[1] <= 1 + 1e-9;
}

/* Maps every outline point through the cell that contains it (a bucket grid over the cells'
 * chart boxes finds the candidates). */
void
_df_drape_map_outline (df_drape *d)
{
  size_t nc = (size_t) (d->ni - 1) * (d->nj - 1), nb, *count, *start, *list = NULL;
  double lo[2] = { HUGE_VAL, HUGE_VAL }, hi[2] = { -HUGE_VAL, -HUGE_VAL }, cw[2];
  int gb = 1;
  double (*box)[4];
  double h = d->opt.cell;

  if (d->ni < 2 || d->nj < 2)
    {
      d->sum.n_outline_unmapped = d->n_outline;
      return;
    }
  box = calloc (nc, sizeof *box);
  for (size_t c = 0; c < nc; c++)
    {
      int i = (int) (c % (d->ni - 1)) + d->i_min, j = (int) (c / (d->ni - 1)) + d->j_min;
      double b[4] = { HUGE_VAL, -HUGE_VAL, HUGE_VAL, -HUGE_VAL }, m0, m1;

      if (!d->cell_ok[c])
        continue;
      for (int k = 0; k < 4; k++)
        {
          const net_node *n = _df_drape_valid_node (d, i + (k & 1), j + (k >> 1));

          b[0] = fmin (b[0], n->uv[0]);
          b[1] = fmax (b[1], n->uv[0]);
          b[2] = fmin (b[2], n->uv[1]);
          b[3] = fmax (b[3], n->uv[1]);
        }
      /* The geodesic sides bow out of the corners' box by a fraction of it. */
      m0 = 0.25 * (b[1] - b[0]) + 1e-12;
      m1 = 0.25 * (b[3] - b[2]) + 1e-12;
      box[c][0] = b[0] - m0;
      box[c][1] = b[1] + m0;
      box[c][2] = b[2] - m1;
      box[c][3] = b[3] + m1;
      lo[0] = fmin (lo[0], box[c][0]);
      hi[0] = fmax (hi[0], box[c][1]);
      lo[1] = fmin (lo[1], box[c][2]);
      hi[1] = fmax (hi[1], box[c][3]);
    }
  if (!(hi[0] > lo[0]))
    {
      free (box);
      d->sum.n_outline_unmapped = d->n_outline;
      return;
    }
  while ((size_t) gb * gb < nc && gb < 1024)
    gb *= 2;
  nb = (size_t) gb * gb;
  cw[0] = (hi[0] - lo[0]) / gb;
  cw[1] = (hi[1] - lo[1]) / gb;
  count = calloc (nb + 1, sizeof *count);
  start = calloc (nb + 1, sizeof *start);
  /* Two passes (count, fill) give a compact bucket list. */
  for (int pass = 0; pass < 2; pass++)
    {
      if (pass == 1)
        {
          for (size_t b = 0; b < nb; b++)
            start[b + 1] = start[b] + count[b];
          list = malloc ((start[nb] + 1) * sizeof *list);
          memset (count, 0, (nb + 1) * sizeof *count);
        }
      for (size_t c = 0; c < nc; c++)
        {
          int a0, a1, b0, b1;

          if (!d->cell_ok[c])
            continue;
          a0 = (int) fmax (0, floor ((box[c][0] - lo[0]) / cw[0]));
          a1 = (int) fmin (gb - 1, floor ((box[c][1] - lo[0]) / cw[0]));
          b0 = (int) fmax (0, floor ((box[c][2] - lo[1]) / cw[1]));
          b1 = (int) fmin (gb - 1, floor ((box[c][3] - lo[1]) / cw[1]));
          for (int bj = b0; bj <= b1; bj++)
            for (int bi = a0; bi <= a1; bi++)
              {
                size_t b = (size_t) bj * gb + bi;

                if (pass == 1)
                  list[start[b] + count[b]] = c;
                count[b]++;
              }
        }
    }

  for (size_t k = 0; k < d->n_outline; k++)
    {
      const double *q = d->outline[k];
      int bi = (int) floor ((q[0] - lo[0]) / cw[0]), bj = (int) floor ((q[1] - lo[1]) / cw[1]);

      d->mapped[k] = false;
      if (bi < 0 || bj < 0 || bi >= gb || bj >= gb)
        continue;
      for (size_t e = start[(size_t) bj * gb + bi]; e < start[(size_t) bj * gb + bi + 1]; e++)
        {
          size_t c = list[e];
          int i = (int) (c % (d->ni - 1)) + d->i_min, j = (int) (c / (d->ni - 1)) + d->j_min;
          _df_coons co;
          double st[2];

          if (q[0] < box[c][0] || q[0] > box[c][1] || q[1] < box[c][2] || q[1] > box[c][3])
            continue;
          if (_df_drape_cell_coons (d, i, j, &co) && coons_invert (&co, q, st))
            {
              d->flat[k][0] = (i + st[0]) * h;
              d->flat[k][1] = (j + st[1]) * h;
              d->mapped[k] = true;
              break;
            }
        }
      if (!d->mapped[k])
        {
          d->flat[k][0] = d->flat[k][1] = NAN;
          d->sum.n_outline_unmapped++;
        }
    }
  free (list);
  free (count);
  free (start);
  free (box);
}

/* ---- blocks of cells --------------------------------------------------------------------- */

struct df_drape_block
{
  size_t   n;
  _df_hermite *seg;      /* in order round the block, each oriented along the travel */
};

/* The boundary's segments anticlockwise: along +i at the bottom, +j on the right, -i at the
 * top, -j on the left (the weft is 90 deg anticlockwise from the warp, so the block lies on
 * the left). */
static size_t
block_walk (const df_drape *d, int i0, int i1, int j0, int j1, _df_hermite *seg)
{
  size_t n = 0;

  for (int i = i0; i < i1; i++, n++)
    if (!_df_drape_segment_hermite (d, i, j0, DIR_PI, &seg[n]))
      return 0;
  for (int j = j0; j < j1; j++, n++)
    if (!_df_drape_segment_hermite (d, i1, j, DIR_PJ, &seg[n]))
      return 0;
  for (int i = i1; i > i0; i--, n++)
    if (!_df_drape_segment_hermite (d, i, j1, DIR_MI, &seg[n]))
      return 0;
  for (int j = j1; j > j0; j--, n++)
    if (!_df_drape_segment_hermite (d, i0, j, DIR_MJ, &seg[n]))
      return 0;
  return n;
}

static void
block_fn (double tau, void *user, double p[2], double dp[2], double ddp[2])
{
  const df_drape_block *b = user;
  double k = floor (tau), f;
  size_t idx;

  if (k < 0)
    k = 0;
  if (k >= (double) b->n)
    k = (double) b->n - 1;
  idx = (size_t) k;
  f = tau - k;
  hermite_eval (&b->seg[idx], f, p, dp, ddp);
}

void
df_drape_block_free (df_drape_block *b)
{
  if (b == NULL)
    return;
  free (b->seg);
  free (b);
}

df_status
df_drape_block_curve (const df_drape *d, int i0, int i1, int j0, int j1, df_curve **out,
                      df_drape_block **block, df_diag *diag)
{
  df_drape_block *b;
  double *breaks;
  df_status st;

  *out = NULL;
  *block = NULL;
  if (i1 <= i0 || j1 <= j0)
    return df_diag_fail (diag, DF_E_INPUT, -1, "an empty block of cells");
  b = calloc (1, sizeof *b);
  if (b == NULL)
    return DF_E_NOMEM;
  b->seg = calloc (2 * (size_t) (i1 - i0 + j1 - j0), sizeof *b->seg);
  if (b->seg == NULL)
    {
      free (b);
      return DF_E_NOMEM;
    }
  b->n = block_walk (d, i0, i1, j0, j1, b->seg);
  if (b->n == 0)
    {
      df_drape_block_free (b);
      return df_diag_fail (diag, DF_E_INPUT, -1, "the block [%d, %d) x [%d, %d) has a missing "
                           "thread segment", i0, i1, j0, j1);
    }
  breaks = malloc (b->n * sizeof *breaks);
  if (breaks == NULL)
    {
      df_drape_block_free (b);
      return DF_E_NOMEM;
    }
  for (size_t k = 1; k < b->n; k++)
    breaks[k - 1] = (double) k;
  st = df_curve_new_function (d->surface, DF_COORDS_CHART, 0.0, (double) b->n, breaks,
                              b->n - 1, true, block_fn, b, out, diag);
  free (breaks);
  if (st != DF_OK)
    {
      df_drape_block_free (b);
      return st;
    }
  *block = b;
  return DF_OK;
}

size_t
df_drape_block_points (const df_drape *d, int i0, int i1, int j0, int j1, int per_segment,
                       double (**out)[2])
{
  size_t n, total;
  _df_hermite *seg;

  *out = NULL;
  if (i1 <= i0 || j1 <= j0 || per_segment < 1)
    return 0;
  seg = calloc (2 * (size_t) (i1 - i0 + j1 - j0), sizeof *seg);
  if (seg == NULL)
    return 0;
  n = block_walk (d, i0, i1, j0, j1, seg);
  total = n * per_segment;
  if (n == 0 || (*out = malloc (total * sizeof **out)) == NULL)
    {
      free (seg);
      return 0;
    }
  for (size_t k = 0; k < n; k++)
    for (int q = 0; q < per_segment; q++)
      {
        double dp[2];

        hermite_eval (&seg[k], (double) q / per_segment, (*out)[k * per_segment + q], dp, NULL);
      }
  free (seg);
  return total;
}

double
df_drape_block_excess (const df_drape *d, int i0, int i1, int j0, int j1)
{
  double sum = 0;

  for (int j = j0; j < j1; j++)
    for (int i = i0; i < i1; i++)
      {
        df_drape_cell c;

        if (!df_drape_get_cell (d, i, j, &c))
          return NAN;
        sum += c.excess_rad;
      }
  return sum;
}

