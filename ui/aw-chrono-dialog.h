/* aw-chrono-dialog.h: small dialogs editing one chrono string or one measured point of a setup
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Each dialog is a modal window over the main window. OK records one undoable edit of the
 * document and closes the dialog; it is insensitive while a value is refused. The values the
 * dialogs accept are the ranges of the file format, and the edited project is validated before
 * it is recorded, so a save never meets a value the loader refuses.
 */
#pragma once

#include <gtk/gtk.h>

#include "aw-document.h"
#include "aw-format.h"

G_BEGIN_DECLS

/* Chrono string `item` of setup `setup` (item −1: a new string appended on OK). */
GtkWindow *aw_chrono_dialog_new (GtkWindow *parent, AwDocument *document, int setup, int item,
                                 AwUnitSystem units);
/* Measured point `item` of setup `setup` (item −1: a new point). */
GtkWindow *aw_point_dialog_new (GtkWindow *parent, AwDocument *document, int setup, int item,
                                AwUnitSystem units);

/* A control of either dialog by name, for tests: chrono "mass", "unit", "hop", "temperature",
 * "date", "note", "shots" (GtkTextView), "shots-hint", "message", "stats", "ok"; point "mass",
 * "velocity", "message", "ok". */
GtkWidget *aw_edit_dialog_get_widget (GtkWindow *dialog, const char *name);
/* What OK does: records the edit and closes. FALSE (dialog kept open) when a value is refused. */
gboolean aw_edit_dialog_accept (GtkWindow *dialog);

/* Reads the shots typed in a chrono string, in `unit`. Shots are separated by white space,
 * ';' and — when the locale's decimal separator is not a comma — ','. On failure *problem (when
 * given) is a translated message naming the first bad shot. */
gboolean aw_chrono_parse_shots (const char *text, AwVelocityUnit unit, GArray *velocities,
                                char **problem);
/* Translated hint telling which separators aw_chrono_parse_shots accepts in this locale. */
const char *aw_chrono_shots_hint (void);

G_END_DECLS
