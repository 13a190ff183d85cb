/* df-project-file.c: a project (one surface spec and its named loops) in GLib key file form
 * (`.dfproj`), read with messages naming the file, group and key, written atomically.
 * Reader/writer layer: GLib. */
#include "df-project-file.h"

#include <math.h>
#include <string.h>

#include "df-glib.h"
#include "df-limits-file.h"
#include "df-surface-spec-private.h"

#define LOOP_PREFIX "loop "
#define DEFAULT_COLOUR "#7b3fc4"
#define RECORD_GROUP "record"

df_project *
df_project_new (df_surface_spec *spec)
{
  df_project *project = g_new0 (df_project, 1);

  project->spec = spec;
  project->loops = g_ptr_array_new_with_free_func ((GDestroyNotify) df_project_loop_free);
  df_project_extras_init (&project->extras);
  project->limits = df_limits_new ();
  return project;
}

void
df_project_free (df_project *project)
{
  if (project == NULL)
    return;
  df_surface_spec_free (project->spec);
  g_ptr_array_unref (project->loops);
  g_free (project->record.title);
  g_free (project->record.part_number);
  g_free (project->record.revision);
  g_free (project->record.author);
  df_project_extras_clear (&project->extras);
  df_limits_free (project->limits);
  g_free (project);
}

void
df_project_loop_free (df_project_loop *loop)
{
  if (loop == NULL)
    return;
  g_free (loop->name);
  g_free (loop->colour);
  g_free (loop->uv);
  g_free (loop);
}

void
df_project_add_loop (df_project *project, const char *name, const char *colour,
                     gboolean show_frames, const double (*uv)[2], gsize n)
{
  df_project_loop *loop;

  g_return_if_fail (project != NULL);
  loop = g_new0 (df_project_loop, 1);
  loop->name = g_strdup (name != NULL ? name : "");
  loop->colour = g_strdup (colour != NULL ? colour : DEFAULT_COLOUR);
  loop->show_frames = show_frames;
  loop->n = n;
  loop->uv = n > 0 ? g_memdup2 (uv, n * sizeof *uv) : NULL;
  g_ptr_array_add (project->loops, loop);
}

static gboolean
is_colour (const char *text)
{
  if (strlen (text) != 7 || text[0] != '#')
    return FALSE;
  for (int i = 1; i < 7; i++)
    if (!g_ascii_isxdigit (text[i]))
      return FALSE;
  return TRUE;
}

/* A ';'-separated list of finite numbers; messages name the value's position. */
static double *
read_numbers (GKeyFile *key_file, const char *group, const char *key, const char *source,
              gsize *n_out, GError **error)
{
  g_autofree char *text = _df_key_file_get_text (key_file, group, key, TRUE, source, error);
  g_auto (GStrv) parts = NULL;
  g_autoptr (GArray) values = g_array_new (FALSE, FALSE, sizeof (double));

  if (text == NULL)
    return NULL;
  /* g_strsplit of "" gives no parts, and an empty array would read as a failure. */
  if (text[0] == '\0')
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                   "%s: [%s] %s: no values (expected numbers separated by ';')", source, group,
                   key);
      return NULL;
    }
  parts = g_strsplit (text, ";", -1);
  for (guint i = 0; parts[i] != NULL; i++)
    {
      char *part = g_strstrip (parts[i]);
      char *end = NULL;
      double x;

      /* A trailing ';' (GKeyFile's own list style) leaves one empty last part. */
      if (part[0] == '\0' && parts[i + 1] == NULL && i > 0)
        break;
      x = g_ascii_strtod (part, &end);
      if (part[0] == '\0' || end == part || *end != '\0')
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                       "%s: [%s] %s: value %u '%s' is not a number", source, group, key, i + 1,
                       part);
          return NULL;
        }
      if (!isfinite (x))
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                       "%s: [%s] %s: value %u '%s' is not a finite number", source, group, key,
                       i + 1, part);
          return NULL;
        }
      g_array_append_val (values, x);
    }
  *n_out = values->len;
  return (double *) (void *) g_array_free (g_steal_pointer (&values), FALSE);
}

