/* df-geodesic-panel.c: the Geodesic tool's readout (see df-geodesic-panel.h). */
#include "df-curve-verdicts.h"
#include "df-format.h"
#include "df-geodesic-panel.h"

struct _DfGeodesicPanel
{
  GtkWidget parent_instance;

  /* template children */
  GtkLabel *hint_label;
  GtkLabel *start_value;
  GtkLabel *heading_value;
  GtkLabel *requested_value;
  GtkLabel *reached_value;
  GtkLabel *end_value;
  GtkLabel *note_label;
  GtkLabel *error_label;
  GtkLabel *verdict_label;  /* made in init, below the note: the curve against the limits */
  GtkEntry *start_entry;
  GtkEntry *heading_entry;
  GtkEntry *length_entry;
  GtkLabel *length_label;   /* "Length (mm)": the unit a typed length is read in */
  GtkLabel *reference_label;
};

enum
{
  SHOOT_REQUESTED,
  N_SIGNALS
};

static guint signals[N_SIGNALS];

static void
shoot_activate_cb (DfGeodesicPanel *self)
{
  g_signal_emit (self, signals[SHOOT_REQUESTED], 0,
                 gtk_editable_get_text (GTK_EDITABLE (self->start_entry)),
                 gtk_editable_get_text (GTK_EDITABLE (self->heading_entry)),
                 gtk_editable_get_text (GTK_EDITABLE (self->length_entry)));
}

G_DEFINE_FINAL_TYPE (DfGeodesicPanel, df_geodesic_panel, GTK_TYPE_WIDGET)

static void
show_text (GtkLabel   *label,
           const char *text)
{
  gtk_label_set_text (label, text != NULL ? text : "");
  gtk_widget_set_visible (GTK_WIDGET (label), text != NULL && text[0] != '\0');
}

static char *
describe_point (const df_surface         *surface,
                const df_geodesic_sample *sample,
                const DfDisplayUnits     *du)
{
  /* The chart point as the surface defines it; the point in space in the display units. */
  const char *units = df_du_length_unit (du);
  g_autofree char *x = df_format_number (df_du_length (du, sample->point[0]));
  g_autofree char *y = df_format_number (df_du_length (du, sample->point[1]));
  g_autofree char *z = df_format_number (df_du_length (du, sample->point[2]));

  {
    g_autofree char *chart = df_du_format_chart_point (du, df_surface_get_kind (surface)
                                                          == DF_SURFACE_REVOLUTION,
                                                      sample->u, sample->v);

    return g_strdup_printf ("%s\n(%s, %s, %s) %s", chart, x, y, z, units);
  }
}

static void
df_geodesic_panel_dispose (GObject *object)
{
  GtkWidget *child;

  gtk_widget_dispose_template (GTK_WIDGET (object), DF_TYPE_GEODESIC_PANEL);
  /* The template's unnamed top box is not a bound child: unparent whatever is left. */
  while ((child = gtk_widget_get_first_child (GTK_WIDGET (object))) != NULL)
    gtk_widget_unparent (child);
  G_OBJECT_CLASS (df_geodesic_panel_parent_class)->dispose (object);
}

static void
df_geodesic_panel_class_init (DfGeodesicPanelClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->dispose = df_geodesic_panel_dispose;
  gtk_widget_class_set_template_from_resource (
    widget_class, "/org/driftframe/Driftframe/ui/df-geodesic-panel.ui");
  gtk_widget_class_bind_template_child (widget_class, DfGeodesicPanel, hint_label);
  gtk_widget_class_bind_template_child (widget_class, DfGeodesicPanel, start_value);
  gtk_widget_class_bind_template_child (widget_class, DfGeodesicPanel, heading_value);
  gtk_widget_class_bind_template_child (widget_class, DfGeodesicPanel, requested_value);
  gtk_widget_class_bind_template_child (widget_class, DfGeodesicPanel, reached_value);
  gtk_widget_class_bind_template_child (widget_class, DfGeodesicPanel, end_value);
  gtk_widget_class_bind_template_child (widget_class, DfGeodesicPanel, note_label);
  gtk_widget_class_bind_template_child (widget_class, DfGeodesicPanel, error_label);
  gtk_widget_class_bind_template_child (widget_class, DfGeodesicPanel, start_entry);
  gtk_widget_class_bind_template_child (widget_class, DfGeodesicPanel, heading_entry);
  gtk_widget_class_bind_template_child (widget_class, DfGeodesicPanel, length_entry);
  gtk_widget_class_bind_template_child (widget_class, DfGeodesicPanel, length_label);
  gtk_widget_class_bind_template_child (widget_class, DfGeodesicPanel, reference_label);
  gtk_widget_class_bind_template_callback (widget_class, shoot_activate_cb);

  /* The typed start, heading and length (the entries' texts) were confirmed. */
  signals[SHOOT_REQUESTED] =
    g_signal_new ("shoot-requested", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0, NULL,
                  NULL, NULL, G_TYPE_NONE, 3, G_TYPE_STRING, G_TYPE_STRING, G_TYPE_STRING);
  gtk_widget_class_set_layout_manager_type (widget_class, GTK_TYPE_BIN_LAYOUT);
  gtk_widget_class_set_css_name (widget_class, "dfgeodesicpanel");
}

