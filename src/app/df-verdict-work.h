/* df-verdict-work.h: one loop checked against the user's limits on a GTask thread: the core's
 * verdicts (df_verdicts_measure, and the region's sheet strain by df_verdict_strain) and the
 * curves the details plot against arc length (k_g, |k_g / k_n|, the fibre deviation), with the
 * points in space of the samples for the marks in the view. All numbers are the core's; this
 * file moves data between threads. */
#pragma once

#include <gio/gio.h>

#include "df-glib.h"
#include "df-gores.h"
#include "df-verdict.h"
#include "df-verdict-shear.h"

G_BEGIN_DECLS

typedef struct
{
  df_verdict_list list;          /* the verdicts, loop and region */
  gboolean        strain_checked;
  char           *strain_note;   /* why the region's strain was not checked, or NULL */
  /* max-shear-deg by a drape of the loop (df_verdict_shear, as check does): what it used, or
   * why it was not checked (NULL when it was, or when the limit is not set). */
  gboolean        shear_checked;
  df_shear_used   shear;
  char           *shear_note;
  double          length;
  /* Darts for a flat sheet over the enclosed region (df_darts_compute), when the loop bounds a
   * disc: one of the whole enclosed curvature, and the least count each closing at most
   * max-shear-deg (0 when that limit is not set). */
  gboolean        has_darts;
  df_darts        darts;
  int             darts_least;
  df_darts        darts_each;    /* the least count's darts */
  gsize           n;             /* samples, evenly in the curve's parameter */
  double         *s;             /* arc length */
  double         *kg;            /* 1/length, + turning left about N */
  double         *ratio;         /* |k_g / k_n|; NAN where k_n = 0 */
  double         *deviation_deg; /* |fibre deviation| as the verdict counts it */
  double        (*xyz)[3];       /* the samples in space */
  double        (*normal)[3];    /* the surface's unit normal there */
} DfLoopCheck;

void         df_loop_check_free           (DfLoopCheck *check);
G_DEFINE_AUTOPTR_CLEANUP_FUNC (DfLoopCheck, df_loop_check_free)

/* Checks the closed loop through uv[0..n-1] (copied) against limits (copied, resolved); its
 * drape for max-shear-deg as drape says (copied; NULL: the defaults). */
void         df_work_check_loop_async     (const df_surface   *surface,
                                           const double      (*uv)[2],
                                           gsize               n,
                                           const df_limits    *limits,
                                           const df_shear_setup *drape,
                                           GCancellable       *cancellable,
                                           GAsyncReadyCallback callback,
                                           gpointer            user_data);
DfLoopCheck *df_work_check_loop_finish    (GAsyncResult *result,
                                           GError      **error);

G_END_DECLS
