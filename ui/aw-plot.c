/* aw-plot.c: the flight plot renderer, hit-testing and export
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

#include "aw-plot.h"
#include "aw-units.h"

/* Zoom limits: the narrowest and widest ranges a viewport may show (metres). They also keep
 * device coordinates far inside cairo's fixed-point range. */
#define MIN_SPAN_X   0.05
#define MIN_SPAN_V   0.005
#define MAX_SPAN     5000.0
#define MAX_EXPORT_PX 16384.0
#define MAX_EXPORT_PT 14400.0   /* 200 in, the largest page PDF readers accept */

/* ---- scene ---- */

void
aw_plot_scene_init (AwPlotScene *scene)
{
  g_return_if_fail (scene != NULL);

  memset (scene, 0, sizeof *scene);
  scene->sight_line_m = NAN;
  scene->band_half_m = NAN;
  scene->muzzle_height_m = NAN;
  scene->min_engagement_m = NAN;
  scene->show_ground = true;
  scene->show_top_view = false;
  scene->show_legend = true;
  scene->units = AW_PLOT_UNITS_METRIC;
}

/* A copy owns its series array, names and samples; the public struct stays first so that the
 * AwPlotScene pointer is the allocation. */
typedef struct
{
  AwPlotScene scene;
  AwPlotSeries *series;
  size_t n_series;
} OwnedScene;

AwPlotScene *
aw_plot_scene_copy (const AwPlotScene *scene)
{
  OwnedScene *own;

  g_return_val_if_fail (scene != NULL, NULL);
  g_return_val_if_fail (scene->n_series == 0 || scene->series != NULL, NULL);

  own = g_new0 (OwnedScene, 1);
  own->scene = *scene;
  own->n_series = scene->n_series;
  own->series = g_new0 (AwPlotSeries, MAX (1, scene->n_series));
  for (size_t i = 0; i < scene->n_series; i++)
    {
      const AwPlotSeries *src = &scene->series[i];
      AwPlotSeries *dst = &own->series[i];

      *dst = *src;
      dst->name = g_strdup (src->name);
      dst->samples = src->n_samples && src->samples
                       ? g_memdup2 (src->samples, src->n_samples * sizeof (AwSample))
                       : NULL;
      if (dst->samples == NULL)
        dst->n_samples = 0;
    }
  own->scene.series = own->series;
  return &own->scene;
}

void
aw_plot_scene_free (AwPlotScene *scene)
{
  OwnedScene *own = (OwnedScene *) scene;

  if (scene == NULL)
    return;
  for (size_t i = 0; i < own->n_series; i++)
    {
      g_free ((char *) own->series[i].name);
      g_free ((AwSample *) own->series[i].samples);
    }
  g_free (own->series);
  g_free (own);
}

static bool
has_value (double v)
{
  return isfinite (v);
}

static bool
has_band (const AwPlotScene *scene)
{
  return isfinite (scene->sight_line_m) && isfinite (scene->band_half_m)
         && scene->band_half_m > 0.0;
}

static bool
has_min_distance (const AwPlotScene *scene)
{
  return isfinite (scene->min_engagement_m) && scene->min_engagement_m > 0.0;
}

static bool
sample_ok (const AwSample *s)
{
  return isfinite (s->x) && isfinite (s->y) && isfinite (s->z);
}

/* ---- viewport ---- */

bool
aw_plot_viewport_is_valid (const AwPlotViewport *vp)
{
  return vp != NULL
         && isfinite (vp->x_min) && isfinite (vp->x_max) && vp->x_max > vp->x_min
         && isfinite (vp->z_min) && isfinite (vp->z_max) && vp->z_max > vp->z_min
         && isfinite (vp->y_min) && isfinite (vp->y_max) && vp->y_max > vp->y_min;
}

void
aw_plot_viewport_fit (const AwPlotScene    *scene,
                      AwPlotViewport       *vp)
{
  double x_max = 0.0, z_min = INFINITY, z_max = -INFINITY, y_abs = 0.0;
  bool any = false;

  g_return_if_fail (vp != NULL);

  if (scene != NULL)
    {
      for (size_t i = 0; i < scene->n_series; i++)
        {
          const AwPlotSeries *s = &scene->series[i];

          if (!s->visible || s->samples == NULL)
            continue;
          for (size_t k = 0; k < s->n_samples; k++)
            {
              const AwSample *p = &s->samples[k];

              if (!sample_ok (p))
                continue;
              any = true;
              x_max = MAX (x_max, p->x);
              z_min = MIN (z_min, p->z);
              z_max = MAX (z_max, p->z);
              y_abs = MAX (y_abs, fabs (p->y));
            }
        }
      if (has_value (scene->muzzle_height_m))
        {
          z_min = MIN (z_min, scene->muzzle_height_m);
          z_max = MAX (z_max, scene->muzzle_height_m);
        }
      if (has_band (scene))
        {
          z_min = MIN (z_min, scene->sight_line_m - scene->band_half_m);
          z_max = MAX (z_max, scene->sight_line_m + scene->band_half_m);
        }
      else if (has_value (scene->sight_line_m))
        {
          z_min = MIN (z_min, scene->sight_line_m);
          z_max = MAX (z_max, scene->sight_line_m);
        }
      if (scene->show_ground)
        z_min = MIN (z_min, 0.0);
      if (has_min_distance (scene))
        x_max = MAX (x_max, scene->min_engagement_m * 1.1);
    }

  if (!any && !(x_max > 0.0))
    x_max = 50.0;
  if (!isfinite (z_min) || !isfinite (z_max))
    {
      z_min = 0.0;
      z_max = 2.0;
    }
  if (z_max - z_min < 0.2)
    {
      double mid = (z_max + z_min) / 2;
      z_min = mid - 0.1;
      z_max = mid + 0.1;
    }
  x_max = MIN (x_max, MAX_SPAN);

  vp->x_min = 0.0;
  vp->x_max = x_max * 1.03;
  vp->z_min = z_min - (z_max - z_min) * 0.04;
  vp->z_max = z_max + (z_max - z_min) * 0.08;
  y_abs = MAX (y_abs * 1.15, 0.2);
  vp->y_min = -y_abs;
  vp->y_max = y_abs;
}

