/* fuzz-param.c: --param values on the presets. Input: one byte choosing the preset, then
 * lines as typed after --param ("R=1e300", "alpha_deg=90"). Each line goes through
 * df_surface_spec_set_param exactly as the CLI passes it, then the surface is built and its
 * geometry taken at the middle of the chart. Rules: a refused value has a message free of
 * non-finite numbers; a built surface has a finite positive size and finite geometry or a
 * message. */
#include <math.h>

#include "df-glib.h"
#include "df-geometry.h"
#include "fuzz-common.h"

#define FUZZ_MAX_INPUT 1024

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
  const df_preset_info *presets = df_presets_list ();
  g_autofree char *text = NULL;
  g_auto (GStrv) lines = NULL;
  g_autoptr (df_surface_spec) spec = NULL;
  g_autoptr (df_surface) surface = NULL;
  g_autoptr (GError) error = NULL;
  gsize n_presets = 0;

  if (size < 1 || (size > FUZZ_MAX_INPUT && !fuzz_replaying))
    return 0;
  while (presets[n_presets].name != NULL)
    n_presets++;
  spec = df_surface_spec_new_preset (presets[data[0] % n_presets].name, &error);
  FUZZ_REQUIRE (spec != NULL);
  text = fuzz_string (data + 1, size - 1);
  lines = g_strsplit (text, "\n", 8);
  for (gsize i = 0; lines[i] != NULL; i++)
    if (!df_surface_spec_set_param (spec, lines[i], NULL, &error))
      {
        fuzz_check_error ("df_surface_spec_set_param", error);
        return 0;
      }
  surface = df_surface_spec_build (spec, &error);
  if (surface == NULL)
    {
      fuzz_check_error ("df_surface_spec_build", error);
      return 0;
    }
  FUZZ_REQUIRE (isfinite (df_surface_size (surface)) && df_surface_size (surface) > 0.0);
  {
    double u0, u1, v0, v1;
    df_point_geometry g;
    df_diag diag;

    df_surface_get_domain (surface, &u0, &u1, &v0, &v1);
    df_diag_clear (&diag);
    if (df_surface_geometry (surface, 0.5 * (u0 + u1), 0.5 * (v0 + v1), &g, &diag) == DF_OK)
      FUZZ_REQUIRE (isfinite (g.K) && isfinite (g.H));
    else
      fuzz_check_detail ("df_surface_geometry", diag.detail);
  }
  return 0;
}
