/* aw-sweep-panel.c: the sweep panel
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Threads: a sweep runs in a GTask worker, which itself spreads the points over several threads
 * (aw_sweep_run). The worker reports progress into its Run under a mutex and schedules at most
 * one low-priority idle at a time, which moves the progress bar in the main thread. Every Run
 * carries the generation it was started in; results of a Run that is no longer the panel's
 * (stopped, restarted, panel disposed) are dropped when they arrive.
 */
#include "aw-config.h"

#include <math.h>
#include <glib/gi18n.h>

#include "aw-sweep-panel.h"
#include "aw-sweep-plot.h"

/* the generated resource (registered by hand: a static library would drop its constructor) */
GResource *aw_sweep_get_resource (void);
void aw_sweep_register_resource (void);

#define RESTART_DELAY_MS 250
#define HOVER_DISTANCE_PX 40.0

/* ---- one sweep in progress ---- */

typedef struct
{
  AwSweepPanel *panel;        /* main thread only; NULL once the panel no longer waits for it */
  guint generation;
  AwProject *project;         /* the worker's own copy: names and power points live here */
  AwSweepSetup *setups;
  guint n_setups;
  GArray *colors;             /* AwRgba per setup, for the plot */
  AwSweepDesc desc;
  guint n_threads;
  GMutex lock;
  double fraction;            /* under lock */
  gboolean idle_pending;      /* under lock */
  gint64 started_us;
} Run;

static void
run_clear (Run *run)
{
  g_mutex_clear (&run->lock);
  g_clear_pointer (&run->project, aw_project_free);
  g_clear_pointer (&run->setups, g_free);
  g_clear_pointer (&run->colors, g_array_unref);
}

static Run *
run_ref (Run *run)
{
  return g_atomic_rc_box_acquire (run);
}

static void
run_unref (Run *run)
{
  g_atomic_rc_box_release_full (run, (GDestroyNotify) run_clear);
}

/* ---- the panel ---- */

struct _AwSweepPanel
{
  GtkWidget parent_instance;

  /* template widgets */
  GtkGrid *controls;
  GtkDropDown *var1_drop;
  GtkDropDown *var2_drop;
  GtkDropDown *metric_drop;
  GtkDropDown *hop_drop;
  GtkDropDown *site_drop;
  GtkSpinButton *from1;
  GtkSpinButton *to1;
  GtkSpinButton *n1;
  GtkSpinButton *from2;
  GtkSpinButton *to2;
  GtkSpinButton *n2;
  GtkSpinButton *at_distance;
  GtkLabel *unit1;
  GtkLabel *unit2;
  GtkLabel *from2_label;
  GtkLabel *to2_label;
  GtkLabel *n2_in_label;
  GtkLabel *n2_label;
  GtkLabel *at_label;
  GtkLabel *at_unit;
  GtkLabel *status_label;
  GtkFlowBox *setups_box;
  GtkButton *run_button;
  GtkButton *stop_button;
  GtkProgressBar *progress;
  GtkMenuButton *export_button;
  GtkDrawingArea *plot;

  /* owned */
  AwProject *project;
  GHashTable *excluded;       /* names of setups left out */
  GArray *sites;              /* AwSiteClass per entry of site_drop (0: no limit) */
  AwSweepResult *result;
  GArray *result_colors;      /* AwRgba per setup of result */
  AwSweepPlotScene scene;
  Run *run;                   /* the sweep in progress */
  GCancellable *cancellable;
  guint generation;
  guint runs_started;
  guint restart_id;
  guint n_threads;
  double progress_value;
  gboolean running;
  gboolean live;              /* after Run: changes restart the sweep; after Stop: they do not */
  gboolean updating;          /* controls set by code: no change events */
};

G_DEFINE_FINAL_TYPE (AwSweepPanel, aw_sweep_panel, GTK_TYPE_WIDGET)

enum
{
  PROP_0,
  PROP_RUNNING,
  N_PROPS
};

static GParamSpec *properties[N_PROPS];

/* Defaults per varied input: range, points, spin step. Values are in the input's unit. */
typedef struct
{
  double lo, hi;
  guint n;
  double step;
} VarDefault;

static const VarDefault var_defaults[AW_SWEEP_N_VARS] = {
  [AW_SWEEP_VAR_NONE] = { 0, 0, 1, 1 },
  [AW_SWEEP_VAR_LIFT_RATIO] = { 0.0, 3.0, 31, 0.05 },
  [AW_SWEEP_VAR_SPIN_RPM] = { 0.0, 20000.0, 41, 500.0 },
  [AW_SWEEP_VAR_MASS_G] = { 0.20, 0.48, 15, 0.01 },
  [AW_SWEEP_VAR_ENERGY_J] = { 0.8, 2.0, 13, 0.05 },
  [AW_SWEEP_VAR_CROSSWIND_MPS] = { -4.0, 4.0, 17, 0.5 },
  [AW_SWEEP_VAR_HEIGHT_M] = { 0.3, 2.0, 18, 0.1 },
  [AW_SWEEP_VAR_TEMPERATURE_C] = { -10.0, 35.0, 10, 1.0 },
};

static void update_actions (AwSweepPanel *self);
static void inputs_changed (AwSweepPanel *self);

static AwSweepVar
var1_of (AwSweepPanel *self)
{
  return (AwSweepVar) (gtk_drop_down_get_selected (self->var1_drop) + 1);
}

static AwSweepVar
var2_of (AwSweepPanel *self)
{
  guint pos = gtk_drop_down_get_selected (self->var2_drop);
  return pos == GTK_INVALID_LIST_POSITION ? AW_SWEEP_VAR_NONE : (AwSweepVar) pos;
}

static void
set_status (AwSweepPanel *self, const char *text)
{
  gtk_label_set_text (self->status_label, text ? text : "");
}

