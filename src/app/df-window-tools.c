/* df-window-tools.c: the tools of the header bar's selector, driven by the view's pick signals
 * (surface-pressed / -dragged / -released with chart coordinates):
 *   Look       orbit the camera (the view handles it);
 *   Sketch     press-drag-release draws a closed loop, measured live while drawing and for good
 *              on release;
 *   Probe      the local geometry at the clicked point;
 *   Geodesic   press at the start, drag to aim, release to shoot;
 *   Two paths  path A, then path B with its ends snapped to A's; compares the carried vectors.
 * Strokes are collected in chart coordinates; all measuring is the core's. */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "df-project.h"

#include "df-format.h"
#include "df-window-private.h"

/* Stroke filtering in screen pixels: points closer than this to the previous one are dropped
 * (they add noise, not shape), and a stroke smaller than DF_STROKE_MIN_PX across is refused.
 * Common practice for pointer sketching, no source. */
#define DF_STROKE_STEP_PX 4.0
#define DF_STROKE_MIN_PX  16.0
/* Sketches are faired within this many pixels at the stroke's depth: pointer positions come
 * in whole pixels and a hand jitters by a pixel or two. Common practice, no source. */
#define DF_SKETCH_FAIR_PX 2.0
/* Live readout while sketching: at most one job at a time, at most this often. */
#define DF_LIVE_INTERVAL_US (150 * 1000)
#define DF_LIVE_SAMPLES 32
/* Samples along a shot geodesic. */
#define DF_GEODESIC_SAMPLES 240

static const char *const colour_path_a = "#00838f";
static const char *const colour_path_b = "#e0a41c";
static const char *const colour_stroke = "#1b1b1b";
static const char *const colour_geodesic = "#8c4fc4";
static const char *const colour_marker = "#111111";

typedef struct
{
  double u, v;
  double px, py;  /* pointer position when picked */
} StrokePoint;

/* ---- small helpers ----------------------------------------------------------------------- */

static GdkRGBA
rgba (const char *spec)
{
  GdkRGBA colour;

  gdk_rgba_parse (&colour, spec);
  return colour;
}

static gboolean
surface_point (DfWindow *self,
               double    u,
               double    v,
               double    xyz[3])
{
  const df_surface *surface = df_document_get_surface (self->document);
  df_chart_jet jet;

  if (surface == NULL || df_surface_eval (surface, u, v, 0, &jet, NULL) != DF_OK)
    return FALSE;
  memcpy (xyz, jet.x, sizeof jet.x);
  return TRUE;
}

static void
show_coords (DfWindow *self,
             double    u,
             double    v)
{
  const df_surface *surface = df_document_get_surface (self->document);
  const char *units = df_document_get_units (self->document);
  g_autofree char *a = df_format_number (u);
  g_autofree char *text = NULL;
  g_autofree char *where = NULL;
  double xyz[3];

  /* The point in space too: t is the profile's own parameter (an angle, a length...), so the
   * position is what carries the units. */
  if (surface_point (self, u, v, xyz))
    {
      g_autofree char *x = df_format_number (xyz[0]);
      g_autofree char *y = df_format_number (xyz[1]);
      g_autofree char *z = df_format_number (xyz[2]);
      where = g_strdup_printf ("  (%s, %s, %s) %s", x, y, z, units);
    }
  if (surface != NULL && df_surface_get_kind (surface) == DF_SURFACE_REVOLUTION)
    {
      double phi = remainder (v, 2 * G_PI);
      g_autofree char *b = df_format_number (phi * 180.0 / G_PI);
      text = g_strdup_printf ("t = %s, φ = %s°%s", a, b, where != NULL ? where : "");
    }
  else
    {
      g_autofree char *b = df_format_number (v);
      g_autofree char *zn = where != NULL ? df_format_number (xyz[2]) : NULL;

      if (zn != NULL)
        text = g_strdup_printf ("x = %s, y = %s, z = %s %s", a, b, zn, units);
      else
        text = g_strdup_printf ("x = %s, y = %s %s", a, b, units);
    }
  gtk_label_set_text (self->coords_label, text);
}

/* Chart points of a stroke as a plain array (g_free). */
static double (*stroke_uv (GArray *stroke))[2]
{
  double (*uv)[2] = g_malloc_n (MAX (stroke->len, 1), sizeof (double[2]));

  for (guint i = 0; i < stroke->len; i++)
    {
      StrokePoint *p = &g_array_index (stroke, StrokePoint, i);
      uv[i][0] = p->u;
      uv[i][1] = p->v;
    }
  return uv;
}

