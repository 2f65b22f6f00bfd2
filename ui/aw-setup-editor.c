/* aw-setup-editor.c: the editor of the selected setup, grouped by topic
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <glib/gi18n.h>
#include <math.h>

#include "aw-chrono-dialog.h"
#include "aw-number-field.h"
#include "aw-setup-editor.h"
#include "aw-units.h"

typedef double (*FieldGet) (const AwSetup *s, const AwProjectConditions *c);
typedef void (*FieldSet) (AwSetup *s, AwProjectConditions *c, double v);

typedef struct
{
  const char *id;
  AwQuantity quantity;
  double min, max;           /* base unit */
  gboolean allow_empty;
  const char *empty_text;    /* N_() */
  const char *undo_label;    /* N_() */
  const char *help;          /* N_() */
  FieldGet get;
  FieldSet set;
  gboolean conditions;       /* edits conditions (the setup's own or the project's) */
} FieldSpec;

#define SETUP_FIELD(name, expr)                                                               \
  static double get_##name (const AwSetup *s, const AwProjectConditions *c) { return (expr); } \
  static void set_##name (AwSetup *s, AwProjectConditions *c, double v) { (expr) = v; }
#define COND_FIELD(name, member)                                                              \
  static double get_##name (const AwSetup *s, const AwProjectConditions *c) { return c->member; } \
  static void set_##name (AwSetup *s, AwProjectConditions *c, double v) { c->member = v; }

SETUP_FIELD (ref_mass, s->replica.ref_mass_g)
SETUP_FIELD (ref_velocity, s->replica.ref_velocity_mps)
SETUP_FIELD (creep, s->replica.creep_pct_per_01g)
SETUP_FIELD (mass, s->bb.mass_g)
SETUP_FIELD (diameter, s->bb.diameter_mm)
SETUP_FIELD (lift_ratio, s->hop.value)
SETUP_FIELD (tilt, s->hop.tilt_deg)
SETUP_FIELD (hop_limit, s->hop.max_lift_ratio)
SETUP_FIELD (muzzle_height, s->muzzle_height_m)
SETUP_FIELD (sight_height, s->sighting.sight_height_m)
SETUP_FIELD (zero, s->sighting.zero_distance_m)
SETUP_FIELD (band, s->band_half_height_m)
SETUP_FIELD (drag_cd, s->model.drag_cd)
SETUP_FIELD (lift_slope, s->model.lift_slope)
SETUP_FIELD (lift_factor, s->model.lift_factor)
SETUP_FIELD (drag_factor, s->model.drag_factor)
SETUP_FIELD (decay_factor, s->model.spin_decay_factor)
COND_FIELD (temperature, temperature_c)
COND_FIELD (pressure, pressure_hpa)
COND_FIELD (altitude, altitude_m)
COND_FIELD (humidity, humidity_pct)
COND_FIELD (wind_speed, wind_speed_mps)
COND_FIELD (wind_from, wind_from_deg)

