/* fuzz-loop.c: loop CSV -> curve -> measurement. Input: one byte choosing the surface, then
 * the CSV text. Inputs are kept small (at most 40 rows reach the measurement) so one run
 * stays fast. Rules: a refused file has a message naming it; a measured loop has a finite
 * holonomy in (-pi, pi], a finite length and, when it bounds a disc, a finite enclosed
 * curvature; failures carry a message free of non-finite numbers. */
#include <math.h>

#include "df-glib.h"
#include "fuzz-common.h"

#define FUZZ_MAX_INPUT 2048
#define MAX_MEASURED_POINTS 40

static df_surface *surfaces[4];

int LLVMFuzzerInitialize (int *argc, char ***argv);

static df_surface *
preset (const char *name)
{
  g_autoptr (df_surface_spec) spec = df_surface_spec_new_preset (name, NULL);
  df_surface *s = spec != NULL ? df_surface_spec_build (spec, NULL) : NULL;

  if (s == NULL)
    abort ();
  return s;
}

int
LLVMFuzzerInitialize (int *argc, char ***argv)
{
  df_core_init ();
  surfaces[0] = preset ("sphere");
  surfaces[1] = preset ("bump");
  surfaces[2] = preset ("torus");
  surfaces[3] = preset ("cone");
  return 0;
}

int
LLVMFuzzerTestOneInput (const unsigned char *data, size_t size)
{
  g_autofree char *text = NULL;
  g_autofree double (*uv)[2] = NULL;
  g_autoptr (GError) error = NULL;
  g_autoptr (df_curve) curve = NULL;
  g_auto (df_loop_result) result = { 0 };
  const df_surface *s;
  df_loop_options options;
  df_diag diag;
  gsize n = 0;

  if (size < 1 || (size > FUZZ_MAX_INPUT && !fuzz_replaying))
    return 0;
  s = surfaces[data[0] % G_N_ELEMENTS (surfaces)];
  text = fuzz_string (data + 1, size - 1);

  if (!df_loop_csv_parse (text, "fuzz.csv", s, &uv, &n, &error))
    {
      fuzz_check_error ("df_loop_csv_parse", error);
      FUZZ_REQUIRE (g_str_has_prefix (error->message, "fuzz.csv"));
      return 0;
    }
  FUZZ_REQUIRE (n >= 3);
  for (gsize i = 0; i < n; i++)
    FUZZ_REQUIRE (isfinite (uv[i][0]) && isfinite (uv[i][1]) && df_surface_contains (s, uv[i][0], uv[i][1]));
  if (n > MAX_MEASURED_POINTS)
    return 0;

  df_diag_clear (&diag);
  if (df_curve_new_through_points (s, (const double (*)[2]) uv, n, true, &curve, &diag) != DF_OK)
    {
      fuzz_check_detail ("df_curve_new_through_points", diag.detail);
      return 0;
    }
  df_loop_options_init (&options);
  options.n_samples = 16;
  df_diag_clear (&diag);
  if (df_loop_measure (curve, &options, &result, &diag) != DF_OK)
    {
      fuzz_check_detail ("df_loop_measure", diag.detail);
      return 0;
    }
  FUZZ_REQUIRE (isfinite (result.holonomy_rad));
  FUZZ_REQUIRE (result.holonomy_rad > -M_PI && result.holonomy_rad <= M_PI);
  FUZZ_REQUIRE (isfinite (result.length) && result.length > 0.0);
  if (result.bounds_disc)
    FUZZ_REQUIRE (isfinite (result.enclosed_curvature_rad) && isfinite (result.area));
  return 0;
}
