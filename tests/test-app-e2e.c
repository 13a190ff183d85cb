/* test-app-e2e.c: end-to-end tests of the desktop app `driftframe`, driven from outside as a
 * user would: a private Xvfb server, the app binary, xdotool for the mouse and keys. A loop
 * sketched round a sphere's pole against Gauss-Bonnet, the exported PNG and PDF, kill -9 and
 * restore, a surface replaced with its loops carried, typed probe and geodesic, a failing job
 * that leaves the window, data imported. Skips (with the reason) when Xvfb or xdotool is
 * missing. The decisions' tests are in test-app-decide.c. */
#include <gdk-pixbuf/gdk-pixbuf.h>
#include <gio/gio.h>
#include <json-glib/json-glib.h>
#include <glib/gstdio.h>
#include <math.h>
#include <signal.h>
#include <stdarg.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#ifdef __linux__
#include <signal.h>
#include <sys/prctl.h>
#endif

#include "df-glib.h"
#include "df-test.h"
#include "df-test-app.h"

/* Never lose work: a sketched loop is autosaved within seconds; after kill -9 the next start
 * offers it back, and the restored loop measures exactly as before (same points, same core).
 * A clean exit (discarding the changes) removes the autosave. */
static void
test_kill_restore (void)
{
  Xserver x;
  g_autoptr(GSubprocessLauncher) launcher = NULL;
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GSubprocess) again = NULL;
  g_autoptr(GError) error = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_autoptr(GDataInputStream) out2 = NULL;
  g_auto(GStrv) geometry = NULL;
  g_autofree char *measured = NULL;
  g_autofree char *autosaved = NULL;
  g_autofree char *offered = NULL;
  g_autofree char *restored = NULL;
  g_autofree char *measured2 = NULL;
  double hol1, enc1, hol2, enc2;

  if (!xserver_start (&x))
    return;
  g_assert_cmpuint (count_autosaves (), ==, 0);

  launcher = app_launcher (&x);
  app = g_subprocess_launcher_spawn (launcher, &error, DF_APP_PATH, "--preset", "sphere",
                                     "--tool", "sketch", "--view", "top",
                                     "--report-view-geometry", "--report-events", NULL);
  g_assert_no_error (error);
  out = g_data_input_stream_new (g_subprocess_get_stdout_pipe (app));
  geometry = read_view_geometry (out);
  drag_circle (&x, geometry, atoi (geometry[5]) / 5, 60);
  measured = read_until (out, "loop-measured Loop_1 ");
  g_assert_nonnull (measured);
  parse_measured (measured, &hol1, &enc1);
  autosaved = read_until (out, "autosaved ");
  g_assert_nonnull (autosaved);
  g_assert_true (g_file_test (autosaved + strlen ("autosaved "), G_FILE_TEST_IS_REGULAR));
  g_subprocess_send_signal (app, SIGKILL);
  g_subprocess_wait (app, NULL, NULL);
  g_assert_cmpuint (count_autosaves (), ==, 1);

  again = g_subprocess_launcher_spawn (launcher, &error, DF_APP_PATH, "--report-events", NULL);
  g_assert_no_error (error);
  out2 = g_data_input_stream_new (g_subprocess_get_stdout_pipe (again));
  offered = read_until (out2, "restore-offered ");
  g_assert_nonnull (offered);
  answer_dialog (&x, "Restore unsaved work", "Return");
  restored = read_until (out2, "restored ");
  g_assert_nonnull (restored);
  measured2 = read_until (out2, "loop-measured Loop_1 ");
  g_assert_nonnull (measured2);
  parse_measured (measured2, &hol2, &enc2);
  /* The project file stores the points bit for bit and the measurement is deterministic, so
   * the numbers agree to rounding (common practice, no source). */
  df_assert_close (hol2, hol1, 1e-12, 1e-15);
  df_assert_close (enc2, enc1, 1e-12, 1e-15);
  /* A loop round the north pole encloses positive curvature (Gauss-Bonnet on the sphere, do
   * Carmo sec. 4-5, from memory): the restored loop is the sketched one, not an empty one. */
  g_assert_cmpfloat (hol2, >, 0.05);

  /* Quit, discarding the changes: a clean exit leaves no autosave behind. */
  xdotool_va (&x, "key", "ctrl+q", NULL);
  answer_dialog (&x, "Unsaved changes", "alt+d");
  g_assert_true (app_wait (again));
  xserver_stop (&x);
  g_assert_cmpuint (count_autosaves (), ==, 0);
}

/* Sketch a loop around the north pole of the sphere preset, seen from above, through the
 * app's own pointer handling, and export its measurement through the app's export actions. */
