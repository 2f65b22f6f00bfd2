/* aw-flight.c: 3-D flight of a spinning BB with an adaptive Dormand–Prince 5(4) integrator
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The integrator is the embedded pair of Dormand & Prince (1980, J. Comput. Appl. Math. 6:19) with
 * the continuous extension and step-size control of Hairer, Nørsett & Wanner, "Solving Ordinary
 * Differential Equations I", 2nd ed., §II.4–II.6 (DOPRI5). Events (ground, downrange distances,
 * apex) are located on the dense output by a safeguarded secant (Illinois) iteration.
 */
#include "aw-flight.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#define N AW_FLIGHT_STATE_DIM

/* state layout */
enum { PX, PY, PZ, VX, VY, VZ, WX, WY, WZ };

void
aw_shot_init (AwShot *shot)
{
  memset (shot, 0, sizeof *shot);
  shot->mass_kg = 0.20e-3;
  shot->diameter_m = 5.95e-3;
  shot->velocity_mps = 90.0;
  shot->elevation_rad = 0.0;
  shot->height_m = 1.5;
  shot->spin_rad_s = 0.0;
  shot->hop_tilt_rad = 0.0;
  shot->gravity = AW_G0;
  shot->air.density = 1.225;
  shot->air.viscosity = 1.7894e-5;
  aw_aero_model_init (&shot->aero);
}

static inline bool
in_range (double v, double lo, double hi)
{
  return isfinite (v) && v >= lo && v <= hi;
}

AwShotStatus
aw_shot_validate (const AwShot *shot)
{
  const AwAeroModel *m = &shot->aero;

  if (!in_range (shot->mass_kg, 0.01e-3, 5e-3))
    return AW_SHOT_BAD_MASS;
  if (!in_range (shot->diameter_m, 1e-3, 20e-3))
    return AW_SHOT_BAD_DIAMETER;
  if (!in_range (shot->velocity_mps, 0.0, 300.0) || shot->velocity_mps == 0.0)
    return AW_SHOT_BAD_VELOCITY;
  if (!in_range (shot->elevation_rad, -M_PI / 2, M_PI / 2))
    return AW_SHOT_BAD_ELEVATION;
  if (!in_range (shot->height_m, 0.0, 100.0))
    return AW_SHOT_BAD_HEIGHT;
  if (!in_range (shot->spin_rad_s, 0.0, 1e5))
    return AW_SHOT_BAD_SPIN;
  if (!in_range (shot->hop_tilt_rad, -M_PI / 2, M_PI / 2))
    return AW_SHOT_BAD_TILT;
  for (int i = 0; i < 3; i++)
    if (!in_range (shot->wind[i], -50.0, 50.0))
      return AW_SHOT_BAD_WIND;
  if (!in_range (shot->gravity, 0.1, 30.0))
    return AW_SHOT_BAD_GRAVITY;
  if (!in_range (shot->air.density, 0.01, 5.0))
    return AW_SHOT_BAD_DENSITY;
  if (!in_range (shot->air.viscosity, 1e-6, 1e-3))
    return AW_SHOT_BAD_VISCOSITY;
  if ((unsigned) m->drag >= AW_N_DRAG_MODELS || (unsigned) m->lift >= AW_N_LIFT_MODELS
      || !in_range (m->drag_cd, 0.0, 10.0) || !in_range (m->lift_slope, 0.0, 10.0)
      || !in_range (m->spin_decay_cm, 0.0, 10.0) || !in_range (m->inertia_factor, 0.01, 1.0)
      || !in_range (m->lift_factor, 0.0, 100.0) || !in_range (m->drag_factor, 0.0, 100.0)
      || !in_range (m->spin_decay_factor, 0.0, 100.0))
    return AW_SHOT_BAD_MODEL;
  return AW_SHOT_OK;
}

/* Unit spin axis at the muzzle: backspin (toward the shooter's right, −y, for a level bore)
 * rolled clockwise, seen from behind, by the hop tilt about the bore direction. */
static void
spin_axis (const AwShot *shot, double axis[3])
{
  double se = sin (shot->elevation_rad), ce = cos (shot->elevation_rad);
  double st = sin (shot->hop_tilt_rad), ct = cos (shot->hop_tilt_rad);
  /* right = (0, −1, 0); up perpendicular to the bore = (−se, 0, ce); axis = ct·right − st·up */
  axis[0] = st * se;
  axis[1] = -ct;
  axis[2] = -st * ce;
}

void
aw_shot_initial_state (const AwShot *shot, double y[N])
{
  double axis[3];
  double v = shot->velocity_mps;

  spin_axis (shot, axis);
  y[PX] = 0.0;
  y[PY] = 0.0;
  y[PZ] = shot->height_m;
  y[VX] = v * cos (shot->elevation_rad);
  y[VY] = 0.0;
  y[VZ] = v * sin (shot->elevation_rad);
  y[WX] = shot->spin_rad_s * axis[0];
  y[WY] = shot->spin_rad_s * axis[1];
  y[WZ] = shot->spin_rad_s * axis[2];
}

