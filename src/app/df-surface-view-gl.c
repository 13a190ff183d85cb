/* df-surface-view-gl.c: DfSurfaceView's OpenGL side: the vertex arrays and buffers, the three
 * programs (surface, wide lines, solids), uploads of dirty data, the draw passes and an offscreen
 * render for PNG export. Every GL name lives in the instance's ViewGl and is deleted in one
 * place. Only draws: the geometry comes ready-made. */
#include "df-surface-view-private.h"

#include <math.h>
#include <string.h>

#include "df-gl-program.h"

/* Floats per line corner: start (3), end (3), colour (4), width (1), corner (2). */
#define CORNER_STRIDE 13

#define SHADER_PREFIX "/org/driftframe/Driftframe/shaders/"

/* The ramp's stops at s = -1, -0.5, 0, 0.5, 1 (sRGB): a deep blue, a light sky blue, a warm
 * white, a light apricot and a burnt orange. Chosen for this app; the two arms differ in both
 * hue and lightness so they stay apart for the common colour-vision deficiencies. */
static const float ramp_stops[DF_SHADING_RAMP_STOPS][3] = {
  { 0.161f, 0.349f, 0.678f },
  { 0.518f, 0.706f, 0.886f },
  { 0.957f, 0.945f, 0.910f },
  { 0.988f, 0.757f, 0.502f },
  { 0.851f, 0.420f, 0.098f },
};
static const float plain_colour[3] = { 0.80f, 0.76f, 0.68f };

void
df_shading_ramp_colour (double   s,
                        GdkRGBA *colour)
{
  double x;
  int i;

  g_return_if_fail (colour != NULL);
  if (!isfinite (s))
    s = 0;
  x = (CLAMP (s, -1.0, 1.0) + 1) * 2;
  i = MIN ((int) floor (x), DF_SHADING_RAMP_STOPS - 2);
  x -= i;
  colour->red = ramp_stops[i][0] + x * (ramp_stops[i + 1][0] - ramp_stops[i][0]);
  colour->green = ramp_stops[i][1] + x * (ramp_stops[i + 1][1] - ramp_stops[i][1]);
  colour->blue = ramp_stops[i][2] + x * (ramp_stops[i + 1][2] - ramp_stops[i][2]);
  colour->alpha = 1;
}

