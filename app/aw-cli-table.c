/* aw-cli-table.c: "arcwright-cli table", the range table of one setup
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

#include "aw-analysis.h"
#include "aw-cli.h"
#include "aw-cli-site.h"
#include "aw-units.h"

static void
print_help (void)
{
  printf ("Usage: arcwright-cli table [OPTIONS]\n\n"
          "Range table of one setup: rise or drop against the sight line, hold, time of flight,\n"
          "speed, energy, model spin and wind drift by distance, and the band range.\n\n"
          "  --project FILE --setup NAME   take the setup from a project (options below override)\n"
          "  (or the shot options of \"fly\": --mass-g, --velocity-mps|--velocity-fps|--energy-j,\n"
          "   --height-m, --elevation-deg, --hop-tilt-deg, --crosswind-mps, air and models)\n"
          "  --hop auto|RATIO      hop: auto (longest band range) or a lift ratio (default auto)\n"
          "  --spin-rpm RPM | --lift-ratio R   hop given directly instead of --hop\n"
          "  --band-cm CM          half-height of the band around the sight line (default 15)\n"
          "  --sight-height-cm CM  sight line above the bore (default 0)\n"
          "  --zero-m M            zero distance: the bore is tilted so the BB comes down through\n"
          "                        the sight line there (default none: the bore as given)\n"
          "  --optimise-elevation  auto hop also chooses the bore elevation (no zero)\n"
          "  --angle-unit mrad|moa hold angle unit (default mrad)\n"
          "  --step-m M            row spacing (default 5)\n"
          "  --max-m M             last distance (default: to the ground)\n"
          "  --min-distance-m M    minimum engagement distance (rows before it are marked)\n"
          "  --limit-j J --chrono-mass-g G   site class limit and the BB its chrono uses\n"
          "  --site NAME --class NAME        site class from the project\n"
          "  --power constant-energy|constant-velocity|creep:PCT|measured\n"
          "  --measured-mps G:V,… | --measured-fps G:V,…   measured velocities per BB mass\n"
          "  --hop-limit RATIO|none  the highest lift ratio the hop-up reaches with the setup's\n"
          "                        own BB (default: the setup's hop limit, else none); auto hop\n"
          "                        stays under it, a given hop above it is flagged\n"
          "  --format text|csv|json\n");
}


typedef struct
{
  bool have_site;
  AwSiteClass site;
  AwCompliance compliance;
  double chrono_energy_j;
  double energy_j;
  bool energy_over_limit;
  double chrono_mass_kg;
} Compliance;

static const char *
compliance_name (AwCompliance c)
{
  switch (c)
    {
    case AW_COMPLIANCE_UNDER: return "under";
    case AW_COMPLIANCE_OVER: return "over";
    case AW_COMPLIANCE_UNKNOWN:
    default: return "unknown";
    }
}

static void
print_json (const AwAnalysisInput *in, const AwRangeTable *t, const Compliance *cp)
{
  char b[16][40];
  const AwBandResult *r = &t->band;
  printf ("{\"summary\": {\"status\": \"%s\", \"band_range_m\": %s, \"band_near_m\": %s, "
          "\"lift_ratio\": %s, \"muzzle_spin_rpm\": %s, \"bore_elevation_deg\": %s, "
          "\"ground_distance_m\": %s, \"apex_height_m\": %s, \"apex_distance_m\": %s, "
          "\"time_of_flight_s\": %s, \"band_half_cm\": %s, \"sight_height_cm\": %s, "
          "\"zero_m\": %s, \"angle_unit\": \"%s\", \"mass_g\": %s, \"velocity_mps\": %s, "
          "\"energy_j\": %s, \"hop_limit_lift_ratio\": %s, \"hop_limited\": %s, "
          "\"hop_over_limit\": %s",
          aw_analysis_status_name (r->status),
          aw_cli_num (b[0], 40, r->band_range_m, 9), aw_cli_num (b[1], 40, r->band_near_m, 9),
          aw_cli_num (b[2], 40, r->lift_ratio, 9),
          aw_cli_num (b[3], 40, aw_rad_s_to_rpm (r->spin_rad_s), 9),
          aw_cli_num (b[4], 40, aw_rad_to_deg (r->elevation_rad), 9),
          aw_cli_num (b[5], 40, r->ground_distance_m, 9),
          aw_cli_num (b[6], 40, r->apex_height_m, 9), aw_cli_num (b[7], 40, r->apex_distance_m, 9),
          aw_cli_num (b[8], 40, r->time_of_flight_s, 9),
          aw_cli_num (b[9], 40, in->band_half_m * 100.0, 9),
          aw_cli_num (b[10], 40, in->sight_height_m * 100.0, 9),
          aw_cli_num (b[11], 40, in->zero_distance_m > 0.0 ? in->zero_distance_m : NAN, 9),
          in->angle_unit == AW_ANGLE_MOA ? "moa" : "mrad",
          aw_cli_num (b[12], 40, aw_kg_to_g (in->shot.mass_kg), 9),
          aw_cli_num (b[13], 40, in->shot.velocity_mps, 9),
          aw_cli_num (b[14], 40, aw_energy_j (in->shot.mass_kg, in->shot.velocity_mps), 9),
          aw_cli_num (b[15], 40, r->hop_limit_lift_ratio, 9),
          r->hop_limited ? "true" : "false", r->hop_over_limit ? "true" : "false");
  if (cp->have_site)
    printf (", \"energy_limit_j\": %s, \"chrono_mass_g\": %s, \"chrono_energy_j\": %s, "
            "\"compliance\": \"%s\", \"energy_over_limit\": %s, \"min_engagement_m\": %s, "
            "\"energy_at_min_engagement_j\": %s",
            aw_cli_num (b[0], 40, cp->site.energy_limit_j, 9),
            aw_cli_num (b[1], 40, aw_kg_to_g (cp->chrono_mass_kg), 9),
            aw_cli_num (b[2], 40, cp->chrono_energy_j, 9), compliance_name (cp->compliance),
            cp->energy_over_limit ? "true" : "false",
            aw_cli_num (b[3], 40, cp->site.min_engagement_m, 9),
            aw_cli_num (b[4], 40, cp->site.min_engagement_m > 0.0
                                  ? aw_range_table_energy_at (t, cp->site.min_engagement_m)
                                  : NAN, 9));
  printf ("},\n \"rows\": [");
  for (size_t i = 0; i < t->n_rows; i++)
    {
      const AwRangeRow *w = &t->rows[i];
      printf ("%s\n  {\"distance_m\": %s, \"height_cm\": %s, \"hold_cm\": %s, \"hold_angle\": %s, "
              "\"time_s\": %s, \"speed_mps\": %s, \"energy_j\": %s, \"spin_rpm\": %s, "
              "\"drift_cm_per_mps\": %s, \"drift_cm\": %s, \"in_band\": %s, "
              "\"beyond_min_distance\": %s}",
              i ? "," : "",
              aw_cli_num (b[0], 40, w->distance_m, 9), aw_cli_num (b[1], 40, w->height_cm, 9),
              aw_cli_num (b[2], 40, w->hold_cm, 9), aw_cli_num (b[3], 40, w->hold_angle, 9),
              aw_cli_num (b[4], 40, w->time_s, 9), aw_cli_num (b[5], 40, w->speed_mps, 9),
              aw_cli_num (b[6], 40, w->energy_j, 9),
              aw_cli_num (b[7], 40, aw_rad_s_to_rpm (w->spin_rad_s), 9),
              aw_cli_num (b[8], 40, w->drift_cm_per_mps, 9), aw_cli_num (b[9], 40, w->drift_cm, 9),
              w->in_band ? "true" : "false", w->beyond_min_distance ? "true" : "false");
    }
  printf ("]}\n");
}

static void
print_csv (const AwAnalysisInput *in, const AwRangeTable *t)
{
  char b[10][40];
  printf ("distance_m,height_cm,hold_cm,hold_%s,time_s,speed_mps,energy_j,spin_rpm,"
          "drift_cm_per_mps,in_band,beyond_min_distance\r\n",
          in->angle_unit == AW_ANGLE_MOA ? "moa" : "mrad");
  for (size_t i = 0; i < t->n_rows; i++)
    {
      const AwRangeRow *w = &t->rows[i];
      printf ("%s,%s,%s,%s,%s,%s,%s,%s,%s,%d,%d\r\n",
              aw_cli_num (b[0], 40, w->distance_m, 9), aw_cli_num (b[1], 40, w->height_cm, 9),
              aw_cli_num (b[2], 40, w->hold_cm, 9),
              isfinite (w->hold_angle) ? aw_cli_num (b[3], 40, w->hold_angle, 9) : "",
              aw_cli_num (b[4], 40, w->time_s, 9), aw_cli_num (b[5], 40, w->speed_mps, 9),
              aw_cli_num (b[6], 40, w->energy_j, 9),
              aw_cli_num (b[7], 40, aw_rad_s_to_rpm (w->spin_rad_s), 9),
              isfinite (w->drift_cm_per_mps) ? aw_cli_num (b[8], 40, w->drift_cm_per_mps, 9) : "",
              w->in_band, w->beyond_min_distance);
    }
}

/* v without a "-0" after rounding to `decimals` places. */
static double
shown (double v, int decimals)
{
  double half = 0.5 * pow (10.0, -decimals);
  return fabs (v) < half ? 0.0 : v;
}

