/* df-cli-geodesic.c: `driftframe-cli geodesic`: shoots a geodesic (the path a tape laid
 * without in-plane steering follows) from a chart point with a heading (df_geodesic_shoot) and
 * prints where it ends, optionally writing its samples as CSV. */
#include <math.h>
#include <stdio.h>

#include "df-cli-commands.h"
#include "df-cli-common.h"
#include "df-units-convert.h"
#include "df-json-out.h"

#define NAME "geodesic"

typedef struct
{
  DfCliSurfaceOptions surface;
  char    *from_text;
  char    *heading_text;
  char    *length_text;
  char    *samples_path;
  char    *units_text;
  int      count;
  gboolean json;
} geodesic_options;

static int
run (geodesic_options *o)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface_spec) spec = NULL;
  g_autoptr (df_surface) surface = NULL;
  g_auto (df_geodesic_result) result = { 0 };
  double u, v, heading_deg, length;
  size_t count = 101;
  const char *un, *vn, *units;
  int model = 0, display = 0;
  df_diag diag;
  df_status st;

  if (!df_cli_parse_pair ("--from", o->from_text, &u, &v, &error)
      || !df_cli_require ("--heading", o->heading_text, &error)
      || !df_cli_parse_number ("--heading", o->heading_text, &heading_deg, &error)
      || !df_cli_require ("--length", o->length_text, &error)
      || !df_cli_parse_number ("--length", o->length_text, &length, &error))
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
  /* An angle: a full turn either way covers every heading, and beyond that a huge value
   * (1e308) would overflow on the way to radians. */
  if (!(fabs (heading_deg) <= 360.0))
    return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT,
                            "--heading: %s degrees is outside [-360, 360]", o->heading_text);
  if (!(length > 0.0))
    return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT, "--length: must be positive, is %s",
                            o->length_text);
  if (o->count != 0)
    {
      if (o->count > DF_CLI_MAX_COUNT)
        return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT,
                                "--count: %d is above the cap of %d samples", o->count,
                                DF_CLI_MAX_COUNT);
      if (o->count < 2)
        return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT, "--count: %d is outside [2, %d]",
                                o->count, DF_CLI_MAX_COUNT);
      count = (size_t) o->count;
    }
  if (!df_cli_surface_load (&o->surface, &spec, &surface, &error))
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
  df_cli_chart_names (surface, &un, &vn);
  units = spec->units;
  if (o->units_text != NULL)
    {
      if (!df_cli_units (o->units_text, spec->units, &model, &display, &error))
        return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
      units = df_unit_name ((df_unit) display);
      /* --length is in the display units, as every length shown. */
      length = df_unit_length (length, (df_unit) display, (df_unit) model);
    }
  if (!df_surface_contains (surface, u, v))
    {
      double u0, u1, v0, v1;

      df_surface_get_domain (surface, &u0, &u1, &v0, &v1);
      return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT,
                              "--from: point (%.10g, %.10g) lies outside the surface (%s in "
                              "[%.6g, %.6g], %s in [%.6g, %.6g])", u, v, un, u0, u1, vn, v0, v1);
    }

  df_diag_clear (&diag);
  st = df_geodesic_shoot (surface, u, v, heading_deg * G_PI / 180.0, length, count, &result,
                          &diag);
  if (st != DF_OK)
    {
      df_status_to_gerror (st, &diag, &error);
      g_prefix_error (&error, "--from %s: ", o->from_text);
      return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
    }
  if (o->samples_path != NULL)
    {
      df_csv_context csv = df_cli_csv_context (spec, surface, o->surface.label);

      if (!df_geodesic_samples_write (o->samples_path, &result, &csv, &error))
        return df_cli_fail (NAME, error, DF_CLI_EXIT_OUTPUT);
    }
  if (o->units_text != NULL)
    {
      df_geodesic_result_convert (&result, (df_unit) model, (df_unit) display);
      length = df_unit_length (length, (df_unit) model, (df_unit) display);
    }

  if (o->json)
    {
      g_autoptr (JsonBuilder) j = json_builder_new ();

      json_builder_begin_object (j);
      json_builder_set_member_name (j, "surface");
      json_builder_add_string_value (j, o->surface.label);
      df_json_add_vector (j, "from", (double[2]) { u, v }, 2);
      df_json_add_double (j, "heading_deg", heading_deg);
      df_json_add_double (j, "requested_length", length);
      df_json_add_geodesic (j, &result);
      json_builder_set_member_name (j, "normal_side");
      json_builder_add_string_value (j, df_surface_normal_side (surface));
      df_json_add_fit (j, surface);
      json_builder_set_member_name (j, "units");
      json_builder_add_string_value (j, units);
      json_builder_set_member_name (j, "caution");
      json_builder_add_string_value (j, DF_CLI_CAUTION);
      json_builder_end_object (j);
      df_cli_print_json (j);
    }
  else
    {
      char a[40], b[40], c[40];

      printf ("Surface: %s (%s, lengths in %s)\n", o->surface.label,
              df_cli_kind_text (surface), units);
      printf ("Normal:  %s\n", df_surface_normal_side (surface));
      df_cli_print_fit (surface, spec->units);
      printf ("Start:   %s = %s, %s = %s, heading %s deg from the %s direction (anticlockwise "
              "about N)\n\n", un, df_cli_num (a, sizeof a, u, 10), vn,
              df_cli_num (b, sizeof b, v, 10), df_cli_num (c, sizeof c, heading_deg, 10), un);
      printf ("Length reached: %s %s", df_cli_num (a, sizeof a, result.length, 10), units);
      if (result.stopped_early)
        printf (" of %s requested: stopped early: %s\n",
                df_cli_num (b, sizeof b, length, 10), result.stop_reason);
      else
        printf ("\n");
      if (result.n_samples > 0)
        {
          const df_geodesic_sample *e = &result.samples[result.n_samples - 1];
          char d[40], f[40];

          printf ("End:     %s = %s, %s = %s; point (%s, %s, %s) %s\n", un,
                  df_cli_num (a, sizeof a, e->u, 10), vn, df_cli_num (b, sizeof b, e->v, 10),
                  df_cli_num (c, sizeof c, e->point[0], 10),
                  df_cli_num (d, sizeof d, e->point[1], 10),
                  df_cli_num (f, sizeof f, e->point[2], 10), units);
        }
      printf ("Samples: %zu%s%s\n", result.n_samples, o->samples_path ? ", written to " : "",
              o->samples_path ? o->samples_path : "");
      printf ("\nCaution: %s\n", DF_CLI_CAUTION);
    }
  return DF_CLI_EXIT_OK;
}

