/* df-drape-window.h: DfDrapeWindow, the woven-ply drape of one loop of the project (issue 12):
 * the ply (a loop of the loops panel), the start pin typed in the chart's own names or picked
 * and dragged on the surface (the main window forwards the view's picks, df-window-drape.c),
 * the warp angle from the first chart direction and the cell size; the net drawn over the view
 * coloured by shear with its own legend and crosses on the cells past [limits] max-shear-deg,
 * the numbers with the limits and their sources, the flat pattern beside them, exports of the
 * flat pattern (SVG at true scale, the core's writer) and of the pins and the flat outline
 * (CSV), and the caution. Kept while the main window lives (closing hides it and its net). */
#pragma once

#include <gtk/gtk.h>

#include "df-document.h"
#include "df-surface-view.h"

G_BEGIN_DECLS

#define DF_TYPE_DRAPE_WINDOW (df_drape_window_get_type ())
G_DECLARE_FINAL_TYPE (DfDrapeWindow, df_drape_window, DF, DRAPE_WINDOW, GtkWindow)

/* view_legend: the view's own legend; its parent overlay takes the drape's legend.
 * report_events: print "drape-start U V" (chart, radians) and "draped CELLS MAX_SHEAR_DEG ENCLOSED_RAD CELLS_OVER_LIMIT" for every
 * finished (not dragging) drape, "drape-flags COUNT WORST_DEG" when a locking angle is set,
 * "drape-failed MESSAGE" and "drape-exported svg|csv|flat PATH". */
GtkWidget *df_drape_window_new         (GtkWindow     *parent,
                                        DfDocument    *document,
                                        DfSurfaceView *view,
                                        GtkWidget     *view_legend,
                                        gboolean       report_events);
/* TRUE while "Pick the start on the surface" is on. */
gboolean   df_drape_window_get_picking (DfDrapeWindow *self);
void       df_drape_window_set_picking (DfDrapeWindow *self,
                                        gboolean       on);
/* The start pin picked at chart point (u, v): while dragging (final FALSE) the net alone is
 * redrawn (no closure check; a request while one runs replaces the waiting one), on release
 * (final TRUE) the full result. Also fills the typed fields. */
void       df_drape_window_pick        (DfDrapeWindow *self,
                                        double         u,
                                        double         v,
                                        gboolean       final);
/* Chooses the loop (by name) and the values as typed, then drapes (the Drape button's path);
 * for --drape and tests. FALSE with a message in the window when no loop has that name. */
gboolean   df_drape_window_set_typed   (DfDrapeWindow *self,
                                        const char    *loop_name,
                                        const char    *start_u,
                                        const char    *start_v,
                                        const char    *warp_deg,
                                        const char    *cell);
/* Called on the main thread each time a net lands in the view (for the drag benchmark):
 * final as requested, drape_ms the core's time, ms the worker's (drape and vertices). */
void       df_drape_window_set_shown_cb (DfDrapeWindow *self,
                                         void         (*cb) (gboolean final, double drape_ms,
                                                             double ms, gpointer user),
                                         gpointer       user);

/* Called when "Pick the start on the surface" is switched on or off. */
void       df_drape_window_set_picking_cb (DfDrapeWindow *self,
                                           void         (*cb) (gboolean on, gpointer user),
                                           gpointer       user);

G_END_DECLS
