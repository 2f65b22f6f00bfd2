/* test-air.c: air properties against the physics reference (physics.md §1)
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Every check names its source as physics.md tags it: SRC (a named published source),
 * CALC (computed there with the formula shown) or MEM (from memory).
 */
#include <glib.h>
#include <math.h>

#include "aw-air.h"

/* ---- §1a dry air, ideal gas ---- */

/* physics.md §1a: "tolerance 5e-5 relative covers all three R_d choices" (CALC) */
#define DRY_DENSITY_RTOL 5e-5

static void
test_dry_density (void)
{
  /* physics.md §1a check values, CALC with R_d = 287.05 */
  static const struct { double p, T, rho; } rows[] = {
    { 101325.0, 288.15, 1.22501 },
    { 101325.0, 293.15, 1.20412 },
    { 100000.0, 273.15, 1.27538 },
    {  90000.0, 303.15, 1.03425 },
  };
  for (guint i = 0; i < G_N_ELEMENTS (rows); i++)
    {
      double rho = aw_air_dry_density (rows[i].p, rows[i].T);
      g_test_message ("p %.0f T %.2f: rho %.6f (table %.5f)", rows[i].p, rows[i].T, rho,
                      rows[i].rho);
      g_assert_cmpfloat_with_epsilon (rho / rows[i].rho, 1.0, DRY_DENSITY_RTOL);
    }
}

/* ---- §1c USSA76 troposphere ---- */

/* physics.md §1c: "Tolerance: T ±0.001 K, p ±1 Pa, ρ ±1e-5 kg/m³" */
#define USSA_T_TOL    0.001
#define USSA_P_TOL    1.0
#define USSA_RHO_TOL  1e-5
/* geopotential and speed of sound: half a unit of the printed last digit of the CALC table */
#define USSA_H_TOL    0.005
#define USSA_A_TOL    0.005
/* viscosity column of the same table: the Sutherland same-formula tolerance of §1d */
#define USSA_MU_TOL   1e-9

typedef struct
{
  double Z, H, T, p, rho, mu, a;
} UssaRow;

/* physics.md §1c check rows, CALC from the USSA76 constants (U.S. Standard Atmosphere 1976, SRC) */
static const UssaRow ussa_rows[] = {
  {    0.0,    0.00, 288.150, 101325.0, 1.22500, 1.7894e-5, 340.29 },
  {  500.0,  499.96, 284.900,  95461.3, 1.16727, 1.7737e-5, 338.37 },
  { 1000.0,  999.84, 281.651,  89876.3, 1.11166, 1.7579e-5, 336.43 },
  { 1500.0, 1499.65, 278.402,  84559.7, 1.05810, 1.7420e-5, 334.49 },
  { 2000.0, 1999.37, 275.154,  79501.4, 1.00655, 1.7260e-5, 332.53 },
  { 2500.0, 2499.02, 271.906,  74691.8, 0.95695, 1.7099e-5, 330.56 },
  { 3000.0, 2998.58, 268.659,  70121.2, 0.90925, 1.6938e-5, 328.58 },
};

static void
test_ussa76 (void)
{
  for (guint i = 0; i < G_N_ELEMENTS (ussa_rows); i++)
    {
      const UssaRow *r = &ussa_rows[i];
      double T = NAN, p = NAN, rho = NAN, H = NAN;
      g_assert_true (aw_air_ussa76 (r->Z, 0.0, &T, &p, &rho, &H));
      g_test_message ("Z %.0f: H %.3f T %.4f p %.2f rho %.6f", r->Z, H, T, p, rho);
      g_assert_cmpfloat_with_epsilon (H, r->H, USSA_H_TOL);        /* physics.md §1c (CALC) */
      /* physics.md §1c, USSA76 (SRC), rows CALC */
      g_assert_cmpfloat_with_epsilon (T, r->T, USSA_T_TOL);
      g_assert_cmpfloat_with_epsilon (p, r->p, USSA_P_TOL);
      g_assert_cmpfloat_with_epsilon (rho, r->rho, USSA_RHO_TOL);
      /* physics.md §1c table, a = sqrt(1.4·R_star/M0·T) (CALC) */
      g_assert_cmpfloat_with_epsilon (aw_air_speed_of_sound (T), r->a, USSA_A_TOL);
      /* physics.md §1c table, μ column = Sutherland USSA76 form of §1d (SRC) */
      g_assert_cmpfloat_with_epsilon (aw_air_sutherland_viscosity (T), r->mu, USSA_MU_TOL);
    }
}

