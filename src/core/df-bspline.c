/* df-bspline.c: uniform B-spline basis with derivatives, and the penalised one-dimensional
 * smoother (banded normal equations). Plain C + libm + GSL; no GLib. */
#include "df-bspline.h"

#include <gsl/gsl_errno.h>
#include <gsl/gsl_linalg.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#define PENALTY_ORDER 3

/* The uniform quintic B-splines on the unit span [0, 1), 120 B_m(tau) = sum_j c[m][j] tau^j for
 * the 6 functions that do not vanish there (m = 0 is the leftmost), and their derivatives
 * (table k: the k-th derivative's coefficients). Expanded from the Cox-de Boor recursion
 * below with exact rational arithmetic (SymPy); the value table is the usual uniform quintic
 * blending matrix, and each row set sums to 120, 0, 0, 0 (partition of unity). */
static const double quintic[4][6][6] = {
  { /* derivative 0 */
    { 1, -5, 10, -10, 5, -1 },
    { 26, -50, 20, 20, -20, 5 },
    { 66, 0, -60, 0, 30, -10 },
    { 26, 50, 20, -20, -20, 10 },
    { 1, 5, 10, 10, 5, -5 },
    { 0, 0, 0, 0, 0, 1 } },
  { /* derivative 1 */
    { -5, 20, -30, 20, -5, 0 },
    { -50, 40, 60, -80, 25, 0 },
    { 0, -120, 0, 120, -50, 0 },
    { 50, 40, -60, -80, 50, 0 },
    { 5, 20, 30, 20, -25, 0 },
    { 0, 0, 0, 0, 5, 0 } },
  { /* derivative 2 */
    { 20, -60, 60, -20, 0, 0 },
    { 40, 120, -240, 100, 0, 0 },
    { -120, 0, 360, -200, 0, 0 },
    { 40, -120, -240, 200, 0, 0 },
    { 20, 60, 60, -100, 0, 0 },
    { 0, 0, 0, 20, 0, 0 } },
  { /* derivative 3 */
    { -60, 120, -60, 0, 0, 0 },
    { 120, -480, 300, 0, 0, 0 },
    { 0, 720, -600, 0, 0, 0 },
    { -120, -480, 600, 0, 0, 0 },
    { 60, 120, -300, 0, 0, 0 },
    { 0, 0, 60, 0, 0, 0 } },
};

int
df_bspline_eval_basis (const df_bspline *b, double x, int nder,
                       double vals[4][DF_BSPLINE_MAX_DEGREE + 1])
{
  /* N[d][m] = B_{m-d,d}(tau) on the unit span [0, 1): the Cox-de Boor recursion on integer
   * knots, B_{i,d} = (x - i)/d B_{i,d-1} + (i + d + 1 - x)/d B_{i+1,d-1}. */
  double N[DF_BSPLINE_MAX_DEGREE + 1][DF_BSPLINE_MAX_DEGREE + 1];
  int p = b->degree, s;
  double u = (x - b->a) / b->h, tau, hk = 1.0;

  /* Clamp before the conversion: a non-finite or huge x must not overflow the int. */
  if (!(u >= 0.0))
    s = 0;
  else if (!(u < (double) b->spans))
    s = b->spans - 1;
  else
    s = (int) floor (u);
  if (!isfinite (u))
    u = s;
  tau = u - s;
  if (p == 5)
    {
      /* The quintic (every fitted surface) from its polynomial pieces on the unit span:
       * Horner on the table below, a fifth of the recursion's work. */
      /* One reciprocal per derivative order: a division per value was a third of the time
       * of every fitted surface's evaluation. */
      double inv_h = 1.0 / b->h, scale = 1.0 / 120.0;

      for (int k = 0; k <= nder && k <= 3; k++)
        {
          for (int m = 0; m <= 5; m++)
            {
              const double *c = quintic[k][m];
              double acc = c[5 - k];

              for (int j = 4 - k; j >= 0; j--)
                acc = acc * tau + c[j];
              vals[k][m] = acc * scale;
            }
          scale *= inv_h;
        }
      return s;
    }
  N[0][0] = 1.0;
  for (int d = 1; d <= p; d++)
    for (int m = 0; m <= d; m++)
      {
        double left = m >= 1 ? (tau - m + d) / d * N[d - 1][m - 1] : 0.0;
        double right = m <= d - 1 ? (m + 1 - tau) / d * N[d - 1][m] : 0.0;

        N[d][m] = left + right;
      }
  /* k-th derivative (unit spacing): sum_j (-1)^j C(k, j) B_{i+j, p-k}. */
  for (int k = 0; k <= nder && k <= 3; k++)
    {
      static const double binom[4][4] = { { 1 }, { 1, 1 }, { 1, 2, 1 }, { 1, 3, 3, 1 } };

      for (int m = 0; m <= p; m++)
        {
          double sum = 0.0;

          if (k <= p)
            for (int j = 0; j <= k; j++)
              {
                int idx = m + j - k;

                if (idx >= 0 && idx <= p - k)
                  sum += ((j & 1) ? -1.0 : 1.0) * binom[k][j] * N[p - k][idx];
              }
          vals[k][m] = sum / hk;
        }
      hk *= b->h;
    }
  return s;
}