static void
zoom_range (double *lo,
            double *hi,
            double  factor,
            double  c,
            double  min_span)
{
  double span = (*hi - *lo) / factor;

  if (span < min_span)
    factor = (*hi - *lo) / min_span;
  else if (span > MAX_SPAN)
    factor = (*hi - *lo) / MAX_SPAN;
  if (!(factor > 0.0) || !isfinite (factor))
    return;
  if (!isfinite (c))
    c = (*lo + *hi) / 2;
  *lo = c - (c - *lo) / factor;
  *hi = c + (*hi - c) / factor;
}

void
aw_plot_viewport_zoom (AwPlotViewport *vp,
                       bool            top_view,
                       double          factor,
                       double          cx,
                       double          cv)
{
  g_return_if_fail (vp != NULL);

  if (!(factor > 0.0) || !isfinite (factor))
    return;
  zoom_range (&vp->x_min, &vp->x_max, factor, cx, MIN_SPAN_X);
  if (top_view)
    zoom_range (&vp->y_min, &vp->y_max, factor, cv, MIN_SPAN_V);
  else
    zoom_range (&vp->z_min, &vp->z_max, factor, cv, MIN_SPAN_V);
}

void
aw_plot_viewport_pan (AwPlotViewport *vp,
                      bool            top_view,
                      double          dx_m,
                      double          dv_m)
{
  g_return_if_fail (vp != NULL);

  if (isfinite (dx_m) && fabs (dx_m) < MAX_SPAN)
    {
      vp->x_min += dx_m;
      vp->x_max += dx_m;
    }
  if (isfinite (dv_m) && fabs (dv_m) < MAX_SPAN)
    {
      if (top_view)
        {
          vp->y_min += dv_m;
          vp->y_max += dv_m;
        }
      else
        {
          vp->z_min += dv_m;
          vp->z_max += dv_m;
        }
    }
}

/* ---- layout ---- */

void
aw_plot_layout (double              width,
                double              height,
                const AwPlotScene  *scene,
                const AwChartStyle *style,
                AwPlotLayout       *layout)
{
  double pad, left, right, top, bottom, inner_h, gap;

  g_return_if_fail (layout != NULL);

  if (style == NULL)
    style = aw_chart_style_light ();
  memset (layout, 0, sizeof *layout);
  if (!(width > 0.0) || !(height > 0.0) || !isfinite (width) || !isfinite (height))
    return;

  pad = style->font_size * 0.8;
  left = pad + aw_chart_axis_margin (style, AW_AXIS_LEFT, true);
  right = pad + style->font_size * 1.5;
  top = pad + style->font_size * 0.6;
  bottom = pad * 0.6 + aw_chart_axis_margin (style, AW_AXIS_BOTTOM, true);

  layout->side.x = left;
  layout->side.y = top;
  layout->side.width = MAX (0.0, width - left - right);
  inner_h = MAX (0.0, height - top - bottom);

  if (scene != NULL && scene->show_top_view)
    {
      /* the side view keeps its distance tick labels; the title goes below the top view */
      gap = aw_chart_axis_margin (style, AW_AXIS_BOTTOM, false) + pad;
      layout->has_top = true;
      layout->side.height = MAX (0.0, (inner_h - gap) * 0.66);
      layout->top.x = left;
      layout->top.width = layout->side.width;
      layout->top.y = top + layout->side.height + gap;
      layout->top.height = MAX (0.0, inner_h - gap - layout->side.height);
    }
  else
    layout->side.height = inner_h;
}

static bool
rect_contains (const AwChartRect *r,
               double             px,
               double             py)
{
  return r->width > 0 && r->height > 0
         && px >= r->x && px <= r->x + r->width && py >= r->y && py <= r->y + r->height;
}

AwPlotPane
aw_plot_device_to_data (const AwPlotLayout   *layout,
                        const AwPlotViewport *vp,
                        double                px,
                        double                py,
                        double               *x_m,
                        double               *v_m)
{
  const AwChartRect *r;
  AwPlotPane pane;
  double lo, hi;

  g_return_val_if_fail (layout != NULL && vp != NULL, AW_PLOT_PANE_NONE);

  if (rect_contains (&layout->side, px, py))
    {
      pane = AW_PLOT_PANE_SIDE;
      r = &layout->side;
      lo = vp->z_min;
      hi = vp->z_max;
    }
  else if (layout->has_top && rect_contains (&layout->top, px, py))
    {
      pane = AW_PLOT_PANE_TOP;
      r = &layout->top;
      lo = vp->y_min;
      hi = vp->y_max;
    }
  else
    return AW_PLOT_PANE_NONE;

  if (x_m)
    *x_m = aw_chart_map (px, r->x, r->x + r->width, vp->x_min, vp->x_max);
  if (v_m)
    *v_m = aw_chart_map (py, r->y + r->height, r->y, lo, hi);
  return pane;
}

