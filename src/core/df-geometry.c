/* df-geometry.c: metric, Christoffel symbols (and their derivatives), Riemann tensor, second
 * fundamental form and curvatures at a chart point, from the exact chart derivatives.
 * Index conventions: ../shared/GEOMETRY.md. Plain C + libm; no GLib. */
#include "df-geometry.h"
#include "df-vec3.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

/* X_ij and X_ijm by index: the number of v's among the indices picks the stored derivative. */
#define X2(j, a, b)    ((j)->d2[(a) + (b)])
#define X3(j, a, b, c) ((j)->d3[(a) + (b) + (c)])

/* Whether the metric is too degenerate to invert: det g / (g11 g22) is the squared sine of the
 * angle between X_u and X_v, so the test does not depend on how differently the two chart
 * directions are scaled (a cylinder of radius 1e13 has g_phiphi / g_tt = 1e26 and is regular).
 * A vanishing or non-finite diagonal is singular too. */
static bool
metric_singular (double det, double g11, double g22)
{
  return !(isfinite (det) && isfinite (g11) && isfinite (g22) && g11 > 0 && g22 > 0
           && det > 1e-24 * g11 * g22);
}

/* Unit normal of a revolution surface from its profile: finite on the axis, where X_u x X_v
 * vanishes, and equal there to the limit of N. */
static void
revolution_normal (const df_chart_jet *j, double v, double n[3])
{
  double c = cos (v), s = sin (v);
  double dr = j->d1[0][0] * c + j->d1[0][1] * s;  /* r' from X_t = (r' cos, r' sin, z') */
  double dz = j->d1[0][2];
  double sp = hypot (dr, dz);

  n[0] = -dz / sp * c;
  n[1] = -dz / sp * s;
  n[2] = dr / sp;
}

/* At a pole of a surface of revolution (r = 0) the chart (t, phi) is degenerate, but the
 * surface need not be: the curvatures there are limits, taken in closed form from the
 * profile's jet at the pole, never from nearby points (so no call back into
 * df_surface_geometry, and no loss of digits). With II_tt / g_tt = (r' z'' - r'' z') / |P'|^3
 * (meridian) and II_phiphi / g_phiphi = z' / (r |P'|) (parallel), and z' -> 0 with r at a
 * smooth pole, L'Hopital gives the parallel's limit z'' / (r' |P'|); both equal
 * z'' / (r' |r'|) there (an umbilic). At a cone apex (z' != 0 at r = 0) the parallel's
 * curvature grows without bound: K, H and the principal curvatures have no value, and the apex
 * carries the concentrated curvature 2 pi (1 - sin alpha) (GEOMETRY.md). */
