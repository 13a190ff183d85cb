/* df-gore-dialog.c: the gore tool (see df-gore-dialog.h). The gores, their least count and
 * the flat outline are the core's (df-gores); the SVG and CSV are the core's writers
 * (df-decide-out), the same the CLI's `gores` uses. Here: the inputs, a preview to fit and
 * the file choosers. */
#include "df-document-units.h"
#include "df-export-chooser.h"
#include "df-labels.h"
#include "df-gore-dialog.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

#include "df-decide-out.h"
#include "df-format.h"
#include "df-gores.h"
#include "df-io-error.h"

/* Samples of the centre meridian: smooth outlines at print size (the CLI's default too). */
#define GORE_POINTS 201

typedef struct
{
  DfDocument *document;   /* owned */
  GtkWidget  *dialog;     /* borrowed: owns this struct */
  GtkWidget  *t0, *t1, *count, *seam;
  GtkWidget  *least_label, *least_button;
  GtkWidget  *numbers_label, *error_label, *preview;
  GtkWidget  *svg_button, *csv_button;
  df_gores    gores;
  gboolean    have_gores;
  int         least;
  df_unit     model, display;
  gboolean    units_known;
  double      seam_value; /* display units */
  gboolean    report_events;
} GoreDialog;

static void
gore_dialog_free (gpointer data)
{
  GoreDialog *d = data;

  df_gores_clear (&d->gores);
  g_clear_object (&d->document);
  g_free (d);
}

static gboolean
read_number (GtkWidget  *entry,
             const char *what,
             double     *out,
             GError    **error)
{
  const char *text = gtk_editable_get_text (GTK_EDITABLE (entry));
  char *end = NULL;
  double value = g_ascii_strtod (text, &end);

  while (end != NULL && g_ascii_isspace (*end))
    end++;
  if (end == text || end == NULL || *end != '\0' || !isfinite (value))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE, "%s: '%s' is not a number", what, text);
      return FALSE;
    }
  *out = value;
  return TRUE;
}

static void
show_error (GoreDialog *d,
            const char *message)
{
  gtk_label_set_text (GTK_LABEL (d->error_label), message != NULL ? message : "");
  gtk_widget_set_visible (d->error_label, message != NULL);
}

