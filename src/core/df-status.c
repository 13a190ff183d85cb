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

static int
is_word_char (char c)
{
  return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') || c == '_'
         || c == '.';
}

static int
word_at (const char *s, const char *word)
{
  size_t n = strlen (word);

  for (size_t i = 0; i < n; i++)
    if (s[i] == '\0' || (s[i] | 0x20) != word[i])
      return 0;
  return !is_word_char (s[n]) ? (int) n : 0;
}

void
df_words_for_nonfinite (char *text, size_t size)
{
  char out[1024];
  size_t o = 0;
  char quote = 0;

  if (text == NULL || size == 0)
    return;
  for (const char *s = text; *s != '\0' && o + 24 < sizeof out;)
    {
      int neg = 0, n = 0;

      /* The user's own text is quoted ('...') or a group name ([...]): left as typed. */
      if (quote != 0 || *s == '\'' || *s == '[')
        {
          if (quote == 0)
            quote = *s == '[' ? ']' : '\'';
          else if (*s == quote)
            quote = 0;
          out[o++] = *s++;
          continue;
        }
      if (s == text || !is_word_char (s[-1]))
        {
          neg = (*s == '-' || *s == '+') ? 1 : 0;
          if ((n = word_at (s + neg, "infinity")) == 0 && (n = word_at (s + neg, "inf")) == 0
              && (n = word_at (s + neg, "nan")) == 0)
            neg = 0;
        }
      if (n > 0)
        {
          const char *word = (s[neg] | 0x20) == 'n' ? "undefined"
                             : (neg && *s == '-') ? "too large (negative)" : "too large";

          memcpy (out + o, word, strlen (word));
          o += strlen (word);
          s += neg + n;
          continue;
        }
      out[o++] = *s++;
    }
  out[o] = '\0';
  if (o >= size)
    o = size - 1;
  memcpy (text, out, o);
  text[o] = '\0';
}

static void
diag_vformat (df_diag *diag, const char *format, va_list ap)
{
  vsnprintf (diag->detail, sizeof diag->detail, format, ap);
  /* The one place every core failure is worded: a number that overflowed or did not exist
   * reads as a word, never as "inf" or "nan". */
  df_words_for_nonfinite (diag->detail, sizeof diag->detail);
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
