/* df-drape-out.c: CSV, SVG and JSON output of a woven-ply drape (df-drape-out.h). Numbers go
 * through g_ascii_dtostr / g_ascii_formatd, so the C locale is used whatever the user's is.
 * Reader/writer layer: GLib and json-glib allowed. */
#include "df-drape-out.h"

#include <math.h>

#include "df-io-error.h"
#include "df-json-out.h"

#define CSV_EOL "\r\n"

static void
append_number (GString *out, double value)
{
  char buf[G_ASCII_DTOSTR_BUF_SIZE];

  /* An empty field for a value that does not exist: never NaN in a file. */
  if (isfinite (value))
    g_string_append (out, g_ascii_dtostr (buf, sizeof buf, value + 0.0));
}

static void
append_row (GString *out, const double *values, gsize n)
{
  for (gsize i = 0; i < n; i++)
    {
      if (i > 0)
        g_string_append_c (out, ',');
      append_number (out, values[i]);
    }
  g_string_append (out, CSV_EOL);
}

char *
df_drape_nodes_to_csv (const df_drape *d)
{
  return df_drape_nodes_to_csv_scaled (d, 1.0);
}

char *
df_drape_nodes_to_csv_scaled (const df_drape *d, double f)
{
  const df_drape_summary *s = df_drape_get_summary (d);
  GString *out = g_string_new ("i,j,u,v,x,y,z,inside,shear_deg,warp_deviation_deg,flat_x,"
                               "flat_y" CSV_EOL);

  for (int j = s->j_min; j <= s->j_max; j++)
    for (int i = s->i_min; i <= s->i_max; i++)
      {
        df_drape_node n;

        if (!df_drape_get_node (d, i, j, &n))
          continue;
        {
          double row[12] = { i, j, n.u, n.v, f * n.point[0], f * n.point[1], f * n.point[2],
                             n.inside, n.shear_rad * 180 / G_PI,
                             n.warp_deviation_rad * 180 / G_PI, f * n.flat[0], f * n.flat[1] };

          append_row (out, row, G_N_ELEMENTS (row));
        }
      }
  return g_string_free (out, FALSE);
}

gboolean
df_drape_nodes_write (const char *path, const df_drape *d, GError **error)
{
  return df_drape_nodes_write_scaled (path, d, 1.0, error);
}

gboolean
df_drape_nodes_write_scaled (const char *path, const df_drape *d, double f, GError **error)
{
  g_autofree char *text = df_drape_nodes_to_csv_scaled (d, f);

  return df_write_file_atomic (path, text, -1, error);
}

char *
df_drape_flat_to_csv (const df_drape *d)
{
  return df_drape_flat_to_csv_scaled (d, 1.0);
}

char *
df_drape_flat_to_csv_scaled (const df_drape *d, double f)
{
  const df_drape_summary *s = df_drape_get_summary (d);
  const double (*uv)[2] = df_drape_get_outline (d), (*flat)[2] = df_drape_get_flat_outline (d);
  const bool *mapped = df_drape_get_outline_mapped (d);
  GString *out = g_string_new ("u,v,flat_x,flat_y" CSV_EOL);

  for (gsize k = 0; k < s->n_outline; k++)
    {
      double row[4] = { uv[k][0], uv[k][1], mapped[k] ? f * flat[k][0] : NAN,
                        mapped[k] ? f * flat[k][1] : NAN };

      append_row (out, row, 4);
    }
  return g_string_free (out, FALSE);
}

gboolean
df_drape_flat_write (const char *path, const df_drape *d, GError **error)
{
  return df_drape_flat_write_scaled (path, d, 1.0, error);
}

gboolean
df_drape_flat_write_scaled (const char *path, const df_drape *d, double f, GError **error)
{
  g_autofree char *text = df_drape_flat_to_csv_scaled (d, f);

  return df_write_file_atomic (path, text, -1, error);
}

