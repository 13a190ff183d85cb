/* df-cli-common.c: shared option handling, error reporting and output helpers of
 * driftframe-cli (see df-cli-common.h). CLI layer: no geometry is computed here. */
#include "df-cli-common.h"

#include "df-fit.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

#include "df-json-out.h"
#include "df-limits.h"
#include "df-units-convert.h"

void
df_cli_add_surface_options (GOptionContext *context, DfCliSurfaceOptions *o)
{
  const GOptionEntry entries[] = {
    { "surface", 's', 0, G_OPTION_ARG_FILENAME, &o->surface_path,
      "Surface file (.surface key file, or a .dfproj project's surface)", "FILE" },
    { "preset", 'p', 0, G_OPTION_ARG_STRING, &o->preset,
      "Use a built-in surface instead of a file (see `driftframe-cli presets`)", "NAME" },
    { "param", 'P', 0, G_OPTION_ARG_STRING_ARRAY, &o->params,
      "Set a surface parameter, e.g. R=120 (repeatable; values may be formulas)", "KEY=VALUE" },
    { NULL },
  };

  g_option_context_add_main_entries (context, entries, NULL);
}

void
df_cli_surface_options_clear (DfCliSurfaceOptions *o)
{
  g_clear_pointer (&o->surface_path, g_free);
  g_clear_pointer (&o->preset, g_free);
  g_clear_pointer (&o->params, g_strfreev);
  g_clear_pointer (&o->label, g_free);
}

gboolean
df_cli_surface_load (DfCliSurfaceOptions *o, df_surface_spec **spec_out,
                     df_surface **surface_out, GError **error)
{
  g_autoptr (df_surface_spec) spec = NULL;
  g_autoptr (df_surface) surface = NULL;

  if (o->surface_path == NULL && o->preset == NULL)
    {
      g_set_error_literal (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                           "no surface: give --surface FILE or --preset NAME");
      return FALSE;
    }
  if (o->surface_path != NULL && o->preset != NULL)
    {
      g_set_error_literal (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                           "give either --surface or --preset, not both");
      return FALSE;
    }

  if (o->surface_path != NULL)
    {
      /* A project carries its surface in the same groups, so --surface accepts one too. */
      if (g_str_has_suffix (o->surface_path, ".dfproj"))
        {
          g_autoptr (df_project) project = df_project_load (o->surface_path, error);

          if (project == NULL)
            return FALSE;
          spec = g_steal_pointer (&project->spec);
        }
      else
        spec = df_surface_spec_load (o->surface_path, error);
      if (spec == NULL)
        return FALSE;
      o->label = g_strdup (o->surface_path);
    }
  else
    {
      spec = df_surface_spec_new_preset (o->preset, error);
      if (spec == NULL)
        {
          g_prefix_error (error, "--preset: ");
          return FALSE;
        }
      o->label = g_strdup_printf ("preset %s", o->preset);
    }

  for (gsize i = 0; o->params != NULL && o->params[i] != NULL; i++)
    if (!df_surface_spec_set_param (spec, o->params[i], NULL, error))
      {
        g_prefix_error (error, "--param %s: ", o->params[i]);
        return FALSE;
      }

  surface = df_surface_spec_build (spec, error);
  if (surface == NULL)
    {
      g_prefix_error (error, "%s: ", o->label);
      return FALSE;
    }
  if (spec_out != NULL)
    *spec_out = g_steal_pointer (&spec);
  *surface_out = g_steal_pointer (&surface);
  return TRUE;
}

GOptionContext *
df_cli_context_new (const char *name, const char *summary, const char *description)
{
  g_autofree char *param = g_strdup_printf ("- %s", summary);
  GOptionContext *context = g_option_context_new (param);

  g_option_context_set_description (context, description);
  return context;
}

gboolean
df_cli_parse (GOptionContext *context, const char *name, int *argc, char ***argv)
{
  g_autoptr (GError) error = NULL;

  if (!g_option_context_parse (context, argc, argv, &error))
    {
      df_cli_fail_msg (name, DF_CLI_EXIT_INPUT, "%s (see driftframe-cli %s --help)",
                       error->message, name);
      return FALSE;
    }
  if (*argc > 1)
    {
      df_cli_fail_msg (name, DF_CLI_EXIT_INPUT,
                       "unexpected argument '%s' (see driftframe-cli %s --help)", (*argv)[1],
                       name);
      return FALSE;
    }
  return TRUE;
}