static void
test_sketch_pole_loop (void)
{
  Xserver x;
  g_autoptr(GSubprocessLauncher) launcher = NULL;
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GError) error = NULL;
  g_autofree char *dir = g_dir_make_tmp ("df-e2e-XXXXXX", NULL);
  g_autofree char *samples = g_build_filename (dir, "samples.csv", NULL);
  g_autofree char *summary = g_build_filename (dir, "summary.csv", NULL);
  g_autofree char *geometry = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_auto(GStrv) parts = NULL;
  g_autoptr(GPtrArray) xdo = g_ptr_array_new_with_free_func (g_free);
  g_autoptr(GSubprocess) driver = NULL;
  g_autoptr(GPtrArray) rows = NULL;
  g_auto(GStrv) header = NULL;
  int cx, cy, radius, n_steps = 90;
  double theta_sum = 0, theta_min = G_MAXDOUBLE, theta_max = -G_MAXDOUBLE, theta_mean;
  double holonomy, enclosed;
  int ix, iy, iz, ih, ie;

  if (!xserver_start (&x))
    return;

  launcher = app_launcher (&x);
  app = g_subprocess_launcher_spawn (launcher, &error, DF_APP_PATH, "--preset", "sphere",
                                     "--tool", "sketch", "--view", "top",
                                     "--report-view-geometry", "--export-samples", samples,
                                     "--export-summary", summary, NULL);
  g_assert_no_error (error);

  /* "view-geometry XID X Y WIDTH HEIGHT": the view inside the app's X window. */
  out = g_data_input_stream_new (g_subprocess_get_stdout_pipe (app));
  geometry = read_until (out, "view-geometry ");
  g_assert_nonnull (geometry);
  parts = g_strsplit (geometry, " ", -1);
  g_assert_cmpuint (g_strv_length (parts), ==, 6);
  cx = atoi (parts[2]) + atoi (parts[4]) / 2;
  cy = atoi (parts[3]) + atoi (parts[5]) / 2;
  /* Top view, fitted: the pole is at the view's centre and the sphere fills most of the
   * smaller side; a fifth of the height keeps the loop well inside the upper hemisphere. */
  radius = atoi (parts[5]) / 5;
  g_assert_cmpint (radius, >, 20);

  /* One xdotool run: press, a counter-clockwise circle (screen y points down), release. */
  g_ptr_array_add (xdo, g_strdup ("xdotool"));
  g_ptr_array_add (xdo, g_strdup ("sleep"));
  g_ptr_array_add (xdo, g_strdup ("1"));
  for (int k = 0; k <= n_steps; k++)
    {
      double a = 2 * G_PI * k / n_steps;

      g_ptr_array_add (xdo, g_strdup ("mousemove"));
      g_ptr_array_add (xdo, g_strdup ("--window"));
      g_ptr_array_add (xdo, g_strdup (parts[1]));
      g_ptr_array_add (xdo, g_strdup_printf ("%d", cx + (int) lround (radius * cos (a))));
      g_ptr_array_add (xdo, g_strdup_printf ("%d", cy - (int) lround (radius * sin (a))));
      if (k == 0)
        {
          g_ptr_array_add (xdo, g_strdup ("mousedown"));
          g_ptr_array_add (xdo, g_strdup ("1"));
        }
      g_ptr_array_add (xdo, g_strdup ("sleep"));
      g_ptr_array_add (xdo, g_strdup ("0.03"));
    }
  g_ptr_array_add (xdo, g_strdup ("mouseup"));
  g_ptr_array_add (xdo, g_strdup ("1"));
  g_ptr_array_add (xdo, NULL);
  {
    g_autoptr(GSubprocessLauncher) xl = g_subprocess_launcher_new (G_SUBPROCESS_FLAGS_NONE);

    g_subprocess_launcher_setenv (xl, "DISPLAY", x.display, TRUE);
    driver = g_subprocess_launcher_spawnv (xl, (const char *const *) xdo->pdata, &error);
    g_assert_no_error (error);
    g_assert_true (g_subprocess_wait_check (driver, NULL, &error));
    g_assert_no_error (error);
  }

  /* The app quits by itself once the loop is measured and both files are written. */
  g_assert_true (app_wait (app));
  xserver_stop (&x);
  g_assert_true (g_file_test (samples, G_FILE_TEST_IS_REGULAR));
  g_assert_true (g_file_test (summary, G_FILE_TEST_IS_REGULAR));

  /* Mean polar angle of the exported sample points (sphere centred at the origin). */
  rows = read_csv (samples, &header);
  ix = column_of (header, "x_mm");
  iy = column_of (header, "y_mm");
  iz = column_of (header, "z_mm");
  g_assert_cmpuint (rows->len, >=, 8);
  for (guint i = 0; i < rows->len; i++)
    {
      double px = field (rows, i, ix), py = field (rows, i, iy), pz = field (rows, i, iz);
      double theta = acos (pz / sqrt (px * px + py * py + pz * pz));

      theta_sum += theta;
      theta_min = MIN (theta_min, theta);
      theta_max = MAX (theta_max, theta);
    }
  theta_mean = theta_sum / rows->len;
  /* The sketch must be close to a latitude circle for the formula below to apply: a hand (or
   * xdotool) circle in the top view keeps the polar angle within a few hundredths of a radian
   * (common practice, no source). */
  g_assert_cmpfloat (theta_max - theta_min, <, 0.05);
  g_assert_cmpfloat (theta_mean, >, 0.1);
  g_assert_cmpfloat (theta_mean, <, 1.0);
  g_clear_pointer (&rows, g_ptr_array_unref);
  g_clear_pointer (&header, g_strfreev);

  rows = read_csv (summary, &header);
  g_assert_cmpuint (rows->len, ==, 1);
  ih = column_of (header, "holonomy_rad");
  ie = column_of (header, "enclosed_curvature_rad");
  holonomy = field (rows, 0, ih);
  enclosed = field (rows, 0, ie);

  /* A loop bounding a disc turns a carried vector by the enclosed total curvature
   * (Gauss-Bonnet; do Carmo, Differential Geometry of Curves and Surfaces, sec. 4-5, from
   * memory). The core computes the two independently (transport vs. Green's theorem), so they
   * agree to the integration tolerance for whatever shape was sketched. */
  df_assert_close (holonomy, enclosed, 1e-6, 1e-8);
  /* Counter-clockwise seen from above is counter-clockwise about the outward N at the north
   * pole, so the cap lies on the left and the holonomy is positive. */
  g_assert_cmpfloat (holonomy, >, 0.0);
  /* Latitude circle at polar angle theta on a sphere encloses K dA = 2 pi (1 - cos theta):
   * Gauss-Bonnet, do Carmo sec. 4-5 (from memory). The sketch is only nearly a circle, so the
   * comparison uses its mean polar angle and a 2 % tolerance. */
  df_assert_close (holonomy, 2 * G_PI * (1 - cos (theta_mean)), 0.02, 0.0);

  g_remove (samples);
  g_remove (summary);
  g_rmdir (dir);
}

