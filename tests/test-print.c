/* test-print.c: range cards, setup sheets and loadout sheets as PDF
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Every output is made from the demo project and read back with poppler-utils (pdfinfo for the
 * page count, size and metadata; pdftotext for the text and the word boxes). The figures printed
 * are compared with the range table, chrono statistics, site check and recommendation computed
 * here with the same core calls (aw_range_table_build, aw_chrono_string_stats, aw_site_check,
 * aw_recommend), formatted by this file's own code. Layout checks: every word inside the page
 * margins and no two words overlapping, also with long setup names and long (pseudo-German)
 * translations.
 *
 * Needs pdfinfo/pdftotext, xgettext/msgfmt and the de_DE.UTF-8 locale: a missing one fails the
 * test that needs it, loudly.
 */
#include "aw-config.h"

#include <glib.h>
#include <glib/gstdio.h>
#include <locale.h>
#include <math.h>
#include <string.h>
#include <sys/wait.h>

#include "aw-print-dialog.h"
#include "aw-print.h"
#include "aw-project-io.h"
#include "aw-units.h"

#define SITE "Example: woodland site (typical values)"
#define DMR_CLASS "designated marksman"   /* 20 m minimum engagement distance in the demo */
#define RIFLE_CLASS "outdoor rifle"
/* Paper sizes: ISO 216 (A4 210 × 297 mm, A6 105 × 148 mm) and ANSI Letter 8.5 × 11 in; pdfinfo
 * prints three decimals, so 0.01 pt is enough. */
#define PAGE_TOL_PT 0.01
/* Words may not come closer to the paper's edge than this (pt): the cards' own margin is 13 pt
 * and sheets keep 36 pt; 4 pt catches text pushed off the page or into the printer's edge. */
#define EDGE_MIN_PT 4.0
/* Two words overlap when their boxes share more than this fraction of the smaller box. */
#define OVERLAP_MAX 0.15

static char *tmp_dir;
static char *demo_path;
static char *long_path;                 /* demo with a 60-character setup name */
static char *pseudo_localedir;          /* long pseudo-German translations of the print texts */
static const char *long_name = "Outdoor rifle for Saturday woodland games, long barrel set 1";

/* the usual BB masses of the trade (trade reference, common practice, no source) */
static const double masses_g[] = { 0.20, 0.23, 0.25, 0.28, 0.30, 0.32, 0.36, 0.40, 0.43, 0.45,
                                   0.48 };

/* ---- running tools ---- */

static char *
run (const char *const *argv, const char *const *env_extra, int *exit_code, char **err_out)
{
  g_auto (GStrv) env = g_get_environ ();
  g_autoptr (GError) error = NULL;
  char *out = NULL, *err = NULL;
  int status = 0;

  for (int i = 0; env_extra && env_extra[i]; i += 2)
    env = g_environ_setenv (env, env_extra[i], env_extra[i + 1], TRUE);
  if (!g_spawn_sync (NULL, (char **) argv, env, G_SPAWN_SEARCH_PATH, NULL, NULL, &out, &err,
                     &status, &error))
    g_error ("cannot run %s: %s (install poppler-utils and gettext)", argv[0], error->message);
  *exit_code = WIFEXITED (status) ? WEXITSTATUS (status) : 128;
  if (err_out)
    *err_out = err;
  else
    g_free (err);
  return out;
}

static char *
tool (const char *const *argv)
{
  int code;
  g_autofree char *err = NULL;
  char *out = run (argv, NULL, &code, &err);
  if (code != 0)
    g_error ("%s failed (%d): %s", argv[0], code, err);
  return out;
}

static char *
cli (const char *const *args, const char *const *env_extra, int *code, char **err)
{
  const char *exe = g_getenv ("AW_CLI");
  g_autoptr (GPtrArray) argv = g_ptr_array_new ();
  g_assert_nonnull (exe);
  g_ptr_array_add (argv, (gpointer) exe);
  for (int i = 0; args[i]; i++)
    g_ptr_array_add (argv, (gpointer) args[i]);
  g_ptr_array_add (argv, NULL);
  return run ((const char *const *) argv->pdata, env_extra, code, err);
}

static char *
out_path (const char *name)
{
  return g_build_filename (tmp_dir, name, NULL);
}

/* ---- reading PDFs ---- */

typedef struct
{
  int pages;
  double width, height;
  char *title, *creator, *created;
} PdfInfo;

static void
pdf_info_clear (PdfInfo *info)
{
  g_free (info->title);
  g_free (info->creator);
  g_free (info->created);
}

static void
pdf_info (const char *pdf, PdfInfo *info)
{
  const char *argv[] = { "pdfinfo", pdf, NULL };
  g_autofree char *out = tool (argv);
  g_auto (GStrv) lines = g_strsplit (out, "\n", -1);

  memset (info, 0, sizeof *info);
  for (int i = 0; lines[i]; i++)
    {
      const char *l = lines[i];
      if (g_str_has_prefix (l, "Pages:"))
        info->pages = atoi (l + 6);
      else if (g_str_has_prefix (l, "Page size:"))
        g_assert_cmpint (sscanf (l + 10, " %lf x %lf", &info->width, &info->height), ==, 2);
      else if (g_str_has_prefix (l, "Title:"))
        info->title = g_strstrip (g_strdup (l + 6));
      else if (g_str_has_prefix (l, "Creator:"))
        info->creator = g_strstrip (g_strdup (l + 8));
      else if (g_str_has_prefix (l, "CreationDate:"))
        info->created = g_strstrip (g_strdup (l + 13));
    }
}

static char *
pdf_text (const char *pdf)
{
  const char *argv[] = { "pdftotext", "-layout", pdf, "-", NULL };
  return tool (argv);
}

/* The text with every run of white space made one space (for phrases that may wrap). */
static char *
flat (const char *text)
{
  GString *s = g_string_new (NULL);
  gboolean space = FALSE;
  for (const char *p = text; *p; p++)
    {
      if (g_ascii_isspace (*p))
        space = TRUE;
      else
        {
          if (space && s->len)
            g_string_append_c (s, ' ');
          space = FALSE;
          g_string_append_c (s, *p);
        }
    }
  return g_string_free (s, FALSE);
}

/* Counts the lines of text holding the tokens consecutively (several times per line counts
 * several times: cards side by side). */
static int
count_sequence (const char *text, char **tokens, int n)
{
  g_auto (GStrv) lines = g_strsplit (text, "\n", -1);
  int found = 0;
  for (int i = 0; lines[i]; i++)
    {
      g_auto (GStrv) raw = g_strsplit_set (lines[i], " \t", -1);
      g_autoptr (GPtrArray) w = g_ptr_array_new ();
      for (int k = 0; raw[k]; k++)
        if (*raw[k])
          g_ptr_array_add (w, raw[k]);
      for (guint k = 0; k + n <= w->len; k++)
        {
          int j = 0;
          while (j < n && g_str_equal (g_ptr_array_index (w, k + j), tokens[j]))
            j++;
          if (j == n)
            found++;
        }
    }
  return found;
}

