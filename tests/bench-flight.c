/* bench-flight.c: cost of one trajectory to the ground, the engine against GSL at equal accuracy
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * A benchmark, not a test: it prints figures and always exits 0 unless something cannot run.
 *
 * Shot: 0.20 g at 1 J (100 m/s), level from 1.5 m, lift ratio 1 with the default lift model,
 * standard sea-level air; no samples are kept (keep_samples = false, sample_step_m = 0).
 *
 * Reference: the engine's right-hand side (aw_flight_rhs) integrated with GSL rk8pd at
 * rtol = atol = 1e-12; the ground is located inside the last step by re-integration.
 *
 * Compared at equal accuracy (impact point within 1 mm of the reference): the engine, GSL rkf45
 * and GSL rk8pd, each at the loosest tolerance rtol = atol of a sweep over 1e-3 … 1e-9 for which it
 * and every tighter tolerance of the sweep meet 1 mm, first on this shot, then on every shot of a
 * spread of hopped shots. The GSL runs locate the ground by re-taking the last step from its start
 * with a shorter step (secant iteration); RHS evaluations are counted in the GSL system function,
 * the engine counts its own. Times are CPU time of the thread, best of several batches.
 */
#include <glib.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_odeiv2.h>
#include <math.h>
#include <stdio.h>
#include <string.h>
#include <time.h>

#include "aw-flight.h"
#include "aw-units.h"

#define DIM AW_FLIGHT_STATE_DIM
enum { PX, PY, PZ, VX, VY, VZ };

#define ACCURACY_M   1e-3    /* equal accuracy: impact point within 1 mm of the reference */
#define REF_TOL      1e-12
#define GOAL_US      10.0    /* goal: under 10 µs per trajectory */
#define GOAL_EVALS   2.0     /* goal: at least 2× fewer RHS evaluations than rkf45 */
#define BATCH_MIN_US 150000  /* each timing batch runs at least this long (CPU µs) */
#define BATCHES      5       /* best of */

static const double sweep[] = { 1e-3, 3e-4, 1e-4, 3e-5, 1e-5, 3e-6, 1e-6, 3e-7, 1e-7, 3e-8, 1e-8,
                                3e-9, 1e-9 };
#define N_SWEEP G_N_ELEMENTS (sweep)

typedef struct
{
  double x, y, t;
  long evals, steps;
} Impact;

/* ---- GSL ---- */

typedef struct
{
  const AwShot *shot;
  long evals;
} SysData;

static int
sys_func (double t, const double y[], double f[], void *params)
{
  SysData *d = params;
  d->evals++;
  aw_flight_rhs (d->shot, y, f);
  return GSL_SUCCESS;
}

typedef struct
{
  SysData data;
  gsl_odeiv2_system sys;
  gsl_odeiv2_step *step;      /* adaptive stepping */
  gsl_odeiv2_step *restep;    /* single steps inside the last step */
  gsl_odeiv2_control *control;
  gsl_odeiv2_evolve *evolve;
} Gsl;

static void
gsl_init (Gsl *g, const gsl_odeiv2_step_type *type, const AwShot *shot, double tol)
{
  g->data.shot = shot;
  g->data.evals = 0;
  g->sys = (gsl_odeiv2_system) { sys_func, NULL, DIM, &g->data };
  g->step = gsl_odeiv2_step_alloc (type, DIM);
  g->restep = gsl_odeiv2_step_alloc (type, DIM);
  g->control = gsl_odeiv2_control_y_new (tol, tol);
  g->evolve = gsl_odeiv2_evolve_alloc (DIM);
}

static void
gsl_clear (Gsl *g)
{
  gsl_odeiv2_evolve_free (g->evolve);
  gsl_odeiv2_control_free (g->control);
  gsl_odeiv2_step_free (g->restep);
  gsl_odeiv2_step_free (g->step);
}

/* One trajectory to z = 0. The secant stops when |z| ≤ root_z or the bracket is shorter than
 * root_t in time. */
