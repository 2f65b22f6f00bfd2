/* aw-chrono-dialog.c: small dialogs editing one chrono string or one measured point of a setup
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <glib/gi18n.h>
#include <math.h>
#include <string.h>

#include "aw-chrono-dialog.h"
#include "aw-number-field.h"
#include "aw-project-io.h"
#include "aw-units.h"

/* the ranges of data/FORMAT.md (core/aw-project-io.c) */
#define SHOTS_MAX        10000
#define POINTS_MAX       100
#define MASS_MIN_G       0.05
#define MASS_MAX_G       2.0
#define MPS_MIN          1.0
#define MPS_MAX          300.0
#define FPS_MIN          3.0
#define FPS_MAX          985.0
#define TEMP_MIN_C       (-40.0)
#define TEMP_MAX_C       60.0
#define FPS_TO_MPS       0.3048

typedef enum
{
  KIND_CHRONO,
  KIND_POINT,
} Kind;

typedef struct
{
  Kind kind;
  AwDocument *document;
  int setup;
  int item;
  AwUnitSystem units;
  GHashTable *widgets;       /* name → GtkWidget* (not owned) */
} Dialog;

static void
dialog_free (gpointer data)
{
  Dialog *d = data;

  g_clear_object (&d->document);
  g_hash_table_unref (d->widgets);
  g_free (d);
}

static Dialog *
dialog_of (GtkWindow *window)
{
  return g_object_get_data (G_OBJECT (window), "aw-edit-dialog");
}

GtkWidget *
aw_edit_dialog_get_widget (GtkWindow  *dialog,
                           const char *name)
{
  Dialog *d = dialog_of (dialog);

  g_return_val_if_fail (d != NULL, NULL);
  return g_hash_table_lookup (d->widgets, name);
}

static void
put (Dialog     *d,
     const char *name,
     GtkWidget  *w)
{
  g_hash_table_insert (d->widgets, (gpointer) name, w);
}

static GtkWidget *
get (Dialog     *d,
     const char *name)
{
  return g_hash_table_lookup (d->widgets, name);
}

/* ---- shots ---- */

static gboolean
decimal_comma (void)
{
  g_autofree char *half = aw_format_number (0.5, 1);
  return strchr (half, ',') != NULL;
}

const char *
aw_chrono_shots_hint (void)
{
  if (decimal_comma ())
    return _ ("One velocity per shot, separated by spaces, semicolons or new lines.");
  return _ ("One velocity per shot, separated by spaces, commas or new lines.");
}

gboolean
aw_chrono_parse_shots (const char     *text,
                       AwVelocityUnit  unit,
                       GArray         *velocities,
                       char          **problem)
{
  const char *seps = decimal_comma () ? " \t\r\n;" : " \t\r\n;,";
  double lo = unit == AW_VELOCITY_UNIT_FPS ? FPS_MIN : MPS_MIN;
  double hi = unit == AW_VELOCITY_UNIT_FPS ? FPS_MAX : MPS_MAX;
  const char *symbol = unit == AW_VELOCITY_UNIT_FPS ? "fps" : "m/s";
  g_auto (GStrv) tokens = g_strsplit_set (text ? text : "", seps, -1);
  guint n = 0;

  g_array_set_size (velocities, 0);
  for (guint i = 0; tokens[i] != NULL; i++)
    {
      double v;

      if (tokens[i][0] == '\0')
        continue;
      n++;
      if (n > SHOTS_MAX)
        {
          if (problem)
            *problem = g_strdup_printf (_ ("At most %u shots fit in one chrono string."),
                                        (guint) SHOTS_MAX);
          return FALSE;
        }
      if (!aw_parse_number (tokens[i], &v))
        {
          if (problem)
            /* translators: %u is the shot number, %s what was typed */
            *problem = g_strdup_printf (_ ("Shot %u: “%s” is not a number."), n, tokens[i]);
          return FALSE;
        }
      if (v < lo || v > hi)
        {
          if (problem)
            {
              g_autofree char *a = aw_format_number (lo, 0);
              g_autofree char *b = aw_format_number (hi, 0);
              /* translators: shot number, what was typed, lowest, highest, unit */
              *problem = g_strdup_printf (_ ("Shot %u: %s is outside %s … %s %s."), n,
                                          tokens[i], a, b, symbol);
            }
          return FALSE;
        }
      g_array_append_val (velocities, v);
    }
  if (n == 0)
    {
      if (problem)
        *problem = g_strdup (_ ("Enter the velocity of at least one shot."));
      return FALSE;
    }
  return TRUE;
}

