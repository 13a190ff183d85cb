/* df-report-plot.c: k_g against arc length for the report, drawn as vectors with cairo's toy
 * text API (labels are short and Latin; pango would add nothing here). Reader/writer layer. */
#include "df-report-plot.h"

#include <math.h>
#include <stdbool.h>
#include <stdio.h>
#include <string.h>

static void
label (cairo_t *cr, double x, double y, const char *text, double align)
{
  cairo_text_extents_t ext;

  cairo_text_extents (cr, text, &ext);
  cairo_move_to (cr, x - align * ext.width - ext.x_bearing, y);
  cairo_show_text (cr, text);
}

static void
fmt (char *buf, size_t len, double v)
{
  if (!isfinite (v))
    snprintf (buf, len, "n/a");
  else if (v == 0)
    snprintf (buf, len, "0");
  else
    snprintf (buf, len, "%.3g", v);
}

void
df_report_draw_kg_plot (cairo_t *cr, double x, double y, double w, double h,
                        const df_loop_result *r, const char *units, double kg_limit)
{
  const double left = 52, bottom = 24, top = 14, right = 8;
  double px = x + left, py = y + top, pw = w - left - right, ph = h - top - bottom;
  double kmax = 0, len = r->length > 0 && isfinite (r->length) ? r->length : 1;
  char buf[64], axis[64];

  for (size_t i = 0; i < r->n_samples; i++)
    if (isfinite (r->samples[i].k_g))
      kmax = fmax (kmax, fabs (r->samples[i].k_g));
  if (kg_limit > 0 && isfinite (kg_limit))
    kmax = fmax (kmax, 1.15 * kg_limit);
  if (!(kmax > 0))
    kmax = 1;
  kmax *= 1.05;

  cairo_save (cr);
  cairo_select_font_face (cr, "DejaVu Sans", CAIRO_FONT_SLANT_NORMAL, CAIRO_FONT_WEIGHT_NORMAL);
  cairo_set_font_size (cr, 7);
  cairo_set_source_rgb (cr, 0.98, 0.98, 0.97);
  cairo_rectangle (cr, px, py, pw, ph);
  cairo_fill_preserve (cr);
  cairo_set_source_rgb (cr, 0.4, 0.4, 0.4);
  cairo_set_line_width (cr, 0.6);
  cairo_stroke (cr);

#define SX(s) (px + pw * (s) / len)
#define SY(k) (py + ph / 2 - (ph / 2) * (k) / kmax)
  /* zero line */
  cairo_set_source_rgb (cr, 0.6, 0.6, 0.6);
  cairo_set_line_width (cr, 0.4);
  cairo_move_to (cr, px, SY (0));
  cairo_line_to (cr, px + pw, SY (0));
  cairo_stroke (cr);

  if (kg_limit > 0 && isfinite (kg_limit))
    {
      double dash[2] = { 4, 2 };

      /* Beyond the limit: shaded bands, so the plot reads in grey print too. */
      cairo_set_source_rgba (cr, 0.85, 0.2, 0.1, 0.08);
      cairo_rectangle (cr, px, py, pw, SY (kg_limit) - py);
      cairo_rectangle (cr, px, SY (-kg_limit), pw, py + ph - SY (-kg_limit));
      cairo_fill (cr);
      cairo_set_source_rgb (cr, 0.75, 0.15, 0.05);
      cairo_set_line_width (cr, 0.8);
      cairo_set_dash (cr, dash, 2, 0);
      for (int sgn = -1; sgn <= 1; sgn += 2)
        {
          cairo_move_to (cr, px, SY (sgn * kg_limit));
          cairo_line_to (cr, px + pw, SY (sgn * kg_limit));
        }
      cairo_stroke (cr);
      cairo_set_dash (cr, NULL, 0, 0);
      label (cr, px + pw - 2, SY (kg_limit) - 2, "steering limit \xc2\xb1" "1/R", 1);
    }

  cairo_set_source_rgb (cr, 0.1, 0.25, 0.55);
  cairo_set_line_width (cr, 1.0);
  {
    bool pen = false;

    for (size_t i = 0; i < r->n_samples; i++)
      {
        const df_loop_sample *s = &r->samples[i];

        if (!isfinite (s->k_g) || !isfinite (s->s))
          {
            pen = false;
            continue;
          }
        if (pen)
          cairo_line_to (cr, SX (s->s), SY (fmax (-kmax, fmin (kmax, s->k_g))));
        else
          cairo_move_to (cr, SX (s->s), SY (fmax (-kmax, fmin (kmax, s->k_g))));
        pen = true;
      }
    cairo_stroke (cr);
  }

  cairo_set_source_rgb (cr, 0.15, 0.15, 0.15);
  fmt (buf, sizeof buf, kmax);
  label (cr, px - 3, py + 6, buf, 1);
  fmt (buf, sizeof buf, -kmax);
  label (cr, px - 3, py + ph, buf, 1);
  label (cr, px - 3, SY (0) + 2.5, "0", 1);
  label (cr, px, py + ph + 9, "0", 0);
  fmt (buf, sizeof buf, len);
  label (cr, px + pw, py + ph + 9, buf, 1);
  snprintf (axis, sizeof axis, "arc length s (%s)", units);
  label (cr, px + pw / 2, py + ph + 18, axis, 0.5);
  snprintf (axis, sizeof axis, "geodesic curvature k_g (1/%s) along the loop", units);
  label (cr, px, py - 4, axis, 0);
#undef SX
#undef SY
  cairo_restore (cr);
}
