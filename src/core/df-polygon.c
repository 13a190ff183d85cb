/* df-polygon.c: point in polygon (see df-polygon.h). A plain crossing count: the outlines are
 * simple loops sampled finely, so no winding number is needed. */
#include "df-polygon.h"

bool
df_polygon_contains (const double (*poly)[2], size_t n, double u, double v)
{
  bool in = false;

  if (n < 3)
    return false;
  for (size_t a = 0, b = n - 1; a < n; b = a++)
    if ((poly[a][1] > v) != (poly[b][1] > v)
        && u < (poly[b][0] - poly[a][0]) * (v - poly[a][1]) / (poly[b][1] - poly[a][1])
                 + poly[a][0])
      in = !in;
  return in;
}
