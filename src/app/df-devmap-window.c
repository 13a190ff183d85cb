/* df-devmap-window.c: the developability map's controls (see df-devmap-window.h). The map is
 * computed by df-devmap-job.c (the core's discs); here it is spread onto the mesh's vertices
 * for the view by bilinear interpolation between grid points (display only: the numbers shown
 * and exported are the grid's), its legend is placed over the view, and the exports go through
 * the view's PNG writer and the core's CSV writer. */
#include "df-export-chooser.h"
#include "df-labels.h"
#include "df-devmap-window.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

#include "df-decide-out.h"
#include "df-devmap-job.h"
#include "df-devmap-legend.h"
#include "df-document-units.h"
#include "df-format.h"
#include "df-io-error.h"
#include "df-surface-view-field.h"

enum { SHOW_STRAIN, SHOW_ENCLOSED };

struct _DfDevmapWindow
{
  GtkWindow parent_instance;

  /* children */
  GtkWidget *radius, *show, *grid, *compute, *cancel, *progress, *status, *off;
  GtkWidget *png, *csv;
  GtkWidget *radius_unit;     /* the display unit the radius is typed in */

  /* owned */
  DfDocument   *document;
  DfSurfaceView *view;
  GtkWidget    *legend;       /* in the view's overlay; a reference of ours */
  GtkWidget    *view_legend;  /* the view's own legend, faded out while the map shows */
  GCancellable *cancellable;
  df_devmap    *map;
  gboolean      report_events;
  DfDisplayUnits du;          /* the radius field's and the legend's units */
};

G_DEFINE_FINAL_TYPE (DfDevmapWindow, df_devmap_window, GTK_TYPE_WINDOW)

static void
set_status (DfDevmapWindow *self,
            const char     *text,
            gboolean        error)
{
  gtk_label_set_text (GTK_LABEL (self->status), text);
  if (error)
    gtk_widget_add_css_class (self->status, "df-error");
  else
    gtk_widget_remove_css_class (self->status, "df-error");
}

static double
point_value (const df_devmap_point *p,
             int                    show)
{
  return show == SHOW_STRAIN ? 100 * p->strain : p->enclosed_rad * 180 / G_PI;
}

/* The map at (u, v), bilinear between the four grid points around it (periodic in v where the
 * chart is); points whose disc could not be built are left out. FALSE when none is usable. */
static gboolean
map_at (const df_devmap *m,
        int              show,
        gboolean         v_periodic,
        double           v_period,
        double           u,
        double           v,
        double          *out)
{
  double fu, fv, sum = 0, weight = 0;
  long i0, j0;

  fu = (u - m->u[0]) / (m->u[m->nu - 1] - m->u[0]) * (m->nu - 1);
  fu = CLAMP (fu, 0, m->nu - 1);
  i0 = MIN ((long) floor (fu), (long) m->nu - 2);
  if (v_periodic)
    {
      double step = v_period / m->nv;

      fv = (v - m->v[0]) / step;
      fv -= m->nv * floor (fv / m->nv);
      j0 = (long) floor (fv);
    }
  else
    {
      fv = (v - m->v[0]) / (m->v[m->nv - 1] - m->v[0]) * (m->nv - 1);
      fv = CLAMP (fv, 0, m->nv - 1);
      j0 = MIN ((long) floor (fv), (long) m->nv - 2);
    }
  for (int di = 0; di < 2; di++)
    for (int dj = 0; dj < 2; dj++)
      {
        long i = i0 + di, j = (j0 + dj) % (long) m->nv;
        double w = (di ? fu - i0 : 1 - (fu - i0)) * (dj ? fv - j0 : 1 - (fv - j0));
        const df_devmap_point *p = &m->points[j * m->nu + i];

        if (!p->ok || !isfinite (point_value (p, show)))
          continue;
        sum += w * point_value (p, show);
        weight += w;
      }
  if (!(weight > 1e-9))
    return FALSE;
  *out = sum / weight;
  return TRUE;
}

