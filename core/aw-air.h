/* aw-air.h: properties of the air the BB flies through
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * libm only. All quantities in SI units (K, Pa, kg/m³, Pa·s, m). Sources are given beside each
 * function in aw-air.c and in the physics reference.
 */
#pragma once

#include <stdbool.h>

#ifdef __cplusplus
extern "C" {
#endif

#define AW_G0           9.80665     /* standard gravity, m/s², exact by definition */
#define AW_T0_K         273.15      /* 0 °C in kelvin */
#define AW_P_STD_PA     101325.0    /* standard sea-level pressure */
#define AW_T_STD_K      288.15      /* USSA76 sea-level temperature */
#define AW_R_DRY        287.05      /* common engineering gas constant of dry air, J/(kg·K) */

/* Air state consumed by the flight engine. */
typedef struct
{
  double density;     /* kg/m³ */
  double viscosity;   /* dynamic, Pa·s */
} AwAir;

/* Ideal-gas density of dry air, p in Pa, T in K. */
double aw_air_dry_density (double pressure_pa, double temperature_k);

/* Saturation vapour pressure over water (CIPM-2007 formula), T in K; result in Pa. */
double aw_air_saturation_pressure (double temperature_k);

/* Enhancement factor f(p, t) of CIPM-2007. */
double aw_air_enhancement_factor (double pressure_pa, double temperature_k);

/* Compressibility factor Z of moist air (CIPM-2007), x_v mole fraction of water vapour. */
double aw_air_compressibility (double pressure_pa, double temperature_k, double x_v);

/* Density of moist air by CIPM-2007 (x_CO2 = 400 ppm). humidity is relative, 0…1. */
double aw_air_cipm2007_density (double pressure_pa, double temperature_k, double humidity);

/* Sutherland viscosity with the USSA76 constants (β = 1.458e-6, S = 110.4 K). */
double aw_air_sutherland_viscosity (double temperature_k);

/* US Standard Atmosphere 1976 troposphere (0 … 11 km geopotential). Geometric altitude in m,
 * temperature offset in K added to the standard temperature at constant pressure.
 * Returns false when the altitude is outside −500 … 11 000 m. Any out pointer may be NULL. */
bool aw_air_ussa76 (double altitude_m,
                    double delta_t_k,
                    double *temperature_k,
                    double *pressure_pa,
                    double *density,
                    double *geopotential_m);

/* Speed of sound in dry air (USSA76 constants), T in K. */
double aw_air_speed_of_sound (double temperature_k);

/* Conditions as users give them. Either pressure or altitude; density/viscosity overrides win. */
typedef struct
{
  double temperature_c;   /* NAN: standard for the altitude (or 15 °C) */
  double pressure_hpa;    /* NAN: from altitude */
  double altitude_m;      /* used when pressure_hpa is NAN; 0 = sea level */
  double humidity;        /* relative, 0 … 1 */
  double density;         /* NAN: computed; else override, kg/m³ */
  double viscosity;       /* NAN: computed; else override, Pa·s */
} AwConditions;

/* Standard sea-level conditions: 15 °C, 1013.25 hPa, dry. */
void aw_conditions_init_standard (AwConditions *c);

typedef enum
{
  AW_AIR_OK = 0,
  AW_AIR_BAD_TEMPERATURE = -1,
  AW_AIR_BAD_PRESSURE = -2,
  AW_AIR_BAD_ALTITUDE = -3,
  AW_AIR_BAD_HUMIDITY = -4,
  AW_AIR_BAD_DENSITY = -5,
  AW_AIR_BAD_VISCOSITY = -6,
} AwAirStatus;

/* Air from conditions: CIPM-2007 density, Sutherland viscosity, USSA76 when only altitude is given.
 * Ranges: temperature −40 … 60 °C, pressure 500 … 1100 hPa, altitude −500 … 6000 m, humidity 0 … 1,
 * density 0.5 … 1.6 kg/m³, viscosity 1e-5 … 3e-5 Pa·s. */
AwAirStatus aw_air_from_conditions (const AwConditions *c, AwAir *air);

#ifdef __cplusplus
}
#endif
