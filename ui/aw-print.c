/* aw-print.c: the print job — options, analysis, pagination, PDF output
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <cairo-pdf.h>
#include <errno.h>
#include <glib/gi18n.h>
#include <glib/gstdio.h>
#include <math.h>
#include <pango/pangocairo.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

#include "aw-print-private.h"
#include "aw-units.h"

G_DEFINE_QUARK (aw-print-error-quark, aw_print_error)

/* common practice, no source: the usual BB masses sold (trade reference "Numbers") */
const double aw_print_sweep_masses_g[AW_PRINT_N_SWEEP_MASSES] = {
  0.20, 0.23, 0.25, 0.28, 0.30, 0.32, 0.36, 0.40, 0.43, 0.45, 0.48
};

/* ---- job ---- */

AwPrintJob *
aw_print_job_new (AwPrintKind kind, const AwProject *project)
{
  AwPrintJob *job;

  g_return_val_if_fail (project != NULL, NULL);
  job = g_new0 (AwPrintJob, 1);
  job->kind = kind;
  job->project = aw_project_copy (project);
  job->names = g_ptr_array_new_with_free_func (g_free);
  job->paper = kind == AW_PRINT_KIND_CARD ? AW_PAPER_A6 : AW_PAPER_A4;
  job->units = AW_PRINT_UNITS_METRIC;
  job->date = g_date_time_new_now_local ();
  return job;
}

static void
unprepare (AwPrintJob *job)
{
  if (job->setups)
    {
      for (guint i = 0; i < job->setups->len; i++)
        {
          AwPrintSetup *ps = &g_array_index (job->setups, AwPrintSetup, i);
          aw_range_table_clear (&ps->table);
          aw_trajectory_clear (&ps->traj);
          if (ps->has_rec)
            aw_recommendation_clear (&ps->rec);
        }
      g_clear_pointer (&job->setups, g_array_unref);
    }
  if (job->doc && job->doc_free)
    job->doc_free (job->doc);
  job->doc = NULL;
  job->doc_free = NULL;
  job->prepared = FALSE;
  job->layout_w = job->layout_h = 0.0;
  job->n_pages = 0;
  g_clear_pointer (&job->title, g_free);
}

void
aw_print_job_free (AwPrintJob *job)
{
  if (job == NULL)
    return;
  unprepare (job);
  aw_project_free (job->project);
  g_ptr_array_unref (job->names);
  g_free (job->site_name);
  g_free (job->class_name);
  g_clear_pointer (&job->date, g_date_time_unref);
  g_free (job);
}

AwPrintKind
aw_print_job_get_kind (AwPrintJob *job)
{
  return job->kind;
}

gboolean
aw_print_job_add_setup (AwPrintJob *job, const char *setup_name, GError **error)
{
  g_return_val_if_fail (job != NULL, FALSE);
  g_return_val_if_fail (setup_name != NULL, FALSE);
  if (aw_project_find_setup (job->project, setup_name) == NULL)
    {
      g_set_error (error, AW_PRINT_ERROR, AW_PRINT_ERROR_UNKNOWN_SETUP,
                   _("The project has no setup named “%s”."), setup_name);
      return FALSE;
    }
  unprepare (job);
  g_ptr_array_add (job->names, g_strdup (setup_name));
  return TRUE;
}

guint
aw_print_job_get_n_setups (AwPrintJob *job)
{
  return job->names->len;
}

void
aw_print_job_set_paper (AwPrintJob *job, AwPaper paper)
{
  unprepare (job);
  job->paper = paper;
  job->paper_set = TRUE;
}

AwPaper
aw_print_job_get_paper (AwPrintJob *job)
{
  return job->paper;
}

void
aw_print_job_set_units (AwPrintJob *job, AwPrintUnits units)
{
  unprepare (job);
  job->units = units;
}

AwPrintUnits
aw_print_job_get_units (AwPrintJob *job)
{
  return job->units;
}

AwUnitSystem
aw_print_job_unit_system (AwPrintJob *job)
{
  return job->units == AW_PRINT_UNITS_IMPERIAL ? AW_UNITS_IMPERIAL : AW_UNITS_METRIC;
}

