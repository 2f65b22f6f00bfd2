/* aw-cli.c: arcwright-cli, the command-line front end for batch work and scripts
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <errno.h>
#include <locale.h>
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "aw-cli.h"
#include "aw-units.h"

typedef struct
{
  const char *name;
  int (*run) (int argc, char **argv);
  const char *summary;
} AwCliCommand;

static const AwCliCommand commands[] = {
  { "fly", aw_cli_fly, "compute one trajectory and print it" },
  { "check", aw_cli_check, "validate a project file and list every problem" },
  { "sweep", aw_cli_sweep, "vary one or two inputs and print a metric at every point" },
  { "table", aw_cli_table, "range table and band range of one setup" },
  { "recommend", aw_cli_recommend, "compare BB masses for one replica and recommend one" },
#ifdef AW_HAVE_PRINT
  { "card", aw_cli_print, "write range cards as a PDF" },
  { "sheet", aw_cli_print, "write customer setup sheets as a PDF" },
  { "loadout", aw_cli_print, "write a team loadout sheet as a PDF" },
#endif
  { NULL, NULL, NULL }
};

const char *const aw_cli_format_words[] = { "text", "csv", "json", NULL };

/* "a, b or c" */
static char *
choice_list (const char *const *choices)
{
  GString *s = g_string_new (NULL);
  for (guint i = 0; choices[i]; i++)
    {
      if (i > 0)
        g_string_append (s, choices[i + 1] ? ", " : " or ");
      g_string_append (s, choices[i]);
    }
  return g_string_free (s, FALSE);
}

void
aw_cli_error (const char *command, const char *format, ...)
{
  va_list ap;
  g_autofree char *msg = NULL;

  va_start (ap, format);
  msg = g_strdup_vprintf (format, ap);
  va_end (ap);
  if (command)
    fprintf (stderr, "arcwright-cli %s: %s\n", command, msg);
  else
    fprintf (stderr, "arcwright-cli: %s\n", msg);
}

char *
aw_cli_num (char *buf, size_t len, double v, int digits)
{
  char fmt[16];
  if (v == 0.0)
    v = 0.0; /* no "-0" */
  if (!isfinite (v))
    {
      g_strlcpy (buf, "null", len);
      return buf;
    }
  g_snprintf (fmt, sizeof fmt, "%%.%dg", digits);
  g_ascii_formatd (buf, len, fmt, v);
  return buf;
}

static bool
parse_number (const char *command, const char *name, const char *text, double *out)
{
  char *end = NULL;
  double v;

  if (text == NULL || *text == '\0')
    {
      aw_cli_error (command, "--%s: needs a number", name);
      return false;
    }
  errno = 0;
  v = g_ascii_strtod (text, &end);
  if (end != text && *end == '\0' && errno == ERANGE)
    {
      aw_cli_error (command, "--%s: out of range (found \"%s\")", name, text);
      return false;
    }
  if (end == text || *end != '\0')
    {
      aw_cli_error (command, "--%s: not a number: \"%s\"", name, text);
      return false;
    }
  if (!isfinite (v))
    {
      aw_cli_error (command, "--%s: must be a finite number (found \"%s\")", name, text);
      return false;
    }
  *out = v;
  return true;
}