static void
set_progress (AwSweepPanel *self, double f)
{
  g_autofree char *text = NULL;
  self->progress_value = f;
  gtk_progress_bar_set_fraction (self->progress, f);
  text = g_strdup_printf (_("%.0f %%"), 100.0 * f);
  gtk_progress_bar_set_text (self->progress, text);
}

static void
set_running (AwSweepPanel *self, gboolean running)
{
  if (self->running == running)
    return;
  self->running = running;
  update_actions (self);
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_RUNNING]);
}

static void
drop_result (AwSweepPanel *self)
{
  g_clear_pointer (&self->result, aw_sweep_result_free);
  g_clear_pointer (&self->result_colors, g_array_unref);
  self->scene.result = NULL;
  self->scene.colors = NULL;
  self->scene.has_hover = FALSE;
  gtk_accessible_update_property (GTK_ACCESSIBLE (self->plot),
                                  GTK_ACCESSIBLE_PROPERTY_DESCRIPTION, "", -1);
  update_actions (self);
}

/* Forgets the sweep in progress (it is cancelled; its result will be dropped). */
static void
forget_run (AwSweepPanel *self)
{
  if (self->cancellable)
    g_cancellable_cancel (self->cancellable);
  g_clear_object (&self->cancellable);
  if (self->run)
    {
      self->run->panel = NULL;
      g_clear_pointer (&self->run, run_unref);
    }
  set_running (self, FALSE);
}

/* ---- controls ---- */

static void
configure_spin (GtkSpinButton *spin, AwSweepVar var, double value)
{
  double lo, hi;
  aw_sweep_var_range (var, &lo, &hi);
  gtk_spin_button_set_digits (spin, (guint) aw_sweep_var_digits (var));
  gtk_spin_button_set_range (spin, lo, hi);
  gtk_spin_button_set_increments (spin, var_defaults[var].step, var_defaults[var].step * 10);
  gtk_spin_button_set_value (spin, value);
}

static void
configure_axis (AwSweepPanel *self, guint k, AwSweepVar var, double lo, double hi, guint n)
{
  GtkSpinButton *from = k == 0 ? self->from1 : self->from2;
  GtkSpinButton *to = k == 0 ? self->to1 : self->to2;
  GtkSpinButton *count = k == 0 ? self->n1 : self->n2;
  GtkLabel *unit = k == 0 ? self->unit1 : self->unit2;
  gboolean used = var != AW_SWEEP_VAR_NONE;

  if (used)
    {
      configure_spin (from, var, lo);
      configure_spin (to, var, hi);
      gtk_spin_button_set_value (count, n);
    }
  gtk_label_set_text (unit, used ? aw_sweep_var_unit (var) : "");
  if (k == 1)
    {
      GtkWidget *w[] = { GTK_WIDGET (self->from2), GTK_WIDGET (self->to2),
                         GTK_WIDGET (self->n2), GTK_WIDGET (self->from2_label),
                         GTK_WIDGET (self->to2_label), GTK_WIDGET (self->n2_in_label),
                         GTK_WIDGET (self->n2_label) };
      for (guint i = 0; i < G_N_ELEMENTS (w); i++)
        gtk_widget_set_sensitive (w[i], used);
    }
}

static void
on_var_changed (GtkDropDown *drop, GParamSpec *pspec, AwSweepPanel *self)
{
  gboolean first = drop == self->var1_drop;
  AwSweepVar var = first ? var1_of (self) : var2_of (self);
  gboolean was = self->updating;

  if (was)
    return;
  self->updating = TRUE;
  configure_axis (self, first ? 0 : 1, var, var_defaults[var].lo, var_defaults[var].hi,
                  first || var_defaults[var].n <= 25 ? var_defaults[var].n : 25);
  self->updating = was;
  inputs_changed (self);
}

static void
on_value_changed (GtkSpinButton *spin, AwSweepPanel *self)
{
  inputs_changed (self);
}

static void
on_choice_changed (GtkDropDown *drop, GParamSpec *pspec, AwSweepPanel *self)
{
  inputs_changed (self);
}

static void
on_metric_changed (GtkDropDown *drop, GParamSpec *pspec, AwSweepPanel *self)
{
  guint pos = gtk_drop_down_get_selected (drop);
  gboolean at;

  if (pos == GTK_INVALID_LIST_POSITION || pos >= AW_SWEEP_N_METRICS)
    return;
  self->scene.metric = (AwSweepMetric) pos;
  at = aw_sweep_metric_is_at_distance (self->scene.metric);
  gtk_widget_set_sensitive (GTK_WIDGET (self->at_distance), at);
  gtk_widget_set_sensitive (GTK_WIDGET (self->at_label), at);
  gtk_widget_set_sensitive (GTK_WIDGET (self->at_unit), at);
  /* every metric was computed: only the picture changes */
  self->scene.has_hover = FALSE;
  gtk_widget_queue_draw (GTK_WIDGET (self->plot));
}

void
aw_sweep_panel_get_desc (AwSweepPanel *self, AwSweepDesc *desc)
{
  guint site, hop;

  g_return_if_fail (AW_IS_SWEEP_PANEL (self));
  g_return_if_fail (desc != NULL);

  aw_sweep_desc_init (desc);
  desc->axis[0] = (AwSweepAxis) { var1_of (self), gtk_spin_button_get_value (self->from1),
                                  gtk_spin_button_get_value (self->to1),
                                  (guint) gtk_spin_button_get_value_as_int (self->n1) };
  desc->axis[1] = (AwSweepAxis) { var2_of (self), gtk_spin_button_get_value (self->from2),
                                  gtk_spin_button_get_value (self->to2),
                                  (guint) gtk_spin_button_get_value_as_int (self->n2) };
  if (desc->axis[1].var == AW_SWEEP_VAR_NONE)
    desc->axis[1] = (AwSweepAxis) { AW_SWEEP_VAR_NONE, 0.0, 0.0, 1 };
  for (guint k = 0; k < 2; k++)
    if (desc->axis[k].n == 1)
      desc->axis[k].hi = desc->axis[k].lo;
  hop = gtk_drop_down_get_selected (self->hop_drop);
  desc->hop = hop <= AW_SWEEP_HOP_AUTO ? (AwSweepHop) hop : AW_SWEEP_HOP_DEFAULT;
  desc->at_distance_m = gtk_spin_button_get_value (self->at_distance);
  site = gtk_drop_down_get_selected (self->site_drop);
  if (self->sites && site != GTK_INVALID_LIST_POSITION && site < self->sites->len)
    desc->site = g_array_index (self->sites, AwSiteClass, site);
}

