/* df-drape-pin.c: placing the pins of the woven-ply net (df-drape.c): a pin's frame from the
 * surface, the point-in-outline test, and every pin off the generators as the intersection of
 * the geodesic circles of radius h about its two known neighbours, by Newton's method on the
 * headings of two shots.
 * Plain C + libm + GSL; no GLib. */
#include "df-drape-private.h"
#include "df-polygon.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

#include "df-geometry.h"
#include "df-vec3.h"

static void
metric_at (const df_surface *s, const double uv[2], double g[2][2])
{
  df_chart_jet j;

  if (df_surface_eval (s, uv[0], uv[1], 1, &j, NULL) != DF_OK)
    {
      g[0][0] = g[1][1] = 1.0;
      g[0][1] = g[1][0] = 0.0;
      return;
    }
  g[0][0] = df_dot3 (j.d1[0], j.d1[0]);
  g[0][1] = g[1][0] = df_dot3 (j.d1[0], j.d1[1]);
  g[1][1] = df_dot3 (j.d1[1], j.d1[1]);
}

net_node *
_df_drape_valid_node (const df_drape *d, int i, int j)
{
  return valid_node (d, i, j);
}

/* Evaluates the node's frame, metric and Christoffel symbols at uv. */
bool
_df_drape_node_fill (df_drape *d, net_node *nd, const double uv[2])
{
  df_chart_jet j;
  double len;

  if (df_surface_eval (d->surface, uv[0], uv[1], 2, &j, NULL) != DF_OK
      || df_chart_jet_christoffel (&j, nd->gamma) != DF_OK)
    return false;
  nd->uv[0] = uv[0];
  nd->uv[1] = uv[1];
  memcpy (nd->x, j.x, sizeof nd->x);
  memcpy (nd->xu, j.d1[0], sizeof nd->xu);
  memcpy (nd->xv, j.d1[1], sizeof nd->xv);
  nd->g[0][0] = df_dot3 (j.d1[0], j.d1[0]);
  nd->g[0][1] = nd->g[1][0] = df_dot3 (j.d1[0], j.d1[1]);
  nd->g[1][1] = df_dot3 (j.d1[1], j.d1[1]);
  df_cross3 (j.d1[0], j.d1[1], nd->n);
  len = sqrt (df_dot3 (nd->n, nd->n));
  if (!(len > 0) || !isfinite (len))
    return false;
  for (int k = 0; k < 3; k++)
    nd->n[k] /= len;
  nd->sqrt_det = len;
  nd->valid = true;
  nd->inside = df_polygon_contains ((const double (*)[2]) d->outline, d->n_outline,
                                           uv[0], uv[1]);
  return true;
}

void
_df_drape_note_lost (df_drape *d, int i, int j, const char *why)
{
  d->sum.n_nodes_lost++;
  if (d->sum.lost_note[0] == '\0')
    snprintf (d->sum.lost_note, sizeof d->sum.lost_note, "pin (%d, %d): %s", i, j, why);
}

