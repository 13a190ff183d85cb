/* df-cli-drape.c: `driftframe-cli drape`: the kinematic drape of a woven ply (df_drape_new)
 * over a ply outline from a start point, a warp direction and a cell size; prints the shear,
 * the locking-angle and fibre-deviation flags, the closure check and the flat pattern's size,
 * and writes the pins (CSV), the flat outline (CSV), the flat pattern (SVG at true scale) and
 * the whole cells' boundary as a loop (CSV) that `measure` reads.
 * CLI layer: parses, calls the core, prints; computes no geometry. */
#include <math.h>
#include <string.h>
#include <stdio.h>

#include "df-cli-commands.h"
#include "df-cli-common.h"
#include "df-units.h"
#include "df-drape-out.h"
#include "df-json-out.h"

#define NAME "drape"

/* Points a thread segment in the boundary loop (crowded towards the pins). `measure` runs a
 * cubic spline through them, which rounds each corner at a pin over a few point spacings; the
 * enclosed curvature then differs by about K x spacing^2 a corner. Measured on a sphere of
 * R = 100 with 4 mm cells (96 segments): 1.1e-10 rad with 64 points, 1.9e-9 with 32; evenly
 * spaced, 64 gave 1.1e-7. */
#define BOUNDARY_POINTS_PER_SEGMENT 64

typedef struct
{
  DfCliSurfaceOptions surface;
  char    *loop_path;
  char    *start_text;
  char    *warp_text;
  char    *cell_text;
  char    *units_text;
  char    *project_path;
  char    *max_shear_text;
  char    *max_dev_text;
  char    *svg_path;
  char    *nodes_path;
  char    *flat_path;
  char    *boundary_path;
  gboolean json;
} drape_options;

/* A limit from the project's [limits] group; absent keys leave *out as it is. */
static gboolean
read_limit (GKeyFile *kf, const char *path, const char *key, double *out, GError **error)
{
  g_autofree char *text = NULL;
  g_autofree char *where = NULL;

  if (!g_key_file_has_key (kf, "limits", key, NULL))
    return TRUE;
  text = g_key_file_get_string (kf, "limits", key, NULL);
  where = g_strdup_printf ("%s: [limits] %s", path, key);
  if (!df_cli_parse_number (where, text, out, error))
    return FALSE;
  if (!(*out >= 0 && *out < 90))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE, "%s: %s deg must lie in [0, 90)",
                   where, text);
      return FALSE;
    }
  return TRUE;
}

static gboolean
read_limits (drape_options *o, double *max_shear_deg, double *max_dev_deg, GError **error)
{
  if (o->project_path != NULL)
    {
      g_autoptr (GKeyFile) kf = g_key_file_new ();

      if (!g_key_file_load_from_file (kf, o->project_path, G_KEY_FILE_NONE, error))
        {
          g_prefix_error (error, "%s: ", o->project_path);
          return FALSE;
        }
      if (!read_limit (kf, o->project_path, "max-shear-deg", max_shear_deg, error)
          || !read_limit (kf, o->project_path, "max-fibre-deviation-deg", max_dev_deg, error))
        return FALSE;
    }
  /* An option given on the command line wins over the project. */
  if (o->max_shear_text != NULL
      && !df_cli_parse_number ("--max-shear-deg", o->max_shear_text, max_shear_deg, error))
    return FALSE;
  if (o->max_dev_text != NULL
      && !df_cli_parse_number ("--max-fibre-deviation-deg", o->max_dev_text, max_dev_deg,
                               error))
    return FALSE;
  if (isfinite (*max_shear_deg) && !(*max_shear_deg >= 0 && *max_shear_deg < 90))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                   "--max-shear-deg: %g must lie in [0, 90)", *max_shear_deg);
      return FALSE;
    }
  if (isfinite (*max_dev_deg) && !(*max_dev_deg >= 0 && *max_dev_deg <= 180))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                   "--max-fibre-deviation-deg: %g must lie in [0, 180]", *max_dev_deg);
      return FALSE;
    }
  return TRUE;
}

