/* aw-sweep-plot.c: curves and heat maps of sweep results
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <math.h>
#include <string.h>
#include <glib/gi18n.h>
#include <gio/gio.h>
#include <cairo-pdf.h>
#include <cairo-svg.h>

#include "aw-sweep-plot.h"

#define MARKERS_UP_TO 40          /* curves with at most this many points show their points */
#define MAX_CONTOURS  12

/* ---- scene and names ---- */

void
aw_sweep_plot_scene_init (AwSweepPlotScene *scene)
{
  g_return_if_fail (scene != NULL);
  memset (scene, 0, sizeof *scene);
  scene->metric = AW_SWEEP_METRIC_BAND_RANGE;
}

const char *
aw_sweep_var_label (AwSweepVar var)
{
  switch (var)
    {
    case AW_SWEEP_VAR_LIFT_RATIO:
      return _("Lift ratio");
    case AW_SWEEP_VAR_SPIN_RPM:
      return _("Model spin");
    case AW_SWEEP_VAR_MASS_G:
      return _("BB mass");
    case AW_SWEEP_VAR_ENERGY_J:
      return _("Muzzle energy");
    case AW_SWEEP_VAR_CROSSWIND_MPS:
      return _("Crosswind");
    case AW_SWEEP_VAR_HEIGHT_M:
      return _("Muzzle height");
    case AW_SWEEP_VAR_TEMPERATURE_C:
      return _("Temperature");
    case AW_SWEEP_VAR_NONE:
    case AW_SWEEP_N_VARS:
    default:
      return _("None");
    }
}

const char *
aw_sweep_metric_label (AwSweepMetric metric)
{
  switch (metric)
    {
    case AW_SWEEP_METRIC_BAND_RANGE:
      return _("Band range");
    case AW_SWEEP_METRIC_GROUND_DISTANCE:
      return _("Ground distance");
    case AW_SWEEP_METRIC_APEX:
      return _("Apex height");
    case AW_SWEEP_METRIC_TIME_AT:
      return _("Time of flight to a distance");
    case AW_SWEEP_METRIC_ENERGY_AT:
      return _("Energy at a distance");
    case AW_SWEEP_METRIC_SPEED_AT:
      return _("Speed at a distance");
    case AW_SWEEP_METRIC_DRIFT_AT:
      return _("Drift at a distance");
    case AW_SWEEP_METRIC_MUZZLE_ENERGY:
      return _("Muzzle energy");
    case AW_SWEEP_METRIC_COMPLIANCE:
      return _("Energy as the site measures it");
    case AW_SWEEP_N_METRICS:
    default:
      return "";
    }
}

char *
aw_sweep_var_title (AwSweepVar var)
{
  const char *unit = aw_sweep_var_unit (var);
  if (unit == NULL || *unit == '\0')
    return g_strdup (aw_sweep_var_label (var));
  /* TRANSLATORS: an axis title, "BB mass (g)" */
  return g_strdup_printf (_("%s (%s)"), aw_sweep_var_label (var), unit);
}

char *
aw_sweep_metric_title (AwSweepMetric metric, double at_distance_m)
{
  g_autofree char *d = aw_chart_format_number (at_distance_m,
                                               at_distance_m == round (at_distance_m) ? 0 : 1);
  switch (metric)
    {
    case AW_SWEEP_METRIC_BAND_RANGE:
      return g_strdup (_("Band range (m)"));
    case AW_SWEEP_METRIC_GROUND_DISTANCE:
      return g_strdup (_("Ground distance (m)"));
    case AW_SWEEP_METRIC_APEX:
      return g_strdup (_("Apex height above the ground (m)"));
    case AW_SWEEP_METRIC_TIME_AT:
      /* TRANSLATORS: %s is a distance in metres */
      return g_strdup_printf (_("Time of flight to %s m (s)"), d);
    case AW_SWEEP_METRIC_ENERGY_AT:
      return g_strdup_printf (_("Energy at %s m (J)"), d);
    case AW_SWEEP_METRIC_SPEED_AT:
      return g_strdup_printf (_("Speed at %s m (m/s)"), d);
    case AW_SWEEP_METRIC_DRIFT_AT:
      return g_strdup_printf (_("Drift at %s m, + to the left (cm)"), d);
    case AW_SWEEP_METRIC_MUZZLE_ENERGY:
      return g_strdup (_("Muzzle energy (J)"));
    case AW_SWEEP_METRIC_COMPLIANCE:
      /* xgettext:no-c-format */
      return g_strdup (_("Energy as the site measures it (% of the limit)"));
    case AW_SWEEP_N_METRICS:
    default:
      return g_strdup ("");
    }
}

int
aw_sweep_var_digits (AwSweepVar var)
{
  switch (var)
    {
    case AW_SWEEP_VAR_LIFT_RATIO:
    case AW_SWEEP_VAR_ENERGY_J:
    case AW_SWEEP_VAR_HEIGHT_M:
      return 2;
    case AW_SWEEP_VAR_MASS_G:
      return 3;
    case AW_SWEEP_VAR_SPIN_RPM:
      return 0;
    case AW_SWEEP_VAR_CROSSWIND_MPS:
    case AW_SWEEP_VAR_TEMPERATURE_C:
    case AW_SWEEP_VAR_NONE:
    case AW_SWEEP_N_VARS:
    default:
      return 1;
    }
}

int
aw_sweep_metric_digits (AwSweepMetric metric)
{
  switch (metric)
    {
    case AW_SWEEP_METRIC_APEX:
      return 2;
    case AW_SWEEP_METRIC_TIME_AT:
    case AW_SWEEP_METRIC_ENERGY_AT:
    case AW_SWEEP_METRIC_MUZZLE_ENERGY:
      return 3;
    default:
      return 1;
    }
}

