/* df-verdict-text.c: wording of verdicts (see df-verdict-text.h). Formatting only. */
#include "df-verdict-text.h"

#include <math.h>

#include "df-format.h"

const char *
df_verdict_limit_title (df_limit_id id)
{
  switch (id)
    {
    case DF_LIMIT_MIN_STEERING_RADIUS:
      return "Steering radius";
    case DF_LIMIT_TOW_WIDTH:
      return "Tow width";
    case DF_LIMIT_MAX_FIBRE_DEVIATION:
      return "Fibre deviation";
    case DF_LIMIT_MAX_SHEAR:
      return "Fabric shear";
    case DF_LIMIT_FRICTION:
      return "Slip (|k_g / k_n| against friction)";
    case DF_LIMIT_MAX_STRAIN:
      return "Sheet strain over the enclosed region";
    case DF_N_LIMITS:
    default:
      return "Limit";
    }
}

const char *
df_verdict_units (df_limit_id           id,
                  const DfDisplayUnits *du)
{
  switch (df_limit_kind_of (id))
    {
    case DF_LIMIT_KIND_LENGTH:
      return df_du_length_unit (du);
    case DF_LIMIT_KIND_DEGREES:
      return "°";
    case DF_LIMIT_KIND_PERCENT:
      return "%";
    case DF_LIMIT_KIND_RATIO:
    default:
      return "";
    }
}

double
df_verdict_shown (df_limit_id           id,
                  const DfDisplayUnits *du,
                  double                model)
{
  return df_limit_kind_of (id) == DF_LIMIT_KIND_LENGTH ? df_du_length (du, model) : model;
}

static char *
with_units (double value,
            const char *units)
{
  g_autofree char *n = df_format_number (value);

  if (units[0] == '\0')
    return g_steal_pointer (&n);
  if (g_str_equal (units, "°"))
    return g_strdup_printf ("%s°", n);
  return g_strdup_printf ("%s %s", n, units);
}

char *
df_verdict_describe (const df_verdict *v,
                     const df_limits  *limits,
                     const DfDisplayUnits *du,
                     gboolean          revolution)
{
  const char *u = df_verdict_units (v->limit, du);
  const char *su = df_du_length_unit (du);
  const df_limit *l = limits != NULL ? &limits->item[v->limit] : NULL;
  g_autofree char *value = v->has_value ? with_units (df_verdict_shown (v->limit, du, v->value), u)
                                        : g_strdup ("unbounded");
  g_autofree char *threshold = with_units (df_verdict_shown (v->limit, du, v->threshold), u);
  GString *t = g_string_new (NULL);

  if (v->region && v->limit == DF_LIMIT_MAX_SHEAR)
    /* check's drape of the loop as a woven ply (df-verdict-shear.h). */
    g_string_append_printf (t, "%s: worst cell shear %s of the ply draped over the loop (the "
                            "crossing angle %s there), limit %s",
                            v->within ? "Within" : "Exceeded", value,
                            v->signed_value >= 0 ? "closes" : "opens", threshold);
  else if (v->region)
    g_string_append_printf (t, "%s: worst %s of a flat disc forced onto the surface (%s), "
                            "limit %s",
                            v->within ? "Within" : "Exceeded", value,
                            v->signed_value >= 0 ? "its rim must shrink" : "its rim must stretch",
                            threshold);
  else if (v->within || !v->has_where)
    g_string_append_printf (t, "%s all along: worst %s, limit %s",
                            v->within ? "Within the limit" : "Exceeded", value, threshold);
  else
    {
      g_autofree char *s0 = df_format_number (df_du_length (du, v->s0));
      g_autofree char *s1 = df_format_number (df_du_length (du, v->s1));
      g_autofree char *sw = df_format_number (df_du_length (du, v->s_worst));

      g_string_append_printf (t, "Exceeded from s = %s to %s %s%s: worst %s at s = %s %s, "
                              "limit %s", s0, s1, su,
                              v->s0 > v->s1 ? " (through the start)" : "", value, sw, su,
                              threshold);
    }
  if (v->region || v->has_where || !v->within)
    {
      g_autofree char *at = df_du_format_chart_point (du, revolution, v->u_worst, v->v_worst);

      g_string_append_printf (t, " (worst at %s)", at);
    }
  if (v->has_tow && isfinite (v->tow_compression))
    {
      g_autofree char *c = df_format_number (100 * v->tow_compression);

      g_string_append_printf (t, "; the tow's inner edge is compressed about %s %%", c);
    }
  g_string_append_printf (t, ". Source: %s.",
                          l != NULL && l->source != NULL ? l->source : "none given");
  return g_string_free (t, FALSE);
}

char *
df_verdict_summary (const df_verdict_list *list)
{
  if (list->n_exceeded > 0)
    return g_strdup_printf ("%zu stretch%s beyond the limits", list->n_exceeded,
                            list->n_exceeded == 1 ? "" : "es");
  if (list->n == 0)
    return g_strdup ("no limit applies here");
  return g_strdup ("within the limits");
}
