/* df-gores.h: darts and gores, the two ways a flat sheet is made to fit a curved region.
 * Darts: a region of total curvature Omega > 0 takes a flat sheet only if a wedge of angle Omega
 * is removed (one dart of Omega, or n of Omega / n); Omega < 0 needs one inserted (a gusset).
 * Gores of a surface of revolution between the parallels t0 and t1: n pieces bounded by
 * meridians 2 pi / n apart; developed flat along the centre meridian (arc length s) a gore's
 * half-width is pi r(s) / n, half the parallel's arc (GEOMETRY.md, "Decisions").
 * The decision layer above measurement; plain C + libm; no GLib. */
#pragma once

#include <stdbool.h>
#include <stddef.h>

#include "df-surface.h"

typedef struct
{
  double omega_rad;       /* enclosed curvature */
  int    count;
  bool   gusset;          /* omega < 0: wedges are inserted, not removed */
  double angle_each_rad;  /* |omega| / count */
  /* Length of each dart from its point to the rim: the darts meet at the region's centre, taken
   * here as the radius sqrt(A / pi) of a flat disc of the region's area (an estimate; a real
   * outline's darts differ in length). */
  double length;
} df_darts;

/* count >= 1; area > 0 (surface units^2). */
df_status df_darts_compute     (double omega_rad, double area, int count, df_darts *out,
                                df_diag *diag);
/* Least number of darts each closing at most max_angle_rad (> 0): ceil(|omega| / max). 0 when
 * omega is 0. DF_E_INPUT when the count would exceed 100000. */
df_status df_darts_least_count (double omega_rad, double max_angle_rad, int *count,
                                df_diag *diag);

typedef struct
{
  int     count;
  double  t0, t1;
  double  length;         /* of the developed centre meridian, = meridian arc length */
  double  max_width;      /* 2 pi max r / n */
  double  area_each;      /* flat area of one gore, = surface area of the band / n */
  /* The flat gore's edge is longer than the meridian it is sewn to: (edge - length) / length,
   * the strain the seam must take up (a fraction; hand derivation: the edge is the curve
   * x = pi r(s) / n, its length integral of sqrt(1 + (pi r'(s) / n)^2) ds). */
  double  edge_strain;
  size_t  n;              /* samples of the centre meridian */
  double *t;              /* owned, n each */
  double *s;              /* arc length from t0 */
  double *half_width;     /* pi r(s) / n */
} df_gores;

/* Gores of a surface of revolution between t0 < t1 (inside the profile's range), count >= 1,
 * n_points >= 3 samples (evenly in t; the lengths and the area are integrated between them by
 * Gauss-Legendre). DF_E_INPUT for a graph. */
df_status df_gores_compute     (const df_surface *surface, double t0, double t1, int count,
                                size_t n_points, df_gores *out, df_diag *diag);
void      df_gores_clear       (df_gores *gores);

/* Least count whose edge strain is at most max_strain (a fraction > 0), up to 10000. */
df_status df_gores_least_count (const df_surface *surface, double t0, double t1,
                                double max_strain, int *count, df_diag *diag);

/* The flat outline of one gore as a closed polygon (x across, y = s along the centre line),
 * anticlockwise, without the repeated first point; seam > 0 offsets it outward by that
 * distance (the seam allowance; corners mitred, a miter longer than 3 x seam cut back).
 * *pts is malloc'd. */
df_status df_gores_outline     (const df_gores *gores, double seam, double (**pts)[2],
                                size_t *n_pts, df_diag *diag);
