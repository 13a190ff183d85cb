/* df-window-report.c: DfWindow's design-record exports: the view as a PNG with its legend, the
 * loop names and a caption line at a size the user chooses; the PDF record (the core's
 * df-report, with the view rendered by the app as its picture); and the dialog that edits the
 * record's title block. Computes no geometry. */
#include "df-document-units.h"
#include "df-window-private.h"
#include "df-format.h"

#include <math.h>
#include <pango/pangocairo.h>
#include <string.h>

#include "df-colour-ramp.h"
#include "df-io-error.h"
#include "df-decide-out.h"
#include "df-report.h"
#include "df-report-verdicts.h"

#define CAUTION_TEXT                                                                             \
  "Geometric estimate only, not a material or structural assessment: check against the "       \
  "material supplier's data, local codes and licensed engineering practice. " DF_DECIDE_CAUTION

static void
show_text (cairo_t *cr, double x, double y, const char *text, double size, gboolean bold,
           gboolean backdrop, double *w_out, double *h_out)
{
  PangoLayout *l = pango_cairo_create_layout (cr);
  PangoFontDescription *d = pango_font_description_new ();
  int w, h;

  pango_font_description_set_family (d, "Sans");
  pango_font_description_set_absolute_size (d, size * PANGO_SCALE);
  if (bold)
    pango_font_description_set_weight (d, PANGO_WEIGHT_BOLD);
  pango_layout_set_font_description (l, d);
  pango_font_description_free (d);
  pango_layout_set_text (l, text, -1);
  pango_layout_get_pixel_size (l, &w, &h);
  if (backdrop)
    {
      cairo_save (cr);
      cairo_set_source_rgba (cr, 1, 1, 1, 0.85);
      cairo_rectangle (cr, x - size * 0.3, y - size * 0.15, w + size * 0.6, h + size * 0.3);
      cairo_fill (cr);
      cairo_restore (cr);
    }
  cairo_move_to (cr, x, y);
  pango_cairo_show_layout (cr, l);
  g_object_unref (l);
  if (w_out != NULL)
    *w_out = w;
  if (h_out != NULL)
    *h_out = h;
}

static void
number_text (char *buf, gsize len, double v)
{
  if (!isfinite (v))
    g_strlcpy (buf, "n/a", len);
  else if (v == 0)
    g_strlcpy (buf, "0", len);
  else
    {
      /* The legend's and the details' format (x10^n with a true minus), not printf's e-05. */
      g_autofree char *text = df_format_number (v);

      g_strlcpy (buf, text, len);
    }
}