/* The ply outline as a dense chart polygon: the loop's spline, sampled. */
static gboolean
read_outline (drape_options *o, const df_surface *surface, double (**poly)[2], gsize *n_poly,
              GError **error)
{
  g_autofree double (*uv)[2] = NULL;
  g_autoptr (df_curve) curve = NULL;
  gsize n = 0;
  df_diag diag;
  df_status st;

  if (!df_cli_require ("--loop", o->loop_path, error)
      || !df_loop_csv_read (o->loop_path, surface, &uv, &n, error))
    return FALSE;
  df_diag_clear (&diag);
  st = df_curve_new_through_points (surface, (const double (*)[2]) uv, n, true, &curve, &diag);
  if (st != DF_OK)
    {
      df_status_to_gerror (st, &diag, error);
      g_prefix_error (error, "%s: ", o->loop_path);
      return FALSE;
    }
  if (df_curve_get_coords (curve) != DF_COORDS_CHART)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY,
                   "%s: the ply comes near a pole of the surface, where the drape's chart is "
                   "singular; move it or split it", o->loop_path);
      return FALSE;
    }
  if (df_curve_axis_winding (curve) != 0 || df_curve_tube_winding (curve) != 0)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY,
                   "%s: the ply outline winds round the surface and bounds no patch to drape",
                   o->loop_path);
      return FALSE;
    }
  *n_poly = df_curve_sample_plane (curve, MAX (8 * n, 2048), poly);
  if (*n_poly == 0)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY, "%s: out of memory",
                   o->loop_path);
      return FALSE;
    }
  return TRUE;
}

