/* df-report.c: the design record PDF: page flow, title block, inputs, conventions, picture,
 * summary, one section per loop and the caution, laid out twice (once to count the pages, so
 * each footer can say "page i of n", once to draw), rendered into memory by cairo's PDF backend
 * and written atomically. Reader/writer layer: GLib, cairo and pango allowed. */
#include "df-report.h"

#include <cairo-pdf.h>
#include <math.h>
#include <pango/pangocairo.h>
#include <string.h>

#include "df-fit.h"
#include "df-io-error.h"
#include "df-report-picture.h"
#include "df-report-plot.h"
#include "df-units.h"

#define MARGIN        50.0     /* points: about 18 mm */
#define HEADER_SPACE  28.0
#define FOOTER_SPACE  30.0
#define PICTURE_H     300.0
#define PLOT_H        130.0
#define BODY_FONT     "DejaVu Sans 10"
#define SMALL_FONT    "DejaVu Sans 8"
#define HEADING_FONT  "DejaVu Sans Bold 14"
#define TITLE_FONT    "DejaVu Sans Bold 20"

gboolean
df_paper_from_name (const char *name, df_paper *out)
{
  if (name == NULL)
    return FALSE;
  if (g_ascii_strcasecmp (name, "a4") == 0)
    *out = DF_PAPER_A4;
  else if (g_ascii_strcasecmp (name, "letter") == 0)
    *out = DF_PAPER_LETTER;
  else
    return FALSE;
  return TRUE;
}

/* --- input fields ----------------------------------------------------------------------- */

void
df_report_fields_init (df_report_fields *f)
{
  f->fields = g_array_new (FALSE, TRUE, sizeof (df_report_field));
  f->strings = g_ptr_array_new_with_free_func (g_free);
}

void
df_report_fields_add (df_report_fields *f, const char *key, const char *value)
{
  df_report_field field;
  char *k = g_strdup (key), *v = g_strdup (value != NULL ? value : "");

  g_ptr_array_add (f->strings, k);
  g_ptr_array_add (f->strings, v);
  field.key = k;
  field.value = v;
  field.mono = FALSE;
  g_array_append_val (f->fields, field);
}

static void
fields_add_mono (df_report_fields *f, const char *key, const char *value)
{
  df_report_fields_add (f, key, value);
  g_array_index (f->fields, df_report_field, f->fields->len - 1).mono = TRUE;
}

void
df_report_fields_add_spec (df_report_fields *f, const df_surface_spec *spec,
                           const df_surface *surface)
{
  static const char *const range_names[2][4] = { { "t-min", "t-max", NULL, NULL },
                                                 { "x-min", "x-max", "y-min", "y-max" } };
  int k = spec->kind == DF_SURFACE_REVOLUTION ? 0 : 1;
  g_autoptr (GString) ranges = g_string_new (NULL);
  g_autoptr (GString) params = g_string_new (NULL);

  df_report_fields_add (f, "Surface kind",
                        spec->kind == DF_SURFACE_REVOLUTION
                          ? "surface of revolution, chart (t, \xcf\x86), X = (r cos \xcf\x86, r sin "
                            "\xcf\x86, z)"
                          : "graph z = f(x, y), chart (x, y)");
  if (spec->preset != NULL)
    df_report_fields_add (f, "Preset", spec->preset);
  if (spec->data_key != NULL)
    {
      g_autofree char *path = spec->base_dir != NULL && !g_path_is_absolute (spec->data_path)
                                ? g_build_filename (spec->base_dir, spec->data_path, NULL)
                                : g_strdup (spec->data_path);
      df_fit_info info;

      df_report_fields_add_file (f, g_str_equal (spec->data_key, "profile") ? "Profile data"
                                    : g_str_equal (spec->data_key, "mesh") ? "Mesh data"
                                                                            : "Height data",
                                 path);
      if (surface != NULL && df_fit_get_info (df_surface_get_fn (surface), &info))
        {
          g_autofree char *text = g_strdup_printf (
            "%zu points; RMS distance %.4g %s, largest %.4g %s at (%.6g, %.6g, %.6g); "
            "tolerance %.4g %s (%s). Curvature from a fit amplifies the data's noise; the "
            "holonomy of a loop is far less sensitive than K at a point.",
            info.points, info.rms, spec->units, info.max, spec->units, info.max_at[0],
            info.max_at[1], info.max_at[2], info.tolerance, spec->units,
            info.chosen ? "chosen from the data by cross-validation" : "given");

          df_report_fields_add (f, "Fit", text);
          if (info.has_symmetry)
            {
              g_autofree char *round = g_strdup_printf (
                "departs from rotational symmetry by RMS %.4g %s, largest %.4g %s at "
                "(%.6g, %.6g, %.6g)", info.symmetry_rms, spec->units, info.symmetry_max,
                spec->units, info.symmetry_max_at[0], info.symmetry_max_at[1],
                info.symmetry_max_at[2]);

              df_report_fields_add (f, "Round", round);
            }
        }
    }
  else if (spec->kind == DF_SURFACE_REVOLUTION)
    {
      df_report_fields_add (f, "r(t)", spec->r_text);
      df_report_fields_add (f, "z(t)", spec->z_text);
    }
  else
    df_report_fields_add (f, "z(x, y)", spec->z_text);
  for (int i = 0; i < 4; i++)
    if (range_names[k][i] != NULL && spec->range_text[i] != NULL)
      g_string_append_printf (ranges, "%s%s = %s", ranges->len ? ", " : "", range_names[k][i],
                              spec->range_text[i]);
  if (ranges->len > 0)
    df_report_fields_add (f, "Chart range", ranges->str);
  for (guint i = 0; spec->params != NULL && i < df_params_count (spec->params); i++)
    g_string_append_printf (params, "%s%s = %s", params->len ? ", " : "",
                            df_params_name (spec->params, i), df_params_text (spec->params, i));
  if (params->len > 0)
    df_report_fields_add (f, "Parameters", params->str);
  df_report_fields_add (f, "Length unit", spec->units);
  if (surface != NULL)
    df_report_fields_add (f, "Normal N", df_surface_normal_side (surface));
}

