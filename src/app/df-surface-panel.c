/* df-surface-panel.c: the surface editor (see df-surface-panel.h). The formula rows and the
 * parameter rows are built in code because their number depends on the surface kind and the
 * spec; the fixed frame is ui/df-surface-panel.ui. Parsing is the core's (df_expr_parse), so
 * an error column here is exactly the one the builder would report. */
#include <math.h>
#include <string.h>

#include "df-fit-summary.h"
#include "df-surface-panel.h"

/* Wait this long after the last keystroke before building: a formula mid-edit is usually
 * invalid, and a rebuild re-measures every loop. */
#define DF_SPEC_DEBOUNCE_MS 350

enum
{
  KIND_PRESET,
  KIND_REVOLUTION,
  KIND_GRAPH,
  KIND_DATA      /* a surface fitted to a data file (df-fit-summary.c) */
};

/* One formula or range entry of the revolution or graph page. */
typedef struct
{
  const char *key;       /* the builder's key: "r", "z", "t-min", ... */
  const char *name;      /* as messages name it: "r(t)", "t from" */
  const char *label;
  const char *tooltip;
  gboolean    is_formula;
  int         range_slot; /* index into range_text, or -1 for r_text / z_text */
  GtkEntry   *entry;
  GtkLabel   *error;
  GtkLabel   *full;      /* the whole formula, wrapped, when the one-line entry cuts it */
} FormulaField;

/* One row of the parameter grid. */
typedef struct
{
  char          *name;
  GtkSpinButton *spin;   /* NULL for a derived parameter */
  GtkLabel      *value;  /* derived parameters show their value here */
} ParamRow;

struct _DfSurfacePanel
{
  GtkWidget parent_instance;

  /* template children */
  GtkDropDown *kind_dropdown;
  GtkStack    *kind_stack;
  GtkDropDown *preset_dropdown;
  GtkLabel    *preset_description;
  GtkGrid     *revolution_grid;
  GtkGrid     *graph_grid;
  GtkGrid     *params_grid;
  GtkBox      *add_param_box;
  GtkEntry    *add_param_entry;
  GtkLabel    *add_param_error;
  GtkEntry    *units_entry;
  GtkLabel    *build_error;
  GtkLabel    *normal_label;
  DfFitSummary *fit_summary;

  /* owned */
  df_surface_spec *spec;
  FormulaField     rev_fields[4];
  GtkDropDown     *t_units_dropdown;   /* what t is measured in (revolution formulas) */
  GtkStringList   *t_units_names;
  FormulaField     graph_fields[5];
  GArray          *param_rows;  /* of ParamRow */
  guint            debounce_id;
  gboolean         updating;    /* filling widgets from spec: do not react */
};

G_DEFINE_FINAL_TYPE (DfSurfacePanel, df_surface_panel, GTK_TYPE_WIDGET)

enum
{
  SPEC_CHANGED,
  N_SIGNALS
};

static guint signals[N_SIGNALS];

static const FormulaField rev_template[4] = {
  { "r", "r(t)", "r(t) =", "Distance from the axis as a function of t", TRUE, -1, NULL, NULL, NULL },
  { "z", "z(t)", "z(t) =", "Height along the axis as a function of t", TRUE, -1, NULL, NULL, NULL },
  { "t-min", "t-min", "t-min", "Start of the profile parameter t (a number or expression)",
    FALSE, 0, NULL, NULL, NULL },
  { "t-max", "t-max", "t-max", "End of the profile parameter t", FALSE, 1, NULL, NULL, NULL },
};

static const FormulaField graph_template[5] = {
  { "z", "z(x, y)", "z(x, y) =", "Height as a function of x and y", TRUE, -1, NULL, NULL, NULL },
  { "x-min", "x-min", "x-min", "Smallest x of the panel", FALSE, 0, NULL, NULL, NULL },
  { "x-max", "x-max", "x-max", "Largest x of the panel", FALSE, 1, NULL, NULL, NULL },
  { "y-min", "y-min", "y-min", "Smallest y of the panel", FALSE, 2, NULL, NULL, NULL },
  { "y-max", "y-max", "y-max", "Largest y of the panel", FALSE, 3, NULL, NULL, NULL },
};

static void rebuild_params (DfSurfacePanel *self);

static void
param_row_clear (gpointer data)
{
  ParamRow *row = data;

  g_free (row->name);
}

static gboolean
debounce_cb (gpointer user_data)
{
  DfSurfacePanel *self = user_data;

  self->debounce_id = 0;
  g_signal_emit (self, signals[SPEC_CHANGED], 0);
  return G_SOURCE_REMOVE;
}

static void
schedule_changed (DfSurfacePanel *self)
{
  g_clear_handle_id (&self->debounce_id, g_source_remove);
  self->debounce_id = g_timeout_add (DF_SPEC_DEBOUNCE_MS, debounce_cb, self);
}

