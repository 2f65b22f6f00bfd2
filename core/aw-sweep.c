/* aw-sweep.c: sweeps and maps over setups, evaluated on several threads
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Work sharing: every point has a slot in the result; threads take the next point number from an
 * atomic counter and write only that slot. A point is computed by aw_sweep_eval_point() from its
 * setup, the description and its two values alone (no warm start from a neighbour), so the result
 * does not depend on the number of threads or on which thread computed what.
 */
#include "aw-config.h"

#include <math.h>
#include <string.h>

#include "aw-core-error.h"
#include "aw-sweep.h"
#include "aw-units.h"

/* ---- names ---- */

typedef struct
{
  const char *name;
  const char *unit;
  const char *column;
  double lo, hi;
} VarInfo;

static const VarInfo var_info[AW_SWEEP_N_VARS] = {
  [AW_SWEEP_VAR_NONE] = { "none", "", "", 0.0, 0.0 },
  [AW_SWEEP_VAR_LIFT_RATIO] = { "lift-ratio", "", "lift_ratio", 0.0, 20.0 },
  [AW_SWEEP_VAR_SPIN_RPM] = { "spin-rpm", "rpm", "spin_rpm", 0.0, 950000.0 },
  [AW_SWEEP_VAR_MASS_G] = { "mass-g", "g", "mass_g", 0.05, 2.0 },
  [AW_SWEEP_VAR_ENERGY_J] = { "energy-j", "J", "energy_j", 0.001, 100.0 },
  [AW_SWEEP_VAR_CROSSWIND_MPS] = { "crosswind-mps", "m/s", "crosswind_mps", -50.0, 50.0 },
  [AW_SWEEP_VAR_HEIGHT_M] = { "height-m", "m", "height_m", 0.0, 100.0 },
  [AW_SWEEP_VAR_TEMPERATURE_C] = { "temperature-c", "°C", "temperature_c", -40.0, 60.0 },
};

typedef struct
{
  const char *name;
  const char *unit;
  const char *column;     /* without the distance and the unit */
  const char *column_unit;
} MetricInfo;

static const MetricInfo metric_info[AW_SWEEP_N_METRICS] = {
  [AW_SWEEP_METRIC_BAND_RANGE] = { "band-range", "m", "band_range", "m" },
  [AW_SWEEP_METRIC_GROUND_DISTANCE] = { "ground-distance", "m", "ground_distance", "m" },
  [AW_SWEEP_METRIC_APEX] = { "apex", "m", "apex", "m" },
  [AW_SWEEP_METRIC_TIME_AT] = { "time-at", "s", "time_at", "s" },
  [AW_SWEEP_METRIC_ENERGY_AT] = { "energy-at", "J", "energy_at", "j" },
  [AW_SWEEP_METRIC_SPEED_AT] = { "speed-at", "m/s", "speed_at", "mps" },
  [AW_SWEEP_METRIC_DRIFT_AT] = { "drift-at", "cm", "drift_at", "cm" },
  [AW_SWEEP_METRIC_MUZZLE_ENERGY] = { "muzzle-energy", "J", "muzzle_energy", "j" },
  [AW_SWEEP_METRIC_COMPLIANCE] = { "compliance", "%", "compliance", "pct" },
};

const char *
aw_sweep_var_to_name (AwSweepVar var)
{
  if ((unsigned) var >= AW_SWEEP_N_VARS)
    return NULL;
  return var_info[var].name;
}

gboolean
aw_sweep_var_from_name (const char *name, AwSweepVar *out)
{
  g_return_val_if_fail (out != NULL, FALSE);
  if (name == NULL)
    return FALSE;
  for (int v = 0; v < AW_SWEEP_N_VARS; v++)
    if (strcmp (var_info[v].name, name) == 0)
      {
        *out = (AwSweepVar) v;
        return TRUE;
      }
  return FALSE;
}

const char *
aw_sweep_var_unit (AwSweepVar var)
{
  if ((unsigned) var >= AW_SWEEP_N_VARS)
    return NULL;
  return var_info[var].unit;
}

const char *
aw_sweep_var_column (AwSweepVar var)
{
  if ((unsigned) var >= AW_SWEEP_N_VARS)
    return NULL;
  return var_info[var].column;
}