void
df_report_fields_add_file (df_report_fields *f, const char *key, const char *path)
{
  g_autofree char *data = NULL;
  g_autofree char *sum = NULL;
  g_autofree char *text = NULL;
  g_autofree char *base = g_path_get_basename (path);
  g_autoptr (GError) error = NULL;
  gsize len = 0;

  if (g_file_get_contents (path, &data, &len, &error))
    {
      sum = g_compute_checksum_for_data (G_CHECKSUM_SHA256, (const guchar *) data, len);
      text = g_strdup_printf ("%s (%" G_GSIZE_FORMAT " bytes)", base, len);
      df_report_fields_add (f, key, text);
      fields_add_mono (f, "SHA-256", sum);
      return;
    }
  text = g_strdup_printf ("%s (could not be read: %s)", base, error->message);
  df_report_fields_add (f, key, text);
}

void
df_report_fields_clear (df_report_fields *f)
{
  g_clear_pointer (&f->fields, g_array_unref);
  g_clear_pointer (&f->strings, g_ptr_array_unref);
}

/* --- page flow -------------------------------------------------------------------------- */

typedef struct
{
  const df_report *report;
  cairo_t *cr;
  gboolean draw;        /* FALSE on the counting pass: measure only */
  double page_w, page_h;
  double y;             /* next free line */
  int page;             /* 1-based */
  int n_pages;          /* known on the drawing pass */
  GError *error;        /* first drawing failure (the picture), reported after the pass */
  GPtrArray *scratch;   /* strings made while laying out, freed at the end */
} flow;

static double
content_width (const flow *f)
{
  return f->page_w - 2 * MARGIN;
}

static PangoLayout *
make_layout (flow *f, const char *font, double width, const char *text, gboolean markup)
{
  PangoLayout *layout = pango_cairo_create_layout (f->cr);
  PangoFontDescription *desc = pango_font_description_from_string (font);

  /* Sizes in points: one cairo unit of a PDF page is a point (pango assumes 96 dpi). */
  pango_cairo_context_set_resolution (pango_layout_get_context (layout), 72);
  pango_layout_context_changed (layout);
  pango_layout_set_font_description (layout, desc);
  pango_font_description_free (desc);
  pango_layout_set_width (layout, (int) (width * PANGO_SCALE));
  pango_layout_set_wrap (layout, PANGO_WRAP_WORD_CHAR);
  if (markup)
    pango_layout_set_markup (layout, text, -1);
  else
    pango_layout_set_text (layout, text, -1);
  return layout;
}

