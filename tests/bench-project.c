/* bench-project.c: how long project files take to load and save
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Prints figures only (no pass/fail): the load time of a project with 10 000 setups and of a
 * file of about 50 MB, each generated into a temporary directory, best of three runs.
 */
#include "aw-config.h"

#include <stdio.h>

#include <glib.h>
#include <glib/gstdio.h>

#include "aw-project-io.h"

static AwProject *
many_setups (guint n, guint notes_bytes, guint shots)
{
  AwProject *p = aw_project_new ();
  char *notes = g_strnfill (notes_bytes, 'n');
  for (guint i = 0; i < n; i++)
    {
      char *name = g_strdup_printf ("setup %u", i);
      AwSetup *s = aw_setup_new (name);
      g_free (name);
      g_free (s->notes);
      s->notes = g_strdup (notes);
      s->bb.mass_g = 0.20 + 0.01 * (i % 25);
      AwChronoString *c = aw_chrono_string_new ();
      for (guint k = 0; k < shots; k++)
        aw_chrono_string_add (c, 95.0 + 0.1 * (double) ((i + k) % 37));
      g_ptr_array_add (s->chrono, c);
      g_ptr_array_add (s->observations, aw_observation_new ());
      g_ptr_array_add (p->setups, s);
    }
  g_free (notes);
  return p;
}

static void
measure (const char *label, AwProject *p, const char *dir)
{
  char *file = g_build_filename (dir, "bench.arcw", NULL);
  GError *error = NULL;
  double best_save = G_MAXDOUBLE, best_load = G_MAXDOUBLE;
  for (int run = 0; run < 3; run++)
    {
      gint64 t0 = g_get_monotonic_time ();
      if (!aw_project_save (p, file, &error))
        g_error ("save: %s", error->message);
      gint64 t1 = g_get_monotonic_time ();
      AwProject *q = aw_project_load_file (file, AW_PROJECT_LOAD_STRICT, NULL, &error);
      gint64 t2 = g_get_monotonic_time ();
      if (q == NULL)
        g_error ("load: %s", error->message);
      if (q->setups->len != p->setups->len)
        g_error ("load: %u setups instead of %u", q->setups->len, p->setups->len);
      aw_project_free (q);
      best_save = MIN (best_save, (t1 - t0) / 1e6);
      best_load = MIN (best_load, (t2 - t1) / 1e6);
    }
  GStatBuf st;
  g_stat (file, &st);
  printf ("%-28s %6u setups %8.1f MB   load %7.3f s (%6.1f MB/s)   save %7.3f s\n", label,
          p->setups->len, st.st_size / 1e6, best_load, st.st_size / 1e6 / best_load, best_save);
  char *backup = aw_project_backup_path (file);
  g_unlink (backup);
  g_unlink (file);
  g_free (backup);
  g_free (file);
}

int
main (void)
{
  GError *error = NULL;
  char *dir = g_dir_make_tmp ("aw-bench-project-XXXXXX", &error);
  if (dir == NULL)
    g_error ("%s", error->message);

  printf ("project files: best of 3 runs (save = validate, write, flush, read back, compare, "
          "backup, rename)\n");
  AwProject *p = many_setups (10000, 16, 10);
  measure ("10 000 setups", p, dir);
  aw_project_free (p);

  p = many_setups (5000, 9000, 100);
  measure ("about 50 MB", p, dir);
  aw_project_free (p);

  g_rmdir (dir);
  g_free (dir);
  return 0;
}