static void
df_geodesic_panel_init (DfGeodesicPanel *self)
{
  gtk_widget_init_template (GTK_WIDGET (self));
  /* Not in the template: the verdicts came later, and the panel's layout stays as it was. */
  self->verdict_label = df_curve_verdicts_label_after (GTK_WIDGET (self->note_label));
}

GtkWidget *
df_geodesic_panel_new (void)
{
  return g_object_new (DF_TYPE_GEODESIC_PANEL, NULL);
}

void
df_geodesic_panel_show (DfGeodesicPanel          *self,
                        const df_surface         *surface,
                        double                    heading_rad,
                        double                    requested,
                        const df_geodesic_result *result,
                        const DfDisplayUnits     *du)
{
  g_autofree char *start = NULL;
  g_autofree char *end = NULL;
  g_autofree char *heading = NULL;
  g_autofree char *asked = NULL;
  g_autofree char *reached = NULL;

  g_return_if_fail (DF_IS_GEODESIC_PANEL (self));
  g_return_if_fail (result != NULL && result->n_samples >= 1);

  start = describe_point (surface, &result->samples[0], du);
  end = describe_point (surface, &result->samples[result->n_samples - 1], du);
  heading = df_format_angle (heading_rad);
  asked = df_du_format_length (du, requested);
  reached = df_du_format_length (du, result->length);
  gtk_label_set_text (self->start_value, start);
  gtk_label_set_text (self->heading_value, heading);
  gtk_label_set_text (self->requested_value, asked);
  gtk_label_set_text (self->reached_value, reached);
  gtk_label_set_text (self->end_value, end);
  show_text (self->error_label, NULL);
  if (result->stopped_early)
    {
      g_autofree char *note = g_strdup_printf ("Stopped early: %s.", result->stop_reason);
      show_text (self->note_label, note);
    }
  else
    show_text (self->note_label, NULL);
}

void
df_geodesic_panel_show_error (DfGeodesicPanel *self,
                              const char      *message)
{
  g_return_if_fail (DF_IS_GEODESIC_PANEL (self));
  show_text (self->error_label, message);
}

void
df_geodesic_panel_clear (DfGeodesicPanel *self)
{
  GtkLabel *values[] = { self->start_value, self->heading_value, self->requested_value,
                         self->reached_value, self->end_value };

  g_return_if_fail (DF_IS_GEODESIC_PANEL (self));

  for (guint i = 0; i < G_N_ELEMENTS (values); i++)
    gtk_label_set_text (values[i], "\u2014");
  show_text (self->note_label, NULL);
  show_text (self->error_label, NULL);
  if (self->verdict_label != NULL)
    show_text (self->verdict_label, NULL);
}

void
df_geodesic_panel_set_chart (DfGeodesicPanel *self,
                             const char      *start_hint,
                             const char      *reference,
                             const char      *units)
{
  g_return_if_fail (DF_IS_GEODESIC_PANEL (self));

  gtk_entry_set_placeholder_text (self->start_entry, start_hint);
  gtk_label_set_text (self->reference_label, reference);
  g_autofree char *label = g_strdup_printf ("_Length (%s)", units);
  g_autofree char *tip = g_strdup_printf ("Length of the geodesic in %s (the display unit); a "
                                          "point in space in From is in %s too", units, units);

  gtk_entry_set_placeholder_text (self->length_entry, units);
  gtk_widget_set_tooltip_text (GTK_WIDGET (self->length_entry), tip);
  gtk_label_set_text_with_mnemonic (self->length_label, label);
}

void
df_geodesic_panel_focus_entry (DfGeodesicPanel *self)
{
  g_return_if_fail (DF_IS_GEODESIC_PANEL (self));
  gtk_widget_grab_focus (GTK_WIDGET (self->start_entry));
}

void
df_geodesic_panel_show_verdicts (DfGeodesicPanel *self, const char *text)
{
  g_return_if_fail (DF_IS_GEODESIC_PANEL (self));
  if (self->verdict_label != NULL)
    show_text (self->verdict_label, text);
}
