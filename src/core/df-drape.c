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
 * patches, the closure quadrature, the flat mapping) lives in df-drape-patch.c.
 *
 * Plain C + libm + GSL; no GLib. */
#include "df-drape.h"

#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>
#include <gsl/gsl_odeiv2.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "df-geometry.h"
#include "df-vec3.h"

#include "df-drape-private.h"

#define DF_DRAPE_MAX_ACROSS 1000

/* Which pins to place, per quadrant q (bit 0: i < 0, bit 1: j < 0): in row |j| = b, the pins
 * 1 <= |i| <= ext[q][b], for b < rows[q]. NULL: every pin the generators allow. */
typedef struct
{
  int  rows[4];
  int *ext[4];
} envelope;

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

static int
shot_rhs (double s, const double y[], double dydt[], void *data)
{
  shooter *sh = data;
  double gamma[2][2][2];

  (void) s;
  sh->rhs++;
  if (df_surface_christoffel (sh->surface, y[0], y[1], gamma, &sh->fail) != DF_OK)
    return GSL_EBADFUNC;
  dydt[0] = y[2];
  dydt[1] = y[3];
  for (int k = 0; k < 2; k++)
    dydt[2 + k] = -(gamma[k][0][0] * y[2] * y[2] + 2 * gamma[k][0][1] * y[2] * y[3]
                    + gamma[k][1][1] * y[3] * y[3]);
  return GSL_SUCCESS;
}

/* Geodesic of length len from uv with unit chart velocity vel; end point and velocity. */
static bool
shoot (shooter *sh, const double uv[2], const double vel[2], double len, int substeps,
       double end[2], double end_vel[2])
{
  double y[4] = { uv[0], uv[1], vel[0], vel[1] }, yerr[4], ds = len / substeps;

  sh->shots++;
  gsl_odeiv2_step_reset (sh->step);
  for (int k = 0; k < substeps; k++)
    if (gsl_odeiv2_step_apply (sh->step, k * ds, ds, y, yerr, NULL, NULL, &sh->sys)
        != GSL_SUCCESS)
      return false;
  if (!(isfinite (y[0]) && isfinite (y[1]) && isfinite (y[2]) && isfinite (y[3]))
      || !df_surface_contains (sh->surface, y[0], y[1]))
    return false;
  end[0] = y[0];
  end[1] = y[1];
  end_vel[0] = y[2];
  end_vel[1] = y[3];
  return true;
}

/* ---- small tangent-plane helpers --------------------------------------------------------- */

static double
g_norm (const double g[2][2], const double a[2])
{
  return sqrt (g[0][0] * a[0] * a[0] + 2 * g[0][1] * a[0] * a[1] + g[1][1] * a[1] * a[1]);
}

/* a turned by +90 deg about N: with N = X_u x X_v / sqrt(det g) this is
 * (-(g12 a1 + g22 a2), g11 a1 + g12 a2) / sqrt(det g). */
static void
g_rot (const double g[2][2], const double a[2], double out[2])
{
  double sd = sqrt (g[0][0] * g[1][1] - g[0][1] * g[0][1]);
  double r0 = -(g[0][1] * a[0] + g[1][1] * a[1]) / sd, r1 = (g[0][0] * a[0] + g[0][1] * a[1]) / sd;

  out[0] = r0;
  out[1] = r1;
}

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

static void
to_space (const net_node *nd, const double a[2], double out[3])
{
  for (int k = 0; k < 3; k++)
    out[k] = nd->xu[k] * a[0] + nd->xv[k] * a[1];
}

/* Unsigned angle between two space vectors in (0, pi). */
static double
angle_between (const double a[3], const double b[3])
{
  double c[3];

  df_cross3 (a, b, c);
  return atan2 (sqrt (df_dot3 (c, c)), df_dot3 (a, b));
}

/* Angle from a to b anticlockwise about n. */
static double
angle_about (const double a[3], const double b[3], const double n[3])
{
  double c[3];

  df_cross3 (a, b, c);
  return atan2 (df_dot3 (c, n), df_dot3 (a, b));
}

static double
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

static net_node *
node_at (const df_drape *d, int i, int j)
{
  int a = i - d->i_min, b = j - d->j_min;

  if (a < 0 || b < 0 || a >= d->ni || b >= d->nj)
    return NULL;
  return &d->nodes[(size_t) b * d->ni + a];
}

