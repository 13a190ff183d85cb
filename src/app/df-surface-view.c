/* df-surface-view.c: DfSurfaceView, the GtkGLArea that shows the surface mesh (built by the core
 * in df-mesh on a worker thread) with overlay curves, frames, arrows and a marker. This file
 * holds the widget (properties, signals, GL vfuncs) and its public setters; the mesh hand-over
 * is in df-surface-view-mesh.c, input and picking in df-surface-view-input.c, offscreen images
 * and the orbit benchmark in df-surface-view-capture.c, drawing in df-surface-view-gl.c and
 * the overlay vertex arrays in df-surface-view-overlay.c. Geometry comes from the core. */
#include "df-surface-view-private.h"

#include <epoxy/gl.h>
#include <math.h>
#include <stdlib.h>

#include "df-gl-program.h"

GParamSpec *_df_surface_view_properties[DF_SURFACE_VIEW_N_PROPS];
guint _df_surface_view_signals[DF_SURFACE_VIEW_N_SIGNALS];

G_DEFINE_FINAL_TYPE (DfSurfaceView, df_surface_view, GTK_TYPE_GL_AREA)

/* ---- GL vfuncs -------------------------------------------------------------------------- */

static void
fail_gl (DfSurfaceView *self,
         GError        *error)
{
  g_warning ("3D view: %s", error->message);
  g_signal_emit (self, _df_surface_view_signals[GL_FAILED], 0, error->message);
  gtk_gl_area_set_error (GTK_GL_AREA (self), error);
}

static void
df_surface_view_realize (GtkWidget *widget)
{
  DfSurfaceView *self = DF_SURFACE_VIEW (widget);
  GtkGLArea *area = GTK_GL_AREA (widget);
  g_autoptr (GError) error = NULL;
  GdkGLContext *context;
  int major = 0, minor = 0;

  GTK_WIDGET_CLASS (df_surface_view_parent_class)->realize (widget);
  gtk_gl_area_make_current (area);
  if (gtk_gl_area_get_error (area) != NULL)
    {
      g_warning ("3D view: %s", gtk_gl_area_get_error (area)->message);
      g_signal_emit (self, _df_surface_view_signals[GL_FAILED], 0, gtk_gl_area_get_error (area)->message);
      return;
    }
  context = gtk_gl_area_get_context (area);
  gdk_gl_context_get_version (context, &major, &minor);
  if (gdk_gl_context_get_use_es (context) || major < 3 || (major == 3 && minor < 3))
    {
      g_set_error (&error, DF_GL_PROGRAM_ERROR, DF_GL_PROGRAM_ERROR_VERSION,
                   "The 3D view needs desktop OpenGL 3.3 core or newer; this system offers "
                   "%s %d.%d",
                   gdk_gl_context_get_use_es (context) ? "OpenGL ES" : "OpenGL", major, minor);
      fail_gl (self, error);
      return;
    }

  if (!_df_surface_view_gl_create (&self->gl, &error)
      || !_df_surface_view_points_create (&self->points, &error))
    {
      fail_gl (self, error);
      return;
    }
  self->mesh_dirty = TRUE;
  self->overlay_dirty = TRUE;
}

static void
df_surface_view_unrealize (GtkWidget *widget)
{
  DfSurfaceView *self = DF_SURFACE_VIEW (widget);
  GtkGLArea *area = GTK_GL_AREA (widget);

  if (gtk_gl_area_get_context (area) != NULL)
    {
      gtk_gl_area_make_current (area);
      _df_surface_view_gl_delete (&self->gl);
      _df_surface_view_points_delete (&self->points);
    }
  GTK_WIDGET_CLASS (df_surface_view_parent_class)->unrealize (widget);
}

static gboolean
df_surface_view_render (GtkGLArea    *area,
                        GdkGLContext *context)
{
  DfSurfaceView *self = DF_SURFACE_VIEW (area);
  gint64 start;

  if (gtk_gl_area_get_error (area) != NULL)
    return FALSE;
  start = g_get_monotonic_time ();
  _df_surface_view_gl_upload (self);
  /* The full mesh always: with GTK's cairo renderer on a software driver (df-gl-renderer.c)
   * it orbits at the display's rate, and a coarser mesh while moving let loops drawn on the
   * full surface dip behind it. */
  _df_surface_view_gl_draw (self, self->fb_width, self->fb_height, FALSE);
  if (self->bench != NULL)
    {
      gint64 now, spent;
      /* Wait for the software rasterizer so each stamp marks a finished frame. */
      glFinish ();
      now = g_get_monotonic_time ();
      spent = now - start;
      g_array_append_val (self->bench->stamps, now);
      g_array_append_val (self->bench->render_us, spent);
    }
  return TRUE;
}