void
aw_sweep_panel_set_desc (AwSweepPanel *self, const AwSweepDesc *desc)
{
  gboolean was;

  g_return_if_fail (AW_IS_SWEEP_PANEL (self));
  g_return_if_fail (desc != NULL);
  g_return_if_fail (desc->axis[0].var > AW_SWEEP_VAR_NONE && desc->axis[0].var < AW_SWEEP_N_VARS);
  g_return_if_fail ((unsigned) desc->axis[1].var < AW_SWEEP_N_VARS);

  was = self->updating;
  self->updating = TRUE;
  gtk_drop_down_set_selected (self->var1_drop, desc->axis[0].var - 1);
  gtk_drop_down_set_selected (self->var2_drop, desc->axis[1].var);
  configure_axis (self, 0, desc->axis[0].var, desc->axis[0].lo, desc->axis[0].hi,
                  desc->axis[0].n);
  configure_axis (self, 1, desc->axis[1].var, desc->axis[1].lo, desc->axis[1].hi,
                  desc->axis[1].n);
  if ((unsigned) desc->hop <= AW_SWEEP_HOP_AUTO)
    gtk_drop_down_set_selected (self->hop_drop, desc->hop);
  if (isfinite (desc->at_distance_m))
    gtk_spin_button_set_value (self->at_distance, desc->at_distance_m);
  self->updating = was;
  inputs_changed (self);
}

/* ---- the project: setups and site classes ---- */

static void
on_setup_toggled (GtkCheckButton *check, AwSweepPanel *self)
{
  const char *name = g_object_get_data (G_OBJECT (check), "aw-setup-name");
  if (gtk_check_button_get_active (check))
    g_hash_table_remove (self->excluded, name);
  else
    g_hash_table_add (self->excluded, g_strdup (name));
  inputs_changed (self);
}

static void
rebuild_setups (AwSweepPanel *self)
{
  GtkWidget *child;

  while ((child = gtk_widget_get_first_child (GTK_WIDGET (self->setups_box))) != NULL)
    gtk_flow_box_remove (self->setups_box, child);
  if (self->project == NULL)
    return;
  for (guint i = 0; i < self->project->setups->len; i++)
    {
      AwSetup *s = g_ptr_array_index (self->project->setups, i);
      GtkWidget *check = gtk_check_button_new_with_label (s->name);
      g_object_set_data_full (G_OBJECT (check), "aw-setup-name", g_strdup (s->name), g_free);
      gtk_check_button_set_active (GTK_CHECK_BUTTON (check),
                                   !g_hash_table_contains (self->excluded, s->name));
      g_signal_connect (check, "toggled", G_CALLBACK (on_setup_toggled), self);
      gtk_flow_box_append (self->setups_box, check);
    }
}

static void
rebuild_sites (AwSweepPanel *self)
{
  g_autoptr (GtkStringList) list = gtk_string_list_new (NULL);
  g_autofree char *previous = NULL;
  guint keep = 0, old = gtk_drop_down_get_selected (self->site_drop);
  GListModel *old_model = gtk_drop_down_get_model (self->site_drop);
  AwSiteClass none = { NAN, NAN, NAN };
  gboolean was = self->updating;

  if (old_model && old != GTK_INVALID_LIST_POSITION && old > 0)
    previous = g_strdup (gtk_string_list_get_string (GTK_STRING_LIST (old_model), old));

  g_array_set_size (self->sites, 0);
  g_array_append_val (self->sites, none);
  gtk_string_list_append (list, _("No limit"));
  if (self->project)
    for (guint i = 0; i < self->project->site_rules->len; i++)
      {
        AwSiteRules *rules = g_ptr_array_index (self->project->site_rules, i);
        for (guint j = 0; j < rules->classes->len; j++)
          {
            AwSiteClassRule *rule = g_ptr_array_index (rules->classes, j);
            AwSiteClass site;
            g_autofree char *limit = aw_chart_format_number (rule->energy_limit_j, 2);
            /* TRANSLATORS: site rules, class and its energy limit: "Field A — rifle (1,49 J)" */
            g_autofree char *label = g_strdup_printf (_("%s — %s (%s J)"), rules->name,
                                                      rule->name, limit);
            aw_site_class_rule_to_site_class (rule, &site);
            g_array_append_val (self->sites, site);
            gtk_string_list_append (list, label);
            if (previous && g_str_equal (previous, label))
              keep = self->sites->len - 1;
          }
      }
  self->updating = TRUE;
  gtk_drop_down_set_model (self->site_drop, G_LIST_MODEL (list));
  gtk_drop_down_set_selected (self->site_drop, keep);
  self->updating = was;
}

static gboolean
same_setup_names (const AwProject *a, const AwProject *b)
{
  if (a == NULL || b == NULL)
    return a == b;
  if (a->setups->len != b->setups->len)
    return FALSE;
  for (guint i = 0; i < a->setups->len; i++)
    if (!g_str_equal (((AwSetup *) g_ptr_array_index (a->setups, i))->name,
                      ((AwSetup *) g_ptr_array_index (b->setups, i))->name))
      return FALSE;
  return TRUE;
}

void
aw_sweep_panel_set_project (AwSweepPanel *self, const AwProject *project)
{
  AwProject *old;
  gboolean names_same;

  g_return_if_fail (AW_IS_SWEEP_PANEL (self));

  if (project && self->project && aw_project_equal (project, self->project))
    return;
  old = self->project;
  self->project = project ? aw_project_copy (project) : NULL;
  names_same = same_setup_names (old, self->project);
  if (old)
    aw_project_free (old);
  if (!names_same)
    rebuild_setups (self);
  rebuild_sites (self);
  update_actions (self);
  inputs_changed (self);
}

