/* aw-analysis.c: band range, sight line and zero, auto hop, range tables, BB-mass conversion and
 * BB recommendation, built on the flight engine
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * libm only, no globals: every function works on its own stack state, so any number of threads
 * may call them at once.
 *
 * The band. The sight line is level at z_s = muzzle height + sight height; the band is
 * z_s − h ≤ z < z_s + h. Crossings of its two edges are located by the engine on its dense
 * output (aw_flight_run_events), not interpolated between samples.
 *
 * Contiguous reading of the band range: the trajectory enters the band at x_near (0 when the
 * muzzle is inside it) and x_far is the END OF THAT FIRST IN-BAND STRETCH: the first place after
 * x_near where it leaves the band, through the top or the bottom. An over-hopped BB that climbs
 * out of the band top has left the band there, even if it comes back down through the band later:
 * a target at the distance where it passes above the band would be missed, so the band range is
 * where it went out of the top. When the BB lands while still inside the band (the band reaches
 * the ground), x_far is the ground distance.
 *
 * Auto hop. With the bore elevation fixed, the band range rises with the lift ratio as long as
 * the apex stays inside the band and falls abruptly once the apex pokes out of the top (the BB
 * then leaves through the top, near the apex). The usual optimum is therefore the hop whose apex
 * just touches the band top. The apex height is monotonic in the lift ratio, so that hop is found
 * by a bracketed root search (Illinois variant of regula falsi) on apex(L) − top, kept on the low
 * side of the top (apex within AW_APEX_TOL_M below it, never above). Saturating lift models are
 * clamped to the largest ratio the model reaches with the engine's spin limit. The result is then
 * checked against a coarse scan of lift ratios below it and the better one is kept (refined by a
 * golden-section search when a scan point wins); when the apex criterion does not apply (muzzle
 * above the band, apex above the top without hop, a zero distance) a scan with golden-section
 * refinement maximises the band range directly.
 *
 * Hop limit (modelling assumption, no source: a hop-up at its strongest setting gives at most the
 * same spin parameter S = r·ω⊥/V at the muzzle whatever the BB). Auto hop searches lift ratios
 * only up to the one the limit gives with the shot's own BB and speed; when that cuts the search
 * short, the strongest setting itself is tried too, and a result sitting at it is flagged
 * hop_limited. A hop given as a lift ratio or a spin is flown as given and only flagged when it
 * is above the limit. Without a limit (NAN) nothing of this runs: results are those of the
 * unlimited search, bit for bit.
 */
#include "aw-analysis.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#define AW_SPIN_CAP_RAD_S   1e5      /* the engine's spin limit (aw_shot_validate) */
#define AW_LIFT_RATIO_CAP   20.0     /* the largest lift ratio the analysis considers */
#define AW_APEX_TOL_M       2e-4     /* the auto-hop apex sits within this below the band top */
#define AW_ZERO_TOL_M       1e-4     /* the zeroed trajectory passes the zero within this */
#define AW_SCAN_BELOW       8        /* coarse scan below the apex solution */
#define AW_SCAN_GENERIC     10       /* scan points when the apex criterion does not apply */
#define AW_GOLDEN_ITER      12
#define AW_ELEV_SCAN_DEG    3.0      /* optimise_elevation scans ±this many degrees… */
#define AW_ELEV_SCAN_N      13       /* …at this many points, then refines */
#define AW_DEG              (M_PI / 180.0)
#define AW_HOP_LIMIT_TOL    2e-3     /* auto hop within this (relative) of the hop limit is at it */

/* ---- defaults, validation, names ---- */

void
aw_analysis_input_init (AwAnalysisInput *in)
{
  memset (in, 0, sizeof *in);
  aw_shot_init (&in->shot);
  in->hop_mode = AW_HOP_MODE_AUTO;
  in->hop_value = 0.0;
  in->band_half_m = AW_BAND_HALF_DEFAULT_M;
  in->sight_height_m = 0.0;
  in->zero_distance_m = NAN;
  in->optimise_elevation = false;
  in->angle_unit = AW_ANGLE_MRAD;
  in->hop_limit_s = NAN;
}

static bool
hop_limit_set (const AwAnalysisInput *in)
{
  return !isnan (in->hop_limit_s);
}

static bool
zero_is_set (const AwAnalysisInput *in)
{
  return isfinite (in->zero_distance_m) && in->zero_distance_m > 0.0;
}

static void
result_reset (AwBandResult *out)
{
  memset (out, 0, sizeof *out);
  out->lift_ratio = NAN;
  out->spin_rad_s = NAN;
  out->elevation_rad = NAN;
  out->band_near_m = NAN;
  out->band_range_m = NAN;
  out->ground_distance_m = NAN;
  out->apex_height_m = NAN;
  out->apex_distance_m = NAN;
  out->time_of_flight_s = NAN;
  out->hop_limit_lift_ratio = NAN;
}

/* Checks the analysis fields (not the hop mode's value, see check_hop). */
static AwAnalysisField
check_input (const AwAnalysisInput *in)
{
  if (!isfinite (in->band_half_m) || in->band_half_m <= 0.0 || in->band_half_m > 5.0)
    return AW_FIELD_BAND_HALF;
  if (!isfinite (in->sight_height_m) || fabs (in->sight_height_m) > 1.0)
    return AW_FIELD_SIGHT_HEIGHT;
  if (!isnan (in->zero_distance_m)
      && (!isfinite (in->zero_distance_m) || in->zero_distance_m > 1000.0))
    return AW_FIELD_ZERO_DISTANCE;
  if (in->optimise_elevation && zero_is_set (in))
    return AW_FIELD_OPTIMISE_ELEVATION;
  if ((unsigned) in->angle_unit > AW_ANGLE_MOA)
    return AW_FIELD_ANGLE_UNIT;
  if ((unsigned) in->hop_mode > AW_HOP_MODE_SPIN)
    return AW_FIELD_HOP_MODE;
  if (in->hop_mode == AW_HOP_MODE_LIFT_RATIO
      && (!isfinite (in->hop_value) || in->hop_value < 0.0 || in->hop_value > AW_LIFT_RATIO_CAP))
    return AW_FIELD_HOP_VALUE;
  if (in->hop_mode == AW_HOP_MODE_SPIN
      && (!isfinite (in->hop_value) || in->hop_value < 0.0 || in->hop_value > AW_SPIN_CAP_RAD_S))
    return AW_FIELD_HOP_VALUE;
  if (hop_limit_set (in)
      && (!isfinite (in->hop_limit_s) || in->hop_limit_s < 0.0 || in->hop_limit_s > 1000.0))
    return AW_FIELD_HOP_LIMIT;
  return AW_FIELD_NONE;
}

/* Validates the input; fills out and returns false when it is bad. */
static bool
validate (const AwAnalysisInput *in, AwBandResult *out)
{
  AwAnalysisField f = check_input (in);
  out->shot_status = aw_shot_validate (&in->shot);
  if (f != AW_FIELD_NONE)
    {
      out->bad_field = f;
      out->status = AW_ANALYSIS_BAD_INPUT;
      return false;
    }
  if (out->shot_status != AW_SHOT_OK)
    {
      out->bad_field = AW_FIELD_SHOT;
      out->status = AW_ANALYSIS_BAD_INPUT;
      return false;
    }
  return true;
}

