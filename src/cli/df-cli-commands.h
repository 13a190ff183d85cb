/* df-cli-commands.h: the subcommands of driftframe-cli, one file each. Each takes the
 * arguments after the command word (argv[0] = "driftframe-cli NAME") and returns the exit code
 * (df-cli-common.h). */
#pragma once

int df_cli_check    (int argc, char **argv);
int df_cli_devmap   (int argc, char **argv);
int df_cli_gores    (int argc, char **argv);
int df_cli_measure  (int argc, char **argv);
int df_cli_probe    (int argc, char **argv);
int df_cli_compare  (int argc, char **argv);
int df_cli_geodesic (int argc, char **argv);
int df_cli_drape    (int argc, char **argv);
int df_cli_presets  (int argc, char **argv);
int df_cli_report   (int argc, char **argv);
