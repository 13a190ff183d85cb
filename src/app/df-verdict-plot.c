/* df-verdict-plot.c: three plots of a loop against arc length (see df-verdict-plot.h). The
 * design record's df_report_draw_kg_plot (df_report) draws k_g alone at print sizes with the
 * toy text API; here three quantities share one layout at screen sizes with pango, so the
 * layout is the app's own. Computes no geometry: the curves are the check's samples. */
#include "df-verdict-plot.h"

#include <math.h>
#include <pango/pangocairo.h>

#include "df-format.h"
#include "df-verdict-text.h"

#define PLOT_HEIGHT 110
#define N_PLOTS 3

struct _DfVerdictPlot
{
  GtkDrawingArea parent_instance;

  /* owned */
  DfLoopVerdicts *verdicts;
  df_limits      *limits;
  DfDisplayUnits  du;        /* the axis labels' units (the curves are drawn as measured) */
};

G_DEFINE_FINAL_TYPE (DfVerdictPlot, df_verdict_plot, GTK_TYPE_DRAWING_AREA)

static void
text_at (cairo_t    *cr,
         double      x,
         double      y,
         const char *text,
         double      align,     /* 0 left, 0.5 centre, 1 right of x */
         double      valign)    /* 0 top, 0.5 middle, 1 bottom at y */
{
  PangoLayout *layout = pango_cairo_create_layout (cr);
  PangoFontDescription *font = pango_font_description_from_string ("Sans 8");
  int w, h;

  pango_layout_set_font_description (layout, font);
  pango_font_description_free (font);
  pango_layout_set_text (layout, text, -1);
  pango_layout_get_pixel_size (layout, &w, &h);
  cairo_move_to (cr, x - align * w, y - valign * h);
  pango_cairo_show_layout (cr, layout);
  g_object_unref (layout);
}

/* Diagonal hatching over [x0, x1] of the box: a stretch beyond the limit. */
static void
hatch (cairo_t *cr,
       double   x0,
       double   x1,
       double   top,
       double   bottom)
{
  cairo_save (cr);
  cairo_rectangle (cr, x0, top, x1 - x0, bottom - top);
  cairo_clip (cr);
  cairo_set_source_rgba (cr, 0.8, 0.25, 0.1, 0.12);
  cairo_paint (cr);
  cairo_set_source_rgba (cr, 0.6, 0.15, 0.05, 0.45);
  cairo_set_line_width (cr, 1);
  for (double x = x0 - (bottom - top); x < x1; x += 6)
    {
      cairo_move_to (cr, x, bottom);
      cairo_line_to (cr, x + (bottom - top), top);
    }
  cairo_stroke (cr);
  cairo_restore (cr);
}

typedef struct
{
  const char   *title;
  const double *y;
  gboolean      symmetric;   /* k_g: signed, limit drawn at +/- */
  double        limit;       /* <= 0: none set */
  df_limit_id   id;
  const char   *y_units;
  gboolean      per_length;  /* y is a curvature (1/length): its labels convert */
} PlotSpec;

