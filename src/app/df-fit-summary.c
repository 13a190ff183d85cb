/* df-fit-summary.c: the fit of a data surface in the surface panel (see df-fit-summary.h).
 * The number rows are built in code (one label pair each, hidden where they do not apply);
 * the frame is ui/df-fit-summary.ui. The legend is drawn with cairo. */
#include <math.h>

#include "df-fit-summary.h"
#include "df-format.h"

enum
{
  ROW_POINTS,
  ROW_RMS,
  ROW_MAX,
  ROW_MAX_AT,
  ROW_TOLERANCE,
  ROW_POLES,
  ROW_SYMMETRY,
  N_ROWS
};

static const char *const row_titles[N_ROWS] = {
  "Points", "RMS distance", "Largest distance", "Largest at", "Tolerance", "Ends on the axis",
  "Off rotational symmetry"
};

struct _DfFitSummary
{
  GtkWidget parent_instance;

  /* template children */
  GtkWidget       *box;
  GtkLabel        *file_label;
  GtkGrid         *numbers_grid;
  GtkEntry        *tolerance_entry;
  GtkSpinner      *spinner;
  GtkLabel        *error_label;
  GtkCheckButton  *points_check;
  GtkDrawingArea  *legend;
  GtkLabel        *points_label;

  /* borrowed from the grid */
  GtkLabel        *titles[N_ROWS];
  GtkLabel        *values[N_ROWS];

  /* owned */
  DfDisplayUnits   du;   /* residuals and the legend in the display units */
  double           range;
  gboolean         clamped;
  gboolean         updating;
};

G_DEFINE_FINAL_TYPE (DfFitSummary, df_fit_summary, GTK_TYPE_WIDGET)

enum
{
  PROP_0,
  PROP_SHOW_POINTS,
  N_PROPS
};

enum
{
  TOLERANCE_CHANGED,
  N_SIGNALS
};

static GParamSpec *properties[N_PROPS];
static guint signals[N_SIGNALS];

/* Stops at s = -1, 0, +1 (sRGB), chosen for this app: a teal and a magenta of about the same
 * lightness round a near white (each disc has a dark rim, so it reads on any surface colour),
 * and neither arm is a curvature colour (blue, orange) of the surface under it. */
static const float deviation_stops[3][3] = {
  { 0.05f, 0.60f, 0.55f },
  { 0.93f, 0.93f, 0.91f },
  { 0.85f, 0.18f, 0.62f },
};

void
df_deviation_colour (double s,
                     float  rgb[3])
{
  int i;
  double x;

  if (!isfinite (s))
    s = 0;
  s = CLAMP (s, -1.0, 1.0);
  i = s < 0 ? 0 : 1;
  x = s < 0 ? s + 1 : s;
  for (int c = 0; c < 3; c++)
    rgb[c] = (float) (deviation_stops[i][c] + x * (deviation_stops[i + 1][c] - deviation_stops[i][c]));
}

static void
set_row (DfFitSummary *self,
         int           row,
         const char   *text)
{
  gtk_widget_set_visible (GTK_WIDGET (self->titles[row]), text != NULL);
  gtk_widget_set_visible (GTK_WIDGET (self->values[row]), text != NULL);
  gtk_label_set_text (self->values[row], text != NULL ? text : "");
}

static const char *
pole_word (int pole)
{
  return pole == 1 ? "smooth pole" : pole == 2 ? "cone apex" : "off the axis";
}

