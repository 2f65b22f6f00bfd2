/* test-gui-sweep.c: the sweep panel and its plot, headless (suite 'gui-sweep')
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Runs under a private display (xvfb-run -a, GTK_A11Y=none, GSK_RENDERER=cairo). The panel runs
 * small sweeps and maps; the widget is rendered offscreen to PNG and checked to be a real picture
 * (not one flat colour); the pictures are left in the build directory (gui-sweep-*.png) to look
 * at. Also: results kept when only the metric changes, dropped and recomputed when an input
 * changes; an edit during a sweep restarts it; Stop ends it; the main loop keeps running while a
 * sweep computes; exports write PNG, SVG, PDF and CSV files.
 */
#include "aw-config.h"

#include <math.h>
#include <string.h>
#include <glib/gstdio.h>
#include <gtk/gtk.h>

#include "aw-sweep-panel.h"
#include "aw-sweep-plot.h"

#define WAIT_S 120.0

static AwProject *
make_project (void)
{
  AwProject *p = aw_project_new ();
  AwSetup *a = aw_setup_new ("Field rifle, 0.25 g");
  AwSetup *b = aw_setup_new ("Shop pistol");
  AwSiteRules *rules = aw_site_rules_new ("Example field");
  AwSiteClassRule *rifle = aw_site_class_rule_new ("rifle");

  a->bb.mass_g = 0.25;
  a->replica.ref_mass_g = 0.20;
  a->replica.ref_velocity_mps = 115.0;
  b->bb.mass_g = 0.20;
  b->replica.ref_mass_g = 0.20;
  b->replica.ref_velocity_mps = 90.0;
  g_free (b->colour);
  b->colour = g_strdup ("#d55e00");
  g_ptr_array_add (p->setups, a);
  g_ptr_array_add (p->setups, b);
  rifle->energy_limit_j = 1.49;   /* a common outdoor limit (common practice, no source) */
  g_ptr_array_add (rules->classes, rifle);
  g_ptr_array_add (p->site_rules, rules);
  return p;
}

typedef gboolean (*Cond) (gpointer data);

static gboolean
wait_for (Cond cond, gpointer data, double seconds)
{
  gint64 end = g_get_monotonic_time () + (gint64) (seconds * G_USEC_PER_SEC);
  while (!cond (data))
    {
      if (g_get_monotonic_time () > end)
        return FALSE;
      if (!g_main_context_iteration (NULL, FALSE))
        g_usleep (2000);
    }
  return TRUE;
}

static gboolean
not_running (gpointer data)
{
  return !aw_sweep_panel_get_running (data);
}

static gboolean
has_size (gpointer data)
{
  return gtk_widget_get_width (data) > 100 && gtk_widget_get_height (data) > 100;
}

static void
pump (double seconds)
{
  gint64 end = g_get_monotonic_time () + (gint64) (seconds * G_USEC_PER_SEC);
  while (g_get_monotonic_time () < end)
    if (!g_main_context_iteration (NULL, FALSE))
      g_usleep (2000);
}

typedef struct
{
  GtkWidget *window;
  AwSweepPanel *panel;
} Fixture;

static void
fixture_setup (Fixture *f, gconstpointer data)
{
  g_autoptr (AwProject) project = make_project ();

  f->window = gtk_window_new ();
  gtk_window_set_default_size (GTK_WINDOW (f->window), 1000, 760);
  f->panel = AW_SWEEP_PANEL (aw_sweep_panel_new ());
  gtk_window_set_child (GTK_WINDOW (f->window), GTK_WIDGET (f->panel));
  aw_sweep_panel_set_project (f->panel, project);
  gtk_window_present (GTK_WINDOW (f->window));
  g_assert_true (wait_for (has_size, aw_sweep_panel_get_plot (f->panel), 30));
}

static void
fixture_teardown (Fixture *f, gconstpointer data)
{
  gtk_window_destroy (GTK_WINDOW (f->window));
  pump (0.05);
}

/* Renders the widget offscreen, saves it, and checks it is a picture: many pixels differ from
 * the corner and there are at least min_colors different colours. */
