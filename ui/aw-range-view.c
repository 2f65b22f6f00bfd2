/* aw-range-view.c: the range table of the selected setup, with copy as CSV
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <glib/gi18n.h>
#include <math.h>
#include <string.h>

#include "aw-range-view.h"
#include "aw-units.h"

/* ---- one row as an object for the list model ---- */

#define AW_TYPE_RANGE_ITEM (aw_range_item_get_type ())
G_DECLARE_FINAL_TYPE (AwRangeItem, aw_range_item, AW, RANGE_ITEM, GObject)

struct _AwRangeItem
{
  GObject parent_instance;
  AwRangeRow row;
};

G_DEFINE_FINAL_TYPE (AwRangeItem, aw_range_item, G_TYPE_OBJECT)

static void aw_range_item_class_init (AwRangeItemClass *klass) { }
static void aw_range_item_init (AwRangeItem *self) { }

/* ---- columns ---- */

typedef enum
{
  COL_DISTANCE,
  COL_HEIGHT,
  COL_HOLD,
  COL_TIME,
  COL_SPEED,
  COL_ENERGY,
  COL_DRIFT,
  COL_BAND,
  N_COLS
} Column;

struct _AwRangeView
{
  GtkWidget parent_instance;

  /* template widgets */
  GtkLabel *title_label;
  GtkButton *copy_button;
  GtkStack *stack;
  GtkColumnView *column_view;
  GtkLabel *empty_label;

  /* owned */
  GListStore *store;
  GtkColumnViewColumn *columns[N_COLS];
  AwUnitSystem units;
  AwAngleUnit angle_unit;
  char *setup_name;
  gboolean has_min_distance;
};

G_DEFINE_FINAL_TYPE (AwRangeView, aw_range_view, GTK_TYPE_WIDGET)

static char *
column_title (AwRangeView *self,
              Column       col)
{
  switch (col)
    {
    case COL_DISTANCE:
      /* translators: column titles of the range table; %s is the unit */
      return g_strdup_printf (_ ("Distance (%s)"), aw_qty_unit (AW_QTY_DISTANCE, self->units));
    case COL_HEIGHT:
      return g_strdup_printf (_ ("Height (%s)"), aw_qty_unit (AW_QTY_SMALL_CM, self->units));
    case COL_HOLD:
      return g_strdup_printf (_ ("Hold (%s)"), self->angle_unit == AW_ANGLE_MOA ? "MOA" : "mrad");
    case COL_TIME:
      return g_strdup_printf (_ ("Time (%s)"), "s");
    case COL_SPEED:
      return g_strdup_printf (_ ("Speed (%s)"), aw_qty_unit (AW_QTY_VELOCITY, self->units));
    case COL_ENERGY:
      return g_strdup_printf (_ ("Energy (%s)"), "J");
    case COL_DRIFT:
      /* translators: sideways drift for each 1 m/s (or 1 mph) of full crosswind */
      return g_strdup_printf (_ ("Drift per %s (%s)"),
                              self->units == AW_UNITS_METRIC ? "1 m/s" : "1 mph",
                              aw_qty_unit (AW_QTY_SMALL_CM, self->units));
    case COL_BAND:
      return g_strdup (_ ("Band"));
    case N_COLS:
    default:
      return g_strdup ("");
    }
}

static double
drift_per_unit_wind (AwRangeView     *self,
                     const AwRangeRow *row)
{
  /* drift per 1 m/s, or per 1 mph (0.44704 m/s) in imperial */
  double cm = row->drift_cm_per_mps;
  if (self->units == AW_UNITS_IMPERIAL)
    cm *= 0.44704;
  return cm;
}

