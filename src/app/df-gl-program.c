/* df-gl-program.c: shader compile and link with the full info log in the GError (the first line
 * of a log is rarely the useful one). Sources come only from the GResource bundle. */
#include "df-gl-program.h"

#include <gio/gio.h>

G_DEFINE_QUARK (df-gl-program-error-quark, df_gl_program_error)

static char *
shader_log (GLuint shader)
{
  GLint len = 0;
  char *log;

  glGetShaderiv (shader, GL_INFO_LOG_LENGTH, &len);
  log = g_malloc0 (MAX (len, 1) + 1);
  if (len > 0)
    glGetShaderInfoLog (shader, len, NULL, log);
  return g_strchomp (log);
}

static char *
program_log (GLuint program)
{
  GLint len = 0;
  char *log;

  glGetProgramiv (program, GL_INFO_LOG_LENGTH, &len);
  log = g_malloc0 (MAX (len, 1) + 1);
  if (len > 0)
    glGetProgramInfoLog (program, len, NULL, log);
  return g_strchomp (log);
}

static GLuint
compile (GLenum type, const char *path, GError **error)
{
  g_autoptr (GBytes) bytes = NULL;
  g_autoptr (GError) local_error = NULL;
  const char *source;
  GLint length, ok = GL_FALSE;
  GLuint shader;
  gsize size;

  bytes = g_resources_lookup_data (path, G_RESOURCE_LOOKUP_FLAGS_NONE, &local_error);
  if (bytes == NULL)
    {
      g_set_error (error, DF_GL_PROGRAM_ERROR, DF_GL_PROGRAM_ERROR_RESOURCE,
                   "Shader %s is missing from the resource bundle: %s", path,
                   local_error->message);
      return 0;
    }
  source = g_bytes_get_data (bytes, &size);
  length = (GLint) size;
  shader = glCreateShader (type);
  glShaderSource (shader, 1, &source, &length);
  glCompileShader (shader);
  glGetShaderiv (shader, GL_COMPILE_STATUS, &ok);
  if (!ok)
    {
      g_autofree char *log = shader_log (shader);
      g_set_error (error, DF_GL_PROGRAM_ERROR, DF_GL_PROGRAM_ERROR_COMPILE,
                   "Shader %s does not compile:\n%s", path, log);
      glDeleteShader (shader);
      return 0;
    }
  return shader;
}

gboolean
df_gl_program_build (GLuint      *program,
                     const char  *vert_path,
                     const char  *frag_path,
                     GError     **error)
{
  GLuint vert = 0, frag = 0, prog;
  GLint ok = GL_FALSE;

  g_return_val_if_fail (program != NULL, FALSE);
  g_return_val_if_fail (vert_path != NULL && frag_path != NULL, FALSE);
  *program = 0;

  vert = compile (GL_VERTEX_SHADER, vert_path, error);
  if (vert == 0)
    return FALSE;
  frag = compile (GL_FRAGMENT_SHADER, frag_path, error);
  if (frag == 0)
    {
      glDeleteShader (vert);
      return FALSE;
    }

  prog = glCreateProgram ();
  glAttachShader (prog, vert);
  glAttachShader (prog, frag);
  glLinkProgram (prog);
  glGetProgramiv (prog, GL_LINK_STATUS, &ok);
  /* Shaders are flagged for deletion now; they go when the program does. */
  glDetachShader (prog, vert);
  glDeleteShader (vert);
  glDetachShader (prog, frag);
  glDeleteShader (frag);
  if (!ok)
    {
      g_autofree char *log = program_log (prog);
      g_set_error (error, DF_GL_PROGRAM_ERROR, DF_GL_PROGRAM_ERROR_LINK,
                   "Shader program %s + %s does not link:\n%s", vert_path, frag_path, log);
      glDeleteProgram (prog);
      return FALSE;
    }
  *program = prog;
  return TRUE;
}
