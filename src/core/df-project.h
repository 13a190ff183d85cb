/* df-project.h: the closest surface point to a point in space, used to place loop points given
 * in space (a scan, a CAD export) and mouse picks. A placer follows a sequence of points: each
 * search starts from the previous point's answer (Newton in the chart), and only the first
 * point and a detected jump are searched from a seed grid.
 * Plain C + libm + GSL; no GLib. */
#pragma once

#include <stddef.h>

#include "df-surface.h"

/* Finds (u, v) minimising |X(u, v) - p| from scratch (seed grid, then Newton from the best
 * few seeds). dist is that distance. DF_E_DOMAIN when the closest point is farther than
 * max_dist from p (max_dist <= 0: no limit), DF_E_NOCONVERGE when no surface point could be
 * evaluated, DF_E_INPUT for a non-finite p. On a surface of revolution v is atan2 (y, x) of p
 * (0 on the axis); on a closed profile u is wrapped into [t_min, t_max]. */
df_status df_surface_project (const df_surface *surface,
                              const double      p[3],
                              double            max_dist,
                              double           *u,
                              double           *v,
                              double           *dist,
                              df_diag          *diag);

/* Places a sequence of space points one after the other. Borrows the surface, which must
 * outlive it; holds mutable state, so one placer per thread. */
typedef struct df_placer df_placer;

/* NULL when out of memory. The seed grid is built at the first search. */
df_placer *df_placer_new            (const df_surface *surface);
void       df_placer_free           (df_placer *placer);    /* NULL is a no-op */

/* Forgets the previous point: the next one is searched from the seed grid. */
void       df_placer_reset          (df_placer *placer);

/* The closest point to p, continuing from the previous call's answer: safeguarded Newton on
 * |X(u, v) - p|^2 in the chart. A jump (Newton failing, ending on the domain's edge, or the
 * distance growing more than the point moved, or past twice the previous distance) falls back
 * to the seed grid and keeps the better answer. Results and failures as df_surface_project. */
df_status  df_placer_place          (df_placer    *placer,
                                     const double  p[3],
                                     double        max_dist,
                                     double       *u,
                                     double       *v,
                                     double       *dist,
                                     df_diag      *diag);

/* How many points were placed by continuation and how many were searched from the seed grid
 * (the first point and every jump) since the placer was made. */
void       df_placer_get_counts     (const df_placer *placer,
                                     size_t          *continued,
                                     size_t          *searched);