void
df_fit_summary_set_fit (DfFitSummary          *self,
                        const df_surface_spec *spec,
                        const df_fit_info     *info,
                        const DfDisplayUnits  *du)
{
  g_autofree char *base = NULL;
  const char *what;

  g_return_if_fail (DF_IS_FIT_SUMMARY (self));
  g_return_if_fail (spec != NULL);

  self->du = *du;
  base = spec->data_path != NULL ? g_path_get_basename (spec->data_path) : g_strdup ("");
  what = g_strcmp0 (spec->data_key, "profile") == 0 ? "profile points, turned about the z axis"
         : g_strcmp0 (spec->data_key, "mesh") == 0
           ? (spec->kind == DF_SURFACE_REVOLUTION ? "triangle mesh, fitted as a profile about z"
                                                  : "triangle mesh, fitted as heights over xy")
         : "heights over the xy plane";
  {
    g_autofree char *text = g_strdup_printf ("%s: %s", base, what);
    gtk_label_set_text (self->file_label, text);
    gtk_widget_set_tooltip_text (GTK_WIDGET (self->file_label), spec->data_path);
  }

  self->updating = TRUE;
  if (g_strcmp0 (gtk_editable_get_text (GTK_EDITABLE (self->tolerance_entry)),
                 spec->fit_tolerance_text != NULL ? spec->fit_tolerance_text : "") != 0)
    gtk_editable_set_text (GTK_EDITABLE (self->tolerance_entry),
                           spec->fit_tolerance_text != NULL ? spec->fit_tolerance_text : "");
  self->updating = FALSE;

  if (info == NULL)
    {
      for (int r = 0; r < N_ROWS; r++)
        set_row (self, r, NULL);
      return;
    }
  {
    g_autofree char *points = g_strdup_printf ("%zu", info->points);
    g_autofree char *rms = df_du_format_length (&self->du, info->rms);
    g_autofree char *max = df_du_format_length (&self->du, info->max);
    g_autofree char *x = df_format_number (df_du_length (&self->du, info->max_at[0]));
    g_autofree char *y = df_format_number (df_du_length (&self->du, info->max_at[1]));
    g_autofree char *z = df_format_number (df_du_length (&self->du, info->max_at[2]));
    g_autofree char *at = NULL;
    /* The tolerance as the field above takes it: in the surface's own units. */
    g_autofree char *tol_len = df_format_length (info->tolerance, self->du.label);
    g_autofree char *tol = NULL;

    /* A profile's point lies in its half-plane: (r, z) is what the file says. */
    if (g_strcmp0 (spec->data_key, "profile") == 0)
      at = g_strdup_printf ("r = %s, z = %s %s", x, z, df_du_length_unit (&self->du));
    else
      at = g_strdup_printf ("(%s, %s, %s) %s", x, y, z, df_du_length_unit (&self->du));
    if (info->chosen)
      tol = g_strdup_printf ("%s, chosen from the data (generalised cross-validation)", tol_len);
    else if (info->tolerance == 0)
      tol = g_strdup ("0: the fit runs through the points");
    else
      tol = g_strdup_printf ("%s, as given", tol_len);
    set_row (self, ROW_POINTS, points);
    set_row (self, ROW_RMS, rms);
    set_row (self, ROW_MAX, max);
    set_row (self, ROW_MAX_AT, at);
    set_row (self, ROW_TOLERANCE, tol);
  }
  if (spec->kind == DF_SURFACE_REVOLUTION && (info->pole[0] != 0 || info->pole[1] != 0))
    {
      g_autofree char *poles = g_strdup_printf ("first point: %s; last point: %s",
                                                pole_word (info->pole[0]),
                                                pole_word (info->pole[1]));
      set_row (self, ROW_POLES, poles);
    }
  else
    set_row (self, ROW_POLES, NULL);
  if (info->has_symmetry)
    {
      g_autofree char *rms = df_du_format_length (&self->du, info->symmetry_rms);
      g_autofree char *max = df_du_format_length (&self->du, info->symmetry_max);
      g_autofree char *text = g_strdup_printf ("RMS %s, largest %s", rms, max);
      set_row (self, ROW_SYMMETRY, text);
    }
  else
    set_row (self, ROW_SYMMETRY, NULL);
}

void
df_fit_summary_set_busy (DfFitSummary *self,
                         gboolean      busy)
{
  g_return_if_fail (DF_IS_FIT_SUMMARY (self));
  gtk_widget_set_visible (GTK_WIDGET (self->spinner), busy);
  gtk_spinner_set_spinning (self->spinner, busy);
}

void
df_fit_summary_set_error (DfFitSummary *self,
                          const char   *message)
{
  g_return_if_fail (DF_IS_FIT_SUMMARY (self));
  gtk_widget_set_visible (GTK_WIDGET (self->error_label), message != NULL);
  gtk_label_set_text (self->error_label, message != NULL ? message : "");
}

void
df_fit_summary_set_deviation (DfFitSummary *self,
                              double        range,
                              gboolean      clamped,
                              gsize         n_shown,
                              gsize         n_data,
                              const DfDisplayUnits *du)
{
  g_autofree char *text = NULL;

  g_return_if_fail (DF_IS_FIT_SUMMARY (self));
  self->range = isfinite (range) ? range : 0;
  self->clamped = clamped;
  self->du = *du;
  if (n_shown == 0)
    text = g_strdup ("No data points to draw.");
  else if (n_shown < n_data)
    text = g_strdup_printf ("%zu of the %zu points drawn, evenly thinned in file order; "
                            "distances along the surface normal, + on the side it points to.",
                            n_shown, n_data);
  else
    text = g_strdup_printf ("All %zu points drawn; distances along the surface normal, + on "
                            "the side it points to.", n_shown);
  gtk_label_set_text (self->points_label, text);
  gtk_widget_set_visible (GTK_WIDGET (self->legend), n_shown > 0);
  gtk_widget_queue_draw (GTK_WIDGET (self->legend));
}

