/* aw-compute.c: background computation of setups, coalesced per setup
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <math.h>
#include <string.h>

#include "aw-compute.h"
#include "aw-units.h"

typedef struct
{
  gboolean running;
  AwComputeRequest *pending;
  guint64 serial;               /* of the newest request */
} Slot;

typedef struct
{
  AwComputeRequest request;
  guint slot;
  guint64 serial;
  guint epoch;
} Job;

struct _AwComputer
{
  GObject parent_instance;

  AwComputeFunc func;
  gpointer user_data;
  GHashTable *slots;            /* guint slot → Slot* */
  guint epoch;
  guint n_running;
  GCancellable *cancellable;
};

G_DEFINE_FINAL_TYPE (AwComputer, aw_computer, G_TYPE_OBJECT)

static void
compute_result_clear (gpointer data)
{
  AwComputeResult *result = data;

  g_free (result->samples);
  if (result->has_table)
    aw_range_table_clear (&result->table);
}

AwComputeResult *
aw_compute_result_ref (AwComputeResult *result)
{
  return g_atomic_rc_box_acquire (result);
}

void
aw_compute_result_unref (AwComputeResult *result)
{
  g_atomic_rc_box_release_full (result, compute_result_clear);
}

AwComputeResult *
aw_compute_run (const AwComputeRequest *request)
{
  AwComputeResult *result = g_atomic_rc_box_new0 (AwComputeResult);
  AwAnalysisInput in = request->input;
  gint64 start = g_get_monotonic_time ();

  result->bridge = request->bridge;
  result->table_wanted = request->want_table;
  result->mass_kg = in.shot.mass_kg;
  result->velocity_mps = in.shot.velocity_mps;
  result->energy_j = aw_energy_j (in.shot.mass_kg, in.shot.velocity_mps);
  if (request->bridge != AW_BRIDGE_OK)
    {
      result->status = AW_ANALYSIS_BAD_INPUT;
      return result;
    }

  if (request->want_table)
    {
      double step = request->table_step_m > 0 ? request->table_step_m : 5.0;

      result->status = aw_range_table_build (&in, step, 0.0, request->min_engagement_m,
                                             &result->table);
      result->has_table = TRUE;
      result->band = result->table.band;
    }
  else
    result->status = aw_analysis_solve (&in, &result->band);

  if (result->status >= 0 && isfinite (result->band.spin_rad_s)
      && isfinite (result->band.elevation_rad))
    {
      AwShot shot = in.shot;
      AwFlightOptions opt;
      AwTrajectory traj = { 0 };

      shot.spin_rad_s = result->band.spin_rad_s;
      shot.elevation_rad = result->band.elevation_rad;
      aw_flight_options_init (&opt);
      opt.sample_step_m = request->plot_step_m > 0 ? request->plot_step_m : 0.25;
      opt.keep_samples = true;
      if (aw_flight_run (&shot, &opt, &traj) >= 0 && traj.n_samples > 0)
        {
          result->samples = g_steal_pointer (&traj.samples);
          result->n_samples = traj.n_samples;
          traj.n_samples = 0;
          traj.samples_alloc = 0;
        }
      aw_trajectory_clear (&traj);
    }

  result->elapsed_us = g_get_monotonic_time () - start;
  return result;
}

static void
slot_free (gpointer data)
{
  Slot *slot = data;

  g_free (slot->pending);
  g_free (slot);
}

static void
aw_computer_dispose (GObject *object)
{
  AwComputer *self = AW_COMPUTER (object);

  g_cancellable_cancel (self->cancellable);
  G_OBJECT_CLASS (aw_computer_parent_class)->dispose (object);
}

static void
aw_computer_finalize (GObject *object)
{
  AwComputer *self = AW_COMPUTER (object);

  g_clear_pointer (&self->slots, g_hash_table_unref);
  g_clear_object (&self->cancellable);
  G_OBJECT_CLASS (aw_computer_parent_class)->finalize (object);
}

static void
aw_computer_class_init (AwComputerClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);

  object_class->dispose = aw_computer_dispose;
  object_class->finalize = aw_computer_finalize;
}