/* Writes a project: the sphere preset with R = 120 and one latitude loop at polar angle 0.6 rad in a colour
 * found nowhere else on screen. */
static void
write_sphere_project (const char *path,
                      gboolean    frames)
{
  g_autoptr(GError) error = NULL;
  df_surface_spec *spec = df_surface_spec_new_preset ("sphere", &error);
  g_autoptr(df_project) project = NULL;
  double uv[48][2];

  g_assert_no_error (error);
  g_assert_true (df_surface_spec_set_param (spec, "R", "120", &error));
  g_assert_no_error (error);
  project = df_project_new (spec);
  for (int i = 0; i < 48; i++)
    {
      uv[i][0] = 0.6;
      uv[i][1] = -G_PI + 2 * G_PI * i / 48;
    }
  df_project_add_loop (project, "Marker loop", "#ff00ff", frames, (const double (*)[2]) uv, 48);
  g_assert_true (df_project_save (project, path, &error));
  g_assert_no_error (error);
}

static GdkPixbuf *
export_png (Xserver    *x,
            const char *project,
            const char *png)
{
  g_autoptr(GSubprocessLauncher) launcher = app_launcher (x);
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GError) error = NULL;
  GdkPixbuf *pixbuf;

  app = g_subprocess_launcher_spawn (launcher, &error, DF_APP_PATH, project, "--view", "top",
                                     "--colouring", "plain", "--export-png", png, NULL);
  g_assert_no_error (error);
  g_assert_true (app_wait (app));
  pixbuf = load_png (png);
  g_assert_cmpint (gdk_pixbuf_get_n_channels (pixbuf), >=, 3);
  return pixbuf;
}

static const guchar *
pixel (GdkPixbuf *pixbuf,
       int        x,
       int        y)
{
  return gdk_pixbuf_read_pixels (pixbuf) + (gsize) y * gdk_pixbuf_get_rowstride (pixbuf)
         + (gsize) x * gdk_pixbuf_get_n_channels (pixbuf);
}

static int
colour_distance (const guchar *a,
                 const guchar *b)
{
  return abs (a[0] - b[0]) + abs (a[1] - b[1]) + abs (a[2] - b[2]);
}

/* The exported view shows the surface, the loop in its colour and its frames. */
static void
test_screenshot (void)
{
  Xserver x;
  g_autofree char *dir = g_dir_make_tmp ("df-e2e-XXXXXX", NULL);
  g_autofree char *with = g_build_filename (dir, "with-frames.dfproj", NULL);
  g_autofree char *without = g_build_filename (dir, "without-frames.dfproj", NULL);
  g_autofree char *png_with = g_build_filename (dir, "with.png", NULL);
  g_autofree char *png_without = g_build_filename (dir, "without.png", NULL);
  g_autoptr(GdkPixbuf) a = NULL;
  g_autoptr(GdkPixbuf) b = NULL;
  const guchar *background;
  int w, h, centre_total = 0, centre_surface = 0, loop_pixels = 0, frame_pixels = 0;

  if (!xserver_start (&x))
    return;
  write_sphere_project (with, TRUE);
  write_sphere_project (without, FALSE);
  a = export_png (&x, with, png_with);
  b = export_png (&x, without, png_without);
  xserver_stop (&x);

  w = gdk_pixbuf_get_width (a);
  h = gdk_pixbuf_get_height (a);
  g_assert_cmpint (w, >, 100);
  g_assert_cmpint (h, >, 100);
  g_assert_cmpint (gdk_pixbuf_get_width (b), ==, w);
  g_assert_cmpint (gdk_pixbuf_get_height (b), ==, h);

  /* Thresholds on 8-bit RGB sums: a rendering difference of 40 is far above antialiasing
   * noise of a deterministic software render (common practice, no source). */
  background = pixel (a, 2, 2);
  for (int y = 0; y < h; y++)
    for (int xx = 0; xx < w; xx++)
      {
        const guchar *p = pixel (a, xx, y);
        const guchar *q = pixel (b, xx, y);

        /* The central tenth of the view lies on the sphere, seen from above. */
        if (abs (xx - w / 2) < w / 20 && abs (y - h / 2) < h / 20)
          {
            centre_total++;
            centre_surface += colour_distance (p, background) > 40;
          }
        /* Magenta: strong red and blue, little green. */
        loop_pixels += p[0] > 170 && p[2] > 170 && p[1] < 110;
        frame_pixels += colour_distance (p, q) > 40;
      }
  g_test_message ("centre %d/%d surface pixels, %d loop pixels, %d pixels differ with frames",
                  centre_surface, centre_total, loop_pixels, frame_pixels);
  g_assert_cmpint (centre_surface, >, centre_total * 9 / 10);
  g_assert_cmpint (loop_pixels, >, 100);
  g_assert_cmpint (frame_pixels, >, 200);

  g_remove (with);
  g_remove (without);
  g_remove (png_with);
  g_remove (png_without);
  g_rmdir (dir);
}

