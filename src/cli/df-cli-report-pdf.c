/* df-cli-report-pdf.c: assembles the design record for `driftframe-cli report --pdf` from a
 * loaded project and its measured loops; the layout and drawing live in the core's df-report.
 * CLI layer: computes nothing. */
#include "df-cli-report-pdf.h"

#include <math.h>
#include <string.h>

#include "df-cli-common.h"
#include "df-decide-out.h"
#include "df-io-error.h"
#include "df-report.h"
#include "df-report-verdicts.h"
#include "df-units-convert.h"
#include "df-verdict-curves.h"

/* Strings and arrays that the report points into, freed together. */
typedef struct
{
  GPtrArray *strings;
  GArray    *curves;     /* df_report_curve */
  GArray    *sections;   /* df_report_section */
  GPtrArray *field_arrays;  /* GArray of df_report_field, one per section */
  GPtrArray *points;        /* point arrays of the curves */
  GPtrArray *line_arrays;   /* the verdict lines of each loop (GStrv) */
} extras_out;

#define keep(x, s) df_report_keep ((x)->strings, (s))
#define num(x, v, d) df_report_num ((x)->strings, (v), (d))

static void
add_section (extras_out *x, const char *title, GArray *fields)
{
  df_report_section sec = { title, (const df_report_field *) fields->data, fields->len };

  g_ptr_array_add (x->field_arrays, fields);
  g_array_append_val (x->sections, sec);
}

static void
field (GArray *fields, const char *key, const char *value)
{
  df_report_field f = { .key = key, .value = value };

  g_array_append_val (fields, f);
}

static void
add_curve (extras_out *x, const char *name, double r, double g, double b, double (*xyz)[3],
           gsize n)
{
  df_report_curve c = { name, { r, g, b }, (const double (*)[3]) xyz, n };

  g_ptr_array_add (x->points, xyz);
  g_array_append_val (x->curves, c);
}

/* The user's limits along a geodesic or path route, one field per verdict (nothing when the
 * project sets no curve limit). */
static void
verdict_fields (extras_out *x, GArray *fields, const df_verdict_list *list, df_status st,
                df_diag *diag, const df_limits *limits, const df_display_units *du,
                const char *what)
{
  if (st != DF_OK)
    {
      g_autoptr (GError) error = NULL;

      df_status_to_gerror (st, diag, &error);
      field (fields, keep (x, g_strdup_printf ("Limits (%s)", what)),
             keep (x, g_strdup_printf ("not checked: %s", error->message)));
      return;
    }
  for (size_t k = 0; k < list->n; k++)
    field (fields, keep (x, g_strdup_printf ("Limit (%s)", what)),
           keep (x, df_report_verdict_text_display (&list->items[k], limits, du)));
  if (list->n > 0)
    field (fields, "Caution", DF_DECIDE_CAUTION);
}

