/* aw-number-field.c: a labelled number entry with its unit, checked as the user types
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <glib/gi18n.h>
#include <math.h>

#include "aw-number-field.h"

struct _AwNumberField
{
  GtkWidget parent_instance;

  /* template widgets */
  GtkWidget *box;
  GtkLabel *label;
  GtkEntry *entry;
  GtkLabel *unit_label;
  GtkRevealer *error_revealer;
  GtkLabel *error_label;

  /* owned */
  AwQuantity quantity;
  AwUnitSystem units;
  double min;
  double max;
  double value;
  int digits;
  gboolean allow_empty;
  char *error;
  char *help;
  guint updating : 1;
};

G_DEFINE_FINAL_TYPE (AwNumberField, aw_number_field, GTK_TYPE_WIDGET)

enum { PROP_0, PROP_LABEL, PROP_VALUE, N_PROPS };
static GParamSpec *properties[N_PROPS];

enum { VALUE_CHANGED, N_SIGNALS };
static guint signals[N_SIGNALS];

static int
digits_for (AwNumberField *self)
{
  return self->digits >= 0 ? self->digits : aw_qty_digits (self->quantity, self->units);
}

static char *
format_shown (AwNumberField *self,
              double         base)
{
  return aw_format_number (aw_qty_to_display (self->quantity, self->units, base),
                           digits_for (self));
}

static void
show_error (AwNumberField *self,
            char          *message)   /* owned, NULL clears */
{
  g_free (self->error);
  self->error = message;

  if (message != NULL)
    {
      gtk_label_set_text (self->error_label, message);
      gtk_widget_add_css_class (GTK_WIDGET (self->entry), "error");
      gtk_accessible_update_state (GTK_ACCESSIBLE (self->entry), GTK_ACCESSIBLE_STATE_INVALID,
                                   GTK_ACCESSIBLE_INVALID_TRUE, -1);
      gtk_accessible_update_property (GTK_ACCESSIBLE (self->entry),
                                      GTK_ACCESSIBLE_PROPERTY_DESCRIPTION, message, -1);
    }
  else
    {
      gtk_widget_remove_css_class (GTK_WIDGET (self->entry), "error");
      gtk_accessible_reset_state (GTK_ACCESSIBLE (self->entry), GTK_ACCESSIBLE_STATE_INVALID);
      if (self->help)
        gtk_accessible_update_property (GTK_ACCESSIBLE (self->entry),
                                        GTK_ACCESSIBLE_PROPERTY_DESCRIPTION, self->help, -1);
      else
        gtk_accessible_reset_property (GTK_ACCESSIBLE (self->entry),
                                       GTK_ACCESSIBLE_PROPERTY_DESCRIPTION);
    }
  gtk_revealer_set_reveal_child (self->error_revealer, message != NULL);
}

/* Checks the text; on success stores the value in *out (base unit). */
static char *
check_text (AwNumberField *self,
            const char    *text,
            double        *out)
{
  double shown, base;
  const char *unit = aw_qty_unit (self->quantity, self->units);

  while (*text == ' ')
    text++;
  if (*text == '\0')
    {
      if (self->allow_empty)
        {
          *out = NAN;
          return NULL;
        }
      return g_strdup (_ ("Enter a value."));
    }
  if (!aw_parse_number (text, &shown))
    {
      g_autofree char *example = format_shown (self, isfinite (self->value)
                                                     ? self->value
                                                     : (isfinite (self->min) ? self->min : 0.0));
      /* translators: %s is a number written the way this field expects it, e.g. "0,25" */
      return g_strdup_printf (_ ("Not a number. Write it like %s."), example);
    }
  base = aw_qty_from_display (self->quantity, self->units, shown);
  /* compare in the shown unit's rounding so that a limit typed exactly is accepted */
  if ((isfinite (self->min) && base < self->min - 1e-9 * fabs (self->min))
      || (isfinite (self->max) && base > self->max + 1e-9 * fabs (self->max)))
    {
      g_autofree char *lo = format_shown (self, self->min);
      g_autofree char *hi = format_shown (self, self->max);

      if (isfinite (self->min) && isfinite (self->max))
        {
          if (unit[0] != '\0')
            /* translators: a range, e.g. "Must be between 0,05 and 2,00 g." */
            return g_strdup_printf (_ ("Must be between %s and %s %s."), lo, hi, unit);
          return g_strdup_printf (_ ("Must be between %s and %s."), lo, hi);
        }
      if (isfinite (self->min))
        return g_strdup_printf (_ ("Must be at least %s %s."), lo, unit);
      return g_strdup_printf (_ ("Must be at most %s %s."), hi, unit);
    }
  *out = base;
  return NULL;
}

