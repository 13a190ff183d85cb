/* df-data-import.h: surfaces from measured or CAD data in the app, without widgets: what a
 * file is (by its extension and its CSV header), the fit of a data surface on a worker thread
 * (the core's reader and fit, under the crash guard) with the data points and their signed
 * deviations from the fit for the overlay, and the data file's path kept absolute in the open
 * document but written relative to the project file. */
#pragma once

#include <gio/gio.h>

#include "df-glib.h"

G_BEGIN_DECLS

typedef enum
{
  DF_DATA_FILE_UNKNOWN,
  DF_DATA_FILE_PROJECT,   /* .dfproj */
  DF_DATA_FILE_SURFACE,   /* .surface */
  DF_DATA_FILE_PROFILE,   /* CSV with header r,z */
  DF_DATA_FILE_XYZ,       /* CSV with header x,y,z: heights, or a loop's space points */
  DF_DATA_FILE_LOOP_UV,   /* CSV with header u,v: a loop in chart numbers */
  DF_DATA_FILE_MESH       /* .stl, .obj, .ply */
} DfDataFileKind;

/* What path holds: by extension, and for CSV by its first line that is neither blank nor a
 * comment. UNKNOWN with error naming the file (and the line of a header it does not know). */
DfDataFileKind df_data_file_sniff (const char *path, GError **error);

/* The most data points drawn over the surface: enough to see the pattern of the deviation,
 * few enough for the software rasterizer (a 1000 x 1000 grid is thinned evenly). */
#define DF_DATA_POINTS_SHOWN 40000

/* A data surface fitted on a worker thread. */
typedef struct
{
  df_surface_spec *spec;        /* the spec as fitted: absolute data path, SHA-256 recorded */
  df_surface      *surface;
  df_fit_info      info;
  gboolean         has_info;
  /* Points drawn: x, y, z and the signed deviation (in units), n_points of them, thinned from
   * n_data; max_abs the largest |deviation| among them. Empty when the points could not be
   * read again (points_error says why). */
  float           *points;
  gsize            n_points;
  gsize            n_data;
  double           max_abs;
  char            *points_error;
} DfDataFit;

void       df_data_fit_free    (DfDataFit *fit);   /* NULL: no-op */
G_DEFINE_AUTOPTR_CLEANUP_FUNC (DfDataFit, df_data_fit_free)

/* Builds spec (copied) on a thread: the fit, then the deviations of the points shown. */
void       df_data_fit_async   (const df_surface_spec *spec,
                                GCancellable          *cancellable,
                                GAsyncReadyCallback    callback,
                                gpointer               user_data);
/* The fit, or NULL with the reader's or the fit's message (file and row or place). */
DfDataFit *df_data_fit_finish  (GAsyncResult  *result,
                                GError       **error);
/* The deviations of an already fitted surface's points (a document opened from a project
 * built its surface itself); same result, spec and surface copied. */
void       df_data_points_async (const df_surface_spec *spec,
                                 const df_surface      *surface,
                                 GCancellable          *cancellable,
                                 GAsyncReadyCallback    callback,
                                 gpointer               user_data);

/* A data spec's path made absolute (base_dir applied, base_dir cleared), so undo snapshots
 * and autosaves, read back from elsewhere, still find the file. No-op for formulas. */
void       df_data_spec_make_absolute (df_surface_spec *spec);
/* Project text (as the document writes it) with the data file's path written relative to the
 * folder of project_path when it has one in common; a copy otherwise. */
char      *df_data_project_text_for   (const char *data,
                                       const char *project_path);

G_END_DECLS
