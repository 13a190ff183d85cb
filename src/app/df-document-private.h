/* df-document-private.h: what the files of DfDocument share (df-document*.c): the instance
 * struct, its properties and signals, and the helpers one file calls in another. */
#pragma once

#include "df-document.h"
#include "df-history.h"

G_BEGIN_DECLS

/* A loop point carried to a new surface "fits" when the new surface passes within this
 * fraction of its size (its bounding box diagonal) of the point's old place in space: about
 * a pencil line on a part a metre across (common practice, no source). */
#define DF_CARRY_TOLERANCE 0.01
/* Comment on a loop's group in undo snapshots and autosaves (and saved files, where the CLI
 * ignores it): the loop was left off the surface and must not be measured on its points. */
#define DF_OFF_SURFACE_COMMENT "off-surface:"

#define DF_HISTORY_LIMIT 100

struct _DfDocument
{
  GObject parent_instance;

  /* owned */
  df_surface_spec *spec;
  df_surface      *surface;
  df_limits       *limits;   /* the project's [limits] and [units], kept through a save */
  GListStore      *loops;
  DfHistory       *history;
  char            *path;
  char            *saved_snapshot;  /* project text as last loaded or saved */
  char            *last_label;
  char            *display_name;
  gboolean         modified;
  /* The title block, geodesics, path pairs, probes and view of the project as loaded: kept so
   * that saving from the app writes them back (the app does not edit them yet). */
  df_project      *carried;
  guint            last_carried;     /* loops placed on the surface by the last spec change */
  guint            last_off;         /* loops left off it */
  char            *load_skipped;     /* messages of loops left out by load, one a line */
  guint            last_dropped_geodesics; /* geodesics it removed (undo restores them) */
  guint            last_dropped_paths;     /* path pairs it removed, being off the surface */
};

enum
{
  PROP_0,
  PROP_PATH,
  PROP_MODIFIED,
  DF_DOCUMENT_N_PROPS
};

enum
{
  SURFACE_CHANGED,
  LOOP_CHANGED,
  HISTORY_CHANGED,
  CHANGED,
  UNITS_CHANGED,
  DF_DOCUMENT_N_SIGNALS
};

/* df-document.c */
extern GParamSpec *_df_document_properties[DF_DOCUMENT_N_PROPS];
extern guint _df_document_signals[DF_DOCUMENT_N_SIGNALS];
/* Compares the project text with the one last loaded or saved; notifies and emits "changed". */
void _df_document_update_modified (DfDocument *self);
/* Measures one loop (or every loop) on a worker thread; "loop-changed" when done. */
void _df_document_measure_item    (DfDocument *self,
                                   DfLoopItem *item);
void _df_document_measure_all     (DfDocument *self);
/* Records the state before an edit, under label. */
void _df_document_push_history    (DfDocument *self,
                                   const char *label);

G_END_DECLS
