/* df-fair.c: fairing of a noisy closed loop by a periodic cubic P-spline (Eilers & Marx 1996,
 * "Flexible smoothing with B-splines and penalties"): uniform periodic cubic B-splines in the
 * chord-length parameter of the points in space, fitted by weighted least squares with a
 * penalty on third differences of the coefficients; the smoothing parameter from a bisection
 * on log lambda for the deviation bound; the spline resampled and placed back on the surface.
 * GSL's B-spline module has no periodic basis in the Debian 12 version (2.7), so the uniform
 * periodic basis is written out here; the cyclic banded system is solved with GSL's banded
 * Cholesky and a Schur complement for the six coefficients that close the loop.
 * Plain C + libm + GSL; no GLib. */
#include "df-fair.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_blas.h>
#include <gsl/gsl_linalg.h>

#include "df-project.h"

/* Coefficients: one per 8 points to start with (P-splines want a moderate number, Eilers &
 * Marx 1996, and the system stays well conditioned at heavy smoothing), doubled while even the
 * lightest smoothing cannot stay within the tolerance, up to one per point (a spline with one
 * coefficient per point can come as close to the points as asked) or MAX_COEFFS. */
#define POINTS_PER_COEFF 8
#define MIN_COEFFS 16
#define MAX_COEFFS 20000
/* The lightest smoothing: lambda times the penalty's diagonal at a tenth of the data term's
 * (about n / K), so a spline with more coefficients than the points can fix still has no
 * freedom to swing between them. */
#define LIGHTEST 0.005
/* lambda times the penalty's largest entry stays below 1e9 times the data term's diagonal
 * (about n / K): beyond, the banded Cholesky would lose the coefficients to rounding. */
#define CONDITION_LIMIT 1e9
#define N_BISECT 40
/* The bisection finds the heaviest smoothing whose deviation is within the tolerance; used as
 * found, the bias of the smoother (linear in lambda) would spend all the tolerance the noise
 * leaves, shrinking a circle by that much. The filter is about 1 / (1 + lambda w^6) at
 * frequency w (third differences), so dividing lambda by 100 cuts that bias a hundredfold and
 * raises the noise cut-off frequency only 100^(1/6) = 2.15 times (common practice, no source
 * for the factor). */
#define BACK_OFF 100.0
/* The penalty. Plain third differences (-1, 3, -3, 1) have the constant as their only periodic
 * null space, so heavy smoothing shrinks a loop towards a point: a circle comes out smaller
 * and its enclosed curvature with it. Here the operator (E - 1)(E^2 - 2 cos(theta) E + 1), E
 * the shift and theta = 2 pi / K, with coefficients (-1, 1 + 2 cos theta, -(1 + 2 cos theta), 1):
 * it annihilates the constant and the loop's fundamental harmonic cos, sin (2 pi k / K), as
 * the differential operator D^3 + w^2 D does (an L-spline penalty; derived here), so heavy
 * smoothing tends to the loop's best ellipse and a circle is not shrunk at all. For large K
 * it is the third difference. P^T P is circulant; its first row, the autocorrelation of those
 * coefficients with a = 1 + 2 cos theta, is (2 + 2a^2, -2a - a^2, 2a, -1, 0, ...). */
static void
penalty_row (size_t K, double pen[4])
{
  double a = 1.0 + 2.0 * cos (2.0 * M_PI / (double) K);

  pen[0] = 2.0 + 2.0 * a * a;
  pen[1] = -2.0 * a - a * a;
  pen[2] = 2.0 * a;
  pen[3] = -1.0;
}
/* The last 2 x 3 coefficients are coupled round the loop's closing seam. */
#define N_SEAM 6

typedef struct
{
  size_t n, K;
  double L, h;
  double (*x)[3];     /* the given points on the surface */
  double *tau, *w;    /* chord-length parameter and weights */
  double (*g)[4];     /* cyclic band of B^T W B: g[k][d] is entry (k, k + d mod K) */
  double (*rhs)[3];   /* B^T W X */
  double (*c)[3];     /* spline coefficients */
  double lambda;
  double pen[4];      /* first row of the circulant P^T P */
  gsl_matrix *ab, *a12, *z, *s22;
  gsl_vector *y1, *t2;
} fit;

