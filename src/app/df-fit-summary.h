/* df-fit-summary.h: DfFitSummary, the part of the surface panel for a surface fitted to
 * measured or CAD data: which file, how good the fit is (points, RMS and largest distance and
 * where, the tolerance and whether it was chosen from the data), the fit tolerance to edit
 * (empty: chosen from the data), a switch for the data points drawn over the surface and the
 * legend of their deviation. Shows numbers it is given; fits nothing itself. */
#pragma once

#include <gtk/gtk.h>

#include "df-display-units.h"
#include "df-glib.h"

G_BEGIN_DECLS

#define DF_TYPE_FIT_SUMMARY (df_fit_summary_get_type ())
G_DECLARE_FINAL_TYPE (DfFitSummary, df_fit_summary, DF, FIT_SUMMARY, GtkWidget)

GtkWidget *df_fit_summary_new            (void);
/* The spec's file and tolerance text; info NULL while the fit is not known yet. */
void       df_fit_summary_set_fit        (DfFitSummary          *self,
                                          const df_surface_spec *spec,
                                          const df_fit_info     *info,
                                          const DfDisplayUnits  *du);
/* A refit is running (spinner, "Fitting…") or not. */
void       df_fit_summary_set_busy       (DfFitSummary *self,
                                          gboolean      busy);
/* Why the last refit or import failed (shown in the panel), NULL clears. */
void       df_fit_summary_set_error      (DfFitSummary *self,
                                          const char   *message);
/* The deviation scale of the drawn points, +/- range in the surface's units, shown in du's (0: no points); clamped: some
 * points lie beyond it (the legend's ends then read "≤" and "≥"). */
void       df_fit_summary_set_deviation  (DfFitSummary *self,
                                          double        range,
                                          gboolean      clamped,
                                          gsize         n_shown,
                                          gsize         n_data,
                                          const DfDisplayUnits *du);
gboolean   df_fit_summary_get_show_points (DfFitSummary *self);

/* The colour of a deviation s in [-1, 1] (clamped) for the data points and their legend:
 * teal below the fit, a dark grey on it, magenta above; apart from the curvature colours. */
void       df_deviation_colour           (double s,
                                          float  rgb[3]);

G_END_DECLS
