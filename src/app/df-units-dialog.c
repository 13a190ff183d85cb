/* df-units-dialog.c: the Display Units window (see df-units-dialog.h). It only chooses: the
 * edit is df_document_set_display_units, and it follows the document when an undo or a surface
 * change moves the units under it. */
#include "df-units-dialog.h"

#include "df-document-units.h"
#include "df-labels.h"

typedef struct
{
  DfDocument *document;
  GtkWidget  *length;     /* GtkDropDown over mm, cm, m, in (the df_unit order) */
  GtkWidget  *curvature;
  GtkWidget  *note;
  gboolean    syncing;    /* the drop-downs set from the document, not by the user */
} UnitsDialog;

static void
units_dialog_free (gpointer data)
{
  UnitsDialog *d = data;

  g_signal_handlers_disconnect_by_data (d->document, d);
  g_object_unref (d->document);
  g_free (d);
}

static void
sync_from_document (UnitsDialog *d)
{
  DfDisplayUnits du;
  g_autofree char *why = NULL;

  df_document_get_display_units (d->document, &du);
  d->syncing = TRUE;
  /* Nothing chosen when nothing can be: the surface's label is none of the four. */
  gtk_drop_down_set_selected (GTK_DROP_DOWN (d->length),
                              du.known ? du.units.length : GTK_INVALID_LIST_POSITION);
  gtk_drop_down_set_selected (GTK_DROP_DOWN (d->curvature),
                              du.known ? du.units.curvature : GTK_INVALID_LIST_POSITION);
  d->syncing = FALSE;
  if (!du.known)
    why = g_strdup_printf ("The surface's units are “%s”, not mm, cm, m or in: its values "
                           "cannot be converted and show as the surface gives them. Set the "
                           "units in the Surface panel to choose display units.", du.label);
  gtk_widget_set_sensitive (d->length, du.known);
  gtk_widget_set_sensitive (d->curvature, du.known);
  gtk_widget_set_tooltip_text (d->length, why);
  gtk_widget_set_tooltip_text (d->curvature, why);
  {
    g_autofree char *text = du.known
      ? g_strdup_printf ("The surface is defined in %s; values are converted for display and "
                         "export only. Chart coordinates and the probe's tensors stay in the "
                         "chart's own units; angles have no units.", du.label)
      : g_strdup (why);

    gtk_label_set_text (GTK_LABEL (d->note), text);
  }
}

static void
selected_cb (GObject    *drop_down,
             GParamSpec *pspec,
             gpointer    user_data)
{
  UnitsDialog *d = user_data;
  g_autoptr(GError) error = NULL;
  guint length = gtk_drop_down_get_selected (GTK_DROP_DOWN (d->length));
  guint curvature = gtk_drop_down_get_selected (GTK_DROP_DOWN (d->curvature));

  if (d->syncing || length >= DF_N_UNITS || curvature >= DF_N_UNITS)
    return;
  /* Lengths chosen: K follows them unless the user picked its unit apart before. */
  if (drop_down == G_OBJECT (d->length))
    {
      DfDisplayUnits du;

      df_document_get_display_units (d->document, &du);
      if (du.units.curvature == du.units.length)
        curvature = length;
    }
  if (!df_document_set_display_units (d->document, (df_unit) length, (df_unit) curvature,
                                      &error))
    gtk_label_set_text (GTK_LABEL (d->note), error->message);
  sync_from_document (d);
}

static GtkWidget *
unit_drop_down (gboolean squared)
{
  const char *names[DF_N_UNITS + 1];
  char buf[DF_N_UNITS][16];

  for (int i = 0; i < DF_N_UNITS; i++)
    {
      g_snprintf (buf[i], sizeof buf[i], squared ? "1/%s²" : "%s",
                  df_unit_name ((df_unit) i));
      names[i] = buf[i];
    }
  names[DF_N_UNITS] = NULL;
  return gtk_drop_down_new_from_strings (names);
}