static void
set_error_label (GtkLabel   *label,
                 GtkWidget  *entry,
                 const char *message)
{
  gtk_label_set_text (label, message != NULL ? message : "");
  gtk_widget_set_visible (GTK_WIDGET (label), message != NULL);
  if (entry == NULL)
    return;
  if (message != NULL)
    gtk_widget_add_css_class (entry, "error");
  else
    gtk_widget_remove_css_class (entry, "error");
}

static FormulaField *
current_fields (DfSurfacePanel *self,
                guint          *n)
{
  if (self->spec->kind == DF_SURFACE_REVOLUTION)
    {
      *n = G_N_ELEMENTS (self->rev_fields);
      return self->rev_fields;
    }
  *n = G_N_ELEMENTS (self->graph_fields);
  return self->graph_fields;
}

static void
clear_errors (DfSurfacePanel *self)
{
  for (guint i = 0; i < G_N_ELEMENTS (self->rev_fields); i++)
    set_error_label (self->rev_fields[i].error, GTK_WIDGET (self->rev_fields[i].entry), NULL);
  for (guint i = 0; i < G_N_ELEMENTS (self->graph_fields); i++)
    set_error_label (self->graph_fields[i].error, GTK_WIDGET (self->graph_fields[i].entry),
                     NULL);
  set_error_label (self->build_error, NULL, NULL);
}

/* Checks every formula of the current kind with the core's parser and shows each error next
 * to its entry. TRUE when all parse. */
static gboolean
validate_fields (DfSurfacePanel *self)
{
  static const char *const rev_vars[] = { "t" };
  static const char *const graph_vars[] = { "x", "y" };
  gboolean rev = self->spec->kind == DF_SURFACE_REVOLUTION;
  gboolean ok = TRUE;
  FormulaField *fields;
  guint n;

  fields = current_fields (self, &n);
  for (guint i = 0; i < n; i++)
    {
      const char *text = gtk_editable_get_text (GTK_EDITABLE (fields[i].entry));
      g_autoptr(GError) error = NULL;
      g_autofree char *message = NULL;
      g_autofree char *trimmed = g_strstrip (g_strdup (text));
      int column = 0;

      if (trimmed[0] == '\0')
        g_set_error (&error, DF_IO_ERROR, DF_IO_ERROR_SYNTAX, "no value given");
      else if (fields[i].is_formula)
        {
          g_autoptr(df_expr) expr = df_expr_parse (text, rev ? rev_vars : graph_vars,
                                                   rev ? 1 : 2, self->spec->params, &column,
                                                   &error);
        }
      else
        {
          double value;
          df_expr_parse_value (text, self->spec->params, &value, &column, &error);
        }
      if (error != NULL)
        {
          message = g_strdup_printf ("%s: %s", fields[i].name, error->message);
          ok = FALSE;
        }
      set_error_label (fields[i].error, GTK_WIDGET (fields[i].entry), message);
    }
  return ok;
}

/* A formula longer than its entry shows (about 28 characters at the panel's width) is
 * repeated in full below it, wrapped, so it can be read without scrolling the entry. */
#define DF_FORMULA_SHOWN_CHARS 28

static void
show_full_formula (FormulaField *field)
{
  const char *text = gtk_editable_get_text (GTK_EDITABLE (field->entry));
  gboolean long_text = field->is_formula && g_utf8_strlen (text, -1) > DF_FORMULA_SHOWN_CHARS;

  gtk_label_set_text (field->full, long_text ? text : "");
  gtk_widget_set_visible (GTK_WIDGET (field->full), long_text);
}

static void
formula_changed_cb (GtkEditable    *editable,
                    DfSurfacePanel *self)
{
  FormulaField *fields;
  guint n;

  for (guint i = 0; i < G_N_ELEMENTS (self->rev_fields); i++)
    if (GTK_EDITABLE (self->rev_fields[i].entry) == editable)
      show_full_formula (&self->rev_fields[i]);
  for (guint i = 0; i < G_N_ELEMENTS (self->graph_fields); i++)
    if (GTK_EDITABLE (self->graph_fields[i].entry) == editable)
      show_full_formula (&self->graph_fields[i]);
  if (self->updating)
    return;
  fields = current_fields (self, &n);
  for (guint i = 0; i < n; i++)
    if (GTK_EDITABLE (fields[i].entry) == editable)
      {
        const char *text = gtk_editable_get_text (editable);

        if (fields[i].range_slot >= 0)
          {
            g_free (self->spec->range_text[fields[i].range_slot]);
            self->spec->range_text[fields[i].range_slot] = g_strdup (text);
          }
        else if (g_str_equal (fields[i].key, "r"))
          {
            g_free (self->spec->r_text);
            self->spec->r_text = g_strdup (text);
          }
        else
          {
            g_free (self->spec->z_text);
            self->spec->z_text = g_strdup (text);
          }
      }
  /* A typed formula is no longer the preset it may have started from. */
  g_clear_pointer (&self->spec->preset, g_free);
  set_error_label (self->build_error, NULL, NULL);
  if (validate_fields (self))
    schedule_changed (self);
  else
    g_clear_handle_id (&self->debounce_id, g_source_remove);
}

