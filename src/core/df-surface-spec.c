/* df-surface-spec.c: the editable description of a surface (formulas, ranges, parameters,
 * units): construction, compilation into a df_surface, and its GLib key file form.
 * Reader/writer layer: GLib; geometry itself is left to the core (df-surface.c). */
#include "df-surface-spec.h"

#include <math.h>
#include <string.h>

#include "df-data-csv.h"
#include "df-fit.h"
#include "df-glib.h"
#include "df-mesh-read.h"
#include "df-surface-spec-private.h"

#define GROUP_SURFACE    "surface"
#define GROUP_PARAMETERS "parameters"

static const char *const range_keys[2][4] = {
  [DF_SURFACE_REVOLUTION] = { "t-min", "t-max", NULL, NULL },
  [DF_SURFACE_GRAPH] = { "x-min", "x-max", "y-min", "y-max" },
};

static df_surface_spec *
spec_alloc (df_surface_type kind)
{
  df_surface_spec *spec = g_new0 (df_surface_spec, 1);

  spec->kind = kind;
  spec->params = df_params_new ();
  spec->units = g_strdup ("mm");
  return spec;
}

df_surface_spec *
df_surface_spec_new_revolution (const char *r_text, const char *z_text,
                                const char *t_min_text, const char *t_max_text)
{
  df_surface_spec *spec = spec_alloc (DF_SURFACE_REVOLUTION);

  spec->r_text = g_strdup (r_text);
  spec->z_text = g_strdup (z_text);
  spec->range_text[0] = g_strdup (t_min_text);
  spec->range_text[1] = g_strdup (t_max_text);
  return spec;
}

df_surface_spec *
df_surface_spec_new_graph (const char *z_text,
                           const char *x_min_text, const char *x_max_text,
                           const char *y_min_text, const char *y_max_text)
{
  df_surface_spec *spec = spec_alloc (DF_SURFACE_GRAPH);

  spec->z_text = g_strdup (z_text);
  spec->range_text[0] = g_strdup (x_min_text);
  spec->range_text[1] = g_strdup (x_max_text);
  spec->range_text[2] = g_strdup (y_min_text);
  spec->range_text[3] = g_strdup (y_max_text);
  return spec;
}

df_surface_spec *
df_surface_spec_copy (const df_surface_spec *spec)
{
  df_surface_spec *copy;

  g_return_val_if_fail (spec != NULL, NULL);
  copy = g_new0 (df_surface_spec, 1);
  copy->kind = spec->kind;
  copy->preset = g_strdup (spec->preset);
  copy->r_text = g_strdup (spec->r_text);
  copy->z_text = g_strdup (spec->z_text);
  for (int i = 0; i < 4; i++)
    copy->range_text[i] = g_strdup (spec->range_text[i]);
  copy->params = spec->params != NULL ? df_params_copy (spec->params) : df_params_new ();
  copy->units = g_strdup (spec->units);
  copy->t_units = g_strdup (spec->t_units);
  copy->data_key = g_strdup (spec->data_key);
  copy->data_path = g_strdup (spec->data_path);
  copy->base_dir = g_strdup (spec->base_dir);
  copy->fit_tolerance_text = g_strdup (spec->fit_tolerance_text);
  copy->data_sha256 = g_strdup (spec->data_sha256);
  copy->placement_rotate_text = g_strdup (spec->placement_rotate_text);
  copy->placement_offset_text = g_strdup (spec->placement_offset_text);
  return copy;
}

void
df_surface_spec_free (df_surface_spec *spec)
{
  if (spec == NULL)
    return;
  g_free (spec->preset);
  g_free (spec->r_text);
  g_free (spec->z_text);
  for (int i = 0; i < 4; i++)
    g_free (spec->range_text[i]);
  df_params_free (spec->params);
  g_free (spec->units);
  g_free (spec->t_units);
  g_free (spec->data_key);
  g_free (spec->data_path);
  g_free (spec->base_dir);
  g_free (spec->fit_tolerance_text);
  g_free (spec->data_sha256);
  g_free (spec->placement_rotate_text);
  g_free (spec->placement_offset_text);
  g_free (spec);
}

