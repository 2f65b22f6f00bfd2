/* aw-chart.h: chart primitives shared by every plot (flight plot, sweeps, maps, printed pages)
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Plain cairo + pango: nothing here knows about widgets, so the window, PDF export, printing and
 * the command line draw the same picture. All lengths are in cairo user units (device pixels on
 * screen and in PNG files, points in PDF/SVG); font sizes too (absolute sizes, not points at
 * some resolution).
 */
#pragma once

#include <stdbool.h>
#include <cairo.h>
#include <glib.h>

G_BEGIN_DECLS

typedef struct
{
  double r, g, b, a;   /* 0 … 1, straight (not premultiplied) alpha */
} AwRgba;

typedef struct
{
  double x, y, width, height;
} AwChartRect;

/* ---- theme ---- */

#define AW_CHART_PALETTE_MAX 8

typedef struct
{
  bool dark;
  AwRgba background;
  AwRgba foreground;      /* text, axis lines, tick marks */
  AwRgba muted;           /* secondary text (legend frame, notes) */
  AwRgba grid;
  AwRgba band;            /* shading of the band around the sight line */
  AwRgba band_edge;       /* the sight line and the band edges */
  AwRgba no_shoot;        /* shading of the zone closer than the minimum engagement distance */
  AwRgba ground;          /* ground line and ground hatch */
  AwRgba muzzle;          /* muzzle height marker */
  AwRgba tooltip_bg;
  AwRgba tooltip_fg;
  AwRgba palette[AW_CHART_PALETTE_MAX];   /* categorical colours for setups, in order */
  unsigned n_palette;
  const char *font_family; /* e.g. "Sans" */
  double font_size;       /* tick labels, user units */
  double title_size;      /* axis titles, user units */
  double line_width;      /* series lines, user units; other lines scale from it */
  bool dash_series;       /* also tell series apart by dash pattern (print, greyscale) */
} AwChartStyle;

/* Built-in styles for a light or dark background, for the screen (font 12 px, line 2 px). */
const AwChartStyle *aw_chart_style_light (void);
const AwChartStyle *aw_chart_style_dark (void);

/* Copy of base with fonts and lines multiplied by factor (e.g. for print, hi-dpi PNG). */
void aw_chart_style_scaled (const AwChartStyle *base, double factor, AwChartStyle *out);

/* Categorical colour number index of the style's palette (wraps around). */
AwRgba aw_chart_palette_color (const AwChartStyle *style, unsigned index);

/* Dash pattern for series number index when style->dash_series is set (index 0 is solid).
 * Writes up to 4 values into dashes (scaled by the line width) and returns how many (0 = solid). */
int aw_chart_series_dash (const AwChartStyle *style, unsigned index, double dashes[4]);

/* Sequential perceptually uniform scale for maps: t in [0, 1] (clamped; NAN gives transparent). */
AwRgba aw_chart_sequential (double t);

/* Relative luminance (WCAG 2.x definition) and contrast ratio, for checks and tests. */
double aw_rgba_luminance (const AwRgba *c);
double aw_rgba_contrast (const AwRgba *a, const AwRgba *b);

void aw_chart_set_source (cairo_t *cr, const AwRgba *c);

/* ---- ticks ---- */

typedef struct
{
  double start;    /* first tick ≥ lo (to within rounding) */
  double step;     /* 1, 2 or 5 × 10^k */
  int count;       /* ticks from start to ≤ hi */
  int decimals;    /* digits after the decimal point that show the step exactly */
} AwTicks;

/* Nice ticks for [lo, hi] with about `target` intervals (1-2-5 steps). lo > hi is swapped.
 * Returns false (and count 0) for a non-finite range or target < 1; a zero-width range is
 * widened. */
bool aw_chart_nice_ticks (double lo, double hi, int target, AwTicks *ticks);

