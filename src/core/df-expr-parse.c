/* df-expr-parse.c: the formula reader (text -> df_expr) and the ordered named parameters.
 * A small recursive-descent parser of our own that emits postfix code straight into the builder
 * of df-expr-private.h. Debian's libmatheval was examined and not used: its symbolic
 * derivatives come back unsimplified and grow quickly with each order (we need third
 * derivatives, which jets give exactly at the cost of one evaluation), and its errors carry no
 * position, while a user typing a mould profile needs "column 7: ...". Reader layer: GLib. */
#include "df-expr-parse.h"

#include <math.h>
#include <string.h>

#include "df-expr-private.h"

/* Nesting of parentheses, unary signs and exponents the recursion may reach; deep enough for
 * any real formula, shallow enough that hostile input cannot exhaust the C stack. */
#define MAX_NESTING 200

/* Parameter names listed in an "unknown name" message before it says "...". */
#define MAX_LISTED 12

typedef struct
{
  char  *name;
  char  *text;
  double value;
} df_param;

struct df_params
{
  GPtrArray *items;   /* of df_param, in definition order */
};

typedef enum
{
  TOK_END,
  TOK_NUMBER,
  TOK_NAME,
  TOK_PLUS,
  TOK_MINUS,
  TOK_STAR,
  TOK_SLASH,
  TOK_CARET,
  TOK_OPEN,
  TOK_CLOSE
} token_kind;

typedef struct
{
  /* input */
  const char         *text;
  const char *const  *var_names;
  int                 n_vars;
  const df_params    *params;
  guint               n_params;   /* only params->items[0..n_params-1] are visible */
  /* state */
  df_expr_builder    *builder;
  int                 nesting;
  const char         *pos;        /* just after the current token */
  token_kind          tok;
  const char         *tok_start;
  size_t              tok_len;
  double              tok_value;
  /* output */
  GError            **error;
  int                 error_column;
} parser;

/* ---- messages ---- */

static int
column_of (const parser *p, const char *at)
{
  return (int) g_utf8_strlen (p->text, at - p->text) + 1;
}

/* Sets the error "column N: ..." for the place `at` in the text. Always returns FALSE. */
static gboolean fail (parser *p, DfIoError code, const char *at, const char *format, ...)
  G_GNUC_PRINTF (4, 5);

static gboolean
fail (parser *p, DfIoError code, const char *at, const char *format, ...)
{
  g_autofree char *msg = NULL;
  va_list ap;

  if (p->error_column > 0)   /* keep the first error */
    return FALSE;
  p->error_column = column_of (p, at);
  va_start (ap, format);
  msg = g_strdup_vprintf (format, ap);
  va_end (ap);
  g_set_error (p->error, DF_IO_ERROR, code, "column %d: %s", p->error_column, msg);
  return FALSE;
}

/* How the current token reads in a message: "'x'", "'2.5'", "the end of the formula". */
static char *
describe_token (const parser *p)
{
  if (p->tok == TOK_END)
    return g_strdup ("the end of the formula");
  return g_strdup_printf ("'%.*s'", (int) MIN (p->tok_len, 40), p->tok_start);
}

/* Turns a failed builder call into a GError at `at`. */
static gboolean
fail_build (parser *p, df_status status, const df_diag *diag, const char *at)
{
  switch (status)
    {
    case DF_E_DOMAIN:
    case DF_E_NONFINITE:
      return fail (p, DF_IO_ERROR_VALUE, at, "%s", diag->detail);
    case DF_E_NOMEM:
      return fail (p, DF_IO_ERROR_VALUE, at, "out of memory");
    default:
      return fail (p, DF_IO_ERROR_SYNTAX, at, "%s", diag->detail);
    }
}

static gboolean
emit_op (parser *p, df_expr_op op, const char *at)
{
  df_diag diag;
  df_status status = _df_expr_builder_op (p->builder, op, &diag);

  return status == DF_OK || fail_build (p, status, &diag, at);
}

static gboolean
emit_const (parser *p, double value, const char *at)
{
  df_diag diag;
  df_status status = _df_expr_builder_const (p->builder, value, &diag);

  return status == DF_OK || fail_build (p, status, &diag, at);
}

static gboolean
emit_var (parser *p, int index, const char *at)
{
  df_diag diag;
  df_status status = _df_expr_builder_var (p->builder, index, &diag);

  return status == DF_OK || fail_build (p, status, &diag, at);
}

