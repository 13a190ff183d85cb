/* df-surface-spec-private.h: GLib key file helpers shared by the surface and project readers
 * (df-surface-spec.c, df-project-file.c), so both report the file, line, group and key the
 * same way. Not installed; reader layer only. */
#pragma once

#include <glib.h>

#include "df-surface-spec.h"

/* Surface and project files larger than this are refused (a real one is a few kB; 64 MB
 * holds 10^6 loop points). */
#define DF_MAX_FILE_BYTES (64 * 1024 * 1024)

/* TRUE for NULL, "" or only white space. */
gboolean  _df_text_is_blank          (const char *text);

/* Reads and parses a key file. A line that is not a group, a key=value pair, a comment or
 * blank is reported with its number ("part.dfproj:7: ..."), which GKeyFile does not do. */
GKeyFile *_df_key_file_load          (const char *path, GError **error);
GKeyFile *_df_key_file_load_data     (const char *data, const char *source, GError **error);
/* The same from bytes with their length: a NUL byte, a byte-order mark, a repeated group or
 * key and a bad escape are reported with their line. */
GKeyFile *_df_key_file_load_bytes    (const char *data,
                                      gsize       length,
                                      const char *source,
                                      GError    **error);

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
/* Exactly count (1 or 2) numbers of such a list: one number, or a pair "U;V"; the message
 * says how many were found. */
gboolean  _df_key_file_get_fixed     (GKeyFile   *key_file,
                                      const char *group,
                                      const char *key,
                                      const char *source,
                                      gsize       count,
                                      double     *out,
                                      GError    **error);
/* A preset's parameters within the range where the preset means what it says (a cone's
 * half-angle in (0, 90) degrees, a radius above 0); TRUE for a spec that is not an unedited
 * preset. The message names the parameter and its valid range. */
gboolean  _df_preset_check_params    (const df_surface_spec *spec,
                                      GError               **error);

/* Surfaces from data (df-surface-data.c): the [surface] keys profile=, heights=, mesh=,
 * fit-tolerance=, data-sha256= and placement-*; building the fitted surface; units= of a data
 * surface must be one df-units.h converts (mm, cm, m, in). */
gboolean  _df_surface_spec_read_data_keys   (GKeyFile        *key_file,
                                             const char      *source,
                                             df_surface_spec *spec,
                                             const char      *kind,
                                             GError         **error);
gboolean  _df_surface_spec_check_data_units (const df_surface_spec *spec,
                                             const char            *source,
                                             GError               **error);
df_surface *_df_surface_spec_build_data     (const df_surface_spec *spec, GError **error);
