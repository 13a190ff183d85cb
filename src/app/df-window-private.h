/* df-window-private.h: the DfWindow instance structure and the functions the df-window-*.c
 * files share. Only the window's own files include it. */
#pragma once

#include "df-compare-panel.h"
#include "df-document.h"
#include "df-geodesic-panel.h"
#include "df-legend-bar.h"
#include "df-loops-panel.h"
#include "df-probe-panel.h"
#include "df-surface-panel.h"
#include "df-surface-view.h"
#include "df-window.h"
#include "df-work.h"

G_BEGIN_DECLS

typedef struct _DfWindowData DfWindowData;

typedef enum
{
  DF_TOOL_LOOK,
  DF_TOOL_SKETCH,
  DF_TOOL_PROBE,
  DF_TOOL_GEODESIC,
  DF_TOOL_PATHS
} DfTool;

/* Curve and arrow ids in the view: loops use their DfLoopItem id (small numbers); the tools'
 * own drawings use ids far above them. */
enum
{
  DF_CURVE_SKETCH = 1000000,
  DF_CURVE_GEODESIC,
  DF_CURVE_PATH_A,
  DF_CURVE_PATH_B,
  DF_ARROW_PATH_A,
  DF_ARROW_PATH_B,
  DF_ARROW_GEODESIC
};

/* Progress of the Two paths tool. */
typedef enum
{
  DF_PATHS_WANT_A,
  DF_PATHS_DRAWING_A,
  DF_PATHS_WANT_B,
  DF_PATHS_DRAWING_B,
  DF_PATHS_DONE
} DfPathsStage;

struct _DfWindow
{
  GtkApplicationWindow parent_instance;

  /* template children */
  GtkPaned        *paned;
  DfSurfaceView   *view;
  DfLegendBar     *legend;
  GtkStack        *panel_stack;
  DfSurfacePanel  *surface_panel;
  DfLoopsPanel    *loops_panel;
  DfProbePanel    *probe_panel;
  DfGeodesicPanel *geodesic_panel;
  DfComparePanel  *compare_panel;
  GtkLabel        *title_label;
  GtkLabel        *subtitle_label;
  GtkImage        *status_icon;
  GtkLabel        *status_label;
  GtkLabel        *coords_label;
  GtkMenuButton   *primary_menu_button;

  /* owned */
  DfDocument   *document;
  DfWindowData *data;               /* surfaces from data (df-window-data.c) */
  DfStartup     startup;
  DfTool        tool;
  DfShading     shading;
  gboolean      iso_lines;
  guint         status_timeout_id;
  GStrv         recent;             /* most recent first */
  GMenu        *recent_menu;
  int           panel_width;
  int           png_width;          /* chosen size of the PNG export; 0: as the view shows */
  int           png_height;
  char         *report_paper;       /* "a4" or "letter", chosen in the export dialog */
  gboolean      panel_placed;
  gboolean      exports_pending;
  guint         export_idle_id;
  gboolean      bench_started;
  gboolean      view_reported;
  guint         autosave_id;        /* pending autosave timeout */
  char         *autosave_path;      /* this window's autosave file; NULL when not autosaving */

  GArray       *loop_curve_ids;     /* of guint: loop curves now in the view */
  char         *shown_shape;
  char         *selected_name;      /* the loop last selected, found again after undo */        /* "kind/preset" of the surface in the view, to spot a new shape */

  /* pointer position over the view, widget coordinates (for sketch size checks) */
  double        pointer_x, pointer_y;

  /* Sketch loop / Two paths: the stroke being drawn */
  gboolean      stroking;
  GArray       *stroke_uv;          /* of double[2] */
  double        stroke_px_min[2], stroke_px_max[2];
  gboolean      stroke_left;        /* the pointer ran off the surface during the stroke */
  GCancellable *live_cancellable;
  gint64        live_last_us;
  guint         live_timeout_id;
  gboolean      live_running;

  /* Two paths */
  DfPathsStage  paths_stage;
  GArray       *path_a;             /* of double[2] */
  GArray       *path_b;
  GCancellable *paths_cancellable;
  gboolean      paths_long_legs;    /* B's ends were far from A's and were joined to them */
  gboolean      paths_record;       /* the running comparison goes into the document */

  /* Probe: the point shown, shown again when the display units change */
  gboolean      probe_shown;
  double        probe_uv[2];

  /* Geodesic */
  gboolean      geodesic_pressed;
  double        geodesic_start[2];
};

/* df-window-actions.c */
void     _df_window_actions_class_init (GtkWidgetClass *widget_class);
void     _df_window_actions_update     (DfWindow *self);

/* df-window-autosave.c */
/* Starts autosaving this window's document and offers work left by a crashed run. */
void     _df_window_autosave_init      (DfWindow *self);
/* A clean close: stop, and remove this window's autosave. */
void     _df_window_autosave_finish    (DfWindow *self);

