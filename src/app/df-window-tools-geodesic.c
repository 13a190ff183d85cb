/* df-window-tools-geodesic.c: the Probe tool (local geometry at a picked point) and the Geodesic tool
 * (press at the start, drag to aim, release to shoot; the core traces it). */
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

/* ---- Probe -------------------------------------------------------------------------------- */

void
_df_window_probe_at (DfWindow *self,
                     double    u,
                     double    v)
{
  const df_surface *surface = df_document_get_surface (self->document);
  df_point_geometry geometry;
  df_diag diag;
  df_status status;
  GdkRGBA colour = _df_window_rgba (colour_marker);
  DfDisplayUnits du;

  df_document_get_display_units (self->document, &du);
  self->probe_shown = TRUE;
  self->probe_uv[0] = u;
  self->probe_uv[1] = v;
  df_diag_clear (&diag);
  status = df_surface_geometry (surface, u, v, &geometry, &diag);
  if (status != DF_OK)
    {
      g_autoptr(GError) error = NULL;

      df_status_to_gerror (status, &diag, &error);
      df_probe_panel_show_error (self->probe_panel, error->message);
      df_surface_view_set_marker (self->view, NULL, NULL);
      return;
    }
  df_probe_panel_show (self->probe_panel, surface, &geometry, &du);
  df_surface_view_set_marker (self->view, geometry.point, &colour);
  if (self->startup.report_events)
    {
      char a[G_ASCII_DTOSTR_BUF_SIZE], b[G_ASCII_DTOSTR_BUF_SIZE], k[G_ASCII_DTOSTR_BUF_SIZE];

      printf ("probed %s %s %s\n", g_ascii_dtostr (a, sizeof a, u),
              g_ascii_dtostr (b, sizeof b, v), g_ascii_dtostr (k, sizeof k, geometry.K));
      /* What the panel shows, in the display units. */
      printf ("probe-shown %s %s %.17g %.17g %.17g %.17g %.17g\n", df_du_length_unit (&du),
              df_du_curvature_unit (&du), df_du_length (&du, geometry.point[0]),
              df_du_length (&du, geometry.point[1]), df_du_length (&du, geometry.point[2]),
              geometry.curvature_defined ? df_du_gaussian (&du, geometry.K) : NAN,
              geometry.curvature_defined ? df_du_per_curvature (&du, geometry.H) : NAN);
      fflush (stdout);
    }
}

/* ---- Geodesic ----------------------------------------------------------------------------- */

void
_df_window_clear_geodesic (DfWindow *self)
{
  self->geodesic_pressed = FALSE;
  df_surface_view_remove_curve (self->view, DF_CURVE_GEODESIC);
  df_surface_view_remove_arrow (self->view, DF_ARROW_GEODESIC);
  df_geodesic_panel_clear (self->geodesic_panel);
}

void
_df_window_geodesic_aim (DfWindow *self,
                         double    u,
                         double    v)
{
  double a[3], b[3], dir[3];
  GdkRGBA colour = _df_window_rgba (colour_geodesic);

  if (!_df_window_surface_point (self, self->geodesic_start[0], self->geodesic_start[1], a)
      || !_df_window_surface_point (self, u, v, b))
    return;
  for (int k = 0; k < 3; k++)
    dir[k] = b[k] - a[k];
  if (dir[0] != 0 || dir[1] != 0 || dir[2] != 0)
    df_surface_view_set_arrow (self->view, DF_ARROW_GEODESIC, a, dir, &colour);
}

void
_df_window_geodesic_shoot (DfWindow *self,
                           double    u,
                           double    v)
{
  const df_surface *surface = df_document_get_surface (self->document);
  g_auto(df_geodesic_result) result = { 0 };
  df_point_geometry start;
  double a[3], b[3], w[3], du, dv, heading, length;
  df_diag diag;
  df_status status;
  g_autoptr(GError) error = NULL;

  self->geodesic_pressed = FALSE;
  du = u - self->geodesic_start[0];
  dv = v - self->geodesic_start[1];
  if (df_surface_v_periodic (surface))
    dv = remainder (dv, 2 * G_PI);
  df_diag_clear (&diag);
  status = df_surface_geometry (surface, self->geodesic_start[0], self->geodesic_start[1],
                                &start, &diag);
  if (status == DF_OK && !start.chart_regular)
    {
      df_geodesic_panel_show_error (self->geodesic_panel,
                                    "The start point is a pole of the chart, where no heading "
                                    "can be measured: start next to it.");
      return;
    }
  if (status != DF_OK)
    {
      df_status_to_gerror (status, &diag, &error);
      df_geodesic_panel_show_error (self->geodesic_panel, error->message);
      df_geodesic_panel_show_verdicts (self->geodesic_panel, NULL);
      _df_window_decide_mark_open_curve (self, DF_OPEN_MARKS_GEODESIC, NULL, NULL, NULL, 0, 0,
                                         NULL);
      return;
    }
  if (!_df_window_surface_point (self, self->geodesic_start[0], self->geodesic_start[1], a)
      || !_df_window_surface_point (self, u, v, b))
    return;
  /* The drag's direction as a tangent vector (du X_u + dv X_v) and its heading from X_u about
   * N; the length asked is the straight distance between press and release. This only turns
   * a mouse gesture into the two numbers the core's shooter takes. */
  for (int k = 0; k < 3; k++)
    w[k] = du * start.xu[k] + dv * start.xv[k];
  length = sqrt ((b[0] - a[0]) * (b[0] - a[0]) + (b[1] - a[1]) * (b[1] - a[1])
                 + (b[2] - a[2]) * (b[2] - a[2]));
  if (!(length > 1e-6 * df_surface_size (surface)) || (w[0] == 0 && w[1] == 0 && w[2] == 0))
    {
      df_geodesic_panel_show_error (self->geodesic_panel,
                                    "Drag away from the start point to set the direction and "
                                    "length of the geodesic.");
      df_surface_view_remove_arrow (self->view, DF_ARROW_GEODESIC);
      return;
    }
  heading = df_signed_angle (start.xu, w, start.normal);
  _df_window_shoot_from (self, heading, length, TRUE);
}

