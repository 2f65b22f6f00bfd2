/* aw-document.c: an open project — its file, its edits and their undo history
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <glib/gi18n.h>

#include "aw-document.h"

/* Typing in one field within this time joins one undo step. */
#define MERGE_WINDOW_US (2 * G_USEC_PER_SEC)

typedef struct
{
  AwProject *before;
  AwProject *after;
  char *label;
  char *merge_key;
  int selection_before;
  int selection_after;
  gint64 time_us;
} AwCommand;

struct _AwDocument
{
  GObject parent_instance;

  AwProject *project;
  GFile *file;
  GPtrArray *commands;   /* of AwCommand*; [0, pos) applied */
  guint pos;
  int saved_pos;         /* −1: the saved state is not in the history */
  gboolean sealed;
};

G_DEFINE_FINAL_TYPE (AwDocument, aw_document, G_TYPE_OBJECT)

enum { PROP_0, PROP_FILE, PROP_MODIFIED, N_PROPS };
static GParamSpec *properties[N_PROPS];

enum { CHANGED, N_SIGNALS };
static guint signals[N_SIGNALS];

static void
command_free (gpointer data)
{
  AwCommand *cmd = data;

  g_clear_pointer (&cmd->before, aw_project_free);
  g_clear_pointer (&cmd->after, aw_project_free);
  g_free (cmd->label);
  g_free (cmd->merge_key);
  g_free (cmd);
}

static void
aw_document_finalize (GObject *object)
{
  AwDocument *self = AW_DOCUMENT (object);

  g_clear_pointer (&self->project, aw_project_free);
  g_clear_object (&self->file);
  g_clear_pointer (&self->commands, g_ptr_array_unref);

  G_OBJECT_CLASS (aw_document_parent_class)->finalize (object);
}

static void
aw_document_get_property (GObject    *object,
                          guint       prop_id,
                          GValue     *value,
                          GParamSpec *pspec)
{
  AwDocument *self = AW_DOCUMENT (object);

  switch (prop_id)
    {
    case PROP_FILE:
      g_value_set_object (value, self->file);
      break;
    case PROP_MODIFIED:
      g_value_set_boolean (value, aw_document_get_modified (self));
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
    }
}

static void
aw_document_class_init (AwDocumentClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);

  object_class->finalize = aw_document_finalize;
  object_class->get_property = aw_document_get_property;

  properties[PROP_FILE] =
    g_param_spec_object ("file", NULL, NULL, G_TYPE_FILE,
                         G_PARAM_READABLE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  properties[PROP_MODIFIED] =
    g_param_spec_boolean ("modified", NULL, NULL, FALSE,
                          G_PARAM_READABLE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  g_object_class_install_properties (object_class, N_PROPS, properties);

  /* changed (AwChange flags, int setup index or −1) */
  signals[CHANGED] = g_signal_new ("changed", G_TYPE_FROM_CLASS (klass), G_SIGNAL_RUN_LAST, 0,
                                   NULL, NULL, NULL, G_TYPE_NONE, 2, G_TYPE_UINT, G_TYPE_INT);
}

static void
aw_document_init (AwDocument *self)
{
  self->commands = g_ptr_array_new_with_free_func (command_free);
  self->saved_pos = 0;
}

AwDocument *
aw_document_new_for_project (AwProject *project,
                             GFile     *file)
{
  AwDocument *self;

  g_return_val_if_fail (project != NULL, NULL);

  self = g_object_new (AW_TYPE_DOCUMENT, NULL);
  self->project = project;
  self->file = file ? g_object_ref (file) : NULL;
  return self;
}

AwDocument *
aw_document_new (void)
{
  AwProject *project = aw_project_new ();

  /* translators: the name of the first setup of a new project */
  g_ptr_array_add (project->setups, aw_setup_new (_ ("Setup 1")));
  return aw_document_new_for_project (project, NULL);
}

const AwProject *
aw_document_get_project (AwDocument *self)
{
  g_return_val_if_fail (AW_IS_DOCUMENT (self), NULL);
  return self->project;
}

GFile *
aw_document_get_file (AwDocument *self)
{
  g_return_val_if_fail (AW_IS_DOCUMENT (self), NULL);
  return self->file;
}

void
aw_document_set_file (AwDocument *self,
                      GFile      *file)
{
  g_return_if_fail (AW_IS_DOCUMENT (self));

  if (g_set_object (&self->file, file))
    g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_FILE]);
}

char *
aw_document_dup_display_name (AwDocument *self)
{
  g_return_val_if_fail (AW_IS_DOCUMENT (self), NULL);

  if (self->file == NULL)
    return g_strdup (_ ("Unsaved Project"));
  return g_file_get_basename (self->file);
}

gboolean
aw_document_get_modified (AwDocument *self)
{
  g_return_val_if_fail (AW_IS_DOCUMENT (self), FALSE);
  return self->saved_pos != (int) self->pos;
}

static void
set_saved_pos (AwDocument *self,
               int         saved_pos)
{
  gboolean was = aw_document_get_modified (self);

  self->saved_pos = saved_pos;
  if (was != aw_document_get_modified (self))
    g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_MODIFIED]);
}

void
aw_document_mark_saved (AwDocument *self)
{
  g_return_if_fail (AW_IS_DOCUMENT (self));
  self->sealed = TRUE;
  set_saved_pos (self, (int) self->pos);
}

void
aw_document_mark_unsaved (AwDocument *self)
{
  g_return_if_fail (AW_IS_DOCUMENT (self));
  set_saved_pos (self, -1);
}

