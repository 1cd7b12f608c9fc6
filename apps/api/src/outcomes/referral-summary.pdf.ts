// The referral summary as a PDF (pdfkit), for the surgeon of a share: what was placed, what was
// delivered on it, the last recall status and the bone-level trend of each implant.
import { type PracticeContactLines, practiceContactLines } from '../common/patient-pdf.js';
import { FONT, notoPdfDocument, pdfBytes } from '../common/pdf-document.js';
import { datePrinter } from '../common/printed-dates.js';
import { fdiToUniversal } from '@torquetrail/domain';

interface SummaryPart {
  name: string;
  referenceCode: string;
  lot: string | null;
  installedOn: string;
}

export interface SummaryPdfSite {
  fdi: number;
  status: string;
  endedOn: string | null;
  placedOn: string;
  implant: string;
  lengthMm: number;
  lot: string | null;
  surgeonName: string;
  insertionTorqueNcm: number | null;
  stabilityIsq: number | null;
  loadingProtocol: string | null;
  restoration: string | null;
  deliveredOn: string | null;
  retrievable: boolean | null;
  parts: SummaryPart[];
  lastExam: { status: string; on: string } | null;
  boneLevels: { date: string; mm: number }[];
  boneChange: { mm: number; since: string } | null;
}

export interface SummaryPdfInput {
  practice: PracticeContactLines;
  patientName: string;
  birthDate: string;
  chartNumber: string;
  generatedOn: string;
  sites: SummaryPdfSite[];
}

/** The latest readings the trend lists (older ones are in the record). */
const TREND_READINGS = 8;

export async function renderReferralSummary(input: SummaryPdfInput): Promise<Buffer> {
  const doc = await notoPdfDocument({
    size: 'A4',
    margin: 50,
    info: { Title: `Referral summary ${input.chartNumber}`, Author: input.practice.name },
  });
  const done = pdfBytes(doc);
  const dates = datePrinter(input.practice.dateFormat);

  doc.font(FONT.bold).fontSize(16).text('Referral summary: implants');
  doc.font(FONT.regular).fontSize(10);
  for (const line of practiceContactLines(input.practice)) doc.text(line);
  doc.moveDown(0.5);
  doc.text(`Patient: ${input.patientName}, born ${dates.date(input.birthDate)}, chart ${input.chartNumber}`);
  doc.text(`Prepared: ${dates.date(input.generatedOn)}`);
  doc.moveDown();
  if (input.sites.length === 0) doc.text('No implant has been placed for this patient.');

  for (const s of input.sites) {
    doc
      .font(FONT.bold)
      .fontSize(11)
      .text(
        `Site ${s.fdi} (FDI) / ${fdiToUniversal(s.fdi)} (Universal): ${s.status}${s.endedOn ? ` on ${dates.date(s.endedOn)}` : ''}`,
      );
    doc.font(FONT.regular).fontSize(10);
    doc.text(
      `Placed ${dates.date(s.placedOn)} by ${s.surgeonName}: ${s.implant}, length ${s.lengthMm} mm${s.lot ? `, lot ${s.lot}` : ''}`,
      { indent: 12 },
    );
    const surgical = [
      s.insertionTorqueNcm !== null ? `insertion torque ${s.insertionTorqueNcm} N·cm` : null,
      s.stabilityIsq !== null ? `ISQ ${s.stabilityIsq}` : null,
      s.loadingProtocol ? `${s.loadingProtocol} loading` : null,
    ].filter(Boolean);
    if (surgical.length > 0) doc.text(surgical.join('; '), { indent: 12 });
    if (s.restoration) {
      doc.text(
        `Restoration delivered ${s.deliveredOn ? dates.date(s.deliveredOn) : '(date not recorded)'}: ${s.restoration}; ${s.retrievable ? 'retrievable (screw access)' : 'not retrievable without cutting (cemented)'}`,
        { indent: 12 },
      );
    } else doc.text('No restoration delivered yet', { indent: 12 });
    for (const p of s.parts)
      doc.text(`> ${p.name} [${p.referenceCode}]${p.lot ? ` lot ${p.lot}` : ''}, since ${dates.date(p.installedOn)}`, {
        indent: 24,
      });
    doc.text(
      s.lastExam
        ? `Last recall: ${s.lastExam.status} on ${dates.date(s.lastExam.on)}`
        : 'Last recall: not examined yet',
      {
        indent: 12,
      },
    );
    if (s.boneLevels.length > 0) {
      const trend = s.boneLevels
        .slice(-TREND_READINGS)
        .map((b) => `${dates.date(b.date)} ${b.mm.toFixed(1)} mm`)
        .join('; ');
      doc.text(`Bone level (mm from the platform): ${trend}`, { indent: 12 });
      doc.text(
        s.boneChange === null
          ? 'Change since loading: no reading since loading'
          : `Change since loading (from the reading of ${dates.date(s.boneChange.since)}): ${s.boneChange.mm > 0 ? 'loss of ' : s.boneChange.mm < 0 ? 'gain of ' : ''}${Math.abs(s.boneChange.mm).toFixed(1)} mm`,
        { indent: 12 },
      );
    } else doc.text('Bone level: no radiographic reading recorded', { indent: 12 });
    doc.moveDown(0.6);
  }
  doc
    .fontSize(8)
    .fillColor('#444444')
    .text(
      'Statuses are computed from the recorded exams (2017 World Workshop case definitions) and support, never replace, the clinical judgement.',
    );
  doc.end();
  return done;
}
