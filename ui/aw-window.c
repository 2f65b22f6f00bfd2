/* aw-window.c: the workbench window — setups, flight plot, range table and setup editor
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <glib/gi18n.h>
#include <math.h>

#include "aw-plot-view.h"
#include "aw-project-io.h"
#include "aw-setup-row.h"
#include "aw-units.h"
#include "aw-window-private.h"

G_DEFINE_FINAL_TYPE (AwWindow, aw_window, GTK_TYPE_APPLICATION_WINDOW)

enum { PROP_0, PROP_SHOW_SIDEBAR, PROP_SHOW_TOP_VIEW, PROP_VIEW, N_PROPS };
static GParamSpec *properties[N_PROPS];

static void request_setup (AwWindow *self, guint index);
static void schedule_scene (AwWindow *self);

/* ---- helpers ---- */

static const AwProject *
project_of (AwWindow *self)
{
  return self->document ? aw_document_get_project (self->document) : NULL;
}

static const AwSetup *
setup_at (AwWindow *self,
          int       index)
{
  const AwProject *p = project_of (self);

  if (p == NULL || index < 0 || (guint) index >= p->setups->len)
    return NULL;
  return g_ptr_array_index (p->setups, index);
}

static AwComputeResult *
result_at (AwWindow *self,
           int       index)
{
  if (index < 0 || (guint) index >= self->results->len)
    return NULL;
  return g_ptr_array_index (self->results, index);
}

static void
set_result (AwWindow        *self,
            guint            index,
            AwComputeResult *result)
{
  if (index >= self->results->len)
    g_ptr_array_set_size (self->results, index + 1);
  if (g_ptr_array_index (self->results, index) != NULL)
    aw_compute_result_unref (g_ptr_array_index (self->results, index));
  g_ptr_array_index (self->results, index) = result ? aw_compute_result_ref (result) : NULL;
}

static AwSetupRow *
row_at (AwWindow *self,
        int       index)
{
  GtkListBoxRow *row = gtk_list_box_get_row_at_index (self->setup_list, index);
  return row ? AW_SETUP_ROW (row) : NULL;
}

void
aw_window_show_error (AwWindow   *self,
                      const char *headline,
                      const char *detail)
{
  GtkWidget *dialog;

  dialog = gtk_message_dialog_new (GTK_WINDOW (self),
                                   GTK_DIALOG_MODAL | GTK_DIALOG_DESTROY_WITH_PARENT,
                                   GTK_MESSAGE_ERROR, GTK_BUTTONS_CLOSE, "%s", headline);
  if (detail != NULL)
    gtk_message_dialog_format_secondary_text (GTK_MESSAGE_DIALOG (dialog), "%s", detail);
  g_signal_connect (dialog, "response", G_CALLBACK (gtk_window_destroy), NULL);
  gtk_window_present (GTK_WINDOW (dialog));
}

void
aw_window_show_banner (AwWindow   *self,
                       const char *message)
{
  g_return_if_fail (AW_IS_WINDOW (self));

  self->banner_action = AW_BANNER_NONE;
  gtk_label_set_text (self->banner_label, message);
  gtk_widget_set_visible (GTK_WIDGET (self->banner_button), FALSE);
  gtk_revealer_set_reveal_child (self->banner_revealer, TRUE);
}

void
aw_window_show_banner_with_action (AwWindow       *self,
                         const char     *message,
                         AwBannerAction  action,
                         const char     *button_label)
{
  aw_window_show_banner (self, message);
  self->banner_action = action;
  gtk_button_set_label (self->banner_button, button_label);
  gtk_button_set_use_underline (self->banner_button, TRUE);
  gtk_widget_set_visible (GTK_WIDGET (self->banner_button), TRUE);
}

static void
banner_close_cb (AwWindow *self)
{
  gtk_revealer_set_reveal_child (self->banner_revealer, FALSE);
}

static void
banner_button_cb (AwWindow *self)
{
  AwBannerAction action = self->banner_action;

  gtk_revealer_set_reveal_child (self->banner_revealer, FALSE);
  switch (action)
    {
    case AW_BANNER_UNDO:
      gtk_widget_activate_action (GTK_WIDGET (self), "win.undo", NULL);
      break;
    case AW_BANNER_SAVE_AS:
      gtk_widget_activate_action (GTK_WIDGET (self), "win.save-as", NULL);
      break;
    case AW_BANNER_NONE:
    default:
      break;
    }
}

/* ---- title ---- */

void
aw_window_update_title (AwWindow *self)
{
  g_autofree char *name = NULL;
  g_autofree char *title = NULL;
  g_autofree char *subtitle = NULL;
  g_autofree char *window_title = NULL;
  gboolean modified;
  GFile *file;

  if (self->document == NULL)
    return;
  name = aw_document_dup_display_name (self->document);
  modified = aw_document_get_modified (self->document);
  file = aw_document_get_file (self->document);

  /* translators: window title of a project with unsaved changes */
  title = modified ? g_strdup_printf (_ ("• %s"), name) : g_strdup (name);
  gtk_label_set_text (self->title_label, title);

  if (file != NULL)
    {
      g_autoptr (GFile) parent = g_file_get_parent (file);
      g_autofree char *path = parent ? g_file_get_path (parent) : NULL;
      const char *home = g_get_home_dir ();

      if (path && home && g_str_has_prefix (path, home) && strlen (home) > 1)
        subtitle = g_strconcat ("~", path + strlen (home), NULL);
      else
        subtitle = g_steal_pointer (&path);
    }
  if (self->recovered)
    {
      g_autofree char *where = g_steal_pointer (&subtitle);
      /* translators: subtitle of a project recovered after a crash, %s is its folder */
      subtitle = where ? g_strdup_printf (_ ("Recovered — %s"), where)
                       : g_strdup (_ ("Recovered"));
    }
  if (subtitle == NULL)
    subtitle = g_strdup (_ ("Not saved yet"));
  gtk_label_set_text (self->subtitle_label, subtitle);

  /* translators: the window title for the window list, %s is the project file name */
  window_title = g_strdup_printf (_ ("%s — Arcwright"), title);
  gtk_window_set_title (GTK_WINDOW (self), window_title);
}

