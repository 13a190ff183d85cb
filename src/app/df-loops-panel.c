/* df-loops-panel.c: the loops list and the selected loop's readout (see df-loops-panel.h).
 * Numbers come from the loop's df_loop_result; here they are only formatted with units. */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "df-document-units.h"
#include "df-format.h"
#include "df-loop-row.h"
#include "df-loops-panel.h"
#include "df-verdict-details.h"

struct _DfLoopsPanel
{
  GtkWidget parent_instance;

  /* template children */
  GtkLabel    *live_label;
  GtkLabel    *empty_label;
  GtkListBox  *list_box;
  GtkEditableLabel *details_title;
  GtkWidget   *colour_button;  /* the selected loop's colour, changeable (built in code) */
  GtkWidget   *rename_button;  /* a visible cue that the name is editable */
  GtkGrid     *details_grid;
  GtkLabel    *holonomy_value;
  GtkLabel    *enclosed_value;
  GtkLabel    *residual_value;
  GtkLabel    *area_value;
  GtkLabel    *length_value;
  GtkLabel    *kg_value;
  GtkLabel    *steering_value;
  GtkLabel    *winding_value;
  GtkLabel    *mean_k_value;   /* built in code, after the area: K in the curvature unit */
  GtkLabel    *note_label;
  GtkLabel    *error_label;

  /* owned */
  DfDocument *document;
  GtkWidget  *verdict_details;   /* child of the details box, after the notes */
  gboolean    syncing_colour;    /* the colour button set from the item, not by the user */
  gboolean    report_events;     /* print "loop-shown" lines (--report-events) */
};

G_DEFINE_FINAL_TYPE (DfLoopsPanel, df_loops_panel, GTK_TYPE_WIDGET)

enum
{
  SELECTION_CHANGED,
  N_SIGNALS
};

static guint signals[N_SIGNALS];

static void
set_value (GtkLabel   *label,
           char       *text)  /* taken */
{
  gtk_label_set_text (label, text);
  g_free (text);
}

static void
show_text (GtkLabel   *label,
           const char *text)
{
  gtk_label_set_text (label, text != NULL ? text : "");
  gtk_widget_set_visible (GTK_WIDGET (label), text != NULL && text[0] != '\0');
}

static void
clear_values (DfLoopsPanel *self,
              const char   *placeholder)
{
  GtkLabel *labels[] = { self->holonomy_value, self->enclosed_value, self->residual_value,
                         self->area_value, self->length_value, self->kg_value,
                         self->steering_value, self->winding_value, self->mean_k_value };

  for (guint i = 0; i < G_N_ELEMENTS (labels); i++)
    gtk_label_set_text (labels[i], placeholder);
}