static void
setup_vertex_arrays (ViewGl *gl)
{
  glGenVertexArrays (1, &gl->surface_vao);
  glGenBuffers (1, &gl->surface_vbo);
  glGenBuffers (1, &gl->surface_ibo);
  glGenBuffers (1, &gl->surface_ibo_coarse);
  glBindVertexArray (gl->surface_vao);
  glBindBuffer (GL_ARRAY_BUFFER, gl->surface_vbo);
  glBindBuffer (GL_ELEMENT_ARRAY_BUFFER, gl->surface_ibo);
  glEnableVertexAttribArray (0);
  glVertexAttribPointer (0, 3, GL_FLOAT, GL_FALSE, SURFACE_STRIDE * sizeof (float), (void *) 0);
  glEnableVertexAttribArray (1);
  glVertexAttribPointer (1, 3, GL_FLOAT, GL_FALSE, SURFACE_STRIDE * sizeof (float),
                         (void *) (3 * sizeof (float)));
  glEnableVertexAttribArray (2);
  glVertexAttribPointer (2, 2, GL_FLOAT, GL_FALSE, SURFACE_STRIDE * sizeof (float),
                         (void *) (6 * sizeof (float)));
  glEnableVertexAttribArray (3);
  glVertexAttribPointer (3, 2, GL_FLOAT, GL_FALSE, SURFACE_STRIDE * sizeof (float),
                         (void *) (8 * sizeof (float)));

  /* A line corner: both segment ends, its colour and width, which corner (see lines.vert). */
  glGenVertexArrays (1, &gl->lines_vao);
  glGenBuffers (1, &gl->lines_vbo);
  glGenBuffers (1, &gl->lines_ibo);
  glBindVertexArray (gl->lines_vao);
  glBindBuffer (GL_ARRAY_BUFFER, gl->lines_vbo);
  glBindBuffer (GL_ELEMENT_ARRAY_BUFFER, gl->lines_ibo);
  glEnableVertexAttribArray (0);
  glVertexAttribPointer (0, 3, GL_FLOAT, GL_FALSE, CORNER_STRIDE * sizeof (float), (void *) 0);
  glEnableVertexAttribArray (1);
  glVertexAttribPointer (1, 3, GL_FLOAT, GL_FALSE, CORNER_STRIDE * sizeof (float),
                         (void *) (3 * sizeof (float)));
  glEnableVertexAttribArray (2);
  glVertexAttribPointer (2, 4, GL_FLOAT, GL_FALSE, CORNER_STRIDE * sizeof (float),
                         (void *) (6 * sizeof (float)));
  glEnableVertexAttribArray (3);
  glVertexAttribPointer (3, 1, GL_FLOAT, GL_FALSE, CORNER_STRIDE * sizeof (float),
                         (void *) (10 * sizeof (float)));
  glEnableVertexAttribArray (4);
  glVertexAttribPointer (4, 2, GL_FLOAT, GL_FALSE, CORNER_STRIDE * sizeof (float),
                         (void *) (11 * sizeof (float)));

  glGenVertexArrays (1, &gl->solid_vao);
  glGenBuffers (1, &gl->solid_vbo);
  glBindVertexArray (gl->solid_vao);
  glBindBuffer (GL_ARRAY_BUFFER, gl->solid_vbo);
  glEnableVertexAttribArray (0);
  glVertexAttribPointer (0, 3, GL_FLOAT, GL_FALSE, SOLID_STRIDE * sizeof (float), (void *) 0);
  glEnableVertexAttribArray (1);
  glVertexAttribPointer (1, 3, GL_FLOAT, GL_FALSE, SOLID_STRIDE * sizeof (float),
                         (void *) (3 * sizeof (float)));
  glEnableVertexAttribArray (2);
  glVertexAttribPointer (2, 4, GL_FLOAT, GL_FALSE, SOLID_STRIDE * sizeof (float),
                         (void *) (6 * sizeof (float)));

  glBindVertexArray (0);
  glBindBuffer (GL_ARRAY_BUFFER, 0);
}

static gboolean
build_programs (ViewGl  *gl,
                GError **error)
{
  if (!df_gl_program_build (&gl->surface_program, SHADER_PREFIX "surface.vert",
                            SHADER_PREFIX "surface.frag", error)
      || !df_gl_program_build (&gl->lines_program, SHADER_PREFIX "lines.vert",
                               SHADER_PREFIX "lines.frag", error)
      || !df_gl_program_build (&gl->solid_program, SHADER_PREFIX "solid.vert",
                               SHADER_PREFIX "solid.frag", error))
    return FALSE;

  gl->su.view = glGetUniformLocation (gl->surface_program, "u_view");
  gl->su.proj = glGetUniformLocation (gl->surface_program, "u_proj");
  gl->su.shading = glGetUniformLocation (gl->surface_program, "u_shading");
  gl->su.inv_range = glGetUniformLocation (gl->surface_program, "u_inv_range");
  gl->su.offset = glGetUniformLocation (gl->surface_program, "u_offset");
  gl->su.ramp = glGetUniformLocation (gl->surface_program, "u_ramp");
  gl->su.plain = glGetUniformLocation (gl->surface_program, "u_plain");
  gl->su.iso = glGetUniformLocation (gl->surface_program, "u_iso");
  gl->su.iso_step = glGetUniformLocation (gl->surface_program, "u_iso_step");
  gl->su.back_shade = glGetUniformLocation (gl->surface_program, "u_back_shade");
  gl->lu.view = glGetUniformLocation (gl->lines_program, "u_view");
  gl->lu.proj = glGetUniformLocation (gl->lines_program, "u_proj");
  gl->lu.bias = glGetUniformLocation (gl->lines_program, "u_bias");
  gl->lu.viewport = glGetUniformLocation (gl->lines_program, "u_viewport");
  gl->lu.alpha = glGetUniformLocation (gl->lines_program, "u_alpha");
  gl->lu.px_scale = glGetUniformLocation (gl->lines_program, "u_px_scale");
  gl->ou.view = glGetUniformLocation (gl->solid_program, "u_view");
  gl->ou.proj = glGetUniformLocation (gl->solid_program, "u_proj");
  gl->ou.bias = glGetUniformLocation (gl->solid_program, "u_bias");
  gl->ou.alpha = glGetUniformLocation (gl->solid_program, "u_alpha");
  return TRUE;
}