static void
draw_stroke (DfWindow   *self,
             guint       id,
             GArray     *stroke,
             const char *colour_spec,
             float       width)
{
  g_autofree double (*xyz)[3] = g_malloc_n (MAX (stroke->len, 1), sizeof (double[3]));
  GdkRGBA colour = rgba (colour_spec);
  gsize n = 0;

  for (guint i = 0; i < stroke->len; i++)
    {
      StrokePoint *p = &g_array_index (stroke, StrokePoint, i);
      if (surface_point (self, p->u, p->v, xyz[n]))
        n++;
    }
  if (n >= 2)
    df_surface_view_set_curve (self->view, id, (const double (*)[3]) xyz, n, FALSE, &colour,
                               width);
  else
    df_surface_view_remove_curve (self->view, id);
}

/* ---- strokes (Sketch loop and Two paths) -------------------------------------------------- */

static void
stroke_begin (DfWindow *self,
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

static gboolean
stroke_add (DfWindow *self,
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
static const char *
stroke_problem (DfWindow *self,
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

static void live_start (DfWindow *self);

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
      live_start (self);
    }
  g_object_unref (self);
}

static void
live_start (DfWindow *self)
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
  uv = stroke_uv (self->stroke_uv);
  df_work_measure_loop_async (df_document_get_surface (self->document),
                              (const double (*)[2]) uv, n, DF_LIVE_SAMPLES,
                              self->live_cancellable, live_done_cb, g_object_ref (self));
}

static void
live_stop (DfWindow *self)
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

      if (px > 0 && surface_point (self, p->u, p->v, a) && surface_point (self, q->u, q->v, b))
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
  const char *units = df_document_get_units (self->document);
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
  t = df_format_length (info.tolerance, units);
  d = df_format_length (info.max_deviation, units);
  return g_strdup_printf ("Faired as drawn: %s within %s (%g px at the stroke's depth), largest "
                          "deviation from the stroke %s%s.", df_fair_method_name (), t,
                          DF_SKETCH_FAIR_PX, d, info.met ? "" : ", more than the tolerance");
}