gboolean
aw_print_job_set_site (AwPrintJob *job, const char *site_name, const char *class_name,
                       GError **error)
{
  const AwSiteRules *site = NULL;
  const AwSiteClassRule *rule = NULL;

  g_return_val_if_fail (job != NULL, FALSE);
  unprepare (job);
  if (class_name == NULL)
    {
      g_clear_pointer (&job->site_name, g_free);
      g_clear_pointer (&job->class_name, g_free);
      job->site = NULL;
      job->site_class = NULL;
      return TRUE;
    }
  if (site_name)
    {
      site = aw_project_find_site_rules (job->project, site_name);
      if (site == NULL)
        {
          g_set_error (error, AW_PRINT_ERROR, AW_PRINT_ERROR_UNKNOWN_SITE,
                       _("The project has no site rules named “%s”."), site_name);
          return FALSE;
        }
    }
  else
    {
      /* the class name alone: it must name a class in exactly one set of site rules */
      for (guint i = 0; i < job->project->site_rules->len; i++)
        {
          const AwSiteRules *r = g_ptr_array_index (job->project->site_rules, i);
          for (guint k = 0; k < r->classes->len; k++)
            if (g_strcmp0 (((AwSiteClassRule *) g_ptr_array_index (r->classes, k))->name,
                           class_name) == 0)
              {
                if (site && site != r)
                  {
                    g_set_error (error, AW_PRINT_ERROR, AW_PRINT_ERROR_UNKNOWN_SITE,
                                 _("Several site rules have a class named “%s”: choose the "
                                   "site as well."), class_name);
                    return FALSE;
                  }
                site = r;
              }
        }
      if (site == NULL)
        {
          g_set_error (error, AW_PRINT_ERROR, AW_PRINT_ERROR_UNKNOWN_SITE,
                       _("No site rules of the project have a class named “%s”."), class_name);
          return FALSE;
        }
    }
  for (guint k = 0; k < site->classes->len; k++)
    {
      const AwSiteClassRule *r = g_ptr_array_index (site->classes, k);
      if (g_strcmp0 (r->name, class_name) == 0)
        rule = r;
    }
  if (rule == NULL)
    {
      g_set_error (error, AW_PRINT_ERROR, AW_PRINT_ERROR_UNKNOWN_SITE,
                   _("The site rules “%s” have no class named “%s”."), site->name,
                   class_name);
      return FALSE;
    }
  g_free (job->site_name);
  job->site_name = g_strdup (site->name);
  g_free (job->class_name);
  job->class_name = g_strdup (class_name);
  job->site = site;
  job->site_class = rule;
  return TRUE;
}

void
aw_print_job_set_date (AwPrintJob *job, GDateTime *date)
{
  g_return_if_fail (date != NULL);
  unprepare (job);
  g_clear_pointer (&job->date, g_date_time_unref);
  job->date = g_date_time_ref (date);
}

double
aw_print_job_min_engagement_m (AwPrintJob *job)
{
  if (job->site_class && job->site_class->min_engagement_m > 0.0)
    return job->site_class->min_engagement_m;
  return NAN;
}

