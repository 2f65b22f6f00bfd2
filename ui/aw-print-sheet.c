/* aw-print-sheet.c: the customer setup sheet (A4 or Letter, one or more pages per setup)
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <glib/gi18n.h>
#include <math.h>

#include "aw-chart.h"
#include "aw-print-private.h"
#include "aw-units.h"

#define BODY_SIZE 8.5
#define HEADING_SIZE 10.5
#define PLOT_H 185.0

/* ---- title ---- */

typedef struct
{
  AwPrintJob *job;
  const AwPrintSetup *ps;
  const char *kind;             /* "Setup sheet", "Loadout sheet" (static, translated) */
  char *name;                   /* big title */
  char *sub;                    /* line under it */
} TitleBlock;

static void
title_free (gpointer p)
{
  TitleBlock *t = p;
  g_free (t->name);
  g_free (t->sub);
  g_free (t);
}

static double
title_layout (AwPl *pl, TitleBlock *t, double x, double y, double w, gboolean draw)
{
  AwPlStyle ks = aw_pl_style_bold (8.0);
  AwPlStyle ns = aw_pl_style_bold (16.0);
  AwPlStyle ss = aw_pl_style (8.5);
  double yy = y;

  ks.rgb[0] = ks.rgb[1] = ks.rgb[2] = 0.35;
  ns.max_lines = 3;
  ss.max_lines = 3;
  if (draw)
    {
      yy += aw_pl_text (pl, x + 8.0, yy, w - 8.0, t->kind, &ks);
      yy += aw_pl_text (pl, x + 8.0, yy, w - 8.0, t->name, &ns) + 1.0;
      yy += aw_pl_text (pl, x + 8.0, yy, w - 8.0, t->sub, &ss);
      if (t->ps)
        aw_pl_set_rgb (pl, t->ps->rgb);
      else
        cairo_set_source_rgb (pl->cr, 0.3, 0.3, 0.3);
      cairo_rectangle (pl->cr, x, y, 4.0, yy - y);
      cairo_fill (pl->cr);
    }
  else
    yy += aw_pl_text_height (pl, t->kind, &ks, w - 8.0)
          + aw_pl_text_height (pl, t->name, &ns, w - 8.0) + 1.0
          + aw_pl_text_height (pl, t->sub, &ss, w - 8.0);
  return yy - y;
}

static double
title_measure (AwPl *pl, gpointer data, double width)
{
  return title_layout (pl, data, 0, 0, width, FALSE);
}

static void
title_draw (AwPl *pl, gpointer data, double x, double y, double width, double height)
{
  title_layout (pl, data, x, y, width, TRUE);
}

void
aw_print_add_title (AwPlFlowDoc *doc, AwPrintJob *job, const AwPrintSetup *ps, const char *kind,
                    const char *name, const char *sub)
{
  TitleBlock *t = g_new0 (TitleBlock, 1);
  AwPlBlock *b;
  t->job = job;
  t->ps = ps;
  t->kind = kind;
  t->name = g_strdup (name);
  t->sub = g_strdup (sub);
  b = aw_pl_flow_add (doc, title_measure, title_draw, t, title_free);
  b->space_after = 10.0;
}

/* ---- customer and job: a grid of fields, blank ones ruled to write on ---- */

typedef struct
{
  char *label;
  char *value;                  /* NULL: write in by hand */
} Field;

typedef struct
{
  GArray *fields;               /* of Field */
} FieldsBlock;

static void
fields_free (gpointer p)
{
  FieldsBlock *f = p;
  for (guint i = 0; i < f->fields->len; i++)
    {
      Field *fd = &g_array_index (f->fields, Field, i);
      g_free (fd->label);
      g_free (fd->value);
    }
  g_array_unref (f->fields);
  g_free (f);
}

static double
fields_layout (AwPl *pl, FieldsBlock *f, double x, double y, double w, gboolean draw)
{
  AwPlStyle ls = aw_pl_style_bold (6.5);
  AwPlStyle vs = aw_pl_style (BODY_SIZE);
  double cw = (w - 12.0) / 2.0, yy = y;

  ls.rgb[0] = ls.rgb[1] = ls.rgb[2] = 0.3;
  vs.max_lines = 3;
  for (guint i = 0; i < f->fields->len; i += 2)
    {
      double rh = 0.0;
      for (guint k = i; k < MIN (i + 2, f->fields->len); k++)
        {
          Field *fd = &g_array_index (f->fields, Field, k);
          double cx = x + (k - i) * (cw + 12.0);
          double h = aw_pl_text_height (pl, fd->label, &ls, cw) + 1.0;
          double vh = fd->value ? aw_pl_text_height (pl, fd->value, &vs, cw) : 0.0;
          h += MAX (vh, 11.0);
          if (draw)
            {
              double lh = aw_pl_text (pl, cx, yy, cw, fd->label, &ls) + 1.0;
              if (fd->value)
                aw_pl_text (pl, cx, yy + lh, cw, fd->value, &vs);
            }
          rh = MAX (rh, h);
        }
      if (draw)
        for (guint k = i; k < MIN (i + 2, f->fields->len); k++)
          {
            double cx = x + (k - i) * (cw + 12.0);
            cairo_set_source_rgb (pl->cr, 0.55, 0.55, 0.55);
            aw_pl_hline (pl, cx, cx + cw, yy + rh + 1.0, 0.4);
          }
      yy += rh + 5.0;
    }
  return yy - y;
}

static double
fields_measure (AwPl *pl, gpointer data, double width)
{
  return fields_layout (pl, data, 0, 0, width, FALSE);
}

static void
fields_draw (AwPl *pl, gpointer data, double x, double y, double width, double height)
{
  fields_layout (pl, data, x, y, width, TRUE);
}

static void
field_add (FieldsBlock *f, const char *label, char *value)
{
  Field fd = { g_strdup (label), value };
  if (fd.value && *fd.value == '\0')
    g_clear_pointer (&fd.value, g_free);
  g_array_append_val (f->fields, fd);
}

/* ---- chrono table ---- */

