/* aw-print-card.c: the range card (A6 pocket card, or four to an A4/Letter sheet)
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <glib/gi18n.h>
#include <math.h>

#include "aw-print-private.h"
#include "aw-units.h"

#define CARDS_PER_SHEET 4
#define SHEET_FOOTER_BAND 16.0
#define GAP 4.0
#define PLOT_MIN 95.0     /* the card's flight plot gets at least this height, pt … */
#define PLOT_DROP 50.0    /* … and is left out when less than this remains */

/* Cards go four to a page on any page wide enough for two (A4, Letter, or whatever the print
 * dialog chose), one to a page on A6. */
static gboolean
is_sheet_of_cards (double page_width)
{
  return page_width >= 1.5 * AW_PRINT_CARD_W;
}

int
aw_print_card_paginate (AwPrintJob *job, AwPl *pl, double w, double h)
{
  guint n = job->setups->len;
  /* a page smaller than two cards across takes one card per page */
  if (!is_sheet_of_cards (w))
    return (int) n;
  return (int) MAX (1, (n + CARDS_PER_SHEET - 1) / CARDS_PER_SHEET);
}

/* ---- one card ---- */

typedef struct
{
  const char *title;
  GPtrArray *lines;            /* of char* */
} InfoBox;

static double
info_box_height (AwPl *pl, const InfoBox *b, double w, double size)
{
  AwPlStyle ts = aw_pl_style_bold (size + 0.5);
  AwPlStyle s = aw_pl_style (size);
  double h = aw_pl_text_height (pl, b->title, &ts, w - 4.0) + 3.0;
  for (guint i = 0; i < b->lines->len; i++)
    h += aw_pl_text_height (pl, g_ptr_array_index (b->lines, i), &s, w - 4.0) + 0.6;
  return h + 2.5;
}

static void
info_box_draw (AwPl *pl, const InfoBox *b, double x, double y, double w, double h, double size)
{
  AwPlStyle ts = aw_pl_style_bold (size + 0.5);
  AwPlStyle s = aw_pl_style (size);
  double yy = y + 1.5;
  aw_pl_rect_fill (pl, x, y, w, h, 0.95);
  yy += aw_pl_text (pl, x + 2.0, yy, w - 4.0, b->title, &ts) + 1.5;
  for (guint i = 0; i < b->lines->len; i++)
    yy += aw_pl_text (pl, x + 2.0, yy, w - 4.0, g_ptr_array_index (b->lines, i), &s) + 0.6;
}

static void
add_line (InfoBox *b, char *line)
{
  g_ptr_array_add (b->lines, line);
}

/* Column headers of the card's table, in the job's units. */
static GPtrArray *
table_headers (AwPrintJob *job, const AwPrintSetup *ps)
{
  AwUnitSystem u = aw_print_job_unit_system (job);
  GPtrArray *h = g_ptr_array_new_with_free_func (g_free);
  const char *angle = ps->in.angle_unit == AW_ANGLE_MOA ? "MOA" : "mrad";

  /* TRANSLATORS: table column header and its unit, e.g. "Distance (m)" */
  g_ptr_array_add (h, g_strdup_printf (_("%s (%s)"), _("Distance"),
                                       aw_qty_unit (AW_QTY_DISTANCE, u)));
  /* TRANSLATORS: range-card column: rise or drop against the sight line */
  g_ptr_array_add (h, g_strdup_printf (_("%s (%s)"), _("Rise/drop"),
                                       aw_qty_unit (AW_QTY_SMALL_CM, u)));
  /* TRANSLATORS: range-card column: aim correction */
  g_ptr_array_add (h, g_strdup_printf (_("%s (%s)"), _("Hold"),
                                       aw_qty_unit (AW_QTY_SMALL_CM, u)));
  g_ptr_array_add (h, g_strdup_printf (_("%s (%s)"), _("Hold"), angle));
  /* TRANSLATORS: range-card column: time of flight */
  g_ptr_array_add (h, g_strdup_printf (_("%s (%s)"), _("Time"), "s"));
  g_ptr_array_add (h, g_strdup_printf (_("%s (%s)"), _("Speed"),
                                       aw_qty_unit (AW_QTY_VELOCITY, u)));
  g_ptr_array_add (h, g_strdup_printf (_("%s (%s)"), _("Energy"), "J"));
  /* TRANSLATORS: range-card column: sideways drift for a crosswind of 1 m/s or 1 mph;
   * the first %s is the length unit, the second the wind unit */
  g_ptr_array_add (h, g_strdup_printf (_("Drift (%s per 1 %s wind)"),
                                       aw_qty_unit (AW_QTY_SMALL_CM, u),
                                       aw_qty_unit (AW_QTY_WIND, u)));
  return h;
}