/* The design record from the app: the demo project's PDF (the view as its picture, the title
 * block from the project's [record] group, every loop named) and the PNG with its legend (both
 * ends of the curvature scale drawn on a light backdrop in the bottom-left corner) and caption.
 * Read back with poppler-utils; skipped without them. */
static void
test_record_exports (void)
{
  Xserver x;
  g_autofree char *dir = g_dir_make_tmp ("df-e2e-XXXXXX", NULL);
  g_autofree char *pdf = g_build_filename (dir, "record.pdf", NULL);
  g_autofree char *png = g_build_filename (dir, "view.png", NULL);
  g_autofree char *pdftotext = g_find_program_in_path ("pdftotext");
  g_autofree char *demo = g_build_filename (DF_EXAMPLES_DIR, "demo.dfproj", NULL);
  g_autoptr(GSubprocessLauncher) launcher = NULL;
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GError) error = NULL;
  g_autoptr(GdkPixbuf) pb = NULL;
  g_autofree char *text = NULL;
  /* df-colour-ramp.c's end stops in 8-bit sRGB. */
  const guchar blue[3] = { 41, 89, 173 }, orange[3] = { 217, 107, 25 };
  int w, h, near_blue = 0, near_orange = 0;

  if (pdftotext == NULL)
    {
      g_test_skip ("needs pdftotext (Debian: apt install poppler-utils)");
      return;
    }
  if (!xserver_start (&x))
    return;
  launcher = app_launcher (&x);
  app = g_subprocess_launcher_spawn (launcher, &error, DF_APP_PATH, demo, "--colouring",
                                     "gaussian", "--export-report", pdf, "--export-png", png,
                                     NULL);
  g_assert_no_error (error);
  g_assert_true (app_wait (app));
  xserver_stop (&x);

  {
    const char *argv[] = { pdftotext, "-layout", pdf, "-", NULL };
    int status = 0;

    g_assert_true (g_spawn_sync (NULL, (char **) argv, NULL, G_SPAWN_STDERR_TO_DEV_NULL, NULL,
                                 NULL, &text, NULL, &status, &error));
    g_assert_no_error (error);
    g_assert_true (g_spawn_check_wait_status (status, NULL));
  }
  g_assert_nonnull (strstr (text, "Lamp-shade mould, three plies"));
  g_assert_nonnull (strstr (text, "LS-220-01"));
  g_assert_nonnull (strstr (text, "Rim band"));
  g_assert_nonnull (strstr (text, "Belly patch"));
  g_assert_nonnull (strstr (text, "Top seam ply"));
  g_assert_nonnull (strstr (text, "SHA-256"));
  g_assert_nonnull (strstr (text, "not a material or structural assessment"));

  pb = load_png (png);
  w = gdk_pixbuf_get_width (pb);
  h = gdk_pixbuf_get_height (pb);
  for (int y = h * 3 / 4; y < h; y++)
    for (int xx = 0; xx < w / 2; xx++)
      {
        const guchar *p = pixel (pb, xx, y);

        near_blue += colour_distance (p, blue) < 40;
        near_orange += colour_distance (p, orange) < 40;
      }
  g_test_message ("legend corner: %d blue-end, %d orange-end pixels", near_blue, near_orange);
  /* The bar is some 400 x 14 pixels: each end stop covers dozens of pixels. */
  g_assert_cmpint (near_blue, >, 30);
  g_assert_cmpint (near_orange, >, 30);

  g_remove (pdf);
  g_remove (png);
  g_rmdir (dir);
}

/* Writes a horizontal plane z = height over a square of half-width 200 as a .surface file. */
static void
write_plane_surface (const char *path,
                     double      height)
{
  char z[G_ASCII_DTOSTR_BUF_SIZE];
  g_autofree char *text = NULL;
  g_autoptr(GError) error = NULL;

  g_ascii_dtostr (z, sizeof z, height);
  text = g_strdup_printf ("[surface]\nkind=graph\nz=%s\nx-min=-200\nx-max=200\n"
                          "y-min=-200\ny-max=200\n", z);
  g_file_set_contents (path, text, -1, &error);
  g_assert_no_error (error);
}