/* Recomputes the gores from the inputs; the preview and numbers follow. */
static void
recompute (GoreDialog *d)
{
  const df_surface *surface = df_document_get_surface (d->document);
  const df_limits *limits = df_document_get_limits (d->document);
  const char *un = df_unit_name (d->display);
  g_autoptr(GError) error = NULL;
  double t0 = 0, t1 = 0, seam = 0;
  int count = (int) gtk_spin_button_get_value_as_int (GTK_SPIN_BUTTON (d->count));
  df_diag diag;
  df_status st;

  if (d->have_gores)
    df_gores_clear (&d->gores);
  d->have_gores = FALSE;
  d->least = 0;
  if (!read_number (d->t0, "From t", &t0, &error) || !read_number (d->t1, "To t", &t1, &error)
      || !read_number (d->seam, "Seam allowance", &seam, &error))
    goto fail;
  if (!(seam >= 0))
    {
      g_set_error (&error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                   "Seam allowance: '%g' must not be negative", seam);
      goto fail;
    }
  d->seam_value = seam;
  df_diag_clear (&diag);
  st = df_gores_compute (surface, t0, t1, count, GORE_POINTS, &d->gores, &diag);
  if (st != DF_OK)
    {
      df_status_to_gerror (st, &diag, &error);
      goto fail;
    }
  d->have_gores = TRUE;
  if (limits != NULL && limits->item[DF_LIMIT_MAX_STRAIN].set)
    {
      double max = limits->item[DF_LIMIT_MAX_STRAIN].model_value;
      g_autofree char *m = df_format_number (max);
      g_autofree char *text = NULL;

      df_diag_clear (&diag);
      if (df_gores_least_count (surface, t0, t1, max / 100.0, &d->least, &diag) == DF_OK)
        text = g_strdup_printf ("Least count that keeps each gore's edge within your largest "
                                "sheet strain (%s %%, source: %s): %d", m,
                                limits->item[DF_LIMIT_MAX_STRAIN].source != NULL
                                  ? limits->item[DF_LIMIT_MAX_STRAIN].source : "none given",
                                d->least);
      else
        text = g_strdup_printf ("No count keeps each gore within %s %%: %s", m, diag.detail);
      gtk_label_set_text (GTK_LABEL (d->least_label), text);
    }
  else
    gtk_label_set_text (GTK_LABEL (d->least_label), "Set a largest sheet strain in the limits to "
                                                    "get the least count of gores.");
  gtk_widget_set_sensitive (d->least_button, d->least > 0 && d->least != count);
  {
    g_autofree char *len = df_format_number (df_unit_length (d->gores.length, d->model,
                                                             d->display));
    g_autofree char *wid = df_format_number (df_unit_length (d->gores.max_width, d->model,
                                                             d->display));
    g_autofree char *area = df_format_number (df_unit_area (d->gores.area_each, d->model,
                                                            d->display));
    g_autofree char *strain = df_format_number (100 * d->gores.edge_strain);
    g_autofree char *text = g_strdup_printf ("%d gores, each %s %s long and at most %s %s wide; "
                                             "flat area %s %s² each. Each edge is %s %% "
                                             "longer than the meridian it is sewn to.",
                                             count, len, un, wid, un, area, un, strain);

    gtk_label_set_text (GTK_LABEL (d->numbers_label), text);
  }
  show_error (d, d->units_known ? NULL
                                : "The surface's units are not mm, cm, m or in: the pattern "
                                  "cannot be exported at true scale (set units= in the surface).");
  gtk_widget_set_sensitive (d->svg_button, d->units_known);
  gtk_widget_set_sensitive (d->csv_button, d->units_known);
  gtk_widget_queue_draw (d->preview);
  return;

fail:
  show_error (d, error->message);
  gtk_label_set_text (GTK_LABEL (d->numbers_label), "");
  gtk_widget_set_sensitive (d->least_button, FALSE);
  gtk_widget_set_sensitive (d->svg_button, FALSE);
  gtk_widget_set_sensitive (d->csv_button, FALSE);
  gtk_widget_queue_draw (d->preview);
}

static void
input_changed_cb (GtkWidget  *widget,
                  GoreDialog *d)
{
  recompute (d);
}

static void
use_least_cb (GtkButton  *button,
              GoreDialog *d)
{
  if (d->least > 0)
    gtk_spin_button_set_value (GTK_SPIN_BUTTON (d->count), d->least);
}

/* The flat gore to scale in the box: the cutting line solid, the sewing line dashed when a
 * seam allowance is set, the centre line dotted, a scale bar. */
