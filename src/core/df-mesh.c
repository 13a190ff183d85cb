/* df-mesh.c: tessellation of a df_surface into an adapted (u, v) grid. A coarse probe grid
 * measures, per chart interval, how long the surface is and how far its normal turns; rows and
 * columns are then placed by equidistributing that density (each direction separately, so the
 * grid stays a tensor product and (u, v) lines stay straight in the chart).
 * Plain C + libm; no GLib. */
#include "df-mesh.h"
#include "df-vec3.h"

#include <float.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "df-geometry.h"

/* Probe resolution per direction: fine enough to see a bump of 1/50 of the range. */
#define PROBE 129
#define MIN_SEGMENTS 8
#define MIN_SEGMENTS_PERIODIC 24
/* Below this |X_u x X_v| / (|X_u| |X_v|) the chart is treated as singular (a pole). */
#define SINGULAR_SINE 1e-9

struct df_mesh
{
  size_t    n_rows, n_cols, n_vertices, n_triangles, n_invalid;
  double   *positions, *normals, *uv, *k, *h;
  uint8_t  *valid;
  uint32_t *indices;
  double    max_abs_k, max_abs_h;
  double    lo[3], hi[3];
  int       has_problem;
  df_diag   problem;
};

typedef struct
{
  double x[3], n[3];
  int    ok, has_normal;
} probe_point;

static double
dist3 (const double a[3], const double b[3])
{
  double d[3] = { a[0] - b[0], a[1] - b[1], a[2] - b[2] };
  return sqrt (df_dot3 (d, d));
}

static int
finite3 (const double a[3])
{
  return isfinite (a[0]) && isfinite (a[1]) && isfinite (a[2]);
}

/* Angle between unit vectors; atan2 keeps small angles accurate where acos would not. */
static double
angle3 (const double a[3], const double b[3])
{
  double c[3];
  df_cross3 (a, b, c);
  return atan2 (sqrt (df_dot3 (c, c)), df_dot3 (a, b));
}

/* Unit normal from first derivatives, or 0 where the chart is singular. */
static int
unit_normal (const double xu[3], const double xv[3], double n[3])
{
  double c[3], len, scale;

  df_cross3 (xu, xv, c);
  len = sqrt (df_dot3 (c, c));
  scale = sqrt (df_dot3 (xu, xu) * df_dot3 (xv, xv));
  if (!(scale > 0) || !(len > SINGULAR_SINE * scale) || !isfinite (len))
    return 0;
  for (int i = 0; i < 3; i++)
    n[i] = c[i] / len;
  return 1;
}

static void
probe_grid (const df_surface *surface,
            double u0, double du, double v0, double dv,
            probe_point *grid)
{
  for (int i = 0; i < PROBE; i++)
    for (int j = 0; j < PROBE; j++)
      {
        probe_point *p = &grid[i * PROBE + j];
        df_chart_jet jet;

        p->ok = df_surface_eval (surface, u0 + i * du, v0 + j * dv, 1, &jet, NULL) == DF_OK
                && finite3 (jet.x);
        p->has_normal = p->ok && unit_normal (jet.d1[0], jet.d1[1], p->n);
        memcpy (p->x, jet.x, sizeof p->x);
      }
}

/* Segments wanted in a probe interval between points a and b: length over the target edge plus
 * normal turn over the target angle (either alone can demand refinement). */
static double
interval_density (const probe_point *a, const probe_point *b, double edge, double turn)
{
  double d;

  if (!a->ok || !b->ok)
    return 0;
  d = dist3 (a->x, b->x) / edge;
  if (a->has_normal && b->has_normal)
    d += angle3 (a->n, b->n) / turn;
  return isfinite (d) ? d : 0;
}

/* density[0..PROBE-2] per probe interval (already floored); returns the total. */
static double
floor_density (double *density)
{
  double sum = 0;

  for (int i = 0; i < PROBE - 1; i++)
    sum += density[i];
  if (!(sum > 0))
    {
      for (int i = 0; i < PROBE - 1; i++)
        density[i] = 1;
      return PROBE - 1;
    }
  /* A floor keeps flat stretches from being left with one huge row: 20 % of the mean. */
  {
    double floor_value = 0.2 * sum / (PROBE - 1);
    sum = 0;
    for (int i = 0; i < PROBE - 1; i++)
      {
        if (density[i] < floor_value)
          density[i] = floor_value;
        sum += density[i];
      }
  }
  return sum;
}

