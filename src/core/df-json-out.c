/* df-json-out.c: JSON writers for loop measurements, point geometry and geodesics on
 * json-glib's JsonBuilder, with non-finite values as null. Reader/writer layer (GLib). */
#include "df-json-out.h"

#include "df-fit.h"

#include <math.h>
#include <string.h>

#include "df-io-error.h"

void
df_json_add_double_value (JsonBuilder *builder, double value)
{
  /* JSON has no NaN or infinity; null is the honest "no value". */
  if (isfinite (value))
    json_builder_add_double_value (builder, value);
  else
    json_builder_add_null_value (builder);
}

void
df_json_add_double (JsonBuilder *builder, const char *name, double value)
{
  json_builder_set_member_name (builder, name);
  df_json_add_double_value (builder, value);
}

void
df_json_add_double_or_null (JsonBuilder *builder, const char *name, gboolean present,
                            double value)
{
  json_builder_set_member_name (builder, name);
  if (present)
    df_json_add_double_value (builder, value);
  else
    json_builder_add_null_value (builder);
}

void
df_json_add_vector (JsonBuilder *builder, const char *name, const double *v, gsize n)
{
  json_builder_set_member_name (builder, name);
  json_builder_begin_array (builder);
  for (gsize i = 0; i < n; i++)
    df_json_add_double_value (builder, v[i]);
  json_builder_end_array (builder);
}

static void
add_string_or_null (JsonBuilder *builder, const char *name, const char *text)
{
  json_builder_set_member_name (builder, name);
  if (text != NULL && text[0] != '\0')
    json_builder_add_string_value (builder, text);
  else
    json_builder_add_null_value (builder);
}

void
df_json_add_loop_result (JsonBuilder *builder, const df_loop_result *r)
{
  gboolean disc = r->bounds_disc;
  /* A disc whose curvature integral could not be evaluated: null with the reason in note. */
  gboolean enclosed = disc && r->enclosed_available;
  g_autofree char *note = NULL;

  df_json_add_double (builder, "holonomy_deg", r->holonomy_rad * 180.0 / G_PI);
  df_json_add_double (builder, "holonomy_rad", r->holonomy_rad);
  /* Without a disc the enclosed curvature, its area and the Gauss-Bonnet comparison do not
   * exist (a loop around a torus tube): null rather than a misleading number. */
  df_json_add_double_or_null (builder, "enclosed_curvature_rad", enclosed,
                              r->enclosed_curvature_rad);
  df_json_add_double_or_null (builder, "enclosed_curvature_error_rad", enclosed,
                              r->enclosed_error_rad);
  df_json_add_double_or_null (builder, "concentrated_curvature_rad", disc, r->concentrated_rad);
  df_json_add_double_or_null (builder, "area", enclosed, r->area);
  df_json_add_double_or_null (builder, "gauss_bonnet_residual_rad", enclosed, r->residual_rad);
  /* Enclosed curvature / area, per the square of the document's curvature_units. */
  df_json_add_double_or_null (builder, "mean_gaussian_curvature", enclosed && r->has_mean_K,
                              r->mean_K);
  /* The cap on the other side of a loop round a closed surface's axis (same sign rule). */
  df_json_add_double_or_null (builder, "other_cap_curvature_rad", r->has_other_disc,
                              r->other_enclosed_curvature_rad);
  df_json_add_double_or_null (builder, "other_cap_area", r->has_other_disc, r->other_area);
  df_json_add_double (builder, "total_geodesic_curvature_rad", r->total_geodesic_curvature_rad);
  df_json_add_double (builder, "length", r->length);
  df_json_add_double_or_null (builder, "min_steering_radius", r->has_steering_radius,
                              r->min_steering_radius);
  df_json_add_double (builder, "max_abs_geodesic_curvature", r->max_abs_kg);
  json_builder_set_member_name (builder, "samples");
  json_builder_add_int_value (builder, (gint64) r->n_samples);
  json_builder_set_member_name (builder, "bounds_disc");
  json_builder_add_boolean_value (builder, r->bounds_disc);
  json_builder_set_member_name (builder, "disc_on_left");
  if (enclosed)
    json_builder_add_boolean_value (builder, r->disc_on_left);
  else
    json_builder_add_null_value (builder);
  json_builder_set_member_name (builder, "simple");
  json_builder_add_boolean_value (builder, r->simple);
  json_builder_set_member_name (builder, "axis_winding");
  json_builder_add_int_value (builder, r->axis_winding);
  if (r->enclosed_note[0] != '\0')
    note = g_strdup_printf ("%s%s%s", r->disc_note, r->disc_note[0] ? "; " : "",
                            r->enclosed_note);
  add_string_or_null (builder, "note", note ? note : r->disc_note);
  json_builder_set_member_name (builder, "rhs_evaluations");
  json_builder_add_int_value (builder, (gint64) r->rhs_evals);
  df_json_add_double (builder, "norm_drift", r->norm_drift);
}

