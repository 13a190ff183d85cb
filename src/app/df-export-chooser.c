/* df-export-chooser.c: the tool windows' export dialog (see df-export-chooser.h). */
#include "df-export-chooser.h"

GtkFileChooserNative *
df_export_chooser_new (GtkWindow  *parent,
                       const char *title,
                       const char *filter_name,
                       const char *pattern,
                       const char *name,
                       const char *project_path)
{
  GtkFileChooserNative *chooser = gtk_file_chooser_native_new (
    title, parent, GTK_FILE_CHOOSER_ACTION_SAVE, "_Export", "_Cancel");
  g_autoptr(GtkFileFilter) filter = gtk_file_filter_new ();

  gtk_file_filter_set_name (filter, filter_name);
  gtk_file_filter_add_pattern (filter, pattern);
  gtk_file_chooser_add_filter (GTK_FILE_CHOOSER (chooser), filter);
  gtk_file_chooser_set_current_name (GTK_FILE_CHOOSER (chooser), name);
  if (project_path != NULL)
    {
      g_autofree char *folder = g_path_get_dirname (project_path);

      if (g_file_test (folder, G_FILE_TEST_IS_DIR))
        {
          g_autoptr(GFile) dir = g_file_new_for_path (folder);

          gtk_file_chooser_set_current_folder (GTK_FILE_CHOOSER (chooser), dir, NULL);
        }
    }
  gtk_native_dialog_set_modal (GTK_NATIVE_DIALOG (chooser), TRUE);
  return chooser;
}
