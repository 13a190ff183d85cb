/* df-cheb2.c: tensor Chebyshev fits by the discrete cosine sums at first-kind Chebyshev points,
 * with the x-antiderivative taken coefficient by coefficient (Mason and Handscomb, Chebyshev
 * Polynomials, ch. 2 and 6, from memory). GSL's gsl_cheb is one-dimensional only, hence this.
 * Plain C + libm; no GLib. */
#include "df-cheb2.h"

#include <float.h>
#include <math.h>
#include <stdbool.h>
#include <stdlib.h>
#include <string.h>

#define MIN_DEGREE 16
#define MAX_DEGREE 256

struct df_cheb2
{
  int     n;          /* degree: n coefficients in y, n + 1 in x after integration */
  int     n_f;
  double  xa, xb, ya, yb;
  double *b;          /* [f][j][i]: antiderivative coefficients, i < n + 1, j < n */
};

void
df_cheb2_free (df_cheb2 *c)
{
  if (c == NULL)
    return;
  free (c->b);
  free (c);
}

int
df_cheb2_degree (const df_cheb2 *c)
{
  return c->n;
}

/* Coefficients a[f][j][i] of the degree-n interpolant from values at the n x n nodes. */
static df_status
fit_degree (df_cheb2_fn fn, void *user, int n_f, int n, double xa, double xb, double ya,
            double yb, double *a, df_diag *diag)
{
  double *vals = malloc ((size_t) n * n * n_f * sizeof *vals);
  double *tmp = malloc ((size_t) n * n * n_f * sizeof *tmp);
  double *cs = malloc ((size_t) n * n * sizeof *cs);
  double *fv = malloc ((size_t) n_f * sizeof *fv);
  df_status st = DF_OK;

  if (!vals || !tmp || !cs || !fv)
    {
      st = DF_E_NOMEM;
      goto out;
    }
  /* cs[i][k] = cos(i theta_k), theta_k = pi (k + 1/2) / n. */
  for (int i = 0; i < n; i++)
    for (int k = 0; k < n; k++)
      cs[i * n + k] = cos (M_PI * i * (k + 0.5) / n);
  for (int kx = 0; kx < n; kx++)
    for (int ky = 0; ky < n; ky++)
      {
        double x = 0.5 * (xa + xb) + 0.5 * (xb - xa) * cs[n + kx];
        double y = 0.5 * (ya + yb) + 0.5 * (yb - ya) * cs[n + ky];

        if ((st = fn (x, y, fv, user)) != DF_OK)
          goto out;
        for (int f = 0; f < n_f; f++)
          {
            if (!isfinite (fv[f]))
              {
                st = df_diag_fail_at (diag, DF_E_NONFINITE, -1, x, y,
                                      "the curvature integrand is not finite");
                goto out;
              }
            vals[((size_t) f * n + ky) * n + kx] = fv[f];
          }
      }
  /* Separable sums: first over x nodes, then over y nodes. */
  for (int f = 0; f < n_f; f++)
    {
      for (int ky = 0; ky < n; ky++)
        for (int i = 0; i < n; i++)
          {
            double acc = 0.0;

            for (int kx = 0; kx < n; kx++)
              acc += vals[((size_t) f * n + ky) * n + kx] * cs[i * n + kx];
            tmp[((size_t) f * n + ky) * n + i] = acc * (i == 0 ? 1.0 : 2.0) / n;
          }
      for (int j = 0; j < n; j++)
        for (int i = 0; i < n; i++)
          {
            double acc = 0.0;

            for (int ky = 0; ky < n; ky++)
              acc += tmp[((size_t) f * n + ky) * n + i] * cs[j * n + ky];
            a[((size_t) f * n + j) * n + i] = acc * (j == 0 ? 1.0 : 2.0) / n;
          }
    }
out:
  free (vals);
  free (tmp);
  free (cs);
  free (fv);
  return st;
}

static bool
converged (const double *a, int n_f, int n, double rel_tol)
{
  for (int f = 0; f < n_f; f++)
    {
      double big = 0.0, tail = 0.0;

      for (int j = 0; j < n; j++)
        for (int i = 0; i < n; i++)
          {
            double v = fabs (a[((size_t) f * n + j) * n + i]);

            big = fmax (big, v);
            if (i >= n - 3 || j >= n - 3)
              tail = fmax (tail, v);
          }
      /* The cosine sums carry rounding of about n eps of the largest coefficient: a tail at
       * that floor has converged as far as double precision allows. */
      if (tail > fmax (rel_tol, 50.0 * n * DBL_EPSILON) * big && tail > 1e-300)
        return false;
    }
  return true;
}

