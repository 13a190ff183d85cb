/* df-loop-csv.c: RFC 4180 CSV for loops and paths (read: `u,v` chart points or `x,y,z` space
 * points projected onto the surface) and for measurement samples and summaries (write).
 * Writers use CRLF line ends as RFC 4180 asks; the reader accepts CRLF and LF. Numbers are
 * written with g_ascii_dtostr ("%.17g" in the C locale: 17 significant digits, independent
 * of the user's locale, and read back to the same double).
 * Reader/writer layer: GLib. */
#include "df-loop-csv.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "df-glib.h"
#include "df-project.h"

#define CSV_EOL "\r\n"

/* A loop needs three points to enclose anything; a path read by the same code needs fewer,
 * but three keeps one rule for both and costs a designer nothing. */
#define MIN_POINTS 3

/* Space points farther than this fraction of the surface's size from it are refused: they were
 * probably digitised on another part or in other units. */
#define OFF_SURFACE_FRACTION 1e-3

/* Splits one CSV record (no embedded line breaks) into fields per RFC 4180: a field may be
 * quoted, with "" for a quote inside it. Returns NULL and sets *bad_column on a malformed
 * quote. */
static GPtrArray *
split_record (const char *line, int *bad_column)
{
  g_autoptr (GPtrArray) fields = g_ptr_array_new_with_free_func (g_free);
  const char *p = line;

  for (;;)
    {
      g_autoptr (GString) field = g_string_new (NULL);

      while (*p == ' ' || *p == '\t')
        p++;
      if (*p == '"')
        {
          const char *open = p++;

          for (;;)
            {
              if (*p == '\0')
                {
                  *bad_column = (int) (open - line) + 1;
                  return NULL;
                }
              if (*p == '"' && p[1] == '"')
                {
                  g_string_append_c (field, '"');
                  p += 2;
                  continue;
                }
              if (*p == '"')
                {
                  p++;
                  break;
                }
              g_string_append_c (field, *p++);
            }
          while (*p == ' ' || *p == '\t')
            p++;
          if (*p != ',' && *p != '\0')
            {
              *bad_column = (int) (p - line) + 1;
              return NULL;
            }
        }
      else
        {
          while (*p != ',' && *p != '\0')
            g_string_append_c (field, *p++);
          g_strchomp (field->str);
          field->len = strlen (field->str);
        }
      g_ptr_array_add (fields, g_string_free (g_steal_pointer (&field), FALSE));
      if (*p == '\0')
        break;
      p++; /* the comma */
    }
  return g_steal_pointer (&fields);
}

/* Parses a whole field as a finite number in the C locale. */
static gboolean
parse_number (const char *field, double *out)
{
  char *end = NULL;

  if (field[0] == '\0')
    return FALSE;
  *out = g_ascii_strtod (field, &end);
  return end != field && *end == '\0';
}

static const char *
domain_text (const df_surface *surface, double u, double v, char *buf, gsize len)
{
  double u0, u1, v0, v1;
  gboolean graph = df_surface_get_kind (surface) == DF_SURFACE_GRAPH;
  const char *un = graph ? "x" : "t";

  df_surface_get_domain (surface, &u0, &u1, &v0, &v1);
  if (graph && (u < u0 || u > u1) && (v < v0 || v > v1))
    g_snprintf (buf, len, "x in [%.6g, %.6g], y in [%.6g, %.6g]", u0, u1, v0, v1);
  else if (graph && (v < v0 || v > v1) && !(u < u0 || u > u1))
    g_snprintf (buf, len, "y in [%.6g, %.6g]", v0, v1);
  else
    g_snprintf (buf, len, "%s in [%.6g, %.6g]", un, u0, u1);
  return buf;
}

static int
compare_points (gconstpointer a, gconstpointer b)
{
  const double *p = a, *q = b;

  if (p[0] != q[0])
    return p[0] < q[0] ? -1 : 1;
  if (p[1] != q[1])
    return p[1] < q[1] ? -1 : 1;
  return 0;
}

/* How many different chart points (exactly equal ones counted once), up to MIN_POINTS: a scan
 * against the few found so far (sorting all the points cost a 10^4-point loop 4 ms). */
