/* aw-application.c: the desktop program — windows, files, recent files, preferences, recovery
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <glib/gi18n.h>
#include <glib/gstdio.h>
#include <string.h>
#include <unistd.h>

#include "aw-application.h"
#include "aw-preferences.h"
#include "aw-project-io.h"

#define MAX_RECENT 8

struct _AwApplication
{
  GtkApplication parent_instance;

  GSettings *settings;
  GMenu *recent_menu;
  GtkCssProvider *dark_css;
  GDBusConnection *session_bus;
  guint portal_signal_id;
  int system_scheme;          /* portal value: 0 none, 1 prefer dark, 2 prefer light */
  gboolean recovery_checked;
};

G_DEFINE_FINAL_TYPE (AwApplication, aw_application, GTK_TYPE_APPLICATION)

/* ---- windows ---- */

static AwWindow *
new_window (AwApplication *self)
{
  AwWindow *window = aw_window_new (GTK_APPLICATION (self), self->settings);

  aw_window_set_recent_menu (window, G_MENU_MODEL (self->recent_menu));
  return window;
}

static AwWindow *
find_window_for_file (AwApplication *self,
                      GFile         *file)
{
  for (GList *l = gtk_application_get_windows (GTK_APPLICATION (self)); l; l = l->next)
    if (AW_IS_WINDOW (l->data))
      {
        GFile *f = aw_document_get_file (aw_window_get_document (l->data));
        if (f != NULL && g_file_equal (f, file))
          return l->data;
      }
  return NULL;
}

static AwWindow *
pristine_window (AwApplication *self)
{
  GtkWindow *active = gtk_application_get_active_window (GTK_APPLICATION (self));

  if (AW_IS_WINDOW (active) && aw_window_is_pristine (AW_WINDOW (active)))
    return AW_WINDOW (active);
  return NULL;
}

AwWindow *
aw_application_open_file (AwApplication *self,
                          GFile         *file)
{
  AwWindow *window;
  gboolean created = FALSE;
  g_autoptr (GError) error = NULL;

  g_return_val_if_fail (AW_IS_APPLICATION (self), NULL);
  g_return_val_if_fail (G_IS_FILE (file), NULL);

  window = find_window_for_file (self, file);
  if (window != NULL)
    {
      gtk_window_present (GTK_WINDOW (window));
      return window;
    }
  window = pristine_window (self);
  if (window == NULL)
    {
      window = new_window (self);
      created = TRUE;
    }
  gtk_window_present (GTK_WINDOW (window));
  if (!aw_window_load_file (window, file, FALSE, &error) && created)
    {
      /* keep the new window only to show the error; it holds an empty project */
      g_debug ("open failed: %s", error->message);
    }
  return window;
}

/* ---- recent files ---- */

static gint
compare_recent (gconstpointer a,
                gconstpointer b)
{
  GtkRecentInfo *ia = *(GtkRecentInfo **) a;
  GtkRecentInfo *ib = *(GtkRecentInfo **) b;
  GDateTime *ta = gtk_recent_info_get_modified (ia);
  GDateTime *tb = gtk_recent_info_get_modified (ib);

  return g_date_time_compare (tb, ta);
}

