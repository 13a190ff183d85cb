/* df-units.c: conversion between length units (see df-units.h). Plain C; no GLib. */
#include "df-units.h"

#include <string.h>

static const struct
{
  const char *name;
  double      metres;
} units[DF_N_UNITS] = {
  [DF_UNIT_MM] = { "mm", 1e-3 },
  [DF_UNIT_CM] = { "cm", 1e-2 },
  [DF_UNIT_M] = { "m", 1.0 },
  /* The international inch, 25.4 mm exactly (1959 agreement). */
  [DF_UNIT_IN] = { "in", 0.0254 },
};

bool
df_unit_from_name (const char *name, df_unit *out)
{
  if (name == NULL)
    return false;
  for (int i = 0; i < DF_N_UNITS; i++)
    if (strcmp (name, units[i].name) == 0)
      {
        *out = (df_unit) i;
        return true;
      }
  if (strcmp (name, "inch") == 0)
    {
      *out = DF_UNIT_IN;
      return true;
    }
  return false;
}

const char *
df_unit_name (df_unit unit)
{
  return unit < DF_N_UNITS ? units[unit].name : "?";
}

double
df_unit_metres (df_unit unit)
{
  return unit < DF_N_UNITS ? units[unit].metres : 1.0;
}

double
df_unit_length (double value, df_unit from, df_unit to)
{
  return from == to ? value : value * (df_unit_metres (from) / df_unit_metres (to));
}

double
df_unit_area (double value, df_unit from, df_unit to)
{
  double f = df_unit_metres (from) / df_unit_metres (to);

  return from == to ? value : value * f * f;
}

double
df_unit_curvature (double value, df_unit from, df_unit to)
{
  return from == to ? value : value * (df_unit_metres (to) / df_unit_metres (from));
}

double
df_unit_gaussian (double value, df_unit from, df_unit to)
{
  double f = df_unit_metres (to) / df_unit_metres (from);

  return from == to ? value : value * f * f;
}

void
df_display_units_init (df_display_units *du, df_unit model)
{
  du->model = model;
  du->length = model;
  du->curvature = model;
}
