/* df-gore-dialog.h: the gore tool: for a surface of revolution, the band between two parallels
 * t0 and t1 cut into n gores bounded by meridians; the least count that keeps each gore's
 * edge within the user's largest sheet strain (when set); a seam allowance; a preview of one
 * flat gore to scale; export as SVG at true scale and as CSV outline points through the core's
 * writers, each with the caution. */
#pragma once

#include <gtk/gtk.h>

#include "df-document.h"

G_BEGIN_DECLS

/* Opens the tool for document's surface over parent (a graph gets a short explanation
 * instead). report_events: print "gores-exported svg|csv PATH" after each export. Returns the
 * dialog (owned by GTK). */
GtkWidget *df_gore_dialog_present (GtkWindow  *parent,
                                   DfDocument *document,
                                   gboolean    report_events);

G_END_DECLS
