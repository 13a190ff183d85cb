/* df-surface.c: surfaces of revolution and graphs as const method tables over a defining
 * function (df-fn.h: a formula or a fitted spline): X and its partial derivatives to third
 * order, exactly, from the function's own derivatives.
 * Plain C + libm; no GLib. */
#include "df-surface.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* Samples used to check a profile and to find the bounding box. Dense enough to catch a
 * profile that dips below the axis between two checks in any practical part. */
#define PROFILE_CHECK_SAMPLES 2049
#define GRAPH_CHECK_SAMPLES   97

/* The sizes a surface may have, in its units. Beyond them squared lengths (the metric, the
 * area) and inverse squares (the curvature) leave double precision's comfortable range or
 * the numbers stop meaning a part; common practice, no source. */
#define SURFACE_MAX_SIZE 1e12
#define SURFACE_MIN_SIZE 1e-9
/* A chart direction shorter in space than this fraction of the surface's size is a strip
 * too thin to measure on (its metric is singular to double precision). */
#define MIN_EXTENT_FRACTION 1e-8
/* A range narrower than this fraction of its own values leaves too few digits to step in. */
#define MIN_RANGE_DIGITS 1e-9

typedef struct
{
  const char     *name;
  df_surface_type type;
  df_status     (*eval) (const df_surface *s, double u, double v, int order, df_chart_jet *out,
                         df_diag *diag);
} df_surface_kind;

struct df_surface
{
  const df_surface_kind *kind;
  df_fn   *fn;            /* revolution: (r, z)(t); graph: f(x, y) */
  double   dom[4];        /* u_min, u_max, v_min, v_max */
  double   margin[2];     /* tolerated excess beyond the u and v ranges */
  double   lo[3], hi[3];
  double   size;
  df_pole  poles[2];
  bool     u_periodic;    /* a closed profile (a torus tube): t wraps round */
  char     normal_side[200];
};

static df_status
revolution_eval (const df_surface *s, double t, double phi, int order, df_chart_jet *out,
                 df_diag *diag)
{
  df_fn_jet d;
  double r[4], z[4], c, sn;
  df_status st;

  if ((st = df_fn_eval (s->fn, t, 0.0, order, d, diag)) != DF_OK)
    return st;
  for (int k = 0; k < 4; k++)
    {
      static const df_jet_index idx[4] = { DF_JET_D, DF_JET_DX, DF_JET_DXX, DF_JET_DXXX };

      r[k] = k <= order ? d[0][idx[k]] : 0.0;
      z[k] = k <= order ? d[1][idx[k]] : 0.0;
    }
  c = cos (phi);
  sn = sin (phi);

  memset (out, 0, sizeof *out);
  out->x[0] = r[0] * c; out->x[1] = r[0] * sn; out->x[2] = z[0];
  if (order >= 1)
    {
      out->d1[0][0] = r[1] * c; out->d1[0][1] = r[1] * sn; out->d1[0][2] = z[1];
      out->d1[1][0] = -r[0] * sn; out->d1[1][1] = r[0] * c;
    }
  if (order >= 2)
    {
      out->d2[0][0] = r[2] * c; out->d2[0][1] = r[2] * sn; out->d2[0][2] = z[2];
      out->d2[1][0] = -r[1] * sn; out->d2[1][1] = r[1] * c;
      out->d2[2][0] = -r[0] * c; out->d2[2][1] = -r[0] * sn;
    }
  if (order >= 3)
    {
      out->d3[0][0] = r[3] * c; out->d3[0][1] = r[3] * sn; out->d3[0][2] = z[3];
      out->d3[1][0] = -r[2] * sn; out->d3[1][1] = r[2] * c;
      out->d3[2][0] = -r[1] * c; out->d3[2][1] = -r[1] * sn;
      out->d3[3][0] = r[0] * sn; out->d3[3][1] = -r[0] * c;
    }
  return DF_OK;
}

