/* df-test-cli.h: what the tests that run the built driftframe-cli (DF_CLI_PATH) share: a
 * temporary folder (tmp_dir, made and removed by each test's main), running the CLI with its
 * exit status and output, and parsing its JSON. Included by one test program each. */
#pragma once

#include <glib/gstdio.h>
#include <json-glib/json-glib.h>

#include "df-test.h"

static char *tmp_dir;

typedef struct
{
  int   status;   /* exit code */
  char *out;
  char *err;
} cli_run;

static inline void
cli_run_clear (cli_run *r)
{
  g_clear_pointer (&r->out, g_free);
  g_clear_pointer (&r->err, g_free);
}

G_DEFINE_AUTO_CLEANUP_CLEAR_FUNC (cli_run, cli_run_clear)

static inline char *
tmp_path (const char *name)
{
  return g_build_filename (tmp_dir, name, NULL);
}

static inline char *
write_tmp (const char *name, const char *text)
{
  char *path = tmp_path (name);

  g_assert_true (g_file_set_contents (path, text, -1, NULL));
  return path;
}

/* Runs the CLI with a NULL-terminated argument list. */
static inline void
run_cli (cli_run *r, const char *first, ...)
{
  g_autoptr (GPtrArray) argv = g_ptr_array_new ();
  g_autoptr (GError) error = NULL;
  g_autoptr (GError) exit_error = NULL;
  int wait_status = 0;
  va_list args;

  g_ptr_array_add (argv, (char *) DF_CLI_PATH);
  va_start (args, first);
  for (const char *a = first; a != NULL; a = va_arg (args, const char *))
    g_ptr_array_add (argv, (char *) a);
  va_end (args);
  g_ptr_array_add (argv, NULL);

  g_assert_true (g_spawn_sync (NULL, (char **) argv->pdata, NULL, G_SPAWN_DEFAULT, NULL, NULL,
                               &r->out, &r->err, &wait_status, &error));
  g_assert_no_error (error);
  if (g_spawn_check_wait_status (wait_status, &exit_error))
    r->status = 0;
  else
    {
      g_assert_true (exit_error->domain == G_SPAWN_EXIT_ERROR);
      r->status = exit_error->code;
    }
  g_test_message ("exit %d\nstdout: %s\nstderr: %s", r->status, r->out, r->err);
}

static inline JsonObject *
parse_object (JsonParser *parser, const char *text)
{
  g_autoptr (GError) error = NULL;

  g_assert_true (json_parser_load_from_data (parser, text, -1, &error));
  g_assert_no_error (error);
  g_assert_true (JSON_NODE_HOLDS_OBJECT (json_parser_get_root (parser)));
  return json_node_get_object (json_parser_get_root (parser));
}