const char *
aw_sweep_status_label (AwAnalysisStatus status)
{
  switch (status)
    {
    case AW_ANALYSIS_OK:
      return "";
    case AW_ANALYSIS_NO_BAND:
      return _("the BB never enters the band");
    case AW_ANALYSIS_HOP_UNREACHABLE:
      return _("this lift ratio cannot be reached with the lift model");
    case AW_ANALYSIS_NO_ZERO:
      return _("no bore elevation reaches the zero");
    case AW_ANALYSIS_BAD_INPUT:
      return _("these values give an impossible shot");
    case AW_ANALYSIS_FLIGHT_FAILED:
    default:
      return _("the flight could not be computed");
    }
}

static gboolean
metric_needs_caution (AwSweepMetric metric)
{
  return metric == AW_SWEEP_METRIC_MUZZLE_ENERGY || metric == AW_SWEEP_METRIC_ENERGY_AT
         || metric == AW_SWEEP_METRIC_COMPLIANCE;
}

static const char *
caution_text (void)
{
  return _("Estimates only: the site’s chronograph decides compliance, local law applies, "
           "and eye protection is worn at all times.");
}

static AwRgba
setup_color (const AwSweepPlotScene *scene, const AwChartStyle *style, guint s)
{
  if (scene->colors && scene->colors[s].a > 0.0)
    return scene->colors[s];
  return aw_chart_palette_color (style, s);
}

/* ---- layout ---- */

static double
axis_step (const double *v, guint n)
{
  double d = n > 1 ? fabs (v[n - 1] - v[0]) / (n - 1) : 0.0;
  if (!(d > 0.0))
    d = fmax (fabs (v[0]) * 0.1, 0.5);
  return d;
}

bool
aw_sweep_plot_layout (double width, double height, const AwSweepPlotScene *scene,
                      const AwChartStyle *style, AwSweepPlotLayout *lay)
{
  const AwSweepResult *r;
  double lo, hi;
  double fs, left, bottom, top, right, foot;

  g_return_val_if_fail (scene != NULL && lay != NULL, false);
  memset (lay, 0, sizeof *lay);
  r = scene->result;
  if (style == NULL)
    style = aw_chart_style_light ();
  if (r == NULL || r->n1 == 0 || (unsigned) scene->metric >= AW_SWEEP_N_METRICS)
    return false;
  if (!aw_sweep_result_range (r, -1, scene->metric, &lo, &hi))
    return false;

  fs = style->font_size;
  left = aw_chart_axis_margin (style, AW_AXIS_LEFT, true);
  bottom = aw_chart_axis_margin (style, AW_AXIS_BOTTOM, true);
  foot = metric_needs_caution (scene->metric) ? fs * 1.8 : 0.0;
  lay->map = r->desc.axis[1].var != AW_SWEEP_VAR_NONE;

  if (!lay->map)
    {
      double x0 = r->values1[0], x1 = r->values1[r->n1 - 1];
      top = fs * 1.2;
      right = fs * 1.5;
      lay->n_panels = 1;
      lay->panels[0] = (AwChartRect) { left, top, fmax (1.0, width - left - right),
                                       fmax (1.0, height - top - bottom - foot) };
      lay->x_lo = fmin (x0, x1);
      lay->x_hi = fmax (x0, x1);
      if (lay->x_lo == lay->x_hi)
        {
          double d = axis_step (r->values1, r->n1);
          lay->x_lo -= d;
          lay->x_hi += d;
        }
      if (scene->metric == AW_SWEEP_METRIC_COMPLIANCE)
        {
          /* the limit (100 %) is always in view */
          lo = fmin (lo, 100.0);
          hi = fmax (hi, 100.0);
        }
      double pad = (hi - lo) * 0.06;
      if (!(pad > 0.0))
        pad = fmax (fabs (lo) * 0.1, 1.0);
      lay->y_lo = lo - pad;
      lay->y_hi = hi + pad;
      /* a quantity that cannot be negative keeps its zero in sight when it is near */
      if (scene->metric != AW_SWEEP_METRIC_DRIFT_AT && lo >= 0.0 && lay->y_lo < 0.0)
        lay->y_lo = 0.0;
      return true;
    }

  /* maps: a grid of panels, one per setup, and one colour bar at the right */
  {
    guint n = MIN (r->n_setups, AW_SWEEP_PLOT_MAX_PANELS);
    guint cols = (guint) ceil (sqrt ((double) n));
    guint rows = (n + cols - 1) / cols;
    double bar_w = fs * 1.2;
    double bar_right = aw_chart_axis_margin (style, AW_AXIS_RIGHT, true);
    double gap = fs * 1.5;
    double title_h = style->title_size * 1.6;
    double grid_w = fmax (1.0, width - gap - bar_w - bar_right - fs * 0.5);
    double grid_h = fmax (1.0, height - foot - fs * 0.5);
    double cell_w = grid_w / cols, cell_h = grid_h / rows;
    double dx = axis_step (r->values1, r->n1), dy = axis_step (r->values2, r->n2);

    lay->n_panels = n;
    for (guint k = 0; k < n; k++)
      {
        guint c = k % cols, w = k / cols;
        lay->panels[k] = (AwChartRect) { c * cell_w + left, fs * 0.5 + w * cell_h + title_h,
                                         fmax (1.0, cell_w - left - fs * 1.2),
                                         fmax (1.0, cell_h - title_h - bottom) };
      }
    lay->colorbar = (AwChartRect) { grid_w + gap, lay->panels[0].y, bar_w,
                                    fmax (1.0, lay->panels[n - 1].y + lay->panels[n - 1].height
                                               - lay->panels[0].y) };
    lay->x_lo = fmin (r->values1[0], r->values1[r->n1 - 1]) - dx / 2;
    lay->x_hi = fmax (r->values1[0], r->values1[r->n1 - 1]) + dx / 2;
    lay->y_lo = fmin (r->values2[0], r->values2[r->n2 - 1]) - dy / 2;
    lay->y_hi = fmax (r->values2[0], r->values2[r->n2 - 1]) + dy / 2;
    if (lo == hi)
      {
        double d = fmax (fabs (lo) * 0.05, 0.5);
        lo -= d;
        hi += d;
      }
    lay->c_lo = lo;
    lay->c_hi = hi;
  }
  return true;
}