/* ---- units ---- */

static double
dist_factor (AwPlotUnits u)
{
  return u == AW_PLOT_UNITS_IMPERIAL ? 1.0 / AW_M_PER_YD : 1.0;
}

static double
height_factor (AwPlotUnits u)
{
  return u == AW_PLOT_UNITS_IMPERIAL ? 1.0 / AW_M_PER_FT : 1.0;
}

static const char *
dist_unit (AwPlotUnits u)
{
  /* TRANSLATORS: unit symbols */
  return u == AW_PLOT_UNITS_IMPERIAL ? C_("unit", "yd") : C_("unit", "m");
}

static const char *
height_unit (AwPlotUnits u)
{
  return u == AW_PLOT_UNITS_IMPERIAL ? C_("unit", "ft") : C_("unit", "m");
}

/* ---- rendering ---- */

static AwRgba
series_color (const AwChartStyle *style,
              const AwPlotSeries *s,
              size_t              index)
{
  if (s->color.a > 0.0)
    return s->color;
  return aw_chart_palette_color (style, (unsigned) index);
}

static char *
series_name (const AwPlotSeries *s,
             size_t              index)
{
  if (s->name != NULL && *s->name != '\0')
    return g_strdup (s->name);
  /* TRANSLATORS: legend entry for a setup without a name */
  return g_strdup_printf (_("Setup %u"), (unsigned) index + 1);
}

typedef struct
{
  const AwChartRect *r;
  double x_lo, x_hi, v_lo, v_hi;
} Mapper;

static inline double
map_x (const Mapper *m,
       double        x)
{
  return aw_chart_map (x, m->x_lo, m->x_hi, m->r->x, m->r->x + m->r->width);
}

static inline double
map_v (const Mapper *m,
       double        v)
{
  return aw_chart_map (v, m->v_lo, m->v_hi, m->r->y + m->r->height, m->r->y);
}

static void
mapper_init (Mapper               *m,
             const AwChartRect    *r,
             const AwPlotViewport *vp,
             bool                  top)
{
  m->r = r;
  m->x_lo = vp->x_min;
  m->x_hi = vp->x_max;
  m->v_lo = top ? vp->y_min : vp->z_min;
  m->v_hi = top ? vp->y_max : vp->z_max;
}

static void
draw_no_shoot (cairo_t            *cr,
               const AwChartStyle *style,
               const AwPlotScene  *scene,
               const Mapper       *m)
{
  double x0, x1, y0, y1, step;
  AwRgba hatch;

  if (!has_min_distance (scene))
    return;
  x0 = MAX (map_x (m, 0.0), m->r->x);
  x1 = MIN (map_x (m, scene->min_engagement_m), m->r->x + m->r->width);
  if (x1 <= x0)
    return;
  y0 = m->r->y;
  y1 = m->r->y + m->r->height;

  cairo_save (cr);
  cairo_rectangle (cr, x0, y0, x1 - x0, y1 - y0);
  aw_chart_set_source (cr, &style->no_shoot);
  cairo_fill_preserve (cr);
  cairo_clip (cr);
  /* diagonal hatch so the zone reads without colour, too */
  hatch = style->no_shoot;
  hatch.a = MIN (1.0, hatch.a * 1.8);
  aw_chart_set_source (cr, &hatch);
  cairo_set_line_width (cr, MAX (1.0, style->line_width * 0.5));
  step = style->font_size * 0.9;
  for (double s = x0 - (y1 - y0); s < x1; s += step)
    {
      cairo_move_to (cr, s, y1);
      cairo_line_to (cr, s + (y1 - y0), y0);
    }
  cairo_stroke (cr);
  cairo_restore (cr);

  /* the boundary */
  if (map_x (m, scene->min_engagement_m) <= m->r->x + m->r->width)
    {
      hatch.a = MIN (1.0, style->no_shoot.a * 6.0);
      aw_chart_set_source (cr, &hatch);
      cairo_set_line_width (cr, MAX (1.0, style->line_width * 0.6));
      cairo_move_to (cr, x1, y0);
      cairo_line_to (cr, x1, y1);
      cairo_stroke (cr);
    }
}

static void
draw_series_line (cairo_t            *cr,
                  const AwChartStyle *style,
                  const AwPlotSeries *s,
                  size_t              index,
                  const Mapper       *m,
                  bool                top)
{
  AwRgba color = series_color (style, s, index);
  double dashes[4];
  int nd = aw_chart_series_dash (style, (unsigned) index, dashes);
  bool pen_down = false;
  double left = m->r->x - 1e4, right = m->r->x + m->r->width + 1e4;
  const AwSample *last = NULL;

  if (!s->visible || s->samples == NULL || s->n_samples == 0)
    return;

  cairo_save (cr);
  aw_chart_set_source (cr, &color);
  cairo_set_line_width (cr, style->line_width);
  cairo_set_line_join (cr, CAIRO_LINE_JOIN_ROUND);
  cairo_set_line_cap (cr, CAIRO_LINE_CAP_ROUND);
  cairo_set_dash (cr, dashes, nd, 0);

  for (size_t k = 0; k < s->n_samples; k++)
    {
      const AwSample *p = &s->samples[k];
      double px, py;

      if (!sample_ok (p))
        {
          pen_down = false;
          continue;
        }
      px = map_x (m, p->x);
      py = map_v (m, top ? p->y : p->z);
      /* far outside (deep zoom): lift the pen, keeping coordinates in cairo's range */
      if (px < left || px > right || fabs (py - m->r->y) > 1e6)
        {
          pen_down = false;
          continue;
        }
      if (pen_down)
        cairo_line_to (cr, px, py);
      else
        cairo_move_to (cr, px, py);
      pen_down = true;
      last = p;
    }
  cairo_stroke (cr);

  /* where the flight ends (the ground, usually): a small dot */
  if (last != NULL && last == &s->samples[s->n_samples - 1])
    {
      cairo_set_dash (cr, NULL, 0, 0);
      cairo_arc (cr, map_x (m, last->x), map_v (m, top ? last->y : last->z),
                 style->line_width * 1.6, 0, 2 * G_PI);
      cairo_fill (cr);
    }
  cairo_restore (cr);
}

