/* df-legend-bar.h: DfLegendBar, a small widget that draws the view's diverging colour scale with
 * its quantity, its symmetric end values and the display units (1/unit^2 for K, 1/unit for H).
 * It can follow a DfSurfaceView by itself (df_legend_bar_set_view). */
#pragma once

#include <gtk/gtk.h>

#include "df-display-units.h"
#include "df-surface-view.h"

G_BEGIN_DECLS

#define DF_TYPE_LEGEND_BAR (df_legend_bar_get_type ())
G_DECLARE_FINAL_TYPE (DfLegendBar, df_legend_bar, DF, LEGEND_BAR, GtkWidget)

GtkWidget  *df_legend_bar_new        (void);

/* Follows view's shading and "shading-range-changed" (view is not referenced; NULL stops). */
void        df_legend_bar_set_view   (DfLegendBar   *self,
                                      DfSurfaceView *view);

/* Length unit of the surface, e.g. "mm" (NULL: "mm"); also the "units" property. */
void        df_legend_bar_set_units  (DfLegendBar   *self,
                                      const char    *units);
const char *df_legend_bar_get_units  (DfLegendBar   *self);
/* The display units the end values and the title are shown in (the range stays in the
 * surface's units). */
void        df_legend_bar_set_display_units (DfLegendBar          *self,
                                             const DfDisplayUnits *du);

/* Sets what is shown directly, for use without a view. */
void        df_legend_bar_set_range  (DfLegendBar   *self,
                                      DfShading      shading,
                                      double         lo,
                                      double         hi);

G_END_DECLS
