/* df-limits-file.c: the [limits] and [units] groups of a project file (see df-limits-file.h):
 * read with messages naming the file, group and key; written back as the user wrote them.
 * Reader/writer layer: GLib. */
#include "df-limits-file.h"

#include <math.h>
#include <string.h>

#include "df-glib.h"
#include "df-surface-spec-private.h"

static gboolean
find_limit (const char *key, df_limit_id *id, gboolean *is_source)
{
  for (int i = 0; i < DF_N_LIMITS; i++)
    {
      const char *name = df_limit_key ((df_limit_id) i);
      gsize len = strlen (name);

      if (g_str_equal (key, name))
        {
          *id = (df_limit_id) i;
          *is_source = FALSE;
          return TRUE;
        }
      if (strncmp (key, name, len) == 0 && g_str_equal (key + len, "-source"))
        {
          *id = (df_limit_id) i;
          *is_source = TRUE;
          return TRUE;
        }
    }
  return FALSE;
}

/* "25", "25 mm", "0.025m": a finite number with an optional length unit (lengths only). */
static gboolean
parse_value (const char *text, df_limit_id id, const char *source, double *value,
             gboolean *has_unit, df_unit *unit, GError **error)
{
  const char *key = df_limit_key (id);
  char *end = NULL;
  g_autofree char *rest = NULL;

  *value = g_ascii_strtod (text, &end);
  if (end == text)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                   "%s: [" DF_LIMITS_GROUP "] %s: '%s' is not a number", source, key, text);
      return FALSE;
    }
  if (!isfinite (*value))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                   "%s: [" DF_LIMITS_GROUP "] %s: '%s' is not a finite number", source, key,
                   text);
      return FALSE;
    }
  rest = g_strstrip (g_strdup (end));
  *has_unit = rest[0] != '\0';
  if (*has_unit)
    {
      if (df_limit_kind_of (id) != DF_LIMIT_KIND_LENGTH)
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                       "%s: [" DF_LIMITS_GROUP "] %s: '%s' should be a plain number (%s)",
                       source, key, text, df_limit_kind_units (df_limit_kind_of (id)));
          return FALSE;
        }
      if (!df_unit_from_name (rest, unit))
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                       "%s: [" DF_LIMITS_GROUP "] %s: unknown unit '%s' (known: mm, cm, m, in)",
                       source, key, rest);
          return FALSE;
        }
    }

  switch (df_limit_kind_of (id))
    {
    case DF_LIMIT_KIND_DEGREES:
      if (!(*value > 0.0 && *value < 180.0))
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                       "%s: [" DF_LIMITS_GROUP "] %s: '%s' must lie between 0 and 180 degrees",
                       source, key, text);
          return FALSE;
        }
      break;
    case DF_LIMIT_KIND_PERCENT:
      if (!(*value > 0.0 && *value <= 100.0))
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                       "%s: [" DF_LIMITS_GROUP "] %s: '%s' must lie in (0, 100] percent",
                       source, key, text);
          return FALSE;
        }
      break;
    case DF_LIMIT_KIND_LENGTH:
    case DF_LIMIT_KIND_RATIO:
    default:
      if (!(*value > 0.0))
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                       "%s: [" DF_LIMITS_GROUP "] %s: '%s' must be positive", source, key, text);
          return FALSE;
        }
      break;
    }
  return TRUE;
}

/* A positive length with an optional unit: "20", "20 mm". */
static gboolean
parse_length (const char *text, const char *group, const char *key, const char *source,
              df_length_setting *out, GError **error)
{
  char *end = NULL;
  g_autofree char *rest = NULL;
  double value = g_ascii_strtod (text, &end);

  if (end == text || !isfinite (value) || !(value > 0.0))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                   "%s: [%s] %s: '%s' is not a positive length", source, group, key, text);
      return FALSE;
    }
  rest = g_strstrip (g_strdup (end));
  out->has_unit = rest[0] != '\0';
  out->unit = DF_UNIT_MM;
  if (out->has_unit && !df_unit_from_name (rest, &out->unit))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                   "%s: [%s] %s: unknown unit '%s' (known: mm, cm, m, in)", source, group, key,
                   rest);
      return FALSE;
    }
  out->set = true;
  out->value = value;
  out->model_value = value;
  return TRUE;
}

