/* df-surface-view.c: DfSurfaceView, the GtkGLArea that draws the surface mesh (built by the core
 * in df-mesh on a worker thread), overlay curves, frames, arrows and a marker, and turns pointer
 * input into camera moves or picked chart points. Geometry comes from the core; this file only
 * converts it to vertex arrays, draws and ray-casts. */
#include "df-surface-view.h"

#include <epoxy/gl.h>
#include <math.h>
#include <stdlib.h>

#include "df-camera.h"
#include "df-geometry.h"
#include "df-gl-program.h"
#include "df-io-error.h"
#include "df-mesh.h"
#include "df-project.h"

#define SHADER_PREFIX "/org/driftframe/Driftframe/shaders/"

/* Floats per vertex: surface (position, normal, uv, K, H), lines (position, rgba, width),
 * solids (position, normal, rgba). */
#define SURFACE_STRIDE 10
#define LINE_STRIDE 8
#define SOLID_STRIDE 10

/* Overlay sizes as fractions of the surface's bounding-box diagonal. */
#define FRAME_LENGTH 0.07
#define HIGHLIGHT_LENGTH 0.12
#define MARKER_RADIUS 0.011
/* How far overlays are pulled toward the eye, as a fraction of their distance: more than the
 * mesh's chord error (edges ~1/120 of the size, a few degrees of turn) at any sane zoom. */
#define OVERLAY_BIAS 0.003f
#define GHOST_ALPHA 0.28f
#define GHOST_SOLID_ALPHA 0.16f
#define BACK_SHADE 0.78f
#define ORBIT_DEG_PER_PX 0.4

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

/* The ramp's stops at s = -1, -0.5, 0, 0.5, 1 (sRGB): a deep blue, a light sky blue, a warm
 * white, a light apricot and a burnt orange. Chosen for this app; the two arms differ in both
 * hue and lightness so they stay apart for the common colour-vision deficiencies. */
static const float ramp_stops[DF_SHADING_RAMP_STOPS][3] = {
  { 0.161f, 0.349f, 0.678f },
  { 0.518f, 0.706f, 0.886f },
  { 0.957f, 0.945f, 0.910f },
  { 0.988f, 0.757f, 0.502f },
  { 0.851f, 0.420f, 0.098f },
};
static const float plain_colour[3] = { 0.80f, 0.76f, 0.68f };

/* The surface mesh and its GPU-ready copy, made on the worker thread; immutable after. */
typedef struct
{
  df_mesh *mesh;        /* NULL when nothing could be tessellated */
  float   *vertices;    /* SURFACE_STRIDE per vertex */
  uint32_t *coarse;     /* every other grid line, drawn while the view moves */
  gsize     n_coarse;   /* triangles in coarse */
  char    *problem;     /* why part of the surface is missing, or NULL */
  float    lo[3], hi[3];
  double   size;        /* bounding-box diagonal */
  float    iso_step[2];
  double   range[2];    /* colour range of |K|, |H| (area quantile; 0 if the value is nil) */
  gboolean below[2];    /* some K, H lie below -range */
  gboolean above[2];    /* some K, H lie above +range */
} MeshData;

typedef struct
{
  df_surface *surface;
  guint       generation;
} BuildJob;

typedef struct
{
  double  (*xyz)[3];
  gsize     n;
  gboolean  closed;
  GdkRGBA   colour;
  float     width;
} Curve;

typedef struct
{
  double  origin[3], dir[3];
  GdkRGBA colour;
} Arrow;

/* Every GL name the widget creates, deleted together in unrealize. */
typedef struct
{
  GLuint surface_program, lines_program, solid_program;
  GLuint surface_vao, surface_vbo, surface_ibo, surface_ibo_coarse;
  GLuint lines_vao, lines_vbo;
  GLuint solid_vao, solid_vbo;
  GLuint fbo, fbo_colour, fbo_depth;
  struct { GLint view, proj, shading, inv_range, ramp, plain, iso, iso_step, back_shade; } su;
  struct { GLint view, proj, bias, viewport, alpha, px_scale; } lu;
  struct { GLint view, proj, bias, alpha; } ou;
  GLsizei surface_indices, surface_indices_coarse, line_vertices, solid_vertices;
} ViewGl;

typedef struct
{
  guint    n_frames;
  GArray  *stamps;      /* gint64 monotonic times of each render */
  GArray  *render_us;   /* gint64 time spent inside render, GL work finished */
  guint    tick_id;
  float    yaw0;
  void   (*done) (double median_ms, double p95_ms, gpointer user);
  gpointer user;
  double   median_ms, p95_ms;
} Benchmark;

static void
benchmark_free (Benchmark *bench)
{
  g_array_unref (bench->stamps);
  g_array_unref (bench->render_us);
  g_free (bench);
}

