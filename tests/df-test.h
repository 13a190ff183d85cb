/* df-test.h: shared helpers for the GTest programs: a float comparison that prints both values. */
#pragma once

#include <glib.h>
#include <math.h>

/* Passes when |got - want| <= max(abs_tol, rel_tol * |want|); prints both values otherwise. */
#define df_assert_close(got, want, rel_tol, abs_tol)                                          \
  G_STMT_START                                                                                \
  {                                                                                           \
    double df__g = (got), df__w = (want);                                                     \
    double df__tol = MAX ((abs_tol), (rel_tol) * fabs (df__w));                               \
    if (!(isfinite (df__g) && fabs (df__g - df__w) <= df__tol))                               \
      {                                                                                       \
        g_autofree char *df__m = g_strdup_printf (                                            \
            "%s = %.17g, expected %s = %.17g (diff %.3g, tol %.3g)", #got, df__g, #want,      \
            df__w, df__g - df__w, df__tol);                                                   \
        g_assertion_message (G_LOG_DOMAIN, __FILE__, __LINE__, G_STRFUNC, df__m);             \
      }                                                                                       \
  }                                                                                           \
  G_STMT_END
