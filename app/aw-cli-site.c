/* aw-cli-site.c: site-class and power-curve options shared by "table" and "recommend"
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <errno.h>
#include <math.h>
#include <string.h>

#include "aw-cli.h"
#include "aw-cli-site.h"
#include "aw-project-io.h"
#include "aw-units.h"

void
aw_cli_site_options_init (AwCliSiteOptions *o)
{
  memset (o, 0, sizeof *o);
  o->limit_j = NAN;
  o->chrono_mass_g = NAN;
  o->min_distance_m = NAN;
  o->power = "constant-energy";
}

#define ARG(n, k, t, l, h, s) AW_CLI_ADD (args, n, k, t, l, h, s)

void
aw_cli_site_options_add (AwCliSiteOptions *o, GArray *args)
{
  ARG ("limit-j", AW_CLI_ARG_POSITIVE, &o->limit_j, 0.0, 100.0, &o->seen_limit);
  ARG ("chrono-mass-g", AW_CLI_ARG_POSITIVE, &o->chrono_mass_g, 0.01, 5.0, &o->seen_chrono_mass);
  ARG ("min-distance-m", AW_CLI_ARG_DOUBLE, &o->min_distance_m, 0.0, 1000.0,
       &o->seen_min_distance);
  ARG ("site", AW_CLI_ARG_STRING, &o->site, 0, 0, &o->seen_site);
  ARG ("class", AW_CLI_ARG_STRING, &o->class_name, 0, 0, &o->seen_class);
  ARG ("power", AW_CLI_ARG_STRING, &o->power, 0, 0, &o->seen_power);
  ARG ("measured-mps", AW_CLI_ARG_STRING, &o->measured_mps, 0, 0, &o->seen_measured_mps);
  ARG ("measured-fps", AW_CLI_ARG_STRING, &o->measured_fps, 0, 0, &o->seen_measured_fps);
  ARG ("hop-limit", AW_CLI_ARG_STRING, &o->hop_limit, 0, 0, &o->seen_hop_limit);
}

bool
aw_cli_site_options_any_site (const AwCliSiteOptions *o)
{
  return o->seen_limit || o->seen_chrono_mass || o->seen_min_distance || o->seen_site
         || o->seen_class;
}

static bool
parse_plain_number (const char *s, double *out)
{
  char *end = NULL;
  errno = 0;
  double v = g_ascii_strtod (s, &end);
  if (end == s || *end != '\0' || errno == ERANGE || !isfinite (v))
    return false;
  *out = v;
  return true;
}

GArray *
aw_cli_parse_masses (const char *text, const char *option, const char *command)
{
  g_auto (GStrv) parts = g_strsplit (text, ",", -1);
  GArray *a = g_array_new (FALSE, FALSE, sizeof (double));

  for (guint i = 0; parts[i]; i++)
    {
      double g;
      g_strstrip (parts[i]);
      if (!parse_plain_number (parts[i], &g) || g < 0.01 || g > 5.0)
        {
          aw_cli_error (command, "--%s: \"%s\" is not a BB mass in grams between 0.01 and 5",
                        option, parts[i]);
          g_array_unref (a);
          return NULL;
        }
      double kg = aw_g_to_kg (g);
      g_array_append_val (a, kg);
    }
  if (a->len == 0 || a->len > 64)
    {
      aw_cli_error (command, "--%s: give 1 to 64 masses in grams, separated by commas", option);
      g_array_unref (a);
      return NULL;
    }
  return a;
}

/* "G:V,G:V" → points; velocity in m/s (fps when in_fps). */
static bool
parse_points (const char *text, bool in_fps, const char *option, const char *command,
              GArray *points)
{
  g_auto (GStrv) parts = g_strsplit (text, ",", -1);
  for (guint i = 0; parts[i]; i++)
    {
      g_auto (GStrv) mv = g_strsplit (g_strstrip (parts[i]), ":", 3);
      double g, v;
      if (g_strv_length (mv) != 2 || !parse_plain_number (g_strstrip (mv[0]), &g)
          || !parse_plain_number (g_strstrip (mv[1]), &v))
        {
          aw_cli_error (command, "--%s: expected MASS_G:VELOCITY pairs separated by commas "
                        "(found \"%s\")", option, parts[i]);
          return false;
        }
      if (in_fps)
        v = aw_fps_to_mps (v);
      if (g < 0.01 || g > 5.0 || !(v > 0.0) || v > 300.0)
        {
          aw_cli_error (command, "--%s: \"%s\": mass must be 0.01 … 5 g and velocity "
                        "0 … 300 m/s (984 fps)", option, parts[i]);
          return false;
        }
      AwPowerPoint p = { aw_g_to_kg (g), v };
      g_array_append_val (points, p);
    }
  if (points->len == 0)
    {
      aw_cli_error (command, "--%s: give at least one MASS_G:VELOCITY pair", option);
      return false;
    }
  return true;
}

