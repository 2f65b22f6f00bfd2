/* aw-window.h: the workbench window — setups, flight plot, range table and setup editor
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#pragma once

#include <gtk/gtk.h>

#include "aw-compute.h"
#include "aw-document.h"
#include "aw-print.h"

G_BEGIN_DECLS

#define AW_APP_ID "io.github.arcwright.Arcwright"

#define AW_TYPE_WINDOW (aw_window_get_type ())
G_DECLARE_FINAL_TYPE (AwWindow, aw_window, AW, WINDOW, GtkApplicationWindow)

/* settings: the program's settings (schema AW_APP_ID). */
AwWindow *aw_window_new (GtkApplication *app, GSettings *settings);

AwDocument *aw_window_get_document (AwWindow *self);
void aw_window_set_document (AwWindow *self, AwDocument *document);

/* Reads a project file into this window. On failure the window keeps its document, an error
 * dialog explains the problem (unless quiet) and FALSE is returned with error set. */
gboolean aw_window_load_file (AwWindow *self, GFile *file, gboolean quiet, GError **error);
/* Saves to the document's file (or asks for one when quiet is FALSE and there is none). */
gboolean aw_window_save_to (AwWindow *self, GFile *file, GError **error);

/* An unmodified window without a file: a file opened next may replace it. */
gboolean aw_window_is_pristine (AwWindow *self);
/* Shows a message bar at the top of the window. */
void aw_window_show_banner (AwWindow *self, const char *message);

/* The centre of the window: "flight" (plot and range table) or "sweep" (the sweep panel).
 * Also the stateful action "win.view" (Ctrl+1, Ctrl+2). */
void aw_window_set_view (AwWindow *self, const char *view);
const char *aw_window_get_view (AwWindow *self);

/* The print job the window's print and PDF actions run: the selected setup for a range card or
 * setup sheet, every setup shown in the plot for a loadout sheet; the window's units, its site
 * class and, for sheets, the locale's paper. NULL with error set when there is nothing to print. */
AwPrintJob *aw_window_new_print_job (AwWindow *self, AwPrintKind kind, GError **error);

/* The "Open Recent" entries (shared by every window). */
void aw_window_set_recent_menu (AwWindow *self, GMenuModel *recent);

/* ---- autosave and recovery ---- */

/* Directory of autosaved copies: $XDG_STATE_HOME/arcwright/autosave. */
char *aw_autosave_dir (void);
/* Writes the autosaved copy now when the document is modified (else removes it). */
void aw_window_autosave_now (AwWindow *self);
/* Marks a recovered document: its copy is kept until saved or discarded. */
void aw_window_mark_recovered (AwWindow *self);

/* ---- for tests ---- */

GtkListBox *aw_window_get_setup_list (AwWindow *self);
GtkWidget *aw_window_get_editor (AwWindow *self);
GtkWidget *aw_window_get_plot (AwWindow *self);
GtkWidget *aw_window_get_range_view (AwWindow *self);
int aw_window_get_selected (AwWindow *self);
void aw_window_select (AwWindow *self, int index);
/* The latest result of a setup (NULL: computing). */
AwComputeResult *aw_window_get_result (AwWindow *self, guint index);
/* TRUE when no computation runs or waits and the plot shows the latest results. */
gboolean aw_window_is_idle (AwWindow *self);
/* Site class shown (0: none; then the project's classes in order). */
void aw_window_set_site_class (AwWindow *self, guint position);
GtkWidget *aw_window_get_sweep_panel (AwWindow *self);

G_END_DECLS