/* ---- chrono string ---- */

static gboolean
date_ok (const char *s)
{
  int y, m, dd;
  char tail;

  if (s[0] == '\0')
    return TRUE;
  if (sscanf (s, "%4d-%2d-%2d%c", &y, &m, &dd, &tail) == 3 && strlen (s) == 10)
    return g_date_valid_dmy ((GDateDay) dd, (GDateMonth) m, (GDateYear) y);
  {
    g_autoptr (GTimeZone) utc = g_time_zone_new_utc ();
    GDateTime *dt = g_date_time_new_from_iso8601 (s, utc);
    if (dt == NULL)
      return FALSE;
    g_date_time_unref (dt);
    return TRUE;
  }
}

static char *
dup_text_view (GtkWidget *view)
{
  GtkTextBuffer *buf = gtk_text_view_get_buffer (GTK_TEXT_VIEW (view));
  GtkTextIter a, b;

  gtk_text_buffer_get_bounds (buf, &a, &b);
  return gtk_text_buffer_get_text (buf, &a, &b, FALSE);
}

static void
set_problem (GtkWidget  *widget,
             const char *problem)
{
  if (problem != NULL)
    {
      gtk_widget_add_css_class (widget, "error");
      gtk_accessible_update_state (GTK_ACCESSIBLE (widget), GTK_ACCESSIBLE_STATE_INVALID,
                                   GTK_ACCESSIBLE_INVALID_TRUE, -1);
    }
  else
    {
      gtk_widget_remove_css_class (widget, "error");
      gtk_accessible_reset_state (GTK_ACCESSIBLE (widget), GTK_ACCESSIBLE_STATE_INVALID);
    }
}

static char *
fmt_vel (double mps,
         AwVelocityUnit unit,
         int digits)
{
  g_autofree char *num = aw_format_number (unit == AW_VELOCITY_UNIT_FPS ? mps / FPS_TO_MPS : mps,
                                           digits);
  return g_strdup_printf ("%s\u202f%s", num, unit == AW_VELOCITY_UNIT_FPS ? "fps" : "m/s");
}

/* Builds the chrono string from the controls; NULL (and *problem) when a value is refused. */
static AwChronoString *
chrono_from_controls (Dialog  *d,
                      char   **problem,
                      gboolean *shots_bad)
{
  g_autoptr (AwChronoString) c = aw_chrono_string_new ();
  AwNumberField *mass = AW_NUMBER_FIELD (get (d, "mass"));
  AwNumberField *temp = AW_NUMBER_FIELD (get (d, "temperature"));
  const char *date = gtk_editable_get_text (GTK_EDITABLE (get (d, "date")));
  g_autofree char *date_s = g_strstrip (g_strdup (date));
  g_autofree char *shots = dup_text_view (get (d, "shots"));
  guint hop = gtk_drop_down_get_selected (GTK_DROP_DOWN (get (d, "hop")));

  *shots_bad = FALSE;
  c->unit = gtk_drop_down_get_selected (GTK_DROP_DOWN (get (d, "unit"))) == 1
            ? AW_VELOCITY_UNIT_FPS : AW_VELOCITY_UNIT_MPS;
  if (!aw_chrono_parse_shots (shots, c->unit, c->velocities, problem))
    {
      *shots_bad = TRUE;
      return NULL;
    }
  if (!aw_number_field_is_valid (mass))
    {
      *problem = g_strdup_printf (_ ("BB mass: %s"), aw_number_field_get_error (mass));
      return NULL;
    }
  if (!aw_number_field_is_valid (temp))
    {
      *problem = g_strdup_printf (_ ("Temperature: %s"), aw_number_field_get_error (temp));
      return NULL;
    }
  if (!date_ok (date_s))
    {
      *problem = g_strdup (_ ("Date: write it as year-month-day, e.g. 2024-05-18."));
      return NULL;
    }
  c->bb_mass_g = aw_number_field_get_value (mass);
  c->temperature_c = aw_number_field_get_value (temp);
  c->hop = hop == 1 ? AW_CHRONO_HOP_OFF : hop == 2 ? AW_CHRONO_HOP_ON : AW_CHRONO_HOP_UNSPECIFIED;
  c->date = date_s[0] ? g_strdup (date_s) : NULL;
  g_free (c->note);
  c->note = g_strdup (gtk_editable_get_text (GTK_EDITABLE (get (d, "note"))));
  return g_steal_pointer (&c);
}

