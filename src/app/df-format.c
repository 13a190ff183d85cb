/* df-format.c: number formatting for readouts (see df-format.h). Plain string work; no
 * geometry here. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "df-format.h"

#define DF_DASH "\u2014"

/* "6.940e-05" as "6.940×10⁻⁵", with a true minus sign: one look for small and large numbers
 * across the app (details, legend, status line). */
static char *
scientific (double x)
{
  static const char *const superscript[10] = { "\u2070", "\u00b9", "\u00b2", "\u00b3",
                                                "\u2074", "\u2075", "\u2076", "\u2077",
                                                "\u2078", "\u2079" };
  g_autofree char *text = g_strdup_printf ("%.3e", fabs (x));
  g_autofree char *digits = NULL;
  GString *out = g_string_new (x < 0 ? "\u2212" : NULL);
  char *e = strchr (text, 'e');
  int exponent;

  if (e == NULL)
    {
      g_string_append (out, text);
      return g_string_free (out, FALSE);
    }
  *e = '\0';
  exponent = atoi (e + 1);
  g_string_append (out, text);
  g_string_append (out, "\u00d710");
  if (exponent < 0)
    g_string_append (out, "\u207b");
  digits = g_strdup_printf ("%d", ABS (exponent));
  for (const char *p = digits; *p != '\0'; p++)
    g_string_append (out, superscript[*p - '0']);
  return g_string_free (out, FALSE);
}

char *
df_format_number (double x)
{
  double ax = fabs (x);
  int decimals;

  if (!isfinite (x))
    return g_strdup (DF_DASH);
  if (x == 0.0)
    return g_strdup ("0");
  if (ax < 1e-3 || ax >= 1e6)
    return scientific (x);
  /* Four significant digits in fixed notation: 1234, 123.4, 12.34, 1.234, 0.1234, 0.01234. */
  decimals = 3 - (int) floor (log10 (ax));
  decimals = CLAMP (decimals, 0, 6);
  /* The true minus of the scientific form, so "−0.003096" sits beside "−1.047×10⁻⁴". */
  return g_strdup_printf ("%s%.*f", x < 0 ? "\u2212" : "", decimals, ax);
}

char *
df_format_number_as (double x,
                     double other)
{
  double ax = fabs (x), ao = fabs (other);
  gboolean sci_x = ax != 0 && (ax < 1e-3 || ax >= 1e6);
  gboolean sci_o = ao != 0 && (ao < 1e-3 || ao >= 1e6);

  if (isfinite (x) && x != 0 && !sci_x && sci_o && isfinite (other))
    return scientific (x);
  return df_format_number (x);
}

char *
df_format_angle (double rad)
{
  g_autofree char *deg = NULL;
  g_autofree char *r = NULL;

  if (!isfinite (rad))
    return g_strdup (DF_DASH);
  deg = df_format_number (rad * 180.0 / G_PI);
  r = df_format_number (rad);
  return g_strdup_printf ("%s° (%s rad)", deg, r);
}

char *
df_format_length (double x, const char *units)
{
  g_autofree char *n = df_format_number (x);

  if (!isfinite (x))
    return g_steal_pointer (&n);
  return g_strdup_printf ("%s %s", n, units ? units : "mm");
}

char *
df_format_area (double x, const char *units)
{
  g_autofree char *n = df_format_number (x);

  if (!isfinite (x))
    return g_steal_pointer (&n);
  return g_strdup_printf ("%s %s²", n, units ? units : "mm");
}

char *
df_format_per_length (double x, const char *units)
{
  g_autofree char *n = df_format_number (x);

  if (!isfinite (x))
    return g_steal_pointer (&n);
  return g_strdup_printf ("%s 1/%s", n, units ? units : "mm");
}

char *
df_format_per_area (double x, const char *units)
{
  g_autofree char *n = df_format_number (x);

  if (!isfinite (x))
    return g_steal_pointer (&n);
  return g_strdup_printf ("%s 1/%s²", n, units ? units : "mm");
}