static void
sketch_finish (DfWindow *self)
{
  g_autofree double (*uv)[2] = NULL;
  g_autofree char *fairing = NULL;
  const char *problem, *why = NULL;
  DfLoopItem *item;

  self->stroking = FALSE;
  live_stop (self);
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
  problem = stroke_problem (self, 3);
  if (problem != NULL)
    {
      _df_window_status (self, TRUE, "Loop not added: %s.", problem);
      return;
    }
  uv = stroke_uv (self->stroke_uv);
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

/* ---- Probe -------------------------------------------------------------------------------- */

static void
probe_at (DfWindow *self,
          double    u,
          double    v)
{
  const df_surface *surface = df_document_get_surface (self->document);
  df_point_geometry geometry;
  df_diag diag;
  df_status status;
  GdkRGBA colour = rgba (colour_marker);

  df_diag_clear (&diag);
  status = df_surface_geometry (surface, u, v, &geometry, &diag);
  if (status != DF_OK)
    {
      g_autoptr(GError) error = NULL;

      df_status_to_gerror (status, &diag, &error);
      df_probe_panel_show_error (self->probe_panel, error->message);
      df_surface_view_set_marker (self->view, NULL, NULL);
      return;
    }
  df_probe_panel_show (self->probe_panel, surface, &geometry,
                       df_document_get_units (self->document));
  df_surface_view_set_marker (self->view, geometry.point, &colour);
  if (self->startup.report_events)
    {
      char a[G_ASCII_DTOSTR_BUF_SIZE], b[G_ASCII_DTOSTR_BUF_SIZE], k[G_ASCII_DTOSTR_BUF_SIZE];

      printf ("probed %s %s %s\n", g_ascii_dtostr (a, sizeof a, u),
              g_ascii_dtostr (b, sizeof b, v), g_ascii_dtostr (k, sizeof k, geometry.K));
      fflush (stdout);
    }
}

/* ---- Geodesic ----------------------------------------------------------------------------- */

void
_df_window_clear_geodesic (DfWindow *self)
{
  self->geodesic_pressed = FALSE;
  df_surface_view_remove_curve (self->view, DF_CURVE_GEODESIC);
  df_surface_view_remove_arrow (self->view, DF_ARROW_GEODESIC);
  df_geodesic_panel_clear (self->geodesic_panel);
}

static void
geodesic_aim (DfWindow *self,
              double    u,
              double    v)
{
  double a[3], b[3], dir[3];
  GdkRGBA colour = rgba (colour_geodesic);

  if (!surface_point (self, self->geodesic_start[0], self->geodesic_start[1], a)
      || !surface_point (self, u, v, b))
    return;
  for (int k = 0; k < 3; k++)
    dir[k] = b[k] - a[k];
  if (dir[0] != 0 || dir[1] != 0 || dir[2] != 0)
    df_surface_view_set_arrow (self->view, DF_ARROW_GEODESIC, a, dir, &colour);
}

static void shoot_from (DfWindow *self, double heading, double length);

static void
geodesic_shoot (DfWindow *self,
                double    u,
                double    v)
{
  const df_surface *surface = df_document_get_surface (self->document);
  g_auto(df_geodesic_result) result = { 0 };
  df_point_geometry start;
  double a[3], b[3], w[3], du, dv, heading, length;
  df_diag diag;
  df_status status;
  g_autoptr(GError) error = NULL;

  self->geodesic_pressed = FALSE;
  du = u - self->geodesic_start[0];
  dv = v - self->geodesic_start[1];
  if (df_surface_v_periodic (surface))
    dv = remainder (dv, 2 * G_PI);
  df_diag_clear (&diag);
  status = df_surface_geometry (surface, self->geodesic_start[0], self->geodesic_start[1],
                                &start, &diag);
  if (status == DF_OK && !start.chart_regular)
    {
      df_geodesic_panel_show_error (self->geodesic_panel,
                                    "The start point is a pole of the chart, where no heading "
                                    "can be measured: start next to it.");
      return;
    }
  if (status != DF_OK)
    {
      df_status_to_gerror (status, &diag, &error);
      df_geodesic_panel_show_error (self->geodesic_panel, error->message);
      return;
    }
  if (!surface_point (self, self->geodesic_start[0], self->geodesic_start[1], a)
      || !surface_point (self, u, v, b))
    return;
  /* The drag's direction as a tangent vector (du X_u + dv X_v) and its heading from X_u about
   * N; the length asked is the straight distance between press and release. This only turns
   * a mouse gesture into the two numbers the core's shooter takes. */
  for (int k = 0; k < 3; k++)
    w[k] = du * start.xu[k] + dv * start.xv[k];
  length = sqrt ((b[0] - a[0]) * (b[0] - a[0]) + (b[1] - a[1]) * (b[1] - a[1])
                 + (b[2] - a[2]) * (b[2] - a[2]));
  if (!(length > 1e-6 * df_surface_size (surface)) || (w[0] == 0 && w[1] == 0 && w[2] == 0))
    {
      df_geodesic_panel_show_error (self->geodesic_panel,
                                    "Drag away from the start point to set the direction and "
                                    "length of the geodesic.");
      df_surface_view_remove_arrow (self->view, DF_ARROW_GEODESIC);
      return;
    }
  heading = df_signed_angle (start.xu, w, start.normal);
  shoot_from (self, heading, length);
}

/* Shoots from self->geodesic_start with heading (rad, from X_u about N) and length. */
static void
shoot_from (DfWindow *self,
            double    heading,
            double    length)
{
  const df_surface *surface = df_document_get_surface (self->document);
  const char *units = df_document_get_units (self->document);
  g_auto(df_geodesic_result) result = { 0 };
  df_diag diag;
  df_status status;
  g_autoptr(GError) error = NULL;

  df_diag_clear (&diag);
  status = df_geodesic_shoot (surface, self->geodesic_start[0], self->geodesic_start[1],
                              heading, length, DF_GEODESIC_SAMPLES, &result, &diag);
  if (status != DF_OK)
    {
      df_status_to_gerror (status, &diag, &error);
      df_geodesic_panel_show_error (self->geodesic_panel, error->message);
      _df_window_status (self, TRUE, "No geodesic: %s", error->message);
      return;
    }
  {
    g_autofree double (*xyz)[3] = g_malloc_n (MAX (result.n_samples, 1), sizeof (double[3]));
    GdkRGBA colour = rgba (colour_geodesic);
    g_autofree char *reached = df_format_length (result.length, units);

    for (gsize i = 0; i < result.n_samples; i++)
      memcpy (xyz[i], result.samples[i].point, sizeof xyz[i]);
    df_surface_view_set_curve (self->view, DF_CURVE_GEODESIC, (const double (*)[3]) xyz,
                               result.n_samples, FALSE, &colour, 3.5f);
    if (result.n_samples > 0)
      df_surface_view_set_arrow (self->view, DF_ARROW_GEODESIC, result.samples[0].point,
                                 result.samples[0].tangent, &colour);
    df_geodesic_panel_show (self->geodesic_panel, surface, heading, length, &result, units);
    _df_window_status (self, result.stopped_early, "Geodesic of %s%s%s.", reached,
                       result.stopped_early ? ", stopped early: " : "",
                       result.stopped_early ? result.stop_reason : "");
    if (self->startup.report_events && result.n_samples > 0)
      {
        df_geodesic_sample *end = &result.samples[result.n_samples - 1];
        char a[G_ASCII_DTOSTR_BUF_SIZE], b[G_ASCII_DTOSTR_BUF_SIZE], c[G_ASCII_DTOSTR_BUF_SIZE];

        printf ("geodesic-end %s %s %s\n", g_ascii_dtostr (a, sizeof a, end->u),
                g_ascii_dtostr (b, sizeof b, end->v), g_ascii_dtostr (c, sizeof c, result.length));
        fflush (stdout);
      }
  }
}

/* ---- Two paths ---------------------------------------------------------------------------- */

static const char *
paths_hint (DfPathsStage stage)
{
  switch (stage)
    {
    case DF_PATHS_WANT_A:
    case DF_PATHS_DRAWING_A:
      return "Drag path A on the surface, from its start to its end.";
    case DF_PATHS_WANT_B:
    case DF_PATHS_DRAWING_B:
      return "Now drag path B: another way from A's start to A's end (its ends snap to A's).";
    case DF_PATHS_DONE:
    default:
      return "Done. Drag again to start a new path A, or Clear paths.";
    }
}

static void
paths_set_stage (DfWindow     *self,
                 DfPathsStage  stage)
{
  self->paths_stage = stage;
  df_compare_panel_set_hint (self->compare_panel, paths_hint (stage));
}

void
_df_window_clear_paths (DfWindow *self)
{
  if (self->paths_cancellable != NULL)
    g_cancellable_cancel (self->paths_cancellable);
  g_clear_object (&self->paths_cancellable);
  g_array_set_size (self->path_a, 0);
  g_array_set_size (self->path_b, 0);
  df_surface_view_remove_curve (self->view, DF_CURVE_PATH_A);
  df_surface_view_remove_curve (self->view, DF_CURVE_PATH_B);
  df_surface_view_remove_arrow (self->view, DF_ARROW_PATH_A);
  df_surface_view_remove_arrow (self->view, DF_ARROW_PATH_B);
  df_compare_panel_set_paths (self->compare_panel, 0, 0);
  df_compare_panel_set_angle (self->compare_panel, NAN);
  paths_set_stage (self, DF_PATHS_WANT_A);
}

static void
draw_transport (DfWindow                  *self,
                guint                      curve_id,
                guint                      arrow_id,
                const df_transport_result *result,
                const char                *colour_spec)
{
  g_autofree double (*xyz)[3] = g_malloc_n (MAX (result->n_samples, 1), sizeof (double[3]));
  GdkRGBA colour = rgba (colour_spec);

  for (gsize i = 0; i < result->n_samples; i++)
    memcpy (xyz[i], result->samples[i].x, sizeof xyz[i]);
  if (result->n_samples >= 2)
    {
      df_surface_view_set_curve (self->view, curve_id, (const double (*)[3]) xyz,
                                 result->n_samples, FALSE, &colour, 3.5f);
      df_surface_view_set_arrow (self->view, arrow_id, result->samples[result->n_samples - 1].x,
                                 result->end_vector, &colour);
    }
}

static void
compare_done_cb (GObject      *source,
                 GAsyncResult *result,
                 gpointer      user_data)
{
  DfWindow *self = user_data;
  g_autoptr(GError) error = NULL;
  g_autoptr(DfPathComparison) comparison = df_work_compare_paths_finish (result, &error);

  if (g_error_matches (error, G_IO_ERROR, G_IO_ERROR_CANCELLED))
    {
      g_object_unref (self);
      return;
    }
  if (comparison == NULL)
    {
      df_compare_panel_show_error (self->compare_panel, error->message);
      _df_window_status (self, TRUE, "Paths not compared: %s", error->message);
      paths_set_stage (self, DF_PATHS_DONE);
      g_object_unref (self);
      return;
    }
  draw_transport (self, DF_CURVE_PATH_A, DF_ARROW_PATH_A, &comparison->a, colour_path_a);
  draw_transport (self, DF_CURVE_PATH_B, DF_ARROW_PATH_B, &comparison->b, colour_path_b);
  df_compare_panel_set_angle (self->compare_panel, comparison->angle_rad);
  df_compare_panel_set_lengths (self->compare_panel, comparison->a.length, comparison->b.length,
                                df_document_get_units (self->document));
  {
    g_autofree char *angle = df_format_angle (comparison->angle_rad);
    _df_window_status (self, self->paths_long_legs, "Carried along B, the direction ends %s "
                       "from the one carried along A.%s", angle,
                       self->paths_long_legs ? " Path B was drawn away from A's ends and was "
                                               "joined to them by straight legs in the chart: "
                                               "draw it from A's start to A's end." : "");
  }
  paths_set_stage (self, DF_PATHS_DONE);
  g_object_unref (self);
}

static void
paths_finish_stroke (DfWindow *self)
{
  const char *problem;
  gboolean is_a = self->paths_stage == DF_PATHS_DRAWING_A;

  self->stroking = FALSE;
  df_surface_view_remove_curve (self->view, DF_CURVE_SKETCH);
  problem = stroke_problem (self, 3);
  if (problem != NULL)
    {
      _df_window_status (self, TRUE, "Path %s not taken: %s.", is_a ? "A" : "B", problem);
      paths_set_stage (self, is_a ? DF_PATHS_WANT_A : DF_PATHS_WANT_B);
      return;
    }
  if (is_a)
    {
      g_array_set_size (self->path_a, 0);
      g_array_append_vals (self->path_a, self->stroke_uv->data, self->stroke_uv->len);
      draw_stroke (self, DF_CURVE_PATH_A, self->path_a, colour_path_a, 3.5f);
      df_compare_panel_set_paths (self->compare_panel, self->path_a->len, 0);
      paths_set_stage (self, DF_PATHS_WANT_B);
      return;
    }

  {
    StrokePoint *a0 = &g_array_index (self->path_a, StrokePoint, 0);
    StrokePoint *a1 = &g_array_index (self->path_a, StrokePoint, self->path_a->len - 1);
    g_autofree double (*uv_a)[2] = NULL;
    g_autofree double (*uv_b)[2] = NULL;
    StrokePoint *b0, *b1;
    double gap_start, gap_end;

    g_array_set_size (self->path_b, 0);
    g_array_append_vals (self->path_b, self->stroke_uv->data, self->stroke_uv->len);
    /* Common ends: B starts and ends exactly where A does. */
    b0 = &g_array_index (self->path_b, StrokePoint, 0);
    b1 = &g_array_index (self->path_b, StrokePoint, self->path_b->len - 1);
    gap_start = hypot (b0->px - a0->px, b0->py - a0->py);
    gap_end = hypot (b1->px - a1->px, b1->py - a1->py);
    *b0 = *a0;
    *b1 = *a1;
    draw_stroke (self, DF_CURVE_PATH_B, self->path_b, colour_path_b, 3.5f);
    df_compare_panel_set_paths (self->compare_panel, self->path_a->len, self->path_b->len);
    paths_set_stage (self, DF_PATHS_DONE);
    df_compare_panel_set_hint (self->compare_panel, "Comparing…");
    /* The snap is silent when B was drawn onto A's ends; say so when it adds long legs. */
    self->paths_long_legs = MAX (gap_start, gap_end) > 5 * DF_STROKE_STEP_PX;

    uv_a = stroke_uv (self->path_a);
    uv_b = stroke_uv (self->path_b);
    if (self->paths_cancellable != NULL)
      g_cancellable_cancel (self->paths_cancellable);
    g_clear_object (&self->paths_cancellable);
    self->paths_cancellable = g_cancellable_new ();
    df_work_compare_paths_async (df_document_get_surface (self->document),
                                 (const double (*)[2]) uv_a, self->path_a->len,
                                 (const double (*)[2]) uv_b, self->path_b->len,
                                 self->paths_cancellable, compare_done_cb, g_object_ref (self));
  }
}

/* ---- view signals ------------------------------------------------------------------------- */

static void
surface_pressed_cb (DfSurfaceView *view,
                    double         u,
                    double         v,
                    DfWindow      *self)
{
  show_coords (self, u, v);
  switch (self->tool)
    {
    case DF_TOOL_SKETCH:
      stroke_begin (self, u, v);
      df_loops_panel_set_live_text (self->loops_panel, "Drawing… release to close the loop.");
      break;
    case DF_TOOL_PROBE:
      probe_at (self, u, v);
      break;
    case DF_TOOL_GEODESIC:
      {
        double xyz[3];
        GdkRGBA colour = rgba (colour_geodesic);

        _df_window_clear_geodesic (self);
        self->geodesic_pressed = TRUE;
        self->geodesic_start[0] = u;
        self->geodesic_start[1] = v;
        if (surface_point (self, u, v, xyz))
          df_surface_view_set_marker (self->view, xyz, &colour);
      }
      break;
    case DF_TOOL_PATHS:
      if (self->paths_stage == DF_PATHS_DONE)
        _df_window_clear_paths (self);
      if (self->paths_stage == DF_PATHS_WANT_A)
        {
          df_surface_view_remove_curve (self->view, DF_CURVE_PATH_A);
          paths_set_stage (self, DF_PATHS_DRAWING_A);
        }
      else
        paths_set_stage (self, DF_PATHS_DRAWING_B);
      stroke_begin (self, u, v);
      break;
    case DF_TOOL_LOOK:
    default:
      break;
    }
}

static void
surface_dragged_cb (DfSurfaceView *view,
                    double         u,
                    double         v,
                    DfWindow      *self)
{
  show_coords (self, u, v);
  switch (self->tool)
    {
    case DF_TOOL_SKETCH:
    case DF_TOOL_PATHS:
      if (self->stroking && stroke_add (self, u, v))
        {
          draw_stroke (self, DF_CURVE_SKETCH, self->stroke_uv,
                       self->tool == DF_TOOL_SKETCH ? colour_stroke
                       : self->paths_stage == DF_PATHS_DRAWING_A ? colour_path_a
                       : colour_path_b, 3.0f);
          if (self->tool == DF_TOOL_SKETCH)
            live_start (self);
        }
      break;
    case DF_TOOL_PROBE:
      probe_at (self, u, v);
      break;
    case DF_TOOL_GEODESIC:
      if (self->geodesic_pressed)
        geodesic_aim (self, u, v);
      break;
    case DF_TOOL_LOOK:
    default:
      break;
    }
}

static void
surface_released_cb (DfSurfaceView *view,
                     double         u,
                     double         v,
                     DfWindow      *self)
{
  switch (self->tool)
    {
    case DF_TOOL_SKETCH:
      if (self->stroking)
        sketch_finish (self);
      break;
    case DF_TOOL_PATHS:
      if (self->stroking)
        paths_finish_stroke (self);
      break;
    case DF_TOOL_GEODESIC:
      if (self->geodesic_pressed)
        geodesic_shoot (self, u, v);
      break;
    case DF_TOOL_PROBE:
    case DF_TOOL_LOOK:
    default:
      break;
    }
}

static void
pointer_motion_cb (GtkEventControllerMotion *controller,
                   double                    x,
                   double                    y,
                   DfWindow                 *self)
{
  double u, v;

  self->pointer_x = x;
  self->pointer_y = y;
  /* The view reports hits only; a stroke whose pointer passes off the surface (or is released
   * there) would otherwise silently join its two ends with a chord. */
  if (self->stroking && !self->stroke_left
      && !df_surface_view_pick (self->view, x, y, &u, &v))
    self->stroke_left = TRUE;
  /* Hover readout of where the pointer is on the surface (the stroke updates it itself). */
  if (!self->stroking)
    {
      if (df_surface_view_pick (self->view, x, y, &u, &v))
        show_coords (self, u, v);
      else
        gtk_label_set_text (self->coords_label, "");
    }
}

/* ---- typed values ------------------------------------------------------------------------- */

/* Numbers separated by commas, semicolons or spaces; FALSE (error naming field) unless there
 * are between min and max finite ones. */
static gboolean
parse_numbers (const char  *text,
               const char  *field,
               int          min,
               int          max,
               double      *out,
               int         *n_out,
               GError     **error)
{
  g_auto(GStrv) parts = g_strsplit_set (text, ",; \t", -1);
  int n = 0;

  for (int i = 0; parts[i] != NULL; i++)
    {
      char *end = NULL;
      double value;

      if (parts[i][0] == '\0')
        continue;
      value = g_ascii_strtod (parts[i], &end);
      if (end == parts[i] || *end != '\0' || !isfinite (value))
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: '%s' is not a number",
                       field, parts[i]);
          return FALSE;
        }
      if (n == max)
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: more than %d numbers",
                       field, max);
          return FALSE;
        }
      out[n++] = value;
    }
  if (n < min || (min == 2 && max == 3 && n != 2 && n != 3))
    {
      if (min == max)
        g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: expected %d number%s", field,
                     min, min == 1 ? "" : "s");
      else
        g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: expected %d or %d numbers",
                     field, min, max);
      return FALSE;
    }
  *n_out = n;
  return TRUE;
}