static void
chrono_update (Dialog *d)
{
  g_autofree char *problem = NULL;
  gboolean shots_bad = FALSE;
  g_autoptr (AwChronoString) c = chrono_from_controls (d, &problem, &shots_bad);
  GtkWidget *message = get (d, "message");
  GtkWidget *stats = get (d, "stats");
  GtkWidget *shots = get (d, "shots");

  gtk_label_set_text (GTK_LABEL (message), problem ? problem : "");
  gtk_widget_set_visible (message, problem != NULL);
  set_problem (shots, shots_bad ? problem : NULL);
  set_problem (gtk_widget_get_parent (shots), shots_bad ? problem : NULL);
  if (shots_bad)
    gtk_accessible_update_property (GTK_ACCESSIBLE (shots), GTK_ACCESSIBLE_PROPERTY_DESCRIPTION,
                                    problem, -1);
  else
    gtk_accessible_reset_property (GTK_ACCESSIBLE (shots), GTK_ACCESSIBLE_PROPERTY_DESCRIPTION);
  {
    const char *date = gtk_editable_get_text (GTK_EDITABLE (get (d, "date")));
    g_autofree char *date_s = g_strstrip (g_strdup (date));
    set_problem (get (d, "date"), date_ok (date_s) ? NULL : "bad");
  }
  gtk_widget_set_sensitive (get (d, "ok"), c != NULL);

  if (c == NULL && shots_bad)
    {
      gtk_label_set_text (GTK_LABEL (stats), _ ("No statistics until every shot is read."));
      return;
    }
  if (c != NULL)
    {
      AwChronoStats st;
      if (aw_chrono_string_stats (c, &st))
        {
          g_autofree char *mean = fmt_vel (st.mean_mps, c->unit, 1);
          g_autofree char *min = fmt_vel (st.min_mps, c->unit, 1);
          g_autofree char *max = fmt_vel (st.max_mps, c->unit, 1);
          g_autofree char *sd = isnan (st.sd_mps) ? g_strdup ("—") : fmt_vel (st.sd_mps, c->unit, 2);
          g_autofree char *es = fmt_vel (st.es_mps, c->unit, 1);
          g_autofree char *mass = aw_qty_format (AW_QTY_MASS_G, d->units, c->bb_mass_g);
          g_autofree char *em = aw_qty_format (AW_QTY_ENERGY, d->units, st.energy_mean_j);
          g_autofree char *ex = aw_qty_format (AW_QTY_ENERGY, d->units, st.energy_max_j);
          GString *s = g_string_new (NULL);

          /* translators: chrono statistics; n shots, mean, min, max, SD, ES */
          g_string_append_printf (s, _ ("n %u · mean %s · min %s · max %s\nSD %s · ES %s"),
                                  st.n, mean, min, max, sd, es);
          g_string_append_c (s, '\n');
          /* translators: BB mass, energy at the mean velocity, energy at the highest */
          g_string_append_printf (s, _ ("With %s BBs: %s at the mean, %s at the max"),
                                  mass, em, ex);
          if (st.n < 10)
            {
              g_string_append_c (s, '\n');
              g_string_append (s, _ ("Fewer than 10 shots: chronograph at least 10 for a "
                                     "reliable mean and spread."));
            }
          gtk_label_set_text (GTK_LABEL (stats), s->str);
          g_string_free (s, TRUE);
        }
    }
}

static gboolean
push_edit (Dialog     *d,
           AwProject  *p,
           const char *label)
{
  g_autoptr (GPtrArray) problems = g_ptr_array_new_with_free_func (g_free);

  if (!aw_project_validate (p, problems))
    {
      g_autofree char *all = aw_project_problems_join (problems);
      GtkWidget *message = get (d, "message");
      g_autofree char *text = g_strdup_printf (_ ("The project would not load again: %s"), all);
      gtk_label_set_text (GTK_LABEL (message), text);
      gtk_widget_set_visible (message, TRUE);
      aw_project_free (p);
      return FALSE;
    }
  aw_document_push (d->document, p, label, NULL, d->setup, d->setup);
  return TRUE;
}

