/* df-drape-window.c: the woven-ply drape's window (see df-drape-window.h). The drape itself is
 * the core's, run by df-drape-job.c; the wording is df-drape-text.c's; the flat pattern is
 * drawn by df-flat-pattern-view.c and the net by the view (df-surface-view-net.c). While the
 * start pin is dragged at most one job runs: a pick that comes meanwhile waits, replaced by
 * any later one, and starts when the running job lands (the core call cannot be stopped
 * half-way, and its result is still worth showing: the net follows the pointer). */
#include "df-document-units.h"
#include "df-export-chooser.h"
#include "df-labels.h"
#include "df-drape-window-private.h"

#include <math.h>
#include <stdio.h>

#include "df-devmap-legend.h"
#include "df-drape-job.h"
#include "df-drape-out.h"
#include "df-drape-text.h"
#include "df-flat-pattern-view.h"
#include "df-format.h"
#include "df-loop-item.h"

G_DEFINE_FINAL_TYPE (DfDrapeWindow, df_drape_window, GTK_TYPE_WINDOW)

void
_df_drape_window_set_status (DfDrapeWindow *self,
                             const char    *text,
                             gboolean       error)
{
  gtk_label_set_text (GTK_LABEL (self->status), text);
  if (error)
    gtk_widget_add_css_class (self->status, "df-error");
  else
    gtk_widget_remove_css_class (self->status, "df-error");
}

static gboolean
is_revolution (DfDrapeWindow *self)
{
  const df_surface *s = df_document_get_surface (self->document);

  return s != NULL && df_surface_get_kind (s) == DF_SURFACE_REVOLUTION;
}

/* The chart's names and the units beside the fields (they change with the surface). */
static void
update_labels (DfDrapeWindow *self)
{
  const char *un, *vn;
  g_autofree char *u = NULL;
  g_autofree char *v = NULL;
  g_autofree char *hint = NULL;

  DfDisplayUnits du;

  df_document_get_display_units (self->document, &du);
  df_drape_text_chart_names (df_document_get_surface (self->document), &un, &vn);
  /* The start is typed as the chart is shown: t in its own unit (when the surface says it),
   * φ in degrees, a graph's x, y (its plan) in the display unit. */
  if (is_revolution (self))
    {
      u = du.t_unit[0] != '\0' ? g_strdup_printf ("Start %s (%s)", un, du.t_unit)
                               : g_strdup_printf ("Start %s", un);
      v = g_strdup_printf ("Start %s (°)", vn);
    }
  else
    {
      u = g_strdup_printf ("Start %s (%s)", un, df_du_length_unit (&du));
      v = g_strdup_printf ("Start %s (%s)", vn, df_du_length_unit (&du));
    }
  hint = g_strdup_printf ("0° = along +%s, anticlockwise about N; the weft at +90°", un);
  gtk_label_set_text (GTK_LABEL (self->u_label), u);
  gtk_label_set_text (GTK_LABEL (self->v_label), v);
  gtk_label_set_text (GTK_LABEL (self->warp_hint), hint);
  /* The cell is typed in the display unit, as `drape --units` takes --cell. */
  gtk_label_set_text (GTK_LABEL (self->cell_units), df_du_length_unit (&du));
}

DfLoopItem *
_df_drape_window_chosen_loop (DfDrapeWindow *self)
{
  GListModel *loops = df_document_get_loops (self->document);
  guint k = gtk_drop_down_get_selected (GTK_DROP_DOWN (self->loop));
  g_autoptr(DfLoopItem) item = NULL;

  if (k == GTK_INVALID_LIST_POSITION || k >= g_list_model_get_n_items (loops))
    return NULL;
  item = g_list_model_get_item (loops, k);
  return item;   /* the list keeps it alive */
}

static void
refresh_names (DfDrapeWindow *self)
{
  GListModel *loops = df_document_get_loops (self->document);
  guint n = g_list_model_get_n_items (loops);
  guint old = g_list_model_get_n_items (G_LIST_MODEL (self->names));
  guint keep = gtk_drop_down_get_selected (GTK_DROP_DOWN (self->loop));
  g_autoptr(GPtrArray) names = g_ptr_array_new_with_free_func (g_free);

  for (guint k = 0; k < n; k++)
    {
      g_autoptr(DfLoopItem) item = g_list_model_get_item (loops, k);

      g_ptr_array_add (names, g_strdup (df_loop_item_get_name (item)));
    }
  g_ptr_array_add (names, NULL);
  gtk_string_list_splice (self->names, 0, old, (const char *const *) names->pdata);
  if (n > 0)
    gtk_drop_down_set_selected (GTK_DROP_DOWN (self->loop), keep < n ? keep : 0);
}

