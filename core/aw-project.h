/* aw-project.h: the project data model (setups, replicas, chrono strings, site rules, conditions)
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Plain C structs with _new/_free/_copy and GPtrArray lists. Every struct keeps the JSON members
 * it does not know in `extra` (NULL when there are none), so a file written by a newer minor
 * revision of the format survives a load and a save unchanged.
 *
 * Units follow the file (data/FORMAT.md): grams, millimetres, metres, m/s, °C, hPa, %, degrees.
 * "Unset" optional numbers are NAN (test with isnan). Strings are UTF-8 and never NULL (empty
 * string when absent), except AwChronoString.date which is NULL when absent.
 *
 * Loading, saving and validation: aw-project-io.h. Bridges to the analysis: see the end of this
 * file (implemented in aw-project-bridge.c).
 */
#pragma once

#include <glib.h>
#include <json-glib/json-glib.h>
#include <stdbool.h>

#include "aw-aero.h"
#include "aw-analysis.h"
#include "aw-flight.h"

G_BEGIN_DECLS

#define AW_PROJECT_FORMAT_NAME    "arcwright-project"
#define AW_PROJECT_FORMAT_VERSION 1
#define AW_PROJECT_FILE_EXTENSION ".arcw"

/* ---- conditions ---- */

/* Wind direction: the direction the wind blows FROM, in degrees clockwise from the line of fire
 * seen from above: 0 = head wind (from the target), 90 = from the right (pushes the BB left),
 * 180 = tail wind, 270 = from the left. */
typedef struct _AwProjectConditions
{
  double temperature_c;     /* default 15 */
  double pressure_hpa;      /* station pressure; NAN when altitude_m is used */
  double altitude_m;        /* NAN when pressure_hpa is used (exactly one of the two is set) */
  double humidity_pct;      /* relative humidity 0 … 100, default 50 */
  double wind_speed_mps;    /* default 0 */
  double wind_from_deg;     /* see above, default 90 */
  JsonObject *extra;        /* unknown members (NULL when none) */
} AwProjectConditions;

/* 15 °C, 1013.25 hPa (altitude unset), 50 %, no wind, direction 90°. */
AwProjectConditions *aw_project_conditions_new (void);
void aw_project_conditions_init (AwProjectConditions *c);   /* same defaults, extra = NULL */
void aw_project_conditions_clear (AwProjectConditions *c);  /* frees extra */
void aw_project_conditions_copy_into (AwProjectConditions *dst, const AwProjectConditions *src);
AwProjectConditions *aw_project_conditions_copy (const AwProjectConditions *c);
void aw_project_conditions_free (AwProjectConditions *c);
bool aw_project_conditions_equal (const AwProjectConditions *a, const AwProjectConditions *b);

/* ---- replica ---- */

typedef enum
{
  AW_POWER_SOURCE_SPRING = 0,
  AW_POWER_SOURCE_ELECTRIC_PISTON,
  AW_POWER_SOURCE_GAS,
  AW_POWER_SOURCE_HPA,              /* high-pressure air */
  AW_POWER_SOURCE_CO2,
  AW_N_POWER_SOURCES
} AwPowerSource;

/* A measured muzzle velocity with one BB mass (energy model "measured"). */
typedef struct _AwReplicaPoint
{
  double mass_g;
  double velocity_mps;
  JsonObject *extra;                /* unknown members; the points array frees it */
} AwReplicaPoint;

typedef struct _AwReplica
{
  char *type;                       /* free text, e.g. "electric rifle, M4 pattern" */
  AwPowerSource power_source;
  AwPowerModel energy_model;        /* from aw-analysis.h; default constant energy */
  double creep_pct_per_01g;         /* AW_POWER_CREEP: energy change in % per +0.1 g, else 0 */
  GArray *points;                   /* of AwReplicaPoint; used by AW_POWER_MEASURED (≥ 1);
                                     * create with aw_replica_points_new () */
  double ref_mass_g;                /* the BB the reference velocity was measured with */
  double ref_velocity_mps;
  JsonObject *extra;
  JsonObject *reference_extra;      /* unknown members of "reference" */
  /* private: SI copy of points for aw_setup_power_curve (rebuilt on each call) */
  GArray *curve_points;
} AwReplica;

/* An empty GArray of AwReplicaPoint that frees each point's extra when cleared. */
GArray *aw_replica_points_new (void);

