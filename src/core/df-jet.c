/* df-jet.c: arithmetic on bivariate Taylor polynomials truncated at total degree 3 (df-jet.h),
 * the number type behind exact chart derivatives. This is the inner loop of the transport ODE
 * (millions of calls per loop), so every product is written out term by term, nothing
 * allocates, outputs may alias inputs, and each operation computes only the coefficients its
 * operands' truncation keeps (a constant operand makes a product a scaling).
 * Plain C + libm; no GLib. */
#include "df-jet.h"

#include <string.h>

/* Index of each monomial: 0:1  1:x  2:y  3:x^2  4:xy  5:y^2  6:x^3  7:x^2y  8:xy^2  9:y^3. */

#define FULL_ORDER 3

void
df_jet_const (df_jet *out, double value)
{
  memset (out, 0, sizeof *out);
  out->c[0] = value;
  out->n_vars = 0;
  out->order = FULL_ORDER;
}

void
df_jet_seed (df_jet *out, double value, int which, int n_vars, int order)
{
  df_jet_const (out, value);
  out->c[which == 0 ? DF_JET_DX : DF_JET_DY] = 1.0;
  out->n_vars = (unsigned char) (n_vars < 1 ? 1 : n_vars > 2 ? 2 : n_vars);
  if (which != 0)
    out->n_vars = 2;
  out->order = (unsigned char) (order < 1 ? 1 : order > FULL_ORDER ? FULL_ORDER : order);
}

void
df_jet_var (df_jet *out, double value, int which)
{
  df_jet_seed (out, value, which, 2, FULL_ORDER);
}

double
df_jet_deriv (const df_jet *a, df_jet_index index)
{
  /* Taylor coefficient of x^i y^j is f_(x^i y^j) / (i! j!): multiply back by i! j!. */
  static const double factor[DF_JET_N] = { 1, 1, 1, 2, 1, 2, 6, 2, 2, 6 };

  if ((int) index < 0 || (int) index >= DF_JET_N)
    return 0.0;
  return a->c[index] * factor[index];
}

/* The truncation of a binary operation's result (read before out, which may alias, is
 * written). */
static inline void
merge_mode (const df_jet *a, const df_jet *b, unsigned char *n_vars, unsigned char *order)
{
  if (a->n_vars == 0)
    {
      *n_vars = b->n_vars;
      *order = b->order;
    }
  else if (b->n_vars == 0)
    {
      *n_vars = a->n_vars;
      *order = a->order;
    }
  else
    {
      *n_vars = a->n_vars > b->n_vars ? a->n_vars : b->n_vars;
      *order = a->order < b->order ? a->order : b->order;
    }
}

void
df_jet_add (const df_jet *a, const df_jet *b, df_jet *out)
{
  unsigned char n, o;

  merge_mode (a, b, &n, &o);
  for (int i = 0; i < DF_JET_N; i++)
    out->c[i] = a->c[i] + b->c[i];
  out->n_vars = n;
  out->order = o;
}

void
df_jet_sub (const df_jet *a, const df_jet *b, df_jet *out)
{
  unsigned char n, o;

  merge_mode (a, b, &n, &o);
  for (int i = 0; i < DF_JET_N; i++)
    out->c[i] = a->c[i] - b->c[i];
  out->n_vars = n;
  out->order = o;
}

void
df_jet_neg (const df_jet *a, df_jet *out)
{
  for (int i = 0; i < DF_JET_N; i++)
    out->c[i] = -a->c[i];
  out->n_vars = a->n_vars;
  out->order = a->order;
}

void
df_jet_scale (const df_jet *a, double s, df_jet *out)
{
  for (int i = 0; i < DF_JET_N; i++)
    out->c[i] = a->c[i] * s;
  out->n_vars = a->n_vars;
  out->order = a->order;
}

