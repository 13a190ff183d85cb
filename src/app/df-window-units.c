/* df-window-units.c: the window's side of the display units: the Display Units action
 * (Ctrl+Shift+K, in the View menu; not Ctrl+Shift+U, which text fields
 * keep for typing a character by its code), --units, and what every change of units redraws in the
 * window itself (title, legend, status line; the panels listen to the document on their own).
 * --report-events adds "units LENGTH CURVATURE" after each change. */
#include <stdio.h>

#include "df-document-units.h"
#include "df-units-dialog.h"
#include "df-window-data.h"
#include "df-window-private.h"
#include "df-window-tools-private.h"

/* The units the tools' readouts were last drawn in: a surface change redraws them all, so only
 * a change of units alone needs them drawn again. */
typedef struct
{
  DfDisplayUnits shown;
} UnitsState;

static gboolean
same_units (const DfDisplayUnits *a,
            const DfDisplayUnits *b)
{
  return a->known == b->known && a->units.model == b->units.model
         && a->units.length == b->units.length && a->units.curvature == b->units.curvature
         && g_str_equal (a->label, b->label);
}

static void
surface_changed_cb (DfDocument *document,
                    DfWindow   *self)
{
  UnitsState *st = g_object_get_data (G_OBJECT (self), "df-units");

  df_document_get_display_units (document, &st->shown);
}

static void
display_units_action (GSimpleAction *action,
                      GVariant      *parameter,
                      gpointer       user_data)
{
  DfWindow *self = user_data;

  if (df_document_get_surface (self->document) != NULL)
    df_units_dialog_present (GTK_WINDOW (self), self->document);
}

static const GActionEntry units_actions[] = {
  { "display-units", display_units_action, NULL, NULL, NULL, { 0 } },
};

static void
units_changed_cb (DfDocument *document,
                  DfWindow   *self)
{
  UnitsState *st = g_object_get_data (G_OBJECT (self), "df-units");
  DfDisplayUnits du;

  df_document_get_display_units (document, &du);
  _df_window_sync_legend (self);
  _df_window_sync_title (self);
  if (!same_units (&du, &st->shown))
    {
      /* The panels of the document listen for themselves; the tools' readouts are the
       * window's: the probe, the geodesic and the path pair shown again in the new units. */
      st->shown = du;
      _df_window_update_typed_hints (self);
      if (self->probe_shown)
        _df_window_probe_at (self, self->probe_uv[0], self->probe_uv[1]);
      _df_window_show_extras (self);
      _df_window_data_sync (self);
      _df_window_status (self, FALSE, "Shown in %s, Gaussian curvature per %s² (the surface "
                         "stays in %s; Ctrl+Z undoes the change).", df_du_length_unit (&du),
                         df_du_curvature_unit (&du), du.label);
    }
  if (self->startup.report_events)
    {
      printf ("units %s %s\n", df_du_length_unit (&du), df_du_curvature_unit (&du));
      fflush (stdout);
    }
}

void
_df_window_units_init (DfWindow *self)
{
  GtkEventController *shortcuts = gtk_shortcut_controller_new ();
  UnitsState *st = g_new0 (UnitsState, 1);

  g_object_set_data_full (G_OBJECT (self), "df-units", st, g_free);
  df_document_get_display_units (self->document, &st->shown);

  g_action_map_add_action_entries (G_ACTION_MAP (self), units_actions,
                                   G_N_ELEMENTS (units_actions), self);
  gtk_shortcut_controller_set_scope (GTK_SHORTCUT_CONTROLLER (shortcuts),
                                     GTK_SHORTCUT_SCOPE_GLOBAL);
  gtk_shortcut_controller_add_shortcut (GTK_SHORTCUT_CONTROLLER (shortcuts),
                                        gtk_shortcut_new (gtk_shortcut_trigger_parse_string ("<Control><Shift>k"),
                                                          gtk_named_action_new ("win.display-units")));
  gtk_widget_add_controller (GTK_WIDGET (self), shortcuts);
  /* After df-window-sync's handler (connected first), which redraws the tools. */
  g_signal_connect (self->document, "surface-changed", G_CALLBACK (surface_changed_cb), self);
  g_signal_connect (self->document, "units-changed", G_CALLBACK (units_changed_cb), self);
}

void
_df_window_units_start (DfWindow *self)
{
  g_auto(GStrv) parts = NULL;
  df_unit length, curvature;
  g_autoptr(GError) error = NULL;

  df_loops_panel_set_report_events (self->loops_panel, self->startup.report_events);
  if (self->startup.units == NULL || df_document_get_surface (self->document) == NULL)
    return;
  parts = g_strsplit (self->startup.units, ",", 2);
  if (!df_unit_from_name (parts[0], &length)
      || (parts[1] != NULL && !df_unit_from_name (parts[1], &curvature)))
    {
      g_printerr ("driftframe: --units: '%s' is not UNIT or UNIT,CURV with each one of mm, cm, "
                  "m, in\n", self->startup.units);
      return;
    }
  if (parts[1] == NULL)
    curvature = length;
  if (!df_document_set_display_units (self->document, length, curvature, &error))
    _df_window_status (self, TRUE, "%s", error->message);
}