static guint
count_distinct (const double (*uv)[2], guint n)
{
  const double *found[MIN_POINTS];
  guint distinct = 0;

  for (guint i = 0; i < n && distinct < MIN_POINTS; i++)
    {
      gboolean seen = FALSE;

      for (guint k = 0; k < distinct && !seen; k++)
        seen = compare_points (found[k], uv[i]) == 0;
      if (!seen)
        found[distinct++] = uv[i];
    }
  return distinct;
}

gboolean
df_loop_csv_parse (const char *text, const char *source, const df_surface *surface,
                   double (**uv_out)[2], gsize *n_out, GError **error)
{
  g_autoptr (GArray) points = g_array_new (FALSE, FALSE, sizeof (double[2]));
  g_autoptr (GArray) point_lines = g_array_new (FALSE, FALSE, sizeof (guint));
  g_auto (GStrv) lines = NULL;
  gboolean have_header = FALSE;
  guint n_cols = 0;
  double max_dist;
  /* Space points are placed in sequence, each from its neighbour's answer. */
  g_autoptr (df_placer) placer = NULL;

  g_return_val_if_fail (text != NULL && surface != NULL, FALSE);
  if (source == NULL)
    source = "loop";
  max_dist = OFF_SURFACE_FRACTION * df_surface_size (surface);

  /* A UTF-8 byte order mark, as some spreadsheets write, is not part of the header. */
  if (g_str_has_prefix (text, "\xEF\xBB\xBF"))
    text += 3;
  if (!g_utf8_validate (text, -1, NULL))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: the file is not UTF-8 text",
                   source);
      return FALSE;
    }

  lines = g_strsplit (text, "\n", -1);
  for (guint li = 0; lines[li] != NULL; li++)
    {
      g_autoptr (GPtrArray) fields = NULL;
      char *line = lines[li];
      guint lineno = li + 1;
      int bad_col = 0;
      double val[3];

      g_strchomp (line); /* drops the \r of CRLF too */
      if (g_strchug (line)[0] == '\0' || line[0] == '#')
        continue;

      if (strchr (line, '"') == NULL)
        {
          /* Fast path for the usual unquoted row: split in place, no allocation per field
           * (a loop may have tens of thousands of rows). */
          char *p = line;

          fields = g_ptr_array_new ();
          for (;;)
            {
              char *comma = strchr (p, ',');

              if (comma)
                *comma = '\0';
              g_ptr_array_add (fields, g_strstrip (p));
              if (!comma)
                break;
              p = comma + 1;
            }
        }
      else
        fields = split_record (line, &bad_col);
      if (fields == NULL)
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                       "%s:%u: column %d: unbalanced quote", source, lineno, bad_col);
          return FALSE;
        }

      if (!have_header)
        {
          g_autoptr (GString) got = g_string_new (NULL);

          for (guint i = 0; i < fields->len; i++)
            {
              g_autofree char *lower = g_ascii_strdown (g_ptr_array_index (fields, i), -1);

              g_string_append_printf (got, "%s%s", i ? "," : "", lower);
            }
          if (g_str_equal (got->str, "u,v"))
            n_cols = 2;
          else if (g_str_equal (got->str, "x,y,z"))
            n_cols = 3;
          else if (parse_number (g_ptr_array_index (fields, 0), &val[0]))
            {
              g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                           "%s:%u: missing header: the first row must be u,v (chart "
                           "coordinates) or x,y,z (points in space)", source, lineno);
              return FALSE;
            }
          else
            {
              g_autoptr (GString) shown = g_string_new (NULL);

              /* The fields, not the line: the fast path above has cut it at each comma. */
              for (guint i = 0; i < fields->len && shown->len < 80; i++)
                g_string_append_printf (shown, "%s%s", i ? "," : "",
                                        (const char *) g_ptr_array_index (fields, i));
              g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                           "%s:%u: unknown header '%s' (expected u,v or x,y,z)", source,
                           lineno, shown->str);
              return FALSE;
            }
          have_header = TRUE;
          continue;
        }

      if (points->len >= DF_LOOP_MAX_POINTS)
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                       "%s:%u: more than %d points, the most a loop may have; thin the points "
                       "or split the loop", source, lineno, DF_LOOP_MAX_POINTS);
          return FALSE;
        }
      if (fields->len != n_cols)
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                       "%s:%u: expected %u numbers, found %u", source, lineno, n_cols,
                       fields->len);
          return FALSE;
        }
      for (guint i = 0; i < n_cols; i++)
        {
          const char *f = g_ptr_array_index (fields, i);

          if (f[0] == '\0')
            {
              g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s:%u: field %u is empty",
                           source, lineno, i + 1);
              return FALSE;
            }
          if (!parse_number (f, &val[i]))
            {
              g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                           "%s:%u: field %u: '%s' is not a number", source, lineno, i + 1, f);
              return FALSE;
            }
          if (!isfinite (val[i]))
            {
              g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                           "%s:%u: field %u: '%s' is not a finite number", source, lineno,
                           i + 1, f);
              return FALSE;
            }
        }

      if (n_cols == 2)
        {
          double uv[2] = { val[0], val[1] };
          char dom[160];

          if (!df_surface_contains (surface, uv[0], uv[1]))
            {
              g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY,
                           "%s:%u: point (%.10g, %.10g) lies outside the surface (%s)", source,
                           lineno, uv[0], uv[1],
                           domain_text (surface, uv[0], uv[1], dom, sizeof dom));
              return FALSE;
            }
          g_array_append_val (points, uv);
          g_array_append_val (point_lines, lineno);
        }
      else
        {
          double uv[2], dist = INFINITY;
          df_diag diag;
          df_status st;

          df_diag_clear (&diag);
          if (placer == NULL && (placer = df_placer_new (surface)) == NULL)
            {
              g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY,
                           "%s:%u: out of memory placing the points", source, lineno);
              return FALSE;
            }
          st = df_placer_place (placer, val, 0.0, &uv[0], &uv[1], &dist, &diag);
          if (st != DF_OK && !(st == DF_E_DOMAIN && isfinite (dist)))
            {
              g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY,
                           "%s:%u: point (%.10g, %.10g, %.10g) could not be placed on the "
                           "surface: %s%s%s", source, lineno, val[0], val[1], val[2],
                           df_status_describe (st), diag.detail[0] ? ": " : "", diag.detail);
              return FALSE;
            }
          if (!(dist <= max_dist))
            {
              g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY,
                           "%s:%u: point (%.10g, %.10g, %.10g) lies %.4g from the surface "
                           "(more than %.4g, 1e-3 of its size)", source, lineno, val[0], val[1],
                           val[2], dist, max_dist);
              return FALSE;
            }
          g_array_append_val (points, uv);
          g_array_append_val (point_lines, lineno);
        }
    }

  if (!have_header)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: the file is empty", source);
      return FALSE;
    }
  if (points->len < MIN_POINTS)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                   "%s: %u point%s, need at least %d", source, points->len,
                   points->len == 1 ? "" : "s", MIN_POINTS);
      return FALSE;
    }

  {
    /* Repeated rows would otherwise surface as the curve's "distinct points" count, which
     * does not say that the file repeats itself. */
    guint distinct = count_distinct ((const double (*)[2]) (void *) points->data, points->len);

    if (distinct < MIN_POINTS)
      {
        g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                     "%s: the %u points are only %u different point%s (rows repeat); a loop "
                     "needs at least %d different points", source, points->len, distinct,
                     distinct == 1 ? "" : "s", MIN_POINTS);
        return FALSE;
      }
  }
  /* A row equal to the one before cannot be joined to it by a curve: the measurement would
   * refuse it as "point k repeats point k-1". Refused here, naming both lines, so the app's
   * import and typed points and the CLI's commands follow one rule before anything is added
   * (a closing row equal to the first is not consecutive and stays allowed). */
  for (guint i = 1; i < points->len; i++)
    {
      const double *a = (const double *) (void *) points->data + 2 * (i - 1);
      const double *b = a + 2;

      if (a[0] == b[0] && a[1] == b[1])
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                       "%s:%u: the same point as line %u; consecutive points must differ "
                       "(delete the repeated row)", source, g_array_index (point_lines, guint, i),
                       g_array_index (point_lines, guint, i - 1));
          return FALSE;
        }
    }
  *n_out = points->len;
  *uv_out = (double (*)[2]) (void *) g_array_free (g_steal_pointer (&points), FALSE);
  return TRUE;
}