/* The cells of one range-table row, as printed (shared with the tests through the same rules:
 * distance 0 decimals, heights and holds 1, angle 1, time 2, speed 1 (m/s) or 0 (fps),
 * energy 2, drift 1). */
static void
row_cells (AwPrintJob *job, const AwRangeRow *r, char **cells)
{
  AwUnitSystem u = aw_print_job_unit_system (job);
  double wind_unit_mps = aw_qty_from_display (AW_QTY_WIND, u, 1.0);

  cells[0] = aw_pl_num (aw_qty_to_display (AW_QTY_DISTANCE, u, r->distance_m), 0);
  cells[1] = aw_pl_num (aw_qty_to_display (AW_QTY_SMALL_CM, u, r->height_cm), 1);
  cells[2] = aw_pl_num (aw_qty_to_display (AW_QTY_SMALL_CM, u, r->hold_cm), 1);
  cells[3] = aw_pl_num (r->hold_angle, 1);
  cells[4] = aw_pl_num (r->time_s, 2);
  cells[5] = aw_pl_num (aw_qty_to_display (AW_QTY_VELOCITY, u, r->speed_mps),
                        u == AW_UNITS_IMPERIAL ? 0 : 1);
  cells[6] = aw_pl_num (r->energy_j, 2);
  cells[7] = aw_pl_num (aw_qty_to_display (AW_QTY_SMALL_CM, u,
                                           r->drift_cm_per_mps * wind_unit_mps), 1);
}

static const AwPlColumn *
make_columns (GPtrArray *headers, AwPlColumn *cols)
{
  static const double weights[8] = { 0.9, 1.05, 1.0, 1.0, 0.9, 1.0, 1.0, 1.25 };
  for (int i = 0; i < 8; i++)
    {
      cols[i].header = g_ptr_array_index (headers, i);
      cols[i].weight = weights[i];
      cols[i].align = PANGO_ALIGN_RIGHT;
    }
  return cols;
}

static char *
band_text (AwPrintJob *job, const AwPrintSetup *ps)
{
  const AwBandResult *b = &ps->table.band;
  g_autofree char *half = aw_print_qty (job, AW_QTY_BAND, ps->in.band_half_m);
  g_autofree char *near = aw_print_qty (job, AW_QTY_DISTANCE, b->band_near_m);
  g_autofree char *far = aw_print_qty (job, AW_QTY_DISTANCE, b->band_range_m);
  double med = aw_print_job_min_engagement_m (job);
  g_autofree char *band = NULL;

  if (ps->status == AW_ANALYSIS_OK && isfinite (b->band_range_m))
    /* TRANSLATORS: range card; %s are the band half-height and two distances */
    band = g_strdup_printf (_("Band ±%s: from %s to %s (shaded rows)."), half, near, far);
  else
    /* TRANSLATORS: range card; the first %s is the band half-height, the second the reason */
    band = g_strdup_printf (_("Band ±%s: no band range (%s)."), half,
                            aw_print_status_text (ps->status));
  if (isfinite (med))
    {
      g_autofree char *m = aw_print_qty (job, AW_QTY_DISTANCE, med);
      /* TRANSLATORS: range card; %s is the minimum engagement distance */
      g_autofree char *no = g_strdup_printf (_("Closer than %s: no shooting (hatched rows)."), m);
      return g_strdup_printf ("%s %s", band, no);
    }
  return g_steal_pointer (&band);
}

