/* test-expr.c: the formula reader, parameters, double and jet evaluation, and jet arithmetic.
 * Values are checked against GSL (special functions, complex elementary functions and the
 * numerical derivative gsl_deriv_central) and against derivatives worked out by hand with the
 * rules of calculus (from memory). */
#include <gsl/gsl_complex.h>
#include <gsl/gsl_complex_math.h>
#include <gsl/gsl_deriv.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_math.h>
#include <gsl/gsl_sf_exp.h>
#include <gsl/gsl_sf_log.h>
#include <gsl/gsl_sf_trig.h>
#include <math.h>

#include "df-glib.h"
#include "df-test.h"

static const char *const var_t[] = { "t" };
static const char *const var_xy[] = { "x", "y" };

/* ---- helpers ---- */

static df_expr *
parse_ok (const char *text, const char *const *vars, int n_vars, const df_params *params)
{
  g_autoptr (GError) error = NULL;
  int column = -1;
  df_expr *expr = df_expr_parse (text, vars, n_vars, params, &column, &error);

  if (expr == NULL)
    g_error ("'%s' did not parse: %s", text, error->message);
  g_assert_no_error (error);
  g_assert_cmpint (column, ==, 0);
  return expr;
}

/* Value of a formula in t (or constant) at t. */
static double
eval_t (const char *text, double t)
{
  g_autoptr (df_expr) expr = parse_ok (text, var_t, 1, NULL);
  df_diag diag;
  double value = NAN;
  df_status status = df_expr_eval (expr, &t, &value, &diag);

  if (status != DF_OK)
    g_error ("'%s' at t = %g: %s: %s", text, t, df_status_describe (status), diag.detail);
  return value;
}

/* All ten partials of a formula in (x, y) at a point, by jets. */
static void
eval_jet_xy (const df_expr *expr, double x, double y, df_jet *out)
{
  df_jet vars[2];
  df_diag diag;
  df_status status;

  df_jet_var (&vars[0], x, 0);
  df_jet_var (&vars[1], y, 1);
  status = df_expr_eval_jet (expr, vars, out, &diag);
  if (status != DF_OK)
    g_error ("jet at (%g, %g): %s: %s", x, y, df_status_describe (status), diag.detail);
}

typedef struct
{
  const df_expr *expr;
  int            order;   /* 0: value by df_expr_eval; k >= 1: jet's k-th x-derivative */
  double         y;
} deriv_fixture;

/* x -> d^order f / dx^order at (x, y), for gsl_deriv_central. */
static double
deriv_fn (double x, void *data)
{
  const deriv_fixture *fx = data;
  static const df_jet_index index[] = { DF_JET_D, DF_JET_DX, DF_JET_DXX, DF_JET_DXXX };
  double vars[2] = { x, fx->y };
  double value = NAN;
  df_jet jet;

  if (fx->order == 0)
    {
      g_assert_cmpint (df_expr_eval (fx->expr, vars, &value, NULL), ==, DF_OK);
      return value;
    }
  eval_jet_xy (fx->expr, x, fx->y, &jet);
  return df_jet_deriv (&jet, index[fx->order]);
}

/* Reference: GSL's 5-point central difference, gsl_deriv_central, of the order-1 quantity. */
static double
gsl_numeric_dx (const df_expr *expr, int order, double x, double y)
{
  deriv_fixture fx = { expr, order, y };
  gsl_function fn = { deriv_fn, &fx };
  double result = NAN, abserr = NAN;

  g_assert_cmpint (gsl_deriv_central (&fn, x, 1e-3, &result, &abserr), ==, GSL_SUCCESS);
  return result;
}

static void
check_parse_error (const char        *text,
                   const char *const *vars,
                   int                n_vars,
                   const df_params   *params,
                   int                code,
                   int                column,
                   const char        *fragment)
{
  g_autoptr (GError) error = NULL;
  g_autofree char *prefix = g_strdup_printf ("column %d: ", column);
  int got_column = -1;
  df_expr *expr = df_expr_parse (text, vars, n_vars, params, &got_column, &error);

  g_test_message ("'%s' -> %s", text, error != NULL ? error->message : "(parsed)");
  g_assert_null (expr);
  g_assert_error (error, DF_IO_ERROR, code);
  g_assert_cmpint (got_column, ==, column);
  g_assert_true (g_str_has_prefix (error->message, prefix));
  g_assert_nonnull (strstr (error->message, fragment));
}

/* ---- jets ---- */

static void
test_jet_mul (void)
{
  df_jet x, y, s, p;

  /* (1 + x + y)^3 at the origin: the Taylor coefficient of x^i y^j is the trinomial
   * coefficient 3! / (i! j! (3-i-j)!) (binomial theorem, from memory). */
  df_jet_var (&x, 0.0, 0);
  df_jet_var (&y, 0.0, 1);
  df_jet_add (&x, &y, &s);
  s.c[0] = 1.0;
  df_jet_mul (&s, &s, &p);
  df_jet_mul (&p, &s, &p);   /* output aliasing an input is allowed */
  {
    const double want[DF_JET_N] = { 1, 3, 3, 3, 6, 3, 1, 3, 3, 1 };

    for (int k = 0; k < DF_JET_N; k++)
      df_assert_close (p.c[k], want[k], 1e-15, 1e-15);
  }

  /* Plain partials of x^3 at x = 2: 8, 12, 12, 6 (power rule, from memory). */
  df_jet_var (&x, 2.0, 0);
  df_jet_mul (&x, &x, &p);
  df_jet_mul (&p, &x, &p);
  df_assert_close (df_jet_deriv (&p, DF_JET_D), 8.0, 1e-15, 0.0);
  df_assert_close (df_jet_deriv (&p, DF_JET_DX), 12.0, 1e-15, 0.0);
  df_assert_close (df_jet_deriv (&p, DF_JET_DXX), 12.0, 1e-15, 0.0);
  df_assert_close (df_jet_deriv (&p, DF_JET_DXXX), 6.0, 1e-15, 0.0);
  df_assert_close (df_jet_deriv (&p, DF_JET_DY), 0.0, 0.0, 1e-15);
}

