/* test-report.c: the design record as a quality engineer would check it: `driftframe-cli report
 * --pdf` run on projects, the PDF read back with Debian's poppler-utils (pdfinfo for pages and
 * paper size, pdftotext for the words and figures, pdftoppm for the picture's pixels), its
 * figures compared with closed forms and its hashes with GLib's SHA-256. Skips when
 * poppler-utils is missing (.ci/packages installs it). */
#include <math.h>
#include <string.h>

#include <glib/gstdio.h>

#include "df-glib.h"
#include "df-test.h"

static char *tmp_dir;

typedef struct
{
  int   status;
  char *out;
  char *err;
} run_result;

static void
run_result_clear (run_result *r)
{
  g_clear_pointer (&r->out, g_free);
  g_clear_pointer (&r->err, g_free);
}

G_DEFINE_AUTO_CLEANUP_CLEAR_FUNC (run_result, run_result_clear)

/* Runs argv (NULL-terminated) and keeps its exit status and output. */
static void
run (run_result *r, const char *const *argv)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (GError) exit_error = NULL;
  int wait_status = 0;

  g_assert_true (g_spawn_sync (NULL, (char **) argv, NULL, G_SPAWN_SEARCH_PATH, NULL, NULL,
                               &r->out, &r->err, &wait_status, &error));
  g_assert_no_error (error);
  r->status = g_spawn_check_wait_status (wait_status, &exit_error) ? 0 : exit_error->code;
  g_test_message ("%s: exit %d\nstderr: %s", argv[0], r->status, r->err);
}

static gboolean
have_poppler (void)
{
  g_autofree char *a = g_find_program_in_path ("pdftotext");
  g_autofree char *b = g_find_program_in_path ("pdfinfo");
  g_autofree char *c = g_find_program_in_path ("pdftoppm");

  if (a == NULL || b == NULL || c == NULL)
    {
      g_test_skip ("poppler-utils (pdftotext, pdfinfo, pdftoppm) is not installed");
      return FALSE;
    }
  return TRUE;
}

static char *
write_tmp (const char *name, const char *text)
{
  char *path = g_build_filename (tmp_dir, name, NULL);

  g_assert_true (g_file_set_contents (path, text, -1, NULL));
  return path;
}

static char *
pdf_text (const char *pdf)
{
  const char *argv[] = { "pdftotext", "-layout", pdf, "-", NULL };
  run_result r = { 0 };
  char *text;

  run (&r, argv);
  g_assert_cmpint (r.status, ==, 0);
  text = g_steal_pointer (&r.out);
  run_result_clear (&r);
  return text;
}

/* A latitude circle at polar angle theta on a sphere of radius 100 mm, as a project whose
 * record fields are set. The loop runs with increasing phi. */
static char *
sphere_project (const char *name, double theta, int n)
{
  g_autoptr (GString) u = g_string_new (NULL);
  g_autoptr (GString) v = g_string_new (NULL);
  g_autofree char *text = NULL;
  char buf[G_ASCII_DTOSTR_BUF_SIZE];

  for (int i = 0; i < n; i++)
    {
      g_string_append_printf (u, "%s%s", i ? ";" : "", g_ascii_dtostr (buf, sizeof buf, theta));
      g_string_append_printf (v, "%s%s", i ? ";" : "",
                              g_ascii_dtostr (buf, sizeof buf, -G_PI + 2 * G_PI * i / n));
    }
  text = g_strdup_printf ("[surface]\nkind=revolution\nr=R*sin(t)\nz=R*cos(t)\nt-min=0\n"
                          "t-max=pi\nunits=mm\n\n[parameters]\nR=100\n\n"
                          "[record]\ntitle=Test dome\npart-number=TD-001\nrevision=C\n"
                          "author=Test Author\n\n"
                          "[loop 1]\nname=Latitude ply\ncolour=#3b7dd0\nframes=true\nu=%s\nv=%s\n",
                          u->str, v->str);
  return write_tmp (name, text);
}

/* The number printed after the first `label` in text (a loop's section). */
static double
number_after (const char *text, const char *label)
{
  const char *p = strstr (text, label);

  g_assert_nonnull (p);
  p += strlen (label);
  /* Past the column gap and any opening bracket, to the number. */
  while (*p != '\0' && *p != '\n' && strchr ("+-0123456789", *p) == NULL)
    p++;
  return g_ascii_strtod (p, NULL);
}

