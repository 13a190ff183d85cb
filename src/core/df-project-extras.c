/* df-project-extras.c: reads and writes the geodesics, path pairs, probe points and view of a
 * project key file (df-project-extras.h), with messages naming the file, group and key.
 * Reader layer: GLib allowed. */
#include "df-project-extras.h"

#include <math.h>
#include <string.h>

#include "df-io-error.h"
#include "df-surface-spec-private.h"

#define GEODESIC_PREFIX "geodesic "
#define PATHS_PREFIX    "paths "
#define PROBE_PREFIX    "probe "
#define VIEW_GROUP      "view"

static void
geodesic_free (df_project_geodesic *g)
{
  g_free (g->name);
  g_free (g);
}

static void
paths_free (df_project_paths *p)
{
  g_free (p->name);
  g_free (p->a);
  g_free (p->b);
  g_free (p);
}

static void
probe_free (df_project_probe *p)
{
  g_free (p->name);
  g_free (p);
}

void
df_project_extras_init (df_project_extras *x)
{
  memset (x, 0, sizeof *x);
  x->geodesics = g_ptr_array_new_with_free_func ((GDestroyNotify) geodesic_free);
  x->paths = g_ptr_array_new_with_free_func ((GDestroyNotify) paths_free);
  x->probes = g_ptr_array_new_with_free_func ((GDestroyNotify) probe_free);
}

void
df_project_extras_clear (df_project_extras *x)
{
  g_clear_pointer (&x->geodesics, g_ptr_array_unref);
  g_clear_pointer (&x->paths, g_ptr_array_unref);
  g_clear_pointer (&x->probes, g_ptr_array_unref);
  g_clear_pointer (&x->view.colouring, g_free);
}

/* "geodesic 12": the prefix and then a positive whole number. */
static gboolean
numbered (const char *group, const char *prefix)
{
  const char *p;

  if (!g_str_has_prefix (group, prefix))
    return FALSE;
  p = group + strlen (prefix);
  if (*p < '1' || *p > '9')
    return FALSE;
  for (; *p; p++)
    if (!g_ascii_isdigit (*p))
      return FALSE;
  return TRUE;
}

gboolean
df_project_extras_owns_group (const char *group)
{
  return numbered (group, GEODESIC_PREFIX) || numbered (group, PATHS_PREFIX)
         || numbered (group, PROBE_PREFIX) || g_str_equal (group, VIEW_GROUP);
}

void
df_project_extras_add_geodesic (df_project_extras *x, const char *name, double u, double v,
                                double heading_deg, double length)
{
  df_project_geodesic *g = g_new0 (df_project_geodesic, 1);

  g->name = g_strdup (name);
  g->u = u;
  g->v = v;
  g->heading_deg = heading_deg;
  g->length = length;
  g_ptr_array_add (x->geodesics, g);
}

void
df_project_extras_add_paths (df_project_extras *x, const char *name, const double (*a)[2],
                             gsize n_a, const double (*b)[2], gsize n_b)
{
  df_project_paths *p = g_new0 (df_project_paths, 1);

  p->name = g_strdup (name);
  p->a = g_memdup2 (a, n_a * sizeof *a);
  p->n_a = n_a;
  p->b = g_memdup2 (b, n_b * sizeof *b);
  p->n_b = n_b;
  g_ptr_array_add (x->paths, p);
}

void
df_project_extras_add_probe (df_project_extras *x, const char *name, double u, double v)
{
  df_project_probe *p = g_new0 (df_project_probe, 1);

  p->name = g_strdup (name);
  p->u = u;
  p->v = v;
  g_ptr_array_add (x->probes, p);
}

