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
#include "fuzz-surface-check.h"

#define FUZZ_MAX_INPUT 8192

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
  fuzz_check_surface (surface);
  return 0;
}
