/* df-verdict.h: verdicts along a measured curve against the user's limits (df-limits.h): each
 * stretch where a limit is exceeded, as an arc-length range with its worst value and where it
 * is. Checked: the steering radius 1/|k_g| against min-steering-radius (with the tow's
 * inner-edge compression w/(2R) beside it when tow-width is set), the fibre deviation (the angle
 * between the path and a fibre carried parallel from its start, df_loop_sample.angle_rad)
 * against max-fibre-deviation-deg, and |k_g / k_n| against friction (a winding path slips where
 * the in-surface bend asks more side force than friction gives; k_n = II(T, T)).
 * Loops, open paths and geodesics each get verdicts (df-verdict-curves.h: what "intended" means
 * for each); a loop's enclosed region also gets max-strain-percent and max-shear-deg
 * (df-verdict-region.h).
 * Geometric indicators only: the limits are the user's data. The decision layer above
 * measurement; plain C + libm + GSL; no GLib. */
#pragma once

#include <stdbool.h>
#include <stddef.h>

#include "df-curve.h"
#include "df-limits.h"
#include "df-loop.h"

/* What a verdict list is about: JSON names "loop", "geodesic", "path". */
typedef enum
{
  DF_VERDICT_LOOP,
  DF_VERDICT_GEODESIC,
  DF_VERDICT_PATH
} df_verdict_curve;

const char *df_verdict_curve_name (df_verdict_curve kind);

typedef struct
{
  df_limit_id limit;
  bool   within;
  bool   has_value;       /* false when the worst value is unbounded (k_n = 0 under friction) */
  double value;           /* the worst value: the smallest radius (surface units), the largest
                           * deviation (deg) or the largest |k_g / k_n| */
  double threshold;       /* the limit, in the same units */
  /* The stretch [s0, s1] in arc length from the curve's start; on a closed curve s0 > s1 means
   * it runs on through the start. Whole curve: [0, length]. For a verdict within the limit,
   * has_where is false. */
  bool   has_where;
  double s0, s1;
  double s_worst;         /* where the worst value is (the worst sample) */
  double u_worst, v_worst;
  double point_worst[3];
  /* A verdict over a loop's enclosed region (max-strain-percent, max-shear-deg): there is no
   * arc-length stretch (has_where false); the worst point is where the limit is exceeded most
   * (s_worst 0). */
  bool   region;
  double signed_value;    /* region strain: the worst strain with its sign, percent (> 0 a
                           * flat rim must shrink, < 0 stretch); region shear: the worst cell
                           * shear with its sign, degrees (> 0 the crossing angle closes) */
  /* Region shear only (df-verdict-shear.h): cells of the drape with a corner inside the loop,
   * and how many of them are past the locking angle. */
  size_t n_cells;
  size_t n_cells_over;
  /* Set only by the geodesic verdicts: the value holds by construction (k_g = 0 exactly), not
   * from samples. */
  bool   exact;
  bool   has_tow;         /* steering only, tow-width set */
  double tow_compression; /* w / (2 R) at the worst point, a fraction (from memory) */
} df_verdict;

typedef struct
{
  size_t      n;
  df_verdict *items;      /* owned */
  size_t      n_exceeded;
  df_verdict_curve kind;  /* set by the function that fills the list */
} df_verdict_list;

/* Normal and geodesic curvature of the curve at tau: k_n = x'' . N / |x'|^2 = II(T, T),
 * k_g = x'' . (N x x') / |x'|^3 (+ turning left about N), both 1/length. */
df_status df_curve_curvatures (const df_curve *curve, double tau, double *k_g, double *k_n,
                               df_diag *diag);

/* Verdicts for every set limit that applies to a path (steering radius, fibre deviation,
 * friction): one per exceeded stretch, or one within-limit verdict with the worst value over the
 * whole curve. samples are the curve's measured samples (df_loop_result.samples, with tau, s,
 * k_g and angle_rad; the more, the finer the worst values; >= 8), length its arc length. The
 * range ends are refined between samples: by bisection on the exact k_g and k_n, linearly for
 * the deviation. limits must be resolved (df_limits_resolve). */
df_status df_verdicts_measure (const df_curve       *curve,
                               const df_loop_sample *samples,
                               size_t                n_samples,
                               double                length,
                               const df_limits      *limits,
                               df_verdict_list      *out,
                               df_diag              *diag);

/* Frees the items; keeps kind. NULL: no-op. */
void      df_verdict_list_clear (df_verdict_list *list);
