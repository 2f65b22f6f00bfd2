/* aw-project-private.h: internals shared by the project model, its file code and their tests
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#pragma once

#include <glib.h>
#include <json-glib/json-glib.h>
#include <stdbool.h>

#include "aw-project.h"

G_BEGIN_DECLS

JsonNode *aw_json_node_deep_copy (JsonNode *node);
JsonObject *aw_json_object_copy_or_null (JsonObject *o);
bool aw_json_node_equal (JsonNode *a, JsonNode *b);
bool aw_json_object_equal (JsonObject *a, JsonObject *b);

AwRejectedEntry *aw_rejected_entry_new (const char *list, guint index, const char *name,
                                        JsonNode *raw);
void aw_rejected_entry_free (AwRejectedEntry *e);

/* Stages of aw_project_save, in order. */
typedef enum
{
  AW_SAVE_STAGE_OPEN_TEMP = 0,  /* creating the temporary file */
  AW_SAVE_STAGE_WRITE,          /* writing its contents (the hook may ask for a short write) */
  AW_SAVE_STAGE_SYNC,           /* flushing it to disk */
  AW_SAVE_STAGE_VERIFY,         /* reading it back and comparing */
  AW_SAVE_STAGE_BACKUP,         /* keeping the previous file as PATH~ */
  AW_SAVE_STAGE_RENAME,         /* renaming the temporary file over PATH */
} AwSaveStage;

/* Test hook: called before each stage. Returning FALSE makes that stage fail as if the system
 * had refused it. At AW_SAVE_STAGE_WRITE, *write_limit (initially the full length) may be
 * lowered: the contents are cut there and the stage then fails like a full disk. */
typedef gboolean (*AwSaveHook) (AwSaveStage stage, gsize *write_limit, gpointer user_data);

/* Installs (or with NULL removes) the hook; process-wide, for tests only. */
void aw_project_set_save_hook (AwSaveHook hook, gpointer user_data);

G_END_DECLS