static void
draw_preview (GtkDrawingArea *area,
              cairo_t        *cr,
              int             width,
              int             height,
              gpointer        user_data)
{
  GoreDialog *d = user_data;
  g_autofree double (*sew)[2] = NULL;
  g_autofree double (*cut)[2] = NULL;
  size_t n_sew = 0, n_cut = 0;
  double x0 = 0, x1 = 0, y0 = 0, y1 = 0, scale, ox, oy;
  double seam_model;

  cairo_set_source_rgb (cr, 1, 1, 1);
  cairo_paint (cr);
  if (!d->have_gores)
    return;
  seam_model = df_unit_length (d->seam_value, d->display, d->model);
  if (df_gores_outline (&d->gores, 0.0, &sew, &n_sew, NULL) != DF_OK || n_sew < 3)
    return;
  if (seam_model > 0 && df_gores_outline (&d->gores, seam_model, &cut, &n_cut, NULL) != DF_OK)
    n_cut = 0;
  for (size_t i = 0; i < (n_cut > 0 ? n_cut : n_sew); i++)
    {
      const double *p = n_cut > 0 ? cut[i] : sew[i];

      x0 = fmin (x0, p[0]);
      x1 = fmax (x1, p[0]);
      y0 = fmin (y0, p[1]);
      y1 = fmax (y1, p[1]);
    }
  if (!(x1 > x0) || !(y1 > y0))
    return;
  scale = fmin ((width - 24) / (x1 - x0), (height - 40) / (y1 - y0));
  ox = width / 2.0 - scale * (x0 + x1) / 2;
  /* s = 0 (the t0 end) at the top, as in the SVG. */
  oy = 12 - scale * y0;

#define PX(x) (ox + scale * (x))
#define PY(y) (oy + scale * (y))
  cairo_set_line_width (cr, 1.5);
  cairo_set_source_rgb (cr, 0.1, 0.1, 0.1);
  for (int pass = 0; pass < 2; pass++)
    {
      double (*pts)[2] = pass == 0 ? (n_cut > 0 ? cut : sew) : sew;
      size_t n = pass == 0 ? (n_cut > 0 ? n_cut : n_sew) : n_sew;
      double dash[2] = { 5, 3 };

      if (pass == 1 && n_cut == 0)
        break;
      if (pass == 1)
        cairo_set_dash (cr, dash, 2, 0);
      for (size_t i = 0; i < n; i++)
        (i == 0 ? cairo_move_to : cairo_line_to) (cr, PX (pts[i][0]), PY (pts[i][1]));
      cairo_close_path (cr);
      if (pass == 0)
        {
          cairo_set_source_rgba (cr, 0.93, 0.86, 0.72, 1);
          cairo_fill_preserve (cr);
          cairo_set_source_rgb (cr, 0.1, 0.1, 0.1);
        }
      cairo_stroke (cr);
      cairo_set_dash (cr, NULL, 0, 0);
    }
  {
    double dots[2] = { 1, 3 };

    cairo_set_dash (cr, dots, 2, 0);
    cairo_set_line_width (cr, 1);
    cairo_move_to (cr, PX (0), PY (0));
    cairo_line_to (cr, PX (0), PY (d->gores.length));
    cairo_stroke (cr);
    cairo_set_dash (cr, NULL, 0, 0);
  }
  {
    g_autofree char *a = g_strdup_printf ("t = %s", gtk_editable_get_text (GTK_EDITABLE (d->t0)));
    g_autofree char *b = g_strdup_printf ("t = %s", gtk_editable_get_text (GTK_EDITABLE (d->t1)));

    cairo_set_font_size (cr, 11);
    cairo_move_to (cr, PX (0) + 4, PY (0) + 14);
    cairo_show_text (cr, a);
    cairo_move_to (cr, PX (0) + 4, PY (d->gores.length) - 4);
    cairo_show_text (cr, b);
  }
  {
    /* A round scale bar, so the preview's proportions can be read. */
    double span = df_unit_length (x1 - x0, d->model, d->display);
    double bar = pow (10.0, floor (log10 (fmax (span, 1e-300))));
    double bar_model = df_unit_length (bar, d->display, d->model);
    g_autofree char *b = df_format_number (bar);
    g_autofree char *text = g_strdup_printf ("%s %s", b, df_unit_name (d->display));
    cairo_text_extents_t ext;

    cairo_set_line_width (cr, 2);
    cairo_move_to (cr, 12, height - 14);
    cairo_line_to (cr, 12 + scale * bar_model, height - 14);
    cairo_stroke (cr);
    cairo_set_font_size (cr, 11);
    cairo_text_extents (cr, text, &ext);
    cairo_move_to (cr, 16 + scale * bar_model, height - 10);
    cairo_show_text (cr, text);
  }
#undef PX
#undef PY
}

static char *
pattern_label (GoreDialog *d)
{
  g_autofree char *title = df_document_get_title (d->document);
  const char *t0 = gtk_editable_get_text (GTK_EDITABLE (d->t0));
  const char *t1 = gtk_editable_get_text (GTK_EDITABLE (d->t1));

  return g_strdup_printf ("%s, t from %s to %s, %d gores", title, t0, t1,
                          gtk_spin_button_get_value_as_int (GTK_SPIN_BUTTON (d->count)));
}