static const char *
chrono_hop_text (AwChronoHop hop)
{
  switch (hop)
    {
    case AW_CHRONO_HOP_OFF:
      return _("off");
    case AW_CHRONO_HOP_ON:
      return _("on");
    case AW_CHRONO_HOP_UNSPECIFIED:
    default:
      return "–";
    }
}

static void
add_chrono_table (AwPlFlowDoc *doc, AwPrintJob *job, const AwPrintSetup *ps)
{
  static const double weights[] = { 0.8, 0.7, 0.5, 0.7, 1, 1, 1, 0.8, 0.8, 1.1, 1.1 };
  AwPlColumn *cols = g_new0 (AwPlColumn, 11);
  AwPlTable *t = g_new0 (AwPlTable, 1);
  const char *headers[11];

  /* TRANSLATORS: chrono table column headers */
  headers[0] = _("BB (g)");
  headers[1] = _("Hop");
  headers[2] = _("Shots");
  headers[3] = _("Unit");
  headers[4] = _("Mean");
  headers[5] = _("Min");
  headers[6] = _("Max");
  headers[7] = _("SD");
  headers[8] = _("ES");
  headers[9] = _("Energy at mean (J)");
  headers[10] = _("Energy at max (J)");
  for (int i = 0; i < 11; i++)
    {
      cols[i].header = headers[i];
      cols[i].weight = weights[i];
      cols[i].align = i == 1 || i == 3 ? PANGO_ALIGN_CENTER : PANGO_ALIGN_RIGHT;
    }
  aw_pl_table_init (t, cols, 11, 8.0);
  aw_pl_table_keep (t, cols);
  t->row_height = 12.0;
  for (guint i = 0; i < ps->setup->chrono->len; i++)
    {
      const AwChronoString *c = g_ptr_array_index (ps->setup->chrono, i);
      AwChronoStats st;
      char *cells[11];

      if (!aw_chrono_string_stats (c, &st))
        continue;
      for (int pass = 0; pass < 2; pass++)
        {
          gboolean fps = pass == 0;
          double k = fps ? 1.0 / AW_M_PER_FT : 1.0;
          int d = fps ? 1 : 2;
          cells[0] = fps ? aw_pl_num (c->bb_mass_g, 2) : NULL;
          cells[1] = fps ? g_strdup (chrono_hop_text (c->hop)) : NULL;
          cells[2] = fps ? g_strdup_printf ("%u", st.n) : NULL;
          cells[3] = g_strdup (fps ? "fps" : "m/s");
          cells[4] = aw_pl_num (st.mean_mps * k, d);
          cells[5] = aw_pl_num (st.min_mps * k, d);
          cells[6] = aw_pl_num (st.max_mps * k, d);
          cells[7] = aw_pl_num (st.sd_mps * k, d);
          cells[8] = aw_pl_num (st.es_mps * k, d);
          cells[9] = fps ? aw_pl_num (st.energy_mean_j, 2) : NULL;
          cells[10] = fps ? aw_pl_num (st.energy_max_j, 2) : NULL;
          aw_pl_table_add_row (t, cells, fps ? AW_PL_ROW_RULE : AW_PL_ROW_PLAIN);
        }
    }
  (void) job;
  if (aw_pl_table_n_rows (t) == 0)
    {
      AwPlStyle s = aw_pl_style (BODY_SIZE);
      g_autofree char *v = aw_print_velocity_text (job, ps->velocity_mps);
      g_autofree char *m = aw_pl_num_unit (aw_kg_to_g (ps->in.shot.mass_kg), 2, "g");
      /* TRANSLATORS: setup sheet, when no chrono string was recorded; %s are a velocity and a
       * BB mass */
      g_autofree char *txt = g_strdup_printf (_("No chrono string is recorded for this setup. "
                                                "The figures below use the replica’s reference "
                                                "velocity: %s with %s."), v, m);
      aw_pl_table_clear (t);
      g_free (t);
      aw_pl_flow_add_text (doc, txt, &s);
      return;
    }
  aw_pl_flow_add_table (doc, t);

  /* what was recorded with each string */
  {
    GString *notes = g_string_new (NULL);
    AwPlStyle ns = aw_pl_style (7.5);
    for (guint i = 0; i < ps->setup->chrono->len; i++)
      {
        const AwChronoString *c = g_ptr_array_index (ps->setup->chrono, i);
        g_autofree char *m = aw_pl_num_unit (c->bb_mass_g, 2, "g");
        GString *parts = g_string_new (NULL);
        if (isfinite (c->temperature_c))
          {
            g_autofree char *temp = aw_print_qty (job, AW_QTY_TEMPERATURE, c->temperature_c);
            g_string_append (parts, temp);
          }
        if (c->date && *c->date)
          g_string_append_printf (parts, "%s%s", parts->len ? ", " : "", c->date);
        if (c->note && *c->note)
          g_string_append_printf (parts, "%s%s", parts->len ? ", " : "", c->note);
        if (parts->len)
          g_string_append_printf (notes, "%s%s: %s", notes->len ? "; " : "", m, parts->str);
        g_string_free (parts, TRUE);
      }
    if (notes->len)
      {
        /* TRANSLATORS: under the chrono table: temperature, date and notes of each string */
        g_autofree char *txt = g_strdup_printf (_("Recorded with the strings: %s."), notes->str);
        ns.italic = TRUE;
        aw_pl_flow_add_text (doc, txt, &ns);
      }
    g_string_free (notes, TRUE);
  }
}

/* ---- BB-mass sweep plot: band range and energy against BB mass ---- */

typedef struct
{
  AwPrintJob *job;
  const AwPrintSetup *ps;
} PlotsBlock;