static gboolean
chrono_accept (Dialog *d)
{
  g_autofree char *problem = NULL;
  gboolean shots_bad;
  AwChronoString *c = chrono_from_controls (d, &problem, &shots_bad);
  const AwProject *cur = aw_document_get_project (d->document);
  AwProject *p;
  AwSetup *s;

  if (c == NULL)
    {
      chrono_update (d);
      return FALSE;
    }
  if (d->setup < 0 || (guint) d->setup >= cur->setups->len)
    {
      aw_chrono_string_free (c);
      return FALSE;
    }
  p = aw_project_copy (cur);
  s = g_ptr_array_index (p->setups, d->setup);
  if (d->item >= 0 && (guint) d->item < s->chrono->len)
    {
      AwChronoString *old = g_ptr_array_index (s->chrono, d->item);
      /* members this version does not know stay with the string */
      if (old->extra)
        c->extra = json_object_ref (old->extra);
      aw_chrono_string_free (old);
      s->chrono->pdata[d->item] = c;
      return push_edit (d, p, _ ("Edit chrono string"));
    }
  g_ptr_array_add (s->chrono, c);
  return push_edit (d, p, _ ("Add chrono string"));
}

/* ---- measured point ---- */

static gboolean
point_values (Dialog  *d,
              double  *mass,
              double  *velocity,
              char   **problem)
{
  AwNumberField *mf = AW_NUMBER_FIELD (get (d, "mass"));
  AwNumberField *vf = AW_NUMBER_FIELD (get (d, "velocity"));
  const AwProject *p = aw_document_get_project (d->document);
  const AwSetup *s;

  if (!aw_number_field_is_valid (mf))
    {
      *problem = g_strdup_printf (_ ("BB mass: %s"), aw_number_field_get_error (mf));
      return FALSE;
    }
  if (!aw_number_field_is_valid (vf))
    {
      *problem = g_strdup_printf (_ ("Velocity: %s"), aw_number_field_get_error (vf));
      return FALSE;
    }
  *mass = aw_number_field_get_value (mf);
  *velocity = aw_number_field_get_value (vf);
  if (d->setup < 0 || (guint) d->setup >= p->setups->len)
    return FALSE;
  s = g_ptr_array_index (p->setups, d->setup);
  for (guint i = 0; i < s->replica.points->len; i++)
    if ((int) i != d->item && g_array_index (s->replica.points, AwReplicaPoint, i).mass_g == *mass)
      {
        g_autofree char *m = aw_qty_format (AW_QTY_MASS_G, d->units, *mass);
        *problem = g_strdup_printf (_ ("There is already a point measured with %s."), m);
        return FALSE;
      }
  if (d->item < 0 && s->replica.points->len >= POINTS_MAX)
    {
      *problem = g_strdup_printf (_ ("At most %u measured points."), (guint) POINTS_MAX);
      return FALSE;
    }
  return TRUE;
}

static void
point_update (Dialog *d)
{
  g_autofree char *problem = NULL;
  double m = NAN, v = NAN;
  gboolean ok = point_values (d, &m, &v, &problem);
  GtkWidget *message = get (d, "message");

  gtk_label_set_text (GTK_LABEL (message), problem ? problem : "");
  gtk_widget_set_visible (message, problem != NULL);
  gtk_widget_set_sensitive (get (d, "ok"), ok);
  if (ok)
    {
      g_autofree char *e = aw_qty_format (AW_QTY_ENERGY, d->units, 0.5 * m * 1e-3 * v * v);
      g_autofree char *text = g_strdup_printf (_ ("Energy: %s"), e);
      gtk_label_set_text (GTK_LABEL (get (d, "stats")), text);
    }
  else
    gtk_label_set_text (GTK_LABEL (get (d, "stats")), "");
}