/* The legend on a backdrop, bottom left: always readable over the surface. */
static void
draw_legend (DfWindow *self, cairo_t *cr, int w, int h, double fs)
{
  DfShading shading = df_surface_view_get_shading (self->view);
  DfDisplayUnits du;
  const char *u;
  double lo, hi, bw = MIN (w * 0.35, 36 * fs), bh = fs * 0.9, x = fs, y;
  g_autofree char *title = NULL;
  char a[32], b[32];
  cairo_pattern_t *grad;

  if (shading == DF_SHADING_PLAIN)
    return;
  df_surface_view_get_shading_range (self->view, &lo, &hi);
  /* The window legend's numbers (df-legend-bar.c): the range shown in the display units. */
  df_document_get_display_units (self->document, &du);
  if (shading == DF_SHADING_GAUSSIAN)
    {
      lo = df_du_gaussian (&du, lo);
      hi = df_du_gaussian (&du, hi);
      u = df_du_curvature_unit (&du);
    }
  else
    {
      lo = df_du_per_curvature (&du, lo);
      hi = df_du_per_curvature (&du, hi);
      u = df_du_curvature_unit (&du);
    }
  title = g_strdup_printf ("%s, 1/%s%s",
                           shading == DF_SHADING_GAUSSIAN ? "Gaussian curvature K"
                                                          : "Mean curvature H",
                           u, shading == DF_SHADING_GAUSSIAN ? "\xc2\xb2" : "");
  y = h - fs * 4.6;
  cairo_set_source_rgba (cr, 1, 1, 1, 0.88);
  cairo_rectangle (cr, x - fs * 0.5, y - fs * 0.4, bw + fs, fs * 4.2);
  cairo_fill (cr);
  cairo_set_source_rgb (cr, 0.1, 0.1, 0.1);
  show_text (cr, x, y, title, fs, FALSE, FALSE, NULL, NULL);
  y += fs * 1.5;
  grad = cairo_pattern_create_linear (x, 0, x + bw, 0);
  for (int i = 0; i <= 8; i++)
    {
      /* A one-signed span is drawn on one arm, as in the window's legend (df-legend-bar.c). */
      double rgb[3], s_lo = lo > 0 ? 0 : -1, s_hi = hi < 0 ? 0 : 1;

      df_colour_ramp (s_lo + (s_hi - s_lo) * i / 8.0, rgb);
      cairo_pattern_add_color_stop_rgb (grad, i / 8.0, rgb[0], rgb[1], rgb[2]);
    }
  cairo_rectangle (cr, x, y, bw, bh);
  cairo_set_source (cr, grad);
  cairo_fill (cr);
  cairo_pattern_destroy (grad);
  cairo_set_source_rgb (cr, 0.1, 0.1, 0.1);
  if (hi > lo)
    {
      double tw;

      number_text (a, sizeof a, lo);
      number_text (b, sizeof b, hi);
      show_text (cr, x, y + bh + fs * 0.1, a, fs * 0.85, FALSE, FALSE, NULL, NULL);
      if (lo < 0 && hi > 0)
        show_text (cr, x + bw / 2 - fs * 0.25, y + bh + fs * 0.1, "0", fs * 0.85, FALSE, FALSE,
                   NULL, NULL);
      /* Right-aligned: measure first, then draw. */
      cairo_save (cr);
      cairo_set_source_rgba (cr, 0, 0, 0, 0);
      show_text (cr, 0, 0, b, fs * 0.85, FALSE, FALSE, &tw, NULL);
      cairo_restore (cr);
      show_text (cr, x + bw - tw, y + bh + fs * 0.1, b, fs * 0.85, FALSE, FALSE, NULL, NULL);
    }
  else
    show_text (cr, x, y + bh + fs * 0.1, "0 everywhere", fs * 0.85, FALSE, FALSE, NULL, NULL);
}

/* Each measured loop's name beside its topmost point in the picture among those on the side
 * of the surface that faces the eye (any point when none does), so a name sits on what is
 * seen. */
static void
draw_loop_names (DfWindow *self, cairo_t *cr, int w, int h, double fs)
{
  GListModel *loops = df_document_get_loops (self->document);
  double eye[3];

  df_surface_view_get_eye (self->view, eye);
  for (guint i = 0; i < g_list_model_get_n_items (loops); i++)
    {
      g_autoptr (DfLoopItem) item = g_list_model_get_item (loops, i);
      const df_loop_result *r = df_loop_item_get_result (item);
      double bx = 0, by = INFINITY;
      GdkRGBA rgba;

      if (r == NULL)
        continue;
      for (int pass = 0; pass < 2 && !isfinite (by); pass++)
        for (gsize k = 0; k < r->n_samples; k++)
          {
            const df_loop_sample *s = &r->samples[k];
            double px, py, facing = 0;

            for (int c = 0; c < 3; c++)
              facing += s->normal[c] * (eye[c] - s->point[c]);
            /* Where N turns towards the eye the point lies on the near side of a shell; the
             * second pass takes any point (a loop seen only from inside). */
            if (pass == 0 && facing <= 0)
              continue;
            if (df_surface_view_project_point (self->view, s->point, w, h, &px, &py) && py < by)
              {
                bx = px;
                by = py;
              }
          }
      if (!isfinite (by))
        continue;
      df_loop_item_get_rgba (item, &rgba);
      /* A swatch of the loop's colour, then its name, on a light backdrop. */
      cairo_set_source_rgba (cr, 1, 1, 1, 0.85);
      cairo_rectangle (cr, bx - fs * 0.2, by - fs * 1.75, fs * 1.1, fs * 1.1);
      cairo_fill (cr);
      gdk_cairo_set_source_rgba (cr, &rgba);
      cairo_rectangle (cr, bx, by - fs * 1.55, fs * 0.7, fs * 0.7);
      cairo_fill (cr);
      cairo_set_source_rgb (cr, 0.08, 0.08, 0.08);
      show_text (cr, bx + fs * 1.1, by - fs * 1.85, df_loop_item_get_name (item), fs, TRUE, TRUE,
                 NULL, NULL);
    }
}