static double
layout_height (PangoLayout *layout)
{
  int w, h;

  pango_layout_get_size (layout, &w, &h);
  return (double) h / PANGO_SCALE;
}

static void
show_layout (flow *f, PangoLayout *layout, double x, double y)
{
  if (!f->draw)
    return;
  cairo_move_to (f->cr, x, y);
  pango_cairo_show_layout (f->cr, layout);
}

static void
page_decorations (flow *f)
{
  const df_report *r = f->report;
  g_autofree char *head = NULL;
  g_autofree char *foot = NULL;
  PangoLayout *l;

  if (!f->draw)
    return;
  cairo_set_source_rgb (f->cr, 0.35, 0.35, 0.35);
  head = g_strdup_printf ("Design record \xe2\x80\x94 %s%s%s", r->title,
                          r->part_number ? " \xe2\x80\x94 part " : "",
                          r->part_number ? r->part_number : "");
  l = make_layout (f, SMALL_FONT, content_width (f), head, FALSE);
  show_layout (f, l, MARGIN, MARGIN - 22);
  g_object_unref (l);
  cairo_set_line_width (f->cr, 0.5);
  cairo_move_to (f->cr, MARGIN, MARGIN - 8);
  cairo_line_to (f->cr, f->page_w - MARGIN, MARGIN - 8);
  cairo_move_to (f->cr, MARGIN, f->page_h - MARGIN + 6);
  cairo_line_to (f->cr, f->page_w - MARGIN, f->page_h - MARGIN + 6);
  cairo_stroke (f->cr);

  l = make_layout (f, SMALL_FONT, content_width (f) * 0.75,
                   "Geometric estimate, not a material or structural assessment: see the caution "
                   "at the end of this record.", FALSE);
  show_layout (f, l, MARGIN, f->page_h - MARGIN + 10);
  g_object_unref (l);
  foot = g_strdup_printf ("Page %d of %d", f->page, f->n_pages);
  l = make_layout (f, SMALL_FONT, content_width (f), foot, FALSE);
  pango_layout_set_alignment (l, PANGO_ALIGN_RIGHT);
  show_layout (f, l, MARGIN, f->page_h - MARGIN + 10);
  g_object_unref (l);
  cairo_set_source_rgb (f->cr, 0, 0, 0);
}

static void
new_page (flow *f)
{
  if (f->draw)
    cairo_show_page (f->cr);
  f->page++;
  f->y = MARGIN + HEADER_SPACE - 20;
  page_decorations (f);
}

/* Makes room for a block of height h: a new page when it does not fit (a block taller than a
 * page starts on a new page and runs over the footer space at worst). */
static void
ensure (flow *f, double h)
{
  if (f->y + h > f->page_h - MARGIN - FOOTER_SPACE + 24 && f->y > MARGIN + HEADER_SPACE)
    new_page (f);
}

static void
paragraph (flow *f, const char *font, const char *text, gboolean markup, double gap)
{
  PangoLayout *l = make_layout (f, font, content_width (f), text, markup);
  double h = layout_height (l);

  ensure (f, h);
  show_layout (f, l, MARGIN, f->y);
  f->y += h + gap;
  g_object_unref (l);
}

static void
heading (flow *f, const char *text)
{
  /* Keep a heading with at least a few lines of what follows. */
  ensure (f, 60);
  f->y += 6;
  paragraph (f, HEADING_FONT, text, FALSE, 4);
}

/* A two-column table of key and value; values wrap. */
static void
key_value_table (flow *f, const df_report_field *fields, gsize n)
{
  double kw = content_width (f) * 0.26, vw = content_width (f) - kw - 8;

  for (gsize i = 0; i < n; i++)
    {
      PangoLayout *k = make_layout (f, "DejaVu Sans Bold 10", kw, fields[i].key, FALSE);
      PangoLayout *v = make_layout (f, fields[i].mono ? "DejaVu Sans Mono 9" : BODY_FONT, vw,
                                    fields[i].value, FALSE);
      double h = fmax (layout_height (k), layout_height (v)) + 4;

      ensure (f, h);
      if (f->draw && i % 2 == 0)
        {
          cairo_set_source_rgb (f->cr, 0.95, 0.95, 0.93);
          cairo_rectangle (f->cr, MARGIN - 2, f->y - 1, content_width (f) + 4, h);
          cairo_fill (f->cr);
          cairo_set_source_rgb (f->cr, 0, 0, 0);
        }
      show_layout (f, k, MARGIN, f->y + 1);
      show_layout (f, v, MARGIN + kw + 8, f->y + 1);
      f->y += h;
      g_object_unref (k);
      g_object_unref (v);
    }
  f->y += 6;
}

