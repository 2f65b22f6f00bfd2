/* aw-air.c: properties of the air the BB flies through
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-air.h"

#include <math.h>
#include <stddef.h>

/* Ideal gas with the common engineering R_d = 287.05 J/(kg·K) (physics reference §1a; lies between
 * the CIPM-2007 and USSA76 constants, ≤ 2e-5 relative from either). */
double
aw_air_dry_density (double pressure_pa, double temperature_k)
{
  return pressure_pa / (AW_R_DRY * temperature_k);
}

/* Picard, Davis, Gläser & Fujii 2008, Metrologia 45:149 (CIPM-2007), saturation vapour pressure. */
double
aw_air_saturation_pressure (double temperature_k)
{
  const double A = 1.2378847e-5, B = -1.9121316e-2, C = 33.93711047, D = -6.3431645e3;
  double T = temperature_k;
  return exp (A * T * T + B * T + C + D / T);
}

/* CIPM-2007 enhancement factor. */
double
aw_air_enhancement_factor (double pressure_pa, double temperature_k)
{
  double t = temperature_k - AW_T0_K;
  return 1.00062 + 3.14e-8 * pressure_pa + 5.6e-7 * t * t;
}

/* CIPM-2007 compressibility factor. */
double
aw_air_compressibility (double pressure_pa, double temperature_k, double x_v)
{
  const double a0 = 1.58123e-6, a1 = -2.9331e-8, a2 = 1.1043e-10;
  const double b0 = 5.707e-6, b1 = -2.051e-8;
  const double c0 = 1.9898e-4, c1 = -2.376e-6;
  const double d = 1.83e-11, e = -0.765e-8;
  double p = pressure_pa, T = temperature_k, t = T - AW_T0_K;
  return 1.0
         - (p / T) * (a0 + a1 * t + a2 * t * t + (b0 + b1 * t) * x_v + (c0 + c1 * t) * x_v * x_v)
         + (p * p) / (T * T) * (d + e * x_v * x_v);
}

double
aw_air_cipm2007_density (double pressure_pa, double temperature_k, double humidity)
{
  const double R = 8.314472;
  const double x_co2 = 0.0004;
  const double M_a = (28.96546 + 12.011 * (x_co2 - 0.0004)) * 1e-3;
  const double M_v = 18.01528e-3;
  double x_v = humidity * aw_air_enhancement_factor (pressure_pa, temperature_k)
               * aw_air_saturation_pressure (temperature_k) / pressure_pa;
  double Z = aw_air_compressibility (pressure_pa, temperature_k, x_v);
  return pressure_pa * M_a / (Z * R * temperature_k) * (1.0 - x_v * (1.0 - M_v / M_a));
}

/* USSA76 Sutherland law: μ = β·T^1.5/(T + S), β = 1.458e-6, S = 110.4 K. */
double
aw_air_sutherland_viscosity (double temperature_k)
{
  return 1.458e-6 * pow (temperature_k, 1.5) / (temperature_k + 110.4);
}

/* U.S. Standard Atmosphere 1976, first layer (0 … 11 km geopotential). */
#define USSA76_R0   6356766.0
#define USSA76_M0   28.9644
#define USSA76_RSTAR 8314.32
#define USSA76_L    (-0.0065)

bool
aw_air_ussa76 (double altitude_m, double delta_t_k, double *temperature_k, double *pressure_pa,
               double *density, double *geopotential_m)
{
  if (!isfinite (altitude_m) || !isfinite (delta_t_k) || altitude_m < -500.0
      || altitude_m > 11000.0)
    return false;
  double H = USSA76_R0 * altitude_m / (USSA76_R0 + altitude_m);
  double T_std = AW_T_STD_K + USSA76_L * H;
  double expo = AW_G0 * USSA76_M0 / (USSA76_RSTAR * USSA76_L);
  double p = AW_P_STD_PA * pow (AW_T_STD_K / T_std, expo);
  double T = T_std + delta_t_k;
  if (temperature_k)
    *temperature_k = T;
  if (pressure_pa)
    *pressure_pa = p;
  if (density)
    *density = p * USSA76_M0 / (USSA76_RSTAR * T);
  if (geopotential_m)
    *geopotential_m = H;
  return true;
}

double
aw_air_speed_of_sound (double temperature_k)
{
  return sqrt (1.4 * USSA76_RSTAR / USSA76_M0 * temperature_k);
}

void
aw_conditions_init_standard (AwConditions *c)
{
  c->temperature_c = 15.0;
  c->pressure_hpa = 1013.25;
  c->altitude_m = 0.0;
  c->humidity = 0.0;
  c->density = NAN;
  c->viscosity = NAN;
}

AwAirStatus
aw_air_from_conditions (const AwConditions *c, AwAir *out)
{
  double T, p;
  AwAir air_buf, *air = &air_buf;   /* *out is written only on success */

  if (!isnan (c->temperature_c) && !(c->temperature_c >= -40.0 && c->temperature_c <= 60.0))
    return AW_AIR_BAD_TEMPERATURE;
  if (!(c->humidity >= 0.0 && c->humidity <= 1.0))
    return AW_AIR_BAD_HUMIDITY;

  if (!isnan (c->pressure_hpa))
    {
      if (!(c->pressure_hpa >= 500.0 && c->pressure_hpa <= 1100.0))
        return AW_AIR_BAD_PRESSURE;
      p = c->pressure_hpa * 100.0;
      T = isnan (c->temperature_c) ? AW_T_STD_K : c->temperature_c + AW_T0_K;
    }
  else
    {
      double T_std;
      if (!(c->altitude_m >= -500.0 && c->altitude_m <= 6000.0))
        return AW_AIR_BAD_ALTITUDE;
      if (!aw_air_ussa76 (c->altitude_m, 0.0, &T_std, &p, NULL, NULL))
        return AW_AIR_BAD_ALTITUDE;
      T = isnan (c->temperature_c) ? T_std : c->temperature_c + AW_T0_K;
    }

  if (!isnan (c->density))
    {
      if (!(c->density >= 0.5 && c->density <= 1.6))
        return AW_AIR_BAD_DENSITY;
      air->density = c->density;
    }
  else if (c->humidity > 0.0)
    air->density = aw_air_cipm2007_density (p, T, c->humidity);
  else
    air->density = aw_air_cipm2007_density (p, T, 0.0);

  if (!isnan (c->viscosity))
    {
      if (!(c->viscosity >= 1e-5 && c->viscosity <= 3e-5))
        return AW_AIR_BAD_VISCOSITY;
      air->viscosity = c->viscosity;
    }
  else
    air->viscosity = aw_air_sutherland_viscosity (T);

  *out = air_buf;
  return AW_AIR_OK;
}
