/* df-surface.h: a parametrised surface (chart) with exact derivatives to third order: a surface
 * of revolution from a profile r(t), z(t), or a graph z = f(x, y). Variants are const method
 * tables (df_surface_kind), the way GSL picks ODE steppers.
 * Plain C + libm + GSL; no GLib. Conventions: ../shared/GEOMETRY.md. */
#pragma once

#include <stdbool.h>

#include "df-expr.h"
#include "df-fn.h"
#include "df-status.h"

typedef struct df_surface df_surface;

typedef enum
{
  DF_SURFACE_REVOLUTION,  /* (u, v) = (t, phi), X = (r cos phi, r sin phi, z) */
  DF_SURFACE_GRAPH        /* (u, v) = (x, y),   X = (x, y, f(x, y)) */
} df_surface_type;

/* X and its partial derivatives at a chart point, to the order asked for.
 * d1[i] = X_i; d2[0..2] = X_uu, X_uv, X_vv; d3[0..3] = X_uuu, X_uuv, X_uvv, X_vvv. */
typedef struct
{
  double x[3];
  double d1[2][3];
  double d2[3][3];
  double d3[4][3];
} df_chart_jet;

/* A profile end on the rotation axis (r = 0 up to 1e-12 x max r). sin_alpha = dr/ds there
 * (alpha the cone's half-angle); concentrated = 2 pi (1 - sin_alpha), the apex curvature
 * (0 at a smooth pole). */
typedef struct
{
  bool   on_axis;
  double t;
  double sin_alpha;
  double concentrated;
} df_pole;

/* Builds a surface of revolution; takes ownership of r and z (freed also on failure).
 * Checks on a fine sampling of [t_min, t_max] that r >= 0 (|r| <= 1e-12 max r counts as on
 * the axis), the profile speed is non-zero and everything is finite; diag names the t. */
df_status   df_surface_new_revolution (df_expr     *r,
                                       df_expr     *z,
                                       double       t_min,
                                       double       t_max,
                                       df_surface **out,
                                       df_diag     *diag);

/* Builds a graph z = f(x, y) over a rectangle; takes ownership of f. */
df_status   df_surface_new_graph      (df_expr     *f,
                                       double       x_min,
                                       double       x_max,
                                       double       y_min,
                                       double       y_max,
                                       df_surface **out,
                                       df_diag     *diag);

/* The same from any defining function (df-fn.h): profile (r, z)(t) of dimension 1 with two
 * outputs, or height f(x, y) of dimension 2 with one; takes ownership of fn (freed also on
 * failure) and runs the same checks. A fitted function gives its own range
 * (df_fn_get_domain), and may cover only part of the rectangle (df_fn_contains). */
df_status   df_surface_new_revolution_fn (df_fn       *fn,
                                          double       t_min,
                                          double       t_max,
                                          df_surface **out,
                                          df_diag     *diag);
df_status   df_surface_new_graph_fn   (df_fn       *f,
                                       double       x_min,
                                       double       x_max,
                                       double       y_min,
                                       double       y_max,
                                       df_surface **out,
                                       df_diag     *diag);
/* The defining function (owned by the surface). */
const df_fn *df_surface_get_fn        (const df_surface *surface);

df_surface *df_surface_copy           (const df_surface *surface);
void        df_surface_free           (df_surface *surface);   /* NULL is a no-op */

df_surface_type df_surface_get_kind   (const df_surface *surface);
const char *df_surface_kind_name      (const df_surface *surface);  /* "revolution", "graph" */

/* Chart domain. For a revolution surface v = phi in [-pi, pi] and is periodic. */
void        df_surface_get_domain     (const df_surface *surface,
                                       double *u_min, double *u_max,
                                       double *v_min, double *v_max);
bool        df_surface_v_periodic     (const df_surface *surface);
/* A closed profile (ends meeting with the same tangent, e.g. a torus tube): u = t wraps with
 * period t_max - t_min, and any finite t is accepted. */
bool        df_surface_u_periodic     (const df_surface *surface);

/* Axis-aligned bounding box of the surface (from a sampling) and its diagonal, the length
 * scale for relative tolerances. */
void        df_surface_get_bbox       (const df_surface *surface, double lo[3], double hi[3]);
double      df_surface_size           (const df_surface *surface);

/* poles[0] at u_min, poles[1] at u_max; always not on_axis for a graph. */
void        df_surface_get_poles      (const df_surface *surface, df_pole poles[2]);

/* One sentence on which way N = X_u x X_v / |X_u x X_v| points, e.g.
 * "N points away from the axis (to the left of the profile as t increases)". */
const char *df_surface_normal_side    (const df_surface *surface);

/* X and derivatives up to `order` (0..3) at (u, v). DF_E_DOMAIN outside the domain (a margin
 * of 1e-9 of the range is allowed), DF_E_NONFINITE if a formula fails there. The periodic v
 * of a revolution surface is accepted at any value, and so is t on a closed profile. */
df_status   df_surface_eval           (const df_surface *surface,
                                       double            u,
                                       double            v,
                                       int               order,
                                       df_chart_jet     *out,
                                       df_diag          *diag);

/* Is (u, v) in the domain (same margin as df_surface_eval)? */
bool        df_surface_contains       (const df_surface *surface, double u, double v);
