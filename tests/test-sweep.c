/* test-sweep.c: sweeps and maps (suite 'sweep')
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * What is checked:
 * - every point of a sweep is bit for bit the single-run result (aw_sweep_eval_point, and the
 *   analysis called by hand on the same input), for every kind of varied input;
 * - results are identical with 1, 2, 3 and 5 threads;
 * - cancelling returns promptly with G_IO_ERROR_CANCELLED, progress is monotonic, arrives on the
 *   calling thread, and reaches 1 exactly once and only when the sweep is complete;
 * - the CSV parses back (an independent RFC 4180 reader below) to the same doubles, and does not
 *   change under LC_ALL=de_DE.UTF-8;
 * - physics through the sweep wiring against the reference trajectories of the physics reference.
 */
#include "aw-config.h"

#include <glib/gstdio.h>
#include <locale.h>
#include <math.h>
#include <string.h>

#include "aw-core-error.h"
#include "aw-sweep.h"
#include "aw-units.h"

/* ---- helpers ---- */

static void
setup_default (AwSweepSetup *s, const char *name)
{
  aw_sweep_setup_init (s, name);
  s->input.shot.velocity_mps = 100.0;   /* 0.20 g at 100 m/s: 1.00 J */
}

static AwSweepResult *
run_ok (const AwSweepSetup *setups, guint n, const AwSweepDesc *desc, guint threads)
{
  g_autoptr (GError) error = NULL;
  AwSweepResult *r = aw_sweep_run (setups, n, desc, threads, NULL, NULL, NULL, &error);
  g_assert_no_error (error);
  g_assert_nonnull (r);
  return r;
}

static gsize
n_points (const AwSweepResult *r)
{
  return (gsize) r->n_setups * r->n1 * r->n2;
}

/* Every slot equals aw_sweep_eval_point on the same values, byte for byte. */
static void
assert_points_are_single_runs (const AwSweepResult *r, const AwSweepSetup *setups)
{
  for (guint s = 0; s < r->n_setups; s++)
    for (guint j = 0; j < r->n2; j++)
      for (guint i = 0; i < r->n1; i++)
        {
          AwSweepPoint alone;
          const AwSweepPoint *p = aw_sweep_result_point (r, s, i, j);
          aw_sweep_eval_point (&setups[s], &r->desc, r->values1[i], r->values2[j], &alone);
          if (memcmp (p, &alone, sizeof alone) != 0)
            g_error ("setup %u point (%u, %u): the sweep differs from the single run", s, i, j);
        }
}

/* Bitwise equality of doubles (NAN equal to NAN with the same bits). */
static void
assert_same_bits (double a, double b, const char *what)
{
  if (memcmp (&a, &b, sizeof a) != 0)
    g_error ("%s: %.17g differs from %.17g", what, a, b);
}

/* ---- names and validation ---- */

static void
test_names (void)
{
  AwSweepVar v;
  AwSweepMetric m;
  double d = -1.0;

  for (int k = AW_SWEEP_VAR_NONE; k < AW_SWEEP_N_VARS; k++)
    {
      g_assert_true (aw_sweep_var_from_name (aw_sweep_var_to_name (k), &v));
      g_assert_cmpint (v, ==, k);
    }
  for (int k = 0; k < AW_SWEEP_N_METRICS; k++)
    {
      g_assert_true (aw_sweep_metric_from_name (aw_sweep_metric_to_name (k), &m, NULL));
      g_assert_cmpint (m, ==, k);
    }
  g_assert_true (aw_sweep_metric_from_name ("time-at:25.5", &m, &d));
  g_assert_cmpint (m, ==, AW_SWEEP_METRIC_TIME_AT);
  g_assert_cmpfloat (d, ==, 25.5);
  d = 7.0;
  g_assert_true (aw_sweep_metric_from_name ("drift-at", &m, &d));
  g_assert_cmpfloat (d, ==, 7.0);
  g_assert_false (aw_sweep_metric_from_name ("band-range:30", &m, &d));
  g_assert_false (aw_sweep_metric_from_name ("energy-at:", &m, &d));
  g_assert_false (aw_sweep_metric_from_name ("energy-at:-3", &m, &d));
  g_assert_false (aw_sweep_metric_from_name ("energy-at:nan", &m, &d));
  g_assert_false (aw_sweep_metric_from_name ("energy-at:30x", &m, &d));
  g_assert_false (aw_sweep_metric_from_name ("range", &m, &d));
  g_assert_false (aw_sweep_var_from_name ("mass", &v));
  g_assert_false (aw_sweep_var_from_name (NULL, &v));

  g_autofree char *c1 = aw_sweep_metric_column (AW_SWEEP_METRIC_ENERGY_AT, 30.0);
  g_autofree char *c2 = aw_sweep_metric_column (AW_SWEEP_METRIC_BAND_RANGE, 30.0);
  g_autofree char *c3 = aw_sweep_metric_column (AW_SWEEP_METRIC_TIME_AT, 12.5);
  g_assert_cmpstr (c1, ==, "energy_at_30m_j");
  g_assert_cmpstr (c2, ==, "band_range_m");
  g_assert_cmpstr (c3, ==, "time_at_12.5m_s");
}

static void
expect_invalid (const AwSweepDesc *desc, const char *field)
{
  g_autoptr (GError) error = NULL;
  g_assert_false (aw_sweep_desc_validate (desc, &error));
  g_assert_error (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID);
  if (!g_str_has_prefix (error->message, field))
    g_error ("expected a message about %s, got \"%s\"", field, error->message);
}

