/* aw-aero.c: drag, Magnus lift and spin-decay models
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-aero.h"

#include <math.h>

void
aw_aero_model_init (AwAeroModel *model)
{
  model->drag = AW_DRAG_CLIFT;
  model->drag_cd = 0.47;
  model->lift = AW_LIFT_SATURATING;
  model->lift_slope = AW_LIFT_TRADE_SLOPE;
  model->spin_decay_cm = AW_SPIN_DECAY_CM_DEFAULT;
  model->inertia_factor = AW_INERTIA_FACTOR_DEFAULT;
  model->lift_factor = 1.0;
  model->drag_factor = 1.0;
  model->spin_decay_factor = 1.0;
}

/* Clift, Grace & Weber 1978, Bubbles, Drops, and Particles, Table 5.2 (coefficients as in the
 * physics reference §2; 29.78 in the 3.38e5–4e5 piece). Above 4e5, outside this tool's envelope,
 * the last piece is held at its value at 4e5 continued by 0.1w − 0.49 (from memory, §2). */
double
aw_drag_clift (double re)
{
  if (!(re > 0.0))
    return 0.0;
  if (re <= 0.01)
    return 3.0 / 16.0 + 24.0 / re;
  double w = log10 (re);
  if (re <= 20.0)
    return 24.0 / re * (1.0 + 0.1315 * pow (re, 0.82 - 0.05 * w));
  if (re <= 260.0)
    return 24.0 / re * (1.0 + 0.1935 * pow (re, 0.6305));
  if (re <= 1.5e3)
    return pow (10.0, 1.6435 - 1.1242 * w + 0.1558 * w * w);
  if (re <= 1.2e4)
    return pow (10.0, -2.4571 + 2.5558 * w - 0.9295 * w * w + 0.1049 * w * w * w);
  if (re <= 4.4e4)
    return pow (10.0, -1.9181 + 0.6370 * w - 0.0636 * w * w);
  if (re <= 3.38e5)
    return pow (10.0, -4.3390 + 1.5809 * w - 0.1546 * w * w);
  if (re <= 4e5)
    return 29.78 - 5.3 * w;
  if (re <= 1e6)
    return 0.1 * w - 0.49;
  return 0.19 - 8e4 / re;
}

/* Morrison 2013, An Introduction to Fluid Mechanics, CUP (stated range Re ≤ 1e6). */
double
aw_drag_morrison (double re)
{
  if (!(re > 0.0))
    return 0.0;
  double a = re / 5.0;
  double b = re / 263000.0;
  return 24.0 / re + 2.6 * a / (1.0 + pow (a, 1.52)) + 0.411 * pow (b, -7.94) / (1.0 + pow (b, -8.0))
         + pow (re, 0.8) / 461000.0;
}

double
aw_aero_drag_coefficient (const AwAeroModel *model, double re)
{
  double cd;
  switch (model->drag)
    {
    case AW_DRAG_CLIFT:
      cd = aw_drag_clift (re);
      break;
    case AW_DRAG_MORRISON:
      cd = aw_drag_morrison (re);
      break;
    case AW_DRAG_CONSTANT:
      cd = model->drag_cd;
      break;
    case AW_DRAG_OFF:
    case AW_N_DRAG_MODELS:
    default:
      return 0.0;
    }
  return cd * model->drag_factor;
}

double
aw_aero_lift_coefficient (const AwAeroModel *model, double s)
{
  if (!(s > 0.0))
    return 0.0;
  switch (model->lift)
    {
    case AW_LIFT_SATURATING:
      return s / (1.0 + 2.0 * s);
    case AW_LIFT_SHS:
      return s <= 0.1 ? 1.5 * s : 0.09 + 0.6 * s;
    case AW_LIFT_LOTH:
      return 0.5 * s;
    case AW_LIFT_LINEAR:
      return model->lift_slope * s;
    case AW_LIFT_OFF:
    case AW_N_LIFT_MODELS:
    default:
      return 0.0;
    }
}

double
aw_aero_lift_coefficient_max (const AwAeroModel *model)
{
  switch (model->lift)
    {
    case AW_LIFT_SATURATING:
      return 0.5;
    case AW_LIFT_SHS:
    case AW_LIFT_LOTH:
      return INFINITY;
    case AW_LIFT_LINEAR:
      return model->lift_slope > 0.0 ? INFINITY : 0.0;
    case AW_LIFT_OFF:
    case AW_N_LIFT_MODELS:
    default:
      return 0.0;
    }
}

double
aw_aero_spin_parameter_for_lift (const AwAeroModel *model, double cl)
{
  if (!(cl >= 0.0) || !isfinite (cl))
    return -1.0;
  if (cl == 0.0)
    return 0.0;
  switch (model->lift)
    {
    case AW_LIFT_SATURATING:
      /* cl = s/(1+2s)  ⇒  s = cl/(1 − 2cl), for cl < 0.5 */
      return cl < 0.5 ? cl / (1.0 - 2.0 * cl) : -1.0;
    case AW_LIFT_SHS:
      return cl <= 0.15 ? cl / 1.5 : (cl - 0.09) / 0.6;
    case AW_LIFT_LOTH:
      return cl / 0.5;
    case AW_LIFT_LINEAR:
      return model->lift_slope > 0.0 ? cl / model->lift_slope : -1.0;
    case AW_LIFT_OFF:
    case AW_N_LIFT_MODELS:
    default:
      return -1.0;
    }
}
