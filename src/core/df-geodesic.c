/* df-geodesic.c: geodesics from a point and heading: x''^k + Gamma^k_ij x'^i x'^j = 0 by
 * adaptive rk8pd in arc length, in the (u, v) chart or, near a pole of a surface of revolution,
 * in the pole-centred chart p = rho (cos phi, sin phi), which is regular there; so a geodesic
 * runs through and past poles. The first step comes from the local curvature; a failed step is
 * retried shorter, and only a step that cannot be made at any length is a real stop, reported
 * with where and why.
 * Plain C + libm + GSL; no GLib. */
#include "df-geodesic.h"

#include <gsl/gsl_errno.h>
#include <gsl/gsl_odeiv2.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "df-geometry.h"

/* Pole charts are entered below this fraction of the t range from the pole and left above the
 * larger one (hysteresis, so a geodesic skimming the boundary does not switch every step). */
#define POLE_ENTER 0.05
#define POLE_LEAVE 0.15

typedef struct
{
  const df_surface *surface;
  int               mode;         /* -1: (u, v) chart; 0, 1: pole chart about that end */
  df_status         fail_status;
  df_diag           fail;
} geo_ctx;

static df_status
geo_jet (const geo_ctx *ctx, const double y[], df_chart_jet *j, df_diag *diag)
{
  if (ctx->mode < 0)
    return df_surface_eval (ctx->surface, y[0], y[1], 2, j, diag);
  return df_surface_polar_jet (ctx->surface, ctx->mode, y, j, diag);
}

static int
geo_rhs (double s, const double y[], double dydt[], void *data)
{
  geo_ctx *ctx = data;
  double gamma[2][2][2];
  df_chart_jet j;
  df_status st;

  (void) s;
  st = geo_jet (ctx, y, &j, &ctx->fail);
  if (st == DF_OK && df_chart_jet_christoffel (&j, gamma) != DF_OK)
    st = df_diag_fail_at (&ctx->fail, DF_E_SINGULAR, -1, y[0], y[1], "the chart is singular "
                          "here");
  if (st != DF_OK)
    {
      ctx->fail_status = st;
      return GSL_EBADFUNC;
    }
  dydt[0] = y[2];
  dydt[1] = y[3];
  for (int k = 0; k < 2; k++)
    {
      double acc = 0.0;

      for (int i = 0; i < 2; i++)
        for (int l = 0; l < 2; l++)
          acc += gamma[k][i][l] * y[2 + i] * y[2 + l];
      dydt[2 + k] = -acc;
    }
  return GSL_SUCCESS;
}

/* The chart point (t, phi) of a state, whichever chart it is in. */
static void
state_uv (const geo_ctx *ctx, const double y[4], double *u, double *v)
{
  double u_min, u_max;

  if (ctx->mode < 0)
    {
      *u = y[0];
      *v = y[1];
      return;
    }
  df_surface_get_domain (ctx->surface, &u_min, &u_max, NULL, NULL);
  *u = ctx->mode ? u_max - hypot (y[0], y[1]) : u_min + hypot (y[0], y[1]);
  *v = atan2 (y[1], y[0]);
}

/* Moves the state into the chart that suits it: the pole chart near an on-axis pole, the
 * (t, phi) chart away from it. Returns whether it switched. */
static bool
choose_chart (geo_ctx *ctx, double y[4])
{
  df_pole poles[2];
  double u_min, u_max, range;

  if (df_surface_get_kind (ctx->surface) != DF_SURFACE_REVOLUTION)
    return false;
  df_surface_get_domain (ctx->surface, &u_min, &u_max, NULL, NULL);
  df_surface_get_poles (ctx->surface, poles);
  range = u_max - u_min;
  if (ctx->mode < 0)
    for (int e = 0; e < 2; e++)
      {
        double sg = e ? -1.0 : 1.0, rho = sg * (y[0] - poles[e].t);

        if (poles[e].on_axis && poles[e].sin_alpha > 1.0 - 1e-9 && rho < POLE_ENTER * range)
          {
            /* p = rho e_r: p' = rho' e_r + rho phi' e_phi, rho' = sg t'. */
            double c = cos (y[1]), sn = sin (y[1]), rd = sg * y[2], w = rho * y[3];

            y[0] = rho * c;
            y[1] = rho * sn;
            y[2] = rd * c - w * sn;
            y[3] = rd * sn + w * c;
            ctx->mode = e;
            return true;
          }
      }
  else
    {
      double rho = hypot (y[0], y[1]), sg = ctx->mode ? -1.0 : 1.0;

      if (rho > POLE_LEAVE * range)
        {
          double t = poles[ctx->mode].t + sg * rho, ph = atan2 (y[1], y[0]);
          double td = sg * (y[0] * y[2] + y[1] * y[3]) / rho;
          double pd = (y[0] * y[3] - y[1] * y[2]) / (rho * rho);

          y[0] = t;
          y[1] = ph;
          y[2] = td;
          y[3] = pd;
          ctx->mode = -1;
          return true;
        }
    }
  return false;
}

