/* df-surface-view-input.c: DfSurfaceView's input: picking a chart point under the pointer (a ray
 * against the mesh, then the core's closest-point projection), drags that orbit, pan or pick,
 * the scroll zoom, and the view's actions and key bindings. */
#include "df-surface-view-private.h"

#include <math.h>

#include "df-project.h"

/* Nearest hit of the ray with the mesh (Moller-Trumbore, both faces); barycentric (u, v) of the
 * hit in *hit_uv and the point in *hit. Brute force over ~100k triangles stays near a
 * millisecond, well inside a pointer event. */
static gboolean
ray_mesh (const df_mesh *mesh,
          const double   o[3],
          const double   d[3],
          double         hit[3],
          double         hit_uv[2])
{
  const double *x = df_mesh_positions (mesh), *uv = df_mesh_uv (mesh);
  const uint32_t *idx = df_mesh_indices (mesh);
  double best = INFINITY;
  gsize best_tri = 0;
  double best_b[2] = { 0, 0 };

  for (gsize t = 0; t < df_mesh_n_triangles (mesh); t++)
    {
      const double *a = &x[3 * idx[3 * t]], *b = &x[3 * idx[3 * t + 1]];
      const double *c = &x[3 * idx[3 * t + 2]];
      double e1[3], e2[3], p[3], q[3], s[3], det, inv, bu, bv, dist;
      for (int i = 0; i < 3; i++)
        {
          e1[i] = b[i] - a[i];
          e2[i] = c[i] - a[i];
          s[i] = o[i] - a[i];
        }
      p[0] = d[1] * e2[2] - d[2] * e2[1];
      p[1] = d[2] * e2[0] - d[0] * e2[2];
      p[2] = d[0] * e2[1] - d[1] * e2[0];
      det = e1[0] * p[0] + e1[1] * p[1] + e1[2] * p[2];
      if (fabs (det) < 1e-300)
        continue;
      inv = 1 / det;
      bu = (s[0] * p[0] + s[1] * p[1] + s[2] * p[2]) * inv;
      if (bu < 0 || bu > 1)
        continue;
      q[0] = s[1] * e1[2] - s[2] * e1[1];
      q[1] = s[2] * e1[0] - s[0] * e1[2];
      q[2] = s[0] * e1[1] - s[1] * e1[0];
      bv = (d[0] * q[0] + d[1] * q[1] + d[2] * q[2]) * inv;
      if (bv < 0 || bu + bv > 1)
        continue;
      dist = (e2[0] * q[0] + e2[1] * q[1] + e2[2] * q[2]) * inv;
      if (dist > 0 && dist < best)
        {
          best = dist;
          best_tri = t;
          best_b[0] = bu;
          best_b[1] = bv;
        }
    }
  if (!isfinite (best))
    return FALSE;
  for (int i = 0; i < 3; i++)
    hit[i] = o[i] + best * d[i];
  for (int k = 0; k < 2; k++)
    hit_uv[k] = (1 - best_b[0] - best_b[1]) * uv[2 * idx[3 * best_tri] + k]
                + best_b[0] * uv[2 * idx[3 * best_tri + 1] + k]
                + best_b[1] * uv[2 * idx[3 * best_tri + 2] + k];
  return TRUE;
}

gboolean
df_surface_view_pick (DfSurfaceView *self,
                      double         widget_x,
                      double         widget_y,
                      double        *u,
                      double        *v)
{
  vec3 fo, fd;
  double o[3], d[3], hit[3], hit_uv[2], pu, pv, dist, size;

  g_return_val_if_fail (DF_IS_SURFACE_VIEW (self), FALSE);
  if (self->surface == NULL || self->mesh == NULL || self->mesh->mesh == NULL)
    return FALSE;
  df_camera_ray (&self->camera, widget_x, widget_y, gtk_widget_get_width (GTK_WIDGET (self)),
                 gtk_widget_get_height (GTK_WIDGET (self)), fo, fd);
  for (int i = 0; i < 3; i++)
    {
      o[i] = fo[i];
      d[i] = fd[i];
    }
  if (!ray_mesh (self->mesh->mesh, o, d, hit, hit_uv))
    return FALSE;

  /* The mesh is flat between vertices; the projection puts the point on the true surface. If it
   * fails or lands far away (another sheet), the interpolated chart point is still a surface
   * point, only slightly off the ray. */
  size = self->mesh->size;
  if (df_surface_project (self->surface, hit, 0.05 * size, &pu, &pv, &dist, NULL) == DF_OK
      && dist < 0.02 * size && df_surface_contains (self->surface, pu, pv))
    {
      hit_uv[0] = pu;
      hit_uv[1] = pv;
    }
  if (u != NULL)
    *u = hit_uv[0];
  if (v != NULL)
    *v = hit_uv[1];
  return TRUE;
}