static char *
cell_text (AwRangeView     *self,
           Column           col,
           const AwRangeRow *row)
{
  switch (col)
    {
    case COL_DISTANCE:
      return aw_qty_format_number (AW_QTY_DISTANCE, self->units, row->distance_m);
    case COL_HEIGHT:
      return aw_format_number (aw_qty_to_display (AW_QTY_SMALL_CM, self->units, row->height_cm),
                               1);
    case COL_HOLD:
      return aw_format_number (row->hold_angle, self->angle_unit == AW_ANGLE_MOA ? 1 : 2);
    case COL_TIME:
      return aw_format_number (row->time_s, 3);
    case COL_SPEED:
      return aw_qty_format_number (AW_QTY_VELOCITY, self->units, row->speed_mps);
    case COL_ENERGY:
      return aw_format_number (row->energy_j, 2);
    case COL_DRIFT:
      return aw_format_number (aw_qty_to_display (AW_QTY_SMALL_CM, self->units,
                                                  drift_per_unit_wind (self, row)), 1);
    case COL_BAND:
      if (self->has_min_distance && !row->beyond_min_distance)
        /* translators: a range-table row closer than the minimum engagement distance */
        return g_strdup (_ ("no-shoot"));
      return g_strdup (row->in_band ? _ ("inside") : "");
    case N_COLS:
    default:
      return g_strdup ("");
    }
}

static void
setup_cell (GtkSignalListItemFactory *factory,
            GtkListItem              *item,
            gpointer                  user_data)
{
  GtkWidget *label = gtk_label_new (NULL);

  gtk_label_set_xalign (GTK_LABEL (label), GPOINTER_TO_INT (user_data) == COL_BAND ? 0.0 : 1.0);
  gtk_widget_add_css_class (label, "numeric");
  gtk_list_item_set_child (item, label);
}

static void
bind_cell (GtkSignalListItemFactory *factory,
           GtkListItem              *item,
           gpointer                  user_data)
{
  AwRangeView *self = g_object_get_data (G_OBJECT (factory), "aw-range-view");
  AwRangeItem *ri = gtk_list_item_get_item (item);
  GtkWidget *label = gtk_list_item_get_child (item);
  Column col = GPOINTER_TO_INT (user_data);
  g_autofree char *text = cell_text (self, col, &ri->row);

  gtk_label_set_text (GTK_LABEL (label), text);
  if (self->has_min_distance && !ri->row.beyond_min_distance)
    gtk_widget_add_css_class (label, "aw-no-shoot");
  else
    gtk_widget_remove_css_class (label, "aw-no-shoot");
  if (col == COL_BAND && ri->row.in_band)
    gtk_widget_add_css_class (label, "aw-in-band");
  else
    gtk_widget_remove_css_class (label, "aw-in-band");
}

static void
update_titles (AwRangeView *self)
{
  g_autofree char *title = NULL;

  for (int c = 0; c < N_COLS; c++)
    {
      g_autofree char *t = column_title (self, c);
      gtk_column_view_column_set_title (self->columns[c], t);
    }
  if (self->setup_name)
    /* translators: heading of the range table, %s is the setup name */
    title = g_strdup_printf (_ ("Range table: %s"), self->setup_name);
  else
    title = g_strdup (_ ("Range table"));
  gtk_label_set_text (self->title_label, title);
}

static void
refresh_cells (AwRangeView *self)
{
  /* re-bind every visible row: replace the items with themselves */
  guint n = g_list_model_get_n_items (G_LIST_MODEL (self->store));
  g_autoptr (GPtrArray) items = g_ptr_array_new_with_free_func (g_object_unref);

  for (guint i = 0; i < n; i++)
    g_ptr_array_add (items, g_list_model_get_item (G_LIST_MODEL (self->store), i));
  g_list_store_splice (self->store, 0, n, items->pdata, n);
}

static void
aw_range_view_dispose (GObject *object)
{
  AwRangeView *self = AW_RANGE_VIEW (object);

  gtk_widget_dispose_template (GTK_WIDGET (self), AW_TYPE_RANGE_VIEW);
  {
    GtkWidget *child;
    while ((child = gtk_widget_get_first_child (GTK_WIDGET (self))) != NULL)
      gtk_widget_unparent (child);
  }
  g_clear_object (&self->store);
  g_clear_pointer (&self->setup_name, g_free);
  G_OBJECT_CLASS (aw_range_view_parent_class)->dispose (object);
}

