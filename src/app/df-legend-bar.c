/* df-legend-bar.c: DfLegendBar draws, with GtkSnapshot, the quantity and unit on one line, the
 * colour ramp (df_shading_ramp_colour, the same stops the surface shader uses) as a gradient bar,
 * and the end values and zero under it. */
#include "df-format.h"
#include "df-legend-bar.h"

#include <math.h>
#include <stdlib.h>

#define BAR_HEIGHT 12
#define GAP 3

enum
{
  PROP_0,
  PROP_UNITS,
  N_PROPS
};

static GParamSpec *properties[N_PROPS];

struct _DfLegendBar
{
  GtkWidget parent_instance;

  /* owned */
  char          *units;
  DfDisplayUnits du;            /* what the end values and the title are shown in */
  /* borrowed (weak pointer) */
  DfSurfaceView *view;
  /* state */
  DfShading      shading;
  double         lo, hi;
  gboolean       below, above;  /* values lie beyond lo, hi (drawn in the end colours) */
};

G_DEFINE_FINAL_TYPE (DfLegendBar, df_legend_bar, GTK_TYPE_WIDGET)

/* The app's one number format (df-format.c): "−3.960×10⁻⁵" and "0.01234" alike. */
static char *
format_value (double value)
{
  if (value == 0 || !isfinite (value))
    return g_strdup ("0");
  return df_format_number (value);
}

static char *
title_text (DfLegendBar *self)
{
  switch (self->shading)
    {
    case DF_SHADING_GAUSSIAN:
      return g_strdup_printf ("Gaussian curvature K (1/%s\u00b2)",
                              df_du_curvature_unit (&self->du));
    case DF_SHADING_MEAN:
      return g_strdup_printf ("Mean curvature H (1/%s)", df_du_curvature_unit (&self->du));
    case DF_SHADING_PLAIN:
    default:
      return g_strdup ("Plain shading: no curvature scale");
    }
}

static PangoLayout *
make_layout (DfLegendBar *self,
             const char  *text)
{
  return gtk_widget_create_pango_layout (GTK_WIDGET (self), text);
}

static void
df_legend_bar_measure (GtkWidget      *widget,
                       GtkOrientation  orientation,
                       int             for_size,
                       int            *minimum,
                       int            *natural,
                       int            *minimum_baseline,
                       int            *natural_baseline)
{
  DfLegendBar *self = DF_LEGEND_BAR (widget);
  g_autofree char *title = title_text (self);
  g_autoptr (PangoLayout) layout = make_layout (self, title);
  int w, h;

  pango_layout_get_pixel_size (layout, &w, &h);
  if (orientation == GTK_ORIENTATION_HORIZONTAL)
    {
      *minimum = MAX (w, 160);
      *natural = MAX (w, 260);
    }
  else
    {
      *minimum = *natural = self->shading == DF_SHADING_PLAIN ? h : 2 * h + BAR_HEIGHT + 2 * GAP;
    }
}

static void
append_text (GtkSnapshot   *snapshot,
             PangoLayout   *layout,
             float          x,
             float          y,
             const GdkRGBA *colour)
{
  gtk_snapshot_save (snapshot);
  gtk_snapshot_translate (snapshot, &GRAPHENE_POINT_INIT (x, y));
  gtk_snapshot_append_layout (snapshot, layout, colour);
  gtk_snapshot_restore (snapshot);
}