/* --- numbers -------------------------------------------------------------------------------- */

const char *
df_report_keep (GPtrArray *strings, char *s)
{
  g_ptr_array_add (strings, s);
  return s;
}

const char *
df_report_num (GPtrArray *strings, double value, int digits)
{
  if (!isfinite (value))
    return "n/a";
  if (value == 0)
    return "0";
  return df_report_keep (strings, g_strdup_printf ("%.*g", digits, value));
}

/* Every number of the layout pass goes through these, its strings freed when the pass ends. */
#define keep(f, s) df_report_keep ((f)->scratch, (s))
#define num(f, v, d) df_report_num ((f)->scratch, (v), (d))

static const char *
deg (flow *f, double rad)
{
  return num (f, rad * 180 / G_PI, 8);
}

/* --- sections ------------------------------------------------------------------------------ */

static void
title_block (flow *f)
{
  const df_report *r = f->report;
  g_autofree char *today = NULL;
  g_autofree char *tool = g_strdup_printf ("driftframe %s", r->version ? r->version : "");
  df_report_field fields[6];

  if (r->date == NULL)
    {
      g_autoptr (GDateTime) now = g_date_time_new_now_local ();

      today = g_date_time_format (now, "%Y-%m-%d %H:%M %z");
    }
  fields[0] = (df_report_field) { .key = "Project", .value = r->title };
  fields[1] = (df_report_field) { .key = "Part number", .value = r->part_number ? r->part_number : "not given" };
  fields[2] = (df_report_field) { .key = "Revision", .value = r->revision ? r->revision : "not given" };
  fields[3] = (df_report_field) { .key = "Author", .value = r->author ? r->author : "not given" };
  fields[4] = (df_report_field) { .key = "Date", .value = r->date ? r->date : today };
  fields[5] = (df_report_field) { .key = "Produced by", .value = tool };
  paragraph (f, TITLE_FONT, "Design record: surface and loop measurements", FALSE, 8);
  key_value_table (f, fields, G_N_ELEMENTS (fields));
}

/* The picture's K legend: in the record's curvature unit when both it and the surface's are
 * known units (factor from df_unit_gaussian), else in the surface's own. */
static double
legend_k_scale (const df_report *r, const char **k_units)
{
  const char *mu = r->model_units ? r->model_units : r->units;
  const char *ku = r->curvature_units ? r->curvature_units : r->units;
  df_unit m, k;

  *k_units = mu;
  if (ku == NULL || mu == NULL || !df_unit_from_name (mu, &m) || !df_unit_from_name (ku, &k))
    return 1.0;
  *k_units = ku;
  return df_unit_gaussian (1.0, m, k);
}

static void
conventions (flow *f)
{
  const char *u = f->report->units ? f->report->units : "units";
  const char *ku = f->report->curvature_units ? f->report->curvature_units : u;
  const char *mu = f->report->model_units;
  const char *lk = NULL;
  g_autofree char *units_note = NULL;

  legend_k_scale (f->report, &lk);
  units_note = mu != NULL && (strcmp (mu, u) != 0 || strcmp (mu, ku) != 0)
    ? g_strdup_printf (" The surface is defined in %s: its inputs above are in %s and the "
                       "picture's curvature scale in 1/%s\xc2\xb2; every figure below is "
                       "converted (lengths to %s, K to 1/%s\xc2\xb2).", mu, mu,
                       lk != NULL ? lk : mu, u, ku)
    : g_strdup ("");
  g_autofree char *text = g_strdup_printf (
    "Lengths are in %s, areas in %s\xc2\xb2, curvature K in 1/%s\xc2\xb2 and geodesic "
    "curvature k_g in 1/%s. The unit normal is N = X_u \xc3\x97 X_v / |X_u \xc3\x97 X_v| "
    "(which way it points is stated above); angles in a tangent plane are measured "
    "anticlockwise about N. The holonomy of a loop is the angle from the start vector to the "
    "vector carried parallel once round the loop, anticlockwise about N at the start, wrapped "
    "to (\xe2\x88\x92" "180\xc2\xb0, 180\xc2\xb0]. The enclosed curvature is +\xe2\x88\xac K dA "
    "over the disc on the left of the direction of travel (\xe2\x88\x92\xe2\x88\xac K dA when "
    "the disc lies on the right), computed independently of the transport by Green's theorem; "
    "by Gauss\xe2\x80\x93" "Bonnet the holonomy equals it modulo 360\xc2\xb0, and the residual "
    "(their difference, wrapped) measures the numerical agreement. A cone apex contributes "
    "its concentrated curvature 2\xcf\x80(1 \xe2\x88\x92 sin \xce\xb1) when the disc contains "
    "it. The steering radius is 1/|k_g|.%s",
    u, u, ku, u, units_note);

  heading (f, "Conventions");
  paragraph (f, BODY_FONT, text, FALSE, 6);
}