/* Parses one formula; errors are prefixed with the key ("r: column 5: ..."). */
static df_expr *
compile_formula (const df_surface_spec *spec, const char *key, const char *text,
                 GError **error)
{
  static const char *const rev_vars[] = { "t" };
  static const char *const graph_vars[] = { "x", "y" };
  gboolean rev = spec->kind == DF_SURFACE_REVOLUTION;
  df_expr *expr;

  if (_df_text_is_blank (text))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: the formula is empty", key);
      return NULL;
    }
  expr = df_expr_parse (text, rev ? rev_vars : graph_vars, rev ? 1 : 2, spec->params, NULL,
                        error);
  if (expr == NULL)
    g_prefix_error (error, "%s: ", key);
  return expr;
}

/* Parses the formulas and evaluates the ranges; every message names its key. */
static gboolean
compile_spec (const df_surface_spec *spec, df_expr **r_out, df_expr **z_out, double range[4],
              GError **error)
{
  g_autoptr (df_expr) r = NULL;
  g_autoptr (df_expr) z = NULL;
  gboolean rev = spec->kind == DF_SURFACE_REVOLUTION;
  int n_ranges = rev ? 2 : 4;

  if (spec->kind != DF_SURFACE_REVOLUTION && spec->kind != DF_SURFACE_GRAPH)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE, "kind: unknown surface kind %d",
                   (int) spec->kind);
      return FALSE;
    }
  if (rev)
    {
      r = compile_formula (spec, "r", spec->r_text, error);
      if (r == NULL)
        return FALSE;
    }
  z = compile_formula (spec, "z", spec->z_text, error);
  if (z == NULL)
    return FALSE;

  for (int i = 0; i < n_ranges; i++)
    {
      const char *key = range_keys[spec->kind][i];
      const char *text = spec->range_text[i];

      if (_df_text_is_blank (text))
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: no value given", key);
          return FALSE;
        }
      if (!df_expr_parse_value (text, spec->params, &range[i], NULL, error))
        {
          g_prefix_error (error, "%s: ", key);
          return FALSE;
        }
      if (!isfinite (range[i]))
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE, "%s: the value is not finite",
                       key);
          return FALSE;
        }
    }
  for (int i = 0; i < n_ranges; i += 2)
    if (!(range[i] < range[i + 1]))
      {
        g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                     "%s: must be greater than %s (%.10g), is %.10g", range_keys[spec->kind][i + 1],
                     range_keys[spec->kind][i], range[i], range[i + 1]);
        return FALSE;
      }

  if (r_out != NULL)
    *r_out = g_steal_pointer (&r);
  if (z_out != NULL)
    *z_out = g_steal_pointer (&z);
  return TRUE;
}

df_surface_spec *
df_surface_spec_new_data (df_surface_type kind, const char *path,
                          const char *fit_tolerance_text)
{
  df_surface_spec *spec = spec_alloc (kind);

  spec->data_key = g_strdup (df_mesh_data_hint (path) != NULL    ? "mesh"
                             : kind == DF_SURFACE_REVOLUTION ? "profile"
                                                             : "heights");
  spec->data_path = g_strdup (path);
  spec->fit_tolerance_text = g_strdup (fit_tolerance_text);
  return spec;
}

char *
df_surface_spec_data_file (const df_surface_spec *spec)
{
  if (spec->data_path == NULL)
    return NULL;
  if (g_path_is_absolute (spec->data_path) || spec->base_dir == NULL)
    return g_strdup (spec->data_path);
  return g_build_filename (spec->base_dir, spec->data_path, NULL);
}

