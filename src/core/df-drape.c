/* df-drape.c: the pin-jointed (Chebyshev) net of a woven ply on a surface (df-drape.h).
 *
 * Construction. The two generators are the geodesics through the start point along the warp
 * and the weft (90 deg anticlockwise from it), pinned every h. Every other pin P has two known
 * neighbours A (along the warp) and B (along the weft) and lies at geodesic distance h from
 * both: the intersection of two geodesic circles of radius h. It is found by shooting: the
 * headings at A and B are the unknowns, each shot a geodesic of length exactly h, and Newton's
 * method makes the two ends meet. So every thread segment is a true geodesic of length h
 * and its end tangents come with it, which is what the exact checks need (a cell bounded by
 * four geodesic segments obeys Gauss-Bonnet exactly). The Jacobian of an end point with
 * respect to its heading is the Jacobi field, h (1 - K h^2 / 6 + ...) times the end tangent
 * turned by 90 deg; taking h alone costs a convergence rate of K h^2 / 6 per step and no
 * derivative of the Christoffel symbols.
 *
 * Geodesics are stepped here, not by df_geodesic_shoot: that driver adapts its step size,
 * which makes the end point a non-smooth function of the heading (bad for Newton), and it
 * allocates and samples per call, too heavy for some 10^5 short shots. A fixed number of GSL
 * rk8pd steps per segment keeps the map smooth; the number is chosen once from a
 * step-halving test on the first segment. The cells' geometry (segment curves, Coons
 * patches, the closure quadrature, the flat mapping) lives in df-drape-patch.c; the shots
 * and generators in df-drape-shoot.c, pin placement in df-drape-pin.c, the pins' and cells'
 * measures and the summary in df-drape-measure.c.
 *
 * Plain C + libm + GSL; no GLib. */
#include "df-drape.h"
#include "df-polygon.h"

#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>
#include <gsl/gsl_odeiv2.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "df-geometry.h"

#include "df-drape-private.h"

#define DF_DRAPE_MAX_ACROSS 1000

/* Which pins to place, per quadrant q (bit 0: i < 0, bit 1: j < 0): in row |j| = b, the pins
 * 1 <= |i| <= ext[q][b], for b < rows[q]. NULL: every pin the generators allow. */
typedef struct
{
  int  rows[4];
  int *ext[4];
} envelope;

/* ---- building ---------------------------------------------------------------------------- */

void
df_drape_options_init (df_drape_options *o)
{
  memset (o, 0, sizeof *o);
  o->warp_rad = 0.0;
  o->cell = 0.0;
  o->max_shear_rad = NAN;
  o->max_fibre_deviation_rad = NAN;
  o->substeps = 0;
  o->check_closure = true;
  o->max_nodes_per_side = 4000;
}

void
df_drape_free (df_drape *d)
{
  if (d == NULL)
    return;
  df_surface_free (d->surface);
  free (d->nodes);
  free (d->cells);
  free (d->cell_ok);
  free (d->outline);
  free (d->flat);
  free (d->mapped);
  free (d);
}

