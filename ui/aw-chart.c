/* aw-chart.c: chart primitives shared by every plot
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <math.h>
#include <string.h>
#include <pango/pangocairo.h>

#include "aw-chart.h"

#define RGB(hex, alpha) { ((hex) >> 16 & 0xff) / 255.0, ((hex) >> 8 & 0xff) / 255.0, \
                          ((hex) & 0xff) / 255.0, (alpha) }

/* Categorical colours: the eight colours of the Okabe–Ito scheme (M. Okabe and K. Ito, "Color
 * Universal Design (CUD): how to make figures and presentations that are friendly to colorblind
 * people", 2008), ordered per background so that the first five keep a contrast of at least
 * 3:1 with the background (WCAG 2.1, non-text contrast) and the first three stay far apart
 * (CIE76 ΔE > 20) under simulated protanopia, deuteranopia and tritanopia (Machado et al. 2009);
 * yellow is last on white, black is replaced by a light grey on dark. */
static const AwChartStyle light_style = {
  .dark = false,
  .background = RGB (0xffffff, 1.0),
  .foreground = RGB (0x1c1c1c, 1.0),
  .muted = RGB (0x6a6a6a, 1.0),
  .grid = RGB (0x000000, 0.09),
  .band = RGB (0x4c9a4c, 0.17),
  .band_edge = RGB (0x3b7a3b, 0.85),
  .no_shoot = RGB (0xc8321e, 0.10),
  .ground = RGB (0x7a5c3a, 1.0),
  .muzzle = RGB (0x444444, 1.0),
  .tooltip_bg = RGB (0xfdfdfd, 0.96),
  .tooltip_fg = RGB (0x1c1c1c, 1.0),
  .palette = {
    RGB (0x0072b2, 1.0),   /* blue */
    RGB (0xd55e00, 1.0),   /* vermillion */
    RGB (0xcc79a7, 1.0),   /* reddish purple */
    RGB (0x009e73, 1.0),   /* bluish green */
    RGB (0x000000, 1.0),   /* black */
    RGB (0xe69f00, 1.0),   /* orange */
    RGB (0x56b4e9, 1.0),   /* sky blue */
    RGB (0xf0e442, 1.0),   /* yellow */
  },
  .n_palette = 8,
  .font_family = "Sans",
  .font_size = 12.0,
  .title_size = 13.0,
  .line_width = 2.0,
  .dash_series = false,
};

static const AwChartStyle dark_style = {
  .dark = true,
  .background = RGB (0x242424, 1.0),
  .foreground = RGB (0xe6e6e6, 1.0),
  .muted = RGB (0xa0a0a0, 1.0),
  .grid = RGB (0xffffff, 0.10),
  .band = RGB (0x6fc36f, 0.16),
  .band_edge = RGB (0x8fd18f, 0.85),
  .no_shoot = RGB (0xff5a46, 0.11),
  .ground = RGB (0xb8946a, 1.0),
  .muzzle = RGB (0xcccccc, 1.0),
  .tooltip_bg = RGB (0x333333, 0.96),
  .tooltip_fg = RGB (0xf0f0f0, 1.0),
  .palette = {
    RGB (0x56b4e9, 1.0),   /* sky blue */
    RGB (0xd55e00, 1.0),   /* vermillion */
    RGB (0xf0e442, 1.0),   /* yellow */
    RGB (0x009e73, 1.0),   /* bluish green */
    RGB (0xcc79a7, 1.0),   /* reddish purple */
    RGB (0xe69f00, 1.0),   /* orange */
    RGB (0xdddddd, 1.0),   /* light grey in place of black */
    RGB (0x0072b2, 1.0),   /* blue */
  },
  .n_palette = 8,
  .font_family = "Sans",
  .font_size = 12.0,
  .title_size = 13.0,
  .line_width = 2.0,
  .dash_series = false,
};

const AwChartStyle *
aw_chart_style_light (void)
{
  return &light_style;
}

const AwChartStyle *
aw_chart_style_dark (void)
{
  return &dark_style;
}

void
aw_chart_style_scaled (const AwChartStyle *base,
                       double              factor,
                       AwChartStyle       *out)
{
  g_return_if_fail (base != NULL && out != NULL);

  *out = *base;
  if (!(factor > 0.0) || !isfinite (factor))
    return;
  out->font_size *= factor;
  out->title_size *= factor;
  out->line_width *= factor;
}