static void
check_rendering (GtkWidget *widget, const char *name, guint min_colors)
{
  int w = gtk_widget_get_width (widget), h = gtk_widget_get_height (widget);
  g_autoptr (GdkPaintable) paintable = gtk_widget_paintable_new (widget);
  GtkSnapshot *snapshot = gtk_snapshot_new ();
  g_autoptr (GskRenderNode) node = NULL;
  g_autoptr (GdkTexture) texture = NULL;
  g_autofree guchar *pixels = NULL;
  g_autoptr (GHashTable) colors = g_hash_table_new (g_direct_hash, g_direct_equal);
  g_autofree char *path = g_build_filename (g_getenv ("G_TEST_BUILDDIR") ?: ".", name, NULL);
  guint differ = 0;

  gdk_paintable_snapshot (paintable, snapshot, w, h);
  node = gtk_snapshot_free_to_node (snapshot);
  g_assert_nonnull (node);
  texture = gsk_renderer_render_texture (gtk_native_get_renderer (gtk_widget_get_native (widget)),
                                         node, &GRAPHENE_RECT_INIT (0, 0, w, h));
  g_assert_true (gdk_texture_save_to_png (texture, path));
  pixels = g_malloc ((gsize) w * h * 4);
  gdk_texture_download (texture, pixels, (gsize) w * 4);
  guint32 corner;
  memcpy (&corner, pixels, 4);
  for (gsize p = 0; p < (gsize) w * h; p++)
    {
      guint32 v;
      memcpy (&v, pixels + 4 * p, 4);
      differ += v != corner;
      g_hash_table_add (colors, GUINT_TO_POINTER (v));
    }
  g_test_message ("%s: %d × %d, %u pixels differ from the corner, %u colours", path, w, h,
                  differ, g_hash_table_size (colors));
  g_assert_cmpuint (differ, >, (guint) (0.02 * w * h));
  g_assert_cmpuint (g_hash_table_size (colors), >=, min_colors);
}

static void
check_file_starts (const char *path, const char *magic, gsize len)
{
  g_autofree char *data = NULL;
  gsize n = 0;
  g_assert_true (g_file_get_contents (path, &data, &n, NULL));
  g_assert_cmpuint (n, >, 200);
  if (memcmp (data, magic, len) != 0 && strstr (data, magic) == NULL)
    g_error ("%s does not look right", path);
}