static df_status
graph_eval (const df_surface *s, double x, double y, int order, df_chart_jet *out, df_diag *diag)
{
  df_fn_jet d;
  const double *f = d[0];
  df_status st;

  if ((st = df_fn_eval (s->fn, x, y, order, d, diag)) != DF_OK)
    return st;

  memset (out, 0, sizeof *out);
  out->x[0] = x; out->x[1] = y; out->x[2] = f[DF_JET_D];
  if (order >= 1)
    {
      out->d1[0][0] = 1.0; out->d1[0][2] = f[DF_JET_DX];
      out->d1[1][1] = 1.0; out->d1[1][2] = f[DF_JET_DY];
    }
  if (order >= 2)
    {
      out->d2[0][2] = f[DF_JET_DXX];
      out->d2[1][2] = f[DF_JET_DXY];
      out->d2[2][2] = f[DF_JET_DYY];
    }
  if (order >= 3)
    {
      out->d3[0][2] = f[DF_JET_DXXX];
      out->d3[1][2] = f[DF_JET_DXXY];
      out->d3[2][2] = f[DF_JET_DXYY];
      out->d3[3][2] = f[DF_JET_DYYY];
    }
  return DF_OK;
}

static const df_surface_kind revolution_kind = { "revolution", DF_SURFACE_REVOLUTION,
                                                 revolution_eval };
static const df_surface_kind graph_kind = { "graph", DF_SURFACE_GRAPH, graph_eval };

static bool
jet_finite (const df_chart_jet *j)
{
  const double *p = &j->x[0];
  size_t n = sizeof *j / sizeof (double);

  for (size_t i = 0; i < n; i++)
    if (!isfinite (p[i]))
      return false;
  return true;
}

/* The point alone: for a formula a tenth of the cost of a jet evaluation, and what chord
 * lengths, seed grids and meshes need. */
static df_status
point_eval (const df_surface *s, double u, double v, df_chart_jet *out, df_diag *diag)
{
  df_fn_jet d;
  df_status st;

  memset (out, 0, sizeof *out);
  if ((st = df_fn_eval (s->fn, u, v, 0, d, diag)) != DF_OK)
    return st;
  if (s->kind->type == DF_SURFACE_REVOLUTION)
    {
      out->x[0] = d[0][DF_JET_D] * cos (v);
      out->x[1] = d[0][DF_JET_D] * sin (v);
      out->x[2] = d[1][DF_JET_D];
      return DF_OK;
    }
  out->x[0] = u;
  out->x[1] = v;
  out->x[2] = d[0][DF_JET_D];
  return DF_OK;
}

/* t wrapped into [t_min, t_max) for a closed profile. */
static double
wrap_u (const df_surface *s, double u)
{
  double period = s->dom[1] - s->dom[0];

  if (!s->u_periodic || (u >= s->dom[0] && u <= s->dom[1]))
    return u;
  return u - period * floor ((u - s->dom[0]) / period);
}

bool
df_surface_contains (const df_surface *s, double u, double v)
{
  if (s->u_periodic)
    return isfinite (u) && isfinite (v);
  if (!(u >= s->dom[0] - s->margin[0] && u <= s->dom[1] + s->margin[0]))
    return false;
  if (s->kind->type == DF_SURFACE_REVOLUTION)
    return isfinite (v);
  return v >= s->dom[2] - s->margin[1] && v <= s->dom[3] + s->margin[1]
         && df_fn_contains (s->fn, u, v);
}

df_status
df_surface_eval (const df_surface *s, double u, double v, int order, df_chart_jet *out,
                 df_diag *diag)
{
  df_status st;

  if (!df_surface_contains (s, u, v))
    {
      if (s->kind->type == DF_SURFACE_REVOLUTION)
        return df_diag_fail_at (diag, DF_E_DOMAIN, -1, u, v, "t outside [%.6g, %.6g]",
                                s->dom[0], s->dom[1]);
      if (u >= s->dom[0] - s->margin[0] && u <= s->dom[1] + s->margin[0]
          && v >= s->dom[2] - s->margin[1] && v <= s->dom[3] + s->margin[1])
        return df_diag_fail_at (diag, DF_E_DOMAIN, -1, u, v, "(x, y) = (%.6g, %.6g) is "
                                "outside the region covered by the data", u, v);
      return df_diag_fail_at (diag, DF_E_DOMAIN, -1, u, v,
                              "(x, y) = (%.6g, %.6g) outside [%.6g, %.6g] x [%.6g, %.6g]",
                              u, v, s->dom[0], s->dom[1], s->dom[2], s->dom[3]);
    }
  u = wrap_u (s, u);
  if (order == 0)
    st = point_eval (s, u, v, out, diag);
  else
    st = s->kind->eval (s, u, v, order, out, diag);
  if (st != DF_OK)
    return st;
  if (!jet_finite (out))
    return df_diag_fail_at (diag, DF_E_NONFINITE, -1, u, v, "the surface or a derivative is "
                            "not finite there");
  return DF_OK;
}

