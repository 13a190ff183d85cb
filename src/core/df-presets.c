/* df-presets.c: the built-in surfaces as formulas with default parameters (lengths in mm), and
 * setting a parameter by name. Every preset is written so that N = X_u x X_v points outward:
 * for a revolution profile N lies to the left of (r', z') in the (r, z) half-plane, so the
 * profiles run with z decreasing on the outer side (GEOMETRY.md); a graph's N points up (+z).
 * Reader layer: GLib. */
#include "df-surface-spec.h"

#include <math.h>
#include <string.h>

#include "df-glib.h"
#include "df-surface-spec-private.h"

/* A parameter, its default and the range where the preset means what it says: lo < value
 * (or lo <= value when lo_closed), value < hi, and value < the parameter named by below. An
 * infinite bound is no bound. */
typedef struct
{
  const char *name;
  const char *value;
  double      lo, hi;
  gboolean    lo_closed;
  const char *below;
} preset_param;

#define POSITIVE 0.0, INFINITY, FALSE, NULL
#define ANY      -INFINITY, INFINITY, FALSE, NULL

typedef struct
{
  df_surface_type kind;
  const char     *r;
  const char     *z;
  const char     *range[4];
  preset_param    params[5];
} preset_def;

/* Kept in the same order as preset_defs below. */
static const df_preset_info preset_infos[] = {
  { "plane", "Plane", "A flat square panel of half-width L: zero curvature, the reference." },
  { "sphere", "Sphere", "A sphere of radius R: K = 1/R^2 everywhere." },
  { "dome", "Dome", "A spherical cap of base diameter span and height rise (R is derived from "
                    "them), the shape of a dome mould." },
  { "spheroid", "Spheroid", "An ellipsoid of revolution with equatorial radius a and polar "
                            "semi-axis c." },
  { "torus", "Torus", "A ring of centre radius R and tube radius a: K > 0 outside, K < 0 "
                      "inside; loops around the tube bound no disc." },
  { "cylinder", "Cylinder", "A cylinder of radius R and height h: developable, K = 0." },
  { "cone", "Cone", "A cone of half-angle alpha_deg (degrees) and height h, apex up: K = 0 "
                    "except the apex, which holds 2 pi (1 - sin alpha)." },
  { "paraboloid", "Paraboloid", "A paraboloid of focal length f, apex up, out to radius "
                                "rmax: K = 1/(2f)^2 at the apex, falling off outward." },
  { "catenoid", "Catenoid", "A catenoid of neck radius c and height 2h: a minimal surface "
                            "(H = 0), K < 0." },
  { "hyperboloid", "Hyperboloid", "A hyperboloid of one sheet with waist radius a, shape "
                                  "constant c and height 2h: K < 0." },
  { "pseudosphere", "Pseudosphere", "A tractrix horn of radius R: constant K = -1/R^2." },
  { "saddle", "Saddle", "A hyperbolic paraboloid z = (x^2 - y^2)/(2R) of half-width L: "
                        "K = -1/R^2 at the centre." },
  { "bump", "Gaussian bump", "A bump of height h and width w on a square of half-width L: "
                             "K > 0 on top, K < 0 on the flank." },
  { "wave", "Wave panel", "An egg-crate panel of amplitude A and wavelength W, half-width L: "
                          "alternating K > 0 and K < 0." },
  { NULL, NULL, NULL },
};

