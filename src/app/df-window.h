/* df-window.h: DfWindow, the main window: header bar with file buttons and the tool selector,
 * the 3D view with its colour legend, the side panel (surface, loops, probe, geodesic, two
 * paths) and the status line. The window code is split by concern across df-window-*.c. */
#pragma once

#include <gtk/gtk.h>

G_BEGIN_DECLS

/* What the command line asked for (see df-application.c). Strings may be NULL. */
typedef struct
{
  char    *file;            /* .dfproj or .surface to open */
  char    *import_data;     /* measured data or a mesh to fit once the window is up */
  gboolean demo;            /* open the demo project */
  char    *preset;          /* start from this preset */
  char    *tool;            /* look, sketch, probe, geodesic, paths */
  char    *view;            /* iso, top, front, side */
  char    *shading;         /* plain, gaussian, mean */
  char    *units;           /* display units "LENGTH[,CURVATURE]" (mm, cm, m, in), set as an edit */
  char    *export_samples;  /* export the selected loop's samples once measured, then quit */
  char    *export_summary;  /* export the loops summary once all are measured, then quit */
  char    *export_png;      /* export the view once everything is drawn, then quit */
  char    *export_report;   /* write the PDF design record once everything is drawn, then quit */
  gboolean bench_orbit;     /* print orbit frame times, then quit */
  gboolean bench_mesh;      /* print display-mesh build times (after --import-data), then quit */
  gboolean report_view;     /* print the view's place in the window (for test drivers) */
  gboolean report_events;   /* print measurements, autosaves and restores (for test drivers) */
  char    *drape;           /* "LOOP;U;V;WARP_DEG;CELL": drape as typed once open (df-window-drape.c) */
  gboolean bench_drape;     /* print drape drag-to-redraw times, then quit */
} DfStartup;

void df_startup_clear (DfStartup *startup);

#define DF_TYPE_WINDOW (df_window_get_type ())
G_DECLARE_FINAL_TYPE (DfWindow, df_window, DF, WINDOW, GtkApplicationWindow)

DfWindow *df_window_new   (GtkApplication *application);
/* Opens what startup names (or the last project, or the demo on a first run) and arranges the
 * one-shot exports; startup is copied. FALSE when a one-shot run cannot go on (the file does
 * not open); the message is on stderr and the caller should drop the window. */
gboolean  df_window_start (DfWindow *self, const DfStartup *startup);

G_END_DECLS