static gboolean
prepare_setup (AwPrintJob *job, AwPrintSetup *ps, GError **error)
{
  AwBridgeStatus bs;
  AwAnalysisStatus st;
  AwSiteClass site = { 0.0, 0.0, 0.0 };

  bs = aw_setup_to_analysis_input (ps->setup, job->project, &ps->in);
  if (bs != AW_BRIDGE_OK)
    {
      const char *why;
      switch (bs)
        {
        case AW_BRIDGE_BAD_CONDITIONS:
          why = _("the conditions (temperature, pressure or altitude, humidity) are out of range");
          break;
        case AW_BRIDGE_BAD_POWER:
          why = _("the replica gives no muzzle velocity for this BB (check the reference "
                  "velocity and the energy model)");
          break;
        case AW_BRIDGE_BAD_INPUT:
        default:
          why = _("a value is missing or not a number");
          break;
        }
      g_set_error (error, AW_PRINT_ERROR, AW_PRINT_ERROR_SETUP_INVALID,
                   _("Setup “%s” cannot be printed: %s."), ps->setup->name, why);
      return FALSE;
    }
  /* after the bridge: its points stay valid until the next call on this setup */
  aw_setup_power_curve (ps->setup, &ps->curve);
  ps->velocity_mps = ps->in.shot.velocity_mps;
  ps->energy_j = aw_energy_j (ps->in.shot.mass_kg, ps->velocity_mps);
  aw_pl_parse_colour (ps->setup->colour, ps->rgb);

  st = aw_range_table_build (&ps->in, job->table_step_m,
                             job->table_step_m * AW_PRINT_TABLE_MAX_ROWS,
                             aw_print_job_min_engagement_m (job), &ps->table);
  ps->status = st;
  if (st < 0)
    {
      g_set_error (error, AW_PRINT_ERROR, AW_PRINT_ERROR_ANALYSIS,
                   _("Setup “%s” cannot be printed: %s."), ps->setup->name,
                   aw_print_status_text (st));
      return FALSE;
    }

  /* the solved flight, sampled finely, for the plots */
  if ((st == AW_ANALYSIS_OK || st == AW_ANALYSIS_NO_BAND)
      && isfinite (ps->table.band.spin_rad_s) && isfinite (ps->table.band.elevation_rad))
    {
      AwShot shot = ps->in.shot;
      AwFlightOptions opt;
      aw_flight_options_init (&opt);
      opt.sample_step_m = 0.25;
      shot.spin_rad_s = ps->table.band.spin_rad_s;
      shot.elevation_rad = ps->table.band.elevation_rad;
      ps->traj_ok = aw_flight_run (&shot, &opt, &ps->traj) >= 0 && ps->traj.n_samples > 1;
    }

  if (job->site_class)
    aw_site_class_rule_to_site_class (job->site_class, &site);
  ps->compliance = aw_site_check (&site, &ps->curve, ps->in.shot.mass_kg, &ps->chrono_energy_j);
  if (!job->site_class)
    ps->chrono_energy_j = NAN;

  if (job->kind != AW_PRINT_KIND_CARD)
    {
      double masses[AW_PRINT_N_SWEEP_MASSES];
      for (int i = 0; i < AW_PRINT_N_SWEEP_MASSES; i++)
        masses[i] = aw_g_to_kg (aw_print_sweep_masses_g[i]);
      st = aw_recommend (&ps->in, &ps->curve, &site, masses, AW_PRINT_N_SWEEP_MASSES, &ps->rec);
      ps->has_rec = st >= 0;
      if (!ps->has_rec)
        aw_recommendation_clear (&ps->rec);
    }
  return TRUE;
}