const char *
aw_analysis_status_name (AwAnalysisStatus status)
{
  switch (status)
    {
    case AW_ANALYSIS_OK: return "ok";
    case AW_ANALYSIS_NO_BAND: return "no-band";
    case AW_ANALYSIS_HOP_UNREACHABLE: return "hop-unreachable";
    case AW_ANALYSIS_NO_ZERO: return "no-zero";
    case AW_ANALYSIS_BAD_INPUT: return "bad-input";
    case AW_ANALYSIS_FLIGHT_FAILED: return "flight-failed";
    default: return "unknown";
    }
}

const char *
aw_analysis_field_name (AwAnalysisField field)
{
  switch (field)
    {
    case AW_FIELD_NONE: return "none";
    case AW_FIELD_SHOT: return "shot";
    case AW_FIELD_HOP_MODE: return "hop-mode";
    case AW_FIELD_HOP_VALUE: return "hop-value";
    case AW_FIELD_BAND_HALF: return "band-half";
    case AW_FIELD_SIGHT_HEIGHT: return "sight-height";
    case AW_FIELD_ZERO_DISTANCE: return "zero-distance";
    case AW_FIELD_OPTIMISE_ELEVATION: return "optimise-elevation";
    case AW_FIELD_ANGLE_UNIT: return "angle-unit";
    case AW_FIELD_STEP: return "step";
    case AW_FIELD_MAX_DISTANCE: return "max-distance";
    case AW_FIELD_MIN_ENGAGEMENT: return "min-engagement";
    case AW_FIELD_POWER_CURVE: return "power-curve";
    case AW_FIELD_SITE: return "site";
    case AW_FIELD_MASSES: return "masses";
    case AW_FIELD_HOP_LIMIT: return "hop-limit";
    default: return "unknown";
    }
}

/* ---- angles ---- */

double
aw_hold_angle (double hold_m, double distance_m, AwAngleUnit unit)
{
  if (!isfinite (hold_m) || !isfinite (distance_m) || distance_m <= 0.0)
    return NAN;
  double a = atan (hold_m / distance_m);
  return unit == AW_ANGLE_MOA ? a * 10800.0 / M_PI : a * 1e3;
}

/* ---- one flight against the band ---- */

typedef struct
{
  double z_sight, lo, hi;
} Band;

static void
band_init (const AwAnalysisInput *in, const AwShot *shot, Band *b)
{
  b->z_sight = shot->height_m + in->sight_height_m;
  b->lo = b->z_sight - in->band_half_m;
  b->hi = b->z_sight + in->band_half_m;
}

/* Follows the BB through the band edges (levels[0] = bottom, levels[1] = top). */
typedef struct
{
  int where;            /* −1 below, 0 inside, +1 above the band */
  bool entered, left, stop_on_exit;
  double x_near, x_far;
} BandTrack;

static bool
band_event (const AwFlightEvent *e, void *data)
{
  BandTrack *bt = data;
  int was = bt->where;

  if (e->kind == AW_EVENT_APEX || bt->left)
    return true;
  if (e->kind == AW_EVENT_HEIGHT_UP)
    bt->where = e->level == 0 ? 0 : +1;
  else
    bt->where = e->level == 0 ? -1 : 0;
  if (was != 0 && bt->where == 0 && !bt->entered)
    {
      bt->entered = true;
      bt->x_near = e->state.x;
    }
  else if (was == 0 && bt->where != 0 && bt->entered)
    {
      bt->left = true;
      bt->x_far = e->state.x;
      return !bt->stop_on_exit;
    }
  return true;
}

typedef struct
{
  const AwAnalysisInput *in;
  AwFlightOptions fo;       /* no samples */
  int flights;
  AwFlightStatus last_failure;
} Ctx;

static void
ctx_init (Ctx *c, const AwAnalysisInput *in)
{
  c->in = in;
  aw_flight_options_init (&c->fo);
  c->fo.sample_step_m = 0.0;
  c->fo.keep_samples = false;
  c->flights = 0;
  c->last_failure = AW_FLIGHT_GROUND;
}

/* Flies shot against the band. full: to the ground (else it stops where the BB leaves the band).
 * Returns the band range, −1 when the BB never enters the band, NAN when the flight failed. */
static double
fly_band (Ctx *c, const AwShot *shot, bool full, BandTrack *bt_out, AwTrajectory *tr_out)
{
  Band b;
  BandTrack bt = { 0 };
  AwTrajectory tr = { 0 };
  double levels[2];
  AwFlightEvents ev = { levels, 2, false, band_event, &bt };

  band_init (c->in, shot, &b);
  levels[0] = b.lo;
  levels[1] = b.hi;
  if (shot->height_m >= b.hi)
    bt.where = +1;
  else if (shot->height_m >= b.lo)
    {
      bt.where = 0;
      bt.entered = true;
      bt.x_near = 0.0;
    }
  else
    bt.where = -1;
  bt.stop_on_exit = !full;

  AwFlightStatus st = aw_flight_run_events (shot, &c->fo, &tr, NULL, NULL, &ev);
  c->flights++;
  if (bt_out)
    *bt_out = bt;
  if (tr_out)
    *tr_out = tr;
  if (st < 0)
    {
      c->last_failure = st;
      return NAN;
    }
  if (!bt.entered)
    return -1.0;
  if (!bt.left)
    {
      bt.x_far = tr.end.x;
      if (bt_out)
        bt_out->x_far = bt.x_far;
    }
  return bt.x_far;
}

typedef struct
{
  bool found;
  double z, x;
} ApexTrack;

static bool
apex_event (const AwFlightEvent *e, void *data)
{
  ApexTrack *a = data;
  a->found = true;
  a->z = e->state.z;
  a->x = e->state.x;
  return false;
}

/* Height of the first apex (the muzzle height when the BB never rises). NAN on failure. */
static double
fly_apex (Ctx *c, const AwShot *shot)
{
  ApexTrack a = { 0 };
  AwTrajectory tr = { 0 };
  AwFlightEvents ev = { NULL, 0, true, apex_event, &a };
  AwFlightStatus st = aw_flight_run_events (shot, &c->fo, &tr, NULL, NULL, &ev);
  c->flights++;
  if (st < 0)
    {
      c->last_failure = st;
      return NAN;
    }
  return a.found ? a.z : tr.apex_height;
}

/* ---- hop ---- */

/* The largest lift ratio the model reaches (the engine's spin limit), at most the cap. */
static double
lift_ratio_max (const AwShot *shot)
{
  double l = aw_shot_lift_ratio_for_spin (shot, AW_SPIN_CAP_RAD_S);
  if (!isfinite (l) || l < 0.0)
    return 0.0;
  return fmin (l, AW_LIFT_RATIO_CAP);
}

