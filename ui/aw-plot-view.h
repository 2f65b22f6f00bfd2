/* aw-plot-view.h: interactive flight plot widget
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Shows an AwPlotScene with aw_plot_render. Scroll zooms around the pointer, dragging pans,
 * hovering shows a readout of the nearest setup. Keys: + / − / 0 zoom in, out, reset; arrows pan.
 * Widget actions (for menus and buttons): "plot.zoom-in", "plot.zoom-out", "plot.reset".
 */
#pragma once

#include <gtk/gtk.h>

#include "aw-plot.h"

G_BEGIN_DECLS

#define AW_TYPE_PLOT_VIEW (aw_plot_view_get_type ())
G_DECLARE_FINAL_TYPE (AwPlotView, aw_plot_view, AW, PLOT_VIEW, GtkWidget)

GtkWidget *aw_plot_view_new (void);

/* Shows a deep copy of scene (NULL clears). When keep_view is false, or the current view is the
 * default one (not zoomed or panned by the user), the view is fitted to the new scene. */
void aw_plot_view_set_scene (AwPlotView *self, const AwPlotScene *scene, gboolean keep_view);
/* The widget's own copy (NULL when empty); valid until the next set_scene. */
const AwPlotScene *aw_plot_view_get_scene (AwPlotView *self);

void aw_plot_view_set_series_visible (AwPlotView *self, guint index, gboolean visible);
void aw_plot_view_set_units (AwPlotView *self, AwPlotUnits units);

/* Properties "show-top-view" and "show-legend". */
void aw_plot_view_set_show_top_view (AwPlotView *self, gboolean show);
gboolean aw_plot_view_get_show_top_view (AwPlotView *self);
void aw_plot_view_set_show_legend (AwPlotView *self, gboolean show);
gboolean aw_plot_view_get_show_legend (AwPlotView *self);

void aw_plot_view_get_viewport (AwPlotView *self, AwPlotViewport *vp);
void aw_plot_view_set_viewport (AwPlotView *self, const AwPlotViewport *vp);
void aw_plot_view_zoom (AwPlotView *self, double factor);   /* around the centre, > 1 zooms in */
void aw_plot_view_reset_view (AwPlotView *self);
/* Property "zoomed" (read-only): TRUE while the view differs from "fit all". */
gboolean aw_plot_view_get_zoomed (AwPlotView *self);

/* Shows the hover readout for the widget point (x, y) as if the pointer were there (touch,
 * tests); NaN hides it until the pointer moves again. */
void aw_plot_view_show_readout_at (AwPlotView *self, double x, double y);

/* Exports what the widget shows (its viewport; light style for files) with aw_plot_export. */
gboolean aw_plot_view_export (AwPlotView *self, const char *path, AwPlotFormat fmt, double width,
                              double height, GError **error);

G_END_DECLS