static void
draw_sweep_plot (AwPrintJob *job, AwPl *pl, const AwPrintSetup *ps, double x, double y,
                 double w, double h)
{
  cairo_t *cr = pl->cr;
  AwChartStyle style;
  AwChartRect area;
  AwAxis ax = { 0 }, ayl = { 0 }, ayr = { 0 };
  AwUnitSystem u = aw_print_job_unit_system (job);
  const AwRecommendation *rec = &ps->rec;
  double rmax = 0.0, emax = 0.0, lim = NAN;
  g_autofree char *xt = NULL, *yl = NULL, *yr = NULL;
  AwRgba band_c = { 0.13, 0.36, 0.65, 1 }, energy_c = { 0.75, 0.33, 0.05, 1 };

  aw_chart_style_scaled (aw_chart_style_light (), 0.62, &style);
  style.font_family = "DejaVu Sans";
  if (!ps->has_rec || rec->n_rows == 0)
    return;
  for (size_t i = 0; i < rec->n_rows; i++)
    {
      if (isfinite (rec->rows[i].band.band_range_m))
        rmax = MAX (rmax, aw_qty_to_display (AW_QTY_DISTANCE, u, rec->rows[i].band.band_range_m));
      if (isfinite (rec->rows[i].energy_j))
        emax = MAX (emax, rec->rows[i].energy_j);
      if (isfinite (rec->rows[i].chrono_energy_j))
        emax = MAX (emax, rec->rows[i].chrono_energy_j);
    }
  if (job->site_class && job->site_class->energy_limit_j > 0)
    {
      lim = job->site_class->energy_limit_j;
      emax = MAX (emax, lim);
    }
  rmax = rmax > 0 ? rmax * 1.1 : 10.0;
  emax = emax > 0 ? emax * 1.15 : 1.0;

  cairo_save (cr);
  cairo_set_source_rgb (cr, 1, 1, 1);
  cairo_rectangle (cr, x, y, w, h);
  cairo_fill (cr);
  cairo_translate (cr, x + 3.0, y + 3.0);
  w -= 6.0;
  h -= 6.0;
  area.x = aw_chart_axis_margin (&style, AW_AXIS_LEFT, TRUE);
  area.y = style.font_size * 1.2;
  area.width = w - area.x - aw_chart_axis_margin (&style, AW_AXIS_RIGHT, TRUE);
  area.height = h - area.y - aw_chart_axis_margin (&style, AW_AXIS_BOTTOM, TRUE);

  xt = g_strdup_printf (_("%s (%s)"), _("BB mass"), "g");
  yl = g_strdup_printf (_("%s (%s)"), _("Band range"), aw_qty_unit (AW_QTY_DISTANCE, u));
  yr = g_strdup_printf (_("%s (%s)"), _("Energy"), "J");
  ax.side = AW_AXIS_BOTTOM;
  ax.lo = 0.18;
  ax.hi = 0.50;
  ax.title = xt;
  ax.grid = true;
  ayl.side = AW_AXIS_LEFT;
  ayl.lo = 0;
  ayl.hi = rmax;
  ayl.title = yl;
  ayl.grid = true;
  ayr.side = AW_AXIS_RIGHT;
  ayr.lo = 0;
  ayr.hi = emax;
  ayr.title = yr;
  aw_chart_draw_axis (cr, &style, &area, &ax);
  aw_chart_draw_axis (cr, &style, &area, &ayl);
  aw_chart_draw_axis (cr, &style, &area, &ayr);

  cairo_save (cr);
  cairo_rectangle (cr, area.x, area.y, area.width, area.height);
  cairo_clip (cr);
  /* the site's limit on the energy axis */
  if (isfinite (lim))
    {
      double py = aw_chart_map (lim, 0, emax, area.y + area.height, area.y);
      cairo_set_source_rgb (cr, 0.8, 0.1, 0.1);
      cairo_set_line_width (cr, 0.8);
      cairo_set_dash (cr, (double[]) { 4, 2 }, 2, 0);
      cairo_move_to (cr, area.x, py);
      cairo_line_to (cr, area.x + area.width, py);
      cairo_stroke (cr);
      cairo_set_dash (cr, NULL, 0, 0);
    }
  /* the BB the setup uses */
  {
    double px = aw_chart_map (aw_kg_to_g (ps->in.shot.mass_kg), ax.lo, ax.hi, area.x,
                              area.x + area.width);
    cairo_set_source_rgb (cr, 0.5, 0.5, 0.5);
    cairo_set_line_width (cr, 0.6);
    cairo_set_dash (cr, (double[]) { 1, 2 }, 2, 0);
    cairo_move_to (cr, px, area.y);
    cairo_line_to (cr, px, area.y + area.height);
    cairo_stroke (cr);
    cairo_set_dash (cr, NULL, 0, 0);
  }
  for (int series = 0; series < 2; series++)
    {
      gboolean started = FALSE;
      aw_chart_set_source (cr, series == 0 ? &band_c : &energy_c);
      cairo_set_line_width (cr, 1.3);
      if (series == 1)
        cairo_set_dash (cr, (double[]) { 3, 1.5 }, 2, 0);
      for (size_t i = 0; i < rec->n_rows; i++)
        {
          const AwRecommendRow *r = &rec->rows[i];
          double v = series == 0 ? aw_qty_to_display (AW_QTY_DISTANCE, u, r->band.band_range_m)
                                 : (isfinite (r->chrono_energy_j) && job->site_class
                                    ? r->chrono_energy_j : r->energy_j);
          double px = aw_chart_map (aw_kg_to_g (r->mass_kg), ax.lo, ax.hi, area.x,
                                    area.x + area.width);
          double py = aw_chart_map (v, 0, series == 0 ? rmax : emax, area.y + area.height,
                                    area.y);
          if (!isfinite (v))
            {
              started = FALSE;
              continue;
            }
          if (started)
            cairo_line_to (cr, px, py);
          else
            cairo_move_to (cr, px, py);
          started = TRUE;
        }
      cairo_stroke (cr);
      cairo_set_dash (cr, NULL, 0, 0);
      for (size_t i = 0; i < rec->n_rows; i++)
        {
          const AwRecommendRow *r = &rec->rows[i];
          double v = series == 0 ? aw_qty_to_display (AW_QTY_DISTANCE, u, r->band.band_range_m)
                                 : (isfinite (r->chrono_energy_j) && job->site_class
                                    ? r->chrono_energy_j : r->energy_j);
          double px = aw_chart_map (aw_kg_to_g (r->mass_kg), ax.lo, ax.hi, area.x,
                                    area.x + area.width);
          double py = aw_chart_map (v, 0, series == 0 ? rmax : emax, area.y + area.height,
                                    area.y);
          if (!isfinite (v))
            continue;
          if (series == 0 && r->compliance == AW_COMPLIANCE_OVER)
            {
              /* over the limit: a cross */
              cairo_move_to (cr, px - 2.2, py - 2.2);
              cairo_line_to (cr, px + 2.2, py + 2.2);
              cairo_move_to (cr, px - 2.2, py + 2.2);
              cairo_line_to (cr, px + 2.2, py - 2.2);
              cairo_stroke (cr);
            }
          else
            {
              cairo_arc (cr, px, py, r->recommended && series == 0 ? 3.2 : 1.6, 0, 2 * G_PI);
              cairo_fill (cr);
            }
        }
    }
  cairo_restore (cr);

  cairo_restore (cr);
  cairo_set_source_rgb (cr, 0.6, 0.6, 0.6);
  aw_pl_rect_stroke (pl, x, y, w + 6.0, h + 6.0, 0.4);
}