/* Sets the spin for lift ratio l, clamped to what the model reaches. Returns the ratio set. */
static double
set_lift_ratio (AwShot *shot, double l)
{
  double w;
  AwHopStatus hs = aw_shot_spin_for_lift_ratio (shot, l, &w);
  if (hs == AW_HOP_OK)
    {
      shot->spin_rad_s = w;
      return l;
    }
  if (hs == AW_HOP_UNREACHABLE)
    {
      shot->spin_rad_s = AW_SPIN_CAP_RAD_S;
      return aw_shot_lift_ratio_for_spin (shot, AW_SPIN_CAP_RAD_S);
    }
  shot->spin_rad_s = 0.0;
  return 0.0;
}

/* ---- hop limit ---- */

double
aw_hop_limit_s_for_lift_ratio (const AwShot *own, double max_lift_ratio)
{
  double w;
  if (!own || !isfinite (max_lift_ratio) || max_lift_ratio < 0.0)
    return NAN;
  switch (aw_shot_spin_for_lift_ratio (own, max_lift_ratio, &w))
    {
    case AW_HOP_OK:
      return aw_shot_spin_parameter_for_spin (own, w);
    case AW_HOP_UNREACHABLE:
      /* beyond the model's reach: its own ceiling, so the limit never binds */
      return aw_shot_spin_parameter_for_spin (own, AW_SPIN_CAP_RAD_S);
    case AW_HOP_NO_LIFT:
    case AW_HOP_BAD_INPUT:
    default:
      return NAN;
    }
}

double
aw_hop_limit_lift_ratio (const AwShot *shot, double hop_limit_s)
{
  if (!shot || isnan (hop_limit_s))
    return NAN;
  /* at a fixed S the lift ratio is ½ρA·V²·C_L(S)/(m·g): the spin that gives S here, uncapped */
  double w = aw_shot_spin_for_spin_parameter (shot, hop_limit_s);
  if (isnan (w))
    return NAN;
  return aw_shot_lift_ratio_for_spin (shot, w);
}

/* The largest lift ratio the input's hop limit allows for shot; INFINITY without a limit. */
static double
hop_limit_ratio (const Ctx *c, const AwShot *shot)
{
  if (!hop_limit_set (c->in))
    return INFINITY;
  double l = aw_hop_limit_lift_ratio (shot, c->in->hop_limit_s);
  return isnan (l) ? INFINITY : l;
}

/* Sets the hop-limit fields of a result for the shot as flown (spin and elevation set) with lift
 * ratio l. auto_hop: flagged when l sits at the limit; else when the hop is above it. */
static void
note_hop_limit (const AwAnalysisInput *in, const AwShot *shot, double l, bool auto_hop,
                AwBandResult *out)
{
  out->hop_limited = false;
  out->hop_over_limit = false;
  out->hop_limit_lift_ratio = NAN;
  if (!hop_limit_set (in))
    return;
  double lim = aw_hop_limit_lift_ratio (shot, in->hop_limit_s);
  out->hop_limit_lift_ratio = lim;
  if (isnan (lim) || !isfinite (l))
    return;
  if (auto_hop)
    /* at the limit: the search's resolution near it (a golden-section bracket of about 6e-4 of
     * the range searched, and noise from the zero's tolerance) and the limit's small change with
     * the bore elevation in a wind are covered by 0.2 % */
    out->hop_limited = l >= lim * (1.0 - AW_HOP_LIMIT_TOL);
  else
    {
      double s = aw_shot_spin_parameter_for_spin (shot, shot->spin_rad_s);
      out->hop_over_limit = (isfinite (s) && s > in->hop_limit_s * (1.0 + 1e-9))
                            || l > lim * (1.0 + 1e-9);
      out->hop_limited = out->hop_over_limit;
    }
}

/* ---- zero ---- */

typedef struct
{
  double z;        /* height at the zero distance (extrapolated below ground when short) */
  double vz;
  bool reached;
} ZeroProbe;

/* Height at x = dist for the shot as it is; false when the flight failed. */
static bool
probe_at (Ctx *c, const AwShot *shot, double dist, ZeroProbe *p)
{
  AwFlightOptions fo = c->fo;
  AwTrajectory tr = { 0 };
  fo.max_distance_m = dist;
  AwFlightStatus st = aw_flight_run (shot, &fo, &tr);
  c->flights++;
  if (st < 0)
    {
      c->last_failure = st;
      return false;
    }
  p->reached = st == AW_FLIGHT_DISTANCE;
  p->vz = tr.end.vz;
  if (p->reached)
    p->z = tr.end.z;
  else
    {
      /* landed short: continue the descent on the impact slope (keeps the function monotonic
       * in the elevation for the bracketing below) */
      double slope = tr.end.vx > 1e-9 ? tr.end.vz / tr.end.vx : -1.0;
      p->z = tr.end.z + fmin (slope, -0.05) * (dist - tr.end.x);
    }
  return true;
}

/* Elevation making the trajectory pass the sight line at dist. shot->elevation_rad is the start
 * guess and receives the result; hop_ratio ≥ 0 re-sets the spin for that lift ratio at each
 * elevation (the ratio depends slightly on the elevation in wind), < 0 keeps the spin. */
static AwAnalysisStatus
solve_zero (Ctx *c, AwShot *shot, double dist, double hop_ratio)
{
  const double e_lim = 45.0 * AW_DEG;
  double z_s = shot->height_m + c->in->sight_height_m;
  ZeroProbe p;
  double ea, eb, fa, fb;

#define PROBE(e, f)                                                  \
  do {                                                               \
    shot->elevation_rad = (e);                                       \
    if (hop_ratio >= 0.0)                                            \
      set_lift_ratio (shot, hop_ratio);                              \
    if (!probe_at (c, shot, dist, &p))                               \
      return AW_ANALYSIS_FLIGHT_FAILED;                              \
    (f) = p.z - z_s;                                                 \
  } while (0)

  ea = fmax (-e_lim, fmin (e_lim, isfinite (shot->elevation_rad) ? shot->elevation_rad : 0.0));
  PROBE (ea, fa);
  if (fabs (fa) < AW_ZERO_TOL_M && p.reached)
    goto check;
  /* raising the bore by δ raises the height at dist by about dist·δ: secant start */
  {
    double d = -fa / dist;
    d = copysign (fmax (fabs (d), 1e-5), d);
    eb = fmax (-e_lim, fmin (e_lim, ea + d));
    PROBE (eb, fb);
  }
  /* secant steps until the root is bracketed or found */
  for (int it = 0; it < 40 && (fa > 0.0) == (fb > 0.0); it++)
    {
      if (fabs (fb) < AW_ZERO_TOL_M && p.reached)
        goto check;
      double en;
      if (fb != fa)
        en = eb - fb * (eb - ea) / (fb - fa);
      else
        en = eb + (eb - ea);
      /* never step backwards away from the root, and at least double the last step */
      double step = en - eb;
      double last = eb - ea;
      if (!isfinite (en) || (fabs (fb) > fabs (fa) && step * last > 0.0))
        step = -2.0 * last;
      if (fabs (step) < 2.0 * fabs (last) && (fb > 0.0) == (fa > 0.0) && fabs (fb) >= fabs (fa))
        step = copysign (2.0 * fabs (last), step);
      en = fmax (-e_lim, fmin (e_lim, eb + step));
      if (en == eb)
        return AW_ANALYSIS_NO_ZERO;
      ea = eb;
      fa = fb;
      eb = en;
      PROBE (eb, fb);
    }
  if ((fa > 0.0) == (fb > 0.0))
    return AW_ANALYSIS_NO_ZERO;
  /* Illinois on the bracket */
  {
    int side = 0;
    for (int it = 0; it < 60; it++)
      {
        double ec = (ea * fb - eb * fa) / (fb - fa);
        if (!(ec > fmin (ea, eb) && ec < fmax (ea, eb)))
          ec = 0.5 * (ea + eb);
        double fc;
        PROBE (ec, fc);
        if ((fabs (fc) < AW_ZERO_TOL_M && p.reached) || fabs (eb - ea) < 1e-12)
          goto check;
        if ((fc > 0.0) == (fb > 0.0))
          {
            eb = ec;
            fb = fc;
            if (side == -1)
              fa *= 0.5;
            side = -1;
          }
        else
          {
            ea = ec;
            fa = fc;
            if (side == +1)
              fb *= 0.5;
            side = +1;
          }
      }
    return AW_ANALYSIS_NO_ZERO;
  }
#undef PROBE

check:
  /* the zero is where the BB comes DOWN through the sight line */
  if (!p.reached || p.vz > 0.0)
    return AW_ANALYSIS_NO_ZERO;
  return AW_ANALYSIS_OK;
}

