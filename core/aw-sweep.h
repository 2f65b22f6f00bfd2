/* aw-sweep.h: sweeps (one varied input) and maps (two varied inputs) over setups
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * GLib only, no GTK, no user-visible strings (GError messages are technical: a field and a rule).
 *
 * A sweep varies one input of every setup over evenly spaced values and records metrics at each
 * value; a map varies two. Each point is a pure function of (setup, description, values): it is
 * computed by aw_sweep_eval_point() and nothing else, into its own slot, so a sweep gives exactly
 * the numbers of running each point alone, whatever the number of threads.
 *
 * Values of varied inputs are in the unit their name carries (g, J, rpm, m/s, m, °C; the lift
 * ratio has none). Results are SI except where the metric's name says otherwise (drift in cm,
 * compliance in % of the limit).
 */
#pragma once

#include <gio/gio.h>
#include <glib.h>
#include <stdbool.h>

#include "aw-air.h"
#include "aw-analysis.h"
#include "aw-project.h"

G_BEGIN_DECLS

/* ---- what varies ---- */

typedef enum
{
  AW_SWEEP_VAR_NONE = 0,         /* the second axis of a one-input sweep */
  AW_SWEEP_VAR_LIFT_RATIO,       /* hop fixed to this lift ratio at the muzzle */
  AW_SWEEP_VAR_SPIN_RPM,         /* hop fixed to this model spin at the muzzle, rpm */
  AW_SWEEP_VAR_MASS_G,           /* BB mass, g; muzzle velocity from the setup's power curve */
  AW_SWEEP_VAR_ENERGY_J,         /* muzzle energy with the BB used, J */
  AW_SWEEP_VAR_CROSSWIND_MPS,    /* full crosswind blowing toward +y (from the right), m/s */
  AW_SWEEP_VAR_HEIGHT_M,         /* muzzle height above the ground, m */
  AW_SWEEP_VAR_TEMPERATURE_C,    /* air temperature, °C (density and viscosity follow) */
  AW_SWEEP_N_VARS
} AwSweepVar;

/* ---- what is measured at each point ---- */

typedef enum
{
  AW_SWEEP_METRIC_BAND_RANGE = 0,   /* m, where the BB leaves the band for good */
  AW_SWEEP_METRIC_GROUND_DISTANCE,  /* m */
  AW_SWEEP_METRIC_APEX,             /* m above the ground */
  AW_SWEEP_METRIC_TIME_AT,          /* s, time of flight to at_distance_m */
  AW_SWEEP_METRIC_ENERGY_AT,        /* J at at_distance_m */
  AW_SWEEP_METRIC_SPEED_AT,         /* m/s at at_distance_m */
  AW_SWEEP_METRIC_DRIFT_AT,         /* cm at at_distance_m, sideways (+ toward +y, left) with the
                                     * point's own wind and hop tilt */
  AW_SWEEP_METRIC_MUZZLE_ENERGY,    /* J with the BB used */
  AW_SWEEP_METRIC_COMPLIANCE,       /* energy as the site measures it, % of the site's limit
                                     * (NAN without a limit); the verdict is in the point */
  AW_SWEEP_N_METRICS
} AwSweepMetric;

/* How the hop is chosen at points where no axis varies it (an axis varying the lift ratio or the
 * model spin always sets the hop). */
typedef enum
{
  AW_SWEEP_HOP_DEFAULT = 0,  /* auto hop at every point when the BB mass varies, else the setup's */
  AW_SWEEP_HOP_SETUP,        /* the setup's hop (auto, lift ratio or spin) at every point */
  AW_SWEEP_HOP_AUTO,         /* auto hop at every point */
} AwSweepHop;

#define AW_SWEEP_MAX_AXIS_POINTS  10000
#define AW_SWEEP_MAX_POINTS       1000000   /* setups × points of axis 1 × points of axis 2 */
#define AW_SWEEP_AT_DISTANCE_DEFAULT_M 30.0

typedef struct
{
  AwSweepVar var;
  double lo, hi;             /* first and last value (lo > hi runs downward) */
  guint n;                   /* number of values, ≥ 1 (1: lo alone) */
} AwSweepAxis;

typedef struct
{
  AwSweepAxis axis[2];       /* axis[1].var == AW_SWEEP_VAR_NONE for a one-input sweep */
  AwSweepHop hop;
  double at_distance_m;      /* for the *_AT metrics, > 0 */
  AwSiteClass site;          /* for AW_SWEEP_METRIC_COMPLIANCE; energy_limit_j ≤ 0: no limit */
} AwSweepDesc;

