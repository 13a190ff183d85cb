/* df-labels.c: form labels shared by the tool windows (see df-labels.h). */
#include "df-labels.h"

GtkWidget *
df_label_field (const char *mnemonic,
                GtkWidget  *target)
{
  GtkWidget *label = gtk_label_new_with_mnemonic (mnemonic);

  gtk_label_set_xalign (GTK_LABEL (label), 0);
  gtk_label_set_mnemonic_widget (GTK_LABEL (label), target);
  return label;
}

GtkWidget *
df_label_wrapped (const char *text,
                  const char *css,
                  int         max_chars)
{
  GtkWidget *label = gtk_label_new (text);

  gtk_label_set_wrap (GTK_LABEL (label), TRUE);
  gtk_label_set_xalign (GTK_LABEL (label), 0);
  gtk_label_set_max_width_chars (GTK_LABEL (label), max_chars);
  if (css != NULL)
    gtk_widget_add_css_class (label, css);
  return label;
}