/* ---- site classes ---- */

static void
rebuild_site_model (AwWindow *self)
{
  const AwProject *p = project_of (self);
  g_autofree char *keep = NULL;
  guint selected = gtk_drop_down_get_selected (self->site_dropdown);
  guint new_selected = 0;
  guint n = g_list_model_get_n_items (G_LIST_MODEL (self->site_model));
  g_autoptr (GPtrArray) items = g_ptr_array_new_with_free_func (g_free);

  if (selected != GTK_INVALID_LIST_POSITION && selected > 0 && selected < n)
    keep = g_strdup (gtk_string_list_get_string (self->site_model, selected));

  g_array_set_size (self->site_refs, 0);
  /* translators: no site class chosen in the plot */
  g_ptr_array_add (items, g_strdup (_ ("None")));
  if (p != NULL)
    for (guint r = 0; r < p->site_rules->len; r++)
      {
        const AwSiteRules *rules = g_ptr_array_index (p->site_rules, r);
        for (guint c = 0; c < rules->classes->len; c++)
          {
            const AwSiteClassRule *cls = g_ptr_array_index (rules->classes, c);
            guint ref[2] = { r, c };
            /* translators: a site class in the chooser: "class name — site rules name" */
            char *label = g_strdup_printf (_ ("%s — %s"), cls->name, rules->name);

            if (keep && g_str_equal (keep, label))
              new_selected = items->len;
            g_ptr_array_add (items, label);
            g_array_append_vals (self->site_refs, ref, 2);
          }
      }
  g_ptr_array_add (items, NULL);
  gtk_string_list_splice (self->site_model, 0, n, (const char * const *) items->pdata);
  gtk_drop_down_set_selected (self->site_dropdown, new_selected);
}

const AwSiteClassRule *
aw_window_get_site_choice (AwWindow           *self,
                           const AwSiteRules **rules_out)
{
  const AwProject *p = project_of (self);
  guint pos = gtk_drop_down_get_selected (self->site_dropdown);
  guint r, c;
  const AwSiteRules *rules;

  if (rules_out != NULL)
    *rules_out = NULL;
  if (p == NULL || pos == GTK_INVALID_LIST_POSITION || pos == 0
      || (pos - 1) * 2 + 1 >= self->site_refs->len)
    return NULL;
  r = g_array_index (self->site_refs, guint, (pos - 1) * 2);
  c = g_array_index (self->site_refs, guint, (pos - 1) * 2 + 1);
  if (r >= p->site_rules->len)
    return NULL;
  rules = g_ptr_array_index (p->site_rules, r);
  if (c >= rules->classes->len)
    return NULL;
  if (rules_out != NULL)
    *rules_out = rules;
  return g_ptr_array_index (rules->classes, c);
}

static const AwSiteClassRule *
selected_site_class (AwWindow *self)
{
  return aw_window_get_site_choice (self, NULL);
}

double
aw_window_min_engagement_m (AwWindow *self)
{
  const AwSiteClassRule *cls = selected_site_class (self);

  if (cls == NULL || !isfinite (cls->min_engagement_m) || cls->min_engagement_m <= 0)
    return NAN;
  return cls->min_engagement_m;
}

static void
update_site_label (AwWindow *self)
{
  const AwSiteClassRule *cls = selected_site_class (self);
  g_autofree char *limit = NULL;
  g_autofree char *text = NULL;

  gtk_widget_set_visible (GTK_WIDGET (self->site_label), cls != NULL);
  if (cls == NULL)
    {
      gtk_label_set_text (self->site_label, "");
      gtk_widget_set_tooltip_text (GTK_WIDGET (self->site_label), NULL);
      return;
    }
  limit = aw_qty_format (AW_QTY_ENERGY, self->units, cls->energy_limit_j);
  if (isfinite (cls->min_engagement_m) && cls->min_engagement_m > 0)
    {
      g_autofree char *med = aw_qty_format (AW_QTY_DISTANCE, self->units, cls->min_engagement_m);
      /* translators: site class summary: energy limit and minimum engagement distance */
      text = g_strdup_printf (_ ("Limit %s · no-shoot closer than %s"), limit, med);
    }
  else
    /* translators: site class summary without a minimum engagement distance */
    text = g_strdup_printf (_ ("Limit %s · no minimum distance"), limit);
  /* the selected setup against that limit, as the site would measure it */
  {
    const AwSetup *sel = setup_at (self, self->selected);
    if (sel != NULL && isfinite (cls->energy_limit_j) && cls->energy_limit_j > 0)
      {
        g_autoptr (AwSetup) copy = aw_setup_copy (sel);
        AwPowerCurve curve;
        AwSiteClass site;
        double chrono_j = NAN;
        AwCompliance verdict;

        aw_setup_power_curve (copy, &curve);
        aw_site_class_rule_to_site_class (cls, &site);
        verdict = aw_site_check (&site, &curve, copy->bb.mass_g * 1e-3, &chrono_j);
        if (verdict != AW_COMPLIANCE_UNKNOWN && isfinite (chrono_j))
          {
            g_autofree char *e = aw_qty_format (AW_QTY_ENERGY, self->units, chrono_j);
            g_autofree char *joined = NULL;
            /* translators: the selected setup's energy as the site's chronograph would measure
             * it, and the verdict of this estimate */
            joined = g_strdup_printf (verdict == AW_COMPLIANCE_OVER
                                      ? _ ("%s · this setup ≈ %s at the site's chrono: over")
                                      : _ ("%s · this setup ≈ %s at the site's chrono: under"),
                                      text, e);
            g_free (text);
            text = g_steal_pointer (&joined);
          }
      }
  }
  gtk_label_set_text (self->site_label, text);
  gtk_widget_set_tooltip_text (GTK_WIDGET (self->site_label),
                               _ ("Taken from the project's site rules. The site's own chronograph "
                                 "and marshals decide; these are estimates, not permission."));
}