AwAnalysisStatus
aw_zero_elevation (const AwAnalysisInput *in, const AwShot *shot, double zero_distance_m,
                   double *elevation_rad)
{
  Ctx c;
  AwShot s;
  if (check_input (in) != AW_FIELD_NONE || aw_shot_validate (shot) != AW_SHOT_OK
      || !isfinite (zero_distance_m) || zero_distance_m <= 0.0 || zero_distance_m > 1000.0)
    return AW_ANALYSIS_BAD_INPUT;
  ctx_init (&c, in);
  s = *shot;
  AwAnalysisStatus st = solve_zero (&c, &s, zero_distance_m, -1.0);
  if (st == AW_ANALYSIS_OK)
    *elevation_rad = s.elevation_rad;
  return st;
}

/* ---- auto hop ---- */

/* Band range with lift ratio l (elevation from the zero when one is set). shot keeps the spin and
 * elevation used; *l_used the ratio after clamping. −1: no band or no zero. */
static double
eval_hop (Ctx *c, AwShot *shot, double l, double *l_used, AwAnalysisStatus *fail)
{
  double lu = set_lift_ratio (shot, l);
  if (zero_is_set (c->in))
    {
      AwAnalysisStatus zs = solve_zero (c, shot, c->in->zero_distance_m, l);
      if (zs == AW_ANALYSIS_FLIGHT_FAILED)
        {
          *fail = zs;
          return NAN;
        }
      lu = aw_shot_lift_ratio_for_spin (shot, shot->spin_rad_s);
      if (zs != AW_ANALYSIS_OK)
        {
          if (l_used)
            *l_used = lu;
          return -1.0;
        }
    }
  if (l_used)
    *l_used = lu;
  double r = fly_band (c, shot, false, NULL, NULL);
  if (isnan (r))
    *fail = AW_ANALYSIS_FLIGHT_FAILED;
  return r;
}

typedef struct
{
  double l;          /* lift ratio asked for */
  double range;      /* band range (−1 none) */
  double elevation;
} Best;

static void
consider (Best *best, double l, double range, double elevation)
{
  if (range > best->range)
    {
      best->l = l;
      best->range = range;
      best->elevation = elevation;
    }
}

/* Golden-section search for the largest band range in [a, b]; every point tried counts. */
static bool
golden (Ctx *c, AwShot *shot, double a, double b, Best *best, AwAnalysisStatus *fail)
{
  const double g = 0.5 * (sqrt (5.0) - 1.0);
  double x1 = b - g * (b - a), x2 = a + g * (b - a);
  double f1 = eval_hop (c, shot, x1, NULL, fail);
  consider (best, x1, f1, shot->elevation_rad);
  double f2 = eval_hop (c, shot, x2, NULL, fail);
  consider (best, x2, f2, shot->elevation_rad);
  if (isnan (f1) || isnan (f2))
    return false;
  for (int i = 0; i < AW_GOLDEN_ITER; i++)
    {
      if (f1 >= f2)
        {
          b = x2;
          x2 = x1;
          f2 = f1;
          x1 = b - g * (b - a);
          f1 = eval_hop (c, shot, x1, NULL, fail);
          if (isnan (f1))
            return false;
          consider (best, x1, f1, shot->elevation_rad);
        }
      else
        {
          a = x1;
          x1 = x2;
          f1 = f2;
          x2 = a + g * (b - a);
          f2 = eval_hop (c, shot, x2, NULL, fail);
          if (isnan (f2))
            return false;
          consider (best, x2, f2, shot->elevation_rad);
        }
    }
  return true;
}

/* Scan of n points on [a, b) (b included when with_end), refined around the best. */
static bool
scan_refine (Ctx *c, AwShot *shot, double a, double b, int n, bool with_end, double beat,
             Best *best, AwAnalysisStatus *fail)
{
  double xs[AW_SCAN_GENERIC + 1], fs[AW_SCAN_GENERIC + 1];
  int m = with_end ? n + 1 : n;
  int k_best = -1;
  double f_best = beat;

  for (int k = 0; k < m; k++)
    {
      xs[k] = a + (b - a) * k / n;
      fs[k] = eval_hop (c, shot, xs[k], NULL, fail);
      if (isnan (fs[k]))
        return false;
      consider (best, xs[k], fs[k], shot->elevation_rad);
      if (fs[k] > f_best + 1e-3)
        {
          f_best = fs[k];
          k_best = k;
        }
    }
  if (k_best < 0)
    return true;
  double lo = k_best > 0 ? xs[k_best - 1] : a;
  double hi = k_best + 1 < m ? xs[k_best + 1] : b;
  return golden (c, shot, lo, hi, best, fail);
}

/* Auto hop at the elevation of shot (or from the zero). On return shot holds the best hop and
 * elevation; *l_best the lift ratio. */