AwRgba
aw_chart_palette_color (const AwChartStyle *style,
                        unsigned            index)
{
  if (style == NULL)
    style = &light_style;
  if (style->n_palette == 0)
    return style->foreground;
  return style->palette[index % MIN (style->n_palette, AW_CHART_PALETTE_MAX)];
}

int
aw_chart_series_dash (const AwChartStyle *style,
                      unsigned            index,
                      double              dashes[4])
{
  /* solid, long dash, dots, dash-dot; in multiples of the line width */
  static const double patterns[4][4] = {
    { 0, 0, 0, 0 },
    { 4.0, 2.0, 0, 0 },
    { 1.0, 1.6, 0, 0 },
    { 4.0, 1.6, 1.0, 1.6 },
  };
  static const int lengths[4] = { 0, 2, 2, 4 };
  double w;
  unsigned k;

  if (style == NULL || !style->dash_series)
    return 0;
  k = index % 4;
  w = style->line_width > 0 ? style->line_width : 1.0;
  for (int i = 0; i < lengths[k]; i++)
    dashes[i] = patterns[k][i] * w;
  return lengths[k];
}

/* Sequential scale: viridis (S. van der Walt and N. Smith, the default colour map of matplotlib
 * 2.0, 2015; designed to be perceptually uniform in CAM02-UCS and readable with colour-vision
 * deficiencies). Ten equally spaced samples of the published map (values from memory: the
 * midpoint #21908C matches the published table entry 128 = (0.128, 0.567, 0.551)), interpolated
 * linearly in sRGB. */
static const guint32 viridis10[10] = {
  0x440154, 0x482878, 0x3e4a89, 0x31688e, 0x26828e,
  0x1f9e89, 0x35b779, 0x6dcd59, 0xb4de2c, 0xfde725,
};

AwRgba
aw_chart_sequential (double t)
{
  AwRgba c = { 0, 0, 0, 0 };
  double f, u;
  int i;

  if (isnan (t))
    return c;
  t = CLAMP (t, 0.0, 1.0);
  f = t * 9.0;
  i = (int) floor (f);
  if (i >= 9)
    i = 8;
  u = f - i;
  for (int k = 0; k < 3; k++)
    {
      int shift = 16 - 8 * k;
      double a = (viridis10[i] >> shift & 0xff) / 255.0;
      double b = (viridis10[i + 1] >> shift & 0xff) / 255.0;
      double v = a + (b - a) * u;
      if (k == 0)
        c.r = v;
      else if (k == 1)
        c.g = v;
      else
        c.b = v;
    }
  c.a = 1.0;
  return c;
}

static double
srgb_to_linear (double c)
{
  return c <= 0.04045 ? c / 12.92 : pow ((c + 0.055) / 1.055, 2.4);
}

/* WCAG 2.1, "relative luminance" and "contrast ratio" definitions. */
double
aw_rgba_luminance (const AwRgba *c)
{
  return 0.2126 * srgb_to_linear (c->r) + 0.7152 * srgb_to_linear (c->g)
         + 0.0722 * srgb_to_linear (c->b);
}

double
aw_rgba_contrast (const AwRgba *a,
                  const AwRgba *b)
{
  double la = aw_rgba_luminance (a);
  double lb = aw_rgba_luminance (b);

  return (MAX (la, lb) + 0.05) / (MIN (la, lb) + 0.05);
}

void
aw_chart_set_source (cairo_t      *cr,
                     const AwRgba *c)
{
  cairo_set_source_rgba (cr, c->r, c->g, c->b, c->a);
}

/* ---- ticks ---- */

bool
aw_chart_nice_ticks (double   lo,
                     double   hi,
                     int      target,
                     AwTicks *ticks)
{
  double range, rough, mag, norm, nice, step, first, last;

  g_return_val_if_fail (ticks != NULL, false);

  memset (ticks, 0, sizeof *ticks);
  if (!isfinite (lo) || !isfinite (hi) || target < 1)
    return false;
  if (lo > hi)
    {
      double t = lo;
      lo = hi;
      hi = t;
    }
  if (hi - lo <= fabs (hi) * 1e-12 || hi == lo)
    {
      double pad = lo != 0.0 ? fabs (lo) * 0.1 : 0.5;
      lo -= pad;
      hi += pad;
    }

  range = hi - lo;
  rough = range / target;
  mag = pow (10.0, floor (log10 (rough)));
  norm = rough / mag;
  /* nearest of 1, 2, 5, 10 on a log scale: the geometric midpoints √2, √10, √50 */
  if (norm < M_SQRT2)
    nice = 1.0;
  else if (norm < sqrt (10.0))
    nice = 2.0;
  else if (norm < sqrt (50.0))
    nice = 5.0;
  else
    nice = 10.0;
  step = nice * mag;

  first = ceil (lo / step - 1e-9);
  last = floor (hi / step + 1e-9);
  ticks->step = step;
  ticks->start = first * step;
  ticks->count = (int) (last - first) + 1;
  if (ticks->count < 0)
    ticks->count = 0;
  ticks->decimals = MAX (0, (int) -floor (log10 (step) + 1e-9));
  return true;
}

