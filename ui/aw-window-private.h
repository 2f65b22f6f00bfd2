/* aw-window-private.h: the window's struct, shared by aw-window.c and aw-window-actions.c
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#pragma once

#include "aw-format.h"
#include "aw-range-view.h"
#include "aw-setup-editor.h"
#include "aw-sweep-panel.h"
#include "aw-window.h"

G_BEGIN_DECLS

typedef enum
{
  AW_BANNER_NONE = 0,
  AW_BANNER_UNDO,         /* button: undo the last edit */
  AW_BANNER_SAVE_AS,      /* button: save as */
} AwBannerAction;

struct _AwWindow
{
  GtkApplicationWindow parent_instance;

  /* template widgets */
  GtkLabel *title_label;
  GtkLabel *subtitle_label;
  GtkMenuButton *menu_button;
  GtkStackSwitcher *view_switcher;
  GtkButton *save_button;
  GtkButton *open_button;
  GtkButton *undo_button;
  GtkButton *redo_button;
  GtkToggleButton *sidebar_button;
  GtkRevealer *banner_revealer;
  GtkLabel *banner_label;
  GtkButton *banner_button;
  GtkButton *banner_close_button;
  GtkRevealer *sidebar_revealer;
  GtkListBox *setup_list;
  GtkButton *add_button;
  GtkMenuButton *setup_menu_button;
  GtkButton *duplicate_button;
  GtkButton *move_up_button;
  GtkButton *move_down_button;
  GtkButton *delete_button;
  GtkPaned *main_paned;
  GtkStack *view_stack;
  GtkPaned *centre_paned;
  GtkDropDown *site_dropdown;
  GtkLabel *site_label;
  GtkToggleButton *top_view_button;
  GtkButton *reset_view_button;
  GtkMenuButton *export_button;
  GtkWidget *plot_box;
  AwRangeView *range_view;
  AwSetupEditor *editor;
  AwSweepPanel *sweep_panel;
  GMenu *recent_submenu;

  /* owned */
  GtkWidget *plot;
  GSettings *settings;
  AwDocument *document;
  AwComputer *computer;
  GPtrArray *results;         /* AwComputeResult* or NULL, per setup */
  GtkStringList *site_model;
  GArray *site_refs;          /* guint pairs (rules, class) for positions ≥ 1 */
  int selected;
  AwUnitSystem units;
  guint scene_idle_id;
  guint autosave_timeout_id;
  char *autosave_name;        /* basename of this window's autosaved copy */
  AwBannerAction banner_action;
  guint building_list : 1;
  guint sidebar_set_by_user : 1;
  guint sidebar_auto_hidden : 1;
  guint recovered : 1;
  guint closing : 1;
};

/* aw-window.c */
void aw_window_update_title (AwWindow *self);
void aw_window_update_actions (AwWindow *self);
double aw_window_min_engagement_m (AwWindow *self);
/* The site class chosen in the window (NULL: none); rules, when not NULL, gets its site rules. */
const AwSiteClassRule *aw_window_get_site_choice (AwWindow *self, const AwSiteRules **rules);
void aw_window_show_error (AwWindow *self, const char *headline, const char *detail);
/* Shows the flight view and puts the focus in the editor's name field. */
void aw_window_focus_editor (AwWindow *self);
void aw_window_show_banner_with_action (AwWindow *self, const char *message, AwBannerAction action,
                                        const char *button_label);

/* aw-window-actions.c */
void aw_window_install_actions (GtkWidgetClass *widget_class);
void aw_window_schedule_autosave (AwWindow *self);
void aw_window_remove_autosave (AwWindow *self);
gboolean aw_window_close_request (GtkWindow *window);

G_END_DECLS