#define F(id, q, lo, hi, undo, help, name) \
  { id, q, lo, hi, FALSE, NULL, undo, help, get_##name, set_##name, FALSE }
#define C(id, q, lo, hi, undo, help, name) \
  { id, q, lo, hi, FALSE, NULL, undo, help, get_##name, set_##name, TRUE }

static const FieldSpec field_specs[] = {
  F ("ref_mass_field", AW_QTY_MASS_G, 0.05, 2.0, N_ ("Change chrono BB mass"),
     N_ ("The BB mass the chrono velocity was measured with."), ref_mass),
  F ("ref_velocity_field", AW_QTY_VELOCITY, 1.0, 300.0, N_ ("Change chrono velocity"),
     N_ ("Muzzle velocity measured with the chrono BB."), ref_velocity),
  F ("creep_field", AW_QTY_CREEP, -50.0, 100.0, N_ ("Change energy creep"),
     N_ ("How much the energy grows for every 0.1 g heavier BB (gas and high-pressure air)."),
     creep),
  F ("mass_field", AW_QTY_MASS_G, 0.05, 2.0, N_ ("Change BB mass"),
     N_ ("Mass of the BB this setup shoots. Always in grams."), mass),
  F ("diameter_field", AW_QTY_DIAMETER_MM, 4.0, 8.0, N_ ("Change BB diameter"),
     N_ ("Measured BB diameter; precision 6 mm BBs are about 5.95 mm."), diameter),
  F ("lift_ratio_field", AW_QTY_NONE, 0.0, 5.0, N_ ("Change lift ratio"),
     N_ ("Magnus force divided by the BB's weight at the muzzle: 1 holds it level, more makes it "
        "climb first."), lift_ratio),
  F ("tilt_field", AW_QTY_DEGREES, -45.0, 45.0, N_ ("Change hop tilt"),
     N_ ("Roll of the spin axis; a positive tilt curves the BB to the right."), tilt),
  { "hop_limit_field", AW_QTY_NONE, AW_HOP_MAX_LIFT_RATIO_MIN, AW_HOP_MAX_LIFT_RATIO_MAX, TRUE,
    N_ ("no limit"), N_ ("Change hop limit"),
    N_ ("The highest lift ratio this replica's hop-up reaches at its strongest, with this setup's "
       "own BB at its muzzle velocity; auto hop stays within it, and heavier BBs get less lift "
       "from the same hop-up (leave empty for no limit)."), get_hop_limit, set_hop_limit, FALSE },
  F ("muzzle_height_field", AW_QTY_HEIGHT, 0.05, 10.0, N_ ("Change muzzle height"),
     N_ ("Height of the muzzle above the ground: about 1.5 m standing, 1 m kneeling, 0.3 m prone."),
     muzzle_height),
  F ("sight_height_field", AW_QTY_SIGHT_HEIGHT, 0.0, 0.3, N_ ("Change sight height"),
     N_ ("Height of the sight line above the bore."), sight_height),
  { "zero_field", AW_QTY_DISTANCE, 1.0, 300.0, TRUE, N_ ("none"), N_ ("Change zero distance"),
    N_ ("Distance where the flight crosses the sight line on its way down. Leave empty for a "
       "level bore."), get_zero, set_zero, FALSE },
  F ("band_field", AW_QTY_BAND, 0.01, 1.0, N_ ("Change band"),
     N_ ("Half-height of the band around the sight line; the band range is the farthest distance "
        "the BB stays inside it."), band),
  F ("drag_cd_field", AW_QTY_NONE, 0.01, 2.0, N_ ("Change drag coefficient"),
     N_ ("Drag coefficient used by the constant drag model."), drag_cd),
  F ("lift_slope_field", AW_QTY_NONE, 0.001, 1.0, N_ ("Change lift slope"),
     N_ ("Slope k of the linear lift model; 0.032 matches the trade's rule of thumb."), lift_slope),
  F ("lift_factor_field", AW_QTY_FACTOR, 0.05, 5.0, N_ ("Change lift factor"),
     N_ ("Multiplies the lift of the model; 1 is the model as published."), lift_factor),
  F ("drag_factor_field", AW_QTY_FACTOR, 0.05, 5.0, N_ ("Change drag factor"),
     N_ ("Multiplies the drag of the model; 1 is the model as published."), drag_factor),
  F ("decay_factor_field", AW_QTY_FACTOR, 0.0, 10.0, N_ ("Change spin-decay factor"),
     N_ ("Multiplies how fast the spin decays; 1 is the model default."), decay_factor),
  C ("temperature_field", AW_QTY_TEMPERATURE, -40.0, 60.0, N_ ("Change temperature"),
     N_ ("Air temperature."), temperature),
  C ("pressure_field", AW_QTY_PRESSURE, 500.0, 1100.0, N_ ("Change air pressure"),
     N_ ("Station pressure (not reduced to sea level)."), pressure),
  C ("altitude_field", AW_QTY_ALTITUDE, -500.0, 6000.0, N_ ("Change altitude"),
     N_ ("Altitude above sea level; the pressure follows the standard atmosphere."), altitude),
  C ("humidity_field", AW_QTY_PERCENT, 0.0, 100.0, N_ ("Change humidity"),
     N_ ("Relative humidity."), humidity),
  C ("wind_speed_field", AW_QTY_WIND, 0.0, 30.0, N_ ("Change wind speed"),
     N_ ("Wind speed."), wind_speed),
  C ("wind_from_field", AW_QTY_DEGREES, 0.0, 360.0, N_ ("Change wind direction"),
     N_ ("Where the wind blows from, clockwise from the line of fire: 0 from the target, 90 from "
        "the right, 180 from behind, 270 from the left."), wind_from),
};

#undef F
#undef C

struct _AwSetupEditor
{
  GtkWidget parent_instance;

  /* template widgets */
  GtkWidget *scroller;
  GtkEntry *name_entry;
  GtkColorButton *colour_button;
  GtkRevealer *name_error_revealer;
  GtkLabel *name_error_label;
  GtkLabel *band_range_value;
  GtkLabel *energy_value;
  GtkLabel *velocity_value;
  GtkLabel *hop_summary_value;
  GtkLabel *status_label;
  GtkEntry *type_entry;
  GtkDropDown *power_dropdown;
  GtkDropDown *energy_model_dropdown;
  GtkBox *points_box;
  GtkBox *chrono_box;
  GtkDropDown *hop_dropdown;
  GtkLabel *hop_used_value;
  GtkLabel *spin_value;
  GtkLabel *hop_note_label;
  GtkLabel *hop_limit_note_label;
  GtkDropDown *angle_dropdown;
  GtkSwitch *own_conditions_switch;
  GtkLabel *conditions_note_label;
  GtkDropDown *air_source_dropdown;
  GtkLabel *model_note_label;
  GtkDropDown *drag_dropdown;
  GtkDropDown *lift_dropdown;

  /* owned */
  AwDocument *document;
  AwComputeResult *result;
  GtkWidget *fields[G_N_ELEMENTS (field_specs)];
  int index;
  AwUnitSystem units;
  int updating;
  GtkListBox *points_list;
  GtkListBox *chrono_list;
  GtkWidget *add_point_button;
  char *points_shown;        /* text of the rows last built, to rebuild only on change */
  char *chrono_shown;
};

G_DEFINE_FINAL_TYPE (AwSetupEditor, aw_setup_editor, GTK_TYPE_WIDGET)

static const AwSetup *
current_setup (AwSetupEditor *self)
{
  const AwProject *p;

  if (self->document == NULL || self->index < 0)
    return NULL;
  p = aw_document_get_project (self->document);
  if ((guint) self->index >= p->setups->len)
    return NULL;
  return g_ptr_array_index (p->setups, self->index);
}

/* Starts an edit: a copy of the project and the setup being edited in it. */
static AwProject *
begin_edit (AwSetupEditor *self,
            AwSetup      **setup)
{
  AwProject *p;

  if (current_setup (self) == NULL)
    return NULL;
  p = aw_project_copy (aw_document_get_project (self->document));
  *setup = g_ptr_array_index (p->setups, self->index);
  return p;
}

static void
commit (AwSetupEditor *self,
        AwProject     *project,
        const char    *label,
        const char    *key)
{
  g_autofree char *merge_key = key ? g_strdup_printf ("%d:%s", self->index, key) : NULL;

  aw_document_push (self->document, project, label, merge_key, self->index, self->index);
}

static void
field_value_changed_cb (AwNumberField *field,
                        AwSetupEditor *self)
{
  const FieldSpec *spec = g_object_get_data (G_OBJECT (field), "aw-field-spec");
  AwSetup *s = NULL;
  AwProject *p;
  double v = aw_number_field_get_value (field);

  if (self->updating || spec == NULL)
    return;
  p = begin_edit (self, &s);
  if (p == NULL)
    return;
  spec->set (s, s->conditions ? s->conditions : &p->conditions, v);
  commit (self, p, _ (spec->undo_label), spec->id);
}

/* ---- name and colour ---- */

static char *
check_name (AwSetupEditor *self,
            const char    *name)
{
  const AwProject *p = aw_document_get_project (self->document);
  g_autofree char *stripped = g_strstrip (g_strdup (name));

  if (stripped[0] == '\0')
    return g_strdup (_ ("A setup needs a name."));
  if (g_utf8_strlen (stripped, -1) > 80)
    return g_strdup (_ ("Keep the name under 80 characters."));
  for (guint i = 0; i < p->setups->len; i++)
    {
      const AwSetup *other = g_ptr_array_index (p->setups, i);
      if ((int) i != self->index && g_strcmp0 (other->name, stripped) == 0)
        return g_strdup (_ ("Another setup already has this name."));
    }
  return NULL;
}

static void
name_changed_cb (AwSetupEditor *self)
{
  g_autofree char *problem = NULL;
  g_autofree char *name = NULL;
  AwSetup *s = NULL;
  AwProject *p;

  if (self->updating || current_setup (self) == NULL)
    return;
  name = g_strstrip (g_strdup (gtk_editable_get_text (GTK_EDITABLE (self->name_entry))));
  problem = check_name (self, name);
  gtk_label_set_text (self->name_error_label, problem ? problem : "");
  gtk_revealer_set_reveal_child (self->name_error_revealer, problem != NULL);
  if (problem != NULL)
    {
      gtk_widget_add_css_class (GTK_WIDGET (self->name_entry), "error");
      gtk_accessible_update_state (GTK_ACCESSIBLE (self->name_entry),
                                   GTK_ACCESSIBLE_STATE_INVALID, GTK_ACCESSIBLE_INVALID_TRUE, -1);
      gtk_accessible_update_property (GTK_ACCESSIBLE (self->name_entry),
                                      GTK_ACCESSIBLE_PROPERTY_DESCRIPTION, problem, -1);
      return;
    }
  gtk_widget_remove_css_class (GTK_WIDGET (self->name_entry), "error");
  gtk_accessible_reset_state (GTK_ACCESSIBLE (self->name_entry), GTK_ACCESSIBLE_STATE_INVALID);
  gtk_accessible_reset_property (GTK_ACCESSIBLE (self->name_entry),
                                 GTK_ACCESSIBLE_PROPERTY_DESCRIPTION);

  p = begin_edit (self, &s);
  g_free (s->name);
  s->name = g_steal_pointer (&name);
  commit (self, p, _ ("Rename setup"), "name");
}

static void
colour_changed_cb (AwSetupEditor *self)
{
  GdkRGBA rgba;
  AwSetup *s = NULL;
  AwProject *p;

  if (self->updating)
    return;
  p = begin_edit (self, &s);
  if (p == NULL)
    return;
  gtk_color_chooser_get_rgba (GTK_COLOR_CHOOSER (self->colour_button), &rgba);
  g_free (s->colour);
  s->colour = g_strdup_printf ("#%02x%02x%02x", (int) lround (CLAMP (rgba.red, 0, 1) * 255),
                               (int) lround (CLAMP (rgba.green, 0, 1) * 255),
                               (int) lround (CLAMP (rgba.blue, 0, 1) * 255));
  commit (self, p, _ ("Change colour"), NULL);
}

static void
type_changed_cb (AwSetupEditor *self)
{
  AwSetup *s = NULL;
  AwProject *p;

  if (self->updating)
    return;
  p = begin_edit (self, &s);
  if (p == NULL)
    return;
  g_free (s->replica.type);
  s->replica.type = g_strdup (gtk_editable_get_text (GTK_EDITABLE (self->type_entry)));
  commit (self, p, _ ("Change replica type"), "type");
}

/* ---- choices ---- */

static void
dropdown_changed_cb (GtkDropDown   *dropdown,
                     GParamSpec    *pspec,
                     AwSetupEditor *self)
{
  guint sel = gtk_drop_down_get_selected (dropdown);
  AwSetup *s = NULL;
  AwProject *p;
  const char *label = NULL;

  if (self->updating || sel == GTK_INVALID_LIST_POSITION)
    return;
  p = begin_edit (self, &s);
  if (p == NULL)
    return;

  if (dropdown == self->power_dropdown)
    {
      s->replica.power_source = (AwPowerSource) sel;
      label = _ ("Change power source");
    }
  else if (dropdown == self->energy_model_dropdown)
    {
      s->replica.energy_model = (AwPowerModel) sel;
      if (s->replica.energy_model == AW_POWER_MEASURED && s->replica.points->len == 0)
        {
          /* start the measured points from the chrono reference */
          AwReplicaPoint pt = { s->replica.ref_mass_g, s->replica.ref_velocity_mps };
          g_array_append_val (s->replica.points, pt);
        }
      label = _ ("Change energy model");
    }
  else if (dropdown == self->hop_dropdown)
    {
      if (sel == 0)
        {
          s->hop.mode = AW_HOP_MODE_AUTO;
          s->hop.value = 0.0;
        }
      else if (sel == 2)
        {
          /* keep the flight as it is: the model spin now in use, to 100 rpm */
          double rpm = 0.0;
          if (self->result != NULL && isfinite (self->result->band.spin_rad_s))
            rpm = round (aw_rad_s_to_rpm (self->result->band.spin_rad_s) / 100.0) * 100.0;
          s->hop.mode = AW_HOP_MODE_SPIN;
          s->hop.value = rpm;
        }
      else
        {
          double start = 1.0;
          if (self->result != NULL && isfinite (self->result->band.lift_ratio)
              && self->result->band.lift_ratio > 0)
            start = round (self->result->band.lift_ratio * 100.0) / 100.0;
          s->hop.mode = AW_HOP_MODE_LIFT_RATIO;
          s->hop.value = start;
        }
      label = _ ("Change hop");
    }
  else if (dropdown == self->angle_dropdown)
    {
      s->sighting.angle_unit = (AwAngleUnit) sel;
      label = _ ("Change angle unit");
    }
  else if (dropdown == self->air_source_dropdown)
    {
      AwProjectConditions *c = s->conditions ? s->conditions : &p->conditions;
      if (sel == 0 && isnan (c->pressure_hpa))
        {
          c->pressure_hpa = 1013.25;
          c->altitude_m = NAN;
        }
      else if (sel == 1 && isnan (c->altitude_m))
        {
          c->altitude_m = 0.0;
          c->pressure_hpa = NAN;
        }
      label = _ ("Change how the air is given");
    }
  else if (dropdown == self->drag_dropdown)
    {
      s->model.drag = (AwDragModel) sel;
      label = _ ("Change drag model");
    }
  else if (dropdown == self->lift_dropdown)
    {
      s->model.lift = (AwLiftModel) sel;
      label = _ ("Change lift model");
    }
  commit (self, p, label, NULL);
}

static void
own_conditions_cb (AwSetupEditor *self)
{
  AwSetup *s = NULL;
  AwProject *p;
  gboolean own = gtk_switch_get_active (self->own_conditions_switch);

  if (self->updating)
    return;
  p = begin_edit (self, &s);
  if (p == NULL)
    return;
  if (own && s->conditions == NULL)
    s->conditions = aw_project_conditions_copy (&p->conditions);
  else if (!own && s->conditions != NULL)
    g_clear_pointer (&s->conditions, aw_project_conditions_free);
  commit (self, p, own ? _ ("Give the setup its own conditions")
                       : _ ("Use the project's conditions"), NULL);
}

/* ---- showing values ---- */

static void
set_label_qty (GtkLabel     *label,
               AwQuantity    q,
               AwUnitSystem  units,
               double        v)
{
  g_autofree char *text = aw_qty_format (q, units, v);
  gtk_label_set_text (label, text);
}

static const char *
lift_model_name (AwLiftModel m)
{
  switch (m)
    {
    case AW_LIFT_SATURATING:
      return _ ("saturating S/(1+2S)");
    case AW_LIFT_SHS:
      return _ ("Sawicki, Hubbard & Stronge");
    case AW_LIFT_LOTH:
      return _ ("Loth");
    case AW_LIFT_LINEAR:
      return _ ("linear k·S");
    case AW_LIFT_OFF:
    case AW_N_LIFT_MODELS:
    default:
      return _ ("lift off");
    }
}

char *
aw_compute_result_describe_problem (const AwComputeResult *result)
{
  if (result == NULL)
    return NULL;
  switch (result->bridge)
    {
    case AW_BRIDGE_OK:
      break;
    case AW_BRIDGE_BAD_CONDITIONS:
      return g_strdup (_ ("The conditions are outside what the air model covers."));
    case AW_BRIDGE_BAD_POWER:
      return g_strdup (_ ("The replica's energy settings give no velocity for this BB."));
    case AW_BRIDGE_BAD_INPUT:
    default:
      return g_strdup (_ ("Some values of this setup are missing or not numbers."));
    }
  switch (result->status)
    {
    case AW_ANALYSIS_OK:
      return NULL;
    case AW_ANALYSIS_NO_BAND:
      return g_strdup (_ ("The flight never enters the band: check the muzzle height, the sight "
                         "height and the band."));
    case AW_ANALYSIS_HOP_UNREACHABLE:
      return g_strdup (_ ("The lift model cannot reach this lift ratio: lower it, or choose "
                         "another lift model."));
    case AW_ANALYSIS_NO_ZERO:
      return g_strdup (_ ("No bore elevation puts the flight on the zero distance: shorten it or "
                         "leave it empty."));
    case AW_ANALYSIS_BAD_INPUT:
      return g_strdup (_ ("A value is out of the range the flight model accepts."));
    case AW_ANALYSIS_FLIGHT_FAILED:
    default:
      return g_strdup (_ ("The flight could not be computed with these values."));
    }
}

/* A note under the hop limit when the limit shapes the result: auto hop held at it, or a given hop
 * above it (flown as given, but the hop-up cannot reach it). */
static void
show_hop_limit_note (AwSetupEditor         *self,
                     const AwSetup         *s,
                     const AwComputeResult *r)   /* NULL: no usable result */
{
  GtkWidget *note = GTK_WIDGET (self->hop_limit_note_label);
  g_autofree char *text = NULL;

  if (r == NULL || isnan (s->hop.max_lift_ratio) || !r->band.hop_limited)
    {
      gtk_label_set_text (self->hop_limit_note_label, "");
      gtk_widget_set_visible (note, FALSE);
      return;
    }
  if (r->band.hop_over_limit)
    {
      if (isfinite (r->band.hop_limit_lift_ratio))
        {
          g_autofree char *lim = aw_format_number (r->band.hop_limit_lift_ratio, 2);
          /* translators: %s is the largest lift ratio the hop limit allows, e.g. "2,40" */
          text = g_strdup_printf (_ ("Above the hop limit: the hop-up reaches at most %s with "
                                     "this BB."), lim);
        }
      else
        text = g_strdup (_ ("Above the hop limit: the hop-up cannot reach this hop."));
      gtk_widget_add_css_class (note, "aw-status-warning");
      gtk_widget_remove_css_class (note, "dim-label");
    }
  else
    {
      text = g_strdup (_ ("Auto hop is held at the hop limit: a stronger hop-up would reach "
                          "further."));
      gtk_widget_add_css_class (note, "dim-label");
      gtk_widget_remove_css_class (note, "aw-status-warning");
    }
  gtk_label_set_text (self->hop_limit_note_label, text);
  gtk_widget_set_visible (note, TRUE);
}

static void
show_result (AwSetupEditor *self)
{
  const AwSetup *s = current_setup (self);
  AwComputeResult *r = self->result;
  g_autofree char *problem = NULL;
  gboolean ok;

  if (s == NULL)
    return;

  if (r == NULL)
    {
      gtk_widget_add_css_class (GTK_WIDGET (self->band_range_value), "dim-label");
      show_hop_limit_note (self, s, NULL);
      return;
    }
  gtk_widget_remove_css_class (GTK_WIDGET (self->band_range_value), "dim-label");

  ok = r->bridge == AW_BRIDGE_OK && r->status >= 0;
  set_label_qty (self->velocity_value, AW_QTY_VELOCITY, self->units,
                 r->bridge == AW_BRIDGE_OK ? r->velocity_mps : NAN);
  set_label_qty (self->energy_value, AW_QTY_ENERGY, self->units,
                 r->bridge == AW_BRIDGE_OK ? r->energy_j : NAN);
  set_label_qty (self->band_range_value, AW_QTY_DISTANCE, self->units,
                 ok && r->status != AW_ANALYSIS_NO_BAND ? r->band.band_range_m : NAN);

  if (ok && isfinite (r->band.lift_ratio))
    {
      g_autofree char *ratio = aw_format_number (r->band.lift_ratio, 2);
      g_autofree char *text = s->hop.mode == AW_HOP_MODE_AUTO
                              /* translators: the lift ratio chosen by auto hop */
                              ? g_strdup_printf (_ ("%s (auto)"), ratio)
                              : g_strdup (ratio);
      gtk_label_set_text (self->hop_used_value, text);
      gtk_label_set_text (self->hop_summary_value, text);
    }
  else
    {
      gtk_label_set_text (self->hop_used_value, "—");
      gtk_label_set_text (self->hop_summary_value, "—");
    }

  if (ok && isfinite (r->band.spin_rad_s))
    {
      g_autofree char *rpm = aw_format_number (round (aw_rad_s_to_rpm (r->band.spin_rad_s)
                                                      / 10.0) * 10.0, 0);
      /* translators: model spin in revolutions per minute */
      g_autofree char *text = g_strdup_printf (_ ("≈ %s rpm"), rpm);
      gtk_label_set_text (self->spin_value, text);
    }
  else
    gtk_label_set_text (self->spin_value, "—");

  show_hop_limit_note (self, s, ok ? r : NULL);

  problem = aw_compute_result_describe_problem (r);
  gtk_label_set_text (self->status_label, problem ? problem : "");
  gtk_widget_set_visible (GTK_WIDGET (self->status_label), problem != NULL);
}

static void
set_dropdown (GtkDropDown *dropdown,
              guint        value)
{
  GListModel *model = gtk_drop_down_get_model (dropdown);

  if (value >= g_list_model_get_n_items (model))
    value = GTK_INVALID_LIST_POSITION;
  if (gtk_drop_down_get_selected (dropdown) != value)
    gtk_drop_down_set_selected (dropdown, value);
}

static void
set_entry_text (GtkEntry   *entry,
                const char *text)
{
  if (g_strcmp0 (gtk_editable_get_text (GTK_EDITABLE (entry)), text) != 0)
    gtk_editable_set_text (GTK_EDITABLE (entry), text ? text : "");
}

static void rebuild_lists (AwSetupEditor *self, const AwSetup *s);

void
aw_setup_editor_refresh (AwSetupEditor *self)
{
  const AwSetup *s;
  const AwProjectConditions *c;
  gboolean own;

  g_return_if_fail (AW_IS_SETUP_EDITOR (self));

  s = current_setup (self);
  gtk_widget_set_sensitive (self->scroller, s != NULL);
  if (s == NULL)
    return;

  self->updating++;
  own = s->conditions != NULL;
  c = own ? s->conditions : &aw_document_get_project (self->document)->conditions;

  for (guint i = 0; i < G_N_ELEMENTS (field_specs); i++)
    aw_number_field_set_value (AW_NUMBER_FIELD (self->fields[i]), field_specs[i].get (s, c));

  if (!gtk_widget_has_focus (GTK_WIDGET (self->name_entry))
      || gtk_revealer_get_reveal_child (self->name_error_revealer) == FALSE)
    {
      g_autofree char *shown = g_strstrip (g_strdup (gtk_editable_get_text (
                                                       GTK_EDITABLE (self->name_entry))));
      if (g_strcmp0 (shown, s->name) != 0)
        set_entry_text (self->name_entry, s->name);
    }
  {
    GdkRGBA rgba, now;
    if (!gdk_rgba_parse (&rgba, s->colour))
      gdk_rgba_parse (&rgba, "#3465a4");
    gtk_color_chooser_get_rgba (GTK_COLOR_CHOOSER (self->colour_button), &now);
    if (!gdk_rgba_equal (&rgba, &now))
      gtk_color_chooser_set_rgba (GTK_COLOR_CHOOSER (self->colour_button), &rgba);
  }
  set_entry_text (self->type_entry, s->replica.type);

  set_dropdown (self->power_dropdown, s->replica.power_source);
  set_dropdown (self->energy_model_dropdown, s->replica.energy_model);
  set_dropdown (self->angle_dropdown, s->sighting.angle_unit);
  set_dropdown (self->drag_dropdown, s->model.drag);
  set_dropdown (self->lift_dropdown, s->model.lift);
  set_dropdown (self->air_source_dropdown, isnan (c->pressure_hpa) ? 1 : 0);
  switch (s->hop.mode)
    {
    case AW_HOP_MODE_AUTO:
      set_dropdown (self->hop_dropdown, 0);
      break;
    case AW_HOP_MODE_LIFT_RATIO:
      set_dropdown (self->hop_dropdown, 1);
      break;
    case AW_HOP_MODE_SPIN:
    default:
      set_dropdown (self->hop_dropdown, 2);
      break;
    }
  gtk_switch_set_active (self->own_conditions_switch, own);

  /* fields that apply only to some choices */
  {
    gboolean measured = s->replica.energy_model == AW_POWER_MEASURED;
    GtkWidget *w;

    w = aw_setup_editor_get_field (self, "creep_field");
    gtk_widget_set_visible (w, s->replica.energy_model == AW_POWER_CREEP);
    gtk_widget_set_visible (aw_setup_editor_get_field (self, "ref_mass_field"), !measured);
    gtk_widget_set_visible (aw_setup_editor_get_field (self, "ref_velocity_field"), !measured);
    gtk_widget_set_visible (GTK_WIDGET (self->points_box), measured);
    rebuild_lists (self, s);

    gtk_widget_set_visible (aw_setup_editor_get_field (self, "lift_ratio_field"),
                            s->hop.mode == AW_HOP_MODE_LIFT_RATIO);
    if (s->hop.mode == AW_HOP_MODE_SPIN)
      {
        g_autofree char *rpm = aw_format_number (s->hop.value, 0);
        g_autofree char *text =
          g_strdup_printf (_ ("This setup's hop is stored as a model spin of %s rpm, which only "
                             "means something with its lift model. Choose Auto or Lift ratio to "
                             "set the hop the usual way."), rpm);
        gtk_label_set_text (self->hop_note_label, text);
      }
    else
      {
        g_autofree char *text =
          g_strdup_printf (_ ("Model spin depends on the lift model (now: %s) and is shown for "
                             "information only."), lift_model_name (s->model.lift));
        gtk_label_set_text (self->hop_note_label, text);
      }

    gtk_widget_set_visible (aw_setup_editor_get_field (self, "pressure_field"),
                            !isnan (c->pressure_hpa));
    gtk_widget_set_visible (aw_setup_editor_get_field (self, "altitude_field"),
                            isnan (c->pressure_hpa));
    gtk_label_set_text (self->conditions_note_label,
                        own ? _ ("Only this setup uses these conditions.")
                            : _ ("These are the project's conditions, shared by every setup "
                                "without its own."));

    gtk_widget_set_visible (aw_setup_editor_get_field (self, "drag_cd_field"),
                            s->model.drag == AW_DRAG_CONSTANT);
    gtk_widget_set_visible (aw_setup_editor_get_field (self, "lift_slope_field"),
                            s->model.lift == AW_LIFT_LINEAR);
  }
  self->updating--;

  show_result (self);
}

static void
document_changed_cb (AwSetupEditor *self,
                     guint          change,
                     int            index)
{
  aw_setup_editor_refresh (self);
}

/* ---- chrono strings and measured points ---- */

static GtkWindow *
parent_window (AwSetupEditor *self)
{
  GtkRoot *root = gtk_widget_get_root (GTK_WIDGET (self));
  return GTK_IS_WINDOW (root) ? GTK_WINDOW (root) : NULL;
}

GtkWindow *
aw_setup_editor_open_chrono (AwSetupEditor *self,
                             int            item)
{
  GtkWindow *dialog;

  g_return_val_if_fail (AW_IS_SETUP_EDITOR (self), NULL);
  if (current_setup (self) == NULL)
    return NULL;
  aw_document_seal (self->document);
  dialog = aw_chrono_dialog_new (parent_window (self), self->document, self->index, item,
                                 self->units);
  gtk_window_present (dialog);
  return dialog;
}

GtkWindow *
aw_setup_editor_open_point (AwSetupEditor *self,
                            int            item)
{
  GtkWindow *dialog;

  g_return_val_if_fail (AW_IS_SETUP_EDITOR (self), NULL);
  if (current_setup (self) == NULL)
    return NULL;
  aw_document_seal (self->document);
  dialog = aw_point_dialog_new (parent_window (self), self->document, self->index, item,
                                self->units);
  gtk_window_present (dialog);
  return dialog;
}

void
aw_setup_editor_delete_chrono (AwSetupEditor *self,
                               int            item)
{
  AwSetup *s = NULL;
  AwProject *p;

  g_return_if_fail (AW_IS_SETUP_EDITOR (self));
  p = begin_edit (self, &s);
  if (p == NULL)
    return;
  if (item < 0 || (guint) item >= s->chrono->len)
    {
      aw_project_free (p);
      return;
    }
  g_ptr_array_remove_index (s->chrono, item);
  commit (self, p, _ ("Delete chrono string"), NULL);
}

void
aw_setup_editor_delete_point (AwSetupEditor *self,
                              int            item)
{
  AwSetup *s = NULL;
  AwProject *p;

  g_return_if_fail (AW_IS_SETUP_EDITOR (self));
  p = begin_edit (self, &s);
  if (p == NULL)
    return;
  /* the measured model needs one point at least */
  if (item < 0 || (guint) item >= s->replica.points->len
      || (s->replica.energy_model == AW_POWER_MEASURED && s->replica.points->len <= 1))
    {
      aw_project_free (p);
      return;
    }
  g_array_remove_index (s->replica.points, item);
  commit (self, p, _ ("Delete measured point"), NULL);
}

static int
row_item (GtkWidget *button)
{
  return GPOINTER_TO_INT (g_object_get_data (G_OBJECT (button), "aw-item"));
}

static void
chrono_edit_cb (GtkWidget     *button,
                AwSetupEditor *self)
{
  aw_setup_editor_open_chrono (self, row_item (button));
}

static void
chrono_delete_cb (GtkWidget     *button,
                  AwSetupEditor *self)
{
  aw_setup_editor_delete_chrono (self, row_item (button));
}

static void
point_edit_cb (GtkWidget     *button,
               AwSetupEditor *self)
{
  aw_setup_editor_open_point (self, row_item (button));
}

static void
point_delete_cb (GtkWidget     *button,
                 AwSetupEditor *self)
{
  aw_setup_editor_delete_point (self, row_item (button));
}

static void
row_activated_cb (GtkListBox    *list,
                  GtkListBoxRow *row,
                  AwSetupEditor *self)
{
  int item = gtk_list_box_row_get_index (row);

  if (list == self->chrono_list)
    aw_setup_editor_open_chrono (self, item);
  else
    aw_setup_editor_open_point (self, item);
}

static void
add_chrono_cb (AwSetupEditor *self)
{
  aw_setup_editor_open_chrono (self, -1);
}

static void
add_point_cb (AwSetupEditor *self)
{
  aw_setup_editor_open_point (self, -1);
}

static GtkWidget *
icon_button (const char *icon,
             const char *tooltip,
             int         item,
             GCallback   cb,
             gpointer    data)
{
  GtkWidget *b = gtk_button_new_from_icon_name (icon);

  gtk_widget_add_css_class (b, "flat");
  gtk_widget_set_valign (b, GTK_ALIGN_CENTER);
  gtk_widget_set_tooltip_text (b, tooltip);
  gtk_accessible_update_property (GTK_ACCESSIBLE (b), GTK_ACCESSIBLE_PROPERTY_LABEL, tooltip, -1);
  g_object_set_data (G_OBJECT (b), "aw-item", GINT_TO_POINTER (item));
  g_signal_connect (b, "clicked", cb, data);
  return b;
}

static void
list_clear (GtkListBox *list)
{
  GtkWidget *child;

  while ((child = gtk_widget_get_first_child (GTK_WIDGET (list))) != NULL)
    gtk_list_box_remove (list, child);
}

static void
list_add_row (GtkListBox *list,
              const char *text,
              GtkWidget  *edit,
              GtkWidget  *del)
{
  GtkWidget *box = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 2);
  GtkWidget *label = gtk_label_new (text);

  gtk_label_set_xalign (GTK_LABEL (label), 0);
  /* lines are short and end in an ellipsis when the panel is narrow (the full text is the
   * tooltip): a wrapping label would ask for more height at some widths than at others */
  gtk_label_set_ellipsize (GTK_LABEL (label), PANGO_ELLIPSIZE_END);
  gtk_widget_set_tooltip_text (label, text);
  gtk_widget_set_hexpand (label, TRUE);
  gtk_widget_add_css_class (label, "caption");
  gtk_widget_set_margin_start (box, 6);
  gtk_widget_set_margin_top (box, 4);
  gtk_widget_set_margin_bottom (box, 4);
  gtk_box_append (GTK_BOX (box), label);
  gtk_box_append (GTK_BOX (box), edit);
  gtk_box_append (GTK_BOX (box), del);
  gtk_list_box_append (list, box);
}

/* One chrono string in a line or two: BB mass (always with the velocities), hop, n, mean in the
 * string's unit (and in the window's unit when that differs), energy, SD and ES. */
static char *
chrono_row_text (AwSetupEditor        *self,
                 const AwChronoString *c)
{
  AwChronoStats st;
  g_autofree char *mass = aw_qty_format (AW_QTY_MASS_G, self->units, c->bb_mass_g);
  const char *hop = c->hop == AW_CHRONO_HOP_ON ? _ ("hop on")
                    : c->hop == AW_CHRONO_HOP_OFF ? _ ("hop off") : _ ("hop not recorded");
  gboolean fps = c->unit == AW_VELOCITY_UNIT_FPS;
  double k = fps ? 1.0 / 0.3048 : 1.0;
  const char *sym = fps ? "fps" : "m/s";

  if (!aw_chrono_string_stats (c, &st))
    /* translators: a chrono string that has no usable shots, %s is the BB mass */
    return g_strdup_printf (_ ("%s: no usable shots"), mass);
  {
    g_autofree char *mean = aw_format_number (st.mean_mps * k, 1);
    g_autofree char *sd = aw_format_number (st.sd_mps * k, 2);
    g_autofree char *es = aw_format_number (st.es_mps * k, 1);
    g_autofree char *energy = aw_qty_format (AW_QTY_ENERGY, self->units, st.energy_mean_j);
    g_autofree char *other = NULL;
    gboolean differs = (self->units == AW_UNITS_IMPERIAL) != fps;

    if (differs)
      {
        g_autofree char *o = aw_qty_format (AW_QTY_VELOCITY, self->units, st.mean_mps);
        other = g_strdup_printf (" (%s)", o);
      }
    /* translators: one chrono string: BB mass, hop state, shots; then mean velocity with its
     * unit, the mean in the window's unit when it differs, mean energy, SD and ES */
    return g_strdup_printf (g_dngettext (GETTEXT_PACKAGE,
                                         "%s · %s · %u shot\nmean %s %s%s\n≈ %s · SD %s · ES %s %s",
                                         "%s · %s · %u shots\nmean %s %s%s\n≈ %s · SD %s · ES %s %s",
                                         st.n),
                            mass, hop, st.n, mean, sym, other ? other : "", energy, sd, es, sym);
  }
}

static void
rebuild_lists (AwSetupEditor *self,
               const AwSetup *s)
{
  GString *all = g_string_new (NULL);
  g_autoptr (GPtrArray) texts = g_ptr_array_new_with_free_func (g_free);
  gboolean can_delete_point = s->replica.energy_model != AW_POWER_MEASURED
                              || s->replica.points->len > 1;

  /* chrono strings */
  for (guint i = 0; i < s->chrono->len; i++)
    {
      char *t = chrono_row_text (self, g_ptr_array_index (s->chrono, i));
      g_string_append (all, t);
      g_string_append_c (all, '\x1f');
      g_ptr_array_add (texts, t);
    }
  if (g_strcmp0 (all->str, self->chrono_shown) != 0)
    {
      list_clear (self->chrono_list);
      for (guint i = 0; i < texts->len; i++)
        list_add_row (self->chrono_list, texts->pdata[i],
                      icon_button ("document-edit-symbolic", _ ("Edit chrono string"), i,
                                   G_CALLBACK (chrono_edit_cb), self),
                      icon_button ("user-trash-symbolic", _ ("Delete chrono string"), i,
                                   G_CALLBACK (chrono_delete_cb), self));
      gtk_widget_set_visible (GTK_WIDGET (self->chrono_list), texts->len > 0);
      g_free (self->chrono_shown);
      self->chrono_shown = g_strdup (all->str);
    }

  /* measured points */
  g_string_truncate (all, 0);
  g_ptr_array_set_size (texts, 0);
  g_string_append_c (all, can_delete_point ? 'd' : '-');
  for (guint i = 0; i < s->replica.points->len; i++)
    {
      const AwReplicaPoint *pt = &g_array_index (s->replica.points, AwReplicaPoint, i);
      g_autofree char *m = aw_qty_format (AW_QTY_MASS_G, self->units, pt->mass_g);
      g_autofree char *v = aw_qty_format (AW_QTY_VELOCITY, self->units, pt->velocity_mps);
      g_autofree char *e = aw_qty_format (AW_QTY_ENERGY, self->units,
                                          0.5 * pt->mass_g * 1e-3 * pt->velocity_mps
                                          * pt->velocity_mps);
      char *t = g_strdup_printf ("%s → %s (%s)", m, v, e);
      g_string_append (all, t);
      g_string_append_c (all, '\x1f');
      g_ptr_array_add (texts, t);
    }
  if (g_strcmp0 (all->str, self->points_shown) != 0)
    {
      list_clear (self->points_list);
      for (guint i = 0; i < texts->len; i++)
        {
          GtkWidget *del = icon_button ("user-trash-symbolic", _ ("Delete measured point"), i,
                                        G_CALLBACK (point_delete_cb), self);
          gtk_widget_set_sensitive (del, can_delete_point);
          if (!can_delete_point)
            gtk_widget_set_tooltip_text (del, _ ("The measured model needs one point at least."));
          list_add_row (self->points_list, texts->pdata[i],
                        icon_button ("document-edit-symbolic", _ ("Edit measured point"), i,
                                     G_CALLBACK (point_edit_cb), self),
                        del);
        }
      g_free (self->points_shown);
      self->points_shown = g_strdup (all->str);
    }
  gtk_widget_set_sensitive (self->add_point_button, s->replica.points->len < 100);
  g_string_free (all, TRUE);
}

static GtkListBox *
build_one_list (AwSetupEditor *self,
                GtkBox        *box,
                const char    *heading,
                const char    *add_label,
                GCallback      add_cb,
                GtkWidget    **add_button)
{
  GtkWidget *top = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 6);
  GtkWidget *label = gtk_label_new (heading);
  GtkWidget *add = gtk_button_new_with_mnemonic (add_label);
  GtkWidget *list = gtk_list_box_new ();

  gtk_label_set_xalign (GTK_LABEL (label), 0);
  gtk_label_set_wrap (GTK_LABEL (label), TRUE);
  gtk_widget_set_hexpand (label, TRUE);
  gtk_widget_add_css_class (label, "dim-label");
  gtk_widget_add_css_class (add, "flat");
  gtk_widget_set_valign (add, GTK_ALIGN_CENTER);
  g_signal_connect_swapped (add, "clicked", add_cb, self);
  gtk_box_append (GTK_BOX (top), label);
  gtk_box_append (GTK_BOX (top), add);
  gtk_box_append (box, top);

  gtk_list_box_set_selection_mode (GTK_LIST_BOX (list), GTK_SELECTION_NONE);
  gtk_list_box_set_activate_on_single_click (GTK_LIST_BOX (list), FALSE);
  gtk_widget_add_css_class (list, "frame");
  gtk_accessible_update_property (GTK_ACCESSIBLE (list), GTK_ACCESSIBLE_PROPERTY_LABEL, heading,
                                  -1);
  g_signal_connect (list, "row-activated", G_CALLBACK (row_activated_cb), self);
  gtk_box_append (box, list);
  if (add_button)
    *add_button = add;
  return GTK_LIST_BOX (list);
}

