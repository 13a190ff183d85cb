/* df-geodesic.c: geodesics from a point and heading: x''^k + Gamma^k_ij x'^i x'^j = 0 in the
 * chart, by adaptive rk8pd in arc length; stops cleanly where the chart ends or is singular.
 * Plain C + libm + GSL; no GLib. */
#include "df-geodesic.h"

#include <gsl/gsl_errno.h>
#include <gsl/gsl_odeiv2.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "df-geometry.h"

typedef struct
{
  const df_surface *surface;
  df_status         fail_status;
  df_diag           fail;
} geo_ctx;

static int
geo_rhs (double s, const double y[], double dydt[], void *data)
{
  geo_ctx *ctx = data;
  double gamma[2][2][2];
  df_status st;

  (void) s;
  st = df_surface_christoffel (ctx->surface, y[0], y[1], gamma, &ctx->fail);
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
        for (int j = 0; j < 2; j++)
          acc += gamma[k][i][j] * y[2 + i] * y[2 + j];
      dydt[2 + k] = -acc;
    }
  return GSL_SUCCESS;
}

static df_status
fill_sample (const df_surface *surface, double s, const double y[4], df_geodesic_sample *out,
             df_diag *diag)
{
  df_chart_jet j;
  df_status st = df_surface_eval (surface, y[0], y[1], 1, &j, diag);
  double len = 0.0;

  if (st != DF_OK)
    return st;
  out->s = s;
  out->u = y[0];
  out->v = y[1];
  memcpy (out->point, j.x, sizeof out->point);
  for (int k = 0; k < 3; k++)
    {
      out->tangent[k] = j.d1[0][k] * y[2] + j.d1[1][k] * y[3];
      len += out->tangent[k] * out->tangent[k];
    }
  len = sqrt (len);
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

df_status
df_geodesic_shoot (const df_surface *surface, double u, double v, double heading_rad,
                   double length, size_t n_samples, df_geodesic_result *out, df_diag *diag)
{
  df_point_geometry geo;
  geo_ctx ctx = { surface, DF_OK, { 0 } };
  double e1[3], e2[3], d[3], len, y[4], s = 0.0, h;
  gsl_odeiv2_system sys = { geo_rhs, NULL, 4, &ctx };
  gsl_odeiv2_step *step = NULL;
  gsl_odeiv2_control *control = NULL;
  gsl_odeiv2_evolve *evolve = NULL;
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

  out->samples = calloc (n_samples, sizeof *out->samples);
  step = gsl_odeiv2_step_alloc (gsl_odeiv2_step_rk8pd, 4);
  control = gsl_odeiv2_control_y_new (1e-12 * df_surface_size (surface), 1e-11);
  evolve = gsl_odeiv2_evolve_alloc (4);
  if (!out->samples || !step || !control || !evolve)
    {
      st = DF_E_NOMEM;
      goto done;
    }
  if ((st = fill_sample (surface, 0.0, y, &out->samples[0], diag)) != DF_OK)
    goto done;
  out->n_samples = 1;
  h = length / 64;
  for (size_t i = 1; i < n_samples; i++)
    {
      double target = length * i / (n_samples - 1);
      double y_prev[4], s_prev;

      while (s < target)
        {
          int rc;

          memcpy (y_prev, y, sizeof y);
          s_prev = s;
          rc = gsl_odeiv2_evolve_apply (evolve, control, step, &sys, &s, target, &h, y);
          if (rc != GSL_SUCCESS)
            {
              /* Ran off the chart (domain edge or near a pole): keep what was reached. */
              out->stopped_early = true;
              memcpy (y, y_prev, sizeof y);
              s = s_prev;
              snprintf (out->stop_reason, sizeof out->stop_reason,
                        "stopped after %.6g of %.6g: %s%s%s", s, length,
                        df_status_describe (ctx.fail_status != DF_OK ? ctx.fail_status
                                                                     : df_status_from_gsl (rc)),
                        ctx.fail.detail[0] ? ": " : "", ctx.fail.detail);
              break;
            }
        }
      if (out->stopped_early)
        {
          if (s > out->samples[out->n_samples - 1].s
              && fill_sample (surface, s, y, &out->samples[out->n_samples], NULL) == DF_OK)
            out->n_samples++;
          break;
        }
      if ((st = fill_sample (surface, s, y, &out->samples[out->n_samples], diag)) != DF_OK)
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
