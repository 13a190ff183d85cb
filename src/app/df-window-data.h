/* df-window-data.h: the window's surfaces from data (df-window-data.c), for the df-window-*.c
 * files only. */
#pragma once

#include "df-window-private.h"

G_BEGIN_DECLS

/* The action win.import-data and its key (Ctrl+Shift+P). */
void     _df_window_data_class_init (GtkWidgetClass        *widget_class);
/* The drop target and the fit summary's signals; after the template is set up. */
void     _df_window_data_init       (DfWindow              *self);
void     _df_window_data_finalize   (DfWindow              *self);
/* The document's surface changed: the fit summary and the data points follow it. */
void     _df_window_data_sync       (DfWindow              *self);
/* Fits spec (a data surface) on a worker thread; the document takes it when it is done, and
 * keeps its surface (the reason shown) when it fails. */
void     _df_window_data_fit        (DfWindow              *self,
                                     const df_surface_spec *spec);
/* A file given by the user: a data file is fitted (a mesh, or from a drop an x,y,z table,
 * asks first), a loop CSV imported, a project or surface opened. as_data: it came from
 * "From measured data", so x,y,z means heights. FALSE (said in the status and a dialog)
 * when the file is none of these. */
gboolean _df_window_data_take_file  (DfWindow              *self,
                                     const char            *path,
                                     gboolean               as_data);

/* --bench-mesh: times the display mesh of the document's surface from the request to the
 * mesh in place (worker thread, vertex arrays, hand-over) a few times, prints them, quits. */
void     _df_window_data_bench_mesh (DfWindow              *self);

G_END_DECLS
