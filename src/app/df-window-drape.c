/* df-window-drape.c: the main window's side of the woven-ply drape (issue 12): the action and
 * its key (Ctrl+Shift+W, "woven": Ctrl+Shift+D and Ctrl+Shift+I open GTK's inspector; M, L, G
 * and T are taken),
 * the menu item, the view's picks forwarded to the drape window while its "Pick the start"
 * is on and the Look tool is chosen, --drape (drape as typed once open) and --bench-drape (the
 * drag-to-redraw figure). The drape window itself is df-drape-window.c. */
#include <math.h>
#include <stdio.h>

#include "df-drape-window.h"
#include "df-loop-item.h"
#include "df-window-private.h"

/* Drag steps of the benchmark. */
#define BENCH_STEPS 24

typedef struct
{
  DfWindow  *window;
  GtkWidget *drape;        /* DfDrapeWindow, made on first use; destroyed with the window */
  /* --bench-drape */
  guint      bench_step;
  gint64     bench_t0;
  gboolean   bench_waiting_render;
  double     bench_centre[2], bench_radius[2];
  GArray    *bench_total_ms, *bench_worker_ms, *bench_core_ms;
  double     bench_final_ms;
  gulong     render_handler;
  /* The colouring before the drape window showed, given back when it hides. */
  gboolean   shading_saved;
  DfShading  shading_before;
} DrapeState;

static DrapeState *
state_of (DfWindow *self)
{
  return g_object_get_data (G_OBJECT (self), "df-drape");
}

static void
state_free (gpointer data)
{
  DrapeState *st = data;

  if (st->bench_total_ms != NULL)
    g_array_unref (st->bench_total_ms);
  if (st->bench_worker_ms != NULL)
    g_array_unref (st->bench_worker_ms);
  if (st->bench_core_ms != NULL)
    g_array_unref (st->bench_core_ms);
  g_free (st);
}

static void
picking_cb (gboolean on,
            gpointer user)
{
  DfWindow *self = user;

  /* Picking the start belongs to the Look tool, so no stroke or probe starts with it. */
  if (on && self->tool != DF_TOOL_LOOK)
    g_object_set (self, "tool", "look", NULL);
  if (self->tool == DF_TOOL_LOOK)
    df_surface_view_set_interaction (self->view, on ? DF_INTERACTION_PICK
                                                    : DF_INTERACTION_ORBIT);
}

/* The net is coloured by shear on the same blue-orange scale as the curvature: while the
 * drape window shows, the surface is drawn plain so that one scale means one thing. */
static void
drape_visible_cb (GObject    *object,
                  GParamSpec *pspec,
                  DfWindow   *self)
{
  DrapeState *st = state_of (self);

  if (gtk_widget_get_visible (GTK_WIDGET (object)))
    {
      if (!st->shading_saved)
        {
          st->shading_saved = TRUE;
          st->shading_before = self->shading;
        }
      g_object_set (self, "shading", _df_shading_to_string (DF_SHADING_PLAIN), NULL);
    }
  else if (st->shading_saved)
    {
      st->shading_saved = FALSE;
      if (self->shading == DF_SHADING_PLAIN)
        g_object_set (self, "shading", _df_shading_to_string (st->shading_before), NULL);
    }
}

static DfDrapeWindow *
drape_window (DfWindow *self)
{
  DrapeState *st = state_of (self);

  if (st->drape == NULL)
    {
      st->drape = df_drape_window_new (GTK_WINDOW (self), self->document, self->view,
                                       GTK_WIDGET (self->legend), self->startup.report_events);
      df_drape_window_set_picking_cb (DF_DRAPE_WINDOW (st->drape), picking_cb, self);
      g_signal_connect (st->drape, "notify::visible", G_CALLBACK (drape_visible_cb), self);
    }
  return DF_DRAPE_WINDOW (st->drape);
}

static void
drape_activated (GSimpleAction *action,
                 GVariant      *parameter,
                 gpointer       user_data)
{
  DfWindow *self = user_data;

  if (df_document_get_surface (self->document) == NULL)
    return;
  gtk_window_present (GTK_WINDOW (drape_window (self)));
}

static const GActionEntry drape_actions[] = {
  { "drape", drape_activated, NULL, NULL, NULL, { 0 } },
};

static gboolean
picking (DfWindow *self)
{
  DrapeState *st = state_of (self);

  return st->drape != NULL && self->tool == DF_TOOL_LOOK
         && df_drape_window_get_picking (DF_DRAPE_WINDOW (st->drape));
}

static void
surface_pressed_cb (DfSurfaceView *view,
                    double         u,
                    double         v,
                    DfWindow      *self)
{
  if (picking (self))
    df_drape_window_pick (DF_DRAPE_WINDOW (state_of (self)->drape), u, v, FALSE);
}

static void
surface_released_cb (DfSurfaceView *view,
                     double         u,
                     double         v,
                     DfWindow      *self)
{
  if (picking (self))
    df_drape_window_pick (DF_DRAPE_WINDOW (state_of (self)->drape), u, v, TRUE);
}

