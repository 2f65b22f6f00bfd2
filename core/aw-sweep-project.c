/* aw-sweep-project.c: a project setup as a sweep setup
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Kept apart from aw-sweep.c so that programs using sweeps without projects do not link the
 * project layer.
 */
#include "aw-config.h"

#include <math.h>

#include "aw-core-error.h"
#include "aw-sweep.h"

gboolean
aw_sweep_setup_from_project (AwSweepSetup *out, AwSetup *setup, const AwProject *project,
                             GError **error)
{
  const AwProjectConditions *pc;
  AwBridgeStatus st;

  g_return_val_if_fail (out != NULL && setup != NULL, FALSE);

  aw_sweep_setup_init (out, setup->name);
  st = aw_setup_to_analysis_input (setup, project, &out->input);
  if (st != AW_BRIDGE_OK)
    {
      g_set_error (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID, "setup \"%s\": %s",
                   setup->name, aw_bridge_status_name (st));
      return FALSE;
    }
  aw_setup_power_curve (setup, &out->power);

  /* the conditions the setup's air came from, for temperature sweeps */
  pc = aw_setup_effective_conditions (setup, project);
  aw_conditions_init_standard (&out->conditions);
  out->conditions.temperature_c = pc->temperature_c;
  if (isfinite (pc->pressure_hpa))
    out->conditions.pressure_hpa = pc->pressure_hpa;
  else
    {
      out->conditions.pressure_hpa = NAN;
      out->conditions.altitude_m = isfinite (pc->altitude_m) ? pc->altitude_m : 0.0;
    }
  out->conditions.humidity = isfinite (pc->humidity_pct) ? pc->humidity_pct / 100.0 : 0.0;
  out->conditions.density = NAN;
  out->conditions.viscosity = NAN;
  return TRUE;
}