static void
hex_colour (const char *colour, double rgb[3])
{
  guint v;

  rgb[0] = rgb[1] = rgb[2] = 0.25;
  if (colour == NULL || colour[0] != '#' || strlen (colour) != 7
      || sscanf (colour + 1, "%6x", &v) != 1)
    return;
  rgb[0] = ((v >> 16) & 0xff) / 255.0;
  rgb[1] = ((v >> 8) & 0xff) / 255.0;
  rgb[2] = (v & 0xff) / 255.0;
}

static void
picture (flow *f)
{
  const df_report *r = f->report;
  double w = content_width (f), h = PICTURE_H;
  g_autoptr (GError) error = NULL;

  /* Heading, picture and caption stay together. */
  ensure (f, h + 60);
  heading (f, "Surface and loops");
  if (f->draw && r->picture != NULL)
    {
      double iw = cairo_image_surface_get_width (r->picture);
      double ih = cairo_image_surface_get_height (r->picture);
      double s = fmin (w / fmax (iw, 1), h / fmax (ih, 1));

      cairo_save (f->cr);
      cairo_translate (f->cr, MARGIN + (w - iw * s) / 2, f->y);
      cairo_scale (f->cr, s, s);
      cairo_set_source_surface (f->cr, r->picture, 0, 0);
      cairo_paint (f->cr);
      cairo_restore (f->cr);
    }
  else if (f->draw)
    {
      GArray *curves = g_array_new (FALSE, TRUE, sizeof (df_picture_curve));
      GPtrArray *owned = g_ptr_array_new_with_free_func (g_free);

      for (gsize i = 0; i < r->n_loops; i++)
        {
          const df_report_loop *lp = &r->loops[i];
          df_picture_curve c = { 0 };
          double (*xyz)[3];
          gsize n = 0;

          hex_colour (lp->colour, c.rgb);
          c.name = lp->name;
          c.closed = TRUE;
          if (lp->result != NULL && lp->result->n_samples >= 2)
            {
              xyz = g_malloc_n (lp->result->n_samples, sizeof (double[3]));
              for (gsize k = 0; k < lp->result->n_samples; k++)
                memcpy (xyz[n++], lp->result->samples[k].point, sizeof xyz[0]);
            }
          else
            {
              /* Unmeasured: the given points themselves, where the surface has them. */
              xyz = g_malloc_n (MAX (lp->n, 1), sizeof (double[3]));
              for (gsize k = 0; k < lp->n; k++)
                {
                  df_chart_jet j;

                  if (df_surface_eval (r->surface, lp->uv[k][0], lp->uv[k][1], 0, &j, NULL)
                      == DF_OK)
                    memcpy (xyz[n++], j.x, sizeof xyz[0]);
                }
            }
          g_ptr_array_add (owned, xyz);
          c.xyz = (const double (*)[3]) xyz;
          c.n = n;
          g_array_append_val (curves, c);
        }
      for (gsize i = 0; i < r->n_curves; i++)
        {
          df_picture_curve c = { 0 };

          c.name = r->curves[i].name;
          memcpy (c.rgb, r->curves[i].rgb, sizeof c.rgb);
          c.xyz = r->curves[i].xyz;
          c.n = r->curves[i].n;
          c.closed = FALSE;
          g_array_append_val (curves, c);
        }
      const char *k_units = NULL;
      double k_scale = legend_k_scale (r, &k_units);

      if (!df_report_draw_picture_k_scaled (f->cr, MARGIN, f->y, w, h, r->view_yaw_deg,
                                            r->view_pitch_deg, r->surface, k_units, k_scale,
                                            (const df_picture_curve *) curves->data,
                                            curves->len, &error)
          && f->error == NULL)
        f->error = g_steal_pointer (&error);
      g_array_unref (curves);
      g_ptr_array_unref (owned);
    }
  f->y += h + 4;
  paragraph (f, SMALL_FONT,
             r->picture != NULL ? "The view as shown in driftframe, with its legend."
                                : "Orthographic view, shaded by Gaussian curvature; loops solid "
                                  "where seen, dashed where the surface hides them.",
             FALSE, 8);
}