df_status
df_cheb2_fit (df_cheb2_fn fn, void *user, int n_f, double xa, double xb, double ya, double yb,
              double rel_tol, int max_degree, df_cheb2 **out, df_diag *diag)
{
  df_cheb2 *c;
  double *a = NULL;
  int n;
  df_status st;

  *out = NULL;
  if (!(xa < xb) || !(ya < yb) || n_f < 1)
    return df_diag_fail (diag, DF_E_INPUT, -1, "empty fitting rectangle");
  if (max_degree > MAX_DEGREE || max_degree < MIN_DEGREE)
    max_degree = MAX_DEGREE;
  /* Degrees grow by half each time (16, 24, 32, 48, ...): the cost is n^2 per evaluation
   * later, so the smallest degree that converges is worth finding. */
  for (n = MIN_DEGREE; n <= max_degree; n = n * 3 / 2 + (n * 3 / 2) % 2)
    {
      free (a);
      a = malloc ((size_t) n_f * n * n * sizeof *a);
      if (a == NULL)
        return DF_E_NOMEM;
      if ((st = fit_degree (fn, user, n_f, n, xa, xb, ya, yb, a, diag)) != DF_OK)
        {
          free (a);
          return st;
        }
      if (converged (a, n_f, n, rel_tol))
        break;
    }
  if (n > max_degree)
    {
      free (a);
      return df_diag_fail (diag, DF_E_NOCONVERGE, -1, "no Chebyshev fit up to degree %d",
                           max_degree);
    }
  c = calloc (1, sizeof *c);
  if (c == NULL || (c->b = calloc ((size_t) n_f * n * (n + 1), sizeof (double))) == NULL)
    {
      free (c);
      free (a);
      return DF_E_NOMEM;
    }
  c->n = n;
  c->n_f = n_f;
  c->xa = xa;
  c->xb = xb;
  c->ya = ya;
  c->yb = yb;
  /* Antiderivative in x of each column: b_1 = a_0 - a_2 / 2, b_i = (a_{i-1} - a_{i+1}) / (2 i),
   * b_0 so that the value at x = xa is 0; times the half-width for the change of variable. */
  for (int f = 0; f < n_f; f++)
    for (int j = 0; j < n; j++)
      {
        const double *col = &a[((size_t) f * n + j) * n];
        double *b = &c->b[((size_t) f * n + j) * (n + 1)];
        double at_left = 0.0, hw = 0.5 * (xb - xa);

        for (int i = 1; i <= n; i++)
          {
            double prev = col[i - 1], next = i + 1 < n ? col[i + 1] : 0.0;

            b[i] = (i == 1 ? prev - 0.5 * next : (prev - next) / (2.0 * i)) * hw;
            at_left += (i % 2 ? -1.0 : 1.0) * b[i];
          }
        b[0] = -at_left;
      }
  free (a);
  *out = c;
  return DF_OK;
}

/* The T_i at the clamped, rescaled x and y. */
static void
basis (const df_cheb2 *c, double x, double y, double *tx, double *ty)
{
  double xh = (2 * x - c->xa - c->xb) / (c->xb - c->xa);
  double yh = (2 * y - c->ya - c->yb) / (c->yb - c->ya);
  int n = c->n;

  xh = xh < -1 ? -1 : xh > 1 ? 1 : xh;
  yh = yh < -1 ? -1 : yh > 1 ? 1 : yh;
  tx[0] = 1.0;
  tx[1] = xh;
  for (int i = 2; i <= n; i++)
    tx[i] = 2 * xh * tx[i - 1] - tx[i - 2];
  ty[0] = 1.0;
  ty[1] = yh;
  for (int j = 2; j < n; j++)
    ty[j] = 2 * yh * ty[j - 1] - ty[j - 2];
}

static double
sum_one (const df_cheb2 *c, int f, const double *tx, const double *ty)
{
  int n = c->n;
  double acc = 0.0;

  for (int j = 0; j < n; j++)
    {
      const double *b = &c->b[((size_t) f * n + j) * (n + 1)];
      double r0 = 0.0, r1 = 0.0, r2 = 0.0, r3 = 0.0;
      int i = 0;

      /* Four partial sums: independent chains the processor can overlap. */
      for (; i + 3 <= n; i += 4)
        {
          r0 += b[i] * tx[i];
          r1 += b[i + 1] * tx[i + 1];
          r2 += b[i + 2] * tx[i + 2];
          r3 += b[i + 3] * tx[i + 3];
        }
      for (; i <= n; i++)
        r0 += b[i] * tx[i];
      acc += ((r0 + r1) + (r2 + r3)) * ty[j];
    }
  return acc;
}

void
df_cheb2_eval_xint (const df_cheb2 *c, double x, double y, double *values)
{
  double tx[MAX_DEGREE + 2], ty[MAX_DEGREE + 1];

  basis (c, x, y, tx, ty);
  for (int f = 0; f < c->n_f; f++)
    values[f] = sum_one (c, f, tx, ty);
}

double
df_cheb2_eval_xint_one (const df_cheb2 *c, int f, double x, double y)
{
  double tx[MAX_DEGREE + 2], ty[MAX_DEGREE + 1];

  basis (c, x, y, tx, ty);
  return sum_one (c, f, tx, ty);
}
