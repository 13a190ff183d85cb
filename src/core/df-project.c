/* df-project.c: closest surface point to a point in space. A revolution surface reduces to a
 * one-dimensional search along the profile in the point's meridian half-plane (for r >= 0,
 * |p - X(t, phi)|^2 = (rho - r)^2 + (z_p - z)^2 + 2 rho r (1 - cos (phi - phi_p)) is least at
 * phi = phi_p); a graph to a two-dimensional one. Both run safeguarded Newton on the squared
 * distance in the chart, clamped to the domain. A sequence of points (a scanned loop) starts
 * each search from the previous answer; a seed grid serves the first point and jumps.
 * Plain C + libm; no GLib. */
#include "df-project.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

/* Seed grid: as fine as the former from-scratch search on a profile, finer on a graph (65^2
 * order-0 evaluations, about 0.3 ms, once per placer). */
#define SEEDS_1D 1025
#define SEEDS_2D 65
/* Newton is started from the best few local minima of the sampled distance, so a point that
 * has two near-equal basins (above a saddle, near a sphere's centre) gets the better one. */
#define N_BASINS 3
#define CONTINUE_STEPS 10
#define SEARCH_STEPS 60
/* A full Newton step below this fraction of the coordinate's range is taken without a further
 * evaluation: convergence is quadratic, so the error left is of the order of its square. */
#define STEP_DONE 1e-7
/* Steps are capped to this fraction of the range, so a wild first step cannot leave the
 * basin in one go. */
#define STEP_CAP 0.25

struct df_placer
{
  const df_surface *s;
  bool revolution;
  bool u_periodic;
  double lo[2], hi[2], span[2];
  double size;

  /* Seed grid in the working frame (revolution: the profile in the half-plane phi = 0). */
  bool seeds_built;
  int seeds_n[2];
  size_t n_seeds;
  double (*seed_uv)[2];
  double (*seed_x)[3];
  double *seed_d2;
  /* Buckets over the seeds' bounding box (counting sort: bucket b holds
   * bucket_item[bucket_start[b] .. bucket_start[b + 1]]), for "is any seed closer than d?". */
  double bucket_lo[3], bucket_cell;
  int bucket_n[3];
  size_t *bucket_start, *bucket_item;

  /* The previous answer: its working-frame target, distance, and the jet the next Newton
   * starts from (at x, within STEP_DONE of the answer). */
  bool have_prev;
  double prev_q[3];
  double prev_dist;
  double x[2];
  df_chart_jet jet;

  size_t n_continued, n_searched;
};

/* A chart point with its second-order jet and the squared distance to the target; fa is the
 * squared distance at the answer (x plus a last step below STEP_DONE, to first order). */
typedef struct
{
  double x[2];
  df_chart_jet jet;
  double f;
  double fa;
} point_state;

static double
clamp (double x, double lo, double hi)
{
  return x < lo ? lo : x > hi ? hi : x;
}

static double
dist2 (const double a[3], const double b[3])
{
  double d0 = a[0] - b[0], d1 = a[1] - b[1], d2 = a[2] - b[2];

  return d0 * d0 + d1 * d1 + d2 * d2;
}

/* Squared distance f, its gradient g, the full Hessian h (Gauss-Newton part 2 J^T J plus the
 * second-order term 2 (X - q) . X_ab) and the Gauss-Newton part alone. */
static void
objective (const df_chart_jet *j, const double q[3], double *f, double g[2], double h[2][2],
           double gn[2][2])
{
  double d[3];

  for (int k = 0; k < 3; k++)
    d[k] = j->x[k] - q[k];
  *f = d[0] * d[0] + d[1] * d[1] + d[2] * d[2];
  for (int a = 0; a < 2; a++)
    {
      g[a] = 0.0;
      for (int k = 0; k < 3; k++)
        g[a] += 2 * d[k] * j->d1[a][k];
      for (int b = 0; b < 2; b++)
        {
          double jj = 0.0, dd = 0.0;

          for (int k = 0; k < 3; k++)
            {
              jj += j->d1[a][k] * j->d1[b][k];
              dd += d[k] * j->d2[a + b][k];
            }
          gn[a][b] = 2 * jj;
          h[a][b] = 2 * (jj + dd);
        }
    }
}

