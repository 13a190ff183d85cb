/* df-cli-measure.c: `driftframe-cli measure`: reads a surface and a closed loop (CSV), measures
 * the loop with the core (df_loop_measure) and prints the holonomy, the enclosed curvature and
 * the steering figures as text or JSON, optionally writing the per-sample CSV. */
#include <stdio.h>

#include "df-cli-commands.h"
#include "df-cli-common.h"
#include "df-json-out.h"

#define NAME "measure"

typedef struct
{
  DfCliSurfaceOptions surface;
  char    *loop_path;
  char    *samples_path;
  char    *tolerance_text;
  int      count;
  gboolean json;
} measure_options;

static void
print_json (const measure_options *o, const df_surface_spec *spec, const df_surface *surface,
            const df_loop_result *r, double tol)
{
  g_autoptr (JsonBuilder) b = json_builder_new ();

  json_builder_begin_object (b);
  json_builder_set_member_name (b, "surface");
  json_builder_add_string_value (b, o->surface.label);
  json_builder_set_member_name (b, "loop");
  json_builder_add_string_value (b, o->loop_path);
  df_json_add_loop_result (b, r);
  json_builder_set_member_name (b, "normal_side");
  json_builder_add_string_value (b, df_surface_normal_side (surface));
  json_builder_set_member_name (b, "units");
  json_builder_add_string_value (b, spec->units);
  df_json_add_double (b, "tolerance", tol);
  json_builder_set_member_name (b, "caution");
  json_builder_add_string_value (b, DF_CLI_CAUTION);
  json_builder_end_object (b);
  df_cli_print_json (b);
}

static void
print_angle_line (const char *label, double rad)
{
  char d[40], r[40];

  printf ("%-38s %s deg  (%s rad)\n", label, df_cli_num (d, sizeof d, rad * 180.0 / G_PI, 9),
          df_cli_num (r, sizeof r, rad, 9));
}

static void
print_text (const measure_options *o, const df_surface_spec *spec, const df_surface *surface,
            gsize n_points, const df_loop_result *r, double tol)
{
  const char *un = spec->units;
  char a[40], b[40];

  printf ("Surface: %s (%s, lengths in %s)\n", o->surface.label, df_cli_kind_text (surface), un);
  printf ("Normal:  %s\n", df_surface_normal_side (surface));
  printf ("Loop:    %s, %zu points", o->loop_path, n_points);
  if (r->axis_winding != 0)
    printf (", winds %d time%s around the axis", r->axis_winding,
            ABS (r->axis_winding) == 1 ? "" : "s");
  printf ("%s\n\n", r->simple ? "" : ", CROSSES ITSELF");

  print_angle_line ("Holonomy (about N, + anticlockwise):", r->holonomy_rad);
  if (r->bounds_disc && !r->enclosed_available)
    printf ("%-38s not computed (see the note)\n", "Enclosed curvature:");
  else if (r->bounds_disc)
    {
      print_angle_line ("Enclosed curvature (integral K dA):", r->enclosed_curvature_rad);
      printf ("%-38s %s rad (achieved estimate)\n", "  its error:",
              df_cli_num (a, sizeof a, r->enclosed_error_rad, 2));
      if (r->concentrated_rad != 0.0)
        print_angle_line ("  of which at the cone apex:", r->concentrated_rad);
      printf ("%-38s %s rad\n", "Gauss-Bonnet residual:",
              df_cli_num (a, sizeof a, r->residual_rad, 3));
      printf ("%-38s %s %s^2 (%s of the loop)\n", "Enclosed area:",
              df_cli_num (a, sizeof a, r->area, 9), un, r->disc_on_left ? "left" : "right");
      if (r->has_other_disc)
        {
          print_angle_line ("The cap on the other side:", r->other_enclosed_curvature_rad);
          printf ("%-38s %s %s^2\n", "  its area:", df_cli_num (a, sizeof a, r->other_area, 9),
                  un);
        }
    }
  else
    printf ("%-38s not defined: the loop bounds no disc\n", "Enclosed curvature:");
  if (r->disc_note[0] != '\0')
    printf ("%-38s %s\n", "Note:", r->disc_note);
  if (r->enclosed_note[0] != '\0')
    printf ("%-38s %s\n", r->disc_note[0] ? "" : "Note:", r->enclosed_note);
  print_angle_line ("Total geodesic curvature:", r->total_geodesic_curvature_rad);
  printf ("%-38s %s %s\n", "Length:", df_cli_num (a, sizeof a, r->length, 9), un);
  if (r->has_steering_radius)
    printf ("%-38s %s %s (tightest in-surface bend, max |k_g| %s 1/%s)\n",
            "Minimum steering radius:", df_cli_num (a, sizeof a, r->min_steering_radius, 6), un,
            df_cli_num (b, sizeof b, r->max_abs_kg, 6), un);
  else
    printf ("%-38s none (the loop is a geodesic: no in-surface bend)\n",
            "Minimum steering radius:");
  printf ("%-38s relative tolerance %s, %zu right-hand side evaluations, %zu samples\n",
          "Transport:", df_cli_num (a, sizeof a, tol, 3), r->rhs_evals, r->n_samples);
  printf ("\nCaution: %s\n", DF_CLI_CAUTION);
}