/* What t is measured in (the surface's t-units key): shown beside t wherever it is read out.
 * The choices and their key values; a label of the file's own is added as a last entry. */
static const struct { const char *title, *key; } t_unit_choices[] = {
  { "not stated", NULL },
  { "a length (the length unit)", "length" },
  { "an angle in radians", "rad" },
  { "an angle in degrees", "deg" },
};

static void
fill_t_units (DfSurfacePanel *self)
{
  const char *key = self->spec->t_units;
  guint n = g_list_model_get_n_items (G_LIST_MODEL (self->t_units_names));
  guint pick = 0;

  if (n > G_N_ELEMENTS (t_unit_choices))
    gtk_string_list_remove (self->t_units_names, G_N_ELEMENTS (t_unit_choices));
  for (guint i = 1; i < G_N_ELEMENTS (t_unit_choices) && key != NULL; i++)
    if (g_str_equal (key, t_unit_choices[i].key))
      pick = i;
  if (key != NULL && pick == 0)
    {
      g_autofree char *own = g_strdup_printf ("as the file says: %s", key);

      gtk_string_list_append (self->t_units_names, own);
      pick = G_N_ELEMENTS (t_unit_choices);
    }
  gtk_drop_down_set_selected (self->t_units_dropdown, pick);
}

static void
t_units_selected_cb (GtkDropDown    *dropdown,
                     GParamSpec     *pspec,
                     DfSurfacePanel *self)
{
  guint i = gtk_drop_down_get_selected (dropdown);

  if (self->updating || i >= G_N_ELEMENTS (t_unit_choices))
    return;   /* the file's own label stays as it is */
  if (g_strcmp0 (self->spec->t_units, t_unit_choices[i].key) == 0)
    return;
  g_free (self->spec->t_units);
  self->spec->t_units = g_strdup (t_unit_choices[i].key);
  schedule_changed (self);
}

static void
build_t_units (DfSurfacePanel *self)
{
  GtkWidget *label = gtk_label_new ("t in");
  int row = 2 * (int) G_N_ELEMENTS (self->rev_fields);

  self->t_units_names = gtk_string_list_new (NULL);
  for (guint i = 0; i < G_N_ELEMENTS (t_unit_choices); i++)
    gtk_string_list_append (self->t_units_names, t_unit_choices[i].title);
  self->t_units_dropdown = GTK_DROP_DOWN (gtk_drop_down_new (
    G_LIST_MODEL (g_object_ref (self->t_units_names)), NULL));
  gtk_label_set_xalign (GTK_LABEL (label), 1.0);
  gtk_widget_set_tooltip_text (GTK_WIDGET (self->t_units_dropdown),
                               "What the profile's parameter t is measured in: shown beside t "
                               "in the status line, the probe and the verdicts (a label: t is "
                               "not converted)");
  gtk_accessible_update_property (GTK_ACCESSIBLE (self->t_units_dropdown),
                                  GTK_ACCESSIBLE_PROPERTY_LABEL, "t measured in", -1);
  gtk_grid_attach (self->revolution_grid, label, 0, row, 1, 1);
  gtk_grid_attach (self->revolution_grid, GTK_WIDGET (self->t_units_dropdown), 1, row, 1, 1);
  g_signal_connect (self->t_units_dropdown, "notify::selected",
                    G_CALLBACK (t_units_selected_cb), self);
}

