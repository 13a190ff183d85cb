/* df-surface-view.c: DfSurfaceView, the GtkGLArea that shows the surface mesh (built by the core
 * in df-mesh on a worker thread) with overlay curves, frames, arrows and a marker, and turns
 * pointer input into camera moves or picked chart points. This file holds the widget, its API,
 * input, picking and the mesh hand-over; drawing is in df-surface-view-gl.c and the overlay
 * vertex arrays in df-surface-view-overlay.c. Geometry comes from the core. */
#include "df-surface-view-private.h"
#include "df-work-guard.h"

#include <epoxy/gl.h>
#include <math.h>
#include <stdlib.h>

#include "df-geometry.h"
#include "df-gl-program.h"
#include "df-io-error.h"
#include "df-project.h"

enum
{
  PROP_0,
  PROP_SHADING,
  PROP_ISO_LINES,
  PROP_INTERACTION,
  PROP_BUSY,
  N_PROPS
};

enum
{
  SURFACE_PRESSED,
  SURFACE_DRAGGED,
  SURFACE_RELEASED,
  SHADING_RANGE_CHANGED,
  MESH_READY,
  GL_FAILED,
  N_SIGNALS
};

static GParamSpec *properties[N_PROPS];
static guint signals[N_SIGNALS];

G_DEFINE_FINAL_TYPE (DfSurfaceView, df_surface_view, GTK_TYPE_GL_AREA)

static void
benchmark_free (Benchmark *bench)
{
  g_array_unref (bench->stamps);
  g_array_unref (bench->render_us);
  g_free (bench);
}

/* ---- mesh data (worker thread) ---------------------------------------------------------- */

static void
mesh_data_free (MeshData *data)
{
  if (data == NULL)
    return;
  df_mesh_free (data->mesh);
  g_free (data->vertices);
  free (data->coarse);
  g_free (data->problem);
  g_free (data);
}

/* 1, 2 or 5 times a power of ten, near range / 10: iso-line spacing a reader can count in. */
static double
nice_step (double range)
{
  double raw = range / 10, mag, f;

  if (!(raw > 0) || !isfinite (raw))
    return 1;
  mag = pow (10, floor (log10 (raw)));
  f = raw / mag;
  return mag * (f < 1.5 ? 1 : f < 3.5 ? 2 : f < 7.5 ? 5 : 10);
}