static double
px_x (const AwSweepPlotLayout *lay, guint k, double v)
{
  const AwChartRect *a = &lay->panels[k];
  return aw_chart_map (v, lay->x_lo, lay->x_hi, a->x, a->x + a->width);
}

static double
px_y (const AwSweepPlotLayout *lay, guint k, double v)
{
  const AwChartRect *a = &lay->panels[k];
  return aw_chart_map (v, lay->y_lo, lay->y_hi, a->y + a->height, a->y);
}

/* ---- drawing pieces ---- */

static void
draw_message (cairo_t *cr, const AwChartStyle *style, double width, double height,
              const char *message)
{
  if (message == NULL || *message == '\0')
    return;
  aw_chart_set_source (cr, &style->muted);
  aw_chart_draw_text (cr, style, message, width / 2, height / 2, 0.5, 0.5, style->title_size,
                      false);
}

static void
draw_axes (cairo_t *cr, const AwChartStyle *style, const AwSweepPlotLayout *lay, guint k,
           const char *x_title, const char *y_title)
{
  /* grid lines help reading curves; over a heat map they only add noise */
  AwAxis ax = { AW_AXIS_BOTTOM, lay->x_lo, lay->x_hi, 0, x_title, !lay->map, false };
  AwAxis ay = { AW_AXIS_LEFT, lay->y_lo, lay->y_hi, 0, y_title, !lay->map, false };
  aw_chart_draw_axis (cr, style, &lay->panels[k], &ax);
  aw_chart_draw_axis (cr, style, &lay->panels[k], &ay);
}

static void
draw_caution (cairo_t *cr, const AwChartStyle *style, const AwSweepPlotScene *scene,
              double width, double height)
{
  if (!metric_needs_caution (scene->metric))
    return;
  aw_chart_set_source (cr, &style->muted);
  aw_chart_draw_text (cr, style, caution_text (), width / 2, height - style->font_size * 0.3,
                      0.5, 1.0, style->font_size * 0.9, false);
}

/* A box with lines of text near (x, y), kept inside (0, 0, width, height). */
static void
draw_readout (cairo_t *cr, const AwChartStyle *style, double width, double height, double x,
              double y, const char *text)
{
  double tw, th, pad = style->font_size * 0.5, bx, by;

  aw_chart_text_size (cr, style, text, 0, false, &tw, &th);
  bx = x + style->font_size;
  by = y - th - 2 * pad - style->font_size * 0.5;
  if (bx + tw + 2 * pad > width)
    bx = x - style->font_size - tw - 2 * pad;
  if (by < 0)
    by = y + style->font_size;
  bx = CLAMP (bx, 0, fmax (0, width - tw - 2 * pad));
  by = CLAMP (by, 0, fmax (0, height - th - 2 * pad));
  cairo_save (cr);
  aw_chart_set_source (cr, &style->tooltip_bg);
  cairo_rectangle (cr, bx, by, tw + 2 * pad, th + 2 * pad);
  cairo_fill_preserve (cr);
  aw_chart_set_source (cr, &style->muted);
  cairo_set_line_width (cr, 1.0);
  cairo_stroke (cr);
  aw_chart_set_source (cr, &style->tooltip_fg);
  aw_chart_draw_text (cr, style, text, bx + pad, by + pad, 0, 0, 0, false);
  cairo_restore (cr);
}

/* ---- curves ---- */

/* The corner whose legend box covers the fewest points of the curves (sampled along each
 * segment, so a line crossing the box counts too). */
static AwChartCorner
legend_corner (cairo_t *cr, const AwChartStyle *style, const AwSweepPlotScene *scene,
               const AwSweepPlotLayout *lay, const AwLegendItem *items, guint n_items)
{
  const AwSweepResult *r = scene->result;
  const AwChartRect *a = &lay->panels[0];
  const AwChartCorner corners[] = { AW_CORNER_TOP_RIGHT, AW_CORNER_TOP_LEFT,
                                    AW_CORNER_BOTTOM_RIGHT, AW_CORNER_BOTTOM_LEFT };
  double w, h, inset = style->font_size * 0.6;
  guint best_count = G_MAXUINT;
  AwChartCorner best = AW_CORNER_TOP_RIGHT;

  aw_chart_legend_size (cr, style, items, n_items, &w, &h);
  for (guint c = 0; c < G_N_ELEMENTS (corners); c++)
    {
      gboolean right = corners[c] == AW_CORNER_TOP_RIGHT || corners[c] == AW_CORNER_BOTTOM_RIGHT;
      gboolean top = corners[c] == AW_CORNER_TOP_RIGHT || corners[c] == AW_CORNER_TOP_LEFT;
      double bx = right ? a->x + a->width - inset - w : a->x + inset;
      double by = top ? a->y + inset : a->y + a->height - inset - h;
      guint count = 0;
      for (guint s = 0; s < r->n_setups; s++)
        for (guint i = 0; i < r->n1; i++)
          {
            double v0 = aw_sweep_result_value (r, s, i, 0, scene->metric);
            double v1 = i + 1 < r->n1 ? aw_sweep_result_value (r, s, i + 1, 0, scene->metric) : v0;
            if (!isfinite (v0))
              continue;
            if (!isfinite (v1))
              v1 = v0;
            double x0 = px_x (lay, 0, r->values1[i]), y0 = px_y (lay, 0, v0);
            double x1 = i + 1 < r->n1 ? px_x (lay, 0, r->values1[i + 1]) : x0;
            double y1 = px_y (lay, 0, v1);
            for (int k = 0; k < 8; k++)
              {
                double x = x0 + (x1 - x0) * k / 8.0, y = y0 + (y1 - y0) * k / 8.0;
                count += x >= bx && x <= bx + w && y >= by && y <= by + h;
              }
          }
      if (count < best_count)
        {
          best_count = count;
          best = corners[c];
        }
    }
  return best;
}

