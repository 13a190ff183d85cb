/* df-drape-window-export.c: the drape window's exports (the flat pattern as SVG at true scale,
 * the pins and the flat outline as CSV in the display unit, through the core's atomic writers,
 * as `driftframe-cli drape --units --svg/--nodes/--flat`) and Keep for the shear check (the
 * shown drape made the loop's own for its max-shear-deg verdict). */
#include "df-drape-window-private.h"

#include <stdio.h>

#include "df-document-units.h"
#include "df-drape-out.h"
#include "df-export-chooser.h"

/* The shown drape's start, warp and cell become the loop's own for its max-shear-deg check
 * (saved with the project, read by `check`), instead of the defaults. */
void
_df_drape_window_keep_cb (GtkButton     *button,
         DfDrapeWindow *self)
{
  DfLoopItem *item = _df_drape_window_chosen_loop (self);
  const df_drape_options *o;
  df_shear_setup setup = { 0 };

  if (item == NULL || self->result == NULL || !self->result_final || !self->have_start)
    return;
  o = df_drape_get_options (self->result->drape);
  setup.has_start = TRUE;
  setup.start[0] = self->start[0];
  setup.start[1] = self->start[1];
  setup.has_warp = TRUE;
  setup.warp_deg = o->warp_rad * DEG;
  setup.has_cell = TRUE;
  setup.cell = o->cell;
  df_document_set_loop_drape (self->document, item, &setup);
  _df_drape_window_set_status (self, "The loop's fabric-shear check now drapes it from this "
                               "start, warp and cell (saved with the project; Ctrl+Z undoes "
                               "it).", FALSE);
  if (self->report_events)
    {
      printf ("drape-kept %.17g %.17g %.17g %.17g\n", setup.start[0], setup.start[1],
              setup.warp_deg, setup.cell);
      fflush (stdout);
    }
}

typedef struct
{
  DfDrapeWindow *self;
  const char    *what;
} ExportChoice;

static void
export_response_cb (GtkNativeDialog *chooser,
                    int              response,
                    gpointer         user_data)
{
  ExportChoice *choice = user_data;
  DfDrapeWindow *self = choice->self;
  g_autoptr(GFile) file = response == GTK_RESPONSE_ACCEPT
                          ? gtk_file_chooser_get_file (GTK_FILE_CHOOSER (chooser)) : NULL;
  g_autofree char *path = file != NULL ? g_file_get_path (file) : NULL;
  g_autoptr(GError) error = NULL;

  if (path != NULL && self->result != NULL && self->document != NULL)
    {
      const df_drape *d = self->result->drape;
      DfDisplayUnits du;
      double f;
      gboolean ok;

      /* The core's writers, atomic (df-drape-out.c), as `drape --units --svg/--nodes/--flat`:
       * the CSVs' lengths in the display unit, the SVG at true scale in the surface's. */
      df_document_get_display_units (self->document, &du);
      f = df_du_length (&du, 1.0);
      if (g_str_equal (choice->what, "svg"))
        ok = df_drape_svg_write (path, d, df_document_get_units (self->document), &error);
      else if (g_str_equal (choice->what, "csv"))
        ok = df_drape_nodes_write_scaled (path, d, f, &error);
      else
        ok = df_drape_flat_write_scaled (path, d, f, &error);
      if (ok)
        {
          g_autofree char *text = g_strdup_printf ("Written %s.", path);

          _df_drape_window_set_status (self, text, FALSE);
          if (self->report_events)
            {
              printf ("drape-exported %s %s\n", choice->what, path);
              fflush (stdout);
            }
        }
      else
        _df_drape_window_set_status (self, error->message, TRUE);
    }
  g_object_unref (self);
  g_free (choice);
  g_object_unref (chooser);
}

void
_df_drape_window_export_cb (GtkButton     *button,
           DfDrapeWindow *self)
{
  GtkWidget *w = GTK_WIDGET (button);
  const char *what = w == self->svg ? "svg" : w == self->pins ? "csv" : "flat";
  gboolean svg = w == self->svg;
  GtkFileChooserNative *chooser;
  ExportChoice *choice = g_new0 (ExportChoice, 1);

  chooser = df_export_chooser_new (GTK_WINDOW (self),
                                   svg ? "Export Flat Pattern (SVG)"
                                   : w == self->pins ? "Export Drape Pins (CSV)"
                                   : "Export Flat Outline (CSV)",
                                   svg ? "SVG image (*.svg)" : "CSV (*.csv)",
                                   svg ? "*.svg" : "*.csv",
                                   svg ? "flat-pattern.svg" : w == self->pins
                                   ? "drape-pins.csv" : "flat-outline.csv",
                                   df_document_get_path (self->document));
  choice->self = g_object_ref (self);
  choice->what = what;
  g_signal_connect (chooser, "response", G_CALLBACK (export_response_cb), choice);
  gtk_native_dialog_show (GTK_NATIVE_DIALOG (chooser));
}
