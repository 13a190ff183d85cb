/* fuzz-surface.c: surface key file -> surface -> local geometry. Input: the bytes of a
 * .surface file. Rules: a refused file has a message naming the file; a built surface has a
 * finite, positive size and a finite box; geometry at a few chart points (ends, middle, near
 * the corners) either succeeds with finite K and H or fails with a message. */
#include <math.h>

#include "df-glib.h"
#include "df-geometry.h"
#include "df-project.h"
#include "df-surface-spec-private.h"
#include "fuzz-common.h"

#define FUZZ_MAX_INPUT 8192

int LLVMFuzzerInitialize (int *argc, char ***argv);

int
LLVMFuzzerInitialize (int *argc, char ***argv)
{
  df_core_init ();
  return 0;
}

static void
check_surface (const df_surface *s)
{
  static const double fractions[][2] = { { 0.0, 0.0 }, { 0.5, 0.5 }, { 1.0, 1.0 },
                                         { 0.25, 0.875 }, { 1e-7, 0.5 } };
  double u0, u1, v0, v1, lo[3], hi[3];

  FUZZ_REQUIRE (isfinite (df_surface_size (s)) && df_surface_size (s) > 0.0);
  df_surface_get_bbox (s, lo, hi);
  for (int k = 0; k < 3; k++)
    FUZZ_REQUIRE (isfinite (lo[k]) && isfinite (hi[k]) && lo[k] <= hi[k]);
  df_surface_get_domain (s, &u0, &u1, &v0, &v1);
  for (gsize i = 0; i < G_N_ELEMENTS (fractions); i++)
    {
      double u = u0 + (u1 - u0) * fractions[i][0];
      double v = v0 + (v1 - v0) * fractions[i][1];
      df_point_geometry g;
      df_diag diag;

      df_diag_clear (&diag);
      if (df_surface_geometry (s, u, v, &g, &diag) == DF_OK)
        {
          FUZZ_REQUIRE (isfinite (g.K) && isfinite (g.H));
          for (int k = 0; k < 3; k++)
            FUZZ_REQUIRE (isfinite (g.point[k]) && isfinite (g.normal[k]));
        }
      else
        fuzz_check_detail ("df_surface_geometry", diag.detail);
    }
  {
    /* The box centre pushed off the surface: placing it gives a point or a message. */
    double p[3], u, v, dist;
    df_diag diag;

    for (int k = 0; k < 3; k++)
      p[k] = 0.5 * (lo[k] + hi[k]);
    p[2] = hi[2] + 0.01 * df_surface_size (s);
    df_diag_clear (&diag);
    if (df_surface_project (s, p, 0.0, &u, &v, &dist, &diag) == DF_OK)
      FUZZ_REQUIRE (isfinite (u) && isfinite (v) && isfinite (dist));
    else
      fuzz_check_detail ("df_surface_project", diag.detail);
  }
}

int
LLVMFuzzerTestOneInput (const unsigned char *data, size_t size)
{
  g_autoptr (GKeyFile) key_file = NULL;
  g_autoptr (df_surface_spec) spec = NULL;
  g_autoptr (df_surface) surface = NULL;
  g_autoptr (GError) error = NULL;

  if ((size > FUZZ_MAX_INPUT && !fuzz_replaying))
    return 0;
  key_file = _df_key_file_load_bytes ((const char *) data, size, "fuzz.surface", &error);
  if (key_file == NULL)
    {
      fuzz_check_error ("load", error);
      FUZZ_REQUIRE (g_str_has_prefix (error->message, "fuzz.surface"));
      return 0;
    }
  spec = df_surface_spec_from_key_file (key_file, "fuzz.surface", &error);
  if (spec == NULL)
    {
      fuzz_check_error ("df_surface_spec_from_key_file", error);
      FUZZ_REQUIRE (g_str_has_prefix (error->message, "fuzz.surface"));
      return 0;
    }
  surface = df_surface_spec_build (spec, &error);
  if (surface == NULL)
    {
      fuzz_check_error ("df_surface_spec_build", error);
      return 0;
    }
  check_surface (surface);
  return 0;
}