/* A coordinate for SVG text, C locale, 4 decimals. */
char *
df_drape_boundary_to_csv (const df_drape *d, int per_segment, df_drape_boundary_info *info)
{
  g_autofree double (*uv)[2] = NULL;
  size_t n = df_drape_whole_boundary (d, per_segment, &uv, info);
  GString *out;

  if (n == 0)
    return NULL;
  /* '#' lines are skipped by the loop reader (df-loop-csv.h). */
  out = g_string_new ("# driftframe: boundary of the whole cells of a drape, anticlockwise "
                      "about N" CSV_EOL);
  g_string_append_printf (out, "# %zu cells bounded, %zu thread segments" CSV_EOL,
                          info->n_cells, info->n_segments);
  if (info->n_whole_left_out > 0 || info->n_cells_filled > 0)
    g_string_append_printf (out, "# the whole cells are not one simply connected piece: the "
                            "outer boundary of the largest (%zu whole cells left out, %zu "
                            "cells of holes inside)" CSV_EOL, info->n_whole_left_out,
                            info->n_cells_filled);
  g_string_append (out, "u,v" CSV_EOL);
  for (size_t k = 0; k < n; k++)
    append_row (out, uv[k], 2);
  return g_string_free (out, FALSE);
}

gboolean
df_drape_boundary_write (const char *path, const df_drape *d, int per_segment,
                         df_drape_boundary_info *info, GError **error)
{
  g_autofree char *text = df_drape_boundary_to_csv (d, per_segment, info);

  if (text == NULL)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY, "%s: the drape has no whole cell "
                   "inside the ply outline, so no boundary to write", path);
      return FALSE;
    }
  return df_write_file_atomic (path, text, -1, error);
}

static const char *
fmt (char *buf, double v)
{
  return g_ascii_formatd (buf, G_ASCII_DTOSTR_BUF_SIZE, "%.4f", isfinite (v) ? v + 0.0 : 0.0);
}

