/* aw-analysis.h: band range, sight line and zero, auto hop, range tables, BB-mass conversion and
 * BB recommendation, built on the flight engine
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * libm only (like the flight engine): no GLib, no user-visible strings. Every function is
 * re-entrant and thread-safe (sweeps call them from several threads at once).
 */
#pragma once

#include <stdbool.h>
#include <stddef.h>

#include "aw-flight.h"

#ifdef __cplusplus
extern "C" {
#endif

#define AW_BAND_HALF_DEFAULT_M 0.15

typedef enum
{
  AW_HOP_MODE_AUTO = 0,      /* the lift ratio that maximises the band range */
  AW_HOP_MODE_LIFT_RATIO,    /* hop_value is the lift ratio at the muzzle */
  AW_HOP_MODE_SPIN,          /* hop_value is the model spin at the muzzle, rad/s */
} AwHopMode;

typedef enum
{
  AW_ANGLE_MRAD = 0,
  AW_ANGLE_MOA,
} AwAngleUnit;

/* Everything an analysis needs about one setup. shot.spin_rad_s and shot.elevation_rad are
 * outputs of the analysis (from the hop and the zero) unless the mode says otherwise. */
typedef struct
{
  AwShot shot;               /* BB, muzzle velocity, height, hop tilt, wind, air, models */
  AwHopMode hop_mode;
  double hop_value;          /* lift ratio, or rad/s for AW_HOP_MODE_SPIN */
  double band_half_m;        /* half-height h of the band, default 0.15 m */
  double sight_height_m;     /* sight above the bore, default 0 */
  double zero_distance_m;    /* NAN or ≤ 0: unset; the bore keeps shot.elevation_rad */
  bool optimise_elevation;   /* auto hop also chooses the bore elevation (zero must be unset) */
  AwAngleUnit angle_unit;
  double hop_limit_s;        /* hop limit: the largest spin parameter S = r·ω⊥/V the hop-up gives
                              * at the muzzle, whatever the BB (see "hop limit" below); NAN: no
                              * limit. Build it with aw_hop_limit_s_for_lift_ratio. */
} AwAnalysisInput;

/* Defaults: aw_shot_init, auto hop, band ±0.15 m, no sight height, no zero, mrad, no hop
 * limit. */
void aw_analysis_input_init (AwAnalysisInput *in);

typedef enum
{
  AW_ANALYSIS_OK = 0,
  AW_ANALYSIS_NO_BAND = 1,          /* the flight never enters the band */
  AW_ANALYSIS_HOP_UNREACHABLE = 2,  /* a requested lift ratio cannot be reached by the model */
  AW_ANALYSIS_NO_ZERO = 3,          /* no bore elevation puts the trajectory on the zero */
  AW_ANALYSIS_BAD_INPUT = -1,       /* see shot_status */
  AW_ANALYSIS_FLIGHT_FAILED = -2,   /* the engine returned an error; see flight_status */
} AwAnalysisStatus;

/* Which input was refused (AW_ANALYSIS_BAD_INPUT); AW_FIELD_SHOT: see shot_status. */
typedef enum
{
  AW_FIELD_NONE = 0,
  AW_FIELD_SHOT,               /* a field of AwShot, named by shot_status */
  AW_FIELD_HOP_MODE,
  AW_FIELD_HOP_VALUE,          /* lift ratio 0 … 20, or spin 0 … 1e5 rad/s */
  AW_FIELD_BAND_HALF,          /* 0 < h ≤ 5 m */
  AW_FIELD_SIGHT_HEIGHT,       /* |sight height| ≤ 1 m */
  AW_FIELD_ZERO_DISTANCE,      /* NAN, ≤ 0 (unset) or up to 1000 m */
  AW_FIELD_OPTIMISE_ELEVATION, /* cannot be combined with a zero distance */
  AW_FIELD_ANGLE_UNIT,
  AW_FIELD_STEP,               /* range table step 0.01 … 1000 m */
  AW_FIELD_MAX_DISTANCE,       /* range table maximum distance ≤ 10 000 m */
  AW_FIELD_MIN_ENGAGEMENT,     /* NAN, ≤ 0 or up to 1000 m */
  AW_FIELD_POWER_CURVE,
  AW_FIELD_SITE,
  AW_FIELD_MASSES,             /* 1 … 64 masses, each 0.01 … 5 g */
  AW_FIELD_HOP_LIMIT,          /* hop_limit_s: NAN (none) or 0 … 1000 */
} AwAnalysisField;

const char *aw_analysis_field_name (AwAnalysisField field);

/* Hold as an angle: atan(hold/distance) in mrad (1 mrad = 0.001 rad) or MOA (π/10 800 rad).
 * NAN at distance ≤ 0. */
double aw_hold_angle (double hold_m, double distance_m, AwAngleUnit unit);

/* The sight line: z_sight(x) = muzzle height + sight height (level line of sight).
 * With sight height 0 and no zero it is the level bore line from the muzzle. */

typedef struct
{
  AwAnalysisStatus status;
  AwShotStatus shot_status;
  AwFlightStatus flight_status;
  AwAnalysisField bad_field;  /* which input was refused (AW_ANALYSIS_BAD_INPUT) */
  double lift_ratio;          /* at the muzzle (the one used) */
  double spin_rad_s;          /* muzzle model spin that gives it */
  double elevation_rad;       /* bore elevation used */
  double band_near_m;         /* where the trajectory enters the band (0: the muzzle is in it) */
  double band_range_m;        /* x_far: where it first leaves the band after x_near, through the
                               * top or the bottom (contiguous reading; the ground when it lands
                               * inside the band) */
  double ground_distance_m;
  double apex_height_m;       /* above the ground */
  double apex_distance_m;
  double time_of_flight_s;
  int flights;                /* trajectories computed to reach this result */
  /* the hop limit (all false / NAN when the input has none) */
  double hop_limit_lift_ratio;/* the largest lift ratio the limit allows with this BB at this
                               * speed (at the muzzle, bore elevation used); NAN: no limit */
  bool hop_limited;           /* the limit shapes this result: auto hop ended at it (within
                               * 0.2 %: a stronger hop-up would reach further, band_range_m is
                               * the reduced one), or a given hop is above it (hop_over_limit) */
  bool hop_over_limit;        /* a given lift ratio or spin is above what the limit allows: it is
                               * flown as given (not clamped), but the hop-up cannot reach it */
} AwBandResult;

/* Band range of one shot as given (its spin and elevation; the hop mode and zero of `in` are
 * ignored) against the band and sight line of `in`. Flies the shot itself, with the band edges
 * located on the engine's dense output. */
AwAnalysisStatus aw_band_of_shot (const AwAnalysisInput *in, const AwShot *shot,
                                  AwBandResult *out);

/* Solves the hop (auto, ratio or spin) and the zero, and reports the band. This is the one call
 * the window, the command line, sweeps and printing use. */
AwAnalysisStatus aw_analysis_solve (const AwAnalysisInput *in, AwBandResult *out);

/* The auto-hop optimum alone: lift ratio maximising band range (elevation as given, or also
 * optimised when in->optimise_elevation; with a zero distance the elevation is re-solved for
 * every hop tried). The hop mode of `in` is ignored. */
AwAnalysisStatus aw_auto_hop (const AwAnalysisInput *in, AwBandResult *out);

/* Bore elevation that makes the trajectory cross the sight line at zero_distance_m (going down),
 * for the shot's spin. */
AwAnalysisStatus aw_zero_elevation (const AwAnalysisInput *in, const AwShot *shot,
                                    double zero_distance_m, double *elevation_rad);

/* ---- hop limit ----
 *
 * A real hop-up has a strongest setting. Modelling assumption, no source: at that setting a given
 * hop-up gives at most the same spin parameter S = r·ω⊥/V at the muzzle whatever the BB (its
 * spin scales with the muzzle speed). People state the limit as what they can see: the highest
 * lift ratio the hop-up reaches with one BB (usually the setup's own) at its muzzle velocity.
 * That ratio is converted once to S_max with the setup's lift model; any other BB then gets, at
 * most, the lift ratio S_max gives with its own mass and speed. At a fixed S the Magnus force is
 * ½ρA·V²·C_L(S), so the largest lift ratio scales with V²/m: a heavier BB at equal energy gets
 * less (∝ 1/m²) and ends up under-hopped. */

/* S_max of a hop-up whose strongest setting gives lift ratio max_lift_ratio with the BB and muzzle
 * velocity of `own` (its diameter, hop tilt, wind, air and lift model too; elevation as given).
 * When the lift model cannot reach that ratio within the engine's spin limit (1e5 rad/s), the S of
 * that spin limit (the model's own ceiling, so the limit never binds). NAN when max_lift_ratio is
 * NAN, negative or not finite, the shot is bad, or the lift model gives no lift. */
double aw_hop_limit_s_for_lift_ratio (const AwShot *own, double max_lift_ratio);

/* The largest lift ratio a hop limit allows with the BB and speed of `shot` (not capped by the
 * engine's spin limit). NAN when hop_limit_s is NAN or the shot is bad. */
double aw_hop_limit_lift_ratio (const AwShot *shot, double hop_limit_s);

/* ---- range table ---- */

typedef struct
{
  double distance_m;
  double height_cm;           /* trajectory above (+) or below (−) the sight line */
  double hold_cm;             /* aim correction: −height_cm */
  double hold_angle;          /* hold as an angle in the chosen unit (mrad or MOA); NAN at 0 m */
  double time_s;
  double speed_mps;
  double energy_j;
  double spin_rad_s;
  double drift_cm_per_mps;    /* lateral move per 1 m/s of full crosswind (second flight with
                               * +1 m/s added), positive downwind; NAN past that flight's end */
  double drift_cm;            /* lateral position with the shot's own wind */
  bool in_band;               /* |height| ≤ h at this distance (geometric, per row) */
  bool beyond_min_distance;   /* distance ≥ the minimum engagement distance given */
} AwRangeRow;

typedef struct
{
  AwBandResult band;
  AwRangeRow *rows;
  size_t n_rows;
} AwRangeTable;

/* Solves the hop and zero as aw_analysis_solve does (result in table->band), then rows every
 * step_m (0.01 … 1000 m) from 0 up to the ground or max_m (≤ 0: to the ground), and a second
 * flight with 1 m/s more crosswind for the drift column.
 * min_engagement_m: NAN or ≤ 0 when none. The table owns rows; free with aw_range_table_clear
 * (also after an error). Returns table->band.status. */
AwAnalysisStatus aw_range_table_build (const AwAnalysisInput *in, double step_m, double max_m,
                                       double min_engagement_m, AwRangeTable *table);
void aw_range_table_clear (AwRangeTable *table);

/* Energy remaining at a distance (NAN when the flight ends before it); linear between rows. */
double aw_range_table_energy_at (const AwRangeTable *table, double distance_m);

/* ---- energy versus BB mass ---- */

typedef enum
{
  AW_POWER_CONSTANT_ENERGY = 0,  /* spring, electric piston: E the same for every BB mass */
  AW_POWER_CONSTANT_VELOCITY,    /* v the same for every BB mass */
  AW_POWER_CREEP,                /* E grows by creep_pct per +0.1 g (gas, HPA, over-volumed),
                                  * compounding: E = E_ref·(1 + pct/100)^((m − m_ref)/0.1 g) */
  AW_POWER_MEASURED,             /* measured (mass, velocity) points, interpolated */
} AwPowerModel;

typedef struct
{
  double mass_kg;
  double velocity_mps;
} AwPowerPoint;

typedef struct
{
  AwPowerModel model;
  double ref_mass_kg;            /* the BB the reference velocity was measured with */
  double ref_velocity_mps;
  double creep_pct_per_01g;      /* AW_POWER_CREEP: energy change in % per +0.1 g */
  const AwPowerPoint *points;    /* AW_POWER_MEASURED: sorted or not, ≥ 1 point */
  size_t n_points;
} AwPowerCurve;

/* Muzzle velocity with a BB of mass_kg (NAN on bad input). Measured points: energy interpolated
 * linearly in mass between points, held at the end points' energy outside them. */
double aw_power_velocity_for_mass (const AwPowerCurve *curve, double mass_kg);
double aw_power_energy_for_mass (const AwPowerCurve *curve, double mass_kg);

/* ---- site classes and the BB recommendation ---- */

typedef struct
{
  double energy_limit_j;         /* ≤ 0 or NAN: no limit */
  double chrono_mass_kg;         /* the BB mass the site chronographs with; ≤ 0: the BB used */
  double min_engagement_m;       /* ≤ 0 or NAN: none */
} AwSiteClass;

typedef enum
{
  AW_COMPLIANCE_UNKNOWN = 0,     /* no limit given */
  AW_COMPLIANCE_UNDER,
  AW_COMPLIANCE_OVER,
} AwCompliance;

/* Energy as the site measures it (with its chrono BB), and the verdict. */
AwCompliance aw_site_check (const AwSiteClass *site, const AwPowerCurve *curve,
                            double used_mass_kg, double *chrono_energy_j);

typedef struct
{
  double mass_kg;
  double velocity_mps;
  double energy_j;               /* with this BB */
  double chrono_energy_j;        /* as the site measures it */
  AwCompliance compliance;
  bool energy_over_limit;        /* energy WITH THIS BB above the limit (flagged even when the
                                  * site's chrono BB passes; such a mass is never recommended) */
  AwBandResult band;             /* with auto hop */
  double drift_30m_cm_per_mps;   /* NAN when the flight ends before 30 m */
  bool recommended;
} AwRecommendRow;

typedef enum
{
  AW_RECOMMEND_REASON_NONE = 0,       /* no compliant mass */
  AW_RECOMMEND_REASON_LONGEST_BAND,   /* the compliant mass with the longest band range */
  AW_RECOMMEND_REASON_LESS_DRIFT,     /* within 2 % of the longest band range and less drift */
} AwRecommendReason;

typedef struct
{
  AwRecommendRow *rows;
  size_t n_rows;
  int best;                      /* index into rows, −1 when none is compliant */
  AwRecommendReason reason;
  AwAnalysisField bad_field;     /* which input was refused (AW_ANALYSIS_BAD_INPUT) */
} AwRecommendation;

/* For each mass: velocity from the curve, auto hop, band range, drift at 30 m per 1 m/s,
 * energy and compliance. base supplies everything else (diameter, height, air, models, band).
 * With base->hop_limit_s set, every mass gets the hop limit at its own speed (row band:
 * hop_limit_lift_ratio, hop_limited and the reduced band range); without it the model hops
 * every BB as well as needed, which favours heavy BBs. */
AwAnalysisStatus aw_recommend (const AwAnalysisInput *base, const AwPowerCurve *curve,
                               const AwSiteClass *site, const double *masses_kg, size_t n_masses,
                               AwRecommendation *out);
void aw_recommendation_clear (AwRecommendation *rec);

const char *aw_analysis_status_name (AwAnalysisStatus status);

#ifdef __cplusplus
}
#endif
