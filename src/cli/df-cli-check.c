/* df-cli-check.c: `driftframe-cli check`: measures every loop of a project against the user's
 * limits ([limits] in the project file) and lists each stretch where one is exceeded, with its
 * worst value and where it is. Exit status 0 when everything is within the limits, 3 when any
 * is exceeded (so a batch pipeline can gate on it), 2 for bad input. CLI layer: the verdicts
 * come from the core (df-verdict.h). */
#include <math.h>
#include <stdio.h>

#include "df-cli-commands.h"
#include "df-cli-common.h"
#include "df-decide-out.h"
#include "df-gores.h"
#include "df-limits-file.h"
#include "df-json-out.h"
#include "df-verdict.h"
#include "df-verdict-curves.h"
#include "df-verdict-region.h"
#include "df-verdict-shear.h"

#define NAME "check"
#define DEFAULT_SAMPLES 2000

typedef struct
{
  char    *project_path;
  char   **params;
  int      samples;
  char    *units_text;
  gboolean json;
} check_options;

typedef struct
{
  df_loop_result  result;
  df_verdict_list verdicts;
  gboolean        has_darts;
  df_darts        darts;
  int             least_darts;   /* 0 when max-shear-deg is not set */
  char            strain_note[240];  /* why max-strain-percent was not checked, or "" */
  df_shear_used   shear;             /* the drape max-shear-deg was checked with */
  gboolean        shear_checked;
  char            shear_note[320];   /* why max-shear-deg was not checked, or "" */
} loop_check;

/* A geodesic or a path route of the project, checked. */
typedef struct
{
  char           *name;     /* the geodesic's, or "PAIR route A" */
  df_verdict_list verdicts;
  double          length;
  int             route;    /* 0 none (a geodesic), 'a' or 'b' */
} curve_check;

static gboolean
check_geodesic (const df_surface *surface, const df_project_geodesic *g, const df_limits *limits,
                size_t n_samples, curve_check *out, GError **error)
{
  df_geodesic_result res = { 0 };
  df_diag diag;
  df_status st;

  df_diag_clear (&diag);
  out->name = g_strdup (g->name);
  st = df_geodesic_shoot (surface, g->u, g->v, g->heading_deg * G_PI / 180.0, g->length,
                          n_samples, &res, &diag);
  if (st == DF_OK)
    st = df_verdicts_geodesic (surface, &res, g->heading_deg * G_PI / 180.0, limits,
                               &out->verdicts, &diag);
  out->length = res.length;
  df_geodesic_result_clear (&res);
  if (st != DF_OK)
    return df_status_to_gerror (st, &diag, error);
  return TRUE;
}

static gboolean
check_route (const df_surface *surface, const df_project_paths *p, int route,
             const df_limits *limits, size_t n_samples, curve_check *out, GError **error)
{
  g_autoptr (df_curve) curve = NULL;
  df_diag diag;
  df_status st;

  df_diag_clear (&diag);
  out->name = g_strdup_printf ("%s route %c", p->name, route == 'a' ? 'A' : 'B');
  out->route = route;
  st = df_curve_new_through_points (surface, (const double (*)[2]) (route == 'a' ? p->a : p->b),
                                    route == 'a' ? p->n_a : p->n_b, false, &curve, &diag);
  if (st == DF_OK)
    st = df_verdicts_path (curve, n_samples, limits, &out->verdicts, &out->length, &diag);
  if (st != DF_OK)
    return df_status_to_gerror (st, &diag, error);
  return TRUE;
}

