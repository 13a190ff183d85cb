/* df-document-units.c: the project's display units as an undoable edit of DfDocument (see
 * df-document-units.h). They live in the df_limits the document keeps (its [units] fields),
 * so the core's writer saves them and undo snapshots carry them like the limits. */
#include "df-document-units.h"
#include "df-document-private.h"

void
df_document_get_display_units (DfDocument     *self,
                               DfDisplayUnits *out)
{
  g_return_if_fail (DF_IS_DOCUMENT (self));
  df_du_resolve (out, self->limits, df_document_get_units (self));
  if (self->spec != NULL && df_surface_spec_t_units (self->spec) != NULL)
    g_strlcpy (out->t_unit, df_surface_spec_t_units (self->spec), sizeof out->t_unit);
}

gboolean
df_document_set_display_units (DfDocument  *self,
                               df_unit      length,
                               df_unit      curvature,
                               GError     **error)
{
  g_autoptr(df_limits) next = NULL;
  df_unit model;

  g_return_val_if_fail (DF_IS_DOCUMENT (self), FALSE);
  g_return_val_if_fail (length < DF_N_UNITS && curvature < DF_N_UNITS, FALSE);
  if (self->spec == NULL || !df_unit_from_name (df_document_get_units (self), &model))
    {
      g_set_error (error, G_IO_ERROR, G_IO_ERROR_INVALID_DATA,
                   "The display units were not changed: the surface's units “%s” are not mm, "
                   "cm, m or in, so its values cannot be converted.",
                   df_document_get_units (self));
      return FALSE;
    }
  next = self->limits != NULL ? df_limits_copy (self->limits) : df_limits_new ();
  /* The project file says only what differs from the default: curvature follows lengths. */
  next->has_length_unit = length != model || curvature != model;
  next->length_unit = length;
  next->has_curvature_unit = curvature != length;
  next->curvature_unit = curvature;
  if (next->has_length_unit == (self->limits != NULL && self->limits->has_length_unit)
      && next->has_curvature_unit == (self->limits != NULL && self->limits->has_curvature_unit)
      && (!next->has_length_unit || next->length_unit == self->limits->length_unit)
      && (!next->has_curvature_unit || next->curvature_unit == self->limits->curvature_unit))
    return TRUE;  /* the same choice: no edit */
  _df_document_push_history (self, "change display units");
  df_limits_free (self->limits);
  self->limits = g_steal_pointer (&next);
  g_signal_emit (self, _df_document_signals[UNITS_CHANGED], 0);
  _df_document_update_modified (self);
  return TRUE;
}