static void
build_list_boxes (AwSetupEditor *self)
{
  self->points_list = build_one_list (self, self->points_box, _ ("Measured with each BB"),
                                      _ ("Add _Point…"), G_CALLBACK (add_point_cb),
                                      &self->add_point_button);
  self->chrono_list = build_one_list (self, self->chrono_box, _ ("Chrono strings"),
                                      _ ("Add _String…"), G_CALLBACK (add_chrono_cb), NULL);
  gtk_widget_set_margin_top (GTK_WIDGET (self->chrono_box), 4);
}

/* ---- class ---- */

static void
aw_setup_editor_dispose (GObject *object)
{
  AwSetupEditor *self = AW_SETUP_EDITOR (object);

  if (self->document)
    g_signal_handlers_disconnect_by_data (self->document, self);
  g_clear_object (&self->document);
  g_clear_pointer (&self->result, aw_compute_result_unref);
  g_clear_pointer (&self->points_shown, g_free);
  g_clear_pointer (&self->chrono_shown, g_free);
  gtk_widget_dispose_template (GTK_WIDGET (self), AW_TYPE_SETUP_EDITOR);
  {
    GtkWidget *child;
    while ((child = gtk_widget_get_first_child (GTK_WIDGET (self))) != NULL)
      gtk_widget_unparent (child);
  }
  G_OBJECT_CLASS (aw_setup_editor_parent_class)->dispose (object);
}

