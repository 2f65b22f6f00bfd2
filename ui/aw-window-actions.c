/* aw-window-actions.c: the window's actions — setups, undo, saving, export, printing, closing,
 * autosave
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <glib/gi18n.h>
#include <glib/gstdio.h>
#include <math.h>
#include <string.h>
#include <unistd.h>

#include "aw-plot-view.h"
#include "aw-print-dialog.h"
#include "aw-project-io.h"
#include "aw-window-private.h"

#define AUTOSAVE_DELAY_S 4

/* ---- setups ---- */

static char *
unique_name (const AwProject *p,
             const char      *base)
{
  if (aw_project_find_setup (p, base) == NULL)
    return g_strdup (base);
  for (guint i = 2; i < 10000; i++)
    {
      /* translators: a name made unique by a number, e.g. "Setup 1 (2)" */
      char *name = g_strdup_printf (_ ("%s (%u)"), base, i);
      if (aw_project_find_setup (p, name) == NULL)
        return name;
      g_free (name);
    }
  return g_strdup_printf ("%s (%" G_GINT64_FORMAT ")", base, g_get_real_time ());
}

static const char *const palette[] = {
  /* the window's own set for new setups: distinct in light and dark themes */
  "#2f7dbf", "#d1602b", "#3c9a57", "#9b4fb8", "#c2a124", "#d04876", "#2aa3a3", "#7a6a58",
};

static void
add_setup_cb (GtkWidget  *widget,
              const char *action_name,
              GVariant   *parameter)
{
  AwWindow *self = AW_WINDOW (widget);
  const AwProject *cur = aw_document_get_project (self->document);
  AwProject *p = aw_project_copy (cur);
  g_autofree char *base = NULL;
  g_autofree char *name = NULL;
  AwSetup *s;
  guint n = p->setups->len;

  /* translators: default name of a new setup, %u is a number */
  base = g_strdup_printf (_ ("Setup %u"), n + 1);
  name = unique_name (p, base);
  s = aw_setup_new (name);
  g_free (s->colour);
  s->colour = g_strdup (palette[n % G_N_ELEMENTS (palette)]);
  s->band_half_height_m = g_settings_get_double (self->settings, "band-half-height-cm") / 100.0;
  g_ptr_array_add (p->setups, s);
  self->selected = (int) n;
  aw_document_push (self->document, p, _ ("Add setup"), NULL, self->selected, (int) n);
  aw_window_select (self, (int) n);
  aw_window_focus_editor (self);
}

static void
duplicate_setup_cb (GtkWidget  *widget,
                    const char *action_name,
                    GVariant   *parameter)
{
  AwWindow *self = AW_WINDOW (widget);
  const AwProject *cur = aw_document_get_project (self->document);
  AwProject *p;
  AwSetup *copy;
  int before = self->selected;
  g_autofree char *base = NULL;

  if (self->selected < 0 || (guint) self->selected >= cur->setups->len)
    return;
  p = aw_project_copy (cur);
  copy = aw_setup_copy (g_ptr_array_index (p->setups, self->selected));
  /* translators: name of a duplicated setup, %s is the original name */
  base = g_strdup_printf (_ ("%s copy"), copy->name);
  g_free (copy->name);
  copy->name = unique_name (p, base);
  g_free (copy->colour);
  copy->colour = g_strdup (palette[p->setups->len % G_N_ELEMENTS (palette)]);
  g_ptr_array_insert (p->setups, before + 1, copy);
  self->selected = before + 1;
  aw_document_push (self->document, p, _ ("Duplicate setup"), NULL, before, before + 1);
  aw_window_select (self, before + 1);
}

static void
rename_setup_cb (GtkWidget  *widget,
                 const char *action_name,
                 GVariant   *parameter)
{
  AwWindow *self = AW_WINDOW (widget);

  aw_window_focus_editor (self);
}

static void
delete_setup_cb (GtkWidget  *widget,
                 const char *action_name,
                 GVariant   *parameter)
{
  AwWindow *self = AW_WINDOW (widget);
  const AwProject *cur = aw_document_get_project (self->document);
  AwProject *p;
  int before = self->selected;
  g_autofree char *name = NULL;
  g_autofree char *msg = NULL;

  if (before < 0 || (guint) before >= cur->setups->len || cur->setups->len <= 1)
    return;
  p = aw_project_copy (cur);
  name = g_strdup (((AwSetup *) g_ptr_array_index (p->setups, before))->name);
  g_ptr_array_remove_index (p->setups, before);
  self->selected = MIN (before, (int) p->setups->len - 1);
  aw_document_push (self->document, p, _ ("Delete setup"), NULL, before, self->selected);
  aw_window_select (self, self->selected);
  /* translators: shown after deleting a setup, %s is its name */
  msg = g_strdup_printf (_ ("Deleted “%s”."), name);
  aw_window_show_banner (self, msg);
  self->banner_action = AW_BANNER_UNDO;
  gtk_button_set_label (self->banner_button, _ ("_Undo"));
  gtk_button_set_use_underline (self->banner_button, TRUE);
  gtk_widget_set_visible (GTK_WIDGET (self->banner_button), TRUE);
}