static void
test_curves (Fixture *f, gconstpointer data)
{
  AwSweepDesc d;
  const AwSweepResult *r;
  g_autoptr (GError) error = NULL;
  g_autofree char *dir = g_dir_make_tmp ("aw-gui-sweep-XXXXXX", &error);

  g_assert_no_error (error);
  aw_sweep_desc_init (&d);
  d.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_LIFT_RATIO, 0.0, 3.0, 13 };
  aw_sweep_panel_set_desc (f->panel, &d);
  g_assert_null (aw_sweep_panel_get_result (f->panel));
  g_assert_false (aw_sweep_panel_get_running (f->panel));
  aw_sweep_panel_run (f->panel);
  g_assert_true (aw_sweep_panel_get_running (f->panel));
  g_assert_true (wait_for (not_running, f->panel, WAIT_S));
  r = aw_sweep_panel_get_result (f->panel);
  g_assert_nonnull (r);
  g_assert_cmpuint (r->n_setups, ==, 2);
  g_assert_cmpuint (r->n1, ==, 13);
  g_assert_cmpuint (r->n2, ==, 1);
  g_assert_cmpstr (r->setup_names[1], ==, "Shop pistol");
  g_assert_cmpfloat (aw_sweep_panel_get_progress (f->panel), ==, 1.0);
  /* the panel's numbers are the core's: one point again by hand */
  {
    AwSweepSetup s;
    AwSweepPoint p;
    AwProject *copy = make_project ();
    g_assert_true (aw_sweep_setup_from_project (&s, g_ptr_array_index (copy->setups, 0), copy,
                                                NULL));
    aw_sweep_eval_point (&s, &r->desc, r->values1[6], NAN, &p);
    g_assert_cmpmem (&p, sizeof p, aw_sweep_result_point (r, 0, 6, 0), sizeof p);
    aw_project_free (copy);
  }
  pump (0.1);
  check_rendering (GTK_WIDGET (f->panel), "gui-sweep-panel-curves.png", 8);

  /* hover over a point shows the marker (the picture changes) */
  {
    GtkWidget *plot = aw_sweep_panel_get_plot (f->panel);
    AwSweepPlotScene scene;
    AwSweepPlotLayout lay;
    aw_sweep_plot_scene_init (&scene);
    scene.result = r;
    g_assert_true (aw_sweep_plot_layout (gtk_widget_get_width (plot), gtk_widget_get_height (plot),
                                         &scene, aw_chart_style_light (), &lay));
    double x = aw_chart_map (r->values1[6], lay.x_lo, lay.x_hi, lay.panels[0].x,
                             lay.panels[0].x + lay.panels[0].width);
    double v = aw_sweep_result_value (r, 0, 6, 0, AW_SWEEP_METRIC_BAND_RANGE);
    double y = aw_chart_map (v, lay.y_lo, lay.y_hi, lay.panels[0].y + lay.panels[0].height,
                             lay.panels[0].y);
    aw_sweep_panel_show_readout_at (f->panel, x + 2, y - 2);
    pump (0.1);
    check_rendering (plot, "gui-sweep-panel-hover.png", 8);
    aw_sweep_panel_show_readout_at (f->panel, NAN, NAN);
  }

  /* exports */
  {
    g_autofree char *png = g_build_filename (dir, "s.png", NULL);
    g_autofree char *svg = g_build_filename (dir, "s.svg", NULL);
    g_autofree char *pdf = g_build_filename (dir, "s.pdf", NULL);
    g_autofree char *csv = g_build_filename (dir, "s.csv", NULL);
    g_autofree char *text = NULL;
    g_auto (GStrv) lines = NULL;
    g_assert_true (aw_sweep_panel_export (f->panel, png, FALSE, AW_PLOT_FORMAT_PNG, 0, 0, &error));
    g_assert_true (aw_sweep_panel_export (f->panel, svg, FALSE, AW_PLOT_FORMAT_SVG, 0, 0, &error));
    g_assert_true (aw_sweep_panel_export (f->panel, pdf, FALSE, AW_PLOT_FORMAT_PDF, 0, 0, &error));
    g_assert_true (aw_sweep_panel_export (f->panel, csv, TRUE, AW_PLOT_FORMAT_PNG, 0, 0, &error));
    g_assert_no_error (error);
    check_file_starts (png, "\x89PNG", 4);
    check_file_starts (svg, "<svg", 4);
    check_file_starts (pdf, "%PDF-", 5);
    g_assert_true (g_file_get_contents (csv, &text, NULL, NULL));
    lines = g_strsplit (text, "\r\n", -1);
    g_assert_cmpuint (g_strv_length (lines), ==, 1 + 26 + 1);   /* header, points, "" */
    g_assert_true (g_str_has_prefix (lines[0], "setup,lift_ratio,band_range_m,"));
    /* a file that cannot be written: an error naming it, nothing else changes */
    g_autofree char *bad = g_build_filename (dir, "no", "such", "s.png", NULL);
    g_assert_false (aw_sweep_panel_export (f->panel, bad, FALSE, AW_PLOT_FORMAT_PNG, 0, 0,
                                           &error));
    g_assert_nonnull (error);
    g_clear_error (&error);
    g_assert_nonnull (aw_sweep_panel_get_result (f->panel));
    g_remove (png);
    g_remove (svg);
    g_remove (pdf);
    g_remove (csv);
    g_rmdir (dir);
  }
}

