/* df-io-error.c: DF_IO_ERROR quark, status-to-GError conversion and atomic file writes. */
#include "df-io-error.h"

G_DEFINE_QUARK (df-io-error-quark, df_io_error)

gboolean
df_status_to_gerror (df_status status, const df_diag *diag, GError **error)
{
  g_autoptr (GString) msg = g_string_new (NULL);

  if (diag != NULL && diag->index >= 0)
    g_string_append_printf (msg, "point %ld", diag->index + 1);
  if (diag != NULL && diag->has_point)
    g_string_append_printf (msg, "%sat chart point (%.6g, %.6g)", msg->len ? " " : "", diag->u,
                            diag->v);
  if (msg->len)
    g_string_append (msg, ": ");
  g_string_append (msg, df_status_describe (status));
  if (diag != NULL && diag->detail[0] != '\0')
    g_string_append_printf (msg, ": %s", diag->detail);
  g_string_set_size (msg, MIN (msg->len, 1000));
  df_words_for_nonfinite (msg->str, msg->len + 1);
  g_set_error_literal (error, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY, msg->str);
  return FALSE;
}

gboolean
df_write_file_atomic (const char *path, const char *contents, gssize length, GError **error)
{
  /* CONSISTENT writes a temporary file and renames it over the target, so a crash or a full
   * disk never leaves a half-written file in place of the user's work. */
  return g_file_set_contents_full (path, contents, length,
                                   G_FILE_SET_CONTENTS_CONSISTENT, 0644, error);
}