static void
move_setup (AwWindow *self,
            int       delta)
{
  const AwProject *cur = aw_document_get_project (self->document);
  AwProject *p;
  int from = self->selected, to = self->selected + delta;
  gpointer s;

  if (from < 0 || to < 0 || (guint) to >= cur->setups->len)
    return;
  p = aw_project_copy (cur);
  s = g_ptr_array_steal_index (p->setups, from);
  g_ptr_array_insert (p->setups, to, s);
  self->selected = to;
  aw_document_push (self->document, p, delta < 0 ? _ ("Move setup up") : _ ("Move setup down"),
                    NULL, from, to);
  aw_window_select (self, to);
  {
    GtkListBoxRow *row = gtk_list_box_get_row_at_index (self->setup_list, to);
    if (row)
      gtk_widget_grab_focus (GTK_WIDGET (row));
  }
}

static void
move_up_cb (GtkWidget *widget, const char *action_name, GVariant *parameter)
{
  move_setup (AW_WINDOW (widget), -1);
}

static void
move_down_cb (GtkWidget *widget, const char *action_name, GVariant *parameter)
{
  move_setup (AW_WINDOW (widget), +1);
}

static void
toggle_visible_cb (GtkWidget  *widget,
                   const char *action_name,
                   GVariant   *parameter)
{
  AwWindow *self = AW_WINDOW (widget);
  const AwProject *cur = aw_document_get_project (self->document);
  AwProject *p;
  AwSetup *s;

  if (self->selected < 0 || (guint) self->selected >= cur->setups->len)
    return;
  p = aw_project_copy (cur);
  s = g_ptr_array_index (p->setups, self->selected);
  s->visible = !s->visible;
  aw_document_push (self->document, p, s->visible ? _ ("Show setup in plot")
                                                  : _ ("Hide setup in plot"),
                    NULL, self->selected, self->selected);
}

/* ---- undo ---- */

static void
undo_cb (GtkWidget  *widget,
         const char *action_name,
         GVariant   *parameter)
{
  AwWindow *self = AW_WINDOW (widget);
  int sel;

  if (!aw_document_can_undo (self->document))
    return;
  if (self->banner_action == AW_BANNER_UNDO)
    gtk_revealer_set_reveal_child (self->banner_revealer, FALSE);
  sel = aw_document_undo (self->document);
  if (sel >= 0)
    aw_window_select (self, sel);
}

static void
redo_cb (GtkWidget  *widget,
         const char *action_name,
         GVariant   *parameter)
{
  AwWindow *self = AW_WINDOW (widget);
  int sel;

  if (!aw_document_can_redo (self->document))
    return;
  if (self->banner_action == AW_BANNER_UNDO)
    gtk_revealer_set_reveal_child (self->banner_revealer, FALSE);
  sel = aw_document_redo (self->document);
  if (sel >= 0)
    aw_window_select (self, sel);
}

/* ---- saving ---- */

gboolean
aw_window_save_to (AwWindow  *self,
                   GFile     *file,
                   GError   **error)
{
  g_autofree char *path = NULL;
  g_autofree char *uri = NULL;

  g_return_val_if_fail (AW_IS_WINDOW (self), FALSE);
  g_return_val_if_fail (G_IS_FILE (file), FALSE);

  path = g_file_get_path (file);
  if (path == NULL)
    {
      g_set_error (error, G_IO_ERROR, G_IO_ERROR_NOT_SUPPORTED,
                   "%s: only local files can be saved", g_file_peek_path (file));
      return FALSE;
    }
  if (!aw_project_save (aw_document_get_project (self->document), path, error))
    return FALSE;

  aw_document_set_file (self->document, file);
  aw_document_mark_saved (self->document);
  self->recovered = FALSE;
  aw_window_remove_autosave (self);
  uri = g_file_get_uri (file);
  gtk_recent_manager_add_item (gtk_recent_manager_get_default (), uri);
  aw_window_update_title (self);
  return TRUE;
}