double
aw_chart_tick_value (const AwTicks *ticks,
                     int            i)
{
  double v = ticks->start + i * ticks->step;
  double p = pow (10.0, MIN (ticks->decimals, 15));

  v = round (v * p) / p;
  if (v == 0.0)
    v = 0.0;    /* no negative zero */
  return v;
}

char *
aw_chart_format_number (double v,
                        int    decimals)
{
  char *s, *out;

  if (isnan (v))
    return g_strdup ("–");
  decimals = CLAMP (decimals, 0, 12);
  if (fabs (v) < 0.5 * pow (10.0, -decimals))
    v = 0.0;
  /* printf follows LC_NUMERIC, which GTK sets from the environment: the locale's separator */
  s = g_strdup_printf ("%.*f", decimals, v);
  if (s[0] != '-')
    return s;
  /* a true minus sign reads better than a hyphen */
  out = g_strconcat ("−", s + 1, NULL);
  g_free (s);
  return out;
}

/* ---- text ---- */

static PangoLayout *
make_layout (cairo_t            *cr,
             const AwChartStyle *style,
             const char         *text,
             double              size,
             bool                bold)
{
  PangoLayout *layout = pango_cairo_create_layout (cr);
  PangoFontDescription *desc = pango_font_description_new ();

  pango_font_description_set_family (desc, style->font_family ? style->font_family : "Sans");
  pango_font_description_set_absolute_size (desc, (size > 0 ? size : style->font_size)
                                                  * PANGO_SCALE);
  if (bold)
    pango_font_description_set_weight (desc, PANGO_WEIGHT_BOLD);
  pango_layout_set_font_description (layout, desc);
  pango_font_description_free (desc);
  pango_layout_set_text (layout, text, -1);
  return layout;
}

void
aw_chart_text_size (cairo_t            *cr,
                    const AwChartStyle *style,
                    const char         *text,
                    double              size,
                    bool                bold,
                    double             *width,
                    double             *height)
{
  PangoLayout *layout;
  PangoRectangle logical;

  layout = make_layout (cr, style, text ? text : "", size, bold);
  pango_layout_get_extents (layout, NULL, &logical);
  if (width)
    *width = (double) logical.width / PANGO_SCALE;
  if (height)
    *height = (double) logical.height / PANGO_SCALE;
  g_object_unref (layout);
}

double
aw_chart_draw_text (cairo_t            *cr,
                    const AwChartStyle *style,
                    const char         *text,
                    double              x,
                    double              y,
                    double              anchor_x,
                    double              anchor_y,
                    double              size,
                    bool                bold)
{
  PangoLayout *layout;
  PangoRectangle logical;
  double w, h;

  if (text == NULL || *text == '\0')
    return 0.0;
  layout = make_layout (cr, style, text, size, bold);
  pango_layout_get_extents (layout, NULL, &logical);
  w = (double) logical.width / PANGO_SCALE;
  h = (double) logical.height / PANGO_SCALE;
  cairo_move_to (cr, x - anchor_x * w - (double) logical.x / PANGO_SCALE,
                 y - anchor_y * h - (double) logical.y / PANGO_SCALE);
  pango_cairo_show_layout (cr, layout);
  cairo_new_path (cr);
  g_object_unref (layout);
  return w;
}

/* ---- axes ---- */

#define TICK_LEN(style) ((style)->font_size * 0.4)
#define LABEL_GAP(style) ((style)->font_size * 0.3)

