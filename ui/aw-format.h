/* aw-format.h: quantities shown to people — units (metric or imperial), locale numbers, parsing
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Each quantity has a base unit (the one the project stores) and a display unit per unit system.
 * Numbers shown follow the locale; numbers typed are read in the locale, or with a '.' decimal
 * point as a fallback. BB mass is always grams, BB diameter millimetres and energy joules.
 */
#pragma once

#include <glib.h>

G_BEGIN_DECLS

typedef enum
{
  AW_UNITS_METRIC = 0,
  AW_UNITS_IMPERIAL,
} AwUnitSystem;

typedef enum
{
  AW_QTY_NONE = 0,        /* plain number, no unit */
  AW_QTY_VELOCITY,        /* base m/s; m/s or fps */
  AW_QTY_DISTANCE,        /* base m; m or yd (downrange) */
  AW_QTY_HEIGHT,          /* base m; m or ft (muzzle height, apex) */
  AW_QTY_SIGHT_HEIGHT,    /* base m; mm or in */
  AW_QTY_BAND,            /* base m; cm or in */
  AW_QTY_SMALL_CM,        /* base cm; cm or in (table heights, drift) */
  AW_QTY_MASS_G,          /* base g; always g */
  AW_QTY_DIAMETER_MM,     /* base mm; always mm */
  AW_QTY_ENERGY,          /* base J; always J */
  AW_QTY_TEMPERATURE,     /* base °C; °C or °F */
  AW_QTY_PRESSURE,        /* base hPa; hPa or inHg */
  AW_QTY_ALTITUDE,        /* base m; m or ft */
  AW_QTY_WIND,            /* base m/s; m/s or mph */
  AW_QTY_PERCENT,         /* % */
  AW_QTY_DEGREES,         /* ° */
  AW_QTY_SPIN_RPM,        /* rpm */
  AW_QTY_TIME,            /* s */
  AW_QTY_CREEP,           /* % per 0.1 g */
  AW_QTY_FACTOR,          /* ×, calibration multipliers */
  AW_N_QTY
} AwQuantity;

double aw_qty_to_display (AwQuantity q, AwUnitSystem units, double base);
double aw_qty_from_display (AwQuantity q, AwUnitSystem units, double shown);
/* Unit symbol (not translated: SI and customary symbols), "" for plain numbers. */
const char *aw_qty_unit (AwQuantity q, AwUnitSystem units);
/* Digits after the decimal point used to show the quantity. */
int aw_qty_digits (AwQuantity q, AwUnitSystem units);

/* A number in the locale ("1,25" in German), "-0" shown as "0", NAN as an em dash. */
char *aw_format_number (double v, int digits);
/* Number and unit with a narrow no-break space, in the display unit: "42,3 m". */
char *aw_qty_format (AwQuantity q, AwUnitSystem units, double base);
/* Number alone in the display unit. */
char *aw_qty_format_number (AwQuantity q, AwUnitSystem units, double base);

/* Reads a number typed by a person: the locale's decimal separator, or '.', surrounding spaces
 * ignored. FALSE for empty text, trailing garbage, or a non-finite value. */
gboolean aw_parse_number (const char *text, double *out);

/* Locale-independent number for files and CSV (shortest form that reads back the same, at most
 * `digits` significant digits when digits > 0). */
char *aw_format_ascii (double v, int digits);

G_END_DECLS
