/* df-verdict-plot.h: DfVerdictPlot, the loop details' plots against arc length s: the
 * geodesic curvature k_g with the steering limit ±1/R, |k_g / k_n| with the friction
 * coefficient, and the fibre deviation with its largest allowed value, each limit a dashed line
 * and each stretch beyond it hatched (readable without colour). Draws with cairo and pango. */
#pragma once

#include <gtk/gtk.h>

#include "df-limits.h"
#include "df-display-units.h"
#include "df-loop-verdicts.h"

G_BEGIN_DECLS

#define DF_TYPE_VERDICT_PLOT (df_verdict_plot_get_type ())
G_DECLARE_FINAL_TYPE (DfVerdictPlot, df_verdict_plot, DF, VERDICT_PLOT, GtkDrawingArea)

GtkWidget *df_verdict_plot_new (void);
/* verdicts (may be NULL: nothing to plot) is observed; limits copied; du: the units
 * its axis labels are shown in. */
void       df_verdict_plot_set (DfVerdictPlot   *self,
                                DfLoopVerdicts  *verdicts,
                                const df_limits *limits,
                                const DfDisplayUnits *du);

G_END_DECLS
