/* aw-print-loadout.c: the loadout sheet — a team's setups side by side (A4 or Letter)
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <glib/gi18n.h>
#include <math.h>

#include "aw-print-private.h"
#include "aw-units.h"

#define BODY_SIZE 8.5
#define HEADING_SIZE 10.5
#define PLOT_H 215.0
#define DRIFT_ROW 6            /* the table row at 6 steps: 30 m or 30 yd */

typedef struct
{
  AwPlFlowDoc flow;
} LoadoutDoc;

static void
loadout_doc_free (gpointer p)
{
  LoadoutDoc *d = p;
  aw_pl_flow_clear (&d->flow);
  g_free (d);
}

/* ---- the overlaid plot ---- */

typedef struct
{
  AwPrintJob *job;
} PlotBlock;

static double
plot_measure (AwPl *pl, gpointer data, double width)
{
  return PLOT_H;
}

static void
plot_draw (AwPl *pl, gpointer data, double x, double y, double width, double height)
{
  PlotBlock *b = data;
  AwPrintJob *job = b->job;
  g_autofree const AwPrintSetup **list = g_new0 (const AwPrintSetup *, job->setups->len);
  for (guint i = 0; i < job->setups->len; i++)
    list[i] = &g_array_index (job->setups, AwPrintSetup, i);
  aw_print_draw_flight_plot (job, pl, list, job->setups->len, x, y, width, height, FALSE, 0.7);
}

/* ---- colour swatches beside the setup names ---- */

typedef struct
{
  AwPrintJob *job;
} KeyBlock;

static double
key_layout (AwPl *pl, AwPrintJob *job, double x, double y, double w, gboolean draw)
{
  AwPlStyle s = aw_pl_style (7.5);
  double cw = (w - 10.0) / 2.0, yy = y, rh = 0.0;
  s.max_lines = 2;
  for (guint i = 0; i < job->setups->len; i++)
    {
      const AwPrintSetup *ps = &g_array_index (job->setups, AwPrintSetup, i);
      double cx = x + (i % 2) * (cw + 10.0);
      g_autofree char *label = ps->traj_ok
                               ? g_strdup (ps->setup->name)
                               /* TRANSLATORS: plot key of a setup whose flight is not drawn;
                                * the first %s is its name, the second the reason */
                               : g_strdup_printf (_("%s (not drawn: %s)"), ps->setup->name,
                                                  aw_print_status_text (ps->status));
      double h = aw_pl_text_height (pl, label, &s, cw - 20.0);
      if (draw)
        {
          double dashes[4];
          AwChartStyle style;
          int nd;
          aw_chart_style_scaled (aw_chart_style_light (), 0.7, &style);
          style.dash_series = job->setups->len > 1;
          nd = aw_chart_series_dash (&style, i, dashes);
          cairo_save (pl->cr);
          aw_pl_set_rgb (pl, ps->rgb);
          cairo_set_line_width (pl->cr, style.line_width);
          cairo_set_dash (pl->cr, dashes, nd, 0);
          cairo_move_to (pl->cr, cx, yy + 4.5);
          cairo_line_to (pl->cr, cx + 15.0, yy + 4.5);
          cairo_stroke (pl->cr);
          cairo_restore (pl->cr);
          aw_pl_text (pl, cx + 20.0, yy, cw - 20.0, label, &s);
        }
      rh = MAX (rh, h);
      if (i % 2 == 1 || i + 1 == job->setups->len)
        {
          yy += rh + 2.0;
          rh = 0.0;
        }
    }
  return yy - y;
}

static double
key_measure (AwPl *pl, gpointer data, double width)
{
  return key_layout (pl, ((KeyBlock *) data)->job, 0, 0, width, FALSE);
}

static void
key_draw (AwPl *pl, gpointer data, double x, double y, double width, double height)
{
  key_layout (pl, ((KeyBlock *) data)->job, x, y, width, TRUE);
}

/* ---- the table ---- */