static void
rebuild_recent_menu (AwApplication *self)
{
  GtkRecentManager *manager = gtk_recent_manager_get_default ();
  GList *items = gtk_recent_manager_get_items (manager);
  g_autoptr (GPtrArray) arcw = g_ptr_array_new ();
  guint shown = 0;

  for (GList *l = items; l; l = l->next)
    {
      const char *uri = gtk_recent_info_get_uri (l->data);
      if (g_str_has_suffix (uri, AW_PROJECT_FILE_EXTENSION) && gtk_recent_info_exists (l->data))
        g_ptr_array_add (arcw, l->data);
    }
  g_ptr_array_sort (arcw, compare_recent);

  g_menu_remove_all (self->recent_menu);
  for (guint i = 0; i < arcw->len && shown < MAX_RECENT; i++, shown++)
    {
      GtkRecentInfo *info = g_ptr_array_index (arcw, i);
      g_autoptr (GMenuItem) item = NULL;
      g_autofree char *label = g_strdup (gtk_recent_info_get_display_name (info));

      item = g_menu_item_new (label, NULL);
      g_menu_item_set_action_and_target (item, "app.open-recent", "s",
                                         gtk_recent_info_get_uri (info));
      g_menu_append_item (self->recent_menu, item);
    }
  if (shown == 0)
    {
      g_autoptr (GMenuItem) item = g_menu_item_new (_ ("No recent projects"), "app.no-recent");
      g_menu_append_item (self->recent_menu, item);
    }
  g_list_free_full (items, (GDestroyNotify) gtk_recent_info_unref);
}

/* ---- appearance ---- */

static gboolean
theme_is_dark (void)
{
  const char *env = g_getenv ("GTK_THEME");
  GtkSettings *settings = gtk_settings_get_default ();
  gboolean prefer_dark = FALSE;
  g_autofree char *theme = NULL;

  if (env != NULL)
    return g_str_has_suffix (env, ":dark") || g_str_has_suffix (env, "-dark");
  if (settings == NULL)
    return FALSE;
  g_object_get (settings, "gtk-application-prefer-dark-theme", &prefer_dark,
                "gtk-theme-name", &theme, NULL);
  return prefer_dark || (theme && g_str_has_suffix (theme, "-dark"));
}

static void
apply_style (AwApplication *self)
{
  GtkSettings *gtk_settings = gtk_settings_get_default ();
  g_autofree char *style = g_settings_get_string (self->settings, "style");
  gboolean dark;
  GdkDisplay *display = gdk_display_get_default ();

  if (g_str_equal (style, "dark"))
    dark = TRUE;
  else if (g_str_equal (style, "light"))
    dark = FALSE;
  else
    dark = self->system_scheme == 1;
  if (gtk_settings != NULL)
    g_object_set (gtk_settings, "gtk-application-prefer-dark-theme", dark, NULL);

  if (display == NULL)
    return;
  if (theme_is_dark ())
    gtk_style_context_add_provider_for_display (display, GTK_STYLE_PROVIDER (self->dark_css),
                                                GTK_STYLE_PROVIDER_PRIORITY_APPLICATION + 1);
  else
    gtk_style_context_remove_provider_for_display (display, GTK_STYLE_PROVIDER (self->dark_css));
}

static void
set_system_scheme (AwApplication *self,
                   GVariant      *value)
{
  /* the value may arrive wrapped in one or two variants */
  g_autoptr (GVariant) v = g_variant_ref (value);

  while (v != NULL && g_variant_is_of_type (v, G_VARIANT_TYPE_VARIANT))
    {
      GVariant *inner = g_variant_get_variant (v);
      g_variant_unref (v);
      v = inner;
    }
  if (v != NULL && g_variant_is_of_type (v, G_VARIANT_TYPE_UINT32))
    self->system_scheme = (int) g_variant_get_uint32 (v);
  apply_style (self);
}

static void
portal_read_cb (GObject      *source,
                GAsyncResult *res,
                gpointer      user_data)
{
  g_autoptr (AwApplication) self = user_data;
  g_autoptr (GVariant) reply = g_dbus_connection_call_finish (G_DBUS_CONNECTION (source), res,
                                                             NULL);
  g_autoptr (GVariant) value = NULL;

  if (reply == NULL)
    return;   /* no portal: the style choice falls back to light unless the theme says dark */
  g_variant_get (reply, "(v)", &value);
  set_system_scheme (self, value);
}

