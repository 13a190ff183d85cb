/* df-window-tools-private.h: what the files of the window's tools share (df-window-tools*.c):
 * stroke limits, tool colours, the stroke point, and the functions one tool's file calls in
 * another's. */
#pragma once

#include "df-window-private.h"

G_BEGIN_DECLS

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

/* df-window-tools.c */
GdkRGBA
_df_window_rgba (const char *spec);
gboolean
_df_window_surface_point (DfWindow *self,
                          double    u,
                          double    v,
                          double    xyz[3]);
double (*_df_window_stroke_uv (GArray *stroke))[2];
void
_df_window_draw_stroke (DfWindow   *self,
                        guint       id,
                        GArray     *stroke,
                        const char *colour_spec,
                        float       width);

/* df-window-tools-sketch.c */
void
_df_window_stroke_begin (DfWindow *self,
                         double    u,
                         double    v);
gboolean
_df_window_stroke_add (DfWindow *self,
                       double    u,
                       double    v);
const char *
_df_window_stroke_problem (DfWindow *self,
                           guint     min_points);
void
_df_window_live_start (DfWindow *self);
void
_df_window_live_stop (DfWindow *self);
void
_df_window_sketch_finish (DfWindow *self);

/* df-window-tools-geodesic.c */
void
_df_window_probe_at (DfWindow *self,
                     double    u,
                     double    v);
void
_df_window_geodesic_aim (DfWindow *self,
                         double    u,
                         double    v);
void
_df_window_geodesic_shoot (DfWindow *self,
                           double    u,
                           double    v);
/* Shoots from self->geodesic_start; record: keep it in the document (an undoable edit). */
void
_df_window_shoot_from (DfWindow *self,
                       double    heading,
                       double    length,
                       gboolean  record);

/* df-window-tools-paths.c */
void
_df_window_paths_set_stage (DfWindow     *self,
                            DfPathsStage  stage);
void
_df_window_paths_finish_stroke (DfWindow *self);
void
_df_window_paths_compare (DfWindow *self,
                          gboolean  record);

/* df-window-points.c: TRUE when the chart points p and q lie farther apart in space than a
 * path's ends may (a hundredth of the surface's size). */
gboolean
_df_window_far_apart (DfWindow     *self,
                      const double  p[2],
                      const double  q[2]);

/* df-window-tools-typed.c */
void
_df_window_probe_requested_cb (DfProbePanel *panel,
                               const char   *text,
                               DfWindow     *self);
void
_df_window_shoot_requested_cb (DfGeodesicPanel *panel,
                               const char      *start_text,
                               const char      *heading_text,
                               const char      *length_text,
                               DfWindow        *self);
void
_df_window_update_typed_hints (DfWindow *self);

G_END_DECLS
