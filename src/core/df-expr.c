/* df-expr.c: compiled formulas: a postfix program over a fixed-size operand stack, evaluated on
 * doubles or on jets (df-jet.h), and the builder that the reader emits into, which folds
 * constant operands as it goes. Evaluation never allocates and touches no global state, so one
 * df_expr may be evaluated from several threads. Plain C + libm; no GLib. */
#include "df-expr-private.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

typedef struct
{
  int    op;      /* df_expr_op */
  int    arg;     /* _DF_OP_VAR: variable index; _DF_OP_POWI: the exponent */
  double value;   /* _DF_OP_CONST: the constant; _DF_OP_POWC: the exponent */
} df_expr_insn;

struct df_expr
{
  int          n_vars;
  int          n_insn;
  df_expr_insn insn[];
};

struct df_expr_builder
{
  int           n_vars;
  int           depth;    /* operands on the stack after the instructions so far */
  int           failed;
  int           n_insn;
  int           cap;
  df_expr_insn *insn;
};

/* Indexed by op - _DF_OP_FIRST_FUNCTION. */
static const char *const function_names[_DF_OP_N_FUNCTIONS] = {
  "sin", "cos", "tan", "asin", "acos", "atan", "exp", "log", "sqrt", "abs", "sinh", "cosh", "tanh",
};

int
_df_expr_function_lookup (const char *name, size_t len)
{
  for (int i = 0; i < _DF_OP_N_FUNCTIONS; i++)
    if (strlen (function_names[i]) == len && memcmp (function_names[i], name, len) == 0)
      return _DF_OP_FIRST_FUNCTION + i;
  return -1;
}

const char *
_df_expr_function_name (int i)
{
  return i >= 0 && i < _DF_OP_N_FUNCTIONS ? function_names[i] : NULL;
}

static int
is_binary (int op)
{
  return op >= _DF_OP_ADD && op <= _DF_OP_POW;
}

static const char *
binary_symbol (int op)
{
  switch (op)
    {
    case _DF_OP_ADD: return "+";
    case _DF_OP_SUB: return "-";
    case _DF_OP_MUL: return "*";
    case _DF_OP_DIV: return "/";
    default: return "^";
    }
}

/* x^n by repeated squaring: exact for small integers, and defined for negative x. */
static double
powi (double x, int n)
{
  unsigned m = n < 0 ? -(unsigned) n : (unsigned) n;
  double r = 1.0;

  while (m)
    {
      if (m & 1)
        r *= x;
      x *= x;
      m >>= 1;
    }
  return n < 0 ? 1.0 / r : r;
}

static int
is_integer (double x)
{
  return isfinite (x) && x == nearbyint (x);
}

/* ---- domain checks, shared by the double and the jet evaluation so both say the same ---- */

/* Refuses v outside the operand domain of a unary instruction. With jets, also refuses the
 * points where the value exists but a derivative does not (sqrt at 0, asin at 1). */
static df_status
unary_domain (const df_expr_insn *in, double v, int jets, df_diag *diag)
{
  switch (in->op)
    {
    case _DF_OP_LOG:
      if (v <= 0.0)
        return df_diag_fail (diag, DF_E_DOMAIN, -1, "log of %g", v);
      break;
    case _DF_OP_SQRT:
      if (v < 0.0)
        return df_diag_fail (diag, DF_E_DOMAIN, -1, "sqrt of %g", v);
      if (jets && v == 0.0)
        return df_diag_fail (diag, DF_E_DOMAIN, -1, "sqrt at 0 has no derivative");
      break;
    case _DF_OP_ASIN:
    case _DF_OP_ACOS:
      if (!(fabs (v) <= 1.0))
        return df_diag_fail (diag, DF_E_DOMAIN, -1, "%s of %g",
                             function_names[in->op - _DF_OP_FIRST_FUNCTION], v);
      if (jets && fabs (v) == 1.0)
        return df_diag_fail (diag, DF_E_DOMAIN, -1, "%s at %g has no derivative",
                             function_names[in->op - _DF_OP_FIRST_FUNCTION], v);
      break;
    case _DF_OP_POWI:
      if (v == 0.0 && in->arg < 0)
        return df_diag_fail (diag, DF_E_DOMAIN, -1, "division by zero (0 raised to the power %d)",
                             in->arg);
      break;
    case _DF_OP_POWC:
      if (v < 0.0 && !is_integer (in->value))
        return df_diag_fail (diag, DF_E_DOMAIN, -1,
                             "negative base %g raised to the non-integer power %g", v, in->value);
      if (v == 0.0 && in->value < 0.0)
        return df_diag_fail (diag, DF_E_DOMAIN, -1, "division by zero (0 raised to the power %g)",
                             in->value);
      /* d^k/dx^k x^c = c (c-1) ... x^(c-k) is infinite at 0 for k > c (c not an integer). */
      if (jets && v == 0.0 && in->value < 3.0)
        return df_diag_fail (diag, DF_E_DOMAIN, -1, "0 raised to the power %g has no derivative",
                             in->value);
      break;
    default:
      break;
    }
  return DF_OK;
}