static void
update_details (DfLoopsPanel *self)
{
  DfLoopItem *item = df_loops_panel_get_selected (self);
  DfDisplayUnits du;
  const df_loop_result *r;
  g_autoptr(GString) notes = g_string_new (NULL);

  if (self->document != NULL)
    df_document_get_display_units (self->document, &du);
  else
    df_du_identity (&du, NULL);
  show_text (self->error_label, NULL);
  df_verdict_details_set_item (DF_VERDICT_DETAILS (self->verdict_details), self->document, item);
  gtk_widget_set_sensitive (GTK_WIDGET (self->details_title), item != NULL);
  gtk_widget_set_visible (self->colour_button, item != NULL);
  gtk_widget_set_visible (self->rename_button, item != NULL);
  if (item != NULL)
    {
      GdkRGBA rgba;

      df_loop_item_get_rgba (item, &rgba);
      self->syncing_colour = TRUE;
      gtk_color_chooser_set_rgba (GTK_COLOR_CHOOSER (self->colour_button), &rgba);
      self->syncing_colour = FALSE;
    }
  if (item == NULL)
    {
      gtk_editable_set_text (GTK_EDITABLE (self->details_title), "No loop selected");
      clear_values (self, "\u2014");
      show_text (self->note_label, NULL);
      return;
    }
  if (!gtk_editable_label_get_editing (self->details_title))
    gtk_editable_set_text (GTK_EDITABLE (self->details_title), df_loop_item_get_name (item));

  switch (df_loop_item_get_state (item))
    {
    case DF_LOOP_PENDING:
      clear_values (self, "measuring…");
      show_text (self->note_label, NULL);
      return;
    case DF_LOOP_FAILED:
      {
        g_autofree char *message = g_strdup_printf ("This loop could not be measured: %s",
                                                    df_loop_item_get_error (item));
        clear_values (self, "\u2014");
        show_text (self->error_label, message);
        show_text (self->note_label, NULL);
      }
      return;
    case DF_LOOP_MEASURED:
    default:
      break;
    }

  r = df_loop_item_get_result (item);
  gtk_label_set_text (self->mean_k_value, "\u2014");  /* set below where the disc has one */
  {
    g_autofree char *angle = df_format_angle (r->holonomy_rad);
    const char *sense = r->holonomy_rad > 0 ? ", counter-clockwise about N"
                        : r->holonomy_rad < 0 ? ", clockwise about N" : "";
    set_value (self->holonomy_value, g_strdup_printf ("%s%s", angle, sense));
  }
  if (r->bounds_disc && !r->enclosed_available)
    {
      gtk_label_set_text (self->enclosed_value, "not computed (see the note)");
      gtk_label_set_text (self->residual_value, "\u2014");
      gtk_label_set_text (self->area_value, "\u2014");
    }
  else if (r->bounds_disc)
    {
      set_value (self->enclosed_value, df_format_angle (r->enclosed_curvature_rad));
      set_value (self->residual_value, df_format_angle (r->residual_rad));
      set_value (self->area_value, df_du_format_area (&du, r->area));
      if (r->has_mean_K)
        set_value (self->mean_k_value, df_du_format_gaussian (&du, r->mean_K));
      if (r->concentrated_rad != 0.0)
        {
          g_autofree char *apex = df_format_angle (r->concentrated_rad);
          g_string_append_printf (notes, "The enclosed curvature includes %s concentrated at "
                                  "a cone apex. ", apex);
        }
      if (!r->disc_on_left)
        g_string_append (notes, "The disc lies to the right of the direction of travel, so "
                                "the enclosed curvature is counted negative. ");
      if (r->has_other_disc)
        {
          /* On a closed surface the loop also bounds the cap on its other side; a designer
           * who drew a small loop round a pole usually means that one. */
          g_autofree char *other = df_format_angle (r->other_enclosed_curvature_rad);
          g_autofree char *other_area = df_du_format_area (&du, r->other_area);

          g_string_append_printf (notes, "The cap on the other side of the loop: enclosed "
                                  "curvature %s, area %s. ", other, other_area);
        }
    }
  else
    {
      /* The core's note says why (crossing itself, round the axis or the tube); the table
       * and the note then tell one story. */
      gtk_label_set_text (self->enclosed_value, r->simple ? "none: bounds no disc"
                                                          : "none: the loop crosses itself");
      gtk_label_set_text (self->residual_value, "\u2014");
      gtk_label_set_text (self->area_value, "\u2014");
      if (r->disc_note[0] == '\0')
        g_string_append (notes, "This loop bounds no disc on the surface, so there is no "
                                "enclosed curvature to compare with; the holonomy is still "
                                "defined. ");
    }
  if (r->disc_note[0] != '\0')
    {
      gsize len = strlen (r->disc_note);

      g_string_append_c (notes, g_ascii_toupper (r->disc_note[0]));
      g_string_append (notes, r->disc_note + 1);
      g_string_append (notes, r->disc_note[len - 1] == '.' ? " " : ". ");
    }
  if (r->enclosed_note[0] != '\0')
    {
      g_string_append_c (notes, g_ascii_toupper (r->enclosed_note[0]));
      g_string_append (notes, r->enclosed_note + 1);
      g_string_append (notes, ". ");
    }
  /* Set by the Sketch tool (df-window-tools.c): which fairing the stroke got. */
  if (g_object_get_data (G_OBJECT (item), "df-fairing") != NULL)
    g_string_append_printf (notes, "%s ",
                            (const char *) g_object_get_data (G_OBJECT (item), "df-fairing"));
  set_value (self->length_value, df_du_format_length (&du, r->length));
  set_value (self->kg_value, df_format_angle (r->total_geodesic_curvature_rad));
  if (r->has_steering_radius)
    set_value (self->steering_value, df_du_format_length (&du, r->min_steering_radius));
  else
    gtk_label_set_text (self->steering_value, "none: the loop is a geodesic (k_g = 0)");
  set_value (self->winding_value, g_strdup_printf ("%d", r->axis_winding));
  show_text (self->note_label, g_strstrip (notes->str));
  if (self->report_events)
    {
      /* The numbers the labels above were made from, in full, for test drivers. */
      g_autofree char *name = g_strdelimit (g_strdup (df_loop_item_get_name (item)), " ", '_');

      printf ("loop-shown %s %s %.17g %.17g %.17g %s %.17g\n", name, df_du_length_unit (&du),
              df_du_length (&du, r->length),
              r->bounds_disc && r->enclosed_available ? df_du_area (&du, r->area) : NAN,
              r->has_steering_radius ? df_du_length (&du, r->min_steering_radius) : NAN,
              df_du_curvature_unit (&du), r->has_mean_K ? df_du_gaussian (&du, r->mean_K) : NAN);
      fflush (stdout);
    }
}

