/* df-verdict-details.c: the limits section of the loop details (see df-verdict-details.h).
 * Wording from df-verdict-text.c; the verdicts are the core's. */
#include "df-verdict-details.h"

#include "df-decide-out.h"
#include "df-document-units.h"
#include "df-format.h"
#include "df-loop-verdicts.h"
#include "df-verdict-plot.h"
#include "df-verdict-text.h"

struct _DfVerdictDetails
{
  GtkWidget parent_instance;

  /* children */
  GtkWidget *box;
  GtkWidget *heading;
  GtkWidget *list;      /* GtkBox of verdict lines */
  GtkWidget *plot;
  GtkWidget *caution;

  /* owned */
  DfLoopVerdicts *verdicts;
  DfDocument     *document;
};

G_DEFINE_FINAL_TYPE (DfVerdictDetails, df_verdict_details, GTK_TYPE_WIDGET)

static GtkWidget *
verdict_line (const char *icon,
              const char *title,
              const char *text,
              gboolean    exceeded)
{
  GtkWidget *row = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 6);
  GtkWidget *image = gtk_image_new_from_icon_name (icon);
  g_autofree char *full = g_strdup_printf ("%s — %s", title, text);
  GtkWidget *label = gtk_label_new (full);

  gtk_widget_set_valign (image, GTK_ALIGN_START);
  gtk_label_set_wrap (GTK_LABEL (label), TRUE);
  gtk_label_set_xalign (GTK_LABEL (label), 0);
  gtk_label_set_selectable (GTK_LABEL (label), TRUE);
  gtk_widget_set_focusable (label, FALSE);
  gtk_widget_set_hexpand (label, TRUE);
  gtk_box_append (GTK_BOX (row), image);
  gtk_box_append (GTK_BOX (row), label);
  gtk_widget_add_css_class (row, exceeded ? "df-verdict-exceeded" : "df-verdict-within");
  return row;
}

static void
clear_list (DfVerdictDetails *self)
{
  GtkWidget *child;

  while ((child = gtk_widget_get_first_child (self->list)) != NULL)
    gtk_box_remove (GTK_BOX (self->list), child);
}

static void
sync_details (DfVerdictDetails *self)
{
  DfVerdictsState state = self->verdicts != NULL ? df_loop_verdicts_get_state (self->verdicts)
                                                 : DF_VERDICTS_NONE;
  const DfLoopCheck *check = self->verdicts != NULL
                             ? df_loop_verdicts_get_check (self->verdicts) : NULL;
  const df_limits *limits = self->document != NULL ? df_document_get_limits (self->document)
                                                   : NULL;
  DfDisplayUnits du;
  const df_surface *surface = self->document != NULL ? df_document_get_surface (self->document)
                                                     : NULL;
  gboolean revolution = surface != NULL
                        && g_str_equal (df_surface_kind_name (surface), "revolution");

  if (self->document != NULL)
    df_document_get_display_units (self->document, &du);
  else
    df_du_identity (&du, NULL);
  clear_list (self);
  gtk_widget_set_visible (GTK_WIDGET (self), state != DF_VERDICTS_NONE);
  switch (state)
    {
    case DF_VERDICTS_PENDING:
      gtk_label_set_text (GTK_LABEL (self->heading), "Against your limits: checking…");
      break;
    case DF_VERDICTS_FAILED:
      {
        g_autofree char *text = g_strdup_printf ("The loop could not be checked: %s",
                                                 df_loop_verdicts_get_error (self->verdicts));

        gtk_label_set_text (GTK_LABEL (self->heading), "Against your limits: not checked");
        gtk_box_append (GTK_BOX (self->list), verdict_line ("dialog-question-symbolic",
                                                            "Not checked", text, TRUE));
      }
      break;
    case DF_VERDICTS_DONE:
      {
        g_autofree char *summary = df_verdict_summary (&check->list);
        g_autofree char *heading = g_strdup_printf ("Against your limits: %s", summary);

        gtk_label_set_text (GTK_LABEL (self->heading), heading);
        /* Exceeded first: those are what the user came to see. */
        for (int pass = 0; pass < 2; pass++)
          for (gsize k = 0; k < check->list.n; k++)
            {
              const df_verdict *v = &check->list.items[k];
              g_autofree char *text = NULL;

              if (v->within != (pass == 1))
                continue;
              text = df_verdict_describe (v, limits, &du, revolution);
              if (v->limit == DF_LIMIT_MAX_SHEAR && check->shear_checked)
                {
                  /* What the drape behind it was: its start, warp and cell, given or not. */
                  const df_shear_used *sh = &check->shear;
                  g_autofree char *from = df_du_format_chart_point (&du, revolution,
                                                                    sh->start[0], sh->start[1]);
                  g_autofree char *warp = df_format_number (sh->warp_deg);
                  g_autofree char *cell = df_du_format_length (&du, sh->cell);
                  g_autofree char *with = g_strdup_printf (
                    "%s %zu of %zu cells past it; draped from %s%s, warp %s°%s, cell %s%s.",
                    text, sh->n_cells_over, sh->n_cells, from,
                    sh->start_default ? " (the loop's centre)" : "", warp,
                    sh->warp_default ? " (default)" : "", cell,
                    sh->cell_default ? " (default: the loop's length / "
                                       G_STRINGIFY (DF_SHEAR_CELLS_PER_LENGTH) ")" : "");

                  g_free (text);
                  text = g_steal_pointer (&with);
                }
              gtk_box_append (GTK_BOX (self->list),
                              verdict_line (v->within ? "object-select-symbolic"
                                                      : "dialog-warning-symbolic",
                                            df_verdict_limit_title (v->limit), text,
                                            !v->within));
            }
        if (check->has_darts)
          {
            const df_darts *d = &check->darts;
            g_autofree char *angle = df_format_angle (d->angle_each_rad);
            g_autofree char *len = df_du_format_length (&du, d->length);
            g_autofree char *text = NULL;

            if (check->darts_least > 0)
              {
                g_autofree char *each = df_format_angle (check->darts_each.angle_each_rad);
                const df_limit *shear = &limits->item[DF_LIMIT_MAX_SHEAR];

                text = g_strdup_printf ("one %s of %s lets a flat sheet fit, or at least %d of %s "
                                        "each to stay within your fabric locking angle (source: "
                                        "%s); each about %s long (an estimate from the area).",
                                        d->gusset ? "gusset (inserted)" : "dart (removed)",
                                        angle, check->darts_least, each,
                                        shear->source != NULL ? shear->source : "none given",
                                        len);
              }
            else
              text = g_strdup_printf ("one %s of %s lets a flat sheet fit; about %s long (an "
                                      "estimate from the area). Set a fabric locking angle for "
                                      "the least count.",
                                      d->gusset ? "gusset (inserted)" : "dart (removed)", angle,
                                      len);
            gtk_box_append (GTK_BOX (self->list),
                            verdict_line ("dialog-information-symbolic",
                                          d->gusset ? "Gussets" : "Darts", text, FALSE));
          }
        if (check->strain_note != NULL)
          gtk_box_append (GTK_BOX (self->list),
                          verdict_line ("dialog-information-symbolic",
                                        df_verdict_limit_title (DF_LIMIT_MAX_STRAIN),
                                        check->strain_note, FALSE));
        if (check->shear_note != NULL)
          gtk_box_append (GTK_BOX (self->list),
                          verdict_line ("dialog-information-symbolic",
                                        df_verdict_limit_title (DF_LIMIT_MAX_SHEAR),
                                        check->shear_note, FALSE));
      }
      break;
    case DF_VERDICTS_NONE:
    default:
      break;
    }
  df_verdict_plot_set (DF_VERDICT_PLOT (self->plot), self->verdicts, limits, &du);
}