void
df_project_extras_copy (df_project_extras *dst, const df_project_extras *src)
{
  df_project_extras_clear (dst);
  df_project_extras_init (dst);
  for (guint i = 0; i < src->geodesics->len; i++)
    {
      const df_project_geodesic *g = g_ptr_array_index (src->geodesics, i);

      df_project_extras_add_geodesic (dst, g->name, g->u, g->v, g->heading_deg, g->length);
    }
  for (guint i = 0; i < src->paths->len; i++)
    {
      const df_project_paths *p = g_ptr_array_index (src->paths, i);

      df_project_extras_add_paths (dst, p->name, (const double (*)[2]) p->a, p->n_a,
                                   (const double (*)[2]) p->b, p->n_b);
    }
  for (guint i = 0; i < src->probes->len; i++)
    {
      const df_project_probe *p = g_ptr_array_index (src->probes, i);

      df_project_extras_add_probe (dst, p->name, p->u, p->v);
    }
  dst->view = src->view;
  dst->view.colouring = g_strdup (src->view.colouring);
}

/* Fails naming the first key of group that is not in known. */
static gboolean
check_keys (GKeyFile *kf, const char *group, const char *source, const char *const *known,
            const char *known_text, GError **error)
{
  g_auto (GStrv) keys = g_key_file_get_keys (kf, group, NULL, NULL);

  for (gsize i = 0; keys != NULL && keys[i] != NULL; i++)
    if (!g_strv_contains (known, keys[i]))
      {
        g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT, "%s: [%s] unknown key '%s' (known: %s)",
                     source, group, keys[i], known_text);
        return FALSE;
      }
  return TRUE;
}

/* A point list from two keys of equal length, at least min points. */
static double (*read_points (GKeyFile *kf, const char *group, const char *ku, const char *kv,
                             const char *source, gsize min, gsize *n_out, GError **error))[2]
{
  gsize nu = 0, nv = 0;
  g_autofree double *u = _df_key_file_get_numbers (kf, group, ku, source, &nu, error);
  g_autofree double *v = NULL;
  double (*uv)[2];

  if (u == NULL && error != NULL && *error != NULL)
    return NULL;
  v = _df_key_file_get_numbers (kf, group, kv, source, &nv, error);
  if (v == NULL && error != NULL && *error != NULL)
    return NULL;
  if (nu != nv || nu < min)
    {
      g_clear_error (error);
      if (nu != nv)
        g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                     "%s: [%s] %s: %" G_GSIZE_FORMAT " values but %s has %" G_GSIZE_FORMAT,
                     source, group, ku, nu, kv, nv);
      else
        g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_FORMAT,
                     "%s: [%s] %s: %" G_GSIZE_FORMAT " point%s, a path needs at least %"
                     G_GSIZE_FORMAT, source, group, ku, nu, nu == 1 ? "" : "s", min);
      return NULL;
    }
  uv = g_malloc_n (nu, sizeof *uv);
  for (gsize i = 0; i < nu; i++)
    {
      uv[i][0] = u[i];
      uv[i][1] = v[i];
    }
  *n_out = nu;
  return uv;
}

static gboolean
read_geodesic (df_project_extras *x, GKeyFile *kf, const char *group, const char *source,
               GError **error)
{
  static const char *const known[] = { "name", "start", "heading-deg", "length", NULL };
  g_autofree char *name = NULL;
  double start[2], heading, length;

  if (!check_keys (kf, group, source, known, "name, start, heading-deg, length", error))
    return FALSE;
  name = _df_key_file_get_text (kf, group, "name", FALSE, source, error);
  if (!_df_key_file_get_fixed (kf, group, "start", source, 2, start, error)
      || !_df_key_file_get_fixed (kf, group, "heading-deg", source, 1, &heading, error)
      || !_df_key_file_get_fixed (kf, group, "length", source, 1, &length, error))
    return FALSE;
  if (!(length > 0))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                   "%s: [%s] length: must be greater than 0", source, group);
      return FALSE;
    }
  df_project_extras_add_geodesic (x, name != NULL ? name : group, start[0], start[1], heading,
                                  length);
  return TRUE;
}

