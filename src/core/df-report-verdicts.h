/* df-report-verdicts.h: the user's limits checked along a loop (the decision layer, df-verdict)
 * written as lines of the design record, each with its source, and the darts a flat sheet needs;
 * shared by the CLI's and the app's record. Reader/writer layer: GLib allowed. */
#pragma once

#include <glib.h>

#include "df-limits.h"
#include "df-surface.h"
#include "df-verdict.h"
#include "df-verdict-shear.h"

/* One verdict as a line of the record (worst value, stretch, tow compression, source); units
 * names the surface's length unit. Newly allocated. */
char  *df_report_verdict_text  (const df_verdict *v, const df_limits *limits, const char *units);
/* The same with the verdict's lengths (computed in du->model) shown in du->length. */
char  *df_report_verdict_text_display (const df_verdict *v, const df_limits *limits,
                                       const df_display_units *du);

/* A NULL-terminated array of lines (g_strfreev), or NULL when limits set no limit. kg_limit:
 * 1 / min-steering-radius (0 when unset), for the k_g plot; checked: the verdicts could be
 * computed (else the one line says why); n_exceeded: stretches beyond a limit. units names the
 * surface's length unit. */
char **df_report_verdict_lines (const df_surface *surface,
                                const double    (*uv)[2],
                                gsize             n,
                                const df_limits  *limits,
                                const char       *units,
                                double           *kg_limit,
                                gboolean         *checked,
                                guint            *n_exceeded);
/* The same lines with every length in du->length (the verdicts are computed in du->model, the
 * surface's unit) and kg_limit per du->length, for a k_g plot of converted samples. drape: the
 * loop's own drape for max-shear-deg (df_project_loop.drape; NULL: the defaults of
 * df-verdict-shear.h), which df_report_verdict_lines always uses. */
char **df_report_verdict_lines_display (const df_surface       *surface,
                                        const double          (*uv)[2],
                                        gsize                   n,
                                        const df_limits        *limits,
                                        const df_shear_setup   *drape,
                                        const df_display_units *du,
                                        double                 *kg_limit,
                                        gboolean               *checked,
                                        guint                  *n_exceeded);