static void
render_curves (cairo_t *cr, const AwChartStyle *style, const AwSweepPlotScene *scene,
               const AwSweepPlotLayout *lay)
{
  const AwSweepResult *r = scene->result;
  const AwChartRect *a = &lay->panels[0];
  g_autofree char *x_title = aw_sweep_var_title (r->desc.axis[0].var);
  g_autofree char *y_title = aw_sweep_metric_title (scene->metric, r->desc.at_distance_m);
  g_autofree AwLegendItem *items = g_new0 (AwLegendItem, r->n_setups);

  draw_axes (cr, style, lay, 0, x_title, y_title);

  cairo_save (cr);
  {
    /* points at the ends of the range are drawn whole */
    double grow = style->line_width * 2.0;
    cairo_rectangle (cr, a->x - grow, a->y - grow, a->width + 2 * grow, a->height + 2 * grow);
    cairo_clip (cr);
  }

  if (scene->metric == AW_SWEEP_METRIC_COMPLIANCE)
    {
      /* the site's limit */
      double y = px_y (lay, 0, 100.0), dash[] = { 6.0, 4.0 };
      AwRgba c = style->no_shoot;
      c.a = 1.0;
      aw_chart_set_source (cr, &c);
      cairo_set_line_width (cr, 1.5);
      cairo_set_dash (cr, dash, 2, 0);
      cairo_move_to (cr, a->x, y);
      cairo_line_to (cr, a->x + a->width, y);
      cairo_stroke (cr);
      cairo_set_dash (cr, NULL, 0, 0);
      aw_chart_draw_text (cr, style, _("Site limit"), a->x + style->font_size * 0.5,
                          y - style->font_size * 0.2, 0, 1.0, 0, false);
    }

  cairo_set_line_join (cr, CAIRO_LINE_JOIN_ROUND);
  cairo_set_line_cap (cr, CAIRO_LINE_CAP_ROUND);
  for (guint s = 0; s < r->n_setups; s++)
    {
      AwRgba c = setup_color (scene, style, s);
      double dashes[4];
      int nd = aw_chart_series_dash (style, s, dashes);
      gboolean pen = FALSE;

      aw_chart_set_source (cr, &c);
      cairo_set_line_width (cr, style->line_width);
      cairo_set_dash (cr, dashes, nd, 0);
      for (guint i = 0; i < r->n1; i++)
        {
          double v = aw_sweep_result_value (r, s, i, 0, scene->metric);
          if (!isfinite (v))
            {
              pen = FALSE;
              continue;
            }
          double x = px_x (lay, 0, r->values1[i]), y = px_y (lay, 0, v);
          if (pen)
            cairo_line_to (cr, x, y);
          else
            cairo_move_to (cr, x, y);
          /* a lone point (neighbours without a value) still shows */
          if (!pen)
            cairo_line_to (cr, x, y);
          pen = TRUE;
        }
      cairo_stroke (cr);
      cairo_set_dash (cr, NULL, 0, 0);
      if (r->n1 <= MARKERS_UP_TO)
        for (guint i = 0; i < r->n1; i++)
          {
            double v = aw_sweep_result_value (r, s, i, 0, scene->metric);
            if (!isfinite (v))
              continue;
            cairo_new_sub_path (cr);
            cairo_arc (cr, px_x (lay, 0, r->values1[i]), px_y (lay, 0, v),
                       style->line_width * 1.6, 0, 2 * G_PI);
          }
      cairo_fill (cr);
      items[s] = (AwLegendItem) { r->setup_names[s], c, AW_LEGEND_LINE, s };
    }
  cairo_restore (cr);

  aw_chart_draw_legend (cr, style, a, legend_corner (cr, style, scene, lay, items, r->n_setups),
                        items, r->n_setups, NULL);
}

/* ---- maps ---- */

static guint32
cell_pixel (double t)
{
  AwRgba c = aw_chart_sequential (t);
  if (c.a <= 0.0)
    return 0;
  return 0xff000000u | (guint32) lround (c.r * 255) << 16 | (guint32) lround (c.g * 255) << 8
         | (guint32) lround (c.b * 255);
}

static void
draw_hatch (cairo_t *cr, const AwChartStyle *style, const AwChartRect *a)
{
  double step = style->font_size * 0.6;
  cairo_save (cr);
  cairo_rectangle (cr, a->x, a->y, a->width, a->height);
  cairo_clip (cr);
  aw_chart_set_source (cr, &style->grid);
  cairo_set_line_width (cr, 1.0);
  for (double d = -a->height; d < a->width; d += step)
    {
      cairo_move_to (cr, a->x + d, a->y + a->height);
      cairo_line_to (cr, a->x + d + a->height, a->y);
    }
  cairo_stroke (cr);
  cairo_restore (cr);
}