static gboolean
point_accept (Dialog *d)
{
  g_autofree char *problem = NULL;
  double m, v;
  AwProject *p;
  AwSetup *s;

  if (!point_values (d, &m, &v, &problem))
    {
      point_update (d);
      return FALSE;
    }
  p = aw_project_copy (aw_document_get_project (d->document));
  s = g_ptr_array_index (p->setups, d->setup);
  if (d->item >= 0 && (guint) d->item < s->replica.points->len)
    {
      AwReplicaPoint *pt = &g_array_index (s->replica.points, AwReplicaPoint, d->item);
      pt->mass_g = m;
      pt->velocity_mps = v;
      return push_edit (d, p, _ ("Edit measured point"));
    }
  {
    AwReplicaPoint pt = { m, v, NULL };
    g_array_append_val (s->replica.points, pt);
  }
  return push_edit (d, p, _ ("Add measured point"));
}

/* ---- common ---- */

gboolean
aw_edit_dialog_accept (GtkWindow *dialog)
{
  Dialog *d = dialog_of (dialog);
  gboolean ok;

  g_return_val_if_fail (d != NULL, FALSE);
  ok = d->kind == KIND_CHRONO ? chrono_accept (d) : point_accept (d);
  if (ok)
    gtk_window_destroy (dialog);
  return ok;
}

static void
ok_clicked_cb (GtkWindow *dialog)
{
  aw_edit_dialog_accept (dialog);
}

static void
update_cb (GtkWindow *dialog)
{
  Dialog *d = dialog_of (dialog);

  if (d == NULL)
    return;
  if (d->kind == KIND_CHRONO)
    chrono_update (d);
  else
    point_update (d);
}

static GtkWidget *
labelled (const char *text,
          GtkWidget  *control)
{
  GtkWidget *box = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 8);
  GtkWidget *label = gtk_label_new_with_mnemonic (text);

  gtk_label_set_xalign (GTK_LABEL (label), 0);
  gtk_widget_set_hexpand (label, TRUE);
  gtk_label_set_mnemonic_widget (GTK_LABEL (label), control);
  gtk_box_append (GTK_BOX (box), label);
  gtk_box_append (GTK_BOX (box), control);
  return box;
}

static GtkWidget *
caption (const char *text,
         const char *css)
{
  GtkWidget *l = gtk_label_new (text);

  gtk_label_set_xalign (GTK_LABEL (l), 0);
  gtk_label_set_wrap (GTK_LABEL (l), TRUE);
  gtk_label_set_max_width_chars (GTK_LABEL (l), 50);
  gtk_widget_add_css_class (l, "caption");
  if (css)
    gtk_widget_add_css_class (l, css);
  return l;
}

static GtkWindow *
dialog_new (GtkWindow  *parent,
            AwDocument *document,
            Kind        kind,
            int         setup,
            int         item,
            AwUnitSystem units,
            const char *title,
            GtkWidget **content)
{
  GtkWindow *w = GTK_WINDOW (gtk_window_new ());
  Dialog *d = g_new0 (Dialog, 1);
  GtkWidget *box = gtk_box_new (GTK_ORIENTATION_VERTICAL, 8);
  GtkWidget *buttons = gtk_box_new (GTK_ORIENTATION_HORIZONTAL, 8);
  GtkWidget *cancel = gtk_button_new_with_mnemonic (_ ("_Cancel"));
  GtkWidget *ok = gtk_button_new_with_mnemonic (_ ("_OK"));
  GtkEventController *keys = gtk_shortcut_controller_new ();

  d->kind = kind;
  d->document = g_object_ref (document);
  d->setup = setup;
  d->item = item;
  d->units = units;
  d->widgets = g_hash_table_new (g_str_hash, g_str_equal);
  g_object_set_data_full (G_OBJECT (w), "aw-edit-dialog", d, dialog_free);

  gtk_window_set_title (w, title);
  gtk_window_set_modal (w, TRUE);
  if (parent)
    gtk_window_set_transient_for (w, parent);
  gtk_window_set_destroy_with_parent (w, TRUE);
  gtk_window_set_default_size (w, 440, -1);

  gtk_widget_set_margin_start (box, 18);
  gtk_widget_set_margin_end (box, 18);
  gtk_widget_set_margin_top (box, 18);
  gtk_widget_set_margin_bottom (box, 18);
  gtk_window_set_child (w, box);

  gtk_widget_set_halign (buttons, GTK_ALIGN_END);
  gtk_widget_set_margin_top (buttons, 6);
  gtk_widget_add_css_class (ok, "suggested-action");
  gtk_box_append (GTK_BOX (buttons), cancel);
  gtk_box_append (GTK_BOX (buttons), ok);
  g_signal_connect_swapped (cancel, "clicked", G_CALLBACK (gtk_window_destroy), w);
  g_signal_connect_swapped (ok, "clicked", G_CALLBACK (ok_clicked_cb), w);
  put (d, "ok", ok);
  put (d, "cancel", cancel);
  g_object_set_data (G_OBJECT (w), "aw-buttons", buttons);

  gtk_shortcut_controller_add_shortcut (
    GTK_SHORTCUT_CONTROLLER (keys),
    gtk_shortcut_new (gtk_keyval_trigger_new (GDK_KEY_Escape, 0),
                      gtk_named_action_new ("window.close")));
  gtk_widget_add_controller (GTK_WIDGET (w), keys);

  *content = box;
  return w;
}

