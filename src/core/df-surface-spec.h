/* df-surface-spec.h: the user's description of a surface (preset or formulas, ranges, named
 * parameters, units), its GLib key file form (`.surface`, group [surface] and [parameters]) and
 * the presets. It is what is edited and saved; df_surface_spec_build() turns it into a
 * df_surface. Reader layer: GLib allowed.
 *
 * Key file:
 *   [surface]
 *   kind=revolution            # or graph
 *   r=R*sin(t)                 # revolution: r, z, t-min, t-max
 *   z=R*cos(t)
 *   t-min=0
 *   t-max=pi
 *   units=mm                   # optional, default mm
 *   t-units=length             # optional (revolution): what t is measured in: "length" (the
 *                              # surface's units, following them), or any label ("rad", "deg")
 *   [parameters]               # optional, in order; values may use earlier parameters
 *   R=120
 * A graph has z=f(x, y) and x-min, x-max, y-min, y-max. Range values are expressions too.
 *
 * Surfaces from data (df-fit.h) name a CSV file instead of formulas and ranges, relative to
 * the file that names them:
 *   kind=revolution  profile=mould.csv   (header r,z; points in order along the profile)
 *   kind=graph       heights=panel.csv   (header x,y,z; a full grid of heights)
 *   kind=graph       mesh=fairing.stl    (a triangle mesh, .stl/.obj/.ply: vertices fitted
 *                                         as heights; a mesh that folds over is refused)
 *   kind=revolution  mesh=mould.stl      (vertices' (sqrt(x^2+y^2), z) fitted as a profile)
 *   placement-rotate-deg=AX,AY,AZ        # optional (heights, mesh): the data turned AX degrees
 *                                        # about x, then AY about y, then AZ about z ...
 *   placement-offset=X,Y,Z               # ... then moved by (X, Y, Z), before fitting
 *   units=mm                             # the unit of the file's numbers: mm, cm, m or in
 *   fit-tolerance=0.01                   # optional: RMS distance the fit may keep, in units;
 *                                        # 0 interpolates; absent: chosen from the data (GCV)
 *   data-sha256=...                      # written on save; checked on load */
#pragma once

#include <glib.h>

#include "df-expr-parse.h"
#include "df-surface.h"

typedef struct
{
  df_surface_type kind;
  char      *preset;        /* preset name it came from, or NULL */
  char      *r_text;        /* revolution profile */
  char      *z_text;        /* revolution: z(t); graph: z(x, y) */
  char      *range_text[4]; /* t-min, t-max, (unused, unused)  or  x-min, x-max, y-min, y-max */
  df_params *params;
  char      *units;         /* "mm" unless given */
  /* Revolution: what the profile parameter t is measured in, as key t-units states it
   * ("length" = the surface's units; presets set it); NULL: not stated. */
  char      *t_units;
  /* A surface from data: data_key "profile" or "heights" (NULL for formulas), data_path as
   * written, base_dir the folder of the file naming it (NULL: the working folder), and the
   * fit-tolerance text (NULL: chosen from the data). */
  char      *data_key;
  char      *data_path;
  char      *base_dir;
  char      *fit_tolerance_text;
  /* SHA-256 of the data file as first read (key data-sha256): a saved project records it,
   * and a file that changed since is reported on load, never silently re-fitted. */
  char      *data_sha256;
  /* Placement of the data before fitting (heights= and mesh= only): "AX,AY,AZ" degrees about
   * the fixed x, y, z axes in that order, then the offset "X,Y,Z" in units; NULL: none. */
  char      *placement_rotate_text;
  char      *placement_offset_text;
} df_surface_spec;

/* A surface fitted to the data file path (key "profile" for a revolution, "heights" for a
 * graph; "mesh" for either when path ends in .stl, .obj or .ply). */
df_surface_spec *df_surface_spec_new_data       (df_surface_type kind, const char *path,
                                                 const char *fit_tolerance_text);
/* The data file's path as opened (base_dir applied; g_free), or NULL for formulas. */
char            *df_surface_spec_data_file      (const df_surface_spec *spec);
/* The data points of a surface from data as they are fitted (placement applied; a profile's
 * (r, z) as (r, 0, z); a mesh's vertices), *n of them (g_free), in file order. Errors as the
 * build's reader: the file and the line. */
gboolean         df_surface_spec_read_data_points (const df_surface_spec *spec,
                                                   double (**xyz)[3], gsize *n,
                                                   GError **error);

df_surface_spec *df_surface_spec_new_revolution (const char *r_text, const char *z_text,
                                                 const char *t_min_text, const char *t_max_text);
df_surface_spec *df_surface_spec_new_graph      (const char *z_text,
                                                 const char *x_min_text, const char *x_max_text,
                                                 const char *y_min_text, const char *y_max_text);
/* The unit of t to show beside it: the surface's units for a profile fitted to data (t is its
 * arc length) or t-units=length, else the t-units text; NULL when nothing says (t may then be
 * an angle, a length or a pure number) and for graphs, whose x, y are in the surface's units. */
const char      *df_surface_spec_t_units        (const df_surface_spec *spec);
df_surface_spec *df_surface_spec_copy           (const df_surface_spec *spec);
void             df_surface_spec_free           (df_surface_spec *spec);   /* NULL: no-op */

/* Builds the surface. Errors name the key: "r: column 5: expected an operand after '*'",
 * "t-max: must be greater than t-min (0)", or the core's geometry complaint with its t. */
df_surface      *df_surface_spec_build          (const df_surface_spec *spec, GError **error);

/* Key file group [surface] (+ [parameters]); source names the file in messages
 * ("lamp.surface: [surface] r: column 5: ..."). */
df_surface_spec *df_surface_spec_from_key_file  (GKeyFile *key_file, const char *source,
                                                 GError **error);
void             df_surface_spec_to_key_file    (const df_surface_spec *spec, GKeyFile *key_file);
df_surface_spec *df_surface_spec_load           (const char *path, GError **error);
gboolean         df_surface_spec_save           (const df_surface_spec *spec, const char *path,
                                                 GError **error);

/* Presets: plane, sphere, torus, catenoid, pseudosphere, cone, paraboloid, saddle, bump and
 * more; each written so that N points outward. */
typedef struct
{
  const char *name;         /* "sphere" */
  const char *title;        /* "Sphere" */
  const char *description;  /* one sentence */
} df_preset_info;

/* NULL-terminated by a zero entry. */
const df_preset_info *df_presets_list           (void);
/* A fresh spec with the preset's default parameters; error VALUE for an unknown name (the
 * message lists the known ones). */
df_surface_spec *df_surface_spec_new_preset     (const char *name, GError **error);
/* Sets one parameter from "KEY=VALUE" text or key and value; error for an unknown key. */
gboolean         df_surface_spec_set_param      (df_surface_spec *spec, const char *key,
                                                 const char *value_text, GError **error);
