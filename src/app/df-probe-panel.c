/* df-probe-panel.c: the Probe tool's readout (see df-probe-panel.h). The tables are rebuilt on
 * each probe because their index names depend on the chart: (t, φ) for a surface of
 * revolution, (x, y) for a height field. Values are the core's; this file formats them. */
#include <math.h>

#include "df-format.h"
#include "df-probe-panel.h"

struct _DfProbePanel
{
  GtkWidget parent_instance;

  /* template children */
  GtkLabel *hint_label;
  GtkLabel *error_label;
  GtkBox   *content_box;
  GtkEntry *at_entry;
};

enum
{
  PROBE_REQUESTED,
  N_SIGNALS
};

static guint signals[N_SIGNALS];

static void
at_activate_cb (DfProbePanel *self)
{
  const char *text = gtk_editable_get_text (GTK_EDITABLE (self->at_entry));

  if (text[0] != '\0')
    g_signal_emit (self, signals[PROBE_REQUESTED], 0, text);
}

G_DEFINE_FINAL_TYPE (DfProbePanel, df_probe_panel, GTK_TYPE_WIDGET)

static GtkWidget *
heading (const char *text)
{
  GtkWidget *label = gtk_label_new (text);

  gtk_label_set_xalign (GTK_LABEL (label), 0.0);
  gtk_widget_add_css_class (label, "heading");
  gtk_widget_set_margin_top (label, 6);
  return label;
}

static GtkWidget *
note (const char *text)
{
  GtkWidget *label = gtk_label_new (text);

  gtk_label_set_xalign (GTK_LABEL (label), 0.0);
  gtk_label_set_wrap (GTK_LABEL (label), TRUE);
  gtk_widget_add_css_class (label, "dim-label");
  gtk_widget_add_css_class (label, "caption");
  return label;
}

/* A two-column table of name / value rows. */
static GtkWidget *
table_new (void)
{
  GtkWidget *grid = gtk_grid_new ();

  gtk_grid_set_column_spacing (GTK_GRID (grid), 12);
  gtk_grid_set_row_spacing (GTK_GRID (grid), 2);
  return grid;
}

static void
table_add (GtkWidget  *grid,
           int         row,
           const char *name,
           const char *value)  /* owned by caller */
{
  GtkWidget *n = gtk_label_new (NULL);
  GtkWidget *v = gtk_label_new (value);

  gtk_label_set_markup (GTK_LABEL (n), name);
  gtk_label_set_xalign (GTK_LABEL (n), 0.0);
  gtk_label_set_xalign (GTK_LABEL (v), 0.0);
  gtk_label_set_selectable (GTK_LABEL (v), TRUE);
  /* Selectable for copying with the mouse, but not a Tab stop: a table of numbers would
   * otherwise take dozens of presses to get through. */
  gtk_widget_set_focusable (v, FALSE);
  gtk_widget_set_hexpand (v, TRUE);
  gtk_widget_add_css_class (v, "numeric");
  gtk_accessible_update_property (GTK_ACCESSIBLE (v), GTK_ACCESSIBLE_PROPERTY_LABEL, name, -1);
  gtk_grid_attach (GTK_GRID (grid), n, 0, row, 1, 1);
  gtk_grid_attach (GTK_GRID (grid), v, 1, row, 1, 1);
}

/* Components below this fraction of the largest one in their table are rounding noise of
 * the derivatives (a symmetric chart gives exact zeros analytically): shown as 0. */
#define DF_NOISE_FRACTION 1e-11

static double
denoise (double value,
         double scale)
{
  return fabs (value) <= DF_NOISE_FRACTION * scale ? 0.0 : value;
}

static void
table_add_number (GtkWidget  *grid,
                  int         row,
                  const char *name,
                  double      value,
                  const char *unit)
{
  g_autofree char *number = df_format_number (value);
  g_autofree char *text = isfinite (value) && unit != NULL && unit[0] != '\0'
                            ? g_strdup_printf ("%s %s", number, unit)
                            : g_strdup (number);

  table_add (grid, row, name, text);
}

static void
clear_content (DfProbePanel *self)
{
  GtkWidget *child;

  while ((child = gtk_widget_get_first_child (GTK_WIDGET (self->content_box))) != NULL)
    gtk_box_remove (self->content_box, child);
}

