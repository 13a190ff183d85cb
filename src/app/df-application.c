/* df-application.c: DfApplication: the command line (files, --demo, --preset, start tool and
 * view, one-shot exports, --bench-orbit), the application actions (quit, about, shortcuts)
 * with their accelerators, and the style sheet. Windows do the rest. */
#include "df-application.h"
#include "df-gl-renderer.h"
#include "df-glib.h"
#include "df-window.h"

struct _DfApplication
{
  GtkApplication parent_instance;
};

G_DEFINE_FINAL_TYPE (DfApplication, df_application, GTK_TYPE_APPLICATION)

static const GOptionEntry option_entries[] = {
  { "demo", 0, 0, G_OPTION_ARG_NONE, NULL,
    "Open the demo project (a lamp-shade mould with three plies)", NULL },
  { "preset", 0, 0, G_OPTION_ARG_STRING, NULL,
    "Start from a preset surface (sphere, torus, saddle, …)", "NAME" },
  { "tool", 0, 0, G_OPTION_ARG_STRING, NULL,
    "Start with a tool: look, sketch, probe, geodesic or paths", "TOOL" },
  { "view", 0, 0, G_OPTION_ARG_STRING, NULL,
    "Start with a standard view: iso, top, front or side", "VIEW" },
  { "colouring", 0, 0, G_OPTION_ARG_STRING, NULL,
    "Colour the surface by: plain, gaussian or mean", "WHAT" },
  { "units", 0, 0, G_OPTION_ARG_STRING, NULL,
    "Show lengths in UNIT (mm, cm, m or in) and Gaussian curvature per square of CURV (default "
    "UNIT), as if chosen in Display Units", "UNIT[,CURV]" },
  { "export-samples", 0, 0, G_OPTION_ARG_FILENAME, NULL,
    "Once the selected (or first) loop is measured, write its samples CSV and quit", "PATH" },
  { "export-summary", 0, 0, G_OPTION_ARG_FILENAME, NULL,
    "Once the loops are measured, write the loops summary CSV and quit", "PATH" },
  { "export-png", 0, 0, G_OPTION_ARG_FILENAME, NULL,
    "Once everything is drawn, save the view as PNG and quit", "PATH" },
  { "export-report", 0, 0, G_OPTION_ARG_FILENAME, NULL,
    "Once everything is drawn, write the PDF design record (the view as its picture) and quit",
    "PATH" },
  { "bench-orbit", 0, 0, G_OPTION_ARG_NONE, NULL,
    "Orbit the view once, print the median and 95th-percentile frame times and quit", NULL },
  { "bench-mesh", 0, 0, G_OPTION_ARG_NONE, NULL,
    "Build the display mesh of the surface (after --import-data: of the fitted one) a few "
    "times, print the times and quit", NULL },
  { "drape", 0, 0, G_OPTION_ARG_STRING, NULL,
    "Open the Woven-Ply Drape window and drape the loop named LOOP from the start U;V (phi in "
    "degrees on a surface of revolution), warp WARP degrees, cell CELL, as if typed",
    "LOOP;U;V;WARP;CELL" },
  { "bench-drape", 0, 0, G_OPTION_ARG_NONE, NULL,
    "Drag a drape's start pin across the first loop (or the one --drape names), print the "
    "drag-to-redraw times and quit", NULL },
  { "report-view-geometry", 0, 0, G_OPTION_ARG_NONE, NULL,
    "Print where the 3D view lies in the window (for test drivers)", NULL },
  { "import-data", 0, 0, G_OPTION_ARG_FILENAME, NULL,
    "Fit the surface to measured data or a mesh (CSV of r,z or x,y,z; STL, OBJ, PLY) once the "
    "window is open", "PATH" },
  { "report-events", 0, 0, G_OPTION_ARG_NONE, NULL,
    "Print loop measurements, autosaves and restores as they happen (for test drivers)",
    NULL },
  { "version", 0, 0, G_OPTION_ARG_NONE, NULL, "Print the version and quit", NULL },
  { G_OPTION_REMAINING, 0, 0, G_OPTION_ARG_FILENAME_ARRAY, NULL, NULL, NULL },
  { NULL }
};