static void
test_validate (void)
{
  AwSweepDesc d, ok;
  AwSweepSetup s;
  g_autoptr (GError) error = NULL;

  aw_sweep_desc_init (&ok);
  g_assert_true (aw_sweep_desc_validate (&ok, NULL));

  d = ok;
  d.axis[0].var = AW_SWEEP_VAR_NONE;
  expect_invalid (&d, "axis[0].var");
  d = ok;
  d.axis[0].n = 0;
  expect_invalid (&d, "axis[0].n");
  d = ok;
  d.axis[0].hi = NAN;
  expect_invalid (&d, "axis[0].hi");
  d = ok;
  d.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_MASS_G, -0.2, 0.4, 10 };
  expect_invalid (&d, "axis[0].lo");
  d = ok;
  d.axis[1] = (AwSweepAxis) { AW_SWEEP_VAR_LIFT_RATIO, 0, 1, 3 };
  expect_invalid (&d, "axis[1].var");   /* the same input twice */
  d = ok;
  d.axis[1] = (AwSweepAxis) { AW_SWEEP_VAR_SPIN_RPM, 0, 1000, 3 };
  expect_invalid (&d, "axis[1].var");   /* two inputs that both set the hop */
  d = ok;
  d.axis[1] = (AwSweepAxis) { AW_SWEEP_VAR_TEMPERATURE_C, 0, 500, 3 };
  expect_invalid (&d, "axis[1].hi");
  d = ok;
  d.axis[1] = (AwSweepAxis) { 99, 0, 5, 3 };
  expect_invalid (&d, "axis[1].var");
  d = ok;
  d.axis[0].n = 10000;
  d.axis[1] = (AwSweepAxis) { AW_SWEEP_VAR_HEIGHT_M, 0, 5, 1000 };
  expect_invalid (&d, "axis");
  d = ok;
  d.at_distance_m = 0.0;
  expect_invalid (&d, "at_distance_m");
  d = ok;
  d.at_distance_m = INFINITY;
  expect_invalid (&d, "at_distance_m");
  d = ok;
  d.site.energy_limit_j = INFINITY;
  expect_invalid (&d, "site.energy_limit_j");
  d = ok;
  d.site.chrono_mass_kg = 1.0;
  expect_invalid (&d, "site.chrono_mass_kg");
  d = ok;
  d.hop = 7;
  expect_invalid (&d, "hop");

  /* a run refuses a bad description and an empty setup list */
  d = ok;
  d.axis[0].n = 0;
  setup_default (&s, "a");
  g_assert_null (aw_sweep_run (&s, 1, &d, 1, NULL, NULL, NULL, &error));
  g_assert_error (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID);
  g_clear_error (&error);
  g_assert_null (aw_sweep_run (&s, 0, &ok, 1, NULL, NULL, NULL, &error));
  g_assert_error (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID);
}

static void
test_axis_values (void)
{
  AwSweepAxis a = { AW_SWEEP_VAR_LIFT_RATIO, 0.0, 3.0, 61 };
  AwSweepAxis down = { AW_SWEEP_VAR_MASS_G, 0.48, 0.20, 29 };
  AwSweepAxis one = { AW_SWEEP_VAR_HEIGHT_M, 1.5, 1.5, 1 };

  g_assert_cmpfloat (aw_sweep_axis_value (&a, 0), ==, 0.0);
  g_assert_cmpfloat (aw_sweep_axis_value (&a, 60), ==, 3.0);
  g_assert_cmpfloat_with_epsilon (aw_sweep_axis_value (&a, 20), 1.0, 1e-15);
  g_assert_cmpfloat (aw_sweep_axis_value (&down, 0), ==, 0.48);
  g_assert_cmpfloat (aw_sweep_axis_value (&down, 28), ==, 0.20);
  g_assert_cmpfloat_with_epsilon (aw_sweep_axis_value (&down, 14), 0.34, 1e-15);
  g_assert_cmpfloat (aw_sweep_axis_value (&one, 0), ==, 1.5);
  for (guint i = 1; i < a.n; i++)
    g_assert_cmpfloat (aw_sweep_axis_value (&a, i), >, aw_sweep_axis_value (&a, i - 1));
}

/* ---- each point is the single run ---- */

/* Lift ratio sweep with a zero and a sight height: the sweep, aw_sweep_eval_point, the analysis
 * by hand, and the range table all agree to the bit. */
static void
test_lift_ratio_single_run (void)
{
  AwSweepSetup s;
  AwSweepDesc d;
  g_autoptr (AwSweepResult) r = NULL;

  setup_default (&s, "zeroed");
  s.input.sight_height_m = 0.07;
  s.input.zero_distance_m = 25.0;
  s.input.hop_mode = AW_HOP_MODE_AUTO;
  aw_sweep_desc_init (&d);
  d.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_LIFT_RATIO, 0.0, 3.0, 31 };
  d.at_distance_m = 30.0;
  r = run_ok (&s, 1, &d, 2);
  assert_points_are_single_runs (r, &s);

  guint n_ok = 0;
  for (guint i = 0; i < r->n1; i++)
    {
      const AwSweepPoint *p = aw_sweep_result_point (r, 0, i, 0);
      AwAnalysisInput in = s.input;
      AwBandResult band;
      AwRangeTable table;

      in.hop_mode = AW_HOP_MODE_LIFT_RATIO;
      in.hop_value = r->values1[i];
      AwAnalysisStatus st = aw_analysis_solve (&in, &band);
      g_assert_cmpint (st, ==, p->status);
      if (st != AW_ANALYSIS_OK)
        continue;
      n_ok++;
      assert_same_bits (p->values[AW_SWEEP_METRIC_BAND_RANGE], band.band_range_m, "band range");
      assert_same_bits (p->values[AW_SWEEP_METRIC_GROUND_DISTANCE], band.ground_distance_m,
                        "ground distance");
      assert_same_bits (p->values[AW_SWEEP_METRIC_APEX], band.apex_height_m, "apex");
      assert_same_bits (p->spin_rad_s, band.spin_rad_s, "spin");
      assert_same_bits (p->elevation_rad, band.elevation_rad, "elevation");

      /* the range table's row at 30 m is the same flight sampled at the same distance */
      g_assert_cmpint (aw_range_table_build (&in, 30.0, 0.0, NAN, &table), ==, AW_ANALYSIS_OK);
      if (table.n_rows > 1 && table.rows[1].distance_m == 30.0)
        {
          g_assert_cmpfloat (p->values[AW_SWEEP_METRIC_TIME_AT], ==, table.rows[1].time_s);
          g_assert_cmpfloat (p->values[AW_SWEEP_METRIC_SPEED_AT], ==, table.rows[1].speed_mps);
          g_assert_cmpfloat (p->values[AW_SWEEP_METRIC_ENERGY_AT], ==, table.rows[1].energy_j);
          g_assert_cmpfloat (p->values[AW_SWEEP_METRIC_DRIFT_AT], ==, table.rows[1].drift_cm);
        }
      else
        g_assert_true (isnan (p->values[AW_SWEEP_METRIC_TIME_AT]));
      aw_range_table_clear (&table);
    }
  g_assert_cmpuint (n_ok, >, 20);
}

/* Mass × energy map, two setups (constant energy and creep), auto hop in every cell: each cell is
 * the analysis run by hand on that BB and energy, and the map is the same with 1, 2, 3, 5 and the
 * default number of threads. */