static void
df_legend_bar_snapshot (GtkWidget   *widget,
                        GtkSnapshot *snapshot)
{
  DfLegendBar *self = DF_LEGEND_BAR (widget);
  int width = gtk_widget_get_width (widget);
  g_autofree char *title = title_text (self);
  g_autoptr (PangoLayout) title_layout = make_layout (self, title);
  GskColorStop stops[2 * DF_SHADING_RAMP_STOPS - 1];
  GdkRGBA fg, frame;
  int tw, th;
  float bar_y;

  gtk_style_context_get_color (gtk_widget_get_style_context (widget), &fg);
  pango_layout_get_pixel_size (title_layout, &tw, &th);
  append_text (snapshot, title_layout, 0, 0, &fg);
  if (self->shading == DF_SHADING_PLAIN)
    return;

  /* Nine stops reproduce the five-stop piecewise-linear ramp exactly at its knots and closely
   * between them. */
  for (int i = 0; i < (int) G_N_ELEMENTS (stops); i++)
    {
      /* A one-signed span (df-surface-view-mesh.c) is drawn on one arm of the ramp. */
      double s_lo = self->lo > 0 ? 0 : -1, s_hi = self->hi < 0 ? 0 : 1;

      stops[i].offset = (float) i / (G_N_ELEMENTS (stops) - 1);
      df_shading_ramp_colour (s_lo + (s_hi - s_lo) * stops[i].offset, &stops[i].color);
    }
  bar_y = th + GAP;
  gtk_snapshot_append_linear_gradient (snapshot,
                                       &GRAPHENE_RECT_INIT (0, bar_y, width, BAR_HEIGHT),
                                       &GRAPHENE_POINT_INIT (0, bar_y),
                                       &GRAPHENE_POINT_INIT (width, bar_y),
                                       stops, G_N_ELEMENTS (stops));
  frame = fg;
  frame.alpha *= 0.35f;
  {
    GskRoundedRect outline;
    float widths[4] = { 1, 1, 1, 1 };
    GdkRGBA colours[4] = { frame, frame, frame, frame };
    gsk_rounded_rect_init_from_rect (&outline, &GRAPHENE_RECT_INIT (0, bar_y, width, BAR_HEIGHT),
                                     0);
    gtk_snapshot_append_border (snapshot, &outline, widths, colours);
  }

  {
    /* The view's range is in the surface's units; shown in the display units. */
    double shown_lo = self->shading == DF_SHADING_GAUSSIAN ? df_du_gaussian (&self->du, self->lo)
                                                           : df_du_per_curvature (&self->du, self->lo);
    double shown_hi = self->shading == DF_SHADING_GAUSSIAN ? df_du_gaussian (&self->du, self->hi)
                                                           : df_du_per_curvature (&self->du, self->hi);
    g_autofree char *lo_value = self->lo == 0 ? g_strdup ("0")
                                : df_format_number_as (shown_lo, shown_hi);
    g_autofree char *hi_value = self->hi == 0 ? g_strdup ("0")
                                : df_format_number_as (shown_hi, shown_lo);
    g_autofree char *lo = g_strconcat (self->below ? "\u2264 " : "", lo_value, NULL);
    g_autofree char *hi = g_strconcat (self->above ? "\u2265 " : "", hi_value, NULL);
    g_autoptr (PangoLayout) lo_layout = make_layout (self, lo);
    g_autoptr (PangoLayout) zero_layout = make_layout (self, "0");
    g_autoptr (PangoLayout) hi_layout = make_layout (self, hi);
    float label_y = bar_y + BAR_HEIGHT + GAP;
    int w, h;

    /* A flat or developable shape has a zero range: "0 ... 0" at both ends reads like a
     * broken scale, so say it once. */
    if (self->lo == 0 && self->hi == 0)
      {
        g_autoptr (PangoLayout) flat_layout = make_layout (self, "0 everywhere");

        pango_layout_get_pixel_size (flat_layout, &w, &h);
        append_text (snapshot, flat_layout, 0.5f * (width - w), label_y, &fg);
        return;
      }
    append_text (snapshot, lo_layout, 0, label_y, &fg);
    pango_layout_get_pixel_size (zero_layout, &w, &h);
    if (self->hi > 0 && self->lo < 0)
      append_text (snapshot, zero_layout, 0.5f * (width - w), label_y, &fg);
    pango_layout_get_pixel_size (hi_layout, &w, &h);
    append_text (snapshot, hi_layout, width - w, label_y, &fg);
  }
}

static void
view_range_changed_cb (DfSurfaceView *view,
                       double         lo,
                       double         hi,
                       DfLegendBar   *self)
{
  df_legend_bar_set_range (self, df_surface_view_get_shading (view), lo, hi);
  df_surface_view_get_shading_clipped (view, &self->below, &self->above);
}

static void
df_legend_bar_dispose (GObject *object)
{
  DfLegendBar *self = DF_LEGEND_BAR (object);

  df_legend_bar_set_view (self, NULL);
  G_OBJECT_CLASS (df_legend_bar_parent_class)->dispose (object);
}

static void
df_legend_bar_finalize (GObject *object)
{
  DfLegendBar *self = DF_LEGEND_BAR (object);

  g_clear_pointer (&self->units, g_free);
  G_OBJECT_CLASS (df_legend_bar_parent_class)->finalize (object);
}

static void
df_legend_bar_get_property (GObject    *object,
                            guint       prop_id,
                            GValue     *value,
                            GParamSpec *pspec)
{
  DfLegendBar *self = DF_LEGEND_BAR (object);

  switch (prop_id)
    {
    case PROP_UNITS:
      g_value_set_string (value, df_legend_bar_get_units (self));
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
    }
}