static void
draw_caption (DfWindow *self, cairo_t *cr, int w, double fs)
{
  g_autofree char *file_title = df_document_get_title (self->document);
  const df_project *meta = df_document_get_meta (self->document);
  const char *title = meta != NULL && meta->record.title != NULL ? meta->record.title : file_title;
  g_autoptr (GDateTime) now = g_date_time_new_now_local ();
  g_autofree char *date = g_date_time_format (now, "%Y-%m-%d");
  const df_surface *s = df_document_get_surface (self->document);
  DfDisplayUnits du;
  g_autofree char *text = NULL;

  df_document_get_display_units (self->document, &du);
  text = g_strdup_printf (
    "%s \xe2\x80\x94 %s \xe2\x80\x94 lengths in %s \xe2\x80\x94 %s", title,
    s != NULL && df_surface_get_kind (s) == DF_SURFACE_REVOLUTION ? "surface of revolution"
                                                                  : "graph z = f(x, y)",
    df_du_length_unit (&du), date);

  cairo_set_source_rgba (cr, 1, 1, 1, 0.85);
  cairo_rectangle (cr, 0, 0, w, fs * 1.9);
  cairo_fill (cr);
  cairo_set_source_rgb (cr, 0.1, 0.1, 0.1);
  show_text (cr, fs * 0.6, fs * 0.35, text, fs, FALSE, FALSE, NULL, NULL);
}

/* The view with its legend, loop names and caption, as an image of w x h pixels, in the
 * display units (the PDF's picture too, as `report --pdf` draws its K legend). */
static cairo_surface_t *
annotated_image (DfWindow *self, int w, int h, GError **error)
{
  cairo_surface_t *img = df_surface_view_render_image (self->view, w, h, error);
  cairo_t *cr;
  double fs;

  if (img == NULL)
    return NULL;
  w = cairo_image_surface_get_width (img);
  h = cairo_image_surface_get_height (img);
  fs = MAX (11.0, MIN (w, h) / 45.0);
  cr = cairo_create (img);
  draw_caption (self, cr, w, fs);
  draw_loop_names (self, cr, w, h, fs);
  draw_legend (self, cr, w, h, fs);
  cairo_destroy (cr);
  return img;
}

static cairo_status_t
append_bytes (void *closure, const unsigned char *data, unsigned int length)
{
  g_byte_array_append (closure, data, length);
  return CAIRO_STATUS_SUCCESS;
}

gboolean
_df_window_export_png_annotated (DfWindow    *self,
                                 const char  *path,
                                 int          width,
                                 int          height,
                                 GError     **error)
{
  cairo_surface_t *img = annotated_image (self, width, height, error);
  g_autoptr (GByteArray) bytes = g_byte_array_new ();
  cairo_status_t cs;

  if (img == NULL)
    {
      g_prefix_error (error, "Cannot save %s: ", path);
      return FALSE;
    }
  cs = cairo_surface_write_to_png_stream (img, append_bytes, bytes);
  cairo_surface_destroy (img);
  if (cs != CAIRO_STATUS_SUCCESS)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FILE, "Cannot save %s: %s", path,
                   cairo_status_to_string (cs));
      return FALSE;
    }
  return df_write_file_atomic (path, (const char *) bytes->data, (gssize) bytes->len, error);
}

