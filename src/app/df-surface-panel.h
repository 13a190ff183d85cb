/* df-surface-panel.h: DfSurfacePanel, the side panel that edits the surface: a preset with its
 * parameter spin buttons, or formulas (revolution profile or height field) with inline errors
 * naming the column, the length unit, and the sentence saying which way N points. It keeps a
 * working copy of the spec and emits "spec-changed" (debounced) when it is worth building. */
#pragma once

#include <gtk/gtk.h>

#include "df-glib.h"

G_BEGIN_DECLS

#define DF_TYPE_SURFACE_PANEL (df_surface_panel_get_type ())
G_DECLARE_FINAL_TYPE (DfSurfacePanel, df_surface_panel, DF, SURFACE_PANEL, GtkWidget)

GtkWidget             *df_surface_panel_new             (void);
/* Shows spec (copied) without emitting "spec-changed". */
void                   df_surface_panel_set_spec        (DfSurfacePanel        *self,
                                                         const df_surface_spec *spec);
/* The working spec, valid until the next edit. */
const df_surface_spec *df_surface_panel_get_spec        (DfSurfacePanel *self);
/* Shows the builder's error next to the entry its key names ("r: column 5: ..."), or below
 * the form; NULL clears. */
void                   df_surface_panel_show_error      (DfSurfacePanel *self,
                                                         const GError   *error);
void                   df_surface_panel_set_normal_text (DfSurfacePanel *self,
                                                         const char     *text);
/* The DfFitSummary shown for a surface fitted to data. */
GtkWidget             *df_surface_panel_get_fit_summary (DfSurfacePanel *self);

G_END_DECLS