static gboolean
save_with_feedback (AwWindow *self,
                    GFile    *file)
{
  g_autoptr (GError) error = NULL;

  if (aw_window_save_to (self, file, &error))
    return TRUE;
  {
    g_autofree char *name = g_file_get_basename (file);
    /* translators: %s is a file name */
    g_autofree char *headline = g_strdup_printf (_ ("Could not save “%s”"), name);
    g_autofree char *detail =
      g_strdup_printf (_ ("%s\n\nThe file on disk was not changed, and your edits are still "
                         "here."), error->message);
    aw_window_show_error (self, headline, detail);
  }
  return FALSE;
}

typedef void (*AfterSave) (AwWindow *self, gboolean saved);

static GFile *
with_extension (GFile *file)
{
  g_autofree char *name = g_file_get_basename (file);

  if (g_str_has_suffix (name, AW_PROJECT_FILE_EXTENSION))
    return g_object_ref (file);
  {
    g_autofree char *fixed = g_strconcat (name, AW_PROJECT_FILE_EXTENSION, NULL);
    g_autoptr (GFile) parent = g_file_get_parent (file);
    return g_file_get_child (parent, fixed);
  }
}

static void
save_as_response_cb (GtkNativeDialog *dialog,
                     int              response,
                     gpointer         user_data)
{
  AwWindow *self = AW_WINDOW (g_object_get_data (G_OBJECT (dialog), "aw-window"));
  AfterSave after = user_data;
  gboolean saved = FALSE;

  if (response == GTK_RESPONSE_ACCEPT)
    {
      g_autoptr (GFile) chosen = gtk_file_chooser_get_file (GTK_FILE_CHOOSER (dialog));
      g_autoptr (GFile) file = chosen ? with_extension (chosen) : NULL;

      if (file != NULL)
        saved = save_with_feedback (self, file);
    }
  if (after)
    after (self, saved);
  g_object_unref (dialog);
}

static GtkFileFilter *
project_filter (void)
{
  GtkFileFilter *filter = gtk_file_filter_new ();

  gtk_file_filter_set_name (filter, _ ("Arcwright projects"));
  gtk_file_filter_add_pattern (filter, "*" AW_PROJECT_FILE_EXTENSION);
  gtk_file_filter_add_mime_type (filter, "application/x-arcwright-project");
  return filter;
}

static void
save_as (AwWindow  *self,
         AfterSave  after)
{
  GtkFileChooserNative *dialog;
  g_autoptr (GtkFileFilter) filter = project_filter ();
  GFile *file = aw_document_get_file (self->document);

  dialog = gtk_file_chooser_native_new (_ ("Save Project As"), GTK_WINDOW (self),
                                        GTK_FILE_CHOOSER_ACTION_SAVE, _ ("_Save"), _ ("_Cancel"));
  gtk_native_dialog_set_modal (GTK_NATIVE_DIALOG (dialog), TRUE);
  gtk_file_chooser_add_filter (GTK_FILE_CHOOSER (dialog), filter);
  if (file != NULL)
    gtk_file_chooser_set_file (GTK_FILE_CHOOSER (dialog), file, NULL);
  else
    {
      const AwProject *p = aw_document_get_project (self->document);
      g_autofree char *name = g_strconcat (p->name && p->name[0] ? p->name : _ ("Project"),
                                           AW_PROJECT_FILE_EXTENSION, NULL);
      g_strdelimit (name, "/\\:", '-');
      gtk_file_chooser_set_current_name (GTK_FILE_CHOOSER (dialog), name);
    }
  g_object_set_data_full (G_OBJECT (dialog), "aw-window", g_object_ref (self), g_object_unref);
  g_signal_connect (dialog, "response", G_CALLBACK (save_as_response_cb), after);
  gtk_native_dialog_show (GTK_NATIVE_DIALOG (dialog));
}

static void
save_then (AwWindow  *self,
           AfterSave  after)
{
  GFile *file = aw_document_get_file (self->document);

  if (file == NULL || self->recovered)
    {
      save_as (self, after);
      return;
    }
  {
    gboolean saved = save_with_feedback (self, file);
    if (after)
      after (self, saved);
  }
}

static void
save_cb (GtkWidget *widget, const char *action_name, GVariant *parameter)
{
  save_then (AW_WINDOW (widget), NULL);
}

static void
save_as_cb (GtkWidget *widget, const char *action_name, GVariant *parameter)
{
  save_as (AW_WINDOW (widget), NULL);
}

/* ---- closing ---- */

static void
close_after_save (AwWindow *self,
                  gboolean  saved)
{
  if (saved)
    {
      self->closing = TRUE;
      gtk_window_destroy (GTK_WINDOW (self));
    }
}

