/* test-data.c: surfaces from data files: the measured-point CSV reader's refusals (each naming
 * the file and line or column), the surface file keys profile=, heights=, fit-tolerance= and
 * data-sha256=, paths relative to the file naming them, and a changed or missing data file. */
#include <glib/gstdio.h>
#include <math.h>
#include <string.h>

#include "df-test.h"

static char *tmp_dir;

static char *
write_tmp (const char *name, const char *text)
{
  char *path = g_build_filename (tmp_dir, name, NULL);

  g_assert_true (g_file_set_contents (path, text, -1, NULL));
  return path;
}

static void
expect_csv_error (const char *text, const char *const *header, int n, const char *want)
{
  g_autofree char *path = write_tmp ("bad.csv", text);
  g_autoptr (GError) error = NULL;
  g_autofree double *v = NULL;
  gsize rows = 0;

  g_assert_false (df_data_csv_read (path, header, n, &v, &rows, NULL, &error));
  g_assert_nonnull (error);
  if (strstr (error->message, want) == NULL || strstr (error->message, "bad.csv") == NULL)
    g_error ("message '%s' lacks '%s' or the file name", error->message, want);
}

static void
test_csv_errors (void)
{
  static const char *const rz[] = { "r", "z" };
  static const char *const xyz[] = { "x", "y", "z" };

  expect_csv_error ("r,z\n1,2\n1,abc\n", rz, 2, ":3: column 2 (z): 'abc' is not a number");
  expect_csv_error ("r,z\n1,2\nnan,3\n", rz, 2, ":3: column 1 (r): 'nan' is not a finite");
  expect_csv_error ("r,z\n1,2\n4,inf\n", rz, 2, ":3: column 2 (z): 'inf' is not a finite");
  expect_csv_error ("x,z\n1,2\n", rz, 2, ":1: the header must be 'r,z'");
  expect_csv_error ("# only a comment\n", xyz, 3, "no header");
  expect_csv_error ("x,y,z\n1,2\n", xyz, 3, ":2: expected 3 numbers, found 2");
  {
    g_autoptr (GError) error = NULL;
    g_autofree double *v = NULL;
    gsize rows;

    g_assert_false (df_data_csv_read ("/nonexistent/none.csv", rz, 2, &v, &rows, NULL, &error));
    g_assert_nonnull (strstr (error->message, "none.csv"));
  }
}

/* A cap of the sphere R = 50 from its pole, 40 points, in the temporary folder. */
static void
write_cap (const char *name, size_t n, gboolean break_order)
{
  g_autoptr (GString) s = g_string_new ("# test cap\nr,z\n");
  g_autofree char *path = NULL;

  for (size_t i = 0; i < n; i++)
    {
      double th = 1.2 * i / (n - 1);

      if (break_order && i == 20)
        th = 0.1;
      g_string_append_printf (s, "%.12g,%.12g\n", i == 0 ? 0.0 : 50 * sin (th), 50 * cos (th));
    }
  path = write_tmp (name, s->str);
}

static void
test_surface_file (void)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface_spec) spec = NULL;
  g_autoptr (df_surface) surface = NULL;
  g_autofree char *sf = NULL, *saved = NULL, *saved_text = NULL;
  g_autoptr (GKeyFile) kf = g_key_file_new ();
  df_fit_info info;
  double u0, u1;

  write_cap ("cap.csv", 40, FALSE);
  sf = write_tmp ("cap.surface", "[surface]\nkind=revolution\nprofile=cap.csv\nunits=mm\n");
  spec = df_surface_spec_load (sf, &error);
  g_assert_no_error (error);
  surface = df_surface_spec_build (spec, &error);
  g_assert_no_error (error);
  g_assert_true (df_fit_get_info (df_surface_get_fn (surface), &info));
  /* No fit-tolerance: chosen from the data. */
  g_assert_true (info.chosen);
  g_assert_cmpuint (info.points, ==, 40);
  df_surface_get_domain (surface, &u0, &u1, NULL, NULL);
  /* Arc length of the cap's meridian, R times the polar angle 1.2. */
  df_assert_close (u1 - u0, 50 * 1.2, 1e-5, 0.0);

  /* Saving records the data file's SHA-256; a changed file is then refused on load. */
  saved = g_build_filename (tmp_dir, "cap-saved.surface", NULL);
  g_assert_true (df_surface_spec_save (spec, saved, &error));
  g_assert_true (g_file_get_contents (saved, &saved_text, NULL, NULL));
  g_assert_nonnull (strstr (saved_text, "data-sha256="));
  g_assert_nonnull (strstr (saved_text, "profile=cap.csv"));
  {
    g_autoptr (df_surface_spec) again = df_surface_spec_load (saved, &error);

    g_assert_no_error (error);
    g_assert_nonnull (again);
  }
  write_cap ("cap.csv", 41, FALSE);
  {
    g_autoptr (df_surface_spec) changed = df_surface_spec_load (saved, &error);

    g_assert_null (changed);
    g_assert_nonnull (error);
    g_assert_nonnull (strstr (error->message, "has changed since"));
    g_assert_nonnull (strstr (error->message, "cap-saved.surface"));
    g_clear_error (&error);
  }
  /* Missing data file, named. */
  {
    g_autofree char *m = write_tmp ("missing.surface",
                                    "[surface]\nkind=graph\nheights=gone.csv\n");
    g_autoptr (df_surface_spec) gone = df_surface_spec_load (m, &error);

    g_assert_null (gone);
    g_assert_nonnull (strstr (error->message, "gone.csv"));
    g_clear_error (&error);
  }
  /* A fit refusal names the file and the line of the row (row 20 is line 23: comment,
   * header, 0-based row). */
  write_cap ("order.csv", 40, TRUE);
  {
    g_autofree char *o = write_tmp ("order.surface",
                                    "[surface]\nkind=revolution\nprofile=order.csv\n");
    g_autoptr (df_surface_spec) os = df_surface_spec_load (o, &error);
    g_autoptr (df_surface) bad = NULL;

    g_assert_no_error (error);
    bad = df_surface_spec_build (os, &error);
    g_assert_null (bad);
    if (strstr (error->message, "order.csv:2") == NULL)
      g_error ("message '%s' lacks the file and line", error->message);
    g_clear_error (&error);
  }
  /* Formulas and data do not mix; fit-tolerance must be a length. */
  {
    g_autofree char *a = write_tmp ("mix.surface", "[surface]\nkind=revolution\n"
                                    "profile=cap.csv\nr=t\n");
    g_autofree char *b = write_tmp ("tol.surface", "[surface]\nkind=revolution\n"
                                    "profile=cap.csv\nfit-tolerance=-1\n");
    g_autoptr (df_surface_spec) sa = df_surface_spec_load (a, &error);

    g_assert_null (sa);
    g_assert_nonnull (strstr (error->message, "r: a surface from data"));
    g_clear_error (&error);
    sa = df_surface_spec_load (b, &error);
    g_assert_null (sa);
    g_assert_nonnull (strstr (error->message, "fit-tolerance"));
    g_clear_error (&error);
  }
}

int
main (int argc, char **argv)
{
  int rc;

  df_core_init ();
  g_test_init (&argc, &argv, NULL);
  tmp_dir = g_dir_make_tmp ("df-test-data-XXXXXX", NULL);
  g_assert_nonnull (tmp_dir);
  g_test_add_func ("/io/data/csv-errors", test_csv_errors);
  g_test_add_func ("/io/data/surface-file", test_surface_file);
  rc = g_test_run ();
  df_test_remove_dir (tmp_dir);
  g_free (tmp_dir);
  return rc;
}