static void
portal_changed_cb (GDBusConnection *connection,
                   const char      *sender,
                   const char      *path,
                   const char      *interface,
                   const char      *signal,
                   GVariant        *params,
                   gpointer         user_data)
{
  AwApplication *self = user_data;
  const char *ns = NULL, *key = NULL;
  g_autoptr (GVariant) value = NULL;

  if (!g_variant_is_of_type (params, G_VARIANT_TYPE ("(ssv)")))
    return;
  g_variant_get (params, "(&s&sv)", &ns, &key, &value);
  if (g_str_equal (ns, "org.freedesktop.appearance") && g_str_equal (key, "color-scheme"))
    set_system_scheme (self, value);
}

static void
follow_system_style (AwApplication *self)
{
  self->session_bus = g_bus_get_sync (G_BUS_TYPE_SESSION, NULL, NULL);
  if (self->session_bus == NULL)
    return;
  self->portal_signal_id =
    g_dbus_connection_signal_subscribe (self->session_bus, "org.freedesktop.portal.Desktop",
                                        "org.freedesktop.portal.Settings", "SettingChanged",
                                        "/org/freedesktop/portal/desktop", NULL,
                                        G_DBUS_SIGNAL_FLAGS_NONE, portal_changed_cb, self, NULL);
  g_dbus_connection_call (self->session_bus, "org.freedesktop.portal.Desktop",
                          "/org/freedesktop/portal/desktop", "org.freedesktop.portal.Settings",
                          "Read", g_variant_new ("(ss)", "org.freedesktop.appearance",
                                                 "color-scheme"),
                          G_VARIANT_TYPE ("(v)"), G_DBUS_CALL_FLAGS_NO_AUTO_START, 2000, NULL,
                          portal_read_cb, g_object_ref (self));
}

/* ---- recovery ---- */

static gboolean
process_alive (gint64 pid)
{
  g_autofree char *path = NULL;
  g_autofree char *comm = NULL;

  if (pid <= 0)
    return FALSE;
  if (pid == (gint64) getpid ())
    return TRUE;
  path = g_strdup_printf ("/proc/%" G_GINT64_FORMAT "/comm", pid);
  if (!g_file_get_contents (path, &comm, NULL, NULL))
    return FALSE;
  return g_str_has_prefix (comm, "arcwright") || g_str_has_prefix (comm, "test-gui");
}

GPtrArray *
aw_application_find_orphans (void)
{
  g_autofree char *dir_path = aw_autosave_dir ();
  g_autoptr (GDir) dir = g_dir_open (dir_path, 0, NULL);
  GPtrArray *found = g_ptr_array_new_with_free_func (g_free);
  const char *name;

  if (dir == NULL)
    return found;
  while ((name = g_dir_read_name (dir)) != NULL)
    {
      g_autofree char *base = NULL;
      g_autofree char *info_path = NULL;
      g_autoptr (GKeyFile) info = g_key_file_new ();
      gint64 pid = 0;

      if (!g_str_has_suffix (name, AW_PROJECT_FILE_EXTENSION))
        continue;
      base = g_strndup (name, strlen (name) - strlen (AW_PROJECT_FILE_EXTENSION));
      info_path = g_strconcat (dir_path, G_DIR_SEPARATOR_S, base, ".info", NULL);
      if (g_key_file_load_from_file (info, info_path, G_KEY_FILE_NONE, NULL))
        pid = g_key_file_get_int64 (info, "autosave", "pid", NULL);
      if (process_alive (pid))
        continue;
      g_ptr_array_add (found, g_build_filename (dir_path, name, NULL));
    }
  return found;
}

static void
remove_copy (const char *data_path)
{
  g_autofree char *base = g_strndup (data_path,
                                     strlen (data_path) - strlen (AW_PROJECT_FILE_EXTENSION));
  g_autofree char *info_path = g_strconcat (base, ".info", NULL);

  g_remove (data_path);
  g_remove (info_path);
}