static void
test_map_threads (void)
{
  AwSweepSetup s[2];
  AwSweepDesc d;
  guint threads[] = { 2, 3, 5, 0 };
  g_autoptr (AwSweepResult) r1 = NULL;

  setup_default (&s[0], "spring");
  setup_default (&s[1], "gas, \"creep\"");
  s[1].power.model = AW_POWER_CREEP;
  s[1].power.ref_mass_kg = 0.25e-3;
  s[1].power.ref_velocity_mps = 95.0;
  s[1].power.creep_pct_per_01g = 10.0;
  s[1].input.shot.hop_tilt_rad = aw_deg_to_rad (3.0);
  s[1].input.shot.wind[1] = 1.5;
  aw_sweep_desc_init (&d);
  d.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_MASS_G, 0.20, 0.40, 5 };
  d.axis[1] = (AwSweepAxis) { AW_SWEEP_VAR_ENERGY_J, 0.9, 1.8, 4 };

  r1 = run_ok (s, 2, &d, 1);
  g_assert_cmpuint (r1->n1, ==, 5);
  g_assert_cmpuint (r1->n2, ==, 4);
  assert_points_are_single_runs (r1, s);
  for (guint k = 0; k < G_N_ELEMENTS (threads); k++)
    {
      g_autoptr (AwSweepResult) rn = run_ok (s, 2, &d, threads[k]);
      g_assert_cmpmem (rn->points, n_points (rn) * sizeof (AwSweepPoint), r1->points,
                       n_points (r1) * sizeof (AwSweepPoint));
    }

  for (guint st = 0; st < 2; st++)
    for (guint j = 0; j < r1->n2; j++)
      for (guint i = 0; i < r1->n1; i++)
        {
          const AwSweepPoint *p = aw_sweep_result_point (r1, st, i, j);
          AwAnalysisInput in = s[st].input;
          AwBandResult band;
          in.hop_mode = AW_HOP_MODE_AUTO;   /* the BB mass varies: auto hop per mass */
          in.shot.mass_kg = aw_g_to_kg (r1->values1[i]);
          in.shot.velocity_mps = aw_velocity_for_energy (in.shot.mass_kg, r1->values2[j]);
          g_assert_cmpint (aw_analysis_solve (&in, &band), ==, AW_ANALYSIS_OK);
          g_assert_cmpint (p->status, ==, AW_ANALYSIS_OK);
          assert_same_bits (p->values[AW_SWEEP_METRIC_BAND_RANGE], band.band_range_m,
                            "band range");
          assert_same_bits (p->lift_ratio, band.lift_ratio, "lift ratio");
          assert_same_bits (p->velocity_mps, in.shot.velocity_mps, "velocity");
          /* E = ½·m·v² (closed form): the muzzle energy is the map's energy value */
          g_assert_cmpfloat_with_epsilon (p->values[AW_SWEEP_METRIC_MUZZLE_ENERGY],
                                          r1->values2[j], 1e-12);
        }
  /* the hop tilt and wind of the second setup move it sideways, the first stays on the line */
  g_assert_cmpfloat (aw_sweep_result_value (r1, 0, 2, 2, AW_SWEEP_METRIC_DRIFT_AT), ==, 0.0);
  g_assert_cmpfloat (fabs (aw_sweep_result_value (r1, 1, 2, 2, AW_SWEEP_METRIC_DRIFT_AT)), >,
                     1.0);
}

/* One input of each other kind, each point checked against the analysis run by hand. */
static void
test_other_inputs_single_run (void)
{
  AwSweepSetup s;
  AwSweepDesc d;

  setup_default (&s, "base");
  s.input.hop_mode = AW_HOP_MODE_LIFT_RATIO;
  s.input.hop_value = 1.1;
  s.conditions.pressure_hpa = 980.0;
  s.conditions.humidity = 0.5;
  g_assert_cmpint (aw_air_from_conditions (&s.conditions, &s.input.shot.air), ==, AW_AIR_OK);

  const AwSweepAxis axes[] = {
    { AW_SWEEP_VAR_SPIN_RPM, 0.0, 20000.0, 9 },
    { AW_SWEEP_VAR_CROSSWIND_MPS, -4.0, 4.0, 9 },
    { AW_SWEEP_VAR_HEIGHT_M, 0.3, 2.0, 6 },
    { AW_SWEEP_VAR_TEMPERATURE_C, -10.0, 35.0, 6 },
    { AW_SWEEP_VAR_ENERGY_J, 0.5, 2.5, 6 },
    { AW_SWEEP_VAR_MASS_G, 0.2, 0.45, 6 },
  };
  for (guint k = 0; k < G_N_ELEMENTS (axes); k++)
    {
      g_autoptr (AwSweepResult) r = NULL;
      aw_sweep_desc_init (&d);
      d.axis[0] = axes[k];
      r = run_ok (&s, 1, &d, 2);
      assert_points_are_single_runs (r, &s);
      for (guint i = 0; i < r->n1; i++)
        {
          double v = r->values1[i];
          AwAnalysisInput in = s.input;
          AwBandResult band;
          const AwSweepPoint *p = aw_sweep_result_point (r, 0, i, 0);
          switch (axes[k].var)
            {
            case AW_SWEEP_VAR_SPIN_RPM:
              in.hop_mode = AW_HOP_MODE_SPIN;
              in.hop_value = aw_rpm_to_rad_s (v);
              in.shot.spin_rad_s = in.hop_value;
              break;
            case AW_SWEEP_VAR_CROSSWIND_MPS:
              in.shot.wind[1] = v;
              break;
            case AW_SWEEP_VAR_HEIGHT_M:
              in.shot.height_m = v;
              break;
            case AW_SWEEP_VAR_TEMPERATURE_C:
              {
                AwConditions c = s.conditions;
                c.temperature_c = v;
                g_assert_cmpint (aw_air_from_conditions (&c, &in.shot.air), ==, AW_AIR_OK);
              }
              break;
            case AW_SWEEP_VAR_ENERGY_J:
              in.shot.velocity_mps = aw_velocity_for_energy (in.shot.mass_kg, v);
              break;
            case AW_SWEEP_VAR_MASS_G:
              {
                /* constant energy through the setup's BB; auto hop when the mass varies */
                AwPowerCurve c = { AW_POWER_CONSTANT_ENERGY, s.input.shot.mass_kg,
                                   s.input.shot.velocity_mps, 0.0, NULL, 0 };
                in.shot.mass_kg = aw_g_to_kg (v);
                in.shot.velocity_mps = aw_power_velocity_for_mass (&c, in.shot.mass_kg);
                in.hop_mode = AW_HOP_MODE_AUTO;
                /* 0.20 g at 100 m/s = 1.00 J (trade reference anchor, common practice, no
                 * source); constant energy keeps it for every BB */
                g_assert_cmpfloat_with_epsilon (p->values[AW_SWEEP_METRIC_MUZZLE_ENERGY], 1.0,
                                                1e-12);
              }
              break;
            default:
              g_assert_not_reached ();
            }
          g_assert_cmpint (aw_analysis_solve (&in, &band), ==, p->status);
          assert_same_bits (p->values[AW_SWEEP_METRIC_BAND_RANGE], band.band_range_m,
                            aw_sweep_var_to_name (axes[k].var));
          assert_same_bits (p->values[AW_SWEEP_METRIC_GROUND_DISTANCE], band.ground_distance_m,
                            aw_sweep_var_to_name (axes[k].var));
        }

      if (axes[k].var == AW_SWEEP_VAR_CROSSWIND_MPS)
        {
          /* mirror symmetry of the equations of motion about the x–z plane (physics reference
           * §5, closed form): no tilt, so drift(−W) = −drift(W) and no drift without wind */
          for (guint i = 0; i < r->n1; i++)
            {
              double a = aw_sweep_result_value (r, 0, i, 0, AW_SWEEP_METRIC_DRIFT_AT);
              double b = aw_sweep_result_value (r, 0, r->n1 - 1 - i, 0, AW_SWEEP_METRIC_DRIFT_AT);
              g_assert_cmpfloat_with_epsilon (a, -b, 1e-9 * (1.0 + fabs (a)));
            }
          g_assert_cmpfloat (aw_sweep_result_value (r, 0, 4, 0, AW_SWEEP_METRIC_DRIFT_AT), ==,
                             0.0);
          /* a crosswind toward +y (from the right) carries the BB toward +y */
          g_assert_cmpfloat (aw_sweep_result_value (r, 0, 8, 0, AW_SWEEP_METRIC_DRIFT_AT), >,
                             1.0);
        }
      if (axes[k].var == AW_SWEEP_VAR_TEMPERATURE_C)
        {
          /* warmer air is thinner: less drag, more speed left at 30 m (same energy, same hop) */
          for (guint i = 1; i < r->n1; i++)
            g_assert_cmpfloat (aw_sweep_result_value (r, 0, i, 0, AW_SWEEP_METRIC_SPEED_AT), >,
                               aw_sweep_result_value (r, 0, i - 1, 0,
                                                      AW_SWEEP_METRIC_SPEED_AT));
        }
    }
}