static df_status
drape_build (const df_surface *surface, const double (*outline)[2], size_t n_outline,
             double u, double v, const df_drape_options *options, const envelope *env,
             double dcap, df_drape **out, df_diag *diag)
{
  df_drape *d = NULL;
  shooter sh = { 0 };
  net_node start = { 0 };
  double (*guv[4])[2] = { NULL }, (*gvel[4])[2] = { NULL };
  size_t glen[4] = { 0 }, cap;
  df_status st = DF_OK;
  gsl_integration_glfixed_table *lo = NULL, *hi = NULL;

  *out = NULL;
  df_diag_clear (diag);
  if (!(options->cell > 0) || !isfinite (options->cell))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the cell size must be a positive number");
  if (!isfinite (options->warp_rad))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the warp angle must be a finite number");
  if (n_outline < 3)
    return df_diag_fail (diag, DF_E_INPUT, -1, "the ply outline needs at least 3 points");
  if (options->substeps < 0 || options->substeps > 64)
    return df_diag_fail (diag, DF_E_INPUT, -1, "substeps must lie in [0, 64]");
  if (options->cell > 0.5 * df_surface_size (surface))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the cell size %.6g is larger than half the "
                         "surface (%.6g across)", options->cell, df_surface_size (surface));
  if (!isfinite (u) || !isfinite (v) || !df_surface_contains (surface, u, v))
    return df_diag_fail_at (diag, DF_E_DOMAIN, -1, u, v, "the start point lies outside the "
                            "surface");
  for (size_t k = 0; k < n_outline; k++)
    if (!isfinite (outline[k][0]) || !isfinite (outline[k][1]))
      return df_diag_fail (diag, DF_E_NONFINITE, (long) k, "outline point is not finite");

  d = calloc (1, sizeof *d);
  if (d == NULL)
    return DF_E_NOMEM;
  d->opt = *options;
  if (d->opt.max_nodes_per_side == 0)
    d->opt.max_nodes_per_side = 4000;
  d->surface = df_surface_copy (surface);
  d->n_outline = n_outline;
  d->outline = malloc (n_outline * sizeof *d->outline);
  d->flat = calloc (n_outline, sizeof *d->flat);
  d->mapped = calloc (n_outline, sizeof *d->mapped);
  if (!d->surface || !d->outline || !d->flat || !d->mapped)
    {
      st = DF_E_NOMEM;
      goto fail;
    }
  {
    /* A surface of revolution: bring the polygon to the start's turn of phi. */
    double shift = 0, mean = 0;

    if (df_surface_v_periodic (surface))
      {
        for (size_t k = 0; k < n_outline; k++)
          mean += outline[k][1] / n_outline;
        shift = 2 * M_PI * round ((v - mean) / (2 * M_PI));
      }
    for (size_t k = 0; k < n_outline; k++)
      {
        d->outline[k][0] = outline[k][0];
        d->outline[k][1] = outline[k][1] + shift;
      }
  }
  if (!df_polygon_contains ((const double (*)[2]) d->outline, n_outline, u, v))
    {
      st = df_diag_fail_at (diag, DF_E_INPUT, -1, u, v, "the start point lies outside the ply "
                            "outline");
      goto fail;
    }

  /* The start pin and its frame. */
  d->ni = d->nj = 1;
  if (!_df_drape_node_fill (d, &start, (double[2]) { u, v }))
    {
      st = df_diag_fail_at (diag, DF_E_SINGULAR, -1, u, v, "the chart is singular at the start "
                            "point (a pole): start beside it");
      goto fail;
    }

  memcpy (d->x0, start.x, sizeof d->x0);
  d->dcap = dcap;
  sh.surface = d->surface;
  sh.step = NULL;
  sh.sys = (gsl_odeiv2_system) { _df_drape_shot_rhs, NULL, 4, &sh };
  lo = gsl_integration_glfixed_table_alloc (3);
  hi = gsl_integration_glfixed_table_alloc (5);
  cap = d->opt.max_nodes_per_side + 1;
  for (int g = 0; g < 4; g++)
    {
      guv[g] = malloc (cap * sizeof *guv[g]);
      gvel[g] = malloc (cap * sizeof *gvel[g]);
    }
  if (!lo || !hi || !guv[0] || !guv[1] || !guv[2] || !guv[3] || !gvel[0]
      || !gvel[1] || !gvel[2] || !gvel[3])
    {
      st = DF_E_NOMEM;
      goto fail;
    }
  if (!_df_drape_choose_stepper (d, &sh, &start))
    {
      st = DF_E_NOMEM;
      goto fail;
    }
  d->sum.substeps = sh.substeps;
  d->sum.stepper = sh.step->type->name;

  /* Generators: +warp, -warp, +weft, -weft (dir order). */
  {
    const double heading[4] = { d->opt.warp_rad, d->opt.warp_rad + M_PI,
                                d->opt.warp_rad + M_PI_2, d->opt.warp_rad - M_PI_2 };

    for (int g = 0; g < 4; g++)
      {
        bool edge;
        size_t gcap = cap;

        if (env != NULL)
          {
            static const int qa[4][2] = { { 0, 2 }, { 1, 3 }, { 0, 1 }, { 2, 3 } };
            size_t want = 0;

            for (int e = 0; e < 2; e++)
              {
                int q = qa[g][e];
                size_t w = g < 2 ? (env->rows[q] > 0 ? (size_t) env->ext[q][0] + 1 : 1)
                                 : (size_t) env->rows[q];

                want = w > want ? w : want;
              }
            gcap = want < cap ? (want > 1 ? want : 1) : cap;
          }
        glen[g] = _df_drape_generator (d, &sh, &start, heading[g], gcap, guv[g], gvel[g], &edge);
        if (edge)
          _df_drape_note_lost (d, dir_di[g] * (int) glen[g], dir_dj[g] * (int) glen[g],
                               "the generator leaves the surface or meets a singular point");
      }
  }
  d->i_min = -(int) (glen[DIR_MI] - 1);
  d->j_min = -(int) (glen[DIR_MJ] - 1);
  d->ni = (int) (glen[DIR_PI] + glen[DIR_MI] - 1);
  d->nj = (int) (glen[DIR_PJ] + glen[DIR_MJ] - 1);
  d->nodes = calloc ((size_t) d->ni * d->nj, sizeof *d->nodes);
  d->cells = calloc ((size_t) (d->ni - 1 > 0 ? d->ni - 1 : 1) * (d->nj - 1 > 0 ? d->nj - 1 : 1),
                     sizeof *d->cells);
  d->cell_ok = calloc ((size_t) (d->ni - 1 > 0 ? d->ni - 1 : 1)
                       * (d->nj - 1 > 0 ? d->nj - 1 : 1), sizeof *d->cell_ok);
  if (!d->nodes || !d->cells || !d->cell_ok)
    {
      st = DF_E_NOMEM;
      goto fail;
    }
  *node_at (d, 0, 0) = start;
  for (int g = 0; g < 4; g++)
    for (size_t k = 0; k < glen[g]; k++)
      {
        int i = dir_di[g] * (int) k, j = dir_dj[g] * (int) k;
        net_node *n = node_at (d, i, j);

        if (k > 0 && !_df_drape_node_fill (d, n, guv[g][k]))
          {
            _df_drape_note_lost (d, i, j, "the chart is singular here");
            glen[g] = k;
            break;
          }
        if (k + 1 < glen[g])
          {
            n->has[g] = true;
            memcpy (n->out[g], gvel[g][k], sizeof n->out[g]);
          }
        if (k > 0)
          {
            n->has[dir_opp[g]] = true;
            n->out[dir_opp[g]][0] = -gvel[g][k][0];
            n->out[dir_opp[g]][1] = -gvel[g][k][1];
          }
      }

  /* The four quadrants, row by row (|j| = b), each row outward in |i|, so both known
   * neighbours of a pin are placed before it. */
  for (int q = 0; q < 4; q++)
    {
      int si = (q & 1) ? -1 : 1, sj = (q & 2) ? -1 : 1;
      int na = (int) glen[si > 0 ? DIR_PI : DIR_MI], nb = (int) glen[sj > 0 ? DIR_PJ : DIR_MJ];

      for (int b = 1; b < nb; b++)
        {
          int amax = na - 1;

          if (env != NULL)
            amax = b < env->rows[q] ? (env->ext[q][b] < amax ? env->ext[q][b] : amax) : 0;
          for (int a = 1; a <= amax; a++)
            _df_drape_place_node (d, &sh, si * a, sj * b, si, sj);
        }
    }

  for (int j = d->j_min; j < d->j_min + d->nj; j++)
    for (int i = d->i_min; i < d->i_min + d->ni; i++)
      {
        net_node *n = valid_node (d, i, j);

        if (n != NULL)
          _df_drape_derive_node (d, n);
      }
  for (int j = d->j_min; j < d->j_min + d->nj - 1; j++)
    for (int i = d->i_min; i < d->i_min + d->ni - 1; i++)
      _df_drape_derive_cell (d, i, j, lo, hi);
  _df_drape_map_outline (d);
  _df_drape_summarise (d);
  d->sum.n_shots = (size_t) sh.shots;
  d->sum.n_rhs = (size_t) sh.rhs;
  d->sum.i_min = d->i_min;
  d->sum.i_max = d->i_min + d->ni - 1;
  d->sum.j_min = d->j_min;
  d->sum.j_max = d->j_min + d->nj - 1;

  if (!isfinite (d->sum.max_shear_rad))
    {
      st = df_diag_fail_at (diag, DF_E_NONFINITE, -1, u, v, "the shear at the start is not "
                            "finite");
      goto fail;
    }
  *out = d;
  d = NULL;