static void
summary_table (flow *f)
{
  const df_report *r = f->report;
  const char *u = r->units ? r->units : "";
  static const double frac[] = { 0.22, 0.13, 0.13, 0.12, 0.12, 0.13, 0.15 };
  g_autofree char *len_h = g_strdup_printf ("Length (%s)", u);
  g_autofree char *rad_h = g_strdup_printf ("Min. steering radius (%s)", u);
  const char *head[] = { "Loop", "Holonomy (\xc2\xb0)", "Enclosed curvature (\xc2\xb0)",
                         "Residual (rad)", len_h, rad_h, "Status" };
  double w = content_width (f);

  heading (f, "Summary");
  for (gsize row = 0; row <= r->n_loops; row++)
    {
      const char *cell[7] = { 0 };
      PangoLayout *l[7];
      double x = MARGIN, h = 0;

      if (row == 0)
        for (int c = 0; c < 7; c++)
          cell[c] = head[c];
      else
        {
          const df_report_loop *lp = &r->loops[row - 1];
          const df_loop_result *res = lp->result;

          cell[0] = lp->name;
          if (res == NULL)
            {
              for (int c = 1; c < 6; c++)
                cell[c] = "\xe2\x80\x94";
              cell[6] = "not measured (see its section)";
            }
          else
            {
              cell[1] = deg (f, res->holonomy_rad);
              cell[2] = !res->bounds_disc            ? "no disc"
                        : !res->enclosed_available ? "not computed"
                                                   : deg (f, res->enclosed_curvature_rad);
              cell[3] = res->bounds_disc && res->enclosed_available ? num (f, res->residual_rad, 2)
                                                                    : "\xe2\x80\x94";
              cell[4] = num (f, res->length, 7);
              cell[5] = res->has_steering_radius ? num (f, res->min_steering_radius, 6)
                                                 : "none (geodesic)";
              cell[6] = !lp->checked ? "measured"
                        : lp->n_exceeded > 0
                          ? keep (f, g_strdup_printf ("LIMITS EXCEEDED (%u stretch%s)",
                                                      lp->n_exceeded,
                                                      lp->n_exceeded == 1 ? "" : "es"))
                          : "within the limits";
            }
        }
      for (int c = 0; c < 7; c++)
        {
          l[c] = make_layout (f, row == 0 ? "DejaVu Sans Bold 9" : "DejaVu Sans 9",
                              w * frac[c] - 4, cell[c], FALSE);
          h = fmax (h, layout_height (l[c]));
        }
      h += 4;
      ensure (f, h);
      if (f->draw && row % 2 == 0)
        {
          cairo_set_source_rgb (f->cr, row == 0 ? 0.88 : 0.95, row == 0 ? 0.88 : 0.95,
                                row == 0 ? 0.85 : 0.93);
          cairo_rectangle (f->cr, MARGIN - 2, f->y - 1, w + 4, h);
          cairo_fill (f->cr);
          cairo_set_source_rgb (f->cr, 0, 0, 0);
        }
      for (int c = 0; c < 7; c++)
        {
          show_layout (f, l[c], x, f->y + 1);
          x += w * frac[c];
          g_object_unref (l[c]);
        }
      f->y += h;
    }
  f->y += 8;
}