static void
recover_copies (AwApplication *self,
                GPtrArray     *copies)
{
  for (guint i = 0; i < copies->len; i++)
    {
      const char *path = g_ptr_array_index (copies, i);
      g_autofree char *base = g_strndup (path, strlen (path) - strlen (AW_PROJECT_FILE_EXTENSION));
      g_autofree char *info_path = g_strconcat (base, ".info", NULL);
      g_autoptr (GKeyFile) info = g_key_file_new ();
      g_autofree char *uri = NULL;
      g_autoptr (GFile) original = NULL;
      g_autoptr (GFile) copy = g_file_new_for_path (path);
      g_autoptr (GError) error = NULL;
      AwWindow *window = pristine_window (self);

      if (g_key_file_load_from_file (info, info_path, G_KEY_FILE_NONE, NULL))
        uri = g_key_file_get_string (info, "autosave", "uri", NULL);
      if (window == NULL)
        window = new_window (self);
      gtk_window_present (GTK_WINDOW (window));
      if (!aw_window_load_file (window, copy, FALSE, &error))
        continue;   /* the error was shown; the copy stays for another try */
      original = uri ? g_file_new_for_uri (uri) : NULL;
      aw_document_set_file (aw_window_get_document (window), original);
      aw_window_mark_recovered (window);
      remove_copy (path);
    }
}

static void
recovery_response_cb (GtkDialog *dialog,
                      int        response,
                      gpointer   user_data)
{
  AwApplication *self = AW_APPLICATION (user_data);
  GPtrArray *copies = g_object_get_data (G_OBJECT (dialog), "aw-copies");

  if (response == GTK_RESPONSE_ACCEPT)
    recover_copies (self, copies);
  else if (response == GTK_RESPONSE_REJECT)
    for (guint i = 0; i < copies->len; i++)
      remove_copy (g_ptr_array_index (copies, i));
  gtk_window_destroy (GTK_WINDOW (dialog));
  g_application_release (G_APPLICATION (self));
}

static void
offer_recovery (AwApplication *self,
                GtkWindow     *parent)
{
  g_autoptr (GPtrArray) copies = NULL;
  GtkWidget *dialog;
  GtkWidget *button;

  if (self->recovery_checked || g_getenv ("AW_NO_RECOVERY") != NULL)
    return;
  self->recovery_checked = TRUE;
  copies = aw_application_find_orphans ();
  if (copies->len == 0)
    return;

  dialog = gtk_message_dialog_new (parent, GTK_DIALOG_MODAL | GTK_DIALOG_DESTROY_WITH_PARENT,
                                   GTK_MESSAGE_QUESTION, GTK_BUTTONS_NONE,
                                   _ ("Recover unsaved work?"));
  gtk_message_dialog_format_secondary_text (
    GTK_MESSAGE_DIALOG (dialog),
    g_dngettext (GETTEXT_PACKAGE,
                 "Arcwright closed unexpectedly while %u project had unsaved changes. An "
                 "automatic copy was kept.",
                 "Arcwright closed unexpectedly while %u projects had unsaved changes. "
                 "Automatic copies were kept.",
                 copies->len),
    copies->len);
  button = gtk_dialog_add_button (GTK_DIALOG (dialog), _ ("_Discard"), GTK_RESPONSE_REJECT);
  gtk_widget_add_css_class (button, "destructive-action");
  gtk_dialog_add_button (GTK_DIALOG (dialog), _ ("_Later"), GTK_RESPONSE_CANCEL);
  button = gtk_dialog_add_button (GTK_DIALOG (dialog), _ ("_Recover"), GTK_RESPONSE_ACCEPT);
  gtk_widget_add_css_class (button, "suggested-action");
  gtk_dialog_set_default_response (GTK_DIALOG (dialog), GTK_RESPONSE_ACCEPT);
  g_object_set_data_full (G_OBJECT (dialog), "aw-copies", g_steal_pointer (&copies),
                          (GDestroyNotify) g_ptr_array_unref);
  g_application_hold (G_APPLICATION (self));
  g_signal_connect (dialog, "response", G_CALLBACK (recovery_response_cb), self);
  gtk_window_present (GTK_WINDOW (dialog));
}

/* ---- actions ---- */