static gboolean
check_loop (const df_surface *surface, const df_project_loop *loop, const df_limits *limits,
            size_t n_samples, loop_check *out, GError **error)
{
  g_autoptr (df_curve) curve = NULL;
  df_loop_options opt;
  df_diag diag;
  df_status st;

  df_loop_options_init (&opt);
  opt.n_samples = n_samples;
  df_diag_clear (&diag);
  st = df_curve_new_through_points (surface, (const double (*)[2]) loop->uv, loop->n, true,
                                    &curve, &diag);
  if (st == DF_OK)
    st = df_loop_measure (curve, &opt, &out->result, &diag);
  if (st == DF_OK)
    st = df_verdicts_measure (curve, out->result.samples, out->result.n_samples,
                              out->result.length, limits, &out->verdicts, &diag);
  if (st == DF_OK)
    {
      bool checked;

      st = df_verdict_strain (curve, &out->result, limits, 0, NULL, &out->verdicts, &checked,
                              out->strain_note, sizeof out->strain_note, &diag);
    }
  if (st == DF_OK)
    {
      bool checked = false;

      /* The woven ply's locking angle, by a drape of the loop (df-verdict-shear.h). */
      st = df_verdict_shear (curve, loop->n, &out->result, limits, &loop->drape,
                             &out->verdicts, &out->shear, &checked, out->shear_note,
                             sizeof out->shear_note, &diag);
      out->shear_checked = checked;
      if (st != DF_OK)
        {
          df_status_to_gerror (st, &diag, error);
          g_prefix_error (error, "max-shear-deg: the drape (drape-start, drape-warp-deg, "
                          "drape-cell): ");
          return FALSE;
        }
    }
  if (st == DF_OK && out->result.bounds_disc && out->result.area > 0.0)
    {
      st = df_darts_compute (out->result.enclosed_curvature_rad, out->result.area, 1,
                             &out->darts, &diag);
      out->has_darts = st == DF_OK;
      /* A woven ply takes up to its locking angle by shear instead of a cut: each dart need
       * close only what is beyond it (common practice, no source). */
      if (st == DF_OK && limits->item[DF_LIMIT_MAX_SHEAR].set)
        st = df_darts_least_count (out->result.enclosed_curvature_rad,
                                   limits->item[DF_LIMIT_MAX_SHEAR].model_value * G_PI / 180.0,
                                   &out->least_darts, &diag);
    }
  if (st != DF_OK)
    return df_status_to_gerror (st, &diag, error);
  return TRUE;
}

/* The verdict's value, threshold and stretch in display units, and their units' name. */
static const char *
display (const df_verdict *v, const df_display_units *du, double *value, double *threshold)
{
  df_limit_kind kind = df_limit_kind_of (v->limit);

  *value = v->value;
  *threshold = v->threshold;
  if (kind != DF_LIMIT_KIND_LENGTH)
    return df_limit_kind_units (kind);
  *value = df_unit_length (v->value, du->model, du->length);
  *threshold = df_unit_length (v->threshold, du->model, du->length);
  return df_unit_name (du->length);
}

static const char *
quantity_name (df_limit_id id)
{
  switch (id)
    {
    case DF_LIMIT_MIN_STEERING_RADIUS:
      return "steering radius";
    case DF_LIMIT_MAX_FIBRE_DEVIATION:
      return "fibre deviation";
    case DF_LIMIT_FRICTION:
      return "|k_g/k_n|";
    case DF_LIMIT_MAX_STRAIN:
      return "rim strain";
    case DF_LIMIT_MAX_SHEAR:
      return "cell shear";
    default:
      return df_limit_key (id);
    }
}

