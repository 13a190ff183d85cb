/* df-report-verdicts.h: the user's limits checked along a loop (the decision layer, df-verdict)
 * written as lines of the design record, each with its source, and the darts a flat sheet needs;
 * shared by the CLI's and the app's record. Reader/writer layer: GLib allowed. */
#pragma once

#include <glib.h>

#include "df-limits.h"
#include "df-surface.h"
#include "df-verdict.h"

/* One verdict as a line of the record (worst value, stretch, tow compression, source); units
 * names the surface's length unit. Newly allocated. */
char  *df_report_verdict_text  (const df_verdict *v, const df_limits *limits, const char *units);

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
