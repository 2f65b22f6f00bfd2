/* aw-core-error.h: the error domain of core's GLib layer
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Core never builds sentences for people; where a GError carries a message it is a technical
 * description (a JSON path and a rule) that the command line prints as it is and the window shows
 * next to a translated headline.
 */
#pragma once

#include <glib.h>

G_BEGIN_DECLS

#define AW_CORE_ERROR (aw_core_error_quark ())

typedef enum
{
  AW_CORE_ERROR_INVALID,      /* a value out of range or of the wrong type */
  AW_CORE_ERROR_SYNTAX,       /* a file that does not parse */
  AW_CORE_ERROR_VERSION,      /* a file written by a newer major version */
  AW_CORE_ERROR_IO,           /* reading or writing failed */
  AW_CORE_ERROR_CANCELLED,
} AwCoreError;

GQuark aw_core_error_quark (void);

G_END_DECLS