static void
update_empty (DfLoopsPanel *self)
{
  guint n = 0;

  if (self->document != NULL)
    n = g_list_model_get_n_items (df_document_get_loops (self->document));
  gtk_widget_set_visible (GTK_WIDGET (self->empty_label), n == 0);
  gtk_widget_set_visible (gtk_widget_get_parent (GTK_WIDGET (self->list_box)), n > 0);
}

/* Renames go through the document, so that they can be undone. */
static void
title_editing_cb (GtkEditableLabel *label,
                  GParamSpec       *pspec,
                  DfLoopsPanel     *self)
{
  DfLoopItem *item = df_loops_panel_get_selected (self);
  g_autofree char *name = NULL;

  if (gtk_editable_label_get_editing (label) || item == NULL || self->document == NULL)
    return;
  name = g_strstrip (g_strdup (gtk_editable_get_text (GTK_EDITABLE (label))));
  if (name[0] == '\0')
    {
      /* An empty name is refused: put the old one back. */
      gtk_editable_set_text (GTK_EDITABLE (label), df_loop_item_get_name (item));
      return;
    }
  df_document_rename_loop (self->document, item, name);
}

static void
colour_set_cb (GtkColorButton *button,
               DfLoopsPanel   *self)
{
  DfLoopItem *item = df_loops_panel_get_selected (self);
  GdkRGBA rgba;
  g_autofree char *hex = NULL;

  if (item == NULL || self->document == NULL || self->syncing_colour)
    return;
  gtk_color_chooser_get_rgba (GTK_COLOR_CHOOSER (button), &rgba);
  hex = g_strdup_printf ("#%02x%02x%02x", (int) lround (CLAMP (rgba.red, 0, 1) * 255),
                         (int) lround (CLAMP (rgba.green, 0, 1) * 255),
                         (int) lround (CLAMP (rgba.blue, 0, 1) * 255));
  df_document_set_loop_colour (self->document, item, hex);
}

void
df_loops_panel_start_rename (DfLoopsPanel *self)
{
  g_return_if_fail (DF_IS_LOOPS_PANEL (self));

  if (df_loops_panel_get_selected (self) == NULL)
    return;
  gtk_editable_label_start_editing (self->details_title);
  gtk_widget_grab_focus (GTK_WIDGET (self->details_title));
}

static void
rename_clicked_cb (GtkButton    *button,
                   DfLoopsPanel *self)
{
  df_loops_panel_start_rename (self);
}

/* The heading row: colour button, the editable name, a pencil that starts renaming. The
 * template has the name alone; the row is put round it here. */
static void
build_heading (DfLoopsPanel *self)
{
  GtkWidget *title = GTK_WIDGET (self->details_title);
  GtkWidget *parent = gtk_widget_get_parent (title);
  GtkWidget *row = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 6);
  GdkRGBA black = { 0, 0, 0, 1 };

  self->colour_button = gtk_color_button_new_with_rgba (&black);
  gtk_color_chooser_set_use_alpha (GTK_COLOR_CHOOSER (self->colour_button), FALSE);
  gtk_color_button_set_title (GTK_COLOR_BUTTON (self->colour_button), "Loop Colour");
  gtk_widget_set_tooltip_text (self->colour_button, "Colour of the selected loop");
  gtk_widget_set_valign (self->colour_button, GTK_ALIGN_CENTER);
  self->rename_button = gtk_button_new_from_icon_name ("document-edit-symbolic");
  gtk_widget_add_css_class (self->rename_button, "flat");
  gtk_widget_set_valign (self->rename_button, GTK_ALIGN_CENTER);
  gtk_widget_set_tooltip_text (self->rename_button, "Rename the selected loop (F2)");
  gtk_accessible_update_property (GTK_ACCESSIBLE (self->rename_button),
                                  GTK_ACCESSIBLE_PROPERTY_LABEL, "Rename loop", -1);
  gtk_widget_set_margin_top (row, gtk_widget_get_margin_top (title));
  gtk_widget_set_margin_top (title, 0);
  gtk_widget_set_hexpand (title, TRUE);
  gtk_widget_set_valign (title, GTK_ALIGN_CENTER);
  gtk_widget_insert_after (row, parent, title);
  g_object_ref (title);
  gtk_box_remove (GTK_BOX (parent), title);
  gtk_box_append (GTK_BOX (row), self->colour_button);
  gtk_box_append (GTK_BOX (row), title);
  gtk_box_append (GTK_BOX (row), self->rename_button);
  g_object_unref (title);
  g_signal_connect (self->colour_button, "color-set", G_CALLBACK (colour_set_cb), self);
  g_signal_connect (self->rename_button, "clicked", G_CALLBACK (rename_clicked_cb), self);
}

