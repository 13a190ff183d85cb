/* df-fn.c: the defining-function interface (df-fn.h) and its formula implementation, which
 * evaluates compiled formulas on jets (forward-mode differentiation, exact to third order) and
 * on plain doubles when only the value is asked for.
 * Plain C + libm; no GLib. */
#include "df-fn.h"

#include <stdlib.h>
#include <string.h>

struct df_fn
{
  const df_fn_type *type;
  void             *data;
  int               dim;
  int               n_out;
  bool              has_dom;
  double            dom[4];
};

df_fn *
df_fn_new (const df_fn_type *type, void *data, int dim, int n_out, const double *dom)
{
  df_fn *fn;

  if (data == NULL || dim < 1 || dim > 2 || n_out < 1 || n_out > DF_FN_MAX_OUT)
    {
      if (data != NULL)
        type->free (data);
      return NULL;
    }
  fn = calloc (1, sizeof *fn);
  if (fn == NULL)
    {
      type->free (data);
      return NULL;
    }
  fn->type = type;
  fn->data = data;
  fn->dim = dim;
  fn->n_out = n_out;
  if (dom != NULL)
    {
      fn->has_dom = true;
      memcpy (fn->dom, dom, sizeof fn->dom);
    }
  return fn;
}

df_fn *
df_fn_copy (const df_fn *fn)
{
  df_fn *c;

  if (fn == NULL)
    return NULL;
  c = malloc (sizeof *c);
  if (c == NULL)
    return NULL;
  *c = *fn;
  c->data = fn->type->copy (fn->data);
  if (c->data == NULL)
    {
      free (c);
      return NULL;
    }
  return c;
}

void
df_fn_free (df_fn *fn)
{
  if (fn == NULL)
    return;
  fn->type->free (fn->data);
  free (fn);
}

int
df_fn_dim (const df_fn *fn)
{
  return fn->dim;
}

int
df_fn_n_out (const df_fn *fn)
{
  return fn->n_out;
}

const char *
df_fn_type_name (const df_fn *fn)
{
  return fn->type->name;
}

bool
df_fn_get_domain (const df_fn *fn, double dom[4])
{
  if (fn->has_dom)
    memcpy (dom, fn->dom, sizeof fn->dom);
  return fn->has_dom;
}

bool
df_fn_contains (const df_fn *fn, double u, double v)
{
  return fn->type->contains == NULL || fn->type->contains (fn->data, u, v);
}

double
df_fn_piece_width (const df_fn *fn, int axis)
{
  return fn->type->piece_width != NULL ? fn->type->piece_width (fn->data, axis) : 0.0;
}

const void *
df_fn_get_data (const df_fn *fn, const df_fn_type *type)
{
  return fn != NULL && fn->type == type ? fn->data : NULL;
}

df_status
df_fn_eval (const df_fn *fn, double u, double v, int order, df_fn_jet out, df_diag *diag)
{
  return fn->type->eval (fn->data, u, v, order, out, diag);
}

/* ---- formulas ---- */

typedef struct
{
  int      dim, n_out;
  df_expr *e[DF_FN_MAX_OUT];
  char     name[DF_FN_MAX_OUT][16];
} formula_data;

static void
formula_free (void *data)
{
  formula_data *f = data;

  for (int k = 0; k < f->n_out; k++)
    df_expr_free (f->e[k]);
  free (f);
}

static void *
formula_copy (const void *data)
{
  const formula_data *f = data;
  formula_data *c = malloc (sizeof *c);

  if (c == NULL)
    return NULL;
  *c = *f;
  for (int k = 0; k < f->n_out; k++)
    c->e[k] = NULL;
  for (int k = 0; k < f->n_out; k++)
    if ((c->e[k] = df_expr_copy (f->e[k])) == NULL)
      {
        formula_free (c);
        return NULL;
      }
  return c;
}

static df_status
formula_eval (const void *data, double u, double v, int order, df_fn_jet out, df_diag *diag)
{
  const formula_data *f = data;
  df_diag local;
  df_status st;

  if (order == 0)
    {
      /* The value alone, on doubles: a tenth of the cost of a jet evaluation, and what chord
       * lengths, seed grids and meshes need. */
      double xy[2] = { u, v };

      for (int k = 0; k < f->n_out; k++)
        if ((st = df_expr_eval (f->e[k], xy, &out[k][DF_JET_D], &local)) != DF_OK)
          return df_diag_fail_at (diag, DF_E_NONFINITE, -1, u, v, "%s: %s", f->name[k],
                                  local.detail);
      return DF_OK;
    }
  {
    /* Taylor coefficient of x^i y^j times i! j! is the partial derivative. */
    static const double factor[DF_JET_N] = { 1, 1, 1, 2, 1, 2, 6, 2, 2, 6 };
    df_jet vars[2], r;

    /* Jets truncated at the order asked for and in the function's own variables: a profile's
     * second-order jet has 3 coefficients where the full one has 10 (df-jet.h). */
    if (order > 3)
      order = 3;
    df_jet_seed (&vars[0], u, 0, f->dim, order);
    if (f->dim == 2)
      df_jet_seed (&vars[1], v, 1, 2, order);
    else
      df_jet_const (&vars[1], v);
    for (int k = 0; k < f->n_out; k++)
      {
        /* Inside the chart's range a failing formula is a singular value of the surface, not
         * a point outside it. */
        if ((st = df_expr_eval_jet (f->e[k], vars, &r, &local)) != DF_OK)
          return df_diag_fail_at (diag, DF_E_NONFINITE, -1, u, v, "%s: %s", f->name[k],
                                  local.detail);
        for (int i = 0; i < DF_JET_N; i++)
          out[k][i] = r.c[i] * factor[i];
      }
  }
  return DF_OK;
}

static const df_fn_type formula_type = {
  "formula", formula_eval, NULL, formula_copy, formula_free, NULL
};

df_fn *
df_fn_new_formula (int dim, int n_out, df_expr **exprs, const char *const *names)
{
  formula_data *f;
  bool ok = n_out >= 1 && n_out <= DF_FN_MAX_OUT;

  for (int k = 0; ok && k < n_out; k++)
    ok = exprs[k] != NULL;
  f = ok ? calloc (1, sizeof *f) : NULL;
  if (f == NULL)
    {
      for (int k = 0; k < n_out && k < DF_FN_MAX_OUT; k++)
        df_expr_free (exprs[k]);
      return NULL;
    }
  f->dim = dim;
  f->n_out = n_out;
  for (int k = 0; k < n_out; k++)
    {
      f->e[k] = exprs[k];
      strncpy (f->name[k], names[k], sizeof f->name[k] - 1);
    }
  return df_fn_new (&formula_type, f, dim, n_out, NULL);
}