/* Page size in points from pdfinfo's "Page size:  595.276 x 841.89 pts (A4)". */
static void
page_size (const char *pdf, double *w, double *h, int *pages)
{
  const char *argv[] = { "pdfinfo", pdf, NULL };
  g_auto (run_result) r = { 0 };
  const char *p;

  run (&r, argv);
  g_assert_cmpint (r.status, ==, 0);
  p = strstr (r.out, "Page size:");
  g_assert_nonnull (p);
  g_assert_cmpint (sscanf (p, "Page size: %lf x %lf", w, h), ==, 2);
  p = strstr (r.out, "Pages:");
  g_assert_nonnull (p);
  g_assert_cmpint (sscanf (p, "Pages: %d", pages), ==, 1);
}

static void
test_sphere_record (void)
{
  const double theta = 1.0;
  g_autofree char *proj = sphere_project ("dome.dfproj", theta, 96);
  g_autofree char *pdf = g_build_filename (tmp_dir, "dome.pdf", NULL);
  const char *argv[] = { DF_CLI_PATH, "report", "--project", proj, "--pdf", pdf, NULL };
  g_auto (run_result) r = { 0 };
  g_autofree char *text = NULL;
  g_autofree char *data = NULL;
  g_autofree char *sum = NULL;
  gsize len;
  const char *section;
  double w, h, hol;
  int pages;

  if (!have_poppler ())
    return;
  run (&r, argv);
  g_assert_cmpint (r.status, ==, 0);
  page_size (pdf, &w, &h, &pages);
  /* ISO 216 A4 is 210 x 297 mm = 595.276 x 841.89 pt. */
  df_assert_close (w, 595.276, 0, 0.01);
  df_assert_close (h, 841.89, 0, 0.01);
  g_assert_cmpint (pages, >=, 2);

  text = pdf_text (pdf);
  g_assert_nonnull (strstr (text, "Loop 1: Latitude ply"));
  section = strstr (text, "Loop 1: Latitude ply");
  /* The title block, from the project's [record] group. */
  g_assert_nonnull (strstr (text, "Test dome"));
  g_assert_nonnull (strstr (text, "TD-001"));
  g_assert_nonnull (strstr (text, "Test Author"));
  g_assert_nonnull (strstr (text, "driftframe "));
  g_assert_nonnull (strstr (text, "Latitude ply"));
  /* The project file's SHA-256, computed here by GLib's checksum. */
  g_assert_true (g_file_get_contents (proj, &data, &len, NULL));
  sum = g_compute_checksum_for_data (G_CHECKSUM_SHA256, (const guchar *) data, len);
  g_assert_nonnull (strstr (text, sum));
  /* Latitude circle at polar angle theta: holonomy = enclosed curvature = 2 pi (1 - cos theta)
   * up to sign (Gauss-Bonnet; do Carmo, sec. 4-5, from memory). Printed to 8 digits. */
  hol = number_after (section, "Holonomy ");
  df_assert_close (fabs (hol), 360 * (1 - cos (theta)), 0, 1e-5);
  df_assert_close (fabs (number_after (section, "Enclosed curvature ")), 360 * (1 - cos (theta)), 0,
                   1e-5);
  /* Its length 2 pi R sin theta, with its unit. */
  df_assert_close (number_after (section, "Length "), 2 * G_PI * 100 * sin (theta), 1e-6, 0);
  g_assert_nonnull (strstr (text, " mm"));
  g_assert_nonnull (strstr (text, "Gauss\xe2\x80\x93" "Bonnet residual"));
  g_assert_nonnull (strstr (text, "k_g"));
  /* The caution, and page numbers. */
  g_assert_nonnull (strstr (text, "not a material or structural assessment"));
  g_assert_nonnull (strstr (text, "Page 1 of"));
  g_assert_null (strstr (text, "nan"));
  g_assert_null (strstr (text, "inf "));
}

