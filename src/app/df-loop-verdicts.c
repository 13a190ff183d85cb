/* df-loop-verdicts.c: a loop's verdicts against the user's limits, kept with its DfLoopItem
 * (see df-loop-verdicts.h). Holds state only; the numbers are the core's. */
#include "df-loop-verdicts.h"

struct _DfLoopVerdicts
{
  GObject parent_instance;

  /* owned */
  DfVerdictsState state;
  DfLoopCheck    *check;
  char           *error;
  GCancellable   *cancellable;
};

G_DEFINE_FINAL_TYPE (DfLoopVerdicts, df_loop_verdicts, G_TYPE_OBJECT)

enum
{
  CHANGED,
  N_SIGNALS
};

static guint signals[N_SIGNALS];

static void
df_loop_verdicts_dispose (GObject *object)
{
  DfLoopVerdicts *self = DF_LOOP_VERDICTS (object);

  if (self->cancellable != NULL)
    g_cancellable_cancel (self->cancellable);
  g_clear_object (&self->cancellable);
  G_OBJECT_CLASS (df_loop_verdicts_parent_class)->dispose (object);
}

static void
df_loop_verdicts_finalize (GObject *object)
{
  DfLoopVerdicts *self = DF_LOOP_VERDICTS (object);

  g_clear_pointer (&self->check, df_loop_check_free);
  g_free (self->error);
  G_OBJECT_CLASS (df_loop_verdicts_parent_class)->finalize (object);
}

static void
df_loop_verdicts_class_init (DfLoopVerdictsClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);

  object_class->dispose = df_loop_verdicts_dispose;
  object_class->finalize = df_loop_verdicts_finalize;
  signals[CHANGED] = g_signal_new ("changed", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0,
                                   NULL, NULL, NULL, G_TYPE_NONE, 0);
}

static void
df_loop_verdicts_init (DfLoopVerdicts *self)
{
  self->state = DF_VERDICTS_NONE;
}

DfLoopVerdicts *
df_loop_verdicts_get (DfLoopItem *item)
{
  DfLoopVerdicts *self;

  g_return_val_if_fail (DF_IS_LOOP_ITEM (item), NULL);
  self = g_object_get_data (G_OBJECT (item), "df-loop-verdicts");
  if (self == NULL)
    {
      self = g_object_new (DF_TYPE_LOOP_VERDICTS, NULL);
      g_object_set_data_full (G_OBJECT (item), "df-loop-verdicts", self, g_object_unref);
    }
  return self;
}

DfVerdictsState
df_loop_verdicts_get_state (DfLoopVerdicts *self)
{
  g_return_val_if_fail (DF_IS_LOOP_VERDICTS (self), DF_VERDICTS_NONE);
  return self->state;
}

const DfLoopCheck *
df_loop_verdicts_get_check (DfLoopVerdicts *self)
{
  g_return_val_if_fail (DF_IS_LOOP_VERDICTS (self), NULL);
  return self->state == DF_VERDICTS_DONE ? self->check : NULL;
}

const char *
df_loop_verdicts_get_error (DfLoopVerdicts *self)
{
  g_return_val_if_fail (DF_IS_LOOP_VERDICTS (self), NULL);
  return self->state == DF_VERDICTS_FAILED ? self->error : NULL;
}

guint
df_loop_verdicts_n_exceeded (DfLoopVerdicts *self)
{
  g_return_val_if_fail (DF_IS_LOOP_VERDICTS (self), 0);
  return self->state == DF_VERDICTS_DONE ? (guint) self->check->list.n_exceeded : 0;
}

static void
set_state (DfLoopVerdicts *self,
           DfVerdictsState state,
           DfLoopCheck    *check,
           const char     *message)
{
  g_clear_pointer (&self->check, df_loop_check_free);
  g_clear_pointer (&self->error, g_free);
  self->state = state;
  self->check = check;
  self->error = g_strdup (message);
  g_signal_emit (self, signals[CHANGED], 0);
}

void
df_loop_verdicts_set_none (DfLoopVerdicts *self)
{
  g_return_if_fail (DF_IS_LOOP_VERDICTS (self));
  set_state (self, DF_VERDICTS_NONE, NULL, NULL);
}

void
df_loop_verdicts_set_pending (DfLoopVerdicts *self)
{
  g_return_if_fail (DF_IS_LOOP_VERDICTS (self));
  set_state (self, DF_VERDICTS_PENDING, NULL, NULL);
}

void
df_loop_verdicts_set_check (DfLoopVerdicts *self,
                            DfLoopCheck    *check)
{
  g_return_if_fail (DF_IS_LOOP_VERDICTS (self));
  g_return_if_fail (check != NULL);
  set_state (self, DF_VERDICTS_DONE, check, NULL);
}

void
df_loop_verdicts_set_failed (DfLoopVerdicts *self,
                             const char     *message)
{
  g_return_if_fail (DF_IS_LOOP_VERDICTS (self));
  set_state (self, DF_VERDICTS_FAILED, NULL, message);
}

GCancellable *
df_loop_verdicts_restart (DfLoopVerdicts *self)
{
  g_return_val_if_fail (DF_IS_LOOP_VERDICTS (self), NULL);
  if (self->cancellable != NULL)
    g_cancellable_cancel (self->cancellable);
  g_clear_object (&self->cancellable);
  self->cancellable = g_cancellable_new ();
  return self->cancellable;
}