/* The drape behind a max-shear-deg verdict: what it was draped with and where the worst is. */
static void
print_shear (const df_verdict *v, const df_shear_used *sh, const df_display_units *du,
             const char *un, const char *vn)
{
  char b1[40], b2[40], b3[40], b4[40], b5[40], b6[40];

  printf (" over the enclosed region: %zu of %zu cells past it, worst at (%s = %s, %s = %s) "
          "where the crossing angle %s; draped from (%s = %s, %s = %s) with warp %s deg%s and "
          "cell %s %s%s",
          sh->n_cells_over, sh->n_cells, un, df_cli_num (b1, sizeof b1, v->u_worst, 6), vn,
          df_cli_num (b2, sizeof b2, v->v_worst, 6),
          v->signed_value >= 0 ? "closes" : "opens", un,
          df_cli_num (b3, sizeof b3, sh->start[0], 6), vn,
          df_cli_num (b4, sizeof b4, sh->start[1], 6),
          df_cli_num (b5, sizeof b5, sh->warp_deg, 4), sh->warp_default ? " (default)" : "",
          df_cli_num (b6, sizeof b6, df_unit_length (sh->cell, du->model, du->length), 4),
          df_unit_name (du->length),
          sh->cell_default ? " (default: the loop's length / "
                             G_STRINGIFY (DF_SHEAR_CELLS_PER_LENGTH) ")" : "");
  if (sh->start_default)
    printf ("; the start is %s", sh->start_moved ? "the loop's first point moved inward (its "
                                                   "chart centroid lies outside it)"
                                                 : "the loop's chart centroid");
  if (sh->n_nodes_lost > 0)
    printf ("; %zu pins could not be placed", sh->n_nodes_lost);
}

/* The lines of one curve's verdicts; returns how many are exceeded. */
static guint
print_verdicts (const df_verdict_list *list, const df_limits *limits,
                const df_display_units *du, const char *un, const char *vn,
                const df_shear_used *shear)
{
  const char *ln = df_unit_name (du->length);
  guint exceeded = 0;

  for (size_t k = 0; k < list->n; k++)
    {
      const df_verdict *v = &list->items[k];
      double value, threshold;
      const char *units = display (v, du, &value, &threshold);
      char b1[40], b2[40], b3[40], b4[40], b5[40];

      printf ("  %-8s %s %s%s%s (limit %s %s)", v->within ? "within" : "EXCEEDED",
              quantity_name (v->limit),
              v->has_value ? df_cli_num (b1, sizeof b1, value, 5) : "unbounded",
              *units && v->has_value ? " " : "", v->has_value ? units : "", df_cli_num (b2, sizeof b2, threshold, 5), units);
      if (v->exact)
        printf (" (a geodesic: k_g = 0)");
      if (v->region && v->limit == DF_LIMIT_MAX_SHEAR && shear != NULL)
        print_shear (v, shear, du, un, vn);
      else if (v->region)
        printf (" over the enclosed region, flat discs of radius %s %s; worst at (%s = %s, "
                "%s = %s), the flat rim must %s",
                df_cli_num (b3, sizeof b3, df_unit_length (limits->patch_size.model_value,
                                                           du->model, du->length), 5), ln,
                un, df_cli_num (b1, sizeof b1, v->u_worst, 6), vn,
                df_cli_num (b2, sizeof b2, v->v_worst, 6),
                v->signed_value >= 0 ? "shrink" : "stretch");
      if (v->has_where)
        printf (" from s = %s to %s %s%s, worst at s = %s (%s = %s, %s = %s)",
                df_cli_num (b3, sizeof b3, df_unit_length (v->s0, du->model, du->length), 6),
                df_cli_num (b4, sizeof b4, df_unit_length (v->s1, du->model, du->length), 6),
                ln, v->s0 > v->s1 ? " (through the start)" : "",
                df_cli_num (b5, sizeof b5, df_unit_length (v->s_worst, du->model,
                                                           du->length), 6),
                un, df_cli_num (b1, sizeof b1, v->u_worst, 6), vn,
                df_cli_num (b2, sizeof b2, v->v_worst, 6));
      if (v->has_tow)
        printf ("; tow inner edge compressed about %s %%",
                df_cli_num (b3, sizeof b3, 100.0 * v->tow_compression, 3));
      printf ("\n");
      exceeded += !v->within;
    }
  return exceeded;
}

