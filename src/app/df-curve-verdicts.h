/* df-curve-verdicts.h: a geodesic's or an open path's verdicts against the project's limits for
 * the Geodesic and Paths panels and the marks in the view: the core's df_verdicts_geodesic /
 * df_verdicts_path on a fine sampling (the one `check` uses, so both agree), worded by
 * df-verdict-text, with the curve's samples in space for the marks. Computes nothing itself. */
#pragma once

#include <gtk/gtk.h>

#include "df-decide-out.h"
#include "df-display-units.h"
#include "df-glib.h"
#include "df-verdict.h"

G_BEGIN_DECLS

/* Samples the verdicts are taken on (as `driftframe-cli check`). */
#define DF_CURVE_VERDICT_SAMPLES 2000
/* The caller shows it once below all the verdict texts it shows. */
#define DF_CURVE_VERDICTS_CAUTION DF_DECIDE_CAUTION

typedef struct
{
  char            *text;     /* "Against your limits (geodesic): ..." or why not checked */
  gboolean         checked;  /* list holds the verdicts */
  df_verdict_list  list;
  /* The curve in space for marking its stretches: arc length, points, unit normals. */
  gsize            n;
  double          *s;
  double         (*xyz)[3];
  double         (*normal)[3];
  double           length;
} DfCurveVerdicts;

void df_curve_verdicts_free (DfCurveVerdicts *v);
G_DEFINE_AUTOPTR_CLEANUP_FUNC (DfCurveVerdicts, df_curve_verdicts_free)

/* NULL when the project sets no limit that applies to a curve (steering radius, fibre
 * deviation, friction). */
DfCurveVerdicts *df_curve_verdicts_geodesic (const df_surface *surface, const df_limits *limits,
                                             double u, double v, double heading_rad,
                                             double length, const DfDisplayUnits *du);
DfCurveVerdicts *df_curve_verdicts_path     (const df_surface *surface, const df_limits *limits,
                                             const double (*uv)[2], gsize n, const char *label,
                                             const DfDisplayUnits *du);

/* A hidden, wrapping, selectable note label put in the box right after sibling, for a panel
 * to show the text in; NULL when sibling's parent is no GtkBox. */
GtkLabel *df_curve_verdicts_label_after (GtkWidget *sibling);

G_END_DECLS