static void
show_legend (DfDevmapWindow *self,
             gboolean        on)
{
  if (self->legend != NULL)
    gtk_widget_set_visible (self->legend, on);
  if (self->view_legend != NULL)
    gtk_widget_set_opacity (self->view_legend, on ? 0 : 1);
  gtk_widget_set_sensitive (self->off, on);
  gtk_widget_set_sensitive (self->png, on);
}

/* Colours the view by the map (the chosen quantity). */
static void
apply_map (DfDevmapWindow *self)
{
  const df_surface *surface = df_document_get_surface (self->document);
  const df_limits *limits = df_document_get_limits (self->document);
  int show = (int) gtk_drop_down_get_selected (GTK_DROP_DOWN (self->show));
  g_autofree double *uv = NULL;
  g_autofree float *values = NULL;
  double range = 0, u0, u1, v0, v1, limit = 0;
  const char *source = NULL;
  gsize n = 0;

  if (self->map == NULL || surface == NULL)
    return;
  for (gsize k = 0; k < self->map->nu * self->map->nv; k++)
    if (self->map->points[k].ok && isfinite (point_value (&self->map->points[k], show)))
      range = fmax (range, fabs (point_value (&self->map->points[k], show)));
  if (!(range > 0))
    range = 1;
  df_surface_get_domain (surface, &u0, &u1, &v0, &v1);
  uv = df_surface_view_get_vertex_uv (self->view, &n);
  if (uv == NULL)
    return;
  values = g_new (float, n);
  for (gsize i = 0; i < n; i++)
    {
      double value = 0;

      /* A vertex with no usable disc near it shows the scale's middle (white). */
      if (!map_at (self->map, show, df_surface_v_periodic (surface), v1 - v0, uv[2 * i],
                   uv[2 * i + 1], &value))
        value = 0;
      values[i] = (float) value;
    }
  if (!df_surface_view_set_field (self->view, values, n, range))
    return;
  if (show == SHOW_STRAIN && limits != NULL && limits->item[DF_LIMIT_MAX_STRAIN].set)
    {
      limit = limits->item[DF_LIMIT_MAX_STRAIN].model_value;
      source = limits->item[DF_LIMIT_MAX_STRAIN].source;
    }
  {
    g_autofree char *a = df_du_format_length (&self->du, self->map->a);
    g_autofree char *title = g_strdup_printf (show == SHOW_STRAIN
                                              ? "Rim strain, flat disc of radius %s "
                                                "(+ shrink)"
                                              : "Enclosed curvature, disc of radius %s",
                                              a);

    df_devmap_legend_set (DF_DEVMAP_LEGEND (self->legend), title,
                          show == SHOW_STRAIN ? "%" : "°", range, limit, source);
  }
  show_legend (self, TRUE);
}

static void
progress_cb (double   fraction,
             gpointer user_data)
{
  DfDevmapWindow *self = user_data;

  gtk_progress_bar_set_fraction (GTK_PROGRESS_BAR (self->progress), fraction);
}

static void
set_busy (DfDevmapWindow *self,
          gboolean        busy)
{
  gtk_widget_set_sensitive (self->compute, !busy);
  gtk_widget_set_sensitive (self->cancel, busy);
  gtk_widget_set_visible (self->progress, busy);
  gtk_widget_set_sensitive (self->csv, !busy && self->map != NULL);
}

static void
map_done_cb (GObject      *source,
             GAsyncResult *result,
             gpointer      user_data)
{
  DfDevmapWindow *self = user_data;   /* a reference */
  g_autoptr(GError) error = NULL;
  df_devmap *map = df_devmap_job_finish (result, &error);

  if (self->document == NULL)   /* disposed meanwhile */
    {
      df_devmap_job_map_free (map);
      g_object_unref (self);
      return;
    }
  set_busy (self, FALSE);
  if (map == NULL)
    set_status (self, g_error_matches (error, G_IO_ERROR, G_IO_ERROR_CANCELLED)
                      ? "Stopped." : error->message,
                !g_error_matches (error, G_IO_ERROR, G_IO_ERROR_CANCELLED));
  else
    {
      g_autofree char *text = NULL;

      df_devmap_job_map_free (self->map);
      self->map = map;
      text = g_strdup_printf ("%zu of %zu discs could be built (the others leave the surface, "
                              "reach a pole or fold; shown white).", map->n_ok,
                              map->nu * map->nv);
      set_status (self, text, FALSE);
      gtk_widget_set_sensitive (self->csv, TRUE);
      apply_map (self);
      if (self->report_events)
        {
          printf ("devmap-done %zu %zu\n", map->n_ok, map->nu * map->nv);
          fflush (stdout);
        }
    }
  g_object_unref (self);
}

