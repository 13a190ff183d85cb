/* df-io-error.h: the GError domain of every reader and writer, and the one helper that turns a
 * failed core call (df_status + df_diag) into a GError. Reader layer: GLib allowed. */
#pragma once

#include <glib.h>

#include "df-status.h"

#define DF_IO_ERROR (df_io_error_quark ())

typedef enum
{
  DF_IO_ERROR_SYNTAX,       /* a formula does not parse */
  DF_IO_ERROR_UNKNOWN_NAME, /* unknown function, variable or parameter */
  DF_IO_ERROR_FORMAT,       /* a file is malformed (wrong columns, missing key, bad number) */
  DF_IO_ERROR_VALUE,        /* a value is out of range (t-min >= t-max, unknown preset) */
  DF_IO_ERROR_GEOMETRY,     /* the core refused the input (off the surface, singular...) */
  DF_IO_ERROR_FILE          /* cannot read or write the file */
} DfIoError;

GQuark   df_io_error_quark      (void);

/* Sets *error (domain DF_IO_ERROR, code GEOMETRY) from a failed status, naming the diag's
 * index, chart point and detail: "point 14 (u = 0.3, v = 1.2): outside the surface's domain:
 * x beyond x-max". Always returns FALSE. */
gboolean df_status_to_gerror    (df_status      status,
                                 const df_diag *diag,
                                 GError       **error);

/* Writes contents to path atomically (g_file_set_contents_full, CONSISTENT), mode 0644. */
gboolean df_write_file_atomic   (const char  *path,
                                 const char  *contents,
                                 gssize       length,
                                 GError     **error);