static void
close_response_cb (GtkDialog *dialog,
                   int        response,
                   AwWindow  *self)
{
  gtk_window_destroy (GTK_WINDOW (dialog));
  switch (response)
    {
    case GTK_RESPONSE_ACCEPT:
      save_then (self, close_after_save);
      break;
    case GTK_RESPONSE_REJECT:
      /* the user chose to drop the changes: the recovery copy goes too */
      aw_window_remove_autosave (self);
      self->closing = TRUE;
      gtk_window_destroy (GTK_WINDOW (self));
      break;
    default:
      break;
    }
}

gboolean
aw_window_close_request (GtkWindow *window)
{
  AwWindow *self = AW_WINDOW (window);
  g_autofree char *name = NULL;
  GtkWidget *dialog;
  GtkWidget *discard;

  if (self->closing || self->document == NULL || !aw_document_get_modified (self->document))
    {
      if (self->settings)
        {
          int w, h;
          gtk_window_get_default_size (window, &w, &h);
          if (!gtk_window_is_maximized (window) && w > 0 && h > 0)
            {
              g_settings_set_int (self->settings, "window-width", w);
              g_settings_set_int (self->settings, "window-height", h);
            }
          g_settings_set_boolean (self->settings, "window-maximized",
                                  gtk_window_is_maximized (window));
        }
      aw_window_remove_autosave (self);
      return FALSE;
    }

  name = aw_document_dup_display_name (self->document);
  dialog = gtk_message_dialog_new (window, GTK_DIALOG_MODAL | GTK_DIALOG_DESTROY_WITH_PARENT,
                                   GTK_MESSAGE_QUESTION, GTK_BUTTONS_NONE,
                                   /* translators: %s is a file name */
                                   _ ("Save changes to “%s” before closing?"), name);
  gtk_message_dialog_format_secondary_text (GTK_MESSAGE_DIALOG (dialog), "%s",
                                            _ ("If you close without saving, the changes since "
                                              "the last save are lost."));
  discard = gtk_dialog_add_button (GTK_DIALOG (dialog), _ ("Close _Without Saving"),
                                   GTK_RESPONSE_REJECT);
  gtk_widget_add_css_class (discard, "destructive-action");
  gtk_dialog_add_button (GTK_DIALOG (dialog), _ ("_Cancel"), GTK_RESPONSE_CANCEL);
  gtk_widget_add_css_class (gtk_dialog_add_button (GTK_DIALOG (dialog), _ ("_Save"),
                                                   GTK_RESPONSE_ACCEPT),
                            "suggested-action");
  gtk_dialog_set_default_response (GTK_DIALOG (dialog), GTK_RESPONSE_ACCEPT);
  g_signal_connect (dialog, "response", G_CALLBACK (close_response_cb), self);
  gtk_window_present (GTK_WINDOW (dialog));
  return TRUE;
}

static void
close_cb (GtkWidget *widget, const char *action_name, GVariant *parameter)
{
  gtk_window_close (GTK_WINDOW (widget));
}

/* ---- plot, table ---- */

static void
reset_view_cb (GtkWidget *widget, const char *action_name, GVariant *parameter)
{
  aw_plot_view_reset_view (AW_PLOT_VIEW (AW_WINDOW (widget)->plot));
}

static void
copy_table_cb (GtkWidget *widget, const char *action_name, GVariant *parameter)
{
  AwWindow *self = AW_WINDOW (widget);

  if (aw_range_view_copy_csv (self->range_view))
    aw_window_show_banner (self, _ ("Range table copied as CSV."));
}

static void
export_response_cb (GtkNativeDialog *dialog,
                    int              response,
                    gpointer         user_data)
{
  AwWindow *self = AW_WINDOW (g_object_get_data (G_OBJECT (dialog), "aw-window"));
  AwPlotFormat fmt = GPOINTER_TO_INT (user_data);

  if (response == GTK_RESPONSE_ACCEPT)
    {
      g_autoptr (GFile) file = gtk_file_chooser_get_file (GTK_FILE_CHOOSER (dialog));
      g_autofree char *path = file ? g_file_get_path (file) : NULL;
      g_autoptr (GError) error = NULL;
      AwPlotFormat by_name;
      double w = 1600, h = 1000;

      if (path != NULL && aw_plot_format_from_path (path, &by_name))
        fmt = by_name;
      if (fmt != AW_PLOT_FORMAT_PNG)
        {
          w = 800;
          h = 500;
        }
      if (path != NULL && !aw_plot_view_export (AW_PLOT_VIEW (self->plot), path, fmt, w, h,
                                                &error))
        {
          g_autofree char *name = g_file_get_basename (file);
          g_autofree char *headline = g_strdup_printf (_ ("Could not export “%s”"), name);
          aw_window_show_error (self, headline, error->message);
        }
      else if (path != NULL)
        {
          g_autofree char *name = g_file_get_basename (file);
          /* translators: %s is a file name */
          g_autofree char *msg = g_strdup_printf (_ ("Plot exported to “%s”."), name);
          aw_window_show_banner (self, msg);
        }
    }
  g_object_unref (dialog);
}

