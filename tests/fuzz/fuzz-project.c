/* fuzz-project.c: project file -> save -> reload. Input: the bytes of a .dfproj. Rules: a
 * refused file has a message naming it; a read project written out and read back gives the
 * same surface texts and the same loops bit for bit, and writing that again gives the same
 * text (the writer is a fixed point). */
#include <math.h>
#include <string.h>

#include "df-glib.h"
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
require_same_spec (const df_surface_spec *a, const df_surface_spec *b)
{
  FUZZ_REQUIRE (a->kind == b->kind);
  FUZZ_REQUIRE (g_strcmp0 (a->preset, b->preset) == 0);
  FUZZ_REQUIRE (g_strcmp0 (a->r_text, b->r_text) == 0);
  FUZZ_REQUIRE (g_strcmp0 (a->z_text, b->z_text) == 0);
  for (int i = 0; i < 4; i++)
    FUZZ_REQUIRE (g_strcmp0 (a->range_text[i], b->range_text[i]) == 0);
  FUZZ_REQUIRE (g_strcmp0 (a->units, b->units) == 0);
  FUZZ_REQUIRE (df_params_count (a->params) == df_params_count (b->params));
  for (guint i = 0; i < df_params_count (a->params); i++)
    {
      FUZZ_REQUIRE (g_strcmp0 (df_params_name (a->params, i), df_params_name (b->params, i)) == 0);
      FUZZ_REQUIRE (g_strcmp0 (df_params_text (a->params, i), df_params_text (b->params, i)) == 0);
    }
}

int
LLVMFuzzerTestOneInput (const unsigned char *data, size_t size)
{
  g_autofree char *text = NULL;
  g_autofree char *saved = NULL;
  g_autofree char *saved_again = NULL;
  g_autoptr (df_project) project = NULL;
  g_autoptr (df_project) reloaded = NULL;
  g_autoptr (GError) error = NULL;

  if ((size > FUZZ_MAX_INPUT && !fuzz_replaying))
    return 0;
  project = df_project_from_bytes ((const char *) data, size, "fuzz.dfproj", &error);
  if (project == NULL)
    {
      fuzz_check_error ("df_project_from_bytes", error);
      FUZZ_REQUIRE (g_str_has_prefix (error->message, "fuzz.dfproj"));
      return 0;
    }
  saved = df_project_to_data (project);
  FUZZ_REQUIRE (saved != NULL);
  reloaded = df_project_from_data (saved, "saved.dfproj", &error);
  if (reloaded == NULL)
    {
      fprintf (stderr, "a saved project does not reload: %s\n--- saved:\n%s\n",
               error->message, saved);
      abort ();
    }
  require_same_spec (project->spec, reloaded->spec);
  FUZZ_REQUIRE (project->loops->len == reloaded->loops->len);
  for (guint i = 0; i < project->loops->len; i++)
    {
      const df_project_loop *a = g_ptr_array_index (project->loops, i);
      const df_project_loop *b = g_ptr_array_index (reloaded->loops, i);

      FUZZ_REQUIRE (g_strcmp0 (a->name, b->name) == 0);
      FUZZ_REQUIRE (a->show_frames == b->show_frames);
      FUZZ_REQUIRE (a->n == b->n);
      FUZZ_REQUIRE (memcmp (a->uv, b->uv, a->n * sizeof *a->uv) == 0);
    }
  saved_again = df_project_to_data (reloaded);
  FUZZ_REQUIRE (g_strcmp0 (saved, saved_again) == 0);
  return 0;
}
