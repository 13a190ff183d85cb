/* df-transport.h: parallel transport of a tangent vector along a df_curve by adaptive ODE
 * integration (GSL, Runge-Kutta Prince-Dormand 8(9)). Two equivalent forms:
 * the chart form dV^k/dtau + Gamma^k_ij x'^i V^j = 0, used where the chart is regular, and the
 * extrinsic form dV/dtau = -(V . dN/dtau) N in space, used through poles.
 * Plain C + libm + GSL; no GLib. */
#pragma once

#include <stddef.h>

#include "df-curve.h"

typedef enum
{
  DF_TRANSPORT_AUTO,       /* chart form unless the curve is in polar coordinates */
  DF_TRANSPORT_CHART,
  DF_TRANSPORT_EXTRINSIC
} df_transport_form;

#define DF_TRANSPORT_MAX_EXTRA 4

/* Extra integrands integrated along with the transport: values of n_extra functions of the
 * curve's plane coordinates p and dp/dtau at tau, integrated over each of the transport's
 * accepted steps by a 5-point Gauss-Legendre rule (the steps adapt to the curve's shape). */
typedef df_status (*df_transport_extra_fn) (double tau, const double p[2], const double dp[2],
                                            double *values, void *user);

typedef struct
{
  double            rel_tol;     /* per-step relative tolerance; default 1e-11 */
  double            abs_tol;     /* per-step absolute tolerance; default 1e-12 */
  df_transport_form form;
  size_t            n_out;       /* samples to record, evenly spaced in tau (>= 2); 0 = none */
  size_t            n_extra;     /* 0 .. DF_TRANSPORT_MAX_EXTRA */
  df_transport_extra_fn extra;
  void             *extra_user;
} df_transport_options;

/* Fills the defaults above. */
void      df_transport_options_init (df_transport_options *options);

/* A recorded sample of the transport. */
typedef struct
{
  double tau;
  double x[3];        /* space point */
  double normal[3];
  double vector[3];   /* the carried vector, unit length, in space */
  double s;           /* arc length from the start */
  double angle;       /* angle from the path's unit tangent to the carried vector about N,
                       * followed continuously from its start value (changes by -k_g ds) */
} df_transport_sample;

typedef struct
{
  double               start_vector[3];  /* unit, tangent at the start */
  double               end_vector[3];    /* carried to the end */
  double               start_normal[3];
  double               end_normal[3];
  double               norm_drift;       /* | |V_end| - 1 |: a check on the integration */
  double               length;           /* of the path, integrated with the transport */
  double               total_kg;         /* integral of k_g ds over the smooth pieces, from the
                                          * turning of the tangent against the carried vector
                                          * (corners excluded) */
  double               corner_turning;   /* sum of the turning angles at corners */
  double               max_abs_kg;       /* largest |k_g| met at the integrator's points */
  double               extra[DF_TRANSPORT_MAX_EXTRA];  /* integrals of the extra integrands */
  size_t               rhs_evals;
  size_t               n_samples;
  df_transport_sample *samples;          /* n_samples, owned */
} df_transport_result;

/* Carries the vector v0 (in space: projected to the tangent plane at the start and normalised;
 * v0 = NULL takes the curve's unit tangent at its start) from tau0 to tau1. */
df_status df_transport_run  (const df_curve             *curve,
                             const double               *v0_space,
                             const df_transport_options *options,
                             df_transport_result        *out,
                             df_diag                    *diag);

void      df_transport_result_clear (df_transport_result *result);

/* Signed angle from a to b about the unit axis n, in (-pi, pi]; a and b are projected to the
 * plane normal to n first. */
double    df_signed_angle   (const double a[3], const double b[3], const double n[3]);