static void
build_fields (DfSurfacePanel *self,
              GtkGrid        *grid,
              FormulaField   *fields,
              guint           n)
{
  for (guint i = 0; i < n; i++)
    {
      GtkWidget *label = gtk_label_new (fields[i].label);
      GtkWidget *entry = gtk_entry_new ();
      GtkWidget *error = gtk_label_new (NULL);
      GtkWidget *full = gtk_label_new (NULL);
      GtkWidget *below = gtk_box_new (GTK_ORIENTATION_VERTICAL, 2);

      gtk_label_set_xalign (GTK_LABEL (label), 1.0);
      gtk_label_set_wrap (GTK_LABEL (full), TRUE);
      gtk_label_set_wrap_mode (GTK_LABEL (full), PANGO_WRAP_WORD_CHAR);
      gtk_label_set_selectable (GTK_LABEL (full), FALSE);
      gtk_label_set_xalign (GTK_LABEL (full), 0.0);
      gtk_label_set_max_width_chars (GTK_LABEL (full), 30);
      gtk_widget_add_css_class (full, "dim-label");
      gtk_widget_set_visible (full, FALSE);
      gtk_widget_set_hexpand (entry, TRUE);
      gtk_widget_set_tooltip_text (entry, fields[i].tooltip);
      gtk_accessible_update_property (GTK_ACCESSIBLE (entry), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                      fields[i].label, GTK_ACCESSIBLE_PROPERTY_DESCRIPTION,
                                      fields[i].tooltip, -1);
      gtk_label_set_wrap (GTK_LABEL (error), TRUE);
      gtk_label_set_xalign (GTK_LABEL (error), 0.0);
      gtk_widget_add_css_class (error, "df-error");
      gtk_widget_set_visible (error, FALSE);
      gtk_grid_attach (grid, label, 0, (int) (2 * i), 1, 1);
      gtk_grid_attach (grid, entry, 1, (int) (2 * i), 1, 1);
      gtk_box_append (GTK_BOX (below), full);
      gtk_box_append (GTK_BOX (below), error);
      gtk_grid_attach (grid, below, 1, (int) (2 * i + 1), 1, 1);
      fields[i].entry = GTK_ENTRY (entry);
      fields[i].error = GTK_LABEL (error);
      fields[i].full = GTK_LABEL (full);
      g_signal_connect (entry, "changed", G_CALLBACK (formula_changed_cb), self);
    }
}

static void
fill_fields (DfSurfacePanel *self)
{
  FormulaField *fields;
  guint n;

  fields = current_fields (self, &n);
  for (guint i = 0; i < n; i++)
    {
      const char *text;

      if (fields[i].range_slot >= 0)
        text = self->spec->range_text[fields[i].range_slot];
      else if (g_str_equal (fields[i].key, "r"))
        text = self->spec->r_text;
      else
        text = self->spec->z_text;
      gtk_editable_set_text (GTK_EDITABLE (fields[i].entry), text != NULL ? text : "");
    }
}

/* Parameter units: presets give lengths in the spec's unit, and mark angles with "_deg". */
static const char *
param_unit (DfSurfacePanel *self,
            const char     *name)
{
  if (g_str_has_suffix (name, "_deg"))
    return "°";
  if (self->spec->preset != NULL)
    return self->spec->units != NULL ? self->spec->units : "mm";
  return "";
}

static void
refresh_param_values (DfSurfacePanel *self)
{
  for (guint i = 0; i < self->param_rows->len; i++)
    {
      ParamRow *row = &g_array_index (self->param_rows, ParamRow, i);
      double value = 0.0;

      if (row->value == NULL || !df_params_lookup (self->spec->params, row->name, &value))
        continue;
      {
        g_autofree char *text = g_strdup_printf ("%.6g (derived)", value);
        gtk_label_set_text (row->value, text);
      }
    }
}

static void
param_spin_changed_cb (GtkSpinButton  *spin,
                       DfSurfacePanel *self)
{
  g_autoptr(GError) error = NULL;
  char buffer[G_ASCII_DTOSTR_BUF_SIZE];
  const char *name;

  if (self->updating)
    return;
  name = g_object_get_data (G_OBJECT (spin), "df-param");
  g_ascii_formatd (buffer, sizeof buffer, "%.10g", gtk_spin_button_get_value (spin));
  if (!df_params_set (self->spec->params, name, buffer, &error))
    {
      set_error_label (self->build_error, NULL, error->message);
      return;
    }
  refresh_param_values (self);
  set_error_label (self->build_error, NULL, NULL);
  if (self->spec->preset != NULL || validate_fields (self))
    schedule_changed (self);
}

/* A parameter given by a plain number gets a spin button; one given by an expression of
 * others ("R = (span^2/4 + rise^2)/(2*rise)") is shown as derived. */
static gboolean
is_plain_number (const char *text)
{
  char *end = NULL;

  g_ascii_strtod (text, &end);
  return end != text && end != NULL && *g_strchug (end) == '\0';
}

/* Decimals a spin button needs for its step (a tenth of the value's magnitude) and for the
 * value as typed ("12.75" needs two). */
static int
param_decimals (const char *text,
                double      step)
{
  const char *dot = strchr (text, '.');
  int typed = 0, for_step = step < 1 ? (int) ceil (-log10 (step) - 1e-9) : 0;

  if (dot != NULL && strpbrk (text, "eE") == NULL)
    for (const char *p = dot + 1; g_ascii_isdigit (*p); p++)
      typed++;
  return CLAMP (MAX (typed, for_step), 0, 6);
}