static void
df_legend_bar_set_property (GObject      *object,
                            guint         prop_id,
                            const GValue *value,
                            GParamSpec   *pspec)
{
  DfLegendBar *self = DF_LEGEND_BAR (object);

  switch (prop_id)
    {
    case PROP_UNITS:
      df_legend_bar_set_units (self, g_value_get_string (value));
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
    }
}

static void
df_legend_bar_class_init (DfLegendBarClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->dispose = df_legend_bar_dispose;
  object_class->finalize = df_legend_bar_finalize;
  object_class->get_property = df_legend_bar_get_property;
  object_class->set_property = df_legend_bar_set_property;
  widget_class->measure = df_legend_bar_measure;
  widget_class->snapshot = df_legend_bar_snapshot;

  properties[PROP_UNITS] =
    g_param_spec_string ("units", NULL, NULL, "mm",
                         G_PARAM_READWRITE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  g_object_class_install_properties (object_class, N_PROPS, properties);

  gtk_widget_class_set_css_name (widget_class, "legendbar");
  gtk_widget_class_set_accessible_role (widget_class, GTK_ACCESSIBLE_ROLE_IMG);
}

static void
df_legend_bar_init (DfLegendBar *self)
{
  self->units = g_strdup ("mm");
  df_du_identity (&self->du, "mm");
  self->shading = DF_SHADING_GAUSSIAN;
}

GtkWidget *
df_legend_bar_new (void)
{
  return g_object_new (DF_TYPE_LEGEND_BAR, NULL);
}

void
df_legend_bar_set_view (DfLegendBar   *self,
                        DfSurfaceView *view)
{
  g_return_if_fail (DF_IS_LEGEND_BAR (self));
  g_return_if_fail (view == NULL || DF_IS_SURFACE_VIEW (view));

  if (self->view == view)
    return;
  if (self->view != NULL)
    g_signal_handlers_disconnect_by_func (self->view, view_range_changed_cb, self);
  g_set_weak_pointer (&self->view, view);
  if (view != NULL)
    {
      double lo, hi;
      g_signal_connect (view, "shading-range-changed", G_CALLBACK (view_range_changed_cb), self);
      df_surface_view_get_shading_range (view, &lo, &hi);
      df_legend_bar_set_range (self, df_surface_view_get_shading (view), lo, hi);
      df_surface_view_get_shading_clipped (view, &self->below, &self->above);
    }
}

void
df_legend_bar_set_units (DfLegendBar *self,
                         const char  *units)
{
  g_return_if_fail (DF_IS_LEGEND_BAR (self));

  if (units == NULL || units[0] == '\0')
    units = "mm";
  if (g_strcmp0 (self->units, units) != 0)
    {
      g_free (self->units);
      self->units = g_strdup (units);
      df_du_identity (&self->du, units);
      g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_UNITS]);
      gtk_widget_queue_resize (GTK_WIDGET (self));
    }
}

void
df_legend_bar_set_display_units (DfLegendBar          *self,
                                 const DfDisplayUnits *du)
{
  g_return_if_fail (DF_IS_LEGEND_BAR (self));

  df_legend_bar_set_units (self, du->label);
  self->du = *du;
  gtk_widget_queue_resize (GTK_WIDGET (self));
}

const char *
df_legend_bar_get_units (DfLegendBar *self)
{
  g_return_val_if_fail (DF_IS_LEGEND_BAR (self), NULL);
  return self->units;
}

void
df_legend_bar_set_range (DfLegendBar *self,
                         DfShading    shading,
                         double       lo,
                         double       hi)
{
  g_return_if_fail (DF_IS_LEGEND_BAR (self));

  if (self->shading != shading)
    gtk_widget_queue_resize (GTK_WIDGET (self));
  self->shading = shading;
  self->below = self->above = FALSE;
  self->lo = isfinite (lo) ? lo : 0;
  self->hi = isfinite (hi) ? hi : 0;
  {
    g_autofree char *title = title_text (self);
    g_autofree char *lo_text = format_value (self->lo);
    g_autofree char *hi_text = format_value (self->hi);
    g_autofree char *description = g_strdup_printf ("%s from %s to %s", title, lo_text, hi_text);
    gtk_accessible_update_property (GTK_ACCESSIBLE (self), GTK_ACCESSIBLE_PROPERTY_DESCRIPTION,
                                    description, -1);
  }
  gtk_widget_queue_draw (GTK_WIDGET (self));
}
