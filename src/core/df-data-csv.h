/* df-data-csv.h: tables of measured points for fitted surfaces: a CSV file whose first
 * non-comment line is the header naming the columns (`r,z` for a profile, `x,y,z` for
 * heights), then one point a row. Blank lines and lines starting with # are skipped. Every
 * complaint names the file and the line, and the column where there is one. Reader layer:
 * GLib. */
#pragma once

#include <glib.h>

/* Reads the columns named by header (e.g. { "r", "z" }, n_cols of them) into a fresh array of
 * *n_rows x n_cols doubles (g_free). lines, when non-NULL, receives each row's line number
 * (g_free), so fit errors can point at the file. */
gboolean df_data_csv_read (const char        *path,
                           const char *const *header,
                           int                n_cols,
                           double           **values,
                           gsize             *n_rows,
                           guint            **lines,
                           GError           **error);

/* The file's SHA-256 as lower-case hex (g_free), GLib's GChecksum; NULL with an error naming
 * the file when it cannot be read. */
char    *df_data_file_sha256 (const char *path, GError **error);
