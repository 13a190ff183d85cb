/* df-window.c: DfWindow's type: template, properties behind the stateful actions, startup
 * (what to open first, one-shot exports and benchmark), and closing with unsaved changes.
 * Actions are in df-window-actions.c, files in df-window-files.c, remembered state in
 * df-window-state.c, document-to-view sync in df-window-sync.c, tools in df-window-tools.c. */
#include "df-window-data.h"
#include "df-window-private.h"
#include "df-window-decide.h"

#include <stdio.h>

#ifdef GDK_WINDOWING_X11
#include <gdk/x11/gdkx.h>
#endif

G_DEFINE_FINAL_TYPE (DfWindow, df_window, GTK_TYPE_APPLICATION_WINDOW)

enum
{
  PROP_0,
  PROP_TOOL,
  PROP_SHADING,
  PROP_ISO_LINES,
  PROP_LOOP_FRAMES,
  N_PROPS
};

static GParamSpec *properties[N_PROPS];

/* Frames of the orbit benchmark: one full turn. */
#define DF_BENCH_FRAMES 240

void
df_startup_clear (DfStartup *startup)
{
  g_clear_pointer (&startup->file, g_free);
  g_clear_pointer (&startup->import_data, g_free);
  g_clear_pointer (&startup->preset, g_free);
  g_clear_pointer (&startup->tool, g_free);
  g_clear_pointer (&startup->view, g_free);
  g_clear_pointer (&startup->shading, g_free);
  g_clear_pointer (&startup->units, g_free);
  g_clear_pointer (&startup->export_samples, g_free);
  g_clear_pointer (&startup->export_summary, g_free);
  g_clear_pointer (&startup->export_png, g_free);
  g_clear_pointer (&startup->export_report, g_free);
  g_clear_pointer (&startup->drape, g_free);
  startup->demo = FALSE;
  startup->bench_orbit = FALSE;
  startup->report_view = FALSE;
  startup->report_events = FALSE;
}

static gboolean
is_one_shot (DfWindow *self)
{
  return self->startup.export_samples != NULL || self->startup.export_summary != NULL
         || self->startup.export_png != NULL || self->startup.export_report != NULL
         || self->startup.bench_orbit;
}

static void
df_window_get_property (GObject    *object,
                        guint       prop_id,
                        GValue     *value,
                        GParamSpec *pspec)
{
  DfWindow *self = DF_WINDOW (object);

  switch (prop_id)
    {
    case PROP_TOOL:
      g_value_set_string (value, _df_tool_to_string (self->tool));
      break;
    case PROP_SHADING:
      g_value_set_string (value, _df_shading_to_string (self->shading));
      break;
    case PROP_ISO_LINES:
      g_value_set_boolean (value, self->iso_lines);
      break;
    case PROP_LOOP_FRAMES:
      {
        /* Also asked while the template is being built or torn down. */
        DfLoopItem *item = self->loops_panel != NULL
                             ? df_loops_panel_get_selected (self->loops_panel) : NULL;
        g_value_set_boolean (value, item != NULL && df_loop_item_get_show_frames (item));
      }
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
    }
}

static void
df_window_set_property (GObject      *object,
                        guint         prop_id,
                        const GValue *value,
                        GParamSpec   *pspec)
{
  DfWindow *self = DF_WINDOW (object);

  switch (prop_id)
    {
    case PROP_TOOL:
      {
        DfTool tool;

        if (_df_tool_from_string (g_value_get_string (value), &tool) && tool != self->tool)
          {
            _df_window_set_tool (self, tool);
            g_object_notify_by_pspec (object, pspec);
          }
      }
      break;
    case PROP_SHADING:
      {
        DfShading shading;

        if (_df_shading_from_string (g_value_get_string (value), &shading)
            && shading != self->shading)
          {
            self->shading = shading;
            df_surface_view_set_shading (self->view, shading);
            _df_window_sync_legend (self);
            g_object_notify_by_pspec (object, pspec);
          }
      }
      break;
    case PROP_ISO_LINES:
      if (self->iso_lines != g_value_get_boolean (value))
        {
          self->iso_lines = g_value_get_boolean (value);
          df_surface_view_set_iso_lines (self->view, self->iso_lines);
          g_object_notify_by_pspec (object, pspec);
        }
      break;
    case PROP_LOOP_FRAMES:
      {
        DfLoopItem *item = df_loops_panel_get_selected (self->loops_panel);

        if (item != NULL && df_loop_item_get_show_frames (item) != g_value_get_boolean (value))
          {
            df_document_set_loop_frames (self->document, item, g_value_get_boolean (value));
            g_object_notify_by_pspec (object, pspec);
          }
      }
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
    }
}