bool
aw_cli_site_options_apply (const AwCliSiteOptions *o, const AwShot *shot, AwPowerCurve *curve,
                           AwPowerPoint **points_out, AwSiteClass *site, const char *command)
{
  g_autoptr (GArray) points = g_array_new (FALSE, FALSE, sizeof (AwPowerPoint));

  memset (curve, 0, sizeof *curve);
  *points_out = NULL;
  curve->ref_mass_kg = shot->mass_kg;
  curve->ref_velocity_mps = shot->velocity_mps;

  if (o->seen_measured_mps && !parse_points (o->measured_mps, false, "measured-mps", command,
                                             points))
    return false;
  if (o->seen_measured_fps && !parse_points (o->measured_fps, true, "measured-fps", command,
                                             points))
    return false;

  const char *power = o->power;
  if (!o->seen_power && points->len > 0)
    power = "measured";
  if (g_str_equal (power, "constant-energy"))
    curve->model = AW_POWER_CONSTANT_ENERGY;
  else if (g_str_equal (power, "constant-velocity"))
    curve->model = AW_POWER_CONSTANT_VELOCITY;
  else if (g_str_has_prefix (power, "creep:"))
    {
      curve->model = AW_POWER_CREEP;
      if (!parse_plain_number (power + 6, &curve->creep_pct_per_01g)
          || curve->creep_pct_per_01g <= -100.0 || curve->creep_pct_per_01g > 1000.0)
        {
          aw_cli_error (command, "--power: creep:PCT needs a percentage per +0.1 g above -100 "
                        "and at most 1000 (found \"%s\")", power);
          return false;
        }
    }
  else if (g_str_equal (power, "measured"))
    {
      curve->model = AW_POWER_MEASURED;
      if (points->len == 0)
        {
          aw_cli_error (command, "--power: measured needs --measured-mps or --measured-fps");
          return false;
        }
    }
  else
    {
      aw_cli_error (command, "--power: expected constant-energy, constant-velocity, creep:PCT "
                    "or measured (found \"%s\")", power);
      return false;
    }
  if (points->len > 0 && curve->model != AW_POWER_MEASURED)
    {
      aw_cli_error (command, "--measured-mps/--measured-fps: only with --power measured");
      return false;
    }
  if (curve->model == AW_POWER_MEASURED)
    {
      curve->n_points = points->len;
      *points_out = (AwPowerPoint *) g_array_free (g_steal_pointer (&points), FALSE);
      curve->points = *points_out;
    }

  site->energy_limit_j = o->seen_limit ? o->limit_j : NAN;
  site->chrono_mass_kg = o->seen_chrono_mass ? aw_g_to_kg (o->chrono_mass_g) : NAN;
  site->min_engagement_m = o->seen_min_distance ? o->min_distance_m : NAN;
  return true;
}

bool
aw_cli_parse_hop_limit (const char *text, double *ratio, const char *command)
{
  double v;
  if (g_str_equal (text, "none"))
    {
      *ratio = NAN;
      return true;
    }
  if (!parse_plain_number (text, &v) || v < AW_HOP_MAX_LIFT_RATIO_MIN
      || v > AW_HOP_MAX_LIFT_RATIO_MAX)
    {
      aw_cli_error (command, "--hop-limit: expected the highest lift ratio the hop-up reaches "
                    "(0.1 … 20) or none (found \"%s\")", text);
      return false;
    }
  *ratio = v;
  return true;
}

bool
aw_cli_hop_limit_apply (const AwCliSiteOptions *o, const AwSetup *setup, const AwShot *own,
                        AwAnalysisInput *in, double *ratio, const char *command)
{
  double r = setup ? setup->hop.max_lift_ratio : NAN;
  if (o->seen_hop_limit && !aw_cli_parse_hop_limit (o->hop_limit, &r, command))
    return false;
  *ratio = r;
  in->hop_limit_s = NAN;
  if (isnan (r))
    return true;
  AwShot s = *own;
  s.spin_rad_s = 0.0;
  in->hop_limit_s = aw_hop_limit_s_for_lift_ratio (&s, r);
  /* NAN here: the lift model gives no lift, so there is nothing to limit */
  if (isnan (in->hop_limit_s))
    *ratio = NAN;
  return true;
}

void
aw_cli_print_hop_limit (FILE *out, double ratio, const AwShot *own, const char *indent)
{
  if (isnan (ratio))
    fprintf (out, "%sNo hop limit given: the model lets every BB be hopped as well as it needs, "
             "which favours\n%sheavy BBs; give --hop-limit RATIO (the highest lift ratio the "
             "hop-up reaches).\n", indent, indent);
  else
    fprintf (out, "%sHop limit: lift ratio %.2f at most with the %.2f g BB at %.1f m/s. At its "
             "strongest setting the\n%shop-up gives every BB the same spin parameter (a modelling "
             "assumption), so heavier,\n%sslower BBs get less lift.\n", indent, ratio,
             aw_kg_to_g (own->mass_kg), own->velocity_mps, indent, indent);
}

