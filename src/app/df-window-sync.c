/* df-window-sync.c: keeps what the window shows in step with the document: the surface in the
 * view and the surface panel, one curve per loop, the selected loop's frames, the legend, the
 * title and the status line. Only copies and draws; the numbers come from the core. */
#include <math.h>
#include <stdio.h>

#include "df-document-units.h"
#include "df-format.h"
#include "df-window-data.h"
#include "df-window-private.h"

/* Frames drawn along a loop: enough to see the rotation, few enough to read. */
#define DF_FRAMES_SHOWN 28

void
_df_window_status (DfWindow   *self,
                   gboolean    is_error,
                   const char *format,
                   ...)
{
  g_autofree char *text = NULL;
  va_list args;

  va_start (args, format);
  text = g_strdup_vprintf (format, args);
  va_end (args);

  gtk_label_set_text (self->status_label, text);
  gtk_widget_set_tooltip_text (GTK_WIDGET (self->status_label), text);
  gtk_image_set_from_icon_name (self->status_icon, is_error ? "dialog-warning-symbolic"
                                                            : "dialog-information-symbolic");
  gtk_widget_set_visible (GTK_WIDGET (self->status_icon), text[0] != '\0');
  if (is_error)
    gtk_widget_add_css_class (GTK_WIDGET (self->status_label), "df-error");
  else
    gtk_widget_remove_css_class (GTK_WIDGET (self->status_label), "df-error");
}

void
_df_window_sync_title (DfWindow *self)
{
  g_autofree char *title = df_document_get_title (self->document);
  g_autofree char *window_title = NULL;
  g_autofree char *subtitle = NULL;
  const df_surface_spec *spec = df_document_get_spec (self->document);
  gboolean modified = df_document_get_modified (self->document);

  window_title = g_strdup_printf ("%s%s — driftframe", modified ? "• " : "", title);
  gtk_window_set_title (GTK_WINDOW (self), window_title);
  {
    g_autofree char *shown = g_strdup_printf ("%s%s", title, modified ? " •" : "");
    gtk_label_set_text (self->title_label, shown);
  }
  if (spec != NULL)
    {
      const char *what = spec->kind == DF_SURFACE_REVOLUTION ? "revolution profile"
                                                             : "height field";
      const df_preset_info *presets = df_presets_list ();

      for (guint i = 0; spec->preset != NULL && presets[i].name != NULL; i++)
        if (g_str_equal (presets[i].name, spec->preset))
          what = presets[i].title;
      const char *path = df_document_get_path (self->document);
      const char *name = df_document_get_display_name (self->document);
      g_autofree char *base = path != NULL ? g_path_get_basename (path) : NULL;
      /* The file's name where the title is the project's own (kept through Save As). */
      g_autofree char *file = path == NULL ? g_strdup (", no file yet")
                              : name != NULL ? g_strdup_printf (", %s", base)
                              : g_strdup ("");

      DfDisplayUnits du;

      df_document_get_display_units (self->document, &du);
      if (df_du_converts (&du))
        subtitle = g_strdup_printf ("%s in %s, shown in %s%s", what, du.label,
                                    df_du_length_unit (&du), file);
      else
        subtitle = g_strdup_printf ("%s, lengths in %s%s", what, du.label, file);
    }
  gtk_label_set_text (self->subtitle_label, subtitle != NULL ? subtitle : "");
}

void
_df_window_sync_legend (DfWindow *self)
{
  DfDisplayUnits du;

  df_document_get_display_units (self->document, &du);
  df_legend_bar_set_display_units (self->legend, &du);
  gtk_widget_set_visible (GTK_WIDGET (self->legend), self->shading != DF_SHADING_PLAIN);
}

/* Space points of a loop: the measured samples when there are any, else its chart points
 * mapped onto the surface (pending or failed loops are drawn too, so the user sees them). */
static double (*loop_points (DfWindow   *self,
                             DfLoopItem *item,
                             gsize      *n_out))[3]
{
  const df_loop_result *result = df_loop_item_get_result (item);
  const df_surface *surface = df_document_get_surface (self->document);
  double (*xyz)[3];
  gsize n = 0;

  if (result != NULL && result->n_samples > 0)
    {
      xyz = g_malloc_n (result->n_samples, sizeof (double[3]));
      for (gsize i = 0; i < result->n_samples; i++)
        for (int k = 0; k < 3; k++)
          xyz[i][k] = result->samples[i].point[k];
      *n_out = result->n_samples;
      return xyz;
    }
  {
    const double (*uv)[2];
    gsize n_uv;

    uv = df_loop_item_get_points (item, &n_uv);
    xyz = g_malloc_n (MAX (n_uv, 1), sizeof (double[3]));
    for (gsize i = 0; i < n_uv; i++)
      {
        df_chart_jet jet;

        if (surface != NULL
            && df_surface_eval (surface, uv[i][0], uv[i][1], 0, &jet, NULL) == DF_OK)
          {
            for (int k = 0; k < 3; k++)
              xyz[n][k] = jet.x[k];
            n++;
          }
      }
  }
  *n_out = n;
  return xyz;
}

