/* aw-print-layout.h: text, tables, boxes and page flow for the printed outputs
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Helpers shared by the range card, the setup sheet and the loadout sheet. Every length is in
 * points. Text goes through pango so translated strings wrap, shrink or ellipsize instead of
 * running out of their box. Nothing here knows about widgets.
 */
#pragma once

#include <cairo.h>
#include <glib.h>
#include <pango/pango.h>

G_BEGIN_DECLS

#define AW_PL_FONT_FAMILY "DejaVu Sans, Sans"

typedef struct
{
  cairo_t *cr;
  PangoContext *pango;
} AwPl;

/* ---- text ---- */

typedef enum
{
  AW_PL_WRAP = 0,       /* wrap onto as many lines as needed (max_lines > 0 caps them) */
  AW_PL_FIT,            /* one line: shrink down to min_size, then ellipsize */
  AW_PL_ELLIPSIZE,      /* one line, ellipsized at the end */
} AwPlFlow;

typedef struct
{
  double size;          /* font size, pt */
  double min_size;      /* AW_PL_FIT: smallest size (0: 0.6 × size) */
  gboolean bold;
  gboolean italic;
  gboolean mono;        /* monospaced family */
  PangoAlignment align;
  AwPlFlow flow;
  int max_lines;        /* AW_PL_WRAP: ellipsize after this many lines (0: no limit) */
  double rgb[3];
} AwPlStyle;

/* Style with the given size and everything else plain (left, wrap, black). */
AwPlStyle aw_pl_style (double size);
AwPlStyle aw_pl_style_bold (double size);

/* Builds a layout of text (plain text, not markup) for a box `width` wide. */
PangoLayout *aw_pl_layout (AwPl *pl, const char *text, const AwPlStyle *style, double width);

/* Height text takes in a box `width` wide. */
double aw_pl_text_height (AwPl *pl, const char *text, const AwPlStyle *style, double width);

/* Natural width of text on one line. */
double aw_pl_text_width (AwPl *pl, const char *text, const AwPlStyle *style);

/* Draws text with its top-left corner at (x, y) in a box `width` wide; returns its height. */
double aw_pl_text (AwPl *pl, double x, double y, double width, const char *text,
                   const AwPlStyle *style);

/* Draws text on one line inside the cell (x, y, w, h), vertically centred, shrinking the font
 * (down to style->min_size) and ellipsizing when it still does not fit. */
void aw_pl_text_cell (AwPl *pl, double x, double y, double w, double h, const char *text,
                      const AwPlStyle *style);

/* "Label: value" pairs, label in bold; wraps. Returns the height. draw FALSE only measures. */
double aw_pl_label_value (AwPl *pl, double x, double y, double width, const char *label,
                          const char *value, double size, gboolean draw);

/* ---- numbers ---- */

/* A number for people: the locale's decimal mark, a true minus sign (U+2212), no "−0", and an
 * en dash "–" for NAN/infinity. */
char *aw_pl_num (double v, int decimals);

/* Number with a unit: "12.5 cm" (a thin no-break space between). */
char *aw_pl_num_unit (double v, int decimals, const char *unit);

/* ---- drawing ---- */

void aw_pl_set_rgb (AwPl *pl, const double rgb[3]);
void aw_pl_rect_fill (AwPl *pl, double x, double y, double w, double h, double grey);
void aw_pl_rect_stroke (AwPl *pl, double x, double y, double w, double h, double line_width);
void aw_pl_hline (AwPl *pl, double x0, double x1, double y, double line_width);
void aw_pl_hatch (AwPl *pl, double x, double y, double w, double h, double spacing);

/* Parses "#rrggbb" (falls back to a dark blue). */
void aw_pl_parse_colour (const char *text, double rgb[3]);

/* A titled box: title bar in bold on a light grey band. Returns the title bar's height; the
 * content starts below it. draw FALSE only measures. */
double aw_pl_box_title (AwPl *pl, double x, double y, double w, const char *title, double size,
                        gboolean draw);

/* ---- plot keys ---- */

typedef struct
{
  const char *label;
  double rgb[3];
  double dash[4];       /* n_dash values, pt */
  int n_dash;           /* 0: solid */
  double line_width;    /* 0: 1.2 */
} AwPlKeyItem;

/* One item per line: a short line sample and its label (wrapped). Returns the height. */
double aw_pl_key (AwPl *pl, double x, double y, double w, const AwPlKeyItem *items, int n,
                  double size, gboolean draw);

/* ---- tables ---- */

typedef struct
{
  const char *header;   /* may wrap onto up to three lines and shrink */
  double weight;        /* relative width */
  PangoAlignment align;
  gboolean wrap;        /* body text wraps onto two lines (names) instead of shrinking */
} AwPlColumn;

typedef enum
{
  AW_PL_ROW_PLAIN = 0,
  AW_PL_ROW_SHADED = 1 << 0,   /* light grey background */
  AW_PL_ROW_HATCHED = 1 << 1,  /* diagonal hatching (no-shoot distances) */
  AW_PL_ROW_BOLD = 1 << 2,
  AW_PL_ROW_RULE = 1 << 3,     /* a heavier rule above the row */
} AwPlRowFlags;

