/* df-cli-main.c: entry point of driftframe-cli: picks the subcommand from the first argument
 * and hands it the rest. Thin layer: each command lives in its own file. */
#include <malloc.h>
#include <locale.h>
#include <stdio.h>
#include <string.h>

#include "df-cli-commands.h"
#include "df-cli-common.h"

typedef struct
{
  const char *name;
  int       (*run) (int argc, char **argv);
  const char *summary;
} command;

static const command commands[] = {
  { "measure", df_cli_measure, "holonomy, enclosed curvature and steering of a closed loop" },
  { "probe", df_cli_probe, "metric, connection and curvature at a point" },
  { "compare", df_cli_compare, "angle between a direction carried along two paths" },
  { "geodesic", df_cli_geodesic, "trace a geodesic (a straight-laid path) from a point" },
  { "drape", df_cli_drape, "drape a woven ply: shear, locking cells and the flat pattern" },
  { "report", df_cli_report, "measure every loop of a project file" },
  { "check", df_cli_check, "check every loop of a project against its limits (exit 3: exceeded)" },
  { "gores", df_cli_gores, "flat pattern of gores of a surface of revolution (SVG, CSV)" },
  { "devmap", df_cli_devmap, "where a flat patch of a given size cannot follow the surface" },
  { "presets", df_cli_presets, "list the built-in surfaces and their parameters" },
};

static void
print_usage (FILE *out)
{
  fputs ("Usage: driftframe-cli COMMAND [OPTION...]\n\n"
         "How a doubly curved surface turns a direction carried across it.\n\n"
         "Commands:\n", out);
  for (gsize i = 0; i < G_N_ELEMENTS (commands); i++)
    fprintf (out, "  %-10s %s\n", commands[i].name, commands[i].summary);
  fputs ("\n`driftframe-cli COMMAND --help` describes each command's options.\n"
         "Exit status: 0 done, 2 bad input (the message names the file, line or option),\n"
         "1 an output file could not be written, 3 (check) a limit is exceeded.\n", out);
}

int
main (int argc, char **argv)
{
  const char *name;

  /* Messages and --help follow the user's locale; numbers are read and written in the C
   * locale by the parsers and writers themselves. */
  setlocale (LC_ALL, "");
  /* Keep freed blocks in the process: glibc returns large ones to the system at each free, and
   * a fresh page costs more here than the work done on it (a loop of 10 000 points allocates a
   * few megabytes per measurement). */
  mallopt (M_MMAP_THRESHOLD, 64 << 20);
  mallopt (M_TRIM_THRESHOLD, 128 << 20);
  df_core_init ();

  if (argc < 2)
    {
      print_usage (stderr);
      return DF_CLI_EXIT_INPUT;
    }
  name = argv[1];
  if (g_str_equal (name, "--help") || g_str_equal (name, "-h") || g_str_equal (name, "help"))
    {
      print_usage (stdout);
      return DF_CLI_EXIT_OK;
    }
  if (g_str_equal (name, "--version"))
    {
      puts ("driftframe-cli " DF_VERSION);
      return DF_CLI_EXIT_OK;
    }

  for (gsize i = 0; i < G_N_ELEMENTS (commands); i++)
    if (g_str_equal (name, commands[i].name))
      {
        g_autofree char *arg0 = g_strdup_printf ("driftframe-cli %s", name);
        int code;

        /* The command sees "driftframe-cli NAME" as its program name, which GOptionContext
         * shows in its usage line. */
        argv[1] = arg0;
        code = commands[i].run (argc - 1, argv + 1);
        argv[1] = (char *) name;
        return code;
      }

  fprintf (stderr, "driftframe-cli: unknown command '%s' (commands: measure, probe, compare, "
           "geodesic, drape, report, check, gores, devmap, presets; see driftframe-cli --help)\n", name);
  return DF_CLI_EXIT_INPUT;
}