/* Word boxes from pdftotext -bbox: every word inside the page with EDGE_MIN_PT to spare, and
 * no two words overlapping. Returns the number of words seen. */
static int
check_layout (const char *pdf)
{
  const char *argv[] = { "pdftotext", "-bbox", pdf, "-", NULL };
  g_autofree char *html = tool (argv);
  const char *p = html;
  int page = 0, words = 0;

  while ((p = strstr (p, "<page ")) != NULL)
    {
      double pw, ph;
      const char *end = strstr (p, "</page>");
      g_autoptr (GArray) boxes = g_array_new (FALSE, FALSE, sizeof (double) * 4);
      g_autoptr (GPtrArray) texts = g_ptr_array_new_with_free_func (g_free);

      g_assert_nonnull (end);
      g_assert_cmpint (sscanf (p, "<page width=\"%lf\" height=\"%lf\"", &pw, &ph), ==, 2);
      page++;
      for (const char *w = strstr (p, "<word "); w && w < end; w = strstr (w + 1, "<word "))
        {
          double b[4];
          const char *gt = strchr (w, '>'), *close = strstr (w, "</word>");
          g_assert_cmpint (sscanf (w, "<word xMin=\"%lf\" yMin=\"%lf\" xMax=\"%lf\" yMax=\"%lf\"",
                                   &b[0], &b[1], &b[2], &b[3]), ==, 4);
          g_array_append_vals (boxes, b, 1);
          g_ptr_array_add (texts, g_strndup (gt + 1, close - gt - 1));
          words++;
          if (b[0] < EDGE_MIN_PT || b[1] < EDGE_MIN_PT || b[2] > pw - EDGE_MIN_PT
              || b[3] > ph - EDGE_MIN_PT)
            g_error ("%s page %d: \"%s\" at %.1f,%.1f–%.1f,%.1f is off the page (%.0f × %.0f)",
                     pdf, page, (char *) g_ptr_array_index (texts, texts->len - 1), b[0], b[1],
                     b[2], b[3], pw, ph);
        }
      for (guint i = 0; i < boxes->len; i++)
        for (guint k = i + 1; k < boxes->len; k++)
          {
            const double *a = (double *) boxes->data + 4 * i, *c = (double *) boxes->data + 4 * k;
            double ix = MIN (a[2], c[2]) - MAX (a[0], c[0]);
            double iy = MIN (a[3], c[3]) - MAX (a[1], c[1]);
            double aa = (a[2] - a[0]) * (a[3] - a[1]), ac = (c[2] - c[0]) * (c[3] - c[1]);
            if (ix > 0 && iy > 0 && ix * iy > OVERLAP_MAX * MIN (aa, ac))
              g_error ("%s page %d: \"%s\" and \"%s\" overlap", pdf, page,
                       (char *) g_ptr_array_index (texts, i),
                       (char *) g_ptr_array_index (texts, k));
          }
      p = end;
    }
  g_assert_cmpint (page, >, 0);
  return words;
}

/* ---- reference formatting (independent of the renderer) ---- */

static char decimal_mark = '.';

/* %.*f with the decimal mark of the output's locale, U+2212 for minus, no "−0.0", "–" for
 * non-finite values. */
static char *
ref_num (double v, int d)
{
  g_autofree char *s = NULL;
  GString *o;
  gboolean zero = TRUE;

  if (!isfinite (v))
    return g_strdup ("–");
  s = g_strdup_printf ("%.*f", d, v);   /* the test runs in the C locale */
  for (char *q = s; *q; q++)
    if (*q >= '1' && *q <= '9')
      zero = FALSE;
  o = g_string_new (NULL);
  for (char *q = s; *q; q++)
    {
      if (*q == '-')
        {
          if (!zero)
            g_string_append (o, "−");
        }
      else if (*q == '.')
        g_string_append_c (o, decimal_mark);
      else
        g_string_append_c (o, *q);
    }
  return g_string_free (o, FALSE);
}

static AwProject *
load (const char *path)
{
  g_autoptr (GError) error = NULL;
  AwProject *p = aw_project_load_file (path, AW_PROJECT_LOAD_STRICT, NULL, &error);
  g_assert_no_error (error);
  return p;
}

static const AwSiteClassRule *
find_class (const AwProject *p, const char *class_name)
{
  const AwSiteRules *site = aw_project_find_site_rules (p, SITE);
  g_assert_nonnull (site);
  for (guint i = 0; i < site->classes->len; i++)
    {
      const AwSiteClassRule *r = g_ptr_array_index (site->classes, i);
      if (g_str_equal (r->name, class_name))
        return r;
    }
  g_assert_not_reached ();
  return NULL;
}

/* The range table printed on a card: the same core call with the documented step, row limit
 * and minimum engagement distance. Checks every row beyond 0 appears `copies` times. */
static int
check_card_rows (const char *text, AwProject *p, const char *setup_name, const char *class_name,
                 gboolean imperial, int copies)
{
  AwSetup *s = aw_project_find_setup (p, setup_name);
  AwAnalysisInput in;
  AwRangeTable table = { 0 };
  double step = imperial ? AW_PRINT_TABLE_STEP_IMPERIAL_M : AW_PRINT_TABLE_STEP_METRIC_M;
  double med = NAN;
  int rows = 0;

  g_assert_nonnull (s);
  g_assert_cmpint (aw_setup_to_analysis_input (s, p, &in), ==, AW_BRIDGE_OK);
  if (class_name && find_class (p, class_name)->min_engagement_m > 0)
    med = find_class (p, class_name)->min_engagement_m;
  g_assert_cmpint (aw_range_table_build (&in, step, step * AW_PRINT_TABLE_MAX_ROWS, med, &table),
                   >=, 0);
  for (size_t i = 0; i < table.n_rows; i++)
    {
      const AwRangeRow *r = &table.rows[i];
      char *tok[8];
      int n;
      if (!(r->distance_m > 0))
        continue;
      if (imperial)
        {
          tok[0] = ref_num (r->distance_m / 0.9144, 0);                  /* yd */
          tok[1] = ref_num (r->height_cm / 2.54, 1);                     /* in */
          tok[2] = ref_num (r->hold_cm / 2.54, 1);
          tok[5] = ref_num (r->speed_mps / 0.3048, 0);                   /* fps */
          tok[7] = ref_num (r->drift_cm_per_mps * 0.44704 / 2.54, 1);    /* in per 1 mph */
        }
      else
        {
          tok[0] = ref_num (r->distance_m, 0);
          tok[1] = ref_num (r->height_cm, 1);
          tok[2] = ref_num (r->hold_cm, 1);
          tok[5] = ref_num (r->speed_mps, 1);
          tok[7] = ref_num (r->drift_cm_per_mps, 1);
        }
      tok[3] = ref_num (r->hold_angle, 1);
      tok[4] = ref_num (r->time_s, 2);
      tok[6] = ref_num (r->energy_j, 2);
      n = count_sequence (text, tok, 8);
      if (n != copies)
        g_error ("%s: row at %.1f m printed %d times, expected %d: %s %s %s %s %s %s %s %s",
                 setup_name, r->distance_m, n, copies, tok[0], tok[1], tok[2], tok[3], tok[4],
                 tok[5], tok[6], tok[7]);
      for (int k = 0; k < 8; k++)
        g_free (tok[k]);
      rows++;
    }
  aw_range_table_clear (&table);
  return rows;
}