static void
add_matrix (JsonBuilder *builder, const char *name, gboolean present,
            const double m[DF_DIM][DF_DIM])
{
  json_builder_set_member_name (builder, name);
  if (!present)
    {
      json_builder_add_null_value (builder);
      return;
    }
  json_builder_begin_array (builder);
  for (int i = 0; i < DF_DIM; i++)
    {
      json_builder_begin_array (builder);
      for (int j = 0; j < DF_DIM; j++)
        df_json_add_double_value (builder, m[i][j]);
      json_builder_end_array (builder);
    }
  json_builder_end_array (builder);
}

void
df_json_add_point_geometry (JsonBuilder *builder, const df_point_geometry *g)
{
  gboolean reg = g->chart_regular;
  double k[2] = { g->k1, g->k2 };

  df_json_add_double (builder, "u", g->u);
  df_json_add_double (builder, "v", g->v);
  json_builder_set_member_name (builder, "chart_regular");
  json_builder_add_boolean_value (builder, reg);
  df_json_add_vector (builder, "point", g->point, 3);
  df_json_add_vector (builder, "normal", g->normal, 3);
  /* The chart's metric exists at a pole too (degenerate there); its inverse does not. */
  add_matrix (builder, "metric", TRUE, g->g);

  /* christoffel[k][i][j] = Gamma^k_ij, riemann[r][s][m][n] = R^r_smn: the nesting follows the
   * index order of df_point_geometry so a reader indexes the same way. */
  json_builder_set_member_name (builder, "christoffel");
  if (reg)
    {
      json_builder_begin_array (builder);
      for (int a = 0; a < DF_DIM; a++)
        {
          json_builder_begin_array (builder);
          for (int i = 0; i < DF_DIM; i++)
            {
              json_builder_begin_array (builder);
              for (int j = 0; j < DF_DIM; j++)
                df_json_add_double_value (builder, g->gamma[a][i][j]);
              json_builder_end_array (builder);
            }
          json_builder_end_array (builder);
        }
      json_builder_end_array (builder);
    }
  else
    json_builder_add_null_value (builder);

  json_builder_set_member_name (builder, "riemann");
  if (reg)
    {
      json_builder_begin_array (builder);
      for (int r = 0; r < DF_DIM; r++)
        {
          json_builder_begin_array (builder);
          for (int s = 0; s < DF_DIM; s++)
            {
              json_builder_begin_array (builder);
              for (int m = 0; m < DF_DIM; m++)
                {
                  json_builder_begin_array (builder);
                  for (int n = 0; n < DF_DIM; n++)
                    df_json_add_double_value (builder, g->riemann[r][s][m][n]);
                  json_builder_end_array (builder);
                }
              json_builder_end_array (builder);
            }
          json_builder_end_array (builder);
        }
      json_builder_end_array (builder);
    }
  else
    json_builder_add_null_value (builder);

  add_matrix (builder, "second_fundamental_form", TRUE, g->second_form);
  df_json_add_double_or_null (builder, "gaussian_curvature", g->curvature_defined, g->K);
  df_json_add_double_or_null (builder, "mean_curvature", g->curvature_defined, g->H);
  json_builder_set_member_name (builder, "principal_curvatures");
  if (g->curvature_defined)
    {
      json_builder_begin_array (builder);
      df_json_add_double_value (builder, k[0]);
      df_json_add_double_value (builder, k[1]);
      json_builder_end_array (builder);
    }
  else
    json_builder_add_null_value (builder);
  df_json_add_double_or_null (builder, "concentrated_curvature_rad", !g->curvature_defined,
                              g->concentrated_rad);
  add_string_or_null (builder, "note", g->note[0] ? g->note : NULL);
}