static gboolean
gsl_to_ground (Gsl *g, double root_z, double root_t, Impact *out)
{
  double y[DIM], y0[DIM], yt[DIM], yerr[DIM], f0[DIM];
  double t = 0.0, h = 1e-4;
  long steps = 0;

  g->data.evals = 0;
  gsl_odeiv2_evolve_reset (g->evolve);
  gsl_odeiv2_step_reset (g->step);
  aw_shot_initial_state (g->data.shot, y);
  while (t < 30.0)
    {
      double t0 = t;
      memcpy (y0, y, sizeof y);
      if (gsl_odeiv2_evolve_apply (g->evolve, g->control, g->step, &g->sys, &t, 30.0, &h, y)
          != GSL_SUCCESS)
        return FALSE;
      steps++;
      if (y[PZ] <= 0.0)
        {
          /* the derivative at the step start, as the evolver computed it */
          memcpy (f0, g->evolve->dydt_in, sizeof f0);
          double a = 0.0, b = t - t0, fa = y0[PZ], fb = y[PZ];
          int side = 0;
          memcpy (yt, y, sizeof y);
          out->t = t;
          for (int it = 0; it < 60 && b - a > root_t; it++)
            {
              double c = (a * fb - b * fa) / (fb - fa);
              if (!(c > a && c < b))
                c = 0.5 * (a + b);
              memcpy (yt, y0, sizeof y0);
              gsl_odeiv2_step_reset (g->restep);
              if (gsl_odeiv2_step_apply (g->restep, t0, c, yt, yerr, f0, NULL, &g->sys)
                  != GSL_SUCCESS)
                return FALSE;
              double fc = yt[PZ];
              out->t = t0 + c;
              if (fabs (fc) <= root_z)
                {
                  a = b = c;
                  break;
                }
              if (fc < 0.0)
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
            }
          out->x = yt[PX];
          out->y = yt[PY];
          out->evals = g->data.evals;
          out->steps = steps;
          return TRUE;
        }
    }
  return FALSE;
}

/* ---- the engine ---- */

static gboolean
engine_to_ground (const AwShot *shot, const AwFlightOptions *opt, AwTrajectory *tr, Impact *out)
{
  if (aw_flight_run (shot, opt, tr) != AW_FLIGHT_GROUND)
    return FALSE;
  out->x = tr->ground_distance;
  out->y = tr->ground_drift;
  out->t = tr->time_of_flight;
  out->evals = tr->rhs_evaluations;
  out->steps = tr->steps_accepted + tr->steps_rejected;
  return TRUE;
}

/* ---- timing ---- */

/* CPU time of this thread in µs: other work on the machine does not count against us */
static double
cpu_us (void)
{
  struct timespec ts;
  clock_gettime (CLOCK_THREAD_CPUTIME_ID, &ts);
  return ts.tv_sec * 1e6 + ts.tv_nsec * 1e-3;
}

typedef enum { M_ENGINE, M_RKF45, M_RK8PD, N_METHODS } Method;

static const char *const method_names[] = { "engine (Dormand-Prince 5(4), dense output)",
                                            "GSL rkf45", "GSL rk8pd" };

/* Ground location of the compared GSL runs: 1 µm in height or 0.1 µs, far inside 1 mm; the
 * reference goes to rounding. */
#define ROOT_Z 1e-6
#define ROOT_T 1e-7

/* Runs one trajectory by method m at tolerance tol; fills out. */
static gboolean
run_once (Method m, const AwShot *shot, double tol, Impact *out)
{
  if (m == M_ENGINE)
    {
      AwFlightOptions o;
      AwTrajectory tr = { 0 };
      aw_flight_options_init (&o);
      o.rtol = o.atol = tol;
      o.keep_samples = false;
      o.sample_step_m = 0.0;
      gboolean ok = engine_to_ground (shot, &o, &tr, out);
      aw_trajectory_clear (&tr);
      return ok;
    }
  Gsl g;
  gsl_init (&g, m == M_RKF45 ? gsl_odeiv2_step_rkf45 : gsl_odeiv2_step_rk8pd, shot, tol);
  gboolean ok = tol <= REF_TOL ? gsl_to_ground (&g, 0.0, 1e-14, out)
                               : gsl_to_ground (&g, ROOT_Z, ROOT_T, out);
  gsl_clear (&g);
  return ok;
}

/* CPU µs per trajectory, best of BATCHES batches of at least min_us each (integrator objects
 * allocated once, as an application would) */