static void
compute_cb (GtkButton      *button,
            DfDevmapWindow *self)
{
  const df_surface *surface = df_document_get_surface (self->document);
  const char *text = gtk_editable_get_text (GTK_EDITABLE (self->radius));
  char *end = NULL;
  double a = g_ascii_strtod (text, &end);
  int grid = gtk_spin_button_get_value_as_int (GTK_SPIN_BUTTON (self->grid));

  while (end != NULL && g_ascii_isspace (*end))
    end++;
  if (surface == NULL || end == text || *end != '\0' || !isfinite (a) || !(a > 0))
    {
      g_autofree char *msg = g_strdup_printf ("Patch radius: '%s' is not a positive number "
                                              "(in %s)", text, df_du_length_unit (&self->du));
      set_status (self, msg, TRUE);
      return;
    }
  a = df_du_to_model (&self->du, a);
  if (self->cancellable != NULL)
    g_cancellable_cancel (self->cancellable);
  g_clear_object (&self->cancellable);
  self->cancellable = g_cancellable_new ();
  set_busy (self, TRUE);
  gtk_progress_bar_set_fraction (GTK_PROGRESS_BAR (self->progress), 0);
  set_status (self, "Building a geodesic disc at each grid point…", FALSE);
  df_devmap_job_start (surface, a, grid, grid, self->cancellable, progress_cb, map_done_cb,
                       g_object_ref (self));
}

static void
cancel_cb (GtkButton      *button,
           DfDevmapWindow *self)
{
  if (self->cancellable != NULL)
    g_cancellable_cancel (self->cancellable);
}

static void
off_cb (GtkButton      *button,
        DfDevmapWindow *self)
{
  df_surface_view_clear_field (self->view);
  show_legend (self, FALSE);
}

static void
show_changed_cb (GObject        *object,
                 GParamSpec     *pspec,
                 DfDevmapWindow *self)
{
  if (df_surface_view_has_field (self->view))
    apply_map (self);
}

typedef struct
{
  DfDevmapWindow *self;
  gboolean        png;
} ExportChoice;

static void
export_response_cb (GtkNativeDialog *chooser,
                    int              response,
                    gpointer         user_data)
{
  ExportChoice *choice = user_data;
  DfDevmapWindow *self = choice->self;
  g_autoptr(GFile) file = response == GTK_RESPONSE_ACCEPT
                          ? gtk_file_chooser_get_file (GTK_FILE_CHOOSER (chooser)) : NULL;
  g_autofree char *path = file != NULL ? g_file_get_path (file) : NULL;
  g_autoptr(GError) error = NULL;

  if (path != NULL && self->document != NULL)
    {
      gboolean ok = FALSE;

      if (choice->png)
        ok = df_surface_view_save_png (self->view, path, &error);
      else if (self->map != NULL)
        {
          DfDisplayUnits du;

          /* In the display unit, as `devmap --units`; a surface label that is no known unit
           * is written as it is, unconverted (model and length the same). */
          df_document_get_display_units (self->document, &du);
          ok = df_devmap_csv_write (path, df_document_get_surface (self->document), self->map,
                                    du.units.model, du.units.length, &error);
        }
      if (ok)
        {
          g_autofree char *text = g_strdup_printf ("Written %s.", path);

          set_status (self, text, FALSE);
          if (self->report_events)
            {
              printf ("devmap-exported %s %s\n", choice->png ? "png" : "csv", path);
              fflush (stdout);
            }
        }
      else if (error != NULL)
        set_status (self, error->message, TRUE);
    }
  g_object_unref (self);
  g_free (choice);
  g_object_unref (chooser);
}