static void
delete_program (GLuint *name)
{
  if (*name != 0)
    glDeleteProgram (*name);
  *name = 0;
}

static void
delete_buffer (GLuint *name)
{
  if (*name != 0)
    glDeleteBuffers (1, name);
  *name = 0;
}

static void
delete_vertex_array (GLuint *name)
{
  if (*name != 0)
    glDeleteVertexArrays (1, name);
  *name = 0;
}

void
_df_surface_view_gl_delete (ViewGl *gl)
{
  delete_program (&gl->surface_program);
  delete_program (&gl->lines_program);
  delete_program (&gl->solid_program);
  delete_vertex_array (&gl->surface_vao);
  delete_vertex_array (&gl->lines_vao);
  delete_vertex_array (&gl->solid_vao);
  delete_buffer (&gl->surface_vbo);
  delete_buffer (&gl->surface_ibo);
  delete_buffer (&gl->surface_ibo_coarse);
  delete_buffer (&gl->lines_vbo);
  delete_buffer (&gl->lines_ibo);
  delete_buffer (&gl->solid_vbo);
  if (gl->fbo != 0)
    glDeleteFramebuffers (1, &gl->fbo);
  if (gl->fbo_colour != 0)
    glDeleteRenderbuffers (1, &gl->fbo_colour);
  if (gl->fbo_depth != 0)
    glDeleteRenderbuffers (1, &gl->fbo_depth);
  gl->fbo = gl->fbo_colour = gl->fbo_depth = 0;
  gl->surface_indices = gl->surface_indices_coarse = gl->line_indices = gl->solid_vertices = 0;
}

/* Each segment (a pair of LINE_STRIDE vertices) becomes the four corners of a quad that
 * lines.vert places in screen space, and two triangles. Why not a geometry shader (as
 * before): llvmpipe, the software rasterizer this app is built for, runs that stage on one
 * thread; the corners drew the demo's scene slightly faster (median 9.3 against 9.6 ms,
 * 2026-12-03, alternating runs) with the same pixels, and need no geometry stage at all. */
static void
upload_line_quads (ViewGl      *gl,
                   const float *pairs,
                   gsize        n_vertices)
{
  gsize n_segments = n_vertices / 2;
  float *corners = g_new (float, MAX (n_segments, 1) * 4 * CORNER_STRIDE);
  guint32 *indices = g_new (guint32, MAX (n_segments, 1) * 6);

  for (gsize s = 0; s < n_segments; s++)
    {
      const float *a = pairs + 2 * s * LINE_STRIDE, *b = a + LINE_STRIDE;
      for (int k = 0; k < 4; k++)
        {
          float *c = corners + (4 * s + k) * CORNER_STRIDE;
          const float *end = k < 2 ? a : b;
          memcpy (c, a, 3 * sizeof (float));
          memcpy (c + 3, b, 3 * sizeof (float));
          memcpy (c + 6, end + 3, 4 * sizeof (float));   /* the colour of its own end */
          c[10] = a[7];                                  /* the width of the segment's start */
          c[11] = k < 2 ? 0.0f : 1.0f;
          c[12] = k % 2 == 0 ? -1.0f : 1.0f;
        }
      guint32 base = (guint32) (4 * s);
      guint32 *q = indices + 6 * s;
      q[0] = base; q[1] = base + 1; q[2] = base + 2;
      q[3] = base + 2; q[4] = base + 1; q[5] = base + 3;
    }
  glBindVertexArray (gl->lines_vao);
  glBindBuffer (GL_ARRAY_BUFFER, gl->lines_vbo);
  glBufferData (GL_ARRAY_BUFFER, n_segments * 4 * CORNER_STRIDE * sizeof (float), corners,
                GL_DYNAMIC_DRAW);
  glBufferData (GL_ELEMENT_ARRAY_BUFFER, n_segments * 6 * sizeof (guint32), indices,
                GL_DYNAMIC_DRAW);
  gl->line_indices = (GLsizei) (n_segments * 6);
  g_free (corners);
  g_free (indices);
}

