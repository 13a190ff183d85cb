/* df-drape-private.h: what the files of the drape share: a pin of the net, the drape's
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

/* ---- shared by the drape's files (df-drape.c, -shoot.c, -pin.c, -measure.c) ------------- */

#include <gsl/gsl_odeiv2.h>
#include <math.h>

#include "df-vec3.h"

/* The geodesic shooter: one GSL stepper, reused for every shot; counts for the summary. */
/* ---- geodesic shots ---------------------------------------------------------------------- */

typedef struct
{
  const df_surface  *surface;
  gsl_odeiv2_step   *step;
  gsl_odeiv2_system  sys;
  df_diag            fail;
  int                substeps;
  long               shots;
  long               rhs;
} shooter;

/* ---- small tangent-plane helpers --------------------------------------------------------- */

static inline double
g_norm (const double g[2][2], const double a[2])
{
  return sqrt (g[0][0] * a[0] * a[0] + 2 * g[0][1] * a[0] * a[1] + g[1][1] * a[1] * a[1]);
}

/* a turned by +90 deg about N: with N = X_u x X_v / sqrt(det g) this is
 * (-(g12 a1 + g22 a2), g11 a1 + g12 a2) / sqrt(det g). */
static inline void
g_rot (const double g[2][2], const double a[2], double out[2])
{
  double sd = sqrt (g[0][0] * g[1][1] - g[0][1] * g[0][1]);
  double r0 = -(g[0][1] * a[0] + g[1][1] * a[1]) / sd, r1 = (g[0][0] * a[0] + g[0][1] * a[1]) / sd;

  out[0] = r0;
  out[1] = r1;
}

static inline void
to_space (const net_node *nd, const double a[2], double out[3])
{
  for (int k = 0; k < 3; k++)
    out[k] = nd->xu[k] * a[0] + nd->xv[k] * a[1];
}

/* Unsigned angle between two space vectors in (0, pi). */
static inline double
angle_between (const double a[3], const double b[3])
{
  double c[3];

  df_cross3 (a, b, c);
  return atan2 (sqrt (df_dot3 (c, c)), df_dot3 (a, b));
}

/* Angle from a to b anticlockwise about n. */
static inline double
angle_about (const double a[3], const double b[3], const double n[3])
{
  double c[3];

  df_cross3 (a, b, c);
  return atan2 (df_dot3 (c, n), df_dot3 (a, b));
}

static inline double
wrap_pi (double a)
{
  a = fmod (a, 2 * M_PI);
  if (a <= -M_PI)
    a += 2 * M_PI;
  else if (a > M_PI)
    a -= 2 * M_PI;
  return a;
}
/* ---- the grid ---------------------------------------------------------------------------- */

static inline net_node *
node_at (const df_drape *d, int i, int j)
{
  int a = i - d->i_min, b = j - d->j_min;

  if (a < 0 || b < 0 || a >= d->ni || b >= d->nj)
    return NULL;
  return &d->nodes[(size_t) b * d->ni + a];
}

static inline net_node *
valid_node (const df_drape *d, int i, int j)
{
  net_node *n = node_at (d, i, j);

  return n != NULL && n->valid ? n : NULL;
}

/* Geodesic of length len from uv with unit chart velocity vel; end point and velocity. */
bool      _df_drape_shoot           (shooter *sh, const double uv[2], const double vel[2],
                                     double len, int substeps, double end[2],
                                     double end_vel[2]);
/* The geodesic equation in (u, v, u', v') for GSL; data is the shooter. */
int       _df_drape_shot_rhs        (double s, const double y[], double dydt[], void *data);
/* Picks the stepper and steps per segment (leaves sh->step allocated); false: no memory. */
bool      _df_drape_choose_stepper  (df_drape *d, shooter *sh, const net_node *start);
/* One generator ray from the start (chart points and unit velocities, at most cap pins). */
size_t    _df_drape_generator       (df_drape *d, shooter *sh, const net_node *start,
                                     double theta, size_t cap, double (*uv)[2],
                                     double (*vel)[2], bool *hit_edge);
/* Fills the pin's frame, metric and Christoffel symbols at uv; false at a singular point. */
bool      _df_drape_node_fill       (df_drape *d, net_node *nd, const double uv[2]);
void      _df_drape_note_lost       (df_drape *d, int i, int j, const char *why);
/* Places pin (i, j) from its neighbours (i - si, j), (i, j - sj), (i - si, j - sj). */
void      _df_drape_place_node      (df_drape *d, shooter *sh, int i, int j, int si, int sj);
void      _df_drape_derive_node     (df_drape *d, net_node *nd);
void      _df_drape_derive_cell     (df_drape *d, int i, int j,
                                     gsl_integration_glfixed_table *lo,
                                     gsl_integration_glfixed_table *hi);
void      _df_drape_summarise       (df_drape *d);