static void
test_jet_div_compose (void)
{
  df_jet x, y, one, q, e;

  /* 1/(x y) at (2, 0.5): d/dx = -1/(x^2 y) = -0.5, d2/dxdy = 1/(x^2 y^2) = 1,
   * d3/dy3 = -6/(x y^4) = -48 (power rule, from memory). */
  df_jet_var (&x, 2.0, 0);
  df_jet_var (&y, 0.5, 1);
  df_jet_const (&one, 1.0);
  df_jet_mul (&x, &y, &q);
  df_jet_div (&one, &q, &q);
  df_assert_close (df_jet_deriv (&q, DF_JET_D), 1.0, 1e-15, 0.0);
  df_assert_close (df_jet_deriv (&q, DF_JET_DX), -0.5, 1e-15, 0.0);
  df_assert_close (df_jet_deriv (&q, DF_JET_DXY), 1.0, 1e-15, 0.0);
  df_assert_close (df_jet_deriv (&q, DF_JET_DYYY), -48.0, 1e-14, 0.0);
  /* d/dy (2/(x^3 y)) = -2/(x^3 y^2) = -1 at (2, 0.5) */
  df_assert_close (df_jet_deriv (&q, DF_JET_DXXY), -1.0, 1e-14, 0.0);

  /* exp(x + y) composed: every partial equals exp(x + y) (from memory). */
  df_jet_add (&x, &y, &e);
  df_jet_compose (&e, exp (2.5), exp (2.5), exp (2.5), exp (2.5), &e);
  for (int k = 0; k < DF_JET_N; k++)
    df_assert_close (df_jet_deriv (&e, (df_jet_index) k), gsl_sf_exp (2.5), 1e-14, 0.0);
}

/* ---- values, precedence, numbers ---- */

static void
test_precedence (void)
{
  /* Usual arithmetic conventions (from memory): * before +, left-associative - and /,
   * ^ right-associative and binding tighter than unary minus. */
  df_assert_close (eval_t ("1 + 2*3", 0), 7.0, 0, 0);
  df_assert_close (eval_t ("(1 + 2)*3", 0), 9.0, 0, 0);
  df_assert_close (eval_t ("2 - 3 - 4", 0), -5.0, 0, 0);
  df_assert_close (eval_t ("8/4/2", 0), 1.0, 0, 0);
  df_assert_close (eval_t ("2^3^2", 0), 512.0, 0, 0);
  df_assert_close (eval_t ("(2^3)^2", 0), 64.0, 0, 0);
  df_assert_close (eval_t ("-2^2", 0), -4.0, 0, 0);
  df_assert_close (eval_t ("(-2)^2", 0), 4.0, 0, 0);
  df_assert_close (eval_t ("-t^2", 3.0), -9.0, 0, 0);
  df_assert_close (eval_t ("2*-3", 0), -6.0, 0, 0);
  df_assert_close (eval_t ("2^-1", 0), 0.5, 0, 0);
  df_assert_close (eval_t ("2^-t", 2.0), 0.25, 1e-15, 0);
  df_assert_close (eval_t ("--3", 0), 3.0, 0, 0);
  df_assert_close (eval_t ("+3 - -t", 1.0), 4.0, 0, 0);
  df_assert_close (eval_t ("-(t - 5)*2", 1.0), 8.0, 0, 0);
  df_assert_close (eval_t ("1 - t*t/2", 2.0), -1.0, 0, 0);
  df_assert_close (eval_t ("2*t^2 + 3*t - 4", 2.0), 10.0, 0, 0);
}

static void
test_numbers (void)
{
  /* Decimal notation (from memory). */
  df_assert_close (eval_t ("1e-3", 0), 0.001, 1e-15, 0);
  df_assert_close (eval_t ("2.5E+2", 0), 250.0, 0, 0);
  df_assert_close (eval_t (".5", 0), 0.5, 0, 0);
  df_assert_close (eval_t ("2.", 0), 2.0, 0, 0);
  df_assert_close (eval_t ("  12.75 ", 0), 12.75, 0, 0);
  df_assert_close (eval_t ("\t3\n", 0), 3.0, 0, 0);
  /* pi against GSL's M_PI (gsl_math.h). */
  df_assert_close (eval_t ("pi", 0), M_PI, 1e-16, 0);
  df_assert_close (eval_t ("2*pi*t", 0.5), M_PI, 1e-16, 0);
}

/* Every function's value against GSL: gsl_sf for sin, cos, exp, log; GSL's complex
 * elementary functions (real part on the real axis) for the others. */