static GtkWidget *
create_row (gpointer item,
            gpointer user_data)
{
  return df_loop_row_new (DF_LOOP_ITEM (item));
}

static void
row_selected_cb (GtkListBox    *box,
                 GtkListBoxRow *row,
                 DfLoopsPanel  *self)
{
  update_details (self);
  g_signal_emit (self, signals[SELECTION_CHANGED], 0);
}

static void
loop_changed_cb (DfDocument   *document,
                 DfLoopItem   *item,
                 DfLoopsPanel *self)
{
  if (item == df_loops_panel_get_selected (self))
    update_details (self);
}

static void
items_changed_cb (GListModel   *model,
                  guint         position,
                  guint         removed,
                  guint         added,
                  DfLoopsPanel *self)
{
  update_empty (self);
  update_details (self);
}

static void
df_loops_panel_dispose (GObject *object)
{
  GtkWidget *child;
  DfLoopsPanel *self = DF_LOOPS_PANEL (object);

  df_loops_panel_set_document (self, NULL);
  gtk_widget_dispose_template (GTK_WIDGET (self), DF_TYPE_LOOPS_PANEL);
  /* The template's unnamed top box is not a bound child: unparent whatever is left. */
  while ((child = gtk_widget_get_first_child (GTK_WIDGET (self))) != NULL)
    gtk_widget_unparent (child);
  G_OBJECT_CLASS (df_loops_panel_parent_class)->dispose (object);
}

static void
df_loops_panel_class_init (DfLoopsPanelClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->dispose = df_loops_panel_dispose;

  signals[SELECTION_CHANGED] =
    g_signal_new ("selection-changed", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0,
                  NULL, NULL, NULL, G_TYPE_NONE, 0);

  g_type_ensure (DF_TYPE_LOOP_ROW);
  gtk_widget_class_set_template_from_resource (widget_class,
                                               "/org/driftframe/Driftframe/ui/df-loops-panel.ui");
  gtk_widget_class_bind_template_child (widget_class, DfLoopsPanel, live_label);
  gtk_widget_class_bind_template_child (widget_class, DfLoopsPanel, empty_label);
  gtk_widget_class_bind_template_child (widget_class, DfLoopsPanel, list_box);
  gtk_widget_class_bind_template_child (widget_class, DfLoopsPanel, details_title);
  gtk_widget_class_bind_template_child (widget_class, DfLoopsPanel, details_grid);
  gtk_widget_class_bind_template_child (widget_class, DfLoopsPanel, holonomy_value);
  gtk_widget_class_bind_template_child (widget_class, DfLoopsPanel, enclosed_value);
  gtk_widget_class_bind_template_child (widget_class, DfLoopsPanel, residual_value);
  gtk_widget_class_bind_template_child (widget_class, DfLoopsPanel, area_value);
  gtk_widget_class_bind_template_child (widget_class, DfLoopsPanel, length_value);
  gtk_widget_class_bind_template_child (widget_class, DfLoopsPanel, kg_value);
  gtk_widget_class_bind_template_child (widget_class, DfLoopsPanel, steering_value);
  gtk_widget_class_bind_template_child (widget_class, DfLoopsPanel, winding_value);
  gtk_widget_class_bind_template_child (widget_class, DfLoopsPanel, note_label);
  gtk_widget_class_bind_template_child (widget_class, DfLoopsPanel, error_label);
  gtk_widget_class_set_layout_manager_type (widget_class, GTK_TYPE_BIN_LAYOUT);
  gtk_widget_class_set_css_name (widget_class, "dfloopspanel");
}