static void
check_page_numbers (const char *text, int n)
{
  g_autofree char *f = flat (text);
  for (int i = 1; i <= n; i++)
    {
      g_autofree char *want = g_strdup_printf ("Page %d of %d", i, n);
      g_assert_nonnull (strstr (f, want));
    }
  {
    g_autofree char *none = g_strdup_printf ("Page %d of %d", n + 1, n);
    g_assert_null (strstr (f, none));
  }
}

static void
check_page (const PdfInfo *info, double w, double h)
{
  g_assert_cmpfloat_with_epsilon (info->width, w, PAGE_TOL_PT);
  g_assert_cmpfloat_with_epsilon (info->height, h, PAGE_TOL_PT);
}

#define A6_W (105.0 / 25.4 * 72.0)
#define A6_H (148.0 / 25.4 * 72.0)
#define A4_W (210.0 / 25.4 * 72.0)
#define A4_H (297.0 / 25.4 * 72.0)
#define LETTER_W (8.5 * 72.0)
#define LETTER_H (11.0 * 72.0)

/* ---- range cards ---- */

static void
test_card_a6 (void)
{
  g_autoptr (AwProject) p = load (demo_path);
  g_autoptr (AwPrintJob) job = aw_print_job_new (AW_PRINT_KIND_CARD, p);
  g_autoptr (GError) error = NULL;
  g_autofree char *pdf = out_path ("card-a6.pdf");
  g_autofree char *text = NULL, *f = NULL;
  PdfInfo info;

  g_assert_true (aw_print_job_add_setup (job, "Gas sidearm", &error));
  g_assert_true (aw_print_job_add_setup (job, "Designated marksman (HPA)", &error));
  g_assert_true (aw_print_job_set_site (job, SITE, DMR_CLASS, &error));
  g_assert_no_error (error);
  g_assert_cmpint (aw_print_n_pages (job), ==, 2);
  g_assert_true (aw_print_to_pdf (job, pdf, &error));
  g_assert_no_error (error);

  pdf_info (pdf, &info);
  g_assert_cmpint (info.pages, ==, 2);
  check_page (&info, A6_W, A6_H);
  g_assert_cmpstr (info.title, ==, "Range cards");
  g_assert_cmpstr (info.creator, ==, "Arcwright");
  g_assert_nonnull (info.created);
  g_assert_cmpstr (info.created, !=, "");
  pdf_info_clear (&info);

  text = pdf_text (pdf);
  g_assert_cmpint (check_card_rows (text, p, "Gas sidearm", DMR_CLASS, FALSE, 1), >=, 6);
  g_assert_cmpint (check_card_rows (text, p, "Designated marksman (HPA)", DMR_CLASS, FALSE, 1),
                   >=, 6);
  check_page_numbers (text, 2);
  f = flat (text);
  /* the caution, the no-shoot distance and the site's limit */
  g_assert_nonnull (strstr (f, "Sealed eye protection at all times"));
  g_assert_nonnull (strstr (f, "The site’s chronograph and rules decide"));
  g_assert_nonnull (strstr (f, "Closer than 20.0 m: no shooting"));
  g_assert_nonnull (strstr (f, "Limit 2.32 J"));
  check_layout (pdf);
}

static void
test_card_sheet_of_four (void)
{
  g_autoptr (AwProject) p = load (demo_path);
  const struct { AwPaper paper; double w, h; const char *name; } cases[] = {
    { AW_PAPER_A4, A4_W, A4_H, "cards-a4.pdf" },
    { AW_PAPER_LETTER, LETTER_W, LETTER_H, "cards-letter.pdf" },
  };

  for (guint c = 0; c < G_N_ELEMENTS (cases); c++)
    {
      g_autoptr (AwPrintJob) job = aw_print_job_new (AW_PRINT_KIND_CARD, p);
      g_autoptr (GError) error = NULL;
      g_autofree char *pdf = out_path (cases[c].name);
      g_autofree char *text = NULL;
      PdfInfo info;

      aw_print_job_set_paper (job, cases[c].paper);
      g_assert_true (aw_print_job_add_setup (job, "Outdoor rifle", &error));
      g_assert_true (aw_print_to_pdf (job, pdf, &error));
      g_assert_no_error (error);
      pdf_info (pdf, &info);
      g_assert_cmpint (info.pages, ==, 1);
      check_page (&info, cases[c].w, cases[c].h);
      g_assert_cmpstr (info.title, ==, "Range card – Outdoor rifle");
      pdf_info_clear (&info);
      /* one setup fills the sheet with four copies to cut out */
      text = pdf_text (pdf);
      g_assert_cmpint (check_card_rows (text, p, "Outdoor rifle", NULL, FALSE, 4), >=, 6);
      check_page_numbers (text, 1);
      check_layout (pdf);
    }

  {
    /* five setups: four to a page */
    g_autoptr (AwPrintJob) job = aw_print_job_new (AW_PRINT_KIND_CARD, p);
    const char *names[] = { "Close-quarters carbine", "Outdoor rifle",
                            "Team rifle, 0.28 g standard", "Gas sidearm", "CO2 sidearm" };
    for (guint i = 0; i < G_N_ELEMENTS (names); i++)
      g_assert_true (aw_print_job_add_setup (job, names[i], NULL));
    g_assert_cmpint (aw_print_n_pages (job), ==, 5);
    aw_print_job_set_paper (job, AW_PAPER_A4);
    g_assert_cmpint (aw_print_n_pages (job), ==, 2);
  }
}

static void
test_card_imperial_cli (void)
{
  g_autoptr (AwProject) p = load (demo_path);
  g_autofree char *pdf = out_path ("card-imperial.pdf");
  g_autofree char *text = NULL, *f = NULL, *out = NULL, *err = NULL;
  const char *args[] = { "card", demo_path, "--setup", "Team rifle, 0.28 g standard",
                         "--units", "imperial", "--class", DMR_CLASS, "-o", pdf, NULL };
  PdfInfo info;
  int code;

  out = cli (args, NULL, &code, &err);
  g_assert_cmpint (code, ==, 0);
  pdf_info (pdf, &info);
  g_assert_cmpint (info.pages, ==, 1);
  check_page (&info, A6_W, A6_H);
  pdf_info_clear (&info);
  text = pdf_text (pdf);
  g_assert_cmpint (check_card_rows (text, p, "Team rifle, 0.28 g standard", DMR_CLASS, TRUE, 1),
                   >=, 6);
  f = flat (text);
  /* the headers carry the imperial units (they may wrap between word and unit) */
  g_assert_nonnull (strstr (f, "(yd)"));
  g_assert_nonnull (strstr (f, "(fps)"));
  g_assert_nonnull (strstr (f, "mph"));
  g_assert_null (strstr (f, "(m/s)"));
  check_layout (pdf);
}

