/* fuzz-replay.c: runs a fuzz target's LLVMFuzzerTestOneInput on files, without libFuzzer, so
 * the corpora and every input that ever crashed are checked by `meson test` with any
 * compiler. Arguments are files or directories (every regular file in them, sorted). Prints
 * one TAP case per input; a broken rule aborts inside the target, which fails the test. */
#define FUZZ_REPLAY_MAIN 1

#include <glib.h>
#include <stdio.h>

#include "df-status.h"
#include "fuzz-common.h"

int LLVMFuzzerInitialize (int *argc, char ***argv);

int fuzz_replaying = 1;

static int
compare_paths (gconstpointer a, gconstpointer b)
{
  return g_strcmp0 (*(const char *const *) a, *(const char *const *) b);
}

static void
add_path (GPtrArray *files, const char *path)
{
  g_autoptr (GDir) dir = NULL;
  g_autoptr (GPtrArray) names = NULL;
  const char *name;

  if (!g_file_test (path, G_FILE_TEST_IS_DIR))
    {
      g_ptr_array_add (files, g_strdup (path));
      return;
    }
  dir = g_dir_open (path, 0, NULL);
  if (dir == NULL)
    return;
  names = g_ptr_array_new_with_free_func (g_free);
  while ((name = g_dir_read_name (dir)) != NULL)
    if (name[0] != '.')
      g_ptr_array_add (names, g_build_filename (path, name, NULL));
  g_ptr_array_sort (names, compare_paths);
  for (guint i = 0; i < names->len; i++)
    if (g_file_test (g_ptr_array_index (names, i), G_FILE_TEST_IS_REGULAR))
      g_ptr_array_add (files, g_strdup (g_ptr_array_index (names, i)));
}

int
main (int argc, char **argv)
{
  g_autoptr (GPtrArray) files = g_ptr_array_new_with_free_func (g_free);

  LLVMFuzzerInitialize (&argc, &argv);
  for (int i = 1; i < argc; i++)
    add_path (files, argv[i]);
  if (files->len == 0)
    {
      fprintf (stderr, "fuzz-replay: no input files\n");
      return 1;
    }
  printf ("1..%u\n", files->len);
  for (guint i = 0; i < files->len; i++)
    {
      const char *path = g_ptr_array_index (files, i);
      g_autofree char *data = NULL;
      gsize len = 0;

      if (!g_file_get_contents (path, &data, &len, NULL))
        {
          printf ("not ok %u - %s: cannot read\n", i + 1, path);
          return 1;
        }
      fprintf (stderr, "%s\n", path);
      LLVMFuzzerTestOneInput ((const unsigned char *) data, len);
      printf ("ok %u - %s\n", i + 1, path);
      fflush (stdout);
    }
  return 0;
}
