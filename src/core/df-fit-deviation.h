/* df-fit-deviation.h: how far each measured point lies from the surface fitted to it, signed
 * along the surface normal, for the app's overlay of the data points coloured by deviation.
 * The fit's own report (df_fit_info) gives only RMS and max; a picture needs every point.
 * Plain C + libm + GSL; no GLib. */
#pragma once

#include <stdbool.h>
#include <stddef.h>

#include "df-surface.h"

/* For each space point xyz[i] (a profile's (r, z) given as (r, 0, z)): the closest surface
 * point (df-project.h, by continuation from the previous point, so give the points in their
 * file order) and the distance to it, positive on the side N points to. placed[i] is false
 * (dev[i] = 0) where no closest point was found; *n_placed counts the others. DF_E_INPUT for a
 * non-finite point (index in diag), DF_E_NOMEM when out of memory. */
df_status df_fit_deviations (const df_surface *surface,
                             const double    (*xyz)[3],
                             size_t            n,
                             double           *dev,
                             bool             *placed,
                             size_t           *n_placed,
                             df_diag          *diag);