/* ---- setup sheet ---- */

static void
check_sheet_figures (const char *text, AwProject *p, const char *setup_name,
                     const char *class_name)
{
  AwSetup *s = aw_project_find_setup (p, setup_name);
  const AwSiteClassRule *rule = find_class (p, class_name);
  g_autofree char *f = flat (text);
  AwAnalysisInput in;
  AwPowerCurve curve;
  AwSiteClass site;
  AwRecommendation rec = { 0 };
  double chrono_j, kg[G_N_ELEMENTS (masses_g)];
  AwCompliance verdict;
  guint strings = 0;

  for (guint i = 0; i < s->chrono->len; i++)
    {
      const AwChronoString *c = g_ptr_array_index (s->chrono, i);
      AwChronoStats st;
      char *fps[11], *mps[6];
      const double k = 1.0 / 0.3048;
      g_assert_true (aw_chrono_string_stats (c, &st));
      fps[0] = ref_num (c->bb_mass_g, 2);
      fps[1] = g_strdup (c->hop == AW_CHRONO_HOP_OFF ? "off" : c->hop == AW_CHRONO_HOP_ON ? "on"
                         : "–");
      fps[2] = g_strdup_printf ("%u", st.n);
      fps[3] = g_strdup ("fps");
      fps[4] = ref_num (st.mean_mps * k, 1);
      fps[5] = ref_num (st.min_mps * k, 1);
      fps[6] = ref_num (st.max_mps * k, 1);
      fps[7] = ref_num (st.sd_mps * k, 1);
      fps[8] = ref_num (st.es_mps * k, 1);
      fps[9] = ref_num (st.energy_mean_j, 2);
      fps[10] = ref_num (st.energy_max_j, 2);
      mps[0] = g_strdup ("m/s");
      mps[1] = ref_num (st.mean_mps, 2);
      mps[2] = ref_num (st.min_mps, 2);
      mps[3] = ref_num (st.max_mps, 2);
      mps[4] = ref_num (st.sd_mps, 2);
      mps[5] = ref_num (st.es_mps, 2);
      if (count_sequence (text, fps, 11) != 1)
        g_error ("%s: chrono line not printed: %s %s %s fps %s %s %s %s %s %s %s", setup_name,
                 fps[0], fps[1], fps[2], fps[4], fps[5], fps[6], fps[7], fps[8], fps[9], fps[10]);
      if (count_sequence (text, mps, 6) != 1)
        g_error ("%s: chrono m/s line not printed: %s %s %s %s %s", setup_name, mps[1], mps[2],
                 mps[3], mps[4], mps[5]);
      for (int j = 0; j < 11; j++)
        g_free (fps[j]);
      for (int j = 0; j < 6; j++)
        g_free (mps[j]);
      strings++;
    }
  g_assert_cmpuint (strings, ==, s->chrono->len);
  g_assert_cmpuint (strings, >, 0);

  /* compliance with the site's own chrono BB, and the recommendation */
  g_assert_cmpint (aw_setup_to_analysis_input (s, p, &in), ==, AW_BRIDGE_OK);
  aw_setup_power_curve (s, &curve);
  aw_site_class_rule_to_site_class (rule, &site);
  verdict = aw_site_check (&site, &curve, in.shot.mass_kg, &chrono_j);
  {
    g_autofree char *e = ref_num (chrono_j, 2);
    g_autofree char *m = ref_num (rule->chrono_bb_mass_g, 2);
    g_autofree char *want = g_strdup_printf ("Estimated energy at the site’s chrono: %s J with "
                                             "%s g", e, m);
    g_assert_nonnull (strstr (f, want));
  }
  g_assert_nonnull (strstr (f, verdict == AW_COMPLIANCE_OVER ? "Verdict: OVER THE LIMIT"
                                                               : "Verdict: under the limit"));
  for (guint i = 0; i < G_N_ELEMENTS (masses_g); i++)
    kg[i] = aw_g_to_kg (masses_g[i]);
  g_assert_cmpint (aw_recommend (&in, &curve, &site, kg, G_N_ELEMENTS (kg), &rec), >=, 0);
  if (rec.best >= 0)
    {
      g_autofree char *m = ref_num (aw_kg_to_g (rec.rows[rec.best].mass_kg), 2);
      g_autofree char *e = ref_num (rec.rows[rec.best].energy_j, 2);
      g_autofree char *want = g_strdup_printf ("Recommended BB: %s g (%s J)", m, e);
      g_assert_nonnull (strstr (f, want));
    }
  /* the sweep table: one row per BB mass with velocity, energy, site energy */
  for (size_t i = 0; i < rec.n_rows; i++)
    {
      char *tok[4];
      tok[0] = ref_num (aw_kg_to_g (rec.rows[i].mass_kg), 2);
      tok[1] = ref_num (rec.rows[i].velocity_mps, 1);
      tok[2] = ref_num (rec.rows[i].energy_j, 2);
      tok[3] = ref_num (rec.rows[i].chrono_energy_j, 2);
      if (count_sequence (text, tok, 4) != 1)
        g_error ("%s: BB-mass row not printed: %s %s %s %s", setup_name, tok[0], tok[1], tok[2],
                 tok[3]);
      for (int j = 0; j < 4; j++)
        g_free (tok[j]);
    }
  aw_recommendation_clear (&rec);
  g_assert_nonnull (strstr (f, "Wear sealed, impact-rated eye protection"));
  g_assert_nonnull (strstr (f, "Technician: name, signature and date"));
  g_assert_nonnull (strstr (f, s->notes));
}