/* Places n + 1 nodes on [a, b] so that each gets an equal share of the cumulative density. */
static void
place_nodes (const double *density, double total, double a, double b, size_t n, double *nodes)
{
  double step = (b - a) / (PROBE - 1);
  double cum = 0;
  int i = 0;

  nodes[0] = a;
  for (size_t k = 1; k < n; k++)
    {
      double target = total * (double) k / (double) n;
      while (i < PROBE - 2 && cum + density[i] < target)
        cum += density[i++];
      {
        double frac = density[i] > 0 ? (target - cum) / density[i] : 0;
        if (frac < 0)
          frac = 0;
        if (frac > 1)
          frac = 1;
        nodes[k] = a + (i + frac) * step;
      }
    }
  nodes[n] = b;
}

static size_t
clamp_segments (double want, size_t min_segments)
{
  if (!(want < 1e6))
    want = 1e6;
  return want < (double) min_segments ? min_segments : (size_t) ceil (want);
}

typedef struct
{
  double x[3], n[3], k, h;
} vertex_values;

/* Normal, K and H from a second-order jet at a regular point: K = det II / det I and
 * H = (E N - 2 F M + G L) / (2 det I) with II_ij = X_ij . N (do Carmo, sec. 3-3, from memory). */
static int
regular_values (const df_chart_jet *jet, vertex_values *out)
{
  double e, f, g, l, m, nn, det;

  if (!unit_normal (jet->d1[0], jet->d1[1], out->n))
    return 0;
  e = df_dot3 (jet->d1[0], jet->d1[0]);
  f = df_dot3 (jet->d1[0], jet->d1[1]);
  g = df_dot3 (jet->d1[1], jet->d1[1]);
  l = df_dot3 (jet->d2[0], out->n);
  m = df_dot3 (jet->d2[1], out->n);
  nn = df_dot3 (jet->d2[2], out->n);
  det = e * g - f * f;
  if (!(det > 0))
    return 0;
  out->k = (l * nn - m * m) / det;
  out->h = (e * nn - 2 * f * m + g * l) / (2 * det);
  memcpy (out->x, jet->x, sizeof out->x);
  return isfinite (out->k) && isfinite (out->h) && finite3 (out->n) && finite3 (out->x);
}

/* Evaluates one grid point. At a singular chart point (a smooth pole) the normal and curvatures
 * are df_surface_geometry's limits. A cone apex has no tangent plane, so there (or if the limits
 * are not finite) they come from a point nudged a hair into the domain: each column then gets
 * its own meridian's normal, which is what the eye expects of a cone tip. */
static df_status
vertex_eval (const df_surface *surface, double u, double v, double u_min, double u_max,
             const df_pole poles[2], vertex_values *out, df_diag *diag)
{
  df_chart_jet jet;
  df_point_geometry geo;
  df_status status;
  double nudge;
  int apex;

  status = df_surface_eval (surface, u, v, 2, &jet, diag);
  if (status != DF_OK)
    return status;
  if (!finite3 (jet.x))
    return df_diag_fail_at (diag, DF_E_NONFINITE, -1, u, v, "the surface point is not finite");
  if (regular_values (&jet, out))
    return DF_OK;

  memcpy (out->x, jet.x, sizeof out->x);
  apex = (poles[0].on_axis && fabs (u - poles[0].t) <= 1e-9 * (u_max - u_min)
          && fabs (poles[0].concentrated) > 1e-9)
         || (poles[1].on_axis && fabs (u - poles[1].t) <= 1e-9 * (u_max - u_min)
             && fabs (poles[1].concentrated) > 1e-9);
  if (!apex && df_surface_geometry (surface, u, v, &geo, NULL) == DF_OK && finite3 (geo.normal)
      && fabs (df_dot3 (geo.normal, geo.normal) - 1) < 1e-6 && isfinite (geo.K) && isfinite (geo.H))
    {
      memcpy (out->n, geo.normal, sizeof out->n);
      out->k = geo.K;
      out->h = geo.H;
      return DF_OK;
    }

  nudge = 1e-6 * (u_max - u_min);
  if (u - u_min > u_max - u)
    nudge = -nudge;
  {
    vertex_values near;
    if (df_surface_eval (surface, u + nudge, v, 2, &jet, NULL) == DF_OK
        && regular_values (&jet, &near))
      {
        memcpy (out->n, near.n, sizeof out->n);
        out->k = near.k;
        out->h = near.h;
        return DF_OK;
      }
  }
  return df_diag_fail_at (diag, DF_E_SINGULAR, -1, u, v,
                          "no tangent plane at this point or near it");
}

