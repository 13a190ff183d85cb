/* df-status.h: status codes and failure diagnostics shared by every core module.
 * Plain C, no GLib: the numeric core reports failures through these, and the reader/writer
 * layer turns them into GError (df-io-error.h). */
#pragma once

#include <stddef.h>

typedef enum
{
  DF_OK = 0,
  DF_E_INPUT,       /* degenerate or malformed input (too few points, bad range) */
  DF_E_DOMAIN,      /* a point lies outside the chart's domain or off the surface */
  DF_E_SINGULAR,    /* the chart is singular there (pole, zero speed, r < 0) */
  DF_E_NONFINITE,   /* a computed value was NaN or infinite */
  DF_E_NOCONVERGE,  /* an iteration or integrator did not reach its tolerance */
  DF_E_NOMEM,
  DF_E_INTERNAL
} df_status;

/* Where a failure happened. Every field is optional: index = -1 and has_point = 0 mean
 * "not known". detail is a short English phrase without a trailing full stop. */
typedef struct
{
  long   index;       /* sample, point or row index (0-based), or -1 */
  int    has_point;   /* u, v below are meaningful */
  double u, v;
  char   detail[256];
} df_diag;

/* Switches off GSL's default error handler (which aborts). First thing in every main(). */
void        df_core_init       (void);

/* A fixed English text for a status; never NULL. */
const char *df_status_describe (df_status status);

/* Fills diag (if non-NULL) with an index (-1 for none) and a printf-style detail; clears the
 * point. Returns status so callers can write `return df_diag_fail (diag, DF_E_INPUT, ...)`. */
df_status   df_diag_fail       (df_diag    *diag,
                                df_status   status,
                                long        index,
                                const char *format,
                                ...) __attribute__ ((format (printf, 4, 5)));

/* Like df_diag_fail, and records the chart point (u, v). */
df_status   df_diag_fail_at    (df_diag    *diag,
                                df_status   status,
                                long        index,
                                double      u,
                                double      v,
                                const char *format,
                                ...) __attribute__ ((format (printf, 6, 7)));

/* Resets diag to "nothing known". NULL is allowed. */
void        df_diag_clear      (df_diag *diag);

/* Rewrites, in place, every "inf", "-inf", "infinity" or "nan" word of text (as printf prints
 * a non-finite double) outside quoted user text ('...', [...]) as "too large", "too large
 * (negative)" or "undefined", so no message shows a non-finite number. Text is cut to 1000
 * bytes. */
void        df_words_for_nonfinite (char *text, size_t size);

/* Maps a GSL error number to a df_status; the one place that knows GSL's codes. */
df_status   df_status_from_gsl (int gsl_errno);
