/* aw-core-error.c
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-core-error.h"

G_DEFINE_QUARK (aw-core-error-quark, aw_core_error)
