/* df-fit-private.h: shared between the profile fit (df-fit.c) and the height fit
 * (df-fit-grid.c): the smoothing-weight search and the grid function's method table. */
#pragma once

#include "df-fit.h"

/* One trial fit at relative smoothing weight lambda: the RMS distance of the data from it and
 * its GCV score n RSS / (n - tr H)^2 (gcv may be left alone when want_gcv is false). */
typedef df_status (*_df_fit_trial) (void *ctx, double lambda, int want_gcv, double *rms,
                                    double *gcv, df_diag *diag);

/* tolerance > 0: the largest lambda whose RMS stays within it (RMS grows with lambda, so
 * bisection in log lambda); 0: the smallest lambda; DF_FIT_TOLERANCE_AUTO: GCV's minimum over
 * 1e-9..1e9, refined by golden section. */
df_status _df_fit_choose_lambda (_df_fit_trial trial, void *ctx, double tolerance,
                                 double *lambda, df_diag *diag);

extern const df_fn_type _df_fit_grid_type;
extern const df_fn_type _df_fit_profile_type;
const df_fit_info *_df_fit_grid_info (const void *data);
extern const df_fn_type _df_fit_scattered_type;
const df_fit_info *_df_fit_scattered_info (const void *data);
/* Points that form no lattice (df-fit-scattered.c); lo, hi their bounding box. */
df_status _df_fit_scattered (const double (*xyz)[3], size_t n, const double lo[2],
                             const double hi[2], double tolerance, df_fn **out,
                             df_fit_info *info, df_diag *diag);
