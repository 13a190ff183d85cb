/* df-document-carry.c: a new surface for the document: each loop carried over by its points in
 * space (the core's closest point on the new surface, on a worker thread under the crash
 * guard), loops that do not fit kept on their old points and marked off the surface. */
#include <string.h>

#include <math.h>

#include "df-data-import.h"
#include "df-document-private.h"
#include "df-project.h"
#include "df-work-guard.h"
#include "df-work.h"

/* One loop carried from the old surface to the new one by its points in space. */
typedef struct
{
  double (*uv)[2];
  gsize    n;
  char    *off;       /* why it does not fit, or NULL */
} Carried;

typedef struct
{
  const df_surface *from;
  const df_surface *to;
  const char       *units;
  GPtrArray        *items;    /* of DfLoopItem (borrowed) */
  Carried          *out;      /* one per item */
  GPtrArray        *paths;    /* of df_project_paths (borrowed; NULL: none) */
  Carried          *out_paths; /* two per pair: a, b */
} CarryJob;

/* Projects each point's old place onto the new surface (the core's closest point). A point
 * that cannot be evaluated on the old surface or projected counts as not fitting. On a
 * periodic v the projected angles are unwrapped along the loop, as a sketch is. */
static void
carry_points (const CarryJob *job,
              const double  (*uv)[2],
              gsize           n,
              Carried        *c)
{
  double tolerance = DF_CARRY_TOLERANCE * df_surface_size (job->to);
  gboolean periodic = df_surface_v_periodic (job->to);
  double worst = 0;
  gsize worst_at = 0;
  gboolean failed = FALSE;

  c->uv = g_malloc_n (MAX (n, 1), sizeof (double[2]));
  c->n = n;
  for (gsize k = 0; k < n; k++)
    {
      df_chart_jet jet;
      double u = uv[k][0], v = uv[k][1], dist = 0;

      if (df_surface_eval (job->from, uv[k][0], uv[k][1], 0, &jet, NULL) != DF_OK
          || df_surface_project (job->to, jet.x, 0, &u, &v, &dist, NULL) != DF_OK
          || !isfinite (dist))
        {
          failed = TRUE;
          worst_at = k;
          break;
        }
      if (periodic && k > 0)
        v += 2 * G_PI * round ((c->uv[k - 1][1] - v) / (2 * G_PI));
      c->uv[k][0] = u;
      c->uv[k][1] = v;
      if (dist > worst)
        {
          worst = dist;
          worst_at = k;
        }
    }
  if (failed)
    {
      /* Keep the old chart values: they are only a placeholder, never measured. */
      memcpy (c->uv, uv, n * sizeof *uv);
      c->off = g_strdup_printf ("point %zu has no closest point on it", worst_at + 1);
    }
  else if (worst > tolerance)
    {
      g_autofree char *far = g_strdup_printf ("%.3g %s", worst, job->units);
      g_autofree char *tol = g_strdup_printf ("%.3g %s", tolerance, job->units);
      c->off = g_strdup_printf ("point %zu lies %s from it (tolerance %s); kept at the "
                                "closest points, not measured; Undo brings the old "
                                "surface back", worst_at + 1, far, tol);
    }
}

static void
carry_guarded (gpointer user_data)
{
  CarryJob *job = user_data;

  for (guint i = 0; i < job->items->len; i++)
    {
      const double (*uv)[2];
      gsize n;

      uv = df_loop_item_get_points (g_ptr_array_index (job->items, i), &n);
      carry_points (job, uv, n, &job->out[i]);
    }
  /* Path pairs are point sequences like loops and go the same way. */
  for (guint i = 0; job->paths != NULL && i < job->paths->len; i++)
    {
      df_project_paths *p = g_ptr_array_index (job->paths, i);

      carry_points (job, (const double (*)[2]) p->a, p->n_a, &job->out_paths[2 * i]);
      carry_points (job, (const double (*)[2]) p->b, p->n_b, &job->out_paths[2 * i + 1]);
    }
}

/* Puts each carried path pair in place, or drops it when either path left the surface (undo
 * brings it back). Returns how many were dropped. */
static guint
apply_carried_paths (GPtrArray *paths,
                     Carried   *out)
{
  guint dropped = 0;

  for (guint i = paths->len; i-- > 0;)
    {
      df_project_paths *p = g_ptr_array_index (paths, i);
      Carried *a = &out[2 * i], *b = &out[2 * i + 1];

      if (a->off != NULL || b->off != NULL)
        {
          g_ptr_array_remove_index (paths, i);
          dropped++;
        }
      else
        {
          g_free (p->a);
          g_free (p->b);
          p->a = g_steal_pointer (&a->uv);
          p->b = g_steal_pointer (&b->uv);
        }
      g_free (a->uv);
      g_free (a->off);
      g_free (b->uv);
      g_free (b->off);
    }
  return dropped;
}