const char *
df_fair_method_name (void)
{
  return "periodic cubic smoothing spline (P-spline)";
}

/* Uniform cubic B-spline weights of the four coefficients j..j+3 at fraction f of segment j,
 * and their first and second derivatives in f. */
static void
basis (double f, double b[4], double d1[4], double d2[4])
{
  double e = 1.0 - f;

  b[0] = e * e * e / 6;
  b[1] = (3 * f * f * f - 6 * f * f + 4) / 6;
  b[2] = (-3 * f * f * f + 3 * f * f + 3 * f + 1) / 6;
  b[3] = f * f * f / 6;
  if (d1)
    {
      d1[0] = -e * e / 2;
      d1[1] = 1.5 * f * f - 2 * f;
      d1[2] = -1.5 * f * f + f + 0.5;
      d1[3] = f * f / 2;
      d2[0] = e;
      d2[1] = 3 * f - 2;
      d2[2] = 1 - 3 * f;
      d2[3] = f;
    }
}

static double
wrap_tau (const fit *F, double t)
{
  t = fmod (t, F->L);
  return t < 0 ? t + F->L : t;
}

static void
locate (const fit *F, double t, size_t *j, double *f)
{
  double s = wrap_tau (F, t) / F->h;
  size_t k = (size_t) s;

  if (k >= F->K)
    k = F->K - 1;
  *j = k;
  *f = s - (double) k;
}

/* The spline and its first two derivatives in tau at tau = t. */
static void
spline_eval (const fit *F, double t, double p[3], double dp[3], double ddp[3])
{
  double b[4], d1[4], d2[4], f;
  size_t j;

  locate (F, t, &j, &f);
  basis (f, b, d1, d2);
  for (int k = 0; k < 3; k++)
    p[k] = dp[k] = ddp[k] = 0.0;
  for (int a = 0; a < 4; a++)
    {
      const double *c = F->c[(j + a) % F->K];

      for (int k = 0; k < 3; k++)
        {
          p[k] += b[a] * c[k];
          dp[k] += d1[a] * c[k] / F->h;
          ddp[k] += d2[a] * c[k] / (F->h * F->h);
        }
    }
}

/* The entry (i, j) of B^T W B + lambda D^T D. */
static double
entry (const fit *F, size_t i, size_t j)
{
  size_t d = (j + F->K - i) % F->K, e = (i + F->K - j) % F->K;

  if (d <= 3)
    return F->g[i][d] + F->lambda * F->pen[d];
  if (e <= 3)
    return F->g[j][e] + F->lambda * F->pen[e];
  return 0.0;
}

/* Solves for the coefficients at F->lambda: banded Cholesky of the first K - 6 unknowns, the
 * seam's six through the Schur complement. */
static df_status
solve (fit *F)
{
  size_t n1 = F->K - N_SEAM;

  for (size_t i = 0; i < n1; i++)
    for (size_t d = 0; d < 4; d++)
      gsl_matrix_set (F->ab, i, d, i + d < n1 ? entry (F, i + d, i) : 0.0);
  gsl_matrix_set_zero (F->a12);
  for (size_t i = 0; i < n1; i++)
    {
      /* Only the first and the last three rows of the block couple to the seam. */
      if (i >= 3 && i + 3 < n1)
        continue;
      for (size_t c = 0; c < N_SEAM; c++)
        gsl_matrix_set (F->a12, i, c, entry (F, i, n1 + c));
    }
  for (size_t r = 0; r < N_SEAM; r++)
    for (size_t c = 0; c < N_SEAM; c++)
      gsl_matrix_set (F->s22, r, c, entry (F, n1 + r, n1 + c));
  if (gsl_linalg_cholesky_band_decomp (F->ab) != 0)
    return DF_E_NOCONVERGE;
  gsl_matrix_memcpy (F->z, F->a12);
  if (gsl_linalg_cholesky_band_svxm (F->ab, F->z) != 0)
    return DF_E_NOCONVERGE;
  gsl_blas_dgemm (CblasTrans, CblasNoTrans, -1.0, F->a12, F->z, 1.0, F->s22);
  if (gsl_linalg_cholesky_decomp1 (F->s22) != 0)
    return DF_E_NOCONVERGE;
  for (int k = 0; k < 3; k++)
    {
      for (size_t i = 0; i < n1; i++)
        gsl_vector_set (F->y1, i, F->rhs[i][k]);
      gsl_linalg_cholesky_band_svx (F->ab, F->y1);
      for (size_t r = 0; r < N_SEAM; r++)
        gsl_vector_set (F->t2, r, F->rhs[n1 + r][k]);
      gsl_blas_dgemv (CblasTrans, -1.0, F->a12, F->y1, 1.0, F->t2);
      gsl_linalg_cholesky_svx (F->s22, F->t2);
      for (size_t i = 0; i < n1; i++)
        {
          double v = gsl_vector_get (F->y1, i);

          for (size_t r = 0; r < N_SEAM; r++)
            v -= gsl_matrix_get (F->z, i, r) * gsl_vector_get (F->t2, r);
          F->c[i][k] = v;
        }
      for (size_t r = 0; r < N_SEAM; r++)
        F->c[n1 + r][k] = gsl_vector_get (F->t2, r);
    }
  for (size_t i = 0; i < F->K; i++)
    for (int k = 0; k < 3; k++)
      if (!isfinite (F->c[i][k]))
        return DF_E_NONFINITE;
  return DF_OK;
}

