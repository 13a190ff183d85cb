/* df-window-decide.c: DfWindow's decisions layer: every measured loop is checked against the
 * project's limits on a worker thread (df-verdict-work.c) whenever the loop or the limits
 * change; the stretches beyond a limit are marked on the curve in the view by a pattern per
 * limit (dashes for the steering radius, ticks on the left for the fibre deviation, on the
 * right for slip; never colour alone); the actions and menu
 * entries of the limits editor and the gore tool; and, for test drivers, "verdict LOOP LIMIT
 * within|exceeded" lines. Computes no geometry: the dash and tick positions come from the
 * check's samples. */
#include "df-window-private.h"
#include "df-window-decide.h"

#include <math.h>
#include <stdio.h>

#include "df-devmap-window.h"
#include "df-document-limits.h"
#include "df-gore-dialog.h"
#include "df-limits-dialog.h"
#include "df-loop-verdicts.h"

/* Curve ids of the marks: far above the loops' and the tools' (df-window-private.h), a block
 * of MARKS_PER_LOOP per loop. */
#define MARK_BASE 3000000u
#define MARKS_PER_LOOP 1024u

typedef struct
{
  DfWindow   *window;        /* borrowed: owns this */
  char       *limits_text;   /* the limits last checked against */
  GHashTable *mark_counts;   /* loop id -> marks drawn (GUINT_TO_POINTER) */
  GtkWidget  *devmap;        /* DfDevmapWindow, made on first use; destroyed with the window */
} DecideState;

static void
decide_state_free (gpointer data)
{
  DecideState *st = data;

  g_free (st->limits_text);
  g_hash_table_unref (st->mark_counts);
  g_free (st);
}

static DecideState *
state_of (DfWindow *self)
{
  return g_object_get_data (G_OBJECT (self), "df-decide");
}

static gboolean
any_limit (const df_limits *limits)
{
  for (int i = 0; limits != NULL && i < DF_N_LIMITS; i++)
    if (limits->item[i].set)
      return TRUE;
  return FALSE;
}

static void
remove_marks (DfWindow   *self,
              DecideState *st,
              guint       loop_id)
{
  guint n = GPOINTER_TO_UINT (g_hash_table_lookup (st->mark_counts, GUINT_TO_POINTER (loop_id)));

  for (guint k = 0; k < n; k++)
    df_surface_view_remove_curve (self->view, MARK_BASE + loop_id * MARKS_PER_LOOP + k);
  g_hash_table_remove (st->mark_counts, GUINT_TO_POINTER (loop_id));
}

/* A sample lifted off the surface along its normal by lift, so that the marks lie over the
 * loop's own line instead of fighting it for depth. */
static void
lifted (const DfLoopCheck *c,
        gsize              i,
        double             lift,
        double             out[3])
{
  for (int k = 0; k < 3; k++)
    out[k] = c->xyz[i][k] + lift * c->normal[i][k];
}

/* How a limit's stretches are marked: each its own pattern, so that where two overlap both
 * still read, and none depends on colour. */
typedef enum
{
  MARK_DASHES,       /* steering radius: dashes along the curve */
  MARK_TICKS_LEFT,   /* fibre deviation: ticks on the left of the direction of travel */
  MARK_TICKS_RIGHT   /* slip (friction): ticks on the right */
} MarkStyle;

static MarkStyle
style_of (df_limit_id id)
{
  switch (id)
    {
    case DF_LIMIT_MAX_FIBRE_DEVIATION:
      return MARK_TICKS_LEFT;
    case DF_LIMIT_FRICTION:
      return MARK_TICKS_RIGHT;
    case DF_LIMIT_MIN_STEERING_RADIUS:
    default:
      return MARK_DASHES;
    }
}

/* A short tick from the curve at sample i: along N x T (left) or its opposite, T from the
 * neighbouring samples; both sides when side is 0. */
