/* df-window-tools.c: the tools of the header bar's selector, driven by the view's pick signals
 * (surface-pressed / -dragged / -released with chart coordinates):
 *   Look       orbit the camera (the view handles it);
 *   Sketch     press-drag-release draws a closed loop, measured live while drawing and for good
 *              on release;
 *   Probe      the local geometry at the clicked point;
 *   Geodesic   press at the start, drag to aim, release to shoot;
 *   Two paths  path A, then path B with its ends snapped to A's; compares the carried vectors.
 * Strokes are collected in chart coordinates; all measuring is the core's. This file has the
 * shared helpers, the view's signals dispatched to the tools, and tool switching; the tools
 * themselves are in df-window-tools-sketch.c (strokes, Sketch loop and its live readout),
 * df-window-tools-geodesic.c (Probe, Geodesic), df-window-tools-paths.c (Two paths) and
 * df-window-tools-typed.c (typed points for Probe and Geodesic). */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "df-project.h"

#include "df-document-units.h"
#include "df-format.h"
#include "df-window-private.h"
#include "df-window-tools-private.h"

/* ---- small helpers ----------------------------------------------------------------------- */

GdkRGBA
_df_window_rgba (const char *spec)
{
  GdkRGBA colour;

  gdk_rgba_parse (&colour, spec);
  return colour;
}

gboolean
_df_window_surface_point (DfWindow *self,
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
  g_autofree char *a = df_format_number (u);
  g_autofree char *text = NULL;
  g_autofree char *where = NULL;
  double xyz[3];
  DfDisplayUnits du;
  const char *units;

  df_document_get_display_units (self->document, &du);
  units = df_du_length_unit (&du);

  /* The point in space too: t is the profile's own parameter (an angle, a length...), so the
   * position is what carries the units. */
  if (_df_window_surface_point (self, u, v, xyz))
    {
      g_autofree char *x = df_format_number (df_du_length (&du, xyz[0]));
      g_autofree char *y = df_format_number (df_du_length (&du, xyz[1]));
      g_autofree char *z = df_format_number (df_du_length (&du, xyz[2]));
      where = g_strdup_printf ("  (%s, %s, %s) %s", x, y, z, units);
    }
  if (surface != NULL && df_surface_get_kind (surface) == DF_SURFACE_REVOLUTION)
    {
      g_autofree char *chart = df_du_format_chart_point (&du, TRUE, u, v);

      text = g_strdup_printf ("%s%s", chart, where != NULL ? where : "");
    }
  else
    {
      /* A height field's chart is its plan: x, y of the point in space, so all three show in
       * the display unit. */
      g_autofree char *b = NULL;
      g_autofree char *zn = where != NULL ? df_format_number (df_du_length (&du, xyz[2])) : NULL;

      g_free (a);
      a = df_format_number (df_du_length (&du, u));
      b = df_format_number (df_du_length (&du, v));
      if (zn != NULL)
        text = g_strdup_printf ("x = %s, y = %s, z = %s %s", a, b, zn, units);
      else
        text = g_strdup_printf ("x = %s, y = %s %s", a, b, units);
    }
  gtk_label_set_text (self->coords_label, text);
}

/* Chart points of a stroke as a plain array (g_free). */
double (*_df_window_stroke_uv (GArray *stroke))[2]
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

