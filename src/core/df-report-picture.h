/* df-report-picture.h: the report's own picture of a surface for a process without a display
 * (the CLI): a shaded orthographic view of the core's display mesh coloured by Gaussian
 * curvature, the loops drawn on it (hidden stretches dashed) with their names, and the colour
 * legend, all into a box of a cairo context. Reader/writer layer: GLib and cairo allowed. */
#pragma once

#include <cairo.h>
#include <glib.h>

#include "df-surface.h"

typedef struct
{
  const char *name;
  double      rgb[3];
  const double (*xyz)[3];  /* points along the loop in space */
  gsize       n;
  gboolean    closed;
} df_picture_curve;

/* Draws into the box (x, y, w, h) in cairo user units (points in a PDF), seen from yaw_deg
 * about +z (0: the eye on +x) and pitch_deg above the xy plane, as the app's camera. units names
 * the surface's length unit for the legend ("mm"). Open curves (geodesics, paths) are drawn
 * like loops. Fails only when the surface cannot be meshed. */
gboolean df_report_draw_picture (cairo_t                *cr,
                                 double                  x,
                                 double                  y,
                                 double                  w,
                                 double                  h,
                                 double                  yaw_deg,
                                 double                  pitch_deg,
                                 const df_surface       *surface,
                                 const char             *units,
                                 const df_picture_curve *curves,
                                 gsize                   n_curves,
                                 GError                **error);

/* Another colouring than K (the developability map): value_at gives the value at a chart
 * point (non-finite: no value, drawn grey), shaded on the same diverging scale over
 * [-range, range]; the legend shows caption and, when has_mark, ticks at +/- mark labelled
 * mark_label (a user's limit: readable without colour). */
typedef struct
{
  double    (*value_at) (double u, double v, void *user);
  void       *user;
  double      range;
  const char *caption;
  gboolean    has_mark;
  double      mark;
  const char *mark_label;
} df_picture_colouring;

/* df_report_draw_picture with colouring (NULL: K, as df_report_draw_picture). */
gboolean df_report_draw_picture_coloured (cairo_t                    *cr,
                                          double                      x,
                                          double                      y,
                                          double                      w,
                                          double                      h,
                                          double                      yaw_deg,
                                          double                      pitch_deg,
                                          const df_surface           *surface,
                                          const char                 *units,
                                          const df_picture_colouring *colouring,
                                          const df_picture_curve     *curves,
                                          gsize                       n_curves,
                                          GError                    **error);

/* df_report_draw_picture with the K legend in another unit: its numbers are the surface's K
 * times k_scale (df_unit_gaussian (1, model, unit)), per the square of k_units ("m"). */
gboolean df_report_draw_picture_k_scaled (cairo_t                *cr,
                                          double                  x,
                                          double                  y,
                                          double                  w,
                                          double                  h,
                                          double                  yaw_deg,
                                          double                  pitch_deg,
                                          const df_surface       *surface,
                                          const char             *k_units,
                                          double                  k_scale,
                                          const df_picture_curve *curves,
                                          gsize                   n_curves,
                                          GError                **error);
