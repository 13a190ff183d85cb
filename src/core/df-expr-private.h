/* df-expr-private.h: the opcodes of a compiled formula and the builder that the formula reader
 * (df-expr-parse.c) uses to emit them in postfix order. Not for use outside src/core.
 * Plain C; no GLib. */
#pragma once

#include <stddef.h>

#include "df-expr.h"

/* Deepest operand stack a formula may need. Evaluation keeps the stack in a fixed array on
 * the C stack (no allocation, thread-safe); the builder refuses anything deeper. */
#define DF_EXPR_MAX_STACK 64

/* Integer exponents up to this size become repeated multiplication (_DF_OP_POWI), which is
 * exact and works for negative bases; larger ones go through pow(). */
#define DF_EXPR_MAX_POWI 1024

typedef enum
{
  _DF_OP_CONST,     /* push value */
  _DF_OP_VAR,       /* push vars[arg] */
  _DF_OP_ADD,       /* binary: pop b, pop a, push a op b */
  _DF_OP_SUB,
  _DF_OP_MUL,
  _DF_OP_DIV,
  _DF_OP_POW,       /* a^b = exp(b log a), a > 0 (a = 0 allowed for the value when b > 0) */
  _DF_OP_NEG,       /* unary: replace top */
  _DF_OP_POWI,      /* top^arg, arg an integer with |arg| <= DF_EXPR_MAX_POWI */
  _DF_OP_POWC,      /* top^value, value a constant that is not a small integer */
  /* Functions, in the order of their names in df-expr.c. */
  _DF_OP_SIN,
  _DF_OP_COS,
  _DF_OP_TAN,
  _DF_OP_ASIN,
  _DF_OP_ACOS,
  _DF_OP_ATAN,
  _DF_OP_EXP,
  _DF_OP_LOG,
  _DF_OP_SQRT,
  _DF_OP_ABS,
  _DF_OP_SINH,
  _DF_OP_COSH,
  _DF_OP_TANH,
  _DF_OP_COUNT
} df_expr_op;

#define _DF_OP_FIRST_FUNCTION _DF_OP_SIN
#define _DF_OP_N_FUNCTIONS    (_DF_OP_COUNT - _DF_OP_FIRST_FUNCTION)

/* The function opcode called `name` (len bytes, not necessarily NUL-terminated), or -1. */
int         _df_expr_function_lookup (const char *name, size_t len);
/* The name of function i (0 <= i < _DF_OP_N_FUNCTIONS), for messages and reserved names. */
const char *_df_expr_function_name   (int i);

typedef struct df_expr_builder df_expr_builder;

/* A builder for a formula over n_vars variables (0..DF_EXPR_MAX_VARS); NULL on out-of-memory. */
df_expr_builder *_df_expr_builder_new   (int n_vars);
void             _df_expr_builder_free  (df_expr_builder *builder);   /* NULL is a no-op */

/* Each call appends one instruction in postfix order. Constant operands are folded at once
 * (a parameter is a constant), and a constant exponent turns _DF_OP_POW into _DF_OP_POWI or
 * _DF_OP_POWC. Failures leave the builder unusable except for _free:
 *   DF_E_INPUT      the formula is too deeply nested (stack over DF_EXPR_MAX_STACK), a bad
 *                   variable index or an operator without enough operands;
 *   DF_E_DOMAIN     folding met a domain error ("log of -2");
 *   DF_E_NONFINITE  folding gave a non-finite value ("exp of 1000 is not finite");
 *   DF_E_NOMEM. */
df_status        _df_expr_builder_const (df_expr_builder *builder, double value, df_diag *diag);
df_status        _df_expr_builder_var   (df_expr_builder *builder, int index, df_diag *diag);
/* op is a binary operator, _DF_OP_NEG or a function (not CONST, VAR, POWI or POWC). */
df_status        _df_expr_builder_op    (df_expr_builder *builder, df_expr_op op, df_diag *diag);

/* Ends the formula (exactly one value must be on the stack) and frees the builder.
 * NULL with diag filled on failure (DF_E_INPUT or DF_E_NOMEM). */
df_expr         *_df_expr_builder_finish (df_expr_builder *builder, df_diag *diag);

/* True when the formula is a single constant (always so without variables); *value gets it. */
int              _df_expr_is_constant    (const df_expr *expr, double *value);
