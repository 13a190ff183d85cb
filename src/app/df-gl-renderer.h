/* df-gl-renderer.h: picks GTK's scene renderer for the app before the first window exists.
 * On a software OpenGL driver (Mesa's llvmpipe, softpipe, swrast) GTK's GL renderer draws the
 * whole widget tree through the rasterizer every frame, which costs more than the 3D view
 * itself; GTK's cairo renderer paints widgets on the CPU and only repaints what changed. */
#pragma once

#include <gdk/gdk.h>

G_BEGIN_DECLS

/* Unless the user chose one (GSK_RENDERER set), sets GSK_RENDERER=cairo when display's OpenGL
 * driver is a software rasterizer. Returns the driver's GL_RENDERER string (g_free) or NULL
 * when no GL context could be made. Call before any window is realized: GTK reads the
 * variable once. */
char *df_gl_renderer_choose (GdkDisplay *display);

G_END_DECLS
