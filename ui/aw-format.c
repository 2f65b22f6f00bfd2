/* aw-format.c: quantities shown to people
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <errno.h>
#include <locale.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "aw-format.h"
#include "aw-units.h"

#define AW_CM_PER_IN   2.54
#define AW_MPS_PER_MPH 0.44704  /* 1 mph = 1609.344 m / 3600 s, exact */

double
aw_qty_to_display (AwQuantity   q,
                   AwUnitSystem units,
                   double       base)
{
  if (units == AW_UNITS_METRIC)
    {
      switch (q)
        {
        case AW_QTY_SIGHT_HEIGHT:
          return base * 1000.0;
        case AW_QTY_BAND:
          return base * 100.0;
        default:
          return base;
        }
    }

  switch (q)
    {
    case AW_QTY_VELOCITY:
      return aw_mps_to_fps (base);
    case AW_QTY_DISTANCE:
      return aw_m_to_yd (base);
    case AW_QTY_HEIGHT:
    case AW_QTY_ALTITUDE:
      return aw_m_to_ft (base);
    case AW_QTY_SIGHT_HEIGHT:
    case AW_QTY_BAND:
      return base * 100.0 / AW_CM_PER_IN;
    case AW_QTY_SMALL_CM:
      return base / AW_CM_PER_IN;
    case AW_QTY_TEMPERATURE:
      return aw_c_to_f (base);
    case AW_QTY_PRESSURE:
      return aw_hpa_to_inhg (base);
    case AW_QTY_WIND:
      return base / AW_MPS_PER_MPH;
    default:
      return base;
    }
}

double
aw_qty_from_display (AwQuantity   q,
                     AwUnitSystem units,
                     double       shown)
{
  if (units == AW_UNITS_METRIC)
    {
      switch (q)
        {
        case AW_QTY_SIGHT_HEIGHT:
          return shown / 1000.0;
        case AW_QTY_BAND:
          return shown / 100.0;
        default:
          return shown;
        }
    }

  switch (q)
    {
    case AW_QTY_VELOCITY:
      return aw_fps_to_mps (shown);
    case AW_QTY_DISTANCE:
      return aw_yd_to_m (shown);
    case AW_QTY_HEIGHT:
    case AW_QTY_ALTITUDE:
      return aw_ft_to_m (shown);
    case AW_QTY_SIGHT_HEIGHT:
    case AW_QTY_BAND:
      return shown * AW_CM_PER_IN / 100.0;
    case AW_QTY_SMALL_CM:
      return shown * AW_CM_PER_IN;
    case AW_QTY_TEMPERATURE:
      return aw_f_to_c (shown);
    case AW_QTY_PRESSURE:
      return aw_inhg_to_hpa (shown);
    case AW_QTY_WIND:
      return shown * AW_MPS_PER_MPH;
    default:
      return shown;
    }
}

const char *
aw_qty_unit (AwQuantity   q,
             AwUnitSystem units)
{
  gboolean metric = units == AW_UNITS_METRIC;

  switch (q)
    {
    case AW_QTY_VELOCITY:
      return metric ? "m/s" : "fps";
    case AW_QTY_DISTANCE:
      return metric ? "m" : "yd";
    case AW_QTY_HEIGHT:
    case AW_QTY_ALTITUDE:
      return metric ? "m" : "ft";
    case AW_QTY_SIGHT_HEIGHT:
      return metric ? "mm" : "in";
    case AW_QTY_BAND:
    case AW_QTY_SMALL_CM:
      return metric ? "cm" : "in";
    case AW_QTY_MASS_G:
      return "g";
    case AW_QTY_DIAMETER_MM:
      return "mm";
    case AW_QTY_ENERGY:
      return "J";
    case AW_QTY_TEMPERATURE:
      return metric ? "°C" : "°F";
    case AW_QTY_PRESSURE:
      return metric ? "hPa" : "inHg";
    case AW_QTY_WIND:
      return metric ? "m/s" : "mph";
    case AW_QTY_PERCENT:
      return "%";
    case AW_QTY_DEGREES:
      return "°";
    case AW_QTY_SPIN_RPM:
      return "rpm";
    case AW_QTY_TIME:
      return "s";
    case AW_QTY_CREEP:
      return "% / 0.1 g";
    case AW_QTY_FACTOR:
      return "×";
    case AW_QTY_NONE:
    case AW_N_QTY:
    default:
      return "";
    }
}