/* D_q^T D_q for q = 3 is banded with half-width 3: entry (i, i + o) accumulates
 * d_r[i - r] d_r[i + o - r] over the difference rows r. */
static void
add_penalty (gsl_matrix *ab, int count, double lambda)
{
  static const double d[PENALTY_ORDER + 1] = { -1.0, 3.0, -3.0, 1.0 };

  for (int r = 0; r + PENALTY_ORDER < count; r++)
    for (int i = 0; i <= PENALTY_ORDER; i++)
      for (int j = i; j <= PENALTY_ORDER; j++)
        {
          double *e = gsl_matrix_ptr (ab, (size_t) (r + i), (size_t) (j - i));

          *e += lambda * d[i] * d[j];
        }
}

double
df_bspline_lambda_scale (const df_bspline *b, size_t n, const double *x)
{
  double tr_b = 0.0, tr_p = 20.0 * fmax (1, df_bspline_count (b) - PENALTY_ORDER);
  double v[4][DF_BSPLINE_MAX_DEGREE + 1];

  for (size_t i = 0; i < n; i++)
    {
      df_bspline_eval_basis (b, x[i], 0, v);
      for (int m = 0; m <= b->degree; m++)
        tr_b += v[0][m] * v[0][m];
    }
  return tr_b / tr_p;
}

