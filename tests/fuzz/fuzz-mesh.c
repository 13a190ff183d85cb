/* fuzz-mesh.c: mesh bytes -> assimp (df-mesh-read.c) -> fitted surface (df-fit-mesh.c) ->
 * geometry, the path a surface file's mesh= key takes, from memory. Input: one byte choosing
 * the format (bits 0-1: stl, obj, ply, stl), the kind (bit 2: revolution rather than graph)
 * and the fit (bit 3: fit-tolerance 0.01 rather than chosen by GCV), then the mesh's bytes.
 * Rules: a refused mesh has a message naming its source; a failed fit a detail with no
 * non-finite number; a built surface keeps the rules of fuzz-surface-check.h. */
#include "df-fit-mesh.h"
#include "df-mesh-read.h"
#include "fuzz-common.h"
#include "fuzz-surface-check.h"

/* A few thousand triangles keep one execution of the fit well under a second. */
#define FUZZ_MAX_INPUT 262144

int LLVMFuzzerInitialize (int *argc, char ***argv);

int
LLVMFuzzerInitialize (int *argc, char ***argv)
{
  df_core_init ();
  return 0;
}

int
LLVMFuzzerTestOneInput (const unsigned char *data, size_t size)
{
  static const char *const hints[] = { "stl", "obj", "ply", "stl" };
  g_autoptr (GError) error = NULL;
  g_autoptr (df_surface) surface = NULL;
  df_mesh_data mesh = { 0 };
  df_fit_mesh_input in;
  df_fn *fn = NULL;
  df_diag diag;
  df_status st;
  double dom[4];
  gboolean rev;

  if (size < 1 || (size > FUZZ_MAX_INPUT && !fuzz_replaying))
    return 0;
  rev = (data[0] & 4) != 0;
  if (!df_mesh_data_read_memory (data + 1, size - 1, hints[data[0] & 3], "fuzz.mesh", &mesh,
                                 &error))
    {
      fuzz_check_error ("df_mesh_data_read_memory", error);
      FUZZ_REQUIRE (strstr (error->message, "fuzz.mesh") != NULL);
      return 0;
    }
  in = (df_fit_mesh_input) { (const double (*)[3]) mesh.vertices, mesh.n_vertices,
                             (const unsigned (*)[3]) mesh.triangles, mesh.n_triangles,
                             mesh.n_other_faces, mesh.first_other_face };
  st = rev ? df_fit_mesh_revolution (&in, (data[0] & 8) ? 0.01 : DF_FIT_TOLERANCE_AUTO, &fn,
                                     NULL, &diag)
           : df_fit_mesh_graph (&in, (data[0] & 8) ? 0.01 : DF_FIT_TOLERANCE_AUTO, &fn, NULL,
                                &diag);
  df_mesh_data_clear (&mesh);
  if (st != DF_OK)
    {
      FUZZ_REQUIRE (fn == NULL);
      if (st != DF_E_NOMEM)
        fuzz_check_detail ("df_fit_mesh", diag.detail);
      return 0;
    }
  df_fn_get_domain (fn, dom);
  if (rev)
    st = df_surface_new_revolution_fn (fn, dom[0], dom[1], &surface, &diag);
  else
    st = df_surface_new_graph_fn (fn, dom[0], dom[1], dom[2], dom[3], &surface, &diag);
  if (st != DF_OK)
    {
      fuzz_check_detail ("df_surface_new_*_fn", diag.detail);
      return 0;
    }
  fuzz_check_surface (surface);
  return 0;
}