static void
df_probe_panel_dispose (GObject *object)
{
  GtkWidget *child;

  gtk_widget_dispose_template (GTK_WIDGET (object), DF_TYPE_PROBE_PANEL);
  /* The template's unnamed top box is not a bound child: unparent whatever is left. */
  while ((child = gtk_widget_get_first_child (GTK_WIDGET (object))) != NULL)
    gtk_widget_unparent (child);
  G_OBJECT_CLASS (df_probe_panel_parent_class)->dispose (object);
}

static void
df_probe_panel_class_init (DfProbePanelClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->dispose = df_probe_panel_dispose;
  gtk_widget_class_set_template_from_resource (widget_class,
                                               "/org/driftframe/Driftframe/ui/df-probe-panel.ui");
  gtk_widget_class_bind_template_child (widget_class, DfProbePanel, hint_label);
  gtk_widget_class_bind_template_child (widget_class, DfProbePanel, error_label);
  gtk_widget_class_bind_template_child (widget_class, DfProbePanel, content_box);
  gtk_widget_class_bind_template_child (widget_class, DfProbePanel, at_entry);
  gtk_widget_class_bind_template_callback (widget_class, at_activate_cb);

  /* The typed point (the entry's text) was confirmed; the window parses and probes it. */
  signals[PROBE_REQUESTED] =
    g_signal_new ("probe-requested", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0, NULL,
                  NULL, NULL, G_TYPE_NONE, 1, G_TYPE_STRING);
  gtk_widget_class_set_layout_manager_type (widget_class, GTK_TYPE_BIN_LAYOUT);
  gtk_widget_class_set_css_name (widget_class, "dfprobepanel");
}

static void
df_probe_panel_init (DfProbePanel *self)
{
  gtk_widget_init_template (GTK_WIDGET (self));
}

GtkWidget *
df_probe_panel_new (void)
{
  return g_object_new (DF_TYPE_PROBE_PANEL, NULL);
}

