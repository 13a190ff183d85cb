/* df-display-units.h: DfDisplayUnits, the units the app shows and exports values in: the
 * project's [units] choice (lengths in mm, cm, m or in; Gaussian curvature per square of one of
 * them) over the surface's own unit, with the one set of helpers every readout goes through.
 * Values are kept in the surface's units everywhere else; they are converted only here, on the
 * way to the screen or a file, and typed lengths come back through df_du_to_model. When the
 * surface's units label is not a known unit nothing is converted and the label is shown as
 * written (df_limits_display_units' rule). */
#pragma once

#include <glib.h>

#include "df-limits.h"
#include "df-loop.h"

G_BEGIN_DECLS

typedef struct
{
  df_display_units units;    /* model (the surface's), length, curvature */
  gboolean         known;    /* the surface's label is a known unit: a choice is possible */
  char             label[32]; /* the surface's own label, shown when nothing converts */
  /* What a profile's t is measured in (df_surface_spec_t_units: "mm", "rad"...), "" when
   * nothing says; set by df_document_get_display_units. Chart coordinates stay in the
   * surface's own units: this only labels them. */
  char             t_unit[24];
} DfDisplayUnits;

/* From the project's limits (may be NULL) and the surface's units label (NULL: "mm"). */
void        df_du_resolve          (DfDisplayUnits  *out,
                                    const df_limits *limits,
                                    const char      *surface_units);
/* The surface's own units, nothing converted. */
void        df_du_identity         (DfDisplayUnits  *out,
                                    const char      *surface_units);
/* TRUE when some value shows in another unit than the surface's. */
gboolean    df_du_converts         (const DfDisplayUnits *u);

/* "m" (the chosen length unit, or the surface's label); the unit K is per square of. */
const char *df_du_length_unit      (const DfDisplayUnits *u);
const char *df_du_curvature_unit   (const DfDisplayUnits *u);

/* A value in the surface's units as shown: lengths and points, areas, 1/length (k_g, H, k1,
 * k2, a tow's steering curvature) and Gaussian curvature K (1/curvature unit^2). */
double      df_du_length           (const DfDisplayUnits *u, double model);
double      df_du_area             (const DfDisplayUnits *u, double model);
double      df_du_per_length       (const DfDisplayUnits *u, double model);
double      df_du_gaussian         (const DfDisplayUnits *u, double model);
/* A surface curvature (H, k1, k2) per the curvature unit, as the CLI's probe gives it: K = k1 k2
 * holds in the figures shown. (A curve's k_g stays per length unit: df_du_per_length.) */
double      df_du_per_curvature    (const DfDisplayUnits *u, double model);
/* A length typed in the display unit, in the surface's units. */
double      df_du_to_model         (const DfDisplayUnits *u, double shown);

/* df-format's forms of the converted values: "0.1234 m", "0.0123 m²", "8.1 1/m",
 * "69 1/m²" (never nan or inf: an em dash); per_curvature: "8.1 1/m" per the curvature unit. */
char       *df_du_format_length    (const DfDisplayUnits *u, double model);
char       *df_du_format_area      (const DfDisplayUnits *u, double model);
char       *df_du_format_per_length (const DfDisplayUnits *u, double model);
char       *df_du_format_gaussian  (const DfDisplayUnits *u, double model);
char       *df_du_format_per_curvature (const DfDisplayUnits *u, double model);

/* A chart point: "t = 90 mm, φ = 5°" on a surface of revolution (t as the surface defines it,
 * with its unit when known; φ in degrees wrapped to (−180°, 180°]), "x = 0.012, y = −0.003 m"
 * on a graph (its plan coordinates, lengths in space, in the display unit). */
char       *df_du_format_chart_point (const DfDisplayUnits *u, gboolean revolution, double cu,
                                      double cv);

/* A measured loop in the display units, for an export (df_loop_result_convert_display, as the
 * CLI's report converts: lengths and k_g per length unit, K per curvature unit squared); free
 * with df_du_loop_result_free. */
df_loop_result *df_du_loop_result_copy (const DfDisplayUnits *u, const df_loop_result *result);
void        df_du_loop_result_free (df_loop_result *result);

G_END_DECLS
