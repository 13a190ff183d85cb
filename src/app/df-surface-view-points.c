/* df-surface-view-points.c: DfSurfaceView's data points: the measured points a surface was
 * fitted to, drawn as small round discs (GL point sprites, shaders/points.*) over the surface,
 * each in the colour its owner gives (their deviation from the fit). Visible points are drawn
 * full, hidden ones as a faint ghost, as the loops are. Only draws. */
#include "df-surface-view-private.h"
#include "df-surface-view-points.h"

#include "df-gl-program.h"

#define SHADER_PREFIX "/org/driftframe/Driftframe/shaders/"

/* Disc size in widget pixels: big enough to see its colour, small enough that a 200 x 200
 * thinned grid still shows the surface between the points. */
#define POINT_SIZE_PX 6.0f
#define POINT_GHOST_ALPHA 0.18f

gboolean
_df_surface_view_points_create (ViewPoints  *points,
                                GError     **error)
{
  glGenVertexArrays (1, &points->vao);
  glGenBuffers (1, &points->vbo);
  glBindVertexArray (points->vao);
  glBindBuffer (GL_ARRAY_BUFFER, points->vbo);
  glEnableVertexAttribArray (0);
  glVertexAttribPointer (0, 3, GL_FLOAT, GL_FALSE, POINT_STRIDE * sizeof (float), (void *) 0);
  glEnableVertexAttribArray (1);
  glVertexAttribPointer (1, 3, GL_FLOAT, GL_FALSE, POINT_STRIDE * sizeof (float),
                         (void *) (3 * sizeof (float)));
  glBindVertexArray (0);
  glBindBuffer (GL_ARRAY_BUFFER, 0);
  if (!df_gl_program_build (&points->program, SHADER_PREFIX "points.vert",
                            SHADER_PREFIX "points.frag", error))
    return FALSE;
  points->view = glGetUniformLocation (points->program, "u_view");
  points->proj = glGetUniformLocation (points->program, "u_proj");
  points->bias = glGetUniformLocation (points->program, "u_bias");
  points->size = glGetUniformLocation (points->program, "u_size");
  points->alpha = glGetUniformLocation (points->program, "u_alpha");
  points->count = 0;
  /* A new context has none of the data yet. */
  points->dirty = TRUE;
  return TRUE;
}

void
_df_surface_view_points_delete (ViewPoints *points)
{
  if (points->program != 0)
    glDeleteProgram (points->program);
  if (points->vao != 0)
    glDeleteVertexArrays (1, &points->vao);
  if (points->vbo != 0)
    glDeleteBuffers (1, &points->vbo);
  points->program = points->vao = points->vbo = 0;
  points->count = 0;
}

void
_df_surface_view_points_clear (ViewPoints *points)
{
  g_clear_pointer (&points->data, g_free);
  points->n = 0;
}

void
_df_surface_view_points_upload (ViewPoints *points)
{
  if (!points->dirty || points->vbo == 0)
    return;
  glBindBuffer (GL_ARRAY_BUFFER, points->vbo);
  glBufferData (GL_ARRAY_BUFFER, points->n * POINT_STRIDE * sizeof (float),
                points->n > 0 ? points->data : NULL, GL_STATIC_DRAW);
  glBindBuffer (GL_ARRAY_BUFFER, 0);
  points->count = points->n;
  points->dirty = FALSE;
}

void
_df_surface_view_points_draw (DfSurfaceView *self,
                              const float   *view,
                              const float   *proj)
{
  ViewPoints *points = &self->points;
  float size = POINT_SIZE_PX * gtk_widget_get_scale_factor (GTK_WIDGET (self));

  if (points->count == 0 || points->program == 0)
    return;
  glEnable (GL_PROGRAM_POINT_SIZE);
  glEnable (GL_BLEND);
  glBlendFuncSeparate (GL_SRC_ALPHA, GL_ONE_MINUS_SRC_ALPHA, GL_ONE, GL_ONE_MINUS_SRC_ALPHA);
  glUseProgram (points->program);
  glUniformMatrix4fv (points->view, 1, GL_FALSE, view);
  glUniformMatrix4fv (points->proj, 1, GL_FALSE, proj);
  glUniform1f (points->bias, OVERLAY_BIAS);
  glUniform1f (points->size, size);
  glBindVertexArray (points->vao);
  /* Hidden points first, faint and without depth writes; then the visible ones. */
  glDepthMask (GL_FALSE);
  glDepthFunc (GL_GREATER);
  glUniform1f (points->alpha, POINT_GHOST_ALPHA);
  glDrawArrays (GL_POINTS, 0, points->count);
  glDepthFunc (GL_LEQUAL);
  glUniform1f (points->alpha, 1.0f);
  glDrawArrays (GL_POINTS, 0, points->count);
  glDepthMask (GL_TRUE);
  glDepthFunc (GL_LESS);
  glDisable (GL_BLEND);
  glDisable (GL_PROGRAM_POINT_SIZE);
  glBindVertexArray (0);
  glUseProgram (0);
}

void
df_surface_view_set_points (DfSurfaceView *self,
                            const float   *xyz_rgb,
                            gsize          n)
{
  g_return_if_fail (DF_IS_SURFACE_VIEW (self));
  g_return_if_fail (n == 0 || xyz_rgb != NULL);

  _df_surface_view_points_clear (&self->points);
  if (n > 0)
    self->points.data = g_memdup2 (xyz_rgb, n * POINT_STRIDE * sizeof (float));
  self->points.n = n;
  self->points.dirty = TRUE;
  gtk_gl_area_queue_render (GTK_GL_AREA (self));
}