gboolean
df_loop_csv_read (const char *path, const df_surface *surface, double (**uv_out)[2],
                  gsize *n_out, GError **error)
{
  g_autofree char *text = NULL;
  g_autoptr (GError) local = NULL;
  gsize len = 0;

  if (!g_file_get_contents (path, &text, &len, &local))
    {
      /* GLib's message already names the file. */
      g_set_error_literal (error, DF_IO_ERROR, DF_IO_ERROR_FILE, local->message);
      return FALSE;
    }
  if (memchr (text, '\0', len) != NULL)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: not a text file", path);
      return FALSE;
    }
  return df_loop_csv_parse (text, path, surface, uv_out, n_out, error);
}

/* Writers. */

static void
append_number (GString *out, double value)
{
  char buf[G_ASCII_DTOSTR_BUF_SIZE];

  /* A value that does not exist (or failed) is an empty field, never "nan". */
  if (isfinite (value))
    g_string_append (out, g_ascii_dtostr (buf, sizeof buf, value));
}

static void
append_row (GString *out, const double *values, gsize n)
{
  for (gsize i = 0; i < n; i++)
    {
      if (i > 0)
        g_string_append_c (out, ',');
      append_number (out, values[i]);
    }
  g_string_append (out, CSV_EOL);
}

/* Quotes a text field when RFC 4180 requires it (comma, quote, line break). */
static void
append_text_field (GString *out, const char *text)
{
  if (text == NULL)
    return;
  if (strpbrk (text, ",\"\r\n") == NULL)
    {
      g_string_append (out, text);
      return;
    }
  g_string_append_c (out, '"');
  for (const char *p = text; *p != '\0'; p++)
    {
      if (*p == '"')
        g_string_append_c (out, '"');
      g_string_append_c (out, *p);
    }
  g_string_append_c (out, '"');
}