bool
aw_cli_parse (int argc, char **argv, int first, const AwCliArg *args, GPtrArray *positionals,
              const char *command)
{
  for (int i = first; i < argc; i++)
    {
      const char *a = argv[i];
      const char *value = NULL;
      g_autofree char *name = NULL;
      const AwCliArg *arg = NULL;

      if (a[0] != '-' || a[1] != '-' || a[2] == '\0')
        {
          if (a[0] == '-' && a[1] != '\0' && !g_ascii_isdigit (a[1]) && a[1] != '.')
            {
              aw_cli_error (command, "%s: unknown option (options start with --)", a);
              return false;
            }
          if (positionals == NULL)
            {
              aw_cli_error (command, "unexpected argument \"%s\"", a);
              return false;
            }
          g_ptr_array_add (positionals, (gpointer) a);
          continue;
        }
      const char *eq = strchr (a + 2, '=');
      if (eq)
        {
          name = g_strndup (a + 2, eq - (a + 2));
          value = eq + 1;
        }
      else
        name = g_strdup (a + 2);

      for (const AwCliArg *p = args; p->name; p++)
        if (strcmp (p->name, name) == 0)
          {
            arg = p;
            break;
          }
      if (arg == NULL)
        {
          aw_cli_error (command, "--%s: unknown option", name);
          return false;
        }
      if (arg->kind == AW_CLI_ARG_FLAG)
        {
          if (value)
            {
              aw_cli_error (command, "--%s: takes no value", name);
              return false;
            }
          *(bool *) arg->target = true;
          if (arg->seen)
            *arg->seen = true;
          continue;
        }
      if (!value)
        {
          if (i + 1 >= argc)
            {
              aw_cli_error (command, "--%s: needs a value", name);
              return false;
            }
          value = argv[++i];
        }
      switch (arg->kind)
        {
        case AW_CLI_ARG_DOUBLE:
        case AW_CLI_ARG_POSITIVE:
          {
            double v;
            if (!parse_number (command, name, value, &v))
              return false;
            if (arg->kind == AW_CLI_ARG_POSITIVE && !(v > 0.0))
              {
                aw_cli_error (command, "--%s: must be greater than 0 (found %s)", name, value);
                return false;
              }
            if (v < arg->lo || v > arg->hi)
              {
                char lo[32], hi[32];
                aw_cli_error (command, "--%s: must be between %s and %s (found %s)", name,
                              aw_cli_num (lo, sizeof lo, arg->lo, 6),
                              aw_cli_num (hi, sizeof hi, arg->hi, 6), value);
                return false;
              }
            *(double *) arg->target = v;
          }
          break;
        case AW_CLI_ARG_STRING:
          if (*value == '\0')
            {
              aw_cli_error (command, "--%s: needs a value", name);
              return false;
            }
          *(const char **) arg->target = value;
          break;
        case AW_CLI_ARG_STRINGS:
          g_ptr_array_add ((GPtrArray *) arg->target, (gpointer) value);
          break;
        case AW_CLI_ARG_CHOICE:
          {
            int found = -1;
            for (int k = 0; arg->choices[k]; k++)
              if (g_str_equal (arg->choices[k], value))
                found = k;
            if (found < 0)
              {
                g_autofree char *list = choice_list (arg->choices);
                aw_cli_error (command, "--%s: expected %s (found \"%s\")", name, list, value);
                return false;
              }
            *(int *) arg->target = found;
          }
          break;
        case AW_CLI_ARG_FLAG:
        default:
          break;
        }
      if (arg->seen)
        *arg->seen = true;
    }
  return true;
}

/* ---- shot options ---- */

void
aw_cli_shot_options_init (AwCliShotOptions *o)
{
  memset (o, 0, sizeof *o);
  o->mass_g = 0.20;
  o->diameter_mm = 5.95;
  o->velocity_mps = 90.0;
  o->height_m = 1.5;
  o->temperature_c = 15.0;
  o->pressure_hpa = 1013.25;
  o->drag = "clift";
  o->lift = "default";
}

#define ARG(n, k, t, l, h, s) AW_CLI_ADD (args, n, k, t, l, h, s)

void
aw_cli_shot_options_add (AwCliShotOptions *o, GArray *args)
{
  ARG ("mass-g", AW_CLI_ARG_POSITIVE, &o->mass_g, 0.01, 5.0, &o->seen_mass);
  ARG ("diameter-mm", AW_CLI_ARG_POSITIVE, &o->diameter_mm, 1.0, 20.0, &o->seen_diameter);
  ARG ("velocity-mps", AW_CLI_ARG_POSITIVE, &o->velocity_mps, 0.0, 300.0, &o->seen_velocity_mps);
  ARG ("velocity-fps", AW_CLI_ARG_POSITIVE, &o->velocity_fps, 0.0, 984.0, &o->seen_velocity_fps);
  ARG ("energy-j", AW_CLI_ARG_POSITIVE, &o->energy_j, 0.0, 100.0, &o->seen_energy);
  ARG ("spin-rpm", AW_CLI_ARG_DOUBLE, &o->spin_rpm, 0.0, 950000.0, &o->seen_spin);
  ARG ("lift-ratio", AW_CLI_ARG_DOUBLE, &o->lift_ratio, 0.0, 20.0, &o->seen_lift_ratio);
  ARG ("hop-tilt-deg", AW_CLI_ARG_DOUBLE, &o->hop_tilt_deg, -90.0, 90.0, &o->seen_tilt);
  ARG ("height-m", AW_CLI_ARG_DOUBLE, &o->height_m, 0.0, 100.0, &o->seen_height);
  ARG ("elevation-deg", AW_CLI_ARG_DOUBLE, &o->elevation_deg, -90.0, 90.0, &o->seen_elevation);
  ARG ("crosswind-mps", AW_CLI_ARG_DOUBLE, &o->crosswind_mps, -50.0, 50.0, &o->seen_crosswind);
  ARG ("temperature-c", AW_CLI_ARG_DOUBLE, &o->temperature_c, -40.0, 60.0, &o->seen_temperature);
  ARG ("pressure-hpa", AW_CLI_ARG_DOUBLE, &o->pressure_hpa, 500.0, 1100.0, &o->seen_pressure);
  ARG ("altitude-m", AW_CLI_ARG_DOUBLE, &o->altitude_m, -500.0, 6000.0, &o->seen_altitude);
  ARG ("humidity-pct", AW_CLI_ARG_DOUBLE, &o->humidity_pct, 0.0, 100.0, &o->seen_humidity);
  ARG ("density", AW_CLI_ARG_POSITIVE, &o->density, 0.5, 1.6, &o->seen_density);
  ARG ("viscosity", AW_CLI_ARG_POSITIVE, &o->viscosity, 1e-5, 3e-5, &o->seen_viscosity);
  ARG ("gravity", AW_CLI_ARG_POSITIVE, &o->gravity, 0.1, 30.0, &o->seen_gravity);
  ARG ("drag", AW_CLI_ARG_STRING, &o->drag, 0, 0, &o->seen_drag);
  ARG ("lift", AW_CLI_ARG_STRING, &o->lift, 0, 0, &o->seen_lift);
}