void
df_mesh_free (df_mesh *mesh)
{
  if (mesh == NULL)
    return;
  free (mesh->positions);
  free (mesh->normals);
  free (mesh->uv);
  free (mesh->k);
  free (mesh->h);
  free (mesh->valid);
  free (mesh->indices);
  free (mesh);
}

static void
choose_grid (const df_surface *surface, const df_mesh_options *options,
             double **u_nodes, size_t *n_u, double **v_nodes, size_t *n_v)
{
  double u_min, u_max, v_min, v_max, du, dv, size, edge, turn, total_u, total_v;
  double density_u[PROBE - 1], density_v[PROBE - 1];
  size_t max_vertices, seg_u, seg_v, min_v;
  probe_point *grid;

  df_surface_get_domain (surface, &u_min, &u_max, &v_min, &v_max);
  du = (u_max - u_min) / (PROBE - 1);
  dv = (v_max - v_min) / (PROBE - 1);
  size = df_surface_size (surface);
  if (!(size > 0) || !isfinite (size))
    size = 1;
  edge = size * (options && options->max_edge > 0 ? options->max_edge : 1.0 / 120);
  turn = options && options->max_turn > 0 ? options->max_turn : 4 * M_PI / 180;
  max_vertices = options && options->max_vertices > 0 ? options->max_vertices
                                                      : DF_MESH_DEFAULT_MAX_VERTICES;
  if (max_vertices < 16)
    max_vertices = 16;

  memset (density_u, 0, sizeof density_u);
  memset (density_v, 0, sizeof density_v);
  grid = malloc (sizeof *grid * PROBE * PROBE);
  if (grid != NULL)
    {
      probe_grid (surface, u_min, du, v_min, dv, grid);
      /* The worst line across the chart decides, so a narrow ridge anywhere refines its rows. */
      for (int i = 0; i < PROBE - 1; i++)
        for (int j = 0; j < PROBE; j++)
          {
            double d = interval_density (&grid[i * PROBE + j], &grid[(i + 1) * PROBE + j],
                                         edge, turn);
            if (d > density_u[i])
              density_u[i] = d;
            d = interval_density (&grid[j * PROBE + i], &grid[j * PROBE + i + 1], edge, turn);
            if (d > density_v[i])
              density_v[i] = d;
          }
      free (grid);
    }
  total_u = floor_density (density_u);
  total_v = floor_density (density_v);

  min_v = df_surface_v_periodic (surface) ? MIN_SEGMENTS_PERIODIC : MIN_SEGMENTS;
  seg_u = clamp_segments (total_u, MIN_SEGMENTS);
  seg_v = clamp_segments (total_v, min_v);
  if ((double) (seg_u + 1) * (double) (seg_v + 1) > (double) max_vertices)
    {
      /* Scale both directions alike so the aspect of the cells is kept. */
      double s = sqrt ((double) max_vertices / ((double) (seg_u + 1) * (double) (seg_v + 1)));
      seg_u = (size_t) fmax (2, floor ((seg_u + 1) * s) - 1);
      seg_v = (size_t) fmax (2, floor ((seg_v + 1) * s) - 1);
      while ((seg_u + 1) * (seg_v + 1) > max_vertices && (seg_u > 2 || seg_v > 2))
        {
          if (seg_u >= seg_v)
            seg_u--;
          else
            seg_v--;
        }
    }

  *u_nodes = malloc (sizeof (double) * (seg_u + 1));
  *v_nodes = malloc (sizeof (double) * (seg_v + 1));
  if (*u_nodes != NULL)
    place_nodes (density_u, total_u, u_min, u_max, seg_u, *u_nodes);
  if (*v_nodes != NULL)
    place_nodes (density_v, total_v, v_min, v_max, seg_v, *v_nodes);
  *n_u = seg_u + 1;
  *n_v = seg_v + 1;
}

