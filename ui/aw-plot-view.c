/* aw-plot-view.c: interactive flight plot widget
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <math.h>
#include <string.h>
#include <glib/gi18n.h>

#include "aw-plot-view.h"

#define ZOOM_STEP        1.25   /* one key press or one wheel notch */
#define PAN_FRACTION     0.1    /* one arrow key press, of the visible range */
#define HOVER_MAX_PX     48.0

struct _AwPlotView
{
  GtkWidget parent_instance;

  /* owned */
  AwPlotScene *scene;            /* deep copy, NULL when empty */
  AwPlotViewport vp;
  gboolean zoomed;
  gboolean show_top_view;
  gboolean show_legend;
  AwPlotUnits units;

  /* interaction state */
  AwPlotViewport drag_vp;
  AwPlotPane drag_pane;
  gboolean dragging;
  gboolean pointer_inside;
  double pointer_x, pointer_y;
};

G_DEFINE_FINAL_TYPE (AwPlotView, aw_plot_view, GTK_TYPE_WIDGET)

enum
{
  PROP_0,
  PROP_SHOW_TOP_VIEW,
  PROP_SHOW_LEGEND,
  PROP_ZOOMED,
  N_PROPS
};

static GParamSpec *properties[N_PROPS];

/* ---- helpers ---- */

static const AwPlotScene *
current_scene (AwPlotView  *self,
               AwPlotScene *empty)
{
  if (self->scene != NULL)
    return self->scene;
  aw_plot_scene_init (empty);
  empty->show_top_view = self->show_top_view;
  empty->show_legend = self->show_legend;
  empty->units = self->units;
  return empty;
}

/* The chart style that suits the widget's colours: dark when its text colour is light. */
static void
pick_style (AwPlotView   *self,
            AwChartStyle *style)
{
  GtkStyleContext *ctx;
  GdkRGBA fg;
  AwRgba c;
  PangoContext *pctx;
  const PangoFontDescription *desc;

  G_GNUC_BEGIN_IGNORE_DEPRECATIONS
  ctx = gtk_widget_get_style_context (GTK_WIDGET (self));
  gtk_style_context_get_color (ctx, &fg);
  G_GNUC_END_IGNORE_DEPRECATIONS
  c.r = fg.red;
  c.g = fg.green;
  c.b = fg.blue;
  c.a = 1.0;
  *style = *(aw_rgba_luminance (&c) > 0.4 ? aw_chart_style_dark () : aw_chart_style_light ());

  /* follow the desktop font size (GTK lays out at 96 dpi: pt × 96/72 = px) */
  pctx = gtk_widget_get_pango_context (GTK_WIDGET (self));
  desc = pctx ? pango_context_get_font_description (pctx) : NULL;
  if (desc != NULL && pango_font_description_get_size (desc) > 0)
    {
      double px = (double) pango_font_description_get_size (desc) / PANGO_SCALE;

      if (!pango_font_description_get_size_is_absolute (desc))
        px *= 96.0 / 72.0;
      px = CLAMP (px * 0.92, 9.0, 28.0);
      style->title_size = style->title_size * px / style->font_size;
      style->font_size = px;
    }
}

static void
update_accessible (AwPlotView *self)
{
  g_autoptr (GString) desc = g_string_new (NULL);

  if (self->scene != NULL)
    for (size_t i = 0; i < self->scene->n_series; i++)
      {
        const AwPlotSeries *s = &self->scene->series[i];

        if (!s->visible || s->n_samples == 0)
          continue;
        if (desc->len)
          g_string_append (desc, "; ");
        /* TRANSLATORS: accessible description of one curve: setup name, where the flight ends */
        g_string_append_printf (desc, _("%s, flight ends at %.0f m"),
                                s->name ? s->name : "", s->samples[s->n_samples - 1].x);
      }
  if (desc->len == 0)
    g_string_append (desc, _("No setups shown"));

  gtk_accessible_update_property (GTK_ACCESSIBLE (self),
                                  GTK_ACCESSIBLE_PROPERTY_LABEL, _("Flight plot"),
                                  GTK_ACCESSIBLE_PROPERTY_DESCRIPTION, desc->str,
                                  -1);
}

