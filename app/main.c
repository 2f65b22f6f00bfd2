/* main.c: arcwright, the desktop program
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <glib/gi18n.h>
#include <locale.h>
#include <stdio.h>

#include "aw-application.h"

/* Run from the build tree, the program uses the schema, and the translations compiled there.
 * AW_LOCALEDIR overrides where translations are looked for (tests use it). */
static const char *
find_locale_dir (gboolean *from_build_tree)
{
  g_autofree char *exe = g_file_read_link ("/proc/self/exe", NULL);
  const char *env = g_getenv ("AW_LOCALEDIR");

  *from_build_tree = exe != NULL && g_str_has_prefix (exe, AW_BUILD_ROOT G_DIR_SEPARATOR_S);
  if (env != NULL && env[0] != '\0')
    return env;
  return *from_build_tree ? AW_BUILD_ROOT G_DIR_SEPARATOR_S "po" : AW_LOCALEDIR;
}

int
main (int   argc,
      char *argv[])
{
  g_autoptr (AwApplication) app = NULL;
  g_autoptr (GSettingsSchema) schema = NULL;
  gboolean from_build_tree = FALSE;
  const char *localedir = find_locale_dir (&from_build_tree);
  GSettingsSchemaSource *source;

  if (from_build_tree && g_getenv ("GSETTINGS_SCHEMA_DIR") == NULL)
    g_setenv ("GSETTINGS_SCHEMA_DIR", AW_BUILD_ROOT G_DIR_SEPARATOR_S "data", TRUE);

  setlocale (LC_ALL, "");
  {
    /* gettext ignores LANGUAGE in the plain C locale: use its UTF-8 twin so that
     * LANGUAGE=de works on a machine without a configured locale */
    const char *messages = setlocale (LC_MESSAGES, NULL);
    const char *language = g_getenv ("LANGUAGE");
    if (language != NULL && language[0] != '\0' && messages != NULL
        && (g_str_equal (messages, "C") || g_str_equal (messages, "POSIX")))
      setlocale (LC_MESSAGES, "C.UTF-8");
  }
  bindtextdomain (GETTEXT_PACKAGE, localedir);
  bind_textdomain_codeset (GETTEXT_PACKAGE, "UTF-8");
  textdomain (GETTEXT_PACKAGE);

  source = g_settings_schema_source_get_default ();
  schema = source ? g_settings_schema_source_lookup (source, AW_APP_ID, TRUE) : NULL;
  if (schema == NULL)
    {
      fprintf (stderr, "%s\n",
               _ ("arcwright: the settings schema io.github.arcwright.Arcwright is not installed. "
                 "Install the program (meson install), or run it from its build directory."));
      return 1;
    }

  g_set_application_name ("Arcwright");
  app = aw_application_new ();
  return g_application_run (G_APPLICATION (app), argc, argv);
}