gboolean
df_fit_summary_get_show_points (DfFitSummary *self)
{
  g_return_val_if_fail (DF_IS_FIT_SUMMARY (self), FALSE);
  return gtk_check_button_get_active (self->points_check);
}

/* The legend: the ramp from -max to +max with its two ends and zero labelled in units. */
static void
draw_legend (GtkDrawingArea *area,
             cairo_t        *cr,
             int             width,
             int             height,
             gpointer        user_data)
{
  DfFitSummary *self = user_data;
  GtkStyleContext *style = gtk_widget_get_style_context (GTK_WIDGET (area));
  double bar_h = 12, margin = 4;
  GdkRGBA fg;
  const char *labels[3];
  g_autofree char *lo = NULL;
  g_autofree char *hi = NULL;
  PangoLayout *layout;

  gtk_style_context_get_color (style, &fg);
  for (int x = 0; x < width - 2 * margin; x++)
    {
      float rgb[3];

      df_deviation_colour (2.0 * x / MAX (width - 2 * margin - 1, 1) - 1, rgb);
      cairo_set_source_rgb (cr, rgb[0], rgb[1], rgb[2]);
      cairo_rectangle (cr, margin + x, 0, 1, bar_h);
      cairo_fill (cr);
    }
  {
    g_autofree char *a = df_du_format_length (&self->du, -self->range);
    g_autofree char *b = df_du_format_length (&self->du, self->range);

    lo = self->clamped ? g_strdup_printf ("≤ %s", a) : g_steal_pointer (&a);
    hi = self->clamped ? g_strdup_printf ("≥ %s", b) : g_steal_pointer (&b);
  }
  labels[0] = lo;
  labels[1] = "0";
  labels[2] = hi;
  layout = gtk_widget_create_pango_layout (GTK_WIDGET (area), NULL);
  gdk_cairo_set_source_rgba (cr, &fg);
  {
    int tw[3], th;
    double gap = 8;

    for (int i = 0; i < 3; i++)
      {
        pango_layout_set_text (layout, labels[i], -1);
        pango_layout_get_pixel_size (layout, &tw[i], &th);
      }
    for (int i = 0; i < 3; i++)
      {
        double x = i == 0 ? margin : i == 2 ? width - margin - tw[2] : (width - tw[1]) / 2.0;

        /* The zero mark only where it clears both ends (a narrow panel, long numbers). */
        if (i == 1 && (x < margin + tw[0] + gap || x + tw[1] > width - margin - tw[2] - gap))
          continue;
        pango_layout_set_text (layout, labels[i], -1);
        cairo_move_to (cr, x, bar_h + 2);
        pango_cairo_show_layout (cr, layout);
      }
  }
  g_object_unref (layout);
}

static void
tolerance_activate_cb (GtkEntry     *entry,
                       DfFitSummary *self)
{
  g_autofree char *text = g_strstrip (g_strdup (gtk_editable_get_text (GTK_EDITABLE (entry))));
  char *end = NULL;
  double value;

  if (self->updating)
    return;
  if (text[0] == '\0')
    {
      df_fit_summary_set_error (self, NULL);
      g_signal_emit (self, signals[TOLERANCE_CHANGED], 0, NULL);
      return;
    }
  value = g_ascii_strtod (text, &end);
  if (end == text || *end != '\0' || !isfinite (value) || value < 0)
    {
      g_autofree char *message = g_strdup_printf ("Fit tolerance: “%s” is not a length ≥ 0 "
                                                  "(leave it empty to choose it from the data)",
                                                  text);
      df_fit_summary_set_error (self, message);
      return;
    }
  df_fit_summary_set_error (self, NULL);
  g_signal_emit (self, signals[TOLERANCE_CHANGED], 0, text);
}

static void
points_toggled_cb (GtkCheckButton *check,
                   DfFitSummary   *self)
{
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_SHOW_POINTS]);
}

