/* df-report-plot.h: the report's plot of a loop's geodesic curvature k_g against arc length s,
 * with the zero line and, when the user set one, the steering limit +/- 1/R drawn as lines and
 * the stretches beyond it shaded. Reader/writer layer: cairo allowed. */
#pragma once

#include <cairo.h>

#include "df-loop.h"

/* Draws into the box (x, y, w, h). kg_limit > 0 draws +/- kg_limit. units names the length. */
void df_report_draw_kg_plot (cairo_t              *cr,
                             double                x,
                             double                y,
                             double                w,
                             double                h,
                             const df_loop_result *result,
                             const char           *units,
                             double                kg_limit);