void
aw_sweep_var_range (AwSweepVar var, double *lo, double *hi)
{
  if ((unsigned) var >= AW_SWEEP_N_VARS)
    var = AW_SWEEP_VAR_NONE;
  if (lo)
    *lo = var_info[var].lo;
  if (hi)
    *hi = var_info[var].hi;
}

const char *
aw_sweep_metric_to_name (AwSweepMetric metric)
{
  if ((unsigned) metric >= AW_SWEEP_N_METRICS)
    return NULL;
  return metric_info[metric].name;
}

gboolean
aw_sweep_metric_is_at_distance (AwSweepMetric metric)
{
  return metric == AW_SWEEP_METRIC_TIME_AT || metric == AW_SWEEP_METRIC_ENERGY_AT
         || metric == AW_SWEEP_METRIC_SPEED_AT || metric == AW_SWEEP_METRIC_DRIFT_AT;
}

gboolean
aw_sweep_metric_from_name (const char *name, AwSweepMetric *out, double *at_distance_m)
{
  g_return_val_if_fail (out != NULL, FALSE);
  if (name == NULL)
    return FALSE;

  const char *colon = strchr (name, ':');
  gsize len = colon ? (gsize) (colon - name) : strlen (name);

  for (int m = 0; m < AW_SWEEP_N_METRICS; m++)
    {
      if (strlen (metric_info[m].name) != len || strncmp (metric_info[m].name, name, len) != 0)
        continue;
      if (colon)
        {
          char *end = NULL;
          double d;
          if (!aw_sweep_metric_is_at_distance ((AwSweepMetric) m))
            return FALSE;
          d = g_ascii_strtod (colon + 1, &end);
          if (end == colon + 1 || *end != '\0' || !isfinite (d) || !(d > 0.0) || d > 1000.0)
            return FALSE;
          if (at_distance_m)
            *at_distance_m = d;
        }
      *out = (AwSweepMetric) m;
      return TRUE;
    }
  return FALSE;
}

const char *
aw_sweep_metric_unit (AwSweepMetric metric)
{
  if ((unsigned) metric >= AW_SWEEP_N_METRICS)
    return NULL;
  return metric_info[metric].unit;
}

char *
aw_sweep_metric_column (AwSweepMetric metric, double at_distance_m)
{
  char d[G_ASCII_DTOSTR_BUF_SIZE];

  if ((unsigned) metric >= AW_SWEEP_N_METRICS)
    return NULL;
  if (!aw_sweep_metric_is_at_distance (metric))
    return g_strdup_printf ("%s_%s", metric_info[metric].column, metric_info[metric].column_unit);
  g_ascii_formatd (d, sizeof d, "%.10g", at_distance_m);
  return g_strdup_printf ("%s_%sm_%s", metric_info[metric].column, d,
                          metric_info[metric].column_unit);
}

const char *
aw_sweep_status_to_name (AwAnalysisStatus status)
{
  switch (status)
    {
    case AW_ANALYSIS_OK:
      return "ok";
    case AW_ANALYSIS_NO_BAND:
      return "no-band";
    case AW_ANALYSIS_HOP_UNREACHABLE:
      return "hop-unreachable";
    case AW_ANALYSIS_NO_ZERO:
      return "no-zero";
    case AW_ANALYSIS_BAD_INPUT:
      return "bad-input";
    case AW_ANALYSIS_FLIGHT_FAILED:
      return "flight-failed";
    default:
      return "unknown";
    }
}

/* ---- description ---- */

void
aw_sweep_desc_init (AwSweepDesc *desc)
{
  g_return_if_fail (desc != NULL);
  memset (desc, 0, sizeof *desc);
  desc->axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_LIFT_RATIO, 0.0, 3.0, 31 };
  desc->axis[1] = (AwSweepAxis) { AW_SWEEP_VAR_NONE, 0.0, 0.0, 1 };
  desc->hop = AW_SWEEP_HOP_DEFAULT;
  desc->at_distance_m = AW_SWEEP_AT_DISTANCE_DEFAULT_M;
  desc->site.energy_limit_j = NAN;
  desc->site.chrono_mass_kg = NAN;
  desc->site.min_engagement_m = NAN;
}

static gboolean
is_hop_var (AwSweepVar v)
{
  return v == AW_SWEEP_VAR_LIFT_RATIO || v == AW_SWEEP_VAR_SPIN_RPM;
}

