/* df-drape-job.c: the drape on a worker thread (see df-drape-job.h). The outline is the loop's
 * spline sampled exactly as `driftframe-cli drape` samples it (df-cli-drape.c: MAX (8 n, 2048)
 * points of df_curve_sample_plane), so the app and the CLI drape the same polygon. The
 * vertices of the threads are made here, off the main thread: a 2 mm net of a 300 mm ply has
 * some 45 000 segments. App layer: calls the core, computes no geometry of its own. */
#include "df-drape-job.h"

#include <math.h>
#include <string.h>

#include "df-colour-ramp.h"
#include "df-glib.h"
#include "df-io-error.h"
#include "df-work-guard.h"

#define NET_STRIDE 8

typedef struct
{
  df_surface      *surface;
  double         (*uv)[2];
  gsize            n;
  double           u, v;
  df_drape_options options;
} Job;

typedef struct
{
  Job           *job;
  DfDrapeResult *result;
  GError        *error;
} Guarded;

void
df_drape_result_free (DfDrapeResult *result)
{
  if (result == NULL)
    return;
  df_drape_free (result->drape);
  g_free (result->net);
  g_free (result);
}

static void
job_free (gpointer data)
{
  Job *job = data;

  df_surface_free (job->surface);
  g_free (job->uv);
  g_free (job);
}

static gboolean
chart_point (const df_surface *surface,
             const double      uv[2],
             double            xyz[3])
{
  df_chart_jet jet;

  if (df_surface_eval (surface, uv[0], uv[1], 0, &jet, NULL) != DF_OK)
    return FALSE;
  memcpy (xyz, jet.x, sizeof jet.x);
  return isfinite (xyz[0]) && isfinite (xyz[1]) && isfinite (xyz[2]);
}

static void
push (GArray      *out,
      const double p[3],
      const float  rgba[4],
      float        width)
{
  float v[NET_STRIDE] = { p[0], p[1], p[2], rgba[0], rgba[1], rgba[2], rgba[3], width };

  g_array_append_vals (out, v, NET_STRIDE);
}

static void
shear_colour (double shear_rad,
              double range_deg,
              float  rgba[4])
{
  double rgb[3];

  df_colour_ramp (shear_rad * 180 / G_PI / range_deg, rgb);
  /* Darker than the surface's own ramp, so that threads near zero shear (the ramp's white)
   * still read against the plain mesh. */
  for (int k = 0; k < 3; k++)
    rgba[k] = (float) (0.62 * rgb[k]);
  rgba[3] = 1.0f;
}

/* The threads: every segment with an end inside the outline, pieces segment points long, its
 * colour the mean shear of its two pins. Then a cross on every cell past the locking angle
 * (its two diagonals through the cell's pins, in ink), so the flag does not rest on colour. */