static gboolean
tick_at (DfWindow          *self,
         const DfLoopCheck *c,
         gsize              i,
         double             half,
         int                side_sign,
         double             lift,
         guint              id,
         const GdkRGBA     *colour)
{
  gsize a = i > 0 ? i - 1 : i, b = i + 1 < c->n ? i + 1 : i;
  double t[3], side[3], p[3], seg[2][3], len_s = 0;
  const double *nrm = c->normal[i];

  for (int k = 0; k < 3; k++)
    t[k] = c->xyz[b][k] - c->xyz[a][k];
  side[0] = nrm[1] * t[2] - nrm[2] * t[1];
  side[1] = nrm[2] * t[0] - nrm[0] * t[2];
  side[2] = nrm[0] * t[1] - nrm[1] * t[0];
  for (int k = 0; k < 3; k++)
    len_s += side[k] * side[k];
  if (!(len_s > 0))
    return FALSE;
  len_s = sqrt (len_s);
  lifted (c, i, lift, p);
  for (int k = 0; k < 3; k++)
    {
      double d = half * side[k] / len_s;

      seg[0][k] = side_sign == 0 ? p[k] - d : p[k];
      seg[1][k] = side_sign == 0 ? p[k] + d : p[k] + 2 * side_sign * d;
    }
  df_surface_view_set_curve (self->view, id, (const double (*)[3]) seg, 2, FALSE, colour, 3.0f);
  return TRUE;
}

/* A mark drawn twice: a white halo, and the ink a little nearer the eye (so it wins the depth
 * test), so that it reads over dark frames and light colouring alike. Uses two ids. */
static guint
tick_twice (DfWindow          *self,
            const DfLoopCheck *c,
            gsize              i,
            double             half,
            int                side_sign,
            double             lift,
            guint              id)
{
  const GdkRGBA halo = { 1, 1, 1, 0.9 }, ink = { 0.05, 0.05, 0.05, 1 };

  if (!tick_at (self, c, i, half, side_sign, lift, id, &halo))
    return 0;
  tick_at (self, c, i, half, side_sign, 1.6 * lift, id + 1, &ink);
  return 2;
}

static guint
dash_twice (DfWindow          *self,
            const DfLoopCheck *c,
            GArray            *samples,   /* of gsize */
            double             lift,
            guint              id)
{
  const GdkRGBA halo = { 1, 1, 1, 0.9 }, ink = { 0.05, 0.05, 0.05, 1 };
  g_autofree double (*pts)[3] = g_malloc_n (samples->len, sizeof *pts);

  for (int pass = 0; pass < 2; pass++)
    {
      for (guint k = 0; k < samples->len; k++)
        lifted (c, g_array_index (samples, gsize, k), pass == 0 ? lift : 1.6 * lift, pts[k]);
      df_surface_view_set_curve (self->view, id + pass, (const double (*)[3]) pts, samples->len,
                                 FALSE, pass == 0 ? &halo : &ink, pass == 0 ? 7.0f : 4.0f);
    }
  return 2;
}

/* Marks along [s0, s1] (through the start when s0 > s1) in the limit's pattern; dashes get a
 * tick across the curve at each end. Returns the curve ids used. */
static guint
mark_stretch (DfWindow          *self,
              const DfLoopCheck *c,
              double             s0,
              double             s1,
              MarkStyle          style,
              guint              first_id,
              guint              room)
{
  double dash = c->length / 90, lift = c->length / 400, tick = c->length / 70;
  gboolean wraps = s0 > s1;
  GArray *piece = g_array_new (FALSE, FALSE, sizeof (gsize));
  guint used = 0;
  gsize i_first = G_MAXSIZE, i_last = G_MAXSIZE;
  double along_first = G_MAXDOUBLE, along_last = -1, next_tick = 0;

  for (gsize i = 0; i < c->n && used + 6 < room; i++)
    {
      double s = c->s[i];
      gboolean inside = wraps ? (s >= s0 || s <= s1) : (s >= s0 && s <= s1);
      /* Arc length along the stretch, continuous through the start. */
      double along = wraps ? (s >= s0 ? s - s0 : s + (c->length - s0)) : s - s0;
      gboolean on = inside && style == MARK_DASHES && fmod (along, 2 * dash) < dash;

      /* The stretch's first and last samples, in its own order (through the start). */
      if (inside && along < along_first)
        {
          along_first = along;
          i_first = i;
        }
      if (inside && along > along_last)
        {
          along_last = along;
          i_last = i;
        }
      if (inside && style != MARK_DASHES && along >= next_tick)
        {
          next_tick = along + 2 * dash;
          used += tick_twice (self, c, i, tick / 2, style == MARK_TICKS_LEFT ? 1 : -1, lift,
                              first_id + used);
        }
      if (on)
        g_array_append_val (piece, i);
      if ((!on || i + 1 == c->n) && piece->len >= 2)
        used += dash_twice (self, c, piece, lift, first_id + used);
      if (!on)
        g_array_set_size (piece, 0);
    }
  g_array_unref (piece);
  if (style == MARK_DASHES && i_first != G_MAXSIZE && used + 4 <= room)
    {
      used += tick_twice (self, c, i_first, tick, 0, lift, first_id + used);
      used += tick_twice (self, c, i_last, tick, 0, lift, first_id + used);
    }
  return used;
}

