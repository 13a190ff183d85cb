/* df-verdict-details.h: DfVerdictDetails, the loop details' section on the user's limits:
 * each verdict as a line with an icon and words (within, or exceeded from s0 to s1 with the
 * worst value, where it is, the limit and its source), the plots against arc length and the
 * caution. Hidden while no limit is set. */
#pragma once

#include <gtk/gtk.h>

#include "df-document.h"

G_BEGIN_DECLS

#define DF_TYPE_VERDICT_DETAILS (df_verdict_details_get_type ())
G_DECLARE_FINAL_TYPE (DfVerdictDetails, df_verdict_details, DF, VERDICT_DETAILS, GtkWidget)

GtkWidget *df_verdict_details_new      (void);
/* Shows item's verdicts (NULL: none) against document's limits. */
void       df_verdict_details_set_item (DfVerdictDetails *self,
                                        DfDocument       *document,
                                        DfLoopItem       *item);

G_END_DECLS