static void
draw_side (cairo_t              *cr,
           const AwChartStyle   *style,
           const AwPlotScene    *scene,
           const AwPlotViewport *vp,
           const AwChartRect    *r,
           bool                  axis_title)
{
  Mapper m;
  double lw = MAX (1.0, style->line_width * 0.5);
  AwAxis ax = { 0 };
  double hf = height_factor (scene->units), df = dist_factor (scene->units);
  g_autofree char *xtitle = NULL, *ztitle = NULL;

  mapper_init (&m, r, vp, false);

  cairo_save (cr);
  cairo_rectangle (cr, r->x, r->y, r->width, r->height);
  cairo_clip (cr);

  draw_no_shoot (cr, style, scene, &m);

  if (has_band (scene))
    {
      double ya = map_v (&m, scene->sight_line_m + scene->band_half_m);
      double yb = map_v (&m, scene->sight_line_m - scene->band_half_m);
      double dashes[2] = { 5.0 * lw, 3.0 * lw };

      aw_chart_set_source (cr, &style->band);
      cairo_rectangle (cr, r->x, ya, r->width, yb - ya);
      cairo_fill (cr);
      aw_chart_set_source (cr, &style->band_edge);
      cairo_set_line_width (cr, lw);
      cairo_set_dash (cr, dashes, 2, 0);
      cairo_move_to (cr, r->x, ya);
      cairo_line_to (cr, r->x + r->width, ya);
      cairo_move_to (cr, r->x, yb);
      cairo_line_to (cr, r->x + r->width, yb);
      cairo_stroke (cr);
      cairo_set_dash (cr, NULL, 0, 0);
    }
  if (has_value (scene->sight_line_m))
    {
      double ys = map_v (&m, scene->sight_line_m);

      aw_chart_set_source (cr, &style->band_edge);
      cairo_set_line_width (cr, lw);
      cairo_move_to (cr, r->x, ys);
      cairo_line_to (cr, r->x + r->width, ys);
      cairo_stroke (cr);
    }

  if (scene->show_ground)
    {
      double yg = map_v (&m, 0.0);

      if (yg < r->y + r->height)
        {
          AwRgba fill = style->ground;

          fill.a = 0.14;
          aw_chart_set_source (cr, &fill);
          cairo_rectangle (cr, r->x, yg, r->width, r->y + r->height - yg);
          cairo_fill (cr);
          aw_chart_set_source (cr, &style->ground);
          cairo_set_line_width (cr, MAX (1.0, style->line_width * 0.75));
          cairo_move_to (cr, r->x, yg);
          cairo_line_to (cr, r->x + r->width, yg);
          cairo_stroke (cr);
        }
    }

  for (size_t i = 0; i < scene->n_series; i++)
    draw_series_line (cr, style, &scene->series[i], i, &m, false);

  cairo_restore (cr);

  /* muzzle height: a small arrowhead on the height axis, outside the clip so it stays whole */
  if (has_value (scene->muzzle_height_m) && vp->x_min <= 0.0 && vp->x_max > 0.0)
    {
      double my = map_v (&m, scene->muzzle_height_m), mx = map_x (&m, 0.0);
      double s = style->font_size * 0.45;

      if (my >= r->y && my <= r->y + r->height)
        {
          aw_chart_set_source (cr, &style->muzzle);
          cairo_move_to (cr, mx + s * 1.4, my);
          cairo_line_to (cr, mx, my - s);
          cairo_line_to (cr, mx, my + s);
          cairo_close_path (cr);
          cairo_fill (cr);
        }
    }

  if (axis_title)
    xtitle = g_strdup_printf (_("Distance (%s)"), dist_unit (scene->units));
  ztitle = g_strdup_printf (_("Height (%s)"), height_unit (scene->units));

  aw_chart_set_source (cr, &style->foreground);
  ax.side = AW_AXIS_LEFT;
  ax.lo = vp->z_min * hf;
  ax.hi = vp->z_max * hf;
  ax.title = ztitle;
  ax.grid = true;
  aw_chart_draw_axis (cr, style, r, &ax);

  ax.side = AW_AXIS_BOTTOM;
  ax.lo = vp->x_min * df;
  ax.hi = vp->x_max * df;
  ax.title = xtitle;
  aw_chart_draw_axis (cr, style, r, &ax);
}

