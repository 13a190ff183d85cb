/* df-report-devmap.c: the developability map drawn as a PNG (see df-report-devmap.h). The
 * map's grid is sampled bilinearly at the picture mesh's chart points; a cell with a corner
 * whose disc could not be built is left grey rather than guessed. Reader/writer layer. */
#include "df-report-devmap.h"

#include <math.h>

#include <cairo.h>

#include "df-io-error.h"
#include "df-report.h"
#include "df-report-picture.h"

/* The index i with lines[i] <= x < lines[i + 1] (clamped) and the fraction within. */
static size_t
bracket (const double *lines, size_t n, double x, double *f)
{
  size_t i = 0;

  if (x <= lines[0])
    {
      *f = 0;
      return 0;
    }
  if (x >= lines[n - 1])
    {
      *f = 1;
      return n - 2;
    }
  while (i + 2 < n && lines[i + 1] <= x)
    i++;
  *f = (x - lines[i]) / (lines[i + 1] - lines[i]);
  return i;
}

static double
strain_at (double u, double v, void *user)
{
  const df_devmap *map = user;
  double fu, fv, s = 0;
  size_t i = bracket (map->u, map->nu, u, &fu), j = bracket (map->v, map->nv, v, &fv);

  for (int dj = 0; dj < 2; dj++)
    for (int di = 0; di < 2; di++)
      {
        const df_devmap_point *p = &map->points[(j + dj) * map->nu + i + di];
        double w = (di ? fu : 1 - fu) * (dj ? fv : 1 - fv);

        if (!p->ok)
          {
            if (w > 0)
              return NAN;
            continue;
          }
        s += w * 100 * p->strain;
      }
  return s;
}

static cairo_status_t
append (void *closure, const unsigned char *data, unsigned int length)
{
  g_byte_array_append (closure, data, length);
  return CAIRO_STATUS_SUCCESS;
}

gboolean
df_devmap_png_write (const char *path, const df_surface *surface, const df_devmap *map,
                     int width, int height, double max_strain_percent, const char *units,
                     double a_display, const char *caution, GError **error)
{
  g_autoptr (GPtrArray) strings = g_ptr_array_new_with_free_func (g_free);
  g_autoptr (GByteArray) png = g_byte_array_new ();
  df_picture_colouring col = { .value_at = strain_at, .user = (void *) map };
  cairo_surface_t *img;
  cairo_t *cr;
  double range = 0, sx, sy;
  gboolean ok;

  if (width < 200 || width > 8000 || height < 200 || height > 8000)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE, "%s: picture size %d x %d outside "
                   "[200, 8000]", path, width, height);
      return FALSE;
    }
  for (size_t k = 0; k < map->nu * map->nv; k++)
    if (map->points[k].ok)
      range = fmax (range, fabs (100 * map->points[k].strain));
  if (isfinite (max_strain_percent))
    {
      /* The limit stays on the scale even where the map is below it. */
      range = fmax (range, 1.1 * max_strain_percent);
      col.has_mark = TRUE;
      col.mark = max_strain_percent;
      col.mark_label = df_report_keep (strings, g_strdup_printf (
        "limit %s %%", df_report_num (strings, max_strain_percent, 4)));
    }
  col.range = range > 0 ? range : 1;
  col.caption = df_report_keep (strings, g_strdup_printf (
    "Rim strain of a flat disc of radius %s %s, %% (> 0 the rim must shrink, < 0 stretch)",
    df_report_num (strings, a_display, 5), units));

  img = cairo_image_surface_create (CAIRO_FORMAT_RGB24, width, height);
  cr = cairo_create (img);
  cairo_set_source_rgb (cr, 1, 1, 1);
  cairo_paint (cr);
  /* Laid out on a 600-point-wide page, scaled to the pixels asked for. */
  sx = width / 600.0;
  sy = height / (600.0 * height / width);
  cairo_scale (cr, sx, sy);
  ok = df_report_draw_picture_coloured (cr, 10, 10, 580, 600.0 * height / width - 40,
                                        DF_REPORT_DEFAULT_YAW_DEG, DF_REPORT_DEFAULT_PITCH_DEG,
                                        surface, units, &col, NULL, 0, error);
  if (ok && caution != NULL)
    {
      cairo_set_source_rgb (cr, 0.2, 0.2, 0.2);
      cairo_select_font_face (cr, "sans-serif", CAIRO_FONT_SLANT_NORMAL,
                              CAIRO_FONT_WEIGHT_NORMAL);
      cairo_set_font_size (cr, 7);
      cairo_move_to (cr, 10, 600.0 * height / width - 12);
      cairo_show_text (cr, caution);
    }
  cairo_destroy (cr);
  if (ok && cairo_surface_write_to_png_stream (img, append, png) != CAIRO_STATUS_SUCCESS)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FILE, "%s: the picture could not be encoded",
                   path);
      ok = FALSE;
    }
  cairo_surface_destroy (img);
  if (!ok)
    return FALSE;
  return df_write_file_atomic (path, (const char *) png->data, png->len, error);
}