static df_status
pole_geometry (const df_surface *s, double u, double v, const df_chart_jet *j,
               df_point_geometry *out, df_diag *diag)
{
  df_pole poles[2];
  double u_min, u_max, r1, r2, z1, z2, sp, sin_alpha, km, kp;
  df_chart_jet p;
  int e;
  df_status st;

  df_surface_get_domain (s, &u_min, &u_max, NULL, NULL);
  df_surface_get_poles (s, poles);
  e = fabs (u - u_min) <= fabs (u - u_max) ? 0 : 1;
  if (!poles[e].on_axis || fabs (u - poles[e].t) > 1e-6 * (u_max - u_min))
    return df_diag_fail_at (diag, DF_E_SINGULAR, -1, u, v, "the chart is singular here "
                            "(r = 0 at t = %.9g) but the profile has no pole there", u);
  if ((st = df_surface_eval (s, u, 0.0, 2, &p, diag)) != DF_OK)
    return st;
  r1 = p.d1[0][0];
  z1 = p.d1[0][2];
  r2 = p.d2[0][0];
  z2 = p.d2[0][2];
  sp = hypot (r1, z1);
  if (!(sp > 0) || !isfinite (sp))
    return df_diag_fail_at (diag, DF_E_SINGULAR, -1, u, v, "the profile has no direction at "
                            "the pole (zero or non-finite speed)");

  memset (out, 0, sizeof *out);
  out->u = u;
  out->v = v;
  memcpy (out->point, j->x, sizeof out->point);
  memcpy (out->xu, j->d1[0], sizeof out->xu);
  memcpy (out->xv, j->d1[1], sizeof out->xv);
  revolution_normal (j, v, out->normal);
  for (int a = 0; a < 2; a++)
    for (int b = 0; b < 2; b++)
      {
        out->g[a][b] = df_dot3 (j->d1[a], j->d1[b]);
        out->second_form[a][b] = df_dot3 (X2 (j, a, b), out->normal);
      }
  out->det_g = out->g[0][0] * out->g[1][1] - out->g[0][1] * out->g[1][0];
  out->chart_regular = false;
  sin_alpha = fmin (1.0, fabs (r1) / sp);
  if (sin_alpha < 1.0 - 1e-9)
    {
      out->curvature_defined = false;
      out->concentrated_rad = 2 * M_PI * (1.0 - sin_alpha);
      snprintf (out->note, sizeof out->note,
                "a cone apex (half-angle %.6g deg): K, H and the principal curvatures have no "
                "value here; the apex carries the concentrated curvature 2 pi (1 - sin alpha); "
                "the chart (t, phi) is singular, so Gamma and R have none either",
                asin (sin_alpha) * 180 / M_PI);
      return DF_OK;
    }
  km = (r1 * z2 - r2 * z1) / (sp * sp * sp);
  kp = z2 / (r1 * sp);
  out->curvature_defined = true;
  out->K = km * kp;
  out->H = 0.5 * (km + kp);
  out->k1 = fmax (km, kp);
  out->k2 = fmin (km, kp);
  snprintf (out->note, sizeof out->note,
            "a pole of the chart (t, phi): g_phiphi = r^2 = 0, so g has no inverse and the "
            "Christoffel symbols and the Riemann tensor have no value in these coordinates; K, H "
            "and the principal curvatures are their limits at the pole");
  if (!isfinite (out->K) || !isfinite (out->H))
    return df_diag_fail_at (diag, DF_E_NONFINITE, -1, u, v, "the curvature at the pole is not "
                            "finite");
  return DF_OK;
}