/* The nearest point of the spline to x, by Newton on |S(tau) - x|^2 / 2 from tau0 (the
 * point's own parameter), steps capped to one knot interval. Returns that tau. */
static double
nearest_tau (const fit *F, const double x[3], double tau0, double s[3])
{
  double t = tau0, dp[3], ddp[3];

  for (int it = 0; it < 8; it++)
    {
      double r[3], g = 0.0, hh = 0.0, sp2 = 0.0, step;

      spline_eval (F, t, s, dp, ddp);
      for (int k = 0; k < 3; k++)
        {
          r[k] = s[k] - x[k];
          g += r[k] * dp[k];
          sp2 += dp[k] * dp[k];
          hh += dp[k] * dp[k] + r[k] * ddp[k];
        }
      if (!(sp2 > 0))
        break;
      step = -g / (hh > 0 ? hh : sp2);
      step = step > F->h ? F->h : step < -F->h ? -F->h : step;
      t += step;
      if (fabs (step) <= 1e-12 * F->h)
        break;
    }
  spline_eval (F, t, s, dp, ddp);
  return t;
}

/* Largest distance from a given point to the spline (in space). */
static double
deviation (const fit *F)
{
  double worst = 0.0;

  for (size_t i = 0; i < F->n; i++)
    {
      double s[3];

      nearest_tau (F, F->x[i], F->tau[i], s);
      worst = fmax (worst, sqrt ((s[0] - F->x[i][0]) * (s[0] - F->x[i][0])
                                 + (s[1] - F->x[i][1]) * (s[1] - F->x[i][1])
                                 + (s[2] - F->x[i][2]) * (s[2] - F->x[i][2])));
    }
  return worst;
}

/* Deviation at lambda = 10^log_lambda; +inf when the system cannot be solved. */
static double
deviation_at (fit *F, double log_lambda)
{
  F->lambda = pow (10.0, log_lambda);
  return solve (F) == DF_OK ? deviation (F) : INFINITY;
}

static void
fit_free (fit *F)
{
  free (F->x);
  free (F->tau);
  free (F->w);
  free (F->g);
  free (F->rhs);
  free (F->c);
  if (F->ab)
    gsl_matrix_free (F->ab);
  if (F->a12)
    gsl_matrix_free (F->a12);
  if (F->z)
    gsl_matrix_free (F->z);
  if (F->s22)
    gsl_matrix_free (F->s22);
  if (F->y1)
    gsl_vector_free (F->y1);
  if (F->t2)
    gsl_vector_free (F->t2);
}

/* B^T W B and B^T W X from the parameters; with weights set, the weights first: each point
 * stands for half of each neighbouring chord, so a cluster where a stroke paused does not
 * outweigh the rest. */
