/* df-format.h: number formatting for the app's readouts: every value with its unit, and never a
 * "nan" or "inf" on screen (a non-finite value shows as an em dash). */
#pragma once

#include <glib.h>

G_BEGIN_DECLS

/* Four significant digits; fixed notation between 1e-3 and 1e6, scientific outside. */
char *df_format_number       (double x);
/* As df_format_number, but scientific when other is: the two ends of one scale in one form. */
char *df_format_number_as    (double x, double other);
/* "12.35° (0.2155 rad)" */
char *df_format_angle        (double rad);
/* "123.4 mm" */
char *df_format_length       (double x, const char *units);
/* "1.234e+04 mm²" */
char *df_format_area         (double x, const char *units);
/* "0.0083 1/mm" */
char *df_format_per_length   (double x, const char *units);
/* "6.9e-05 1/mm²" */
char *df_format_per_area     (double x, const char *units);

G_END_DECLS