static void
quit_activated (GSimpleAction *action,
                GVariant      *parameter,
                gpointer       user_data)
{
  GtkApplication *app = GTK_APPLICATION (user_data);
  GList *windows = gtk_application_get_windows (app);

  /* Close through each window's close request, so unsaved changes are asked about. */
  if (windows == NULL)
    g_application_quit (G_APPLICATION (app));
  for (GList *l = windows; l != NULL; l = l->next)
    gtk_window_close (GTK_WINDOW (l->data));
}

static void
about_activated (GSimpleAction *action,
                 GVariant      *parameter,
                 gpointer       user_data)
{
  GtkApplication *app = GTK_APPLICATION (user_data);
  static const char *authors[] = { "The driftframe authors", NULL };

  gtk_show_about_dialog (gtk_application_get_active_window (app),
                         "program-name", "driftframe",
                         "logo-icon-name", DF_APP_ID,
                         "version", DF_VERSION,
                         "comments", "How a doubly curved surface turns a direction carried "
                                     "across it: holonomy of loops, enclosed curvature, "
                                     "geodesics and path comparison, for layup, fibre "
                                     "steering, forming and membrane cutting.\n\n"
                                     "Geometric estimates only, not a material or structural "
                                     "assessment.",
                         "license-type", GTK_LICENSE_GPL_3_0,
                         "authors", authors,
                         "modal", TRUE,
                         NULL);
}

static void
shortcuts_activated (GSimpleAction *action,
                     GVariant      *parameter,
                     gpointer       user_data)
{
  GtkWindow *window = gtk_application_get_active_window (GTK_APPLICATION (user_data));

  /* GtkApplicationWindow provides win.show-help-overlay from gtk/help-overlay.ui. */
  if (window != NULL)
    gtk_widget_activate_action (GTK_WIDGET (window), "win.show-help-overlay", NULL);
}

static const GActionEntry app_entries[] = {
  { "quit", quit_activated, NULL, NULL, NULL, { 0 } },
  { "about", about_activated, NULL, NULL, NULL, { 0 } },
  { "shortcuts", shortcuts_activated, NULL, NULL, NULL, { 0 } },
};

static void
df_application_startup (GApplication *application)
{
  static const char *const quit_accels[] = { "<Control>q", NULL };
  static const char *const shortcuts_accels[] = { "<Control>question", NULL };
  g_autoptr(GtkCssProvider) css = gtk_css_provider_new ();

  G_APPLICATION_CLASS (df_application_parent_class)->startup (application);

  /* Before any window is realized: GTK reads GSK_RENDERER once. */
  {
    g_autofree char *gl = df_gl_renderer_choose (gdk_display_get_default ());

    g_debug ("OpenGL renderer: %s; GTK scene renderer: %s", gl != NULL ? gl : "none",
             g_getenv ("GSK_RENDERER") != NULL ? g_getenv ("GSK_RENDERER") : "GTK's default");
  }

  g_action_map_add_action_entries (G_ACTION_MAP (application), app_entries,
                                   G_N_ELEMENTS (app_entries), application);
  gtk_application_set_accels_for_action (GTK_APPLICATION (application), "app.quit",
                                         quit_accels);
  gtk_application_set_accels_for_action (GTK_APPLICATION (application), "app.shortcuts",
                                         shortcuts_accels);

  gtk_css_provider_load_from_resource (css, "/org/driftframe/Driftframe/ui/style.css");
  gtk_style_context_add_provider_for_display (gdk_display_get_default (),
                                              GTK_STYLE_PROVIDER (css),
                                              GTK_STYLE_PROVIDER_PRIORITY_APPLICATION);
}

static gboolean
open_window (DfApplication   *self,
             const DfStartup *startup)
{
  DfWindow *window = df_window_new (GTK_APPLICATION (self));

  if (!df_window_start (window, startup))
    {
      gtk_window_destroy (GTK_WINDOW (window));
      return FALSE;
    }
  gtk_window_present (GTK_WINDOW (window));
  return TRUE;
}

static void
df_application_activate (GApplication *application)
{
  GtkWindow *window = gtk_application_get_active_window (GTK_APPLICATION (application));
  DfStartup startup = { 0 };

  if (window != NULL)
    gtk_window_present (window);
  else
    open_window (DF_APPLICATION (application), &startup);
}

