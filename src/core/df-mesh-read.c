/* df-mesh-read.c: triangle meshes through assimp's C API into plain arrays. assimp's STL
 * reader gives every triangle its own corners with the facet normal, so the normals (and any
 * texture coordinates and colours) are removed first: JoinIdenticalVertices then joins corners
 * by position alone, which the fits need (a vertex is one data point). Scene nodes' transforms
 * are applied (PreTransformVertices) so an OBJ or PLY with several parts lands where its
 * program placed it. Reader layer: GLib + assimp. */
#include "df-mesh-read.h"

#include <assimp/cimport.h>
#include <assimp/config.h>
#include <assimp/postprocess.h>
#include <assimp/scene.h>
#include <math.h>
#include <string.h>

#include "df-io-error.h"

/* A 1-million-triangle ASCII STL is about 250 MB; assimp takes a 32-bit length. */
#define MAX_MESH_BYTES ((gsize) 1 << 30)

/* assimp's C API keeps the last error in one static string: imports are serialised so that
 * a worker thread reads its own message. */
static GMutex import_lock;

const char *
df_mesh_data_hint (const char *path)
{
  static const char *const hints[] = { "stl", "obj", "ply" };
  const char *dot = path != NULL ? strrchr (path, '.') : NULL;

  for (gsize i = 0; dot != NULL && i < G_N_ELEMENTS (hints); i++)
    if (g_ascii_strcasecmp (dot + 1, hints[i]) == 0)
      return hints[i];
  return NULL;
}

void
df_mesh_data_clear (df_mesh_data *mesh)
{
  if (mesh == NULL)
    return;
  g_clear_pointer (&mesh->vertices, g_free);
  g_clear_pointer (&mesh->triangles, g_free);
  memset (mesh, 0, sizeof *mesh);
}

/* Copies every mesh of the scene into out (vertices of later meshes after earlier ones). */
static gboolean
copy_scene (const struct aiScene *scene, const char *source, df_mesh_data *out, GError **error)
{
  gsize nv = 0, nt = 0, other = 0, first_other = 0, face_base = 0;

  for (unsigned m = 0; m < scene->mNumMeshes; m++)
    {
      const struct aiMesh *mesh = scene->mMeshes[m];

      nv += mesh->mNumVertices;
      for (unsigned f = 0; f < mesh->mNumFaces; f++)
        if (mesh->mFaces[f].mNumIndices == 3)
          nt++;
    }
  if (nt == 0)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: no triangles in the mesh "
                   "(%zu vertices): export the surface as triangles", source, nv);
      return FALSE;
    }
  out->vertices = g_try_malloc (nv * sizeof *out->vertices);
  out->triangles = g_try_malloc (nt * sizeof *out->triangles);
  if (out->vertices == NULL || out->triangles == NULL)
    {
      df_mesh_data_clear (out);
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FILE, "%s: out of memory for %zu vertices "
                   "and %zu triangles", source, nv, nt);
      return FALSE;
    }
  nv = nt = 0;
  for (unsigned m = 0; m < scene->mNumMeshes; m++)
    {
      const struct aiMesh *mesh = scene->mMeshes[m];
      gsize base = nv;

      for (unsigned i = 0; i < mesh->mNumVertices; i++, nv++)
        {
          out->vertices[nv][0] = mesh->mVertices[i].x;
          out->vertices[nv][1] = mesh->mVertices[i].y;
          out->vertices[nv][2] = mesh->mVertices[i].z;
        }
      for (unsigned f = 0; f < mesh->mNumFaces; f++)
        {
          const struct aiFace *face = &mesh->mFaces[f];

          if (face->mNumIndices != 3)
            {
              if (other++ == 0)
                first_other = face_base + f;
              continue;
            }
          for (int k = 0; k < 3; k++)
            out->triangles[nt][k] = (guint) (base + face->mIndices[k]);
          nt++;
        }
      face_base += mesh->mNumFaces;
    }
  out->n_vertices = nv;
  out->n_triangles = nt;
  out->n_other_faces = other;
  out->first_other_face = first_other;
  return TRUE;
}

gboolean
df_mesh_data_read_memory (const void *bytes, gsize length, const char *hint, const char *source,
                          df_mesh_data *out, GError **error)
{
  const unsigned flags = aiProcess_RemoveComponent | aiProcess_Triangulate
                         | aiProcess_JoinIdenticalVertices | aiProcess_PreTransformVertices;
  struct aiPropertyStore *props;
  const struct aiScene *scene;
  gboolean ok;

  memset (out, 0, sizeof *out);
  if (source == NULL)
    source = "mesh";
  if (length == 0)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: the mesh file is empty", source);
      return FALSE;
    }
  if (length > MAX_MESH_BYTES)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: %zu bytes: larger than the "
                   "%zu MB a mesh may have", source, length, MAX_MESH_BYTES >> 20);
      return FALSE;
    }
  props = aiCreatePropertyStore ();
  aiSetImportPropertyInteger (props, AI_CONFIG_PP_RVC_FLAGS,
                              aiComponent_NORMALS | aiComponent_TANGENTS_AND_BITANGENTS
                              | aiComponent_COLORS | aiComponent_TEXCOORDS
                              | aiComponent_BONEWEIGHTS | aiComponent_ANIMATIONS
                              | aiComponent_MATERIALS);
  g_mutex_lock (&import_lock);
  scene = aiImportFileFromMemoryWithProperties (bytes, (unsigned) length, flags, hint, props);
  if (scene == NULL)
    {
      const char *why = aiGetErrorString ();

      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: not a mesh assimp can read "
                   "as %s: %s", source, hint != NULL ? hint : "any format",
                   why != NULL && why[0] != '\0' ? why : "no reason given");
    }
  g_mutex_unlock (&import_lock);
  aiReleasePropertyStore (props);
  if (scene == NULL)
    return FALSE;
  ok = copy_scene (scene, source, out, error);
  aiReleaseImport (scene);
  return ok;
}

gboolean
df_mesh_data_read (const char *path, df_mesh_data *out, GError **error)
{
  g_autofree char *bytes = NULL;
  g_autoptr (GError) local = NULL;
  const char *hint = df_mesh_data_hint (path);
  gsize length = 0;

  memset (out, 0, sizeof *out);
  if (hint == NULL)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: a mesh file ends in .stl, .obj "
                   "or .ply", path);
      return FALSE;
    }
  if (!g_file_get_contents (path, &bytes, &length, &local))
    {
      g_set_error_literal (error, DF_IO_ERROR, DF_IO_ERROR_FILE, local->message);
      return FALSE;
    }
  return df_mesh_data_read_memory (bytes, length, hint, path, out, error);
}