static void
bbox_add (df_surface *s, const double x[3])
{
  for (int k = 0; k < 3; k++)
    {
      if (x[k] < s->lo[k])
        s->lo[k] = x[k];
      if (x[k] > s->hi[k])
        s->hi[k] = x[k];
    }
}

static void
bbox_finish (df_surface *s)
{
  double d2 = 0.0;

  for (int k = 0; k < 3; k++)
    d2 += (s->hi[k] - s->lo[k]) * (s->hi[k] - s->lo[k]);
  s->size = sqrt (d2);
}

static df_surface *
surface_alloc (const df_surface_kind *kind, df_fn *fn)
{
  df_surface *s = calloc (1, sizeof *s);

  if (s == NULL)
    return NULL;
  s->kind = kind;
  s->fn = fn;
  for (int k = 0; k < 3; k++)
    {
      s->lo[k] = INFINITY;
      s->hi[k] = -INFINITY;
    }
  return s;
}

/* Profile speed |(r', z')| and dr/ds at t. */
static df_status
profile_at (const df_surface *s, double t, double *r, double *speed, double *drds, double *dzds,
            df_diag *diag)
{
  df_chart_jet j;
  df_status st = s->kind->eval (s, t, 0.0, 1, &j, diag);

  if (st != DF_OK)
    return st;
  if (!jet_finite (&j))
    return df_diag_fail_at (diag, DF_E_NONFINITE, -1, t, 0.0, "the profile is not finite at "
                            "t = %.6g", t);
  *r = j.x[0];
  *speed = hypot (j.d1[0][0], j.d1[0][2]);
  *drds = *speed > 0 ? j.d1[0][0] / *speed : 0.0;
  *dzds = *speed > 0 ? j.d1[0][2] / *speed : 0.0;
  return DF_OK;
}

/* A chart range [lo, hi] with enough digits to step in, checked before any sampling. */
static df_status
check_range (const char *name_lo, const char *name_hi, double lo, double hi, df_diag *diag)
{
  if (!(isfinite (lo) && isfinite (hi) && lo < hi))
    return df_diag_fail (diag, DF_E_INPUT, -1, "%s (%.6g) must be less than %s (%.6g)",
                         name_lo, lo, name_hi, hi);
  if (!isfinite (hi - lo))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the range %s to %s (%.3g to %.3g) is too wide "
                         "to compute with", name_lo, name_hi, lo, hi);
  if (hi - lo < MIN_RANGE_DIGITS * fmax (fabs (lo), fabs (hi)))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the range %s to %s (%.10g to %.10g) is too "
                         "narrow for its numbers: widen it, or shift the variable so that the "
                         "range starts near 0", name_lo, name_hi, lo, hi);
  return DF_OK;
}

/* The surface's size and its thinnest chart direction (extent, the length in space of the
 * shortest chart line across it), checked once the box is known. */
static df_status
check_scale (const df_surface *s, const char *direction, double extent, df_diag *diag)
{
  if (!isfinite (s->size))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the surface's extent overflows (its box is "
                         "too large to compute); it may be at most %.0e across", SURFACE_MAX_SIZE);
  if (s->size > SURFACE_MAX_SIZE)
    return df_diag_fail (diag, DF_E_INPUT, -1, "the surface is %.3g across, more than the %.0e "
                         "allowed; check the parameters and units", s->size, SURFACE_MAX_SIZE);
  if (!(s->size >= SURFACE_MIN_SIZE))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the surface is %.3g across, less than the %.0e "
                         "allowed; check the parameters and units", s->size, SURFACE_MIN_SIZE);
  if (!(extent >= MIN_EXTENT_FRACTION * s->size))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the surface is only %.3g long along %s, against "
                         "%.3g across: a strip that thin cannot be measured on; widen the "
                         "range", extent, direction, s->size);
  return DF_OK;
}