static double
param_step (double value)
{
  double magnitude = fabs (value) > 0 ? fabs (value) : 1.0;

  return pow (10.0, floor (log10 (magnitude)) - 1.0);
}

static void
remove_param_clicked_cb (GtkButton      *button,
                         DfSurfacePanel *self)
{
  const char *name = g_object_get_data (G_OBJECT (button), "df-param");
  g_autoptr(GError) error = NULL;
  g_autofree char *owned = g_strdup (name);

  if (!df_params_remove (self->spec->params, owned, &error))
    {
      set_error_label (self->add_param_error, NULL, error->message);
      return;
    }
  set_error_label (self->add_param_error, NULL, NULL);
  rebuild_params (self);
  /* A formula that still uses it says so beside its field (validate_fields). */
  if (validate_fields (self))
    schedule_changed (self);
}

static void
rebuild_params (DfSurfacePanel *self)
{
  GtkWidget *child;
  guint n = df_params_count (self->spec->params);
  gboolean removable = self->spec->preset == NULL && self->spec->data_key == NULL;
  int digits = 0;

  /* One number of decimals for the whole grid (5.0 beside 40.0, not 5.0000 beside 40.00). */
  for (guint i = 0; i < n; i++)
    if (is_plain_number (df_params_text (self->spec->params, i)))
      digits = MAX (digits, param_decimals (df_params_text (self->spec->params, i),
                                            param_step (df_params_value (self->spec->params,
                                                                         i))));

  while ((child = gtk_widget_get_first_child (GTK_WIDGET (self->params_grid))) != NULL)
    gtk_grid_remove (self->params_grid, child);
  g_array_set_size (self->param_rows, 0);

  for (guint i = 0; i < n; i++)
    {
      const char *name = df_params_name (self->spec->params, i);
      const char *text = df_params_text (self->spec->params, i);
      double value = df_params_value (self->spec->params, i);
      g_autofree char *plain = g_strdup (text);
      GtkWidget *label = gtk_label_new (name);
      GtkWidget *unit = gtk_label_new (param_unit (self, name));
      ParamRow row = { g_strdup (name), NULL, NULL };

      gtk_label_set_xalign (GTK_LABEL (label), 1.0);
      gtk_label_set_xalign (GTK_LABEL (unit), 0.0);
      gtk_grid_attach (self->params_grid, label, 0, (int) i, 1, 1);
      if (is_plain_number (plain))
        {
          double step = param_step (value);
          GtkAdjustment *adjustment = gtk_adjustment_new (value, -1e9, 1e9, step, step * 10, 0);
          GtkWidget *spin = gtk_spin_button_new (adjustment, step, (guint) digits);
          g_autofree char *tooltip = g_strdup_printf ("Parameter %s of the formulas", name);

          gtk_spin_button_set_digits (GTK_SPIN_BUTTON (spin), (guint) digits);
          gtk_widget_set_hexpand (spin, TRUE);
          gtk_widget_set_tooltip_text (spin, tooltip);
          gtk_accessible_update_property (GTK_ACCESSIBLE (spin), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                          name, -1);
          g_object_set_data_full (G_OBJECT (spin), "df-param", g_strdup (name), g_free);
          g_signal_connect (spin, "value-changed", G_CALLBACK (param_spin_changed_cb), self);
          gtk_grid_attach (self->params_grid, spin, 1, (int) i, 1, 1);
          row.spin = GTK_SPIN_BUTTON (spin);
        }
      else
        {
          GtkWidget *derived = gtk_label_new (NULL);
          g_autofree char *tooltip = g_strdup_printf ("%s = %s", name, text);

          gtk_label_set_xalign (GTK_LABEL (derived), 0.0);
          gtk_widget_set_hexpand (derived, TRUE);
          gtk_widget_set_tooltip_text (derived, tooltip);
          gtk_grid_attach (self->params_grid, derived, 1, (int) i, 1, 1);
          row.value = GTK_LABEL (derived);
        }
      gtk_grid_attach (self->params_grid, unit, 2, (int) i, 1, 1);
      if (removable)
        {
          GtkWidget *remove = gtk_button_new_from_icon_name ("user-trash-symbolic");
          g_autofree char *what = g_strdup_printf ("Remove the parameter %s", name);

          gtk_widget_add_css_class (remove, "flat");
          gtk_widget_set_tooltip_text (remove, what);
          gtk_accessible_update_property (GTK_ACCESSIBLE (remove),
                                          GTK_ACCESSIBLE_PROPERTY_LABEL, what, -1);
          g_object_set_data_full (G_OBJECT (remove), "df-param", g_strdup (name), g_free);
          g_signal_connect (remove, "clicked", G_CALLBACK (remove_param_clicked_cb), self);
          gtk_grid_attach (self->params_grid, remove, 3, (int) i, 1, 1);
        }
      g_array_append_val (self->param_rows, row);
    }
  if (n == 0)
    {
      GtkWidget *none = gtk_label_new ("None");

      gtk_widget_add_css_class (none, "dim-label");
      gtk_label_set_xalign (GTK_LABEL (none), 0.0);
      gtk_grid_attach (self->params_grid, none, 0, 0, 1, 1);
    }
  refresh_param_values (self);
}