/* Solves m step = -g over the free coordinates; false when m is not positive definite there. */
static bool
solve_free (const double m[2][2], const double g[2], const bool free_[2], double step[2])
{
  step[0] = step[1] = 0.0;
  if (free_[0] && free_[1])
    {
      double det = m[0][0] * m[1][1] - m[0][1] * m[1][0];

      if (!(m[0][0] > 0 && det > 1e-14 * m[0][0] * m[1][1]))
        return false;
      step[0] = -(m[1][1] * g[0] - m[0][1] * g[1]) / det;
      step[1] = -(m[0][0] * g[1] - m[1][0] * g[0]) / det;
      return true;
    }
  for (int a = 0; a < 2; a++)
    if (free_[a])
      {
        if (!(m[a][a] > 0))
          return false;
        step[a] = -g[a] / m[a][a];
      }
  return true;
}

static bool
at_bound (const df_placer *pl, const double x[2], int a)
{
  if (a == 0 && pl->u_periodic)
    return false;
  return x[a] <= pl->lo[a] || x[a] >= pl->hi[a];
}

static bool
finish (const df_placer *pl, const double ans[2], bool *at_edge)
{
  for (int a = 0; a < (pl->revolution ? 1 : 2); a++)
    *at_edge = *at_edge || at_bound (pl, ans, a);
  return true;
}

/* Safeguarded Newton from st (whose jet must be valid at st->x) towards the closest point to q.
 * Full Newton where the Hessian is positive definite, else Gauss-Newton, else a scaled
 * gradient step; each step capped, clamped to the box (a coordinate at a bound whose descent
 * leaves the box is held: an active set), and halved until the distance does not grow.
 * On return st holds the last evaluated point and ans the answer (st->x plus a final step
 * below STEP_DONE). True when converged; *at_edge when the answer lies on the domain's edge. */
static bool
newton (const df_placer *pl, const double q[3], point_state *st, int max_steps, double ans[2],
        bool *at_edge)
{
  int dims = pl->revolution ? 1 : 2;
  bool converged = false;

  *at_edge = false;
  for (int it = 0; it < max_steps && !converged; it++)
    {
      double g[2], h[2][2], gn[2][2], step[2];
      bool free_[2] = { true, false }, full, small = true, any_free = false, accepted = false;
      double t = 1.0;

      objective (&st->jet, q, &st->f, g, h, gn);
      for (int a = 0; a < dims; a++)
        {
          free_[a] = !((a != 0 || !pl->u_periodic)
                       && ((st->x[a] <= pl->lo[a] && g[a] > 0)
                           || (st->x[a] >= pl->hi[a] && g[a] < 0)));
          any_free = any_free || free_[a];
        }
      if (!any_free)
        {
          /* Held on a corner: that is the answer. */
          ans[0] = st->x[0];
          ans[1] = st->x[1];
          converged = true;
          break;
        }
      full = solve_free (h, g, free_, step);
      if (!full && !solve_free (gn, g, free_, step))
        {
          double sc = fabs (h[0][0]) + (dims == 2 ? fabs (h[1][1]) : 0.0) + 1e-300;

          for (int a = 0; a < 2; a++)
            step[a] = free_[a] ? -g[a] / sc : 0.0;
        }
      for (int a = 0; a < 2; a++)
        {
          double cap = STEP_CAP * pl->span[a];

          if (!isfinite (step[a]))
            step[a] = 0.0;
          step[a] = clamp (step[a], -cap, cap);
          small = small && fabs (step[a]) <= STEP_DONE * pl->span[a];
        }
      if (small && full)
        {
          double e[3];

          for (int a = 0; a < 2; a++)
            ans[a] = (a == 0 && pl->u_periodic) ? st->x[a] + step[a]
                                                : clamp (st->x[a] + step[a], pl->lo[a], pl->hi[a]);
          /* The distance at the answer to first order: for a point on the surface the last
           * step is all that is left of it. */
          for (int k = 0; k < 3; k++)
            e[k] = st->jet.x[k] - q[k] + st->jet.d1[0][k] * (ans[0] - st->x[0])
                   + st->jet.d1[1][k] * (ans[1] - st->x[1]);
          st->fa = e[0] * e[0] + e[1] * e[1] + e[2] * e[2];
          return finish (pl, ans, at_edge);
        }
      for (int k = 0; k < 30; k++, t *= 0.5)
        {
          point_state tr;
          double f2, g2[2], h2[2][2], gn2[2][2];

          for (int a = 0; a < 2; a++)
            tr.x[a] = (a == 0 && pl->u_periodic) ? st->x[a] + t * step[a]
                                                 : clamp (st->x[a] + t * step[a], pl->lo[a],
                                                          pl->hi[a]);
          if (tr.x[0] == st->x[0] && tr.x[1] == st->x[1])
            break;
          if (df_surface_eval (pl->s, tr.x[0], tr.x[1], 2, &tr.jet, NULL) != DF_OK)
            continue;
          objective (&tr.jet, q, &f2, g2, h2, gn2);
          if (f2 <= st->f)
            {
              small = true;
              for (int a = 0; a < 2; a++)
                small = small && fabs (tr.x[a] - st->x[a]) <= STEP_DONE * pl->span[a];
              tr.f = f2;
              *st = tr;
              accepted = true;
              break;
            }
        }
      if (!accepted || small)
        {
          /* No decrease, or a gradient or clamped step that no longer moves: converged when
           * the step asked for was already at the level of rounding. */
          converged = accepted || fabs (step[0]) <= 1e-6 * pl->span[0];
          if (dims == 2)
            converged = converged && (accepted || fabs (step[1]) <= 1e-6 * pl->span[1]);
          ans[0] = st->x[0];
          ans[1] = st->x[1];
          break;
        }
    }
  if (!converged)
    {
      ans[0] = st->x[0];
      ans[1] = st->x[1];
    }
  st->fa = st->f;
  finish (pl, ans, at_edge);
  return converged;
}

