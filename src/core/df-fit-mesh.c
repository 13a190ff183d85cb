/* df-fit-mesh.c: a triangle mesh's vertices fitted as a height map or as a profile of
 * revolution (df-fit-mesh.h), with the checks a mesh needs first: degenerate triangles, and
 * for a graph the places where it folds over (triangles that face the other way or stand
 * vertical seen along z, vertices lying over another part of the mesh, more projected area
 * than the footprint holds). Plain C + libm; no GLib. */
#include "df-fit-mesh.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

/* A triangle with less area than this fraction of the mesh's size squared has its corners on
 * a line to rounding (common practice, no source). */
#define DEGENERATE_REL 1e-12
/* Seen along z, a triangle whose projected area is under this fraction of its area stands
 * vertical: over its footprint the mesh has a range of heights (our own threshold). */
#define VERTICAL_REL   1e-6
/* Places along a revolution mesh's profile: enough to follow a turned part's profile, few
 * enough that each averages many vertices of a scan over the angle. */
#define PROFILE_PLACES 400
#define AXIS_REL       1e-6

typedef struct
{
  unsigned char *used;   /* n_vertices: referenced by a triangle */
  double         size;   /* diagonal of the used vertices' box */
  double         lo[3], hi[3];
} mesh_scan;

static void
cross3 (const double *a, const double *b, const double *c, double out[3])
{
  double u[3] = { b[0] - a[0], b[1] - a[1], b[2] - a[2] };
  double v[3] = { c[0] - a[0], c[1] - a[1], c[2] - a[2] };

  out[0] = u[1] * v[2] - u[2] * v[1];
  out[1] = u[2] * v[0] - u[0] * v[2];
  out[2] = u[0] * v[1] - u[1] * v[0];
}

/* Corner indices in range, finite vertices, then no degenerate triangle. */
static df_status
scan_mesh (const df_fit_mesh_input *m, mesh_scan *sc, df_diag *diag)
{
  memset (sc, 0, sizeof *sc);
  if (m->n_triangles == 0)
    return df_diag_fail (diag, DF_E_INPUT, -1, "no triangles in the mesh");
  if (m->n_other_faces > 0)
    return df_diag_fail (diag, DF_E_INPUT, -1, "face %zu is degenerate: it has fewer than "
                         "three distinct corners (%zu such faces)", m->first_other_face,
                         m->n_other_faces);
  sc->used = calloc (m->n_vertices > 0 ? m->n_vertices : 1, 1);
  if (sc->used == NULL)
    return DF_E_NOMEM;
  for (int k = 0; k < 3; k++)
    {
      sc->lo[k] = INFINITY;
      sc->hi[k] = -INFINITY;
    }
  for (size_t t = 0; t < m->n_triangles; t++)
    for (int k = 0; k < 3; k++)
      {
        unsigned i = m->triangles[t][k];

        if (i >= m->n_vertices)
          return df_diag_fail (diag, DF_E_INPUT, -1, "triangle %zu names vertex %u of %zu", t,
                               i, m->n_vertices);
        if (sc->used[i])
          continue;
        for (int d = 0; d < 3; d++)
          {
            double x = m->vertices[i][d];

            if (!isfinite (x))
              return df_diag_fail (diag, DF_E_INPUT, -1, "vertex %u: %c is not a finite "
                                   "number", i, "xyz"[d]);
            sc->lo[d] = fmin (sc->lo[d], x);
            sc->hi[d] = fmax (sc->hi[d], x);
          }
        sc->used[i] = 1;
      }
  sc->size = hypot (hypot (sc->hi[0] - sc->lo[0], sc->hi[1] - sc->lo[1]),
                    sc->hi[2] - sc->lo[2]);
  if (!(sc->size > 0.0) || !isfinite (sc->size))
    return df_diag_fail (diag, DF_E_INPUT, -1, "the mesh has no extent (all its vertices at "
                         "one point, or spread beyond the numbers' range)");
  for (size_t t = 0; t < m->n_triangles; t++)
    {
      const unsigned *c = m->triangles[t];
      const double *a = m->vertices[c[0]], *b = m->vertices[c[1]], *e = m->vertices[c[2]];
      double n[3];

      cross3 (a, b, e, n);
      if (c[0] == c[1] || c[1] == c[2] || c[0] == c[2]
          || !(0.5 * hypot (hypot (n[0], n[1]), n[2]) > DEGENERATE_REL * sc->size * sc->size))
        return df_diag_fail (diag, DF_E_INPUT, t, "triangle %zu (vertices %u, %u, %u) near "
                             "(%.6g, %.6g, %.6g) is degenerate: its corners lie on a line "
                             "(no area)", t, c[0], c[1], c[2], (a[0] + b[0] + e[0]) / 3.0,
                             (a[1] + b[1] + e[1]) / 3.0, (a[2] + b[2] + e[2]) / 3.0);
    }
  return DF_OK;
}