static void
test_function_values (void)
{
  df_assert_close (eval_t ("sin(t)", 0.7), gsl_sf_sin (0.7), 1e-15, 0);
  df_assert_close (eval_t ("cos(t)", 0.7), gsl_sf_cos (0.7), 1e-15, 0);
  df_assert_close (eval_t ("tan(t)", 0.4), GSL_REAL (gsl_complex_tan (gsl_complex_rect (0.4, 0))),
                   1e-14, 0);
  df_assert_close (eval_t ("asin(t)", 0.3), GSL_REAL (gsl_complex_arcsin_real (0.3)), 1e-14, 0);
  df_assert_close (eval_t ("acos(t)", -0.4), GSL_REAL (gsl_complex_arccos_real (-0.4)), 1e-14, 0);
  df_assert_close (eval_t ("atan(t)", 1.3),
                   GSL_REAL (gsl_complex_arctan (gsl_complex_rect (1.3, 0))), 1e-14, 0);
  df_assert_close (eval_t ("exp(t)", 0.6), gsl_sf_exp (0.6), 1e-15, 0);
  df_assert_close (eval_t ("log(t)", 2.5), gsl_sf_log (2.5), 1e-15, 0);
  df_assert_close (eval_t ("sqrt(t)", 1.7), GSL_REAL (gsl_complex_sqrt_real (1.7)), 1e-15, 0);
  df_assert_close (eval_t ("abs(t)", -1.2), gsl_complex_abs (gsl_complex_rect (-1.2, 0)), 0, 0);
  df_assert_close (eval_t ("sinh(t)", 0.8),
                   GSL_REAL (gsl_complex_sinh (gsl_complex_rect (0.8, 0))), 1e-14, 0);
  df_assert_close (eval_t ("cosh(t)", -0.9),
                   GSL_REAL (gsl_complex_cosh (gsl_complex_rect (-0.9, 0))), 1e-14, 0);
  df_assert_close (eval_t ("tanh(t)", 0.5),
                   GSL_REAL (gsl_complex_tanh (gsl_complex_rect (0.5, 0))), 1e-14, 0);
  /* A constant argument is folded when the formula is read; the value must not change. */
  df_assert_close (eval_t ("log(2.5) + 0*t", 1.0), gsl_sf_log (2.5), 1e-15, 0);
  df_assert_close (eval_t ("sqrt(2)", 0), M_SQRT2, 1e-16, 0);
}

/* ---- derivatives ---- */

typedef struct
{
  const char *formula;
  double      x;
  double      d1, d2, d3;   /* closed forms, calculus rules (from memory) */
} deriv_case;

static void
test_function_derivatives (void)
{
  const double s = sin (0.7), c = cos (0.7);
  const double ct = cos (0.4), st = sin (0.4);
  const double sh = sinh (0.5), ch = cosh (0.5);
  const deriv_case cases[] = {
    { "sin(x)", 0.7, c, -s, -c },
    { "cos(x)", 0.7, -s, -c, s },
    /* tan' = 1/cos^2, tan'' = 2 sin/cos^3, tan''' = (2 + 4 sin^2)/cos^4 */
    { "tan(x)", 0.4, 1 / (ct * ct), 2 * st / pow (ct, 3), (2 + 4 * st * st) / pow (ct, 4) },
    /* asin' = (1-x^2)^(-1/2), asin'' = x (1-x^2)^(-3/2), asin''' = (1+2x^2)(1-x^2)^(-5/2) */
    { "asin(x)", 0.3, pow (0.91, -0.5), 0.3 * pow (0.91, -1.5), 1.18 * pow (0.91, -2.5) },
    { "acos(x)", -0.4, -pow (0.84, -0.5), 0.4 * pow (0.84, -1.5), -1.32 * pow (0.84, -2.5) },
    /* atan' = 1/(1+x^2), atan'' = -2x/(1+x^2)^2, atan''' = (6x^2-2)/(1+x^2)^3 */
    { "atan(x)", 1.3, 1 / 2.69, -2.6 / (2.69 * 2.69), (6 * 1.69 - 2) / pow (2.69, 3) },
    { "exp(x)", 0.6, exp (0.6), exp (0.6), exp (0.6) },
    { "log(x)", 2.5, 1 / 2.5, -1 / 6.25, 2 / 15.625 },
    { "sqrt(x)", 1.7, 0.5 * pow (1.7, -0.5), -0.25 * pow (1.7, -1.5), 0.375 * pow (1.7, -2.5) },
    { "abs(x)", -1.2, -1, 0, 0 },
    { "sinh(x)", 0.8, cosh (0.8), sinh (0.8), cosh (0.8) },
    { "cosh(x)", -0.9, sinh (-0.9), cosh (-0.9), sinh (-0.9) },
    /* tanh' = 1/cosh^2, tanh'' = -2 sinh/cosh^3, tanh''' = (4 sinh^2 - 2)/cosh^4 */
    { "tanh(x)", 0.5, 1 / (ch * ch), -2 * sh / pow (ch, 3), (4 * sh * sh - 2) / pow (ch, 4) },
    /* x^2.5: 2.5 x^1.5, 3.75 x^0.5, 1.875 x^-0.5 (power rule) */
    { "x^2.5", 1.3, 2.5 * pow (1.3, 1.5), 3.75 * pow (1.3, 0.5), 1.875 * pow (1.3, -0.5) },
    /* chain rule: d^k/dx^k sin(3x) = 3^k sin^(k)(3x) */
    { "sin(3*x)", 0.2, 3 * cos (0.6), -9 * sin (0.6), -27 * cos (0.6) },
  };

  for (size_t i = 0; i < G_N_ELEMENTS (cases); i++)
    {
      const deriv_case *dc = &cases[i];
      g_autoptr (df_expr) expr = parse_ok (dc->formula, var_xy, 2, NULL);
      df_jet jet;
      double value;

      g_test_message ("%s at x = %g", dc->formula, dc->x);
      eval_jet_xy (expr, dc->x, 0.25, &jet);
      g_assert_cmpint (df_expr_eval (expr, (double[]) { dc->x, 0.25 }, &value, NULL), ==, DF_OK);
      df_assert_close (jet.c[0], value, 1e-15, 0);
      df_assert_close (df_jet_deriv (&jet, DF_JET_DX), dc->d1, 1e-12, 1e-14);
      df_assert_close (df_jet_deriv (&jet, DF_JET_DXX), dc->d2, 1e-12, 1e-14);
      df_assert_close (df_jet_deriv (&jet, DF_JET_DXXX), dc->d3, 1e-12, 1e-14);
      /* No dependence on y. */
      for (int k = DF_JET_DY; k < DF_JET_N; k++)
        if (k != DF_JET_DXX && k != DF_JET_DXXX)
          df_assert_close (jet.c[k], 0.0, 0, 0);

      /* Each order is the numerical derivative of the one below (reference: GSL's
       * gsl_deriv_central; tolerance loose for its truncation and rounding error). */
      df_assert_close (df_jet_deriv (&jet, DF_JET_DX), gsl_numeric_dx (expr, 0, dc->x, 0.25),
                       1e-6, 1e-7);
      df_assert_close (df_jet_deriv (&jet, DF_JET_DXX), gsl_numeric_dx (expr, 1, dc->x, 0.25),
                       1e-6, 1e-7);
      df_assert_close (df_jet_deriv (&jet, DF_JET_DXXX), gsl_numeric_dx (expr, 2, dc->x, 0.25),
                       1e-6, 1e-7);
    }
}

