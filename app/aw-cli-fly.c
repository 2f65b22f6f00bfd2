/* aw-cli-fly.c: "arcwright-cli fly", one trajectory
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <math.h>
#include <stdio.h>

#include "aw-analysis.h"
#include "aw-cli.h"
#include "aw-project.h"
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
          "  --format text|csv|json\n\n"
          "  --project FILE --setup NAME\n"
          "                        fly a setup stored in a project: its BB, muzzle velocity for\n"
          "                        that BB, height, hop (auto, lift ratio or spin), zero, air\n"
          "                        and wind; any option above overrides the stored value\n"
          "                        (--mass-g alone takes the velocity from the replica's\n"
          "                        energy-versus-mass behaviour)\n");
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

/* Air from the setup's conditions with the air options given on the command line laid over
 * them (the options' own defaults would otherwise replace the stored conditions). */
static bool
project_air (const AwProjectConditions *stored, AwCliShotOptions *so, AwShot *shot)
{
  if (!(so->seen_temperature || so->seen_pressure || so->seen_altitude || so->seen_humidity
        || so->seen_density || so->seen_viscosity))
    return true;
  if (so->seen_pressure && so->seen_altitude)
    {
      aw_cli_error ("fly", "--pressure-hpa and --altitude-m: give only one");
      return false;
    }
  AwConditions c;
  aw_conditions_init_standard (&c);
  c.temperature_c = so->seen_temperature ? so->temperature_c : stored->temperature_c;
  if (so->seen_altitude || (!so->seen_pressure && isnan (stored->pressure_hpa)))
    {
      c.pressure_hpa = NAN;
      c.altitude_m = so->seen_altitude ? so->altitude_m : stored->altitude_m;
    }
  else
    c.pressure_hpa = so->seen_pressure ? so->pressure_hpa : stored->pressure_hpa;
  c.humidity = (so->seen_humidity ? so->humidity_pct : stored->humidity_pct) / 100.0;
  c.density = so->seen_density ? so->density : NAN;
  c.viscosity = so->seen_viscosity ? so->viscosity : NAN;
  if (aw_air_from_conditions (&c, &shot->air) != AW_AIR_OK)
    {
      aw_cli_error ("fly", "the air conditions are out of range");
      return false;
    }
  so->seen_temperature = so->seen_pressure = so->seen_altitude = false;
  so->seen_humidity = so->seen_density = so->seen_viscosity = false;
  return true;
}

/* Builds the shot of a stored setup with the options laid over it. */
static bool
project_shot (const char *file, const char *name, AwCliShotOptions *so, AwShot *shot,
              double *lift_ratio, char **description)
{
  AwProject *project = NULL;
  AwSetup *setup = NULL;
  AwAnalysisInput in;
  bool ok = false;

  if (!aw_cli_load_setup (file, name, "fly", &project, &setup))
    return false;

  AwBridgeStatus bs = aw_setup_to_analysis_input (setup, project, &in);
  if (bs != AW_BRIDGE_OK)
    {
      aw_cli_error ("fly", "%s: setup \"%s\" cannot be flown (%s)", file, name,
                    aw_bridge_status_name (bs));
      goto out;
    }

  AwCliShotOptions rest = *so;
  if (!project_air (aw_setup_effective_conditions (setup, project), &rest, &in.shot))
    goto out;
  if (!aw_cli_shot_options_apply (&rest, &in.shot, lift_ratio, "fly"))
    goto out;
  if (so->seen_mass && !(so->seen_velocity_mps || so->seen_velocity_fps || so->seen_energy))
    {
      /* a different BB: its velocity from the replica's energy-versus-mass behaviour */
      AwPowerCurve curve;
      aw_setup_power_curve (setup, &curve);
      double v = aw_power_velocity_for_mass (&curve, in.shot.mass_kg);
      if (!(v > 0.0 && v <= 300.0))
        {
          aw_cli_error ("fly", "--mass-g: the replica of setup \"%s\" gives no usable velocity "
                        "with a %g g BB", name, so->mass_g);
          goto out;
        }
      in.shot.velocity_mps = v;
      if (isfinite (*lift_ratio))
        {
          /* the lift ratio given was converted with the stored velocity: convert again */
          double w;
          if (aw_shot_spin_for_lift_ratio (&in.shot, *lift_ratio, &w) == AW_HOP_OK)
            in.shot.spin_rad_s = w;
        }
    }

  const char *hop_text = "";
  if (!so->seen_spin && !so->seen_lift_ratio)
    {
      switch (setup->hop.mode)
        {
        case AW_HOP_MODE_LIFT_RATIO:
          {
            double w;
            AwHopStatus hs = aw_shot_spin_for_lift_ratio (&in.shot, setup->hop.value, &w);
            if (hs != AW_HOP_OK)
              {
                aw_cli_error ("fly", "setup \"%s\": the stored lift ratio %g cannot be reached "
                              "with its lift model at this speed", name, setup->hop.value);
                goto out;
              }
            in.shot.spin_rad_s = w;
            *lift_ratio = setup->hop.value;
            hop_text = "stored lift ratio";
            break;
          }
        case AW_HOP_MODE_SPIN:
          in.shot.spin_rad_s = aw_rpm_to_rad_s (setup->hop.value);
          hop_text = "stored model spin";
          break;
        case AW_HOP_MODE_AUTO:
        default:
          {
            AwBandResult br;
            AwAnalysisStatus as = aw_auto_hop (&in, &br);
            if (as < 0 || !isfinite (br.spin_rad_s))
              {
                aw_cli_error ("fly", "setup \"%s\": the automatic hop could not be found (%s)",
                              name, aw_analysis_status_name (as));
                goto out;
              }
            in.shot.spin_rad_s = br.spin_rad_s;
            *lift_ratio = br.lift_ratio;
            hop_text = "automatic hop";
            break;
          }
        }
    }
  else
    hop_text = "hop from the command line";

  const char *zero_text = "level bore";
  if (!so->seen_elevation && isfinite (setup->sighting.zero_distance_m)
      && setup->sighting.zero_distance_m > 0.0)
    {
      double elev;
      if (aw_zero_elevation (&in, &in.shot, setup->sighting.zero_distance_m, &elev)
          == AW_ANALYSIS_OK)
        {
          in.shot.elevation_rad = elev;
          zero_text = "bore elevated for the stored zero";
        }
      else
        {
          aw_cli_error ("fly", "setup \"%s\": no bore elevation reaches the zero at %g m; "
                        "flying with a level bore", name, setup->sighting.zero_distance_m);
        }
    }
  else if (so->seen_elevation)
    zero_text = "elevation from the command line";

  *shot = in.shot;
  *description = g_strdup_printf ("Setup \"%s\" from %s (%s, %s)", setup->name, file, hop_text,
                                  zero_text);
  ok = true;

out:
  aw_project_free (project);
  return ok;
}