/* df-window-files.c */
gboolean _df_window_open_path          (DfWindow *self, const char *path, GError **error);
void     _df_window_open_dialog        (DfWindow *self, gboolean surface_only);
void     _df_window_save               (DfWindow *self, gboolean ask_path);
void     _df_window_import_loop_dialog (DfWindow *self);
/* Gives the project the surface of a .surface file; loops are carried over (undoable). */
void     _df_window_replace_surface_dialog (DfWindow *self);
gboolean _df_window_replace_surface_path (DfWindow *self, const char *path, GError **error);
gboolean _df_window_export_samples     (DfWindow *self, const char *path, GError **error);
gboolean _df_window_export_summary     (DfWindow *self, const char *path, GError **error);
gboolean _df_window_export_png         (DfWindow *self, const char *path, GError **error);
void     _df_window_export_dialog      (DfWindow *self, const char *what);
/* df-window-report.c: the annotated PNG, the PDF design record and its title-block dialog. */
gboolean _df_window_export_png_annotated (DfWindow *self, const char *path, int width,
                                          int height, GError **error);
gboolean _df_window_export_report      (DfWindow *self, const char *path, const char *paper,
                                        GError **error);
void     _df_window_edit_record        (DfWindow *self);
/* Runs then() once unsaved changes are saved or discarded; not at all on cancel. */
void     _df_window_confirm_discard    (DfWindow *self, GCallback then, const char *verb);
void     _df_window_show_error         (DfWindow *self, const char *primary, const GError *error);
void     _df_window_check_exports      (DfWindow *self);
/* File choosers: a filter; start in the project's folder; the chosen path (g_free) or NULL. */
void     _df_window_add_filter         (GtkFileChooser *chooser, const char *name,
                                        const char *pattern);
void     _df_window_start_in_project_folder (DfWindow *self, GtkFileChooser *chooser);
char    *_df_window_chooser_path       (GtkNativeDialog *dialog);

/* df-window-points.c: paths A and B from CSV files and a loop from typed points, both read by
 * the core's loop CSV reader (the CLI's rule). */
void     _df_window_import_path_dialog (DfWindow *self, gboolean path_b);
void     _df_window_type_loop_dialog   (DfWindow *self);
/* Path A or B from a loop CSV file (df-loop-csv.h); B needs A and is compared with it. */
gboolean _df_window_import_path        (DfWindow *self, const char *path, gboolean path_b,
                                        GError **error);

/* df-window-drape.c: the Woven-Ply Drape window (Ctrl+Shift+W), the view's picks forwarded
 * to it, --drape and --bench-drape. */
void     _df_window_drape_init         (DfWindow *self);
void     _df_window_drape_start        (DfWindow *self);

/* df-window-units.c: the Display Units action and --units (after the project is open). */
void     _df_window_units_init         (DfWindow *self);
void     _df_window_units_start        (DfWindow *self);

/* df-window-state.c */
void     _df_window_state_load         (DfWindow *self, gboolean *first_run, char **last_project);
void     _df_window_state_save         (DfWindow *self);
void     _df_window_add_recent         (DfWindow *self, const char *path);

/* df-window-sync.c: document -> view, panels and title */
void     _df_window_sync_init          (DfWindow *self);
void     _df_window_sync_all           (DfWindow *self);
void     _df_window_sync_loop          (DfWindow *self, DfLoopItem *item);
void     _df_window_sync_frames        (DfWindow *self);
void     _df_window_sync_legend        (DfWindow *self);
void     _df_window_sync_title         (DfWindow *self);
/* After a surface change: " The geodesic was removed: ..." for what it dropped, or "". */
char    *_df_window_dropped_note       (DfWindow *self);
void     _df_window_status             (DfWindow *self, gboolean is_error, const char *format,
                                        ...) G_GNUC_PRINTF (3, 4);

/* df-window-tools.c */
void     _df_window_tools_init         (DfWindow *self);
void     _df_window_tools_finalize     (DfWindow *self);
void     _df_window_set_tool           (DfWindow *self, DfTool tool);
void     _df_window_clear_geodesic     (DfWindow *self);
void     _df_window_clear_paths        (DfWindow *self);
/* Shows the document's geodesic and path pair (after undo, redo, loading, a surface change). */
void     _df_window_show_extras        (DfWindow *self);
/* Path A and B from chart points; B's ends become A's. far_ends: B was given away from A's
 * ends (said once compared); record: keep the pair in the document once compared. */
void     _df_window_paths_set          (DfWindow *self, const double (*a)[2], gsize n_a,
                                        const double (*b)[2], gsize n_b, gboolean far_ends,
                                        gboolean record);
/* Ctrl+T: the typed-value entry of the current tool (Probe unless Geodesic) gets the focus. */
void     _df_window_focus_typed        (DfWindow *self);
/* The surface changed: drop tool drawings that refer to the old one. */
void     _df_window_tools_surface_changed (DfWindow *self);

/* Mapping between the enums and their action target names. */
const char *_df_tool_to_string         (DfTool tool);
gboolean    _df_tool_from_string       (const char *name, DfTool *tool);
const char *_df_shading_to_string      (DfShading shading);
gboolean    _df_shading_from_string    (const char *name, DfShading *shading);
gboolean    _df_view_from_string       (const char *name, DfStandardView *view);

G_END_DECLS
