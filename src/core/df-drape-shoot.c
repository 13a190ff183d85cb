/* df-drape-shoot.c: the geodesic shots of the woven-ply net (df-drape.c): the geodesic
 * equation stepped a fixed number of GSL steps per thread segment, the choice of stepper and
 * steps from a step-halving test, and the two generators through the start pin.
 * Plain C + libm + GSL; no GLib. */
#include "df-drape-private.h"

#include <gsl/gsl_errno.h>
#include <gsl/gsl_odeiv2.h>
#include <math.h>
#include <string.h>

#include "df-geometry.h"

int
_df_drape_shot_rhs (double s, const double y[], double dydt[], void *data)
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
bool
_df_drape_shoot (shooter *sh, const double uv[2], const double vel[2], double len,
                 int substeps, double end[2], double end_vel[2])
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

/* One generator ray from the start: pins every h along the geodesic with heading theta, at
 * most cap, until one lies farther than dcap from the start or the ray is longer than
 * 2 dcap. The length cap is for closed surfaces: on a sphere smaller than dcap every point
 * is nearer than dcap and a chord test alone lets the ray wind round it up to cap pins
 * (4000 a ray, which took half a minute for a cell larger than the ply). Twice the chord
 * cap is more than a geodesic to any needed pin (at most pi/2 times the chord on a sphere).
 * Writes chart points and unit velocities. */
size_t
_df_drape_generator (df_drape *d, shooter *sh, const net_node *start, double theta,
                     size_t cap, double (*uv)[2], double (*vel)[2], bool *hit_edge)
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
                + (j.x[2] - d->x0[2]) * (j.x[2] - d->x0[2])) > d->dcap
          || (double) (n - 1) * d->opt.cell > 2 * d->dcap)
        break;
      if (!_df_drape_shoot (sh, uv[n - 1], vel[n - 1], d->opt.cell, sh->substeps, uv[n], vel[n]))
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
bool
_df_drape_choose_stepper (df_drape *d, shooter *sh, const net_node *start)
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
          if (!_df_drape_shoot (sh, start->uv, v, h, n, a, av)
              || !_df_drape_shoot (sh, start->uv, v, h, 2 * n, b, bv))
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
