/* aw-print-layout.c: text, tables, boxes and page flow for the printed outputs
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <glib/gi18n.h>
#include <math.h>
#include <pango/pangocairo.h>
#include <string.h>

#include "aw-print-layout.h"

#define MONO_FAMILY "DejaVu Sans Mono, Monospace"
#define CELL_PAD 1.6           /* horizontal padding inside table cells, pt */
#define HEADER_MAX_LINES 3

/* ---- text ---- */

AwPlStyle
aw_pl_style (double size)
{
  AwPlStyle s;
  memset (&s, 0, sizeof s);
  s.size = size;
  s.align = PANGO_ALIGN_LEFT;
  s.flow = AW_PL_WRAP;
  return s;
}

AwPlStyle
aw_pl_style_bold (double size)
{
  AwPlStyle s = aw_pl_style (size);
  s.bold = TRUE;
  return s;
}

static PangoLayout *
layout_at_size (AwPl *pl, const char *text, const AwPlStyle *style, double size)
{
  PangoLayout *layout;
  PangoFontDescription *fd;

  pango_cairo_update_context (pl->cr, pl->pango);
  layout = pango_layout_new (pl->pango);
  fd = pango_font_description_from_string (style->mono ? MONO_FAMILY : AW_PL_FONT_FAMILY);
  pango_font_description_set_absolute_size (fd, size * PANGO_SCALE);
  pango_font_description_set_weight (fd, style->bold ? PANGO_WEIGHT_BOLD : PANGO_WEIGHT_NORMAL);
  pango_font_description_set_style (fd, style->italic ? PANGO_STYLE_ITALIC : PANGO_STYLE_NORMAL);
  pango_layout_set_font_description (layout, fd);
  pango_font_description_free (fd);
  pango_layout_set_text (layout, text ? text : "", -1);
  pango_layout_set_alignment (layout, style->align);
  return layout;
}

static double
layout_width (PangoLayout *layout)
{
  PangoRectangle logical;
  pango_layout_get_extents (layout, NULL, &logical);
  return (double) logical.width / PANGO_SCALE;
}

static double
layout_height (PangoLayout *layout)
{
  PangoRectangle logical;
  pango_layout_get_extents (layout, NULL, &logical);
  return (double) logical.height / PANGO_SCALE;
}

/* The size at which text fits on one line `width` wide (not below min). */
static double
fit_size (AwPl *pl, const char *text, const AwPlStyle *style, double width)
{
  double min = style->min_size > 0 ? style->min_size : 0.6 * style->size;
  g_autoptr (PangoLayout) layout = layout_at_size (pl, text, style, style->size);
  double natural = layout_width (layout);
  double size;

  if (natural <= width || natural <= 0)
    return style->size;
  size = style->size * width / natural;
  /* text width is close to linear in size without hinting; step down to be sure */
  while (size > min)
    {
      g_autoptr (PangoLayout) l = layout_at_size (pl, text, style, size);
      if (layout_width (l) <= width)
        break;
      size -= 0.1;
    }
  return MAX (size, min);
}

PangoLayout *
aw_pl_layout (AwPl *pl, const char *text, const AwPlStyle *style, double width)
{
  PangoLayout *layout;

  if (style->flow == AW_PL_FIT)
    {
      double size = fit_size (pl, text, style, width);
      layout = layout_at_size (pl, text, style, size);
      pango_layout_set_width (layout, (int) (width * PANGO_SCALE));
      pango_layout_set_ellipsize (layout, PANGO_ELLIPSIZE_END);
      pango_layout_set_single_paragraph_mode (layout, TRUE);
      return layout;
    }

  layout = layout_at_size (pl, text, style, style->size);
  pango_layout_set_width (layout, (int) (width * PANGO_SCALE));
  if (style->flow == AW_PL_ELLIPSIZE)
    {
      pango_layout_set_ellipsize (layout, PANGO_ELLIPSIZE_END);
      pango_layout_set_single_paragraph_mode (layout, TRUE);
    }
  else
    {
      pango_layout_set_wrap (layout, PANGO_WRAP_WORD_CHAR);
      if (style->max_lines > 0)
        {
          pango_layout_set_height (layout, -style->max_lines);
          pango_layout_set_ellipsize (layout, PANGO_ELLIPSIZE_END);
        }
    }
  return layout;
}

