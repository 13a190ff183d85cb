/* df-devmap.c: the developability map from geodesic discs (see df-devmap.h): geodesics from
 * df-geodesic.c, K from df-geometry.c, the Jacobi equation by Numerov's method on the
 * geodesic's evenly spaced samples. Plain C + libm + GSL; no GLib. */
#include "df-devmap.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "df-geodesic.h"
#include "df-geometry.h"

void
df_devmap_options_init (df_devmap_options *options)
{
  options->n_directions = 48;
  options->n_steps = 32;
}

/* Along one geodesic of n + 1 samples spaced h with curvature K[k]: J and the integrals of
 * K J and J over rho (Simpson), and J'(a). FALSE when J reaches 0 before the end (a conjugate
 * point: the disc folds over itself there). */
static bool
jacobi (const double *K, size_t n, double h, double *j_end, double *dj_end, double *int_kj,
        double *int_j, double *J)
{
  double c = h * h / 12.0, skj = 0.0, sj = 0.0;

  J[0] = 0.0;
  /* Taylor start J(h) = h - K h^3 / 6 - K' h^4 / 12 (from J'' = -K J, J(0) = 0, J'(0) = 1). */
  J[1] = h - K[0] * h * h * h / 6.0 - (K[1] - K[0]) / h * h * h * h * h / 12.0;
  /* Numerov (Hairer, Norsett and Wanner, Solving ODEs I, III.10, from memory): fourth order for
   * y'' = f(x) y. */
  for (size_t k = 1; k < n; k++)
    J[k + 1] = (2.0 * J[k] * (1.0 - 5.0 * c * K[k]) - J[k - 1] * (1.0 + c * K[k - 1]))
               / (1.0 + c * K[k + 1]);
  for (size_t k = 1; k <= n; k++)
    if (!(J[k] > 0.0))
      return false;
  for (size_t k = 0; k <= n; k++)
    {
      double w = (k == 0 || k == n) ? 1.0 : (k % 2 ? 4.0 : 2.0);

      skj += w * K[k] * J[k];
      sj += w * J[k];
    }
  *int_kj = skj * h / 3.0;
  *int_j = sj * h / 3.0;
  *j_end = J[n];
  /* Five-point backward difference, fourth order (Abramowitz and Stegun 25.3.4-type, from
   * memory). */
  *dj_end = (25.0 * J[n] - 48.0 * J[n - 1] + 36.0 * J[n - 2] - 16.0 * J[n - 3] + 3.0 * J[n - 4])
            / (12.0 * h);
  return true;
}

df_status
df_devmap_at (const df_surface *surface, double u, double v, double a,
              const df_devmap_options *options, df_devmap_point *out, df_diag *diag)
{
  df_devmap_options opt;
  double *K = NULL, *J = NULL, dtheta, h;
  df_status st = DF_OK;

  memset (out, 0, sizeof *out);
  if (options == NULL)
    df_devmap_options_init (&opt);
  else
    opt = *options;
  if (opt.n_directions < 8 || opt.n_steps < 8 || opt.n_steps % 2 != 0 || opt.n_directions > 4096
      || opt.n_steps > 4096)
    return df_diag_fail (diag, DF_E_INPUT, -1, "directions in [8, 4096], steps even in [8, "
                         "4096]");
  if (!(a > 0.0) || !isfinite (a))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the patch radius must be positive");
  K = malloc ((opt.n_steps + 1) * sizeof *K);
  J = malloc ((opt.n_steps + 1) * sizeof *J);
  if (K == NULL || J == NULL)
    {
      st = DF_E_NOMEM;
      goto done;
    }
  dtheta = 2.0 * M_PI / opt.n_directions;
  h = a / opt.n_steps;
  for (size_t d = 0; d < opt.n_directions; d++)
    {
      df_geodesic_result g = { 0 };
      double j_end, dj_end, int_kj, int_j;
      bool fine;

      st = df_geodesic_shoot (surface, u, v, d * dtheta, a, opt.n_steps + 1, &g, diag);
      if (st != DF_OK || g.stopped_early || g.n_samples != opt.n_steps + 1)
        {
          df_geodesic_result_clear (&g);
          /* Off the surface or at a pole: this point has no full disc; not an error. */
          if (st == DF_OK || st == DF_E_DOMAIN || st == DF_E_SINGULAR)
            st = DF_OK;
          goto done;
        }
      for (size_t k = 0; k <= opt.n_steps && st == DF_OK; k++)
        {
          df_point_geometry geo;

          st = df_surface_geometry (surface, g.samples[k].u, g.samples[k].v, &geo, diag);
          K[k] = geo.K;
        }
      df_geodesic_result_clear (&g);
      if (st != DF_OK)
        goto done;
      fine = jacobi (K, opt.n_steps, h, &j_end, &dj_end, &int_kj, &int_j, J);
      if (!fine)
        goto done;
      /* The trapezoid rule in theta is spectrally accurate for a periodic integrand. */
      out->enclosed_rad += int_kj * dtheta;
      out->area += int_j * dtheta;
      out->circumference += j_end * dtheta;
      out->gauss_bonnet_rad += dj_end * dtheta;
    }
  out->gauss_bonnet_rad = 2.0 * M_PI - out->gauss_bonnet_rad;
  out->strain = (2.0 * M_PI * a - out->circumference) / (2.0 * M_PI * a);
  out->ok = isfinite (out->enclosed_rad) && isfinite (out->circumference)
            && isfinite (out->area) && isfinite (out->gauss_bonnet_rad);

done:
  if (!out->ok)
    memset (out, 0, sizeof *out);
  free (K);
  free (J);
  return st;
}

void
df_devmap_clear (df_devmap *map)
{
  if (map == NULL)
    return;
  free (map->u);
  free (map->v);
  free (map->points);
  memset (map, 0, sizeof *map);
}

df_status
df_devmap_grid (const df_surface *surface, double a, size_t nu, size_t nv,
                const df_devmap_options *options, df_devmap *out, df_diag *diag)
{
  double u0, u1, v0, v1;
  df_status st = DF_OK;

  memset (out, 0, sizeof *out);
  if (nu < 2 || nv < 2 || nu > 2000 || nv > 2000)
    return df_diag_fail (diag, DF_E_INPUT, -1, "grid %zu x %zu outside [2, 2000]", nu, nv);
  df_surface_get_domain (surface, &u0, &u1, &v0, &v1);
  out->nu = nu;
  out->nv = nv;
  out->a = a;
  out->u = malloc (nu * sizeof *out->u);
  out->v = malloc (nv * sizeof *out->v);
  out->points = calloc (nu * nv, sizeof *out->points);
  if (out->u == NULL || out->v == NULL || out->points == NULL)
    {
      df_devmap_clear (out);
      return DF_E_NOMEM;
    }
  for (size_t i = 0; i < nu; i++)
    out->u[i] = u0 + (u1 - u0) * (i + 0.5) / nu;
  for (size_t j = 0; j < nv; j++)
    out->v[j] = v0 + (v1 - v0) * (j + 0.5) / nv;
  for (size_t j = 0; j < nv; j++)
    for (size_t i = 0; i < nu; i++)
      {
        df_devmap_point *p = &out->points[j * nu + i];

        if ((st = df_devmap_at (surface, out->u[i], out->v[j], a, options, p, diag)) != DF_OK)
          {
            df_devmap_clear (out);
            return st;
          }
        if (p->ok)
          out->n_ok++;
      }
  return DF_OK;
}
