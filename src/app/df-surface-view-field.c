/* df-surface-view-field.c: a colouring given from outside (see df-surface-view-field.h). It
 * is kept with the mesh it was made for and rides in the K slot of a copy of the vertices at
 * upload; the shader is unchanged. */
#include "df-surface-view-private.h"
#include "df-surface-view-field.h"

double *
df_surface_view_get_vertex_uv (DfSurfaceView *self,
                               gsize         *n_vertices)
{
  double *uv;
  gsize n;

  g_return_val_if_fail (DF_IS_SURFACE_VIEW (self), NULL);
  *n_vertices = 0;
  if (self->mesh == NULL || self->mesh->mesh == NULL)
    return NULL;
  n = df_mesh_n_vertices (self->mesh->mesh);
  if (n == 0)
    return NULL;
  uv = g_memdup2 (df_mesh_uv (self->mesh->mesh), 2 * n * sizeof *uv);
  *n_vertices = n;
  return uv;
}

gboolean
df_surface_view_set_field (DfSurfaceView *self,
                           const float   *values,
                           gsize          n_vertices,
                           double         range)
{
  g_return_val_if_fail (DF_IS_SURFACE_VIEW (self), FALSE);
  g_return_val_if_fail (range > 0, FALSE);

  if (self->mesh == NULL || self->mesh->mesh == NULL
      || df_mesh_n_vertices (self->mesh->mesh) != n_vertices)
    return FALSE;
  g_free (self->field);
  self->field = g_memdup2 (values, n_vertices * sizeof *values);
  self->field_mesh = self->mesh;
  self->field_range = range;
  self->mesh_dirty = TRUE;
  gtk_gl_area_queue_render (GTK_GL_AREA (self));
  return TRUE;
}

void
df_surface_view_clear_field (DfSurfaceView *self)
{
  g_return_if_fail (DF_IS_SURFACE_VIEW (self));
  if (self->field == NULL)
    return;
  _df_surface_view_field_free (self);
  self->mesh_dirty = TRUE;
  gtk_gl_area_queue_render (GTK_GL_AREA (self));
}

gboolean
df_surface_view_has_field (DfSurfaceView *self)
{
  g_return_val_if_fail (DF_IS_SURFACE_VIEW (self), FALSE);
  return _df_surface_view_field_active (self);
}

gboolean
_df_surface_view_field_active (DfSurfaceView *self)
{
  return self->field != NULL && self->field_mesh == self->mesh && self->mesh != NULL;
}

const float *
_df_surface_view_field_vertices (DfSurfaceView *self,
                                 gboolean      *copied)
{
  gsize n = df_mesh_n_vertices (self->mesh->mesh);
  float *v;

  *copied = FALSE;
  if (!_df_surface_view_field_active (self))
    return self->mesh->vertices;
  v = g_memdup2 (self->mesh->vertices, n * SURFACE_STRIDE * sizeof (float));
  for (gsize i = 0; i < n; i++)
    v[i * SURFACE_STRIDE + 8] = self->field[i];
  *copied = TRUE;
  return v;
}

void
_df_surface_view_field_free (DfSurfaceView *self)
{
  g_clear_pointer (&self->field, g_free);
  self->field_mesh = NULL;
  self->field_range = 0;
}