double
aw_pl_text_height (AwPl *pl, const char *text, const AwPlStyle *style, double width)
{
  g_autoptr (PangoLayout) layout = NULL;
  if (text == NULL || *text == '\0')
    return 0.0;
  layout = aw_pl_layout (pl, text, style, width);
  return layout_height (layout);
}

double
aw_pl_text_width (AwPl *pl, const char *text, const AwPlStyle *style)
{
  g_autoptr (PangoLayout) layout = layout_at_size (pl, text, style, style->size);
  return layout_width (layout);
}

double
aw_pl_text (AwPl *pl, double x, double y, double width, const char *text, const AwPlStyle *style)
{
  g_autoptr (PangoLayout) layout = NULL;
  double h;

  if (text == NULL || *text == '\0')
    return 0.0;
  layout = aw_pl_layout (pl, text, style, width);
  h = layout_height (layout);
  cairo_save (pl->cr);
  cairo_set_source_rgb (pl->cr, style->rgb[0], style->rgb[1], style->rgb[2]);
  cairo_move_to (pl->cr, x, y);
  pango_cairo_show_layout (pl->cr, layout);
  cairo_restore (pl->cr);
  return h;
}

void
aw_pl_text_cell (AwPl *pl, double x, double y, double w, double h, const char *text,
                 const AwPlStyle *style)
{
  AwPlStyle s = *style;
  g_autoptr (PangoLayout) layout = NULL;
  double th;

  if (text == NULL || *text == '\0')
    return;
  s.flow = AW_PL_FIT;
  layout = aw_pl_layout (pl, text, &s, w);
  th = layout_height (layout);
  cairo_save (pl->cr);
  cairo_set_source_rgb (pl->cr, s.rgb[0], s.rgb[1], s.rgb[2]);
  cairo_move_to (pl->cr, x, y + (h - th) / 2.0);
  pango_cairo_show_layout (pl->cr, layout);
  cairo_restore (pl->cr);
}

double
aw_pl_label_value (AwPl *pl, double x, double y, double width, const char *label,
                   const char *value, double size, gboolean draw)
{
  g_autofree char *label_esc = g_markup_escape_text (label ? label : "", -1);
  g_autofree char *value_esc = g_markup_escape_text (value ? value : "", -1);
  g_autofree char *markup = NULL;
  AwPlStyle s = aw_pl_style (size);
  g_autoptr (PangoLayout) layout = aw_pl_layout (pl, "", &s, width);
  double h;

  /* TRANSLATORS: a label and its value on a printed page, e.g. "Wind: 2 m/s" */
  markup = g_strdup_printf (_("<b>%s:</b> %s"), label_esc, value_esc);
  pango_layout_set_markup (layout, markup, -1);
  h = layout_height (layout);
  if (draw)
    {
      cairo_save (pl->cr);
      cairo_set_source_rgb (pl->cr, 0, 0, 0);
      cairo_move_to (pl->cr, x, y);
      pango_cairo_show_layout (pl->cr, layout);
      cairo_restore (pl->cr);
    }
  return h;
}

/* ---- numbers ---- */

char *
aw_pl_num (double v, int decimals)
{
  g_autofree char *s = NULL;
  GString *out;
  gboolean all_zero = TRUE;

  if (!isfinite (v))
    return g_strdup ("–");
  /* locale-dependent on purpose: numbers for people use the locale's decimal mark */
  s = g_strdup_printf ("%.*f", CLAMP (decimals, 0, 9), v);
  for (const char *p = s; *p; p++)
    if (g_ascii_isdigit (*p) && *p != '0')
      all_zero = FALSE;
  out = g_string_new (NULL);
  for (const char *p = s; *p; p++)
    {
      if (*p == '-')
        {
          if (!all_zero)
            g_string_append (out, "−");
        }
      else
        g_string_append_c (out, *p);
    }
  return g_string_free (out, FALSE);
}

char *
aw_pl_num_unit (double v, int decimals, const char *unit)
{
  g_autofree char *n = aw_pl_num (v, decimals);
  if (!isfinite (v))
    return g_steal_pointer (&n);
  /* U+202F narrow no-break space keeps the unit with its number */
  return g_strdup_printf ("%s\u202f%s", n, unit);
}