static void
add_table (AwPlFlowDoc *doc, AwPrintJob *job)
{
  static const double weights[] = { 1.9, 1.5, 0.7, 1.1, 0.8, 1.0, 1.0, 1.3, 0.9, 1.0 };
  AwUnitSystem u = aw_print_job_unit_system (job);
  AwPlColumn *cols = g_new0 (AwPlColumn, 10);
  AwPlTable *t = g_new0 (AwPlTable, 1);
  double per = aw_qty_from_display (AW_QTY_WIND, u, 1.0);
  g_autofree char *at = aw_pl_num_unit (aw_qty_to_display (AW_QTY_DISTANCE, u,
                                                           DRIFT_ROW * job->table_step_m),
                                        0, aw_qty_unit (AW_QTY_DISTANCE, u));
  g_autofree char *w1 = aw_pl_num_unit (1.0, 0, aw_qty_unit (AW_QTY_WIND, u));

  aw_pl_table_init (t, cols, 10, 7.8);
  aw_pl_table_keep (t, cols);
  t->row_height = 14.0;
  cols[0].header = _("Setup");
  cols[1].header = _("Replica");
  cols[2].header = _("BB (g)");
  cols[3].header = aw_pl_table_keep (t, g_strdup_printf (_("%s (%s)"), _("Muzzle velocity"),
                                                         aw_qty_unit (AW_QTY_VELOCITY, u)));
  cols[4].header = aw_pl_table_keep (t, g_strdup_printf (_("%s (%s)"), _("Energy"), "J"));
  cols[5].header = aw_pl_table_keep (t, g_strdup_printf (_("%s (%s)"), _("Site chrono"), "J"));
  cols[6].header = _("Limit");
  cols[7].header = _("Hop");
  cols[8].header = aw_pl_table_keep (t, g_strdup_printf (_("%s (%s)"), _("Band range"),
                                                         aw_qty_unit (AW_QTY_DISTANCE, u)));
  cols[9].header = aw_pl_table_keep (t, g_strdup_printf (_("Drift at %s per %s (%s)"), at, w1,
                                                         aw_qty_unit (AW_QTY_SMALL_CM, u)));
  for (int i = 0; i < 10; i++)
    {
      cols[i].weight = weights[i];
      cols[i].align = i <= 1 || i == 7 ? PANGO_ALIGN_LEFT
                      : i == 6 ? PANGO_ALIGN_CENTER : PANGO_ALIGN_RIGHT;
      cols[i].wrap = i <= 1;
    }
  for (guint i = 0; i < job->setups->len; i++)
    {
      const AwPrintSetup *ps = &g_array_index (job->setups, AwPrintSetup, i);
      char *cells[10];
      AwPlRowFlags f = AW_PL_ROW_PLAIN;
      double drift = NAN;

      if (ps->table.n_rows > DRIFT_ROW)
        drift = ps->table.rows[DRIFT_ROW].drift_cm_per_mps;
      cells[0] = g_strdup (ps->setup->name);
      cells[1] = g_strdup (ps->setup->replica.type);
      cells[2] = aw_pl_num (aw_kg_to_g (ps->in.shot.mass_kg), 2);
      cells[3] = aw_pl_num (aw_qty_to_display (AW_QTY_VELOCITY, u, ps->velocity_mps),
                            u == AW_UNITS_IMPERIAL ? 0 : 1);
      cells[4] = aw_pl_num (ps->energy_j, 2);
      cells[5] = job->site_class ? aw_pl_num (ps->chrono_energy_j, 2) : g_strdup ("–");
      cells[6] = g_strdup (ps->compliance == AW_COMPLIANCE_OVER ? _("OVER")
                           : ps->compliance == AW_COMPLIANCE_UNDER ? _("under") : "–");
      if (ps->setup->hop.mode == AW_HOP_MODE_AUTO)
        {
          g_autofree char *lr = aw_pl_num (ps->table.band.lift_ratio, 2);
          /* TRANSLATORS: short hop text in a table cell: auto hop and its lift ratio */
          cells[7] = g_strdup_printf (_("auto %s"), lr);
        }
      else
        cells[7] = aw_pl_num (ps->table.band.lift_ratio, 2);
      cells[8] = ps->status == AW_ANALYSIS_OK
                 ? aw_pl_num (aw_qty_to_display (AW_QTY_DISTANCE, u, ps->table.band.band_range_m),
                              0)
                 : g_strdup ("–");
      cells[9] = aw_pl_num (aw_qty_to_display (AW_QTY_SMALL_CM, u, drift * per), 1);
      if (ps->compliance == AW_COMPLIANCE_OVER)
        f |= AW_PL_ROW_HATCHED | AW_PL_ROW_BOLD;
      aw_pl_table_add_row (t, cells, f);
    }
  aw_pl_flow_add_table (doc, t);
}

