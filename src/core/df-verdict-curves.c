/* df-verdict-curves.c: verdicts along open paths and geodesics (see df-verdict-curves.h): the
 * samples are built here (a transport of the start tangent, or the geodesic's own samples with
 * its heading against X_u), the stretches are found by df-verdict.c's run-finding.
 * Plain C + libm + GSL; no GLib. */
#include "df-verdict-curves.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "df-loop.h"
#include "df-transport.h"
#include "df-vec3.h"
#include "df-verdict-private.h"

static const df_limit_id curve_limits[] = { DF_LIMIT_MIN_STEERING_RADIUS,
                                            DF_LIMIT_MAX_FIBRE_DEVIATION, DF_LIMIT_FRICTION };

df_status
df_verdicts_path (const df_curve *curve, size_t n_samples, const df_limits *limits,
                  df_verdict_list *out, double *length, df_diag *diag)
{
  df_transport_options opt;
  df_transport_result tr = { 0 };
  df_loop_sample *smp = NULL;
  df_status st;

  memset (out, 0, sizeof *out);
  out->kind = DF_VERDICT_PATH;
  if (curve == NULL || limits == NULL || n_samples < 8)
    return df_diag_fail (diag, DF_E_INPUT, -1, "verdicts need a curve, limits and >= 8 samples");
  if (df_curve_is_closed (curve))
    return df_diag_fail (diag, DF_E_INPUT, -1, "a path is an open curve");
  df_transport_options_init (&opt);
  opt.n_out = n_samples;
  if ((st = df_transport_run (curve, NULL, &opt, &tr, diag)) != DF_OK)
    return st;
  smp = calloc (tr.n_samples, sizeof *smp);
  if (smp == NULL)
    {
      st = DF_E_NOMEM;
      goto done;
    }
  for (size_t i = 0; i < tr.n_samples; i++)
    {
      df_curve_point cp;

      if ((st = df_curve_eval (curve, tr.samples[i].tau, &cp, diag)) != DF_OK)
        goto done;
      smp[i].s = tr.samples[i].s;
      smp[i].tau = tr.samples[i].tau;
      smp[i].u = cp.u;
      smp[i].v = cp.v;
      memcpy (smp[i].point, tr.samples[i].x, sizeof smp[i].point);
      /* From the tangent to the carried vector, 0 at the start: the deviation. */
      smp[i].angle_rad = tr.samples[i].angle;
    }
  if (length != NULL)
    *length = tr.length;
  st = _df_verdicts_from_samples (curve, false, df_surface_size (df_curve_get_surface (curve)),
                                  smp, tr.n_samples, tr.length, limits, curve_limits,
                                  sizeof curve_limits / sizeof curve_limits[0], out, diag);
done:
  if (st != DF_OK)
    df_verdict_list_clear (out);
  free (smp);
  df_transport_result_clear (&tr);
  return st;
}

/* The exact verdicts of a geodesic (k_g = 0): worst value at the start. */
static df_status
exact_verdict (const df_geodesic_result *g, const df_limits *limits, df_limit_id id,
               df_verdict_list *out)
{
  df_verdict v = { .limit = id, .within = true, .exact = true,
                   .threshold = limits->item[id].model_value };

  v.s0 = 0.0;
  v.s1 = g->length;
  v.u_worst = g->samples[0].u;
  v.v_worst = g->samples[0].v;
  memcpy (v.point_worst, g->samples[0].point, sizeof v.point_worst);
  if (id == DF_LIMIT_MIN_STEERING_RADIUS)
    {
      v.has_value = false;   /* radius unbounded */
      v.has_tow = limits->item[DF_LIMIT_TOW_WIDTH].set;
      v.tow_compression = 0.0;
    }
  else
    {
      v.has_value = true;
      v.value = 0.0;
    }
  return _df_verdict_push (out, &v);
}

df_status
df_verdicts_geodesic (const df_surface *surface, const df_geodesic_result *g,
                      double heading_rad, const df_limits *limits, df_verdict_list *out,
                      df_diag *diag)
{
  static const df_limit_id deviation[] = { DF_LIMIT_MAX_FIBRE_DEVIATION };
  df_loop_sample *smp;
  double held = 0.0, unwrap = 0.0, prev = 0.0;
  df_status st = DF_OK;

  memset (out, 0, sizeof *out);
  out->kind = DF_VERDICT_GEODESIC;
  if (surface == NULL || g == NULL || limits == NULL || g->n_samples < 8 || g->samples == NULL)
    return df_diag_fail (diag, DF_E_INPUT, -1,
                         "verdicts need a surface, a geodesic of >= 8 samples and limits");
  if (!(g->length > 0.0))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the geodesic has no length");
  if (limits->item[DF_LIMIT_MIN_STEERING_RADIUS].set
      && (st = exact_verdict (g, limits, DF_LIMIT_MIN_STEERING_RADIUS, out)) != DF_OK)
    goto fail;
  if (!limits->item[DF_LIMIT_MAX_FIBRE_DEVIATION].set)
    {
      if (limits->item[DF_LIMIT_FRICTION].set
          && (st = exact_verdict (g, limits, DF_LIMIT_FRICTION, out)) != DF_OK)
        goto fail;
      return DF_OK;
    }

  smp = calloc (g->n_samples, sizeof *smp);
  if (smp == NULL)
    {
      st = DF_E_NOMEM;
      goto fail;
    }
  for (size_t i = 0; i < g->n_samples; i++)
    {
      const df_geodesic_sample *gs = &g->samples[i];
      df_chart_jet jet;
      double n[3], len;

      smp[i].s = gs->s;
      smp[i].tau = gs->s;
      smp[i].u = gs->u;
      smp[i].v = gs->v;
      memcpy (smp[i].point, gs->point, sizeof smp[i].point);
      if ((st = df_surface_eval (surface, gs->u, gs->v, 1, &jet, diag)) != DF_OK)
        {
          free (smp);
          goto fail;
        }
      df_cross3 (jet.d1[0], jet.d1[1], n);
      len = sqrt (df_dot3 (n, n));
      /* Where X_u x X_v vanishes (a pole) X_u gives no reference: hold the last value. */
      if (isfinite (len)
          && len > 1e-12 * sqrt (df_dot3 (jet.d1[0], jet.d1[0]) * df_dot3 (jet.d1[1], jet.d1[1])))
        {
          double a;

          n[0] /= len;
          n[1] /= len;
          n[2] /= len;
          a = df_signed_angle (jet.d1[0], gs->tangent, n) - heading_rad;
          /* Followed continuously, so a winding geodesic does not jump by 2 pi. */
          if (i > 0)
            unwrap += df_wrap_angle (a - prev) - (a - prev);
          prev = a;
          held = a + unwrap;
        }
      smp[i].angle_rad = held;
    }
  st = _df_verdicts_from_samples (NULL, false, df_surface_size (surface), smp, g->n_samples,
                                  g->length, limits, deviation, 1, out, diag);
  free (smp);
  if (st != DF_OK)
    goto fail;
  if (limits->item[DF_LIMIT_FRICTION].set
      && (st = exact_verdict (g, limits, DF_LIMIT_FRICTION, out)) != DF_OK)
    goto fail;
  return DF_OK;

fail:
  df_verdict_list_clear (out);
  return st;
}
