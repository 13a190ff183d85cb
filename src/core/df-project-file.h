/* df-project-file.h: a driftframe project (a surface and its named loops) as a GLib key file
 * (`.dfproj`): the groups of df-surface-spec.h, then one group per loop:
 *   [loop 1]
 *   name=Rim ply A
 *   colour=#d0563b
 *   frames=true
 *   u=0.1;0.2;...        # chart coordinates, same count as v
 *   v=0.0;0.5;...
 * Reader layer: GLib allowed. */
#pragma once

#include <glib.h>

#include "df-surface-spec.h"

typedef struct
{
  char    *name;
  char    *colour;       /* "#rrggbb" */
  gboolean show_frames;
  double (*uv)[2];
  gsize    n;
} df_project_loop;

typedef struct
{
  df_surface_spec *spec;
  GPtrArray       *loops;  /* of df_project_loop*, owned (free func set) */
} df_project;

df_project      *df_project_new        (df_surface_spec *spec);   /* takes spec */
void             df_project_free       (df_project *project);     /* NULL: no-op */
/* Copies name, colour and points. */
void             df_project_add_loop   (df_project *project, const char *name, const char *colour,
                                        gboolean show_frames, const double (*uv)[2], gsize n);
void             df_project_loop_free  (df_project_loop *loop);

/* Messages name the file and group: "part.dfproj: [loop 2] u: 7 values but v has 6". */
df_project      *df_project_load       (const char *path, GError **error);
df_project      *df_project_from_data  (const char *data, const char *source, GError **error);
/* From bytes with their length, so a NUL byte inside is reported instead of cutting the text. */
df_project      *df_project_from_bytes (const char *data, gsize length, const char *source,
                                        GError **error);
char            *df_project_to_data    (const df_project *project);
gboolean         df_project_save       (const df_project *project, const char *path,
                                        GError **error);