static void
draw_top (cairo_t              *cr,
          const AwChartStyle   *style,
          const AwPlotScene    *scene,
          const AwPlotViewport *vp,
          const AwChartRect    *r)
{
  Mapper m;
  double lw = MAX (1.0, style->line_width * 0.5), dashes[2] = { 5.0 * lw, 3.0 * lw };
  AwAxis ax = { 0 };
  double hf = height_factor (scene->units), df = dist_factor (scene->units);
  g_autofree char *xtitle = NULL, *ytitle = NULL;
  double y0;

  if (r->width <= 0 || r->height <= 0)
    return;
  mapper_init (&m, r, vp, true);

  cairo_save (cr);
  cairo_rectangle (cr, r->x, r->y, r->width, r->height);
  cairo_clip (cr);

  draw_no_shoot (cr, style, scene, &m);

  /* the line of fire */
  y0 = map_v (&m, 0.0);
  aw_chart_set_source (cr, &style->muted);
  cairo_set_line_width (cr, lw);
  cairo_set_dash (cr, dashes, 2, 0);
  cairo_move_to (cr, r->x, y0);
  cairo_line_to (cr, r->x + r->width, y0);
  cairo_stroke (cr);
  cairo_set_dash (cr, NULL, 0, 0);

  for (size_t i = 0; i < scene->n_series; i++)
    draw_series_line (cr, style, &scene->series[i], i, &m, true);

  /* which side is which (+y is to the shooter's left, drawn up) */
  aw_chart_set_source (cr, &style->muted);
  aw_chart_draw_text (cr, style, C_("drift direction", "left"), r->x + style->font_size * 0.5,
                      r->y + style->font_size * 0.2, 0.0, 0.0, style->font_size * 0.9, false);
  aw_chart_draw_text (cr, style, C_("drift direction", "right"), r->x + style->font_size * 0.5,
                      r->y + r->height - style->font_size * 0.2, 0.0, 1.0,
                      style->font_size * 0.9, false);
  cairo_restore (cr);

  xtitle = g_strdup_printf (_("Distance (%s)"), dist_unit (scene->units));
  ytitle = g_strdup_printf (_("Drift (%s)"), height_unit (scene->units));

  aw_chart_set_source (cr, &style->foreground);
  ax.side = AW_AXIS_LEFT;
  ax.lo = vp->y_min * hf;
  ax.hi = vp->y_max * hf;
  ax.title = ytitle;
  ax.grid = true;
  ax.target_ticks = MAX (2, (int) (r->height / (style->font_size * 3.0)));
  aw_chart_draw_axis (cr, style, r, &ax);

  ax.side = AW_AXIS_BOTTOM;
  ax.lo = vp->x_min * df;
  ax.hi = vp->x_max * df;
  ax.title = xtitle;
  ax.target_ticks = 0;
  aw_chart_draw_axis (cr, style, r, &ax);
}

/* Number of visible sample points of the side view inside box: the legend goes where it hides
 * the fewest. */
static size_t
points_in_box (const AwPlotScene *scene,
               const Mapper      *m,
               const AwChartRect *box)
{
  size_t n = 0;

  for (size_t i = 0; i < scene->n_series; i++)
    {
      const AwPlotSeries *s = &scene->series[i];

      if (!s->visible || s->samples == NULL)
        continue;
      for (size_t k = 0; k < s->n_samples; k++)
        if (sample_ok (&s->samples[k])
            && rect_contains (box, map_x (m, s->samples[k].x), map_v (m, s->samples[k].z)))
          n++;
    }
  return n;
}

static bool
box_overlaps_band (const AwPlotScene *scene,
                   const Mapper      *m,
                   const AwChartRect *box)
{
  double ya, yb;

  if (!has_band (scene))
    return false;
  ya = map_v (m, scene->sight_line_m + scene->band_half_m);
  yb = map_v (m, scene->sight_line_m - scene->band_half_m);
  return box->y < yb && box->y + box->height > ya;
}

/* Picks the corner where the legend hides the fewest points of the curves (then: not over the
 * band; then the order of corners). Returns the score (0: hides nothing). */
static size_t
best_corner (cairo_t            *cr,
             const AwChartStyle *style,
             const AwPlotScene  *scene,
             const Mapper       *m,
             const AwChartRect  *r,
             const AwLegendItem *items,
             size_t              n_items,
             AwChartCorner      *corner)
{
  static const AwChartCorner corners[4] = {
    AW_CORNER_TOP_RIGHT, AW_CORNER_BOTTOM_LEFT, AW_CORNER_BOTTOM_RIGHT, AW_CORNER_TOP_LEFT,
  };
  double w, h, inset = style->font_size * 0.6;
  size_t best = G_MAXSIZE;

  aw_chart_legend_size (cr, style, items, n_items, &w, &h);
  *corner = corners[0];
  if (w > r->width - 2 * inset || h > r->height - 2 * inset)
    return G_MAXSIZE;
  for (int c = 0; c < 4; c++)
    {
      bool left = corners[c] == AW_CORNER_TOP_LEFT || corners[c] == AW_CORNER_BOTTOM_LEFT;
      bool upper = corners[c] == AW_CORNER_TOP_LEFT || corners[c] == AW_CORNER_TOP_RIGHT;
      AwChartRect box = {
        left ? r->x + inset : r->x + r->width - inset - w,
        upper ? r->y + inset : r->y + r->height - inset - h,
        w, h,
      };
      size_t score = points_in_box (scene, m, &box) * 2
                     + (box_overlaps_band (scene, m, &box) ? 1 : 0);

      if (score < best)
        {
          best = score;
          *corner = corners[c];
        }
    }
  return best;
}