fail:
  for (int g = 0; g < 4; g++)
    {
      free (guv[g]);
      free (gvel[g]);
    }
  if (lo) gsl_integration_glfixed_table_free (lo);
  if (hi) gsl_integration_glfixed_table_free (hi);
  if (sh.step) gsl_odeiv2_step_free (sh.step);
  df_drape_free (d);
  return st;
}

/* ---- accessors --------------------------------------------------------------------------- */

const df_drape_summary *
df_drape_get_summary (const df_drape *d)
{
  return &d->sum;
}

const df_drape_options *
df_drape_get_options (const df_drape *d)
{
  return &d->opt;
}

const double (*df_drape_get_outline (const df_drape *d))[2]
{
  return (const double (*)[2]) d->outline;
}

const double (*df_drape_get_flat_outline (const df_drape *d))[2]
{
  return (const double (*)[2]) d->flat;
}

const bool *
df_drape_get_outline_mapped (const df_drape *d)
{
  return d->mapped;
}

/* ---- the two passes ---------------------------------------------------------------------- */

static void
envelope_clear (envelope *e)
{
  for (int q = 0; q < 4; q++)
    free (e->ext[q]);
  memset (e, 0, sizeof *e);
}

/* The pins a fine net of cell h needs, from a coarse net's flat outline: pin (a, b) of a
 * quadrant is needed when some point of the ply has net coordinates beyond it in both (every
 * pin depends on the whole index rectangle between it and the generators). A point's flat
 * coordinates are its net coordinates times the cell, nearly the same on both nets; margin
 * (in fine cells) covers the difference. Outline points suffice: over the ply, the largest
 * |i| within rows >= b is reached on its boundary. */