typedef struct
{
  double x0, y0, x1, y1;
} Seg;

/* Device point on the edge between grid points (ia, ja) and (ib, jb) where the value is level. */
static void
edge_point (const AwSweepResult *r, const AwSweepPlotLayout *lay, guint k, double level,
            guint ia, guint ja, double va, guint ib, guint jb, double vb, double *x, double *y)
{
  double t = (level - va) / (vb - va);
  double dx = r->values1[ib] - r->values1[ia], dy = r->values2[jb] - r->values2[ja];
  *x = px_x (lay, k, r->values1[ia] + t * dx);
  *y = px_y (lay, k, r->values2[ja] + t * dy);
}

/* Marching squares over the grid of setup s for one level: segments appended to segs. */
static void
contour_segments (const AwSweepResult *r, const AwSweepPlotLayout *lay, guint k, guint s,
                  AwSweepMetric metric, double level, GArray *segs)
{
  for (guint j = 0; j + 1 < r->n2; j++)
    for (guint i = 0; i + 1 < r->n1; i++)
      {
        /* corners: bottom-left, bottom-right, top-right, top-left (in grid order) */
        const guint ci[4] = { i, i + 1, i + 1, i };
        const guint cj[4] = { j, j, j + 1, j + 1 };
        double v[4];
        gboolean up[4];
        double ex[4], ey[4];
        gboolean cross[4];
        int n = 0;

        for (int c = 0; c < 4; c++)
          {
            v[c] = aw_sweep_result_value (r, s, ci[c], cj[c], metric);
            if (!isfinite (v[c]))
              goto next;
            up[c] = v[c] >= level;
          }
        /* edges: 0 bottom (0–1), 1 right (1–2), 2 top (3–2), 3 left (0–3) */
        {
          const int ea[4] = { 0, 1, 3, 0 }, eb[4] = { 1, 2, 2, 3 };
          for (int e = 0; e < 4; e++)
            {
              cross[e] = up[ea[e]] != up[eb[e]];
              if (cross[e])
                {
                  edge_point (r, lay, k, level, ci[ea[e]], cj[ea[e]], v[ea[e]], ci[eb[e]],
                              cj[eb[e]], v[eb[e]], &ex[e], &ey[e]);
                  n++;
                }
            }
        }
        if (n == 2)
          {
            int a = -1, b = -1;
            for (int e = 0; e < 4; e++)
              if (cross[e])
                {
                  if (a < 0)
                    a = e;
                  else
                    b = e;
                }
            Seg sg = { ex[a], ey[a], ex[b], ey[b] };
            g_array_append_val (segs, sg);
          }
        else if (n == 4)
          {
            /* a saddle: the mean of the corners says which diagonal is connected */
            gboolean centre_up = (v[0] + v[1] + v[2] + v[3]) / 4.0 >= level;
            Seg s1, s2;
            if (up[0] == centre_up)
              {
                /* bottom-left joins the centre: cut off bottom-right and top-left */
                s1 = (Seg) { ex[0], ey[0], ex[1], ey[1] };
                s2 = (Seg) { ex[3], ey[3], ex[2], ey[2] };
              }
            else
              {
                s1 = (Seg) { ex[3], ey[3], ex[0], ey[0] };
                s2 = (Seg) { ex[1], ey[1], ex[2], ey[2] };
              }
            g_array_append_val (segs, s1);
            g_array_append_val (segs, s2);
          }
      next:;
      }
}

typedef struct
{
  double x, y, w, h;
} Box;

static gboolean
box_free (GArray *boxes, const Box *b)
{
  for (guint i = 0; i < boxes->len; i++)
    {
      const Box *o = &g_array_index (boxes, Box, i);
      if (b->x < o->x + o->w && o->x < b->x + b->w && b->y < o->y + o->h && o->y < b->y + b->h)
        return FALSE;
    }
  return TRUE;
}

