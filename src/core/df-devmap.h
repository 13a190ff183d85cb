/* df-devmap.h: the developability map: what a flat patch of radius a suffers at a point of the
 * surface. The geodesic disc of radius a is built from the exponential map (geodesics shot in
 * evenly spaced headings, df-geodesic.c) in geodesic polar coordinates (rho, theta), where
 * dA = J drho dtheta and J solves the Jacobi equation J'' + K J = 0, J(0) = 0, J'(0) = 1 along
 * each geodesic (do Carmo, sec. 4-6, from memory). From it: the enclosed curvature
 * Omega = integral of K J, the circumference C = integral of J(a) dtheta, the area, and the rim
 * strain of a flat disc forced onto it, (2 pi a - C) / (2 pi a), about K a^2 / 6 for small a
 * (Bertrand-Diguet-Puiseux). The decision layer above measurement; plain C + libm + GSL. */
#pragma once

#include <stdbool.h>
#include <stddef.h>

#include "df-surface.h"

typedef struct
{
  size_t n_directions;  /* geodesics per disc, >= 8; default 48 */
  size_t n_steps;       /* steps along each (even, >= 8); default 32 */
} df_devmap_options;

void df_devmap_options_init (df_devmap_options *options);

typedef struct
{
  bool   ok;              /* false: the disc leaves the surface, reaches a pole or folds */
  double enclosed_rad;    /* integral of K dA over the geodesic disc */
  double gauss_bonnet_rad;/* 2 pi - closed integral of k_g ds of the rim: the same by
                           * Gauss-Bonnet, an independent check */
  double circumference;
  double area;
  double strain;          /* (2 pi a - C) / (2 pi a): > 0 the rim must shrink, < 0 stretch */
} df_devmap_point;

/* The disc of radius a > 0 round (u, v). A disc that cannot be built is DF_OK with ok false. */
df_status df_devmap_at (const df_surface        *surface,
                        double                   u,
                        double                   v,
                        double                   a,
                        const df_devmap_options *options,   /* NULL: defaults */
                        df_devmap_point         *out,
                        df_diag                 *diag);

typedef struct
{
  size_t           nu, nv;
  double           a;
  double          *u, *v;     /* grid lines, nu and nv values, owned */
  df_devmap_point *points;    /* [j * nu + i] at (u[i], v[j]), owned */
  size_t           n_ok;
} df_devmap;

/* An nu x nv grid (each >= 2) over the chart's domain, inset by half a cell so that no point
 * lies on the edge (or on a revolution surface's pole). */
df_status df_devmap_grid (const df_surface        *surface,
                          double                   a,
                          size_t                   nu,
                          size_t                   nv,
                          const df_devmap_options *options,
                          df_devmap               *out,
                          df_diag                 *diag);
void      df_devmap_clear (df_devmap *map);