const char *
aw_cli_power_model_label (const AwPowerCurve *curve)
{
  switch (curve->model)
    {
    case AW_POWER_CONSTANT_ENERGY: return "constant energy";
    case AW_POWER_CONSTANT_VELOCITY: return "constant velocity";
    case AW_POWER_CREEP: return "energy creeps up with heavier BBs";
    case AW_POWER_MEASURED: return "measured points, interpolated";
    default: return "unknown";
    }
}

void
aw_cli_print_caution (FILE *out)
{
  fprintf (out,
           "\nCaution: these figures are computed estimates, not permission to play. Wear sealed,\n"
           "impact-rated eye protection wherever BBs fly. The site's own chronograph, with its BB\n"
           "and rules, decides compliance; respect minimum engagement distances, and local law\n"
           "applies.\n");
}

/* ---- project ---- */

void
aw_cli_project_base_clear (AwCliProjectBase *base)
{
  g_clear_pointer (&base->project, aw_project_free);
  base->setup = NULL;
}

static bool
find_class (const AwProject *p, const char *file, const char *site_name, const char *class_name,
            AwSiteClass *site, const char *command)
{
  AwSiteRules *rules = aw_project_find_site_rules (p, site_name);
  if (rules == NULL)
    {
      GString *names = g_string_new (NULL);
      for (guint i = 0; i < p->site_rules->len && i < 20; i++)
        g_string_append_printf (names, "%s\"%s\"", i ? ", " : "",
                                ((AwSiteRules *) p->site_rules->pdata[i])->name);
      aw_cli_error (command, "--site: %s has no site rules named \"%s\"%s%s", file, site_name,
                    names->len ? "; it has " : " (it has none)", names->str);
      g_string_free (names, TRUE);
      return false;
    }
  for (guint i = 0; i < rules->classes->len; i++)
    {
      const AwSiteClassRule *r = rules->classes->pdata[i];
      if (g_strcmp0 (r->name, class_name) == 0)
        {
          aw_site_class_rule_to_site_class (r, site);
          return true;
        }
    }
  GString *names = g_string_new (NULL);
  for (guint i = 0; i < rules->classes->len && i < 20; i++)
    g_string_append_printf (names, "%s\"%s\"", i ? ", " : "",
                            ((AwSiteClassRule *) rules->classes->pdata[i])->name);
  aw_cli_error (command, "--class: site \"%s\" has no class named \"%s\"%s%s", site_name,
                class_name, names->len ? "; it has " : " (it has none)", names->str);
  g_string_free (names, TRUE);
  return false;
}

bool
aw_cli_project_base_load (const char *file, const char *setup_name, const AwCliSiteOptions *o,
                          AwAnalysisInput *in, AwCliProjectBase *base, const char *command)
{
  memset (base, 0, sizeof *base);
  if (file == NULL)
    {
      aw_cli_error (command, "--project: needed with %s",
                    setup_name ? "--setup" : "--site and --class");
      return false;
    }
  if (o->seen_site != o->seen_class)
    {
      aw_cli_error (command, "%s: give both --site NAME and --class NAME",
                    o->seen_site ? "--class" : "--site");
      return false;
    }
  if (setup_name == NULL && !o->seen_site)
    {
      aw_cli_error (command, "--setup: name the setup to use from %s", file);
      return false;
    }

  if (setup_name)
    {
      if (!aw_cli_load_setup (file, setup_name, command, &base->project, &base->setup))
        return false;
      AwBridgeStatus bs = aw_setup_to_analysis_input (base->setup, base->project, in);
      if (bs != AW_BRIDGE_OK)
        {
          aw_cli_error (command, "--setup: \"%s\" in %s cannot be analysed (%s)", setup_name,
                        file, aw_bridge_status_name (bs));
          aw_cli_project_base_clear (base);
          return false;
        }
      aw_setup_power_curve (base->setup, &base->curve);
    }
  else
    {
      g_autoptr (GPtrArray) problems = g_ptr_array_new_with_free_func (g_free);
      g_autoptr (GError) error = NULL;
      base->project = aw_project_load_file (file, AW_PROJECT_LOAD_LENIENT, problems, &error);
      if (base->project == NULL)
        {
          aw_cli_error (command, "--project: %s: %s", file,
                        error ? error->message : "cannot be read");
          return false;
        }
    }
  if (o->seen_site)
    {
      if (!find_class (base->project, file, o->site, o->class_name, &base->site, command))
        {
          aw_cli_project_base_clear (base);
          return false;
        }
      base->have_site = true;
    }
  return true;
}
