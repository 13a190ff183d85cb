/* df-cli-presets.c: `driftframe-cli presets`: lists the built-in surfaces with their formulas,
 * ranges and default parameters, as text or JSON. */
#include <stdio.h>

#include "df-cli-commands.h"
#include "df-cli-common.h"
#include "df-json-out.h"

#define NAME "presets"

static const char *const range_names[2][4] = {
  [DF_SURFACE_REVOLUTION] = { "t-min", "t-max", NULL, NULL },
  [DF_SURFACE_GRAPH] = { "x-min", "x-max", "y-min", "y-max" },
};

static void
add_spec_json (JsonBuilder *b, const df_preset_info *info, const df_surface_spec *spec)
{
  json_builder_begin_object (b);
  json_builder_set_member_name (b, "name");
  json_builder_add_string_value (b, info->name);
  json_builder_set_member_name (b, "title");
  json_builder_add_string_value (b, info->title);
  json_builder_set_member_name (b, "description");
  json_builder_add_string_value (b, info->description);
  json_builder_set_member_name (b, "kind");
  json_builder_add_string_value (b, spec->kind == DF_SURFACE_GRAPH ? "graph" : "revolution");
  if (spec->kind == DF_SURFACE_REVOLUTION)
    {
      json_builder_set_member_name (b, "r");
      json_builder_add_string_value (b, spec->r_text);
    }
  json_builder_set_member_name (b, "z");
  json_builder_add_string_value (b, spec->z_text);
  for (int i = 0; i < 4 && range_names[spec->kind][i] != NULL; i++)
    {
      json_builder_set_member_name (b, range_names[spec->kind][i]);
      json_builder_add_string_value (b, spec->range_text[i]);
    }
  json_builder_set_member_name (b, "units");
  json_builder_add_string_value (b, spec->units);
  /* Parameters as an ordered list: a value may use the ones before it. */
  json_builder_set_member_name (b, "parameters");
  json_builder_begin_array (b);
  for (guint i = 0; i < df_params_count (spec->params); i++)
    {
      json_builder_begin_object (b);
      json_builder_set_member_name (b, "name");
      json_builder_add_string_value (b, df_params_name (spec->params, i));
      json_builder_set_member_name (b, "default");
      json_builder_add_string_value (b, df_params_text (spec->params, i));
      json_builder_set_member_name (b, "value");
      df_json_add_double_value (b, df_params_value (spec->params, i));
      json_builder_end_object (b);
    }
  json_builder_end_array (b);
  json_builder_end_object (b);
}

static void
print_spec_text (const df_preset_info *info, const df_surface_spec *spec)
{
  printf ("%s (%s)\n  %s\n", info->name, info->title, info->description);
  if (spec->kind == DF_SURFACE_REVOLUTION)
    printf ("  r(t) = %s, z(t) = %s, t in [%s, %s]\n", spec->r_text, spec->z_text,
            spec->range_text[0], spec->range_text[1]);
  else
    printf ("  z(x, y) = %s, x in [%s, %s], y in [%s, %s]\n", spec->z_text, spec->range_text[0],
            spec->range_text[1], spec->range_text[2], spec->range_text[3]);
  printf ("  parameters:");
  for (guint i = 0; i < df_params_count (spec->params); i++)
    printf (" %s=%s", df_params_name (spec->params, i), df_params_text (spec->params, i));
  printf ("  (%s)\n\n", spec->units);
}

int
df_cli_presets (int argc, char **argv)
{
  g_autoptr (GOptionContext) context = NULL;
  g_autoptr (JsonBuilder) b = NULL;
  gboolean json = FALSE;
  const df_preset_info *list = df_presets_list ();
  const GOptionEntry entries[] = {
    { "json", 'j', 0, G_OPTION_ARG_NONE, &json, "Print the list as JSON", NULL },
    { NULL },
  };

  context = df_cli_context_new (NAME, "list the built-in surfaces",
                                "Lists each preset's name (for --preset), formulas, ranges and "
                                "parameters with their defaults (for --param KEY=VALUE). Every "
                                "preset is written so that the normal N points outward.");
  g_option_context_add_main_entries (context, entries, NULL);
  if (!df_cli_parse (context, NAME, &argc, &argv))
    return DF_CLI_EXIT_INPUT;

  if (json)
    {
      b = json_builder_new ();
      json_builder_begin_object (b);
      json_builder_set_member_name (b, "presets");
      json_builder_begin_array (b);
    }
  for (gsize i = 0; list[i].name != NULL; i++)
    {
      g_autoptr (GError) error = NULL;
      g_autoptr (df_surface_spec) spec = df_surface_spec_new_preset (list[i].name, &error);

      if (spec == NULL)
        return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
      if (json)
        add_spec_json (b, &list[i], spec);
      else
        print_spec_text (&list[i], spec);
    }
  if (json)
    {
      json_builder_end_array (b);
      json_builder_end_object (b);
      df_cli_print_json (b);
    }
  return DF_CLI_EXIT_OK;
}
