/* df-cli-report.c: `driftframe-cli report`: measures every loop of a project (.dfproj) on its
 * surface and prints one line per loop, or JSON, optionally writing the summary CSV
 * (df_loop_summary_write): the check a workshop runs over all plies before cutting.
 * The loops are measured on a GThreadPool of up to REPORT_THREADS threads (the core keeps no
 * globals and a surface is read-only once built); each result goes to its loop's slot, so the
 * output keeps the project's order whatever order the threads finish in. */
#include <stdio.h>
#include <string.h>

#include "df-cli-commands.h"
#include "df-cli-common.h"
#include "df-cli-report-pdf.h"
#include "df-json-out.h"
#include "df-units-convert.h"

#define NAME "report"
/* The development machine's two cores; more threads would only queue. */
#define REPORT_THREADS 2

typedef struct
{
  char    *project_path;
  char   **params;
  char    *summary_path;
  char    *pdf_path;
  char    *paper;
  char    *units_text;
  char    *curvature_text;
  gboolean json;
} report_options;

static gboolean
measure_loop (const df_surface *surface, const df_project_loop *loop, int threads,
              df_loop_result *out, GError **error)
{
  g_autoptr (df_curve) curve = NULL;
  df_loop_options opt;
  df_diag diag;
  df_status st;

  df_loop_options_init (&opt);
  opt.threads = threads;
  df_diag_clear (&diag);
  st = df_curve_new_through_points (surface, (const double (*)[2]) loop->uv, loop->n, true,
                                    &curve, &diag);
  if (st == DF_OK)
    {
      df_diag_clear (&diag);
      st = df_loop_measure (curve, &opt, out, &diag);
    }
  if (st != DF_OK)
    return df_status_to_gerror (st, &diag, error);
  return TRUE;
}

/* The work shared by the pool's threads: each task is one loop index, writing only its own
 * result and error slots. */
typedef struct
{
  const df_surface *surface;
  const df_project *project;
  df_loop_result   *results;
  GError          **errors;
  int               loop_threads;   /* 1 when the loops themselves run in parallel */
} report_job;

static void
measure_task (gpointer data, gpointer user_data)
{
  report_job *job = user_data;
  guint i = GPOINTER_TO_UINT (data) - 1;
  const df_project_loop *loop = g_ptr_array_index (job->project->loops, i);

  measure_loop (job->surface, loop, job->loop_threads, &job->results[i], &job->errors[i]);
}

/* Measures every loop on the pool's threads; failures[i] gets the reason loop i could not be
 * measured (NULL when it was). Returns how many failed. */
static guint
measure_all (const df_project *project, const df_surface *surface, df_loop_result *results,
             char **failures)
{
  guint n = project->loops->len, n_failed = 0;
  g_autofree GError **errors = g_new0 (GError *, n);
  report_job job = { surface, project, results, errors, REPORT_THREADS };
  gint threads = MIN (REPORT_THREADS, MAX (1, (gint) g_get_num_processors ()));
  GThreadPool *pool = NULL;

  if (n > 1 && threads > 1)
    pool = g_thread_pool_new (measure_task, &job, MIN (threads, (gint) n), TRUE, NULL);
  if (pool != NULL)
    job.loop_threads = 1;
  for (guint i = 0; i < n; i++)
    if (pool == NULL || !g_thread_pool_push (pool, GUINT_TO_POINTER (i + 1), NULL))
      measure_task (GUINT_TO_POINTER (i + 1), &job);
  if (pool != NULL)
    g_thread_pool_free (pool, FALSE, TRUE);
  for (guint i = 0; i < n; i++)
    if (errors[i] != NULL)
      {
        failures[i] = g_strdup (errors[i]->message);
        g_clear_error (&errors[i]);
        n_failed++;
      }
  return n_failed;
}

static void
print_text (const report_options *o, const df_project *project, const df_surface *surface,
            const char *un, const char *k_units, const df_loop_result *results,
            const char *const *failures)
{
  printf ("Project: %s (%s, lengths in %s)\n", o->project_path, df_cli_kind_text (surface),
          project->spec->units);
  if (strcmp (un, project->spec->units) != 0)
    printf ("Shown in: %s\n", un);
  df_cli_print_fit (surface, project->spec->units);
  printf ("Normal:  %s\n\n", df_surface_normal_side (surface));
  printf ("%-24s %14s %14s %12s %12s %14s %14s\n", "Loop", "holonomy deg", "enclosed deg",
          "residual rad", "length", "min radius", "mean K");
  for (guint i = 0; i < project->loops->len; i++)
    {
      const df_project_loop *loop = g_ptr_array_index (project->loops, i);
      const df_loop_result *r = &results[i];
      char h[40], e[40], res[40], len[40], rad[40], mk[40];

      if (failures[i] != NULL)
        {
          printf ("%-24.24s not measured: %s\n", loop->name, failures[i]);
          continue;
        }
      printf ("%-24.24s %14s %14s %12s %12s %14s %14s\n", loop->name,
              df_cli_num (h, sizeof h, r->holonomy_rad * 180.0 / G_PI, 8),
              !r->bounds_disc         ? "no disc"
              : !r->enclosed_available ? "n/a"
                                       : df_cli_num (e, sizeof e,
                                                     r->enclosed_curvature_rad * 180.0 / G_PI, 8),
              r->bounds_disc && r->enclosed_available
                ? df_cli_num (res, sizeof res, r->residual_rad, 2) : "-",
              df_cli_num (len, sizeof len, r->length, 7),
              r->has_steering_radius ? df_cli_num (rad, sizeof rad, r->min_steering_radius, 6)
                                     : "none",
              r->bounds_disc && r->enclosed_available && r->has_mean_K
                ? df_cli_num (mk, sizeof mk, r->mean_K, 6) : "-");
    }
  printf ("\nLengths and radii in %s; mean K (enclosed curvature / disc area) in %s; holonomy "
          "is anticlockwise about N.\n", un, k_units);
  printf ("\nCaution: %s\n", DF_CLI_CAUTION);
}