gboolean
aw_print_job_prepare (AwPrintJob *job, GError **error)
{
  g_return_val_if_fail (job != NULL, FALSE);
  if (job->prepared)
    return TRUE;
  unprepare (job);

  if (job->names->len == 0)
    {
      g_set_error_literal (error, AW_PRINT_ERROR, AW_PRINT_ERROR_NO_SETUP,
                           _("Choose at least one setup to print."));
      return FALSE;
    }
  if (job->kind != AW_PRINT_KIND_CARD && job->paper == AW_PAPER_A6)
    {
      g_set_error_literal (error, AW_PRINT_ERROR, AW_PRINT_ERROR_OPTION,
                           _("Setup sheets and loadout sheets are printed on A4 or Letter, "
                             "not A6."));
      return FALSE;
    }
  job->table_step_m = job->units == AW_PRINT_UNITS_IMPERIAL ? AW_PRINT_TABLE_STEP_IMPERIAL_M
                                                             : AW_PRINT_TABLE_STEP_METRIC_M;
  job->setups = g_array_sized_new (FALSE, TRUE, sizeof (AwPrintSetup), job->names->len);
  g_array_set_size (job->setups, job->names->len);
  for (guint i = 0; i < job->names->len; i++)
    {
      AwPrintSetup *ps = &g_array_index (job->setups, AwPrintSetup, i);
      ps->setup = aw_project_find_setup (job->project, g_ptr_array_index (job->names, i));
      if (ps->setup == NULL)
        {
          g_set_error (error, AW_PRINT_ERROR, AW_PRINT_ERROR_UNKNOWN_SETUP,
                       _("The project has no setup named “%s”."),
                       (char *) g_ptr_array_index (job->names, i));
          unprepare (job);
          return FALSE;
        }
      if (!prepare_setup (job, ps, error))
        {
          unprepare (job);
          return FALSE;
        }
    }

  {
    const char *first = g_ptr_array_index (job->names, 0);
    switch (job->kind)
      {
      case AW_PRINT_KIND_CARD:
        job->title = job->names->len == 1
                     /* TRANSLATORS: document title; %s is a setup name */
                     ? g_strdup_printf (_("Range card – %s"), first)
                     : g_strdup (_("Range cards"));
        break;
      case AW_PRINT_KIND_SHEET:
        job->title = job->names->len == 1
                     /* TRANSLATORS: document title; %s is a setup name */
                     ? g_strdup_printf (_("Setup sheet – %s"), first)
                     : g_strdup (_("Setup sheets"));
        break;
      case AW_PRINT_KIND_LOADOUT:
      default:
        job->title = job->project->name && *job->project->name
                     /* TRANSLATORS: document title; %s is the project name */
                     ? g_strdup_printf (_("Loadout sheet – %s"), job->project->name)
                     : g_strdup (_("Loadout sheet"));
        break;
      }
  }
  job->prepared = TRUE;
  return TRUE;
}

const char *
aw_print_job_get_title (AwPrintJob *job)
{
  if (!aw_print_job_prepare (job, NULL))
    return _("Arcwright");
  return job->title;
}

char *
aw_print_job_date_text (AwPrintJob *job)
{
  /* ISO 8601: unambiguous in every country */
  return g_date_time_format (job->date, "%Y-%m-%d");
}

char *
aw_print_job_footer_text (AwPrintJob *job)
{
  g_autofree char *date = aw_print_job_date_text (job);
  const char *kind;
  switch (job->kind)
    {
    case AW_PRINT_KIND_CARD:
      kind = _("Range card");
      break;
    case AW_PRINT_KIND_SHEET:
      kind = _("Setup sheet");
      break;
    case AW_PRINT_KIND_LOADOUT:
    default:
      kind = _("Loadout sheet");
      break;
    }
  return g_strdup_printf ("Arcwright · %s · %s", kind, date);
}

/* the band kept free for the footer at the bottom of a sheet, pt */
#define FLOW_FOOTER_BAND 14.0

int
aw_print_flow_paginate (AwPlFlowDoc *flow, AwPl *pl, double w, double h)
{
  double m = AW_PRINT_MARGIN_PT;
  return aw_pl_flow_paginate (flow, pl, w - 2 * m, h - 2 * m - FLOW_FOOTER_BAND);
}

void
aw_print_flow_draw_page (AwPrintJob *job, AwPlFlowDoc *flow, AwPl *pl, int page, double w,
                         double h)
{
  double m = AW_PRINT_MARGIN_PT;
  g_autofree char *foot = aw_print_job_footer_text (job);

  aw_pl_flow_draw_page (flow, pl, page, m, m, w - 2 * m);
  aw_pl_footer (pl, m, h - m - 6.0, w - 2 * m, foot, page, job->n_pages, AW_PRINT_FOOTER_SIZE);
}

/* ---- texts shared by the kinds ---- */

const char *
aw_print_caution_short (void)
{
  return _("Computed estimate, not a measurement. Sealed eye protection at all times. The site’s "
           "chronograph and rules decide; respect minimum engagement distances. Local law "
           "applies.");
}

const char *
aw_print_caution_long (void)
{
  return _("Wear sealed, impact-rated eye protection at all times in play areas (mesh lets "
           "fragments through); lower-face protection is required for minors at many sites. "
           "Use a barrel blocker in safe zones, take the magazine out and clear the replica by "
           "firing into the ground. Chronograph the replica with the site’s BB and rules before "
           "every game and after any change: the site’s chronograph decides, not these figures. "
           "Respect minimum engagement distances. Laws differ between countries and change; the "
           "owner is responsible. These pages give computed estimates, not legal advice.");
}

