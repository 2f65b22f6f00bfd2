/* aw-print.h: printed outputs (range card, setup sheet, loadout sheet)
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * One renderer draws every page with cairo and pango (no widgets), so the on-screen preview, the
 * PDF export and printing show the same page. A job holds a private copy of the project, the
 * chosen setups and the options; the analysis runs once (aw_print_job_prepare, called on demand).
 *
 * Page coordinates are PostScript points (1/72 in), origin at the top-left corner of the paper.
 *
 *   job = aw_print_job_new (AW_PRINT_KIND_CARD, project);
 *   aw_print_job_add_setup (job, "Field rifle", &error);
 *   aw_print_job_set_site (job, "Club field", "outdoor rifle", &error);
 *   aw_print_to_pdf (job, "card.pdf", &error);
 *   aw_print_job_free (job);
 *
 * Printing through GtkPrintOperation: see aw-print-dialog.h.
 */
#pragma once

#include <cairo.h>
#include <glib.h>
#include <pango/pango.h>

#include "aw-project.h"

G_BEGIN_DECLS

#define AW_PRINT_ERROR (aw_print_error_quark ())

typedef enum
{
  AW_PRINT_ERROR_NO_SETUP,        /* the job has no setup */
  AW_PRINT_ERROR_UNKNOWN_SETUP,   /* no setup of that name in the project */
  AW_PRINT_ERROR_UNKNOWN_SITE,    /* no site rules / class of that name */
  AW_PRINT_ERROR_SETUP_INVALID,   /* a setup's values cannot be turned into a flight */
  AW_PRINT_ERROR_ANALYSIS,        /* the flight computation failed */
  AW_PRINT_ERROR_OPTION,          /* an option does not suit the kind of output */
  AW_PRINT_ERROR_IO,              /* writing the file failed */
} AwPrintError;

GQuark aw_print_error_quark (void);

typedef enum
{
  AW_PRINT_KIND_CARD = 0,         /* range card, one per setup */
  AW_PRINT_KIND_SHEET,            /* customer setup sheet, one per setup */
  AW_PRINT_KIND_LOADOUT,          /* loadout sheet, all setups of the job on one sheet */
} AwPrintKind;

typedef enum
{
  AW_PAPER_A6 = 0,                /* 105 × 148 mm: one pocket card per page */
  AW_PAPER_A4,                    /* 210 × 297 mm */
  AW_PAPER_LETTER,                /* 8.5 × 11 in */
} AwPaper;

typedef enum
{
  AW_PRINT_UNITS_METRIC = 0,      /* m, cm, m/s */
  AW_PRINT_UNITS_IMPERIAL,        /* yd, in, fps, mph (BB mass stays in grams, energy in J) */
} AwPrintUnits;

/* Range-table rows: every 5 m (metric) or every 5 yd (imperial), from the first step to the
 * ground, at most AW_PRINT_TABLE_MAX_ROWS rows. */
#define AW_PRINT_TABLE_STEP_METRIC_M   5.0
#define AW_PRINT_TABLE_STEP_IMPERIAL_M (5.0 * 0.9144)
#define AW_PRINT_TABLE_MAX_ROWS        24

/* A range card is drawn in an A6 box (105 × 148 mm), scaled to a quarter of A4 or Letter. */
#define AW_PRINT_CARD_W (105.0 / 25.4 * 72.0)
#define AW_PRINT_CARD_H (148.0 / 25.4 * 72.0)

typedef struct _AwPrintJob AwPrintJob;

/* The job keeps its own copy of the project. */
AwPrintJob *aw_print_job_new (AwPrintKind kind, const AwProject *project);
void aw_print_job_free (AwPrintJob *job);

AwPrintKind aw_print_job_get_kind (AwPrintJob *job);

/* Adds a setup by name (cards and sheets: one per setup, in order; loadout: one row each). */
gboolean aw_print_job_add_setup (AwPrintJob *job, const char *setup_name, GError **error);
guint aw_print_job_get_n_setups (AwPrintJob *job);

/* Paper: cards default to A6; sheets and loadouts to A4 (A6 is refused by prepare for them). */
void aw_print_job_set_paper (AwPrintJob *job, AwPaper paper);
AwPaper aw_print_job_get_paper (AwPrintJob *job);

/* Range cards on A4 or Letter are always laid out several to a page (four, each scaled to a
 * quarter of the sheet; a single setup is repeated to fill the sheet). */
void aw_print_job_set_units (AwPrintJob *job, AwPrintUnits units);
AwPrintUnits aw_print_job_get_units (AwPrintJob *job);

/* The site class the outputs check against (limit, chrono BB, minimum engagement distance).
 * site_name may be NULL when the project has exactly one set of site rules. class_name NULL
 * clears the choice. */
gboolean aw_print_job_set_site (AwPrintJob *job, const char *site_name, const char *class_name,
                                GError **error);

/* The date printed on the pages (default: now). The job takes a reference. */
void aw_print_job_set_date (AwPrintJob *job, GDateTime *date);

/* Runs the analysis for every setup. Called by the functions below when needed; call it first
 * to get the error. Idempotent; changing an option makes it run again. */
gboolean aw_print_job_prepare (AwPrintJob *job, GError **error);

/* Title for the PDF metadata and the print job name ("Range card – NAME", …). */
const char *aw_print_job_get_title (AwPrintJob *job);

/* Size of a paper in points. */
void aw_print_paper_size (AwPaper paper, double *width_pt, double *height_pt);

/* Number of pages on the job's paper (0 when prepare fails). */
int aw_print_n_pages (AwPrintJob *job);

/* Number of pages for a page of another size (the print dialog may change the paper): the
 * layout follows width × height from then on. */
int aw_print_paginate (AwPrintJob *job, double width_pt, double height_pt);

/* Draws page `page` (0-based) on cr, whose user space is points with the origin at the top-left
 * corner of a width × height page. pango may be NULL (a context is made for cr); when given, its
 * resolution should be 72 dpi (see aw_print_pango_context_new). */
void aw_print_draw_page (AwPrintJob *job, cairo_t *cr, PangoContext *pango, int page,
                         double width_pt, double height_pt);

/* A pango context for cr with 72 dpi and unhinted metrics, so text measures the same on the
 * screen, in a PDF and on a printer. */
PangoContext *aw_print_pango_context_new (cairo_t *cr);

/* Writes every page to a PDF (title, subject, creator "Arcwright", creation date; fonts embedded
 * by cairo). The file is written to a temporary name and renamed, so a failure never leaves a
 * half-written file at path. */
gboolean aw_print_to_pdf (AwPrintJob *job, const char *path, GError **error);

G_DEFINE_AUTOPTR_CLEANUP_FUNC (AwPrintJob, aw_print_job_free)

G_END_DECLS