static void
assemble (fit *F, bool weights)
{
  size_t n = F->n, K = F->K;

  F->h = F->L / (double) K;
  memset (F->g, 0, K * sizeof *F->g);
  memset (F->rhs, 0, K * sizeof *F->rhs);
  for (size_t i = 0; i < n && weights; i++)
    {
      double next = (i + 1 < n ? F->tau[i + 1] : F->L) - F->tau[i];
      double prev = i > 0 ? F->tau[i] - F->tau[i - 1] : F->L - F->tau[n - 1];

      F->w[i] = 0.5 * (next + prev) * (double) n / F->L;
    }
  for (size_t i = 0; i < n; i++)
    {
      double b[4], f;
      size_t j;

      locate (F, F->tau[i], &j, &f);
      basis (f, b, NULL, NULL);
      for (int a = 0; a < 4; a++)
        {
          size_t ka = (j + a) % K;

          for (int k = 0; k < 3; k++)
            F->rhs[ka][k] += F->w[i] * b[a] * F->x[i][k];
          for (int bb = a; bb < 4; bb++)
            F->g[ka][bb - a] += F->w[i] * b[a] * b[bb];
        }
    }
}

/* Points, chord-length parameter, weights (each point stands for half of each neighbouring
 * chord, so a cluster where a stroke paused does not outweigh the rest) and B^T W B. */
static df_status
fit_setup (fit *F, const df_surface *s, const double (*uv)[2], size_t n, size_t K,
           df_diag *diag)
{
  memset (F, 0, sizeof *F);
  F->n = n;
  F->K = K;
  penalty_row (K, F->pen);
  F->x = malloc (n * sizeof *F->x);
  F->tau = malloc (n * sizeof *F->tau);
  F->w = malloc (n * sizeof *F->w);
  F->g = calloc (K, sizeof *F->g);
  F->rhs = calloc (K, sizeof *F->rhs);
  F->c = calloc (K, sizeof *F->c);
  F->ab = gsl_matrix_alloc (K - N_SEAM, 4);
  F->a12 = gsl_matrix_alloc (K - N_SEAM, N_SEAM);
  F->z = gsl_matrix_alloc (K - N_SEAM, N_SEAM);
  F->s22 = gsl_matrix_alloc (N_SEAM, N_SEAM);
  F->y1 = gsl_vector_alloc (K - N_SEAM);
  F->t2 = gsl_vector_alloc (N_SEAM);
  if (!F->x || !F->tau || !F->w || !F->g || !F->rhs || !F->c || !F->ab || !F->a12 || !F->z
      || !F->s22 || !F->y1 || !F->t2)
    return df_diag_fail (diag, DF_E_NOMEM, -1, "no memory for the fairing");
  for (size_t i = 0; i < n; i++)
    {
      df_chart_jet j;
      df_status st = df_surface_eval (s, uv[i][0], uv[i][1], 0, &j, diag);

      if (st != DF_OK)
        {
          if (diag)
            diag->index = (long) i;
          return st;
        }
      memcpy (F->x[i], j.x, sizeof j.x);
    }
  F->L = 0.0;
  for (size_t i = 0; i < n; i++)
    {
      const double *a = F->x[i], *b = F->x[(i + 1) % n];

      F->tau[i] = F->L;
      F->L += sqrt ((b[0] - a[0]) * (b[0] - a[0]) + (b[1] - a[1]) * (b[1] - a[1])
                    + (b[2] - a[2]) * (b[2] - a[2]));
    }
  if (!(F->L > 0) || !isfinite (F->L))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the loop has no length to fair");
  assemble (F, true);
  return DF_OK;
}

/* Arc length of the spline from tau = a to b within one knot interval (Gauss-Legendre, five
 * points; Abramowitz and Stegun 25.4.30). */
static double
arc (const fit *F, double a, double b)
{
  static const double x[5] = { -0.9061798459386640, -0.5384693101056831, 0.0,
                               0.5384693101056831, 0.9061798459386640 };
  static const double w[5] = { 0.2369268850561891, 0.4786286704993665, 0.5688888888888889,
                               0.4786286704993665, 0.2369268850561891 };
  double sum = 0.0;

  for (int q = 0; q < 5; q++)
    {
      double p[3], dp[3], ddp[3];

      spline_eval (F, 0.5 * (a + b) + 0.5 * (b - a) * x[q], p, dp, ddp);
      sum += w[q] * sqrt (dp[0] * dp[0] + dp[1] * dp[1] + dp[2] * dp[2]);
    }
  return 0.5 * (b - a) * sum;
}

