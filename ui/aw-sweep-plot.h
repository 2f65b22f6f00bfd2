/* aw-sweep-plot.h: renderer for sweep results — curves for one varied input, heat maps with
 * contour lines for two
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Draws on any cairo_t (the sweep panel, PNG/SVG/PDF export). One varied input: the metric against
 * the input, one curve per setup, overlaid, with a legend. Two: one heat map per setup (side by
 * side, sharing one colour scale) in the colour-blind-safe sequential scale of aw-chart, a colour
 * bar, and contour lines at round values (marching squares) labelled with their value. Cells
 * without a value are left hatched. Energy and compliance plots carry a short caution.
 */
#pragma once

#include <stdbool.h>
#include <cairo.h>
#include <glib.h>

#include "aw-chart.h"
#include "aw-plot.h"
#include "aw-sweep.h"

G_BEGIN_DECLS

typedef struct
{
  const AwSweepResult *result;  /* borrowed; NULL: an empty plot showing message */
  AwSweepMetric metric;
  const AwRgba *colors;         /* result->n_setups colours (alpha 0: palette), or NULL */
  const char *message;          /* translated; shown when there is no result (may be NULL) */
  /* the hovered point: a marker and a readout box are drawn there */
  bool has_hover;
  guint hover_setup, hover_i1, hover_i2;
} AwSweepPlotScene;

/* No result, band range, palette colours, no message, no hover. */
void aw_sweep_plot_scene_init (AwSweepPlotScene *scene);

/* ---- translated names (for the panel too) ---- */

/* "BB mass", "Lift ratio", … */
const char *aw_sweep_var_label (AwSweepVar var);
/* "Band range", "Energy at distance", … */
const char *aw_sweep_metric_label (AwSweepMetric metric);
/* Axis titles with units: "BB mass (g)", "Energy at 30 m (J)". Free with g_free. */
char *aw_sweep_var_title (AwSweepVar var);
char *aw_sweep_metric_title (AwSweepMetric metric, double at_distance_m);
/* Digits shown for values of a varied input or a metric. */
int aw_sweep_var_digits (AwSweepVar var);
int aw_sweep_metric_digits (AwSweepMetric metric);
/* "no band in reach", … for a point status other than OK. */
const char *aw_sweep_status_label (AwAnalysisStatus status);

/* ---- layout (no text measuring, so hit-testing agrees with drawing) ---- */

#define AW_SWEEP_PLOT_MAX_PANELS 16

typedef struct
{
  bool map;                     /* two varied inputs */
  guint n_panels;               /* 1 for curves; one per setup (at most the maximum) for maps */
  AwChartRect panels[AW_SWEEP_PLOT_MAX_PANELS];  /* plot areas inside the axes */
  AwChartRect colorbar;         /* maps only */
  double x_lo, x_hi;            /* data range of the horizontal axis */
  double y_lo, y_hi;            /* data range of the vertical axis (metric, or axis 1) */
  double c_lo, c_hi;            /* colour scale (maps) */
} AwSweepPlotLayout;

/* False when there is nothing to lay out (no result or no finite value). */
bool aw_sweep_plot_layout (double width, double height, const AwSweepPlotScene *scene,
                           const AwChartStyle *style, AwSweepPlotLayout *layout);

/* ---- rendering ---- */

/* Draws the whole plot into (0, 0, width, height). style NULL: light. */
void aw_sweep_plot_render (cairo_t *cr, double width, double height,
                           const AwSweepPlotScene *scene, const AwChartStyle *style);

/* ---- hover ---- */

typedef struct
{
  guint setup, i1, i2;
  double px, py;                /* device position of the point (cell centre for maps) */
  double distance_px;
} AwSweepPlotHit;

/* Curves: the nearest point of any curve within max_distance_px (≤ 0: any distance). Maps: the cell
 * under the pointer. False when there is none. */
bool aw_sweep_plot_hit_test (double width, double height, const AwSweepPlotScene *scene,
                             const AwChartStyle *style, double px, double py,
                             double max_distance_px, AwSweepPlotHit *hit);

/* Translated multi-line readout of a point: setup, the varied inputs, the metric (or why it has
 * no value). Free with g_free. */
char *aw_sweep_plot_format_readout (const AwSweepPlotScene *scene, const AwSweepPlotHit *hit);

/* ---- export ---- */

/* Renders (style NULL: light) and writes PNG (width × height px), SVG or PDF (points) atomically.
 * Errors: G_IO_ERROR / G_FILE_ERROR with the path in the message. */
gboolean aw_sweep_plot_export (const AwSweepPlotScene *scene, const AwChartStyle *style,
                               const char *path, AwPlotFormat fmt, double width, double height,
                               GError **error);

G_END_DECLS