/* Gives the open project another surface through the Replace Surface dialog, typing the path
 * as a user would (a leading "/" opens the location entry). */
static void
replace_surface (Xserver    *x,
                 const char *path)
{
  focus_main (x);
  xdotool_va (x, "key", "ctrl+r", NULL);
  xdotool_va (x, "search", "--sync", "--onlyvisible", "--name", "Replace Surface", "windowfocus", "sleep", "1",
              "type", "--delay", "20", path, NULL);
  xdotool_va (x, "sleep", "0.5", "key", "Return", NULL);
}

/* Replacing the surface carries loops by their places in space: a latitude loop of the
 * sphere lies in the plane at its height, so it is placed there (and measured as a plane loop,
 * not its (t, phi) read as (x, y)); a plane far away leaves it marked as off the surface, and
 * the project still saves in a form the CLI's reader accepts. Undo brings the sphere and the
 * loop's own numbers back. */
static void
test_replace_surface (void)
{
  Xserver x;
  g_autofree char *dir = g_dir_make_tmp ("df-e2e-XXXXXX", NULL);
  g_autofree char *project_path = g_build_filename (dir, "sphere.dfproj", NULL);
  g_autofree char *near_path = g_build_filename (dir, "near-plane.surface", NULL);
  g_autofree char *far_path = g_build_filename (dir, "far-plane.surface", NULL);
  g_autoptr(GSubprocessLauncher) launcher = NULL;
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GError) error = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_autoptr(df_project) saved = NULL;
  double hol0, enc0, hol, enc, rho = 120 * sin (0.6);
  char *line;

  if (!xserver_start (&x))
    return;
  write_sphere_project (project_path, FALSE);
  /* The project's sphere has R = 120: the loop at polar angle 0.6 is the circle of radius
   * 120 sin 0.6 at height 120 cos 0.6. */
  write_plane_surface (near_path, 120 * cos (0.6));
  write_plane_surface (far_path, 0.0);

  launcher = app_launcher (&x);
  app = g_subprocess_launcher_spawn (launcher, &error, DF_APP_PATH, project_path,
                                     "--report-view-geometry", "--report-events", NULL);
  g_assert_no_error (error);
  out = g_data_input_stream_new (g_subprocess_get_stdout_pipe (app));
  line = read_until (out, "loop-measured Marker_loop ");
  g_assert_nonnull (line);
  parse_measured (line, &hol0, &enc0);
  g_free (line);
  /* Latitude circle at polar angle 0.6: 2 pi (1 - cos 0.6) (Gauss-Bonnet, do Carmo sec. 4-5,
   * from memory). */
  df_assert_close (hol0, 2 * G_PI * (1 - cos (0.6)), 1e-6, 1e-9);

  replace_surface (&x, near_path);
  line = read_until (out, "loop-measured Marker_loop ");
  g_assert_nonnull (line);
  parse_measured (line, &hol, &enc);
  g_free (line);
  /* A closed loop in a plane carries a direction back unturned (K = 0); read as chart numbers
   * the old (0.6, phi) would have been a degenerate sliver near the origin instead. */
  g_assert_cmpfloat (fabs (hol), <, 1e-6);
  g_assert_cmpfloat (fabs (enc), <, 1e-9);

  focus_main (&x);
  xdotool_va (&x, "key", "ctrl+z", NULL);
  line = read_until (out, "loop-measured Marker_loop ");
  g_assert_nonnull (line);
  parse_measured (line, &hol, &enc);
  g_free (line);
  df_assert_close (hol, hol0, 1e-12, 1e-15);

  replace_surface (&x, far_path);
  line = read_until (out, "loop-failed Marker_loop off the new surface");
  g_assert_nonnull (line);
  g_free (line);

  /* Saved with the loop off the surface: the file still reads (the CLI's reader), and the
   * points kept are the closest ones on the plane, the loop's circle seen from above. */
  focus_main (&x);
  xdotool_va (&x, "key", "ctrl+s", NULL);
  line = read_until (out, "saved ");
  g_assert_nonnull (line);
  g_free (line);
  saved = df_project_load (project_path, &error);
  g_assert_no_error (error);
  g_assert_cmpuint (saved->loops->len, ==, 1);
  g_assert_cmpint (saved->spec->kind, ==, DF_SURFACE_GRAPH);
  {
    df_project_loop *loop = g_ptr_array_index (saved->loops, 0);

    for (gsize i = 0; i < loop->n; i++)
      df_assert_close (hypot (loop->uv[i][0], loop->uv[i][1]), rho, 1e-6, 1e-6);
  }

  /* Undo restores the sphere, and the loop measures as it did at first. */
  focus_main (&x);
  xdotool_va (&x, "key", "ctrl+z", NULL);
  line = read_until (out, "loop-measured Marker_loop ");
  g_assert_nonnull (line);
  parse_measured (line, &hol, &enc);
  g_free (line);
  df_assert_close (hol, hol0, 1e-12, 1e-15);

  focus_main (&x);
  xdotool_va (&x, "key", "ctrl+q", NULL);
  answer_dialog (&x, "Unsaved changes", "alt+d");
  g_assert_true (app_wait (app));
  xserver_stop (&x);
  g_remove (project_path);
  g_remove (near_path);
  g_remove (far_path);
  g_rmdir (dir);
}