void
df_probe_panel_show (DfProbePanel            *self,
                     const df_surface        *surface,
                     const df_point_geometry *g,
                     const DfDisplayUnits    *du)
{
  /* Chart coordinates and the chart's tensors stay in the surface's own units (as the CLI's
   * probe --units leaves them); the point and the curvatures are shown in the display units. */
  const char *units = du->label;
  const char *shown = df_du_length_unit (du);
  gboolean rev;
  const char *idx[2];
  GtkWidget *table;
  double scale;
  int row = 0;

  g_return_if_fail (DF_IS_PROBE_PANEL (self));
  g_return_if_fail (surface != NULL && g != NULL);

  rev = df_surface_get_kind (surface) == DF_SURFACE_REVOLUTION;
  idx[0] = rev ? "t" : "x";
  idx[1] = rev ? "φ" : "y";
  clear_content (self);
  gtk_widget_set_visible (GTK_WIDGET (self->error_label), FALSE);
  gtk_widget_set_visible (GTK_WIDGET (self->content_box), TRUE);
  gtk_label_set_text (self->hint_label, "Click another point to probe it.");

  /* Where */
  gtk_box_append (self->content_box, heading ("Point"));
  table = table_new ();
  {
    g_autofree char *chart = NULL;
    g_autofree char *x = df_format_number (df_du_length (du, g->point[0]));
    g_autofree char *y = df_format_number (df_du_length (du, g->point[1]));
    g_autofree char *z = df_format_number (df_du_length (du, g->point[2]));
    g_autofree char *space = g_strdup_printf ("(%s, %s, %s) %s", x, y, z, shown);
    g_autofree char *nx = df_format_number (g->normal[0]);
    g_autofree char *ny = df_format_number (g->normal[1]);
    g_autofree char *nz = df_format_number (g->normal[2]);
    g_autofree char *normal = g_strdup_printf ("(%s, %s, %s)", nx, ny, nz);

    chart = df_du_format_chart_point (du, rev, g->u, g->v);
    table_add (table, row++, "Chart", chart);
    if (df_du_converts (du))
      gtk_widget_set_tooltip_text (gtk_widget_get_last_child (table),
                                   "t is the profile's own parameter, in its own unit (a "
                                   "graph's x, y are shown in the display unit); the tensors "
                                   "below are in the chart's own coordinates and the surface's "
                                   "units, as the project file and the command line take them.");
    table_add (table, row++, "Position", space);
    table_add (table, row++, "Unit normal N", normal);
  }
  gtk_box_append (self->content_box, table);
  gtk_box_append (self->content_box, note (df_surface_normal_side (surface)));

  /* Curvature */
  gtk_box_append (self->content_box, heading ("Curvature"));
  table = table_new ();
  row = 0;
  {
    g_autofree char *per_area = g_strdup_printf ("1/%s²", df_du_curvature_unit (du));
    /* H, k1, k2 per the curvature unit, as `probe --curvature-units` (K = k1 k2 as shown). */
    g_autofree char *per_length = g_strdup_printf ("1/%s", df_du_curvature_unit (du));

    if (!g->curvature_defined)
      {
        /* A cone apex: no K or H, only the concentrated curvature (core: df-geometry.h). */
        table_add_number (table, row++, "Concentrated", g->concentrated_rad, "rad");
        gtk_box_append (self->content_box, table);
        gtk_box_append (self->content_box, note (g->note));
        return;
      }
    table_add_number (table, row++, "Gaussian K", df_du_gaussian (du, g->K), per_area);
    table_add_number (table, row++, "Mean H", df_du_per_curvature (du, g->H), per_length);
    table_add_number (table, row++, "Principal k<sub>1</sub>", df_du_per_curvature (du, g->k1),
                      per_length);
    table_add_number (table, row++, "Principal k<sub>2</sub>", df_du_per_curvature (du, g->k2),
                      per_length);
    if (g->k1 != 0.0)
      table_add_number (table, row++, "Radius 1/k<sub>1</sub>", df_du_length (du, 1.0 / g->k1),
                        shown);
    if (g->k2 != 0.0)
      table_add_number (table, row++, "Radius 1/k<sub>2</sub>", df_du_length (du, 1.0 / g->k2),
                        shown);
  }
  gtk_box_append (self->content_box, table);
  gtk_box_append (self->content_box,
                  note ("k₁, k₂ and H are signed by N (second form X_ij · N): positive where the "
                        "surface curves towards N, so a sphere with N pointing outward has "
                        "k = −1/R. K does not depend on the choice of N."));

  if (!g->chart_regular)
    {
      gtk_box_append (self->content_box,
                      note ("This point is a pole of the chart (r = 0): the inverse metric, "
                            "Christoffel symbols and Riemann components are not defined there in "
                            "(t, φ); the curvatures above are their exact limits."));
      return;
    }
  /* Near a pole the chart's Christoffel symbols grow like 1/r while the geometry is smooth:
   * say so before someone reads Γ of several hundred as a property of the part. "Near": within
   * 2 % of the surface's size of the axis (common practice, no source). */
  if (rev && hypot (g->point[0], g->point[1]) < 0.02 * df_surface_size (surface))
    {
      GtkWidget *warning = note ("Near a singular point of the chart (a pole, r → 0): the "
                                 "Christoffel symbols and metric below are large because the "
                                 "(t, φ) chart degenerates there, not because the surface "
                                 "does; the curvatures above are unaffected.");
      gtk_widget_add_css_class (warning, "df-error");
      gtk_box_append (self->content_box, warning);
    }

  /* Metric */
  gtk_box_append (self->content_box, heading ("Metric g<sub>ij</sub>"));
  gtk_label_set_use_markup (GTK_LABEL (gtk_widget_get_last_child (GTK_WIDGET (self->content_box))),
                            TRUE);
  if (df_du_converts (du))
    {
      g_autofree char *text = g_strdup_printf ("The chart's tensors below are in its own "
                                               "coordinates, the surface's %s, not in %s.",
                                               units, shown);

      gtk_box_append (self->content_box, note (text));
    }
  table = table_new ();
  row = 0;
  scale = 0.0;
  for (int i = 0; i < DF_DIM; i++)
    for (int j = 0; j < DF_DIM; j++)
      scale = MAX (scale, fabs (g->g[i][j]));
  for (int i = 0; i < DF_DIM; i++)
    for (int j = i; j < DF_DIM; j++)
      {
        g_autofree char *name = g_strdup_printf ("g<sub>%s%s</sub>", idx[i], idx[j]);
        table_add_number (table, row++, name, denoise (g->g[i][j], scale), NULL);
      }
  table_add_number (table, row++, "det g", g->det_g, NULL);
  gtk_box_append (self->content_box, table);

  /* Christoffel symbols, symmetric in the lower pair */
  gtk_box_append (self->content_box, heading ("Christoffel symbols Γ<sup>k</sup><sub>ij</sub>"));
  gtk_label_set_use_markup (GTK_LABEL (gtk_widget_get_last_child (GTK_WIDGET (self->content_box))),
                            TRUE);
  table = table_new ();
  row = 0;
  scale = 0.0;
  for (int k = 0; k < DF_DIM; k++)
    for (int i = 0; i < DF_DIM; i++)
      for (int j = 0; j < DF_DIM; j++)
        scale = MAX (scale, fabs (g->gamma[k][i][j]));
  for (int k = 0; k < DF_DIM; k++)
    for (int i = 0; i < DF_DIM; i++)
      for (int j = i; j < DF_DIM; j++)
        {
          g_autofree char *name = g_strdup_printf ("Γ<sup>%s</sup><sub>%s%s</sub>", idx[k],
                                                   idx[i], idx[j]);
          table_add_number (table, row++, name, denoise (g->gamma[k][i][j], scale), NULL);
        }
  gtk_box_append (self->content_box, table);

  /* Riemann tensor: on a surface only the mu, nu = 1, 2 block is independent. */
  gtk_box_append (self->content_box, heading ("Riemann tensor R<sup>ρ</sup><sub>σμν</sub>"));
  gtk_label_set_use_markup (GTK_LABEL (gtk_widget_get_last_child (GTK_WIDGET (self->content_box))),
                            TRUE);
  table = table_new ();
  row = 0;
  scale = 0.0;
  for (int r = 0; r < DF_DIM; r++)
    for (int s = 0; s < DF_DIM; s++)
      scale = MAX (scale, fabs (g->riemann[r][s][0][1]));
  for (int r = 0; r < DF_DIM; r++)
    for (int s = 0; s < DF_DIM; s++)
      {
        g_autofree char *name = g_strdup_printf ("R<sup>%s</sup><sub>%s%s%s</sub>", idx[r],
                                                 idx[s], idx[0], idx[1]);
        table_add_number (table, row++, name, denoise (g->riemann[r][s][0][1], scale), NULL);
      }
  gtk_box_append (self->content_box, table);
  {
    g_autofree char *text = NULL;

    if (rev)
      text = g_strdup_printf (
        "Components in the chart (t, φ): φ in radians, t as it appears in the profile formula, "
        "lengths in %s, the surface's own units (g in %s² per coordinate unit squared). "
        "Swapping the last two indices of R changes its sign; R with equal last indices is "
        "zero.", units, units);
    else
      text = g_strdup_printf (
        "Components in the chart (x, y), both in %s, the surface's own units: g is "
        "dimensionless, Γ in 1/%s, R in 1/%s². Swapping the last two indices of R changes its sign; R with equal last indices is "
        "zero.", units, units, units);
    gtk_box_append (self->content_box, note (text));
  }
}