/* g(x) = x^3/(1+x^2) = x - x/(1+x^2) and its derivatives, worked by hand (quotient rule):
 * g' = 1 - (1-x^2)/(1+x^2)^2, g'' = 2x(3-x^2)/(1+x^2)^3, g''' = 6(x^4-6x^2+1)/(1+x^2)^4. */
static void
g_derivs (double x, double g[4])
{
  double q = 1 + x * x;

  g[0] = x * x * x / q;
  g[1] = 1 - (1 - x * x) / (q * q);
  g[2] = 2 * x * (3 - x * x) / (q * q * q);
  g[3] = 6 * (x * x * x * x - 6 * x * x + 1) / (q * q * q * q);
}

static void
test_bivariate_third (void)
{
  g_autoptr (df_expr) f = parse_ok ("exp(x)*sin(y) + x^3*y^2 / (1 + x^2)", var_xy, 2, NULL);
  const double pts[][2] = { { 0.3, 0.8 }, { -1.1, 2.0 }, { 1.7, -0.4 } };

  for (size_t i = 0; i < G_N_ELEMENTS (pts); i++)
    {
      double x = pts[i][0], y = pts[i][1];
      double e = exp (x), sy = sin (y), cy = cos (y), g[4];
      df_jet jet;

      g_derivs (x, g);
      eval_jet_xy (f, x, y, &jet);
      /* f = e^x sin y + g(x) y^2, differentiated term by term (from memory). */
      df_assert_close (df_jet_deriv (&jet, DF_JET_D), e * sy + g[0] * y * y, 1e-13, 1e-14);
      df_assert_close (df_jet_deriv (&jet, DF_JET_DX), e * sy + g[1] * y * y, 1e-13, 1e-14);
      df_assert_close (df_jet_deriv (&jet, DF_JET_DY), e * cy + 2 * g[0] * y, 1e-13, 1e-14);
      df_assert_close (df_jet_deriv (&jet, DF_JET_DXX), e * sy + g[2] * y * y, 1e-13, 1e-14);
      df_assert_close (df_jet_deriv (&jet, DF_JET_DXY), e * cy + 2 * g[1] * y, 1e-13, 1e-14);
      df_assert_close (df_jet_deriv (&jet, DF_JET_DYY), -e * sy + 2 * g[0], 1e-13, 1e-14);
      df_assert_close (df_jet_deriv (&jet, DF_JET_DXXX), e * sy + g[3] * y * y, 1e-13, 1e-14);
      df_assert_close (df_jet_deriv (&jet, DF_JET_DXXY), e * cy + 2 * g[2] * y, 1e-13, 1e-14);
      df_assert_close (df_jet_deriv (&jet, DF_JET_DXYY), -e * sy + 2 * g[1], 1e-13, 1e-14);
      df_assert_close (df_jet_deriv (&jet, DF_JET_DYYY), -e * cy, 1e-13, 1e-14);
      /* The hand-worked g' itself, against GSL's numerical derivative of the value. */
      df_assert_close (e * sy + g[1] * y * y, gsl_numeric_dx (f, 0, x, y), 1e-6, 1e-7);
      df_assert_close (df_jet_deriv (&jet, DF_JET_DXXX), gsl_numeric_dx (f, 2, x, y), 1e-6, 1e-7);
    }
}

