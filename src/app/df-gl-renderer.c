/* df-gl-renderer.c: GTK scene renderer choice by the OpenGL driver (see df-gl-renderer.h).
 * Measured with `driftframe --demo --bench-orbit` at 1280x800 under Xvfb + llvmpipe: GTK's GL
 * renderer 73 ms a frame against 18-28 ms with the cairo renderer in the same run (the
 * figures are in DEVELOPERS.md). */
#include <epoxy/gl.h>
#include <string.h>

#include "df-gl-renderer.h"

static gboolean
is_software (const char *renderer)
{
  static const char *const names[] = { "llvmpipe", "softpipe", "swrast", "software" };

  for (guint i = 0; i < G_N_ELEMENTS (names); i++)
    if (strstr (renderer, names[i]) != NULL)
      return TRUE;
  return FALSE;
}

char *
df_gl_renderer_choose (GdkDisplay *display)
{
  g_autoptr(GdkGLContext) context = NULL;
  g_autoptr(GError) error = NULL;
  const char *renderer;
  char *name;

  g_return_val_if_fail (GDK_IS_DISPLAY (display), NULL);

  context = gdk_display_create_gl_context (display, &error);
  if (context == NULL || !gdk_gl_context_realize (context, &error))
    return NULL;
  gdk_gl_context_make_current (context);
  renderer = (const char *) glGetString (GL_RENDERER);
  name = g_strdup (renderer != NULL ? renderer : "");
  gdk_gl_context_clear_current ();
  if (g_getenv ("GSK_RENDERER") == NULL && is_software (name))
    g_setenv ("GSK_RENDERER", "cairo", TRUE);
  return name;
}
