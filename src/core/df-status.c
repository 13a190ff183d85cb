/* df-status.c: status texts, diagnostics and the mapping from GSL's error numbers.
 * Plain C + GSL; no GLib. */
#include "df-status.h"

#include <gsl/gsl_errno.h>
#include <stdarg.h>
#include <stdio.h>
#include <string.h>

void
df_core_init (void)
{
  /* GSL's default handler calls abort(); the core reports every failure as a df_status. */
  gsl_set_error_handler_off ();
}

const char *
df_status_describe (df_status status)
{
  switch (status)
    {
    case DF_OK: return "no error";
    case DF_E_INPUT: return "degenerate or malformed input";
    case DF_E_DOMAIN: return "outside the surface's domain";
    case DF_E_SINGULAR: return "singular point of the chart";
    case DF_E_NONFINITE: return "a value could not be computed (not finite)";
    case DF_E_NOCONVERGE: return "did not converge to the requested tolerance";
    case DF_E_NOMEM: return "out of memory";
    case DF_E_INTERNAL: return "internal error";
    default: return "unknown error";
    }
}

void
df_diag_clear (df_diag *diag)
{
  if (diag == NULL)
    return;
  diag->index = -1;
  diag->has_point = 0;
  diag->u = 0.0;
  diag->v = 0.0;
  diag->detail[0] = '\0';
}

static void
diag_vformat (df_diag *diag, const char *format, va_list ap)
{
  vsnprintf (diag->detail, sizeof diag->detail, format, ap);
}

df_status
df_diag_fail (df_diag *diag, df_status status, long index, const char *format, ...)
{
  va_list ap;

  if (diag == NULL)
    return status;
  df_diag_clear (diag);
  diag->index = index;
  va_start (ap, format);
  diag_vformat (diag, format, ap);
  va_end (ap);
  return status;
}

df_status
df_diag_fail_at (df_diag    *diag,
                 df_status   status,
                 long        index,
                 double      u,
                 double      v,
                 const char *format,
                 ...)
{
  va_list ap;

  if (diag == NULL)
    return status;
  df_diag_clear (diag);
  diag->index = index;
  diag->has_point = 1;
  diag->u = u;
  diag->v = v;
  va_start (ap, format);
  diag_vformat (diag, format, ap);
  va_end (ap);
  return status;
}

df_status
df_status_from_gsl (int gsl_errno)
{
  switch (gsl_errno)
    {
    case GSL_SUCCESS: return DF_OK;
    case GSL_EDOM: case GSL_EBADFUNC: return DF_E_DOMAIN;
    case GSL_ENOMEM: return DF_E_NOMEM;
    case GSL_ESING: case GSL_EZERODIV: return DF_E_SINGULAR;
    case GSL_EMAXITER: case GSL_ETOL: case GSL_ENOPROG: case GSL_ENOPROGJ:
    case GSL_EROUND: case GSL_EFAILED: case GSL_ETOLF: case GSL_ETOLX: case GSL_ETOLG:
      return DF_E_NOCONVERGE;
    case GSL_EOVRFLW: case GSL_EUNDRFLW: case GSL_ERANGE: return DF_E_NONFINITE;
    case GSL_EINVAL: case GSL_EBADLEN: case GSL_ENOTSQR: return DF_E_INPUT;
    default: return DF_E_INTERNAL;
    }
}
