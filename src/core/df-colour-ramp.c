/* df-colour-ramp.c: the curvature colour scale shared by the app and the report. Plain C + libm;
 * no GLib. */
#include "df-colour-ramp.h"

#include <math.h>

/* A deep blue, a light sky blue, a warm white, a light apricot and a burnt orange. Chosen for
 * this program; the two arms differ in both hue and lightness so they stay apart for the common
 * colour-vision deficiencies. */
const float df_colour_ramp_stops[DF_COLOUR_RAMP_STOPS][3] = {
  { 0.161f, 0.349f, 0.678f },
  { 0.518f, 0.706f, 0.886f },
  { 0.957f, 0.945f, 0.910f },
  { 0.988f, 0.757f, 0.502f },
  { 0.851f, 0.420f, 0.098f },
};

void
df_colour_ramp (double s, double rgb[3])
{
  double x;
  int i;

  if (!isfinite (s))
    s = 0;
  x = (fmin (fmax (s, -1.0), 1.0) + 1) * 2;
  i = (int) floor (x);
  if (i > DF_COLOUR_RAMP_STOPS - 2)
    i = DF_COLOUR_RAMP_STOPS - 2;
  x -= i;
  for (int c = 0; c < 3; c++)
    rgb[c] = df_colour_ramp_stops[i][c] + x * (df_colour_ramp_stops[i + 1][c]
                                               - df_colour_ramp_stops[i][c]);
}
