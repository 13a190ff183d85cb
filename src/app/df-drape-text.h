/* df-drape-text.h: the wording of a drape's result in the drape window: the figures with their
 * units and chart names, the locking-angle and fibre-deviation flags with the limits' sources.
 * Formatting only. */
#pragma once

#include <glib.h>

#include "df-display-units.h"
#include "df-drape-job.h"
#include "df-limits.h"

G_BEGIN_DECLS

/* The chart's names: "t", "φ" (shown in degrees) on a surface of revolution, else "x", "y". */
void  df_drape_text_chart_names (const df_surface *surface, const char **u, const char **v);
/* "t = 90 mm, φ = -19.76°" for chart point (u, v) (df_du_format_chart_point). */
char *df_drape_text_point       (const DfDisplayUnits *du, const df_surface *surface,
                                 double u, double v);
/* The figures, one a line. final: the closure check was run (FALSE while dragging). */
char *df_drape_text_figures     (const DfDrapeResult *r, const df_surface *surface,
                                 const DfDisplayUnits *du, gboolean final);
/* The flags against max-shear-deg and max-fibre-deviation-deg, with the limits' sources, or
 * what to set when they are absent. */
char *df_drape_text_flags       (const DfDrapeResult *r, const df_surface *surface,
                                 const DfDisplayUnits *du, const df_limits *limits);

G_END_DECLS