static void
test_product_chain (void)
{
  g_autoptr (df_expr) f = parse_ok ("sin(x*y)", var_xy, 2, NULL);
  g_autoptr (df_expr) p = parse_ok ("x^y", var_xy, 2, NULL);
  double x = 0.9, y = 1.4, u = x * y, su = sin (u), cu = cos (u);
  df_jet jet;

  /* Chain and product rules on sin(xy) (from memory). */
  eval_jet_xy (f, x, y, &jet);
  df_assert_close (df_jet_deriv (&jet, DF_JET_DX), y * cu, 1e-14, 0);
  df_assert_close (df_jet_deriv (&jet, DF_JET_DY), x * cu, 1e-14, 0);
  df_assert_close (df_jet_deriv (&jet, DF_JET_DXX), -y * y * su, 1e-14, 0);
  df_assert_close (df_jet_deriv (&jet, DF_JET_DXY), cu - u * su, 1e-13, 0);
  df_assert_close (df_jet_deriv (&jet, DF_JET_DYY), -x * x * su, 1e-14, 0);
  df_assert_close (df_jet_deriv (&jet, DF_JET_DXXX), -y * y * y * cu, 1e-13, 0);
  df_assert_close (df_jet_deriv (&jet, DF_JET_DXXY), -2 * y * su - x * y * y * cu, 1e-13, 0);
  df_assert_close (df_jet_deriv (&jet, DF_JET_DXYY), -2 * x * su - x * x * y * cu, 1e-13, 0);
  df_assert_close (df_jet_deriv (&jet, DF_JET_DYYY), -x * x * x * cu, 1e-13, 0);

  /* x^y with a variable exponent: d/dx = y x^(y-1), d/dy = x^y ln x,
   * d2/dxdy = x^(y-1) (1 + y ln x), d2/dy2 = x^y ln^2 x (from memory). */
  x = 1.6, y = 0.7;
  eval_jet_xy (p, x, y, &jet);
  df_assert_close (df_jet_deriv (&jet, DF_JET_D), pow (x, y), 1e-14, 0);
  df_assert_close (df_jet_deriv (&jet, DF_JET_DX), y * pow (x, y - 1), 1e-13, 0);
  df_assert_close (df_jet_deriv (&jet, DF_JET_DY), pow (x, y) * log (x), 1e-13, 0);
  df_assert_close (df_jet_deriv (&jet, DF_JET_DXY), pow (x, y - 1) * (1 + y * log (x)), 1e-13, 0);
  df_assert_close (df_jet_deriv (&jet, DF_JET_DYY), pow (x, y) * log (x) * log (x), 1e-13, 0);
  df_assert_close (df_jet_deriv (&jet, DF_JET_DXX), gsl_numeric_dx (p, 1, x, y), 1e-6, 1e-7);
}

static void
test_integer_power (void)
{
  g_autoptr (df_expr) cube = parse_ok ("x^3", var_xy, 2, NULL);
  g_autoptr (df_expr) inv = parse_ok ("x^-2", var_xy, 2, NULL);
  g_autoptr (df_expr) half = parse_ok ("x^0.5", var_xy, 2, NULL);
  g_autoptr (df_expr) zero = parse_ok ("x^0", var_xy, 2, NULL);
  df_jet jet;
  df_diag diag;
  double value;

  /* Integer powers of a negative base are defined; power rule (from memory):
   * x^3 at -2: -8, 12, -12, 6. */
  eval_jet_xy (cube, -2.0, 0.0, &jet);
  df_assert_close (df_jet_deriv (&jet, DF_JET_D), -8.0, 0, 0);
  df_assert_close (df_jet_deriv (&jet, DF_JET_DX), 12.0, 0, 0);
  df_assert_close (df_jet_deriv (&jet, DF_JET_DXX), -12.0, 0, 0);
  df_assert_close (df_jet_deriv (&jet, DF_JET_DXXX), 6.0, 0, 0);
  /* x^-2 at -2: 1/4, -2x^-3 = 1/4, 6x^-4 = 3/8, -24x^-5 = 3/4. */
  eval_jet_xy (inv, -2.0, 0.0, &jet);
  df_assert_close (df_jet_deriv (&jet, DF_JET_D), 0.25, 1e-15, 0);
  df_assert_close (df_jet_deriv (&jet, DF_JET_DX), 0.25, 1e-15, 0);
  df_assert_close (df_jet_deriv (&jet, DF_JET_DXX), 0.375, 1e-15, 0);
  df_assert_close (df_jet_deriv (&jet, DF_JET_DXXX), 0.75, 1e-15, 0);
  /* x^0 = 1 everywhere, even at 0 (the usual convention for polynomials). */
  eval_jet_xy (zero, 0.0, 0.0, &jet);
  df_assert_close (jet.c[0], 1.0, 0, 0);
  df_assert_close (jet.c[1], 0.0, 0, 0);
  df_assert_close (eval_t ("(-3)^3", 0), -27.0, 0, 0);
  df_assert_close (eval_t ("t^4", -1.5), 5.0625, 0, 0);
  df_assert_close (eval_t ("t^3", 0), 0.0, 0, 0);
  df_assert_close (eval_t ("t^0.5", 0), 0.0, 0, 0);

  /* A non-integer power of a negative base is not real. */
  g_assert_cmpint (df_expr_eval (half, (double[]) { -2.0, 0.0 }, &value, &diag), ==,
                   DF_E_DOMAIN);
  g_assert_nonnull (strstr (diag.detail, "negative base -2"));
  g_assert_cmpint (df_expr_eval (inv, (double[]) { 0.0, 0.0 }, &value, &diag), ==, DF_E_DOMAIN);
  g_assert_nonnull (strstr (diag.detail, "division by zero"));
}

/* ---- evaluation errors ---- */

static void
check_eval_error (const char *text, double t, df_status want, const char *detail)
{
  g_autoptr (df_expr) expr = parse_ok (text, var_t, 1, NULL);
  df_diag diag;
  double value = 12345.0;
  df_status status = df_expr_eval (expr, &t, &value, &diag);

  g_test_message ("%s at %g -> %s", text, t, diag.detail);
  g_assert_cmpint (status, ==, want);
  g_assert_cmpstr (diag.detail, ==, detail);
  g_assert_cmpfloat (value, ==, 12345.0);   /* output untouched on failure */
}