static void
draw_legend (cairo_t              *cr,
             const AwChartStyle   *style,
             const AwPlotScene    *scene,
             const AwPlotViewport *vp,
             const AwChartRect    *r)
{
  g_autoptr (GArray) items = g_array_new (FALSE, TRUE, sizeof (AwLegendItem));
  g_autoptr (GPtrArray) strings = g_ptr_array_new_with_free_func (g_free);
  AwChartCorner corner, corner2;
  size_t n_series, score;
  Mapper m;

  for (size_t i = 0; i < scene->n_series; i++)
    {
      const AwPlotSeries *s = &scene->series[i];
      AwLegendItem it = { 0 };
      char *name;

      if (!s->visible)
        continue;
      name = series_name (s, i);
      g_ptr_array_add (strings, name);
      it.label = name;
      it.color = series_color (style, s, i);
      it.mark = AW_LEGEND_LINE;
      it.dash_index = (unsigned) i;
      g_array_append_val (items, it);
    }
  n_series = items->len;
  if (has_band (scene))
    {
      AwLegendItem it = { 0 };
      bool imp = scene->units == AW_PLOT_UNITS_IMPERIAL;
      g_autofree char *num = aw_chart_format_number (scene->band_half_m * (imp ? 1.0 / 0.0254
                                                                              : 100.0),
                                                     imp ? 1 : 0);
      char *label;

      /* TRANSLATORS: legend for the band, e.g. "Band ±15 cm" */
      label = g_strdup_printf (_("Band ±%s %s"), num, imp ? C_("unit", "in") : C_("unit", "cm"));
      g_ptr_array_add (strings, label);
      it.label = label;
      it.color = style->band;
      it.color.a = MIN (1.0, it.color.a * 2.0);
      it.mark = AW_LEGEND_SWATCH;
      g_array_append_val (items, it);
    }
  if (has_min_distance (scene) && vp->x_min < scene->min_engagement_m)
    {
      AwLegendItem it = { 0 };
      double d = scene->min_engagement_m * dist_factor (scene->units);
      g_autofree char *num = aw_chart_format_number (d, fabs (d - round (d)) < 0.05 ? 0 : 1);
      char *label;

      /* TRANSLATORS: legend for the shaded zone closer than the minimum engagement distance,
       * e.g. "No-shoot zone (under 20 m)" */
      label = g_strdup_printf (_("No-shoot zone (under %s %s)"), num, dist_unit (scene->units));
      g_ptr_array_add (strings, label);
      it.label = label;
      it.color = style->no_shoot;
      it.color.a = MIN (1.0, it.color.a * 3.0);
      it.mark = AW_LEGEND_SWATCH;
      g_array_append_val (items, it);
    }
  if (items->len == 0)
    return;

  mapper_init (&m, r, vp, false);
  score = best_corner (cr, style, scene, &m, r, (AwLegendItem *) items->data, items->len,
                       &corner);
  /* when every corner hides part of a curve, the areas (which are labelled by their look and the
   * axes) leave the legend if that helps */
  if (score > 1 && n_series > 0 && n_series < items->len)
    {
      size_t score2 = best_corner (cr, style, scene, &m, r, (AwLegendItem *) items->data,
                                   n_series, &corner2);
      if (score2 < score)
        {
          g_array_set_size (items, n_series);
          corner = corner2;
          score = score2;
        }
    }
  if (score == G_MAXSIZE)
    return;     /* no room at all */
  aw_chart_draw_legend (cr, style, r, corner, (AwLegendItem *) items->data, items->len, NULL);
}

void
aw_plot_render (cairo_t              *cr,
                double                width,
                double                height,
                const AwPlotScene    *scene,
                const AwPlotViewport *vp,
                const AwChartStyle   *style)
{
  AwPlotLayout layout;
  AwPlotViewport fit;
  AwPlotScene empty;

  g_return_if_fail (cr != NULL);

  if (style == NULL)
    style = aw_chart_style_light ();
  if (scene == NULL)
    {
      aw_plot_scene_init (&empty);
      scene = &empty;
    }
  if (!aw_plot_viewport_is_valid (vp))
    {
      aw_plot_viewport_fit (scene, &fit);
      vp = &fit;
    }
  if (!(width > 0.0) || !(height > 0.0) || !isfinite (width) || !isfinite (height))
    return;

  cairo_save (cr);
  aw_chart_set_source (cr, &style->background);
  cairo_rectangle (cr, 0, 0, width, height);
  cairo_fill (cr);

  aw_plot_layout (width, height, scene, style, &layout);
  if (layout.side.width > 0 && layout.side.height > 0)
    {
      draw_side (cr, style, scene, vp, &layout.side, !layout.has_top);
      if (layout.has_top)
        draw_top (cr, style, scene, vp, &layout.top);
      if (scene->show_legend)
        draw_legend (cr, style, scene, vp, &layout.side);
    }
  cairo_restore (cr);
}

/* ---- hover ---- */

static void
lerp_sample (const AwSample *a,
             const AwSample *b,
             double          u,
             AwSample       *out)
{
#define L(f) out->f = a->f + (b->f - a->f) * u
  L (t);
  L (x);
  L (y);
  L (z);
  L (vx);
  L (vy);
  L (vz);
  L (speed);
  L (spin);
  L (energy);
#undef L
}