/* ---- BB, hop, sighting, models ---- */

typedef struct _AwBB
{
  double mass_g;                    /* default 0.20 */
  double diameter_mm;               /* default 5.95 */
  JsonObject *extra;
} AwBB;

/* Hop as stored: AW_HOP_MODE_AUTO (value unused), AW_HOP_MODE_LIFT_RATIO (value = lift ratio at
 * the muzzle), AW_HOP_MODE_SPIN (value = model spin in rpm — not rad/s as in AwAnalysisInput).
 *
 * max_lift_ratio is the hop limit: the highest lift ratio the hop-up reaches at its strongest
 * setting with the setup's own BB at its own muzzle velocity (file member "max_lift_ratio",
 * 0.1 … 20; NAN = no limit, not written). aw_setup_to_analysis_input turns it into
 * AwAnalysisInput.hop_limit_s (modelling assumption, no source: the same hop-up gives at most the
 * same spin parameter S = r·ω⊥/V at the muzzle whatever the BB). Editors read and write it
 * directly; NAN clears it. */
typedef struct _AwHop
{
  AwHopMode mode;                   /* default auto */
  double value;                     /* default 0 for auto, else as given */
  double tilt_deg;                  /* spin-axis roll, positive curves right; default 0 */
  double max_lift_ratio;            /* hop limit, see above; default NAN (none) */
  JsonObject *extra;
} AwHop;

#define AW_HOP_MAX_LIFT_RATIO_MIN 0.1
#define AW_HOP_MAX_LIFT_RATIO_MAX 20.0

typedef struct _AwSighting
{
  double sight_height_m;            /* above the bore, default 0.07 */
  double zero_distance_m;           /* NAN: unset */
  AwAngleUnit angle_unit;           /* default mrad */
  JsonObject *extra;
} AwSighting;

typedef struct _AwModelChoice
{
  AwDragModel drag;                 /* default AW_DRAG_CLIFT */
  double drag_cd;                   /* for AW_DRAG_CONSTANT, default 0.47 */
  AwLiftModel lift;                 /* default AW_LIFT_SATURATING */
  double lift_slope;                /* for AW_LIFT_LINEAR, default AW_LIFT_TRADE_SLOPE */
  double lift_factor;               /* calibration multipliers, default 1 */
  double drag_factor;
  double spin_decay_factor;
  JsonObject *extra;
} AwModelChoice;

/* ---- chrono strings and field observations ---- */

typedef enum
{
  AW_CHRONO_HOP_UNSPECIFIED = 0,    /* member absent */
  AW_CHRONO_HOP_OFF,
  AW_CHRONO_HOP_ON,
} AwChronoHop;

typedef enum
{
  AW_VELOCITY_UNIT_MPS = 0,
  AW_VELOCITY_UNIT_FPS,
} AwVelocityUnit;

typedef struct _AwChronoString
{
  double bb_mass_g;
  AwChronoHop hop;
  AwVelocityUnit unit;
  GArray *velocities;               /* of double, in `unit`, in shot order (≥ 1) */
  double temperature_c;             /* NAN: not recorded */
  char *date;                       /* ISO 8601 date or date-time, NULL when not recorded */
  char *note;
  JsonObject *extra;
} AwChronoString;

AwChronoString *aw_chrono_string_new (void);          /* 0.20 g, m/s, no shots */
AwChronoString *aw_chrono_string_copy (const AwChronoString *c);
void aw_chrono_string_free (AwChronoString *c);
bool aw_chrono_string_equal (const AwChronoString *a, const AwChronoString *b);
/* Appends one velocity given in the string's unit. */
void aw_chrono_string_add (AwChronoString *c, double velocity);
double aw_chrono_string_velocity_mps (const AwChronoString *c, guint i);

/* Statistics of a chrono string, all velocities in m/s. sd_mps is the sample standard deviation
 * (n − 1); NAN when n < 2. Energies use bb_mass_g. */
typedef struct _AwChronoStats
{
  guint n;
  double mean_mps;
  double min_mps;
  double max_mps;
  double sd_mps;
  double es_mps;                    /* extreme spread, max − min */
  double energy_mean_j;             /* ½·m·mean² */
  double energy_max_j;              /* ½·m·max² */
} AwChronoStats;

/* False (stats zeroed, NANs) when the string has no shots or a non-finite value. */
bool aw_chrono_string_stats (const AwChronoString *c, AwChronoStats *stats);

