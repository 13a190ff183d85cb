/* df-flat-pattern-view.h: DfFlatPatternView, the flat pattern of a woven-ply drape drawn with
 * cairo: the ply's cut outline on the flat fabric, the square cells of side h (every few when
 * they are too small to see), the cells past the locking angle shaded and crossed, the start
 * pin, a scale bar and the pattern's size in the display units. Seen from the side N points
 * to, warp to the right, weft up (the SVG writer's view, df-drape-out.h). */
#pragma once

#include <gtk/gtk.h>

#include "df-display-units.h"
#include "df-drape.h"

G_BEGIN_DECLS

#define DF_TYPE_FLAT_PATTERN_VIEW (df_flat_pattern_view_get_type ())
G_DECLARE_FINAL_TYPE (DfFlatPatternView, df_flat_pattern_view, DF, FLAT_PATTERN_VIEW,
                      GtkDrawingArea)

GtkWidget *df_flat_pattern_view_new (void);
/* drape is borrowed: the caller keeps it until the next call (NULL clears). */
void       df_flat_pattern_view_set (DfFlatPatternView *self,
                                     const df_drape    *drape,
                                     const DfDisplayUnits *du);  /* NULL: unchanged */

G_END_DECLS