static gboolean
validate_axis (const AwSweepAxis *a, guint k, GError **error)
{
  double lo, hi;

  if ((unsigned) a->var >= AW_SWEEP_N_VARS || (k == 0 && a->var == AW_SWEEP_VAR_NONE))
    {
      g_set_error (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID,
                   "axis[%u].var: must be a varied input (found %d)", k, (int) a->var);
      return FALSE;
    }
  if (a->var == AW_SWEEP_VAR_NONE)
    return TRUE;
  if (a->n < 1 || a->n > AW_SWEEP_MAX_AXIS_POINTS)
    {
      g_set_error (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID,
                   "axis[%u].n: must be between 1 and %d (found %u)", k,
                   AW_SWEEP_MAX_AXIS_POINTS, a->n);
      return FALSE;
    }
  aw_sweep_var_range (a->var, &lo, &hi);
  for (int e = 0; e < 2; e++)
    {
      double v = e == 0 ? a->lo : a->hi;
      if (a->n == 1 && e == 1)
        break;
      if (!isfinite (v) || v < lo || v > hi)
        {
          char b[3][G_ASCII_DTOSTR_BUF_SIZE];
          g_set_error (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID,
                       "axis[%u].%s: %s must be between %s and %s (found %s)", k,
                       e == 0 ? "lo" : "hi", var_info[a->var].name,
                       g_ascii_dtostr (b[0], sizeof b[0], lo),
                       g_ascii_dtostr (b[1], sizeof b[1], hi),
                       g_ascii_dtostr (b[2], sizeof b[2], v));
          return FALSE;
        }
    }
  return TRUE;
}

gboolean
aw_sweep_desc_validate (const AwSweepDesc *desc, GError **error)
{
  g_return_val_if_fail (desc != NULL, FALSE);

  for (guint k = 0; k < 2; k++)
    if (!validate_axis (&desc->axis[k], k, error))
      return FALSE;
  if (desc->axis[1].var == desc->axis[0].var)
    {
      g_set_error (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID,
                   "axis[1].var: the same input as axis[0] (%s)", var_info[desc->axis[0].var].name);
      return FALSE;
    }
  if (is_hop_var (desc->axis[0].var) && is_hop_var (desc->axis[1].var))
    {
      g_set_error (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID,
                   "axis[1].var: lift-ratio and spin-rpm both set the hop; vary only one");
      return FALSE;
    }
  if ((guint64) desc->axis[0].n * aw_sweep_desc_axis_count (desc, 1) > AW_SWEEP_MAX_POINTS)
    {
      g_set_error (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID,
                   "axis: %u × %u points, more than %d", desc->axis[0].n,
                   aw_sweep_desc_axis_count (desc, 1), AW_SWEEP_MAX_POINTS);
      return FALSE;
    }
  if ((unsigned) desc->hop > AW_SWEEP_HOP_AUTO)
    {
      g_set_error (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID,
                   "hop: unknown choice (found %d)", (int) desc->hop);
      return FALSE;
    }
  if (!isfinite (desc->at_distance_m) || !(desc->at_distance_m > 0.0)
      || desc->at_distance_m > 1000.0)
    {
      char b[G_ASCII_DTOSTR_BUF_SIZE];
      g_set_error (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID,
                   "at_distance_m: must be greater than 0 and at most 1000 (found %s)",
                   g_ascii_dtostr (b, sizeof b, desc->at_distance_m));
      return FALSE;
    }
  if (isinf (desc->site.energy_limit_j))
    {
      g_set_error (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID,
                   "site.energy_limit_j: must be finite");
      return FALSE;
    }
  if (desc->site.chrono_mass_kg > 0.0
      && !(desc->site.chrono_mass_kg >= 1e-5 && desc->site.chrono_mass_kg <= 5e-3))
    {
      char b[G_ASCII_DTOSTR_BUF_SIZE];
      g_set_error (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID,
                   "site.chrono_mass_kg: must be between 1e-05 and 0.005 (found %s)",
                   g_ascii_dtostr (b, sizeof b, desc->site.chrono_mass_kg));
      return FALSE;
    }
  return TRUE;
}

guint
aw_sweep_desc_axis_count (const AwSweepDesc *desc, guint k)
{
  g_return_val_if_fail (desc != NULL && k < 2, 0);
  if (desc->axis[k].var == AW_SWEEP_VAR_NONE)
    return 1;
  return desc->axis[k].n;
}