static MeshData *
mesh_data_build (const df_surface *surface)
{
  MeshData *data = g_new0 (MeshData, 1);
  double lo[3], hi[3], u_min, u_max, v_min, v_max;
  const double *x, *n, *uv, *k, *h;
  const df_diag *problem;
  df_status status;
  df_diag diag;
  gsize count;

  status = df_mesh_build (surface, NULL, &data->mesh, &diag);
  if (status != DF_OK)
    {
      g_autoptr (GError) error = NULL;
      df_status_to_gerror (status, &diag, &error);
      data->problem = g_strdup_printf ("The surface cannot be drawn: %s", error->message);
      return data;
    }
  problem = df_mesh_problem (data->mesh);
  if (problem != NULL)
    data->problem = g_strdup_printf ("Part of the surface is not drawn: it cannot be evaluated "
                                     "at u = %.6g, v = %.6g%s%s and %zu other grid points",
                                     problem->u, problem->v, problem->detail[0] ? ": " : "",
                                     problem->detail, df_mesh_n_invalid (data->mesh) - 1);

  df_mesh_get_bbox (data->mesh, lo, hi);
  for (int i = 0; i < 3; i++)
    {
      data->lo[i] = lo[i];
      data->hi[i] = hi[i];
    }
  data->size = sqrt ((hi[0] - lo[0]) * (hi[0] - lo[0]) + (hi[1] - lo[1]) * (hi[1] - lo[1])
                     + (hi[2] - lo[2]) * (hi[2] - lo[2]));
  if (!(data->size > 0))
    data->size = 1;

  /* The colour scale spans 99 % of the area: a cone apex or a cusp rim, where curvature
   * diverges on a sliver, would otherwise wash everything else out to white. Values that are
   * rounding noise on a developable or minimal surface (|K| size^2, |H| size below 1e-9) give
   * an empty range: all white, not speckled. */
  for (int q = 0; q < 2; q++)
    {
      df_mesh_quantity which = q == 0 ? DF_MESH_GAUSSIAN : DF_MESH_MEAN;
      const double *values = q == 0 ? df_mesh_gaussian (data->mesh) : df_mesh_mean (data->mesh);
      const uint8_t *valid = df_mesh_valid (data->mesh);
      double max = q == 0 ? df_mesh_max_abs_k (data->mesh) : df_mesh_max_abs_h (data->mesh);
      double scale = q == 0 ? data->size * data->size : data->size;
      double range = df_mesh_abs_quantile (data->mesh, which, 0.99);
      if (!(range * scale > 1e-9))
        range = max * scale > 1e-9 ? max : 0;
      data->range[q] = range;
      for (gsize i = 0; range > 0 && i < df_mesh_n_vertices (data->mesh); i++)
        if (valid[i])
          {
            data->below[q] |= values[i] < -range * (1 + 1e-6);
            data->above[q] |= values[i] > range * (1 + 1e-6);
          }
    }

  df_surface_get_domain (surface, &u_min, &u_max, &v_min, &v_max);
  data->iso_step[0] = nice_step (u_max - u_min);
  /* Meridians of a surface of revolution every 15 degrees, a division the trade reads. */
  data->iso_step[1] = df_surface_v_periodic (surface) ? G_PI / 12 : nice_step (v_max - v_min);

  /* No coarse mesh while moving any more (see df_surface_view_render). */
  data->coarse = NULL;
  data->n_coarse = 0;

  count = df_mesh_n_vertices (data->mesh);
  x = df_mesh_positions (data->mesh);
  n = df_mesh_normals (data->mesh);
  uv = df_mesh_uv (data->mesh);
  k = df_mesh_gaussian (data->mesh);
  h = df_mesh_mean (data->mesh);
  data->vertices = g_new (float, SURFACE_STRIDE * count);
  for (gsize i = 0; i < count; i++)
    {
      float *out = &data->vertices[SURFACE_STRIDE * i];
      for (int a = 0; a < 3; a++)
        {
          out[a] = x[3 * i + a];
          out[3 + a] = n[3 * i + a];
        }
      out[6] = uv[2 * i];
      out[7] = uv[2 * i + 1];
      out[8] = k[i];
      out[9] = h[i];
    }
  return data;
}

static void
build_job_free (BuildJob *job)
{
  df_surface_free (job->surface);
  g_free (job);
}

typedef struct
{
  const df_surface *surface;
  MeshData         *data;
} GuardedBuild;

static void
mesh_build_guarded (gpointer user_data)
{
  GuardedBuild *build = user_data;

  build->data = mesh_data_build (build->surface);
}

static void
mesh_build_thread (GTask        *task,
                   gpointer      source,
                   gpointer      task_data,
                   GCancellable *cancellable)
{
  BuildJob *job = task_data;
  GuardedBuild build = { job->surface, NULL };
  g_autoptr (GError) error = NULL;

  /* A crash while meshing (a degenerate surface the core mishandles) leaves an empty mesh
   * with the reason, shown like any other "cannot be drawn". */
  if (!df_guard_call (mesh_build_guarded, &build, "drawing the surface", &error))
    {
      build.data = g_new0 (MeshData, 1);
      build.data->problem = g_strdup_printf ("The surface cannot be drawn: %s", error->message);
    }
  g_task_return_pointer (task, build.data, (GDestroyNotify) mesh_data_free);
}

static void start_mesh_build (DfSurfaceView *self);

double
_df_surface_view_mesh_range (DfSurfaceView *self)
{
  if (self->mesh == NULL || self->mesh->mesh == NULL)
    return 0;
  switch (self->shading)
    {
    case DF_SHADING_GAUSSIAN:
      return self->mesh->range[0];
    case DF_SHADING_MEAN:
      return self->mesh->range[1];
    case DF_SHADING_PLAIN:
    default:
      return 0;
    }
}

