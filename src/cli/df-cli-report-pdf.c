/* df-cli-report-pdf.c: assembles the design record for `driftframe-cli report --pdf` from a
 * loaded project and its measured loops; the layout and drawing live in the core's df-report.
 * CLI layer: computes nothing. */
#include "df-cli-report-pdf.h"

#include "df-cli-common.h"
#include "df-io-error.h"
#include "df-report.h"

gboolean
df_cli_report_write_pdf (const char *project_path, const df_project *project,
                         const df_surface *surface, const df_loop_result *results,
                         const char *const *failures, const char *paper, const char *out_path,
                         GError **error)
{
  df_report report = { 0 };
  df_report_fields fields;
  g_autofree df_report_loop *loops = NULL;
  g_autofree char *base = g_path_get_basename (project_path);
  gboolean ok;

  if (!df_paper_from_name (paper != NULL ? paper : "a4", &report.paper))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                   "--paper: '%s' is not a paper size (a4 or letter)", paper);
      return FALSE;
    }
  df_report_fields_init (&fields);
  df_report_fields_add_file (&fields, "Project file", project_path);
  df_report_fields_add_spec (&fields, project->spec, surface);

  loops = g_new0 (df_report_loop, project->loops->len);
  for (guint i = 0; i < project->loops->len; i++)
    {
      const df_project_loop *pl = g_ptr_array_index (project->loops, i);

      loops[i].name = pl->name;
      loops[i].colour = pl->colour;
      loops[i].uv = (const double (*)[2]) pl->uv;
      loops[i].n = pl->n;
      loops[i].result = failures[i] == NULL ? &results[i] : NULL;
      loops[i].failure = failures[i];
    }

  report.title = project->record.title != NULL ? project->record.title : base;
  report.part_number = project->record.part_number;
  report.revision = project->record.revision;
  report.author = project->record.author;
  report.version = DF_VERSION;
  report.inputs = (const df_report_field *) fields.fields->data;
  report.n_inputs = fields.fields->len;
  report.units = project->spec->units;
  report.surface = surface;
  report.loops = loops;
  report.n_loops = project->loops->len;
  report.caution = DF_CLI_CAUTION;
  ok = df_report_write_pdf (&report, out_path, error);
  df_report_fields_clear (&fields);
  return ok;
}