/* Constants of the right-hand side that depend on the shot only. */
typedef struct
{
  const AwShot *shot;
  double r;           /* radius */
  double re_per_v;    /* ρ·d/μ */
  double drag_k;      /* ½ρA/m: acceleration per C_D·V² */
  double decay_k;     /* c_M·factor·π·ρ·r²/(2κm): spin decay rate per unit speed */
  double lift_factor;
} RhsConst;

static void
rhs_const_init (RhsConst *k, const AwShot *shot)
{
  double r = 0.5 * shot->diameter_m;
  double area = M_PI * r * r;
  k->shot = shot;
  k->r = r;
  k->re_per_v = shot->air.density * shot->diameter_m / shot->air.viscosity;
  k->drag_k = 0.5 * shot->air.density * area / shot->mass_kg;
  k->decay_k = shot->aero.spin_decay_cm * shot->aero.spin_decay_factor * M_PI * shot->air.density
               * r * r / (2.0 * shot->aero.inertia_factor * shot->mass_kg);
  k->lift_factor = shot->aero.lift_factor;
}

static inline double
clift_fast (double re)
{
  /* The subcritical pieces used in flight, with pow(10, ·) written as exp; other Re fall back. */
  if (re > 1.2e4 && re <= 4.4e4)
    {
      double w = log10 (re);
      return exp (M_LN10 * (-1.9181 + w * (0.6370 - 0.0636 * w)));
    }
  if (re > 1.5e3 && re <= 1.2e4)
    {
      double w = log10 (re);
      return exp (M_LN10 * (-2.4571 + w * (2.5558 + w * (-0.9295 + 0.1049 * w))));
    }
  if (re > 4.4e4 && re <= 3.38e5)
    {
      double w = log10 (re);
      return exp (M_LN10 * (-4.3390 + w * (1.5809 - 0.1546 * w)));
    }
  return aw_drag_clift (re);
}

static inline void
rhs_eval (const RhsConst *k, const double *y, double *f)
{
  const AwShot *shot = k->shot;
  double vr[3] = { y[VX] - shot->wind[0], y[VY] - shot->wind[1], y[VZ] - shot->wind[2] };
  double V2 = vr[0] * vr[0] + vr[1] * vr[1] + vr[2] * vr[2];
  double V = sqrt (V2);

  f[PX] = y[VX];
  f[PY] = y[VY];
  f[PZ] = y[VZ];
  f[VX] = 0.0;
  f[VY] = 0.0;
  f[VZ] = -shot->gravity;
  f[WX] = f[WY] = f[WZ] = 0.0;

  if (V < 1e-9)
    return;

  /* drag */
  double cd;
  if (shot->aero.drag == AW_DRAG_CLIFT)
    cd = clift_fast (k->re_per_v * V) * shot->aero.drag_factor;
  else
    cd = aw_aero_drag_coefficient (&shot->aero, k->re_per_v * V);
  double a_d = k->drag_k * cd * V;
  f[VX] -= a_d * vr[0];
  f[VY] -= a_d * vr[1];
  f[VZ] -= a_d * vr[2];

  /* Magnus lift along ω × v_r */
  double c[3] = { y[WY] * vr[2] - y[WZ] * vr[1],
                  y[WZ] * vr[0] - y[WX] * vr[2],
                  y[WX] * vr[1] - y[WY] * vr[0] };
  double cn = sqrt (c[0] * c[0] + c[1] * c[1] + c[2] * c[2]);
  if (cn > 1e-12 * V2 && k->lift_factor > 0.0)
    {
      double s = k->r * cn / V2;
      double cl = aw_aero_lift_coefficient (&shot->aero, s) * k->lift_factor;
      double a_l = k->drag_k * V2 * cl / cn;
      f[VX] += a_l * c[0];
      f[VY] += a_l * c[1];
      f[VZ] += a_l * c[2];
    }

  /* spin decay: dω/dt = −(c_M·π·ρ·r²·V/(2κm))·ω */
  double rate = k->decay_k * V;
  f[WX] = -rate * y[WX];
  f[WY] = -rate * y[WY];
  f[WZ] = -rate * y[WZ];
}

void
aw_flight_rhs (const AwShot *shot, const double y[N], double dydt[N])
{
  RhsConst k;
  rhs_const_init (&k, shot);
  rhs_eval (&k, y, dydt);
}

/* ---- hop conversion ---- */

/* |â × v̂_r| at the muzzle, and the air-relative speed. */
static void
muzzle_geometry (const AwShot *shot, double *sin_angle, double *v_rel)
{
  double y[N], axis[3], vr[3];
  spin_axis (shot, axis);
  aw_shot_initial_state (shot, y);
  for (int i = 0; i < 3; i++)
    vr[i] = y[VX + i] - shot->wind[i];
  double V = sqrt (vr[0] * vr[0] + vr[1] * vr[1] + vr[2] * vr[2]);
  double c[3] = { axis[1] * vr[2] - axis[2] * vr[1],
                  axis[2] * vr[0] - axis[0] * vr[2],
                  axis[0] * vr[1] - axis[1] * vr[0] };
  double cn = sqrt (c[0] * c[0] + c[1] * c[1] + c[2] * c[2]);
  *v_rel = V;
  *sin_angle = V > 0.0 ? cn / V : 0.0;
}

