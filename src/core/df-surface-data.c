/* df-surface-data.c: the [surface] keys of a surface fitted to data (profile=, heights=,
 * mesh=, fit-tolerance=, data-sha256=, placement-rotate-deg=, placement-offset=) and the
 * build of the fitted surface: read the file (CSV or a triangle mesh through assimp), place the
 * points, fit them (df-fit.h, df-fit-mesh.h). Reader layer: GLib; the fits stay in the core. */
#include <math.h>
#include <string.h>

#include "df-data-csv.h"
#include "df-fit-mesh.h"
#include "df-glib.h"
#include "df-io-error.h"
#include "df-mesh-read.h"
#include "df-surface-spec-private.h"
#include "df-units.h"

#define GROUP_SURFACE "surface"

/* fit-tolerance: a length >= 0, or DF_FIT_TOLERANCE_AUTO when absent. */
static gboolean
parse_fit_tolerance (const df_surface_spec *spec, double *tol, GError **error)
{
  char *end = NULL;

  *tol = DF_FIT_TOLERANCE_AUTO;
  if (spec->fit_tolerance_text == NULL)
    return TRUE;
  *tol = g_ascii_strtod (spec->fit_tolerance_text, &end);
  if (end == spec->fit_tolerance_text || *end != '\0' || !isfinite (*tol) || *tol < 0.0)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE, "fit-tolerance: '%s' is not a "
                   "length >= 0", spec->fit_tolerance_text);
      return FALSE;
    }
  return TRUE;
}

/* "A,B,C": three finite numbers separated by commas. */
static gboolean
parse_triple (const char *key, const char *text, double out[3], GError **error)
{
  g_auto (GStrv) parts = g_strsplit (text, ",", -1);

  if (g_strv_length (parts) != 3)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: expected three numbers "
                   "separated by commas, found '%s'", key, text);
      return FALSE;
    }
  for (int k = 0; k < 3; k++)
    {
      char *end = NULL;
      g_autofree char *t = g_strstrip (g_strdup (parts[k]));

      out[k] = g_ascii_strtod (t, &end);
      if (t[0] == '\0' || *end != '\0' || !isfinite (out[k]))
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: number %d ('%s') is not a "
                       "finite number", key, k + 1, t);
          return FALSE;
        }
    }
  return TRUE;
}

/* The placement p' = Rz Ry Rx p + offset as a 3 x 3 matrix and the offset; identity when
 * the spec has none. */
static gboolean
placement_of (const df_surface_spec *spec, double rot[3][3], double offset[3], GError **error)
{
  double deg[3] = { 0 }, c[3], s[3];

  memset (offset, 0, 3 * sizeof (double));
  if (spec->placement_rotate_text != NULL
      && !parse_triple ("placement-rotate-deg", spec->placement_rotate_text, deg, error))
    return FALSE;
  if (spec->placement_offset_text != NULL
      && !parse_triple ("placement-offset", spec->placement_offset_text, offset, error))
    return FALSE;
  for (int k = 0; k < 3; k++)
    {
      c[k] = cos (deg[k] * G_PI / 180.0);
      s[k] = sin (deg[k] * G_PI / 180.0);
    }
  /* Rz Ry Rx, written out (rotations about the fixed axes, x first). */
  rot[0][0] = c[2] * c[1];
  rot[0][1] = c[2] * s[1] * s[0] - s[2] * c[0];
  rot[0][2] = c[2] * s[1] * c[0] + s[2] * s[0];
  rot[1][0] = s[2] * c[1];
  rot[1][1] = s[2] * s[1] * s[0] + c[2] * c[0];
  rot[1][2] = s[2] * s[1] * c[0] - c[2] * s[0];
  rot[2][0] = -s[1];
  rot[2][1] = c[1] * s[0];
  rot[2][2] = c[1] * c[0];
  return TRUE;
}

static void
place_points (double (*p)[3], gsize n, const double rot[3][3], const double offset[3])
{
  for (gsize i = 0; i < n; i++)
    {
      double q[3];

      for (int r = 0; r < 3; r++)
        q[r] = rot[r][0] * p[i][0] + rot[r][1] * p[i][1] + rot[r][2] * p[i][2] + offset[r];
      memcpy (p[i], q, sizeof q);
    }
}

