/* aw-cli-check.c: "arcwright-cli check FILE", and loading a stored setup for other commands
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <stdio.h>
#include <string.h>

#include "aw-cli.h"
#include "aw-project-io.h"

static void
print_help (void)
{
  printf ("Usage: arcwright-cli check FILE\n\n"
          "Reads a project file (.arcw) and lists every problem found in it, one per line, as\n"
          "JSON.path: problem. Prints a one-line summary when the file is clean.\n\n"
          "Exit status: 0 clean, 2 problems found (or the file cannot be read).\n");
}

static void
print_summary (const char *file, const AwProject *p)
{
  guint classes = 0, strings = 0, shots = 0, observations = 0;
  for (guint i = 0; i < p->site_rules->len; i++)
    classes += ((AwSiteRules *) p->site_rules->pdata[i])->classes->len;
  for (guint i = 0; i < p->setups->len; i++)
    {
      const AwSetup *s = p->setups->pdata[i];
      strings += s->chrono->len;
      observations += s->observations->len;
      for (guint j = 0; j < s->chrono->len; j++)
        shots += ((AwChronoString *) s->chrono->pdata[j])->velocities->len;
    }
  printf ("%s: project \"%s\": %u setup%s, %u site rules profile%s (%u class%s), "
          "%u chrono string%s (%u shots), %u field observation%s: no problems\n",
          file, p->name, p->setups->len, p->setups->len == 1 ? "" : "s",
          p->site_rules->len, p->site_rules->len == 1 ? "" : "s",
          classes, classes == 1 ? "" : "es", strings, strings == 1 ? "" : "s", shots,
          observations, observations == 1 ? "" : "s");
}

int
aw_cli_check (int argc, char **argv)
{
  bool help = false;
  g_autoptr (GPtrArray) files = g_ptr_array_new ();
  AwCliArg args[] = {
    { "help", AW_CLI_ARG_FLAG, &help, 0, 0, NULL },
    { NULL },
  };
  if (!aw_cli_parse (argc, argv, 2, args, files, "check"))
    return AW_CLI_EXIT_USAGE;
  if (help)
    {
      print_help ();
      return AW_CLI_EXIT_OK;
    }
  if (files->len != 1)
    {
      aw_cli_error ("check", "expected one project file (found %u arguments)", files->len);
      return AW_CLI_EXIT_USAGE;
    }
  const char *file = files->pdata[0];

  g_autoptr (GPtrArray) problems = g_ptr_array_new_with_free_func (g_free);
  g_autoptr (GError) error = NULL;
  AwProject *p = aw_project_load_file (file, AW_PROJECT_LOAD_STRICT, problems, &error);
  if (p != NULL && problems->len == 0)
    {
      print_summary (file, p);
      aw_project_free (p);
      return AW_CLI_EXIT_OK;
    }
  aw_project_free (p);
  if (error != NULL && error->code == AW_CORE_ERROR_IO)
    {
      aw_cli_error ("check", "%s: %s", file, error->message);
      return AW_CLI_EXIT_USAGE;
    }
  for (guint i = 0; i < problems->len; i++)
    printf ("%s\n", (const char *) problems->pdata[i]);
  aw_cli_error ("check", "%s: %u problem%s", file, problems->len, problems->len == 1 ? "" : "s");
  return AW_CLI_EXIT_USAGE;
}

/* Problems whose path lies inside setups[index]. */
static void
print_entry_problems (GPtrArray *problems, const char *list, guint index, const char *command)
{
  char *prefix = g_strdup_printf ("%s[%u]", list, index);
  gsize n = strlen (prefix);
  for (guint i = 0; i < problems->len; i++)
    {
      const char *line = problems->pdata[i];
      if (strncmp (line, prefix, n) == 0 && (line[n] == '.' || line[n] == ':'))
        aw_cli_error (command, "  %s", line);
    }
  g_free (prefix);
}

bool
aw_cli_load_setup (const char *file, const char *setup_name, const char *command,
                   AwProject **project, AwSetup **setup)
{
  g_return_val_if_fail (file != NULL && setup_name != NULL && project != NULL && setup != NULL,
                        false);
  *project = NULL;
  *setup = NULL;

  g_autoptr (GPtrArray) problems = g_ptr_array_new_with_free_func (g_free);
  g_autoptr (GError) error = NULL;
  AwProject *p = aw_project_load_file (file, AW_PROJECT_LOAD_LENIENT, problems, &error);
  if (p == NULL)
    {
      if (error != NULL && error->code == AW_CORE_ERROR_IO)
        aw_cli_error (command, "%s: %s", file, error->message);
      else
        {
          aw_cli_error (command, "%s is not a valid project file (%u problem%s; "
                        "run \"arcwright-cli check %s\" for the full list):", file,
                        problems->len, problems->len == 1 ? "" : "s", file);
          for (guint i = 0; i < problems->len && i < 10; i++)
            aw_cli_error (command, "  %s", (const char *) problems->pdata[i]);
        }
      return false;
    }

  AwSetup *s = aw_project_find_setup (p, setup_name);
  if (s == NULL)
    {
      for (guint i = 0; i < p->rejected->len; i++)
        {
          const AwRejectedEntry *e = p->rejected->pdata[i];
          if (g_strcmp0 (e->list, "setups") == 0 && g_strcmp0 (e->name, setup_name) == 0)
            {
              aw_cli_error (command, "%s: setup \"%s\" (setups[%u]) is invalid:", file,
                            setup_name, e->index);
              print_entry_problems (problems, "setups", e->index, command);
              aw_project_free (p);
              return false;
            }
        }
      GString *names = g_string_new (NULL);
      for (guint i = 0; i < p->setups->len && i < 20; i++)
        g_string_append_printf (names, "%s\"%s\"", i ? ", " : "",
                                ((AwSetup *) p->setups->pdata[i])->name);
      if (p->setups->len > 20)
        g_string_append (names, ", …");
      if (p->setups->len == 0)
        aw_cli_error (command, "%s: no setup named \"%s\" (the project has no setups)", file,
                      setup_name);
      else
        aw_cli_error (command, "%s: no setup named \"%s\"; the project has %s", file, setup_name,
                      names->str);
      g_string_free (names, TRUE);
      aw_project_free (p);
      return false;
    }

  *project = p;
  *setup = s;
  return true;
}
