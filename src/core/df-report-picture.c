/* df-report-picture.c: the report's shaded orthographic picture of a surface with its loops and
 * curvature legend, drawn with cairo from the core's display mesh (no GL, no display: the CLI
 * writes reports on a server). The surface is painted back to front into an image (painter's
 * order per triangle, fine for a display mesh whose triangles are small), the loops and the
 * legend as vectors on top so they stay sharp when printed. Reader/writer layer. */
#include "df-report-picture.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "df-colour-ramp.h"
#include "df-io-error.h"
#include "df-mesh.h"
#include "df-vec3.h"

/* Resolution of the painted surface: 3 pixels per point is 216 dpi, sharp on paper yet a
 * picture of a few hundred kB. */
#define PX_PER_PT     3.0
#define MAX_IMAGE_PX  2400
#define LEGEND_HEIGHT 40.0
/* Mesh density of the picture: enough for a smooth silhouette at print size. */
#define PICTURE_MAX_VERTICES 40000

static void
normalize3 (double v[3])
{
  double n = sqrt (df_dot3 (v, v));

  if (n > 0)
    for (int i = 0; i < 3; i++)
      v[i] /= n;
}

typedef struct
{
  double right[3], up[3], eye[3];  /* orthonormal; eye points from the surface to the viewer */
  double key[3];                   /* key light direction */
  double scale, ox, oy;            /* screen (pt) = scale * (p.right, -p.up) + (ox, oy) */
} view;

static void
view_init (view *v, double yaw_deg, double pitch_deg)
{
  const double az = yaw_deg * M_PI / 180, el = fmax (-89.9, fmin (89.9, pitch_deg)) * M_PI / 180;
  const double z[3] = { 0, 0, 1 };

  v->eye[0] = cos (el) * cos (az);
  v->eye[1] = cos (el) * sin (az);
  v->eye[2] = sin (el);
  df_cross3 (z, v->eye, v->right);
  normalize3 (v->right);
  df_cross3 (v->eye, v->right, v->up);
  for (int i = 0; i < 3; i++)
    v->key[i] = -0.45 * v->right[i] + 0.65 * v->up[i] + 0.6 * v->eye[i];
  normalize3 (v->key);
}

static void
view_project (const view *v, const double p[3], double *sx, double *sy, double *depth)
{
  *sx = v->scale * df_dot3 (p, v->right) + v->ox;
  *sy = -v->scale * df_dot3 (p, v->up) + v->oy;
  if (depth != NULL)
    *depth = df_dot3 (p, v->eye);
}

/* Fits the valid vertices into the box (x, y, w, h) with a small margin. */
static void
view_fit (view *v, const df_mesh *mesh, double x, double y, double w, double h)
{
  const double *pos = df_mesh_positions (mesh);
  const uint8_t *valid = df_mesh_valid (mesh);
  double lo[2] = { INFINITY, INFINITY }, hi[2] = { -INFINITY, -INFINITY };

  for (size_t i = 0; i < df_mesh_n_vertices (mesh); i++)
    {
      double a, b;

      if (!valid[i])
        continue;
      a = df_dot3 (pos + 3 * i, v->right);
      b = -df_dot3 (pos + 3 * i, v->up);
      lo[0] = fmin (lo[0], a); hi[0] = fmax (hi[0], a);
      lo[1] = fmin (lo[1], b); hi[1] = fmax (hi[1], b);
    }
  if (!(hi[0] > lo[0]))
    hi[0] = lo[0] + 1;
  if (!(hi[1] > lo[1]))
    hi[1] = lo[1] + 1;
  v->scale = 0.94 * fmin (w / (hi[0] - lo[0]), h / (hi[1] - lo[1]));
  v->ox = x + w / 2 - v->scale * (lo[0] + hi[0]) / 2;
  v->oy = y + h / 2 - v->scale * (lo[1] + hi[1]) / 2;
}

typedef struct
{
  double depth;
  uint32_t tri;
} depth_key;

static int
depth_cmp (const void *a, const void *b)
{
  double da = ((const depth_key *) a)->depth, db = ((const depth_key *) b)->depth;

  return (da > db) - (da < db);
}