static guint
preset_index (const char *name)
{
  const df_preset_info *presets = df_presets_list ();

  for (guint i = 0; name != NULL && presets[i].name != NULL; i++)
    if (g_str_equal (presets[i].name, name))
      return i;
  return GTK_INVALID_LIST_POSITION;
}

static void
update_description (DfSurfacePanel *self)
{
  const df_preset_info *presets = df_presets_list ();
  guint i = gtk_drop_down_get_selected (self->preset_dropdown);

  if (i != GTK_INVALID_LIST_POSITION && presets[i].name != NULL)
    gtk_label_set_text (self->preset_description, presets[i].description);
}

/* Fills every widget from self->spec. */
static void
fill_all (DfSurfacePanel *self)
{
  guint kind;

  self->updating = TRUE;
  if (self->spec->preset != NULL && preset_index (self->spec->preset) != GTK_INVALID_LIST_POSITION)
    {
      kind = KIND_PRESET;
      gtk_drop_down_set_selected (self->preset_dropdown, preset_index (self->spec->preset));
    }
  else if (self->spec->data_key != NULL)
    kind = KIND_DATA;
  else
    kind = self->spec->kind == DF_SURFACE_REVOLUTION ? KIND_REVOLUTION : KIND_GRAPH;
  gtk_drop_down_set_selected (self->kind_dropdown, kind);
  gtk_stack_set_visible_child_name (self->kind_stack, kind == KIND_PRESET ? "preset"
                                                      : kind == KIND_REVOLUTION ? "revolution"
                                                      : kind == KIND_DATA ? "data"
                                                      : "graph");
  gtk_widget_set_visible (GTK_WIDGET (self->add_param_box),
                          kind != KIND_PRESET && kind != KIND_DATA);
  update_description (self);
  fill_fields (self);
  gtk_editable_set_text (GTK_EDITABLE (self->units_entry),
                         self->spec->units != NULL ? self->spec->units : "mm");
  fill_t_units (self);
  rebuild_params (self);
  clear_errors (self);
  self->updating = FALSE;
}

/* Replaces the working spec by a preset's, keeping the unit. */
static gboolean
load_preset (DfSurfacePanel *self,
             const char     *name)
{
  g_autoptr(GError) error = NULL;
  df_surface_spec *spec = df_surface_spec_new_preset (name, &error);

  if (spec == NULL)
    {
      set_error_label (self->build_error, NULL, error->message);
      return FALSE;
    }
  g_free (spec->units);
  spec->units = g_strdup (self->spec->units);
  df_surface_spec_free (self->spec);
  self->spec = spec;
  return TRUE;
}

static void
preset_selected_cb (GtkDropDown    *dropdown,
                    GParamSpec     *pspec,
                    DfSurfacePanel *self)
{
  const df_preset_info *presets = df_presets_list ();
  guint i = gtk_drop_down_get_selected (dropdown);

  if (self->updating || i == GTK_INVALID_LIST_POSITION || presets[i].name == NULL)
    return;
  if (load_preset (self, presets[i].name))
    {
      fill_all (self);
      schedule_changed (self);
    }
}

static void
kind_selected_cb (GtkDropDown    *dropdown,
                  GParamSpec     *pspec,
                  DfSurfacePanel *self)
{
  guint kind = gtk_drop_down_get_selected (dropdown);
  const df_preset_info *presets = df_presets_list ();

  if (self->updating)
    return;
  switch (kind)
    {
    case KIND_PRESET:
      {
        guint i = gtk_drop_down_get_selected (self->preset_dropdown);

        if (i == GTK_INVALID_LIST_POSITION || presets[i].name == NULL)
          i = 0;
        if (!load_preset (self, presets[i].name))
          return;
      }
      break;
    case KIND_REVOLUTION:
    case KIND_GRAPH:
      {
        df_surface_type want = kind == KIND_REVOLUTION ? DF_SURFACE_REVOLUTION
                                                       : DF_SURFACE_GRAPH;

        /* Switching to formulas keeps the current shape when the kind matches, so a preset
         * can be edited as formulas; otherwise start from a simple example of that kind. */
        if ((self->spec->kind != want || self->spec->data_key != NULL)
            && !load_preset (self, want == DF_SURFACE_REVOLUTION ? "sphere" : "bump"))
          return;
        g_clear_pointer (&self->spec->preset, g_free);
      }
      break;
    case KIND_DATA:
      /* Data come from a file: ask for it; the dropdown shows the current surface until an
       * import lands. */
      if (self->spec->data_key == NULL)
        {
          fill_all (self);
          gtk_widget_activate_action (GTK_WIDGET (self), "win.import-data", NULL);
        }
      return;
    default:
      return;
    }
  fill_all (self);
  schedule_changed (self);
}