#define KEY_SIZE 7.0

/* Keys under the two plots: a caption for the flight, the series of the sweep. */
static int
sweep_key (PlotsBlock *b, AwPlKeyItem *items)
{
  int n = 0;
  items[n++] = (AwPlKeyItem) { _("band range with auto hop, at each BB mass (dot: recommended, "
                                 "cross: over the limit)"), { 0.13, 0.36, 0.65 }, { 0 }, 0, 1.3 };
  items[n++] = (AwPlKeyItem) { b->job->site_class ? _("energy as the site measures it (right "
                                                      "axis)")
                                                  : _("muzzle energy (right axis)"),
                               { 0.75, 0.33, 0.05 }, { 3, 1.5 }, 2, 1.3 };
  if (b->job->site_class && b->job->site_class->energy_limit_j > 0)
    items[n++] = (AwPlKeyItem) { _("the site’s energy limit"), { 0.8, 0.1, 0.1 }, { 4, 2 }, 2,
                                 0.8 };
  items[n++] = (AwPlKeyItem) { _("the BB this setup uses"), { 0.5, 0.5, 0.5 }, { 1, 2 }, 2, 0.6 };
  return n;
}

static double
plots_keys (AwPl *pl, PlotsBlock *b, double x, double y, double width, gboolean draw)
{
  double pw = (width - 10.0) / 2.0;
  AwPlStyle cap = aw_pl_style (KEY_SIZE);
  AwPlStyle title = aw_pl_style_bold (KEY_SIZE + 0.5);
  AwPlKeyItem items[4];
  int n = sweep_key (b, items);
  /* TRANSLATORS: caption under the flight plot of the setup sheet */
  const char *fc = _("Flight of this setup from the side, with its hop and sight; green: the band "
                     "around the sight line.");
  /* TRANSLATORS: title of the BB-mass plot on the setup sheet */
  const char *st = _("Heavier or lighter BB");
  double hl, hr;

  if (draw)
    {
      hl = aw_pl_text (pl, x, y, pw, fc, &cap);
      hr = aw_pl_text (pl, x + pw + 10.0, y, pw, st, &title) + 1.0;
      hr += aw_pl_key (pl, x + pw + 10.0, y + hr, pw, items, n, KEY_SIZE, TRUE);
    }
  else
    {
      hl = aw_pl_text_height (pl, fc, &cap, pw);
      hr = aw_pl_text_height (pl, st, &title, pw) + 1.0
           + aw_pl_key (pl, 0, 0, pw, items, n, KEY_SIZE, FALSE);
    }
  return MAX (hl, hr);
}

static double
plots_measure (AwPl *pl, gpointer data, double width)
{
  return PLOT_H + 4.0 + plots_keys (pl, data, 0, 0, width, FALSE);
}

static void
plots_draw (AwPl *pl, gpointer data, double x, double y, double width, double height)
{
  PlotsBlock *b = data;
  double pw = (width - 10.0) / 2.0;
  const AwPrintSetup *one[1] = { b->ps };
  aw_print_draw_flight_plot (b->job, pl, one, 1, x, y, pw, PLOT_H, FALSE, 0.62);
  draw_sweep_plot (b->job, pl, b->ps, x + pw + 10.0, y, pw, PLOT_H);
  plots_keys (pl, b, x, y + PLOT_H + 4.0, width, TRUE);
}

/* ---- sign-off ---- */

static double
signoff_layout (AwPl *pl, double x, double y, double w, gboolean draw)
{
  AwPlStyle s = aw_pl_style (BODY_SIZE);
  AwPlStyle ls = aw_pl_style (6.5);
  const char *who[2] = { _("Technician"), _("Customer") };
  /* TRANSLATORS: sign-off statement on the setup sheet */
  const char *stmt = _("Handed over after the chronograph test recorded above. The customer has "
                       "read the safety notes.");
  double yy = y, cw = (w - 20.0) / 2.0;

  ls.rgb[0] = ls.rgb[1] = ls.rgb[2] = 0.3;
  yy += (draw ? aw_pl_text (pl, x, yy, w, stmt, &s) : aw_pl_text_height (pl, stmt, &s, w)) + 26.0;
  for (int i = 0; i < 2; i++)
    {
      double cx = x + i * (cw + 20.0);
      /* TRANSLATORS: under a signature line: who signs, then "signature and date" */
      g_autofree char *lab = g_strdup_printf (_("%s: name, signature and date"), who[i]);
      if (draw)
        {
          cairo_set_source_rgb (pl->cr, 0, 0, 0);
          aw_pl_hline (pl, cx, cx + cw, yy, 0.6);
          aw_pl_text (pl, cx, yy + 2.0, cw, lab, &ls);
        }
    }
  yy += 2.0 + MAX (aw_pl_text_height (pl, who[0], &ls, cw), 20.0);
  return yy - y;
}

static double
signoff_measure (AwPl *pl, gpointer data, double width)
{
  return signoff_layout (pl, 0, 0, width, FALSE);
}

static void
signoff_draw (AwPl *pl, gpointer data, double x, double y, double width, double height)
{
  signoff_layout (pl, x, y, width, TRUE);
}