/* Reads a binary PPM (P6, maxval 255) as pdftoppm writes it. */
static guchar *
read_ppm (const char *path, int *w, int *h)
{
  g_autofree char *data = NULL;
  gsize len;
  int maxval, off = 0;

  g_assert_true (g_file_get_contents (path, &data, &len, NULL));
  g_assert_cmpint (sscanf (data, "P6 %d %d %d%n", w, h, &maxval, &off), ==, 3);
  g_assert_cmpint (maxval, ==, 255);
  off++;   /* the single white space after maxval */
  g_assert_cmpuint (len, >=, (gsize) off + (gsize) *w * *h * 3);
  return g_memdup2 (data + off, (gsize) *w * *h * 3);
}

/* The picture shows the surface: on a sphere (K = 1/R^2 > 0 everywhere) the shading is the
 * warm end of the scale, so a good share of some page's pixels are orange; the rest of the record
 * is black text on white. */
static void
test_picture_pixels (void)
{
  g_autofree char *proj = sphere_project ("pic.dfproj", 0.8, 64);
  g_autofree char *pdf = g_build_filename (tmp_dir, "pic.pdf", NULL);
  g_autofree char *prefix = g_build_filename (tmp_dir, "pic", NULL);
  const char *argv[] = { DF_CLI_PATH, "report", "--project", proj, "--pdf", pdf, NULL };
  const char *ppm[] = { "pdftoppm", "-r", "40", pdf, prefix, NULL };
  g_auto (run_result) r = { 0 };
  g_auto (run_result) r2 = { 0 };
  double best = 0;

  if (!have_poppler ())
    return;
  run (&r, argv);
  g_assert_cmpint (r.status, ==, 0);
  run (&r2, ppm);
  g_assert_cmpint (r2.status, ==, 0);
  for (int page = 1; page <= 9; page++)
    {
      g_autofree char *path = g_strdup_printf ("%s-%d.ppm", prefix, page);
      g_autofree guchar *px = NULL;
      int w, h;
      gsize warm = 0;

      if (!g_file_test (path, G_FILE_TEST_EXISTS))
        continue;
      px = read_ppm (path, &w, &h);
      for (gsize i = 0; i < (gsize) w * h; i++)
        {
          int R = px[3 * i], G = px[3 * i + 1], B = px[3 * i + 2];

          if (R > G + 30 && R > B + 60)
            warm++;
        }
      best = fmax (best, (double) warm / ((double) w * h));
    }
  /* The 300 pt high picture covers about a fifth of a page; a quarter of that at least is
   * surface. */
  g_assert_cmpfloat (best, >, 0.03);
}

static void
test_letter_and_bad_paper (void)
{
  g_autofree char *proj = sphere_project ("letter.dfproj", 0.5, 48);
  g_autofree char *pdf = g_build_filename (tmp_dir, "letter.pdf", NULL);
  const char *argv[] = { DF_CLI_PATH, "report", "--project", proj, "--pdf", pdf, "--paper",
                         "letter", NULL };
  const char *bad[] = { DF_CLI_PATH, "report", "--project", proj, "--pdf", pdf, "--paper",
                        "b5", NULL };
  g_auto (run_result) r = { 0 };
  g_auto (run_result) r2 = { 0 };
  double w, h;
  int pages;

  if (!have_poppler ())
    return;
  run (&r, argv);
  g_assert_cmpint (r.status, ==, 0);
  page_size (pdf, &w, &h, &pages);
  /* US Letter is 8.5 x 11 in = 612 x 792 pt (ANSI/ASME Y14.1). */
  df_assert_close (w, 612, 0, 0.01);
  df_assert_close (h, 792, 0, 0.01);
  run (&r2, bad);
  g_assert_cmpint (r2.status, ==, 2);
  g_assert_nonnull (strstr (r2.err, "--paper"));
  g_assert_nonnull (strstr (r2.err, "b5"));
}

/* A loop that cannot be measured stays in the record with its reason, and the run says so. */
static void
test_unmeasured_loop_listed (void)
{
  g_autofree char *proj = write_tmp (
    "bad.dfproj",
    "[surface]\nkind=graph\nz=0.001*(x*x+y*y)\nx-min=-50\nx-max=50\ny-min=-50\ny-max=50\n\n"
    "[loop 1]\nname=Good patch\nu=10;0;-10;0\nv=0;10;0;-10\n\n"
    "[loop 2]\nname=Doubled corner\nu=10;10;0;-10;0\nv=0;0;10;0;-10\n");
  g_autofree char *pdf = g_build_filename (tmp_dir, "bad.pdf", NULL);
  const char *argv[] = { DF_CLI_PATH, "report", "--project", proj, "--pdf", pdf, NULL };
  g_auto (run_result) r = { 0 };
  g_autofree char *text = NULL;

  if (!have_poppler ())
    return;
  run (&r, argv);
  g_assert_cmpint (r.status, ==, 2);
  g_assert_nonnull (strstr (r.err, "Doubled corner"));
  g_assert_true (g_file_test (pdf, G_FILE_TEST_EXISTS));
  text = pdf_text (pdf);
  g_assert_nonnull (strstr (text, "Good patch"));
  g_assert_nonnull (strstr (text, "Doubled corner"));
  g_assert_nonnull (strstr (text, "Not measured"));
  g_assert_nonnull (strstr (r.out, "not measured"));
}

