/* df-mesh.h: tessellation of a df_surface into a (u, v) vertex grid for drawing and picking:
 * positions, unit normals, Gaussian and mean curvature, chart coordinates and triangles. The grid
 * is denser where the surface is long or its normal turns fast. Plain C + libm; no GLib.
 *
 * Vertex i = row * n_cols + col; rows run along u (u_min .. u_max), columns along v. A periodic
 * v gets both ends as separate columns (a seam of coincident vertices), so (u, v) interpolates
 * across every triangle. Triangles are wound counter-clockwise seen from the side N points to. */
#pragma once

#include <stddef.h>
#include <stdint.h>

#include "df-surface.h"

#define DF_MESH_DEFAULT_MAX_VERTICES 60000

typedef struct df_mesh df_mesh;

typedef struct
{
  size_t max_vertices;  /* cap on rows x columns; 0: DF_MESH_DEFAULT_MAX_VERTICES */
  double max_edge;      /* target edge length as a fraction of df_surface_size; 0: 1/120 */
  double max_turn;      /* target normal turn between neighbours, radians; 0: 4 degrees */
} df_mesh_options;

/* Builds the mesh (options may be NULL). Grid points where the surface cannot be evaluated (a
 * formula fails there) are kept finite but marked invalid, and the triangles touching them are
 * left out; df_mesh_problem() then names the first such point. At a pole the normal, K and H are
 * the limits from df_surface_geometry. Fails (DF_E_DOMAIN, diag names a point) only when no
 * triangle is left. Everything stored is finite. */
df_status       df_mesh_build         (const df_surface      *surface,
                                       const df_mesh_options *options,
                                       df_mesh              **out,
                                       df_diag               *diag);
void            df_mesh_free          (df_mesh *mesh);   /* NULL is a no-op */

size_t          df_mesh_n_rows        (const df_mesh *mesh);
size_t          df_mesh_n_cols        (const df_mesh *mesh);
size_t          df_mesh_n_vertices    (const df_mesh *mesh);
size_t          df_mesh_n_triangles   (const df_mesh *mesh);

const double   *df_mesh_positions     (const df_mesh *mesh);   /* 3 per vertex */
const double   *df_mesh_normals       (const df_mesh *mesh);   /* 3 per vertex, unit */
const double   *df_mesh_uv            (const df_mesh *mesh);   /* 2 per vertex */
const double   *df_mesh_gaussian      (const df_mesh *mesh);   /* K, 1/length^2 */
const double   *df_mesh_mean          (const df_mesh *mesh);   /* H, 1/length, sign as df-geometry */
const uint8_t  *df_mesh_valid         (const df_mesh *mesh);   /* 1 where the surface evaluated */
const uint32_t *df_mesh_indices       (const df_mesh *mesh);   /* 3 per triangle */

/* Triangles over every step-th row and column (the last ones always kept) on the same
 * vertices: a lighter mesh to draw while the view moves. malloc'd, 3 * *n_triangles indices
 * (free() it); NULL when out of memory. */
uint32_t       *df_mesh_coarse_indices (const df_mesh *mesh,
                                        size_t         step,
                                        size_t        *n_triangles);

/* Largest |K| and |H| over valid vertices (0 for none): the symmetric shading range. */
double          df_mesh_max_abs_k     (const df_mesh *mesh);
double          df_mesh_max_abs_h     (const df_mesh *mesh);

typedef enum
{
  DF_MESH_GAUSSIAN,
  DF_MESH_MEAN
} df_mesh_quantity;

/* The area-weighted quantile q (0..1) of |K| or |H| over the drawn triangles, each vertex
 * weighing a third of the area around it. Near-1 quantiles make a colour range that ignores
 * what lives on a sliver of area (a cone apex, where H diverges; the rim of a cusp) yet equals
 * the maximum where the value is constant. 0 when nothing is drawn. */
double          df_mesh_abs_quantile  (const df_mesh    *mesh,
                                       df_mesh_quantity  quantity,
                                       double            q);

/* Axis-aligned box of the valid vertices. */
void            df_mesh_get_bbox      (const df_mesh *mesh, double lo[3], double hi[3]);

/* Number of invalid vertices, and the first failure (NULL when there is none). */
size_t          df_mesh_n_invalid     (const df_mesh *mesh);
const df_diag  *df_mesh_problem       (const df_mesh *mesh);
