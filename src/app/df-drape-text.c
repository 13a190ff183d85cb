/* df-drape-text.c: the drape window's wording (see df-drape-text.h). Numbers through
 * df-format.c, so no "nan" reaches the screen. */
#include "df-drape-text.h"

#include <math.h>

#include "df-format.h"

#define DEG (180.0 / G_PI)

void
df_drape_text_chart_names (const df_surface *surface,
                           const char      **u,
                           const char      **v)
{
  gboolean rev = surface != NULL && df_surface_get_kind (surface) == DF_SURFACE_REVOLUTION;

  *u = rev ? "t" : "x";
  *v = rev ? "φ" : "y";
}

char *
df_drape_text_point (const DfDisplayUnits *du,
                     const df_surface     *surface,
                     double                u,
                     double                v)
{
  return df_du_format_chart_point (du, surface != NULL
                                       && df_surface_get_kind (surface) == DF_SURFACE_REVOLUTION,
                                   u, v);
}

char *
df_drape_text_figures (const DfDrapeResult *r,
                       const df_surface    *surface,
                       const DfDisplayUnits *du,
                       gboolean             final)
{
  const df_drape_summary *s = df_drape_get_summary (r->drape);
  GString *t = g_string_new (NULL);
  g_autofree char *at = df_drape_text_point (du, surface, s->max_shear_u, s->max_shear_v);
  g_autofree char *shear = df_format_number (s->max_shear_rad * DEG);
  g_autofree char *cshear = df_format_number (s->max_cell_shear_rad * DEG);
  g_autofree char *dev = df_format_number (s->max_warp_deviation_rad * DEG);
  g_autofree char *dev_at = df_drape_text_point (du, surface, s->max_warp_deviation_u,
                                                 s->max_warp_deviation_v);
  g_autofree char *enclosed = df_format_number (s->enclosed_curvature_rad);
  g_autofree char *ms = df_format_number (r->elapsed_ms);

  g_string_append_printf (t, "Cells over the ply: %zu (%zu whole), %zu pins placed, in %s ms\n",
                          s->n_cells, s->n_whole_cells, s->n_nodes, ms);
  g_string_append_printf (t, "Max shear (90° − crossing angle): %s° at %s (cells: %s°)\n",
                          shear, at, cshear);
  g_string_append_printf (t, "Max warp deviation from the intended direction: %s° at %s\n",
                          dev, dev_at);
  g_string_append_printf (t, "Enclosed curvature (whole cells' angle excess): %s rad\n",
                          enclosed);
  if (final && isfinite (s->closure_max_residual_rad))
    {
      g_autofree char *res = g_strdup_printf ("%.2g", s->closure_max_residual_rad);

      g_string_append_printf (t, "Cell closure (worst |excess − ∬K dA|): %s rad\n", res);
    }
  else
    g_string_append (t, "Cell closure: checked when the start pin is released\n");
  if (isfinite (s->flat_area))
    {
      g_autofree char *area = df_du_format_area (du, s->flat_area);
      g_autofree char *w = df_du_format_length (du, s->flat_hi[0] - s->flat_lo[0]);
      g_autofree char *h = df_du_format_length (du, s->flat_hi[1] - s->flat_lo[1]);

      g_string_append_printf (t, "Flat pattern: area %s, %s × %s (warp × weft)", area, w, h);
    }
  else
    g_string_append_printf (t, "Flat pattern: incomplete, %zu of %zu outline points lie in no "
                            "cell (the net does not reach them)", s->n_outline_unmapped,
                            s->n_outline);
  if (s->n_nodes_lost > 0)
    g_string_append_printf (t, "\nPins not placed: %zu; first: %s", s->n_nodes_lost,
                            s->lost_note);
  return g_string_free (t, FALSE);
}

static const char *
source_of (const df_limit *l)
{
  return l->source != NULL && l->source[0] != '\0' ? l->source : "no source given";
}

char *
df_drape_text_flags (const DfDrapeResult *r,
                     const df_surface    *surface,
                     const DfDisplayUnits *du,
                     const df_limits     *limits)
{
  const df_drape_summary *s = df_drape_get_summary (r->drape);
  const df_drape_options *o = df_drape_get_options (r->drape);
  const df_limit *shear = limits != NULL ? &limits->item[DF_LIMIT_MAX_SHEAR] : NULL;
  const df_limit *dev = limits != NULL ? &limits->item[DF_LIMIT_MAX_FIBRE_DEVIATION] : NULL;
  GString *t = g_string_new (NULL);

  if (isfinite (o->max_shear_rad) && shear != NULL && shear->set)
    {
      g_autofree char *lim = df_format_number (shear->model_value);

      g_string_append_printf (t, "Locking angle: [limits] max-shear-deg = %s° (%s). ", lim,
                              source_of (shear));
      if (s->n_cells_over_limit == 0)
        g_string_append (t, "No cell of the ply is sheared past it.");
      else
        {
          g_autofree char *worst = df_format_number (r->worst_shear_rad * DEG);
          g_autofree char *at = df_drape_text_point (du, surface, r->worst_u, r->worst_v);

          g_string_append_printf (t, "%zu cell%s past it (crossed in the view and shaded in "
                                  "the flat pattern); the worst %s° at cell (%d, %d), %s.",
                                  s->n_cells_over_limit, s->n_cells_over_limit == 1 ? " is"
                                  : "s are", worst, r->worst_i, r->worst_j, at);
        }
    }
  else
    g_string_append (t, "Locking angle: no max-shear-deg in the project's limits (Material and "
                     "Process Limits, Ctrl+Shift+L): no cell is flagged.");
  if (isfinite (o->max_fibre_deviation_rad) && dev != NULL && dev->set)
    {
      g_autofree char *lim = df_format_number (dev->model_value);

      g_string_append_printf (t, "\nFibre deviation: [limits] max-fibre-deviation-deg = %s° "
                              "(%s): %zu pin%s past it%s.", lim, source_of (dev),
                              s->n_nodes_over_deviation,
                              s->n_nodes_over_deviation == 1 ? "" : "s",
                              s->n_nodes_over_deviation > 0
                              ? " (a magenta dash along the warp in the view)" : "");
    }
  else
    g_string_append (t, "\nFibre deviation: no max-fibre-deviation-deg in the limits.");
  return g_string_free (t, FALSE);
}