static void
window_destroy_cb (GtkWidget *window,
                   gpointer   parent)
{
  g_object_set_data (G_OBJECT (parent), "df-units-dialog", NULL);
}

void
df_units_dialog_present (GtkWindow  *parent,
                         DfDocument *document)
{
  GtkWidget *window, *grid;
  UnitsDialog *d;

  g_return_if_fail (DF_IS_DOCUMENT (document));
  window = g_object_get_data (G_OBJECT (parent), "df-units-dialog");
  if (window != NULL)
    {
      gtk_window_present (GTK_WINDOW (window));
      return;
    }
  d = g_new0 (UnitsDialog, 1);
  d->document = g_object_ref (document);
  window = gtk_window_new ();
  gtk_window_set_title (GTK_WINDOW (window), "Display Units");
  gtk_window_set_transient_for (GTK_WINDOW (window), parent);
  gtk_window_set_destroy_with_parent (GTK_WINDOW (window), TRUE);
  gtk_window_set_resizable (GTK_WINDOW (window), FALSE);
  /* Its own title bar with a close button, like the app's other tool windows. */
  gtk_window_set_titlebar (GTK_WINDOW (window), gtk_header_bar_new ());
  g_object_set_data_full (G_OBJECT (window), "df-dialog", d, units_dialog_free);
  g_object_set_data (G_OBJECT (parent), "df-units-dialog", window);
  g_signal_connect (window, "destroy", G_CALLBACK (window_destroy_cb), parent);
  {
    GtkEventController *keys = gtk_shortcut_controller_new ();

    gtk_shortcut_controller_add_shortcut (GTK_SHORTCUT_CONTROLLER (keys),
                                          gtk_shortcut_new (gtk_keyval_trigger_new (GDK_KEY_Escape, 0),
                                                            gtk_named_action_new ("window.close")));
    gtk_widget_add_controller (window, keys);
  }

  grid = gtk_grid_new ();
  gtk_grid_set_row_spacing (GTK_GRID (grid), 8);
  gtk_grid_set_column_spacing (GTK_GRID (grid), 12);
  gtk_widget_set_margin_top (grid, 16);
  gtk_widget_set_margin_bottom (grid, 16);
  gtk_widget_set_margin_start (grid, 16);
  gtk_widget_set_margin_end (grid, 16);
  d->length = unit_drop_down (FALSE);
  d->curvature = unit_drop_down (TRUE);
  d->note = df_label_wrapped ("", "dim-label", 44);
  gtk_grid_attach (GTK_GRID (grid), df_label_field ("_Lengths, positions, areas", d->length),
                   0, 0, 1, 1);
  gtk_grid_attach (GTK_GRID (grid), d->length, 1, 0, 1, 1);
  gtk_grid_attach (GTK_GRID (grid), df_label_field ("_Gaussian curvature K", d->curvature),
                   0, 1, 1, 1);
  gtk_grid_attach (GTK_GRID (grid), d->curvature, 1, 1, 1, 1);
  gtk_grid_attach (GTK_GRID (grid),
                   df_label_wrapped ("Saved with the project (its [units] group, read by the "
                                     "command-line tool too); Ctrl+Z undoes a change. H, k1 and k2 "
                                     "are per the curvature unit (K = k1 k2 as shown); a curve's "
                                     "k_g is per length unit.",
                                     NULL, 44), 0, 2, 2, 1);
  gtk_grid_attach (GTK_GRID (grid), d->note, 0, 3, 2, 1);
  gtk_window_set_child (GTK_WINDOW (window), grid);
  sync_from_document (d);
  g_signal_connect (d->length, "notify::selected", G_CALLBACK (selected_cb), d);
  g_signal_connect (d->curvature, "notify::selected", G_CALLBACK (selected_cb), d);
  g_signal_connect_swapped (document, "units-changed", G_CALLBACK (sync_from_document), d);
  gtk_window_present (GTK_WINDOW (window));
}