/* Typed values instead of the mouse: a geodesic from a typed start, heading and length, and a
 * probe at a typed chart point and at a typed point in space, on the sphere preset (R = 100,
 * src/core/df-presets.c; chart t = polar angle, phi = longitude). */
static void
test_typed_probe_geodesic (void)
{
  Xserver x;
  g_autoptr(GSubprocessLauncher) launcher = NULL;
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GError) error = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_autofree char *line = NULL;
  g_autofree char *space = NULL;
  double end[3], probed[3], R = 100;

  if (!xserver_start (&x))
    return;
  launcher = app_launcher (&x);
  app = g_subprocess_launcher_spawn (launcher, &error, DF_APP_PATH, "--preset", "sphere",
                                     "--tool", "geodesic", "--report-view-geometry",
                                     "--report-events", NULL);
  g_assert_no_error (error);
  out = g_data_input_stream_new (g_subprocess_get_stdout_pipe (app));
  g_strfreev (read_view_geometry (out));

  /* Heading 0 is along +t: down the meridian, a great circle, so after a length L the polar
   * angle grew by L / R and the longitude is unchanged (geodesics of a sphere are its great
   * circles: do Carmo sec. 4-4, from memory). */
  focus_main (&x);
  xdotool_va (&x, "key", "ctrl+t", NULL);
  type_field (&x, "0.6, 0");
  xdotool_va (&x, "key", "Tab", NULL);
  type_field (&x, "0");
  xdotool_va (&x, "key", "Tab", NULL);
  type_field (&x, "50");
  xdotool_va (&x, "key", "Return", NULL);
  line = read_until (out, "geodesic-end ");
  g_assert_nonnull (line);
  parse_three (line, end);
  df_assert_close (end[2], 50, 1e-9, 1e-9);
  df_assert_close (end[0], 0.6 + 50 / R, 1e-6, 1e-8);
  g_assert_cmpfloat (fabs (end[1]), <, 1e-8);
  g_clear_pointer (&line, g_free);

  /* Heading 90 degrees: along the parallel, leaving along the great circle through the start
   * perpendicular to the meridian, P(s) = cos(s/R) P0 + sin(s/R) E with E horizontal, so
   * cos t(s) = cos t0 cos(s/R) (spherical trigonometry, from memory). With N outward (the
   * preset's orientation), anticlockwise from +t is towards +phi. */
  xdotool_va (&x, "key", "ctrl+t", NULL);
  type_field (&x, "0.6, 0");
  xdotool_va (&x, "key", "Tab", NULL);
  type_field (&x, "90");
  xdotool_va (&x, "key", "Tab", NULL);
  type_field (&x, "50");
  xdotool_va (&x, "key", "Return", NULL);
  line = read_until (out, "geodesic-end ");
  g_assert_nonnull (line);
  parse_three (line, end);
  df_assert_close (cos (end[0]), cos (0.6) * cos (50 / R), 1e-6, 1e-8);
  g_assert_cmpfloat (end[1], >, 0.1);
  g_clear_pointer (&line, g_free);

  /* Probe at a typed chart point (phi in degrees) and at a point in space 2 % outside the
   * sphere, placed at its closest surface point; K = 1/R^2 on a sphere (Gauss, do Carmo
   * sec. 3-3, from memory). */
  xdotool_va (&x, "key", "ctrl+3", "sleep", "0.5", "key", "ctrl+t", NULL);
  type_field (&x, "0.6, 45");
  xdotool_va (&x, "key", "Return", NULL);
  line = read_until (out, "probed ");
  g_assert_nonnull (line);
  parse_three (line, probed);
  df_assert_close (probed[0], 0.6, 1e-12, 1e-12);
  df_assert_close (probed[1], G_PI / 4, 1e-12, 1e-12);
  df_assert_close (probed[2], 1 / (R * R), 1e-8, 0);
  g_clear_pointer (&line, g_free);

  space = g_strdup_printf ("%.9f, 0, %.9f", 1.02 * R * sin (0.6), 1.02 * R * cos (0.6));
  xdotool_va (&x, "key", "ctrl+t", NULL);
  type_field (&x, space);
  xdotool_va (&x, "key", "Return", NULL);
  line = read_until (out, "probed ");
  g_assert_nonnull (line);
  parse_three (line, probed);
  df_assert_close (probed[0], 0.6, 1e-6, 1e-8);
  g_assert_cmpfloat (fabs (remainder (probed[1], 2 * G_PI)), <, 1e-6);
  df_assert_close (probed[2], 1 / (R * R), 1e-8, 0);

  g_subprocess_force_exit (app);
  g_subprocess_wait (app, NULL, NULL);
  xserver_stop (&x);
}