int
aw_qty_digits (AwQuantity   q,
               AwUnitSystem units)
{
  gboolean metric = units == AW_UNITS_METRIC;

  switch (q)
    {
    case AW_QTY_VELOCITY:
      return metric ? 1 : 0;
    case AW_QTY_DISTANCE:
    case AW_QTY_HEIGHT:
      return metric ? 1 : 1;
    case AW_QTY_SIGHT_HEIGHT:
      return metric ? 0 : 2;
    case AW_QTY_BAND:
    case AW_QTY_SMALL_CM:
      return 1;
    case AW_QTY_MASS_G:
    case AW_QTY_DIAMETER_MM:
    case AW_QTY_ENERGY:
      return 2;
    case AW_QTY_TEMPERATURE:
      return 1;
    case AW_QTY_PRESSURE:
      return metric ? 1 : 2;
    case AW_QTY_ALTITUDE:
    case AW_QTY_PERCENT:
    case AW_QTY_DEGREES:
    case AW_QTY_SPIN_RPM:
      return 0;
    case AW_QTY_WIND:
      return 1;
    case AW_QTY_TIME:
      return 3;
    case AW_QTY_CREEP:
    case AW_QTY_FACTOR:
    case AW_QTY_NONE:
    case AW_N_QTY:
    default:
      return 2;
    }
}

char *
aw_format_number (double v,
                  int    digits)
{
  char *s;

  if (!isfinite (v))
    return g_strdup ("—");
  digits = CLAMP (digits, 0, 9);
  s = g_strdup_printf ("%.*f", digits, v);
  /* "-0.0" → "0.0" */
  if (s[0] == '-')
    {
      gboolean all_zero = TRUE;
      for (const char *p = s + 1; *p; p++)
        if (*p >= '1' && *p <= '9')
          all_zero = FALSE;
      if (all_zero)
        memmove (s, s + 1, strlen (s));
    }
  return s;
}

char *
aw_qty_format_number (AwQuantity   q,
                      AwUnitSystem units,
                      double       base)
{
  return aw_format_number (aw_qty_to_display (q, units, base), aw_qty_digits (q, units));
}

char *
aw_qty_format (AwQuantity   q,
               AwUnitSystem units,
               double       base)
{
  g_autofree char *num = aw_qty_format_number (q, units, base);
  const char *unit = aw_qty_unit (q, units);

  if (!isfinite (base) || unit[0] == '\0')
    return g_steal_pointer (&num);
  if (q == AW_QTY_DEGREES)
    return g_strconcat (num, unit, NULL);
  /* U+202F narrow no-break space keeps the number and its unit together */
  return g_strconcat (num, "\u202f", unit, NULL);
}

static gboolean
parse_with (const char *text,
            gboolean    ascii,
            double     *out)
{
  char *end = NULL;
  double v;

  errno = 0;
  v = ascii ? g_ascii_strtod (text, &end) : strtod (text, &end);
  if (end == text || errno == ERANGE)
    return FALSE;
  while (*end == ' ' || *end == '\t')
    end++;
  if (*end != '\0' || !isfinite (v))
    return FALSE;
  *out = v;
  return TRUE;
}

gboolean
aw_parse_number (const char *text,
                 double     *out)
{
  g_autofree char *copy = NULL;
  char *p;

  g_return_val_if_fail (out != NULL, FALSE);

  if (text == NULL)
    return FALSE;
  copy = g_strstrip (g_strdup (text));
  if (copy[0] == '\0')
    return FALSE;
  /* the Unicode minus sign typed or pasted from elsewhere */
  while ((p = strstr (copy, "\u2212")) != NULL)
    {
      *p = '-';
      memmove (p + 1, p + 3, strlen (p + 3) + 1);
    }
  /* no hex floats, infinities or NaN spelled out */
  for (p = copy; *p; p++)
    if (g_ascii_isalpha (*p) && *p != 'e' && *p != 'E')
      return FALSE;
  if (parse_with (copy, FALSE, out))
    return TRUE;
  return parse_with (copy, TRUE, out);
}

char *
aw_format_ascii (double v,
                 int    digits)
{
  char buf[G_ASCII_DTOSTR_BUF_SIZE];

  if (!isfinite (v))
    return g_strdup ("");
  if (v == 0.0)
    v = 0.0;
  if (digits > 0)
    {
      char fmt[16];
      g_snprintf (fmt, sizeof fmt, "%%.%dg", digits);
      g_ascii_formatd (buf, sizeof buf, fmt, v);
    }
  else
    g_ascii_dtostr (buf, sizeof buf, v);
  return g_strdup (buf);
}