static void
test_domain_errors (void)
{
  df_jet tj, out;
  df_diag diag;

  check_eval_error ("log(t)", -2.0, DF_E_DOMAIN, "log of -2");
  check_eval_error ("log(t)", 0.0, DF_E_DOMAIN, "log of 0");
  check_eval_error ("sqrt(t)", -0.5, DF_E_DOMAIN, "sqrt of -0.5");
  check_eval_error ("1/t", 0.0, DF_E_DOMAIN, "division by zero");
  check_eval_error ("asin(t)", 1.5, DF_E_DOMAIN, "asin of 1.5");
  check_eval_error ("acos(t)", -2.0, DF_E_DOMAIN, "acos of -2");
  check_eval_error ("2 + exp(t)", 1000.0, DF_E_NONFINITE, "exp of 1000 is not finite");
  check_eval_error ("t*t*t", 1e200, DF_E_NONFINITE, "1e+200 * 1e+200 is not finite");

  /* sqrt(0) has a value but no derivative: fine on doubles, refused on jets. */
  df_assert_close (eval_t ("sqrt(t)", 0.0), 0.0, 0, 0);
  {
    g_autoptr (df_expr) expr = parse_ok ("sqrt(t)", var_t, 1, NULL);

    df_jet_var (&tj, 0.0, 0);
    g_assert_cmpint (df_expr_eval_jet (expr, &tj, &out, &diag), ==, DF_E_DOMAIN);
    g_assert_cmpstr (diag.detail, ==, "sqrt at 0 has no derivative");
  }
  {
    g_autoptr (df_expr) expr = parse_ok ("log(t)", var_t, 1, NULL);

    df_jet_var (&tj, -2.0, 0);
    g_assert_cmpint (df_expr_eval_jet (expr, &tj, &out, &diag), ==, DF_E_DOMAIN);
    g_assert_cmpstr (diag.detail, ==, "log of -2");
  }
  /* abs at its kink: value 0, slope taken as 0 (documented choice, no source). */
  {
    g_autoptr (df_expr) expr = parse_ok ("abs(t)", var_t, 1, NULL);

    df_jet_var (&tj, 0.0, 0);
    g_assert_cmpint (df_expr_eval_jet (expr, &tj, &out, &diag), ==, DF_OK);
    df_assert_close (out.c[0], 0.0, 0, 0);
    df_assert_close (out.c[1], 0.0, 0, 0);
  }
}

/* ---- parse errors ---- */

static void
test_parse_errors (void)
{
  g_autoptr (df_params) params = df_params_new ();
  g_autofree char *opens = g_strnfill (300, '(');
  g_autofree char *closes = g_strnfill (300, ')');
  g_autofree char *deep_parens = NULL;
  g_autoptr (GString) deep_sum = g_string_new (NULL);

  g_assert_true (df_params_set (params, "R", "120", NULL));
  g_assert_true (df_params_set (params, "a", "R/4", NULL));

  check_parse_error ("2x", var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 2,
                     "expected an operator, found 'x'");
  check_parse_error ("", var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 1, "empty formula");
  check_parse_error ("   ", var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 1, "empty formula");
  check_parse_error ("2*(t+1", var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 7,
                     "expected ')' to close '(' at column 3");
  check_parse_error ("2 * ", var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 5,
                     "expected an operand after '*'");
  check_parse_error ("2+3#", var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 4, "unexpected character '#'");
  check_parse_error ("foo", var_t, 1, params, DF_IO_ERROR_UNKNOWN_NAME, 1,
                     "unknown name 'foo' (variables: t; parameters: R, a)");
  check_parse_error ("1 + foo(t)", var_t, 1, NULL, DF_IO_ERROR_UNKNOWN_NAME, 5,
                     "unknown function 'foo'");
  check_parse_error ("ln(t)", var_t, 1, NULL, DF_IO_ERROR_UNKNOWN_NAME, 1, "did you mean 'log'?");
  check_parse_error ("sin t", var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 1,
                     "function 'sin' needs parentheses");
  check_parse_error ("2*cos", var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 3,
                     "function 'cos' needs parentheses");
  check_parse_error (")", var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 1, "expected an operand, found ')'");
  check_parse_error ("(1+2))", var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 6,
                     "')' without a matching '('");
  check_parse_error ("(t 2)", var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 4,
                     "expected an operator or ')' to close '(' at column 1, found '2'");
  check_parse_error ("1e+", var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 4, "digits of the exponent");
  check_parse_error ("2^^3", var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 3,
                     "expected an operand after '^', found '^'");
  check_parse_error ("sin()", var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 5,
                     "expected an operand after '(', found ')'");
  check_parse_error ("t(2)", var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 2, "'t' is not a function");
  check_parse_error ("atan(1, 2)", var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 7,
                     "unexpected character ','");
  /* Columns count characters, not bytes: "×" is two bytes in UTF-8. */
  check_parse_error ("t \xc3\x97 2", var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 3,
                     "unexpected character '\xc3\x97'; write '*' to multiply");
  check_parse_error ("\xcf\x80 + #", var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 1, "write 'pi'");
  check_parse_error ("1 + \xff", var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 5, "not valid UTF-8");
  check_parse_error ("x + y", var_t, 1, NULL, DF_IO_ERROR_UNKNOWN_NAME, 1,
                     "unknown name 'x' (variables: t; no parameters)");
  check_parse_error ("t", NULL, 0, params, DF_IO_ERROR_UNKNOWN_NAME, 1,
                     "unknown name 't' (no variables; parameters: R, a)");
  /* Constant parts are evaluated while reading, so their domain errors point at the place. */
  check_parse_error ("t + 1/0", var_t, 1, NULL, DF_IO_ERROR_VALUE, 6, "division by zero");
  check_parse_error ("t*log(-2)", var_t, 1, NULL, DF_IO_ERROR_VALUE, 3, "log of -2");
  check_parse_error ("1e999 + t", var_t, 1, NULL, DF_IO_ERROR_VALUE, 1, "too large");
  check_parse_error ("exp(1000)", var_t, 1, NULL, DF_IO_ERROR_VALUE, 1, "not finite");

  /* Nesting limits: parentheses (recursion depth) and the operand stack. */
  deep_parens = g_strdup_printf ("%s1%s", opens, closes);
  check_parse_error (deep_parens, var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 201,
                     "formula too deeply nested");
  for (int i = 0; i < 80; i++)
    g_string_append (deep_sum, "t+(");
  g_string_append (deep_sum, "t");
  for (int i = 0; i < 80; i++)
    g_string_append (deep_sum, ")");
  /* The 65th operand on the stack (column 3 * 64 + 1) is one too many. */
  check_parse_error (deep_sum->str, var_t, 1, NULL, DF_IO_ERROR_SYNTAX, 3 * 64 + 1,
                     "formula too deeply nested");
  /* ...while a long flat formula is fine: a + b + c ... never holds more than 2 operands. */
  {
    g_autoptr (GString) flat = g_string_new ("t");

    for (int i = 0; i < 500; i++)
      g_string_append (flat, " + t*t");
    df_assert_close (eval_t (flat->str, 2.0), 2.0 + 500 * 4.0, 0, 0);
  }
}