static void
site_changed_cb (AwWindow *self)
{
  guint pos = gtk_drop_down_get_selected (self->site_dropdown);

  /* the sweep panel checks against the same class (it keeps its own chooser) */
  aw_sweep_panel_set_site_class (self->sweep_panel, pos == GTK_INVALID_LIST_POSITION ? 0 : pos);
  update_site_label (self);
  /* the range table marks the no-shoot rows */
  if (self->selected >= 0)
    request_setup (self, (guint) self->selected);
  schedule_scene (self);
}

void
aw_window_set_site_class (AwWindow *self,
                          guint     position)
{
  g_return_if_fail (AW_IS_WINDOW (self));
  gtk_drop_down_set_selected (self->site_dropdown, position);
}

/* ---- views ---- */

const char *
aw_window_get_view (AwWindow *self)
{
  const char *name;

  g_return_val_if_fail (AW_IS_WINDOW (self), "flight");
  name = self->view_stack ? gtk_stack_get_visible_child_name (self->view_stack) : NULL;
  return name ? name : "flight";
}

/* The editor is beside the flight view only (the sweep panel needs the width). */
void
aw_window_focus_editor (AwWindow *self)
{
  aw_window_set_view (self, "flight");
  aw_setup_editor_focus_name (self->editor);
}

void
aw_window_set_view (AwWindow   *self,
                    const char *view)
{
  g_return_if_fail (AW_IS_WINDOW (self));

  if (view == NULL || (!g_str_equal (view, "flight") && !g_str_equal (view, "sweep")))
    {
      g_warning ("unknown view “%s”", view ? view : "(null)");
      return;
    }
  /* the stack's notify::visible-child-name notifies "view" */
  gtk_stack_set_visible_child_name (self->view_stack, view);
}

/* ---- plot ---- */

static AwRgba
rgba_from_hex (const char *hex)
{
  GdkRGBA c;
  AwRgba out = { 0, 0, 0, 0 };

  if (hex != NULL && gdk_rgba_parse (&c, hex))
    {
      out.r = c.red;
      out.g = c.green;
      out.b = c.blue;
      out.a = 1.0;
    }
  return out;
}

static gboolean
update_scene_idle (gpointer user_data)
{
  AwWindow *self = user_data;
  const AwProject *p = project_of (self);
  const AwSetup *sel = setup_at (self, self->selected);
  g_autofree AwPlotSeries *series = NULL;
  AwPlotScene scene;
  guint n = p ? p->setups->len : 0;

  self->scene_idle_id = 0;
  aw_plot_scene_init (&scene);
  series = g_new0 (AwPlotSeries, MAX (n, 1));
  for (guint i = 0; i < n; i++)
    {
      const AwSetup *s = g_ptr_array_index (p->setups, i);
      AwComputeResult *r = result_at (self, (int) i);

      series[i].name = s->name;
      series[i].color = rgba_from_hex (s->colour);
      series[i].visible = s->visible;
      if (r != NULL && r->samples != NULL)
        {
          series[i].samples = r->samples;
          series[i].n_samples = r->n_samples;
        }
    }
  scene.series = series;
  scene.n_series = n;
  if (sel == NULL && n > 0)
    sel = g_ptr_array_index (p->setups, 0);
  if (sel != NULL)
    {
      scene.muzzle_height_m = sel->muzzle_height_m;
      scene.sight_line_m = sel->muzzle_height_m + sel->sighting.sight_height_m;
      scene.band_half_m = sel->band_half_height_m;
    }
  scene.min_engagement_m = aw_window_min_engagement_m (self);
  scene.show_ground = true;
  scene.show_legend = true;
  scene.show_top_view = g_settings_get_boolean (self->settings, "show-top-view");
  scene.units = self->units == AW_UNITS_IMPERIAL ? AW_PLOT_UNITS_IMPERIAL : AW_PLOT_UNITS_METRIC;
  aw_plot_view_set_show_top_view (AW_PLOT_VIEW (self->plot), scene.show_top_view);
  aw_plot_view_set_scene (AW_PLOT_VIEW (self->plot), &scene, TRUE);
  return G_SOURCE_REMOVE;
}

static void
schedule_scene (AwWindow *self)
{
  if (self->scene_idle_id == 0)
    self->scene_idle_id = g_idle_add_full (G_PRIORITY_HIGH_IDLE, update_scene_idle, self, NULL);
}

/* ---- computation ---- */

static void
request_setup (AwWindow *self,
               guint     index)
{
  const AwSetup *s = setup_at (self, (int) index);
  g_autoptr (AwSetup) copy = NULL;
  AwComputeRequest req = { 0 };

  if (s == NULL)
    return;
  copy = aw_setup_copy (s);
  req.bridge = aw_setup_to_analysis_input (copy, project_of (self), &req.input);
  req.want_table = (int) index == self->selected;
  req.table_step_m = g_settings_get_double (self->settings, "table-step-m");
  if (self->units == AW_UNITS_IMPERIAL)
    /* whole yards for imperial tables: the step rounded to yards */
    req.table_step_m = aw_yd_to_m (MAX (1.0, round (aw_m_to_yd (req.table_step_m))));
  req.min_engagement_m = aw_window_min_engagement_m (self);
  req.plot_step_m = 0.25;
  aw_computer_request (self->computer, index, &req);
}

static void
request_all (AwWindow *self)
{
  const AwProject *p = project_of (self);

  aw_computer_reset (self->computer);
  if (p == NULL)
    return;
  /* the selected setup first: it is the one being looked at */
  if (self->selected >= 0)
    request_setup (self, (guint) self->selected);
  for (guint i = 0; i < p->setups->len; i++)
    if ((int) i != self->selected)
      request_setup (self, i);
}

