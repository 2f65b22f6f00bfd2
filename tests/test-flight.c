/* test-flight.c: the flight engine against closed forms, regression trajectories and an
 * independent integrator (physics.md §4–§6)
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Every check names its source as physics.md tags it (SRC, CALC, MEM); trade facts say
 * "common practice, no source". The independent reference integrates the engine's own right-hand
 * side (aw_flight_rhs) with GSL's Prince–Dormand 8(9) pair (gsl_odeiv2 rk8pd) at 1e-12 and locates
 * events by re-integrating inside the last step.
 */
#include <glib.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_odeiv2.h>
#include <math.h>
#include <string.h>

#include "aw-flight.h"
#include "aw-units.h"

enum { PX, PY, PZ, VX, VY, VZ, WX, WY, WZ };

#define G0 9.80665   /* physics.md §1c: standard gravity, exact by definition */

/* physics.md §5 closed forms: "tolerance 1e-6 relative unless noted" (CALC) */
#define CLOSED_RTOL 1e-6
/* physics.md §5 regression trajectories: "Tolerance 1e-4 relative" (CALC, scipy DOP853) */
#define REGRESSION_RTOL 1e-4
/* The engine's accuracy goal at its default tolerance: impact point within 1 mm of the reference */
#define IMPACT_TOL_M 1e-3
/* rk8pd reference tolerance */
#define REF_EPS 1e-12

/* ---- shots ---- */

/* The §5 regression inputs: 0.20 g, 5.95 mm, κ 0.4, ρ 1.2, μ 1.81e-5, Clift, S/(1+2S), c_M 0.02,
 * from (0, 0, 1.5 m) at 90 m/s level. */
static void
regression_shot (AwShot *s)
{
  aw_shot_init (s);
  s->air.density = 1.2;
  s->air.viscosity = 1.81e-5;
}

/* no drag, no lift: a point mass in vacuum */
static void
vacuum_shot (AwShot *s)
{
  regression_shot (s);
  s->aero.drag = AW_DRAG_OFF;
  s->aero.lift = AW_LIFT_OFF;
}

/* physics.md §5 closed-form sphere: 0.20 g, d = 5.95 mm, constant C_D = 0.47, ρ = 1.2, no lift */
static void
drag_only_shot (AwShot *s)
{
  regression_shot (s);
  s->aero.drag = AW_DRAG_CONSTANT;
  s->aero.drag_cd = 0.47;
  s->aero.lift = AW_LIFT_OFF;
}

/* k = ρ·C_D·A/(2m) of a shot with constant C_D (physics.md §5) */
static double
drag_k (const AwShot *s)
{
  double r = 0.5 * s->diameter_m;
  return s->air.density * s->aero.drag_cd * G_PI * r * r / (2.0 * s->mass_kg);
}

static AwFlightStatus
run (const AwShot *shot, const AwFlightOptions *opt, AwTrajectory *tr)
{
  AwFlightOptions o;
  if (!opt)
    {
      aw_flight_options_init (&o);
      opt = &o;
    }
  return aw_flight_run (shot, opt, tr);
}

/* ---- the independent reference: GSL rk8pd on aw_flight_rhs ---- */

typedef struct
{
  const AwShot *shot;
  gsl_odeiv2_system sys;
  gsl_odeiv2_driver *main;   /* steps along the flight */
  gsl_odeiv2_driver *sub;    /* re-integrates inside a step to locate an event */
} Ref;

static int
ref_func (double t, const double y[], double f[], void *params)
{
  aw_flight_rhs (params, y, f);
  return GSL_SUCCESS;
}

static void
ref_init (Ref *r, const AwShot *shot)
{
  r->shot = shot;
  r->sys = (gsl_odeiv2_system) { ref_func, NULL, AW_FLIGHT_STATE_DIM, (void *) shot };
  r->main = gsl_odeiv2_driver_alloc_y_new (&r->sys, gsl_odeiv2_step_rk8pd, 1e-4, REF_EPS, REF_EPS);
  r->sub = gsl_odeiv2_driver_alloc_y_new (&r->sys, gsl_odeiv2_step_rk8pd, 1e-4, REF_EPS, REF_EPS);
}

static void
ref_clear (Ref *r)
{
  gsl_odeiv2_driver_free (r->main);
  gsl_odeiv2_driver_free (r->sub);
}

/* y(tau) from (t0, y0), tau within one step of t0 */
static void
ref_integrate_to (Ref *r, double t0, const double *y0, double tau, double *y)
{
  double t = t0;
  memcpy (y, y0, AW_FLIGHT_STATE_DIM * sizeof (double));
  if (tau <= t0)
    return;
  gsl_odeiv2_driver_reset_hstart (r->sub, tau - t0);
  int st = gsl_odeiv2_driver_apply (r->sub, &t, tau, y);
  g_assert_cmpint (st, ==, GSL_SUCCESS);
}

/* Integrates until dir·(y[comp] − target) changes from < 0 to ≥ 0 (dir −1: falling through target,
 * +1: rising through it), or t_max. The crossing is located by an Illinois iteration on the time,
 * each trial re-integrated from the start of the step at the reference tolerance. */
static gboolean
ref_run (Ref *r, int comp, double target, int dir, double t_max, double *t_ev, double *y_ev)
{
  double y[AW_FLIGHT_STATE_DIM], y0[AW_FLIGHT_STATE_DIM], yt[AW_FLIGHT_STATE_DIM];
  double t = 0.0, h = 1e-4;
  gsl_odeiv2_driver *d = r->main;

  aw_shot_initial_state (r->shot, y);
  gsl_odeiv2_driver_reset (d);
  while (t < t_max)
    {
      double t0 = t;
      memcpy (y0, y, sizeof y);
      int st = gsl_odeiv2_evolve_apply (d->e, d->c, d->s, d->sys, &t, t_max, &h, y);
      g_assert_cmpint (st, ==, GSL_SUCCESS);
      double ga = dir * (y0[comp] - target), gb = dir * (y[comp] - target);
      if (ga < 0.0 && gb >= 0.0)
        {
          double a = t0, b = t;
          int side = 0;
          for (int it = 0; it < 200 && b - a > 1e-15 * fmax (1.0, b); it++)
            {
              double c = (a * gb - b * ga) / (gb - ga);
              if (!(c > a && c < b))
                c = 0.5 * (a + b);
              ref_integrate_to (r, t0, y0, c, yt);
              double gc = dir * (yt[comp] - target);
              if (gc == 0.0)
                {
                  a = b = c;
                  break;
                }
              if (gc > 0.0)
                {
                  b = c;
                  gb = gc;
                  if (side == -1)
                    ga *= 0.5;
                  side = -1;
                }
              else
                {
                  a = c;
                  ga = gc;
                  if (side == +1)
                    gb *= 0.5;
                  side = +1;
                }
            }
          *t_ev = 0.5 * (a + b);
          ref_integrate_to (r, t0, y0, *t_ev, y_ev);
          return TRUE;
        }
    }
  *t_ev = t;
  memcpy (y_ev, y, sizeof y);
  return FALSE;
}

/* Ground impact by the reference */
static void
ref_ground (const AwShot *shot, double *t, double *y)
{
  Ref r;
  ref_init (&r, shot);
  g_assert_true (ref_run (&r, PZ, 0.0, -1, 60.0, t, y));
  ref_clear (&r);
}

/* ---- §5 closed forms: vacuum ---- */

static void
test_vacuum_fall (void)
{
  AwShot s;
  AwTrajectory tr = { 0 };

  vacuum_shot (&s);
  s.elevation_rad = -G_PI / 2;   /* straight down */
  s.velocity_mps = 1e-9;         /* validation wants v > 0; 1e-9 m/s shifts t by 1e-10 s */
  g_assert_cmpint (run (&s, NULL, &tr), ==, AW_FLIGHT_GROUND);
  g_test_message ("vacuum fall from 1.5 m: %.9f s", tr.time_of_flight);
  /* physics.md §5: t = sqrt(2h/g) = 0.553096 s (CALC) */
  g_assert_cmpfloat_with_epsilon (tr.time_of_flight / sqrt (2.0 * 1.5 / G0), 1.0, CLOSED_RTOL);
  g_assert_cmpfloat_with_epsilon (tr.time_of_flight, 0.553096, 5e-7);   /* printed table value */
  /* the trade's "a BB falls 1.5 m in about 0.55 s": common practice, no source (two digits) */
  g_assert_cmpfloat_with_epsilon (tr.time_of_flight, 0.55, 0.005);
  /* arrives at g·t */
  g_assert_cmpfloat_with_epsilon (tr.impact_speed / (G0 * tr.time_of_flight), 1.0, CLOSED_RTOL);
  aw_trajectory_clear (&tr);
}

static void
test_vacuum_horizontal (void)
{
  AwShot s;
  AwTrajectory tr = { 0 };

  vacuum_shot (&s);
  g_assert_cmpint (run (&s, NULL, &tr), ==, AW_FLIGHT_GROUND);
  g_test_message ("vacuum level shot: %.6f m in %.9f s", tr.ground_distance, tr.time_of_flight);
  /* physics.md §5: 90 m/s from 1.5 m, range 49.7786 m (CALC) */
  g_assert_cmpfloat_with_epsilon (tr.ground_distance / (90.0 * sqrt (3.0 / G0)), 1.0, CLOSED_RTOL);
  g_assert_cmpfloat_with_epsilon (tr.ground_distance, 49.7786, 5e-5);   /* printed table value */
  /* the same fall time as the drop (physics.md §5: 0.553096 s) */
  g_assert_cmpfloat_with_epsilon (tr.time_of_flight / sqrt (3.0 / G0), 1.0, CLOSED_RTOL);
  /* no rise: the apex is the muzzle */
  g_assert_cmpfloat (tr.apex_height, ==, 1.5);
  g_assert_cmpfloat (tr.apex_distance, ==, 0.0);
  aw_trajectory_clear (&tr);
}

static void
test_vacuum_45 (void)
{
  AwShot s;
  AwTrajectory tr = { 0 };

  vacuum_shot (&s);
  s.height_m = 0.0;
  s.elevation_rad = G_PI / 4;
  g_assert_cmpint (run (&s, NULL, &tr), ==, AW_FLIGHT_GROUND);
  g_test_message ("vacuum 45 deg: range %.6f apex %.6f at %.6f", tr.ground_distance,
                  tr.apex_height, tr.apex_distance);
  /* physics.md §5: range v0²/g = 825.970 m, apex 206.4925 m (CALC) */
  g_assert_cmpfloat_with_epsilon (tr.ground_distance / (90.0 * 90.0 / G0), 1.0, CLOSED_RTOL);
  g_assert_cmpfloat_with_epsilon (tr.ground_distance, 825.970, 5e-4);
  g_assert_cmpfloat_with_epsilon (tr.apex_height / (90.0 * 90.0 / (4.0 * G0)), 1.0, CLOSED_RTOL);
  g_assert_cmpfloat_with_epsilon (tr.apex_height, 206.4925, 5e-5);
  /* the apex lies half way */
  g_assert_cmpfloat_with_epsilon (tr.apex_distance / (0.5 * 90.0 * 90.0 / G0), 1.0, CLOSED_RTOL);
  aw_trajectory_clear (&tr);
}

