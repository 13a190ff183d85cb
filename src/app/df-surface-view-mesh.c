/* df-surface-view-mesh.c: DfSurfaceView's surface mesh: built by the core's df-mesh on a
 * worker thread (one build at a time, stale ones dropped), with its colour range and iso-line
 * spacing, and handed over to the widget on the main thread. */
#include "df-surface-view-private.h"
#include "df-work-guard.h"

#include <math.h>
#include <stdlib.h>

#include "df-geometry.h"
#include "df-io-error.h"

/* ---- mesh data (worker thread) ---------------------------------------------------------- */

void
_df_surface_view_mesh_data_free (MeshData *data)
{
  if (data == NULL)
    return;
  df_mesh_free (data->mesh);
  g_free (data->vertices);
  free (data->coarse);
  g_free (data->problem);
  g_free (data);
}

static int
compare_doubles (const void *a,
                 const void *b)
{
  double x = *(const double *) a, y = *(const double *) b;

  return (x > y) - (x < y);
}

/* A quantity of one sign everywhere (the mean curvature of a convex shade, K of a dome) on the
 * symmetric scale uses one arm only, and a narrow spread of it: nearly one solid colour. Its
 * own span (1 % to 99 % of the vertices, like the symmetric scale's quantile) shows the
 * variation instead, white at the end nearer zero; the legend names both ends. A spread under
 * a millionth of the values (a sphere's H) keeps the symmetric scale: the colour is constant. */
static void
one_signed_span (const df_mesh   *mesh,
                 const double    *values,
                 const uint8_t   *valid,
                 double          *lo,
                 double          *hi)
{
  gsize count = df_mesh_n_vertices (mesh), n = 0;
  g_autofree double *sorted = g_new (double, MAX (count, 1));
  double a, b;

  for (gsize i = 0; i < count; i++)
    if (valid[i] && isfinite (values[i]))
      sorted[n++] = values[i];
  if (n < 2)
    return;
  qsort (sorted, n, sizeof *sorted, compare_doubles);
  a = sorted[(gsize) (0.01 * (n - 1))];
  b = sorted[(gsize) ceil (0.99 * (n - 1))];
  if (!(b - a > 1e-6 * MAX (fabs (a), fabs (b))))
    return;
  if (a > 0 || b < 0)
    {
      *lo = a;
      *hi = b;
    }
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

  /* Edges up to 1/60 of the surface's size where it is flat (the core's default is 1/120, for
   * the record's picture): the normal-turn rule still refines wherever the surface bends, and
   * on Mesa's software driver the vertex stage runs on one thread, so the triangle count set
   * the orbit's frame time (the demo: 45 582 triangles, 20 ms of scene; at 1/60 about half,
   * 13 ms; DEVELOPERS.md, "Benchmark"). */
  df_mesh_options mesh_options = { .max_edge = 1.0 / 60 };
  status = df_mesh_build (surface, &mesh_options, &data->mesh, &diag);
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
      data->shade_lo[q] = -range;
      data->shade_hi[q] = range;
      if (range > 0)
        one_signed_span (data->mesh, values, valid, &data->shade_lo[q], &data->shade_hi[q]);
      for (gsize i = 0; range > 0 && i < df_mesh_n_vertices (data->mesh); i++)
        if (valid[i])
          {
            double tol = 1e-6 * range;
            data->below[q] |= values[i] < data->shade_lo[q] - tol;
            data->above[q] |= values[i] > data->shade_hi[q] + tol;
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
  g_task_return_pointer (task, build.data, (GDestroyNotify) _df_surface_view_mesh_data_free);
}

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

void
_df_surface_view_mesh_shade_range (DfSurfaceView *self,
                                   double        *lo,
                                   double        *hi)
{
  double m = _df_surface_view_mesh_range (self);
  int q = self->shading == DF_SHADING_MEAN;

  *lo = -m;
  *hi = m;
  if (m > 0)
    {
      *lo = self->mesh->shade_lo[q];
      *hi = self->mesh->shade_hi[q];
    }
}

void
_df_surface_view_emit_range_changed (DfSurfaceView *self)
{
  double lo, hi;

  _df_surface_view_mesh_shade_range (self, &lo, &hi);
  g_signal_emit (self, _df_surface_view_signals[SHADING_RANGE_CHANGED], 0, lo, hi);
}

void
_df_surface_view_install_mesh (DfSurfaceView *self,
              MeshData      *data)
{
  g_clear_pointer (&self->mesh, _df_surface_view_mesh_data_free);
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
  _df_surface_view_emit_range_changed (self);
  g_signal_emit (self, _df_surface_view_signals[MESH_READY], 0);
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
    _df_surface_view_install_mesh (self, data);
  else
    _df_surface_view_mesh_data_free (data);

  if (self->rebuild_pending && self->surface != NULL)
    _df_surface_view_start_mesh_build (self);
  else
    g_object_notify_by_pspec (G_OBJECT (self), _df_surface_view_properties[PROP_BUSY]);
}

/* One build at a time: requests that arrive meanwhile collapse into one follow-up build of the
 * newest surface, so dragging a parameter slider cannot queue up stale work. */
void
_df_surface_view_start_mesh_build (DfSurfaceView *self)
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
  g_task_set_source_tag (task, _df_surface_view_start_mesh_build);
  g_task_set_task_data (task, job, (GDestroyNotify) build_job_free);
  g_task_run_in_thread (task, mesh_build_thread);
  if (!was_busy)
    g_object_notify_by_pspec (G_OBJECT (self), _df_surface_view_properties[PROP_BUSY]);
}