static gboolean
is_loop_key (const char *key)
{
  static const char *const keys[] = { "name", "colour", "frames", "u", "v", "drape-start",
                                      "drape-warp-deg", "drape-cell", NULL };

  return g_strv_contains (keys, key);
}

/* Exactly count numbers of a ';'-list key (df-surface-spec-private.h). */
gboolean
_df_key_file_get_fixed (GKeyFile *key_file, const char *group, const char *key, const char *source,
            gsize count, double *out, GError **error)
{
  gsize n = 0;
  g_autofree double *values = read_numbers (key_file, group, key, source, &n, error);

  if (values == NULL)
    return FALSE;
  if (n != count)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: [%s] %s: expected %s, found %"
                   G_GSIZE_FORMAT " value%s", source, group, key,
                   count == 1 ? "one number" : "two numbers u;v", n, n == 1 ? "" : "s");
      return FALSE;
    }
  memcpy (out, values, count * sizeof *out);
  return TRUE;
}

/* The loop's optional drape keys (the max-shear-deg check's start, warp and cell). */
static gboolean
read_drape (GKeyFile *key_file, const char *group, const char *source,
            const df_surface *surface, df_shear_setup *d, GError **error)
{
  if (g_key_file_has_key (key_file, group, "drape-start", NULL))
    {
      if (!_df_key_file_get_fixed (key_file, group, "drape-start", source, 2, d->start, error))
        return FALSE;
      if (surface != NULL && !df_surface_contains (surface, d->start[0], d->start[1]))
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY,
                       "%s: [%s] drape-start: (%.10g, %.10g) lies outside the surface", source,
                       group, d->start[0], d->start[1]);
          return FALSE;
        }
      d->has_start = true;
    }
  if (g_key_file_has_key (key_file, group, "drape-warp-deg", NULL))
    {
      if (!_df_key_file_get_fixed (key_file, group, "drape-warp-deg", source, 1, &d->warp_deg, error))
        return FALSE;
      d->has_warp = true;
    }
  if (g_key_file_has_key (key_file, group, "drape-cell", NULL))
    {
      if (!_df_key_file_get_fixed (key_file, group, "drape-cell", source, 1, &d->cell, error))
        return FALSE;
      if (!(d->cell > 0))
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                       "%s: [%s] drape-cell: %.10g is not a positive length", source, group,
                       d->cell);
          return FALSE;
        }
      d->has_cell = true;
    }
  return TRUE;
}