/* ---- §5 closed forms: quadratic drag, horizontal ---- */

/* Closed form v(x) = v0·e^(−kx), t(x) = (e^(kx) − 1)/(k·v0) (physics.md §5, CALC) */
static double cf_v_of_x (double k, double v0, double x) { return v0 * exp (-k * x); }
static double cf_t_of_x (double k, double v0, double x) { return (exp (k * x) - 1.0) / (k * v0); }

static void
test_drag_horizontal_table (void)
{
  AwShot s;
  drag_only_shot (&s);
  double k = drag_k (&s);
  /* physics.md §5: 0.20 g, d 5.95 mm, C_D 0.47, ρ 1.2 → k = 0.0392051 1/m (CALC); the closed forms
   * give the printed rows to their last digit */
  g_assert_cmpfloat_with_epsilon (k, 0.0392051, 5e-8);
  g_assert_cmpfloat_with_epsilon (cf_v_of_x (k, 90.0, 30.0), 27.7617, 5e-5);
  g_assert_cmpfloat_with_epsilon (cf_t_of_x (k, 90.0, 30.0), 0.63537, 5e-6);
  g_assert_cmpfloat_with_epsilon (cf_v_of_x (k, 90.0, 50.0), 12.6740, 5e-5);
  g_assert_cmpfloat_with_epsilon (cf_t_of_x (k, 90.0, 50.0), 1.72912, 5e-6);
  /* v(t) = v0/(1 + k·v0·t), x(t) = ln(1 + k·v0·t)/k at t = 0.5 s: 32.5588, 25.9344 */
  g_assert_cmpfloat_with_epsilon (90.0 / (1.0 + k * 90.0 * 0.5), 32.5588, 5e-5);
  g_assert_cmpfloat_with_epsilon (log1p (k * 90.0 * 0.5) / k, 25.9344, 5e-5);
  /* generic row k = 0.04, v0 = 100, t = 1 s → v = 20.000, x = 40.23595 */
  g_assert_cmpfloat_with_epsilon (100.0 / (1.0 + 0.04 * 100.0), 20.000, 5e-4);
  g_assert_cmpfloat_with_epsilon (log1p (0.04 * 100.0) / 0.04, 40.23595, 5e-6);
}

/* Same equations without gravity (aw_flight_rhs takes any g; the engine's validation does not):
 * the reference integrator must reproduce the closed form to the §5 tolerance. */
static void
test_drag_horizontal_rhs (void)
{
  AwShot s;
  Ref r;
  double t, y[AW_FLIGHT_STATE_DIM];

  drag_only_shot (&s);
  s.gravity = 0.0;
  double k = drag_k (&s);
  ref_init (&r, &s);
  for (double x = 10.0; x <= 50.0; x += 20.0)
    {
      g_assert_true (ref_run (&r, PX, x, +1, 10.0, &t, y));
      g_assert_cmpfloat_with_epsilon (y[VX] / cf_v_of_x (k, 90.0, x), 1.0, CLOSED_RTOL);
      g_assert_cmpfloat_with_epsilon (t / cf_t_of_x (k, 90.0, x), 1.0, CLOSED_RTOL);
      g_assert_cmpfloat (y[PZ], ==, 1.5);
      g_assert_cmpfloat (y[VZ], ==, 0.0);
    }
  ref_clear (&r);
}

/* The engine itself needs g ≥ 0.1 m/s² (its validation range). That small gravity bends the path,
 * and the drag then acts along the speed V = vx·sqrt(1 + (vz/vx)²), which slows vx by the extra
 * relative amount  δ(x) = k·∫ ½(vz/vx)² dx  (first order). With |vz| ≤ g·t this is bounded by
 * k·∫ ½(g·t(x')/v(x'))² dx' along the closed form (CALC here); the check allows 1e-6 + that bound,
 * which is 2e-7 at 30 m and 2e-5 at 50 m. */
static double
gravity_perturbation_bound (double k, double v0, double g, double x)
{
  const int n = 2000;
  double sum = 0.0;
  for (int i = 0; i <= n; i++)
    {
      double xi = x * i / n;
      double q = g * cf_t_of_x (k, v0, xi) / cf_v_of_x (k, v0, xi);
      sum += (i == 0 || i == n ? 0.5 : 1.0) * 0.5 * q * q;
    }
  return k * sum * x / n;
}

static void
test_drag_horizontal_engine (void)
{
  AwShot s;
  AwFlightOptions o;

  drag_only_shot (&s);
  s.gravity = 0.1;   /* the smallest gravity the engine accepts */
  double k = drag_k (&s);
  aw_flight_options_init (&o);
  for (double x = 30.0; x <= 50.0; x += 20.0)
    {
      AwTrajectory tr = { 0 };
      o.max_distance_m = x;
      g_assert_cmpint (run (&s, &o, &tr), ==, AW_FLIGHT_DISTANCE);
      double bound = gravity_perturbation_bound (k, 90.0, s.gravity, x);
      double dv = tr.end.vx / cf_v_of_x (k, 90.0, x) - 1.0;
      double dt = tr.time_of_flight / cf_t_of_x (k, 90.0, x) - 1.0;
      g_test_message ("x %.0f: vx %.7f (dev %.2e) t %.7f (dev %.2e), gravity bound %.2e", x,
                      tr.end.vx, dv, tr.time_of_flight, dt, bound);
      g_assert_cmpfloat (tr.end.x, ==, x);
      /* physics.md §5 v(x) = v0·e^(−kx), t(x) = (e^(kx) − 1)/(k·v0) (CALC) */
      g_assert_cmpfloat (fabs (dv), <=, CLOSED_RTOL + bound);
      g_assert_cmpfloat (fabs (dt), <=, CLOSED_RTOL + bound);
      aw_trajectory_clear (&tr);
    }
}

/* The time limit ends the flight at exactly that time (status AW_FLIGHT_TIME_LIMIT); in vacuum the
 * state there is the parabola (physics.md §5 vacuum, CALC). */
static void
test_time_limit (void)
{
  AwShot s;
  AwFlightOptions o;
  AwTrajectory tr = { 0 };

  vacuum_shot (&s);
  aw_flight_options_init (&o);
  o.max_time_s = 0.3;
  g_assert_cmpint (run (&s, &o, &tr), ==, AW_FLIGHT_TIME_LIMIT);
  g_assert_cmpint (tr.status, ==, AW_FLIGHT_TIME_LIMIT);
  g_assert_cmpfloat_with_epsilon (tr.time_of_flight, 0.3, 1e-12);
  g_assert_cmpfloat_with_epsilon (tr.end.x / 27.0, 1.0, CLOSED_RTOL);
  g_assert_cmpfloat_with_epsilon (tr.end.z / (1.5 - 0.5 * G0 * 0.09), 1.0, CLOSED_RTOL);
  g_assert_cmpfloat_with_epsilon (tr.end.vz / (-G0 * 0.3), 1.0, CLOSED_RTOL);

  /* with drag (g = 0.1, see above): physics.md §5 t = 0.5 s → v = 32.5588, x = 25.9344 (CALC) */
  drag_only_shot (&s);
  s.gravity = 0.1;
  o.max_time_s = 0.5;
  double k = drag_k (&s);
  double bound = gravity_perturbation_bound (k, 90.0, s.gravity, 26.0);
  g_assert_cmpint (run (&s, &o, &tr), ==, AW_FLIGHT_TIME_LIMIT);
  g_assert_cmpfloat_with_epsilon (tr.time_of_flight, 0.5, 1e-12);
  g_assert_cmpfloat (fabs (tr.end.vx / (90.0 / (1.0 + k * 45.0)) - 1.0), <=, CLOSED_RTOL + bound);
  g_assert_cmpfloat (fabs (tr.end.x / (log1p (k * 45.0) / k) - 1.0), <=, CLOSED_RTOL + bound);
  aw_trajectory_clear (&tr);
}

/* The distance limit ends the flight there (status AW_FLIGHT_DISTANCE) */
static void
test_distance_limit (void)
{
  AwShot s;
  AwFlightOptions o;
  AwTrajectory tr = { 0 };
  double t, y[AW_FLIGHT_STATE_DIM];
  Ref r;

  regression_shot (&s);
  aw_flight_options_init (&o);
  o.max_distance_m = 20.0;
  g_assert_cmpint (run (&s, &o, &tr), ==, AW_FLIGHT_DISTANCE);
  g_assert_cmpfloat (tr.end.x, ==, 20.0);
  g_assert_cmpfloat (tr.ground_distance, ==, 20.0);
  ref_init (&r, &s);
  g_assert_true (ref_run (&r, PX, 20.0, +1, 10.0, &t, y));
  ref_clear (&r);
  g_assert_cmpfloat_with_epsilon (tr.end.z, y[PZ], IMPACT_TOL_M);
  g_assert_cmpfloat_with_epsilon (tr.time_of_flight, t, IMPACT_TOL_M / 30.0);
  /* beyond the ground the distance limit never fires */
  o.max_distance_m = 200.0;
  g_assert_cmpint (run (&s, &o, &tr), ==, AW_FLIGHT_GROUND);
  aw_trajectory_clear (&tr);
}

/* ---- §5 closed forms: vertical fall with quadratic drag ---- */

/* t(h) = (v_t/g)·arccosh(exp(g·h/v_t²)), v(t) = v_t·tanh(g·t/v_t),
 * y(t) = (v_t²/g)·ln cosh(g·t/v_t)  (physics.md §5, CALC) */
static double cf_fall_t (double vt, double h) { return vt / G0 * acosh (exp (G0 * h / (vt * vt))); }
static double cf_fall_v (double vt, double t) { return vt * tanh (G0 * t / vt); }
static double cf_fall_y (double vt, double t) { return vt * vt / G0 * log (cosh (G0 * t / vt)); }

static void
drop_shot (AwShot *s, double height)
{
  drag_only_shot (s);
  s->elevation_rad = -G_PI / 2;
  s->velocity_mps = 1e-9;   /* validation wants v > 0 */
  s->height_m = height;
}