static net_node *
valid_node (const df_drape *d, int i, int j)
{
  net_node *n = node_at (d, i, j);

  return n != NULL && n->valid ? n : NULL;
}

net_node *
_df_drape_valid_node (const df_drape *d, int i, int j)
{
  return valid_node (d, i, j);
}

static bool
point_in_polygon (const double (*poly)[2], size_t n, double u, double v)
{
  bool in = false;

  /* Crossing number in the chart (even-odd rule). */
  for (size_t a = 0, b = n - 1; a < n; b = a++)
    if ((poly[a][1] > v) != (poly[b][1] > v)
        && u < (poly[b][0] - poly[a][0]) * (v - poly[a][1]) / (poly[b][1] - poly[a][1])
                 + poly[a][0])
      in = !in;
  return in;
}

/* Evaluates the node's frame, metric and Christoffel symbols at uv. */
static bool
node_fill (df_drape *d, net_node *nd, const double uv[2])
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
  nd->inside = point_in_polygon ((const double (*)[2]) d->outline, d->n_outline, uv[0], uv[1]);
  return true;
}

static void
note_lost (df_drape *d, int i, int j, const char *why)
{
  d->sum.n_nodes_lost++;
  if (d->sum.lost_note[0] == '\0')
    snprintf (d->sum.lost_note, sizeof d->sum.lost_note, "pin (%d, %d): %s", i, j, why);
}

/* Places pin (i, j) from A = (i - si, j), B = (i, j - sj), C = (i - si, j - sj). */
static void
place_node (df_drape *d, shooter *sh, int i, int j, int si, int sj)
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
      if (!shoot (sh, a->uv, va, h, sh->substeps, ea, wa)
          || !shoot (sh, b->uv, vb, h, sh->substeps, eb, wb))
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

    if (!node_fill (d, p, mid))
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
  note_lost (d, i, j, "a thread segment leaves the surface or meets a singular point");
  return;
fold:
  note_lost (d, i, j, "the threads fold onto each other (no crossing at distance h)");
  return;
lost:
  note_lost (d, i, j, "degenerate neighbours");
}

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

/* One generator ray from the start: pins every h along the geodesic with heading theta, at
 * most cap, until one lies farther than dcap from the start. Writes chart points and unit
 * velocities. */
static size_t
generator (df_drape *d, shooter *sh, const net_node *start, double theta, size_t cap,
           double (*uv)[2], double (*vel)[2], bool *hit_edge)
{
  double e1[2] = { 1.0 / sqrt (start->g[0][0]), 0.0 }, e2[2];
  size_t n = 1;

  g_rot (start->g, e1, e2);
  uv[0][0] = start->uv[0];
  uv[0][1] = start->uv[1];
  for (int k = 0; k < 2; k++)
    vel[0][k] = cos (theta) * e1[k] + sin (theta) * e2[k];
  *hit_edge = false;
  while (n < cap)
    {
      df_chart_jet j;

      if (df_surface_eval (d->surface, uv[n - 1][0], uv[n - 1][1], 0, &j, NULL) != DF_OK)
        break;
      if (sqrt ((j.x[0] - d->x0[0]) * (j.x[0] - d->x0[0]) + (j.x[1] - d->x0[1]) * (j.x[1] - d->x0[1])
                + (j.x[2] - d->x0[2]) * (j.x[2] - d->x0[2])) > d->dcap)
        break;
      if (!shoot (sh, uv[n - 1], vel[n - 1], d->opt.cell, sh->substeps, uv[n], vel[n]))
        {
          *hit_edge = true;
          break;
        }
      n++;
    }
  return n;
}

/* Stepper and steps per segment: the cheapest of rkck with one step, then rk8pd with 1, 2, 4...
 * steps for which halving the step moves the end of the first warp segment by less than
 * 1e-12 h (and turns its tangent by less than 1e-12). Fine cells take rkck (6 stages), coarse
 * ones rk8pd (13 stages, 8th order). Leaves sh->step allocated for the choice. */
