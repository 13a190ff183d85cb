/* df-flat-pattern-view.c: the flat pattern of a drape (see df-flat-pattern-view.h). Every pin
 * (i, j) lies at (i h, j h) on the fabric and the outline points come mapped by the core
 * (df_drape_get_flat_outline); this file only scales them into the widget. */
#include "df-flat-pattern-view.h"

#include <math.h>

#include "df-format.h"

struct _DfFlatPatternView
{
  GtkDrawingArea parent_instance;

  /* borrowed */
  const df_drape *drape;
  /* owned */
  DfDisplayUnits  du;      /* the sizes' and the scale bar's units */
};

G_DEFINE_FINAL_TYPE (DfFlatPatternView, df_flat_pattern_view, GTK_TYPE_DRAWING_AREA)

/* A round length near target: 1, 2 or 5 times a power of 10. */
static double
nice_length (double target)
{
  double p = pow (10, floor (log10 (target)));

  return target >= 5 * p ? 5 * p : target >= 2 * p ? 2 * p : p;
}

static void
draw_cb (GtkDrawingArea *area,
         cairo_t        *cr,
         int             width,
         int             height,
         gpointer        user_data)
{
  DfFlatPatternView *self = DF_FLAT_PATTERN_VIEW (area);
  const df_drape *d = self->drape;
  const df_drape_summary *s;
  const double (*flat)[2];
  const bool *mapped;
  double h, lo[2], hi[2], scale, ox, oy, bar;
  int step, top = 22, bottom = 30, margin = 12;
  gboolean pen_down = FALSE;

  cairo_set_source_rgb (cr, 1, 1, 1);
  cairo_paint (cr);
  if (d == NULL)
    {
      cairo_set_source_rgb (cr, 0.45, 0.45, 0.45);
      cairo_move_to (cr, margin, height / 2.0);
      cairo_show_text (cr, "No drape yet: the flat pattern shows here.");
      return;
    }
  s = df_drape_get_summary (d);
  h = df_drape_get_options (d)->cell;
  flat = df_drape_get_flat_outline (d);
  mapped = df_drape_get_outline_mapped (d);
  /* The outline's box, or the net's when no outline point is mapped. */
  lo[0] = s->flat_lo[0];
  lo[1] = s->flat_lo[1];
  hi[0] = s->flat_hi[0];
  hi[1] = s->flat_hi[1];
  if (!(hi[0] > lo[0] && hi[1] > lo[1]))
    {
      lo[0] = s->i_min * h;
      lo[1] = s->j_min * h;
      hi[0] = s->i_max * h;
      hi[1] = s->j_max * h;
    }
  if (!(hi[0] > lo[0] && hi[1] > lo[1]) || width < 4 * margin || height < top + bottom + 8)
    return;
  scale = fmin ((width - 2.0 * margin) / (hi[0] - lo[0]),
                (height - top - bottom - 0.0) / (hi[1] - lo[1]));
  ox = margin + 0.5 * (width - 2.0 * margin - scale * (hi[0] - lo[0])) - scale * lo[0];
  oy = top + 0.5 * (height - top - bottom - scale * (hi[1] - lo[1])) + scale * hi[1];
#define PX(x) (ox + scale * (x))
#define PY(y) (oy - scale * (y))
  /* Cells under 3 px are drawn every few, so the lattice stays a lattice. */
  step = MAX (1, (int) ceil (3.0 / (scale * h)));

  for (int i = s->i_min; i < s->i_max; i++)
    for (int j = s->j_min; j < s->j_max; j++)
      {
        df_drape_cell c;

        if (!df_drape_get_cell (d, i, j, &c) || c.corners_inside == 0)
          continue;
        if (c.over_limit)
          {
            cairo_set_source_rgba (cr, 0.85, 0.35, 0.10, 0.45);
            cairo_rectangle (cr, PX (i * h), PY ((j + 1) * h), scale * h, scale * h);
            cairo_fill (cr);
            if (scale * h >= 6)
              {
                cairo_set_source_rgb (cr, 0.1, 0.1, 0.1);
                cairo_set_line_width (cr, 1);
                cairo_move_to (cr, PX (i * h), PY (j * h));
                cairo_line_to (cr, PX ((i + 1) * h), PY ((j + 1) * h));
                cairo_move_to (cr, PX ((i + 1) * h), PY (j * h));
                cairo_line_to (cr, PX (i * h), PY ((j + 1) * h));
                cairo_stroke (cr);
              }
          }
        cairo_set_source_rgba (cr, 0.35, 0.45, 0.6, 0.55);
        cairo_set_line_width (cr, 0.7);
        if (i % step == 0)
          {
            cairo_move_to (cr, PX (i * h), PY (j * h));
            cairo_line_to (cr, PX (i * h), PY ((j + 1) * h));
          }
        if (j % step == 0)
          {
            cairo_move_to (cr, PX (i * h), PY (j * h));
            cairo_line_to (cr, PX ((i + 1) * h), PY (j * h));
          }
        cairo_stroke (cr);
      }

  /* The cut outline, broken where a point lies in no cell. */
  cairo_set_source_rgb (cr, 0.05, 0.05, 0.08);
  cairo_set_line_width (cr, 2);
  for (size_t k = 0; k <= s->n_outline; k++)
    {
      size_t m = k % s->n_outline;

      if (!mapped[m])
        {
          pen_down = FALSE;
          continue;
        }
      if (pen_down)
        cairo_line_to (cr, PX (flat[m][0]), PY (flat[m][1]));
      else
        cairo_move_to (cr, PX (flat[m][0]), PY (flat[m][1]));
      pen_down = TRUE;
    }
  cairo_stroke (cr);

  /* The start pin. */
  cairo_set_source_rgb (cr, 0.75, 0.1, 0.45);
  cairo_arc (cr, PX (0), PY (0), 4, 0, 2 * G_PI);
  cairo_fill (cr);

  /* Title, size and a scale bar. */
  {
    g_autofree char *w = df_du_format_length (&self->du, hi[0] - lo[0]);
    g_autofree char *ht = df_du_format_length (&self->du, hi[1] - lo[1]);
    g_autofree char *cell = df_du_format_length (&self->du, h);
    g_autofree char *title = step > 1
                             ? g_strdup_printf ("Flat %s × %s (warp → × weft ↑), cells %s, "
                                                "every %d drawn", w, ht, cell, step)
                             : g_strdup_printf ("Flat %s × %s (warp → × weft ↑), cells %s", w,
                                                ht, cell);
    g_autofree char *bar_text = NULL;

    cairo_set_source_rgb (cr, 0.1, 0.1, 0.1);
    cairo_set_font_size (cr, 12);
    cairo_move_to (cr, margin, 15);
    cairo_show_text (cr, title);
    /* A round length in the unit it is labelled in. */
    bar = df_du_to_model (&self->du,
                          nice_length (df_du_length (&self->du, (width - 2.0 * margin) / 4 / scale)));
    bar_text = df_du_format_length (&self->du, bar);
    cairo_set_line_width (cr, 2);
    cairo_move_to (cr, margin, height - 10);
    cairo_line_to (cr, margin + bar * scale, height - 10);
    cairo_move_to (cr, margin, height - 14);
    cairo_line_to (cr, margin, height - 6);
    cairo_move_to (cr, margin + bar * scale, height - 14);
    cairo_line_to (cr, margin + bar * scale, height - 6);
    cairo_stroke (cr);
    cairo_move_to (cr, margin + bar * scale + 6, height - 6);
    cairo_show_text (cr, bar_text);
  }
#undef PX
#undef PY
}

static void
df_flat_pattern_view_class_init (DfFlatPatternViewClass *klass)
{
  (void) klass;  /* nothing owned to free */
}

static void
df_flat_pattern_view_init (DfFlatPatternView *self)
{
  df_du_identity (&self->du, NULL);
  gtk_drawing_area_set_content_width (GTK_DRAWING_AREA (self), 360);
  gtk_drawing_area_set_content_height (GTK_DRAWING_AREA (self), 300);
  gtk_drawing_area_set_draw_func (GTK_DRAWING_AREA (self), draw_cb, NULL, NULL);
}

GtkWidget *
df_flat_pattern_view_new (void)
{
  return g_object_new (DF_TYPE_FLAT_PATTERN_VIEW, NULL);
}

void
df_flat_pattern_view_set (DfFlatPatternView *self,
                          const df_drape    *drape,
                          const DfDisplayUnits *du)
{
  g_return_if_fail (DF_IS_FLAT_PATTERN_VIEW (self));

  self->drape = drape;
  if (du != NULL)
    self->du = *du;
  gtk_widget_queue_draw (GTK_WIDGET (self));
}