static void
geodesic_sections (extras_out *x, const df_project *project, const df_surface *surface,
                const df_display_units *du)
{
  df_unit model = du->model, display = du->length;
  const char *u = df_unit_name (display);

  for (guint i = 0; i < project->extras.geodesics->len; i++)
    {
      const df_project_geodesic *g = g_ptr_array_index (project->extras.geodesics, i);
      GArray *fields = g_array_new (FALSE, TRUE, sizeof (df_report_field));
      df_geodesic_result res = { 0 };
      df_diag diag;
      df_status st;

      df_diag_clear (&diag);
      st = df_geodesic_shoot (surface, g->u, g->v, g->heading_deg * G_PI / 180, g->length, 201,
                              &res, &diag);
      field (fields, "Start (chart)", keep (x, g_strdup_printf ("(%s, %s)", num (x, g->u, 10),
                                                                  num (x, g->v, 10))));
      field (fields, "Heading", keep (x, g_strdup_printf ("%s\xc2\xb0 from +u, anticlockwise "
                                                          "about N", num (x, g->heading_deg, 8))));
      field (fields, "Length asked",
             keep (x, g_strdup_printf ("%s %s", num (x, df_unit_length (g->length, model,
                                                                         display), 8), u)));
      if (st != DF_OK)
        {
          g_autoptr (GError) error = NULL;

          df_status_to_gerror (st, &diag, &error);
          field (fields, "Not traced", keep (x, g_strdup (error->message)));
        }
      else
        {
          double (*xyz)[3] = g_malloc_n (MAX (res.n_samples, 1), sizeof (double[3]));
          const df_geodesic_sample *end = &res.samples[res.n_samples - 1];

          for (gsize k = 0; k < res.n_samples; k++)
            memcpy (xyz[k], res.samples[k].point, sizeof xyz[k]);
          add_curve (x, g->name, 0.35, 0.2, 0.55, xyz, res.n_samples);
          /* The picture keeps the surface's unit (xyz above); the figures are converted. */
          df_geodesic_result_convert (&res, model, display);
          field (fields, "Length traced", keep (x, g_strdup_printf ("%s %s", num (x, res.length, 8),
                                                                    u)));
          field (fields, "End (chart)", keep (x, g_strdup_printf ("(%s, %s)", num (x, end->u, 10),
                                                                  num (x, end->v, 10))));
          field (fields, "End (space)",
                 keep (x, g_strdup_printf ("(%s, %s, %s) %s", num (x, end->point[0], 8),
                                           num (x, end->point[1], 8), num (x, end->point[2], 8),
                                           u)));
          if (res.stopped_early)
            field (fields, "Stopped", keep (x, g_strdup (res.stop_reason)));
          {
            df_geodesic_result fine = { 0 };
            df_verdict_list list = { 0 };

            /* The verdicts on the finer sampling `check` uses, so both agree. */
            df_diag_clear (&diag);
            st = df_geodesic_shoot (surface, g->u, g->v, g->heading_deg * G_PI / 180, g->length,
                                    2000, &fine, &diag);
            if (st == DF_OK)
              st = df_verdicts_geodesic (surface, &fine, g->heading_deg * G_PI / 180,
                                         project->limits, &list, &diag);
            verdict_fields (x, fields, &list, st, &diag, project->limits, du, "geodesic");
            df_verdict_list_clear (&list);
            df_geodesic_result_clear (&fine);
          }
        }
      add_section (x, keep (x, g_strdup_printf ("Geodesic %u: %s", i + 1, g->name)), fields);
      df_geodesic_result_clear (&res);
    }
}

static df_status
open_curve (const df_surface *surface, const double (*uv)[2], gsize n, df_curve **out,
            df_diag *diag)
{
  df_diag_clear (diag);
  return df_curve_new_through_points (surface, uv, n, false, out, diag);
}