static bool
choose_stepper (df_drape *d, shooter *sh, const net_node *start)
{
  double e1[2] = { 1.0 / sqrt (start->g[0][0]), 0.0 }, e2[2], h = d->opt.cell;

  g_rot (start->g, e1, e2);
  for (int c = 0; c < 8; c++)
    {
      const gsl_odeiv2_step_type *type = c == 0 ? gsl_odeiv2_step_rkck : gsl_odeiv2_step_rk8pd;
      int n = c == 0 ? 1 : 1 << (c - 1);
      bool good = true;

      if (sh->step == NULL || sh->step->type != type)
        {
          if (sh->step)
            gsl_odeiv2_step_free (sh->step);
          if ((sh->step = gsl_odeiv2_step_alloc (type, 4)) == NULL)
            return false;
        }
      sh->substeps = n;
      if (d->opt.substeps > 0)
        {
          /* Asked for: rk8pd with that many steps. */
          if (c == 0)
            continue;
          sh->substeps = d->opt.substeps;
          return true;
        }
      /* Three headings, none along a chart line: a meridian or a straight chart line is
       * integrated exactly by any Runge-Kutta method and would pass any stepper. */
      for (int k = 0; k < 3 && good; k++)
        {
          double th = d->opt.warp_rad + 0.4 + 2.1 * k, v[2], a[2], av[2], b[2], bv[2], df[2];

          for (int q = 0; q < 2; q++)
            v[q] = cos (th) * e1[q] + sin (th) * e2[q];
          if (!shoot (sh, start->uv, v, h, n, a, av)
              || !shoot (sh, start->uv, v, h, 2 * n, b, bv))
            continue;   /* off the edge that way: the others decide */
          df[0] = a[0] - b[0];
          df[1] = a[1] - b[1];
          good = g_norm (start->g, df) < 1e-12 * h
                 && g_norm (start->g, (double[2]) { av[0] - bv[0], av[1] - bv[1] }) < 1e-12;
        }
      if (good || c == 7)
        return true;
    }
  return true;
}

static void
derive_node (df_drape *d, net_node *nd)
{
  double a[3] = { 0 }, b[3] = { 0 }, s[3], len, e1[3], e2[3], want[3], w = d->opt.warp_rad;

  if (nd->has[DIR_PI])
    {
      to_space (nd, nd->out[DIR_PI], s);
      for (int k = 0; k < 3; k++) a[k] += s[k];
    }
  if (nd->has[DIR_MI])
    {
      to_space (nd, nd->out[DIR_MI], s);
      for (int k = 0; k < 3; k++) a[k] -= s[k];
    }
  if (nd->has[DIR_PJ])
    {
      to_space (nd, nd->out[DIR_PJ], s);
      for (int k = 0; k < 3; k++) b[k] += s[k];
    }
  if (nd->has[DIR_MJ])
    {
      to_space (nd, nd->out[DIR_MJ], s);
      for (int k = 0; k < 3; k++) b[k] -= s[k];
    }
  len = sqrt (df_dot3 (a, a));
  for (int k = 0; k < 3; k++)
    nd->warp[k] = len > 0 ? a[k] / len : NAN;
  len = sqrt (df_dot3 (b, b));
  for (int k = 0; k < 3; k++)
    nd->weft[k] = len > 0 ? b[k] / len : NAN;
  nd->shear = M_PI_2 - angle_about (nd->warp, nd->weft, nd->n);
  len = sqrt (df_dot3 (nd->xu, nd->xu));
  for (int k = 0; k < 3; k++)
    e1[k] = nd->xu[k] / len;
  df_cross3 (nd->n, e1, e2);
  for (int k = 0; k < 3; k++)
    want[k] = cos (w) * e1[k] + sin (w) * e2[k];
  nd->deviation = wrap_pi (angle_about (want, nd->warp, nd->n));
}