static bool
parse_model_number (const char *s, double lo, double hi, double *out)
{
  char *end = NULL;
  double v = g_ascii_strtod (s, &end);
  if (end == s || *end != '\0' || !isfinite (v) || v < lo || v > hi)
    return false;
  *out = v;
  return true;
}

bool
aw_cli_parse_drag (const char *s, AwAeroModel *model)
{
  if (g_str_equal (s, "clift"))
    model->drag = AW_DRAG_CLIFT;
  else if (g_str_equal (s, "morrison"))
    model->drag = AW_DRAG_MORRISON;
  else if (g_str_equal (s, "off"))
    model->drag = AW_DRAG_OFF;
  else if (g_str_has_prefix (s, "const:"))
    {
      if (!parse_model_number (s + 6, 0.0, 10.0, &model->drag_cd) || model->drag_cd <= 0.0)
        return false;
      model->drag = AW_DRAG_CONSTANT;
    }
  else
    return false;
  return true;
}

bool
aw_cli_parse_lift (const char *s, AwAeroModel *model)
{
  if (g_str_equal (s, "default"))
    model->lift = AW_LIFT_SATURATING;
  else if (g_str_equal (s, "shs"))
    model->lift = AW_LIFT_SHS;
  else if (g_str_equal (s, "loth"))
    model->lift = AW_LIFT_LOTH;
  else if (g_str_equal (s, "off"))
    model->lift = AW_LIFT_OFF;
  else if (g_str_equal (s, "trade"))
    {
      model->lift = AW_LIFT_LINEAR;
      model->lift_slope = AW_LIFT_TRADE_SLOPE;
    }
  else if (g_str_has_prefix (s, "linear:"))
    {
      if (!parse_model_number (s + 7, 0.0, 10.0, &model->lift_slope) || model->lift_slope <= 0.0)
        return false;
      model->lift = AW_LIFT_LINEAR;
    }
  else
    return false;
  return true;
}

