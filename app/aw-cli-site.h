/* aw-cli-site.h: site-class and power-curve options shared by "table" and "recommend"
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#pragma once

#include <glib.h>
#include <stdbool.h>
#include <stdio.h>

#include "aw-analysis.h"
#include "aw-project.h"

G_BEGIN_DECLS

typedef struct
{
  /* site class given on the command line */
  double limit_j, chrono_mass_g, min_distance_m;
  bool seen_limit, seen_chrono_mass, seen_min_distance;
  /* site class from the project */
  const char *site, *class_name;
  bool seen_site, seen_class;
  /* energy versus BB mass */
  const char *power;            /* constant-energy | constant-velocity | creep:PCT | measured */
  const char *measured_mps;     /* "G:V,G:V,…" */
  const char *measured_fps;
  bool seen_power, seen_measured_mps, seen_measured_fps;
  /* hop limit: --hop-limit RATIO|none */
  const char *hop_limit;
  bool seen_hop_limit;
} AwCliSiteOptions;

void aw_cli_site_options_init (AwCliSiteOptions *o);
void aw_cli_site_options_add (AwCliSiteOptions *o, GArray *args);

/* True when any site-class option (limit, chrono BB, minimum distance, --site/--class) is given. */
bool aw_cli_site_options_any_site (const AwCliSiteOptions *o);

/* Builds the power curve (reference: the shot's BB and velocity) and the site class from the
 * command-line options (not --site/--class). *points receives an array to g_free (or NULL).
 * Returns false after printing one line naming the option. */
bool aw_cli_site_options_apply (const AwCliSiteOptions *o, const AwShot *shot,
                                AwPowerCurve *curve, AwPowerPoint **points, AwSiteClass *site,
                                const char *command);

/* A setup and/or a site class taken from a project (--project FILE --setup NAME, --site NAME
 * --class NAME). */
typedef struct
{
  AwProject *project;           /* owned */
  AwSetup *setup;               /* inside project; NULL when no --setup was given */
  AwPowerCurve curve;           /* the setup's replica (valid while project lives) */
  bool have_site;
  AwSiteClass site;             /* the named class */
} AwCliProjectBase;

/* Loads the project and fills in (when a setup is named) through the project bridge. Needs
 * file when setup_name or --site/--class are given. Returns false after printing one line
 * naming the option. */
bool aw_cli_project_base_load (const char *file, const char *setup_name,
                               const AwCliSiteOptions *o, AwAnalysisInput *in,
                               AwCliProjectBase *base, const char *command);
void aw_cli_project_base_clear (AwCliProjectBase *base);
G_DEFINE_AUTO_CLEANUP_CLEAR_FUNC (AwCliProjectBase, aw_cli_project_base_clear)

/* The hop limit (modelling assumption, no source: a hop-up at its strongest setting gives at most
 * the same spin parameter whatever the BB): --hop-limit RATIO|none, else the stored setup's
 * hop.max_lift_ratio (setup may be NULL). The ratio is the one seen with `own` (the BB and
 * velocity it was measured with, and the air and lift model in use); it is converted into
 * in->hop_limit_s. *ratio receives the ratio (NAN: no limit). Returns false after printing one
 * line naming the option. */
bool aw_cli_hop_limit_apply (const AwCliSiteOptions *o, const AwSetup *setup, const AwShot *own,
                             AwAnalysisInput *in, double *ratio, const char *command);

/* Parses a --hop-limit value: a lift ratio 0.1 … 20, or "none" (NAN). Returns false after
 * printing one line naming the option. */
bool aw_cli_parse_hop_limit (const char *text, double *ratio, const char *command);

/* One line about the hop limit for text output: the limit and the BB it was seen with, or (ratio
 * NAN) that without one every BB is hopped as well as needed, which favours heavy BBs. */
void aw_cli_print_hop_limit (FILE *out, double ratio, const AwShot *own, const char *indent);

/* Parses "0.20,0.25,…" (grams) into kg. Returns NULL after printing an error naming option. */
GArray *aw_cli_parse_masses (const char *text, const char *option, const char *command);

/* Human name of a power model for text output. */
const char *aw_cli_power_model_label (const AwPowerCurve *curve);

/* The safety caution printed at the end of text output that involves energy or site rules. */
void aw_cli_print_caution (FILE *out);

G_END_DECLS