static void
export_plot (AwWindow     *self,
             AwPlotFormat  fmt)
{
  static const char *const ext[] = { "png", "svg", "pdf" };
  GtkFileChooserNative *dialog;
  g_autoptr (GtkFileFilter) filter = gtk_file_filter_new ();
  g_autofree char *base = aw_document_dup_display_name (self->document);
  g_autofree char *name = NULL;
  char *dot;

  dot = strrchr (base, '.');
  if (dot && aw_document_get_file (self->document) != NULL)
    *dot = '\0';
  /* translators: default file name of an exported plot, %s is the project name */
  name = g_strdup_printf (_ ("%s plot.%s"), base, ext[fmt]);
  g_strdelimit (name, "/\\:", '-');

  dialog = gtk_file_chooser_native_new (_ ("Export Plot"), GTK_WINDOW (self),
                                        GTK_FILE_CHOOSER_ACTION_SAVE, _ ("_Export"), _ ("_Cancel"));
  gtk_native_dialog_set_modal (GTK_NATIVE_DIALOG (dialog), TRUE);
  switch (fmt)
    {
    case AW_PLOT_FORMAT_PNG:
      gtk_file_filter_set_name (filter, _ ("PNG images"));
      gtk_file_filter_add_pattern (filter, "*.png");
      break;
    case AW_PLOT_FORMAT_SVG:
      gtk_file_filter_set_name (filter, _ ("SVG drawings"));
      gtk_file_filter_add_pattern (filter, "*.svg");
      break;
    case AW_PLOT_FORMAT_PDF:
    default:
      gtk_file_filter_set_name (filter, _ ("PDF documents"));
      gtk_file_filter_add_pattern (filter, "*.pdf");
      break;
    }
  gtk_file_chooser_add_filter (GTK_FILE_CHOOSER (dialog), filter);
  gtk_file_chooser_set_current_name (GTK_FILE_CHOOSER (dialog), name);
  g_object_set_data_full (G_OBJECT (dialog), "aw-window", g_object_ref (self), g_object_unref);
  g_signal_connect (dialog, "response", G_CALLBACK (export_response_cb), GINT_TO_POINTER (fmt));
  gtk_native_dialog_show (GTK_NATIVE_DIALOG (dialog));
}

static void
export_plot_cb (GtkWidget *widget, const char *action_name, GVariant *parameter)
{
  export_plot (AW_WINDOW (widget), AW_PLOT_FORMAT_PNG);
}

static void
export_plot_as_cb (GtkWidget  *widget,
                   const char *action_name,
                   GVariant   *parameter)
{
  const char *kind = g_variant_get_string (parameter, NULL);
  AwPlotFormat fmt = AW_PLOT_FORMAT_PNG;

  if (g_str_equal (kind, "svg"))
    fmt = AW_PLOT_FORMAT_SVG;
  else if (g_str_equal (kind, "pdf"))
    fmt = AW_PLOT_FORMAT_PDF;
  export_plot (AW_WINDOW (widget), fmt);
}

/* ---- printing ---- */

/* Sheets go on the paper of the locale (Letter where that is the custom, else A4); range cards
 * keep their pocket size. */
static AwPaper
default_sheet_paper (void)
{
  const char *name = gtk_paper_size_get_default ();

  if (name != NULL && g_str_equal (name, GTK_PAPER_NAME_LETTER))
    return AW_PAPER_LETTER;
  return AW_PAPER_A4;
}