/* A depth buffer of the surface in image pixels, for telling which stretches of a loop the
 * surface hides. Filled by barycentric rasterisation of every triangle. */
typedef struct
{
  int w, h;
  float *z;
} depth_buffer;

static void
depth_buffer_fill (depth_buffer *zb, const view *v, const df_mesh *mesh, double px, double ox,
                   double oy)
{
  const double *pos = df_mesh_positions (mesh);
  const uint32_t *idx = df_mesh_indices (mesh);

  for (int i = 0; i < zb->w * zb->h; i++)
    zb->z[i] = -INFINITY;
  for (size_t t = 0; t < df_mesh_n_triangles (mesh); t++)
    {
      double sx[3], sy[3], d[3], area;
      int x0, x1, y0, y1;

      for (int k = 0; k < 3; k++)
        {
          view_project (v, pos + 3 * idx[3 * t + k], &sx[k], &sy[k], &d[k]);
          sx[k] = (sx[k] - ox) * px;
          sy[k] = (sy[k] - oy) * px;
        }
      area = (sx[1] - sx[0]) * (sy[2] - sy[0]) - (sx[2] - sx[0]) * (sy[1] - sy[0]);
      if (fabs (area) < 1e-12)
        continue;
      x0 = (int) fmax (0, floor (fmin (sx[0], fmin (sx[1], sx[2]))));
      x1 = (int) fmin (zb->w - 1, ceil (fmax (sx[0], fmax (sx[1], sx[2]))));
      y0 = (int) fmax (0, floor (fmin (sy[0], fmin (sy[1], sy[2]))));
      y1 = (int) fmin (zb->h - 1, ceil (fmax (sy[0], fmax (sy[1], sy[2]))));
      for (int py = y0; py <= y1; py++)
        for (int qx = x0; qx <= x1; qx++)
          {
            double cx = qx + 0.5, cy = py + 0.5, b0, b1, b2, z;

            b0 = ((sx[1] - cx) * (sy[2] - cy) - (sx[2] - cx) * (sy[1] - cy)) / area;
            b1 = ((sx[2] - cx) * (sy[0] - cy) - (sx[0] - cx) * (sy[2] - cy)) / area;
            b2 = 1 - b0 - b1;
            if (b0 < -1e-9 || b1 < -1e-9 || b2 < -1e-9)
              continue;
            z = b0 * d[0] + b1 * d[1] + b2 * d[2];
            if (z > zb->z[py * zb->w + qx])
              zb->z[py * zb->w + qx] = (float) z;
          }
    }
}

/* Is a point at screen (sx, sy) and depth d in front of the surface there? A tolerance of a
 * hundredth of the surface's size keeps a loop lying on the surface visible; the nearest
 * 3 x 3 pixels are asked so that a loop on a silhouette is not lost to rounding. */
static gboolean
depth_buffer_visible (const depth_buffer *zb, double ix, double iy, double d, double tol)
{
  int cx = (int) floor (ix), cy = (int) floor (iy);
  double front = -INFINITY;

  for (int dy = -1; dy <= 1; dy++)
    for (int dx = -1; dx <= 1; dx++)
      {
        int qx = cx + dx, qy = cy + dy;

        if (qx >= 0 && qy >= 0 && qx < zb->w && qy < zb->h)
          front = fmax (front, zb->z[qy * zb->w + qx]);
      }
  return !isfinite (front) || d >= front - tol;
}

static double
shade (const view *v, const double n[3])
{
  double nn[3] = { n[0], n[1], n[2] };

  /* Two-sided, as in the app: the back of the sheet lit with its flipped normal. */
  if (df_dot3 (nn, v->eye) < 0)
    for (int i = 0; i < 3; i++)
      nn[i] = -nn[i];
  return fmin (1.0, 0.3 + 0.45 * fmax (df_dot3 (nn, v->key), 0) + 0.35 * df_dot3 (nn,
                                                                                     v->eye));
}

/* Paints the mesh back to front into an image of the box and returns it. */
/* kk: the value per vertex shaded on the diverging ramp over [-range, range]; a triangle with
 * a non-finite value (no value there) is drawn grey. */
