/* df-surface-spec-private.h: GLib key file helpers shared by the surface and project readers
 * (df-surface-spec.c, df-project-file.c), so both report the file, line, group and key the
 * same way. Not installed; reader layer only. */
#pragma once

#include <glib.h>

/* TRUE for NULL, "" or only white space. */
gboolean  _df_text_is_blank          (const char *text);

/* Reads and parses a key file. A line that is not a group, a key=value pair, a comment or
 * blank is reported with its number ("part.dfproj:7: ..."), which GKeyFile does not do. */
GKeyFile *_df_key_file_load          (const char *path, GError **error);
GKeyFile *_df_key_file_load_data     (const char *data, const char *source, GError **error);

/* The value of group/key, stripped of surrounding white space; NULL when absent (an error
 * "source: [group] missing key 'key'" only when required). */
char     *_df_key_file_get_text      (GKeyFile   *key_file,
                                      const char *group,
                                      const char *key,
                                      gboolean    required,
                                      const char *source,
                                      GError    **error);

/* Fails naming the first group that is neither in names nor starts with prefix (may be
 * NULL). */
gboolean  _df_key_file_check_groups  (GKeyFile          *key_file,
                                      const char        *source,
                                      const char *const *names,
                                      const char        *prefix,
                                      GError           **error);

/* A required ';'-separated list of finite numbers (g_free it); messages name the value's
 * position. NULL with error set on failure. */
double   *_df_key_file_get_numbers   (GKeyFile   *key_file,
                                      const char *group,
                                      const char *key,
                                      const char *source,
                                      gsize      *n_out,
                                      GError    **error);