static void
new_activated (GSimpleAction *action,
               GVariant      *parameter,
               gpointer       user_data)
{
  AwApplication *self = user_data;
  AwWindow *window = pristine_window (self);

  if (window == NULL)
    window = new_window (self);
  gtk_window_present (GTK_WINDOW (window));
}

static void
new_window_activated (GSimpleAction *action,
                      GVariant      *parameter,
                      gpointer       user_data)
{
  gtk_window_present (GTK_WINDOW (new_window (user_data)));
}

static void
open_response_cb (GtkNativeDialog *dialog,
                  int              response,
                  gpointer         user_data)
{
  AwApplication *self = user_data;

  if (response == GTK_RESPONSE_ACCEPT)
    {
      g_autoptr (GListModel) files = gtk_file_chooser_get_files (GTK_FILE_CHOOSER (dialog));
      for (guint i = 0; i < g_list_model_get_n_items (files); i++)
        {
          g_autoptr (GFile) file = g_list_model_get_item (files, i);
          aw_application_open_file (self, file);
        }
    }
  g_object_unref (dialog);
  g_application_release (G_APPLICATION (self));
}

static void
open_activated (GSimpleAction *action,
                GVariant      *parameter,
                gpointer       user_data)
{
  AwApplication *self = user_data;
  GtkFileChooserNative *dialog;
  g_autoptr (GtkFileFilter) filter = gtk_file_filter_new ();
  g_autoptr (GtkFileFilter) all = gtk_file_filter_new ();

  dialog = gtk_file_chooser_native_new (_ ("Open Project"),
                                        gtk_application_get_active_window (GTK_APPLICATION (self)),
                                        GTK_FILE_CHOOSER_ACTION_OPEN, _ ("_Open"), _ ("_Cancel"));
  gtk_native_dialog_set_modal (GTK_NATIVE_DIALOG (dialog), TRUE);
  gtk_file_chooser_set_select_multiple (GTK_FILE_CHOOSER (dialog), TRUE);
  gtk_file_filter_set_name (filter, _ ("Arcwright projects"));
  gtk_file_filter_add_pattern (filter, "*" AW_PROJECT_FILE_EXTENSION);
  gtk_file_filter_add_mime_type (filter, "application/x-arcwright-project");
  gtk_file_chooser_add_filter (GTK_FILE_CHOOSER (dialog), filter);
  gtk_file_filter_set_name (all, _ ("All files"));
  gtk_file_filter_add_pattern (all, "*");
  gtk_file_chooser_add_filter (GTK_FILE_CHOOSER (dialog), all);
  g_application_hold (G_APPLICATION (self));
  g_signal_connect (dialog, "response", G_CALLBACK (open_response_cb), self);
  gtk_native_dialog_show (GTK_NATIVE_DIALOG (dialog));
}

static void
open_recent_activated (GSimpleAction *action,
                       GVariant      *parameter,
                       gpointer       user_data)
{
  g_autoptr (GFile) file = g_file_new_for_uri (g_variant_get_string (parameter, NULL));

  aw_application_open_file (user_data, file);
}

static void
preferences_activated (GSimpleAction *action,
                       GVariant      *parameter,
                       gpointer       user_data)
{
  AwApplication *self = user_data;
  GtkWindow *parent = gtk_application_get_active_window (GTK_APPLICATION (self));

  gtk_window_present (GTK_WINDOW (aw_preferences_new (parent, self->settings)));
}