/* The physics reference's regression trajectories through a spin sweep and a crosswind sweep:
 * physics reference §5 "Numerical regression trajectories" (CALC, scipy DOP853), tolerance
 * 1e-4 relative. 0.20 g, 5.95 mm, ρ = 1.2, μ = 1.81e-5, 90 m/s level from 1.5 m. */
static void
test_reference_trajectories (void)
{
  AwSweepSetup s;
  AwSweepDesc d;
  g_autoptr (AwSweepResult) r = NULL;
  g_autoptr (AwSweepResult) w = NULL;

  aw_sweep_setup_init (&s, "reference");
  s.input.shot.air.density = 1.2;
  s.input.shot.air.viscosity = 1.81e-5;
  s.input.shot.velocity_mps = 90.0;
  s.input.band_half_m = 5.0;   /* keep the band out of the way: the ground decides */
  aw_sweep_desc_init (&d);
  d.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_SPIN_RPM, 0.0, 4318.28, 2 };
  r = run_ok (&s, 1, &d, 2);
  g_assert_cmpfloat_with_epsilon (aw_sweep_result_value (r, 0, 0, 0,
                                                         AW_SWEEP_METRIC_GROUND_DISTANCE),
                                  31.1033, 31.1033 * 1e-4);
  g_assert_cmpfloat_with_epsilon (aw_sweep_result_value (r, 0, 0, 0, AW_SWEEP_METRIC_SPEED_AT),
                                  30.054, 30.054 * 1e-4);
  g_assert_cmpfloat_with_epsilon (aw_sweep_result_value (r, 0, 1, 0,
                                                         AW_SWEEP_METRIC_GROUND_DISTANCE),
                                  38.0856, 38.0856 * 1e-4);
  /* lift = weight at launch for this spin */
  g_assert_cmpfloat_with_epsilon (aw_sweep_result_point (r, 0, 1, 0)->lift_ratio, 1.0, 1e-4);

  /* "no spin, wind 2 m/s toward −y": ground distance 31.1004 m */
  d.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_CROSSWIND_MPS, -2.0, -2.0, 1 };
  d.hop = AW_SWEEP_HOP_SETUP;
  s.input.hop_mode = AW_HOP_MODE_SPIN;
  s.input.hop_value = 0.0;
  w = run_ok (&s, 1, &d, 1);
  g_assert_cmpfloat_with_epsilon (aw_sweep_result_value (w, 0, 0, 0,
                                                         AW_SWEEP_METRIC_GROUND_DISTANCE),
                                  31.1004, 31.1004 * 1e-4);
  g_assert_cmpfloat (aw_sweep_result_value (w, 0, 0, 0, AW_SWEEP_METRIC_DRIFT_AT), <, 0.0);
  /* the flight ends before 40 m: nothing to report there */
  {
    AwSweepPoint p;
    d.at_distance_m = 40.0;
    aw_sweep_eval_point (&s, &d, -2.0, NAN, &p);
    g_assert_cmpint (p.status, ==, AW_ANALYSIS_OK);
    g_assert_true (isnan (p.values[AW_SWEEP_METRIC_TIME_AT]));
    g_assert_true (isnan (p.values[AW_SWEEP_METRIC_ENERGY_AT]));
    g_assert_true (isfinite (p.values[AW_SWEEP_METRIC_GROUND_DISTANCE]));
  }
}

/* ---- points that cannot be computed ---- */