void
aw_sweep_panel_set_setup_included (AwSweepPanel *self, const char *name, gboolean included)
{
  GtkWidget *check;

  g_return_if_fail (AW_IS_SWEEP_PANEL (self));
  g_return_if_fail (name != NULL);

  for (GtkWidget *cell = gtk_widget_get_first_child (GTK_WIDGET (self->setups_box)); cell;
       cell = gtk_widget_get_next_sibling (cell))
    {
      const char *n;
      check = gtk_flow_box_child_get_child (GTK_FLOW_BOX_CHILD (cell));
      n = check ? g_object_get_data (G_OBJECT (check), "aw-setup-name") : NULL;
      if (n && g_str_equal (n, name))
        {
          /* the toggled handler records it */
          gtk_check_button_set_active (GTK_CHECK_BUTTON (check), included);
          return;
        }
    }
  /* a setup not (yet) in the project */
  if (included)
    g_hash_table_remove (self->excluded, name);
  else
    g_hash_table_add (self->excluded, g_strdup (name));
}

gboolean
aw_sweep_panel_get_setup_included (AwSweepPanel *self, const char *name)
{
  g_return_val_if_fail (AW_IS_SWEEP_PANEL (self), FALSE);
  return name != NULL && !g_hash_table_contains (self->excluded, name);
}

void
aw_sweep_panel_set_site_class (AwSweepPanel *self, guint position)
{
  g_return_if_fail (AW_IS_SWEEP_PANEL (self));
  if (position < self->sites->len)
    gtk_drop_down_set_selected (self->site_drop, position);
}

void
aw_sweep_panel_set_metric (AwSweepPanel *self, AwSweepMetric metric)
{
  g_return_if_fail (AW_IS_SWEEP_PANEL (self));
  g_return_if_fail ((unsigned) metric < AW_SWEEP_N_METRICS);
  gtk_drop_down_set_selected (self->metric_drop, metric);
}

AwSweepMetric
aw_sweep_panel_get_metric (AwSweepPanel *self)
{
  g_return_val_if_fail (AW_IS_SWEEP_PANEL (self), AW_SWEEP_METRIC_BAND_RANGE);
  return self->scene.metric;
}

void
aw_sweep_panel_set_threads (AwSweepPanel *self, guint n_threads)
{
  g_return_if_fail (AW_IS_SWEEP_PANEL (self));
  self->n_threads = n_threads;
}

/* ---- running ---- */

static gboolean
restart_cb (gpointer data)
{
  AwSweepPanel *self = data;
  self->restart_id = 0;
  aw_sweep_panel_run (self);
  return G_SOURCE_REMOVE;
}

/* An input of the sweep changed: the results no longer apply. */
static void
inputs_changed (AwSweepPanel *self)
{
  if (self->updating)
    return;
  drop_result (self);
  if (self->running || self->live)
    {
      /* restart once the user pauses */
      forget_run (self);
      g_clear_handle_id (&self->restart_id, g_source_remove);
      self->restart_id = g_timeout_add (RESTART_DELAY_MS, restart_cb, self);
      update_actions (self);
      self->scene.message = _("Computing…");
      set_status (self, _("The inputs changed: computing again…"));
    }
  else
    {
      self->scene.message = _("Choose what varies, then press Run");
      set_status (self, "");
      set_progress (self, 0.0);
    }
  gtk_widget_queue_draw (GTK_WIDGET (self->plot));
}

static gboolean
progress_idle (gpointer data)
{
  Run *run = data;
  double f;

  g_mutex_lock (&run->lock);
  f = run->fraction;
  run->idle_pending = FALSE;
  g_mutex_unlock (&run->lock);
  if (run->panel && run->panel->run == run && f < 1.0)
    set_progress (run->panel, f);
  return G_SOURCE_REMOVE;
}

/* Worker thread: store, and wake the main thread once. */
static void
progress_cb (double fraction, gpointer data)
{
  Run *run = data;
  gboolean schedule;

  g_mutex_lock (&run->lock);
  run->fraction = fraction;
  schedule = !run->idle_pending;
  run->idle_pending = TRUE;
  g_mutex_unlock (&run->lock);
  if (schedule)
    g_idle_add_full (G_PRIORITY_LOW, progress_idle, run_ref (run), (GDestroyNotify) run_unref);
}

static void
run_thread (GTask *task, gpointer source, gpointer task_data, GCancellable *cancellable)
{
  Run *run = task_data;
  GError *error = NULL;
  AwSweepResult *r = aw_sweep_run (run->setups, run->n_setups, &run->desc, run->n_threads,
                                   progress_cb, run, cancellable, &error);
  if (r)
    g_task_return_pointer (task, r, (GDestroyNotify) aw_sweep_result_free);
  else
    g_task_return_error (task, error);
}