static void
print_text (const drape_options *o, const df_surface *surface, const df_surface_spec *spec,
            const df_drape *d, double u, double v, double warp_deg,
            const df_drape_boundary_info *bi, const char *units, double f)
{
  const df_drape_summary *s = df_drape_get_summary (d);
  const df_drape_options *opt = df_drape_get_options (d);
  const char *un, *vn;
  const double deg = 180 / G_PI;
  char a[40], b[40], c[40], e[40];

  df_cli_chart_names (surface, &un, &vn);
  printf ("Surface: %s (%s, lengths in %s)\n", o->surface.label, df_cli_kind_text (surface),
          spec->units);
  if (strcmp (units, spec->units) != 0)
    printf ("Shown in: %s (the cell and the flat pattern; the chart point stays in the chart's "
            "own coordinates)\n", units);
  printf ("Normal:  %s\n", df_surface_normal_side (surface));
  printf ("Start:   %s = %s, %s = %s; warp %s deg from the %s direction (anticlockwise about "
          "N), weft at +90 deg; cell %s %s\n\n", un, df_cli_num (a, sizeof a, u, 10), vn,
          df_cli_num (b, sizeof b, v, 10), df_cli_num (c, sizeof c, warp_deg, 10), un,
          df_cli_num (e, sizeof e, f * opt->cell, 10), units);
  printf ("Cells over the ply:            %zu (%zu whole), %zu pins placed\n", s->n_cells,
          s->n_whole_cells, s->n_nodes);
  printf ("Max shear (90 - crossing):     %s deg at %s = %s, %s = %s (cells: %s deg)\n",
          df_cli_num (a, sizeof a, s->max_shear_rad * deg, 6), un,
          df_cli_num (b, sizeof b, s->max_shear_u, 8), vn,
          df_cli_num (c, sizeof c, s->max_shear_v, 8),
          df_cli_num (e, sizeof e, s->max_cell_shear_rad * deg, 6));
  if (isfinite (opt->max_shear_rad))
    printf ("Cells past the locking angle:  %zu (limit %s deg)\n", s->n_cells_over_limit,
            df_cli_num (a, sizeof a, opt->max_shear_rad * deg, 6));
  else
    printf ("Cells past the locking angle:  no limit given (--max-shear-deg or [limits] "
            "max-shear-deg of --project)\n");
  printf ("Max warp deviation:            %s deg at %s = %s, %s = %s",
          df_cli_num (a, sizeof a, s->max_warp_deviation_rad * deg, 6), un,
          df_cli_num (b, sizeof b, s->max_warp_deviation_u, 8), vn,
          df_cli_num (c, sizeof c, s->max_warp_deviation_v, 8));
  if (isfinite (opt->max_fibre_deviation_rad))
    printf ("; %zu pins past %s deg\n", s->n_nodes_over_deviation,
            df_cli_num (a, sizeof a, opt->max_fibre_deviation_rad * deg, 6));
  else
    printf ("\n");
  printf ("Enclosed curvature (whole cells, sum of angle excess): %s rad\n",
          df_cli_num (a, sizeof a, s->enclosed_curvature_rad, 10));
  printf ("Cell closure (|excess - integral K dA|, worst cell): %s rad\n",
          df_cli_num (a, sizeof a, s->closure_max_residual_rad, 3));
  if (isfinite (s->flat_area))
    printf ("Flat pattern:                  area %s %s^2, %s x %s %s (warp x weft)\n",
            df_cli_num (a, sizeof a, f * f * s->flat_area, 8), units,
            df_cli_num (b, sizeof b, f * (s->flat_hi[0] - s->flat_lo[0]), 8),
            df_cli_num (c, sizeof c, f * (s->flat_hi[1] - s->flat_lo[1]), 8), units);
  else
    printf ("Flat pattern:                  incomplete: %zu of %zu outline points lie in no "
            "cell (the net does not reach them)\n", s->n_outline_unmapped, s->n_outline);
  if (s->n_nodes_lost > 0)
    printf ("Pins not placed:               %zu; first: %s\n", s->n_nodes_lost, s->lost_note);
  if (o->boundary_path != NULL)
    {
      printf ("Boundary loop:                 %s: %zu cells, excess %s rad\n", o->boundary_path,
              bi->n_cells, df_cli_num (a, sizeof a, bi->excess_rad, 10));
      if (bi->n_whole_left_out > 0 || bi->n_cells_filled > 0)
        printf ("                               the whole cells are not one simply connected "
                "piece: it is the outer boundary of the largest (%zu whole cells left out, "
                "%zu cells of holes inside)\n", bi->n_whole_left_out, bi->n_cells_filled);
    }
  printf ("\nCaution: %s\n", DF_DRAPE_CAUTION);
}

