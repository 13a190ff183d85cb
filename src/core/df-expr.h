/* df-expr.h: a compiled formula (a small stack program over named variables with parameters
 * folded to constants) and its evaluation on doubles or on jets (df-jet.h).
 * Plain C + libm; no GLib. Parsing lives in df-expr-parse.h (reader layer).
 *
 * A df_expr is immutable once built, so one may be evaluated from several threads. */
#pragma once

#include "df-jet.h"
#include "df-status.h"

#define DF_EXPR_MAX_VARS 2

typedef struct df_expr df_expr;

/* Deep copy; NULL on out-of-memory. */
df_expr  *df_expr_copy     (const df_expr *expr);
void      df_expr_free     (df_expr *expr);           /* NULL is a no-op */
int       df_expr_n_vars   (const df_expr *expr);

/* Evaluates with vars[0..n_vars-1]. DF_E_DOMAIN when a function is outside its domain
 * (log of a negative, sqrt of a negative, division by zero), DF_E_NONFINITE when the result
 * is not finite; diag->detail then names the operation ("log of -2"). */
df_status df_expr_eval     (const df_expr *expr, const double *vars, double *out, df_diag *diag);

/* Same on jets: vars are df_jet_var() seeds; out has value and partials to third order. */
df_status df_expr_eval_jet (const df_expr *expr, const df_jet *vars, df_jet *out, df_diag *diag);