static void
dialog_finish (GtkWindow *w,
               GtkWidget *box)
{
  gtk_box_append (GTK_BOX (box), g_object_get_data (G_OBJECT (w), "aw-buttons"));
  gtk_window_set_default_widget (w, aw_edit_dialog_get_widget (w, "ok"));
  update_cb (w);
}

static GtkWidget *
dropdown (const char *const *items,
          guint              selected)
{
  GtkWidget *dd = gtk_drop_down_new_from_strings (items);
  gtk_drop_down_set_selected (GTK_DROP_DOWN (dd), selected);
  return dd;
}

GtkWindow *
aw_chrono_dialog_new (GtkWindow   *parent,
                      AwDocument  *document,
                      int          setup,
                      int          item,
                      AwUnitSystem units)
{
  const AwProject *p = aw_document_get_project (document);
  const AwSetup *s = setup >= 0 && (guint) setup < p->setups->len
                     ? g_ptr_array_index (p->setups, setup) : NULL;
  const AwChronoString *c = s && item >= 0 && (guint) item < s->chrono->len
                            ? g_ptr_array_index (s->chrono, item) : NULL;
  g_autoptr (AwChronoString) fresh = NULL;
  GtkWidget *box, *w, *scroller;
  GtkWindow *win;
  Dialog *d;
  const char *unit_items[] = { "m/s", "fps", NULL };
  const char *hop_items[] = { _ ("not recorded"), _ ("off"), _ ("on"), NULL };

  g_return_val_if_fail (s != NULL, NULL);
  if (c == NULL)
    {
      /* a new string starts with the setup's BB, in the unit the window shows */
      fresh = aw_chrono_string_new ();
      fresh->bb_mass_g = s->bb.mass_g;
      fresh->unit = units == AW_UNITS_IMPERIAL ? AW_VELOCITY_UNIT_FPS : AW_VELOCITY_UNIT_MPS;
      c = fresh;
      item = -1;
    }
  win = dialog_new (parent, document, KIND_CHRONO, setup, item, units,
                    item < 0 ? _ ("New Chrono String") : _ ("Chrono String"), &box);
  d = dialog_of (win);

  w = aw_number_field_new (_ ("BB _mass"), AW_QTY_MASS_G, MASS_MIN_G, MASS_MAX_G);
  aw_number_field_set_units (AW_NUMBER_FIELD (w), units);
  aw_number_field_set_help (AW_NUMBER_FIELD (w), _ ("The BB the string was shot with."));
  aw_number_field_set_value (AW_NUMBER_FIELD (w), c->bb_mass_g);
  g_signal_connect_swapped (aw_number_field_get_entry (AW_NUMBER_FIELD (w)), "changed",
                            G_CALLBACK (update_cb), win);
  put (d, "mass", w);
  gtk_box_append (GTK_BOX (box), w);

  w = dropdown (unit_items, c->unit == AW_VELOCITY_UNIT_FPS ? 1 : 0);
  put (d, "unit", w);
  g_signal_connect_swapped (w, "notify::selected", G_CALLBACK (update_cb), win);
  gtk_box_append (GTK_BOX (box), labelled (_ ("Velocity _unit"), w));

  w = dropdown (hop_items, c->hop == AW_CHRONO_HOP_OFF ? 1 : c->hop == AW_CHRONO_HOP_ON ? 2 : 0);
  put (d, "hop", w);
  gtk_box_append (GTK_BOX (box), labelled (_ ("_Hop while shooting"), w));

  w = aw_number_field_new (_ ("_Temperature"), AW_QTY_TEMPERATURE, TEMP_MIN_C, TEMP_MAX_C);
  aw_number_field_set_units (AW_NUMBER_FIELD (w), units);
  aw_number_field_set_allow_empty (AW_NUMBER_FIELD (w), TRUE, _ ("not recorded"));
  aw_number_field_set_digits (AW_NUMBER_FIELD (w), 0);
  aw_number_field_set_value (AW_NUMBER_FIELD (w), c->temperature_c);
  g_signal_connect_swapped (aw_number_field_get_entry (AW_NUMBER_FIELD (w)), "changed",
                            G_CALLBACK (update_cb), win);
  put (d, "temperature", w);
  gtk_box_append (GTK_BOX (box), w);

  w = gtk_entry_new ();
  gtk_entry_set_placeholder_text (GTK_ENTRY (w), _ ("YYYY-MM-DD, optional"));
  gtk_editable_set_text (GTK_EDITABLE (w), c->date ? c->date : "");
  gtk_editable_set_width_chars (GTK_EDITABLE (w), 14);
  g_signal_connect_swapped (w, "changed", G_CALLBACK (update_cb), win);
  put (d, "date", w);
  gtk_box_append (GTK_BOX (box), labelled (_ ("_Date"), w));

  w = gtk_entry_new ();
  gtk_widget_set_hexpand (w, TRUE);
  gtk_entry_set_placeholder_text (GTK_ENTRY (w), _ ("e.g. after the new hop rubber"));
  gtk_editable_set_text (GTK_EDITABLE (w), c->note ? c->note : "");
  put (d, "note", w);
  {
    GtkWidget *row = labelled (_ ("N_ote"), w);
    gtk_widget_set_hexpand (gtk_widget_get_first_child (row), FALSE);
    gtk_box_append (GTK_BOX (box), row);
  }

  {
    GtkWidget *label = gtk_label_new_with_mnemonic (_ ("_Shots"));
    GtkWidget *view = gtk_text_view_new ();
    GString *text = g_string_new (NULL);
    const char *sep = decimal_comma () ? "; " : ", ";
    int digits = 0;

    for (guint i = 0; i < c->velocities->len; i++)
      {
        double v = g_array_index (c->velocities, double, i);
        if (fabs (v * 10 - round (v * 10)) > 1e-9)
          digits = 2;
        else if (fabs (v - round (v)) > 1e-9 && digits < 1)
          digits = 1;
      }
    for (guint i = 0; i < c->velocities->len; i++)
      {
        g_autofree char *num = aw_format_number (g_array_index (c->velocities, double, i),
                                                 digits);
        if (i > 0)
          g_string_append (text, (i % 10) == 0 ? "\n" : sep);
        g_string_append (text, num);
      }
    gtk_label_set_xalign (GTK_LABEL (label), 0);
    gtk_label_set_mnemonic_widget (GTK_LABEL (label), view);
    gtk_widget_set_margin_top (label, 6);
    gtk_box_append (GTK_BOX (box), label);
    w = caption (aw_chrono_shots_hint (), "dim-label");
    put (d, "shots-hint", w);
    gtk_box_append (GTK_BOX (box), w);

    gtk_text_view_set_wrap_mode (GTK_TEXT_VIEW (view), GTK_WRAP_WORD_CHAR);
    gtk_text_view_set_accepts_tab (GTK_TEXT_VIEW (view), FALSE);
    gtk_text_view_set_left_margin (GTK_TEXT_VIEW (view), 6);
    gtk_text_view_set_right_margin (GTK_TEXT_VIEW (view), 6);
    gtk_text_view_set_top_margin (GTK_TEXT_VIEW (view), 4);
    gtk_text_view_set_bottom_margin (GTK_TEXT_VIEW (view), 4);
    gtk_text_buffer_set_text (gtk_text_view_get_buffer (GTK_TEXT_VIEW (view)), text->str, -1);
    g_string_free (text, TRUE);
    g_signal_connect_swapped (gtk_text_view_get_buffer (GTK_TEXT_VIEW (view)), "changed",
                              G_CALLBACK (update_cb), win);
    scroller = gtk_scrolled_window_new ();
    gtk_scrolled_window_set_child (GTK_SCROLLED_WINDOW (scroller), view);
    gtk_scrolled_window_set_policy (GTK_SCROLLED_WINDOW (scroller), GTK_POLICY_NEVER,
                                    GTK_POLICY_AUTOMATIC);
    gtk_widget_set_size_request (scroller, -1, 96);
    gtk_widget_set_vexpand (scroller, TRUE);
    gtk_widget_add_css_class (scroller, "frame");
    gtk_widget_add_css_class (scroller, "aw-shots");
    put (d, "shots", view);
    gtk_box_append (GTK_BOX (box), scroller);
  }

  w = caption ("", "aw-field-error");
  gtk_accessible_update_property (GTK_ACCESSIBLE (w), GTK_ACCESSIBLE_PROPERTY_LABEL,
                                  _ ("Problem"), -1);
  put (d, "message", w);
  gtk_box_append (GTK_BOX (box), w);

  w = caption ("", NULL);
  gtk_label_set_selectable (GTK_LABEL (w), FALSE);
  put (d, "stats", w);
  gtk_box_append (GTK_BOX (box), w);

  gtk_box_append (GTK_BOX (box),
                  caption (_ ("Eye protection on whenever a replica is shot. The site's own "
                              "chronograph and local rules decide what is allowed."),
                           "dim-label"));
  dialog_finish (win, box);
  return win;
}