static int
run (drape_options *o)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface_spec) spec = NULL;
  g_autoptr (df_surface) surface = NULL;
  g_autoptr (df_drape) drape = NULL;
  g_autofree double (*poly)[2] = NULL;
  double u, v, warp_deg, cell, max_shear_deg = NAN, max_dev_deg = NAN, f = 1.0;
  const char *units;
  gsize n_poly = 0;
  df_drape_options opt;
  df_drape_boundary_info bi = { 0 };
  df_diag diag;
  df_status st;

  if (!df_cli_parse_pair ("--start", o->start_text, &u, &v, &error)
      || !df_cli_require ("--warp-deg", o->warp_text, &error)
      || !df_cli_parse_number ("--warp-deg", o->warp_text, &warp_deg, &error)
      || !df_cli_require ("--cell", o->cell_text, &error)
      || !df_cli_parse_number ("--cell", o->cell_text, &cell, &error)
      || !read_limits (o, &max_shear_deg, &max_dev_deg, &error))
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
  if (!(cell > 0.0))
    return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT, "--cell: must be positive, is %s",
                            o->cell_text);
  /* A project carries its own surface: use it unless one is given. */
  if (o->project_path != NULL && o->surface.surface_path == NULL && o->surface.preset == NULL)
    o->surface.surface_path = g_strdup (o->project_path);
  if (!df_cli_surface_load (&o->surface, &spec, &surface, &error)
      || !read_outline (o, surface, &poly, &n_poly, &error))
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
  units = spec->units;

  if (o->units_text != NULL)
    {
      int model, display;

      if (!df_cli_units (o->units_text, spec->units, &model, &display, &error))
        return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
      units = df_unit_name ((df_unit) display);
      /* --cell is given in the display unit; the net is built in the surface's. */
      f = df_unit_length (1.0, (df_unit) model, (df_unit) display);
      cell /= f;
    }
  df_drape_options_init (&opt);
  opt.warp_rad = warp_deg * G_PI / 180.0;
  opt.cell = cell;
  opt.max_shear_rad = max_shear_deg * G_PI / 180.0;
  opt.max_fibre_deviation_rad = max_dev_deg * G_PI / 180.0;
  df_diag_clear (&diag);
  st = df_drape_new (surface, (const double (*)[2]) poly, n_poly, u, v, &opt, &drape, &diag);
  if (st != DF_OK)
    {
      df_status_to_gerror (st, &diag, &error);
      g_prefix_error (&error, "--start %s: ", o->start_text);
      return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
    }

  /* The SVG is at true scale in the surface's unit whatever --units says (its width and
   * height carry the unit, so the drawing is the same physical size either way). */
  if ((o->nodes_path != NULL && !df_drape_nodes_write_scaled (o->nodes_path, drape, f, &error))
      || (o->flat_path != NULL && !df_drape_flat_write_scaled (o->flat_path, drape, f, &error))
      || (o->svg_path != NULL && !df_drape_svg_write (o->svg_path, drape, spec->units, &error))
      || (o->boundary_path != NULL
          && !df_drape_boundary_write (o->boundary_path, drape, BOUNDARY_POINTS_PER_SEGMENT,
                                       &bi, &error)))
    return df_cli_fail (NAME, error, DF_CLI_EXIT_OUTPUT);

  if (o->json)
    {
      g_autoptr (JsonBuilder) j = json_builder_new ();

      json_builder_begin_object (j);
      json_builder_set_member_name (j, "surface");
      json_builder_add_string_value (j, o->surface.label);
      df_json_add_vector (j, "start", (double[2]) { u, v }, 2);
      df_json_add_drape_scaled (j, drape, f);
      if (o->boundary_path != NULL)
        {
          json_builder_set_member_name (j, "boundary");
          json_builder_begin_object (j);
          json_builder_set_member_name (j, "file");
          json_builder_add_string_value (j, o->boundary_path);
          json_builder_set_member_name (j, "cells");
          json_builder_add_int_value (j, (gint64) bi.n_cells);
          json_builder_set_member_name (j, "all_whole_cells");
          json_builder_add_boolean_value (j, bi.n_whole_left_out == 0 && bi.n_cells_filled == 0);
          df_json_add_double (j, "excess_rad", bi.excess_rad);
          json_builder_set_member_name (j, "pieces");
          json_builder_add_int_value (j, (gint64) bi.n_pieces);
          json_builder_set_member_name (j, "whole_cells_left_out");
          json_builder_add_int_value (j, (gint64) bi.n_whole_left_out);
          json_builder_set_member_name (j, "cells_filled");
          json_builder_add_int_value (j, (gint64) bi.n_cells_filled);
          json_builder_end_object (j);
        }
      json_builder_set_member_name (j, "normal_side");
      json_builder_add_string_value (j, df_surface_normal_side (surface));
      json_builder_set_member_name (j, "units");
      json_builder_add_string_value (j, units);
      json_builder_end_object (j);
      df_cli_print_json (j);
    }
  else
    print_text (o, surface, spec, drape, u, v, warp_deg, &bi, units, f);
  return DF_CLI_EXIT_OK;
}