typedef struct
{
  const AwPlColumn *columns;
  int n_columns;
  GPtrArray *cells;            /* of char*, row-major, n_columns per row */
  GArray *flags;               /* of AwPlRowFlags, one per row */
  double size;                 /* body font size */
  double header_size;
  double row_height;           /* 0: from the font size */
  GPtrArray *keep;             /* memory freed with the table (column arrays, headers) */
} AwPlTable;

void aw_pl_table_init (AwPlTable *t, const AwPlColumn *columns, int n_columns, double size);
void aw_pl_table_clear (AwPlTable *t);
/* Appends a row; takes ownership of the n_columns strings in cells (NULL: empty cell). */
void aw_pl_table_add_row (AwPlTable *t, char **cells, AwPlRowFlags flags);
int aw_pl_table_n_rows (const AwPlTable *t);
/* Frees p (g_free) together with the table; returns p. */
gpointer aw_pl_table_keep (AwPlTable *t, gpointer p);

double aw_pl_table_header_height (AwPl *pl, const AwPlTable *t, double width);
double aw_pl_table_row_height (const AwPlTable *t);
/* Height of row r: the base height, more when a wrapping cell needs two lines. */
double aw_pl_table_row_height_at (AwPl *pl, const AwPlTable *t, double width, int r);
/* Draws the header and rows [first, last) at (x, y); returns the height used. */
double aw_pl_table_draw (AwPl *pl, const AwPlTable *t, double x, double y, double width,
                         int first, int last);

/* ---- page flow ---- */

typedef struct _AwPlBlock AwPlBlock;

/* A block measures itself for a width; tables can be split between rows. */
typedef double (*AwPlMeasureFunc) (AwPl *pl, gpointer data, double width);
typedef void (*AwPlDrawFunc) (AwPl *pl, gpointer data, double x, double y, double width,
                              double height);

struct _AwPlBlock
{
  AwPlMeasureFunc measure;
  AwPlDrawFunc draw;
  gpointer data;
  GDestroyNotify destroy;
  AwPlTable *table;        /* when set, the block is this table (split between pages) */
  double space_after;
  gboolean keep_with_next; /* never the last block on a page (headings) */
  gboolean new_page;       /* starts a new page */
};

typedef struct
{
  int page;
  const AwPlBlock *block;
  double y;
  double height;
  int first_row, last_row; /* tables */
} AwPlPlacement;

typedef struct
{
  GPtrArray *blocks;       /* of AwPlBlock* */
  GArray *placements;      /* of AwPlPlacement, after aw_pl_flow_paginate */
  int n_pages;
} AwPlFlowDoc;

void aw_pl_flow_init (AwPlFlowDoc *doc);
void aw_pl_flow_clear (AwPlFlowDoc *doc);
AwPlBlock *aw_pl_flow_add (AwPlFlowDoc *doc, AwPlMeasureFunc measure, AwPlDrawFunc draw,
                           gpointer data, GDestroyNotify destroy);
/* A table block; the document takes ownership of the table. */
AwPlBlock *aw_pl_flow_add_table (AwPlFlowDoc *doc, AwPlTable *table);
/* A paragraph (text copied). */
AwPlBlock *aw_pl_flow_add_text (AwPlFlowDoc *doc, const char *text, const AwPlStyle *style);
/* A section heading with a rule under it; kept with the next block. */
AwPlBlock *aw_pl_flow_add_heading (AwPlFlowDoc *doc, const char *text, double size);
/* A framed box with a title bar and lines of text ("Label: value" or plain paragraphs), and
 * optionally empty ruled lines to write on. */
typedef struct
{
  char *title;
  GPtrArray *lines;            /* private */
  double size;                 /* body font size, default 8.5 */
  double border_rgb[3];
  double border_width;         /* default 0.6 */
  int write_in_lines;          /* empty ruled lines at the end */
} AwPlBox;

AwPlBox *aw_pl_flow_add_box (AwPlFlowDoc *doc, const char *title, AwPlBlock **block);
void aw_pl_box_add (AwPlBox *box, const char *label, const char *text);
/* A line in its own size, weight and colour (verdicts). */
void aw_pl_box_add_styled (AwPlBox *box, const char *text, const AwPlStyle *style);

/* Lays the blocks out in a column `width` wide and `height` high per page. */
int aw_pl_flow_paginate (AwPlFlowDoc *doc, AwPl *pl, double width, double height);
/* Draws the blocks placed on `page`, the column's top-left corner at (x, y). */
void aw_pl_flow_draw_page (AwPlFlowDoc *doc, AwPl *pl, int page, double x, double y,
                           double width);

/* ---- page furniture ---- */

/* Footer line: left "Arcwright · date", right "Page N of M". Returns its height. */
double aw_pl_footer (AwPl *pl, double x, double y, double width, const char *left, int page,
                     int n_pages, double size);

G_END_DECLS
