/* aw-setup-row.h: one setup in the sidebar list — colour, name, BB, energy, band range
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#pragma once

#include <gtk/gtk.h>

#include "aw-compute.h"
#include "aw-format.h"
#include "aw-project.h"

G_BEGIN_DECLS

#define AW_TYPE_SETUP_ROW (aw_setup_row_get_type ())
G_DECLARE_FINAL_TYPE (AwSetupRow, aw_setup_row, AW, SETUP_ROW, GtkListBoxRow)

GtkWidget *aw_setup_row_new (void);

/* result NULL: still computing. */
void aw_setup_row_update (AwSetupRow *self, const AwSetup *setup, AwComputeResult *result,
                          AwUnitSystem units);
const char *aw_setup_row_get_name (AwSetupRow *self);
/* The text shown under the name (for tests). */
const char *aw_setup_row_get_details (AwSetupRow *self);

/* Signal "visibility-toggled" (gboolean visible): the user pressed the eye button. */

G_END_DECLS
