/* test-plot-view.c: the interactive flight plot widget, rendered offscreen
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Run under a private display: xvfb-run -a, GTK_A11Y=none, GSK_RENDERER=cairo,
 * GSETTINGS_BACKEND=memory (meson sets these).
 */
#include "aw-config.h"

#include <math.h>
#include <string.h>
#include <glib/gstdio.h>
#include <gtk/gtk.h>

#include "aw-plot-view.h"

#define W 800
#define H 480

static const char *
out_dir (void)
{
  const char *dir = g_getenv ("G_TEST_BUILDDIR");

  return dir ? dir : g_get_tmp_dir ();
}

/* Three invented flights: a level start, then a fall (like a hopped BB). */
static AwSample *
fake_flight (size_t n,
             double x_end,
             double rise)
{
  AwSample *s = g_new0 (AwSample, n);

  for (size_t i = 0; i < n; i++)
    {
      double u = (double) i / (n - 1);

      s[i].x = u * x_end;
      s[i].z = 1.5 + rise * sin (G_PI * u) - 1.5 * pow (u, 4);
      s[i].y = 0.3 * u * u;
      s[i].t = u * 0.9;
      s[i].speed = 95.0 - 45.0 * u;
      s[i].energy = 0.5 * 0.00025 * s[i].speed * s[i].speed;
      s[i].spin = 900.0 - 200.0 * u;
    }
  return s;
}

typedef struct
{
  GtkWidget *window;
  GtkWidget *view;
  AwSample *samples[3];
  AwPlotSeries series[3];
  AwPlotScene scene;
} Fixture;

static gboolean
count_tick (GtkWidget     *widget,
            GdkFrameClock *clock,
            gpointer       data)
{
  (*(int *) data)++;
  return G_SOURCE_CONTINUE;
}

/* Runs the main loop until the widget is mapped, has a size, and two frames have passed (the
 * second one after its latest queue_draw). */
static void
wait_until_drawn (GtkWidget *widget)
{
  int ticks = 0;
  guint id = gtk_widget_add_tick_callback (widget, count_tick, &ticks, NULL);

  gtk_widget_queue_draw (widget);
  for (int i = 0; i < 5000 && (gtk_widget_get_width (widget) <= 0
                               || !gtk_widget_get_mapped (widget) || ticks < 3); i++)
    {
      while (g_main_context_iteration (NULL, FALSE))
        ;
      g_usleep (1000);
    }
  gtk_widget_remove_tick_callback (widget, id);
  while (g_main_context_iteration (NULL, FALSE))
    ;
  g_assert_cmpint (ticks, >=, 3);
}

static void
fixture_setup (Fixture       *f,
               gconstpointer  data)
{
  static const char *names[3] = { "Left wing", "Centre", "Long gun" };

  for (int i = 0; i < 3; i++)
    {
      f->samples[i] = fake_flight (120, 40.0 + 15.0 * i, 0.1 * i);
      f->series[i] = (AwPlotSeries) { names[i], { 0 }, f->samples[i], 120, true };
    }
  aw_plot_scene_init (&f->scene);
  f->scene.series = f->series;
  f->scene.n_series = 3;
  f->scene.sight_line_m = 1.5;
  f->scene.band_half_m = 0.15;
  f->scene.muzzle_height_m = 1.5;
  f->scene.min_engagement_m = 15.0;

  g_object_set (gtk_settings_get_default (), "gtk-application-prefer-dark-theme",
                GPOINTER_TO_INT (data), NULL);
  f->window = gtk_window_new ();
  gtk_window_set_default_size (GTK_WINDOW (f->window), W, H);
  f->view = aw_plot_view_new ();
  gtk_window_set_child (GTK_WINDOW (f->window), f->view);
  aw_plot_view_set_scene (AW_PLOT_VIEW (f->view), &f->scene, FALSE);
  gtk_window_present (GTK_WINDOW (f->window));
  wait_until_drawn (f->view);
}

static void
fixture_teardown (Fixture       *f,
                  gconstpointer  data)
{
  gtk_window_destroy (GTK_WINDOW (f->window));
  for (int i = 0; i < 3; i++)
    g_free (f->samples[i]);
  while (g_main_context_iteration (NULL, FALSE))
    ;
}

/* Offscreen rendering of the widget into a cairo image surface (ARGB32). */
static cairo_surface_t *
render_widget (GtkWidget  *widget,
               const char *png_name)
{
  int w = gtk_widget_get_width (widget), h = gtk_widget_get_height (widget);
  GdkPaintable *paintable = gtk_widget_paintable_new (widget);
  GtkSnapshot *snapshot = gtk_snapshot_new ();
  GskRenderNode *node;
  GskRenderer *renderer;
  GdkTexture *texture;
  cairo_surface_t *surface;

  wait_until_drawn (widget);
  w = gtk_widget_get_width (widget);
  h = gtk_widget_get_height (widget);
  g_assert_cmpint (w, >, 0);
  g_assert_cmpint (h, >, 0);
  gdk_paintable_snapshot (paintable, snapshot, w, h);
  node = gtk_snapshot_free_to_node (snapshot);
  g_assert_nonnull (node);
  renderer = gtk_native_get_renderer (gtk_widget_get_native (widget));
  texture = gsk_renderer_render_texture (renderer, node, &GRAPHENE_RECT_INIT (0, 0, w, h));
  if (png_name != NULL)
    {
      g_autofree char *path = g_build_filename (out_dir (), png_name, NULL);
      g_assert_true (gdk_texture_save_to_png (texture, path));
      g_test_message ("wrote %s", path);
    }
  surface = cairo_image_surface_create (CAIRO_FORMAT_ARGB32, w, h);
  gdk_texture_download (texture, cairo_image_surface_get_data (surface),
                        cairo_image_surface_get_stride (surface));
  cairo_surface_mark_dirty (surface);
  gsk_render_node_unref (node);
  g_object_unref (texture);
  g_object_unref (paintable);
  return surface;
}