static void
aw_setup_editor_class_init (AwSetupEditorClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->dispose = aw_setup_editor_dispose;

  g_type_ensure (AW_TYPE_NUMBER_FIELD);
  gtk_widget_class_set_template_from_resource (widget_class,
                                               "/io/github/arcwright/Arcwright/aw-setup-editor.ui");
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, scroller);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, name_entry);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, colour_button);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, name_error_revealer);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, name_error_label);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, band_range_value);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, energy_value);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, velocity_value);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, hop_summary_value);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, status_label);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, type_entry);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, power_dropdown);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, energy_model_dropdown);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, points_box);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, chrono_box);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, hop_dropdown);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, hop_used_value);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, spin_value);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, hop_note_label);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, hop_limit_note_label);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, angle_dropdown);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, own_conditions_switch);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, conditions_note_label);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, air_source_dropdown);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, model_note_label);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, drag_dropdown);
  gtk_widget_class_bind_template_child (widget_class, AwSetupEditor, lift_dropdown);
  /* the number fields are reached by id (aw_setup_editor_get_field) */
  for (guint i = 0; i < G_N_ELEMENTS (field_specs); i++)
    gtk_widget_class_bind_template_child_full (widget_class, field_specs[i].id, FALSE, 0);
  gtk_widget_class_bind_template_callback (widget_class, name_changed_cb);
  gtk_widget_class_bind_template_callback (widget_class, colour_changed_cb);
  gtk_widget_class_set_layout_manager_type (widget_class, GTK_TYPE_BIN_LAYOUT);
  gtk_widget_class_set_css_name (widget_class, "awsetupeditor");
}

