/* aw-units.c: unit conversions
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-units.h"

#include <math.h>

double
aw_velocity_for_energy (double mass_kg, double energy_j)
{
  if (!(mass_kg > 0.0) || !(energy_j >= 0.0))
    return NAN;
  return sqrt (2.0 * energy_j / mass_kg);
}