static void
draw_marks (DfWindow   *self,
            DfLoopItem *item)
{
  DecideState *st = state_of (self);
  const DfLoopCheck *c = df_loop_verdicts_get_check (df_loop_verdicts_get (item));
  guint id = df_loop_item_get_id (item), used = 0;

  if (st == NULL)
    return;
  remove_marks (self, st, id);
  if (c == NULL || c->n < 2)
    return;
  for (gsize k = 0; k < c->list.n; k++)
    {
      const df_verdict *v = &c->list.items[k];

      if (v->within || v->region)
        continue;
      used += mark_stretch (self, c, v->has_where ? v->s0 : 0,
                            v->has_where ? v->s1 : c->length, style_of (v->limit),
                            MARK_BASE + id * MARKS_PER_LOOP + used, MARKS_PER_LOOP - used);
    }
  g_hash_table_insert (st->mark_counts, GUINT_TO_POINTER (id), GUINT_TO_POINTER (used));
}

/* The open curves' marks use the blocks of pseudo loop ids from here on, far above any real
 * loop's id (the ids stay within a guint: MARK_BASE + id * MARKS_PER_LOOP). */
#define OPEN_MARKS_ID 4000000u

void
_df_window_decide_mark_open_curve (DfWindow               *self,
                                   DfOpenMarks             which,
                                   const double           *s,
                                   const double          (*xyz)[3],
                                   const double          (*normal)[3],
                                   gsize                   n,
                                   double                  length,
                                   const df_verdict_list  *list)
{
  DecideState *st = state_of (self);
  guint id = OPEN_MARKS_ID + (guint) which, used = 0;
  /* A check of the loops' shape over the caller's arrays (borrowed, never freed here). */
  DfLoopCheck c = { 0 };

  if (st == NULL)
    return;
  remove_marks (self, st, id);
  if (list == NULL || list->n_exceeded == 0 || n < 2 || !(length > 0))
    return;
  c.n = n;
  c.length = length;
  c.s = (double *) s;
  c.xyz = (double (*)[3]) xyz;
  c.normal = (double (*)[3]) normal;
  for (gsize k = 0; k < list->n; k++)
    {
      const df_verdict *v = &list->items[k];

      if (v->within || v->region)
        continue;
      used += mark_stretch (self, &c, v->has_where ? v->s0 : 0, v->has_where ? v->s1 : length,
                            style_of (v->limit), MARK_BASE + id * MARKS_PER_LOOP + used,
                            MARKS_PER_LOOP - used);
    }
  g_hash_table_insert (st->mark_counts, GUINT_TO_POINTER (id), GUINT_TO_POINTER (used));
}

/* One line per limit checked: exceeded when any of its stretches is. */
static void
report_verdicts (DfWindow   *self,
                 DfLoopItem *item)
{
  DfLoopVerdicts *verdicts = df_loop_verdicts_get (item);
  const DfLoopCheck *c = df_loop_verdicts_get_check (verdicts);
  g_autofree char *name = g_strdelimit (g_strdup (df_loop_item_get_name (item)), " ", '_');
  gboolean seen[DF_N_LIMITS] = { FALSE }, exceeded[DF_N_LIMITS] = { FALSE };

  if (!self->startup.report_events)
    return;
  if (c == NULL)
    {
      if (df_loop_verdicts_get_state (verdicts) == DF_VERDICTS_FAILED)
        printf ("verdict-failed %s %s\n", name, df_loop_verdicts_get_error (verdicts));
      fflush (stdout);
      return;
    }
  for (gsize k = 0; k < c->list.n; k++)
    {
      seen[c->list.items[k].limit] = TRUE;
      exceeded[c->list.items[k].limit] |= !c->list.items[k].within;
    }
  for (int i = 0; i < DF_N_LIMITS; i++)
    if (seen[i])
      printf ("verdict %s %s %s\n", name, df_limit_key ((df_limit_id) i),
              exceeded[i] ? "exceeded" : "within");
  fflush (stdout);
}

