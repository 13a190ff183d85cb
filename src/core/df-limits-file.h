/* df-limits-file.h: the project file's [limits] and [units] groups:
 *   [limits]                              # every key optional; none has a default
 *   min-steering-radius=25 mm             # a length, with its unit or in the surface's units
 *   min-steering-radius-source=Supplier X datasheet TP-12, rev. 3
 *   tow-width=6.35 mm
 *   max-fibre-deviation-deg=3
 *   max-shear-deg=35
 *   friction=0.2
 *   max-strain-percent=2
 *   patch-size=20 mm                      # the disc radius a that max-strain-percent is
 *                                         # checked at (a choice, so no -source)
 *   [units]                               # optional display units
 *   length=mm                             # mm, cm, m or in
 *   curvature=1/m^2                       # Gaussian curvature per square of mm, cm, m or in
 * Each NAME may have a companion NAME-source (free text). Reader layer: GLib. */
#pragma once

#include <glib.h>

#include "df-limits.h"

#define DF_LIMITS_GROUP "limits"
#define DF_UNITS_GROUP "units"

/* Reads both groups (absent groups: nothing set). surface_units is the surface's `units` label,
 * used to relate lengths written with a unit. Messages name the file, group and key:
 * "demo.dfproj: [limits] friction: '-1' must be positive". */
df_limits *df_limits_from_key_file (GKeyFile *key_file, const char *source,
                                    const char *surface_units, GError **error);
/* Writes the set limits (value with its unit as written, and the source) and the display
 * units; writes nothing for an empty set. */
void       df_limits_to_key_file   (const df_limits *limits, GKeyFile *key_file);

/* "25 mm" style text of a limit's value, as written back (newly allocated). */
char      *df_limit_value_text     (const df_limit *limit);
char      *df_length_setting_text  (const df_length_setting *setting);