static void
test_sheet (void)
{
  g_autoptr (AwProject) p = load (demo_path);
  const struct { AwPaper paper; double w, h; const char *setup, *klass, *name; } cases[] = {
    { AW_PAPER_A4, A4_W, A4_H, "Outdoor rifle", RIFLE_CLASS, "sheet-a4.pdf" },
    { AW_PAPER_LETTER, LETTER_W, LETTER_H, "Designated marksman (HPA)", DMR_CLASS,
      "sheet-letter.pdf" },
  };

  for (guint c = 0; c < G_N_ELEMENTS (cases); c++)
    {
      g_autoptr (AwPrintJob) job = aw_print_job_new (AW_PRINT_KIND_SHEET, p);
      g_autoptr (GError) error = NULL;
      g_autofree char *pdf = out_path (cases[c].name);
      g_autofree char *text = NULL;
      PdfInfo info;

      aw_print_job_set_paper (job, cases[c].paper);
      g_assert_true (aw_print_job_add_setup (job, cases[c].setup, &error));
      g_assert_true (aw_print_job_set_site (job, NULL, cases[c].klass, &error));
      g_assert_true (aw_print_to_pdf (job, pdf, &error));
      g_assert_no_error (error);
      pdf_info (pdf, &info);
      g_assert_cmpint (info.pages, ==, aw_print_n_pages (job));
      g_assert_cmpint (info.pages, >=, 1);
      check_page (&info, cases[c].w, cases[c].h);
      pdf_info_clear (&info);
      text = pdf_text (pdf);
      check_sheet_figures (text, p, cases[c].setup, cases[c].klass);
      check_page_numbers (text, aw_print_n_pages (job));
      check_layout (pdf);
    }

  {
    /* A6 is for cards only */
    g_autoptr (AwPrintJob) job = aw_print_job_new (AW_PRINT_KIND_SHEET, p);
    g_autoptr (GError) error = NULL;
    aw_print_job_set_paper (job, AW_PAPER_A6);
    g_assert_true (aw_print_job_add_setup (job, "Outdoor rifle", NULL));
    g_assert_false (aw_print_job_prepare (job, &error));
    g_assert_error (error, AW_PRINT_ERROR, AW_PRINT_ERROR_OPTION);
    g_assert_cmpint (aw_print_n_pages (job), ==, 0);
  }
}

/* ---- loadout ---- */

static void
test_loadout (void)
{
  g_autoptr (AwProject) p = load (demo_path);
  g_autoptr (AwPrintJob) job = aw_print_job_new (AW_PRINT_KIND_LOADOUT, p);
  g_autoptr (GError) error = NULL;
  g_autofree char *pdf = out_path ("loadout.pdf");
  g_autofree char *text = NULL, *f = NULL;
  const AwSiteClassRule *rule = find_class (p, RIFLE_CLASS);
  AwSiteClass site;
  PdfInfo info;

  for (guint i = 0; i < p->setups->len; i++)
    {
      const AwSetup *s = g_ptr_array_index (p->setups, i);
      g_assert_true (aw_print_job_add_setup (job, s->name, &error));
    }
  g_assert_true (aw_print_job_set_site (job, SITE, RIFLE_CLASS, &error));
  g_assert_true (aw_print_to_pdf (job, pdf, &error));
  g_assert_no_error (error);
  pdf_info (pdf, &info);
  g_assert_cmpint (info.pages, ==, aw_print_n_pages (job));
  check_page (&info, A4_W, A4_H);
  g_assert_cmpstr (info.title, ==, "Loadout sheet – Kestrel Lane Workshop — spring jobs");
  pdf_info_clear (&info);
  text = pdf_text (pdf);
  f = flat (text);

  aw_site_class_rule_to_site_class (rule, &site);
  for (guint i = 0; i < p->setups->len; i++)
    {
      AwSetup *s = g_ptr_array_index (p->setups, i);
      AwAnalysisInput in;
      AwPowerCurve curve;
      double chrono_j;
      AwCompliance verdict;
      char *tok[5];

      g_assert_cmpint (aw_setup_to_analysis_input (s, p, &in), ==, AW_BRIDGE_OK);
      aw_setup_power_curve (s, &curve);
      verdict = aw_site_check (&site, &curve, in.shot.mass_kg, &chrono_j);
      tok[0] = ref_num (s->bb.mass_g, 2);
      tok[1] = ref_num (in.shot.velocity_mps, 1);
      tok[2] = ref_num (aw_energy_j (in.shot.mass_kg, in.shot.velocity_mps), 2);
      tok[3] = ref_num (chrono_j, 2);
      tok[4] = g_strdup (verdict == AW_COMPLIANCE_OVER ? "OVER" : "under");
      if (count_sequence (text, tok, 5) != 1)
        g_error ("%s: loadout row not printed: %s %s %s %s %s", s->name, tok[0], tok[1], tok[2],
                 tok[3], tok[4]);
      for (int j = 0; j < 5; j++)
        g_free (tok[j]);
    }
  g_assert_nonnull (strstr (f, "outdoor rifle (" SITE "): limit 1.49 J, chrono with 0.20 g"));
  g_assert_nonnull (strstr (f, "Everyone chronographs with the site’s BB before play"));
  g_assert_nonnull (strstr (f, "Wear sealed, impact-rated eye protection"));
  check_page_numbers (text, aw_print_n_pages (job));
  check_layout (pdf);
}

/* ---- German locale: numbers with a decimal comma (LANGUAGE=de LC_ALL=de_DE.UTF-8) ---- */

static void
require_german (void)
{
  const char *old = setlocale (LC_ALL, NULL);
  g_autofree char *saved = g_strdup (old);
  if (setlocale (LC_ALL, "de_DE.UTF-8") == NULL)
    g_error ("the de_DE.UTF-8 locale is missing: generate it (see .ci/install-deps)");
  setlocale (LC_ALL, saved);
}

static void
run_german (const char *localedir, const char *tag)
{
  g_autoptr (AwProject) p = load (demo_path);
  const char *env[] = { "LANGUAGE", "de", "LC_ALL", "de_DE.UTF-8", "AW_LOCALEDIR", localedir,
                        NULL };
  g_autofree char *card = g_strdup_printf ("%s/card-%s.pdf", tmp_dir, tag);
  g_autofree char *sheet = g_strdup_printf ("%s/sheet-%s.pdf", tmp_dir, tag);
  g_autofree char *loadout = g_strdup_printf ("%s/loadout-%s.pdf", tmp_dir, tag);
  const char *card_args[] = { "card", demo_path, "--setup", "Gas sidearm", "--setup",
                              "Designated marksman (HPA)", "--site", SITE, "--class", DMR_CLASS,
                              "-o", card, NULL };
  const char *sheet_args[] = { "sheet", demo_path, "--setup", "Designated marksman (HPA)",
                               "--class", DMR_CLASS, "-o", sheet, NULL };
  const char *loadout_args[] = { "loadout", demo_path, "--class", RIFLE_CLASS, "--paper",
                                 "letter", "-o", loadout, NULL };
  const char *const *all[] = { card_args, sheet_args, loadout_args };
  g_autofree char *text = NULL;
  int code;

  require_german ();
  for (guint i = 0; i < G_N_ELEMENTS (all); i++)
    {
      g_autofree char *err = NULL;
      g_autofree char *out = cli (all[i], env, &code, &err);
      if (code != 0)
        g_error ("%s failed (%d): %s", all[i][0], code, err);
    }
  decimal_mark = ',';
  text = pdf_text (card);
  g_assert_cmpint (check_card_rows (text, p, "Gas sidearm", DMR_CLASS, FALSE, 1), >=, 6);
  g_assert_cmpint (check_card_rows (text, p, "Designated marksman (HPA)", DMR_CLASS, FALSE, 1),
                   >=, 6);
  g_clear_pointer (&text, g_free);
  {
    /* chrono figures with a decimal comma */
    AwSetup *s = aw_project_find_setup (p, "Designated marksman (HPA)");
    AwChronoStats st;
    g_autofree char *mean = NULL, *emax = NULL;
    g_assert_true (aw_chrono_string_stats (g_ptr_array_index (s->chrono, 0), &st));
    mean = ref_num (st.mean_mps, 2);
    emax = ref_num (st.energy_max_j, 2);
    g_assert_nonnull (strchr (mean, ','));
    text = pdf_text (sheet);
    g_assert_cmpint (count_sequence (text, &mean, 1), >=, 1);
    g_assert_cmpint (count_sequence (text, &emax, 1), >=, 1);
    g_clear_pointer (&text, g_free);
  }
  decimal_mark = '.';
  check_layout (card);
  check_layout (sheet);
  check_layout (loadout);
}