static guint32
pixel (cairo_surface_t *s,
       int              x,
       int              y)
{
  unsigned char *data = cairo_image_surface_get_data (s);
  return *(guint32 *) (data + y * cairo_image_surface_get_stride (s) + x * 4) & 0xffffff;
}

static guint32
rgb_of (const AwRgba *c)
{
  return (guint32) lround (c->r * 255) << 16 | (guint32) lround (c->g * 255) << 8
         | (guint32) lround (c->b * 255);
}

/* The widget picks the chart style from its own text colour. */
static void
test_theme (Fixture       *f,
            gconstpointer  data)
{
  gboolean dark = GPOINTER_TO_INT (data);
  const AwChartStyle *st = dark ? aw_chart_style_dark () : aw_chart_style_light ();
  cairo_surface_t *s = render_widget (f->view, dark ? "plot-view-dark.png"
                                                    : "plot-view-light.png");

  g_assert_cmphex (pixel (s, 4, 4), ==, rgb_of (&st->background));
  cairo_surface_destroy (s);
}

/* The hover readout appears near the point and names the nearest setup. */
static void
test_readout (Fixture       *f,
              gconstpointer  data)
{
  AwPlotViewport vp;
  AwPlotLayout layout;
  cairo_surface_t *before, *after;
  double px, py;
  int changed = 0;
  const AwChartStyle *st = GPOINTER_TO_INT (data) ? aw_chart_style_dark ()
                                                 : aw_chart_style_light ();

  aw_plot_view_get_viewport (AW_PLOT_VIEW (f->view), &vp);
  aw_plot_layout (gtk_widget_get_width (f->view), gtk_widget_get_height (f->view),
                  aw_plot_view_get_scene (AW_PLOT_VIEW (f->view)), st, &layout);
  /* sample 40 of "Long gun" (x = 70 · 40/119 m) */
  px = aw_chart_map (f->samples[2][40].x, vp.x_min, vp.x_max, layout.side.x,
                     layout.side.x + layout.side.width);
  py = aw_chart_map (f->samples[2][40].z, vp.z_min, vp.z_max,
                     layout.side.y + layout.side.height, layout.side.y);

  before = render_widget (f->view, NULL);
  aw_plot_view_show_readout_at (AW_PLOT_VIEW (f->view), px, py);
  after = render_widget (f->view, GPOINTER_TO_INT (data) ? "plot-view-readout-dark.png"
                                                         : "plot-view-readout-light.png");
  /* the box is below-right of the point (or flipped near the edges): count changed pixels in a
   * 200 × 150 window around the point */
  for (int y = MAX (0, (int) py - 150); y < MIN (H, (int) py + 150); y++)
    for (int x = MAX (0, (int) px - 200); x < MIN (W, (int) px + 200); x++)
      if (pixel (before, x, y) != pixel (after, x, y))
        changed++;
  g_test_message ("readout changed %d pixels", changed);
  g_assert_cmpint (changed, >, 3000);

  /* hidden again */
  aw_plot_view_show_readout_at (AW_PLOT_VIEW (f->view), NAN, NAN);
  cairo_surface_destroy (after);
  after = render_widget (f->view, NULL);
  changed = 0;
  for (int y = 0; y < H; y++)
    for (int x = 0; x < W; x++)
      if (pixel (before, x, y) != pixel (after, x, y))
        changed++;
  g_assert_cmpint (changed, ==, 0);
  cairo_surface_destroy (before);
  cairo_surface_destroy (after);
}

static void
on_notify (GObject    *object,
           GParamSpec *pspec,
           int        *count)
{
  (*count)++;
}