double
aw_chart_axis_margin (const AwChartStyle *style,
                      AwAxisSide          side,
                      bool                has_title)
{
  double title = has_title ? style->title_size * 1.5 : 0.0;

  if (side == AW_AXIS_LEFT || side == AW_AXIS_RIGHT)
    return TICK_LEN (style) + LABEL_GAP (style) + style->font_size * 3.0 + title;
  return TICK_LEN (style) + LABEL_GAP (style) + style->font_size * 1.35 + title;
}

static bool
axis_is_horizontal (AwAxisSide side)
{
  return side == AW_AXIS_BOTTOM || side == AW_AXIS_TOP;
}

static char *
axis_label (const AwAxis *axis,
            double        v,
            int           decimals)
{
  char *s = NULL;

  if (axis->format != NULL)
    s = axis->format (v, decimals, axis->format_data);
  return s != NULL ? s : aw_chart_format_number (v, decimals);
}

/* Tick positions: a target that keeps labels from overlapping. */
static bool
axis_ticks (cairo_t            *cr,
            const AwChartStyle *style,
            const AwChartRect  *area,
            const AwAxis       *axis,
            AwTicks            *ticks)
{
  bool horiz = axis_is_horizontal (axis->side);
  double length = horiz ? area->width : area->height;
  int target = axis->target_ticks;

  if (target <= 0)
    target = MAX (2, (int) (length / (style->font_size * (horiz ? 6.5 : 3.5))));

  for (int attempt = 0; attempt < 8; attempt++)
    {
      double spacing, need = 0.0;

      if (!aw_chart_nice_ticks (axis->lo, axis->hi, target, ticks))
        return false;
      if (ticks->count < 2 || axis->skip_labels)
        return true;
      spacing = fabs (ticks->step / (axis->hi - axis->lo) * length);
      for (int i = 0; i < ticks->count; i++)
        {
          g_autofree char *s = axis_label (axis, aw_chart_tick_value (ticks, i),
                                           ticks->decimals);
          double w, h;

          aw_chart_text_size (cr, style, s, 0, false, &w, &h);
          need = MAX (need, horiz ? w + style->font_size * 0.8 : h * 1.2);
        }
      if (need <= spacing || target <= 1)
        return true;
      target = MAX (1, (int) (target * spacing / need));
    }
  return true;
}