int
df_cli_fail_msg (const char *name, int code, const char *format, ...)
{
  g_autofree char *msg = NULL;
  va_list args;

  va_start (args, format);
  msg = g_strdup_vprintf (format, args);
  va_end (args);
  /* One line, whatever the message holds, so scripts can read it with a single read. */
  g_strdelimit (msg, "\r\n", ' ');
  /* The last guard: a number that slipped through unchecked reads as a word. */
  if (strlen (msg) < 1000)
    df_words_for_nonfinite (msg, strlen (msg) + 1);
  fprintf (stderr, "driftframe-cli %s: %s\n", name, msg);
  return code;
}

int
df_cli_fail (const char *name, const GError *error, int code)
{
  return df_cli_fail_msg (name, code, "%s", error != NULL ? error->message : "failed");
}

gboolean
df_cli_parse_number (const char *option, const char *text, double *out, GError **error)
{
  g_autofree char *copy = g_strstrip (g_strdup (text != NULL ? text : ""));
  char *end = NULL;

  *out = g_ascii_strtod (copy, &end);
  if (copy[0] == '\0' || end == copy || *end != '\0')
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: '%s' is not a number", option,
                   copy);
      return FALSE;
    }
  if (!isfinite (*out))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: '%s' is not a finite number",
                   option, copy);
      return FALSE;
    }
  return TRUE;
}

gboolean
df_cli_parse_pair (const char *option, const char *text, double *a, double *b, GError **error)
{
  g_auto (GStrv) parts = NULL;

  if (!df_cli_require (option, text, error))
    return FALSE;
  parts = g_strsplit (text, ",", -1);
  if (g_strv_length (parts) != 2)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                   "%s: expected two numbers separated by a comma (e.g. 0.5,1.2), got '%s'",
                   option, text);
      return FALSE;
    }
  return df_cli_parse_number (option, parts[0], a, error)
         && df_cli_parse_number (option, parts[1], b, error);
}

gboolean
df_cli_require (const char *option, const char *value, GError **error)
{
  if (value != NULL)
    return TRUE;
  g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE, "%s is required", option);
  return FALSE;
}

const char *
df_cli_num (char *buf, gsize len, double value, int digits)
{
  /* Adding zero turns a negative zero into a plain one: "-0" on screen reads as a sign. */
  if (isfinite (value))
    g_snprintf (buf, len, "%.*g", digits, value + 0.0);
  else
    g_strlcpy (buf, "n/a", len);
  return buf;
}

void
df_cli_chart_names (const df_surface *surface, const char **u_name, const char **v_name)
{
  gboolean graph = df_surface_get_kind (surface) == DF_SURFACE_GRAPH;

  *u_name = graph ? "x" : "t";
  *v_name = graph ? "y" : "phi";
}

const char *
df_cli_kind_text (const df_surface *surface)
{
  return df_surface_get_kind (surface) == DF_SURFACE_GRAPH ? "graph z = f(x, y)"
                                                           : "surface of revolution";
}

df_csv_context
df_cli_csv_context (const df_surface_spec *spec, const df_surface *surface, const char *label)
{
  df_csv_context c = { spec->units, df_surface_get_kind (surface), label,
                       df_surface_normal_side (surface) };

  return c;
}

/* One unit option: an unknown name fails naming the option. */
static gboolean
unit_option (const char *option, const char *text, df_unit *out, GError **error)
{
  if (df_unit_from_name (text, out))
    return TRUE;
  g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
               "%s: unknown unit '%s' (known: mm, cm, m, in)", option, text);
  return FALSE;
}

static gboolean
model_known (const char *option, const char *surface_units, df_unit *model, GError **error)
{
  if (df_unit_from_name (surface_units, model))
    return TRUE;
  g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE, "%s: the surface's units '%s' are not mm, "
               "cm, m or in, so nothing can be converted", option,
               surface_units != NULL ? surface_units : "");
  return FALSE;
}

gboolean
df_cli_display_units (const char *units_text, const char *curvature_text,
                      const char *surface_units, df_display_units *out, GError **error)
{
  df_unit model;

  if (!df_unit_from_name (surface_units, &model))
    {
      /* An unknown label: numbers stay unconverted, unless a conversion is asked for. */
      if (units_text != NULL)
        return model_known ("--units", surface_units, &model, error);
      if (curvature_text != NULL)
        return model_known ("--curvature-units", surface_units, &model, error);
      model = DF_UNIT_MM;
    }
  df_display_units_init (out, model);
  if (units_text != NULL && !unit_option ("--units", units_text, &out->length, error))
    return FALSE;
  out->curvature = out->length;
  if (curvature_text != NULL
      && !unit_option ("--curvature-units", curvature_text, &out->curvature, error))
    return FALSE;
  return TRUE;
}

