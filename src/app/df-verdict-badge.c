/* df-verdict-badge.c: a loop row's verdict line (see df-verdict-badge.h). */
#include "df-verdict-badge.h"

#include "df-loop-verdicts.h"
#include "df-verdict-text.h"

struct _DfVerdictBadge
{
  GtkWidget parent_instance;

  /* children */
  GtkWidget *box;
  GtkWidget *icon;
  GtkWidget *label;

  /* owned */
  DfLoopVerdicts *verdicts;
};

G_DEFINE_FINAL_TYPE (DfVerdictBadge, df_verdict_badge, GTK_TYPE_WIDGET)

static void
sync_badge (DfVerdictBadge *self)
{
  DfVerdictsState state = df_loop_verdicts_get_state (self->verdicts);
  const DfLoopCheck *check = df_loop_verdicts_get_check (self->verdicts);
  g_autofree char *text = NULL;
  const char *icon = NULL;

  gtk_widget_remove_css_class (self->box, "df-verdict-exceeded");
  gtk_widget_remove_css_class (self->box, "df-verdict-within");
  switch (state)
    {
    case DF_VERDICTS_PENDING:
      text = g_strdup ("checking against the limits…");
      icon = "content-loading-symbolic";
      break;
    case DF_VERDICTS_FAILED:
      text = g_strdup ("limits not checked (see the details)");
      icon = "dialog-question-symbolic";
      break;
    case DF_VERDICTS_DONE:
      text = df_verdict_summary (&check->list);
      if (check->list.n_exceeded > 0)
        {
          icon = "dialog-warning-symbolic";
          gtk_widget_add_css_class (self->box, "df-verdict-exceeded");
        }
      else
        {
          icon = "object-select-symbolic";
          gtk_widget_add_css_class (self->box, "df-verdict-within");
        }
      break;
    case DF_VERDICTS_NONE:
    default:
      break;
    }
  gtk_widget_set_visible (GTK_WIDGET (self), text != NULL);
  gtk_label_set_text (GTK_LABEL (self->label), text != NULL ? text : "");
  gtk_image_set_from_icon_name (GTK_IMAGE (self->icon), icon);
}

static void
verdicts_changed_cb (DfLoopVerdicts *verdicts,
                     DfVerdictBadge *self)
{
  sync_badge (self);
}

static void
df_verdict_badge_dispose (GObject *object)
{
  DfVerdictBadge *self = DF_VERDICT_BADGE (object);

  if (self->verdicts != NULL)
    g_signal_handlers_disconnect_by_data (self->verdicts, self);
  g_clear_object (&self->verdicts);
  g_clear_pointer (&self->box, gtk_widget_unparent);
  G_OBJECT_CLASS (df_verdict_badge_parent_class)->dispose (object);
}

static void
df_verdict_badge_class_init (DfVerdictBadgeClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->dispose = df_verdict_badge_dispose;
  gtk_widget_class_set_layout_manager_type (widget_class, GTK_TYPE_BIN_LAYOUT);
  gtk_widget_class_set_css_name (widget_class, "dfverdictbadge");
}

static void
df_verdict_badge_init (DfVerdictBadge *self)
{
  self->box = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 4);
  self->icon = gtk_image_new ();
  self->label = gtk_label_new (NULL);
  gtk_label_set_xalign (GTK_LABEL (self->label), 0);
  gtk_label_set_ellipsize (GTK_LABEL (self->label), PANGO_ELLIPSIZE_END);
  gtk_widget_add_css_class (self->label, "caption");
  gtk_box_append (GTK_BOX (self->box), self->icon);
  gtk_box_append (GTK_BOX (self->box), self->label);
  gtk_widget_set_parent (self->box, GTK_WIDGET (self));
}

GtkWidget *
df_verdict_badge_new (DfLoopItem *item)
{
  DfVerdictBadge *self;

  g_return_val_if_fail (DF_IS_LOOP_ITEM (item), NULL);
  self = g_object_new (DF_TYPE_VERDICT_BADGE, NULL);
  self->verdicts = g_object_ref (df_loop_verdicts_get (item));
  g_signal_connect (self->verdicts, "changed", G_CALLBACK (verdicts_changed_cb), self);
  sync_badge (self);
  return GTK_WIDGET (self);
}