double
aw_sweep_axis_value (const AwSweepAxis *axis, guint i)
{
  g_return_val_if_fail (axis != NULL, NAN);
  if (axis->var == AW_SWEEP_VAR_NONE)
    return NAN;
  if (axis->n <= 1 || i == 0)
    return axis->lo;
  if (i >= axis->n - 1)
    return axis->hi;
  return axis->lo + (axis->hi - axis->lo) * ((double) i / (double) (axis->n - 1));
}

/* ---- setups ---- */

void
aw_sweep_setup_init (AwSweepSetup *setup, const char *name)
{
  g_return_if_fail (setup != NULL);
  memset (setup, 0, sizeof *setup);
  setup->name = name;
  aw_analysis_input_init (&setup->input);
  setup->power.model = AW_POWER_CONSTANT_ENERGY;
  setup->power.ref_mass_kg = 0.0;
  setup->power.ref_velocity_mps = 0.0;
  aw_conditions_init_standard (&setup->conditions);
}

/* The power curve a setup stands for: its own, or constant energy through its shot. */
static void
effective_curve (const AwSweepSetup *s, AwPowerCurve *c)
{
  *c = s->power;
  if (c->model == AW_POWER_MEASURED && c->points != NULL && c->n_points > 0)
    return;
  if (c->model != AW_POWER_MEASURED && isfinite (c->ref_mass_kg) && c->ref_mass_kg > 0.0
      && isfinite (c->ref_velocity_mps) && c->ref_velocity_mps > 0.0)
    return;
  memset (c, 0, sizeof *c);
  c->model = AW_POWER_CONSTANT_ENERGY;
  c->ref_mass_kg = s->input.shot.mass_kg;
  c->ref_velocity_mps = s->input.shot.velocity_mps;
}

/* ---- one point ---- */

typedef struct
{
  double x;
  AwSample sample;
  gboolean found;
} AtCapture;

static bool
capture_at (const AwSample *s, void *user_data)
{
  AtCapture *cap = user_data;
  if (s->x >= cap->x)
    {
      cap->sample = *s;
      cap->found = TRUE;
      return false;   /* nothing further is needed */
    }
  return true;
}

/* Energy as the site measures it: the point's energy, carried to the site's chrono BB along the
 * shape of the setup's energy-versus-mass curve (scaled through the point). */
static AwCompliance
point_compliance (const AwSiteClass *site, const AwPowerCurve *curve, double mass_kg,
                  double energy_j, double *percent)
{
  double limit = site->energy_limit_j;
  double chrono = energy_j;

  *percent = NAN;
  if (!(limit > 0.0) || !isfinite (limit) || !isfinite (energy_j))
    return AW_COMPLIANCE_UNKNOWN;
  if (site->chrono_mass_kg > 0.0 && site->chrono_mass_kg != mass_kg)
    {
      double e_used = aw_power_energy_for_mass (curve, mass_kg);
      double e_chrono = aw_power_energy_for_mass (curve, site->chrono_mass_kg);
      if (!(e_used > 0.0) || !isfinite (e_used) || !isfinite (e_chrono))
        return AW_COMPLIANCE_UNKNOWN;
      chrono = energy_j * (e_chrono / e_used);
    }
  *percent = 100.0 * chrono / limit;
  /* Site limits are absolute, with no tolerance (common practice, no source): at the limit is
   * still under it, anything above is over. */
  return chrono > limit ? AW_COMPLIANCE_OVER : AW_COMPLIANCE_UNDER;
}