/* physics.md §1c pitfall: using the geometric altitude as H gives 89874.6 Pa / 1.11164 at 1000 m
 * and 70108.5 Pa / 0.90912 at 3000 m (CALC). Those differ from the right rows by more than the
 * tolerance, so the engine must land on the right ones and not on these. */
static void
test_ussa76_geopotential_pitfall (void)
{
  static const struct { double Z, p_right, rho_right, p_wrong, rho_wrong; } rows[] = {
    { 1000.0, 89876.3, 1.11166, 89874.6, 1.11164 },
    { 3000.0, 70121.2, 0.90925, 70108.5, 0.90912 },
  };
  for (guint i = 0; i < G_N_ELEMENTS (rows); i++)
    {
      double p, rho, H;
      g_assert_true (aw_air_ussa76 (rows[i].Z, 0.0, NULL, &p, &rho, &H));
      g_assert_cmpfloat (H, <, rows[i].Z);
      g_assert_cmpfloat_with_epsilon (p, rows[i].p_right, USSA_P_TOL);
      g_assert_cmpfloat_with_epsilon (rho, rows[i].rho_right, USSA_RHO_TOL);
      g_assert_cmpfloat (fabs (p - rows[i].p_wrong), >, USSA_P_TOL);
      g_assert_cmpfloat (fabs (rho - rows[i].rho_wrong), >, USSA_RHO_TOL);
    }
}

/* physics.md §1c: non-standard day, T = T_std + ΔT with p unchanged (as fluids ATMOSPHERE_1976) */
static void
test_ussa76_delta_t (void)
{
  double T0, p0, rho0, T, p, rho;
  g_assert_true (aw_air_ussa76 (1000.0, 0.0, &T0, &p0, &rho0, NULL));
  g_assert_true (aw_air_ussa76 (1000.0, 10.0, &T, &p, &rho, NULL));
  g_assert_cmpfloat (p, ==, p0);
  g_assert_cmpfloat_with_epsilon (T, ussa_rows[2].T + 10.0, USSA_T_TOL);
  /* ideal gas at fixed p: ρ ∝ 1/T (physics.md §1c, ρ = p·M0/(R*·T)) */
  g_assert_cmpfloat_with_epsilon (rho, rho0 * T0 / T, 1e-12);
}

/* aw-air.h contract: the troposphere is −500 … 11 000 m; outside, or not finite, returns false */
static void
test_ussa76_range (void)
{
  double T = 123.0;
  g_assert_false (aw_air_ussa76 (-501.0, 0.0, &T, NULL, NULL, NULL));
  g_assert_false (aw_air_ussa76 (11001.0, 0.0, &T, NULL, NULL, NULL));
  g_assert_false (aw_air_ussa76 (NAN, 0.0, &T, NULL, NULL, NULL));
  g_assert_false (aw_air_ussa76 (INFINITY, 0.0, &T, NULL, NULL, NULL));
  g_assert_false (aw_air_ussa76 (0.0, NAN, &T, NULL, NULL, NULL));
  g_assert_cmpfloat (T, ==, 123.0);   /* untouched on failure */
  g_assert_true (aw_air_ussa76 (-500.0, 0.0, NULL, NULL, NULL, NULL));
  g_assert_true (aw_air_ussa76 (11000.0, 0.0, NULL, NULL, NULL, NULL));
}

/* ---- §1b CIPM-2007 moist air ---- */

