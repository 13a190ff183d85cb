/* df-fit-scattered.c: a height map z = f(x, y) fitted to scattered points: a tensor product of
 * quintic B-splines over the points' bounding box, by penalised least squares with the
 * difference penalty lambda (Dx'Dx (x) I + I (x) Dy'Dy).
 * Solver: with the coefficients in lexicographic order the normal matrix is banded, half-width
 * degree x (count_y + 1), so GSL's banded Cholesky factors it directly. For the knot counts
 * scattered data support here (at most 40 spans a side) that is cheaper than a general sparse
 * factorisation and keeps df_numeric on GSL alone; CHOLMOD (SuiteSparse) would be the choice
 * beyond that. The domain is the bounding box minus the knot cells without a point: a loop
 * there is refused. GCV's tr H is estimated by Hutchinson's method (8 fixed +-1 probes).
 * Plain C + libm + GSL; no GLib. */
#include "df-fit-private.h"

#include <gsl/gsl_linalg.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "df-bspline.h"

#define MAX_SPANS 40
#define PROBES    8

typedef struct
{
  df_bspline     bx, by;
  double        *theta;     /* count_x x count_y */
  unsigned char *covered;   /* spans_x x spans_y: a data point lies in the cell */
  df_fit_info    info;
} scat_data;

static df_status
scat_eval (const void *data, double x, double y, int order, df_fn_jet out, df_diag *diag)
{
  const scat_data *g = data;
  double vx[4][DF_BSPLINE_MAX_DEGREE + 1], vy[4][DF_BSPLINE_MAX_DEGREE + 1];
  double t[4][DF_BSPLINE_MAX_DEGREE + 1];
  int fx = df_bspline_eval_basis (&g->bx, x, order, vx);
  int fy = df_bspline_eval_basis (&g->by, y, order, vy);
  int my = df_bspline_count (&g->by), p = g->bx.degree;
  static const int kx[DF_JET_N] = { 0, 1, 0, 2, 1, 0, 3, 2, 1, 0 };
  static const int ky[DF_JET_N] = { 0, 0, 1, 0, 1, 2, 0, 1, 2, 3 };
  static const int count[4] = { 1, 3, 6, 10 };

  (void) diag;
  for (int k = 0; k <= order; k++)
    for (int a = 0; a <= p; a++)
      {
        const double *row = g->theta + (size_t) (fx + a) * my + fy;
        double sum = 0.0;

        for (int b = 0; b <= g->by.degree; b++)
          sum += row[b] * vy[k][b];
        t[k][a] = sum;
      }
  for (int i = 0; i < count[order]; i++)
    {
      double sum = 0.0;

      for (int a = 0; a <= p; a++)
        sum += vx[kx[i]][a] * t[ky[i]][a];
      out[0][i] = sum;
    }
  return DF_OK;
}

static bool
scat_contains (const void *data, double x, double y)
{
  const scat_data *g = data;
  int i = (int) fmin (fmax (floor ((x - g->bx.a) / g->bx.h), 0.0), g->bx.spans - 1);
  int j = (int) fmin (fmax (floor ((y - g->by.a) / g->by.h), 0.0), g->by.spans - 1);

  return isfinite (x) && isfinite (y) && g->covered[(size_t) i * g->by.spans + j];
}

static void
scat_free (void *data)
{
  scat_data *g = data;

  if (g == NULL)
    return;
  free (g->theta);
  free (g->covered);
  free (g);
}

static void *
scat_copy (const void *data)
{
  const scat_data *g = data;
  scat_data *c = malloc (sizeof *c);
  size_t n = (size_t) df_bspline_count (&g->bx) * (size_t) df_bspline_count (&g->by);
  size_t cells = (size_t) g->bx.spans * (size_t) g->by.spans;

  if (c == NULL)
    return NULL;
  *c = *g;
  c->theta = malloc (sizeof (double) * n);
  c->covered = malloc (cells);
  if (c->theta == NULL || c->covered == NULL)
    {
      scat_free (c);
      return NULL;
    }
  memcpy (c->theta, g->theta, sizeof (double) * n);
  memcpy (c->covered, g->covered, cells);
  return c;
}

static double
scat_piece_width (const void *data, int axis)
{
  const scat_data *g = data;

  return axis == 0 ? g->bx.h : g->by.h;
}

const df_fn_type _df_fit_scattered_type = {
  "scattered height spline", scat_eval, scat_contains, scat_copy, scat_free, scat_piece_width
};

const df_fit_info *
_df_fit_scattered_info (const void *data)
{
  return &((const scat_data *) data)->info;
}

typedef struct
{
  scat_data     *g;
  size_t         n;
  const double (*xyz)[3];
  gsl_matrix    *gram;      /* B'B in band form, built once */
  gsl_vector    *rhs0;      /* B'z */
  gsl_matrix    *work;
  gsl_vector    *sol;
  double         scale;
  int            bw;
} scat_ctx;

