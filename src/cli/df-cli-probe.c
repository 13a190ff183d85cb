/* df-cli-probe.c: `driftframe-cli probe`: the local geometry at one chart point (point, normal,
 * metric, Christoffel symbols, Riemann tensor, curvatures) from df_surface_geometry, as text
 * or JSON. */
#include <stdio.h>
#include <string.h>

#include "df-units-convert.h"

#include "df-cli-commands.h"
#include "df-cli-common.h"
#include "df-json-out.h"

#define NAME "probe"

typedef struct
{
  DfCliSurfaceOptions surface;
  char    *at_text;
  char    *units_text;
  char    *curvature_text;
  gboolean json;
} probe_options;

/* What the figures are in: lengths, and the curvatures' labels. */
typedef struct
{
  const char *length;
  char       *gaussian;     /* "1/m^2" */
  char       *curvature;    /* "1/m" */
} probe_units;

static void
print_json (const probe_options *o, const probe_units *units, const df_surface *surface,
            const df_point_geometry *g)
{
  g_autoptr (JsonBuilder) b = json_builder_new ();

  json_builder_begin_object (b);
  json_builder_set_member_name (b, "surface");
  json_builder_add_string_value (b, o->surface.label);
  df_json_add_point_geometry (b, g);
  json_builder_set_member_name (b, "normal_side");
  json_builder_add_string_value (b, df_surface_normal_side (surface));
  /* The fit a data surface's curvature rests on (in the surface's own units). */
  df_json_add_fit (b, surface);
  json_builder_set_member_name (b, "units");
  json_builder_add_string_value (b, units->length);
  /* K per the curvature unit squared, H, k1, k2 per it (--curvature-units, else the length
   * unit; df-units-convert.h). */
  json_builder_set_member_name (b, "curvature_units");
  json_builder_add_string_value (b, units->gaussian);
  json_builder_set_member_name (b, "mean_curvature_units");
  json_builder_add_string_value (b, units->curvature);
  json_builder_end_object (b);
  df_cli_print_json (b);
}

static void
print_text (const probe_options *o, const df_surface_spec *spec, const probe_units *units,
            const df_surface *surface, const df_point_geometry *g)
{
  const char *un = units->length, *names[2];
  char a[40], b[40], c[40], d[40];

  df_cli_chart_names (surface, &names[0], &names[1]);
  printf ("Surface: %s (%s, lengths in %s)\n", o->surface.label, df_cli_kind_text (surface),
          spec->units);
  if (strcmp (un, spec->units) != 0 || strcmp (units->curvature + 2, spec->units) != 0)
    printf ("Shown in: %s, curvatures in %s and %s (the chart point, metric, Christoffel "
            "symbols and Riemann tensor stay in the chart's own coordinates, in %s)\n", un,
            units->gaussian, units->curvature, spec->units);
  /* A data surface's K is a second derivative of a fit: its quality goes first. */
  df_cli_print_fit (surface, spec->units);
  {
    /* Each chart coordinate with its unit where the surface says it: t's own (t-units), phi
     * in radians; a graph's x, y in the surface's units. */
    gboolean rev = df_surface_get_kind (surface) == DF_SURFACE_REVOLUTION;
    const char *t_unit = df_surface_spec_t_units (spec);
    const char *u_unit = rev ? t_unit : spec->units;

    printf ("Chart point: %s = %s%s%s, %s = %s %s\n", names[0],
            df_cli_num (a, sizeof a, g->u, 12), u_unit != NULL ? " " : "",
            u_unit != NULL ? u_unit : "", names[1], df_cli_num (b, sizeof b, g->v, 12),
            rev ? "rad" : spec->units);
  }
  printf ("Point:   (%s, %s, %s) %s\n", df_cli_num (a, sizeof a, g->point[0], 10),
          df_cli_num (b, sizeof b, g->point[1], 10), df_cli_num (c, sizeof c, g->point[2], 10),
          un);
  printf ("Normal:  (%s, %s, %s); %s\n", df_cli_num (a, sizeof a, g->normal[0], 10),
          df_cli_num (b, sizeof b, g->normal[1], 10), df_cli_num (c, sizeof c, g->normal[2], 10),
          df_surface_normal_side (surface));

  if (g->chart_regular)
    {
      printf ("\nMetric g_ij:          [[%s, %s], [%s, %s]]\n",
              df_cli_num (a, sizeof a, g->g[0][0], 10), df_cli_num (b, sizeof b, g->g[0][1], 10),
              df_cli_num (c, sizeof c, g->g[1][0], 10), df_cli_num (d, sizeof d, g->g[1][1], 10));
      printf ("Christoffel symbols Gamma^k_ij:\n");
      for (int k = 0; k < DF_DIM; k++)
        for (int i = 0; i < DF_DIM; i++)
          for (int j = i; j < DF_DIM; j++)
            printf ("  Gamma^%s_%s%s = %s\n", names[k], names[i], names[j],
                    df_cli_num (a, sizeof a, g->gamma[k][i][j], 10));
      /* On a surface the Riemann tensor has one independent component. */
      printf ("Riemann R^%s_%s%s%s = %s\n", names[0], names[1], names[0], names[1],
              df_cli_num (a, sizeof a, g->riemann[0][1][0][1], 10));
    }
  else
    {
      printf ("\nMetric g_ij:          [[%s, %s], [%s, %s]] (degenerate)\n",
              df_cli_num (a, sizeof a, g->g[0][0], 10), df_cli_num (b, sizeof b, g->g[0][1], 10),
              df_cli_num (c, sizeof c, g->g[1][0], 10), df_cli_num (d, sizeof d, g->g[1][1], 10));
      printf ("Note:                 %s\n", g->note);
    }

  if (!g->curvature_defined)
    {
      printf ("\nGaussian curvature K:  none here (concentrated: %s rad = %s deg)\n",
              df_cli_num (a, sizeof a, g->concentrated_rad, 10),
              df_cli_num (b, sizeof b, g->concentrated_rad * 180 / G_PI, 10));
      printf ("Mean curvature H:      none here\n");
      printf ("Principal curvatures:  none here\n");
      return;
    }
  printf ("\nGaussian curvature K:  %s %s\n", df_cli_num (a, sizeof a, g->K, 10),
          units->gaussian);
  printf ("Mean curvature H:      %s %s\n", df_cli_num (a, sizeof a, g->H, 10),
          units->curvature);
  printf ("Principal curvatures:  k1 = %s, k2 = %s %s\n", df_cli_num (a, sizeof a, g->k1, 10),
          df_cli_num (b, sizeof b, g->k2, 10), units->curvature);
}

