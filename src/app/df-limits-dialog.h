/* df-limits-dialog.h: the editor of the project's material and process limits: each limit's
 * value with its units and the free-text source it comes from; empty means not set. A value
 * whose source says it was invented (the demo's) is marked as such. Apply replaces the limits
 * as one undoable edit of the document. */
#pragma once

#include <gtk/gtk.h>

#include "df-document.h"

G_BEGIN_DECLS

/* Opens the editor for document's limits over parent (modal). Does nothing without a surface. */
void     df_limits_dialog_present     (GtkWindow  *parent,
                                       DfDocument *document);

/* TRUE when a source's text says the value is made up ("invented for the demo"). */
gboolean df_limits_source_is_invented (const char *source);

G_END_DECLS