gboolean
_df_window_export_report (DfWindow    *self,
                          const char  *path,
                          const char  *paper,
                          GError     **error)
{
  GListModel *loops = df_document_get_loops (self->document);
  guint n = g_list_model_get_n_items (loops);
  const df_project *meta = df_document_get_meta (self->document);
  const df_surface *surface = df_document_get_surface (self->document);
  g_autofree char *title = df_document_get_title (self->document);
  g_autofree df_report_loop *rl = g_new0 (df_report_loop, MAX (n, 1));
  g_autoptr (GPtrArray) items = g_ptr_array_new_with_free_func (g_object_unref);
  g_autoptr (GPtrArray) lines = g_ptr_array_new_with_free_func ((GDestroyNotify) g_strfreev);
  g_autoptr (GPtrArray) shown = g_ptr_array_new_with_free_func ((GDestroyNotify) df_du_loop_result_free);
  df_report report = { 0 };
  df_report_fields fields;
  cairo_surface_t *picture;
  gboolean ok;
  DfDisplayUnits du;

  if (surface == NULL)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE, "there is no surface to report on");
      return FALSE;
    }
  if (!df_paper_from_name (paper != NULL ? paper : "a4", &report.paper))
    report.paper = DF_PAPER_A4;
  /* The picture as the user sees it, at print resolution for a 180 mm wide figure. */
  picture = annotated_image (self, 1600, 1000, error);
  if (picture == NULL)
    {
      g_prefix_error (error, "Cannot write %s: ", path);
      return FALSE;
    }
  df_report_fields_init (&fields);
  if (df_document_get_path (self->document) != NULL)
    df_report_fields_add_file (&fields, "Project file (as last saved)",
                               df_document_get_path (self->document));
  else
    df_report_fields_add (&fields, "Project file", "not saved yet");
  df_report_fields_add_spec (&fields, df_document_get_spec (self->document), surface);

  /* The figures, the picture's legend and the verdict lines in the display units, the inputs
   * in the surface's, as `report --pdf` writes them. */
  df_document_get_display_units (self->document, &du);
  for (guint i = 0; i < n; i++)
    {
      DfLoopItem *item = g_list_model_get_item (loops, i);

      g_ptr_array_add (items, item);
      rl[i].name = df_loop_item_get_name (item);
      rl[i].colour = df_loop_item_get_colour (item);
      rl[i].uv = df_loop_item_get_points (item, &rl[i].n);
      rl[i].result = df_loop_item_get_result (item);
      rl[i].failure = rl[i].result != NULL ? NULL
                      : df_loop_item_get_error (item) != NULL ? df_loop_item_get_error (item)
                                                              : "not measured yet";
      if (rl[i].result != NULL)
        {
          df_loop_result *converted = df_du_loop_result_copy (&du, rl[i].result);
          char **v;

          g_ptr_array_add (shown, converted);
          rl[i].result = converted;
          /* max-shear-deg by a drape of the loop with its own keys (defaults where unset),
           * as `report` does. */
          v = df_report_verdict_lines_display (surface, rl[i].uv, rl[i].n,
                                               df_document_get_limits (self->document),
                                               df_loop_item_get_drape (item),
                                               &du.units, &rl[i].kg_limit, &rl[i].checked,
                                               &rl[i].n_exceeded);

          if (v != NULL)
            g_ptr_array_add (lines, v);
          rl[i].verdicts = (const char *const *) v;
        }
    }
  report.title = meta != NULL && meta->record.title != NULL ? meta->record.title : title;
  report.part_number = meta != NULL ? meta->record.part_number : NULL;
  report.revision = meta != NULL ? meta->record.revision : NULL;
  report.author = meta != NULL ? meta->record.author : NULL;
  report.version = DF_VERSION;
  report.inputs = (const df_report_field *) fields.fields->data;
  report.n_inputs = fields.fields->len;
  report.units = df_du_length_unit (&du);
  report.model_units = du.label;
  report.curvature_units = df_du_curvature_unit (&du);
  report.surface = surface;
  report.loops = rl;
  report.n_loops = n;
  report.caution = CAUTION_TEXT;
  report.picture = picture;
  ok = df_report_write_pdf (&report, path, error);
  cairo_surface_destroy (picture);
  df_report_fields_clear (&fields);
  return ok;
}

