/* df-polygon.h: whether a chart point lies inside a closed polygon of chart points (the
 * sampled outline of a loop or a ply), by the even-odd rule: the drape's pins, the strain
 * check's grid and the shear check's start all ask it. Plain C; no GLib. */
#pragma once

#include <stdbool.h>
#include <stddef.h>

/* poly[0..n-1], closed implicitly (the last point joins the first); n >= 3. */
bool df_polygon_contains (const double (*poly)[2], size_t n, double u, double v);
