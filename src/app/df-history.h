/* df-history.h: the undo/redo stack of the app: whole-project snapshots (the project key file
 * text, df_project_to_data), each with a short label naming the edit it undoes. Snapshots are
 * small (a surface spec and loop points), so storing them whole keeps undo obviously right. */
#pragma once

#include <glib.h>

G_BEGIN_DECLS

typedef struct _DfHistory DfHistory;

DfHistory  *df_history_new        (guint limit);
void        df_history_free       (DfHistory *history);   /* NULL: no-op */
void        df_history_clear      (DfHistory *history);

/* Records the state before an edit (takes snapshot). Clears the redo side. */
void        df_history_push       (DfHistory  *history,
                                   char       *snapshot,
                                   const char *label);
gboolean    df_history_can_undo   (const DfHistory *history);
gboolean    df_history_can_redo   (const DfHistory *history);
/* Label of the edit an undo (redo) would revert (reapply), or NULL. */
const char *df_history_undo_label (const DfHistory *history);
const char *df_history_redo_label (const DfHistory *history);

/* Steps back: stores current (taken) on the redo side and returns the snapshot to restore
 * (caller frees), or NULL (current is then freed). */
char       *df_history_undo       (DfHistory *history, char *current);
char       *df_history_redo       (DfHistory *history, char *current);

G_END_DECLS
