/* df-curve-private.h: the curve's struct and the helpers shared by df-curve.c and
 * df-curve-sphere.c. Not for use outside the curve module. Plain C; no GLib. */
#pragma once

#include <stdbool.h>
#include <stddef.h>

#include "df-curve.h"

/* A pole's data for pole-centred coordinates about it. */
typedef struct
{
  double t;          /* the pole's t */
  double sign;       /* dt/drho: +1 at u_min, -1 at u_max */
  double r[4];       /* the profile's r and t-derivatives at the pole */
  bool   smooth;     /* a smooth pole (not a cone apex) */
} pole_frame;

struct df_curve
{
  df_surface     *surface;      /* own copy */
  df_curve_coords coords;
  bool            closed;
  double          tau0, tau1;
  double          pole_t;       /* polar coordinates: the pole's t */
  double          pole_sign;    /* dt/drho: +1 at u_min, -1 at u_max */
  double          t_range;
  pole_frame      frame[2];     /* both ends' pole data (revolution surfaces) */
  /* spline */
  size_t          n_nodes;      /* distinct nodes; closed: the period adds one more */
  double         *taus;         /* n_nodes + 1 when closed */
  double         *coef[3];      /* per segment 4 coefficients a, b, c, d of each coordinate
                                 * (3 in sphere coordinates) */
  double          drift[2];     /* chart coords, closed: u, v grow by drift * tau per lap */
  /* exact function */
  df_curve_fn     fn;
  void           *user;
  double         *breaks;
  size_t          n_breaks;
  int             winding;
  int             tube_winding; /* turns round a closed profile (t) */
};

/* Largest segment i with taus[i] <= tau, clamped. */
size_t    _df_curve_segment_of    (const df_curve *c, double tau);
/* tau wrapped into the range of a closed curve (laps: whole periods removed), else clamped. */
double    _df_curve_wrap_tau      (const df_curve *c, double tau, int *laps);
/* Sphere coordinates: the plane point and derivatives in the polar picture about end `force`
 * (or the nearer pole when force < 0); returns the end used. */
int       _df_curve_sphere_plane  (const df_curve *c, double tau, int force, double p[2],
                                   double dp[2], double ddp[2]);
/* Sphere coordinates: stores the equator crossings as the curve's breaks. */
df_status _df_curve_sphere_breaks (df_curve *c);

/* Slopes s_i of the C2 cubic through (x_i, y_i), i < n (df-curve-spline.c). Closed: periodic
 * with period x[n] - x[0]; open: not-a-knot ends. Returns 0 or a GSL error code. */
int       _df_curve_spline_slopes (const double *x, const double *y, size_t n, bool closed,
                                   double *s);
/* Per-segment cubic coefficients a + b dt + c dt^2 + d dt^3 (4 per segment) from values and
 * slopes. */
void      _df_curve_spline_coefficients (const double *x, const double *y, const double *s,
                                         size_t nseg, size_t n, double *coef);