/* ---- tokens ---- */

static gboolean
is_name_start (char c)
{
  return g_ascii_isalpha (c) || c == '_';
}

static gboolean
is_name_char (char c)
{
  return g_ascii_isalnum (c) || c == '_';
}

/* A hint for characters people type from other habits. */
static const char *
character_hint (const char *utf8)
{
  static const struct { const char *c; const char *hint; } hints[] = {
    { "\xc3\x97", "; write '*' to multiply" },                          /* × */
    { "\xc2\xb7", "; write '*' to multiply" },                          /* · */
    { "\xc2\xb2", "; write '^2' for a square" },                        /* ² */
    { "\xc2\xb3", "; write '^3' for a cube" },                          /* ³ */
    { "\xcf\x80", "; write 'pi'" },                                      /* π */
    { "\xe2\x88\x92", "; write '-' (ASCII minus)" },                     /* − */
    { ",", "; functions take one argument, and decimals use '.'" },
  };

  for (size_t i = 0; i < G_N_ELEMENTS (hints); i++)
    if (strncmp (utf8, hints[i].c, strlen (hints[i].c)) == 0)
      return hints[i].hint;
  return "";
}

/* Reads the next token; FALSE (with the error set) on a character or number we cannot read. */
static gboolean
next_token (parser *p)
{
  const char *s = p->pos;

  while (*s == ' ' || *s == '\t' || *s == '\n' || *s == '\r')
    s++;
  p->tok_start = s;

  if (*s == '\0')
    {
      p->tok = TOK_END;
      p->tok_len = 0;
      p->pos = s;
      return TRUE;
    }

  if (g_ascii_isdigit (*s) || (*s == '.' && g_ascii_isdigit (s[1])))
    {
      g_autofree char *copy = NULL;

      /* Digits with at most one '.', then an optional exponent: 2, 2., .5, 1e-3, 6.02E23. */
      while (g_ascii_isdigit (*s))
        s++;
      if (*s == '.')
        for (s++; g_ascii_isdigit (*s); s++)
          ;
      if (*s == 'e' || *s == 'E')
        {
          s++;
          if (*s == '+' || *s == '-')
            s++;
          if (!g_ascii_isdigit (*s))
            return fail (p, DF_IO_ERROR_SYNTAX, s, "expected the digits of the exponent in '%.*s'",
                         (int) (s - p->tok_start), p->tok_start);
          while (g_ascii_isdigit (*s))
            s++;
        }
      p->tok = TOK_NUMBER;
      p->tok_len = (size_t) (s - p->tok_start);
      p->pos = s;
      /* g_ascii_strtod on a copy of exactly our span: locale-independent, and it cannot
       * wander into hex floats, "inf" or "nan". */
      copy = g_strndup (p->tok_start, p->tok_len);
      p->tok_value = g_ascii_strtod (copy, NULL);
      if (!isfinite (p->tok_value))
        return fail (p, DF_IO_ERROR_VALUE, p->tok_start, "the number '%s' is too large", copy);
      return TRUE;
    }

  if (is_name_start (*s))
    {
      while (is_name_char (*s))
        s++;
      p->tok = TOK_NAME;
      p->tok_len = (size_t) (s - p->tok_start);
      p->pos = s;
      return TRUE;
    }

  switch (*s)
    {
    case '+': p->tok = TOK_PLUS; break;
    case '-': p->tok = TOK_MINUS; break;
    case '*': p->tok = TOK_STAR; break;
    case '/': p->tok = TOK_SLASH; break;
    case '^': p->tok = TOK_CARET; break;
    case '(': p->tok = TOK_OPEN; break;
    case ')': p->tok = TOK_CLOSE; break;
    default:
      {
        const char *end = g_utf8_next_char (s);

        return fail (p, DF_IO_ERROR_SYNTAX, s, "unexpected character '%.*s'%s",
                     (int) (end - s), s, character_hint (s));
      }
    }
  p->tok_len = 1;
  p->pos = s + 1;
  return TRUE;
}

static gboolean
token_is (const parser *p, const char *name)
{
  return p->tok == TOK_NAME && strlen (name) == p->tok_len
         && memcmp (p->tok_start, name, p->tok_len) == 0;
}

/* ---- names ---- */