df_status
df_surface_geometry (const df_surface *s, double u, double v, df_point_geometry *out,
                     df_diag *diag)
{
  df_chart_jet j;
  double n[3], len, gl[2][2][2], dgl[2][2][2][2], dg[2][2][2], dginv[2][2][2];
  df_status st;

  if ((st = df_surface_eval (s, u, v, 3, &j, diag)) != DF_OK)
    return st;
  memset (out, 0, sizeof *out);
  out->u = u;
  out->v = v;
  memcpy (out->point, j.x, sizeof out->point);
  memcpy (out->xu, j.d1[0], sizeof out->xu);
  memcpy (out->xv, j.d1[1], sizeof out->xv);
  for (int a = 0; a < 2; a++)
    for (int b = 0; b < 2; b++)
      out->g[a][b] = df_dot3 (j.d1[a], j.d1[b]);
  out->det_g = out->g[0][0] * out->g[1][1] - out->g[0][1] * out->g[1][0];
  if (!isfinite (out->det_g))
    return df_diag_fail_at (diag, DF_E_NONFINITE, -1, u, v, "the metric overflows double precision "
                            "here (the surface's numbers are too large): scale the surface down");
  if (df_surface_get_kind (s) == DF_SURFACE_REVOLUTION)
    {
      /* A pole by the surface's own rule (r <= 1e-12 max r), not by the metric's look. */
      double lo[3], hi[3], r = hypot (j.x[0], j.x[1]);

      df_surface_get_bbox (s, lo, hi);
      if (!(r > 1e-12 * hi[0]))
        return pole_geometry (s, u, v, &j, out, diag);
    }
  if (metric_singular (out->det_g, out->g[0][0], out->g[1][1]))
    return df_diag_fail_at (diag, DF_E_SINGULAR, -1, u, v, "the metric is degenerate here "
                            "(X_u and X_v parallel or zero)");
  out->chart_regular = true;
  out->curvature_defined = true;
  out->ginv[0][0] = out->g[1][1] / out->det_g;
  out->ginv[1][1] = out->g[0][0] / out->det_g;
  out->ginv[0][1] = out->ginv[1][0] = -out->g[0][1] / out->det_g;

  df_cross3 (j.d1[0], j.d1[1], n);
  len = sqrt (df_dot3 (n, n));
  for (int k = 0; k < 3; k++)
    out->normal[k] = n[k] / len;

  /* Christoffel symbols of the first kind Gamma_{l,ij} = X_ij . X_l, which equal
   * 1/2 (d_i g_jl + d_j g_il - d_l g_ij), and their derivatives
   * d_m Gamma_{l,ij} = X_ijm . X_l + X_ij . X_lm. */
  for (int l = 0; l < 2; l++)
    for (int a = 0; a < 2; a++)
      for (int b = 0; b < 2; b++)
        {
          gl[l][a][b] = df_dot3 (X2 (&j, a, b), j.d1[l]);
          for (int m = 0; m < 2; m++)
            dgl[m][l][a][b] = df_dot3 (X3 (&j, a, b, m), j.d1[l]) + df_dot3 (X2 (&j, a, b),
                                                                      X2 (&j, l, m));
        }
  /* d_m g_ab = X_am . X_b + X_a . X_bm; d_m g^kl = -g^ka (d_m g_ab) g^bl. */
  for (int m = 0; m < 2; m++)
    for (int a = 0; a < 2; a++)
      for (int b = 0; b < 2; b++)
        dg[m][a][b] = df_dot3 (X2 (&j, a, m), j.d1[b]) + df_dot3 (j.d1[a], X2 (&j, b, m));
  for (int m = 0; m < 2; m++)
    for (int k = 0; k < 2; k++)
      for (int l = 0; l < 2; l++)
        {
          double acc = 0.0;

          for (int a = 0; a < 2; a++)
            for (int b = 0; b < 2; b++)
              acc -= out->ginv[k][a] * dg[m][a][b] * out->ginv[b][l];
          dginv[m][k][l] = acc;
        }
  for (int k = 0; k < 2; k++)
    for (int a = 0; a < 2; a++)
      for (int b = 0; b < 2; b++)
        {
          double acc = 0.0;

          for (int l = 0; l < 2; l++)
            acc += out->ginv[k][l] * gl[l][a][b];
          out->gamma[k][a][b] = acc;
          for (int m = 0; m < 2; m++)
            {
              double d = 0.0;

              for (int l = 0; l < 2; l++)
                d += dginv[m][k][l] * gl[l][a][b] + out->ginv[k][l] * dgl[m][l][a][b];
              out->dgamma[m][k][a][b] = d;
            }
        }

  /* R^r_smn = d_m Gamma^r_ns - d_n Gamma^r_ms + Gamma^r_ml Gamma^l_ns - Gamma^r_nl Gamma^l_ms,
   * written for any dimension (DF_DIM). */
  for (int r = 0; r < DF_DIM; r++)
    for (int sg = 0; sg < DF_DIM; sg++)
      for (int m = 0; m < DF_DIM; m++)
        for (int nn = 0; nn < DF_DIM; nn++)
          {
            double acc = out->dgamma[m][r][nn][sg] - out->dgamma[nn][r][m][sg];

            for (int l = 0; l < DF_DIM; l++)
              acc += out->gamma[r][m][l] * out->gamma[l][nn][sg]
                     - out->gamma[r][nn][l] * out->gamma[l][m][sg];
            out->riemann[r][sg][m][nn] = acc;
          }

  for (int a = 0; a < 2; a++)
    for (int b = 0; b < 2; b++)
      out->second_form[a][b] = df_dot3 (X2 (&j, a, b), out->normal);
  out->K = (out->second_form[0][0] * out->second_form[1][1]
            - out->second_form[0][1] * out->second_form[1][0]) / out->det_g;
  out->H = 0.5 * (out->ginv[0][0] * out->second_form[0][0]
                  + 2 * out->ginv[0][1] * out->second_form[0][1]
                  + out->ginv[1][1] * out->second_form[1][1]);
  {
    /* Principal curvatures as eigenvalues of the shape operator S = g^-1 II, with the
     * discriminant ((S11 - S22) / 2)^2 + S12 S21 formed from S's entries: H^2 - K would lose
     * half the digits near an umbilic, where the two are nearly equal. */
    double sh[2][2], half, disc;

    for (int a = 0; a < 2; a++)
      for (int b = 0; b < 2; b++)
        sh[a][b] = out->ginv[a][0] * out->second_form[0][b]
                   + out->ginv[a][1] * out->second_form[1][b];
    half = 0.5 * (sh[0][0] - sh[1][1]);
    disc = half * half + sh[0][1] * sh[1][0];
    disc = disc > 0 ? sqrt (disc) : 0.0;
    out->k1 = out->H + disc;
    out->k2 = out->H - disc;
  }
  if (df_surface_get_kind (s) == DF_SURFACE_REVOLUTION)
    revolution_normal (&j, v, out->normal);
  return DF_OK;
}

