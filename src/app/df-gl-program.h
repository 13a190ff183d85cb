/* df-gl-program.h: builds a GLSL program from shader sources stored in the GResource bundle,
 * reporting compile and link failures with the resource path and the driver's full info log.
 * Needs a current GL context. */
#pragma once

#include <epoxy/gl.h>
#include <glib.h>

#define DF_GL_PROGRAM_ERROR (df_gl_program_error_quark ())

typedef enum
{
  DF_GL_PROGRAM_ERROR_RESOURCE,   /* the shader source is not in the bundle */
  DF_GL_PROGRAM_ERROR_COMPILE,
  DF_GL_PROGRAM_ERROR_LINK,
  DF_GL_PROGRAM_ERROR_VERSION     /* the context is OpenGL ES or older than the shaders need */
} DfGlProgramError;

GQuark   df_gl_program_error_quark (void);

/* Compiles and links vertex and fragment shaders from resource paths into *program (0 on
 * failure; every intermediate name is deleted either way). */
gboolean df_gl_program_build       (GLuint      *program,
                                    const char  *vert_path,
                                    const char  *frag_path,
                                    GError     **error);
