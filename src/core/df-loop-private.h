/* df-loop-private.h: helpers shared by the loop measurement's files (df-loop.c,
 * df-loop-simple.c). Not for use outside the loop module. Plain C; no GLib. */
#pragma once

#include <stdbool.h>

#include "df-curve.h"
#include "df-status.h"

/* Whether the curve's samples (the nodes, subdivided when few) cross themselves in a planar
 * picture of the chart that is regular at the poles (GEOMETRY.md). DF_E_NOMEM on failure. */
df_status _df_loop_is_simple (const df_curve *c, bool *simple);
