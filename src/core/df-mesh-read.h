/* df-mesh-read.h: triangle meshes from CAD and scanning programs (STL binary and ASCII, OBJ,
 * PLY) read through assimp, as plain vertex and triangle arrays for the fits of df-fit-mesh.h.
 * No mesh reader of our own: assimp parses, triangulates polygons and joins the corners that
 * share a position. Reader layer: GLib + assimp. Not the display mesh (df-mesh.h). */
#pragma once

#include <glib.h>

typedef struct
{
  double (*vertices)[3];    /* n_vertices positions, in the file's numbers */
  gsize    n_vertices;
  guint  (*triangles)[3];   /* n_triangles corner indices into vertices */
  gsize    n_triangles;
  /* Faces assimp kept that are no triangle (a point or a line: a triangle whose corners
   * coincided in the file), with the first one's index; checked by the fits. */
  gsize    n_other_faces;
  gsize    first_other_face;
} df_mesh_data;

/* Reads path (its extension picks the format: .stl, .obj, .ply, any case). Errors name the
 * file: missing or unreadable (GLib's words), a format assimp cannot read (assimp's message),
 * no triangles. */
gboolean df_mesh_data_read        (const char   *path,
                                   df_mesh_data *out,
                                   GError      **error);
/* The same from bytes; hint is the format ("stl", "obj", "ply"), source names them in
 * messages. */
gboolean df_mesh_data_read_memory (const void   *bytes,
                                   gsize         length,
                                   const char   *hint,
                                   const char   *source,
                                   df_mesh_data *out,
                                   GError      **error);
/* The format hint of a file name ("stl", ...), or NULL when assimp is not asked to read it. */
const char *df_mesh_data_hint     (const char *path);
void     df_mesh_data_clear       (df_mesh_data *mesh);
