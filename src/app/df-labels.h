/* df-labels.h: the labels the app's tool windows and dialogs build their forms from: a field's
 * mnemonic label and a wrapping note. One place, so the forms read alike. */
#pragma once

#include <gtk/gtk.h>

G_BEGIN_DECLS

/* A left-aligned mnemonic label for target ("_Radius" focuses the radius entry). */
GtkWidget *df_label_field   (const char *mnemonic, GtkWidget *target);
/* A left-aligned label wrapping at max_chars characters, with the CSS class css (or NULL). */
GtkWidget *df_label_wrapped (const char *text, const char *css, int max_chars);

G_END_DECLS