static gboolean
parse_field (GtkWidget  *entry,
             const char *what,
             double     *out,
             GString    *problems)
{
  const char *text = gtk_editable_get_text (GTK_EDITABLE (entry));
  char *end = NULL;
  double x = g_ascii_strtod (text, &end);

  while (end != NULL && g_ascii_isspace (*end))
    end++;
  if (end == text || *end != '\0' || !isfinite (x))
    {
      g_string_append_printf (problems, "%s%s: '%s' is not a number", problems->len ? "; " : "",
                              what, text);
      return FALSE;
    }
  *out = x;
  return TRUE;
}

static void
set_number (GtkWidget *entry,
            double     x)
{
  char buf[G_ASCII_DTOSTR_BUF_SIZE];

  gtk_editable_set_text (GTK_EDITABLE (entry), g_ascii_formatd (buf, sizeof buf, "%.10g", x));
}

static void
show_legend (DfDrapeWindow *self,
             gboolean       on)
{
  if (self->legend != NULL)
    gtk_widget_set_visible (self->legend, on);
}

static void
clear_result (DfDrapeWindow *self)
{
  df_surface_view_set_net (self->view, NULL, 0);
  df_flat_pattern_view_set (DF_FLAT_PATTERN_VIEW (self->flat), NULL, NULL);
  g_clear_pointer (&self->result, df_drape_result_free);
  gtk_label_set_text (GTK_LABEL (self->figures), "");
  gtk_label_set_text (GTK_LABEL (self->flags), "");
  show_legend (self, FALSE);
  gtk_widget_set_sensitive (self->svg, FALSE);
  gtk_widget_set_sensitive (self->pins, FALSE);
  gtk_widget_set_sensitive (self->outline, FALSE);
  gtk_widget_set_sensitive (self->keep, FALSE);
}

static void
show_result (DfDrapeWindow *self,
             DfDrapeResult *r,
             gboolean       final)
{
  const df_surface *surface = df_document_get_surface (self->document);
  const df_limits *limits = df_document_get_limits (self->document);
  const df_limit *shear = limits != NULL ? &limits->item[DF_LIMIT_MAX_SHEAR] : NULL;
  const df_drape_summary *s = df_drape_get_summary (r->drape);
  DfDisplayUnits du;
  g_autofree char *figures = NULL;
  g_autofree char *flags = NULL;
  gboolean has_limit = shear != NULL && shear->set;

  df_document_get_display_units (self->document, &du);
  flags = df_drape_text_flags (r, surface, &du, limits);
  figures = df_drape_text_figures (r, surface, &du, final);
  /* The flat view borrows the drape: hand it the new one before freeing the old. */
  df_surface_view_set_net (self->view, r->net, r->n_net);
  df_flat_pattern_view_set (DF_FLAT_PATTERN_VIEW (self->flat), r->drape, &du);
  df_drape_result_free (self->result);
  self->result = r;
  self->result_final = final;
  gtk_label_set_text (GTK_LABEL (self->figures), figures);
  gtk_label_set_text (GTK_LABEL (self->flags), flags);
  df_devmap_legend_set (DF_DEVMAP_LEGEND (self->legend),
                        has_limit ? "Drape shear, 90° − crossing angle\n(+ closes); × past "
                                    "the limit" : "Drape shear, 90° − crossing angle (+ closes)",
                        "°",
                        r->range_deg, has_limit ? shear->model_value : 0,
                        has_limit ? shear->source : NULL);
  show_legend (self, TRUE);
  gtk_widget_set_sensitive (self->svg, TRUE);
  gtk_widget_set_sensitive (self->pins, TRUE);
  gtk_widget_set_sensitive (self->outline, TRUE);
  gtk_widget_set_sensitive (self->keep, final);
  _df_drape_window_set_status (self, final ? "Draped."
                                           : "Dragging: release to check every cell's closure.",
                               FALSE);
  if (final && self->report_events)
    {
      printf ("drape-start %.17g %.17g\n", self->start[0], self->start[1]);
      printf ("draped %zu %.17g %.17g %zu\n", s->n_cells, s->max_shear_rad * DEG,
              s->enclosed_curvature_rad, s->n_cells_over_limit);
      if (has_limit)
        printf ("drape-flags %zu %.17g\n", s->n_cells_over_limit,
                r->has_worst ? r->worst_shear_rad * DEG : 0.0);
      fflush (stdout);
    }
  if (self->shown_cb != NULL)
    self->shown_cb (final, r->drape_ms, r->elapsed_ms, self->shown_user);
}

static void start_job (DfDrapeWindow *self, double u, double v, gboolean final);
static void prefer_drapable (DfDrapeWindow *self);