static void
test_bad_points (void)
{
  AwSweepSetup s;
  AwSweepDesc d;
  g_autoptr (AwSweepResult) r = NULL;
  g_autoptr (AwSweepResult) h = NULL;

  /* 0.12 g: above 5.4 J the muzzle velocity passes the engine's 300 m/s */
  setup_default (&s, "light");
  s.input.shot.mass_kg = 0.12e-3;
  aw_sweep_desc_init (&d);
  d.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_ENERGY_J, 1.0, 7.0, 7 };
  r = run_ok (&s, 1, &d, 2);
  for (guint i = 0; i < r->n1; i++)
    {
      const AwSweepPoint *p = aw_sweep_result_point (r, 0, i, 0);
      gboolean too_fast = aw_velocity_for_energy (0.12e-3, r->values1[i]) > 300.0;
      g_assert_cmpint (p->status, ==, too_fast ? AW_ANALYSIS_BAD_INPUT : AW_ANALYSIS_OK);
      for (int m = 0; m < AW_SWEEP_N_METRICS; m++)
        if (too_fast || m == AW_SWEEP_METRIC_COMPLIANCE)
          g_assert_true (isnan (p->values[m]));
    }
  g_assert_cmpstr (aw_sweep_status_to_name (aw_sweep_result_point (r, 0, 6, 0)->status), ==,
                   "bad-input");

  /* 0.48 g at 0.2 J (about 29 m/s): the saturating lift model cannot reach high ratios */
  setup_default (&s, "slow");
  s.input.shot.mass_kg = 0.48e-3;
  s.input.shot.velocity_mps = aw_velocity_for_energy (0.48e-3, 0.2);
  d.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_LIFT_RATIO, 0.5, 6.0, 12 };
  h = run_ok (&s, 1, &d, 2);
  g_assert_cmpint (aw_sweep_result_point (h, 0, 0, 0)->status, ==, AW_ANALYSIS_OK);
  g_assert_cmpint (aw_sweep_result_point (h, 0, 11, 0)->status, ==, AW_ANALYSIS_HOP_UNREACHABLE);
  g_assert_true (isnan (aw_sweep_result_value (h, 0, 11, 0, AW_SWEEP_METRIC_BAND_RANGE)));
  g_assert_cmpstr (aw_sweep_status_to_name (AW_ANALYSIS_HOP_UNREACHABLE), ==, "hop-unreachable");
}

/* ---- compliance ---- */

static void
test_compliance (void)
{
  AwSweepSetup s;
  AwSweepDesc d;
  g_autoptr (AwSweepResult) r = NULL;
  g_autoptr (AwSweepResult) m = NULL;
  g_autoptr (AwSweepResult) none = NULL;

  /* 1.49 J, the common outdoor limit (trade reference, common practice, no source), chronographed
   * with the BB the player uses */
  setup_default (&s, "rifle");
  aw_sweep_desc_init (&d);
  d.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_ENERGY_J, 1.0, 2.0, 11 };
  d.site.energy_limit_j = 1.49;
  r = run_ok (&s, 1, &d, 2);
  for (guint i = 0; i < r->n1; i++)
    {
      const AwSweepPoint *p = aw_sweep_result_point (r, 0, i, 0);
      double e = p->values[AW_SWEEP_METRIC_MUZZLE_ENERGY];
      g_assert_cmpint (p->compliance, ==, e > 1.49 ? AW_COMPLIANCE_OVER : AW_COMPLIANCE_UNDER);
      g_assert_cmpfloat_with_epsilon (p->values[AW_SWEEP_METRIC_COMPLIANCE], 100.0 * e / 1.49,
                                      1e-9);
    }
  g_assert_cmpint (aw_sweep_result_point (r, 0, 4, 0)->compliance, ==, AW_COMPLIANCE_UNDER);
  g_assert_cmpint (aw_sweep_result_point (r, 0, 5, 0)->compliance, ==, AW_COMPLIANCE_OVER);

  /* a mass sweep of a gas replica that creeps, chronographed with 0.20 g: the same verdict and
   * energy as aw_site_check */
  setup_default (&s, "gas");
  s.power.model = AW_POWER_CREEP;
  s.power.ref_mass_kg = 0.20e-3;
  s.power.ref_velocity_mps = 118.0;
  s.power.creep_pct_per_01g = 12.0;
  d.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_MASS_G, 0.20, 0.45, 6 };
  d.site.chrono_mass_kg = 0.20e-3;
  m = run_ok (&s, 1, &d, 2);
  for (guint i = 0; i < m->n1; i++)
    {
      const AwSweepPoint *p = aw_sweep_result_point (m, 0, i, 0);
      AwSiteClass site = d.site;
      double chrono;
      AwCompliance c = aw_site_check (&site, &s.power, aw_g_to_kg (m->values1[i]), &chrono);
      g_assert_cmpint (p->compliance, ==, c);
      g_assert_cmpfloat_with_epsilon (p->values[AW_SWEEP_METRIC_COMPLIANCE] / 100.0 * 1.49,
                                      chrono, 1e-12);
      /* energy at the BB used grows with mass: the creep model's definition (aw-analysis.h) */
      if (i > 0)
        g_assert_cmpfloat (p->values[AW_SWEEP_METRIC_MUZZLE_ENERGY], >,
                           aw_sweep_result_value (m, 0, i - 1, 0,
                                                  AW_SWEEP_METRIC_MUZZLE_ENERGY));
    }

  /* no limit: no verdict and no percentage */
  aw_sweep_desc_init (&d);
  none = run_ok (&s, 1, &d, 1);
  g_assert_cmpint (aw_sweep_result_point (none, 0, 0, 0)->compliance, ==, AW_COMPLIANCE_UNKNOWN);
  g_assert_true (isnan (aw_sweep_result_value (none, 0, 0, 0, AW_SWEEP_METRIC_COMPLIANCE)));
}

/* ---- progress and cancel ---- */

typedef struct
{
  GArray *fractions;
  GThread *thread;
  gboolean other_thread;
  GCancellable *cancel_at_first;
  gint64 cancelled_at;
} Progress;

static void
on_progress (double f, gpointer data)
{
  Progress *p = data;
  g_array_append_val (p->fractions, f);
  if (g_thread_self () != p->thread)
    p->other_thread = TRUE;
  if (p->cancel_at_first && p->cancelled_at == 0)
    {
      p->cancelled_at = g_get_monotonic_time ();
      g_cancellable_cancel (p->cancel_at_first);
    }
}