double
aw_shot_lift_ratio_for_spin (const AwShot *shot, double spin_rad_s)
{
  double sa, V;
  if (aw_shot_validate (shot) != AW_SHOT_OK || !(spin_rad_s >= 0.0))
    return NAN;
  muzzle_geometry (shot, &sa, &V);
  if (V <= 0.0)
    return 0.0;
  double r = 0.5 * shot->diameter_m;
  double s = r * spin_rad_s * sa / V;
  double cl = aw_aero_lift_coefficient (&shot->aero, s) * shot->aero.lift_factor;
  double area = M_PI * r * r;
  return 0.5 * shot->air.density * area * V * V * cl / (shot->mass_kg * shot->gravity);
}

AwHopStatus
aw_shot_spin_for_lift_ratio (const AwShot *shot, double lift_ratio, double *spin_rad_s)
{
  double sa, V;
  if (aw_shot_validate (shot) != AW_SHOT_OK || !isfinite (lift_ratio) || lift_ratio < 0.0)
    return AW_HOP_BAD_INPUT;
  if (lift_ratio == 0.0)
    {
      *spin_rad_s = 0.0;
      return AW_HOP_OK;
    }
  if (shot->aero.lift == AW_LIFT_OFF || !(shot->aero.lift_factor > 0.0)
      || aw_aero_lift_coefficient_max (&shot->aero) <= 0.0)
    return AW_HOP_NO_LIFT;
  muzzle_geometry (shot, &sa, &V);
  if (!(V > 0.0) || !(sa > 1e-9))
    return AW_HOP_NO_LIFT;
  double r = 0.5 * shot->diameter_m;
  double area = M_PI * r * r;
  double cl = lift_ratio * shot->mass_kg * shot->gravity
              / (0.5 * shot->air.density * area * V * V * shot->aero.lift_factor);
  double s = aw_aero_spin_parameter_for_lift (&shot->aero, cl);
  if (s < 0.0)
    return AW_HOP_UNREACHABLE;
  double w = s * V / (r * sa);
  if (!isfinite (w) || w > 1e5)
    return AW_HOP_UNREACHABLE;
  *spin_rad_s = w;
  return AW_HOP_OK;
}

double
aw_shot_spin_parameter_for_spin (const AwShot *shot, double spin_rad_s)
{
  double sa, V;
  if (aw_shot_validate (shot) != AW_SHOT_OK || !(spin_rad_s >= 0.0) || !isfinite (spin_rad_s))
    return NAN;
  muzzle_geometry (shot, &sa, &V);
  if (!(V > 0.0))
    return NAN;
  return 0.5 * shot->diameter_m * spin_rad_s * sa / V;
}

double
aw_shot_spin_for_spin_parameter (const AwShot *shot, double s)
{
  double sa, V;
  if (aw_shot_validate (shot) != AW_SHOT_OK || !isfinite (s) || s < 0.0)
    return NAN;
  muzzle_geometry (shot, &sa, &V);
  if (!(V > 0.0) || !(sa > 1e-9))
    return NAN;
  return s * V / (0.5 * shot->diameter_m * sa);
}

/* ---- integrator ---- */

void
aw_flight_options_init (AwFlightOptions *opt)
{
  opt->rtol = 1e-6;
  opt->atol = 1e-6;
  opt->sample_step_m = 1.0;
  opt->max_distance_m = 0.0;
  opt->max_time_s = 30.0;
  opt->max_steps = 100000;
  opt->keep_samples = true;
}

/* Dormand–Prince 5(4) tableau (Hairer, Nørsett & Wanner, Table II.5.2). */
static const double A21 = 1.0 / 5;
static const double A31 = 3.0 / 40, A32 = 9.0 / 40;
static const double A41 = 44.0 / 45, A42 = -56.0 / 15, A43 = 32.0 / 9;
static const double A51 = 19372.0 / 6561, A52 = -25360.0 / 2187, A53 = 64448.0 / 6561,
                    A54 = -212.0 / 729;
static const double A61 = 9017.0 / 3168, A62 = -355.0 / 33, A63 = 46732.0 / 5247, A64 = 49.0 / 176,
                    A65 = -5103.0 / 18656;
static const double A71 = 35.0 / 384, A73 = 500.0 / 1113, A74 = 125.0 / 192, A75 = -2187.0 / 6784,
                    A76 = 11.0 / 84;
static const double E1 = 71.0 / 57600, E3 = -71.0 / 16695, E4 = 71.0 / 1920,
                    E5 = -17253.0 / 339200, E6 = 22.0 / 525, E7 = -1.0 / 40;
