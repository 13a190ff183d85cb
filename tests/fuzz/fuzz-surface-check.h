/* fuzz-surface-check.h: the rules a built surface must keep, shared by the targets that build
 * one (surface key files, data files): a finite positive size and box, and at a few chart
 * points either finite geometry or a failure whose message shows no non-finite number; placing
 * a point off the surface gives a point or a message. */
#pragma once

#include <math.h>

#include "df-geometry.h"
#include "df-glib.h"
#include "df-project.h"
#include "fuzz-common.h"

static inline void
fuzz_check_surface (const df_surface *s)
{
  static const double fractions[][2] = { { 0.0, 0.0 }, { 0.5, 0.5 }, { 1.0, 1.0 },
                                         { 0.25, 0.875 }, { 1e-7, 0.5 } };
  double u0, u1, v0, v1, lo[3], hi[3];

  FUZZ_REQUIRE (isfinite (df_surface_size (s)) && df_surface_size (s) > 0.0);
  df_surface_get_bbox (s, lo, hi);
  for (int k = 0; k < 3; k++)
    FUZZ_REQUIRE (isfinite (lo[k]) && isfinite (hi[k]) && lo[k] <= hi[k]);
  df_surface_get_domain (s, &u0, &u1, &v0, &v1);
  for (gsize i = 0; i < G_N_ELEMENTS (fractions); i++)
    {
      double u = u0 + (u1 - u0) * fractions[i][0];
      double v = v0 + (v1 - v0) * fractions[i][1];
      df_point_geometry g;
      df_diag diag;

      df_diag_clear (&diag);
      if (df_surface_geometry (s, u, v, &g, &diag) == DF_OK)
        {
          FUZZ_REQUIRE (isfinite (g.K) && isfinite (g.H));
          for (int k = 0; k < 3; k++)
            FUZZ_REQUIRE (isfinite (g.point[k]) && isfinite (g.normal[k]));
        }
      else
        fuzz_check_detail ("df_surface_geometry", diag.detail);
    }
  {
    /* The box centre pushed off the surface: placing it gives a point or a message. */
    double p[3], u, v, dist;
    df_diag diag;

    for (int k = 0; k < 3; k++)
      p[k] = 0.5 * (lo[k] + hi[k]);
    p[2] = hi[2] + 0.01 * df_surface_size (s);
    df_diag_clear (&diag);
    if (df_surface_project (s, p, 0.0, &u, &v, &dist, &diag) == DF_OK)
      FUZZ_REQUIRE (isfinite (u) && isfinite (v) && isfinite (dist));
    else
      fuzz_check_detail ("df_surface_project", diag.detail);
  }
}