static void
print_text (const AwAnalysisInput *in, const AwRangeTable *t, const Compliance *cp)
{
  const AwBandResult *r = &t->band;
  const AwShot *s = &in->shot;
  const char *unit = in->angle_unit == AW_ANGLE_MOA ? "MOA" : "mrad";

  printf ("BB %.2f g at %.1f m/s (%.0f fps with this BB), %.3f J; muzzle height %.2f m\n",
          aw_kg_to_g (s->mass_kg), s->velocity_mps, aw_mps_to_fps (s->velocity_mps),
          aw_energy_j (s->mass_kg, s->velocity_mps), s->height_m);
  printf ("Hop: %s, lift ratio %.3f (model spin %.0f rpm, depends on the lift model)\n",
          in->hop_mode == AW_HOP_MODE_AUTO ? "auto" : "as given", r->lift_ratio,
          aw_rad_s_to_rpm (r->spin_rad_s));
  if (isfinite (r->hop_limit_lift_ratio))
    printf ("Hop limit: lift ratio %.3f at most with this BB at this speed%s\n",
            r->hop_limit_lift_ratio,
            r->hop_over_limit ? "; the hop given is ABOVE it (the hop-up cannot reach it)"
            : r->hop_limited ? "; auto hop is held there (hop-limited: a stronger hop would "
                               "reach further)" : "");
  if (in->zero_distance_m > 0.0)
    printf ("Sight height %.1f cm, zero %.1f m, bore elevation %.3f°\n",
            in->sight_height_m * 100.0, in->zero_distance_m, aw_rad_to_deg (r->elevation_rad));
  else
    printf ("Sight height %.1f cm, no zero, bore elevation %.3f°\n", in->sight_height_m * 100.0,
            aw_rad_to_deg (r->elevation_rad));
  if (r->status == AW_ANALYSIS_OK)
    printf ("Band ±%.0f cm: inside from %.1f m to %.1f m (band range %.1f m); lands at %.1f m\n",
            in->band_half_m * 100.0, r->band_near_m, r->band_range_m, r->band_range_m,
            r->ground_distance_m);
  else
    printf ("Band ±%.0f cm: the BB never enters it; lands at %.1f m\n", in->band_half_m * 100.0,
            r->ground_distance_m);
  if (cp->have_site)
    {
      if (isfinite (cp->site.energy_limit_j) && cp->site.energy_limit_j > 0.0)
        {
          printf ("Site limit %.2f J, chronographed with %.2f g: about %.2f J there, %s the "
                  "limit\n",
                  cp->site.energy_limit_j, aw_kg_to_g (cp->chrono_mass_kg), cp->chrono_energy_j,
                  cp->compliance == AW_COMPLIANCE_OVER ? "OVER" : "under");
          if (cp->energy_over_limit)
            printf ("WARNING: with this %.2f g BB the energy (%.2f J) is over the limit\n",
                    aw_kg_to_g (s->mass_kg), cp->energy_j);
        }
      if (isfinite (cp->site.min_engagement_m) && cp->site.min_engagement_m > 0.0)
        {
          double e = aw_range_table_energy_at (t, cp->site.min_engagement_m);
          printf ("Minimum engagement distance %.0f m: ", cp->site.min_engagement_m);
          if (isfinite (e))
            printf ("about %.2f J left there; ", e);
          printf ("rows marked \"no\" are closer\n");
        }
    }
  printf ("\n%8s %8s %8s %8s %7s %7s %8s %8s %10s %5s%s\n", "dist m", "height", "hold cm",
          unit, "time s", "m/s", "energy J", "spin rpm", "drift cm", "band",
          cp->have_site && cp->site.min_engagement_m > 0.0 ? "  engage" : "");
  printf ("%8s %8s %8s %8s %7s %7s %8s %8s %10s %5s\n", "", "cm", "", "", "", "", "", "",
          "per 1 m/s", "");
  for (size_t i = 0; i < t->n_rows; i++)
    {
      const AwRangeRow *w = &t->rows[i];
      char angle[16], drift[16];
      if (isfinite (w->hold_angle))
        g_snprintf (angle, sizeof angle, "%.2f", shown (w->hold_angle, 2));
      else
        g_strlcpy (angle, "-", sizeof angle);
      if (isfinite (w->drift_cm_per_mps))
        g_snprintf (drift, sizeof drift, "%.1f", shown (w->drift_cm_per_mps, 1));
      else
        g_strlcpy (drift, "-", sizeof drift);
      printf ("%8.1f %8.1f %8.1f %8s %7.3f %7.1f %8.3f %8.0f %10s %5s%s\n", w->distance_m,
              shown (w->height_cm, 1), shown (w->hold_cm, 1), angle, w->time_s, w->speed_mps,
              w->energy_j,
              aw_rad_s_to_rpm (w->spin_rad_s), drift, w->in_band ? "in" : "out",
              cp->have_site && cp->site.min_engagement_m > 0.0
              ? (w->beyond_min_distance ? "  yes" : "  no") : "");
    }
  if (cp->have_site)
    aw_cli_print_caution (stdout);
}

