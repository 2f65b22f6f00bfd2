/* aw-setup-row.c: one setup in the sidebar list
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <glib/gi18n.h>
#include <math.h>

#include "aw-setup-row.h"

struct _AwSetupRow
{
  GtkListBoxRow parent_instance;

  /* template widgets */
  GtkDrawingArea *swatch;
  GtkLabel *name_label;
  GtkLabel *details_label;
  GtkLabel *band_label;
  GtkButton *visible_button;

  /* owned */
  GdkRGBA colour;
  gboolean shown;
};

G_DEFINE_FINAL_TYPE (AwSetupRow, aw_setup_row, GTK_TYPE_LIST_BOX_ROW)

enum { VISIBILITY_TOGGLED, N_SIGNALS };
static guint signals[N_SIGNALS];

static void
draw_swatch (GtkDrawingArea *area,
             cairo_t        *cr,
             int             width,
             int             height,
             gpointer        user_data)
{
  AwSetupRow *self = user_data;
  double r = MIN (width, height) / 2.0 - 1.0;
  double cx = width / 2.0;

  /* a rounded bar, hollow when the setup is hidden from the plot */
  cairo_new_sub_path (cr);
  cairo_arc (cr, cx, 1 + r, r, G_PI, 0);
  cairo_arc (cr, cx, height - 1 - r, r, 0, G_PI);
  cairo_close_path (cr);
  gdk_cairo_set_source_rgba (cr, &self->colour);
  if (self->shown)
    cairo_fill (cr);
  else
    {
      cairo_set_line_width (cr, 2.0);
      cairo_stroke (cr);
    }
}

static void
visible_clicked_cb (AwSetupRow *self)
{
  g_signal_emit (self, signals[VISIBILITY_TOGGLED], 0, !self->shown);
}

static void
aw_setup_row_dispose (GObject *object)
{
  gtk_widget_dispose_template (GTK_WIDGET (object), AW_TYPE_SETUP_ROW);
  G_OBJECT_CLASS (aw_setup_row_parent_class)->dispose (object);
}

static void
aw_setup_row_class_init (AwSetupRowClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->dispose = aw_setup_row_dispose;

  signals[VISIBILITY_TOGGLED] = g_signal_new ("visibility-toggled", G_TYPE_FROM_CLASS (klass),
                                              G_SIGNAL_RUN_LAST, 0, NULL, NULL, NULL,
                                              G_TYPE_NONE, 1, G_TYPE_BOOLEAN);

  gtk_widget_class_set_template_from_resource (widget_class,
                                               "/io/github/arcwright/Arcwright/aw-setup-row.ui");
  gtk_widget_class_bind_template_child (widget_class, AwSetupRow, swatch);
  gtk_widget_class_bind_template_child (widget_class, AwSetupRow, name_label);
  gtk_widget_class_bind_template_child (widget_class, AwSetupRow, details_label);
  gtk_widget_class_bind_template_child (widget_class, AwSetupRow, band_label);
  gtk_widget_class_bind_template_child (widget_class, AwSetupRow, visible_button);
  gtk_widget_class_bind_template_callback (widget_class, visible_clicked_cb);
}

static void
aw_setup_row_init (AwSetupRow *self)
{
  gtk_widget_init_template (GTK_WIDGET (self));
  gdk_rgba_parse (&self->colour, "#3465a4");
  self->shown = TRUE;
  gtk_drawing_area_set_draw_func (self->swatch, draw_swatch, self, NULL);
  gtk_accessible_update_property (GTK_ACCESSIBLE (self->visible_button),
                                  GTK_ACCESSIBLE_PROPERTY_LABEL, _ ("Show in the plot"), -1);
}

GtkWidget *
aw_setup_row_new (void)
{
  return g_object_new (AW_TYPE_SETUP_ROW, NULL);
}