static int
run (measure_options *o)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface_spec) spec = NULL;
  g_autoptr (df_surface) surface = NULL;
  g_autoptr (df_curve) curve = NULL;
  g_auto (df_loop_result) result = { 0 };
  g_autofree double (*uv)[2] = NULL;
  df_loop_options lopt;
  gsize n = 0;
  df_diag diag;
  df_status st;

  df_loop_options_init (&lopt);
  if (o->tolerance_text != NULL)
    {
      if (!df_cli_parse_number ("--tolerance", o->tolerance_text, &lopt.rel_tol, &error))
        return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
      if (!(lopt.rel_tol >= 1e-14 && lopt.rel_tol <= 1e-3))
        return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT,
                                "--tolerance: %s is outside [1e-14, 1e-3]", o->tolerance_text);
    }
  if (o->count != 0)
    {
      if (o->count > DF_CLI_MAX_COUNT)
        return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT,
                                "--count: %d is above the cap of %d samples", o->count,
                                DF_CLI_MAX_COUNT);
      if (o->count < 8)
        return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT,
                                "--count: %d is outside [8, %d]", o->count, DF_CLI_MAX_COUNT);
      lopt.n_samples = (size_t) o->count;
    }
  if (!df_cli_require ("--loop", o->loop_path, &error)
      || !df_cli_surface_load (&o->surface, &spec, &surface, &error)
      || !df_loop_csv_read (o->loop_path, surface, &uv, &n, &error))
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);

  df_diag_clear (&diag);
  st = df_curve_new_through_points (surface, (const double (*)[2]) uv, n, true, &curve, &diag);
  if (st == DF_OK)
    {
      df_diag_clear (&diag);
      st = df_loop_measure (curve, &lopt, &result, &diag);
    }
  if (st != DF_OK)
    {
      df_status_to_gerror (st, &diag, &error);
      g_prefix_error (&error, "%s: ", o->loop_path);
      return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
    }

  if (o->samples_path != NULL && !df_loop_samples_write (o->samples_path, &result, &error))
    return df_cli_fail (NAME, error, DF_CLI_EXIT_OUTPUT);

  if (o->json)
    print_json (o, spec, surface, &result, lopt.rel_tol);
  else
    print_text (o, spec, surface, n, &result, lopt.rel_tol);
  return DF_CLI_EXIT_OK;
}

int
df_cli_measure (int argc, char **argv)
{
  measure_options o = { 0 };
  g_autoptr (GOptionContext) context = NULL;
  int code;
  const GOptionEntry entries[] = {
    { "loop", 'l', 0, G_OPTION_ARG_FILENAME, &o.loop_path,
      "Closed loop as CSV with header u,v (chart) or x,y,z (space, projected)", "FILE.csv" },
    { "json", 'j', 0, G_OPTION_ARG_NONE, &o.json, "Print the result as JSON", NULL },
    { "samples", 'o', 0, G_OPTION_ARG_FILENAME, &o.samples_path,
      "Write the carried frame along the loop as CSV (s,u,v,x,y,z,vx,vy,vz,angle_deg,k_g,K)",
      "OUT.csv" },
    { "count", 'n', 0, G_OPTION_ARG_INT, &o.count,
      "Number of samples, 8 to 100000 (default 200)", "N" },
    { "tolerance", 0, 0, G_OPTION_ARG_STRING, &o.tolerance_text,
      "Relative tolerance of the transport integration (default 1e-11)", "REL" },
    { NULL },
  };

  context = df_cli_context_new (NAME, "measure a closed loop's holonomy",
                                "Carries a direction once around the loop by parallel transport "
                                "and reports how far it turned (the holonomy), the total "
                                "Gaussian curvature the loop encloses (computed independently), "
                                "their difference, the loop's length, area and the tightest "
                                "in-surface bend.\n\nExit status: 0 done, 2 bad input, 1 the "
                                "samples file could not be written.");
  g_option_context_add_main_entries (context, entries, NULL);
  df_cli_add_surface_options (context, &o.surface);
  if (!df_cli_parse (context, NAME, &argc, &argv))
    code = DF_CLI_EXIT_INPUT;
  else
    code = run (&o);

  df_cli_surface_options_clear (&o.surface);
  g_free (o.loop_path);
  g_free (o.samples_path);
  g_free (o.tolerance_text);
  return code;
}