/* ---- drawing ---- */

void
aw_pl_set_rgb (AwPl *pl, const double rgb[3])
{
  cairo_set_source_rgb (pl->cr, rgb[0], rgb[1], rgb[2]);
}

void
aw_pl_rect_fill (AwPl *pl, double x, double y, double w, double h, double grey)
{
  cairo_save (pl->cr);
  cairo_set_source_rgb (pl->cr, grey, grey, grey);
  cairo_rectangle (pl->cr, x, y, w, h);
  cairo_fill (pl->cr);
  cairo_restore (pl->cr);
}

void
aw_pl_rect_stroke (AwPl *pl, double x, double y, double w, double h, double line_width)
{
  cairo_save (pl->cr);
  cairo_set_source_rgb (pl->cr, 0, 0, 0);
  cairo_set_line_width (pl->cr, line_width);
  cairo_rectangle (pl->cr, x, y, w, h);
  cairo_stroke (pl->cr);
  cairo_restore (pl->cr);
}

void
aw_pl_hline (AwPl *pl, double x0, double x1, double y, double line_width)
{
  cairo_save (pl->cr);
  cairo_set_line_width (pl->cr, line_width);
  cairo_move_to (pl->cr, x0, y);
  cairo_line_to (pl->cr, x1, y);
  cairo_stroke (pl->cr);
  cairo_restore (pl->cr);
}

void
aw_pl_hatch (AwPl *pl, double x, double y, double w, double h, double spacing)
{
  cairo_t *cr = pl->cr;
  cairo_save (cr);
  cairo_rectangle (cr, x, y, w, h);
  cairo_clip (cr);
  cairo_set_source_rgb (cr, 0.62, 0.62, 0.62);
  cairo_set_line_width (cr, 0.4);
  for (double t = -h; t < w; t += spacing)
    {
      cairo_move_to (cr, x + t, y + h);
      cairo_line_to (cr, x + t + h, y);
    }
  cairo_stroke (cr);
  cairo_restore (cr);
}

void
aw_pl_parse_colour (const char *text, double rgb[3])
{
  unsigned int r, g, b;
  rgb[0] = 0.20;
  rgb[1] = 0.40;
  rgb[2] = 0.64;
  if (text && strlen (text) == 7 && text[0] == '#'
      && sscanf (text + 1, "%02x%02x%02x", &r, &g, &b) == 3)
    {
      rgb[0] = r / 255.0;
      rgb[1] = g / 255.0;
      rgb[2] = b / 255.0;
    }
}

double
aw_pl_box_title (AwPl *pl, double x, double y, double w, const char *title, double size,
                 gboolean draw)
{
  AwPlStyle s = aw_pl_style_bold (size);
  double pad = 0.35 * size;
  double th;

  s.max_lines = 2;
  th = aw_pl_text_height (pl, title, &s, w - 2 * pad) + 2 * pad;
  if (draw)
    {
      aw_pl_rect_fill (pl, x, y, w, th, 0.88);
      aw_pl_text (pl, x + pad, y + pad, w - 2 * pad, title, &s);
    }
  return th;
}

/* ---- plot keys ---- */

double
aw_pl_key (AwPl *pl, double x, double y, double w, const AwPlKeyItem *items, int n, double size,
           gboolean draw)
{
  AwPlStyle s = aw_pl_style (size);
  double sample = 2.2 * size, yy = y;

  for (int i = 0; i < n; i++)
    {
      double h = draw ? aw_pl_text (pl, x + sample + 4.0, yy, w - sample - 4.0, items[i].label, &s)
                      : aw_pl_text_height (pl, items[i].label, &s, w - sample - 4.0);
      if (draw)
        {
          cairo_save (pl->cr);
          aw_pl_set_rgb (pl, items[i].rgb);
          cairo_set_line_width (pl->cr, items[i].line_width > 0 ? items[i].line_width : 1.2);
          cairo_set_dash (pl->cr, items[i].dash, items[i].n_dash, 0);
          cairo_move_to (pl->cr, x, yy + 0.6 * size);
          cairo_line_to (pl->cr, x + sample, yy + 0.6 * size);
          cairo_stroke (pl->cr);
          cairo_restore (pl->cr);
        }
      yy += h + 1.0;
    }
  return yy - y;
}