static AwAnalysisStatus
auto_hop_fixed (Ctx *c, AwShot *shot, bool verify, double *l_best, double *range_best)
{
  AwAnalysisStatus fail = AW_ANALYSIS_OK;
  Best best = { 0.0, -1.0, shot->elevation_rad };
  double l_model = lift_ratio_max (shot);
  double l_limit = hop_limit_ratio (c, shot);   /* INFINITY without a hop limit */
  double l_max = fmin (l_model, l_limit);
  double e0 = shot->elevation_rad;
  bool cut = false;                             /* the hop limit cut the search short */
  Band b;

  band_init (c->in, shot, &b);

  if (!(l_max > 0.0))
    {
      /* no lift: the only hop is none */
      double r = eval_hop (c, shot, 0.0, NULL, &fail);
      if (isnan (r))
        return fail;
      consider (&best, 0.0, r, shot->elevation_rad);
    }
  else if (zero_is_set (c->in))
    {
      /* the elevation follows the hop: maximise the band range directly */
      double top = fmin (l_max, 4.0);
      cut = l_limit < fmin (l_model, 4.0);
      if (!scan_refine (c, shot, 0.0, top, AW_SCAN_GENERIC, true, -1.0, &best, &fail))
        return fail;
    }
  else
    {
      /* apex(L) − top: bracket, then Illinois kept on the low side */
      double la = 0.0, lb, ga, gb, apex;
      bool bracket = false;

      shot->elevation_rad = e0;
      set_lift_ratio (shot, 0.0);
      apex = fly_apex (c, shot);
      if (isnan (apex))
        return AW_ANALYSIS_FLIGHT_FAILED;
      ga = apex - b.hi;
      cut = ga < 0.0 && l_limit < l_model;
      if (ga < 0.0)
        {
          lb = fmin (1.2, l_max);
          for (;;)
            {
              double lu = set_lift_ratio (shot, lb);
              apex = fly_apex (c, shot);
              if (isnan (apex))
                return AW_ANALYSIS_FLIGHT_FAILED;
              gb = apex - b.hi;
              if (gb >= 0.0)
                {
                  bracket = true;
                  break;
                }
              la = lu;
              ga = gb;
              if (lb >= l_max)
                break;
              lb = fmin (l_max, lb < 2.0 ? lb + 0.4 : 1.5 * lb);
            }
          if (bracket && la == 0.0 && lb > 1.0)
            {
              /* below a ratio of about 1 a level BB never rises: tighten the low end */
              double lm = 1.0;
              set_lift_ratio (shot, lm);
              apex = fly_apex (c, shot);
              if (isnan (apex))
                return AW_ANALYSIS_FLIGHT_FAILED;
              if (apex - b.hi < 0.0)
                {
                  la = lm;
                  ga = apex - b.hi;
                }
              else
                {
                  lb = lm;
                  gb = apex - b.hi;
                }
            }
        }

      if (bracket)
        {
          int side = 0;
          double ga_true = ga;   /* Illinois halves ga; the stop test needs the real value */
          for (int it = 0; it < 60 && ga_true < -AW_APEX_TOL_M && lb - la > 1e-10; it++)
            {
              double lc = (la * gb - lb * ga) / (gb - ga);
              if (!(lc > la && lc < lb))
                lc = 0.5 * (la + lb);
              double lu = set_lift_ratio (shot, lc);
              apex = fly_apex (c, shot);
              if (isnan (apex))
                return AW_ANALYSIS_FLIGHT_FAILED;
              double gc = apex - b.hi;
              if (gc >= 0.0)
                {
                  lb = lu;
                  gb = gc;
                  if (side == -1)
                    ga *= 0.5;
                  side = -1;
                }
              else
                {
                  la = lu;
                  ga = ga_true = gc;
                  if (side == +1)
                    gb *= 0.5;
                  side = +1;
                }
            }
          shot->elevation_rad = e0;
          double r = eval_hop (c, shot, la, NULL, &fail);
          if (isnan (r))
            return fail;
          consider (&best, la, r, e0);
          /* check against a coarse scan below the solution */
          if (verify && !scan_refine (c, shot, 0.0, la, AW_SCAN_BELOW, false, r, &best, &fail))
            return fail;
        }
      else if (ga < 0.0)
        {
          /* even the largest reachable hop keeps the apex under the top (saturating lift) */
          double lu = set_lift_ratio (shot, l_max);
          double r = eval_hop (c, shot, lu, NULL, &fail);
          if (isnan (r))
            return fail;
          consider (&best, lu, r, e0);
          if (verify && !scan_refine (c, shot, 0.0, lu, AW_SCAN_BELOW, false, r, &best, &fail))
            return fail;
        }
      else
        {
          /* the apex is above the top without hop (or the muzzle is above the band) */
          cut = l_limit < fmin (l_model, 4.0);
          if (!scan_refine (c, shot, 0.0, fmin (l_max, 4.0), AW_SCAN_GENERIC, true, -1.0, &best,
                            &fail))
            return fail;
        }
    }

  /* the hop-up's strongest setting itself, when the limit cut the search short (a scan or a
   * golden-section search may stop just below it) */
  if (cut && best.l < l_max)
    {
      shot->elevation_rad = e0;
      double r = eval_hop (c, shot, l_max, NULL, &fail);
      if (isnan (r))
        return fail;
      consider (&best, l_max, r, shot->elevation_rad);
    }

  /* leave the best hop and elevation on the shot */
  shot->elevation_rad = best.elevation;
  *l_best = set_lift_ratio (shot, best.l);
  *range_best = best.range;
  return AW_ANALYSIS_OK;
}

/* Auto hop with the bore elevation chosen too (no zero): scan of elevations, golden refinement
 * around the best; every elevation gets its own auto hop. */
static AwAnalysisStatus
auto_hop_elevation (Ctx *c, AwShot *shot, double *l_best, double *range_best)
{
  const double span = AW_ELEV_SCAN_DEG * AW_DEG;
  double es[AW_ELEV_SCAN_N], fs[AW_ELEV_SCAN_N], ls[AW_ELEV_SCAN_N];
  double best_e = 0.0, best_f = -2.0, best_l = 0.0;
  int k_best = 0;

#define TRY(e, f, l)                                                   \
  do {                                                                 \
    shot->elevation_rad = (e);                                         \
    AwAnalysisStatus s_ = auto_hop_fixed (c, shot, false, &(l), &(f)); \
    if (s_ < 0)                                                        \
      return s_;                                                       \
    if ((f) > best_f)                                                  \
      {                                                                \
        best_f = (f);                                                  \
        best_e = (e);                                                  \
        best_l = (l);                                                  \
      }                                                                \
  } while (0)

  for (int k = 0; k < AW_ELEV_SCAN_N; k++)
    {
      es[k] = -span + 2.0 * span * k / (AW_ELEV_SCAN_N - 1);
      TRY (es[k], fs[k], ls[k]);
      if (fs[k] >= fs[k_best])
        k_best = k;
    }
  {
    const double g = 0.5 * (sqrt (5.0) - 1.0);
    double a = es[k_best > 0 ? k_best - 1 : 0];
    double b = es[k_best + 1 < AW_ELEV_SCAN_N ? k_best + 1 : AW_ELEV_SCAN_N - 1];
    double x1 = b - g * (b - a), x2 = a + g * (b - a), f1, f2, l1, l2;
    TRY (x1, f1, l1);
    TRY (x2, f2, l2);
    for (int i = 0; i < 10; i++)
      {
        if (f1 >= f2)
          {
            b = x2;
            x2 = x1;
            f2 = f1;
            x1 = b - g * (b - a);
            TRY (x1, f1, l1);
          }
        else
          {
            a = x1;
            x1 = x2;
            f1 = f2;
            x2 = a + g * (b - a);
            TRY (x2, f2, l2);
          }
      }
  }
#undef TRY
  /* the winner gets the full treatment, scan below its hop included */
  shot->elevation_rad = best_e;
  AwAnalysisStatus st = auto_hop_fixed (c, shot, true, l_best, range_best);
  if (st >= 0 && *range_best < best_f)
    {
      shot->elevation_rad = best_e;
      *l_best = set_lift_ratio (shot, best_l);
      *range_best = best_f;
    }
  return st;
}