static void
test_progress (void)
{
  AwSweepSetup s;
  AwSweepDesc d;
  Progress p = { g_array_new (FALSE, FALSE, sizeof (double)), g_thread_self (), FALSE, NULL, 0 };
  g_autoptr (AwSweepResult) r = NULL;
  guint ones = 0;

  setup_default (&s, "p");
  aw_sweep_desc_init (&d);
  d.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_MASS_G, 0.20, 0.48, 40 };
  d.axis[1] = (AwSweepAxis) { AW_SWEEP_VAR_ENERGY_J, 0.8, 2.0, 40 };
  r = aw_sweep_run (&s, 1, &d, 2, on_progress, &p, NULL, NULL);
  g_assert_nonnull (r);
  g_assert_cmpuint (p.fractions->len, >=, 1);
  for (guint i = 0; i < p.fractions->len; i++)
    {
      double f = g_array_index (p.fractions, double, i);
      g_assert_cmpfloat (f, >, 0.0);
      g_assert_cmpfloat (f, <=, 1.0);
      if (i > 0)
        g_assert_cmpfloat (f, >, g_array_index (p.fractions, double, i - 1));
      ones += f == 1.0;
    }
  g_assert_cmpuint (ones, ==, 1);
  g_assert_cmpfloat (g_array_index (p.fractions, double, p.fractions->len - 1), ==, 1.0);
  g_assert_false (p.other_thread);
  g_test_message ("%u progress reports", p.fractions->len);
  g_array_unref (p.fractions);
}

static void
test_cancel (void)
{
  AwSweepSetup s;
  AwSweepDesc d;
  g_autoptr (GCancellable) c = g_cancellable_new ();
  g_autoptr (GError) error = NULL;
  Progress p = { g_array_new (FALSE, FALSE, sizeof (double)), g_thread_self (), FALSE, c, 0 };

  /* 250 × 250 auto-hop cells: far longer than the first progress report (50 ms) */
  setup_default (&s, "c");
  aw_sweep_desc_init (&d);
  d.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_MASS_G, 0.20, 0.48, 250 };
  d.axis[1] = (AwSweepAxis) { AW_SWEEP_VAR_ENERGY_J, 0.8, 2.0, 250 };
  AwSweepResult *r = aw_sweep_run (&s, 1, &d, 2, on_progress, &p, c, &error);
  gint64 returned = g_get_monotonic_time ();
  g_assert_null (r);
  g_assert_error (error, G_IO_ERROR, G_IO_ERROR_CANCELLED);
  g_assert_cmpuint (p.fractions->len, ==, 1);
  g_assert_cmpfloat (g_array_index (p.fractions, double, 0), <, 1.0);
  /* only the points in progress finish: a cell takes well under a millisecond (a few under a
   * sanitizer or valgrind), so a second is a wide margin that still tells "stopped" from
   * "ran on to the end" (which takes several seconds) */
  g_test_message ("returned %.1f ms after the cancel",
                  (returned - p.cancelled_at) / 1000.0);
  g_assert_cmpint (returned - p.cancelled_at, <, G_USEC_PER_SEC);
  g_array_unref (p.fractions);

  /* cancelled before the start: no work, no progress */
  g_clear_error (&error);
  p.fractions = g_array_new (FALSE, FALSE, sizeof (double));
  g_assert_null (aw_sweep_run (&s, 1, &d, 2, on_progress, &p, c, &error));
  g_assert_error (error, G_IO_ERROR, G_IO_ERROR_CANCELLED);
  g_assert_cmpuint (p.fractions->len, ==, 0);
  g_array_unref (p.fractions);
}

/* ---- CSV ---- */

/* An independent RFC 4180 reader: rows of fields; quoted fields may hold commas, doubled quotes
 * and line breaks; records end with CRLF (a lone LF is accepted too). Returns NULL on a syntax
 * error (a quote inside an unquoted field, text after a closing quote, an open quote at the
 * end). */
static GPtrArray *
csv_parse (const char *text)
{
  GPtrArray *rows = g_ptr_array_new_with_free_func ((GDestroyNotify) g_strfreev);
  GPtrArray *row = g_ptr_array_new_with_free_func (g_free);
  GString *field = g_string_new (NULL);
  const char *p = text;
  gboolean ok = TRUE;

  while (*p)
    {
      if (*p == '"')
        {
          p++;
          for (;;)
            {
              if (*p == '\0')
                {
                  ok = FALSE;
                  goto done;
                }
              if (*p == '"' && p[1] == '"')
                {
                  g_string_append_c (field, '"');
                  p += 2;
                }
              else if (*p == '"')
                {
                  p++;
                  break;
                }
              else
                g_string_append_c (field, *p++);
            }
          if (*p != ',' && *p != '\r' && *p != '\n' && *p != '\0')
            {
              ok = FALSE;
              goto done;
            }
        }
      else
        while (*p && *p != ',' && *p != '\r' && *p != '\n')
          {
            if (*p == '"')
              {
                ok = FALSE;
                goto done;
              }
            g_string_append_c (field, *p++);
          }
      g_ptr_array_add (row, g_strdup (field->str));
      g_string_truncate (field, 0);
      if (*p == ',')
        {
          p++;
          continue;
        }
      if (*p == '\r')
        p++;
      if (*p == '\n')
        p++;
      g_ptr_array_add (row, NULL);
      g_ptr_array_add (rows, g_ptr_array_free (row, FALSE));
      row = g_ptr_array_new_with_free_func (g_free);
    }
done:
  g_string_free (field, TRUE);
  g_ptr_array_free (row, TRUE);
  if (!ok)
    {
      g_ptr_array_unref (rows);
      return NULL;
    }
  return rows;
}

static double
parse_field (const char *s)
{
  char *end = NULL;
  double v;
  if (*s == '\0')
    return NAN;
  v = g_ascii_strtod (s, &end);
  g_assert_true (end != s && *end == '\0');
  return v;
}

static AwSweepResult *
csv_result (void)
{
  AwSweepSetup s[2];
  AwSweepDesc d;

  setup_default (&s[0], "Team \"North\", rifle");
  setup_default (&s[1], "two\r\nlines");
  s[1].input.shot.mass_kg = 0.12e-3;   /* energies above 5.4 J: bad points, empty fields */
  aw_sweep_desc_init (&d);
  d.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_ENERGY_J, 0.7, 6.0, 4 };
  d.axis[1] = (AwSweepAxis) { AW_SWEEP_VAR_CROSSWIND_MPS, -1.5, 2.0, 3 };
  d.at_distance_m = 27.5;
  d.site.energy_limit_j = 1.14;
  return run_ok (s, 2, &d, 2);
}