int
df_cli_drape (int argc, char **argv)
{
  drape_options o = { 0 };
  g_autoptr (GOptionContext) context = NULL;
  int code;
  const GOptionEntry entries[] = {
    { "loop", 'l', 0, G_OPTION_ARG_FILENAME, &o.loop_path,
      "The ply outline (loop CSV: u,v or x,y,z)", "PLY.csv" },
    { "start", 'a', 0, G_OPTION_ARG_STRING, &o.start_text,
      "Start pin inside the ply: t,phi on a surface of revolution, x,y on a graph", "U,V" },
    { "warp-deg", 'w', 0, G_OPTION_ARG_STRING, &o.warp_text,
      "Warp direction at the start, degrees from the first chart direction (t or x), "
      "anticlockwise about N; the weft starts at +90", "A" },
    { "cell", 'c', 0, G_OPTION_ARG_STRING, &o.cell_text,
      "Thread length between pins, in the surface's units (in --units when given)", "H" },
    { "units", 'u', 0, G_OPTION_ARG_STRING, &o.units_text,
      "Show and export lengths (the cell, the flat pattern, the pins' CSV) in mm, cm, m or in "
      "(default: the surface's units); the SVG stays at true scale in the surface's", "UNIT" },
    { "project", 0, 0, G_OPTION_ARG_FILENAME, &o.project_path,
      "Project whose [limits] max-shear-deg and max-fibre-deviation-deg apply (and whose "
      "surface, unless --surface or --preset is given)", "FILE.dfproj" },
    { "max-shear-deg", 0, 0, G_OPTION_ARG_STRING, &o.max_shear_text,
      "Locking angle: flag cells sheared more (overrides the project)", "DEG" },
    { "max-fibre-deviation-deg", 0, 0, G_OPTION_ARG_STRING, &o.max_dev_text,
      "Flag pins whose warp deviates more from the intended direction", "DEG" },
    { "json", 'j', 0, G_OPTION_ARG_NONE, &o.json, "Print the result as JSON", NULL },
    { "svg", 0, 0, G_OPTION_ARG_FILENAME, &o.svg_path,
      "Write the flat pattern as SVG at true scale", "OUT.svg" },
    { "nodes", 0, 0, G_OPTION_ARG_FILENAME, &o.nodes_path,
      "Write the pins as CSV (i,j,u,v,x,y,z,inside,shear_deg,warp_deviation_deg,flat_x,flat_y)",
      "OUT.csv" },
    { "flat", 0, 0, G_OPTION_ARG_FILENAME, &o.flat_path,
      "Write the flat outline as CSV (u,v,flat_x,flat_y)", "OUT.csv" },
    { "boundary", 0, 0, G_OPTION_ARG_FILENAME, &o.boundary_path,
      "Write the boundary of the whole cells as a loop CSV (u,v) for `measure`; when they are "
      "not one simply connected piece, the outer boundary of the largest", "OUT.csv" },
    { NULL },
  };

  context = df_cli_context_new (NAME, "drape a woven ply: shear, locking and the flat pattern",
                                "Builds the pin-jointed net of a woven fabric (inextensible "
                                "warp and weft pinned every H, each cell a rhombus of geodesic "
                                "sides) from the start pin, the warp and weft following "
                                "geodesics through it, and reports the shear (90 deg minus the "
                                "crossing angle; + where the angle closes), the cells past the "
                                "locking angle, the warp's deviation, each cell's Gauss-Bonnet "
                                "closure and the flat pattern (every cell a square of side H)."
                                "\n\n" DF_DRAPE_CAUTION "\n\nExit status: 0 done, 2 bad input, "
                                "1 an output file could not be written.");
  g_option_context_add_main_entries (context, entries, NULL);
  df_cli_add_surface_options (context, &o.surface);
  if (!df_cli_parse (context, NAME, &argc, &argv))
    code = DF_CLI_EXIT_INPUT;
  else
    code = run (&o);

  df_cli_surface_options_clear (&o.surface);
  g_free (o.loop_path);
  g_free (o.start_text);
  g_free (o.warp_text);
  g_free (o.cell_text);
  g_free (o.units_text);
  g_free (o.project_path);
  g_free (o.max_shear_text);
  g_free (o.max_dev_text);
  g_free (o.svg_path);
  g_free (o.nodes_path);
  g_free (o.flat_path);
  g_free (o.boundary_path);
  return code;
}