static void
job_done_cb (GObject      *source,
             GAsyncResult *result,
             gpointer      user_data)
{
  DfDrapeWindow *self = user_data;   /* a reference */
  g_autoptr(GError) error = NULL;
  DfDrapeResult *r = df_drape_job_finish (result, &error);
  gboolean final = self->running_final;

  if (self->document == NULL || g_error_matches (error, G_IO_ERROR, G_IO_ERROR_CANCELLED))
    {
      /* Disposed, or the surface changed meanwhile. */
      df_drape_result_free (r);
      if (self->document != NULL)
        self->running = FALSE;
      g_object_unref (self);
      return;
    }
  self->running = FALSE;
  if (r != NULL)
    show_result (self, r, final);
  else
    {
      _df_drape_window_set_status (self, error->message, TRUE);
      if (final && self->report_events)
        {
          printf ("drape-failed %s\n", error->message);
          fflush (stdout);
        }
    }
  if (self->pending)
    {
      self->pending = FALSE;
      start_job (self, self->pending_uv[0], self->pending_uv[1], self->pending_final);
    }
  g_object_unref (self);
}

static void
start_job (DfDrapeWindow *self,
           double         u,
           double         v,
           gboolean       final)
{
  const df_surface *surface = df_document_get_surface (self->document);
  const df_limits *limits = df_document_get_limits (self->document);
  DfLoopItem *item = _df_drape_window_chosen_loop (self);
  g_autoptr(GString) problems = g_string_new (NULL);
  const double (*uv)[2];
  double warp = 0, cell = 0;
  df_drape_options opt;
  gsize n = 0;
  DfDisplayUnits du;

  if (self->running)
    {
      self->pending = TRUE;
      self->pending_uv[0] = u;
      self->pending_uv[1] = v;
      self->pending_final = final;
      return;
    }
  if (surface == NULL || item == NULL)
    {
      _df_drape_window_set_status (self, surface == NULL ? "No surface."
                                         : "Choose a loop as the ply outline (sketch or import "
                                           "one first).", TRUE);
      return;
    }
  df_document_get_display_units (self->document, &du);
  parse_field (self->warp, "Warp angle", &warp, problems);
  if (parse_field (self->cell, "Cell size", &cell, problems) && !(cell > 0))
    g_string_append_printf (problems, "%sCell size: must be positive (in %s)",
                            problems->len ? "; " : "", df_du_length_unit (&du));
  cell = df_du_to_model (&du, cell);
  if (problems->len > 0)
    {
      _df_drape_window_set_status (self, problems->str, TRUE);
      if (final && self->report_events)
        {
          printf ("drape-failed %s\n", problems->str);
          fflush (stdout);
        }
      return;
    }
  uv = df_loop_item_get_points (item, &n);
  df_drape_options_init (&opt);
  opt.warp_rad = warp / DEG;
  opt.cell = cell;
  opt.check_closure = final;
  if (limits != NULL && limits->item[DF_LIMIT_MAX_SHEAR].set)
    opt.max_shear_rad = limits->item[DF_LIMIT_MAX_SHEAR].model_value / DEG;
  if (limits != NULL && limits->item[DF_LIMIT_MAX_FIBRE_DEVIATION].set)
    opt.max_fibre_deviation_rad = limits->item[DF_LIMIT_MAX_FIBRE_DEVIATION].model_value / DEG;
  self->start[0] = u;
  self->start[1] = v;
  self->have_start = TRUE;
  self->running = TRUE;
  if (self->cancellable == NULL)
    self->cancellable = g_cancellable_new ();
  _df_drape_window_set_status (self, "Draping…", FALSE);
  self->running_final = final;
  df_drape_job_start (surface, uv, n, u, v, &opt, self->cancellable, job_done_cb,
                      g_object_ref (self));
}

/* The start as typed: (u, v) in the chart (φ typed in degrees). */
static gboolean
typed_start (DfDrapeWindow *self,
             double         uv[2])
{
  g_autoptr(GString) problems = g_string_new (NULL);
  const char *un, *vn;

  df_drape_text_chart_names (df_document_get_surface (self->document), &un, &vn);
  parse_field (self->start_u, un, &uv[0], problems);
  parse_field (self->start_v, vn, &uv[1], problems);
  if (problems->len > 0)
    {
      g_string_prepend (problems, "Start: ");
      _df_drape_window_set_status (self, problems->str, TRUE);
      if (self->report_events)
        {
          printf ("drape-failed %s\n", problems->str);
          fflush (stdout);
        }
      return FALSE;
    }
  if (is_revolution (self))
    uv[1] /= DEG;
  else
    {
      /* A graph's plan, typed in the display unit like every length shown. */
      DfDisplayUnits du;

      df_document_get_display_units (self->document, &du);
      uv[0] = df_du_to_model (&du, uv[0]);
      uv[1] = df_du_to_model (&du, uv[1]);
    }
  return TRUE;
}