/* ---- parameters ---- */

/* Removing a parameter (the surface panel's delete button): refused, naming the user, while a
 * later one is defined through it; allowed once that one is gone, the rest re-evaluated from
 * their texts (values by hand: R/4 = 30, 30^2 = 900). */
static void
test_params_remove (void)
{
  g_autoptr (df_params) params = df_params_new ();
  g_autoptr (GError) error = NULL;
  double value = 0;

  g_assert_true (df_params_set (params, "R", "120", &error));
  g_assert_true (df_params_set (params, "a", "R/4", &error));
  g_assert_true (df_params_set (params, "h", "40", &error));
  g_assert_true (df_params_set (params, "b", "a^2", &error));
  g_assert_no_error (error);

  g_assert_false (df_params_remove (params, "a", &error));
  g_assert_error (error, DF_IO_ERROR, DF_IO_ERROR_UNKNOWN_NAME);
  g_assert_nonnull (strstr (error->message, "'a' is used by 'b'"));
  g_clear_error (&error);
  g_assert_cmpuint (df_params_count (params), ==, 4);
  df_assert_close (df_params_value (params, 3), 900.0, 0, 0);

  g_assert_false (df_params_remove (params, "nope", &error));
  g_assert_error (error, DF_IO_ERROR, DF_IO_ERROR_UNKNOWN_NAME);
  g_clear_error (&error);

  g_assert_true (df_params_remove (params, "h", &error));
  g_assert_no_error (error);
  g_assert_cmpuint (df_params_count (params), ==, 3);
  g_assert_false (df_params_lookup (params, "h", &value));
  g_assert_cmpstr (df_params_name (params, 2), ==, "b");
  df_assert_close (df_params_value (params, 2), 900.0, 0, 0);

  g_assert_true (df_params_remove (params, "b", &error));
  g_assert_true (df_params_remove (params, "a", &error));
  g_assert_no_error (error);
  g_assert_cmpuint (df_params_count (params), ==, 1);
  g_assert_true (df_params_lookup (params, "R", &value));
  df_assert_close (value, 120.0, 0, 0);
}

