/* df-cli-pdf-module.c: `report --pdf` through the PDF writer module (df-cli-report-pdf.c built
 * as driftframe-cli-pdf, on cairo and pango). Loading those libraries costs a process about
 * 5 ms, a fifth of a whole `measure` of a 10 000-point loop, so only this command loads them:
 * the module is looked for beside the running executable (the build tree) and then in the
 * install directory. CLI layer: computes nothing. */
#include "df-cli-report-pdf.h"

#include <gmodule.h>

#include "df-io-error.h"

typedef gboolean (*write_pdf_fn) (const char *, const df_project *, const df_surface *,
                                  const df_loop_result *, const char *const *, const char *,
                                  const df_display_units *, const char *, GError **);

static GModule *
open_module (GError **error)
{
  g_autofree char *exe = g_file_read_link ("/proc/self/exe", NULL);
  g_autofree char *exe_dir = exe ? g_path_get_dirname (exe) : NULL;
  const char *dirs[] = { exe_dir, DF_PDF_MODULE_DIR };
  g_autofree char *tried = NULL;

  for (guint i = 0; i < G_N_ELEMENTS (dirs); i++)
    {
      g_autofree char *path = NULL;
      GModule *m;

      if (dirs[i] == NULL)
        continue;
      path = g_module_build_path (dirs[i], "driftframe-cli-pdf");
      if (!g_file_test (path, G_FILE_TEST_IS_REGULAR))
        {
          g_autofree char *was = g_steal_pointer (&tried);

          tried = was ? g_strconcat (was, ", ", path, NULL) : g_strdup (path);
          continue;
        }
      /* The module's core calls resolve to the executable's (exported); its own names stay
       * local. */
      m = g_module_open (path, G_MODULE_BIND_LOCAL);
      if (m == NULL)
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FILE,
                       "the PDF writer %s could not be loaded: %s", path, g_module_error ());
          return NULL;
        }
      return m;
    }
  g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FILE,
               "the PDF writer (driftframe-cli-pdf) is not installed: looked for %s",
               tried ? tried : "nothing");
  return NULL;
}

gboolean
df_cli_report_write_pdf (const char *project_path, const df_project *project,
                         const df_surface *surface, const df_loop_result *results,
                         const char *const *failures, const char *paper,
                         const df_display_units *du, const char *out_path, GError **error)
{
  GModule *m = open_module (error);
  gpointer sym = NULL;
  gboolean ok;

  if (m == NULL)
    return FALSE;
  if (!g_module_symbol (m, "df_cli_pdf_module_write", &sym) || sym == NULL)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FILE,
                   "the PDF writer %s has no entry point: %s", g_module_name (m),
                   g_module_error ());
      g_module_close (m);
      return FALSE;
    }
  /* Resident: pango and cairo register GLib types, which must never be unloaded. */
  g_module_make_resident (m);
  ok = ((write_pdf_fn) sym) (project_path, project, surface, results, failures, paper, du,
                             out_path, error);
  return ok;
}

typedef gboolean (*write_devmap_png_fn) (const char *, const df_surface *, const df_devmap *,
                                         int, int, double, const char *, double, const char *,
                                         GError **);

gboolean
df_cli_devmap_write_png (const char *path, const df_surface *surface, const df_devmap *map,
                         int width, int height, double max_strain_percent, const char *units,
                         double a_display, const char *caution, GError **error)
{
  GModule *m = open_module (error);
  gpointer sym = NULL;

  if (m == NULL)
    return FALSE;
  if (!g_module_symbol (m, "df_cli_pdf_module_devmap_png", &sym) || sym == NULL)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FILE,
                   "the picture writer %s has no devmap entry point: %s", g_module_name (m),
                   g_module_error ());
      g_module_close (m);
      return FALSE;
    }
  g_module_make_resident (m);
  return ((write_devmap_png_fn) sym) (path, surface, map, width, height, max_strain_percent,
                                      units, a_display, caution, error);
}
