/* df-limits-dialog.c: the editor of the project's material and process limits (see
 * df-limits-dialog.h). What the user types goes through the core's [limits] reader
 * (df_limits_from_key_file), so the dialog accepts and refuses exactly what a project file
 * does, with the same messages. Computes no geometry. */
#include "df-limits-dialog.h"

#include <string.h>

#include "df-decide-out.h"
#include "df-document-limits.h"
#include "df-document-units.h"
#include "df-limits-file.h"

/* How the editor names each limit, with a line on what it means. The keys stay the file's. */
static const struct
{
  const char *label;
  const char *help;
} limit_text[DF_N_LIMITS] = {
  [DF_LIMIT_MIN_STEERING_RADIUS] = { "Minimum steering _radius",
                                     "Tightest bend within the surface a tow or tape can follow "
                                     "(checked against 1 / |k_g| along each loop)" },
  [DF_LIMIT_TOW_WIDTH] = { "_Tow width",
                           "Width of the tow: its inner edge is compressed by about w / (2R) "
                           "at a steering radius R" },
  [DF_LIMIT_MAX_FIBRE_DEVIATION] = { "Largest fibre _deviation",
                                     "How far the fibre direction may turn away from the one "
                                     "laid at the start of a loop" },
  [DF_LIMIT_MAX_SHEAR] = { "Fabric _locking angle",
                           "Shear angle at which the user's woven fabric locks; also the "
                           "largest dart each may close" },
  [DF_LIMIT_FRICTION] = { "Tow–mandrel _friction",
                          "Friction coefficient: a winding path slips where |k_g / k_n| "
                          "exceeds it" },
  [DF_LIMIT_MAX_STRAIN] = { "Largest sheet _strain",
                            "In-plane strain a flat sheet may take when forced onto the "
                            "surface (the developability map's rim strain)" },
};

#define KEY_VALUE "df-value-%d"
#define KEY_SOURCE "df-source-%d"
#define KEY_MARK "df-mark-%d"

typedef struct
{
  DfDocument *document;   /* owned */
  GtkWidget  *value[DF_N_LIMITS];
  GtkWidget  *source[DF_N_LIMITS];
  GtkWidget  *mark[DF_N_LIMITS];
  GtkWidget  *patch;
  GtkWidget  *error_label;
  /* With lengths shown in another unit than the surface's, a bare number of a length is
   * typed in that display unit (so "0.018" with lengths shown in m means 18 mm) and is stored
   * with it; otherwise a bare number is in the surface's units, as in the project file. */
  gboolean    bare_in_display;
  df_unit     display;
  char        model_unit[32];
} LimitsDialog;

/* A length as the entry shows it: with the surface's unit when the file gave none, since a
 * bare number in the entry now reads in the display unit. */
static char *
shown_length (const LimitsDialog *d,
              gboolean            has_unit,
              char               *text)
{
  if (d->bare_in_display && !has_unit)
    {
      char *with = g_strdup_printf ("%s %s", text, d->model_unit);

      g_free (text);
      return with;
    }
  return text;
}

static void
limits_dialog_free (gpointer data)
{
  LimitsDialog *d = data;

  g_clear_object (&d->document);
  g_free (d);
}

/* A source that says the value was made up (the demo's do) is marked beside the row, so that
 * nobody reads it as material data. */
gboolean
df_limits_source_is_invented (const char *source)
{
  g_autofree char *folded = NULL;

  if (source == NULL)
    return FALSE;
  folded = g_utf8_casefold (source, -1);
  return strstr (folded, "invented") != NULL || strstr (folded, "made up") != NULL
         || strstr (folded, "placeholder") != NULL;
}

static void
update_mark (LimitsDialog *d,
             int           i)
{
  const char *value = gtk_editable_get_text (GTK_EDITABLE (d->value[i]));
  const char *source = gtk_editable_get_text (GTK_EDITABLE (d->source[i]));
  GtkLabel *mark = GTK_LABEL (d->mark[i]);
  /* Stripped on a copy: the entry's text stays as typed. */
  g_autofree char *stripped = g_strstrip (g_strdup (value));

  gtk_widget_remove_css_class (d->mark[i], "warning");
  gtk_widget_remove_css_class (d->mark[i], "dim-label");
  if (stripped[0] == '\0')
    {
      gtk_label_set_text (mark, "not set");
      gtk_widget_add_css_class (d->mark[i], "dim-label");
    }
  else if (df_limits_source_is_invented (source))
    {
      gtk_label_set_text (mark, "⚠ invented, not data");
      gtk_widget_add_css_class (d->mark[i], "warning");
    }
  else if (source[0] == '\0')
    {
      gtk_label_set_text (mark, "⚠ no source given");
      gtk_widget_add_css_class (d->mark[i], "warning");
    }
  else
    gtk_label_set_text (mark, "");
}

