/* df-geodesic-panel.h: DfGeodesicPanel, the side panel of the Geodesic tool: where the shot
 * starts, its heading, the length asked and reached, and why it stopped early. */
#pragma once

#include <gtk/gtk.h>

#include "df-display-units.h"
#include "df-glib.h"

G_BEGIN_DECLS

#define DF_TYPE_GEODESIC_PANEL (df_geodesic_panel_get_type ())
G_DECLARE_FINAL_TYPE (DfGeodesicPanel, df_geodesic_panel, DF, GEODESIC_PANEL, GtkWidget)

GtkWidget *df_geodesic_panel_new        (void);
void       df_geodesic_panel_show       (DfGeodesicPanel          *self,
                                         const df_surface         *surface,
                                         double                    heading_rad,
                                         double                    requested,
                                         const df_geodesic_result *result,
                                         const DfDisplayUnits     *du);
void       df_geodesic_panel_show_error (DfGeodesicPanel *self, const char *message);
void       df_geodesic_panel_clear      (DfGeodesicPanel *self);
/* The typed-shot entries: what the start asks for, the heading's reference ("0° = along +t,
 * anticlockwise about N") and the display unit lengths are typed in. Texts come back in "shoot-requested" (start,
 * heading, length strings). */
void       df_geodesic_panel_set_chart  (DfGeodesicPanel *self, const char *start_hint,
                                         const char *reference, const char *units);
void       df_geodesic_panel_focus_entry (DfGeodesicPanel *self);

/* The curve against the project's limits (df-curve-verdicts.h), or NULL to hide. */
void       df_geodesic_panel_show_verdicts (DfGeodesicPanel *self, const char *text);

G_END_DECLS