static void
derive_cell (df_drape *d, int i, int j, gsl_integration_glfixed_table *lo,
             gsl_integration_glfixed_table *hi)
{
  const net_node *c[4] = { valid_node (d, i, j), valid_node (d, i + 1, j),
                           valid_node (d, i + 1, j + 1), valid_node (d, i, j + 1) };
  /* At each corner, the two segments that bound the cell. */
  static const int dirs[4][2] = { { DIR_PI, DIR_PJ }, { DIR_MI, DIR_PJ }, { DIR_MI, DIR_MJ },
                                  { DIR_PI, DIR_MJ } };
  size_t idx = (size_t) (j - d->j_min) * (d->ni - 1) + (i - d->i_min);
  df_drape_cell *cell = &d->cells[idx];
  _df_coons co;

  memset (cell, 0, sizeof *cell);
  for (int k = 0; k < 4; k++)
    if (c[k] == NULL || !c[k]->has[dirs[k][0]] || !c[k]->has[dirs[k][1]])
      return;
  if (!_df_drape_cell_coons (d, i, j, &co))
    return;
  cell->i = i;
  cell->j = j;
  cell->excess_rad = -2 * M_PI;
  for (int k = 0; k < 4; k++)
    {
      double s1[3], s2[3];

      to_space (c[k], c[k]->out[dirs[k][0]], s1);
      to_space (c[k], c[k]->out[dirs[k][1]], s2);
      cell->angle_rad[k] = angle_between (s1, s2);
      cell->excess_rad += cell->angle_rad[k];
      cell->corners_inside += c[k]->inside;
    }
  cell->whole = cell->corners_inside == 4;
  cell->shear_rad = 0.25 * (cell->angle_rad[1] + cell->angle_rad[3] - cell->angle_rad[0]
                            - cell->angle_rad[2]);
  cell->over_limit = isfinite (d->opt.max_shear_rad)
                     && fabs (cell->shear_rad) > d->opt.max_shear_rad;
  cell->k_area_rad = NAN;
  cell->area = NAN;
  if (d->opt.check_closure)
    {
      double k, area;

      if (_df_drape_cell_integrate (d->surface, &co, lo, hi, &k, &area))
        {
          cell->k_area_rad = k;
          cell->area = area;
        }
    }
  d->cell_ok[idx] = true;
}