/* physics.md §1b: "Tolerance: ±0.05 % between implementations of the same formula" */
#define PSV_RTOL 5e-4
/* physics.md §1b: "Same-formula tolerance: 1e-5 kg/m³" */
#define CIPM_RHO_TOL 1e-5
/* x_v and Z columns: half a unit of the last printed digit (6 decimals) of the CALC table */
#define CIPM_XV_TOL 5e-7
#define CIPM_Z_TOL  5e-7

static void
test_cipm2007_saturation (void)
{
  /* physics.md §1b, p_sv CIPM column (CALC from Picard et al. 2008, SRC) */
  static const struct { double t, psv; } rows[] = {
    { 0.01, 611.66 }, { 10.0, 1228.11 }, { 20.0, 2339.16 }, { 25.0, 3169.76 }, { 30.0, 4246.80 },
  };
  for (guint i = 0; i < G_N_ELEMENTS (rows); i++)
    {
      double psv = aw_air_saturation_pressure (rows[i].t + AW_T0_K);
      g_test_message ("t %.2f C: p_sv %.4f Pa (table %.2f)", rows[i].t, psv, rows[i].psv);
      g_assert_cmpfloat_with_epsilon (psv / rows[i].psv, 1.0, PSV_RTOL);
    }
}

typedef struct
{
  double t, p, h, x_v, Z, rho;
} CipmRow;

/* physics.md §1b CIPM-2007 moist-air check values (CALC, x_CO2 = 0.0004; formula SRC: Picard,
 * Davis, Gläser & Fujii 2008, Metrologia 45:149) */
static const CipmRow cipm_rows[] = {
  { 20.0, 101325.0, 0.0, 0.0,      0.999643, 1.20456 },
  { 20.0, 101325.0, 0.5, 0.011589, 0.999615, 1.19931 },
  { 15.0, 101325.0, 0.5, 0.008450, 0.999572, 1.22163 },
  { 25.0, 100000.0, 0.8, 0.025462, 0.999619, 1.15765 },
  { 30.0, 101325.0, 1.0, 0.042093, 0.999586, 1.14635 },
  {  0.0, 101325.0, 0.0, 0.0,      0.999416, 1.29305 },
};

static void
test_cipm2007_density (void)
{
  for (guint i = 0; i < G_N_ELEMENTS (cipm_rows); i++)
    {
      const CipmRow *r = &cipm_rows[i];
      double T = r->t + AW_T0_K;
      double x_v = r->h * aw_air_enhancement_factor (r->p, T) * aw_air_saturation_pressure (T)
                   / r->p;
      double Z = aw_air_compressibility (r->p, T, x_v);
      double rho = aw_air_cipm2007_density (r->p, T, r->h);
      g_test_message ("t %.0f p %.0f h %.1f: x_v %.7f Z %.7f rho %.6f", r->t, r->p, r->h, x_v, Z,
                      rho);
      g_assert_cmpfloat_with_epsilon (x_v, r->x_v, CIPM_XV_TOL);   /* physics.md §1b (CALC) */
      g_assert_cmpfloat_with_epsilon (Z, r->Z, CIPM_Z_TOL);        /* physics.md §1b (CALC) */
      g_assert_cmpfloat_with_epsilon (rho, r->rho, CIPM_RHO_TOL);  /* physics.md §1b (CALC) */
    }
}

/* physics.md §1b: moist air is lighter than dry air at the same p and T (water vapour M_v < M_a):
 * the table rows at 20 °C fall from 1.20456 (dry) to 1.19931 (h = 0.5), CALC */
static void
test_cipm2007_humidity_monotone (void)
{
  double prev = INFINITY;
  for (int k = 0; k <= 10; k++)
    {
      double rho = aw_air_cipm2007_density (101325.0, 293.15, k / 10.0);
      g_assert_cmpfloat (rho, <, prev);
      prev = rho;
    }
}

/* ---- §1d Sutherland ---- */

/* physics.md §1d: "Tolerance: 1e-9 Pa·s for the same formula" */
#define SUTHERLAND_TOL 1e-9