static void
df_loops_panel_init (DfLoopsPanel *self)
{
  gtk_widget_init_template (GTK_WIDGET (self));
  {
    /* Below the area (row 3 of the template's grid): the disc's mean Gaussian curvature, the
     * enclosed curvature over the area, in the chosen curvature unit. */
    const char *tip = "The enclosed curvature divided by the disc's area: its mean Gaussian "
                      "curvature K";
    GtkWidget *name = gtk_label_new ("Mean K over the disc");
    GtkWidget *value = gtk_label_new ("\u2014");

    gtk_label_set_xalign (GTK_LABEL (name), 0);
    gtk_widget_set_tooltip_text (name, tip);
    gtk_label_set_xalign (GTK_LABEL (value), 0);
    gtk_label_set_selectable (GTK_LABEL (value), TRUE);
    gtk_label_set_wrap (GTK_LABEL (value), TRUE);
    gtk_widget_set_focusable (value, FALSE);
    gtk_widget_set_hexpand (value, TRUE);
    gtk_widget_set_tooltip_text (value, tip);
    gtk_widget_add_css_class (value, "numeric");
    gtk_accessible_update_property (GTK_ACCESSIBLE (value), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                    "Mean K over the disc", -1);
    gtk_grid_insert_row (self->details_grid, 4);
    gtk_grid_attach (self->details_grid, name, 0, 4, 1, 1);
    gtk_grid_attach (self->details_grid, value, 1, 4, 1, 1);
    self->mean_k_value = GTK_LABEL (value);
  }
  self->verdict_details = df_verdict_details_new ();
  gtk_widget_insert_after (self->verdict_details,
                           gtk_widget_get_parent (GTK_WIDGET (self->error_label)),
                           GTK_WIDGET (self->error_label));
  g_signal_connect (self->list_box, "row-selected", G_CALLBACK (row_selected_cb), self);
  g_signal_connect (self->details_title, "notify::editing", G_CALLBACK (title_editing_cb), self);
  build_heading (self);
  update_empty (self);
  update_details (self);
}

GtkWidget *
df_loops_panel_new (void)
{
  return g_object_new (DF_TYPE_LOOPS_PANEL, NULL);
}

void
df_loops_panel_set_document (DfLoopsPanel *self,
                             DfDocument   *document)
{
  g_return_if_fail (DF_IS_LOOPS_PANEL (self));

  if (self->document == document)
    return;
  if (self->document != NULL)
    {
      g_signal_handlers_disconnect_by_data (self->document, self);
      g_signal_handlers_disconnect_by_data (df_document_get_loops (self->document), self);
      gtk_list_box_bind_model (self->list_box, NULL, NULL, NULL, NULL);
    }
  g_set_object (&self->document, document);
  if (document != NULL)
    {
      gtk_list_box_bind_model (self->list_box, df_document_get_loops (document), create_row,
                               self, NULL);
      g_signal_connect (document, "loop-changed", G_CALLBACK (loop_changed_cb), self);
      g_signal_connect_swapped (document, "units-changed", G_CALLBACK (update_details), self);
      g_signal_connect (df_document_get_loops (document), "items-changed",
                        G_CALLBACK (items_changed_cb), self);
    }
  update_empty (self);
  update_details (self);
}

DfLoopItem *
df_loops_panel_get_selected (DfLoopsPanel *self)
{
  GtkListBoxRow *row;
  GtkWidget *child;

  g_return_val_if_fail (DF_IS_LOOPS_PANEL (self), NULL);

  row = gtk_list_box_get_selected_row (self->list_box);
  if (row == NULL)
    return NULL;
  child = gtk_list_box_row_get_child (row);
  return DF_IS_LOOP_ROW (child) ? df_loop_row_get_item (DF_LOOP_ROW (child)) : NULL;
}

void
df_loops_panel_select (DfLoopsPanel *self,
                       DfLoopItem   *item)
{
  guint position;

  g_return_if_fail (DF_IS_LOOPS_PANEL (self));

  if (item == NULL || self->document == NULL
      || !g_list_store_find (G_LIST_STORE (df_document_get_loops (self->document)), item,
                             &position))
    {
      gtk_list_box_unselect_all (self->list_box);
      return;
    }
  gtk_list_box_select_row (self->list_box,
                           gtk_list_box_get_row_at_index (self->list_box, (int) position));
}

void
df_loops_panel_set_live_text (DfLoopsPanel *self,
                              const char   *text)
{
  g_return_if_fail (DF_IS_LOOPS_PANEL (self));
  show_text (self->live_label, text);
}

void
df_loops_panel_set_report_events (DfLoopsPanel *self,
                                  gboolean      report)
{
  g_return_if_fail (DF_IS_LOOPS_PANEL (self));
  self->report_events = report;
}
