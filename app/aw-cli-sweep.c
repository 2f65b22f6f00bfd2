/* aw-cli-sweep.c: "arcwright-cli sweep", one or two varied inputs over one or more setups
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "aw-cli.h"
#include "aw-cli-site.h"
#include "aw-project-io.h"
#include "aw-sweep.h"
#include "aw-units.h"

#define CMD "sweep"

static const char caution[] =
  "Caution: computed estimates, not measurements. The site's chronograph decides compliance, "
  "local law and site rules apply, and eye protection is worn at all times.";

static void
print_help (void)
{
  printf ("Usage: arcwright-cli sweep --vary INPUT:FROM:TO:COUNT [--vary2 INPUT:FROM:TO:COUNT] "
          "[OPTIONS]\n\n"
          "Varies one input (a sweep) or two (a map) and prints a metric at every point.\n\n"
          "Inputs: lift-ratio, spin-rpm (model spin), mass-g (muzzle velocity from the replica's\n"
          "        energy-versus-mass behaviour, auto hop per mass), energy-j (muzzle energy with\n"
          "        the BB used), crosswind-mps, height-m (muzzle height), temperature-c\n"
          "  --vary INPUT:FROM:TO:COUNT   e.g. lift-ratio:0:3:61\n"
          "  --vary2 INPUT:FROM:TO:COUNT  a second input for a map, e.g. energy-j:0.8:2.0:25\n"
          "  --metric NAME        band-range (default), ground-distance, apex, time-at:D,\n"
          "                       energy-at:D, speed-at:D, drift-at:D (D in m, default 30),\n"
          "                       muzzle-energy, compliance (%% of --energy-limit-j), or all\n"
          "  --hop default|setup|auto   the hop where no input varies it (default: auto when\n"
          "                       the BB mass varies, else the setup's)\n"
          "  --hop-limit RATIO|none     the highest lift ratio the hop-up reaches with each\n"
          "                       setup's own BB (default: the setup's hop limit, else none);\n"
          "                       auto hop stays under the limit at every point, a BB of\n"
          "                       another mass getting the same spin parameter (a modelling\n"
          "                       assumption); json lists the points held at it (hop_limited)\n"
          "  --threads N          worker threads (default: one per processor)\n"
          "  --format csv|json    (default csv)\n"
          "  --output FILE        write to FILE (replaced only when complete) instead of stdout\n"
          "  --progress           show progress on stderr\n\n"
          "Setups from a project:\n"
          "  --project FILE --setup NAME   (--setup repeats; without it every setup)\n"
          "  --site NAME --class NAME      the site class for compliance\n\n"
          "Or one setup from shot options (as for \"fly\"):\n"
          "  --mass-g --diameter-mm --velocity-mps|--velocity-fps|--energy-j\n"
          "  --spin-rpm|--lift-ratio --hop-tilt-deg --height-m --elevation-deg\n"
          "  --crosswind-mps --temperature-c --pressure-hpa|--altitude-m --humidity-pct\n"
          "  --density --viscosity --gravity --drag --lift\n"
          "  --band-half-m M       half-height of the band (default 0.15)\n"
          "  --sight-height-m M    sight above the bore (default 0)\n"
          "  --zero-m M            zero distance (default none: the bore stays as given)\n"
          "  --power constant-energy|constant-velocity|creep:PCT\n"
          "                        energy versus BB mass, through the BB and velocity given\n\n"
          "Site limit (either way):\n"
          "  --energy-limit-j J  --chrono-mass-g G   (G: the BB the site chronographs with)\n\n"
          "%s\n", caution);
}

static gboolean
parse_axis (const char *option, const char *text, AwSweepAxis *axis)
{
  g_auto (GStrv) parts = g_strsplit (text, ":", -1);
  double v[2];
  char *end = NULL;
  guint64 n;

  if (g_strv_length (parts) != 4)
    {
      aw_cli_error (CMD, "--%s: expected INPUT:FROM:TO:COUNT, e.g. mass-g:0.20:0.48:29 "
                    "(found \"%s\")", option, text);
      return FALSE;
    }
  if (!aw_sweep_var_from_name (parts[0], &axis->var) || axis->var == AW_SWEEP_VAR_NONE)
    {
      aw_cli_error (CMD, "--%s: unknown input \"%s\" (expected lift-ratio, spin-rpm, mass-g, "
                    "energy-j, crosswind-mps, height-m or temperature-c)", option, parts[0]);
      return FALSE;
    }
  for (int k = 0; k < 2; k++)
    {
      errno = 0;
      v[k] = g_ascii_strtod (parts[1 + k], &end);
      if (end == parts[1 + k] || *end != '\0' || errno == ERANGE || !isfinite (v[k]))
        {
          aw_cli_error (CMD, "--%s: %s value \"%s\" is not a number", option,
                        k == 0 ? "FROM" : "TO", parts[1 + k]);
          return FALSE;
        }
    }
  errno = 0;
  n = g_ascii_strtoull (parts[3], &end, 10);
  if (end == parts[3] || *end != '\0' || errno != 0 || n < 1 || n > AW_SWEEP_MAX_AXIS_POINTS)
    {
      aw_cli_error (CMD, "--%s: COUNT must be a whole number from 1 to %d (found \"%s\")", option,
                    AW_SWEEP_MAX_AXIS_POINTS, parts[3]);
      return FALSE;
    }
  if (n == 1 && v[0] != v[1])
    {
      aw_cli_error (CMD, "--%s: COUNT 1 needs FROM equal to TO (found %s and %s)", option,
                    parts[1], parts[2]);
      return FALSE;
    }
  double lo, hi;
  aw_sweep_var_range (axis->var, &lo, &hi);
  for (int k = 0; k < 2; k++)
    if (v[k] < lo || v[k] > hi)
      {
        char b[2][32];
        aw_cli_error (CMD, "--%s: %s must be between %s and %s (found %s)", option, parts[0],
                      aw_cli_num (b[0], sizeof b[0], lo, 6), aw_cli_num (b[1], sizeof b[1], hi, 6),
                      parts[1 + k]);
        return FALSE;
      }
  axis->lo = v[0];
  axis->hi = v[1];
  axis->n = (guint) n;
  return TRUE;
}

static gboolean
any_shot_option (const AwCliShotOptions *o)
{
  return o->seen_mass || o->seen_diameter || o->seen_velocity_mps || o->seen_velocity_fps
         || o->seen_energy || o->seen_spin || o->seen_lift_ratio || o->seen_tilt || o->seen_height
         || o->seen_elevation || o->seen_crosswind || o->seen_temperature || o->seen_pressure
         || o->seen_altitude || o->seen_humidity || o->seen_density || o->seen_viscosity
         || o->seen_gravity || o->seen_drag || o->seen_lift;
}

/* The conditions the shot options describe (the same rules as aw_cli_shot_options_apply). */
static void
conditions_from_options (const AwCliShotOptions *o, AwConditions *c)
{
  aw_conditions_init_standard (c);
  c->temperature_c = o->seen_temperature ? o->temperature_c : (o->seen_altitude ? NAN : 15.0);
  if (o->seen_altitude)
    {
      c->pressure_hpa = NAN;
      c->altitude_m = o->altitude_m;
    }
  else if (o->seen_pressure)
    c->pressure_hpa = o->pressure_hpa;
  c->humidity = o->seen_humidity ? o->humidity_pct / 100.0 : 0.0;
  c->density = o->seen_density ? o->density : NAN;
  c->viscosity = o->seen_viscosity ? o->viscosity : NAN;
}