static void
entry_changed_cb (AwNumberField *self)
{
  double v = NAN;
  char *problem;

  if (self->updating)
    return;

  problem = check_text (self, gtk_editable_get_text (GTK_EDITABLE (self->entry)), &v);
  show_error (self, problem);
  if (problem != NULL)
    return;

  if ((isnan (v) && isnan (self->value)) || v == self->value)
    return;
  self->value = v;
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_VALUE]);
  g_signal_emit (self, signals[VALUE_CHANGED], 0);
}

static void
reformat (AwNumberField *self)
{
  g_autofree char *text = NULL;

  if (self->error != NULL)
    return;
  text = isnan (self->value) ? g_strdup ("") : format_shown (self, self->value);
  if (g_strcmp0 (text, gtk_editable_get_text (GTK_EDITABLE (self->entry))) == 0)
    return;
  self->updating = TRUE;
  gtk_editable_set_text (GTK_EDITABLE (self->entry), text);
  self->updating = FALSE;
}

static void
entry_activate_cb (AwNumberField *self)
{
  reformat (self);
  gtk_widget_activate_default (GTK_WIDGET (self));
}

static void
focus_leave_cb (AwNumberField *self)
{
  reformat (self);
}

static void
update_unit (AwNumberField *self)
{
  const char *unit = aw_qty_unit (self->quantity, self->units);

  /* an empty unit still takes its column, so the entries of a group line up */
  gtk_label_set_text (self->unit_label, unit);
}

static void
aw_number_field_dispose (GObject *object)
{
  AwNumberField *self = AW_NUMBER_FIELD (object);

  gtk_widget_dispose_template (GTK_WIDGET (self), AW_TYPE_NUMBER_FIELD);
  {
    GtkWidget *child;
    while ((child = gtk_widget_get_first_child (GTK_WIDGET (self))) != NULL)
      gtk_widget_unparent (child);
  }
  G_OBJECT_CLASS (aw_number_field_parent_class)->dispose (object);
}

static void
aw_number_field_finalize (GObject *object)
{
  AwNumberField *self = AW_NUMBER_FIELD (object);

  g_free (self->error);
  g_free (self->help);
  G_OBJECT_CLASS (aw_number_field_parent_class)->finalize (object);
}

static void
aw_number_field_get_property (GObject    *object,
                              guint       prop_id,
                              GValue     *value,
                              GParamSpec *pspec)
{
  AwNumberField *self = AW_NUMBER_FIELD (object);

  switch (prop_id)
    {
    case PROP_LABEL:
      g_value_set_string (value, gtk_label_get_label (self->label));
      break;
    case PROP_VALUE:
      g_value_set_double (value, self->value);
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
    }
}

static void
aw_number_field_set_property (GObject      *object,
                              guint         prop_id,
                              const GValue *value,
                              GParamSpec   *pspec)
{
  AwNumberField *self = AW_NUMBER_FIELD (object);

  switch (prop_id)
    {
    case PROP_LABEL:
      aw_number_field_set_label (self, g_value_get_string (value));
      break;
    case PROP_VALUE:
      aw_number_field_set_value (self, g_value_get_double (value));
      break;
    default:
      G_OBJECT_WARN_INVALID_PROPERTY_ID (object, prop_id, pspec);
    }
}