AwPrintJob *
aw_window_new_print_job (AwWindow     *self,
                         AwPrintKind   kind,
                         GError      **error)
{
  g_autoptr (AwPrintJob) job = NULL;
  const AwProject *p;
  const AwSiteClassRule *cls;
  const AwSiteRules *rules = NULL;

  g_return_val_if_fail (AW_IS_WINDOW (self), NULL);
  g_return_val_if_fail (error == NULL || *error == NULL, NULL);

  p = aw_document_get_project (self->document);
  job = aw_print_job_new (kind, p);
  if (kind == AW_PRINT_KIND_LOADOUT)
    {
      /* the setups shown in the plot, in the list's order */
      for (guint i = 0; i < p->setups->len; i++)
        {
          const AwSetup *s = g_ptr_array_index (p->setups, i);
          if (s->visible && !aw_print_job_add_setup (job, s->name, error))
            return NULL;
        }
      if (aw_print_job_get_n_setups (job) == 0)
        {
          g_set_error_literal (error, AW_PRINT_ERROR, AW_PRINT_ERROR_NO_SETUP,
                               _ ("No setup is shown in the plot. A loadout sheet lists the "
                                 "setups shown there."));
          return NULL;
        }
    }
  else
    {
      const AwSetup *s = NULL;

      if (self->selected >= 0 && (guint) self->selected < p->setups->len)
        s = g_ptr_array_index (p->setups, self->selected);
      if (s == NULL)
        {
          g_set_error_literal (error, AW_PRINT_ERROR, AW_PRINT_ERROR_NO_SETUP,
                               _ ("Choose a setup in the list first."));
          return NULL;
        }
      if (!aw_print_job_add_setup (job, s->name, error))
        return NULL;
    }
  if (kind != AW_PRINT_KIND_CARD)
    aw_print_job_set_paper (job, default_sheet_paper ());
  aw_print_job_set_units (job, self->units == AW_UNITS_IMPERIAL ? AW_PRINT_UNITS_IMPERIAL
                                                                : AW_PRINT_UNITS_METRIC);
  cls = aw_window_get_site_choice (self, &rules);
  if (cls != NULL && !aw_print_job_set_site (job, rules->name, cls->name, error))
    return NULL;
  return g_steal_pointer (&job);
}

static void
print_cb (GtkWidget  *widget,
          const char *action_name,
          GVariant   *parameter)
{
  AwWindow *self = AW_WINDOW (widget);
  g_autoptr (GError) error = NULL;
  AwPrintKind kind = AW_PRINT_KIND_CARD;
  gboolean to_pdf = g_str_has_prefix (action_name, "win.export-");
  AwPrintJob *job;

  if (strstr (action_name, "sheet") != NULL)
    kind = AW_PRINT_KIND_SHEET;
  else if (strstr (action_name, "loadout") != NULL)
    kind = AW_PRINT_KIND_LOADOUT;

  job = aw_window_new_print_job (self, kind, &error);
  if (job == NULL)
    {
      aw_window_show_error (self, to_pdf ? _ ("Nothing to export") : _ ("Nothing to print"),
                            error->message);
      return;
    }
  /* both take the job and report their own problems */
  if (to_pdf)
    aw_print_export_pdf_dialog (GTK_WINDOW (self), job);
  else
    aw_print_run_dialog (GTK_WINDOW (self), job);
}

/* ---- moving around ---- */

static void
focus_list_cb (GtkWidget *widget, const char *action_name, GVariant *parameter)
{
  AwWindow *self = AW_WINDOW (widget);
  GtkListBoxRow *row = gtk_list_box_get_row_at_index (self->setup_list, MAX (self->selected, 0));

  g_object_set (self, "show-sidebar", TRUE, NULL);
  if (row)
    gtk_widget_grab_focus (GTK_WIDGET (row));
}

static void
focus_editor_cb (GtkWidget *widget, const char *action_name, GVariant *parameter)
{
  aw_window_focus_editor (AW_WINDOW (widget));
}

static void
focus_plot_cb (GtkWidget *widget, const char *action_name, GVariant *parameter)
{
  AwWindow *self = AW_WINDOW (widget);

  /* the plot of the view shown */
  if (g_str_equal (aw_window_get_view (self), "sweep"))
    gtk_widget_grab_focus (aw_sweep_panel_get_plot (self->sweep_panel));
  else
    gtk_widget_grab_focus (self->plot);
}