/* A typed point: chart coordinates (φ in degrees on a surface of revolution, as everywhere in
 * the app) or a point in space, placed at its closest surface point (within 5 % of the
 * surface's size, common practice, no source). */
static gboolean
typed_point (DfWindow    *self,
             const char  *text,
             const char  *field,
             double      *u,
             double      *v,
             GError     **error)
{
  const df_surface *surface = df_document_get_surface (self->document);
  double x[3], dist = 0;
  int n = 0;
  df_diag diag;
  df_status status;

  if (surface == NULL || !parse_numbers (text, field, 2, 3, x, &n, error))
    return FALSE;
  if (n == 2)
    {
      *u = x[0];
      *v = df_surface_get_kind (surface) == DF_SURFACE_REVOLUTION ? x[1] * G_PI / 180.0 : x[1];
      return TRUE;
    }
  df_diag_clear (&diag);
  status = df_surface_project (surface, x, 0.05 * df_surface_size (surface), u, v, &dist, &diag);
  if (status != DF_OK)
    {
      df_status_to_gerror (status, &diag, error);
      g_prefix_error (error, "%s: the point (%g, %g, %g) is not near the surface: ", field,
                      x[0], x[1], x[2]);
      return FALSE;
    }
  if (dist > 1e-6 * df_surface_size (surface))
    {
      g_autofree char *d = df_format_length (dist, df_document_get_units (self->document));
      _df_window_status (self, FALSE, "%s: the typed point is %s from the surface; its closest "
                         "surface point is used.", field, d);
    }
  return TRUE;
}