static void
print_text (const check_options *o, const df_project *project, const df_surface *surface,
            const loop_check *checks, const curve_check *curves, guint n_curves,
            const df_display_units *du, gboolean any_limit)
{
  const char *ln = df_unit_name (du->length), *un, *vn;
  guint exceeded = 0;

  df_cli_chart_names (surface, &un, &vn);
  printf ("Project: %s (lengths in %s)\n", o->project_path, ln);
  for (int i = 0; i < DF_N_LIMITS; i++)
    {
      const df_limit *l = &project->limits->item[i];
      g_autofree char *text = NULL;

      if (!l->set)
        continue;
      text = df_limit_value_text (l);
      printf ("Limit:   %-24s %-12s source: %s\n", df_limit_key ((df_limit_id) i), text,
              l->source != NULL ? l->source : "(none given)");
    }
  if (!any_limit)
    printf ("No limits in the project's [limits] group: nothing to check against.\n");
  printf ("\n");
  for (guint i = 0; i < project->loops->len; i++)
    {
      const df_project_loop *loop = g_ptr_array_index (project->loops, i);
      const loop_check *c = &checks[i];
      char b1[40], b2[40], b3[40];

      printf ("%s (length %s %s)\n", loop->name,
              df_cli_num (b1, sizeof b1, df_unit_length (c->result.length, du->model,
                                                         du->length), 7), ln);
      exceeded += print_verdicts (&c->verdicts, project->limits, du, un, vn, &c->shear);
      if (c->strain_note[0] != '\0')
        printf ("  not checked: max-strain-percent: %s\n", c->strain_note);
      if (c->shear_note[0] != '\0')
        printf ("  not checked: max-shear-deg: %s\n", c->shear_note);
      if (c->has_darts)
        {
          printf ("  darts    enclosed curvature %s deg: one %s of that angle",
                  df_cli_num (b1, sizeof b1, c->darts.omega_rad * 180.0 / G_PI, 5),
                  c->darts.gusset ? "gusset (inserted)" : "dart (removed)");
          if (c->least_darts > 0)
            printf (", or %d of %s deg each to stay within max-shear-deg", c->least_darts,
                    df_cli_num (b2, sizeof b2, fabs (c->darts.omega_rad) / c->least_darts
                                                   * 180.0 / G_PI, 4));
          printf ("; about %s %s long\n",
                  df_cli_num (b3, sizeof b3, df_unit_length (c->darts.length, du->model,
                                                             du->length), 4), ln);
        }
    }
  for (guint i = 0; i < n_curves; i++)
    {
      char b1[40];

      printf ("%s %s (length %s %s)\n", curves[i].route ? "Path" : "Geodesic", curves[i].name,
              df_cli_num (b1, sizeof b1, df_unit_length (curves[i].length, du->model,
                                                         du->length), 7), ln);
      if (curves[i].verdicts.kind == DF_VERDICT_GEODESIC && curves[i].verdicts.n > 0)
        printf ("  (fibre deviation of a geodesic: its heading against the u lines, from its "
                "start heading)\n");
      exceeded += print_verdicts (&curves[i].verdicts, project->limits, du, un, vn, NULL);
    }
  printf ("\n%s\n", exceeded ? "Some limits are exceeded (exit status 3)."
                             : "Everything is within the limits given.");
  printf ("Caution: %s\n", DF_DECIDE_CAUTION);
}