/* One axis: lift ratio 0 … 3 in 31 values; no second axis; default hop; 30 m; no site limit. */
void aw_sweep_desc_init (AwSweepDesc *desc);

/* Checks variables, ranges (see aw_sweep_var_range), counts, the distance and the site. Errors:
 * AW_CORE_ERROR_INVALID with a message naming the field ("axis[1].hi: …"). */
gboolean aw_sweep_desc_validate (const AwSweepDesc *desc, GError **error);

/* Number of values on axis k (0 or 1): axis n, or 1 for an unused second axis. */
guint aw_sweep_desc_axis_count (const AwSweepDesc *desc, guint k);

/* Value number i of an axis: lo + (hi − lo)·i/(n − 1), exactly hi for the last one. */
double aw_sweep_axis_value (const AwSweepAxis *axis, guint i);

/* ---- one setup as the sweep sees it ---- */

typedef struct
{
  const char *name;          /* borrowed; copied by aw_sweep_run */
  AwAnalysisInput input;     /* the setup's analysis input at its own BB and conditions; its
                              * hop_limit_s (a spin parameter, the same for every BB) applies at
                              * every point */
  AwPowerCurve power;        /* energy versus BB mass; ref_mass_kg ≤ 0 (and not measured): constant
                              * energy through the input's BB mass and velocity. points borrowed */
  AwConditions conditions;   /* the conditions input.shot.air came from (temperature sweeps) */
} AwSweepSetup;

/* aw_analysis_input_init, constant energy through the shot, standard sea-level conditions. */
void aw_sweep_setup_init (AwSweepSetup *setup, const char *name);

/* A project setup as the sweep sees it (aw_setup_to_analysis_input, aw_setup_power_curve and the
 * setup's effective conditions). name and the power points are borrowed from setup: they stay
 * valid until setup changes or is freed (aw_sweep_run copies them). Errors: AW_CORE_ERROR_INVALID
 * naming the setup and the bridge's status. Implemented in aw-sweep-project.c. */
gboolean aw_sweep_setup_from_project (AwSweepSetup *out, AwSetup *setup, const AwProject *project,
                                      GError **error);

/* ---- one point ---- */

typedef struct
{
  AwAnalysisStatus status;   /* of the analysis; AW_ANALYSIS_BAD_INPUT also when the varied
                              * values give an impossible shot (e.g. over 300 m/s) */
  AwCompliance compliance;
  double values[AW_SWEEP_N_METRICS];  /* NAN where undefined (flight ends before the distance,
                                       * hop unreachable, no limit, …) */
  double mass_kg;            /* the BB, its muzzle velocity, the hop and bore used at this point */
  double velocity_mps;
  double lift_ratio;
  double spin_rad_s;
  double elevation_rad;
  gboolean hop_limited;      /* the setup's hop limit (input.hop_limit_s) shapes this point: auto
                              * hop held at it (e.g. a heavy BB in a mass sweep, which gets the
                              * limit at its own speed), or a given hop above it */
} AwSweepPoint;

/* Evaluates one point: the setup with the values v1 (axis 0) and v2 (axis 1, ignored for a
 * one-input sweep) applied. desc must be valid (aw_sweep_desc_validate). Thread-safe; the same
 * inputs give the same bits. Returns out->status. */
AwAnalysisStatus aw_sweep_eval_point (const AwSweepSetup *setup, const AwSweepDesc *desc,
                                      double v1, double v2, AwSweepPoint *out);

/* ---- a whole sweep ---- */

typedef struct
{
  AwSweepDesc desc;
  guint n_setups;
  char **setup_names;        /* n_setups entries, NULL-terminated */
  guint n1, n2;              /* values on axis 0 and axis 1 (n2 = 1 for one input) */
  double *values1;           /* n1 values of axis 0 */
  double *values2;           /* n2 values of axis 1 (NAN for one input) */
  AwSweepPoint *points;      /* n_setups × n2 × n1, see aw_sweep_result_point */
} AwSweepResult;

static inline AwSweepPoint *
aw_sweep_result_point (const AwSweepResult *r, guint setup, guint i1, guint i2)
{
  return &r->points[((gsize) setup * r->n2 + i2) * r->n1 + i1];
}

static inline double
aw_sweep_result_value (const AwSweepResult *r, guint setup, guint i1, guint i2,
                       AwSweepMetric metric)
{
  return aw_sweep_result_point (r, setup, i1, i2)->values[metric];
}

void aw_sweep_result_free (AwSweepResult *result);

/* Smallest and largest finite value of a metric over the result (setup < 0: all setups).
 * Returns false when there is none. */
