/* df-verdict-private.h: what the verdict files share inside the core (df-verdict.c,
 * df-verdict-curves.c, df-verdict-region.c). Not for the app or the CLI. */
#pragma once

#include "df-verdict.h"

/* The run-finding of df_verdicts_measure on given samples. curve may be NULL: then only the
 * fibre deviation (from samples[].angle_rad, refined linearly) is checked; closed says whether
 * the samples go round a loop (the last repeating the first). size is the surface's size.
 * Appends to out (which must be initialised). */
df_status _df_verdicts_from_samples (const df_curve *curve, bool closed, double size,
                                     const df_loop_sample *samples, size_t n_samples,
                                     double length, const df_limits *limits,
                                     const df_limit_id *ids, size_t n_ids,
                                     df_verdict_list *out, df_diag *diag);
/* Appends one verdict (counts it when exceeded). */
df_status _df_verdict_push (df_verdict_list *out, const df_verdict *v);
