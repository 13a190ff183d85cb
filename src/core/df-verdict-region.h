/* df-verdict-region.h: max-strain-percent over a loop's enclosed region: the rim strain of the
 * developability map (df-devmap.h: a flat disc of radius a = [limits] patch-size forced onto
 * the surface, (2 pi a - C) / (2 pi a), about K a^2 / 6 for small a by Bertrand-Diguet-Puiseux)
 * at the points of a grid over the region, the largest |strain| against the limit. The region
 * is the loop's inside in the chart (a loop that does not wind round the axis) or in the
 * pole-centred picture (a loop drawn round a pole). Not checked, with a note: a loop that
 * bounds no disc, winds round the axis in the chart, or runs round both poles.
 * The decision layer; plain C + libm + GSL; no GLib. */
#pragma once

#include "df-devmap.h"
#include "df-verdict.h"

#define DF_REGION_GRID_DEFAULT 7

/* Appends one verdict (region true) to out when limits set max-strain-percent and patch_size
 * and the region can be sampled; else *checked is false and note says why (note_len >= 1).
 * grid: points a side of the sampling grid over the region's box (>= 2; 0 = default). */
df_status df_verdict_strain (const df_curve          *loop,
                             const df_loop_result    *result,
                             const df_limits         *limits,
                             size_t                   grid,
                             const df_devmap_options *devmap,
                             df_verdict_list         *out,
                             bool                    *checked,
                             char                    *note,
                             size_t                   note_len,
                             df_diag                 *diag);
