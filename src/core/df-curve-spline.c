/* df-curve-spline.c: the C2 cubic interpolation behind a curve through points: slopes from
 * the (cyclic) tridiagonal system and per-segment coefficients (split from df-curve.c, which
 * builds and evaluates the curve). Plain C + libm + GSL; no GLib. */
#include "df-curve-private.h"

#include <gsl/gsl_linalg.h>
#include <gsl/gsl_vector.h>
#include <math.h>
#include <stdlib.h>

/* --- cubic spline slopes --------------------------------------------------------------- */

/* Slopes s_i of the C2 cubic through (x_i, y_i), i < n. Closed: periodic with period
 * x[n] - x[0] and y[n] = y[0]; open: not-a-knot ends (n = 2: the line, n = 3: the parabola).
 * Equations: h_i s_{i-1} + 2 (h_{i-1} + h_i) s_i + h_{i-1} s_{i+1} = 3 (h_i d_{i-1} + h_{i-1} d_i)
 * with h_i = x_{i+1} - x_i, d_i = (y_{i+1} - y_i) / h_i; the not-a-knot rows as in de Boor,
 * A Practical Guide to Splines, ch. IV (from memory). */
int
_df_curve_spline_slopes (const double *x, const double *y, size_t n, bool closed, double *s)
{
  size_t nseg = closed ? n : n - 1, m_off = closed ? n : n - 1;
  /* One block: h, d, diagonal, right-hand side, upper and lower diagonals. Filled as plain
   * arrays and handed to GSL through vector views. */
  double *work = malloc ((2 * nseg + 2 * n + 2 * m_off) * sizeof *work);
  double *h, *d, *dg, *rhs, *up, *lo;
  gsl_vector_view v_dg, v_rhs, v_up, v_lo, sol = gsl_vector_view_array (s, n);
  int rc = 0;

  if (work == NULL)
    return -1;
  h = work;
  d = h + nseg;
  dg = d + nseg;
  rhs = dg + n;
  up = rhs + n;
  lo = up + m_off;
  for (size_t i = 0; i < nseg; i++)
    {
      h[i] = x[i + 1] - x[i];
      d[i] = (y[(i + 1) % n] - y[i]) / h[i];
    }
  if (closed)
    {
      for (size_t i = 0; i < n; i++)
        {
          size_t im = (i + n - 1) % n;

          dg[i] = 2 * (h[im] + h[i]);
          rhs[i] = 3 * (h[i] * d[im] + h[im] * d[i]);
          up[i] = h[im];              /* coefficient of s_{i+1} in row i */
          lo[im] = h[i];              /* coefficient of s_{i-1} in row i */
        }
    }
  else if (n == 2)
    {
      s[0] = s[1] = d[0];
      goto out;
    }
  else if (n == 3)
    {
      /* The parabola through three points. */
      double c2 = (d[1] - d[0]) / (h[0] + h[1]);

      s[0] = d[0] - c2 * h[0];
      s[1] = d[0] + c2 * h[0];
      s[2] = d[1] + c2 * h[1];
      goto out;
    }
  else
    {
      size_t k = n - 1;
      double a = h[k - 2], bb = h[k - 1];

      dg[0] = h[1];
      up[0] = h[0] + h[1];
      rhs[0] = ((h[0] + 2 * (h[0] + h[1])) * h[1] * d[0] + h[0] * h[0] * d[1]) / (h[0] + h[1]);
      for (size_t i = 1; i + 1 < n; i++)
        {
          lo[i - 1] = h[i];
          dg[i] = 2 * (h[i - 1] + h[i]);
          up[i] = h[i - 1];
          rhs[i] = 3 * (h[i] * d[i - 1] + h[i - 1] * d[i]);
        }
      lo[k - 1] = a + bb;
      dg[k] = a;
      rhs[k] = (bb * bb * d[k - 2] + (2 * (a + bb) + bb) * a * d[k - 1]) / (a + bb);
    }
  v_dg = gsl_vector_view_array (dg, n);
  v_rhs = gsl_vector_view_array (rhs, n);
  v_up = gsl_vector_view_array (up, m_off);
  v_lo = gsl_vector_view_array (lo, m_off);
  rc = closed ? gsl_linalg_solve_cyc_tridiag (&v_dg.vector, &v_up.vector, &v_lo.vector,
                                              &v_rhs.vector, &sol.vector)
              : gsl_linalg_solve_tridiag (&v_dg.vector, &v_up.vector, &v_lo.vector,
                                          &v_rhs.vector, &sol.vector);
out:
  free (work);
  return rc;
}

/* Per-segment cubic coefficients a + b dt + c dt^2 + d dt^3 from values and slopes. */
void
_df_curve_spline_coefficients (const double *x, const double *y, const double *s, size_t nseg, size_t n,
                     double *coef)
{
  for (size_t i = 0; i < nseg; i++)
    {
      double h = x[i + 1] - x[i];
      double y1 = y[(i + 1) % n], s1 = s[(i + 1) % n];
      double del = (y1 - y[i]) / h;

      coef[4 * i + 0] = y[i];
      coef[4 * i + 1] = s[i];
      coef[4 * i + 2] = (3 * del - 2 * s[i] - s1) / h;
      coef[4 * i + 3] = (s[i] + s1 - 2 * del) / (h * h);
    }
}