/* ---- the document ---- */

static char *
energy_model_text (const AwPrintSetup *ps)
{
  const AwReplica *r = &ps->setup->replica;
  g_autofree char *ref = NULL;
  g_autofree char *m = aw_pl_num_unit (r->ref_mass_g, 2, "g");
  g_autofree char *v = aw_pl_num_unit (r->ref_velocity_mps, 1, "m/s");

  /* TRANSLATORS: the replica's reference chrono: a velocity with a BB mass */
  ref = g_strdup_printf (_("%s with %s"), v, m);
  switch (r->energy_model)
    {
    case AW_POWER_CONSTANT_VELOCITY:
      return g_strdup_printf (_("same velocity with every BB; reference %s"), ref);
    case AW_POWER_CREEP:
      {
        g_autofree char *c = aw_pl_num (r->creep_pct_per_01g, 1);
        /* TRANSLATORS: energy creep model; %s: percent per 0.1 g, then the reference */
        return g_strdup_printf (_("energy grows by %s %% per 0.1 g heavier (creep); "
                                  "reference %s"), c, ref);
      }
    case AW_POWER_MEASURED:
      return g_strdup_printf (_("measured velocities with %u BB masses"),
                              r->points ? r->points->len : 0);
    case AW_POWER_CONSTANT_ENERGY:
    default:
      return g_strdup_printf (_("same energy with every BB; reference %s"), ref);
    }
}

static gboolean
replica_creeps (const AwPrintSetup *ps)
{
  AwPowerSource s = ps->setup->replica.power_source;
  return ps->setup->replica.energy_model == AW_POWER_CREEP || s == AW_POWER_SOURCE_GAS
         || s == AW_POWER_SOURCE_HPA || s == AW_POWER_SOURCE_CO2;
}

static void
add_compliance (AwPlFlowDoc *doc, AwPrintJob *job, const AwPrintSetup *ps)
{
  AwPlBlock *blk;
  AwPlBox *box = aw_pl_flow_add_box (doc, _("Compliance"), &blk);
  const AwSiteClassRule *r = job->site_class;
  AwPlStyle vs = aw_pl_style_bold (11.0);
  double used_g = aw_kg_to_g (ps->in.shot.mass_kg);

  box->size = BODY_SIZE;
  box->border_width = 1.2;
  if (r == NULL)
    {
      g_autofree char *e = aw_pl_num_unit (ps->energy_j, 2, "J");
      aw_pl_box_add (box, _("Site class"), _("none chosen: no limit to check against"));
      aw_pl_box_add (box, _("Muzzle energy with the BB used"), e);
    }
  else
    {
      double chrono_g = isfinite (r->chrono_bb_mass_g) && r->chrono_bb_mass_g > 0
                        ? r->chrono_bb_mass_g : used_g;
      g_autofree char *site = aw_print_site_text (job);
      g_autofree char *ce = aw_pl_num_unit (ps->chrono_energy_j, 2, "J");
      g_autofree char *cg = aw_pl_num_unit (chrono_g, 2, "g");
      g_autofree char *pct = aw_pl_num (100.0 * ps->chrono_energy_j / r->energy_limit_j, 0);
      g_autofree char *est = NULL;
      g_autofree char *verdict = NULL;
      AwCompliance worst = ps->compliance;
      gboolean measured = FALSE;

      aw_pl_box_add (box, _("Site class"), site);
      /* TRANSLATORS: %s: energy, BB mass, percent of the limit */
      est = g_strdup_printf (_("%s with %s (%s %% of the limit), from the replica’s energy "
                               "model"), ce, cg, pct);
      aw_pl_box_add (box, _("Estimated energy at the site’s chrono"), est);

      /* measured strings with the site's chrono BB */
      for (guint i = 0; i < ps->setup->chrono->len; i++)
        {
          const AwChronoString *c = g_ptr_array_index (ps->setup->chrono, i);
          AwChronoStats st;
          if (fabs (c->bb_mass_g - chrono_g) > 0.005 || !aw_chrono_string_stats (c, &st))
            continue;
          {
            g_autofree char *emax = aw_pl_num_unit (st.energy_max_j, 2, "J");
            g_autofree char *vmax = aw_print_velocity_text (job, st.max_mps);
            /* TRANSLATORS: highest shot of a chrono string: energy, velocity, shot count */
            g_autofree char *txt = g_strdup_printf (_("highest of %u shots %s, %s"), st.n, emax,
                                                    vmax);
            aw_pl_box_add (box, _("Measured with that BB"), txt);
            measured = TRUE;
            if (r->energy_limit_j > 0 && st.energy_max_j > r->energy_limit_j)
              worst = AW_COMPLIANCE_OVER;
            else if (worst == AW_COMPLIANCE_UNKNOWN && r->energy_limit_j > 0)
              worst = AW_COMPLIANCE_UNDER;
          }
        }
      if (!measured)
        aw_pl_box_add (box, _("Measured with that BB"),
                       _("no chrono string with the site’s BB: chronograph it before play"));
      if (r->hop_rule && *r->hop_rule)
        aw_pl_box_add (box, _("Site’s hop rule"), r->hop_rule);
      if (isfinite (aw_print_job_min_engagement_m (job)))
        {
          g_autofree char *d = aw_print_qty (job, AW_QTY_DISTANCE,
                                             aw_print_job_min_engagement_m (job));
          aw_pl_box_add (box, _("Minimum engagement distance"), d);
        }
      switch (worst)
        {
        case AW_COMPLIANCE_OVER:
          verdict = g_strdup (_("Verdict: OVER THE LIMIT. Do not use this setup at this site "
                                "class."));
          vs.rgb[0] = 0.75;
          box->border_rgb[0] = 0.75;
          break;
        case AW_COMPLIANCE_UNDER:
          verdict = g_strdup (_("Verdict: under the limit by this estimate."));
          vs.rgb[1] = 0.4;
          box->border_rgb[1] = 0.4;
          break;
        case AW_COMPLIANCE_UNKNOWN:
        default:
          verdict = g_strdup (_("Verdict: the class has no energy limit."));
          break;
        }
      aw_pl_box_add_styled (box, verdict, &vs);
    }
  {
    AwPlStyle ns = aw_pl_style (7.5);
    ns.italic = TRUE;
    if (replica_creeps (ps))
      aw_pl_box_add_styled (box, _("Creep: this replica’s energy can grow with heavier BBs "
                                   "(gas, high-pressure air or a creep model). Chronograph it "
                                   "with the BB you will actually use, as well as the site’s "
                                   "BB."), &ns);
    else
      aw_pl_box_add_styled (box, _("Energy is taken as the same for every BB mass (spring or "
                                   "electric piston). Some replicas still gain energy with "
                                   "heavier BBs: chronograph with the BB you use."), &ns);
    aw_pl_box_add_styled (box, _("The site’s own chronograph decides, not this estimate. "
                                 "Limits are absolute: there is no tolerance."), &ns);
  }
}