static void
test_map_and_inputs (Fixture *f, gconstpointer data)
{
  AwSweepDesc d;
  const AwSweepResult *r;
  guint runs;

  aw_sweep_desc_init (&d);
  d.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_MASS_G, 0.20, 0.45, 14 };
  d.axis[1] = (AwSweepAxis) { AW_SWEEP_VAR_ENERGY_J, 0.8, 2.0, 12 };
  aw_sweep_panel_set_desc (f->panel, &d);
  aw_sweep_panel_run (f->panel);
  g_assert_true (wait_for (not_running, f->panel, WAIT_S));
  r = aw_sweep_panel_get_result (f->panel);
  g_assert_nonnull (r);
  g_assert_cmpuint (r->n1, ==, 14);
  g_assert_cmpuint (r->n2, ==, 12);
  pump (0.1);
  /* a heat map: a whole scale of colours */
  check_rendering (GTK_WIDGET (f->panel), "gui-sweep-panel-map.png", 40);

  /* another metric: the same results, drawn again, nothing computed */
  runs = aw_sweep_panel_get_runs_started (f->panel);
  aw_sweep_panel_set_metric (f->panel, AW_SWEEP_METRIC_SPEED_AT);
  g_assert_true (aw_sweep_panel_get_result (f->panel) == r);
  g_assert_false (aw_sweep_panel_get_running (f->panel));
  g_assert_cmpuint (aw_sweep_panel_get_runs_started (f->panel), ==, runs);

  /* a site limit is an input: the results go, and (after Run) the sweep runs again */
  aw_sweep_panel_set_metric (f->panel, AW_SWEEP_METRIC_COMPLIANCE);
  aw_sweep_panel_set_site_class (f->panel, 1);
  g_assert_null (aw_sweep_panel_get_result (f->panel));
  g_assert_true (aw_sweep_panel_get_running (f->panel));
  g_assert_true (wait_for (not_running, f->panel, WAIT_S));
  r = aw_sweep_panel_get_result (f->panel);
  g_assert_nonnull (r);
  g_assert_cmpuint (aw_sweep_panel_get_runs_started (f->panel), ==, runs + 1);
  g_assert_cmpfloat (r->desc.site.energy_limit_j, ==, 1.49);
  g_assert_true (isfinite (aw_sweep_result_value (r, 0, 3, 3, AW_SWEEP_METRIC_COMPLIANCE)));
  pump (0.1);
  check_rendering (GTK_WIDGET (f->panel), "gui-sweep-panel-map-compliance.png", 40);

  /* a setup left out is an input too */
  aw_sweep_panel_set_setup_included (f->panel, "Shop pistol", FALSE);
  g_assert_null (aw_sweep_panel_get_result (f->panel));
  g_assert_true (wait_for (not_running, f->panel, WAIT_S));
  r = aw_sweep_panel_get_result (f->panel);
  g_assert_nonnull (r);
  g_assert_cmpuint (r->n_setups, ==, 1);
  g_assert_false (aw_sweep_panel_get_setup_included (f->panel, "Shop pistol"));

  /* the same project again changes nothing; an edited setup does */
  {
    g_autoptr (AwProject) p = make_project ();
    runs = aw_sweep_panel_get_runs_started (f->panel);
    aw_sweep_panel_set_project (f->panel, p);
    g_assert_true (aw_sweep_panel_get_result (f->panel) == r);
    ((AwSetup *) g_ptr_array_index (p->setups, 0))->muzzle_height_m = 1.0;
    aw_sweep_panel_set_project (f->panel, p);
    g_assert_null (aw_sweep_panel_get_result (f->panel));
    g_assert_true (wait_for (not_running, f->panel, WAIT_S));
    g_assert_nonnull (aw_sweep_panel_get_result (f->panel));
    g_assert_cmpuint (aw_sweep_panel_get_runs_started (f->panel), ==, runs + 1);
  }
}

typedef struct
{
  gint64 last;
  gint64 max_gap;
} Ticks;

static gboolean
tick (gpointer data)
{
  Ticks *t = data;
  gint64 now = g_get_monotonic_time ();
  if (t->last)
    t->max_gap = MAX (t->max_gap, now - t->last);
  t->last = now;
  return G_SOURCE_CONTINUE;
}

static gboolean
started_and_progressing (gpointer data)
{
  return aw_sweep_panel_get_progress (data) > 0.0;
}