AwChange
aw_project_diff (const AwProject *a,
                 const AwProject *b,
                 int             *index)
{
  AwChange change = 0;
  int differing = -1;
  guint n_differing = 0;

  *index = -1;
  if (a->setups->len != b->setups->len)
    return AW_CHANGE_ALL;

  for (guint i = 0; i < a->setups->len; i++)
    {
      const AwSetup *sa = g_ptr_array_index (a->setups, i);
      const AwSetup *sb = g_ptr_array_index (b->setups, i);

      if (!aw_setup_equal (sa, sb))
        {
          differing = (int) i;
          n_differing++;
        }
    }
  if (n_differing == 1)
    {
      change |= AW_CHANGE_SETUP;
      *index = differing;
    }
  else if (n_differing > 1)
    change |= AW_CHANGE_SETUP | AW_CHANGE_STRUCTURE;

  if (!aw_project_conditions_equal (&a->conditions, &b->conditions)
      || g_strcmp0 (a->name, b->name) != 0 || g_strcmp0 (a->notes, b->notes) != 0
      || a->site_rules->len != b->site_rules->len)
    change |= AW_CHANGE_PROJECT;
  else
    for (guint i = 0; i < a->site_rules->len; i++)
      if (!aw_site_rules_equal (g_ptr_array_index (a->site_rules, i),
                                g_ptr_array_index (b->site_rules, i)))
        change |= AW_CHANGE_PROJECT;

  return change;
}

static void
replace_project (AwDocument *self,
                 AwProject  *project)
{
  g_autoptr (AwProject) old = g_steal_pointer (&self->project);
  AwChange change;
  int index;

  self->project = project;
  change = aw_project_diff (old, project, &index);
  g_signal_emit (self, signals[CHANGED], 0, (guint) change, index);
}

gboolean
aw_document_push (AwDocument *self,
                  AwProject  *project,
                  const char *label,
                  const char *merge_key,
                  int         selection_before,
                  int         selection_after)
{
  gboolean was_modified;
  gint64 now = g_get_monotonic_time ();
  AwCommand *top = NULL;

  g_return_val_if_fail (AW_IS_DOCUMENT (self), FALSE);
  g_return_val_if_fail (project != NULL, FALSE);

  if (aw_project_equal (self->project, project))
    {
      aw_project_free (project);
      return FALSE;
    }

  was_modified = aw_document_get_modified (self);

  /* a new edit drops what could have been redone */
  if (self->pos < self->commands->len)
    {
      if (self->saved_pos > (int) self->pos)
        self->saved_pos = -1;
      g_ptr_array_set_size (self->commands, self->pos);
    }

  if (self->pos > 0)
    top = g_ptr_array_index (self->commands, self->pos - 1);

  if (top != NULL && !self->sealed && merge_key != NULL && top->merge_key != NULL
      && g_str_equal (merge_key, top->merge_key) && now - top->time_us < MERGE_WINDOW_US
      && self->saved_pos != (int) self->pos)
    {
      g_clear_pointer (&top->after, aw_project_free);
      top->after = aw_project_copy (project);
      top->selection_after = selection_after;
      top->time_us = now;
    }
  else
    {
      AwCommand *cmd = g_new0 (AwCommand, 1);

      cmd->before = aw_project_copy (self->project);
      cmd->after = aw_project_copy (project);
      cmd->label = g_strdup (label);
      cmd->merge_key = g_strdup (merge_key);
      cmd->selection_before = selection_before;
      cmd->selection_after = selection_after;
      cmd->time_us = now;
      g_ptr_array_add (self->commands, cmd);
      self->pos++;
    }
  self->sealed = FALSE;

  replace_project (self, project);
  if (was_modified != aw_document_get_modified (self))
    g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_MODIFIED]);
  return TRUE;
}

void
aw_document_seal (AwDocument *self)
{
  g_return_if_fail (AW_IS_DOCUMENT (self));
  self->sealed = TRUE;
}

gboolean
aw_document_can_undo (AwDocument *self)
{
  g_return_val_if_fail (AW_IS_DOCUMENT (self), FALSE);
  return self->pos > 0;
}

gboolean
aw_document_can_redo (AwDocument *self)
{
  g_return_val_if_fail (AW_IS_DOCUMENT (self), FALSE);
  return self->pos < self->commands->len;
}

const char *
aw_document_get_undo_label (AwDocument *self)
{
  AwCommand *cmd;

  if (!aw_document_can_undo (self))
    return NULL;
  cmd = g_ptr_array_index (self->commands, self->pos - 1);
  return cmd->label;
}

const char *
aw_document_get_redo_label (AwDocument *self)
{
  AwCommand *cmd;

  if (!aw_document_can_redo (self))
    return NULL;
  cmd = g_ptr_array_index (self->commands, self->pos);
  return cmd->label;
}

int
aw_document_undo (AwDocument *self)
{
  AwCommand *cmd;
  gboolean was_modified;

  g_return_val_if_fail (AW_IS_DOCUMENT (self), -1);

  if (!aw_document_can_undo (self))
    return -1;
  was_modified = aw_document_get_modified (self);
  cmd = g_ptr_array_index (self->commands, self->pos - 1);
  self->pos--;
  self->sealed = TRUE;
  replace_project (self, aw_project_copy (cmd->before));
  if (was_modified != aw_document_get_modified (self))
    g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_MODIFIED]);
  return cmd->selection_before;
}

int
aw_document_redo (AwDocument *self)
{
  AwCommand *cmd;
  gboolean was_modified;

  g_return_val_if_fail (AW_IS_DOCUMENT (self), -1);

  if (!aw_document_can_redo (self))
    return -1;
  was_modified = aw_document_get_modified (self);
  cmd = g_ptr_array_index (self->commands, self->pos);
  self->pos++;
  self->sealed = TRUE;
  replace_project (self, aw_project_copy (cmd->after));
  if (was_modified != aw_document_get_modified (self))
    g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_MODIFIED]);
  return cmd->selection_after;
}
