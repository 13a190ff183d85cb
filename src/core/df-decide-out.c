/* df-decide-out.c: gore patterns as SVG and CSV, the developability map as CSV (see
 * df-decide-out.h). Reader/writer layer: GLib. */
#include "df-decide-out.h"

#include <math.h>
#include <string.h>

#include "df-glib.h"

#define CSV_EOL "\r\n"

/* SVG's absolute units are mm, cm, in (and pt, pc, px): a length in metres is written in cm. */
static const char *
svg_unit (df_unit display, double *factor)
{
  *factor = 1.0;
  if (display == DF_UNIT_M)
    {
      *factor = 100.0;
      return "cm";
    }
  return df_unit_name (display);
}

static char *
num (double x)
{
  char buf[G_ASCII_DTOSTR_BUF_SIZE];

  return g_strdup (g_ascii_formatd (buf, sizeof buf, "%.6g", x + 0.0));
}

/* The outline (sewing line, seam 0) or the cutting line, in display units. */
static gboolean
outline_display (const df_gores *gores, df_unit model, df_unit display, double seam,
                 double (**pts)[2], gsize *n, GError **error)
{
  df_diag diag;
  size_t count = 0;
  df_status st;

  df_diag_clear (&diag);
  st = df_gores_outline (gores, df_unit_length (seam, display, model), pts, &count, &diag);
  if (st != DF_OK)
    return df_status_to_gerror (st, &diag, error);
  for (size_t i = 0; i < count; i++)
    for (int c = 0; c < 2; c++)
      (*pts)[i][c] = df_unit_length ((*pts)[i][c], model, display);
  *n = count;
  return TRUE;
}

static void
append_path (GString *svg, double (*pts)[2], gsize n, double ox, double oy, const char *style)
{
  g_string_append (svg, "  <path d=\"");
  for (gsize i = 0; i < n; i++)
    {
      g_autofree char *x = num (pts[i][0] - ox);
      g_autofree char *y = num (pts[i][1] - oy);

      g_string_append_printf (svg, "%s%s %s ", i ? "L" : "M", x, y);
    }
  g_string_append_printf (svg, "Z\" %s/>\n", style);
}

