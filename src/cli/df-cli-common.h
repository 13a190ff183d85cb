/* df-cli-common.h: what every driftframe-cli subcommand shares: the surface options
 * (--surface, or --preset with --param), reading "U,V" and numbers, exit codes, one-line
 * error reports, JSON printing and text formatting that never shows NaN. CLI layer: prints,
 * computes nothing. */
#pragma once

#include <glib.h>
#include <json-glib/json-glib.h>

#include "df-glib.h"
#include "df-units.h"

/* Exit codes: 0 success, 2 bad input (options, files, geometry the core refuses),
 * 1 failure to write an output file. */
#define DF_CLI_EXIT_OK     0
#define DF_CLI_EXIT_OUTPUT 1
#define DF_CLI_EXIT_INPUT  2
/* `check`: a limit of the project is exceeded. */
#define DF_CLI_EXIT_EXCEEDED 3

#define DF_CLI_CAUTION                                                                           \
  "Geometric estimate only, not a material or structural assessment: check against the "       \
  "material supplier's data, local codes and licensed engineering practice."

typedef struct
{
  /* filled by GOptionContext */
  char  *surface_path;
  char  *preset;
  char **params;
  /* filled by df_cli_surface_load */
  char  *label;       /* the file, or "preset NAME" */
} DfCliSurfaceOptions;

/* Adds --surface, --preset and --param to the context's main group (o must outlive it). */
void      df_cli_add_surface_options (GOptionContext *context, DfCliSurfaceOptions *o);
void      df_cli_surface_options_clear (DfCliSurfaceOptions *o);

/* Loads the spec (file or preset), applies the --param values and builds the surface. */
gboolean  df_cli_surface_load        (DfCliSurfaceOptions *o,
                                      df_surface_spec    **spec_out,
                                      df_surface         **surface_out,
                                      GError             **error);

/* A new context for a subcommand: "driftframe-cli NAME ARGS" with a summary and a
 * description (the text after the options in --help). */
GOptionContext *df_cli_context_new   (const char *name, const char *summary,
                                      const char *description);
/* Parses; on failure reports one line and returns FALSE (exit with DF_CLI_EXIT_INPUT).
 * Leftover arguments are refused. */
gboolean  df_cli_parse               (GOptionContext *context, const char *name, int *argc,
                                      char ***argv);

/* Prints "driftframe-cli NAME: MESSAGE" as one line on stderr and returns code. */
int       df_cli_fail                (const char *name, const GError *error, int code);
/* The most samples --count accepts in `measure` and `geodesic`: each sample is a line of
 * output and a chart evaluation, and beyond this a file grows past what anyone reads while the
 * curve's shape is long resolved. */
#define DF_CLI_MAX_COUNT 100000

int       df_cli_fail_msg            (const char *name, int code, const char *format, ...)
                                      G_GNUC_PRINTF (3, 4);

/* "U,V" -> two finite numbers; errors name the option. */
gboolean  df_cli_parse_pair          (const char *option, const char *text, double *a, double *b,
                                      GError **error);
/* A whole string as one finite number; errors name the option. */
gboolean  df_cli_parse_number        (const char *option, const char *text, double *out,
                                      GError **error);
/* Checks a required string option is present. */
gboolean  df_cli_require             (const char *option, const char *value, GError **error);

/* A number for text output: "%.*g", or "n/a" when not finite, so NaN never reaches the
 * screen. Returns buf. */
const char *df_cli_num               (char *buf, gsize len, double value, int digits);

/* Variable names of the chart for text: ("t", "phi") or ("x", "y"). */
void      df_cli_chart_names         (const df_surface *surface, const char **u_name,
                                      const char **v_name);
/* "surface of revolution" or "graph z = f(x, y)". */
const char *df_cli_kind_text         (const df_surface *surface);

/* What the CSV outputs say about themselves: the unit, chart, surface label and normal side
 * (pointers into spec, surface and label: they must outlive the context). */
df_csv_context df_cli_csv_context    (const df_surface_spec *spec, const df_surface *surface,
                                      const char *label);
/* For a surface fitted to data: "Fit: N points, RMS ..., max ... at (x, y, z), tolerance ...
 * (given | chosen by GCV)" and the noise caution; nothing for formulas. */
void      df_cli_print_fit           (const df_surface *surface, const char *units);

/* --units: the model unit (the surface's units label; mm for a label that is no known unit,
 * when nothing is asked) and the display unit (units_text, else the model's). Errors name the
 * option: an unknown unit, or a conversion asked of a surface whose label is no known unit. */
gboolean  df_cli_units               (const char *units_text, const char *surface_units,
                                      int *model, int *display, GError **error);

/* --units with --curvature-units: the model unit, the length unit (units_text, else the
 * model's) and the unit Gaussian curvature is given per square of (curvature_text, else the
 * length unit). Errors name the option, as df_cli_units. */
gboolean  df_cli_display_units       (const char *units_text, const char *curvature_text,
                                      const char *surface_units, df_display_units *out,
                                      GError **error);

/* A project's display units for check and report: its [units] group, the length overridden by
 * units_text (--units) and the curvature unit by curvature_text (--curvature-units) when given
 * (a project without [units] curvature= has K follow the length unit, --units included).
 * Errors name the project file or the option: a conversion asked of a surface whose label is
 * no known unit, or an unknown unit. */
gboolean  df_cli_project_units       (const df_project *project, const char *project_path,
                                      const char *units_text, const char *curvature_text,
                                      df_display_units *out, GError **error);

/* The labels of K ("1/m^2") and of H, k1, k2 ("1/m") in text and JSON; a surface whose label
 * is no known unit (nothing converted) keeps its own: "1/LABEL^2". Newly allocated. */
char     *df_cli_gaussian_units      (const df_display_units *du, const char *surface_units);
char     *df_cli_curvature_units     (const df_display_units *du, const char *surface_units);

/* Prints a finished JSON document (builder's root) on stdout. */
void      df_cli_print_json          (JsonBuilder *builder);
