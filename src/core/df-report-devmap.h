/* df-report-devmap.h: the developability map as a PNG: the shaded surface (the report's
 * picture, df-report-picture.h) coloured by the rim strain of a flat disc of radius a forced
 * onto it (df-devmap.h), with the legend on which the user's max-strain-percent is ticked, the
 * patch radius and the caution. Written atomically. Reader/writer layer: cairo, no GTK. */
#pragma once

#include <glib.h>

#include "df-devmap.h"
#include "df-units.h"

/* width x height pixels (each 200..8000). max_strain_percent: the user's limit, NAN for none.
 * units names the length unit a is shown in, a_display the radius in it. caution: the text
 * printed at the foot. Errors name the path. */
gboolean df_devmap_png_write (const char       *path,
                              const df_surface *surface,
                              const df_devmap  *map,
                              int               width,
                              int               height,
                              double            max_strain_percent,
                              const char       *units,
                              double            a_display,
                              const char       *caution,
                              GError          **error);