gboolean
df_document_set_spec (DfDocument            *self,
                      const df_surface_spec *spec,
                      GError               **error)
{
  df_surface *surface;

  g_return_val_if_fail (DF_IS_DOCUMENT (self), FALSE);
  g_return_val_if_fail (spec != NULL, FALSE);

  surface = df_surface_spec_build (spec, error);
  return surface != NULL && df_document_set_spec_built (self, spec, surface, error);
}

gboolean
df_document_set_spec_built (DfDocument            *self,
                            const df_surface_spec *spec,
                            df_surface            *built,
                            GError               **error)
{
  g_autoptr(df_surface) surface = built;
  g_autoptr(GPtrArray) items = g_ptr_array_new_with_free_func (g_object_unref);
  CarryJob job = { 0 };
  guint n;

  g_return_val_if_fail (DF_IS_DOCUMENT (self), FALSE);
  g_return_val_if_fail (spec != NULL && built != NULL, FALSE);

  /* Loops keep their places in space, not their chart numbers: (t, φ) of a lamp shade read as
   * (x, y) on a plane would be another loop altogether. */
  n = g_list_model_get_n_items (G_LIST_MODEL (self->loops));
  for (guint i = 0; i < n; i++)
    g_ptr_array_add (items, g_list_model_get_item (G_LIST_MODEL (self->loops), i));
  job.from = self->surface;
  job.to = surface;
  job.units = spec->units != NULL && spec->units[0] != '\0' ? spec->units : "mm";
  job.items = items;
  job.out = g_new0 (Carried, MAX (n, 1));
  job.paths = self->carried != NULL ? self->carried->extras.paths : NULL;
  job.out_paths = g_new0 (Carried, job.paths != NULL ? 2 * job.paths->len + 1 : 1);
  if (self->surface != NULL && (n > 0 || (job.paths != NULL && job.paths->len > 0))
      && !df_guard_call (carry_guarded, &job, "carrying the loops to the new surface", error))
    {
      g_free (job.out);
      g_free (job.out_paths);
      return FALSE;
    }

  _df_document_push_history (self, "surface change");
  df_surface_spec_free (self->spec);
  self->spec = df_surface_spec_copy (spec);
  df_data_spec_make_absolute (self->spec);
  df_surface_free (self->surface);
  self->surface = g_steal_pointer (&surface);
  self->last_carried = self->last_off = 0;
  self->last_dropped_geodesics = self->last_dropped_paths = 0;
  if (self->carried != NULL && job.from != NULL)
    {
      /* A geodesic is a start, a heading from X_u and a length: the heading means another
       * direction on another chart, so it is not carried (undo brings it back). */
      self->last_dropped_geodesics = self->carried->extras.geodesics->len;
      g_ptr_array_set_size (self->carried->extras.geodesics, 0);
      self->last_dropped_paths = apply_carried_paths (self->carried->extras.paths,
                                                      job.out_paths);
    }
  for (guint i = 0; i < n && job.from != NULL; i++)
    {
      DfLoopItem *item = g_ptr_array_index (items, i);
      Carried *c = &job.out[i];

      df_loop_item_set_points (item, (const double (*)[2]) c->uv, c->n);
      /* A loop already off the surface stays off: its true place was left behind. */
      if (c->off != NULL && df_loop_item_get_off_surface (item) == NULL)
        df_loop_item_set_off_surface (item, c->off);
      if (df_loop_item_get_off_surface (item) != NULL)
        self->last_off++;
      else
        self->last_carried++;
      g_free (c->uv);
      g_free (c->off);
    }
  g_free (job.out);
  g_free (job.out_paths);
  g_signal_emit (self, _df_document_signals[SURFACE_CHANGED], 0);
  g_signal_emit (self, _df_document_signals[UNITS_CHANGED], 0);
  _df_document_measure_all (self);
  _df_document_update_modified (self);
  return TRUE;
}

void
df_document_get_last_carry (DfDocument *self,
                            guint      *carried,
                            guint      *off)
{
  g_return_if_fail (DF_IS_DOCUMENT (self));
  *carried = self->last_carried;
  *off = self->last_off;
}

void
df_document_get_last_dropped (DfDocument *self,
                              guint      *geodesics,
                              guint      *paths)
{
  g_return_if_fail (DF_IS_DOCUMENT (self));
  *geodesics = self->last_dropped_geodesics;
  *paths = self->last_dropped_paths;
}
