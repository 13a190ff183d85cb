/* df-history.c: undo/redo stack of project snapshots (see df-history.h). */
#include "df-history.h"

typedef struct
{
  char *snapshot;
  char *label;
} DfHistoryEntry;

struct _DfHistory
{
  guint      limit;
  GPtrArray *undo;  /* of DfHistoryEntry*, oldest first */
  GPtrArray *redo;  /* of DfHistoryEntry*, the next redo last */
};

static void
entry_free (gpointer data)
{
  DfHistoryEntry *entry = data;

  g_free (entry->snapshot);
  g_free (entry->label);
  g_free (entry);
}

static DfHistoryEntry *
entry_new (char       *snapshot,
           const char *label)
{
  DfHistoryEntry *entry = g_new0 (DfHistoryEntry, 1);

  entry->snapshot = snapshot;
  entry->label = g_strdup (label);
  return entry;
}

DfHistory *
df_history_new (guint limit)
{
  DfHistory *history = g_new0 (DfHistory, 1);

  history->limit = MAX (limit, 1);
  history->undo = g_ptr_array_new_with_free_func (entry_free);
  history->redo = g_ptr_array_new_with_free_func (entry_free);
  return history;
}

void
df_history_free (DfHistory *history)
{
  if (history == NULL)
    return;
  g_ptr_array_unref (history->undo);
  g_ptr_array_unref (history->redo);
  g_free (history);
}

void
df_history_clear (DfHistory *history)
{
  g_ptr_array_set_size (history->undo, 0);
  g_ptr_array_set_size (history->redo, 0);
}

void
df_history_push (DfHistory  *history,
                 char       *snapshot,
                 const char *label)
{
  g_ptr_array_add (history->undo, entry_new (snapshot, label));
  /* Oldest snapshots go first once the stack is full. */
  while (history->undo->len > history->limit)
    g_ptr_array_remove_index (history->undo, 0);
  g_ptr_array_set_size (history->redo, 0);
}

gboolean
df_history_can_undo (const DfHistory *history)
{
  return history->undo->len > 0;
}

gboolean
df_history_can_redo (const DfHistory *history)
{
  return history->redo->len > 0;
}

const char *
df_history_undo_label (const DfHistory *history)
{
  DfHistoryEntry *entry;

  if (history->undo->len == 0)
    return NULL;
  entry = g_ptr_array_index (history->undo, history->undo->len - 1);
  return entry->label;
}

const char *
df_history_redo_label (const DfHistory *history)
{
  DfHistoryEntry *entry;

  if (history->redo->len == 0)
    return NULL;
  entry = g_ptr_array_index (history->redo, history->redo->len - 1);
  return entry->label;
}

/* Moves the top of `from` to the caller and puts current (with the same label) on `to`. */
static char *
step (GPtrArray *from,
      GPtrArray *to,
      char      *current)
{
  DfHistoryEntry *entry;
  char *snapshot;

  if (from->len == 0)
    {
      g_free (current);
      return NULL;
    }
  entry = g_ptr_array_steal_index (from, from->len - 1);
  snapshot = g_steal_pointer (&entry->snapshot);
  g_ptr_array_add (to, entry_new (current, entry->label));
  entry_free (entry);
  return snapshot;
}

char *
df_history_undo (DfHistory *history,
                 char      *current)
{
  return step (history->undo, history->redo, current);
}

char *
df_history_redo (DfHistory *history,
                 char      *current)
{
  return step (history->redo, history->undo, current);
}