static void
paths_sections (extras_out *x, const df_project *project, const df_surface *surface,
                const df_display_units *du)
{
  df_unit model = du->model, display = du->length;
  const char *u = df_unit_name (display);

  for (guint i = 0; i < project->extras.paths->len; i++)
    {
      const df_project_paths *p = g_ptr_array_index (project->extras.paths, i);
      GArray *fields = g_array_new (FALSE, TRUE, sizeof (df_report_field));
      g_autoptr (df_curve) a = NULL;
      g_autoptr (df_curve) b = NULL;
      df_transport_options topt;
      df_transport_result ra = { 0 }, rb = { 0 };
      double angle = NAN;
      df_diag diag;
      df_status st;

      df_transport_options_init (&topt);
      topt.n_out = 101;
      st = open_curve (surface, (const double (*)[2]) p->a, p->n_a, &a, &diag);
      if (st == DF_OK)
        st = open_curve (surface, (const double (*)[2]) p->b, p->n_b, &b, &diag);
      if (st == DF_OK)
        {
          df_diag_clear (&diag);
          st = df_compare_paths (a, b, NULL, &topt, &angle, &ra, &rb, &diag);
        }
      if (st != DF_OK)
        {
          g_autoptr (GError) error = NULL;

          df_status_to_gerror (st, &diag, &error);
          field (fields, "Not compared", keep (x, g_strdup (error->message)));
        }
      else
        {
          const df_transport_result *rs[2] = { &ra, &rb };

          for (int k = 0; k < 2; k++)
            {
              double (*xyz)[3] = g_malloc_n (MAX (rs[k]->n_samples, 1), sizeof (double[3]));

              for (gsize j = 0; j < rs[k]->n_samples; j++)
                memcpy (xyz[j], rs[k]->samples[j].x, sizeof xyz[j]);
              add_curve (x, keep (x, g_strdup_printf ("%s %c", p->name, k ? 'B' : 'A')), 0.1,
                         k ? 0.45 : 0.3, k ? 0.3 : 0.6, xyz, rs[k]->n_samples);
            }
          field (fields, "Rotation from A to B",
                 keep (x, g_strdup_printf ("%s\xc2\xb0 at the common end, anticlockwise about N "
                                           "(the start vector carried along each)",
                                           num (x, angle * 180 / G_PI, 8))));
          field (fields, "Length of A", keep (x, g_strdup_printf ("%s %s", num (x, df_unit_length (
                                                                    ra.length, model, display), 8),
                                                                  u)));
          field (fields, "Length of B", keep (x, g_strdup_printf ("%s %s", num (x, df_unit_length (
                                                                    rb.length, model, display), 8),
                                                                  u)));
          for (int k = 0; k < 2; k++)
            {
              df_verdict_list list = { 0 };

              df_diag_clear (&diag);
              st = df_verdicts_path (k ? b : a, 2000, project->limits, &list, NULL, &diag);
              verdict_fields (x, fields, &list, st, &diag, project->limits, du,
                              k ? "route B" : "route A");
              df_verdict_list_clear (&list);
            }
        }
      add_section (x, keep (x, g_strdup_printf ("Path pair %u: %s", i + 1, p->name)), fields);
      df_transport_result_clear (&ra);
      df_transport_result_clear (&rb);
    }
}

static void
probe_sections (extras_out *x, const df_project *project, const df_surface *surface,
                const df_display_units *du)
{
  const char *u = df_unit_name (du->length), *ku = df_unit_name (du->curvature);

  for (guint i = 0; i < project->extras.probes->len; i++)
    {
      const df_project_probe *p = g_ptr_array_index (project->extras.probes, i);
      GArray *fields = g_array_new (FALSE, TRUE, sizeof (df_report_field));
      df_point_geometry geo;
      df_diag diag;
      df_status st;

      df_diag_clear (&diag);
      st = df_surface_geometry (surface, p->u, p->v, &geo, &diag);
      field (fields, "At (chart)", keep (x, g_strdup_printf ("(%s, %s)", num (x, p->u, 10),
                                                             num (x, p->v, 10))));
      if (st != DF_OK)
        {
          g_autoptr (GError) error = NULL;

          df_status_to_gerror (st, &diag, &error);
          field (fields, "Not evaluated", keep (x, g_strdup (error->message)));
        }
      else
        {
          df_point_geometry_convert_display (&geo, du);
          field (fields, "Point (space)",
                 keep (x, g_strdup_printf ("(%s, %s, %s) %s", num (x, geo.point[0], 8),
                                           num (x, geo.point[1], 8), num (x, geo.point[2], 8),
                                           u)));
          field (fields, "Gaussian curvature K",
                 keep (x, g_strdup_printf ("%s 1/%s\xc2\xb2", num (x, geo.K, 8), ku)));
          field (fields, "Mean curvature H", keep (x, g_strdup_printf ("%s 1/%s", num (x, geo.H, 8),
                                                                       ku)));
          field (fields, "Principal curvatures",
                 keep (x, g_strdup_printf ("k1 = %s, k2 = %s 1/%s", num (x, geo.k1, 8),
                                           num (x, geo.k2, 8), ku)));
        }
      add_section (x, keep (x, g_strdup_printf ("Probe %u: %s", i + 1, p->name)), fields);
    }
}

