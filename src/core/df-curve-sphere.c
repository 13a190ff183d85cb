/* df-curve-sphere.c: sphere coordinates for curves that come near both poles of a surface of
 * revolution: a cubic spline on the unit-sphere picture of the surface, projected back and
 * handed on in the nearer pole's pole-centred picture, with the equator crossings as breaks.
 * Split from df-curve.c, whose private struct it shares (df-curve-private.h).
 * Plain C + libm; no GLib. */
#include "df-curve.h"
#include "df-curve-private.h"
#include "df-vec3.h"

#include <math.h>
#include <stdlib.h>

/* Sphere coordinates, for a loop that comes near both poles, where no one plane chart will
 * do: the points go to the unit sphere by theta = pi (t - t_min) / range (a picture of the
 * surface regular at both poles, since r is odd and z even in the distance to a smooth pole),
 * a cubic spline w(tau) in R^3 runs through them and is projected back radially. At each tau
 * the result is handed on in the pole-centred picture of the nearer pole (end 0 or 1, or the
 * one forced): p = k (theta_e / sin theta_e) (w_x, w_y) / |w| with k = range / pi and theta_e
 * the angle from that pole. Returns the end used. */
int
_df_curve_sphere_plane (const df_curve *c, double tau, int force, double p[2], double dp[2], double ddp[2])
{
  int laps, e;
  size_t i;
  double w[3], w1[3], w2[3], u[3], u1[3], u2[3], dt, L, L1, L2, sg, cz, cz1, cz2, x, F, F1, F2;
  double k = c->t_range / M_PI;

  tau = _df_curve_wrap_tau (c, tau, &laps);
  i = _df_curve_segment_of (c, tau);
  dt = tau - c->taus[i];
  for (int m = 0; m < 3; m++)
    {
      const double *q = &c->coef[m][4 * i];

      w[m] = q[0] + dt * (q[1] + dt * (q[2] + dt * q[3]));
      w1[m] = q[1] + dt * (2 * q[2] + dt * 3 * q[3]);
      w2[m] = 2 * q[2] + 6 * dt * q[3];
    }
  /* u = w / |w| and its first two derivatives. */
  L = sqrt (df_dot3 (w, w));
  for (int m = 0; m < 3; m++)
    u[m] = w[m] / L;
  L1 = df_dot3 (u, w1);
  L2 = (df_dot3 (w1, w1) + df_dot3 (w, w2) - L1 * L1) / L;
  for (int m = 0; m < 3; m++)
    {
      u1[m] = (w1[m] - u[m] * L1) / L;
      u2[m] = w2[m] / L - 2 * w1[m] * L1 / (L * L) - w[m] * L2 / (L * L)
              + 2 * w[m] * L1 * L1 / (L * L * L);
    }
  e = force >= 0 ? force : (u[2] + 1e-9 >= 0 ? 0 : 1);
  sg = e ? -1.0 : 1.0;
  cz = sg * u[2];
  cz1 = sg * u1[2];
  cz2 = sg * u2[2];
  /* F(c) = theta / sin theta with c = cos theta, and dF/dc, d2F/dc2; near the pole from the
   * series in x = 1 - c (sympy), where the closed forms lose their digits. */
  x = 1.0 - cz;
  if (x < 1e-2)
    {
      static const double a[8] = { 1.0, 1.0 / 3, 2.0 / 15, 2.0 / 35, 8.0 / 315, 8.0 / 693,
                                   16.0 / 3003, 16.0 / 6435 };
      double dF = 0.0, ddF = 0.0;

      F = 0.0;
      for (int m = 7; m >= 0; m--)
        F = F * x + a[m];
      for (int m = 7; m >= 1; m--)
        dF = dF * x + m * a[m];
      for (int m = 7; m >= 2; m--)
        ddF = ddF * x + m * (m - 1) * a[m];
      F1 = -dF;
      F2 = ddF;
    }
  else
    {
      double s2 = 1.0 - cz * cz, sn = sqrt (fmax (s2, 0.0));

      F = atan2 (sn, cz) / sn;
      F1 = (cz * F - 1.0) / s2;
      F2 = ((F + cz * F1) * s2 + 2 * cz * (cz * F - 1.0)) / (s2 * s2);
    }
  for (int m = 0; m < 2; m++)
    {
      p[m] = k * F * u[m];
      dp[m] = k * (F1 * cz1 * u[m] + F * u1[m]);
      ddp[m] = k * (F2 * cz1 * cz1 * u[m] + F1 * cz2 * u[m] + 2 * F1 * cz1 * u1[m] + F * u2[m]);
    }
  return e;
}

int
df_curve_plane_pole (const df_curve *c, double tau)
{
  double p[2], dp[2], ddp[2];

  if (c->coords == DF_COORDS_SPHERE)
    return _df_curve_sphere_plane (c, tau, -1, p, dp, ddp);
  return c->coords == DF_COORDS_CHART ? -1 : c->coords == DF_COORDS_POLAR_MAX ? 1 : 0;
}

void
df_curve_eval_plane_about (const df_curve *c, double tau, int end, double p[2], double dp[2],
                           double ddp[2])
{
  if (c->coords == DF_COORDS_SPHERE)
    _df_curve_sphere_plane (c, tau, end, p, dp, ddp);
  else
    df_curve_eval_plane (c, tau, p, dp, ddp);
}

/* Sphere coordinates hand on one pole's picture in the northern half and the other's in the
 * southern: where the curve crosses the equator the pictures change, so the crossings become
 * breaks, and no integrator step straddles one. Found on each segment by sign changes of
 * w_z / |w| + 1e-9 (the same rule as sphere_plane's) on 16 samples, refined by bisection. */
df_status
_df_curve_sphere_breaks (df_curve *c)
{
  size_t nseg = c->closed ? c->n_nodes : c->n_nodes - 1, cap = 16, n = 0;
  double *b = malloc (cap * sizeof *b);

  if (b == NULL)
    return DF_E_NOMEM;
  for (size_t i = 0; i < nseg; i++)
    {
      double a0 = c->taus[i], h = (c->taus[i + 1] - a0) / 16;
      int prev = df_curve_plane_pole (c, a0 + 1e-12 * h);

      for (int j = 1; j <= 16; j++)
        {
          double lo = a0 + (j - 1) * h, hi = j == 16 ? c->taus[i + 1] - 1e-12 * h : a0 + j * h;
          int e = df_curve_plane_pole (c, hi);

          if (e == prev)
            continue;
          for (int it = 0; it < 80 && hi - lo > 1e-15 * (c->tau1 - c->tau0); it++)
            {
              double mid = 0.5 * (lo + hi);

              if (df_curve_plane_pole (c, mid) == prev)
                lo = mid;
              else
                hi = mid;
            }
          if (n == cap)
            {
              double *g = realloc (b, 2 * cap * sizeof *b);

              if (g == NULL)
                {
                  free (b);
                  return DF_E_NOMEM;
                }
              b = g;
              cap *= 2;
            }
          if (hi > c->tau0 && hi < c->tau1)
            b[n++] = hi;
          prev = e;
        }
    }
  c->breaks = b;
  c->n_breaks = n;
  return DF_OK;
}