static const preset_def preset_defs[] = {
  /* plane: z = 0 over a square. */
  { DF_SURFACE_GRAPH, NULL, "0", { "-L", "L", "-L", "L" }, { { "L", "100", POSITIVE } } },
  /* sphere: t = polar angle from the north pole; z decreasing, so N points outward. */
  { DF_SURFACE_REVOLUTION, "R*sin(t)", "R*cos(t)", { "0", "pi" }, { { "R", "100", POSITIVE } } },
  /* dome: a cap of the sphere of radius R = (a^2 + h^2)/(2h), a = span/2; its half-angle is
   * 2 atan(h/a) (inscribed angle), base at z = 0. */
  { DF_SURFACE_REVOLUTION, "R*sin(t)", "R*cos(t) - R + rise", { "0", "2*atan(2*rise/span)" },
    { { "span", "300", POSITIVE }, { "rise", "60", POSITIVE },
      { "R", "(span^2/4 + rise^2)/(2*rise)", POSITIVE } } },
  /* spheroid: same parametrisation as the sphere with unequal semi-axes. */
  { DF_SURFACE_REVOLUTION, "a*sin(t)", "c*cos(t)", { "0", "pi" },
    { { "a", "100", POSITIVE }, { "c", "60", POSITIVE } } },
  /* torus: z = -a sin t (not +a sin t) makes the profile circle run clockwise in the (r, z)
   * half-plane, so its left side, where N points, is away from the tube's centre. */
  { DF_SURFACE_REVOLUTION, "R + a*cos(t)", "-a*sin(t)", { "-pi", "pi" },
    { { "R", "100", POSITIVE }, { "a", "40", 0.0, INFINITY, FALSE, "R" } } },
  /* cylinder: straight profile running down. */
  { DF_SURFACE_REVOLUTION, "R", "h - t", { "0", "h" }, { { "R", "50", POSITIVE }, { "h", "150", POSITIVE } } },
  /* cone: t = slant distance from the apex at height h, running down and out. */
  { DF_SURFACE_REVOLUTION, "t*sin(alpha_deg*pi/180)", "h - t*cos(alpha_deg*pi/180)",
    { "0", "h/cos(alpha_deg*pi/180)" }, { { "alpha_deg", "30", 0.0, 90.0, FALSE, NULL }, { "h", "100", POSITIVE } } },
  /* paraboloid: z = -r^2/(4f), apex at the top (a hanging-dish mould seen from outside). */
  { DF_SURFACE_REVOLUTION, "t", "-t^2/(4*f)", { "0", "rmax" },
    { { "f", "100", POSITIVE }, { "rmax", "120", POSITIVE } } },
  /* catenoid: r = c cosh(z/c), with t = -z so z decreases. */
  { DF_SURFACE_REVOLUTION, "c*cosh(t/c)", "-t", { "-h", "h" }, { { "c", "50", POSITIVE }, { "h", "80", POSITIVE } } },
  /* hyperboloid: r = a cosh t, z = -c sinh t; |z| <= h at t = asinh(h/c), asinh written with
   * log and sqrt because the formula language has no asinh. */
  { DF_SURFACE_REVOLUTION, "a*cosh(t)", "-c*sinh(t)",
    { "-log(h/c + sqrt((h/c)^2 + 1))", "log(h/c + sqrt((h/c)^2 + 1))" },
    { { "a", "50", POSITIVE }, { "c", "80", POSITIVE }, { "h", "100", POSITIVE } } },
  /* pseudosphere: tractrix r = R sech t, z = R (tanh t - t), running down from the rim; the
   * rim t = 0 is a cusp (zero profile speed), so the range starts just after it. */
  { DF_SURFACE_REVOLUTION, "R/cosh(t)", "R*(tanh(t) - t)", { "0.2", "3" }, { { "R", "60", POSITIVE } } },
  /* saddle: hyperbolic paraboloid. */
  { DF_SURFACE_GRAPH, NULL, "(x^2 - y^2)/(2*R)", { "-L", "L", "-L", "L" },
    { { "R", "200", POSITIVE }, { "L", "100", POSITIVE } } },
  /* bump: Gaussian of height h and standard width w. */
  { DF_SURFACE_GRAPH, NULL, "h*exp(-(x^2 + y^2)/(2*w^2))", { "-L", "L", "-L", "L" },
    { { "h", "30", ANY }, { "w", "40", POSITIVE }, { "L", "120", POSITIVE } } },
  /* wave: doubly periodic egg crate. */
  { DF_SURFACE_GRAPH, NULL, "A*cos(2*pi*x/W)*cos(2*pi*y/W)", { "-L", "L", "-L", "L" },
    { { "A", "10", ANY }, { "W", "200", POSITIVE }, { "L", "150", POSITIVE } } },
};

/* What each preset's t is measured in, same order ("length": the surface's units; NULL for
 * graphs and for the pure numbers of the hyperboloid's and the pseudosphere's t). */
static const char *const preset_t_units[] = {
  NULL, "rad", "rad", "rad", "rad", "length", "length", "length", "length", NULL, NULL,
  NULL, NULL, NULL,
};

G_STATIC_ASSERT (G_N_ELEMENTS (preset_infos) == G_N_ELEMENTS (preset_defs) + 1);
G_STATIC_ASSERT (G_N_ELEMENTS (preset_t_units) == G_N_ELEMENTS (preset_defs));

static const preset_def *
find_preset (const char *name)
{
  for (gsize i = 0; name != NULL && preset_infos[i].name != NULL; i++)
    if (g_str_equal (preset_infos[i].name, name))
      return &preset_defs[i];
  return NULL;
}

/* The valid range of a preset parameter in words: "greater than 0 and less than 90". */
static char *
describe_range (const preset_param *param)
{
  GString *text = g_string_new (NULL);

  if (isfinite (param->lo))
    g_string_append_printf (text, "%s %g", param->lo_closed ? "at least" : "greater than",
                            param->lo);
  if (isfinite (param->hi))
    g_string_append_printf (text, "%sless than %g", text->len ? " and " : "", param->hi);
  if (param->below != NULL)
    g_string_append_printf (text, "%sless than %s", text->len ? " and " : "", param->below);
  return g_string_free (text, FALSE);
}