static double
time_method (Method m, const AwShot *shot, double tol, double min_us)
{
  double best = INFINITY;
  AwFlightOptions o;
  AwTrajectory tr = { 0 };
  Impact imp;
  Gsl g;

  aw_flight_options_init (&o);
  o.rtol = o.atol = tol;
  o.keep_samples = false;
  o.sample_step_m = 0.0;
  if (m != M_ENGINE)
    gsl_init (&g, m == M_RKF45 ? gsl_odeiv2_step_rkf45 : gsl_odeiv2_step_rk8pd, shot, tol);

  for (int b = 0; b < BATCHES; b++)
    {
      long n = 0;
      double start = cpu_us (), now;
      do
        {
          for (int k = 0; k < 64; k++)
            {
              gboolean ok = m == M_ENGINE ? engine_to_ground (shot, &o, &tr, &imp)
                                          : gsl_to_ground (&g, ROOT_Z, ROOT_T, &imp);
              if (!ok)
                g_error ("%s failed at tolerance %g", method_names[m], tol);
            }
          n += 64;
          now = cpu_us ();
        }
      while (now - start < min_us);
      best = fmin (best, (now - start) / n);
    }
  if (m != M_ENGINE)
    gsl_clear (&g);
  aw_trajectory_clear (&tr);
  return best;
}

/* ---- the shot ---- */

static void
bench_shot (AwShot *s, double mass_g, double energy_j, double lift_ratio, double elev_deg)
{
  aw_shot_init (s);
  s->mass_kg = aw_g_to_kg (mass_g);
  s->velocity_mps = aw_velocity_for_energy (s->mass_kg, energy_j);
  s->elevation_rad = aw_deg_to_rad (elev_deg);
  if (aw_shot_spin_for_lift_ratio (s, lift_ratio, &s->spin_rad_s) != AW_HOP_OK)
    g_error ("cannot set lift ratio %g", lift_ratio);
}

static Impact
reference (const AwShot *shot)
{
  Impact ref;
  if (!run_once (M_RK8PD, shot, REF_TOL, &ref))
    g_error ("the reference integration failed");
  return ref;
}

static double
miss (const Impact *a, const Impact *ref)
{
  return hypot (a->x - ref->x, a->y - ref->y);
}

/* A spread of hopped shots for the robustness column (the benchmark shot is the first) */
static const struct { double mass_g, energy_j, lift_ratio, elev_deg; } spread[] = {
  { 0.20, 1.0, 1.0, 0.0 }, { 0.20, 1.0, 1.5, 0.0 }, { 0.25, 1.14, 1.0, 2.0 },
  { 0.28, 1.5, 1.2, 0.0 }, { 0.40, 2.3, 1.0, 5.0 }, { 0.12, 0.8, 0.7, 10.0 },
  { 0.30, 1.5, 2.0, 0.0 }, { 0.45, 3.0, 1.1, -2.0 },
};
#define N_SPREAD G_N_ELEMENTS (spread)

typedef struct
{
  int index;        /* into sweep[], −1: none */
  double us;
  Impact imp;
} Choice;

/* the loosest tolerance whose miss, and that of every tighter tolerance, is within the accuracy */
static int
loosest (const double *err)
{
  int chosen = -1;
  for (int i = N_SWEEP - 1; i >= 0 && err[i] <= ACCURACY_M; i--)
    chosen = i;
  return chosen;
}

static void
compare (const char *title, const Choice *c)
{
  printf ("%s\n", title);
  for (int m = 0; m < N_METHODS; m++)
    if (c[m].index < 0)
      {
        printf ("  %s: no tolerance of the sweep is accurate enough\n", method_names[m]);
        return;
      }
  printf ("  %-44s %9s %10s %10s\n", "", "rtol=atol", "us/traj", "RHS/traj");
  for (int m = 0; m < N_METHODS; m++)
    printf ("  %-44s %9g %10.2f %10ld\n", method_names[m], sweep[c[m].index], c[m].us,
            c[m].imp.evals);
  double eval_ratio = (double) c[M_RKF45].imp.evals / c[M_ENGINE].imp.evals;
  printf ("  time ratio      rkf45/engine %.2f, rk8pd/engine %.2f\n",
          c[M_RKF45].us / c[M_ENGINE].us, c[M_RK8PD].us / c[M_ENGINE].us);
  printf ("  RHS eval ratio  rkf45/engine %.2f, rk8pd/engine %.2f\n", eval_ratio,
          (double) c[M_RK8PD].imp.evals / c[M_ENGINE].imp.evals);
  printf ("  goal under %.0f us per trajectory: %s (%.2f us)\n", GOAL_US,
          c[M_ENGINE].us < GOAL_US ? "met" : "NOT met", c[M_ENGINE].us);
  printf ("  goal at least %.0fx fewer RHS evaluations than rkf45: %s (%.2fx)\n\n", GOAL_EVALS,
          eval_ratio >= GOAL_EVALS ? "met" : "NOT met", eval_ratio);
}