void
aw_setup_row_update (AwSetupRow      *self,
                     const AwSetup   *setup,
                     AwComputeResult *result,
                     AwUnitSystem     units)
{
  g_autofree char *mass = NULL;
  g_autofree char *energy = NULL;
  g_autofree char *details = NULL;
  g_autofree char *band = NULL;
  g_autofree char *accessible = NULL;

  g_return_if_fail (AW_IS_SETUP_ROW (self));
  g_return_if_fail (setup != NULL);

  gtk_label_set_text (self->name_label, setup->name);
  if (!gdk_rgba_parse (&self->colour, setup->colour))
    gdk_rgba_parse (&self->colour, "#3465a4");
  self->shown = setup->visible;
  gtk_widget_queue_draw (GTK_WIDGET (self->swatch));

  gtk_button_set_icon_name (self->visible_button,
                            setup->visible ? "view-reveal-symbolic" : "view-conceal-symbolic");
  gtk_accessible_update_state (GTK_ACCESSIBLE (self->visible_button),
                               GTK_ACCESSIBLE_STATE_PRESSED,
                               setup->visible ? GTK_ACCESSIBLE_TRISTATE_TRUE
                                              : GTK_ACCESSIBLE_TRISTATE_FALSE, -1);
  gtk_widget_set_tooltip_text (GTK_WIDGET (self->visible_button),
                               setup->visible ? _ ("Shown in the plot: click to hide")
                                              : _ ("Hidden from the plot: click to show"));

  mass = aw_qty_format (AW_QTY_MASS_G, units, setup->bb.mass_g);
  if (result != NULL && result->bridge == AW_BRIDGE_OK)
    energy = aw_qty_format (AW_QTY_ENERGY, units, result->energy_j);
  else
    energy = g_strdup ("…");
  /* translators: BB mass and muzzle energy in the setup list, e.g. "0,25 g · 1,14 J" */
  details = g_strdup_printf (_ ("%s · %s"), mass, energy);
  gtk_label_set_text (self->details_label, details);

  if (result == NULL)
    band = g_strdup (_ ("Band range: computing…"));
  else if (result->bridge != AW_BRIDGE_OK || result->status < 0)
    band = g_strdup (_ ("⚠ Cannot compute: see the editor"));
  else if (result->status == AW_ANALYSIS_NO_ZERO)
    band = g_strdup (_ ("⚠ Zero distance out of reach"));
  else if (result->status == AW_ANALYSIS_HOP_UNREACHABLE)
    band = g_strdup (_ ("⚠ Lift ratio out of reach"));
  else if (result->status == AW_ANALYSIS_OK && isfinite (result->band.band_range_m))
    {
      g_autofree char *near = aw_qty_format_number (AW_QTY_DISTANCE, units,
                                                    result->band.band_near_m);
      g_autofree char *far = aw_qty_format (AW_QTY_DISTANCE, units, result->band.band_range_m);
      /* translators: the band range in the setup list; the first number is where the BB enters
       * the band, the second where it leaves it, e.g. "Band 0–41,3 m" */
      band = g_strdup_printf (_ ("Band %s–%s"), near, far);
    }
  else
    band = g_strdup (_ ("⚠ Never inside the band"));
  gtk_label_set_text (self->band_label, band);
  if (g_str_has_prefix (band, "⚠"))
    gtk_widget_add_css_class (GTK_WIDGET (self->band_label), "aw-row-warning");
  else
    gtk_widget_remove_css_class (GTK_WIDGET (self->band_label), "aw-row-warning");

  accessible = g_strdup_printf ("%s, %s, %s", setup->name, details, band);
  gtk_accessible_update_property (GTK_ACCESSIBLE (self), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                  accessible, -1);
}

const char *
aw_setup_row_get_name (AwSetupRow *self)
{
  g_return_val_if_fail (AW_IS_SETUP_ROW (self), NULL);
  return gtk_label_get_text (self->name_label);
}

const char *
aw_setup_row_get_details (AwSetupRow *self)
{
  g_return_val_if_fail (AW_IS_SETUP_ROW (self), NULL);
  return gtk_label_get_text (self->details_label);
}
