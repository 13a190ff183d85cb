/* df-cli-compare.c: `driftframe-cli compare`: carries the same direction along two open paths
 * with common ends (df_compare_paths) and prints the angle between the two arrivals: how much
 * the route, not just the end points, decides the fibre direction. */
#include <stdio.h>

#include "df-cli-commands.h"
#include "df-cli-common.h"
#include "df-json-out.h"

#define NAME "compare"

typedef struct
{
  DfCliSurfaceOptions surface;
  char    *path_a;
  char    *path_b;
  char    *units_text;
  gboolean json;
} compare_options;

/* Reads one path file and interpolates it as an open curve; errors name the file. */
static df_curve *
read_path (const df_surface *surface, const char *option, const char *path, GError **error)
{
  g_autofree double (*uv)[2] = NULL;
  df_curve *curve = NULL;
  gsize n = 0;
  df_diag diag;
  df_status st;

  if (!df_cli_require (option, path, error) || !df_loop_csv_read (path, surface, &uv, &n, error))
    return NULL;
  df_diag_clear (&diag);
  st = df_curve_new_through_points (surface, (const double (*)[2]) uv, n, false, &curve, &diag);
  if (st != DF_OK)
    {
      df_status_to_gerror (st, &diag, error);
      g_prefix_error (error, "%s: ", path);
      return NULL;
    }
  return curve;
}

static int
run (compare_options *o)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface_spec) spec = NULL;
  g_autoptr (df_surface) surface = NULL;
  g_autoptr (df_curve) a = NULL;
  g_autoptr (df_curve) b = NULL;
  df_transport_options topt;
  df_transport_result ra = { 0 }, rb = { 0 };
  double len_a, len_b;
  int model, display;
  const char *units;
  double angle = 0.0;
  df_diag diag;
  df_status st;

  if (!df_cli_require ("--path-a", o->path_a, &error)
      || !df_cli_require ("--path-b", o->path_b, &error)
      || !df_cli_surface_load (&o->surface, &spec, &surface, &error))
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
  a = read_path (surface, "--path-a", o->path_a, &error);
  if (a == NULL)
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
  b = read_path (surface, "--path-b", o->path_b, &error);
  if (b == NULL)
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);

  df_transport_options_init (&topt);
  df_diag_clear (&diag);
  st = df_compare_paths (a, b, NULL, &topt, &angle, &ra, &rb, &diag);
  len_a = ra.length;
  len_b = rb.length;
  df_transport_result_clear (&ra);
  df_transport_result_clear (&rb);
  if (st != DF_OK)
    {
      df_status_to_gerror (st, &diag, &error);
      g_prefix_error (&error, "%s and %s: ", o->path_a, o->path_b);
      return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
    }
  if (!df_cli_units (o->units_text, spec->units, &model, &display, &error))
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
  units = o->units_text != NULL ? df_unit_name ((df_unit) display) : spec->units;
  len_a = df_unit_length (len_a, (df_unit) model, (df_unit) display);
  len_b = df_unit_length (len_b, (df_unit) model, (df_unit) display);

  if (o->json)
    {
      g_autoptr (JsonBuilder) j = json_builder_new ();

      json_builder_begin_object (j);
      json_builder_set_member_name (j, "surface");
      json_builder_add_string_value (j, o->surface.label);
      json_builder_set_member_name (j, "path_a");
      json_builder_add_string_value (j, o->path_a);
      json_builder_set_member_name (j, "path_b");
      json_builder_add_string_value (j, o->path_b);
      df_json_add_double (j, "angle_deg", angle * 180.0 / G_PI);
      df_json_add_double (j, "angle_rad", angle);
      json_builder_set_member_name (j, "normal_side");
      json_builder_add_string_value (j, df_surface_normal_side (surface));
      df_json_add_fit (j, surface);
      df_json_add_double (j, "length_a", len_a);
      df_json_add_double (j, "length_b", len_b);
      json_builder_set_member_name (j, "units");
      json_builder_add_string_value (j, units);
      df_json_add_double (j, "tolerance", topt.rel_tol);
      json_builder_set_member_name (j, "caution");
      json_builder_add_string_value (j, DF_CLI_CAUTION);
      json_builder_end_object (j);
      df_cli_print_json (j);
    }
  else
    {
      char d[40], r[40];

      printf ("Surface: %s (%s, lengths in %s)\n", o->surface.label,
              df_cli_kind_text (surface), units);
      printf ("Normal:  %s\n", df_surface_normal_side (surface));
      df_cli_print_fit (surface, spec->units);
      printf ("Paths:   A = %s, B = %s (common ends), lengths %s and %s %s\n\n", o->path_a,
              o->path_b, df_cli_num (d, sizeof d, len_a, 9), df_cli_num (r, sizeof r, len_b, 9),
              units);
      printf ("A direction carried along B arrives turned %s deg (%s rad) from the same "
              "direction carried along A,\nmeasured anticlockwise about N at the end point.\n",
              df_cli_num (d, sizeof d, angle * 180.0 / G_PI, 9),
              df_cli_num (r, sizeof r, angle, 9));
      printf ("\nCaution: %s\n", DF_CLI_CAUTION);
    }
  return DF_CLI_EXIT_OK;
}

int
df_cli_compare (int argc, char **argv)
{
  compare_options o = { 0 };
  g_autoptr (GOptionContext) context = NULL;
  int code;
  const GOptionEntry entries[] = {
    { "path-a", 'a', 0, G_OPTION_ARG_FILENAME, &o.path_a,
      "First path as CSV (u,v or x,y,z header)", "A.csv" },
    { "path-b", 'b', 0, G_OPTION_ARG_FILENAME, &o.path_b,
      "Second path, with the same start and end points", "B.csv" },
    { "json", 'j', 0, G_OPTION_ARG_NONE, &o.json, "Print the result as JSON", NULL },
    { "units", 'u', 0, G_OPTION_ARG_STRING, &o.units_text,
      "Show the paths' lengths in mm, cm, m or in (default: the surface's units)", "UNIT" },
    { NULL },
  };

  context = df_cli_context_new (NAME, "compare a direction carried along two paths",
                                "Carries the first path's starting direction along both paths "
                                "by parallel transport and reports the angle between the two "
                                "arrivals. On a curved surface it equals the total curvature "
                                "between the paths.\n\nExit status: 0 done, 2 bad input.");
  g_option_context_add_main_entries (context, entries, NULL);
  df_cli_add_surface_options (context, &o.surface);
  if (!df_cli_parse (context, NAME, &argc, &argv))
    code = DF_CLI_EXIT_INPUT;
  else
    code = run (&o);

  df_cli_surface_options_clear (&o.surface);
  g_free (o.path_a);
  g_free (o.path_b);
  g_free (o.units_text);
  return code;
}
