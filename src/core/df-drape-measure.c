/* df-drape-measure.c: the measures of the woven-ply net once its pins are placed
 * (df-drape.c): each pin's thread directions, shear and warp deviation; each cell's corner
 * angles, excess, shear and closure integral; the summary (maxima, counts, the enclosed
 * curvature, the flat outline's area); the node and cell accessors.
 * Plain C + libm + GSL; no GLib. */
#include "df-drape-private.h"

#include <math.h>
#include <string.h>

#include "df-vec3.h"

void
_df_drape_derive_node (df_drape *d, net_node *nd)
{
  double a[3] = { 0 }, b[3] = { 0 }, s[3], len, e1[3], e2[3], want[3], w = d->opt.warp_rad;

  if (nd->has[DIR_PI])
    {
      to_space (nd, nd->out[DIR_PI], s);
      for (int k = 0; k < 3; k++) a[k] += s[k];
    }
  if (nd->has[DIR_MI])
    {
      to_space (nd, nd->out[DIR_MI], s);
      for (int k = 0; k < 3; k++) a[k] -= s[k];
    }
  if (nd->has[DIR_PJ])
    {
      to_space (nd, nd->out[DIR_PJ], s);
      for (int k = 0; k < 3; k++) b[k] += s[k];
    }
  if (nd->has[DIR_MJ])
    {
      to_space (nd, nd->out[DIR_MJ], s);
      for (int k = 0; k < 3; k++) b[k] -= s[k];
    }
  len = sqrt (df_dot3 (a, a));
  for (int k = 0; k < 3; k++)
    nd->warp[k] = len > 0 ? a[k] / len : NAN;
  len = sqrt (df_dot3 (b, b));
  for (int k = 0; k < 3; k++)
    nd->weft[k] = len > 0 ? b[k] / len : NAN;
  nd->shear = M_PI_2 - angle_about (nd->warp, nd->weft, nd->n);
  len = sqrt (df_dot3 (nd->xu, nd->xu));
  for (int k = 0; k < 3; k++)
    e1[k] = nd->xu[k] / len;
  df_cross3 (nd->n, e1, e2);
  for (int k = 0; k < 3; k++)
    want[k] = cos (w) * e1[k] + sin (w) * e2[k];
  nd->deviation = wrap_pi (angle_about (want, nd->warp, nd->n));
}

void
_df_drape_derive_cell (df_drape *d, int i, int j, gsl_integration_glfixed_table *lo,
                       gsl_integration_glfixed_table *hi)
{
  const net_node *c[4] = { valid_node (d, i, j), valid_node (d, i + 1, j),
                           valid_node (d, i + 1, j + 1), valid_node (d, i, j + 1) };
  /* At each corner, the two segments that bound the cell. */
  static const int dirs[4][2] = { { DIR_PI, DIR_PJ }, { DIR_MI, DIR_PJ }, { DIR_MI, DIR_MJ },
                                  { DIR_PI, DIR_MJ } };
  size_t idx = (size_t) (j - d->j_min) * (d->ni - 1) + (i - d->i_min);
  df_drape_cell *cell = &d->cells[idx];
  _df_coons co;

  memset (cell, 0, sizeof *cell);
  for (int k = 0; k < 4; k++)
    if (c[k] == NULL || !c[k]->has[dirs[k][0]] || !c[k]->has[dirs[k][1]])
      return;
  if (!_df_drape_cell_coons (d, i, j, &co))
    return;
  cell->i = i;
  cell->j = j;
  cell->excess_rad = -2 * M_PI;
  for (int k = 0; k < 4; k++)
    {
      double s1[3], s2[3];

      to_space (c[k], c[k]->out[dirs[k][0]], s1);
      to_space (c[k], c[k]->out[dirs[k][1]], s2);
      cell->angle_rad[k] = angle_between (s1, s2);
      cell->excess_rad += cell->angle_rad[k];
      cell->corners_inside += c[k]->inside;
    }
  cell->whole = cell->corners_inside == 4;
  cell->shear_rad = 0.25 * (cell->angle_rad[1] + cell->angle_rad[3] - cell->angle_rad[0]
                            - cell->angle_rad[2]);
  cell->over_limit = isfinite (d->opt.max_shear_rad)
                     && fabs (cell->shear_rad) > d->opt.max_shear_rad;
  cell->k_area_rad = NAN;
  cell->area = NAN;
  if (d->opt.check_closure)
    {
      double k, area;

      if (_df_drape_cell_integrate (d->surface, &co, lo, hi, &k, &area))
        {
          cell->k_area_rad = k;
          cell->area = area;
        }
    }
  d->cell_ok[idx] = true;
}