static void
test_restart_and_stop (Fixture *f, gconstpointer data)
{
  AwSweepDesc big, small;
  Ticks ticks = { 0, 0 };
  guint id, runs;
  gint64 t0;

  aw_sweep_desc_init (&big);
  big.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_MASS_G, 0.20, 0.48, 160 };
  big.axis[1] = (AwSweepAxis) { AW_SWEEP_VAR_ENERGY_J, 0.8, 2.0, 160 };
  small = big;
  small.axis[0].n = 9;
  small.axis[1].n = 7;

  /* the window keeps running while the sweep computes */
  aw_sweep_panel_set_desc (f->panel, &big);
  id = g_timeout_add (10, tick, &ticks);
  aw_sweep_panel_run (f->panel);
  runs = aw_sweep_panel_get_runs_started (f->panel);
  g_assert_true (wait_for (started_and_progressing, f->panel, WAIT_S));
  pump (0.3);
  g_assert_true (aw_sweep_panel_get_running (f->panel));
  g_test_message ("longest pause of the main loop during the sweep: %.1f ms",
                  ticks.max_gap / 1000.0);
  /* a sweep of seconds on the main thread would freeze it that long; 0.5 s is far above a
   * normal frame and far below the sweep */
  g_assert_cmpint (ticks.max_gap, <, G_USEC_PER_SEC / 2);
  g_source_remove (id);

  /* an edit meanwhile: the big sweep is dropped and the new one runs */
  aw_sweep_panel_set_desc (f->panel, &small);
  g_assert_true (aw_sweep_panel_get_running (f->panel));
  g_assert_true (wait_for (not_running, f->panel, WAIT_S));
  g_assert_cmpuint (aw_sweep_panel_get_runs_started (f->panel), ==, runs + 1);
  g_assert_nonnull (aw_sweep_panel_get_result (f->panel));
  g_assert_cmpuint (aw_sweep_panel_get_result (f->panel)->n1, ==, 9);
  g_assert_cmpuint (aw_sweep_panel_get_result (f->panel)->n2, ==, 7);

  /* Stop: at once, no result, and none arrives later */
  aw_sweep_panel_set_desc (f->panel, &big);
  g_assert_true (wait_for (started_and_progressing, f->panel, WAIT_S));
  t0 = g_get_monotonic_time ();
  aw_sweep_panel_stop (f->panel);
  g_assert_false (aw_sweep_panel_get_running (f->panel));
  g_test_message ("stop took %.2f ms", (g_get_monotonic_time () - t0) / 1000.0);
  pump (0.5);
  g_assert_null (aw_sweep_panel_get_result (f->panel));
  g_assert_false (aw_sweep_panel_get_running (f->panel));

  /* after Stop an edit does not start a sweep */
  runs = aw_sweep_panel_get_runs_started (f->panel);
  aw_sweep_panel_set_desc (f->panel, &small);
  pump (0.5);
  g_assert_cmpuint (aw_sweep_panel_get_runs_started (f->panel), ==, runs);
  g_assert_false (aw_sweep_panel_get_running (f->panel));

  /* closing the window during a sweep: nothing arrives at a dead panel */
  aw_sweep_panel_set_desc (f->panel, &big);
  aw_sweep_panel_run (f->panel);
  g_assert_true (wait_for (started_and_progressing, f->panel, WAIT_S));
}