/* ---- input ------------------------------------------------------------------------------ */

static void
set_moving (DfSurfaceView *self,
            gboolean       moving)
{
  if (self->moving == moving)
    return;
  self->moving = moving;
  gtk_gl_area_queue_render (GTK_GL_AREA (self));
}

static gboolean
settle_cb (gpointer user_data)
{
  DfSurfaceView *self = user_data;

  self->settle_id = 0;
  set_moving (self, FALSE);
  return G_SOURCE_REMOVE;
}

static void
orbit_by_pixels (DfSurfaceView *self,
                 double         dx,
                 double         dy)
{
  df_camera_orbit (&self->camera, glm_rad (-ORBIT_DEG_PER_PX * dx),
                   glm_rad (ORBIT_DEG_PER_PX * dy));
  gtk_gl_area_queue_render (GTK_GL_AREA (self));
}

static void
pan_by_pixels (DfSurfaceView *self,
               double         dx,
               double         dy)
{
  df_camera_pan (&self->camera, dx, dy, gtk_widget_get_height (GTK_WIDGET (self)));
  gtk_gl_area_queue_render (GTK_GL_AREA (self));
}

static void
pick_event (DfSurfaceView *self,
            double         x,
            double         y,
            int            which)
{
  double u, v;
  gboolean hit = df_surface_view_pick (self, x, y, &u, &v);

  if (hit)
    {
      self->last_u = u;
      self->last_v = v;
    }
  if (which == SURFACE_RELEASED)
    {
      if (self->pick_active)
        g_signal_emit (self, _df_surface_view_signals[SURFACE_RELEASED], 0, self->last_u, self->last_v);
      self->pick_active = FALSE;
      return;
    }
  if (!hit)
    return;
  /* A drag that starts off the surface begins when it first reaches it, so listeners always
   * see pressed, dragged..., released. */
  if (!self->pick_active)
    {
      self->pick_active = TRUE;
      g_signal_emit (self, _df_surface_view_signals[SURFACE_PRESSED], 0, u, v);
    }
  else
    g_signal_emit (self, _df_surface_view_signals[SURFACE_DRAGGED], 0, u, v);
}

static void
drag_begin_cb (GtkGestureDrag *gesture,
               double          x,
               double          y,
               DfSurfaceView  *self)
{
  guint button = gtk_gesture_single_get_current_button (GTK_GESTURE_SINGLE (gesture));

  self->drag_last_x = 0;
  self->drag_last_y = 0;
  gtk_widget_grab_focus (GTK_WIDGET (self));
  if (button == GDK_BUTTON_PRIMARY && self->interaction == DF_INTERACTION_PICK)
    {
      self->pick_active = FALSE;
      pick_event (self, x, y, SURFACE_PRESSED);
    }
}

static void
drag_update_cb (GtkGestureDrag *gesture,
                double          dx,
                double          dy,
                DfSurfaceView  *self)
{
  guint button = gtk_gesture_single_get_current_button (GTK_GESTURE_SINGLE (gesture));
  GdkModifierType mods = gtk_event_controller_get_current_event_state (
      GTK_EVENT_CONTROLLER (gesture));
  double step_x = dx - self->drag_last_x, step_y = dy - self->drag_last_y;
  double x0, y0;

  self->drag_last_x = dx;
  self->drag_last_y = dy;
  if (button == GDK_BUTTON_PRIMARY && self->interaction == DF_INTERACTION_PICK)
    {
      gtk_gesture_drag_get_start_point (gesture, &x0, &y0);
      pick_event (self, x0 + dx, y0 + dy, SURFACE_DRAGGED);
    }
  else if (button == GDK_BUTTON_MIDDLE || (mods & GDK_SHIFT_MASK))
    {
      set_moving (self, TRUE);
      pan_by_pixels (self, step_x, step_y);
    }
  else
    {
      set_moving (self, TRUE);
      orbit_by_pixels (self, step_x, step_y);
    }
}

static void
drag_end_cb (GtkGestureDrag *gesture,
             double          dx,
             double          dy,
             DfSurfaceView  *self)
{
  guint button = gtk_gesture_single_get_current_button (GTK_GESTURE_SINGLE (gesture));
  double x0, y0;

  set_moving (self, FALSE);
  if (button == GDK_BUTTON_PRIMARY && self->interaction == DF_INTERACTION_PICK)
    {
      gtk_gesture_drag_get_start_point (gesture, &x0, &y0);
      pick_event (self, x0 + dx, y0 + dy, SURFACE_RELEASED);
    }
}

