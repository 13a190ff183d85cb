/* df-window-tools-sketch.c: strokes collected from the view's pick signals (shared by Sketch loop
 * and Two paths), the live readout while sketching, and the Sketch loop tool: the stroke faired
 * by the core's smoothing spline and added as a loop on release. */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "df-project.h"

#include "df-document-units.h"
#include "df-format.h"
#include "df-window-private.h"
#include "df-window-tools-private.h"

/* ---- strokes (Sketch loop and Two paths) -------------------------------------------------- */

void
_df_window_stroke_begin (DfWindow *self,
                         double    u,
                         double    v)
{
  StrokePoint p = { u, v, self->pointer_x, self->pointer_y };

  self->stroking = TRUE;
  self->stroke_left = FALSE;
  g_array_set_size (self->stroke_uv, 0);
  g_array_append_val (self->stroke_uv, p);
  self->stroke_px_min[0] = self->stroke_px_max[0] = p.px;
  self->stroke_px_min[1] = self->stroke_px_max[1] = p.py;
}

gboolean
_df_window_stroke_add (DfWindow *self,
                       double    u,
                       double    v)
{
  const df_surface *surface = df_document_get_surface (self->document);
  StrokePoint *last = &g_array_index (self->stroke_uv, StrokePoint, self->stroke_uv->len - 1);
  StrokePoint p = { u, v, self->pointer_x, self->pointer_y };
  double step = hypot (p.px - last->px, p.py - last->py);

  if (step < DF_STROKE_STEP_PX)
    return FALSE;
  /* Keep the angle of a surface of revolution continuous along the stroke, so that a loop
   * around the axis shows as a full turn rather than a jump at +-180 degrees. */
  if (surface != NULL && df_surface_v_periodic (surface))
    p.v += 2 * G_PI * round ((last->v - p.v) / (2 * G_PI));
  g_array_append_val (self->stroke_uv, p);
  self->stroke_px_min[0] = MIN (self->stroke_px_min[0], p.px);
  self->stroke_px_max[0] = MAX (self->stroke_px_max[0], p.px);
  self->stroke_px_min[1] = MIN (self->stroke_px_min[1], p.py);
  self->stroke_px_max[1] = MAX (self->stroke_px_max[1], p.py);
  return TRUE;
}

/* Why a finished stroke cannot be used, or NULL. */
const char *
_df_window_stroke_problem (DfWindow *self,
                           guint     min_points)
{
  double extent = MAX (self->stroke_px_max[0] - self->stroke_px_min[0],
                       self->stroke_px_max[1] - self->stroke_px_min[1]);

  if (self->stroke_uv->len < min_points)
    return "too few distinct points: drag further across the surface";
  if (extent < DF_STROKE_MIN_PX)
    return "too small: drag a larger shape (or zoom in first)";
  if (self->stroke_left)
    return "it left the surface: keep the whole stroke on the surface";
  return NULL;
}

/* ---- live readout while sketching --------------------------------------------------------- */

static void
live_done_cb (GObject      *source,
              GAsyncResult *result,
              gpointer      user_data)
{
  DfWindow *self = user_data;
  g_autoptr(GError) error = NULL;
  g_autoptr(df_loop_result) measured = df_work_measure_loop_finish (result, &error);

  if (g_error_matches (error, G_IO_ERROR, G_IO_ERROR_CANCELLED))
    {
      g_object_unref (self);
      return;
    }
  self->live_running = FALSE;
  if (self->stroking && self->tool == DF_TOOL_SKETCH)
    {
      if (measured != NULL)
        {
          g_autofree char *hol = df_format_angle (measured->holonomy_rad);
          g_autofree char *enc = measured->bounds_disc
                                   ? df_format_angle (measured->enclosed_curvature_rad)
                                   : g_strdup ("none (bounds no disc)");
          g_autofree char *text = g_strdup_printf ("Closing the loop here would give:\n"
                                                   "holonomy %s\nenclosed curvature %s",
                                                   hol, enc);
          df_loops_panel_set_live_text (self->loops_panel, text);
        }
      else
        df_loops_panel_set_live_text (self->loops_panel,
                                      "Closing the loop here: not measurable yet "
                                      "(keep drawing)");
      /* The stroke grew while this job ran: measure the newer stroke. */
      _df_window_live_start (self);
    }
  g_object_unref (self);
}

void
_df_window_live_start (DfWindow *self)
{
  g_autofree double (*uv)[2] = NULL;
  gint64 now = g_get_monotonic_time ();
  guint n = self->stroke_uv->len;

  if (self->live_running || n < 8 || now - self->live_last_us < DF_LIVE_INTERVAL_US)
    return;
  self->live_last_us = now;
  self->live_running = TRUE;
  g_cancellable_cancel (self->live_cancellable);
  g_clear_object (&self->live_cancellable);
  self->live_cancellable = g_cancellable_new ();
  uv = _df_window_stroke_uv (self->stroke_uv);
  df_work_measure_loop_async (df_document_get_surface (self->document),
                              (const double (*)[2]) uv, n, DF_LIVE_SAMPLES,
                              self->live_cancellable, live_done_cb, g_object_ref (self));
}