void
_df_window_sync_loop (DfWindow   *self,
                      DfLoopItem *item)
{
  g_autofree double (*xyz)[3] = NULL;
  gboolean selected = item == df_loops_panel_get_selected (self->loops_panel);
  guint id = df_loop_item_get_id (item);
  GdkRGBA colour;
  gsize n;

  xyz = loop_points (self, item, &n);
  df_loop_item_get_rgba (item, &colour);
  if (df_loop_item_get_state (item) == DF_LOOP_FAILED)
    colour.alpha = 0.5f;
  if (n >= 2)
    df_surface_view_set_curve (self->view, id, (const double (*)[3]) xyz, n, TRUE, &colour,
                               selected ? 4.0f : 2.5f);
  else
    df_surface_view_remove_curve (self->view, id);
  for (guint i = 0; i < self->loop_curve_ids->len; i++)
    if (g_array_index (self->loop_curve_ids, guint, i) == id)
      return;
  g_array_append_val (self->loop_curve_ids, id);
}

static void
sync_all_loops (DfWindow *self)
{
  GListModel *loops = df_document_get_loops (self->document);

  for (guint i = 0; i < self->loop_curve_ids->len; i++)
    df_surface_view_remove_curve (self->view, g_array_index (self->loop_curve_ids, guint, i));
  g_array_set_size (self->loop_curve_ids, 0);
  for (guint i = 0; i < g_list_model_get_n_items (loops); i++)
    {
      g_autoptr(DfLoopItem) item = g_list_model_get_item (loops, i);
      _df_window_sync_loop (self, item);
    }
}

void
_df_window_sync_frames (DfWindow *self)
{
  DfLoopItem *item = df_loops_panel_get_selected (self->loops_panel);
  const df_loop_result *result = item != NULL ? df_loop_item_get_result (item) : NULL;
  g_autofree double (*origin)[3] = NULL;
  g_autofree double (*vec)[3] = NULL;
  g_autofree double (*partner)[3] = NULL;
  gsize n, step;

  if (result == NULL || !df_loop_item_get_show_frames (item) || result->n_samples < 2)
    {
      df_surface_view_set_frames (self->view, NULL, NULL, NULL, 0);
      return;
    }
  /* Evenly spaced samples, always with the last one: the view highlights the first and the
   * last, the start vector and the vector carried once around. */
  step = MAX ((result->n_samples - 1) / (DF_FRAMES_SHOWN - 1), 1);
  n = (result->n_samples - 1) / step + 1;
  if ((n - 1) * step != result->n_samples - 1)
    n++;
  origin = g_malloc_n (n, sizeof (double[3]));
  vec = g_malloc_n (n, sizeof (double[3]));
  partner = g_malloc_n (n, sizeof (double[3]));
  for (gsize j = 0; j < n; j++)
    {
      gsize i = MIN (j * step, result->n_samples - 1);

      if (j == n - 1)
        i = result->n_samples - 1;
      for (int k = 0; k < 3; k++)
        {
          origin[j][k] = result->samples[i].point[k];
          vec[j][k] = result->samples[i].vector[k];
          partner[j][k] = result->samples[i].partner[k];
        }
    }
  df_surface_view_set_frames (self->view, (const double (*)[3]) origin,
                              (const double (*)[3]) vec, (const double (*)[3]) partner, n);
}

static void
sync_surface (DfWindow *self)
{
  const df_surface *surface = df_document_get_surface (self->document);
  const df_surface_spec *spec = df_document_get_spec (self->document);

  /* A parameter tweak keeps the user's view; another kind of surface or preset gets framed. */
  if (spec != NULL)
    {
      char *shape = g_strdup_printf ("%d/%s", (int) spec->kind,
                                     spec->preset != NULL ? spec->preset : "");

      if (self->shown_shape != NULL && !g_str_equal (shape, self->shown_shape))
        df_surface_view_fit_next_mesh (self->view);
      g_free (self->shown_shape);
      self->shown_shape = shape;
    }
  df_surface_view_set_surface (self->view, surface);
  if (spec != NULL)
    df_surface_panel_set_spec (self->surface_panel, spec);
  if (surface != NULL)
    {
      g_autofree char *normal = g_strdup_printf ("%s.", df_surface_normal_side (surface));
      df_surface_panel_set_normal_text (self->surface_panel, normal);
    }
  _df_window_sync_legend (self);
  _df_window_tools_surface_changed (self);
  _df_window_data_sync (self);
}