static void
draw_one (DfVerdictPlot     *self,
          cairo_t           *cr,
          const DfLoopCheck *check,
          const PlotSpec    *spec,
          double             top,
          double             width,
          double             height)
{
  const double left = 58, right = 10, title_h = 16, bottom_h = 18;
  double px = left, pw = width - left - right, py = top + title_h, ph = height - title_h - bottom_h;
  double ymax = 0, len = check->length > 0 ? check->length : 1;
  gboolean any = FALSE, first = TRUE, clipped = FALSE;
  g_autofree char *title = NULL;
  GdkRGBA fg = { 0.15, 0.15, 0.15, 1 };

  for (gsize i = 0; i < check->n; i++)
    if (isfinite (spec->y[i]))
      ymax = fmax (ymax, fabs (spec->y[i]));
  if (spec->limit > 0)
    ymax = fmax (ymax, 1.15 * spec->limit);
  /* A curve far beyond the limit would flatten the limit line onto the axis: clip the plot at
   * 4 x the limit and say so in the title. */
  if (spec->limit > 0 && ymax > 4 * spec->limit)
    {
      ymax = 4 * spec->limit;
      clipped = TRUE;
    }
  if (!(ymax > 0) || !isfinite (ymax))
    ymax = 1;
  ymax *= 1.05;

#define SX(s) (px + pw * (s) / len)
#define SY(v) (spec->symmetric ? py + ph / 2 - (ph / 2) * (v) / ymax : py + ph - ph * (v) / ymax)

  cairo_set_source_rgb (cr, 1, 1, 1);
  cairo_rectangle (cr, px, py, pw, ph);
  cairo_fill (cr);

  /* Stretches beyond this limit, from the verdicts (wrapping through the start). */
  for (gsize k = 0; k < check->list.n; k++)
    {
      const df_verdict *v = &check->list.items[k];

      if (v->limit != spec->id || v->within || v->region)
        continue;
      any = TRUE;
      if (!v->has_where)
        hatch (cr, SX (0), SX (len), py, py + ph);
      else if (v->s0 <= v->s1)
        hatch (cr, SX (v->s0), SX (v->s1), py, py + ph);
      else
        {
          hatch (cr, SX (v->s0), SX (len), py, py + ph);
          hatch (cr, SX (0), SX (v->s1), py, py + ph);
        }
    }

  cairo_set_source_rgba (cr, 0, 0, 0, 0.25);
  cairo_set_line_width (cr, 1);
  cairo_move_to (cr, px, SY (0) + 0.5);
  cairo_line_to (cr, px + pw, SY (0) + 0.5);
  cairo_stroke (cr);

  /* The curve, clipped to the box. */
  cairo_save (cr);
  cairo_rectangle (cr, px, py, pw, ph);
  cairo_clip (cr);
  cairo_set_source_rgb (cr, 0.1, 0.25, 0.55);
  cairo_set_line_width (cr, 1.5);
  for (gsize i = 0; i < check->n; i++)
    {
      double y = spec->y[i];

      if (!isfinite (y))
        {
          first = TRUE;
          continue;
        }
      y = CLAMP (y, -1.2 * ymax, 1.2 * ymax);
      if (first)
        cairo_move_to (cr, SX (check->s[i]), SY (y));
      else
        cairo_line_to (cr, SX (check->s[i]), SY (y));
      first = FALSE;
    }
  cairo_stroke (cr);

  if (spec->limit > 0)
    {
      double dash[2] = { 6, 3 };

      cairo_set_source_rgb (cr, 0.7, 0.15, 0.05);
      cairo_set_line_width (cr, 1.5);
      cairo_set_dash (cr, dash, 2, 0);
      cairo_move_to (cr, px, SY (spec->limit));
      cairo_line_to (cr, px + pw, SY (spec->limit));
      if (spec->symmetric)
        {
          cairo_move_to (cr, px, SY (-spec->limit));
          cairo_line_to (cr, px + pw, SY (-spec->limit));
        }
      cairo_stroke (cr);
      cairo_set_dash (cr, NULL, 0, 0);
    }
  cairo_restore (cr);

  cairo_set_source_rgba (cr, 0, 0, 0, 0.5);
  cairo_set_line_width (cr, 1);
  cairo_rectangle (cr, px + 0.5, py + 0.5, pw - 1, ph - 1);
  cairo_stroke (cr);

  gdk_cairo_set_source_rgba (cr, &fg);
  if (spec->limit > 0)
    {
      g_autofree char *l = df_format_number (spec->per_length
                                             ? df_du_per_length (&self->du, spec->limit)
                                             : spec->limit);

      title = g_strdup_printf ("%s: limit %s%s%s dashed%s", spec->title,
                               spec->symmetric ? "±" : "", l, spec->y_units,
                               any ? ", hatched beyond" : "");
    }
  else
    title = g_strdup_printf ("%s: no limit set", spec->title);
  /* From the left edge, not the plot's: the axis labels' margin would cut a long title. */
  text_at (cr, 4, top, title, 0, 0);
  if (clipped)
    text_at (cr, px + pw - 3, py + 2, "↑ higher values cut off", 1, 0);
  {
    g_autofree char *hi = df_format_number (spec->per_length
                                            ? df_du_per_length (&self->du, ymax) : ymax);
    g_autofree char *lo = spec->symmetric ? g_strdup_printf ("−%s", hi) : g_strdup ("0");
    g_autofree char *s_end = df_du_format_length (&self->du, len);

    text_at (cr, px - 4, py, hi, 1, 0);
    text_at (cr, px - 4, py + ph, lo, 1, 1);
    text_at (cr, px, py + ph + 2, "s = 0", 0, 0);
    text_at (cr, px + pw, py + ph + 2, s_end, 1, 0);
    text_at (cr, px + pw / 2, py + ph + 2, "arc length s", 0.5, 0);
  }
#undef SX
#undef SY
}