static void
aw_range_view_class_init (AwRangeViewClass *klass)
{
  GObjectClass *object_class = G_OBJECT_CLASS (klass);
  GtkWidgetClass *widget_class = GTK_WIDGET_CLASS (klass);

  object_class->dispose = aw_range_view_dispose;

  gtk_widget_class_set_template_from_resource (widget_class,
                                               "/io/github/arcwright/Arcwright/aw-range-view.ui");
  gtk_widget_class_bind_template_child (widget_class, AwRangeView, title_label);
  gtk_widget_class_bind_template_child (widget_class, AwRangeView, copy_button);
  gtk_widget_class_bind_template_child (widget_class, AwRangeView, stack);
  gtk_widget_class_bind_template_child (widget_class, AwRangeView, column_view);
  gtk_widget_class_bind_template_child (widget_class, AwRangeView, empty_label);
  gtk_widget_class_set_layout_manager_type (widget_class, GTK_TYPE_BIN_LAYOUT);
}

static void
aw_range_view_init (AwRangeView *self)
{
  GtkNoSelection *selection;

  gtk_widget_init_template (GTK_WIDGET (self));
  self->store = g_list_store_new (AW_TYPE_RANGE_ITEM);
  selection = gtk_no_selection_new (G_LIST_MODEL (g_object_ref (self->store)));
  gtk_column_view_set_model (self->column_view, GTK_SELECTION_MODEL (selection));
  g_object_unref (selection);

  for (int c = 0; c < N_COLS; c++)
    {
      GtkListItemFactory *factory = gtk_signal_list_item_factory_new ();

      g_object_set_data (G_OBJECT (factory), "aw-range-view", self);
      g_signal_connect (factory, "setup", G_CALLBACK (setup_cell), GINT_TO_POINTER (c));
      g_signal_connect (factory, "bind", G_CALLBACK (bind_cell), GINT_TO_POINTER (c));
      self->columns[c] = gtk_column_view_column_new (NULL, factory);
      gtk_column_view_column_set_expand (self->columns[c], c != COL_BAND);
      gtk_column_view_append_column (self->column_view, self->columns[c]);
      g_object_unref (self->columns[c]);
    }
  gtk_accessible_update_property (GTK_ACCESSIBLE (self->column_view),
                                  GTK_ACCESSIBLE_PROPERTY_LABEL, _ ("Range table"), -1);
  gtk_label_set_text (self->empty_label, _ ("Select a setup to see its range table."));
  gtk_stack_set_visible_child_name (self->stack, "empty");
  update_titles (self);
}

GtkWidget *
aw_range_view_new (void)
{
  return g_object_new (AW_TYPE_RANGE_VIEW, NULL);
}

void
aw_range_view_set_result (AwRangeView     *self,
                          const char      *setup_name,
                          AwComputeResult *result,
                          AwAngleUnit      angle_unit)
{
  g_autoptr (GPtrArray) items = g_ptr_array_new_with_free_func (g_object_unref);

  g_return_if_fail (AW_IS_RANGE_VIEW (self));

  g_free (self->setup_name);
  self->setup_name = g_strdup (setup_name);
  self->angle_unit = angle_unit;

  if (result != NULL && result->has_table && result->status >= 0)
    {
      for (size_t i = 0; i < result->table.n_rows; i++)
        {
          AwRangeItem *item = g_object_new (AW_TYPE_RANGE_ITEM, NULL);
          item->row = result->table.rows[i];
          g_ptr_array_add (items, item);
        }
      self->has_min_distance = FALSE;
      for (size_t i = 0; i < result->table.n_rows; i++)
        if (!result->table.rows[i].beyond_min_distance)
          self->has_min_distance = TRUE;
    }
  g_list_store_splice (self->store, 0, g_list_model_get_n_items (G_LIST_MODEL (self->store)),
                       items->pdata, items->len);

  if (items->len > 0)
    gtk_stack_set_visible_child_name (self->stack, "table");
  else
    {
      gtk_label_set_text (self->empty_label,
                          setup_name == NULL ? _ ("Select a setup to see its range table.")
                          : result == NULL ? _ ("Computing…")
                          : _ ("No range table: the flight of this setup could not be computed."));
      gtk_stack_set_visible_child_name (self->stack, "empty");
    }
  gtk_widget_set_sensitive (GTK_WIDGET (self->copy_button), items->len > 0);
  update_titles (self);
}