static void
loop_section (flow *f, gsize i)
{
  const df_report *r = f->report;
  const df_report_loop *lp = &r->loops[i];
  const df_loop_result *res = lp->result;
  const char *u = r->units ? r->units : "";
  g_autofree char *title = g_strdup_printf ("Loop %" G_GSIZE_FORMAT ": %s", i + 1, lp->name);
  GArray *fields = g_array_new (FALSE, TRUE, sizeof (df_report_field));

  /* Keys are literals; values are literals or kept strings. */
#define ADD(k, v)                                                                               \
  do                                                                                            \
    {                                                                                           \
      df_report_field fl_ = { .key = (k), .value = (v) };                                                     \
      g_array_append_val (fields, fl_);                                                         \
    }                                                                                           \
  while (0)
#define FMT(...) keep (f, g_strdup_printf (__VA_ARGS__))

  /* A loop's figures and its plot on one page: about a dozen table rows and the plot. */
  ensure (f, res != NULL ? 12 * 15 + PLOT_H + 40 : 80);
  heading (f, title);
  ADD ("Points given", FMT ("%" G_GSIZE_FORMAT, lp->n));
  if (res == NULL)
    {
      ADD ("Not measured", lp->failure ? lp->failure : "no reason given");
      key_value_table (f, (const df_report_field *) fields->data, fields->len);
    }
  else
    {
      ADD ("Holonomy", FMT ("%s\xc2\xb0 (%s rad), anticlockwise about N",
                            deg (f, res->holonomy_rad), num (f, res->holonomy_rad, 10)));
      if (res->bounds_disc && !res->enclosed_available)
        ADD ("Enclosed curvature", FMT ("not computed: %s", res->enclosed_note));
      else if (res->bounds_disc)
        {
          ADD ("Enclosed curvature", FMT ("%s\xc2\xb0 (%s rad \xc2\xb1 %s, the achieved error "
                                          "estimate), disc on the %s",
                                          deg (f, res->enclosed_curvature_rad),
                                          num (f, res->enclosed_curvature_rad, 10),
                                          num (f, res->enclosed_error_rad, 2),
                                          res->disc_on_left ? "left" : "right"));
          ADD ("Gauss\xe2\x80\x93" "Bonnet residual", FMT ("%s rad", num (f, res->residual_rad, 3)));
          ADD ("Disc area", FMT ("%s %s\xc2\xb2", num (f, res->area, 7), u));
          if (res->has_mean_K)
            ADD ("Mean Gaussian curvature",
                 FMT ("%s 1/%s\xc2\xb2 (enclosed curvature / area)", num (f, res->mean_K, 6),
                      r->curvature_units ? r->curvature_units : u));
          if (res->concentrated_rad != 0)
            ADD ("Cone apex inside", FMT ("%s rad of it concentrated at the apex",
                                          num (f, res->concentrated_rad, 8)));
          if (res->has_other_disc)
            ADD ("Other cap", FMT ("%s\xc2\xb0 over %s %s\xc2\xb2",
                                   deg (f, res->other_enclosed_curvature_rad),
                                   num (f, res->other_area, 7), u));
        }
      else
        ADD ("Enclosed curvature", res->disc_note[0] ? res->disc_note : "the loop bounds no disc");
      ADD ("\xe2\x88\xae k_g ds", FMT ("%s rad", num (f, res->total_geodesic_curvature_rad, 10)));
      ADD ("Length", FMT ("%s %s", num (f, res->length, 8), u));
      ADD ("Min. steering radius",
           res->has_steering_radius ? FMT ("%s %s", num (f, res->min_steering_radius, 6), u)
                                    : "none: a geodesic loop");
      ADD ("Simple", res->simple ? "yes, no self-intersection found"
                                 : "no: the loop crosses itself");
      if (res->bounds_disc && res->disc_note[0] != '\0')
        ADD ("Note", res->disc_note);
      if (res->bounds_disc && res->enclosed_available && res->enclosed_note[0] != '\0')
        ADD ("Note on the enclosed curvature", res->enclosed_note);
      key_value_table (f, (const df_report_field *) fields->data, fields->len);

      ensure (f, PLOT_H + 10);
      if (f->draw)
        df_report_draw_kg_plot (f->cr, MARGIN, f->y, content_width (f), PLOT_H, res, u,
                                lp->kg_limit);
      f->y += PLOT_H + 8;
    }
  if (lp->verdicts != NULL && lp->verdicts[0] != NULL)
    {
      paragraph (f, "DejaVu Sans Bold 10", "Limits", FALSE, 2);
      for (gsize k = 0; lp->verdicts[k] != NULL; k++)
        paragraph (f, BODY_FONT, lp->verdicts[k], FALSE, 2);
      f->y += 4;
    }
  for (gsize k = 0; lp->extra != NULL && lp->extra[k] != NULL; k++)
    paragraph (f, BODY_FONT, lp->extra[k], FALSE, 2);
#undef ADD
#undef FMT
  g_array_unref (fields);
}