/* Whether the setup has a hop limit the analysis uses. */
static gboolean
has_hop_limit (const AwPrintSetup *ps)
{
  return !isnan (ps->setup->hop.max_lift_ratio) && !isnan (ps->in.hop_limit_s);
}

/* The hop limit line of the recommendation, or the note that there is none. Modelling
 * assumption, no source: a hop-up's strongest setting gives every BB the same spin parameter. */
static char *
hop_limit_text (const AwPrintSetup *ps)
{
  if (has_hop_limit (ps))
    {
      g_autofree char *lr = aw_pl_num (ps->setup->hop.max_lift_ratio, 2);
      g_autofree char *bb = aw_pl_num_unit (aw_kg_to_g (ps->in.shot.mass_kg), 2, "g");
      /* TRANSLATORS: the hop limit on the setup sheet: lift ratio, BB mass */
      return g_strdup_printf (_("lift ratio %s at most with the %s BB (the hop-up’s strongest "
                                "setting). Every BB is taken to get the same spin parameter "
                                "there (a modelling assumption), so heavier, slower BBs get "
                                "less lift."), lr, bb);
    }
  return g_strdup (_("none given: every BB is taken as hopped as well as it needs, which "
                     "favours heavy BBs. Set the highest lift ratio the hop-up reaches for a "
                     "sounder recommendation."));
}

static void
add_recommendation (AwPlFlowDoc *doc, AwPrintJob *job, const AwPrintSetup *ps)
{
  AwPlBox *box = aw_pl_flow_add_box (doc, _("Recommendation"), NULL);
  const AwBandResult *b = &ps->table.band;
  g_autofree char *half = aw_print_qty (job, AW_QTY_BAND, ps->in.band_half_m);
  g_autofree char *bb = aw_pl_num_unit (aw_kg_to_g (ps->in.shot.mass_kg), 2, "g");

  box->size = BODY_SIZE;
  box->border_rgb[0] = box->border_rgb[1] = box->border_rgb[2] = 0.4;
  if (ps->has_rec && ps->rec.best >= 0)
    {
      const AwRecommendRow *r = &ps->rec.rows[ps->rec.best];
      g_autofree char *m = aw_pl_num_unit (aw_kg_to_g (r->mass_kg), 2, "g");
      g_autofree char *range = aw_print_qty (job, AW_QTY_DISTANCE, r->band.band_range_m);
      g_autofree char *lr = aw_pl_num (r->band.lift_ratio, 2);
      g_autofree char *e = aw_pl_num_unit (r->energy_j, 2, "J");
      const char *why = ps->rec.reason == AW_RECOMMEND_REASON_LESS_DRIFT
                        ? _("nearly the longest band range and less wind drift")
                        : _("the longest band range of the BBs inside the limit");
      /* TRANSLATORS: recommended BB: mass, energy with it, the reason */
      g_autofree char *t = g_strdup_printf (_("%s (%s): %s"), m, e, why);
      /* TRANSLATORS: band range with auto hop: distance, band half-height, lift ratio */
      g_autofree char *t2 = g_strdup_printf (_("%s in a ±%s band, hop at lift ratio %s"), range,
                                             half, lr);
      aw_pl_box_add (box, _("Recommended BB"), t);
      aw_pl_box_add (box, _("With that BB"), t2);
      if (r->band.hop_limited)
        aw_pl_box_add (box, NULL, _("That BB is held at the hop limit: the hop-up cannot lift it "
                                    "as much as it needs."));
      if (isfinite (r->drift_30m_cm_per_mps))
        {
          AwUnitSystem u = aw_print_job_unit_system (job);
          double per = aw_qty_from_display (AW_QTY_WIND, u, 1.0);
          g_autofree char *d = aw_print_qty (job, AW_QTY_SMALL_CM, r->drift_30m_cm_per_mps * per);
          g_autofree char *at = aw_pl_num_unit (aw_qty_to_display (AW_QTY_DISTANCE, u, 30.0), 0,
                                                aw_qty_unit (AW_QTY_DISTANCE, u));
          g_autofree char *w1 = aw_pl_num_unit (1.0, 0, aw_qty_unit (AW_QTY_WIND, u));
          /* TRANSLATORS: drift at a distance for a crosswind: drift, distance, wind speed */
          g_autofree char *t3 = g_strdup_printf (_("%s at %s per %s of crosswind"), d, at, w1);
          aw_pl_box_add (box, _("Wind drift"), t3);
        }
    }
  else
    aw_pl_box_add (box, _("Recommended BB"),
                   job->site_class ? _("none: no BB mass keeps this replica inside the limit")
                                   : _("none could be computed"));
  {
    g_autofree char *hl = hop_limit_text (ps);
    aw_pl_box_add (box, _("Hop limit"), hl);
  }
  {
    g_autofree char *hop = aw_print_hop_text (ps);
    g_autofree char *range = aw_print_qty (job, AW_QTY_DISTANCE, b->band_range_m);
    /* TRANSLATORS: the setup as configured: BB mass, hop, band range and band half-height */
    g_autofree char *t = ps->status == AW_ANALYSIS_OK
                         ? g_strdup_printf (_("%s, hop %s: band range %s (±%s)"), bb, hop, range,
                                            half)
                         : g_strdup_printf (_("%s, hop %s: %s"), bb, hop,
                                            aw_print_status_text (ps->status));
    aw_pl_box_add (box, _("As set up"), t);
    if (b->hop_over_limit)
      aw_pl_box_add (box, NULL, _("The hop as set up is above the hop limit: the hop-up cannot "
                                  "reach it."));
  }
}

