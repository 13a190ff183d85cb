/* df-drape-window-private.h: the drape window's fields and the internals its files share:
 * df-drape-window.c (the form, the jobs, the result) and df-drape-window-export.c (the
 * exports and Keep for the shear check). */
#pragma once

#include "df-display-units.h"
#include "df-document.h"
#include "df-drape-job.h"
#include "df-surface-view.h"
#include "df-drape-window.h"
#include "df-loop-item.h"

#define DEG (180.0 / G_PI)

struct _DfDrapeWindow
{
  GtkWindow parent_instance;

  /* children */
  GtkWidget *loop, *start_u, *start_v, *warp, *cell, *pick, *run, *clear, *keep;
  GtkWidget *u_label, *v_label, *warp_hint, *cell_units, *status, *figures, *flags, *flat;
  GtkWidget *svg, *pins, *outline;

  /* owned */
  DfDocument    *document;
  DfSurfaceView *view;
  GtkWidget     *legend;       /* in the view's overlay; a reference of ours */
  GtkStringList *names;        /* the loops' names, in the document's order */
  GCancellable  *cancellable;  /* every job of the current surface */
  DfDrapeResult *result;       /* shown */
  gboolean       result_final;
  gboolean       report_events;
  DfDisplayUnits du;           /* what the cell field is typed in */
  /* The running job and the one waiting (a drag's newest pick). */
  gboolean       running;
  gboolean       pending;
  double         pending_uv[2];
  gboolean       pending_final;
  gboolean       running_final;
  /* What the shown (or running) drape was asked with, for re-running on a limits change. */
  double         start[2];
  gboolean       have_start;
  void         (*shown_cb) (gboolean final, double drape_ms, double ms, gpointer user);
  void         (*picking_cb) (gboolean on, gpointer user);
  gpointer       picking_user;
  gpointer       shown_user;
};

void        _df_drape_window_set_status  (DfDrapeWindow *self, const char *text, gboolean error);
/* The loop chosen as the ply, or NULL. */
DfLoopItem *_df_drape_window_chosen_loop (DfDrapeWindow *self);
/* Buttons: Export SVG / pins CSV / flat outline CSV (which, by the button), and Keep for the
 * shear check. */
void        _df_drape_window_export_cb   (GtkButton *button, DfDrapeWindow *self);
void        _df_drape_window_keep_cb     (GtkButton *button, DfDrapeWindow *self);