static df_status
binary_domain (int op, double a, double b, int jets, df_diag *diag)
{
  if (op == _DF_OP_DIV && b == 0.0)
    return df_diag_fail (diag, DF_E_DOMAIN, -1, "division by zero");
  if (op == _DF_OP_POW)
    {
      /* A variable exponent goes through exp(b log a), so the base must be positive; integer
       * and constant exponents were turned into POWI/POWC when the formula was built. */
      if (a < 0.0)
        return df_diag_fail (diag, DF_E_DOMAIN, -1,
                             "negative base %g raised to a variable power (%g)", a, b);
      if (a == 0.0 && b <= 0.0)
        return df_diag_fail (diag, DF_E_DOMAIN, -1, "division by zero (0 raised to the power %g)",
                             b);
      if (a == 0.0 && jets)
        return df_diag_fail (diag, DF_E_DOMAIN, -1,
                             "0 raised to a variable power has no derivative");
    }
  return DF_OK;
}

static df_status
unary_nonfinite (const df_expr_insn *in, double v, df_diag *diag)
{
  if (in->op == _DF_OP_POWI)
    return df_diag_fail (diag, DF_E_NONFINITE, -1, "%g raised to the power %d is not finite",
                         v, in->arg);
  if (in->op == _DF_OP_POWC)
    return df_diag_fail (diag, DF_E_NONFINITE, -1, "%g raised to the power %g is not finite",
                         v, in->value);
  if (in->op >= _DF_OP_FIRST_FUNCTION)
    return df_diag_fail (diag, DF_E_NONFINITE, -1, "%s of %g is not finite",
                         function_names[in->op - _DF_OP_FIRST_FUNCTION], v);
  return df_diag_fail (diag, DF_E_NONFINITE, -1, "value of %g is not finite", v);
}

static df_status
binary_nonfinite (int op, double a, double b, df_diag *diag)
{
  return df_diag_fail (diag, DF_E_NONFINITE, -1, "%g %s %g is not finite", a, binary_symbol (op),
                       b);
}

/* ---- double evaluation ---- */

static df_status
apply_unary (const df_expr_insn *in, double v, double *out, df_diag *diag)
{
  df_status status = unary_domain (in, v, 0, diag);
  double r;

  if (status != DF_OK)
    return status;
  switch (in->op)
    {
    case _DF_OP_NEG: r = -v; break;
    case _DF_OP_POWI: r = powi (v, in->arg); break;
    case _DF_OP_POWC: r = v == 0.0 ? 0.0 : pow (v, in->value); break;
    case _DF_OP_SIN: r = sin (v); break;
    case _DF_OP_COS: r = cos (v); break;
    case _DF_OP_TAN: r = tan (v); break;
    case _DF_OP_ASIN: r = asin (v); break;
    case _DF_OP_ACOS: r = acos (v); break;
    case _DF_OP_ATAN: r = atan (v); break;
    case _DF_OP_EXP: r = exp (v); break;
    case _DF_OP_LOG: r = log (v); break;
    case _DF_OP_SQRT: r = sqrt (v); break;
    case _DF_OP_ABS: r = fabs (v); break;
    case _DF_OP_SINH: r = sinh (v); break;
    case _DF_OP_COSH: r = cosh (v); break;
    case _DF_OP_TANH: r = tanh (v); break;
    default:
      return df_diag_fail (diag, DF_E_INTERNAL, -1, "bad formula instruction %d", in->op);
    }
  if (!isfinite (r))
    return unary_nonfinite (in, v, diag);
  *out = r;
  return DF_OK;
}