/* The renderer on its own: curves with gaps, maps with gaps, both styles, hit-testing. */
static void
test_renderer (void)
{
  AwSweepSetup s[2];
  AwSweepDesc d;
  AwSweepPlotScene scene;
  AwSweepPlotHit hit;
  AwSweepPlotLayout lay;
  g_autoptr (AwSweepResult) curves = NULL;
  g_autoptr (AwSweepResult) map = NULL;
  const AwChartStyle *styles[] = { aw_chart_style_light (), aw_chart_style_dark () };
  const char *style_names[] = { "light", "dark" };

  aw_sweep_setup_init (&s[0], "Light BB, 0.12 g");
  s[0].input.shot.mass_kg = 0.12e-3;
  aw_sweep_setup_init (&s[1], "0.30 g");
  s[1].input.shot.mass_kg = 0.30e-3;
  aw_sweep_desc_init (&d);
  /* energies where the 0.12 g BB goes past 300 m/s: a gap in its curve */
  d.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_ENERGY_J, 0.6, 7.0, 33 };
  curves = aw_sweep_run (s, 2, &d, 0, NULL, NULL, NULL, NULL);
  g_assert_nonnull (curves);
  d.axis[0] = (AwSweepAxis) { AW_SWEEP_VAR_LIFT_RATIO, 0.0, 3.0, 40 };
  d.axis[1] = (AwSweepAxis) { AW_SWEEP_VAR_ENERGY_J, 0.5, 6.5, 30 };
  map = aw_sweep_run (s, 2, &d, 0, NULL, NULL, NULL, NULL);
  g_assert_nonnull (map);

  aw_sweep_plot_scene_init (&scene);
  for (guint k = 0; k < 2; k++)
    for (guint which = 0; which < 2; which++)
      {
        g_autofree char *name = g_strdup_printf ("gui-sweep-render-%s-%s.png",
                                                 which ? "map" : "curves", style_names[k]);
        g_autofree char *path = g_build_filename (g_getenv ("G_TEST_BUILDDIR") ?: ".", name,
                                                  NULL);
        scene.result = which ? map : curves;
        scene.metric = which ? AW_SWEEP_METRIC_BAND_RANGE : AW_SWEEP_METRIC_SPEED_AT;
        g_assert_true (aw_sweep_plot_export (&scene, styles[k], path, AW_PLOT_FORMAT_PNG, 900,
                                             560, NULL));
        cairo_surface_t *img = cairo_image_surface_create_from_png (path);
        g_assert_cmpint (cairo_surface_status (img), ==, CAIRO_STATUS_SUCCESS);
        g_assert_cmpint (cairo_image_surface_get_width (img), ==, 900);
        cairo_surface_destroy (img);
      }

  /* hit-testing a curve point returns that point; the readout names setup and value */
  scene.result = curves;
  scene.metric = AW_SWEEP_METRIC_SPEED_AT;
  g_assert_true (aw_sweep_plot_layout (900, 560, &scene, NULL, &lay));
  g_assert_false (lay.map);
  {
    double v = aw_sweep_result_value (curves, 1, 10, 0, AW_SWEEP_METRIC_SPEED_AT);
    double x = aw_chart_map (curves->values1[10], lay.x_lo, lay.x_hi, lay.panels[0].x,
                             lay.panels[0].x + lay.panels[0].width);
    double y = aw_chart_map (v, lay.y_lo, lay.y_hi, lay.panels[0].y + lay.panels[0].height,
                             lay.panels[0].y);
    g_assert_true (aw_sweep_plot_hit_test (900, 560, &scene, NULL, x + 1, y + 1, 20, &hit));
    g_assert_cmpuint (hit.setup, ==, 1);
    g_assert_cmpuint (hit.i1, ==, 10);
    g_autofree char *text = aw_sweep_plot_format_readout (&scene, &hit);
    g_assert_nonnull (strstr (text, "0.30 g"));
    g_assert_false (aw_sweep_plot_hit_test (900, 560, &scene, NULL, 1, 1, 20, &hit));
  }

  /* maps: the cell under the pointer, with the panel of its setup */
  scene.result = map;
  scene.metric = AW_SWEEP_METRIC_BAND_RANGE;
  g_assert_true (aw_sweep_plot_layout (900, 560, &scene, NULL, &lay));
  g_assert_true (lay.map);
  g_assert_cmpuint (lay.n_panels, ==, 2);
  {
    const AwChartRect *a = &lay.panels[1];
    double x = aw_chart_map (map->values1[7], lay.x_lo, lay.x_hi, a->x, a->x + a->width);
    double y = aw_chart_map (map->values2[20], lay.y_lo, lay.y_hi, a->y + a->height, a->y);
    g_assert_true (aw_sweep_plot_hit_test (900, 560, &scene, NULL, x, y, 0, &hit));
    g_assert_cmpuint (hit.setup, ==, 1);
    g_assert_cmpuint (hit.i1, ==, 7);
    g_assert_cmpuint (hit.i2, ==, 20);
  }

  /* nothing to show: a message, no crash */
  scene.result = NULL;
  scene.message = "—";
  g_assert_false (aw_sweep_plot_layout (900, 560, &scene, NULL, &lay));
  g_assert_false (aw_sweep_plot_hit_test (900, 560, &scene, NULL, 10, 10, 0, &hit));
}

int
main (int argc, char **argv)
{
  gtk_test_init (&argc, &argv, NULL);
  /* no animations: a widget in mid-transition is a state no check waits for */
  g_object_set (gtk_settings_get_default (), "gtk-enable-animations", FALSE, NULL);

  g_test_add_func ("/gui-sweep/renderer", test_renderer);
  g_test_add ("/gui-sweep/panel/curves", Fixture, NULL, fixture_setup, test_curves,
              fixture_teardown);
  g_test_add ("/gui-sweep/panel/map-and-inputs", Fixture, NULL, fixture_setup,
              test_map_and_inputs, fixture_teardown);
  g_test_add ("/gui-sweep/panel/restart-and-stop", Fixture, NULL, fixture_setup,
              test_restart_and_stop, fixture_teardown);
  return g_test_run ();
}