static void
probe_requested_cb (DfProbePanel *panel,
                    const char   *text,
                    DfWindow     *self)
{
  g_autoptr(GError) error = NULL;
  double u, v;

  if (!typed_point (self, text, "Probe at", &u, &v, &error))
    {
      df_probe_panel_show_error (panel, error->message);
      return;
    }
  probe_at (self, u, v);
}

static void
shoot_requested_cb (DfGeodesicPanel *panel,
                    const char      *start_text,
                    const char      *heading_text,
                    const char      *length_text,
                    DfWindow        *self)
{
  const df_surface *surface = df_document_get_surface (self->document);
  g_autoptr(GError) error = NULL;
  df_point_geometry start;
  double u, v, heading, length;
  int n;

  if (!typed_point (self, start_text, "From", &u, &v, &error)
      || !parse_numbers (heading_text, "Heading", 1, 1, &heading, &n, &error)
      || !parse_numbers (length_text, "Length", 1, 1, &length, &n, &error))
    {
      df_geodesic_panel_show_error (panel, error->message);
      return;
    }
  if (!(length > 0))
    {
      df_geodesic_panel_show_error (panel, "Length: must be greater than 0");
      return;
    }
  if (df_surface_geometry (surface, u, v, &start, NULL) == DF_OK && !start.chart_regular)
    {
      df_geodesic_panel_show_error (panel, "From: the start point is a pole of the chart, "
                                           "where no heading can be measured: start next to it.");
      return;
    }
  self->geodesic_start[0] = u;
  self->geodesic_start[1] = v;
  shoot_from (self, heading * G_PI / 180.0, length);
}