static gboolean
viewport_equal (const AwPlotViewport *a,
                const AwPlotViewport *b)
{
  return memcmp (a, b, sizeof *a) == 0;
}

static void
set_zoomed (AwPlotView *self,
            gboolean    zoomed)
{
  zoomed = !!zoomed;
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "plot.reset", zoomed);
  if (self->zoomed == zoomed)
    return;
  self->zoomed = zoomed;
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_ZOOMED]);
}

static void
viewport_changed (AwPlotView *self)
{
  AwPlotScene empty;
  AwPlotViewport fit;

  aw_plot_viewport_fit (current_scene (self, &empty), &fit);
  set_zoomed (self, !viewport_equal (&fit, &self->vp));
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

static void
apply_flags (AwPlotView *self)
{
  if (self->scene == NULL)
    return;
  self->scene->show_top_view = self->show_top_view;
  self->scene->show_legend = self->show_legend;
  self->scene->units = self->units;
}

static void
layout_now (AwPlotView   *self,
            AwPlotLayout *layout)
{
  AwChartStyle style;
  AwPlotScene empty;

  pick_style (self, &style);
  aw_plot_layout (gtk_widget_get_width (GTK_WIDGET (self)),
                  gtk_widget_get_height (GTK_WIDGET (self)),
                  current_scene (self, &empty), &style, layout);
}

/* ---- drawing ---- */

static void
draw_readout (AwPlotView         *self,
              cairo_t            *cr,
              const AwChartStyle *style,
              double              width,
              double              height)
{
  AwPlotHit hit;
  g_autofree char *text = NULL;
  PangoLayout *layout;
  PangoFontDescription *desc;
  PangoRectangle ink, logical;
  AwRgba color;
  double pad = style->font_size * 0.5, bw, bh, bx, by, r = style->font_size * 0.3;
  const AwPlotSeries *s;

  if (self->scene == NULL || !self->pointer_inside || self->dragging)
    return;
  if (!aw_plot_hit_test (width, height, self->scene, &self->vp, style, self->pointer_x,
                         self->pointer_y, HOVER_MAX_PX, &hit))
    return;
  text = aw_plot_format_readout (self->scene, &hit);
  if (text == NULL)
    return;
  s = &self->scene->series[hit.series];
  color = s->color.a > 0 ? s->color : aw_chart_palette_color (style, (unsigned) hit.series);

  /* the point the readout refers to */
  cairo_save (cr);
  aw_chart_set_source (cr, &style->background);
  cairo_arc (cr, hit.px, hit.py, style->line_width * 3.2, 0, 2 * G_PI);
  cairo_fill (cr);
  aw_chart_set_source (cr, &color);
  cairo_arc (cr, hit.px, hit.py, style->line_width * 2.4, 0, 2 * G_PI);
  cairo_fill (cr);

  layout = pango_cairo_create_layout (cr);
  desc = pango_font_description_new ();
  pango_font_description_set_family (desc, style->font_family);
  pango_font_description_set_absolute_size (desc, style->font_size * PANGO_SCALE);
  pango_layout_set_font_description (layout, desc);
  pango_font_description_free (desc);
  {
    /* the setup name in bold on the first line */
    const char *nl = strchr (text, '\n');
    g_autofree char *head = g_markup_escape_text (text, nl ? nl - text : -1);
    g_autofree char *rest = nl ? g_markup_escape_text (nl, -1) : g_strdup ("");
    g_autofree char *markup = g_strconcat ("<b>", head, "</b>", rest, NULL);

    pango_layout_set_markup (layout, markup, -1);
  }
  pango_layout_get_pixel_extents (layout, &ink, &logical);

  bw = logical.width + 2 * pad + 4;
  bh = logical.height + 2 * pad;
  bx = self->pointer_x + 16;
  by = self->pointer_y + 16;
  if (bx + bw > width - 2)
    bx = self->pointer_x - 16 - bw;
  if (by + bh > height - 2)
    by = self->pointer_y - 16 - bh;
  bx = round (CLAMP (bx, 2, MAX (2, width - bw - 2)));
  by = round (CLAMP (by, 2, MAX (2, height - bh - 2)));

  cairo_new_sub_path (cr);
  cairo_arc (cr, bx + bw - r, by + r, r, -G_PI / 2, 0);
  cairo_arc (cr, bx + bw - r, by + bh - r, r, 0, G_PI / 2);
  cairo_arc (cr, bx + r, by + bh - r, r, G_PI / 2, G_PI);
  cairo_arc (cr, bx + r, by + r, r, G_PI, 3 * G_PI / 2);
  cairo_close_path (cr);
  aw_chart_set_source (cr, &style->tooltip_bg);
  cairo_fill_preserve (cr);
  aw_chart_set_source (cr, &style->muted);
  cairo_set_line_width (cr, 1.0);
  cairo_stroke (cr);

  /* a colour key on the left edge names the setup without relying on text */
  aw_chart_set_source (cr, &color);
  cairo_rectangle (cr, bx + 1, by + r, 3, bh - 2 * r);
  cairo_fill (cr);

  aw_chart_set_source (cr, &style->tooltip_fg);
  cairo_move_to (cr, bx + pad + 4, by + pad);
  pango_cairo_show_layout (cr, layout);
  g_object_unref (layout);
  cairo_restore (cr);
}

static void
aw_plot_view_snapshot (GtkWidget   *widget,
                       GtkSnapshot *snapshot)
{
  AwPlotView *self = AW_PLOT_VIEW (widget);
  int width = gtk_widget_get_width (widget);
  int height = gtk_widget_get_height (widget);
  AwChartStyle style;
  AwPlotScene empty;
  const AwPlotScene *scene;
  cairo_t *cr;

  if (width <= 0 || height <= 0)
    return;

  pick_style (self, &style);
  scene = current_scene (self, &empty);
  cr = gtk_snapshot_append_cairo (snapshot, &GRAPHENE_RECT_INIT (0, 0, width, height));
  aw_plot_render (cr, width, height, scene, &self->vp, &style);

  if (self->scene == NULL || self->scene->n_series == 0)
    {
      AwPlotLayout layout;

      aw_plot_layout (width, height, scene, &style, &layout);
      aw_chart_set_source (cr, &style.muted);
      aw_chart_draw_text (cr, &style, _("No setups to show"),
                          layout.side.x + layout.side.width / 2,
                          layout.side.y + layout.side.height / 2, 0.5, 0.5,
                          style.title_size, false);
    }
  else
    draw_readout (self, cr, &style, width, height);

  if (gtk_widget_has_visible_focus (widget))
    {
      double dashes[2] = { 2.0, 2.0 };

      aw_chart_set_source (cr, &style.muted);
      cairo_set_line_width (cr, 1.0);
      cairo_set_dash (cr, dashes, 2, 0);
      cairo_rectangle (cr, 1.5, 1.5, width - 3, height - 3);
      cairo_stroke (cr);
    }
  cairo_destroy (cr);
}

static void
aw_plot_view_measure (GtkWidget      *widget,
                      GtkOrientation  orientation,
                      int             for_size,
                      int            *minimum,
                      int            *natural,
                      int            *minimum_baseline,
                      int            *natural_baseline)
{
  if (orientation == GTK_ORIENTATION_HORIZONTAL)
    {
      *minimum = 240;
      *natural = 720;
    }
  else
    {
      *minimum = 180;
      *natural = 420;
    }
}

/* ---- interaction ---- */

static void
zoom_at (AwPlotView *self,
         double      factor,
         double      px,
         double      py)
{
  AwPlotLayout layout;
  AwPlotPane pane;
  double cx, cv;

  layout_now (self, &layout);
  pane = aw_plot_device_to_data (&layout, &self->vp, px, py, &cx, &cv);
  if (pane == AW_PLOT_PANE_NONE)
    {
      /* outside the panes: around the centre of the side view */
      pane = AW_PLOT_PANE_SIDE;
      cx = (self->vp.x_min + self->vp.x_max) / 2;
      cv = (self->vp.z_min + self->vp.z_max) / 2;
    }
  aw_plot_viewport_zoom (&self->vp, pane == AW_PLOT_PANE_TOP, factor, cx, cv);
  viewport_changed (self);
}

static gboolean
on_scroll (GtkEventControllerScroll *controller,
           double                    dx,
           double                    dy,
           AwPlotView               *self)
{
  if (dy == 0.0)
    return FALSE;
  zoom_at (self, pow (ZOOM_STEP, -dy), self->pointer_x, self->pointer_y);
  return TRUE;
}

static void
on_motion (GtkEventControllerMotion *controller,
           double                    x,
           double                    y,
           AwPlotView               *self)
{
  self->pointer_inside = TRUE;
  self->pointer_x = x;
  self->pointer_y = y;
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

static void
on_leave (GtkEventControllerMotion *controller,
          AwPlotView               *self)
{
  self->pointer_inside = FALSE;
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

static void
on_drag_begin (GtkGestureDrag *gesture,
               double          x,
               double          y,
               AwPlotView     *self)
{
  AwPlotLayout layout;

  gtk_widget_grab_focus (GTK_WIDGET (self));
  layout_now (self, &layout);
  self->drag_pane = aw_plot_device_to_data (&layout, &self->vp, x, y, NULL, NULL);
  self->drag_vp = self->vp;
  self->dragging = self->drag_pane != AW_PLOT_PANE_NONE;
  if (!self->dragging)
    gtk_gesture_set_state (GTK_GESTURE (gesture), GTK_EVENT_SEQUENCE_DENIED);
}

static void
on_drag_update (GtkGestureDrag *gesture,
                double          ox,
                double          oy,
                AwPlotView     *self)
{
  AwPlotLayout layout;
  const AwChartRect *r;
  bool top = self->drag_pane == AW_PLOT_PANE_TOP;
  double dx, dv;

  if (!self->dragging)
    return;
  layout_now (self, &layout);
  r = top ? &layout.top : &layout.side;
  if (r->width <= 0 || r->height <= 0)
    return;
  self->vp = self->drag_vp;
  dx = -ox * (self->vp.x_max - self->vp.x_min) / r->width;
  dv = top ? oy * (self->vp.y_max - self->vp.y_min) / r->height
           : oy * (self->vp.z_max - self->vp.z_min) / r->height;
  aw_plot_viewport_pan (&self->vp, top, dx, dv);
  viewport_changed (self);
}

static void
on_drag_end (GtkGestureDrag *gesture,
             double          ox,
             double          oy,
             AwPlotView     *self)
{
  self->dragging = FALSE;
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

static void
action_zoom (GtkWidget  *widget,
             const char *action_name,
             GVariant   *parameter)
{
  AwPlotView *self = AW_PLOT_VIEW (widget);

  if (g_str_equal (action_name, "plot.zoom-in"))
    aw_plot_view_zoom (self, ZOOM_STEP);
  else if (g_str_equal (action_name, "plot.zoom-out"))
    aw_plot_view_zoom (self, 1.0 / ZOOM_STEP);
  else
    aw_plot_view_reset_view (self);
}

static gboolean
pan_shortcut (GtkWidget *widget,
              GVariant  *args,
              gpointer   user_data)
{
  AwPlotView *self = AW_PLOT_VIEW (widget);
  int sx = 0, sy = 0;

  g_variant_get (args, "(ii)", &sx, &sy);
  aw_plot_viewport_pan (&self->vp, false, sx * PAN_FRACTION * (self->vp.x_max - self->vp.x_min),
                        sy * PAN_FRACTION * (self->vp.z_max - self->vp.z_min));
  viewport_changed (self);
  return TRUE;
}

/* ---- GObject ---- */

static void
aw_plot_view_dispose (GObject *object)
{
  AwPlotView *self = AW_PLOT_VIEW (object);

  g_clear_pointer (&self->scene, aw_plot_scene_free);
  G_OBJECT_CLASS (aw_plot_view_parent_class)->dispose (object);
}

static void
aw_plot_view_get_property (GObject    *object,
                           guint       prop_id,
                           GValue     *value,
                           GParamSpec *pspec)
{
  AwPlotView *self = AW_PLOT_VIEW (object);

  switch (prop_id)
    {
    case PROP_SHOW_TOP_VIEW:
      g_value_set_boolean (value, self->show_top_view);
      break;
    case PROP_SHOW_LEGEND:
      g_value_set_boolean (value, self->show_legend);
      break;
    case PROP_ZOOMED:
      g_value_set_boolean (value, self->zoomed);
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
    }
}

static void
aw_plot_view_set_property (GObject      *object,
                           guint         prop_id,
                           const GValue *value,
                           GParamSpec   *pspec)
{
  AwPlotView *self = AW_PLOT_VIEW (object);

  switch (prop_id)
    {
    case PROP_SHOW_TOP_VIEW:
      aw_plot_view_set_show_top_view (self, g_value_get_boolean (value));
      break;
    case PROP_SHOW_LEGEND:
      aw_plot_view_set_show_legend (self, g_value_get_boolean (value));
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
    }
}

static void
aw_plot_view_class_init (AwPlotViewClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);
  static const struct { guint key; int sx, sy; } pans[] = {
    { GDK_KEY_Left, -1, 0 }, { GDK_KEY_Right, 1, 0 }, { GDK_KEY_Up, 0, 1 },
    { GDK_KEY_Down, 0, -1 }, { GDK_KEY_KP_Left, -1, 0 }, { GDK_KEY_KP_Right, 1, 0 },
    { GDK_KEY_KP_Up, 0, 1 }, { GDK_KEY_KP_Down, 0, -1 },
  };

  object_class->dispose = aw_plot_view_dispose;
  object_class->get_property = aw_plot_view_get_property;
  object_class->set_property = aw_plot_view_set_property;

  widget_class->snapshot = aw_plot_view_snapshot;
  widget_class->measure = aw_plot_view_measure;

  properties[PROP_SHOW_TOP_VIEW] =
    g_param_spec_boolean ("show-top-view", NULL, NULL, FALSE,
                          G_PARAM_READWRITE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  properties[PROP_SHOW_LEGEND] =
    g_param_spec_boolean ("show-legend", NULL, NULL, TRUE,
                          G_PARAM_READWRITE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  properties[PROP_ZOOMED] =
    g_param_spec_boolean ("zoomed", NULL, NULL, FALSE,
                          G_PARAM_READABLE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  g_object_class_install_properties (object_class, N_PROPS, properties);

  gtk_widget_class_install_action (widget_class, "plot.zoom-in", NULL, action_zoom);
  gtk_widget_class_install_action (widget_class, "plot.zoom-out", NULL, action_zoom);
  gtk_widget_class_install_action (widget_class, "plot.reset", NULL, action_zoom);

  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_plus, 0, "plot.zoom-in", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_plus, GDK_SHIFT_MASK,
                                       "plot.zoom-in", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_equal, 0, "plot.zoom-in", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_KP_Add, 0, "plot.zoom-in", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_minus, 0, "plot.zoom-out", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_KP_Subtract, 0, "plot.zoom-out",
                                       NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_0, 0, "plot.reset", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_KP_0, 0, "plot.reset", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_Home, 0, "plot.reset", NULL);
  for (guint i = 0; i < G_N_ELEMENTS (pans); i++)
    gtk_widget_class_add_binding (widget_class, pans[i].key, 0, pan_shortcut, "(ii)",
                                  pans[i].sx, pans[i].sy);

  gtk_widget_class_set_css_name (widget_class, "plotview");
  gtk_widget_class_set_accessible_role (widget_class, GTK_ACCESSIBLE_ROLE_IMG);
}

static void
aw_plot_view_init (AwPlotView *self)
{
  GtkEventController *controller;
  GtkGesture *drag;
  AwPlotScene empty;

  self->show_legend = TRUE;
  self->units = AW_PLOT_UNITS_METRIC;
  aw_plot_viewport_fit (current_scene (self, &empty), &self->vp);

  gtk_widget_set_focusable (GTK_WIDGET (self), TRUE);
  gtk_widget_set_focus_on_click (GTK_WIDGET (self), TRUE);
  gtk_widget_set_hexpand (GTK_WIDGET (self), TRUE);
  gtk_widget_set_vexpand (GTK_WIDGET (self), TRUE);
  gtk_widget_set_cursor_from_name (GTK_WIDGET (self), "crosshair");

  controller = gtk_event_controller_scroll_new (GTK_EVENT_CONTROLLER_SCROLL_VERTICAL);
  g_signal_connect (controller, "scroll", G_CALLBACK (on_scroll), self);
  gtk_widget_add_controller (GTK_WIDGET (self), controller);

  controller = gtk_event_controller_motion_new ();
  g_signal_connect (controller, "enter", G_CALLBACK (on_motion), self);
  g_signal_connect (controller, "motion", G_CALLBACK (on_motion), self);
  g_signal_connect (controller, "leave", G_CALLBACK (on_leave), self);
  gtk_widget_add_controller (GTK_WIDGET (self), controller);

  drag = gtk_gesture_drag_new ();
  gtk_gesture_single_set_button (GTK_GESTURE_SINGLE (drag), GDK_BUTTON_PRIMARY);
  g_signal_connect (drag, "drag-begin", G_CALLBACK (on_drag_begin), self);
  g_signal_connect (drag, "drag-update", G_CALLBACK (on_drag_update), self);
  g_signal_connect (drag, "drag-end", G_CALLBACK (on_drag_end), self);
  gtk_widget_add_controller (GTK_WIDGET (self), GTK_EVENT_CONTROLLER (drag));

  gtk_widget_action_set_enabled (GTK_WIDGET (self), "plot.reset", FALSE);
  update_accessible (self);
}

/* ---- public ---- */

GtkWidget *
aw_plot_view_new (void)
{
  return g_object_new (AW_TYPE_PLOT_VIEW, NULL);
}

void
aw_plot_view_set_scene (AwPlotView        *self,
                        const AwPlotScene *scene,
                        gboolean           keep_view)
{
  AwPlotScene empty;

  g_return_if_fail (AW_IS_PLOT_VIEW (self));

  g_clear_pointer (&self->scene, aw_plot_scene_free);
  if (scene != NULL)
    {
      self->scene = aw_plot_scene_copy (scene);
      apply_flags (self);
    }
  if (!keep_view || !self->zoomed)
    aw_plot_viewport_fit (current_scene (self, &empty), &self->vp);
  update_accessible (self);
  viewport_changed (self);
}

const AwPlotScene *
aw_plot_view_get_scene (AwPlotView *self)
{
  g_return_val_if_fail (AW_IS_PLOT_VIEW (self), NULL);

  return self->scene;
}

void
aw_plot_view_set_series_visible (AwPlotView *self,
                                 guint       index,
                                 gboolean    visible)
{
  g_return_if_fail (AW_IS_PLOT_VIEW (self));

  if (self->scene == NULL || index >= self->scene->n_series)
    return;
  /* the copy owns its series array */
  ((AwPlotSeries *) self->scene->series)[index].visible = !!visible;
  update_accessible (self);
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

void
aw_plot_view_set_units (AwPlotView  *self,
                        AwPlotUnits  units)
{
  g_return_if_fail (AW_IS_PLOT_VIEW (self));

  self->units = units;
  apply_flags (self);
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

void
aw_plot_view_set_show_top_view (AwPlotView *self,
                                gboolean    show)
{
  g_return_if_fail (AW_IS_PLOT_VIEW (self));

  show = !!show;
  if (self->show_top_view == show)
    return;
  self->show_top_view = show;
  apply_flags (self);
  gtk_widget_queue_draw (GTK_WIDGET (self));
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_SHOW_TOP_VIEW]);
}

gboolean
aw_plot_view_get_show_top_view (AwPlotView *self)
{
  g_return_val_if_fail (AW_IS_PLOT_VIEW (self), FALSE);

  return self->show_top_view;
}

void
aw_plot_view_set_show_legend (AwPlotView *self,
                              gboolean    show)
{
  g_return_if_fail (AW_IS_PLOT_VIEW (self));

  show = !!show;
  if (self->show_legend == show)
    return;
  self->show_legend = show;
  apply_flags (self);
  gtk_widget_queue_draw (GTK_WIDGET (self));
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_SHOW_LEGEND]);
}

gboolean
aw_plot_view_get_show_legend (AwPlotView *self)
{
  g_return_val_if_fail (AW_IS_PLOT_VIEW (self), FALSE);

  return self->show_legend;
}

void
aw_plot_view_get_viewport (AwPlotView     *self,
                           AwPlotViewport *vp)
{
  g_return_if_fail (AW_IS_PLOT_VIEW (self));
  g_return_if_fail (vp != NULL);

  *vp = self->vp;
}

void
aw_plot_view_set_viewport (AwPlotView           *self,
                           const AwPlotViewport *vp)
{
  g_return_if_fail (AW_IS_PLOT_VIEW (self));

  if (!aw_plot_viewport_is_valid (vp))
    return;
  self->vp = *vp;
  viewport_changed (self);
}

void
aw_plot_view_zoom (AwPlotView *self,
                   double      factor)
{
  AwPlotLayout layout;

  g_return_if_fail (AW_IS_PLOT_VIEW (self));

  layout_now (self, &layout);
  zoom_at (self, factor, layout.side.x + layout.side.width / 2,
           layout.side.y + layout.side.height / 2);
}

void
aw_plot_view_reset_view (AwPlotView *self)
{
  AwPlotScene empty;

  g_return_if_fail (AW_IS_PLOT_VIEW (self));

  aw_plot_viewport_fit (current_scene (self, &empty), &self->vp);
  viewport_changed (self);
}

gboolean
aw_plot_view_get_zoomed (AwPlotView *self)
{
  g_return_val_if_fail (AW_IS_PLOT_VIEW (self), FALSE);

  return self->zoomed;
}

void
aw_plot_view_show_readout_at (AwPlotView *self,
                              double      x,
                              double      y)
{
  g_return_if_fail (AW_IS_PLOT_VIEW (self));

  self->pointer_inside = isfinite (x) && isfinite (y);
  if (self->pointer_inside)
    {
      self->pointer_x = x;
      self->pointer_y = y;
    }
  gtk_widget_queue_draw (GTK_WIDGET (self));
}

gboolean
aw_plot_view_export (AwPlotView    *self,
                     const char    *path,
                     AwPlotFormat   fmt,
                     double         width,
                     double         height,
                     GError       **error)
{
  AwPlotScene empty;

  g_return_val_if_fail (AW_IS_PLOT_VIEW (self), FALSE);

  return aw_plot_export (current_scene (self, &empty), &self->vp, path, fmt, width, height,
                         error);
}