static df_status
apply_binary (int op, double a, double b, double *out, df_diag *diag)
{
  df_status status = binary_domain (op, a, b, 0, diag);
  double r;

  if (status != DF_OK)
    return status;
  switch (op)
    {
    case _DF_OP_ADD: r = a + b; break;
    case _DF_OP_SUB: r = a - b; break;
    case _DF_OP_MUL: r = a * b; break;
    case _DF_OP_DIV: r = a / b; break;
    case _DF_OP_POW: r = a == 0.0 ? 0.0 : pow (a, b); break;   /* a > 0 here */
    default:
      return df_diag_fail (diag, DF_E_INTERNAL, -1, "bad formula instruction %d", op);
    }
  if (!isfinite (r))
    return binary_nonfinite (op, a, b, diag);
  *out = r;
  return DF_OK;
}

df_status
df_expr_eval (const df_expr *expr, const double *vars, double *out, df_diag *diag)
{
  double stack[DF_EXPR_MAX_STACK];
  int sp = 0;
  df_status status;

  if (expr == NULL || out == NULL || (expr->n_vars > 0 && vars == NULL))
    return df_diag_fail (diag, DF_E_INPUT, -1, "no formula or no variables given");
  for (int i = 0; i < expr->n_insn; i++)
    {
      const df_expr_insn *in = &expr->insn[i];

      switch (in->op)
        {
        case _DF_OP_CONST:
          stack[sp++] = in->value;
          break;
        case _DF_OP_VAR:
          stack[sp++] = vars[in->arg];
          break;
        case _DF_OP_ADD:
        case _DF_OP_SUB:
        case _DF_OP_MUL:
          {
            /* The commonest operations inline; an overflow is still caught at once, so the
             * double and the jet evaluation refuse the same points. */
            double a = stack[sp - 2], b = stack[sp - 1];
            double r = in->op == _DF_OP_ADD ? a + b : in->op == _DF_OP_SUB ? a - b : a * b;

            if (!isfinite (r))
              return binary_nonfinite (in->op, a, b, diag);
            sp--;
            stack[sp - 1] = r;
            break;
          }
        case _DF_OP_DIV:
        case _DF_OP_POW:
          sp--;
          status = apply_binary (in->op, stack[sp - 1], stack[sp], &stack[sp - 1], diag);
          if (status != DF_OK)
            return status;
          break;
        default:
          status = apply_unary (in, stack[sp - 1], &stack[sp - 1], diag);
          if (status != DF_OK)
            return status;
          break;
        }
    }
  if (!isfinite (stack[0]))
    return df_diag_fail (diag, DF_E_NONFINITE, -1, "the formula's value is not finite");
  *out = stack[0];
  return DF_OK;
}

/* ---- jet evaluation ---- */

