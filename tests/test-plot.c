/* test-plot.c: chart primitives, the flight plot renderer, hit-testing and export
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <locale.h>
#include <math.h>
#include <string.h>
#include <glib.h>
#include <glib/gstdio.h>
#include <gio/gio.h>

#include "aw-chart.h"
#include "aw-plot.h"
#include "aw-units.h"

/* ---- helpers ---- */

static const char *
out_dir (void)
{
  const char *dir = g_getenv ("G_TEST_BUILDDIR");

  return dir ? dir : g_get_tmp_dir ();
}

/* A straight-line "flight" from (0, z0) to (x_end, z1), n samples. */
static AwSample *
line_samples (size_t n,
              double x_end,
              double z0,
              double z1,
              double drift_end)
{
  AwSample *s = g_new0 (AwSample, n);

  for (size_t i = 0; i < n; i++)
    {
      double u = (double) i / (n - 1);

      s[i].x = u * x_end;
      s[i].z = z0 + u * (z1 - z0);
      s[i].y = u * drift_end;
      s[i].t = u * 1.0;
      s[i].speed = 90.0 - 30.0 * u;
      s[i].energy = 0.5 * 0.0002 * s[i].speed * s[i].speed;
      s[i].spin = 5000.0 - 1000.0 * u;
    }
  return s;
}

typedef struct
{
  guint8 r, g, b;
} Px;

static Px
pixel_at (cairo_surface_t *surface,
          int              x,
          int              y)
{
  unsigned char *data = cairo_image_surface_get_data (surface);
  int stride = cairo_image_surface_get_stride (surface);
  guint32 v = *(guint32 *) (data + y * stride + x * 4);   /* opaque ARGB32, native endian */
  Px p = { (v >> 16) & 0xff, (v >> 8) & 0xff, v & 0xff };

  return p;
}

/* Colour c (straight alpha) composited over an opaque background, in 8-bit units. */
static Px
composite (const AwRgba *c,
           const AwRgba *bg)
{
  Px p;

  p.r = (guint8) lround ((c->r * c->a + bg->r * (1 - c->a)) * 255);
  p.g = (guint8) lround ((c->g * c->a + bg->g * (1 - c->a)) * 255);
  p.b = (guint8) lround ((c->b * c->a + bg->b * (1 - c->a)) * 255);
  return p;
}

static gboolean
px_near (Px  a,
         Px  b,
         int tol)
{
  return ABS ((int) a.r - b.r) <= tol && ABS ((int) a.g - b.g) <= tol
         && ABS ((int) a.b - b.b) <= tol;
}

static char *
read_file (const char *path,
           gsize      *len)
{
  char *contents = NULL;
  GError *error = NULL;

  g_file_get_contents (path, &contents, len, &error);
  g_assert_no_error (error);
  return contents;
}

/* ---- ticks ---- */

/* The 1-2-5 "nice number" rule for axis labels (P. S. Heckbert, "Nice numbers for graph labels",
 * Graphics Gems, 1990): step = {1, 2, 5} × 10^k closest (on a log scale) to range / target. The
 * expected values are worked by hand from that rule. */
static void
test_nice_ticks (void)
{
  static const struct
  {
    double lo, hi;
    int target;
    double start, step;
    int count, decimals;
  } cases[] = {
    { 0, 100, 5, 0, 20, 6, 0 },          /* rough 20 → 2 × 10 */
    { 0, 1, 5, 0, 0.2, 6, 1 },           /* rough 0.2 → 2 × 0.1 */
    { 0, 10, 4, 0, 2, 6, 0 },            /* rough 2.5 < √10 → 2 */
    { 0, 7, 2, 0, 5, 2, 0 },             /* rough 3.5 ≥ √10 → 5 */
    { 0, 93, 10, 0, 10, 10, 0 },         /* rough 9.3 ≥ √50 → 10 */
    { 0, 13, 10, 0, 1, 14, 0 },          /* rough 1.3 < √2 → 1 */
    { -1.3, 2.7, 8, -1.0, 0.5, 8, 1 },   /* rough 0.5 → 5 × 0.1, first tick inside */
    { 0, 0.013, 3, 0, 0.005, 3, 3 },     /* rough 0.0043 → 5 × 0.001 */
    { 100, 0, 5, 0, 20, 6, 0 },          /* reversed range */
    { 5, 5, 4, 4.6, 0.2, 5, 1 },         /* empty range widened to 4.5 … 5.5 */
    { -0.35, 1.95, 6, 0, 0.5, 4, 1 },    /* rough 0.38 ≥ √10 × 0.1 → 5 × 0.1; −0.5 is below lo */
  };

  for (guint i = 0; i < G_N_ELEMENTS (cases); i++)
    {
      AwTicks t;

      g_test_message ("case %u: [%g, %g] target %d", i, cases[i].lo, cases[i].hi,
                      cases[i].target);
      g_assert_true (aw_chart_nice_ticks (cases[i].lo, cases[i].hi, cases[i].target, &t));
      g_assert_cmpfloat_with_epsilon (t.step, cases[i].step, 1e-12 * cases[i].step);
      g_assert_cmpfloat_with_epsilon (t.start, cases[i].start, 1e-9);
      g_assert_cmpint (t.count, ==, cases[i].count);
      g_assert_cmpint (t.decimals, ==, cases[i].decimals);
    }
}