/* Fills out from a full flight of shot (hop and elevation set). */
static AwAnalysisStatus
finish_result (Ctx *c, const AwShot *shot, double lift_ratio, AwBandResult *out)
{
  BandTrack bt;
  AwTrajectory tr;
  double r = fly_band (c, shot, true, &bt, &tr);

  out->lift_ratio = lift_ratio;
  out->spin_rad_s = shot->spin_rad_s;
  out->elevation_rad = shot->elevation_rad;
  out->flights = c->flights;
  if (isnan (r))
    {
      out->flight_status = c->last_failure;
      return out->status = AW_ANALYSIS_FLIGHT_FAILED;
    }
  out->flight_status = tr.status;
  out->ground_distance_m = tr.ground_distance;
  out->apex_height_m = tr.apex_height;
  out->apex_distance_m = tr.apex_distance;
  out->time_of_flight_s = tr.time_of_flight;
  if (r < 0.0)
    return out->status = AW_ANALYSIS_NO_BAND;
  out->band_near_m = bt.x_near;
  out->band_range_m = r;
  return out->status = AW_ANALYSIS_OK;
}

AwAnalysisStatus
aw_band_of_shot (const AwAnalysisInput *in, const AwShot *shot, AwBandResult *out)
{
  Ctx c;
  AwAnalysisInput tmp = *in;

  result_reset (out);
  tmp.shot = *shot;
  if (!validate (&tmp, out))
    return out->status;
  ctx_init (&c, in);
  double l = aw_shot_lift_ratio_for_spin (shot, shot->spin_rad_s);
  note_hop_limit (in, shot, l, false, out);
  return finish_result (&c, shot, l, out);
}

AwAnalysisStatus
aw_auto_hop (const AwAnalysisInput *in, AwBandResult *out)
{
  Ctx c;
  AwShot shot;
  double l, r;
  AwAnalysisStatus st;

  result_reset (out);
  if (!validate (in, out))
    return out->status;
  ctx_init (&c, in);
  shot = in->shot;
  if (in->optimise_elevation)
    st = auto_hop_elevation (&c, &shot, &l, &r);
  else
    st = auto_hop_fixed (&c, &shot, true, &l, &r);
  if (st < 0)
    {
      out->flight_status = c.last_failure;
      out->flights = c.flights;
      return out->status = st;
    }
  if (zero_is_set (in) && r < 0.0)
    {
      /* no hop gave a zero with a band: report the zero failure */
      AwAnalysisStatus zs = solve_zero (&c, &shot, in->zero_distance_m, l);
      if (zs != AW_ANALYSIS_OK)
        {
          note_hop_limit (in, &shot, l, true, out);
          finish_result (&c, &shot, l, out);
          return out->status = zs;
        }
    }
  note_hop_limit (in, &shot, l, true, out);
  return finish_result (&c, &shot, l, out);
}

AwAnalysisStatus
aw_analysis_solve (const AwAnalysisInput *in, AwBandResult *out)
{
  Ctx c;
  AwShot shot;
  double l;

  result_reset (out);
  if (!validate (in, out))
    return out->status;
  if (in->hop_mode == AW_HOP_MODE_AUTO)
    return aw_auto_hop (in, out);

  ctx_init (&c, in);
  shot = in->shot;
  if (in->hop_mode == AW_HOP_MODE_LIFT_RATIO)
    {
      double w;
      AwHopStatus hs = aw_shot_spin_for_lift_ratio (&shot, in->hop_value, &w);
      if (hs != AW_HOP_OK)
        {
          out->lift_ratio = in->hop_value;
          shot.spin_rad_s = 0.0;
          note_hop_limit (in, &shot, in->hop_value, false, out);
          return out->status = hs == AW_HOP_BAD_INPUT ? AW_ANALYSIS_BAD_INPUT
                                                      : AW_ANALYSIS_HOP_UNREACHABLE;
        }
      shot.spin_rad_s = w;
      l = in->hop_value;
    }
  else
    {
      shot.spin_rad_s = in->hop_value;
      l = aw_shot_lift_ratio_for_spin (&shot, shot.spin_rad_s);
    }

  if (zero_is_set (in))
    {
      AwAnalysisStatus zs = solve_zero (&c, &shot, in->zero_distance_m,
                                        in->hop_mode == AW_HOP_MODE_LIFT_RATIO ? l : -1.0);
      if (zs == AW_ANALYSIS_FLIGHT_FAILED)
        {
          out->flight_status = c.last_failure;
          out->flights = c.flights;
          return out->status = zs;
        }
      if (zs != AW_ANALYSIS_OK)
        {
          note_hop_limit (in, &shot, l, false, out);
          finish_result (&c, &shot, l, out);
          return out->status = zs;
        }
    }
  note_hop_limit (in, &shot, l, false, out);
  return finish_result (&c, &shot, l, out);
}

/* ---- range table ---- */

void
aw_range_table_clear (AwRangeTable *table)
{
  free (table->rows);
  table->rows = NULL;
  table->n_rows = 0;
}