static void
draw_contours (cairo_t *cr, const AwChartStyle *style, const AwSweepResult *r,
               const AwSweepPlotLayout *lay, guint k, guint s, AwSweepMetric metric)
{
  AwTicks ticks;
  const AwChartRect *a = &lay->panels[k];
  g_autoptr (GArray) boxes = g_array_new (FALSE, FALSE, sizeof (Box));
  AwRgba halo = style->background, line = style->foreground;

  if (r->n1 < 2 || r->n2 < 2)
    return;
  if (!aw_chart_nice_ticks (lay->c_lo, lay->c_hi, 6, &ticks) || ticks.count > MAX_CONTOURS + 2)
    return;
  halo.a = 0.55;
  line.a = 0.85;

  cairo_save (cr);
  cairo_rectangle (cr, a->x, a->y, a->width, a->height);
  cairo_clip (cr);
  cairo_set_line_join (cr, CAIRO_LINE_JOIN_ROUND);
  cairo_set_line_cap (cr, CAIRO_LINE_CAP_ROUND);
  /* on compliance maps the site's limit (100 %) is a contour even when it is not a round step */
  gboolean has_100 = metric != AW_SWEEP_METRIC_COMPLIANCE;
  for (int t = 0; t < ticks.count && !has_100; t++)
    has_100 = fabs (aw_chart_tick_value (&ticks, t) - 100.0) < 1e-9;
  for (int t = 0; t <= ticks.count; t++)
    {
      double level = t < ticks.count ? aw_chart_tick_value (&ticks, t) : 100.0;
      g_autoptr (GArray) segs = g_array_new (FALSE, FALSE, sizeof (Seg));
      gboolean limit = metric == AW_SWEEP_METRIC_COMPLIANCE && fabs (level - 100.0) < 1e-9;

      if (!(level > lay->c_lo && level < lay->c_hi))
        continue;
      if (t == ticks.count && has_100)
        continue;
      contour_segments (r, lay, k, s, metric, level, segs);
      if (segs->len == 0)
        continue;
      for (int pass = 0; pass < 2; pass++)
        {
          aw_chart_set_source (cr, pass == 0 ? &halo : &line);
          cairo_set_line_width (cr, (pass == 0 ? 3.0 : 1.2) * (limit ? 2.0 : 1.0));
          for (guint i = 0; i < segs->len; i++)
            {
              const Seg *sg = &g_array_index (segs, Seg, i);
              cairo_move_to (cr, sg->x0, sg->y0);
              cairo_line_to (cr, sg->x1, sg->y1);
            }
          cairo_stroke (cr);
        }

      /* a label on the line: near the middle of its segments, not over another label */
      {
        g_autofree char *num = aw_chart_format_number (level, limit ? 0 : ticks.decimals);
        /* TRANSLATORS: the contour of the site's energy limit on a compliance map, "100 % limit" */
        g_autofree char *text = limit ? g_strdup_printf (_("%s %% limit"), num)
                                      : g_strdup (num);
        double tw, th, pad = 2.0;
        aw_chart_text_size (cr, style, text, style->font_size * 0.85, false, &tw, &th);
        const double tries[] = { 0.5, 0.3, 0.7, 0.15, 0.85, 0.4, 0.6 };
        for (guint q = 0; q < G_N_ELEMENTS (tries); q++)
          {
            const Seg *sg = &g_array_index (segs, Seg, (guint) (tries[q] * (segs->len - 1)));
            double cx = (sg->x0 + sg->x1) / 2, cy = (sg->y0 + sg->y1) / 2;
            Box b = { cx - tw / 2 - pad, cy - th / 2 - pad, tw + 2 * pad, th + 2 * pad };
            if (b.x < a->x || b.y < a->y || b.x + b.w > a->x + a->width
                || b.y + b.h > a->y + a->height || !box_free (boxes, &b))
              continue;
            g_array_append_val (boxes, b);
            AwRgba bg = style->background;
            bg.a = 0.8;
            aw_chart_set_source (cr, &bg);
            cairo_rectangle (cr, b.x, b.y, b.w, b.h);
            cairo_fill (cr);
            aw_chart_set_source (cr, &style->foreground);
            aw_chart_draw_text (cr, style, text, cx, cy, 0.5, 0.5, style->font_size * 0.85,
                                false);
            break;
          }
      }
    }
  cairo_restore (cr);
}

static void
render_maps (cairo_t *cr, const AwChartStyle *style, const AwSweepPlotScene *scene,
             const AwSweepPlotLayout *lay)
{
  const AwSweepResult *r = scene->result;
  g_autofree char *x_title = aw_sweep_var_title (r->desc.axis[0].var);
  g_autofree char *y_title = aw_sweep_var_title (r->desc.axis[1].var);
  g_autofree char *c_title = aw_sweep_metric_title (scene->metric, r->desc.at_distance_m);
  double step1 = r->n1 > 1 ? (r->values1[r->n1 - 1] - r->values1[0]) / (r->n1 - 1)
                           : axis_step (r->values1, r->n1);
  double step2 = r->n2 > 1 ? (r->values2[r->n2 - 1] - r->values2[0]) / (r->n2 - 1)
                           : axis_step (r->values2, r->n2);

  for (guint k = 0; k < lay->n_panels; k++)
    {
      const AwChartRect *a = &lay->panels[k];
      guint s = k;
      cairo_surface_t *img = cairo_image_surface_create (CAIRO_FORMAT_ARGB32, (int) r->n1,
                                                         (int) r->n2);
      int stride = cairo_image_surface_get_stride (img);
      unsigned char *data;

      cairo_surface_flush (img);
      data = cairo_image_surface_get_data (img);
      for (guint j = 0; j < r->n2 && data; j++)
        {
          guint32 *row = (guint32 *) (data + (gsize) j * stride);
          for (guint i = 0; i < r->n1; i++)
            {
              double v = aw_sweep_result_value (r, s, i, j, scene->metric);
              row[i] = isfinite (v) ? cell_pixel ((v - lay->c_lo) / (lay->c_hi - lay->c_lo)) : 0;
            }
        }
      cairo_surface_mark_dirty (img);

      draw_hatch (cr, style, a);
      cairo_save (cr);
      cairo_rectangle (cr, a->x, a->y, a->width, a->height);
      cairo_clip (cr);
      /* pixel (i, j) covers the cell centred on (values1[i], values2[j]) */
      {
        double x0 = px_x (lay, k, r->values1[0] - step1 / 2);
        double x1 = px_x (lay, k, r->values1[0] + step1 / 2);
        double y0 = px_y (lay, k, r->values2[0] - step2 / 2);
        double y1 = px_y (lay, k, r->values2[0] + step2 / 2);
        cairo_translate (cr, x0, y0);
        cairo_scale (cr, x1 - x0, y1 - y0);
      }
      cairo_set_source_surface (cr, img, 0, 0);
      cairo_pattern_set_filter (cairo_get_source (cr), CAIRO_FILTER_NEAREST);
      cairo_rectangle (cr, 0, 0, r->n1, r->n2);
      cairo_fill (cr);
      cairo_restore (cr);
      cairo_surface_destroy (img);

      draw_contours (cr, style, r, lay, k, s, scene->metric);
      draw_axes (cr, style, lay, k, x_title, y_title);
      aw_chart_set_source (cr, &style->foreground);
      aw_chart_draw_text (cr, style, r->setup_names[s], a->x, a->y - style->title_size * 0.35,
                          0.0, 1.0, style->title_size, true);
    }
  aw_chart_draw_colorbar (cr, style, &lay->colorbar, lay->c_lo, lay->c_hi, c_title);
}