struct _DfSurfaceView
{
  GtkGLArea parent_instance;

  /* owned */
  df_surface   *surface;
  MeshData     *mesh;
  GHashTable   *curves;         /* guint id -> Curve */
  GHashTable   *arrows;         /* guint id -> Arrow */
  double       *frames;         /* 9 per sample: origin, carried, partner */
  gsize         n_frames;
  gboolean      has_marker;
  double        marker[3];
  GdkRGBA       marker_colour;
  GArray       *line_data;      /* floats, LINE_STRIDE per vertex */
  GArray       *solid_data;     /* floats, SOLID_STRIDE per vertex */
  Benchmark    *bench;          /* running */
  Benchmark    *bench_report;   /* finished, waiting for its report */
  ViewGl        gl;

  /* state */
  DfCamera      camera;
  DfShading     shading;
  gboolean      iso_lines;
  DfInteraction interaction;
  guint         generation;     /* bumped by each set_surface; stale builds are dropped */
  gboolean      building;
  gboolean      rebuild_pending;
  gboolean      mesh_dirty;
  gboolean      overlay_dirty;
  gboolean      fit_pending;    /* a fit was asked before the mesh or the size was known */
  gboolean      moving;         /* the user is orbiting, panning or zooming: draw coarse */
  guint         settle_id;      /* timeout that ends a scroll-zoom's motion */
  int           fb_width, fb_height;
  double        drag_last_x, drag_last_y;
  gboolean      pick_active;    /* a press landed on the surface; released will follow */
  double        last_u, last_v;
};

G_DEFINE_FINAL_TYPE (DfSurfaceView, df_surface_view, GTK_TYPE_GL_AREA)

void
df_shading_ramp_colour (double   s,
                        GdkRGBA *colour)
{
  double x;
  int i;

  g_return_if_fail (colour != NULL);
  if (!isfinite (s))
    s = 0;
  x = (CLAMP (s, -1.0, 1.0) + 1) * 2;
  i = MIN ((int) floor (x), DF_SHADING_RAMP_STOPS - 2);
  x -= i;
  colour->red = ramp_stops[i][0] + x * (ramp_stops[i + 1][0] - ramp_stops[i][0]);
  colour->green = ramp_stops[i][1] + x * (ramp_stops[i + 1][1] - ramp_stops[i][1]);
  colour->blue = ramp_stops[i][2] + x * (ramp_stops[i + 1][2] - ramp_stops[i][2]);
  colour->alpha = 1;
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

  /* Software rasterizers spend most of a frame on triangle setup: a quarter of the triangles
   * keeps orbiting fluid, and the full mesh returns as soon as the view stops. */
  data->coarse = df_mesh_coarse_indices (data->mesh, 2, &data->n_coarse);
  if (data->coarse == NULL)
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

static void
mesh_build_thread (GTask        *task,
                   gpointer      source,
                   gpointer      task_data,
                   GCancellable *cancellable)
{
  BuildJob *job = task_data;

  g_task_return_pointer (task, mesh_data_build (job->surface), (GDestroyNotify) mesh_data_free);
}

static void start_mesh_build (DfSurfaceView *self);
static void rebuild_overlay  (DfSurfaceView *self);

static double
mesh_range (DfSurfaceView *self)
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
  double m = mesh_range (self);

  g_signal_emit (self, signals[SHADING_RANGE_CHANGED], 0, -m, m);
}