static void
add_verdict (JsonBuilder *b, const char *loop_name, guint index, df_verdict_curve kind,
             int route, const df_verdict *v, const df_limits *limits,
             const df_display_units *du, const df_shear_used *shear)
{
  double value, threshold;
  const char *units = display (v, du, &value, &threshold);
  const df_limit *l = &limits->item[v->limit];

  json_builder_begin_object (b);
  json_builder_set_member_name (b, "loop");
  json_builder_add_string_value (b, loop_name);
  json_builder_set_member_name (b, "kind");
  json_builder_add_string_value (b, df_verdict_curve_name (kind));
  /* loop_index counts within its kind: [loop N], [geodesic N], [paths N]. */
  json_builder_set_member_name (b, "loop_index");
  json_builder_add_int_value (b, index + 1);
  if (route != 0)
    {
      json_builder_set_member_name (b, "route");
      json_builder_add_string_value (b, route == 'a' ? "a" : "b");
    }
  json_builder_set_member_name (b, "region");
  json_builder_add_boolean_value (b, v->region);
  json_builder_set_member_name (b, "exact");
  json_builder_add_boolean_value (b, v->exact);
  json_builder_set_member_name (b, "limit");
  json_builder_add_string_value (b, df_limit_key (v->limit));
  df_json_add_double_or_null (b, "value", v->has_value, value);
  df_json_add_double (b, "threshold", threshold);
  json_builder_set_member_name (b, "units");
  json_builder_add_string_value (b, units);
  json_builder_set_member_name (b, "source");
  if (l->source != NULL)
    json_builder_add_string_value (b, l->source);
  else
    json_builder_add_null_value (b);
  json_builder_set_member_name (b, "within");
  json_builder_add_boolean_value (b, v->within);
  json_builder_set_member_name (b, "where");
  if (v->has_where)
    {
      json_builder_begin_array (b);
      df_json_add_double_value (b, df_unit_length (v->s0, du->model, du->length));
      df_json_add_double_value (b, df_unit_length (v->s1, du->model, du->length));
      json_builder_end_array (b);
    }
  else
    json_builder_add_null_value (b);
  json_builder_set_member_name (b, "through_start");
  json_builder_add_boolean_value (b, v->has_where && v->s0 > v->s1);
  json_builder_set_member_name (b, "worst_at");
  json_builder_begin_object (b);
  df_json_add_double (b, "s", df_unit_length (v->s_worst, du->model, du->length));
  df_json_add_double (b, "u", v->u_worst);
  df_json_add_double (b, "v", v->v_worst);
  json_builder_set_member_name (b, "point");
  json_builder_begin_array (b);
  for (int c = 0; c < 3; c++)
    df_json_add_double_value (b, df_unit_length (v->point_worst[c], du->model, du->length));
  json_builder_end_array (b);
  json_builder_end_object (b);
  if (v->limit == DF_LIMIT_MIN_STEERING_RADIUS)
    df_json_add_double_or_null (b, "tow_compression_percent", v->has_tow,
                                100.0 * v->tow_compression);
  if (v->limit == DF_LIMIT_MAX_SHEAR && v->region && shear != NULL)
    {
      /* The drape behind the verdict, so it can be rerun with `drape` (lengths converted). */
      df_json_add_double (b, "signed_value", v->signed_value);
      json_builder_set_member_name (b, "cells");
      json_builder_add_int_value (b, (gint64) shear->n_cells);
      json_builder_set_member_name (b, "cells_over_limit");
      json_builder_add_int_value (b, (gint64) shear->n_cells_over);
      json_builder_set_member_name (b, "drape");
      json_builder_begin_object (b);
      json_builder_set_member_name (b, "start");
      json_builder_begin_array (b);
      df_json_add_double_value (b, shear->start[0]);
      df_json_add_double_value (b, shear->start[1]);
      json_builder_end_array (b);
      df_json_add_double (b, "warp_deg", shear->warp_deg);
      df_json_add_double (b, "cell", df_unit_length (shear->cell, du->model, du->length));
      json_builder_set_member_name (b, "start_default");
      json_builder_add_string_value (b, !shear->start_default ? "given"
                                        : shear->start_moved ? "first point moved inward"
                                                             : "chart centroid");
      json_builder_set_member_name (b, "warp_default");
      json_builder_add_boolean_value (b, shear->warp_default);
      json_builder_set_member_name (b, "cell_default");
      json_builder_add_boolean_value (b, shear->cell_default);
      json_builder_set_member_name (b, "pins_lost");
      json_builder_add_int_value (b, (gint64) shear->n_nodes_lost);
      json_builder_end_object (b);
    }
  json_builder_set_member_name (b, "caution");
  json_builder_add_string_value (b, DF_DECIDE_CAUTION);
  json_builder_end_object (b);
}

