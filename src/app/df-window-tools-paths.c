/* df-window-tools-paths.c: the Two paths tool: path A, then path B with its ends snapped to A's;
 * the core compares the vectors carried along each. */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "df-curve-verdicts.h"
#include "df-window-decide.h"
#include "df-project.h"

#include "df-document-units.h"
#include "df-format.h"
#include "df-window-private.h"
#include "df-window-tools-private.h"

/* ---- Two paths ---------------------------------------------------------------------------- */

static void
clear_route_marks (DfWindow *self)
{
  _df_window_decide_mark_open_curve (self, DF_OPEN_MARKS_ROUTE_A, NULL, NULL, NULL, 0, 0, NULL);
  _df_window_decide_mark_open_curve (self, DF_OPEN_MARKS_ROUTE_B, NULL, NULL, NULL, 0, 0, NULL);
}

static const char *
paths_hint (DfPathsStage stage)
{
  switch (stage)
    {
    case DF_PATHS_WANT_A:
    case DF_PATHS_DRAWING_A:
      return "Drag path A on the surface, from its start to its end.";
    case DF_PATHS_WANT_B:
    case DF_PATHS_DRAWING_B:
      return "Now drag path B: another way from A's start to A's end (its ends snap to A's).";
    case DF_PATHS_DONE:
    default:
      return "Done. Drag again to start a new path A, or Clear paths.";
    }
}

void
_df_window_paths_set_stage (DfWindow     *self,
                            DfPathsStage  stage)
{
  self->paths_stage = stage;
  df_compare_panel_set_hint (self->compare_panel, paths_hint (stage));
}

void
_df_window_clear_paths (DfWindow *self)
{
  if (self->paths_cancellable != NULL)
    g_cancellable_cancel (self->paths_cancellable);
  g_clear_object (&self->paths_cancellable);
  g_array_set_size (self->path_a, 0);
  g_array_set_size (self->path_b, 0);
  df_surface_view_remove_curve (self->view, DF_CURVE_PATH_A);
  df_surface_view_remove_curve (self->view, DF_CURVE_PATH_B);
  df_surface_view_remove_arrow (self->view, DF_ARROW_PATH_A);
  df_surface_view_remove_arrow (self->view, DF_ARROW_PATH_B);
  df_compare_panel_set_paths (self->compare_panel, 0, 0);
  df_compare_panel_set_angle (self->compare_panel, NAN);
  df_compare_panel_show_verdicts (self->compare_panel, NULL);
  clear_route_marks (self);
  _df_window_paths_set_stage (self, DF_PATHS_WANT_A);
}

static void
draw_transport (DfWindow                  *self,
                guint                      curve_id,
                guint                      arrow_id,
                const df_transport_result *result,
                const char                *colour_spec)
{
  g_autofree double (*xyz)[3] = g_malloc_n (MAX (result->n_samples, 1), sizeof (double[3]));
  GdkRGBA colour = _df_window_rgba (colour_spec);

  for (gsize i = 0; i < result->n_samples; i++)
    memcpy (xyz[i], result->samples[i].x, sizeof xyz[i]);
  if (result->n_samples >= 2)
    {
      df_surface_view_set_curve (self->view, curve_id, (const double (*)[3]) xyz,
                                 result->n_samples, FALSE, &colour, 3.5f);
      df_surface_view_set_arrow (self->view, arrow_id, result->samples[result->n_samples - 1].x,
                                 result->end_vector, &colour);
    }
}