/* Parameter correction: each point's parameter becomes the arc length, along the current
 * spline, of its nearest point there. The chord lengths of noisy points wander (the noise
 * along the normal adds to every chord), and a circle traced at an uneven rate in the
 * parameter is no longer a pure harmonic, which the smoothing would then distort; a loop
 * parametrised by its own arc length is not. Noise along the loop may swap neighbours (the
 * fit does not mind; the weights stay those of the chords); false (nothing changed) when the
 * nearest points run backwards for more than 1 % of the loop in all. */
static bool
reparametrize (fit *F)
{
  double *cum = malloc ((F->K + 1) * sizeof *cum), *s = malloc (F->n * sizeof *s);
  bool ok = cum != NULL && s != NULL;

  if (ok)
    {
      cum[0] = 0.0;
      for (size_t k = 0; k < F->K; k++)
        cum[k + 1] = cum[k] + arc (F, k * F->h, (k + 1) * F->h);
      for (size_t i = 0; i < F->n; i++)
        {
          double sp[3], t = wrap_tau (F, nearest_tau (F, F->x[i], F->tau[i], sp)), f;
          size_t j;

          locate (F, t, &j, &f);
          s[i] = cum[j] + arc (F, j * F->h, t);
        }
      double back = 0.0, total = cum[F->K];

      ok = total > 0 && isfinite (total);
      for (size_t i = 0; i < F->n && ok; i++)
        {
          /* Start the loop at the first point again; a point just before it stays at the end. */
          s[i] = fmod (s[i] - s[0] + 2 * total, total);
          if (i > 0 && s[i] < s[i - 1])
            {
              double d = s[i - 1] - s[i];

              back += d < 0.5 * total ? d : total - d;
            }
        }
      ok = ok && back <= 0.01 * total;
    }
  if (ok)
    {
      memcpy (F->tau, s, F->n * sizeof *s);
      F->L = cum[F->K];
      assemble (F, false);
    }
  free (cum);
  free (s);
  return ok;
}

/* Resamples the spline at n equal steps of tau from 0, places the samples on the surface, and
 * measures the deviation of the given points from the placed loop. */
static df_status
resample (const fit *F, const df_surface *s, double (*out)[2], double *max_dev, df_diag *diag)
{
  df_placer *pl = df_placer_new (s);
  df_status st = DF_OK;

  if (pl == NULL)
    return df_diag_fail (diag, DF_E_NOMEM, -1, "no memory for the fairing");
  for (size_t i = 0; i < F->n && st == DF_OK; i++)
    {
      double p[3], dp[3], ddp[3], d;

      spline_eval (F, F->L * (double) i / (double) F->n, p, dp, ddp);
      st = df_placer_place (pl, p, 0.0, &out[i][0], &out[i][1], &d, diag);
      if (st != DF_OK && diag)
        diag->index = (long) i;
    }
  df_placer_reset (pl);
  *max_dev = 0.0;
  for (size_t i = 0; i < F->n && st == DF_OK; i++)
    {
      double sp[3], u, v, d;
      df_chart_jet j;

      nearest_tau (F, F->x[i], F->tau[i], sp);
      st = df_placer_place (pl, sp, 0.0, &u, &v, &d, diag);
      if (st == DF_OK)
        st = df_surface_eval (s, u, v, 0, &j, diag);
      if (st == DF_OK)
        *max_dev = fmax (*max_dev, sqrt ((j.x[0] - F->x[i][0]) * (j.x[0] - F->x[i][0])
                                         + (j.x[1] - F->x[i][1]) * (j.x[1] - F->x[i][1])
                                         + (j.x[2] - F->x[i][2]) * (j.x[2] - F->x[i][2])));
    }
  df_placer_free (pl);
  if (st != DF_OK)
    return df_diag_fail (diag, DF_E_NOCONVERGE, diag ? diag->index : -1,
                         "the faired loop could not be placed back on the surface");
  return DF_OK;
}

