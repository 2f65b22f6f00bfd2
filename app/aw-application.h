/* aw-application.h: the desktop program — windows, files, recent files, preferences, recovery
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#pragma once

#include <gtk/gtk.h>

#include "aw-window.h"

G_BEGIN_DECLS

#define AW_TYPE_APPLICATION (aw_application_get_type ())
G_DECLARE_FINAL_TYPE (AwApplication, aw_application, AW, APPLICATION, GtkApplication)

AwApplication *aw_application_new (void);

GSettings *aw_application_get_settings (AwApplication *self);

/* Opens file in a pristine window (or a new one); an already open file is brought forward. */
AwWindow *aw_application_open_file (AwApplication *self, GFile *file);

/* Autosaved copies left by a session that ended unexpectedly (paths of the .arcw copies). */
GPtrArray *aw_application_find_orphans (void);

G_END_DECLS