/* continuous extension of order 4 (DOPRI5, contd5) */
static const double D1 = -12715105075.0 / 11282082432.0, D3 = 87487479700.0 / 32700410799.0,
                    D4 = -10690763975.0 / 1880347072.0, D5 = 701980252875.0 / 199316789632.0,
                    D6 = -1453857185.0 / 822651844.0, D7 = 69997945.0 / 29380423.0;

typedef struct
{
  double t0, h;
  double r1[N], r2[N], r3[N], r4[N], r5[N];
} Dense;

static inline double
dense_comp (const Dense *d, int i, double theta)
{
  double t1 = 1.0 - theta;
  return d->r1[i] + theta * (d->r2[i] + t1 * (d->r3[i] + theta * (d->r4[i] + t1 * d->r5[i])));
}

static void
dense_state (const Dense *d, double theta, double *y)
{
  for (int i = 0; i < N; i++)
    y[i] = dense_comp (d, i, theta);
}

/* Root of dense_comp(i, θ) − target on [a, b] with a sign change; Illinois method. */
static double
dense_root (const Dense *d, int i, double target, double a, double b)
{
  double fa = dense_comp (d, i, a) - target;
  double fb = dense_comp (d, i, b) - target;
  int side = 0;

  if (fa == 0.0)
    return a;
  if (fb == 0.0)
    return b;
  for (int it = 0; it < 60; it++)
    {
      double c = (a * fb - b * fa) / (fb - fa);
      if (!(c > a && c < b))
        c = 0.5 * (a + b);
      double fc = dense_comp (d, i, c) - target;
      if (fc == 0.0 || (b - a) * d->h < 1e-13)
        return c;
      if ((fc > 0.0) == (fb > 0.0))
        {
          b = c;
          fb = fc;
          if (side == -1)
            fa *= 0.5;
          side = -1;
        }
      else
        {
          a = c;
          fa = fc;
          if (side == +1)
            fb *= 0.5;
          side = +1;
        }
      if ((b - a) * d->h < 1e-13)
        break;
    }
  return 0.5 * (a + b);
}

static void
fill_sample (const AwShot *shot, double t, const double *y, AwSample *s)
{
  s->t = t;
  s->x = y[PX];
  s->y = y[PY];
  s->z = y[PZ];
  s->vx = y[VX];
  s->vy = y[VY];
  s->vz = y[VZ];
  s->speed = sqrt (y[VX] * y[VX] + y[VY] * y[VY] + y[VZ] * y[VZ]);
  s->spin = sqrt (y[WX] * y[WX] + y[WY] * y[WY] + y[WZ] * y[WZ]);
  s->energy = 0.5 * shot->mass_kg * s->speed * s->speed;
}

static bool
push_sample (AwTrajectory *traj, const AwSample *s, bool keep)
{
  if (!keep)
    return true;
  if (traj->n_samples == traj->samples_alloc)
    {
      size_t n = traj->samples_alloc ? 2 * traj->samples_alloc : 128;
      AwSample *p = realloc (traj->samples, n * sizeof *p);
      if (!p)
        return false;
      traj->samples = p;
      traj->samples_alloc = n;
    }
  traj->samples[traj->n_samples++] = *s;
  return true;
}

static double
err_norm (const double *y0, const double *y1, const double *e, double h, double rtol, double atol)
{
  double sum = 0.0;
  for (int i = 0; i < N; i++)
    {
      double sk = atol + rtol * fmax (fabs (y0[i]), fabs (y1[i]));
      double q = h * e[i] / sk;
      sum += q * q;
    }
  return sqrt (sum / N);
}

static bool
all_finite (const double *y)
{
  for (int i = 0; i < N; i++)
    if (!isfinite (y[i]))
      return false;
  return true;
}

/* Emit a sample; false when the callback asks to stop or memory ran out (code in *status). */
static bool
emit (const AwShot *shot, AwTrajectory *traj, bool keep, double t, const double *y,
      AwSampleFunc func, void *user_data, AwFlightStatus *status)
{
  AwSample s;
  fill_sample (shot, t, y, &s);
  if (!push_sample (traj, &s, keep))
    {
      *status = AW_FLIGHT_NO_MEMORY;
      return false;
    }
  if (func && !func (&s, user_data))
    {
      *status = AW_FLIGHT_STOPPED;
      return false;
    }
  return true;
}

static void
finish (const AwShot *shot, AwTrajectory *traj, double t, const double *y, bool keep)
{
  AwSample s;
  fill_sample (shot, t, y, &s);
  traj->end = s;
  traj->time_of_flight = t;
  traj->ground_distance = s.x;
  traj->ground_drift = s.y;
  traj->impact_speed = s.speed;
  traj->impact_energy = s.energy;
  traj->impact_spin = s.spin;
  if (keep && !(traj->n_samples > 0 && fabs (traj->samples[traj->n_samples - 1].t - t) < 1e-12))
    push_sample (traj, &s, keep);
}