static int
find_var (const parser *p, const char *name, size_t len)
{
  for (int i = 0; i < p->n_vars; i++)
    if (strlen (p->var_names[i]) == len && memcmp (p->var_names[i], name, len) == 0)
      return i;
  return -1;
}

static int
find_param (const df_params *params, guint n_visible, const char *name, size_t len)
{
  if (params == NULL)
    return -1;
  for (guint i = 0; i < n_visible; i++)
    {
      const df_param *item = g_ptr_array_index (params->items, i);

      if (strlen (item->name) == len && memcmp (item->name, name, len) == 0)
        return (int) i;
    }
  return -1;
}

/* " (did you mean 'log'?)" for a near miss: a different case, or a common other spelling. */
static char *
suggestion (const parser *p, const char *name, size_t len)
{
  static const char *const aliases[][2] = {
    { "ln", "log" }, { "arcsin", "asin" }, { "arccos", "acos" }, { "arctan", "atan" },
    { "PI", "pi" }, { "Pi", "pi" }, { "fabs", "abs" },
  };

  for (size_t i = 0; i < G_N_ELEMENTS (aliases); i++)
    if (strlen (aliases[i][0]) == len && memcmp (aliases[i][0], name, len) == 0)
      return g_strdup_printf ("; did you mean '%s'?", aliases[i][1]);
  for (int i = 0; i < _DF_OP_N_FUNCTIONS; i++)
    {
      const char *f = _df_expr_function_name (i);

      if (strlen (f) == len && g_ascii_strncasecmp (f, name, len) == 0)
        return g_strdup_printf ("; did you mean '%s'?", f);
    }
  for (int i = 0; i < p->n_vars; i++)
    if (strlen (p->var_names[i]) == len && g_ascii_strncasecmp (p->var_names[i], name, len) == 0)
      return g_strdup_printf ("; did you mean '%s'?", p->var_names[i]);
  for (guint i = 0; p->params != NULL && i < p->n_params; i++)
    {
      const df_param *item = g_ptr_array_index (p->params->items, i);

      if (strlen (item->name) == len && g_ascii_strncasecmp (item->name, name, len) == 0)
        return g_strdup_printf ("; did you mean '%s'?", item->name);
    }
  return g_strdup ("");
}

static gboolean
fail_unknown_name (parser *p, const char *at, size_t len)
{
  g_autoptr (GString) known = g_string_new (NULL);
  g_autofree char *hint = suggestion (p, at, len);

  if (p->n_vars == 0)
    g_string_append (known, "no variables");
  else
    {
      g_string_append (known, "variables: ");
      for (int i = 0; i < p->n_vars; i++)
        g_string_append_printf (known, "%s%s", i ? ", " : "", p->var_names[i]);
    }
  if (p->params == NULL || p->n_params == 0)
    g_string_append (known, "; no parameters");
  else
    {
      g_string_append (known, "; parameters: ");
      for (guint i = 0; i < p->n_params && i < MAX_LISTED; i++)
        {
          const df_param *item = g_ptr_array_index (p->params->items, i);

          g_string_append_printf (known, "%s%s", i ? ", " : "", item->name);
        }
      if (p->n_params > MAX_LISTED)
        g_string_append (known, ", ...");
    }
  return fail (p, DF_IO_ERROR_UNKNOWN_NAME, at, "unknown name '%.*s' (%s)%s", (int) len, at,
               known->str, hint);
}

static gboolean
fail_unknown_function (parser *p, const char *at, size_t len)
{
  g_autoptr (GString) known = g_string_new (NULL);
  g_autofree char *hint = suggestion (p, at, len);

  for (int i = 0; i < _DF_OP_N_FUNCTIONS; i++)
    g_string_append_printf (known, "%s%s", i ? ", " : "", _df_expr_function_name (i));
  return fail (p, DF_IO_ERROR_UNKNOWN_NAME, at, "unknown function '%.*s' (functions: %s)%s",
               (int) len, at, known->str, hint);
}

/* ---- grammar ----
 *   expr    := term (('+' | '-') term)*
 *   term    := unary (('*' | '/') unary)*
 *   unary   := ('-' | '+') unary | power
 *   power   := primary ('^' unary)?          right-associative; -x^2 = -(x^2); 2^-1 allowed
 *   primary := number | name | function '(' expr ')' | '(' expr ')'
 * `after` names the operator an operand follows, for "expected an operand after '*'". */