GtkWindow *
aw_point_dialog_new (GtkWindow   *parent,
                     AwDocument  *document,
                     int          setup,
                     int          item,
                     AwUnitSystem units)
{
  const AwProject *p = aw_document_get_project (document);
  const AwSetup *s = setup >= 0 && (guint) setup < p->setups->len
                     ? g_ptr_array_index (p->setups, setup) : NULL;
  double mass, velocity;
  GtkWidget *box, *w;
  GtkWindow *win;
  Dialog *d;

  g_return_val_if_fail (s != NULL, NULL);
  if (item >= 0 && (guint) item < s->replica.points->len)
    {
      const AwReplicaPoint *pt = &g_array_index (s->replica.points, AwReplicaPoint, item);
      mass = pt->mass_g;
      velocity = pt->velocity_mps;
    }
  else
    {
      /* start from the setup's BB and the chrono reference */
      item = -1;
      mass = s->bb.mass_g;
      velocity = s->replica.ref_velocity_mps;
    }
  win = dialog_new (parent, document, KIND_POINT, setup, item, units,
                    item < 0 ? _ ("New Measured Point") : _ ("Measured Point"), &box);
  d = dialog_of (win);

  gtk_box_append (GTK_BOX (box),
                  caption (_ ("The mean muzzle velocity measured with one BB mass."),
                           "dim-label"));
  w = aw_number_field_new (_ ("BB _mass"), AW_QTY_MASS_G, MASS_MIN_G, MASS_MAX_G);
  aw_number_field_set_units (AW_NUMBER_FIELD (w), units);
  aw_number_field_set_value (AW_NUMBER_FIELD (w), mass);
  g_signal_connect_swapped (aw_number_field_get_entry (AW_NUMBER_FIELD (w)), "changed",
                            G_CALLBACK (update_cb), win);
  put (d, "mass", w);
  gtk_box_append (GTK_BOX (box), w);

  w = aw_number_field_new (_ ("_Velocity"), AW_QTY_VELOCITY, MPS_MIN, MPS_MAX);
  aw_number_field_set_units (AW_NUMBER_FIELD (w), units);
  aw_number_field_set_value (AW_NUMBER_FIELD (w), velocity);
  g_signal_connect_swapped (aw_number_field_get_entry (AW_NUMBER_FIELD (w)), "changed",
                            G_CALLBACK (update_cb), win);
  put (d, "velocity", w);
  gtk_box_append (GTK_BOX (box), w);

  w = caption ("", "aw-field-error");
  put (d, "message", w);
  gtk_box_append (GTK_BOX (box), w);
  w = caption ("", NULL);
  put (d, "stats", w);
  gtk_box_append (GTK_BOX (box), w);
  gtk_box_append (GTK_BOX (box),
                  caption (_ ("Eye protection on whenever a replica is shot. The site's own "
                              "chronograph and local rules decide what is allowed."),
                           "dim-label"));
  dialog_finish (win, box);
  return win;
}
