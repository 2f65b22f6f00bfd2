/* aw-project-bridge.c: from stored setups to the inputs of the analysis
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <math.h>

#include "aw-project.h"
#include "aw-units.h"

static const AwProjectConditions standard_conditions = {
  .temperature_c = 15.0,
  .pressure_hpa = 1013.25,
  .altitude_m = NAN,
  .humidity_pct = 50.0,
  .wind_speed_mps = 0.0,
  .wind_from_deg = 90.0,
  .extra = NULL,
};

const AwProjectConditions *
aw_setup_effective_conditions (const AwSetup *setup, const AwProject *project)
{
  if (setup != NULL && setup->conditions != NULL)
    return setup->conditions;
  if (project != NULL)
    return &project->conditions;
  return &standard_conditions;
}

AwAirStatus
aw_project_conditions_to_air (const AwProjectConditions *c, AwAir *air)
{
  g_return_val_if_fail (c != NULL && air != NULL, AW_AIR_BAD_TEMPERATURE);
  AwConditions ac;
  aw_conditions_init_standard (&ac);
  ac.temperature_c = c->temperature_c;
  if (!isnan (c->pressure_hpa))
    ac.pressure_hpa = c->pressure_hpa;
  else
    {
      ac.pressure_hpa = NAN;
      ac.altitude_m = c->altitude_m;
    }
  ac.humidity = c->humidity_pct / 100.0;
  return aw_air_from_conditions (&ac, air);
}

/* Blowing FROM wind_from_deg, clockwise from the line of fire: 0 head wind (toward −x),
 * 90 from the right (toward +y, the left), 180 tail wind, 270 from the left. */
void
aw_project_conditions_wind (const AwProjectConditions *c, double wind[3])
{
  g_return_if_fail (c != NULL && wind != NULL);
  double d = aw_deg_to_rad (c->wind_from_deg);
  double w = c->wind_speed_mps;
  wind[0] = -w * cos (d);
  wind[1] = w * sin (d);
  wind[2] = 0.0;
  /* exact zeros for the cardinal directions, so a pure crosswind has no along-range part */
  for (int i = 0; i < 2; i++)
    if (fabs (wind[i]) < 1e-12 * (w > 0 ? w : 1.0))
      wind[i] = 0.0;
}

void
aw_setup_power_curve (AwSetup *setup, AwPowerCurve *curve)
{
  g_return_if_fail (setup != NULL && curve != NULL);
  AwReplica *r = &setup->replica;
  curve->model = r->energy_model;
  curve->ref_mass_kg = aw_g_to_kg (r->ref_mass_g);
  curve->ref_velocity_mps = r->ref_velocity_mps;
  curve->creep_pct_per_01g = r->creep_pct_per_01g;
  if (r->curve_points == NULL)
    r->curve_points = g_array_new (FALSE, FALSE, sizeof (AwPowerPoint));
  g_array_set_size (r->curve_points, r->points->len);
  for (guint i = 0; i < r->points->len; i++)
    {
      const AwReplicaPoint *p = &g_array_index (r->points, AwReplicaPoint, i);
      AwPowerPoint *q = &g_array_index (r->curve_points, AwPowerPoint, i);
      q->mass_kg = aw_g_to_kg (p->mass_g);
      q->velocity_mps = p->velocity_mps;
    }
  curve->points = r->points->len > 0 ? (const AwPowerPoint *) r->curve_points->data : NULL;
  curve->n_points = r->points->len;
}