void
df_jet_mul (const df_jet *a, const df_jet *b, df_jet *out)
{
  const double *p = a->c, *q = b->c;
  double r[DF_JET_N] = { 0 };
  unsigned char n, o;

  if (a->n_vars == 0)
    {
      double s = p[0];

      df_jet_scale (b, s, out);
      return;
    }
  if (b->n_vars == 0)
    {
      df_jet_scale (a, q[0], out);
      return;
    }
  merge_mode (a, b, &n, &o);
  /* Cauchy product of the two polynomials, keeping the monomials of the truncation.
   * Written into a local first because out may be a or b. */
  r[0] = p[0] * q[0];
  r[1] = p[0] * q[1] + p[1] * q[0];
  if (n == 1)
    {
      if (o >= 2)
        r[3] = p[0] * q[3] + p[1] * q[1] + p[3] * q[0];
      if (o >= 3)
        r[6] = p[0] * q[6] + p[1] * q[3] + p[3] * q[1] + p[6] * q[0];
    }
  else
    {
      r[2] = p[0] * q[2] + p[2] * q[0];
      if (o >= 2)
        {
          r[3] = p[0] * q[3] + p[1] * q[1] + p[3] * q[0];
          r[4] = p[0] * q[4] + p[1] * q[2] + p[2] * q[1] + p[4] * q[0];
          r[5] = p[0] * q[5] + p[2] * q[2] + p[5] * q[0];
        }
      if (o >= 3)
        {
          r[6] = p[0] * q[6] + p[1] * q[3] + p[3] * q[1] + p[6] * q[0];
          r[7] = p[0] * q[7] + p[1] * q[4] + p[2] * q[3] + p[3] * q[2] + p[4] * q[1]
                 + p[7] * q[0];
          r[8] = p[0] * q[8] + p[1] * q[5] + p[2] * q[4] + p[4] * q[2] + p[5] * q[1]
                 + p[8] * q[0];
          r[9] = p[0] * q[9] + p[2] * q[5] + p[5] * q[2] + p[9] * q[0];
        }
    }
  memcpy (out->c, r, sizeof r);
  out->n_vars = n;
  out->order = o;
}

void
df_jet_compose (const df_jet *a, double f0, double f1, double f2, double f3, df_jet *out)
{
  const double *h = a->c;   /* h[0] is ignored: h is the non-constant part of a */
  double r[DF_JET_N] = { 0 };
  double g2 = 0.5 * f2, g3 = f3 / 6.0;
  unsigned char n = a->n_vars, o = a->order;

  /* f(a) = f0 + f1 h + f2 h^2/2 + f3 h^3/6, with the powers of h truncated like a. */
  r[0] = f0;
  if (n == 0)
    {
      df_jet_const (out, f0);
      return;
    }
  r[1] = f1 * h[1];
  if (n == 1)
    {
      if (o >= 2)
        r[3] = f1 * h[3] + g2 * h[1] * h[1];
      if (o >= 3)
        r[6] = f1 * h[6] + g2 * 2.0 * h[1] * h[3] + g3 * h[1] * h[1] * h[1];
    }
  else
    {
      r[2] = f1 * h[2];
      if (o >= 2)
        {
          double s3 = h[1] * h[1], s4 = 2.0 * h[1] * h[2], s5 = h[2] * h[2];

          r[3] = f1 * h[3] + g2 * s3;
          r[4] = f1 * h[4] + g2 * s4;
          r[5] = f1 * h[5] + g2 * s5;
          if (o >= 3)
            {
              /* h^2 in degree 3, and h^3 (degree 3 only). */
              double s6 = 2.0 * h[1] * h[3];
              double s7 = 2.0 * (h[1] * h[4] + h[2] * h[3]);
              double s8 = 2.0 * (h[1] * h[5] + h[2] * h[4]);
              double s9 = 2.0 * h[2] * h[5];

              r[6] = f1 * h[6] + g2 * s6 + g3 * s3 * h[1];
              r[7] = f1 * h[7] + g2 * s7 + g3 * 3.0 * s3 * h[2];
              r[8] = f1 * h[8] + g2 * s8 + g3 * 3.0 * h[1] * s5;
              r[9] = f1 * h[9] + g2 * s9 + g3 * s5 * h[2];
            }
        }
    }
  /* out may alias a: every read of h happens before this write. */
  memcpy (out->c, r, sizeof r);
  out->n_vars = n;
  out->order = o;
}

void
df_jet_div (const df_jet *a, const df_jet *b, df_jet *out)
{
  double inv = 1.0 / b->c[0];
  double inv2 = inv * inv;
  double value = a->c[0] / b->c[0];
  df_jet r;

  /* 1/x has derivatives 1/x, -1/x^2, 2/x^3, -6/x^4. b->c[0] == 0 gives infinities: callers
   * that can meet a zero divisor (df-expr.c) check it first and report it. */
  if (b->n_vars == 0)
    df_jet_scale (a, inv, out);
  else
    {
      df_jet_compose (b, inv, -inv2, 2.0 * inv2 * inv, -6.0 * inv2 * inv2, &r);
      df_jet_mul (a, &r, out);
    }
  /* The value as a plain division rounds it, so a jet and a double evaluation agree exactly. */
  out->c[0] = value;
}