static gboolean
scroll_cb (GtkEventControllerScroll *controller,
           double                    dx,
           double                    dy,
           DfSurfaceView            *self)
{
  df_camera_zoom (&self->camera, pow (1.12, dy));
  /* A wheel sends no "end": the motion ends a moment after the last notch. */
  set_moving (self, TRUE);
  g_clear_handle_id (&self->settle_id, g_source_remove);
  self->settle_id = g_timeout_add (180, settle_cb, self);
  gtk_gl_area_queue_render (GTK_GL_AREA (self));
  return TRUE;
}

static void
orbit_action (GtkWidget  *widget,
              const char *action_name,
              GVariant   *parameter)
{
  DfSurfaceView *self = DF_SURFACE_VIEW (widget);
  double yaw, pitch;

  g_variant_get (parameter, "(dd)", &yaw, &pitch);
  df_camera_orbit (&self->camera, glm_rad (yaw), glm_rad (pitch));
  gtk_gl_area_queue_render (GTK_GL_AREA (self));
}

static void
zoom_action (GtkWidget  *widget,
             const char *action_name,
             GVariant   *parameter)
{
  DfSurfaceView *self = DF_SURFACE_VIEW (widget);

  df_camera_zoom (&self->camera, g_variant_get_double (parameter));
  gtk_gl_area_queue_render (GTK_GL_AREA (self));
}

static void
fit_all_action (GtkWidget  *widget,
                const char *action_name,
                GVariant   *parameter)
{
  df_surface_view_fit_all (DF_SURFACE_VIEW (widget));
}

static void
standard_view_action (GtkWidget  *widget,
                      const char *action_name,
                      GVariant   *parameter)
{
  static const char *const names[] = { "iso", "top", "front", "side" };
  const char *name = g_variant_get_string (parameter, NULL);

  for (guint i = 0; i < G_N_ELEMENTS (names); i++)
    if (g_str_equal (name, names[i]))
      df_surface_view_set_standard_view (DF_SURFACE_VIEW (widget), (DfStandardView) i);
}

static void
add_drag (DfSurfaceView *self,
          guint          button)
{
  GtkGesture *drag = gtk_gesture_drag_new ();

  gtk_gesture_single_set_button (GTK_GESTURE_SINGLE (drag), button);
  g_signal_connect (drag, "drag-begin", G_CALLBACK (drag_begin_cb), self);
  g_signal_connect (drag, "drag-update", G_CALLBACK (drag_update_cb), self);
  g_signal_connect (drag, "drag-end", G_CALLBACK (drag_end_cb), self);
  gtk_widget_add_controller (GTK_WIDGET (self), GTK_EVENT_CONTROLLER (drag));
}

void
_df_surface_view_input_class_init (GtkWidgetClass *widget_class)
{
  gtk_widget_class_install_action (widget_class, "view.orbit", "(dd)", orbit_action);
  gtk_widget_class_install_action (widget_class, "view.zoom", "d", zoom_action);
  gtk_widget_class_install_action (widget_class, "view.fit-all", NULL, fit_all_action);
  gtk_widget_class_install_action (widget_class, "view.standard-view", "s",
                                   standard_view_action);

  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_Left, 0, "view.orbit", "(dd)",
                                       10.0, 0.0);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_Right, 0, "view.orbit", "(dd)",
                                       -10.0, 0.0);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_Up, 0, "view.orbit", "(dd)",
                                       0.0, -10.0);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_Down, 0, "view.orbit", "(dd)",
                                       0.0, 10.0);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_plus, 0, "view.zoom", "d", 0.8);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_equal, 0, "view.zoom", "d", 0.8);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_KP_Add, 0, "view.zoom", "d", 0.8);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_minus, 0, "view.zoom", "d", 1.25);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_KP_Subtract, 0, "view.zoom", "d",
                                       1.25);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_Home, 0, "view.fit-all", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_KP_Home, 0, "view.fit-all", NULL);
}

void
_df_surface_view_input_init (DfSurfaceView *self)
{
  GtkEventController *scroll;

  add_drag (self, GDK_BUTTON_PRIMARY);
  add_drag (self, GDK_BUTTON_MIDDLE);
  add_drag (self, GDK_BUTTON_SECONDARY);
  scroll = gtk_event_controller_scroll_new (GTK_EVENT_CONTROLLER_SCROLL_VERTICAL);
  g_signal_connect (scroll, "scroll", G_CALLBACK (scroll_cb), self);
  gtk_widget_add_controller (GTK_WIDGET (self), scroll);
}
