/* df-surface-view-points.h: DfSurfaceView's data points (df-surface-view-points.c): the
 * measured points of a fitted surface drawn over it as small discs. */
#pragma once

#include "df-surface-view.h"

G_BEGIN_DECLS

/* n points, 6 floats each: x, y, z (in space) and r, g, b (0..1); copied. n = 0 clears. */
void df_surface_view_set_points (DfSurfaceView *self,
                                 const float   *xyz_rgb,
                                 gsize          n);

G_END_DECLS
