/* aw-print-private.h: the print job shared by the card, sheet and loadout renderers
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#pragma once

#include "aw-analysis.h"
#include "aw-flight.h"
#include "aw-format.h"
#include "aw-plot.h"
#include "aw-print-layout.h"
#include "aw-print.h"
#include "aw-project.h"

G_BEGIN_DECLS

/* The usual BB masses of the trade (trade reference, common practice, no source), used for the
 * recommendation and the BB-mass sweep. */
#define AW_PRINT_N_SWEEP_MASSES 11
extern const double aw_print_sweep_masses_g[AW_PRINT_N_SWEEP_MASSES];

/* Page margins, pt. */
#define AW_PRINT_MARGIN_PT 36.0       /* sheets: half an inch */
#define AW_PRINT_CARD_MARGIN_PT 13.0  /* cards: about 4.6 mm */
#define AW_PRINT_FOOTER_SIZE 7.0

/* Everything computed for one setup. */
typedef struct
{
  AwSetup *setup;                 /* borrowed from job->project */
  AwAnalysisInput in;
  AwAnalysisStatus status;        /* of the range table's band */
  AwRangeTable table;             /* every job->table_step_m to the ground */
  AwTrajectory traj;              /* the solved flight (fine samples), for plots */
  gboolean traj_ok;
  AwPowerCurve curve;             /* points borrowed from the setup */
  double velocity_mps;            /* muzzle velocity with the setup's BB */
  double energy_j;
  AwCompliance compliance;        /* UNKNOWN without a site class */
  double chrono_energy_j;         /* energy as the site measures it */
  AwRecommendation rec;           /* sheets and loadouts: over aw_print_sweep_masses_g */
  gboolean has_rec;
  double rgb[3];                  /* the setup's colour */
} AwPrintSetup;

struct _AwPrintJob
{
  AwPrintKind kind;
  AwProject *project;             /* owned copy */
  GPtrArray *names;               /* of char*, the chosen setups in order */
  AwPaper paper;
  gboolean paper_set;
  AwPrintUnits units;
  char *site_name;                /* NULL: none */
  char *class_name;
  const AwSiteRules *site;        /* borrowed from project, after set_site */
  const AwSiteClassRule *site_class;
  GDateTime *date;
  char *title;

  /* prepared state */
  gboolean prepared;
  GArray *setups;                 /* of AwPrintSetup */
  double table_step_m;

  /* layout state (pages depend on the page size) */
  double layout_w, layout_h;
  int n_pages;
  gpointer doc;                   /* kind-specific layout (sheet, loadout) */
  GDestroyNotify doc_free;
};

/* Unit system of the job for aw-format. */
AwUnitSystem aw_print_job_unit_system (AwPrintJob *job);

/* The print date, ISO 8601 ("2025-04-30"). */
char *aw_print_job_date_text (AwPrintJob *job);

/* Footer text "Arcwright · KIND · date". */
char *aw_print_job_footer_text (AwPrintJob *job);

/* A sheet laid out as a flow of blocks (setup and loadout sheets): paginates inside the margins
 * above the footer band, and draws one page with its footer. */
int aw_print_flow_paginate (AwPlFlowDoc *flow, AwPl *pl, double w, double h);
void aw_print_flow_draw_page (AwPrintJob *job, AwPlFlowDoc *flow, AwPl *pl, int page, double w,
                              double h);

/* The short caution every output carries (translated). */
const char *aw_print_caution_short (void);
/* The longer safety text of sheets (translated, several sentences). */
const char *aw_print_caution_long (void);

/* A flight plot of several setups into (x, y, w, h) on pl's cairo context, with the band, sight
 * line and no-shoot zone of the first setup and the site class. */
void aw_print_draw_flight_plot (AwPrintJob *job, AwPl *pl, const AwPrintSetup *const *setups,
                                guint n, double x, double y, double w, double h,
                                gboolean legend, double font_scale);

/* Text for a compliance verdict and analysis problems. */
const char *aw_print_compliance_text (AwCompliance c);
const char *aw_print_status_text (AwAnalysisStatus status);
/* "auto (lift ratio 1.12)", "lift ratio 1.10", "model spin 120 000 rpm". */
char *aw_print_hop_text (const AwPrintSetup *ps);
/* Power source as a word ("spring", "gas", …). */
const char *aw_print_power_source_text (AwPowerSource s);
/* Site class summary: "outdoor rifle (Club field): limit 1.49 J, chrono with 0.20 g". */
char *aw_print_site_text (AwPrintJob *job);
/* "101.3 m/s (332 fps)" (metric) or "332 fps (101.3 m/s)" (imperial). */
char *aw_print_velocity_text (AwPrintJob *job, double v_mps);
/* Quantity in the job's units with its unit symbol. */
char *aw_print_qty (AwPrintJob *job, AwQuantity q, double base);
/* "15 °C, 1013 hPa, 50 % humidity, wind 2.0 m/s from 90°". */
char *aw_print_conditions_text (AwPrintJob *job, const AwPrintSetup *ps);
/* Minimum engagement distance of the job's class in metres (NAN when none). */
double aw_print_job_min_engagement_m (AwPrintJob *job);

/* A title block: a small kind line, a big name (up to three lines), a subtitle, and a bar in the
 * setup's colour (ps may be NULL). */
void aw_print_add_title (AwPlFlowDoc *doc, AwPrintJob *job, const AwPrintSetup *ps,
                         const char *kind, const char *name, const char *sub);

/* Per kind. */
int aw_print_card_paginate (AwPrintJob *job, AwPl *pl, double w, double h);
void aw_print_card_draw_page (AwPrintJob *job, AwPl *pl, int page, double w, double h);
/* One card in the 0 … AW_PRINT_CARD_W × AW_PRINT_CARD_H box. */
void aw_print_card_draw (AwPrintJob *job, AwPl *pl, const AwPrintSetup *ps, int page,
                         int n_pages);

int aw_print_sheet_paginate (AwPrintJob *job, AwPl *pl, double w, double h);
void aw_print_sheet_draw_page (AwPrintJob *job, AwPl *pl, int page, double w, double h);

int aw_print_loadout_paginate (AwPrintJob *job, AwPl *pl, double w, double h);
void aw_print_loadout_draw_page (AwPrintJob *job, AwPl *pl, int page, double w, double h);

G_END_DECLS