/* ---- the title block dialog ------------------------------------------------------------- */

static const struct
{
  const char *key;
  const char *label;
} record_fields[] = {
  { "title", "_Project name" },
  { "part-number", "Part _number" },
  { "revision", "_Revision" },
  { "author", "A_uthor" },
};

static void
record_response_cb (GtkDialog *dialog,
                    int        response,
                    DfWindow  *self)
{
  if (response == GTK_RESPONSE_OK)
    for (gsize i = 0; i < G_N_ELEMENTS (record_fields); i++)
      {
        GtkEditable *entry = g_object_get_data (G_OBJECT (dialog), record_fields[i].key);

        df_document_set_record (self->document, record_fields[i].key,
                                gtk_editable_get_text (entry));
      }
  gtk_window_destroy (GTK_WINDOW (dialog));
}

void
_df_window_edit_record (DfWindow *self)
{
  const df_project *meta = df_document_get_meta (self->document);
  const char *values[4] = { NULL };
  GtkWidget *dialog, *grid, *content;

  if (meta != NULL)
    {
      values[0] = meta->record.title;
      values[1] = meta->record.part_number;
      values[2] = meta->record.revision;
      values[3] = meta->record.author;
    }
  dialog = gtk_dialog_new_with_buttons ("Design Record Details", GTK_WINDOW (self),
                                        GTK_DIALOG_MODAL | GTK_DIALOG_DESTROY_WITH_PARENT
                                          | GTK_DIALOG_USE_HEADER_BAR,
                                        "_Cancel", GTK_RESPONSE_CANCEL, "_Apply", GTK_RESPONSE_OK,
                                        NULL);
  gtk_dialog_set_default_response (GTK_DIALOG (dialog), GTK_RESPONSE_OK);
  content = gtk_dialog_get_content_area (GTK_DIALOG (dialog));
  grid = gtk_grid_new ();
  gtk_grid_set_row_spacing (GTK_GRID (grid), 8);
  gtk_grid_set_column_spacing (GTK_GRID (grid), 12);
  gtk_widget_set_margin_top (grid, 12);
  gtk_widget_set_margin_bottom (grid, 12);
  gtk_widget_set_margin_start (grid, 12);
  gtk_widget_set_margin_end (grid, 12);
  for (gsize i = 0; i < G_N_ELEMENTS (record_fields); i++)
    {
      GtkWidget *label = gtk_label_new_with_mnemonic (record_fields[i].label);
      GtkWidget *entry = gtk_entry_new ();

      gtk_label_set_xalign (GTK_LABEL (label), 0);
      gtk_label_set_mnemonic_widget (GTK_LABEL (label), entry);
      gtk_editable_set_text (GTK_EDITABLE (entry), values[i] != NULL ? values[i] : "");
      gtk_entry_set_activates_default (GTK_ENTRY (entry), TRUE);
      gtk_widget_set_hexpand (entry, TRUE);
      gtk_widget_set_size_request (entry, 280, -1);
      gtk_grid_attach (GTK_GRID (grid), label, 0, (int) i, 1, 1);
      gtk_grid_attach (GTK_GRID (grid), entry, 1, (int) i, 1, 1);
      g_object_set_data (G_OBJECT (dialog), record_fields[i].key, entry);
    }
  {
    GtkWidget *note = gtk_label_new ("Shown in the title block of the PDF design record and "
                                     "saved with the project.");

    gtk_widget_add_css_class (note, "dim-label");
    gtk_label_set_wrap (GTK_LABEL (note), TRUE);
    gtk_label_set_xalign (GTK_LABEL (note), 0);
    gtk_grid_attach (GTK_GRID (grid), note, 0, G_N_ELEMENTS (record_fields), 2, 1);
  }
  gtk_box_append (GTK_BOX (content), grid);
  g_signal_connect (dialog, "response", G_CALLBACK (record_response_cb), self);
  gtk_window_present (GTK_WINDOW (dialog));
}