static void
test_fall_with_drag (void)
{
  AwShot s;
  AwTrajectory tr = { 0 };
  AwFlightOptions o;

  drop_shot (&s, 1.5);
  double vt = sqrt (G0 / drag_k (&s));
  /* physics.md §5: v_t = 15.8157 m/s, 1.5 m in 0.558532 s arriving at 5.26837 m/s (CALC) */
  g_assert_cmpfloat_with_epsilon (vt, 15.8157, 5e-5);
  g_assert_cmpfloat_with_epsilon (cf_fall_t (vt, 1.5), 0.558532, 5e-7);
  g_assert_cmpfloat_with_epsilon (cf_fall_v (vt, cf_fall_t (vt, 1.5)), 5.26837, 5e-6);

  g_assert_cmpint (run (&s, NULL, &tr), ==, AW_FLIGHT_GROUND);
  g_test_message ("fall 1.5 m with drag: %.9f s, %.7f m/s", tr.time_of_flight, tr.impact_speed);
  g_assert_cmpfloat_with_epsilon (tr.time_of_flight / cf_fall_t (vt, 1.5), 1.0, CLOSED_RTOL);
  g_assert_cmpfloat_with_epsilon (tr.impact_speed / cf_fall_v (vt, tr.time_of_flight), 1.0,
                                  CLOSED_RTOL);
  /* drag makes it slower than the vacuum drop (0.553096 s) */
  g_assert_cmpfloat (tr.time_of_flight, >, sqrt (3.0 / G0));

  /* physics.md §5: y(1 s) = 4.61800 m, y(2 s) = 16.00226 m (CALC), from 100 m with a time limit */
  drop_shot (&s, 100.0);
  aw_flight_options_init (&o);
  static const struct { double t, y; } rows[] = { { 1.0, 4.61800 }, { 2.0, 16.00226 } };
  for (guint i = 0; i < G_N_ELEMENTS (rows); i++)
    {
      g_assert_cmpfloat_with_epsilon (cf_fall_y (vt, rows[i].t), rows[i].y, 5e-6);
      o.max_time_s = rows[i].t;
      g_assert_cmpint (run (&s, &o, &tr), ==, AW_FLIGHT_TIME_LIMIT);
      g_assert_cmpfloat_with_epsilon ((100.0 - tr.end.z) / cf_fall_y (vt, rows[i].t), 1.0,
                                      CLOSED_RTOL);
      g_assert_cmpfloat_with_epsilon (-tr.end.vz / cf_fall_v (vt, rows[i].t), 1.0, CLOSED_RTOL);
    }

  /* to the ground from 100 m: t(h) again, and the speed approaches v_t */
  aw_flight_options_init (&o);
  g_assert_cmpint (run (&s, &o, &tr), ==, AW_FLIGHT_GROUND);
  g_assert_cmpfloat_with_epsilon (tr.time_of_flight / cf_fall_t (vt, 100.0), 1.0, CLOSED_RTOL);
  g_assert_cmpfloat (tr.impact_speed, <, vt);
  g_assert_cmpfloat (tr.impact_speed, >, 0.999 * vt);
  aw_trajectory_clear (&tr);
}

/* physics.md §5 generic row: v_t = 10 m/s → v(1 s) = 7.53354 m/s, y(1 s) = 4.27398 m (CALC).
 * C_D chosen so that g/k = 100 m²/s². */
static void
test_fall_vt10 (void)
{
  AwShot s;
  AwFlightOptions o;
  AwTrajectory tr = { 0 };

  drop_shot (&s, 100.0);
  double r = 0.5 * s.diameter_m;
  s.aero.drag_cd = 2.0 * s.mass_kg * (G0 / 100.0) / (s.air.density * G_PI * r * r);
  g_assert_cmpfloat_with_epsilon (sqrt (G0 / drag_k (&s)), 10.0, 1e-12);
  aw_flight_options_init (&o);
  o.max_time_s = 1.0;
  g_assert_cmpint (run (&s, &o, &tr), ==, AW_FLIGHT_TIME_LIMIT);
  g_assert_cmpfloat_with_epsilon (-tr.end.vz, 7.53354, 5e-6 + 7.53354 * CLOSED_RTOL);
  g_assert_cmpfloat_with_epsilon (100.0 - tr.end.z, 4.27398, 5e-6 + 4.27398 * CLOSED_RTOL);
  aw_trajectory_clear (&tr);
}

/* Terminal velocity: at V = v_t straight down, gravity and drag cancel (physics.md §5,
 * v_t = √(g/k), CALC) */
static void
test_terminal_velocity_rhs (void)
{
  AwShot s;
  drop_shot (&s, 1.5);
  double vt = sqrt (G0 / drag_k (&s));
  double y[AW_FLIGHT_STATE_DIM] = { 0, 0, 10.0, 0, 0, -vt, 0, 0, 0 };
  double f[AW_FLIGHT_STATE_DIM];
  aw_flight_rhs (&s, y, f);
  g_assert_cmpfloat (fabs (f[VZ]), <, 1e-12 * G0);
  /* 1 % slower: net downward acceleration g·(1 − 0.99²) */
  y[VZ] = -0.99 * vt;
  aw_flight_rhs (&s, y, f);
  g_assert_cmpfloat_with_epsilon (f[VZ] / (-G0 * (1.0 - 0.99 * 0.99)), 1.0, 1e-12);
}

/* ---- §5 regression trajectories ---- */

static void
sample_at_x (const AwTrajectory *tr, double x, AwSample *out)
{
  for (size_t i = 0; i < tr->n_samples; i++)
    if (tr->samples[i].x == x)
      {
        *out = tr->samples[i];
        return;
      }
  g_assert_not_reached ();
}

#define CHECK_REL(val, ref) g_assert_cmpfloat_with_epsilon ((val) / (ref), 1.0, REGRESSION_RTOL)

static void
test_regression_no_spin (void)
{
  AwShot s;
  AwTrajectory tr = { 0 };
  AwSample at30;

  regression_shot (&s);
  g_assert_cmpint (run (&s, NULL, &tr), ==, AW_FLIGHT_GROUND);
  sample_at_x (&tr, 30.0, &at30);
  g_test_message ("no spin: t %.6f x %.5f z(30) %.6f V(30) %.4f", tr.time_of_flight,
                  tr.ground_distance, at30.z, at30.speed);
  /* physics.md §5 regression, no spin (CALC, scipy DOP853 rtol 1e-11) */
  CHECK_REL (tr.time_of_flight, 0.65227);
  CHECK_REL (tr.ground_distance, 31.1033);
  CHECK_REL (at30.z, 0.15657);
  CHECK_REL (at30.speed, 30.054);
  g_assert_cmpfloat (tr.ground_drift, ==, 0.0);
  aw_trajectory_clear (&tr);
}

static void
test_regression_backspin (void)
{
  AwShot s;
  AwTrajectory tr = { 0 };
  AwSample at30;

  regression_shot (&s);
  s.spin_rad_s = aw_rpm_to_rad_s (4318.28);
  /* physics.md §5: 4318.28 rpm is lift = weight at launch (CALC) */
  g_assert_cmpfloat_with_epsilon (aw_shot_lift_ratio_for_spin (&s, s.spin_rad_s), 1.0, 1e-6);
  g_assert_cmpint (run (&s, NULL, &tr), ==, AW_FLIGHT_GROUND);
  sample_at_x (&tr, 30.0, &at30);
  g_test_message ("backspin: t %.6f x %.5f z(30) %.6f impact %.2f rpm", tr.time_of_flight,
                  tr.ground_distance, at30.z, aw_rad_s_to_rpm (tr.impact_spin));
  /* physics.md §5 regression, backspin 4318.28 rpm (CALC) */
  CHECK_REL (tr.time_of_flight, 0.92571);
  CHECK_REL (tr.ground_distance, 38.0856);
  CHECK_REL (at30.z, 0.92962);
  CHECK_REL (aw_rad_s_to_rpm (tr.impact_spin), 3683.0);
  aw_trajectory_clear (&tr);
}

static void
test_regression_wind (void)
{
  AwShot s;
  AwTrajectory tr = { 0 };

  regression_shot (&s);
  s.wind[1] = -2.0;   /* 2 m/s toward −y */
  g_assert_cmpint (run (&s, NULL, &tr), ==, AW_FLIGHT_GROUND);
  g_test_message ("wind: t %.6f x %.5f y %.6f", tr.time_of_flight, tr.ground_distance,
                  tr.ground_drift);
  /* physics.md §5 regression, no spin, wind 2 m/s toward −y (CALC) */
  CHECK_REL (tr.time_of_flight, 0.65229);
  CHECK_REL (tr.ground_distance, 31.1004);
  CHECK_REL (tr.ground_drift, -0.61345);
  aw_trajectory_clear (&tr);
}

/* ---- §4 spin decay along the path ---- */

/* physics.md §4b: ω(s) = ω0·exp(−s/L_ω), L_ω = 2κm/(c_M·π·ρ·r²) (CALC, exact for C_M = c_M·S).
 * The path length comes from the engine's own samples at 1 cm (sum of chords; the chord error is
 * ~h³κ²/24, below 1e-11 m per chord here). */
#define SPIN_DECAY_RTOL 1e-6

static void
test_spin_decay (void)
{
  AwShot s;
  AwFlightOptions o;
  AwTrajectory tr = { 0 };

  regression_shot (&s);
  s.spin_rad_s = aw_rpm_to_rad_s (4318.28);
  double r = 0.5 * s.diameter_m;
  double L = 2.0 * s.aero.inertia_factor * s.mass_kg
             / (s.aero.spin_decay_cm * G_PI * s.air.density * r * r);
  /* physics.md §5: L_ω = 239.8 m for the regression sphere (CALC) */
  g_assert_cmpfloat_with_epsilon (L, 239.8, 0.05);

  aw_flight_options_init (&o);
  o.sample_step_m = 0.01;
  g_assert_cmpint (run (&s, &o, &tr), ==, AW_FLIGHT_GROUND);
  g_assert_cmpuint (tr.n_samples, >, 3000);
  double path = 0.0;
  for (size_t i = 1; i < tr.n_samples; i++)
    {
      const AwSample *a = &tr.samples[i - 1], *b = &tr.samples[i];
      path += sqrt ((b->x - a->x) * (b->x - a->x) + (b->y - a->y) * (b->y - a->y)
                    + (b->z - a->z) * (b->z - a->z));
      double expect = s.spin_rad_s * exp (-path / L);
      if (fabs (b->spin / expect - 1.0) > SPIN_DECAY_RTOL)
        g_error ("sample %zu at x %.2f: spin %.9g, expected %.9g", i, b->x, b->spin, expect);
    }
  g_test_message ("path %.6f m, impact spin %.3f rpm", path, aw_rad_s_to_rpm (tr.impact_spin));
  g_assert_cmpfloat_with_epsilon (tr.impact_spin / (s.spin_rad_s * exp (-path / L)), 1.0,
                                  SPIN_DECAY_RTOL);
  /* physics.md §5: 3683.0 rpm at impact (CALC) */
  CHECK_REL (aw_rad_s_to_rpm (tr.impact_spin), 3683.0);
  aw_trajectory_clear (&tr);
}

/* physics.md §4b: the decay rate is c_M·π·ρ·r²·V/(2κm) per unit spin, along −ω (CALC), checked on
 * the right-hand side, with wind so that V is the air-relative speed */