/* Appends the triangles of the cell between rows r0, r1 and columns c0, c1, leaving out any
 * touching an invalid vertex. The corners a (r0, c0), b (r1, c0), d (r1, c1), e (r0, c1) run
 * counter-clockwise in the chart, hence about N; any three of them in that cyclic order keep the
 * winding. */
static size_t
cell_triangles (const df_mesh *mesh, size_t r0, size_t r1, size_t c0, size_t c1, uint32_t *out)
{
  uint32_t corner[4];
  int bad = -1, n_bad = 0;
  size_t n = 0;

  corner[0] = (uint32_t) (r0 * mesh->n_cols + c0);
  corner[1] = (uint32_t) (r1 * mesh->n_cols + c0);
  corner[2] = (uint32_t) (r1 * mesh->n_cols + c1);
  corner[3] = (uint32_t) (r0 * mesh->n_cols + c1);
  for (int i = 0; i < 4; i++)
    if (!mesh->valid[corner[i]])
      {
        bad = i;
        n_bad++;
      }
  if (n_bad == 0)
    {
      uint32_t tri[6] = { corner[0], corner[1], corner[2], corner[0], corner[2], corner[3] };
      memcpy (out, tri, sizeof tri);
      n = 2;
    }
  else if (n_bad == 1)
    {
      for (int i = 1; i <= 3; i++)
        out[i - 1] = corner[(bad + i) % 4];
      n = 1;
    }
  return n;
}

/* The next kept grid line after k when keeping every step-th one and always the last. */
static size_t
next_line (size_t k, size_t step, size_t n)
{
  return k + step < n - 1 ? k + step : n - 1;
}

uint32_t *
df_mesh_coarse_indices (const df_mesh *mesh, size_t step, size_t *n_triangles)
{
  size_t n = 0, cells_r, cells_c;
  uint32_t *out;

  if (step < 1)
    step = 1;
  cells_r = (mesh->n_rows - 2) / step + 1;
  cells_c = (mesh->n_cols - 2) / step + 1;
  out = malloc (sizeof (uint32_t) * 6 * cells_r * cells_c);
  if (out == NULL)
    return NULL;
  for (size_t r = 0; r + 1 < mesh->n_rows; r = next_line (r, step, mesh->n_rows))
    for (size_t c = 0; c + 1 < mesh->n_cols; c = next_line (c, step, mesh->n_cols))
      n += cell_triangles (mesh, r, next_line (r, step, mesh->n_rows), c,
                           next_line (c, step, mesh->n_cols), &out[3 * n]);
  *n_triangles = n;
  return out;
}