/* The title block survives a save and reload of the project. */
static void
test_record_round_trip (void)
{
  g_autofree char *proj = sphere_project ("trip.dfproj", 0.7, 32);
  g_autoptr (GError) error = NULL;
  g_autoptr (df_project) p = df_project_load (proj, &error);
  g_autoptr (df_project) q = NULL;
  g_autofree char *data = NULL;

  g_assert_no_error (error);
  g_assert_cmpstr (p->record.part_number, ==, "TD-001");
  g_assert_true (df_project_set_record (p, "revision", "D"));
  g_assert_false (df_project_set_record (p, "colour", "x"));
  data = df_project_to_data (p);
  q = df_project_from_data (data, "saved", &error);
  g_assert_no_error (error);
  g_assert_cmpstr (q->record.title, ==, "Test dome");
  g_assert_cmpstr (q->record.revision, ==, "D");
  g_assert_cmpstr (q->record.author, ==, "Test Author");
  g_clear_pointer (&q, df_project_free);
  q = df_project_from_data ("[surface]\nkind=graph\nz=0\nx-min=0\nx-max=1\ny-min=0\ny-max=1\n"
                            "[record]\nsponsor=x\n", "odd.dfproj", &error);
  g_assert_null (q);
  g_assert_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT);
  g_assert_nonnull (strstr (error->message, "odd.dfproj: [record] unknown key 'sponsor'"));
}

/* Geodesics, path pairs, probe points and the view: saved, reloaded, and in the record. */
static const char extras_text[] =
  "[geodesic 1]\nname=Meridian run\nstart=1.5707963267948966;0\nheading-deg=0\nlength=50\n\n"
  "[paths 1]\nname=Two routes\na-u=1.0;1.2;1.4\na-v=0;0;0\nb-u=1.0;1.1;1.3;1.4\n"
  "b-v=0;0.2;0.2;0\n\n"
  "[probe 1]\nname=Shoulder\nat=1.0;0.5\n\n"
  "[view]\ncolouring=mean\nyaw-deg=-20\npitch-deg=35\n";

static void
test_extras_round_trip (void)
{
  g_autofree char *base = sphere_project ("extras-base.dfproj", 0.7, 32);
  g_autofree char *text = NULL;
  g_autofree char *saved = NULL;
  g_autoptr (GError) error = NULL;
  g_autoptr (df_project) p = NULL;
  g_autoptr (df_project) q = NULL;
  const df_project_paths *pp;

  g_assert_true (g_file_get_contents (base, &text, NULL, NULL));
  {
    g_autofree char *all = g_strconcat (text, "\n", extras_text, NULL);

    p = df_project_from_data (all, "extras.dfproj", &error);
  }
  g_assert_no_error (error);
  g_assert_cmpuint (p->extras.geodesics->len, ==, 1);
  g_assert_cmpuint (p->extras.paths->len, ==, 1);
  g_assert_cmpuint (p->extras.probes->len, ==, 1);
  g_assert_true (p->extras.view.set);
  saved = df_project_to_data (p);
  q = df_project_from_data (saved, "saved.dfproj", &error);
  g_assert_no_error (error);
  g_assert_cmpstr (((df_project_geodesic *) q->extras.geodesics->pdata[0])->name, ==,
                   "Meridian run");
  g_assert_true (((df_project_geodesic *) q->extras.geodesics->pdata[0])->u == G_PI / 2);
  pp = q->extras.paths->pdata[0];
  g_assert_cmpuint (pp->n_a, ==, 3);
  g_assert_cmpuint (pp->n_b, ==, 4);
  g_assert_true (pp->b[1][1] == 0.2);
  g_assert_cmpstr (q->extras.view.colouring, ==, "mean");
  g_assert_true (q->extras.view.pitch_deg == 35);
  g_assert_true (((df_project_probe *) q->extras.probes->pdata[0])->v == 0.5);
}

