/* df-surface-view-overlay.c: the vertex arrays of what DfSurfaceView draws over the surface:
 * polylines as segment pairs for the wide-line shader, arrows as a shaft plus a closed cone, the
 * marker as a ball. Sizes are fractions of the surface's size. No GL here: render() uploads. */
#include "df-surface-view-private.h"

#include <math.h>

static void
push_line_vertex (GArray        *out,
                  const double   p[3],
                  const GdkRGBA *c,
                  float          alpha,
                  float          width)
{
  float v[LINE_STRIDE] = { p[0], p[1], p[2], c->red, c->green, c->blue, c->alpha * alpha, width };

  g_array_append_vals (out, v, LINE_STRIDE);
}

static void
push_segment (GArray        *out,
              const double   a[3],
              const double   b[3],
              const GdkRGBA *c,
              float          alpha,
              float          width)
{
  for (int i = 0; i < 3; i++)
    if (!isfinite (a[i]) || !isfinite (b[i]))
      return;
  push_line_vertex (out, a, c, alpha, width);
  push_line_vertex (out, b, c, alpha, width);
}

static void
push_solid_vertex (GArray        *out,
                   const double   p[3],
                   const double   n[3],
                   const GdkRGBA *c)
{
  float v[SOLID_STRIDE] = { p[0], p[1], p[2], n[0], n[1], n[2],
                            c->red, c->green, c->blue, c->alpha };

  g_array_append_vals (out, v, SOLID_STRIDE);
}

static double
norm3 (const double a[3])
{
  return sqrt (a[0] * a[0] + a[1] * a[1] + a[2] * a[2]);
}

/* Two unit vectors completing unit d to an orthonormal basis. */
static void
orthonormal_basis (const double d[3],
                   double       e1[3],
                   double       e2[3])
{
  double helper[3] = { 1, 0, 0 }, len;

  if (fabs (d[0]) > 0.8)
    {
      helper[0] = 0;
      helper[1] = 1;
    }
  e1[0] = d[1] * helper[2] - d[2] * helper[1];
  e1[1] = d[2] * helper[0] - d[0] * helper[2];
  e1[2] = d[0] * helper[1] - d[1] * helper[0];
  len = norm3 (e1);
  for (int i = 0; i < 3; i++)
    e1[i] /= len;
  e2[0] = d[1] * e1[2] - d[2] * e1[1];
  e2[1] = d[2] * e1[0] - d[0] * e1[2];
  e2[2] = d[0] * e1[1] - d[1] * e1[0];
}

/* A shaft (thick line) ending in a closed cone, the arrow's head, at origin + length * dir. */
static void
push_arrow (DfSurfaceView *self,
            const double   origin[3],
            const double   dir_in[3],
            double         length,
            const GdkRGBA *colour,
            float          width)
{
  enum { SIDES = 14 };
  double dir[3], e1[3], e2[3], tip[3], base[3], shaft_end[3], len = norm3 (dir_in);
  double head = 0.26 * length, radius = 0.08 * length;

  if (!(len > 0) || !isfinite (len) || !isfinite (norm3 (origin)))
    return;
  for (int i = 0; i < 3; i++)
    {
      dir[i] = dir_in[i] / len;
      tip[i] = origin[i] + length * dir[i];
      base[i] = tip[i] - head * dir[i];
      shaft_end[i] = tip[i] - 0.8 * head * dir[i];
    }
  push_segment (self->line_data, origin, shaft_end, colour, 1, width);
  orthonormal_basis (dir, e1, e2);
  for (int k = 0; k < SIDES; k++)
    {
      double a0 = 2 * G_PI * k / SIDES, a1 = 2 * G_PI * (k + 1) / SIDES, am = 0.5 * (a0 + a1);
      double r0[3], r1[3], rm[3], p0[3], p1[3], n0[3], n1[3], nm[3], back[3];
      for (int i = 0; i < 3; i++)
        {
          r0[i] = cos (a0) * e1[i] + sin (a0) * e2[i];
          r1[i] = cos (a1) * e1[i] + sin (a1) * e2[i];
          rm[i] = cos (am) * e1[i] + sin (am) * e2[i];
          p0[i] = base[i] + radius * r0[i];
          p1[i] = base[i] + radius * r1[i];
          /* The cone's normal leans toward the tip by the half-angle. */
          n0[i] = head * r0[i] + radius * dir[i];
          n1[i] = head * r1[i] + radius * dir[i];
          nm[i] = head * rm[i] + radius * dir[i];
          back[i] = -dir[i];
        }
      push_solid_vertex (self->solid_data, tip, nm, colour);
      push_solid_vertex (self->solid_data, p0, n0, colour);
      push_solid_vertex (self->solid_data, p1, n1, colour);
      push_solid_vertex (self->solid_data, base, back, colour);
      push_solid_vertex (self->solid_data, p1, back, colour);
      push_solid_vertex (self->solid_data, p0, back, colour);
    }
}