bool
aw_plot_hit_test (double                width,
                  double                height,
                  const AwPlotScene    *scene,
                  const AwPlotViewport *vp,
                  const AwChartStyle   *style,
                  double                px,
                  double                py,
                  double                max_distance_px,
                  AwPlotHit            *hit)
{
  AwPlotLayout layout;
  AwPlotViewport fit;
  AwPlotPane pane;
  Mapper m;
  double best = INFINITY;
  bool top;

  g_return_val_if_fail (hit != NULL, false);

  memset (hit, 0, sizeof *hit);
  hit->series = -1;
  if (scene == NULL || !isfinite (px) || !isfinite (py))
    return false;
  if (!aw_plot_viewport_is_valid (vp))
    {
      aw_plot_viewport_fit (scene, &fit);
      vp = &fit;
    }
  aw_plot_layout (width, height, scene, style, &layout);
  pane = aw_plot_device_to_data (&layout, vp, px, py, NULL, NULL);
  if (pane == AW_PLOT_PANE_NONE)
    return false;
  top = pane == AW_PLOT_PANE_TOP;
  mapper_init (&m, top ? &layout.top : &layout.side, vp, top);

  for (size_t i = 0; i < scene->n_series; i++)
    {
      const AwPlotSeries *s = &scene->series[i];

      if (!s->visible || s->samples == NULL)
        continue;
      for (size_t k = 0; k < s->n_samples; k++)
        {
          const AwSample *a = &s->samples[k];
          const AwSample *b = k + 1 < s->n_samples ? &s->samples[k + 1] : a;
          double ax, ay, bx, by, dx, dy, len2, u, qx, qy, d;

          if (!sample_ok (a) || !sample_ok (b))
            continue;
          ax = map_x (&m, a->x);
          ay = map_v (&m, top ? a->y : a->z);
          bx = map_x (&m, b->x);
          by = map_v (&m, top ? b->y : b->z);
          dx = bx - ax;
          dy = by - ay;
          len2 = dx * dx + dy * dy;
          u = len2 > 0 ? ((px - ax) * dx + (py - ay) * dy) / len2 : 0.0;
          u = CLAMP (u, 0.0, 1.0);
          qx = ax + u * dx;
          qy = ay + u * dy;
          d = hypot (px - qx, py - qy);
          if (d < best)
            {
              best = d;
              hit->series = (int) i;
              hit->pane = pane;
              hit->distance_px = d;
              hit->px = qx;
              hit->py = qy;
              lerp_sample (a, b, u, &hit->sample);
            }
        }
    }
  if (hit->series < 0)
    return false;
  if (max_distance_px > 0 && best > max_distance_px)
    {
      hit->series = -1;
      return false;
    }
  return true;
}

char *
aw_plot_format_readout (const AwPlotScene *scene,
                        const AwPlotHit   *hit)
{
  GString *s;
  const AwSample *p;
  AwPlotUnits u;
  g_autofree char *name = NULL;
  double df, hf;

  g_return_val_if_fail (scene != NULL && hit != NULL, NULL);

  if (hit->series < 0 || (size_t) hit->series >= scene->n_series)
    return NULL;
  p = &hit->sample;
  u = scene->units;
  df = dist_factor (u);
  hf = height_factor (u);
  name = series_name (&scene->series[hit->series], (size_t) hit->series);

  s = g_string_new (name);
  g_string_append_c (s, '\n');
  g_string_append_printf (s, _("Distance: %.1f %s"), p->x * df, dist_unit (u));
  g_string_append_c (s, '\n');
  g_string_append_printf (s, _("Height: %.2f %s"), p->z * hf, height_unit (u));
  if (has_value (scene->sight_line_m))
    {
      double rel = p->z - scene->sight_line_m;

      if (u == AW_PLOT_UNITS_IMPERIAL)
        /* TRANSLATORS: height against the sight line, in inches */
        g_string_append_printf (s, _(" (%+.1f in to the sight line)"), rel / 0.0254);
      else
        /* TRANSLATORS: height against the sight line, in centimetres */
        g_string_append_printf (s, _(" (%+.0f cm to the sight line)"), rel * 100.0);
    }
  if (fabs (p->y) >= 0.005)
    {
      g_string_append_c (s, '\n');
      if (p->y > 0)
        g_string_append_printf (s, _("Drift: %.2f %s left"), p->y * hf, height_unit (u));
      else
        g_string_append_printf (s, _("Drift: %.2f %s right"), -p->y * hf, height_unit (u));
    }
  g_string_append_c (s, '\n');
  if (u == AW_PLOT_UNITS_IMPERIAL && p->speed > 0 && p->energy > 0)
    {
      /* fps is only meaningful with the BB mass: m = 2E/v² */
      double mass_g = 2.0 * p->energy / (p->speed * p->speed) * 1e3;
      /* TRANSLATORS: speed in feet per second, with the BB mass in grams */
      g_string_append_printf (s, _("Speed: %.0f fps (%.2f g BB)"), aw_mps_to_fps (p->speed),
                              mass_g);
    }
  else
    g_string_append_printf (s, _("Speed: %.1f m/s"), p->speed);
  g_string_append_c (s, '\n');
  g_string_append_printf (s, _("Energy: %.2f J"), p->energy);
  g_string_append_c (s, '\n');
  g_string_append_printf (s, _("Time: %.3f s"), p->t);
  g_string_append_c (s, '\n');
  g_string_append_printf (s, _("Model spin: %'.0f rpm"), aw_rad_s_to_rpm (p->spin));
  return g_string_free (s, FALSE);
}

/* ---- export ---- */