static void
run_cb (GtkButton     *button,
        DfDrapeWindow *self)
{
  double uv[2];

  if (typed_start (self, uv))
    start_job (self, uv[0], uv[1], TRUE);
}

static void
clear_cb (GtkButton     *button,
          DfDrapeWindow *self)
{
  self->pending = FALSE;
  clear_result (self);
  _df_drape_window_set_status (self, "", FALSE);
}

static void
fill_start (DfDrapeWindow *self,
            double         u,
            double         v)
{
  DfDisplayUnits du;

  df_document_get_display_units (self->document, &du);
  if (is_revolution (self))
    {
      set_number (self->start_u, u);
      set_number (self->start_v, remainder (v, 2 * G_PI) * DEG);
    }
  else
    {
      set_number (self->start_u, df_du_length (&du, u));
      set_number (self->start_v, df_du_length (&du, v));
    }
}

/* A first guess for a loop just chosen: the mean of its chart points as the start (inside a
 * convex outline; the user moves it) and a cell a fortieth of its length, rounded. */
static void
guess_values (DfDrapeWindow *self)
{
  DfLoopItem *item = _df_drape_window_chosen_loop (self);
  const df_loop_result *r;
  const double (*uv)[2];
  double mean[2] = { 0, 0 }, length = 0;
  gsize n = 0;

  if (item == NULL)
    return;
  uv = df_loop_item_get_points (item, &n);
  for (gsize k = 0; k < n; k++)
    {
      mean[0] += uv[k][0] / n;
      mean[1] += uv[k][1] / n;
    }
  if (n > 0)
    fill_start (self, mean[0], mean[1]);
  r = df_loop_item_get_result (item);
  if (r != NULL)
    length = r->length;
  else if (df_document_get_surface (self->document) != NULL)
    length = df_surface_size (df_document_get_surface (self->document));
  if (length > 0 && isfinite (length))
    {
      DfDisplayUnits du;
      double target, p;

      /* Rounded in the unit the field is typed in. */
      df_document_get_display_units (self->document, &du);
      target = df_du_length (&du, length / 40);
      p = pow (10, floor (log10 (target)));

      set_number (self->cell, target >= 5 * p ? 5 * p : target >= 2 * p ? 2 * p : p);
    }
}

static void
loop_selected_cb (GObject       *object,
                  GParamSpec    *pspec,
                  DfDrapeWindow *self)
{
  clear_result (self);
  guess_values (self);
}

static void
pick_toggled_cb (GtkToggleButton *button,
                 DfDrapeWindow   *self)
{
  gboolean on = gtk_toggle_button_get_active (button);

  /* The main window switches the view between orbiting and picking (it knows the tool). */
  if (self->picking_cb != NULL)
    self->picking_cb (on, self->picking_user);
  _df_drape_window_set_status (self, on ? "Click on the surface inside the ply for the start "
                                           "pin; drag to move it (the net follows)." : "",
                               FALSE);
}

/* A new surface makes the drape stale; jobs still running are dropped when they land. */
static void
surface_changed_cb (DfDocument    *document,
                    DfDrapeWindow *self)
{
  if (self->cancellable != NULL)
    g_cancellable_cancel (self->cancellable);
  g_clear_object (&self->cancellable);
  self->running = self->pending = FALSE;
  clear_result (self);
  update_labels (self);
  _df_drape_window_set_status (self, "The surface changed: drape again.", FALSE);
  if (self->report_events)
    {
      printf ("drape-cleared surface\n");
      fflush (stdout);
    }
}

/* The cell typed stays the same length, written in the new unit (the "changed" that follows
 * re-runs a shown drape, whose figures then read in it). */
static void
units_changed_cb (DfDocument    *document,
                  DfDrapeWindow *self)
{
  g_autoptr(GString) problems = g_string_new (NULL);
  DfDisplayUnits du;
  double cell = 0;

  df_document_get_display_units (document, &du);
  if (parse_field (self->cell, "Cell size", &cell, problems) && cell > 0)
    set_number (self->cell, df_du_length (&du, df_du_to_model (&self->du, cell)));
  /* A graph's start is a plan point in the display unit too. */
  for (int k = 0; k < 2 && !is_revolution (self); k++)
    {
      GtkWidget *field = k == 0 ? self->start_u : self->start_v;
      double x = 0;

      if (parse_field (field, "Start", &x, problems))
        set_number (field, df_du_length (&du, df_du_to_model (&self->du, x)));
    }
  df_document_get_display_units (document, &self->du);
  update_labels (self);
}

