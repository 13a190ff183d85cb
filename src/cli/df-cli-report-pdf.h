/* df-cli-report-pdf.h: the PDF design record of `driftframe-cli report --pdf`: gathers the
 * project's title block, inputs with their hashes, loops and results for df_report_write_pdf.
 * CLI layer: computes nothing. */
#pragma once

#include <glib.h>

#include "df-glib.h"
#include "df-units.h"

/* results[i] is loop i's measurement, valid where failures[i] is NULL, already in the display
 * units du; failures[i] is the reason a loop could not be measured. paper: "a4" or "letter".
 * The geodesics, paths, probes and the loops' verdicts are computed in the surface's unit
 * (du->model) and shown in du's (K per du->curvature squared). */
gboolean df_cli_report_write_pdf (const char           *project_path,
                                  const df_project     *project,
                                  const df_surface     *surface,
                                  const df_loop_result *results,
                                  const char *const    *failures,
                                  const char           *paper,
                                  const df_display_units *du,
                                  const char           *out_path,
                                  GError              **error);

/* devmap --png through the same module (df-cli-module-devmap.c): df_devmap_png_write's
 * arguments. */
#include "df-devmap.h"
gboolean df_cli_devmap_write_png (const char *path, const df_surface *surface,
                                  const df_devmap *map, int width, int height,
                                  double max_strain_percent, const char *units,
                                  double a_display, const char *caution, GError **error);