static void
close_confirmed (DfWindow *self)
{
  _df_window_state_save (self);
  gtk_window_destroy (GTK_WINDOW (self));
}

static gboolean
df_window_close_request (GtkWindow *window)
{
  DfWindow *self = DF_WINDOW (window);

  /* One-shot runs (exports, benchmark) never ask: nobody is there to answer. */
  if (!is_one_shot (self) && df_document_get_modified (self->document))
    {
      _df_window_confirm_discard (self, G_CALLBACK (close_confirmed), "closing");
      return TRUE;
    }
  if (!is_one_shot (self))
    _df_window_state_save (self);
  return GTK_WINDOW_CLASS (df_window_parent_class)->close_request (window);
}

static void
df_window_dispose (GObject *object)
{
  DfWindow *self = DF_WINDOW (object);

  g_clear_handle_id (&self->status_timeout_id, g_source_remove);
  g_clear_handle_id (&self->export_idle_id, g_source_remove);
  /* Children emit signals while they are torn down: stop listening first. */
  if (self->loops_panel != NULL)
    {
      g_signal_handlers_disconnect_by_data (self->loops_panel, self);
      df_loops_panel_set_document (self->loops_panel, NULL);
    }
  if (self->surface_panel != NULL)
    g_signal_handlers_disconnect_by_data (self->surface_panel, self);
  if (self->view != NULL)
    g_signal_handlers_disconnect_by_data (self->view, self);
  if (self->document != NULL)
    {
      g_signal_handlers_disconnect_by_data (self->document, self);
      g_signal_handlers_disconnect_by_data (df_document_get_loops (self->document), self);
    }
  _df_window_tools_finalize (self);
  _df_window_data_finalize (self);
  /* Only a window that is torn down cleanly gets here: a crash or a kill leaves the autosave
   * for the next start. */
  _df_window_autosave_finish (self);
  g_clear_object (&self->document);
  gtk_widget_dispose_template (GTK_WIDGET (self), DF_TYPE_WINDOW);
  G_OBJECT_CLASS (df_window_parent_class)->dispose (object);
}

static void
df_window_finalize (GObject *object)
{
  DfWindow *self = DF_WINDOW (object);

  df_startup_clear (&self->startup);
  g_strfreev (self->recent);
  g_free (self->report_paper);
  g_free (self->shown_shape);
  g_free (self->selected_name);
  G_OBJECT_CLASS (df_window_parent_class)->finalize (object);
}