static void
test_spin_decay_rhs (void)
{
  AwShot s;
  double y[AW_FLIGHT_STATE_DIM] = { 0, 0, 1.5, 80.0, 3.0, -2.0, 100.0, -2000.0, 300.0 };
  double f[AW_FLIGHT_STATE_DIM];

  regression_shot (&s);
  s.wind[0] = -4.0;
  s.wind[1] = 1.0;
  s.aero.spin_decay_factor = 1.3;
  aw_flight_rhs (&s, y, f);
  double r = 0.5 * s.diameter_m;
  double V = sqrt (84.0 * 84.0 + 2.0 * 2.0 + 2.0 * 2.0);
  double rate = 1.3 * s.aero.spin_decay_cm * G_PI * s.air.density * r * r * V
                / (2.0 * s.aero.inertia_factor * s.mass_kg);
  for (int i = WX; i <= WZ; i++)
    g_assert_cmpfloat_with_epsilon (f[i] / (-rate * y[i]), 1.0, 1e-12);
}

/* ---- the right-hand side ---- */

/* physics.md §5: ω = (0, −1000, 0) and v_r = (90, 0, 0) give ω × v_r = (0, 0, +90000): up */
static void
test_rhs_backspin_lifts (void)
{
  AwShot s;
  double y[AW_FLIGHT_STATE_DIM] = { 0, 0, 1.5, 90.0, 0, 0, 0, -1000.0, 0 };
  double f[AW_FLIGHT_STATE_DIM];

  regression_shot (&s);
  aw_flight_rhs (&s, y, f);
  g_assert_cmpfloat (f[VZ], >, -G0);
  g_assert_cmpfloat (fabs (f[VY]), <, 1e-15);
  /* topspin pushes down by the same amount (physics.md §8: same magnitude, opposite sign) */
  double up = f[VZ] + G0;
  y[WY] = 1000.0;
  aw_flight_rhs (&s, y, f);
  g_assert_cmpfloat_with_epsilon ((f[VZ] + G0) / -up, 1.0, 1e-12);
}

/* The drag and lift terms of physics.md §5 evaluated by hand:
 * a = −½ρ·C_D(Re)·A·V·v_r/m + ½ρ·A·V²·C_L(S)·(ω × v_r)/|ω × v_r|/m − g·ẑ, with the library's
 * C_D and C_L. Speeds span the Clift pieces used in flight (Re from 400 to 1e5). */
static void
test_rhs_terms (void)
{
  static const double speeds[] = { 1.0, 4.0, 12.0, 35.0, 60.0, 95.0, 140.0, 200.0, 290.0 };
  static const AwDragModel drags[] = { AW_DRAG_CLIFT, AW_DRAG_MORRISON, AW_DRAG_CONSTANT };
  static const AwLiftModel lifts[] = { AW_LIFT_SATURATING, AW_LIFT_SHS, AW_LIFT_LOTH,
                                       AW_LIFT_LINEAR };

  for (guint di = 0; di < G_N_ELEMENTS (drags); di++)
    for (guint li = 0; li < G_N_ELEMENTS (lifts); li++)
      for (guint i = 0; i < G_N_ELEMENTS (speeds); i++)
        {
          AwShot s;
          regression_shot (&s);
          s.aero.drag = drags[di];
          s.aero.lift = lifts[li];
          s.aero.lift_factor = 0.9;
          s.aero.drag_factor = 1.05;
          s.wind[0] = 1.5;
          s.wind[1] = -0.5;
          s.wind[2] = 0.25;
          double v = speeds[i];
          double y[AW_FLIGHT_STATE_DIM] = { 3.0, 0.1, 1.2, v * 0.98, v * 0.05, v * 0.1,
                                            30.0, -400.0, 90.0 };
          double f[AW_FLIGHT_STATE_DIM];
          aw_flight_rhs (&s, y, f);

          double vr[3] = { y[VX] - s.wind[0], y[VY] - s.wind[1], y[VZ] - s.wind[2] };
          double V = sqrt (vr[0] * vr[0] + vr[1] * vr[1] + vr[2] * vr[2]);
          double r = 0.5 * s.diameter_m, A = G_PI * r * r;
          double re = s.air.density * V * s.diameter_m / s.air.viscosity;
          double cd = aw_aero_drag_coefficient (&s.aero, re);
          double w[3] = { y[WX], y[WY], y[WZ] };
          double c[3] = { w[1] * vr[2] - w[2] * vr[1], w[2] * vr[0] - w[0] * vr[2],
                          w[0] * vr[1] - w[1] * vr[0] };
          double cn = sqrt (c[0] * c[0] + c[1] * c[1] + c[2] * c[2]);
          double S = r * cn / (V * V);
          double cl = aw_aero_lift_coefficient (&s.aero, S) * s.aero.lift_factor;
          for (int k = 0; k < 3; k++)
            {
              double a = -0.5 * s.air.density * cd * A * V * vr[k] / s.mass_kg
                         + 0.5 * s.air.density * A * V * V * cl * c[k] / cn / s.mass_kg
                         - (k == 2 ? G0 : 0.0);
              if (fabs (f[VX + k] - a) > 1e-12 * (fabs (a) + G0))
                g_error ("drag %d lift %d V %.0f axis %d: rhs %.15g, by hand %.15g", drags[di],
                         lifts[li], v, k, f[VX + k], a);
            }
          for (int k = 0; k < 3; k++)
            g_assert_cmpfloat (f[PX + k], ==, y[VX + k]);
        }
}

/* Guards (physics.md §5: "Guard V → 0 and |ω × v_r| → 0 by setting lift to 0") */
static void
test_rhs_guards (void)
{
  AwShot s;
  double f[AW_FLIGHT_STATE_DIM];

  regression_shot (&s);
  s.wind[0] = 20.0;
  /* moving with the air: no drag, no lift, only gravity */
  double y1[AW_FLIGHT_STATE_DIM] = { 0, 0, 1.5, 20.0, 0, 0, 0, -3000.0, 0 };
  aw_flight_rhs (&s, y1, f);
  g_assert_cmpfloat (f[VX], ==, 0.0);
  g_assert_cmpfloat (f[VY], ==, 0.0);
  g_assert_cmpfloat (f[VZ], ==, -G0);
  for (int i = 0; i < AW_FLIGHT_STATE_DIM; i++)
    g_assert_true (isfinite (f[i]));
  /* spin along the air-relative velocity: no lift, drag only */
  s.wind[0] = 0.0;
  double y2[AW_FLIGHT_STATE_DIM] = { 0, 0, 1.5, 50.0, 0, 0, 5000.0, 0, 0 };
  aw_flight_rhs (&s, y2, f);
  g_assert_cmpfloat (f[VY], ==, 0.0);
  g_assert_cmpfloat (f[VZ], ==, -G0);
  g_assert_cmpfloat (f[VX], <, 0.0);
}

/* ---- the independent reference ---- */

typedef struct
{
  const char *name;
  double mass_g, speed, elevation_deg, height, lift_ratio, tilt_deg;
  double wind[3];
  AwLiftModel lift;
  AwDragModel drag;
} CrossCase;

/* a spread of shots: mass 0.12–0.48 g, 60–160 m/s, elevation −5…+30°, tilt ±20°, head, tail and
 * cross winds, every lift model, both drag laws */
#define SAT   AW_LIFT_SATURATING
#define SHS   AW_LIFT_SHS
#define LOTH  AW_LIFT_LOTH
#define LIN   AW_LIFT_LINEAR
#define CLIFT AW_DRAG_CLIFT
#define MORR  AW_DRAG_MORRISON
static const CrossCase cross_cases[] = {
  { "light fast",         0.12, 160.0,  0.0, 1.5, 1.0,   0.0, {  0.0,  0.0, 0.0 }, SAT, CLIFT },
  { "headwind",           0.20, 100.0,  0.0, 1.5, 1.2,   0.0, { -3.0,  0.0, 0.0 }, SAT, CLIFT },
  { "tailwind up 5",      0.20,  90.0,  5.0, 1.5, 0.8,   0.0, {  4.0,  0.0, 0.0 }, SAT, CLIFT },
  { "crosswind",          0.25,  95.0,  0.0, 1.5, 1.0,   0.0, {  0.0,  3.0, 0.0 }, SAT, CLIFT },
  { "tilt +20 cross",     0.28, 110.0,  2.0, 1.0, 1.1,  20.0, {  0.0, -2.0, 0.0 }, SAT, CLIFT },
  { "tilt -20 down 5",    0.30, 120.0, -5.0, 1.5, 0.5, -20.0, {  0.0,  0.0, 0.0 }, SAT, CLIFT },
  { "prone quartering",   0.32, 130.0, 10.0, 0.3, 1.3,   0.0, {  2.0,  1.0, 0.0 }, SAT, CLIFT },
  { "lob 30",             0.36, 140.0, 30.0, 1.5, 0.6,   0.0, {  0.0,  0.0, 0.0 }, SAT, CLIFT },
  { "over-hop",           0.40,  80.0, 15.0, 1.5, 2.0,   0.0, {  0.0,  0.0, 0.0 }, SAT, CLIFT },
  { "no spin, wind",      0.43,  70.0, -2.0, 1.5, 0.0,   0.0, { -2.0,  2.0, 0.0 }, SAT, CLIFT },
  { "SHS, Morrison",      0.45, 150.0,  0.0, 1.5, 1.5,   0.0, {  0.0,  0.0, 0.0 }, SHS, MORR },
  { "trade, updraft",     0.48,  60.0, 20.0, 1.5, 1.0,  10.0, {  0.0,  0.0, 0.5 }, LIN, CLIFT },
  { "light strong hop",   0.12,  60.0, -5.0, 2.0, 3.0, -15.0, {  0.0, -4.0, 0.0 }, SAT, CLIFT },
  { "Loth, 25",           0.20,  90.0, 25.0, 1.5, 0.9,   5.0, {  1.0,  0.0, 0.0 }, LOTH, CLIFT },
};
#undef SAT
#undef SHS
#undef LOTH
#undef LIN
#undef CLIFT
#undef MORR

static void
cross_shot (const CrossCase *c, AwShot *s)
{
  regression_shot (s);
  s->mass_kg = aw_g_to_kg (c->mass_g);
  s->velocity_mps = c->speed;
  s->elevation_rad = aw_deg_to_rad (c->elevation_deg);
  s->height_m = c->height;
  s->hop_tilt_rad = aw_deg_to_rad (c->tilt_deg);
  memcpy (s->wind, c->wind, sizeof s->wind);
  s->aero.lift = c->lift;
  s->aero.drag = c->drag;
  g_assert_cmpint (aw_shot_spin_for_lift_ratio (s, c->lift_ratio, &s->spin_rad_s), ==, AW_HOP_OK);
}

