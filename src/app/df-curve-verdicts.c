/* df-curve-verdicts.c: verdict text for geodesics and open paths (see df-curve-verdicts.h). */
#include "df-curve-verdicts.h"

#include "df-verdict-curves.h"
#include "df-verdict-text.h"

static gboolean
any_curve_limit (const df_limits *limits)
{
  return limits != NULL
         && (limits->item[DF_LIMIT_MIN_STEERING_RADIUS].set
             || limits->item[DF_LIMIT_MAX_FIBRE_DEVIATION].set
             || limits->item[DF_LIMIT_FRICTION].set);
}

/* "Against your limits (route A): 1 stretch beyond limits" and one line per verdict. */
static char *
describe (const df_verdict_list *list, const df_limits *limits, const char *units,
          gboolean revolution, const char *label)
{
  g_autofree char *summary = df_verdict_summary (list);
  GString *text = g_string_new (NULL);

  g_string_append_printf (text, "Against your limits (%s): %s", label, summary);
  for (size_t i = 0; i < list->n; i++)
    {
      g_autofree char *line = df_verdict_describe (&list->items[i], limits, units, revolution);

      g_string_append_printf (text, "\n• %s: %s", df_verdict_limit_title (list->items[i].limit),
                              line);
    }
  return g_string_free (text, FALSE);
}

static char *
failed (df_status st, df_diag *diag, const char *label)
{
  g_autoptr (GError) error = NULL;

  df_status_to_gerror (st, diag, &error);
  return g_strdup_printf ("Against your limits (%s): not checked: %s", label, error->message);
}

char *
df_curve_verdicts_geodesic_text (const df_surface *surface, const df_limits *limits, double u,
                                 double v, double heading_rad, double length, const char *units)
{
  g_auto (df_geodesic_result) fine = { 0 };
  df_verdict_list list = { 0 };
  df_diag diag;
  df_status st;
  char *text;

  if (surface == NULL || !any_curve_limit (limits))
    return NULL;
  df_diag_clear (&diag);
  st = df_geodesic_shoot (surface, u, v, heading_rad, length, DF_CURVE_VERDICT_SAMPLES, &fine,
                          &diag);
  if (st == DF_OK)
    st = df_verdicts_geodesic (surface, &fine, heading_rad, limits, &list, &diag);
  text = st == DF_OK
           ? describe (&list, limits, units,
                       df_surface_get_kind (surface) == DF_SURFACE_REVOLUTION, "geodesic")
           : failed (st, &diag, "geodesic");
  df_verdict_list_clear (&list);
  return text;
}

char *
df_curve_verdicts_path_text (const df_surface *surface, const df_limits *limits,
                             const double (*uv)[2], gsize n, const char *label,
                             const char *units)
{
  g_autoptr (df_curve) curve = NULL;
  df_verdict_list list = { 0 };
  df_diag diag;
  df_status st;
  char *text;

  if (surface == NULL || !any_curve_limit (limits) || uv == NULL || n < 2)
    return NULL;
  df_diag_clear (&diag);
  st = df_curve_new_through_points (surface, uv, n, false, &curve, &diag);
  if (st == DF_OK)
    {
      df_diag_clear (&diag);
      st = df_verdicts_path (curve, DF_CURVE_VERDICT_SAMPLES, limits, &list, NULL, &diag);
    }
  text = st == DF_OK
           ? describe (&list, limits, units,
                       df_surface_get_kind (surface) == DF_SURFACE_REVOLUTION, label)
           : failed (st, &diag, label);
  df_verdict_list_clear (&list);
  return text;
}

GtkLabel *
df_curve_verdicts_label_after (GtkWidget *sibling)
{
  GtkWidget *box = gtk_widget_get_parent (sibling), *label;

  if (!GTK_IS_BOX (box))
    return NULL;
  label = gtk_label_new (NULL);
  gtk_label_set_wrap (GTK_LABEL (label), TRUE);
  gtk_label_set_xalign (GTK_LABEL (label), 0);
  gtk_label_set_selectable (GTK_LABEL (label), TRUE);
  gtk_widget_set_focusable (label, FALSE);
  gtk_widget_add_css_class (label, "df-note");
  gtk_widget_set_visible (label, FALSE);
  gtk_box_insert_child_after (GTK_BOX (box), label, sibling);
  return GTK_LABEL (label);
}
