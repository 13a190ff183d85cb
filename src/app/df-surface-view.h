/* df-surface-view.h: the 3D view of the surface (a GtkGLArea): shaded mesh with curvature
 * colouring and iso-parameter lines, overlay curves, transported frames, arrows and a marker;
 * orbit/zoom/pan camera, picking of chart points, PNG export and an orbit benchmark.
 * The mesh comes from the core (df-mesh); this widget only draws and picks. */
#pragma once

#include <gtk/gtk.h>

#include "df-surface.h"

G_BEGIN_DECLS

#define DF_TYPE_SURFACE_VIEW (df_surface_view_get_type ())
G_DECLARE_FINAL_TYPE (DfSurfaceView, df_surface_view, DF, SURFACE_VIEW, GtkGLArea)

typedef enum
{
  DF_SHADING_PLAIN,
  DF_SHADING_GAUSSIAN,
  DF_SHADING_MEAN
} DfShading;

typedef enum
{
  DF_VIEW_ISO,
  DF_VIEW_TOP,
  DF_VIEW_FRONT,
  DF_VIEW_SIDE
} DfStandardView;

typedef enum
{
  DF_INTERACTION_ORBIT,
  DF_INTERACTION_PICK
} DfInteraction;

/* The diverging colour scale shared by the shader and the legend: s in [-1, 1] (clamped), from
 * deep blue (negative) through a warm white (zero) to burnt orange (positive). */
#define DF_SHADING_RAMP_STOPS 5
void        df_shading_ramp_colour              (double   s,
                                                 GdkRGBA *colour);

GtkWidget  *df_surface_view_new                 (void);

/* Copies the surface (df_surface_copy); NULL clears. The mesh is rebuilt on a worker thread
 * (the newest request wins); "mesh-ready" is emitted when it is in place. The camera is fitted
 * the first time only. */
void        df_surface_view_set_surface         (DfSurfaceView    *self,
                                                 const df_surface *surface);
/* Frames the next mesh that lands (e.g. after another preset was chosen: the old view may
 * show none of the new shape). */
void        df_surface_view_fit_next_mesh       (DfSurfaceView    *self);
/* Borrowed; NULL when there is none. */
const df_surface *df_surface_view_get_surface   (DfSurfaceView    *self);
/* TRUE while a mesh is being built ("busy" property). */
gboolean    df_surface_view_get_busy            (DfSurfaceView    *self);
/* Why part (or all) of the surface is not drawn, e.g. "point (u = 0.9, v = 0.9): ...: sqrt of
 * -0.62"; NULL when the whole chart evaluated. Valid until the next mesh. */
const char *df_surface_view_get_mesh_problem    (DfSurfaceView    *self);

void        df_surface_view_set_shading         (DfSurfaceView    *self,
                                                 DfShading         shading);
DfShading   df_surface_view_get_shading         (DfSurfaceView    *self);
void        df_surface_view_set_iso_lines       (DfSurfaceView    *self,
                                                 gboolean          show);

/* Polylines in space (loops, paths, geodesics); the view copies the data. width in px. */
void        df_surface_view_set_curve           (DfSurfaceView    *self,
                                                 guint             id,
                                                 const double    (*xyz)[3],
                                                 gsize             n,
                                                 gboolean          closed,
                                                 const GdkRGBA    *colour,
                                                 float             width);
void        df_surface_view_remove_curve        (DfSurfaceView    *self,
                                                 guint             id);
void        df_surface_view_clear_curves        (DfSurfaceView    *self);

/* Transported frame arrows at samples: origin, carried vector, partner vector (unit, in space);
 * drawn at a fraction of the surface size. The first and last are highlighted (start and
 * returned vector). n = 0 clears. */
void        df_surface_view_set_frames          (DfSurfaceView    *self,
                                                 const double    (*origin)[3],
                                                 const double    (*vec)[3],
                                                 const double    (*partner)[3],
                                                 gsize             n);

/* Free arrows (e.g. the two carried vectors of a comparison); id-based like curves. Only the
 * direction of dir counts: arrows are drawn at the highlighted frame length. */
void        df_surface_view_set_arrow           (DfSurfaceView    *self,
                                                 guint             id,
                                                 const double      origin[3],
                                                 const double      dir[3],
                                                 const GdkRGBA    *colour);
void        df_surface_view_remove_arrow        (DfSurfaceView    *self,
                                                 guint             id);