static void
add_band (gsl_matrix *ab, int i, int j, double v)
{
  if (j < i)
    {
      int t = i;

      i = j;
      j = t;
    }
  *gsl_matrix_ptr (ab, (size_t) i, (size_t) (j - i)) += v;
}

/* lambda (Dx'Dx (x) I + I (x) Dy'Dy), third differences. */
static void
add_penalty2 (gsl_matrix *ab, const scat_data *g, double lambda)
{
  static const double d[4] = { -1.0, 3.0, -3.0, 1.0 };
  int mx = df_bspline_count (&g->bx), my = df_bspline_count (&g->by);

  for (int b = 0; b < my; b++)
    for (int r = 0; r + 3 < mx; r++)
      for (int i = 0; i <= 3; i++)
        for (int j = i; j <= 3; j++)
          add_band (ab, (r + i) * my + b, (r + j) * my + b, lambda * d[i] * d[j]);
  for (int a = 0; a < mx; a++)
    for (int r = 0; r + 3 < my; r++)
      for (int i = 0; i <= 3; i++)
        for (int j = i; j <= 3; j++)
          add_band (ab, a * my + r + i, a * my + r + j, lambda * d[i] * d[j]);
}

static df_status
scat_trial (void *ctx, double lambda, int want_gcv, double *rms, double *gcv, df_diag *diag)
{
  scat_ctx *c = ctx;
  scat_data *g = c->g;
  int mx = df_bspline_count (&g->bx), my = df_bspline_count (&g->by), N = mx * my;
  double sum = 0.0, tr = 0.0, dof;

  gsl_matrix_memcpy (c->work, c->gram);
  add_penalty2 (c->work, g, lambda * c->scale);
  if (gsl_linalg_cholesky_band_decomp (c->work) != 0)
    return df_diag_fail (diag, DF_E_SINGULAR, -1, "the scattered fit is not determined");
  gsl_vector_memcpy (c->sol, c->rhs0);
  gsl_linalg_cholesky_band_svx (c->work, c->sol);
  for (int k = 0; k < N; k++)
    g->theta[k] = gsl_vector_get (c->sol, (size_t) k);
  for (size_t i = 0; i < c->n; i++)
    {
      df_fn_jet out;
      double e;

      scat_eval (g, c->xyz[i][0], c->xyz[i][1], 0, out, NULL);
      e = c->xyz[i][2] - out[0][0];
      sum += e * e;
    }
  *rms = sqrt (sum / (double) c->n);
  if (want_gcv)
    {
      /* tr(A^-1 G) ~ mean of z' A^-1 G z over +-1 probes z (Hutchinson 1989). */
      unsigned long long s = 0x9e3779b97f4a7c15ULL;
      gsl_vector *z = gsl_vector_alloc ((size_t) N), *gz = gsl_vector_alloc ((size_t) N);

      for (int p = 0; p < PROBES; p++)
        {
          double acc = 0.0;

          for (int k = 0; k < N; k++)
            {
              s = s * 6364136223846793005ULL + 1442695040888963407ULL;
              gsl_vector_set (z, (size_t) k, (s >> 63) ? 1.0 : -1.0);
            }
          gsl_vector_set_zero (gz);
          for (int i = 0; i < N; i++)
            for (int j = i; j < N && j - i <= c->bw; j++)
              {
                double v = gsl_matrix_get (c->gram, (size_t) i, (size_t) (j - i));

                if (v == 0.0)
                  continue;
                *gsl_vector_ptr (gz, (size_t) i) += v * gsl_vector_get (z, (size_t) j);
                if (j != i)
                  *gsl_vector_ptr (gz, (size_t) j) += v * gsl_vector_get (z, (size_t) i);
              }
          gsl_linalg_cholesky_band_svx (c->work, gz);
          for (int k = 0; k < N; k++)
            acc += gsl_vector_get (z, (size_t) k) * gsl_vector_get (gz, (size_t) k);
          tr += acc / PROBES;
        }
      gsl_vector_free (z);
      gsl_vector_free (gz);
    }
  dof = fmax ((double) c->n - tr, 1.0);
  *gcv = (double) c->n * (double) c->n * (*rms) * (*rms) / (dof * dof);
  return DF_OK;
}