static void
df_fit_summary_get_property (GObject    *object,
                             guint       prop_id,
                             GValue     *value,
                             GParamSpec *pspec)
{
  DfFitSummary *self = DF_FIT_SUMMARY (object);

  switch (prop_id)
    {
    case PROP_SHOW_POINTS:
      g_value_set_boolean (value, df_fit_summary_get_show_points (self));
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
    }
}

static void
df_fit_summary_dispose (GObject *object)
{
  gtk_widget_dispose_template (GTK_WIDGET (object), DF_TYPE_FIT_SUMMARY);
  G_OBJECT_CLASS (df_fit_summary_parent_class)->dispose (object);
}

static void
df_fit_summary_finalize (GObject *object)
{
  G_OBJECT_CLASS (df_fit_summary_parent_class)->finalize (object);
}

static void
df_fit_summary_class_init (DfFitSummaryClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->get_property = df_fit_summary_get_property;
  object_class->dispose = df_fit_summary_dispose;
  object_class->finalize = df_fit_summary_finalize;

  properties[PROP_SHOW_POINTS] =
    g_param_spec_boolean ("show-points", NULL, NULL, TRUE,
                          G_PARAM_READABLE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  g_object_class_install_properties (object_class, N_PROPS, properties);

  /* The user asked for another fit tolerance: the text (a length >= 0), or NULL to choose it
   * from the data. */
  signals[TOLERANCE_CHANGED] =
    g_signal_new ("tolerance-changed", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0,
                  NULL, NULL, NULL, G_TYPE_NONE, 1, G_TYPE_STRING);

  gtk_widget_class_set_template_from_resource (widget_class,
                                               "/org/driftframe/Driftframe/ui/df-fit-summary.ui");
  gtk_widget_class_bind_template_child (widget_class, DfFitSummary, box);
  gtk_widget_class_bind_template_child (widget_class, DfFitSummary, file_label);
  gtk_widget_class_bind_template_child (widget_class, DfFitSummary, numbers_grid);
  gtk_widget_class_bind_template_child (widget_class, DfFitSummary, tolerance_entry);
  gtk_widget_class_bind_template_child (widget_class, DfFitSummary, spinner);
  gtk_widget_class_bind_template_child (widget_class, DfFitSummary, error_label);
  gtk_widget_class_bind_template_child (widget_class, DfFitSummary, points_check);
  gtk_widget_class_bind_template_child (widget_class, DfFitSummary, legend);
  gtk_widget_class_bind_template_child (widget_class, DfFitSummary, points_label);
  gtk_widget_class_set_layout_manager_type (widget_class, GTK_TYPE_BIN_LAYOUT);
  gtk_widget_class_set_css_name (widget_class, "dffitsummary");
}

static void
df_fit_summary_init (DfFitSummary *self)
{
  gtk_widget_init_template (GTK_WIDGET (self));
  df_du_identity (&self->du, NULL);
  for (int r = 0; r < N_ROWS; r++)
    {
      self->titles[r] = GTK_LABEL (gtk_label_new (row_titles[r]));
      self->values[r] = GTK_LABEL (gtk_label_new (NULL));
      gtk_label_set_xalign (self->titles[r], 0);
      gtk_label_set_xalign (self->values[r], 0);
      gtk_widget_set_valign (GTK_WIDGET (self->titles[r]), GTK_ALIGN_START);
      gtk_label_set_wrap (self->values[r], TRUE);
      gtk_label_set_selectable (self->values[r], TRUE);
      gtk_widget_set_focusable (GTK_WIDGET (self->values[r]), FALSE);
      gtk_widget_set_hexpand (GTK_WIDGET (self->values[r]), TRUE);
      gtk_widget_add_css_class (GTK_WIDGET (self->titles[r]), "dim-label");
      gtk_grid_attach (self->numbers_grid, GTK_WIDGET (self->titles[r]), 0, r, 1, 1);
      gtk_grid_attach (self->numbers_grid, GTK_WIDGET (self->values[r]), 1, r, 1, 1);
      set_row (self, r, NULL);
    }
  gtk_drawing_area_set_draw_func (self->legend, draw_legend, self, NULL);
  g_signal_connect (self->tolerance_entry, "activate", G_CALLBACK (tolerance_activate_cb), self);
  g_signal_connect (self->points_check, "toggled", G_CALLBACK (points_toggled_cb), self);
  df_fit_summary_set_deviation (self, 0, FALSE, 0, 0, &self->du);
}

GtkWidget *
df_fit_summary_new (void)
{
  return g_object_new (DF_TYPE_FIT_SUMMARY, NULL);
}