/* Replaces x by f(x) for a unary instruction, through the chain rule in df_jet_compose. */
static df_status
jet_unary (const df_expr_insn *in, df_jet *x, df_diag *diag)
{
  double v = x->c[0];
  double f0, f1, f2, f3;
  df_status status;

  if (in->op == _DF_OP_NEG)
    {
      df_jet_neg (x, x);
      return DF_OK;
    }
  status = unary_domain (in, v, 1, diag);
  if (status != DF_OK)
    return status;

  /* Derivatives of the elementary functions: calculus rules, from memory. */
  switch (in->op)
    {
    case _DF_OP_POWI:
      {
        int n = in->arg;
        double ff1 = n, ff2 = ff1 * (n - 1), ff3 = ff2 * (n - 2);   /* falling factorials */

        /* When n >= 0 and n - k < 0 the falling factorial is 0: skip 0^(negative). */
        f0 = powi (v, n);
        f1 = ff1 == 0.0 ? 0.0 : ff1 * powi (v, n - 1);
        f2 = ff2 == 0.0 ? 0.0 : ff2 * powi (v, n - 2);
        f3 = ff3 == 0.0 ? 0.0 : ff3 * powi (v, n - 3);
        break;
      }
    case _DF_OP_POWC:
      {
        double c = in->value;

        if (v == 0.0)   /* c > 3 here: value and first three derivatives vanish */
          f0 = f1 = f2 = f3 = 0.0;
        else
          {
            f0 = pow (v, c);
            f1 = c * f0 / v;
            f2 = (c - 1.0) * f1 / v;
            f3 = (c - 2.0) * f2 / v;
          }
        break;
      }
    case _DF_OP_SIN:
      f0 = sin (v), f1 = cos (v), f2 = -f0, f3 = -f1;
      break;
    case _DF_OP_COS:
      f0 = cos (v), f1 = -sin (v), f2 = -f0, f3 = -f1;
      break;
    case _DF_OP_TAN:
      {
        double t = tan (v), s2 = 1.0 + t * t;   /* sec^2 */

        f0 = t, f1 = s2, f2 = 2.0 * t * s2, f3 = 2.0 * s2 * (1.0 + 3.0 * t * t);
        break;
      }
    case _DF_OP_ASIN:
    case _DF_OP_ACOS:
      {
        double r = 1.0 / sqrt (1.0 - v * v), r3 = r * r * r;
        double sign = in->op == _DF_OP_ASIN ? 1.0 : -1.0;

        f0 = in->op == _DF_OP_ASIN ? asin (v) : acos (v);
        f1 = sign * r, f2 = sign * v * r3, f3 = sign * r3 * (1.0 + 3.0 * v * v * r * r);
        break;
      }
    case _DF_OP_ATAN:
      {
        double q = 1.0 / (1.0 + v * v);

        f0 = atan (v), f1 = q, f2 = -2.0 * v * q * q, f3 = q * q * (8.0 * v * v * q - 2.0);
        break;
      }
    case _DF_OP_EXP:
      f0 = f1 = f2 = f3 = exp (v);
      break;
    case _DF_OP_LOG:
      {
        double r = 1.0 / v;

        f0 = log (v), f1 = r, f2 = -r * r, f3 = 2.0 * r * r * r;
        break;
      }
    case _DF_OP_SQRT:
      {
        double s = sqrt (v), r = 1.0 / s;

        f0 = s, f1 = 0.5 * r, f2 = -0.25 * r / v, f3 = 0.375 * r / (v * v);
        break;
      }
    case _DF_OP_ABS:
      /* |x| has slope sign(x); at exactly 0 the kink has no derivative, and 0 is the value
       * a one-sided average gives, so a surface through a crease still evaluates. */
      f0 = fabs (v), f1 = v > 0.0 ? 1.0 : v < 0.0 ? -1.0 : 0.0, f2 = 0.0, f3 = 0.0;
      break;
    case _DF_OP_SINH:
      f0 = sinh (v), f1 = cosh (v), f2 = f0, f3 = f1;
      break;
    case _DF_OP_COSH:
      f0 = cosh (v), f1 = sinh (v), f2 = f0, f3 = f1;
      break;
    case _DF_OP_TANH:
      {
        double t = tanh (v), u = 1.0 - t * t;   /* sech^2 */

        f0 = t, f1 = u, f2 = -2.0 * t * u, f3 = -2.0 * u * (1.0 - 3.0 * t * t);
        break;
      }
    default:
      return df_diag_fail (diag, DF_E_INTERNAL, -1, "bad formula instruction %d", in->op);
    }
  if (!isfinite (f0))
    return unary_nonfinite (in, v, diag);
  df_jet_compose (x, f0, f1, f2, f3, x);
  return DF_OK;
}

/* Replaces a by a op b. */
static df_status
jet_binary (int op, df_jet *a, const df_jet *b, df_diag *diag)
{
  double a0 = a->c[0], b0 = b->c[0];
  df_status status = binary_domain (op, a0, b0, 1, diag);

  if (status != DF_OK)
    return status;
  switch (op)
    {
    case _DF_OP_ADD: df_jet_add (a, b, a); break;
    case _DF_OP_SUB: df_jet_sub (a, b, a); break;
    case _DF_OP_MUL: df_jet_mul (a, b, a); break;
    case _DF_OP_DIV: df_jet_div (a, b, a); break;
    case _DF_OP_POW:
      {
        /* a^b = exp(b log a), a > 0 (checked above). */
        double r = 1.0 / a0, e;

        df_jet_compose (a, log (a0), r, -r * r, 2.0 * r * r * r, a);
        df_jet_mul (a, b, a);
        e = exp (a->c[0]);
        df_jet_compose (a, e, e, e, e, a);
        a->c[0] = pow (a0, b0);   /* the value exactly as df_expr_eval gives it */
        break;
      }
    default:
      return df_diag_fail (diag, DF_E_INTERNAL, -1, "bad formula instruction %d", op);
    }
  if (!isfinite (a->c[0]))
    return binary_nonfinite (op, a0, b0, diag);
  return DF_OK;
}