static void
add_sweep_table (AwPlFlowDoc *doc, AwPrintJob *job, const AwPrintSetup *ps)
{
  static const double weights[] = { 0.7, 1.3, 0.8, 0.9, 1.3, 1.0, 0.9, 1.3 };
  AwUnitSystem u = aw_print_job_unit_system (job);
  AwPlColumn *cols;
  AwPlTable *t;
  double per = aw_qty_from_display (AW_QTY_WIND, u, 1.0);
  g_autofree char *at = aw_pl_num_unit (aw_qty_to_display (AW_QTY_DISTANCE, u, 30.0), 0,
                                        aw_qty_unit (AW_QTY_DISTANCE, u));
  g_autofree char *w1 = aw_pl_num_unit (1.0, 0, aw_qty_unit (AW_QTY_WIND, u));

  if (!ps->has_rec || ps->rec.n_rows == 0)
    return;
  cols = g_new0 (AwPlColumn, 8);
  t = g_new0 (AwPlTable, 1);
  aw_pl_table_init (t, cols, 8, 8.0);
  aw_pl_table_keep (t, cols);
  t->row_height = 11.5;
  cols[0].header = _("BB (g)");
  cols[1].header = aw_pl_table_keep (t, g_strdup_printf (_("%s (%s)"), _("Muzzle velocity"),
                                                         aw_qty_unit (AW_QTY_VELOCITY, u)));
  cols[2].header = aw_pl_table_keep (t, g_strdup_printf (_("%s (%s)"), _("Energy"), "J"));
  cols[3].header = aw_pl_table_keep (t, g_strdup_printf (_("%s (%s)"), _("Site chrono"), "J"));
  cols[4].header = _("Limit");
  cols[5].header = _("Lift ratio");
  cols[6].header = aw_pl_table_keep (t, g_strdup_printf (_("%s (%s)"), _("Band range"),
                                                         aw_qty_unit (AW_QTY_DISTANCE, u)));
  /* TRANSLATORS: column header: drift at 30 m per 1 m/s of crosswind */
  cols[7].header = aw_pl_table_keep (t, g_strdup_printf (_("Drift at %s per %s (%s)"), at, w1,
                                                         aw_qty_unit (AW_QTY_SMALL_CM, u)));
  for (int i = 0; i < 8; i++)
    {
      cols[i].weight = weights[i];
      cols[i].align = i == 4 ? PANGO_ALIGN_CENTER : PANGO_ALIGN_RIGHT;
    }
  for (size_t i = 0; i < ps->rec.n_rows; i++)
    {
      const AwRecommendRow *r = &ps->rec.rows[i];
      char *cells[8];
      AwPlRowFlags f = AW_PL_ROW_PLAIN;
      cells[0] = aw_pl_num (aw_kg_to_g (r->mass_kg), 2);
      cells[1] = aw_pl_num (aw_qty_to_display (AW_QTY_VELOCITY, u, r->velocity_mps),
                            u == AW_UNITS_IMPERIAL ? 0 : 1);
      cells[2] = aw_pl_num (r->energy_j, 2);
      cells[3] = job->site_class ? aw_pl_num (r->chrono_energy_j, 2) : g_strdup ("–");
      cells[4] = g_strdup (r->compliance == AW_COMPLIANCE_OVER ? _("over")
                           : r->compliance == AW_COMPLIANCE_UNDER ? _("under") : "–");
      cells[5] = aw_pl_num (r->band.lift_ratio, 2);
      if (r->band.hop_limited)
        {
          /* held at the hop limit */
          char *c5 = g_strconcat (cells[5], " †", NULL);
          g_free (cells[5]);
          cells[5] = c5;
        }
      cells[6] = aw_pl_num (aw_qty_to_display (AW_QTY_DISTANCE, u, r->band.band_range_m), 0);
      cells[7] = aw_pl_num (aw_qty_to_display (AW_QTY_SMALL_CM, u,
                                               r->drift_30m_cm_per_mps * per), 1);
      if (r->recommended)
        f |= AW_PL_ROW_BOLD | AW_PL_ROW_SHADED;
      if (r->compliance == AW_COMPLIANCE_OVER)
        f |= AW_PL_ROW_HATCHED;
      if (fabs (r->mass_kg - ps->in.shot.mass_kg) < 1e-7)
        f |= AW_PL_ROW_SHADED;
      aw_pl_table_add_row (t, cells, f);
    }
  aw_pl_flow_add_table (doc, t);
}