typedef struct
{
  GoreDialog *d;
  gboolean    svg;
} ExportChoice;

static void
export_response_cb (GtkNativeDialog *chooser,
                    int              response,
                    gpointer         user_data)
{
  ExportChoice *choice = user_data;
  GoreDialog *d = choice->d;
  g_autoptr(GFile) file = NULL;
  g_autofree char *path = NULL;
  g_autoptr(GError) error = NULL;

  if (response == GTK_RESPONSE_ACCEPT)
    file = gtk_file_chooser_get_file (GTK_FILE_CHOOSER (chooser));
  path = file != NULL ? g_file_get_path (file) : NULL;
  if (path != NULL && d->have_gores)
    {
      g_autofree char *label = pattern_label (d);
      gboolean ok = choice->svg
                    ? df_gores_svg_write (path, &d->gores, d->model, d->display, d->seam_value,
                                          label, &error)
                    : df_gores_csv_write (path, &d->gores, d->model, d->display, d->seam_value,
                                          &error);

      if (!ok)
        show_error (d, error->message);
      else
        {
          g_autofree char *text = g_strdup_printf ("Written %s.", path);

          show_error (d, NULL);
          gtk_label_set_text (GTK_LABEL (d->numbers_label), text);
          if (d->report_events)
            {
              printf ("gores-exported %s %s\n", choice->svg ? "svg" : "csv", path);
              fflush (stdout);
            }
        }
    }
  g_object_unref (d->dialog);
  g_free (choice);
  g_object_unref (chooser);
}

static void
export_cb (GtkButton  *button,
           GoreDialog *d)
{
  gboolean svg = GTK_WIDGET (button) == d->svg_button;
  GtkFileChooserNative *chooser;
  g_autofree char *title = df_document_get_title (d->document);
  g_autofree char *name = NULL;
  const char *path = df_document_get_path (d->document);
  ExportChoice *choice;
  char *dot = strrchr (title, '.');

  if (dot != NULL && dot != title)
    *dot = '\0';
  name = g_strdup_printf ("%s-gores.%s", title, svg ? "svg" : "csv");
  chooser = df_export_chooser_new (GTK_WINDOW (d->dialog),
                                   svg ? "Export Gore Pattern (SVG)" : "Export Gore Outline (CSV)",
                                   svg ? "SVG drawing (*.svg)" : "CSV (*.csv)",
                                   svg ? "*.svg" : "*.csv", name, path);
  choice = g_new0 (ExportChoice, 1);
  choice->d = d;
  choice->svg = svg;
  g_object_ref (d->dialog);
  g_signal_connect (chooser, "response", G_CALLBACK (export_response_cb), choice);
  gtk_native_dialog_show (GTK_NATIVE_DIALOG (chooser));
}

static GtkWidget *
number_entry (double value)
{
  GtkWidget *entry = gtk_entry_new ();
  char buf[G_ASCII_DTOSTR_BUF_SIZE];

  g_ascii_formatd (buf, sizeof buf, "%.6g", value);
  gtk_editable_set_text (GTK_EDITABLE (entry), buf);
  gtk_editable_set_width_chars (GTK_EDITABLE (entry), 10);
  return entry;
}

static void
response_cb (GtkDialog *dialog,
             int        response,
             gpointer   user_data)
{
  gtk_window_destroy (GTK_WINDOW (dialog));
}

