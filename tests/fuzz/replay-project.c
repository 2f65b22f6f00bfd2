/* replay-project.c: runs the fuzz target over the regression corpus in a normal build
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Usage: replay-project DIR|FILE…  Every file is passed to LLVMFuzzerTestOneInput, which aborts
 * on a broken invariant; the sanitizers are not needed for that. Prints TAP.
 */
#include <glib.h>
#include <stdint.h>
#include <stdio.h>

int LLVMFuzzerTestOneInput (const uint8_t *data, size_t size);

static int n_run;

static void
replay_file (const char *path)
{
  char *data = NULL;
  gsize len = 0;
  GError *error = NULL;
  if (!g_file_get_contents (path, &data, &len, &error))
    {
      printf ("not ok %d %s: %s\n", ++n_run, path, error->message);
      g_error_free (error);
      return;
    }
  LLVMFuzzerTestOneInput ((const uint8_t *) data, len);
  printf ("ok %d %s\n", ++n_run, path);
  g_free (data);
}

int
main (int argc, char **argv)
{
  for (int i = 1; i < argc; i++)
    {
      if (g_file_test (argv[i], G_FILE_TEST_IS_DIR))
        {
          GDir *dir = g_dir_open (argv[i], 0, NULL);
          const char *name;
          GPtrArray *names = g_ptr_array_new_with_free_func (g_free);
          while (dir != NULL && (name = g_dir_read_name (dir)) != NULL)
            g_ptr_array_add (names, g_build_filename (argv[i], name, NULL));
          if (dir != NULL)
            g_dir_close (dir);
          g_ptr_array_sort (names, (GCompareFunc) g_strcmp0);
          for (guint k = 0; k < names->len; k++)
            replay_file (names->pdata[k]);
          g_ptr_array_unref (names);
        }
      else
        replay_file (argv[i]);
    }
  if (n_run == 0)
    {
      printf ("Bail out! no corpus files found\n");
      return 1;
    }
  printf ("1..%d\n", n_run);
  return 0;
}
