/* aw-range-view.h: the range table of the selected setup, with copy as CSV
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#pragma once

#include <gtk/gtk.h>

#include "aw-compute.h"
#include "aw-format.h"

G_BEGIN_DECLS

#define AW_TYPE_RANGE_VIEW (aw_range_view_get_type ())
G_DECLARE_FINAL_TYPE (AwRangeView, aw_range_view, AW, RANGE_VIEW, GtkWidget)

GtkWidget *aw_range_view_new (void);

/* Shows the table of result (NULL or without a table: empty). setup_name for the title. */
void aw_range_view_set_result (AwRangeView *self, const char *setup_name, AwComputeResult *result,
                               AwAngleUnit angle_unit);
void aw_range_view_set_units (AwRangeView *self, AwUnitSystem units);
guint aw_range_view_get_n_rows (AwRangeView *self);

/* The table as CSV: a header line with units, then one line per row; numbers are written with a
 * '.' decimal point whatever the locale. NULL when there is no table. */
char *aw_range_view_dup_csv (AwRangeView *self);
/* Copies the CSV to the clipboard; FALSE when there is no table. */
gboolean aw_range_view_copy_csv (AwRangeView *self);

G_END_DECLS
