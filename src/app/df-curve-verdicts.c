/* df-curve-verdicts.c: verdict text for geodesics and open paths (see df-curve-verdicts.h). */
#include "df-curve-verdicts.h"

#include "df-verdict-curves.h"
#include "df-vec3.h"
#include "df-verdict-text.h"

#include <math.h>
#include <string.h>

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
describe (const df_verdict_list *list, const df_limits *limits, const DfDisplayUnits *du,
          gboolean revolution, const char *label)
{
  g_autofree char *summary = df_verdict_summary (list);
  GString *text = g_string_new (NULL);

  g_string_append_printf (text, "Against your limits (%s): %s", label, summary);
  for (size_t i = 0; i < list->n; i++)
    {
      g_autofree char *line = df_verdict_describe (&list->items[i], limits, du, revolution);

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

void
df_curve_verdicts_free (DfCurveVerdicts *v)
{
  if (v == NULL)
    return;
  g_free (v->text);
  df_verdict_list_clear (&v->list);
  g_free (v->s);
  g_free (v->xyz);
  g_free (v->normal);
  g_free (v);
}

static void
alloc_samples (DfCurveVerdicts *r, gsize n)
{
  r->n = n;
  r->s = g_new0 (double, n);
  r->xyz = g_malloc0_n (n, sizeof (double[3]));
  r->normal = g_malloc0_n (n, sizeof (double[3]));
}

DfCurveVerdicts *
df_curve_verdicts_geodesic (const df_surface *surface, const df_limits *limits, double u,
                            double v, double heading_rad, double length, const DfDisplayUnits *du)
{
  g_auto (df_geodesic_result) fine = { 0 };
  DfCurveVerdicts *r;
  df_diag diag;
  df_status st;

  if (surface == NULL || !any_curve_limit (limits))
    return NULL;
  r = g_new0 (DfCurveVerdicts, 1);
  df_diag_clear (&diag);
  st = df_geodesic_shoot (surface, u, v, heading_rad, length, DF_CURVE_VERDICT_SAMPLES, &fine,
                          &diag);
  if (st == DF_OK)
    st = df_verdicts_geodesic (surface, &fine, heading_rad, limits, &r->list, &diag);
  if (st != DF_OK)
    {
      r->text = failed (st, &diag, "geodesic");
      return r;
    }
  r->checked = TRUE;
  r->text = describe (&r->list, limits, du,
                      df_surface_get_kind (surface) == DF_SURFACE_REVOLUTION, "geodesic");
  r->length = fine.length;
  alloc_samples (r, fine.n_samples);
  for (gsize i = 0; i < fine.n_samples; i++)
    {
      const df_geodesic_sample *g = &fine.samples[i];
      df_chart_jet j;
      double nrm[3], len;

      r->s[i] = g->s;
      memcpy (r->xyz[i], g->point, sizeof r->xyz[i]);
      /* N = X_u x X_v / |X_u x X_v| (GEOMETRY.md); a point that cannot be evaluated keeps a
       * zero normal, so its marks lie on the curve itself. */
      if (df_surface_eval (surface, g->u, g->v, 1, &j, NULL) != DF_OK)
        continue;
      df_cross3 (j.d1[0], j.d1[1], nrm);
      len = sqrt (df_dot3 (nrm, nrm));
      if (len > 0 && isfinite (len))
        for (int k = 0; k < 3; k++)
          r->normal[i][k] = nrm[k] / len;
    }
  return r;
}

/* Points of the open curve for its marks, evenly in its parameter, with the arc length as the
 * sum of chords (400 of them: within about 1e-5 of the exact length on a smooth route, finer
 * than a mark can show). */
#define PATH_MARK_SAMPLES 401

DfCurveVerdicts *
df_curve_verdicts_path (const df_surface *surface, const df_limits *limits,
                        const double (*uv)[2], gsize n, const char *label, const DfDisplayUnits *du)
{
  g_autoptr (df_curve) curve = NULL;
  DfCurveVerdicts *r;
  double tau0, tau1, length = 0;
  df_diag diag;
  df_status st;

  if (surface == NULL || !any_curve_limit (limits) || uv == NULL || n < 2)
    return NULL;
  r = g_new0 (DfCurveVerdicts, 1);
  df_diag_clear (&diag);
  st = df_curve_new_through_points (surface, uv, n, false, &curve, &diag);
  if (st == DF_OK)
    {
      df_diag_clear (&diag);
      st = df_verdicts_path (curve, DF_CURVE_VERDICT_SAMPLES, limits, &r->list, &length, &diag);
    }
  if (st != DF_OK)
    {
      r->text = failed (st, &diag, label);
      return r;
    }
  r->checked = TRUE;
  r->text = describe (&r->list, limits, du,
                      df_surface_get_kind (surface) == DF_SURFACE_REVOLUTION, label);
  r->length = length;
  df_curve_get_range (curve, &tau0, &tau1);
  alloc_samples (r, PATH_MARK_SAMPLES);
  for (gsize i = 0; i < PATH_MARK_SAMPLES; i++)
    {
      df_curve_point cp;

      if (df_curve_eval (curve, tau0 + (tau1 - tau0) * i / (PATH_MARK_SAMPLES - 1), &cp, NULL)
          != DF_OK)
        {
          /* No marks rather than marks in the wrong place. */
          r->n = 0;
          break;
        }
      memcpy (r->xyz[i], cp.x, sizeof r->xyz[i]);
      memcpy (r->normal[i], cp.normal, sizeof r->normal[i]);
      if (i > 0)
        {
          double d[3] = { cp.x[0] - r->xyz[i - 1][0], cp.x[1] - r->xyz[i - 1][1],
                          cp.x[2] - r->xyz[i - 1][2] };

          r->s[i] = r->s[i - 1] + sqrt (df_dot3 (d, d));
        }
    }
  /* The chords' sum scaled onto the exact length, so the verdicts' s ranges land right. */
  if (r->n > 1 && r->s[r->n - 1] > 0 && length > 0)
    for (gsize i = 0; i < r->n; i++)
      r->s[i] *= length / r->s[r->n - 1];
  return r;
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