df_status
df_surface_new_revolution (df_expr *r, df_expr *z, double t_min, double t_max, df_surface **out,
                           df_diag *diag)
{
  static const char *const names[2] = { "r(t)", "z(t)" };
  df_fn *fn;

  *out = NULL;
  df_diag_clear (diag);
  if (r == NULL || z == NULL)
    {
      df_expr_free (r);
      df_expr_free (z);
      return df_diag_fail (diag, DF_E_INPUT, -1, "missing profile formula");
    }
  fn = df_fn_new_formula (1, 2, (df_expr *[2]) { r, z }, names);
  if (fn == NULL)
    return DF_E_NOMEM;
  return df_surface_new_revolution_fn (fn, t_min, t_max, out, diag);
}

df_status
df_surface_new_revolution_fn (df_fn *fn, double t_min, double t_max, df_surface **out,
                              df_diag *diag)
{
  df_surface *s;
  double rs[PROFILE_CHECK_SAMPLES], speed_max = 0.0, r_max = 0.0;
  double profile_length = 0.0, prev[2] = { 0.0, 0.0 };
  df_status st;

  *out = NULL;
  df_diag_clear (diag);
  if (fn == NULL || df_fn_dim (fn) != 1 || df_fn_n_out (fn) != 2)
    {
      df_fn_free (fn);
      return df_diag_fail (diag, DF_E_INPUT, -1, "missing profile function (r, z)(t)");
    }
  if ((st = check_range ("t-min", "t-max", t_min, t_max, diag)) != DF_OK)
    {
      df_fn_free (fn);
      return st;
    }
  s = surface_alloc (&revolution_kind, fn);
  if (s == NULL)
    {
      df_fn_free (fn);
      return DF_E_NOMEM;
    }
  s->dom[0] = t_min;
  s->dom[1] = t_max;
  s->dom[2] = -M_PI;
  s->dom[3] = M_PI;
  s->margin[0] = 1e-9 * (t_max - t_min);
  s->margin[1] = 0.0;

  for (int i = 0; i < PROFILE_CHECK_SAMPLES; i++)
    {
      double t = t_min + (t_max - t_min) * ((double) i / (PROFILE_CHECK_SAMPLES - 1));
      double speed, drds, dzds;
      df_chart_jet j;

      st = profile_at (s, t, &rs[i], &speed, &drds, &dzds, diag);
      if (st != DF_OK)
        {
          df_surface_free (s);
          return st;
        }
      if (speed > speed_max)
        speed_max = speed;
      if (fabs (rs[i]) > r_max)
        r_max = fabs (rs[i]);
      s->kind->eval (s, t, 0.0, 0, &j, NULL);
      if (i > 0)
        profile_length += hypot (j.x[0] - prev[0], j.x[2] - prev[1]);
      prev[0] = j.x[0];
      prev[1] = j.x[2];
      bbox_add (s, j.x);
      j.x[0] = -j.x[0];
      bbox_add (s, j.x);
    }
  if (!(r_max > 0.0))
    {
      df_surface_free (s);
      return df_diag_fail (diag, DF_E_INPUT, -1, "the profile lies on the axis (r = 0 everywhere)");
    }
  /* The y extent of a full turn equals the x extent. */
  s->lo[1] = s->lo[0];
  s->hi[1] = s->hi[0];
  bbox_finish (s);

  for (int i = 0; i < PROFILE_CHECK_SAMPLES; i++)
    {
      double t = t_min + (t_max - t_min) * ((double) i / (PROFILE_CHECK_SAMPLES - 1));
      double rr, speed, drds, dzds;
      bool end = (i == 0 || i == PROFILE_CHECK_SAMPLES - 1);

      profile_at (s, t, &rr, &speed, &drds, &dzds, NULL);
      if (rs[i] < -1e-12 * r_max)
        {
          df_surface_free (s);
          return df_diag_fail_at (diag, DF_E_SINGULAR, -1, t, 0.0,
                                  "the profile has r = %.6g < 0 at t = %.6g", rs[i], t);
        }
      if (!end && fabs (rs[i]) <= 1e-12 * r_max)
        {
          df_surface_free (s);
          return df_diag_fail_at (diag, DF_E_SINGULAR, -1, t, 0.0,
                                  "the profile touches the axis inside its range, at t = %.6g;"
                                  " split it there", t);
        }
      if (speed <= 1e-12 * speed_max)
        {
          df_surface_free (s);
          return df_diag_fail_at (diag, DF_E_SINGULAR, -1, t, 0.0,
                                  "the profile has zero speed (r' = z' = 0) at t = %.6g", t);
        }
    }

  /* After the profile's own checks, whose messages name a t, as the sharper diagnosis. */
  if ((st = check_scale (s, "the profile (t)", profile_length, diag)) != DF_OK)
    {
      df_surface_free (s);
      return st;
    }

  for (int e = 0; e < 2; e++)
    {
      double t = e == 0 ? t_min : t_max;
      double rr, speed, drds, dzds;
      df_pole *p = &s->poles[e];

      profile_at (s, t, &rr, &speed, &drds, &dzds, NULL);
      p->t = t;
      p->on_axis = fabs (rr) <= 1e-12 * r_max;
      if (p->on_axis)
        {
          p->sin_alpha = fmin (1.0, fabs (drds));
          p->concentrated = 2.0 * M_PI * (1.0 - p->sin_alpha);
        }
    }

  {
    /* A profile that ends where it starts, with the same tangent, is closed: t wraps round. */
    df_chart_jet a, b;

    if (s->kind->eval (s, t_min, 0.0, 1, &a, NULL) == DF_OK
        && s->kind->eval (s, t_max, 0.0, 1, &b, NULL) == DF_OK)
      {
        double gap = hypot (a.x[0] - b.x[0], a.x[2] - b.x[2]);
        double ta = hypot (a.d1[0][0], a.d1[0][2]), tb = hypot (b.d1[0][0], b.d1[0][2]);
        double turn = hypot (a.d1[0][0] / ta - b.d1[0][0] / tb, a.d1[0][2] / ta - b.d1[0][2] / tb);

        s->u_periodic = gap <= 1e-9 * s->size && turn <= 1e-6 && !s->poles[0].on_axis;
      }
  }
  {
    double t = 0.5 * (t_min + t_max), rr, speed, drds, dzds;
    const char *side;

    profile_at (s, t, &rr, &speed, &drds, &dzds, NULL);
    /* N = (-z' e_r + r' e_z) / |(r', z')|: the profile direction turned a quarter turn
     * counter-clockwise in the (r, z) half-plane. */
    if (-dzds > 0.2)
      side = "away from the axis";
    else if (-dzds < -0.2)
      side = "toward the axis";
    else if (drds > 0)
      side = "upward (+z)";
    else
      side = "downward (-z)";
    snprintf (s->normal_side, sizeof s->normal_side,
              "N points %s at mid-profile (t = %.4g): it lies to the left of the profile as t "
              "increases, in the (r, z) half-plane", side, t);
  }
  *out = s;
  return DF_OK;
}

