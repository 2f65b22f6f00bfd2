/* fuzz-project.c: libFuzzer target for the project loader
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Every input is loaded leniently. When it loads, the project must validate, write, and read
 * back equal to itself (with its kept invalid entries), and its copy must be equal too; any
 * difference aborts, so the fuzzer reports it like a crash. The same function replays the
 * regression corpus in a normal build (replay-project.c).
 */
#include <glib.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

#include "aw-project-io.h"

int LLVMFuzzerTestOneInput (const uint8_t *data, size_t size);

int
LLVMFuzzerTestOneInput (const uint8_t *data, size_t size)
{
  GPtrArray *problems = g_ptr_array_new_with_free_func (g_free);
  GError *error = NULL;
  AwProject *p = aw_project_load_data ((const char *) data, (gssize) size,
                                       AW_PROJECT_LOAD_LENIENT, problems, &error);
  if (p == NULL)
    {
      /* a refused file always says why */
      if (error == NULL || problems->len == 0)
        abort ();
      g_error_free (error);
    }
  else
    {
      if (error != NULL)
        abort ();
      /* strict and lenient agree: strict accepts exactly the files without problems */
      GError *strict_error = NULL;
      AwProject *strict = aw_project_load_data ((const char *) data, (gssize) size,
                                                AW_PROJECT_LOAD_STRICT, NULL, &strict_error);
      if ((strict != NULL) != (problems->len == 0))
        abort ();
      if (strict != NULL && !aw_project_equal (strict, p))
        abort ();
      aw_project_free (strict);
      g_clear_error (&strict_error);

      if (!aw_project_validate (p, NULL))
        abort ();
      gsize len = 0;
      char *text = aw_project_to_data (p, &len);
      AwProject *q = aw_project_load_data (text, (gssize) len, AW_PROJECT_LOAD_LENIENT, NULL,
                                           NULL);
      if (q == NULL || !aw_project_equal (p, q))
        abort ();
      /* writing is a fixed point */
      gsize len2 = 0;
      char *text2 = aw_project_to_data (q, &len2);
      if (len2 != len || memcmp (text, text2, len) != 0)
        abort ();
      AwProject *c = aw_project_copy (q);
      if (!aw_project_equal (c, p))
        abort ();
      aw_project_free (c);
      g_free (text2);
      aw_project_free (q);
      g_free (text);
      aw_project_free (p);
    }
  g_ptr_array_unref (problems);
  return 0;
}
