/* aw-preferences.c: the preferences window
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <glib/gi18n.h>

#include "aw-preferences.h"

struct _AwPreferences
{
  GtkWindow parent_instance;

  /* template widgets */
  GtkDropDown *units_dropdown;
  GtkSpinButton *band_spin;
  GtkSpinButton *step_spin;
  GtkDropDown *style_dropdown;

  /* owned */
  GSettings *settings;
};

G_DEFINE_FINAL_TYPE (AwPreferences, aw_preferences, GTK_TYPE_WINDOW)

/* enum setting (nick) ↔ dropdown position */
static gboolean
enum_to_position (GValue   *value,
                  GVariant *variant,
                  gpointer  user_data)
{
  const char *const *nicks = user_data;
  const char *nick = g_variant_get_string (variant, NULL);

  for (guint i = 0; nicks[i]; i++)
    if (g_str_equal (nicks[i], nick))
      {
        g_value_set_uint (value, i);
        return TRUE;
      }
  return FALSE;
}

static GVariant *
position_to_enum (const GValue       *value,
                  const GVariantType *type,
                  gpointer            user_data)
{
  const char *const *nicks = user_data;
  guint pos = g_value_get_uint (value);

  if (pos >= g_strv_length ((char **) nicks))
    return NULL;
  return g_variant_new_string (nicks[pos]);
}

static const char *const units_nicks[] = { "metric", "imperial", NULL };
static const char *const style_nicks[] = { "system", "light", "dark", NULL };

static void
aw_preferences_dispose (GObject *object)
{
  AwPreferences *self = AW_PREFERENCES (object);

  g_clear_object (&self->settings);
  gtk_widget_dispose_template (GTK_WIDGET (self), AW_TYPE_PREFERENCES);
  G_OBJECT_CLASS (aw_preferences_parent_class)->dispose (object);
}

static void
aw_preferences_class_init (AwPreferencesClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->dispose = aw_preferences_dispose;
  gtk_widget_class_set_template_from_resource (widget_class,
                                               "/io/github/arcwright/Arcwright/aw-preferences.ui");
  gtk_widget_class_bind_template_child (widget_class, AwPreferences, units_dropdown);
  gtk_widget_class_bind_template_child (widget_class, AwPreferences, band_spin);
  gtk_widget_class_bind_template_child (widget_class, AwPreferences, step_spin);
  gtk_widget_class_bind_template_child (widget_class, AwPreferences, style_dropdown);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_Escape, 0, "window.close", NULL);
}

static void
aw_preferences_init (AwPreferences *self)
{
  gtk_widget_init_template (GTK_WIDGET (self));
}

GtkWidget *
aw_preferences_new (GtkWindow *parent,
                    GSettings *settings)
{
  AwPreferences *self;

  g_return_val_if_fail (G_IS_SETTINGS (settings), NULL);

  self = g_object_new (AW_TYPE_PREFERENCES, "transient-for", parent, NULL);
  self->settings = g_object_ref (settings);
  g_settings_bind_with_mapping (settings, "units", self->units_dropdown, "selected",
                                G_SETTINGS_BIND_DEFAULT, enum_to_position, position_to_enum,
                                (gpointer) units_nicks, NULL);
  g_settings_bind_with_mapping (settings, "style", self->style_dropdown, "selected",
                                G_SETTINGS_BIND_DEFAULT, enum_to_position, position_to_enum,
                                (gpointer) style_nicks, NULL);
  g_settings_bind (settings, "band-half-height-cm", self->band_spin, "value",
                   G_SETTINGS_BIND_DEFAULT);
  g_settings_bind (settings, "table-step-m", self->step_spin, "value", G_SETTINGS_BIND_DEFAULT);
  return GTK_WIDGET (self);
}
