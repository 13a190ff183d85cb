/* df-loop-item.h: DfLoopItem, one loop of the open project as a list item: its name, colour,
 * frames switch and chart points, and the state of its measurement (pending, measured with a
 * df_loop_result, or failed with a message). The document owns the list; rows and the view
 * observe the items. */
#pragma once

#include <gdk/gdk.h>

#include "df-glib.h"
#include "df-verdict-shear.h"

G_BEGIN_DECLS

typedef enum
{
  DF_LOOP_PENDING,
  DF_LOOP_MEASURED,
  DF_LOOP_FAILED
} DfLoopState;

#define DF_TYPE_LOOP_ITEM (df_loop_item_get_type ())
G_DECLARE_FINAL_TYPE (DfLoopItem, df_loop_item, DF, LOOP_ITEM, GObject)

/* Copies uv. colour is "#rrggbb". */
DfLoopItem           *df_loop_item_new          (const char    *name,
                                                 const char    *colour,
                                                 gboolean       show_frames,
                                                 const double (*uv)[2],
                                                 gsize          n);

/* A number unique in this run, used as the curve id in the view. */
guint                 df_loop_item_get_id       (DfLoopItem *self);
const char           *df_loop_item_get_name     (DfLoopItem *self);
void                  df_loop_item_set_name     (DfLoopItem *self, const char *name);
const char           *df_loop_item_get_colour   (DfLoopItem *self);
void                  df_loop_item_get_rgba     (DfLoopItem *self, GdkRGBA *rgba);
gboolean              df_loop_item_get_show_frames (DfLoopItem *self);
void                  df_loop_item_set_show_frames (DfLoopItem *self, gboolean show);
const double        (*df_loop_item_get_points   (DfLoopItem *self, gsize *n))[2];
/* The drape max-shear-deg is checked with (the project's drape-start, drape-warp-deg and
 * drape-cell keys of the loop; nothing set by default), kept so that saving loses none. */
const df_shear_setup *df_loop_item_get_drape    (DfLoopItem *self);
void                  df_loop_item_set_drape    (DfLoopItem *self, const df_shear_setup *drape);

DfLoopState           df_loop_item_get_state    (DfLoopItem *self);
/* The measurement, or NULL unless the state is MEASURED. */
const df_loop_result *df_loop_item_get_result   (DfLoopItem *self);
/* The failure message, or NULL unless the state is FAILED. */
const char           *df_loop_item_get_error    (DfLoopItem *self);
/* One line for the list: the holonomy, "measuring…" or "not measured: …". */
const char           *df_loop_item_get_summary  (DfLoopItem *self);

/* State changes, each notifying "state" and "summary". set_result takes the result. */
void                  df_loop_item_set_pending  (DfLoopItem *self);
void                  df_loop_item_set_result   (DfLoopItem *self, df_loop_result *result);
void                  df_loop_item_set_failed   (DfLoopItem *self, const char *message);

/* Replaces the chart points (copied); the caller re-measures. */
void                  df_loop_item_set_points   (DfLoopItem *self, const double (*uv)[2],
                                                 gsize n);
/* "#rrggbb"; notifies "colour". */
void                  df_loop_item_set_colour   (DfLoopItem *self, const char *colour);
/* Marks the loop as lying off the surface (why: "point 12 is 35 mm from it"), or clears the
 * mark (NULL). A marked loop is failed with that message and is not measured: its points
 * are the closest ones on the surface, kept so the project stays valid, not a loop to read
 * numbers from. */
void                  df_loop_item_set_off_surface (DfLoopItem *self, const char *why);
const char           *df_loop_item_get_off_surface (DfLoopItem *self);

/* Cancels a running measurement and returns a fresh cancellable for the next one
 * (owned by the item). */
GCancellable         *df_loop_item_restart_cancellable (DfLoopItem *self);

G_END_DECLS
