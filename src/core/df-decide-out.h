/* df-decide-out.h: the decision layer's exports: a gore pattern as SVG at true scale (width and
 * height carry the units, so a browser or a print at 100 % shows it life size) and as CSV
 * outline points, and the developability map as a CSV grid. Values are written in the display
 * units (df-units.h); every file carries the caution and is written atomically.
 * Reader/writer layer: GLib. */
#pragma once

#include <glib.h>

#include "df-devmap.h"
#include "df-gores.h"
#include "df-units.h"

/* The caution that stands beside every verdict and in every export of this layer. */
#define DF_DECIDE_CAUTION                                                                        \
  "Geometric indicators only; limits come from the user's material data and trials; decisions " \
  "follow the applicable codes and licensed engineering review."

/* seam: allowance in the display unit (0 for none); label: a title such as the surface file. */
gboolean df_gores_svg_write  (const char *path, const df_gores *gores, df_unit model,
                              df_unit display, double seam, const char *label, GError **error);
/* Columns outline,x,y: the sewing line ("sewing"), then the cutting line with the seam
 * allowance ("cutting") when seam > 0; '#' comment lines first (units, counts, caution). */
gboolean df_gores_csv_write  (const char *path, const df_gores *gores, df_unit model,
                              df_unit display, double seam, GError **error);
/* Columns u,v,x,y,z,enclosed_deg,strain_percent,circumference,area; empty fields where no
 * disc could be built. Lengths in display.length, K-based values need none. */
gboolean df_devmap_csv_write (const char *path, const df_surface *surface, const df_devmap *map,
                              df_unit model, df_unit display, GError **error);