void
_df_surface_view_gl_upload (DfSurfaceView *self)
{
  ViewGl *gl = &self->gl;

  if (self->mesh_dirty)
    {
      gsize n_vertices = 0, n_indices = 0, n_coarse = 0;
      if (self->mesh != NULL && self->mesh->mesh != NULL)
        {
          n_vertices = df_mesh_n_vertices (self->mesh->mesh);
          n_indices = 3 * df_mesh_n_triangles (self->mesh->mesh);
          n_coarse = 3 * self->mesh->n_coarse;
        }
      gboolean copied = FALSE;
      const float *vertices = n_vertices > 0 ? _df_surface_view_field_vertices (self, &copied)
                                             : NULL;

      glBindVertexArray (gl->surface_vao);
      glBindBuffer (GL_ARRAY_BUFFER, gl->surface_vbo);
      glBufferData (GL_ARRAY_BUFFER, n_vertices * SURFACE_STRIDE * sizeof (float),
                    vertices, GL_STATIC_DRAW);
      if (copied)
        g_free ((float *) vertices);
      glBufferData (GL_ELEMENT_ARRAY_BUFFER, n_indices * sizeof (uint32_t),
                    n_indices > 0 ? df_mesh_indices (self->mesh->mesh) : NULL, GL_STATIC_DRAW);
      gl->surface_indices = n_indices;
      glBindBuffer (GL_ELEMENT_ARRAY_BUFFER, gl->surface_ibo_coarse);
      glBufferData (GL_ELEMENT_ARRAY_BUFFER, n_coarse * sizeof (uint32_t),
                    n_coarse > 0 ? self->mesh->coarse : NULL, GL_STATIC_DRAW);
      gl->surface_indices_coarse = n_coarse;
      /* The VAO keeps the full index buffer as its own. */
      glBindBuffer (GL_ELEMENT_ARRAY_BUFFER, gl->surface_ibo);
      self->mesh_dirty = FALSE;
    }
  if (self->overlay_dirty)
    {
      upload_line_quads (gl, (const float *) self->line_data->data,
                         self->line_data->len / LINE_STRIDE);
      glBindBuffer (GL_ARRAY_BUFFER, gl->solid_vbo);
      glBufferData (GL_ARRAY_BUFFER, self->solid_data->len * sizeof (float),
                    self->solid_data->data, GL_DYNAMIC_DRAW);
      gl->solid_vertices = self->solid_data->len / SOLID_STRIDE;
      self->overlay_dirty = FALSE;
    }
  _df_surface_view_points_upload (&self->points);
  glBindVertexArray (0);
  glBindBuffer (GL_ARRAY_BUFFER, 0);
}

/* A neutral background a little apart from the theme: light grey under dark text, dark grey
 * under light text, so the sheet's light and dark sides both read in either theme. */
static void
background_colour (DfSurfaceView *self,
                   float          rgb[3])
{
  GdkRGBA fg;
  double luma;

  gtk_style_context_get_color (gtk_widget_get_style_context (GTK_WIDGET (self)), &fg);
  luma = 0.2126 * fg.red + 0.7152 * fg.green + 0.0722 * fg.blue;
  if (luma > 0.5)
    {
      rgb[0] = 0.19f;
      rgb[1] = 0.20f;
      rgb[2] = 0.22f;
    }
  else
    {
      rgb[0] = 0.84f;
      rgb[1] = 0.86f;
      rgb[2] = 0.88f;
    }
}

