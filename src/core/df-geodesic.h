/* df-geodesic.h: geodesics shot from a point with a heading, by adaptive integration of
 * x''^k + Gamma^k_ij x'^i x'^j = 0 in arc length, in pole-centred coordinates near a smooth pole
 * (so it runs through poles). Stops only where it cannot go on (the domain's edge, a cone apex)
 * and says where and why.
 * Plain C + libm + GSL; no GLib. */
#pragma once

#include <stdbool.h>
#include <stddef.h>

#include "df-surface.h"

typedef struct
{
  double s;
  double u, v;
  double point[3];
  double tangent[3];   /* unit, in space */
} df_geodesic_sample;

typedef struct
{
  double length;                 /* reached; < requested when stopped early */
  bool   stopped_early;
  char   stop_reason[400];
  size_t n_samples;
  df_geodesic_sample *samples;   /* owned, evenly spaced in s */
} df_geodesic_result;

/* heading_rad: angle of the initial direction from the unit vector along X_u, counter-clockwise
 * about N. length > 0 in the surface's units. n_samples >= 2. */
df_status df_geodesic_shoot (const df_surface   *surface,
                             double              u,
                             double              v,
                             double              heading_rad,
                             double              length,
                             size_t              n_samples,
                             df_geodesic_result *out,
                             df_diag            *diag);

void      df_geodesic_result_clear (df_geodesic_result *result);
