/* aw-setup-editor.h: the editor of the selected setup, grouped by topic
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Every change the user makes becomes one undoable edit of the document. Conditions edit the
 * setup's own conditions when it has them, else the project's conditions.
 */
#pragma once

#include <gtk/gtk.h>

#include "aw-compute.h"
#include "aw-document.h"
#include "aw-format.h"

G_BEGIN_DECLS

#define AW_TYPE_SETUP_EDITOR (aw_setup_editor_get_type ())
G_DECLARE_FINAL_TYPE (AwSetupEditor, aw_setup_editor, AW, SETUP_EDITOR, GtkWidget)

GtkWidget *aw_setup_editor_new (void);

void aw_setup_editor_set_document (AwSetupEditor *self, AwDocument *document);
/* Setup shown (−1: none). */
void aw_setup_editor_set_index (AwSetupEditor *self, int index);
int aw_setup_editor_get_index (AwSetupEditor *self);
/* Re-reads every value from the document. */
void aw_setup_editor_refresh (AwSetupEditor *self);
void aw_setup_editor_set_units (AwSetupEditor *self, AwUnitSystem units);
/* The latest computation of the shown setup (NULL: computing). */
void aw_setup_editor_set_result (AwSetupEditor *self, AwComputeResult *result);
void aw_setup_editor_focus_name (AwSetupEditor *self);

/* Opens the dialog editing chrono string / measured point `item` of the shown setup (−1: a new
 * one); returns it (NULL when no setup is shown). */
GtkWindow *aw_setup_editor_open_chrono (AwSetupEditor *self, int item);
GtkWindow *aw_setup_editor_open_point (AwSetupEditor *self, int item);
/* Deletes one as an undoable edit (the last point of the measured model stays). */
void aw_setup_editor_delete_chrono (AwSetupEditor *self, int item);
void aw_setup_editor_delete_point (AwSetupEditor *self, int item);

/* A control by its id in the template (e.g. "mass_field", "hop_dropdown"), for tests. */
GtkWidget *aw_setup_editor_get_field (AwSetupEditor *self, const char *id);

/* Translated explanation of a computation that did not succeed (NULL when it did). */
char *aw_compute_result_describe_problem (const AwComputeResult *result);

G_END_DECLS