static void
caution (flow *f)
{
  const char *text = f->report->caution
                       ? f->report->caution
                       : "Geometric estimate only, not a material or structural assessment.";
  PangoLayout *l;
  double h;

  heading (f, "Caution");
  l = make_layout (f, "DejaVu Sans 10.5", content_width (f) - 16, text, FALSE);
  h = layout_height (l);
  ensure (f, h + 16);
  if (f->draw)
    {
      cairo_set_source_rgb (f->cr, 1.0, 0.97, 0.88);
      cairo_rectangle (f->cr, MARGIN, f->y, content_width (f), h + 16);
      cairo_fill_preserve (f->cr);
      cairo_set_source_rgb (f->cr, 0.6, 0.45, 0.1);
      cairo_set_line_width (f->cr, 0.8);
      cairo_stroke (f->cr);
      cairo_set_source_rgb (f->cr, 0, 0, 0);
    }
  show_layout (f, l, MARGIN + 8, f->y + 8);
  f->y += h + 24;
  g_object_unref (l);
}

static void
lay_out (flow *f)
{
  const df_report *r = f->report;

  f->page = 1;
  f->y = MARGIN + HEADER_SPACE - 20;
  page_decorations (f);
  title_block (f);
  heading (f, "Inputs");
  key_value_table (f, r->inputs, r->n_inputs);
  conventions (f);
  picture (f);
  summary_table (f);
  for (gsize i = 0; i < r->n_loops; i++)
    loop_section (f, i);
  for (gsize i = 0; i < r->n_sections; i++)
    {
      ensure (f, 40 + 15.0 * r->sections[i].n_fields);
      heading (f, r->sections[i].title);
      key_value_table (f, r->sections[i].fields, r->sections[i].n_fields);
    }
  caution (f);
}

static cairo_status_t
append_bytes (void *closure, const unsigned char *data, unsigned int length)
{
  g_byte_array_append (closure, data, length);
  return CAIRO_STATUS_SUCCESS;
}

gboolean
df_report_write_pdf (const df_report *report, const char *path, GError **error)
{
  flow f = { 0 };
  cairo_surface_t *surface;
  g_autoptr (GByteArray) bytes = g_byte_array_new ();
  cairo_status_t cs;

  g_return_val_if_fail (report != NULL && report->surface != NULL, FALSE);
  f.report = report;
  f.scratch = g_ptr_array_new_with_free_func (g_free);
  if (report->paper == DF_PAPER_LETTER)
    {
      f.page_w = 612;
      f.page_h = 792;
    }
  else
    {
      f.page_w = 595.276;   /* 210 x 297 mm */
      f.page_h = 841.89;
    }

  /* Pass 1: count the pages on a scratch surface (same fonts and metrics, nothing drawn). */
  surface = cairo_image_surface_create (CAIRO_FORMAT_ARGB32, 4, 4);
  f.cr = cairo_create (surface);
  f.draw = FALSE;
  lay_out (&f);
  f.n_pages = f.page;
  cairo_destroy (f.cr);
  cairo_surface_destroy (surface);

  surface = cairo_pdf_surface_create_for_stream (append_bytes, bytes, f.page_w, f.page_h);
  cairo_pdf_surface_set_metadata (surface, CAIRO_PDF_METADATA_TITLE, report->title);
  cairo_pdf_surface_set_metadata (surface, CAIRO_PDF_METADATA_CREATOR, "driftframe");
  if (report->author != NULL)
    cairo_pdf_surface_set_metadata (surface, CAIRO_PDF_METADATA_AUTHOR, report->author);
  f.cr = cairo_create (surface);
  f.draw = TRUE;
  lay_out (&f);
  cairo_show_page (f.cr);
  cs = cairo_status (f.cr);
  cairo_destroy (f.cr);
  cairo_surface_finish (surface);
  if (cs == CAIRO_STATUS_SUCCESS)
    cs = cairo_surface_status (surface);
  cairo_surface_destroy (surface);
  g_ptr_array_unref (f.scratch);

  if (f.error != NULL)
    {
      g_propagate_prefixed_error (error, f.error, "%s: ", path);
      return FALSE;
    }
  if (cs != CAIRO_STATUS_SUCCESS)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FILE, "%s: the PDF could not be drawn: %s",
                   path, cairo_status_to_string (cs));
      return FALSE;
    }
  return df_write_file_atomic (path, (const char *) bytes->data, (gssize) bytes->len, error);
}
