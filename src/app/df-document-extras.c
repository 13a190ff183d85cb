/* df-document-extras.c: the document's geodesic and path pair, the Geodesic and Two paths
 * tools' results kept in the project's [geodesic N] and [paths N] groups, so that they are
 * saved, autosaved and undone with everything else. The tools show the project's last one of
 * each; a new result replaces that one when the tool made it (same name), else follows it. */
#include <string.h>

#include "df-document-private.h"
#include "df-project.h"

const df_project_geodesic *
df_document_get_geodesic (DfDocument *self)
{
  GPtrArray *list;

  g_return_val_if_fail (DF_IS_DOCUMENT (self), NULL);
  if (self->carried == NULL)
    return NULL;
  list = self->carried->extras.geodesics;
  return list->len > 0 ? g_ptr_array_index (list, list->len - 1) : NULL;
}

const df_project_paths *
df_document_get_paths (DfDocument *self)
{
  GPtrArray *list;

  g_return_val_if_fail (DF_IS_DOCUMENT (self), NULL);
  if (self->carried == NULL)
    return NULL;
  list = self->carried->extras.paths;
  return list->len > 0 ? g_ptr_array_index (list, list->len - 1) : NULL;
}

/* Drops the last item of list when it carries name (the tool's own), so that the new one
 * takes its place. */
static void
drop_own (GPtrArray  *list,
          const char *name,
          gsize       name_offset)
{
  const char *last_name;

  if (list->len == 0)
    return;
  last_name = G_STRUCT_MEMBER (const char *, g_ptr_array_index (list, list->len - 1),
                               name_offset);
  if (g_strcmp0 (last_name, name) == 0)
    g_ptr_array_remove_index (list, list->len - 1);
}

void
df_document_set_geodesic (DfDocument *self,
                          const char *name,
                          double      u,
                          double      v,
                          double      heading_deg,
                          double      length)
{
  const df_project_geodesic *now;

  g_return_if_fail (DF_IS_DOCUMENT (self));
  g_return_if_fail (name != NULL);
  if (self->carried == NULL)
    return;
  now = df_document_get_geodesic (self);
  if (now != NULL && g_strcmp0 (now->name, name) == 0 && now->u == u && now->v == v
      && now->heading_deg == heading_deg && now->length == length)
    return;
  _df_document_push_history (self, "shoot geodesic");
  drop_own (self->carried->extras.geodesics, name, G_STRUCT_OFFSET (df_project_geodesic, name));
  df_project_extras_add_geodesic (&self->carried->extras, name, u, v, heading_deg, length);
  _df_document_update_modified (self);
}

void
df_document_clear_geodesic (DfDocument *self)
{
  GPtrArray *list;

  g_return_if_fail (DF_IS_DOCUMENT (self));
  if (self->carried == NULL || self->carried->extras.geodesics->len == 0)
    return;
  list = self->carried->extras.geodesics;
  _df_document_push_history (self, "clear geodesic");
  g_ptr_array_remove_index (list, list->len - 1);
  _df_document_update_modified (self);
}

void
df_document_set_paths (DfDocument    *self,
                       const char    *name,
                       const double (*a)[2],
                       gsize          n_a,
                       const double (*b)[2],
                       gsize          n_b)
{
  const df_project_paths *now;

  g_return_if_fail (DF_IS_DOCUMENT (self));
  g_return_if_fail (name != NULL && a != NULL && b != NULL);
  if (self->carried == NULL)
    return;
  now = df_document_get_paths (self);
  if (now != NULL && g_strcmp0 (now->name, name) == 0 && now->n_a == n_a && now->n_b == n_b
      && memcmp (now->a, a, n_a * sizeof *a) == 0 && memcmp (now->b, b, n_b * sizeof *b) == 0)
    return;
  _df_document_push_history (self, "compare paths");
  drop_own (self->carried->extras.paths, name, G_STRUCT_OFFSET (df_project_paths, name));
  df_project_extras_add_paths (&self->carried->extras, name, a, n_a, b, n_b);
  _df_document_update_modified (self);
}

void
df_document_clear_paths (DfDocument *self)
{
  GPtrArray *list;

  g_return_if_fail (DF_IS_DOCUMENT (self));
  if (self->carried == NULL || self->carried->extras.paths->len == 0)
    return;
  list = self->carried->extras.paths;
  _df_document_push_history (self, "clear paths");
  g_ptr_array_remove_index (list, list->len - 1);
  _df_document_update_modified (self);
}