void
aw_print_card_draw (AwPrintJob *job, AwPl *pl, const AwPrintSetup *ps, int page, int n_pages)
{
  const double m = AW_PRINT_CARD_MARGIN_PT;
  const double W = AW_PRINT_CARD_W - 2 * m;
  const double x0 = m;
  const AwSetup *s = ps->setup;
  double y = m, bottom = AW_PRINT_CARD_H - m;
  double info_size = 5.8;

  /* ---- header ---- */
  {
    AwPlStyle ts = aw_pl_style_bold (10.5);
    AwPlStyle ss = aw_pl_style (6.2);
    g_autofree char *date = aw_print_job_date_text (job);
    g_autofree char *line2 = NULL;
    g_autofree char *line3 = NULL;
    double y0 = y;

    ts.max_lines = 2;
    ss.max_lines = 2;
    if (s->replica.type && *s->replica.type)
      line2 = g_strdup_printf ("%s · %s", s->replica.type,
                               aw_print_power_source_text (s->replica.power_source));
    else
      line2 = g_strdup (aw_print_power_source_text (s->replica.power_source));
    if (job->project->name && *job->project->name)
      /* TRANSLATORS: range card header: project (owner or team) name and date */
      line3 = g_strdup_printf (_("Project: %s · %s"), job->project->name, date);
    else
      line3 = g_strdup (date);

    y += aw_pl_text (pl, x0 + 6.0, y, W - 6.0, s->name, &ts) + 0.5;
    y += aw_pl_text (pl, x0 + 6.0, y, W - 6.0, line2, &ss);
    ss.max_lines = 1;
    ss.flow = AW_PL_ELLIPSIZE;
    y += aw_pl_text (pl, x0 + 6.0, y, W - 6.0, line3, &ss);
    aw_pl_set_rgb (pl, ps->rgb);
    cairo_rectangle (pl->cr, x0, y0, 3.0, y - y0);
    cairo_fill (pl->cr);
    y += 4.0;
  }

  /* ---- load, power, sighting ---- */
  {
    InfoBox boxes[3];
    double bw = (W - 2 * GAP) / 3.0, bh = 0.0;
    g_autofree char *vel = aw_print_velocity_text (job, ps->velocity_mps);
    g_autofree char *mass = aw_pl_num_unit (aw_kg_to_g (ps->in.shot.mass_kg), 2, "g");
    g_autofree char *diam = aw_pl_num_unit (aw_m_to_mm (ps->in.shot.diameter_m), 2, "mm");
    g_autofree char *energy = aw_pl_num_unit (ps->energy_j, 2, "J");
    g_autofree char *hop = aw_print_hop_text (ps);
    double med = aw_print_job_min_engagement_m (job);

    boxes[0].title = _("Load");
    boxes[1].title = _("Power");
    boxes[2].title = _("Sighting");
    for (int i = 0; i < 3; i++)
      boxes[i].lines = g_ptr_array_new_with_free_func (g_free);

    /* TRANSLATORS: BB mass and diameter, e.g. "BB 0.25 g, 5.95 mm" */
    add_line (&boxes[0], g_strdup_printf (_("BB %s, %s"), mass, diam));
    /* TRANSLATORS: %s is the hop description */
    add_line (&boxes[0], g_strdup_printf (_("Hop: %s"), hop));

    /* TRANSLATORS: muzzle velocity with a BB mass, e.g. "99.8 m/s (327 fps) with 0.20 g" */
    add_line (&boxes[1], g_strdup_printf (_("%s with %s"), vel, mass));
    /* TRANSLATORS: muzzle energy */
    add_line (&boxes[1], g_strdup_printf (_("Energy %s"), energy));
    if (job->site_class)
      {
        g_autofree char *lim = aw_pl_num_unit (job->site_class->energy_limit_j, 2, "J");
        g_autofree char *chrono = aw_pl_num_unit (ps->chrono_energy_j, 2, "J");
        /* TRANSLATORS: energy limit and site class name */
        add_line (&boxes[1], g_strdup_printf (_("Limit %s (%s)"), lim, job->site_class->name));
        /* TRANSLATORS: energy as the site measures it, and the verdict */
        add_line (&boxes[1], g_strdup_printf (_("Site chrono: %s, %s"), chrono,
                                              aw_print_compliance_text (ps->compliance)));
      }
    else
      add_line (&boxes[1], aw_print_site_text (job));
    if (isfinite (med))
      {
        g_autofree char *d = aw_print_qty (job, AW_QTY_DISTANCE, med);
        /* TRANSLATORS: the site's minimum engagement distance */
        add_line (&boxes[1], g_strdup_printf (_("Min. engagement %s"), d));
      }

    {
      g_autofree char *sh = aw_print_qty (job, AW_QTY_SIGHT_HEIGHT, ps->in.sight_height_m);
      g_autofree char *mh = aw_print_qty (job, AW_QTY_HEIGHT, ps->in.shot.height_m);
      /* TRANSLATORS: sight height above the bore */
      add_line (&boxes[2], g_strdup_printf (_("Sight height %s"), sh));
      if (isfinite (ps->in.zero_distance_m) && ps->in.zero_distance_m > 0)
        {
          g_autofree char *z = aw_print_qty (job, AW_QTY_DISTANCE, ps->in.zero_distance_m);
          /* TRANSLATORS: zero distance of the sight */
          add_line (&boxes[2], g_strdup_printf (_("Zero %s"), z));
        }
      else
        add_line (&boxes[2], g_strdup (_("No zero: bore level")));
      /* TRANSLATORS: the angle unit of the hold column */
      add_line (&boxes[2], g_strdup_printf (_("Angle unit %s"),
                                            ps->in.angle_unit == AW_ANGLE_MOA ? "MOA" : "mrad"));
      /* TRANSLATORS: muzzle height above the ground */
      add_line (&boxes[2], g_strdup_printf (_("Muzzle height %s"), mh));
    }

    for (int i = 0; i < 3; i++)
      bh = MAX (bh, info_box_height (pl, &boxes[i], bw, info_size));
    /* long translations: shrink the boxes' text rather than eat the table */
    while (bh > 62.0 && info_size > 4.6)
      {
        info_size -= 0.2;
        bh = 0.0;
        for (int i = 0; i < 3; i++)
          bh = MAX (bh, info_box_height (pl, &boxes[i], bw, info_size));
      }
    for (int i = 0; i < 3; i++)
      {
        info_box_draw (pl, &boxes[i], x0 + i * (bw + GAP), y, bw, bh, info_size);
        g_ptr_array_unref (boxes[i].lines);
      }
    y += bh + 3.0;
  }

  /* ---- conditions ---- */
  {
    g_autofree char *c = aw_print_conditions_text (job, ps);
    y += aw_pl_label_value (pl, x0, y, W, _("Conditions"), c, 5.8, TRUE) + 3.0;
  }

  /* ---- from the bottom: footer, caution, plot, band line ---- */
  {
    AwPlStyle cs = aw_pl_style (5.4);
    g_autofree char *foot = aw_print_job_footer_text (job);
    g_autofree char *band = band_text (job, ps);
    AwPlStyle bs = aw_pl_style (5.8);
    double ch, bandh, table_top = y, avail;
    GPtrArray *headers;
    AwPlColumn cols[8] = { { 0 } };
    AwPlTable t;
    int n_rows;

    if (n_pages > 0)
      aw_pl_footer (pl, x0, bottom - 7.0, W, foot, page, n_pages, 5.4);
    else
      {
        AwPlStyle fs = aw_pl_style (5.4);
        fs.flow = AW_PL_ELLIPSIZE;
        fs.rgb[0] = fs.rgb[1] = fs.rgb[2] = 0.25;
        aw_pl_text (pl, x0, bottom - 7.0, W, foot, &fs);
      }
    bottom -= 9.0;

    cs.italic = TRUE;
    ch = aw_pl_text_height (pl, aw_print_caution_short (), &cs, W - 6.0) + 4.0;
    aw_pl_rect_stroke (pl, x0, bottom - ch, W, ch, 0.6);
    aw_pl_text (pl, x0 + 3.0, bottom - ch + 2.0, W - 6.0, aw_print_caution_short (), &cs);
    bottom -= ch + 3.0;

    /* the table: rows beyond 0 m */
    headers = table_headers (job, ps);
    aw_pl_table_init (&t, make_columns (headers, cols), 8, 6.2);
    t.header_size = 5.6;
    for (size_t i = 0; i < ps->table.n_rows; i++)
      {
        const AwRangeRow *r = &ps->table.rows[i];
        AwPlRowFlags f = AW_PL_ROW_PLAIN;
        char *cells[8];
        if (!(r->distance_m > 0.0))
          continue;
        if (r->in_band)
          f |= AW_PL_ROW_SHADED;
        if (!r->beyond_min_distance && isfinite (aw_print_job_min_engagement_m (job)))
          f |= AW_PL_ROW_HATCHED;
        row_cells (job, r, cells);
        aw_pl_table_add_row (&t, cells, f);
      }
    n_rows = aw_pl_table_n_rows (&t);

    bandh = aw_pl_text_height (pl, band, &bs, W);
    /* table, band line and plot share what is left */
    avail = bottom - table_top - bandh - 6.0;
    if (n_rows == 0)
      {
        AwPlStyle ms = aw_pl_style_bold (7.0);
        /* TRANSLATORS: range card without rows; %s is the reason */
        g_autofree char *msg = g_strdup_printf (_("No range table: %s. Check the hop and the "
                                                  "zero distance of this setup."),
                                                aw_print_status_text (ps->status));
        double mh = aw_pl_text_height (pl, msg, &ms, W - 8.0) + 8.0;
        aw_pl_rect_fill (pl, x0, table_top, W, mh, 0.92);
        aw_pl_text (pl, x0 + 4.0, table_top + 4.0, W - 8.0, msg, &ms);
        y = table_top + mh + 3.0;
      }
    else
      {
        double hh = aw_pl_table_header_height (pl, &t, W);
        /* rows up to 10.5 pt, as long as the plot keeps PLOT_MIN; rows not below 7 pt (the
         * plot is left out when that leaves it too little room) */
        double rh = CLAMP ((avail - hh - PLOT_MIN) / n_rows, 7.0, 10.5);
        if (avail - hh - rh * n_rows < PLOT_DROP)
          rh = MAX ((avail - hh) / n_rows, 4.0);
        if (rh < 7.4)
          t.size = MAX (3.6, rh / 1.25);
        t.row_height = rh;
        aw_pl_table_draw (pl, &t, x0, table_top, W, 0, n_rows);
        y = table_top + hh + rh * n_rows + 3.0;
      }
    aw_pl_table_clear (&t);
    g_ptr_array_unref (headers);

    y += aw_pl_text (pl, x0, y, W, band, &bs) + 3.0;
    if (bottom - y >= PLOT_DROP)
      {
        const AwPrintSetup *one[1] = { ps };
        aw_print_draw_flight_plot (job, pl, one, 1, x0, y, W, bottom - y, FALSE, 0.5);
      }
  }
}