static void
entry_changed_cb (GtkEditable *editable,
                  gpointer     user_data)
{
  LimitsDialog *d = g_object_get_data (G_OBJECT (editable), "df-dialog");
  int i = GPOINTER_TO_INT (user_data);

  gtk_widget_remove_css_class (GTK_WIDGET (editable), "error");
  update_mark (d, i);
}

/* The typed values as a [limits] group, read back by the core's reader. The display units are
 * not edited here: they are kept as they were. */
static df_limits *
read_entries (LimitsDialog *d,
              GError      **error)
{
  g_autoptr(GKeyFile) key_file = g_key_file_new ();
  const df_limits *old = df_document_get_limits (d->document);
  g_autofree char *patch = NULL;
  df_limits *limits;

  for (int i = 0; i < DF_N_LIMITS; i++)
    {
      g_autofree char *value = g_strstrip (g_strdup (gtk_editable_get_text (GTK_EDITABLE (d->value[i]))));
      g_autofree char *source = g_strstrip (g_strdup (gtk_editable_get_text (GTK_EDITABLE (d->source[i]))));
      const char *key = df_limit_key ((df_limit_id) i);

      if (value[0] != '\0')
        g_key_file_set_string (key_file, DF_LIMITS_GROUP, key, value);
      if (value[0] != '\0' && source[0] != '\0')
        {
          g_autofree char *source_key = g_strdup_printf ("%s-source", key);

          g_key_file_set_string (key_file, DF_LIMITS_GROUP, source_key, source);
        }
    }
  patch = g_strstrip (g_strdup (gtk_editable_get_text (GTK_EDITABLE (d->patch))));
  if (patch[0] != '\0')
    g_key_file_set_string (key_file, DF_LIMITS_GROUP, "patch-size", patch);
  limits = df_limits_from_key_file (key_file, "Limits", df_document_get_units (d->document),
                                    error);
  if (limits != NULL && d->bare_in_display)
    {
      /* The reader took bare lengths in the surface's units: they were typed in the display
       * unit, which they now carry (and are written with). */
      df_diag diag;
      df_status st;

      for (int i = 0; i < DF_N_LIMITS; i++)
        if (limits->item[i].set && !limits->item[i].has_unit
            && df_limit_kind_of ((df_limit_id) i) == DF_LIMIT_KIND_LENGTH)
          {
            limits->item[i].has_unit = true;
            limits->item[i].unit = d->display;
          }
      if (limits->patch_size.set && !limits->patch_size.has_unit)
        {
          limits->patch_size.has_unit = true;
          limits->patch_size.unit = d->display;
        }
      df_diag_clear (&diag);
      st = df_limits_resolve (limits, df_document_get_units (d->document), &diag);
      if (st != DF_OK)
        {
          df_status_to_gerror (st, &diag, error);
          g_clear_pointer (&limits, df_limits_free);
          return NULL;
        }
    }
  if (limits != NULL && old != NULL)
    {
      limits->has_length_unit = old->has_length_unit;
      limits->length_unit = old->length_unit;
      limits->has_curvature_unit = old->has_curvature_unit;
      limits->curvature_unit = old->curvature_unit;
    }
  return limits;
}

/* Marks the entry the reader's message names ("[limits] friction: ..."). */
static void
mark_bad_entry (LimitsDialog *d,
                const char   *message)
{
  for (int i = DF_N_LIMITS - 1; i >= 0; i--)
    {
      g_autofree char *needle = g_strdup_printf ("] %s", df_limit_key ((df_limit_id) i));

      if (strstr (message, needle) != NULL)
        {
          gtk_widget_add_css_class (d->value[i], "error");
          gtk_widget_grab_focus (d->value[i]);
          return;
        }
    }
  if (strstr (message, "patch-size") != NULL)
    {
      gtk_widget_add_css_class (d->patch, "error");
      gtk_widget_grab_focus (d->patch);
    }
}

static void
response_cb (GtkDialog *dialog,
             int        response,
             gpointer   user_data)
{
  LimitsDialog *d = g_object_get_data (G_OBJECT (dialog), "df-dialog");
  g_autoptr(df_limits) limits = NULL;
  g_autoptr(GError) error = NULL;

  if (response != GTK_RESPONSE_OK)
    {
      gtk_window_destroy (GTK_WINDOW (dialog));
      return;
    }
  limits = read_entries (d, &error);
  if (limits == NULL || !df_document_set_limits (d->document, limits, &error))
    {
      gtk_label_set_text (GTK_LABEL (d->error_label), error->message);
      gtk_widget_set_visible (d->error_label, TRUE);
      mark_bad_entry (d, error->message);
      return;
    }
  gtk_window_destroy (GTK_WINDOW (dialog));
}