gboolean
df_loop_csv_write_points (const char *path, const double (*uv)[2], gsize n, GError **error)
{
  g_autoptr (GString) out = g_string_new ("u,v" CSV_EOL);

  for (gsize i = 0; i < n; i++)
    append_row (out, uv[i], 2);
  return df_write_file_atomic (path, out->str, (gssize) out->len, error);
}

/* The unit as a column-name suffix: letters and digits only ("mm", "in"); "unit" if none. */
static char *
unit_suffix (const df_csv_context *c)
{
  const char *u = c != NULL && c->units != NULL ? c->units : "mm";
  GString *out = g_string_new (NULL);

  for (const char *p = u; *p; p++)
    if (g_ascii_isalnum (*p))
      g_string_append_c (out, *p);
  if (out->len == 0)
    g_string_append (out, "unit");
  return g_string_free (out, FALSE);
}

static void
append_chart_header (GString *out, const df_csv_context *c, const char *u)
{
  if (c != NULL && c->kind == DF_SURFACE_REVOLUTION)
    g_string_append (out, "t,phi_rad");
  else
    g_string_append_printf (out, "u_%s,v_%s", u, u);
}

char *
df_loop_samples_to_csv (const df_loop_result *result, const df_csv_context *context)
{
  g_autofree char *u = unit_suffix (context);
  GString *out = g_string_new (NULL);

  g_string_append_printf (out, "s_%s,", u);
  append_chart_header (out, context, u);
  g_string_append_printf (out, ",x_%s,y_%s,z_%s,vx,vy,vz,angle_deg,angle_unwrapped_deg,"
                          "k_g_per_%s,K_per_%s2" CSV_EOL, u, u, u, u, u);
  for (gsize i = 0; i < result->n_samples; i++)
    {
      const df_loop_sample *s = &result->samples[i];
      /* At a pole the angle v is arbitrary: leave the field empty rather than invent one. */
      double row[13] = { s->s, s->u, s->at_pole ? NAN : s->v,
                         s->point[0], s->point[1], s->point[2],
                         s->vector[0], s->vector[1], s->vector[2],
                         df_wrap_angle (s->angle_rad) * 180.0 / G_PI,
                         s->angle_rad * 180.0 / G_PI, s->k_g, s->K };

      append_row (out, row, G_N_ELEMENTS (row));
    }
  return g_string_free (out, FALSE);
}

gboolean
df_loop_samples_write (const char *path, const df_loop_result *result,
                       const df_csv_context *context, GError **error)
{
  g_autofree char *text = df_loop_samples_to_csv (result, context);

  return df_write_file_atomic (path, text, -1, error);
}

char *
df_loop_summary_to_csv (const char *const *names, const df_loop_result *const *results,
                        const char *const *failures, gsize n, const df_csv_context *context)
{
  return df_loop_summary_to_csv_k (names, results, failures, n, context, NULL);
}