int
aw_cli_table (int argc, char **argv)
{
  const char *cmd = "table";
  AwCliShotOptions so;
  AwCliSiteOptions sto;
  AwAnalysisInput in;
  AwRangeTable table = { 0 };
  const char *hop = NULL;
  const char *project = NULL, *setup = NULL;
  double band_cm = 15.0, sight_cm = 0.0, zero_m = NAN, step = 5.0, max_m = 0.0;
  bool seen_hop = false, seen_band = false, seen_sight = false, seen_zero = false;
  bool seen_angle = false, seen_step = false, seen_max = false, seen_project = false;
  bool seen_setup = false, optimise = false, help = false;
  double lift_ratio;
  int fmt = AW_CLI_FORMAT_TEXT, angle = AW_ANGLE_MRAD;
  static const char *const angle_words[] = { "mrad", "moa", NULL };
  g_autoptr (GArray) args = g_array_new (TRUE, TRUE, sizeof (AwCliArg));
  g_autofree AwPowerPoint *points = NULL;
  g_auto (AwCliProjectBase) pb = { 0 };
  AwShot own;
  double hop_limit = NAN;

  aw_cli_shot_options_init (&so);
  aw_cli_shot_options_add (&so, args);
  aw_cli_site_options_init (&sto);
  aw_cli_site_options_add (&sto, args);
#define ARG(n, k, t, l, h, s) AW_CLI_ADD (args, n, k, t, l, h, s)
  ARG ("project", AW_CLI_ARG_STRING, &project, 0, 0, &seen_project);
  ARG ("setup", AW_CLI_ARG_STRING, &setup, 0, 0, &seen_setup);
  ARG ("hop", AW_CLI_ARG_STRING, &hop, 0, 0, &seen_hop);
  ARG ("band-cm", AW_CLI_ARG_POSITIVE, &band_cm, 0.1, 500.0, &seen_band);
  ARG ("sight-height-cm", AW_CLI_ARG_DOUBLE, &sight_cm, -100.0, 100.0, &seen_sight);
  ARG ("zero-m", AW_CLI_ARG_POSITIVE, &zero_m, 0.0, 1000.0, &seen_zero);
  ARG ("optimise-elevation", AW_CLI_ARG_FLAG, &optimise, 0, 0, NULL);
  AW_CLI_ADD_CHOICE (args, "angle-unit", &angle, angle_words, &seen_angle);
  ARG ("step-m", AW_CLI_ARG_POSITIVE, &step, 0.01, 1000.0, &seen_step);
  ARG ("max-m", AW_CLI_ARG_POSITIVE, &max_m, 0.0, 10000.0, &seen_max);
  AW_CLI_ADD_CHOICE (args, "format", &fmt, aw_cli_format_words, NULL);
  ARG ("help", AW_CLI_ARG_FLAG, &help, 0, 0, NULL);
#undef ARG

  if (!aw_cli_parse (argc, argv, 2, (const AwCliArg *) args->data, NULL, cmd))
    return AW_CLI_EXIT_USAGE;
  if (help)
    {
      print_help ();
      return AW_CLI_EXIT_OK;
    }
  if (seen_hop && (so.seen_spin || so.seen_lift_ratio))
    {
      aw_cli_error (cmd, "--hop: give either --hop, --spin-rpm or --lift-ratio, not several");
      return AW_CLI_EXIT_USAGE;
    }
  if (optimise && seen_zero)
    {
      aw_cli_error (cmd, "--optimise-elevation: cannot be combined with --zero-m (the zero "
                    "fixes the bore elevation)");
      return AW_CLI_EXIT_USAGE;
    }

  /* the base: a stored setup or the defaults */
  aw_analysis_input_init (&in);
  if (seen_project || seen_setup || sto.seen_site || sto.seen_class)
    {
      if (!aw_cli_project_base_load (project, setup, &sto, &in, &pb, cmd))
        return AW_CLI_EXIT_USAGE;
    }
  own = in.shot;   /* the setup's own BB at its own velocity (the hop limit's reference) */
  if (!aw_cli_shot_options_apply (&so, &in.shot, &lift_ratio, cmd))
    return AW_CLI_EXIT_USAGE;
  bool cli_velocity = so.seen_velocity_mps || so.seen_velocity_fps || so.seen_energy;
  {
    /* the hop limit is seen with the setup's own BB (or the BB and velocity given here); air
     * and models as now chosen */
    double m = own.mass_kg, v = own.velocity_mps;
    own = in.shot;
    if (pb.setup && !cli_velocity)
      {
        own.mass_kg = m;
        own.velocity_mps = v;
      }
    own.spin_rad_s = 0.0;
    own.elevation_rad = 0.0;
    if (!aw_cli_hop_limit_apply (&sto, pb.setup, &own, &in, &hop_limit, cmd))
      return AW_CLI_EXIT_USAGE;
  }
  if (pb.setup && so.seen_mass && !cli_velocity)
    {
      /* another BB for the stored replica: velocity from its energy-versus-mass behaviour */
      double v = aw_power_velocity_for_mass (&pb.curve, in.shot.mass_kg);
      if (!(v > 0.0 && v <= 300.0))
        {
          aw_cli_error (cmd, "--mass-g: the replica of setup \"%s\" gives no usable velocity "
                        "with a %g g BB", setup, so.mass_g);
          return AW_CLI_EXIT_USAGE;
        }
      in.shot.velocity_mps = v;
    }

  if (seen_hop)
    {
      if (g_str_equal (hop, "auto"))
        in.hop_mode = AW_HOP_MODE_AUTO;
      else
        {
          char *end = NULL;
          double v = g_ascii_strtod (hop, &end);
          if (end == hop || *end != '\0' || !isfinite (v) || v < 0.0 || v > 20.0)
            {
              aw_cli_error (cmd, "--hop: expected auto or a lift ratio between 0 and 20 "
                            "(found \"%s\")", hop);
              return AW_CLI_EXIT_USAGE;
            }
          in.hop_mode = AW_HOP_MODE_LIFT_RATIO;
          in.hop_value = v;
        }
    }
  else if (so.seen_lift_ratio)
    {
      in.hop_mode = AW_HOP_MODE_LIFT_RATIO;
      in.hop_value = lift_ratio;
    }
  else if (so.seen_spin)
    {
      in.hop_mode = AW_HOP_MODE_SPIN;
      in.hop_value = in.shot.spin_rad_s;
    }
  if (seen_band)
    in.band_half_m = band_cm / 100.0;
  if (seen_sight)
    in.sight_height_m = sight_cm / 100.0;
  if (seen_zero)
    in.zero_distance_m = zero_m;
  if (seen_angle)
    in.angle_unit = (AwAngleUnit) angle;
  if (optimise)
    {
      if (in.zero_distance_m > 0.0)
        {
          aw_cli_error (cmd, "--optimise-elevation: the setup has a zero distance, which fixes "
                        "the bore elevation");
          return AW_CLI_EXIT_USAGE;
        }
      in.optimise_elevation = true;
    }

  Compliance cp = { 0 };
  cp.have_site = aw_cli_site_options_any_site (&sto);
  {
    AwPowerCurve curve;
    AwSiteClass site_cli;
    AwPowerPoint *pts = NULL;
    if (!aw_cli_site_options_apply (&sto, &in.shot, &curve, &pts, &site_cli, cmd))
      return AW_CLI_EXIT_USAGE;
    points = pts;
    if (pb.setup && !cli_velocity && !sto.seen_power && !sto.seen_measured_mps
        && !sto.seen_measured_fps)
      curve = pb.curve;   /* the stored replica's behaviour */
    if (!pb.have_site)
      cp.site = site_cli;
    else
      {
        /* project class, with command-line values overriding */
        cp.site = pb.site;
        if (sto.seen_limit)
          cp.site.energy_limit_j = site_cli.energy_limit_j;
        if (sto.seen_chrono_mass)
          cp.site.chrono_mass_kg = site_cli.chrono_mass_kg;
        if (sto.seen_min_distance)
          cp.site.min_engagement_m = site_cli.min_engagement_m;
      }
    cp.energy_j = aw_power_energy_for_mass (&curve, in.shot.mass_kg);
    cp.compliance = aw_site_check (&cp.site, &curve, in.shot.mass_kg, &cp.chrono_energy_j);
    cp.chrono_mass_kg = cp.site.chrono_mass_kg > 0.0 ? cp.site.chrono_mass_kg : in.shot.mass_kg;
    cp.energy_over_limit = isfinite (cp.site.energy_limit_j) && cp.site.energy_limit_j > 0.0
                           && cp.energy_j > cp.site.energy_limit_j;
  }

  AwAnalysisStatus st = aw_range_table_build (&in, step, seen_max ? max_m : 0.0,
                                              cp.site.min_engagement_m, &table);
  switch (st)
    {
    case AW_ANALYSIS_OK:
    case AW_ANALYSIS_NO_BAND:
      break;
    case AW_ANALYSIS_HOP_UNREACHABLE:
      aw_cli_error (cmd, "%s: lift ratio %g cannot be reached with the chosen lift model at this "
                    "speed (it saturates); lower it or choose another --lift",
                    seen_hop ? "--hop" : "--lift-ratio", in.hop_value);
      aw_range_table_clear (&table);
      return AW_CLI_EXIT_USAGE;
    case AW_ANALYSIS_NO_ZERO:
      aw_cli_error (cmd, "--zero-m: no bore elevation brings the BB down through the sight line "
                    "at %g m with this hop (it is still climbing there, or never gets there)",
                    in.zero_distance_m);
      aw_range_table_clear (&table);
      return AW_CLI_EXIT_USAGE;
    case AW_ANALYSIS_BAD_INPUT:
      if (table.band.bad_field == AW_FIELD_SHOT)
        aw_cli_error (cmd, "the shot is out of range (%s)",
                      aw_shot_status_name (table.band.shot_status));
      else
        aw_cli_error (cmd, "input out of range (%s)",
                      aw_analysis_field_name (table.band.bad_field));
      aw_range_table_clear (&table);
      return AW_CLI_EXIT_USAGE;
    case AW_ANALYSIS_FLIGHT_FAILED:
    default:
      aw_cli_error (cmd, "the flight could not be computed (%s)",
                    aw_flight_status_name (table.band.flight_status));
      aw_range_table_clear (&table);
      return AW_CLI_EXIT_FAILED;
    }

  switch (fmt)
    {
    case AW_CLI_FORMAT_JSON:
      print_json (&in, &table, &cp);
      break;
    case AW_CLI_FORMAT_CSV:
      print_csv (&in, &table);
      break;
    case AW_CLI_FORMAT_TEXT:
    default:
      print_text (&in, &table, &cp);
      break;
    }
  aw_range_table_clear (&table);
  return AW_CLI_EXIT_OK;
}
