/* main.c: entry point of the desktop app `driftframe`: initialises the core and runs
 * DfApplication. All behaviour lives in df-application.c and the window files. */
#include <malloc.h>
#include <gtk/gtk.h>

#include "df-application.h"
#include "df-glib.h"

int
main (int   argc,
      char *argv[])
{
  g_autoptr(DfApplication) app = NULL;
  gboolean one_shot = FALSE;

  /* Keep freed blocks in the process: glibc returns large ones to the system at each free, and
   * a fresh page costs more here than the work done on it (a loop of 10 000 points allocates a
   * few megabytes per measurement). */
  mallopt (M_MMAP_THRESHOLD, 64 << 20);
  mallopt (M_TRIM_THRESHOLD, 128 << 20);
  df_core_init ();

  /* Runs that export, benchmark or report and then quit must not hand their work to an already
   * running instance (a unique GApplication forwards the command line to it). */
  for (int i = 1; i < argc; i++)
    if (g_str_has_prefix (argv[i], "--export-") || g_str_has_prefix (argv[i], "--bench-")
        || g_str_has_prefix (argv[i], "--report-"))
      one_shot = TRUE;

  app = df_application_new (one_shot);
  return g_application_run (G_APPLICATION (app), argc, argv);
}