df_status
df_fair_closed_loop (const df_surface *s, const double (*uv)[2], size_t n, double tol,
                     double (**uv_out)[2], df_fair_info *info, df_diag *diag)
{
  fit F;
  double centre[3] = { 0, 0, 0 }, radius = 0.0, lo, hi, lo_min = 0.0;
  double (*out)[2] = NULL, max_dev = INFINITY, log_used;
  size_t K = n / POINTS_PER_COEFF, K_max = n < MAX_COEFFS ? n : MAX_COEFFS;
  bool met = true;
  df_status st;

  df_diag_clear (diag);
  *uv_out = NULL;
  memset (info, 0, sizeof *info);
  if (!(tol > 0) || !isfinite (tol))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the fairing tolerance must be a positive length");
  if (n < 4)
    return df_diag_fail (diag, DF_E_INPUT, -1, "%zu points are too few to fair", n);
  K_max = K_max < MIN_COEFFS ? MIN_COEFFS : K_max;
  K = K < MIN_COEFFS ? MIN_COEFFS : K > K_max ? K_max : K;
  st = fit_setup (&F, s, uv, n, K, diag);
  if (st != DF_OK)
    goto done;
  for (size_t i = 0; i < n; i++)
    for (int k = 0; k < 3; k++)
      centre[k] += F.x[i][k] / (double) n;
  for (size_t i = 0; i < n; i++)
    radius = fmax (radius, sqrt ((F.x[i][0] - centre[0]) * (F.x[i][0] - centre[0])
                                 + (F.x[i][1] - centre[1]) * (F.x[i][1] - centre[1])
                                 + (F.x[i][2] - centre[2]) * (F.x[i][2] - centre[2])));
  /* Smoothing without bound turns a loop into an ellipse: a tolerance near the loop's own size
   * would fair its shape away. */
  if (!(tol <= 0.1 * radius))
    {
      st = df_diag_fail (diag, DF_E_INPUT, -1, "the fairing tolerance %.3g is not small beside "
                         "the loop (its points lie within %.3g of their centre)", tol, radius);
      goto done;
    }

  lo_min = log10 (LIGHTEST * (double) n / (double) K);
  while (!(deviation_at (&F, lo_min) <= tol) && K < K_max)
    {
      fit_free (&F);
      K = 2 * K < K_max ? 2 * K : K_max;
      st = fit_setup (&F, s, uv, n, K, diag);
      if (st != DF_OK)
        goto done;
      lo_min = log10 (LIGHTEST * (double) n / (double) K);
    }
  lo = lo_min;
  for (int round = 0; round < 3; round++)
    {
      lo = lo_min;
      hi = log10 (CONDITION_LIMIT * (double) n / (double) K / F.pen[0]);
      met = true;
      if (!(deviation_at (&F, lo) <= tol))
        met = false;
      else if (deviation_at (&F, hi) <= tol)
        lo = hi;
      else
        for (int it = 0; it < N_BISECT; it++)
          {
            double mid = 0.5 * (lo + hi);

            if (deviation_at (&F, mid) <= tol)
              lo = mid;
            else
              hi = mid;
          }
      /* Twice: the parameters from the faired loop, and the bisection again. */
      if (round == 2 || !met || deviation_at (&F, lo) == INFINITY || !reparametrize (&F))
        break;
    }
  log_used = met ? fmax (lo_min, lo - log10 (BACK_OFF)) : lo_min;

  out = malloc (n * sizeof *out);
  if (out == NULL)
    {
      st = df_diag_fail (diag, DF_E_NOMEM, -1, "no memory for the fairing");
      goto done;
    }
  /* Placing the spline back on the surface moves it a little more; lighten the smoothing
   * until the placed loop is within the tolerance too. */
  for (int round = 0; round < 6; round++)
    {
      F.lambda = pow (10.0, log_used);
      st = solve (&F);
      if (st != DF_OK)
        {
          df_diag_fail (diag, st, -1, "the smoothing spline's system could not be solved");
          goto done;
        }
      st = resample (&F, s, out, &max_dev, diag);
      if (st != DF_OK)
        goto done;
      if (max_dev <= tol || log_used <= lo_min)
        break;
      log_used = fmax (lo_min, log_used - 1.0);
    }
  info->tolerance = tol;
  info->max_deviation = max_dev;
  info->lambda = F.lambda;
  info->n_points = n;
  info->met = max_dev <= tol;
  *uv_out = out;
  out = NULL;
  st = DF_OK;

done:
  free (out);
  fit_free (&F);
  return st;
}