static void
run_done (GObject *source, GAsyncResult *res, gpointer user_data)
{
  AwSweepPanel *self = AW_SWEEP_PANEL (source);
  Run *run = g_task_get_task_data (G_TASK (res));
  g_autoptr (GError) error = NULL;
  AwSweepResult *r = g_task_propagate_pointer (G_TASK (res), &error);
  g_autofree char *status = NULL;
  guint bad = 0;
  gsize total;

  if (run->panel != self || self->run != run)
    {
      /* stopped or replaced meanwhile */
      g_clear_pointer (&r, aw_sweep_result_free);
      return;
    }
  g_clear_object (&self->cancellable);
  g_clear_pointer (&self->run, run_unref);
  run->panel = NULL;
  set_running (self, FALSE);

  if (r == NULL)
    {
      if (g_error_matches (error, G_IO_ERROR, G_IO_ERROR_CANCELLED))
        set_status (self, _("Stopped."));
      else
        {
          g_autofree char *msg = g_strdup_printf (_("The sweep could not be computed: %s"),
                                                  error->message);
          set_status (self, msg);
        }
      self->scene.message = _("No results");
      gtk_widget_queue_draw (GTK_WIDGET (self->plot));
      return;
    }

  drop_result (self);
  self->result = r;
  self->result_colors = g_array_ref (run->colors);
  self->scene.result = r;
  self->scene.colors = (const AwRgba *) self->result_colors->data;
  self->scene.message = NULL;
  set_progress (self, 1.0);
  total = (gsize) r->n_setups * r->n1 * r->n2;
  for (gsize p = 0; p < total; p++)
    bad += r->points[p].status != AW_ANALYSIS_OK;
  {
    double us = (double) (g_get_monotonic_time () - run->started_us);
    g_autofree char *num = aw_chart_format_number (us < 1e6 ? us / 1e3 : us / 1e6,
                                                   us < 1e6 ? 0 : 2);
    /* TRANSLATORS: a duration, "35 ms" or "1,25 s" */
    g_autofree char *took = g_strdup_printf (us < 1e6 ? _("%s ms") : _("%s s"), num);
    if (bad == 0)
      /* TRANSLATORS: "336 points computed in 35 ms." */
      status = g_strdup_printf (ngettext ("%u point computed in %s.",
                                          "%u points computed in %s.", (gulong) total),
                                (guint) total, took);
    else
      status = g_strdup_printf (ngettext ("%u point computed in %s; %u without a value "
                                          "(hover over a gap to see why).",
                                          "%u points computed in %s; %u without a value "
                                          "(hover over a gap to see why).", (gulong) total),
                                (guint) total, took, bad);
  }
  set_status (self, status);
  update_actions (self);
  gtk_widget_queue_draw (GTK_WIDGET (self->plot));
}

static gboolean
check_desc (AwSweepPanel *self, const AwSweepDesc *desc)
{
  const char *problem = NULL;

  if (desc->axis[1].var == desc->axis[0].var)
    problem = _("The second input is the same as the first: choose another one, or none.");
  else if ((desc->axis[0].var == AW_SWEEP_VAR_LIFT_RATIO
            || desc->axis[0].var == AW_SWEEP_VAR_SPIN_RPM)
           && (desc->axis[1].var == AW_SWEEP_VAR_LIFT_RATIO
               || desc->axis[1].var == AW_SWEEP_VAR_SPIN_RPM))
    problem = _("Lift ratio and model spin both set the hop: vary only one of them.");
  else if ((guint64) desc->axis[0].n * aw_sweep_desc_axis_count (desc, 1) > AW_SWEEP_MAX_POINTS)
    problem = _("Too many points: use fewer points per input.");
  else if (!aw_sweep_desc_validate (desc, NULL))
    problem = _("A range is outside what the model accepts.");
  if (problem)
    {
      set_status (self, problem);
      return FALSE;
    }
  return TRUE;
}

void
aw_sweep_panel_run (AwSweepPanel *self)
{
  g_autoptr (GTask) task = NULL;
  g_autoptr (GString) skipped = g_string_new (NULL);
  Run *run;
  AwSweepDesc desc;

  g_return_if_fail (AW_IS_SWEEP_PANEL (self));

  g_clear_handle_id (&self->restart_id, g_source_remove);
  forget_run (self);
  drop_result (self);
  self->live = TRUE;

  aw_sweep_panel_get_desc (self, &desc);
  if (!check_desc (self, &desc))
    {
      self->scene.message = _("No results");
      gtk_widget_queue_draw (GTK_WIDGET (self->plot));
      return;
    }
  if (self->project == NULL)
    {
      set_status (self, _("There is no project."));
      return;
    }

  run = g_atomic_rc_box_new0 (Run);
  g_mutex_init (&run->lock);
  run->project = aw_project_copy (self->project);
  run->setups = g_new0 (AwSweepSetup, run->project->setups->len + 1);
  run->colors = g_array_new (FALSE, TRUE, sizeof (AwRgba));
  for (guint i = 0; i < run->project->setups->len; i++)
    {
      AwSetup *s = g_ptr_array_index (run->project->setups, i);
      GdkRGBA rgba;
      AwRgba c = { 0, 0, 0, 0 };
      if (g_hash_table_contains (self->excluded, s->name))
        continue;
      if (!aw_sweep_setup_from_project (&run->setups[run->n_setups], s, run->project, NULL))
        {
          g_string_append_printf (skipped, skipped->len ? ", “%s”" : "“%s”", s->name);
          continue;
        }
      if (s->colour && gdk_rgba_parse (&rgba, s->colour))
        c = (AwRgba) { rgba.red, rgba.green, rgba.blue, 1.0 };
      g_array_append_val (run->colors, c);
      run->n_setups++;
    }
  if (run->n_setups == 0)
    {
      run_unref (run);
      set_status (self, _("Choose at least one setup that can be computed."));
      self->scene.message = _("No setup takes part");
      gtk_widget_queue_draw (GTK_WIDGET (self->plot));
      return;
    }
  if ((guint64) run->n_setups * desc.axis[0].n * aw_sweep_desc_axis_count (&desc, 1)
      > AW_SWEEP_MAX_POINTS)
    {
      run_unref (run);
      set_status (self, _("Too many points: use fewer points or fewer setups."));
      return;
    }
  run->desc = desc;
  run->n_threads = self->n_threads;
  run->generation = ++self->generation;
  run->started_us = g_get_monotonic_time ();
  run->panel = self;
  self->run = run;
  self->runs_started++;
  self->cancellable = g_cancellable_new ();

  task = g_task_new (self, self->cancellable, run_done, NULL);
  g_task_set_source_tag (task, aw_sweep_panel_run);
  g_task_set_task_data (task, run_ref (run), (GDestroyNotify) run_unref);
  g_task_run_in_thread (task, run_thread);

  set_running (self, TRUE);
  set_progress (self, 0.0);
  self->scene.message = _("Computing…");
  if (skipped->len)
    {
      /* TRANSLATORS: %s lists setup names */
      g_autofree char *msg = g_strdup_printf (_("Computing… Left out because their values are "
                                                "incomplete: %s."), skipped->str);
      set_status (self, msg);
    }
  else
    set_status (self, _("Computing…"));
  gtk_widget_queue_draw (GTK_WIDGET (self->plot));
}