df_surface *
df_surface_spec_build (const df_surface_spec *spec, GError **error)
{
  df_expr *r = NULL, *z = NULL;
  double range[4] = { 0 };
  df_surface *surface = NULL;
  df_diag diag;
  df_status status;

  g_return_val_if_fail (spec != NULL, NULL);
  if (!_df_preset_check_params (spec, error))
    return NULL;
  if (spec->data_key != NULL)
    return _df_surface_spec_build_data (spec, error);
  if (!compile_spec (spec, &r, &z, range, error))
    return NULL;

  df_diag_clear (&diag);
  /* The constructors take ownership of the formulas, also on failure. */
  if (spec->kind == DF_SURFACE_REVOLUTION)
    status = df_surface_new_revolution (r, z, range[0], range[1], &surface, &diag);
  else
    status = df_surface_new_graph (z, range[0], range[1], range[2], range[3], &surface, &diag);
  if (status != DF_OK)
    {
      df_status_to_gerror (status, &diag, error);
      return NULL;
    }
  return surface;
}

const char *
df_surface_spec_t_units (const df_surface_spec *spec)
{
  g_return_val_if_fail (spec != NULL, NULL);
  if (spec->kind != DF_SURFACE_REVOLUTION)
    return NULL;
  if (spec->data_key != NULL || g_strcmp0 (spec->t_units, "length") == 0)
    return spec->units != NULL ? spec->units : "mm";
  return spec->t_units;
}

/* The keys a [surface] group may have; anything else is a typo worth reporting. */
static gboolean
is_surface_key (const char *key)
{
  static const char *const keys[] = { "kind", "preset", "r", "z", "t-min", "t-max", "x-min",
                                      "x-max", "y-min", "y-max", "units", "t-units", "profile", "heights",
                                      "mesh", "fit-tolerance", "data-sha256",
                                      "placement-rotate-deg", "placement-offset", NULL };

  return g_strv_contains (keys, key);
}