void
_df_drape_summarise (df_drape *d)
{
  df_drape_summary *s = &d->sum;
  const net_node *start = valid_node (d, 0, 0);
  bool any_inside = false;
  double best_shear = -1, best_dev = -1, best_cell = -1, area2 = 0;

  s->max_shear_rad = start->shear;
  s->max_shear_u = start->uv[0];
  s->max_shear_v = start->uv[1];
  s->max_warp_deviation_rad = start->deviation;
  s->max_warp_deviation_u = start->uv[0];
  s->max_warp_deviation_v = start->uv[1];
  for (int j = d->j_min; j < d->j_min + d->nj; j++)
    for (int i = d->i_min; i < d->i_min + d->ni; i++)
      {
        const net_node *n = valid_node (d, i, j);

        if (n == NULL)
          continue;
        s->n_nodes++;
        if (!n->inside || !isfinite (n->shear))
          continue;
        s->n_nodes_inside++;
        any_inside = true;
        if (fabs (n->shear) > best_shear)
          {
            best_shear = fabs (n->shear);
            s->max_shear_rad = n->shear;
            s->max_shear_u = n->uv[0];
            s->max_shear_v = n->uv[1];
          }
        if (fabs (n->deviation) > best_dev)
          {
            best_dev = fabs (n->deviation);
            s->max_warp_deviation_rad = n->deviation;
            s->max_warp_deviation_u = n->uv[0];
            s->max_warp_deviation_v = n->uv[1];
          }
        if (isfinite (d->opt.max_fibre_deviation_rad)
            && fabs (n->deviation) > d->opt.max_fibre_deviation_rad)
          s->n_nodes_over_deviation++;
      }
  (void) any_inside;

  s->enclosed_curvature_rad = 0;
  s->enclosed_k_area_rad = d->opt.check_closure ? 0 : NAN;
  s->closure_max_residual_rad = d->opt.check_closure ? 0 : NAN;
  s->max_cell_shear_rad = 0;
  for (int j = d->j_min; j < d->j_min + d->nj - 1; j++)
    for (int i = d->i_min; i < d->i_min + d->ni - 1; i++)
      {
        size_t idx = (size_t) (j - d->j_min) * (d->ni - 1) + (i - d->i_min);
        const df_drape_cell *c = &d->cells[idx];

        if (!d->cell_ok[idx])
          continue;
        if (c->corners_inside == 0)
          continue;
        if (d->opt.check_closure)
          {
            double r = fabs (c->excess_rad - c->k_area_rad);

            if (!(r <= s->closure_max_residual_rad))
              {
                s->closure_max_residual_rad = r;   /* NAN propagates: a failed quadrature */
                s->closure_worst_i = i;
                s->closure_worst_j = j;
              }
          }
        s->n_cells++;
        s->n_cells_over_limit += c->over_limit;
        if (fabs (c->shear_rad) > best_cell)
          {
            best_cell = fabs (c->shear_rad);
            s->max_cell_shear_rad = c->shear_rad;
          }
        if (c->whole)
          {
            s->n_whole_cells++;
            s->enclosed_curvature_rad += c->excess_rad;
            if (d->opt.check_closure)
              s->enclosed_k_area_rad += c->k_area_rad;
          }
      }

  s->n_outline = d->n_outline;
  s->flat_lo[0] = s->flat_lo[1] = HUGE_VAL;
  s->flat_hi[0] = s->flat_hi[1] = -HUGE_VAL;
  for (size_t k = 0; k < d->n_outline; k++)
    {
      const double *p = d->flat[k], *q = d->flat[(k + 1) % d->n_outline];

      if (!d->mapped[k])
        continue;
      for (int a = 0; a < 2; a++)
        {
          s->flat_lo[a] = fmin (s->flat_lo[a], p[a]);
          s->flat_hi[a] = fmax (s->flat_hi[a], p[a]);
        }
      area2 += p[0] * q[1] - q[0] * p[1];
    }
  s->flat_area = s->n_outline_unmapped == 0 ? 0.5 * fabs (area2) : NAN;
}


bool
df_drape_get_node (const df_drape *d, int i, int j, df_drape_node *out)
{
  const net_node *n = valid_node (d, i, j);

  if (n == NULL)
    return false;
  out->i = i;
  out->j = j;
  out->u = n->uv[0];
  out->v = n->uv[1];
  memcpy (out->point, n->x, sizeof out->point);
  memcpy (out->normal, n->n, sizeof out->normal);
  out->inside = n->inside;
  memcpy (out->warp, n->warp, sizeof out->warp);
  memcpy (out->weft, n->weft, sizeof out->weft);
  out->shear_rad = n->shear;
  out->warp_deviation_rad = n->deviation;
  out->flat[0] = i * d->opt.cell;
  out->flat[1] = j * d->opt.cell;
  return true;
}

bool
df_drape_get_cell (const df_drape *d, int i, int j, df_drape_cell *out)
{
  size_t idx;

  if (i < d->i_min || j < d->j_min || i >= d->i_min + d->ni - 1 || j >= d->j_min + d->nj - 1)
    return false;
  idx = (size_t) (j - d->j_min) * (d->ni - 1) + (i - d->i_min);
  if (!d->cell_ok[idx])
    return false;
  *out = d->cells[idx];
  return true;
}