static void
push_ball (DfSurfaceView *self,
           const double   centre[3],
           double         radius,
           const GdkRGBA *colour)
{
  enum { SLICES = 18, STACKS = 10 };

  for (int i = 0; i < STACKS; i++)
    for (int j = 0; j < SLICES; j++)
      {
        double corner[4][3];
        for (int c = 0; c < 4; c++)
          {
            double th = G_PI * (i + (c == 1 || c == 2)) / STACKS;
            double ph = 2 * G_PI * (j + (c >= 2)) / SLICES;
            corner[c][0] = sin (th) * cos (ph);
            corner[c][1] = sin (th) * sin (ph);
            corner[c][2] = cos (th);
          }
        {
          static const int order[6] = { 0, 1, 2, 0, 2, 3 };
          for (int t = 0; t < 6; t++)
            {
              double p[3];
              for (int a = 0; a < 3; a++)
                p[a] = centre[a] + radius * corner[order[t]][a];
              push_solid_vertex (self->solid_data, p, corner[order[t]], colour);
            }
        }
      }
}

static double
scene_size (DfSurfaceView *self)
{
  if (self->mesh != NULL && self->mesh->mesh != NULL)
    return self->mesh->size;
  if (self->surface != NULL)
    return df_surface_size (self->surface);
  return 1;
}

/* Turns curves, frames, arrows and the marker into vertex arrays; render() only uploads them.
 * Sizes follow the surface, so this runs again whenever the mesh changes. */
void
_df_surface_view_rebuild_overlay (DfSurfaceView *self)
{
  /* Ink-dark carried vectors read on every colour of the blue-white-orange scale; the partner
   * is a green, a hue the scale does not use; the returned vector is a strong magenta against
   * the ink start vector, so the two compare at a glance. */
  static const GdkRGBA carried = { 0.10f, 0.10f, 0.14f, 0.9f };
  static const GdkRGBA partner = { 0.04f, 0.48f, 0.30f, 0.85f };
  static const GdkRGBA start = { 0.05f, 0.05f, 0.07f, 1.0f };
  static const GdkRGBA returned = { 0.85f, 0.05f, 0.55f, 1.0f };
  double size = scene_size (self);
  double frame_size = size;
  GHashTableIter iter;
  gpointer value;

  /* Frame arrows scale with the loop as well as the surface: on a small loop arrows sized for
   * the whole part make a cage larger than the loop. A quarter of the extent of the frame
   * origins keeps them inside it (common practice, no source). */
  if (self->n_frames > 1)
    {
      double lo[3] = { G_MAXDOUBLE, G_MAXDOUBLE, G_MAXDOUBLE };
      double hi[3] = { -G_MAXDOUBLE, -G_MAXDOUBLE, -G_MAXDOUBLE };
      double extent;

      for (gsize i = 0; i < self->n_frames; i++)
        for (int k = 0; k < 3; k++)
          {
            lo[k] = MIN (lo[k], self->frames[9 * i + k]);
            hi[k] = MAX (hi[k], self->frames[9 * i + k]);
          }
      extent = sqrt ((hi[0] - lo[0]) * (hi[0] - lo[0]) + (hi[1] - lo[1]) * (hi[1] - lo[1])
                     + (hi[2] - lo[2]) * (hi[2] - lo[2]));
      if (extent > 0 && 0.25 * extent < HIGHLIGHT_LENGTH * size)
        frame_size = 0.25 * extent / HIGHLIGHT_LENGTH;
    }

  g_array_set_size (self->line_data, 0);
  g_array_set_size (self->solid_data, 0);

  g_hash_table_iter_init (&iter, self->curves);
  while (g_hash_table_iter_next (&iter, NULL, &value))
    {
      Curve *c = value;
      for (gsize i = 0; i + 1 < c->n; i++)
        push_segment (self->line_data, c->xyz[i], c->xyz[i + 1], &c->colour, 1, c->width);
      if (c->closed && c->n > 2)
        push_segment (self->line_data, c->xyz[c->n - 1], c->xyz[0], &c->colour, 1, c->width);
    }

  for (gsize i = 0; i < self->n_frames; i++)
    {
      const double *f = &self->frames[9 * i];
      gboolean first = i == 0, last = i + 1 == self->n_frames && i > 0;
      double length = (first || last ? HIGHLIGHT_LENGTH : FRAME_LENGTH) * frame_size;

      if (first || last)
        continue;   /* drawn after the others, so they stay on top */
      push_arrow (self, f, f + 6, 0.7 * length, &partner, 1.5f);
      push_arrow (self, f, f + 3, length, &carried, 2.0f);
    }
  if (self->n_frames > 0)
    {
      gsize ends[2] = { 0, self->n_frames - 1 };
      for (int e = 0; e < (self->n_frames > 1 ? 2 : 1); e++)
        {
          const double *f = &self->frames[9 * ends[e]];
          double length = HIGHLIGHT_LENGTH * frame_size;
          push_arrow (self, f, f + 6, 0.7 * length, &partner, 2.5f);
          push_arrow (self, f, f + 3, length, e == 0 ? &start : &returned, 3.5f);
        }
    }

  g_hash_table_iter_init (&iter, self->arrows);
  while (g_hash_table_iter_next (&iter, NULL, &value))
    {
      Arrow *a = value;
      push_arrow (self, a->origin, a->dir, HIGHLIGHT_LENGTH * size, &a->colour, 3.5f);
    }

  _df_surface_view_net_append (self);

  if (self->has_marker)
    push_ball (self, self->marker, MARKER_RADIUS * size, &self->marker_colour);

  self->overlay_dirty = TRUE;
  gtk_gl_area_queue_render (GTK_GL_AREA (self));
}

void
_df_surface_view_curve_free (Curve *curve)
{
  g_free (curve->xyz);
  g_free (curve);
}