static void
test_csv_roundtrip (void)
{
  g_autoptr (AwSweepResult) r = csv_result ();
  g_autofree char *csv = aw_sweep_result_to_csv (r, NULL, 0);
  g_autoptr (GPtrArray) rows = csv_parse (csv);
  guint row = 1, empty = 0;

  g_assert_nonnull (rows);
  g_assert_true (g_str_has_suffix (csv, "\r\n"));
  g_assert_cmpuint (rows->len, ==, 1 + n_points (r));
  char **head = g_ptr_array_index (rows, 0);
  const char *expect[] = { "setup", "energy_j", "crosswind_mps", "band_range_m",
                           "ground_distance_m", "apex_m", "time_at_27.5m_s", "energy_at_27.5m_j",
                           "speed_at_27.5m_mps", "drift_at_27.5m_cm", "muzzle_energy_j",
                           "compliance_pct", "status", NULL };
  g_assert_cmpstrv (head, expect);

  for (guint s = 0; s < r->n_setups; s++)
    for (guint j = 0; j < r->n2; j++)
      for (guint i = 0; i < r->n1; i++, row++)
        {
          char **f = g_ptr_array_index (rows, row);
          const AwSweepPoint *p = aw_sweep_result_point (r, s, i, j);
          g_assert_cmpuint (g_strv_length (f), ==, 3 + AW_SWEEP_N_METRICS + 1);
          g_assert_cmpstr (f[0], ==, r->setup_names[s]);
          assert_same_bits (parse_field (f[1]), r->values1[i], "axis 0");
          assert_same_bits (parse_field (f[2]), r->values2[j], "axis 1");
          for (int m = 0; m < AW_SWEEP_N_METRICS; m++)
            {
              double v = parse_field (f[3 + m]);
              if (isnan (p->values[m]))
                {
                  g_assert_cmpstr (f[3 + m], ==, "");
                  empty++;
                }
              else
                assert_same_bits (v, p->values[m], head[3 + m]);
            }
          g_assert_cmpstr (f[3 + AW_SWEEP_N_METRICS], ==, aw_sweep_status_to_name (p->status));
        }
  g_assert_cmpuint (empty, >, 0);   /* the bad points were written as empty fields */

  /* one metric only */
  AwSweepMetric only = AW_SWEEP_METRIC_SPEED_AT;
  g_autofree char *one = aw_sweep_result_to_csv (r, &only, 1);
  g_autoptr (GPtrArray) rows1 = csv_parse (one);
  g_assert_nonnull (rows1);
  const char *expect1[] = { "setup", "energy_j", "crosswind_mps", "speed_at_27.5m_mps", "status",
                            NULL };
  g_assert_cmpstrv (g_ptr_array_index (rows1, 0), expect1);

  /* a one-input sweep has one axis column */
  {
    AwSweepSetup s;
    AwSweepDesc d;
    setup_default (&s, "plain");
    aw_sweep_desc_init (&d);
    d.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_HEIGHT_M, 0.3, 1.5, 3 };
    g_autoptr (AwSweepResult) r1 = run_ok (&s, 1, &d, 1);
    g_autofree char *c1 = aw_sweep_result_to_csv (r1, &only, 1);
    g_autoptr (GPtrArray) rr = csv_parse (c1);
    const char *e1[] = { "setup", "height_m", "speed_at_30m_mps", "status", NULL };
    g_assert_cmpstrv (g_ptr_array_index (rr, 0), e1);
    g_assert_cmpuint (rr->len, ==, 4);
  }

  /* the file holds the same text; saving over an existing file replaces it whole */
  {
    g_autoptr (GError) error = NULL;
    g_autofree char *dir = g_dir_make_tmp ("aw-sweep-XXXXXX", &error);
    g_assert_no_error (error);
    g_autofree char *path = g_build_filename (dir, "sweep.csv", NULL);
    g_autofree char *back = NULL;
    g_assert_true (g_file_set_contents (path, "old", -1, NULL));
    g_assert_true (aw_sweep_result_save_csv (r, NULL, 0, path, &error));
    g_assert_no_error (error);
    g_assert_true (g_file_get_contents (path, &back, NULL, NULL));
    g_assert_cmpstr (back, ==, csv);
    g_autofree char *bad = g_build_filename (dir, "missing", "sweep.csv", NULL);
    g_assert_false (aw_sweep_result_save_csv (r, NULL, 0, bad, &error));
    g_assert_nonnull (error);
    g_remove (path);
    g_rmdir (dir);
  }
}

/* The independent reader itself: quoted commas, doubled quotes, line breaks, bad input. */
static void
test_csv_reader (void)
{
  g_autoptr (GPtrArray) a = csv_parse ("a,\"b,c\",\"say \"\"hi\"\"\"\r\n\"x\r\ny\",,z\r\n");
  g_assert_nonnull (a);
  g_assert_cmpuint (a->len, ==, 2);
  const char *r0[] = { "a", "b,c", "say \"hi\"", NULL };
  const char *r1[] = { "x\r\ny", "", "z", NULL };
  g_assert_cmpstrv (g_ptr_array_index (a, 0), r0);
  g_assert_cmpstrv (g_ptr_array_index (a, 1), r1);
  g_assert_null (csv_parse ("a,b\"c\r\n"));
  g_assert_null (csv_parse ("\"open\r\n"));
  g_assert_null (csv_parse ("\"a\"b\r\n"));
}

/* The German locale writes "1,5" with printf: the file must not change. */
static void
test_csv_locale (void)
{
  g_autoptr (AwSweepResult) r = csv_result ();
  g_autofree char *c_text = NULL;
  g_autofree char *de_text = NULL;
  g_autofree char *saved = g_strdup (setlocale (LC_ALL, NULL));

  g_assert_nonnull (setlocale (LC_ALL, "C"));
  c_text = aw_sweep_result_to_csv (r, NULL, 0);
  if (setlocale (LC_ALL, "de_DE.UTF-8") == NULL)
    {
      /* fail loudly, never skip: the locale is part of the test environment (.ci/install-deps) */
      g_test_message ("the de_DE.UTF-8 locale is missing: generate it with "
                      "sed -i 's/^# *de_DE.UTF-8/de_DE.UTF-8/' /etc/locale.gen && locale-gen");
      g_test_fail ();
      setlocale (LC_ALL, saved);
      return;
    }
  /* the locale really uses a decimal comma, or this test proves nothing */
  {
    char probe[16];
    g_snprintf (probe, sizeof probe, "%.1f", 1.5);
    g_assert_cmpstr (probe, ==, "1,5");
  }
  de_text = aw_sweep_result_to_csv (r, NULL, 0);
  {
    char b[G_ASCII_DTOSTR_BUF_SIZE];
    /* shortest exact forms, with a point whatever the locale */
    g_assert_cmpstr (aw_sweep_format_number (b, 0.2), ==, "0.2");
    g_assert_cmpstr (aw_sweep_format_number (b, 1.5), ==, "1.5");
    g_assert_cmpstr (aw_sweep_format_number (b, -2.5e-7), ==, "-2.5e-07");
    g_assert_cmpstr (aw_sweep_format_number (b, 0.1 + 0.2), ==, "0.30000000000000004");
    for (int k = 1; k < 200; k++)
      {
        double v = 1.0 / k + k * 1e-3;
        assert_same_bits (g_ascii_strtod (aw_sweep_format_number (b, v), NULL), v, "format");
      }
  }
  setlocale (LC_ALL, saved);
  g_assert_cmpstr (de_text, ==, c_text);
  g_assert_nonnull (strstr (c_text, "0.7"));   /* a decimal point, as written in C */
}