static void
computed_cb (guint            slot,
             AwComputeResult *result,
             gpointer         user_data)
{
  AwWindow *self = user_data;
  const AwSetup *s = setup_at (self, (int) slot);
  AwSetupRow *row;

  if (s == NULL)
    return;
  /* keep the table of the selected setup: a result without one came from before a selection */
  if ((int) slot == self->selected && !result->table_wanted)
    {
      request_setup (self, slot);
      return;
    }
  set_result (self, slot, result);
  row = row_at (self, (int) slot);
  if (row)
    aw_setup_row_update (row, s, result, self->units);
  if ((int) slot == self->selected)
    {
      aw_setup_editor_set_result (self->editor, result);
      aw_range_view_set_result (self->range_view, s->name, result, s->sighting.angle_unit);
    }
  schedule_scene (self);
}

/* ---- the setups list ---- */

static void
visibility_toggled_cb (AwSetupRow *row,
                       gboolean    visible,
                       AwWindow   *self)
{
  int index = gtk_list_box_row_get_index (GTK_LIST_BOX_ROW (row));
  AwProject *p;
  AwSetup *s;

  if (setup_at (self, index) == NULL)
    return;
  p = aw_project_copy (project_of (self));
  s = g_ptr_array_index (p->setups, index);
  s->visible = visible;
  aw_document_push (self->document, p,
                    visible ? _ ("Show setup in plot") : _ ("Hide setup in plot"),
                    NULL, self->selected, self->selected);
}

static void
rebuild_list (AwWindow *self)
{
  const AwProject *p = project_of (self);
  GtkWidget *child;
  gboolean had_focus = gtk_widget_has_focus (GTK_WIDGET (self->setup_list))
                       || (gtk_root_get_focus (GTK_ROOT (self)) != NULL
                           && gtk_widget_is_ancestor (gtk_root_get_focus (GTK_ROOT (self)),
                                                      GTK_WIDGET (self->setup_list)));

  self->building_list = TRUE;
  while ((child = gtk_widget_get_first_child (GTK_WIDGET (self->setup_list))) != NULL)
    gtk_list_box_remove (self->setup_list, child);
  if (p != NULL)
    for (guint i = 0; i < p->setups->len; i++)
      {
        GtkWidget *row = aw_setup_row_new ();
        aw_setup_row_update (AW_SETUP_ROW (row), g_ptr_array_index (p->setups, i),
                             result_at (self, (int) i), self->units);
        g_signal_connect (row, "visibility-toggled", G_CALLBACK (visibility_toggled_cb), self);
        gtk_list_box_append (self->setup_list, row);
      }
  if (self->selected >= 0)
    {
      GtkListBoxRow *row = gtk_list_box_get_row_at_index (self->setup_list, self->selected);
      gtk_list_box_select_row (self->setup_list, row);
      if (had_focus && row)
        gtk_widget_grab_focus (GTK_WIDGET (row));
    }
  self->building_list = FALSE;
}

static void
apply_selection (AwWindow *self,
                 int       index)
{
  const AwSetup *s;
  AwComputeResult *r;

  self->selected = index;
  aw_setup_editor_set_index (self->editor, index);
  s = setup_at (self, index);
  r = result_at (self, index);
  aw_setup_editor_set_result (self->editor, r);
  aw_range_view_set_result (self->range_view, s ? s->name : NULL, r && r->table_wanted ? r : NULL,
                            s ? s->sighting.angle_unit : AW_ANGLE_MRAD);
  if (s != NULL && (r == NULL || !r->table_wanted))
    request_setup (self, (guint) index);
  update_site_label (self);
  schedule_scene (self);
  aw_window_update_actions (self);
}

static void
row_selected_cb (AwWindow      *self,
                 GtkListBoxRow *row)
{
  int index;

  if (self->building_list || row == NULL)
    return;
  index = gtk_list_box_row_get_index (row);
  if (index != self->selected)
    apply_selection (self, index);
}

/* Enter or a double click on a setup goes to its editor. */
static void
row_activated_cb (AwWindow      *self,
                  GtkListBoxRow *row)
{
  aw_window_focus_editor (self);
}

/* Delete in the list deletes the selected setup (it can be undone). */
static gboolean
list_key_pressed_cb (GtkEventControllerKey *controller,
                     guint                  keyval,
                     guint                  keycode,
                     GdkModifierType        state,
                     AwWindow              *self)
{
  if ((keyval == GDK_KEY_Delete || keyval == GDK_KEY_KP_Delete)
      && (state & (GDK_CONTROL_MASK | GDK_ALT_MASK | GDK_SHIFT_MASK)) == 0)
    {
      gtk_widget_activate_action (GTK_WIDGET (self), "win.delete-setup", NULL);
      return TRUE;
    }
  return FALSE;
}

void
aw_window_select (AwWindow *self,
                  int       index)
{
  GtkListBoxRow *row;

  g_return_if_fail (AW_IS_WINDOW (self));

  row = gtk_list_box_get_row_at_index (self->setup_list, index);
  if (row != NULL)
    gtk_list_box_select_row (self->setup_list, row);
  if (index != self->selected)
    apply_selection (self, index);
}

/* ---- document ---- */

static void
document_changed_cb (AwWindow *self,
                     guint     change,
                     int       index)
{
  const AwProject *p = project_of (self);
  int n = (int) p->setups->len;

  /* the panel keeps a copy and ignores changes that do not matter to it */
  aw_sweep_panel_set_project (self->sweep_panel, p);
  if (self->selected >= n)
    self->selected = n - 1;
  if (self->selected < 0 && n > 0)
    self->selected = 0;

  if (change & (AW_CHANGE_STRUCTURE | AW_CHANGE_PROJECT))
    {
      /* results are per position: start again */
      for (guint i = 0; i < self->results->len; i++)
        set_result (self, i, NULL);
      g_ptr_array_set_size (self->results, n);
      if (change & AW_CHANGE_STRUCTURE)
        rebuild_list (self);
      else
        for (int i = 0; i < n; i++)
          aw_setup_row_update (row_at (self, i), g_ptr_array_index (p->setups, i), NULL,
                               self->units);
      if (change & AW_CHANGE_PROJECT)
        rebuild_site_model (self);
      aw_setup_editor_set_index (self->editor, self->selected);
      aw_setup_editor_set_result (self->editor, NULL);
      request_all (self);
    }
  else if ((change & AW_CHANGE_SETUP) && index >= 0)
    {
      AwSetupRow *row = row_at (self, index);
      if (row)
        aw_setup_row_update (row, g_ptr_array_index (p->setups, index),
                             result_at (self, index), self->units);
      request_setup (self, (guint) index);
    }
  update_site_label (self);
  schedule_scene (self);
  aw_window_update_title (self);
  aw_window_update_actions (self);
  aw_window_schedule_autosave (self);
}

