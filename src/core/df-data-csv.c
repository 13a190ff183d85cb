/* df-data-csv.c: the measured-point CSV reader and data file checksums (df-data-csv.h).
 * Reader layer: GLib. */
#include "df-data-csv.h"

#include <math.h>
#include <string.h>

#include "df-io-error.h"

gboolean
df_data_csv_read (const char *path, const char *const *header, int n_cols, double **values,
                  gsize *n_rows, guint **lines, GError **error)
{
  g_autofree char *data = NULL;
  g_autoptr (GError) local = NULL;
  g_auto (GStrv) text = NULL;
  g_autoptr (GArray) vals = g_array_new (FALSE, FALSE, sizeof (double));
  g_autoptr (GArray) nums = g_array_new (FALSE, FALSE, sizeof (guint));
  gboolean seen_header = FALSE;

  *values = NULL;
  *n_rows = 0;
  if (lines)
    *lines = NULL;
  if (!g_file_get_contents (path, &data, NULL, &local))
    {
      g_set_error_literal (error, DF_IO_ERROR, DF_IO_ERROR_FILE, local->message);
      return FALSE;
    }
  if (!g_utf8_validate (data, -1, NULL))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: the file is not UTF-8 text",
                   path);
      return FALSE;
    }
  text = g_strsplit (data, "\n", -1);
  for (guint i = 0; text[i] != NULL; i++)
    {
      char *line = g_strstrip (text[i]);
      g_auto (GStrv) cells = NULL;
      guint nc;

      if (*line == '\0' || *line == '#')
        continue;
      cells = g_strsplit (line, ",", -1);
      nc = g_strv_length (cells);
      if (!seen_header)
        {
          gboolean ok = nc == (guint) n_cols;

          for (guint c = 0; ok && c < nc; c++)
            ok = g_ascii_strcasecmp (g_strstrip (cells[c]), header[c]) == 0;
          if (!ok)
            {
              g_autofree char *want = g_strjoinv (",", (char **) header);

              g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                           "%s:%u: the header must be '%s' (found '%s')", path, i + 1, want,
                           line);
              return FALSE;
            }
          seen_header = TRUE;
          continue;
        }
      if (nc != (guint) n_cols)
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                       "%s:%u: expected %d numbers, found %u", path, i + 1, n_cols, nc);
          return FALSE;
        }
      for (guint c = 0; c < nc; c++)
        {
          char *cell = g_strstrip (cells[c]), *end = NULL;
          double v = g_ascii_strtod (cell, &end);

          if (*cell == '\0' || end == cell || *end != '\0')
            {
              g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                           "%s:%u: column %u (%s): '%s' is not a number", path, i + 1, c + 1,
                           header[c], cell);
              return FALSE;
            }
          if (!isfinite (v))
            {
              g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                           "%s:%u: column %u (%s): '%s' is not a finite number", path, i + 1,
                           c + 1, header[c], cell);
              return FALSE;
            }
          g_array_append_val (vals, v);
        }
      {
        guint ln = i + 1;

        g_array_append_val (nums, ln);
      }
    }
  if (!seen_header)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: no header line (expected '%s"
                   "%s%s')", path, header[0], n_cols > 1 ? "," : "", n_cols > 1 ? header[1] : "");
      return FALSE;
    }
  *n_rows = nums->len;
  *values = (double *) g_array_free (g_steal_pointer (&vals), FALSE);
  if (lines)
    *lines = (guint *) g_array_free (g_steal_pointer (&nums), FALSE);
  return TRUE;
}

char *
df_data_file_sha256 (const char *path, GError **error)
{
  g_autofree char *data = NULL;
  g_autoptr (GError) local = NULL;
  gsize len = 0;

  if (!g_file_get_contents (path, &data, &len, &local))
    {
      g_set_error_literal (error, DF_IO_ERROR, DF_IO_ERROR_FILE, local->message);
      return NULL;
    }
  return g_compute_checksum_for_data (G_CHECKSUM_SHA256, (const guchar *) data, len);
}