static void
df_window_class_init (DfWindowClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);
  GtkWindowClass *window_class = GTK_WINDOW_CLASS (klass);

  object_class->dispose = df_window_dispose;
  object_class->finalize = df_window_finalize;
  object_class->get_property = df_window_get_property;
  object_class->set_property = df_window_set_property;
  window_class->close_request = df_window_close_request;

  /* These back the stateful actions win.tool, win.shading, win.iso-lines, win.loop-frames. */
  properties[PROP_TOOL] =
    g_param_spec_string ("tool", NULL, NULL, "look",
                         G_PARAM_READWRITE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  properties[PROP_SHADING] =
    g_param_spec_string ("shading", NULL, NULL, "gaussian",
                         G_PARAM_READWRITE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  properties[PROP_ISO_LINES] =
    g_param_spec_boolean ("iso-lines", NULL, NULL, TRUE,
                          G_PARAM_READWRITE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  properties[PROP_LOOP_FRAMES] =
    g_param_spec_boolean ("loop-frames", NULL, NULL, FALSE,
                          G_PARAM_READWRITE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  g_object_class_install_properties (object_class, N_PROPS, properties);

  g_type_ensure (DF_TYPE_SURFACE_VIEW);
  g_type_ensure (DF_TYPE_LEGEND_BAR);
  g_type_ensure (DF_TYPE_SURFACE_PANEL);
  g_type_ensure (DF_TYPE_LOOPS_PANEL);
  g_type_ensure (DF_TYPE_PROBE_PANEL);
  g_type_ensure (DF_TYPE_GEODESIC_PANEL);
  g_type_ensure (DF_TYPE_COMPARE_PANEL);

  gtk_widget_class_set_template_from_resource (widget_class,
                                               "/org/driftframe/Driftframe/ui/df-window.ui");
  gtk_widget_class_bind_template_child (widget_class, DfWindow, paned);
  gtk_widget_class_bind_template_child (widget_class, DfWindow, view);
  gtk_widget_class_bind_template_child (widget_class, DfWindow, legend);
  gtk_widget_class_bind_template_child (widget_class, DfWindow, panel_stack);
  gtk_widget_class_bind_template_child (widget_class, DfWindow, surface_panel);
  gtk_widget_class_bind_template_child (widget_class, DfWindow, loops_panel);
  gtk_widget_class_bind_template_child (widget_class, DfWindow, probe_panel);
  gtk_widget_class_bind_template_child (widget_class, DfWindow, geodesic_panel);
  gtk_widget_class_bind_template_child (widget_class, DfWindow, compare_panel);
  gtk_widget_class_bind_template_child (widget_class, DfWindow, title_label);
  gtk_widget_class_bind_template_child (widget_class, DfWindow, subtitle_label);
  gtk_widget_class_bind_template_child (widget_class, DfWindow, status_icon);
  gtk_widget_class_bind_template_child (widget_class, DfWindow, status_label);
  gtk_widget_class_bind_template_child (widget_class, DfWindow, coords_label);
  gtk_widget_class_bind_template_child (widget_class, DfWindow, primary_menu_button);
  gtk_widget_class_bind_template_child_full (widget_class, "recent_submenu", FALSE,
                                             G_STRUCT_OFFSET (DfWindow, recent_menu));

  _df_window_actions_class_init (widget_class);
  _df_window_data_class_init (widget_class);
}

static void
df_window_init (DfWindow *self)
{
  gtk_widget_init_template (GTK_WIDGET (self));

  self->document = df_document_new ();
  self->tool = DF_TOOL_LOOK;
  self->shading = DF_SHADING_GAUSSIAN;
  self->iso_lines = TRUE;
  df_surface_view_set_shading (self->view, self->shading);
  df_surface_view_set_iso_lines (self->view, self->iso_lines);
  df_loops_panel_set_document (self->loops_panel, self->document);

  _df_window_sync_init (self);
  _df_window_tools_init (self);
  _df_window_data_init (self);
  _df_window_decide_init (self);
  _df_window_drape_init (self);
  _df_window_units_init (self);
  _df_window_actions_update (self);
  /* The menus read these actions' states while the template was built, before the fields
   * above were set: tell them, or the colouring radio and the iso-lines check start wrong. */
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_SHADING]);
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_ISO_LINES]);
}

DfWindow *
df_window_new (GtkApplication *application)
{
  return g_object_new (DF_TYPE_WINDOW, "application", application, NULL);
}

static void
bench_done_cb (double   median_ms,
               double   p95_ms,
               double   work_ms,
               gpointer user_data)
{
  DfWindow *self = user_data;

  printf ("orbit benchmark: %d frames, median %.2f ms, 95th percentile %.2f ms per frame; "
          "making a frame took %.2f ms (median), the rest is the frame clock's wait\n",
          DF_BENCH_FRAMES, median_ms, p95_ms, work_ms);
  fflush (stdout);
  gtk_window_destroy (GTK_WINDOW (self));
  g_object_unref (self);
}

/* Prints where the view lies in the toplevel's X window, so a test driver can aim xdotool
 * at the surface: "view-geometry XID X Y WIDTH HEIGHT" in pixels. */