void
aw_sweep_panel_stop (AwSweepPanel *self)
{
  g_return_if_fail (AW_IS_SWEEP_PANEL (self));
  g_clear_handle_id (&self->restart_id, g_source_remove);
  self->live = FALSE;
  if (self->running)
    {
      forget_run (self);
      set_status (self, _("Stopped."));
      self->scene.message = _("Stopped");
      gtk_widget_queue_draw (GTK_WIDGET (self->plot));
    }
}

gboolean
aw_sweep_panel_get_running (AwSweepPanel *self)
{
  g_return_val_if_fail (AW_IS_SWEEP_PANEL (self), FALSE);
  return self->running || self->restart_id != 0;
}

double
aw_sweep_panel_get_progress (AwSweepPanel *self)
{
  g_return_val_if_fail (AW_IS_SWEEP_PANEL (self), 0.0);
  return self->progress_value;
}

const AwSweepResult *
aw_sweep_panel_get_result (AwSweepPanel *self)
{
  g_return_val_if_fail (AW_IS_SWEEP_PANEL (self), NULL);
  return self->result;
}

guint
aw_sweep_panel_get_runs_started (AwSweepPanel *self)
{
  g_return_val_if_fail (AW_IS_SWEEP_PANEL (self), 0);
  return self->runs_started;
}

static void
update_actions (AwSweepPanel *self)
{
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "sweep.run", self->project != NULL);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "sweep.stop",
                                 self->running || self->restart_id != 0);
  gtk_widget_action_set_enabled (GTK_WIDGET (self), "sweep.export", self->result != NULL);
  gtk_widget_set_sensitive (GTK_WIDGET (self->export_button), self->result != NULL);
}

/* ---- plot ---- */

static const AwChartStyle *
panel_style (AwSweepPanel *self)
{
  GdkRGBA fg;
  G_GNUC_BEGIN_IGNORE_DEPRECATIONS
  gtk_style_context_get_color (gtk_widget_get_style_context (GTK_WIDGET (self->plot)), &fg);
  G_GNUC_END_IGNORE_DEPRECATIONS
  /* light text means a dark theme */
  return 0.2126 * fg.red + 0.7152 * fg.green + 0.0722 * fg.blue > 0.5 ? aw_chart_style_dark ()
                                                                       : aw_chart_style_light ();
}

static void
draw_plot (GtkDrawingArea *area, cairo_t *cr, int width, int height, gpointer data)
{
  AwSweepPanel *self = data;
  aw_sweep_plot_render (cr, width, height, &self->scene, panel_style (self));
}

void
aw_sweep_panel_show_readout_at (AwSweepPanel *self, double x, double y)
{
  AwSweepPlotHit hit;
  GtkWidget *plot;
  gboolean had;

  g_return_if_fail (AW_IS_SWEEP_PANEL (self));
  plot = GTK_WIDGET (self->plot);
  had = self->scene.has_hover;
  if (self->result && aw_sweep_plot_hit_test (gtk_widget_get_width (plot),
                                              gtk_widget_get_height (plot), &self->scene,
                                              panel_style (self), x, y, HOVER_DISTANCE_PX, &hit))
    {
      g_autofree char *text = NULL;
      if (had && self->scene.hover_setup == hit.setup && self->scene.hover_i1 == hit.i1
          && self->scene.hover_i2 == hit.i2)
        return;
      self->scene.has_hover = TRUE;
      self->scene.hover_setup = hit.setup;
      self->scene.hover_i1 = hit.i1;
      self->scene.hover_i2 = hit.i2;
      text = aw_sweep_plot_format_readout (&self->scene, &hit);
      gtk_accessible_update_property (GTK_ACCESSIBLE (self->plot),
                                      GTK_ACCESSIBLE_PROPERTY_DESCRIPTION, text, -1);
    }
  else
    self->scene.has_hover = FALSE;
  if (had || self->scene.has_hover)
    gtk_widget_queue_draw (plot);
}

static void
on_motion (GtkEventControllerMotion *motion, double x, double y, AwSweepPanel *self)
{
  aw_sweep_panel_show_readout_at (self, x, y);
}

static void
on_leave (GtkEventControllerMotion *motion, AwSweepPanel *self)
{
  aw_sweep_panel_show_readout_at (self, NAN, NAN);
}

GtkWidget *
aw_sweep_panel_get_plot (AwSweepPanel *self)
{
  g_return_val_if_fail (AW_IS_SWEEP_PANEL (self), NULL);
  return GTK_WIDGET (self->plot);
}

/* ---- export ---- */

gboolean
aw_sweep_panel_export (AwSweepPanel *self, const char *path, gboolean csv, AwPlotFormat fmt,
                       double width, double height, GError **error)
{
  AwSweepPlotScene scene;
  AwChartStyle scaled;

  g_return_val_if_fail (AW_IS_SWEEP_PANEL (self), FALSE);
  g_return_val_if_fail (path != NULL, FALSE);

  if (self->result == NULL)
    {
      g_set_error (error, G_IO_ERROR, G_IO_ERROR_FAILED,
                   _("Cannot save “%s”: there are no results yet"), path);
      return FALSE;
    }
  if (csv)
    return aw_sweep_result_save_csv (self->result, NULL, 0, path, error);

  if (width <= 0 || height <= 0)
    {
      width = gtk_widget_get_width (GTK_WIDGET (self->plot));
      height = gtk_widget_get_height (GTK_WIDGET (self->plot));
      if (width < 100 || height < 100)
        {
          width = 960;
          height = 600;
        }
    }
  scene = self->scene;
  scene.has_hover = FALSE;
  scene.message = NULL;
  if (fmt == AW_PLOT_FORMAT_PNG)
    {
      /* twice the pixels, everything drawn twice as large: sharp on paper and hi-dpi screens */
      aw_chart_style_scaled (aw_chart_style_light (), 2.0, &scaled);
      return aw_sweep_plot_export (&scene, &scaled, path, fmt, 2 * width, 2 * height, error);
    }
  return aw_sweep_plot_export (&scene, NULL, path, fmt, width, height, error);
}