static void
test_german (void)
{
  /* the translations built in the tree (po/) */
  const char *dir = g_getenv ("AW_PO_BUILDDIR");
  g_assert_nonnull (dir);
  run_german (dir, "de");
}

/* Pseudo-German: every word of four letters or more of the printed texts gets a long ending
 * ("Distance" → "Distanceungsfläche"), as long German compounds do, to show that headers, boxes
 * and tables still fit without overlapping. */
static char *
pseudo (const char *s)
{
  GString *o = g_string_new (NULL);
  const char *p = s;
  while (*p)
    {
      if (*p == '<')
        {
          const char *e = strchr (p, '>');
          if (e == NULL)
            e = p + strlen (p) - 1;
          g_string_append_len (o, p, e - p + 1);
          p = e + 1;
        }
      else if (*p == '%')
        {
          /* a conversion: copy it whole (%s, %u, %d, %%) */
          g_string_append_c (o, *p++);
          if (*p)
            g_string_append_c (o, *p++);
        }
      else if (g_ascii_isalpha (*p))
        {
          const char *q = p;
          while (g_ascii_isalpha (*q))
            q++;
          g_string_append_len (o, p, q - p);
          if (q - p >= 4)
            g_string_append (o, "ungsfläche");
          p = q;
        }
      else
        g_string_append_c (o, *p++);
    }
  return g_string_free (o, FALSE);
}

/* Reads the C-string literal after a keyword in a .pot line ("msgid \"…\"" or "\"…\""). */
static void
pot_append (GString *s, const char *line)
{
  const char *a = strchr (line, '"'), *b = strrchr (line, '"');
  if (a && b > a)
    g_string_append_len (s, a + 1, b - a - 1);
}

static char *
po_escape_pseudo (const char *escaped)
{
  g_autofree char *raw = g_strcompress (escaped);
  g_autofree char *ps = pseudo (raw);
  GString *o = g_string_new (NULL);
  for (const char *q = ps; *q; q++)
    switch (*q)
      {
      case '"':
        g_string_append (o, "\\\"");
        break;
      case '\\':
        g_string_append (o, "\\\\");
        break;
      case '\n':
        g_string_append (o, "\\n");
        break;
      case '\t':
        g_string_append (o, "\\t");
        break;
      default:
        g_string_append_c (o, *q);
        break;
      }
  return g_string_free (o, FALSE);
}

static void
build_pseudo_catalog (void)
{
  g_autofree char *src = g_build_filename (g_getenv ("G_TEST_SRCDIR"), "..", NULL);
  g_autofree char *pot = out_path ("print.pot");
  g_autofree char *po = out_path ("print-de.po");
  g_autofree char *dir = g_build_filename (tmp_dir, "locale", "de", "LC_MESSAGES", NULL);
  g_autofree char *mo = g_build_filename (dir, "arcwright.mo", NULL);
  g_autofree char *pot_text = NULL;
  g_auto (GStrv) lines = NULL;
  GString *out = g_string_new ("msgid \"\"\nmsgstr \"\"\n\"Content-Type: text/plain; "
                               "charset=UTF-8\\n\"\n\"Plural-Forms: nplurals=2; "
                               "plural=(n != 1);\\n\"\n\n");
  g_autoptr (GPtrArray) files = g_ptr_array_new_with_free_func (g_free);
  const char *names[] = { "ui/aw-print.c", "ui/aw-print-card.c", "ui/aw-print-sheet.c",
                          "ui/aw-print-loadout.c", "ui/aw-print-layout.c", "ui/aw-plot.c",
                          "ui/aw-chart.c" };

  g_ptr_array_add (files, g_strdup ("xgettext"));
  g_ptr_array_add (files, g_strdup ("--from-code=UTF-8"));
  g_ptr_array_add (files, g_strdup ("--keyword=_"));
  g_ptr_array_add (files, g_strdup ("--keyword=N_"));
  g_ptr_array_add (files, g_strdup ("--keyword=g_dngettext:2,3"));
  g_ptr_array_add (files, g_strdup ("-o"));
  g_ptr_array_add (files, g_strdup (pot));
  for (guint i = 0; i < G_N_ELEMENTS (names); i++)
    g_ptr_array_add (files, g_build_filename (src, names[i], NULL));
  g_ptr_array_add (files, NULL);
  g_free (tool ((const char *const *) files->pdata));

  g_assert_true (g_file_get_contents (pot, &pot_text, NULL, NULL));
  lines = g_strsplit (pot_text, "\n", -1);
  for (int i = 0; lines[i]; i++)
    {
      GString *id, *plural = NULL;
      if (!g_str_has_prefix (lines[i], "msgid \""))
        continue;
      id = g_string_new (NULL);
      pot_append (id, lines[i]);
      while (lines[i + 1] && lines[i + 1][0] == '"')
        pot_append (id, lines[++i]);
      if (id->len == 0)
        {
          g_string_free (id, TRUE);
          continue;
        }
      if (lines[i + 1] && g_str_has_prefix (lines[i + 1], "msgid_plural \""))
        {
          plural = g_string_new (NULL);
          pot_append (plural, lines[++i]);
          while (lines[i + 1] && lines[i + 1][0] == '"')
            pot_append (plural, lines[++i]);
        }
      {
        g_autofree char *t = po_escape_pseudo (id->str);
        if (plural)
          {
            g_autofree char *tp = po_escape_pseudo (plural->str);
            g_string_append_printf (out, "msgid \"%s\"\nmsgid_plural \"%s\"\nmsgstr[0] \"%s\"\n"
                                    "msgstr[1] \"%s\"\n\n", id->str, plural->str, t, tp);
          }
        else
          g_string_append_printf (out, "msgid \"%s\"\nmsgstr \"%s\"\n\n", id->str, t);
      }
      g_string_free (id, TRUE);
      if (plural)
        g_string_free (plural, TRUE);
    }
  g_assert_true (g_file_set_contents (po, out->str, -1, NULL));
  g_string_free (out, TRUE);
  g_assert_cmpint (g_mkdir_with_parents (dir, 0755), ==, 0);
  {
    const char *argv[] = { "msgfmt", "--check-format", "-o", mo, po, NULL };
    g_free (tool (argv));
  }
  pseudo_localedir = g_build_filename (tmp_dir, "locale", NULL);
}