AwAnalysisStatus
aw_range_table_build (const AwAnalysisInput *in, double step_m, double max_m,
                      double min_engagement_m, AwRangeTable *table)
{
  AwAnalysisInput solved;
  AwFlightOptions fo;
  AwTrajectory base = { 0 }, windy = { 0 };
  AwShot shot, shot_w;
  Band b;

  memset (table, 0, sizeof *table);
  result_reset (&table->band);
  if (!isfinite (step_m) || step_m < 0.01 || step_m > 1000.0)
    {
      table->band.bad_field = AW_FIELD_STEP;
      return table->band.status = AW_ANALYSIS_BAD_INPUT;
    }
  if (isnan (max_m) || (isfinite (max_m) && max_m > 10000.0) || max_m == INFINITY)
    {
      table->band.bad_field = AW_FIELD_MAX_DISTANCE;
      return table->band.status = AW_ANALYSIS_BAD_INPUT;
    }
  if (!isnan (min_engagement_m) && (!isfinite (min_engagement_m) || min_engagement_m > 1000.0))
    {
      table->band.bad_field = AW_FIELD_MIN_ENGAGEMENT;
      return table->band.status = AW_ANALYSIS_BAD_INPUT;
    }

  AwAnalysisStatus st = aw_analysis_solve (in, &table->band);
  if (st < 0 || st == AW_ANALYSIS_HOP_UNREACHABLE || st == AW_ANALYSIS_NO_ZERO)
    return st;

  /* the solved shot */
  shot = in->shot;
  shot.spin_rad_s = table->band.spin_rad_s;
  shot.elevation_rad = table->band.elevation_rad;
  solved = *in;
  solved.shot = shot;
  band_init (&solved, &shot, &b);

  aw_flight_options_init (&fo);
  fo.sample_step_m = step_m;
  fo.max_distance_m = max_m > 0.0 ? max_m : 0.0;
  fo.keep_samples = true;
  AwFlightStatus fs = aw_flight_run (&shot, &fo, &base);
  if (fs < 0)
    {
      aw_trajectory_clear (&base);
      table->band.flight_status = fs;
      return table->band.status = AW_ANALYSIS_FLIGHT_FAILED;
    }
  /* the same shot with 1 m/s more crosswind toward +y (same spin and elevation) */
  shot_w = shot;
  shot_w.wind[1] += 1.0;
  if (fabs (shot_w.wind[1]) > 50.0)
    shot_w.wind[1] -= 2.0;
  double wind_sign = shot_w.wind[1] > shot.wind[1] ? 1.0 : -1.0;
  fs = aw_flight_run (&shot_w, &fo, &windy);
  table->band.flights += 2;
  if (fs < 0)
    {
      aw_trajectory_clear (&base);
      aw_trajectory_clear (&windy);
      table->band.flight_status = fs;
      return table->band.status = AW_ANALYSIS_FLIGHT_FAILED;
    }

  double x_end = base.end.x;
  size_t n = x_end >= 0.0 ? (size_t) floor (x_end / step_m + 1e-9) + 1 : 1;
  table->rows = calloc (n, sizeof *table->rows);
  if (!table->rows)
    {
      aw_trajectory_clear (&base);
      aw_trajectory_clear (&windy);
      table->band.flight_status = AW_FLIGHT_NO_MEMORY;
      return table->band.status = AW_ANALYSIS_FLIGHT_FAILED;
    }
  size_t k = 0;
  for (size_t i = 0; i < n; i++)
    {
      double x = i * step_m;
      AwSample s, sw;
      if (x > x_end)
        x = x_end;
      if (!aw_trajectory_at (&base, x, &s))
        break;
      AwRangeRow *row = &table->rows[k++];
      row->distance_m = x;
      row->height_cm = (s.z - b.z_sight) * 100.0;
      row->hold_cm = -row->height_cm;
      row->hold_angle = aw_hold_angle (row->hold_cm / 100.0, x, in->angle_unit);
      row->time_s = s.t;
      row->speed_mps = s.speed;
      row->energy_j = s.energy;
      row->spin_rad_s = s.spin;
      row->drift_cm = s.y * 100.0;
      if (aw_trajectory_at (&windy, x, &sw))
        row->drift_cm_per_mps = (sw.y - s.y) * 100.0 * wind_sign;
      else
        row->drift_cm_per_mps = NAN;
      row->in_band = fabs (s.z - b.z_sight) <= in->band_half_m;
      row->beyond_min_distance = isfinite (min_engagement_m) && min_engagement_m > 0.0
                                 ? x >= min_engagement_m : true;
    }
  table->n_rows = k;
  aw_trajectory_clear (&base);
  aw_trajectory_clear (&windy);
  return table->band.status;
}

double
aw_range_table_energy_at (const AwRangeTable *table, double distance_m)
{
  if (!table || table->n_rows == 0 || !isfinite (distance_m))
    return NAN;
  const AwRangeRow *r = table->rows;
  size_t n = table->n_rows;
  if (distance_m < r[0].distance_m || distance_m > r[n - 1].distance_m)
    return NAN;
  for (size_t i = 1; i < n; i++)
    if (distance_m <= r[i].distance_m)
      {
        double span = r[i].distance_m - r[i - 1].distance_m;
        if (span <= 0.0)
          return r[i].energy_j;
        double f = (distance_m - r[i - 1].distance_m) / span;
        return r[i - 1].energy_j + f * (r[i].energy_j - r[i - 1].energy_j);
      }
  return r[0].energy_j;
}

/* ---- energy versus BB mass ---- */

#define AW_TENTH_GRAM_KG 1e-4

static bool
mass_ok (double m)
{
  return isfinite (m) && m > 0.0 && m <= 0.1;
}

double
aw_power_energy_for_mass (const AwPowerCurve *curve, double mass_kg)
{
  if (!curve || !mass_ok (mass_kg))
    return NAN;
  if (curve->model != AW_POWER_MEASURED
      && (!mass_ok (curve->ref_mass_kg) || !isfinite (curve->ref_velocity_mps)
          || curve->ref_velocity_mps <= 0.0))
    return NAN;
  double e_ref = 0.5 * curve->ref_mass_kg * curve->ref_velocity_mps * curve->ref_velocity_mps;

  switch (curve->model)
    {
    case AW_POWER_CONSTANT_ENERGY:
      return e_ref;
    case AW_POWER_CONSTANT_VELOCITY:
      return 0.5 * mass_kg * curve->ref_velocity_mps * curve->ref_velocity_mps;
    case AW_POWER_CREEP:
      /* compounding: every +0.1 g multiplies the energy by (1 + pct/100), from any start */
      if (!isfinite (curve->creep_pct_per_01g) || curve->creep_pct_per_01g <= -100.0
          || curve->creep_pct_per_01g > 1000.0)
        return NAN;
      return e_ref * pow (1.0 + curve->creep_pct_per_01g / 100.0,
                          (mass_kg - curve->ref_mass_kg) / AW_TENTH_GRAM_KG);
    case AW_POWER_MEASURED:
      {
        /* nearest measured masses below and above (equal masses averaged) */
        double m_lo = -INFINITY, m_hi = INFINITY;
        double e_lo = 0.0, e_hi = 0.0;
        int n_lo = 0, n_hi = 0;
        if (!curve->points || curve->n_points == 0)
          return NAN;
        for (size_t i = 0; i < curve->n_points; i++)
          {
            const AwPowerPoint *p = &curve->points[i];
            if (!mass_ok (p->mass_kg) || !isfinite (p->velocity_mps) || p->velocity_mps <= 0.0)
              return NAN;
          }
        for (size_t i = 0; i < curve->n_points; i++)
          {
            const AwPowerPoint *p = &curve->points[i];
            double e = 0.5 * p->mass_kg * p->velocity_mps * p->velocity_mps;
            if (p->mass_kg <= mass_kg)
              {
                if (p->mass_kg > m_lo)
                  {
                    m_lo = p->mass_kg;
                    e_lo = e;
                    n_lo = 1;
                  }
                else if (p->mass_kg == m_lo)
                  e_lo += e, n_lo++;
              }
            if (p->mass_kg >= mass_kg)
              {
                if (p->mass_kg < m_hi)
                  {
                    m_hi = p->mass_kg;
                    e_hi = e;
                    n_hi = 1;
                  }
                else if (p->mass_kg == m_hi)
                  e_hi += e, n_hi++;
              }
          }
        if (n_lo)
          e_lo /= n_lo;
        if (n_hi)
          e_hi /= n_hi;
        if (!n_lo)
          return e_hi;             /* lighter than every point: held at the lightest */
        if (!n_hi)
          return e_lo;             /* heavier than every point: held at the heaviest */
        if (m_hi == m_lo)
          return e_lo;
        return e_lo + (e_hi - e_lo) * (mass_kg - m_lo) / (m_hi - m_lo);
      }
    default:
      return NAN;
    }
}