df_status
df_expr_eval_jet (const df_expr *expr, const df_jet *vars, df_jet *out, df_diag *diag)
{
  df_jet stack[DF_EXPR_MAX_STACK];
  int sp = 0;
  df_status status;

  if (expr == NULL || out == NULL || (expr->n_vars > 0 && vars == NULL))
    return df_diag_fail (diag, DF_E_INPUT, -1, "no formula or no variables given");
  for (int i = 0; i < expr->n_insn; i++)
    {
      const df_expr_insn *in = &expr->insn[i];

      switch (in->op)
        {
        case _DF_OP_CONST:
          df_jet_const (&stack[sp++], in->value);
          break;
        case _DF_OP_VAR:
          stack[sp++] = vars[in->arg];
          break;
        case _DF_OP_ADD:
        case _DF_OP_SUB:
        case _DF_OP_MUL:
        case _DF_OP_DIV:
        case _DF_OP_POW:
          sp--;
          status = jet_binary (in->op, &stack[sp - 1], &stack[sp], diag);
          if (status != DF_OK)
            return status;
          break;
        default:
          status = jet_unary (in, &stack[sp - 1], diag);
          if (status != DF_OK)
            return status;
          break;
        }
    }
  for (int k = 0; k < DF_JET_N; k++)
    if (!isfinite (stack[0].c[k]))
      return df_diag_fail (diag, DF_E_NONFINITE, -1,
                           k == 0 ? "the formula's value is not finite"
                                  : "a derivative of the formula is not finite");
  *out = stack[0];
  return DF_OK;
}

/* ---- the compiled formula ---- */

df_expr *
df_expr_copy (const df_expr *expr)
{
  size_t size;
  df_expr *copy;

  if (expr == NULL)
    return NULL;
  size = sizeof *expr + (size_t) expr->n_insn * sizeof expr->insn[0];
  copy = malloc (size);
  if (copy != NULL)
    memcpy (copy, expr, size);
  return copy;
}

void
df_expr_free (df_expr *expr)
{
  free (expr);
}

int
df_expr_n_vars (const df_expr *expr)
{
  return expr != NULL ? expr->n_vars : 0;
}

int
_df_expr_is_constant (const df_expr *expr, double *value)
{
  if (expr == NULL || expr->n_insn != 1 || expr->insn[0].op != _DF_OP_CONST)
    return 0;
  if (value != NULL)
    *value = expr->insn[0].value;
  return 1;
}

/* ---- the builder ---- */

df_expr_builder *
_df_expr_builder_new (int n_vars)
{
  df_expr_builder *b;

  if (n_vars < 0 || n_vars > DF_EXPR_MAX_VARS)
    return NULL;
  b = calloc (1, sizeof *b);
  if (b != NULL)
    b->n_vars = n_vars;
  return b;
}

void
_df_expr_builder_free (df_expr_builder *builder)
{
  if (builder == NULL)
    return;
  free (builder->insn);
  free (builder);
}

static df_status
builder_fail (df_expr_builder *b, df_status status)
{
  b->failed = 1;
  return status;
}

static df_status
builder_push (df_expr_builder *b, const df_expr_insn *in, df_diag *diag)
{
  if (b->n_insn == b->cap)
    {
      int cap = b->cap ? 2 * b->cap : 16;
      df_expr_insn *grown = realloc (b->insn, (size_t) cap * sizeof *grown);

      if (grown == NULL)
        return builder_fail (b, df_diag_fail (diag, DF_E_NOMEM, -1, "out of memory"));
      b->insn = grown;
      b->cap = cap;
    }
  b->insn[b->n_insn++] = *in;
  return DF_OK;
}

/* Pushes a leaf (constant or variable): one more operand on the stack. */
static df_status
builder_leaf (df_expr_builder *b, const df_expr_insn *in, df_diag *diag)
{
  if (b->failed)
    return df_diag_fail (diag, DF_E_INPUT, -1, "formula builder used after a failure");
  if (b->depth >= DF_EXPR_MAX_STACK)
    return builder_fail (b, df_diag_fail (diag, DF_E_INPUT, -1, "formula too deeply nested"));
  b->depth++;
  return builder_push (b, in, diag);
}

df_status
_df_expr_builder_const (df_expr_builder *builder, double value, df_diag *diag)
{
  df_expr_insn in = { _DF_OP_CONST, 0, value };

  if (!isfinite (value))
    return builder_fail (builder, df_diag_fail (diag, DF_E_NONFINITE, -1,
                                                "constant %g is not finite", value));
  return builder_leaf (builder, &in, diag);
}

