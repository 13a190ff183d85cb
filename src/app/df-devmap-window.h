/* df-devmap-window.h: DfDevmapWindow, the developability map as a colouring of the view: the
 * patch radius a (the user's choice; the project's patch-size when set), strain or enclosed
 * curvature, the grid; computed on a worker thread with progress and a stop button; its legend
 * over the view with the user's max-strain-percent marked; export as PNG (the view's image)
 * and as the core's CSV grid; the caution. Kept while the main window lives (closing hides
 * it); the map colours the view until "back to the curvature colouring", another colouring,
 * or a new surface. */
#pragma once

#include <gtk/gtk.h>

#include "df-document.h"
#include "df-surface-view.h"

G_BEGIN_DECLS

#define DF_TYPE_DEVMAP_WINDOW (df_devmap_window_get_type ())
G_DECLARE_FINAL_TYPE (DfDevmapWindow, df_devmap_window, DF, DEVMAP_WINDOW, GtkWindow)

/* view_legend: the view's own legend, faded while the map shows; its parent overlay takes the
 * map's legend. report_events: print "devmap-done OK TOTAL" and "devmap-exported png|csv
 * PATH". */
GtkWidget *df_devmap_window_new (GtkWindow     *parent,
                                 DfDocument    *document,
                                 DfSurfaceView *view,
                                 GtkWidget     *view_legend,
                                 gboolean       report_events);

G_END_DECLS