/* A woven ply's net (df-drape-job.c): n vertices of 8 floats each (x, y, z, r, g, b, a, width
 * in px), in pairs, one segment a pair; copied. NULL or 0 removes it. */
void        df_surface_view_set_net             (DfSurfaceView    *self,
                                                 const float      *vertices,
                                                 gsize             n);

void        df_surface_view_set_marker          (DfSurfaceView    *self,
                                                 const double     *xyz,
                                                 const GdkRGBA    *colour);

void        df_surface_view_fit_all             (DfSurfaceView    *self);
void        df_surface_view_set_standard_view   (DfSurfaceView    *self,
                                                 DfStandardView    view);
void        df_surface_view_set_interaction     (DfSurfaceView    *self,
                                                 DfInteraction     mode);
DfInteraction df_surface_view_get_interaction   (DfSurfaceView    *self);

/* Ray cast through a widget point: CPU ray-mesh intersection, then refined on the true surface
 * with df_surface_project from the hit point, so (u, v) lies exactly on the surface. FALSE when
 * the ray misses (u, v untouched). */
gboolean    df_surface_view_pick                (DfSurfaceView    *self,
                                                 double            widget_x,
                                                 double            widget_y,
                                                 double           *u,
                                                 double           *v);

/* Saves what the view shows as PNG (a render into an offscreen framebuffer at the widget's size
 * in device pixels), written atomically. Fails if the view is not realized or GL failed. */
gboolean    df_surface_view_save_png            (DfSurfaceView    *self,
                                                 const char       *path,
                                                 GError          **error);

/* Renders the view into an image of width x height device pixels (0, 0: the widget's size),
 * the camera's framing kept, for the annotated PNG and the design record (cairo_surface_destroy
 * it). NULL with error when the view is not realized or GL failed. */
cairo_surface_t *df_surface_view_render_image   (DfSurfaceView    *self,
                                                 int               width,
                                                 int               height,
                                                 GError          **error);
/* Where a point in space lands in a width x height picture of the view (origin top left); FALSE
 * behind the eye. */
gboolean    df_surface_view_project_point       (DfSurfaceView    *self,
                                                 const double      xyz[3],
                                                 int               width,
                                                 int               height,
                                                 double           *px,
                                                 double           *py);
/* The camera's eye point in space. */
void        df_surface_view_get_eye             (DfSurfaceView    *self,
                                                 double            eye[3]);
/* Turns the camera to yaw_deg about +z and pitch_deg above the xy plane (a saved view). */
void        df_surface_view_set_angles          (DfSurfaceView    *self,
                                                 double            yaw_deg,
                                                 double            pitch_deg);
/* The camera's angles in degrees (yaw about +z, 0 = eye on +x; pitch above the xy plane). */
void        df_surface_view_get_angles          (DfSurfaceView    *self,
                                                 double           *yaw_deg,
                                                 double           *pitch_deg);

/* Shading range (symmetric, +/- max |value|) for the legend, in 1/unit^2 (K) or 1/unit (H);
 * 0, 0 for plain shading or no surface. The max is taken over 99 % of the surface's area, so
 * a divergence on a sliver (a cone apex, a cusp) does not wash the colours out; the values
 * beyond are drawn in the end colours, and get_shading_clipped says on which side values lie
 * beyond the range (for a legend's "<=" and ">="). Rounding noise
 * (K, H of a developable or minimal surface) gives 0, 0. */
void        df_surface_view_get_shading_range   (DfSurfaceView    *self,
                                                 double           *lo,
                                                 double           *hi);
void        df_surface_view_get_shading_clipped (DfSurfaceView    *self,
                                                 gboolean         *below,
                                                 gboolean         *above);

/* Runs n frames of orbit animation (one full turn) and reports the frame-to-frame times through
 * the callback when done (median and 95th percentile in ms), with the median time the window
 * spent making each frame (from the frame clock's update phase to the end of its paint: what is
 * left of a frame is waiting for the clock), for a benchmark mode. The camera returns to where
 * it was. */
void        df_surface_view_run_orbit_benchmark (DfSurfaceView    *self,
                                                 guint             n_frames,
                                                 void            (*done) (double   median_ms,
                                                                          double   p95_ms,
                                                                          double   work_ms,
                                                                          gpointer user),
                                                 gpointer          user);

G_END_DECLS