df_status
df_surface_new_graph (df_expr *f, double x_min, double x_max, double y_min, double y_max,
                      df_surface **out, df_diag *diag)
{
  static const char *const names[1] = { "z(x, y)" };
  df_fn *fn;

  *out = NULL;
  df_diag_clear (diag);
  if (f == NULL)
    return df_diag_fail (diag, DF_E_INPUT, -1, "missing formula z(x, y)");
  fn = df_fn_new_formula (2, 1, &f, names);
  if (fn == NULL)
    return DF_E_NOMEM;
  return df_surface_new_graph_fn (fn, x_min, x_max, y_min, y_max, out, diag);
}

df_status
df_surface_new_graph_fn (df_fn *f, double x_min, double x_max, double y_min, double y_max,
                         df_surface **out, df_diag *diag)
{
  df_surface *s;
  df_status st;

  *out = NULL;
  df_diag_clear (diag);
  if (f == NULL || df_fn_dim (f) != 2 || df_fn_n_out (f) != 1)
    {
      df_fn_free (f);
      return df_diag_fail (diag, DF_E_INPUT, -1, "missing height function z(x, y)");
    }
  if ((st = check_range ("x-min", "x-max", x_min, x_max, diag)) != DF_OK
      || (st = check_range ("y-min", "y-max", y_min, y_max, diag)) != DF_OK)
    {
      df_fn_free (f);
      return st;
    }
  s = surface_alloc (&graph_kind, f);
  if (s == NULL)
    {
      df_fn_free (f);
      return DF_E_NOMEM;
    }
  s->dom[0] = x_min;
  s->dom[1] = x_max;
  s->dom[2] = y_min;
  s->dom[3] = y_max;
  s->margin[0] = 1e-9 * (x_max - x_min);
  s->margin[1] = 1e-9 * (y_max - y_min);
  for (int i = 0; i < GRAPH_CHECK_SAMPLES; i++)
    for (int k = 0; k < GRAPH_CHECK_SAMPLES; k++)
      {
        double x = x_min + (x_max - x_min) * ((double) i / (GRAPH_CHECK_SAMPLES - 1));
        double y = y_min + (y_max - y_min) * ((double) k / (GRAPH_CHECK_SAMPLES - 1));
        df_chart_jet j;

        /* Data with gaps: only where the function is defined. */
        if (!df_fn_contains (f, x, y))
          continue;

        st = df_surface_eval (s, x, y, 2, &j, diag);
        if (st != DF_OK)
          {
            df_surface_free (s);
            return st;
          }
        bbox_add (s, j.x);
      }
  bbox_finish (s);
  /* A graph's chart lines are at least as long in space as their range. */
  if ((st = check_scale (s, x_max - x_min < y_max - y_min ? "x" : "y",
                         fmin (x_max - x_min, y_max - y_min), diag)) != DF_OK)
    {
      df_surface_free (s);
      return st;
    }
  snprintf (s->normal_side, sizeof s->normal_side,
            "N points upward (+z side of the graph z = f(x, y))");
  *out = s;
  return DF_OK;
}