static bool build_buckets (df_placer *pl);

static bool
build_seeds (df_placer *pl)
{
  size_t k = 0;

  pl->seeds_n[0] = pl->revolution ? SEEDS_1D : SEEDS_2D;
  pl->seeds_n[1] = pl->revolution ? 1 : SEEDS_2D;
  pl->n_seeds = (size_t) pl->seeds_n[0] * (size_t) pl->seeds_n[1];
  pl->seed_uv = malloc (pl->n_seeds * sizeof *pl->seed_uv);
  pl->seed_x = malloc (pl->n_seeds * sizeof *pl->seed_x);
  pl->seed_d2 = malloc (pl->n_seeds * sizeof *pl->seed_d2);
  if (!pl->seed_uv || !pl->seed_x || !pl->seed_d2)
    return false;
  for (int a = 0; a < pl->seeds_n[0]; a++)
    for (int b = 0; b < pl->seeds_n[1]; b++, k++)
      {
        df_chart_jet j;
        double uu = pl->lo[0] + pl->span[0] * a / (pl->seeds_n[0] - 1);
        double vv = pl->revolution ? 0.0 : pl->lo[1] + pl->span[1] * b / (pl->seeds_n[1] - 1);

        pl->seed_uv[k][0] = uu;
        pl->seed_uv[k][1] = vv;
        if (df_surface_eval (pl->s, uu, vv, 0, &j, NULL) == DF_OK)
          memcpy (pl->seed_x[k], j.x, sizeof j.x);
        else
          pl->seed_x[k][0] = NAN;  /* never chosen: its distance is not finite */
      }
  pl->seeds_built = true;
  return build_buckets (pl);
}

static size_t
bucket_of (const df_placer *pl, const double x[3])
{
  size_t b = 0;

  for (int k = 0; k < 3; k++)
    {
      int i = (int) floor ((x[k] - pl->bucket_lo[k]) / pl->bucket_cell);

      i = i < 0 ? 0 : i >= pl->bucket_n[k] ? pl->bucket_n[k] - 1 : i;
      b = b * (size_t) pl->bucket_n[k] + (size_t) i;
    }
  return b;
}