static void
test_reference_impacts (void)
{
  double worst = 0.0;
  for (guint i = 0; i < G_N_ELEMENTS (cross_cases); i++)
    {
      AwShot s;
      AwTrajectory tr = { 0 };
      double t, y[AW_FLIGHT_STATE_DIM];

      cross_shot (&cross_cases[i], &s);
      g_assert_cmpint (run (&s, NULL, &tr), ==, AW_FLIGHT_GROUND);
      ref_ground (&s, &t, y);
      double miss = hypot (tr.ground_distance - y[PX], tr.ground_drift - y[PY]);
      worst = fmax (worst, miss);
      g_test_message ("%-18s x %8.4f y %8.4f t %.5f | ref x %8.4f y %8.4f t %.5f | miss %.2e m, "
                      "%d steps", cross_cases[i].name, tr.ground_distance, tr.ground_drift,
                      tr.time_of_flight, y[PX], y[PY], t, miss, tr.steps_accepted);
      /* an independent integrator (GSL rk8pd at 1e-12) on the same equations */
      g_assert_cmpfloat (miss, <=, IMPACT_TOL_M);
      g_assert_cmpfloat (fabs (tr.end.z), <, 1e-9);
      aw_trajectory_clear (&tr);
    }
  g_test_message ("worst impact miss at the default tolerance: %.3g mm", worst * 1e3);
}

/* The regression values of physics.md §5 again, from the reference integrator: the table and the
 * reference agree, so a failure of the engine above is the engine's. */
static void
test_reference_regression (void)
{
  AwShot s;
  double t, y[AW_FLIGHT_STATE_DIM];

  regression_shot (&s);
  s.spin_rad_s = aw_rpm_to_rad_s (4318.28);
  ref_ground (&s, &t, y);
  CHECK_REL (t, 0.92571);
  CHECK_REL (y[PX], 38.0856);
  CHECK_REL (aw_rad_s_to_rpm (fabs (y[WY])), 3683.0);
}

/* Fixed-distance samples: exactly at multiples of the step, on the trajectory (located on the dense
 * output, compared with the reference at the same x), then the end point. */
static void
test_samples (void)
{
  AwShot s;
  AwFlightOptions o;
  AwTrajectory tr = { 0 };
  Ref r;

  cross_shot (&cross_cases[4], &s);   /* tilted, crosswind: every component moves */
  aw_flight_options_init (&o);
  o.sample_step_m = 2.5;
  g_assert_cmpint (run (&s, &o, &tr), ==, AW_FLIGHT_GROUND);
  size_t n_fixed = (size_t) floor (tr.ground_distance / 2.5) + 1;
  g_assert_cmpuint (tr.n_samples, ==, n_fixed + 1);
  for (size_t i = 0; i < n_fixed; i++)
    {
      g_assert_cmpfloat (tr.samples[i].x, ==, i * 2.5);
      if (i > 0)
        g_assert_cmpfloat (tr.samples[i].t, >, tr.samples[i - 1].t);
    }
  /* the last sample is the impact */
  g_assert_cmpfloat (tr.samples[tr.n_samples - 1].x, ==, tr.ground_distance);
  g_assert_cmpfloat (tr.samples[tr.n_samples - 1].z, ==, 0.0);

  ref_init (&r, &s);
  for (double x = 10.0; x < tr.ground_distance; x += 10.0)
    {
      double t, y[AW_FLIGHT_STATE_DIM];
      const AwSample *smp = &tr.samples[(size_t) (x / 2.5)];
      g_assert_true (ref_run (&r, PX, x, +1, 10.0, &t, y));
      g_test_message ("x %.1f: z %.6f (ref %.6f) y %.6f (ref %.6f)", x, smp->z, y[PZ], smp->y,
                      y[PY]);
      g_assert_cmpfloat (hypot (smp->z - y[PZ], smp->y - y[PY]), <=, IMPACT_TOL_M);
      g_assert_cmpfloat_with_epsilon (smp->t, t, IMPACT_TOL_M / smp->speed);
    }

  /* at a tight engine tolerance the samples agree to a micrometre: they come from the dense
   * output, not from linear interpolation between steps */
  o.rtol = o.atol = 1e-10;
  g_assert_cmpint (run (&s, &o, &tr), ==, AW_FLIGHT_GROUND);
  for (double x = 10.0; x < tr.ground_distance; x += 10.0)
    {
      double t, y[AW_FLIGHT_STATE_DIM];
      const AwSample *smp = &tr.samples[(size_t) (x / 2.5)];
      g_assert_true (ref_run (&r, PX, x, +1, 10.0, &t, y));
      g_assert_cmpfloat (hypot (smp->z - y[PZ], smp->y - y[PY]), <=, 1e-6);
    }
  ref_clear (&r);

  /* without keep_samples nothing is stored; a step ≤ 0 gives no fixed samples, only the end */
  o.keep_samples = FALSE;
  g_assert_cmpint (run (&s, &o, &tr), ==, AW_FLIGHT_GROUND);
  g_assert_cmpuint (tr.n_samples, ==, 0);
  o.keep_samples = TRUE;
  o.sample_step_m = 0.0;
  g_assert_cmpint (run (&s, &o, &tr), ==, AW_FLIGHT_GROUND);
  g_assert_cmpuint (tr.n_samples, ==, 1);
  g_assert_cmpfloat (tr.samples[0].z, ==, 0.0);
  aw_trajectory_clear (&tr);
}

/* aw_trajectory_at interpolates between stored samples */
static void
test_trajectory_at (void)
{
  AwShot s;
  AwTrajectory tr = { 0 };
  AwSample a, b, m;

  regression_shot (&s);
  g_assert_cmpint (run (&s, NULL, &tr), ==, AW_FLIGHT_GROUND);
  g_assert_true (aw_trajectory_at (&tr, 12.0, &a));
  g_assert_cmpfloat (a.x, ==, 12.0);
  g_assert_cmpfloat (a.z, ==, tr.samples[12].z);
  g_assert_true (aw_trajectory_at (&tr, 13.0, &b));
  g_assert_true (aw_trajectory_at (&tr, 12.5, &m));
  g_assert_cmpfloat_with_epsilon (m.z, 0.5 * (a.z + b.z), 1e-12);
  g_assert_false (aw_trajectory_at (&tr, -1.0, &m));
  g_assert_false (aw_trajectory_at (&tr, tr.ground_distance + 0.1, &m));
  g_assert_false (aw_trajectory_at (&tr, NAN, &m));
  aw_trajectory_clear (&tr);
  g_assert_false (aw_trajectory_at (&tr, 1.0, &m));
}

/* The apex event, located on the dense output, against the reference (vz falling through 0) */
static void
test_apex (void)
{
  static const struct { double elev_deg, lift_ratio; } cases[] = {
    { 10.0, 0.0 },    /* fired upward, no hop */
    { 0.0, 2.0 },     /* level bore, over-hopped: climbs, then drops */
    { 3.0, 1.2 },
  };
  for (guint i = 0; i < G_N_ELEMENTS (cases); i++)
    {
      AwShot s;
      AwTrajectory tr = { 0 };
      Ref r;
      double t, y[AW_FLIGHT_STATE_DIM];

      regression_shot (&s);
      s.elevation_rad = aw_deg_to_rad (cases[i].elev_deg);
      g_assert_cmpint (aw_shot_spin_for_lift_ratio (&s, cases[i].lift_ratio, &s.spin_rad_s), ==,
                       AW_HOP_OK);
      g_assert_cmpint (run (&s, NULL, &tr), ==, AW_FLIGHT_GROUND);
      ref_init (&r, &s);
      g_assert_true (ref_run (&r, VZ, 0.0, -1, 10.0, &t, y));
      ref_clear (&r);
      g_test_message ("apex %.6f m at %.5f m (ref %.6f at %.5f)", tr.apex_height,
                      tr.apex_distance, y[PZ], y[PX]);
      g_assert_cmpfloat (tr.apex_height, >, s.height_m + 0.05);
      g_assert_cmpfloat_with_epsilon (tr.apex_height, y[PZ], IMPACT_TOL_M);
      g_assert_cmpfloat_with_epsilon (tr.apex_distance, y[PX], IMPACT_TOL_M);
      aw_trajectory_clear (&tr);
    }
}

/* The sample callback: called once per stored sample; returning false stops the flight with
 * AW_FLIGHT_STOPPED, keeping the samples produced so far */
typedef struct
{
  guint calls, stop_at;
  double last_x;
} CbData;

static bool
count_cb (const AwSample *sample, void *user_data)
{
  CbData *d = user_data;
  d->calls++;
  d->last_x = sample->x;
  return d->stop_at == 0 || d->calls < d->stop_at;
}

static void
test_callback_stop (void)
{
  AwShot s;
  AwFlightOptions o;
  AwTrajectory tr = { 0 };
  CbData d = { 0, 0, -1.0 };

  regression_shot (&s);
  aw_flight_options_init (&o);
  g_assert_cmpint (aw_flight_run_full (&s, &o, &tr, count_cb, &d), ==, AW_FLIGHT_GROUND);
  /* every fixed-distance sample goes through the callback (the end point is stored only) */
  g_assert_cmpuint (d.calls, ==, tr.n_samples - 1);
  g_assert_cmpfloat (d.last_x, ==, floor (tr.ground_distance));

  d = (CbData) { 0, 3, -1.0 };
  g_assert_cmpint (aw_flight_run_full (&s, &o, &tr, count_cb, &d), ==, AW_FLIGHT_STOPPED);
  g_assert_cmpint (tr.status, ==, AW_FLIGHT_STOPPED);
  g_assert_cmpuint (d.calls, ==, 3);
  g_assert_cmpfloat (d.last_x, ==, 2.0);
  g_assert_cmpuint (tr.n_samples, <=, 3);

  /* stop at the muzzle sample */
  d = (CbData) { 0, 1, -1.0 };
  g_assert_cmpint (aw_flight_run_full (&s, &o, &tr, count_cb, &d), ==, AW_FLIGHT_STOPPED);
  g_assert_cmpuint (d.calls, ==, 1);
  aw_trajectory_clear (&tr);
}

/* ---- hop conversion ---- */

/* Magnus acceleration ÷ g at the muzzle from the right-hand side: the part of dv/dt + g·ẑ normal to
 * the air-relative velocity (the drag is along it) */
static double
rhs_lift_ratio (const AwShot *s)
{
  double y[AW_FLIGHT_STATE_DIM], f[AW_FLIGHT_STATE_DIM];
  aw_shot_initial_state (s, y);
  aw_flight_rhs (s, y, f);
  double a[3] = { f[VX], f[VY], f[VZ] + s->gravity };
  double vr[3] = { y[VX] - s->wind[0], y[VY] - s->wind[1], y[VZ] - s->wind[2] };
  double V = sqrt (vr[0] * vr[0] + vr[1] * vr[1] + vr[2] * vr[2]);
  double along = (a[0] * vr[0] + a[1] * vr[1] + a[2] * vr[2]) / V;
  for (int k = 0; k < 3; k++)
    a[k] -= along * vr[k] / V;
  return sqrt (a[0] * a[0] + a[1] * a[1] + a[2] * a[2]) / s->gravity;
}

