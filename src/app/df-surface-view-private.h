/* df-surface-view-private.h: what the files of DfSurfaceView share: the instance struct, the
 * mesh and overlay data it owns, its GL names, its properties and signals, and the helpers
 * split out by concern (df-surface-view-mesh.c builds the mesh, df-surface-view-input.c turns
 * input into camera moves and picks, df-surface-view-capture.c renders offscreen and runs the
 * benchmark, df-surface-view-gl.c draws, df-surface-view-overlay.c builds overlay vertex
 * arrays). */
#pragma once

#include <epoxy/gl.h>

#include "df-camera.h"
#include "df-mesh.h"
#include "df-surface-view.h"

G_BEGIN_DECLS

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
  double   shade_lo[2]; /* the colour scale's ends: -range, +range, or for a quantity of one */
  double   shade_hi[2]; /* sign its own 1 %..99 % span (white at the end nearer zero) */
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
  GLuint lines_vao, lines_vbo, lines_ibo;
  GLuint solid_vao, solid_vbo;
  GLuint fbo, fbo_colour, fbo_depth;
  struct { GLint view, proj, shading, inv_range, offset, ramp, plain, iso, iso_step, back_shade; } su;
  struct { GLint view, proj, bias, viewport, alpha, px_scale; } lu;
  struct { GLint view, proj, bias, alpha; } ou;
  /* line_indices: 6 per segment, each segment drawn as a quad of 4 corner vertices */
  GLsizei surface_indices, surface_indices_coarse, line_indices, solid_vertices;
} ViewGl;

/* Data points over a fitted surface (df-surface-view-points.c): position and colour per point,
 * and the GL names of their program and buffer, created and deleted with the rest. */
#define POINT_STRIDE 6
typedef struct
{
  GLuint  program, vao, vbo;
  GLint   view, proj, bias, size, alpha;
  GLsizei count;
  float  *data;         /* POINT_STRIDE per point */
  gsize   n;
  gboolean dirty;
} ViewPoints;

typedef struct
{
  guint    n_frames;
  GArray  *stamps;      /* gint64 monotonic times of each render */
  GArray  *render_us;   /* gint64 time spent inside render, GL work finished */
  GArray  *work_us;     /* gint64 from each frame's update phase to the end of its paint */
  GdkFrameClock *clock; /* whose phases are timed (a reference) */
  gulong   update_handler, paint_handler;
  gint64   update_t0;
  guint    tick_id;
  float    yaw0;
  void   (*done) (double median_ms, double p95_ms, double work_ms, gpointer user);
  gpointer user;
  double   median_ms, p95_ms, work_ms;
} Benchmark;

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
  ViewPoints    points;

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
  gboolean      fit_next_mesh;  /* the shape changed: frame the mesh being built once it lands */
  gboolean      moving;         /* the user is orbiting, panning or zooming: draw coarse */
  guint         settle_id;      /* timeout that ends a scroll-zoom's motion */
  int           fb_width, fb_height;
  double        drag_last_x, drag_last_y;
  gboolean      pick_active;    /* a press landed on the surface; released will follow */
  double        last_u, last_v;

  /* A colouring given from outside (df-surface-view-field.c): one value per vertex of the
   * mesh it was made for, drawn instead of K while that mesh is shown. */
  float        *field;
  const MeshData *field_mesh;
  double        field_range;

  /* A drape's net (df-surface-view-net.c): line vertices, LINE_STRIDE floats each, in pairs;
   * NULL when none is shown. */
  GArray       *net;
};

enum
{
  PROP_0,
  PROP_SHADING,
  PROP_ISO_LINES,
  PROP_INTERACTION,
  PROP_BUSY,
  DF_SURFACE_VIEW_N_PROPS
};

enum
{
  SURFACE_PRESSED,
  SURFACE_DRAGGED,
  SURFACE_RELEASED,
  SHADING_RANGE_CHANGED,
  MESH_READY,
  GL_FAILED,
  DF_SURFACE_VIEW_N_SIGNALS
};

/* df-surface-view.c */
extern GParamSpec *_df_surface_view_properties[DF_SURFACE_VIEW_N_PROPS];
extern guint _df_surface_view_signals[DF_SURFACE_VIEW_N_SIGNALS];

/* df-surface-view-mesh.c */
double   _df_surface_view_mesh_range       (DfSurfaceView *self);
void     _df_surface_view_mesh_shade_range (DfSurfaceView *self, double *lo, double *hi);
void     _df_surface_view_mesh_data_free   (MeshData      *data);
void     _df_surface_view_emit_range_changed (DfSurfaceView *self);
/* Takes data (may be NULL: nothing to draw), refits if asked, rebuilds the overlay. */
void     _df_surface_view_install_mesh     (DfSurfaceView *self,
                                            MeshData      *data);
/* Builds the current surface's mesh on a worker thread; a request while one runs is folded
 * into one follow-up build. */
void     _df_surface_view_start_mesh_build (DfSurfaceView *self);

/* df-surface-view-input.c: the drags and scroll of init, the actions and keys of class_init. */
void     _df_surface_view_input_init       (DfSurfaceView  *self);
void     _df_surface_view_input_class_init (GtkWidgetClass *widget_class);

/* df-surface-view-field.c: the vertices to upload (the mesh's own, or a copy carrying the
 * field; free with g_free when *copied), and the colour range (0: the mesh's). */
const float *_df_surface_view_field_vertices (DfSurfaceView *self, gboolean *copied);
gboolean     _df_surface_view_field_active   (DfSurfaceView *self);
void         _df_surface_view_field_free     (DfSurfaceView *self);

/* df-surface-view-capture.c */
void     _df_surface_view_benchmark_free   (Benchmark     *bench);

/* df-surface-view-overlay.c: fills line_data and solid_data from curves, frames, arrows and the
 * marker, marks them dirty and queues a render. */
void     _df_surface_view_rebuild_overlay  (DfSurfaceView *self);
void     _df_surface_view_curve_free       (Curve         *curve);

/* df-surface-view-net.c: appends the net's segments to line_data (rebuild_overlay calls it). */
void     _df_surface_view_net_append       (DfSurfaceView *self);

/* df-surface-view-gl.c; all need the area's context current. */
gboolean _df_surface_view_gl_create        (ViewGl        *gl,
                                            GError       **error);
void     _df_surface_view_gl_delete        (ViewGl        *gl);
void     _df_surface_view_gl_upload        (DfSurfaceView *self);
void     _df_surface_view_gl_draw          (DfSurfaceView *self,
                                            int            width,
                                            int            height,
                                            gboolean       coarse);
/* Renders into an offscreen framebuffer of width x height and reads it back, bottom row first,
 * as RGBA into pixels (4 * width * height bytes). Rebinds the area's own buffers after. */
gboolean _df_surface_view_gl_read_pixels   (DfSurfaceView *self,
                                            int            width,
                                            int            height,
                                            guchar        *pixels);

/* df-surface-view-points.c; the GL ones need the area's context current. */
gboolean _df_surface_view_points_create    (ViewPoints    *points,
                                            GError       **error);
void     _df_surface_view_points_delete    (ViewPoints    *points);
void     _df_surface_view_points_upload    (ViewPoints    *points);
void     _df_surface_view_points_draw      (DfSurfaceView *self,
                                            const float   *view,
                                            const float   *proj);
void     _df_surface_view_points_clear     (ViewPoints    *points);

G_END_DECLS
