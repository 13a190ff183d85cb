/* df-fn.h: the defining function of a surface, as a small interface: a map from a 1-D domain
 * (a profile parameter t) or a 2-D domain (x, y) to one or more values, with exact partial
 * derivatives to third order. The surface kinds (df-surface.c) build charts from it and never
 * ask what is behind it: a formula (df_expr, below) or a fitted spline (df-fit.h). Variants are
 * const method tables with user data, the way GSL picks ODE steppers.
 * Plain C + libm; no GLib. */
#pragma once

#include <stdbool.h>

#include "df-expr.h"
#include "df-jet.h"
#include "df-status.h"

/* A defining function's derivatives at a point, one row per output, as plain partial
 * derivatives indexed by df_jet_index (d[k][DF_JET_DX] = d f_k / dx ...). A 1-D function fills
 * only DF_JET_D, DF_JET_DX, DF_JET_DXX and DF_JET_DXXX. */
#define DF_FN_MAX_OUT 2
typedef double df_fn_jet[DF_FN_MAX_OUT][DF_JET_N];

typedef struct
{
  const char *name;   /* "formula", "profile spline", "height spline" */
  /* Values and derivatives up to `order` (0..3) at (u, v) (v unused in 1-D); rows beyond
   * n_out and derivatives beyond order may be left unset. A failure is a singular value
   * (DF_E_NONFINITE) with a detail naming the output. Must be thread-safe on const data. */
  df_status (*eval) (const void *data, double u, double v, int order, df_fn_jet out,
                     df_diag *diag);
  /* Optional: is (u, v) where the function is defined (e.g. covered by data)? NULL means the
   * whole rectangle the surface is built on. */
  bool      (*contains) (const void *data, double u, double v);
  void     *(*copy) (const void *data);
  void      (*free) (void *data);
  /* Optional: the width of the polynomial pieces along axis 0 (u) or 1 (v) of a piecewise-
   * polynomial function (a spline's knot spacing); NULL for an analytic one. Lets a caller
   * skip methods that need one smooth function over many pieces. */
  double    (*piece_width) (const void *data, int axis);
} df_fn_type;

typedef struct df_fn df_fn;

/* Wraps data (ownership passes to the function, freed with type->free also on failure). dim is
 * 1 or 2, n_out 1..DF_FN_MAX_OUT. dom is the natural domain (u_min, u_max, v_min, v_max), or
 * NULL when the caller gives the range (a formula). NULL on allocation failure. */
df_fn      *df_fn_new          (const df_fn_type *type,
                                void             *data,
                                int               dim,
                                int               n_out,
                                const double     *dom);

/* The formula implementation: takes ownership of the n_out formulas (also on failure); their
 * variables are t (dim 1) or x, y (dim 2). names label them in messages ("r(t)", "z(t)"). */
df_fn      *df_fn_new_formula  (int                dim,
                                int                n_out,
                                df_expr          **exprs,
                                const char *const *names);

df_fn      *df_fn_copy         (const df_fn *fn);
void        df_fn_free         (df_fn *fn);   /* NULL is a no-op */

int         df_fn_dim          (const df_fn *fn);
int         df_fn_n_out        (const df_fn *fn);
const char *df_fn_type_name    (const df_fn *fn);
/* The natural domain; false (dom untouched) for a function defined by the caller's range. */
bool        df_fn_get_domain   (const df_fn *fn, double dom[4]);
bool        df_fn_contains     (const df_fn *fn, double u, double v);
/* The type's piece_width, or 0 for an analytic function. */
double      df_fn_piece_width  (const df_fn *fn, int axis);
/* Type check for implementations' own accessors (df-fit.c). */
const void *df_fn_get_data     (const df_fn *fn, const df_fn_type *type);

df_status   df_fn_eval         (const df_fn *fn,
                                double       u,
                                double       v,
                                int          order,
                                df_fn_jet    out,
                                df_diag     *diag);