static void
print_json (const report_options *o, const df_project *project, const df_surface *surface,
            const char *units, const char *k_units, const df_loop_result *results,
            const char *const *failures)
{
  g_autoptr (JsonBuilder) b = json_builder_new ();

  json_builder_begin_object (b);
  json_builder_set_member_name (b, "project");
  json_builder_add_string_value (b, o->project_path);
  json_builder_set_member_name (b, "units");
  json_builder_add_string_value (b, units);
  /* Of mean_gaussian_curvature: [units] curvature= or --curvature-units, else the lengths'. */
  json_builder_set_member_name (b, "curvature_units");
  json_builder_add_string_value (b, k_units);
  json_builder_set_member_name (b, "normal_side");
  json_builder_add_string_value (b, df_surface_normal_side (surface));
  df_json_add_fit (b, surface);
  json_builder_set_member_name (b, "loops");
  json_builder_begin_array (b);
  for (guint i = 0; i < project->loops->len; i++)
    {
      const df_project_loop *loop = g_ptr_array_index (project->loops, i);

      json_builder_begin_object (b);
      json_builder_set_member_name (b, "name");
      json_builder_add_string_value (b, loop->name);
      json_builder_set_member_name (b, "colour");
      json_builder_add_string_value (b, loop->colour);
      json_builder_set_member_name (b, "points");
      json_builder_add_int_value (b, (gint64) loop->n);
      if (failures[i] != NULL)
        {
          json_builder_set_member_name (b, "error");
          json_builder_add_string_value (b, failures[i]);
        }
      else
        df_json_add_loop_result (b, &results[i]);
      json_builder_end_object (b);
    }
  json_builder_end_array (b);
  json_builder_set_member_name (b, "caution");
  json_builder_add_string_value (b, DF_CLI_CAUTION);
  json_builder_end_object (b);
  df_cli_print_json (b);
}