static void
print_json (const check_options *o, const df_project *project, const loop_check *checks,
            const curve_check *curves, guint n_curves, const df_display_units *du,
            gboolean exceeded)
{
  g_autoptr (JsonBuilder) b = json_builder_new ();

  json_builder_begin_object (b);
  json_builder_set_member_name (b, "project");
  json_builder_add_string_value (b, o->project_path);
  json_builder_set_member_name (b, "units");
  json_builder_add_string_value (b, df_unit_name (du->length));
  json_builder_set_member_name (b, "within");
  json_builder_add_boolean_value (b, !exceeded);
  json_builder_set_member_name (b, "limits");
  json_builder_begin_array (b);
  for (int i = 0; i < DF_N_LIMITS; i++)
    {
      const df_limit *l = &project->limits->item[i];
      g_autofree char *text = NULL;

      if (!l->set)
        continue;
      text = df_limit_value_text (l);
      json_builder_begin_object (b);
      json_builder_set_member_name (b, "limit");
      json_builder_add_string_value (b, df_limit_key ((df_limit_id) i));
      json_builder_set_member_name (b, "as_written");
      json_builder_add_string_value (b, text);
      json_builder_set_member_name (b, "source");
      if (l->source != NULL)
        json_builder_add_string_value (b, l->source);
      else
        json_builder_add_null_value (b);
      json_builder_end_object (b);
    }
  json_builder_end_array (b);
  json_builder_set_member_name (b, "verdicts");
  json_builder_begin_array (b);
  for (guint i = 0; i < project->loops->len; i++)
    {
      const df_project_loop *loop = g_ptr_array_index (project->loops, i);

      for (size_t k = 0; k < checks[i].verdicts.n; k++)
        add_verdict (b, loop->name, i, DF_VERDICT_LOOP, 0, &checks[i].verdicts.items[k],
                     project->limits, du, &checks[i].shear);
    }
  for (guint i = 0, gi = 0, pi = 0; i < n_curves; i++)
    {
      const curve_check *c = &curves[i];
      gboolean geo = c->verdicts.kind == DF_VERDICT_GEODESIC;
      const char *name = geo ? ((const df_project_geodesic *) g_ptr_array_index (
                                   project->extras.geodesics, gi))->name
                             : ((const df_project_paths *) g_ptr_array_index (
                                   project->extras.paths, pi))->name;

      for (size_t k = 0; k < c->verdicts.n; k++)
        add_verdict (b, name, geo ? gi : pi, c->verdicts.kind, c->route, &c->verdicts.items[k],
                     project->limits, du, NULL);
      if (geo)
        gi++;
      else if (c->route == 'b')
        pi++;
    }
  json_builder_end_array (b);
  /* Limits set but not checked on a loop, with why. */
  json_builder_set_member_name (b, "not_checked");
  json_builder_begin_array (b);
  for (guint i = 0; i < project->loops->len; i++)
    {
      const df_project_loop *loop = g_ptr_array_index (project->loops, i);
      const char *notes[2] = { checks[i].strain_note, checks[i].shear_note };
      const df_limit_id ids[2] = { DF_LIMIT_MAX_STRAIN, DF_LIMIT_MAX_SHEAR };

      for (int k = 0; k < 2; k++)
        if (notes[k][0] != '\0')
          {
            json_builder_begin_object (b);
            json_builder_set_member_name (b, "loop");
            json_builder_add_string_value (b, loop->name);
            json_builder_set_member_name (b, "limit");
            json_builder_add_string_value (b, df_limit_key (ids[k]));
            json_builder_set_member_name (b, "note");
            json_builder_add_string_value (b, notes[k]);
            json_builder_end_object (b);
          }
    }
  json_builder_end_array (b);
  json_builder_set_member_name (b, "darts");
  json_builder_begin_array (b);
  for (guint i = 0; i < project->loops->len; i++)
    {
      const df_project_loop *loop = g_ptr_array_index (project->loops, i);
      const loop_check *c = &checks[i];

      if (!c->has_darts)
        continue;
      json_builder_begin_object (b);
      json_builder_set_member_name (b, "loop");
      json_builder_add_string_value (b, loop->name);
      df_json_add_double (b, "enclosed_curvature_deg", c->darts.omega_rad * 180.0 / G_PI);
      json_builder_set_member_name (b, "gusset");
      json_builder_add_boolean_value (b, c->darts.gusset);
      df_json_add_double (b, "dart_angle_one_deg", c->darts.angle_each_rad * 180.0 / G_PI);
      json_builder_set_member_name (b, "least_count");
      if (c->least_darts > 0)
        json_builder_add_int_value (b, c->least_darts);
      else
        json_builder_add_null_value (b);
      df_json_add_double (b, "dart_length",
                          df_unit_length (c->darts.length, du->model, du->length));
      json_builder_end_object (b);
    }
  json_builder_end_array (b);
  json_builder_set_member_name (b, "caution");
  json_builder_add_string_value (b, DF_DECIDE_CAUTION);
  json_builder_end_object (b);
  df_cli_print_json (b);
}