/* ---- tables ---- */

void
aw_pl_table_init (AwPlTable *t, const AwPlColumn *columns, int n_columns, double size)
{
  memset (t, 0, sizeof *t);
  t->columns = columns;
  t->n_columns = n_columns;
  t->cells = g_ptr_array_new_with_free_func (g_free);
  t->flags = g_array_new (FALSE, FALSE, sizeof (AwPlRowFlags));
  t->size = size;
  t->header_size = size;
  t->keep = g_ptr_array_new_with_free_func (g_free);
}

gpointer
aw_pl_table_keep (AwPlTable *t, gpointer p)
{
  g_ptr_array_add (t->keep, p);
  return p;
}

void
aw_pl_table_clear (AwPlTable *t)
{
  g_clear_pointer (&t->cells, g_ptr_array_unref);
  g_clear_pointer (&t->flags, g_array_unref);
  g_clear_pointer (&t->keep, g_ptr_array_unref);
}

void
aw_pl_table_add_row (AwPlTable *t, char **cells, AwPlRowFlags flags)
{
  for (int i = 0; i < t->n_columns; i++)
    g_ptr_array_add (t->cells, cells[i]);
  g_array_append_val (t->flags, flags);
}

int
aw_pl_table_n_rows (const AwPlTable *t)
{
  return (int) t->flags->len;
}

static void
column_geometry (const AwPlTable *t, double width, double *xs, double *ws)
{
  double total = 0.0, x = 0.0;
  for (int i = 0; i < t->n_columns; i++)
    total += t->columns[i].weight > 0 ? t->columns[i].weight : 1.0;
  for (int i = 0; i < t->n_columns; i++)
    {
      double wgt = t->columns[i].weight > 0 ? t->columns[i].weight : 1.0;
      xs[i] = x;
      ws[i] = width * wgt / total;
      x += ws[i];
    }
}

/* Layout of a column header: word-wrapped onto at most three lines, shrunk until every word
 * fits the cell; at the smallest size words may break. */
static PangoLayout *
header_layout (AwPl *pl, const AwPlTable *t, int col, double w)
{
  AwPlStyle s = aw_pl_style_bold (t->header_size);
  double min = 0.7 * t->header_size;
  double inner = MAX (w - 2 * CELL_PAD, 1.0);

  s.align = t->columns[col].align;
  for (double size = t->header_size; size >= min - 1e-9; size -= 0.25)
    {
      PangoLayout *l = layout_at_size (pl, t->columns[col].header, &s, size);
      pango_layout_set_width (l, (int) (inner * PANGO_SCALE));
      pango_layout_set_wrap (l, PANGO_WRAP_WORD);
      if (layout_width (l) <= inner + 0.01 && pango_layout_get_line_count (l) <= HEADER_MAX_LINES)
        return l;
      g_object_unref (l);
    }
  {
    PangoLayout *l = layout_at_size (pl, t->columns[col].header, &s, min);
    pango_layout_set_width (l, (int) (inner * PANGO_SCALE));
    pango_layout_set_wrap (l, PANGO_WRAP_WORD_CHAR);
    pango_layout_set_height (l, -HEADER_MAX_LINES);
    pango_layout_set_ellipsize (l, PANGO_ELLIPSIZE_END);
    return l;
  }
}

double
aw_pl_table_header_height (AwPl *pl, const AwPlTable *t, double width)
{
  double xs[64], ws[64], h = 0.0;
  g_return_val_if_fail (t->n_columns <= 64, 0.0);
  column_geometry (t, width, xs, ws);
  for (int i = 0; i < t->n_columns; i++)
    {
      g_autoptr (PangoLayout) l = header_layout (pl, t, i, ws[i]);
      h = MAX (h, layout_height (l));
    }
  return h + 0.5 * t->header_size;
}

double
aw_pl_table_row_height (const AwPlTable *t)
{
  return t->row_height > 0 ? t->row_height : 1.6 * t->size;
}

static AwPlStyle
wrap_style (const AwPlTable *t, int col, AwPlRowFlags f)
{
  AwPlStyle s = aw_pl_style (t->size);
  s.bold = (f & AW_PL_ROW_BOLD) != 0;
  s.align = t->columns[col].align;
  s.max_lines = 2;
  return s;
}