static gboolean
aw_number_field_grab_focus (GtkWidget *widget)
{
  return gtk_widget_grab_focus (GTK_WIDGET (AW_NUMBER_FIELD (widget)->entry));
}

static void
aw_number_field_class_init (AwNumberFieldClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->dispose = aw_number_field_dispose;
  object_class->finalize = aw_number_field_finalize;
  object_class->get_property = aw_number_field_get_property;
  object_class->set_property = aw_number_field_set_property;
  widget_class->grab_focus = aw_number_field_grab_focus;

  properties[PROP_LABEL] =
    g_param_spec_string ("label", NULL, NULL, NULL,
                         G_PARAM_READWRITE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  properties[PROP_VALUE] =
    g_param_spec_double ("value", NULL, NULL, -G_MAXDOUBLE, G_MAXDOUBLE, 0,
                         G_PARAM_READWRITE | G_PARAM_STATIC_STRINGS | G_PARAM_EXPLICIT_NOTIFY);
  g_object_class_install_properties (object_class, N_PROPS, properties);

  signals[VALUE_CHANGED] = g_signal_new ("value-changed", G_TYPE_FROM_CLASS (klass),
                                         G_SIGNAL_RUN_LAST, 0, NULL, NULL, NULL, G_TYPE_NONE, 0);

  gtk_widget_class_set_template_from_resource (widget_class,
                                               "/io/github/arcwright/Arcwright/aw-number-field.ui");
  gtk_widget_class_bind_template_child (widget_class, AwNumberField, box);
  gtk_widget_class_bind_template_child (widget_class, AwNumberField, label);
  gtk_widget_class_bind_template_child (widget_class, AwNumberField, entry);
  gtk_widget_class_bind_template_child (widget_class, AwNumberField, unit_label);
  gtk_widget_class_bind_template_child (widget_class, AwNumberField, error_revealer);
  gtk_widget_class_bind_template_child (widget_class, AwNumberField, error_label);
  gtk_widget_class_bind_template_callback (widget_class, entry_changed_cb);
  gtk_widget_class_bind_template_callback (widget_class, entry_activate_cb);
  gtk_widget_class_set_layout_manager_type (widget_class, GTK_TYPE_BIN_LAYOUT);
  gtk_widget_class_set_css_name (widget_class, "awnumberfield");
}

static void
aw_number_field_init (AwNumberField *self)
{
  GtkEventController *focus;

  self->min = -G_MAXDOUBLE;
  self->max = G_MAXDOUBLE;
  self->digits = -1;
  self->value = 0.0;
  gtk_widget_init_template (GTK_WIDGET (self));

  focus = gtk_event_controller_focus_new ();
  g_signal_connect_swapped (focus, "leave", G_CALLBACK (focus_leave_cb), self);
  gtk_widget_add_controller (GTK_WIDGET (self->entry), focus);
  update_unit (self);
}

GtkWidget *
aw_number_field_new (const char *label,
                     AwQuantity  quantity,
                     double      min,
                     double      max)
{
  AwNumberField *self = g_object_new (AW_TYPE_NUMBER_FIELD, "label", label, NULL);

  self->quantity = quantity;
  self->min = min;
  self->max = max;
  update_unit (self);
  return GTK_WIDGET (self);
}

void
aw_number_field_set_label (AwNumberField *self,
                           const char    *label)
{
  g_return_if_fail (AW_IS_NUMBER_FIELD (self));

  if (g_strcmp0 (label, gtk_label_get_label (self->label)) == 0)
    return;
  gtk_label_set_text_with_mnemonic (self->label, label ? label : "");
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_LABEL]);
}

const char *
aw_number_field_get_label (AwNumberField *self)
{
  g_return_val_if_fail (AW_IS_NUMBER_FIELD (self), NULL);
  return gtk_label_get_text (self->label);
}

void
aw_number_field_set_quantity (AwNumberField *self,
                              AwQuantity     quantity)
{
  g_return_if_fail (AW_IS_NUMBER_FIELD (self));
  self->quantity = quantity;
  update_unit (self);
}