/* The typed-value entries name the chart of the surface now shown. */
static void
update_typed_hints (DfWindow *self)
{
  const df_surface *surface = df_document_get_surface (self->document);
  gboolean revolution = surface != NULL && df_surface_get_kind (surface) == DF_SURFACE_REVOLUTION;

  df_probe_panel_set_placeholder (self->probe_panel,
                                  revolution ? "t, φ° on the surface or x, y, z in space"
                                             : "x, y on the surface or x, y, z in space");
  df_geodesic_panel_set_chart (self->geodesic_panel, revolution ? "t, φ°  or  x, y, z" :
                                                                  "x, y  or  x, y, z",
                               revolution ? "Heading 0° = along +t (X_t, the way t grows "
                                            "along the profile), counted anticlockwise about "
                                            "N (see the Surface panel's orientation)."
                                          : "Heading 0° = along +x, 90° = along +y; "
                                            "anticlockwise about N.",
                               df_document_get_units (self->document));
}

void
_df_window_focus_typed (DfWindow *self)
{
  if (self->tool == DF_TOOL_GEODESIC)
    {
      gtk_stack_set_visible_child_name (self->panel_stack, "geodesic");
      df_geodesic_panel_focus_entry (self->geodesic_panel);
    }
  else
    {
      if (self->tool != DF_TOOL_PROBE)
        g_object_set (self, "tool", "probe", NULL);
      gtk_stack_set_visible_child_name (self->panel_stack, "probe");
      df_probe_panel_focus_entry (self->probe_panel);
    }
}