void
aw_window_update_actions (AwWindow *self)
{
  GtkWidget *w = GTK_WIDGET (self);
  const AwProject *p;
  int n, sel = self->selected;
  const char *undo, *redo;

  if (self->document == NULL)
    return;
  p = aw_document_get_project (self->document);
  n = (int) p->setups->len;
  gtk_widget_action_set_enabled (w, "win.undo", aw_document_can_undo (self->document));
  gtk_widget_action_set_enabled (w, "win.redo", aw_document_can_redo (self->document));
  gtk_widget_action_set_enabled (w, "win.duplicate-setup", sel >= 0 && sel < n);
  gtk_widget_action_set_enabled (w, "win.rename-setup", sel >= 0 && sel < n);
  gtk_widget_action_set_enabled (w, "win.toggle-visible", sel >= 0 && sel < n);
  gtk_widget_action_set_enabled (w, "win.delete-setup", sel >= 0 && sel < n && n > 1);
  gtk_widget_action_set_enabled (w, "win.move-up", sel > 0 && sel < n);
  gtk_widget_action_set_enabled (w, "win.move-down", sel >= 0 && sel < n - 1);
  {
    gboolean any_shown = FALSE;

    for (int i = 0; i < n && !any_shown; i++)
      any_shown = ((const AwSetup *) g_ptr_array_index (p->setups, i))->visible;
    gtk_widget_action_set_enabled (w, "win.print-card", sel >= 0 && sel < n);
    gtk_widget_action_set_enabled (w, "win.print-sheet", sel >= 0 && sel < n);
    gtk_widget_action_set_enabled (w, "win.print-loadout", any_shown);
    gtk_widget_action_set_enabled (w, "win.export-card-pdf", sel >= 0 && sel < n);
    gtk_widget_action_set_enabled (w, "win.export-sheet-pdf", sel >= 0 && sel < n);
    gtk_widget_action_set_enabled (w, "win.export-loadout-pdf", any_shown);
  }

  undo = aw_document_get_undo_label (self->document);
  redo = aw_document_get_redo_label (self->document);
  {
    /* translators: tooltip of the undo button, %s names the edit, e.g. "Change BB mass" */
    g_autofree char *u = undo ? g_strdup_printf (_ ("Undo: %s (Ctrl+Z)"), undo)
                              : g_strdup (_ ("Nothing to undo"));
    g_autofree char *r = redo ? g_strdup_printf (_ ("Redo: %s (Ctrl+Shift+Z)"), redo)
                              : g_strdup (_ ("Nothing to redo"));
    gtk_widget_set_tooltip_text (GTK_WIDGET (self->undo_button), u);
    gtk_widget_set_tooltip_text (GTK_WIDGET (self->redo_button), r);
  }
}

/* ---- autosave ---- */

char *
aw_autosave_dir (void)
{
  return g_build_filename (g_get_user_state_dir (), "arcwright", "autosave", NULL);
}

void
aw_window_remove_autosave (AwWindow *self)
{
  g_autofree char *dir = NULL;
  g_autofree char *data = NULL;
  g_autofree char *info = NULL;

  g_clear_handle_id (&self->autosave_timeout_id, g_source_remove);
  if (self->autosave_name == NULL)
    return;
  dir = aw_autosave_dir ();
  data = g_strconcat (dir, G_DIR_SEPARATOR_S, self->autosave_name, AW_PROJECT_FILE_EXTENSION,
                      NULL);
  info = g_strconcat (dir, G_DIR_SEPARATOR_S, self->autosave_name, ".info", NULL);
  g_remove (data);
  g_remove (info);
}

void
aw_window_autosave_now (AwWindow *self)
{
  g_autofree char *dir = NULL;
  g_autofree char *data_path = NULL;
  g_autofree char *info_path = NULL;
  g_autofree char *text = NULL;
  g_autofree char *info_text = NULL;
  g_autoptr (GKeyFile) info = NULL;
  g_autoptr (GError) error = NULL;
  GFile *file;
  gsize len = 0;

  g_return_if_fail (AW_IS_WINDOW (self));

  g_clear_handle_id (&self->autosave_timeout_id, g_source_remove);
  if (self->document == NULL || !aw_document_get_modified (self->document))
    {
      aw_window_remove_autosave (self);
      return;
    }

  dir = aw_autosave_dir ();
  if (g_mkdir_with_parents (dir, 0700) != 0)
    {
      g_warning ("autosave: cannot create %s", dir);
      return;
    }
  if (self->autosave_name == NULL)
    {
      g_autofree char *uuid = g_uuid_string_random ();
      self->autosave_name = g_strdup (uuid);
    }
  data_path = g_strconcat (dir, G_DIR_SEPARATOR_S, self->autosave_name,
                           AW_PROJECT_FILE_EXTENSION, NULL);
  info_path = g_strconcat (dir, G_DIR_SEPARATOR_S, self->autosave_name, ".info", NULL);

  text = aw_project_to_data (aw_document_get_project (self->document), &len);
  if (text == NULL || !g_file_set_contents_full (data_path, text, (gssize) len,
                                                 G_FILE_SET_CONTENTS_CONSISTENT, 0600, &error))
    {
      g_warning ("autosave: %s", error ? error->message : data_path);
      return;
    }

  info = g_key_file_new ();
  file = aw_document_get_file (self->document);
  if (file != NULL)
    {
      g_autofree char *uri = g_file_get_uri (file);
      g_key_file_set_string (info, "autosave", "uri", uri);
    }
  g_key_file_set_int64 (info, "autosave", "pid", (gint64) getpid ());
  g_key_file_set_int64 (info, "autosave", "time", g_get_real_time () / G_USEC_PER_SEC);
  info_text = g_key_file_to_data (info, &len, NULL);
  if (!g_file_set_contents_full (info_path, info_text, (gssize) len,
                                 G_FILE_SET_CONTENTS_CONSISTENT, 0600, &error))
    g_warning ("autosave: %s", error->message);
}

