/* df-drape-out.h: writers for a woven-ply drape (df-drape.h): the pins as CSV, the flat
 * pattern as CSV and as SVG at true scale, and the JSON members of the result. Files are
 * written atomically. Reader/writer layer: GLib and json-glib allowed. */
#pragma once

#include <glib.h>
#include <json-glib/json-glib.h>

#include "df-drape.h"

G_DEFINE_AUTOPTR_CLEANUP_FUNC (df_drape, df_drape_free)
G_DEFINE_AUTOPTR_CLEANUP_FUNC (df_drape_block, df_drape_block_free)

/* The caution printed beside every drape result. */
#define DF_DRAPE_CAUTION                                                                       \
  "A kinematic drape ignores material behaviour (friction, tension, bending stiffness, "     \
  "wrinkling); a locking angle alone is not a wrinkling criterion; confirm with trials. A "  \
  "geometric estimate, not a material or structural assessment: limits come from the "       \
  "supplier's data and your own trials."

/* One row per placed pin: i,j,u,v,x,y,z,inside,shear_deg,warp_deviation_deg,flat_x,flat_y. */
char    *df_drape_nodes_to_csv (const df_drape *drape);
gboolean df_drape_nodes_write  (const char *path, const df_drape *drape, GError **error);
/* The _scaled forms multiply every length (x, y, z, flat_x, flat_y, the cell, the flat size;
 * the area by f^2) by f: a unit conversion (df_unit_length (1, model, display)). Chart
 * coordinates and angles stay as they are. */
char    *df_drape_nodes_to_csv_scaled (const df_drape *drape, double f);
gboolean df_drape_nodes_write_scaled  (const char *path, const df_drape *drape, double f,
                                       GError **error);

/* The ply outline on the flat fabric, one row per outline point:
 * u,v,flat_x,flat_y (flat fields empty for a point that lies in no cell). */
char    *df_drape_flat_to_csv  (const df_drape *drape);
gboolean df_drape_flat_write   (const char *path, const df_drape *drape, GError **error);
char    *df_drape_flat_to_csv_scaled (const df_drape *drape, double f);
gboolean df_drape_flat_write_scaled  (const char *path, const df_drape *drape, double f,
                                      GError **error);

/* The boundary of the whole cells (df_drape_whole_boundary) as a loop CSV `u,v` that
 * `measure` reads, per_segment points a thread segment, '#' lines saying what it bounds;
 * *info filled. NULL / an error naming the file when there is no whole cell. */
char    *df_drape_boundary_to_csv (const df_drape *drape, int per_segment,
                                   df_drape_boundary_info *info);
gboolean df_drape_boundary_write  (const char *path, const df_drape *drape, int per_segment,
                                   df_drape_boundary_info *info, GError **error);

/* The flat pattern as SVG at true scale (width and height with units: mm, cm and in as they
 * are, m converted to mm; other units are written as plain user units): the cut outline, the
 * thread lattice every h, the cells past the locking angle shaded, the start pin, seen from the
 * side N points to. */
char    *df_drape_flat_to_svg  (const df_drape *drape, const char *units);
gboolean df_drape_svg_write    (const char *path, const df_drape *drape, const char *units,
                                GError **error);

/* The members of the result into an open object: max_shear_deg, max_shear_at [u, v], cells,
 * cells_over_limit, flat_area, enclosed_curvature_rad, cell_closure_max_residual_rad,
 * caution, and more (see the README). */
void     df_json_add_drape     (JsonBuilder *builder, const df_drape *drape);
void     df_json_add_drape_scaled (JsonBuilder *builder, const df_drape *drape, double f);