static void
compare_done_cb (GObject      *source,
                 GAsyncResult *result,
                 gpointer      user_data)
{
  DfWindow *self = user_data;
  g_autoptr(GError) error = NULL;
  g_autoptr(DfPathComparison) comparison = df_work_compare_paths_finish (result, &error);

  if (g_error_matches (error, G_IO_ERROR, G_IO_ERROR_CANCELLED))
    {
      g_object_unref (self);
      return;
    }
  if (comparison == NULL)
    {
      df_compare_panel_show_error (self->compare_panel, error->message);
      df_compare_panel_show_verdicts (self->compare_panel, NULL);
      clear_route_marks (self);
      _df_window_status (self, TRUE, "Paths not compared: %s", error->message);
      _df_window_paths_set_stage (self, DF_PATHS_DONE);
      g_object_unref (self);
      return;
    }
  draw_transport (self, DF_CURVE_PATH_A, DF_ARROW_PATH_A, &comparison->a, colour_path_a);
  draw_transport (self, DF_CURVE_PATH_B, DF_ARROW_PATH_B, &comparison->b, colour_path_b);
  df_compare_panel_set_angle (self->compare_panel, comparison->angle_rad);
  if (self->startup.report_events)
    {
      char a[G_ASCII_DTOSTR_BUF_SIZE], la[G_ASCII_DTOSTR_BUF_SIZE], lb[G_ASCII_DTOSTR_BUF_SIZE];

      printf ("paths-compared %s %s %s\n", g_ascii_dtostr (a, sizeof a, comparison->angle_rad),
              g_ascii_dtostr (la, sizeof la, comparison->a.length),
              g_ascii_dtostr (lb, sizeof lb, comparison->b.length));
      fflush (stdout);
    }
  if (self->paths_record)
    {
      g_autofree double (*uv_a)[2] = _df_window_stroke_uv (self->path_a);
      g_autofree double (*uv_b)[2] = _df_window_stroke_uv (self->path_b);

      df_document_set_paths (self->document, "Path pair", (const double (*)[2]) uv_a,
                             self->path_a->len, (const double (*)[2]) uv_b, self->path_b->len);
    }
  {
    DfDisplayUnits du;

    df_document_get_display_units (self->document, &du);
    df_compare_panel_set_lengths (self->compare_panel, comparison->a.length,
                                  comparison->b.length, &du);
  }
  {
    /* Both routes against the project's limits, as `check` reports a path pair. */
    const df_surface *surface = df_document_get_surface (self->document);
    const df_limits *limits = df_document_get_limits (self->document);
    DfDisplayUnits du;
    g_autofree double (*uv_a)[2] = _df_window_stroke_uv (self->path_a);
    g_autofree double (*uv_b)[2] = _df_window_stroke_uv (self->path_b);
    g_autoptr (DfCurveVerdicts) va = NULL;
    g_autoptr (DfCurveVerdicts) vb = NULL;
    g_autofree char *both = NULL;
    DfCurveVerdicts *routes[2];

    df_document_get_display_units (self->document, &du);
    va = df_curve_verdicts_path (surface, limits, (const double (*)[2]) uv_a, self->path_a->len,
                                 "route A", &du);
    vb = df_curve_verdicts_path (surface, limits, (const double (*)[2]) uv_b, self->path_b->len,
                                 "route B", &du);
    both = va || vb ? g_strdup_printf ("%s%s%s\n%s", va ? va->text : "", va && vb ? "\n" : "",
                                       vb ? vb->text : "", DF_CURVE_VERDICTS_CAUTION)
                    : NULL;
    routes[0] = va;
    routes[1] = vb;

    df_compare_panel_show_verdicts (self->compare_panel, both);
    for (int k = 0; k < 2; k++)
      _df_window_decide_mark_open_curve (
        self, k ? DF_OPEN_MARKS_ROUTE_B : DF_OPEN_MARKS_ROUTE_A,
        routes[k] ? routes[k]->s : NULL,
        routes[k] ? (const double (*)[3]) routes[k]->xyz : NULL,
        routes[k] ? (const double (*)[3]) routes[k]->normal : NULL, routes[k] ? routes[k]->n : 0,
        routes[k] ? routes[k]->length : 0,
        routes[k] && routes[k]->checked ? &routes[k]->list : NULL);
  }
  {
    g_autofree char *angle = df_format_angle (comparison->angle_rad);
    _df_window_status (self, self->paths_long_legs, "Carried along B, the direction ends %s "
                       "from the one carried along A.%s", angle,
                       self->paths_long_legs ? " Path B started or ended away from A's "
                                               "ends and was pulled onto them, which bends "
                                               "its ends: give B from A's start to A's end."
                                             : "");
  }
  _df_window_paths_set_stage (self, DF_PATHS_DONE);
  g_object_unref (self);
}