AwFlightStatus
aw_flight_run (const AwShot *shot, const AwFlightOptions *opt, AwTrajectory *traj)
{
  return aw_flight_run_full (shot, opt, traj, NULL, NULL);
}

/* One event found inside a step: parameter θ on the dense output, kind, level. */
typedef struct
{
  double theta;
  AwEventKind kind;
  int level;
} StepEvent;

/* Height crossings and the apex inside [0, θ_end] of the step, sorted by θ. above[] holds for
 * each level whether z ≥ level at the start of the step and is updated to θ_end. */
static int
step_events (const Dense *d, const AwFlightEvents *ev, bool *above, double theta_end,
             double theta_apex, StepEvent *out)
{
  double cuts[3];
  int n_cuts = 0, n = 0;

  cuts[n_cuts++] = 0.0;
  /* split at a sign change of vz so that each piece is monotonic in z */
  {
    double va = dense_comp (d, VZ, 0.0), vb = dense_comp (d, VZ, theta_end);
    if (theta_apex > 0.0 && theta_apex < theta_end)
      cuts[n_cuts++] = theta_apex;
    else if (va < 0.0 && vb > 0.0)
      {
        double th = dense_root (d, VZ, 0.0, 0.0, theta_end);
        if (th > 0.0 && th < theta_end)
          cuts[n_cuts++] = th;
      }
  }
  cuts[n_cuts++] = theta_end;

  for (size_t l = 0; l < ev->n_levels; l++)
    {
      double lv = ev->levels[l];
      for (int c = 1; c < n_cuts; c++)
        {
          double zb = dense_comp (d, PZ, cuts[c]);
          bool ab = zb >= lv;
          if (ab == above[l])
            continue;
          double th = dense_root (d, PZ, lv, cuts[c - 1], cuts[c]);
          out[n].theta = th;
          out[n].kind = ab ? AW_EVENT_HEIGHT_UP : AW_EVENT_HEIGHT_DOWN;
          out[n].level = (int) l;
          n++;
          above[l] = ab;
        }
    }
  if (ev->apex && theta_apex >= 0.0)
    {
      out[n].theta = theta_apex;
      out[n].kind = AW_EVENT_APEX;
      out[n].level = -1;
      n++;
    }
  /* insertion sort by θ; at equal θ a crossing up comes before the apex before a crossing down */
  for (int i = 1; i < n; i++)
    {
      StepEvent e = out[i];
      int j = i - 1;
      while (j >= 0 && (out[j].theta > e.theta
                        || (out[j].theta == e.theta && out[j].kind > e.kind)))
        {
          out[j + 1] = out[j];
          j--;
        }
      out[j + 1] = e;
    }
  return n;
}

/* Emits the fixed-distance samples of the step up to θ_lim. */
static bool
step_samples (const AwShot *shot, AwTrajectory *traj, bool keep, const Dense *d, double x0,
              double step, double *next_x, double *lo, double theta_lim, AwSampleFunc func,
              void *user_data, AwFlightStatus *status)
{
  double yt[N];
  if (!(step > 0.0))
    return true;
  double x_lim = dense_comp (d, PX, theta_lim);
  while (*next_x <= x_lim && x0 < *next_x)
    {
      double th = dense_root (d, PX, *next_x, *lo, theta_lim);
      dense_state (d, th, yt);
      yt[PX] = *next_x;
      if (!emit (shot, traj, keep, d->t0 + th * d->h, yt, func, user_data, status))
        return false;
      *lo = th;
      *next_x += step;
    }
  return true;
}

static AwFlightStatus
flight_run (const AwShot *shot, const AwFlightOptions *opt_in, AwTrajectory *traj,
            AwSampleFunc func, void *user_data, const AwFlightEvents *ev);

AwFlightStatus
aw_flight_run_full (const AwShot *shot, const AwFlightOptions *opt_in, AwTrajectory *traj,
                    AwSampleFunc func, void *user_data)
{
  return flight_run (shot, opt_in, traj, func, user_data, NULL);
}

AwFlightStatus
aw_flight_run_events (const AwShot *shot, const AwFlightOptions *opt, AwTrajectory *traj,
                      AwSampleFunc func, void *user_data, const AwFlightEvents *events)
{
  return flight_run (shot, opt, traj, func, user_data, events);
}