static void
export_cb (GtkButton      *button,
           DfDevmapWindow *self)
{
  gboolean png = GTK_WIDGET (button) == self->png;
  GtkFileChooserNative *chooser;
  ExportChoice *choice = g_new0 (ExportChoice, 1);

  chooser = df_export_chooser_new (GTK_WINDOW (self),
                                   png ? "Export Map as PNG" : "Export Map Grid (CSV)",
                                   png ? "PNG image (*.png)" : "CSV (*.csv)",
                                   png ? "*.png" : "*.csv",
                                   png ? "developability-map.png" : "developability-map.csv",
                                   df_document_get_path (self->document));
  choice->self = g_object_ref (self);
  choice->png = png;
  g_signal_connect (chooser, "response", G_CALLBACK (export_response_cb), choice);
  gtk_native_dialog_show (GTK_NATIVE_DIALOG (chooser));
}

/* A new surface makes the map stale; a new mesh of the same surface only needs it spread
 * again. */
static void
surface_changed_cb (DfDocument     *document,
                    DfDevmapWindow *self)
{
  if (self->cancellable != NULL)
    g_cancellable_cancel (self->cancellable);
  g_clear_pointer (&self->map, df_devmap_job_map_free);
  df_surface_view_clear_field (self->view);
  show_legend (self, FALSE);
  gtk_widget_set_sensitive (self->csv, FALSE);
  set_status (self, "The surface changed: compute the map again.", FALSE);
}

/* The radius typed stays the same length, now written in the new unit; a shown map's legend
 * says its radius in it. */
static void
units_changed_cb (DfDocument     *document,
                  DfDevmapWindow *self)
{
  const char *text = gtk_editable_get_text (GTK_EDITABLE (self->radius));
  char *end = NULL;
  double a = g_ascii_strtod (text, &end);
  DfDisplayUnits old = self->du;

  df_document_get_display_units (document, &self->du);
  gtk_label_set_text (GTK_LABEL (self->radius_unit), df_du_length_unit (&self->du));
  if (end != text && *end == '\0' && isfinite (a) && a > 0)
    {
      char buf[G_ASCII_DTOSTR_BUF_SIZE];

      a = df_du_length (&self->du, df_du_to_model (&old, a));
      gtk_editable_set_text (GTK_EDITABLE (self->radius),
                             g_ascii_formatd (buf, sizeof buf, "%.6g", a));
    }
  if (self->map != NULL && gtk_widget_get_visible (self->legend))
    apply_map (self);
}

static void
mesh_ready_cb (DfSurfaceView  *view,
               DfDevmapWindow *self)
{
  if (self->map != NULL && gtk_widget_get_visible (self->legend))
    apply_map (self);
}

/* Choosing a colouring in the view's menu ends the map's. */
static void
view_shading_cb (GObject        *object,
                 GParamSpec     *pspec,
                 DfDevmapWindow *self)
{
  off_cb (NULL, self);
}

static void
df_devmap_window_dispose (GObject *object)
{
  DfDevmapWindow *self = DF_DEVMAP_WINDOW (object);

  if (self->cancellable != NULL)
    g_cancellable_cancel (self->cancellable);
  g_clear_object (&self->cancellable);
  if (self->document != NULL)
    g_signal_handlers_disconnect_by_data (self->document, self);
  if (self->view != NULL)
    {
      g_signal_handlers_disconnect_by_data (self->view, self);
      df_surface_view_clear_field (self->view);
    }
  if (self->legend != NULL)
    {
      /* Held by a reference of ours: the overlay may have gone first (the main window closing). */
      GtkWidget *overlay = gtk_widget_get_parent (self->legend);

      if (GTK_IS_OVERLAY (overlay))
        gtk_overlay_remove_overlay (GTK_OVERLAY (overlay), self->legend);
      g_clear_object (&self->legend);
    }
  if (self->view_legend != NULL)
    gtk_widget_set_opacity (self->view_legend, 1);
  g_clear_object (&self->view_legend);
  g_clear_object (&self->document);
  g_clear_object (&self->view);
  G_OBJECT_CLASS (df_devmap_window_parent_class)->dispose (object);
}

static void
df_devmap_window_finalize (GObject *object)
{
  DfDevmapWindow *self = DF_DEVMAP_WINDOW (object);

  df_devmap_job_map_free (self->map);
  G_OBJECT_CLASS (df_devmap_window_parent_class)->finalize (object);
}

