/* df-verdict-badge.h: DfVerdictBadge, the small line in a loop's row that tells whether the
 * loop stays within the user's limits: an icon and words (a tick "within the limits", a
 * warning sign "2 stretches beyond the limits"), never colour alone. Hidden while no limit is
 * set. Observes the item's DfLoopVerdicts. */
#pragma once

#include <gtk/gtk.h>

#include "df-loop-item.h"

G_BEGIN_DECLS

#define DF_TYPE_VERDICT_BADGE (df_verdict_badge_get_type ())
G_DECLARE_FINAL_TYPE (DfVerdictBadge, df_verdict_badge, DF, VERDICT_BADGE, GtkWidget)

GtkWidget *df_verdict_badge_new (DfLoopItem *item);

G_END_DECLS
