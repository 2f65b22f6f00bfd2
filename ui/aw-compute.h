/* aw-compute.h: background computation of setups, coalesced per setup
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Each request names a slot (the setup's position). While a slot is being computed, newer
 * requests for it replace each other and only the newest one runs next, so typing in a field
 * never piles up work. Results arrive in the main context through the callback; results of a
 * request that has since been replaced, or of an earlier epoch (aw_computer_reset), are dropped.
 */
#pragma once

#include <gio/gio.h>

#include "aw-analysis.h"
#include "aw-project.h"

G_BEGIN_DECLS

typedef struct
{
  AwAnalysisInput input;
  AwBridgeStatus bridge;        /* not OK: nothing to compute, the result says why */
  gboolean want_table;
  double table_step_m;
  double min_engagement_m;      /* NAN: none */
  double plot_step_m;           /* sample spacing of the trajectory for the plot */
} AwComputeRequest;

typedef struct
{
  AwBridgeStatus bridge;
  AwAnalysisStatus status;
  AwBandResult band;
  double velocity_mps;
  double energy_j;
  double mass_kg;
  AwSample *samples;            /* trajectory with the solved hop and elevation, for the plot */
  size_t n_samples;
  gboolean table_wanted;         /* the request asked for a table (it may still have failed) */
  gboolean has_table;
  AwRangeTable table;
  gint64 elapsed_us;            /* time spent computing (worker thread) */
} AwComputeResult;

AwComputeResult *aw_compute_result_ref (AwComputeResult *result);
void aw_compute_result_unref (AwComputeResult *result);
G_DEFINE_AUTOPTR_CLEANUP_FUNC (AwComputeResult, aw_compute_result_unref)

/* The computation itself (runs in the calling thread). */
AwComputeResult *aw_compute_run (const AwComputeRequest *request);

typedef void (*AwComputeFunc) (guint slot, AwComputeResult *result, gpointer user_data);

#define AW_TYPE_COMPUTER (aw_computer_get_type ())
G_DECLARE_FINAL_TYPE (AwComputer, aw_computer, AW, COMPUTER, GObject)

AwComputer *aw_computer_new (AwComputeFunc func, gpointer user_data);
void aw_computer_request (AwComputer *self, guint slot, const AwComputeRequest *request);
/* Forgets every slot: pending requests are dropped and running ones will not report. */
void aw_computer_reset (AwComputer *self);
/* No callback after this (the owner is going away). */
void aw_computer_shutdown (AwComputer *self);
/* TRUE when nothing runs or waits. */
gboolean aw_computer_is_idle (AwComputer *self);

G_END_DECLS
