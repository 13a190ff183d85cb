/* fuzz-data.c: measured-point files -> fitted surface -> geometry, through the same path a
 * surface file's profile= or heights= key takes (df-surface-spec.c, df-data-csv.c, df-fit*.c).
 * Input: one byte choosing the kind and the fit (bit 0: heights x,y,z rather than a profile
 * r,z; bit 1: a fit tolerance of 0.01 rather than 0, interpolation), then the bytes of the
 * CSV. Rules: a refused file has a message naming the data file; a built surface keeps the rules
 * of fuzz-surface-check.h. The CSV goes to a file of this process's own in a temporary folder,
 * since the reader takes a path. */
#include <glib/gstdio.h>
#include <unistd.h>

#include "df-surface-spec-private.h"
#include "fuzz-common.h"
#include "fuzz-surface-check.h"

/* A few thousand rows keep one execution of the fit well under a second. */
#define FUZZ_MAX_INPUT 65536

int LLVMFuzzerInitialize (int *argc, char ***argv);

static char *work_dir;

int
LLVMFuzzerInitialize (int *argc, char ***argv)
{
  df_core_init ();
  return 0;
}

static const char *
folder (void)
{
  if (work_dir == NULL)
    work_dir = g_dir_make_tmp ("df-fuzz-data-XXXXXX", NULL);
  return work_dir;
}

int
LLVMFuzzerTestOneInput (const unsigned char *data, size_t size)
{
  g_autofree char *csv_path = NULL;
  g_autofree char *surface_path = NULL;
  g_autofree char *text = NULL;
  g_autoptr (GKeyFile) key_file = NULL;
  g_autoptr (df_surface_spec) spec = NULL;
  g_autoptr (df_surface) surface = NULL;
  g_autoptr (GError) error = NULL;
  gboolean heights;

  if (size < 1 || (size > FUZZ_MAX_INPUT && !fuzz_replaying) || folder () == NULL)
    return 0;
  heights = (data[0] & 1) != 0;
  csv_path = g_build_filename (folder (), "points.csv", NULL);
  surface_path = g_build_filename (folder (), "data.surface", NULL);
  FUZZ_REQUIRE (g_file_set_contents (csv_path, (const char *) data + 1, (gssize) size - 1, NULL));
  text = g_strdup_printf ("[surface]\nkind=%s\n%s=points.csv\nfit-tolerance=%s\nunits=mm\n",
                          heights ? "graph" : "revolution", heights ? "heights" : "profile",
                          (data[0] & 2) ? "0.01" : "0");
  key_file = _df_key_file_load_bytes (text, strlen (text), surface_path, &error);
  FUZZ_REQUIRE (key_file != NULL);
  spec = df_surface_spec_from_key_file (key_file, surface_path, &error);
  if (spec == NULL)
    {
      fuzz_check_error ("df_surface_spec_from_key_file", error);
      return 0;
    }
  surface = df_surface_spec_build (spec, &error);
  if (surface == NULL)
    {
      fuzz_check_error ("df_surface_spec_build", error);
      /* The complaint is about the data: it names the data file (or the surface file that
       * names it). */
      FUZZ_REQUIRE (strstr (error->message, "points.csv") != NULL
                    || strstr (error->message, "data.surface") != NULL);
      return 0;
    }
  fuzz_check_surface (surface);
  return 0;
}