/* ---- graph: folds ---- */

/* Seen along z every triangle must face the way the mesh does as a whole, and their
 * footprints may not add up to more than the box they lie in. */
static df_status
check_facing (const df_fit_mesh_input *m, const mesh_scan *sc, df_diag *diag)
{
  double total = 0.0, sum_abs = 0.0, sign, box;

  for (size_t t = 0; t < m->n_triangles; t++)
    {
      double n[3];

      cross3 (m->vertices[m->triangles[t][0]], m->vertices[m->triangles[t][1]],
              m->vertices[m->triangles[t][2]], n);
      total += n[2];
      sum_abs += fabs (n[2]);
    }
  sign = total >= 0.0 ? 1.0 : -1.0;
  for (size_t t = 0; t < m->n_triangles; t++)
    {
      const unsigned *c = m->triangles[t];
      const double *a = m->vertices[c[0]], *b = m->vertices[c[1]], *e = m->vertices[c[2]];
      double n[3], area, x = (a[0] + b[0] + e[0]) / 3.0, y = (a[1] + b[1] + e[1]) / 3.0;

      cross3 (a, b, e, n);
      area = hypot (hypot (n[0], n[1]), n[2]);
      if (fabs (n[2]) <= VERTICAL_REL * area)
        return df_diag_fail_at (diag, DF_E_INPUT, (long) t, x, y, "triangle %zu near (x, y) = "
                                "(%.6g, %.6g) stands vertical: the mesh has more than one "
                                "height there (place the part so that it is a graph over xy, "
                                "or use kind=revolution)", t, x, y);
      if (sign * n[2] < 0.0)
        return df_diag_fail_at (diag, DF_E_INPUT, (long) t, x, y, "triangle %zu near (x, y) = "
                                "(%.6g, %.6g) faces the other way seen along z: the mesh "
                                "folds over there (two heights at one (x, y))", t, x, y);
    }
  box = (sc->hi[0] - sc->lo[0]) * (sc->hi[1] - sc->lo[1]);
  if (0.5 * sum_abs > box * (1.0 + 1e-6))
    return df_diag_fail (diag, DF_E_INPUT, -1, "seen along z the triangles cover %.4g times the "
                         "area of their footprint's box: the mesh overlaps itself (two heights "
                         "at one (x, y))", 0.5 * sum_abs / box);
  return DF_OK;
}

/* A vertex strictly inside another triangle's footprint, at another height, is a second layer
 * of the mesh over the first. Triangles are sorted into a uniform grid of cells over the
 * footprint (about one triangle a cell), each vertex tested against its cell's triangles. */
