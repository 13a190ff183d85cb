/* df-export-chooser.h: the save dialog the tool windows export through (gore pattern,
 * developability map, drape): one file type, a suggested name, and the project's own folder
 * to start in, so an export lands beside the design it belongs to. */
#pragma once

#include <gtk/gtk.h>

G_BEGIN_DECLS

/* A modal save chooser over parent (not shown yet): filter_name ("SVG drawing (*.svg)") with
 * pattern ("*.svg"), the suggested file name, and the folder of project_path when it is set
 * and exists (else GTK's default). */
GtkFileChooserNative *df_export_chooser_new (GtkWindow  *parent,
                                             const char *title,
                                             const char *filter_name,
                                             const char *pattern,
                                             const char *name,
                                             const char *project_path);

G_END_DECLS
