/* df-jet.h: truncated Taylor polynomials ("jets") in two variables to total degree 3, the
 * number type of forward-mode automatic differentiation. Evaluating a formula on jets gives
 * its value and exact partial derivatives up to third order in one pass.
 * A jet carries its own truncation (how many variables, which order), so that a caller who
 * needs only second derivatives of a profile r(t) pays for 3 coefficients, not 10, and a
 * constant costs a multiplication by a number: the transport asks for second-order jets of a
 * one-variable profile millions of times per report.
 * Plain C + libm; no GLib. */
#pragma once

/* Coefficient layout (Taylor coefficients, not derivatives):
 *   c[0] = f, c[1] = f_x, c[2] = f_y, c[3] = f_xx/2, c[4] = f_xy, c[5] = f_yy/2,
 *   c[6] = f_xxx/6, c[7] = f_xxy/2, c[8] = f_xyy/2, c[9] = f_yyy/6.
 * df_jet_deriv() converts to plain partial derivatives. */
#define DF_JET_N 10

/* n_vars: 0 for a constant (only c[0] may be non-zero), 1 for a function of x alone (only
 * the coefficients of 1, x, x^2, x^3 may be non-zero), 2 for x and y. order: the total degree
 * kept (1..3). Coefficients outside the truncation are always zero, so the full formulas
 * would give the same result; the arithmetic below skips them. The result of an operation
 * keeps the smaller order and the larger number of variables of its non-constant operands. */
typedef struct
{
  double        c[DF_JET_N];
  unsigned char n_vars;
  unsigned char order;
} df_jet;

typedef enum
{
  DF_JET_D    = 0,
  DF_JET_DX   = 1, DF_JET_DY   = 2,
  DF_JET_DXX  = 3, DF_JET_DXY  = 4, DF_JET_DYY  = 5,
  DF_JET_DXXX = 6, DF_JET_DXXY = 7, DF_JET_DXYY = 8, DF_JET_DYYY = 9
} df_jet_index;

void   df_jet_const (df_jet *out, double value);
/* The independent variable `which` (0 = x, 1 = y) at `value`, to full order in x and y. */
void   df_jet_var   (df_jet *out, double value, int which);
/* The same truncated: n_vars 1 (then which must be 0) or 2, order 1..3. */
void   df_jet_seed  (df_jet *out, double value, int which, int n_vars, int order);
/* Plain partial derivative for a coefficient index (undoes the factorial scaling). */
double df_jet_deriv (const df_jet *a, df_jet_index index);

void   df_jet_add   (const df_jet *a, const df_jet *b, df_jet *out);
void   df_jet_sub   (const df_jet *a, const df_jet *b, df_jet *out);
void   df_jet_mul   (const df_jet *a, const df_jet *b, df_jet *out);
void   df_jet_div   (const df_jet *a, const df_jet *b, df_jet *out);
void   df_jet_neg   (const df_jet *a, df_jet *out);
void   df_jet_scale (const df_jet *a, double s, df_jet *out);

/* Applies a scalar function with value and derivatives f0..f3 at a's constant term:
 * out = f0 + f1 h + f2 h^2/2 + f3 h^3/6, h = a - a.c[0]. Every elementary function is this. */
void   df_jet_compose (const df_jet *a, double f0, double f1, double f2, double f3, df_jet *out);