static void
about_activated (GSimpleAction *action,
                 GVariant      *parameter,
                 gpointer       user_data)
{
  AwApplication *self = user_data;
  GtkWindow *parent = gtk_application_get_active_window (GTK_APPLICATION (self));
  static const char *authors[] = { "The Arcwright developers", NULL };
  g_autofree char *comments = NULL;

  comments = g_strjoin ("\n\n",
                        _ ("A workbench for setting up airsoft replicas: BB flight, hop as a lift "
                          "ratio, band range, range tables and printed sheets."),
                        _ ("Everything it shows is an estimate from a model. The site's own "
                          "chronograph, with the BB weight and rules of that site, decides "
                          "whether a replica may be used; chronograph again after every change."),
                        _ ("Keep sealed, impact-rated eye protection on wherever replicas may be "
                          "fired, and respect minimum engagement distances. Laws differ between "
                          "countries and change: the owner is responsible, and nothing here is "
                          "legal advice."),
                        NULL);
  gtk_show_about_dialog (parent,
                         "program-name", "Arcwright",
                         "logo-icon-name", AW_APP_ID,
                         "version", AW_VERSION,
                         "comments", comments,
                         "website", "https://github.com/arcwright/arcwright",
                         "license-type", GTK_LICENSE_GPL_3_0,
                         "authors", authors,
                         /* translators: put your names here, one per line */
                         "translator-credits", _ ("translator-credits"),
                         "copyright", "© 2024 The Arcwright developers",
                         "modal", TRUE,
                         NULL);
}

static void
quit_activated (GSimpleAction *action,
                GVariant      *parameter,
                gpointer       user_data)
{
  AwApplication *self = user_data;
  GList *windows = g_list_copy (gtk_application_get_windows (GTK_APPLICATION (self)));

  /* each window asks about its own unsaved changes */
  for (GList *l = windows; l; l = l->next)
    gtk_window_close (l->data);
  g_list_free (windows);
}

static const GActionEntry app_entries[] = {
  { "new", new_activated, NULL, NULL, NULL, { 0 } },
  { "new-window", new_window_activated, NULL, NULL, NULL, { 0 } },
  { "open", open_activated, NULL, NULL, NULL, { 0 } },
  { "open-recent", open_recent_activated, "s", NULL, NULL, { 0 } },
  { "preferences", preferences_activated, NULL, NULL, NULL, { 0 } },
  { "about", about_activated, NULL, NULL, NULL, { 0 } },
  { "quit", quit_activated, NULL, NULL, NULL, { 0 } },
};

static const struct
{
  const char *action;
  const char *accels[3];
} accels[] = {
  { "app.new", { "<Control>n", NULL } },
  { "app.open", { "<Control>o", NULL } },
  { "app.preferences", { "<Control>comma", NULL } },
  { "app.quit", { "<Control>q", NULL } },
  { "win.save", { "<Control>s", NULL } },
  { "win.save-as", { "<Control><Shift>s", NULL } },
  { "win.close", { "<Control>w", NULL } },
  { "win.undo", { "<Control>z", NULL } },
  { "win.redo", { "<Control><Shift>z", "<Control>y", NULL } },
  { "win.add-setup", { "<Control><Shift>n", NULL } },
  { "win.duplicate-setup", { "<Control>d", NULL } },
  { "win.rename-setup", { "F2", NULL } },
  { "win.delete-setup", { "<Control>Delete", NULL } },
  { "win.move-up", { "<Alt>Up", NULL } },
  { "win.move-down", { "<Alt>Down", NULL } },
  { "win.toggle-visible", { "<Control>h", NULL } },
  { "win.top-view", { "<Control>t", NULL } },
  { "win.reset-view", { "<Control>0", NULL } },
  { "win.export-plot", { "<Control>e", NULL } },
  { "win.copy-table", { "<Control><Shift>c", NULL } },
  { "win.print-card", { "<Control>p", NULL } },
  { "win.export-card-pdf", { "<Control><Shift>p", NULL } },
  { "win.view::flight", { "<Control>1", NULL } },
  { "win.view::sweep", { "<Control>2", NULL } },
  { "win.show-sidebar", { "F9", NULL } },
  { "win.focus-setups", { "<Alt>1", NULL } },
  { "win.focus-plot", { "<Alt>2", NULL } },
  { "win.focus-editor", { "<Alt>3", NULL } },
};

/* ---- GApplication ---- */