double
aw_pl_table_row_height_at (AwPl *pl, const AwPlTable *t, double width, int r)
{
  double xs[64], ws[64];
  double h = aw_pl_table_row_height (t);
  AwPlRowFlags f = g_array_index (t->flags, AwPlRowFlags, r);

  column_geometry (t, width, xs, ws);
  for (int i = 0; i < t->n_columns; i++)
    {
      const char *text = g_ptr_array_index (t->cells, (guint) (r * t->n_columns + i));
      AwPlStyle s;
      if (!t->columns[i].wrap || text == NULL || *text == '\0')
        continue;
      s = wrap_style (t, i, f);
      h = MAX (h, aw_pl_text_height (pl, text, &s, ws[i] - 2 * CELL_PAD) + 0.45 * t->size);
    }
  return h;
}

double
aw_pl_table_draw (AwPl *pl, const AwPlTable *t, double x, double y, double width, int first,
                  int last)
{
  cairo_t *cr = pl->cr;
  double xs[64], ws[64];
  double hh = aw_pl_table_header_height (pl, t, width);
  double yy;

  g_return_val_if_fail (t->n_columns <= 64, 0.0);
  column_geometry (t, width, xs, ws);

  /* header, bottom-aligned */
  aw_pl_rect_fill (pl, x, y, width, hh, 0.90);
  for (int i = 0; i < t->n_columns; i++)
    {
      g_autoptr (PangoLayout) l = header_layout (pl, t, i, ws[i]);
      double lh = layout_height (l);
      cairo_save (cr);
      cairo_set_source_rgb (cr, 0, 0, 0);
      cairo_move_to (cr, x + xs[i] + CELL_PAD, y + hh - lh - 0.25 * t->header_size);
      pango_cairo_show_layout (cr, l);
      cairo_restore (cr);
    }
  cairo_set_source_rgb (cr, 0, 0, 0);
  aw_pl_hline (pl, x, x + width, y, 0.8);
  aw_pl_hline (pl, x, x + width, y + hh, 0.6);

  yy = y + hh;
  for (int r = first; r < last; r++)
    {
      AwPlRowFlags f = g_array_index (t->flags, AwPlRowFlags, r);
      AwPlStyle s = aw_pl_style (t->size);
      double rh = aw_pl_table_row_height_at (pl, t, width, r);

      s.bold = (f & AW_PL_ROW_BOLD) != 0;
      if (f & AW_PL_ROW_SHADED)
        aw_pl_rect_fill (pl, x, yy, width, rh, 0.92);
      if (f & AW_PL_ROW_HATCHED)
        aw_pl_hatch (pl, x, yy, width, rh, 3.0);
      for (int i = 0; i < t->n_columns; i++)
        {
          const char *text = g_ptr_array_index (t->cells, (guint) (r * t->n_columns + i));
          s.align = t->columns[i].align;
          if (text && *text && (f & AW_PL_ROW_HATCHED))
            {
              /* keep the figures readable over the hatching */
              g_autoptr (PangoLayout) l = NULL;
              AwPlStyle fs = s;
              fs.flow = AW_PL_FIT;
              l = aw_pl_layout (pl, text, &fs, ws[i] - 2 * CELL_PAD);
              {
                PangoRectangle ink;
                double lh = layout_height (l);
                double lx = x + xs[i] + CELL_PAD, ly = yy + (rh - lh) / 2.0;
                pango_layout_get_pixel_extents (l, NULL, &ink);
                cairo_save (cr);
                cairo_set_source_rgb (cr, 1, 1, 1);
                cairo_rectangle (cr, lx + ink.x - 0.6, ly + 0.5, ink.width + 1.2, lh - 1.0);
                cairo_fill (cr);
                cairo_restore (cr);
              }
            }
          if (t->columns[i].wrap && text && *text)
            {
              AwPlStyle w = wrap_style (t, i, f);
              double th = aw_pl_text_height (pl, text, &w, ws[i] - 2 * CELL_PAD);
              aw_pl_text (pl, x + xs[i] + CELL_PAD, yy + (rh - th) / 2.0, ws[i] - 2 * CELL_PAD,
                          text, &w);
            }
          else
            aw_pl_text_cell (pl, x + xs[i] + CELL_PAD, yy, ws[i] - 2 * CELL_PAD, rh, text, &s);
        }
      cairo_set_source_rgb (cr, 0.55, 0.55, 0.55);
      if (f & AW_PL_ROW_RULE && r != first)
        {
          cairo_set_source_rgb (cr, 0, 0, 0);
          aw_pl_hline (pl, x, x + width, yy, 0.5);
        }
      yy += rh;
      cairo_set_source_rgb (cr, 0.75, 0.75, 0.75);
      aw_pl_hline (pl, x, x + width, yy, 0.25);
    }
  cairo_set_source_rgb (cr, 0, 0, 0);
  aw_pl_hline (pl, x, x + width, yy, 0.8);
  return yy - y;
}