static void
draw_cb (GtkDrawingArea *area,
         cairo_t        *cr,
         int             width,
         int             height,
         gpointer        user_data)
{
  DfVerdictPlot *self = DF_VERDICT_PLOT (area);
  const DfLoopCheck *check = self->verdicts != NULL
                             ? df_loop_verdicts_get_check (self->verdicts) : NULL;
  const df_limits *l = self->limits;
  g_autofree char *kg_title = NULL;
  PlotSpec specs[N_PLOTS];

  if (check == NULL || check->n < 2 || l == NULL)
    return;
  kg_title = g_strdup_printf ("k_g (1/%s)", df_du_length_unit (&self->du));
  specs[0] = (PlotSpec) { kg_title, check->kg, TRUE,
                          l->item[DF_LIMIT_MIN_STEERING_RADIUS].set
                            ? 1 / l->item[DF_LIMIT_MIN_STEERING_RADIUS].model_value : 0,
                          DF_LIMIT_MIN_STEERING_RADIUS, "", TRUE };
  specs[1] = (PlotSpec) { "|k_g / k_n|", check->ratio, FALSE,
                          l->item[DF_LIMIT_FRICTION].set
                            ? l->item[DF_LIMIT_FRICTION].model_value : 0,
                          DF_LIMIT_FRICTION, "", FALSE };
  specs[2] = (PlotSpec) { "Fibre deviation", check->deviation_deg, FALSE,
                          l->item[DF_LIMIT_MAX_FIBRE_DEVIATION].set
                            ? l->item[DF_LIMIT_MAX_FIBRE_DEVIATION].model_value : 0,
                          DF_LIMIT_MAX_FIBRE_DEVIATION, "°", FALSE };
  for (int i = 0; i < N_PLOTS; i++)
    draw_one (self, cr, check, &specs[i], i * (double) height / N_PLOTS, width,
              (double) height / N_PLOTS - 6);
}

static void
verdicts_changed_cb (DfLoopVerdicts *verdicts,
                     DfVerdictPlot  *self)
{
  gboolean have = df_loop_verdicts_get_check (verdicts) != NULL;

  gtk_widget_set_visible (GTK_WIDGET (self), have);
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

static void
df_verdict_plot_dispose (GObject *object)
{
  DfVerdictPlot *self = DF_VERDICT_PLOT (object);

  if (self->verdicts != NULL)
    g_signal_handlers_disconnect_by_data (self->verdicts, self);
  g_clear_object (&self->verdicts);
  G_OBJECT_CLASS (df_verdict_plot_parent_class)->dispose (object);
}

static void
df_verdict_plot_finalize (GObject *object)
{
  DfVerdictPlot *self = DF_VERDICT_PLOT (object);

  df_limits_free (self->limits);
  G_OBJECT_CLASS (df_verdict_plot_parent_class)->finalize (object);
}

static void
df_verdict_plot_class_init (DfVerdictPlotClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);

  object_class->dispose = df_verdict_plot_dispose;
  object_class->finalize = df_verdict_plot_finalize;
}

static void
df_verdict_plot_init (DfVerdictPlot *self)
{
  df_du_identity (&self->du, "mm");
  gtk_drawing_area_set_content_height (GTK_DRAWING_AREA (self), N_PLOTS * PLOT_HEIGHT);
  gtk_drawing_area_set_draw_func (GTK_DRAWING_AREA (self), draw_cb, NULL, NULL);
  gtk_accessible_update_property (GTK_ACCESSIBLE (self), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                  "Plots of k_g, |k_g / k_n| and the fibre deviation against arc "
                                  "length, with the limits", -1);
}

GtkWidget *
df_verdict_plot_new (void)
{
  return g_object_new (DF_TYPE_VERDICT_PLOT, NULL);
}

void
df_verdict_plot_set (DfVerdictPlot   *self,
                     DfLoopVerdicts  *verdicts,
                     const df_limits *limits,
                     const DfDisplayUnits *du)
{
  g_return_if_fail (DF_IS_VERDICT_PLOT (self));

  if (self->verdicts != verdicts)
    {
      if (self->verdicts != NULL)
        g_signal_handlers_disconnect_by_data (self->verdicts, self);
      g_set_object (&self->verdicts, verdicts);
      if (verdicts != NULL)
        g_signal_connect (verdicts, "changed", G_CALLBACK (verdicts_changed_cb), self);
    }
  df_limits_free (self->limits);
  self->limits = df_limits_copy (limits);
  self->du = *du;
  gtk_widget_set_visible (GTK_WIDGET (self),
                          verdicts != NULL && df_loop_verdicts_get_check (verdicts) != NULL);
  gtk_widget_queue_draw (GTK_WIDGET (self));
}