/* Any edit (the limits, the loop's points, its name): the list again, and a shown drape is
 * re-run with what it was asked, so its flags follow the limits. */
static void
document_changed_cb (DfDocument    *document,
                     DfDrapeWindow *self)
{
  if (g_list_model_get_n_items (G_LIST_MODEL (self->names))
      != g_list_model_get_n_items (df_document_get_loops (document)))
    return;   /* items-changed refreshes the list and clears */
  /* A renamed loop: the names again, the choice kept. */
  g_signal_handlers_block_by_func (self->loop, loop_selected_cb, self);
  refresh_names (self);
  g_signal_handlers_unblock_by_func (self->loop, loop_selected_cb, self);
  if (self->result != NULL && self->have_start && self->result_final)
    start_job (self, self->start[0], self->start[1], TRUE);
}

static void
loops_changed_cb (GListModel    *loops,
                  guint          position,
                  guint          removed,
                  guint          added,
                  DfDrapeWindow *self)
{
  g_signal_handlers_block_by_func (self->loop, loop_selected_cb, self);
  refresh_names (self);
  g_signal_handlers_unblock_by_func (self->loop, loop_selected_cb, self);
  if (removed > 0 || added > 0)
    {
      clear_result (self);
      if (gtk_editable_get_text (GTK_EDITABLE (self->start_u))[0] == '\0')
        guess_values (self);
    }
}

/* Closing hides the window: its net and legend go with it. */
static gboolean
close_request_cb (GtkWindow     *window,
                  DfDrapeWindow *self)
{
  gtk_toggle_button_set_active (GTK_TOGGLE_BUTTON (self->pick), FALSE);
  self->pending = FALSE;
  clear_result (self);
  return FALSE;
}

static void
df_drape_window_dispose (GObject *object)
{
  DfDrapeWindow *self = DF_DRAPE_WINDOW (object);

  if (self->cancellable != NULL)
    g_cancellable_cancel (self->cancellable);
  g_clear_object (&self->cancellable);
  if (self->document != NULL)
    {
      g_signal_handlers_disconnect_by_data (self->document, self);
      g_signal_handlers_disconnect_by_data (df_document_get_loops (self->document), self);
    }
  if (self->view != NULL)
    df_surface_view_set_net (self->view, NULL, 0);
  if (self->flat != NULL)
    df_flat_pattern_view_set (DF_FLAT_PATTERN_VIEW (self->flat), NULL, NULL);
  if (self->legend != NULL)
    {
      /* Held by a reference of ours: the overlay may have gone first (the main window closing). */
      GtkWidget *overlay = gtk_widget_get_parent (self->legend);

      if (GTK_IS_OVERLAY (overlay))
        gtk_overlay_remove_overlay (GTK_OVERLAY (overlay), self->legend);
      g_clear_object (&self->legend);
    }
  g_clear_object (&self->document);
  g_clear_object (&self->view);
  g_clear_object (&self->names);
  G_OBJECT_CLASS (df_drape_window_parent_class)->dispose (object);
}

static void
df_drape_window_finalize (GObject *object)
{
  DfDrapeWindow *self = DF_DRAPE_WINDOW (object);

  df_drape_result_free (self->result);
  G_OBJECT_CLASS (df_drape_window_parent_class)->finalize (object);
}

static void
df_drape_window_class_init (DfDrapeWindowClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);

  object_class->dispose = df_drape_window_dispose;
  object_class->finalize = df_drape_window_finalize;
}

/* A wrapping note that also keeps its width (the window's column stays put as texts change). */
static GtkWidget *
wrapped (const char *text,
         const char *css,
         int         chars)
{
  GtkWidget *label = df_label_wrapped (text, css, chars);

  gtk_label_set_width_chars (GTK_LABEL (label), chars);
  return label;
}

static GtkWidget *
number_entry (void)
{
  GtkWidget *entry = gtk_entry_new ();

  gtk_editable_set_width_chars (GTK_EDITABLE (entry), 12);
  gtk_entry_set_activates_default (GTK_ENTRY (entry), TRUE);
  return entry;
}

