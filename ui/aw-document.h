/* aw-document.h: an open project — its file, its edits and their undo history
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Every edit replaces the project with a new one and records a command holding copies of the
 * project before and after, so undo and redo restore exact states. Consecutive edits with the
 * same merge key (typing in one field) within a short time become one command.
 */
#pragma once

#include <gio/gio.h>

#include "aw-project.h"

G_BEGIN_DECLS

typedef enum
{
  AW_CHANGE_SETUP = 1 << 0,      /* values of one setup (index given) */
  AW_CHANGE_STRUCTURE = 1 << 1,  /* setups added, removed or moved */
  AW_CHANGE_PROJECT = 1 << 2,    /* project-wide values (conditions, site rules, name) */
  AW_CHANGE_ALL = AW_CHANGE_SETUP | AW_CHANGE_STRUCTURE | AW_CHANGE_PROJECT,
} AwChange;

#define AW_TYPE_DOCUMENT (aw_document_get_type ())
G_DECLARE_FINAL_TYPE (AwDocument, aw_document, AW, DOCUMENT, GObject)

/* An empty project with one default setup. */
AwDocument *aw_document_new (void);
/* Takes ownership of project; file may be NULL (an unsaved project). */
AwDocument *aw_document_new_for_project (AwProject *project, GFile *file);

const AwProject *aw_document_get_project (AwDocument *self);
GFile *aw_document_get_file (AwDocument *self);
void aw_document_set_file (AwDocument *self, GFile *file);
/* File name for titles: the basename, or a translated "Unsaved Project". */
char *aw_document_dup_display_name (AwDocument *self);

/* Property "modified": differs from the last save (or load). */
gboolean aw_document_get_modified (AwDocument *self);
/* Marks the current state as saved (after a successful save). */
void aw_document_mark_saved (AwDocument *self);
/* Marks it as modified with no saved state in the history (a recovered copy). */
void aw_document_mark_unsaved (AwDocument *self);

/* Records an edit: project becomes the document's project (ownership taken). label is the
 * translated action name ("Change BB mass"); merge_key NULL never merges. selection is the
 * setup index to select after the edit (and after redo); the one before is remembered for undo.
 * Emits "changed". Returns FALSE and frees project when nothing changed. */
gboolean aw_document_push (AwDocument *self, AwProject *project, const char *label,
                           const char *merge_key, int selection_before, int selection_after);

/* Ends merging: the next edit starts a new command even with the same key. */
void aw_document_seal (AwDocument *self);

gboolean aw_document_can_undo (AwDocument *self);
gboolean aw_document_can_redo (AwDocument *self);
const char *aw_document_get_undo_label (AwDocument *self);
const char *aw_document_get_redo_label (AwDocument *self);
/* Return the selection to restore, or −1. */
int aw_document_undo (AwDocument *self);
int aw_document_redo (AwDocument *self);

/* Change between two projects, for "changed": *index is the setup for AW_CHANGE_SETUP. */
AwChange aw_project_diff (const AwProject *a, const AwProject *b, int *index);

G_END_DECLS