void
aw_chart_draw_axis (cairo_t            *cr,
                    const AwChartStyle *style,
                    const AwChartRect  *area,
                    const AwAxis       *axis)
{
  AwTicks ticks;
  bool horiz;
  double lw, x0, y0, x1, y1, tick = TICK_LEN (style), gap = LABEL_GAP (style);
  double margin;

  g_return_if_fail (cr != NULL && style != NULL && area != NULL && axis != NULL);

  if (!isfinite (axis->lo) || !isfinite (axis->hi) || axis->lo == axis->hi)
    return;
  if (!axis_ticks (cr, style, area, axis, &ticks))
    return;

  horiz = axis_is_horizontal (axis->side);
  lw = MAX (1.0, style->line_width * 0.5);
  x0 = area->x;
  y0 = area->y;
  x1 = area->x + area->width;
  y1 = area->y + area->height;

  cairo_save (cr);

  /* grid */
  if (axis->grid)
    {
      aw_chart_set_source (cr, &style->grid);
      cairo_set_line_width (cr, lw);
      for (int i = 0; i < ticks.count; i++)
        {
          double v = aw_chart_tick_value (&ticks, i);
          if (horiz)
            {
              double px = aw_chart_map (v, axis->lo, axis->hi, x0, x1);
              cairo_move_to (cr, px, y0);
              cairo_line_to (cr, px, y1);
            }
          else
            {
              double py = aw_chart_map (v, axis->lo, axis->hi, y1, y0);
              cairo_move_to (cr, x0, py);
              cairo_line_to (cr, x1, py);
            }
        }
      cairo_stroke (cr);
    }

  /* axis line and ticks */
  aw_chart_set_source (cr, &style->foreground);
  cairo_set_line_width (cr, lw);
  cairo_set_line_cap (cr, CAIRO_LINE_CAP_SQUARE);
  switch (axis->side)
    {
    case AW_AXIS_BOTTOM:
      cairo_move_to (cr, x0, y1);
      cairo_line_to (cr, x1, y1);
      break;
    case AW_AXIS_TOP:
      cairo_move_to (cr, x0, y0);
      cairo_line_to (cr, x1, y0);
      break;
    case AW_AXIS_LEFT:
      cairo_move_to (cr, x0, y0);
      cairo_line_to (cr, x0, y1);
      break;
    case AW_AXIS_RIGHT:
    default:
      cairo_move_to (cr, x1, y0);
      cairo_line_to (cr, x1, y1);
      break;
    }
  cairo_stroke (cr);
  cairo_set_line_cap (cr, CAIRO_LINE_CAP_BUTT);

  for (int i = 0; i < ticks.count; i++)
    {
      double v = aw_chart_tick_value (&ticks, i);
      g_autofree char *label = NULL;
      double p;

      if (horiz)
        p = aw_chart_map (v, axis->lo, axis->hi, x0, x1);
      else
        p = aw_chart_map (v, axis->lo, axis->hi, y1, y0);

      switch (axis->side)
        {
        case AW_AXIS_BOTTOM:
          cairo_move_to (cr, p, y1);
          cairo_line_to (cr, p, y1 + tick);
          break;
        case AW_AXIS_TOP:
          cairo_move_to (cr, p, y0);
          cairo_line_to (cr, p, y0 - tick);
          break;
        case AW_AXIS_LEFT:
          cairo_move_to (cr, x0, p);
          cairo_line_to (cr, x0 - tick, p);
          break;
        case AW_AXIS_RIGHT:
        default:
          cairo_move_to (cr, x1, p);
          cairo_line_to (cr, x1 + tick, p);
          break;
        }
      cairo_stroke (cr);

      if (axis->skip_labels)
        continue;
      label = axis_label (axis, v, ticks.decimals);
      switch (axis->side)
        {
        case AW_AXIS_BOTTOM:
          aw_chart_draw_text (cr, style, label, p, y1 + tick + gap, 0.5, 0.0, 0, false);
          break;
        case AW_AXIS_TOP:
          aw_chart_draw_text (cr, style, label, p, y0 - tick - gap, 0.5, 1.0, 0, false);
          break;
        case AW_AXIS_LEFT:
          aw_chart_draw_text (cr, style, label, x0 - tick - gap, p, 1.0, 0.5, 0, false);
          break;
        case AW_AXIS_RIGHT:
        default:
          aw_chart_draw_text (cr, style, label, x1 + tick + gap, p, 0.0, 0.5, 0, false);
          break;
        }
    }

  /* title, at the outer edge of the margin */
  if (axis->title != NULL && *axis->title != '\0' && !axis->skip_labels)
    {
      margin = aw_chart_axis_margin (style, axis->side, true);
      switch (axis->side)
        {
        case AW_AXIS_BOTTOM:
          aw_chart_draw_text (cr, style, axis->title, (x0 + x1) / 2, y1 + margin, 0.5, 1.0,
                              style->title_size, false);
          break;
        case AW_AXIS_TOP:
          aw_chart_draw_text (cr, style, axis->title, (x0 + x1) / 2, y0 - margin, 0.5, 0.0,
                              style->title_size, false);
          break;
        case AW_AXIS_LEFT:
          cairo_save (cr);
          cairo_translate (cr, x0 - margin, (y0 + y1) / 2);
          cairo_rotate (cr, -G_PI / 2);
          aw_chart_draw_text (cr, style, axis->title, 0, 0, 0.5, 0.0, style->title_size, false);
          cairo_restore (cr);
          break;
        case AW_AXIS_RIGHT:
        default:
          cairo_save (cr);
          cairo_translate (cr, x1 + margin, (y0 + y1) / 2);
          cairo_rotate (cr, G_PI / 2);
          aw_chart_draw_text (cr, style, axis->title, 0, 0, 0.5, 0.0, style->title_size, false);
          cairo_restore (cr);
          break;
        }
    }

  cairo_restore (cr);
}

/* ---- legend ---- */

#define LEGEND_PAD(style) ((style)->font_size * 0.6)
#define LEGEND_MARK(style) ((style)->font_size * 2.0)

void
aw_chart_legend_size (cairo_t            *cr,
                      const AwChartStyle *style,
                      const AwLegendItem *items,
                      size_t              n_items,
                      double             *width,
                      double             *height)
{
  double w = 0.0, h = 0.0, pad = LEGEND_PAD (style);

  for (size_t i = 0; i < n_items; i++)
    {
      double tw, th;

      aw_chart_text_size (cr, style, items[i].label, 0, false, &tw, &th);
      w = MAX (w, tw);
      h += th;
    }
  if (width)
    *width = n_items ? w + LEGEND_MARK (style) + 3 * pad : 0.0;
  if (height)
    *height = n_items ? h + 2 * pad : 0.0;
}