static void
document_modified_cb (AwWindow *self)
{
  aw_window_update_title (self);
  aw_window_update_actions (self);
  if (!aw_document_get_modified (self->document))
    aw_window_remove_autosave (self);
}

void
aw_window_set_document (AwWindow   *self,
                        AwDocument *document)
{
  g_return_if_fail (AW_IS_WINDOW (self));
  g_return_if_fail (AW_IS_DOCUMENT (document));

  if (self->document == document)
    return;
  if (self->document)
    g_signal_handlers_disconnect_by_data (self->document, self);
  aw_window_remove_autosave (self);
  g_set_object (&self->document, document);
  self->recovered = FALSE;
  g_signal_connect_object (document, "changed", G_CALLBACK (document_changed_cb), self,
                           G_CONNECT_SWAPPED);
  g_signal_connect_object (document, "notify::modified", G_CALLBACK (document_modified_cb),
                           self, G_CONNECT_SWAPPED);
  g_signal_connect_object (document, "notify::file", G_CALLBACK (aw_window_update_title), self,
                           G_CONNECT_SWAPPED);

  for (guint i = 0; i < self->results->len; i++)
    set_result (self, i, NULL);
  g_ptr_array_set_size (self->results, project_of (self)->setups->len);
  self->selected = project_of (self)->setups->len > 0 ? 0 : -1;
  aw_sweep_panel_set_project (self->sweep_panel, project_of (self));
  aw_setup_editor_set_document (self->editor, document);
  rebuild_list (self);
  rebuild_site_model (self);
  apply_selection (self, self->selected);
  request_all (self);
  aw_plot_view_reset_view (AW_PLOT_VIEW (self->plot));
  aw_window_update_title (self);
  aw_window_update_actions (self);
}

AwDocument *
aw_window_get_document (AwWindow *self)
{
  g_return_val_if_fail (AW_IS_WINDOW (self), NULL);
  return self->document;
}

gboolean
aw_window_is_pristine (AwWindow *self)
{
  g_return_val_if_fail (AW_IS_WINDOW (self), FALSE);
  return aw_document_get_file (self->document) == NULL
         && !aw_document_get_modified (self->document)
         && !aw_document_can_undo (self->document);
}

gboolean
aw_window_load_file (AwWindow  *self,
                     GFile     *file,
                     gboolean   quiet,
                     GError   **error)
{
  g_autoptr (GPtrArray) problems = g_ptr_array_new_with_free_func (g_free);
  g_autoptr (GError) local_error = NULL;
  g_autofree char *path = g_file_get_path (file);
  g_autoptr (AwDocument) document = NULL;
  AwProject *project;

  g_return_val_if_fail (AW_IS_WINDOW (self), FALSE);
  g_return_val_if_fail (G_IS_FILE (file), FALSE);

  if (path == NULL)
    {
      g_set_error (&local_error, G_IO_ERROR, G_IO_ERROR_NOT_SUPPORTED,
                   "%s: only local files can be opened", g_file_peek_path (file));
      project = NULL;
    }
  else
    project = aw_project_load_file (path, AW_PROJECT_LOAD_LENIENT, problems, &local_error);

  if (project == NULL)
    {
      if (!quiet)
        {
          g_autofree char *name = g_file_get_basename (file);
          /* translators: %s is a file name */
          g_autofree char *headline = g_strdup_printf (_ ("Could not open “%s”"), name);
          aw_window_show_error (self, headline, local_error->message);
        }
      g_propagate_error (error, g_steal_pointer (&local_error));
      return FALSE;
    }

  document = aw_document_new_for_project (project, file);
  aw_window_set_document (self, document);
  {
    g_autofree char *autosave = aw_autosave_dir ();
    g_autofree char *uri = g_file_get_uri (file);
    /* recovered copies are not the user's files */
    if (!g_str_has_prefix (path, autosave))
      gtk_recent_manager_add_item (gtk_recent_manager_get_default (), uri);
  }
  if (project->rejected != NULL && project->rejected->len > 0)
    {
      g_autofree char *msg =
        g_strdup_printf (g_dngettext (GETTEXT_PACKAGE,
                                      "%u entry of this file could not be read (%s). It is kept "
                                      "unchanged and written back when you save.",
                                      "%u entries of this file could not be read (%s). They are "
                                      "kept unchanged and written back when you save.",
                                      project->rejected->len),
                         project->rejected->len,
                         problems->len > 0 ? (const char *) g_ptr_array_index (problems, 0) : "");
      aw_window_show_banner (self, msg);
    }
  return TRUE;
}

/* ---- properties and class ---- */

static void
units_changed_cb (AwWindow *self)
{
  AwUnitSystem units = g_settings_get_enum (self->settings, "units") == 1 ? AW_UNITS_IMPERIAL
                                                                            : AW_UNITS_METRIC;
  const AwProject *p = project_of (self);

  if (units == self->units)
    return;
  self->units = units;
  aw_setup_editor_set_units (self->editor, units);
  aw_range_view_set_units (self->range_view, units);
  aw_plot_view_set_units (AW_PLOT_VIEW (self->plot),
                          units == AW_UNITS_IMPERIAL ? AW_PLOT_UNITS_IMPERIAL
                                                     : AW_PLOT_UNITS_METRIC);
  if (p != NULL)
    for (guint i = 0; i < p->setups->len; i++)
      aw_setup_row_update (row_at (self, (int) i), g_ptr_array_index (p->setups, i),
                           result_at (self, (int) i), units);
  update_site_label (self);
  /* the table step follows the units */
  if (self->selected >= 0)
    request_setup (self, (guint) self->selected);
  schedule_scene (self);
}