/* Buckets about twice the mean seed spacing wide, at most 8 per seed in all. */
static bool
build_buckets (df_placer *pl)
{
  double hi[3], spacing = 0.0;
  size_t n_pairs = 0, total = 1;

  for (int k = 0; k < 3; k++)
    {
      pl->bucket_lo[k] = INFINITY;
      hi[k] = -INFINITY;
    }
  for (size_t i = 0; i < pl->n_seeds; i++)
    {
      if (!isfinite (pl->seed_x[i][0]))
        continue;
      for (int k = 0; k < 3; k++)
        {
          pl->bucket_lo[k] = fmin (pl->bucket_lo[k], pl->seed_x[i][k]);
          hi[k] = fmax (hi[k], pl->seed_x[i][k]);
        }
      if (i + 1 < pl->n_seeds && isfinite (pl->seed_x[i + 1][0]))
        {
          spacing += sqrt (dist2 (pl->seed_x[i], pl->seed_x[i + 1]));
          n_pairs++;
        }
    }
  if (!isfinite (pl->bucket_lo[0]))
    for (int k = 0; k < 3; k++)
      pl->bucket_lo[k] = hi[k] = 0.0;
  pl->bucket_cell = n_pairs > 0 && spacing > 0 ? 2 * spacing / n_pairs : 1.0;
  for (int pass = 0; pass < 2; pass++)
    {
      total = 1;
      for (int k = 0; k < 3; k++)
        {
          double cells = floor ((hi[k] - pl->bucket_lo[k]) / pl->bucket_cell) + 1;

          pl->bucket_n[k] = cells > 1024 ? 1024 : (int) cells;
          total *= (size_t) pl->bucket_n[k];
        }
      if (total <= 8 * pl->n_seeds)
        break;
      pl->bucket_cell *= cbrt ((double) total / (8.0 * pl->n_seeds)) * 1.01;
    }
  pl->bucket_start = calloc (total + 1, sizeof *pl->bucket_start);
  pl->bucket_item = malloc (pl->n_seeds * sizeof *pl->bucket_item);
  if (!pl->bucket_start || !pl->bucket_item)
    return false;
  for (size_t i = 0; i < pl->n_seeds; i++)
    if (isfinite (pl->seed_x[i][0]))
      pl->bucket_start[bucket_of (pl, pl->seed_x[i]) + 1]++;
  for (size_t b = 0; b < total; b++)
    pl->bucket_start[b + 1] += pl->bucket_start[b];
  for (size_t i = 0; i < pl->n_seeds; i++)
    if (isfinite (pl->seed_x[i][0]))
      {
        size_t b = bucket_of (pl, pl->seed_x[i]);

        /* bucket_start[b] runs ahead while filling and is shifted back below. */
        pl->bucket_item[pl->bucket_start[b]++] = i;
      }
  for (size_t b = total; b > 0; b--)
    pl->bucket_start[b] = pl->bucket_start[b - 1];
  pl->bucket_start[0] = 0;
  return true;
}

/* Does a seed lie closer to q than r? Every surface point is at least the closest distance
 * from q, so a true answer never triggers this; a wrong basin does once it is worse than the
 * true closest point by more than the seed spacing (a seed lies that near the true foot). */
static bool
seed_closer_than (const df_placer *pl, const double q[3], double r)
{
  int lo[3], hi[3];
  size_t visits = 1;

  for (int k = 0; k < 3; k++)
    {
      lo[k] = (int) floor ((q[k] - r - pl->bucket_lo[k]) / pl->bucket_cell);
      hi[k] = (int) floor ((q[k] + r - pl->bucket_lo[k]) / pl->bucket_cell);
      if (hi[k] < 0 || lo[k] >= pl->bucket_n[k])
        return false;
      lo[k] = lo[k] < 0 ? 0 : lo[k];
      hi[k] = hi[k] >= pl->bucket_n[k] ? pl->bucket_n[k] - 1 : hi[k];
      visits *= (size_t) (hi[k] - lo[k] + 1);
    }
  if (visits > pl->n_seeds / 4)
    {
      /* A ball that covers much of the box: a plain scan is cheaper. */
      for (size_t i = 0; i < pl->n_seeds; i++)
        if (dist2 (pl->seed_x[i], q) < r * r)
          return true;
      return false;
    }
  for (int a = lo[0]; a <= hi[0]; a++)
    for (int b = lo[1]; b <= hi[1]; b++)
      for (int c = lo[2]; c <= hi[2]; c++)
        {
          size_t cell = ((size_t) a * pl->bucket_n[1] + (size_t) b) * pl->bucket_n[2] + c;

          for (size_t m = pl->bucket_start[cell]; m < pl->bucket_start[cell + 1]; m++)
            if (dist2 (pl->seed_x[pl->bucket_item[m]], q) < r * r)
              return true;
        }
  return false;
}