void
_df_window_paths_finish_stroke (DfWindow *self)
{
  const char *problem;
  gboolean is_a = self->paths_stage == DF_PATHS_DRAWING_A;

  self->stroking = FALSE;
  df_surface_view_remove_curve (self->view, DF_CURVE_SKETCH);
  problem = _df_window_stroke_problem (self, 3);
  if (problem != NULL)
    {
      _df_window_status (self, TRUE, "Path %s not taken: %s.", is_a ? "A" : "B", problem);
      _df_window_paths_set_stage (self, is_a ? DF_PATHS_WANT_A : DF_PATHS_WANT_B);
      return;
    }
  if (is_a)
    {
      g_array_set_size (self->path_a, 0);
      g_array_append_vals (self->path_a, self->stroke_uv->data, self->stroke_uv->len);
      _df_window_draw_stroke (self, DF_CURVE_PATH_A, self->path_a, colour_path_a, 3.5f);
      df_compare_panel_set_paths (self->compare_panel, self->path_a->len, 0);
      _df_window_paths_set_stage (self, DF_PATHS_WANT_B);
      return;
    }

  {
    StrokePoint *a0 = &g_array_index (self->path_a, StrokePoint, 0);
    StrokePoint *a1 = &g_array_index (self->path_a, StrokePoint, self->path_a->len - 1);
    StrokePoint *b0, *b1;
    double gap_start, gap_end;

    g_array_set_size (self->path_b, 0);
    g_array_append_vals (self->path_b, self->stroke_uv->data, self->stroke_uv->len);
    /* Common ends: B starts and ends exactly where A does. */
    b0 = &g_array_index (self->path_b, StrokePoint, 0);
    b1 = &g_array_index (self->path_b, StrokePoint, self->path_b->len - 1);
    gap_start = hypot (b0->px - a0->px, b0->py - a0->py);
    gap_end = hypot (b1->px - a1->px, b1->py - a1->py);
    /* The snap is silent when B was drawn onto A's ends; say so when it adds long legs. */
    self->paths_long_legs = MAX (gap_start, gap_end) > 5 * DF_STROKE_STEP_PX;
    /* Path A from a file has no pointer positions: its ends are compared in space. */
    if (isnan (a0->px) || isnan (a1->px))
      {
        double pa[2] = { a0->u, a0->v }, pb[2] = { b0->u, b0->v };
        double qa[2] = { a1->u, a1->v }, qb[2] = { b1->u, b1->v };

        self->paths_long_legs = _df_window_far_apart (self, pa, pb)
                                || _df_window_far_apart (self, qa, qb);
      }
    *b0 = *a0;
    *b1 = *a1;
    _df_window_paths_compare (self, TRUE);
  }
}

/* Draws path_a and path_b and compares them on a worker thread; record: keep the pair in the
 * document once compared (an undoable edit), FALSE when showing the document's own pair. */
void
_df_window_paths_compare (DfWindow *self,
                          gboolean  record)
{
  g_autofree double (*uv_a)[2] = NULL;
  g_autofree double (*uv_b)[2] = NULL;

  _df_window_draw_stroke (self, DF_CURVE_PATH_A, self->path_a, colour_path_a, 3.5f);
  _df_window_draw_stroke (self, DF_CURVE_PATH_B, self->path_b, colour_path_b, 3.5f);
  df_compare_panel_set_paths (self->compare_panel, self->path_a->len, self->path_b->len);
  _df_window_paths_set_stage (self, DF_PATHS_DONE);
  df_compare_panel_set_hint (self->compare_panel, "Comparing…");
  self->paths_record = record;

  uv_a = _df_window_stroke_uv (self->path_a);
  uv_b = _df_window_stroke_uv (self->path_b);
  if (self->paths_cancellable != NULL)
    g_cancellable_cancel (self->paths_cancellable);
  g_clear_object (&self->paths_cancellable);
  self->paths_cancellable = g_cancellable_new ();
  df_work_compare_paths_async (df_document_get_surface (self->document),
                               (const double (*)[2]) uv_a, self->path_a->len,
                               (const double (*)[2]) uv_b, self->path_b->len,
                               self->paths_cancellable, compare_done_cb, g_object_ref (self));
}

static void
fill_path (GArray        *path,
           const double (*uv)[2],
           gsize          n)
{
  g_array_set_size (path, 0);
  for (gsize i = 0; i < n; i++)
    {
      StrokePoint p = { uv[i][0], uv[i][1], 0, 0 };
      g_array_append_val (path, p);
    }
}

/* Path A and B from chart points (a file or the document); B's ends are A's. far_ends: B was
 * given away from A's ends, said in the status line once compared. */
void
_df_window_paths_set (DfWindow      *self,
                      const double (*a)[2],
                      gsize          n_a,
                      const double (*b)[2],
                      gsize          n_b,
                      gboolean       far_ends,
                      gboolean       record)
{
  g_return_if_fail (n_a >= 2 && n_b >= 2);
  fill_path (self->path_a, a, n_a);
  fill_path (self->path_b, b, n_b);
  g_array_index (self->path_b, StrokePoint, 0) = g_array_index (self->path_a, StrokePoint, 0);
  g_array_index (self->path_b, StrokePoint, n_b - 1)
    = g_array_index (self->path_a, StrokePoint, n_a - 1);
  self->paths_long_legs = far_ends;
  _df_window_paths_compare (self, record);
}