static void
units_changed_cb (GtkEditable    *editable,
                  DfSurfacePanel *self)
{
  g_autofree char *units = NULL;

  if (self->updating)
    return;
  units = g_strstrip (g_strdup (gtk_editable_get_text (editable)));
  g_free (self->spec->units);
  self->spec->units = g_strdup (units[0] != '\0' ? units : "mm");
  rebuild_params (self);
  schedule_changed (self);
}

/* An error under the add-parameter field goes when the field is cleared. */
static void
add_param_changed_cb (GtkEditable    *editable,
                      DfSurfacePanel *self)
{
  if (gtk_editable_get_text (editable)[0] == '\0')
    set_error_label (self->add_param_error, GTK_WIDGET (editable), NULL);
}

/* "name = value" adds (or redefines) a parameter of a formula surface. */
static void
add_param_activate_cb (GtkEntry       *entry,
                       DfSurfacePanel *self)
{
  g_autofree char *text = g_strdup (gtk_editable_get_text (GTK_EDITABLE (entry)));
  g_autoptr(GError) error = NULL;
  char *eq = strchr (text, '=');

  if (eq == NULL)
    g_set_error (&error, DF_IO_ERROR, DF_IO_ERROR_SYNTAX,
                 "expected name = value, e.g. h = 40");
  else
    {
      *eq = '\0';
      df_params_set (self->spec->params, g_strstrip (text), g_strstrip (eq + 1), &error);
    }
  set_error_label (self->add_param_error, GTK_WIDGET (entry),
                   error != NULL ? error->message : NULL);
  if (error != NULL)
    return;
  gtk_editable_set_text (GTK_EDITABLE (entry), "");
  rebuild_params (self);
  if (validate_fields (self))
    schedule_changed (self);
}

static void
df_surface_panel_dispose (GObject *object)
{
  GtkWidget *child;
  DfSurfacePanel *self = DF_SURFACE_PANEL (object);

  g_clear_handle_id (&self->debounce_id, g_source_remove);
  gtk_widget_dispose_template (GTK_WIDGET (self), DF_TYPE_SURFACE_PANEL);
  /* The template's unnamed top box is not a bound child: unparent whatever is left. */
  while ((child = gtk_widget_get_first_child (GTK_WIDGET (self))) != NULL)
    gtk_widget_unparent (child);
  G_OBJECT_CLASS (df_surface_panel_parent_class)->dispose (object);
}

static void
df_surface_panel_finalize (GObject *object)
{
  DfSurfacePanel *self = DF_SURFACE_PANEL (object);

  df_surface_spec_free (self->spec);
  g_array_unref (self->param_rows);
  g_clear_object (&self->t_units_names);
  G_OBJECT_CLASS (df_surface_panel_parent_class)->finalize (object);
}

static void
df_surface_panel_class_init (DfSurfacePanelClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->dispose = df_surface_panel_dispose;
  object_class->finalize = df_surface_panel_finalize;

  /* The working spec changed and its formulas parse: the owner should build it. */
  signals[SPEC_CHANGED] =
    g_signal_new ("spec-changed", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0,
                  NULL, NULL, NULL, G_TYPE_NONE, 0);

  gtk_widget_class_set_template_from_resource (widget_class,
                                               "/org/driftframe/Driftframe/ui/df-surface-panel.ui");
  gtk_widget_class_bind_template_child (widget_class, DfSurfacePanel, kind_dropdown);
  gtk_widget_class_bind_template_child (widget_class, DfSurfacePanel, kind_stack);
  gtk_widget_class_bind_template_child (widget_class, DfSurfacePanel, preset_dropdown);
  gtk_widget_class_bind_template_child (widget_class, DfSurfacePanel, preset_description);
  gtk_widget_class_bind_template_child (widget_class, DfSurfacePanel, revolution_grid);
  gtk_widget_class_bind_template_child (widget_class, DfSurfacePanel, graph_grid);
  gtk_widget_class_bind_template_child (widget_class, DfSurfacePanel, params_grid);
  gtk_widget_class_bind_template_child (widget_class, DfSurfacePanel, add_param_box);
  gtk_widget_class_bind_template_child (widget_class, DfSurfacePanel, add_param_entry);
  gtk_widget_class_bind_template_child (widget_class, DfSurfacePanel, add_param_error);
  gtk_widget_class_bind_template_child (widget_class, DfSurfacePanel, units_entry);
  gtk_widget_class_bind_template_child (widget_class, DfSurfacePanel, build_error);
  gtk_widget_class_bind_template_child (widget_class, DfSurfacePanel, normal_label);
  gtk_widget_class_bind_template_child (widget_class, DfSurfacePanel, fit_summary);
  gtk_widget_class_set_layout_manager_type (widget_class, GTK_TYPE_BIN_LAYOUT);
  gtk_widget_class_set_css_name (widget_class, "dfsurfacepanel");
}