df_surface_spec *
df_surface_spec_from_key_file (GKeyFile *key_file, const char *source, GError **error)
{
  g_autoptr (df_surface_spec) spec = NULL;
  g_auto (GStrv) keys = NULL;
  g_autofree char *kind = NULL;
  df_surface_type type;
  GError *local = NULL;

  g_return_val_if_fail (key_file != NULL, NULL);
  if (source == NULL)
    source = "surface";

  if (!g_key_file_has_group (key_file, GROUP_SURFACE))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: missing group [%s]", source,
                   GROUP_SURFACE);
      return NULL;
    }
  keys = g_key_file_get_keys (key_file, GROUP_SURFACE, NULL, NULL);
  for (gsize i = 0; keys != NULL && keys[i] != NULL; i++)
    if (!is_surface_key (keys[i]))
      {
        g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                     "%s: [%s] unknown key '%s' (known: kind, preset, r, z, t-min, t-max, "
                     "x-min, x-max, y-min, y-max, units, t-units, profile, heights, mesh, "
                     "fit-tolerance, "
                     "data-sha256, placement-rotate-deg, placement-offset)", source,
                     GROUP_SURFACE, keys[i]);
        return NULL;
      }

  kind = _df_key_file_get_text (key_file, GROUP_SURFACE, "kind", TRUE, source, error);
  if (kind == NULL)
    return NULL;
  if (g_str_equal (kind, "revolution"))
    type = DF_SURFACE_REVOLUTION;
  else if (g_str_equal (kind, "graph"))
    type = DF_SURFACE_GRAPH;
  else
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                   "%s: [%s] kind: unknown kind '%s' (expected revolution or graph)", source,
                   GROUP_SURFACE, kind);
      return NULL;
    }

  spec = spec_alloc (type);
  if (!_df_surface_spec_read_data_keys (key_file, source, spec, kind, error))
    return NULL;
  if (spec->data_key != NULL)
    ;
  else if (type == DF_SURFACE_REVOLUTION)
    {
      spec->r_text = _df_key_file_get_text (key_file, GROUP_SURFACE, "r", TRUE, source, error);
      if (spec->r_text == NULL)
        return NULL;
    }
  else if (g_key_file_has_key (key_file, GROUP_SURFACE, "r", NULL))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                   "%s: [%s] r: a graph has no r (it is z = f(x, y))", source, GROUP_SURFACE);
      return NULL;
    }
  if (spec->data_key == NULL)
    {
      spec->z_text = _df_key_file_get_text (key_file, GROUP_SURFACE, "z", TRUE, source, error);
      if (spec->z_text == NULL)
        return NULL;
    }
  for (int i = 0; spec->data_key == NULL && i < 4 && range_keys[type][i] != NULL; i++)
    {
      spec->range_text[i] = _df_key_file_get_text (key_file, GROUP_SURFACE, range_keys[type][i],
                                                   TRUE, source, error);
      if (spec->range_text[i] == NULL)
        return NULL;
    }
  /* The other kind's range keys would be silently ignored: say so instead. */
  for (int i = 0; i < 4; i++)
    {
      const char *other = range_keys[type == DF_SURFACE_GRAPH ? DF_SURFACE_REVOLUTION
                                                              : DF_SURFACE_GRAPH][i];

      if (other != NULL && g_key_file_has_key (key_file, GROUP_SURFACE, other, NULL))
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                       "%s: [%s] %s: not a key of a %s surface", source, GROUP_SURFACE, other,
                       kind);
          return NULL;
        }
    }

  spec->preset = _df_key_file_get_text (key_file, GROUP_SURFACE, "preset", FALSE, source,
                                        &local);
  if (local != NULL)
    {
      g_propagate_error (error, local);
      return NULL;
    }
  if (g_key_file_has_key (key_file, GROUP_SURFACE, "units", NULL))
    {
      g_free (spec->units);
      spec->units = _df_key_file_get_text (key_file, GROUP_SURFACE, "units", TRUE, source, error);
      if (spec->units == NULL)
        return NULL;
    }
  if (spec->data_key != NULL && !_df_surface_spec_check_data_units (spec, source, error))
    return NULL;
  if (g_key_file_has_key (key_file, GROUP_SURFACE, "t-units", NULL))
    {
      g_free (spec->t_units);
      spec->t_units = _df_key_file_get_text (key_file, GROUP_SURFACE, "t-units", TRUE, source,
                                             error);
      if (spec->t_units == NULL)
        return NULL;
      /* A fitted profile's t is its arc length; a graph has no t. */
      if (type != DF_SURFACE_REVOLUTION || spec->data_key != NULL)
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                       "%s: [%s] t-units: only for a surface of revolution given by formulas "
                       "(a fitted profile's t is its arc length, in units)", source,
                       GROUP_SURFACE);
          return NULL;
        }
      if (spec->t_units[0] == '\0' || strlen (spec->t_units) > 16
          || !g_utf8_validate (spec->t_units, -1, NULL))
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                       "%s: [%s] t-units: a short label is expected (\"length\", \"rad\", "
                       "\"deg\"...), at most 16 bytes", source, GROUP_SURFACE);
          return NULL;
        }
    }

  if (g_key_file_has_group (key_file, GROUP_PARAMETERS))
    {
      g_auto (GStrv) names = g_key_file_get_keys (key_file, GROUP_PARAMETERS, NULL, NULL);

      /* g_key_file_get_keys keeps file order, which matters: a value may use earlier ones. */
      for (gsize i = 0; names != NULL && names[i] != NULL; i++)
        {
          g_autofree char *text = _df_key_file_get_text (key_file, GROUP_PARAMETERS, names[i],
                                                         TRUE, source, error);

          if (text == NULL)
            return NULL;
          if (!df_params_set (spec->params, names[i], text, error))
            {
              g_prefix_error (error, "%s: [%s] %s: ", source, GROUP_PARAMETERS, names[i]);
              return NULL;
            }
        }
    }

  /* Check formulas and ranges now, so a bad file is refused with its key named; the
   * geometric checks (r >= 0, regular profile) happen in df_surface_spec_build. */
  if (spec->data_key == NULL && !compile_spec (spec, NULL, NULL, (double[4]) { 0 }, error))
    {
      g_prefix_error (error, "%s: [%s] ", source, GROUP_SURFACE);
      return NULL;
    }
  return g_steal_pointer (&spec);
}