static AwFlightStatus
flight_run (const AwShot *shot, const AwFlightOptions *opt_in, AwTrajectory *traj,
            AwSampleFunc func, void *user_data, const AwFlightEvents *ev)
{
  AwFlightOptions opt;
  RhsConst kc;
  double y[N], y1[N], yt[N], k1[N], k2[N], k3[N], k4[N], k5[N], k6[N], k7[N], e[N];
  double t = 0.0, h, err_old = 1e-4;
  bool keep, last_rejected = false;
  AwFlightStatus status = AW_FLIGHT_GROUND;
  Dense d;

  if (opt_in)
    opt = *opt_in;
  else
    aw_flight_options_init (&opt);
  keep = opt.keep_samples;

  AwSample *saved = traj->samples;
  size_t saved_alloc = traj->samples_alloc;
  memset (traj, 0, sizeof *traj);
  traj->samples = saved;
  traj->samples_alloc = saved_alloc;
  traj->n_samples = 0;

  traj->shot_status = aw_shot_validate (shot);
  if (traj->shot_status != AW_SHOT_OK)
    return traj->status = AW_FLIGHT_BAD_INPUT;
  if (!(opt.rtol > 0.0) || !(opt.atol > 0.0) || !isfinite (opt.rtol) || !isfinite (opt.atol)
      || !(opt.max_time_s > 0.0) || !isfinite (opt.max_time_s) || opt.max_steps <= 0
      || !isfinite (opt.sample_step_m) || !isfinite (opt.max_distance_m)
      || (opt.sample_step_m > 0.0 && opt.sample_step_m < 1e-3))
    return traj->status = AW_FLIGHT_BAD_INPUT;

  bool above[AW_FLIGHT_MAX_LEVELS];
  if (ev && ev->n_levels > 0)
    {
      if (ev->n_levels > AW_FLIGHT_MAX_LEVELS || ev->levels == NULL)
        return traj->status = AW_FLIGHT_BAD_INPUT;
      for (size_t l = 0; l < ev->n_levels; l++)
        if (!isfinite (ev->levels[l]))
          return traj->status = AW_FLIGHT_BAD_INPUT;
    }
  if (ev && ev->func == NULL)
    ev = NULL;

  rhs_const_init (&kc, shot);
  aw_shot_initial_state (shot, y);
  if (ev)
    for (size_t l = 0; l < ev->n_levels; l++)
      above[l] = y[PZ] >= ev->levels[l];
  rhs_eval (&kc, y, k1);
  traj->rhs_evaluations = 1;
  traj->apex_height = y[PZ];
  traj->apex_distance = 0.0;

  double step = opt.sample_step_m;
  double next_x = 0.0;
  /* the muzzle sample */
  if (step > 0.0)
    {
      if (!emit (shot, traj, keep, t, y, func, user_data, &status))
        return traj->status = status;
      next_x = step;
    }

  /* already on the ground, shooting down */
  if (y[PZ] <= 0.0 && y[VZ] <= 0.0)
    {
      finish (shot, traj, t, y, keep);
      return traj->status = AW_FLIGHT_GROUND;
    }

  /* initial step (Hairer's HINIT, simplified) */
  {
    double d0 = 0, d1 = 0, d2 = 0, h0;
    for (int i = 0; i < N; i++)
      {
        double sk = opt.atol + opt.rtol * fabs (y[i]);
        d0 += (y[i] / sk) * (y[i] / sk);
        d1 += (k1[i] / sk) * (k1[i] / sk);
      }
    d0 = sqrt (d0 / N);
    d1 = sqrt (d1 / N);
    h0 = (d0 < 1e-10 || d1 < 1e-10) ? 1e-6 : 0.01 * d0 / d1;
    h0 = fmin (h0, opt.max_time_s);
    for (int i = 0; i < N; i++)
      yt[i] = y[i] + h0 * k1[i];
    rhs_eval (&kc, yt, k2);
    traj->rhs_evaluations++;
    for (int i = 0; i < N; i++)
      {
        double sk = opt.atol + opt.rtol * fabs (y[i]);
        double q = (k2[i] - k1[i]) / sk;
        d2 += q * q;
      }
    d2 = sqrt (d2 / N) / h0;
    double dm = fmax (d1, d2);
    double h1 = dm <= 1e-15 ? fmax (1e-6, h0 * 1e-3) : pow (0.01 / dm, 1.0 / 5.0);
    h = fmin (100 * h0, h1);
  }

  const double safe = 0.9, fac_min = 0.2, fac_max = 10.0, beta = 0.04;
  const double expo1 = 0.2 - beta * 0.75;

  for (;;)
    {
      if (traj->steps_accepted + traj->steps_rejected >= opt.max_steps)
        return traj->status = AW_FLIGHT_TOO_MANY_STEPS;
      bool time_end = false;
      if (t + h >= opt.max_time_s)
        {
          h = opt.max_time_s - t;
          time_end = true;
        }
      if (h < 1e-12 * fmax (1.0, fabs (t)))
        return traj->status = AW_FLIGHT_STEP_UNDERFLOW;

      for (int i = 0; i < N; i++)
        yt[i] = y[i] + h * A21 * k1[i];
      rhs_eval (&kc, yt, k2);
      for (int i = 0; i < N; i++)
        yt[i] = y[i] + h * (A31 * k1[i] + A32 * k2[i]);
      rhs_eval (&kc, yt, k3);
      for (int i = 0; i < N; i++)
        yt[i] = y[i] + h * (A41 * k1[i] + A42 * k2[i] + A43 * k3[i]);
      rhs_eval (&kc, yt, k4);
      for (int i = 0; i < N; i++)
        yt[i] = y[i] + h * (A51 * k1[i] + A52 * k2[i] + A53 * k3[i] + A54 * k4[i]);
      rhs_eval (&kc, yt, k5);
      for (int i = 0; i < N; i++)
        yt[i] = y[i] + h * (A61 * k1[i] + A62 * k2[i] + A63 * k3[i] + A64 * k4[i] + A65 * k5[i]);
      rhs_eval (&kc, yt, k6);
      for (int i = 0; i < N; i++)
        y1[i] = y[i] + h * (A71 * k1[i] + A73 * k3[i] + A74 * k4[i] + A75 * k5[i] + A76 * k6[i]);
      rhs_eval (&kc, y1, k7);
      traj->rhs_evaluations += 6;

      for (int i = 0; i < N; i++)
        e[i] = E1 * k1[i] + E3 * k3[i] + E4 * k4[i] + E5 * k5[i] + E6 * k6[i] + E7 * k7[i];
      double err = err_norm (y, y1, e, h, opt.rtol, opt.atol);

      if (!isfinite (err))
        {
          /* a non-finite trial: shrink hard and retry */
          traj->steps_rejected++;
          h *= 0.1;
          last_rejected = true;
          if (!all_finite (y))
            return traj->status = AW_FLIGHT_NOT_FINITE;
          continue;
        }

      double fac11 = pow (err, expo1);
      double fac = fac11 / pow (err_old, beta);
      fac = fmax (1.0 / fac_max, fmin (1.0 / fac_min, fac / safe));
      double h_new = h / fac;

      if (err > 1.0)
        {
          traj->steps_rejected++;
          h = h / fmin (1.0 / fac_min, fac11 / safe);
          last_rejected = true;
          continue;
        }

      /* accepted: build the dense output on [t, t + h] */
      traj->steps_accepted++;
      err_old = fmax (err, 1e-4);
      d.t0 = t;
      d.h = h;
      for (int i = 0; i < N; i++)
        {
          double ydiff = y1[i] - y[i];
          double bspl = h * k1[i] - ydiff;
          d.r1[i] = y[i];
          d.r2[i] = ydiff;
          d.r3[i] = bspl;
          d.r4[i] = ydiff - h * k7[i] - bspl;
          d.r5[i] = h * (D1 * k1[i] + D3 * k3[i] + D4 * k4[i] + D5 * k5[i] + D6 * k6[i]
                         + D7 * k7[i]);
        }

      /* where does this step end? */
      double theta_end = 1.0;
      AwFlightStatus end_status = AW_FLIGHT_GROUND;
      bool ended = false;
      if (y[PZ] > 0.0 && y1[PZ] <= 0.0)
        {
          theta_end = dense_root (&d, PZ, 0.0, 0.0, 1.0);
          end_status = AW_FLIGHT_GROUND;
          ended = true;
        }
      else if (y[PZ] == 0.0 && y1[PZ] <= 0.0 && y[VZ] <= 0.0)
        {
          theta_end = 0.0;
          ended = true;
        }
      if (opt.max_distance_m > 0.0 && y1[PX] >= opt.max_distance_m && y[PX] < opt.max_distance_m)
        {
          double th = dense_root (&d, PX, opt.max_distance_m, 0.0, 1.0);
          if (!ended || th < theta_end)
            {
              theta_end = th;
              end_status = AW_FLIGHT_DISTANCE;
              ended = true;
            }
        }
      if (!ended && time_end)
        {
          end_status = AW_FLIGHT_TIME_LIMIT;
          ended = true;
        }

      /* apex (vz from + to −) inside [0, θ_end] */
      double theta_apex = -1.0;
      double apex_h_before = traj->apex_height, apex_x_before = traj->apex_distance;
      if (y[VZ] > 0.0 && dense_comp (&d, VZ, theta_end) <= 0.0)
        {
          double th = dense_root (&d, VZ, 0.0, 0.0, theta_end);
          double zh = dense_comp (&d, PZ, th);
          theta_apex = th;
          if (zh > traj->apex_height)
            {
              traj->apex_height = zh;
              traj->apex_distance = dense_comp (&d, PX, th);
            }
        }

      /* fixed-distance samples and events inside [0, θ_end], in order along the step */
      double lo = 0.0;
      if (ev)
        {
          StepEvent se[2 * AW_FLIGHT_MAX_LEVELS + 1];
          int n_se = step_events (&d, ev, above, theta_end, theta_apex, se);
          for (int k = 0; k < n_se; k++)
            {
              AwFlightEvent fe;
              if (!step_samples (shot, traj, keep, &d, y[PX], step, &next_x, &lo, se[k].theta,
                                 func, user_data, &status))
                return traj->status = status;
              dense_state (&d, se[k].theta, yt);
              if (se[k].kind != AW_EVENT_APEX)
                yt[PZ] = ev->levels[se[k].level];
              fe.kind = se[k].kind;
              fe.level = se[k].level;
              fill_sample (shot, t + se[k].theta * h, yt, &fe.state);
              if (!ev->func (&fe, ev->user_data))
                {
                  if (theta_apex > se[k].theta)
                    {
                      traj->apex_height = apex_h_before;
                      traj->apex_distance = apex_x_before;
                    }
                  if (!all_finite (yt))
                    return traj->status = AW_FLIGHT_NOT_FINITE;
                  finish (shot, traj, fe.state.t, yt, keep);
                  if (yt[PZ] > traj->apex_height)
                    {
                      traj->apex_height = yt[PZ];
                      traj->apex_distance = yt[PX];
                    }
                  return traj->status = AW_FLIGHT_STOPPED;
                }
            }
        }
      if (!step_samples (shot, traj, keep, &d, y[PX], step, &next_x, &lo, theta_end, func,
                         user_data, &status))
        return traj->status = status;

      if (ended)
        {
          double t_end = t + theta_end * h;
          if (theta_end < 1.0)
            dense_state (&d, theta_end, y1);
          if (end_status == AW_FLIGHT_GROUND)
            y1[PZ] = 0.0;
          else if (end_status == AW_FLIGHT_DISTANCE)
            y1[PX] = opt.max_distance_m;
          if (!all_finite (y1))
            return traj->status = AW_FLIGHT_NOT_FINITE;
          finish (shot, traj, t_end, y1, keep);
          if (y1[PZ] > traj->apex_height)
            {
              traj->apex_height = y1[PZ];
              traj->apex_distance = y1[PX];
            }
          return traj->status = end_status;
        }

      if (!all_finite (y1))
        return traj->status = AW_FLIGHT_NOT_FINITE;
      t += h;
      memcpy (y, y1, sizeof y);
      memcpy (k1, k7, sizeof k1);
      if (last_rejected)
        h_new = fmin (h_new, h);
      last_rejected = false;
      h = h_new;
    }
}