/* Properties over many ranges: the mantissa is 1, 2 or 5; ticks lie inside the range; there are
 * about `target` intervals (the nearest step on a log scale is within a factor √(5/2) ≈ 1.58 of
 * the rough step, hence count − 1 is within target / 1.6 … target × 1.6, ±1 for the ends). */
static void
test_nice_ticks_properties (void)
{
  GRand *rand = g_rand_new_with_seed (1234);
  AwTicks t;

  for (int i = 0; i < 2000; i++)
    {
      double lo = g_rand_double_range (rand, -1000, 1000)
                  * pow (10, g_rand_int_range (rand, -4, 3));
      double hi = lo + g_rand_double_range (rand, 1e-3, 2000)
                       * pow (10, g_rand_int_range (rand, -3, 2));
      int target = g_rand_int_range (rand, 2, 12);
      double mant;

      g_assert_true (aw_chart_nice_ticks (lo, hi, target, &t));
      mant = t.step / pow (10, floor (log10 (t.step) + 1e-12));
      g_assert_true (fabs (mant - 1) < 1e-9 || fabs (mant - 2) < 1e-9 || fabs (mant - 5) < 1e-9
                     || fabs (mant - 10) < 1e-9);
      g_assert_cmpfloat (aw_chart_tick_value (&t, 0), >=, lo - t.step * 1e-6);
      g_assert_cmpfloat (aw_chart_tick_value (&t, t.count - 1), <=, hi + t.step * 1e-6);
      g_assert_cmpfloat (aw_chart_tick_value (&t, 0) - t.step, <, lo);
      g_assert_cmpfloat (aw_chart_tick_value (&t, t.count - 1) + t.step, >, hi);
      g_assert_cmpfloat (t.count - 1, <=, target * 1.6 + 1);
      g_assert_cmpfloat (t.count + 1, >=, target / 1.6 - 1);
    }
  g_rand_free (rand);

  g_assert_false (aw_chart_nice_ticks (NAN, 1, 5, &t));
  g_assert_cmpint (t.count, ==, 0);
  g_assert_false (aw_chart_nice_ticks (0, INFINITY, 5, &t));
  g_assert_false (aw_chart_nice_ticks (0, 1, 0, &t));
}

static void
test_format_number (void)
{
  char *s;

  s = aw_chart_format_number (1.5, 1);
  g_assert_cmpstr (s, ==, "1.5");
  g_free (s);
  s = aw_chart_format_number (-2.25, 2);
  g_assert_cmpstr (s, ==, "−2.25");
  g_free (s);
  s = aw_chart_format_number (-0.0001, 2);   /* no "−0.00" */
  g_assert_cmpstr (s, ==, "0.00");
  g_free (s);

  /* display numbers follow the locale (.ci generates de_DE.UTF-8; fail loudly without it) */
  if (setlocale (LC_NUMERIC, "de_DE.UTF-8") == NULL && setlocale (LC_NUMERIC, "de_DE.utf8") == NULL)
    {
      g_test_fail_printf ("locale de_DE.UTF-8 is not available: run locale-gen (see .ci/run)");
      return;
    }
  s = aw_chart_format_number (1.5, 1);
  g_assert_cmpstr (s, ==, "1,5");
  g_free (s);
  setlocale (LC_NUMERIC, "C");
}

static char *
count_format (double v,
              int    decimals,
              void  *data)
{
  (*(int *) data)++;
  return g_strdup_printf ("%.*f%%", decimals, v);
}

/* An axis calls the caller's label format once per tick (and for measuring); a legend grows with
 * its items; a colour bar draws the sequential scale. */
static void
test_axis_legend (void)
{
  cairo_surface_t *surface = cairo_image_surface_create (CAIRO_FORMAT_ARGB32, 400, 300);
  cairo_t *cr = cairo_create (surface);
  const AwChartStyle *st = aw_chart_style_light ();
  AwChartRect area = { 60, 20, 300, 220 };
  AwAxis axis = { AW_AXIS_BOTTOM, 0, 100, 5, "Share (%)", true, false, count_format, NULL };
  AwLegendItem items[3] = {
    { "one", { 1, 0, 0, 1 }, AW_LEGEND_LINE, 0 },
    { "two", { 0, 1, 0, 1 }, AW_LEGEND_SWATCH, 0 },
    { "a much longer third entry", { 0, 0, 1, 1 }, AW_LEGEND_LINE, 2 },
  };
  AwChartRect box;
  double w1, h1, w3, h3;
  int calls = 0;
  unsigned char *data;
  guint32 mid;

  axis.format_data = &calls;
  aw_chart_draw_axis (cr, st, &area, &axis);
  g_assert_cmpint (calls, >=, 6);          /* 0, 20, … 100 */
  calls = 0;
  axis.lo = axis.hi = 5;                   /* empty range: nothing drawn, no crash */
  aw_chart_draw_axis (cr, st, &area, &axis);
  g_assert_cmpint (calls, ==, 0);

  aw_chart_legend_size (cr, st, items, 1, &w1, &h1);
  aw_chart_legend_size (cr, st, items, 3, &w3, &h3);
  g_assert_cmpfloat (w3, >, w1);
  g_assert_cmpfloat (h3, >, h1 * 2);
  aw_chart_draw_legend (cr, st, &area, AW_CORNER_BOTTOM_LEFT, items, 3, &box);
  g_assert_cmpfloat (box.x, >=, area.x);
  g_assert_cmpfloat (box.y + box.height, <=, area.y + area.height);
  g_assert_cmpfloat_with_epsilon (box.width, w3, 1e-9);

  /* the colour bar: its middle is the middle of the scale */
  aw_chart_draw_colorbar (cr, st, &(AwChartRect) { 10, 10, 20, 200 }, 0, 1, NULL);
  cairo_surface_flush (surface);
  data = cairo_image_surface_get_data (surface);
  mid = *(guint32 *) (data + 110 * cairo_image_surface_get_stride (surface) + 20 * 4);
  {
    AwRgba c = aw_chart_sequential (0.5);
    g_assert_cmpint (ABS ((int) ((mid >> 16) & 0xff) - (int) lround (c.r * 255)), <=, 3);
    g_assert_cmpint (ABS ((int) ((mid >> 8) & 0xff) - (int) lround (c.g * 255)), <=, 3);
    g_assert_cmpint (ABS ((int) (mid & 0xff) - (int) lround (c.b * 255)), <=, 3);
  }
  g_assert_cmpint (cairo_status (cr), ==, CAIRO_STATUS_SUCCESS);
  cairo_destroy (cr);
  cairo_surface_destroy (surface);
}