static void
test_params (void)
{
  g_autoptr (df_params) params = df_params_new ();
  g_autoptr (df_params) copy = NULL;
  g_autoptr (GError) error = NULL;
  g_autoptr (df_expr) expr = NULL;
  double value = 0, t = 0.5;

  g_assert_true (df_params_set (params, "R", "120", &error));
  g_assert_true (df_params_set (params, "a", "R/4", &error));
  g_assert_true (df_params_set (params, "b_2", "a^2 + 2*pi", &error));
  g_assert_no_error (error);
  g_assert_cmpuint (df_params_count (params), ==, 3);
  g_assert_cmpstr (df_params_name (params, 1), ==, "a");
  g_assert_cmpstr (df_params_text (params, 1), ==, "R/4");
  df_assert_close (df_params_value (params, 1), 30.0, 0, 0);
  g_assert_true (df_params_lookup (params, "b_2", &value));
  df_assert_close (value, 900.0 + 2 * M_PI, 1e-15, 0);
  g_assert_false (df_params_lookup (params, "c", &value));

  /* Parameters fold into formulas as constants. */
  expr = parse_ok ("R*sin(t) + a", var_t, 1, params);
  g_assert_cmpint (df_expr_eval (expr, &t, &value, NULL), ==, DF_OK);
  df_assert_close (value, 120 * gsl_sf_sin (0.5) + 30, 1e-15, 0);
  g_assert_true (df_expr_parse_value ("2*pi*a", params, &value, NULL, &error));
  df_assert_close (value, 60 * M_PI, 1e-15, 0);

  /* A redefinition keeps its place and re-evaluates the parameters after it. */
  copy = df_params_copy (params);
  g_assert_true (df_params_set (params, "R", "200", &error));
  g_assert_cmpstr (df_params_name (params, 0), ==, "R");
  df_assert_close (df_params_value (params, 1), 50.0, 0, 0);
  df_assert_close (df_params_value (params, 2), 2500.0 + 2 * M_PI, 1e-15, 0);
  /* The copy is independent. */
  df_assert_close (df_params_value (copy, 1), 30.0, 0, 0);

  /* A parameter sees only the ones before it; a failure leaves everything unchanged. */
  g_assert_true (df_params_set (params, "c", "log(a)", &error));
  g_assert_false (df_params_set (params, "a", "-1", &error));
  g_assert_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE);
  g_assert_nonnull (strstr (error->message, "parameter 'c'"));
  g_assert_nonnull (strstr (error->message, "log of -1"));
  g_clear_error (&error);
  df_assert_close (df_params_value (params, 1), 50.0, 0, 0);
  g_assert_cmpstr (df_params_text (params, 1), ==, "R/4");
  g_assert_false (df_params_set (params, "R", "c + 1", &error));
  g_assert_error (error, DF_IO_ERROR, DF_IO_ERROR_UNKNOWN_NAME);
  g_assert_true (g_str_has_prefix (error->message, "column 1: unknown name 'c'"));
  g_clear_error (&error);
  g_assert_false (df_params_set (params, "d", "2*", &error));
  g_assert_error (error, DF_IO_ERROR, DF_IO_ERROR_SYNTAX);
  g_assert_true (g_str_has_prefix (error->message, "column 3: "));
  g_clear_error (&error);
  g_assert_cmpuint (df_params_count (params), ==, 4);

  /* Reserved and malformed names. */
  g_assert_false (df_params_set (params, "sin", "1", &error));
  g_assert_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE);
  g_clear_error (&error);
  g_assert_false (df_params_set (params, "pi", "3", &error));
  g_assert_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE);
  g_clear_error (&error);
  g_assert_false (df_params_set (params, "2a", "1", &error));
  g_assert_error (error, DF_IO_ERROR, DF_IO_ERROR_SYNTAX);
  g_clear_error (&error);
  g_assert_false (df_params_set (params, "", "1", &error));
  g_assert_error (error, DF_IO_ERROR, DF_IO_ERROR_SYNTAX);
  g_clear_error (&error);
  g_assert_cmpuint (df_params_count (params), ==, 4);

  /* A parameter named like a variable is refused by the formula reader. */
  g_assert_true (df_params_set (params, "t", "1", &error));
  check_parse_error ("R*t", var_t, 1, params, DF_IO_ERROR_UNKNOWN_NAME, 3,
                     "'t' is both a variable and a parameter");
  check_parse_error ("R", var_t, 1, params, DF_IO_ERROR_UNKNOWN_NAME, 1,
                     "parameter 't' has the same name as a variable");
}

static void
test_parse_value (void)
{
  g_autoptr (GError) error = NULL;
  double value = 0;
  int column = -1;

  g_assert_true (df_expr_parse_value ("pi/2", NULL, &value, &column, &error));
  df_assert_close (value, M_PI_2, 1e-16, 0);
  g_assert_cmpint (column, ==, 0);
  g_assert_false (df_expr_parse_value ("t", NULL, &value, &column, &error));
  g_assert_error (error, DF_IO_ERROR, DF_IO_ERROR_UNKNOWN_NAME);
  g_assert_cmpint (column, ==, 1);
  g_clear_error (&error);
  g_assert_false (df_expr_parse_value ("sqrt(-1)", NULL, &value, &column, &error));
  g_assert_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE);
  g_assert_cmpstr (error->message, ==, "column 1: sqrt of -1");
}

static void
test_copy (void)
{
  g_autoptr (df_expr) expr = parse_ok ("x*y - cos(x)", var_xy, 2, NULL);
  g_autoptr (df_expr) copy = df_expr_copy (expr);
  double a = 0, b = 1, v[2] = { 0.3, -2.0 };

  g_assert_nonnull (copy);
  g_assert_cmpint (df_expr_n_vars (copy), ==, 2);
  g_assert_cmpint (df_expr_n_vars (NULL), ==, 0);
  g_clear_pointer (&expr, df_expr_free);
  g_assert_cmpint (df_expr_eval (copy, v, &a, NULL), ==, DF_OK);
  /* The value by libm directly, the same expression written out. */
  b = 0.3 * -2.0 - cos (0.3);
  df_assert_close (a, b, 1e-15, 0);
  df_expr_free (NULL);
}

int
main (int argc, char *argv[])
{
  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);

  g_test_add_func ("/core/jet/mul", test_jet_mul);
  g_test_add_func ("/core/jet/div-compose", test_jet_div_compose);
  g_test_add_func ("/core/expr/precedence", test_precedence);
  g_test_add_func ("/core/expr/numbers", test_numbers);
  g_test_add_func ("/core/expr/function-values", test_function_values);
  g_test_add_func ("/core/expr/function-derivatives", test_function_derivatives);
  g_test_add_func ("/core/expr/bivariate-third", test_bivariate_third);
  g_test_add_func ("/core/expr/product-chain", test_product_chain);
  g_test_add_func ("/core/expr/integer-power", test_integer_power);
  g_test_add_func ("/core/expr/domain-errors", test_domain_errors);
  g_test_add_func ("/core/expr/parse-errors", test_parse_errors);
  g_test_add_func ("/core/expr/params", test_params);
  g_test_add_func ("/core/expr/params-remove", test_params_remove);
  g_test_add_func ("/core/expr/parse-value", test_parse_value);
  g_test_add_func ("/core/expr/copy", test_copy);
  return g_test_run ();
}