void
df_surface_spec_to_key_file (const df_surface_spec *spec, GKeyFile *key_file)
{
  gboolean rev = spec->kind == DF_SURFACE_REVOLUTION;

  g_return_if_fail (spec != NULL && key_file != NULL);
  g_key_file_set_string (key_file, GROUP_SURFACE, "kind", rev ? "revolution" : "graph");
  if (spec->preset != NULL)
    g_key_file_set_string (key_file, GROUP_SURFACE, "preset", spec->preset);
  if (spec->data_key != NULL)
    {
      g_key_file_set_string (key_file, GROUP_SURFACE, spec->data_key, spec->data_path);
      g_autofree char *path = df_surface_spec_data_file (spec);
      g_autofree char *sha = spec->data_sha256 != NULL ? g_strdup (spec->data_sha256)
                                                       : df_data_file_sha256 (path, NULL);

      if (spec->fit_tolerance_text != NULL)
        g_key_file_set_string (key_file, GROUP_SURFACE, "fit-tolerance",
                               spec->fit_tolerance_text);
      if (sha != NULL)
        g_key_file_set_string (key_file, GROUP_SURFACE, "data-sha256", sha);
      if (spec->placement_rotate_text != NULL)
        g_key_file_set_string (key_file, GROUP_SURFACE, "placement-rotate-deg",
                               spec->placement_rotate_text);
      if (spec->placement_offset_text != NULL)
        g_key_file_set_string (key_file, GROUP_SURFACE, "placement-offset",
                               spec->placement_offset_text);
    }
  if (rev && spec->data_key == NULL)
    g_key_file_set_string (key_file, GROUP_SURFACE, "r", spec->r_text ? spec->r_text : "");
  if (spec->data_key == NULL)
    g_key_file_set_string (key_file, GROUP_SURFACE, "z", spec->z_text ? spec->z_text : "");
  for (int i = 0; spec->data_key == NULL && i < 4 && range_keys[spec->kind][i] != NULL; i++)
    g_key_file_set_string (key_file, GROUP_SURFACE, range_keys[spec->kind][i],
                           spec->range_text[i] ? spec->range_text[i] : "");
  g_key_file_set_string (key_file, GROUP_SURFACE, "units", spec->units ? spec->units : "mm");
  if (rev && spec->data_key == NULL && spec->t_units != NULL)
    g_key_file_set_string (key_file, GROUP_SURFACE, "t-units", spec->t_units);

  if (spec->params != NULL && df_params_count (spec->params) > 0)
    for (guint i = 0; i < df_params_count (spec->params); i++)
      g_key_file_set_string (key_file, GROUP_PARAMETERS, df_params_name (spec->params, i),
                             df_params_text (spec->params, i));
}

df_surface_spec *
df_surface_spec_load (const char *path, GError **error)
{
  g_autoptr (GKeyFile) key_file = NULL;

  key_file = _df_key_file_load (path, error);
  if (key_file == NULL)
    return NULL;
  if (!_df_key_file_check_groups (key_file, path, (const char *const[]) { GROUP_SURFACE,
                                                                     GROUP_PARAMETERS, NULL },
                                  NULL, error))
    return NULL;
  return df_surface_spec_from_key_file (key_file, path, error);
}

gboolean
df_surface_spec_save (const df_surface_spec *spec, const char *path, GError **error)
{
  g_autoptr (GKeyFile) key_file = g_key_file_new ();
  g_autofree char *data = NULL;
  gsize length = 0;

  g_return_val_if_fail (spec != NULL, FALSE);
  df_surface_spec_to_key_file (spec, key_file);
  g_key_file_set_comment (key_file, NULL, NULL, " driftframe surface", NULL);
  data = g_key_file_to_data (key_file, &length, NULL);
  return df_write_file_atomic (path, data, (gssize) length, error);
}

/* Key file helpers shared with df-project-file.c (df-surface-spec-private.h). */