static void
df_drape_window_init (DfDrapeWindow *self)
{
  GtkWidget *outer = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 12);
  GtkWidget *box = gtk_box_new (GTK_ORIENTATION_VERTICAL, 8);
  GtkWidget *right = gtk_box_new (GTK_ORIENTATION_VERTICAL, 8);
  GtkWidget *grid = gtk_grid_new ();
  GtkWidget *buttons = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 6);
  GtkWidget *exports = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 6);
  GtkWidget *header = gtk_header_bar_new ();
  GtkWidget *scroll = gtk_scrolled_window_new ();

  gtk_window_set_title (GTK_WINDOW (self), "Woven-Ply Drape");
  gtk_window_set_titlebar (GTK_WINDOW (self), header);
  gtk_window_set_hide_on_close (GTK_WINDOW (self), TRUE);
  gtk_window_set_default_size (GTK_WINDOW (self), 860, 600);
  gtk_widget_set_margin_top (outer, 12);
  gtk_widget_set_margin_bottom (outer, 12);
  gtk_widget_set_margin_start (outer, 12);
  gtk_widget_set_margin_end (outer, 12);
  gtk_box_append (GTK_BOX (box), wrapped ("Lays a woven ply over a loop as a pin-jointed net: "
                                          "inextensible warp and weft pinned where they cross, "
                                          "every cell a rhombus of side h; the warp and weft "
                                          "through the start pin follow geodesics.", NULL, 44));
  self->names = gtk_string_list_new (NULL);
  self->loop = gtk_drop_down_new (G_LIST_MODEL (g_object_ref (self->names)), NULL);
  self->start_u = number_entry ();
  self->start_v = number_entry ();
  self->warp = number_entry ();
  gtk_editable_set_text (GTK_EDITABLE (self->warp), "0");
  self->cell = number_entry ();
  self->u_label = df_label_field ("Start _u", self->start_u);
  self->v_label = df_label_field ("Start _v", self->start_v);
  self->warp_hint = gtk_label_new ("");
  gtk_label_set_xalign (GTK_LABEL (self->warp_hint), 0);
  gtk_widget_add_css_class (self->warp_hint, "dim-label");
  self->cell_units = gtk_label_new ("");
  gtk_label_set_xalign (GTK_LABEL (self->cell_units), 0);
  gtk_grid_set_row_spacing (GTK_GRID (grid), 6);
  gtk_grid_set_column_spacing (GTK_GRID (grid), 8);
  gtk_grid_attach (GTK_GRID (grid), df_label_field ("_Ply (loop)", self->loop), 0, 0, 1, 1);
  gtk_grid_attach (GTK_GRID (grid), self->loop, 1, 0, 2, 1);
  gtk_grid_attach (GTK_GRID (grid), self->u_label, 0, 1, 1, 1);
  gtk_grid_attach (GTK_GRID (grid), self->start_u, 1, 1, 1, 1);
  gtk_grid_attach (GTK_GRID (grid), self->v_label, 0, 2, 1, 1);
  gtk_grid_attach (GTK_GRID (grid), self->start_v, 1, 2, 1, 1);
  gtk_grid_attach (GTK_GRID (grid), df_label_field ("_Warp angle (°)", self->warp), 0, 3, 1, 1);
  gtk_grid_attach (GTK_GRID (grid), self->warp, 1, 3, 1, 1);
  gtk_grid_attach (GTK_GRID (grid), self->warp_hint, 0, 4, 3, 1);
  gtk_grid_attach (GTK_GRID (grid), df_label_field ("_Cell size h", self->cell), 0, 5, 1, 1);
  gtk_grid_attach (GTK_GRID (grid), self->cell, 1, 5, 1, 1);
  gtk_grid_attach (GTK_GRID (grid), self->cell_units, 2, 5, 1, 1);
  gtk_box_append (GTK_BOX (box), grid);
  self->pick = gtk_toggle_button_new_with_mnemonic ("P_ick the start on the surface");
  gtk_widget_set_tooltip_text (self->pick, "Click inside the ply in the view; drag to move the "
                               "start pin and the net follows");
  gtk_box_append (GTK_BOX (box), self->pick);
  self->run = gtk_button_new_with_mnemonic ("_Drape");
  gtk_widget_add_css_class (self->run, "suggested-action");
  self->clear = gtk_button_new_with_mnemonic ("C_lear");
  self->keep = gtk_button_new_with_mnemonic ("_Keep for the shear check");
  gtk_widget_set_tooltip_text (self->keep, "Check this loop against the locking angle with this "
                               "drape (start, warp, cell) instead of the defaults: the loop's "
                               "details and `driftframe-cli check` then use it");
  gtk_widget_set_sensitive (self->keep, FALSE);
  gtk_box_append (GTK_BOX (buttons), self->run);
  gtk_box_append (GTK_BOX (buttons), self->clear);
  gtk_box_append (GTK_BOX (buttons), self->keep);
  gtk_box_append (GTK_BOX (box), buttons);
  self->status = wrapped ("", NULL, 44);
  gtk_box_append (GTK_BOX (box), self->status);
  /* The flags against the limits first: they are what the result decides. */
  self->flags = wrapped ("", NULL, 44);
  gtk_label_set_selectable (GTK_LABEL (self->flags), TRUE);
  gtk_box_append (GTK_BOX (box), self->flags);
  self->figures = wrapped ("", NULL, 44);
  gtk_label_set_selectable (GTK_LABEL (self->figures), TRUE);
  gtk_box_append (GTK_BOX (box), self->figures);
  gtk_scrolled_window_set_policy (GTK_SCROLLED_WINDOW (scroll), GTK_POLICY_NEVER,
                                  GTK_POLICY_AUTOMATIC);
  gtk_scrolled_window_set_child (GTK_SCROLLED_WINDOW (scroll), box);
  gtk_widget_set_vexpand (scroll, TRUE);
  gtk_box_append (GTK_BOX (outer), scroll);

  self->flat = df_flat_pattern_view_new ();
  gtk_widget_set_hexpand (self->flat, TRUE);
  gtk_widget_set_vexpand (self->flat, TRUE);
  gtk_box_append (GTK_BOX (right), self->flat);
  self->svg = gtk_button_new_with_mnemonic ("Export _SVG…");
  gtk_widget_set_tooltip_text (self->svg, "The flat pattern at true scale: cut outline, thread "
                               "lattice, cells past the locking angle");
  self->pins = gtk_button_new_with_mnemonic ("Export pi_ns CSV…");
  gtk_widget_set_tooltip_text (self->pins, "Every pin: indices, chart and space point, shear, "
                               "warp deviation, flat position");
  self->outline = gtk_button_new_with_mnemonic ("Export flat _outline CSV…");
  gtk_widget_set_tooltip_text (self->outline, "The ply outline on the flat fabric");
  gtk_box_append (GTK_BOX (exports), self->svg);
  gtk_box_append (GTK_BOX (exports), self->pins);
  gtk_box_append (GTK_BOX (exports), self->outline);
  gtk_box_append (GTK_BOX (right), exports);
  gtk_box_append (GTK_BOX (right), wrapped ("Caution. " DF_DRAPE_CAUTION, "df-caution", 60));
  gtk_box_append (GTK_BOX (outer), right);
  gtk_window_set_child (GTK_WINDOW (self), outer);
  gtk_window_set_default_widget (GTK_WINDOW (self), self->run);

  g_signal_connect (self->run, "clicked", G_CALLBACK (run_cb), self);
  g_signal_connect (self->clear, "clicked", G_CALLBACK (clear_cb), self);
  g_signal_connect (self->keep, "clicked", G_CALLBACK (_df_drape_window_keep_cb), self);
  g_signal_connect (self->pick, "toggled", G_CALLBACK (pick_toggled_cb), self);
  g_signal_connect (self->svg, "clicked", G_CALLBACK (_df_drape_window_export_cb), self);
  g_signal_connect (self->pins, "clicked", G_CALLBACK (_df_drape_window_export_cb), self);
  g_signal_connect (self->outline, "clicked", G_CALLBACK (_df_drape_window_export_cb), self);
  g_signal_connect (self->loop, "notify::selected", G_CALLBACK (loop_selected_cb), self);
  g_signal_connect (self, "close-request", G_CALLBACK (close_request_cb), self);
  gtk_widget_set_sensitive (self->svg, FALSE);
  gtk_widget_set_sensitive (self->pins, FALSE);
  gtk_widget_set_sensitive (self->outline, FALSE);
}