static float *
build_net (const df_surface *surface,
           const df_drape   *d,
           double            range_deg,
           DfDrapeResult    *r,
           gsize            *n_out)
{
  const df_drape_summary *s = df_drape_get_summary (d);
  GArray *out = g_array_new (FALSE, FALSE, sizeof (float));
  int across = MAX (s->i_max - s->i_min, s->j_max - s->j_min);
  /* Chords are enough once cells are a few pixels wide; fewer vertices keep a drag fluid. */
  int pieces = across > 80 ? 1 : across > 30 ? 2 : 4;
  float width = across > 80 ? 1.0f : 1.6f;
  /* Crosses in ink; on a fine net thinner and half transparent, or a block of flagged cells
   * turns solid black and hides its shear colour. */
  const float ink[4] = { 0.07f, 0.07f, 0.09f, across > 80 ? 0.5f : 1.0f };
  float cross = across > 80 ? 1.0f : 2.0f;

  for (int i = s->i_min; i <= s->i_max; i++)
    for (int j = s->j_min; j <= s->j_max; j++)
      {
        df_drape_node a, b;

        if (!df_drape_get_node (d, i, j, &a))
          continue;
        for (int dir = 0; dir < 4; dir += 2)
          {
            int bi = dir == 0 ? i + 1 : i, bj = dir == 0 ? j : j + 1;
            double prev[3];
            float rgba[4];

            if (!df_drape_get_node (d, bi, bj, &b) || !(a.inside || b.inside))
              continue;
            shear_colour (0.5 * (a.shear_rad + b.shear_rad), range_deg, rgba);
            memcpy (prev, a.point, sizeof prev);
            for (int k = 1; k <= pieces; k++)
              {
                double uv[2], p[3];

                if (k == pieces)
                  memcpy (p, b.point, sizeof p);
                else if (!df_drape_segment_point (d, i, j, dir, (double) k / pieces, uv)
                         || !chart_point (surface, uv, p))
                  continue;
                push (out, prev, rgba, width);
                push (out, p, rgba, width);
                memcpy (prev, p, sizeof prev);
              }
          }
      }
  for (int i = s->i_min; i < s->i_max; i++)
    for (int j = s->j_min; j < s->j_max; j++)
      {
        df_drape_cell c;
        df_drape_node n00, n10, n01, n11;

        if (!df_drape_get_cell (d, i, j, &c) || c.corners_inside == 0 || !c.over_limit)
          continue;
        df_drape_get_node (d, i, j, &n00);
        df_drape_get_node (d, i + 1, j, &n10);
        df_drape_get_node (d, i, j + 1, &n01);
        df_drape_get_node (d, i + 1, j + 1, &n11);
        push (out, n00.point, ink, cross);
        push (out, n11.point, ink, cross);
        push (out, n10.point, ink, cross);
        push (out, n01.point, ink, cross);
        if (!r->has_worst || fabs (c.shear_rad) > fabs (r->worst_shear_rad))
          {
            r->has_worst = TRUE;
            r->worst_i = i;
            r->worst_j = j;
            r->worst_shear_rad = c.shear_rad;
            r->worst_u = 0.25 * (n00.u + n10.u + n01.u + n11.u);
            r->worst_v = 0.25 * (n00.v + n10.v + n01.v + n11.v);
          }
      }
  /* Pins whose warp deviates past max-fibre-deviation-deg: a short thick magenta dash along
   * the warp there (a hue the shear scale does not use), so that flag too is a mark. */
  if (isfinite (df_drape_get_options (d)->max_fibre_deviation_rad))
    {
      static const float magenta[4] = { 0.80f, 0.05f, 0.55f, 1.0f };
      double h = df_drape_get_options (d)->cell;
      double lim = df_drape_get_options (d)->max_fibre_deviation_rad;

      for (int i = s->i_min; i <= s->i_max; i++)
        for (int j = s->j_min; j <= s->j_max; j++)
          {
            df_drape_node nd;
            double a[3], b[3];

            if (!df_drape_get_node (d, i, j, &nd) || !nd.inside
                || !(fabs (nd.warp_deviation_rad) > lim))
              continue;
            for (int k = 0; k < 3; k++)
              {
                a[k] = nd.point[k] - 0.3 * h * nd.warp[k];
                b[k] = nd.point[k] + 0.3 * h * nd.warp[k];
              }
            push (out, a, magenta, 3.0f);
            push (out, b, magenta, 3.0f);
          }
    }
  /* The start pin: a bold ink cross along its warp and weft, so a dragged pin is seen. */
  {
    static const float pin_ink[4] = { 0.05f, 0.05f, 0.07f, 1.0f };
    double h = df_drape_get_options (d)->cell;
    df_drape_node nd;

    if (df_drape_get_node (d, 0, 0, &nd))
      for (int t = 0; t < 2; t++)
        {
          const double *dir = t == 0 ? nd.warp : nd.weft;
          double a[3], b[3];

          for (int k = 0; k < 3; k++)
            {
              a[k] = nd.point[k] - 0.8 * h * dir[k];
              b[k] = nd.point[k] + 0.8 * h * dir[k];
            }
          push (out, a, pin_ink, 4.0f);
          push (out, b, pin_ink, 4.0f);
        }
  }
  *n_out = out->len / NET_STRIDE;
  return (float *) g_array_free (out, FALSE);
}

/* A scale that starts at the limit when one is set (so the limit sits at the scale's end, its
 * colour the flag's), else at the largest shear, rounded up to 1, 2 or 5 times a power of 10. */