static void
table_step_changed_cb (AwWindow *self)
{
  if (self->selected >= 0)
    request_setup (self, (guint) self->selected);
}

static void
top_view_changed_cb (AwWindow *self)
{
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_SHOW_TOP_VIEW]);
  schedule_scene (self);
}

static void
aw_window_get_property (GObject    *object,
                        guint       prop_id,
                        GValue     *value,
                        GParamSpec *pspec)
{
  AwWindow *self = AW_WINDOW (object);

  switch (prop_id)
    {
    case PROP_SHOW_SIDEBAR:
      g_value_set_boolean (value, self->sidebar_revealer == NULL
                                  || gtk_revealer_get_reveal_child (self->sidebar_revealer));
      break;
    case PROP_SHOW_TOP_VIEW:
      g_value_set_boolean (value, self->settings
                                  && g_settings_get_boolean (self->settings, "show-top-view"));
      break;
    case PROP_VIEW:
      g_value_set_string (value, aw_window_get_view (self));
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
    }
}

static void
aw_window_set_property (GObject      *object,
                        guint         prop_id,
                        const GValue *value,
                        GParamSpec   *pspec)
{
  AwWindow *self = AW_WINDOW (object);

  switch (prop_id)
    {
    case PROP_SHOW_SIDEBAR:
      /* a choice made by the user wins over the automatic hiding in narrow windows */
      if (!self->building_list)
        self->sidebar_set_by_user = TRUE;
      if (gtk_revealer_get_reveal_child (self->sidebar_revealer) != g_value_get_boolean (value))
        {
          gtk_revealer_set_reveal_child (self->sidebar_revealer, g_value_get_boolean (value));
          g_object_notify_by_pspec (object, pspec);
        }
      break;
    case PROP_SHOW_TOP_VIEW:
      g_settings_set_boolean (self->settings, "show-top-view", g_value_get_boolean (value));
      break;
    case PROP_VIEW:
      aw_window_set_view (self, g_value_get_string (value));
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
    }
}

static void
view_changed_cb (AwWindow *self)
{
  gboolean flight = g_str_equal (aw_window_get_view (self), "flight");

  /* the sweep panel takes the editor's room: its controls are wide */
  gtk_widget_set_visible (GTK_WIDGET (self->editor), flight);
  /* the keyboard goes to the plot of the view shown (in the sweep panel, Ctrl+Return runs the
   * sweep from there) */
  if (gtk_widget_get_mapped (GTK_WIDGET (self)))
    gtk_widget_grab_focus (flight ? self->plot : aw_sweep_panel_get_plot (self->sweep_panel));
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_VIEW]);
}

/* Narrow windows give the plot the room: the sidebar hides itself below this width and comes
 * back above it, until the user shows or hides it. */
#define NARROW_WIDTH 1050

static void
width_changed_cb (AwWindow *self)
{
  int width = 0, height = 0;
  gboolean narrow;

  gtk_window_get_default_size (GTK_WINDOW (self), &width, &height);
  if (width <= 0 || self->sidebar_set_by_user)
    return;
  narrow = width < NARROW_WIDTH;
  if (narrow == self->sidebar_auto_hidden)
    return;
  self->sidebar_auto_hidden = narrow;
  gtk_revealer_set_reveal_child (self->sidebar_revealer, !narrow);
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_SHOW_SIDEBAR]);
}

static void
aw_window_dispose (GObject *object)
{
  AwWindow *self = AW_WINDOW (object);

  if (self->computer)
    aw_computer_shutdown (self->computer);
  g_clear_object (&self->computer);
  g_clear_handle_id (&self->scene_idle_id, g_source_remove);
  g_clear_handle_id (&self->autosave_timeout_id, g_source_remove);
  if (self->settings)
    g_signal_handlers_disconnect_by_data (self->settings, self);
  if (self->document)
    g_signal_handlers_disconnect_by_data (self->document, self);
  g_clear_object (&self->document);
  gtk_widget_dispose_template (GTK_WIDGET (self), AW_TYPE_WINDOW);
  G_OBJECT_CLASS (aw_window_parent_class)->dispose (object);
}

static void
aw_window_finalize (GObject *object)
{
  AwWindow *self = AW_WINDOW (object);

  g_clear_pointer (&self->results, g_ptr_array_unref);
  g_clear_pointer (&self->site_refs, g_array_unref);
  g_clear_object (&self->site_model);
  g_clear_object (&self->settings);
  g_clear_pointer (&self->autosave_name, g_free);
  G_OBJECT_CLASS (aw_window_parent_class)->finalize (object);
}