df_status
df_chart_jet_christoffel (const df_chart_jet *j, double gamma[DF_DIM][DF_DIM][DF_DIM])
{
  double g[2][2], det, ginv[2][2], gl[2][2][2];

  for (int a = 0; a < 2; a++)
    for (int b = 0; b < 2; b++)
      g[a][b] = df_dot3 (j->d1[a], j->d1[b]);
  det = g[0][0] * g[1][1] - g[0][1] * g[1][0];
  if (metric_singular (det, g[0][0], g[1][1]))
    return DF_E_SINGULAR;
  ginv[0][0] = g[1][1] / det;
  ginv[1][1] = g[0][0] / det;
  ginv[0][1] = ginv[1][0] = -g[0][1] / det;
  for (int l = 0; l < 2; l++)
    for (int a = 0; a < 2; a++)
      for (int b = a; b < 2; b++)
        gl[l][a][b] = df_dot3 (X2 (j, a, b), j->d1[l]);
  for (int k = 0; k < 2; k++)
    for (int a = 0; a < 2; a++)
      for (int b = a; b < 2; b++)
        gamma[k][a][b] = gamma[k][b][a] = ginv[k][0] * gl[0][a][b] + ginv[k][1] * gl[1][a][b];
  return DF_OK;
}

df_status
df_surface_christoffel (const df_surface *s, double u, double v,
                        double gamma[DF_DIM][DF_DIM][DF_DIM], df_diag *diag)
{
  df_chart_jet j;
  df_status st;

  if ((st = df_surface_eval (s, u, v, 2, &j, diag)) != DF_OK)
    return st;
  if (df_chart_jet_christoffel (&j, gamma) != DF_OK)
    return df_diag_fail_at (diag, DF_E_SINGULAR, -1, u, v, "the chart is singular here");
  return DF_OK;
}

df_status
df_surface_k_area (const df_surface *s, double u, double v, double *k_sqrt_g, double *sqrt_g,
                   df_diag *diag)
{
  df_chart_jet j;
  double n[3], len, ii[3];
  df_status st;

  if ((st = df_surface_eval (s, u, v, 2, &j, diag)) != DF_OK)
    return st;
  df_cross3 (j.d1[0], j.d1[1], n);
  len = sqrt (df_dot3 (n, n));           /* = sqrt(det g) */
  if (!(len > 0))
    {
      /* On the axis of a revolution surface the area element vanishes. */
      *k_sqrt_g = 0.0;
      if (sqrt_g)
        *sqrt_g = 0.0;
      return DF_OK;
    }
  for (int a = 0; a < 3; a++)
    ii[a] = df_dot3 (j.d2[a], n) / len;
  /* K sqrt(det g) = det II / sqrt(det g). */
  *k_sqrt_g = (ii[0] * ii[2] - ii[1] * ii[1]) / len;
  if (sqrt_g)
    *sqrt_g = len;
  return DF_OK;
}