static cairo_surface_t *
paint_surface (const view *v, const df_mesh *mesh, const double *kk, double range, double x,
               double y, double w, double h, double px)
{
  const double *pos = df_mesh_positions (mesh), *nrm = df_mesh_normals (mesh);
  const uint32_t *idx = df_mesh_indices (mesh);
  size_t nt = df_mesh_n_triangles (mesh);
  int iw = (int) ceil (w * px), ih = (int) ceil (h * px);
  cairo_surface_t *img = cairo_image_surface_create (CAIRO_FORMAT_ARGB32, iw, ih);
  cairo_t *cr = cairo_create (img);
  depth_key *order = malloc (nt * sizeof *order);

  if (order == NULL)
    {
      cairo_destroy (cr);
      return img;
    }
  for (size_t t = 0; t < nt; t++)
    {
      order[t].tri = (uint32_t) t;
      order[t].depth = 0;
      for (int k = 0; k < 3; k++)
        order[t].depth += df_dot3 (pos + 3 * idx[3 * t + k], v->eye);
    }
  qsort (order, nt, sizeof *order, depth_cmp);

  /* Without antialiasing, neighbouring triangles cover complementary pixels: no seams. */
  cairo_set_antialias (cr, CAIRO_ANTIALIAS_NONE);
  cairo_scale (cr, px, px);
  cairo_translate (cr, -x, -y);
  for (size_t o = 0; o < nt; o++)
    {
      const uint32_t *tri = idx + 3 * order[o].tri;
      double n[3] = { 0, 0, 0 }, kavg = 0, rgb[3], light;

      for (int k = 0; k < 3; k++)
        {
          double sx, sy;

          view_project (v, pos + 3 * tri[k], &sx, &sy, NULL);
          if (k == 0)
            cairo_move_to (cr, sx, sy);
          else
            cairo_line_to (cr, sx, sy);
          for (int i = 0; i < 3; i++)
            n[i] += nrm[3 * tri[k] + i];
          kavg += kk[tri[k]] / 3;
        }
      cairo_close_path (cr);
      normalize3 (n);
      if (isfinite (kavg))
        df_colour_ramp (range > 0 ? kavg / range : 0, rgb);
      else
        rgb[0] = rgb[1] = rgb[2] = 0.7;
      light = shade (v, n);
      cairo_set_source_rgb (cr, rgb[0] * light, rgb[1] * light, rgb[2] * light);
      cairo_fill (cr);
    }
  free (order);
  cairo_destroy (cr);
  return img;
}

static void
format_number (char *buf, size_t len, double value)
{
  if (!isfinite (value))
    g_strlcpy (buf, "n/a", len);
  else if (value == 0)
    g_strlcpy (buf, "0", len);
  else
    g_snprintf (buf, len, "%.3g", value);
}

/* Boxes of the labels placed so far, so that a label moves down past those it would cover
 * (two curves that start at one point). */
typedef struct
{
  double box[64][4];
  int n;
} label_boxes;

static gboolean
boxes_overlap (const double a[4], const double b[4])
{
  return a[0] < b[2] && b[0] < a[2] && a[1] < b[3] && b[1] < a[3];
}

static void
draw_text_placed (cairo_t *cr, double x, double y, const char *text, double size,
                  gboolean centre, gboolean backdrop, label_boxes *placed)
{
  cairo_text_extents_t ext;

  cairo_select_font_face (cr, "DejaVu Sans", CAIRO_FONT_SLANT_NORMAL, CAIRO_FONT_WEIGHT_NORMAL);
  cairo_set_font_size (cr, size);
  cairo_text_extents (cr, text, &ext);
  if (centre)
    x -= ext.width / 2 + ext.x_bearing;
  if (placed != NULL)
    {
      double b[4];

      for (int tries = 0; tries < 16; tries++)
        {
          gboolean clear = TRUE;

          b[0] = x + ext.x_bearing - 2;
          b[1] = y + ext.y_bearing - 1.5;
          b[2] = b[0] + ext.width + 4;
          b[3] = b[1] + ext.height + 3;
          for (int k = 0; k < placed->n && clear; k++)
            clear = !boxes_overlap (b, placed->box[k]);
          if (clear)
            break;
          y += ext.height + 3;
        }
      if (placed->n < (int) G_N_ELEMENTS (placed->box))
        memcpy (placed->box[placed->n++], b, sizeof b);
    }
  if (backdrop)
    {
      cairo_save (cr);
      cairo_set_source_rgba (cr, 1, 1, 1, 0.85);
      cairo_rectangle (cr, x + ext.x_bearing - 2, y + ext.y_bearing - 1.5, ext.width + 4,
                       ext.height + 3);
      cairo_fill (cr);
      cairo_restore (cr);
    }
  cairo_move_to (cr, x, y);
  cairo_show_text (cr, text);
}