static df_status
check_overlap (const df_fit_mesh_input *m, const mesh_scan *sc, df_diag *diag)
{
  size_t nt = m->n_triangles, side = (size_t) fmin (fmax (ceil (sqrt ((double) nt)), 1.0), 2048.0);
  size_t cells = side * side, total = 0, *start = NULL, *list = NULL;
  double wx = (sc->hi[0] - sc->lo[0]) / side, wy = (sc->hi[1] - sc->lo[1]) / side;
  df_status st = DF_OK;

  if (!(wx > 0.0) || !(wy > 0.0))
    return df_diag_fail (diag, DF_E_INPUT, -1, "seen along z the mesh is a line: no area to fit "
                         "a height map over");
#define CELL_RANGE(t, i0, i1, j0, j1)                                                        \
  do                                                                                         \
    {                                                                                        \
      double xa = INFINITY, xb = -INFINITY, ya = INFINITY, yb = -INFINITY;                   \
      for (int k_ = 0; k_ < 3; k_++)                                                         \
        {                                                                                    \
          const double *p_ = m->vertices[m->triangles[t][k_]];                               \
          xa = fmin (xa, p_[0]); xb = fmax (xb, p_[0]);                                       \
          ya = fmin (ya, p_[1]); yb = fmax (yb, p_[1]);                                       \
        }                                                                                    \
      i0 = (size_t) fmin (floor ((xa - sc->lo[0]) / wx), side - 1);                          \
      i1 = (size_t) fmin (floor ((xb - sc->lo[0]) / wx), side - 1);                          \
      j0 = (size_t) fmin (floor ((ya - sc->lo[1]) / wy), side - 1);                          \
      j1 = (size_t) fmin (floor ((yb - sc->lo[1]) / wy), side - 1);                          \
    }                                                                                        \
  while (0)
  start = calloc (cells + 1, sizeof *start);
  if (start == NULL)
    return DF_E_NOMEM;
  for (size_t t = 0; t < nt; t++)
    {
      size_t i0, i1, j0, j1;

      CELL_RANGE (t, i0, i1, j0, j1);
      total += (i1 - i0 + 1) * (j1 - j0 + 1);
      for (size_t i = i0; i <= i1; i++)
        for (size_t j = j0; j <= j1; j++)
          start[i * side + j + 1]++;
    }
  /* Long slivers across the footprint would make the table quadratic: the facing and area
   * checks have then to do. */
  if (total > 64 * (nt + cells))
    goto out;
  for (size_t k = 0; k < cells; k++)
    start[k + 1] += start[k];
  list = malloc (sizeof *list * (total > 0 ? total : 1));
  if (list == NULL)
    {
      st = DF_E_NOMEM;
      goto out;
    }
  {
    size_t *fill = malloc (sizeof *fill * cells);

    if (fill == NULL)
      {
        st = DF_E_NOMEM;
        goto out;
      }
    memcpy (fill, start, sizeof *fill * cells);
    for (size_t t = 0; t < nt; t++)
      {
        size_t i0, i1, j0, j1;

        CELL_RANGE (t, i0, i1, j0, j1);
        for (size_t i = i0; i <= i1; i++)
          for (size_t j = j0; j <= j1; j++)
            list[fill[i * side + j]++] = t;
      }
    free (fill);
  }
#undef CELL_RANGE
  for (size_t v = 0; v < m->n_vertices && st == DF_OK; v++)
    {
      const double *p = m->vertices[v];
      size_t i, j, cell;

      if (!sc->used[v])
        continue;
      i = (size_t) fmin (floor ((p[0] - sc->lo[0]) / wx), side - 1);
      j = (size_t) fmin (floor ((p[1] - sc->lo[1]) / wy), side - 1);
      cell = i * side + j;
      for (size_t k = start[cell]; k < start[cell + 1]; k++)
        {
          size_t t = list[k];
          const unsigned *c = m->triangles[t];
          const double *a = m->vertices[c[0]], *b = m->vertices[c[1]], *e = m->vertices[c[2]];
          double det, l1, l2, l0, z;

          if (c[0] == v || c[1] == v || c[2] == v)
            continue;
          det = (b[0] - a[0]) * (e[1] - a[1]) - (b[1] - a[1]) * (e[0] - a[0]);
          l1 = ((p[0] - a[0]) * (e[1] - a[1]) - (p[1] - a[1]) * (e[0] - a[0])) / det;
          l2 = ((b[0] - a[0]) * (p[1] - a[1]) - (b[1] - a[1]) * (p[0] - a[0])) / det;
          l0 = 1.0 - l1 - l2;
          /* Strictly inside, away from edges a neighbour shares to rounding. */
          if (!(l0 > 1e-7 && l1 > 1e-7 && l2 > 1e-7))
            continue;
          z = l0 * a[2] + l1 * b[2] + l2 * e[2];
          if (fabs (z - p[2]) > 1e-9 * sc->size)
            st = df_diag_fail_at (diag, DF_E_INPUT, (long) v, p[0], p[1], "vertex %zu at (x, y) "
                                  "= (%.6g, %.6g), height %.6g, lies over triangle %zu at "
                                  "height %.6g: the mesh folds over there (two heights at one "
                                  "(x, y))", v, p[0], p[1], p[2], t, z);
          break;
        }
    }
out:
  free (start);
  free (list);
  return st;
}