gboolean
df_cli_report_write_pdf (const char *project_path, const df_project *project,
                         const df_surface *surface, const df_loop_result *results,
                         const char *const *failures, const char *paper,
                         const df_display_units *du, const char *out_path, GError **error)
{
  df_unit model = du->model, display = du->length;
  df_report report = { 0 };
  df_report_fields fields;
  g_autofree df_report_loop *loops = NULL;
  g_autofree char *base = g_path_get_basename (project_path);
  extras_out x;
  gboolean ok;

  if (!df_paper_from_name (paper != NULL ? paper : "a4", &report.paper))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                   "--paper: '%s' is not a paper size (a4 or letter)", paper);
      return FALSE;
    }
  x.strings = g_ptr_array_new_with_free_func (g_free);
  x.curves = g_array_new (FALSE, TRUE, sizeof (df_report_curve));
  x.sections = g_array_new (FALSE, TRUE, sizeof (df_report_section));
  x.field_arrays = g_ptr_array_new_with_free_func ((GDestroyNotify) g_array_unref);
  x.points = g_ptr_array_new_with_free_func (g_free);
  x.line_arrays = g_ptr_array_new_with_free_func ((GDestroyNotify) g_strfreev);
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
      if (failures[i] == NULL)
        {
          /* In the display units, as the figures above them (the text and JSON are). */
          char **lines = df_report_verdict_lines_display (surface,
                                                          (const double (*)[2]) pl->uv, pl->n,
                                                          project->limits, &pl->drape, du,
                                                          &loops[i].kg_limit, &loops[i].checked,
                                                          &loops[i].n_exceeded);

          if (lines != NULL)
            g_ptr_array_add (x.line_arrays, lines);
          loops[i].verdicts = (const char *const *) lines;
        }
    }

  report.title = project->record.title != NULL ? project->record.title : base;
  report.part_number = project->record.part_number;
  report.revision = project->record.revision;
  report.author = project->record.author;
  report.version = DF_VERSION;
  report.inputs = (const df_report_field *) fields.fields->data;
  report.n_inputs = fields.fields->len;
  report.units = model == display ? project->spec->units : df_unit_name (display);
  report.model_units = project->spec->units;
  report.curvature_units = model == display && du->curvature == model
                             ? report.units : df_unit_name (du->curvature);
  report.surface = surface;
  report.loops = loops;
  report.n_loops = project->loops->len;
  report.caution = DF_CLI_CAUTION " " DF_DECIDE_CAUTION;
  report.view_yaw_deg = project->extras.view.set ? project->extras.view.yaw_deg
                                                 : DF_REPORT_DEFAULT_YAW_DEG;
  report.view_pitch_deg = project->extras.view.set ? project->extras.view.pitch_deg
                                                   : DF_REPORT_DEFAULT_PITCH_DEG;
  geodesic_sections (&x, project, surface, du);
  paths_sections (&x, project, surface, du);
  probe_sections (&x, project, surface, du);
  report.curves = (const df_report_curve *) x.curves->data;
  report.n_curves = x.curves->len;
  report.sections = (const df_report_section *) x.sections->data;
  report.n_sections = x.sections->len;
  ok = df_report_write_pdf (&report, out_path, error);
  df_report_fields_clear (&fields);
  g_ptr_array_unref (x.strings);
  g_array_unref (x.curves);
  g_array_unref (x.sections);
  g_ptr_array_unref (x.field_arrays);
  g_ptr_array_unref (x.points);
  g_ptr_array_unref (x.line_arrays);
  return ok;
}