df_status
df_bspline_smooth (const df_bspline *b, size_t n, const double *x, const double *y, int ncol,
                   double lambda, const df_bspline_constraint *cons, int ncons, double *coef,
                   double *trace_h, df_diag *diag)
{
  int count = df_bspline_count (b), p = b->degree, bw = p + 1;
  gsl_matrix *ab = gsl_matrix_calloc ((size_t) count, (size_t) bw);
  gsl_matrix *g = trace_h ? gsl_matrix_calloc ((size_t) count, (size_t) bw) : NULL;
  gsl_vector *rhs = gsl_vector_alloc ((size_t) count);
  gsl_matrix *ct = NULL;
  df_status st = DF_OK;
  double v[4][DF_BSPLINE_MAX_DEGREE + 1];
  int err;

  if (ab == NULL || rhs == NULL || (trace_h && g == NULL))
    {
      st = DF_E_NOMEM;
      goto out;
    }
  memset (coef, 0, sizeof (double) * (size_t) count * (size_t) ncol);
  for (size_t i = 0; i < n; i++)
    {
      int f = df_bspline_eval_basis (b, x[i], 0, v);

      for (int m = 0; m <= p; m++)
        {
          for (int l = m; l <= p; l++)
            {
              *gsl_matrix_ptr (ab, (size_t) (f + m), (size_t) (l - m)) += v[0][m] * v[0][l];
              if (g)
                *gsl_matrix_ptr (g, (size_t) (f + m), (size_t) (l - m)) += v[0][m] * v[0][l];
            }
          for (int c = 0; c < ncol; c++)
            coef[(size_t) (f + m) * ncol + c] += v[0][m] * y[i * ncol + c];
        }
    }
  add_penalty (ab, count, lambda);
  if ((err = gsl_linalg_cholesky_band_decomp (ab)) != GSL_SUCCESS)
    {
      st = df_diag_fail (diag, DF_E_SINGULAR, -1, "too few points for the spline (%d "
                         "coefficients): the fit is not determined", count);
      goto out;
    }
  for (int c = 0; c < ncol; c++)
    {
      for (int i = 0; i < count; i++)
        gsl_vector_set (rhs, (size_t) i, coef[(size_t) i * ncol + c]);
      gsl_linalg_cholesky_band_svx (ab, rhs);
      for (int i = 0; i < count; i++)
        coef[(size_t) i * ncol + c] = gsl_vector_get (rhs, (size_t) i);
    }

  if (ncons > 0)
    {
      /* Exact conditions by the Schur complement: c = c0 - A^-1 C^T mu with
       * (C A^-1 C^T) mu = C c0 - d. Few conditions, each touching degree + 1 coefficients. */
      gsl_matrix *s = gsl_matrix_calloc ((size_t) ncons, (size_t) ncons);
      gsl_vector *r = gsl_vector_alloc ((size_t) ncons);
      gsl_permutation *perm = gsl_permutation_alloc ((size_t) ncons);
      int sign;

      ct = gsl_matrix_calloc ((size_t) count, (size_t) ncons);
      for (int k = 0; k < ncons; k++)
        {
          int f = df_bspline_eval_basis (b, cons[k].x, cons[k].deriv, v);
          double cc0 = 0.0;

          for (int m = 0; m <= p; m++)
            {
              gsl_matrix_set (ct, (size_t) (f + m), (size_t) k, v[cons[k].deriv][m]);
              cc0 += v[cons[k].deriv][m] * coef[(size_t) (f + m) * ncol + cons[k].col];
            }
          gsl_vector_set (r, (size_t) k, cc0 - cons[k].value);
        }
      /* ct <- A^-1 C^T, then S = C A^-1 C^T, only among conditions on one column. */
      {
        gsl_matrix *craw = gsl_matrix_alloc ((size_t) count, (size_t) ncons);

        gsl_matrix_memcpy (craw, ct);
        gsl_linalg_cholesky_band_svxm (ab, ct);
        for (int k = 0; k < ncons; k++)
          for (int l = 0; l < ncons; l++)
            {
              double sum = 0.0;

              if (cons[k].col == cons[l].col)
                for (int i = 0; i < count; i++)
                  sum += gsl_matrix_get (craw, (size_t) i, (size_t) k)
                         * gsl_matrix_get (ct, (size_t) i, (size_t) l);
              gsl_matrix_set (s, (size_t) k, (size_t) l, sum);
            }
        gsl_matrix_free (craw);
      }
      if (gsl_linalg_LU_decomp (s, perm, &sign) != GSL_SUCCESS
          || gsl_linalg_LU_svx (s, perm, r) != GSL_SUCCESS)
        st = df_diag_fail (diag, DF_E_SINGULAR, -1, "the end conditions of the fit conflict");
      else
        for (int k = 0; k < ncons; k++)
          for (int i = 0; i < count; i++)
            coef[(size_t) i * ncol + cons[k].col] -= gsl_matrix_get (ct, (size_t) i, (size_t) k)
                                                     * gsl_vector_get (r, (size_t) k);
      gsl_matrix_free (s);
      gsl_vector_free (r);
      gsl_permutation_free (perm);
    }

  if (st == DF_OK && trace_h)
    {
      /* tr(A^-1 G), G = B^T B, from the band of A^-1 alone. */
      if (!df_band_trace_inverse_product (ab, g, trace_h))
        st = df_diag_fail (diag, DF_E_NONFINITE, -1, "the fit's smoothing trace is not finite");
    }
  for (size_t i = 0; st == DF_OK && i < (size_t) count * (size_t) ncol; i++)
    if (!isfinite (coef[i]))
      st = df_diag_fail (diag, DF_E_NONFINITE, -1, "the fit gave a non-finite coefficient");
out:
  gsl_matrix_free (ab);
  if (g)
    gsl_matrix_free (g);
  if (ct)
    gsl_matrix_free (ct);
  if (rhs)
    gsl_vector_free (rhs);
  return st;
}