static df_status
fill_sample (const geo_ctx *ctx, double s, const double y[4], df_geodesic_sample *out,
             df_diag *diag)
{
  df_chart_jet j;
  df_status st = geo_jet (ctx, y, &j, diag);
  double len = 0.0;

  if (st != DF_OK)
    return st;
  out->s = s;
  state_uv (ctx, y, &out->u, &out->v);
  memcpy (out->point, j.x, sizeof out->point);
  for (int k = 0; k < 3; k++)
    {
      out->tangent[k] = j.d1[0][k] * y[2] + j.d1[1][k] * y[3];
      len += out->tangent[k] * out->tangent[k];
    }
  len = sqrt (len);
  if (!(len > 0))
    return df_diag_fail_at (diag, DF_E_SINGULAR, -1, out->u, out->v, "the geodesic's tangent "
                            "vanished");
  for (int k = 0; k < 3; k++)
    out->tangent[k] /= len;
  return DF_OK;
}

void
df_geodesic_result_clear (df_geodesic_result *r)
{
  if (r == NULL)
    return;
  free (r->samples);
  memset (r, 0, sizeof *r);
}

/* Why a step could not be made at any length, in words, with the place. */
static void
describe_stop (const geo_ctx *ctx, double s, double length, const double y[4],
               df_geodesic_result *out)
{
  double u, v, u_min, u_max;
  df_pole poles[2];
  const char *what = "";

  state_uv (ctx, y, &u, &v);
  df_surface_get_domain (ctx->surface, &u_min, &u_max, NULL, NULL);
  df_surface_get_poles (ctx->surface, poles);
  if (ctx->fail_status == DF_E_DOMAIN)
    what = "reached the edge of the surface's domain";
  for (int e = 0; e < 2; e++)
    if (poles[e].on_axis && fabs (u - poles[e].t) < POLE_ENTER * (u_max - u_min))
      what = poles[e].sin_alpha > 1.0 - 1e-9 ? "reached the pole"
                                             : "reached the cone apex, where a geodesic has no "
                                               "continuation";
  if (what[0] == '\0')
    what = df_status_describe (ctx->fail_status != DF_OK ? ctx->fail_status : DF_E_NOCONVERGE);
  snprintf (out->stop_reason, sizeof out->stop_reason,
            "%s at s = %.6g of %.6g (u = %.9g, v = %.9g)%s%s", what, s, length, u, v,
            ctx->fail.detail[0] ? ": " : "", ctx->fail.detail);
}