static void
draw_text (cairo_t *cr, double x, double y, const char *text, double size, gboolean centre,
           gboolean backdrop)
{
  draw_text_placed (cr, x, y, text, size, centre, backdrop, NULL);
}

/* A mark at value on the legend bar (bx..bx+bw over -range..range): a tick through the bar
 * with its label, so it reads without colour. */
static void
draw_legend_mark (cairo_t *cr, double bx, double by, double bw, double bh, double range,
                  double value, const char *label)
{
  double mx = bx + bw * (0.5 + 0.5 * value / range);

  if (!(range > 0) || !isfinite (value) || fabs (value) > range)
    return;
  cairo_save (cr);
  cairo_set_source_rgb (cr, 0, 0, 0);
  cairo_set_line_width (cr, 1.2);
  cairo_move_to (cr, mx, by - 1);
  cairo_line_to (cr, mx, by + bh + 3);
  cairo_stroke (cr);
  draw_text (cr, mx, by + bh + 17, label, 6.5, TRUE, FALSE);
  cairo_restore (cr);
}

static void
draw_legend (cairo_t *cr, double x, double y, double w, double range, const char *units)
{
  double bw = fmin (w * 0.6, 260), bx = x + (w - bw) / 2, by = y + 8, bh = 9;
  cairo_pattern_t *grad = cairo_pattern_create_linear (bx, 0, bx + bw, 0);
  char lo[32], hi[32], caption[96];

  for (int i = 0; i <= 8; i++)
    {
      double rgb[3];

      df_colour_ramp (i / 4.0 - 1, rgb);
      cairo_pattern_add_color_stop_rgb (grad, i / 8.0, rgb[0], rgb[1], rgb[2]);
    }
  cairo_rectangle (cr, bx, by, bw, bh);
  cairo_set_source (cr, grad);
  cairo_fill_preserve (cr);
  cairo_pattern_destroy (grad);
  cairo_set_source_rgb (cr, 0.3, 0.3, 0.3);
  cairo_set_line_width (cr, 0.5);
  cairo_stroke (cr);

  cairo_set_source_rgb (cr, 0.1, 0.1, 0.1);
  if (range > 0)
    {
      format_number (lo, sizeof lo, -range);
      format_number (hi, sizeof hi, range);
      draw_text (cr, bx, by + bh + 9, lo, 7, TRUE, FALSE);
      draw_text (cr, bx + bw / 2, by + bh + 9, "0", 7, TRUE, FALSE);
      draw_text (cr, bx + bw, by + bh + 9, hi, 7, TRUE, FALSE);
      g_snprintf (caption, sizeof caption, "Gaussian curvature K, 1/%s\xc2\xb2", units);
    }
  else
    g_snprintf (caption, sizeof caption, "Gaussian curvature K = 0 everywhere (developable)");
  draw_text (cr, bx + bw / 2, by - 2, caption, 7.5, TRUE, FALSE);
}

/* The legend of a user colouring: its caption, its range, and the marks. */
static void
draw_legend_colouring (cairo_t *cr, double x, double y, double w,
                       const df_picture_colouring *c)
{
  char caption[200];

  draw_legend (cr, x, y, w, c->range, "unit");
  /* Over the K caption: the colouring's own. */
  {
    double bw = fmin (w * 0.6, 260), bx = x + (w - bw) / 2, by = y + 8, bh = 9;

    cairo_save (cr);
    cairo_set_source_rgb (cr, 1, 1, 1);
    cairo_rectangle (cr, x, y, w, by - y - 0.5);
    cairo_fill (cr);
    cairo_set_source_rgb (cr, 0.1, 0.1, 0.1);
    g_snprintf (caption, sizeof caption, "%s", c->caption != NULL ? c->caption : "");
    draw_text (cr, bx + bw / 2, by - 2, caption, 7.5, TRUE, FALSE);
    cairo_restore (cr);
    if (c->has_mark)
      {
        draw_legend_mark (cr, bx, by, bw, bh, c->range, c->mark, c->mark_label);
        draw_legend_mark (cr, bx, by, bw, bh, c->range, -c->mark, c->mark_label);
      }
  }
}