static void
emit_range_changed (DfSurfaceView *self)
{
  double m = _df_surface_view_mesh_range (self);

  g_signal_emit (self, signals[SHADING_RANGE_CHANGED], 0, -m, m);
}

static void
install_mesh (DfSurfaceView *self,
              MeshData      *data)
{
  g_clear_pointer (&self->mesh, mesh_data_free);
  self->mesh = data;
  self->mesh_dirty = TRUE;
  if (data != NULL && data->mesh != NULL
      && (!self->camera.fitted || self->fit_pending || self->fit_next_mesh))
    {
      self->fit_next_mesh = FALSE;
      df_surface_view_fit_all (self);
    }
  if (data != NULL && data->problem != NULL)
    g_debug ("%s", data->problem);
  _df_surface_view_rebuild_overlay (self);
  emit_range_changed (self);
  g_signal_emit (self, signals[MESH_READY], 0);
  gtk_gl_area_queue_render (GTK_GL_AREA (self));
}

static void
mesh_build_done_cb (GObject      *source,
                    GAsyncResult *result,
                    gpointer      user_data)
{
  DfSurfaceView *self = DF_SURFACE_VIEW (source);
  BuildJob *job = g_task_get_task_data (G_TASK (result));
  MeshData *data = g_task_propagate_pointer (G_TASK (result), NULL);

  self->building = FALSE;
  if (job->generation == self->generation)
    install_mesh (self, data);
  else
    mesh_data_free (data);

  if (self->rebuild_pending && self->surface != NULL)
    start_mesh_build (self);
  else
    g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_BUSY]);
}

/* One build at a time: requests that arrive meanwhile collapse into one follow-up build of the
 * newest surface, so dragging a parameter slider cannot queue up stale work. */
static void
start_mesh_build (DfSurfaceView *self)
{
  g_autoptr (GTask) task = NULL;
  BuildJob *job;
  gboolean was_busy = self->building;

  if (self->building)
    {
      self->rebuild_pending = TRUE;
      return;
    }
  self->rebuild_pending = FALSE;
  self->building = TRUE;
  job = g_new0 (BuildJob, 1);
  job->surface = df_surface_copy (self->surface);
  job->generation = self->generation;
  task = g_task_new (self, NULL, mesh_build_done_cb, NULL);
  g_task_set_source_tag (task, start_mesh_build);
  g_task_set_task_data (task, job, (GDestroyNotify) build_job_free);
  g_task_run_in_thread (task, mesh_build_thread);
  if (!was_busy)
    g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_BUSY]);
}

/* ---- GL vfuncs and benchmark ------------------------------------------------------------ */

static void
fail_gl (DfSurfaceView *self,
         GError        *error)
{
  g_warning ("3D view: %s", error->message);
  g_signal_emit (self, signals[GL_FAILED], 0, error->message);
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
      g_signal_emit (self, signals[GL_FAILED], 0, gtk_gl_area_get_error (area)->message);
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

  if (!_df_surface_view_gl_create (&self->gl, &error))
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
    }
  GTK_WIDGET_CLASS (df_surface_view_parent_class)->unrealize (widget);
}

static int
compare_double (gconstpointer a,
                gconstpointer b)
{
  double x = *(const double *) a, y = *(const double *) b;

  return (x > y) - (x < y);
}

static gboolean
benchmark_report_idle (gpointer user_data)
{
  DfSurfaceView *self = user_data;
  Benchmark *bench = g_steal_pointer (&self->bench_report);

  if (bench == NULL)
    return G_SOURCE_REMOVE;
  if (bench->done != NULL)
    bench->done (bench->median_ms, bench->p95_ms, bench->user);
  benchmark_free (bench);
  return G_SOURCE_REMOVE;
}