df_status
df_mesh_build (const df_surface      *surface,
               const df_mesh_options *options,
               df_mesh              **out,
               df_diag               *diag)
{
  double *u_nodes = NULL, *v_nodes = NULL, u_min, u_max, v_min, v_max;
  size_t n_u = 0, n_v = 0, n, n_tri;
  df_pole poles[2];
  df_mesh *mesh;

  *out = NULL;
  df_diag_clear (diag);
  if (surface == NULL)
    return df_diag_fail (diag, DF_E_INPUT, -1, "no surface to tessellate");

  mesh = calloc (1, sizeof *mesh);
  if (mesh == NULL)
    return df_diag_fail (diag, DF_E_NOMEM, -1, "out of memory for the mesh");
  choose_grid (surface, options, &u_nodes, &n_u, &v_nodes, &n_v);
  n = n_u * n_v;
  mesh->n_rows = n_u;
  mesh->n_cols = n_v;
  mesh->n_vertices = n;
  mesh->positions = malloc (sizeof (double) * 3 * n);
  mesh->normals = malloc (sizeof (double) * 3 * n);
  mesh->uv = malloc (sizeof (double) * 2 * n);
  mesh->k = malloc (sizeof (double) * n);
  mesh->h = malloc (sizeof (double) * n);
  mesh->valid = malloc (n);
  mesh->indices = malloc (sizeof (uint32_t) * 6 * (n_u - 1) * (n_v - 1));
  if (u_nodes == NULL || v_nodes == NULL || mesh->positions == NULL || mesh->normals == NULL
      || mesh->uv == NULL || mesh->k == NULL || mesh->h == NULL || mesh->valid == NULL
      || mesh->indices == NULL)
    {
      free (u_nodes);
      free (v_nodes);
      df_mesh_free (mesh);
      return df_diag_fail (diag, DF_E_NOMEM, -1, "out of memory for a %zu x %zu mesh", n_u, n_v);
    }

  df_surface_get_domain (surface, &u_min, &u_max, &v_min, &v_max);
  df_surface_get_poles (surface, poles);
  for (int i = 0; i < 3; i++)
    {
      mesh->lo[i] = DBL_MAX;
      mesh->hi[i] = -DBL_MAX;
    }
  for (size_t r = 0; r < n_u; r++)
    for (size_t c = 0; c < n_v; c++)
      {
        size_t i = r * n_v + c;
        vertex_values val;
        df_diag where;

        df_diag_clear (&where);
        mesh->uv[2 * i] = u_nodes[r];
        mesh->uv[2 * i + 1] = v_nodes[c];
        if (vertex_eval (surface, u_nodes[r], v_nodes[c], u_min, u_max, poles, &val, &where)
            != DF_OK)
          {
            static const double up[3] = { 0, 0, 1 };
            mesh->valid[i] = 0;
            mesh->n_invalid++;
            memset (&mesh->positions[3 * i], 0, sizeof (double) * 3);
            memcpy (&mesh->normals[3 * i], up, sizeof up);
            mesh->k[i] = mesh->h[i] = 0;
            if (!mesh->has_problem)
              {
                mesh->has_problem = 1;
                mesh->problem = where;
                mesh->problem.has_point = 1;
                mesh->problem.u = u_nodes[r];
                mesh->problem.v = v_nodes[c];
                mesh->problem.index = -1;
              }
            continue;
          }
        mesh->valid[i] = 1;
        memcpy (&mesh->positions[3 * i], val.x, sizeof val.x);
        memcpy (&mesh->normals[3 * i], val.n, sizeof val.n);
        mesh->k[i] = val.k;
        mesh->h[i] = val.h;
        if (fabs (val.k) > mesh->max_abs_k)
          mesh->max_abs_k = fabs (val.k);
        if (fabs (val.h) > mesh->max_abs_h)
          mesh->max_abs_h = fabs (val.h);
        for (int a = 0; a < 3; a++)
          {
            mesh->lo[a] = fmin (mesh->lo[a], val.x[a]);
            mesh->hi[a] = fmax (mesh->hi[a], val.x[a]);
          }
      }
  free (u_nodes);
  free (v_nodes);

  n_tri = 0;
  for (size_t r = 0; r + 1 < n_u; r++)
    for (size_t c = 0; c + 1 < n_v; c++)
      n_tri += cell_triangles (mesh, r, r + 1, c, c + 1, &mesh->indices[3 * n_tri]);
  mesh->n_triangles = n_tri;

  if (n_tri == 0)
    {
      if (diag != NULL && mesh->has_problem)
        *diag = mesh->problem;
      else
        df_diag_fail (diag, DF_E_DOMAIN, -1, "the surface could not be evaluated anywhere");
      df_mesh_free (mesh);
      return DF_E_DOMAIN;
    }

  /* Invalid vertices are in no triangle; parking them at the box centre keeps every stored
   * number finite and harmless to a renderer that uploads the whole array. */
  if (mesh->n_invalid > 0)
    for (size_t i = 0; i < n; i++)
      if (!mesh->valid[i])
        for (int a = 0; a < 3; a++)
          mesh->positions[3 * i + a] = 0.5 * (mesh->lo[a] + mesh->hi[a]);

  *out = mesh;
  return DF_OK;
}