static void
test_pseudo_german (void)
{
  build_pseudo_catalog ();
  run_german (pseudo_localedir, "pseudo");
  {
    /* the long translations are really in use */
    g_autofree char *card = g_strdup_printf ("%s/card-pseudo.pdf", tmp_dir);
    g_autofree char *text = pdf_text (card);
    g_assert_nonnull (strstr (text, "ungsfläche"));
  }
}

/* ---- long setup names ---- */

static void
make_long_project (void)
{
  g_autoptr (AwProject) p = load (demo_path);
  g_autoptr (GError) error = NULL;
  AwSetup *s = aw_project_find_setup (p, "Outdoor rifle");

  g_assert_cmpint (g_utf8_strlen (long_name, -1), ==, 60);
  g_free (s->name);
  s->name = g_strdup (long_name);
  long_path = out_path ("long.arcw");
  g_assert_true (aw_project_save (p, long_path, &error));
  g_assert_no_error (error);
}

static void long_names_run (void);

static void
test_long_names (void)
{
  make_long_project ();
  long_names_run ();
}

static void
long_names_run (void)
{
  g_autoptr (AwProject) p = NULL;
  g_autofree char *card = out_path ("long-card.pdf");
  g_autofree char *cards = out_path ("long-cards-letter.pdf");
  g_autofree char *sheet = out_path ("long-sheet.pdf");
  g_autofree char *loadout = out_path ("long-loadout.pdf");
  const char *a1[] = { "card", long_path, "--setup", long_name, "--class", DMR_CLASS, "-o", card,
                       NULL };
  const char *a2[] = { "card", long_path, "--setup", long_name, "--sheet-of-cards", "--paper",
                       "letter", "-o", cards, NULL };
  const char *a3[] = { "sheet", long_path, "--setup", long_name, "--class", RIFLE_CLASS, "-o",
                       sheet, NULL };
  const char *a4[] = { "loadout", long_path, "--class", RIFLE_CLASS, "-o", loadout, NULL };
  const char *const *all[] = { a1, a2, a3, a4 };

  p = load (long_path);
  for (guint i = 0; i < G_N_ELEMENTS (all); i++)
    {
      g_autofree char *err = NULL;
      int code;
      g_autofree char *out = cli (all[i], NULL, &code, &err);
      if (code != 0)
        g_error ("%s failed (%d): %s", all[i][0], code, err);
    }
  {
    /* the name in full (it may wrap) on the card and the sheet, and the figures still there */
    g_autofree char *t1 = pdf_text (card);
    g_autofree char *t3 = pdf_text (sheet);
    g_autofree char *f1 = flat (t1);
    g_autofree char *f3 = flat (t3);
    g_assert_nonnull (strstr (f1, long_name));
    g_assert_nonnull (strstr (f3, long_name));
    g_assert_cmpint (check_card_rows (t1, p, long_name, DMR_CLASS, FALSE, 1), >=, 6);
  }
  check_layout (card);
  check_layout (cards);
  check_layout (sheet);
  check_layout (loadout);
}

/* ---- command line: bad input gets one clear line and no file ---- */

static void
test_cli_errors (void)
{
  g_autofree char *pdf = out_path ("never.pdf");
  g_autofree char *kept = out_path ("kept.pdf");
  g_autofree char *bad = out_path ("bad.arcw");
  g_autofree char *subdir = out_path ("a-directory.pdf");
  struct
  {
    const char *args[12];
    int code;
    const char *mention;
  } cases[] = {
    { { "card", demo_path, "--setup", "No such setup", "-o", pdf }, 2, "--setup" },
    { { "card", demo_path, "--setup", "Gas sidearm" }, 2, "--output" },
    { { "sheet", demo_path, "--setup", "Gas sidearm", "--paper", "a6", "-o", pdf }, 2,
      "--paper" },
    { { "card", demo_path, "--setup", "Gas sidearm", "--paper", "b5", "-o", pdf }, 2,
      "--paper" },
    { { "card", demo_path, "--setup", "Gas sidearm", "--units", "furlongs", "-o", pdf }, 2,
      "--units" },
    { { "card", demo_path, "--setup", "Gas sidearm", "--class", "no such class", "-o", pdf }, 2,
      "--class" },
    { { "sheet", demo_path, "--setup", "Gas sidearm", "--sheet-of-cards", "-o", pdf }, 2,
      "--sheet-of-cards" },
    { { "card", demo_path, "-o", pdf }, 2, "--setup" },
    { { "card", bad, "--setup", "Gas sidearm", "-o", pdf }, 2, "bad.arcw" },
    { { "card", demo_path, "--setup", "Gas sidearm", "--date", "31.12.2024", "-o", pdf }, 2,
      "--date" },
    { { "card", demo_path, "--setup", "Gas sidearm", "-o", subdir }, 1, "a-directory.pdf" },
  };

  g_assert_true (g_file_set_contents (bad, "{ \"format\": \"arcwright-project\", \"version\": ",
                                      -1, NULL));
  g_assert_true (g_file_set_contents (kept, "previous", -1, NULL));
  g_assert_cmpint (g_mkdir_with_parents (subdir, 0755), ==, 0);
  for (guint i = 0; i < G_N_ELEMENTS (cases); i++)
    {
      g_autofree char *err = NULL;
      g_autofree char *out = NULL;
      int code;
      out = cli (cases[i].args, NULL, &code, &err);
      if (code != cases[i].code || strstr (err, cases[i].mention) == NULL)
        g_error ("case %u: exit %d (want %d), stderr \"%s\" should name %s", i, code,
                 cases[i].code, err, cases[i].mention);
      g_assert_cmpuint (strlen (err), >, 0);
      g_assert_false (g_file_test (pdf, G_FILE_TEST_EXISTS));
    }
  g_assert_true (g_file_test (subdir, G_FILE_TEST_IS_DIR));

  {
    /* a failed run leaves an existing file alone, and no temporary file behind */
    const char *args[] = { "card", demo_path, "--setup", "No such setup", "-o", kept, NULL };
    g_autofree char *contents = NULL;
    g_autofree char *err = NULL;
    g_autofree char *out = NULL;
    g_autoptr (GDir) d = NULL;
    const char *name;
    int code;
    out = cli (args, NULL, &code, &err);
    g_assert_cmpint (code, ==, 2);
    g_assert_true (g_file_get_contents (kept, &contents, NULL, NULL));
    g_assert_cmpstr (contents, ==, "previous");
    d = g_dir_open (tmp_dir, 0, NULL);
    while ((name = g_dir_read_name (d)) != NULL)
      g_assert_null (strstr (name, ".tmp-"));
  }
  {
    /* --help and the command list */
    const char *args[] = { "loadout", "--help", NULL };
    const char *list[] = { "--help", NULL };
    g_autofree char *err = NULL, *err2 = NULL;
    int code;
    g_autofree char *out = cli (args, NULL, &code, &err);
    g_autofree char *out2 = NULL;
    g_assert_cmpint (code, ==, 0);
    g_assert_nonnull (strstr (out, "--sheet-of-cards"));
    out2 = cli (list, NULL, &code, &err2);
    g_assert_nonnull (strstr (out2, "card"));
    g_assert_nonnull (strstr (out2, "loadout"));
  }
}