/* ---- colours ---- */

/* Colour-vision deficiency simulation (G. M. Machado, M. M. Oliveira and L. A. F. Fernandes,
 * "A physiologically-based model for simulation of color vision deficiency", IEEE TVCG 15(6),
 * 2009), severity 1.0 matrices on linear RGB; coefficients from memory. */
static const double cvd[3][3][3] = {
  { { 0.152286, 1.052583, -0.204868 }, { 0.114503, 0.786281, 0.099216 },
    { -0.003882, -0.048116, 1.051998 } },                                   /* protanopia */
  { { 0.367322, 0.860646, -0.227968 }, { 0.280085, 0.672501, 0.047413 },
    { -0.011820, 0.042940, 0.968881 } },                                    /* deuteranopia */
  { { 1.255528, -0.076749, -0.178779 }, { -0.078411, 0.930809, 0.147602 },
    { 0.004733, 0.691367, 0.303900 } },                                     /* tritanopia */
};

static double
lin (double c)
{
  return c <= 0.04045 ? c / 12.92 : pow ((c + 0.055) / 1.055, 2.4);
}

/* linear RGB → CIE L*a*b* (D65), the sRGB (IEC 61966-2-1) matrix */
static void
to_lab (const double rgb[3],
        double       lab[3])
{
  double X = 0.4124 * rgb[0] + 0.3576 * rgb[1] + 0.1805 * rgb[2];
  double Y = 0.2126 * rgb[0] + 0.7152 * rgb[1] + 0.0722 * rgb[2];
  double Z = 0.0193 * rgb[0] + 0.1192 * rgb[1] + 0.9505 * rgb[2];
  double w[3] = { 0.95047, 1.0, 1.08883 }, v[3] = { X, Y, Z }, f[3];

  for (int i = 0; i < 3; i++)
    {
      double t = v[i] / w[i];
      f[i] = t > 216.0 / 24389.0 ? cbrt (t) : (24389.0 / 27.0 * t + 16.0) / 116.0;
    }
  lab[0] = 116 * f[1] - 16;
  lab[1] = 500 * (f[0] - f[1]);
  lab[2] = 200 * (f[1] - f[2]);
}

static void
test_palette (void)
{
  const AwChartStyle *styles[2] = { aw_chart_style_light (), aw_chart_style_dark () };

  for (int s = 0; s < 2; s++)
    {
      const AwChartStyle *st = styles[s];

      g_assert_cmpuint (st->n_palette, >=, 5);
      /* the first five setups stay visible on the background: 3:1 (WCAG 2.1 SC 1.4.11) */
      for (unsigned i = 0; i < 5; i++)
        {
          AwRgba c = aw_chart_palette_color (st, i);
          g_test_message ("%s palette %u contrast %.2f", st->dark ? "dark" : "light", i,
                          aw_rgba_contrast (&c, &st->background));
          g_assert_cmpfloat (aw_rgba_contrast (&c, &st->background), >=, 3.0);
        }
      /* the text too: 4.5:1 (WCAG 2.1 SC 1.4.3) */
      g_assert_cmpfloat (aw_rgba_contrast (&st->foreground, &st->background), >=, 4.5);
      g_assert_cmpfloat (aw_rgba_contrast (&st->tooltip_fg, &st->tooltip_bg), >=, 4.5);

      /* the first three setups stay apart under each simulated deficiency: CIE76 ΔE ≥ 20
       * (threshold common practice, no source: well above the ≈ 2.3 just-noticeable difference) */
      for (int k = 0; k < 3; k++)
        for (unsigned i = 0; i < 3; i++)
          for (unsigned j = i + 1; j < 3; j++)
            {
              AwRgba a = aw_chart_palette_color (st, i), b = aw_chart_palette_color (st, j);
              double la[3] = { lin (a.r), lin (a.g), lin (a.b) };
              double lb[3] = { lin (b.r), lin (b.g), lin (b.b) };
              double sa[3], sb[3], laba[3], labb[3], de;

              for (int r = 0; r < 3; r++)
                {
                  sa[r] = CLAMP (cvd[k][r][0] * la[0] + cvd[k][r][1] * la[1]
                                 + cvd[k][r][2] * la[2], 0.0, 1.0);
                  sb[r] = CLAMP (cvd[k][r][0] * lb[0] + cvd[k][r][1] * lb[1]
                                 + cvd[k][r][2] * lb[2], 0.0, 1.0);
                }
              to_lab (sa, laba);
              to_lab (sb, labb);
              de = sqrt ((laba[0] - labb[0]) * (laba[0] - labb[0])
                         + (laba[1] - labb[1]) * (laba[1] - labb[1])
                         + (laba[2] - labb[2]) * (laba[2] - labb[2]));
              g_test_message ("%s deficiency %d colours %u/%u ΔE %.1f",
                              st->dark ? "dark" : "light", k, i, j, de);
              g_assert_cmpfloat (de, >=, 20.0);
            }
    }
}

