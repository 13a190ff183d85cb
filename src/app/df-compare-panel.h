/* df-compare-panel.h: DfComparePanel, the side panel of the Two paths tool: which path is being
 * sketched, and the angle between the directions carried along the two paths to their common
 * end. */
#pragma once

#include <gtk/gtk.h>

#include "df-display-units.h"

G_BEGIN_DECLS

#define DF_TYPE_COMPARE_PANEL (df_compare_panel_get_type ())
G_DECLARE_FINAL_TYPE (DfComparePanel, df_compare_panel, DF, COMPARE_PANEL, GtkWidget)

GtkWidget *df_compare_panel_new        (void);
/* What to do next ("Drag path B ..."). */
void       df_compare_panel_set_hint   (DfComparePanel *self, const char *hint);
/* Point counts of the paths (0: not sketched yet). */
void       df_compare_panel_set_paths  (DfComparePanel *self, gsize n_a, gsize n_b);
/* The angle in radians, or NAN while none is known. */
void       df_compare_panel_set_angle  (DfComparePanel *self, double angle_rad);
void       df_compare_panel_show_error (DfComparePanel *self, const char *message);

/* Once compared: the paths described by their lengths in space. */
void       df_compare_panel_set_lengths (DfComparePanel *self, double length_a,
                                         double length_b, const DfDisplayUnits *du);

/* The curve against the project's limits (df-curve-verdicts.h), or NULL to hide. */
void       df_compare_panel_show_verdicts (DfComparePanel *self, const char *text);

G_END_DECLS
