/* aw-plot.h: the flight plot renderer (side view, optional top view), hit-testing and export
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Draws on any cairo_t: the plot widget, PDF/SVG/PNG export, printing and the command line all
 * use aw_plot_render. Data are always SI (metres, m/s, J, rad/s); the unit system only changes
 * what is displayed (imperial: yards downrange, feet for height and drift).
 */
#pragma once

#include <stdbool.h>
#include <stddef.h>
#include <cairo.h>
#include <glib.h>

#include "aw-chart.h"
#include "aw-flight.h"

G_BEGIN_DECLS

typedef enum
{
  AW_PLOT_UNITS_METRIC = 0,    /* m for distance, height and drift */
  AW_PLOT_UNITS_IMPERIAL,      /* yd for distance, ft for height and drift */
} AwPlotUnits;

typedef struct
{
  const char *name;            /* legend text (a setup name; borrowed) */
  AwRgba color;                /* alpha 0: the style's palette colour for this index */
  const AwSample *samples;     /* borrowed; increasing x (as the flight engine produces) */
  size_t n_samples;
  bool visible;
} AwPlotSeries;

typedef struct
{
  const AwPlotSeries *series;  /* borrowed array */
  size_t n_series;
  double sight_line_m;         /* height of the (level) sight line above the ground; NAN: none */
  double band_half_m;          /* band half-height around the sight line; NAN or ≤ 0: no band */
  double muzzle_height_m;      /* NAN: no marker */
  double min_engagement_m;     /* NAN or ≤ 0: none; else [0, d) is shaded as a no-shoot zone */
  bool show_ground;            /* ground line at z = 0 */
  bool show_top_view;          /* drift vs distance below the side view */
  bool show_legend;
  AwPlotUnits units;
} AwPlotScene;

/* No series, no sight line/band/muzzle/minimum distance, ground and legend on, no top view,
 * metric. */
void aw_plot_scene_init (AwPlotScene *scene);

/* Deep copy (names and samples too): the copy owns everything; free with aw_plot_scene_free. */
AwPlotScene *aw_plot_scene_copy (const AwPlotScene *scene);
void aw_plot_scene_free (AwPlotScene *scene);
G_DEFINE_AUTOPTR_CLEANUP_FUNC (AwPlotScene, aw_plot_scene_free)

/* Data ranges shown, in metres: x downrange, z height (side view), y drift (top view, +y left). */
typedef struct
{
  double x_min, x_max;
  double z_min, z_max;
  double y_min, y_max;
} AwPlotViewport;

/* "Fit all": every visible sample, the muzzle, the band, the ground and the minimum engagement
 * distance, with a small margin; x starts at 0. A scene without samples gets 0 … 50 m × 0 … 2 m. */
void aw_plot_viewport_fit (const AwPlotScene *scene, AwPlotViewport *vp);

/* True when every range is finite and non-empty. */
bool aw_plot_viewport_is_valid (const AwPlotViewport *vp);

/* Zoom by factor (> 1 zooms in) around the data point (cx, cz) in the side view, or (cx, cy) in
 * the top view; and pan by data offsets. */
void aw_plot_viewport_zoom (AwPlotViewport *vp, bool top_view, double factor, double cx,
                            double cv);
void aw_plot_viewport_pan (AwPlotViewport *vp, bool top_view, double dx_m, double dv_m);

/* ---- layout (no text measuring: the same numbers everywhere, for hit-testing) ---- */

typedef enum
{
  AW_PLOT_PANE_NONE = 0,
  AW_PLOT_PANE_SIDE,
  AW_PLOT_PANE_TOP,
} AwPlotPane;

typedef struct
{
  AwChartRect side;            /* plot area of the side view (inside the axes) */
  AwChartRect top;             /* plot area of the top view (zero size when hidden) */
  bool has_top;
} AwPlotLayout;

void aw_plot_layout (double width, double height, const AwPlotScene *scene,
                     const AwChartStyle *style, AwPlotLayout *layout);

/* Device point → pane and data (x, and z or y in metres). Returns the pane under the point. */
AwPlotPane aw_plot_device_to_data (const AwPlotLayout *layout, const AwPlotViewport *vp,
                                   double px, double py, double *x_m, double *v_m);

/* ---- rendering ---- */

/* Draws the whole plot into the rectangle (0, 0, width, height) of cr: background, no-shoot zone,
 * band, sight line, ground, muzzle marker, visible series, axes with units, legend, top view.
 * style NULL: light. vp NULL: fit all. */
void aw_plot_render (cairo_t *cr, double width, double height, const AwPlotScene *scene,
                     const AwPlotViewport *vp, const AwChartStyle *style);

/* ---- hover ---- */

typedef struct
{
  int series;                  /* index into scene->series, −1 when nothing */
  AwPlotPane pane;
  AwSample sample;             /* interpolated at the nearest point of the drawn line */
  double distance_px;          /* from the device point to that point */
  double px, py;               /* device position of that point */
} AwPlotHit;

/* Nearest visible series to the device point (px, py), within max_distance_px (≤ 0: any distance).
 * Returns false when there is none. */
bool aw_plot_hit_test (double width, double height, const AwPlotScene *scene,
                       const AwPlotViewport *vp, const AwChartStyle *style, double px, double py,
                       double max_distance_px, AwPlotHit *hit);

/* Translated multi-line readout for a hit (distance, height, drift, speed, energy, time, model
 * spin) in the scene's units. Free with g_free. */
char *aw_plot_format_readout (const AwPlotScene *scene, const AwPlotHit *hit);

/* ---- export ---- */

typedef enum
{
  AW_PLOT_FORMAT_PNG = 0,      /* width × height pixels */
  AW_PLOT_FORMAT_SVG,          /* width × height points */
  AW_PLOT_FORMAT_PDF,          /* one page of width × height points */
} AwPlotFormat;

/* From a file name's extension (.png/.svg/.pdf, any case); false when unknown. */
bool aw_plot_format_from_path (const char *path, AwPlotFormat *fmt);

/* Renders (light style) and writes the file atomically: an existing file is replaced only when
 * the new one is complete. Errors are G_IO_ERROR / G_FILE_ERROR with the path in the message. */
/* Draws with draw (cr, width, height, data) onto a PNG, SVG or PDF of width × height (pixels for
 * PNG, points otherwise) and writes it atomically to path. Every plot's export goes through here. */
typedef void (*AwPlotDrawFunc) (cairo_t *cr, double width, double height, gconstpointer data);
gboolean aw_plot_export_drawing (AwPlotDrawFunc draw, gconstpointer data, const char *title,
                                 const char *path, AwPlotFormat fmt, double width, double height,
                                 GError **error);

gboolean aw_plot_export (const AwPlotScene *scene, const AwPlotViewport *vp, const char *path,
                         AwPlotFormat fmt, double width, double height, GError **error);

/* Same with a chosen style (NULL: light). */
gboolean aw_plot_export_full (const AwPlotScene *scene, const AwPlotViewport *vp,
                              const AwChartStyle *style, const char *path, AwPlotFormat fmt,
                              double width, double height, GError **error);

G_END_DECLS