static void
report_view (DfWindow *self)
{
  GtkNative *native = gtk_widget_get_native (GTK_WIDGET (self->view));
  graphene_point_t origin = GRAPHENE_POINT_INIT (0, 0), in_window;
  double sx = 0, sy = 0;
  unsigned long xid = 0;

  if (!gtk_widget_compute_point (GTK_WIDGET (self->view), GTK_WIDGET (native), &origin,
                                 &in_window))
    return;
  gtk_native_get_surface_transform (native, &sx, &sy);
#ifdef GDK_WINDOWING_X11
  if (GDK_IS_X11_SURFACE (gtk_native_get_surface (native)))
    xid = gdk_x11_surface_get_xid (gtk_native_get_surface (native));
#endif
  printf ("view-geometry %lu %d %d %d %d\n", xid, (int) (in_window.x + sx),
          (int) (in_window.y + sy), gtk_widget_get_width (GTK_WIDGET (self->view)),
          gtk_widget_get_height (GTK_WIDGET (self->view)));
  fflush (stdout);
}

/* Reports once the view has been drawn at its final size. */
static gboolean
report_view_tick (GtkWidget     *widget,
                  GdkFrameClock *clock,
                  gpointer       user_data)
{
  if (gtk_widget_get_width (widget) <= 1 || !gtk_widget_get_mapped (widget))
    return G_SOURCE_CONTINUE;
  report_view (DF_WINDOW (user_data));
  return G_SOURCE_REMOVE;
}

/* Runs once the view has its mesh: standard view, benchmark, geometry report, exports. */
static void
mesh_ready_cb (DfSurfaceView *view,
               DfWindow      *self)
{
  if (self->startup.report_view && !self->view_reported)
    {
      self->view_reported = TRUE;
      gtk_widget_add_tick_callback (GTK_WIDGET (self->view), report_view_tick, self, NULL);
    }
  if (self->startup.bench_orbit && !self->bench_started)
    {
      self->bench_started = TRUE;
      df_surface_view_run_orbit_benchmark (self->view, DF_BENCH_FRAMES, bench_done_cb,
                                           g_object_ref (self));
    }
  _df_window_check_exports (self);
}

/* "shading-range LO HI": the colour scale's ends as the legend shows them. */
static void
report_range_cb (DfSurfaceView *view,
                 double         lo,
                 double         hi,
                 gpointer       user_data)
{
  char a[G_ASCII_DTOSTR_BUF_SIZE], b[G_ASCII_DTOSTR_BUF_SIZE];

  printf ("shading-range %s %s\n", g_ascii_dtostr (a, sizeof a, lo),
          g_ascii_dtostr (b, sizeof b, hi));
  fflush (stdout);
}

/* "loop-measured NAME-WITHOUT-SPACES HOLONOMY ENCLOSED" with all digits, for test drivers. */
static void
report_loop_cb (DfDocument *document,
                DfLoopItem *item,
                DfWindow   *self)
{
  const df_loop_result *result = df_loop_item_get_result (item);
  g_autofree char *name = g_strdelimit (g_strdup (df_loop_item_get_name (item)), " ", '_');
  char a[G_ASCII_DTOSTR_BUF_SIZE], b[G_ASCII_DTOSTR_BUF_SIZE];

  if (result == NULL)
    {
      if (df_loop_item_get_state (item) == DF_LOOP_FAILED)
        printf ("loop-failed %s %s\n", name, df_loop_item_get_error (item));
      fflush (stdout);
      return;
    }
  printf ("loop-measured %s %s %s\n", name,
          g_ascii_dtostr (a, sizeof a, result->holonomy_rad),
          g_ascii_dtostr (b, sizeof b, result->enclosed_curvature_rad));
  fflush (stdout);
}

static void
open_demo_or_preset (DfWindow   *self,
                     const char *preset)
{
  g_autoptr(GError) error = NULL;
  df_surface_spec *spec;

  spec = df_surface_spec_new_preset (preset, &error);
  if (spec == NULL || !df_document_set_project (self->document, df_project_new (spec), NULL,
                                                &error))
    _df_window_show_error (self, "Cannot start from the preset", error);
}

