/* df-verdict-shear.h: max-shear-deg over a loop's enclosed region: the loop is draped as a
 * woven ply (df-drape.h, the kinematic pin-jointed net) and the worst cell shear (90 deg minus
 * the cell's mean crossing angle) is checked against the user's locking angle, with the number
 * of cells past it and where the worst one is. The drape's start, warp and cell come from the
 * loop's own keys in the project (df_project_loop.drape) or from the defaults below; the
 * closure check of the cells is skipped (it costs as much as the net and decides nothing
 * here). Not checked, with a note: a loop near a pole (the drape's chart is singular there),
 * a loop that winds round the surface, no start inside the loop.
 * The decision layer; plain C + libm + GSL; no GLib. */
#pragma once

#include "df-verdict.h"

/* The default cell: the loop's length over this (about 30 cells round the rim, some 70 cells
 * over a roundish ply): fine enough for a smooth shear field, quick enough for a check. */
#define DF_SHEAR_CELLS_PER_LENGTH 30

/* The drape asked for; each part optional. */
typedef struct
{
  bool   has_start;
  double start[2];       /* chart point */
  bool   has_warp;
  double warp_deg;       /* from X_u, anticlockwise about N */
  bool   has_cell;
  double cell;           /* surface units, > 0 */
} df_shear_setup;

/* What the drape used (given or defaulted), for the output. */
typedef struct
{
  double start[2];
  double warp_deg;
  double cell;           /* surface units */
  bool   start_default, warp_default, cell_default;
  bool   start_moved;    /* the default start: the chart centroid lay outside the loop, so the
                          * first point moved inward was used */
  size_t n_cells;        /* cells with a corner inside the loop */
  size_t n_cells_over;   /* of them past the limit */
  size_t n_nodes_lost;   /* pins the net could not place (the surface's edge, folding) */
} df_shear_used;

/* Appends one verdict (region true, limit DF_LIMIT_MAX_SHEAR; value the worst |cell shear| in
 * degrees at the worst cell's centre) when limits set max-shear-deg and the loop can be
 * draped; else *checked is false and note says why (note_len >= 1). loop is the closed curve
 * through the loop's n_points points; result its measurement (length, disc). used may be
 * NULL. The outline polygon is the loop's spline sampled as `driftframe-cli drape` samples
 * it, so both give the same net. */
df_status df_verdict_shear (const df_curve        *loop,
                            size_t                 n_points,
                            const df_loop_result  *result,
                            const df_limits       *limits,
                            const df_shear_setup  *setup,
                            df_verdict_list       *out,
                            df_shear_used         *used,
                            bool                  *checked,
                            char                  *note,
                            size_t                 note_len,
                            df_diag               *diag);

/* The polygon `drape` and the shear verdict drape over: at least max(8 n_points, 2048) points
 * of the loop's spline (df_curve_sample_plane). Returns the count, 0 on out-of-memory. */
size_t    df_shear_outline (const df_curve *loop, size_t n_points, double (**out)[2]);