static void
test_zoom (Fixture       *f,
           gconstpointer  data)
{
  AwPlotView *view = AW_PLOT_VIEW (f->view);
  AwPlotViewport fit, vp;
  int notified = 0;

  g_signal_connect (view, "notify::zoomed", G_CALLBACK (on_notify), &notified);
  aw_plot_view_get_viewport (view, &fit);
  g_assert_false (aw_plot_view_get_zoomed (view));

  g_assert_true (gtk_widget_activate_action (f->view, "plot.zoom-in", NULL));
  aw_plot_view_get_viewport (view, &vp);
  g_assert_true (aw_plot_view_get_zoomed (view));
  g_assert_cmpint (notified, ==, 1);
  g_assert_cmpfloat_with_epsilon (vp.x_max - vp.x_min, (fit.x_max - fit.x_min) / 1.25, 1e-9);

  /* a new scene keeps a zoomed view when asked */
  aw_plot_view_set_scene (view, &f->scene, TRUE);
  {
    AwPlotViewport kept;
    aw_plot_view_get_viewport (view, &kept);
    g_assert_true (memcmp (&kept, &vp, sizeof vp) == 0);
  }

  g_assert_true (gtk_widget_activate_action (f->view, "plot.reset", NULL));
  aw_plot_view_get_viewport (view, &vp);
  g_assert_false (aw_plot_view_get_zoomed (view));
  g_assert_cmpint (notified, ==, 2);
  g_assert_true (memcmp (&vp, &fit, sizeof vp) == 0);

  g_assert_true (gtk_widget_activate_action (f->view, "plot.zoom-out", NULL));
  aw_plot_view_get_viewport (view, &vp);
  g_assert_cmpfloat (vp.x_max - vp.x_min, >, fit.x_max - fit.x_min);

  /* hiding a series and the top view redraw without trouble */
  aw_plot_view_set_series_visible (view, 1, FALSE);
  aw_plot_view_set_show_top_view (view, TRUE);
  g_assert_true (aw_plot_view_get_show_top_view (view));
  aw_plot_view_set_units (view, AW_PLOT_UNITS_IMPERIAL);
  cairo_surface_destroy (render_widget (f->view, GPOINTER_TO_INT (data)
                                                   ? "plot-view-top-dark.png"
                                                   : "plot-view-top-light.png"));
  g_assert_false (aw_plot_view_get_scene (view)->series[1].visible);
  /* the caller's scene is not touched */
  g_assert_true (f->series[1].visible);
}

static void
test_accessible (Fixture       *f,
                 gconstpointer  data)
{
  char *err;

  g_assert_true (gtk_test_accessible_has_role (GTK_ACCESSIBLE (f->view),
                                               GTK_ACCESSIBLE_ROLE_IMG));
  err = gtk_test_accessible_check_property (GTK_ACCESSIBLE (f->view),
                                            GTK_ACCESSIBLE_PROPERTY_LABEL, "Flight plot");
  g_assert_null (err);
  g_assert_true (gtk_widget_get_focusable (f->view));
}

static void
test_export (Fixture       *f,
             gconstpointer  data)
{
  g_autofree char *path = g_build_filename (out_dir (), "plot-view-export.pdf", NULL);
  g_autofree char *contents = NULL;
  GError *error = NULL;
  gsize len;

  g_assert_true (aw_plot_view_export (AW_PLOT_VIEW (f->view), path, AW_PLOT_FORMAT_PDF, 595, 420,
                                      &error));
  g_assert_no_error (error);
  g_assert_true (g_file_get_contents (path, &contents, &len, NULL));
  g_assert_true (len > 5 && memcmp (contents, "%PDF-", 5) == 0);
  g_unlink (path);
}

static void
test_empty (void)
{
  GtkWidget *window = gtk_window_new ();
  GtkWidget *view = aw_plot_view_new ();
  cairo_surface_t *s;

  gtk_window_set_default_size (GTK_WINDOW (window), 300, 200);
  gtk_window_set_child (GTK_WINDOW (window), view);
  gtk_window_present (GTK_WINDOW (window));
  wait_until_drawn (view);
  s = render_widget (view, "plot-view-empty.png");
  g_assert_null (aw_plot_view_get_scene (AW_PLOT_VIEW (view)));
  aw_plot_view_zoom (AW_PLOT_VIEW (view), 2.0);
  aw_plot_view_reset_view (AW_PLOT_VIEW (view));
  cairo_surface_destroy (s);
  gtk_window_destroy (GTK_WINDOW (window));
}

int
main (int    argc,
      char **argv)
{
  /* the in-process "test" accessibility backend (no bus) so accessible properties can be read */
  g_setenv ("GTK_A11Y", "test", TRUE);
  gtk_test_init (&argc, &argv, NULL);
  /* no animations: a widget in mid-transition is a state no check waits for */
  g_object_set (gtk_settings_get_default (), "gtk-enable-animations", FALSE, NULL);

  for (int dark = 0; dark < 2; dark++)
    {
      g_autofree char *theme = g_strdup_printf ("/ui/plot-view/%s/", dark ? "dark" : "light");
      struct { const char *name; void (*func) (Fixture *, gconstpointer); } tests[] = {
        { "theme", test_theme },
        { "readout", test_readout },
        { "zoom", test_zoom },
        { "accessible", test_accessible },
        { "export", test_export },
      };

      for (guint i = 0; i < G_N_ELEMENTS (tests); i++)
        {
          g_autofree char *path = g_strconcat (theme, tests[i].name, NULL);
          g_test_add (path, Fixture, GINT_TO_POINTER (dark), fixture_setup, tests[i].func,
                      fixture_teardown);
        }
    }
  g_test_add_func ("/ui/plot-view/empty", test_empty);

  return g_test_run ();
}