static void
benchmark_finish (DfSurfaceView *self)
{
  Benchmark *bench = g_steal_pointer (&self->bench);
  g_autoptr (GArray) times = g_array_new (FALSE, FALSE, sizeof (double));
  double median = 0, p95 = 0;

  if (bench->tick_id != 0)
    gtk_widget_remove_tick_callback (GTK_WIDGET (self), bench->tick_id);
  for (guint i = 1; i < bench->stamps->len; i++)
    {
      double ms = (g_array_index (bench->stamps, gint64, i)
                   - g_array_index (bench->stamps, gint64, i - 1)) / 1000.0;
      g_array_append_val (times, ms);
    }
  if (times->len > 0)
    {
      g_array_sort (times, compare_double);
      median = g_array_index (times, double, times->len / 2);
      p95 = g_array_index (times, double, MIN (times->len - 1, (guint) ceil (0.95 * times->len) - 1));
    }
  {
    /* The share of the frame spent drawing the scene (the rest is GTK compositing). */
    g_autoptr (GArray) render = g_array_new (FALSE, FALSE, sizeof (double));
    for (guint i = 0; i < bench->render_us->len; i++)
      {
        double ms = g_array_index (bench->render_us, gint64, i) / 1000.0;
        g_array_append_val (render, ms);
      }
    if (render->len > 0)
      {
        g_array_sort (render, compare_double);
        g_debug ("orbit benchmark: scene render median %.2f ms of a %.2f ms frame (%d x %d px)",
                 g_array_index (render, double, render->len / 2), median, self->fb_width,
                 self->fb_height);
      }
  }
  self->camera.yaw = bench->yaw0;
  gtk_gl_area_queue_render (GTK_GL_AREA (self));
  bench->median_ms = median;
  bench->p95_ms = p95;
  /* Report from an idle, holding a reference: the listener may well close the window, which
   * must not happen inside the frame clock's tick. */
  g_idle_add_full (G_PRIORITY_DEFAULT_IDLE, benchmark_report_idle, g_object_ref (self),
                   g_object_unref);
  self->bench_report = bench;
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

/* ---- picking ---------------------------------------------------------------------------- */

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
        g_signal_emit (self, signals[SURFACE_RELEASED], 0, self->last_u, self->last_v);
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
      g_signal_emit (self, signals[SURFACE_PRESSED], 0, u, v);
    }
  else
    g_signal_emit (self, signals[SURFACE_DRAGGED], 0, u, v);
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
      g_clear_pointer (&self->bench, benchmark_free);
    }
  g_clear_pointer (&self->bench_report, benchmark_free);
  g_clear_pointer (&self->surface, df_surface_free);
  g_clear_pointer (&self->mesh, mesh_data_free);
  G_OBJECT_CLASS (df_surface_view_parent_class)->dispose (object);
}

