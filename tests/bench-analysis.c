/* bench-analysis.c: time per auto hop and per range table (prints figures; not a test)
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <glib.h>
#include <math.h>
#include <stdio.h>

#include "aw-analysis.h"
#include "aw-units.h"

typedef struct
{
  const char *name;
  double mass_g, energy_j, sight_m, zero_m;
  bool optimise;
  AwLiftModel lift;
} Case;

static void
setup_input (const Case *c, AwAnalysisInput *in)
{
  aw_analysis_input_init (in);
  in->shot.mass_kg = aw_g_to_kg (c->mass_g);
  in->shot.velocity_mps = aw_velocity_for_energy (in->shot.mass_kg, c->energy_j);
  in->sight_height_m = c->sight_m;
  in->zero_distance_m = c->zero_m;
  in->optimise_elevation = c->optimise;
  in->shot.aero.lift = c->lift;
  if (c->lift == AW_LIFT_LINEAR)
    in->shot.aero.lift_slope = AW_LIFT_TRADE_SLOPE;
}

int
main (int argc, char **argv)
{
  static const Case cases[] = {
    { "0.20 g 1.00 J level", 0.20, 1.00, 0.0, NAN, false, AW_LIFT_SATURATING },
    { "0.25 g 1.14 J level", 0.25, 1.14, 0.0, NAN, false, AW_LIFT_SATURATING },
    { "0.28 g 1.50 J level", 0.28, 1.50, 0.0, NAN, false, AW_LIFT_SATURATING },
    { "0.40 g 2.30 J level", 0.40, 2.30, 0.0, NAN, false, AW_LIFT_SATURATING },
    { "0.20 g 1.00 J trade linear", 0.20, 1.00, 0.0, NAN, false, AW_LIFT_LINEAR },
    { "0.28 g 1.50 J sight 7 cm", 0.28, 1.50, 0.07, NAN, false, AW_LIFT_SATURATING },
    { "0.28 g 1.50 J sight 25 cm", 0.28, 1.50, 0.25, NAN, false, AW_LIFT_SATURATING },
    { "0.28 g 1.50 J sight 7 zero 30", 0.28, 1.50, 0.07, 30.0, false, AW_LIFT_SATURATING },
    { "0.28 g 1.50 J optimise elev.", 0.28, 1.50, 0.0, NAN, true, AW_LIFT_SATURATING },
  };
  double budget_s = argc > 1 ? g_ascii_strtod (argv[1], NULL) : 0.3;

  printf ("%-32s %10s %8s %10s %8s\n", "auto hop", "us/call", "flights", "band m", "ratio");
  for (guint i = 0; i < G_N_ELEMENTS (cases); i++)
    {
      AwAnalysisInput in;
      AwBandResult r;
      setup_input (&cases[i], &in);
      aw_auto_hop (&in, &r);   /* warm up */
      gint64 t0 = g_get_monotonic_time ();
      int n = 0;
      do
        {
          aw_auto_hop (&in, &r);
          n++;
        }
      while (g_get_monotonic_time () - t0 < budget_s * 1e6);
      double us = (double) (g_get_monotonic_time () - t0) / n;
      printf ("%-32s %10.1f %8d %10.3f %8.4f\n", cases[i].name, us, r.flights, r.band_range_m,
              r.lift_ratio);
    }

  printf ("\n%-32s %10s %8s\n", "range table (1 m rows, auto hop)", "us/call", "rows");
  for (guint i = 0; i < G_N_ELEMENTS (cases); i++)
    {
      AwAnalysisInput in;
      AwRangeTable t;
      setup_input (&cases[i], &in);
      if (cases[i].optimise)
        continue;
      gint64 t0 = g_get_monotonic_time ();
      int n = 0;
      size_t rows = 0;
      do
        {
          aw_range_table_build (&in, 1.0, 0.0, 20.0, &t);
          rows = t.n_rows;
          aw_range_table_clear (&t);
          n++;
        }
      while (g_get_monotonic_time () - t0 < budget_s * 1e6);
      printf ("%-32s %10.1f %8zu\n", cases[i].name, (double) (g_get_monotonic_time () - t0) / n,
              rows);
    }

  {
    AwAnalysisInput in;
    AwPowerCurve c = { AW_POWER_CONSTANT_ENERGY, 0.20e-3, aw_fps_to_mps (400.0), 0.0, NULL, 0 };
    AwSiteClass site = { 1.49, 0.20e-3, NAN };
    const double masses[] = { 0.20e-3, 0.23e-3, 0.25e-3, 0.28e-3, 0.30e-3, 0.32e-3, 0.36e-3,
                              0.40e-3, 0.43e-3, 0.45e-3, 0.48e-3 };
    AwRecommendation rec;
    aw_analysis_input_init (&in);
    gint64 t0 = g_get_monotonic_time ();
    int n = 0;
    do
      {
        aw_recommend (&in, &c, &site, masses, G_N_ELEMENTS (masses), &rec);
        aw_recommendation_clear (&rec);
        n++;
      }
    while (g_get_monotonic_time () - t0 < budget_s * 1e6);
    printf ("\nrecommend, 11 masses: %.1f us/call\n", (double) (g_get_monotonic_time () - t0) / n);
  }
  return 0;
}