/* The fitted function from a mesh file, its complaints naming the file. */
static df_status
fit_mesh (const df_surface_spec *spec, const char *path, double tol, const double rot[3][3],
          const double offset[3], df_fn **fn, df_diag *diag, GError **error)
{
  df_mesh_data mesh = { 0 };
  df_fit_mesh_input in;
  df_status st;

  if (!df_mesh_data_read (path, &mesh, error))
    return DF_E_INPUT;
  place_points (mesh.vertices, mesh.n_vertices, rot, offset);
  in = (df_fit_mesh_input) { (const double (*)[3]) mesh.vertices, mesh.n_vertices,
                             (const unsigned (*)[3]) mesh.triangles, mesh.n_triangles,
                             mesh.n_other_faces, mesh.first_other_face };
  if (spec->kind == DF_SURFACE_REVOLUTION)
    st = df_fit_mesh_revolution (&in, tol, fn, NULL, diag);
  else
    st = df_fit_mesh_graph (&in, tol, fn, NULL, diag);
  df_mesh_data_clear (&mesh);
  if (st != DF_OK)
    g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY, "%s: %s", path,
                 st == DF_E_NOMEM ? "out of memory" : diag->detail);
  return st;
}

/* Reads the data file and fits it; fit complaints name the file and line of the row. */
df_surface *
_df_surface_spec_build_data (const df_surface_spec *spec, GError **error)
{
  static const char *const rz[] = { "r", "z" };
  static const char *const xyz[] = { "x", "y", "z" };
  gboolean rev = spec->kind == DF_SURFACE_REVOLUTION;
  g_autofree char *path = df_surface_spec_data_file (spec);
  g_autofree double *v = NULL;
  g_autofree guint *lines = NULL;
  gsize n = 0;
  double tol, dom[4], rot[3][3], offset[3];
  df_fn *fn = NULL;
  df_surface *surface = NULL;
  df_diag diag;
  df_status st;

  df_diag_clear (&diag);
  if (!parse_fit_tolerance (spec, &tol, error) || !placement_of (spec, rot, offset, error))
    return NULL;
  if (g_strcmp0 (spec->data_key, "mesh") == 0)
    {
      if (fit_mesh (spec, path, tol, (const double (*)[3]) rot, offset, &fn, &diag, error)
          != DF_OK)
        return NULL;
    }
  else
    {
      if (!df_data_csv_read (path, rev ? rz : xyz, rev ? 2 : 3, &v, &n, &lines, error))
        return NULL;
      if (!rev)
        place_points ((double (*)[3]) v, n, (const double (*)[3]) rot, offset);
      if (rev)
        st = df_fit_profile ((const double (*)[2]) v, n, tol, &fn, NULL, &diag);
      else
        st = df_fit_grid ((const double (*)[3]) v, n, tol, &fn, NULL, &diag);
      if (st != DF_OK)
        {
          if (diag.index >= 0 && (gsize) diag.index < n)
            g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY, "%s:%u: %s", path,
                         lines[diag.index], diag.detail);
          else
            g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY, "%s: %s", path,
                         st == DF_E_NOMEM ? "out of memory" : diag.detail);
          return NULL;
        }
    }
  df_fn_get_domain (fn, dom);
  if (rev)
    st = df_surface_new_revolution_fn (fn, dom[0], dom[1], &surface, &diag);
  else
    st = df_surface_new_graph_fn (fn, dom[0], dom[1], dom[2], dom[3], &surface, &diag);
  if (st != DF_OK)
    {
      df_status_to_gerror (st, &diag, error);
      g_prefix_error (error, "%s: the fitted surface: ", path);
      return NULL;
    }
  return surface;
}