static void
aw_computer_init (AwComputer *self)
{
  self->slots = g_hash_table_new_full (g_direct_hash, g_direct_equal, NULL, slot_free);
  self->cancellable = g_cancellable_new ();
}

AwComputer *
aw_computer_new (AwComputeFunc func,
                 gpointer      user_data)
{
  AwComputer *self = g_object_new (AW_TYPE_COMPUTER, NULL);

  self->func = func;
  self->user_data = user_data;
  return self;
}

static void
compute_thread (GTask        *task,
                gpointer      source_object,
                gpointer      task_data,
                GCancellable *cancellable)
{
  Job *job = task_data;

  if (g_cancellable_is_cancelled (cancellable))
    {
      g_task_return_pointer (task, NULL, NULL);
      return;
    }
  g_task_return_pointer (task, aw_compute_run (&job->request),
                         (GDestroyNotify) aw_compute_result_unref);
}

static void start_job (AwComputer *self, guint slot_id, Slot *slot, AwComputeRequest *request);

static void
compute_done (GObject      *source,
              GAsyncResult *res,
              gpointer      user_data)
{
  AwComputer *self = AW_COMPUTER (source);
  Job *job = g_task_get_task_data (G_TASK (res));
  g_autoptr (AwComputeResult) result = g_task_propagate_pointer (G_TASK (res), NULL);
  Slot *slot;

  self->n_running--;
  if (job->epoch != self->epoch)
    return;

  slot = g_hash_table_lookup (self->slots, GUINT_TO_POINTER (job->slot));
  if (slot == NULL)
    return;
  slot->running = FALSE;

  /* only the newest request of the slot reports */
  if (result != NULL && job->serial == slot->serial && self->func != NULL)
    self->func (job->slot, result, self->user_data);

  if (slot->pending != NULL && self->func != NULL)
    start_job (self, job->slot, slot, g_steal_pointer (&slot->pending));
}

static void
start_job (AwComputer       *self,
           guint             slot_id,
           Slot             *slot,
           AwComputeRequest *request)
{
  g_autoptr (GTask) task = NULL;
  Job *job = g_new0 (Job, 1);

  job->request = *request;
  job->slot = slot_id;
  job->serial = slot->serial;
  job->epoch = self->epoch;
  g_free (request);

  slot->running = TRUE;
  self->n_running++;
  task = g_task_new (self, self->cancellable, compute_done, NULL);
  g_task_set_source_tag (task, start_job);
  g_task_set_task_data (task, job, g_free);
  g_task_run_in_thread (task, compute_thread);
}

void
aw_computer_request (AwComputer             *self,
                     guint                   slot_id,
                     const AwComputeRequest *request)
{
  Slot *slot;

  g_return_if_fail (AW_IS_COMPUTER (self));
  g_return_if_fail (request != NULL);

  slot = g_hash_table_lookup (self->slots, GUINT_TO_POINTER (slot_id));
  if (slot == NULL)
    {
      slot = g_new0 (Slot, 1);
      g_hash_table_insert (self->slots, GUINT_TO_POINTER (slot_id), slot);
    }
  slot->serial++;
  if (slot->running)
    {
      g_free (slot->pending);
      slot->pending = g_memdup2 (request, sizeof *request);
      return;
    }
  start_job (self, slot_id, slot, g_memdup2 (request, sizeof *request));
}

void
aw_computer_reset (AwComputer *self)
{
  g_return_if_fail (AW_IS_COMPUTER (self));

  self->epoch++;
  g_hash_table_remove_all (self->slots);
}

void
aw_computer_shutdown (AwComputer *self)
{
  g_return_if_fail (AW_IS_COMPUTER (self));

  self->func = NULL;
  self->user_data = NULL;
  aw_computer_reset (self);
  g_cancellable_cancel (self->cancellable);
}

gboolean
aw_computer_is_idle (AwComputer *self)
{
  GHashTableIter iter;
  gpointer value;

  g_return_val_if_fail (AW_IS_COMPUTER (self), TRUE);

  if (self->n_running > 0)
    return FALSE;
  g_hash_table_iter_init (&iter, self->slots);
  while (g_hash_table_iter_next (&iter, NULL, &value))
    if (((Slot *) value)->pending != NULL)
      return FALSE;
  return TRUE;
}