double
aw_power_velocity_for_mass (const AwPowerCurve *curve, double mass_kg)
{
  double e = aw_power_energy_for_mass (curve, mass_kg);
  if (!isfinite (e) || e <= 0.0)
    return NAN;
  return sqrt (2.0 * e / mass_kg);
}

/* ---- site classes and the BB recommendation ---- */

static bool
limit_set (const AwSiteClass *site)
{
  return site && isfinite (site->energy_limit_j) && site->energy_limit_j > 0.0;
}

AwCompliance
aw_site_check (const AwSiteClass *site, const AwPowerCurve *curve, double used_mass_kg,
               double *chrono_energy_j)
{
  double m = used_mass_kg;
  if (site && isfinite (site->chrono_mass_kg) && site->chrono_mass_kg > 0.0)
    m = site->chrono_mass_kg;
  double e = aw_power_energy_for_mass (curve, m);
  if (chrono_energy_j)
    *chrono_energy_j = e;
  if (!limit_set (site) || !isfinite (e))
    return AW_COMPLIANCE_UNKNOWN;
  /* limits are absolute: no tolerance */
  return e > site->energy_limit_j ? AW_COMPLIANCE_OVER : AW_COMPLIANCE_UNDER;
}

void
aw_recommendation_clear (AwRecommendation *rec)
{
  free (rec->rows);
  rec->rows = NULL;
  rec->n_rows = 0;
  rec->best = -1;
  rec->reason = AW_RECOMMEND_REASON_NONE;
}

/* Lateral move at dist per 1 m/s more crosswind (second flight); NAN when short. */
static double
drift_per_mps_at (const AwShot *shot, double dist)
{
  AwFlightOptions fo;
  AwTrajectory a = { 0 }, w = { 0 };
  AwShot sw = *shot;

  aw_flight_options_init (&fo);
  fo.sample_step_m = 0.0;
  fo.keep_samples = false;
  fo.max_distance_m = dist;
  sw.wind[1] += 1.0;
  if (aw_flight_run (shot, &fo, &a) != AW_FLIGHT_DISTANCE
      || aw_flight_run (&sw, &fo, &w) != AW_FLIGHT_DISTANCE)
    return NAN;
  return (w.end.y - a.end.y) * 100.0;
}

AwAnalysisStatus
aw_recommend (const AwAnalysisInput *base, const AwPowerCurve *curve, const AwSiteClass *site,
              const double *masses_kg, size_t n_masses, AwRecommendation *out)
{
  memset (out, 0, sizeof *out);
  out->best = -1;
  out->reason = AW_RECOMMEND_REASON_NONE;
  out->bad_field = AW_FIELD_NONE;

  if (!base || check_input (base) != AW_FIELD_NONE)
    {
      out->bad_field = base ? check_input (base) : AW_FIELD_SHOT;
      return AW_ANALYSIS_BAD_INPUT;
    }
  if (!curve || !isfinite (aw_power_energy_for_mass (curve, base->shot.mass_kg)))
    {
      out->bad_field = AW_FIELD_POWER_CURVE;
      return AW_ANALYSIS_BAD_INPUT;
    }
  if (site && ((!isnan (site->energy_limit_j) && !isfinite (site->energy_limit_j))
               || (!isnan (site->chrono_mass_kg) && !isfinite (site->chrono_mass_kg))
               || (site->chrono_mass_kg > 0.0 && !mass_ok (site->chrono_mass_kg))
               || (!isnan (site->min_engagement_m) && !isfinite (site->min_engagement_m))))
    {
      out->bad_field = AW_FIELD_SITE;
      return AW_ANALYSIS_BAD_INPUT;
    }
  if (!masses_kg || n_masses == 0 || n_masses > 64)
    {
      out->bad_field = AW_FIELD_MASSES;
      return AW_ANALYSIS_BAD_INPUT;
    }
  for (size_t i = 0; i < n_masses; i++)
    if (!isfinite (masses_kg[i]) || masses_kg[i] < 0.01e-3 || masses_kg[i] > 5e-3)
      {
        out->bad_field = AW_FIELD_MASSES;
        return AW_ANALYSIS_BAD_INPUT;
      }

  out->rows = calloc (n_masses, sizeof *out->rows);
  if (!out->rows)
    return AW_ANALYSIS_FLIGHT_FAILED;
  out->n_rows = n_masses;

  for (size_t i = 0; i < n_masses; i++)
    {
      AwRecommendRow *row = &out->rows[i];
      AwAnalysisInput in = *base;

      row->mass_kg = masses_kg[i];
      row->velocity_mps = aw_power_velocity_for_mass (curve, row->mass_kg);
      row->energy_j = aw_power_energy_for_mass (curve, row->mass_kg);
      row->compliance = aw_site_check (site, curve, row->mass_kg, &row->chrono_energy_j);
      row->energy_over_limit = limit_set (site) && row->energy_j > site->energy_limit_j;
      row->drift_30m_cm_per_mps = NAN;
      in.shot.mass_kg = row->mass_kg;
      in.shot.velocity_mps = row->velocity_mps;
      in.hop_mode = AW_HOP_MODE_AUTO;
      aw_auto_hop (&in, &row->band);
      if (row->band.status == AW_ANALYSIS_OK || row->band.status == AW_ANALYSIS_NO_BAND)
        {
          AwShot s = in.shot;
          s.spin_rad_s = row->band.spin_rad_s;
          s.elevation_rad = row->band.elevation_rad;
          row->drift_30m_cm_per_mps = drift_per_mps_at (&s, 30.0);
        }
    }

  /* candidates: a band, compliant by the site's convention (or no limit), and not over the
   * limit with the BB itself (a creeping replica may pass with the chrono BB and not with this) */
  double longest = -1.0;
  for (size_t i = 0; i < n_masses; i++)
    {
      const AwRecommendRow *r = &out->rows[i];
      if (r->band.status == AW_ANALYSIS_OK && r->compliance != AW_COMPLIANCE_OVER
          && !r->energy_over_limit && r->band.band_range_m > longest)
        {
          longest = r->band.band_range_m;
          out->best = (int) i;
        }
    }
  if (out->best < 0)
    return AW_ANALYSIS_OK;
  out->reason = AW_RECOMMEND_REASON_LONGEST_BAND;
  {
    int longest_i = out->best;
    double drift_best = fabs (out->rows[longest_i].drift_30m_cm_per_mps);
    for (size_t i = 0; i < n_masses; i++)
      {
        const AwRecommendRow *r = &out->rows[i];
        if ((int) i == longest_i || r->band.status != AW_ANALYSIS_OK
            || r->compliance == AW_COMPLIANCE_OVER || r->energy_over_limit)
          continue;
        double d = fabs (r->drift_30m_cm_per_mps);
        if (r->band.band_range_m >= 0.98 * longest && isfinite (d)
            && (!isfinite (drift_best) || d < drift_best))
          {
            drift_best = d;
            out->best = (int) i;
            out->reason = AW_RECOMMEND_REASON_LESS_DRIFT;
          }
      }
  }
  out->rows[out->best].recommended = true;
  return AW_ANALYSIS_OK;
}
