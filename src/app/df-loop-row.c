/* df-loop-row.c: a row of the loops list (see df-loop-row.h). It observes its DfLoopItem and
 * shows its colour, name and summary. */
#include "df-loop-row.h"
#include "df-verdict-badge.h"

struct _DfLoopRow
{
  GtkWidget parent_instance;

  /* template children */
  GtkDrawingArea   *swatch;
  GtkLabel         *name_label;
  GtkLabel         *summary_label;

  /* owned */
  DfLoopItem *item;
};

G_DEFINE_FINAL_TYPE (DfLoopRow, df_loop_row, GTK_TYPE_WIDGET)

static void
draw_swatch (GtkDrawingArea *area,
             cairo_t        *cr,
             int             width,
             int             height,
             gpointer        user_data)
{
  DfLoopRow *self = user_data;
  GdkRGBA rgba;

  df_loop_item_get_rgba (self->item, &rgba);
  cairo_arc (cr, width / 2.0, height / 2.0, MIN (width, height) / 2.0 - 0.5, 0, 2 * G_PI);
  gdk_cairo_set_source_rgba (cr, &rgba);
  cairo_fill_preserve (cr);
  /* A light ring inside a dark one: the dot stays apart from a selected row's blue as well as
   * from the plain background. */
  cairo_set_source_rgba (cr, 0, 0, 0, 0.55);
  cairo_set_line_width (cr, 1.0);
  cairo_stroke (cr);
  cairo_arc (cr, width / 2.0, height / 2.0, MIN (width, height) / 2.0 - 1.75, 0, 2 * G_PI);
  cairo_set_source_rgba (cr, 1, 1, 1, 0.9);
  cairo_set_line_width (cr, 1.5);
  cairo_stroke (cr);
}

static void
sync_from_item (DfLoopRow *self)
{
  g_autofree char *accessible = NULL;

  gtk_label_set_text (self->name_label, df_loop_item_get_name (self->item));
  gtk_label_set_text (self->summary_label, df_loop_item_get_summary (self->item));
  accessible = g_strdup_printf ("%s, colour %s", df_loop_item_get_name (self->item),
                                df_loop_item_get_colour (self->item));
  gtk_accessible_update_property (GTK_ACCESSIBLE (self->swatch), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                  accessible, -1);
}

static void
item_notify_cb (DfLoopItem *item,
                GParamSpec *pspec,
                DfLoopRow  *self)
{
  sync_from_item (self);
}

static void
df_loop_row_dispose (GObject *object)
{
  GtkWidget *child;
  DfLoopRow *self = DF_LOOP_ROW (object);

  if (self->item != NULL)
    g_signal_handlers_disconnect_by_data (self->item, self);
  g_clear_object (&self->item);
  gtk_widget_dispose_template (GTK_WIDGET (self), DF_TYPE_LOOP_ROW);
  /* The template's unnamed top box is not a bound child: unparent whatever is left. */
  while ((child = gtk_widget_get_first_child (GTK_WIDGET (self))) != NULL)
    gtk_widget_unparent (child);
  G_OBJECT_CLASS (df_loop_row_parent_class)->dispose (object);
}

static void
df_loop_row_class_init (DfLoopRowClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->dispose = df_loop_row_dispose;

  gtk_widget_class_set_template_from_resource (widget_class,
                                               "/org/driftframe/Driftframe/ui/df-loop-row.ui");
  gtk_widget_class_bind_template_child (widget_class, DfLoopRow, swatch);
  gtk_widget_class_bind_template_child (widget_class, DfLoopRow, name_label);
  gtk_widget_class_bind_template_child (widget_class, DfLoopRow, summary_label);
  gtk_widget_class_set_layout_manager_type (widget_class, GTK_TYPE_BIN_LAYOUT);
  gtk_widget_class_set_css_name (widget_class, "dflooprow");
}

static void
df_loop_row_init (DfLoopRow *self)
{
  gtk_widget_init_template (GTK_WIDGET (self));
  gtk_drawing_area_set_draw_func (self->swatch, draw_swatch, self, NULL);
}

GtkWidget *
df_loop_row_new (DfLoopItem *item)
{
  DfLoopRow *self;

  g_return_val_if_fail (DF_IS_LOOP_ITEM (item), NULL);

  self = g_object_new (DF_TYPE_LOOP_ROW, NULL);
  self->item = g_object_ref (item);
  g_signal_connect (item, "notify::name", G_CALLBACK (item_notify_cb), self);
  g_signal_connect (item, "notify::summary", G_CALLBACK (item_notify_cb), self);
  g_signal_connect_swapped (item, "notify::colour", G_CALLBACK (gtk_widget_queue_draw),
                            self->swatch);
  /* Under the summary: the loop against the user's limits. */
  gtk_box_append (GTK_BOX (gtk_widget_get_parent (GTK_WIDGET (self->summary_label))),
                  df_verdict_badge_new (item));
  sync_from_item (self);
  return GTK_WIDGET (self);
}

DfLoopItem *
df_loop_row_get_item (DfLoopRow *self)
{
  g_return_val_if_fail (DF_IS_LOOP_ROW (self), NULL);
  return self->item;
}
