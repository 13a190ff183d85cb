/* df-loop-row.h: DfLoopRow, one row of the loops list: the loop's colour, its name and a
 * one-line summary, kept up to date from its DfLoopItem. */
#pragma once

#include <gtk/gtk.h>

#include "df-loop-item.h"

G_BEGIN_DECLS

#define DF_TYPE_LOOP_ROW (df_loop_row_get_type ())
G_DECLARE_FINAL_TYPE (DfLoopRow, df_loop_row, DF, LOOP_ROW, GtkWidget)

GtkWidget  *df_loop_row_new      (DfLoopItem *item);
DfLoopItem *df_loop_row_get_item (DfLoopRow *self);

G_END_DECLS
