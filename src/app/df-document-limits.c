/* df-document-limits.c: the project's limits replaced as one undoable edit (see
 * df-document-limits.h). The text form goes through the core's writer, so the app never has
 * its own idea of what a limit is. */
#include "df-document-limits.h"
#include "df-document-private.h"

#include "df-io-error.h"
#include "df-limits-file.h"

gboolean
df_document_set_limits (DfDocument       *self,
                        const df_limits  *limits,
                        GError          **error)
{
  g_autoptr(df_limits) next = NULL;
  df_diag diag;
  df_status status;

  g_return_val_if_fail (DF_IS_DOCUMENT (self), FALSE);
  g_return_val_if_fail (self->spec != NULL, FALSE);

  next = limits != NULL ? df_limits_copy (limits) : df_limits_new ();
  df_diag_clear (&diag);
  status = df_limits_resolve (next, df_document_get_units (self), &diag);
  if (status != DF_OK)
    {
      df_status_to_gerror (status, &diag, error);
      g_prefix_error (error, "The limits were not changed: ");
      return FALSE;
    }
  _df_document_push_history (self, "edit limits");
  df_limits_free (self->limits);
  self->limits = g_steal_pointer (&next);
  _df_document_update_modified (self);
  return TRUE;
}

char *
df_document_limits_text (DfDocument *self)
{
  g_autoptr(GKeyFile) key_file = g_key_file_new ();

  g_return_val_if_fail (DF_IS_DOCUMENT (self), NULL);
  if (self->limits != NULL)
    df_limits_to_key_file (self->limits, key_file);
  return g_key_file_to_data (key_file, NULL, NULL);
}