size_t
df_mesh_n_rows (const df_mesh *mesh)
{
  return mesh->n_rows;
}

size_t
df_mesh_n_cols (const df_mesh *mesh)
{
  return mesh->n_cols;
}

size_t
df_mesh_n_vertices (const df_mesh *mesh)
{
  return mesh->n_vertices;
}

size_t
df_mesh_n_triangles (const df_mesh *mesh)
{
  return mesh->n_triangles;
}

const double *
df_mesh_positions (const df_mesh *mesh)
{
  return mesh->positions;
}

const double *
df_mesh_normals (const df_mesh *mesh)
{
  return mesh->normals;
}

const double *
df_mesh_uv (const df_mesh *mesh)
{
  return mesh->uv;
}

const double *
df_mesh_gaussian (const df_mesh *mesh)
{
  return mesh->k;
}

const double *
df_mesh_mean (const df_mesh *mesh)
{
  return mesh->h;
}

const uint8_t *
df_mesh_valid (const df_mesh *mesh)
{
  return mesh->valid;
}

const uint32_t *
df_mesh_indices (const df_mesh *mesh)
{
  return mesh->indices;
}

double
df_mesh_max_abs_k (const df_mesh *mesh)
{
  return mesh->max_abs_k;
}

double
df_mesh_max_abs_h (const df_mesh *mesh)
{
  return mesh->max_abs_h;
}

void
df_mesh_get_bbox (const df_mesh *mesh, double lo[3], double hi[3])
{
  memcpy (lo, mesh->lo, sizeof mesh->lo);
  memcpy (hi, mesh->hi, sizeof mesh->hi);
}

size_t
df_mesh_n_invalid (const df_mesh *mesh)
{
  return mesh->n_invalid;
}

typedef struct
{
  double value, weight;
} weighted;

static int
compare_weighted (const void *a, const void *b)
{
  double x = ((const weighted *) a)->value, y = ((const weighted *) b)->value;
  return (x > y) - (x < y);
}

double
df_mesh_abs_quantile (const df_mesh    *mesh,
                      df_mesh_quantity  quantity,
                      double            q)
{
  const double *values = quantity == DF_MESH_MEAN ? mesh->h : mesh->k;
  weighted *w;
  double total = 0, running = 0, result = 0;

  if (mesh->n_triangles == 0)
    return 0;
  w = calloc (mesh->n_vertices, sizeof *w);
  if (w == NULL)
    return quantity == DF_MESH_MEAN ? mesh->max_abs_h : mesh->max_abs_k;
  for (size_t i = 0; i < mesh->n_vertices; i++)
    w[i].value = fabs (values[i]);
  for (size_t t = 0; t < mesh->n_triangles; t++)
    {
      const uint32_t *tri = &mesh->indices[3 * t];
      const double *a = &mesh->positions[3 * tri[0]], *b = &mesh->positions[3 * tri[1]];
      const double *c = &mesh->positions[3 * tri[2]];
      double e1[3] = { b[0] - a[0], b[1] - a[1], b[2] - a[2] };
      double e2[3] = { c[0] - a[0], c[1] - a[1], c[2] - a[2] };
      double n[3], third;
      df_cross3 (e1, e2, n);
      third = sqrt (df_dot3 (n, n)) / 6;
      for (int i = 0; i < 3; i++)
        w[tri[i]].weight += third;
    }
  qsort (w, mesh->n_vertices, sizeof *w, compare_weighted);
  for (size_t i = 0; i < mesh->n_vertices; i++)
    total += w[i].weight;
  if (q < 0)
    q = 0;
  for (size_t i = 0; i < mesh->n_vertices; i++)
    {
      if (w[i].weight <= 0)
        continue;
      result = w[i].value;
      running += w[i].weight;
      if (running >= q * total)
        break;
    }
  free (w);
  return result;
}

const df_diag *
df_mesh_problem (const df_mesh *mesh)
{
  return mesh->has_problem ? &mesh->problem : NULL;
}