/* ---- page flow ---- */

static void
block_free (gpointer p)
{
  AwPlBlock *b = p;
  if (b->destroy)
    b->destroy (b->data);
  if (b->table)
    {
      aw_pl_table_clear (b->table);
      g_free (b->table);
    }
  g_free (b);
}

void
aw_pl_flow_init (AwPlFlowDoc *doc)
{
  doc->blocks = g_ptr_array_new_with_free_func (block_free);
  doc->placements = g_array_new (FALSE, FALSE, sizeof (AwPlPlacement));
  doc->n_pages = 0;
}

void
aw_pl_flow_clear (AwPlFlowDoc *doc)
{
  g_clear_pointer (&doc->blocks, g_ptr_array_unref);
  g_clear_pointer (&doc->placements, g_array_unref);
  doc->n_pages = 0;
}

AwPlBlock *
aw_pl_flow_add (AwPlFlowDoc *doc, AwPlMeasureFunc measure, AwPlDrawFunc draw, gpointer data,
                GDestroyNotify destroy)
{
  AwPlBlock *b = g_new0 (AwPlBlock, 1);
  b->measure = measure;
  b->draw = draw;
  b->data = data;
  b->destroy = destroy;
  b->space_after = 8.0;
  g_ptr_array_add (doc->blocks, b);
  return b;
}

AwPlBlock *
aw_pl_flow_add_table (AwPlFlowDoc *doc, AwPlTable *table)
{
  AwPlBlock *b = aw_pl_flow_add (doc, NULL, NULL, NULL, NULL);
  b->table = table;
  return b;
}

typedef struct
{
  char *text;
  AwPlStyle style;
  gboolean heading;
} TextBlock;

static void
text_block_free (gpointer p)
{
  TextBlock *tb = p;
  g_free (tb->text);
  g_free (tb);
}

static double
text_block_measure (AwPl *pl, gpointer data, double width)
{
  TextBlock *tb = data;
  return aw_pl_text_height (pl, tb->text, &tb->style, width) + (tb->heading ? 2.5 : 0.0);
}

static void
text_block_draw (AwPl *pl, gpointer data, double x, double y, double width, double height)
{
  TextBlock *tb = data;
  double h = aw_pl_text (pl, x, y, width, tb->text, &tb->style);
  if (tb->heading)
    {
      cairo_set_source_rgb (pl->cr, 0, 0, 0);
      aw_pl_hline (pl, x, x + width, y + h + 1.2, 0.8);
    }
}

AwPlBlock *
aw_pl_flow_add_text (AwPlFlowDoc *doc, const char *text, const AwPlStyle *style)
{
  TextBlock *tb = g_new0 (TextBlock, 1);
  tb->text = g_strdup (text);
  tb->style = *style;
  return aw_pl_flow_add (doc, text_block_measure, text_block_draw, tb, text_block_free);
}

AwPlBlock *
aw_pl_flow_add_heading (AwPlFlowDoc *doc, const char *text, double size)
{
  TextBlock *tb = g_new0 (TextBlock, 1);
  AwPlBlock *b;
  tb->text = g_strdup (text);
  tb->style = aw_pl_style_bold (size);
  tb->heading = TRUE;
  b = aw_pl_flow_add (doc, text_block_measure, text_block_draw, tb, text_block_free);
  b->keep_with_next = TRUE;
  b->space_after = 4.0;
  return b;
}