static void
aw_setup_editor_init (AwSetupEditor *self)
{
  GtkDropDown *dropdowns[7];

  self->index = -1;
  gtk_widget_init_template (GTK_WIDGET (self));

  for (guint i = 0; i < G_N_ELEMENTS (field_specs); i++)
    {
      const FieldSpec *spec = &field_specs[i];
      AwNumberField *field;

      self->fields[i] = GTK_WIDGET (gtk_widget_get_template_child (GTK_WIDGET (self),
                                                                   AW_TYPE_SETUP_EDITOR,
                                                                   spec->id));
      g_assert (AW_IS_NUMBER_FIELD (self->fields[i]));
      field = AW_NUMBER_FIELD (self->fields[i]);
      aw_number_field_set_quantity (field, spec->quantity);
      aw_number_field_set_range (field, spec->min, spec->max);
      aw_number_field_set_help (field, _ (spec->help));
      if (spec->allow_empty)
        aw_number_field_set_allow_empty (field, TRUE, _ (spec->empty_text));
      g_object_set_data (G_OBJECT (field), "aw-field-spec", (gpointer) spec);
      g_signal_connect (field, "value-changed", G_CALLBACK (field_value_changed_cb), self);
    }
  aw_number_field_set_digits (
    AW_NUMBER_FIELD (aw_setup_editor_get_field (self, "lift_slope_field")), 3);
  aw_number_field_set_digits (AW_NUMBER_FIELD (aw_setup_editor_get_field (self, "tilt_field")), 1);

  dropdowns[0] = self->power_dropdown;
  dropdowns[1] = self->energy_model_dropdown;
  dropdowns[2] = self->hop_dropdown;
  dropdowns[3] = self->angle_dropdown;
  dropdowns[4] = self->air_source_dropdown;
  dropdowns[5] = self->drag_dropdown;
  dropdowns[6] = self->lift_dropdown;
  for (guint i = 0; i < G_N_ELEMENTS (dropdowns); i++)
    g_signal_connect (dropdowns[i], "notify::selected", G_CALLBACK (dropdown_changed_cb), self);
  g_signal_connect_swapped (self->own_conditions_switch, "notify::active",
                            G_CALLBACK (own_conditions_cb), self);
  g_signal_connect_swapped (self->type_entry, "changed", G_CALLBACK (type_changed_cb), self);

  gtk_label_set_text (self->model_note_label,
                      _ ("A flight cannot tell a steep lift slope with little spin from a shallow "
                        "one with much spin, so hop is set as a lift ratio. Calibration factors "
                        "of 1 use the models as published; a field fit adjusts them."));
  gtk_accessible_update_property (GTK_ACCESSIBLE (self->colour_button),
                                  GTK_ACCESSIBLE_PROPERTY_LABEL, _ ("Setup colour"), -1);
  build_list_boxes (self);
  gtk_widget_set_sensitive (self->scroller, FALSE);
}