static void
summarise (df_drape *d)
{
  df_drape_summary *s = &d->sum;
  const net_node *start = valid_node (d, 0, 0);
  bool any_inside = false;
  double best_shear = -1, best_dev = -1, best_cell = -1, area2 = 0;

  s->max_shear_rad = start->shear;
  s->max_shear_u = start->uv[0];
  s->max_shear_v = start->uv[1];
  s->max_warp_deviation_rad = start->deviation;
  s->max_warp_deviation_u = start->uv[0];
  s->max_warp_deviation_v = start->uv[1];
  for (int j = d->j_min; j < d->j_min + d->nj; j++)
    for (int i = d->i_min; i < d->i_min + d->ni; i++)
      {
        const net_node *n = valid_node (d, i, j);

        if (n == NULL)
          continue;
        s->n_nodes++;
        if (!n->inside || !isfinite (n->shear))
          continue;
        s->n_nodes_inside++;
        any_inside = true;
        if (fabs (n->shear) > best_shear)
          {
            best_shear = fabs (n->shear);
            s->max_shear_rad = n->shear;
            s->max_shear_u = n->uv[0];
            s->max_shear_v = n->uv[1];
          }
        if (fabs (n->deviation) > best_dev)
          {
            best_dev = fabs (n->deviation);
            s->max_warp_deviation_rad = n->deviation;
            s->max_warp_deviation_u = n->uv[0];
            s->max_warp_deviation_v = n->uv[1];
          }
        if (isfinite (d->opt.max_fibre_deviation_rad)
            && fabs (n->deviation) > d->opt.max_fibre_deviation_rad)
          s->n_nodes_over_deviation++;
      }
  (void) any_inside;

  s->enclosed_curvature_rad = 0;
  s->enclosed_k_area_rad = d->opt.check_closure ? 0 : NAN;
  s->closure_max_residual_rad = d->opt.check_closure ? 0 : NAN;
  s->max_cell_shear_rad = 0;
  for (int j = d->j_min; j < d->j_min + d->nj - 1; j++)
    for (int i = d->i_min; i < d->i_min + d->ni - 1; i++)
      {
        size_t idx = (size_t) (j - d->j_min) * (d->ni - 1) + (i - d->i_min);
        const df_drape_cell *c = &d->cells[idx];

        if (!d->cell_ok[idx])
          continue;
        if (c->corners_inside == 0)
          continue;
        if (d->opt.check_closure)
          {
            double r = fabs (c->excess_rad - c->k_area_rad);

            if (!(r <= s->closure_max_residual_rad))
              {
                s->closure_max_residual_rad = r;   /* NAN propagates: a failed quadrature */
                s->closure_worst_i = i;
                s->closure_worst_j = j;
              }
          }
        s->n_cells++;
        s->n_cells_over_limit += c->over_limit;
        if (fabs (c->shear_rad) > best_cell)
          {
            best_cell = fabs (c->shear_rad);
            s->max_cell_shear_rad = c->shear_rad;
          }
        if (c->whole)
          {
            s->n_whole_cells++;
            s->enclosed_curvature_rad += c->excess_rad;
            if (d->opt.check_closure)
              s->enclosed_k_area_rad += c->k_area_rad;
          }
      }

  s->n_outline = d->n_outline;
  s->flat_lo[0] = s->flat_lo[1] = HUGE_VAL;
  s->flat_hi[0] = s->flat_hi[1] = -HUGE_VAL;
  for (size_t k = 0; k < d->n_outline; k++)
    {
      const double *p = d->flat[k], *q = d->flat[(k + 1) % d->n_outline];

      if (!d->mapped[k])
        continue;
      for (int a = 0; a < 2; a++)
        {
          s->flat_lo[a] = fmin (s->flat_lo[a], p[a]);
          s->flat_hi[a] = fmax (s->flat_hi[a], p[a]);
        }
      area2 += p[0] * q[1] - q[0] * p[1];
    }
  s->flat_area = s->n_outline_unmapped == 0 ? 0.5 * fabs (area2) : NAN;
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
  if (!point_in_polygon ((const double (*)[2]) d->outline, n_outline, u, v))
    {
      st = df_diag_fail_at (diag, DF_E_INPUT, -1, u, v, "the start point lies outside the ply "
                            "outline");
      goto fail;
    }

  /* The start pin and its frame. */
  d->ni = d->nj = 1;
  if (!node_fill (d, &start, (double[2]) { u, v }))
    {
      st = df_diag_fail_at (diag, DF_E_SINGULAR, -1, u, v, "the chart is singular at the start "
                            "point (a pole): start beside it");
      goto fail;
    }

  memcpy (d->x0, start.x, sizeof d->x0);
  d->dcap = dcap;
  sh.surface = d->surface;
  sh.step = NULL;
  sh.sys = (gsl_odeiv2_system) { shot_rhs, NULL, 4, &sh };
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
  if (!choose_stepper (d, &sh, &start))
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
        glen[g] = generator (d, &sh, &start, heading[g], gcap, guv[g], gvel[g], &edge);
        if (edge)
          note_lost (d, dir_di[g] * (int) glen[g], dir_dj[g] * (int) glen[g],
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

        if (k > 0 && !node_fill (d, n, guv[g][k]))
          {
            note_lost (d, i, j, "the chart is singular here");
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
            place_node (d, &sh, si * a, sj * b, si, sj);
        }
    }

  for (int j = d->j_min; j < d->j_min + d->nj; j++)
    for (int i = d->i_min; i < d->i_min + d->ni; i++)
      {
        net_node *n = valid_node (d, i, j);

        if (n != NULL)
          derive_node (d, n);
      }
  for (int j = d->j_min; j < d->j_min + d->nj - 1; j++)
    for (int i = d->i_min; i < d->i_min + d->ni - 1; i++)
      derive_cell (d, i, j, lo, hi);
  _df_drape_map_outline (d);
  summarise (d);
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

bool
df_drape_get_node (const df_drape *d, int i, int j, df_drape_node *out)
{
  const net_node *n = valid_node (d, i, j);

  if (n == NULL)
    return false;
  out->i = i;
  out->j = j;
  out->u = n->uv[0];
  out->v = n->uv[1];
  memcpy (out->point, n->x, sizeof out->point);
  memcpy (out->normal, n->n, sizeof out->normal);
  out->inside = n->inside;
  memcpy (out->warp, n->warp, sizeof out->warp);
  memcpy (out->weft, n->weft, sizeof out->weft);
  out->shear_rad = n->shear;
  out->warp_deviation_rad = n->deviation;
  out->flat[0] = i * d->opt.cell;
  out->flat[1] = j * d->opt.cell;
  return true;
}

bool
df_drape_get_cell (const df_drape *d, int i, int j, df_drape_cell *out)
{
  size_t idx;

  if (i < d->i_min || j < d->j_min || i >= d->i_min + d->ni - 1 || j >= d->j_min + d->nj - 1)
    return false;
  idx = (size_t) (j - d->j_min) * (d->ni - 1) + (i - d->i_min);
  if (!d->cell_ok[idx])
    return false;
  *out = d->cells[idx];
  return true;
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