gboolean
df_gores_svg_write (const char *path, const df_gores *gores, df_unit model, df_unit display,
                    double seam, const char *label, GError **error)
{
  g_autofree double (*sew)[2] = NULL;
  g_autofree double (*cut)[2] = NULL;
  gsize n_sew = 0, n_cut = 0;
  g_autoptr (GString) svg = g_string_new (NULL);
  double x_min = 0, x_max = 0, y_min = 0, y_max = 0, font, margin, width, height, factor, bar;
  double length = df_unit_length (gores->length, model, display);
  const char *un = df_unit_name (display), *su = svg_unit (display, &factor);
  g_autofree char *title = g_markup_escape_text (label != NULL ? label : "surface", -1);
  g_autofree char *w_text = NULL, *h_text = NULL, *vb_w = NULL, *vb_h = NULL, *fs = NULL;
  const char *lines[6];
  g_autofree char *l0 = NULL, *l1 = NULL, *l2 = NULL, *l3 = NULL;

  if (!outline_display (gores, model, display, 0.0, &sew, &n_sew, error))
    return FALSE;
  if (seam > 0.0 && !outline_display (gores, model, display, seam, &cut, &n_cut, error))
    return FALSE;
  for (gsize i = 0; i < (cut ? n_cut : n_sew); i++)
    {
      const double *p = cut ? cut[i] : sew[i];

      x_min = fmin (x_min, p[0]);
      x_max = fmax (x_max, p[0]);
      y_min = fmin (y_min, p[1]);
      y_max = fmax (y_max, p[1]);
    }
  /* Text at a size that reads on the pattern itself: a fortieth of its larger side. */
  font = fmax (x_max - x_min, y_max - y_min) / 40.0;
  margin = 2.0 * font;
  width = fmax (x_max - x_min, 42.0 * font) + 2.0 * margin;
  /* Below the pattern: about ten wrapped text rows and the scale bar. */
  height = (y_max - y_min) + 2.0 * margin + 16.0 * font;
  /* A scale bar of a round length, to check the print is life size. */
  bar = pow (10.0, floor (log10 (fmax (x_max - x_min, 1e-300))));

  w_text = num (width * factor);
  h_text = num (height * factor);
  vb_w = num (width);
  vb_h = num (height);
  fs = num (font);
  g_string_append_printf (svg,
                          "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n"
                          "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"%s%s\" "
                          "height=\"%s%s\" viewBox=\"0 0 %s %s\">\n"
                          "  <title>Gore pattern, %s</title>\n"
                          "  <desc>True scale: one user unit is one %s. %s</desc>\n",
                          w_text, su, h_text, su, vb_w, vb_h, title, un, DF_DECIDE_CAUTION);
  {
    double ox = x_min - margin - (width - 2.0 * margin - (x_max - x_min)) / 2.0;
    double oy = y_min - margin;
    g_autofree char *sw = num (font / 10.0);
    g_autofree char *style_cut = g_strdup_printf ("fill=\"none\" stroke=\"black\" "
                                                  "stroke-width=\"%s\"", sw);
    g_autofree char *style_sew = g_strdup_printf ("fill=\"none\" stroke=\"black\" "
                                                  "stroke-width=\"%s\"%s", sw,
                                                  cut ? " stroke-dasharray=\"4 2\"" : "");
    g_autofree char *cx = num (-ox), *cy0 = num (-oy), *cy1 = num (length - oy);
    double ty = y_max - oy + 2.0 * font;

    if (cut != NULL)
      append_path (svg, cut, n_cut, ox, oy, style_cut);
    append_path (svg, sew, n_sew, ox, oy, style_sew);
    g_string_append_printf (svg, "  <line x1=\"%s\" y1=\"%s\" x2=\"%s\" y2=\"%s\" "
                            "stroke=\"grey\" stroke-width=\"%s\" stroke-dasharray=\"1 1\"/>\n",
                            cx, cy0, cx, cy1, sw);

    l0 = g_strdup_printf ("Gore 1 of %d: cut %d alike. Centre meridian %.4g %s, widest %.4g "
                          "%s, area each %.5g %s^2.", gores->count, gores->count, length, un,
                          df_unit_length (gores->max_width, model, display), un,
                          df_unit_area (gores->area_each, model, display), un);
    if (cut != NULL)
      l1 = g_strdup_printf ("Solid: cutting line; dashed: sewing line; seam allowance %.4g "
                            "%s. Edge longer than the meridian by %.3g %%.", seam, un,
                            100.0 * gores->edge_strain);
    else
      l1 = g_strdup_printf ("Sewing line, no seam allowance. Edge longer than the meridian by "
                            "%.3g %%.", 100.0 * gores->edge_strain);
    l2 = g_strdup_printf ("True scale (print at 100 %%): the bar is %.4g %s.", bar, un);
    l3 = g_strdup (DF_DECIDE_CAUTION);
    lines[0] = l0;
    lines[1] = l1;
    lines[2] = l2;
    lines[3] = l3;
    lines[4] = NULL;
    for (int i = 0; lines[i] != NULL; i++)
      {
        /* Wrapped at 80 characters: the page is at least 42 em wide (about 84 average
         * characters of a sans-serif face). */
        g_auto (GStrv) words = g_strsplit (lines[i], " ", -1);
        g_autoptr (GString) row = g_string_new (NULL);

        for (int k = 0; words[k] != NULL; k++)
          {
            if (row->len > 0 && row->len + 1 + strlen (words[k]) > 80)
              {
                g_autofree char *x = num (margin), *y = num (ty);
                g_autofree char *esc = g_markup_escape_text (row->str, -1);

                g_string_append_printf (svg, "  <text x=\"%s\" y=\"%s\" "
                                        "font-family=\"sans-serif\" font-size=\"%s\">%s</text>\n",
                                        x, y, fs, esc);
                ty += 1.4 * font;
                g_string_truncate (row, 0);
              }
            if (row->len > 0)
              g_string_append_c (row, ' ');
            g_string_append (row, words[k]);
          }
        if (row->len > 0)
          {
            g_autofree char *x = num (margin), *y = num (ty);
            g_autofree char *esc = g_markup_escape_text (row->str, -1);

            g_string_append_printf (svg, "  <text x=\"%s\" y=\"%s\" font-family=\"sans-serif\" "
                                    "font-size=\"%s\">%s</text>\n", x, y, fs, esc);
            ty += 1.4 * font;
          }
        ty += 0.4 * font;
      }
    {
      g_autofree char *x0 = num (margin), *x1 = num (margin + bar);
      g_autofree char *y = num (ty + 0.5 * font);
      g_autofree char *bw = num (font / 3.0);

      g_string_append_printf (svg, "  <line x1=\"%s\" y1=\"%s\" x2=\"%s\" y2=\"%s\" "
                              "stroke=\"black\" stroke-width=\"%s\"/>\n", x0, y, x1, y, bw);
    }
  }
  g_string_append (svg, "</svg>\n");
  return df_write_file_atomic (path, svg->str, (gssize) svg->len, error);
}