/* Is seed k no farther than its grid neighbours (a sampled basin)? */
static bool
seed_is_local_min (const df_placer *pl, size_t k)
{
  int n0 = pl->seeds_n[0], n1 = pl->seeds_n[1];
  int a = (int) (k / (size_t) n1), b = (int) (k % (size_t) n1);

  for (int da = -1; da <= 1; da++)
    for (int db = -1; db <= 1; db++)
      {
        int aa = a + da, bb = b + db;

        if ((da == 0 && db == 0) || bb < 0 || bb >= n1)
          continue;
        if (aa < 0 || aa >= n0)
          {
            if (!pl->u_periodic)
              continue;
            aa = (aa + n0) % n0;
          }
        if (pl->seed_d2[(size_t) aa * n1 + bb] < pl->seed_d2[k])
          return false;
      }
  return true;
}

/* From scratch: Newton from the best N_BASINS sampled basins (and, on a graph, from the point
 * straight above or below q); the best converged answer wins. */
static df_status
search (df_placer *pl, const double q[3], point_state *best, double ans[2], df_diag *diag)
{
  size_t cand[N_BASINS + 1];
  int n_cand = 0;
  bool found = false;

  if (!pl->seeds_built && !build_seeds (pl))
    return df_diag_fail (diag, DF_E_NOMEM, -1, "no memory for the seed grid");
  for (size_t k = 0; k < pl->n_seeds; k++)
    {
      double d = dist2 (pl->seed_x[k], q);

      pl->seed_d2[k] = isfinite (d) ? d : INFINITY;
    }
  for (size_t k = 0; k < pl->n_seeds; k++)
    {
      int pos;

      if (!isfinite (pl->seed_d2[k]) || !seed_is_local_min (pl, k))
        continue;
      /* Insertion into the short list, best first. */
      pos = n_cand < N_BASINS ? n_cand++ : N_BASINS;
      if (pos == N_BASINS && pl->seed_d2[k] >= pl->seed_d2[cand[N_BASINS - 1]])
        continue;
      if (pos == N_BASINS)
        pos = N_BASINS - 1;
      while (pos > 0 && pl->seed_d2[cand[pos - 1]] > pl->seed_d2[k])
        {
          cand[pos] = cand[pos - 1];
          pos--;
        }
      cand[pos] = k;
    }

  for (int c = 0; c <= n_cand; c++)
    {
      point_state st;
      double a[2];
      bool edge;

      if (c < n_cand)
        {
          st.x[0] = pl->seed_uv[cand[c]][0];
          st.x[1] = pl->seed_uv[cand[c]][1];
        }
      else if (!pl->revolution)
        {
          st.x[0] = clamp (q[0], pl->lo[0], pl->hi[0]);
          st.x[1] = clamp (q[1], pl->lo[1], pl->hi[1]);
        }
      else
        break;
      if (df_surface_eval (pl->s, st.x[0], st.x[1], 2, &st.jet, NULL) != DF_OK)
        continue;
      newton (pl, q, &st, SEARCH_STEPS, a, &edge);
      if (!found || st.fa < best->fa)
        {
          *best = st;
          ans[0] = a[0];
          ans[1] = a[1];
          found = true;
        }
    }
  if (!found)
    return df_diag_fail (diag, DF_E_NOCONVERGE, -1, "no surface point could be evaluated");
  return DF_OK;
}

df_placer *
df_placer_new (const df_surface *s)
{
  df_placer *pl = calloc (1, sizeof *pl);

  if (pl == NULL)
    return NULL;
  pl->s = s;
  pl->revolution = df_surface_get_kind (s) == DF_SURFACE_REVOLUTION;
  pl->u_periodic = df_surface_u_periodic (s);
  df_surface_get_domain (s, &pl->lo[0], &pl->hi[0], &pl->lo[1], &pl->hi[1]);
  if (pl->revolution)
    pl->lo[1] = pl->hi[1] = 0.0;
  for (int a = 0; a < 2; a++)
    pl->span[a] = pl->hi[a] - pl->lo[a] > 0 ? pl->hi[a] - pl->lo[a] : 1.0;
  pl->size = df_surface_size (s);
  return pl;
}

void
df_placer_free (df_placer *pl)
{
  if (pl == NULL)
    return;
  free (pl->seed_uv);
  free (pl->seed_x);
  free (pl->seed_d2);
  free (pl->bucket_start);
  free (pl->bucket_item);
  free (pl);
}