typedef struct
{
  char *label;                 /* NULL: plain paragraph */
  char *text;
  gboolean styled;
  AwPlStyle style;
} BoxLine;

static void
box_line_free (gpointer p)
{
  BoxLine *l = p;
  g_free (l->label);
  g_free (l->text);
  g_free (l);
}

static void
box_free (gpointer p)
{
  AwPlBox *b = p;
  g_free (b->title);
  g_ptr_array_unref (b->lines);
  g_free (b);
}

#define BOX_PAD 5.0
#define WRITE_IN_STEP 17.0

static double
box_body (AwPl *pl, AwPlBox *b, double x, double y, double width, gboolean draw)
{
  double yy = y;
  for (guint i = 0; i < b->lines->len; i++)
    {
      BoxLine *l = g_ptr_array_index (b->lines, i);
      if (l->label)
        yy += aw_pl_label_value (pl, x, yy, width, l->label, l->text, b->size, draw);
      else
        {
          AwPlStyle s = l->styled ? l->style : aw_pl_style (b->size);
          if (draw)
            yy += aw_pl_text (pl, x, yy, width, l->text, &s);
          else
            yy += aw_pl_text_height (pl, l->text, &s, width);
        }
      yy += 0.25 * b->size;
    }
  for (int i = 0; i < b->write_in_lines; i++)
    {
      yy += WRITE_IN_STEP;
      if (draw)
        {
          cairo_set_source_rgb (pl->cr, 0.55, 0.55, 0.55);
          aw_pl_hline (pl, x, x + width, yy, 0.4);
        }
    }
  return yy - y;
}

static double
box_measure (AwPl *pl, gpointer data, double width)
{
  AwPlBox *b = data;
  double th = aw_pl_box_title (pl, 0, 0, width, b->title, b->size + 0.5, FALSE);
  return th + BOX_PAD + box_body (pl, b, 0, 0, width - 2 * BOX_PAD, FALSE) + BOX_PAD;
}

static void
box_draw (AwPl *pl, gpointer data, double x, double y, double width, double height)
{
  AwPlBox *b = data;
  double th = aw_pl_box_title (pl, x, y, width, b->title, b->size + 0.5, TRUE);
  box_body (pl, b, x + BOX_PAD, y + th + BOX_PAD, width - 2 * BOX_PAD, TRUE);
  cairo_save (pl->cr);
  cairo_set_source_rgb (pl->cr, b->border_rgb[0], b->border_rgb[1], b->border_rgb[2]);
  cairo_set_line_width (pl->cr, b->border_width);
  cairo_rectangle (pl->cr, x, y, width, height);
  cairo_stroke (pl->cr);
  cairo_restore (pl->cr);
}

AwPlBox *
aw_pl_flow_add_box (AwPlFlowDoc *doc, const char *title, AwPlBlock **block)
{
  AwPlBox *b = g_new0 (AwPlBox, 1);
  AwPlBlock *blk;
  b->title = g_strdup (title);
  b->lines = g_ptr_array_new_with_free_func (box_line_free);
  b->size = 8.5;
  b->border_width = 0.6;
  blk = aw_pl_flow_add (doc, box_measure, box_draw, b, box_free);
  if (block)
    *block = blk;
  return b;
}

void
aw_pl_box_add (AwPlBox *box, const char *label, const char *text)
{
  BoxLine *l = g_new0 (BoxLine, 1);
  l->label = g_strdup (label);
  l->text = g_strdup (text ? text : "");
  g_ptr_array_add (box->lines, l);
}

void
aw_pl_box_add_styled (AwPlBox *box, const char *text, const AwPlStyle *style)
{
  BoxLine *l = g_new0 (BoxLine, 1);
  l->text = g_strdup (text ? text : "");
  l->styled = TRUE;
  l->style = *style;
  g_ptr_array_add (box->lines, l);
}

static double
block_min_height (AwPl *pl, const AwPlBlock *b, double width)
{
  if (b->table)
    {
      double h = aw_pl_table_header_height (pl, b->table, width);
      for (int r = 0; r < MIN (2, aw_pl_table_n_rows (b->table)); r++)
        h += aw_pl_table_row_height_at (pl, b->table, width, r);
      return h;
    }
  return b->measure (pl, b->data, width);
}