GtkWidget *
aw_setup_editor_new (void)
{
  return g_object_new (AW_TYPE_SETUP_EDITOR, NULL);
}

void
aw_setup_editor_set_document (AwSetupEditor *self,
                              AwDocument    *document)
{
  g_return_if_fail (AW_IS_SETUP_EDITOR (self));

  if (self->document == document)
    return;
  if (self->document)
    g_signal_handlers_disconnect_by_data (self->document, self);
  g_set_object (&self->document, document);
  if (document)
    g_signal_connect_object (document, "changed", G_CALLBACK (document_changed_cb), self,
                             G_CONNECT_SWAPPED | G_CONNECT_AFTER);
  g_clear_pointer (&self->result, aw_compute_result_unref);
  self->index = -1;
  aw_setup_editor_refresh (self);
}

void
aw_setup_editor_set_index (AwSetupEditor *self,
                           int            index)
{
  g_return_if_fail (AW_IS_SETUP_EDITOR (self));

  if (self->index == index)
    return;
  self->index = index;
  g_clear_pointer (&self->result, aw_compute_result_unref);
  /* a half-typed name of the previous setup must not stick */
  gtk_revealer_set_reveal_child (self->name_error_revealer, FALSE);
  gtk_widget_remove_css_class (GTK_WIDGET (self->name_entry), "error");
  self->updating++;
  if (current_setup (self))
    set_entry_text (self->name_entry, current_setup (self)->name);
  self->updating--;
  if (self->document)
    aw_document_seal (self->document);
  aw_setup_editor_refresh (self);
}