void
df_probe_panel_show_error (DfProbePanel *self,
                           const char   *message)
{
  g_return_if_fail (DF_IS_PROBE_PANEL (self));

  clear_content (self);
  gtk_widget_set_visible (GTK_WIDGET (self->content_box), FALSE);
  gtk_label_set_text (self->error_label, message);
  gtk_widget_set_visible (GTK_WIDGET (self->error_label), TRUE);
}

void
df_probe_panel_clear (DfProbePanel *self)
{
  g_return_if_fail (DF_IS_PROBE_PANEL (self));

  clear_content (self);
  gtk_widget_set_visible (GTK_WIDGET (self->content_box), FALSE);
  gtk_widget_set_visible (GTK_WIDGET (self->error_label), FALSE);
  gtk_label_set_text (self->hint_label,
                      "Choose “Probe” in the header bar (Ctrl+3) and click the surface to read "
                      "its local geometry there.");
}

void
df_probe_panel_set_placeholder (DfProbePanel *self,
                                const char   *text)
{
  g_return_if_fail (DF_IS_PROBE_PANEL (self));
  gtk_entry_set_placeholder_text (self->at_entry, text);
}

void
df_probe_panel_focus_entry (DfProbePanel *self)
{
  g_return_if_fail (DF_IS_PROBE_PANEL (self));
  gtk_widget_grab_focus (GTK_WIDGET (self->at_entry));
}