gboolean
_df_text_is_blank (const char *text)
{
  for (; text != NULL && *text != '\0'; text++)
    if (!g_ascii_isspace (*text))
      return FALSE;
  return TRUE;
}

/* GKeyFile's parse errors quote the line but not its number, and it merges a repeated group
 * and lets a repeated key win silently. GLib stays the parser (it is the format's reference);
 * this pass runs first, over the raw text, so that each of those is refused with its line:
 * a line's shape, repeated groups and keys (naming both lines), and escapes in a value
 * (GLib 2.74 sets one GError over another for an invalid escape followed by a trailing
 * backslash, which prints a warning and is fatal under G_DEBUG=fatal-warnings). */
static gboolean
check_escapes (const char *value, const char *key, const char *source, guint lineno,
               GError **error)
{
  for (const char *s = value; *s != '\0'; s++)
    {
      if (*s != '\\')
        continue;
      if (s[1] == '\0')
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                       "%s:%u: %s: the value ends with a lone '\\' (write '\\\\' for a "
                       "backslash)", source, lineno, key);
          return FALSE;
        }
      if (strchr ("sntr\\", s[1]) == NULL)
        {
          g_autofree char *shown = g_utf8_make_valid (s + 1, g_utf8_next_char (s + 1) - (s + 1));

          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                       "%s:%u: %s: unknown escape '\\%s' (known: \\s \\n \\t \\r \\\\)", source,
                       lineno, key, shown);
          return FALSE;
        }
      s++;
    }
  return TRUE;
}

static gboolean
check_key_file_lines (const char *data, const char *source, GError **error)
{
  g_auto (GStrv) lines = g_strsplit (data, "\n", -1);
  g_autoptr (GHashTable) groups = g_hash_table_new_full (g_str_hash, g_str_equal, g_free, NULL);
  g_autoptr (GHashTable) keys = g_hash_table_new_full (g_str_hash, g_str_equal, g_free, NULL);
  g_autofree char *group = NULL;

  for (guint i = 0; lines[i] != NULL; i++)
    {
      char *line = g_strstrip (lines[i]);
      gsize len = strlen (line);
      guint lineno = i + 1;
      char *eq;

      if (len == 0 || line[0] == '#')
        continue;
      if (line[0] == '[')
        {
          gpointer first;

          if (line[len - 1] != ']' || len < 3)
            {
              g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                           "%s:%u: a group header must look like [name]", source, lineno);
              return FALSE;
            }
          g_free (group);
          group = g_strndup (line + 1, len - 2);
          if (g_hash_table_lookup_extended (groups, group, NULL, &first))
            {
              g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                           "%s:%u: group [%s] appears again (first at line %u); merge the two",
                           source, lineno, group, GPOINTER_TO_UINT (first));
              return FALSE;
            }
          g_hash_table_insert (groups, g_strdup (group), GUINT_TO_POINTER (lineno));
          g_hash_table_remove_all (keys);
          continue;
        }
      eq = strchr (line, '=');
      if (eq == NULL || line[0] == '=')
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                       "%s:%u: expected key=value, a [group] or a # comment", source, lineno);
          return FALSE;
        }
      if (group == NULL)
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                       "%s:%u: key=value before the first [group]", source, lineno);
          return FALSE;
        }
      {
        g_autofree char *key = g_strstrip (g_strndup (line, (gsize) (eq - line)));
        gpointer first;

        if (g_hash_table_lookup_extended (keys, key, NULL, &first))
          {
            g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                         "%s:%u: [%s] key '%s' is given again (first at line %u); keep one",
                         source, lineno, group, key, GPOINTER_TO_UINT (first));
            return FALSE;
          }
        if (!check_escapes (eq + 1, key, source, lineno, error))
          return FALSE;
        g_hash_table_insert (keys, g_steal_pointer (&key), GUINT_TO_POINTER (lineno));
      }
    }
  return TRUE;
}