static bool
envelope_from (const df_drape *coarse, double h, double margin, size_t cap, envelope *e)
{
  const double (*flat)[2] = df_drape_get_flat_outline (coarse);
  const bool *mapped = df_drape_get_outline_mapped (coarse);
  size_t n = coarse->n_outline;

  memset (e, 0, sizeof *e);
  for (int q = 0; q < 4; q++)
    {
      double si = (q & 1) ? -1 : 1, sj = (q & 2) ? -1 : 1, bmax = margin;
      int rows;

      for (size_t k = 0; k < n; k++)
        if (mapped[k])
          bmax = fmax (bmax, sj * flat[k][1] / h + margin);
      rows = (int) fmin ((double) cap, ceil (bmax)) + 1;
      e->rows[q] = rows;
      e->ext[q] = calloc ((size_t) rows, sizeof *e->ext[q]);
      if (e->ext[q] == NULL)
        return false;
      /* ext[b] = max (alpha + margin) over the points with beta + margin >= b: a suffix max. */
      for (int b = 0; b < rows; b++)
        e->ext[q][b] = (int) ceil (margin);
      for (size_t k = 0; k < n; k++)
        {
          double alpha, beta;
          int top, val;

          if (!mapped[k])
            continue;
          alpha = si * flat[k][0] / h + margin;
          beta = sj * flat[k][1] / h + margin;
          if (alpha < 0 || beta < 0)
            continue;
          top = (int) fmin (rows - 1, floor (beta));
          val = (int) fmin ((double) cap, ceil (alpha));
          if (val > e->ext[q][top])
            e->ext[q][top] = val;
        }
      for (int b = rows - 2; b >= 0; b--)
        if (e->ext[q][b + 1] > e->ext[q][b])
          e->ext[q][b] = e->ext[q][b + 1];
    }
  return true;
}