void
aw_number_field_set_units (AwNumberField *self,
                           AwUnitSystem   units)
{
  g_return_if_fail (AW_IS_NUMBER_FIELD (self));

  if (self->units == units)
    return;
  self->units = units;
  update_unit (self);
  /* a value being typed in the old unit is dropped for the applied one */
  show_error (self, NULL);
  self->updating = TRUE;
  {
    g_autofree char *text = isnan (self->value) ? g_strdup ("") : format_shown (self, self->value);
    gtk_editable_set_text (GTK_EDITABLE (self->entry), text);
  }
  self->updating = FALSE;
}

void
aw_number_field_set_range (AwNumberField *self,
                           double         min,
                           double         max)
{
  g_return_if_fail (AW_IS_NUMBER_FIELD (self));
  self->min = min;
  self->max = max;
}

void
aw_number_field_set_allow_empty (AwNumberField *self,
                                 gboolean       allow,
                                 const char    *empty_text)
{
  g_return_if_fail (AW_IS_NUMBER_FIELD (self));
  self->allow_empty = allow;
  gtk_entry_set_placeholder_text (self->entry, empty_text);
}

void
aw_number_field_set_digits (AwNumberField *self,
                            int            digits)
{
  g_return_if_fail (AW_IS_NUMBER_FIELD (self));
  self->digits = digits;
}

void
aw_number_field_set_help (AwNumberField *self,
                          const char    *help)
{
  g_return_if_fail (AW_IS_NUMBER_FIELD (self));

  g_free (self->help);
  self->help = g_strdup (help);
  gtk_widget_set_tooltip_text (GTK_WIDGET (self->label), help);
  gtk_widget_set_tooltip_text (GTK_WIDGET (self->entry), help);
  if (self->error == NULL && help != NULL)
    gtk_accessible_update_property (GTK_ACCESSIBLE (self->entry),
                                    GTK_ACCESSIBLE_PROPERTY_DESCRIPTION, help, -1);
}

void
aw_number_field_set_value (AwNumberField *self,
                           double         value)
{
  double typed;
  g_autofree char *problem = NULL;
  g_autofree char *text = NULL;

  g_return_if_fail (AW_IS_NUMBER_FIELD (self));

  /* leave the user's text alone when it already says this value (e.g. "0,2" for 0.20) */
  problem = check_text (self, gtk_editable_get_text (GTK_EDITABLE (self->entry)), &typed);
  if (problem == NULL && ((isnan (typed) && isnan (value))
                          || fabs (typed - value) <= 1e-12 * MAX (1.0, fabs (value))))
    {
      self->value = value;
      return;
    }
  /* while a bad value is being typed, keep it in view: the document still has `value` */
  if (problem != NULL && gtk_widget_has_focus (GTK_WIDGET (self->entry)))
    {
      self->value = value;
      return;
    }

  self->value = value;
  text = isnan (value) ? g_strdup ("") : format_shown (self, value);
  self->updating = TRUE;
  gtk_editable_set_text (GTK_EDITABLE (self->entry), text);
  self->updating = FALSE;
  show_error (self, NULL);
  g_object_notify_by_pspec (G_OBJECT (self), properties[PROP_VALUE]);
}

double
aw_number_field_get_value (AwNumberField *self)
{
  g_return_val_if_fail (AW_IS_NUMBER_FIELD (self), NAN);
  return self->value;
}

gboolean
aw_number_field_is_valid (AwNumberField *self)
{
  g_return_val_if_fail (AW_IS_NUMBER_FIELD (self), FALSE);
  return self->error == NULL;
}

const char *
aw_number_field_get_error (AwNumberField *self)
{
  g_return_val_if_fail (AW_IS_NUMBER_FIELD (self), NULL);
  return self->error;
}

GtkEntry *
aw_number_field_get_entry (AwNumberField *self)
{
  g_return_val_if_fail (AW_IS_NUMBER_FIELD (self), NULL);
  return self->entry;
}