char *
df_drape_flat_to_svg (const df_drape *d, const char *units)
{
  const df_drape_summary *s = df_drape_get_summary (d);
  const df_drape_options *o = df_drape_get_options (d);
  const double (*flat)[2] = df_drape_get_flat_outline (d);
  const bool *mapped = df_drape_get_outline_mapped (d);
  double h = o->cell, lo[2], hi[2], margin, scale = 1.0, w, ht;
  const char *unit = units;
  char a[G_ASCII_DTOSTR_BUF_SIZE], b[G_ASCII_DTOSTR_BUF_SIZE], c[G_ASCII_DTOSTR_BUF_SIZE],
       e[G_ASCII_DTOSTR_BUF_SIZE];
  GString *out = g_string_new (NULL);
  gboolean pen_down = FALSE;

  if (units == NULL || (!g_str_equal (units, "mm") && !g_str_equal (units, "cm")
                        && !g_str_equal (units, "in") && !g_str_equal (units, "m")))
    unit = "";
  else if (g_str_equal (units, "m"))
    {
      /* SVG has no metre unit: draw in millimetres. */
      scale = 1000.0;
      unit = "mm";
    }
  if (s->n_outline_unmapped < s->n_outline && isfinite (s->flat_lo[0]))
    {
      lo[0] = s->flat_lo[0];
      lo[1] = s->flat_lo[1];
      hi[0] = s->flat_hi[0];
      hi[1] = s->flat_hi[1];
    }
  else
    {
      lo[0] = s->i_min * h;
      lo[1] = s->j_min * h;
      hi[0] = s->i_max * h;
      hi[1] = s->j_max * h;
    }
  margin = 0.05 * fmax (hi[0] - lo[0], hi[1] - lo[1]) + h;
  lo[0] -= margin;
  lo[1] -= margin;
  hi[0] += margin;
  hi[1] += margin;
  w = (hi[0] - lo[0]) * scale;
  ht = (hi[1] - lo[1]) * scale;

  /* Drawing units = the surface's units (times scale); y flipped so that the pattern is seen
   * from the side N points to, with the warp to the right and the weft up. */
  g_string_append_printf (out,
                          "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n"
                          "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"%s%s\" "
                          "height=\"%s%s\" viewBox=\"0 0 %s %s\">\n",
                          fmt (a, w), unit, fmt (b, ht), unit, fmt (c, w), fmt (e, ht));
  g_string_append_printf (out,
                          "<title>Flat pattern of a woven ply: every cell a square of side "
                          "%s %s, warp to the right, weft up, seen from the side the surface "
                          "normal points to</title>\n",
                          fmt (a, h), units ? units : "");
  g_string_append (out, "<desc>" DF_DRAPE_CAUTION "</desc>\n");
  g_string_append_printf (out, "<g transform=\"matrix(%s 0 0 %s %s %s)\" fill=\"none\">\n",
                          fmt (a, scale), fmt (b, -scale), fmt (c, -lo[0] * scale),
                          fmt (e, hi[1] * scale));

  /* Cells past the locking angle. */
  g_string_append (out, "<g fill=\"#d9534f\" fill-opacity=\"0.45\" stroke=\"none\">\n");
  for (int j = s->j_min; j < s->j_max; j++)
    for (int i = s->i_min; i < s->i_max; i++)
      {
        df_drape_cell cell;

        if (df_drape_get_cell (d, i, j, &cell) && cell.corners_inside > 0 && cell.over_limit)
          g_string_append_printf (out, "<rect x=\"%s\" y=\"%s\" width=\"%s\" height=\"%s\"/>\n",
                                  fmt (a, i * h), fmt (b, j * h), fmt (c, h), fmt (e, h));
      }
  g_string_append (out, "</g>\n");

  /* The thread lattice over the pattern's box. */
  g_string_append_printf (out, "<g stroke=\"#9aa5b1\" stroke-width=\"%s\">\n",
                          fmt (a, 0.05 * h));
  for (int i = (int) ceil (lo[0] / h); i * h <= hi[0]; i++)
    g_string_append_printf (out, "<line x1=\"%s\" y1=\"%s\" x2=\"%s\" y2=\"%s\"/>\n",
                            fmt (a, i * h), fmt (b, lo[1]), fmt (c, i * h), fmt (e, hi[1]));
  for (int j = (int) ceil (lo[1] / h); j * h <= hi[1]; j++)
    g_string_append_printf (out, "<line x1=\"%s\" y1=\"%s\" x2=\"%s\" y2=\"%s\"/>\n",
                            fmt (a, lo[0]), fmt (b, j * h), fmt (c, hi[0]), fmt (e, j * h));
  g_string_append (out, "</g>\n");

  /* The cut outline; a gap where points lie in no cell. */
  g_string_append_printf (out, "<path stroke=\"#1f4e79\" stroke-width=\"%s\" d=\"",
                          fmt (a, 0.2 * h));
  for (gsize k = 0; k < s->n_outline; k++)
    {
      if (!mapped[k])
        {
          pen_down = FALSE;
          continue;
        }
      g_string_append_printf (out, "%s%s %s ", pen_down ? "L" : "M", fmt (a, flat[k][0]),
                              fmt (b, flat[k][1]));
      pen_down = TRUE;
    }
  if (s->n_outline_unmapped == 0)
    g_string_append (out, "Z");
  g_string_append (out, "\"/>\n");
  g_string_append_printf (out, "<circle cx=\"0\" cy=\"0\" r=\"%s\" fill=\"#1f4e79\"/>\n",
                          fmt (a, 0.4 * h));
  g_string_append (out, "</g>\n</svg>\n");
  return g_string_free (out, FALSE);
}

gboolean
df_drape_svg_write (const char *path, const df_drape *d, const char *units, GError **error)
{
  g_autofree char *text = df_drape_flat_to_svg (d, units);

  return df_write_file_atomic (path, text, -1, error);
}

void
df_json_add_drape (JsonBuilder *j, const df_drape *d)
{
  df_json_add_drape_scaled (j, d, 1.0);
}