/* ---- rendering ---- */

static void
render_hover (cairo_t *cr, const AwChartStyle *style, const AwSweepPlotScene *scene,
              const AwSweepPlotLayout *lay, double width, double height)
{
  const AwSweepResult *r = scene->result;
  AwSweepPlotHit hit;
  g_autofree char *text = NULL;

  if (!scene->has_hover || scene->hover_setup >= r->n_setups || scene->hover_i1 >= r->n1
      || scene->hover_i2 >= r->n2)
    return;
  hit.setup = scene->hover_setup;
  hit.i1 = scene->hover_i1;
  hit.i2 = scene->hover_i2;
  hit.distance_px = 0.0;
  if (lay->map)
    {
      if (hit.setup >= lay->n_panels)
        return;
      hit.px = px_x (lay, hit.setup, r->values1[hit.i1]);
      hit.py = px_y (lay, hit.setup, r->values2[hit.i2]);
      double step1 = r->n1 > 1 ? fabs (px_x (lay, hit.setup, r->values1[1])
                                       - px_x (lay, hit.setup, r->values1[0]))
                               : lay->panels[hit.setup].width;
      double step2 = r->n2 > 1 ? fabs (px_y (lay, hit.setup, r->values2[1])
                                       - px_y (lay, hit.setup, r->values2[0]))
                               : lay->panels[hit.setup].height;
      cairo_save (cr);
      cairo_set_line_width (cr, 2.0);
      aw_chart_set_source (cr, &style->background);
      cairo_rectangle (cr, hit.px - step1 / 2 - 1, hit.py - step2 / 2 - 1, step1 + 2, step2 + 2);
      cairo_stroke (cr);
      aw_chart_set_source (cr, &style->foreground);
      cairo_set_line_width (cr, 1.0);
      cairo_rectangle (cr, hit.px - step1 / 2, hit.py - step2 / 2, step1, step2);
      cairo_stroke (cr);
      cairo_restore (cr);
    }
  else
    {
      double v = aw_sweep_result_value (r, hit.setup, hit.i1, 0, scene->metric);
      const AwChartRect *a = &lay->panels[0];
      AwRgba c = setup_color (scene, style, hit.setup);
      hit.px = px_x (lay, 0, r->values1[hit.i1]);
      hit.py = isfinite (v) ? px_y (lay, 0, v) : a->y + a->height / 2;
      cairo_save (cr);
      aw_chart_set_source (cr, &style->muted);
      cairo_set_line_width (cr, 1.0);
      cairo_move_to (cr, hit.px, a->y);
      cairo_line_to (cr, hit.px, a->y + a->height);
      cairo_stroke (cr);
      if (isfinite (v))
        {
          cairo_arc (cr, hit.px, hit.py, style->line_width * 3.0, 0, 2 * G_PI);
          aw_chart_set_source (cr, &style->background);
          cairo_fill_preserve (cr);
          aw_chart_set_source (cr, &c);
          cairo_set_line_width (cr, style->line_width);
          cairo_stroke (cr);
        }
      cairo_restore (cr);
    }
  text = aw_sweep_plot_format_readout (scene, &hit);
  draw_readout (cr, style, width, height, hit.px, hit.py, text);
}

void
aw_sweep_plot_render (cairo_t *cr, double width, double height, const AwSweepPlotScene *scene,
                      const AwChartStyle *style)
{
  AwSweepPlotLayout lay;

  g_return_if_fail (cr != NULL && scene != NULL);
  if (style == NULL)
    style = aw_chart_style_light ();

  cairo_save (cr);
  aw_chart_set_source (cr, &style->background);
  cairo_rectangle (cr, 0, 0, width, height);
  cairo_fill (cr);

  if (!aw_sweep_plot_layout (width, height, scene, style, &lay))
    {
      if (scene->result != NULL && scene->message == NULL)
        draw_message (cr, style, width, height, _("No point of the sweep could be computed"));
      else
        draw_message (cr, style, width, height, scene->message);
      cairo_restore (cr);
      return;
    }
  if (lay.map)
    render_maps (cr, style, scene, &lay);
  else
    render_curves (cr, style, scene, &lay);
  draw_caution (cr, style, scene, width, height);
  render_hover (cr, style, scene, &lay, width, height);
  cairo_restore (cr);
}

/* ---- hover ---- */