static void
test_sequential (void)
{
  AwRgba c0 = aw_chart_sequential (0.0), c1 = aw_chart_sequential (1.0);
  double prev = -1;

  /* published end points of viridis: #440154 and #FDE725 (from memory) */
  g_assert_cmpint (lround (c0.r * 255), ==, 0x44);
  g_assert_cmpint (lround (c0.g * 255), ==, 0x01);
  g_assert_cmpint (lround (c0.b * 255), ==, 0x54);
  g_assert_cmpint (lround (c1.r * 255), ==, 0xfd);
  g_assert_cmpint (lround (c1.g * 255), ==, 0xe7);
  g_assert_cmpint (lround (c1.b * 255), ==, 0x25);
  /* table entry 128 of the published map: (0.127568, 0.566949, 0.550556) (from memory) */
  c0 = aw_chart_sequential (128.0 / 255.0);
  g_assert_cmpfloat (fabs (c0.r - 0.127568), <, 0.02);
  g_assert_cmpfloat (fabs (c0.g - 0.566949), <, 0.02);
  g_assert_cmpfloat (fabs (c0.b - 0.550556), <, 0.02);

  /* a sequential scale gets lighter all the way (the map's design goal: monotone lightness) */
  for (int i = 0; i <= 100; i++)
    {
      AwRgba c = aw_chart_sequential (i / 100.0);
      double l = aw_rgba_luminance (&c);

      g_assert_cmpfloat (l, >, prev);
      prev = l;
    }
  /* out of range clamps; NaN is transparent */
  c0 = aw_chart_sequential (-3);
  c1 = aw_chart_sequential (0);
  g_assert_true (memcmp (&c0, &c1, sizeof c0) == 0);
  c0 = aw_chart_sequential (NAN);
  g_assert_cmpfloat (c0.a, ==, 0.0);
}

/* ---- viewport ---- */

static void
test_viewport_fit (void)
{
  g_autofree AwSample *a = line_samples (50, 60.0, 1.5, 0.0, 0.4);
  g_autofree AwSample *b = line_samples (80, 85.0, 1.5, 2.6, -1.2);
  g_autofree AwSample *hidden = line_samples (10, 500.0, 1.5, 40.0, 0);
  AwPlotSeries series[3] = {
    { "A", { 0 }, a, 50, true },
    { "B", { 0 }, b, 80, true },
    { "hidden", { 0 }, hidden, 10, false },
  };
  AwPlotScene scene;
  AwPlotViewport vp;

  aw_plot_scene_init (&scene);
  scene.series = series;
  scene.n_series = 3;
  scene.sight_line_m = 1.55;
  scene.band_half_m = 0.15;
  scene.muzzle_height_m = 1.5;
  scene.min_engagement_m = 20.0;

  aw_plot_viewport_fit (&scene, &vp);
  g_assert_true (aw_plot_viewport_is_valid (&vp));
  for (int s = 0; s < 2; s++)
    for (size_t i = 0; i < series[s].n_samples; i++)
      {
        const AwSample *p = &series[s].samples[i];
        g_assert_cmpfloat (p->x, >=, vp.x_min);
        g_assert_cmpfloat (p->x, <=, vp.x_max);
        g_assert_cmpfloat (p->z, >=, vp.z_min);
        g_assert_cmpfloat (p->z, <=, vp.z_max);
        g_assert_cmpfloat (p->y, >=, vp.y_min);
        g_assert_cmpfloat (p->y, <=, vp.y_max);
      }
  g_assert_cmpfloat (vp.x_min, ==, 0.0);
  g_assert_cmpfloat (vp.z_min, <=, 0.0);                   /* ground shown */
  g_assert_cmpfloat (vp.z_max, >=, 1.55 + 0.15);           /* whole band */
  /* the hidden series does not stretch the view */
  g_assert_cmpfloat (vp.x_max, <, 100.0);
  g_assert_cmpfloat (vp.z_max, <, 5.0);

  /* empty scene: a sensible default */
  aw_plot_scene_init (&scene);
  aw_plot_viewport_fit (&scene, &vp);
  g_assert_true (aw_plot_viewport_is_valid (&vp));

  /* bad samples are ignored, not propagated */
  a[3].z = NAN;
  a[4].x = INFINITY;
  scene.series = series;
  scene.n_series = 1;
  aw_plot_viewport_fit (&scene, &vp);
  g_assert_true (aw_plot_viewport_is_valid (&vp));

  /* zoom around a point keeps that point fixed, and stops at the limits */
  {
    AwPlotViewport z = vp;
    double cx = 10.0, cz = 1.0;
    double ux = (cx - z.x_min) / (z.x_max - z.x_min);

    aw_plot_viewport_zoom (&z, false, 2.0, cx, cz);
    g_assert_cmpfloat_with_epsilon ((cx - z.x_min) / (z.x_max - z.x_min), ux, 1e-12);
    g_assert_cmpfloat_with_epsilon (z.x_max - z.x_min, (vp.x_max - vp.x_min) / 2, 1e-9);
    for (int i = 0; i < 200; i++)
      aw_plot_viewport_zoom (&z, false, 10.0, cx, cz);
    g_assert_true (aw_plot_viewport_is_valid (&z));
    g_assert_cmpfloat (z.x_max - z.x_min, >=, 0.05 * (1 - 1e-9));
    aw_plot_viewport_zoom (&z, false, NAN, cx, cz);
    aw_plot_viewport_pan (&z, false, NAN, INFINITY);
    g_assert_true (aw_plot_viewport_is_valid (&z));
  }
}

