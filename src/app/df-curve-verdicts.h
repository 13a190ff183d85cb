/* df-curve-verdicts.h: a geodesic's or an open path's verdicts against the project's limits, as
 * the text the Geodesic and Paths panels show: the core's df_verdicts_geodesic /
 * df_verdicts_path on a fine sampling (the one `check` uses, so both agree), worded by
 * df-verdict-text, with the caution. Computes nothing itself. */
#pragma once

#include <gtk/gtk.h>

#include "df-decide-out.h"
#include "df-glib.h"

G_BEGIN_DECLS

/* Samples the verdicts are taken on (as `driftframe-cli check`). */
#define DF_CURVE_VERDICT_SAMPLES 2000

/* NULL when the project sets no limit that applies to a curve (steering radius, fibre
 * deviation, friction); else the text, or why the curve could not be checked. The caller adds
 * the caution (DF_CURVE_VERDICTS_CAUTION) once below all of it. */
#define DF_CURVE_VERDICTS_CAUTION DF_DECIDE_CAUTION
char *df_curve_verdicts_geodesic_text (const df_surface *surface, const df_limits *limits,
                                       double u, double v, double heading_rad, double length,
                                       const char *units);
char *df_curve_verdicts_path_text     (const df_surface *surface, const df_limits *limits,
                                       const double (*uv)[2], gsize n, const char *label,
                                       const char *units);

/* A hidden, wrapping, selectable note label put in the box right after sibling, for a panel
 * to show the text above in; NULL when sibling's parent is no GtkBox. */
GtkLabel *df_curve_verdicts_label_after (GtkWidget *sibling);

G_END_DECLS
