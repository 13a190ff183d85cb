/* df-devmap-legend.c: the developability map's legend over the view (see df-devmap-legend.h):
 * the view's diverging scale with its ends and middle labelled and, for the strain, the user's
 * limit ticked at plus and minus (the limit applies to the size of the strain). */
#include "df-devmap-legend.h"

#include <math.h>
#include <pango/pangocairo.h>

#include "df-format.h"
#include "df-surface-view.h"

struct _DfDevmapLegend
{
  GtkDrawingArea parent_instance;

  char   *title;
  char   *units;
  double  range;
  double  limit;   /* <= 0: none */
  char   *limit_source;
};

G_DEFINE_FINAL_TYPE (DfDevmapLegend, df_devmap_legend, GTK_TYPE_DRAWING_AREA)

/* Draws text (one or more lines) at (x, y), aligned by align of its width; returns its height
 * in pixels. */
static int
text_at (cairo_t    *cr,
         double      x,
         double      y,
         const char *text,
         double      align)
{
  PangoLayout *layout = pango_cairo_create_layout (cr);
  PangoFontDescription *font = pango_font_description_from_string ("Sans 8.5");
  int w, h;

  pango_layout_set_font_description (layout, font);
  pango_font_description_free (font);
  pango_layout_set_text (layout, text, -1);
  pango_layout_get_pixel_size (layout, &w, &h);
  cairo_move_to (cr, x - align * w, y);
  pango_cairo_show_layout (cr, layout);
  g_object_unref (layout);
  return h;
}

static void
draw_cb (GtkDrawingArea *area,
         cairo_t        *cr,
         int             width,
         int             height,
         gpointer        user_data)
{
  DfDevmapLegend *self = DF_DEVMAP_LEGEND (area);
  double x0 = 10, x1 = width - 10, bar_y, bar_h = 14;
  cairo_pattern_t *grad;
  g_autofree char *hi = NULL, *lo = NULL;

  if (!(self->range > 0))
    return;
  cairo_set_source_rgba (cr, 1, 1, 1, 0.88);
  cairo_rectangle (cr, 0, 0, width, height);
  cairo_fill (cr);
  cairo_set_source_rgb (cr, 0.1, 0.1, 0.1);
  /* The bar goes below the title, however many lines it has. */
  bar_y = 4 + text_at (cr, x0, 4, self->title != NULL ? self->title : "", 0) + 6;

  grad = cairo_pattern_create_linear (x0, 0, x1, 0);
  for (int i = 0; i <= 8; i++)
    {
      GdkRGBA c;
      double s = -1 + i / 4.0;

      df_shading_ramp_colour (s, &c);
      cairo_pattern_add_color_stop_rgb (grad, i / 8.0, c.red, c.green, c.blue);
    }
  cairo_set_source (cr, grad);
  cairo_rectangle (cr, x0, bar_y, x1 - x0, bar_h);
  cairo_fill (cr);
  cairo_pattern_destroy (grad);
  cairo_set_source_rgba (cr, 0, 0, 0, 0.5);
  cairo_set_line_width (cr, 1);
  cairo_rectangle (cr, x0 + 0.5, bar_y + 0.5, x1 - x0 - 1, bar_h - 1);
  cairo_stroke (cr);

  {
    g_autofree char *n = df_format_number (self->range);

    hi = g_strdup_printf ("%s %s", n, self->units);
    lo = g_strdup_printf ("−%s %s", n, self->units);
  }
  cairo_set_source_rgb (cr, 0.1, 0.1, 0.1);
  text_at (cr, x0, bar_y + bar_h + 2, lo, 0);
  text_at (cr, (x0 + x1) / 2, bar_y + bar_h + 2, "0", 0.5);
  text_at (cr, x1, bar_y + bar_h + 2, hi, 1);

  if (self->limit > 0)
    {
      g_autofree char *l = df_format_number (self->limit);
      g_autofree char *text = NULL;

      if (self->limit <= self->range)
        {
          /* Ticks through the bar at +/- the limit, drawn black over white so they read over
           * any colour. */
          for (int sgn = -1; sgn <= 1; sgn += 2)
            {
              double x = (x0 + x1) / 2 + sgn * (x1 - x0) / 2 * self->limit / self->range;

              cairo_set_source_rgb (cr, 1, 1, 1);
              cairo_set_line_width (cr, 4);
              cairo_move_to (cr, x, bar_y - 4);
              cairo_line_to (cr, x, bar_y + bar_h + 4);
              cairo_stroke (cr);
              cairo_set_source_rgb (cr, 0, 0, 0);
              cairo_set_line_width (cr, 2);
              cairo_move_to (cr, x, bar_y - 4);
              cairo_line_to (cr, x, bar_y + bar_h + 4);
              cairo_stroke (cr);
            }
          text = g_strdup_printf ("▮ your limit ±%s %s\nsource: %s", l, self->units,
                                  self->limit_source != NULL ? self->limit_source
                                                             : "none given");
        }
      else
        text = g_strdup_printf ("Your limit ±%s %s is off the scale: all within it\n"
                                "source: %s", l, self->units,
                                self->limit_source != NULL ? self->limit_source
                                                           : "none given");
      cairo_set_source_rgb (cr, 0.1, 0.1, 0.1);
      text_at (cr, x0, bar_y + bar_h + 18, text, 0);
    }
}

static void
df_devmap_legend_finalize (GObject *object)
{
  DfDevmapLegend *self = DF_DEVMAP_LEGEND (object);

  g_free (self->title);
  g_free (self->units);
  g_free (self->limit_source);
  G_OBJECT_CLASS (df_devmap_legend_parent_class)->finalize (object);
}

static void
df_devmap_legend_class_init (DfDevmapLegendClass *klass)
{
  G_OBJECT_CLASS (klass)->finalize = df_devmap_legend_finalize;
}

static void
df_devmap_legend_init (DfDevmapLegend *self)
{
  gtk_drawing_area_set_content_width (GTK_DRAWING_AREA (self), 340);
  gtk_drawing_area_set_content_height (GTK_DRAWING_AREA (self), 92);
  gtk_drawing_area_set_draw_func (GTK_DRAWING_AREA (self), draw_cb, NULL, NULL);
  gtk_widget_set_can_target (GTK_WIDGET (self), FALSE);
}

GtkWidget *
df_devmap_legend_new (void)
{
  return g_object_new (DF_TYPE_DEVMAP_LEGEND, NULL);
}

void
df_devmap_legend_set (DfDevmapLegend *self,
                      const char     *title,
                      const char     *units,
                      double          range,
                      double          limit,
                      const char     *limit_source)
{
  g_return_if_fail (DF_IS_DEVMAP_LEGEND (self));
  g_free (self->title);
  g_free (self->units);
  g_free (self->limit_source);
  self->title = g_strdup (title);
  self->units = g_strdup (units);
  self->range = range;
  self->limit = limit;
  self->limit_source = g_strdup (limit_source);
  {
    /* A line more of title (the drape's "(+ closes)..."), a line more of height. */
    int extra = 0;

    for (const char *c = title; c != NULL && *c != '\0'; c++)
      extra += *c == '\n';
    gtk_drawing_area_set_content_height (GTK_DRAWING_AREA (self), 92 + 14 * extra);
  }
  gtk_accessible_update_property (GTK_ACCESSIBLE (self), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                  title != NULL ? title : "", -1);
  gtk_widget_queue_draw (GTK_WIDGET (self));
}
