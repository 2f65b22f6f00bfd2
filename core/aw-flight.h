/* aw-flight.h: 3-D flight of a spinning BB
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * libm only. Frame: x downrange, y left, z up (right-handed). Backspin is ω = (0, −ω, 0).
 * Hop tilt θ rolls the spin axis clockwise as seen from behind the shooter, so a positive tilt
 * curves the BB to the right (−y). A crosswind of W blows toward +y (from the shooter's right).
 *
 * State (9 components): position (3), velocity (3), spin vector (3).
 *
 *   m·dv/dt = m·g − ½ρ·C_D(Re)·A·V·v_r + ½ρ·A·V²·C_L(S)·(ω × v_r)/|ω × v_r|
 *   I·dω/dt = −c_M·S_tot·½ρV²·A·r·ω̂
 *
 * with v_r = v − w, V = |v_r|, Re = ρVd/μ, S = r·|ω × v_r|/V² (perpendicular spin only),
 * S_tot = r|ω|/V, I = κ·m·r².
 */
#pragma once

#include <stdbool.h>
#include <stddef.h>

#include "aw-aero.h"
#include "aw-air.h"

#ifdef __cplusplus
extern "C" {
#endif

#define AW_FLIGHT_STATE_DIM 9

/* Everything that defines one shot. Build with aw_shot_init() then change fields. */
typedef struct
{
  double mass_kg;           /* BB mass */
  double diameter_m;        /* BB diameter */
  double velocity_mps;      /* muzzle speed (ground frame) */
  double elevation_rad;     /* bore elevation above level */
  double height_m;          /* muzzle height above the ground */
  double spin_rad_s;        /* backspin magnitude at the muzzle (≥ 0) */
  double hop_tilt_rad;      /* roll of the spin axis, positive curves right */
  double wind[3];           /* wind velocity vector, m/s (crosswind toward +y is wind[1] > 0) */
  double gravity;           /* m/s², default AW_G0 */
  AwAir air;
  AwAeroModel aero;
} AwShot;

/* 0.20 g, 5.95 mm, 90 m/s, level from 1.5 m, no spin, no wind, standard sea-level air
 * (ρ = 1.225, μ = 1.7894e-5), default models. */
void aw_shot_init (AwShot *shot);

typedef enum
{
  AW_SHOT_OK = 0,
  AW_SHOT_BAD_MASS = -1,
  AW_SHOT_BAD_DIAMETER = -2,
  AW_SHOT_BAD_VELOCITY = -3,
  AW_SHOT_BAD_ELEVATION = -4,
  AW_SHOT_BAD_HEIGHT = -5,
  AW_SHOT_BAD_SPIN = -6,
  AW_SHOT_BAD_TILT = -7,
  AW_SHOT_BAD_WIND = -8,
  AW_SHOT_BAD_GRAVITY = -9,
  AW_SHOT_BAD_DENSITY = -10,
  AW_SHOT_BAD_VISCOSITY = -11,
  AW_SHOT_BAD_MODEL = -12,
} AwShotStatus;

/* Checks every field for finiteness and range:
 * mass 0.01 … 5 g, diameter 1 … 20 mm, velocity 0 < v ≤ 300 m/s, elevation −90° … 90°,
 * height 0 … 100 m, spin 0 … 1e5 rad/s, tilt −90° … 90°, wind |w_i| ≤ 50 m/s, gravity 0.1 … 30,
 * density 0.01 … 5 kg/m³, viscosity 1e-6 … 1e-3 Pa·s, model constants finite and ≥ 0. */
AwShotStatus aw_shot_validate (const AwShot *shot);

/* Initial state vector for a shot. */
void aw_shot_initial_state (const AwShot *shot, double y[AW_FLIGHT_STATE_DIM]);

/* Right-hand side: dy/dt for state y. Exposed so tests can integrate the same equations with an
 * independent solver. Returns the number of evaluations made (always 1). */
void aw_flight_rhs (const AwShot *shot, const double y[AW_FLIGHT_STATE_DIM],
                    double dydt[AW_FLIGHT_STATE_DIM]);

/* Hop conversion at the muzzle: lift ratio = Magnus force ÷ weight at launch. */
typedef enum
{
  AW_HOP_OK = 0,
  AW_HOP_UNREACHABLE = 1,   /* the lift model saturates below the requested ratio */
  AW_HOP_NO_LIFT = 2,       /* the lift model is off, or its factor is zero */
  AW_HOP_BAD_INPUT = -1,
} AwHopStatus;

double aw_shot_lift_ratio_for_spin (const AwShot *shot, double spin_rad_s);
AwHopStatus aw_shot_spin_for_lift_ratio (const AwShot *shot, double lift_ratio,
                                         double *spin_rad_s);

/* Spin parameter at the muzzle, S = r·ω⊥/V, for a muzzle spin: ω⊥ = ω·sin α is the part of the
 * spin perpendicular to the air-relative velocity V (hop tilt, elevation and wind included).
 * NAN on a bad shot or a negative spin. */
double aw_shot_spin_parameter_for_spin (const AwShot *shot, double spin_rad_s);

/* The muzzle spin giving spin parameter s: ω = s·V/(r·sin α). It is NOT capped at the engine's
 * spin limit (compare with 1e5 rad/s before flying it). NAN on a bad shot, a negative or
 * non-finite s, or when no spin gives a perpendicular part (sin α ≈ 0). */
double aw_shot_spin_for_spin_parameter (const AwShot *shot, double s);

/* ---- Integration ---- */

typedef enum
{
  AW_FLIGHT_GROUND = 0,          /* reached z = 0 (normal end) */
  AW_FLIGHT_DISTANCE = 1,        /* reached the requested maximum downrange distance */
  AW_FLIGHT_TIME_LIMIT = 2,      /* reached the time limit */
  AW_FLIGHT_STOPPED = 3,         /* stopped by the sample callback */
  AW_FLIGHT_BAD_INPUT = -1,      /* aw_shot_validate failed; see shot_status */
  AW_FLIGHT_TOO_MANY_STEPS = -2,
  AW_FLIGHT_STEP_UNDERFLOW = -3,
  AW_FLIGHT_NOT_FINITE = -4,
  AW_FLIGHT_NO_MEMORY = -5,
} AwFlightStatus;

typedef struct
{
  double t;          /* s */
  double x, y, z;    /* m */
  double vx, vy, vz; /* m/s */
  double speed;      /* m/s, ground frame */
  double spin;       /* |ω|, rad/s */
  double energy;     /* J, ½·m·speed² */
} AwSample;

typedef struct
{
  double rtol;           /* relative tolerance, default 1e-6 */
  double atol;           /* absolute tolerance, default 1e-6 */
  double sample_step_m;  /* downrange spacing of samples; ≤ 0: no fixed-step samples */
  double max_distance_m; /* stop at this downrange distance; ≤ 0: no limit */
  double max_time_s;     /* time limit, default 30 s */
  int max_steps;         /* default 100 000 */
  bool keep_samples;     /* store samples in the result (default true) */
} AwFlightOptions;

void aw_flight_options_init (AwFlightOptions *opt);

typedef struct
{
  AwFlightStatus status;
  AwShotStatus shot_status;
  /* summary */
  double time_of_flight;     /* s, at the end event */
  double ground_distance;    /* m, x at the end */
  double ground_drift;       /* m, y at the end */
  double apex_height;        /* m, highest z (the muzzle height when it never rises) */
  double apex_distance;      /* m, x at the apex */
  double impact_speed;       /* m/s */
  double impact_energy;      /* J */
  double impact_spin;        /* rad/s */
  AwSample end;              /* full state at the end event */
  /* bookkeeping */
  int steps_accepted;
  int steps_rejected;
  int rhs_evaluations;
  /* samples at fixed downrange steps (x = 0, step, 2·step, …) and the end point */
  AwSample *samples;
  size_t n_samples;
  size_t samples_alloc;
} AwTrajectory;

/* Callback for streaming samples; return false to stop (status AW_FLIGHT_STOPPED). */
typedef bool (*AwSampleFunc) (const AwSample *sample, void *user_data);

/* Integrate one shot. traj must be zero-initialised (or reused: samples are overwritten and the
 * buffer grown as needed). Never aborts; the status says how it ended. */
AwFlightStatus aw_flight_run (const AwShot *shot, const AwFlightOptions *opt, AwTrajectory *traj);

/* Like aw_flight_run, and calls func for each sample as it is produced (may be NULL). */
AwFlightStatus aw_flight_run_full (const AwShot *shot, const AwFlightOptions *opt,
                                   AwTrajectory *traj, AwSampleFunc func, void *user_data);

/* ---- Events located on the dense output (optional) ---- */

#define AW_FLIGHT_MAX_LEVELS 8

typedef enum
{
  AW_EVENT_HEIGHT_UP = 0,    /* z reaches one of the requested levels from below */
  AW_EVENT_HEIGHT_DOWN,      /* z falls below one of the requested levels */
  AW_EVENT_APEX,             /* a local maximum of z (vz from + to −) */
} AwEventKind;

typedef struct
{
  AwEventKind kind;
  int level;                 /* index into AwFlightEvents.levels; −1 for the apex */
  AwSample state;            /* full state at the event */
} AwFlightEvent;

/* Called for each event in order along the flight; return false to end the flight there
 * (status AW_FLIGHT_STOPPED, with traj->end and the summary set to the event state). */
typedef bool (*AwEventFunc) (const AwFlightEvent *event, void *user_data);

typedef struct
{
  const double *levels;      /* heights z in m whose crossings are reported; may be NULL */
  size_t n_levels;           /* at most AW_FLIGHT_MAX_LEVELS */
  bool apex;                 /* also report local maxima of z */
  AwEventFunc func;
  void *user_data;
} AwFlightEvents;

/* Like aw_flight_run_full, and reports height crossings and apexes located on the dense output
 * (to the engine's root tolerance, not interpolated between samples). A level counts as
 * "above" when z ≥ level; each change of that state inside a step (split at the extremum of z
 * when vz changes sign there) is one event, so a trajectory touching a level from below gives an
 * up and a down event, and one staying just under it gives none. events may be NULL. */
AwFlightStatus aw_flight_run_events (const AwShot *shot, const AwFlightOptions *opt,
                                     AwTrajectory *traj, AwSampleFunc func, void *user_data,
                                     const AwFlightEvents *events);

/* Interpolate the stored samples at downrange distance x (linear between samples). Returns false
 * when x is outside the sampled range. */
bool aw_trajectory_at (const AwTrajectory *traj, double x, AwSample *out);

void aw_trajectory_clear (AwTrajectory *traj);

/* Names for status codes, for logs and tests (not for users: the UI translates codes). */
const char *aw_flight_status_name (AwFlightStatus status);
const char *aw_shot_status_name (AwShotStatus status);

#ifdef __cplusplus
}
#endif
