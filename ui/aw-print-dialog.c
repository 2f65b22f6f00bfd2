/* aw-print-dialog.c: printing, print preview and PDF export of a print job from the window
 *
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "aw-config.h"

#include <glib/gi18n.h>

#include "aw-print-dialog.h"

static GtkPrintSettings *saved_settings;

void
aw_print_dialog_forget_settings (void)
{
  g_clear_object (&saved_settings);
}

static void
show_error (GtkWindow *parent, const char *headline, const GError *error)
{
  /* GtkMessageDialog is the 4.8 way (GtkAlertDialog needs 4.10) */
  GtkWidget *dialog = gtk_message_dialog_new (parent,
                                              GTK_DIALOG_MODAL | GTK_DIALOG_DESTROY_WITH_PARENT,
                                              GTK_MESSAGE_ERROR, GTK_BUTTONS_CLOSE, "%s",
                                              headline);
  if (error)
    gtk_message_dialog_format_secondary_text (GTK_MESSAGE_DIALOG (dialog), "%s", error->message);
  g_signal_connect (dialog, "response", G_CALLBACK (gtk_window_destroy), NULL);
  gtk_window_present (GTK_WINDOW (dialog));
}

static GtkPaperSize *
paper_size_for (AwPaper paper)
{
  switch (paper)
    {
    case AW_PAPER_A4:
      return gtk_paper_size_new (GTK_PAPER_NAME_A4);
    case AW_PAPER_LETTER:
      return gtk_paper_size_new (GTK_PAPER_NAME_LETTER);
    case AW_PAPER_A6:
    default:
      return gtk_paper_size_new ("iso_a6");
    }
}

static void
begin_print (GtkPrintOperation *op, GtkPrintContext *context, gpointer user_data)
{
  AwPrintJob *job = user_data;
  int n = aw_print_paginate (job, gtk_print_context_get_width (context),
                             gtk_print_context_get_height (context));
  gtk_print_operation_set_n_pages (op, MAX (n, 1));
}

static void
draw_page (GtkPrintOperation *op, GtkPrintContext *context, int page, gpointer user_data)
{
  AwPrintJob *job = user_data;
  cairo_t *cr = gtk_print_context_get_cairo_context (context);

  /* the same renderer as the PDF export: points, origin at the paper's corner */
  aw_print_draw_page (job, cr, NULL, page, gtk_print_context_get_width (context),
                      gtk_print_context_get_height (context));
}

static void
done (GtkPrintOperation *op, GtkPrintOperationResult result, gpointer user_data)
{
  g_object_set_data (G_OBJECT (op), "aw-done", GINT_TO_POINTER (1));
  if (result == GTK_PRINT_OPERATION_RESULT_ERROR)
    {
      g_autoptr (GError) error = NULL;
      gtk_print_operation_get_error (op, &error);
      show_error (g_object_get_data (G_OBJECT (op), "aw-parent"), _("Printing failed"), error);
    }
  else if (result == GTK_PRINT_OPERATION_RESULT_APPLY)
    g_set_object (&saved_settings, gtk_print_operation_get_print_settings (op));
}

GtkPrintOperation *
aw_print_operation_new (AwPrintJob *job)
{
  g_autoptr (GtkPageSetup) setup = NULL;
  g_autoptr (GtkPaperSize) paper = NULL;
  GtkPrintOperation *op;

  g_return_val_if_fail (job != NULL, NULL);
  op = gtk_print_operation_new ();
  g_object_set_data_full (G_OBJECT (op), "aw-job", job, (GDestroyNotify) aw_print_job_free);
  gtk_print_operation_set_job_name (op, aw_print_job_get_title (job));
  gtk_print_operation_set_unit (op, GTK_UNIT_POINTS);
  gtk_print_operation_set_use_full_page (op, TRUE);
  if (saved_settings)
    gtk_print_operation_set_print_settings (op, saved_settings);

  setup = gtk_page_setup_new ();
  paper = paper_size_for (aw_print_job_get_paper (job));
  gtk_page_setup_set_paper_size_and_default_margins (setup, paper);
  gtk_page_setup_set_orientation (setup, GTK_PAGE_ORIENTATION_PORTRAIT);
  gtk_print_operation_set_default_page_setup (op, setup);

  g_signal_connect (op, "begin-print", G_CALLBACK (begin_print), job);
  g_signal_connect (op, "draw-page", G_CALLBACK (draw_page), job);
  return op;
}

