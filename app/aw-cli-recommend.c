/* aw-cli-recommend.c: "arcwright-cli recommend", BB masses compared for one replica
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

#define DEFAULT_MASSES "0.20,0.23,0.25,0.28,0.30,0.32,0.36,0.40,0.43,0.45,0.48"

static void
print_help (void)
{
  printf ("Usage: arcwright-cli recommend [OPTIONS]\n\n"
          "Compares BB masses for one replica: velocity and energy with each BB (from how the\n"
          "replica's energy changes with BB mass), compliance with a site class as the site\n"
          "measures it, auto hop, band range and crosswind drift; recommends one.\n\n"
          "  --project FILE --setup NAME   the replica, conditions and band of a stored setup\n"
          "  --mass-g G and --velocity-mps V | --velocity-fps V | --energy-j E\n"
          "                        the reference chrono reading: velocity with that BB\n"
          "  (and the other shot options of \"fly\": height, air, models, crosswind)\n"
          "  --masses G,G,…        BB masses to compare (default " DEFAULT_MASSES ")\n"
          "  --power constant-energy|constant-velocity|creep:PCT|measured\n"
          "                        how the energy changes with BB mass (default constant-energy;\n"
          "                        creep:PCT = energy +PCT %% per +0.1 g)\n"
          "  --measured-mps G:V,… | --measured-fps G:V,…   measured velocities per BB mass\n"
          "  --limit-j J           the site class energy limit\n"
          "  --chrono-mass-g G     the BB the site chronographs with (default: the BB used)\n"
          "  --min-distance-m M    the class's minimum engagement distance\n"
          "  --site NAME --class NAME      a site class from the project instead\n"
          "  --band-cm CM  --sight-height-cm CM  --zero-m M   band and sighting\n"
          "  --hop-limit RATIO|none  the highest lift ratio the hop-up reaches with the reference\n"
          "                        BB (the setup's own BB with --setup; default: the setup's hop\n"
          "                        limit, else none). Every BB then gets at most the same spin\n"
          "                        parameter (a modelling assumption), so heavier, slower BBs get\n"
          "                        less lift. Without a limit every BB is hopped as well as it\n"
          "                        needs, which favours heavy BBs.\n"
          "  --format text|csv|json\n");
}


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

static const char *
reason_name (AwRecommendReason r)
{
  switch (r)
    {
    case AW_RECOMMEND_REASON_LONGEST_BAND: return "longest-band";
    case AW_RECOMMEND_REASON_LESS_DRIFT: return "less-drift";
    case AW_RECOMMEND_REASON_NONE:
    default: return "none";
    }
}

static bool
limit_set (const AwSiteClass *site)
{
  return isfinite (site->energy_limit_j) && site->energy_limit_j > 0.0;
}

static void
print_json (const AwPowerCurve *curve, const AwSiteClass *site, const AwRecommendation *rec,
            double hop_limit, const AwShot *own)
{
  char b[14][40];
  printf ("{\"summary\": {\"power_model\": \"%s\", \"reference_mass_g\": %s, "
          "\"reference_velocity_mps\": %s, \"energy_limit_j\": %s, \"chrono_mass_g\": %s, "
          "\"min_engagement_m\": %s, \"best_mass_g\": %s, \"reason\": \"%s\", "
          "\"hop_limit_lift_ratio\": %s, \"hop_limit_mass_g\": %s, "
          "\"hop_limit_velocity_mps\": %s},\n \"rows\": [",
          curve->model == AW_POWER_CONSTANT_ENERGY ? "constant-energy"
          : curve->model == AW_POWER_CONSTANT_VELOCITY ? "constant-velocity"
          : curve->model == AW_POWER_CREEP ? "creep" : "measured",
          aw_cli_num (b[0], 40, curve->model == AW_POWER_MEASURED
                                ? NAN : aw_kg_to_g (curve->ref_mass_kg), 9),
          aw_cli_num (b[1], 40, curve->model == AW_POWER_MEASURED ? NAN : curve->ref_velocity_mps,
                      9),
          aw_cli_num (b[2], 40, limit_set (site) ? site->energy_limit_j : NAN, 9),
          aw_cli_num (b[3], 40, site->chrono_mass_kg > 0.0 ? aw_kg_to_g (site->chrono_mass_kg)
                                                           : NAN, 9),
          aw_cli_num (b[4], 40, site->min_engagement_m > 0.0 ? site->min_engagement_m : NAN, 9),
          aw_cli_num (b[5], 40, rec->best >= 0 ? aw_kg_to_g (rec->rows[rec->best].mass_kg) : NAN,
                      9),
          reason_name (rec->reason),
          aw_cli_num (b[6], 40, hop_limit, 9),
          aw_cli_num (b[7], 40, isnan (hop_limit) ? NAN : aw_kg_to_g (own->mass_kg), 9),
          aw_cli_num (b[8], 40, isnan (hop_limit) ? NAN : own->velocity_mps, 9));
  for (size_t i = 0; i < rec->n_rows; i++)
    {
      const AwRecommendRow *r = &rec->rows[i];
      printf ("%s\n  {\"mass_g\": %s, \"velocity_mps\": %s, \"velocity_fps\": %s, "
              "\"energy_j\": %s, \"chrono_energy_j\": %s, \"compliance\": \"%s\", "
              "\"energy_over_limit\": %s, \"status\": \"%s\", \"lift_ratio\": %s, "
              "\"muzzle_spin_rpm\": %s, \"bore_elevation_deg\": %s, \"band_near_m\": %s, "
              "\"band_range_m\": %s, \"drift_30m_cm_per_mps\": %s, \"recommended\": %s, "
              "\"hop_limit_lift_ratio\": %s, \"hop_limited\": %s}",
              i ? "," : "",
              aw_cli_num (b[0], 40, aw_kg_to_g (r->mass_kg), 9),
              aw_cli_num (b[1], 40, r->velocity_mps, 9),
              aw_cli_num (b[2], 40, aw_mps_to_fps (r->velocity_mps), 9),
              aw_cli_num (b[3], 40, r->energy_j, 9), aw_cli_num (b[4], 40, r->chrono_energy_j, 9),
              compliance_name (r->compliance), r->energy_over_limit ? "true" : "false",
              aw_analysis_status_name (r->band.status),
              aw_cli_num (b[5], 40, r->band.lift_ratio, 9),
              aw_cli_num (b[6], 40, aw_rad_s_to_rpm (r->band.spin_rad_s), 9),
              aw_cli_num (b[7], 40, aw_rad_to_deg (r->band.elevation_rad), 9),
              aw_cli_num (b[8], 40, r->band.band_near_m, 9),
              aw_cli_num (b[9], 40, r->band.band_range_m, 9),
              aw_cli_num (b[10], 40, r->drift_30m_cm_per_mps, 9),
              r->recommended ? "true" : "false",
              aw_cli_num (b[11], 40, r->band.hop_limit_lift_ratio, 9),
              r->band.hop_limited ? "true" : "false");
    }
  printf ("]}\n");
}

static void
print_csv (const AwRecommendation *rec)
{
  char b[10][40];
  printf ("mass_g,velocity_mps,energy_j,chrono_energy_j,compliance,energy_over_limit,lift_ratio,"
          "band_range_m,drift_30m_cm_per_mps,recommended,hop_limit_lift_ratio,hop_limited\r\n");
  for (size_t i = 0; i < rec->n_rows; i++)
    {
      const AwRecommendRow *r = &rec->rows[i];
      printf ("%s,%s,%s,%s,%s,%d,%s,%s,%s,%d,%s,%d\r\n",
              aw_cli_num (b[0], 40, aw_kg_to_g (r->mass_kg), 9),
              aw_cli_num (b[1], 40, r->velocity_mps, 9), aw_cli_num (b[2], 40, r->energy_j, 9),
              aw_cli_num (b[3], 40, r->chrono_energy_j, 9), compliance_name (r->compliance),
              r->energy_over_limit, aw_cli_num (b[4], 40, r->band.lift_ratio, 9),
              isfinite (r->band.band_range_m) ? aw_cli_num (b[5], 40, r->band.band_range_m, 9)
                                              : "",
              isfinite (r->drift_30m_cm_per_mps)
              ? aw_cli_num (b[6], 40, r->drift_30m_cm_per_mps, 9) : "",
              r->recommended,
              isfinite (r->band.hop_limit_lift_ratio)
              ? aw_cli_num (b[7], 40, r->band.hop_limit_lift_ratio, 9) : "",
              r->band.hop_limited);
    }
}

static void
print_text (const AwAnalysisInput *in, const AwPowerCurve *curve, const AwSiteClass *site,
            const AwRecommendation *rec, double hop_limit, const AwShot *own)
{
  if (curve->model == AW_POWER_MEASURED)
    printf ("Replica: measured velocities at %zu BB mass%s; energy between them interpolated\n",
            curve->n_points, curve->n_points == 1 ? "" : "es");
  else
    printf ("Replica: %.1f m/s (%.0f fps) with %.2f g = %.3f J; energy vs BB mass: %s\n",
            curve->ref_velocity_mps, aw_mps_to_fps (curve->ref_velocity_mps),
            aw_kg_to_g (curve->ref_mass_kg),
            aw_energy_j (curve->ref_mass_kg, curve->ref_velocity_mps),
            aw_cli_power_model_label (curve));
  if (curve->model == AW_POWER_CREEP)
    printf ("  (energy %+.1f %% per +0.1 g)\n", curve->creep_pct_per_01g);
  if (limit_set (site))
    {
      if (site->chrono_mass_kg > 0.0)
        printf ("Site class: limit %.2f J, chronographed with a %.2f g BB", site->energy_limit_j,
                aw_kg_to_g (site->chrono_mass_kg));
      else
        printf ("Site class: limit %.2f J, chronographed with the BB used",
                site->energy_limit_j);
      if (site->min_engagement_m > 0.0)
        printf ("; minimum engagement distance %.0f m", site->min_engagement_m);
      printf ("\n");
    }
  else
    printf ("No energy limit given: compliance is not checked\n");
  printf ("Band ±%.0f cm around the sight line, auto hop for every BB%s\n",
          in->band_half_m * 100.0, isnan (hop_limit) ? "" : " up to the hop limit");
  if (!isnan (hop_limit))
    aw_cli_print_hop_limit (stdout, hop_limit, own, "");
  printf ("\n");

  printf ("  %5s %6s %5s %8s %8s %6s %6s %7s %10s\n", "BB g", "m/s", "fps", "energy J",
          "site J", "limit", "hop", "band m", "drift cm");
  printf ("  %5s %6s %5s %8s %8s %6s %6s %7s %10s\n", "", "", "", "", "", "", "ratio", "",
          "30 m, 1m/s");
  for (size_t i = 0; i < rec->n_rows; i++)
    {
      const AwRecommendRow *r = &rec->rows[i];
      char band[16], drift[16], hop[16];
      if (r->band.status == AW_ANALYSIS_OK)
        g_snprintf (band, sizeof band, "%.1f", r->band.band_range_m);
      else
        g_strlcpy (band, "-", sizeof band);
      if (isfinite (r->drift_30m_cm_per_mps))
        g_snprintf (drift, sizeof drift, "%.1f", r->drift_30m_cm_per_mps);
      else
        g_strlcpy (drift, "-", sizeof drift);
      if (isfinite (r->band.lift_ratio))
        g_snprintf (hop, sizeof hop, "%.2f", r->band.lift_ratio);
      else
        g_strlcpy (hop, "-", sizeof hop);
      printf ("%s %5.2f %6.1f %5.0f %8.3f %8.3f %6s %6s %7s %10s%s%s\n",
              r->recommended ? "*" : " ", aw_kg_to_g (r->mass_kg), r->velocity_mps,
              aw_mps_to_fps (r->velocity_mps), r->energy_j, r->chrono_energy_j,
              r->compliance == AW_COMPLIANCE_OVER ? "OVER"
              : r->compliance == AW_COMPLIANCE_UNDER ? "under" : "-",
              hop, band, drift, r->band.hop_limited ? "  hop-limited" : "",
              r->energy_over_limit ? "  ! own energy over the limit" : "");
    }
  printf ("\n");
  if (rec->best >= 0)
    {
      const AwRecommendRow *r = &rec->rows[rec->best];
      printf ("Recommended: %.2f g (marked *): %s.\n", aw_kg_to_g (r->mass_kg),
              rec->reason == AW_RECOMMEND_REASON_LESS_DRIFT
              ? "its band range is within 2 % of the longest, and it drifts less in a crosswind"
              : limit_set (site) ? "the longest band range among the BBs within the limit"
                                 : "the longest band range");
    }
  else
    printf ("No BB mass is recommended: none is within the limit with a usable band.\n");
  bool any_limited = false;
  for (size_t i = 0; i < rec->n_rows; i++)
    any_limited |= rec->rows[i].band.hop_limited;
  if (any_limited)
    printf ("Marked hop-limited: the hop-up's strongest setting lifts that BB less than the best "
            "hop would;\nits band range is the shorter one it gets at that setting.\n");
  if (isnan (hop_limit))
    aw_cli_print_hop_limit (stdout, hop_limit, own, "");
  bool any_over = false;
  for (size_t i = 0; i < rec->n_rows; i++)
    any_over |= rec->rows[i].energy_over_limit;
  if (any_over)
    printf ("Marked !: with that BB the replica carries more energy than the limit, even where "
            "the site's chrono BB reads under it.\n");
  printf ("Model spin and hop depend on the lift model; energies are estimates from the replica's "
          "behaviour, not measurements.\n");
  aw_cli_print_caution (stdout);
}

int
aw_cli_recommend (int argc, char **argv)
{
  const char *cmd = "recommend";
  AwCliShotOptions so;
  AwCliSiteOptions sto;
  AwAnalysisInput in;
  AwRecommendation rec = { 0 };
  AwShot own;
  double hop_limit = NAN;
  const char *masses_text = DEFAULT_MASSES;
  const char *project = NULL, *setup = NULL;
  double band_cm = 15.0, sight_cm = 0.0, zero_m = NAN, lift_ratio;
  bool seen_band = false, seen_sight = false, seen_zero = false, seen_project = false;
  bool seen_setup = false, help = false;
  int fmt = AW_CLI_FORMAT_TEXT;
  g_autoptr (GArray) args = g_array_new (TRUE, TRUE, sizeof (AwCliArg));
  g_autoptr (GArray) masses = NULL;
  g_autofree AwPowerPoint *points = NULL;
  g_auto (AwCliProjectBase) pb = { 0 };

  aw_cli_shot_options_init (&so);
  aw_cli_shot_options_add (&so, args);
  aw_cli_site_options_init (&sto);
  aw_cli_site_options_add (&sto, args);
#define ARG(n, k, t, l, h, s) AW_CLI_ADD (args, n, k, t, l, h, s)
  ARG ("project", AW_CLI_ARG_STRING, &project, 0, 0, &seen_project);
  ARG ("setup", AW_CLI_ARG_STRING, &setup, 0, 0, &seen_setup);
  ARG ("masses", AW_CLI_ARG_STRING, &masses_text, 0, 0, NULL);
  ARG ("band-cm", AW_CLI_ARG_POSITIVE, &band_cm, 0.1, 500.0, &seen_band);
  ARG ("sight-height-cm", AW_CLI_ARG_DOUBLE, &sight_cm, -100.0, 100.0, &seen_sight);
  ARG ("zero-m", AW_CLI_ARG_POSITIVE, &zero_m, 0.0, 1000.0, &seen_zero);
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
  if (so.seen_spin || so.seen_lift_ratio)
    {
      aw_cli_error (cmd, "%s: recommend always uses auto hop for every BB",
                    so.seen_spin ? "--spin-rpm" : "--lift-ratio");
      return AW_CLI_EXIT_USAGE;
    }
  masses = aw_cli_parse_masses (masses_text, "masses", cmd);
  if (!masses)
    return AW_CLI_EXIT_USAGE;

  aw_analysis_input_init (&in);
  if (seen_project || seen_setup || sto.seen_site || sto.seen_class)
    {
      if (!aw_cli_project_base_load (project, setup, &sto, &in, &pb, cmd))
        return AW_CLI_EXIT_USAGE;
    }
  own = in.shot;   /* the setup's own BB at its own velocity (the hop limit's reference) */
  bool cli_velocity = so.seen_velocity_mps || so.seen_velocity_fps || so.seen_energy;
  if (!pb.setup && !cli_velocity && !sto.seen_measured_mps && !sto.seen_measured_fps)
    {
      aw_cli_error (cmd, "--velocity-fps: give the replica's velocity with the --mass-g BB "
                    "(or --velocity-mps, --energy-j, --measured-fps, or --project with --setup)");
      return AW_CLI_EXIT_USAGE;
    }
  if (!aw_cli_shot_options_apply (&so, &in.shot, &lift_ratio, cmd))
    return AW_CLI_EXIT_USAGE;
  if (seen_band)
    in.band_half_m = band_cm / 100.0;
  if (seen_sight)
    in.sight_height_m = sight_cm / 100.0;
  if (seen_zero)
    in.zero_distance_m = zero_m;
  in.hop_mode = AW_HOP_MODE_AUTO;
  {
    /* the reference BB of the hop limit: the command line's chrono reading when given, else the
     * setup's own BB at its own velocity; air and models as now chosen */
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

  AwPowerCurve curve;
  AwSiteClass site;
  {
    AwSiteClass site_cli;
    AwPowerPoint *pts = NULL;
    if (!aw_cli_site_options_apply (&sto, &in.shot, &curve, &pts, &site_cli, cmd))
      return AW_CLI_EXIT_USAGE;
    points = pts;
    if (pb.setup && !cli_velocity && !sto.seen_power && !sto.seen_measured_mps
        && !sto.seen_measured_fps)
      curve = pb.curve;
    site = site_cli;
    if (pb.have_site)
      {
        site = pb.site;
        if (sto.seen_limit)
          site.energy_limit_j = site_cli.energy_limit_j;
        if (sto.seen_chrono_mass)
          site.chrono_mass_kg = site_cli.chrono_mass_kg;
        if (sto.seen_min_distance)
          site.min_engagement_m = site_cli.min_engagement_m;
      }
  }
  /* every mass must get a usable velocity */
  for (guint i = 0; i < masses->len; i++)
    {
      double m = g_array_index (masses, double, i);
      double v = aw_power_velocity_for_mass (&curve, m);
      if (!(v > 0.0 && v <= 300.0))
        {
          aw_cli_error (cmd, "--masses: with a %.2f g BB the replica's curve gives %s; check "
                        "--power and the reference velocity", aw_kg_to_g (m),
                        isfinite (v) ? "a velocity over 300 m/s" : "no velocity");
          return AW_CLI_EXIT_USAGE;
        }
    }

  AwAnalysisStatus st = aw_recommend (&in, &curve, &site, (const double *) masses->data,
                                      masses->len, &rec);
  if (st == AW_ANALYSIS_BAD_INPUT)
    {
      aw_cli_error (cmd, "input out of range (%s)", aw_analysis_field_name (rec.bad_field));
      aw_recommendation_clear (&rec);
      return AW_CLI_EXIT_USAGE;
    }
  if (st < 0)
    {
      aw_cli_error (cmd, "the comparison could not be computed (%s)",
                    aw_analysis_status_name (st));
      aw_recommendation_clear (&rec);
      return AW_CLI_EXIT_FAILED;
    }
  for (size_t i = 0; i < rec.n_rows; i++)
    if (rec.rows[i].band.status == AW_ANALYSIS_BAD_INPUT)
      {
        aw_cli_error (cmd, "--masses: %.2f g: the shot is out of range (%s)",
                      aw_kg_to_g (rec.rows[i].mass_kg),
                      rec.rows[i].band.bad_field == AW_FIELD_SHOT
                      ? aw_shot_status_name (rec.rows[i].band.shot_status)
                      : aw_analysis_field_name (rec.rows[i].band.bad_field));
        aw_recommendation_clear (&rec);
        return AW_CLI_EXIT_USAGE;
      }

  switch (fmt)
    {
    case AW_CLI_FORMAT_JSON:
      print_json (&curve, &site, &rec, hop_limit, &own);
      break;
    case AW_CLI_FORMAT_CSV:
      print_csv (&rec);
      break;
    case AW_CLI_FORMAT_TEXT:
    default:
      print_text (&in, &curve, &site, &rec, hop_limit, &own);
      break;
    }
  aw_recommendation_clear (&rec);
  return AW_CLI_EXIT_OK;
}
