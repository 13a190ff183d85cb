/* df-report-verdicts.c: the design record's lines for the user's limits along a loop and its
 * darts, from the decision layer (df-verdict, df-gores); every number through one formatter
 * that never prints NaN. Reader/writer layer: GLib allowed. */
#include "df-report-verdicts.h"

#include <math.h>

#include "df-glib.h"
#include "df-gores.h"
#include "df-io-error.h"
#include "df-report.h"
#include "df-verdict.h"
#include "df-verdict-region.h"
#include "df-verdict-shear.h"

typedef struct
{
  GPtrArray *strings;
} extras_out;

#define keep(x, s) df_report_keep ((x)->strings, (s))
#define num(x, v, d) df_report_num ((x)->strings, (v), (d))

static const char *
limit_name (df_limit_id id)
{
  switch (id)
    {
    case DF_LIMIT_MIN_STEERING_RADIUS:
      return "Steering radius";
    case DF_LIMIT_MAX_FIBRE_DEVIATION:
      return "Fibre deviation";
    case DF_LIMIT_FRICTION:
      return "|k_g/k_n| against friction";
    case DF_LIMIT_MAX_STRAIN:
      return "Rim strain";
    case DF_LIMIT_MAX_SHEAR:
      return "Cell shear (woven ply draped)";
    default:
      return df_limit_key (id);
    }
}

/* du converts the verdict's lengths (from du->model to du->length); u labels them. */
static char *
verdict_text (const df_verdict *v, const df_limits *limits, const df_display_units *du,
              const char *u)
{
  g_autoptr (GPtrArray) scratch = g_ptr_array_new_with_free_func (g_free);
  extras_out xs = { scratch }, *x = &xs;
  const df_limit *l = &limits->item[v->limit];
  df_limit_kind kind = df_limit_kind_of (v->limit);
  const char *vu = kind == DF_LIMIT_KIND_LENGTH ? u
                   : kind == DF_LIMIT_KIND_RATIO ? "" : df_limit_kind_units (kind);
  double value = v->value, threshold = v->threshold;
  g_autoptr (GString) t = g_string_new (NULL);

#define LEN(q) df_unit_length ((q), du->model, du->length)
  if (kind == DF_LIMIT_KIND_LENGTH)
    {
      value = LEN (value);
      threshold = LEN (threshold);
    }
  g_string_append_printf (t, "%s: %s \xe2\x80\x94 worst %s%s%s against the limit %s%s%s",
                          limit_name (v->limit), v->within ? "within" : "EXCEEDED",
                          v->has_value ? num (x, value, 5) : "unbounded",
                          *vu && v->has_value ? " " : "", v->has_value ? vu : "",
                          num (x, threshold, 5), *vu ? " " : "", vu);
  if (v->exact)
    g_string_append (t, " (a geodesic: k_g = 0)");
  if (v->region && v->limit == DF_LIMIT_MAX_SHEAR)
    g_string_append_printf (t, " over the enclosed region: %zu of %zu cells past it, worst at "
                            "(%s, %s), where the crossing angle %s", v->n_cells_over, v->n_cells,
                            num (x, v->u_worst, 6), num (x, v->v_worst, 6),
                            v->signed_value >= 0 ? "closes" : "opens");
  else if (v->region)
    g_string_append_printf (t, " over the enclosed region (flat discs of radius %s %s), worst "
                            "at (%s, %s)", num (x, LEN (limits->patch_size.model_value), 5), u,
                            num (x, v->u_worst, 6), num (x, v->v_worst, 6));
  if (v->has_where)
    g_string_append_printf (t, ", from s = %s to %s %s%s, worst at s = %s %s",
                            num (x, LEN (v->s0), 6), num (x, LEN (v->s1), 6), u,
                            v->s0 > v->s1 ? " (through the start)" : "",
                            num (x, LEN (v->s_worst), 6), u);
#undef LEN
  if (v->has_tow)
    g_string_append_printf (t, "; tow inner edge compressed about %s %%",
                            num (x, 100 * v->tow_compression, 3));
  g_string_append_printf (t, ". Source: %s.", l->source != NULL ? l->source : "none given");
  return g_string_free (g_steal_pointer (&t), FALSE);
}

/* Nothing converted, the label as given (a surface whose unit is no known one). */
static df_display_units
same_units (void)
{
  df_display_units du;

  df_display_units_init (&du, DF_UNIT_MM);
  return du;
}

char *
df_report_verdict_text (const df_verdict *v, const df_limits *limits, const char *u)
{
  df_display_units du = same_units ();

  return verdict_text (v, limits, &du, u);
}

char *
df_report_verdict_text_display (const df_verdict *v, const df_limits *limits,
                                const df_display_units *du)
{
  return verdict_text (v, limits, du, df_unit_name (du->length));
}

