/* df-units.h: length units as a real choice (mm, cm, m, in): conversion factors for lengths,
 * areas, curvatures (1/length) and Gaussian curvatures (1/length^2). A surface is defined in its
 * own units (its `units` key); the project's display units convert every value shown or
 * exported by the commands that honour them (check, gores, devmap).
 * Plain C + libm; no GLib. */
#pragma once

#include <stdbool.h>

typedef enum
{
  DF_UNIT_MM,
  DF_UNIT_CM,
  DF_UNIT_M,
  DF_UNIT_IN,
  DF_N_UNITS
} df_unit;

/* "mm", "cm", "m", "in" (also "inch"); false for anything else (the surface's label may then
 * be any text, but nothing can be converted). */
bool        df_unit_from_name    (const char *name, df_unit *out);
const char *df_unit_name         (df_unit unit);         /* "mm", ... */
/* Metres per unit: mm 0.001, cm 0.01, m 1, in 0.0254 (exact by definition of the inch). */
double      df_unit_metres       (df_unit unit);

/* A length, area, curvature (1/length) or Gaussian curvature (1/length^2) given in `from`,
 * expressed in `to`. */
double      df_unit_length       (double value, df_unit from, df_unit to);
double      df_unit_area         (double value, df_unit from, df_unit to);
double      df_unit_curvature    (double value, df_unit from, df_unit to);
double      df_unit_gaussian     (double value, df_unit from, df_unit to);

/* What the user asked to see: lengths in one unit, Gaussian curvature per square of another
 * (e.g. lengths in mm, K in 1/m^2). `model` is the surface's own unit. */
typedef struct
{
  df_unit model;
  df_unit length;
  df_unit curvature;   /* K in 1/curvature^2, k_g in 1/length */
} df_display_units;

/* All three the same unit. */
void        df_display_units_init (df_display_units *units, df_unit model);