int
df_cli_geodesic (int argc, char **argv)
{
  geodesic_options o = { 0 };
  g_autoptr (GOptionContext) context = NULL;
  int code;
  const GOptionEntry entries[] = {
    { "from", 'f', 0, G_OPTION_ARG_STRING, &o.from_text,
      "Start point: t,phi on a surface of revolution, x,y on a graph", "U,V" },
    { "heading", 'd', 0, G_OPTION_ARG_STRING, &o.heading_text,
      "Start direction in degrees from the first chart direction, anticlockwise about N",
      "DEG" },
    { "length", 'L', 0, G_OPTION_ARG_STRING, &o.length_text,
      "Length to trace, in the surface's units (in --units when given)", "L" },
    { "units", 'u', 0, G_OPTION_ARG_STRING, &o.units_text,
      "Show lengths and points in mm, cm, m or in (default: the surface's units); chart "
      "coordinates, angles and the --samples file stay as the surface defines them", "UNIT" },
    { "json", 'j', 0, G_OPTION_ARG_NONE, &o.json, "Print the result as JSON", NULL },
    { "samples", 'o', 0, G_OPTION_ARG_FILENAME, &o.samples_path,
      "Write the path as CSV (s,u,v,x,y,z,tx,ty,tz)", "OUT.csv" },
    { "count", 'n', 0, G_OPTION_ARG_INT, &o.count,
      "Number of samples, 2 to 100000 (default 101)", "N" },
    { NULL },
  };

  context = df_cli_context_new (NAME, "trace a geodesic from a point",
                                "Traces the surface's straightest path (a geodesic: what a tape "
                                "laid without in-plane steering follows). It stops early at the "
                                "edge of the surface or at a cone apex, and says where and "
                                "why; it runs through poles.\n\nExit "
                                "status: 0 done, 2 bad input, 1 the samples file could not be "
                                "written.");
  g_option_context_add_main_entries (context, entries, NULL);
  df_cli_add_surface_options (context, &o.surface);
  if (!df_cli_parse (context, NAME, &argc, &argv))
    code = DF_CLI_EXIT_INPUT;
  else
    code = run (&o);

  df_cli_surface_options_clear (&o.surface);
  g_free (o.from_text);
  g_free (o.heading_text);
  g_free (o.length_text);
  g_free (o.samples_path);
  g_free (o.units_text);
  return code;
}
