/* df-fit-grid.c: a height map z = f(x, y) fitted to a full lattice of heights by a tensor
 * product of quintic P-splines, solved direction by direction: coefficients
 * Theta = Ax^-1 Bx^T Z By Ay^-1 with A = B^T B + lambda D^T D in each direction (the array
 * method of Currie, Durban & Eilers 2006 in its separable form; its smoother is the Kronecker
 * product of the two one-dimensional smoothers, so tr H = tr Hx tr Hy for GCV).
 * Plain C + libm + GSL; no GLib. */
#include "df-fit-private.h"

#include <gsl/gsl_linalg.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "df-bspline.h"

#define MIN_NODES 8

typedef struct
{
  df_bspline  bx, by;
  double     *theta;     /* count_x x count_y, row-major */
  df_fit_info info;
} grid_data;

static df_status
grid_eval (const void *data, double x, double y, int order, df_fn_jet out, df_diag *diag)
{
  const grid_data *g = data;
  double vx[4][DF_BSPLINE_MAX_DEGREE + 1], vy[4][DF_BSPLINE_MAX_DEGREE + 1];
  double t[4][DF_BSPLINE_MAX_DEGREE + 1];
  int fx = df_bspline_eval_basis (&g->bx, x, order, vx);
  int fy = df_bspline_eval_basis (&g->by, y, order, vy);
  int my = df_bspline_count (&g->by), p = g->bx.degree, q = g->by.degree;
  static const int kx[DF_JET_N] = { 0, 1, 0, 2, 1, 0, 3, 2, 1, 0 };
  static const int ky[DF_JET_N] = { 0, 0, 1, 0, 1, 2, 0, 1, 2, 3 };
  static const int count[4] = { 1, 3, 6, 10 };

  (void) diag;
  for (int k = 0; k <= order; k++)
    for (int a = 0; a <= p; a++)
      {
        const double *row = g->theta + (size_t) (fx + a) * my + fy;
        double sum = 0.0;

        for (int b = 0; b <= q; b++)
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

static void
grid_free (void *data)
{
  grid_data *g = data;

  if (g == NULL)
    return;
  free (g->theta);
  free (g);
}

static void *
grid_copy (const void *data)
{
  const grid_data *g = data;
  grid_data *c = malloc (sizeof *c);
  size_t n = (size_t) df_bspline_count (&g->bx) * (size_t) df_bspline_count (&g->by);

  if (c == NULL)
    return NULL;
  *c = *g;
  c->theta = malloc (sizeof (double) * n);
  if (c->theta == NULL)
    {
      free (c);
      return NULL;
    }
  memcpy (c->theta, g->theta, sizeof (double) * n);
  return c;
}

static double
grid_piece_width (const void *data, int axis)
{
  const grid_data *g = data;

  return axis == 0 ? g->bx.h : g->by.h;
}

const df_fn_type _df_fit_grid_type = { "height spline", grid_eval, NULL, grid_copy, grid_free,
                                       grid_piece_width };

const df_fit_info *
_df_fit_grid_info (const void *data)
{
  return &((const grid_data *) data)->info;
}

/* ---- the lattice ---- */

static int
cmp_double (const void *a, const void *b)
{
  double x = *(const double *) a, y = *(const double *) b;

  return x < y ? -1 : x > y;
}

/* Distinct values of column col (within tol), sorted; returns their number. */
static size_t
distinct (const double (*xyz)[3], size_t n, int col, double tol, double *out)
{
  size_t m = 0;

  for (size_t i = 0; i < n; i++)
    out[i] = xyz[i][col];
  qsort (out, n, sizeof (double), cmp_double);
  for (size_t i = 0; i < n; i++)
    if (m == 0 || out[i] - out[m - 1] > tol)
      out[m++] = out[i];
  return m;
}

static size_t
find_value (const double *v, size_t m, double x)
{
  size_t lo = 0, hi = m - 1;

  while (lo < hi)
    {
      size_t mid = (lo + hi) / 2;

      if (v[mid] + 0.5 * (v[mid + 1] - v[mid]) < x)
        lo = mid + 1;
      else
        hi = mid;
    }
  return lo;
}

typedef struct
{
  grid_data *g;
  size_t     nx, ny;
  double    *xs, *ys, *z;  /* nodes and heights z[i * ny + j] */
  double    *w;            /* work: ny x count_x */
  double    *v;            /* work: count_x x count_y */
  double    *u;            /* work: nx x count_y */
  int       *by_first;     /* the y basis at each ys[j], computed once */
  double    *by_val;
  double     scale_x, scale_y;
} grid_ctx;

/* Theta for one lambda; tr Hx tr Hy in *trace when asked. */
static df_status
grid_solve (grid_ctx *c, double lambda, double *trace, df_diag *diag)
{
  grid_data *g = c->g;
  int mx = df_bspline_count (&g->bx), my = df_bspline_count (&g->by);
  double trx = 0.0, try_ = 0.0, v[4][DF_BSPLINE_MAX_DEGREE + 1];
  gsl_matrix *ax = df_bspline_factor (&g->bx, c->nx, c->xs, lambda * c->scale_x,
                                      trace ? &trx : NULL);
  gsl_matrix *ay = df_bspline_factor (&g->by, c->ny, c->ys, lambda * c->scale_y,
                                      trace ? &try_ : NULL);

  if (ax == NULL || ay == NULL)
    {
      gsl_matrix_free (ax);
      gsl_matrix_free (ay);
      return df_diag_fail (diag, DF_E_SINGULAR, -1, "the height fit is not determined");
    }
  /* Both solves run on contiguous rows: GSL's band solve walks one vector, and a column of
   * a row-major matrix (the earlier layout) put every element of it in another cache line:
   * that strided walk was half the time of a 1000 x 1000 fit.
   * W^T = Z^T Bx (ny x count_x), each row j then solved with Ax. */
  memset (c->w, 0, sizeof (double) * (size_t) mx * c->ny);
  for (size_t i = 0; i < c->nx; i++)
    {
      int f = df_bspline_eval_basis (&g->bx, c->xs[i], 0, v);
      const double *zr = c->z + i * c->ny;

      for (size_t j = 0; j < c->ny; j++)
        {
          double *wr = c->w + j * (size_t) mx + f;

          for (int m = 0; m <= g->bx.degree; m++)
            wr[m] += v[0][m] * zr[j];
        }
    }
  for (size_t j = 0; j < c->ny; j++)
    {
      gsl_vector_view row = gsl_vector_view_array (c->w + j * (size_t) mx, (size_t) mx);

      gsl_linalg_cholesky_band_svx (ax, &row.vector);
    }
  /* V = (Ax^-1 W) By (count_x x count_y), each row a then solved with Ay: Theta itself. */
  memset (c->v, 0, sizeof (double) * (size_t) mx * (size_t) my);
  for (size_t j = 0; j < c->ny; j++)
    {
      const double *bv = c->by_val + j * (DF_BSPLINE_MAX_DEGREE + 1);
      const double *wr = c->w + j * (size_t) mx;
      int f = c->by_first[j];

      for (int a = 0; a < mx; a++)
        {
          double *vr = c->v + (size_t) a * my + f, wa = wr[a];

          for (int m = 0; m <= g->by.degree; m++)
            vr[m] += bv[m] * wa;
        }
    }
  for (int a = 0; a < mx; a++)
    {
      gsl_vector_view row = gsl_vector_view_array (c->v + (size_t) a * my, (size_t) my);

      gsl_linalg_cholesky_band_svx (ay, &row.vector);
    }
  memcpy (g->theta, c->v, sizeof (double) * (size_t) mx * (size_t) my);
  gsl_matrix_free (ax);
  gsl_matrix_free (ay);
  if (trace)
    *trace = trx * try_;
  return DF_OK;
}

/* Fitted heights at the nodes, with the slopes when grad is set: U = Bx Theta (and Bx'),
 * then rows against By (and By'). Calls back per node. */
static void
grid_residuals (grid_ctx *c, bool normal, df_fit_info *info)
{
  grid_data *g = c->g;
  int my = df_bspline_count (&g->by), p = g->bx.degree, q = g->by.degree;
  double vx[4][DF_BSPLINE_MAX_DEGREE + 1], vy[4][DF_BSPLINE_MAX_DEGREE + 1], sum = 0.0;
  double *u1 = normal ? malloc (sizeof (double) * c->nx * (size_t) my) : NULL;

  normal = normal && u1 != NULL;
  for (size_t i = 0; i < c->nx; i++)
    {
      int f = df_bspline_eval_basis (&g->bx, c->xs[i], 1, vx);
      double *ur = c->u + i * (size_t) my, *u1r = normal ? u1 + i * (size_t) my : NULL;

      for (int b = 0; b < my; b++)
        {
          double s0 = 0.0, s1 = 0.0;

          for (int a = 0; a <= p; a++)
            {
              s0 += vx[0][a] * g->theta[(size_t) (f + a) * my + b];
              s1 += vx[1][a] * g->theta[(size_t) (f + a) * my + b];
            }
          ur[b] = s0;
          if (normal)
            u1r[b] = s1;
        }
    }
  info->max = 0.0;
  for (size_t i = 0; i < c->nx; i++)
    for (size_t j = 0; j < c->ny; j++)
        {
          int f = c->by_first[j];
          const double *ur = c->u + i * (size_t) my + f;
          double z = 0.0, zx = 0.0, zy = 0.0, d;

          if (normal)
            df_bspline_eval_basis (&g->by, c->ys[j], 1, vy);
          for (int b = 0; b <= q; b++)
            {
              z += ur[b] * c->by_val[j * (DF_BSPLINE_MAX_DEGREE + 1) + b];
              if (normal)
                zy += ur[b] * vy[1][b];
              if (normal)
                zx += u1[i * (size_t) my + f + b] * vy[0][b];
            }
          d = fabs (c->z[i * c->ny + j] - z);
          if (normal)
            d /= sqrt (1.0 + zx * zx + zy * zy);
          sum += d * d;
          if (d >= info->max)
            {
              info->max = d;
              info->max_at[0] = c->xs[i];
              info->max_at[1] = c->ys[j];
              info->max_at[2] = c->z[i * c->ny + j];
            }
        }
  free (u1);
  info->points = c->nx * c->ny;
  info->rms = sqrt (sum / (double) info->points);
}

/* The smoothing search uses the vertical distance (cheaper; within cos of the steepest slope
 * of the normal one); the report uses the normal distance. */
static df_status
grid_trial (void *ctx, double lambda, int want_gcv, double *rms, double *gcv, df_diag *diag)
{
  grid_ctx *c = ctx;
  double tr = 0.0, n = (double) (c->nx * c->ny), dof;
  df_fit_info info;
  df_status st = grid_solve (c, lambda, want_gcv ? &tr : NULL, diag);

  if (st != DF_OK)
    return st;
  grid_residuals (c, false, &info);
  *rms = info.rms;
  dof = fmax (n - tr, 1.0);
  *gcv = n * n * info.rms * info.rms / (dof * dof);
  return DF_OK;
}

static void
basis_for (df_bspline *b, const double *v, size_t m)
{
  b->degree = 5;
  b->spans = (int) fmin (fmax ((double) (m - 1) / 2.0, 4.0), 1000.0);
  b->a = v[0];
  b->h = (v[m - 1] - v[0]) / b->spans;
}

df_status
df_fit_grid (const double (*xyz)[3], size_t n, double tolerance, df_fn **out,
             df_fit_info *info, df_diag *diag)
{
  grid_ctx c = { 0 };
  grid_data *g = NULL;
  double lo[2] = { INFINITY, INFINITY }, hi[2] = { -INFINITY, -INFINITY }, lambda, dom[4];
  long *owner = NULL;
  df_status st = DF_OK;
  int mx, my;

  *out = NULL;
  df_diag_clear (diag);
  if (n < (size_t) MIN_NODES * MIN_NODES)
    return df_diag_fail (diag, DF_E_INPUT, -1, "%zu height points: a quintic height map needs a "
                         "grid of at least %d x %d", n, MIN_NODES, MIN_NODES);
  for (size_t i = 0; i < n; i++)
    {
      for (int k = 0; k < 3; k++)
        if (!isfinite (xyz[i][k]))
          return df_diag_fail (diag, DF_E_INPUT, (long) i, "%c is not a finite number",
                               "xyz"[k]);
      for (int k = 0; k < 2; k++)
        {
          lo[k] = fmin (lo[k], xyz[i][k]);
          hi[k] = fmax (hi[k], xyz[i][k]);
        }
    }
  {
    /* All on one line (any direction): the spread of (x, y) across its main axis vanishes. */
    double mx = 0.0, my = 0.0, sxx = 0.0, syy = 0.0, sxy = 0.0, tr, det, lmin;

    for (size_t i = 0; i < n; i++)
      {
        mx += xyz[i][0] / (double) n;
        my += xyz[i][1] / (double) n;
      }
    for (size_t i = 0; i < n; i++)
      {
        double dx = xyz[i][0] - mx, dy = xyz[i][1] - my;

        sxx += dx * dx;
        syy += dy * dy;
        sxy += dx * dy;
      }
    tr = sxx + syy;
    det = sxx * syy - sxy * sxy;
    lmin = 0.5 * (tr - sqrt (fmax (tr * tr - 4.0 * det, 0.0)));
    if (!(lmin > 1e-12 * tr))
      return df_diag_fail (diag, DF_E_INPUT, -1, "the points lie on a line in (x, y): they "
                           "span no area to fit a surface over");
  }
  c.xs = malloc (sizeof (double) * n);
  c.ys = malloc (sizeof (double) * n);
  if (c.xs == NULL || c.ys == NULL)
    {
      st = DF_E_NOMEM;
      goto out;
    }
  c.nx = distinct (xyz, n, 0, 1e-7 * (hi[0] - lo[0]), c.xs);
  c.ny = distinct (xyz, n, 1, 1e-7 * (hi[1] - lo[1]), c.ys);
  if (c.nx * c.ny > 2 * n)
    {
      /* Far more lattice nodes than points: scattered points, not a grid with holes. */
      free (c.xs);
      free (c.ys);
      return _df_fit_scattered (xyz, n, lo, hi, tolerance, out, info, diag);
    }
  if (c.nx < MIN_NODES || c.ny < MIN_NODES)
    {
      st = df_diag_fail (diag, DF_E_INPUT, -1, "a grid of %zu x %zu heights: a quintic height "
                         "map needs at least %d a side", c.nx, c.ny, MIN_NODES);
      goto out;
    }
  c.z = malloc (sizeof (double) * c.nx * c.ny);
  owner = malloc (sizeof (long) * c.nx * c.ny);
  if (c.z == NULL || owner == NULL)
    {
      st = DF_E_NOMEM;
      goto out;
    }
  for (size_t k = 0; k < c.nx * c.ny; k++)
    owner[k] = -1;
  for (size_t i = 0; i < n; i++)
    {
      size_t a = find_value (c.xs, c.nx, xyz[i][0]), b = find_value (c.ys, c.ny, xyz[i][1]);
      size_t k = a * c.ny + b;

      if (owner[k] >= 0)
        {
          st = df_diag_fail (diag, DF_E_INPUT, (long) i, "node (%.6g, %.6g) is given twice "
                             "(also in data row %ld)", c.xs[a], c.ys[b], owner[k] + 1);
          goto out;
        }
      owner[k] = (long) i;
      c.z[k] = xyz[i][2];
    }
  for (size_t k = 0; k < c.nx * c.ny; k++)
    if (owner[k] < 0)
      {
        st = df_diag_fail (diag, DF_E_INPUT, -1, "the grid has a hole: no height at node "
                           "(%.6g, %.6g)", c.xs[k / c.ny], c.ys[k % c.ny]);
        goto out;
      }

  g = calloc (1, sizeof *g);
  if (g == NULL)
    {
      st = DF_E_NOMEM;
      goto out;
    }
  basis_for (&g->bx, c.xs, c.nx);
  basis_for (&g->by, c.ys, c.ny);
  mx = df_bspline_count (&g->bx);
  my = df_bspline_count (&g->by);
  g->theta = malloc (sizeof (double) * (size_t) mx * (size_t) my);
  c.w = malloc (sizeof (double) * (size_t) mx * c.ny);
  c.u = malloc (sizeof (double) * c.nx * (size_t) my);
  c.v = malloc (sizeof (double) * (size_t) mx * (size_t) my);
  c.by_first = malloc (sizeof (int) * c.ny);
  c.by_val = malloc (sizeof (double) * c.ny * (DF_BSPLINE_MAX_DEGREE + 1));
  if (g->theta == NULL || c.w == NULL || c.u == NULL || c.v == NULL || c.by_first == NULL
      || c.by_val == NULL)
    {
      st = DF_E_NOMEM;
      goto out;
    }
  for (size_t j = 0; j < c.ny; j++)
    {
      double v[4][DF_BSPLINE_MAX_DEGREE + 1];

      c.by_first[j] = df_bspline_eval_basis (&g->by, c.ys[j], 0, v);
      memcpy (c.by_val + j * (DF_BSPLINE_MAX_DEGREE + 1), v[0], sizeof v[0]);
    }
  c.g = g;
  c.scale_x = df_bspline_lambda_scale (&g->bx, c.nx, c.xs);
  c.scale_y = df_bspline_lambda_scale (&g->by, c.ny, c.ys);
  st = _df_fit_choose_lambda (grid_trial, &c, tolerance, &lambda, diag);
  if (st == DF_OK)
    st = grid_solve (&c, lambda, NULL, diag);
  if (st != DF_OK)
    goto out;
  for (size_t k = 0; k < (size_t) mx * (size_t) my; k++)
    if (!isfinite (g->theta[k]))
      {
        st = df_diag_fail (diag, DF_E_NONFINITE, -1, "the height fit gave a non-finite value");
        goto out;
      }
  grid_residuals (&c, true, &g->info);
  g->info.lambda = lambda;
  g->info.chosen = tolerance < 0.0;
  g->info.tolerance = tolerance < 0.0 ? g->info.rms : tolerance;
  if (info != NULL)
    *info = g->info;
  dom[0] = c.xs[0];
  dom[1] = c.xs[c.nx - 1];
  dom[2] = c.ys[0];
  dom[3] = c.ys[c.ny - 1];
  *out = df_fn_new (&_df_fit_grid_type, g, 2, 1, dom);
  g = NULL;
  if (*out == NULL)
    st = DF_E_NOMEM;
out:
  grid_free (g);
  free (c.xs);
  free (c.ys);
  free (c.z);
  free (c.w);
  free (c.u);
  free (c.v);
  free (c.by_first);
  free (c.by_val);
  free (owner);
  return st;
}