static void
df_surface_view_resize (GtkGLArea *area,
                        int        width,
                        int        height)
{
  DfSurfaceView *self = DF_SURFACE_VIEW (area);

  self->fb_width = width;
  self->fb_height = height;
  self->camera.aspect = height > 0 ? (float) width / height : 1;
  if (self->fit_pending)
    df_surface_view_fit_all (self);
  GTK_GL_AREA_CLASS (df_surface_view_parent_class)->resize (area, width, height);
}

/* ---- GObject ---------------------------------------------------------------------------- */

static void
df_surface_view_dispose (GObject *object)
{
  DfSurfaceView *self = DF_SURFACE_VIEW (object);

  g_clear_handle_id (&self->settle_id, g_source_remove);
  /* A build still running will find its generation stale and drop its result. */
  self->generation++;
  self->rebuild_pending = FALSE;
  if (self->bench != NULL)
    {
      gtk_widget_remove_tick_callback (GTK_WIDGET (self), self->bench->tick_id);
      g_clear_pointer (&self->bench, _df_surface_view_benchmark_free);
    }
  g_clear_pointer (&self->bench_report, _df_surface_view_benchmark_free);
  g_clear_pointer (&self->surface, df_surface_free);
  g_clear_pointer (&self->mesh, _df_surface_view_mesh_data_free);
  G_OBJECT_CLASS (df_surface_view_parent_class)->dispose (object);
}

static void
df_surface_view_finalize (GObject *object)
{
  DfSurfaceView *self = DF_SURFACE_VIEW (object);

  g_clear_pointer (&self->curves, g_hash_table_unref);
  g_clear_pointer (&self->arrows, g_hash_table_unref);
  g_clear_pointer (&self->frames, g_free);
  _df_surface_view_field_free (self);
  g_clear_pointer (&self->line_data, g_array_unref);
  g_clear_pointer (&self->net, g_array_unref);
  g_clear_pointer (&self->solid_data, g_array_unref);
  _df_surface_view_points_clear (&self->points);
  G_OBJECT_CLASS (df_surface_view_parent_class)->finalize (object);
}

static void
df_surface_view_get_property (GObject    *object,
                              guint       prop_id,
                              GValue     *value,
                              GParamSpec *pspec)
{
  DfSurfaceView *self = DF_SURFACE_VIEW (object);

  switch (prop_id)
    {
    case PROP_SHADING:
      g_value_set_int (value, self->shading);
      break;
    case PROP_ISO_LINES:
      g_value_set_boolean (value, self->iso_lines);
      break;
    case PROP_INTERACTION:
      g_value_set_int (value, self->interaction);
      break;
    case PROP_BUSY:
      g_value_set_boolean (value, self->building);
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
    }
}

static void
df_surface_view_set_property (GObject      *object,
                              guint         prop_id,
                              const GValue *value,
                              GParamSpec   *pspec)
{
  DfSurfaceView *self = DF_SURFACE_VIEW (object);

  switch (prop_id)
    {
    case PROP_SHADING:
      df_surface_view_set_shading (self, g_value_get_int (value));
      break;
    case PROP_ISO_LINES:
      df_surface_view_set_iso_lines (self, g_value_get_boolean (value));
      break;
    case PROP_INTERACTION:
      df_surface_view_set_interaction (self, g_value_get_int (value));
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
    }
}