static gboolean
parse_power (const char *s, AwPowerCurve *curve)
{
  if (g_str_equal (s, "constant-energy"))
    curve->model = AW_POWER_CONSTANT_ENERGY;
  else if (g_str_equal (s, "constant-velocity"))
    curve->model = AW_POWER_CONSTANT_VELOCITY;
  else if (g_str_has_prefix (s, "creep:"))
    {
      char *end = NULL;
      double pct = g_ascii_strtod (s + 6, &end);
      if (end == s + 6 || *end != '\0' || !isfinite (pct) || pct <= -100.0 || pct > 1000.0)
        return FALSE;
      curve->model = AW_POWER_CREEP;
      curve->creep_pct_per_01g = pct;
    }
  else
    return FALSE;
  return TRUE;
}

static void
show_progress (double fraction, gpointer user_data)
{
  fprintf (stderr, "\rarcwright-cli sweep: %3.0f %%", 100.0 * fraction);
  if (fraction >= 1.0)
    fputc ('\n', stderr);
  fflush (stderr);
}

/* JSON is written by hand so that numbers take their shortest exact form ("0.3", not
 * "0.29999999999999999"); undefined values are null. */
static void
json_number (GString *out, double v)
{
  char b[G_ASCII_DTOSTR_BUF_SIZE];
  if (isfinite (v))
    g_string_append (out, aw_sweep_format_number (b, v));
  else
    g_string_append (out, "null");
}