static int
run (probe_options *o)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface_spec) spec = NULL;
  g_autoptr (df_surface) surface = NULL;
  df_point_geometry g;
  double u, v;
  df_diag diag;
  df_status st;

  if (!df_cli_parse_pair ("--at", o->at_text, &u, &v, &error)
      || !df_cli_surface_load (&o->surface, &spec, &surface, &error))
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
  if (!df_surface_contains (surface, u, v))
    {
      double u0, u1, v0, v1;
      const char *un, *vn;

      df_surface_get_domain (surface, &u0, &u1, &v0, &v1);
      df_cli_chart_names (surface, &un, &vn);
      return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT,
                              "--at: point (%.10g, %.10g) lies outside the surface (%s in "
                              "[%.6g, %.6g], %s in [%.6g, %.6g])", u, v, un, u0, u1, vn, v0, v1);
    }

  df_diag_clear (&diag);
  st = df_surface_geometry (surface, u, v, &g, &diag);
  if (st != DF_OK)
    {
      df_status_to_gerror (st, &diag, &error);
      g_prefix_error (&error, "--at %s: ", o->at_text);
      return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
    }
  {
    df_display_units du;
    probe_units pu = { spec->units, NULL, NULL };

    if (!df_cli_display_units (o->units_text, o->curvature_text, spec->units, &du, &error))
      return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
    /* One path for every conversion (a no-op when nothing is asked). */
    df_point_geometry_convert_display (&g, &du);
    if (o->units_text != NULL)
      pu.length = df_unit_name (du.length);
    pu.gaussian = df_cli_gaussian_units (&du, spec->units);
    pu.curvature = df_cli_curvature_units (&du, spec->units);
    if (o->json)
      print_json (o, &pu, surface, &g);
    else
      print_text (o, spec, &pu, surface, &g);
    g_free (pu.gaussian);
    g_free (pu.curvature);
  }
  return DF_CLI_EXIT_OK;
}

int
df_cli_probe (int argc, char **argv)
{
  probe_options o = { 0 };
  g_autoptr (GOptionContext) context = NULL;
  int code;
  const GOptionEntry entries[] = {
    { "at", 'a', 0, G_OPTION_ARG_STRING, &o.at_text,
      "Chart point: t,phi on a surface of revolution, x,y on a graph", "U,V" },
    { "json", 'j', 0, G_OPTION_ARG_NONE, &o.json, "Print the result as JSON", NULL },
    { "units", 'u', 0, G_OPTION_ARG_STRING, &o.units_text,
      "Show the point in mm, cm, m or in and the curvatures per that unit (default: the "
      "surface's units); the chart point and the tensors stay in the chart's coordinates",
      "UNIT" },
    { "curvature-units", 0, 0, G_OPTION_ARG_STRING, &o.curvature_text,
      "Show K per square of mm, cm, m or in and H, k1, k2 per that unit (default: the length "
      "unit), e.g. lengths in mm with K in 1/m^2", "UNIT" },
    { NULL },
  };

  context = df_cli_context_new (NAME, "local geometry at a point",
                                "Prints the point, the unit normal N, the metric g_ij, the "
                                "Christoffel symbols Gamma^k_ij, the Riemann tensor R^r_smn "
                                "(JSON indices 0 = u, 1 = v), and the Gaussian, mean and "
                                "principal curvatures.\n\nExit status: 0 done, 2 bad input.");
  g_option_context_add_main_entries (context, entries, NULL);
  df_cli_add_surface_options (context, &o.surface);
  if (!df_cli_parse (context, NAME, &argc, &argv))
    code = DF_CLI_EXIT_INPUT;
  else
    code = run (&o);

  df_cli_surface_options_clear (&o.surface);
  g_free (o.at_text);
  g_free (o.units_text);
  g_free (o.curvature_text);
  return code;
}
