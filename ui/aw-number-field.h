/* aw-number-field.h: a labelled number entry with its unit, checked as the user types
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Values are in the quantity's base unit (see aw-format.h); the entry shows them in the chosen
 * unit system. A bad value is explained under the entry, marked for assistive technology, and
 * not applied; "value-changed" is emitted only for values the user typed that pass the checks.
 */
#pragma once

#include <gtk/gtk.h>

#include "aw-format.h"

G_BEGIN_DECLS

#define AW_TYPE_NUMBER_FIELD (aw_number_field_get_type ())
G_DECLARE_FINAL_TYPE (AwNumberField, aw_number_field, AW, NUMBER_FIELD, GtkWidget)

GtkWidget *aw_number_field_new (const char *label, AwQuantity quantity, double min, double max);

void aw_number_field_set_label (AwNumberField *self, const char *label);
const char *aw_number_field_get_label (AwNumberField *self);
void aw_number_field_set_quantity (AwNumberField *self, AwQuantity quantity);
void aw_number_field_set_units (AwNumberField *self, AwUnitSystem units);
/* Accepted range in base units (inclusive). */
void aw_number_field_set_range (AwNumberField *self, double min, double max);
/* An empty entry means "unset" (NAN); empty_text is shown as placeholder. */
void aw_number_field_set_allow_empty (AwNumberField *self, gboolean allow, const char *empty_text);
/* Digits shown (−1: the quantity's default). */
void aw_number_field_set_digits (AwNumberField *self, int digits);
/* Help text shown as the tooltip and read as the entry's description. */
void aw_number_field_set_help (AwNumberField *self, const char *help);

/* Shows value (base unit; NAN with allow-empty shows an empty entry) without emitting. Text the
 * user is typing is left alone when it already means this value. */
void aw_number_field_set_value (AwNumberField *self, double value);
double aw_number_field_get_value (AwNumberField *self);
/* TRUE when the text is acceptable (and applied). */
gboolean aw_number_field_is_valid (AwNumberField *self);
/* Translated explanation of the current problem, NULL when valid. */
const char *aw_number_field_get_error (AwNumberField *self);

GtkEntry *aw_number_field_get_entry (AwNumberField *self);

G_END_DECLS