void
_df_window_sync_all (DfWindow *self)
{
  sync_surface (self);
  sync_all_loops (self);
  _df_window_sync_frames (self);
  _df_window_sync_title (self);
  _df_window_actions_update (self);
}

/* ---- document signals ------------------------------------------------------------------- */

static void
surface_changed_cb (DfDocument *document,
                    DfWindow   *self)
{
  sync_surface (self);
  sync_all_loops (self);
  _df_window_sync_frames (self);
  _df_window_sync_title (self);
  _df_window_actions_update (self);
}

static void
loop_changed_cb (DfDocument *document,
                 DfLoopItem *item,
                 DfWindow   *self)
{
  _df_window_sync_loop (self, item);
  if (item == df_loops_panel_get_selected (self->loops_panel))
    _df_window_sync_frames (self);
  if (df_loop_item_get_state (item) == DF_LOOP_FAILED
      && df_loop_item_get_off_surface (item) == NULL)
    _df_window_status (self, TRUE, "“%s” was not measured: %s", df_loop_item_get_name (item),
                       df_loop_item_get_error (item));
  else if (df_loop_item_get_state (item) == DF_LOOP_MEASURED
           && item == df_loops_panel_get_selected (self->loops_panel))
    {
      g_autofree char *angle = df_format_angle (df_loop_item_get_result (item)->holonomy_rad);
      _df_window_status (self, FALSE, "“%s”: holonomy %s.", df_loop_item_get_name (item), angle);
    }
  _df_window_actions_update (self);
  _df_window_check_exports (self);
}

static void
loops_items_changed_cb (GListModel *model,
                        guint       position,
                        guint       removed,
                        guint       added,
                        DfWindow   *self)
{
  sync_all_loops (self);
  /* A new loop (sketched or imported) becomes the selection, so its numbers show at once. */
  if (added == 1 && removed == 0)
    {
      g_autoptr(DfLoopItem) item = g_list_model_get_item (model, position);
      df_loops_panel_select (self->loops_panel, item);
    }
  else if (df_loops_panel_get_selected (self->loops_panel) == NULL
           && g_list_model_get_n_items (model) > 0)
    {
      /* Undo and redo replace every item: select the loop of the same name again; after a
       * delete, its neighbour, not the first loop. */
      guint n = g_list_model_get_n_items (model), pick = MIN (position, n - 1);
      g_autoptr(DfLoopItem) item = NULL;

      for (guint i = 0; i < n && self->selected_name != NULL; i++)
        {
          g_autoptr(DfLoopItem) candidate = g_list_model_get_item (model, i);

          if (g_strcmp0 (df_loop_item_get_name (candidate), self->selected_name) == 0)
            {
              pick = i;
              break;
            }
        }
      item = g_list_model_get_item (model, pick);
      df_loops_panel_select (self->loops_panel, item);
    }
  _df_window_sync_frames (self);
  _df_window_actions_update (self);
}

static void
history_changed_cb (DfDocument *document,
                    DfWindow   *self)
{
  _df_window_actions_update (self);
}

static void
title_notify_cb (DfDocument *document,
                 GParamSpec *pspec,
                 DfWindow   *self)
{
  _df_window_sync_title (self);
}

static void
selection_changed_cb (DfLoopsPanel *panel,
                      DfWindow     *self)
{
  DfLoopItem *item = df_loops_panel_get_selected (panel);

  if (item != NULL)
    {
      g_free (self->selected_name);
      self->selected_name = g_strdup (df_loop_item_get_name (item));
    }
  /* Redraw all so that the selected loop is the thick one. */
  sync_all_loops (self);
  if (item != NULL && df_loop_item_get_result (item) != NULL)
    {
      g_autofree char *angle = df_format_angle (df_loop_item_get_result (item)->holonomy_rad);
      _df_window_status (self, FALSE, "“%s”: holonomy %s.", df_loop_item_get_name (item), angle);
    }
  _df_window_sync_frames (self);
  _df_window_actions_update (self);
}