bool
df_band_trace_inverse_product (const gsl_matrix *l, const gsl_matrix *g, double *trace)
{
  /* The band of S = A^-1 from A = L L^T by the backward recursion from L^T S = L^-1 (lower
   * triangular, diagonal 1/L_jj): for i >= j,
   *   S_ji = (delta_ij / L_jj - sum_{k = j+1}^{j+p} L_kj S_ki) / L_jj,
   * taking i from j + p down to j, so every S_ki it needs (k, i > j, |k - i| < p) is known
   * (the selected-inversion recursion for banded smoothing-spline matrices; from memory).
   * O(n p^2) where solving for each column of A^-1 was O(n^2 p): it was half the time of a
   * 1000 x 1000 GCV fit. Only the band is needed: tr(S G) = sum over G's band. */
  size_t n = l->size1, p = l->size2 - 1;
  double *sb = calloc (n * (p + 1), sizeof *sb), tr = 0.0;

  if (sb == NULL)
    return false;
#define L_AT(r, c) gsl_matrix_get (l, (c), (r) - (c))          /* r >= c, r - c <= p */
#define S_AT(a, b) ((a) <= (b) ? sb[(a) * (p + 1) + ((b) - (a))] : sb[(b) * (p + 1) + ((a) - (b))])
  for (size_t jj = n; jj-- > 0;)
    {
      double ljj = L_AT (jj, jj);
      size_t top = jj + p < n - 1 ? jj + p : n - 1;

      for (size_t i = top + 1; i-- > jj;)
        {
          double acc = i == jj ? 1.0 / ljj : 0.0;

          for (size_t k = jj + 1; k <= top; k++)
            acc -= L_AT (k, jj) * S_AT (k, i);
          sb[jj * (p + 1) + (i - jj)] = acc / ljj;
        }
    }
  for (size_t i = 0; i < n; i++)
    for (size_t d = 0; d <= p && i + d < n; d++)
      tr += (d == 0 ? 1.0 : 2.0) * sb[i * (p + 1) + d] * gsl_matrix_get (g, i, d);
#undef L_AT
#undef S_AT
  free (sb);
  *trace = tr;
  return isfinite (tr);
}

gsl_matrix *
df_bspline_factor (const df_bspline *b, size_t n, const double *x, double lambda,
                   double *trace_h)
{
  int count = df_bspline_count (b), p = b->degree;
  gsl_matrix *ab = gsl_matrix_calloc ((size_t) count, (size_t) p + 1);
  gsl_matrix *g = gsl_matrix_calloc ((size_t) count, (size_t) p + 1);
  gsl_vector *e = gsl_vector_alloc ((size_t) count);
  double v[4][DF_BSPLINE_MAX_DEGREE + 1];

  if (ab == NULL || g == NULL || e == NULL)
    goto fail;
  for (size_t i = 0; i < n; i++)
    {
      int f = df_bspline_eval_basis (b, x[i], 0, v);

      for (int m = 0; m <= p; m++)
        for (int l = m; l <= p; l++)
          *gsl_matrix_ptr (g, (size_t) (f + m), (size_t) (l - m)) += v[0][m] * v[0][l];
    }
  gsl_matrix_memcpy (ab, g);
  add_penalty (ab, count, lambda);
  if (gsl_linalg_cholesky_band_decomp (ab) != GSL_SUCCESS)
    goto fail;
  if (trace_h && !df_band_trace_inverse_product (ab, g, trace_h))
    goto fail;
  gsl_matrix_free (g);
  gsl_vector_free (e);
  return ab;
fail:
  gsl_matrix_free (ab);
  gsl_matrix_free (g);
  gsl_vector_free (e);
  return NULL;
}