gboolean
df_window_start (DfWindow        *self,
                 const DfStartup *startup)
{
  g_autoptr(GError) error = NULL;
  gboolean first_run = FALSE;
  g_autofree char *last = NULL;
  gboolean opened = FALSE;

  g_return_val_if_fail (DF_IS_WINDOW (self), FALSE);

  df_startup_clear (&self->startup);
  self->startup.file = g_strdup (startup->file);
  self->startup.import_data = g_strdup (startup->import_data);
  self->startup.demo = startup->demo;
  self->startup.preset = g_strdup (startup->preset);
  self->startup.tool = g_strdup (startup->tool);
  self->startup.view = g_strdup (startup->view);
  self->startup.shading = g_strdup (startup->shading);
  self->startup.units = g_strdup (startup->units);
  self->startup.export_samples = g_strdup (startup->export_samples);
  self->startup.export_summary = g_strdup (startup->export_summary);
  self->startup.export_png = g_strdup (startup->export_png);
  self->startup.export_report = g_strdup (startup->export_report);
  self->startup.bench_orbit = startup->bench_orbit;
  self->startup.bench_mesh = startup->bench_mesh;
  self->startup.report_view = startup->report_view;
  self->startup.report_events = startup->report_events;
  self->startup.drape = g_strdup (startup->drape);
  self->startup.bench_drape = startup->bench_drape;
  self->exports_pending = is_one_shot (self) && !startup->bench_orbit;

  g_signal_connect (self->view, "mesh-ready", G_CALLBACK (mesh_ready_cb), self);

  _df_window_state_load (self, &first_run, &last);
  if (startup->file != NULL)
    {
      opened = _df_window_open_path (self, startup->file, &error);
      if (!opened)
        {
          if (startup->report_events)
            {
              printf ("open-failed %s\n", error->message);
              fflush (stdout);
            }
          _df_window_show_error (self, "Cannot open the file", error);
          if (is_one_shot (self))
            return FALSE;
          g_clear_error (&error);
        }
    }
  else if (startup->preset != NULL)
    {
      df_surface_spec *spec = df_surface_spec_new_preset (startup->preset, &error);

      opened = spec != NULL && df_document_set_project (self->document, df_project_new (spec),
                                                        NULL, &error);
      if (!opened)
        {
          _df_window_show_error (self, "Cannot start from the preset", error);
          if (is_one_shot (self))
            return FALSE;
          g_clear_error (&error);
        }
    }
  if (!opened && (startup->demo || (first_run && startup->file == NULL)))
    {
      gtk_widget_activate_action (GTK_WIDGET (self), "win.open-demo", NULL);
      opened = df_document_get_surface (self->document) != NULL;
    }
  if (!opened && last != NULL && g_file_test (last, G_FILE_TEST_IS_REGULAR))
    {
      opened = _df_window_open_path (self, last, &error);
      if (!opened)
        {
          _df_window_status (self, TRUE, "Could not reopen the last project: %s",
                             error->message);
          g_clear_error (&error);
        }
    }
  if (!opened || df_document_get_surface (self->document) == NULL)
    open_demo_or_preset (self, "sphere");
  /* Data are fitted over the surface the window opened with, which stays if they fail. */
  if (startup->import_data != NULL)
    _df_window_data_take_file (self, startup->import_data, TRUE);
  else if (startup->bench_mesh)
    _df_window_data_bench_mesh (self);

  if (startup->tool != NULL)
    {
      DfTool tool;

      if (_df_tool_from_string (startup->tool, &tool))
        g_object_set (self, "tool", startup->tool, NULL);
      else
        g_printerr ("driftframe: --tool: unknown tool '%s' (look, sketch, probe, geodesic, "
                    "paths)\n", startup->tool);
    }
  if (startup->shading != NULL)
    {
      DfShading shading;

      if (_df_shading_from_string (startup->shading, &shading))
        g_object_set (self, "shading", startup->shading, NULL);
      else
        g_printerr ("driftframe: --colouring: unknown colouring '%s' (plain, gaussian, mean)\n",
                    startup->shading);
    }
  if (startup->view != NULL)
    {
      DfStandardView view;

      if (_df_view_from_string (startup->view, &view))
        df_surface_view_set_standard_view (self->view, view);
      else
        g_printerr ("driftframe: --view: unknown view '%s' (iso, top, front, side)\n",
                    startup->view);
    }
  _df_window_units_start (self);
  if (startup->report_events)
    {
      g_signal_connect (self->document, "loop-changed", G_CALLBACK (report_loop_cb), self);
      g_signal_connect (self->view, "shading-range-changed", G_CALLBACK (report_range_cb),
                        NULL);
    }
  if (!is_one_shot (self))
    _df_window_autosave_init (self);
  _df_window_drape_start (self);
  _df_window_actions_update (self);
  return TRUE;
}