static void
spec_changed_cb (DfSurfacePanel *panel,
                 DfWindow       *self)
{
  g_autoptr(GError) error = NULL;
  guint carried = 0, off = 0;

  /* A surface from data is fitted on a worker thread (df-window-data.c). */
  if (df_surface_panel_get_spec (panel)->data_key != NULL)
    {
      _df_window_data_fit (self, df_surface_panel_get_spec (panel));
      return;
    }
  if (!df_document_set_spec (self->document, df_surface_panel_get_spec (panel), &error))
    {
      df_surface_panel_show_error (panel, error);
      _df_window_status (self, TRUE, "The surface was not changed: %s", error->message);
      return;
    }
  df_surface_panel_show_error (panel, NULL);
  df_document_get_last_carry (self->document, &carried, &off);
  {
    g_autofree char *dropped = _df_window_dropped_note (self);

    if (off > 0)
      _df_window_status (self, TRUE, "Surface changed: %u loop%s carried over by their places "
                         "in space, %u off the new surface (kept, not measured; Ctrl+Z undoes "
                         "the change).%s", carried, carried == 1 ? "" : "s", off, dropped);
    else if (carried > 0)
      _df_window_status (self, dropped[0] != '\0', "Surface changed: %u loop%s carried over by "
                         "their places in space, measuring…%s", carried,
                         carried == 1 ? "" : "s", dropped);
    else
      _df_window_status (self, dropped[0] != '\0', "Surface changed.%s", dropped);
  }
}

char *
_df_window_dropped_note (DfWindow *self)
{
  guint geodesics = 0, paths = 0;
  GString *note = g_string_new (NULL);

  df_document_get_last_dropped (self->document, &geodesics, &paths);
  /* A heading is measured from X_u of the old chart: read on the new one it would be another
   * direction, so the geodesic is removed rather than reinterpreted. */
  if (geodesics > 0)
    g_string_append_printf (note, " %s removed: %s heading belongs to the old surface "
                            "(Ctrl+Z brings %s back).",
                            geodesics == 1 ? "The geodesic was" : "The geodesics were",
                            geodesics == 1 ? "its" : "their", geodesics == 1 ? "it" : "them");
  if (paths > 0)
    g_string_append_printf (note, " %u path pair%s removed: off the new surface (Ctrl+Z "
                            "brings %s back).", paths, paths == 1 ? " was" : "s were",
                            paths == 1 ? "it" : "them");
  return g_string_free (note, FALSE);
}

static void
mesh_ready_cb (DfSurfaceView *view,
               DfWindow      *self)
{
  const char *problem = df_surface_view_get_mesh_problem (view);

  if (problem != NULL)
    {
      /* The problem text says already whether part or all of the surface is missing. */
      _df_window_status (self, TRUE, "%s", problem);
      if (self->startup.report_events)
        {
          printf ("mesh-problem %s\n", problem);
          fflush (stdout);
        }
    }
  _df_window_actions_update (self);
}

static void
gl_failed_cb (DfSurfaceView *view,
              const char    *message,
              DfWindow      *self)
{
  _df_window_status (self, TRUE, "The 3D view cannot draw: %s", message);
}

void
_df_window_sync_init (DfWindow *self)
{
  self->loop_curve_ids = g_array_new (FALSE, FALSE, sizeof (guint));
  df_legend_bar_set_view (self->legend, self->view);
  g_signal_connect (self->document, "surface-changed", G_CALLBACK (surface_changed_cb), self);
  g_signal_connect (self->document, "loop-changed", G_CALLBACK (loop_changed_cb), self);
  g_signal_connect (self->document, "history-changed", G_CALLBACK (history_changed_cb), self);
  g_signal_connect (self->document, "notify::modified", G_CALLBACK (title_notify_cb), self);
  g_signal_connect (self->document, "notify::path", G_CALLBACK (title_notify_cb), self);
  g_signal_connect_after (df_document_get_loops (self->document), "items-changed",
                          G_CALLBACK (loops_items_changed_cb), self);
  g_signal_connect (self->loops_panel, "selection-changed", G_CALLBACK (selection_changed_cb),
                    self);
  g_signal_connect (self->surface_panel, "spec-changed", G_CALLBACK (spec_changed_cb), self);
  g_signal_connect (self->view, "mesh-ready", G_CALLBACK (mesh_ready_cb), self);
  g_signal_connect (self->view, "gl-failed", G_CALLBACK (gl_failed_cb), self);
  _df_window_sync_title (self);
}