const char *
aw_print_compliance_text (AwCompliance c)
{
  switch (c)
    {
    case AW_COMPLIANCE_UNDER:
      return _("under the limit");
    case AW_COMPLIANCE_OVER:
      return _("OVER THE LIMIT");
    case AW_COMPLIANCE_UNKNOWN:
    default:
      return _("no limit chosen");
    }
}

const char *
aw_print_status_text (AwAnalysisStatus status)
{
  switch (status)
    {
    case AW_ANALYSIS_OK:
      return "";
    case AW_ANALYSIS_NO_BAND:
      return _("the flight never stays inside the band");
    case AW_ANALYSIS_HOP_UNREACHABLE:
      return _("the hop asked for cannot be reached by the lift model");
    case AW_ANALYSIS_NO_ZERO:
      return _("no bore angle puts the flight on the zero distance");
    case AW_ANALYSIS_BAD_INPUT:
      return _("a value of the setup is out of range");
    case AW_ANALYSIS_FLIGHT_FAILED:
    default:
      return _("the flight could not be computed");
    }
}

const char *
aw_print_power_source_text (AwPowerSource s)
{
  switch (s)
    {
    case AW_POWER_SOURCE_SPRING:
      return _("spring");
    case AW_POWER_SOURCE_ELECTRIC_PISTON:
      return _("electric piston");
    case AW_POWER_SOURCE_GAS:
      return _("gas");
    case AW_POWER_SOURCE_HPA:
      return _("high-pressure air");
    case AW_POWER_SOURCE_CO2:
      return _("CO₂");
    case AW_N_POWER_SOURCES:
    default:
      return _("unknown");
    }
}

char *
aw_print_hop_text (const AwPrintSetup *ps)
{
  g_autofree char *ratio = aw_pl_num (ps->table.band.lift_ratio, 2);
  char *text;

  switch (ps->setup->hop.mode)
    {
    case AW_HOP_MODE_AUTO:
      /* TRANSLATORS: hop chosen by the program; %s is the lift ratio found */
      text = g_strdup_printf (_("auto (lift ratio %s)"), ratio);
      break;
    case AW_HOP_MODE_SPIN:
      {
        g_autofree char *rpm = aw_pl_num (ps->setup->hop.value, 0);
        /* TRANSLATORS: %s are the model spin in rpm and the lift ratio it gives */
        text = g_strdup_printf (_("model spin %s rpm (lift ratio %s)"), rpm, ratio);
      }
      break;
    case AW_HOP_MODE_LIFT_RATIO:
    default:
      text = g_strdup_printf (_("lift ratio %s"), ratio);
      break;
    }
  if (fabs (ps->setup->hop.tilt_deg) > 0.0)
    {
      g_autofree char *tilt = aw_pl_num (ps->setup->hop.tilt_deg, 1);
      char *t2 = g_strdup_printf (_("%s, tilt %s°"), text, tilt);
      g_free (text);
      text = t2;
    }
  return text;
}

char *
aw_print_site_text (AwPrintJob *job)
{
  const AwSiteClassRule *r = job->site_class;
  g_autofree char *limit = NULL;
  g_autofree char *chrono = NULL;

  if (r == NULL)
    return g_strdup (_("no site class chosen"));
  limit = aw_pl_num_unit (r->energy_limit_j, 2, "J");
  if (isfinite (r->chrono_bb_mass_g) && r->chrono_bb_mass_g > 0)
    {
      g_autofree char *m = aw_pl_num_unit (r->chrono_bb_mass_g, 2, "g");
      /* TRANSLATORS: %s is a BB mass, e.g. "0.20 g" */
      chrono = g_strdup_printf (_("chrono with %s"), m);
    }
  else
    chrono = g_strdup (_("chrono with the BB used"));
  /* TRANSLATORS: site class summary: class, site, energy limit, chrono BB convention */
  return g_strdup_printf (_("%s (%s): limit %s, %s"), r->name, job->site_name, limit, chrono);
}

