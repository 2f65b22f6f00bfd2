/* aw-sweep-panel.h: the sweep panel — what varies, which setups, which metric; curves and maps
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The panel keeps its own copy of the project. Sweeps run on worker threads (GTask, several
 * threads per sweep) and never block the window; progress arrives through one coalesced idle.
 * Results stay until an input of the sweep changes (the varied inputs and ranges, the distance of
 * the "at" metrics, the hop choice, the site class, the setups taking part or their values).
 * Choosing another metric only redraws: every metric is computed at every point. After Run,
 * a change of the inputs cancels the sweep in progress and starts the new one (after a short
 * pause, so typing does not start a sweep per key); Stop ends that until the next Run.
 *
 * Widget actions: "sweep.run" (Ctrl+Return), "sweep.stop" (Escape), "sweep.export" with a
 * string target "csv", "png", "svg" or "pdf" (asks for a file name).
 */
#pragma once

#include <gtk/gtk.h>

#include "aw-plot.h"
#include "aw-project.h"
#include "aw-sweep.h"

G_BEGIN_DECLS

#define AW_TYPE_SWEEP_PANEL (aw_sweep_panel_get_type ())
G_DECLARE_FINAL_TYPE (AwSweepPanel, aw_sweep_panel, AW, SWEEP_PANEL, GtkWidget)

GtkWidget *aw_sweep_panel_new (void);

/* The project whose setups take part (a deep copy is kept; NULL clears). Setups are matched by
 * name: a setup left out stays left out, new setups take part. Call it after every edit; when
 * nothing that matters changed, nothing happens. */
void aw_sweep_panel_set_project (AwSweepPanel *self, const AwProject *project);

/* Whether the setup named name takes part (TRUE by default). */
void aw_sweep_panel_set_setup_included (AwSweepPanel *self, const char *name, gboolean included);
gboolean aw_sweep_panel_get_setup_included (AwSweepPanel *self, const char *name);

/* The description shown in the controls (axes, hop, distance; the site comes from the site class
 * chooser). Setting it changes the controls like the user would. */
void aw_sweep_panel_set_desc (AwSweepPanel *self, const AwSweepDesc *desc);
void aw_sweep_panel_get_desc (AwSweepPanel *self, AwSweepDesc *desc);

/* The metric plotted (redraws only). */
void aw_sweep_panel_set_metric (AwSweepPanel *self, AwSweepMetric metric);
AwSweepMetric aw_sweep_panel_get_metric (AwSweepPanel *self);

/* Site class for compliance: 0 none, then the project's classes in file order (rules, class). */
void aw_sweep_panel_set_site_class (AwSweepPanel *self, guint position);

/* Worker threads per sweep (0: one per processor, the default). */
void aw_sweep_panel_set_threads (AwSweepPanel *self, guint n_threads);

void aw_sweep_panel_run (AwSweepPanel *self);
void aw_sweep_panel_stop (AwSweepPanel *self);

/* Property "running" (read-only, notified). */
gboolean aw_sweep_panel_get_running (AwSweepPanel *self);
/* Progress of the sweep in progress or the last one, 0 … 1. */
double aw_sweep_panel_get_progress (AwSweepPanel *self);
/* The results shown (NULL: none, or an input changed since). Valid until the next change. */
const AwSweepResult *aw_sweep_panel_get_result (AwSweepPanel *self);
/* Sweeps started so far (each restart counts), for tests and logs. */
guint aw_sweep_panel_get_runs_started (AwSweepPanel *self);

/* Writes the results: fmt AW_PLOT_FORMAT_PNG/SVG/PDF draws the plot (light style; PNG at twice
 * the size in pixels); csv TRUE writes every metric as CSV instead (fmt ignored). width and height
 * ≤ 0: the plot's size on screen (or 960 × 600). */
gboolean aw_sweep_panel_export (AwSweepPanel *self, const char *path, gboolean csv,
                                AwPlotFormat fmt, double width, double height, GError **error);

/* The plot area (a GtkDrawingArea), for tests and screenshots. */
GtkWidget *aw_sweep_panel_get_plot (AwSweepPanel *self);
/* Shows the readout for the plot point (x, y) as if the pointer were there; NaN hides it. */
void aw_sweep_panel_show_readout_at (AwSweepPanel *self, double x, double y);

G_END_DECLS