static void
test_hop_round_trip (void)
{
  static const struct { AwLiftModel lift; double slope; } models[] = {
    { AW_LIFT_SATURATING, 0 }, { AW_LIFT_SHS, 0 }, { AW_LIFT_LOTH, 0 },
    { AW_LIFT_LINEAR, AW_LIFT_TRADE_SLOPE }, { AW_LIFT_LINEAR, 1.0 },
  };
  static const double ratios[] = { 0.05, 0.5, 1.0, 1.5, 3.0 };

  for (guint m = 0; m < G_N_ELEMENTS (models); m++)
    for (guint c = 0; c < 3; c++)
      for (guint i = 0; i < G_N_ELEMENTS (ratios); i++)
        {
          AwShot s;
          double w = -1.0;
          regression_shot (&s);
          s.aero.lift = models[m].lift;
          if (models[m].slope > 0.0)
            s.aero.lift_slope = models[m].slope;
          if (c == 1)
            {
              s.elevation_rad = aw_deg_to_rad (10.0);
              s.hop_tilt_rad = aw_deg_to_rad (20.0);
              s.mass_kg = 0.28e-3;
              s.velocity_mps = 110.0;
            }
          else if (c == 2)
            {
              s.wind[0] = -3.0;
              s.wind[1] = 2.0;
              s.aero.lift_factor = 0.8;
              s.mass_kg = 0.30e-3;
              s.velocity_mps = 85.0;
            }
          g_assert_cmpint (aw_shot_spin_for_lift_ratio (&s, ratios[i], &w), ==, AW_HOP_OK);
          g_assert_cmpfloat (w, >, 0.0);
          double back = aw_shot_lift_ratio_for_spin (&s, w);
          s.spin_rad_s = w;
          double from_rhs = rhs_lift_ratio (&s);
          g_test_message ("model %d k %g case %u ratio %.2f: %.1f rpm -> %.12f, rhs %.12f",
                          s.aero.lift, s.aero.lift_slope, c, ratios[i], aw_rad_s_to_rpm (w), back,
                          from_rhs);
          g_assert_cmpfloat_with_epsilon (back / ratios[i], 1.0, 1e-9);
          /* the right-hand side agrees: Magnus force ÷ weight at launch (physics.md design 1) */
          g_assert_cmpfloat_with_epsilon (from_rhs / ratios[i], 1.0, 1e-9);
        }
}

static void
test_hop_status (void)
{
  AwShot s;
  double w = 42.0;

  regression_shot (&s);
  /* physics.md §3.1e: S/(1+2S) saturates at 0.5 → lift ratio ≤ ½ρAV²·0.5/(mg) ≈ 34 here (CALC) */
  g_assert_cmpint (aw_shot_spin_for_lift_ratio (&s, 1000.0, &w), ==, AW_HOP_UNREACHABLE);
  g_assert_cmpint (aw_shot_spin_for_lift_ratio (&s, 40.0, &w), ==, AW_HOP_UNREACHABLE);
  g_assert_cmpfloat (w, ==, 42.0);
  g_assert_cmpint (aw_shot_spin_for_lift_ratio (&s, 20.0, &w), ==, AW_HOP_OK);
  /* a linear model beyond the spin limit of the shot (1e5 rad/s) */
  s.aero.lift = AW_LIFT_LINEAR;
  s.aero.lift_slope = AW_LIFT_TRADE_SLOPE;
  g_assert_cmpint (aw_shot_spin_for_lift_ratio (&s, 20.0, &w), ==, AW_HOP_UNREACHABLE);
  /* lift off, or a zero lift factor */
  w = 42.0;
  s.aero.lift = AW_LIFT_OFF;
  g_assert_cmpint (aw_shot_spin_for_lift_ratio (&s, 1.0, &w), ==, AW_HOP_NO_LIFT);
  s.aero.lift = AW_LIFT_SATURATING;
  s.aero.lift_factor = 0.0;
  g_assert_cmpint (aw_shot_spin_for_lift_ratio (&s, 1.0, &w), ==, AW_HOP_NO_LIFT);
  g_assert_cmpfloat (w, ==, 42.0);
  s.aero.lift_factor = 1.0;
  /* no hop asked */
  g_assert_cmpint (aw_shot_spin_for_lift_ratio (&s, 0.0, &w), ==, AW_HOP_OK);
  g_assert_cmpfloat (w, ==, 0.0);
  /* bad requests */
  w = 42.0;
  g_assert_cmpint (aw_shot_spin_for_lift_ratio (&s, NAN, &w), ==, AW_HOP_BAD_INPUT);
  g_assert_cmpint (aw_shot_spin_for_lift_ratio (&s, -1.0, &w), ==, AW_HOP_BAD_INPUT);
  g_assert_cmpint (aw_shot_spin_for_lift_ratio (&s, INFINITY, &w), ==, AW_HOP_BAD_INPUT);
  g_assert_cmpfloat (w, ==, 42.0);
  g_assert_true (isnan (aw_shot_lift_ratio_for_spin (&s, NAN)));
  g_assert_true (isnan (aw_shot_lift_ratio_for_spin (&s, -5.0)));
  s.mass_kg = NAN;
  g_assert_cmpint (aw_shot_spin_for_lift_ratio (&s, 1.0, &w), ==, AW_HOP_BAD_INPUT);
  g_assert_true (isnan (aw_shot_lift_ratio_for_spin (&s, 100.0)));
}

/* ---- trade facts as properties (common practice, no source) ---- */

/* physics.md §6 rows at equal energy 1.000 J, ρ = 1.2: 0.20 g at 100 m/s needs 3 865 rpm (S/(1+2S))
 * and 2 516 rpm (SHS); 0.28 g at 84.52 m/s needs 6 553 and 4 167 rpm (CALC, spin printed to ±1 rpm;
 * 84.52 to ±0.005 m/s). The trade's reading: a heavier BB at the same energy leaves slower and
 * needs more hop (common practice, no source). */
static void
test_trade_heavier_needs_more_spin (void)
{
  static const struct { AwLiftModel lift; double rpm20, rpm28; } rows[] = {
    { AW_LIFT_SATURATING, 3865.0, 6553.0 }, { AW_LIFT_SHS, 2516.0, 4167.0 },
  };
  double v20 = aw_velocity_for_energy (0.20e-3, 1.0);
  double v28 = aw_velocity_for_energy (0.28e-3, 1.0);
  /* trade.md anchor: 0.20 g at 100 m/s = 1.00 J */
  g_assert_cmpfloat_with_epsilon (v20, 100.0, 1e-12);
  g_assert_cmpfloat_with_epsilon (v28, 84.52, 0.005);   /* physics.md §6 (CALC) */
  g_assert_cmpfloat (v28, <, v20);   /* common practice, no source */

  for (guint i = 0; i < G_N_ELEMENTS (rows); i++)
    {
      AwShot a, b;
      double wa, wb;
      regression_shot (&a);
      a.aero.lift = rows[i].lift;
      b = a;
      a.velocity_mps = v20;
      b.mass_kg = 0.28e-3;
      b.velocity_mps = v28;
      g_assert_cmpint (aw_shot_spin_for_lift_ratio (&a, 1.0, &wa), ==, AW_HOP_OK);
      g_assert_cmpint (aw_shot_spin_for_lift_ratio (&b, 1.0, &wb), ==, AW_HOP_OK);
      g_test_message ("model %d: 0.20 g %.1f rpm, 0.28 g %.1f rpm", rows[i].lift,
                      aw_rad_s_to_rpm (wa), aw_rad_s_to_rpm (wb));
      g_assert_cmpfloat_with_epsilon (aw_rad_s_to_rpm (wa), rows[i].rpm20, 1.0);
      g_assert_cmpfloat_with_epsilon (aw_rad_s_to_rpm (wb), rows[i].rpm28, 1.0);
      g_assert_cmpfloat (wb, >, wa);   /* common practice, no source */
    }
}

/* Magnus force grows with V² at a fixed spin parameter (common practice, no source; it is
 * F_M = ½ρA·V²·C_L(S) of physics.md §3): lift at 2V is four times the lift at V */
static void
test_trade_magnus_v_squared (void)
{
  static const AwLiftModel lifts[] = { AW_LIFT_SATURATING, AW_LIFT_SHS, AW_LIFT_LOTH,
                                       AW_LIFT_LINEAR };
  const double S = 0.08;

  for (guint i = 0; i < G_N_ELEMENTS (lifts); i++)
    {
      AwShot s;
      double prev = 0.0;
      regression_shot (&s);
      s.aero.lift = lifts[i];
      double r = 0.5 * s.diameter_m;
      for (double V = 30.0; V <= 240.0; V *= 2.0)
        {
          double y[AW_FLIGHT_STATE_DIM] = { 0, 0, 1.5, V, 0, 0, 0, -S * V / r, 0 };
          double f[AW_FLIGHT_STATE_DIM];
          aw_flight_rhs (&s, y, f);
          double lift = f[VZ] + G0;
          if (prev > 0.0)
            g_assert_cmpfloat_with_epsilon (lift / prev, 4.0, 1e-12);
          prev = lift;
        }
    }
}

/* The trade-matched preset (linear k = 0.032): about 130 000 rpm holds a 0.20 g BB level at about
 * 90 m/s (common practice, no source; physics.md §6, ρ = 1.2). */
#define TRADE_RPM       130000.0
#define TRADE_RPM_RTOL  0.05

static void
test_trade_preset (void)
{
  AwShot s;
  double w;

  regression_shot (&s);
  s.aero.lift = AW_LIFT_LINEAR;
  s.aero.lift_slope = AW_LIFT_TRADE_SLOPE;
  g_assert_cmpint (aw_shot_spin_for_lift_ratio (&s, 1.0, &w), ==, AW_HOP_OK);
  g_test_message ("trade preset, lift ratio 1: %.0f rpm", aw_rad_s_to_rpm (w));
  g_assert_cmpfloat_with_epsilon (aw_rad_s_to_rpm (w) / TRADE_RPM, 1.0, TRADE_RPM_RTOL);
  /* physics.md §6: 130 000 rpm is S = 0.450 at 90 m/s, and C_L,req/S = 0.032 (CALC) */
  double s130 = 0.5 * s.diameter_m * aw_rpm_to_rad_s (130000.0) / 90.0;
  g_assert_cmpfloat_with_epsilon (s130, 0.450, 5e-4);
  g_assert_cmpfloat_with_epsilon (aw_shot_lift_ratio_for_spin (&s, aw_rpm_to_rad_s (130000.0))
                                  * 0.01451 / s130, AW_LIFT_TRADE_SLOPE, 5e-4);
}

/* ---- physics sanity ---- */