void
_df_window_live_stop (DfWindow *self)
{
  if (self->live_cancellable != NULL)
    g_cancellable_cancel (self->live_cancellable);
  g_clear_object (&self->live_cancellable);
  self->live_running = FALSE;
  df_loops_panel_set_live_text (self->loops_panel, NULL);
}

/* ---- Sketch loop -------------------------------------------------------------------------- */

static gint
compare_doubles (gconstpointer a,
                 gconstpointer b)
{
  double x = *(const double *) a, y = *(const double *) b;

  return (x > y) - (x < y);
}

/* The length one pixel stands for at the stroke's depth: the median over the stroke of the
 * step in space per step on the screen (a median, so the few steps foreshortened on a slope
 * or lengthened by a jump do not decide it). 0 when it cannot be told. */
static double
stroke_pixel_size (DfWindow *self)
{
  g_autoptr(GArray) ratios = g_array_new (FALSE, FALSE, sizeof (double));
  double a[3], b[3];

  for (guint i = 1; i < self->stroke_uv->len; i++)
    {
      StrokePoint *p = &g_array_index (self->stroke_uv, StrokePoint, i - 1);
      StrokePoint *q = &g_array_index (self->stroke_uv, StrokePoint, i);
      double px = hypot (q->px - p->px, q->py - p->py), r;

      if (px > 0 && _df_window_surface_point (self, p->u, p->v, a) && _df_window_surface_point (self, q->u, q->v, b))
        {
          r = sqrt ((b[0] - a[0]) * (b[0] - a[0]) + (b[1] - a[1]) * (b[1] - a[1])
                    + (b[2] - a[2]) * (b[2] - a[2])) / px;
          g_array_append_val (ratios, r);
        }
    }
  if (ratios->len == 0)
    return 0.0;
  g_array_sort (ratios, compare_doubles);
  return g_array_index (ratios, double, ratios->len / 2);
}

/* Fairs the stroke's points in place (the core's smoothing spline within DF_SKETCH_FAIR_PX
 * pixels); returns the text for the loop's details, or NULL when it was not faired (*why says
 * why). */
static char *
sketch_fair (DfWindow   *self,
             double    (**uv)[2],
             gsize        n,
             const char **why)
{
  const df_surface *surface = df_document_get_surface (self->document);
  DfDisplayUnits du;
  double tol = DF_SKETCH_FAIR_PX * stroke_pixel_size (self);
  double (*faired)[2] = NULL;
  df_fair_info info;
  df_diag diag;
  g_autofree char *t = NULL, *d = NULL;

  *why = "the stroke's scale on screen could not be told";
  if (!(tol > 0))
    return NULL;
  if (df_fair_closed_loop (surface, (const double (*)[2]) *uv, n, tol, &faired, &info, &diag)
      != DF_OK)
    {
      *why = "the stroke is too small beside its own jitter";
      return NULL;
    }
  g_free (*uv);
  *uv = faired;
  df_document_get_display_units (self->document, &du);
  t = df_du_format_length (&du, info.tolerance);
  d = df_du_format_length (&du, info.max_deviation);
  return g_strdup_printf ("Faired as drawn: %s within %s (%g px at the stroke's depth), largest "
                          "deviation from the stroke %s%s.", df_fair_method_name (), t,
                          DF_SKETCH_FAIR_PX, d, info.met ? "" : ", more than the tolerance");
}

void
_df_window_sketch_finish (DfWindow *self)
{
  g_autofree double (*uv)[2] = NULL;
  g_autofree char *fairing = NULL;
  const char *problem, *why = NULL;
  DfLoopItem *item;

  self->stroking = FALSE;
  _df_window_live_stop (self);
  df_surface_view_remove_curve (self->view, DF_CURVE_SKETCH);
  /* A hand-closed loop ends on (or next to) its first point; the loop closes itself, so such
   * an end adds a closing segment far shorter than the rest with a sharp turn in it, which
   * read as a steering radius under a millimetre on a smooth loop. Drop it. */
  while (self->stroke_uv->len > 3)
    {
      StrokePoint *first = &g_array_index (self->stroke_uv, StrokePoint, 0);
      StrokePoint *last = &g_array_index (self->stroke_uv, StrokePoint, self->stroke_uv->len - 1);

      if (hypot (last->px - first->px, last->py - first->py) >= DF_STROKE_STEP_PX)
        break;
      g_array_set_size (self->stroke_uv, self->stroke_uv->len - 1);
    }
  problem = _df_window_stroke_problem (self, 3);
  if (problem != NULL)
    {
      _df_window_status (self, TRUE, "Loop not added: %s.", problem);
      return;
    }
  uv = _df_window_stroke_uv (self->stroke_uv);
  /* A sketch is always faired, so its steering radius shows the shape meant, not the hand's
   * jitter; the loop's details say so (df-loops-panel.c reads "df-fairing"). */
  fairing = sketch_fair (self, &uv, self->stroke_uv->len, &why);
  item = df_document_add_loop (self->document, NULL, (const double (*)[2]) uv,
                               self->stroke_uv->len);
  g_object_set_data_full (G_OBJECT (item), "df-fairing",
                          fairing ? g_steal_pointer (&fairing)
                                  : g_strdup_printf ("Not faired: %s.", why), g_free);
  _df_window_status (self, FALSE, "“%s” closed with %u points, measuring… (Ctrl+Z removes it)",
                     df_loop_item_get_name (item), self->stroke_uv->len);
}