static gboolean parse_expr (parser *p, const char *after);

static gboolean
fail_expected_operand (parser *p, const char *after)
{
  g_autofree char *found = describe_token (p);

  if (after == NULL && p->tok == TOK_END)
    return fail (p, DF_IO_ERROR_SYNTAX, p->text, "empty formula");
  if (after == NULL)
    return fail (p, DF_IO_ERROR_SYNTAX, p->tok_start, "expected an operand, found %s", found);
  if (p->tok == TOK_END)
    return fail (p, DF_IO_ERROR_SYNTAX, p->tok_start, "expected an operand after '%s'", after);
  return fail (p, DF_IO_ERROR_SYNTAX, p->tok_start, "expected an operand after '%s', found %s",
               after, found);
}

/* Expects the ')' closing the '(' at `open`. */
static gboolean
expect_close (parser *p, const char *open)
{
  g_autofree char *found = NULL;

  if (p->tok == TOK_CLOSE)
    return next_token (p);
  if (p->tok == TOK_END)
    return fail (p, DF_IO_ERROR_SYNTAX, p->tok_start, "expected ')' to close '(' at column %d",
                 column_of (p, open));
  found = describe_token (p);
  return fail (p, DF_IO_ERROR_SYNTAX, p->tok_start,
               "expected an operator or ')' to close '(' at column %d, found %s",
               column_of (p, open), found);
}

static gboolean
parse_name (parser *p)
{
  const char *at = p->tok_start;
  size_t len = p->tok_len;
  int var = find_var (p, at, len);
  int param = find_param (p->params, p->n_params, at, len);
  int function = _df_expr_function_lookup (at, len);
  gboolean is_pi = token_is (p, "pi");

  if (!next_token (p))
    return FALSE;

  if (function >= 0)
    {
      const char *open = p->tok_start;

      if (p->tok != TOK_OPEN)
        return fail (p, DF_IO_ERROR_SYNTAX, at, "function '%.*s' needs parentheses: %.*s(...)",
                     (int) len, at, (int) len, at);
      if (!next_token (p) || !parse_expr (p, "(") || !expect_close (p, open))
        return FALSE;
      return emit_op (p, (df_expr_op) function, at);
    }
  if (var >= 0 && param >= 0)
    return fail (p, DF_IO_ERROR_UNKNOWN_NAME, at,
                 "'%.*s' is both a variable and a parameter; rename the parameter", (int) len,
                 at);
  if (var < 0 && param < 0 && !is_pi)
    return p->tok == TOK_OPEN ? fail_unknown_function (p, at, len)
                              : fail_unknown_name (p, at, len);
  if (p->tok == TOK_OPEN)
    return fail (p, DF_IO_ERROR_SYNTAX, p->tok_start,
                 "'%.*s' is not a function; write '%.*s*(' to multiply", (int) len, at,
                 (int) len, at);
  if (var >= 0)
    return emit_var (p, var, at);
  if (param >= 0)
    {
      const df_param *item = g_ptr_array_index (p->params->items, param);

      return emit_const (p, item->value, at);
    }
  return emit_const (p, G_PI, at);
}

static gboolean
parse_primary (parser *p, const char *after)
{
  switch (p->tok)
    {
    case TOK_NUMBER:
      return emit_const (p, p->tok_value, p->tok_start) && next_token (p);
    case TOK_NAME:
      return parse_name (p);
    case TOK_OPEN:
      {
        const char *open = p->tok_start;

        return next_token (p) && parse_expr (p, "(") && expect_close (p, open);
      }
    default:
      return fail_expected_operand (p, after);
    }
}

static gboolean parse_unary (parser *p, const char *after);

static gboolean
parse_power (parser *p, const char *after)
{
  const char *caret;

  if (!parse_primary (p, after))
    return FALSE;
  if (p->tok != TOK_CARET)
    return TRUE;
  caret = p->tok_start;
  /* The exponent is a unary, not a power: 2^3^2 recurses through it, so ^ groups right. */
  return next_token (p) && parse_unary (p, "^") && emit_op (p, _DF_OP_POW, caret);
}