char *
aw_print_qty (AwPrintJob *job, AwQuantity q, double base)
{
  AwUnitSystem u = aw_print_job_unit_system (job);
  return aw_pl_num_unit (aw_qty_to_display (q, u, base), aw_qty_digits (q, u), aw_qty_unit (q, u));
}

char *
aw_print_velocity_text (AwPrintJob *job, double v_mps)
{
  g_autofree char *mps = aw_pl_num_unit (v_mps, 1, "m/s");
  g_autofree char *fps = aw_pl_num_unit (aw_mps_to_fps (v_mps), 0, "fps");
  if (job->units == AW_PRINT_UNITS_IMPERIAL)
    return g_strdup_printf ("%s (%s)", fps, mps);
  return g_strdup_printf ("%s (%s)", mps, fps);
}

char *
aw_print_conditions_text (AwPrintJob *job, const AwPrintSetup *ps)
{
  const AwProjectConditions *c = aw_setup_effective_conditions (ps->setup, job->project);
  g_autofree char *t = aw_print_qty (job, AW_QTY_TEMPERATURE, c->temperature_c);
  g_autofree char *p = NULL;
  g_autofree char *hum = aw_pl_num (c->humidity_pct, 0);
  g_autofree char *wind = NULL;

  if (isfinite (c->pressure_hpa))
    p = aw_print_qty (job, AW_QTY_PRESSURE, c->pressure_hpa);
  else
    {
      g_autofree char *alt = aw_print_qty (job, AW_QTY_ALTITUDE, c->altitude_m);
      /* TRANSLATORS: air given by the altitude; %s is e.g. "350 m" */
      p = g_strdup_printf (_("altitude %s"), alt);
    }
  if (c->wind_speed_mps > 0.0)
    {
      g_autofree char *ws = aw_print_qty (job, AW_QTY_WIND, c->wind_speed_mps);
      g_autofree char *wd = aw_pl_num (c->wind_from_deg, 0);
      /* TRANSLATORS: wind speed and the direction it blows from (0° = from the target) */
      wind = g_strdup_printf (_("wind %s from %s°"), ws, wd);
    }
  else
    wind = g_strdup (_("no wind"));
  /* TRANSLATORS: conditions assumed: temperature, pressure, relative humidity (%), wind */
  return g_strdup_printf (_("%s, %s, %s %% humidity, %s"), t, p, hum, wind);
}

/* ---- plots ---- */

void
aw_print_draw_flight_plot (AwPrintJob *job, AwPl *pl, const AwPrintSetup *const *setups,
                           guint n, double x, double y, double w, double h, gboolean legend,
                           double font_scale)
{
  g_autofree AwPlotSeries *series = g_new0 (AwPlotSeries, MAX (n, 1));
  AwPlotScene scene;
  AwChartStyle style;
  guint k = 0;

  aw_chart_style_scaled (aw_chart_style_light (), font_scale, &style);
  style.dash_series = n > 1;
  style.font_family = "DejaVu Sans";
  aw_plot_scene_init (&scene);
  for (guint i = 0; i < n; i++)
    {
      const AwPrintSetup *ps = setups[i];
      /* every setup keeps its index (colour and dash match the key beside the plot) */
      series[k].name = ps->setup->name;
      series[k].color = (AwRgba) { ps->rgb[0], ps->rgb[1], ps->rgb[2], 1.0 };
      series[k].samples = ps->traj_ok ? ps->traj.samples : NULL;
      series[k].n_samples = ps->traj_ok ? ps->traj.n_samples : 0;
      series[k].visible = ps->traj_ok;
      k++;
    }
  scene.series = series;
  scene.n_series = k;
  if (n > 0)
    {
      scene.sight_line_m = setups[0]->in.shot.height_m + setups[0]->in.sight_height_m;
      scene.band_half_m = setups[0]->in.band_half_m;
      scene.muzzle_height_m = setups[0]->in.shot.height_m;
    }
  scene.min_engagement_m = aw_print_job_min_engagement_m (job);
  scene.show_ground = true;
  scene.show_legend = legend;
  scene.units = job->units == AW_PRINT_UNITS_IMPERIAL ? AW_PLOT_UNITS_IMPERIAL
                                                      : AW_PLOT_UNITS_METRIC;
  cairo_save (pl->cr);
  cairo_translate (pl->cr, x + 2.0, y + 2.0);
  cairo_rectangle (pl->cr, 0, 0, w - 4.0, h - 4.0);
  cairo_clip (pl->cr);
  aw_plot_render (pl->cr, w - 4.0, h - 4.0, &scene, NULL, &style);
  cairo_restore (pl->cr);
  cairo_set_source_rgb (pl->cr, 0.6, 0.6, 0.6);
  aw_pl_rect_stroke (pl, x, y, w, h, 0.4);
}

