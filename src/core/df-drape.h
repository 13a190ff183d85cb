/* df-drape.h: the kinematic drape of a woven ply: the pin-jointed (Chebyshev) net of side h
 * from a start point and a warp direction, its shear at every node and cell, the locking and
 * fibre-deviation flags, the closure check of every cell (Gauss-Bonnet) and the flat pattern
 * (every cell a square of side h, the ply outline mapped with it). Conventions:
 * ../shared/GEOMETRY.md "Woven-ply drape".
 * Plain C + libm + GSL; no GLib. */
#pragma once

#include <stdbool.h>
#include <stddef.h>

#include "df-curve.h"
#include "df-surface.h"

typedef struct df_drape df_drape;

typedef struct
{
  /* Warp direction at the start: the angle from the unit vector along X_u (t on a surface of
   * revolution, x on a graph), anticlockwise about N. The weft starts at warp + 90 deg. */
  double warp_rad;
  double cell;                 /* h, the thread length between pins, surface units, > 0 */
  /* Locking angle and allowed fibre deviation, radians; NAN (the default) = no limit. */
  double max_shear_rad;
  double max_fibre_deviation_rad;
  /* rk8pd steps per thread segment; 0 (default) picks the stepper (rkck or rk8pd) and the
   * steps at the start so that halving the step changes a segment's end by less than
   * 1e-12 h. */
  int    substeps;
  /* Compute each cell's integral of K dA independently (the closure check): costs about as
   * much as the net itself; an interactive view may switch it off while dragging. */
  bool   check_closure;
  /* Nodes per generator and side at most (default 4000). */
  size_t max_nodes_per_side;
} df_drape_options;

void df_drape_options_init (df_drape_options *options);

typedef struct
{
  int    i, j;             /* net indices: i along the warp, j along the weft; (0, 0) = start */
  double u, v;             /* chart point (v unwrapped continuously from the start) */
  double point[3];
  double normal[3];
  bool   inside;           /* inside the ply outline (point in polygon in the chart) */
  double warp[3], weft[3]; /* unit thread directions in space (mean of the two segments) */
  double shear_rad;        /* 90 deg - angle from warp to weft about N; + when it closes */
  /* Angle from the intended warp direction (warp_rad from X_u at this node) to the warp,
   * anticlockwise about N, in (-pi, pi]. */
  double warp_deviation_rad;
  double flat[2];          /* (i h, j h): where the pin lies on the flat fabric */
} df_drape_node;

typedef struct
{
  int    i, j;             /* lower corner (i, j); the others (i+1, j), (i, j+1), (i+1, j+1) */
  int    corners_inside;   /* 0..4 */
  bool   whole;            /* all four corners inside the outline */
  /* Interior angles of the quadrilateral of geodesic segments at (i,j), (i+1,j), (i+1,j+1),
   * (i,j+1) and their excess (sum - 2 pi), which Gauss-Bonnet makes equal to the integral of
   * K dA over the cell. */
  double angle_rad[4];
  double excess_rad;
  /* 90 deg - the cell's mean crossing angle: (a10 + a01 - a00 - a11) / 4. */
  double shear_rad;
  bool   over_limit;       /* |shear| > max_shear_rad */
  /* Integral of K dA and the area over the cell, by adaptive Gauss-Legendre quadrature on a
   * Coons patch of its four sides (NAN unless check_closure). */
  double k_area_rad;
  double area;
} df_drape_cell;

typedef struct
{
  int    i_min, i_max, j_min, j_max;    /* index range of the net's nodes */
  size_t n_nodes;                       /* placed */
  size_t n_nodes_inside;
  size_t n_cells;                       /* complete cells with a corner inside the outline */
  size_t n_whole_cells;
  size_t n_cells_over_limit;
  size_t n_nodes_lost;                  /* wanted but not placed (surface edge, folding) */
  char   lost_note[240];                /* why the first one was lost, or "" */
  int    substeps;                      /* steps per segment of the stepper: */
  const char *stepper;                  /* "rkck" or "rk8pd" (GSL's names) */
  size_t n_shots;                       /* geodesic segments shot (Newton included) */
  size_t n_rhs;                         /* geodesic right-hand sides evaluated */
  /* Over the nodes inside the outline (the start node when none is): */
  double max_shear_rad;                 /* largest |shear|, with its sign */
  double max_shear_u, max_shear_v;
  double max_cell_shear_rad;            /* largest |cell shear| among n_cells, with sign */
  double max_warp_deviation_rad;        /* largest |deviation|, with its sign */
  double max_warp_deviation_u, max_warp_deviation_v;
  size_t n_nodes_over_deviation;        /* |deviation| > max_fibre_deviation_rad */
  /* Sum of the angle excess over the whole cells, and of their independent integrals. */
  double enclosed_curvature_rad;
  double enclosed_k_area_rad;           /* NAN unless check_closure */
  double closure_max_residual_rad;      /* max over the n_cells |excess - K dA|; NAN ditto */
  int    closure_worst_i, closure_worst_j;
  /* Flat pattern: the outline points mapped (those in no cell are left out and counted). */
  size_t n_outline;
  size_t n_outline_unmapped;
  double flat_area;                     /* of the flat outline; NAN when points are unmapped */
  double flat_lo[2], flat_hi[2];        /* bounding box of the flat outline */
} df_drape_summary;

