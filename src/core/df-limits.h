/* df-limits.h: the user's material and process limits, each a value with its units and a
 * free-text source (a supplier's datasheet, a trial report), and the display units the project
 * asks for. Nothing here has a default: a limit the user has not given is simply not set, so no
 * number of ours is ever passed off as data. Read and written by df-limits-file.c.
 * Plain C + libm; no GLib. */
#pragma once

#include <stdbool.h>

#include "df-status.h"
#include "df-units.h"

typedef enum
{
  DF_LIMIT_MIN_STEERING_RADIUS,  /* length: the tightest in-surface bend a tow may follow */
  DF_LIMIT_TOW_WIDTH,            /* length: shown as the inner-edge compression w / (2R) */
  DF_LIMIT_MAX_FIBRE_DEVIATION,  /* degrees: carried fibre direction vs the intended one */
  DF_LIMIT_MAX_SHEAR,            /* degrees: a woven fabric's locking angle */
  DF_LIMIT_FRICTION,             /* ratio: tow-mandrel friction coefficient, vs |k_g / k_n| */
  DF_LIMIT_MAX_STRAIN,           /* percent: in-plane strain a sheet may take */
  DF_N_LIMITS
} df_limit_id;

typedef enum
{
  DF_LIMIT_KIND_LENGTH,
  DF_LIMIT_KIND_DEGREES,
  DF_LIMIT_KIND_RATIO,
  DF_LIMIT_KIND_PERCENT
} df_limit_kind;

typedef struct
{
  bool    set;
  double  value;        /* as written */
  bool    has_unit;     /* a length written with its unit ("25 mm"); else the surface's units */
  df_unit unit;
  double  model_value;  /* lengths in the surface's units (df_limits_resolve); else = value */
  char   *source;       /* free text, owned; NULL when the user gave none */
} df_limit;

/* A length the decision layer needs that is a choice, not material data (no source): the
 * patch size of max-strain-percent's map. */
typedef struct
{
  bool    set;
  double  value;        /* as written */
  bool    has_unit;
  df_unit unit;
  double  model_value;  /* in the surface's units (df_limits_resolve) */
} df_length_setting;

typedef struct
{
  df_limit item[DF_N_LIMITS];
  /* The disc radius a of max-strain-percent's developability map ([limits] patch-size). */
  df_length_setting patch_size;
  /* Display units from the project's [units] group; unset = the surface's own units. */
  bool     has_length_unit;
  df_unit  length_unit;
  bool     has_curvature_unit;
  df_unit  curvature_unit;
} df_limits;

df_limits    *df_limits_new       (void);                    /* nothing set */
df_limits    *df_limits_copy      (const df_limits *limits);
void          df_limits_free      (df_limits *limits);       /* NULL: no-op */

/* Key in the project file: "min-steering-radius", ...; its kind; the units text of a value
 * that is not a length ("deg", "ratio", "%"). */
const char   *df_limit_key        (df_limit_id id);
df_limit_kind df_limit_kind_of    (df_limit_id id);
const char   *df_limit_kind_units (df_limit_kind kind);

/* Sets a limit (source may be NULL; copied). */
void          df_limits_set       (df_limits *limits, df_limit_id id, double value,
                                   bool has_unit, df_unit unit, const char *source);

/* Computes model_value for every set limit (and patch_size) given the surface's units label. Fails with
 * DF_E_INPUT (diag index = the limit id) when a length carries a unit but the surface's label
 * is not a known unit, so the two cannot be related. */
df_status     df_limits_resolve   (df_limits *limits, const char *surface_units, df_diag *diag);

/* The display units: what the project asks for, else the surface's own (a label that is not a
 * known unit counts as mm for conversion purposes only when nothing is asked: then nothing is
 * converted). Returns false when a conversion is asked for but the surface's units are not a
 * known unit. */
bool          df_limits_display_units (const df_limits *limits, const char *surface_units,
                                       df_display_units *out);
