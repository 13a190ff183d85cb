/* df-display-units.c: the app's one conversion path from the surface's units to the display
 * units (see df-display-units.h); the factors are the core's (df-units). */
#include "df-display-units.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "df-format.h"
#include "df-units-convert.h"

void
df_du_identity (DfDisplayUnits *out,
                const char     *surface_units)
{
  df_unit model = DF_UNIT_MM;

  if (surface_units == NULL || surface_units[0] == '\0')
    surface_units = "mm";
  out->known = df_unit_from_name (surface_units, &model);
  df_display_units_init (&out->units, model);
  g_strlcpy (out->label, surface_units, sizeof out->label);
  out->t_unit[0] = '\0';
}

void
df_du_resolve (DfDisplayUnits  *out,
               const df_limits *limits,
               const char      *surface_units)
{
  df_du_identity (out, surface_units);
  /* Asked for but impossible (an unknown label): the values stay as the surface has them. */
  if (!df_limits_display_units (limits, out->label, &out->units) || !out->known)
    df_du_identity (out, surface_units);
}

gboolean
df_du_converts (const DfDisplayUnits *u)
{
  return u->known && (u->units.length != u->units.model || u->units.curvature != u->units.model);
}

const char *
df_du_length_unit (const DfDisplayUnits *u)
{
  return u->known ? df_unit_name (u->units.length) : u->label;
}

const char *
df_du_curvature_unit (const DfDisplayUnits *u)
{
  return u->known ? df_unit_name (u->units.curvature) : u->label;
}

double
df_du_length (const DfDisplayUnits *u, double model)
{
  return u->known ? df_unit_length (model, u->units.model, u->units.length) : model;
}

double
df_du_area (const DfDisplayUnits *u, double model)
{
  return u->known ? df_unit_area (model, u->units.model, u->units.length) : model;
}

double
df_du_per_length (const DfDisplayUnits *u, double model)
{
  return u->known ? df_unit_curvature (model, u->units.model, u->units.length) : model;
}

double
df_du_gaussian (const DfDisplayUnits *u, double model)
{
  return u->known ? df_unit_gaussian (model, u->units.model, u->units.curvature) : model;
}

double
df_du_per_curvature (const DfDisplayUnits *u, double model)
{
  return u->known ? df_unit_curvature (model, u->units.model, u->units.curvature) : model;
}

double
df_du_to_model (const DfDisplayUnits *u, double shown)
{
  return u->known ? df_unit_length (shown, u->units.length, u->units.model) : shown;
}

char *
df_du_format_length (const DfDisplayUnits *u, double model)
{
  return df_format_length (df_du_length (u, model), df_du_length_unit (u));
}

char *
df_du_format_area (const DfDisplayUnits *u, double model)
{
  return df_format_area (df_du_area (u, model), df_du_length_unit (u));
}

char *
df_du_format_per_length (const DfDisplayUnits *u, double model)
{
  return df_format_per_length (df_du_per_length (u, model), df_du_length_unit (u));
}

char *
df_du_format_gaussian (const DfDisplayUnits *u, double model)
{
  return df_format_per_area (df_du_gaussian (u, model), df_du_curvature_unit (u));
}

df_loop_result *
df_du_loop_result_copy (const DfDisplayUnits *u,
                        const df_loop_result *result)
{
  df_loop_result *copy = g_new (df_loop_result, 1);

  *copy = *result;
  copy->samples = NULL;
  /* malloc, as the core's df_loop_result_clear frees with free(). */
  if (result->n_samples > 0)
    {
      copy->samples = malloc (result->n_samples * sizeof *result->samples);
      g_assert (copy->samples != NULL);
      memcpy (copy->samples, result->samples, result->n_samples * sizeof *result->samples);
    }
  if (u->known)
    df_loop_result_convert_display (copy, &u->units);
  return copy;
}

void
df_du_loop_result_free (df_loop_result *result)
{
  if (result == NULL)
    return;
  df_loop_result_clear (result);
  g_free (result);
}

char *
df_du_format_per_curvature (const DfDisplayUnits *u, double model)
{
  return df_format_per_length (df_du_per_curvature (u, model), df_du_curvature_unit (u));
}

char *
df_du_format_chart_point (const DfDisplayUnits *u,
                          gboolean              revolution,
                          double                cu,
                          double                cv)
{
  /* A height field's chart is its plan: x and y are lengths in space, shown in the display
   * unit like the point's z. */
  g_autofree char *a = df_format_number (revolution ? cu : df_du_length (u, cu));
  g_autofree char *b = df_format_number (revolution ? remainder (cv, 2 * G_PI) * 180.0 / G_PI
                                                    : df_du_length (u, cv));

  if (revolution)
    return g_strdup_printf ("t = %s%s%s, φ = %s°", a, u->t_unit[0] != '\0' ? " " : "",
                            u->t_unit, b);
  return g_strdup_printf ("x = %s, y = %s %s", a, b, df_du_length_unit (u));
}