static int
run (report_options *o)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_project) project = NULL;
  g_autoptr (df_surface) surface = NULL;
  g_autofree df_loop_result *results = NULL;
  g_autofree const char **names = NULL;
  g_autofree const df_loop_result **ptrs = NULL;
  g_auto (GStrv) failures = NULL;
  int code = DF_CLI_EXIT_OK;
  guint n, n_failed = 0;
  df_unit display;
  df_display_units du;
  g_autofree char *k_units = NULL;

  if (!df_cli_require ("--project", o->project_path, &error))
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
  project = df_project_load (o->project_path, &error);
  if (project == NULL)
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
  for (gsize i = 0; o->params != NULL && o->params[i] != NULL; i++)
    if (!df_surface_spec_set_param (project->spec, o->params[i], NULL, &error))
      {
        g_prefix_error (&error, "--param %s: ", o->params[i]);
        return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
      }
  surface = df_surface_spec_build (project->spec, &error);
  if (surface == NULL)
    {
      g_prefix_error (&error, "%s: ", o->project_path);
      return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
    }
  n = project->loops->len;
  if (n == 0)
    return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT, "%s: the project has no loops",
                            o->project_path);
  /* As `check` reads them; a surface whose label is no known unit converts nothing. */
  if (!df_cli_project_units (project, o->project_path, o->units_text, o->curvature_text, &du,
                             &error))
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
  display = du.length;
  k_units = df_cli_gaussian_units (&du, project->spec->units);

  results = g_new0 (df_loop_result, n);
  names = g_new0 (const char *, n);
  ptrs = g_new0 (const df_loop_result *, n);
  /* A loop that cannot be measured stays in every output with its reason (a record that
   * silently drops a ply is worse than none); the run still ends with exit status 2. Freed
   * slot by slot below: g_auto (GStrv) would stop at the first empty one. */
  failures = g_new0 (char *, n + 1);
  for (guint i = 0; i < n; i++)
    {
      const df_project_loop *loop = g_ptr_array_index (project->loops, i);

      names[i] = loop->name;
      ptrs[i] = &results[i];
    }
  n_failed = measure_all (project, surface, results, failures);
  /* Every figure in the display units from here on (the project's [units] unless --units or
   * --curvature-units say otherwise); a surface whose label is no known unit stays as it is. */
  for (guint i = 0; i < n; i++)
    if (failures[i] == NULL)
      df_loop_result_convert_display (&results[i], &du);

  if (code == DF_CLI_EXIT_OK && o->pdf_path != NULL
      && !df_cli_report_write_pdf (o->project_path, project, surface, results,
                                   (const char *const *) failures, o->paper, &du, o->pdf_path,
                                   &error))
    code = df_cli_fail (NAME, error,
                        error->code == DF_IO_ERROR_VALUE ? DF_CLI_EXIT_INPUT : DF_CLI_EXIT_OUTPUT);
  if (code == DF_CLI_EXIT_OK && o->summary_path != NULL)
    {
      df_csv_context csv = df_cli_csv_context (project->spec, surface, o->project_path);

      csv.units = df_unit_name (display);

      for (guint i = 0; i < n; i++)
        if (failures[i] != NULL)
          ptrs[i] = NULL;
      if (!df_loop_summary_write_k (o->summary_path, names, ptrs,
                                    (const char *const *) failures, n, &csv,
                                    du.curvature == du.model && du.length == du.model
                                      ? NULL : df_unit_name (du.curvature), &error))
        code = df_cli_fail (NAME, error, DF_CLI_EXIT_OUTPUT);
    }
  if (code == DF_CLI_EXIT_OK)
    {
      if (o->json)
        print_json (o, project, surface, df_unit_name (display), k_units, results,
                    (const char *const *) failures);
      else
        print_text (o, project, surface, df_unit_name (display), k_units, results,
                    (const char *const *) failures);
    }
  for (guint i = 0; n_failed > 0 && i < n; i++)
    if (failures[i] != NULL)
      {
        if (code == DF_CLI_EXIT_OK)
          code = df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT, "%s: [loop %u] '%s': %s",
                                  o->project_path, i + 1,
                                  ((const df_project_loop *) g_ptr_array_index (project->loops,
                                                                                i))->name,
                                  failures[i]);
        g_clear_pointer (&failures[i], g_free);
      }

  for (guint i = 0; i < n; i++)
    df_loop_result_clear (&results[i]);
  return code;
}

int
df_cli_report (int argc, char **argv)
{
  report_options o = { 0 };
  g_autoptr (GOptionContext) context = NULL;
  int code;
  const GOptionEntry entries[] = {
    { "project", 'f', 0, G_OPTION_ARG_FILENAME, &o.project_path,
      "Project file (.dfproj): a surface and its loops", "FILE" },
    { "param", 'P', 0, G_OPTION_ARG_STRING_ARRAY, &o.params,
      "Override a surface parameter, e.g. R=120 (repeatable)", "KEY=VALUE" },
    { "json", 'j', 0, G_OPTION_ARG_NONE, &o.json, "Print the results as JSON", NULL },
    { "pdf", 0, 0, G_OPTION_ARG_FILENAME, &o.pdf_path,
      "Write the design record as a PDF (title block, inputs with SHA-256, picture, figures, "
      "k_g plots, caution)", "OUT.pdf" },
    { "paper", 0, 0, G_OPTION_ARG_STRING, &o.paper, "Paper size of the PDF: a4 (default) or "
      "letter", "SIZE" },
    { "units", 'u', 0, G_OPTION_ARG_STRING, &o.units_text,
      "Show lengths, areas and curvatures in mm, cm, m or in (default: the project's [units] "
      "length, else the surface's)", "UNIT" },
    { "curvature-units", 0, 0, G_OPTION_ARG_STRING, &o.curvature_text,
      "Show Gaussian curvature per square of mm, cm, m or in (default: the project's [units] "
      "curvature, else the length unit)", "UNIT" },
    { "summary", 'o', 0, G_OPTION_ARG_FILENAME, &o.summary_path,
      "Write one CSV row per loop (name, holonomy, enclosed curvature, residual, ...)",
      "OUT.csv" },
    { NULL },
  };

  context = df_cli_context_new (NAME, "measure every loop of a project",
                                "Measures each loop of the project on its surface, as `measure` "
                                "does for one loop, and prints one row per loop; --pdf writes "
                                "the design record. A loop that cannot be measured is listed "
                                "with its reason in every output.\n\nExit status: 0 done, 2 "
                                "bad input or a loop that could not be measured, 1 an output "
                                "could not be written.");
  g_option_context_add_main_entries (context, entries, NULL);
  if (!df_cli_parse (context, NAME, &argc, &argv))
    code = DF_CLI_EXIT_INPUT;
  else
    code = run (&o);

  g_free (o.project_path);
  g_strfreev (o.params);
  g_free (o.summary_path);
  g_free (o.pdf_path);
  g_free (o.paper);
  g_free (o.units_text);
  g_free (o.curvature_text);
  return code;
}
