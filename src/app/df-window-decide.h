/* df-window-decide.h: the window's hook into the decisions layer (df-window-decide.c): the
 * loops' checks against the limits, their marks in the view, the limits editor and the gore
 * tool. Only the window's own files include it. */
#pragma once

#include "df-verdict.h"
#include "df-window.h"

G_BEGIN_DECLS

/* Called once from df_window_init, after the document and the view exist. */
void _df_window_decide_init (DfWindow *self);

/* Open curves marked like the loops (dashes and ticks on their exceeded stretches). */
typedef enum
{
  DF_OPEN_MARKS_GEODESIC,
  DF_OPEN_MARKS_ROUTE_A,
  DF_OPEN_MARKS_ROUTE_B
} DfOpenMarks;

/* Marks list's exceeded stretches along the curve of n samples (arc length s from its start,
 * points and the surface's unit normals there, total length); list NULL (or nothing exceeded)
 * clears that curve's marks. */
void _df_window_decide_mark_open_curve (DfWindow               *self,
                                        DfOpenMarks             which,
                                        const double           *s,
                                        const double          (*xyz)[3],
                                        const double          (*normal)[3],
                                        gsize                   n,
                                        double                  length,
                                        const df_verdict_list  *list);

G_END_DECLS
