/* df-colour-ramp.h: the diverging colour scale that shades curvature everywhere driftframe draws
 * it (the app's view and legend, the report's pictures), so that a colour means the same on
 * screen and on paper. Plain C; no GLib. */
#pragma once

#define DF_COLOUR_RAMP_STOPS 5

/* sRGB colours at s = -1, -0.5, 0, 0.5, 1 (each channel 0..1). */
extern const float df_colour_ramp_stops[DF_COLOUR_RAMP_STOPS][3];

/* The colour at s (clamped to [-1, 1]; a non-finite s gives the colour at 0), linear between
 * the stops. */
void df_colour_ramp (double s, double rgb[3]);