static void
df_surface_view_finalize (GObject *object)
{
  DfSurfaceView *self = DF_SURFACE_VIEW (object);

  g_clear_pointer (&self->curves, g_hash_table_unref);
  g_clear_pointer (&self->arrows, g_hash_table_unref);
  g_clear_pointer (&self->frames, g_free);
  g_clear_pointer (&self->line_data, g_array_unref);
  g_clear_pointer (&self->solid_data, g_array_unref);
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

  properties[PROP_SHADING] =
    g_param_spec_int ("shading", NULL, NULL, DF_SHADING_PLAIN, DF_SHADING_MEAN,
                      DF_SHADING_GAUSSIAN,
                      G_PARAM_READWRITE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  properties[PROP_ISO_LINES] =
    g_param_spec_boolean ("iso-lines", NULL, NULL, TRUE,
                          G_PARAM_READWRITE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  properties[PROP_INTERACTION] =
    g_param_spec_int ("interaction", NULL, NULL, DF_INTERACTION_ORBIT, DF_INTERACTION_PICK,
                      DF_INTERACTION_ORBIT,
                      G_PARAM_READWRITE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  properties[PROP_BUSY] =
    g_param_spec_boolean ("busy", NULL, NULL, FALSE,
                          G_PARAM_READABLE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  g_object_class_install_properties (object_class, N_PROPS, properties);

  signals[SURFACE_PRESSED] =
    g_signal_new ("surface-pressed", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0, NULL,
                  NULL, NULL, G_TYPE_NONE, 2, G_TYPE_DOUBLE, G_TYPE_DOUBLE);
  signals[SURFACE_DRAGGED] =
    g_signal_new ("surface-dragged", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0, NULL,
                  NULL, NULL, G_TYPE_NONE, 2, G_TYPE_DOUBLE, G_TYPE_DOUBLE);
  signals[SURFACE_RELEASED] =
    g_signal_new ("surface-released", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0, NULL,
                  NULL, NULL, G_TYPE_NONE, 2, G_TYPE_DOUBLE, G_TYPE_DOUBLE);
  signals[SHADING_RANGE_CHANGED] =
    g_signal_new ("shading-range-changed", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0,
                  NULL, NULL, NULL, G_TYPE_NONE, 2, G_TYPE_DOUBLE, G_TYPE_DOUBLE);
  signals[MESH_READY] =
    g_signal_new ("mesh-ready", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0, NULL, NULL,
                  NULL, G_TYPE_NONE, 0);
  signals[GL_FAILED] =
    g_signal_new ("gl-failed", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0, NULL, NULL,
                  NULL, G_TYPE_NONE, 1, G_TYPE_STRING);

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

  gtk_widget_class_set_css_name (widget_class, "surfaceview");
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

static void
df_surface_view_init (DfSurfaceView *self)
{
  GtkEventController *scroll;

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

  add_drag (self, GDK_BUTTON_PRIMARY);
  add_drag (self, GDK_BUTTON_MIDDLE);
  add_drag (self, GDK_BUTTON_SECONDARY);
  scroll = gtk_event_controller_scroll_new (GTK_EVENT_CONTROLLER_SCROLL_VERTICAL);
  g_signal_connect (scroll, "scroll", G_CALLBACK (scroll_cb), self);
  gtk_widget_add_controller (GTK_WIDGET (self), scroll);
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
      install_mesh (self, NULL);
      return;
    }
  self->surface = df_surface_copy (surface);
  if (self->surface == NULL)
    {
      install_mesh (self, NULL);
      return;
    }
  start_mesh_build (self);
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
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_SHADING]);
  emit_range_changed (self);
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
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_ISO_LINES]);
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
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_INTERACTION]);
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
  double m;

  g_return_if_fail (DF_IS_SURFACE_VIEW (self));
  m = _df_surface_view_mesh_range (self);
  if (lo != NULL)
    *lo = -m;
  if (hi != NULL)
    *hi = m;
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

cairo_surface_t *
df_surface_view_render_image (DfSurfaceView *self,
                              int            width,
                              int            height,
                              GError       **error)
{
  GtkGLArea *area;
  ViewGl *gl;
  cairo_surface_t *img;
  guchar *data, *dst;
  int w, h, dstride;

  g_return_val_if_fail (DF_IS_SURFACE_VIEW (self), NULL);
  area = GTK_GL_AREA (self);
  gl = &self->gl;
  w = width > 0 ? width : self->fb_width;
  h = height > 0 ? height : self->fb_height;
  if (!gtk_widget_get_realized (GTK_WIDGET (self)) || w <= 0 || h <= 0 || w > 8192 || h > 8192
      || gtk_gl_area_get_error (area) != NULL || gl->surface_program == 0
      || gl->lines_program == 0 || gl->solid_program == 0)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FILE,
                   "the 3D view is not showing anything to render");
      return NULL;
    }
  gtk_gl_area_make_current (area);
  data = g_malloc ((gsize) w * h * 4);
  if (!_df_surface_view_gl_read_pixels (self, w, h, data))
    {
      g_free (data);
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FILE,
                   "no offscreen framebuffer to render the view into");
      return NULL;
    }
  /* GL's RGBA rows run bottom-up; cairo's ARGB32 is native-endian premultiplied (opaque here). */
  img = cairo_image_surface_create (CAIRO_FORMAT_ARGB32, w, h);
  cairo_surface_flush (img);
  dst = cairo_image_surface_get_data (img);
  dstride = cairo_image_surface_get_stride (img);
  for (int y = 0; y < h; y++)
    {
      const guchar *src = data + (gsize) (h - 1 - y) * w * 4;
      guint32 *row = (guint32 *) (void *) (dst + (gsize) y * dstride);

      for (int x = 0; x < w; x++)
        row[x] = 0xff000000u | ((guint32) src[4 * x] << 16) | ((guint32) src[4 * x + 1] << 8)
                 | src[4 * x + 2];
    }
  cairo_surface_mark_dirty (img);
  g_free (data);
  return img;
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

