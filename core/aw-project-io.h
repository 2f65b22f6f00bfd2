/* aw-project-io.h: reading, validating and writing project files (.arcw, JSON)
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The format is described in data/FORMAT.md. Problems are technical lines of the form
 * "JSON.path: problem (found VALUE)", e.g. "setups[2].bb.mass_g: must be between 0.05 and 2 g
 * (found -0.3)"; syntax errors read "line L, column C: syntax error: …". Core builds no
 * sentences for people beyond these lines.
 */
#pragma once

#include <glib.h>
#include <json-glib/json-glib.h>

#include "aw-core-error.h"
#include "aw-project.h"

G_BEGIN_DECLS

/* Deepest nesting of arrays/objects accepted (checked before parsing). */
#define AW_PROJECT_MAX_DEPTH 64

typedef enum
{
  AW_PROJECT_LOAD_STRICT = 0,
  /* Bad entries of "setups" and "site_rules" are kept as AwRejectedEntry (raw JSON, written
   * back unchanged on save) and the rest of the project loads. Problems elsewhere still fail. */
  AW_PROJECT_LOAD_LENIENT = 1 << 0,
} AwProjectLoadFlags;

/* Parses and validates. Every problem found is appended to `problems` (GPtrArray of char*,
 * may be NULL), in file order.
 *
 * Returns the project, or NULL with `error` set (AW_CORE_ERROR_SYNTAX, _VERSION, _INVALID, _IO;
 * the message is the first problem, followed by " (and N more problems)" when there are more).
 * With AW_PROJECT_LOAD_LENIENT, a project is returned when the only problems are inside entries
 * of "setups" or "site_rules"; those problems are still in `problems` and the entries are in
 * project->rejected. */
AwProject *aw_project_load_data (const char *data, gssize length, AwProjectLoadFlags flags,
                                 GPtrArray *problems, GError **error);
AwProject *aw_project_load_file (const char *path, AwProjectLoadFlags flags,
                                 GPtrArray *problems, GError **error);

/* The JSON tree of a project (unknown members and rejected entries included). */
JsonNode *aw_project_to_json (const AwProject *project);

/* The file text: pretty-printed JSON, 2-space indent, numbers in the shortest form that reads
 * back to the same double, locale-independent, ending in a newline. */
char *aw_project_to_data (const AwProject *project, gsize *length);

/* Validates an in-memory project with the same rules as the loader (paths as in the file).
 * Returns TRUE when there is no problem. */
gboolean aw_project_validate (const AwProject *project, GPtrArray *problems);

/* Saves atomically: writes "PATH.tmp-XXXXXX" in the same directory, flushes it to disk, reads it
 * back and compares with `project`, keeps the previous file as "PATH~" (backup), then renames the
 * temporary file over PATH. On any failure the previous PATH is left untouched and the temporary
 * file is removed. A project that fails aw_project_validate is refused (AW_CORE_ERROR_INVALID). */
gboolean aw_project_save (const AwProject *project, const char *path, GError **error);

/* Checks the kept invalid entries (project->rejected) again against the project as it is now
 * and moves each one that has become valid (for example after the setup whose name it
 * duplicated was deleted, or after its JSON was edited) into project->setups or
 * project->site_rules, at its old position when possible. Existing setups are not moved or
 * freed. The problems of the entries still invalid are appended to `problems` (may be NULL).
 * Returns the number of entries still kept as invalid. aw_project_save refuses a project whose
 * kept entries would read back differently; calling this first resolves that. */
guint aw_project_recheck_rejected (AwProject *project, GPtrArray *problems);

/* "PATH~": the backup name used by aw_project_save. */
char *aw_project_backup_path (const char *path);

/* Joins problems into one string, one per line (for logs and tests). */
char *aw_project_problems_join (GPtrArray *problems);

G_END_DECLS