df_surface *
df_surface_copy (const df_surface *s)
{
  df_surface *c;

  if (s == NULL)
    return NULL;
  c = malloc (sizeof *c);
  if (c == NULL)
    return NULL;
  *c = *s;
  c->fn = df_fn_copy (s->fn);
  if (c->fn == NULL)
    {
      free (c);
      return NULL;
    }
  return c;
}

void
df_surface_free (df_surface *s)
{
  if (s == NULL)
    return;
  df_fn_free (s->fn);
  free (s);
}

const df_fn *
df_surface_get_fn (const df_surface *s)
{
  return s->fn;
}

df_surface_type
df_surface_get_kind (const df_surface *s)
{
  return s->kind->type;
}

const char *
df_surface_kind_name (const df_surface *s)
{
  return s->kind->name;
}

void
df_surface_get_domain (const df_surface *s, double *u_min, double *u_max, double *v_min,
                       double *v_max)
{
  if (u_min) *u_min = s->dom[0];
  if (u_max) *u_max = s->dom[1];
  if (v_min) *v_min = s->dom[2];
  if (v_max) *v_max = s->dom[3];
}

bool
df_surface_v_periodic (const df_surface *s)
{
  return s->kind->type == DF_SURFACE_REVOLUTION;
}

bool
df_surface_u_periodic (const df_surface *s)
{
  return s->u_periodic;
}

void
df_surface_get_bbox (const df_surface *s, double lo[3], double hi[3])
{
  memcpy (lo, s->lo, sizeof s->lo);
  memcpy (hi, s->hi, sizeof s->hi);
}

double
df_surface_size (const df_surface *s)
{
  return s->size;
}

void
df_surface_get_poles (const df_surface *s, df_pole poles[2])
{
  poles[0] = s->poles[0];
  poles[1] = s->poles[1];
}

const char *
df_surface_normal_side (const df_surface *s)
{
  return s->normal_side;
}