/* ---- pages ---- */

void
aw_print_paper_size (AwPaper paper, double *width_pt, double *height_pt)
{
  double w, h;
  switch (paper)
    {
    case AW_PAPER_A4:
      w = 210.0 / 25.4 * 72.0;
      h = 297.0 / 25.4 * 72.0;
      break;
    case AW_PAPER_LETTER:
      w = 8.5 * 72.0;
      h = 11.0 * 72.0;
      break;
    case AW_PAPER_A6:
    default:
      w = AW_PRINT_CARD_W;
      h = AW_PRINT_CARD_H;
      break;
    }
  if (width_pt)
    *width_pt = w;
  if (height_pt)
    *height_pt = h;
}

PangoContext *
aw_print_pango_context_new (cairo_t *cr)
{
  PangoContext *ctx = pango_cairo_create_context (cr);
  cairo_font_options_t *fo = cairo_font_options_create ();

  cairo_font_options_set_hint_style (fo, CAIRO_HINT_STYLE_NONE);
  cairo_font_options_set_hint_metrics (fo, CAIRO_HINT_METRICS_OFF);
  pango_cairo_context_set_font_options (ctx, fo);
  cairo_font_options_destroy (fo);
  pango_cairo_context_set_resolution (ctx, 72.0);
  pango_context_set_round_glyph_positions (ctx, FALSE);
  return ctx;
}

/* Lays the job out for a page of w × h with a private measuring context. */
static int
paginate (AwPrintJob *job, double w, double h)
{
  cairo_surface_t *surface;
  cairo_t *cr;
  AwPl pl;

  if (!aw_print_job_prepare (job, NULL))
    return 0;
  if (job->n_pages > 0 && fabs (job->layout_w - w) < 0.01 && fabs (job->layout_h - h) < 0.01)
    return job->n_pages;

  surface = cairo_image_surface_create (CAIRO_FORMAT_ARGB32, 4, 4);
  cr = cairo_create (surface);
  pl.cr = cr;
  pl.pango = aw_print_pango_context_new (cr);
  switch (job->kind)
    {
    case AW_PRINT_KIND_CARD:
      job->n_pages = aw_print_card_paginate (job, &pl, w, h);
      break;
    case AW_PRINT_KIND_SHEET:
      job->n_pages = aw_print_sheet_paginate (job, &pl, w, h);
      break;
    case AW_PRINT_KIND_LOADOUT:
    default:
      job->n_pages = aw_print_loadout_paginate (job, &pl, w, h);
      break;
    }
  job->layout_w = w;
  job->layout_h = h;
  g_object_unref (pl.pango);
  cairo_destroy (cr);
  cairo_surface_destroy (surface);
  return job->n_pages;
}

int
aw_print_paginate (AwPrintJob *job, double width_pt, double height_pt)
{
  g_return_val_if_fail (job != NULL, 0);
  g_return_val_if_fail (width_pt > 0 && height_pt > 0, 0);
  return paginate (job, width_pt, height_pt);
}

int
aw_print_n_pages (AwPrintJob *job)
{
  double w, h;
  g_return_val_if_fail (job != NULL, 0);
  aw_print_paper_size (job->paper, &w, &h);
  return paginate (job, w, h);
}

