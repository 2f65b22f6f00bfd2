/* aw-preferences.h: the preferences window (units, band for new setups, table step, appearance)
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#pragma once

#include <gtk/gtk.h>

G_BEGIN_DECLS

#define AW_TYPE_PREFERENCES (aw_preferences_get_type ())
G_DECLARE_FINAL_TYPE (AwPreferences, aw_preferences, AW, PREFERENCES, GtkWindow)

/* Every control is bound to settings: changes apply at once. */
GtkWidget *aw_preferences_new (GtkWindow *parent, GSettings *settings);

G_END_DECLS
