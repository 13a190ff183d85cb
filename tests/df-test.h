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

#include "df-glib.h"
#include <glib/gstdio.h>

/* Removes a test's temporary folder and the files in it (no subfolders). */
static inline void
df_test_remove_dir (const char *dir)
{
  g_autoptr (GDir) d = g_dir_open (dir, 0, NULL);
  const char *name;

  while (d != NULL && (name = g_dir_read_name (d)) != NULL)
    {
      g_autofree char *p = g_build_filename (dir, name, NULL);

      g_remove (p);
    }
  g_rmdir (dir);
}

/* Surfaces from formula text, for tests; abort the test with the reader's message on error. */
static inline df_surface *
df_test_revolution (const char *r, const char *z, double t_min, double t_max)
{
  const char *vars[] = { "t" };
  g_autoptr (GError) error = NULL;
  df_expr *er, *ez;
  df_surface *s = NULL;
  df_diag diag;
  df_status st;

  er = df_expr_parse (r, vars, 1, NULL, NULL, &error);
  g_assert_no_error (error);
  ez = df_expr_parse (z, vars, 1, NULL, NULL, &error);
  g_assert_no_error (error);
  st = df_surface_new_revolution (er, ez, t_min, t_max, &s, &diag);
  if (st != DF_OK)
    g_error ("surface r = %s, z = %s: %s: %s", r, z, df_status_describe (st), diag.detail);
  return s;
}

static inline df_surface *
df_test_graph (const char *f, double x_min, double x_max, double y_min, double y_max)
{
  const char *vars[] = { "x", "y" };
  g_autoptr (GError) error = NULL;
  df_expr *ef;
  df_surface *s = NULL;
  df_diag diag;
  df_status st;

  ef = df_expr_parse (f, vars, 2, NULL, NULL, &error);
  g_assert_no_error (error);
  st = df_surface_new_graph (ef, x_min, x_max, y_min, y_max, &s, &diag);
  if (st != DF_OK)
    g_error ("surface z = %s: %s: %s", f, df_status_describe (st), diag.detail);
  return s;
}

/* A curve through chart points; aborts the test with the core's message on failure. */
static inline df_curve *
df_test_curve (const df_surface *s, const double (*uv)[2], size_t n, bool closed)
{
  df_curve *c = NULL;
  df_diag diag;
  df_status st = df_curve_new_through_points (s, uv, n, closed, &c, &diag);

  if (st != DF_OK)
    g_error ("curve: %s: %s", df_status_describe (st), diag.detail);
  return c;
}

/* Measures a closed curve at the default options; aborts the test on failure. */
static inline void
df_test_measure (const df_curve *c, df_loop_result *r)
{
  df_diag diag;
  df_status st = df_loop_measure (c, NULL, r, &diag);

  if (st != DF_OK)
    g_error ("measure: %s: %s", df_status_describe (st), diag.detail);
}
