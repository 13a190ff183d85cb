/* df-devmap-legend.h: DfDevmapLegend, the legend of the developability map drawn over the 3D
 * view: the colour scale from -range to +range in degrees (enclosed curvature) or percent (rim
 * strain), and the user's max-strain-percent ticked on it with its source. */
#pragma once

#include <gtk/gtk.h>

G_BEGIN_DECLS

#define DF_TYPE_DEVMAP_LEGEND (df_devmap_legend_get_type ())
G_DECLARE_FINAL_TYPE (DfDevmapLegend, df_devmap_legend, DF, DEVMAP_LEGEND, GtkDrawingArea)

GtkWidget *df_devmap_legend_new (void);
/* limit <= 0: none marked. */
void       df_devmap_legend_set (DfDevmapLegend *self,
                                 const char     *title,
                                 const char     *units,
                                 double          range,
                                 double          limit,
                                 const char     *limit_source);

G_END_DECLS
