/* df-probe-panel.h: DfProbePanel, the side panel of the Probe tool: everything the core knows
 * about the surface at one point (df_point_geometry), as tables with units and index names of
 * the chart, and which way N points. */
#pragma once

#include <gtk/gtk.h>

#include "df-display-units.h"
#include "df-glib.h"

G_BEGIN_DECLS

#define DF_TYPE_PROBE_PANEL (df_probe_panel_get_type ())
G_DECLARE_FINAL_TYPE (DfProbePanel, df_probe_panel, DF, PROBE_PANEL, GtkWidget)

GtkWidget *df_probe_panel_new        (void);
/* Shows the geometry at a point of surface: the point and curvatures in the display units,
 * chart coordinates and tensors in the surface's own. */
void       df_probe_panel_show       (DfProbePanel            *self,
                                      const df_surface        *surface,
                                      const df_point_geometry *geometry,
                                      const DfDisplayUnits    *du);
/* Shows a failure (e.g. the point is outside the domain) instead of the tables. */
void       df_probe_panel_show_error (DfProbePanel *self, const char *message);
void       df_probe_panel_clear      (DfProbePanel *self);
/* The typed-point entry: what it asks for (chart names of the surface), and the focus. Its
 * text comes back in "probe-requested" (string). */
void       df_probe_panel_set_placeholder (DfProbePanel *self, const char *text);
void       df_probe_panel_focus_entry     (DfProbePanel *self);

G_END_DECLS