static void
install_mesh (DfSurfaceView *self,
              MeshData      *data)
{
  g_clear_pointer (&self->mesh, mesh_data_free);
  self->mesh = data;
  self->mesh_dirty = TRUE;
  if (data != NULL && data->mesh != NULL && (!self->camera.fitted || self->fit_pending))
    df_surface_view_fit_all (self);
  if (data != NULL && data->problem != NULL)
    g_debug ("%s", data->problem);
  rebuild_overlay (self);
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

/* ---- overlay geometry ------------------------------------------------------------------- */

static void
push_line_vertex (GArray        *out,
                  const double   p[3],
                  const GdkRGBA *c,
                  float          alpha,
                  float          width)
{
  float v[LINE_STRIDE] = { p[0], p[1], p[2], c->red, c->green, c->blue, c->alpha * alpha, width };

  g_array_append_vals (out, v, LINE_STRIDE);
}

static void
push_segment (GArray        *out,
              const double   a[3],
              const double   b[3],
              const GdkRGBA *c,
              float          alpha,
              float          width)
{
  for (int i = 0; i < 3; i++)
    if (!isfinite (a[i]) || !isfinite (b[i]))
      return;
  push_line_vertex (out, a, c, alpha, width);
  push_line_vertex (out, b, c, alpha, width);
}

static void
push_solid_vertex (GArray        *out,
                   const double   p[3],
                   const double   n[3],
                   const GdkRGBA *c)
{
  float v[SOLID_STRIDE] = { p[0], p[1], p[2], n[0], n[1], n[2],
                            c->red, c->green, c->blue, c->alpha };

  g_array_append_vals (out, v, SOLID_STRIDE);
}

static double
norm3 (const double a[3])
{
  return sqrt (a[0] * a[0] + a[1] * a[1] + a[2] * a[2]);
}

/* Two unit vectors completing unit d to an orthonormal basis. */
static void
orthonormal_basis (const double d[3],
                   double       e1[3],
                   double       e2[3])
{
  double helper[3] = { 1, 0, 0 }, len;

  if (fabs (d[0]) > 0.8)
    {
      helper[0] = 0;
      helper[1] = 1;
    }
  e1[0] = d[1] * helper[2] - d[2] * helper[1];
  e1[1] = d[2] * helper[0] - d[0] * helper[2];
  e1[2] = d[0] * helper[1] - d[1] * helper[0];
  len = norm3 (e1);
  for (int i = 0; i < 3; i++)
    e1[i] /= len;
  e2[0] = d[1] * e1[2] - d[2] * e1[1];
  e2[1] = d[2] * e1[0] - d[0] * e1[2];
  e2[2] = d[0] * e1[1] - d[1] * e1[0];
}

/* A shaft (thick line) ending in a closed cone, the arrow's head, at origin + length * dir. */
static void
push_arrow (DfSurfaceView *self,
            const double   origin[3],
            const double   dir_in[3],
            double         length,
            const GdkRGBA *colour,
            float          width)
{
  enum { SIDES = 14 };
  double dir[3], e1[3], e2[3], tip[3], base[3], shaft_end[3], len = norm3 (dir_in);
  double head = 0.26 * length, radius = 0.08 * length;

  if (!(len > 0) || !isfinite (len) || !isfinite (norm3 (origin)))
    return;
  for (int i = 0; i < 3; i++)
    {
      dir[i] = dir_in[i] / len;
      tip[i] = origin[i] + length * dir[i];
      base[i] = tip[i] - head * dir[i];
      shaft_end[i] = tip[i] - 0.8 * head * dir[i];
    }
  push_segment (self->line_data, origin, shaft_end, colour, 1, width);
  orthonormal_basis (dir, e1, e2);
  for (int k = 0; k < SIDES; k++)
    {
      double a0 = 2 * G_PI * k / SIDES, a1 = 2 * G_PI * (k + 1) / SIDES, am = 0.5 * (a0 + a1);
      double r0[3], r1[3], rm[3], p0[3], p1[3], n0[3], n1[3], nm[3], back[3];
      for (int i = 0; i < 3; i++)
        {
          r0[i] = cos (a0) * e1[i] + sin (a0) * e2[i];
          r1[i] = cos (a1) * e1[i] + sin (a1) * e2[i];
          rm[i] = cos (am) * e1[i] + sin (am) * e2[i];
          p0[i] = base[i] + radius * r0[i];
          p1[i] = base[i] + radius * r1[i];
          /* The cone's normal leans toward the tip by the half-angle. */
          n0[i] = head * r0[i] + radius * dir[i];
          n1[i] = head * r1[i] + radius * dir[i];
          nm[i] = head * rm[i] + radius * dir[i];
          back[i] = -dir[i];
        }
      push_solid_vertex (self->solid_data, tip, nm, colour);
      push_solid_vertex (self->solid_data, p0, n0, colour);
      push_solid_vertex (self->solid_data, p1, n1, colour);
      push_solid_vertex (self->solid_data, base, back, colour);
      push_solid_vertex (self->solid_data, p1, back, colour);
      push_solid_vertex (self->solid_data, p0, back, colour);
    }
}

static void
push_ball (DfSurfaceView *self,
           const double   centre[3],
           double         radius,
           const GdkRGBA *colour)
{
  enum { SLICES = 18, STACKS = 10 };

  for (int i = 0; i < STACKS; i++)
    for (int j = 0; j < SLICES; j++)
      {
        double corner[4][3];
        for (int c = 0; c < 4; c++)
          {
            double th = G_PI * (i + (c == 1 || c == 2)) / STACKS;
            double ph = 2 * G_PI * (j + (c >= 2)) / SLICES;
            corner[c][0] = sin (th) * cos (ph);
            corner[c][1] = sin (th) * sin (ph);
            corner[c][2] = cos (th);
          }
        {
          static const int order[6] = { 0, 1, 2, 0, 2, 3 };
          for (int t = 0; t < 6; t++)
            {
              double p[3];
              for (int a = 0; a < 3; a++)
                p[a] = centre[a] + radius * corner[order[t]][a];
              push_solid_vertex (self->solid_data, p, corner[order[t]], colour);
            }
        }
      }
}

static double
scene_size (DfSurfaceView *self)
{
  if (self->mesh != NULL && self->mesh->mesh != NULL)
    return self->mesh->size;
  if (self->surface != NULL)
    return df_surface_size (self->surface);
  return 1;
}

/* Turns curves, frames, arrows and the marker into vertex arrays; render() only uploads them.
 * Sizes follow the surface, so this runs again whenever the mesh changes. */
static void
rebuild_overlay (DfSurfaceView *self)
{
  /* Ink-dark carried vectors read on every colour of the blue-white-orange scale; the partner
   * is a green, a hue the scale does not use; the returned vector is a strong magenta against
   * the ink start vector, so the two compare at a glance. */
  static const GdkRGBA carried = { 0.10f, 0.10f, 0.14f, 0.9f };
  static const GdkRGBA partner = { 0.04f, 0.48f, 0.30f, 0.85f };
  static const GdkRGBA start = { 0.05f, 0.05f, 0.07f, 1.0f };
  static const GdkRGBA returned = { 0.85f, 0.05f, 0.55f, 1.0f };
  double size = scene_size (self);
  GHashTableIter iter;
  gpointer value;

  g_array_set_size (self->line_data, 0);
  g_array_set_size (self->solid_data, 0);

  g_hash_table_iter_init (&iter, self->curves);
  while (g_hash_table_iter_next (&iter, NULL, &value))
    {
      Curve *c = value;
      for (gsize i = 0; i + 1 < c->n; i++)
        push_segment (self->line_data, c->xyz[i], c->xyz[i + 1], &c->colour, 1, c->width);
      if (c->closed && c->n > 2)
        push_segment (self->line_data, c->xyz[c->n - 1], c->xyz[0], &c->colour, 1, c->width);
    }

  for (gsize i = 0; i < self->n_frames; i++)
    {
      const double *f = &self->frames[9 * i];
      gboolean first = i == 0, last = i + 1 == self->n_frames && i > 0;
      double length = (first || last ? HIGHLIGHT_LENGTH : FRAME_LENGTH) * size;

      if (first || last)
        continue;   /* drawn after the others, so they stay on top */
      push_arrow (self, f, f + 6, 0.7 * length, &partner, 1.5f);
      push_arrow (self, f, f + 3, length, &carried, 2.0f);
    }
  if (self->n_frames > 0)
    {
      gsize ends[2] = { 0, self->n_frames - 1 };
      for (int e = 0; e < (self->n_frames > 1 ? 2 : 1); e++)
        {
          const double *f = &self->frames[9 * ends[e]];
          double length = HIGHLIGHT_LENGTH * size;
          push_arrow (self, f, f + 6, 0.7 * length, &partner, 2.5f);
          push_arrow (self, f, f + 3, length, e == 0 ? &start : &returned, 3.5f);
        }
    }

  g_hash_table_iter_init (&iter, self->arrows);
  while (g_hash_table_iter_next (&iter, NULL, &value))
    {
      Arrow *a = value;
      push_arrow (self, a->origin, a->dir, HIGHLIGHT_LENGTH * size, &a->colour, 3.5f);
    }

  if (self->has_marker)
    push_ball (self, self->marker, MARKER_RADIUS * size, &self->marker_colour);

  self->overlay_dirty = TRUE;
  gtk_gl_area_queue_render (GTK_GL_AREA (self));
}

static void
curve_free (Curve *curve)
{
  g_free (curve->xyz);
  g_free (curve);
}

/* ---- GL --------------------------------------------------------------------------------- */

static void
fail_gl (DfSurfaceView *self,
         GError        *error)
{
  g_warning ("3D view: %s", error->message);
  g_signal_emit (self, signals[GL_FAILED], 0, error->message);
  gtk_gl_area_set_error (GTK_GL_AREA (self), error);
}

static void
setup_vertex_arrays (ViewGl *gl)
{
  glGenVertexArrays (1, &gl->surface_vao);
  glGenBuffers (1, &gl->surface_vbo);
  glGenBuffers (1, &gl->surface_ibo);
  glGenBuffers (1, &gl->surface_ibo_coarse);
  glBindVertexArray (gl->surface_vao);
  glBindBuffer (GL_ARRAY_BUFFER, gl->surface_vbo);
  glBindBuffer (GL_ELEMENT_ARRAY_BUFFER, gl->surface_ibo);
  glEnableVertexAttribArray (0);
  glVertexAttribPointer (0, 3, GL_FLOAT, GL_FALSE, SURFACE_STRIDE * sizeof (float), (void *) 0);
  glEnableVertexAttribArray (1);
  glVertexAttribPointer (1, 3, GL_FLOAT, GL_FALSE, SURFACE_STRIDE * sizeof (float),
                         (void *) (3 * sizeof (float)));
  glEnableVertexAttribArray (2);
  glVertexAttribPointer (2, 2, GL_FLOAT, GL_FALSE, SURFACE_STRIDE * sizeof (float),
                         (void *) (6 * sizeof (float)));
  glEnableVertexAttribArray (3);
  glVertexAttribPointer (3, 2, GL_FLOAT, GL_FALSE, SURFACE_STRIDE * sizeof (float),
                         (void *) (8 * sizeof (float)));

  glGenVertexArrays (1, &gl->lines_vao);
  glGenBuffers (1, &gl->lines_vbo);
  glBindVertexArray (gl->lines_vao);
  glBindBuffer (GL_ARRAY_BUFFER, gl->lines_vbo);
  glEnableVertexAttribArray (0);
  glVertexAttribPointer (0, 3, GL_FLOAT, GL_FALSE, LINE_STRIDE * sizeof (float), (void *) 0);
  glEnableVertexAttribArray (1);
  glVertexAttribPointer (1, 4, GL_FLOAT, GL_FALSE, LINE_STRIDE * sizeof (float),
                         (void *) (3 * sizeof (float)));
  glEnableVertexAttribArray (2);
  glVertexAttribPointer (2, 1, GL_FLOAT, GL_FALSE, LINE_STRIDE * sizeof (float),
                         (void *) (7 * sizeof (float)));

  glGenVertexArrays (1, &gl->solid_vao);
  glGenBuffers (1, &gl->solid_vbo);
  glBindVertexArray (gl->solid_vao);
  glBindBuffer (GL_ARRAY_BUFFER, gl->solid_vbo);
  glEnableVertexAttribArray (0);
  glVertexAttribPointer (0, 3, GL_FLOAT, GL_FALSE, SOLID_STRIDE * sizeof (float), (void *) 0);
  glEnableVertexAttribArray (1);
  glVertexAttribPointer (1, 3, GL_FLOAT, GL_FALSE, SOLID_STRIDE * sizeof (float),
                         (void *) (3 * sizeof (float)));
  glEnableVertexAttribArray (2);
  glVertexAttribPointer (2, 4, GL_FLOAT, GL_FALSE, SOLID_STRIDE * sizeof (float),
                         (void *) (6 * sizeof (float)));

  glBindVertexArray (0);
  glBindBuffer (GL_ARRAY_BUFFER, 0);
}

static gboolean
build_programs (ViewGl  *gl,
                GError **error)
{
  if (!df_gl_program_build (&gl->surface_program, SHADER_PREFIX "surface.vert",
                            SHADER_PREFIX "surface.frag", error)
      || !df_gl_program_build_full (&gl->lines_program, SHADER_PREFIX "lines.vert",
                                    SHADER_PREFIX "lines.geom", SHADER_PREFIX "lines.frag", error)
      || !df_gl_program_build (&gl->solid_program, SHADER_PREFIX "solid.vert",
                               SHADER_PREFIX "solid.frag", error))
    return FALSE;

  gl->su.view = glGetUniformLocation (gl->surface_program, "u_view");
  gl->su.proj = glGetUniformLocation (gl->surface_program, "u_proj");
  gl->su.shading = glGetUniformLocation (gl->surface_program, "u_shading");
  gl->su.inv_range = glGetUniformLocation (gl->surface_program, "u_inv_range");
  gl->su.ramp = glGetUniformLocation (gl->surface_program, "u_ramp");
  gl->su.plain = glGetUniformLocation (gl->surface_program, "u_plain");
  gl->su.iso = glGetUniformLocation (gl->surface_program, "u_iso");
  gl->su.iso_step = glGetUniformLocation (gl->surface_program, "u_iso_step");
  gl->su.back_shade = glGetUniformLocation (gl->surface_program, "u_back_shade");
  gl->lu.view = glGetUniformLocation (gl->lines_program, "u_view");
  gl->lu.proj = glGetUniformLocation (gl->lines_program, "u_proj");
  gl->lu.bias = glGetUniformLocation (gl->lines_program, "u_bias");
  gl->lu.viewport = glGetUniformLocation (gl->lines_program, "u_viewport");
  gl->lu.alpha = glGetUniformLocation (gl->lines_program, "u_alpha");
  gl->lu.px_scale = glGetUniformLocation (gl->lines_program, "u_px_scale");
  gl->ou.view = glGetUniformLocation (gl->solid_program, "u_view");
  gl->ou.proj = glGetUniformLocation (gl->solid_program, "u_proj");
  gl->ou.bias = glGetUniformLocation (gl->solid_program, "u_bias");
  gl->ou.alpha = glGetUniformLocation (gl->solid_program, "u_alpha");
  return TRUE;
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

  setup_vertex_arrays (&self->gl);
  if (!build_programs (&self->gl, &error))
    {
      fail_gl (self, error);
      return;
    }
  self->mesh_dirty = TRUE;
  self->overlay_dirty = TRUE;
}

static void
delete_program (GLuint *name)
{
  if (*name != 0)
    glDeleteProgram (*name);
  *name = 0;
}

static void
delete_buffer (GLuint *name)
{
  if (*name != 0)
    glDeleteBuffers (1, name);
  *name = 0;
}

static void
delete_vertex_array (GLuint *name)
{
  if (*name != 0)
    glDeleteVertexArrays (1, name);
  *name = 0;
}

static void
delete_gl_names (ViewGl *gl)
{
  delete_program (&gl->surface_program);
  delete_program (&gl->lines_program);
  delete_program (&gl->solid_program);
  delete_vertex_array (&gl->surface_vao);
  delete_vertex_array (&gl->lines_vao);
  delete_vertex_array (&gl->solid_vao);
  delete_buffer (&gl->surface_vbo);
  delete_buffer (&gl->surface_ibo);
  delete_buffer (&gl->surface_ibo_coarse);
  delete_buffer (&gl->lines_vbo);
  delete_buffer (&gl->solid_vbo);
  if (gl->fbo != 0)
    glDeleteFramebuffers (1, &gl->fbo);
  if (gl->fbo_colour != 0)
    glDeleteRenderbuffers (1, &gl->fbo_colour);
  if (gl->fbo_depth != 0)
    glDeleteRenderbuffers (1, &gl->fbo_depth);
  gl->fbo = gl->fbo_colour = gl->fbo_depth = 0;
  gl->surface_indices = gl->surface_indices_coarse = gl->line_vertices = gl->solid_vertices = 0;
}

static void
df_surface_view_unrealize (GtkWidget *widget)
{
  DfSurfaceView *self = DF_SURFACE_VIEW (widget);
  GtkGLArea *area = GTK_GL_AREA (widget);

  if (gtk_gl_area_get_context (area) != NULL)
    {
      gtk_gl_area_make_current (area);
      delete_gl_names (&self->gl);
    }
  GTK_WIDGET_CLASS (df_surface_view_parent_class)->unrealize (widget);
}

static void
upload_dirty (DfSurfaceView *self)
{
  ViewGl *gl = &self->gl;

  if (self->mesh_dirty)
    {
      gsize n_vertices = 0, n_indices = 0, n_coarse = 0;
      if (self->mesh != NULL && self->mesh->mesh != NULL)
        {
          n_vertices = df_mesh_n_vertices (self->mesh->mesh);
          n_indices = 3 * df_mesh_n_triangles (self->mesh->mesh);
          n_coarse = 3 * self->mesh->n_coarse;
        }
      glBindVertexArray (gl->surface_vao);
      glBindBuffer (GL_ARRAY_BUFFER, gl->surface_vbo);
      glBufferData (GL_ARRAY_BUFFER, n_vertices * SURFACE_STRIDE * sizeof (float),
                    n_vertices > 0 ? self->mesh->vertices : NULL, GL_STATIC_DRAW);
      glBufferData (GL_ELEMENT_ARRAY_BUFFER, n_indices * sizeof (uint32_t),
                    n_indices > 0 ? df_mesh_indices (self->mesh->mesh) : NULL, GL_STATIC_DRAW);
      gl->surface_indices = n_indices;
      glBindBuffer (GL_ELEMENT_ARRAY_BUFFER, gl->surface_ibo_coarse);
      glBufferData (GL_ELEMENT_ARRAY_BUFFER, n_coarse * sizeof (uint32_t),
                    n_coarse > 0 ? self->mesh->coarse : NULL, GL_STATIC_DRAW);
      gl->surface_indices_coarse = n_coarse;
      /* The VAO keeps the full index buffer as its own. */
      glBindBuffer (GL_ELEMENT_ARRAY_BUFFER, gl->surface_ibo);
      self->mesh_dirty = FALSE;
    }
  if (self->overlay_dirty)
    {
      glBindBuffer (GL_ARRAY_BUFFER, gl->lines_vbo);
      glBufferData (GL_ARRAY_BUFFER, self->line_data->len * sizeof (float),
                    self->line_data->data, GL_DYNAMIC_DRAW);
      gl->line_vertices = self->line_data->len / LINE_STRIDE;
      glBindBuffer (GL_ARRAY_BUFFER, gl->solid_vbo);
      glBufferData (GL_ARRAY_BUFFER, self->solid_data->len * sizeof (float),
                    self->solid_data->data, GL_DYNAMIC_DRAW);
      gl->solid_vertices = self->solid_data->len / SOLID_STRIDE;
      self->overlay_dirty = FALSE;
    }
  glBindVertexArray (0);
  glBindBuffer (GL_ARRAY_BUFFER, 0);
}

/* A neutral background a little apart from the theme: light grey under dark text, dark grey
 * under light text, so the sheet's light and dark sides both read in either theme. */
static void
background_colour (DfSurfaceView *self,
                   float          rgb[3])
{
  GdkRGBA fg;
  double luma;

  gtk_style_context_get_color (gtk_widget_get_style_context (GTK_WIDGET (self)), &fg);
  luma = 0.2126 * fg.red + 0.7152 * fg.green + 0.0722 * fg.blue;
  if (luma > 0.5)
    {
      rgb[0] = 0.19f;
      rgb[1] = 0.20f;
      rgb[2] = 0.22f;
    }
  else
    {
      rgb[0] = 0.84f;
      rgb[1] = 0.86f;
      rgb[2] = 0.88f;
    }
}

static void
draw_scene (DfSurfaceView *self,
            int            width,
            int            height,
            gboolean       coarse)
{
  ViewGl *gl = &self->gl;
  float bg[3];
  mat4 view, proj;
  double range = mesh_range (self);

  background_colour (self, bg);
  glViewport (0, 0, width, height);
  glClearColor (bg[0], bg[1], bg[2], 1);
  glClearDepth (1);
  glClear (GL_COLOR_BUFFER_BIT | GL_DEPTH_BUFFER_BIT);

  df_camera_view (&self->camera, view);
  df_camera_projection (&self->camera, height > 0 ? (float) width / height : 1, proj);

  glEnable (GL_DEPTH_TEST);
  glDepthFunc (GL_LESS);
  glDepthMask (GL_TRUE);
  glDisable (GL_BLEND);
  glDisable (GL_CULL_FACE);

  if (gl->surface_indices > 0)
    {
      glUseProgram (gl->surface_program);
      glUniformMatrix4fv (gl->su.view, 1, GL_FALSE, (float *) view);
      glUniformMatrix4fv (gl->su.proj, 1, GL_FALSE, (float *) proj);
      glUniform1i (gl->su.shading, self->shading);
      glUniform1f (gl->su.inv_range, range > 0 ? 1 / range : 0);
      glUniform3fv (gl->su.ramp, DF_SHADING_RAMP_STOPS, (const float *) ramp_stops);
      glUniform3fv (gl->su.plain, 1, plain_colour);
      glUniform1i (gl->su.iso, self->iso_lines);
      glUniform2fv (gl->su.iso_step, 1, self->mesh->iso_step);
      glUniform1f (gl->su.back_shade, BACK_SHADE);
      glBindVertexArray (gl->surface_vao);
      if (coarse && gl->surface_indices_coarse > 0)
        {
          glBindBuffer (GL_ELEMENT_ARRAY_BUFFER, gl->surface_ibo_coarse);
          glDrawElements (GL_TRIANGLES, gl->surface_indices_coarse, GL_UNSIGNED_INT, NULL);
          glBindBuffer (GL_ELEMENT_ARRAY_BUFFER, gl->surface_ibo);
        }
      else
        glDrawElements (GL_TRIANGLES, gl->surface_indices, GL_UNSIGNED_INT, NULL);
    }

  if (gl->line_vertices > 0 || gl->solid_vertices > 0)
    {
      /* Keep destination alpha at 1: GTK composites the area's buffer with its alpha. */
      glEnable (GL_BLEND);
      glBlendFuncSeparate (GL_SRC_ALPHA, GL_ONE_MINUS_SRC_ALPHA, GL_ONE, GL_ONE_MINUS_SRC_ALPHA);

      glUseProgram (gl->lines_program);
      glUniformMatrix4fv (gl->lu.view, 1, GL_FALSE, (float *) view);
      glUniformMatrix4fv (gl->lu.proj, 1, GL_FALSE, (float *) proj);
      glUniform1f (gl->lu.bias, OVERLAY_BIAS);
      glUniform2f (gl->lu.viewport, width, height);
      glUniform1f (gl->lu.px_scale, gtk_widget_get_scale_factor (GTK_WIDGET (self)));
      glUseProgram (gl->solid_program);
      glUniformMatrix4fv (gl->ou.view, 1, GL_FALSE, (float *) view);
      glUniformMatrix4fv (gl->ou.proj, 1, GL_FALSE, (float *) proj);
      glUniform1f (gl->ou.bias, OVERLAY_BIAS);

      /* Pass 1: a faint ghost of whatever the surface hides, so a loop on the far side is
       * still found. Pass 2: the visible parts, solids writing depth first. */
      for (int pass = 0; pass < 2; pass++)
        {
          float alpha = pass == 0 ? GHOST_ALPHA : 1.0f;
          float solid_alpha = pass == 0 ? GHOST_SOLID_ALPHA : 1.0f;
          glDepthFunc (pass == 0 ? GL_GREATER : GL_LEQUAL);
          if (gl->solid_vertices > 0)
            {
              glDepthMask (pass == 1);
              glUseProgram (gl->solid_program);
              glUniform1f (gl->ou.alpha, solid_alpha);
              glBindVertexArray (gl->solid_vao);
              glDrawArrays (GL_TRIANGLES, 0, gl->solid_vertices);
            }
          if (gl->line_vertices > 0)
            {
              glDepthMask (GL_FALSE);
              glUseProgram (gl->lines_program);
              glUniform1f (gl->lu.alpha, alpha);
              glBindVertexArray (gl->lines_vao);
              glDrawArrays (GL_LINES, 0, gl->line_vertices);
            }
        }
      glDepthMask (GL_TRUE);
      glDepthFunc (GL_LESS);
      glDisable (GL_BLEND);
    }

  glBindVertexArray (0);
  glUseProgram (0);
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
  upload_dirty (self);
  draw_scene (self, self->fb_width, self->fb_height, self->moving || self->bench != NULL);
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
  self->curves = g_hash_table_new_full (NULL, NULL, NULL, (GDestroyNotify) curve_free);
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
  rebuild_overlay (self);
}

void
df_surface_view_remove_curve (DfSurfaceView *self,
                              guint          id)
{
  g_return_if_fail (DF_IS_SURFACE_VIEW (self));

  if (g_hash_table_remove (self->curves, GUINT_TO_POINTER (id)))
    rebuild_overlay (self);
}

void
df_surface_view_clear_curves (DfSurfaceView *self)
{
  g_return_if_fail (DF_IS_SURFACE_VIEW (self));

  g_hash_table_remove_all (self->curves);
  rebuild_overlay (self);
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
  rebuild_overlay (self);
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
  rebuild_overlay (self);
}

void
df_surface_view_remove_arrow (DfSurfaceView *self,
                              guint          id)
{
  g_return_if_fail (DF_IS_SURFACE_VIEW (self));

  if (g_hash_table_remove (self->arrows, GUINT_TO_POINTER (id)))
    rebuild_overlay (self);
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
  rebuild_overlay (self);
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
  m = mesh_range (self);
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
  GLenum status;

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
  upload_dirty (self);
  /* Render into a framebuffer of our own, so the picture does not depend on what GTK last
   * composited. */
  glGenFramebuffers (1, &gl->fbo);
  glGenRenderbuffers (1, &gl->fbo_colour);
  glGenRenderbuffers (1, &gl->fbo_depth);
  glBindRenderbuffer (GL_RENDERBUFFER, gl->fbo_colour);
  glRenderbufferStorage (GL_RENDERBUFFER, GL_RGBA8, w, h);
  glBindRenderbuffer (GL_RENDERBUFFER, gl->fbo_depth);
  glRenderbufferStorage (GL_RENDERBUFFER, GL_DEPTH_COMPONENT24, w, h);
  glBindFramebuffer (GL_FRAMEBUFFER, gl->fbo);
  glFramebufferRenderbuffer (GL_FRAMEBUFFER, GL_COLOR_ATTACHMENT0, GL_RENDERBUFFER,
                             gl->fbo_colour);
  glFramebufferRenderbuffer (GL_FRAMEBUFFER, GL_DEPTH_ATTACHMENT, GL_RENDERBUFFER,
                             gl->fbo_depth);
  status = glCheckFramebufferStatus (GL_FRAMEBUFFER);
  data = g_malloc (stride * h);
  if (status == GL_FRAMEBUFFER_COMPLETE)
    {
      draw_scene (self, w, h, FALSE);
      glPixelStorei (GL_PACK_ALIGNMENT, 1);
      glReadPixels (0, 0, w, h, GL_RGBA, GL_UNSIGNED_BYTE, data);
    }
  glDeleteFramebuffers (1, &gl->fbo);
  glDeleteRenderbuffers (1, &gl->fbo_colour);
  glDeleteRenderbuffers (1, &gl->fbo_depth);
  gl->fbo = gl->fbo_colour = gl->fbo_depth = 0;
  gtk_gl_area_attach_buffers (area);
  if (status != GL_FRAMEBUFFER_COMPLETE)
    {
      g_free (data);
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FILE,
                   "Cannot save %s: no offscreen framebuffer (status 0x%x)", path, status);
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