gboolean
_df_preset_check_params (const df_surface_spec *spec, GError **error)
{
  const preset_def *def = find_preset (spec->preset);

  /* A spec whose formulas were edited is no longer the preset: its parameters mean what the
   * user's formulas make of them, and the surface checks judge it. */
  if (def == NULL || g_strcmp0 (spec->z_text, def->z) != 0
      || (def->r != NULL && g_strcmp0 (spec->r_text, def->r) != 0))
    return TRUE;
  for (gsize i = 0; i < G_N_ELEMENTS (def->params) && def->params[i].name != NULL; i++)
    {
      const preset_param *param = &def->params[i];
      double value, limit = INFINITY;
      gboolean ok;

      if (!df_params_lookup (spec->params, param->name, &value))
        continue;
      if (param->below != NULL)
        df_params_lookup (spec->params, param->below, &limit);
      ok = (param->lo_closed ? value >= param->lo : value > param->lo) && value < param->hi
           && value < limit;
      if (!ok)
        {
          g_autofree char *range = describe_range (param);

          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE,
                       "%s: %.10g is outside the %s preset's range: %s must be %s",
                       param->name, value, spec->preset, param->name, range);
          return FALSE;
        }
    }
  return TRUE;
}

const df_preset_info *
df_presets_list (void)
{
  return preset_infos;
}

df_surface_spec *
df_surface_spec_new_preset (const char *name, GError **error)
{
  g_autoptr (df_surface_spec) spec = NULL;
  const preset_def *def = find_preset (name);

  if (def == NULL)
    {
      g_autoptr (GString) known = g_string_new (NULL);

      for (gsize i = 0; preset_infos[i].name != NULL; i++)
        g_string_append_printf (known, "%s%s", i ? ", " : "", preset_infos[i].name);
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_VALUE, "unknown preset '%s' (known: %s)",
                   name ? name : "", known->str);
      return NULL;
    }

  if (def->kind == DF_SURFACE_REVOLUTION)
    spec = df_surface_spec_new_revolution (def->r, def->z, def->range[0], def->range[1]);
  else
    spec = df_surface_spec_new_graph (def->z, def->range[0], def->range[1], def->range[2],
                                      def->range[3]);
  spec->preset = g_strdup (name);
  spec->t_units = g_strdup (preset_t_units[def - preset_defs]);
  for (gsize i = 0; i < G_N_ELEMENTS (def->params) && def->params[i].name != NULL; i++)
    if (!df_params_set (spec->params, def->params[i].name, def->params[i].value, error))
      {
        /* A preset that does not parse is a bug in this table, not the user's input. */
        g_prefix_error (error, "preset %s: parameter %s: ", name, def->params[i].name);
        return NULL;
      }
  return g_steal_pointer (&spec);
}

gboolean
df_surface_spec_set_param (df_surface_spec *spec, const char *key, const char *value_text,
                           GError **error)
{
  g_autofree char *name = NULL;
  g_autofree char *text = NULL;
  double unused;

  g_return_val_if_fail (spec != NULL && key != NULL, FALSE);
  /* value_text NULL: key is "KEY=VALUE" as typed on a command line. */
  if (value_text == NULL)
    {
      const char *eq = strchr (key, '=');

      if (eq == NULL)
        {
          g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_SYNTAX,
                       "'%s': expected KEY=VALUE, e.g. R=120", key);
          return FALSE;
        }
      name = g_strstrip (g_strndup (key, (gsize) (eq - key)));
      text = g_strstrip (g_strdup (eq + 1));
    }
  else
    {
      name = g_strstrip (g_strdup (key));
      text = g_strstrip (g_strdup (value_text));
    }

  /* Only an existing parameter may be set this way: a typo such as "r=50" for "R=50" would
   * otherwise add a parameter that nothing uses and leave the surface unchanged. */
  if (!df_params_lookup (spec->params, name, &unused))
    {
      g_autoptr (GString) known = g_string_new (NULL);

      for (guint i = 0; i < df_params_count (spec->params); i++)
        g_string_append_printf (known, "%s%s", i ? ", " : "", df_params_name (spec->params, i));
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_UNKNOWN_NAME,
                   "unknown parameter '%s' (this surface has: %s)", name,
                   known->len ? known->str : "none");
      return FALSE;
    }
  if (text[0] == '\0')
    {
      g_set_error (error, DF_IO_ERROR, DF_IO_ERROR_SYNTAX, "%s: no value given", name);
      return FALSE;
    }
  {
    /* Tried on a copy, so a value outside the preset's range leaves the spec as it was. */
    g_autoptr (df_params) before = df_params_copy (spec->params);

    if (!df_params_set (spec->params, name, text, error))
      {
        g_prefix_error (error, "%s: ", name);
        return FALSE;
      }
    if (!_df_preset_check_params (spec, error))
      {
        df_params_free (spec->params);
        spec->params = g_steal_pointer (&before);
        return FALSE;
      }
  }
  return TRUE;
}