/* Another tool ends picking (that tool's own interaction stays). */
static void
tool_changed_cb (GObject    *object,
                 GParamSpec *pspec,
                 DfWindow   *self)
{
  DrapeState *st = state_of (self);

  if (st->drape != NULL && self->tool != DF_TOOL_LOOK
      && df_drape_window_get_picking (DF_DRAPE_WINDOW (st->drape)))
    df_drape_window_set_picking (DF_DRAPE_WINDOW (st->drape), FALSE);
}

/* ---- --bench-drape ------------------------------------------------------------------------ */

static int
compare_double (gconstpointer a,
                gconstpointer b)
{
  double x = *(const double *) a, y = *(const double *) b;

  return (x > y) - (x < y);
}

static double
median_of (GArray *values)
{
  g_array_sort (values, compare_double);
  return values->len == 0 ? NAN : values->len % 2
         ? g_array_index (values, double, values->len / 2)
         : 0.5 * (g_array_index (values, double, values->len / 2 - 1)
                  + g_array_index (values, double, values->len / 2));
}

static void bench_next (DfWindow *self);

static gboolean
bench_next_idle (gpointer data)
{
  bench_next (data);
  return G_SOURCE_REMOVE;
}

/* The first frame painted after a net landed ends that step: pick to net on screen. (The
 * frame clock's after-paint: the view's render handler stops the "render" emission.) */
static void
bench_after_paint_cb (GdkFrameClock *clock,
                      DfWindow      *self)
{
  DrapeState *st = state_of (self);

  if (st->bench_waiting_render)
    {
      double ms = (g_get_monotonic_time () - st->bench_t0) / 1000.0;

      st->bench_waiting_render = FALSE;
      if (st->bench_step <= BENCH_STEPS)
        g_array_append_val (st->bench_total_ms, ms);
      else
        st->bench_final_ms = ms;
      g_idle_add (bench_next_idle, self);
    }
}

static void
bench_shown_cb (gboolean final,
                double   drape_ms,
                double   ms,
                gpointer user)
{
  DfWindow *self = user;
  DrapeState *st = state_of (self);

  if (st->bench_step == 0)
    {
      /* The typed drape of --drape has landed: the drag starts from there. */
      g_idle_add (bench_next_idle, self);
      return;
    }
  if (st->bench_step >= 1 && st->bench_step <= BENCH_STEPS)
    {
      g_array_append_val (st->bench_worker_ms, ms);
      g_array_append_val (st->bench_core_ms, drape_ms);
    }
  st->bench_waiting_render = TRUE;
}

static void
bench_next (DfWindow *self)
{
  DrapeState *st = state_of (self);
  DfDrapeWindow *w = drape_window (self);
  double a;

  st->bench_step++;
  if (st->bench_step > BENCH_STEPS + 1)
    {
      GArray *worker = st->bench_worker_ms;
      double total_median = median_of (st->bench_total_ms);
      double total_max = g_array_index (st->bench_total_ms, double, st->bench_total_ms->len - 1);

      printf ("bench-drape: %u drag steps, pick to net on screen median %.1f ms (max %.1f ms), "
              "worker median %.1f ms (of which the core's drape %.1f ms, the rest the "
              "threads' vertices); release with the closure check %.1f ms\n",
              st->bench_total_ms->len, total_median, total_max, median_of (worker),
              median_of (st->bench_core_ms), st->bench_final_ms);
      fflush (stdout);
      g_signal_handler_disconnect (gtk_widget_get_frame_clock (GTK_WIDGET (self->view)),
                                   st->render_handler);
      g_application_quit (g_application_get_default ());
      return;
    }
  /* Round a small ellipse inside the ply, the way a hand drags the pin; then release. */
  a = 2 * G_PI * st->bench_step / BENCH_STEPS;
  st->bench_t0 = g_get_monotonic_time ();
  df_drape_window_pick (w, st->bench_centre[0] + st->bench_radius[0] * sin (a),
                        st->bench_centre[1] + st->bench_radius[1] * (1 - cos (a)),
                        st->bench_step > BENCH_STEPS);
}

static void
bench_start (DfWindow *self,
             DfLoopItem *item)
{
  DrapeState *st = state_of (self);
  const double (*uv)[2];
  double lo[2] = { G_MAXDOUBLE, G_MAXDOUBLE }, hi[2] = { -G_MAXDOUBLE, -G_MAXDOUBLE };
  gsize n = 0;

  uv = df_loop_item_get_points (item, &n);
  for (gsize k = 0; k < n; k++)
    for (int c = 0; c < 2; c++)
      {
        lo[c] = MIN (lo[c], uv[k][c]);
        hi[c] = MAX (hi[c], uv[k][c]);
      }
  for (int c = 0; c < 2; c++)
    {
      st->bench_centre[c] = 0.5 * (lo[c] + hi[c]);
      st->bench_radius[c] = 0.05 * (hi[c] - lo[c]);
    }
  st->bench_total_ms = g_array_new (FALSE, FALSE, sizeof (double));
  st->bench_worker_ms = g_array_new (FALSE, FALSE, sizeof (double));
  st->bench_core_ms = g_array_new (FALSE, FALSE, sizeof (double));
  st->render_handler = g_signal_connect (gtk_widget_get_frame_clock (GTK_WIDGET (self->view)),
                                         "after-paint", G_CALLBACK (bench_after_paint_cb),
                                         self);
  df_drape_window_set_shown_cb (drape_window (self), bench_shown_cb, self);
  /* With --drape its job is running: start when it lands (bench_shown_cb), not beside it. */
  if (self->startup.drape == NULL)
    bench_next (self);
}

