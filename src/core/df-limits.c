/* df-limits.c: the user's limits with their source and the project's display units (see
 * df-limits.h). Plain C + libm; no GLib. */
#include "df-limits.h"

#include <stdlib.h>
#include <string.h>

static const struct
{
  const char   *key;
  df_limit_kind kind;
} limit_info[DF_N_LIMITS] = {
  [DF_LIMIT_MIN_STEERING_RADIUS] = { "min-steering-radius", DF_LIMIT_KIND_LENGTH },
  [DF_LIMIT_TOW_WIDTH] = { "tow-width", DF_LIMIT_KIND_LENGTH },
  [DF_LIMIT_MAX_FIBRE_DEVIATION] = { "max-fibre-deviation-deg", DF_LIMIT_KIND_DEGREES },
  [DF_LIMIT_MAX_SHEAR] = { "max-shear-deg", DF_LIMIT_KIND_DEGREES },
  [DF_LIMIT_FRICTION] = { "friction", DF_LIMIT_KIND_RATIO },
  [DF_LIMIT_MAX_STRAIN] = { "max-strain-percent", DF_LIMIT_KIND_PERCENT },
};

static char *
dup_text (const char *text)
{
  char *copy;

  if (text == NULL)
    return NULL;
  copy = malloc (strlen (text) + 1);
  if (copy != NULL)
    strcpy (copy, text);
  return copy;
}

df_limits *
df_limits_new (void)
{
  return calloc (1, sizeof (df_limits));
}

df_limits *
df_limits_copy (const df_limits *limits)
{
  df_limits *copy;

  if (limits == NULL)
    return NULL;
  copy = malloc (sizeof *copy);
  if (copy == NULL)
    return NULL;
  *copy = *limits;
  for (int i = 0; i < DF_N_LIMITS; i++)
    copy->item[i].source = dup_text (limits->item[i].source);
  return copy;
}

void
df_limits_free (df_limits *limits)
{
  if (limits == NULL)
    return;
  for (int i = 0; i < DF_N_LIMITS; i++)
    free (limits->item[i].source);
  free (limits);
}

const char *
df_limit_key (df_limit_id id)
{
  return id < DF_N_LIMITS ? limit_info[id].key : "?";
}

df_limit_kind
df_limit_kind_of (df_limit_id id)
{
  return id < DF_N_LIMITS ? limit_info[id].kind : DF_LIMIT_KIND_RATIO;
}

const char *
df_limit_kind_units (df_limit_kind kind)
{
  switch (kind)
    {
    case DF_LIMIT_KIND_DEGREES:
      return "deg";
    case DF_LIMIT_KIND_PERCENT:
      return "%";
    case DF_LIMIT_KIND_RATIO:
      return "ratio";
    case DF_LIMIT_KIND_LENGTH:
    default:
      return "";
    }
}

void
df_limits_set (df_limits *limits, df_limit_id id, double value, bool has_unit, df_unit unit,
               const char *source)
{
  df_limit *l;

  if (limits == NULL || id >= DF_N_LIMITS)
    return;
  l = &limits->item[id];
  free (l->source);
  l->set = true;
  l->value = value;
  l->has_unit = has_unit && limit_info[id].kind == DF_LIMIT_KIND_LENGTH;
  l->unit = unit;
  l->model_value = value;
  l->source = dup_text (source);
}

static df_status
resolve_setting (df_length_setting *l, const char *key, bool known, df_unit model,
                 const char *surface_units, df_diag *diag)
{
  if (!l->set)
    return DF_OK;
  l->model_value = l->value;
  if (!l->has_unit)
    return DF_OK;
  if (!known)
    return df_diag_fail (diag, DF_E_INPUT, -1,
                         "%s is given in %s but the surface's units '%s' are not mm, cm, m "
                         "or in, so the two cannot be related", key, df_unit_name (l->unit),
                         surface_units ? surface_units : "");
  l->model_value = df_unit_length (l->value, l->unit, model);
  return DF_OK;
}

df_status
df_limits_resolve (df_limits *limits, const char *surface_units, df_diag *diag)
{
  df_unit model;
  bool known = df_unit_from_name (surface_units, &model);
  df_status st;

  if ((st = resolve_setting (&limits->patch_size, "patch-size", known, model, surface_units,
                             diag)) != DF_OK)
    return st;

  for (int i = 0; i < DF_N_LIMITS; i++)
    {
      df_limit *l = &limits->item[i];

      if (!l->set)
        continue;
      l->model_value = l->value;
      if (!l->has_unit)
        continue;
      if (!known)
        return df_diag_fail (diag, DF_E_INPUT, i,
                             "%s is given in %s but the surface's units '%s' are not mm, cm, m "
                             "or in, so the two cannot be related", limit_info[i].key,
                             df_unit_name (l->unit), surface_units ? surface_units : "");
      l->model_value = df_unit_length (l->value, l->unit, model);
    }
  return DF_OK;
}

bool
df_limits_display_units (const df_limits *limits, const char *surface_units,
                         df_display_units *out)
{
  df_unit model;
  bool known = df_unit_from_name (surface_units, &model);
  bool asked = limits != NULL && (limits->has_length_unit || limits->has_curvature_unit);

  df_display_units_init (out, known ? model : DF_UNIT_MM);
  if (!asked)
    return true;
  if (!known)
    return false;
  if (limits->has_length_unit)
    out->length = out->curvature = limits->length_unit;
  if (limits->has_curvature_unit)
    out->curvature = limits->curvature_unit;
  return true;
}