static char **
verdict_lines (const df_surface *surface, const double (*uv)[2], gsize n,
               const df_limits *limits, const df_shear_setup *drape,
               const df_display_units *du, const char *u, double *kg_limit,
               gboolean *checked, guint *n_exceeded)
{
  g_autoptr (GPtrArray) scratch = g_ptr_array_new_with_free_func (g_free);
  extras_out xs = { scratch }, *x = &xs;
  g_autoptr (df_curve) curve = NULL;
  GPtrArray *lines;
  df_loop_options opt;
  df_loop_result res = { 0 };
  df_verdict_list list = { 0 };
  gboolean any = FALSE;
  char note[240] = "", shear_note[320] = "";
  g_autofree char *shear_line = NULL;
  df_shear_used used;
  df_diag diag;
  df_status st;

  *kg_limit = 0;
  *checked = FALSE;
  *n_exceeded = 0;
  for (int i = 0; limits != NULL && i < DF_N_LIMITS; i++)
    any = any || limits->item[i].set;
  if (!any)
    return NULL;
  if (limits->item[DF_LIMIT_MIN_STEERING_RADIUS].set
      && limits->item[DF_LIMIT_MIN_STEERING_RADIUS].model_value > 0)
    *kg_limit = df_unit_curvature (1 / limits->item[DF_LIMIT_MIN_STEERING_RADIUS].model_value,
                                   du->model, du->length);
  lines = g_ptr_array_new ();

  df_loop_options_init (&opt);
  /* As `check` does: enough samples that the range ends refine from close brackets. */
  opt.n_samples = 2000;
  df_diag_clear (&diag);
  st = df_curve_new_through_points (surface, uv, n, true, &curve, &diag);
  if (st == DF_OK)
    st = df_loop_measure (curve, &opt, &res, &diag);
  if (st == DF_OK)
    st = df_verdicts_measure (curve, res.samples, res.n_samples, res.length, limits, &list,
                              &diag);
  if (st == DF_OK)
    {
      bool strain_checked;

      st = df_verdict_strain (curve, &res, limits, 0, NULL, &list, &strain_checked, note,
                              sizeof note, &diag);
    }
  if (st == DF_OK)
    {
      bool shear_checked;

      st = df_verdict_shear (curve, n, &res, limits, drape, &list, &used, &shear_checked,
                             shear_note, sizeof shear_note, &diag);
      if (st == DF_OK && shear_checked)
        shear_line = g_strdup_printf ("Drape for max-shear-deg: from (%s, %s)%s, warp %s\xc2\xb0"
                                      "%s, cell %s %s%s; the closure check skipped.",
                                      num (x, used.start[0], 6), num (x, used.start[1], 6),
                                      !used.start_default ? ""
                                      : used.start_moved  ? " (the first point moved inward)"
                                                          : " (the chart centroid)",
                                      num (x, used.warp_deg, 4),
                                      used.warp_default ? " (default)" : "",
                                      num (x, df_unit_length (used.cell, du->model, du->length),
                                           4), u,
                                      used.cell_default ? " (default: the loop's length / "
                                      G_STRINGIFY (DF_SHEAR_CELLS_PER_LENGTH) ")" : "");
    }
  if (st != DF_OK)
    {
      g_autoptr (GError) error = NULL;

      df_status_to_gerror (st, &diag, &error);
      g_ptr_array_add (lines, (g_strdup_printf ("Limits not checked: %s",
                                                                 error->message)));
    }
  for (size_t k = 0; st == DF_OK && k < list.n; k++)
    {
      g_ptr_array_add (lines, verdict_text (&list.items[k], limits, du, u));
    }
  if (st == DF_OK && note[0] != '\0')
    g_ptr_array_add (lines, g_strdup_printf ("Rim strain not checked: %s.", note));
  if (st == DF_OK && shear_line != NULL)
    g_ptr_array_add (lines, g_steal_pointer (&shear_line));
  if (st == DF_OK && shear_note[0] != '\0')
    g_ptr_array_add (lines, g_strdup_printf ("Cell shear not checked: %s.", shear_note));
  if (st == DF_OK && res.bounds_disc && res.area > 0)
    {
      df_darts d;
      int least = 0;

      if (df_darts_compute (res.enclosed_curvature_rad, res.area, 1, &d, NULL) == DF_OK)
        {
          g_autoptr (GString) t = g_string_new (NULL);

          g_string_append_printf (t, "Darts: one %s of %s\xc2\xb0 lets a flat sheet fit",
                                  d.gusset ? "gusset (inserted)" : "dart (removed)",
                                  num (x, fabs (d.omega_rad) * 180 / G_PI, 4));
          if (limits->item[DF_LIMIT_MAX_SHEAR].set
              && df_darts_least_count (res.enclosed_curvature_rad,
                                       limits->item[DF_LIMIT_MAX_SHEAR].model_value * G_PI / 180,
                                       &least, NULL) == DF_OK && least > 0)
            g_string_append_printf (t, ", or %d of %s\xc2\xb0 each within max-shear-deg", least,
                                    num (x, fabs (d.omega_rad) / least * 180 / G_PI, 4));
          g_string_append_printf (t, "; each about %s %s long (estimate).",
                                  num (x, df_unit_length (d.length, du->model, du->length), 4),
                                  u);
          g_ptr_array_add (lines, (g_string_free (g_steal_pointer (&t), FALSE)));
        }
    }
  *checked = st == DF_OK;
  *n_exceeded = (guint) list.n_exceeded;
  df_verdict_list_clear (&list);
  df_loop_result_clear (&res);
  g_ptr_array_add (lines, NULL);
  return (char **) g_ptr_array_free (lines, FALSE);
}


char **
df_report_verdict_lines (const df_surface *surface, const double (*uv)[2], gsize n,
                         const df_limits *limits, const char *u, double *kg_limit,
                         gboolean *checked, guint *n_exceeded)
{
  df_display_units du = same_units ();

  return verdict_lines (surface, uv, n, limits, NULL, &du, u, kg_limit, checked, n_exceeded);
}

char **
df_report_verdict_lines_display (const df_surface *surface, const double (*uv)[2], gsize n,
                                 const df_limits *limits, const df_shear_setup *drape,
                                 const df_display_units *du, double *kg_limit,
                                 gboolean *checked, guint *n_exceeded)
{
  return verdict_lines (surface, uv, n, limits, drape, du, df_unit_name (du->length), kg_limit,
                        checked, n_exceeded);
}