/* Surfaces from data: a height grid sampled from the paraboloid z = a (x^2 + y^2) is fitted
 * over the project's formula paraboloid (--import-data, as a user's "From measured data"), its
 * fit numbers are reported, and the project's loop, carried to the fitted surface by its
 * places in space, measures as on the formula. A table with a bad cell, given through the
 * dialog, is refused naming its line, and the fitted surface stays: saving writes it with
 * the data file named relative to the project and its checksum, which the core's reader
 * accepts. */
static void
test_data_import (void)
{
  Xserver x;
  g_autofree char *dir = g_dir_make_tmp ("df-e2e-XXXXXX", NULL);
  g_autofree char *project_path = g_build_filename (dir, "bowl.dfproj", NULL);
  g_autofree char *csv_path = g_build_filename (dir, "bowl.csv", NULL);
  g_autofree char *bad_path = g_build_filename (dir, "bad.csv", NULL);
  g_autoptr(GSubprocessLauncher) launcher = NULL;
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GError) error = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_autoptr(df_project) saved = NULL;
  g_autoptr(GString) csv = g_string_new ("# bowl sampled on a 2 mm grid\nx,y,z\n");
  const double a = 0.004, rho = 30;
  double hol, enc, want;
  char *line;

  if (!xserver_start (&x))
    return;
  for (int i = 0; i <= 50; i++)
    for (int j = 0; j <= 50; j++)
      {
        double px = -50 + 2 * i, py = -50 + 2 * j;
        g_string_append_printf (csv, "%g,%g,%.12g\n", px, py, a * (px * px + py * py));
      }
  g_file_set_contents (csv_path, csv->str, -1, &error);
  g_assert_no_error (error);
  g_file_set_contents (bad_path, "x,y,z\n0,0,0\n1,0,0\n0,1,0\n1,1,zero\n", -1, &error);
  g_assert_no_error (error);
  {
    df_surface_spec *spec = df_surface_spec_new_graph ("0.004*(x^2+y^2)", "-50", "50", "-50",
                                                       "50");
    g_autoptr(df_project) project = df_project_new (spec);
    double uv[60][2];

    for (int i = 0; i < 60; i++)
      {
        uv[i][0] = rho * cos (2 * G_PI * i / 60);
        uv[i][1] = rho * sin (2 * G_PI * i / 60);
      }
    df_project_add_loop (project, "Bowl loop", "#ff00ff", FALSE, (const double (*)[2]) uv, 60);
    g_assert_true (df_project_save (project, project_path, &error));
    g_assert_no_error (error);
  }
  /* A circle of radius rho on z = a (x^2 + y^2) encloses K dA = 2 pi (1 - 1/sqrt(1 + 4 a^2
   * rho^2)): Gauss-Bonnet with the cap's geodesic curvature (do Carmo sec. 4-5, from memory);
   * the figure issue 8 names for this case. */
  want = 2 * G_PI * (1 - 1 / sqrt (1 + 4 * a * a * rho * rho));

  launcher = app_launcher (&x);
  app = g_subprocess_launcher_spawn (launcher, &error, DF_APP_PATH, project_path,
                                     "--import-data", csv_path, "--report-events", NULL);
  g_assert_no_error (error);
  out = g_data_input_stream_new (g_subprocess_get_stdout_pipe (app));
  /* The points and their deviations come first, then the fit's numbers. */
  line = read_until (out, "data-points ");
  g_assert_nonnull (line);
  g_assert_true (g_str_has_prefix (line, "data-points 2601 2601 "));
  g_free (line);
  line = read_until (out, "data-fitted ");
  g_assert_nonnull (line);
  {
    g_auto(GStrv) f = g_strsplit (line, " ", -1);
    double rms, max, mx, my, mz, tol;

    g_assert_cmpuint (g_strv_length (f), ==, 10);
    g_assert_cmpstr (f[1], ==, "bowl.csv");
    /* Every node of the 51 x 51 lattice the file has. */
    g_assert_cmpstr (f[2], ==, "2601");
    rms = g_ascii_strtod (f[3], NULL);
    max = g_ascii_strtod (f[4], NULL);
    mx = g_ascii_strtod (f[5], NULL);
    my = g_ascii_strtod (f[6], NULL);
    mz = g_ascii_strtod (f[7], NULL);
    tol = g_ascii_strtod (f[8], NULL);
    /* A quadratic is smooth data: the fit keeps within a micrometre of it (the quintic spline
     * reproduces polynomials of low degree; common practice, no source for the bound). */
    g_assert_cmpfloat (rms, <, 1e-3);
    g_assert_cmpfloat (max, <, 1e-3);
    g_assert_cmpfloat (rms, <=, max);
    /* The worst point is one of the file's: on the 2 mm lattice and on the paraboloid. */
    df_assert_close (fmod (mx + 50, 2), 0, 0, 1e-9);
    df_assert_close (fmod (my + 50, 2), 0, 0, 1e-9);
    df_assert_close (mz, a * (mx * mx + my * my), 0, 1e-9);
    /* No fit-tolerance given: chosen from the data. */
    g_assert_cmpstr (f[9], ==, "chosen");
    g_assert_cmpfloat (tol, >=, 0);
  }
  g_free (line);
  /* The loop measured on the fitted surface, carried from the formula by its points: the
   * fit's line comes once the document has taken the fit and started measuring again, so any
   * earlier measurement on the formula has been read past. */
  line = read_until (out, "loop-measured Bowl_loop ");
  g_assert_nonnull (line);
  parse_measured (line, &hol, &enc);
  g_free (line);
  df_assert_close (hol, want, 0, 1e-5);

  /* A bad table through the dialog: refused with its line, the fitted surface kept. */
  focus_main (&x);
  open_by_key (&x, "ctrl+shift+p", "Surface from Measured Data");
  xdotool_va (&x, "search", "--sync", "--onlyvisible", "--name", "Surface from Measured Data",
              "windowfocus", "sleep", "1", "type", "--delay", "20", bad_path, NULL);
  xdotool_va (&x, "sleep", "0.5", "key", "Return", NULL);
  line = read_until (out, "data-failed ");
  g_assert_nonnull (line);
  /* The reader's message names the file and the line of the bad cell (line 5). */
  g_assert_nonnull (strstr (line, "bad.csv:5"));
  g_free (line);

  focus_main (&x);
  xdotool_va (&x, "key", "ctrl+s", NULL);
  line = read_until (out, "saved ");
  g_assert_nonnull (line);
  g_free (line);
  saved = df_project_load (project_path, &error);
  g_assert_no_error (error);
  g_assert_cmpstr (saved->spec->data_key, ==, "heights");
  g_assert_cmpstr (saved->spec->data_path, ==, "bowl.csv");
  g_assert_nonnull (saved->spec->data_sha256);
  g_assert_cmpuint (saved->loops->len, ==, 1);

  focus_main (&x);
  xdotool_va (&x, "key", "ctrl+q", NULL);
  g_assert_true (app_wait (app));
  xserver_stop (&x);
  g_remove (project_path);
  g_remove (csv_path);
  g_remove (bad_path);
  g_rmdir (dir);
}