static void
json_string (GString *out, const char *text)
{
  g_string_append_c (out, '"');
  for (const unsigned char *p = (const unsigned char *) text; *p; p++)
    {
      if (*p == '"' || *p == '\\')
        {
          g_string_append_c (out, '\\');
          g_string_append_c (out, (char) *p);
        }
      else if (*p < 0x20)
        g_string_append_printf (out, "\\u%04x", *p);
      else
        g_string_append_c (out, (char) *p);   /* UTF-8 as it is */
    }
  g_string_append_c (out, '"');
}

static void
json_axis (GString *out, const char *member, const AwSweepAxis *axis, const double *values,
           guint n)
{
  g_string_append_printf (out, "\"%s\": {\"input\": ", member);
  json_string (out, aw_sweep_var_to_name (axis->var));
  g_string_append (out, ", \"unit\": ");
  json_string (out, aw_sweep_var_unit (axis->var));
  g_string_append (out, ", \"values\": [");
  for (guint i = 0; i < n; i++)
    {
      if (i)
        g_string_append (out, ", ");
      json_number (out, values[i]);
    }
  g_string_append (out, "]}, ");
}

static char *
to_json (const AwSweepResult *r, const AwSweepMetric *metrics, guint n_metrics,
         const AwSweepSetup *setups)
{
  GString *out = g_string_new ("{");
  gboolean two = r->desc.axis[1].var != AW_SWEEP_VAR_NONE;
  gboolean energy = FALSE;

  json_axis (out, "vary", &r->desc.axis[0], r->values1, r->n1);
  if (two)
    json_axis (out, "vary2", &r->desc.axis[1], r->values2, r->n2);
  g_string_append (out, "\"at_distance_m\": ");
  json_number (out, r->desc.at_distance_m);
  g_string_append (out, ",\n \"metrics\": [");
  for (guint k = 0; k < n_metrics; k++)
    {
      g_string_append (out, k ? ", {\"name\": " : "{\"name\": ");
      json_string (out, aw_sweep_metric_to_name (metrics[k]));
      g_string_append (out, ", \"unit\": ");
      json_string (out, aw_sweep_metric_unit (metrics[k]));
      g_string_append_c (out, '}');
      energy |= metrics[k] == AW_SWEEP_METRIC_MUZZLE_ENERGY
                || metrics[k] == AW_SWEEP_METRIC_COMPLIANCE
                || metrics[k] == AW_SWEEP_METRIC_ENERGY_AT;
    }
  g_string_append (out, "],\n \"setups\": [");
  for (guint s = 0; s < r->n_setups; s++)
    {
      g_string_append (out, s ? ",\n  {\"name\": " : "\n  {\"name\": ");
      json_string (out, r->setup_names[s]);
      /* values[metric][i] for a sweep, values[metric][j][i] (rows along vary2) for a map */
      g_string_append (out, ",\n   \"values\": [");
      for (guint k = 0; k < n_metrics; k++)
        {
          g_string_append (out, k ? ", [" : "[");
          for (guint j = 0; j < r->n2; j++)
            {
              if (two)
                g_string_append (out, j ? ", [" : "[");
              for (guint i = 0; i < r->n1; i++)
                {
                  if (i)
                    g_string_append (out, ", ");
                  json_number (out, aw_sweep_result_value (r, s, i, j, metrics[k]));
                }
              if (two)
                g_string_append_c (out, ']');
            }
          g_string_append_c (out, ']');
        }
      g_string_append (out, "],\n   \"status\": [");
      for (guint j = 0; j < r->n2; j++)
        {
          if (two)
            g_string_append (out, j ? ", [" : "[");
          for (guint i = 0; i < r->n1; i++)
            {
              if (i)
                g_string_append (out, ", ");
              json_string (out,
                           aw_sweep_status_to_name (aw_sweep_result_point (r, s, i, j)->status));
            }
          if (two)
            g_string_append_c (out, ']');
        }
      g_string_append_c (out, ']');
      if (!isnan (setups[s].input.hop_limit_s))
        {
          /* the points where the setup's hop limit held auto hop (or a given hop is above it) */
          g_string_append (out, ",\n   \"hop_limited\": [");
          for (guint j = 0; j < r->n2; j++)
            {
              if (two)
                g_string_append (out, j ? ", [" : "[");
              for (guint i = 0; i < r->n1; i++)
                g_string_append_printf (out, "%s%s", i ? ", " : "",
                                        aw_sweep_result_point (r, s, i, j)->hop_limited
                                        ? "true" : "false");
              if (two)
                g_string_append_c (out, ']');
            }
          g_string_append_c (out, ']');
        }
      g_string_append_c (out, '}');
    }
  g_string_append (out, "]");
  if (energy)
    {
      g_string_append (out, ",\n \"caution\": ");
      json_string (out, caution);
    }
  g_string_append (out, "}\n");
  return g_string_free (out, FALSE);
}