static void
test_extras_bad (void)
{
  static const struct
  {
    const char *group;
    const char *message;
  } cases[] = {
    { "[view]\npitch-deg=100\n", "bad.dfproj: [view] pitch-deg: must lie in [-90, 90]" },
    { "[view]\ncolouring=rainbow\n", "[view] colouring: 'rainbow' is not one of" },
    { "[geodesic 1]\nstart=1\nheading-deg=0\nlength=5\n",
      "[geodesic 1] start: expected two numbers u;v, found 1 value" },
    { "[geodesic 1]\nstart=1;0\nheading-deg=0\nlength=-5\n",
      "[geodesic 1] length: must be greater than 0" },
    { "[geodesic 1]\nstart=1;0\nheading-deg=0\nlength=5\ncolour=red\n",
      "[geodesic 1] unknown key 'colour'" },
    { "[paths 1]\na-u=1;2\na-v=0;0\nb-u=1;2;3\nb-v=0;0\n", "[paths 1] b-u: 3 values but b-v has 2" },
    { "[probe 1]\nat=x;1\n", "[probe 1] at: value 1 'x' is not a number" },
    { "[probe x]\nat=1;1\n", "unknown group [probe x]" },
  };
  g_autofree char *base = sphere_project ("extras-bad.dfproj", 0.7, 32);
  g_autofree char *text = NULL;

  g_assert_true (g_file_get_contents (base, &text, NULL, NULL));
  for (gsize i = 0; i < G_N_ELEMENTS (cases); i++)
    {
      g_autofree char *all = g_strconcat (text, "\n", cases[i].group, NULL);
      g_autoptr (GError) error = NULL;
      g_autoptr (df_project) p = df_project_from_data (all, "bad.dfproj", &error);

      g_assert_null (p);
      g_assert_nonnull (error);
      g_test_message ("%s", error->message);
      g_assert_nonnull (strstr (error->message, cases[i].message));
    }
}

/* The record lists the geodesic, the path pair and the probe with figures from closed forms:
 * on a sphere of radius R a geodesic from the equator heading along the meridian stays on it,
 * so after length L it is at polar angle pi/2 + L/R (great circles, do Carmo sec. 4-4, from
 * memory); K = 1/R^2 everywhere. */
static void
test_extras_in_record (void)
{
  g_autofree char *base = sphere_project ("extras-rec.dfproj", 0.7, 32);
  g_autofree char *text = NULL;
  g_autofree char *path = NULL;
  g_autofree char *pdf = g_build_filename (tmp_dir, "extras.pdf", NULL);
  g_autofree char *out = NULL;
  g_auto (run_result) r = { 0 };
  const char *sec;

  if (!have_poppler ())
    return;
  g_assert_true (g_file_get_contents (base, &text, NULL, NULL));
  {
    g_autofree char *all = g_strconcat (text, "\n", extras_text, NULL);

    path = write_tmp ("extras.dfproj", all);
  }
  {
    const char *argv[] = { DF_CLI_PATH, "report", "--project", path, "--pdf", pdf, NULL };

    run (&r, argv);
  }
  g_assert_cmpint (r.status, ==, 0);
  out = pdf_text (pdf);
  sec = strstr (out, "Geodesic 1: Meridian run");
  g_assert_nonnull (sec);
  df_assert_close (number_after (sec, "End (chart)") , G_PI / 2 + 0.5, 1e-7, 0);
  g_assert_nonnull (strstr (out, "Path pair 1: Two routes"));
  g_assert_nonnull (strstr (out, "Rotation from A to B"));
  sec = strstr (out, "Probe 1: Shoulder");
  g_assert_nonnull (sec);
  df_assert_close (number_after (sec, "Gaussian curvature K"), 1e-4, 1e-8, 0);
}

/* The demo's record carries the verdicts of `check` against its (invented) limits: the same
 * stretches, each with its source, and the caution of the decision layer. */