static void
test_sutherland (void)
{
  /* physics.md §1d, μ USSA76 column (CALC; law and constants SRC: USSA76) */
  static const struct { double T, mu; } rows[] = {
    { 273.15, 1.71608e-5 }, { 283.15, 1.76515e-5 }, { 288.15, 1.78938e-5 },
    { 293.15, 1.81341e-5 }, { 303.15, 1.86087e-5 },
  };
  for (guint i = 0; i < G_N_ELEMENTS (rows); i++)
    {
      double mu = aw_air_sutherland_viscosity (rows[i].T);
      g_test_message ("T %.2f: mu %.6e (table %.5e)", rows[i].T, mu, rows[i].mu);
      g_assert_cmpfloat_with_epsilon (mu, rows[i].mu, SUTHERLAND_TOL);
    }
  /* physics.md §1d: White's constants (273 K, 111 K) give 1.79018e-5 at 288.15 K, 8e-9 away from
   * the USSA76 constants, so the engine must not be using them (CALC) */
  g_assert_cmpfloat (fabs (aw_air_sutherland_viscosity (288.15) - 1.79018e-5), >, SUTHERLAND_TOL);
}

/* ---- aw_air_from_conditions ---- */

static void
test_conditions_standard (void)
{
  AwConditions c;
  AwAir air = { 0 };

  aw_conditions_init_standard (&c);
  g_assert_cmpint (aw_air_from_conditions (&c, &air), ==, AW_AIR_OK);
  /* dry CIPM-2007 at 15 °C, 101325 Pa: same formula as aw_air_cipm2007_density */
  g_assert_cmpfloat_with_epsilon (air.density, aw_air_cipm2007_density (101325.0, 288.15, 0.0),
                                  1e-12);
  /* physics.md §1a: 1.22501 (R_d = 287.05); the CIPM Z and M_a put dry air within 0.05 % of it
   * (the 20 °C rows of §1a and §1b: 1.20412 vs 1.20456 differ by 3.7e-4), CALC */
  g_assert_cmpfloat_with_epsilon (air.density / 1.22501, 1.0, 5e-4);
  /* physics.md §1d: 1.78938e-5 at 288.15 K (CALC, USSA76 Sutherland) */
  g_assert_cmpfloat_with_epsilon (air.viscosity, 1.78938e-5, SUTHERLAND_TOL);
}

static void
test_conditions_humid (void)
{
  AwConditions c;
  AwAir air = { 0 };

  aw_conditions_init_standard (&c);
  c.temperature_c = 20.0;
  c.humidity = 0.5;
  g_assert_cmpint (aw_air_from_conditions (&c, &air), ==, AW_AIR_OK);
  /* physics.md §1b: 20 °C, 101325 Pa, h 0.5 → 1.19931 (CALC, CIPM-2007) */
  g_assert_cmpfloat_with_epsilon (air.density, 1.19931, CIPM_RHO_TOL);
  /* physics.md §1d: 1.81341e-5 at 293.15 K (CALC) */
  g_assert_cmpfloat_with_epsilon (air.viscosity, 1.81341e-5, SUTHERLAND_TOL);
}

static void
test_conditions_altitude (void)
{
  AwConditions c;
  AwAir air = { 0 };

  aw_conditions_init_standard (&c);
  c.pressure_hpa = NAN;
  c.temperature_c = NAN;
  c.altitude_m = 2000.0;
  g_assert_cmpint (aw_air_from_conditions (&c, &air), ==, AW_AIR_OK);
  /* physics.md §1c row Z = 2000 m: T 275.154 K, p 79501.4 Pa (USSA76, SRC); density by CIPM-2007 at
   * that p and T, dry. p ±1 Pa moves ρ by 1.3e-5 relative, hence the tolerance. */
  double rho = aw_air_cipm2007_density (79501.4, 275.154, 0.0);
  g_assert_cmpfloat_with_epsilon (air.density / rho, 1.0, 2e-5);
  /* physics.md §1c row Z = 2000 m: μ 1.7260e-5 */
  g_assert_cmpfloat_with_epsilon (air.viscosity, 1.7260e-5, USSA_MU_TOL);

  /* a given temperature overrides the standard one at the altitude's pressure */
  c.temperature_c = 30.0;
  g_assert_cmpint (aw_air_from_conditions (&c, &air), ==, AW_AIR_OK);
  rho = aw_air_cipm2007_density (79501.4, 303.15, 0.0);
  g_assert_cmpfloat_with_epsilon (air.density / rho, 1.0, 2e-5);
}

