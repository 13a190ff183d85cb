/* df-expr-parse.h: the formula reader: text -> df_expr, and ordered named parameters whose values
 * may be expressions of parameters defined before them. Reader layer: GLib allowed.
 *
 * Grammar (ours): numbers with optional exponent (1e-3), + - * / ^, unary minus, parentheses,
 * functions sin cos tan asin acos atan exp log sqrt abs sinh cosh tanh, the constant pi,
 * variables and parameters by name. -x^2 = -(x^2); ^ is right-associative. */
#pragma once

#include <glib.h>

#include "df-expr.h"
#include "df-io-error.h"

/* Caps: the longest formula (or parameter value, or range) in characters, and the most
 * parameters a surface may have. Beyond them a message says so. */
#define DF_EXPR_MAX_LENGTH 10000
#define DF_PARAMS_MAX      1000

typedef struct df_params df_params;

df_params  *df_params_new      (void);
df_params  *df_params_copy     (const df_params *params);
void        df_params_free     (df_params *params);   /* NULL is a no-op */

/* Defines or redefines `name` from expression text, evaluated at once with the parameters
 * defined so far (a redefinition keeps its place and re-evaluates the ones after it).
 * Errors: a bad name, a syntax error (with column), an unknown name, a non-finite value. */
gboolean    df_params_set      (df_params  *params,
                                const char *name,
                                const char *text,
                                GError    **error);
/* Removes `name`; refused (params unchanged) when a later parameter no longer evaluates
 * without it, naming that parameter. Removing an unknown name is an error too. */
gboolean    df_params_remove   (df_params  *params,
                                const char *name,
                                GError    **error);
gboolean    df_params_lookup   (const df_params *params, const char *name, double *value);
guint       df_params_count    (const df_params *params);
const char *df_params_name     (const df_params *params, guint i);
const char *df_params_text     (const df_params *params, guint i);
double      df_params_value    (const df_params *params, guint i);

/* Parses text over the variables var_names[0..n_vars-1] (e.g. {"t"} or {"x", "y"}), with
 * params (may be NULL) folded to constants. On error returns NULL, sets error (SYNTAX or
 * UNKNOWN_NAME) with a message "column 7: expected ')' to close '(' at column 3", and sets
 * *error_column (1-based; optional) to the column. */
df_expr    *df_expr_parse      (const char         *text,
                                const char *const  *var_names,
                                int                 n_vars,
                                const df_params    *params,
                                int                *error_column,
                                GError            **error);

/* Parses and evaluates a constant expression (no variables), e.g. a range "2*pi". */
gboolean    df_expr_parse_value (const char      *text,
                                 const df_params *params,
                                 double          *value,
                                 int             *error_column,
                                 GError         **error);