typedef enum
{
  AW_OBSERVATION_HEIGHT = 0,        /* distance_m + height_cm against the sight line */
  AW_OBSERVATION_IMPACT,            /* distance_m is where the BB reached the ground */
} AwObservationKind;

typedef struct _AwObservation
{
  AwObservationKind kind;
  double distance_m;
  double height_cm;                 /* AW_OBSERVATION_HEIGHT: above (+) / below (−); else NAN */
  char *note;
  JsonObject *extra;
} AwObservation;

AwObservation *aw_observation_new (void);
AwObservation *aw_observation_copy (const AwObservation *o);
void aw_observation_free (AwObservation *o);
bool aw_observation_equal (const AwObservation *a, const AwObservation *b);

/* ---- setup ---- */

typedef struct _AwSetup
{
  char *name;                       /* unique within the project, non-empty */
  char *colour;                     /* "#rrggbb", kept as written */
  char *notes;
  bool visible;                     /* shown in the plot, default true */
  AwReplica replica;
  AwBB bb;
  AwHop hop;
  AwSighting sighting;
  double muzzle_height_m;           /* default 1.5 */
  double band_half_height_m;        /* default AW_BAND_HALF_DEFAULT_M */
  AwModelChoice model;
  AwProjectConditions *conditions;  /* own conditions; NULL: the project's defaults */
  GPtrArray *chrono;                /* of AwChronoString* */
  GPtrArray *observations;          /* of AwObservation* */
  JsonObject *extra;
} AwSetup;

/* A setup with every default above: electric piston, constant energy, reference 0.20 g at
 * 100 m/s, BB 0.20 g / 5.95 mm, auto hop, colour "#3465a4". name is copied. */
AwSetup *aw_setup_new (const char *name);
AwSetup *aw_setup_copy (const AwSetup *s);
void aw_setup_free (AwSetup *s);
bool aw_setup_equal (const AwSetup *a, const AwSetup *b);

/* ---- site rules ---- */

typedef struct _AwSiteClassRule
{
  char *name;                       /* e.g. "outdoor rifle" */
  double energy_limit_j;
  double chrono_bb_mass_g;          /* NAN: chronographed with the BB the player uses */
  char *hop_rule;                   /* free text, e.g. "hop off", "any hop setting" */
  double min_engagement_m;          /* 0: none */
  JsonObject *extra;
} AwSiteClassRule;

typedef struct _AwSiteRules
{
  char *name;
  char *notes;
  GPtrArray *classes;               /* of AwSiteClassRule* */
  JsonObject *extra;
} AwSiteRules;

AwSiteClassRule *aw_site_class_rule_new (const char *name);
AwSiteClassRule *aw_site_class_rule_copy (const AwSiteClassRule *r);
void aw_site_class_rule_free (AwSiteClassRule *r);
bool aw_site_class_rule_equal (const AwSiteClassRule *a, const AwSiteClassRule *b);

AwSiteRules *aw_site_rules_new (const char *name);
AwSiteRules *aw_site_rules_copy (const AwSiteRules *r);
void aw_site_rules_free (AwSiteRules *r);
bool aw_site_rules_equal (const AwSiteRules *a, const AwSiteRules *b);

/* ---- project ---- */

/* An entry of "setups" or "site_rules" that failed validation in a lenient load. Its JSON is
 * kept unchanged and written back at the same position on save, so nothing is lost. */
typedef struct _AwRejectedEntry
{
  char *list;                       /* "setups" or "site_rules" */
  guint index;                      /* position in that list in the file it was read from;
                                     * a save puts it back there (or earlier when entries
                                     * before it were removed) */
  char *name;                       /* its "name" when it was a string, else NULL */
  JsonNode *raw;
} AwRejectedEntry;

typedef struct _AwProject
{
  char *name;
  char *notes;
  AwProjectConditions conditions;   /* default conditions */
  GPtrArray *site_rules;            /* of AwSiteRules* */
  GPtrArray *setups;                /* of AwSetup* (valid ones only) */
  GPtrArray *rejected;              /* of AwRejectedEntry* (lenient loads; usually empty) */
  JsonObject *extra;
} AwProject;

AwProject *aw_project_new (void);
AwProject *aw_project_copy (const AwProject *p);
void aw_project_free (AwProject *p);
/* Deep equality of every field including unknown members and rejected entries (their list,
 * name and JSON in order; not their index). NAN equals NAN; numbers compare exactly. */
