/* df-surface-view-net.c: a woven ply's net over the surface (df_surface_view_set_net): the
 * threads as the wide-line shader's segments, each vertex with its own colour (the shear) and
 * width. The vertices are made on the drape's worker thread (df-drape-job.c); here they are
 * only kept and appended to the overlay's lines. No GL here. */
#include "df-surface-view-private.h"

#include <math.h>

void
df_surface_view_set_net (DfSurfaceView *self,
                         const float   *vertices,
                         gsize          n)
{
  g_return_if_fail (DF_IS_SURFACE_VIEW (self));

  if (vertices == NULL || n < 2)
    {
      if (self->net == NULL)
        return;
      g_clear_pointer (&self->net, g_array_unref);
    }
  else
    {
      if (self->net == NULL)
        self->net = g_array_new (FALSE, FALSE, sizeof (float));
      g_array_set_size (self->net, 0);
      g_array_append_vals (self->net, vertices, (n - n % 2) * LINE_STRIDE);
    }
  _df_surface_view_rebuild_overlay (self);
}

void
_df_surface_view_net_append (DfSurfaceView *self)
{
  if (self->net != NULL && self->net->len > 0)
    g_array_append_vals (self->line_data, self->net->data, self->net->len);
}
