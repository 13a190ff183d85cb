/* df-glib.h: g_autoptr support for the core's types, for GLib code (readers, CLI, app, tests).
 * Include this instead of the core headers one by one. */
#pragma once

#include <glib.h>

#include "df-curve.h"
#include "df-data-csv.h"
#include "df-expr.h"
#include "df-expr-parse.h"
#include "df-fair.h"
#include "df-fit.h"
#include "df-geometry.h"
#include "df-geodesic.h"
#include "df-io-error.h"
#include "df-limits.h"
#include "df-loop.h"
#include "df-loop-csv.h"
#include "df-project.h"
#include "df-project-file.h"
#include "df-surface.h"
#include "df-surface-spec.h"
#include "df-transport.h"

G_DEFINE_AUTOPTR_CLEANUP_FUNC (df_expr, df_expr_free)
G_DEFINE_AUTOPTR_CLEANUP_FUNC (df_params, df_params_free)
G_DEFINE_AUTOPTR_CLEANUP_FUNC (df_surface, df_surface_free)
G_DEFINE_AUTOPTR_CLEANUP_FUNC (df_surface_spec, df_surface_spec_free)
G_DEFINE_AUTOPTR_CLEANUP_FUNC (df_curve, df_curve_free)
G_DEFINE_AUTOPTR_CLEANUP_FUNC (df_placer, df_placer_free)
G_DEFINE_AUTOPTR_CLEANUP_FUNC (df_project, df_project_free)
G_DEFINE_AUTOPTR_CLEANUP_FUNC (df_limits, df_limits_free)
G_DEFINE_AUTO_CLEANUP_CLEAR_FUNC (df_loop_result, df_loop_result_clear)
G_DEFINE_AUTO_CLEANUP_CLEAR_FUNC (df_transport_result, df_transport_result_clear)
G_DEFINE_AUTO_CLEANUP_CLEAR_FUNC (df_geodesic_result, df_geodesic_result_clear)