/* Drapes from chart point (u, v) over the ply outline, a closed chart polygon of n >= 3
 * points (dense enough to stand for the outline; the CLI samples the loop's spline). On a
 * surface of revolution the polygon is shifted by whole turns of phi to lie round the start.
 * Fails with DF_E_INPUT (bad options, start outside the outline, more than 1000 cells across
 * the ply), DF_E_DOMAIN (start off the
 * surface), DF_E_SINGULAR (start on a pole). Nodes that cannot be placed (the surface's edge,
 * a pole, threads that fold onto each other) are counted in the summary, not an error. */
df_status df_drape_new            (const df_surface       *surface,
                                   const double          (*outline)[2],
                                   size_t                  n_outline,
                                   double                  u,
                                   double                  v,
                                   const df_drape_options *options,
                                   df_drape              **out,
                                   df_diag                *diag);

void      df_drape_free           (df_drape *drape);      /* NULL is a no-op */

const df_drape_summary *df_drape_get_summary (const df_drape *drape);
const df_drape_options *df_drape_get_options (const df_drape *drape);

/* The node (i, j); false if it was not placed or lies outside the index range. */
bool      df_drape_get_node       (const df_drape *drape, int i, int j, df_drape_node *out);
/* The cell with lower corner (i, j); false unless all four corners are placed. */
bool      df_drape_get_cell       (const df_drape *drape, int i, int j, df_drape_cell *out);

/* A point of the thread segment from node (i, j) to its neighbour in direction dir
 * (0 = +i, 1 = -i, 2 = +j, 3 = -j) at fraction f in [0, 1], in the chart (quintic Hermite of
 * the geodesic from its end points, velocities and accelerations; error O(h^6)). For
 * drawing the threads. False when the segment does not exist. */
bool      df_drape_segment_point  (const df_drape *drape, int i, int j, int dir, double f,
                                   double uv[2]);

/* The outline points: chart (as shifted) and flat; mapped[k] false when point k lies in no
 * cell. Arrays owned by the drape, n = summary->n_outline. */
const double (*df_drape_get_outline (const df_drape *drape))[2];
const double (*df_drape_get_flat_outline (const df_drape *drape))[2];
const bool   *df_drape_get_outline_mapped (const df_drape *drape);

/* The boundary of the block of cells [i0, i1) x [j0, j1) (all complete), anticlockwise about
 * N (the block on its left), as an exact closed curve along the geodesic thread segments,
 * corners at every pin: for measuring it (df_loop_measure). *block holds what the curve
 * evaluates; free it with df_drape_block_free after the curve. The drape must outlive both. */
typedef struct df_drape_block df_drape_block;

df_status df_drape_block_curve    (const df_drape *drape, int i0, int i1, int j0, int j1,
                                   df_curve **out, df_drape_block **block, df_diag *diag);
void      df_drape_block_free     (df_drape_block *block);   /* NULL is a no-op */
/* The same boundary as chart points, per_segment points per thread segment (start pin
 * included, first point not repeated), in *out (free() it); returns the count, 0 on failure. */
size_t    df_drape_block_points   (const df_drape *drape, int i0, int i1, int j0, int j1,
                                   int per_segment, double (**out)[2]);
/* Sum of the angle excess over the block's cells; NAN when one is not complete. */
double    df_drape_block_excess   (const df_drape *drape, int i0, int i1, int j0, int j1);

/* The boundary of the whole cells as one simple closed curve, for writing as a loop: chart
 * points, per_segment a thread segment (start pin included), anticlockwise about N (the
 * cells on its left), in *out (free() it); returns the count, 0 on failure (no whole cell, no
 * memory). When the whole cells are not one simply connected piece, the region bounded is
 * made one (df-drape-boundary.c): the largest edge-connected piece, its holes filled, cells
 * touching only at a corner separated by taking one out; *info says what was done and the
 * excess summed over the cells the curve bounds (= its enclosed curvature by Gauss-Bonnet). */
typedef struct
{
  size_t n_whole_cells;      /* whole cells of the drape */
  size_t n_cells;            /* cells the curve bounds */
  size_t n_pieces;           /* edge-connected pieces of whole cells (1 when connected) */
  size_t n_whole_left_out;   /* whole cells outside the curve (other pieces, corner cuts) */
  size_t n_cells_filled;     /* cells inside it that are not whole (holes) */
  size_t n_corner_cuts;      /* cells taken out where two touched only at a corner */
  size_t n_segments;         /* thread segments along the curve */
  double excess_rad;         /* sum over the cells bounded; NAN when a filled one is not
                              * complete */
} df_drape_boundary_info;

size_t    df_drape_whole_boundary (const df_drape *drape, int per_segment, double (**out)[2],
                                   df_drape_boundary_info *info);
