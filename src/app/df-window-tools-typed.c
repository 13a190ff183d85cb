/* df-window-tools-typed.c: typed values for the tools: a point typed in chart or space coordinates
 * for Probe, a start, heading and length for Geodesic, and the entries' hints naming the chart. */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "df-project.h"

#include "df-document-units.h"
#include "df-format.h"
#include "df-window-private.h"
#include "df-window-tools-private.h"

/* ---- typed values ------------------------------------------------------------------------- */

/* Numbers separated by commas, semicolons or spaces; FALSE (error naming field) unless there
 * are between min and max finite ones. */
static gboolean
parse_numbers (const char  *text,
               const char  *field,
               int          min,
               int          max,
               double      *out,
               int         *n_out,
               GError     **error)
{
  g_auto(GStrv) parts = g_strsplit_set (text, ",; \t", -1);
  int n = 0;

  for (int i = 0; parts[i] != NULL; i++)
    {
      char *end = NULL;
      double value;

      if (parts[i][0] == '\0')
        continue;
      value = g_ascii_strtod (parts[i], &end);
      if (end == parts[i] || *end != '\0' || !isfinite (value))
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: '%s' is not a number",
                       field, parts[i]);
          return FALSE;
        }
      if (n == max)
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: more than %d numbers",
                       field, max);
          return FALSE;
        }
      out[n++] = value;
    }
  if (n < min || (min == 2 && max == 3 && n != 2 && n != 3))
    {
      if (min == max)
        g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: expected %d number%s", field,
                     min, min == 1 ? "" : "s");
      else
        g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: expected %d or %d numbers",
                     field, min, max);
      return FALSE;
    }
  *n_out = n;
  return TRUE;
}

/* A typed point: chart coordinates (φ in degrees on a surface of revolution, as everywhere in
 * the app) or a point in space, placed at its closest surface point (within 5 % of the
 * surface's size, common practice, no source). */
static gboolean
typed_point (DfWindow    *self,
             const char  *text,
             const char  *field,
             double      *u,
             double      *v,
             GError     **error)
{
  const df_surface *surface = df_document_get_surface (self->document);
  double x[3], dist = 0;
  int n = 0;
  df_diag diag;
  df_status status;
  DfDisplayUnits du;

  df_document_get_display_units (self->document, &du);
  if (surface == NULL || !parse_numbers (text, field, 2, 3, x, &n, error))
    return FALSE;
  if (n == 2 && df_surface_get_kind (surface) == DF_SURFACE_REVOLUTION)
    {
      /* t as the profile defines it (its own unit), φ in degrees. */
      *u = x[0];
      *v = x[1] * G_PI / 180.0;
      return TRUE;
    }
  if (n == 2)
    {
      /* A graph's x, y are its plan, lengths in space: typed in the display unit, as the
       * status line and the readouts show them. */
      *u = df_du_to_model (&du, x[0]);
      *v = df_du_to_model (&du, x[1]);
      return TRUE;
    }
  /* A point in space is typed in the display unit. */
  for (int k = 0; k < 3; k++)
    x[k] = df_du_to_model (&du, x[k]);
  df_diag_clear (&diag);
  status = df_surface_project (surface, x, 0.05 * df_surface_size (surface), u, v, &dist, &diag);
  if (status != DF_OK)
    {
      df_status_to_gerror (status, &diag, error);
      g_prefix_error (error, "%s: the point (%g, %g, %g) is not near the surface: ", field,
                      x[0], x[1], x[2]);
      return FALSE;
    }
  if (dist > 1e-6 * df_surface_size (surface))
    {
      g_autofree char *d = df_du_format_length (&du, dist);
      _df_window_status (self, FALSE, "%s: the typed point is %s from the surface; its closest "
                         "surface point is used.", field, d);
    }
  return TRUE;
}

void
_df_window_probe_requested_cb (DfProbePanel *panel,
                               const char   *text,
                               DfWindow     *self)
{
  g_autoptr(GError) error = NULL;
  double u, v;

  if (!typed_point (self, text, "Probe at", &u, &v, &error))
    {
      df_probe_panel_show_error (panel, error->message);
      return;
    }
  _df_window_probe_at (self, u, v);
}

void
_df_window_shoot_requested_cb (DfGeodesicPanel *panel,
                               const char      *start_text,
                               const char      *heading_text,
                               const char      *length_text,
                               DfWindow        *self)
{
  const df_surface *surface = df_document_get_surface (self->document);
  g_autoptr(GError) error = NULL;
  df_point_geometry start;
  double u, v, heading, length;
  int n;

  if (!typed_point (self, start_text, "From", &u, &v, &error)
      || !parse_numbers (heading_text, "Heading", 1, 1, &heading, &n, &error)
      || !parse_numbers (length_text, "Length", 1, 1, &length, &n, &error))
    {
      df_geodesic_panel_show_error (panel, error->message);
      return;
    }
  if (!(length > 0))
    {
      df_geodesic_panel_show_error (panel, "Length: must be greater than 0");
      return;
    }
  if (df_surface_geometry (surface, u, v, &start, NULL) == DF_OK && !start.chart_regular)
    {
      df_geodesic_panel_show_error (panel, "From: the start point is a pole of the chart, "
                                           "where no heading can be measured: start next to it.");
      return;
    }
  self->geodesic_start[0] = u;
  self->geodesic_start[1] = v;
  {
    /* Typed in the display unit (the field says which). */
    DfDisplayUnits du;

    df_document_get_display_units (self->document, &du);
    length = df_du_to_model (&du, length);
  }
  _df_window_shoot_from (self, heading * G_PI / 180.0, length, TRUE);
}

/* The typed-value entries name the chart of the surface now shown. */
void
_df_window_update_typed_hints (DfWindow *self)
{
  const df_surface *surface = df_document_get_surface (self->document);
  gboolean revolution = surface != NULL && df_surface_get_kind (surface) == DF_SURFACE_REVOLUTION;
  DfDisplayUnits du;
  g_autofree char *hint = NULL;

  df_document_get_display_units (self->document, &du);
  if (revolution)
    hint = g_strdup_printf ("t%s%s%s, φ° on the surface or x, y, z in %s",
                            du.t_unit[0] != '\0' ? " (" : "", du.t_unit,
                            du.t_unit[0] != '\0' ? ")" : "", df_du_length_unit (&du));
  else
    hint = g_strdup_printf ("x, y on the surface or x, y, z (all in %s)", df_du_length_unit (&du));
  df_probe_panel_set_placeholder (self->probe_panel, hint);
  df_geodesic_panel_set_chart (self->geodesic_panel, revolution ? "t, φ°  or  x, y, z" :
                                                                  "x, y  or  x, y, z",
                               revolution ? "Heading 0° = along +t (X_t, the way t grows "
                                            "along the profile), counted anticlockwise about "
                                            "N (see the Surface panel's orientation)."
                                          : "Heading 0° = along +x, 90° = along +y; "
                                            "anticlockwise about N.",
                               df_du_length_unit (&du));
}

void
_df_window_focus_typed (DfWindow *self)
{
  if (self->tool == DF_TOOL_GEODESIC)
    {
      gtk_stack_set_visible_child_name (self->panel_stack, "geodesic");
      df_geodesic_panel_focus_entry (self->geodesic_panel);
    }
  else
    {
      if (self->tool != DF_TOOL_PROBE)
        g_object_set (self, "tool", "probe", NULL);
      gtk_stack_set_visible_child_name (self->panel_stack, "probe");
      df_probe_panel_focus_entry (self->probe_panel);
    }
}