static int
df_application_command_line (GApplication            *application,
                             GApplicationCommandLine *command_line)
{
  GVariantDict *options = g_application_command_line_get_options_dict (command_line);
  g_auto(GStrv) files = NULL;
  DfStartup startup = { 0 };
  int status = 0;

  if (g_variant_dict_contains (options, "version"))
    {
      g_application_command_line_print (command_line, "driftframe %s\n", DF_VERSION);
      return 0;
    }
  g_variant_dict_lookup (options, G_OPTION_REMAINING, "^aay", &files);
  if (files != NULL && g_strv_length (files) > 1)
    {
      g_application_command_line_printerr (command_line,
                                           "driftframe: give at most one file to open\n");
      return 2;
    }
  if (files != NULL && files[0] != NULL)
    {
      g_autoptr(GFile) file = g_application_command_line_create_file_for_arg (command_line,
                                                                              files[0]);
      char *path = g_file_get_path (file);

      /* Measured data or a mesh on the command line are fitted, not opened as a project. */
      if (path != NULL && (g_str_has_suffix (path, ".csv") || g_str_has_suffix (path, ".stl")
                           || g_str_has_suffix (path, ".obj") || g_str_has_suffix (path, ".ply")
                           || g_str_has_suffix (path, ".STL")))
        startup.import_data = path;
      else
        startup.file = path;
    }
  startup.demo = g_variant_dict_contains (options, "demo");
  g_variant_dict_lookup (options, "preset", "s", &startup.preset);
  g_variant_dict_lookup (options, "tool", "s", &startup.tool);
  g_variant_dict_lookup (options, "view", "s", &startup.view);
  g_variant_dict_lookup (options, "colouring", "s", &startup.shading);
  g_variant_dict_lookup (options, "units", "s", &startup.units);
  g_variant_dict_lookup (options, "export-samples", "^ay", &startup.export_samples);
  g_variant_dict_lookup (options, "export-summary", "^ay", &startup.export_summary);
  g_variant_dict_lookup (options, "export-png", "^ay", &startup.export_png);
  g_variant_dict_lookup (options, "export-report", "^ay", &startup.export_report);
  if (startup.import_data == NULL
      && g_variant_dict_lookup (options, "import-data", "^ay", &startup.import_data)
      && !g_path_is_absolute (startup.import_data))
    {
      g_autoptr(GFile) file = g_application_command_line_create_file_for_arg (command_line,
                                                                              startup.import_data);
      g_free (startup.import_data);
      startup.import_data = g_file_get_path (file);
    }
  startup.bench_orbit = g_variant_dict_contains (options, "bench-orbit");
  startup.bench_mesh = g_variant_dict_contains (options, "bench-mesh");
  startup.report_view = g_variant_dict_contains (options, "report-view-geometry");
  startup.report_events = g_variant_dict_contains (options, "report-events");
  g_variant_dict_lookup (options, "drape", "s", &startup.drape);
  startup.bench_drape = g_variant_dict_contains (options, "bench-drape");

  if (startup.preset != NULL)
    {
      g_autoptr(GError) error = NULL;
      g_autoptr(df_surface_spec) spec = df_surface_spec_new_preset (startup.preset, &error);

      if (spec == NULL)
        {
          g_application_command_line_printerr (command_line, "driftframe: --preset: %s\n",
                                               error->message);
          status = 2;
        }
    }
  if (status == 0 && !open_window (DF_APPLICATION (application), &startup))
    status = 1;
  df_startup_clear (&startup);
  return status;
}

static void
df_application_class_init (DfApplicationClass *klass)
{
  GApplicationClass *app_class = G_APPLICATION_CLASS (klass);

  app_class->startup = df_application_startup;
  app_class->activate = df_application_activate;
  app_class->command_line = df_application_command_line;
}

static void
df_application_init (DfApplication *self)
{
  g_application_add_main_option_entries (G_APPLICATION (self), option_entries);
  g_application_set_option_context_parameter_string (G_APPLICATION (self),
                                                     "[FILE.dfproj|FILE.surface|DATA.csv|MESH.stl]");
  g_application_set_option_context_summary (G_APPLICATION (self),
                                            "Sketch loops on a curved surface and read how it "
                                            "turns a carried direction.");
}

DfApplication *
df_application_new (gboolean one_shot)
{
  GApplicationFlags flags = G_APPLICATION_HANDLES_COMMAND_LINE;

  if (one_shot)
    flags |= G_APPLICATION_NON_UNIQUE;
  return g_object_new (DF_TYPE_APPLICATION,
                       "application-id", DF_APP_ID,
                       "flags", flags,
                       NULL);
}
