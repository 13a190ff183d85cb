/* df-cli-devmap.c: `driftframe-cli devmap`: the developability map over a grid of the chart
 * (df-devmap.h): at each point the enclosed curvature of the geodesic disc of radius a and the
 * rim strain of a flat disc forced onto it; prints a summary and writes the CSV grid.
 * CLI layer: the map comes from the core. */
#include <math.h>
#include <stdio.h>

#include "df-cli-commands.h"
#include "df-cli-common.h"
#include "df-cli-report-pdf.h"
#include "df-decide-out.h"
#include "df-devmap.h"
#include "df-json-out.h"

#define NAME "devmap"

typedef struct
{
  DfCliSurfaceOptions surface;
  char    *radius_text;
  char    *grid_text;
  char    *units_text;
  char    *max_strain_text;
  char    *csv_path;
  char    *png_path;
  char    *png_size_text;
  int      directions;
  gboolean json;
} devmap_options;

static int
run (devmap_options *o)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface_spec) spec = NULL;
  g_autoptr (df_surface) surface = NULL;
  df_devmap map = { 0 };
  df_devmap_options dopt;
  double a, gu = 24, gv = 24, max_strain = 0.0, worst_strain = 0.0, worst_omega = 0.0;
  size_t worst = 0, worst_o = 0, over = 0;
  df_unit model, display;
  int code = DF_CLI_EXIT_OK;
  gboolean any = FALSE;
  df_diag diag;
  df_status st;

  df_devmap_options_init (&dopt);
  if (!df_cli_require ("--radius", o->radius_text, &error)
      || !df_cli_parse_number ("--radius", o->radius_text, &a, &error)
      || (o->grid_text != NULL && !df_cli_parse_pair ("--grid", o->grid_text, &gu, &gv, &error))
      || (o->max_strain_text != NULL
          && !df_cli_parse_number ("--max-strain-percent", o->max_strain_text, &max_strain,
                                   &error)))
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
  if (!(gu >= 2 && gu <= 400 && gv >= 2 && gv <= 400 && gu == floor (gu) && gv == floor (gv)))
    return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT, "--grid: two whole numbers in [2, 400]");
  if (o->directions != 0)
    {
      if (o->directions < 8 || o->directions > 1024)
        return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT, "--directions: %d is outside [8, 1024]",
                                o->directions);
      dopt.n_directions = (size_t) o->directions;
    }
  if (!df_cli_surface_load (&o->surface, &spec, &surface, &error))
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
  {
    int m, d;

    if (!df_cli_units (o->units_text, spec->units, &m, &d, &error))
      return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
    model = (df_unit) m;
    display = (df_unit) d;
  }
  /* --radius is in the display units. */
  a = df_unit_length (a, display, model);
  if (!(a > 0.0) || a > df_surface_size (surface))
    return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT, "--radius: %s must be positive and no "
                            "larger than the surface", o->radius_text);

  df_diag_clear (&diag);
  st = df_devmap_grid (surface, a, (size_t) gu, (size_t) gv, &dopt, &map, &diag);
  if (st != DF_OK)
    {
      df_status_to_gerror (st, &diag, &error);
      return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
    }
  for (size_t k = 0; k < map.nu * map.nv; k++)
    {
      const df_devmap_point *p = &map.points[k];

      if (!p->ok)
        continue;
      if (!any || fabs (p->strain) > fabs (worst_strain))
        {
          worst_strain = p->strain;
          worst = k;
        }
      if (!any || fabs (p->enclosed_rad) > fabs (worst_omega))
        {
          worst_omega = p->enclosed_rad;
          worst_o = k;
        }
      any = TRUE;
      if (o->max_strain_text != NULL && 100.0 * fabs (p->strain) > max_strain)
        over++;
    }
  if (o->png_path != NULL)
    {
      double pw = 1200, phh = 900;

      if (o->png_size_text != NULL
          && (!df_cli_parse_pair ("--png-size", o->png_size_text, &pw, &phh, &error)
              || pw != floor (pw) || phh != floor (phh)))
        {
          df_devmap_clear (&map);
          if (error == NULL)
            return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT, "--png-size: '%s' is not two "
                                    "whole numbers W,H", o->png_size_text);
          return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
        }
      if (!(pw >= 200 && pw <= 8000 && phh >= 200 && phh <= 8000))
        {
          df_devmap_clear (&map);
          return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT, "--png-size: %s is outside "
                                  "[200, 8000] pixels a side", o->png_size_text);
        }
      if (!df_cli_devmap_write_png (o->png_path, surface, &map, (int) pw, (int) phh,
                                o->max_strain_text != NULL ? max_strain : NAN,
                                df_unit_name (display), df_unit_length (a, model, display),
                                DF_DECIDE_CAUTION, &error))
        {
          df_devmap_clear (&map);
          return df_cli_fail (NAME, error, DF_CLI_EXIT_OUTPUT);
        }
    }
  if (o->csv_path != NULL
      && !df_devmap_csv_write (o->csv_path, surface, &map, model, display, &error))
    code = df_cli_fail (NAME, error, DF_CLI_EXIT_OUTPUT);

  if (code == DF_CLI_EXIT_OK && o->json)
    {
      g_autoptr (JsonBuilder) b = json_builder_new ();

      json_builder_begin_object (b);
      df_json_add_double (b, "radius", df_unit_length (a, model, display));
      json_builder_set_member_name (b, "grid");
      json_builder_begin_array (b);
      json_builder_add_int_value (b, (gint64) map.nu);
      json_builder_add_int_value (b, (gint64) map.nv);
      json_builder_end_array (b);
      json_builder_set_member_name (b, "points_with_disc");
      json_builder_add_int_value (b, (gint64) map.n_ok);
      df_json_add_double_or_null (b, "max_strain_percent", any, 100.0 * worst_strain);
      df_json_add_double_or_null (b, "max_strain_u", any, map.u[worst % map.nu]);
      df_json_add_double_or_null (b, "max_strain_v", any, map.v[worst / map.nu]);
      df_json_add_double_or_null (b, "max_enclosed_deg", any, worst_omega * 180.0 / G_PI);
      df_json_add_double_or_null (b, "max_enclosed_u", any, map.u[worst_o % map.nu]);
      df_json_add_double_or_null (b, "max_enclosed_v", any, map.v[worst_o / map.nu]);
      json_builder_set_member_name (b, "points_over_strain_limit");
      if (o->max_strain_text != NULL)
        json_builder_add_int_value (b, (gint64) over);
      else
        json_builder_add_null_value (b);
      json_builder_set_member_name (b, "units");
      json_builder_add_string_value (b, df_unit_name (display));
      json_builder_set_member_name (b, "caution");
      json_builder_add_string_value (b, DF_DECIDE_CAUTION);
      json_builder_end_object (b);
      df_cli_print_json (b);
    }
  else if (code == DF_CLI_EXIT_OK)
    {
      char b1[40], b2[40], b3[40];
      const char *un, *vn;

      df_cli_chart_names (surface, &un, &vn);
      printf ("Developability of %s for a flat patch of radius %s %s (%zu x %zu grid)\n",
              o->surface.label, df_cli_num (b1, sizeof b1, df_unit_length (a, model, display),
                                            6), df_unit_name (display), map.nu, map.nv);
      printf ("Points with a whole geodesic disc: %zu of %zu\n", map.n_ok, map.nu * map.nv);
      if (any)
        {
          printf ("Largest rim strain:        %s %% at %s = %s, %s = %s (> 0: the rim must "
                  "shrink)\n", df_cli_num (b1, sizeof b1, 100.0 * worst_strain, 4), un,
                  df_cli_num (b2, sizeof b2, map.u[worst % map.nu], 6), vn,
                  df_cli_num (b3, sizeof b3, map.v[worst / map.nu], 6));
          printf ("Largest enclosed curvature: %s deg at %s = %s, %s = %s\n",
                  df_cli_num (b1, sizeof b1, worst_omega * 180.0 / G_PI, 5), un,
                  df_cli_num (b2, sizeof b2, map.u[worst_o % map.nu], 6), vn,
                  df_cli_num (b3, sizeof b3, map.v[worst_o / map.nu], 6));
        }
      if (o->max_strain_text != NULL)
        printf ("Points beyond %s %% strain:   %zu\n", o->max_strain_text, over);
      printf ("\nCaution: %s\n", DF_DECIDE_CAUTION);
    }
  df_devmap_clear (&map);
  return code;
}