AwAnalysisStatus
aw_sweep_eval_point (const AwSweepSetup *setup, const AwSweepDesc *desc, double v1, double v2,
                     AwSweepPoint *out)
{
  AwAnalysisInput in;
  AwPowerCurve curve;
  AwBandResult band;
  gboolean set[AW_SWEEP_N_VARS] = { FALSE };
  double val[AW_SWEEP_N_VARS] = { 0.0 };

  g_return_val_if_fail (out != NULL, AW_ANALYSIS_BAD_INPUT);
  memset (out, 0, sizeof *out);
  out->status = AW_ANALYSIS_BAD_INPUT;
  out->compliance = AW_COMPLIANCE_UNKNOWN;
  for (int m = 0; m < AW_SWEEP_N_METRICS; m++)
    out->values[m] = NAN;
  out->mass_kg = out->velocity_mps = out->lift_ratio = NAN;
  out->spin_rad_s = out->elevation_rad = NAN;
  g_return_val_if_fail (setup != NULL && desc != NULL, AW_ANALYSIS_BAD_INPUT);
  g_return_val_if_fail ((unsigned) desc->axis[0].var < AW_SWEEP_N_VARS
                        && (unsigned) desc->axis[1].var < AW_SWEEP_N_VARS, AW_ANALYSIS_BAD_INPUT);

  in = setup->input;
  effective_curve (setup, &curve);

  set[desc->axis[0].var] = TRUE;
  val[desc->axis[0].var] = v1;
  if (desc->axis[1].var != AW_SWEEP_VAR_NONE)
    {
      set[desc->axis[1].var] = TRUE;
      val[desc->axis[1].var] = v2;
    }
  for (int v = AW_SWEEP_VAR_NONE + 1; v < AW_SWEEP_N_VARS; v++)
    if (set[v] && !isfinite (val[v]))
      return out->status;

  /* the hop where no axis sets it */
  if (desc->hop == AW_SWEEP_HOP_AUTO
      || (desc->hop == AW_SWEEP_HOP_DEFAULT && set[AW_SWEEP_VAR_MASS_G]))
    {
      in.hop_mode = AW_HOP_MODE_AUTO;
      in.hop_value = 0.0;
    }

  /* the varied inputs, in a fixed order: the BB first, then its energy */
  if (set[AW_SWEEP_VAR_MASS_G])
    {
      in.shot.mass_kg = aw_g_to_kg (val[AW_SWEEP_VAR_MASS_G]);
      in.shot.velocity_mps = aw_power_velocity_for_mass (&curve, in.shot.mass_kg);
    }
  if (set[AW_SWEEP_VAR_ENERGY_J])
    in.shot.velocity_mps = aw_velocity_for_energy (in.shot.mass_kg, val[AW_SWEEP_VAR_ENERGY_J]);
  if (set[AW_SWEEP_VAR_LIFT_RATIO])
    {
      in.hop_mode = AW_HOP_MODE_LIFT_RATIO;
      in.hop_value = val[AW_SWEEP_VAR_LIFT_RATIO];
    }
  if (set[AW_SWEEP_VAR_SPIN_RPM])
    {
      in.hop_mode = AW_HOP_MODE_SPIN;
      in.hop_value = aw_rpm_to_rad_s (val[AW_SWEEP_VAR_SPIN_RPM]);
      in.shot.spin_rad_s = in.hop_value;
    }
  if (set[AW_SWEEP_VAR_CROSSWIND_MPS])
    in.shot.wind[1] = val[AW_SWEEP_VAR_CROSSWIND_MPS];
  if (set[AW_SWEEP_VAR_HEIGHT_M])
    in.shot.height_m = val[AW_SWEEP_VAR_HEIGHT_M];
  if (set[AW_SWEEP_VAR_TEMPERATURE_C])
    {
      AwConditions c = setup->conditions;
      c.temperature_c = val[AW_SWEEP_VAR_TEMPERATURE_C];
      if (aw_air_from_conditions (&c, &in.shot.air) != AW_AIR_OK)
        return out->status;
    }

  out->mass_kg = in.shot.mass_kg;
  out->velocity_mps = in.shot.velocity_mps;
  if (aw_shot_validate (&in.shot) != AW_SHOT_OK)
    return out->status;

  double energy = aw_energy_j (in.shot.mass_kg, in.shot.velocity_mps);
  out->values[AW_SWEEP_METRIC_MUZZLE_ENERGY] = energy;
  out->compliance = point_compliance (&desc->site, &curve, in.shot.mass_kg, energy,
                                      &out->values[AW_SWEEP_METRIC_COMPLIANCE]);

  memset (&band, 0, sizeof band);
  out->status = aw_analysis_solve (&in, &band);
  if (out->status != AW_ANALYSIS_OK && out->status != AW_ANALYSIS_NO_BAND)
    return out->status;

  out->lift_ratio = band.lift_ratio;
  out->spin_rad_s = band.spin_rad_s;
  out->elevation_rad = band.elevation_rad;
  out->hop_limited = band.hop_limited;
  out->values[AW_SWEEP_METRIC_BAND_RANGE] = band.band_range_m;
  out->values[AW_SWEEP_METRIC_GROUND_DISTANCE] = band.ground_distance_m;
  out->values[AW_SWEEP_METRIC_APEX] = band.apex_height_m;

  /* the solved trajectory once more, up to the distance of the *-at metrics */
  {
    AwShot shot = in.shot;
    AwFlightOptions fo;
    AwTrajectory tr = { 0 };
    AtCapture cap = { desc->at_distance_m, { 0 }, FALSE };

    shot.spin_rad_s = band.spin_rad_s;
    shot.elevation_rad = band.elevation_rad;
    aw_flight_options_init (&fo);
    fo.sample_step_m = desc->at_distance_m;
    fo.keep_samples = false;
    aw_flight_run_full (&shot, &fo, &tr, capture_at, &cap);
    aw_trajectory_clear (&tr);
    if (cap.found)
      {
        out->values[AW_SWEEP_METRIC_TIME_AT] = cap.sample.t;
        out->values[AW_SWEEP_METRIC_ENERGY_AT] = cap.sample.energy;
        out->values[AW_SWEEP_METRIC_SPEED_AT] = cap.sample.speed;
        out->values[AW_SWEEP_METRIC_DRIFT_AT] = 100.0 * cap.sample.y;
      }
  }
  return out->status;
}

