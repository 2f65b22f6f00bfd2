/* aw-print-dialog.h: printing, print preview and PDF export of a print job from the window
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Hooks for the window's File menu. Each function takes ownership of the job (it is freed when the
 * operation ends) and reports problems in a dialog on parent, so the caller only builds the job:
 *
 *   AwPrintJob *job = aw_print_job_new (AW_PRINT_KIND_CARD, project);
 *   aw_print_job_add_setup (job, setup->name, NULL);
 *   aw_print_run_dialog (GTK_WINDOW (win), job);
 */
#pragma once

#include <gtk/gtk.h>

#include "aw-print.h"

G_BEGIN_DECLS

/* The system print dialog (GtkPrintOperation): the pages are drawn by aw_print_draw_page for the
 * paper chosen there. The dialog's own Preview button shows the same pages. */
void aw_print_run_dialog (GtkWindow *parent, AwPrintJob *job);

/* Straight to GtkPrintOperation's preview. */
void aw_print_run_preview (GtkWindow *parent, AwPrintJob *job);

/* Asks for a file name (suggested from the job's title) and writes the PDF. */
void aw_print_export_pdf_dialog (GtkWindow *parent, AwPrintJob *job);

/* The print operation the functions above run, for other uses (e.g. GTK's own PDF export with
 * gtk_print_operation_set_export_filename and GTK_PRINT_OPERATION_ACTION_EXPORT): job name,
 * points, full page, the job's paper as default page setup, "begin-print" and "draw-page"
 * connected to the renderer. Takes ownership of the job (freed with the operation). */
GtkPrintOperation *aw_print_operation_new (AwPrintJob *job);

/* Print settings and page setup kept between runs in this process. */
void aw_print_dialog_forget_settings (void);

G_END_DECLS