char *
df_loop_summary_to_csv_k (const char *const *names, const df_loop_result *const *results,
                          const char *const *failures, gsize n, const df_csv_context *context,
                          const char *k_units)
{
  g_autofree char *u = unit_suffix (context);
  g_autofree char *k = NULL;
  GString *out = g_string_new (NULL);

  {
    df_csv_context kc = { 0 };

    kc.units = k_units != NULL ? k_units : context != NULL ? context->units : NULL;
    k = unit_suffix (&kc);
  }
  g_string_append_printf (out, "name,status,surface,normal_side,holonomy_deg,holonomy_rad,"
                          "enclosed_curvature_rad,gauss_bonnet_residual_rad,"
                          "total_geodesic_curvature_rad,area_%s2,length_%s,"
                          "min_steering_radius_%s,bounds_disc,note,mean_K_per_%s2" CSV_EOL, u, u,
                          u, k);
  for (gsize i = 0; i < n; i++)
    {
      const df_loop_result *r = results[i];

      append_text_field (out, names != NULL ? names[i] : NULL);
      g_string_append_printf (out, ",%s,", r != NULL ? "measured" : "not measured");
      append_text_field (out, context != NULL ? context->surface : NULL);
      g_string_append_c (out, ',');
      append_text_field (out, context != NULL ? context->normal_side : NULL);
      if (r != NULL)
        {
          /* Empty where there is no disc or its curvature could not be computed. */
          double disc = r->bounds_disc && r->enclosed_available ? 1.0 : NAN;
          double row[8] = { r->holonomy_rad * 180.0 / G_PI, r->holonomy_rad,
                            r->enclosed_curvature_rad * disc, r->residual_rad * disc,
                            r->total_geodesic_curvature_rad, r->area * disc, r->length,
                            r->has_steering_radius ? r->min_steering_radius : NAN };

          for (gsize k = 0; k < G_N_ELEMENTS (row); k++)
            {
              g_string_append_c (out, ',');
              append_number (out, row[k]);
            }
          g_string_append_printf (out, ",%s,", r->bounds_disc ? "true" : "false");
          append_text_field (out, r->disc_note);
          g_string_append_c (out, ',');
          append_number (out, r->has_mean_K ? r->mean_K * disc : NAN);
        }
      else
        {
          /* Eight empty figures and an empty bounds_disc, then the reason, no mean K. */
          g_string_append (out, ",,,,,,,,,,");
          append_text_field (out, failures != NULL ? failures[i] : NULL);
          g_string_append_c (out, ',');
        }
      g_string_append (out, CSV_EOL);
    }
  return g_string_free (out, FALSE);
}

gboolean
df_loop_summary_write (const char *path, const char *const *names,
                       const df_loop_result *const *results, const char *const *failures,
                       gsize n, const df_csv_context *context, GError **error)
{
  return df_loop_summary_write_k (path, names, results, failures, n, context, NULL, error);
}

gboolean
df_loop_summary_write_k (const char *path, const char *const *names,
                         const df_loop_result *const *results, const char *const *failures,
                         gsize n, const df_csv_context *context, const char *k_units,
                         GError **error)
{
  g_autofree char *text = df_loop_summary_to_csv_k (names, results, failures, n, context,
                                                    k_units);

  return df_write_file_atomic (path, text, -1, error);
}

gboolean
df_geodesic_samples_write (const char *path, const df_geodesic_result *result,
                           const df_csv_context *context, GError **error)
{
  g_autofree char *u = unit_suffix (context);
  g_autoptr (GString) out = g_string_new (NULL);

  g_string_append_printf (out, "s_%s,", u);
  append_chart_header (out, context, u);
  g_string_append_printf (out, ",x_%s,y_%s,z_%s,tx,ty,tz" CSV_EOL, u, u, u);
  for (gsize i = 0; i < result->n_samples; i++)
    {
      const df_geodesic_sample *s = &result->samples[i];
      double row[9] = { s->s, s->u, s->v, s->point[0], s->point[1], s->point[2],
                        s->tangent[0], s->tangent[1], s->tangent[2] };

      append_row (out, row, G_N_ELEMENTS (row));
    }
  return df_write_file_atomic (path, out->str, (gssize) out->len, error);
}
