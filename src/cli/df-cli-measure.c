/* df-cli-measure.c: `driftframe-cli measure`: reads a surface and a closed loop (CSV), measures
 * the loop with the core (df_loop_measure) and prints the holonomy, the enclosed curvature and
 * the steering figures as text or JSON, optionally writing the per-sample CSV. */
#include <math.h>
#include <stdio.h>

#include "df-cli-commands.h"
#include "df-cli-common.h"
#include "df-units-convert.h"
#include "df-json-out.h"

#define NAME "measure"

typedef struct
{
  DfCliSurfaceOptions surface;
  char    *loop_path;
  char    *samples_path;
  char    *tolerance_text;
  char    *fair_text;
  char    *units_text;
  char    *curvature_text;
  int      count;
  gboolean json;
} measure_options;

/* "fairing": which fairing was used and the largest deviation from the given points (none:
 * the curve passes through them). */
static void
add_fairing_json (JsonBuilder *b, const df_fair_info *fair, gsize n_points)
{
  json_builder_set_member_name (b, "fairing");
  json_builder_begin_object (b);
  json_builder_set_member_name (b, "method");
  json_builder_add_string_value (b, fair ? df_fair_method_name () : "none");
  df_json_add_double_or_null (b, "tolerance", fair != NULL, fair ? fair->tolerance : 0.0);
  df_json_add_double (b, "max_deviation", fair ? fair->max_deviation : 0.0);
  json_builder_set_member_name (b, "points");
  json_builder_add_int_value (b, (gint64) (fair ? fair->n_points : n_points));
  json_builder_set_member_name (b, "within_tolerance");
  json_builder_add_boolean_value (b, fair ? fair->met : TRUE);
  json_builder_end_object (b);
}

/* For a surface from data: the largest change of the holonomy when the fit tolerance is
 * halved and doubled (the same loop points, refitted), an error bar on the figure. FALSE when
 * a refit or its measurement fails (the figure is then left out, not guessed). */
static gboolean
fit_sensitivity (const df_surface_spec *spec, const df_surface *surface, const double (*uv)[2],
                 gsize n, const df_loop_options *lopt, double holonomy, double *out)
{
  df_fit_info info;
  double worst = 0.0;

  if (spec->data_key == NULL || !df_fit_get_info (df_surface_get_fn (surface), &info)
      || !(info.tolerance > 0.0))
    return FALSE;
  for (int k = 0; k < 2; k++)
    {
      g_autoptr (df_surface_spec) alt = df_surface_spec_copy (spec);
      g_autoptr (df_surface) s = NULL;
      g_autoptr (df_curve) c = NULL;
      g_auto (df_loop_result) r = { 0 };
      char text[G_ASCII_DTOSTR_BUF_SIZE];

      g_free (alt->fit_tolerance_text);
      alt->fit_tolerance_text = g_strdup (g_ascii_dtostr (text, sizeof text,
                                                          info.tolerance * (k ? 2.0 : 0.5)));
      s = df_surface_spec_build (alt, NULL);
      if (s == NULL
          || df_curve_new_through_points (s, uv, n, true, &c, NULL) != DF_OK
          || df_loop_measure (c, lopt, &r, NULL) != DF_OK)
        return FALSE;
      worst = MAX (worst, fabs (df_wrap_angle (r.holonomy_rad - holonomy)));
    }
  *out = worst;
  return TRUE;
}

