/* df-document-loops.c: the document's loop list: adding (with a name and a colour of their own),
 * removing, renaming, frames, and a loop imported from CSV by the core's reader. */
#include <string.h>

#include <math.h>

#include "df-document-private.h"
#include "df-project.h"
#include "df-work-guard.h"
#include "df-work.h"

/* Loop colours: kept away from the blue-white-orange curvature scale, from the frames' ink,
 * green partner and magenta returned-vector arrows, and from each other in lightness as well
 * as hue, so that they still differ for the common colour deficiencies (common practice, no
 * source). pick_colour() takes the one farthest from the colours in use. */
static const char *const loop_palette[] = {
  "#7b3fc4", "#00a0b8", "#e8c300", "#6b8e23", "#5d4037", "#9e9e9e", "#ff8fb1", "#00695c",
};

GListModel *
df_document_get_loops (DfDocument *self)
{
  g_return_val_if_fail (DF_IS_DOCUMENT (self), NULL);
  return G_LIST_MODEL (self->loops);
}

/* The palette colour farthest (in RGB) from every loop colour in use, so that a new loop never
 * looks like an existing one, even one read from a file with its own colours. */
static const char *
pick_colour (DfDocument *self)
{
  guint n = g_list_model_get_n_items (G_LIST_MODEL (self->loops));
  const char *best = loop_palette[n % G_N_ELEMENTS (loop_palette)];
  double best_distance = -1.0;

  for (guint c = 0; c < G_N_ELEMENTS (loop_palette); c++)
    {
      GdkRGBA candidate;
      double nearest = G_MAXDOUBLE;

      gdk_rgba_parse (&candidate, loop_palette[c]);
      for (guint i = 0; i < n; i++)
        {
          g_autoptr(DfLoopItem) item = g_list_model_get_item (G_LIST_MODEL (self->loops), i);
          GdkRGBA used;
          double d;

          df_loop_item_get_rgba (item, &used);
          d = (candidate.red - used.red) * (candidate.red - used.red)
              + (candidate.green - used.green) * (candidate.green - used.green)
              + (candidate.blue - used.blue) * (candidate.blue - used.blue);
          nearest = MIN (nearest, d);
        }
      if (nearest > best_distance)
        {
          best_distance = nearest;
          best = loop_palette[c];
        }
    }
  return best;
}

static char *
pick_name (DfDocument *self)
{
  guint n = g_list_model_get_n_items (G_LIST_MODEL (self->loops));

  for (guint k = n + 1;; k++)
    {
      g_autofree char *name = g_strdup_printf ("Loop %u", k);
      gboolean used = FALSE;

      for (guint i = 0; i < n && !used; i++)
        {
          g_autoptr(DfLoopItem) item = g_list_model_get_item (G_LIST_MODEL (self->loops), i);
          used = g_strcmp0 (df_loop_item_get_name (item), name) == 0;
        }
      if (!used)
        return g_steal_pointer (&name);
    }
}

DfLoopItem *
df_document_add_loop (DfDocument    *self,
                      const char    *name,
                      const double (*uv)[2],
                      gsize          n)
{
  g_autoptr(DfLoopItem) item = NULL;
  g_autofree char *auto_name = NULL;

  g_return_val_if_fail (DF_IS_DOCUMENT (self), NULL);
  g_return_val_if_fail (self->surface != NULL, NULL);

  if (name == NULL)
    name = auto_name = pick_name (self);
  _df_document_push_history (self, "add loop");
  item = df_loop_item_new (name, pick_colour (self), TRUE, uv, n);
  g_list_store_append (self->loops, item);
  _df_document_measure_item (self, item);
  _df_document_update_modified (self);
  return item;  /* borrowed: the store holds a reference */
}

static gboolean
find_item (DfDocument *self,
           DfLoopItem *item,
           guint      *position)
{
  return g_list_store_find (self->loops, item, position);
}

void
df_document_remove_loop (DfDocument *self,
                         DfLoopItem *item)
{
  guint position;

  g_return_if_fail (DF_IS_DOCUMENT (self));
  g_return_if_fail (DF_IS_LOOP_ITEM (item));

  if (!find_item (self, item, &position))
    return;
  _df_document_push_history (self, "delete loop");
  g_cancellable_cancel (df_loop_item_restart_cancellable (item));
  g_list_store_remove (self->loops, position);
  _df_document_update_modified (self);
}

void
df_document_rename_loop (DfDocument *self,
                         DfLoopItem *item,
                         const char *name)
{
  g_return_if_fail (DF_IS_DOCUMENT (self));
  g_return_if_fail (DF_IS_LOOP_ITEM (item));

  if (name == NULL || name[0] == '\0' || g_strcmp0 (name, df_loop_item_get_name (item)) == 0)
    return;
  _df_document_push_history (self, "rename loop");
  df_loop_item_set_name (item, name);
  g_signal_emit (self, _df_document_signals[LOOP_CHANGED], 0, item);
  _df_document_update_modified (self);
}

void
df_document_set_loop_colour (DfDocument *self,
                             DfLoopItem *item,
                             const char *colour)
{
  GdkRGBA rgba;

  g_return_if_fail (DF_IS_DOCUMENT (self));
  g_return_if_fail (DF_IS_LOOP_ITEM (item));

  if (colour == NULL || !gdk_rgba_parse (&rgba, colour)
      || g_ascii_strcasecmp (colour, df_loop_item_get_colour (item)) == 0)
    return;
  _df_document_push_history (self, "loop colour");
  df_loop_item_set_colour (item, colour);
  g_signal_emit (self, _df_document_signals[LOOP_CHANGED], 0, item);
  _df_document_update_modified (self);
}

void
df_document_set_loop_drape (DfDocument           *self,
                            DfLoopItem           *item,
                            const df_shear_setup *drape)
{
  g_return_if_fail (DF_IS_DOCUMENT (self));
  g_return_if_fail (DF_IS_LOOP_ITEM (item));
  g_return_if_fail (drape != NULL);

  _df_document_push_history (self, "drape for the shear check");
  df_loop_item_set_drape (item, drape);
  /* Its verdicts are checked again (df-window-decide.c listens). */
  g_signal_emit (self, _df_document_signals[LOOP_CHANGED], 0, item);
  _df_document_update_modified (self);
}

void
df_document_set_loop_frames (DfDocument *self,
                             DfLoopItem *item,
                             gboolean    show)
{
  g_return_if_fail (DF_IS_DOCUMENT (self));
  g_return_if_fail (DF_IS_LOOP_ITEM (item));

  if (!!show == df_loop_item_get_show_frames (item))
    return;
  /* A display switch: saved with the project, but not worth an undo step. */
  df_loop_item_set_show_frames (item, show);
  g_signal_emit (self, _df_document_signals[LOOP_CHANGED], 0, item);
  _df_document_update_modified (self);
}

DfLoopItem *
df_document_import_loop_csv (DfDocument  *self,
                             const char  *path,
                             GError     **error)
{
  g_autofree double (*uv)[2] = NULL;
  g_autofree char *base = NULL;
  char *dot;
  gsize n = 0;

  g_return_val_if_fail (DF_IS_DOCUMENT (self), NULL);

  if (!df_loop_csv_read (path, self->surface, &uv, &n, error))
    return NULL;
  base = g_path_get_basename (path);
  dot = strrchr (base, '.');
  if (dot != NULL && dot != base)
    *dot = '\0';
  return df_document_add_loop (self, base, (const double (*)[2]) uv, n);
}