static gboolean
read_limits (GKeyFile *key_file, const char *source, df_limits *limits, GError **error)
{
  g_auto (GStrv) keys = g_key_file_get_keys (key_file, DF_LIMITS_GROUP, NULL, NULL);
  char *sources[DF_N_LIMITS] = { NULL };
  gboolean ok = TRUE;

  for (gsize i = 0; keys != NULL && keys[i] != NULL && ok; i++)
    {
      df_limit_id id;
      gboolean is_source;
      g_autofree char *text = NULL;

      if (g_str_equal (keys[i], "patch-size"))
        {
          text = _df_key_file_get_text (key_file, DF_LIMITS_GROUP, keys[i], FALSE, source,
                                        error);
          ok = text != NULL && parse_length (text, DF_LIMITS_GROUP, "patch-size", source,
                                             &limits->patch_size, error);
          continue;
        }
      if (!find_limit (keys[i], &id, &is_source))
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                       "%s: [" DF_LIMITS_GROUP "] unknown key '%s' (known: min-steering-radius, "
                       "tow-width, max-fibre-deviation-deg, max-shear-deg, friction, "
                       "max-strain-percent, each with NAME-source; patch-size)", source, keys[i]);
          ok = FALSE;
          break;
        }
      text = _df_key_file_get_text (key_file, DF_LIMITS_GROUP, keys[i], FALSE, source, error);
      if (text == NULL)
        {
          ok = FALSE;
          break;
        }
      if (is_source)
        {
          g_free (sources[id]);
          sources[id] = g_steal_pointer (&text);
        }
      else
        {
          double value;
          gboolean has_unit;
          df_unit unit = DF_UNIT_MM;

          ok = parse_value (text, id, source, &value, &has_unit, &unit, error);
          if (ok)
            df_limits_set (limits, id, value, has_unit, unit, NULL);
        }
    }
  for (int i = 0; i < DF_N_LIMITS && ok; i++)
    {
      if (sources[i] == NULL)
        continue;
      if (!limits->item[i].set)
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                       "%s: [" DF_LIMITS_GROUP "] %s-source: there is no %s for it to describe",
                       source, df_limit_key ((df_limit_id) i), df_limit_key ((df_limit_id) i));
          ok = FALSE;
          break;
        }
      /* The numeric layer frees with free(). */
      limits->item[i].source = strdup (sources[i]);
    }
  for (int i = 0; i < DF_N_LIMITS; i++)
    g_free (sources[i]);
  return ok;
}

static gboolean
read_units (GKeyFile *key_file, const char *source, df_limits *limits, GError **error)
{
  g_auto (GStrv) keys = g_key_file_get_keys (key_file, DF_UNITS_GROUP, NULL, NULL);

  for (gsize i = 0; keys != NULL && keys[i] != NULL; i++)
    {
      g_autofree char *text = NULL;
      df_unit unit;

      if (!g_str_equal (keys[i], "length") && !g_str_equal (keys[i], "curvature"))
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                       "%s: [" DF_UNITS_GROUP "] unknown key '%s' (known: length, curvature)",
                       source, keys[i]);
          return FALSE;
        }
      text = _df_key_file_get_text (key_file, DF_UNITS_GROUP, keys[i], FALSE, source, error);
      if (text == NULL)
        return FALSE;
      if (g_str_equal (keys[i], "length"))
        {
          if (!df_unit_from_name (text, &unit))
            {
              g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                           "%s: [" DF_UNITS_GROUP "] length: unknown unit '%s' (known: mm, cm, "
                           "m, in)", source, text);
              return FALSE;
            }
          limits->has_length_unit = true;
          limits->length_unit = unit;
        }
      else
        {
          g_autofree char *name = NULL;

          /* "1/m^2", also "1/m2" and "m^-2" */
          if (g_str_has_prefix (text, "1/"))
            name = g_strndup (text + 2, strcspn (text + 2, "^2"));
          else if (g_str_has_suffix (text, "^-2"))
            name = g_strndup (text, strlen (text) - 3);
          if (name == NULL || !df_unit_from_name (name, &unit)
              || !(g_str_has_suffix (text, "^2") || g_str_has_suffix (text, "2")))
            {
              g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                           "%s: [" DF_UNITS_GROUP "] curvature: '%s' is not one of 1/mm^2, "
                           "1/cm^2, 1/m^2, 1/in^2", source, text);
              return FALSE;
            }
          limits->has_curvature_unit = true;
          limits->curvature_unit = unit;
        }
    }
  return TRUE;
}