gboolean
df_cli_project_units (const df_project *project, const char *project_path,
                      const char *units_text, const char *curvature_text,
                      df_display_units *out, GError **error)
{
  df_unit model;

  if (!df_limits_display_units (project->limits, project->spec->units, out))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE, "%s: [units]: the surface's units "
                   "'%s' are not mm, cm, m or in, so nothing can be converted", project_path,
                   project->spec->units);
      return FALSE;
    }
  if (units_text != NULL)
    {
      if (!model_known ("--units", project->spec->units, &model, error)
          || !unit_option ("--units", units_text, &out->length, error))
        return FALSE;
      /* K follows the length unit unless the project or the option says otherwise. */
      if (!project->limits->has_curvature_unit)
        out->curvature = out->length;
    }
  if (curvature_text != NULL
      && (!model_known ("--curvature-units", project->spec->units, &model, error)
          || !unit_option ("--curvature-units", curvature_text, &out->curvature, error)))
    return FALSE;
  return TRUE;
}

/* An unconverted surface whose label is no known unit keeps its label. */
static gboolean
label_only (const df_display_units *du, const char *surface_units)
{
  df_unit model;

  return !df_unit_from_name (surface_units, &model) && du->length == du->model
         && du->curvature == du->model;
}

char *
df_cli_gaussian_units (const df_display_units *du, const char *surface_units)
{
  if (label_only (du, surface_units))
    return g_strdup_printf ("1/%s^2", surface_units != NULL ? surface_units : "unit");
  return g_strdup (df_display_units_gaussian_label (du));
}

char *
df_cli_curvature_units (const df_display_units *du, const char *surface_units)
{
  if (label_only (du, surface_units))
    return g_strdup_printf ("1/%s", surface_units != NULL ? surface_units : "unit");
  return g_strdup (df_display_units_curvature_label (du));
}

void
df_cli_print_json (JsonBuilder *builder)
{
  g_autoptr (JsonNode) root = json_builder_get_root (builder);
  g_autofree char *text = df_json_to_string (root, TRUE);

  fputs (text, stdout);
}

void
df_cli_print_fit (const df_surface *surface, const char *units)
{
  df_fit_info info;
  char a[40], b[40], c[3][40], t[40];

  if (!df_fit_get_info (df_surface_get_fn (surface), &info))
    return;
  printf ("Fit:     %zu points, RMS distance %s %s, max %s %s at (%s, %s, %s); tolerance %s %s "
          "(%s)\n", info.points, df_cli_num (a, sizeof a, info.rms, 3), units,
          df_cli_num (b, sizeof b, info.max, 3), units,
          df_cli_num (c[0], sizeof c[0], info.max_at[0], 6),
          df_cli_num (c[1], sizeof c[1], info.max_at[1], 6),
          df_cli_num (c[2], sizeof c[2], info.max_at[2], 6),
          df_cli_num (t, sizeof t, info.tolerance, 3), units,
          info.chosen ? "chosen from the data by GCV" : "fit-tolerance given");
  if (info.has_symmetry)
    printf ("Round:   departs from rotational symmetry by RMS %s %s, max %s %s at (%s, %s, %s)\n",
            df_cli_num (a, sizeof a, info.symmetry_rms, 3), units,
            df_cli_num (b, sizeof b, info.symmetry_max, 3), units,
            df_cli_num (c[0], sizeof c[0], info.symmetry_max_at[0], 6),
            df_cli_num (c[1], sizeof c[1], info.symmetry_max_at[1], 6),
            df_cli_num (c[2], sizeof c[2], info.symmetry_max_at[2], 6));
  printf ("         curvature is a second derivative of fitted data: K at a point is noisier "
          "than a loop's holonomy\n");
}

gboolean
df_cli_units (const char *units_text, const char *surface_units, int *model, int *display,
              GError **error)
{
  df_display_units du;

  /* The same rule and messages as with a curvature unit, without one. */
  if (!df_cli_display_units (units_text, NULL, surface_units, &du, error))
    return FALSE;
  *model = (int) du.model;
  *display = (int) du.length;
  return TRUE;
}