df_status
_df_expr_builder_var (df_expr_builder *builder, int index, df_diag *diag)
{
  df_expr_insn in = { _DF_OP_VAR, index, 0.0 };

  if (index < 0 || index >= builder->n_vars)
    return builder_fail (builder, df_diag_fail (diag, DF_E_INPUT, -1,
                                                "no variable number %d", index));
  return builder_leaf (builder, &in, diag);
}

df_status
_df_expr_builder_op (df_expr_builder *builder, df_expr_op op, df_diag *diag)
{
  df_expr_builder *b = builder;
  df_expr_insn *top;
  df_status status;

  if (b->failed)
    return df_diag_fail (diag, DF_E_INPUT, -1, "formula builder used after a failure");
  if (op == _DF_OP_CONST || op == _DF_OP_VAR || op == _DF_OP_POWI || op == _DF_OP_POWC
      || (int) op < 0 || op >= _DF_OP_COUNT)
    return builder_fail (b, df_diag_fail (diag, DF_E_INPUT, -1, "bad formula operation %d", op));
  if (b->depth < (is_binary (op) ? 2 : 1))
    return builder_fail (b, df_diag_fail (diag, DF_E_INPUT, -1, "operation without operand"));

  top = &b->insn[b->n_insn - 1];
  if (is_binary (op))
    {
      df_expr_insn *below = &b->insn[b->n_insn - 2];

      /* In postfix order, a constant as the last instruction is the whole top operand, and a
       * constant just before it is the whole operand below. */
      if (op == _DF_OP_POW && top->op == _DF_OP_CONST)
        {
          /* A constant exponent: integer powers by multiplication (negative bases allowed),
           * others by pow(); folded at once when the base is constant too. */
          double c = top->value;
          df_expr_insn power = is_integer (c) && fabs (c) <= DF_EXPR_MAX_POWI
                               ? (df_expr_insn) { _DF_OP_POWI, (int) c, 0.0 }
                               : (df_expr_insn) { _DF_OP_POWC, 0, c };

          b->depth--;
          if (below->op == _DF_OP_CONST)
            {
              b->n_insn--;
              status = apply_unary (&power, below->value, &below->value, diag);
              return status != DF_OK ? builder_fail (b, status) : DF_OK;
            }
          if (c == 1.0)                 /* x^1 = x */
            b->n_insn--;
          else
            *top = power;
          return DF_OK;
        }
      if (top->op == _DF_OP_CONST && below->op == _DF_OP_CONST)
        {
          status = apply_binary (op, below->value, top->value, &below->value, diag);
          if (status != DF_OK)
            return builder_fail (b, status);
          b->n_insn--;
          b->depth--;
          return DF_OK;
        }
      b->depth--;
      return builder_push (b, &(df_expr_insn) { op, 0, 0.0 }, diag);
    }

  if (top->op == _DF_OP_CONST)
    {
      df_expr_insn in = { op, 0, 0.0 };

      status = apply_unary (&in, top->value, &top->value, diag);
      return status != DF_OK ? builder_fail (b, status) : DF_OK;
    }
  if (op == _DF_OP_NEG && top->op == _DF_OP_NEG)   /* - - x = x */
    {
      b->n_insn--;
      return DF_OK;
    }
  return builder_push (b, &(df_expr_insn) { op, 0, 0.0 }, diag);
}

df_expr *
_df_expr_builder_finish (df_expr_builder *builder, df_diag *diag)
{
  df_expr *expr = NULL;

  if (builder == NULL)
    {
      df_diag_fail (diag, DF_E_NOMEM, -1, "out of memory");
      return NULL;
    }
  if (builder->failed || builder->depth != 1)
    df_diag_fail (diag, DF_E_INPUT, -1, "incomplete formula");
  else
    {
      expr = malloc (sizeof *expr + (size_t) builder->n_insn * sizeof expr->insn[0]);
      if (expr == NULL)
        df_diag_fail (diag, DF_E_NOMEM, -1, "out of memory");
      else
        {
          expr->n_vars = builder->n_vars;
          expr->n_insn = builder->n_insn;
          memcpy (expr->insn, builder->insn, (size_t) builder->n_insn * sizeof expr->insn[0]);
        }
    }
  _df_expr_builder_free (builder);
  return expr;
}
