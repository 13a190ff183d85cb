/* df-project-extras.h: what a project keeps besides its surface and loops, so that a saved
 * project reproduces everything its design record shows: geodesics, path pairs, probe points
 * and the view. Groups of the project key file (each optional):
 *   [geodesic 1]   name=Seam line, start=U;V, heading-deg=30, length=120
 *   [paths 1]      name=Two routes, a-u=..., a-v=..., b-u=..., b-v=...   (open curves)
 *   [probe 1]      name=Crown, at=U;V
 *   [view]         colouring=gaussian|mean|plain, yaw-deg=-55, pitch-deg=28
 * Reader layer: GLib allowed. */
#pragma once

#include <glib.h>

typedef struct
{
  char  *name;
  double u, v;          /* start, chart coordinates */
  double heading_deg;   /* from +u (t or x), anticlockwise about N */
  double length;
} df_project_geodesic;

typedef struct
{
  char    *name;
  double (*a)[2];
  gsize    n_a;
  double (*b)[2];
  gsize    n_b;
} df_project_paths;

typedef struct
{
  char  *name;
  double u, v;
} df_project_probe;

typedef struct
{
  gboolean set;         /* FALSE: no [view] group */
  char    *colouring;   /* "gaussian", "mean" or "plain" */
  double   yaw_deg;     /* about +z, 0 = eye on +x */
  double   pitch_deg;   /* above the xy plane */
} df_project_view;

typedef struct
{
  GPtrArray      *geodesics;  /* of df_project_geodesic*, owned */
  GPtrArray      *paths;      /* of df_project_paths*, owned */
  GPtrArray      *probes;     /* of df_project_probe*, owned */
  df_project_view view;
} df_project_extras;

void     df_project_extras_init   (df_project_extras *x);
void     df_project_extras_clear  (df_project_extras *x);

/* TRUE for a group name this module reads ("geodesic 2", "paths 1", "probe 3", "view"). */
gboolean df_project_extras_owns_group (const char *group);

/* Reads every group it owns; messages name the file, group and key. u, v ranges are not
 * checked here (the surface decides, when the item is used). */
gboolean df_project_extras_read   (df_project_extras *x, GKeyFile *key_file, const char *source,
                                   GError **error);
void     df_project_extras_write  (const df_project_extras *x, GKeyFile *key_file);

/* Replaces dst's items and view with copies of src's. */
void     df_project_extras_copy (df_project_extras *dst, const df_project_extras *src);

void     df_project_extras_add_geodesic (df_project_extras *x, const char *name, double u,
                                         double v, double heading_deg, double length);
void     df_project_extras_add_paths    (df_project_extras *x, const char *name,
                                         const double (*a)[2], gsize n_a,
                                         const double (*b)[2], gsize n_b);
void     df_project_extras_add_probe    (df_project_extras *x, const char *name, double u,
                                         double v);