void
_df_window_draw_stroke (DfWindow   *self,
                        guint       id,
                        GArray     *stroke,
                        const char *colour_spec,
                        float       width)
{
  g_autofree double (*xyz)[3] = g_malloc_n (MAX (stroke->len, 1), sizeof (double[3]));
  GdkRGBA colour = _df_window_rgba (colour_spec);
  gsize n = 0;

  for (guint i = 0; i < stroke->len; i++)
    {
      StrokePoint *p = &g_array_index (stroke, StrokePoint, i);
      if (_df_window_surface_point (self, p->u, p->v, xyz[n]))
        n++;
    }
  if (n >= 2)
    df_surface_view_set_curve (self->view, id, (const double (*)[3]) xyz, n, FALSE, &colour,
                               width);
  else
    df_surface_view_remove_curve (self->view, id);
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
      _df_window_stroke_begin (self, u, v);
      df_loops_panel_set_live_text (self->loops_panel, "Drawing… release to close the loop.");
      break;
    case DF_TOOL_PROBE:
      _df_window_probe_at (self, u, v);
      break;
    case DF_TOOL_GEODESIC:
      {
        double xyz[3];
        GdkRGBA colour = _df_window_rgba (colour_geodesic);

        _df_window_clear_geodesic (self);
        self->geodesic_pressed = TRUE;
        self->geodesic_start[0] = u;
        self->geodesic_start[1] = v;
        if (_df_window_surface_point (self, u, v, xyz))
          df_surface_view_set_marker (self->view, xyz, &colour);
      }
      break;
    case DF_TOOL_PATHS:
      if (self->paths_stage == DF_PATHS_DONE)
        _df_window_clear_paths (self);
      if (self->paths_stage == DF_PATHS_WANT_A)
        {
          df_surface_view_remove_curve (self->view, DF_CURVE_PATH_A);
          _df_window_paths_set_stage (self, DF_PATHS_DRAWING_A);
        }
      else
        _df_window_paths_set_stage (self, DF_PATHS_DRAWING_B);
      _df_window_stroke_begin (self, u, v);
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
      if (self->stroking && _df_window_stroke_add (self, u, v))
        {
          _df_window_draw_stroke (self, DF_CURVE_SKETCH, self->stroke_uv,
                       self->tool == DF_TOOL_SKETCH ? colour_stroke
                       : self->paths_stage == DF_PATHS_DRAWING_A ? colour_path_a
                       : colour_path_b, 3.0f);
          if (self->tool == DF_TOOL_SKETCH)
            _df_window_live_start (self);
        }
      break;
    case DF_TOOL_PROBE:
      _df_window_probe_at (self, u, v);
      break;
    case DF_TOOL_GEODESIC:
      if (self->geodesic_pressed)
        _df_window_geodesic_aim (self, u, v);
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
        _df_window_sketch_finish (self);
      break;
    case DF_TOOL_PATHS:
      if (self->stroking)
        _df_window_paths_finish_stroke (self);
      break;
    case DF_TOOL_GEODESIC:
      if (self->geodesic_pressed)
        _df_window_geodesic_shoot (self, u, v);
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

/* ---- tool switching ----------------------------------------------------------------------- */

static void
cancel_stroke (DfWindow *self)
{
  self->stroking = FALSE;
  _df_window_live_stop (self);
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
    _df_window_paths_set_stage (self, DF_PATHS_WANT_A);
  else if (tool == DF_TOOL_PATHS && self->paths_stage == DF_PATHS_DRAWING_B)
    _df_window_paths_set_stage (self, DF_PATHS_WANT_B);
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
  self->probe_shown = FALSE;
  /* The pointer's coordinates were of the old surface. */
  gtk_label_set_text (self->coords_label, "");
  _df_window_update_typed_hints (self);
  _df_window_show_extras (self);
}

void
_df_window_show_extras (DfWindow *self)
{
  const df_project_geodesic *geodesic = df_document_get_geodesic (self->document);
  const df_project_paths *paths = df_document_get_paths (self->document);
  const df_surface *surface = df_document_get_surface (self->document);

  _df_window_clear_geodesic (self);
  _df_window_clear_paths (self);
  if (surface == NULL)
    return;
  if (geodesic != NULL && df_surface_contains (surface, geodesic->u, geodesic->v))
    {
      self->geodesic_start[0] = geodesic->u;
      self->geodesic_start[1] = geodesic->v;
      _df_window_shoot_from (self, geodesic->heading_deg * G_PI / 180, geodesic->length, FALSE);
    }
  if (paths != NULL && paths->n_a >= 2 && paths->n_b >= 2)
    _df_window_paths_set (self, (const double (*)[2]) paths->a, paths->n_a,
                          (const double (*)[2]) paths->b, paths->n_b, FALSE, FALSE);
  if (self->startup.report_events)
    {
      printf ("extras-shown %d %d\n", geodesic != NULL, paths != NULL);
      fflush (stdout);
    }
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
  g_signal_connect (self->probe_panel, "probe-requested", G_CALLBACK (_df_window_probe_requested_cb),
                    self);
  g_signal_connect (self->geodesic_panel, "shoot-requested", G_CALLBACK (_df_window_shoot_requested_cb),
                    self);
  _df_window_paths_set_stage (self, DF_PATHS_WANT_A);
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