typedef struct
{
  AwSweepPanel *panel;
  gboolean csv;
  AwPlotFormat fmt;
} ExportRequest;

static void
export_response (GtkNativeDialog *dialog, int response, gpointer data)
{
  ExportRequest *req = data;
  AwSweepPanel *self = req->panel;

  if (response == GTK_RESPONSE_ACCEPT)
    {
      g_autoptr (GFile) file = gtk_file_chooser_get_file (GTK_FILE_CHOOSER (dialog));
      g_autofree char *path = file ? g_file_get_path (file) : NULL;
      g_autoptr (GError) error = NULL;
      if (path == NULL)
        set_status (self, _("Only local files can be saved."));
      else if (!aw_sweep_panel_export (self, path, req->csv, req->fmt, 0, 0, &error))
        {
          g_autofree char *msg = g_strdup_printf (_("Could not save: %s"), error->message);
          set_status (self, msg);
        }
      else
        {
          g_autofree char *base = g_path_get_basename (path);
          g_autofree char *msg = g_strdup_printf (_("Saved “%s”."), base);
          set_status (self, msg);
        }
    }
  g_object_unref (self);
  g_free (req);
  g_object_unref (dialog);
}

static void
export_action (GtkWidget *widget, const char *action_name, GVariant *param)
{
  AwSweepPanel *self = AW_SWEEP_PANEL (widget);
  const char *kind = g_variant_get_string (param, NULL);
  ExportRequest *req = g_new0 (ExportRequest, 1);
  GtkFileChooserNative *dialog;
  GtkRoot *root = gtk_widget_get_root (widget);
  g_autofree char *name = g_strdup_printf ("%s.%s", _("sweep"), kind);

  req->panel = g_object_ref (self);
  req->csv = g_str_equal (kind, "csv");
  req->fmt = g_str_equal (kind, "svg") ? AW_PLOT_FORMAT_SVG
             : g_str_equal (kind, "pdf") ? AW_PLOT_FORMAT_PDF : AW_PLOT_FORMAT_PNG;
  G_GNUC_BEGIN_IGNORE_DEPRECATIONS
  dialog = gtk_file_chooser_native_new (req->csv ? _("Save the Sweep Table")
                                                 : _("Save the Sweep Plot"),
                                        GTK_IS_WINDOW (root) ? GTK_WINDOW (root) : NULL,
                                        GTK_FILE_CHOOSER_ACTION_SAVE, _("_Save"), _("_Cancel"));
  gtk_file_chooser_set_current_name (GTK_FILE_CHOOSER (dialog), name);
  G_GNUC_END_IGNORE_DEPRECATIONS
  gtk_native_dialog_set_modal (GTK_NATIVE_DIALOG (dialog), TRUE);
  g_signal_connect (dialog, "response", G_CALLBACK (export_response), req);
  gtk_native_dialog_show (GTK_NATIVE_DIALOG (dialog));
}

static void
run_action (GtkWidget *widget, const char *action_name, GVariant *param)
{
  aw_sweep_panel_run (AW_SWEEP_PANEL (widget));
}

static void
stop_action (GtkWidget *widget, const char *action_name, GVariant *param)
{
  aw_sweep_panel_stop (AW_SWEEP_PANEL (widget));
}

/* ---- GObject ---- */

static void
aw_sweep_panel_get_property (GObject *object, guint prop_id, GValue *value, GParamSpec *pspec)
{
  AwSweepPanel *self = AW_SWEEP_PANEL (object);

  switch (prop_id)
    {
    case PROP_RUNNING:
      g_value_set_boolean (value, aw_sweep_panel_get_running (self));
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
    }
}

static void
aw_sweep_panel_dispose (GObject *object)
{
  AwSweepPanel *self = AW_SWEEP_PANEL (object);

  g_clear_handle_id (&self->restart_id, g_source_remove);
  self->live = FALSE;
  if (self->cancellable)
    g_cancellable_cancel (self->cancellable);
  g_clear_object (&self->cancellable);
  if (self->run)
    {
      self->run->panel = NULL;
      g_clear_pointer (&self->run, run_unref);
    }
  gtk_widget_dispose_template (GTK_WIDGET (self), AW_TYPE_SWEEP_PANEL);
  /* GTK 4.8 unparents only the bound template children: the unnamed rows too */
  for (GtkWidget *child; (child = gtk_widget_get_first_child (GTK_WIDGET (self))) != NULL;)
    gtk_widget_unparent (child);
  G_OBJECT_CLASS (aw_sweep_panel_parent_class)->dispose (object);
}

static void
aw_sweep_panel_finalize (GObject *object)
{
  AwSweepPanel *self = AW_SWEEP_PANEL (object);

  g_clear_pointer (&self->result, aw_sweep_result_free);
  g_clear_pointer (&self->result_colors, g_array_unref);
  g_clear_pointer (&self->project, aw_project_free);
  g_clear_pointer (&self->excluded, g_hash_table_unref);
  g_clear_pointer (&self->sites, g_array_unref);
  G_OBJECT_CLASS (aw_sweep_panel_parent_class)->finalize (object);
}