/* ---- results ---- */

void
aw_sweep_result_free (AwSweepResult *result)
{
  if (result == NULL)
    return;
  g_strfreev (result->setup_names);
  g_free (result->values1);
  g_free (result->values2);
  g_free (result->points);
  g_free (result);
}

gboolean
aw_sweep_result_range (const AwSweepResult *result, int setup, AwSweepMetric metric, double *lo,
                       double *hi)
{
  double a = INFINITY, b = -INFINITY;

  g_return_val_if_fail (result != NULL, FALSE);
  g_return_val_if_fail ((unsigned) metric < AW_SWEEP_N_METRICS, FALSE);
  for (guint s = 0; s < result->n_setups; s++)
    {
      if (setup >= 0 && (guint) setup != s)
        continue;
      for (guint j = 0; j < result->n2; j++)
        for (guint i = 0; i < result->n1; i++)
          {
            double v = aw_sweep_result_value (result, s, i, j, metric);
            if (isfinite (v))
              {
                a = fmin (a, v);
                b = fmax (b, v);
              }
          }
    }
  if (!(a <= b))
    return FALSE;
  if (lo)
    *lo = a;
  if (hi)
    *hi = b;
  return TRUE;
}

/* ---- the run ---- */

typedef struct
{
  AwSweepSetup *setups;      /* copies */
  AwSweepDesc desc;
  AwSweepResult *result;
  gint total;
  gint next;                 /* atomic: the next point number to take */
  gint done;                 /* atomic: points finished */
  gint stop;                 /* atomic: a thread saw the cancellation */
  GCancellable *cancellable;
} Job;

/* Computes one point; FALSE when none is left or the work was cancelled. */
static gboolean
job_step (Job *job)
{
  if (g_atomic_int_get (&job->stop))
    return FALSE;
  if (g_cancellable_is_cancelled (job->cancellable))
    {
      g_atomic_int_set (&job->stop, 1);
      return FALSE;
    }
  gint idx = g_atomic_int_add (&job->next, 1);
  if (idx >= job->total)
    return FALSE;

  AwSweepResult *r = job->result;
  guint i1 = (guint) idx % r->n1;
  guint rest = (guint) idx / r->n1;
  guint i2 = rest % r->n2;
  guint s = rest / r->n2;
  aw_sweep_eval_point (&job->setups[s], &job->desc, r->values1[i1], r->values2[i2],
                       aw_sweep_result_point (r, s, i1, i2));
  g_atomic_int_inc (&job->done);
  return TRUE;
}

static gpointer
job_thread (gpointer data)
{
  Job *job = data;
  while (job_step (job))
    ;
  return NULL;
}

static void
free_setup_copies (AwSweepSetup *setups, guint n)
{
  for (guint s = 0; s < n; s++)
    {
      g_free ((char *) setups[s].name);
      g_free ((AwPowerPoint *) setups[s].power.points);
    }
  g_free (setups);
}