GtkWidget *
df_gore_dialog_present (GtkWindow  *parent,
                        DfDocument *document,
                        gboolean    report_events)
{
  const df_surface *surface;
  DfDisplayUnits du;
  GoreDialog *d;
  GtkWidget *dialog, *content, *grid, *side, *hbox, *buttons;
  double u0, u1, v0, v1;
  int row = 0;

  g_return_val_if_fail (DF_IS_DOCUMENT (document), NULL);
  surface = df_document_get_surface (document);
  if (surface == NULL)
    return NULL;
  if (!g_str_equal (df_surface_kind_name (surface), "revolution"))
    {
      GtkWidget *msg = gtk_message_dialog_new (parent, GTK_DIALOG_MODAL
                                                 | GTK_DIALOG_DESTROY_WITH_PARENT,
                                               GTK_MESSAGE_INFO, GTK_BUTTONS_CLOSE,
                                               "Gores need a surface of revolution");

      gtk_message_dialog_format_secondary_text (GTK_MESSAGE_DIALOG (msg),
                                                "A gore is bounded by two meridians; this "
                                                "surface is a graph z = f(x, y), which has "
                                                "none. Use the loop details' darts instead.");
      g_signal_connect (msg, "response", G_CALLBACK (gtk_window_destroy), NULL);
      gtk_window_present (GTK_WINDOW (msg));
      return msg;
    }

  d = g_new0 (GoreDialog, 1);
  d->document = g_object_ref (document);
  d->report_events = report_events;
  /* The figures and the seam allowance in the display unit; the SVG at true scale either way
   * (its width and height carry the unit), as `gores --units` writes it. */
  df_document_get_display_units (document, &du);
  d->units_known = du.known;
  d->model = du.units.model;
  d->display = du.units.length;
  df_surface_get_domain (surface, &u0, &u1, &v0, &v1);

  dialog = gtk_dialog_new_with_buttons ("Gore Pattern", parent,
                                        GTK_DIALOG_DESTROY_WITH_PARENT | GTK_DIALOG_USE_HEADER_BAR,
                                        NULL, NULL);
  d->dialog = dialog;
  g_object_set_data_full (G_OBJECT (dialog), "df-gore-dialog", d, gore_dialog_free);
  gtk_window_set_default_size (GTK_WINDOW (dialog), 760, 560);
  content = gtk_dialog_get_content_area (GTK_DIALOG (dialog));
  hbox = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 12);
  gtk_widget_set_margin_top (hbox, 12);
  gtk_widget_set_margin_bottom (hbox, 12);
  gtk_widget_set_margin_start (hbox, 12);
  gtk_widget_set_margin_end (hbox, 12);
  gtk_widget_set_vexpand (hbox, TRUE);

  side = gtk_box_new (GTK_ORIENTATION_VERTICAL, 8);
  gtk_widget_set_size_request (side, 340, -1);
  gtk_box_append (GTK_BOX (side),
                  df_label_wrapped ("Cut the band of the surface between two parallels into "
                                    "gores bounded by meridians. Each flat gore is as wide as "
                                    "its share of the parallel.", NULL, 60));
  grid = gtk_grid_new ();
  gtk_grid_set_row_spacing (GTK_GRID (grid), 6);
  gtk_grid_set_column_spacing (GTK_GRID (grid), 8);
  d->t0 = number_entry (u0);
  d->t1 = number_entry (u1);
  d->count = gtk_spin_button_new_with_range (1, 10000, 1);
  gtk_spin_button_set_value (GTK_SPIN_BUTTON (d->count), 8);
  d->seam = number_entry (0);
  {
    char range[128];
    g_autofree char *a = df_format_number (u0);
    g_autofree char *b = df_format_number (u1);
    g_autofree char *seam_units = g_strdup_printf ("%s (0: none)", df_unit_name (d->display));
    DfDisplayUnits du;

    /* t as the profile defines it (in its own unit, not the display's), named when known. */
    df_document_get_display_units (document, &du);
    g_snprintf (range, sizeof range, "profile t from %s to %s%s%s", a, b,
                du.t_unit[0] != '\0' ? " " : "", du.t_unit);
    gtk_grid_attach (GTK_GRID (grid), df_label_field ("_From t", d->t0), 0, row, 1, 1);
    gtk_grid_attach (GTK_GRID (grid), d->t0, 1, row, 1, 1);
    gtk_grid_attach (GTK_GRID (grid), df_label_wrapped (range, "dim-label", 60), 2, row++, 1, 2);
    gtk_grid_attach (GTK_GRID (grid), df_label_field ("_To t", d->t1), 0, row, 1, 1);
    gtk_grid_attach (GTK_GRID (grid), d->t1, 1, row++, 1, 1);
    gtk_grid_attach (GTK_GRID (grid), df_label_field ("_Number of gores", d->count), 0, row, 1, 1);
    gtk_grid_attach (GTK_GRID (grid), d->count, 1, row++, 1, 1);
    gtk_grid_attach (GTK_GRID (grid), df_label_field ("Seam _allowance", d->seam), 0, row, 1, 1);
    gtk_grid_attach (GTK_GRID (grid), d->seam, 1, row, 1, 1);
    gtk_grid_attach (GTK_GRID (grid), df_label_wrapped (seam_units, "dim-label", 60), 2, row++,
                     1, 1);
  }
  gtk_box_append (GTK_BOX (side), grid);
  d->least_label = df_label_wrapped ("", NULL, 60);
  gtk_box_append (GTK_BOX (side), d->least_label);
  d->least_button = gtk_button_new_with_mnemonic ("Use the _least count");
  gtk_widget_set_halign (d->least_button, GTK_ALIGN_START);
  gtk_box_append (GTK_BOX (side), d->least_button);
  d->numbers_label = df_label_wrapped ("", NULL, 60);
  gtk_label_set_selectable (GTK_LABEL (d->numbers_label), TRUE);
  gtk_box_append (GTK_BOX (side), d->numbers_label);
  d->error_label = df_label_wrapped ("", "df-error", 60);
  gtk_widget_set_visible (d->error_label, FALSE);
  gtk_box_append (GTK_BOX (side), d->error_label);
  buttons = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 6);
  d->svg_button = gtk_button_new_with_mnemonic ("Export _SVG…");
  gtk_widget_set_tooltip_text (d->svg_button, "The flat gore at true scale (width and height in "
                               "real units), with labels and the caution");
  d->csv_button = gtk_button_new_with_mnemonic ("Export _CSV…");
  gtk_widget_set_tooltip_text (d->csv_button, "The outline points (sewing and cutting lines)");
  gtk_box_append (GTK_BOX (buttons), d->svg_button);
  gtk_box_append (GTK_BOX (buttons), d->csv_button);
  gtk_box_append (GTK_BOX (side), buttons);
  gtk_box_append (GTK_BOX (side), df_label_wrapped (DF_DECIDE_CAUTION, "df-caution", 60));

  d->preview = gtk_drawing_area_new ();
  gtk_widget_set_hexpand (d->preview, TRUE);
  gtk_widget_set_vexpand (d->preview, TRUE);
  gtk_drawing_area_set_content_width (GTK_DRAWING_AREA (d->preview), 360);
  gtk_drawing_area_set_draw_func (GTK_DRAWING_AREA (d->preview), draw_preview, d, NULL);
  gtk_accessible_update_property (GTK_ACCESSIBLE (d->preview), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                  "Preview of one flat gore", -1);
  gtk_box_append (GTK_BOX (hbox), side);
  gtk_box_append (GTK_BOX (hbox), d->preview);
  gtk_box_append (GTK_BOX (content), hbox);

  g_signal_connect (d->t0, "changed", G_CALLBACK (input_changed_cb), d);
  g_signal_connect (d->t1, "changed", G_CALLBACK (input_changed_cb), d);
  g_signal_connect (d->seam, "changed", G_CALLBACK (input_changed_cb), d);
  g_signal_connect (d->count, "value-changed", G_CALLBACK (input_changed_cb), d);
  g_signal_connect (d->least_button, "clicked", G_CALLBACK (use_least_cb), d);
  g_signal_connect (d->svg_button, "clicked", G_CALLBACK (export_cb), d);
  g_signal_connect (d->csv_button, "clicked", G_CALLBACK (export_cb), d);
  g_signal_connect (dialog, "response", G_CALLBACK (response_cb), NULL);
  recompute (d);
  gtk_window_present (GTK_WINDOW (dialog));
  gtk_widget_grab_focus (d->count);
  return dialog;
}