/* ---- rendering ---- */

static void
make_two_series_scene (AwPlotScene  *scene,
                       AwPlotSeries  series[2],
                       AwSample    **a,
                       AwSample    **b)
{
  /* both series stay well above the band (z 2.4 … 3.0) so the band row is free of lines */
  *a = line_samples (40, 60.0, 2.4, 3.0, 0.2);
  *b = line_samples (40, 70.0, 3.0, 2.4, -0.3);
  series[0] = (AwPlotSeries) { "Alpha", { 0 }, *a, 40, true };
  series[1] = (AwPlotSeries) { "Bravo", { 0 }, *b, 40, true };
  aw_plot_scene_init (scene);
  scene->series = series;
  scene->n_series = 2;
  scene->sight_line_m = 1.0;
  scene->band_half_m = 0.3;
  scene->muzzle_height_m = 1.0;
  scene->min_engagement_m = 15.0;
  scene->show_legend = false;
}

static void
test_render_band (void)
{
  const AwChartStyle *styles[2] = { aw_chart_style_light (), aw_chart_style_dark () };
  g_autofree AwSample *a = NULL, *b = NULL;
  AwPlotSeries series[2];
  AwPlotScene scene;
  AwPlotViewport vp;
  const int W = 800, H = 500;

  make_two_series_scene (&scene, series, &a, &b);
  aw_plot_viewport_fit (&scene, &vp);

  for (int s = 0; s < 2; s++)
    {
      const AwChartStyle *st = styles[s];
      cairo_surface_t *surface = cairo_image_surface_create (CAIRO_FORMAT_ARGB32, W, H);
      cairo_t *cr = cairo_create (surface);
      AwPlotLayout layout;
      Px band = composite (&st->band, &st->background);
      Px bg = composite (&st->background, &st->background);
      Px no_shoot = composite (&st->no_shoot, &st->background);
      GHashTable *colours = g_hash_table_new (NULL, NULL);
      int in_band = 0, outside_bg = 0, n_row = 0, zone_px = 0, n_zone = 0;
      int yb, yo, x0, x1, xz;

      aw_plot_render (cr, W, H, &scene, &vp, st);
      cairo_destroy (cr);
      cairo_surface_flush (surface);
      aw_plot_layout (W, H, &scene, st, &layout);

      /* not blank: many distinct colours (lines, text, band, palette) */
      for (int y = 0; y < H; y += 2)
        for (int x = 0; x < W; x += 2)
          {
            Px p = pixel_at (surface, x, y);
            g_hash_table_add (colours, GUINT_TO_POINTER (p.r << 16 | p.g << 8 | p.b));
          }
      g_test_message ("%u distinct colours", g_hash_table_size (colours));
      g_assert_cmpuint (g_hash_table_size (colours), >, 20);
      g_hash_table_unref (colours);

      /* a row inside the band (z = sight + half/2), right of the no-shoot zone: band colour
       * except where grid lines cross; a row above the band (z = sight + 1.5 half): background */
      yb = (int) aw_chart_map (1.0 + 0.15, vp.z_min, vp.z_max,
                               layout.side.y + layout.side.height, layout.side.y);
      yo = (int) aw_chart_map (1.0 + 0.45, vp.z_min, vp.z_max,
                               layout.side.y + layout.side.height, layout.side.y);
      x0 = (int) aw_chart_map (16.0, vp.x_min, vp.x_max, layout.side.x,
                               layout.side.x + layout.side.width) + 2;
      x1 = (int) (layout.side.x + layout.side.width) - 2;
      for (int x = x0; x < x1; x++)
        {
          n_row++;
          if (px_near (pixel_at (surface, x, yb), band, 2))
            in_band++;
          if (px_near (pixel_at (surface, x, yo), bg, 2))
            outside_bg++;
          g_assert_false (px_near (pixel_at (surface, x, yb), bg, 2));
        }
      g_test_message ("band row %d/%d, outside row %d/%d", in_band, n_row, outside_bg, n_row);
      g_assert_cmpint (in_band, >=, n_row * 9 / 10);
      g_assert_cmpint (outside_bg, >=, n_row * 9 / 10);

      /* the no-shoot zone (x < 15 m) is shaded (with hatching): no pixel of a row there above
       * the band is plain background, and most are the shade colour */
      xz = (int) aw_chart_map (15.0, vp.x_min, vp.x_max, layout.side.x,
                               layout.side.x + layout.side.width) - 2;
      for (int x = (int) layout.side.x + 2; x < xz; x++)
        {
          Px p = pixel_at (surface, x, yo);
          n_zone++;
          g_assert_false (px_near (p, bg, 1));
          if (px_near (p, no_shoot, 2))
            zone_px++;
        }
      g_assert_cmpint (n_zone, >, 10);
      g_assert_cmpint (zone_px, >=, n_zone / 2);

      cairo_surface_destroy (surface);
    }
}

