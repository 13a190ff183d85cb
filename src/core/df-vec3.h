/* df-vec3.h: the few operations on 3-vectors in space that the numeric core shares (dot and
 * cross products, the geodesic curvature of a space curve on a surface). Header-only, plain C. */
#pragma once

#include <math.h>

static inline double
df_dot3 (const double a[3], const double b[3])
{
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}

static inline void
df_cross3 (const double a[3], const double b[3], double out[3])
{
  out[0] = a[1] * b[2] - a[2] * b[1];
  out[1] = a[2] * b[0] - a[0] * b[2];
  out[2] = a[0] * b[1] - a[1] * b[0];
}

/* Geodesic curvature x'' . (N x x') / |x'|^3 of a curve with derivatives dx, ddx on a surface of
 * unit normal n; positive when it turns left about N. Also returns the speed |x'|. */
static inline double
df_geodesic_curvature (const double dx[3], const double ddx[3], const double n[3], double *speed)
{
  double nxt[3];

  *speed = sqrt (df_dot3 (dx, dx));
  df_cross3 (n, dx, nxt);
  return df_dot3 (ddx, nxt) / (*speed * *speed * *speed);
}