static void
aw_window_class_init (AwWindowClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);
  GtkWindowClass *window_class = GTK_WINDOW_CLASS (klass);

  object_class->dispose = aw_window_dispose;
  object_class->finalize = aw_window_finalize;
  object_class->get_property = aw_window_get_property;
  object_class->set_property = aw_window_set_property;
  window_class->close_request = aw_window_close_request;

  properties[PROP_SHOW_SIDEBAR] =
    g_param_spec_boolean ("show-sidebar", NULL, NULL, TRUE,
                          G_PARAM_READWRITE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  properties[PROP_SHOW_TOP_VIEW] =
    g_param_spec_boolean ("show-top-view", NULL, NULL, FALSE,
                          G_PARAM_READWRITE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  properties[PROP_VIEW] =
    g_param_spec_string ("view", NULL, NULL, "flight",
                         G_PARAM_READWRITE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  g_object_class_install_properties (object_class, N_PROPS, properties);

  g_type_ensure (AW_TYPE_SETUP_EDITOR);
  g_type_ensure (AW_TYPE_SWEEP_PANEL);
  g_type_ensure (AW_TYPE_RANGE_VIEW);
  gtk_widget_class_set_template_from_resource (widget_class,
                                               "/io/github/arcwright/Arcwright/aw-window.ui");
#define BIND(name) gtk_widget_class_bind_template_child (widget_class, AwWindow, name)
  BIND (title_label);
  BIND (subtitle_label);
  BIND (menu_button);
  BIND (view_switcher);
  BIND (save_button);
  BIND (open_button);
  BIND (undo_button);
  BIND (redo_button);
  BIND (sidebar_button);
  BIND (banner_revealer);
  BIND (banner_label);
  BIND (banner_button);
  BIND (banner_close_button);
  BIND (sidebar_revealer);
  BIND (setup_list);
  BIND (add_button);
  BIND (setup_menu_button);
  BIND (duplicate_button);
  BIND (move_up_button);
  BIND (move_down_button);
  BIND (delete_button);
  BIND (main_paned);
  BIND (view_stack);
  BIND (centre_paned);
  BIND (site_dropdown);
  BIND (site_label);
  BIND (top_view_button);
  BIND (reset_view_button);
  BIND (export_button);
  BIND (plot_box);
  BIND (range_view);
  BIND (editor);
  BIND (sweep_panel);
  BIND (recent_submenu);
#undef BIND
  gtk_widget_class_bind_template_callback (widget_class, banner_button_cb);
  gtk_widget_class_bind_template_callback (widget_class, banner_close_cb);
  gtk_widget_class_bind_template_callback (widget_class, row_selected_cb);
  gtk_widget_class_bind_template_callback (widget_class, row_activated_cb);

  aw_window_install_actions (widget_class);
}

static void
label_icon_button (GtkWidget  *button,
                   const char *label)
{
  gtk_accessible_update_property (GTK_ACCESSIBLE (button), GTK_ACCESSIBLE_PROPERTY_LABEL, label,
                                  -1);
}

/* Site classes: the button shows a short ellipsized label, the popup list the whole name. */
static void
site_item_setup (GtkSignalListItemFactory *factory,
                 GtkListItem              *item,
                 gpointer                  user_data)
{
  GtkWidget *label = gtk_label_new (NULL);

  gtk_label_set_xalign (GTK_LABEL (label), 0.0);
  if (GPOINTER_TO_INT (user_data))
    {
      gtk_label_set_ellipsize (GTK_LABEL (label), PANGO_ELLIPSIZE_END);
      gtk_label_set_max_width_chars (GTK_LABEL (label), 22);
      gtk_label_set_width_chars (GTK_LABEL (label), 8);
    }
  gtk_list_item_set_child (item, label);
}

static void
site_item_bind (GtkSignalListItemFactory *factory,
                GtkListItem              *item,
                gpointer                  user_data)
{
  GtkStringObject *str = gtk_list_item_get_item (item);
  GtkWidget *label = gtk_list_item_get_child (item);
  const char *text = gtk_string_object_get_string (str);

  gtk_label_set_text (GTK_LABEL (label), text);
  gtk_widget_set_tooltip_text (label, GPOINTER_TO_INT (user_data) ? text : NULL);
}

static GtkListItemFactory *
site_factory (gboolean compact)
{
  GtkListItemFactory *factory = gtk_signal_list_item_factory_new ();

  g_signal_connect (factory, "setup", G_CALLBACK (site_item_setup), GINT_TO_POINTER (compact));
  g_signal_connect (factory, "bind", G_CALLBACK (site_item_bind), GINT_TO_POINTER (compact));
  return factory;
}

/* The program's style sheet, added once for the display. */
static void
load_style (GtkWidget *widget)
{
  static gboolean loaded;
  g_autoptr (GtkCssProvider) provider = NULL;

  if (loaded)
    return;
  loaded = TRUE;
  provider = gtk_css_provider_new ();
  gtk_css_provider_load_from_resource (provider, "/io/github/arcwright/Arcwright/style.css");
  gtk_style_context_add_provider_for_display (gtk_widget_get_display (widget),
                                              GTK_STYLE_PROVIDER (provider),
                                              GTK_STYLE_PROVIDER_PRIORITY_APPLICATION);
}

static void
aw_window_init (AwWindow *self)
{
  load_style (GTK_WIDGET (self));
  gtk_widget_init_template (GTK_WIDGET (self));

  self->results = g_ptr_array_new_with_free_func (NULL);
  self->site_refs = g_array_new (FALSE, FALSE, sizeof (guint));
  self->selected = -1;
  self->computer = aw_computer_new (computed_cb, self);

  self->plot = aw_plot_view_new ();
  gtk_widget_set_hexpand (self->plot, TRUE);
  gtk_widget_set_vexpand (self->plot, TRUE);
  gtk_widget_set_focusable (self->plot, TRUE);
  gtk_accessible_update_property (GTK_ACCESSIBLE (self->plot), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                  _ ("Flight plot"), -1);
  gtk_box_append (GTK_BOX (self->plot_box), self->plot);

  g_signal_connect (self, "notify::default-width", G_CALLBACK (width_changed_cb), NULL);
  g_signal_connect_swapped (self->view_stack, "notify::visible-child-name",
                            G_CALLBACK (view_changed_cb), self);
  {
    GtkEventController *keys = gtk_event_controller_key_new ();
    g_signal_connect (keys, "key-pressed", G_CALLBACK (list_key_pressed_cb), self);
    gtk_widget_add_controller (GTK_WIDGET (self->setup_list), keys);
  }

  self->site_model = gtk_string_list_new (NULL);
  gtk_drop_down_set_model (self->site_dropdown, G_LIST_MODEL (self->site_model));
  {
    g_autoptr (GtkListItemFactory) compact = site_factory (TRUE);
    g_autoptr (GtkListItemFactory) full = site_factory (FALSE);
    gtk_drop_down_set_factory (self->site_dropdown, compact);
    gtk_drop_down_set_list_factory (self->site_dropdown, full);
  }
  g_signal_connect_swapped (self->site_dropdown, "notify::selected",
                            G_CALLBACK (site_changed_cb), self);

  /* The sweep plot asks for 640 × 360 pixels, more than a 900 × 600 window has below the
   * sweep controls: it may shrink to this and grows with the window (it expands). */
  {
    GtkWidget *sweep_plot = aw_sweep_panel_get_plot (self->sweep_panel);
    gtk_drawing_area_set_content_width (GTK_DRAWING_AREA (sweep_plot), 360);
    gtk_drawing_area_set_content_height (GTK_DRAWING_AREA (sweep_plot), 200);
  }

  /* controls that show only an icon still need a name for assistive technology */
  label_icon_button (GTK_WIDGET (self->sidebar_button), _ ("Show the setups"));
  label_icon_button (GTK_WIDGET (self->undo_button), _ ("Undo"));
  label_icon_button (GTK_WIDGET (self->redo_button), _ ("Redo"));
  label_icon_button (GTK_WIDGET (self->menu_button), _ ("Main menu"));
  label_icon_button (GTK_WIDGET (self->add_button), _ ("Add a setup"));
  label_icon_button (GTK_WIDGET (self->setup_menu_button), _ ("Setup actions"));
  label_icon_button (GTK_WIDGET (self->duplicate_button), _ ("Duplicate the setup"));
  label_icon_button (GTK_WIDGET (self->move_up_button), _ ("Move the setup up"));
  label_icon_button (GTK_WIDGET (self->move_down_button), _ ("Move the setup down"));
  label_icon_button (GTK_WIDGET (self->delete_button), _ ("Delete the setup"));
  label_icon_button (GTK_WIDGET (self->top_view_button), _ ("Show the top view"));
  label_icon_button (GTK_WIDGET (self->reset_view_button), _ ("Fit the whole flight"));
  label_icon_button (GTK_WIDGET (self->export_button), _ ("Export the plot"));
  label_icon_button (GTK_WIDGET (self->banner_close_button), _ ("Close the message"));
  gtk_accessible_update_property (GTK_ACCESSIBLE (self->setup_list),
                                  GTK_ACCESSIBLE_PROPERTY_LABEL, _ ("Setups"), -1);
  gtk_widget_set_tooltip_text (GTK_WIDGET (self->undo_button), _ ("Undo (Ctrl+Z)"));
  gtk_widget_set_tooltip_text (GTK_WIDGET (self->redo_button), _ ("Redo (Ctrl+Shift+Z)"));
}

AwWindow *
aw_window_new (GtkApplication *app,
               GSettings      *settings)
{
  AwWindow *self;
  g_autoptr (AwDocument) document = NULL;

  g_return_val_if_fail (G_IS_SETTINGS (settings), NULL);

  self = g_object_new (AW_TYPE_WINDOW, "application", app, NULL);
  self->settings = g_object_ref (settings);
  self->units = g_settings_get_enum (settings, "units") == 1 ? AW_UNITS_IMPERIAL
                                                               : AW_UNITS_METRIC;
  aw_setup_editor_set_units (self->editor, self->units);
  aw_range_view_set_units (self->range_view, self->units);
  aw_plot_view_set_units (AW_PLOT_VIEW (self->plot),
                          self->units == AW_UNITS_IMPERIAL ? AW_PLOT_UNITS_IMPERIAL
                                                           : AW_PLOT_UNITS_METRIC);
  g_signal_connect_swapped (settings, "changed::units", G_CALLBACK (units_changed_cb), self);
  g_signal_connect_swapped (settings, "changed::table-step-m",
                            G_CALLBACK (table_step_changed_cb), self);
  g_signal_connect_swapped (settings, "changed::show-top-view", G_CALLBACK (top_view_changed_cb),
                            self);

  gtk_window_set_default_size (GTK_WINDOW (self), g_settings_get_int (settings, "window-width"),
                               g_settings_get_int (settings, "window-height"));
  if (g_settings_get_boolean (settings, "window-maximized"))
    gtk_window_maximize (GTK_WINDOW (self));

  width_changed_cb (self);

  document = aw_document_new ();
  aw_window_set_document (self, document);
  return self;
}

/* ---- for tests ---- */

GtkListBox *
aw_window_get_setup_list (AwWindow *self)
{
  g_return_val_if_fail (AW_IS_WINDOW (self), NULL);
  return self->setup_list;
}

GtkWidget *
aw_window_get_editor (AwWindow *self)
{
  g_return_val_if_fail (AW_IS_WINDOW (self), NULL);
  return GTK_WIDGET (self->editor);
}

GtkWidget *
aw_window_get_plot (AwWindow *self)
{
  g_return_val_if_fail (AW_IS_WINDOW (self), NULL);
  return self->plot;
}

GtkWidget *
aw_window_get_range_view (AwWindow *self)
{
  g_return_val_if_fail (AW_IS_WINDOW (self), NULL);
  return GTK_WIDGET (self->range_view);
}

int
aw_window_get_selected (AwWindow *self)
{
  g_return_val_if_fail (AW_IS_WINDOW (self), -1);
  return self->selected;
}

AwComputeResult *
aw_window_get_result (AwWindow *self,
                      guint     index)
{
  g_return_val_if_fail (AW_IS_WINDOW (self), NULL);
  return result_at (self, (int) index);
}

GtkWidget *
aw_window_get_sweep_panel (AwWindow *self)
{
  g_return_val_if_fail (AW_IS_WINDOW (self), NULL);
  return GTK_WIDGET (self->sweep_panel);
}

gboolean
aw_window_is_idle (AwWindow *self)
{
  g_return_val_if_fail (AW_IS_WINDOW (self), TRUE);
  return aw_computer_is_idle (self->computer) && self->scene_idle_id == 0;
}