/* ---- start-up ----------------------------------------------------------------------------- */

/* --drape "LOOP;U;V;WARP;CELL" once the view has a mesh (the window and its fields are then
 * up, as for a user), and --bench-drape after it. */
static void
mesh_ready_cb (DfSurfaceView *view,
               DfWindow      *self)
{
  g_auto(GStrv) parts = NULL;
  DfDrapeWindow *w;

  g_signal_handlers_disconnect_by_func (view, mesh_ready_cb, self);
  w = drape_window (self);
  gtk_window_present (GTK_WINDOW (w));
  if (self->startup.drape != NULL)
    {
      parts = g_strsplit (self->startup.drape, ";", -1);
      if (g_strv_length (parts) != 5)
        {
          g_printerr ("driftframe: --drape: expected LOOP;U;V;WARP;CELL, got '%s'\n",
                      self->startup.drape);
          return;
        }
      if (!df_drape_window_set_typed (w, parts[0], parts[1], parts[2], parts[3], parts[4]))
        return;
    }
  if (self->startup.bench_drape)
    {
      GListModel *loops = df_document_get_loops (self->document);
      g_autoptr(DfLoopItem) item = NULL;

      if (parts != NULL)
        {
          for (guint k = 0; k < g_list_model_get_n_items (loops) && item == NULL; k++)
            {
              g_autoptr(DfLoopItem) it = g_list_model_get_item (loops, k);

              if (g_strcmp0 (df_loop_item_get_name (it), parts[0]) == 0)
                item = g_steal_pointer (&it);
            }
        }
      else if (g_list_model_get_n_items (loops) > 0)
        item = g_list_model_get_item (loops, 0);
      if (item == NULL)
        {
          g_printerr ("driftframe: --bench-drape: the project has no loop to drape\n");
          g_application_quit (g_application_get_default ());
          return;
        }
      bench_start (self, item);
    }
}

void
_df_window_drape_start (DfWindow *self)
{
  if (self->startup.drape != NULL || self->startup.bench_drape)
    g_signal_connect (self->view, "mesh-ready", G_CALLBACK (mesh_ready_cb), self);
}

static void
add_menu_item (DfWindow *self)
{
  GMenuModel *model = gtk_menu_button_get_menu_model (self->primary_menu_button);
  g_autoptr(GMenu) section = g_menu_new ();
  g_autoptr(GMenuItem) item = g_menu_item_new ("Woven-Ply Drape…", "win.drape");

  if (!G_IS_MENU (model))
    return;
  g_menu_item_set_attribute (item, "accel", "s", "<Control><Shift>w");
  g_menu_append_item (section, item);
  g_menu_insert_section (G_MENU (model), MIN (4, g_menu_model_get_n_items (model)), NULL,
                         G_MENU_MODEL (section));
}

void
_df_window_drape_init (DfWindow *self)
{
  DrapeState *st = g_new0 (DrapeState, 1);
  GtkEventController *shortcuts = gtk_shortcut_controller_new ();

  st->window = self;
  g_object_set_data_full (G_OBJECT (self), "df-drape", st, state_free);
  g_action_map_add_action_entries (G_ACTION_MAP (self), drape_actions,
                                   G_N_ELEMENTS (drape_actions), self);
  gtk_shortcut_controller_set_scope (GTK_SHORTCUT_CONTROLLER (shortcuts),
                                     GTK_SHORTCUT_SCOPE_GLOBAL);
  gtk_shortcut_controller_add_shortcut (GTK_SHORTCUT_CONTROLLER (shortcuts),
                                        gtk_shortcut_new (gtk_shortcut_trigger_parse_string
                                                            ("<Control><Shift>w"),
                                                          gtk_named_action_new ("win.drape")));
  gtk_widget_add_controller (GTK_WIDGET (self), shortcuts);
  add_menu_item (self);
  g_signal_connect (self->view, "surface-pressed", G_CALLBACK (surface_pressed_cb), self);
  g_signal_connect (self->view, "surface-dragged", G_CALLBACK (surface_pressed_cb), self);
  g_signal_connect (self->view, "surface-released", G_CALLBACK (surface_released_cb), self);
  g_signal_connect (self, "notify::tool", G_CALLBACK (tool_changed_cb), self);
}