static void
run (GtkWindow *parent, AwPrintJob *job, GtkPrintOperationAction action)
{
  g_autoptr (GError) error = NULL;
  GtkPrintOperation *op;
  GtkPrintOperationResult result;

  g_return_if_fail (job != NULL);
  if (!aw_print_job_prepare (job, &error))
    {
      show_error (parent, _("Nothing to print"), error);
      aw_print_job_free (job);
      return;
    }

  op = aw_print_operation_new (job);
  g_object_set_data (G_OBJECT (op), "aw-parent", parent);
  gtk_print_operation_set_embed_page_setup (op, TRUE);
  gtk_print_operation_set_allow_async (op, TRUE);
  g_signal_connect (op, "done", G_CALLBACK (done), NULL);

  /* GTK keeps its own references while an asynchronous run is in progress; the job goes with
   * the last reference to op */
  result = gtk_print_operation_run (op, action, parent, &error);
  if (result == GTK_PRINT_OPERATION_RESULT_ERROR
      && g_object_get_data (G_OBJECT (op), "aw-done") == NULL)
    show_error (parent, _("Printing failed"), error);
  g_object_unref (op);
}

void
aw_print_run_dialog (GtkWindow *parent, AwPrintJob *job)
{
  run (parent, job, GTK_PRINT_OPERATION_ACTION_PRINT_DIALOG);
}

void
aw_print_run_preview (GtkWindow *parent, AwPrintJob *job)
{
  run (parent, job, GTK_PRINT_OPERATION_ACTION_PREVIEW);
}

/* ---- PDF export ---- */

static void
export_response (GtkNativeDialog *native, int response, gpointer user_data)
{
  AwPrintJob *job = user_data;
  GtkWindow *parent = gtk_native_dialog_get_transient_for (native);

  if (response == GTK_RESPONSE_ACCEPT)
    {
      g_autoptr (GFile) file = gtk_file_chooser_get_file (GTK_FILE_CHOOSER (native));
      g_autofree char *path = file ? g_file_get_path (file) : NULL;
      g_autoptr (GError) error = NULL;

      if (path == NULL)
        {
          g_set_error_literal (&error, G_IO_ERROR, G_IO_ERROR_NOT_SUPPORTED,
                               _("Choose a file on this computer."));
          show_error (parent, _("The PDF could not be saved"), error);
        }
      else if (!aw_print_to_pdf (job, path, &error))
        show_error (parent, _("The PDF could not be saved"), error);
    }
  aw_print_job_free (job);
  g_object_unref (native);
}

void
aw_print_export_pdf_dialog (GtkWindow *parent, AwPrintJob *job)
{
  g_autoptr (GError) error = NULL;
  GtkFileChooserNative *native;
  g_autoptr (GtkFileFilter) filter = NULL;
  g_autofree char *name = NULL;

  g_return_if_fail (job != NULL);
  if (!aw_print_job_prepare (job, &error))
    {
      show_error (parent, _("Nothing to export"), error);
      aw_print_job_free (job);
      return;
    }
  native = gtk_file_chooser_native_new (_("Export to PDF"), parent, GTK_FILE_CHOOSER_ACTION_SAVE,
                                        _("_Export"), _("_Cancel"));
  gtk_native_dialog_set_modal (GTK_NATIVE_DIALOG (native), TRUE);
  filter = gtk_file_filter_new ();
  gtk_file_filter_set_name (filter, _("PDF documents"));
  gtk_file_filter_add_mime_type (filter, "application/pdf");
  gtk_file_filter_add_suffix (filter, "pdf");
  gtk_file_chooser_add_filter (GTK_FILE_CHOOSER (native), filter);
  /* a file name from the title, without characters file systems dislike */
  name = g_strdup_printf ("%s.pdf", aw_print_job_get_title (job));
  g_strdelimit (name, "/\\:*?\"<>|", '-');
  gtk_file_chooser_set_current_name (GTK_FILE_CHOOSER (native), name);
  g_signal_connect (native, "response", G_CALLBACK (export_response), job);
  gtk_native_dialog_show (GTK_NATIVE_DIALOG (native));
}