GtkWidget *
df_drape_window_new (GtkWindow     *parent,
                     DfDocument    *document,
                     DfSurfaceView *view,
                     GtkWidget     *view_legend,
                     gboolean       report_events)
{
  DfDrapeWindow *self;
  GtkWidget *overlay = view_legend != NULL ? gtk_widget_get_parent (view_legend) : NULL;

  g_return_val_if_fail (DF_IS_DOCUMENT (document), NULL);
  self = g_object_new (DF_TYPE_DRAPE_WINDOW, "transient-for", parent,
                       "destroy-with-parent", TRUE, NULL);
  self->document = g_object_ref (document);
  df_document_get_display_units (document, &self->du);
  self->view = g_object_ref (view);
  self->report_events = report_events;
  self->legend = g_object_ref_sink (df_devmap_legend_new ());
  /* Bottom left: the view's own legend and the map's sit on the right. */
  gtk_widget_set_halign (self->legend, GTK_ALIGN_START);
  gtk_widget_set_valign (self->legend, GTK_ALIGN_END);
  gtk_widget_set_margin_start (self->legend, 12);
  gtk_widget_set_margin_bottom (self->legend, 12);
  gtk_widget_set_visible (self->legend, FALSE);
  if (GTK_IS_OVERLAY (overlay))
    gtk_overlay_add_overlay (GTK_OVERLAY (overlay), self->legend);
  g_signal_handlers_block_by_func (self->loop, loop_selected_cb, self);
  refresh_names (self);
  prefer_drapable (self);
  g_signal_handlers_unblock_by_func (self->loop, loop_selected_cb, self);
  update_labels (self);
  guess_values (self);
  g_signal_connect (document, "surface-changed", G_CALLBACK (surface_changed_cb), self);
  g_signal_connect (document, "changed", G_CALLBACK (document_changed_cb), self);
  g_signal_connect (document, "units-changed", G_CALLBACK (units_changed_cb), self);
  g_signal_connect_after (df_document_get_loops (document), "items-changed",
                          G_CALLBACK (loops_changed_cb), self);
  return GTK_WIDGET (self);
}