static void
add_setup_pages (AwPlFlowDoc *doc, AwPrintJob *job, const AwPrintSetup *ps, gboolean first)
{
  const AwSetup *s = ps->setup;
  AwPlStyle body = aw_pl_style (BODY_SIZE);
  AwPlStyle note = aw_pl_style (7.5);
  g_autofree char *date = aw_print_job_date_text (job);
  g_autofree char *sub = NULL;
  guint n_blocks = doc->blocks->len;

  note.italic = TRUE;
  if (job->project->name && *job->project->name)
    /* TRANSLATORS: setup sheet subtitle: project name and date */
    sub = g_strdup_printf (_("Project: %s · %s"), job->project->name, date);
  else
    sub = g_strdup (date);
  aw_print_add_title (doc, job, ps, _("Setup sheet"), s->name, sub);
  if (!first)
    ((AwPlBlock *) g_ptr_array_index (doc->blocks, n_blocks))->new_page = TRUE;

  /* customer and job */
  aw_pl_flow_add_heading (doc, _("Customer and job"), HEADING_SIZE);
  {
    FieldsBlock *f = g_new0 (FieldsBlock, 1);
    f->fields = g_array_new (FALSE, TRUE, sizeof (Field));
    field_add (f, _("Customer"), NULL);
    field_add (f, _("Date"), g_strdup (date));
    field_add (f, _("Technician"), NULL);
    field_add (f, _("Job number"), NULL);
    field_add (f, _("Replica type"), g_strdup (s->replica.type));
    field_add (f, _("Serial number"), NULL);
    field_add (f, _("Power source"),
               g_strdup (aw_print_power_source_text (s->replica.power_source)));
    field_add (f, _("Intended use"), NULL);
    field_add (f, _("Site class and limit"), job->site_class ? aw_print_site_text (job) : NULL);
    field_add (f, _("Gas and temperature at test"), NULL);
    aw_pl_flow_add (doc, fields_measure, fields_draw, f, fields_free);
  }

  /* work done */
  {
    AwPlBox *box = aw_pl_flow_add_box (doc, _("Work done"), NULL);
    g_autofree char *em = energy_model_text (ps);
    g_autofree char *bb = aw_pl_num_unit (aw_kg_to_g (ps->in.shot.mass_kg), 2, "g");
    g_autofree char *dia = aw_pl_num_unit (aw_m_to_mm (ps->in.shot.diameter_m), 2, "mm");
    g_autofree char *bbt = g_strdup_printf ("%s, %s", bb, dia);
    g_autofree char *hop = aw_print_hop_text (ps);
    box->size = BODY_SIZE;
    box->border_rgb[0] = box->border_rgb[1] = box->border_rgb[2] = 0.4;
    if (s->notes && *s->notes)
      aw_pl_box_add (box, NULL, s->notes);
    else
      {
        AwPlStyle hint = note;
        hint.rgb[0] = hint.rgb[1] = hint.rgb[2] = 0.4;
        aw_pl_box_add_styled (box, _("Parts, barrel length and bore, hop contact, spring or "
                                     "regulator:"), &hint);
      }
    aw_pl_box_add (box, _("BB"), bbt);
    aw_pl_box_add (box, _("Hop"), hop);
    aw_pl_box_add (box, _("Energy with BB mass"), em);
    box->write_in_lines = s->notes && *s->notes ? 1 : 3;
  }

  /* chrono */
  aw_pl_flow_add_heading (doc, _("Chronograph results"), HEADING_SIZE);
  add_chrono_table (doc, job, ps);

  add_compliance (doc, job, ps);
  add_recommendation (doc, job, ps);

  /* plots */
  aw_pl_flow_add_heading (doc, _("Flight and BB mass"), HEADING_SIZE);
  {
    PlotsBlock *pb = g_new0 (PlotsBlock, 1);
    pb->job = job;
    pb->ps = ps;
    aw_pl_flow_add (doc, plots_measure, plots_draw, pb, g_free);
  }
  {
    AwPlBlock *cb = aw_pl_flow_add_text (doc, _("The same replica with other BB masses: muzzle "
                                                "velocity from its energy model, the best hop at "
                                                "each mass, the band range and the drift. Bold: "
                                                "the recommended BB; shaded: the BB this setup "
                                                "uses; hatched: over the limit."), &note);
    cb->keep_with_next = TRUE;
    cb->space_after = has_hop_limit (ps) ? 1.0 : 4.0;
  }
  if (ps->has_rec && ps->rec.n_rows > 0)
    {
      g_autofree char *lr = has_hop_limit (ps) ? aw_pl_num (ps->setup->hop.max_lift_ratio, 2)
                                               : NULL;
      g_autofree char *bb = aw_pl_num_unit (aw_kg_to_g (ps->in.shot.mass_kg), 2, "g");
      /* TRANSLATORS: note under the BB-mass table: the hop limit (lift ratio, BB mass) */
      g_autofree char *t = lr ? g_strdup_printf (_("Hop limit: lift ratio %s with the %s BB. †: "
                                                   "held there, the hop-up cannot lift that BB "
                                                   "as much as it needs, so its band range is "
                                                   "shorter."), lr, bb)
                              : g_strdup (_("No hop limit is set: every BB is hopped as well as "
                                            "it needs, which favours heavy BBs."));
      AwPlBlock *hb = aw_pl_flow_add_text (doc, t, &note);
      hb->keep_with_next = TRUE;
      hb->space_after = 4.0;
    }
  add_sweep_table (doc, job, ps);

  /* care and safety */
  aw_pl_flow_add_heading (doc, _("Care and safety"), HEADING_SIZE);
  aw_pl_flow_add_text (doc, _("Re-chronograph after any change of parts, gas, BB brand or BB "
                              "weight. Keep gas magazines with a little pressure in them and "
                              "away from heat: warm gas shoots faster. Use clean, seamless, "
                              "precision BBs of the weight on this sheet; a dirty or damaged "
                              "BB changes the flight and can jam the hop."), &body);
  aw_pl_flow_add_text (doc, aw_print_caution_long (), &body);

  aw_pl_flow_add_heading (doc, _("Sign-off"), HEADING_SIZE);
  aw_pl_flow_add (doc, signoff_measure, signoff_draw, NULL, NULL);
}

typedef struct
{
  AwPlFlowDoc flow;
} SheetDoc;

static void
sheet_doc_free (gpointer p)
{
  SheetDoc *d = p;
  aw_pl_flow_clear (&d->flow);
  g_free (d);
}

static SheetDoc *
sheet_doc (AwPrintJob *job)
{
  SheetDoc *d;
  if (job->doc)
    return job->doc;
  d = g_new0 (SheetDoc, 1);
  aw_pl_flow_init (&d->flow);
  for (guint i = 0; i < job->setups->len; i++)
    add_setup_pages (&d->flow, job, &g_array_index (job->setups, AwPrintSetup, i), i == 0);
  job->doc = d;
  job->doc_free = sheet_doc_free;
  return d;
}

int
aw_print_sheet_paginate (AwPrintJob *job, AwPl *pl, double w, double h)
{
  return aw_print_flow_paginate (&sheet_doc (job)->flow, pl, w, h);
}

void
aw_print_sheet_draw_page (AwPrintJob *job, AwPl *pl, int page, double w, double h)
{
  aw_print_flow_draw_page (job, &sheet_doc (job)->flow, pl, page, w, h);
}
