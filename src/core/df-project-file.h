/* df-project-file.h: a driftframe project (a surface and its named loops) as a GLib key file
 * (`.dfproj`): the groups of df-surface-spec.h, then one group per loop:
 *   [loop 1]
 *   name=Rim ply A
 *   colour=#d0563b
 *   frames=true
 *   u=0.1;0.2;...        # chart coordinates, same count as v
 *   v=0.0;0.5;...
 * and optionally the user's limits and display units, [limits] and [units] (df-limits-file.h).
 * Reader layer: GLib allowed. */
#pragma once

#include <glib.h>

#include "df-project-extras.h"
#include "df-limits.h"
#include "df-verdict-shear.h"
#include "df-surface-spec.h"

typedef struct
{
  char    *name;
  char    *colour;       /* "#rrggbb" */
  gboolean show_frames;
  double (*uv)[2];
  gsize    n;
  /* The drape max-shear-deg is checked with (optional keys drape-start=U;V, drape-warp-deg=,
   * drape-cell= in surface units; unset parts take df-verdict-shear.h's defaults). */
  df_shear_setup drape;
} df_project_loop;

/* Title block of the design record, group [record] (each key optional):
 *   title=Lamp-shade mould, part-number=LS-220-01, revision=B, author=A. Fitter */
typedef struct
{
  char *title;
  char *part_number;
  char *revision;
  char *author;
} df_project_record;

typedef struct
{
  df_surface_spec *spec;
  df_project_record record;  /* strings owned; NULL where not given */
  df_project_extras extras;  /* geodesics, path pairs, probes, view */
  GPtrArray       *loops;  /* of df_project_loop*, owned (free func set) */
  df_limits       *limits; /* [limits] and [units] (df-limits-file.h), owned, never NULL */
} df_project;

df_project      *df_project_new        (df_surface_spec *spec);   /* takes spec */
void             df_project_free       (df_project *project);     /* NULL: no-op */
/* Copies name, colour and points. */
void             df_project_add_loop   (df_project *project, const char *name, const char *colour,
                                        gboolean show_frames, const double (*uv)[2], gsize n);
void             df_project_loop_free  (df_project_loop *loop);
/* Copies everything but the surface and the loops (the title block, geodesics, path pairs,
 * probes, view) from src to dst: what an editor that rebuilds a project from its own state must
 * carry over so that saving loses nothing. */
void             df_project_copy_meta  (df_project *dst, const df_project *src);
/* Replaces one title-block field (key "title", "part-number", "revision" or "author"; value
 * NULL or blank clears it). FALSE for an unknown key. */
gboolean         df_project_set_record (df_project *project, const char *key, const char *value);

/* Messages name the file and group: "part.dfproj: [loop 2] u: 7 values but v has 6". */
df_project      *df_project_load       (const char *path, GError **error);
/* Like df_project_load, but a loop group that cannot be read is left out and its message
 * (naming the file and group) added to skipped (of char *, g_free): an editor opens the rest
 * and names the bad one. Everything else fails as in df_project_load. */
df_project      *df_project_load_skipping (const char *path, GPtrArray *skipped,
                                           GError **error);
df_project      *df_project_from_data  (const char *data, const char *source, GError **error);
/* From bytes with their length, so a NUL byte inside is reported instead of cutting the text. */
df_project      *df_project_from_bytes (const char *data, gsize length, const char *source,
                                        GError **error);
char            *df_project_to_data    (const df_project *project);
gboolean         df_project_save       (const df_project *project, const char *path,
                                        GError **error);