bool
aw_trajectory_at (const AwTrajectory *traj, double x, AwSample *out)
{
  size_t n = traj->n_samples;
  if (n == 0 || !isfinite (x))
    return false;
  const AwSample *s = traj->samples;
  if (x < s[0].x || x > s[n - 1].x)
    return false;
  size_t lo = 0, hi = n - 1;
  while (hi - lo > 1)
    {
      size_t mid = (lo + hi) / 2;
      if (s[mid].x <= x)
        lo = mid;
      else
        hi = mid;
    }
  if (lo == hi || s[hi].x == s[lo].x)
    {
      *out = s[lo];
      return true;
    }
  double f = (x - s[lo].x) / (s[hi].x - s[lo].x);
  if (f < 0.0)
    f = 0.0;
  if (f > 1.0)
    f = 1.0;
#define LERP(field) out->field = s[lo].field + f * (s[hi].field - s[lo].field)
  LERP (t);
  LERP (y);
  LERP (z);
  LERP (vx);
  LERP (vy);
  LERP (vz);
  LERP (speed);
  LERP (spin);
  LERP (energy);
#undef LERP
  out->x = x;
  return true;
}

void
aw_trajectory_clear (AwTrajectory *traj)
{
  free (traj->samples);
  memset (traj, 0, sizeof *traj);
}