void
_df_surface_view_gl_draw (DfSurfaceView *self,
            int            width,
            int            height,
            gboolean       coarse)
{
  ViewGl *gl = &self->gl;
  float bg[3];
  mat4 view, proj;
  double range = _df_surface_view_mesh_range (self);

  background_colour (self, bg);
  glViewport (0, 0, width, height);
  glClearColor (bg[0], bg[1], bg[2], 1);
  glClearDepth (1);
  glClear (GL_COLOR_BUFFER_BIT | GL_DEPTH_BUFFER_BIT);

  df_camera_view (&self->camera, view);
  df_camera_projection (&self->camera, height > 0 ? (float) width / height : 1, proj);

  glEnable (GL_DEPTH_TEST);
  glDepthFunc (GL_LESS);
  glDepthMask (GL_TRUE);
  glDisable (GL_BLEND);
  glDisable (GL_CULL_FACE);

  if (gl->surface_indices > 0)
    {
      glUseProgram (gl->surface_program);
      glUniformMatrix4fv (gl->su.view, 1, GL_FALSE, (float *) view);
      glUniformMatrix4fv (gl->su.proj, 1, GL_FALSE, (float *) proj);
      if (_df_surface_view_field_active (self))
        {
          /* The field rides in the K slot of the vertices. */
          glUniform1i (gl->su.shading, DF_SHADING_GAUSSIAN);
          glUniform1f (gl->su.inv_range, self->field_range > 0 ? 1 / self->field_range : 0);
          glUniform1f (gl->su.offset, 0);
        }
      else
        {
          double lo, hi;

          /* Symmetric: s = value / range. One sign: the span [lo, hi] onto one arm, its end
           * nearer zero at s = 0 (white). */
          _df_surface_view_mesh_shade_range (self, &lo, &hi);
          glUniform1i (gl->su.shading, self->shading);
          if (range > 0 && lo > 0)
            {
              glUniform1f (gl->su.offset, (float) lo);
              glUniform1f (gl->su.inv_range, (float) (1 / (hi - lo)));
            }
          else if (range > 0 && hi < 0)
            {
              glUniform1f (gl->su.offset, (float) hi);
              glUniform1f (gl->su.inv_range, (float) (1 / (hi - lo)));
            }
          else
            {
              glUniform1f (gl->su.offset, 0);
              glUniform1f (gl->su.inv_range, range > 0 ? 1 / range : 0);
            }
        }
      glUniform3fv (gl->su.ramp, DF_SHADING_RAMP_STOPS, (const float *) ramp_stops);
      glUniform3fv (gl->su.plain, 1, plain_colour);
      glUniform1i (gl->su.iso, self->iso_lines);
      glUniform2fv (gl->su.iso_step, 1, self->mesh->iso_step);
      glUniform1f (gl->su.back_shade, BACK_SHADE);
      glBindVertexArray (gl->surface_vao);
      if (coarse && gl->surface_indices_coarse > 0)
        {
          glBindBuffer (GL_ELEMENT_ARRAY_BUFFER, gl->surface_ibo_coarse);
          glDrawElements (GL_TRIANGLES, gl->surface_indices_coarse, GL_UNSIGNED_INT, NULL);
          glBindBuffer (GL_ELEMENT_ARRAY_BUFFER, gl->surface_ibo);
        }
      else
        glDrawElements (GL_TRIANGLES, gl->surface_indices, GL_UNSIGNED_INT, NULL);
    }
  _df_surface_view_points_draw (self, (const float *) view, (const float *) proj);

  if (gl->line_indices > 0 || gl->solid_vertices > 0)
    {
      /* Keep destination alpha at 1: GTK composites the area's buffer with its alpha. */
      glEnable (GL_BLEND);
      glBlendFuncSeparate (GL_SRC_ALPHA, GL_ONE_MINUS_SRC_ALPHA, GL_ONE, GL_ONE_MINUS_SRC_ALPHA);

      glUseProgram (gl->lines_program);
      glUniformMatrix4fv (gl->lu.view, 1, GL_FALSE, (float *) view);
      glUniformMatrix4fv (gl->lu.proj, 1, GL_FALSE, (float *) proj);
      glUniform1f (gl->lu.bias, OVERLAY_BIAS);
      glUniform2f (gl->lu.viewport, width, height);
      glUniform1f (gl->lu.px_scale, gtk_widget_get_scale_factor (GTK_WIDGET (self)));
      glUseProgram (gl->solid_program);
      glUniformMatrix4fv (gl->ou.view, 1, GL_FALSE, (float *) view);
      glUniformMatrix4fv (gl->ou.proj, 1, GL_FALSE, (float *) proj);
      glUniform1f (gl->ou.bias, OVERLAY_BIAS);

      /* Pass 1: a faint ghost of whatever the surface hides, so a loop on the far side is
       * still found. Pass 2: the visible parts, solids writing depth first. */
      for (int pass = 0; pass < 2; pass++)
        {
          float alpha = pass == 0 ? GHOST_ALPHA : 1.0f;
          float solid_alpha = pass == 0 ? GHOST_SOLID_ALPHA : 1.0f;
          glDepthFunc (pass == 0 ? GL_GREATER : GL_LEQUAL);
          if (gl->solid_vertices > 0)
            {
              glDepthMask (pass == 1);
              glUseProgram (gl->solid_program);
              glUniform1f (gl->ou.alpha, solid_alpha);
              glBindVertexArray (gl->solid_vao);
              glDrawArrays (GL_TRIANGLES, 0, gl->solid_vertices);
            }
          if (gl->line_indices > 0)
            {
              glDepthMask (GL_FALSE);
              glUseProgram (gl->lines_program);
              glUniform1f (gl->lu.alpha, alpha);
              glBindVertexArray (gl->lines_vao);
              glDrawElements (GL_TRIANGLES, gl->line_indices, GL_UNSIGNED_INT, NULL);
            }
        }
      glDepthMask (GL_TRUE);
      glDepthFunc (GL_LESS);
      glDisable (GL_BLEND);
    }

  glBindVertexArray (0);
  glUseProgram (0);
}

