/* df-fit-deviation.c: signed distances of measured points from their fitted surface (see
 * df-fit-deviation.h). The closest point is the core's placer (df-project.c), which follows a
 * sequence by continuation: a grid or a profile given in file order costs about one Newton
 * step a point. Plain C + libm; no GLib. */
#include <math.h>

#include "df-fit-deviation.h"
#include "df-project.h"

df_status
df_fit_deviations (const df_surface *surface,
                   const double    (*xyz)[3],
                   size_t            n,
                   double           *dev,
                   bool             *placed,
                   size_t           *n_placed,
                   df_diag          *diag)
{
  df_placer *placer;

  *n_placed = 0;
  for (size_t i = 0; i < n; i++)
    if (!isfinite (xyz[i][0]) || !isfinite (xyz[i][1]) || !isfinite (xyz[i][2]))
      return df_diag_fail (diag, DF_E_INPUT, (long) i, "point %zu is not finite", i + 1);
  placer = df_placer_new (surface);
  if (placer == NULL)
    return df_diag_fail (diag, DF_E_NOMEM, -1, "no memory for the closest-point search");
  for (size_t i = 0; i < n; i++)
    {
      double u = 0, v = 0, dist = 0, nrm[3], len, side;
      df_chart_jet jet;

      dev[i] = 0;
      placed[i] = false;
      if (df_placer_place (placer, xyz[i], 0, &u, &v, &dist, NULL) != DF_OK
          || !isfinite (dist)
          || df_surface_eval (surface, u, v, 1, &jet, NULL) != DF_OK)
        {
          /* A lost point must not steer the next search: start it from the seed grid. */
          df_placer_reset (placer);
          continue;
        }
      nrm[0] = jet.d1[0][1] * jet.d1[1][2] - jet.d1[0][2] * jet.d1[1][1];
      nrm[1] = jet.d1[0][2] * jet.d1[1][0] - jet.d1[0][0] * jet.d1[1][2];
      nrm[2] = jet.d1[0][0] * jet.d1[1][1] - jet.d1[0][1] * jet.d1[1][0];
      len = sqrt (nrm[0] * nrm[0] + nrm[1] * nrm[1] + nrm[2] * nrm[2]);
      side = 0;
      for (int k = 0; k < 3; k++)
        side += (xyz[i][k] - jet.x[k]) * nrm[k];
      /* At a pole X_u x X_v vanishes: the distance is kept, its side is not known there. */
      dev[i] = len > 0 && side < 0 ? -dist : dist;
      placed[i] = true;
      (*n_placed)++;
    }
  df_placer_free (placer);
  return DF_OK;
}