df_status
df_drape_new (const df_surface *surface, const double (*outline)[2], size_t n_outline,
              double u, double v, const df_drape_options *options, df_drape **out,
              df_diag *diag)
{
  df_drape_options copt;
  df_drape *coarse = NULL;
  envelope env;
  double max_chord = 0, dcap, coarse_h;
  df_chart_jet j0;
  df_status st;
  size_t cap;

  *out = NULL;
  if (options == NULL || outline == NULL)
    return df_diag_fail (diag, DF_E_INPUT, -1, "no options or outline");
  if (n_outline < 3 || !(options->cell > 0) || !isfinite (options->cell) || !isfinite (u)
      || !isfinite (v) || df_surface_eval (surface, u, v, 0, &j0, NULL) != DF_OK)
    /* drape_build names the problem. */
    return drape_build (surface, outline, n_outline, u, v, options, NULL, 0, out, diag);
  for (size_t k = 0; k < n_outline; k++)
    {
      df_chart_jet j;

      if (isfinite (outline[k][0]) && isfinite (outline[k][1])
          && df_surface_eval (surface, outline[k][0], outline[k][1], 0, &j, NULL) == DF_OK)
        max_chord = fmax (max_chord, sqrt ((j.x[0] - j0.x[0]) * (j.x[0] - j0.x[0])
                                           + (j.x[1] - j0.x[1]) * (j.x[1] - j0.x[1])
                                           + (j.x[2] - j0.x[2]) * (j.x[2] - j0.x[2])));
    }
  /* About a million pins at most: the net is stored whole (some 400 bytes a pin with its
   * cell), and a finer net than this adds nothing a cutter could follow. */
  if (2 * max_chord / options->cell > DF_DRAPE_MAX_ACROSS)
    return df_diag_fail (diag, DF_E_INPUT, -1, "a cell of %.6g gives about %.0f cells across "
                         "the ply (%.6g across); at most %d: use a larger cell", options->cell,
                         2 * max_chord / options->cell, 2 * max_chord, DF_DRAPE_MAX_ACROSS);
  /* Generators of a full net reach 1.5 times the farthest outline point (chord): an opened
   * or sheared net needs pins somewhat beyond the ply's own extent. */
  dcap = 1.5 * max_chord + 2 * options->cell;
  coarse_h = 2 * max_chord / 32;
  if (coarse_h <= 2 * options->cell)
    return drape_build (surface, outline, n_outline, u, v, options, NULL, dcap, out, diag);

  /* A large net: a coarse one first (about 32 cells across), every pin it can place, to find
   * which of the fine pins the ply needs; then only those. */
  copt = *options;
  copt.cell = coarse_h;
  copt.check_closure = false;
  st = drape_build (surface, outline, n_outline, u, v, &copt, NULL, dcap, &coarse, diag);
  if (st != DF_OK)
    return st;
  cap = options->max_nodes_per_side ? options->max_nodes_per_side : 4000;
  if (!envelope_from (coarse, options->cell, coarse_h / options->cell + 2, cap, &env))
    {
      envelope_clear (&env);
      df_drape_free (coarse);
      return DF_E_NOMEM;
    }
  df_drape_free (coarse);
  st = drape_build (surface, outline, n_outline, u, v, options, &env, HUGE_VAL, out, diag);
  envelope_clear (&env);
  return st;
}