gboolean
_df_surface_spec_check_data_units (const df_surface_spec *spec, const char *source,
                                   GError **error)
{
  df_unit unit;

  if (spec->units != NULL && df_unit_from_name (spec->units, &unit))
    return TRUE;
  g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE, "%s: [%s] units: '%s' is not a unit of "
               "length driftframe converts (mm, cm, m, in): a data file's numbers need one",
               source, GROUP_SURFACE, spec->units != NULL ? spec->units : "");
  return FALSE;
}

/* One optional placement key: its text kept as written, checked now. */
static gboolean
read_placement_key (GKeyFile *key_file, const char *source, const char *key, char **out,
                    GError **error)
{
  double v[3];

  if (!g_key_file_has_key (key_file, GROUP_SURFACE, key, NULL))
    return TRUE;
  *out = _df_key_file_get_text (key_file, GROUP_SURFACE, key, TRUE, source, error);
  if (*out == NULL)
    return FALSE;
  if (!parse_triple (key, *out, v, error))
    {
      g_prefix_error (error, "%s: [%s] ", source, GROUP_SURFACE);
      return FALSE;
    }
  return TRUE;
}

/* profile= / heights= / mesh= and fit-tolerance=: a data surface names its file instead of
 * the formulas and ranges, and may not have both. */
gboolean
_df_surface_spec_read_data_keys (GKeyFile *key_file, const char *source, df_surface_spec *spec,
                                 const char *kind, GError **error)
{
  gboolean rev = spec->kind == DF_SURFACE_REVOLUTION;
  const char *key = rev ? "profile" : "heights", *other = rev ? "heights" : "profile";
  static const char *const formula_keys[] = { "r", "z", "t-min", "t-max", "x-min", "x-max",
                                              "y-min", "y-max", NULL };
  static const char *const placement_keys[] = { "placement-rotate-deg", "placement-offset",
                                                NULL };

  if (g_key_file_has_key (key_file, GROUP_SURFACE, other, NULL))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: [%s] %s: not a key of a %s "
                   "surface (use %s= or mesh=)", source, GROUP_SURFACE, other, kind, key);
      return FALSE;
    }
  if (g_key_file_has_key (key_file, GROUP_SURFACE, "mesh", NULL))
    {
      if (g_key_file_has_key (key_file, GROUP_SURFACE, key, NULL))
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: [%s] mesh: a surface has "
                       "one data file (%s= or mesh=, not both)", source, GROUP_SURFACE, key);
          return FALSE;
        }
      key = "mesh";
    }
  if (!g_key_file_has_key (key_file, GROUP_SURFACE, key, NULL))
    {
      static const char *const only_data[] = { "fit-tolerance", "placement-rotate-deg",
                                               "placement-offset", NULL };

      for (int i = 0; only_data[i] != NULL; i++)
        if (g_key_file_has_key (key_file, GROUP_SURFACE, only_data[i], NULL))
          {
            g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: [%s] %s: only for a "
                         "surface from data (%s=FILE or mesh=FILE)", source, GROUP_SURFACE,
                         only_data[i], key);
            return FALSE;
          }
      return TRUE;
    }
  for (int i = 0; formula_keys[i] != NULL; i++)
    if (g_key_file_has_key (key_file, GROUP_SURFACE, formula_keys[i], NULL))
      {
        g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: [%s] %s: a surface from data "
                     "(%s=) has no formulas or ranges", source, GROUP_SURFACE,
                     formula_keys[i], key);
        return FALSE;
      }
  for (int i = 0; g_str_equal (key, "profile") && placement_keys[i] != NULL; i++)
    if (g_key_file_has_key (key_file, GROUP_SURFACE, placement_keys[i], NULL))
      {
        g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: [%s] %s: a profile table "
                     "(r, z) has no placement; it is for heights= and mesh=", source,
                     GROUP_SURFACE, placement_keys[i]);
        return FALSE;
      }
  spec->data_key = g_strdup (key);
  spec->data_path = _df_key_file_get_text (key_file, GROUP_SURFACE, key, TRUE, source, error);
  if (spec->data_path == NULL)
    return FALSE;
  if (_df_text_is_blank (spec->data_path))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: [%s] %s: no file named",
                   source, GROUP_SURFACE, key);
      return FALSE;
    }
  if (g_str_equal (key, "mesh") && df_mesh_data_hint (spec->data_path) == NULL)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: [%s] mesh: '%s': a mesh file "
                   "ends in .stl, .obj or .ply", source, GROUP_SURFACE, spec->data_path);
      return FALSE;
    }
  spec->base_dir = g_path_get_dirname (source);
  {
    g_autofree char *path = df_surface_spec_data_file (spec);
    g_autofree char *saved = _df_key_file_get_text (key_file, GROUP_SURFACE, "data-sha256",
                                                    FALSE, source, NULL);

    spec->data_sha256 = df_data_file_sha256 (path, error);
    if (spec->data_sha256 == NULL)
      {
        g_prefix_error (error, "%s: [%s] %s: ", source, GROUP_SURFACE, key);
        return FALSE;
      }
    if (saved != NULL && g_ascii_strcasecmp (saved, spec->data_sha256) != 0)
      {
        g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE, "%s: [%s] %s: the data file %s has "
                     "changed since this file was saved (SHA-256 %.12s... now, %.12s... then): "
                     "check it and import it again; it is not re-fitted silently", source,
                     GROUP_SURFACE, key, path, spec->data_sha256, saved);
        return FALSE;
      }
  }
  if (g_key_file_has_key (key_file, GROUP_SURFACE, "fit-tolerance", NULL))
    {
      double tol;

      spec->fit_tolerance_text = _df_key_file_get_text (key_file, GROUP_SURFACE,
                                                        "fit-tolerance", TRUE, source, error);
      if (spec->fit_tolerance_text == NULL)
        return FALSE;
      if (!parse_fit_tolerance (spec, &tol, error))
        {
          g_prefix_error (error, "%s: [%s] ", source, GROUP_SURFACE);
          return FALSE;
        }
    }
  return read_placement_key (key_file, source, "placement-rotate-deg",
                             &spec->placement_rotate_text, error)
         && read_placement_key (key_file, source, "placement-offset",
                                &spec->placement_offset_text, error);
}

