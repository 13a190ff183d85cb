/* df-work-guard.h: runs one piece of core work so that a crash inside it (a stack overflow in
 * a runaway recursion, an invalid memory access on a degenerate surface) fails that job with a
 * GError instead of taking the window and the user's unsaved work down. The app's last line of
 * defence: the cause is always a core bug to fix, and the message says so. */
#pragma once

#include <glib.h>

G_BEGIN_DECLS

typedef void (*DfGuardFunc) (gpointer data);

/* Calls func (data) in the calling thread. Returns TRUE when it returned normally; FALSE with
 * error set (DF_IO_ERROR GEOMETRY, naming what) when it crashed with SIGSEGV, SIGBUS, SIGFPE or
 * SIGILL. After a crash, whatever func had allocated is leaked and its outputs are undefined:
 * the caller must only report the failure. what: "drawing the surface", "measuring the loop". */
gboolean df_guard_call (DfGuardFunc  func,
                        gpointer     data,
                        const char  *what,
                        GError     **error);

G_END_DECLS