void
df_json_add_drape_scaled (JsonBuilder *j, const df_drape *d, double f)
{
  const df_drape_summary *s = df_drape_get_summary (d);
  const df_drape_options *o = df_drape_get_options (d);
  const double deg = 180 / G_PI;

  df_json_add_double (j, "max_shear_deg", s->max_shear_rad * deg);
  df_json_add_vector (j, "max_shear_at", (double[2]) { s->max_shear_u, s->max_shear_v }, 2);
  df_json_add_double (j, "max_cell_shear_deg", s->max_cell_shear_rad * deg);
  json_builder_set_member_name (j, "cells");
  json_builder_add_int_value (j, (gint64) s->n_cells);
  json_builder_set_member_name (j, "whole_cells");
  json_builder_add_int_value (j, (gint64) s->n_whole_cells);
  json_builder_set_member_name (j, "cells_over_limit");
  json_builder_add_int_value (j, (gint64) s->n_cells_over_limit);
  df_json_add_double (j, "max_shear_limit_deg", o->max_shear_rad * deg);
  /* The cells past the locking angle, as [i, j] of their lower corner. */
  json_builder_set_member_name (j, "cells_over_limit_list");
  json_builder_begin_array (j);
  for (int jj = s->j_min; jj < s->j_max; jj++)
    for (int i = s->i_min; i < s->i_max; i++)
      {
        df_drape_cell c;

        if (df_drape_get_cell (d, i, jj, &c) && c.corners_inside > 0 && c.over_limit)
          {
            json_builder_begin_array (j);
            json_builder_add_int_value (j, i);
            json_builder_add_int_value (j, jj);
            json_builder_end_array (j);
          }
      }
  json_builder_end_array (j);
  df_json_add_double (j, "max_warp_deviation_deg", s->max_warp_deviation_rad * deg);
  df_json_add_vector (j, "max_warp_deviation_at",
                      (double[2]) { s->max_warp_deviation_u, s->max_warp_deviation_v }, 2);
  df_json_add_double (j, "max_fibre_deviation_limit_deg", o->max_fibre_deviation_rad * deg);
  json_builder_set_member_name (j, "pins_over_deviation");
  json_builder_add_int_value (j, (gint64) s->n_nodes_over_deviation);
  df_json_add_double (j, "flat_area", f * f * s->flat_area);
  df_json_add_vector (j, "flat_size",
                      (double[2]) { f * (s->flat_hi[0] - s->flat_lo[0]),
                                    f * (s->flat_hi[1] - s->flat_lo[1]) },
                      2);
  json_builder_set_member_name (j, "outline_points_unmapped");
  json_builder_add_int_value (j, (gint64) s->n_outline_unmapped);
  df_json_add_double (j, "enclosed_curvature_rad", s->enclosed_curvature_rad);
  df_json_add_double (j, "enclosed_curvature_quadrature_rad", s->enclosed_k_area_rad);
  df_json_add_double (j, "cell_closure_max_residual_rad", s->closure_max_residual_rad);
  json_builder_set_member_name (j, "pins");
  json_builder_add_int_value (j, (gint64) s->n_nodes);
  json_builder_set_member_name (j, "pins_lost");
  json_builder_add_int_value (j, (gint64) s->n_nodes_lost);
  json_builder_set_member_name (j, "pins_lost_note");
  if (s->lost_note[0])
    json_builder_add_string_value (j, s->lost_note);
  else
    json_builder_add_null_value (j);
  df_json_add_double (j, "cell", f * o->cell);
  df_json_add_double (j, "warp_deg", o->warp_rad * deg);
  json_builder_set_member_name (j, "stepper");
  json_builder_add_string_value (j, s->stepper);
  json_builder_set_member_name (j, "steps_per_segment");
  json_builder_add_int_value (j, s->substeps);
  json_builder_set_member_name (j, "caution");
  json_builder_add_string_value (j, DF_DRAPE_CAUTION);
}