static void
test_conditions_overrides (void)
{
  AwConditions c;
  AwAir air = { 0 };

  aw_conditions_init_standard (&c);
  c.density = 1.2;
  c.viscosity = 1.81e-5;
  g_assert_cmpint (aw_air_from_conditions (&c, &air), ==, AW_AIR_OK);
  g_assert_cmpfloat (air.density, ==, 1.2);
  g_assert_cmpfloat (air.viscosity, ==, 1.81e-5);
}

/* aw-air.h ranges: temperature −40 … 60 °C, pressure 500 … 1100 hPa, altitude −500 … 6000 m,
 * humidity 0 … 1, density 0.5 … 1.6 kg/m³, viscosity 1e-5 … 3e-5 Pa·s. Each bad field gets its own
 * code and the output is left untouched. */
typedef enum { F_TEMP, F_PRESSURE, F_ALTITUDE, F_HUMIDITY, F_DENSITY, F_VISCOSITY } Field;

static void
test_conditions_range_errors (void)
{
  static const struct { Field field; double value; AwAirStatus expect; } cases[] = {
    { F_TEMP, -40.1, AW_AIR_BAD_TEMPERATURE },
    { F_TEMP, 60.1, AW_AIR_BAD_TEMPERATURE },
    { F_TEMP, INFINITY, AW_AIR_BAD_TEMPERATURE },
    { F_TEMP, -INFINITY, AW_AIR_BAD_TEMPERATURE },
    { F_TEMP, -300.0, AW_AIR_BAD_TEMPERATURE },
    { F_PRESSURE, 499.0, AW_AIR_BAD_PRESSURE },
    { F_PRESSURE, 1101.0, AW_AIR_BAD_PRESSURE },
    { F_PRESSURE, -1013.0, AW_AIR_BAD_PRESSURE },
    { F_PRESSURE, INFINITY, AW_AIR_BAD_PRESSURE },
    { F_ALTITUDE, -501.0, AW_AIR_BAD_ALTITUDE },
    { F_ALTITUDE, 6001.0, AW_AIR_BAD_ALTITUDE },
    { F_ALTITUDE, NAN, AW_AIR_BAD_ALTITUDE },
    { F_ALTITUDE, INFINITY, AW_AIR_BAD_ALTITUDE },
    { F_HUMIDITY, -0.01, AW_AIR_BAD_HUMIDITY },
    { F_HUMIDITY, 1.01, AW_AIR_BAD_HUMIDITY },
    { F_HUMIDITY, NAN, AW_AIR_BAD_HUMIDITY },
    { F_HUMIDITY, 50.0, AW_AIR_BAD_HUMIDITY },   /* a percentage passed as a fraction */
    { F_DENSITY, 0.49, AW_AIR_BAD_DENSITY },
    { F_DENSITY, 1.61, AW_AIR_BAD_DENSITY },
    { F_DENSITY, 0.0, AW_AIR_BAD_DENSITY },
    { F_DENSITY, -1.2, AW_AIR_BAD_DENSITY },
    { F_DENSITY, INFINITY, AW_AIR_BAD_DENSITY },
    { F_VISCOSITY, 0.9e-5, AW_AIR_BAD_VISCOSITY },
    { F_VISCOSITY, 3.1e-5, AW_AIR_BAD_VISCOSITY },
    { F_VISCOSITY, 0.0, AW_AIR_BAD_VISCOSITY },
    { F_VISCOSITY, -INFINITY, AW_AIR_BAD_VISCOSITY },
  };

  for (guint i = 0; i < G_N_ELEMENTS (cases); i++)
    {
      AwConditions c;
      AwAir air = { 42.0, 42.0 };
      aw_conditions_init_standard (&c);
      switch (cases[i].field)
        {
        case F_TEMP: c.temperature_c = cases[i].value; break;
        case F_PRESSURE: c.pressure_hpa = cases[i].value; break;
        case F_ALTITUDE: c.pressure_hpa = NAN; c.altitude_m = cases[i].value; break;
        case F_HUMIDITY: c.humidity = cases[i].value; break;
        case F_DENSITY: c.density = cases[i].value; break;
        case F_VISCOSITY: c.viscosity = cases[i].value; break;
        default: g_assert_not_reached ();
        }
      g_test_message ("case %u: field %d value %g", i, cases[i].field, cases[i].value);
      g_assert_cmpint (aw_air_from_conditions (&c, &air), ==, cases[i].expect);
      g_assert_cmpfloat (air.density, ==, 42.0);
      g_assert_cmpfloat (air.viscosity, ==, 42.0);
    }

  /* the limits themselves are inside */
  static const struct { Field field; double value; } edges[] = {
    { F_TEMP, -40.0 }, { F_TEMP, 60.0 }, { F_PRESSURE, 500.0 }, { F_PRESSURE, 1100.0 },
    { F_ALTITUDE, -500.0 }, { F_ALTITUDE, 6000.0 }, { F_HUMIDITY, 0.0 }, { F_HUMIDITY, 1.0 },
    { F_DENSITY, 0.5 }, { F_DENSITY, 1.6 }, { F_VISCOSITY, 1e-5 }, { F_VISCOSITY, 3e-5 },
  };
  for (guint i = 0; i < G_N_ELEMENTS (edges); i++)
    {
      AwConditions c;
      AwAir air = { 0 };
      aw_conditions_init_standard (&c);
      switch (edges[i].field)
        {
        case F_TEMP: c.temperature_c = edges[i].value; break;
        case F_PRESSURE: c.pressure_hpa = edges[i].value; break;
        case F_ALTITUDE: c.pressure_hpa = NAN; c.altitude_m = edges[i].value; break;
        case F_HUMIDITY: c.humidity = edges[i].value; break;
        case F_DENSITY: c.density = edges[i].value; break;
        case F_VISCOSITY: c.viscosity = edges[i].value; break;
        default: g_assert_not_reached ();
        }
      g_assert_cmpint (aw_air_from_conditions (&c, &air), ==, AW_AIR_OK);
      g_assert_true (isfinite (air.density) && air.density > 0.0);
      g_assert_true (isfinite (air.viscosity) && air.viscosity > 0.0);
    }
}