static void
test_demo_verdicts (void)
{
  g_autofree char *demo = g_build_filename (DF_EXAMPLES_DIR, "demo.dfproj", NULL);
  g_autofree char *pdf = g_build_filename (tmp_dir, "demo.pdf", NULL);
  const char *argv[] = { DF_CLI_PATH, "report", "--project", demo, "--pdf", pdf, NULL };
  const char *check[] = { DF_CLI_PATH, "check", "--project", demo, NULL };
  g_auto (run_result) r = { 0 };
  g_auto (run_result) c = { 0 };
  g_autofree char *text = NULL;
  guint in_pdf = 0, in_check = 0;

  if (!have_poppler ())
    return;
  run (&r, argv);
  g_assert_cmpint (r.status, ==, 0);
  run (&c, check);
  g_assert_cmpint (c.status, ==, 3);
  text = pdf_text (pdf);
  for (const char *p = text; (p = strstr (p, ": EXCEEDED")) != NULL; p++)
    in_pdf++;
  for (const char *p = c.out; (p = strstr (p, "EXCEEDED")) != NULL; p++)
    in_check++;
  g_assert_cmpuint (in_check, >, 0);
  g_assert_cmpuint (in_pdf, ==, in_check);
  g_assert_nonnull (strstr (text, "Source: invented for the demo"));
  g_assert_nonnull (strstr (text, "LIMITS"));
  g_assert_nonnull (strstr (text, "Geometric indicators only"));
}

/* A surface from data: the record names the data file with its SHA-256 (computed here by GLib)
 * and the fit's quality, and shows its picture. */
static void
test_data_surface_record (void)
{
  g_autofree char *proj = g_build_filename (DF_EXAMPLES_DIR, "panel-scan.dfproj", NULL);
  g_autofree char *data_path = g_build_filename (DF_EXAMPLES_DIR, "panel-scan.csv", NULL);
  g_autofree char *pdf = g_build_filename (tmp_dir, "panel.pdf", NULL);
  const char *argv[] = { DF_CLI_PATH, "report", "--project", proj, "--pdf", pdf, NULL };
  g_auto (run_result) r = { 0 };
  g_autofree char *text = NULL;
  g_autofree char *data = NULL;
  g_autofree char *sum = NULL;
  gsize len;

  if (!have_poppler ())
    return;
  run (&r, argv);
  g_assert_cmpint (r.status, ==, 0);
  text = pdf_text (pdf);
  g_assert_true (g_file_get_contents (data_path, &data, &len, NULL));
  sum = g_compute_checksum_for_data (G_CHECKSUM_SHA256, (const guchar *) data, len);
  g_assert_nonnull (strstr (text, "panel-scan.csv"));
  g_assert_nonnull (strstr (text, sum));
  g_assert_nonnull (strstr (text, "RMS distance"));
  g_assert_nonnull (strstr (text, "Centre ply"));
}

int
main (int argc, char **argv)
{
  int status;

  df_core_init ();
  g_test_init (&argc, &argv, G_TEST_OPTION_ISOLATE_DIRS, NULL);
  tmp_dir = g_dir_make_tmp ("df-report-XXXXXX", NULL);
  g_assert_nonnull (tmp_dir);
  g_test_add_func ("/report/sphere-record", test_sphere_record);
  g_test_add_func ("/report/picture-pixels", test_picture_pixels);
  g_test_add_func ("/report/letter-and-bad-paper", test_letter_and_bad_paper);
  g_test_add_func ("/report/unmeasured-loop-listed", test_unmeasured_loop_listed);
  g_test_add_func ("/report/record-round-trip", test_record_round_trip);
  g_test_add_func ("/report/extras-round-trip", test_extras_round_trip);
  g_test_add_func ("/report/extras-bad", test_extras_bad);
  g_test_add_func ("/report/extras-in-record", test_extras_in_record);
  g_test_add_func ("/report/demo-verdicts", test_demo_verdicts);
  g_test_add_func ("/report/data-surface-record", test_data_surface_record);
  status = g_test_run ();
  {
    g_autoptr (GDir) dir = g_dir_open (tmp_dir, 0, NULL);
    const char *name;

    while (dir != NULL && (name = g_dir_read_name (dir)) != NULL)
      {
        g_autofree char *path = g_build_filename (tmp_dir, name, NULL);

        g_unlink (path);
      }
  }
  g_rmdir (tmp_dir);
  g_free (tmp_dir);
  return status;
}
