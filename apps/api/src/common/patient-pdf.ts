// A pdfkit document for pages that carry patient data: every page gets the same header (patient,
// chart number, date of birth, practice) and footer (who printed it, when, page n of m), so a
// page that comes loose from the rest still says whose it is and where it came from.
import type { DateFormat } from '@torquetrail/contracts';
import { FONT, notoPdfDocument, pdfBytes } from './pdf-document.js';
import { type DatePrinter, datePrinter } from './printed-dates.js';

export interface PatientPdfFrame {
  title: string;
  patientName: string;
  chartNumber: string;
  birthDate: string;
  practiceName: string;
  /** The practice's order for dates: every date on the document is written in it. */
  dateFormat: DateFormat;
  printedBy: string;
  /** ISO date-time of the print. */
  printedAt: string;
}

const PDF_MARGIN = 50;

/** The document and the call that draws every page's frame and returns the bytes. */
export async function patientPdf(frame: PatientPdfFrame): Promise<{
  doc: PDFKit.PDFDocument;
  dates: DatePrinter;
  finish: () => Promise<Buffer>;
}> {
  const dates = datePrinter(frame.dateFormat);
  const doc = await notoPdfDocument({
    size: 'A4',
    margins: { top: PDF_MARGIN + 22, bottom: PDF_MARGIN + 10, left: PDF_MARGIN, right: PDF_MARGIN },
    bufferPages: true,
    info: { Title: `${frame.title} ${frame.chartNumber}`, Author: frame.practiceName },
  });
  const done = pdfBytes(doc);
  const finish = () => {
    const { start, count } = doc.bufferedPageRange();
    const header = `${frame.patientName} · chart ${frame.chartNumber} · born ${dates.date(frame.birthDate)} · ${frame.practiceName}`;
    for (let i = start; i < start + count; i += 1) {
      doc.switchToPage(i);
      const width = doc.page.width - 2 * PDF_MARGIN;
      // Margins off while the frame is drawn, so writing in them does not open a new page.
      const { top, bottom } = doc.page.margins;
      doc.page.margins.top = 0;
      doc.page.margins.bottom = 0;
      doc.font(FONT.regular).fontSize(8).fillColor('#444444');
      doc.text(header, PDF_MARGIN, PDF_MARGIN - 20, { width, lineBreak: false });
      doc.text(
        `${frame.title} · printed by ${frame.printedBy} on ${dates.dayOf(frame.printedAt)} · page ${i - start + 1} of ${count}`,
        PDF_MARGIN,
        doc.page.height - PDF_MARGIN,
        { width, lineBreak: false },
      );
      doc.fillColor('#000000');
      doc.page.margins.top = top;
      doc.page.margins.bottom = bottom;
    }
    doc.end();
    return done;
  };
  return { doc, dates, finish };
}

/** How the practice is reached, as each document prints it. */
export interface PracticeContactLines {
  name: string;
  /** The practice's order for dates, which its documents print in. */
  dateFormat: DateFormat;
  address: string | null;
  phone: string | null;
  email: string | null;
}

/** The practice's name, address lines and phone and e-mail, each a line; a gap is said, not left blank. */
export function practiceContactLines(p: PracticeContactLines): string[] {
  const reach = [p.phone ? `Phone ${p.phone}` : '', p.email ? `E-mail ${p.email}` : ''].filter(Boolean).join('    ');
  return [
    p.name,
    ...(p.address ? p.address.split(/\r?\n/).filter((l) => l.trim() !== '') : []),
    reach || 'Phone and e-mail: not recorded by the practice.',
  ];
}