typedef struct
{
  DfWindow   *window;
  DfLoopItem *item;
} CheckJob;

static void
check_done_cb (GObject      *source,
               GAsyncResult *result,
               gpointer      user_data)
{
  CheckJob *job = user_data;
  g_autoptr(GError) error = NULL;
  DfLoopCheck *check = df_work_check_loop_finish (result, &error);
  DfLoopVerdicts *verdicts = df_loop_verdicts_get (job->item);

  if (check != NULL)
    df_loop_verdicts_set_check (verdicts, check);
  else if (!g_error_matches (error, G_IO_ERROR, G_IO_ERROR_CANCELLED))
    df_loop_verdicts_set_failed (verdicts, error->message);
  if (check != NULL || !g_error_matches (error, G_IO_ERROR, G_IO_ERROR_CANCELLED))
    {
      draw_marks (job->window, job->item);
      report_verdicts (job->window, job->item);
    }
  g_object_unref (job->window);
  g_object_unref (job->item);
  g_free (job);
}

static void
check_item (DfWindow   *self,
            DfLoopItem *item)
{
  DfLoopVerdicts *verdicts = df_loop_verdicts_get (item);
  const df_limits *limits = df_document_get_limits (self->document);
  const df_surface *surface = df_document_get_surface (self->document);
  GCancellable *cancellable = df_loop_verdicts_restart (verdicts);
  const double (*uv)[2];
  CheckJob *job;
  gsize n;

  if (df_loop_item_get_state (item) != DF_LOOP_MEASURED || !any_limit (limits) || surface == NULL)
    {
      if (df_loop_verdicts_get_state (verdicts) != DF_VERDICTS_NONE)
        df_loop_verdicts_set_none (verdicts);
      draw_marks (self, item);
      return;
    }
  df_loop_verdicts_set_pending (verdicts);
  uv = df_loop_item_get_points (item, &n);
  job = g_new0 (CheckJob, 1);
  job->window = g_object_ref (self);
  job->item = g_object_ref (item);
  df_work_check_loop_async (surface, uv, n, limits, df_loop_item_get_drape (item), cancellable,
                            check_done_cb, job);
}

static void
check_all (DfWindow *self)
{
  GListModel *loops = df_document_get_loops (self->document);

  for (guint i = 0; i < g_list_model_get_n_items (loops); i++)
    {
      g_autoptr(DfLoopItem) item = g_list_model_get_item (loops, i);

      check_item (self, item);
    }
}

static void
loop_changed_cb (DfDocument *document,
                 DfLoopItem *item,
                 DfWindow   *self)
{
  check_item (self, item);
}

/* Every edit, undo and load says "changed": the limits are compared by their file text. */
static void
document_changed_cb (DfDocument *document,
                     DfWindow   *self)
{
  DecideState *st = state_of (self);
  g_autofree char *text = df_document_limits_text (document);

  if (st == NULL || g_strcmp0 (text, st->limits_text) == 0)
    return;
  g_free (st->limits_text);
  st->limits_text = g_steal_pointer (&text);
  check_all (self);
}

/* A loop removed: its marks go with it. The view's loop curves are redrawn by the sync code;
 * ours are redrawn for every loop still there. */
static void
loops_items_changed_cb (GListModel *model,
                        guint       position,
                        guint       removed,
                        guint       added,
                        DfWindow   *self)
{
  DecideState *st = state_of (self);
  g_autoptr(GList) ids = NULL;

  if (st == NULL || removed == 0)
    return;
  ids = g_hash_table_get_keys (st->mark_counts);
  for (GList *l = ids; l != NULL; l = l->next)
    remove_marks (self, st, GPOINTER_TO_UINT (l->data));
  for (guint i = 0; i < g_list_model_get_n_items (model); i++)
    {
      g_autoptr(DfLoopItem) item = g_list_model_get_item (model, i);

      draw_marks (self, item);
    }
}

static void
edit_limits_activated (GSimpleAction *action,
                       GVariant      *parameter,
                       gpointer       user_data)
{
  DfWindow *self = user_data;

  df_limits_dialog_present (GTK_WINDOW (self), self->document);
}