static void
df_surface_panel_init (DfSurfacePanel *self)
{
  const df_preset_info *presets = df_presets_list ();
  g_autoptr(GtkStringList) titles = gtk_string_list_new (NULL);

  g_type_ensure (DF_TYPE_FIT_SUMMARY);
  gtk_widget_init_template (GTK_WIDGET (self));

  self->param_rows = g_array_new (FALSE, TRUE, sizeof (ParamRow));
  g_array_set_clear_func (self->param_rows, param_row_clear);
  memcpy (self->rev_fields, rev_template, sizeof rev_template);
  memcpy (self->graph_fields, graph_template, sizeof graph_template);
  build_fields (self, self->revolution_grid, self->rev_fields, G_N_ELEMENTS (self->rev_fields));
  build_t_units (self);
  build_fields (self, self->graph_grid, self->graph_fields, G_N_ELEMENTS (self->graph_fields));

  for (guint i = 0; presets[i].name != NULL; i++)
    gtk_string_list_append (titles, presets[i].title);
  gtk_drop_down_set_model (self->preset_dropdown, G_LIST_MODEL (titles));

  self->spec = df_surface_spec_new_revolution ("R*sin(t)", "R*cos(t)", "0", "pi");
  df_params_set (self->spec->params, "R", "100", NULL);

  g_signal_connect (self->kind_dropdown, "notify::selected", G_CALLBACK (kind_selected_cb), self);
  g_signal_connect (self->preset_dropdown, "notify::selected",
                    G_CALLBACK (preset_selected_cb), self);
  g_signal_connect (self->units_entry, "changed", G_CALLBACK (units_changed_cb), self);
  g_signal_connect (self->add_param_entry, "activate", G_CALLBACK (add_param_activate_cb), self);
  g_signal_connect (self->add_param_entry, "changed", G_CALLBACK (add_param_changed_cb), self);
  fill_all (self);
}

GtkWidget *
df_surface_panel_new (void)
{
  return g_object_new (DF_TYPE_SURFACE_PANEL, NULL);
}

void
df_surface_panel_set_spec (DfSurfacePanel        *self,
                           const df_surface_spec *spec)
{
  g_return_if_fail (DF_IS_SURFACE_PANEL (self));
  g_return_if_fail (spec != NULL);

  g_clear_handle_id (&self->debounce_id, g_source_remove);
  df_surface_spec_free (self->spec);
  self->spec = df_surface_spec_copy (spec);
  fill_all (self);
}

const df_surface_spec *
df_surface_panel_get_spec (DfSurfacePanel *self)
{
  g_return_val_if_fail (DF_IS_SURFACE_PANEL (self), NULL);
  return self->spec;
}

void
df_surface_panel_show_error (DfSurfacePanel *self,
                             const GError   *error)
{
  FormulaField *fields;
  guint n;

  g_return_if_fail (DF_IS_SURFACE_PANEL (self));

  clear_errors (self);
  if (error == NULL)
    return;
  /* The builder prefixes its messages with the key ("t-max: must be greater than ..."):
   * show them next to that entry when it is on screen. */
  fields = current_fields (self, &n);
  if (self->spec->preset == NULL)
    for (guint i = 0; i < n; i++)
      {
        g_autofree char *prefix = g_strdup_printf ("%s: ", fields[i].key);

        if (g_str_has_prefix (error->message, prefix))
          {
            g_autofree char *message = g_strdup_printf ("%s: %s", fields[i].name,
                                                        error->message + strlen (prefix));
            set_error_label (fields[i].error, GTK_WIDGET (fields[i].entry), message);
            return;
          }
      }
  {
    g_autofree char *message = g_strdup_printf ("The surface cannot be built: %s",
                                                error->message);
    set_error_label (self->build_error, NULL, message);
  }
}

void
df_surface_panel_set_normal_text (DfSurfacePanel *self,
                                  const char     *text)
{
  g_return_if_fail (DF_IS_SURFACE_PANEL (self));
  gtk_label_set_text (self->normal_label, text != NULL ? text : "");
}

GtkWidget *
df_surface_panel_get_fit_summary (DfSurfacePanel *self)
{
  g_return_val_if_fail (DF_IS_SURFACE_PANEL (self), NULL);
  return GTK_WIDGET (self->fit_summary);
}
