/* df-verdict-text.h: the app's wording of verdicts against the user's limits, shared by the
 * loop row, the details, the plots and the status line: a limit's everyday name, one
 * verdict as a sentence with its units and source, and a loop's one-line standing. Numbers
 * through df-format (never NaN on screen). */
#pragma once

#include <glib.h>

#include "df-display-units.h"
#include "df-limits.h"
#include "df-verdict.h"

G_BEGIN_DECLS

/* "Steering radius", "Fibre deviation", ... */
const char *df_verdict_limit_title (df_limit_id id);
/* The units of a verdict's value and threshold: the display unit for lengths, "°", "%", "". */
const char *df_verdict_units       (df_limit_id id, const DfDisplayUnits *du);
/* A verdict's value or threshold as shown (lengths converted to the display unit). */
double      df_verdict_shown       (df_limit_id id, const DfDisplayUnits *du, double model);
/* "Exceeded from s = 53.65 to 75.31 mm: worst 19.1 mm at s = 66.62 mm (t = 90.09, φ = 0.5);
 * limit 25 mm; tow inner edge compressed about 16.6 %. Source: invented for the demo." */
/* revolution: the chart is named t, φ (else x, y). */
char       *df_verdict_describe    (const df_verdict *verdict,
                                    const df_limits  *limits,
                                    const DfDisplayUnits *du,
                                    gboolean          revolution);
/* "Within all 5 limits" / "3 stretches beyond limits". */
char       *df_verdict_summary     (const df_verdict_list *list);

G_END_DECLS
