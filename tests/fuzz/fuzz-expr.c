/* fuzz-expr.c: the formula reader and evaluator. Input: a formula over x and y (parameters a
 * and b are defined). Rules: parse failures carry a column and a message; a parsed formula
 * evaluates to the same value on doubles and on jets wherever both succeed; the constant
 * reader (ranges) agrees with the variable one on formulas without variables. */
#include <math.h>

#include "df-glib.h"
#include "fuzz-common.h"

/* Formulas longer than this are refused by the reader's cap; more only slows the fuzzer. */
#define FUZZ_MAX_INPUT 4096

static df_params *params;

int LLVMFuzzerInitialize (int *argc, char ***argv);

int
LLVMFuzzerInitialize (int *argc, char ***argv)
{
  df_core_init ();
  params = df_params_new ();
  if (!df_params_set (params, "a", "2", NULL) || !df_params_set (params, "b", "-1.5*a", NULL))
    abort ();
  return 0;
}

static gboolean
close_enough (double p, double q)
{
  if (p == q)
    return TRUE;
  /* Jets and doubles take the same operations in the same order for the value; pow and
   * the compositions may differ in the last bits. Common practice, no source. */
  return fabs (p - q) <= 1e-9 * fmax (1.0, fmax (fabs (p), fabs (q)));
}

int
LLVMFuzzerTestOneInput (const unsigned char *data, size_t size)
{
  static const char *const vars[] = { "x", "y" };
  static const double points[][2] = { { 0.0, 0.0 }, { 0.5, -0.25 }, { -1.75, 2.5 },
                                      { 3.0, 1e-3 }, { 1e3, -7.0 } };
  g_autofree char *text = NULL;
  g_autoptr (GError) error = NULL;
  g_autoptr (df_expr) expr = NULL;
  int column = -1;
  double value;

  if ((size > FUZZ_MAX_INPUT && !fuzz_replaying))
    return 0;
  text = fuzz_string (data, size);

  expr = df_expr_parse (text, vars, 2, params, &column, &error);
  if (expr == NULL)
    {
      fuzz_check_error ("df_expr_parse", error);
      FUZZ_REQUIRE (column >= 1);
      FUZZ_REQUIRE (g_str_has_prefix (error->message, "column "));
    }
  else
    {
      FUZZ_REQUIRE (column == 0 && error == NULL);
      for (gsize i = 0; i < G_N_ELEMENTS (points); i++)
        {
          df_jet jv[2], out;
          df_diag d1, d2;
          df_status s1, s2;
          double plain = NAN;

          df_jet_var (&jv[0], points[i][0], 0);
          df_jet_var (&jv[1], points[i][1], 1);
          s1 = df_expr_eval (expr, points[i], &plain, &d1);
          s2 = df_expr_eval_jet (expr, jv, &out, &d2);
          if (s1 == DF_OK)
            FUZZ_REQUIRE (isfinite (plain));
          else
            fuzz_check_detail ("df_expr_eval", d1.detail);
          if (s2 != DF_OK)
            fuzz_check_detail ("df_expr_eval_jet", d2.detail);
          if (s1 == DF_OK && s2 == DF_OK)
            {
              if (!close_enough (plain, out.c[0]))
                {
                  fprintf (stderr, "at (%g, %g): double %.17g, jet %.17g\n", points[i][0],
                           points[i][1], plain, out.c[0]);
                  abort ();
                }
              for (int k = 0; k < DF_JET_N; k++)
                FUZZ_REQUIRE (isfinite (out.c[k]));
            }
        }
    }

  /* The same text as a constant (a range value): no variables are known. */
  g_clear_error (&error);
  if (!df_expr_parse_value (text, params, &value, &column, &error))
    fuzz_check_error ("df_expr_parse_value", error);
  else
    FUZZ_REQUIRE (isfinite (value));
  return 0;
}