/* ---- pages ---- */

void
aw_print_card_draw_page (AwPrintJob *job, AwPl *pl, int page, double w, double h)
{
  guint n = job->setups->len;
  int n_pages = job->n_pages;

  if (!is_sheet_of_cards (w))
    {
      const AwPrintSetup *ps = &g_array_index (job->setups, AwPrintSetup, (guint) page % n);
      double s = MIN (w / AW_PRINT_CARD_W, h / AW_PRINT_CARD_H);
      cairo_save (pl->cr);
      cairo_translate (pl->cr, (w - s * AW_PRINT_CARD_W) / 2.0, (h - s * AW_PRINT_CARD_H) / 2.0);
      cairo_scale (pl->cr, s, s);
      aw_print_card_draw (job, pl, ps, page, n_pages);
      cairo_restore (pl->cr);
      return;
    }

  {
    double cw = w / 2.0, chh = (h - SHEET_FOOTER_BAND) / 2.0;
    double s = MIN (cw / AW_PRINT_CARD_W, chh / AW_PRINT_CARD_H);
    g_autofree char *foot = aw_print_job_footer_text (job);

    for (int k = 0; k < CARDS_PER_SHEET; k++)
      {
        guint idx = (guint) (page * CARDS_PER_SHEET + k);
        const AwPrintSetup *ps;
        double cx = (k % 2) * cw, cy = (k / 2) * chh;

        if (n == 1)
          idx = 0;  /* one setup: copies to cut out */
        else if (idx >= n)
          break;
        ps = &g_array_index (job->setups, AwPrintSetup, idx);
        cairo_save (pl->cr);
        cairo_translate (pl->cr, cx + (cw - s * AW_PRINT_CARD_W) / 2.0,
                         cy + (chh - s * AW_PRINT_CARD_H) / 2.0);
        cairo_scale (pl->cr, s, s);
        aw_print_card_draw (job, pl, ps, page, 0);
        cairo_restore (pl->cr);
      }

    /* cut lines */
    cairo_save (pl->cr);
    cairo_set_source_rgb (pl->cr, 0.6, 0.6, 0.6);
    cairo_set_line_width (pl->cr, 0.4);
    cairo_set_dash (pl->cr, (double[]) { 3.0, 3.0 }, 2, 0.0);
    cairo_move_to (pl->cr, cw, 0);
    cairo_line_to (pl->cr, cw, 2 * chh);
    cairo_move_to (pl->cr, 0, chh);
    cairo_line_to (pl->cr, w, chh);
    cairo_stroke (pl->cr);
    cairo_restore (pl->cr);

    aw_pl_footer (pl, AW_PRINT_CARD_MARGIN_PT, h - SHEET_FOOTER_BAND + 5.0,
                  w - 2 * AW_PRINT_CARD_MARGIN_PT, foot, page, n_pages, 6.0);
  }
}