gboolean
_df_surface_view_gl_create (ViewGl  *gl,
                            GError **error)
{
  /* Vertex arrays first: unrealize deletes them even when a shader then fails. */
  setup_vertex_arrays (gl);
  return build_programs (gl, error);
}

gboolean
_df_surface_view_gl_read_pixels (DfSurfaceView *self,
                                 int            width,
                                 int            height,
                                 guchar        *pixels)
{
  ViewGl *gl = &self->gl;
  GLenum status;

  _df_surface_view_gl_upload (self);
  /* Render into a framebuffer of our own, so the picture does not depend on what GTK last
   * composited. */
  glGenFramebuffers (1, &gl->fbo);
  glGenRenderbuffers (1, &gl->fbo_colour);
  glGenRenderbuffers (1, &gl->fbo_depth);
  glBindRenderbuffer (GL_RENDERBUFFER, gl->fbo_colour);
  glRenderbufferStorage (GL_RENDERBUFFER, GL_RGBA8, width, height);
  glBindRenderbuffer (GL_RENDERBUFFER, gl->fbo_depth);
  glRenderbufferStorage (GL_RENDERBUFFER, GL_DEPTH_COMPONENT24, width, height);
  glBindFramebuffer (GL_FRAMEBUFFER, gl->fbo);
  glFramebufferRenderbuffer (GL_FRAMEBUFFER, GL_COLOR_ATTACHMENT0, GL_RENDERBUFFER,
                             gl->fbo_colour);
  glFramebufferRenderbuffer (GL_FRAMEBUFFER, GL_DEPTH_ATTACHMENT, GL_RENDERBUFFER,
                             gl->fbo_depth);
  status = glCheckFramebufferStatus (GL_FRAMEBUFFER);
  if (status == GL_FRAMEBUFFER_COMPLETE)
    {
      _df_surface_view_gl_draw (self, width, height, FALSE);
      glPixelStorei (GL_PACK_ALIGNMENT, 1);
      glReadPixels (0, 0, width, height, GL_RGBA, GL_UNSIGNED_BYTE, pixels);
    }
  else
    g_debug ("offscreen framebuffer incomplete: status 0x%x", status);
  glDeleteFramebuffers (1, &gl->fbo);
  glDeleteRenderbuffers (1, &gl->fbo_colour);
  glDeleteRenderbuffers (1, &gl->fbo_depth);
  gl->fbo = gl->fbo_colour = gl->fbo_depth = 0;
  gtk_gl_area_attach_buffers (GTK_GL_AREA (self));
  return status == GL_FRAMEBUFFER_COMPLETE;
}