static gboolean
parse_unary (parser *p, const char *after)
{
  gboolean ok;

  if (++p->nesting > MAX_NESTING)
    return fail (p, DF_IO_ERROR_SYNTAX, p->tok_start, "formula too deeply nested");
  if (p->tok == TOK_MINUS || p->tok == TOK_PLUS)
    {
      const char *sign = p->tok_start;
      gboolean minus = p->tok == TOK_MINUS;

      ok = next_token (p) && parse_unary (p, minus ? "-" : "+")
           && (!minus || emit_op (p, _DF_OP_NEG, sign));
    }
  else
    ok = parse_power (p, after);
  p->nesting--;
  return ok;
}

static gboolean
parse_term (parser *p, const char *after)
{
  if (!parse_unary (p, after))
    return FALSE;
  while (p->tok == TOK_STAR || p->tok == TOK_SLASH)
    {
      const char *at = p->tok_start;
      gboolean mul = p->tok == TOK_STAR;

      if (!next_token (p) || !parse_unary (p, mul ? "*" : "/")
          || !emit_op (p, mul ? _DF_OP_MUL : _DF_OP_DIV, at))
        return FALSE;
    }
  return TRUE;
}

static gboolean
parse_expr (parser *p, const char *after)
{
  if (!parse_term (p, after))
    return FALSE;
  while (p->tok == TOK_PLUS || p->tok == TOK_MINUS)
    {
      const char *at = p->tok_start;
      gboolean add = p->tok == TOK_PLUS;

      if (!next_token (p) || !parse_term (p, add ? "+" : "-")
          || !emit_op (p, add ? _DF_OP_ADD : _DF_OP_SUB, at))
        return FALSE;
    }
  return TRUE;
}

/* Reports the first parameter that shares a name with a variable, even where the formula
 * does not use it: the user meant one thing by the name, and the formula another. */
static gboolean
check_clashes (parser *p)
{
  for (guint i = 0; p->params != NULL && i < p->n_params; i++)
    {
      const df_param *item = g_ptr_array_index (p->params->items, i);

      if (find_var (p, item->name, strlen (item->name)) >= 0)
        return fail (p, DF_IO_ERROR_UNKNOWN_NAME, p->text,
                     "parameter '%s' has the same name as a variable; rename the parameter",
                     item->name);
    }
  return TRUE;
}

static df_expr *
parse_full (const char        *text,
            const char *const *var_names,
            int                n_vars,
            const df_params   *params,
            guint              n_params,
            int               *error_column,
            GError           **error)
{
  parser p = { 0 };
  const char *bad_utf8 = NULL;
  df_expr *expr = NULL;
  gboolean ok;

  p.text = text != NULL ? text : "";
  p.var_names = var_names;
  p.n_vars = n_vars;
  p.params = params;
  p.n_params = params != NULL ? n_params : 0;
  p.error = error;
  p.pos = p.text;
  p.tok_start = p.text;

  if (strlen (p.text) > DF_EXPR_MAX_LENGTH)
    {
      /* Every surface check and every transport step evaluates the formula: a formula of
       * 10^5 characters already takes seconds to build a surface from. */
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                   "column 1: the formula is %zu characters long, more than the %d allowed",
                   strlen (p.text), DF_EXPR_MAX_LENGTH);
      p.error_column = 1;
      goto out;
    }
  if (!g_utf8_validate (p.text, -1, &bad_utf8))
    {
      /* column_of needs valid UTF-8 up to the point; the prefix before bad_utf8 is. */
      fail (&p, DF_IO_ERROR_SYNTAX, bad_utf8, "the text is not valid UTF-8");
      goto out;
    }
  p.builder = _df_expr_builder_new (n_vars);
  if (p.builder == NULL)
    {
      fail (&p, DF_IO_ERROR_VALUE, p.text, "out of memory");
      goto out;
    }

  ok = next_token (&p) && parse_expr (&p, NULL);
  if (ok && p.tok != TOK_END)
    {
      g_autofree char *found = describe_token (&p);

      if (p.tok == TOK_CLOSE)
        ok = fail (&p, DF_IO_ERROR_SYNTAX, p.tok_start, "')' without a matching '('");
      else
        ok = fail (&p, DF_IO_ERROR_SYNTAX, p.tok_start, "expected an operator, found %s", found);
    }
  if (ok)
    ok = check_clashes (&p);
  if (ok)
    {
      df_diag diag;

      expr = _df_expr_builder_finish (g_steal_pointer (&p.builder), &diag);
      if (expr == NULL)
        fail_build (&p, DF_E_INPUT, &diag, p.text);
    }

