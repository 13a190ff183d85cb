/* df-application.h: DfApplication, the GtkApplication of driftframe: command line, application
 * actions (quit, about, shortcuts), accelerators and CSS. */
#pragma once

#include <gtk/gtk.h>

G_BEGIN_DECLS

#define DF_TYPE_APPLICATION (df_application_get_type ())
G_DECLARE_FINAL_TYPE (DfApplication, df_application, DF, APPLICATION, GtkApplication)

/* one_shot: run without uniqueness (exports, benchmark), so the run cannot be forwarded. */
DfApplication *df_application_new (gboolean one_shot);

G_END_DECLS