/* ---- tool switching ----------------------------------------------------------------------- */

static void
cancel_stroke (DfWindow *self)
{
  self->stroking = FALSE;
  live_stop (self);
  df_surface_view_remove_curve (self->view, DF_CURVE_SKETCH);
}

void
_df_window_set_tool (DfWindow *self,
                     DfTool    tool)
{
  static const char *const pages[] = { NULL, "loops", "probe", "geodesic", "paths" };
  static const char *const hints[] = {
    "Look: drag to turn the view, Shift+drag or middle button to pan, scroll to zoom.",
    "Sketch loop: press on the surface, drag around a region and release; the loop closes "
    "itself.",
    "Probe: click (or drag) on the surface to read its local geometry.",
    "Geodesic: press at the start, drag towards where it should head, release to shoot.",
    "Two paths: drag path A, then path B between the same ends.",
  };

  cancel_stroke (self);
  self->tool = tool;
  df_surface_view_set_interaction (self->view, tool == DF_TOOL_LOOK ? DF_INTERACTION_ORBIT
                                                                    : DF_INTERACTION_PICK);
  if (pages[tool] != NULL)
    gtk_stack_set_visible_child_name (self->panel_stack, pages[tool]);
  if (tool == DF_TOOL_PATHS && self->paths_stage == DF_PATHS_DRAWING_A)
    paths_set_stage (self, DF_PATHS_WANT_A);
  else if (tool == DF_TOOL_PATHS && self->paths_stage == DF_PATHS_DRAWING_B)
    paths_set_stage (self, DF_PATHS_WANT_B);
  _df_window_status (self, FALSE, "%s", hints[tool]);
}

