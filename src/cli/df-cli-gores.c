/* df-cli-gores.c: `driftframe-cli gores`: the flat pattern of n gores of a surface of
 * revolution between two parallels (df-gores.h), printed, and written as SVG at true scale and
 * as CSV outline points. CLI layer: the pattern comes from the core. */
#include <math.h>
#include <stdio.h>

#include "df-cli-commands.h"
#include "df-cli-common.h"
#include "df-decide-out.h"
#include "df-gores.h"
#include "df-json-out.h"

#define NAME "gores"

typedef struct
{
  DfCliSurfaceOptions surface;
  char    *from_text;
  char    *to_text;
  int      count;
  char    *max_strain_text;
  char    *seam_text;
  char    *units_text;
  char    *svg_path;
  char    *csv_path;
  int      points;
  gboolean json;
} gores_options;

static int
run (gores_options *o)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface_spec) spec = NULL;
  g_autoptr (df_surface) surface = NULL;
  df_gores g = { 0 };
  double t0, t1, seam = 0.0, max_strain = 0.0;
  df_unit model, display;
  size_t points = 401;
  int count = o->count, least = 0, code = DF_CLI_EXIT_OK;
  const char *un;
  df_diag diag;
  df_status st;

  if (!df_cli_require ("--from", o->from_text, &error)
      || !df_cli_parse_number ("--from", o->from_text, &t0, &error)
      || !df_cli_require ("--to", o->to_text, &error)
      || !df_cli_parse_number ("--to", o->to_text, &t1, &error)
      || (o->seam_text != NULL && !df_cli_parse_number ("--seam", o->seam_text, &seam, &error))
      || (o->max_strain_text != NULL
          && !df_cli_parse_number ("--max-strain-percent", o->max_strain_text, &max_strain,
                                   &error)))
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
  if (count == 0 && o->max_strain_text == NULL)
    return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT, "--count is required (or give "
                            "--max-strain-percent for the least count)");
  if (o->count != 0 && (o->count < 1 || o->count > 10000))
    return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT, "--count: %d is outside [1, 10000]",
                            o->count);
  if (o->max_strain_text != NULL && !(max_strain > 0.0 && max_strain <= 100.0))
    return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT,
                            "--max-strain-percent: %s must lie in (0, 100]", o->max_strain_text);
  if (!(seam >= 0.0))
    return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT, "--seam: %s must not be negative",
                            o->seam_text);
  if (o->points != 0)
    {
      if (o->points < 3 || o->points > 100000)
        return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT, "--points: %d is outside [3, 100000]",
                                o->points);
      points = (size_t) o->points;
    }
  if (!df_cli_surface_load (&o->surface, &spec, &surface, &error))
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
  if (df_surface_get_kind (surface) != DF_SURFACE_REVOLUTION)
    return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT, "%s: gores need a surface of revolution "
                            "(this one is a graph)", o->surface.label);
  {
    int m, d;

    if (!df_cli_units (o->units_text, spec->units, &m, &d, &error))
      return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
    model = (df_unit) m;
    display = (df_unit) d;
  }
  un = df_unit_name (display);

  df_diag_clear (&diag);
  if (o->max_strain_text != NULL)
    {
      st = df_gores_least_count (surface, t0, t1, max_strain / 100.0, &least, &diag);
      if (st != DF_OK)
        {
          df_status_to_gerror (st, &diag, &error);
          return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
        }
      if (count == 0)
        count = least;
    }
  st = df_gores_compute (surface, t0, t1, count, points, &g, &diag);
  if (st != DF_OK)
    {
      df_status_to_gerror (st, &diag, &error);
      g_prefix_error (&error, "--from %s --to %s: ", o->from_text, o->to_text);
      return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
    }
  if (o->svg_path != NULL
      && !df_gores_svg_write (o->svg_path, &g, model, display, seam, o->surface.label, &error))
    code = df_cli_fail (NAME, error, DF_CLI_EXIT_OUTPUT);
  if (code == DF_CLI_EXIT_OK && o->csv_path != NULL
      && !df_gores_csv_write (o->csv_path, &g, model, display, seam, &error))
    code = df_cli_fail (NAME, error, DF_CLI_EXIT_OUTPUT);

  if (code == DF_CLI_EXIT_OK && o->json)
    {
      g_autoptr (JsonBuilder) b = json_builder_new ();

      json_builder_begin_object (b);
      json_builder_set_member_name (b, "count");
      json_builder_add_int_value (b, count);
      df_json_add_double (b, "length", df_unit_length (g.length, model, display));
      df_json_add_double (b, "max_width", df_unit_length (g.max_width, model, display));
      df_json_add_double (b, "area_each", df_unit_area (g.area_each, model, display));
      df_json_add_double (b, "area_all", df_unit_area (g.area_each * count, model, display));
      df_json_add_double (b, "edge_strain_percent", 100.0 * g.edge_strain);
      json_builder_set_member_name (b, "least_count");
      if (least > 0)
        json_builder_add_int_value (b, least);
      else
        json_builder_add_null_value (b);
      df_json_add_double (b, "from", t0);
      df_json_add_double (b, "to", t1);
      df_json_add_double (b, "seam", seam);
      json_builder_set_member_name (b, "units");
      json_builder_add_string_value (b, un);
      json_builder_set_member_name (b, "caution");
      json_builder_add_string_value (b, DF_DECIDE_CAUTION);
      json_builder_end_object (b);
      df_cli_print_json (b);
    }
  else if (code == DF_CLI_EXIT_OK)
    {
      char b1[40], b2[40], b3[40], b4[40];

      printf ("Gores of %s from t = %s to %s (lengths in %s)\n", o->surface.label,
              df_cli_num (b1, sizeof b1, t0, 8), df_cli_num (b2, sizeof b2, t1, 8), un);
      if (least > 0)
        printf ("Least count for an edge strain within %s %%:  %d\n", o->max_strain_text,
                least);
      printf ("Count:                          %d, bounded by meridians %s deg apart\n", count,
              df_cli_num (b1, sizeof b1, 360.0 / count, 6));
      printf ("Developed centre meridian:      %s %s\n",
              df_cli_num (b1, sizeof b1, df_unit_length (g.length, model, display), 8), un);
      printf ("Widest:                         %s %s\n",
              df_cli_num (b2, sizeof b2, df_unit_length (g.max_width, model, display), 8), un);
      printf ("Flat area of one gore:          %s %s^2 (all %d: %s %s^2)\n",
              df_cli_num (b3, sizeof b3, df_unit_area (g.area_each, model, display), 8), un,
              count, df_cli_num (b4, sizeof b4, df_unit_area (g.area_each * count, model,
                                                              display), 8), un);
      printf ("Edge longer than its meridian:  %s %%\n",
              df_cli_num (b1, sizeof b1, 100.0 * g.edge_strain, 4));
      printf ("\nCaution: %s\n", DF_DECIDE_CAUTION);
    }
  df_gores_clear (&g);
  return code;
}