df_limits *
df_limits_from_key_file (GKeyFile *key_file, const char *source, const char *surface_units,
                         GError **error)
{
  df_limits *limits = df_limits_new ();
  df_diag diag;

  df_diag_clear (&diag);
  if (!read_limits (key_file, source, limits, error)
      || !read_units (key_file, source, limits, error))
    {
      df_limits_free (limits);
      return NULL;
    }
  if (df_limits_resolve (limits, surface_units, &diag) != DF_OK)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE, "%s: [" DF_LIMITS_GROUP "] %s",
                   source, diag.detail);
      df_limits_free (limits);
      return NULL;
    }
  return limits;
}

/* The shortest of %.15g and %.17g that reads back to the same double: "6.35", not
 * "6.3499999999999996", and still bit for bit. */
static char *
exact_text (double value, gboolean has_unit, df_unit unit)
{
  char buf[G_ASCII_DTOSTR_BUF_SIZE];

  g_ascii_formatd (buf, sizeof buf, "%.15g", value);
  if (g_ascii_strtod (buf, NULL) != value)
    g_ascii_formatd (buf, sizeof buf, "%.17g", value);
  if (has_unit)
    return g_strdup_printf ("%s %s", buf, df_unit_name (unit));
  return g_strdup (buf);
}

char *
df_limit_value_text (const df_limit *limit)
{
  return exact_text (limit->value, limit->has_unit, limit->unit);
}

char *
df_length_setting_text (const df_length_setting *setting)
{
  return exact_text (setting->value, setting->has_unit, setting->unit);
}

void
df_limits_to_key_file (const df_limits *limits, GKeyFile *key_file)
{
  if (limits == NULL)
    return;
  for (int i = 0; i < DF_N_LIMITS; i++)
    {
      const df_limit *l = &limits->item[i];
      g_autofree char *text = NULL;
      g_autofree char *source_key = NULL;

      if (!l->set)
        continue;
      text = df_limit_value_text (l);
      g_key_file_set_string (key_file, DF_LIMITS_GROUP, df_limit_key ((df_limit_id) i), text);
      if (l->source != NULL)
        {
          source_key = g_strdup_printf ("%s-source", df_limit_key ((df_limit_id) i));
          g_key_file_set_string (key_file, DF_LIMITS_GROUP, source_key, l->source);
        }
    }
  if (limits->patch_size.set)
    {
      g_autofree char *text = df_length_setting_text (&limits->patch_size);

      g_key_file_set_string (key_file, DF_LIMITS_GROUP, "patch-size", text);
    }
  if (limits->has_length_unit)
    g_key_file_set_string (key_file, DF_UNITS_GROUP, "length",
                           df_unit_name (limits->length_unit));
  if (limits->has_curvature_unit)
    {
      g_autofree char *text = g_strdup_printf ("1/%s^2", df_unit_name (limits->curvature_unit));

      g_key_file_set_string (key_file, DF_UNITS_GROUP, "curvature", text);
    }
}