static LoadoutDoc *
loadout_doc (AwPrintJob *job)
{
  LoadoutDoc *d;
  AwPlStyle note = aw_pl_style (7.5);
  g_autofree char *date = NULL;
  g_autofree char *sub = NULL;
  g_autofree char *site = NULL;

  if (job->doc)
    return job->doc;
  d = g_new0 (LoadoutDoc, 1);
  aw_pl_flow_init (&d->flow);
  note.italic = TRUE;
  date = aw_print_job_date_text (job);
  site = aw_print_site_text (job);
  /* TRANSLATORS: loadout sheet subtitle: number of setups, date */
  sub = g_strdup_printf (g_dngettext (GETTEXT_PACKAGE, "%u setup · %s", "%u setups · %s",
                                      job->setups->len), job->setups->len, date);
  aw_print_add_title (&d->flow, job, NULL, _("Loadout sheet"),
                      job->project->name && *job->project->name ? job->project->name
                                                                  : _("Team loadout"), sub);

  {
    AwPlBox *box = aw_pl_flow_add_box (&d->flow, _("Site rules"), NULL);
    box->size = BODY_SIZE;
    box->border_rgb[0] = box->border_rgb[1] = box->border_rgb[2] = 0.4;
    aw_pl_box_add (box, _("Site class"), site);
    if (job->site_class)
      {
        double med = aw_print_job_min_engagement_m (job);
        if (isfinite (med))
          {
            g_autofree char *m = aw_print_qty (job, AW_QTY_DISTANCE, med);
            aw_pl_box_add (box, _("Minimum engagement distance"), m);
          }
        if (job->site_class->hop_rule && *job->site_class->hop_rule)
          aw_pl_box_add (box, _("Site’s hop rule"), job->site_class->hop_rule);
        if (job->site && job->site->notes && *job->site->notes)
          aw_pl_box_add (box, _("Site notes"), job->site->notes);
      }
  }

  aw_pl_flow_add_heading (&d->flow, _("Setups"), HEADING_SIZE);
  add_table (&d->flow, job);
  {
    AwPlBlock *b;
    b = aw_pl_flow_add_text (&d->flow,
                             _("Energy is the muzzle energy with each setup’s own BB; “Site "
                               "chrono” is the energy as the site measures it, with the site’s "
                               "chrono BB. Band range with each setup’s hop and sight. Hatched "
                               "rows are over the limit."), &note);
    b->space_after = 10.0;
  }

  {
    AwPlBox *box = aw_pl_flow_add_box (&d->flow, _("Cautions"), NULL);
    box->size = 8.0;
    box->border_width = 1.0;
    aw_pl_box_add (box, NULL, _("Everyone chronographs with the site’s BB before play, and again "
                                "after any change. A team BB weight only carries hop settings "
                                "and holds over when the BB lot is the same."));
    aw_pl_box_add (box, NULL, aw_print_caution_long ());
  }

  aw_pl_flow_add_heading (&d->flow, _("Flights compared"), HEADING_SIZE);
  {
    PlotBlock *pb = g_new0 (PlotBlock, 1);
    KeyBlock *kb = g_new0 (KeyBlock, 1);
    AwPlBlock *b;
    pb->job = job;
    kb->job = job;
    b = aw_pl_flow_add (&d->flow, plot_measure, plot_draw, pb, g_free);
    b->keep_with_next = TRUE;
    b->space_after = 4.0;
    aw_pl_flow_add (&d->flow, key_measure, key_draw, kb, g_free);
  }

  job->doc = d;
  job->doc_free = loadout_doc_free;
  return d;
}

int
aw_print_loadout_paginate (AwPrintJob *job, AwPl *pl, double w, double h)
{
  return aw_print_flow_paginate (&loadout_doc (job)->flow, pl, w, h);
}

void
aw_print_loadout_draw_page (AwPrintJob *job, AwPl *pl, int page, double w, double h)
{
  aw_print_flow_draw_page (job, &loadout_doc (job)->flow, pl, page, w, h);
}