bool
aw_cli_shot_options_apply (const AwCliShotOptions *o, AwShot *shot, double *hop_lift_ratio,
                           const char *command)
{
  int n_vel = o->seen_velocity_mps + o->seen_velocity_fps + o->seen_energy;

  *hop_lift_ratio = NAN;
  if (n_vel > 1)
    {
      aw_cli_error (command, "--velocity-mps, --velocity-fps and --energy-j: give only one");
      return false;
    }
  if (o->seen_spin && o->seen_lift_ratio)
    {
      aw_cli_error (command, "--spin-rpm and --lift-ratio: give only one");
      return false;
    }
  if (o->seen_pressure && o->seen_altitude)
    {
      aw_cli_error (command, "--pressure-hpa and --altitude-m: give only one");
      return false;
    }
  if (o->seen_drag && !aw_cli_parse_drag (o->drag, &shot->aero))
    {
      aw_cli_error (command, "--drag: expected clift, morrison, off or const:CD with CD > 0 "
                    "(found \"%s\")", o->drag);
      return false;
    }
  if (o->seen_lift && !aw_cli_parse_lift (o->lift, &shot->aero))
    {
      aw_cli_error (command, "--lift: expected default, shs, loth, off, trade or linear:K with "
                    "K > 0 (found \"%s\")", o->lift);
      return false;
    }
  if (o->seen_mass)
    shot->mass_kg = aw_g_to_kg (o->mass_g);
  if (o->seen_diameter)
    shot->diameter_m = aw_mm_to_m (o->diameter_mm);
  if (o->seen_velocity_mps)
    shot->velocity_mps = o->velocity_mps;
  else if (o->seen_velocity_fps)
    shot->velocity_mps = aw_fps_to_mps (o->velocity_fps);
  else if (o->seen_energy)
    shot->velocity_mps = aw_velocity_for_energy (shot->mass_kg, o->energy_j);
  if (!(shot->velocity_mps > 0.0 && shot->velocity_mps <= 300.0))
    {
      aw_cli_error (command, "%s: gives a muzzle velocity of %.1f m/s, outside 0 … 300 m/s",
                    o->seen_energy ? "--energy-j" : "--velocity-fps", shot->velocity_mps);
      return false;
    }
  if (o->seen_tilt)
    shot->hop_tilt_rad = aw_deg_to_rad (o->hop_tilt_deg);
  if (o->seen_height)
    shot->height_m = o->height_m;
  if (o->seen_elevation)
    shot->elevation_rad = aw_deg_to_rad (o->elevation_deg);
  if (o->seen_crosswind)
    shot->wind[1] = o->crosswind_mps;
  if (o->seen_gravity)
    shot->gravity = o->gravity;

  if (o->seen_temperature || o->seen_pressure || o->seen_altitude || o->seen_humidity
      || o->seen_density || o->seen_viscosity)
    {
      AwConditions c;
      AwAir air;
      aw_conditions_init_standard (&c);
      c.temperature_c = o->seen_temperature ? o->temperature_c
                        : (o->seen_altitude ? NAN : 15.0);
      if (o->seen_altitude)
        {
          c.pressure_hpa = NAN;
          c.altitude_m = o->altitude_m;
        }
      else if (o->seen_pressure)
        c.pressure_hpa = o->pressure_hpa;
      c.humidity = o->seen_humidity ? o->humidity_pct / 100.0 : 0.0;
      c.density = o->seen_density ? o->density : NAN;
      c.viscosity = o->seen_viscosity ? o->viscosity : NAN;
      if (aw_air_from_conditions (&c, &air) != AW_AIR_OK)
        {
          aw_cli_error (command, "the air conditions are out of range");
          return false;
        }
      shot->air = air;
    }

  if (o->seen_spin)
    shot->spin_rad_s = aw_rpm_to_rad_s (o->spin_rpm);
  if (o->seen_lift_ratio)
    {
      double w;
      switch (aw_shot_spin_for_lift_ratio (shot, o->lift_ratio, &w))
        {
        case AW_HOP_OK:
          shot->spin_rad_s = w;
          *hop_lift_ratio = o->lift_ratio;
          break;
        case AW_HOP_UNREACHABLE:
          aw_cli_error (command, "--lift-ratio: %g cannot be reached with the chosen lift model "
                        "at this speed (it saturates); lower the ratio or choose another --lift",
                        o->lift_ratio);
          return false;
        case AW_HOP_NO_LIFT:
          aw_cli_error (command, "--lift-ratio: the lift model is off, so no spin gives lift");
          return false;
        case AW_HOP_BAD_INPUT:
        default:
          aw_cli_error (command, "--lift-ratio: cannot be converted with these shot values");
          return false;
        }
    }
  return true;
}

static void
usage (FILE *out)
{
  fprintf (out, "Usage: arcwright-cli COMMAND [OPTIONS]\n\nCommands:\n");
  for (const AwCliCommand *c = commands; c->name; c++)
    fprintf (out, "  %-10s %s\n", c->name, c->summary);
  fprintf (out, "\nRun \"arcwright-cli COMMAND --help\" for the options of a command.\n");
}

int
main (int argc, char **argv)
{
  setlocale (LC_ALL, "");

  if (argc < 2)
    {
      usage (stderr);
      return AW_CLI_EXIT_USAGE;
    }
  if (g_str_equal (argv[1], "--help") || g_str_equal (argv[1], "-h")
      || g_str_equal (argv[1], "help"))
    {
      usage (stdout);
      return AW_CLI_EXIT_OK;
    }
  if (g_str_equal (argv[1], "--version"))
    {
      printf ("arcwright-cli %s\n", AW_VERSION);
      return AW_CLI_EXIT_OK;
    }
  for (const AwCliCommand *c = commands; c->name; c++)
    if (g_str_equal (c->name, argv[1]))
      return c->run (argc, argv);

  aw_cli_error (NULL, "unknown command \"%s\"", argv[1]);
  usage (stderr);
  return AW_CLI_EXIT_USAGE;
}
