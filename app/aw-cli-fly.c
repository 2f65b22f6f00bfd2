/* aw-cli-fly.c: "arcwright-cli fly", one trajectory
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <math.h>
#include <stdio.h>

#include "aw-cli.h"
#include "aw-units.h"

static void
print_help (void)
{
  printf ("Usage: arcwright-cli fly [OPTIONS]\n\n"
          "Computes one trajectory and prints it.\n\n"
          "  --mass-g G            BB mass (default 0.20)\n"
          "  --diameter-mm MM      BB diameter (default 5.95)\n"
          "  --velocity-mps V | --velocity-fps V | --energy-j E\n"
          "                        muzzle velocity with this BB (default 90 m/s)\n"
          "  --spin-rpm RPM | --lift-ratio R\n"
          "                        hop as model spin, or as Magnus force / weight at the muzzle\n"
          "  --hop-tilt-deg DEG    roll of the spin axis; positive curves right\n"
          "  --height-m M          muzzle height (default 1.5)\n"
          "  --elevation-deg DEG   bore elevation (default 0, level)\n"
          "  --crosswind-mps W     wind from the right toward the left\n"
          "  --temperature-c C  --pressure-hpa P | --altitude-m M  --humidity-pct H\n"
          "  --density RHO  --viscosity MU  --gravity G   direct overrides (SI units)\n"
          "  --drag clift|morrison|off|const:CD\n"
          "  --lift default|shs|loth|off|linear:K|trade\n"
          "  --step-m M            sample spacing downrange (default 1)\n"
          "  --format text|csv|json\n");
}

typedef enum { FMT_TEXT, FMT_CSV, FMT_JSON } Format;

static bool
parse_format (const char *s, Format *f)
{
  if (g_str_equal (s, "text"))
    *f = FMT_TEXT;
  else if (g_str_equal (s, "csv"))
    *f = FMT_CSV;
  else if (g_str_equal (s, "json"))
    *f = FMT_JSON;
  else
    return false;
  return true;
}

static void
print_json (const AwShot *shot, const AwTrajectory *tr, double lift_ratio)
{
  char b[9][40];
  printf ("{\"summary\": {\"time_of_flight_s\": %s, \"ground_distance_m\": %s, "
          "\"apex_height_m\": %s, \"apex_distance_m\": %s, \"impact_speed_mps\": %s, "
          "\"impact_energy_j\": %s, \"impact_spin_rpm\": %s, \"muzzle_spin_rpm\": %s, "
          "\"muzzle_lift_ratio\": %s},\n \"samples\": [",
          aw_cli_num (b[0], 40, tr->time_of_flight, 9),
          aw_cli_num (b[1], 40, tr->ground_distance, 9),
          aw_cli_num (b[2], 40, tr->apex_height, 9),
          aw_cli_num (b[3], 40, tr->apex_distance, 9),
          aw_cli_num (b[4], 40, tr->impact_speed, 9),
          aw_cli_num (b[5], 40, tr->impact_energy, 9),
          aw_cli_num (b[6], 40, aw_rad_s_to_rpm (tr->impact_spin), 9),
          aw_cli_num (b[7], 40, aw_rad_s_to_rpm (shot->spin_rad_s), 9),
          aw_cli_num (b[8], 40, lift_ratio, 9));
  for (size_t i = 0; i < tr->n_samples; i++)
    {
      const AwSample *s = &tr->samples[i];
      printf ("%s\n  {\"t_s\": %s, \"x_m\": %s, \"y_m\": %s, \"z_m\": %s, \"speed_mps\": %s, "
              "\"spin_rpm\": %s, \"energy_j\": %s}",
              i ? "," : "",
              aw_cli_num (b[0], 40, s->t, 9), aw_cli_num (b[1], 40, s->x, 9),
              aw_cli_num (b[2], 40, s->y, 9), aw_cli_num (b[3], 40, s->z, 9),
              aw_cli_num (b[4], 40, s->speed, 9),
              aw_cli_num (b[5], 40, aw_rad_s_to_rpm (s->spin), 9),
              aw_cli_num (b[6], 40, s->energy, 9));
    }
  printf ("]}\n");
}

static void
print_csv (const AwTrajectory *tr)
{
  char b[7][40];
  printf ("t_s,x_m,y_m,z_m,speed_mps,spin_rpm,energy_j\r\n");
  for (size_t i = 0; i < tr->n_samples; i++)
    {
      const AwSample *s = &tr->samples[i];
      printf ("%s,%s,%s,%s,%s,%s,%s\r\n",
              aw_cli_num (b[0], 40, s->t, 9), aw_cli_num (b[1], 40, s->x, 9),
              aw_cli_num (b[2], 40, s->y, 9), aw_cli_num (b[3], 40, s->z, 9),
              aw_cli_num (b[4], 40, s->speed, 9),
              aw_cli_num (b[5], 40, aw_rad_s_to_rpm (s->spin), 9),
              aw_cli_num (b[6], 40, s->energy, 9));
    }
}

static void
print_text (const AwShot *shot, const AwTrajectory *tr, double lift_ratio)
{
  printf ("BB %.2f g, %.2f mm at %.1f m/s (%.0f fps), %.3f J; muzzle height %.2f m, "
          "elevation %.2f°\n",
          aw_kg_to_g (shot->mass_kg), aw_m_to_mm (shot->diameter_m), shot->velocity_mps,
          aw_mps_to_fps (shot->velocity_mps), aw_energy_j (shot->mass_kg, shot->velocity_mps),
          shot->height_m, aw_rad_to_deg (shot->elevation_rad));
  printf ("Hop: lift ratio %.3f, model spin %.0f rpm (depends on the lift model)\n", lift_ratio,
          aw_rad_s_to_rpm (shot->spin_rad_s));
  printf ("Time of flight %.3f s, ground distance %.2f m, drift %.2f m\n", tr->time_of_flight,
          tr->ground_distance, tr->ground_drift);
  printf ("Apex %.3f m at %.2f m; impact %.1f m/s, %.3f J, %.0f rpm\n\n", tr->apex_height,
          tr->apex_distance, tr->impact_speed, tr->impact_energy,
          aw_rad_s_to_rpm (tr->impact_spin));
  printf ("%8s %8s %8s %8s %8s %9s %8s\n", "t s", "x m", "y m", "z m", "speed", "spin rpm",
          "energy J");
  for (size_t i = 0; i < tr->n_samples; i++)
    {
      const AwSample *s = &tr->samples[i];
      printf ("%8.3f %8.2f %8.3f %8.3f %8.2f %9.0f %8.4f\n", s->t, s->x, s->y, s->z, s->speed,
              aw_rad_s_to_rpm (s->spin), s->energy);
    }
}

int
aw_cli_fly (int argc, char **argv)
{
  AwCliShotOptions so;
  AwShot shot;
  AwFlightOptions fo;
  AwTrajectory tr = { 0 };
  double step = 1.0, lift_ratio;
  const char *format = "text";
  bool help = false;
  Format fmt;
  g_autoptr (GArray) args = g_array_new (TRUE, TRUE, sizeof (AwCliArg));

  aw_cli_shot_options_init (&so);
  aw_cli_shot_options_add (&so, args);
  g_array_append_val (args, ((AwCliArg) { "step-m", AW_CLI_ARG_POSITIVE, &step, 0.01, 1000, NULL }));
  g_array_append_val (args, ((AwCliArg) { "format", AW_CLI_ARG_STRING, &format, 0, 0, NULL }));
  g_array_append_val (args, ((AwCliArg) { "help", AW_CLI_ARG_FLAG, &help, 0, 0, NULL }));

  if (!aw_cli_parse (argc, argv, 2, (const AwCliArg *) args->data, NULL, "fly"))
    return AW_CLI_EXIT_USAGE;
  if (help)
    {
      print_help ();
      return AW_CLI_EXIT_OK;
    }
  if (!parse_format (format, &fmt))
    {
      aw_cli_error ("fly", "--format: expected text, csv or json (found \"%s\")", format);
      return AW_CLI_EXIT_USAGE;
    }

  aw_shot_init (&shot);
  if (!aw_cli_shot_options_apply (&so, &shot, &lift_ratio, "fly"))
    return AW_CLI_EXIT_USAGE;
  if (isnan (lift_ratio))
    lift_ratio = aw_shot_lift_ratio_for_spin (&shot, shot.spin_rad_s);

  aw_flight_options_init (&fo);
  fo.sample_step_m = step;
  AwFlightStatus st = aw_flight_run (&shot, &fo, &tr);
  if (st < 0)
    {
      if (st == AW_FLIGHT_BAD_INPUT)
        aw_cli_error ("fly", "the shot is out of range (%s)", aw_shot_status_name (tr.shot_status));
      else
        aw_cli_error ("fly", "the flight could not be computed (%s)", aw_flight_status_name (st));
      aw_trajectory_clear (&tr);
      return st == AW_FLIGHT_BAD_INPUT ? AW_CLI_EXIT_USAGE : AW_CLI_EXIT_FAILED;
    }

  switch (fmt)
    {
    case FMT_JSON:
      print_json (&shot, &tr, lift_ratio);
      break;
    case FMT_CSV:
      print_csv (&tr);
      break;
    case FMT_TEXT:
    default:
      print_text (&shot, &tr, lift_ratio);
      break;
    }
  aw_trajectory_clear (&tr);
  return AW_CLI_EXIT_OK;
}