df_status
df_fit_mesh_graph (const df_fit_mesh_input *mesh, double tolerance, df_fn **out,
                   df_fit_info *info, df_diag *diag)
{
  mesh_scan sc;
  double (*xyz)[3] = NULL;
  size_t n = 0, *index = NULL;
  df_status st;

  *out = NULL;
  df_diag_clear (diag);
  if ((st = scan_mesh (mesh, &sc, diag)) != DF_OK
      || (st = check_facing (mesh, &sc, diag)) != DF_OK
      || (st = check_overlap (mesh, &sc, diag)) != DF_OK)
    goto out;
  xyz = malloc (sizeof *xyz * mesh->n_vertices);
  index = malloc (sizeof *index * mesh->n_vertices);
  if (xyz == NULL || index == NULL)
    {
      st = DF_E_NOMEM;
      goto out;
    }
  for (size_t v = 0; v < mesh->n_vertices; v++)
    if (sc.used[v])
      {
        memcpy (xyz[n], mesh->vertices[v], sizeof xyz[n]);
        index[n++] = v;
      }
  st = df_fit_grid ((const double (*)[3]) xyz, n, tolerance, out, info, diag);
  /* The fit names rows of the used vertices; the user knows the mesh's numbering. */
  if (st != DF_OK && diag != NULL && diag->index >= 0 && (size_t) diag->index < n)
    {
      char detail[sizeof diag->detail];

      memcpy (detail, diag->detail, sizeof detail);
      df_diag_fail (diag, st, -1, "vertex %zu: %s", index[diag->index], detail);
    }
out:
  free (sc.used);
  free (xyz);
  free (index);
  return st;
}

/* ---- revolution ---- */

typedef struct
{
  double key, other;   /* the coordinate the profile is ordered by, and the other one */
  size_t v;            /* the vertex */
} place;

static int
cmp_place (const void *pa, const void *pb)
{
  const place *a = pa, *b = pb;

  if (a->key != b->key)
    return a->key < b->key ? -1 : 1;
  return (a->other > b->other) - (a->other < b->other);
}

/* Total variation of the other coordinate along the sorted places: small when the profile is
 * single-valued in the key. */
static double
variation (const place *p, size_t n)
{
  double tv = 0.0;

  for (size_t i = 1; i < n; i++)
    tv += fabs (p[i].other - p[i - 1].other);
  return tv;
}

/* Foot of the perpendicular from q = (r, z) on the fitted profile, by Newton's method from s;
 * the signed distance (positive on the side the profile's right-hand normal points). */
static double
project (const df_fn *fn, double len, const double q[2], double *s)
{
  df_fn_jet j;
  double d = 0.0;

  for (int it = 0; it < 8; it++)
    {
      double pr, pz, tr, tz, f, fp, ds;

      if (df_fn_eval (fn, *s, 0.0, 2, j, NULL) != DF_OK)
        break;
      pr = j[0][DF_JET_D] - q[0];
      pz = j[1][DF_JET_D] - q[1];
      tr = j[0][DF_JET_DX];
      tz = j[1][DF_JET_DX];
      f = pr * tr + pz * tz;
      fp = tr * tr + tz * tz + pr * j[0][DF_JET_DXX] + pz * j[1][DF_JET_DXX];
      ds = fp > 0.0 ? -f / fp : -f;
      *s = fmin (fmax (*s + ds, 0.0), len);
      if (fabs (ds) <= 1e-12 * len)
        break;
    }
  if (df_fn_eval (fn, *s, 0.0, 1, j, NULL) == DF_OK)
    d = (q[0] - j[0][DF_JET_D]) * j[1][DF_JET_DX] - (q[1] - j[1][DF_JET_D]) * j[0][DF_JET_DX];
  return d;
}