AwBridgeStatus
aw_setup_to_analysis_input (AwSetup *setup, const AwProject *project, AwAnalysisInput *in)
{
  g_return_val_if_fail (setup != NULL && in != NULL, AW_BRIDGE_BAD_INPUT);
  aw_analysis_input_init (in);
  AwShot *shot = &in->shot;

  if (!isfinite (setup->bb.mass_g) || setup->bb.mass_g <= 0.0
      || !isfinite (setup->bb.diameter_mm) || setup->bb.diameter_mm <= 0.0
      || !isfinite (setup->muzzle_height_m) || !isfinite (setup->hop.tilt_deg)
      || !isfinite (setup->hop.value))
    return AW_BRIDGE_BAD_INPUT;

  shot->mass_kg = aw_g_to_kg (setup->bb.mass_g);
  shot->diameter_m = aw_mm_to_m (setup->bb.diameter_mm);

  AwPowerCurve curve;
  aw_setup_power_curve (setup, &curve);
  double v = aw_power_velocity_for_mass (&curve, shot->mass_kg);
  if (!isfinite (v) || v <= 0.0)
    return AW_BRIDGE_BAD_POWER;
  shot->velocity_mps = v;

  shot->elevation_rad = 0.0;
  shot->height_m = setup->muzzle_height_m;
  shot->hop_tilt_rad = aw_deg_to_rad (setup->hop.tilt_deg);

  const AwProjectConditions *c = aw_setup_effective_conditions (setup, project);
  if (!isfinite (c->wind_speed_mps) || !isfinite (c->wind_from_deg))
    return AW_BRIDGE_BAD_CONDITIONS;
  aw_project_conditions_wind (c, shot->wind);
  if (aw_project_conditions_to_air (c, &shot->air) != AW_AIR_OK)
    return AW_BRIDGE_BAD_CONDITIONS;

  aw_aero_model_init (&shot->aero);
  shot->aero.drag = setup->model.drag;
  shot->aero.drag_cd = setup->model.drag_cd;
  shot->aero.lift = setup->model.lift;
  shot->aero.lift_slope = setup->model.lift_slope;
  shot->aero.lift_factor = setup->model.lift_factor;
  shot->aero.drag_factor = setup->model.drag_factor;
  shot->aero.spin_decay_factor = setup->model.spin_decay_factor;

  in->hop_mode = setup->hop.mode;
  switch (setup->hop.mode)
    {
    case AW_HOP_MODE_SPIN:
      in->hop_value = aw_rpm_to_rad_s (setup->hop.value);
      shot->spin_rad_s = in->hop_value;
      break;
    case AW_HOP_MODE_LIFT_RATIO:
      in->hop_value = setup->hop.value;
      shot->spin_rad_s = 0.0;
      break;
    case AW_HOP_MODE_AUTO:
    default:
      in->hop_value = 0.0;
      shot->spin_rad_s = 0.0;
      break;
    }

  in->band_half_m = setup->band_half_height_m;
  in->sight_height_m = setup->sighting.sight_height_m;
  in->zero_distance_m = setup->sighting.zero_distance_m;
  in->angle_unit = setup->sighting.angle_unit;

  /* the hop limit, stated with the setup's own BB at its own velocity, as a spin parameter
   * (modelling assumption, no source: the same for every BB) */
  if (!isnan (setup->hop.max_lift_ratio))
    {
      if (!isfinite (setup->hop.max_lift_ratio) || setup->hop.max_lift_ratio < 0.0)
        return AW_BRIDGE_BAD_INPUT;
      AwShot own = *shot;
      own.spin_rad_s = 0.0;
      in->hop_limit_s = aw_hop_limit_s_for_lift_ratio (&own, setup->hop.max_lift_ratio);
    }
  return AW_BRIDGE_OK;
}

void
aw_site_class_rule_to_site_class (const AwSiteClassRule *rule, AwSiteClass *site)
{
  g_return_if_fail (rule != NULL && site != NULL);
  site->energy_limit_j = rule->energy_limit_j;
  site->chrono_mass_kg = isnan (rule->chrono_bb_mass_g) ? 0.0 : aw_g_to_kg (rule->chrono_bb_mass_g);
  site->min_engagement_m = rule->min_engagement_m > 0.0 ? rule->min_engagement_m : NAN;
}

const char *
aw_bridge_status_name (AwBridgeStatus status)
{
  switch (status)
    {
    case AW_BRIDGE_OK:
      return "ok";
    case AW_BRIDGE_BAD_CONDITIONS:
      return "bad-conditions";
    case AW_BRIDGE_BAD_POWER:
      return "bad-power";
    case AW_BRIDGE_BAD_INPUT:
      return "bad-input";
    default:
      return "unknown";
    }
}
