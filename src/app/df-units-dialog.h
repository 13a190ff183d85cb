/* df-units-dialog.h: the Display Units window: lengths in mm, cm, m or in and Gaussian
 * curvature per square of one of them, applied at once as an undoable edit of the project
 * (its [units] group). Insensitive, with the reason as tooltip, when the surface's units label
 * is not a known unit. */
#pragma once

#include <gtk/gtk.h>

#include "df-document.h"

G_BEGIN_DECLS

/* One per parent window: presents the open one again. */
void df_units_dialog_present (GtkWindow *parent, DfDocument *document);

G_END_DECLS
