/** A file name safe in a Content-Disposition header and a mail attachment, whatever the chart number holds. */
export const pdfFilename = (chartNumber: string) =>
  `lab-prescription-${chartNumber.replace(/[^A-Za-z0-9_-]+/g, '_').slice(0, 40)}.pdf`;