static void
gore_tool_activated (GSimpleAction *action,
                     GVariant      *parameter,
                     gpointer       user_data)
{
  DfWindow *self = user_data;

  df_gore_dialog_present (GTK_WINDOW (self), self->document, self->startup.report_events);
}

static void
devmap_activated (GSimpleAction *action,
                  GVariant      *parameter,
                  gpointer       user_data)
{
  DfWindow *self = user_data;
  DecideState *st = state_of (self);

  if (df_document_get_surface (self->document) == NULL)
    return;
  if (st->devmap == NULL)
    st->devmap = df_devmap_window_new (GTK_WINDOW (self), self->document, self->view,
                                       GTK_WIDGET (self->legend),
                                       self->startup.report_events);
  gtk_window_present (GTK_WINDOW (st->devmap));
}

static const GActionEntry decide_actions[] = {
  { "devmap", devmap_activated, NULL, NULL, NULL, { 0 } },
  { "edit-limits", edit_limits_activated, NULL, NULL, NULL, { 0 } },
  { "gore-tool", gore_tool_activated, NULL, NULL, NULL, { 0 } },
};

static void
add_shortcut (GtkShortcutController *controller,
              const char            *trigger,
              const char            *action)
{
  gtk_shortcut_controller_add_shortcut (controller,
                                        gtk_shortcut_new (gtk_shortcut_trigger_parse_string (trigger),
                                                          gtk_named_action_new (action)));
}

/* A menu section of its own after the file exports, so the template stays as it is. */
static void
add_menu_section (DfWindow *self)
{
  GMenuModel *model = gtk_menu_button_get_menu_model (self->primary_menu_button);
  g_autoptr(GMenu) section = g_menu_new ();
  g_autoptr(GMenuItem) limits = g_menu_item_new ("Material and Process Limits…",
                                                 "win.edit-limits");
  g_autoptr(GMenuItem) gores = g_menu_item_new ("Gore Pattern…", "win.gore-tool");
  g_autoptr(GMenuItem) devmap = g_menu_item_new ("Developability Map…", "win.devmap");

  if (!G_IS_MENU (model))
    return;
  g_menu_item_set_attribute (limits, "accel", "s", "<Control><Shift>l");
  g_menu_item_set_attribute (gores, "accel", "s", "<Control><Shift>g");
  g_menu_append_item (section, limits);
  g_menu_append_item (section, gores);
  g_menu_item_set_attribute (devmap, "accel", "s", "<Control><Shift>m");
  g_menu_append_item (section, devmap);
  g_menu_insert_section (G_MENU (model), MIN (3, g_menu_model_get_n_items (model)), NULL,
                         G_MENU_MODEL (section));
}

void
_df_window_decide_init (DfWindow *self)
{
  DecideState *st = g_new0 (DecideState, 1);
  GtkEventController *shortcuts = gtk_shortcut_controller_new ();

  st->window = self;
  st->mark_counts = g_hash_table_new (NULL, NULL);
  st->limits_text = df_document_limits_text (self->document);
  g_object_set_data_full (G_OBJECT (self), "df-decide", st, decide_state_free);
  g_action_map_add_action_entries (G_ACTION_MAP (self), decide_actions,
                                   G_N_ELEMENTS (decide_actions), self);
  gtk_shortcut_controller_set_scope (GTK_SHORTCUT_CONTROLLER (shortcuts), GTK_SHORTCUT_SCOPE_GLOBAL);
  add_shortcut (GTK_SHORTCUT_CONTROLLER (shortcuts), "<Control><Shift>l", "win.edit-limits");
  add_shortcut (GTK_SHORTCUT_CONTROLLER (shortcuts), "<Control><Shift>g", "win.gore-tool");
  add_shortcut (GTK_SHORTCUT_CONTROLLER (shortcuts), "<Control><Shift>m", "win.devmap");
  gtk_widget_add_controller (GTK_WIDGET (self), shortcuts);
  add_menu_section (self);
  /* Connected with the window as data: its dispose disconnects everything of the document's
   * that names the window. */
  g_signal_connect (self->document, "loop-changed", G_CALLBACK (loop_changed_cb), self);
  g_signal_connect (self->document, "changed", G_CALLBACK (document_changed_cb), self);
  g_signal_connect_after (df_document_get_loops (self->document), "items-changed",
                          G_CALLBACK (loops_items_changed_cb), self);
}