df_status
_df_fit_scattered (const double (*xyz)[3], size_t n, const double lo[2], const double hi[2],
                   double tolerance, df_fn **out, df_fit_info *info, df_diag *diag)
{
  scat_ctx c = { 0 };
  scat_data *g = calloc (1, sizeof *g);
  double lambda, dom[4], cells_per_side = fmin (fmax (sqrt ((double) n) / 3.0, 4.0), MAX_SPANS);
  df_status st = DF_OK;
  int mx, my, N, p = 5;

  *out = NULL;
  if (g == NULL)
    return DF_E_NOMEM;
  {
    double aspect = (hi[0] - lo[0]) / (hi[1] - lo[1]);
    int sx = (int) fmin (fmax (round (cells_per_side * sqrt (aspect)), 4.0), MAX_SPANS);
    int sy = (int) fmin (fmax (round (cells_per_side / sqrt (aspect)), 4.0), MAX_SPANS);

    g->bx = (df_bspline) { p, sx, lo[0], (hi[0] - lo[0]) / sx };
    g->by = (df_bspline) { p, sy, lo[1], (hi[1] - lo[1]) / sy };
  }
  mx = df_bspline_count (&g->bx);
  my = df_bspline_count (&g->by);
  N = mx * my;
  c.bw = p * my + p;
  c.g = g;
  c.n = n;
  c.xyz = xyz;
  g->theta = calloc ((size_t) N, sizeof (double));
  g->covered = calloc ((size_t) g->bx.spans * (size_t) g->by.spans, 1);
  c.gram = gsl_matrix_calloc ((size_t) N, (size_t) c.bw + 1);
  c.work = gsl_matrix_alloc ((size_t) N, (size_t) c.bw + 1);
  c.rhs0 = gsl_vector_calloc ((size_t) N);
  c.sol = gsl_vector_alloc ((size_t) N);
  if (g->theta == NULL || g->covered == NULL || !c.gram || !c.work || !c.rhs0 || !c.sol)
    {
      st = DF_E_NOMEM;
      goto out;
    }
  for (size_t i = 0; i < n; i++)
    {
      double vx[4][DF_BSPLINE_MAX_DEGREE + 1], vy[4][DF_BSPLINE_MAX_DEGREE + 1];
      double w[36];
      int fx = df_bspline_eval_basis (&g->bx, xyz[i][0], 0, vx);
      int fy = df_bspline_eval_basis (&g->by, xyz[i][1], 0, vy);
      int ci = (int) fmin (floor ((xyz[i][0] - g->bx.a) / g->bx.h), g->bx.spans - 1);
      int cj = (int) fmin (floor ((xyz[i][1] - g->by.a) / g->by.h), g->by.spans - 1);

      g->covered[(size_t) ci * g->by.spans + cj] = 1;
      for (int a = 0; a <= p; a++)
        for (int b = 0; b <= p; b++)
          w[a * 6 + b] = vx[0][a] * vy[0][b];
      for (int k = 0; k < 36; k++)
        {
          int ik = (fx + k / 6) * my + fy + k % 6;

          *gsl_vector_ptr (c.rhs0, (size_t) ik) += w[k] * xyz[i][2];
          for (int l = 0; l < 36; l++)
            {
              int il = (fx + l / 6) * my + fy + l % 6;

              if (il >= ik)
                *gsl_matrix_ptr (c.gram, (size_t) ik, (size_t) (il - ik)) += w[k] * w[l];
            }
        }
    }
  {
    double trg = 0.0;

    for (int k = 0; k < N; k++)
      trg += gsl_matrix_get (c.gram, (size_t) k, 0);
    c.scale = trg / (40.0 * N);
  }
  st = _df_fit_choose_lambda (scat_trial, &c, tolerance, &lambda, diag);
  if (st == DF_OK)
    {
      double rms, gcv;

      st = scat_trial (&c, lambda, 0, &rms, &gcv, diag);
    }
  if (st != DF_OK)
    goto out;
  {
    double sum = 0.0;

    g->info.max = 0.0;
    for (size_t i = 0; i < n; i++)
      {
        df_fn_jet o;
        double d;

        scat_eval (g, xyz[i][0], xyz[i][1], 1, o, NULL);
        d = fabs (xyz[i][2] - o[0][0]) / sqrt (1.0 + o[0][1] * o[0][1] + o[0][2] * o[0][2]);
        if (!isfinite (d))
          {
            st = df_diag_fail (diag, DF_E_NONFINITE, (long) i, "the scattered fit is not "
                               "finite there");
            goto out;
          }
        sum += d * d;
        if (d >= g->info.max)
          {
            g->info.max = d;
            memcpy (g->info.max_at, xyz[i], sizeof g->info.max_at);
          }
      }
    g->info.points = n;
    g->info.rms = sqrt (sum / (double) n);
  }
  g->info.lambda = lambda;
  g->info.chosen = tolerance < 0.0;
  g->info.tolerance = tolerance < 0.0 ? g->info.rms : tolerance;
  if (info)
    *info = g->info;
  dom[0] = lo[0];
  dom[1] = hi[0];
  dom[2] = lo[1];
  dom[3] = hi[1];
  *out = df_fn_new (&_df_fit_scattered_type, g, 2, 1, dom);
  g = NULL;
  if (*out == NULL)
    st = DF_E_NOMEM;
out:
  scat_free (g);
  gsl_matrix_free (c.gram);
  gsl_matrix_free (c.work);
  gsl_vector_free (c.rhs0);
  gsl_vector_free (c.sol);
  return st;
}