int
df_cli_gores (int argc, char **argv)
{
  gores_options o = { 0 };
  g_autoptr (GOptionContext) context = NULL;
  int code;
  const GOptionEntry entries[] = {
    { "from", 'a', 0, G_OPTION_ARG_STRING, &o.from_text, "Profile parameter of the first parallel",
      "T0" },
    { "to", 'b', 0, G_OPTION_ARG_STRING, &o.to_text, "Profile parameter of the second parallel",
      "T1" },
    { "count", 'n', 0, G_OPTION_ARG_INT, &o.count, "Number of gores", "N" },
    { "max-strain-percent", 'm', 0, G_OPTION_ARG_STRING, &o.max_strain_text,
      "Find the least count whose gore edge is at most this much longer than its meridian",
      "P" },
    { "seam", 'e', 0, G_OPTION_ARG_STRING, &o.seam_text,
      "Seam allowance added outside the sewing line (display units)", "S" },
    { "units", 'u', 0, G_OPTION_ARG_STRING, &o.units_text,
      "Display and export units: mm, cm, m or in (default: the surface's)", "UNIT" },
    { "svg", 0, 0, G_OPTION_ARG_FILENAME, &o.svg_path, "Write the pattern as SVG at true scale",
      "OUT.svg" },
    { "csv", 0, 0, G_OPTION_ARG_FILENAME, &o.csv_path, "Write the outline points as CSV",
      "OUT.csv" },
    { "points", 0, 0, G_OPTION_ARG_INT, &o.points, "Samples along the meridian (default 401)",
      "N" },
    { "json", 'j', 0, G_OPTION_ARG_NONE, &o.json, "Print the results as JSON", NULL },
    { NULL },
  };

  context = df_cli_context_new (NAME, "flat pattern of gores of a surface of revolution",
                                "Each gore is bounded by two meridians 360/N degrees apart; "
                                "developed flat along its centre meridian its half-width is "
                                "pi r(s) / N.\n\nExit status: 0 done, 2 bad input, 1 an output "
                                "file could not be written.");
  df_cli_add_surface_options (context, &o.surface);
  g_option_context_add_main_entries (context, entries, NULL);
  if (!df_cli_parse (context, NAME, &argc, &argv))
    code = DF_CLI_EXIT_INPUT;
  else
    code = run (&o);

  df_cli_surface_options_clear (&o.surface);
  g_free (o.from_text);
  g_free (o.to_text);
  g_free (o.max_strain_text);
  g_free (o.seam_text);
  g_free (o.units_text);
  g_free (o.svg_path);
  g_free (o.csv_path);
  return code;
}