bool
aw_sweep_plot_hit_test (double width, double height, const AwSweepPlotScene *scene,
                        const AwChartStyle *style, double px, double py, double max_distance_px,
                        AwSweepPlotHit *hit)
{
  AwSweepPlotLayout lay;
  const AwSweepResult *r;

  g_return_val_if_fail (scene != NULL && hit != NULL, false);
  if (!isfinite (px) || !isfinite (py)
      || !aw_sweep_plot_layout (width, height, scene, style, &lay))
    return false;
  r = scene->result;

  if (lay.map)
    {
      for (guint k = 0; k < lay.n_panels; k++)
        {
          const AwChartRect *a = &lay.panels[k];
          if (px < a->x || px > a->x + a->width || py < a->y || py > a->y + a->height)
            continue;
          double x = aw_chart_map (px, a->x, a->x + a->width, lay.x_lo, lay.x_hi);
          double y = aw_chart_map (py, a->y + a->height, a->y, lay.y_lo, lay.y_hi);
          guint bi = 0, bj = 0;
          for (guint i = 1; i < r->n1; i++)
            if (fabs (r->values1[i] - x) < fabs (r->values1[bi] - x))
              bi = i;
          for (guint j = 1; j < r->n2; j++)
            if (fabs (r->values2[j] - y) < fabs (r->values2[bj] - y))
              bj = j;
          hit->setup = k;
          hit->i1 = bi;
          hit->i2 = bj;
          hit->px = px_x (&lay, k, r->values1[bi]);
          hit->py = px_y (&lay, k, r->values2[bj]);
          hit->distance_px = hypot (hit->px - px, hit->py - py);
          return true;
        }
      return false;
    }

  {
    double best = INFINITY;
    gboolean found = FALSE;
    for (guint s = 0; s < r->n_setups; s++)
      for (guint i = 0; i < r->n1; i++)
        {
          double v = aw_sweep_result_value (r, s, i, 0, scene->metric);
          if (!isfinite (v))
            continue;
          double x = px_x (&lay, 0, r->values1[i]), y = px_y (&lay, 0, v);
          double d = hypot (x - px, y - py);
          if (d < best)
            {
              best = d;
              hit->setup = s;
              hit->i1 = i;
              hit->i2 = 0;
              hit->px = x;
              hit->py = y;
              hit->distance_px = d;
              found = TRUE;
            }
        }
    return found && (max_distance_px <= 0.0 || best <= max_distance_px);
  }
}

static void
append_value (GString *s, const char *label, double v, int digits, const char *unit)
{
  g_autofree char *n = aw_chart_format_number (v, digits);
  if (unit && *unit)
    /* TRANSLATORS: a line of the readout: "BB mass: 0,280 g" */
    g_string_append_printf (s, _("%s: %s %s"), label, n, unit);
  else
    g_string_append_printf (s, _("%s: %s"), label, n);
}

char *
aw_sweep_plot_format_readout (const AwSweepPlotScene *scene, const AwSweepPlotHit *hit)
{
  const AwSweepResult *r;
  const AwSweepPoint *p;
  GString *s;
  AwSweepMetric m;

  g_return_val_if_fail (scene != NULL && hit != NULL, NULL);
  r = scene->result;
  if (r == NULL || hit->setup >= r->n_setups || hit->i1 >= r->n1 || hit->i2 >= r->n2)
    return g_strdup ("");
  p = aw_sweep_result_point (r, hit->setup, hit->i1, hit->i2);
  m = scene->metric;
  s = g_string_new (r->setup_names[hit->setup]);
  for (guint k = 0; k < 2; k++)
    {
      AwSweepVar v = r->desc.axis[k].var;
      if (v == AW_SWEEP_VAR_NONE)
        continue;
      g_string_append_c (s, '\n');
      append_value (s, aw_sweep_var_label (v), k == 0 ? r->values1[hit->i1] : r->values2[hit->i2],
                    aw_sweep_var_digits (v), aw_sweep_var_unit (v));
    }
  g_string_append_c (s, '\n');
  if (isfinite (p->values[m]))
    {
      g_autofree char *title = NULL;
      const char *label = aw_sweep_metric_label (m);
      if (aw_sweep_metric_is_at_distance (m))
        {
          /* "Energy at 30 m" rather than "Energy at a distance" */
          title = aw_sweep_metric_title (m, r->desc.at_distance_m);
          char *paren = strrchr (title, '(');
          if (paren && paren > title)
            paren[-1] = '\0';
          label = title;
        }
      append_value (s, label, p->values[m], aw_sweep_metric_digits (m), aw_sweep_metric_unit (m));
      if (m == AW_SWEEP_METRIC_COMPLIANCE)
        {
          g_string_append_c (s, '\n');
          g_string_append (s, p->compliance == AW_COMPLIANCE_OVER ? _("Over the site’s limit")
                                                                   : _("Within the site’s limit"));
        }
    }
  else if (p->status != AW_ANALYSIS_OK)
    g_string_append (s, aw_sweep_status_label (p->status));
  else
    g_string_append_printf (s, _("%s: no value (the flight ends before the distance, or no "
                                 "site limit)"), aw_sweep_metric_label (m));
  if (isfinite (p->lift_ratio) && m != AW_SWEEP_METRIC_MUZZLE_ENERGY
      && m != AW_SWEEP_METRIC_COMPLIANCE && r->desc.axis[0].var != AW_SWEEP_VAR_LIFT_RATIO
      && r->desc.axis[1].var != AW_SWEEP_VAR_LIFT_RATIO)
    {
      g_string_append_c (s, '\n');
      append_value (s, _("Lift ratio"), p->lift_ratio, 2, "");
    }
  return g_string_free (s, FALSE);
}

/* ---- export ---- */

typedef struct
{
  const AwSweepPlotScene *scene;
  const AwChartStyle *style;
} SweepDrawing;

static void
draw_sweep (cairo_t *cr, double width, double height, gconstpointer data)
{
  const SweepDrawing *d = data;
  aw_sweep_plot_render (cr, width, height, d->scene, d->style);
}

gboolean
aw_sweep_plot_export (const AwSweepPlotScene *scene, const AwChartStyle *style, const char *path,
                      AwPlotFormat fmt, double width, double height, GError **error)
{
  SweepDrawing d = { scene, style };

  g_return_val_if_fail (scene != NULL, FALSE);
  return aw_plot_export_drawing (draw_sweep, &d, _("Sweep"), path, fmt, width, height, error);
}