static void
test_render_robust (void)
{
  g_autofree AwSample *a = line_samples (20, 30.0, 1.5, 0.0, 0);
  AwPlotSeries series[1] = { { NULL, { 0 }, a, 20, true } };
  AwPlotScene scene;
  AwPlotViewport vp = { NAN, 1, 0, 1, 0, 1 };
  cairo_surface_t *surface = cairo_image_surface_create (CAIRO_FORMAT_ARGB32, 100, 80);
  cairo_t *cr = cairo_create (surface);

  a[5].z = NAN;
  a[6].x = -INFINITY;
  aw_plot_scene_init (&scene);
  scene.series = series;
  scene.n_series = 1;
  scene.show_top_view = true;
  scene.band_half_m = -1;             /* no band */
  scene.min_engagement_m = NAN;
  aw_plot_render (cr, 100, 80, &scene, &vp, NULL);       /* invalid viewport: fit */
  aw_plot_render (cr, 0, 0, &scene, NULL, NULL);         /* nothing to draw */
  aw_plot_render (cr, NAN, 50, &scene, NULL, NULL);
  aw_plot_render (cr, 100, 80, NULL, NULL, NULL);        /* empty */
  aw_plot_render (cr, 5, 5, &scene, NULL, NULL);         /* too small for axes */
  g_assert_cmpint (cairo_status (cr), ==, CAIRO_STATUS_SUCCESS);
  cairo_destroy (cr);
  cairo_surface_destroy (surface);
}

static void
test_scene_copy (void)
{
  g_autofree AwSample *a = line_samples (10, 30.0, 1.5, 0.0, 0);
  AwPlotSeries series[1] = { { "Copy me", { 0.1, 0.2, 0.3, 1 }, a, 10, true } };
  AwPlotScene scene;
  g_autoptr (AwPlotScene) copy = NULL;

  aw_plot_scene_init (&scene);
  scene.series = series;
  scene.n_series = 1;
  scene.min_engagement_m = 12;
  copy = aw_plot_scene_copy (&scene);
  a[3].z = 99;                         /* the copy does not see later changes */
  series[0].name = "changed";
  g_assert_cmpstr (copy->series[0].name, ==, "Copy me");
  g_assert_cmpfloat (copy->series[0].samples[3].z, !=, 99);
  g_assert_cmpuint (copy->series[0].n_samples, ==, 10);
  g_assert_cmpfloat (copy->min_engagement_m, ==, 12);
  g_assert_true (copy->series != series);
}

/* ---- hit-testing ---- */

static void
test_hit_test (void)
{
  g_autofree AwSample *a = NULL, *b = NULL;
  AwPlotSeries series[2];
  AwPlotScene scene;
  AwPlotViewport vp;
  AwPlotLayout layout;
  AwPlotHit hit;
  const int W = 800, H = 500;
  double px, py;
  const AwSample *target;
  g_autofree char *text = NULL;

  make_two_series_scene (&scene, series, &a, &b);
  aw_plot_viewport_fit (&scene, &vp);
  aw_plot_layout (W, H, &scene, NULL, &layout);

  /* a point just below sample 10 of Bravo (its z falls from 3.0) */
  target = &b[10];
  px = aw_chart_map (target->x, vp.x_min, vp.x_max, layout.side.x,
                     layout.side.x + layout.side.width);
  py = aw_chart_map (target->z, vp.z_min, vp.z_max, layout.side.y + layout.side.height,
                     layout.side.y) + 3;
  g_assert_true (aw_plot_hit_test (W, H, &scene, &vp, NULL, px, py, 20, &hit));
  g_assert_cmpint (hit.series, ==, 1);
  g_assert_cmpint (hit.pane, ==, AW_PLOT_PANE_SIDE);
  g_assert_cmpfloat (hit.distance_px, <=, 3.0 + 1e-9);
  /* the interpolated sample lies on Bravo's line: z follows x */
  g_assert_cmpfloat_with_epsilon (hit.sample.z, 3.0 - 0.6 * hit.sample.x / 70.0, 1e-9);
  g_assert_cmpfloat (fabs (hit.sample.x - target->x), <, 1.0);
  g_assert_cmpfloat (hit.sample.speed, <, 90.0);
  text = aw_plot_format_readout (&scene, &hit);
  g_assert_nonnull (strstr (text, "Bravo"));
  g_assert_nonnull (strstr (text, "rpm"));

  /* hide Bravo: the same point now finds Alpha or nothing near */
  series[1].visible = false;
  if (aw_plot_hit_test (W, H, &scene, &vp, NULL, px, py, 0, &hit))
    g_assert_cmpint (hit.series, ==, 0);
  series[1].visible = true;

  /* a point far from both (low in the plot) within 10 px: nothing */
  py = aw_chart_map (0.2, vp.z_min, vp.z_max, layout.side.y + layout.side.height,
                     layout.side.y);
  g_assert_false (aw_plot_hit_test (W, H, &scene, &vp, NULL, px, py, 10, &hit));
  g_assert_cmpint (hit.series, ==, -1);
  /* outside the plot area: nothing */
  g_assert_false (aw_plot_hit_test (W, H, &scene, &vp, NULL, 1, 1, 0, &hit));

  /* top view: drift −0.3 m at 70 m for Bravo (+y left is drawn up) */
  scene.show_top_view = true;
  aw_plot_layout (W, H, &scene, NULL, &layout);
  g_assert_true (layout.has_top);
  px = aw_chart_map (b[30].x, vp.x_min, vp.x_max, layout.top.x, layout.top.x + layout.top.width);
  py = aw_chart_map (b[30].y, vp.y_min, vp.y_max, layout.top.y + layout.top.height, layout.top.y);
  g_assert_true (aw_plot_hit_test (W, H, &scene, &vp, NULL, px, py, 5, &hit));
  g_assert_cmpint (hit.series, ==, 1);
  g_assert_cmpint (hit.pane, ==, AW_PLOT_PANE_TOP);
}