const char *
aw_flight_status_name (AwFlightStatus status)
{
  switch (status)
    {
    case AW_FLIGHT_GROUND: return "ground";
    case AW_FLIGHT_DISTANCE: return "distance";
    case AW_FLIGHT_TIME_LIMIT: return "time-limit";
    case AW_FLIGHT_STOPPED: return "stopped";
    case AW_FLIGHT_BAD_INPUT: return "bad-input";
    case AW_FLIGHT_TOO_MANY_STEPS: return "too-many-steps";
    case AW_FLIGHT_STEP_UNDERFLOW: return "step-underflow";
    case AW_FLIGHT_NOT_FINITE: return "not-finite";
    case AW_FLIGHT_NO_MEMORY: return "no-memory";
    default: return "unknown";
    }
}

const char *
aw_shot_status_name (AwShotStatus status)
{
  switch (status)
    {
    case AW_SHOT_OK: return "ok";
    case AW_SHOT_BAD_MASS: return "mass";
    case AW_SHOT_BAD_DIAMETER: return "diameter";
    case AW_SHOT_BAD_VELOCITY: return "velocity";
    case AW_SHOT_BAD_ELEVATION: return "elevation";
    case AW_SHOT_BAD_HEIGHT: return "height";
    case AW_SHOT_BAD_SPIN: return "spin";
    case AW_SHOT_BAD_TILT: return "hop-tilt";
    case AW_SHOT_BAD_WIND: return "wind";
    case AW_SHOT_BAD_GRAVITY: return "gravity";
    case AW_SHOT_BAD_DENSITY: return "density";
    case AW_SHOT_BAD_VISCOSITY: return "viscosity";
    case AW_SHOT_BAD_MODEL: return "model";
    default: return "unknown";
    }
}