static gboolean
find_class (const AwProject *p, const char *site_name, const char *class_name, AwSiteClass *out)
{
  AwSiteRules *rules = aw_project_find_site_rules (p, site_name);
  if (rules == NULL)
    {
      aw_cli_error (CMD, "--site: no site rules named \"%s\" in the project", site_name);
      return FALSE;
    }
  for (guint i = 0; i < rules->classes->len; i++)
    {
      AwSiteClassRule *rule = g_ptr_array_index (rules->classes, i);
      if (class_name == NULL ? rules->classes->len == 1 : g_str_equal (rule->name, class_name))
        {
          aw_site_class_rule_to_site_class (rule, out);
          return TRUE;
        }
    }
  if (class_name == NULL)
    aw_cli_error (CMD, "--class: the site \"%s\" has %u classes; name one", site_name,
                  rules->classes->len);
  else
    aw_cli_error (CMD, "--class: no class named \"%s\" in the site \"%s\"", class_name,
                  site_name);
  return FALSE;
}

int
aw_cli_sweep (int argc, char **argv)
{
  AwCliShotOptions so;
  AwSweepDesc desc;
  const char *vary = NULL, *vary2 = NULL, *metric_name = "band-range";
  static const char *const hop_words[] = { "default", "setup", "auto", NULL };
  static const char *const format_words[] = { "csv", "json", NULL };
  int hop = AW_SWEEP_HOP_DEFAULT, format = 0;
  const char *project_path = NULL, *output = NULL, *power = NULL;
  const char *site_name = NULL, *class_name = NULL, *hop_limit_text = NULL;
  double threads = 0.0, band_half = AW_BAND_HALF_DEFAULT_M, sight = 0.0, zero = NAN;
  double limit = NAN, chrono_g = NAN;
  bool help = false, progress = false, seen_band = false, seen_sight = false, seen_zero = false;
  bool seen_limit = false, seen_chrono = false;
  AwSweepMetric metric;
  AwSweepMetric metrics[AW_SWEEP_N_METRICS];
  guint n_metrics = 1;
  g_autoptr (GPtrArray) setup_names = g_ptr_array_new ();
  g_autoptr (GArray) args = g_array_new (TRUE, TRUE, sizeof (AwCliArg));
  g_autoptr (AwProject) project = NULL;
  g_autoptr (GArray) setups = g_array_new (FALSE, TRUE, sizeof (AwSweepSetup));
  g_autoptr (GError) error = NULL;
  g_autoptr (AwSweepResult) result = NULL;
  g_autofree char *text = NULL;

#define ADD(n, k, t, l, h, s) AW_CLI_ADD (args, n, k, t, l, h, s)
  aw_cli_shot_options_init (&so);
  aw_cli_shot_options_add (&so, args);
  ADD ("vary", AW_CLI_ARG_STRING, &vary, 0, 0, NULL);
  ADD ("vary2", AW_CLI_ARG_STRING, &vary2, 0, 0, NULL);
  ADD ("metric", AW_CLI_ARG_STRING, &metric_name, 0, 0, NULL);
  AW_CLI_ADD_CHOICE (args, "hop", &hop, hop_words, NULL);
  ADD ("hop-limit", AW_CLI_ARG_STRING, &hop_limit_text, 0, 0, NULL);
  ADD ("threads", AW_CLI_ARG_POSITIVE, &threads, 1, 256, NULL);
  AW_CLI_ADD_CHOICE (args, "format", &format, format_words, NULL);
  ADD ("output", AW_CLI_ARG_STRING, &output, 0, 0, NULL);
  ADD ("progress", AW_CLI_ARG_FLAG, &progress, 0, 0, NULL);
  ADD ("project", AW_CLI_ARG_STRING, &project_path, 0, 0, NULL);
  ADD ("setup", AW_CLI_ARG_STRINGS, setup_names, 0, 0, NULL);
  ADD ("site", AW_CLI_ARG_STRING, &site_name, 0, 0, NULL);
  ADD ("class", AW_CLI_ARG_STRING, &class_name, 0, 0, NULL);
  ADD ("band-half-m", AW_CLI_ARG_POSITIVE, &band_half, 0.001, 5.0, &seen_band);
  ADD ("sight-height-m", AW_CLI_ARG_DOUBLE, &sight, -1.0, 1.0, &seen_sight);
  ADD ("zero-m", AW_CLI_ARG_POSITIVE, &zero, 0.1, 1000.0, &seen_zero);
  ADD ("power", AW_CLI_ARG_STRING, &power, 0, 0, NULL);
  ADD ("energy-limit-j", AW_CLI_ARG_POSITIVE, &limit, 0.0, 100.0, &seen_limit);
  ADD ("chrono-mass-g", AW_CLI_ARG_POSITIVE, &chrono_g, 0.01, 5.0, &seen_chrono);
  ADD ("help", AW_CLI_ARG_FLAG, &help, 0, 0, NULL);
#undef ADD

  if (!aw_cli_parse (argc, argv, 2, (const AwCliArg *) args->data, NULL, CMD))
    return AW_CLI_EXIT_USAGE;
  if (help)
    {
      print_help ();
      return AW_CLI_EXIT_OK;
    }

  /* what varies, what is measured */
  aw_sweep_desc_init (&desc);
  if (vary == NULL)
    {
      aw_cli_error (CMD, "--vary: required, e.g. --vary lift-ratio:0:3:61");
      return AW_CLI_EXIT_USAGE;
    }
  if (!parse_axis ("vary", vary, &desc.axis[0]))
    return AW_CLI_EXIT_USAGE;
  if (vary2 && !parse_axis ("vary2", vary2, &desc.axis[1]))
    return AW_CLI_EXIT_USAGE;
  if (g_str_equal (metric_name, "all"))
    {
      for (int m = 0; m < AW_SWEEP_N_METRICS; m++)
        metrics[m] = (AwSweepMetric) m;
      n_metrics = AW_SWEEP_N_METRICS;
    }
  else if (aw_sweep_metric_from_name (metric_name, &metric, &desc.at_distance_m))
    metrics[0] = metric;
  else
    {
      aw_cli_error (CMD, "--metric: expected band-range, ground-distance, apex, time-at:D, "
                    "energy-at:D, speed-at:D, drift-at:D (0 < D ≤ 1000 m), muzzle-energy, "
                    "compliance or all (found \"%s\")", metric_name);
      return AW_CLI_EXIT_USAGE;
    }
  desc.hop = (AwSweepHop) hop;   /* hop_words follow the AwSweepHop order */
  double hop_limit = NAN;
  if (hop_limit_text && !aw_cli_parse_hop_limit (hop_limit_text, &hop_limit, CMD))
    return AW_CLI_EXIT_USAGE;
  gboolean json = format == 1;
  if (threads != floor (threads))
    {
      aw_cli_error (CMD, "--threads: must be a whole number (found %g)", threads);
      return AW_CLI_EXIT_USAGE;
    }
  if (seen_limit)
    desc.site.energy_limit_j = limit;
  if (seen_chrono)
    desc.site.chrono_mass_kg = aw_g_to_kg (chrono_g);
  if (!aw_sweep_desc_validate (&desc, &error))
    {
      /* core names its fields; say which option they came from */
      const char *m = error->message;
      const char *rest = strstr (m, ": ");
      const char *opt = g_str_has_prefix (m, "axis[1]") ? "--vary2"
                        : g_str_has_prefix (m, "at_distance") ? "--metric"
                        : g_str_has_prefix (m, "site.chrono") ? "--chrono-mass-g"
                        : g_str_has_prefix (m, "site.") ? "--energy-limit-j"
                        : "--vary";
      aw_cli_error (CMD, "%s: %s", opt, rest ? rest + 2 : m);
      return AW_CLI_EXIT_USAGE;
    }

  /* the setups */
  if (project_path)
    {
      g_autoptr (GPtrArray) problems = g_ptr_array_new_with_free_func (g_free);
      if (any_shot_option (&so) || seen_band || seen_sight || seen_zero || power)
        {
          aw_cli_error (CMD, "--project: shot, band, sight and power options apply only without "
                        "a project (edit the setup instead)");
          return AW_CLI_EXIT_USAGE;
        }
      project = aw_project_load_file (project_path, AW_PROJECT_LOAD_STRICT, problems, &error);
      if (project == NULL)
        {
          aw_cli_error (CMD, "%s: %s", project_path, error->message);
          return error->code == AW_CORE_ERROR_IO ? AW_CLI_EXIT_FAILED : AW_CLI_EXIT_USAGE;
        }
      if (site_name && !(seen_limit || seen_chrono))
        {
          if (!find_class (project, site_name, class_name, &desc.site))
            return AW_CLI_EXIT_USAGE;
        }
      else if (site_name || class_name)
        {
          aw_cli_error (CMD, site_name ? "--site: give either --site or --energy-limit-j"
                                       : "--class: needs --site");
          return AW_CLI_EXIT_USAGE;
        }
      if (setup_names->len == 0)
        for (guint i = 0; i < project->setups->len; i++)
          g_ptr_array_add (setup_names, ((AwSetup *) g_ptr_array_index (project->setups, i))->name);
      if (setup_names->len == 0)
        {
          aw_cli_error (CMD, "--project: %s has no setups", project_path);
          return AW_CLI_EXIT_USAGE;
        }
      for (guint i = 0; i < setup_names->len; i++)
        {
          const char *name = g_ptr_array_index (setup_names, i);
          AwSetup *setup = aw_project_find_setup (project, name);
          AwSweepSetup ss;
          if (setup == NULL)
            {
              aw_cli_error (CMD, "--setup: no setup named \"%s\" in %s", name, project_path);
              return AW_CLI_EXIT_USAGE;
            }
          for (guint k = 0; k < i; k++)
            if (g_str_equal (g_ptr_array_index (setup_names, k), name))
              {
                aw_cli_error (CMD, "--setup: \"%s\" is given twice", name);
                return AW_CLI_EXIT_USAGE;
              }
          if (!aw_sweep_setup_from_project (&ss, setup, project, &error))
            {
              aw_cli_error (CMD, "--setup: %s", error->message);
              return AW_CLI_EXIT_USAGE;
            }
          g_array_append_val (setups, ss);
        }
    }
  else
    {
      AwSweepSetup ss;
      double lift_ratio;
      if (setup_names->len > 0 || site_name || class_name)
        {
          aw_cli_error (CMD, "%s: needs --project", setup_names->len > 0 ? "--setup"
                        : site_name ? "--site" : "--class");
          return AW_CLI_EXIT_USAGE;
        }
      aw_sweep_setup_init (&ss, "setup");
      if (!aw_cli_shot_options_apply (&so, &ss.input.shot, &lift_ratio, CMD))
        return AW_CLI_EXIT_USAGE;
      if (!isnan (lift_ratio))
        {
          ss.input.hop_mode = AW_HOP_MODE_LIFT_RATIO;
          ss.input.hop_value = lift_ratio;
        }
      else if (so.seen_spin)
        {
          ss.input.hop_mode = AW_HOP_MODE_SPIN;
          ss.input.hop_value = ss.input.shot.spin_rad_s;
        }
      ss.input.band_half_m = band_half;
      ss.input.sight_height_m = sight;
      ss.input.zero_distance_m = seen_zero ? zero : NAN;
      conditions_from_options (&so, &ss.conditions);
      ss.power.model = AW_POWER_CONSTANT_ENERGY;
      if (power && !parse_power (power, &ss.power))
        {
          aw_cli_error (CMD, "--power: expected constant-energy, constant-velocity or creep:PCT "
                        "(−100 < PCT ≤ 1000) (found \"%s\")", power);
          return AW_CLI_EXIT_USAGE;
        }
      ss.power.ref_mass_kg = ss.input.shot.mass_kg;
      ss.power.ref_velocity_mps = ss.input.shot.velocity_mps;
      g_array_append_val (setups, ss);
    }

  /* --hop-limit: the ratio seen with each setup's own BB at its own velocity */
  if (hop_limit_text)
    for (guint i = 0; i < setups->len; i++)
      {
        AwSweepSetup *ss = &g_array_index (setups, AwSweepSetup, i);
        AwShot own = ss->input.shot;
        own.spin_rad_s = 0.0;
        ss->input.hop_limit_s = isnan (hop_limit) ? NAN
                                                  : aw_hop_limit_s_for_lift_ratio (&own, hop_limit);
      }

  result = aw_sweep_run ((AwSweepSetup *) setups->data, setups->len, &desc, (guint) threads,
                         progress ? show_progress : NULL, NULL, NULL, &error);
  if (result == NULL)
    {
      aw_cli_error (CMD, "%s", error->message);
      return error->domain == AW_CORE_ERROR ? AW_CLI_EXIT_USAGE : AW_CLI_EXIT_FAILED;
    }

  /* points that could not be computed */
  {
    guint counts[8] = { 0 };
    gsize total = (gsize) result->n_setups * result->n1 * result->n2;
    for (gsize p = 0; p < total; p++)
      {
        int st = result->points[p].status;
        if (st != AW_ANALYSIS_OK)
          counts[st < 0 ? 4 - st : st]++;
      }
    for (int st = AW_ANALYSIS_FLIGHT_FAILED; st <= AW_ANALYSIS_NO_ZERO; st++)
      {
        guint c = counts[st < 0 ? 4 - st : st];
        if (st != AW_ANALYSIS_OK && c > 0)
          aw_cli_error (CMD, "%u of %" G_GSIZE_FORMAT " points: %s", c, total,
                        aw_sweep_status_to_name ((AwAnalysisStatus) st));
      }
  }

  if (json)
    text = to_json (result, metrics, n_metrics, (const AwSweepSetup *) setups->data);
  else
    {
      text = aw_sweep_result_to_csv (result, metrics, n_metrics);
      for (guint k = 0; k < n_metrics; k++)
        if (metrics[k] == AW_SWEEP_METRIC_MUZZLE_ENERGY || metrics[k] == AW_SWEEP_METRIC_COMPLIANCE
            || metrics[k] == AW_SWEEP_METRIC_ENERGY_AT)
          {
            fprintf (stderr, "%s\n", caution);
            break;
          }
    }

  if (output)
    {
      if (!g_file_set_contents (output, text, -1, &error))
        {
          aw_cli_error (CMD, "--output: %s", error->message);
          return AW_CLI_EXIT_FAILED;
        }
    }
  else
    fputs (text, stdout);
  return AW_CLI_EXIT_OK;
}