void
aw_range_view_set_units (AwRangeView  *self,
                         AwUnitSystem  units)
{
  g_return_if_fail (AW_IS_RANGE_VIEW (self));

  if (self->units == units)
    return;
  self->units = units;
  update_titles (self);
  refresh_cells (self);
}

guint
aw_range_view_get_n_rows (AwRangeView *self)
{
  g_return_val_if_fail (AW_IS_RANGE_VIEW (self), 0);
  return g_list_model_get_n_items (G_LIST_MODEL (self->store));
}

static void
csv_field (GString    *line,
           const char *text)
{
  if (line->len > 0)
    g_string_append_c (line, ',');
  if (strpbrk (text, ",\"\n") != NULL)
    {
      g_string_append_c (line, '"');
      for (const char *p = text; *p; p++)
        {
          if (*p == '"')
            g_string_append_c (line, '"');
          g_string_append_c (line, *p);
        }
      g_string_append_c (line, '"');
    }
  else
    g_string_append (line, text);
}

static void
csv_number (GString *line,
            double   v,
            int      decimals)
{
  char buf[G_ASCII_DTOSTR_BUF_SIZE];
  char fmt[8];

  if (!isfinite (v))
    {
      csv_field (line, "");
      return;
    }
  if (v == 0.0)
    v = 0.0;
  g_snprintf (fmt, sizeof fmt, "%%.%df", decimals);
  g_ascii_formatd (buf, sizeof buf, fmt, v);
  if (g_str_equal (buf, "-0")
      || (g_str_has_prefix (buf, "-0.") && strspn (buf + 3, "0") == strlen (buf + 3)))
    memmove (buf, buf + 1, strlen (buf));
  csv_field (line, buf);
}

char *
aw_range_view_dup_csv (AwRangeView *self)
{
  guint n;
  GString *out;
  g_autoptr (GString) line = g_string_new (NULL);

  g_return_val_if_fail (AW_IS_RANGE_VIEW (self), NULL);

  n = g_list_model_get_n_items (G_LIST_MODEL (self->store));
  if (n == 0)
    return NULL;

  out = g_string_new (NULL);
  for (int c = 0; c < N_COLS; c++)
    {
      g_autofree char *t = column_title (self, c);
      csv_field (line, t);
    }
  g_string_append (out, line->str);
  g_string_append (out, "\r\n");

  for (guint i = 0; i < n; i++)
    {
      g_autoptr (AwRangeItem) item = g_list_model_get_item (G_LIST_MODEL (self->store), i);
      const AwRangeRow *r = &item->row;

      g_string_truncate (line, 0);
      csv_number (line, aw_qty_to_display (AW_QTY_DISTANCE, self->units, r->distance_m), 2);
      csv_number (line, aw_qty_to_display (AW_QTY_SMALL_CM, self->units, r->height_cm), 2);
      csv_number (line, r->hold_angle, 3);
      csv_number (line, r->time_s, 4);
      csv_number (line, aw_qty_to_display (AW_QTY_VELOCITY, self->units, r->speed_mps), 2);
      csv_number (line, r->energy_j, 3);
      csv_number (line, aw_qty_to_display (AW_QTY_SMALL_CM, self->units,
                                           drift_per_unit_wind (self, r)), 2);
      csv_field (line, (self->has_min_distance && !r->beyond_min_distance) ? "no-shoot"
                       : r->in_band ? "inside" : "");
      g_string_append (out, line->str);
      g_string_append (out, "\r\n");
    }
  return g_string_free (out, FALSE);
}

gboolean
aw_range_view_copy_csv (AwRangeView *self)
{
  g_autofree char *csv = aw_range_view_dup_csv (self);

  if (csv == NULL)
    return FALSE;
  gdk_clipboard_set_text (gtk_widget_get_clipboard (GTK_WIDGET (self)), csv);
  return TRUE;
}