out:
  _df_expr_builder_free (p.builder);
  if (error_column != NULL)
    *error_column = expr != NULL ? 0 : p.error_column;
  return expr;
}

df_expr *
df_expr_parse (const char        *text,
               const char *const *var_names,
               int                n_vars,
               const df_params   *params,
               int               *error_column,
               GError           **error)
{
  g_return_val_if_fail (n_vars >= 0 && n_vars <= DF_EXPR_MAX_VARS, NULL);
  g_return_val_if_fail (n_vars == 0 || var_names != NULL, NULL);
  g_return_val_if_fail (error == NULL || *error == NULL, NULL);

  return parse_full (text, var_names, n_vars, params,
                     params != NULL ? params->items->len : 0, error_column, error);
}

static gboolean
parse_value_with (const char      *text,
                  const df_params *params,
                  guint            n_params,
                  double          *value,
                  int             *error_column,
                  GError         **error)
{
  g_autoptr (GError) local = NULL;
  df_expr *expr = parse_full (text, NULL, 0, params, n_params, error_column, &local);
  double v = 0.0;

  if (expr == NULL)
    {
      g_propagate_error (error, g_steal_pointer (&local));
      return FALSE;
    }
  /* Without variables the builder folds everything to one constant. */
  if (!_df_expr_is_constant (expr, &v))
    {
      df_diag diag;
      df_status status = df_expr_eval (expr, NULL, &v, &diag);

      if (status != DF_OK)
        {
          df_expr_free (expr);
          if (error_column != NULL)
            *error_column = 1;
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE, "column 1: %s", diag.detail);
          return FALSE;
        }
    }
  df_expr_free (expr);
  *value = v;
  return TRUE;
}

gboolean
df_expr_parse_value (const char      *text,
                     const df_params *params,
                     double          *value,
                     int             *error_column,
                     GError         **error)
{
  g_return_val_if_fail (value != NULL, FALSE);
  g_return_val_if_fail (error == NULL || *error == NULL, FALSE);

  return parse_value_with (text, params, params != NULL ? params->items->len : 0, value,
                           error_column, error);
}

/* ---- parameters ---- */

static void
param_free (gpointer data)
{
  df_param *item = data;

  g_free (item->name);
  g_free (item->text);
  g_free (item);
}

static df_param *
param_new (const char *name, const char *text, double value)
{
  df_param *item = g_new (df_param, 1);

  item->name = g_strdup (name);
  item->text = g_strdup (text);
  item->value = value;
  return item;
}

df_params *
df_params_new (void)
{
  df_params *params = g_new (df_params, 1);

  params->items = g_ptr_array_new_with_free_func (param_free);
  return params;
}

df_params *
df_params_copy (const df_params *params)
{
  df_params *copy;

  if (params == NULL)
    return NULL;
  copy = df_params_new ();
  for (guint i = 0; i < params->items->len; i++)
    {
      const df_param *item = g_ptr_array_index (params->items, i);

      g_ptr_array_add (copy->items, param_new (item->name, item->text, item->value));
    }
  return copy;
}

void
df_params_free (df_params *params)
{
  if (params == NULL)
    return;
  g_ptr_array_unref (params->items);
  g_free (params);
}

static gboolean
check_param_name (const char *name, GError **error)
{
  gboolean valid = name != NULL && is_name_start (name[0]);

  for (const char *s = name; valid && *s; s++)
    valid = is_name_char (*s);
  if (!valid)
    {
      g_autofree char *shown = g_utf8_make_valid (name != NULL ? name : "", -1);

      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_SYNTAX,
                   "'%s' is not a valid parameter name: a name starts with a letter or '_' "
                   "and holds only letters, digits and '_'", shown);
      return FALSE;
    }
  if (strcmp (name, "pi") == 0)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                   "'pi' is a built-in constant and cannot be a parameter");
      return FALSE;
    }
  if (_df_expr_function_lookup (name, strlen (name)) >= 0)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                   "'%s' is a function name and cannot be a parameter", name);
      return FALSE;
    }
  return TRUE;
}