static int
run (check_options *o)
{
  g_autoptr (GError) error = NULL;
  g_autoptr (df_project) project = NULL;
  g_autoptr (df_surface) surface = NULL;
  g_autofree loop_check *checks = NULL;
  g_autofree curve_check *curves = NULL;
  guint n_curves = 0;
  df_display_units du;
  gboolean exceeded = FALSE, any_limit = FALSE;
  int code = DF_CLI_EXIT_OK;
  size_t n_samples = DEFAULT_SAMPLES;
  guint n;

  if (!df_cli_require ("--project", o->project_path, &error))
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
  if (o->samples != 0)
    {
      if (o->samples < 8 || o->samples > 200000)
        return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT, "--samples: %d is outside [8, 200000]",
                                o->samples);
      n_samples = (size_t) o->samples;
    }
  project = df_project_load (o->project_path, &error);
  if (project == NULL)
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
  for (gsize i = 0; o->params != NULL && o->params[i] != NULL; i++)
    if (!df_surface_spec_set_param (project->spec, o->params[i], NULL, &error))
      {
        g_prefix_error (&error, "--param %s: ", o->params[i]);
        return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
      }
  surface = df_surface_spec_build (project->spec, &error);
  if (surface == NULL)
    {
      g_prefix_error (&error, "%s: ", o->project_path);
      return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
    }
  if (!df_cli_project_units (project, o->project_path, o->units_text, NULL, &du, &error))
    return df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
  for (int i = 0; i < DF_N_LIMITS; i++)
    any_limit = any_limit || project->limits->item[i].set;
  n = project->loops->len;
  if (n == 0 && project->extras.geodesics->len == 0 && project->extras.paths->len == 0)
    return df_cli_fail_msg (NAME, DF_CLI_EXIT_INPUT, "%s: the project has no loops, geodesics "
                            "or paths", o->project_path);

  checks = g_new0 (loop_check, n);
  for (guint i = 0; i < n && code == DF_CLI_EXIT_OK; i++)
    {
      const df_project_loop *loop = g_ptr_array_index (project->loops, i);

      if (!check_loop (surface, loop, project->limits, n_samples, &checks[i], &error))
        {
          g_prefix_error (&error, "%s: [loop %u] '%s': ", o->project_path, i + 1, loop->name);
          code = df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
        }
      exceeded = exceeded || checks[i].verdicts.n_exceeded > 0;
    }
  curves = g_new0 (curve_check, project->extras.geodesics->len
                                   + 2 * project->extras.paths->len + 1);
  for (guint i = 0; i < project->extras.geodesics->len && code == DF_CLI_EXIT_OK; i++)
    {
      const df_project_geodesic *g = g_ptr_array_index (project->extras.geodesics, i);

      if (!check_geodesic (surface, g, project->limits, n_samples, &curves[n_curves++], &error))
        {
          g_prefix_error (&error, "%s: [geodesic %u] '%s': ", o->project_path, i + 1, g->name);
          code = df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
        }
      exceeded = exceeded || curves[n_curves - 1].verdicts.n_exceeded > 0;
    }
  for (guint i = 0; i < project->extras.paths->len && code == DF_CLI_EXIT_OK; i++)
    {
      const df_project_paths *p = g_ptr_array_index (project->extras.paths, i);

      for (int r = 'a'; r <= 'b' && code == DF_CLI_EXIT_OK; r++)
        {
          if (!check_route (surface, p, r, project->limits, n_samples, &curves[n_curves++],
                            &error))
            {
              g_prefix_error (&error, "%s: [paths %u] '%s' route %c: ", o->project_path, i + 1,
                              p->name, r);
              code = df_cli_fail (NAME, error, DF_CLI_EXIT_INPUT);
            }
          exceeded = exceeded || curves[n_curves - 1].verdicts.n_exceeded > 0;
        }
    }
  if (code == DF_CLI_EXIT_OK)
    {
      if (o->json)
        print_json (o, project, checks, curves, n_curves, &du, exceeded);
      else
        print_text (o, project, surface, checks, curves, n_curves, &du, any_limit);
      if (exceeded)
        code = DF_CLI_EXIT_EXCEEDED;
    }
  for (guint i = 0; i < n; i++)
    {
      df_loop_result_clear (&checks[i].result);
      df_verdict_list_clear (&checks[i].verdicts);
    }
  for (guint i = 0; i < n_curves; i++)
    {
      g_free (curves[i].name);
      df_verdict_list_clear (&curves[i].verdicts);
    }
  return code;
}