bool aw_project_equal (const AwProject *a, const AwProject *b);

/* Setup by name (NULL when none). */
AwSetup *aw_project_find_setup (const AwProject *p, const char *name);
AwSiteRules *aw_project_find_site_rules (const AwProject *p, const char *name);

/* Names for enums as used in the file ("spring", "electric_piston", …); NULL for bad values.
 * from_name returns false for unknown names. */
const char *aw_power_source_to_name (AwPowerSource s);
bool aw_power_source_from_name (const char *name, AwPowerSource *out);
const char *aw_energy_model_to_name (AwPowerModel m);
bool aw_energy_model_from_name (const char *name, AwPowerModel *out);
const char *aw_hop_mode_to_name (AwHopMode m);
bool aw_hop_mode_from_name (const char *name, AwHopMode *out);
const char *aw_angle_unit_to_name (AwAngleUnit u);
bool aw_angle_unit_from_name (const char *name, AwAngleUnit *out);
const char *aw_drag_model_to_name (AwDragModel m);
bool aw_drag_model_from_name (const char *name, AwDragModel *out);
const char *aw_lift_model_to_name (AwLiftModel m);
bool aw_lift_model_from_name (const char *name, AwLiftModel *out);

G_DEFINE_AUTOPTR_CLEANUP_FUNC (AwProject, aw_project_free)
G_DEFINE_AUTOPTR_CLEANUP_FUNC (AwSetup, aw_setup_free)
G_DEFINE_AUTOPTR_CLEANUP_FUNC (AwSiteRules, aw_site_rules_free)
G_DEFINE_AUTOPTR_CLEANUP_FUNC (AwChronoString, aw_chrono_string_free)
G_DEFINE_AUTOPTR_CLEANUP_FUNC (AwProjectConditions, aw_project_conditions_free)

/* ---- bridges to the analysis (aw-project-bridge.c) ---- */

typedef enum
{
  AW_BRIDGE_OK = 0,
  AW_BRIDGE_BAD_CONDITIONS = -1,    /* aw_air_from_conditions refused them */
  AW_BRIDGE_BAD_POWER = -2,         /* no velocity for the setup's BB from the replica */
  AW_BRIDGE_BAD_INPUT = -3,         /* NULL or non-finite fields */
} AwBridgeStatus;

/* The conditions that apply to a setup: its own, else the project's (project may be NULL:
 * then standard defaults). */
const AwProjectConditions *aw_setup_effective_conditions (const AwSetup *setup,
                                                          const AwProject *project);

/* Conditions → air state for the flight engine. */
AwAirStatus aw_project_conditions_to_air (const AwProjectConditions *c, AwAir *air);

/* Wind vector of the conditions in the flight frame (x downrange, y left, z up). */
void aw_project_conditions_wind (const AwProjectConditions *c, double wind[3]);

/* Power curve of the replica. For AW_POWER_MEASURED the points array lives in the setup
 * (setup->replica.curve_points) and stays valid until the next call on the same setup or until
 * the setup is freed. It rewrites that array: do not call it (or aw_setup_to_analysis_input)
 * on the same setup from two threads at once; build the inputs first, then hand them out. */
void aw_setup_power_curve (AwSetup *setup, AwPowerCurve *curve);

/* Setup + conditions → analysis input: BB mass/diameter, muzzle velocity for the setup's BB from
 * the replica's power curve, muzzle height, hop tilt, wind, air, aero model and multipliers,
 * hop mode and value (rpm → rad/s), band, sight height, zero and angle unit. shot.spin_rad_s is
 * the spin for AW_HOP_MODE_SPIN, else 0; shot.elevation_rad is 0. The hop limit
 * (hop.max_lift_ratio) becomes hop_limit_s through aw_hop_limit_s_for_lift_ratio on that very
 * shot (the setup's own BB, velocity, air and lift model); NAN when unset or when the lift model
 * gives no lift. */
AwBridgeStatus aw_setup_to_analysis_input (AwSetup *setup, const AwProject *project,
                                           AwAnalysisInput *in);

/* Site class rule → AwSiteClass (SI units). */
void aw_site_class_rule_to_site_class (const AwSiteClassRule *rule, AwSiteClass *site);

const char *aw_bridge_status_name (AwBridgeStatus status);

G_END_DECLS