/* ---- the same page for another page size (the print dialog's paper) ---- */

static void
test_draw_other_size (void)
{
  g_autoptr (AwProject) p = load (demo_path);
  g_autoptr (AwPrintJob) job = aw_print_job_new (AW_PRINT_KIND_SHEET, p);
  cairo_surface_t *surface;
  cairo_t *cr;
  int n_a4, n_letter;

  g_assert_true (aw_print_job_add_setup (job, "Outdoor rifle", NULL));
  g_assert_true (aw_print_job_add_setup (job, "Gas sidearm", NULL));
  n_a4 = aw_print_n_pages (job);
  n_letter = aw_print_paginate (job, LETTER_W, LETTER_H);
  g_assert_cmpint (n_a4, >=, 2);
  g_assert_cmpint (n_letter, >=, 2);
  /* every page draws something inside the page */
  surface = cairo_recording_surface_create (CAIRO_CONTENT_COLOR_ALPHA, NULL);
  cr = cairo_create (surface);
  for (int i = 0; i < n_letter; i++)
    {
      double x, y, w, h;
      cairo_surface_t *page = cairo_recording_surface_create (CAIRO_CONTENT_COLOR_ALPHA, NULL);
      cairo_t *pcr = cairo_create (page);
      aw_print_draw_page (job, pcr, NULL, i, LETTER_W, LETTER_H);
      cairo_destroy (pcr);
      cairo_recording_surface_ink_extents (page, &x, &y, &w, &h);
      g_assert_cmpfloat (w, >, 100.0);
      g_assert_cmpfloat (x, >=, 0.0);
      g_assert_cmpfloat (y, >=, 0.0);
      g_assert_cmpfloat (x + w, <=, LETTER_W + 0.5);
      g_assert_cmpfloat (y + h, <=, LETTER_H + 0.5);
      cairo_surface_destroy (page);
    }
  cairo_destroy (cr);
  cairo_surface_destroy (surface);
  /* back to the job's own paper */
  g_assert_cmpint (aw_print_n_pages (job), ==, n_a4);
}

/* ---- printing: GtkPrintOperation draws the same pages as the PDF export ---- */

static void
test_operation_export (void)
{
  g_autoptr (AwProject) p = load (demo_path);
  const struct { AwPrintKind kind; AwPaper paper; const char *name; } cases[] = {
    { AW_PRINT_KIND_CARD, AW_PAPER_A6, "op-card" },
    { AW_PRINT_KIND_SHEET, AW_PAPER_LETTER, "op-sheet" },
  };

  for (guint c = 0; c < G_N_ELEMENTS (cases); c++)
    {
      g_autoptr (GError) error = NULL;
      g_autofree char *via_op = g_strdup_printf ("%s/%s-gtk.pdf", tmp_dir, cases[c].name);
      g_autofree char *direct = g_strdup_printf ("%s/%s-direct.pdf", tmp_dir, cases[c].name);
      g_autofree char *t1 = NULL, *t2 = NULL;
      AwPrintJob *job = aw_print_job_new (cases[c].kind, p);
      g_autoptr (AwPrintJob) job2 = aw_print_job_new (cases[c].kind, p);
      g_autoptr (GDateTime) date = g_date_time_new_utc (2025, 5, 17, 10, 0, 0);
      GtkPrintOperation *op;
      GtkPrintOperationResult result;
      PdfInfo a, b;

      for (int k = 0; k < 2; k++)
        {
          AwPrintJob *j = k ? job2 : job;
          aw_print_job_set_paper (j, cases[c].paper);
          aw_print_job_set_date (j, date);
          g_assert_true (aw_print_job_add_setup (j, "Gas sidearm", NULL));
          g_assert_true (aw_print_job_set_site (j, NULL, DMR_CLASS, NULL));
        }
      op = aw_print_operation_new (job);
      gtk_print_operation_set_export_filename (op, via_op);
      result = gtk_print_operation_run (op, GTK_PRINT_OPERATION_ACTION_EXPORT, NULL, &error);
      g_assert_no_error (error);
      g_assert_cmpint (result, ==, GTK_PRINT_OPERATION_RESULT_APPLY);
      g_object_unref (op);
      g_assert_true (aw_print_to_pdf (job2, direct, &error));
      g_assert_no_error (error);

      pdf_info (via_op, &a);
      pdf_info (direct, &b);
      g_assert_cmpint (a.pages, ==, b.pages);
      g_assert_cmpfloat_with_epsilon (a.width, b.width, PAGE_TOL_PT);
      g_assert_cmpfloat_with_epsilon (a.height, b.height, PAGE_TOL_PT);
      pdf_info_clear (&a);
      pdf_info_clear (&b);
      t1 = pdf_text (via_op);
      t2 = pdf_text (direct);
      g_assert_cmpstr (t1, ==, t2);
      check_layout (via_op);
    }
}

int
main (int argc, char **argv)
{
  g_autoptr (GError) error = NULL;
  int ret;

  /* numbers of the expected values are formatted in the C locale (the German run is a child) */
  setlocale (LC_ALL, "C");
  g_test_init (&argc, &argv, NULL);
  demo_path = g_build_filename (g_getenv ("AW_DATADIR") ? g_getenv ("AW_DATADIR")
                                : AW_SOURCE_DATADIR, "demo.arcw", NULL);
  tmp_dir = g_dir_make_tmp ("arcwright-print-XXXXXX", &error);
  g_assert_no_error (error);

  g_test_add_func ("/print/card/a6", test_card_a6);
  g_test_add_func ("/print/card/sheet-of-four", test_card_sheet_of_four);
  g_test_add_func ("/print/card/imperial-cli", test_card_imperial_cli);
  g_test_add_func ("/print/sheet", test_sheet);
  g_test_add_func ("/print/loadout", test_loadout);
  g_test_add_func ("/print/draw-other-size", test_draw_other_size);
  g_test_add_func ("/print/cli/errors", test_cli_errors);
  g_test_add_func ("/print/operation-export", test_operation_export);
  g_test_add_func ("/print/long-names", test_long_names);
  g_test_add_func ("/print/german", test_german);
  g_test_add_func ("/print/pseudo-german", test_pseudo_german);
  ret = g_test_run ();

  /* keep the PDFs to look at with AW_KEEP_PRINT_OUTPUT=1 */
  if (g_getenv ("AW_KEEP_PRINT_OUTPUT"))
    g_printerr ("# outputs kept in %s\n", tmp_dir);
  else
    {
      const char *rm[] = { "rm", "-rf", tmp_dir, NULL };
      int code;
      g_free (run (rm, NULL, &code, NULL));
    }
  return ret;
}