AwSweepResult *
aw_sweep_run (const AwSweepSetup *setups, guint n_setups, const AwSweepDesc *desc, guint n_threads,
              AwSweepProgressFunc progress, gpointer user_data, GCancellable *cancellable,
              GError **error)
{
  Job job = { 0 };
  AwSweepResult *r;
  guint64 total;

  g_return_val_if_fail (setups != NULL || n_setups == 0, NULL);
  g_return_val_if_fail (desc != NULL, NULL);
  g_return_val_if_fail (cancellable == NULL || G_IS_CANCELLABLE (cancellable), NULL);
  g_return_val_if_fail (error == NULL || *error == NULL, NULL);

  if (!aw_sweep_desc_validate (desc, error))
    return NULL;
  if (n_setups == 0)
    {
      g_set_error (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID, "setups: none given");
      return NULL;
    }
  total = (guint64) n_setups * desc->axis[0].n * aw_sweep_desc_axis_count (desc, 1);
  if (total > AW_SWEEP_MAX_POINTS)
    {
      g_set_error (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID,
                   "setups: %u setups × %" G_GUINT64_FORMAT " points, more than %d", n_setups,
                   total / n_setups, AW_SWEEP_MAX_POINTS);
      return NULL;
    }
  if (g_cancellable_set_error_if_cancelled (cancellable, error))
    return NULL;

  r = g_new0 (AwSweepResult, 1);
  r->desc = *desc;
  r->n_setups = n_setups;
  r->n1 = desc->axis[0].n;
  r->n2 = aw_sweep_desc_axis_count (desc, 1);
  r->values1 = g_new (double, r->n1);
  r->values2 = g_new (double, r->n2);
  for (guint i = 0; i < r->n1; i++)
    r->values1[i] = aw_sweep_axis_value (&desc->axis[0], i);
  for (guint j = 0; j < r->n2; j++)
    r->values2[j] = aw_sweep_axis_value (&desc->axis[1], j);
  r->points = g_new0 (AwSweepPoint, total);
  r->setup_names = g_new0 (char *, n_setups + 1);

  job.setups = g_new0 (AwSweepSetup, n_setups);
  for (guint s = 0; s < n_setups; s++)
    {
      job.setups[s] = setups[s];
      job.setups[s].name = g_strdup (setups[s].name ? setups[s].name : "");
      if (setups[s].power.points != NULL && setups[s].power.n_points > 0)
        job.setups[s].power.points = g_memdup2 (setups[s].power.points,
                                                setups[s].power.n_points
                                                * sizeof (AwPowerPoint));
      else
        {
          job.setups[s].power.points = NULL;
          job.setups[s].power.n_points = 0;
        }
      r->setup_names[s] = g_strdup (job.setups[s].name);
    }
  job.desc = *desc;
  job.result = r;
  job.total = (gint) total;
  job.cancellable = cancellable;

  if (n_threads == 0)
    n_threads = g_get_num_processors ();
  if (n_threads > total)
    n_threads = (guint) total;
  if (n_threads > 256)
    n_threads = 256;

  g_autoptr (GPtrArray) threads = g_ptr_array_new ();
  for (guint t = 1; t < n_threads; t++)
    {
      GThread *th = g_thread_try_new ("aw-sweep", job_thread, &job, NULL);
      if (th == NULL)
        break;   /* fewer threads: the same numbers, only slower */
      g_ptr_array_add (threads, th);
    }

  /* the calling thread works too, and reports progress between its points */
  {
    gint64 last = g_get_monotonic_time ();
    double reported = 0.0;
    while (job_step (&job))
      {
        if (progress == NULL)
          continue;
        gint64 now = g_get_monotonic_time ();
        if (now - last < AW_SWEEP_PROGRESS_INTERVAL_US)
          continue;
        last = now;
        gint d = g_atomic_int_get (&job.done);
        double f = (double) d / (double) job.total;
        if (d < job.total && f > reported)
          {
            reported = f;
            progress (f, user_data);
          }
      }
  }
  for (guint t = 0; t < threads->len; t++)
    g_thread_join (g_ptr_array_index (threads, t));

  free_setup_copies (job.setups, n_setups);

  if (g_atomic_int_get (&job.done) != job.total)
    {
      aw_sweep_result_free (r);
      if (!g_cancellable_set_error_if_cancelled (cancellable, error))
        g_set_error (error, G_IO_ERROR, G_IO_ERROR_CANCELLED, "sweep: cancelled");
      return NULL;
    }
  if (progress)
    progress (1.0, user_data);
  return r;
}