void
df_json_add_geodesic (JsonBuilder *builder, const df_geodesic_result *r)
{
  df_json_add_double (builder, "length", r->length);
  json_builder_set_member_name (builder, "stopped_early");
  json_builder_add_boolean_value (builder, r->stopped_early);
  add_string_or_null (builder, "stop_reason", r->stopped_early ? r->stop_reason : NULL);
  json_builder_set_member_name (builder, "samples");
  json_builder_add_int_value (builder, (gint64) r->n_samples);
  json_builder_set_member_name (builder, "end");
  if (r->n_samples > 0)
    {
      const df_geodesic_sample *e = &r->samples[r->n_samples - 1];

      json_builder_begin_object (builder);
      df_json_add_double (builder, "s", e->s);
      df_json_add_double (builder, "u", e->u);
      df_json_add_double (builder, "v", e->v);
      df_json_add_vector (builder, "point", e->point, 3);
      df_json_add_vector (builder, "tangent", e->tangent, 3);
      json_builder_end_object (builder);
    }
  else
    json_builder_add_null_value (builder);
}

/* json-glib 1.6 prints a double with g_ascii_dtostr ("%.17g", so 17 significant digits and
 * locale-independent) and then appends ".0" when the text has no '.', which turns "1e+20" into
 * the invalid "1e+20.0". Outside string literals, drop a ".0" that follows an exponent. */
static void
fix_exponent_numbers (GString *text)
{
  gboolean in_string = FALSE;
  gsize i = 0;

  while (i < text->len)
    {
      char c = text->str[i];

      if (in_string)
        {
          if (c == '\\')
            i++;
          else if (c == '"')
            in_string = FALSE;
          i++;
          continue;
        }
      if (c == '"')
        {
          in_string = TRUE;
          i++;
          continue;
        }
      if (c == '-' || g_ascii_isdigit (c))
        {
          gsize start = i, e_at = 0, dot_at = 0;

          while (i < text->len && strchr ("+-0123456789.eE", text->str[i]) != NULL)
            {
              if ((text->str[i] == 'e' || text->str[i] == 'E') && e_at == 0)
                e_at = i;
              if (text->str[i] == '.' && dot_at == 0)
                dot_at = i;
              i++;
            }
          if (e_at > start && dot_at > e_at)
            {
              g_string_erase (text, dot_at, i - dot_at);
              i = dot_at;
            }
          continue;
        }
      i++;
    }
}

char *
df_json_to_string (JsonNode *root, gboolean pretty)
{
  g_autoptr (JsonGenerator) gen = json_generator_new ();
  g_autofree char *data = NULL;
  GString *text;

  json_generator_set_root (gen, root);
  json_generator_set_pretty (gen, pretty);
  data = json_generator_to_data (gen, NULL);
  text = g_string_new (data);
  fix_exponent_numbers (text);
  g_string_append_c (text, '\n');
  return g_string_free (text, FALSE);
}

gboolean
df_json_write (const char *path, JsonNode *root, GError **error)
{
  g_autofree char *text = df_json_to_string (root, TRUE);

  return df_write_file_atomic (path, text, -1, error);
}

void
df_json_add_fit (JsonBuilder *b, const df_surface *surface)
{
  df_fit_info info;

  if (!df_fit_get_info (df_surface_get_fn (surface), &info))
    return;
  json_builder_set_member_name (b, "fit");
  json_builder_begin_object (b);
  json_builder_set_member_name (b, "points");
  json_builder_add_int_value (b, (gint64) info.points);
  df_json_add_double (b, "rms", info.rms);
  df_json_add_double (b, "max", info.max);
  df_json_add_vector (b, "max_at", info.max_at, 3);
  df_json_add_double (b, "tolerance", info.tolerance);
  json_builder_set_member_name (b, "tolerance_chosen");
  json_builder_add_string_value (b, info.chosen ? "gcv" : "given");
  if (info.has_symmetry)
    {
      /* A revolution fitted to a mesh: how far the part is out of round (df-fit.h). */
      json_builder_set_member_name (b, "rotational_departure");
      json_builder_begin_object (b);
      df_json_add_double (b, "rms", info.symmetry_rms);
      df_json_add_double (b, "max", info.symmetry_max);
      df_json_add_vector (b, "max_at", info.symmetry_max_at, 3);
      json_builder_end_object (b);
    }
  json_builder_end_object (b);
}
