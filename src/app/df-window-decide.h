/* df-window-decide.h: the window's hook into the decisions layer (df-window-decide.c): the
 * loops' checks against the limits, their marks in the view, the limits editor and the gore
 * tool. Only the window's own files include it. */
#pragma once

#include "df-window.h"

G_BEGIN_DECLS

/* Called once from df_window_init, after the document and the view exist. */
void _df_window_decide_init (DfWindow *self);

G_END_DECLS
