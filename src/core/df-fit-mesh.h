/* df-fit-mesh.h: smooth surfaces fitted to a triangle mesh's vertices (the mesh as read by
 * df-mesh-read.h): a graph z = f(x, y) through the height fit (df_fit_grid: scattered points,
 * or a lattice when the vertices form one), refused where the mesh folds over; or a surface of
 * revolution about z through the profile fit of the vertices' (sqrt(x^2 + y^2), z), with how
 * far the part departs from rotational symmetry. Messages name the triangle or vertex (0-based
 * as in the file) and its place. Plain C + libm + GSL; no GLib. */
#pragma once

#include <stddef.h>

#include "df-fit.h"

typedef struct
{
  const double   (*vertices)[3];
  size_t           n_vertices;
  const unsigned (*triangles)[3];
  size_t           n_triangles;
  size_t           n_other_faces;     /* faces that are no triangle: refused as degenerate */
  size_t           first_other_face;
} df_fit_mesh_input;

/* The vertices that triangles use, as a height map. DF_E_INPUT for: a degenerate triangle (a
 * face with fewer than three distinct corners, or corners on a line), a triangle that stands
 * vertical or faces the other way seen from +z (the mesh folds over), a vertex over another
 * part of the mesh or two vertices at one (x, y) with different heights. */
df_status df_fit_mesh_graph      (const df_fit_mesh_input *mesh,
                                  double                   tolerance,
                                  df_fn                  **out,
                                  df_fit_info             *info,
                                  df_diag                 *diag);

/* The vertices' (r, z), r = sqrt(x^2 + y^2), ordered along the profile (by z, or by r where
 * the profile is single-valued in r rather than z, e.g. a flat annulus), averaged over the
 * angle in short pieces of the profile and fitted by df_fit_profile. info: points = vertices;
 * rms, max = the vertices' distance from the fitted profile; has_symmetry and symmetry_*
 * (df-fit.h). DF_E_INPUT for degenerate triangles, and a profile with fewer than 8 places. */
df_status df_fit_mesh_revolution (const df_fit_mesh_input *mesh,
                                  double                   tolerance,
                                  df_fn                  **out,
                                  df_fit_info             *info,
                                  df_diag                 *diag);