/* ---- export ---- */

static void
test_export (void)
{
  g_autofree AwSample *a = NULL, *b = NULL;
  AwPlotSeries series[2];
  AwPlotScene scene;
  static const struct { AwPlotFormat fmt; const char *name; const char *magic; } files[] = {
    { AW_PLOT_FORMAT_PNG, "plot-export.png", "\x89PNG\r\n\x1a\n" },
    { AW_PLOT_FORMAT_SVG, "plot-export.svg", "<?xml" },
    { AW_PLOT_FORMAT_PDF, "plot-export.pdf", "%PDF-" },
  };
  g_autofree char *pdfinfo = g_find_program_in_path ("pdfinfo");

  make_two_series_scene (&scene, series, &a, &b);
  scene.show_legend = true;

  for (guint i = 0; i < G_N_ELEMENTS (files); i++)
    {
      g_autofree char *path = g_build_filename (out_dir (), files[i].name, NULL);
      g_autofree char *data = NULL;
      GError *error = NULL;
      gsize len;
      AwPlotFormat guessed;

      g_assert_true (aw_plot_format_from_path (path, &guessed));
      g_assert_cmpint (guessed, ==, files[i].fmt);
      g_assert_true (aw_plot_export (&scene, NULL, path, files[i].fmt, 640, 400, &error));
      g_assert_no_error (error);
      data = read_file (path, &len);
      g_assert_cmpuint (len, >, 1000);
      g_assert_true (memcmp (data, files[i].magic, strlen (files[i].magic)) == 0);
      if (files[i].fmt == AW_PLOT_FORMAT_SVG)
        g_assert_nonnull (strstr (data, "<svg"));
      if (files[i].fmt == AW_PLOT_FORMAT_PNG)
        {
          cairo_surface_t *png = cairo_image_surface_create_from_png (path);
          g_assert_cmpint (cairo_surface_status (png), ==, CAIRO_STATUS_SUCCESS);
          g_assert_cmpint (cairo_image_surface_get_width (png), ==, 640);
          g_assert_cmpint (cairo_image_surface_get_height (png), ==, 400);
          cairo_surface_destroy (png);
        }
      if (files[i].fmt == AW_PLOT_FORMAT_PDF)
        {
          g_assert_nonnull (memmem (data + len - MIN (len, 64), MIN (len, 64), "%%EOF", 5));
          if (pdfinfo != NULL)
            {
              const char *argv[] = { pdfinfo, path, NULL };
              g_autofree char *out = NULL;
              int status = 0;

              g_assert_true (g_spawn_sync (NULL, (char **) argv, NULL, G_SPAWN_DEFAULT, NULL, NULL,
                                           &out, NULL, &status, &error));
              g_assert_no_error (error);
              g_assert_true (g_spawn_check_wait_status (status, NULL));
              g_assert_nonnull (strstr (out, "Pages:"));
              g_assert_true (g_regex_match_simple ("^Pages:\\s+1$", out, G_REGEX_MULTILINE, 0));
              g_assert_true (g_regex_match_simple ("^Page size:\\s+640 x 400 pts", out,
                                                   G_REGEX_MULTILINE, 0));
            }
          else
            g_test_message ("pdfinfo not found: page count not checked");
        }

      /* a bad size is refused, and the good file stays as it was */
      g_assert_false (aw_plot_export (&scene, NULL, path, files[i].fmt, 0, NAN, &error));
      g_assert_error (error, G_IO_ERROR, G_IO_ERROR_INVALID_ARGUMENT);
      g_assert_nonnull (strstr (error->message, files[i].name));
      g_clear_error (&error);
      {
        gsize len2;
        g_autofree char *again = read_file (path, &len2);
        g_assert_cmpuint (len2, ==, len);
        g_assert_true (memcmp (again, data, len) == 0);
      }
      g_unlink (path);
    }

  /* a directory that does not exist: an error naming the path, no crash */
  {
    GError *error = NULL;
    g_autofree char *path = g_build_filename (out_dir (), "no-such-dir", "x.png", NULL);

    g_assert_false (aw_plot_export (&scene, NULL, path, AW_PLOT_FORMAT_PNG, 100, 100, &error));
    g_assert_nonnull (error);
    g_assert_nonnull (strstr (error->message, "no-such-dir"));
    g_clear_error (&error);
  }
  {
    AwPlotFormat f;
    g_assert_false (aw_plot_format_from_path ("plot.jpeg", &f));
    g_assert_false (aw_plot_format_from_path ("plot", &f));
    g_assert_false (aw_plot_format_from_path ("dir.png/plot", &f));
    g_assert_true (aw_plot_format_from_path ("PLOT.PDF", &f));
  }
}

/* ---- realistic trajectories, written for a person to look at ---- */

typedef struct
{
  const char *name;
  double mass_g;
  double velocity_mps;   /* NAN: from energy */
  double energy_j;
  double lift_ratio;
} DemoSetup;