static void
draw_curves (cairo_t *cr, const view *v, const depth_buffer *zb, double px, double ox,
             double oy, double tol, const df_picture_curve *curves, gsize n_curves)
{
  label_boxes placed = { .n = 0 };

  for (gsize c = 0; c < n_curves; c++)
    {
      const df_picture_curve *pc = &curves[c];
      gsize n = pc->n, segs = pc->closed ? n : n - 1;
      double label_x = 0, label_y = INFINITY, hidden_x = 0, hidden_y = INFINITY;

      if (n < 2)
        continue;
      cairo_set_line_cap (cr, CAIRO_LINE_CAP_ROUND);
      for (int pass = 0; pass < 2; pass++)
        for (gsize i = 0; i < segs; i++)
          {
            double ax, ay, ad, bx, by, bd;
            gboolean vis;

            view_project (v, pc->xyz[i], &ax, &ay, &ad);
            view_project (v, pc->xyz[(i + 1) % n], &bx, &by, &bd);
            vis = depth_buffer_visible (zb, ((ax + bx) / 2 - ox) * px, ((ay + by) / 2 - oy) * px,
                                        (ad + bd) / 2, tol);
            if (pass == 1 && vis && ay < label_y)
              {
                label_y = ay;
                label_x = ax;
              }
            if (pass == 1 && !vis && ay < hidden_y)
              {
                hidden_y = ay;
                hidden_x = ax;
              }
            cairo_move_to (cr, ax, ay);
            cairo_line_to (cr, bx, by);
            if (pass == 0)
              {
                /* A light halo under the visible stretches keeps the line apart from the
                 * shading whatever its colour. */
                if (!vis)
                  {
                    cairo_new_path (cr);
                    continue;
                  }
                cairo_set_source_rgba (cr, 1, 1, 1, 0.9);
                cairo_set_line_width (cr, 3.2);
                cairo_set_dash (cr, NULL, 0, 0);
              }
            else
              {
                double dash[2] = { 2.0, 2.0 };

                cairo_set_source_rgb (cr, pc->rgb[0], pc->rgb[1], pc->rgb[2]);
                cairo_set_line_width (cr, vis ? 1.6 : 0.8);
                cairo_set_dash (cr, vis ? NULL : dash, vis ? 0 : 2, 0);
              }
            cairo_stroke (cr);
          }
      cairo_set_dash (cr, NULL, 0, 0);
      cairo_set_source_rgb (cr, pc->rgb[0] * 0.6, pc->rgb[1] * 0.6, pc->rgb[2] * 0.6);
      if (pc->name != NULL && isfinite (label_y))
        draw_text_placed (cr, label_x, label_y - 5, pc->name, 7.5, TRUE, TRUE, &placed);
      else if (pc->name != NULL && isfinite (hidden_y))
        {
          /* Wholly behind the surface: still named, so every loop of the record is found. */
          g_autofree char *text = g_strdup_printf ("%s (behind)", pc->name);

          draw_text_placed (cr, hidden_x, hidden_y - 5, text, 7.5, TRUE, TRUE, &placed);
        }
    }
}

gboolean
df_report_draw_picture (cairo_t *cr, double x, double y, double w, double h, double yaw_deg,
                        double pitch_deg, const df_surface *surface, const char *units,
                        const df_picture_curve *curves, gsize n_curves, GError **error)
{
  return df_report_draw_picture_coloured (cr, x, y, w, h, yaw_deg, pitch_deg, surface, units,
                                          NULL, curves, n_curves, error);
}

/* k_scale: the legend's K per the square of units is the surface's K times this (the shading
 * is relative to the range, so only the legend's numbers change). */
