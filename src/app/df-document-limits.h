/* df-document-limits.h: the one edit of DfDocument that the decisions layer adds: replacing
 * the project's [limits] (the user's material and process limits with their sources) as an
 * undoable step. Kept apart from df-document.h so the decision tools stay in files of their
 * own. */
#pragma once

#include "df-document.h"

G_BEGIN_DECLS

/* Replaces the limits (copied; NULL clears them all) and resolves their lengths against the
 * surface's units. An undoable edit labelled "edit limits"; nothing happens (FALSE, error set)
 * when a length carries a unit the surface's units cannot be related to. Emits "changed". */
gboolean df_document_set_limits (DfDocument       *self,
                                 const df_limits  *limits,
                                 GError          **error);

/* The limits as project-file text ("[limits]" group and "[units]"), to spot a change
 * (newly allocated; "" when nothing is set). */
char    *df_document_limits_text (DfDocument *self);

G_END_DECLS
