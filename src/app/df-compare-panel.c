/* df-compare-panel.c: the Two paths tool's readout (see df-compare-panel.h). */
#include <math.h>

#include "df-compare-panel.h"
#include "df-curve-verdicts.h"
#include "df-format.h"

struct _DfComparePanel
{
  GtkWidget parent_instance;

  /* template children */
  GtkLabel *hint_label;
  GtkLabel *a_value;
  GtkLabel *b_value;
  GtkLabel *angle_value;
  GtkLabel *note_label;
  GtkLabel *error_label;
  GtkLabel *verdict_label;  /* made in init, below the note: the curve against the limits */
};

G_DEFINE_FINAL_TYPE (DfComparePanel, df_compare_panel, GTK_TYPE_WIDGET)

static void
show_text (GtkLabel   *label,
           const char *text)
{
  gtk_label_set_text (label, text != NULL ? text : "");
  gtk_widget_set_visible (GTK_WIDGET (label), text != NULL && text[0] != '\0');
}

static void
df_compare_panel_dispose (GObject *object)
{
  GtkWidget *child;

  gtk_widget_dispose_template (GTK_WIDGET (object), DF_TYPE_COMPARE_PANEL);
  /* The template's unnamed top box is not a bound child: unparent whatever is left. */
  while ((child = gtk_widget_get_first_child (GTK_WIDGET (object))) != NULL)
    gtk_widget_unparent (child);
  G_OBJECT_CLASS (df_compare_panel_parent_class)->dispose (object);
}

static void
df_compare_panel_class_init (DfComparePanelClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->dispose = df_compare_panel_dispose;
  gtk_widget_class_set_template_from_resource (widget_class,
                                               "/org/driftframe/Driftframe/ui/df-compare-panel.ui");
  gtk_widget_class_bind_template_child (widget_class, DfComparePanel, hint_label);
  gtk_widget_class_bind_template_child (widget_class, DfComparePanel, a_value);
  gtk_widget_class_bind_template_child (widget_class, DfComparePanel, b_value);
  gtk_widget_class_bind_template_child (widget_class, DfComparePanel, angle_value);
  gtk_widget_class_bind_template_child (widget_class, DfComparePanel, note_label);
  gtk_widget_class_bind_template_child (widget_class, DfComparePanel, error_label);
  gtk_widget_class_set_layout_manager_type (widget_class, GTK_TYPE_BIN_LAYOUT);
  gtk_widget_class_set_css_name (widget_class, "dfcomparepanel");
}

static void
df_compare_panel_init (DfComparePanel *self)
{
  gtk_widget_init_template (GTK_WIDGET (self));
  /* Not in the template: the verdicts came later, and the panel's layout stays as it was. */
  self->verdict_label = df_curve_verdicts_label_after (GTK_WIDGET (self->note_label));
}

GtkWidget *
df_compare_panel_new (void)
{
  return g_object_new (DF_TYPE_COMPARE_PANEL, NULL);
}

void
df_compare_panel_set_hint (DfComparePanel *self,
                           const char     *hint)
{
  g_return_if_fail (DF_IS_COMPARE_PANEL (self));
  gtk_label_set_text (self->hint_label, hint);
}

static char *
describe_path (gsize n)
{
  if (n == 0)
    return g_strdup ("not sketched");
  return g_strdup_printf ("%" G_GSIZE_FORMAT " points", n);
}

void
df_compare_panel_set_paths (DfComparePanel *self,
                            gsize           n_a,
                            gsize           n_b)
{
  g_autofree char *a = describe_path (n_a);
  g_autofree char *b = describe_path (n_b);

  g_return_if_fail (DF_IS_COMPARE_PANEL (self));
  gtk_label_set_text (self->a_value, a);
  gtk_label_set_text (self->b_value, b);
  show_text (self->error_label, NULL);
}

void
df_compare_panel_set_angle (DfComparePanel *self,
                            double          angle_rad)
{
  g_return_if_fail (DF_IS_COMPARE_PANEL (self));

  if (isnan (angle_rad))
    {
      gtk_label_set_text (self->angle_value, "\u2014");
      show_text (self->note_label, NULL);
      return;
    }
  {
    g_autofree char *angle = df_format_angle (angle_rad);
    /* The sign alone does not say which way: name the sense, as the loops panel does. */
    const char *sense = angle_rad > 0 ? ", counter-clockwise about N (from A's to B's)"
                        : angle_rad < 0 ? ", clockwise about N (from A's to B's)" : "";
    g_autofree char *text = g_strdup_printf ("%s%s", angle, sense);
    gtk_label_set_text (self->angle_value, text);
  }
  show_text (self->note_label,
             "Arrows at the end point: the direction carried along A (in A's colour) and along "
             "B (in B's colour). Both started as path A's tangent.");
}

void
df_compare_panel_show_error (DfComparePanel *self,
                             const char     *message)
{
  g_return_if_fail (DF_IS_COMPARE_PANEL (self));
  show_text (self->error_label, message);
}

void
df_compare_panel_set_lengths (DfComparePanel *self,
                              double          length_a,
                              double          length_b,
                              const DfDisplayUnits *du)
{
  g_autofree char *a = df_du_format_length (du, length_a);
  g_autofree char *b = df_du_format_length (du, length_b);

  g_return_if_fail (DF_IS_COMPARE_PANEL (self));
  gtk_label_set_text (self->a_value, a);
  gtk_label_set_text (self->b_value, b);
}

void
df_compare_panel_show_verdicts (DfComparePanel *self, const char *text)
{
  g_return_if_fail (DF_IS_COMPARE_PANEL (self));
  if (self->verdict_label != NULL)
    show_text (self->verdict_label, text);
}