static void
df_devmap_window_class_init (DfDevmapWindowClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);

  object_class->dispose = df_devmap_window_dispose;
  object_class->finalize = df_devmap_window_finalize;
}

static void
df_devmap_window_init (DfDevmapWindow *self)
{
  const char *const shows[] = { "Rim strain of a flat disc, %",
                                "Enclosed curvature of the disc, degrees", NULL };
  GtkWidget *box = gtk_box_new (GTK_ORIENTATION_VERTICAL, 8);
  GtkWidget *grid = gtk_grid_new ();
  GtkWidget *buttons = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 6);
  GtkWidget *exports = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 6);
  GtkWidget *header = gtk_header_bar_new ();

  gtk_window_set_title (GTK_WINDOW (self), "Developability Map");
  gtk_window_set_titlebar (GTK_WINDOW (self), header);
  gtk_window_set_hide_on_close (GTK_WINDOW (self), TRUE);
  gtk_widget_set_margin_top (box, 12);
  gtk_widget_set_margin_bottom (box, 12);
  gtk_widget_set_margin_start (box, 12);
  gtk_widget_set_margin_end (box, 12);
  gtk_box_append (GTK_BOX (box),
                  df_label_wrapped ("Colours the surface by what a flat patch of radius a "
                                    "suffers there: the geodesic disc's enclosed curvature, or "
                                    "the strain its rim must take for a flat disc to lie on it "
                                    "(about K a² / 6 when a is small). The discs are built "
                                    "point by point; this takes a while.", NULL, 56));
  self->radius = gtk_entry_new ();
  gtk_editable_set_width_chars (GTK_EDITABLE (self->radius), 10);
  gtk_entry_set_activates_default (GTK_ENTRY (self->radius), TRUE);
  self->show = gtk_drop_down_new_from_strings (shows);
  self->grid = gtk_spin_button_new_with_range (4, 120, 1);
  gtk_spin_button_set_value (GTK_SPIN_BUTTON (self->grid), 24);
  gtk_grid_set_row_spacing (GTK_GRID (grid), 6);
  gtk_grid_set_column_spacing (GTK_GRID (grid), 8);
  gtk_grid_attach (GTK_GRID (grid), df_label_field ("Patch _radius a", self->radius), 0, 0, 1, 1);
  gtk_grid_attach (GTK_GRID (grid), self->radius, 1, 0, 1, 1);
  self->radius_unit = gtk_label_new (NULL);
  gtk_label_set_xalign (GTK_LABEL (self->radius_unit), 0);
  gtk_grid_attach (GTK_GRID (grid), self->radius_unit, 2, 0, 1, 1);
  gtk_grid_attach (GTK_GRID (grid), df_label_field ("S_how", self->show), 0, 1, 1, 1);
  gtk_grid_attach (GTK_GRID (grid), self->show, 1, 1, 2, 1);
  gtk_grid_attach (GTK_GRID (grid), df_label_field ("_Grid points a side", self->grid), 0, 2, 1, 1);
  gtk_grid_attach (GTK_GRID (grid), self->grid, 1, 2, 1, 1);
  gtk_box_append (GTK_BOX (box), grid);
  self->compute = gtk_button_new_with_mnemonic ("_Compute");
  gtk_widget_add_css_class (self->compute, "suggested-action");
  self->cancel = gtk_button_new_with_mnemonic ("_Stop");
  self->off = gtk_button_new_with_mnemonic ("_Back to the curvature colouring");
  gtk_box_append (GTK_BOX (buttons), self->compute);
  gtk_box_append (GTK_BOX (buttons), self->cancel);
  gtk_box_append (GTK_BOX (buttons), self->off);
  gtk_box_append (GTK_BOX (box), buttons);
  self->progress = gtk_progress_bar_new ();
  gtk_box_append (GTK_BOX (box), self->progress);
  self->status = df_label_wrapped ("", NULL, 56);
  gtk_label_set_selectable (GTK_LABEL (self->status), TRUE);
  gtk_box_append (GTK_BOX (box), self->status);
  self->png = gtk_button_new_with_mnemonic ("Export _PNG…");
  gtk_widget_set_tooltip_text (self->png, "The view as it shows the map");
  self->csv = gtk_button_new_with_mnemonic ("Export the grid as CS_V…");
  gtk_widget_set_tooltip_text (self->csv, "Every grid point's disc: enclosed curvature, strain, "
                               "circumference, area");
  gtk_box_append (GTK_BOX (exports), self->png);
  gtk_box_append (GTK_BOX (exports), self->csv);
  gtk_box_append (GTK_BOX (box), exports);
  gtk_box_append (GTK_BOX (box), df_label_wrapped (DF_DECIDE_CAUTION, "df-caution", 56));
  gtk_window_set_child (GTK_WINDOW (self), box);
  gtk_window_set_default_widget (GTK_WINDOW (self), self->compute);

  g_signal_connect (self->compute, "clicked", G_CALLBACK (compute_cb), self);
  g_signal_connect (self->cancel, "clicked", G_CALLBACK (cancel_cb), self);
  g_signal_connect (self->off, "clicked", G_CALLBACK (off_cb), self);
  g_signal_connect (self->png, "clicked", G_CALLBACK (export_cb), self);
  g_signal_connect (self->csv, "clicked", G_CALLBACK (export_cb), self);
  g_signal_connect (self->show, "notify::selected", G_CALLBACK (show_changed_cb), self);
  set_busy (self, FALSE);
  gtk_widget_set_sensitive (self->off, FALSE);
  gtk_widget_set_sensitive (self->png, FALSE);
}