void
df_placer_reset (df_placer *pl)
{
  pl->have_prev = false;
}

void
df_placer_get_counts (const df_placer *pl, size_t *continued, size_t *searched)
{
  if (continued)
    *continued = pl->n_continued;
  if (searched)
    *searched = pl->n_searched;
}

df_status
df_placer_place (df_placer *pl, const double p[3], double max_dist, double *u, double *v,
                 double *dist, df_diag *diag)
{
  double q[3], phi = 0.0, ans[2] = { 0, 0 }, d;
  point_state st;
  bool ok = false;

  df_diag_clear (diag);
  if (!isfinite (p[0]) || !isfinite (p[1]) || !isfinite (p[2]))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the point is not finite");
  if (pl->revolution)
    {
      /* Work in the meridian half-plane phi = 0: q = (rho, 0, z). */
      phi = (p[0] == 0 && p[1] == 0) ? 0.0 : atan2 (p[1], p[0]);
      q[0] = hypot (p[0], p[1]);
      q[1] = 0.0;
      q[2] = p[2];
    }
  else
    memcpy (q, p, sizeof q);

  if (pl->have_prev)
    {
      double moved = sqrt (dist2 (q, pl->prev_q));
      bool edge;

      st.x[0] = pl->x[0];
      st.x[1] = pl->x[1];
      st.jet = pl->jet;
      ok = newton (pl, q, &st, CONTINUE_STEPS, ans, &edge) && !edge;
      d = sqrt (st.fa);
      /* The distance to a surface is 1-Lipschitz in the point: farther than the previous
       * distance plus the move is certainly not the closest point. Growing past twice the
       * previous distance (beyond a tenth of the move, so noise on a scan does not trigger it)
       * is the sign of a basin left behind. */
      if (d > pl->prev_dist + moved * (1 + 1e-9) + 1e-12 * pl->size
          || d > 2 * pl->prev_dist + 0.1 * moved + 1e-9 * pl->size)
        ok = false;
      /* A seed nearer than the answer: another basin is closer. */
      if (ok && pl->bucket_start != NULL && d > 1e-12 * pl->size
          && seed_closer_than (pl, q, d * (1 - 1e-9)))
        ok = false;
    }
  if (ok)
    pl->n_continued++;
  else
    {
      point_state found;
      double a[2] = { 0, 0 };
      df_status s;

      pl->n_searched++;
      s = search (pl, q, &found, a, diag);
      if (s != DF_OK && !pl->have_prev)
        return s;
      if (s == DF_OK && (!pl->have_prev || found.fa < st.fa))
        {
          st = found;
          ans[0] = a[0];
          ans[1] = a[1];
        }
    }

  d = sqrt (st.fa);
  if (!isfinite (d))
    return df_diag_fail (diag, DF_E_NOCONVERGE, -1, "the distance to the surface is not finite");
  pl->have_prev = true;
  memcpy (pl->prev_q, q, sizeof q);
  pl->prev_dist = d;
  pl->x[0] = st.x[0];
  pl->x[1] = st.x[1];
  pl->jet = st.jet;

  if (pl->u_periodic)
    ans[0] = pl->lo[0] + (ans[0] - pl->lo[0]) - pl->span[0] * floor ((ans[0] - pl->lo[0])
                                                                    / pl->span[0]);
  *u = ans[0];
  *v = pl->revolution ? phi : ans[1];
  *dist = d;
  if (max_dist > 0 && d > max_dist)
    return df_diag_fail_at (diag, DF_E_DOMAIN, -1, *u, *v,
                            "the point (%.6g, %.6g, %.6g) is %.3g from the surface (more than "
                            "%.3g)", p[0], p[1], p[2], d, max_dist);
  return DF_OK;
}

df_status
df_surface_project (const df_surface *s, const double p[3], double max_dist, double *u,
                    double *v, double *dist, df_diag *diag)
{
  df_placer *pl;
  df_status st;

  df_diag_clear (diag);
  if (!isfinite (p[0]) || !isfinite (p[1]) || !isfinite (p[2]))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the point is not finite");
  pl = df_placer_new (s);
  if (pl == NULL)
    return df_diag_fail (diag, DF_E_NOMEM, -1, "no memory for the search");
  st = df_placer_place (pl, p, max_dist, u, v, dist, diag);
  df_placer_free (pl);
  return st;
}