void
_df_window_tools_surface_changed (DfWindow *self)
{
  /* Tool drawings belong to the old surface; loops are re-measured by the document. */
  cancel_stroke (self);
  _df_window_clear_geodesic (self);
  _df_window_clear_paths (self);
  df_surface_view_set_marker (self->view, NULL, NULL);
  df_probe_panel_clear (self->probe_panel);
  /* The pointer's coordinates were of the old surface. */
  gtk_label_set_text (self->coords_label, "");
  update_typed_hints (self);
}

void
_df_window_tools_init (DfWindow *self)
{
  GtkEventController *motion = gtk_event_controller_motion_new ();

  self->stroke_uv = g_array_new (FALSE, FALSE, sizeof (StrokePoint));
  self->path_a = g_array_new (FALSE, FALSE, sizeof (StrokePoint));
  self->path_b = g_array_new (FALSE, FALSE, sizeof (StrokePoint));
  g_signal_connect (motion, "motion", G_CALLBACK (pointer_motion_cb), self);
  g_signal_connect (motion, "enter", G_CALLBACK (pointer_motion_cb), self);
  gtk_widget_add_controller (GTK_WIDGET (self->view), motion);
  g_signal_connect (self->view, "surface-pressed", G_CALLBACK (surface_pressed_cb), self);
  g_signal_connect (self->view, "surface-dragged", G_CALLBACK (surface_dragged_cb), self);
  g_signal_connect (self->view, "surface-released", G_CALLBACK (surface_released_cb), self);
  g_signal_connect (self->probe_panel, "probe-requested", G_CALLBACK (probe_requested_cb),
                    self);
  g_signal_connect (self->geodesic_panel, "shoot-requested", G_CALLBACK (shoot_requested_cb),
                    self);
  paths_set_stage (self, DF_PATHS_WANT_A);
  df_compare_panel_set_paths (self->compare_panel, 0, 0);
  df_compare_panel_set_angle (self->compare_panel, NAN);
  df_geodesic_panel_clear (self->geodesic_panel);
}

void
_df_window_tools_finalize (DfWindow *self)
{
  if (self->live_cancellable != NULL)
    g_cancellable_cancel (self->live_cancellable);
  g_clear_object (&self->live_cancellable);
  if (self->paths_cancellable != NULL)
    g_cancellable_cancel (self->paths_cancellable);
  g_clear_object (&self->paths_cancellable);
  g_clear_pointer (&self->stroke_uv, g_array_unref);
  g_clear_pointer (&self->path_a, g_array_unref);
  g_clear_pointer (&self->path_b, g_array_unref);
  g_clear_pointer (&self->loop_curve_ids, g_array_unref);
}