df_status
df_surface_polar_jet (const df_surface *s, int end, const double p[2], df_chart_jet *out,
                      df_diag *diag)
{
  double u_min, u_max, t0, sg, range, rho, t, e[2] = { 0, 0 }, r[4], z[4], pr[4];
  double q, q1, q1r, qq, zr, zz;
  df_chart_jet j, jp;
  df_status st;

  if (df_surface_get_kind (s) != DF_SURFACE_REVOLUTION)
    return df_diag_fail (diag, DF_E_INPUT, -1, "pole coordinates need a surface of revolution");
  df_surface_get_domain (s, &u_min, &u_max, NULL, NULL);
  t0 = end ? u_max : u_min;
  sg = end ? -1.0 : 1.0;
  range = u_max - u_min;
  rho = hypot (p[0], p[1]);
  t = t0 + sg * rho;
  if ((st = df_surface_eval (s, t, 0.0, 3, &j, diag)) != DF_OK
      || (st = df_surface_eval (s, t0, 0.0, 3, &jp, diag)) != DF_OK)
    return st;
  /* Derivatives in rho = sg (t - t0): d/drho = sg d/dt. */
  r[0] = j.x[0]; r[1] = sg * j.d1[0][0]; r[2] = j.d2[0][0]; r[3] = sg * j.d3[0][0];
  z[0] = j.x[2]; z[1] = sg * j.d1[0][2]; z[2] = j.d2[0][2]; z[3] = sg * j.d3[0][2];
  pr[1] = sg * jp.d1[0][0]; pr[2] = jp.d2[0][0]; pr[3] = sg * jp.d3[0][0];
  /* X = (q p_1, q p_2, z(rho)) with q = r / rho, both even in rho at a smooth pole. The
   * quotients r / rho and z' / rho keep their digits (r and z' come from the formulas); the
   * rho-derivatives of q lose them near the pole and come from r's Taylor series there. */
  if (rho > 1e-12 * range)
    {
      q = r[0] / rho;
      zr = z[1] / rho;
      e[0] = p[0] / rho;
      e[1] = p[1] / rho;
    }
  else
    {
      q = pr[1];
      zr = z[2];
    }
  if (rho < 1e-4 * range)
    {
      q1 = pr[2] / 2 + pr[3] * rho / 3;
      q1r = pr[3] / 3 + (rho > 0 ? pr[2] / (2 * rho) : 0.0);
      qq = pr[3] / 3 - q1r;
    }
  else
    {
      q1 = (r[1] * rho - r[0]) / (rho * rho);
      q1r = q1 / rho;
      qq = (r[2] * rho * rho - 2 * r[1] * rho + 2 * r[0]) / (rho * rho * rho) - q1r;
    }
  zz = z[2] - zr;
  memset (out, 0, sizeof *out);
  out->x[0] = q * p[0];
  out->x[1] = q * p[1];
  out->x[2] = z[0];
  for (int i = 0; i < 2; i++)
    {
      for (int k = 0; k < 2; k++)
        out->d1[i][k] = q1 * e[i] * p[k] + (i == k ? q : 0.0);
      out->d1[i][2] = zr * p[i];
    }
  /* d2[a + b] = X_ab: X_11, X_12, X_22. */
  for (int a = 0; a < 2; a++)
    for (int b = a; b < 2; b++)
      {
        double *x = out->d2[a + b], dab = a == b ? 1.0 : 0.0;

        for (int k = 0; k < 2; k++)
          x[k] = (qq * e[a] * e[b] + q1r * dab) * p[k] + q1 * e[a] * (b == k) + q1 * e[b] * (a == k);
        x[2] = zz * e[a] * e[b] + zr * dab;
      }
  for (int k = 0; k < 3; k++)
    if (!isfinite (out->x[k]) || !isfinite (out->d1[0][k]) || !isfinite (out->d1[1][k])
        || !isfinite (out->d2[0][k]) || !isfinite (out->d2[1][k]) || !isfinite (out->d2[2][k]))
      return df_diag_fail_at (diag, DF_E_NONFINITE, -1, t, atan2 (p[1], p[0]),
                              "the surface in pole coordinates is not finite here");
  return DF_OK;
}