static void
aw_sweep_panel_class_init (AwSweepPanelClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);
  static gsize registered = 0;

  if (g_once_init_enter (&registered))
    {
      aw_sweep_register_resource ();
      g_once_init_leave (&registered, 1);
    }

  object_class->get_property = aw_sweep_panel_get_property;
  object_class->dispose = aw_sweep_panel_dispose;
  object_class->finalize = aw_sweep_panel_finalize;

  properties[PROP_RUNNING] =
    g_param_spec_boolean ("running", NULL, NULL, FALSE,
                          G_PARAM_READABLE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  g_object_class_install_properties (object_class, N_PROPS, properties);

  gtk_widget_class_set_template_from_resource (widget_class,
                                               "/io/github/arcwright/Arcwright/sweep/"
                                               "aw-sweep-panel.ui");
#define BIND(name) gtk_widget_class_bind_template_child (widget_class, AwSweepPanel, name)
  BIND (controls);
  BIND (var1_drop);
  BIND (var2_drop);
  BIND (metric_drop);
  BIND (hop_drop);
  BIND (site_drop);
  BIND (from1);
  BIND (to1);
  BIND (n1);
  BIND (from2);
  BIND (to2);
  BIND (n2);
  BIND (at_distance);
  BIND (unit1);
  BIND (unit2);
  BIND (from2_label);
  BIND (to2_label);
  BIND (n2_in_label);
  BIND (n2_label);
  BIND (at_label);
  BIND (at_unit);
  BIND (status_label);
  BIND (setups_box);
  BIND (run_button);
  BIND (stop_button);
  BIND (progress);
  BIND (export_button);
  BIND (plot);
#undef BIND

  gtk_widget_class_install_action (widget_class, "sweep.run", NULL, run_action);
  gtk_widget_class_install_action (widget_class, "sweep.stop", NULL, stop_action);
  gtk_widget_class_install_action (widget_class, "sweep.export", "s", export_action);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_Return, GDK_CONTROL_MASK,
                                       "sweep.run", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_KP_Enter, GDK_CONTROL_MASK,
                                       "sweep.run", NULL);
  gtk_widget_class_add_binding_action (widget_class, GDK_KEY_Escape, 0, "sweep.stop", NULL);
  gtk_widget_class_set_accessible_role (widget_class, GTK_ACCESSIBLE_ROLE_GROUP);
}

static void
fill_drop (GtkDropDown *drop, gboolean with_none, gboolean metrics)
{
  g_autoptr (GtkStringList) list = gtk_string_list_new (NULL);
  if (metrics)
    for (int m = 0; m < AW_SWEEP_N_METRICS; m++)
      gtk_string_list_append (list, aw_sweep_metric_label (m));
  else
    for (int v = with_none ? AW_SWEEP_VAR_NONE : AW_SWEEP_VAR_NONE + 1; v < AW_SWEEP_N_VARS; v++)
      gtk_string_list_append (list, aw_sweep_var_label (v));
  gtk_drop_down_set_model (drop, G_LIST_MODEL (list));
}

static void
aw_sweep_panel_init (AwSweepPanel *self)
{
  GtkEventController *motion;
  AwSweepDesc desc;

  gtk_widget_init_template (GTK_WIDGET (self));
  self->excluded = g_hash_table_new_full (g_str_hash, g_str_equal, g_free, NULL);
  self->sites = g_array_new (FALSE, TRUE, sizeof (AwSiteClass));
  aw_sweep_plot_scene_init (&self->scene);

  self->updating = TRUE;
  fill_drop (self->var1_drop, FALSE, FALSE);
  fill_drop (self->var2_drop, TRUE, FALSE);
  fill_drop (self->metric_drop, FALSE, TRUE);
  rebuild_sites (self);
  aw_sweep_desc_init (&desc);
  desc.axis[0].n = var_defaults[AW_SWEEP_VAR_LIFT_RATIO].n;
  gtk_drop_down_set_selected (self->var1_drop, desc.axis[0].var - 1);
  gtk_drop_down_set_selected (self->var2_drop, AW_SWEEP_VAR_NONE);
  configure_axis (self, 0, desc.axis[0].var, desc.axis[0].lo, desc.axis[0].hi, desc.axis[0].n);
  configure_axis (self, 1, AW_SWEEP_VAR_ENERGY_J, var_defaults[AW_SWEEP_VAR_ENERGY_J].lo,
                  var_defaults[AW_SWEEP_VAR_ENERGY_J].hi, 13);
  configure_axis (self, 1, AW_SWEEP_VAR_NONE, 0, 0, 1);
  gtk_drop_down_set_selected (self->metric_drop, AW_SWEEP_METRIC_BAND_RANGE);
  on_metric_changed (self->metric_drop, NULL, self);
  self->updating = FALSE;

  g_signal_connect (self->var1_drop, "notify::selected", G_CALLBACK (on_var_changed), self);
  g_signal_connect (self->var2_drop, "notify::selected", G_CALLBACK (on_var_changed), self);
  g_signal_connect (self->metric_drop, "notify::selected", G_CALLBACK (on_metric_changed), self);
  g_signal_connect (self->hop_drop, "notify::selected", G_CALLBACK (on_choice_changed), self);
  g_signal_connect (self->site_drop, "notify::selected", G_CALLBACK (on_choice_changed), self);
  {
    GtkSpinButton *spins[] = { self->from1, self->to1, self->n1, self->from2, self->to2,
                               self->n2, self->at_distance };
    for (guint i = 0; i < G_N_ELEMENTS (spins); i++)
      g_signal_connect (spins[i], "value-changed", G_CALLBACK (on_value_changed), self);
  }

  gtk_drawing_area_set_draw_func (self->plot, draw_plot, self, NULL);
  motion = gtk_event_controller_motion_new ();
  g_signal_connect (motion, "motion", G_CALLBACK (on_motion), self);
  g_signal_connect (motion, "leave", G_CALLBACK (on_leave), self);
  gtk_widget_add_controller (GTK_WIDGET (self->plot), motion);

  self->scene.message = _("Choose what varies, then press Run");
  set_progress (self, 0.0);
  update_actions (self);
}

GtkWidget *
aw_sweep_panel_new (void)
{
  return g_object_new (AW_TYPE_SWEEP_PANEL, NULL);
}