/* Places pin (i, j) from A = (i - si, j), B = (i, j - sj), C = (i - si, j - sj). */
void
_df_drape_place_node (df_drape *d, shooter *sh, int i, int j, int si, int sj)
{
  net_node *a = valid_node (d, i - si, j), *b = valid_node (d, i, j - sj);
  net_node *c = valid_node (d, i - si, j - sj), *p = node_at (d, i, j);
  int da = si > 0 ? DIR_PI : DIR_MI, db = sj > 0 ? DIR_PJ : DIR_MJ;
  double h = d->opt.cell, ra[2], rb[2], qa[2], qb[2], ta = 0, tb = 0;
  double va[2], vb[2], ea[2], eb[2], wa[2], wb[2], ga[2][2], gap = HUGE_VAL;
  bool ok = false;

  if (a == NULL || b == NULL || c == NULL || p == NULL)
    return;
  if (!a->has[dir_opp[db]] || !b->has[dir_opp[da]])
    return;

  /* Predictor: the geodesic parallelogram. A->P is C->B carried to A, so the angle from A->C
   * to A->P is pi - sigma, sigma the signed angle at C from C->B to C->A; likewise at B.
   * Its error is of order K h^2 (the cell's excess), against h |Gamma| for a chart
   * parallelogram: one Newton step fewer. */
  {
    double cb[3], ca[3], sigma, r[2], q[2];

    to_space (c, c->out[da], cb);
    to_space (c, c->out[db], ca);
    sigma = angle_about (cb, ca, c->n);
    memcpy (r, a->out[dir_opp[db]], sizeof r);
    g_rot (a->g, r, q);
    for (int k = 0; k < 2; k++)
      ra[k] = cos (M_PI - sigma) * r[k] + sin (M_PI - sigma) * q[k];
    memcpy (r, b->out[dir_opp[da]], sizeof r);
    g_rot (b->g, r, q);
    for (int k = 0; k < 2; k++)
      rb[k] = cos (sigma - M_PI) * r[k] + sin (sigma - M_PI) * q[k];
    if (!c->has[da] || !c->has[db])
      goto lost;
  }
  g_rot (a->g, ra, qa);
  g_rot (b->g, rb, qb);

  for (int it = 0; it < 16; it++)
    {
      double ca[2], cb[2], m[2][2], det, dta, dtb, res[2];

      for (int k = 0; k < 2; k++)
        {
          va[k] = cos (ta) * ra[k] + sin (ta) * qa[k];
          vb[k] = cos (tb) * rb[k] + sin (tb) * qb[k];
        }
      if (!_df_drape_shoot (sh, a->uv, va, h, sh->substeps, ea, wa)
          || !_df_drape_shoot (sh, b->uv, vb, h, sh->substeps, eb, wb))
        goto edge;
      res[0] = ea[0] - eb[0];
      res[1] = ea[1] - eb[1];
      metric_at (d->surface, ea, ga);
      gap = g_norm (ga, res);
      if (gap <= 1e-13 * h)
        {
          ok = true;
          break;
        }
      /* d(end)/d(heading) ~ h x the end tangent turned by 90 deg (the Jacobi field). */
      g_rot (ga, wa, ca);
      g_rot (ga, wb, cb);
      m[0][0] = h * ca[0];
      m[1][0] = h * ca[1];
      m[0][1] = -h * cb[0];
      m[1][1] = -h * cb[1];
      det = m[0][0] * m[1][1] - m[0][1] * m[1][0];
      if (!(fabs (det) > 0))
        goto fold;
      dta = (-res[0] * m[1][1] + res[1] * m[0][1]) / det;
      dtb = (-m[0][0] * res[1] + m[1][0] * res[0]) / det;
      ta += dta;
      tb += dtb;
      if (!isfinite (ta) || !isfinite (tb) || fabs (ta) > 1.0 || fabs (tb) > 1.0)
        goto fold;
      if (gap <= 1e-10 * h)
        {
          /* The last step is so small that its linear model is exact to rounding (its error
           * is the step times K h^2 / 2): move the ends and turn the tangents by it instead
           * of shooting again. */
          double ra_[2], rb_[2];

          for (int k = 0; k < 2; k++)
            {
              ea[k] += h * ca[k] * dta;
              eb[k] += h * cb[k] * dtb;
              va[k] = cos (ta) * ra[k] + sin (ta) * qa[k];
              vb[k] = cos (tb) * rb[k] + sin (tb) * qb[k];
            }
          g_rot (ga, wa, ra_);
          g_rot (ga, wb, rb_);
          for (int k = 0; k < 2; k++)
            {
              wa[k] = cos (dta) * wa[k] + sin (dta) * ra_[k];
              wb[k] = cos (dtb) * wb[k] + sin (dtb) * rb_[k];
            }
          ok = true;
          break;
        }
    }
  if (!ok)
    {
      /* Converged as far as rounding allows (a large, steep chart): accept a tiny gap. */
      if (!(gap <= 1e-9 * h))
        goto fold;
    }
  {
    double mid[2] = { 0.5 * (ea[0] + eb[0]), 0.5 * (ea[1] + eb[1]) };
    double s1[3], s2[3], s3[3];

    if (!_df_drape_node_fill (d, p, mid))
      goto edge;
    /* Threads that cross at a vanishing angle mean the net folds (past any locking). */
    {
      double back_a[2] = { -wa[0], -wa[1] }, back_b[2] = { -wb[0], -wb[1] };
      double angle_p, angle_a;

      to_space (p, back_a, s1);
      to_space (p, back_b, s2);
      angle_p = angle_between (s1, s2);
      to_space (a, va, s1);
      to_space (a, a->out[dir_opp[db]], s3);
      angle_a = angle_between (s1, s3);
      if (angle_p < 1e-3 || angle_p > M_PI - 1e-3 || angle_a < 1e-3)
        {
          p->valid = false;
          goto fold;
        }
    }
    a->has[da] = true;
    memcpy (a->out[da], va, sizeof va);
    b->has[db] = true;
    memcpy (b->out[db], vb, sizeof vb);
    p->has[dir_opp[da]] = true;
    p->out[dir_opp[da]][0] = -wa[0];
    p->out[dir_opp[da]][1] = -wa[1];
    p->has[dir_opp[db]] = true;
    p->out[dir_opp[db]][0] = -wb[0];
    p->out[dir_opp[db]][1] = -wb[1];
  }
  return;

edge:
  _df_drape_note_lost (d, i, j, "a thread segment leaves the surface or meets a singular point");
  return;
fold:
  _df_drape_note_lost (d, i, j, "the threads fold onto each other (no crossing at distance h)");
  return;
lost:
  _df_drape_note_lost (d, i, j, "degenerate neighbours");
}