GtkWidget *
df_devmap_window_new (GtkWindow     *parent,
                      DfDocument    *document,
                      DfSurfaceView *view,
                      GtkWidget     *view_legend,
                      gboolean       report_events)
{
  DfDevmapWindow *self;
  const df_limits *limits = df_document_get_limits (document);
  const df_surface *surface = df_document_get_surface (document);
  GtkWidget *overlay = view_legend != NULL ? gtk_widget_get_parent (view_legend) : NULL;
  char buf[G_ASCII_DTOSTR_BUF_SIZE];
  double a = 0;

  g_return_val_if_fail (DF_IS_DOCUMENT (document), NULL);
  self = g_object_new (DF_TYPE_DEVMAP_WINDOW, "transient-for", parent,
                       "destroy-with-parent", TRUE, NULL);
  self->document = g_object_ref (document);
  self->view = g_object_ref (view);
  self->view_legend = view_legend != NULL ? g_object_ref (view_legend) : NULL;
  self->report_events = report_events;
  /* The user's patch size when set; else a twentieth of the surface's size, a start only. */
  if (limits != NULL && limits->patch_size.set)
    a = limits->patch_size.model_value;
  else if (surface != NULL)
    {
      double size = df_surface_size (surface);

      a = size > 0 ? pow (10, floor (log10 (size / 20))) : 1;
    }
  df_document_get_display_units (document, &self->du);
  gtk_label_set_text (GTK_LABEL (self->radius_unit), df_du_length_unit (&self->du));
  gtk_editable_set_text (GTK_EDITABLE (self->radius),
                         g_ascii_formatd (buf, sizeof buf, "%.6g",
                                          df_du_length (&self->du, a > 0 ? a : 1)));
  self->legend = g_object_ref_sink (df_devmap_legend_new ());
  gtk_widget_set_halign (self->legend, GTK_ALIGN_END);
  gtk_widget_set_valign (self->legend, GTK_ALIGN_END);
  gtk_widget_set_margin_end (self->legend, 12);
  gtk_widget_set_margin_bottom (self->legend, 12);
  gtk_widget_set_visible (self->legend, FALSE);
  if (GTK_IS_OVERLAY (overlay))
    gtk_overlay_add_overlay (GTK_OVERLAY (overlay), self->legend);
  g_signal_connect (document, "surface-changed", G_CALLBACK (surface_changed_cb), self);
  g_signal_connect (document, "units-changed", G_CALLBACK (units_changed_cb), self);
  g_signal_connect (view, "mesh-ready", G_CALLBACK (mesh_ready_cb), self);
  g_signal_connect (view, "notify::shading", G_CALLBACK (view_shading_cb), self);
  return GTK_WIDGET (self);
}