static void
test_result_range (void)
{
  AwSweepSetup s[2];
  AwSweepDesc d;
  double lo, hi, lo0, hi0, lo1, hi1;

  setup_default (&s[0], "a");
  setup_default (&s[1], "b");
  s[1].input.shot.velocity_mps = 120.0;
  aw_sweep_desc_init (&d);
  d.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_HEIGHT_M, 0.5, 2.0, 4 };
  g_autoptr (AwSweepResult) r = run_ok (s, 2, &d, 2);
  g_assert_true (aw_sweep_result_range (r, -1, AW_SWEEP_METRIC_MUZZLE_ENERGY, &lo, &hi));
  g_assert_true (aw_sweep_result_range (r, 0, AW_SWEEP_METRIC_MUZZLE_ENERGY, &lo0, &hi0));
  g_assert_true (aw_sweep_result_range (r, 1, AW_SWEEP_METRIC_MUZZLE_ENERGY, &lo1, &hi1));
  /* E = ½·m·v² (closed form) */
  g_assert_cmpfloat_with_epsilon (lo, 0.5 * 0.2e-3 * 100.0 * 100.0, 1e-12);
  g_assert_cmpfloat_with_epsilon (hi, 0.5 * 0.2e-3 * 120.0 * 120.0, 1e-12);
  g_assert_cmpfloat (lo0, ==, lo);
  g_assert_cmpfloat (hi1, ==, hi);
  /* no site limit: compliance is undefined everywhere */
  g_assert_false (aw_sweep_result_range (r, -1, AW_SWEEP_METRIC_COMPLIANCE, &lo, &hi));
}

/* A project setup as the sweep sees it: its conditions give back exactly the air of the bridge,
 * so a temperature "sweep" at the setup's own temperature is the setup itself. */
static void
test_project_setup (void)
{
  g_autoptr (AwProject) p = aw_project_new ();
  AwSetup *setup = aw_setup_new ("Marksman, own weather");
  AwSweepSetup ss;
  AwSweepDesc d;
  AwSweepPoint plain, at_own_temperature;
  AwAir air;
  g_autoptr (GError) error = NULL;

  setup->bb.mass_g = 0.32;
  setup->conditions = aw_project_conditions_new ();
  setup->conditions->temperature_c = 12.0;
  setup->conditions->pressure_hpa = NAN;
  setup->conditions->altitude_m = 420.0;
  setup->conditions->humidity_pct = 75.0;
  g_ptr_array_add (p->setups, setup);

  g_assert_true (aw_sweep_setup_from_project (&ss, setup, p, &error));
  g_assert_no_error (error);
  g_assert_cmpstr (ss.name, ==, "Marksman, own weather");
  g_assert_cmpfloat (ss.input.shot.mass_kg, ==, 0.32e-3);
  g_assert_cmpint (aw_air_from_conditions (&ss.conditions, &air), ==, AW_AIR_OK);
  assert_same_bits (air.density, ss.input.shot.air.density, "density");
  assert_same_bits (air.viscosity, ss.input.shot.air.viscosity, "viscosity");

  aw_sweep_desc_init (&d);
  d.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_HEIGHT_M, ss.input.shot.height_m,
                              ss.input.shot.height_m, 1 };
  d.hop = AW_SWEEP_HOP_SETUP;
  aw_sweep_eval_point (&ss, &d, ss.input.shot.height_m, NAN, &plain);
  d.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_TEMPERATURE_C, 12.0, 12.0, 1 };
  aw_sweep_eval_point (&ss, &d, 12.0, NAN, &at_own_temperature);
  g_assert_cmpint (plain.status, ==, AW_ANALYSIS_OK);
  g_assert_cmpmem (&plain, sizeof plain, &at_own_temperature, sizeof at_own_temperature);

  /* a setup whose values cannot be bridged is refused with its name */
  setup->conditions->temperature_c = 500.0;
  g_assert_false (aw_sweep_setup_from_project (&ss, setup, p, &error));
  g_assert_error (error, AW_CORE_ERROR, AW_CORE_ERROR_INVALID);
  g_assert_nonnull (strstr (error->message, "Marksman, own weather"));
}

int
main (int argc, char **argv)
{
  g_test_init (&argc, &argv, NULL);

  g_test_add_func ("/sweep/names", test_names);
  g_test_add_func ("/sweep/validate", test_validate);
  g_test_add_func ("/sweep/axis-values", test_axis_values);
  g_test_add_func ("/sweep/single-run/lift-ratio", test_lift_ratio_single_run);
  g_test_add_func ("/sweep/single-run/other-inputs", test_other_inputs_single_run);
  g_test_add_func ("/sweep/map/threads", test_map_threads);
  g_test_add_func ("/sweep/reference-trajectories", test_reference_trajectories);
  g_test_add_func ("/sweep/bad-points", test_bad_points);
  g_test_add_func ("/sweep/compliance", test_compliance);
  g_test_add_func ("/sweep/result-range", test_result_range);
  g_test_add_func ("/sweep/project-setup", test_project_setup);
  g_test_add_func ("/sweep/progress", test_progress);
  g_test_add_func ("/sweep/cancel", test_cancel);
  g_test_add_func ("/sweep/csv/reader", test_csv_reader);
  g_test_add_func ("/sweep/csv/roundtrip", test_csv_roundtrip);
  g_test_add_func ("/sweep/csv/locale", test_csv_locale);
  return g_test_run ();
}