int
df_cli_check (int argc, char **argv)
{
  check_options o = { 0 };
  g_autoptr (GOptionContext) context = NULL;
  int code;
  const GOptionEntry entries[] = {
    { "project", 'f', 0, G_OPTION_ARG_FILENAME, &o.project_path,
      "Project file (.dfproj) with its loops and a [limits] group", "FILE" },
    { "param", 'P', 0, G_OPTION_ARG_STRING_ARRAY, &o.params,
      "Override a surface parameter, e.g. R=120 (repeatable)", "KEY=VALUE" },
    { "samples", 'n', 0, G_OPTION_ARG_INT, &o.samples,
      "Samples per loop for the verdicts (default 2000; range ends are refined between them)",
      "N" },
    { "units", 'u', 0, G_OPTION_ARG_STRING, &o.units_text,
      "Display lengths in mm, cm, m or in (default: the project's [units], else the surface's)",
      "UNIT" },
    { "json", 'j', 0, G_OPTION_ARG_NONE, &o.json, "Print the verdicts as JSON", NULL },
    { NULL },
  };

  context = df_cli_context_new (NAME, "check every loop of a project against its limits",
                                "Checks each loop, geodesic and path route of the project against the limits in its "
                                "[limits] group (min-steering-radius with tow-width, "
                                "max-fibre-deviation-deg, friction; max-strain-percent over "
                                "each loop's enclosed region at [limits] patch-size; "
                                "max-shear-deg against the worst cell shear of a drape of each "
                                "loop, from its drape-start, drape-warp-deg and drape-cell or "
                                "else from its chart centroid, warp 0 and cells of the loop's "
                                "length / " G_STRINGIFY (DF_SHEAR_CELLS_PER_LENGTH) ", and the "
                                "least dart count) and lists every stretch where one is "
                                "exceeded. A path's fibre deviation is against its start "
                                "tangent carried parallel; a geodesic's against its start "
                                "heading held to the u lines (k_g = 0 on a geodesic).\n\nExit status: 0 everything within the limits, 3 a "
                                "limit is exceeded, 2 bad input.");
  g_option_context_add_main_entries (context, entries, NULL);
  if (!df_cli_parse (context, NAME, &argc, &argv))
    code = DF_CLI_EXIT_INPUT;
  else
    code = run (&o);

  g_free (o.project_path);
  g_strfreev (o.params);
  g_free (o.units_text);
  return code;
}