df_status
df_geodesic_shoot (const df_surface *surface, double u, double v, double heading_rad,
                   double length, size_t n_samples, df_geodesic_result *out, df_diag *diag)
{
  df_point_geometry geo;
  geo_ctx ctx = { surface, -1, DF_OK, { 0 } };
  double e1[3], e2[3], d[3], len, y[4], s = 0.0, h, h_min, kmax, size = df_surface_size (surface);
  gsl_odeiv2_system sys = { geo_rhs, NULL, 4, &ctx };
  gsl_odeiv2_step *step = NULL;
  gsl_odeiv2_control *control = NULL;
  gsl_odeiv2_evolve *evolve = NULL;
  size_t guard = 0;
  df_status st;

  memset (out, 0, sizeof *out);
  df_diag_clear (diag);
  if (!(length > 0) || !isfinite (length))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the length must be a positive number");
  if (!isfinite (heading_rad))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the heading must be a finite angle");
  if (n_samples < 2)
    n_samples = 2;
  if ((st = df_surface_geometry (surface, u, v, &geo, diag)) != DF_OK)
    return st;
  if (!geo.chart_regular)
    return df_diag_fail_at (diag, DF_E_SINGULAR, -1, u, v, "a geodesic cannot start on the "
                            "axis, where the chart has no direction; start beside it");

  /* Heading from the unit vector along X_u, counter-clockwise about N. */
  len = sqrt (geo.g[0][0]);
  for (int k = 0; k < 3; k++)
    e1[k] = geo.xu[k] / len;
  e2[0] = geo.normal[1] * e1[2] - geo.normal[2] * e1[1];
  e2[1] = geo.normal[2] * e1[0] - geo.normal[0] * e1[2];
  e2[2] = geo.normal[0] * e1[1] - geo.normal[1] * e1[0];
  for (int k = 0; k < 3; k++)
    d[k] = cos (heading_rad) * e1[k] + sin (heading_rad) * e2[k];
  {
    double b1 = 0, b2 = 0;

    for (int k = 0; k < 3; k++)
      {
        b1 += geo.xu[k] * d[k];
        b2 += geo.xv[k] * d[k];
      }
    y[0] = u;
    y[1] = v;
    y[2] = geo.ginv[0][0] * b1 + geo.ginv[0][1] * b2;
    y[3] = geo.ginv[1][0] * b1 + geo.ginv[1][1] * b2;
  }
  choose_chart (&ctx, y);

  out->samples = calloc (n_samples, sizeof *out->samples);
  step = gsl_odeiv2_step_alloc (gsl_odeiv2_step_rk8pd, 4);
  control = gsl_odeiv2_control_y_new (1e-12 * size, 1e-11);
  evolve = gsl_odeiv2_evolve_alloc (4);
  if (!out->samples || !step || !control || !evolve)
    {
      st = DF_E_NOMEM;
      goto done;
    }
  if ((st = fill_sample (&ctx, 0.0, y, &out->samples[0], diag)) != DF_OK)
    goto done;
  out->n_samples = 1;
  /* First step from the local geometry: a twentieth of the smaller radius of curvature (or of
   * the surface's size where it is flat); the integrator adapts it from there. A step that
   * fails is retried shorter down to h_min, below which the stop is real. */
  kmax = fmax (fabs (geo.k1), fabs (geo.k2));
  h = fmin (length, 0.05 * fmin (size, kmax > 0 ? 1.0 / kmax : size));
  h_min = 1e-12 * fmax (size, length);
  for (size_t i = 1; i < n_samples; i++)
    {
      double target = length * i / (n_samples - 1);

      while (s < target)
        {
          double y_prev[4], s_prev = s;
          int rc;

          memcpy (y_prev, y, sizeof y);
          ctx.fail_status = DF_OK;
          rc = gsl_odeiv2_evolve_apply (evolve, control, step, &sys, &s, target, &h, y);
          if (rc != GSL_SUCCESS)
            {
              memcpy (y, y_prev, sizeof y);
              s = s_prev;
              gsl_odeiv2_evolve_reset (evolve);
              if (h > h_min)
                {
                  h *= 0.125;
                  continue;
                }
              out->stopped_early = true;
              describe_stop (&ctx, s, length, y, out);
              break;
            }
          if (choose_chart (&ctx, y))
            gsl_odeiv2_evolve_reset (evolve);
          if (++guard > 50000000)
            {
              st = df_diag_fail (diag, DF_E_NOCONVERGE, -1, "the geodesic needs more than 5e7 "
                                 "steps");
              goto done;
            }
        }
      if (out->stopped_early)
        {
          if (s > out->samples[out->n_samples - 1].s
              && fill_sample (&ctx, s, y, &out->samples[out->n_samples], NULL) == DF_OK)
            out->n_samples++;
          break;
        }
      if ((st = fill_sample (&ctx, s, y, &out->samples[out->n_samples], diag)) != DF_OK)
        goto done;
      out->n_samples++;
    }
  out->length = out->samples[out->n_samples - 1].s;

done:
  if (evolve) gsl_odeiv2_evolve_free (evolve);
  if (control) gsl_odeiv2_control_free (control);
  if (step) gsl_odeiv2_step_free (step);
  if (st != DF_OK)
    df_geodesic_result_clear (out);
  return st;
}