static void
verdicts_changed_cb (DfLoopVerdicts   *verdicts,
                     DfVerdictDetails *self)
{
  sync_details (self);
}

static void
df_verdict_details_dispose (GObject *object)
{
  DfVerdictDetails *self = DF_VERDICT_DETAILS (object);

  if (self->verdicts != NULL)
    g_signal_handlers_disconnect_by_data (self->verdicts, self);
  g_clear_object (&self->verdicts);
  g_clear_object (&self->document);
  g_clear_pointer (&self->box, gtk_widget_unparent);
  G_OBJECT_CLASS (df_verdict_details_parent_class)->dispose (object);
}

static void
df_verdict_details_class_init (DfVerdictDetailsClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->dispose = df_verdict_details_dispose;
  gtk_widget_class_set_layout_manager_type (widget_class, GTK_TYPE_BIN_LAYOUT);
  gtk_widget_class_set_css_name (widget_class, "dfverdictdetails");
}

static void
df_verdict_details_init (DfVerdictDetails *self)
{
  self->box = gtk_box_new (GTK_ORIENTATION_VERTICAL, 6);
  self->heading = gtk_label_new (NULL);
  gtk_label_set_xalign (GTK_LABEL (self->heading), 0);
  gtk_label_set_wrap (GTK_LABEL (self->heading), TRUE);
  gtk_widget_add_css_class (self->heading, "heading");
  gtk_widget_set_margin_top (self->heading, 6);
  self->list = gtk_box_new (GTK_ORIENTATION_VERTICAL, 4);
  self->plot = df_verdict_plot_new ();
  self->caution = gtk_label_new (DF_DECIDE_CAUTION);
  gtk_label_set_wrap (GTK_LABEL (self->caution), TRUE);
  gtk_label_set_xalign (GTK_LABEL (self->caution), 0);
  gtk_widget_add_css_class (self->caution, "df-caution");
  gtk_box_append (GTK_BOX (self->box), self->heading);
  gtk_box_append (GTK_BOX (self->box), self->list);
  gtk_box_append (GTK_BOX (self->box), self->plot);
  gtk_box_append (GTK_BOX (self->box), self->caution);
  gtk_widget_set_parent (self->box, GTK_WIDGET (self));
  gtk_widget_set_visible (GTK_WIDGET (self), FALSE);
}

GtkWidget *
df_verdict_details_new (void)
{
  return g_object_new (DF_TYPE_VERDICT_DETAILS, NULL);
}

void
df_verdict_details_set_item (DfVerdictDetails *self,
                             DfDocument       *document,
                             DfLoopItem       *item)
{
  DfLoopVerdicts *verdicts = item != NULL ? df_loop_verdicts_get (item) : NULL;

  g_return_if_fail (DF_IS_VERDICT_DETAILS (self));

  g_set_object (&self->document, document);
  if (self->verdicts != verdicts)
    {
      if (self->verdicts != NULL)
        g_signal_handlers_disconnect_by_data (self->verdicts, self);
      g_set_object (&self->verdicts, verdicts);
      if (verdicts != NULL)
        g_signal_connect (verdicts, "changed", G_CALLBACK (verdicts_changed_cb), self);
    }
  sync_details (self);
}