static void
append_outline_rows (GString *csv, const char *name, double (*pts)[2], gsize n)
{
  for (gsize i = 0; i < n; i++)
    {
      char bx[G_ASCII_DTOSTR_BUF_SIZE], by[G_ASCII_DTOSTR_BUF_SIZE];

      g_string_append_printf (csv, "%s,%s,%s" CSV_EOL, name,
                              g_ascii_formatd (bx, sizeof bx, "%.10g", pts[i][0] + 0.0),
                              g_ascii_formatd (by, sizeof by, "%.10g", pts[i][1] + 0.0));
    }
}

gboolean
df_gores_csv_write (const char *path, const df_gores *gores, df_unit model, df_unit display,
                    double seam, GError **error)
{
  g_autofree double (*sew)[2] = NULL;
  g_autofree double (*cut)[2] = NULL;
  gsize n_sew = 0, n_cut = 0;
  g_autoptr (GString) csv = g_string_new (NULL);
  const char *un = df_unit_name (display);

  if (!outline_display (gores, model, display, 0.0, &sew, &n_sew, error))
    return FALSE;
  if (seam > 0.0 && !outline_display (gores, model, display, seam, &cut, &n_cut, error))
    return FALSE;
  g_string_append_printf (csv, "# gore pattern: %d gores, t from %.10g to %.10g; x across, y "
                          "along the centre meridian, in %s" CSV_EOL, gores->count, gores->t0,
                          gores->t1, un);
  g_string_append_printf (csv, "# length %.10g %s, max width %.10g %s, area each %.10g %s^2, "
                          "seam allowance %.6g %s" CSV_EOL,
                          df_unit_length (gores->length, model, display), un,
                          df_unit_length (gores->max_width, model, display), un,
                          df_unit_area (gores->area_each, model, display), un, seam, un);
  g_string_append (csv, "# " DF_DECIDE_CAUTION CSV_EOL);
  g_string_append (csv, "outline,x,y" CSV_EOL);
  append_outline_rows (csv, "sewing", sew, n_sew);
  if (cut != NULL)
    append_outline_rows (csv, "cutting", cut, n_cut);
  return df_write_file_atomic (path, csv->str, (gssize) csv->len, error);
}

static void
field (GString *csv, gboolean present, double value, const char *sep)
{
  char buf[G_ASCII_DTOSTR_BUF_SIZE];

  if (present && isfinite (value))
    g_string_append (csv, g_ascii_formatd (buf, sizeof buf, "%.10g", value + 0.0));
  g_string_append (csv, sep);
}

gboolean
df_devmap_csv_write (const char *path, const df_surface *surface, const df_devmap *map,
                     df_unit model, df_unit display, GError **error)
{
  g_autoptr (GString) csv = g_string_new (NULL);
  const char *un = df_unit_name (display);

  g_string_append_printf (csv, "# developability map: geodesic discs of radius %.10g %s; "
                          "lengths in %s, areas in %s^2; empty fields: no full disc there"
                          CSV_EOL, df_unit_length (map->a, model, display), un, un, un);
  g_string_append (csv, "# " DF_DECIDE_CAUTION CSV_EOL);
  g_string_append (csv, "u,v,x,y,z,enclosed_deg,strain_percent,circumference,area" CSV_EOL);
  for (size_t j = 0; j < map->nv; j++)
    for (size_t i = 0; i < map->nu; i++)
      {
        const df_devmap_point *p = &map->points[j * map->nu + i];
        df_chart_jet jet = { 0 };
        gboolean have_x = df_surface_eval (surface, map->u[i], map->v[j], 0, &jet, NULL) == DF_OK;

        field (csv, TRUE, map->u[i], ",");
        field (csv, TRUE, map->v[j], ",");
        for (int c = 0; c < 3; c++)
          field (csv, have_x, df_unit_length (jet.x[c], model, display), ",");
        field (csv, p->ok, p->enclosed_rad * 180.0 / G_PI, ",");
        field (csv, p->ok, 100.0 * p->strain, ",");
        field (csv, p->ok, df_unit_length (p->circumference, model, display), ",");
        field (csv, p->ok, df_unit_area (p->area, model, display), CSV_EOL);
      }
  return df_write_file_atomic (path, csv->str, (gssize) csv->len, error);
}
