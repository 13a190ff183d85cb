/* df-document.h: DfDocument, the open project in the app: the surface spec and its built
 * surface, the list of loops (DfLoopItem) with their measurements kept up to date in the
 * background, the file it came from, the modified flag and undo/redo. Every edit goes through
 * here so that undo, the modified flag and re-measuring stay consistent. */
#pragma once

#include <gio/gio.h>

#include "df-glib.h"
#include "df-loop-item.h"

G_BEGIN_DECLS

#define DF_TYPE_DOCUMENT (df_document_get_type ())
G_DECLARE_FINAL_TYPE (DfDocument, df_document, DF, DOCUMENT, GObject)

DfDocument           *df_document_new              (void);

/* Replaces everything with project (taken) and clears undo. path: the file it came from, or
 * NULL for an unsaved project. Fails (document unchanged) when the surface does not build. */
gboolean              df_document_set_project      (DfDocument  *self,
                                                    df_project  *project,
                                                    const char  *path,
                                                    GError     **error);
/* Like set_project from project text (an autosave; source names it in messages), for work
 * recovered after a crash: the document counts as modified (it is
 * not what path holds), and display_name (may be NULL) names it while it has no path. */
gboolean              df_document_restore          (DfDocument  *self,
                                                    const char  *data,
                                                    const char  *source,
                                                    const char  *path,
                                                    const char  *display_name,
                                                    GError     **error);
/* Opens a .dfproj, or a .surface as a new project without loops. */
gboolean              df_document_load             (DfDocument  *self,
                                                    const char  *path,
                                                    GError     **error);
/* After load: the messages (one a line, naming file and group) of loops that could not be read
 * and were left out while the rest opened, or NULL. */
const char           *df_document_get_load_skipped (DfDocument *self);
/* Writes the project atomically and remembers path. */
gboolean              df_document_save             (DfDocument  *self,
                                                    const char  *path,
                                                    GError     **error);
/* A new df_project with the current spec and loops (caller frees). */
df_project           *df_document_to_project       (DfDocument *self);

const char           *df_document_get_path         (DfDocument *self);
/* "Untitled project" or the file's base name. */
char                 *df_document_get_title        (DfDocument *self);
gboolean              df_document_get_modified     (DfDocument *self);
/* A name for an unsaved project ("demo.dfproj (copy)"), shown until it is saved; cleared by
 * set_project. */
void                  df_document_set_display_name (DfDocument *self, const char *name);
const char           *df_document_get_display_name (DfDocument *self);

const df_surface_spec *df_document_get_spec        (DfDocument *self);
const df_surface     *df_document_get_surface      (DfDocument *self);
/* Length unit of the surface ("mm" unless the spec says otherwise). */
const char           *df_document_get_units        (DfDocument *self);
/* Builds spec (copied) and makes it current; an undoable edit. Fails with the builder's
 * message (document unchanged). */
gboolean              df_document_set_spec         (DfDocument            *self,
                                                    const df_surface_spec *spec,
                                                    GError               **error);

/* Like set_spec with the surface already built from spec (taken, also on failure): a data
 * surface fitted on a worker thread (df-data-import.h). */
gboolean              df_document_set_spec_built   (DfDocument            *self,
                                                    const df_surface_spec *spec,
                                                    df_surface            *surface,
                                                    GError               **error);

/* The project's title block, geodesics, paths, probes and view as loaded (read-only; NULL
 * before a project is set). */
const df_project     *df_document_get_meta         (DfDocument *self);
/* The project's limits with their sources (read-only; NULL before a project is set). */
const df_limits      *df_document_get_limits       (DfDocument *self);
/* Records the view (colouring "gaussian", "mean" or "plain"; camera angles in degrees) to be
 * saved with the project, so its design record is drawn from the same side. Not an edit: the
 * modified flag does not change. */
void                  df_document_set_view         (DfDocument *self,
                                                    const char *colouring,
                                                    double      yaw_deg,
                                                    double      pitch_deg);
/* Sets one title-block field ("title", "part-number", "revision", "author"; blank clears it).
 * The document becomes modified. */
void                  df_document_set_record       (DfDocument *self,
                                                    const char *key,
                                                    const char *value);
/* After set_spec: how many loops were placed on the new surface, and how many were left off
 * it (marked, see df_loop_item_set_off_surface). */
void                  df_document_get_last_carry   (DfDocument *self, guint *carried,
                                                    guint *off);

/* After set_spec: how many geodesics it removed (a heading from X_u does not carry to another
 * chart) and how many path pairs, being off the new surface (undo brings both back). */
void                  df_document_get_last_dropped (DfDocument *self, guint *geodesics,
                                                    guint *paths);

/* The geodesic and path pair the tools show: the project's last [geodesic N] and [paths N]
 * (NULL: none). set_ replaces that one when it has the same name, else adds one after it;
 * clear_ removes it. All are undoable edits; undo, redo and loading emit "surface-changed",
 * after which the tools show these again. */
const df_project_geodesic *df_document_get_geodesic (DfDocument *self);
void                  df_document_set_geodesic     (DfDocument *self,
                                                    const char *name,
                                                    double      u,
                                                    double      v,
                                                    double      heading_deg,
                                                    double      length);
void                  df_document_clear_geodesic   (DfDocument *self);
const df_project_paths *df_document_get_paths      (DfDocument *self);
void                  df_document_set_paths        (DfDocument    *self,
                                                    const char    *name,
                                                    const double (*a)[2],
                                                    gsize          n_a,
                                                    const double (*b)[2],
                                                    gsize          n_b);
void                  df_document_clear_paths      (DfDocument *self);

/* The loops, a GListModel of DfLoopItem. */
GListModel           *df_document_get_loops        (DfDocument *self);
/* Adds and measures a loop (points copied); name NULL picks "Loop N". Undoable. */
DfLoopItem           *df_document_add_loop         (DfDocument    *self,
                                                    const char    *name,
                                                    const double (*uv)[2],
                                                    gsize          n);
void                  df_document_remove_loop      (DfDocument *self, DfLoopItem *item);
void                  df_document_rename_loop      (DfDocument *self, DfLoopItem *item,
                                                    const char *name);
/* "#rrggbb"; an undoable edit. */
void                  df_document_set_loop_colour  (DfDocument *self, DfLoopItem *item,
                                                    const char *colour);
void                  df_document_set_loop_frames  (DfDocument *self, DfLoopItem *item,
                                                    gboolean show);
/* The drape the loop's max-shear-deg check uses (its drape-start, drape-warp-deg, drape-cell
 * keys); an undoable edit. */
void                  df_document_set_loop_drape   (DfDocument *self, DfLoopItem *item,
                                                    const df_shear_setup *drape);
/* Reads a loop CSV (df-loop-csv.h) and adds it named after the file. */
DfLoopItem           *df_document_import_loop_csv  (DfDocument  *self,
                                                    const char  *path,
                                                    GError     **error);
/* TRUE when no loop is waiting for its measurement. */
gboolean              df_document_all_measured     (DfDocument *self);

gboolean              df_document_can_undo         (DfDocument *self);
gboolean              df_document_can_redo         (DfDocument *self);
/* Reverts (reapplies) the last edit; returns its label ("add loop", ...) or NULL. */
const char           *df_document_undo             (DfDocument *self);
const char           *df_document_redo             (DfDocument *self);

G_END_DECLS