static df_project_loop *
read_loop (GKeyFile *key_file, const char *group, const char *source, const df_surface *surface,
           GError **error)
{
  g_autoptr (GError) local = NULL;
  g_auto (GStrv) keys = g_key_file_get_keys (key_file, group, NULL, NULL);
  g_autofree char *name = NULL;
  g_autofree char *colour = NULL;
  g_autofree char *frames = NULL;
  g_autofree double *u = NULL;
  g_autofree double *v = NULL;
  gsize nu = 0, nv = 0;
  df_project_loop *loop;
  df_shear_setup drape = { 0 };

  for (gsize i = 0; keys != NULL && keys[i] != NULL; i++)
    if (!is_loop_key (keys[i]))
      {
        g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                     "%s: [%s] unknown key '%s' (known: name, colour, frames, u, v, "
                     "drape-start, drape-warp-deg, drape-cell)", source,
                     group, keys[i]);
        return NULL;
      }

  name = _df_key_file_get_text (key_file, group, "name", FALSE, source, &local);
  if (local == NULL)
    colour = _df_key_file_get_text (key_file, group, "colour", FALSE, source, &local);
  if (local == NULL)
    frames = _df_key_file_get_text (key_file, group, "frames", FALSE, source, &local);
  if (local != NULL)
    {
      g_propagate_error (error, g_steal_pointer (&local));
      return NULL;
    }
  if (colour != NULL && !is_colour (colour))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                   "%s: [%s] colour: '%s' is not a colour of the form #rrggbb", source, group,
                   colour);
      return NULL;
    }
  if (frames != NULL && !g_str_equal (frames, "true") && !g_str_equal (frames, "false"))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                   "%s: [%s] frames: '%s' is neither true nor false", source, group, frames);
      return NULL;
    }

  u = read_numbers (key_file, group, "u", source, &nu, error);
  if (u == NULL)
    return NULL;
  v = read_numbers (key_file, group, "v", source, &nv, error);
  if (v == NULL)
    return NULL;
  if (nu != nv)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: [%s] u: %zu values but v has %zu",
                   source, group, nu, nv);
      return NULL;
    }
  if (nu < 3)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                   "%s: [%s] u: %zu point%s, a loop needs at least 3", source, group, nu,
                   nu == 1 ? "" : "s");
      return NULL;
    }
  /* Checked only when the surface builds: a project whose formulas are being fixed still
   * opens, and the builder reports the surface's own problem. */
  for (gsize i = 0; surface != NULL && i < nu; i++)
    if (!df_surface_contains (surface, u[i], v[i]))
      {
        double u0, u1, v0, v1;

        df_surface_get_domain (surface, &u0, &u1, &v0, &v1);
        g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY,
                     "%s: [%s] point %zu (%.10g, %.10g) lies outside the surface "
                     "(u in [%.6g, %.6g], v in [%.6g, %.6g])", source, group, i + 1, u[i], v[i],
                     u0, u1, v0, v1);
        return NULL;
      }

  if (!read_drape (key_file, group, source, surface, &drape, error))
    return NULL;

  loop = g_new0 (df_project_loop, 1);
  loop->drape = drape;
  loop->name = name != NULL ? g_steal_pointer (&name) : g_strdup (group);
  loop->colour = colour != NULL ? g_steal_pointer (&colour) : g_strdup (DEFAULT_COLOUR);
  loop->show_frames = frames == NULL || g_str_equal (frames, "true");
  loop->n = nu;
  loop->uv = g_malloc_n (nu, sizeof *loop->uv);
  for (gsize i = 0; i < nu; i++)
    {
      loop->uv[i][0] = u[i];
      loop->uv[i][1] = v[i];
    }
  return loop;
}

/* Only the parts given, "%.17g" in the C locale so they reload bit for bit. */
static void
write_drape (GKeyFile *key_file, const char *group, const df_shear_setup *d)
{
  char a[G_ASCII_DTOSTR_BUF_SIZE], b[G_ASCII_DTOSTR_BUF_SIZE];

  if (d->has_start)
    {
      g_autofree char *text = g_strdup_printf ("%s;%s", g_ascii_dtostr (a, sizeof a, d->start[0]),
                                               g_ascii_dtostr (b, sizeof b, d->start[1]));

      g_key_file_set_string (key_file, group, "drape-start", text);
    }
  if (d->has_warp)
    g_key_file_set_string (key_file, group, "drape-warp-deg",
                           g_ascii_dtostr (a, sizeof a, d->warp_deg));
  if (d->has_cell)
    g_key_file_set_string (key_file, group, "drape-cell", g_ascii_dtostr (a, sizeof a, d->cell));
}

static const char *const record_keys[] = { "title", "part-number", "revision", "author", NULL };

/* The title block's keys in file order, and where each lives. */
static char **
record_slot (df_project_record *r, const char *key)
{
  if (g_str_equal (key, "title"))
    return &r->title;
  if (g_str_equal (key, "part-number"))
    return &r->part_number;
  if (g_str_equal (key, "revision"))
    return &r->revision;
  if (g_str_equal (key, "author"))
    return &r->author;
  return NULL;
}

void
df_project_copy_meta (df_project *dst, const df_project *src)
{
  for (gsize k = 0; record_keys[k] != NULL; k++)
    df_project_set_record (dst, record_keys[k],
                           *record_slot ((df_project_record *) &src->record, record_keys[k]));
  df_project_extras_copy (&dst->extras, &src->extras);
}