static void
test_render_realistic (void)
{
  static const DemoSetup demo[3] = {
    { "Field rifle, 0.20 g", 0.20, 90.0, NAN, 1.2 },
    { "Support, 0.28 g at 1.5 J", 0.28, NAN, 1.5, 1.6 },
    { "Marksman, 0.40 g at 2.3 J", 0.40, NAN, 2.3, 2.0 },
  };
  AwTrajectory traj[3] = { { 0 } };
  AwPlotSeries series[3];
  AwPlotScene scene;
  AwPlotViewport vp;
  AwFlightOptions opt;
  static const struct { const char *file; gboolean dark; gboolean top; AwPlotUnits units;
                        double w, h; } outs[] = {
    { "plot-light.png", FALSE, FALSE, AW_PLOT_UNITS_METRIC, 900, 520 },
    { "plot-dark.png", TRUE, FALSE, AW_PLOT_UNITS_METRIC, 900, 520 },
    { "plot-top-imperial.png", FALSE, TRUE, AW_PLOT_UNITS_IMPERIAL, 900, 680 },
    { "plot-small-dark-top.png", TRUE, TRUE, AW_PLOT_UNITS_METRIC, 480, 360 },
  };

  aw_flight_options_init (&opt);
  opt.sample_step_m = 0.5;

  for (int i = 0; i < 3; i++)
    {
      AwShot shot;
      double spin = 0;
      AwFlightStatus st;

      aw_shot_init (&shot);
      shot.mass_kg = aw_g_to_kg (demo[i].mass_g);
      shot.velocity_mps = isnan (demo[i].velocity_mps)
                            ? aw_velocity_for_energy (shot.mass_kg, demo[i].energy_j)
                            : demo[i].velocity_mps;
      shot.height_m = 1.5;
      shot.wind[1] = 2.0;     /* a 2 m/s crosswind from the right shows in the top view */
      g_assert_cmpint (aw_shot_spin_for_lift_ratio (&shot, demo[i].lift_ratio, &spin), ==,
                       AW_HOP_OK);
      shot.spin_rad_s = spin;
      st = aw_flight_run (&shot, &opt, &traj[i]);
      g_assert_cmpint (st, ==, AW_FLIGHT_GROUND);
      g_test_message ("%s: %.1f m/s, %.0f rpm, lands at %.1f m, apex %.2f m",
                      demo[i].name, shot.velocity_mps, aw_rad_s_to_rpm (spin),
                      traj[i].ground_distance, traj[i].apex_height);
      series[i] = (AwPlotSeries) { demo[i].name, { 0 }, traj[i].samples, traj[i].n_samples,
                                   true };
    }

  aw_plot_scene_init (&scene);
  scene.series = series;
  scene.n_series = 3;
  scene.muzzle_height_m = 1.5;
  scene.sight_line_m = 1.5;
  scene.band_half_m = 0.15;
  scene.min_engagement_m = 20.0;

  for (guint k = 0; k < G_N_ELEMENTS (outs); k++)
    {
      g_autofree char *path = g_build_filename (out_dir (), outs[k].file, NULL);
      GError *error = NULL;
      cairo_surface_t *png;
      Px bg, corner;
      const AwChartStyle *st = outs[k].dark ? aw_chart_style_dark () : aw_chart_style_light ();

      scene.show_top_view = outs[k].top;
      scene.units = outs[k].units;
      aw_plot_viewport_fit (&scene, &vp);
      /* the landing points are inside the fitted view */
      for (int i = 0; i < 3; i++)
        g_assert_cmpfloat (traj[i].ground_distance, <=, vp.x_max);
      g_assert_true (aw_plot_export_full (&scene, &vp, st, path, AW_PLOT_FORMAT_PNG,
                                          outs[k].w, outs[k].h, &error));
      g_assert_no_error (error);
      png = cairo_image_surface_create_from_png (path);
      g_assert_cmpint (cairo_surface_status (png), ==, CAIRO_STATUS_SUCCESS);
      /* the background follows the style */
      bg = composite (&st->background, &st->background);
      corner = pixel_at (png, 1, 1);
      g_assert_true (px_near (corner, bg, 1));
      cairo_surface_destroy (png);
      g_test_message ("wrote %s", path);
    }

  for (int i = 0; i < 3; i++)
    aw_trajectory_clear (&traj[i]);
}

int
main (int    argc,
      char **argv)
{
  setlocale (LC_ALL, "");
  setlocale (LC_NUMERIC, "C");
  g_test_init (&argc, &argv, NULL);

  g_test_add_func ("/ui/chart/nice-ticks", test_nice_ticks);
  g_test_add_func ("/ui/chart/nice-ticks-properties", test_nice_ticks_properties);
  g_test_add_func ("/ui/chart/format-number", test_format_number);
  g_test_add_func ("/ui/chart/axis-legend", test_axis_legend);
  g_test_add_func ("/ui/chart/palette", test_palette);
  g_test_add_func ("/ui/chart/sequential", test_sequential);
  g_test_add_func ("/ui/plot/viewport-fit", test_viewport_fit);
  g_test_add_func ("/ui/plot/scene-copy", test_scene_copy);
  g_test_add_func ("/ui/plot/render-band", test_render_band);
  g_test_add_func ("/ui/plot/render-robust", test_render_robust);
  g_test_add_func ("/ui/plot/hit-test", test_hit_test);
  g_test_add_func ("/ui/plot/export", test_export);
  g_test_add_func ("/ui/plot/render-realistic", test_render_realistic);

  return g_test_run ();
}