int
df_cli_devmap (int argc, char **argv)
{
  devmap_options o = { 0 };
  g_autoptr (GOptionContext) context = NULL;
  int code;
  const GOptionEntry entries[] = {
    { "radius", 'r', 0, G_OPTION_ARG_STRING, &o.radius_text,
      "Radius a of the flat patch (display units)", "A" },
    { "grid", 'g', 0, G_OPTION_ARG_STRING, &o.grid_text, "Grid points in u and v (default 24,24)",
      "NU,NV" },
    { "directions", 'd', 0, G_OPTION_ARG_INT, &o.directions,
      "Geodesics per disc (default 48)", "N" },
    { "max-strain-percent", 'm', 0, G_OPTION_ARG_STRING, &o.max_strain_text,
      "Count the points whose rim strain exceeds this", "P" },
    { "units", 'u', 0, G_OPTION_ARG_STRING, &o.units_text,
      "Display and export units: mm, cm, m or in (default: the surface's)", "UNIT" },
    { "csv", 0, 0, G_OPTION_ARG_FILENAME, &o.csv_path, "Write the grid as CSV", "OUT.csv" },
    { "png", 0, 0, G_OPTION_ARG_FILENAME, &o.png_path,
      "Draw the surface coloured by the rim strain, the --max-strain-percent limit ticked on "
      "the legend, as PNG", "OUT.png" },
    { "png-size", 0, 0, G_OPTION_ARG_STRING, &o.png_size_text,
      "Pixels of the PNG (default 1200,900)", "W,H" },
    { "json", 'j', 0, G_OPTION_ARG_NONE, &o.json, "Print the summary as JSON", NULL },
    { NULL },
  };

  context = df_cli_context_new (NAME, "where a flat patch of radius a cannot follow the surface",
                                "At each grid point: the enclosed curvature of the geodesic "
                                "disc of radius a, and the rim strain (2 pi a - C) / (2 pi a) of "
                                "a flat disc forced onto it.\n\nExit status: 0 done, 2 bad "
                                "input, 1 the CSV could not be written.");
  df_cli_add_surface_options (context, &o.surface);
  g_option_context_add_main_entries (context, entries, NULL);
  if (!df_cli_parse (context, NAME, &argc, &argv))
    code = DF_CLI_EXIT_INPUT;
  else
    code = run (&o);

  df_cli_surface_options_clear (&o.surface);
  g_free (o.radius_text);
  g_free (o.grid_text);
  g_free (o.units_text);
  g_free (o.max_strain_text);
  g_free (o.png_path);
  g_free (o.png_size_text);
  g_free (o.csv_path);
  return code;
}
