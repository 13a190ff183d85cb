/* df-loop-row.h: DfLoopRow, one row of the loops list: the loop's colour, its name (editable
 * in place) and a one-line summary. Emits "rename" with the new name when editing ends. */
#pragma once

#include <gtk/gtk.h>

#include "df-loop-item.h"

G_BEGIN_DECLS

#define DF_TYPE_LOOP_ROW (df_loop_row_get_type ())
G_DECLARE_FINAL_TYPE (DfLoopRow, df_loop_row, DF, LOOP_ROW, GtkWidget)

GtkWidget  *df_loop_row_new      (DfLoopItem *item);
DfLoopItem *df_loop_row_get_item (DfLoopRow *self);

G_END_DECLS
