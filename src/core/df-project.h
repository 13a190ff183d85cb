/* df-project.h: the closest surface point to a point in space (Newton on the squared distance
 * from a grid seed), used to place loop points given in space and mouse picks.
 * Plain C + libm + GSL; no GLib. */
#pragma once

#include "df-surface.h"

/* Finds (u, v) minimising |X(u, v) - p|. dist is that distance. DF_E_DOMAIN when the closest
 * point lies on the domain's edge farther than max_dist from p (max_dist <= 0: no limit),
 * DF_E_NOCONVERGE when Newton fails. */
df_status df_surface_project (const df_surface *surface,
                              const double      p[3],
                              double            max_dist,
                              double           *u,
                              double           *v,
                              double           *dist,
                              df_diag          *diag);