/* The data points as fitted (placement applied), for showing them over the fit. */
gboolean
df_surface_spec_read_data_points (const df_surface_spec *spec, double (**xyz)[3], gsize *n,
                                  GError **error)
{
  static const char *const rz[] = { "r", "z" };
  static const char *const cols[] = { "x", "y", "z" };
  gboolean rev = spec->kind == DF_SURFACE_REVOLUTION;
  g_autofree char *path = df_surface_spec_data_file (spec);
  g_autofree double *v = NULL;
  double rot[3][3], offset[3];
  gsize m = 0;

  *xyz = NULL;
  *n = 0;
  if (path == NULL)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE, "the surface has no data file");
      return FALSE;
    }
  if (!placement_of (spec, rot, offset, error))
    return FALSE;
  if (g_strcmp0 (spec->data_key, "mesh") == 0)
    {
      df_mesh_data mesh = { 0 };

      if (!df_mesh_data_read (path, &mesh, error))
        return FALSE;
      place_points (mesh.vertices, mesh.n_vertices, (const double (*)[3]) rot, offset);
      *xyz = g_steal_pointer (&mesh.vertices);
      *n = mesh.n_vertices;
      df_mesh_data_clear (&mesh);
      return TRUE;
    }
  if (!df_data_csv_read (path, rev ? rz : cols, rev ? 2 : 3, &v, &m, NULL, error))
    return FALSE;
  if (rev)
    {
      double (*p)[3] = g_malloc_n (MAX (m, 1), sizeof (double[3]));

      /* A profile point (r, z) lies in the half-plane phi = 0. */
      for (gsize i = 0; i < m; i++)
        {
          p[i][0] = v[2 * i];
          p[i][1] = 0;
          p[i][2] = v[2 * i + 1];
        }
      *xyz = p;
    }
  else
    {
      place_points ((double (*)[3]) v, m, (const double (*)[3]) rot, offset);
      *xyz = (double (*)[3]) g_steal_pointer (&v);
    }
  *n = m;
  return TRUE;
}
