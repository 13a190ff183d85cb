/* df-document-units.h: the project's display units ([units] length= and curvature=, the keys
 * the CLI reads) as DfDocument state: read as a DfDisplayUnits for every readout, changed as
 * one undoable edit saved with the project. Kept apart from df-document.h as the limits are. */
#pragma once

#include "df-display-units.h"
#include "df-document.h"

G_BEGIN_DECLS

/* The units values are shown in (the surface's own when the project asks for none). */
void     df_document_get_display_units (DfDocument     *self,
                                        DfDisplayUnits *out);
/* Lengths in length, Gaussian curvature per square of curvature. Choosing the surface's own
 * unit for both clears [units] (the default then follows the surface). An undoable edit
 * labelled "change display units"; FALSE (error set, nothing changed) when the surface's
 * units label is not a known unit. Emits "units-changed" (nothing is re-measured: results
 * stay in the surface's units), after which every readout shows its values again. */
gboolean df_document_set_display_units (DfDocument  *self,
                                        df_unit      length,
                                        df_unit      curvature,
                                        GError     **error);

G_END_DECLS