static void
aw_application_startup (GApplication *app)
{
  AwApplication *self = AW_APPLICATION (app);

  G_APPLICATION_CLASS (aw_application_parent_class)->startup (app);

  self->settings = g_settings_new (AW_APP_ID);
  g_action_map_add_action_entries (G_ACTION_MAP (self), app_entries, G_N_ELEMENTS (app_entries),
                                   self);
  {
    GSimpleAction *none = g_simple_action_new ("no-recent", NULL);
    g_simple_action_set_enabled (none, FALSE);
    g_action_map_add_action (G_ACTION_MAP (self), G_ACTION (none));
    g_object_unref (none);
  }
  for (guint i = 0; i < G_N_ELEMENTS (accels); i++)
    gtk_application_set_accels_for_action (GTK_APPLICATION (self), accels[i].action,
                                           accels[i].accels);

  gtk_window_set_default_icon_name (AW_APP_ID);

  self->recent_menu = g_menu_new ();
  rebuild_recent_menu (self);
  g_signal_connect_object (gtk_recent_manager_get_default (), "changed",
                           G_CALLBACK (rebuild_recent_menu), self, G_CONNECT_SWAPPED);

  self->dark_css = gtk_css_provider_new ();
  gtk_css_provider_load_from_resource (self->dark_css,
                                       "/io/github/arcwright/Arcwright/style-dark.css");
  g_signal_connect_swapped (self->settings, "changed::style", G_CALLBACK (apply_style), self);
  g_signal_connect_swapped (gtk_settings_get_default (), "notify::gtk-theme-name",
                            G_CALLBACK (apply_style), self);
  apply_style (self);
  follow_system_style (self);
}

static void
aw_application_activate (GApplication *app)
{
  AwApplication *self = AW_APPLICATION (app);
  GtkWindow *window = gtk_application_get_active_window (GTK_APPLICATION (self));

  if (window == NULL)
    window = GTK_WINDOW (new_window (self));
  gtk_window_present (window);
  offer_recovery (self, window);
}

static void
aw_application_open (GApplication  *app,
                     GFile        **files,
                     int            n_files,
                     const char    *hint)
{
  AwApplication *self = AW_APPLICATION (app);
  AwWindow *last = NULL;

  for (int i = 0; i < n_files; i++)
    last = aw_application_open_file (self, files[i]);
  if (last != NULL)
    offer_recovery (self, GTK_WINDOW (last));
}

static void
aw_application_shutdown (GApplication *app)
{
  AwApplication *self = AW_APPLICATION (app);

  if (self->portal_signal_id != 0 && self->session_bus != NULL)
    g_dbus_connection_signal_unsubscribe (self->session_bus, self->portal_signal_id);
  self->portal_signal_id = 0;
  G_APPLICATION_CLASS (aw_application_parent_class)->shutdown (app);
}

static void
aw_application_finalize (GObject *object)
{
  AwApplication *self = AW_APPLICATION (object);

  g_clear_object (&self->settings);
  g_clear_object (&self->recent_menu);
  g_clear_object (&self->dark_css);
  g_clear_object (&self->session_bus);
  G_OBJECT_CLASS (aw_application_parent_class)->finalize (object);
}

static void
aw_application_class_init (AwApplicationClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GApplicationClass *app_class = G_APPLICATION_CLASS (klass);

  object_class->finalize = aw_application_finalize;
  app_class->startup = aw_application_startup;
  app_class->activate = aw_application_activate;
  app_class->open = aw_application_open;
  app_class->shutdown = aw_application_shutdown;
}

static void
aw_application_init (AwApplication *self)
{
}

AwApplication *
aw_application_new (void)
{
  return g_object_new (AW_TYPE_APPLICATION,
                       "application-id", AW_APP_ID,
                       "flags", G_APPLICATION_HANDLES_OPEN,
                       "resource-base-path", "/io/github/arcwright/Arcwright",
                       NULL);
}

GSettings *
aw_application_get_settings (AwApplication *self)
{
  g_return_val_if_fail (AW_IS_APPLICATION (self), NULL);
  return self->settings;
}
