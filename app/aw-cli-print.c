/* aw-cli-print.c: "arcwright-cli card|sheet|loadout", printed outputs as PDF
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <glib/gi18n.h>
#include <locale.h>
#include <stdio.h>
#include <string.h>

#include "aw-cli.h"
#include "aw-print.h"
#include "aw-project-io.h"

static void
print_help (const char *command)
{
  const char *what = g_str_equal (command, "card")
                     ? "Writes range cards (one per setup) as a PDF."
                     : g_str_equal (command, "sheet")
                     ? "Writes customer setup sheets (one per setup) as a PDF."
                     : "Writes a loadout sheet (all the setups given, one row each) as a PDF.";
  printf ("Usage: arcwright-cli %s FILE --setup NAME [--setup NAME ...] -o OUT.pdf [OPTIONS]\n\n"
          "%s\n\n"
          "  FILE | --project FILE the project (.arcw)\n"
          "  --setup NAME          a setup of the project (repeat for several; loadout: all\n"
          "                        setups when none is given; card and sheet: the only setup\n"
          "                        when the project has one)\n"
          "  -o, --output PATH     the PDF to write (replaced only when complete)\n"
          "  --paper a4|letter|a6  paper (card: a6; sheet and loadout: a4)\n"
          "  --sheet-of-cards      card: four cards to an A4 page (or the --paper given)\n"
          "  --units metric|imperial\n"
          "  --site NAME           site rules of the project (may be left out when the class\n"
          "                        name is found in only one of them)\n"
          "  --class NAME          site class to check energy and minimum distance against\n"
          "  --date YYYY-MM-DD     date printed on the pages (default today)\n",
          command, what);
}

static gboolean
parse_paper (const char *s, AwPaper *paper)
{
  if (g_ascii_strcasecmp (s, "a4") == 0)
    *paper = AW_PAPER_A4;
  else if (g_ascii_strcasecmp (s, "letter") == 0)
    *paper = AW_PAPER_LETTER;
  else if (g_ascii_strcasecmp (s, "a6") == 0)
    *paper = AW_PAPER_A6;
  else
    return FALSE;
  return TRUE;
}

int
aw_cli_print (int argc, char **argv)
{
  const char *command = argv[1];
  AwPrintKind kind;
  g_autoptr (GPtrArray) setups = g_ptr_array_new ();
  g_autoptr (GPtrArray) positionals = g_ptr_array_new ();
  g_autoptr (GPtrArray) problems = g_ptr_array_new_with_free_func (g_free);
  g_autoptr (GError) error = NULL;
  g_autoptr (AwProject) project = NULL;
  g_autoptr (AwPrintJob) job = NULL;
  g_autofree char **args_v = NULL;
  static const char *const units_words[] = { "metric", "imperial", NULL };
  int units = AW_PRINT_UNITS_METRIC;
  bool seen_units = false;
  const char *output = NULL, *paper_s = NULL, *site = NULL, *klass = NULL;
  const char *date_s = NULL, *project_s = NULL;
  bool sheet_of_cards = false, help = false;
  AwPaper paper;
  int n;

  if (g_str_equal (command, "card"))
    kind = AW_PRINT_KIND_CARD;
  else if (g_str_equal (command, "sheet"))
    kind = AW_PRINT_KIND_SHEET;
  else
    kind = AW_PRINT_KIND_LOADOUT;

  /* translated page text, numbers in the locale; AW_LOCALEDIR overrides where translations are
   * looked for (as for the desktop program; the tests point it at the build tree) */
  bindtextdomain (GETTEXT_PACKAGE, g_getenv ("AW_LOCALEDIR") && *g_getenv ("AW_LOCALEDIR")
                                   ? g_getenv ("AW_LOCALEDIR") : AW_LOCALEDIR);
  bind_textdomain_codeset (GETTEXT_PACKAGE, "UTF-8");
  textdomain (GETTEXT_PACKAGE);

  /* "-o" is the one short option: the common parser knows long options only */
  args_v = g_new0 (char *, argc + 1);
  for (int i = 0; i < argc; i++)
    args_v[i] = g_str_equal (argv[i], "-o") ? (char *) "--output" : argv[i];

  {
    const AwCliArg args[] = {
      { "setup", AW_CLI_ARG_STRINGS, setups, 0, 0, NULL },
      { "project", AW_CLI_ARG_STRING, &project_s, 0, 0, NULL },
      { "output", AW_CLI_ARG_STRING, &output, 0, 0, NULL },
      { "paper", AW_CLI_ARG_STRING, &paper_s, 0, 0, NULL },
      { "sheet-of-cards", AW_CLI_ARG_FLAG, &sheet_of_cards, 0, 0, NULL },
      { "units", AW_CLI_ARG_CHOICE, &units, 0, 0, &seen_units, units_words },
      { "site", AW_CLI_ARG_STRING, &site, 0, 0, NULL },
      { "class", AW_CLI_ARG_STRING, &klass, 0, 0, NULL },
      { "date", AW_CLI_ARG_STRING, &date_s, 0, 0, NULL },
      { "help", AW_CLI_ARG_FLAG, &help, 0, 0, NULL },
      { NULL }
    };
    if (!aw_cli_parse (argc, args_v, 2, args, positionals, command))
      return AW_CLI_EXIT_USAGE;
  }
  if (help)
    {
      print_help (command);
      return AW_CLI_EXIT_OK;
    }
  if (project_s)
    g_ptr_array_insert (positionals, 0, (gpointer) project_s);
  if (positionals->len != 1)
    {
      aw_cli_error (command, positionals->len == 0 ? "FILE: give the project file to print from"
                                                   : "FILE: give only one project file");
      return AW_CLI_EXIT_USAGE;
    }
  if (output == NULL)
    {
      aw_cli_error (command, "--output: give the PDF file to write (-o OUT.pdf)");
      return AW_CLI_EXIT_USAGE;
    }
  if (sheet_of_cards && kind != AW_PRINT_KIND_CARD)
    {
      aw_cli_error (command, "--sheet-of-cards: only for range cards (the card command)");
      return AW_CLI_EXIT_USAGE;
    }
  if (site && !klass)
    {
      aw_cli_error (command, "--site: give the class as well (--class NAME)");
      return AW_CLI_EXIT_USAGE;
    }

  /* lenient: a broken setup that is not printed does not stop the others */
  project = aw_project_load_file (g_ptr_array_index (positionals, 0), AW_PROJECT_LOAD_LENIENT,
                                  problems, &error);
  if (project == NULL)
    {
      aw_cli_error (command, "%s: %s", (char *) g_ptr_array_index (positionals, 0),
                    error->message);
      return error->domain == G_FILE_ERROR || error->code == AW_CORE_ERROR_IO
             ? AW_CLI_EXIT_FAILED : AW_CLI_EXIT_USAGE;
    }

  job = aw_print_job_new (kind, project);
  if (paper_s)
    {
      if (!parse_paper (paper_s, &paper))
        {
          aw_cli_error (command, "--paper: expected a4, letter or a6 (found \"%s\")", paper_s);
          return AW_CLI_EXIT_USAGE;
        }
      if (kind != AW_PRINT_KIND_CARD && paper == AW_PAPER_A6)
        {
          aw_cli_error (command, "--paper: a6 is for range cards; use a4 or letter");
          return AW_CLI_EXIT_USAGE;
        }
      if (sheet_of_cards && paper == AW_PAPER_A6)
        {
          aw_cli_error (command, "--sheet-of-cards: needs --paper a4 or letter (found a6)");
          return AW_CLI_EXIT_USAGE;
        }
      aw_print_job_set_paper (job, paper);
    }
  else if (sheet_of_cards)
    aw_print_job_set_paper (job, AW_PAPER_A4);
  if (seen_units)
    aw_print_job_set_units (job, (AwPrintUnits) units);   /* units_words follow AwPrintUnits */
  if (date_s)
    {
      int y, m, d;
      char extra;
      g_autoptr (GTimeZone) tz = g_time_zone_new_local ();
      g_autoptr (GDateTime) dt = NULL;
      if (sscanf (date_s, "%4d-%2d-%2d%c", &y, &m, &d, &extra) == 3)
        dt = g_date_time_new (tz, y, m, d, 12, 0, 0);
      if (dt == NULL)
        {
          aw_cli_error (command, "--date: expected a date as YYYY-MM-DD (found \"%s\")", date_s);
          return AW_CLI_EXIT_USAGE;
        }
      aw_print_job_set_date (job, dt);
    }

  if (setups->len == 0)
    {
      if (kind == AW_PRINT_KIND_LOADOUT || project->setups->len == 1)
        for (guint i = 0; i < project->setups->len; i++)
          g_ptr_array_add (setups, ((AwSetup *) g_ptr_array_index (project->setups, i))->name);
      else
        {
          aw_cli_error (command, "--setup: the project has %u setups: name the one(s) to print",
                        project->setups->len);
          return AW_CLI_EXIT_USAGE;
        }
    }
  for (guint i = 0; i < setups->len; i++)
    if (!aw_print_job_add_setup (job, g_ptr_array_index (setups, i), &error))
      {
        const char *name = g_ptr_array_index (setups, i);
        gboolean rejected = FALSE;
        for (guint k = 0; k < project->rejected->len; k++)
          {
            const AwRejectedEntry *r = g_ptr_array_index (project->rejected, k);
            if (r->name && g_str_equal (r->name, name) && g_str_equal (r->list, "setups"))
              rejected = TRUE;
          }
        if (rejected)
          {
            g_autofree char *all = aw_project_problems_join (problems);
            aw_cli_error (command, "--setup: \"%s\" is not valid in %s:\n%s", name,
                          (char *) g_ptr_array_index (positionals, 0), all);
          }
        else
          aw_cli_error (command, "--setup: %s", error->message);
        return AW_CLI_EXIT_USAGE;
      }
  if (klass && !aw_print_job_set_site (job, site, klass, &error))
    {
      aw_cli_error (command, "%s: %s", site ? "--site/--class" : "--class", error->message);
      return AW_CLI_EXIT_USAGE;
    }

  if (!aw_print_job_prepare (job, &error))
    {
      aw_cli_error (command, "%s", error->message);
      return error->code == AW_PRINT_ERROR_ANALYSIS ? AW_CLI_EXIT_FAILED : AW_CLI_EXIT_USAGE;
    }
  n = aw_print_n_pages (job);
  if (!aw_print_to_pdf (job, output, &error))
    {
      aw_cli_error (command, "%s", error->message);
      return AW_CLI_EXIT_FAILED;
    }
  fprintf (stderr, "arcwright-cli %s: wrote %s (%d %s)\n", command, output, n,
           n == 1 ? "page" : "pages");
  return AW_CLI_EXIT_OK;
}
