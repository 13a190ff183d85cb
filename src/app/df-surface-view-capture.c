/* df-surface-view-capture.c: DfSurfaceView's offscreen images (the design record's picture and
 * PNG export, rendered into a framebuffer of their own size) and the orbit benchmark, which
 * turns the camera once round on the frame clock and reports the median frame time. */
#include "df-surface-view-private.h"

#include <epoxy/gl.h>
#include <math.h>
#include <stdlib.h>

#include "df-io-error.h"

void
_df_surface_view_benchmark_free (Benchmark *bench)
{
  g_array_unref (bench->stamps);
  g_array_unref (bench->render_us);
  g_array_unref (bench->work_us);
  if (bench->clock != NULL)
    {
      g_clear_signal_handler (&bench->update_handler, bench->clock);
      g_clear_signal_handler (&bench->paint_handler, bench->clock);
      g_object_unref (bench->clock);
    }
  g_free (bench);
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
    bench->done (bench->median_ms, bench->p95_ms, bench->work_ms, bench->user);
  _df_surface_view_benchmark_free (bench);
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
  if (bench->clock != NULL)
    {
      g_clear_signal_handler (&bench->update_handler, bench->clock);
      g_clear_signal_handler (&bench->paint_handler, bench->clock);
    }
  if (bench->work_us->len > 0)
    {
      g_autoptr (GArray) work = g_array_new (FALSE, FALSE, sizeof (double));
      for (guint i = 0; i < bench->work_us->len; i++)
        {
          double ms = g_array_index (bench->work_us, gint64, i) / 1000.0;
          g_array_append_val (work, ms);
        }
      g_array_sort (work, compare_double);
      bench->work_ms = g_array_index (work, double, work->len / 2);
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

static void
frame_update_cb (GdkFrameClock *clock,
                 Benchmark     *bench)
{
  bench->update_t0 = g_get_monotonic_time ();
}

static void
frame_painted_cb (GdkFrameClock *clock,
                  Benchmark     *bench)
{
  gint64 spent;

  if (bench->update_t0 == 0 || bench->stamps->len < 2)
    return;
  spent = g_get_monotonic_time () - bench->update_t0;
  g_array_append_val (bench->work_us, spent);
  bench->update_t0 = 0;
}

void
df_surface_view_run_orbit_benchmark (DfSurfaceView *self,
                                     guint          n_frames,
                                     void         (*done) (double   median_ms,
                                                           double   p95_ms,
                                                           double   work_ms,
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
  bench->work_us = g_array_new (FALSE, FALSE, sizeof (gint64));
  bench->yaw0 = self->camera.yaw;
  bench->done = done;
  bench->user = user;
  self->bench = bench;
  /* The update phase runs the tick callbacks (the orbit step); the paint phase ends with the
   * window's pixels handed to the display. after-paint runs once that is done. */
  bench->clock = gtk_widget_get_frame_clock (GTK_WIDGET (self));
  if (bench->clock != NULL)
    {
      g_object_ref (bench->clock);
      bench->update_handler = g_signal_connect (bench->clock, "update",
                                                G_CALLBACK (frame_update_cb), bench);
      bench->paint_handler = g_signal_connect_after (bench->clock, "after-paint",
                                                     G_CALLBACK (frame_painted_cb), bench);
    }
  bench->tick_id = gtk_widget_add_tick_callback (GTK_WIDGET (self), benchmark_tick_cb, NULL,
                                                 NULL);
  gtk_gl_area_queue_render (GTK_GL_AREA (self));
}