static void
df_surface_view_class_init (DfSurfaceViewClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);
  GtkGLAreaClass *area_class = GTK_GL_AREA_CLASS (klass);

  object_class->dispose = df_surface_view_dispose;
  object_class->finalize = df_surface_view_finalize;
  object_class->get_property = df_surface_view_get_property;
  object_class->set_property = df_surface_view_set_property;
  widget_class->realize = df_surface_view_realize;
  widget_class->unrealize = df_surface_view_unrealize;
  area_class->render = df_surface_view_render;
  area_class->resize = df_surface_view_resize;

  _df_surface_view_properties[PROP_SHADING] =
    g_param_spec_int ("shading", NULL, NULL, DF_SHADING_PLAIN, DF_SHADING_MEAN,
                      DF_SHADING_GAUSSIAN,
                      G_PARAM_READWRITE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  _df_surface_view_properties[PROP_ISO_LINES] =
    g_param_spec_boolean ("iso-lines", NULL, NULL, TRUE,
                          G_PARAM_READWRITE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  _df_surface_view_properties[PROP_INTERACTION] =
    g_param_spec_int ("interaction", NULL, NULL, DF_INTERACTION_ORBIT, DF_INTERACTION_PICK,
                      DF_INTERACTION_ORBIT,
                      G_PARAM_READWRITE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  _df_surface_view_properties[PROP_BUSY] =
    g_param_spec_boolean ("busy", NULL, NULL, FALSE,
                          G_PARAM_READABLE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  g_object_class_install_properties (object_class, DF_SURFACE_VIEW_N_PROPS,
                                     _df_surface_view_properties);

  _df_surface_view_signals[SURFACE_PRESSED] =
    g_signal_new ("surface-pressed", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0, NULL,
                  NULL, NULL, G_TYPE_NONE, 2, G_TYPE_DOUBLE, G_TYPE_DOUBLE);
  _df_surface_view_signals[SURFACE_DRAGGED] =
    g_signal_new ("surface-dragged", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0, NULL,
                  NULL, NULL, G_TYPE_NONE, 2, G_TYPE_DOUBLE, G_TYPE_DOUBLE);
  _df_surface_view_signals[SURFACE_RELEASED] =
    g_signal_new ("surface-released", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0, NULL,
                  NULL, NULL, G_TYPE_NONE, 2, G_TYPE_DOUBLE, G_TYPE_DOUBLE);
  _df_surface_view_signals[SHADING_RANGE_CHANGED] =
    g_signal_new ("shading-range-changed", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0,
                  NULL, NULL, NULL, G_TYPE_NONE, 2, G_TYPE_DOUBLE, G_TYPE_DOUBLE);
  _df_surface_view_signals[MESH_READY] =
    g_signal_new ("mesh-ready", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0, NULL, NULL,
                  NULL, G_TYPE_NONE, 0);
  _df_surface_view_signals[GL_FAILED] =
    g_signal_new ("gl-failed", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0, NULL, NULL,
                  NULL, G_TYPE_NONE, 1, G_TYPE_STRING);

  _df_surface_view_input_class_init (widget_class);

  gtk_widget_class_set_css_name (widget_class, "surfaceview");
}

static void
df_surface_view_init (DfSurfaceView *self)
{
  gtk_gl_area_set_required_version (GTK_GL_AREA (self), 3, 3);
  gtk_gl_area_set_has_depth_buffer (GTK_GL_AREA (self), TRUE);
  gtk_widget_set_focusable (GTK_WIDGET (self), TRUE);
  gtk_widget_set_focus_on_click (GTK_WIDGET (self), TRUE);
  gtk_widget_set_hexpand (GTK_WIDGET (self), TRUE);
  gtk_widget_set_vexpand (GTK_WIDGET (self), TRUE);
  gtk_widget_set_size_request (GTK_WIDGET (self), 200, 160);

  df_camera_init (&self->camera);
  self->shading = DF_SHADING_GAUSSIAN;
  self->iso_lines = TRUE;
  self->interaction = DF_INTERACTION_ORBIT;
  self->curves = g_hash_table_new_full (NULL, NULL, NULL, (GDestroyNotify) _df_surface_view_curve_free);
  self->arrows = g_hash_table_new_full (NULL, NULL, NULL, g_free);
  self->line_data = g_array_new (FALSE, FALSE, sizeof (float));
  self->solid_data = g_array_new (FALSE, FALSE, sizeof (float));

  _df_surface_view_input_init (self);
}
/* ---- public API ------------------------------------------------------------------------- */

GtkWidget *
df_surface_view_new (void)
{
  return g_object_new (DF_TYPE_SURFACE_VIEW, NULL);
}

void
df_surface_view_set_surface (DfSurfaceView    *self,
                             const df_surface *surface)
{
  g_return_if_fail (DF_IS_SURFACE_VIEW (self));

  g_clear_pointer (&self->surface, df_surface_free);
  self->generation++;
  if (surface == NULL)
    {
      self->rebuild_pending = FALSE;
      _df_surface_view_install_mesh (self, NULL);
      return;
    }
  self->surface = df_surface_copy (surface);
  if (self->surface == NULL)
    {
      _df_surface_view_install_mesh (self, NULL);
      return;
    }
  _df_surface_view_start_mesh_build (self);
}

void
df_surface_view_fit_next_mesh (DfSurfaceView *self)
{
  g_return_if_fail (DF_IS_SURFACE_VIEW (self));
  self->fit_next_mesh = TRUE;
}

const df_surface *
df_surface_view_get_surface (DfSurfaceView *self)
{
  g_return_val_if_fail (DF_IS_SURFACE_VIEW (self), NULL);
  return self->surface;
}

gboolean
df_surface_view_get_busy (DfSurfaceView *self)
{
  g_return_val_if_fail (DF_IS_SURFACE_VIEW (self), FALSE);
  return self->building;
}

const char *
df_surface_view_get_mesh_problem (DfSurfaceView *self)
{
  g_return_val_if_fail (DF_IS_SURFACE_VIEW (self), NULL);
  return self->mesh != NULL ? self->mesh->problem : NULL;
}

void
df_surface_view_set_shading (DfSurfaceView *self,
                             DfShading      shading)
{
  g_return_if_fail (DF_IS_SURFACE_VIEW (self));
  g_return_if_fail (shading <= DF_SHADING_MEAN);

  if (self->shading == shading)
    return;
  self->shading = shading;
  g_object_notify_by_pspec (G_OBJECT (self), _df_surface_view_properties[PROP_SHADING]);
  _df_surface_view_emit_range_changed (self);
  gtk_gl_area_queue_render (GTK_GL_AREA (self));
}

DfShading
df_surface_view_get_shading (DfSurfaceView *self)
{
  g_return_val_if_fail (DF_IS_SURFACE_VIEW (self), DF_SHADING_PLAIN);
  return self->shading;
}

void
df_surface_view_set_iso_lines (DfSurfaceView *self,
                               gboolean       show)
{
  g_return_if_fail (DF_IS_SURFACE_VIEW (self));

  show = !!show;
  if (self->iso_lines == show)
    return;
  self->iso_lines = show;
  g_object_notify_by_pspec (G_OBJECT (self), _df_surface_view_properties[PROP_ISO_LINES]);
  gtk_gl_area_queue_render (GTK_GL_AREA (self));
}

void
df_surface_view_set_curve (DfSurfaceView  *self,
                           guint           id,
                           const double  (*xyz)[3],
                           gsize           n,
                           gboolean        closed,
                           const GdkRGBA  *colour,
                           float           width)
{
  static const GdkRGBA fallback = { 0.1f, 0.1f, 0.1f, 1 };
  Curve *curve;

  g_return_if_fail (DF_IS_SURFACE_VIEW (self));
  g_return_if_fail (xyz != NULL || n == 0);

  curve = g_new0 (Curve, 1);
  curve->xyz = g_memdup2 (xyz, n * sizeof *xyz);
  curve->n = n;
  curve->closed = closed;
  curve->colour = colour != NULL ? *colour : fallback;
  curve->width = width > 0 && isfinite (width) ? width : 2;
  g_hash_table_replace (self->curves, GUINT_TO_POINTER (id), curve);
  _df_surface_view_rebuild_overlay (self);
}

void
df_surface_view_remove_curve (DfSurfaceView *self,
                              guint          id)
{
  g_return_if_fail (DF_IS_SURFACE_VIEW (self));

  if (g_hash_table_remove (self->curves, GUINT_TO_POINTER (id)))
    _df_surface_view_rebuild_overlay (self);
}

void
df_surface_view_clear_curves (DfSurfaceView *self)
{
  g_return_if_fail (DF_IS_SURFACE_VIEW (self));

  g_hash_table_remove_all (self->curves);
  _df_surface_view_rebuild_overlay (self);
}

void
df_surface_view_set_frames (DfSurfaceView  *self,
                            const double  (*origin)[3],
                            const double  (*vec)[3],
                            const double  (*partner)[3],
                            gsize           n)
{
  g_return_if_fail (DF_IS_SURFACE_VIEW (self));
  g_return_if_fail (n == 0 || (origin != NULL && vec != NULL && partner != NULL));

  g_clear_pointer (&self->frames, g_free);
  self->n_frames = n;
  if (n > 0)
    {
      self->frames = g_new (double, 9 * n);
      for (gsize i = 0; i < n; i++)
        for (int a = 0; a < 3; a++)
          {
            self->frames[9 * i + a] = origin[i][a];
            self->frames[9 * i + 3 + a] = vec[i][a];
            self->frames[9 * i + 6 + a] = partner[i][a];
          }
    }
  _df_surface_view_rebuild_overlay (self);
}

void
df_surface_view_set_arrow (DfSurfaceView *self,
                           guint          id,
                           const double   origin[3],
                           const double   dir[3],
                           const GdkRGBA *colour)
{
  static const GdkRGBA fallback = { 0.1f, 0.1f, 0.1f, 1 };
  Arrow *arrow;

  g_return_if_fail (DF_IS_SURFACE_VIEW (self));
  g_return_if_fail (origin != NULL && dir != NULL);

  arrow = g_new0 (Arrow, 1);
  memcpy (arrow->origin, origin, sizeof arrow->origin);
  memcpy (arrow->dir, dir, sizeof arrow->dir);
  arrow->colour = colour != NULL ? *colour : fallback;
  g_hash_table_replace (self->arrows, GUINT_TO_POINTER (id), arrow);
  _df_surface_view_rebuild_overlay (self);
}

void
df_surface_view_remove_arrow (DfSurfaceView *self,
                              guint          id)
{
  g_return_if_fail (DF_IS_SURFACE_VIEW (self));

  if (g_hash_table_remove (self->arrows, GUINT_TO_POINTER (id)))
    _df_surface_view_rebuild_overlay (self);
}

void
df_surface_view_set_marker (DfSurfaceView *self,
                            const double  *xyz,
                            const GdkRGBA *colour)
{
  static const GdkRGBA fallback = { 0.95f, 0.80f, 0.10f, 1 };

  g_return_if_fail (DF_IS_SURFACE_VIEW (self));

  self->has_marker = xyz != NULL && isfinite (xyz[0]) && isfinite (xyz[1]) && isfinite (xyz[2]);
  if (self->has_marker)
    memcpy (self->marker, xyz, sizeof self->marker);
  self->marker_colour = colour != NULL ? *colour : fallback;
  _df_surface_view_rebuild_overlay (self);
}

void
df_surface_view_fit_all (DfSurfaceView *self)
{
  g_return_if_fail (DF_IS_SURFACE_VIEW (self));

  if (self->mesh != NULL && self->mesh->mesh != NULL)
    df_camera_fit_points (&self->camera, self->mesh->lo, self->mesh->hi, self->mesh->vertices,
                          df_mesh_n_vertices (self->mesh->mesh), SURFACE_STRIDE);
  else if (self->surface != NULL)
    {
      double dlo[3], dhi[3];
      float lo[3], hi[3];
      df_surface_get_bbox (self->surface, dlo, dhi);
      for (int i = 0; i < 3; i++)
        {
          lo[i] = dlo[i];
          hi[i] = dhi[i];
        }
      df_camera_fit (&self->camera, lo, hi);
    }
  /* The fit depends on the mesh's box and the view's aspect: redo it when either arrives. */
  self->fit_pending = self->mesh == NULL || self->mesh->mesh == NULL || self->fb_width <= 0;
  gtk_gl_area_queue_render (GTK_GL_AREA (self));
}

void
df_surface_view_set_standard_view (DfSurfaceView  *self,
                                   DfStandardView  view)
{
  g_return_if_fail (DF_IS_SURFACE_VIEW (self));

  /* Top: x right, y up. Front: from -y, x right, z up. Side: from +x, y right, z up. */
  switch (view)
    {
    case DF_VIEW_TOP:
      df_camera_set_angles (&self->camera, glm_rad (-90), glm_rad (90));
      break;
    case DF_VIEW_FRONT:
      df_camera_set_angles (&self->camera, glm_rad (-90), 0);
      break;
    case DF_VIEW_SIDE:
      df_camera_set_angles (&self->camera, 0, 0);
      break;
    case DF_VIEW_ISO:
    default:
      df_camera_set_angles (&self->camera, glm_rad (-55), glm_rad (28));
      break;
    }
  df_surface_view_fit_all (self);
}

void
df_surface_view_set_interaction (DfSurfaceView *self,
                                 DfInteraction  mode)
{
  g_return_if_fail (DF_IS_SURFACE_VIEW (self));
  g_return_if_fail (mode <= DF_INTERACTION_PICK);

  if (self->interaction == mode)
    return;
  self->interaction = mode;
  self->pick_active = FALSE;
  gtk_widget_set_cursor_from_name (GTK_WIDGET (self),
                                   mode == DF_INTERACTION_PICK ? "crosshair" : NULL);
  g_object_notify_by_pspec (G_OBJECT (self), _df_surface_view_properties[PROP_INTERACTION]);
}

DfInteraction
df_surface_view_get_interaction (DfSurfaceView *self)
{
  g_return_val_if_fail (DF_IS_SURFACE_VIEW (self), DF_INTERACTION_ORBIT);
  return self->interaction;
}

void
df_surface_view_get_shading_range (DfSurfaceView *self,
                                   double        *lo,
                                   double        *hi)
{
  double a, b;

  g_return_if_fail (DF_IS_SURFACE_VIEW (self));
  _df_surface_view_mesh_shade_range (self, &a, &b);
  if (lo != NULL)
    *lo = a;
  if (hi != NULL)
    *hi = b;
}

void
df_surface_view_get_shading_clipped (DfSurfaceView *self,
                                     gboolean      *below,
                                     gboolean      *above)
{
  gboolean lo = FALSE, hi = FALSE;

  g_return_if_fail (DF_IS_SURFACE_VIEW (self));

  if (self->mesh != NULL && self->mesh->mesh != NULL && self->shading != DF_SHADING_PLAIN)
    {
      int q = self->shading == DF_SHADING_MEAN;
      lo = self->mesh->below[q];
      hi = self->mesh->above[q];
    }
  if (below != NULL)
    *below = lo;
  if (above != NULL)
    *above = hi;
}

gboolean
df_surface_view_project_point (DfSurfaceView *self,
                               const double   xyz[3],
                               int            width,
                               int            height,
                               double        *px,
                               double        *py)
{
  mat4 view, proj, vp;
  vec4 p = { (float) xyz[0], (float) xyz[1], (float) xyz[2], 1.0f }, clip;

  g_return_val_if_fail (DF_IS_SURFACE_VIEW (self), FALSE);
  df_camera_view (&self->camera, view);
  df_camera_projection (&self->camera, height > 0 ? (float) width / height : 1, proj);
  glm_mat4_mul (proj, view, vp);
  glm_mat4_mulv (vp, p, clip);
  if (clip[3] <= 1e-6f)
    return FALSE;
  *px = (clip[0] / clip[3] * 0.5 + 0.5) * width;
  *py = (0.5 - clip[1] / clip[3] * 0.5) * height;
  return TRUE;
}

void
df_surface_view_get_eye (DfSurfaceView *self,
                         double         eye[3])
{
  vec3 e;

  g_return_if_fail (DF_IS_SURFACE_VIEW (self));
  df_camera_get_eye (&self->camera, e);
  for (int i = 0; i < 3; i++)
    eye[i] = e[i];
}

void
df_surface_view_set_angles (DfSurfaceView *self,
                            double         yaw_deg,
                            double         pitch_deg)
{
  g_return_if_fail (DF_IS_SURFACE_VIEW (self));
  if (!isfinite (yaw_deg) || !isfinite (pitch_deg))
    return;
  df_camera_set_angles (&self->camera, (float) (yaw_deg * G_PI / 180.0),
                        (float) (pitch_deg * G_PI / 180.0));
  gtk_gl_area_queue_render (GTK_GL_AREA (self));
}

void
df_surface_view_get_angles (DfSurfaceView *self,
                            double        *yaw_deg,
                            double        *pitch_deg)
{
  g_return_if_fail (DF_IS_SURFACE_VIEW (self));
  *yaw_deg = self->camera.yaw * 180.0 / G_PI;
  *pitch_deg = self->camera.pitch * 180.0 / G_PI;
}