void
aw_chart_draw_legend (cairo_t            *cr,
                      const AwChartStyle *style,
                      const AwChartRect  *area,
                      AwChartCorner       corner,
                      const AwLegendItem *items,
                      size_t              n_items,
                      AwChartRect        *out_box)
{
  double w, h, x, y, pad = LEGEND_PAD (style), inset = style->font_size * 0.6;
  AwRgba bg;

  g_return_if_fail (cr != NULL && style != NULL && area != NULL);

  if (out_box)
    memset (out_box, 0, sizeof *out_box);
  if (n_items == 0)
    return;

  aw_chart_legend_size (cr, style, items, n_items, &w, &h);
  switch (corner)
    {
    case AW_CORNER_TOP_LEFT:
      x = area->x + inset;
      y = area->y + inset;
      break;
    case AW_CORNER_BOTTOM_RIGHT:
      x = area->x + area->width - inset - w;
      y = area->y + area->height - inset - h;
      break;
    case AW_CORNER_BOTTOM_LEFT:
      x = area->x + inset;
      y = area->y + area->height - inset - h;
      break;
    case AW_CORNER_TOP_RIGHT:
    default:
      x = area->x + area->width - inset - w;
      y = area->y + inset;
      break;
    }
  x = round (x);
  y = round (y);
  if (out_box)
    {
      out_box->x = x;
      out_box->y = y;
      out_box->width = w;
      out_box->height = h;
    }

  cairo_save (cr);
  bg = style->background;
  bg.a = 0.88;
  aw_chart_set_source (cr, &bg);
  cairo_rectangle (cr, x, y, w, h);
  cairo_fill_preserve (cr);
  aw_chart_set_source (cr, &style->muted);
  cairo_set_line_width (cr, 1.0);
  cairo_stroke (cr);

  y += pad;
  for (size_t i = 0; i < n_items; i++)
    {
      const AwLegendItem *it = &items[i];
      double tw, th, mx = x + pad, my;

      aw_chart_text_size (cr, style, it->label, 0, false, &tw, &th);
      my = y + th / 2;
      if (it->mark == AW_LEGEND_SWATCH)
        {
          double s = th * 0.7;
          aw_chart_set_source (cr, &it->color);
          cairo_rectangle (cr, mx, my - s / 2, LEGEND_MARK (style), s);
          cairo_fill (cr);
        }
      else
        {
          double dashes[4];
          int nd = aw_chart_series_dash (style, it->dash_index, dashes);

          aw_chart_set_source (cr, &it->color);
          cairo_set_line_width (cr, style->line_width);
          cairo_set_dash (cr, dashes, nd, 0);
          cairo_move_to (cr, mx, my);
          cairo_line_to (cr, mx + LEGEND_MARK (style), my);
          cairo_stroke (cr);
          cairo_set_dash (cr, NULL, 0, 0);
        }
      aw_chart_set_source (cr, &style->foreground);
      aw_chart_draw_text (cr, style, it->label, mx + LEGEND_MARK (style) + pad, y, 0, 0, 0,
                          false);
      y += th;
    }
  cairo_restore (cr);
}

void
aw_chart_draw_colorbar (cairo_t            *cr,
                        const AwChartStyle *style,
                        const AwChartRect  *bar,
                        double              lo,
                        double              hi,
                        const char         *title)
{
  cairo_pattern_t *pat;
  AwAxis axis = { 0 };

  g_return_if_fail (cr != NULL && style != NULL && bar != NULL);

  cairo_save (cr);
  pat = cairo_pattern_create_linear (0, bar->y + bar->height, 0, bar->y);
  for (int i = 0; i < 10; i++)
    {
      AwRgba c = aw_chart_sequential (i / 9.0);
      cairo_pattern_add_color_stop_rgb (pat, i / 9.0, c.r, c.g, c.b);
    }
  cairo_set_source (cr, pat);
  cairo_rectangle (cr, bar->x, bar->y, bar->width, bar->height);
  cairo_fill (cr);
  cairo_pattern_destroy (pat);
  cairo_restore (cr);

  axis.side = AW_AXIS_RIGHT;
  axis.lo = lo;
  axis.hi = hi;
  axis.title = title;
  aw_chart_draw_axis (cr, style, bar, &axis);
}