static GtkWidget *
small_label (const char *text,
             const char *css)
{
  GtkWidget *label = gtk_label_new (text);

  gtk_label_set_xalign (GTK_LABEL (label), 0);
  gtk_label_set_wrap (GTK_LABEL (label), TRUE);
  if (css != NULL)
    gtk_widget_add_css_class (label, css);
  return label;
}

static const char *
units_text (df_limit_id id,
            const char *bare_units,
            char       *buf,
            gsize       len)
{
  switch (df_limit_kind_of (id))
    {
    case DF_LIMIT_KIND_LENGTH:
      g_snprintf (buf, len, "%s, or with a unit", bare_units);
      return buf;
    case DF_LIMIT_KIND_DEGREES:
      return "degrees";
    case DF_LIMIT_KIND_PERCENT:
      return "percent";
    case DF_LIMIT_KIND_RATIO:
    default:
      return "coefficient";
    }
}

void
df_limits_dialog_present (GtkWindow  *parent,
                          DfDocument *document)
{
  const df_limits *limits;
  const char *units;
  LimitsDialog *d;
  GtkWidget *dialog, *content, *grid, *caution;
  int row = 0;

  g_return_if_fail (DF_IS_DOCUMENT (document));
  if (df_document_get_surface (document) == NULL)
    return;
  limits = df_document_get_limits (document);
  units = df_document_get_units (document);

  d = g_new0 (LimitsDialog, 1);
  d->document = g_object_ref (document);
  {
    DfDisplayUnits du;

    df_document_get_display_units (document, &du);
    g_strlcpy (d->model_unit, units, sizeof d->model_unit);
    d->bare_in_display = du.known && du.units.length != du.units.model;
    d->display = du.units.length;
    /* The Units column names what a bare number means. */
    if (d->bare_in_display)
      units = df_unit_name (d->display);
  }
  dialog = gtk_dialog_new_with_buttons ("Material and Process Limits", parent,
                                        GTK_DIALOG_MODAL | GTK_DIALOG_DESTROY_WITH_PARENT
                                          | GTK_DIALOG_USE_HEADER_BAR,
                                        "_Cancel", GTK_RESPONSE_CANCEL, "_Apply", GTK_RESPONSE_OK,
                                        NULL);
  g_object_set_data_full (G_OBJECT (dialog), "df-dialog", d, limits_dialog_free);
  gtk_dialog_set_default_response (GTK_DIALOG (dialog), GTK_RESPONSE_OK);
  content = gtk_dialog_get_content_area (GTK_DIALOG (dialog));

  grid = gtk_grid_new ();
  gtk_grid_set_row_spacing (GTK_GRID (grid), 6);
  gtk_grid_set_column_spacing (GTK_GRID (grid), 10);
  gtk_widget_set_margin_top (grid, 12);
  gtk_widget_set_margin_bottom (grid, 12);
  gtk_widget_set_margin_start (grid, 12);
  gtk_widget_set_margin_end (grid, 12);

  {
    GtkWidget *intro = small_label ("Your limits, each with where it comes from (a supplier's "
                                    "datasheet, your own trial). An empty value is not set: "
                                    "nothing is assumed in its place.", NULL);

    gtk_grid_attach (GTK_GRID (grid), intro, 0, row++, 5, 1);
    gtk_grid_attach (GTK_GRID (grid), small_label ("Limit", "heading"), 0, row, 1, 1);
    gtk_grid_attach (GTK_GRID (grid), small_label ("Value", "heading"), 1, row, 1, 1);
    gtk_grid_attach (GTK_GRID (grid), small_label ("Units", "heading"), 2, row, 1, 1);
    gtk_grid_attach (GTK_GRID (grid), small_label ("Source", "heading"), 3, row++, 2, 1);
  }

  for (int i = 0; i < DF_N_LIMITS; i++, row++)
    {
      const df_limit *l = limits != NULL ? &limits->item[i] : NULL;
      GtkWidget *label = gtk_label_new_with_mnemonic (limit_text[i].label);
      char buf[64];

      d->value[i] = gtk_entry_new ();
      d->source[i] = gtk_entry_new ();
      d->mark[i] = small_label ("", NULL);
      gtk_label_set_xalign (GTK_LABEL (label), 0);
      gtk_label_set_mnemonic_widget (GTK_LABEL (label), d->value[i]);
      gtk_widget_set_tooltip_text (label, limit_text[i].help);
      gtk_widget_set_tooltip_text (d->value[i], limit_text[i].help);
      gtk_entry_set_placeholder_text (GTK_ENTRY (d->value[i]), "not set");
      gtk_entry_set_placeholder_text (GTK_ENTRY (d->source[i]), "datasheet, trial report…");
      gtk_editable_set_width_chars (GTK_EDITABLE (d->value[i]), 10);
      gtk_editable_set_width_chars (GTK_EDITABLE (d->source[i]), 28);
      gtk_entry_set_activates_default (GTK_ENTRY (d->value[i]), TRUE);
      gtk_entry_set_activates_default (GTK_ENTRY (d->source[i]), TRUE);
      gtk_accessible_update_property (GTK_ACCESSIBLE (d->source[i]),
                                      GTK_ACCESSIBLE_PROPERTY_LABEL, "Source", -1);
      if (l != NULL && l->set)
        {
          g_autofree char *text = df_limit_value_text (l);

          if (df_limit_kind_of ((df_limit_id) i) == DF_LIMIT_KIND_LENGTH)
            text = shown_length (d, l->has_unit, text);
          gtk_editable_set_text (GTK_EDITABLE (d->value[i]), text);
          gtk_editable_set_text (GTK_EDITABLE (d->source[i]), l->source != NULL ? l->source : "");
        }
      g_object_set_data (G_OBJECT (d->value[i]), "df-dialog", d);
      g_object_set_data (G_OBJECT (d->source[i]), "df-dialog", d);
      g_signal_connect (d->value[i], "changed", G_CALLBACK (entry_changed_cb), GINT_TO_POINTER (i));
      g_signal_connect (d->source[i], "changed", G_CALLBACK (entry_changed_cb), GINT_TO_POINTER (i));
      gtk_widget_set_hexpand (d->source[i], TRUE);
      gtk_grid_attach (GTK_GRID (grid), label, 0, row, 1, 1);
      gtk_grid_attach (GTK_GRID (grid), d->value[i], 1, row, 1, 1);
      gtk_grid_attach (GTK_GRID (grid), small_label (units_text ((df_limit_id) i, units, buf,
                                                                 sizeof buf), "dim-label"),
                       2, row, 1, 1);
      gtk_grid_attach (GTK_GRID (grid), d->source[i], 3, row, 1, 1);
      gtk_grid_attach (GTK_GRID (grid), d->mark[i], 4, row, 1, 1);
      update_mark (d, i);
    }

  {
    GtkWidget *label = gtk_label_new_with_mnemonic ("_Patch size for the strain");
    char buf[64];

    d->patch = gtk_entry_new ();
    gtk_label_set_xalign (GTK_LABEL (label), 0);
    gtk_label_set_mnemonic_widget (GTK_LABEL (label), d->patch);
    gtk_entry_set_placeholder_text (GTK_ENTRY (d->patch), "not set");
    gtk_editable_set_width_chars (GTK_EDITABLE (d->patch), 10);
    gtk_entry_set_activates_default (GTK_ENTRY (d->patch), TRUE);
    gtk_widget_set_tooltip_text (d->patch, "Radius of the flat discs the sheet strain is "
                                 "checked with: your choice, not material data");
    if (limits != NULL && limits->patch_size.set)
      {
        g_autofree char *text = shown_length (d, limits->patch_size.has_unit,
                                              df_length_setting_text (&limits->patch_size));

        gtk_editable_set_text (GTK_EDITABLE (d->patch), text);
      }
    gtk_grid_attach (GTK_GRID (grid), label, 0, row, 1, 1);
    gtk_grid_attach (GTK_GRID (grid), d->patch, 1, row, 1, 1);
    gtk_grid_attach (GTK_GRID (grid), small_label (units_text (DF_LIMIT_TOW_WIDTH, units, buf,
                                                              sizeof buf), "dim-label"),
                     2, row, 1, 1);
    gtk_grid_attach (GTK_GRID (grid), small_label ("a choice: disc radius of the strain check",
                                                   "dim-label"), 3, row++, 2, 1);
  }

  d->error_label = small_label ("", "df-error");
  gtk_widget_set_visible (d->error_label, FALSE);
  gtk_label_set_selectable (GTK_LABEL (d->error_label), TRUE);
  gtk_grid_attach (GTK_GRID (grid), d->error_label, 0, row++, 5, 1);
  caution = small_label (DF_DECIDE_CAUTION, "df-caution");
  gtk_grid_attach (GTK_GRID (grid), caution, 0, row++, 5, 1);
  gtk_box_append (GTK_BOX (content), grid);
  g_signal_connect (dialog, "response", G_CALLBACK (response_cb), NULL);
  gtk_window_present (GTK_WINDOW (dialog));
  gtk_widget_grab_focus (d->value[0]);
}