static gboolean
read_paths (df_project_extras *x, GKeyFile *kf, const char *group, const char *source,
            GError **error)
{
  static const char *const known[] = { "name", "a-u", "a-v", "b-u", "b-v", NULL };
  g_autofree char *name = NULL;
  g_autofree double (*a)[2] = NULL;
  g_autofree double (*b)[2] = NULL;
  gsize na = 0, nb = 0;

  if (!check_keys (kf, group, source, known, "name, a-u, a-v, b-u, b-v", error))
    return FALSE;
  name = _df_key_file_get_text (kf, group, "name", FALSE, source, error);
  a = read_points (kf, group, "a-u", "a-v", source, 2, &na, error);
  if (a == NULL)
    return FALSE;
  b = read_points (kf, group, "b-u", "b-v", source, 2, &nb, error);
  if (b == NULL)
    return FALSE;
  df_project_extras_add_paths (x, name != NULL ? name : group, (const double (*)[2]) a, na,
                               (const double (*)[2]) b, nb);
  return TRUE;
}

static gboolean
read_probe (df_project_extras *x, GKeyFile *kf, const char *group, const char *source,
            GError **error)
{
  static const char *const known[] = { "name", "at", NULL };
  g_autofree char *name = NULL;
  double at[2];

  if (!check_keys (kf, group, source, known, "name, at", error))
    return FALSE;
  name = _df_key_file_get_text (kf, group, "name", FALSE, source, error);
  if (!_df_key_file_get_fixed (kf, group, "at", source, 2, at, error))
    return FALSE;
  df_project_extras_add_probe (x, name != NULL ? name : group, at[0], at[1]);
  return TRUE;
}

static gboolean
read_view (df_project_extras *x, GKeyFile *kf, const char *source, GError **error)
{
  static const char *const known[] = { "colouring", "yaw-deg", "pitch-deg", NULL };
  g_autofree char *colouring = NULL;
  double yaw = -55, pitch = 28;

  if (!check_keys (kf, VIEW_GROUP, source, known, "colouring, yaw-deg, pitch-deg", error))
    return FALSE;
  colouring = _df_key_file_get_text (kf, VIEW_GROUP, "colouring", FALSE, source, error);
  if (colouring != NULL && !g_str_equal (colouring, "gaussian") && !g_str_equal (colouring, "mean")
      && !g_str_equal (colouring, "plain"))
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                   "%s: [view] colouring: '%s' is not one of gaussian, mean, plain", source,
                   colouring);
      return FALSE;
    }
  if ((g_key_file_has_key (kf, VIEW_GROUP, "yaw-deg", NULL)
       && !_df_key_file_get_fixed (kf, VIEW_GROUP, "yaw-deg", source, 1, &yaw, error))
      || (g_key_file_has_key (kf, VIEW_GROUP, "pitch-deg", NULL)
          && !_df_key_file_get_fixed (kf, VIEW_GROUP, "pitch-deg", source, 1, &pitch, error)))
    return FALSE;
  if (fabs (pitch) > 90)
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                   "%s: [view] pitch-deg: must lie in [-90, 90]", source);
      return FALSE;
    }
  x->view.set = TRUE;
  g_free (x->view.colouring);
  x->view.colouring = colouring != NULL ? g_steal_pointer (&colouring) : g_strdup ("gaussian");
  x->view.yaw_deg = yaw;
  x->view.pitch_deg = pitch;
  return TRUE;
}

gboolean
df_project_extras_read (df_project_extras *x, GKeyFile *key_file, const char *source,
                        GError **error)
{
  g_auto (GStrv) groups = g_key_file_get_groups (key_file, NULL);

  /* In file order, which is the order the user made them. */
  for (gsize i = 0; groups[i] != NULL; i++)
    {
      const char *g = groups[i];
      gboolean ok = TRUE;

      if (numbered (g, GEODESIC_PREFIX))
        ok = read_geodesic (x, key_file, g, source, error);
      else if (numbered (g, PATHS_PREFIX))
        ok = read_paths (x, key_file, g, source, error);
      else if (numbered (g, PROBE_PREFIX))
        ok = read_probe (x, key_file, g, source, error);
      else if (g_str_equal (g, VIEW_GROUP))
        ok = read_view (x, key_file, source, error);
      if (!ok)
        return FALSE;
    }
  return TRUE;
}