df_status
df_fit_mesh_revolution (const df_fit_mesh_input *mesh, double tolerance, df_fn **out,
                        df_fit_info *info, df_diag *diag)
{
  mesh_scan sc;
  place *pl = NULL, *alt = NULL;
  double (*rz)[2] = NULL, *s_at = NULL, *dist = NULL, r_max = 0.0, dom[4], size;
  size_t n = 0, nb = 0, *bin_start = NULL;
  bool by_z;
  df_fit_info fi;
  df_status st;

  *out = NULL;
  df_diag_clear (diag);
  if ((st = scan_mesh (mesh, &sc, diag)) != DF_OK)
    goto out;
  pl = malloc (sizeof *pl * mesh->n_vertices);
  alt = malloc (sizeof *alt * mesh->n_vertices);
  if (pl == NULL || alt == NULL)
    {
      st = DF_E_NOMEM;
      goto out;
    }
  for (size_t v = 0; v < mesh->n_vertices; v++)
    if (sc.used[v])
      {
        double r = hypot (mesh->vertices[v][0], mesh->vertices[v][1]);

        pl[n] = (place) { mesh->vertices[v][2], r, v };
        alt[n++] = (place) { r, mesh->vertices[v][2], v };
        r_max = fmax (r_max, r);
      }
  size = sc.size;
  qsort (pl, n, sizeof *pl, cmp_place);
  qsort (alt, n, sizeof *alt, cmp_place);
  /* Ordered by z unless r orders it with far less back and forth (a flat annulus). */
  by_z = variation (pl, n) <= variation (alt, n);
  if (!by_z)
    {
      place *t = pl;

      pl = alt;
      alt = t;
    }
  free (alt);
  alt = NULL;

  /* Places along the profile: runs of vertices with one key (a ring of a turned part's mesh)
   * are never split; a new place starts once the chord from the place's first run exceeds
   * 1/PROFILE_PLACES of the whole; a run on the axis is a place of its own (a pole). */
  rz = malloc (sizeof *rz * (n + 1));
  bin_start = malloc (sizeof *bin_start * (n + 2));
  if (rz == NULL || bin_start == NULL)
    {
      st = DF_E_NOMEM;
      goto out;
    }
  {
    double len = 0.0, prev[2] = { 0 }, acc = 0.0, sum[2] = { 0 };
    size_t count = 0, i = 0;

    /* First pass: the chord length of the run means. */
    for (size_t a = 0; a < n;)
      {
        size_t b = a;
        double m[2] = { 0 };

        while (b < n && pl[b].key - pl[a].key <= 1e-9 * size)
          {
            m[0] += pl[b].other;
            m[1] += pl[b].key;
            b++;
          }
        m[0] /= (double) (b - a);
        m[1] /= (double) (b - a);
        if (a > 0)
          len += hypot (m[0] - prev[0], m[1] - prev[1]);
        prev[0] = m[0];
        prev[1] = m[1];
        a = b;
      }
    while (i < n)
      {
        size_t b = i;
        double m[2] = { 0 }, step;
        bool on_axis;

        while (b < n && pl[b].key - pl[i].key <= 1e-9 * size)
          {
            m[0] += pl[b].other;
            m[1] += pl[b].key;
            b++;
          }
        m[0] /= (double) (b - i);
        m[1] /= (double) (b - i);
        on_axis = (by_z ? m[0] : m[1]) <= AXIS_REL * r_max;
        step = count > 0 ? hypot (m[0] - prev[0], m[1] - prev[1]) : 0.0;
        if (count > 0 && (on_axis || acc + step > len / PROFILE_PLACES))
          {
            rz[nb][0] = by_z ? sum[0] / count : sum[1] / count;
            rz[nb][1] = by_z ? sum[1] / count : sum[0] / count;
            nb++;
            count = 0;
            acc = 0.0;
            sum[0] = sum[1] = 0.0;
          }
        if (count > 0)
          acc += step;
        if (count == 0)
          bin_start[nb] = i;
        sum[0] += m[0] * (double) (b - i);
        sum[1] += m[1] * (double) (b - i);
        count += b - i;
        prev[0] = m[0];
        prev[1] = m[1];
        i = b;
        if (on_axis)
          {
            rz[nb][0] = 0.0;
            rz[nb][1] = by_z ? sum[1] / count : sum[0] / count;
            nb++;
            count = 0;
            acc = 0.0;
            sum[0] = sum[1] = 0.0;
          }
      }
    if (count > 0)
      {
        rz[nb][0] = by_z ? sum[0] / count : sum[1] / count;
        rz[nb][1] = by_z ? sum[1] / count : sum[0] / count;
        nb++;
      }
    bin_start[nb] = n;
  }
  st = df_fit_profile ((const double (*)[2]) rz, nb, tolerance, out, &fi, diag);
  if (st != DF_OK)
    {
      if (diag != NULL && diag->index >= 0 && (size_t) diag->index < nb)
        {
          char detail[sizeof diag->detail];

          memcpy (detail, diag->detail, sizeof detail);
          df_diag_fail (diag, st, -1, "the vertices' profile at (r, z) = (%.6g, %.6g): %s",
                        rz[diag->index][0], rz[diag->index][1], detail);
        }
      goto out;
    }

  /* Each vertex's distance from the fitted profile, and its departure from the mean distance
   * at its place (the part out of round). */
  df_fn_get_domain (*out, dom);
  s_at = malloc (sizeof *s_at * nb);
  dist = malloc (sizeof *dist * n);
  if (s_at == NULL || dist == NULL)
    {
      st = DF_E_NOMEM;
      goto out;
    }
  {
    double chord = 0.0, total = 0.0, sum2 = 0.0, sym2 = 0.0;

    for (size_t k = 1; k < nb; k++)
      total += hypot (rz[k][0] - rz[k - 1][0], rz[k][1] - rz[k - 1][1]);
    fi.max = 0.0;
    fi.symmetry_max = 0.0;
    for (size_t k = 0; k < nb; k++)
      {
        double mean = 0.0;

        if (k > 0)
          chord += hypot (rz[k][0] - rz[k - 1][0], rz[k][1] - rz[k - 1][1]);
        s_at[k] = total > 0.0 ? chord / total * dom[1] : 0.0;
        project (*out, dom[1], rz[k], &s_at[k]);
        for (size_t i = bin_start[k]; i < bin_start[k + 1]; i++)
          {
            const double *x = mesh->vertices[pl[i].v];
            double q[2] = { pl[i].key, pl[i].other }, s = s_at[k];

            if (by_z)
              {
                q[0] = pl[i].other;
                q[1] = pl[i].key;
              }
            dist[i] = project (*out, dom[1], q, &s);
            mean += dist[i] / (double) (bin_start[k + 1] - bin_start[k]);
            sum2 += dist[i] * dist[i];
            if (fabs (dist[i]) >= fi.max)
              {
                fi.max = fabs (dist[i]);
                memcpy (fi.max_at, x, sizeof fi.max_at);
              }
          }
        for (size_t i = bin_start[k]; i < bin_start[k + 1]; i++)
          {
            double e = dist[i] - mean;

            sym2 += e * e;
            if (fabs (e) >= fi.symmetry_max)
              {
                fi.symmetry_max = fabs (e);
                memcpy (fi.symmetry_max_at, mesh->vertices[pl[i].v], sizeof fi.symmetry_max_at);
              }
          }
      }
    fi.points = n;
    fi.rms = sqrt (sum2 / (double) n);
    fi.has_symmetry = true;
    fi.symmetry_rms = sqrt (sym2 / (double) n);
    if (!isfinite (fi.rms) || !isfinite (fi.symmetry_rms))
      {
        st = df_diag_fail (diag, DF_E_NONFINITE, -1, "the distances of the vertices from the "
                           "fitted profile are not finite");
        goto out;
      }
  }
  df_fit_set_info (*out, &fi);
  if (info != NULL)
    *info = fi;
out:
  if (st != DF_OK && *out != NULL)
    {
      df_fn_free (*out);
      *out = NULL;
    }
  free (sc.used);
  free (pl);
  free (alt);
  free (rz);
  free (bin_start);
  free (s_at);
  free (dist);
  return st;
}