int
main (int argc, char **argv)
{
  g_test_init (&argc, &argv, NULL);

  g_test_add_func ("/core/air/dry-ideal-gas", test_dry_density);
  g_test_add_func ("/core/air/ussa76", test_ussa76);
  g_test_add_func ("/core/air/ussa76/geopotential-pitfall", test_ussa76_geopotential_pitfall);
  g_test_add_func ("/core/air/ussa76/delta-t", test_ussa76_delta_t);
  g_test_add_func ("/core/air/ussa76/range", test_ussa76_range);
  g_test_add_func ("/core/air/cipm2007/saturation-pressure", test_cipm2007_saturation);
  g_test_add_func ("/core/air/cipm2007/density", test_cipm2007_density);
  g_test_add_func ("/core/air/cipm2007/humidity-lowers-density", test_cipm2007_humidity_monotone);
  g_test_add_func ("/core/air/sutherland", test_sutherland);
  g_test_add_func ("/core/air/conditions/standard", test_conditions_standard);
  g_test_add_func ("/core/air/conditions/humid", test_conditions_humid);
  g_test_add_func ("/core/air/conditions/altitude", test_conditions_altitude);
  g_test_add_func ("/core/air/conditions/overrides", test_conditions_overrides);
  g_test_add_func ("/core/air/conditions/range-errors", test_conditions_range_errors);

  return g_test_run ();
}