int
main (int argc, char **argv)
{
  AwShot shots[N_SPREAD];
  Impact refs[N_SPREAD];
  Choice single[N_METHODS], robust[N_METHODS];

  gsl_set_error_handler_off ();
  for (guint k = 0; k < N_SPREAD; k++)
    {
      bench_shot (&shots[k], spread[k].mass_g, spread[k].energy_j, spread[k].lift_ratio,
                  spread[k].elev_deg);
      refs[k] = reference (&shots[k]);
    }
  const AwShot *shot = &shots[0];
  const Impact *ref = &refs[0];

  printf ("Flight benchmark: one trajectory to the ground\n");
  printf ("shot: 0.20 g, 1.00 J (%.2f m/s), level from 1.5 m, lift ratio 1 "
          "(S/(1+2S): %.0f rpm), air %.3f kg/m3, no samples kept\n",
          shot->velocity_mps, aw_rad_s_to_rpm (shot->spin_rad_s), shot->air.density);
  printf ("reference: GSL rk8pd at rtol = atol = %g: ground at x = %.6f m, y = %.6f m, "
          "t = %.6f s (%ld RHS evaluations)\n", REF_TOL, ref->x, ref->y, ref->t, ref->evals);
  {
    Impact tighter;
    if (!run_once (M_RK8PD, shot, 1e-14, &tighter))
      g_error ("the reference self-check failed");
    printf ("reference self-check: rk8pd at 1e-14 lands %.2e mm from it\n",
            miss (&tighter, ref) * 1e3);
  }
  printf ("accuracy required: impact point within %.1f mm of the reference\n", ACCURACY_M * 1e3);
  printf ("columns: miss of this shot; worst miss over %u hopped shots (0.12-0.45 g, 0.8-3 J, "
          "lift ratio 0.7-2, elevation -2..10 deg);\n         time and RHS evaluations for this "
          "shot\n\n", (guint) N_SPREAD);

  for (int m = 0; m < N_METHODS; m++)
    {
      double err[N_SWEEP], worst[N_SWEEP];
      Impact imp[N_SWEEP];

      printf ("%s\n", method_names[m]);
      printf ("  %-9s %10s %12s %10s %10s %7s\n", "rtol=atol", "miss mm", "worst mm", "us/traj",
              "RHS/traj", "steps");
      for (guint i = 0; i < N_SWEEP; i++)
        {
          if (!run_once (m, shot, sweep[i], &imp[i]))
            g_error ("%s failed at %g", method_names[m], sweep[i]);
          err[i] = miss (&imp[i], ref);
          worst[i] = err[i];
          for (guint k = 1; k < N_SPREAD; k++)
            {
              Impact o;
              if (!run_once (m, &shots[k], sweep[i], &o))
                g_error ("%s failed at %g", method_names[m], sweep[i]);
              worst[i] = fmax (worst[i], miss (&o, &refs[k]));
            }
          double us = time_method (m, shot, sweep[i], BATCH_MIN_US / 5);
          printf ("  %-9.0e %10.4f %12.4f %10.2f %10ld %7ld\n", sweep[i], err[i] * 1e3,
                  worst[i] * 1e3, us, imp[i].evals, imp[i].steps);
        }
      single[m].index = loosest (err);
      robust[m].index = loosest (worst);
      Choice *cs[2] = { &single[m], &robust[m] };
      for (int k = 0; k < 2; k++)
        if (cs[k]->index >= 0)
          {
            cs[k]->imp = imp[cs[k]->index];
            cs[k]->us = time_method (m, shot, sweep[cs[k]->index], BATCH_MIN_US);
          }
      printf ("  loosest meeting %.1f mm: this shot %g, all %u shots %g\n\n", ACCURACY_M * 1e3,
              single[m].index >= 0 ? sweep[single[m].index] : NAN, (guint) N_SPREAD,
              robust[m].index >= 0 ? sweep[robust[m].index] : NAN);
    }

  compare ("At equal accuracy on this shot (<= 1 mm on the benchmark shot):", single);
  compare ("At equal accuracy on all shots (<= 1 mm on every shot of the spread):", robust);

  {
    AwFlightOptions def;
    Impact imp;
    aw_flight_options_init (&def);
    if (!run_once (M_ENGINE, shot, def.rtol, &imp))
      g_error ("engine failed");
    printf ("Engine at its default rtol = %g, atol = %g: %.2f us per trajectory, %ld RHS "
            "evaluations, miss %.4f mm\n", def.rtol, def.atol,
            time_method (M_ENGINE, shot, def.rtol, BATCH_MIN_US), imp.evals,
            miss (&imp, ref) * 1e3);
  }
  return 0;
}