/* ---- CSV ---- */

static void
csv_field (GString *s, const char *text)
{
  if (strpbrk (text, ",\"\r\n") == NULL)
    {
      g_string_append (s, text);
      return;
    }
  g_string_append_c (s, '"');
  for (const char *p = text; *p; p++)
    {
      if (*p == '"')
        g_string_append_c (s, '"');
      g_string_append_c (s, *p);
    }
  g_string_append_c (s, '"');
}

char *
aw_sweep_format_number (char *buf, double v)
{
  static const char *const formats[] = { "%.15g", "%.16g" };

  g_return_val_if_fail (buf != NULL, NULL);
  for (guint k = 0; k < G_N_ELEMENTS (formats); k++)
    {
      g_ascii_formatd (buf, G_ASCII_DTOSTR_BUF_SIZE, formats[k], v);
      if (g_ascii_strtod (buf, NULL) == v)
        return buf;
    }
  return g_ascii_dtostr (buf, G_ASCII_DTOSTR_BUF_SIZE, v);   /* %.17g: always exact */
}

static void
csv_number (GString *s, double v)
{
  char b[G_ASCII_DTOSTR_BUF_SIZE];
  if (isfinite (v))
    g_string_append (s, aw_sweep_format_number (b, v));
}

char *
aw_sweep_result_to_csv (const AwSweepResult *result, const AwSweepMetric *metrics, guint n_metrics)
{
  AwSweepMetric all[AW_SWEEP_N_METRICS];
  gboolean two;
  GString *s;

  g_return_val_if_fail (result != NULL, NULL);
  if (metrics == NULL || n_metrics == 0)
    {
      for (int m = 0; m < AW_SWEEP_N_METRICS; m++)
        all[m] = (AwSweepMetric) m;
      metrics = all;
      n_metrics = AW_SWEEP_N_METRICS;
    }
  for (guint k = 0; k < n_metrics; k++)
    g_return_val_if_fail ((unsigned) metrics[k] < AW_SWEEP_N_METRICS, NULL);

  two = result->desc.axis[1].var != AW_SWEEP_VAR_NONE;
  s = g_string_new ("setup,");
  g_string_append (s, aw_sweep_var_column (result->desc.axis[0].var));
  if (two)
    {
      g_string_append_c (s, ',');
      g_string_append (s, aw_sweep_var_column (result->desc.axis[1].var));
    }
  for (guint k = 0; k < n_metrics; k++)
    {
      g_autofree char *col = aw_sweep_metric_column (metrics[k], result->desc.at_distance_m);
      g_string_append_c (s, ',');
      g_string_append (s, col);
    }
  g_string_append (s, ",status\r\n");

  for (guint st = 0; st < result->n_setups; st++)
    for (guint j = 0; j < result->n2; j++)
      for (guint i = 0; i < result->n1; i++)
        {
          const AwSweepPoint *p = aw_sweep_result_point (result, st, i, j);
          csv_field (s, result->setup_names[st]);
          g_string_append_c (s, ',');
          csv_number (s, result->values1[i]);
          if (two)
            {
              g_string_append_c (s, ',');
              csv_number (s, result->values2[j]);
            }
          for (guint k = 0; k < n_metrics; k++)
            {
              g_string_append_c (s, ',');
              csv_number (s, p->values[metrics[k]]);
            }
          g_string_append_c (s, ',');
          g_string_append (s, aw_sweep_status_to_name (p->status));
          g_string_append (s, "\r\n");
        }
  return g_string_free (s, FALSE);
}

gboolean
aw_sweep_result_save_csv (const AwSweepResult *result, const AwSweepMetric *metrics,
                          guint n_metrics, const char *path, GError **error)
{
  g_autofree char *text = NULL;

  g_return_val_if_fail (result != NULL && path != NULL, FALSE);
  text = aw_sweep_result_to_csv (result, metrics, n_metrics);
  if (text == NULL)
    {
      g_set_error (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID, "%s: bad metric list", path);
      return FALSE;
    }
  /* g_file_set_contents writes a temporary file and renames it over path */
  return g_file_set_contents (path, text, -1, error);
}
