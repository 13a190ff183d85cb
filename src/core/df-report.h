/* df-report.h: the design record as a PDF: a title block, the inputs (surface definition, data
 * files and their SHA-256), the conventions, a picture of the surface with its loops and legend,
 * a summary table and a section per loop (figures with units, the Gauss-Bonnet residual, k_g
 * against arc length, the user's limit verdicts with their sources), the caution and page
 * numbers, on A4 or Letter. Drawn with cairo and pango, so the CLI writes it without a display;
 * written atomically. Reader/writer layer: GLib, cairo and pango allowed. */
#pragma once

#include <cairo.h>
#include <glib.h>

#include "df-loop.h"
#include "df-surface-spec.h"

typedef enum
{
  DF_PAPER_A4,
  DF_PAPER_LETTER
} df_paper;

/* "a4" or "letter" (any case); FALSE for anything else. */
gboolean df_paper_from_name (const char *name, df_paper *out);

typedef struct
{
  const char *key;
  const char *value;
  gboolean    mono;   /* set in a fixed-width font that keeps a hash on one line */
} df_report_field;

typedef struct
{
  const char           *name;
  const char           *colour;     /* "#rrggbb"; NULL: a dark grey */
  const double        (*uv)[2];     /* the loop's chart points (for the picture) */
  gsize                 n;
  const df_loop_result *result;     /* NULL when the loop could not be measured */
  const char           *failure;    /* why, when result is NULL */
  /* Optional lines under the figures, NULL-terminated: limit verdicts (each with its source),
   * dart and gore results. */
  const char *const    *verdicts;
  const char *const    *extra;
  gboolean              checked;       /* limits were checked: n_exceeded is meaningful */
  guint                 n_exceeded;    /* stretches beyond a limit */
  /* Optional limit drawn on the k_g plot as +/- 1/R (R the user's minimum steering radius);
   * 0: none. */
  double                kg_limit;
} df_report_loop;

/* A titled block of fields (a geodesic, a path pair, a probe point). */
typedef struct
{
  const char            *title;
  const df_report_field *fields;
  gsize                  n_fields;
} df_report_section;

/* An open curve drawn in the picture (a geodesic or a path). */
typedef struct
{
  const char    *name;
  double         rgb[3];
  const double (*xyz)[3];
  gsize          n;
} df_report_curve;

/* The picture's view when none is saved: seen from above and in front, a little to the left,
 * the angle a part is drawn at on a general-arrangement sheet. */
#define DF_REPORT_DEFAULT_YAW_DEG   (-55.0)
#define DF_REPORT_DEFAULT_PITCH_DEG 28.0

typedef struct
{
  df_paper               paper;
  const char            *title;        /* project name */
  const char            *part_number;  /* NULL: "not given" */
  const char            *revision;
  const char            *author;
  const char            *date;         /* NULL: today, ISO 8601 */
  const char            *version;      /* driftframe version */
  const df_report_field *inputs;       /* the surface definition, files, hashes */
  gsize                  n_inputs;
  const char            *units;        /* length unit of the figures (the display unit) */
  const char            *model_units;  /* the surface's own unit, where the picture's scale
                                        * and the inputs are; NULL: the same as units */
  const char            *curvature_units; /* Gaussian curvature K is per the square of this
                                        * unit (mean K of a loop, probes); NULL: units */
  const df_surface      *surface;
  const df_report_loop  *loops;
  gsize                  n_loops;
  const char            *caution;
  /* A ready picture (the app's view with its legend and names); NULL: the report draws its own
   * shaded view from the core's mesh, from these angles (DF_REPORT_DEFAULT_* unless the project
   * saved a view). */
  cairo_surface_t       *picture;
  double                 view_yaw_deg;
  double                 view_pitch_deg;
  /* Geodesics, path pairs and probe points: drawn (curves) and listed (sections). */
  const df_report_curve   *curves;
  gsize                    n_curves;
  const df_report_section *sections;
  gsize                    n_sections;
} df_report;

/* Keeps s (g_free'd with strings, a GPtrArray made with g_free) and returns it: text that lives
 * as long as the record being put together. */
const char *df_report_keep (GPtrArray *strings, char *s);
/* A number as the record prints it: "%.*g", "0" for zero, "n/a" when not finite (never NaN or
 * inf on paper); the text is kept in strings. */
const char *df_report_num  (GPtrArray *strings, double value, int digits);

/* Writes the PDF to path (atomically). Errors name the path. */
gboolean df_report_write_pdf (const df_report *report, const char *path, GError **error);

/* The input fields describing a surface spec: kind, formulas or preset, ranges, parameters,
 * units and which way N points. Appends df_report_field entries whose strings belong to the
 * array's `strings` (free both with df_report_fields_free). */
typedef struct
{
  GArray    *fields;   /* of df_report_field */
  GPtrArray *strings;  /* owned strings the fields point into */
} df_report_fields;

void     df_report_fields_init      (df_report_fields *f);
void     df_report_fields_add       (df_report_fields *f, const char *key, const char *value);
void     df_report_fields_add_spec  (df_report_fields *f, const df_surface_spec *spec,
                                     const df_surface *surface);
/* Adds "KEY: FILE (size)" and a "SHA-256" row with the file's hash (or why it could not be
 * read). */
void     df_report_fields_add_file  (df_report_fields *f, const char *key, const char *path);
void     df_report_fields_clear     (df_report_fields *f);