gboolean
df_project_set_record (df_project *project, const char *key, const char *value)
{
  char **slot = record_slot (&project->record, key);

  if (slot == NULL)
    return FALSE;
  g_free (*slot);
  *slot = _df_text_is_blank (value) ? NULL : g_strstrip (g_strdup (value));
  return TRUE;
}

static gboolean
read_record (GKeyFile *key_file, const char *source, df_project *project, GError **error)
{
  g_auto (GStrv) keys = NULL;

  if (!g_key_file_has_group (key_file, RECORD_GROUP))
    return TRUE;
  keys = g_key_file_get_keys (key_file, RECORD_GROUP, NULL, NULL);
  for (gsize i = 0; keys != NULL && keys[i] != NULL; i++)
    {
      g_autofree char *value = NULL;

      if (record_slot (&project->record, keys[i]) == NULL)
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                       "%s: [%s] unknown key '%s' (known: title, part-number, revision, author)",
                       source, RECORD_GROUP, keys[i]);
          return FALSE;
        }
      value = _df_key_file_get_text (key_file, RECORD_GROUP, keys[i], FALSE, source, error);
      if (value == NULL && error != NULL && *error != NULL)
        return FALSE;
      df_project_set_record (project, keys[i], value);
    }
  return TRUE;
}

/* skipped: NULL to fail on a bad loop; else its message is added there and the loop left out
 * (df_project_load_skipping). */
static df_project *
project_from_key_file (GKeyFile *key_file, const char *source, GPtrArray *skipped,
                       GError **error)
{
  g_autoptr (GPtrArray) groups_known = g_ptr_array_new ();
  g_autoptr (df_project) project = NULL;
  g_autoptr (df_surface) surface = NULL;
  g_auto (GStrv) groups = g_key_file_get_groups (key_file, NULL);
  df_surface_spec *spec;

  g_ptr_array_add (groups_known, (char *) "surface");
  g_ptr_array_add (groups_known, (char *) "parameters");
  g_ptr_array_add (groups_known, (char *) RECORD_GROUP);
  g_ptr_array_add (groups_known, (char *) DF_LIMITS_GROUP);
  g_ptr_array_add (groups_known, (char *) DF_UNITS_GROUP);
  for (gsize i = 0; groups[i] != NULL; i++)
    if (df_project_extras_owns_group (groups[i]))
      g_ptr_array_add (groups_known, groups[i]);
  g_ptr_array_add (groups_known, NULL);
  if (!_df_key_file_check_groups (key_file, source, (const char *const *) groups_known->pdata,
                                  LOOP_PREFIX, error))
    return NULL;
  spec = df_surface_spec_from_key_file (key_file, source, error);
  if (spec == NULL)
    return NULL;
  project = df_project_new (spec);
  if (!read_record (key_file, source, project, error))
    return NULL;
  df_limits_free (project->limits);
  project->limits = df_limits_from_key_file (key_file, source, spec->units, error);
  if (project->limits == NULL)
    return NULL;
  surface = df_surface_spec_build (spec, NULL);

  if (!df_project_extras_read (&project->extras, key_file, source, error))
    return NULL;
  /* Loops in file order, which is the order the user made them. */
  for (gsize i = 0; groups[i] != NULL; i++)
    {
      df_project_loop *loop;

      if (!g_str_has_prefix (groups[i], LOOP_PREFIX))
        continue;
      if (skipped != NULL)
        {
          g_autoptr (GError) bad = NULL;

          loop = read_loop (key_file, groups[i], source, surface, &bad);
          if (loop == NULL)
            {
              g_ptr_array_add (skipped, g_strdup (bad->message));
              continue;
            }
        }
      else if ((loop = read_loop (key_file, groups[i], source, surface, error)) == NULL)
        return NULL;
      g_ptr_array_add (project->loops, loop);
    }
  return g_steal_pointer (&project);
}