/* Shoots from self->geodesic_start with heading (rad, from X_u about N) and length. */
void
_df_window_shoot_from (DfWindow *self,
                       double    heading,
                       double    length,
                       gboolean  record)
{
  const df_surface *surface = df_document_get_surface (self->document);
  DfDisplayUnits du;
  g_auto(df_geodesic_result) result = { 0 };
  df_diag diag;
  df_status status;
  g_autoptr(GError) error = NULL;

  df_document_get_display_units (self->document, &du);
  df_diag_clear (&diag);
  status = df_geodesic_shoot (surface, self->geodesic_start[0], self->geodesic_start[1],
                              heading, length, DF_GEODESIC_SAMPLES, &result, &diag);
  if (status != DF_OK)
    {
      df_status_to_gerror (status, &diag, &error);
      df_geodesic_panel_show_error (self->geodesic_panel, error->message);
      _df_window_status (self, TRUE, "No geodesic: %s", error->message);
      return;
    }
  {
    g_autofree double (*xyz)[3] = g_malloc_n (MAX (result.n_samples, 1), sizeof (double[3]));
    GdkRGBA colour = _df_window_rgba (colour_geodesic);
    g_autofree char *reached = df_du_format_length (&du, result.length);

    for (gsize i = 0; i < result.n_samples; i++)
      memcpy (xyz[i], result.samples[i].point, sizeof xyz[i]);
    df_surface_view_set_curve (self->view, DF_CURVE_GEODESIC, (const double (*)[3]) xyz,
                               result.n_samples, FALSE, &colour, 3.5f);
    if (result.n_samples > 0)
      df_surface_view_set_arrow (self->view, DF_ARROW_GEODESIC, result.samples[0].point,
                                 result.samples[0].tangent, &colour);
    df_geodesic_panel_show (self->geodesic_panel, surface, heading, length, &result, &du);
    {
      /* Against the project's limits, as `check` reports a geodesic (a few ms: synchronous,
       * like the shot itself). */
      g_autoptr (DfCurveVerdicts) verdicts = df_curve_verdicts_geodesic (
        surface, df_document_get_limits (self->document), self->geodesic_start[0],
        self->geodesic_start[1], heading, length, &du);
      g_autofree char *shown = verdicts ? g_strdup_printf ("%s\n%s", verdicts->text,
                                                           DF_CURVE_VERDICTS_CAUTION) : NULL;

      df_geodesic_panel_show_verdicts (self->geodesic_panel, shown);
      _df_window_decide_mark_open_curve (self, DF_OPEN_MARKS_GEODESIC,
                                         verdicts ? verdicts->s : NULL,
                                         verdicts ? (const double (*)[3]) verdicts->xyz : NULL,
                                         verdicts ? (const double (*)[3]) verdicts->normal : NULL,
                                         verdicts ? verdicts->n : 0,
                                         verdicts ? verdicts->length : 0,
                                         verdicts && verdicts->checked ? &verdicts->list : NULL);
      /* "geodesic-verdict LIMIT within|exceeded S0 S1" per verdict, for test drivers. */
      for (gsize k = 0; self->startup.report_events && verdicts && verdicts->checked
                        && k < verdicts->list.n; k++)
        {
          const df_verdict *v = &verdicts->list.items[k];
          char s0[G_ASCII_DTOSTR_BUF_SIZE], s1[G_ASCII_DTOSTR_BUF_SIZE];

          printf ("geodesic-verdict %s %s %s %s\n", df_limit_key (v->limit),
                  v->within ? "within" : "exceeded",
                  g_ascii_dtostr (s0, sizeof s0, v->has_where ? v->s0 : 0),
                  g_ascii_dtostr (s1, sizeof s1, v->has_where ? v->s1 : 0));
          fflush (stdout);
        }
    }
    if (record)
      df_document_set_geodesic (self->document, "Geodesic", self->geodesic_start[0],
                                self->geodesic_start[1], heading * 180 / G_PI, length);
    _df_window_status (self, result.stopped_early, "Geodesic of %s%s%s.", reached,
                       result.stopped_early ? ", stopped early: " : "",
                       result.stopped_early ? result.stop_reason : "");
    if (self->startup.report_events && result.n_samples > 0)
      {
        df_geodesic_sample *end = &result.samples[result.n_samples - 1];
        char a[G_ASCII_DTOSTR_BUF_SIZE], b[G_ASCII_DTOSTR_BUF_SIZE], c[G_ASCII_DTOSTR_BUF_SIZE];

        printf ("geodesic-end %s %s %s\n", g_ascii_dtostr (a, sizeof a, end->u),
                g_ascii_dtostr (b, sizeof b, end->v), g_ascii_dtostr (c, sizeof c, result.length));
        fflush (stdout);
      }
  }
}

