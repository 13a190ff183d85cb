/* df-loop-verdicts.h: DfLoopVerdicts, a loop's standing against the user's limits: not
 * checked (no limit set), checking, checked (the DfLoopCheck: verdicts, plot curves) or failed
 * with a message. One per DfLoopItem, attached to it, so the row, the details and the view read
 * the same state; the window's checker (df-window-verdicts.c) fills it. */
#pragma once

#include "df-loop-item.h"
#include "df-verdict-work.h"

G_BEGIN_DECLS

typedef enum
{
  DF_VERDICTS_NONE,      /* no limit is set: nothing to check */
  DF_VERDICTS_PENDING,
  DF_VERDICTS_DONE,
  DF_VERDICTS_FAILED
} DfVerdictsState;

#define DF_TYPE_LOOP_VERDICTS (df_loop_verdicts_get_type ())
G_DECLARE_FINAL_TYPE (DfLoopVerdicts, df_loop_verdicts, DF, LOOP_VERDICTS, GObject)

/* The item's verdicts (borrowed; made on first use and kept with the item). */
DfLoopVerdicts    *df_loop_verdicts_get         (DfLoopItem *item);

DfVerdictsState    df_loop_verdicts_get_state   (DfLoopVerdicts *self);
/* NULL unless DONE. */
const DfLoopCheck *df_loop_verdicts_get_check   (DfLoopVerdicts *self);
const char        *df_loop_verdicts_get_error   (DfLoopVerdicts *self);
/* Stretches beyond a limit (0 unless DONE). */
guint              df_loop_verdicts_n_exceeded  (DfLoopVerdicts *self);

/* Each emits "changed". set_check takes check. */
void               df_loop_verdicts_set_none    (DfLoopVerdicts *self);
void               df_loop_verdicts_set_pending (DfLoopVerdicts *self);
void               df_loop_verdicts_set_check   (DfLoopVerdicts *self, DfLoopCheck *check);
void               df_loop_verdicts_set_failed  (DfLoopVerdicts *self, const char *message);
/* Cancels a running check, returns a fresh cancellable for the next (owned here). */
GCancellable      *df_loop_verdicts_restart     (DfLoopVerdicts *self);

G_END_DECLS