/* The 1-based line of the byte at offset in data. */
static guint
line_of (const char *data, gsize offset)
{
  guint line = 1;

  for (gsize i = 0; i < offset; i++)
    if (data[i] == '\n')
      line++;
  return line;
}

GKeyFile *
_df_key_file_load_bytes (const char *data, gsize length, const char *source, GError **error)
{
  g_autoptr (GKeyFile) key_file = g_key_file_new ();
  g_autoptr (GError) local = NULL;
  g_autofree char *text = NULL;
  const char *nul, *bad = NULL;

  if (source == NULL)
    source = "(data)";
  /* A UTF-8 byte order mark, as some editors on Windows write, is not part of the text. */
  if (length >= 3 && memcmp (data, "\xEF\xBB\xBF", 3) == 0)
    {
      data += 3;
      length -= 3;
    }
  nul = memchr (data, '\0', length);
  if (nul != NULL)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                   "%s:%u: a NUL byte: this is not a text file", source,
                   line_of (data, (gsize) (nul - data)));
      return NULL;
    }
  if (length > DF_MAX_FILE_BYTES)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                   "%s: the file is %" G_GSIZE_FORMAT " bytes, more than the %d allowed",
                   source, length, DF_MAX_FILE_BYTES);
      return NULL;
    }
  text = g_strndup (data, length);
  if (_df_text_is_blank (text))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: the file is empty", source);
      return NULL;
    }
  if (!g_utf8_validate (text, -1, &bad))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s:%u: the file is not UTF-8 text",
                   source, line_of (text, (gsize) (bad - text)));
      return NULL;
    }
  if (!check_key_file_lines (text, source, error))
    return NULL;
  if (!g_key_file_load_from_data (key_file, text, (gsize) -1, G_KEY_FILE_NONE, &local))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: %s", source, local->message);
      return NULL;
    }
  return g_steal_pointer (&key_file);
}

GKeyFile *
_df_key_file_load_data (const char *data, const char *source, GError **error)
{
  return _df_key_file_load_bytes (data, strlen (data), source, error);
}

GKeyFile *
_df_key_file_load (const char *path, GError **error)
{
  g_autofree char *data = NULL;
  g_autoptr (GError) local = NULL;
  gsize length = 0;

  if (!g_file_get_contents (path, &data, &length, &local))
    {
      /* GLib's message already names the file. */
      g_set_error_literal (error, DF_IO_ERROR, DF_IO_ERROR_FILE, local->message);
      return NULL;
    }
  return _df_key_file_load_bytes (data, length, path, error);
}

char *
_df_key_file_get_text (GKeyFile *key_file, const char *group, const char *key,
                       gboolean required, const char *source, GError **error)
{
  g_autoptr (GError) local = NULL;
  char *value;

  if (!g_key_file_has_key (key_file, group, key, NULL))
    {
      if (required)
        g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: [%s] missing key '%s'",
                     source, group, key);
      return NULL;
    }
  value = g_key_file_get_string (key_file, group, key, &local);
  if (value == NULL)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: [%s] %s: %s", source, group,
                   key, local->message);
      return NULL;
    }
  /* An escaped line break or other control character would break the one-line places a
   * value is shown in (a text report's header, a CSV field). */
  for (const char *c = value; *c != '\0'; c++)
    if ((guchar) *c < 0x20 && *c != '\t')
      {
        g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                     "%s: [%s] %s: the value holds a line break or control character", source,
                     group, key);
        g_free (value);
        return NULL;
      }
  return g_strstrip (value);
}

gboolean
_df_key_file_check_groups (GKeyFile *key_file, const char *source, const char *const *names,
                           const char *prefix, GError **error)
{
  g_auto (GStrv) groups = g_key_file_get_groups (key_file, NULL);

  for (gsize i = 0; groups[i] != NULL; i++)
    {
      if (g_strv_contains (names, groups[i]))
        continue;
      if (prefix != NULL && g_str_has_prefix (groups[i], prefix))
        continue;
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: unknown group [%s]", source,
                   groups[i]);
      return FALSE;
    }
  return TRUE;
}