gboolean aw_sweep_result_range (const AwSweepResult *result, int setup, AwSweepMetric metric,
                                double *lo, double *hi);

/* Progress, 0 … 1. Called from the thread that called aw_sweep_run, at most about every
 * AW_SWEEP_PROGRESS_INTERVAL_US, with increasing fractions; 1 only once everything is done. */
typedef void (*AwSweepProgressFunc) (double fraction, gpointer user_data);

#define AW_SWEEP_PROGRESS_INTERVAL_US 50000

/* Evaluates every point of every setup on n_threads threads (0: g_get_num_processors ()), the
 * calling thread being one of them. Polls cancellable before each point: when it is cancelled,
 * returns NULL with G_IO_ERROR_CANCELLED once the points in progress end. A bad description
 * gives AW_CORE_ERROR_INVALID. Points that cannot be computed are not errors: see their status.
 * setups are copied (names and power points) before the work starts. */
AwSweepResult *aw_sweep_run (const AwSweepSetup *setups, guint n_setups, const AwSweepDesc *desc,
                             guint n_threads, AwSweepProgressFunc progress, gpointer user_data,
                             GCancellable *cancellable, GError **error);

/* ---- CSV (RFC 4180) ---- */

/* A header row, then one row per point: setup, the axis values, then the metrics asked for
 * (NULL or 0: every metric), then the status. Columns are named with their unit
 * ("mass_g", "band_range_m", "time_at_30m_s"). Numbers are written with g_ascii_formatd /
 * g_ascii_dtostr in the shortest form that reads back to the same double, never in the locale's
 * form; an undefined value is an empty field.
 * Fields with a comma, a quote or a line break are quoted; lines end with CRLF. */
char *aw_sweep_result_to_csv (const AwSweepResult *result, const AwSweepMetric *metrics,
                              guint n_metrics);

/* Writes the CSV atomically (the previous file is replaced only by a complete new one). */
gboolean aw_sweep_result_save_csv (const AwSweepResult *result, const AwSweepMetric *metrics,
                                   guint n_metrics, const char *path, GError **error);

/* A number for files: the shortest of %.15g, %.16g and %.17g that reads back (g_ascii_strtod) to
 * the same double, e.g. "0.2" rather than "0.20000000000000001"; never in the locale's form.
 * buf holds at least G_ASCII_DTOSTR_BUF_SIZE bytes. Returns buf. */
char *aw_sweep_format_number (char *buf, double v);

/* ---- names (command line, files; not for people: the UI translates) ---- */

/* "lift-ratio", "spin-rpm", "mass-g", "energy-j", "crosswind-mps", "height-m", "temperature-c"
 * (and "none"). */
const char *aw_sweep_var_to_name (AwSweepVar var);
gboolean aw_sweep_var_from_name (const char *name, AwSweepVar *out);
/* Unit symbol ("" for the lift ratio): "rpm", "g", "J", "m/s", "m", "°C". */
const char *aw_sweep_var_unit (AwSweepVar var);
/* CSV column: "lift_ratio", "spin_rpm", "mass_g", "energy_j", "crosswind_mps", "height_m",
 * "temperature_c". */
const char *aw_sweep_var_column (AwSweepVar var);
/* Range accepted for a varied input, in its unit. */
void aw_sweep_var_range (AwSweepVar var, double *lo, double *hi);

/* "band-range", "ground-distance", "apex", "time-at", "energy-at", "speed-at", "drift-at",
 * "muzzle-energy", "compliance". */
const char *aw_sweep_metric_to_name (AwSweepMetric metric);
/* Also accepts "time-at:30" style names for the *-at metrics and stores the distance (metres)
 * in *at_distance_m (which may be NULL; untouched when the name carries none). */
gboolean aw_sweep_metric_from_name (const char *name, AwSweepMetric *out, double *at_distance_m);
/* "m", "m", "m", "s", "J", "m/s", "cm", "J", "%". */
const char *aw_sweep_metric_unit (AwSweepMetric metric);
/* True for the metrics measured at at_distance_m. */
gboolean aw_sweep_metric_is_at_distance (AwSweepMetric metric);
/* CSV column, e.g. "band_range_m", "energy_at_30m_j". Free with g_free. */
char *aw_sweep_metric_column (AwSweepMetric metric, double at_distance_m);

/* "ok", "no-band", "hop-unreachable", "no-zero", "bad-input", "flight-failed". */
const char *aw_sweep_status_to_name (AwAnalysisStatus status);

G_DEFINE_AUTOPTR_CLEANUP_FUNC (AwSweepResult, aw_sweep_result_free)

G_END_DECLS