int
aw_setup_editor_get_index (AwSetupEditor *self)
{
  g_return_val_if_fail (AW_IS_SETUP_EDITOR (self), -1);
  return self->index;
}

void
aw_setup_editor_set_units (AwSetupEditor *self,
                           AwUnitSystem   units)
{
  g_return_if_fail (AW_IS_SETUP_EDITOR (self));

  if (self->units == units)
    return;
  self->units = units;
  self->updating++;
  for (guint i = 0; i < G_N_ELEMENTS (field_specs); i++)
    aw_number_field_set_units (AW_NUMBER_FIELD (self->fields[i]), units);
  self->updating--;
  aw_setup_editor_refresh (self);
}

void
aw_setup_editor_set_result (AwSetupEditor   *self,
                            AwComputeResult *result)
{
  g_return_if_fail (AW_IS_SETUP_EDITOR (self));

  if (result)
    aw_compute_result_ref (result);
  g_clear_pointer (&self->result, aw_compute_result_unref);
  self->result = result;
  show_result (self);
}

void
aw_setup_editor_focus_name (AwSetupEditor *self)
{
  g_return_if_fail (AW_IS_SETUP_EDITOR (self));
  gtk_widget_grab_focus (GTK_WIDGET (self->name_entry));
}

GtkWidget *
aw_setup_editor_get_field (AwSetupEditor *self,
                           const char    *id)
{
  g_return_val_if_fail (AW_IS_SETUP_EDITOR (self), NULL);
  return GTK_WIDGET (gtk_widget_get_template_child (GTK_WIDGET (self), AW_TYPE_SETUP_EDITOR, id));
}