static void
set_number (GKeyFile *kf, const char *group, const char *key, double value)
{
  char buf[G_ASCII_DTOSTR_BUF_SIZE];

  /* "%.17g" in the C locale: a saved value reloads bit for bit. */
  g_key_file_set_string (kf, group, key, g_ascii_dtostr (buf, sizeof buf, value));
}

static void
set_pair (GKeyFile *kf, const char *group, const char *key, double a, double b)
{
  char ba[G_ASCII_DTOSTR_BUF_SIZE], bb[G_ASCII_DTOSTR_BUF_SIZE];
  g_autofree char *text = g_strdup_printf ("%s;%s", g_ascii_dtostr (ba, sizeof ba, a),
                                           g_ascii_dtostr (bb, sizeof bb, b));

  g_key_file_set_string (kf, group, key, text);
}

static void
set_list (GKeyFile *kf, const char *group, const char *key, const double (*uv)[2], gsize n,
          int which)
{
  g_autoptr (GString) out = g_string_new (NULL);
  char buf[G_ASCII_DTOSTR_BUF_SIZE];

  for (gsize i = 0; i < n; i++)
    g_string_append_printf (out, "%s%s", i ? ";" : "",
                            g_ascii_dtostr (buf, sizeof buf, uv[i][which]));
  g_key_file_set_string (kf, group, key, out->str);
}

void
df_project_extras_write (const df_project_extras *x, GKeyFile *kf)
{
  for (guint i = 0; i < x->geodesics->len; i++)
    {
      const df_project_geodesic *g = g_ptr_array_index (x->geodesics, i);
      g_autofree char *group = g_strdup_printf (GEODESIC_PREFIX "%u", i + 1);

      g_key_file_set_string (kf, group, "name", g->name != NULL ? g->name : "");
      set_pair (kf, group, "start", g->u, g->v);
      set_number (kf, group, "heading-deg", g->heading_deg);
      set_number (kf, group, "length", g->length);
    }
  for (guint i = 0; i < x->paths->len; i++)
    {
      const df_project_paths *p = g_ptr_array_index (x->paths, i);
      g_autofree char *group = g_strdup_printf (PATHS_PREFIX "%u", i + 1);

      g_key_file_set_string (kf, group, "name", p->name != NULL ? p->name : "");
      set_list (kf, group, "a-u", (const double (*)[2]) p->a, p->n_a, 0);
      set_list (kf, group, "a-v", (const double (*)[2]) p->a, p->n_a, 1);
      set_list (kf, group, "b-u", (const double (*)[2]) p->b, p->n_b, 0);
      set_list (kf, group, "b-v", (const double (*)[2]) p->b, p->n_b, 1);
    }
  for (guint i = 0; i < x->probes->len; i++)
    {
      const df_project_probe *p = g_ptr_array_index (x->probes, i);
      g_autofree char *group = g_strdup_printf (PROBE_PREFIX "%u", i + 1);

      g_key_file_set_string (kf, group, "name", p->name != NULL ? p->name : "");
      set_pair (kf, group, "at", p->u, p->v);
    }
  if (x->view.set)
    {
      g_key_file_set_string (kf, VIEW_GROUP, "colouring",
                             x->view.colouring != NULL ? x->view.colouring : "gaussian");
      set_number (kf, VIEW_GROUP, "yaw-deg", x->view.yaw_deg);
      set_number (kf, VIEW_GROUP, "pitch-deg", x->view.pitch_deg);
    }
}