gboolean
df_params_set (df_params *params, const char *name, const char *text, GError **error)
{
  g_autoptr (GError) local = NULL;
  df_params *trial;
  int index;
  double value;

  g_return_val_if_fail (params != NULL, FALSE);
  g_return_val_if_fail (error == NULL || *error == NULL, FALSE);

  if (!check_param_name (name, error))
    return FALSE;
  if (text == NULL)
    text = "";
  index = find_param (params, params->items->len, name, strlen (name));

  if (index < 0)
    {
      if (params->items->len >= DF_PARAMS_MAX)
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                       "'%s': more than %d parameters, the most a surface may have", name,
                       DF_PARAMS_MAX);
          return FALSE;
        }
      /* A new parameter sees every parameter defined so far. */
      if (!parse_value_with (text, params, params->items->len, &value, NULL, error))
        return FALSE;
      g_ptr_array_add (params->items, param_new (name, text, value));
      return TRUE;
    }

  /* A redefinition keeps its place: it sees the parameters before it, and the ones after it
   * are re-evaluated in order on a trial copy, so a failure leaves params as they were. */
  if (!parse_value_with (text, params, (guint) index, &value, NULL, error))
    return FALSE;
  trial = df_params_copy (params);
  {
    df_param *item = g_ptr_array_index (trial->items, index);

    g_free (item->text);
    item->text = g_strdup (text);
    item->value = value;
  }
  for (guint j = (guint) index + 1; j < trial->items->len; j++)
    {
      df_param *later = g_ptr_array_index (trial->items, j);

      if (!parse_value_with (later->text, trial, j, &later->value, NULL, &local))
        {
          g_set_error (error, DF_IO_ERROR, local->code,
                       "parameter '%s' (which is evaluated after '%s') no longer evaluates: %s",
                       later->name, name, local->message);
          df_params_free (trial);
          return FALSE;
        }
    }
  /* Commit: swap the evaluated items in. */
  {
    GPtrArray *old = params->items;

    params->items = trial->items;
    trial->items = old;
  }
  df_params_free (trial);
  return TRUE;
}

gboolean
df_params_remove (df_params *params, const char *name, GError **error)
{
  g_autoptr (GError) local = NULL;
  df_params *trial;
  int index;

  g_return_val_if_fail (params != NULL && name != NULL, FALSE);
  g_return_val_if_fail (error == NULL || *error == NULL, FALSE);

  index = find_param (params, params->items->len, name, strlen (name));
  if (index < 0)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_UNKNOWN_NAME, "no parameter '%s'", name);
      return FALSE;
    }
  /* The ones after it are re-evaluated on a trial copy without it, as df_params_set does. */
  trial = df_params_copy (params);
  g_ptr_array_remove_index (trial->items, (guint) index);
  for (guint j = (guint) index; j < trial->items->len; j++)
    {
      df_param *later = g_ptr_array_index (trial->items, j);

      if (!parse_value_with (later->text, trial, j, &later->value, NULL, &local))
        {
          g_set_error (error, DF_IO_ERROR, local->code,
                       "parameter '%s' is used by '%s' (%s = %s): change or remove that one "
                       "first", name, later->name, later->name, later->text);
          df_params_free (trial);
          return FALSE;
        }
    }
  {
    GPtrArray *old = params->items;

    params->items = trial->items;
    trial->items = old;
  }
  df_params_free (trial);
  return TRUE;
}

gboolean
df_params_lookup (const df_params *params, const char *name, double *value)
{
  int index;

  g_return_val_if_fail (name != NULL, FALSE);

  if (params == NULL)
    return FALSE;
  index = find_param (params, params->items->len, name, strlen (name));
  if (index < 0)
    return FALSE;
  if (value != NULL)
    *value = ((const df_param *) g_ptr_array_index (params->items, index))->value;
  return TRUE;
}

guint
df_params_count (const df_params *params)
{
  return params != NULL ? params->items->len : 0;
}

static const df_param *
param_at (const df_params *params, guint i)
{
  g_return_val_if_fail (params != NULL && i < params->items->len, NULL);
  return g_ptr_array_index (params->items, i);
}

const char *
df_params_name (const df_params *params, guint i)
{
  const df_param *item = param_at (params, i);

  return item != NULL ? item->name : NULL;
}

const char *
df_params_text (const df_params *params, guint i)
{
  const df_param *item = param_at (params, i);

  return item != NULL ? item->text : NULL;
}

double
df_params_value (const df_params *params, guint i)
{
  const df_param *item = param_at (params, i);

  return item != NULL ? item->value : 0.0;
}