/* Value of tick number i (computed from start + i·step with the rounding noise removed). */
double aw_chart_tick_value (const AwTicks *ticks, int i);

/* A number formatted with the current locale (decimal separator), "-0" shown as "0".
 * Free with g_free. */
char *aw_chart_format_number (double v, int decimals);

/* ---- mapping ---- */

/* Linear map of v from [lo, hi] to [a, b] (device). */
static inline double
aw_chart_map (double v, double lo, double hi, double a, double b)
{
  return a + (v - lo) * (b - a) / (hi - lo);
}

/* ---- axes ---- */

typedef enum
{
  AW_AXIS_BOTTOM = 0,
  AW_AXIS_LEFT,
  AW_AXIS_TOP,
  AW_AXIS_RIGHT,
} AwAxisSide;

/* Tick label for value v; decimals is what the tick step needs. Returns a newly allocated
 * string (g_free). */
typedef char *(*AwChartFormatFunc) (double v, int decimals, void *user_data);

typedef struct
{
  AwAxisSide side;
  double lo, hi;           /* values shown at the two ends of the area's side */
  int target_ticks;        /* about this many intervals (≤ 0: from the length and font size) */
  const char *title;       /* translated title with its unit, e.g. "Distance (m)"; NULL: none */
  bool grid;               /* draw grid lines across the area */
  bool skip_labels;        /* ticks only (a shared axis labelled elsewhere) */
  AwChartFormatFunc format; /* NULL: aw_chart_format_number (locale decimal separator) */
  void *format_data;
} AwAxis;

/* Draws the axis line along one side of area (the plot rectangle), ticks, locale-formatted labels
 * outside the area, the title further out, and grid lines inside the area when asked. */
void aw_chart_draw_axis (cairo_t *cr, const AwChartStyle *style, const AwChartRect *area,
                         const AwAxis *axis);

/* Space the axis needs outside the area (labels + title), user units, for layout. */
double aw_chart_axis_margin (const AwChartStyle *style, AwAxisSide side, bool has_title);

/* A line of text with its top-left (or other anchor, 0 … 1 in each direction) at (x, y).
 * Returns the text width. size ≤ 0 means style->font_size. */
double aw_chart_draw_text (cairo_t *cr, const AwChartStyle *style, const char *text,
                           double x, double y, double anchor_x, double anchor_y, double size,
                           bool bold);
void aw_chart_text_size (cairo_t *cr, const AwChartStyle *style, const char *text, double size,
                         bool bold, double *width, double *height);

/* ---- legend ---- */

typedef enum
{
  AW_LEGEND_LINE = 0,      /* a short line (series) */
  AW_LEGEND_SWATCH,        /* a filled square (areas such as the band) */
} AwLegendMark;

typedef struct
{
  const char *label;       /* translated */
  AwRgba color;
  AwLegendMark mark;
  unsigned dash_index;     /* series number for aw_chart_series_dash (lines only) */
} AwLegendItem;

typedef enum
{
  AW_CORNER_TOP_RIGHT = 0,
  AW_CORNER_TOP_LEFT,
  AW_CORNER_BOTTOM_RIGHT,
  AW_CORNER_BOTTOM_LEFT,
} AwChartCorner;

void aw_chart_legend_size (cairo_t *cr, const AwChartStyle *style, const AwLegendItem *items,
                           size_t n_items, double *width, double *height);

/* Draws a framed legend inside area at the given corner; stores its box in out_box if non-NULL. */
void aw_chart_draw_legend (cairo_t *cr, const AwChartStyle *style, const AwChartRect *area,
                           AwChartCorner corner, const AwLegendItem *items, size_t n_items,
                           AwChartRect *out_box);

/* A vertical colour bar for aw_chart_sequential with its own axis on the right (maps). */
void aw_chart_draw_colorbar (cairo_t *cr, const AwChartStyle *style, const AwChartRect *bar,
                             double lo, double hi, const char *title);

G_END_DECLS