static void
test_sanity_drift (void)
{
  AwShot s;
  AwTrajectory tr = { 0 };

  /* aw-flight.h: a positive hop tilt curves the BB to the right, −y */
  regression_shot (&s);
  s.hop_tilt_rad = aw_deg_to_rad (10.0);
  g_assert_cmpint (aw_shot_spin_for_lift_ratio (&s, 1.0, &s.spin_rad_s), ==, AW_HOP_OK);
  g_assert_cmpint (run (&s, NULL, &tr), ==, AW_FLIGHT_GROUND);
  g_test_message ("tilt +10: drift %.4f m", tr.ground_drift);
  g_assert_cmpfloat (tr.ground_drift, <, -0.05);
  /* and a negative tilt mirrors it */
  double right = tr.ground_drift;
  s.hop_tilt_rad = -s.hop_tilt_rad;
  g_assert_cmpint (run (&s, NULL, &tr), ==, AW_FLIGHT_GROUND);
  g_assert_cmpfloat_with_epsilon (tr.ground_drift, -right, 1e-9);

  /* aw-flight.h: a crosswind W > 0 blows toward +y */
  regression_shot (&s);
  s.wind[1] = 3.0;
  g_assert_cmpint (run (&s, NULL, &tr), ==, AW_FLIGHT_GROUND);
  g_test_message ("crosswind +3: drift %.4f m", tr.ground_drift);
  g_assert_cmpfloat (tr.ground_drift, >, 0.05);
  g_assert_cmpfloat (tr.ground_drift, <, 3.0 * tr.time_of_flight);   /* never faster than the air */

  /* backspin carries farther than none; lift ratio 1 holds it longer in the air */
  regression_shot (&s);
  g_assert_cmpint (run (&s, NULL, &tr), ==, AW_FLIGHT_GROUND);
  double plain = tr.ground_distance;
  g_assert_cmpint (aw_shot_spin_for_lift_ratio (&s, 1.0, &s.spin_rad_s), ==, AW_HOP_OK);
  g_assert_cmpint (run (&s, NULL, &tr), ==, AW_FLIGHT_GROUND);
  g_assert_cmpfloat (tr.ground_distance, >, plain + 3.0);

  /* a headwind shortens the flight, a tailwind lengthens it */
  regression_shot (&s);
  s.wind[0] = -3.0;
  g_assert_cmpint (run (&s, NULL, &tr), ==, AW_FLIGHT_GROUND);
  g_assert_cmpfloat (tr.ground_distance, <, plain);
  s.wind[0] = 3.0;
  g_assert_cmpint (run (&s, NULL, &tr), ==, AW_FLIGHT_GROUND);
  g_assert_cmpfloat (tr.ground_distance, >, plain);
  aw_trajectory_clear (&tr);
}

/* ---- bad input ---- */

typedef enum
{
  F_MASS, F_DIAMETER, F_VELOCITY, F_ELEVATION, F_HEIGHT, F_SPIN, F_TILT, F_WIND0, F_WIND1, F_WIND2,
  F_GRAVITY, F_DENSITY, F_VISCOSITY, F_DRAG_MODEL, F_LIFT_MODEL, F_DRAG_CD, F_LIFT_SLOPE, F_CM,
  F_KAPPA, F_LIFT_FACTOR, F_DRAG_FACTOR, F_DECAY_FACTOR,
} ShotField;

static void
set_field (AwShot *s, ShotField f, double v)
{
  switch (f)
    {
    case F_MASS: s->mass_kg = v; break;
    case F_DIAMETER: s->diameter_m = v; break;
    case F_VELOCITY: s->velocity_mps = v; break;
    case F_ELEVATION: s->elevation_rad = v; break;
    case F_HEIGHT: s->height_m = v; break;
    case F_SPIN: s->spin_rad_s = v; break;
    case F_TILT: s->hop_tilt_rad = v; break;
    case F_WIND0: s->wind[0] = v; break;
    case F_WIND1: s->wind[1] = v; break;
    case F_WIND2: s->wind[2] = v; break;
    case F_GRAVITY: s->gravity = v; break;
    case F_DENSITY: s->air.density = v; break;
    case F_VISCOSITY: s->air.viscosity = v; break;
    case F_DRAG_MODEL: s->aero.drag = (AwDragModel) (int) v; break;
    case F_LIFT_MODEL: s->aero.lift = (AwLiftModel) (int) v; break;
    case F_DRAG_CD: s->aero.drag_cd = v; break;
    case F_LIFT_SLOPE: s->aero.lift_slope = v; break;
    case F_CM: s->aero.spin_decay_cm = v; break;
    case F_KAPPA: s->aero.inertia_factor = v; break;
    case F_LIFT_FACTOR: s->aero.lift_factor = v; break;
    case F_DRAG_FACTOR: s->aero.drag_factor = v; break;
    case F_DECAY_FACTOR: s->aero.spin_decay_factor = v; break;
    default: g_assert_not_reached ();
    }
}

static void
test_bad_shot (void)
{
  /* aw-flight.h ranges: each bad field reaches its own status code */
  static const struct { ShotField f; double v; AwShotStatus expect; } cases[] = {
    { F_MASS, NAN, AW_SHOT_BAD_MASS }, { F_MASS, 0.0, AW_SHOT_BAD_MASS },
    { F_MASS, -0.2e-3, AW_SHOT_BAD_MASS }, { F_MASS, 1.0, AW_SHOT_BAD_MASS },
    { F_MASS, INFINITY, AW_SHOT_BAD_MASS }, { F_MASS, 0.2, AW_SHOT_BAD_MASS },   /* grams as kg */
    { F_DIAMETER, NAN, AW_SHOT_BAD_DIAMETER }, { F_DIAMETER, 0.0, AW_SHOT_BAD_DIAMETER },
    { F_DIAMETER, -5.95e-3, AW_SHOT_BAD_DIAMETER }, { F_DIAMETER, 5.95, AW_SHOT_BAD_DIAMETER },
    { F_VELOCITY, NAN, AW_SHOT_BAD_VELOCITY }, { F_VELOCITY, 0.0, AW_SHOT_BAD_VELOCITY },
    { F_VELOCITY, -90.0, AW_SHOT_BAD_VELOCITY }, { F_VELOCITY, 1e4, AW_SHOT_BAD_VELOCITY },
    { F_VELOCITY, -INFINITY, AW_SHOT_BAD_VELOCITY },
    { F_ELEVATION, NAN, AW_SHOT_BAD_ELEVATION }, { F_ELEVATION, 2.0, AW_SHOT_BAD_ELEVATION },
    { F_ELEVATION, -2.0, AW_SHOT_BAD_ELEVATION }, { F_ELEVATION, 30.0, AW_SHOT_BAD_ELEVATION },
    { F_HEIGHT, NAN, AW_SHOT_BAD_HEIGHT }, { F_HEIGHT, -0.1, AW_SHOT_BAD_HEIGHT },
    { F_HEIGHT, 1e6, AW_SHOT_BAD_HEIGHT },
    { F_SPIN, NAN, AW_SHOT_BAD_SPIN }, { F_SPIN, -10.0, AW_SHOT_BAD_SPIN },
    { F_SPIN, 1e7, AW_SHOT_BAD_SPIN }, { F_SPIN, INFINITY, AW_SHOT_BAD_SPIN },
    { F_TILT, NAN, AW_SHOT_BAD_TILT }, { F_TILT, 3.0, AW_SHOT_BAD_TILT },
    { F_TILT, -20.0, AW_SHOT_BAD_TILT },
    { F_WIND0, NAN, AW_SHOT_BAD_WIND }, { F_WIND1, 1e3, AW_SHOT_BAD_WIND },
    { F_WIND2, -INFINITY, AW_SHOT_BAD_WIND }, { F_WIND1, -51.0, AW_SHOT_BAD_WIND },
    { F_GRAVITY, NAN, AW_SHOT_BAD_GRAVITY }, { F_GRAVITY, 0.0, AW_SHOT_BAD_GRAVITY },
    { F_GRAVITY, -G0, AW_SHOT_BAD_GRAVITY }, { F_GRAVITY, 1e3, AW_SHOT_BAD_GRAVITY },
    { F_DENSITY, NAN, AW_SHOT_BAD_DENSITY }, { F_DENSITY, 0.0, AW_SHOT_BAD_DENSITY },
    { F_DENSITY, -1.2, AW_SHOT_BAD_DENSITY }, { F_DENSITY, 1000.0, AW_SHOT_BAD_DENSITY },
    { F_VISCOSITY, NAN, AW_SHOT_BAD_VISCOSITY }, { F_VISCOSITY, 0.0, AW_SHOT_BAD_VISCOSITY },
    { F_VISCOSITY, 1.0, AW_SHOT_BAD_VISCOSITY },
    { F_DRAG_MODEL, 99, AW_SHOT_BAD_MODEL }, { F_DRAG_MODEL, -1, AW_SHOT_BAD_MODEL },
    { F_LIFT_MODEL, 99, AW_SHOT_BAD_MODEL }, { F_LIFT_MODEL, -3, AW_SHOT_BAD_MODEL },
    { F_DRAG_CD, NAN, AW_SHOT_BAD_MODEL }, { F_DRAG_CD, -0.47, AW_SHOT_BAD_MODEL },
    { F_LIFT_SLOPE, NAN, AW_SHOT_BAD_MODEL }, { F_LIFT_SLOPE, -1.0, AW_SHOT_BAD_MODEL },
    { F_CM, NAN, AW_SHOT_BAD_MODEL }, { F_CM, -0.02, AW_SHOT_BAD_MODEL },
    { F_KAPPA, 0.0, AW_SHOT_BAD_MODEL }, { F_KAPPA, 2.0, AW_SHOT_BAD_MODEL },
    { F_KAPPA, NAN, AW_SHOT_BAD_MODEL },
    { F_LIFT_FACTOR, NAN, AW_SHOT_BAD_MODEL }, { F_LIFT_FACTOR, -1.0, AW_SHOT_BAD_MODEL },
    { F_LIFT_FACTOR, 1e9, AW_SHOT_BAD_MODEL },
    { F_DRAG_FACTOR, NAN, AW_SHOT_BAD_MODEL }, { F_DRAG_FACTOR, -1.0, AW_SHOT_BAD_MODEL },
    { F_DECAY_FACTOR, INFINITY, AW_SHOT_BAD_MODEL },
  };
  AwTrajectory tr = { 0 };
  AwShot good;

  /* a reused trajectory: a bad run must not leave the old samples behind as if they were new */
  regression_shot (&good);
  g_assert_cmpint (run (&good, NULL, &tr), ==, AW_FLIGHT_GROUND);
  g_assert_cmpuint (tr.n_samples, >, 0);

  for (guint i = 0; i < G_N_ELEMENTS (cases); i++)
    {
      AwShot s = good;
      double w = 42.0;
      set_field (&s, cases[i].f, cases[i].v);
      g_test_message ("field %d = %g: %s", cases[i].f, cases[i].v,
                      aw_shot_status_name (aw_shot_validate (&s)));
      g_assert_cmpint (aw_shot_validate (&s), ==, cases[i].expect);
      g_assert_cmpint (run (&s, NULL, &tr), ==, AW_FLIGHT_BAD_INPUT);
      g_assert_cmpint (tr.status, ==, AW_FLIGHT_BAD_INPUT);
      g_assert_cmpint (tr.shot_status, ==, cases[i].expect);
      g_assert_cmpuint (tr.n_samples, ==, 0);
      g_assert_cmpint (aw_shot_spin_for_lift_ratio (&s, 1.0, &w), ==, AW_HOP_BAD_INPUT);
      g_assert_cmpfloat (w, ==, 42.0);
      g_assert_true (isnan (aw_shot_lift_ratio_for_spin (&s, 100.0)));
      g_assert_cmpstr (aw_shot_status_name (cases[i].expect), !=, "unknown");
    }
  aw_trajectory_clear (&tr);
}

