/* df-drape-private.h: what the two files of the drape share: a pin of the net, the drape's
 * state, thread segments as quintic Hermite curves and cells as Coons patches. Not installed;
 * plain C + libm + GSL, no GLib. */
#pragma once

#include <gsl/gsl_integration.h>
#include <stdbool.h>
#include <stddef.h>

#include "df-drape.h"

/* Directions from a pin: +i (warp), -i, +j (weft), -j. */
enum { DIR_PI = 0, DIR_MI = 1, DIR_PJ = 2, DIR_MJ = 3 };

/* Step in (i, j) and the opposite direction, per direction. */
static const int dir_di[4] = { 1, -1, 0, 0 };
static const int dir_dj[4] = { 0, 0, 1, -1 };
static const int dir_opp[4] = { DIR_MI, DIR_PI, DIR_MJ, DIR_PJ };

typedef struct
{
  bool   valid;
  bool   inside;
  double uv[2];
  double x[3], xu[3], xv[3], n[3];
  double g[2][2];
  double sqrt_det;
  double gamma[2][2][2];
  bool   has[4];
  double out[4][2];   /* unit chart velocity of the segment leaving towards each neighbour */
  /* derived */
  double warp[3], weft[3];
  double shear, deviation;
} net_node;

struct df_drape
{
  df_surface      *surface;
  df_drape_options opt;
  int              i_min, j_min, ni, nj;
  net_node        *nodes;
  df_drape_cell   *cells;      /* (ni - 1) x (nj - 1), valid where cell_ok */
  bool            *cell_ok;
  size_t           n_outline;
  double         (*outline)[2];
  double         (*flat)[2];
  bool            *mapped;
  df_drape_summary sum;
  /* while building */
  double           x0[3];      /* the start point in space */
  double           dcap;       /* generators stop farther than this from it (chord) */
};

typedef struct
{
  double p0[2], p1[2], m0[2], m1[2], a0[2], a1[2];
} _df_hermite;

typedef struct
{
  _df_hermite bottom, top, left, right;   /* bottom (i,j)->(i+1,j), top (i,j+1)->(i+1,j+1),
                                           * left (i,j)->(i,j+1), right (i+1,j)->(i+1,j+1) */
} _df_coons;

/* The pin (i, j) if placed, else NULL. */
net_node *_df_drape_valid_node     (const df_drape *d, int i, int j);
/* The segment from pin (i, j) in direction dir as a Hermite curve; false if absent. */
bool      _df_drape_segment_hermite (const df_drape *d, int i, int j, int dir, _df_hermite *hm);
bool      _df_drape_cell_coons      (const df_drape *d, int i, int j, _df_coons *c);
/* The integral of K dA and the area over a cell's patch; false if the surface refused a point. */
bool      _df_drape_cell_integrate  (const df_surface *surface, const _df_coons *c,
                                     gsl_integration_glfixed_table *lo,
                                     gsl_integration_glfixed_table *hi, double *k_area,
                                     double *area);
/* Maps the outline points to the flat fabric (fills flat, mapped, n_outline_unmapped). */
void      _df_drape_map_outline     (df_drape *d);