/* A job that fails must not take the window down: a cone of half-angle 90 degrees (a flat
 * disc whose slant range t-max = h / cos(alpha) is about 1.6e18) made the meshing thread crash
 * the whole app. The window reports the problem and then quits cleanly on Ctrl+Q. */
static void
test_failed_job_keeps_window (void)
{
  Xserver x;
  g_autofree char *dir = g_dir_make_tmp ("df-e2e-XXXXXX", NULL);
  g_autofree char *path = g_build_filename (dir, "flat-cone.surface", NULL);
  g_autoptr(GSubprocessLauncher) launcher = NULL;
  g_autoptr(GSubprocess) app = NULL;
  g_autoptr(GError) error = NULL;
  g_autoptr(GDataInputStream) out = NULL;
  g_autofree char *line = NULL;

  if (!xserver_start (&x))
    return;
  /* The cone preset's formulas (src/core/df-presets.c) at alpha_deg = 90. */
  g_file_set_contents (path, "[surface]\nkind=revolution\npreset=cone\n"
                             "r=t*sin(alpha_deg*pi/180)\nz=h - t*cos(alpha_deg*pi/180)\n"
                             "t-min=0\nt-max=h/cos(alpha_deg*pi/180)\n"
                             "[parameters]\nalpha_deg=90\nh=100\n", -1, &error);
  g_assert_no_error (error);
  launcher = app_launcher (&x);
  app = g_subprocess_launcher_spawn (launcher, &error, DF_APP_PATH, path, "--report-events",
                                     NULL);
  g_assert_no_error (error);
  out = g_data_input_stream_new (g_subprocess_get_stdout_pipe (app));
  /* Either the drawing fails and says so, or (once the surface checks refuse such a profile)
   * the file is refused with a message; never a crash. */
  line = read_until_either (out, "mesh-problem ", "open-failed ");
  g_assert_nonnull (line);
  if (g_str_has_prefix (line, "open-failed "))
    xdotool_va (&x, "sleep", "1", "key", "Return", NULL);
  /* Still there: it answers the keyboard and quits by itself, with status 0. */
  focus_main (&x);
  xdotool_va (&x, "key", "ctrl+q", NULL);
  g_assert_true (app_wait (app));
  g_assert_true (g_subprocess_get_if_exited (app));
  g_assert_cmpint (g_subprocess_get_exit_status (app), ==, 0);
  xserver_stop (&x);
  g_remove (path);
  g_rmdir (dir);
}

int
main (int   argc,
      char *argv[])
{
  app_test_init (&argc, &argv);

  g_test_add_func ("/app/e2e/sketch-pole-loop", test_sketch_pole_loop);
  g_test_add_func ("/app/e2e/screenshot", test_screenshot);
  g_test_add_func ("/app/e2e/record-exports", test_record_exports);
  g_test_add_func ("/app/e2e/kill-restore", test_kill_restore);
  g_test_add_func ("/app/e2e/replace-surface", test_replace_surface);
  g_test_add_func ("/app/e2e/typed-probe-geodesic", test_typed_probe_geodesic);
  g_test_add_func ("/app/e2e/failed-job-keeps-window", test_failed_job_keeps_window);
  g_test_add_func ("/app/e2e/data-import", test_data_import);
  return g_test_run ();
}