/* Height block i needs on its page: its own, plus (through a chain of keep_with_next) the first
 * part of the blocks it is kept with. */
static double
chain_need (AwPl *pl, AwPlFlowDoc *doc, guint i, double width, gboolean first)
{
  const AwPlBlock *b = g_ptr_array_index (doc->blocks, i);
  double h = first && !b->table ? b->measure (pl, b->data, width) : block_min_height (pl, b, width);
  if (b->keep_with_next && !b->table && i + 1 < doc->blocks->len)
    h += b->space_after + chain_need (pl, doc, i + 1, width, FALSE);
  return h;
}

static void
place (AwPlFlowDoc *doc, int page, const AwPlBlock *b, double y, double h, int r0, int r1)
{
  AwPlPlacement p = { page, b, y, h, r0, r1 };
  g_array_append_val (doc->placements, p);
}

int
aw_pl_flow_paginate (AwPlFlowDoc *doc, AwPl *pl, double width, double height)
{
  int page = 0;
  double y = 0.0;

  g_array_set_size (doc->placements, 0);
  for (guint i = 0; i < doc->blocks->len; i++)
    {
      const AwPlBlock *b = g_ptr_array_index (doc->blocks, i);

      if (b->new_page && y > 0.0)
        {
          page++;
          y = 0.0;
        }
      if (b->table)
        {
          int n = aw_pl_table_n_rows (b->table);
          double hh = aw_pl_table_header_height (pl, b->table, width);
          int r = 0;

          while (r < n)
            {
              double used = hh;
              int last = r;
              /* as many rows as fit (at least one on an empty page) */
              while (last < n)
                {
                  double rh = aw_pl_table_row_height_at (pl, b->table, width, last);
                  if (y + used + rh > height + 1e-6 && (last > r || y > 0.0))
                    break;
                  used += rh;
                  last++;
                }
              if (last - r < MIN (2, n - r) && y > 0.0)
                {
                  page++;
                  y = 0.0;
                  continue;
                }
              place (doc, page, b, y, used, r, last);
              y += used;
              r = last;
              if (r < n)
                {
                  page++;
                  y = 0.0;
                }
            }
          y += b->space_after;
          continue;
        }
      {
        double h = b->measure (pl, b->data, width);
        double need = chain_need (pl, doc, i, width, TRUE);
        if (y > 0.0 && y + need > height)
          {
            page++;
            y = 0.0;
          }
        place (doc, page, b, y, h, 0, 0);
        y += h + b->space_after;
      }
    }
  doc->n_pages = page + 1;
  return doc->n_pages;
}

void
aw_pl_flow_draw_page (AwPlFlowDoc *doc, AwPl *pl, int page, double x, double y, double width)
{
  for (guint i = 0; i < doc->placements->len; i++)
    {
      const AwPlPlacement *p = &g_array_index (doc->placements, AwPlPlacement, i);
      if (p->page != page)
        continue;
      if (p->block->table)
        aw_pl_table_draw (pl, p->block->table, x, y + p->y, width, p->first_row, p->last_row);
      else
        p->block->draw (pl, p->block->data, x, y + p->y, width, p->height);
    }
}

/* ---- page furniture ---- */

double
aw_pl_footer (AwPl *pl, double x, double y, double width, const char *left, int page,
              int n_pages, double size)
{
  AwPlStyle s = aw_pl_style (size);
  g_autofree char *right = NULL;
  double rw, h;

  s.rgb[0] = s.rgb[1] = s.rgb[2] = 0.25;
  /* TRANSLATORS: page numbering at the foot of every printed page */
  right = g_strdup_printf (_("Page %d of %d"), page + 1, n_pages);
  rw = aw_pl_text_width (pl, right, &s);
  s.align = PANGO_ALIGN_RIGHT;
  h = aw_pl_text (pl, x + width - rw - 1.0, y, rw + 1.0, right, &s);
  s.align = PANGO_ALIGN_LEFT;
  s.flow = AW_PL_ELLIPSIZE;
  aw_pl_text (pl, x, y, MAX (width - rw - 8.0, 10.0), left, &s);
  cairo_set_source_rgb (pl->cr, 0.5, 0.5, 0.5);
  aw_pl_hline (pl, x, x + width, y - 2.0, 0.4);
  return h;
}