static double
colour_range_deg (const df_drape *d)
{
  const df_drape_summary *s = df_drape_get_summary (d);
  const df_drape_options *o = df_drape_get_options (d);
  double top = fmax (fabs (s->max_shear_rad), fabs (s->max_cell_shear_rad)) * 180 / G_PI;
  double p;

  if (isfinite (o->max_shear_rad) && o->max_shear_rad > 0)
    top = fmax (top, o->max_shear_rad * 180 / G_PI);
  if (!(top > 1e-6) || !isfinite (top))
    return 1;
  p = pow (10, floor (log10 (top)));
  return top <= p ? p : top <= 2 * p ? 2 * p : top <= 5 * p ? 5 * p : 10 * p;
}

static void
drape_guarded (gpointer data)
{
  Guarded *g = data;
  Job *job = g->job;
  g_autoptr(df_curve) curve = NULL;
  g_autofree double (*poly)[2] = NULL;
  gint64 t0 = g_get_monotonic_time ();
  df_drape *drape = NULL;
  DfDrapeResult *r;
  gsize n_poly;
  df_diag diag;
  df_status st;

  df_diag_clear (&diag);
  st = df_curve_new_through_points (job->surface, (const double (*)[2]) job->uv, job->n, true,
                                    &curve, &diag);
  if (st != DF_OK)
    {
      df_status_to_gerror (st, &diag, &g->error);
      g_prefix_error (&g->error, "The ply outline: ");
      return;
    }
  if (df_curve_get_coords (curve) != DF_COORDS_CHART)
    {
      g_set_error (&g->error, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY,
                   "The ply comes near a pole of the surface, where the drape's chart is "
                   "singular; move it or split it");
      return;
    }
  if (df_curve_axis_winding (curve) != 0 || df_curve_tube_winding (curve) != 0)
    {
      g_set_error (&g->error, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY,
                   "The ply outline winds round the surface and bounds no patch to drape");
      return;
    }
  /* df-cli-drape.c's read_outline: the same samples. */
  n_poly = df_curve_sample_plane (curve, MAX (8 * job->n, 2048), &poly);
  if (n_poly == 0)
    {
      g_set_error (&g->error, DF_IO_ERROR, DF_IO_ERROR_GEOMETRY, "Out of memory");
      return;
    }
  df_diag_clear (&diag);
  st = df_drape_new (job->surface, (const double (*)[2]) poly, n_poly, job->u, job->v,
                     &job->options, &drape, &diag);
  if (st != DF_OK)
    {
      df_status_to_gerror (st, &diag, &g->error);
      g_prefix_error (&g->error, "The start point: ");
      return;
    }
  r = g_new0 (DfDrapeResult, 1);
  r->drape_ms = (g_get_monotonic_time () - t0) / 1000.0;
  r->drape = drape;
  r->range_deg = colour_range_deg (drape);
  r->net = build_net (job->surface, drape, r->range_deg, r, &r->n_net);
  r->elapsed_ms = (g_get_monotonic_time () - t0) / 1000.0;
  g->result = r;
}

static void
drape_thread (GTask        *task,
              gpointer      source,
              gpointer      task_data,
              GCancellable *cancellable)
{
  Guarded g = { task_data, NULL, NULL };

  if (!df_guard_call (drape_guarded, &g, "draping the ply", &g.error))
    g.result = NULL;
  if (g.error != NULL)
    g_task_return_error (task, g.error);
  else if (g_task_return_error_if_cancelled (task))
    df_drape_result_free (g.result);
  else
    g_task_return_pointer (task, g.result, (GDestroyNotify) df_drape_result_free);
}

void
df_drape_job_start (const df_surface       *surface,
                    const double          (*uv)[2],
                    gsize                   n,
                    double                  u,
                    double                  v,
                    const df_drape_options *options,
                    GCancellable           *cancellable,
                    GAsyncReadyCallback     callback,
                    gpointer                user_data)
{
  g_autoptr(GTask) task = g_task_new (NULL, cancellable, callback, user_data);
  Job *job = g_new0 (Job, 1);

  job->surface = df_surface_copy (surface);
  job->uv = g_memdup2 (uv, n * sizeof *uv);
  job->n = n;
  job->u = u;
  job->v = v;
  job->options = *options;
  g_task_set_source_tag (task, df_drape_job_start);
  g_task_set_task_data (task, job, job_free);
  g_task_run_in_thread (task, drape_thread);
}

DfDrapeResult *
df_drape_job_finish (GAsyncResult *result,
                     GError      **error)
{
  g_return_val_if_fail (g_task_is_valid (result, NULL), NULL);
  return g_task_propagate_pointer (G_TASK (result), error);
}
