/* df-work-guard.c: crash containment for core work (see df-work-guard.h). A process-wide
 * handler for the fatal signals runs on a per-thread alternate stack (so a stack overflow can
 * still be handled) and, when the faulting thread is inside df_guard_call, jumps back to it
 * with siglongjmp. Outside a guarded call the default action is restored and the fault
 * repeats, so a crash elsewhere still crashes (and the autosave has the work).
 *
 * Why this is tolerable: the guarded work is the core's numeric code (formulas, ODE steps,
 * meshing) on private copies of its inputs; it holds no lock of the main thread's. A fault
 * inside malloc could leave the allocator locked; that risk is accepted against the certain
 * loss of the window. */
#include <setjmp.h>
#include <signal.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#include "df-glib.h"
#include "df-work-guard.h"

/* Enough for the handler itself, which only jumps. */
#define DF_GUARD_ALT_STACK (64 * 1024)

static const int guarded_signals[] = { SIGSEGV, SIGBUS, SIGFPE, SIGILL };

static _Thread_local sigjmp_buf *guard_jump;
static _Thread_local volatile sig_atomic_t guard_signal;

static void
guard_handler (int        signo,
               siginfo_t *info,
               void      *context)
{
  if (guard_jump != NULL)
    {
      sigjmp_buf *jump = guard_jump;

      guard_jump = NULL;
      guard_signal = signo;
      siglongjmp (*jump, 1);
    }
  /* Not ours: the default action, taken when the faulting instruction runs again. */
  signal (signo, SIG_DFL);
}

static void
free_alt_stack (gpointer stack)
{
  stack_t none = { .ss_flags = SS_DISABLE };

  sigaltstack (&none, NULL);
  g_free (stack);
}

static GPrivate alt_stack_key = G_PRIVATE_INIT (free_alt_stack);

static gpointer
install_handler (gpointer unused)
{
  struct sigaction action;

  memset (&action, 0, sizeof action);
  action.sa_sigaction = guard_handler;
  action.sa_flags = SA_SIGINFO | SA_ONSTACK | SA_NODEFER;
  sigemptyset (&action.sa_mask);
  for (gsize i = 0; i < G_N_ELEMENTS (guarded_signals); i++)
    sigaction (guarded_signals[i], &action, NULL);
  return NULL;
}

/* The thread's alternate signal stack, made once per thread and freed with it. */
static void
ensure_alt_stack (void)
{
  stack_t stack;

  if (g_private_get (&alt_stack_key) != NULL)
    return;
  memset (&stack, 0, sizeof stack);
  stack.ss_sp = g_malloc (DF_GUARD_ALT_STACK);
  stack.ss_size = DF_GUARD_ALT_STACK;
  if (sigaltstack (&stack, NULL) != 0)
    {
      g_free (stack.ss_sp);
      return;
    }
  g_private_set (&alt_stack_key, stack.ss_sp);
}

gboolean
df_guard_call (DfGuardFunc  func,
               gpointer     data,
               const char  *what,
               GError     **error)
{
  static GOnce once = G_ONCE_INIT;
  sigjmp_buf jump;
  sigjmp_buf *volatile outer = guard_jump;

  g_return_val_if_fail (func != NULL, FALSE);

  g_once (&once, install_handler, NULL);
  ensure_alt_stack ();
  guard_signal = 0;
  if (sigsetjmp (jump, 1) == 0)
    {
      guard_jump = &jump;
      func (data);
      guard_jump = outer;
      return TRUE;
    }
  guard_jump = outer;
  /* The handler may have run for a signal that the faulting code had re-armed to SIG_DFL (a
   * crash outside a guard in another thread): arm it again. */
  install_handler (NULL);
  g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY,
               "The computation crashed while %s (%s, a defect in driftframe's core on this "
               "input). Nothing was changed; the project is intact",
               what, guard_signal == SIGSEGV ? "invalid memory access or stack overflow"
                     : guard_signal == SIGFPE ? "arithmetic fault"
                     : guard_signal == SIGBUS ? "bus error" : "illegal instruction");
  return FALSE;
}