typedef enum { O_RTOL, O_ATOL, O_STEP, O_DIST, O_TIME, O_STEPS } OptField;

static void
test_bad_options (void)
{
  static const struct { OptField f; double v; } cases[] = {
    { O_RTOL, 0.0 }, { O_RTOL, -1e-6 }, { O_RTOL, NAN }, { O_RTOL, INFINITY },
    { O_ATOL, 0.0 }, { O_ATOL, NAN }, { O_ATOL, -INFINITY },
    { O_STEP, NAN }, { O_STEP, INFINITY }, { O_STEP, 1e-4 },
    { O_DIST, NAN }, { O_DIST, INFINITY },
    { O_TIME, 0.0 }, { O_TIME, -1.0 }, { O_TIME, NAN }, { O_TIME, INFINITY },
    { O_STEPS, 0 }, { O_STEPS, -5 },
  };
  AwShot s;
  AwTrajectory tr = { 0 };

  regression_shot (&s);
  for (guint i = 0; i < G_N_ELEMENTS (cases); i++)
    {
      AwFlightOptions o;
      aw_flight_options_init (&o);
      switch (cases[i].f)
        {
        case O_RTOL: o.rtol = cases[i].v; break;
        case O_ATOL: o.atol = cases[i].v; break;
        case O_STEP: o.sample_step_m = cases[i].v; break;
        case O_DIST: o.max_distance_m = cases[i].v; break;
        case O_TIME: o.max_time_s = cases[i].v; break;
        case O_STEPS: o.max_steps = (int) cases[i].v; break;
        default: g_assert_not_reached ();
        }
      g_test_message ("option %d = %g", cases[i].f, cases[i].v);
      g_assert_cmpint (aw_flight_run (&s, &o, &tr), ==, AW_FLIGHT_BAD_INPUT);
      g_assert_cmpint (tr.shot_status, ==, AW_SHOT_OK);
      g_assert_cmpuint (tr.n_samples, ==, 0);
    }

  /* limits that are legal but cannot be met end with their own codes */
  AwFlightOptions o;
  aw_flight_options_init (&o);
  o.max_steps = 3;
  g_assert_cmpint (aw_flight_run (&s, &o, &tr), ==, AW_FLIGHT_TOO_MANY_STEPS);
  aw_flight_options_init (&o);
  o.rtol = o.atol = 1e-300;
  o.max_steps = 2000;
  AwFlightStatus st = aw_flight_run (&s, &o, &tr);
  g_assert_true (st == AW_FLIGHT_STEP_UNDERFLOW || st == AW_FLIGHT_TOO_MANY_STEPS);
  /* a very loose tolerance still ends on the ground with finite numbers */
  aw_flight_options_init (&o);
  o.rtol = o.atol = 10.0;
  g_assert_cmpint (aw_flight_run (&s, &o, &tr), ==, AW_FLIGHT_GROUND);
  g_assert_true (isfinite (tr.ground_distance) && isfinite (tr.time_of_flight));
  /* NULL options are the defaults */
  g_assert_cmpint (aw_flight_run (&s, NULL, &tr), ==, AW_FLIGHT_GROUND);
  /* negative step and distance mean "none" */
  aw_flight_options_init (&o);
  o.sample_step_m = -1.0;
  o.max_distance_m = -5.0;
  g_assert_cmpint (aw_flight_run (&s, &o, &tr), ==, AW_FLIGHT_GROUND);
  g_assert_cmpuint (tr.n_samples, ==, 1);
  aw_trajectory_clear (&tr);
}

/* Extreme but valid shots, drawn over the whole validated range with a fixed seed: every run ends
 * with a status code and finite numbers, never a crash or a hang. max_steps is lowered to bound the
 * time of the worst draws. */
#define FUZZ_RUNS 150

static double
draw (GRand *rng, double lo, double hi)
{
  /* a third of the draws sit on a limit */
  switch (g_rand_int_range (rng, 0, 6))
    {
    case 0: return lo;
    case 1: return hi;
    default: return g_rand_double_range (rng, lo, hi);
    }
}

static void
test_extreme_valid_shots (void)
{
  GRand *rng = g_rand_new_with_seed (20240611);
  AwTrajectory tr = { 0 };
  AwFlightOptions o;
  int counts[16] = { 0 };

  aw_flight_options_init (&o);
  o.max_steps = 20000;
  o.sample_step_m = 5.0;
  for (int i = 0; i < FUZZ_RUNS; i++)
    {
      AwShot s;
      aw_shot_init (&s);
      s.mass_kg = draw (rng, 0.01e-3, 5e-3);
      s.diameter_m = draw (rng, 1e-3, 20e-3);
      s.velocity_mps = draw (rng, 1e-6, 300.0);
      s.elevation_rad = draw (rng, -G_PI / 2, G_PI / 2);
      s.height_m = draw (rng, 0.0, 100.0);
      s.spin_rad_s = draw (rng, 0.0, 1e5);
      s.hop_tilt_rad = draw (rng, -G_PI / 2, G_PI / 2);
      for (int k = 0; k < 3; k++)
        s.wind[k] = draw (rng, -50.0, 50.0);
      s.gravity = draw (rng, 0.1, 30.0);
      s.air.density = draw (rng, 0.01, 5.0);
      s.air.viscosity = draw (rng, 1e-6, 1e-3);
      s.aero.drag = g_rand_int_range (rng, 0, AW_N_DRAG_MODELS);
      s.aero.lift = g_rand_int_range (rng, 0, AW_N_LIFT_MODELS);
      s.aero.drag_cd = draw (rng, 0.0, 10.0);
      s.aero.lift_slope = draw (rng, 0.0, 10.0);
      s.aero.spin_decay_cm = draw (rng, 0.0, 10.0);
      s.aero.inertia_factor = draw (rng, 0.01, 1.0);
      s.aero.lift_factor = draw (rng, 0.0, 100.0);
      s.aero.drag_factor = draw (rng, 0.0, 100.0);
      s.aero.spin_decay_factor = draw (rng, 0.0, 100.0);
      g_assert_cmpint (aw_shot_validate (&s), ==, AW_SHOT_OK);

      AwFlightStatus st = aw_flight_run (&s, &o, &tr);
      g_assert_cmpstr (aw_flight_status_name (st), !=, "unknown");
      g_assert_cmpint (st, !=, AW_FLIGHT_BAD_INPUT);
      counts[st + 8]++;
      if (st >= 0)
        {
          g_assert_true (isfinite (tr.time_of_flight) && isfinite (tr.ground_distance)
                         && isfinite (tr.ground_drift) && isfinite (tr.apex_height)
                         && isfinite (tr.impact_speed) && isfinite (tr.impact_spin));
          g_assert_cmpfloat (tr.time_of_flight, <=, o.max_time_s);
          g_assert_cmpuint (tr.n_samples, >=, 1);
        }
      double w;
      AwHopStatus hs = aw_shot_spin_for_lift_ratio (&s, draw (rng, 0.0, 20.0), &w);
      g_assert_true (hs == AW_HOP_OK || hs == AW_HOP_UNREACHABLE || hs == AW_HOP_NO_LIFT);
      if (hs == AW_HOP_OK)
        g_assert_true (isfinite (w) && w >= 0.0 && w <= 1e5);
    }
  for (int k = 0; k < 16; k++)
    if (counts[k])
      g_test_message ("%-15s %d", aw_flight_status_name (k - 8), counts[k]);
  aw_trajectory_clear (&tr);
  g_rand_free (rng);
}

int
main (int argc, char **argv)
{
  g_test_init (&argc, &argv, NULL);
  gsl_set_error_handler_off ();

  g_test_add_func ("/core/flight/closed-form/vacuum-fall", test_vacuum_fall);
  g_test_add_func ("/core/flight/closed-form/vacuum-horizontal", test_vacuum_horizontal);
  g_test_add_func ("/core/flight/closed-form/vacuum-45", test_vacuum_45);
  g_test_add_func ("/core/flight/closed-form/drag-horizontal-table", test_drag_horizontal_table);
  g_test_add_func ("/core/flight/closed-form/drag-horizontal-rhs", test_drag_horizontal_rhs);
  g_test_add_func ("/core/flight/closed-form/drag-horizontal", test_drag_horizontal_engine);
  g_test_add_func ("/core/flight/closed-form/fall-with-drag", test_fall_with_drag);
  g_test_add_func ("/core/flight/closed-form/fall-vt10", test_fall_vt10);
  g_test_add_func ("/core/flight/closed-form/terminal-velocity", test_terminal_velocity_rhs);
  g_test_add_func ("/core/flight/regression/no-spin", test_regression_no_spin);
  g_test_add_func ("/core/flight/regression/backspin", test_regression_backspin);
  g_test_add_func ("/core/flight/regression/wind", test_regression_wind);
  g_test_add_func ("/core/flight/spin-decay/path-length", test_spin_decay);
  g_test_add_func ("/core/flight/spin-decay/rhs", test_spin_decay_rhs);
  g_test_add_func ("/core/flight/rhs/backspin-lifts", test_rhs_backspin_lifts);
  g_test_add_func ("/core/flight/rhs/terms", test_rhs_terms);
  g_test_add_func ("/core/flight/rhs/guards", test_rhs_guards);
  g_test_add_func ("/core/flight/reference/impacts", test_reference_impacts);
  g_test_add_func ("/core/flight/reference/regression", test_reference_regression);
  g_test_add_func ("/core/flight/events/samples", test_samples);
  g_test_add_func ("/core/flight/events/trajectory-at", test_trajectory_at);
  g_test_add_func ("/core/flight/events/apex", test_apex);
  g_test_add_func ("/core/flight/events/time-limit", test_time_limit);
  g_test_add_func ("/core/flight/events/distance-limit", test_distance_limit);
  g_test_add_func ("/core/flight/events/callback-stop", test_callback_stop);
  g_test_add_func ("/core/flight/hop/round-trip", test_hop_round_trip);
  g_test_add_func ("/core/flight/hop/status", test_hop_status);
  g_test_add_func ("/core/flight/trade/heavier-needs-more-spin",
                   test_trade_heavier_needs_more_spin);
  g_test_add_func ("/core/flight/trade/magnus-v-squared", test_trade_magnus_v_squared);
  g_test_add_func ("/core/flight/trade/preset-130k-rpm", test_trade_preset);
  g_test_add_func ("/core/flight/sanity/drift", test_sanity_drift);
  g_test_add_func ("/core/flight/bad-input/shot", test_bad_shot);
  g_test_add_func ("/core/flight/bad-input/options", test_bad_options);
  g_test_add_func ("/core/flight/bad-input/extreme-valid-shots", test_extreme_valid_shots);

  return g_test_run ();
}