static void
print_json (const measure_options *o, const df_surface_spec *spec, const df_surface *surface,
            const char *units, const char *k_units, const df_loop_result *r, double tol, const df_fair_info *fair,
            gsize n_points, gboolean has_sens, double sens)
{
  g_autoptr (JsonBuilder) b = json_builder_new ();

  json_builder_begin_object (b);
  json_builder_set_member_name (b, "surface");
  json_builder_add_string_value (b, o->surface.label);
  json_builder_set_member_name (b, "loop");
  json_builder_add_string_value (b, o->loop_path);
  df_json_add_loop_result (b, r);
  add_fairing_json (b, fair, n_points);
  json_builder_set_member_name (b, "normal_side");
  json_builder_add_string_value (b, df_surface_normal_side (surface));
  json_builder_set_member_name (b, "units");
  json_builder_add_string_value (b, units);
  /* Of mean_gaussian_curvature: --curvature-units, else the length unit's. */
  json_builder_set_member_name (b, "curvature_units");
  json_builder_add_string_value (b, k_units);
  df_json_add_double (b, "tolerance", tol);
  df_json_add_fit (b, surface);
  if (spec->data_key != NULL)
    df_json_add_double_or_null (b, "fit_sensitivity_rad", has_sens, sens);
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
            const char *un, const char *k_units, gsize n_points, const df_loop_result *r, double tol,
            const df_fair_info *fair, gboolean has_sens, double sens)
{
  char a[40], b[40];

  printf ("Surface: %s (%s, lengths in %s)\n", o->surface.label, df_cli_kind_text (surface), un);
  printf ("Normal:  %s\n", df_surface_normal_side (surface));
  /* The fit's residuals stay in the surface's own units, where its data are. */
  df_cli_print_fit (surface, spec->units);
  printf ("Loop:    %s, %zu points", o->loop_path, n_points);
  if (r->axis_winding != 0)
    printf (", winds %d time%s around the axis", r->axis_winding,
            ABS (r->axis_winding) == 1 ? "" : "s");
  printf ("%s\n", r->simple ? "" : ", CROSSES ITSELF");
  if (fair == NULL)
    printf ("Fairing: none (the curve passes through the points)\n\n");
  else
    printf ("Fairing: %s within %s %s: largest deviation from the points %s %s%s\n\n",
            df_fair_method_name (), df_cli_num (a, sizeof a, fair->tolerance, 6), un,
            df_cli_num (b, sizeof b, fair->max_deviation, 6), un,
            fair->met ? "" : " (MORE than the tolerance: the points are rougher than that at "
                             "their spacing; the lightest fairing is used)");

  print_angle_line ("Holonomy (about N, + anticlockwise):", r->holonomy_rad);
  if (has_sens)
    print_angle_line ("  moves with the fit (tolerance x0.5, x2):", sens);
  else if (spec->data_key != NULL)
    printf ("%-38s not available (a refit failed or the fit interpolates)\n",
            "  moves with the fit:");
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
      if (r->has_mean_K)
        printf ("%-38s %s %s (enclosed curvature / area)\n", "Mean Gaussian curvature:",
                df_cli_num (a, sizeof a, r->mean_K, 6), k_units);
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
  df_fair_info fair;
  double fair_tol = 0.0;
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
  if (o->fair_text != NULL)
    {
      if (!df_cli_parse_number ("--fair", o->fair_text, &fair_tol, &error))
        return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
      if (!(fair_tol > 0))
        return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT,
                                "--fair: %s is not a positive length", o->fair_text);
    }
  if (!df_cli_require ("--loop", o->loop_path, &error)
      || !df_cli_surface_load (&o->surface, &spec, &surface, &error)
      || !df_loop_csv_read (o->loop_path, surface, &uv, &n, &error))
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
  if (o->fair_text != NULL)
    {
      double (*faired)[2] = NULL;

      df_diag_clear (&diag);
      st = df_fair_closed_loop (surface, (const double (*)[2]) uv, n, fair_tol, &faired, &fair,
                                &diag);
      if (st != DF_OK)
        {
          df_status_to_gerror (st, &diag, &error);
          g_prefix_error (&error, "%s: --fair: ", o->loop_path);
          return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
        }
      /* The core allocates with malloc; uv is freed by g_free, the same allocator in GLib 2.46
       * and later. */
      g_free (uv);
      uv = faired;
    }

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

  if (o->samples_path != NULL)
    {
      df_csv_context csv = df_cli_csv_context (spec, surface, o->surface.label);

      if (!df_loop_samples_write (o->samples_path, &result, &csv, &error))
        return df_cli_fail (NAME, error, DF_CLI_EXIT_OUTPUT);
    }

  {
    double sens = 0.0;
    gboolean has_sens = fit_sensitivity (spec, surface, (const double (*)[2]) uv, n, &lopt,
                                         result.holonomy_rad, &sens);
    const char *units = spec->units;
    g_autofree char *k_units = NULL;
    df_display_units du;

    if (!df_cli_display_units (o->units_text, o->curvature_text, spec->units, &du, &error))
      return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
    /* One path for every conversion (a no-op when nothing is asked). */
    df_loop_result_convert_display (&result, &du);
    if (o->units_text != NULL)
      {
        if (o->fair_text != NULL)
          {
            fair.tolerance = df_unit_length (fair.tolerance, du.model, du.length);
            fair.max_deviation = df_unit_length (fair.max_deviation, du.model, du.length);
          }
        units = df_unit_name (du.length);
      }
    k_units = df_cli_gaussian_units (&du, spec->units);
    if (o->json)
      print_json (o, spec, surface, units, k_units, &result, lopt.rel_tol,
                  o->fair_text ? &fair : NULL, n, has_sens, sens);
    else
      print_text (o, spec, surface, units, k_units, n, &result, lopt.rel_tol,
                  o->fair_text ? &fair : NULL, has_sens, sens);
  }
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
    { "fair", 0, 0, G_OPTION_ARG_STRING, &o.fair_text,
      "Fair noisy points first: a smoothing spline within TOL (a length, in the surface's "
      "units) of them, so the steering radius shows the design, not the noise", "TOL" },
    { "tolerance", 0, 0, G_OPTION_ARG_STRING, &o.tolerance_text,
      "Relative tolerance of the transport integration (default 1e-11)", "REL" },
    { "units", 'u', 0, G_OPTION_ARG_STRING, &o.units_text,
      "Show lengths in mm, cm, m or in (areas in their square, curvature per length or "
      "squared length alike; default: the surface's units). Chart coordinates, angles and the "
      "--samples file stay as the surface defines them", "UNIT" },
    { "curvature-units", 0, 0, G_OPTION_ARG_STRING, &o.curvature_text,
      "Show the mean Gaussian curvature per square of mm, cm, m or in (default: the length "
      "unit), e.g. lengths in mm with K in 1/m^2", "UNIT" },
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
  g_free (o.fair_text);
  g_free (o.units_text);
  g_free (o.curvature_text);
  return code;
}