static gboolean
autosave_timeout_cb (gpointer user_data)
{
  AwWindow *self = user_data;

  self->autosave_timeout_id = 0;
  aw_window_autosave_now (self);
  return G_SOURCE_REMOVE;
}

void
aw_window_schedule_autosave (AwWindow *self)
{
  if (self->document == NULL || !aw_document_get_modified (self->document))
    return;
  g_clear_handle_id (&self->autosave_timeout_id, g_source_remove);
  self->autosave_timeout_id = g_timeout_add_seconds (AUTOSAVE_DELAY_S, autosave_timeout_cb, self);
}

void
aw_window_mark_recovered (AwWindow *self)
{
  g_return_if_fail (AW_IS_WINDOW (self));

  self->recovered = TRUE;
  aw_document_mark_unsaved (self->document);
  aw_window_update_title (self);
  aw_window_update_actions (self);
  aw_window_autosave_now (self);
  aw_window_show_banner_with_action (self,
                           _ ("This project was recovered from an automatic copy made before "
                             "Arcwright closed unexpectedly. Save it to keep it."),
                           AW_BANNER_SAVE_AS, _ ("Save _As…"));
}

void
aw_window_set_recent_menu (AwWindow   *self,
                           GMenuModel *recent)
{
  g_return_if_fail (AW_IS_WINDOW (self));

  g_menu_remove_all (self->recent_submenu);
  if (recent != NULL)
    g_menu_append_section (self->recent_submenu, NULL, recent);
}

void
aw_window_install_actions (GtkWidgetClass *widget_class)
{
  gtk_widget_class_install_action (widget_class, "win.save", NULL, save_cb);
  gtk_widget_class_install_action (widget_class, "win.save-as", NULL, save_as_cb);
  gtk_widget_class_install_action (widget_class, "win.close", NULL, close_cb);
  gtk_widget_class_install_action (widget_class, "win.undo", NULL, undo_cb);
  gtk_widget_class_install_action (widget_class, "win.redo", NULL, redo_cb);
  gtk_widget_class_install_action (widget_class, "win.add-setup", NULL, add_setup_cb);
  gtk_widget_class_install_action (widget_class, "win.duplicate-setup", NULL, duplicate_setup_cb);
  gtk_widget_class_install_action (widget_class, "win.rename-setup", NULL, rename_setup_cb);
  gtk_widget_class_install_action (widget_class, "win.delete-setup", NULL, delete_setup_cb);
  gtk_widget_class_install_action (widget_class, "win.move-up", NULL, move_up_cb);
  gtk_widget_class_install_action (widget_class, "win.move-down", NULL, move_down_cb);
  gtk_widget_class_install_action (widget_class, "win.toggle-visible", NULL, toggle_visible_cb);
  gtk_widget_class_install_action (widget_class, "win.reset-view", NULL, reset_view_cb);
  gtk_widget_class_install_action (widget_class, "win.copy-table", NULL, copy_table_cb);
  gtk_widget_class_install_action (widget_class, "win.export-plot", NULL, export_plot_cb);
  gtk_widget_class_install_action (widget_class, "win.export-plot-as", "s", export_plot_as_cb);
  gtk_widget_class_install_action (widget_class, "win.print-card", NULL, print_cb);
  gtk_widget_class_install_action (widget_class, "win.print-sheet", NULL, print_cb);
  gtk_widget_class_install_action (widget_class, "win.print-loadout", NULL, print_cb);
  gtk_widget_class_install_action (widget_class, "win.export-card-pdf", NULL, print_cb);
  gtk_widget_class_install_action (widget_class, "win.export-sheet-pdf", NULL, print_cb);
  gtk_widget_class_install_action (widget_class, "win.export-loadout-pdf", NULL, print_cb);
  gtk_widget_class_install_action (widget_class, "win.focus-setups", NULL, focus_list_cb);
  gtk_widget_class_install_action (widget_class, "win.focus-editor", NULL, focus_editor_cb);
  gtk_widget_class_install_action (widget_class, "win.focus-plot", NULL, focus_plot_cb);
  gtk_widget_class_install_property_action (widget_class, "win.show-sidebar", "show-sidebar");
  gtk_widget_class_install_property_action (widget_class, "win.top-view", "show-top-view");
  gtk_widget_class_install_property_action (widget_class, "win.view", "view");
}
