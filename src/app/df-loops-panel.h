/* df-loops-panel.h: DfLoopsPanel, the side panel listing the project's loops (select; rename in
 * the details heading) and showing the selected loop's measurements with units, the notes on
 * discs and self-crossings, and the fabrication caution. Also the live readout while a loop is
 * being sketched. Delete, frames and exports are window actions named in the template. */
#pragma once

#include <gtk/gtk.h>

#include "df-document.h"

G_BEGIN_DECLS

#define DF_TYPE_LOOPS_PANEL (df_loops_panel_get_type ())
G_DECLARE_FINAL_TYPE (DfLoopsPanel, df_loops_panel, DF, LOOPS_PANEL, GtkWidget)

GtkWidget  *df_loops_panel_new           (void);
void        df_loops_panel_set_document  (DfLoopsPanel *self, DfDocument *document);
/* The selected loop (borrowed) or NULL. */
DfLoopItem *df_loops_panel_get_selected  (DfLoopsPanel *self);
/* Puts the selected loop's name into editing (F2). */
void        df_loops_panel_start_rename  (DfLoopsPanel *self);
void        df_loops_panel_select        (DfLoopsPanel *self, DfLoopItem *item);
/* Text above the list while a loop is being sketched; NULL hides it. */
void        df_loops_panel_set_live_text (DfLoopsPanel *self, const char *text);
/* Prints "loop-shown NAME UNIT LENGTH AREA STEERING_RADIUS CURVATURE_UNIT MEAN_K" (the values
 * shown, converted to the display units) each time a measured loop's details are shown. */
void        df_loops_panel_set_report_events (DfLoopsPanel *self, gboolean report);

G_END_DECLS
