/* df-surface-view-field.h: a colouring of DfSurfaceView given from outside, such as the
 * developability map: one value per vertex of the mesh now shown, drawn on the view's
 * diverging scale over +/- range in place of the curvature, until it is cleared or a new mesh
 * lands. The view stays a drawing widget: the values are the caller's. */
#pragma once

#include "df-surface-view.h"

G_BEGIN_DECLS

/* The chart points (u, v) of the mesh's vertices, 2 per vertex (newly allocated), for the
 * caller to put values at; NULL when there is no mesh. */
double    *df_surface_view_get_vertex_uv (DfSurfaceView *self,
                                          gsize         *n_vertices);
/* values: n_vertices of them (copied), for the mesh get_vertex_uv described; FALSE (nothing
 * changes) when that mesh is no longer shown. range > 0. */
gboolean   df_surface_view_set_field     (DfSurfaceView *self,
                                          const float   *values,
                                          gsize          n_vertices,
                                          double         range);
void       df_surface_view_clear_field   (DfSurfaceView *self);
gboolean   df_surface_view_has_field     (DfSurfaceView *self);

G_END_DECLS