df_project *
df_project_from_data (const char *data, const char *source, GError **error)
{
  return df_project_from_bytes (data, strlen (data), source, error);
}

df_project *
df_project_from_bytes (const char *data, gsize length, const char *source, GError **error)
{
  g_autoptr (GKeyFile) key_file = NULL;

  if (source == NULL)
    source = "project";
  key_file = _df_key_file_load_bytes (data, length, source, error);
  if (key_file == NULL)
    return NULL;
  return project_from_key_file (key_file, source, NULL, error);
}

df_project *
df_project_load (const char *path, GError **error)
{
  g_autoptr (GKeyFile) key_file = _df_key_file_load (path, error);

  if (key_file == NULL)
    return NULL;
  return project_from_key_file (key_file, path, NULL, error);
}

df_project *
df_project_load_skipping (const char *path, GPtrArray *skipped, GError **error)
{
  g_autoptr (GKeyFile) key_file = NULL;

  g_return_val_if_fail (skipped != NULL, NULL);
  key_file = _df_key_file_load (path, error);
  if (key_file == NULL)
    return NULL;
  return project_from_key_file (key_file, path, skipped, error);
}

static char *
join_numbers (const df_project_loop *loop, int which)
{
  GString *out = g_string_new (NULL);
  char buf[G_ASCII_DTOSTR_BUF_SIZE];

  /* g_ascii_dtostr: "%.17g" in the C locale, so a saved loop reloads bit for bit. */
  for (gsize i = 0; i < loop->n; i++)
    g_string_append_printf (out, "%s%s", i ? ";" : "",
                            g_ascii_dtostr (buf, sizeof buf, loop->uv[i][which]));
  return g_string_free (out, FALSE);
}

char *
df_project_to_data (const df_project *project)
{
  g_autoptr (GKeyFile) key_file = g_key_file_new ();

  g_return_val_if_fail (project != NULL && project->spec != NULL, NULL);
  df_surface_spec_to_key_file (project->spec, key_file);
  g_key_file_set_comment (key_file, NULL, NULL, " driftframe project", NULL);
  for (gsize k = 0; record_keys[k] != NULL; k++)
    {
      char **slot = record_slot ((df_project_record *) &project->record, record_keys[k]);

      if (*slot != NULL)
        g_key_file_set_string (key_file, RECORD_GROUP, record_keys[k], *slot);
    }
  df_limits_to_key_file (project->limits, key_file);
  for (guint i = 0; i < project->loops->len; i++)
    {
      const df_project_loop *loop = g_ptr_array_index (project->loops, i);
      g_autofree char *group = g_strdup_printf (LOOP_PREFIX "%u", i + 1);
      g_autofree char *u = join_numbers (loop, 0);
      g_autofree char *v = join_numbers (loop, 1);

      g_key_file_set_string (key_file, group, "name", loop->name ? loop->name : "");
      g_key_file_set_string (key_file, group, "colour",
                             loop->colour && is_colour (loop->colour) ? loop->colour
                                                                      : DEFAULT_COLOUR);
      g_key_file_set_string (key_file, group, "frames", loop->show_frames ? "true" : "false");
      g_key_file_set_string (key_file, group, "u", u);
      g_key_file_set_string (key_file, group, "v", v);
      write_drape (key_file, group, &loop->drape);
    }
  df_project_extras_write (&project->extras, key_file);
  return g_key_file_to_data (key_file, NULL, NULL);
}

gboolean
df_project_save (const df_project *project, const char *path, GError **error)
{
  g_autofree char *data = df_project_to_data (project);

  g_return_val_if_fail (data != NULL, FALSE);
  return df_write_file_atomic (path, data, -1, error);
}

/* For df-project-extras.c: the same list reader, so every list in a project reads alike. */
double *
_df_key_file_get_numbers (GKeyFile *key_file, const char *group, const char *key,
                          const char *source, gsize *n_out, GError **error)
{
  return read_numbers (key_file, group, key, source, n_out, error);
}