/* The first loop that bounds a disc and does not wind round the axis (a band round a shade
 * cannot be draped), when the loops are measured already. */
static void
prefer_drapable (DfDrapeWindow *self)
{
  GListModel *loops = df_document_get_loops (self->document);

  for (guint k = 0; k < g_list_model_get_n_items (loops); k++)
    {
      g_autoptr(DfLoopItem) item = g_list_model_get_item (loops, k);
      const df_loop_result *r = df_loop_item_get_result (item);

      if (r != NULL && r->bounds_disc && r->axis_winding == 0)
        {
          gtk_drop_down_set_selected (GTK_DROP_DOWN (self->loop), k);
          return;
        }
    }
}

gboolean
df_drape_window_get_picking (DfDrapeWindow *self)
{
  g_return_val_if_fail (DF_IS_DRAPE_WINDOW (self), FALSE);
  return gtk_widget_get_visible (GTK_WIDGET (self))
         && gtk_toggle_button_get_active (GTK_TOGGLE_BUTTON (self->pick));
}

void
df_drape_window_set_picking (DfDrapeWindow *self,
                             gboolean       on)
{
  g_return_if_fail (DF_IS_DRAPE_WINDOW (self));
  gtk_toggle_button_set_active (GTK_TOGGLE_BUTTON (self->pick), on);
}

void
df_drape_window_pick (DfDrapeWindow *self,
                      double         u,
                      double         v,
                      gboolean       final)
{
  g_return_if_fail (DF_IS_DRAPE_WINDOW (self));
  fill_start (self, u, v);
  start_job (self, u, v, final);
}

/* Selects the loop named name; FALSE when there is none. */
static gboolean
select_loop (DfDrapeWindow *self,
             const char    *name)
{
  GListModel *loops = df_document_get_loops (self->document);

  for (guint k = 0; k < g_list_model_get_n_items (loops); k++)
    {
      g_autoptr(DfLoopItem) item = g_list_model_get_item (loops, k);

      if (g_strcmp0 (df_loop_item_get_name (item), name) == 0)
        {
          gtk_drop_down_set_selected (GTK_DROP_DOWN (self->loop), k);
          return TRUE;
        }
    }
  return FALSE;
}

gboolean
df_drape_window_set_typed (DfDrapeWindow *self,
                           const char    *loop_name,
                           const char    *start_u,
                           const char    *start_v,
                           const char    *warp_deg,
                           const char    *cell)
{
  g_return_val_if_fail (DF_IS_DRAPE_WINDOW (self), FALSE);
  if (!select_loop (self, loop_name))
    {
      g_autofree char *msg = g_strdup_printf ("No loop is named '%s'.", loop_name);

      _df_drape_window_set_status (self, msg, TRUE);
      if (self->report_events)
        {
          printf ("drape-failed %s\n", msg);
          fflush (stdout);
        }
      return FALSE;
    }
  gtk_editable_set_text (GTK_EDITABLE (self->start_u), start_u);
  gtk_editable_set_text (GTK_EDITABLE (self->start_v), start_v);
  gtk_editable_set_text (GTK_EDITABLE (self->warp), warp_deg);
  gtk_editable_set_text (GTK_EDITABLE (self->cell), cell);
  run_cb (NULL, self);
  return TRUE;
}

void
df_drape_window_set_shown_cb (DfDrapeWindow *self,
                              void         (*cb) (gboolean final, double drape_ms, double ms,
                                                  gpointer user),
                              gpointer       user)
{
  g_return_if_fail (DF_IS_DRAPE_WINDOW (self));
  self->shown_cb = cb;
  self->shown_user = user;
}

void
df_drape_window_set_picking_cb (DfDrapeWindow *self,
                                void         (*cb) (gboolean on, gpointer user),
                                gpointer       user)
{
  g_return_if_fail (DF_IS_DRAPE_WINDOW (self));
  self->picking_cb = cb;
  self->picking_user = user;
}
