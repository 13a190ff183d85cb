/* df-cli-module-devmap.c: the developability map's PNG writer as an entry point of the
 * driftframe-cli-pdf module (cairo and pango live there only, see df-cli-pdf-module.c), so
 * `devmap --png` loads them on demand like `report --pdf`. CLI layer: computes nothing. */
#include "df-report-devmap.h"

gboolean df_cli_pdf_module_devmap_png (const char *path, const df_surface *surface,
                                       const df_devmap *map, int width, int height,
                                       double max_strain_percent, const char *units,
                                       double a_display, const char *caution, GError **error);

gboolean
df_cli_pdf_module_devmap_png (const char *path, const df_surface *surface, const df_devmap *map,
                              int width, int height, double max_strain_percent,
                              const char *units, double a_display, const char *caution,
                              GError **error)
{
  return df_devmap_png_write (path, surface, map, width, height, max_strain_percent, units,
                              a_display, caution, error);
}