void
aw_print_draw_page (AwPrintJob *job, cairo_t *cr, PangoContext *pango, int page,
                    double width_pt, double height_pt)
{
  AwPl pl;
  int n;

  g_return_if_fail (job != NULL && cr != NULL);
  n = paginate (job, width_pt, height_pt);
  if (page < 0 || page >= n)
    return;
  pl.cr = cr;
  pl.pango = pango ? g_object_ref (pango) : aw_print_pango_context_new (cr);
  cairo_save (cr);
  switch (job->kind)
    {
    case AW_PRINT_KIND_CARD:
      aw_print_card_draw_page (job, &pl, page, width_pt, height_pt);
      break;
    case AW_PRINT_KIND_SHEET:
      aw_print_sheet_draw_page (job, &pl, page, width_pt, height_pt);
      break;
    case AW_PRINT_KIND_LOADOUT:
    default:
      aw_print_loadout_draw_page (job, &pl, page, width_pt, height_pt);
      break;
    }
  cairo_restore (cr);
  g_object_unref (pl.pango);
}

gboolean
aw_print_to_pdf (AwPrintJob *job, const char *path, GError **error)
{
  g_autofree char *tmp = NULL;
  g_autofree char *date = NULL;
  cairo_surface_t *surface;
  cairo_status_t status;
  cairo_t *cr;
  double w, h;
  int fd, n;

  g_return_val_if_fail (job != NULL, FALSE);
  g_return_val_if_fail (path != NULL, FALSE);
  if (!aw_print_job_prepare (job, error))
    return FALSE;
  aw_print_paper_size (job->paper, &w, &h);
  n = paginate (job, w, h);

  tmp = g_strdup_printf ("%s.tmp-XXXXXX", path);
  fd = g_mkstemp (tmp);
  if (fd < 0)
    {
      int e = errno;
      g_set_error (error, AW_PRINT_ERROR, AW_PRINT_ERROR_IO, _("Cannot write “%s”: %s"), path,
                   g_strerror (e));
      return FALSE;
    }
  {
    /* g_mkstemp makes the file private; give it the usual permissions */
    mode_t mask = umask (0);
    umask (mask);
    fchmod (fd, 0666 & ~mask);
  }
  close (fd);

  surface = cairo_pdf_surface_create (tmp, w, h);
  cairo_pdf_surface_set_metadata (surface, CAIRO_PDF_METADATA_TITLE, job->title);
  cairo_pdf_surface_set_metadata (surface, CAIRO_PDF_METADATA_CREATOR, "Arcwright");
  cairo_pdf_surface_set_metadata (surface, CAIRO_PDF_METADATA_SUBJECT,
                                  job->kind == AW_PRINT_KIND_CARD ? _("Range card")
                                  : job->kind == AW_PRINT_KIND_SHEET ? _("Setup sheet")
                                  : _("Loadout sheet"));
  date = g_date_time_format (job->date, "%Y-%m-%dT%H:%M:%S%:z");
  if (date)
    cairo_pdf_surface_set_metadata (surface, CAIRO_PDF_METADATA_CREATE_DATE, date);
  cr = cairo_create (surface);
  for (int p = 0; p < n; p++)
    {
      aw_print_draw_page (job, cr, NULL, p, w, h);
      cairo_show_page (cr);
    }
  cairo_destroy (cr);
  cairo_surface_finish (surface);
  status = cairo_surface_status (surface);
  cairo_surface_destroy (surface);
  if (status != CAIRO_STATUS_SUCCESS)
    {
      g_unlink (tmp);
      g_set_error (error, AW_PRINT_ERROR, AW_PRINT_ERROR_IO, _("Cannot write “%s”: %s"), path,
                   cairo_status_to_string (status));
      return FALSE;
    }
  if (g_rename (tmp, path) != 0)
    {
      int e = errno;
      g_unlink (tmp);
      g_set_error (error, AW_PRINT_ERROR, AW_PRINT_ERROR_IO, _("Cannot write “%s”: %s"), path,
                   g_strerror (e));
      return FALSE;
    }
  return TRUE;
}