static gboolean
draw_picture (cairo_t *cr, double x, double y, double w, double h, double yaw_deg,
              double pitch_deg, const df_surface *surface, const char *units, double k_scale,
              const df_picture_colouring *colouring, const df_picture_curve *curves,
              gsize n_curves, GError **error)
{
  double *values = NULL;
  df_mesh_options mo = { PICTURE_MAX_VERTICES, 0, 0 };
  df_mesh *mesh = NULL;
  df_diag diag;
  df_status st;
  view v;
  double ph = h - LEGEND_HEIGHT, px, range, tol;
  cairo_surface_t *img;
  depth_buffer zb;

  df_diag_clear (&diag);
  if ((st = df_mesh_build (surface, &mo, &mesh, &diag)) != DF_OK)
    {
      df_status_to_gerror (st, &diag, error);
      g_prefix_error (error, "picture: ");
      return FALSE;
    }
  view_init (&v, isfinite (yaw_deg) ? yaw_deg : -55, isfinite (pitch_deg) ? pitch_deg : 28);
  view_fit (&v, mesh, x, y, w, ph);
  px = fmin (PX_PER_PT, MAX_IMAGE_PX / fmax (w, ph));
  /* The 99 % area quantile, as the app shades: a cone apex's sliver does not wash out the
   * scale, yet a constant K gets its own value as the range. */
  range = df_mesh_abs_quantile (mesh, DF_MESH_GAUSSIAN, 0.99);
  if (colouring != NULL)
    {
      const double *uv = df_mesh_uv (mesh);

      values = g_new (double, df_mesh_n_vertices (mesh));
      for (size_t i = 0; i < df_mesh_n_vertices (mesh); i++)
        values[i] = colouring->value_at (uv[2 * i], uv[2 * i + 1], colouring->user);
      range = colouring->range;
    }

  img = paint_surface (&v, mesh, values != NULL ? values : df_mesh_gaussian (mesh), range, x, y,
                       w, ph, px);
  g_free (values);
  cairo_save (cr);
  cairo_rectangle (cr, x, y, w, ph);
  cairo_clip (cr);
  cairo_translate (cr, x, y);
  cairo_scale (cr, 1 / px, 1 / px);
  cairo_set_source_surface (cr, img, 0, 0);
  cairo_paint (cr);
  cairo_restore (cr);
  cairo_surface_destroy (img);

  /* Visibility at a quarter of the painting's resolution is plenty for dashing a line. */
  zb.w = (int) ceil (w * px / 4);
  zb.h = (int) ceil (ph * px / 4);
  zb.z = g_new (float, (gsize) zb.w * zb.h);
  depth_buffer_fill (&zb, &v, mesh, px / 4, x, y);
  tol = 0.01 * df_surface_size (surface);
  cairo_save (cr);
  draw_curves (cr, &v, &zb, px / 4, x, y, tol, curves, n_curves);
  cairo_restore (cr);
  g_free (zb.z);

  if (colouring != NULL)
    draw_legend_colouring (cr, x, y + ph, w, colouring);
  else
    draw_legend (cr, x, y + ph, w, range * k_scale, units != NULL ? units : "unit");
  df_mesh_free (mesh);
  return TRUE;
}

gboolean
df_report_draw_picture_coloured (cairo_t *cr, double x, double y, double w, double h,
                                 double yaw_deg, double pitch_deg, const df_surface *surface,
                                 const char *units, const df_picture_colouring *colouring,
                                 const df_picture_curve *curves, gsize n_curves, GError **error)
{
  return draw_picture (cr, x, y, w, h, yaw_deg, pitch_deg, surface, units, 1.0, colouring,
                       curves, n_curves, error);
}

gboolean
df_report_draw_picture_k_scaled (cairo_t *cr, double x, double y, double w, double h,
                                 double yaw_deg, double pitch_deg, const df_surface *surface,
                                 const char *k_units, double k_scale,
                                 const df_picture_curve *curves, gsize n_curves, GError **error)
{
  return draw_picture (cr, x, y, w, h, yaw_deg, pitch_deg, surface, k_units,
                       isfinite (k_scale) && k_scale > 0 ? k_scale : 1.0, NULL, curves,
                       n_curves, error);
}