int
aw_cli_fly (int argc, char **argv)
{
  AwCliShotOptions so;
  AwShot shot;
  AwFlightOptions fo;
  AwTrajectory tr = { 0 };
  double step = 1.0, lift_ratio;
  const char *project_file = NULL, *setup_name = NULL;
  g_autofree char *description = NULL;
  bool help = false;
  int fmt = AW_CLI_FORMAT_TEXT;
  g_autoptr (GArray) args = g_array_new (TRUE, TRUE, sizeof (AwCliArg));

  aw_cli_shot_options_init (&so);
  aw_cli_shot_options_add (&so, args);
  g_array_append_val (args, ((AwCliArg) { "step-m", AW_CLI_ARG_POSITIVE, &step, 0.01, 1000, NULL }));
  AW_CLI_ADD_CHOICE (args, "format", &fmt, aw_cli_format_words, NULL);
  g_array_append_val (args, ((AwCliArg) { "help", AW_CLI_ARG_FLAG, &help, 0, 0, NULL }));
  g_array_append_val (args, ((AwCliArg) { "project", AW_CLI_ARG_STRING, &project_file, 0, 0,
                                          NULL }));
  g_array_append_val (args, ((AwCliArg) { "setup", AW_CLI_ARG_STRING, &setup_name, 0, 0,
                                          NULL }));

  if (!aw_cli_parse (argc, argv, 2, (const AwCliArg *) args->data, NULL, "fly"))
    return AW_CLI_EXIT_USAGE;
  if (help)
    {
      print_help ();
      return AW_CLI_EXIT_OK;
    }

  if ((project_file == NULL) != (setup_name == NULL))
    {
      aw_cli_error ("fly", "%s: give --project FILE and --setup NAME together",
                    project_file ? "--setup" : "--project");
      return AW_CLI_EXIT_USAGE;
    }
  if (project_file != NULL)
    {
      if (!project_shot (project_file, setup_name, &so, &shot, &lift_ratio, &description))
        return AW_CLI_EXIT_USAGE;
    }
  else
    {
      aw_shot_init (&shot);
      if (!aw_cli_shot_options_apply (&so, &shot, &lift_ratio, "fly"))
        return AW_CLI_EXIT_USAGE;
    }
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
  if (st == AW_FLIGHT_TIME_LIMIT)
    aw_cli_error ("fly", "the BB was still in the air after %g s; the output stops there",
                  fo.max_time_s);

  switch (fmt)
    {
    case AW_CLI_FORMAT_JSON:
      print_json (&shot, &tr, lift_ratio);
      break;
    case AW_CLI_FORMAT_CSV:
      print_csv (&tr);
      break;
    case AW_CLI_FORMAT_TEXT:
    default:
      if (description != NULL)
        printf ("%s\n", description);
      print_text (&shot, &tr, lift_ratio);
      break;
    }
  aw_trajectory_clear (&tr);
  return AW_CLI_EXIT_OK;
}