bool
aw_plot_format_from_path (const char   *path,
                          AwPlotFormat *fmt)
{
  const char *dot;

  if (path == NULL || fmt == NULL)
    return false;
  dot = strrchr (path, '.');
  if (dot == NULL || strchr (dot, '/') != NULL)
    return false;
  if (g_ascii_strcasecmp (dot, ".png") == 0)
    *fmt = AW_PLOT_FORMAT_PNG;
  else if (g_ascii_strcasecmp (dot, ".svg") == 0)
    *fmt = AW_PLOT_FORMAT_SVG;
  else if (g_ascii_strcasecmp (dot, ".pdf") == 0)
    *fmt = AW_PLOT_FORMAT_PDF;
  else
    return false;
  return true;
}

static cairo_status_t
write_to_bytes (void                *closure,
                const unsigned char *data,
                unsigned int         length)
{
  g_byte_array_append ((GByteArray *) closure, data, length);
  return CAIRO_STATUS_SUCCESS;
}

gboolean
aw_plot_export (const AwPlotScene    *scene,
                const AwPlotViewport *vp,
                const char           *path,
                AwPlotFormat          fmt,
                double                width,
                double                height,
                GError              **error)
{
  return aw_plot_export_full (scene, vp, NULL, path, fmt, width, height, error);
}

gboolean
aw_plot_export_drawing (AwPlotDrawFunc draw,
                        gconstpointer  data,
                        const char    *title,
                        const char    *path,
                        AwPlotFormat   fmt,
                        double         width,
                        double         height,
                        GError       **error)
{
  g_autoptr (GByteArray) bytes = NULL;
  cairo_surface_t *surface;
  cairo_status_t status;
  cairo_t *cr;
  double max = fmt == AW_PLOT_FORMAT_PNG ? MAX_EXPORT_PX : MAX_EXPORT_PT;

  g_return_val_if_fail (draw != NULL, FALSE);
  g_return_val_if_fail (error == NULL || *error == NULL, FALSE);

  if (path == NULL || *path == '\0')
    {
      g_set_error (error, G_IO_ERROR, G_IO_ERROR_INVALID_FILENAME, _("No file name given"));
      return FALSE;
    }
  if (!(width >= 1.0 && width <= max) || !(height >= 1.0 && height <= max))
    {
      g_set_error (error, G_IO_ERROR, G_IO_ERROR_INVALID_ARGUMENT,
                   _("Cannot export “%s”: the size must be between 1 and %.0f (width %g, "
                     "height %g)"), path, max, width, height);
      return FALSE;
    }

  bytes = g_byte_array_new ();
  switch (fmt)
    {
    case AW_PLOT_FORMAT_SVG:
      surface = cairo_svg_surface_create_for_stream (write_to_bytes, bytes, width, height);
      break;
    case AW_PLOT_FORMAT_PDF:
      surface = cairo_pdf_surface_create_for_stream (write_to_bytes, bytes, width, height);
      if (cairo_surface_status (surface) == CAIRO_STATUS_SUCCESS)
        {
          cairo_pdf_surface_set_metadata (surface, CAIRO_PDF_METADATA_TITLE, title);
          cairo_pdf_surface_set_metadata (surface, CAIRO_PDF_METADATA_CREATOR, "Arcwright");
        }
      break;
    case AW_PLOT_FORMAT_PNG:
      surface = cairo_image_surface_create (CAIRO_FORMAT_ARGB32, (int) ceil (width),
                                            (int) ceil (height));
      break;
    default:
      g_set_error (error, G_IO_ERROR, G_IO_ERROR_NOT_SUPPORTED,
                   _("Cannot export “%s”: unknown file format"), path);
      return FALSE;
    }

  cr = cairo_create (surface);
  draw (cr, width, height, data);
  cairo_show_page (cr);
  status = cairo_status (cr);
  cairo_destroy (cr);

  if (status == CAIRO_STATUS_SUCCESS && fmt == AW_PLOT_FORMAT_PNG)
    status = cairo_surface_write_to_png_stream (surface, write_to_bytes, bytes);
  cairo_surface_finish (surface);
  if (status == CAIRO_STATUS_SUCCESS)
    status = cairo_surface_status (surface);
  cairo_surface_destroy (surface);

  if (status != CAIRO_STATUS_SUCCESS)
    {
      g_set_error (error, G_IO_ERROR, G_IO_ERROR_FAILED, _("Cannot draw “%s”: %s"), path,
                   cairo_status_to_string (status));
      return FALSE;
    }

  /* g_file_set_contents writes a temporary file and renames it over the old one */
  return g_file_set_contents (path, (const char *) bytes->data, bytes->len, error);
}

typedef struct
{
  const AwPlotScene *scene;
  const AwPlotViewport *vp;
  const AwChartStyle *style;
} FlightDrawing;

static void
draw_flight (cairo_t *cr, double width, double height, gconstpointer data)
{
  const FlightDrawing *d = data;
  aw_plot_render (cr, width, height, d->scene, d->vp, d->style);
}

gboolean
aw_plot_export_full (const AwPlotScene    *scene,
                     const AwPlotViewport *vp,
                     const AwChartStyle   *style,
                     const char           *path,
                     AwPlotFormat          fmt,
                     double                width,
                     double                height,
                     GError              **error)
{
  FlightDrawing d = { scene, vp, style };

  g_return_val_if_fail (scene != NULL, FALSE);
  return aw_plot_export_drawing (draw_flight, &d, _("Flight plot"), path, fmt, width, height,
                                 error);
}