gboolean
df_surface_view_save_png (DfSurfaceView *self,
                          const char    *path,
                          GError       **error)
{
  GtkGLArea *area;
  ViewGl *gl;
  int w, h;
  g_autoptr (GBytes) pixels = NULL;
  g_autoptr (GdkTexture) texture = NULL;
  g_autoptr (GBytes) png = NULL;
  guchar *data, *row;
  gsize stride;

  g_return_val_if_fail (DF_IS_SURFACE_VIEW (self), FALSE);
  g_return_val_if_fail (path != NULL, FALSE);

  area = GTK_GL_AREA (self);
  gl = &self->gl;
  w = self->fb_width;
  h = self->fb_height;
  stride = (gsize) w * 4;
  if (!gtk_widget_get_realized (GTK_WIDGET (self)) || w <= 0 || h <= 0
      || gtk_gl_area_get_error (area) != NULL || gl->surface_program == 0
      || gl->lines_program == 0 || gl->solid_program == 0)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FILE,
                   "Cannot save %s: the 3D view is not showing anything", path);
      return FALSE;
    }

  gtk_gl_area_make_current (area);
  data = g_malloc (stride * h);
  if (!_df_surface_view_gl_read_pixels (self, w, h, data))
    {
      g_free (data);
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FILE,
                   "Cannot save %s: no offscreen framebuffer to render into", path);
      return FALSE;
    }

  /* GL rows run bottom-up; PNG rows top-down. Alpha is forced opaque. */
  row = g_malloc (stride);
  for (int y = 0; y < h / 2; y++)
    {
      memcpy (row, data + y * stride, stride);
      memcpy (data + y * stride, data + (h - 1 - y) * stride, stride);
      memcpy (data + (h - 1 - y) * stride, row, stride);
    }
  g_free (row);
  for (gsize i = 3; i < stride * h; i += 4)
    data[i] = 255;
  pixels = g_bytes_new_take (data, stride * h);
  texture = gdk_memory_texture_new (w, h, GDK_MEMORY_R8G8B8A8, pixels, stride);
  png = gdk_texture_save_to_png_bytes (texture);
  return df_write_file_atomic (path, g_bytes_get_data (png, NULL), g_bytes_get_size (png),
                               error);
}

static gboolean
benchmark_tick_cb (GtkWidget     *widget,
                   GdkFrameClock *clock,
                   gpointer       user_data)
{
  DfSurfaceView *self = DF_SURFACE_VIEW (widget);
  Benchmark *bench = self->bench;

  if (bench == NULL)
    return G_SOURCE_REMOVE;
  /* n frames are n + 1 stamps: the first render only starts the clock. */
  if (bench->stamps->len > bench->n_frames)
    {
      bench->tick_id = 0;
      benchmark_finish (self);
      return G_SOURCE_REMOVE;
    }
  df_camera_orbit (&self->camera, 2 * GLM_PIf / bench->n_frames, 0);
  gtk_gl_area_queue_render (GTK_GL_AREA (self));
  return G_SOURCE_CONTINUE;
}

void
df_surface_view_run_orbit_benchmark (DfSurfaceView *self,
                                     guint          n_frames,
                                     void         (*done) (double   median_ms,
                                                           double   p95_ms,
                                                           gpointer user),
                                     gpointer       user)
{
  Benchmark *bench;

  g_return_if_fail (DF_IS_SURFACE_VIEW (self));
  g_return_if_fail (self->bench == NULL && self->bench_report == NULL);

  bench = g_new0 (Benchmark, 1);
  bench->n_frames = MAX (n_frames, 2);
  bench->stamps = g_array_new (FALSE, FALSE, sizeof (gint64));
  bench->render_us = g_array_new (FALSE, FALSE, sizeof (gint64));
  bench->yaw0 = self->camera.yaw;
  bench->done = done;
  bench->user = user;
  self->bench = bench;
  bench->tick_id = gtk_widget_add_tick_callback (GTK_WIDGET (self), benchmark_tick_cb, NULL,
                                                 NULL);
  gtk_gl_area_queue_render (GTK_GL_AREA (self));
}
