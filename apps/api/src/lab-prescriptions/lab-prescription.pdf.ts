// The lab prescription as a PDF (pdfkit). The patient appears only by chart number and initials:
// the lab needs no more identifying data than that.
import { type PracticeContactLines, practiceContactLines } from '../common/patient-pdf.js';
import { FONT, notoPdfDocument, pdfBytes } from '../common/pdf-document.js';
import { type DatePrinter, datePrinter } from '../common/printed-dates.js';
import { type ComponentKind, MANUFACTURER_CAUTION, STACK_ORDER } from '@torquetrail/contracts';
import { fdiToUniversal, type ImpressionMethod } from '@torquetrail/domain';

interface PrescriptionPart {
  kind: string;
  name: string;
  referenceCode: string;
  torqueSpecNcm: number | null;
  tolerancePct: number;
  engaging: boolean | null;
  angleDeg: number | null;
  tray: string | null;
}

interface PrescriptionSite {
  fdi: number;
  systemName: string | null;
  manufacturer: string | null;
  platformName: string | null;
  connection: string | null;
  diameterMm: number | null;
  lengthMm: number | null;
  interface: string;
  impressionCoping: string;
  multiUnitAngleDeg: number | null;
  restorativeSpaceMm: number | null;
  parts: PrescriptionPart[];
}

export interface PrescriptionInput {
  practice: PracticeContactLines;
  number: number;
  chartNumber: string;
  initials: string;
  dentistName: string;
  kind: string;
  retention: string;
  material: string;
  shade: string | null;
  copingsSplinted: boolean;
  impressionTakenOn: string | null;
  dueOn: string | null;
  labName: string | null;
  notes: string | null;
  issuedOn: string;
  sites: PrescriptionSite[];
  /** The restoration's recorded impression (current version), when there is one. */
  impression: {
    method: ImpressionMethod;
    takenOn: string;
    scanBodies: { fdi: number; name: string; referenceCode: string; lot: string | null; marked: boolean }[];
    files: { name: string; fileType: string; sizeBytes: number }[];
  } | null;
}

const LABELS: Record<string, string> = {
  'single-crown': 'Single crown',
  'splinted-bridge': 'Splinted bridge',
  'full-arch': 'Full-arch prosthesis',
  'overdenture-studs': 'Overdenture on stud attachments',
  'overdenture-bar': 'Overdenture on a bar (bar made by the lab)',
  'screw-to-implant': 'Screw-retained directly on the implant',
  'screw-to-multi-unit': 'Screw-retained on multi-unit abutments',
  'cement-on-abutment': 'Cement-retained on abutments (not retrievable without cutting)',
  'lingual-set-screw': 'Lingual set-screw retained',
  zirconia: 'Zirconia',
  'titanium-porcelain': 'Titanium framework with porcelain',
  'titanium-composite': 'Titanium framework with composite',
  'full-gold': 'Full gold',
  'porcelain-fused-to-metal': 'Porcelain fused to metal',
  other: 'Other (see notes)',
  'internal-conical': 'internal conical',
  'internal-hex': 'internal hex',
  'external-hex': 'external hex',
};
const label = (v: string) => LABELS[v] ?? v;

/** A file size as the lab reads it: kB below a megabyte, MB above (decimal units). */
const fileSize = (bytes: number) =>
  bytes < 1_000_000 ? `${Math.max(1, Math.round(bytes / 1000))} kB` : `${(bytes / 1_000_000).toFixed(1)} MB`;

function impressionSection(
  doc: PDFKit.PDFDocument,
  impression: NonNullable<PrescriptionInput['impression']>,
  dates: DatePrinter,
) {
  doc
    .font(FONT.bold)
    .fontSize(11)
    .text(
      `Impression: ${impression.method === 'digital' ? 'digital (intraoral scan)' : 'analog (copings and tray)'}, taken ${dates.date(impression.takenOn)}`,
    );
  doc.font(FONT.regular).fontSize(10);
  if (impression.method === 'digital') {
    for (const b of impression.scanBodies)
      doc.text(
        `Scan body at ${b.fdi} (FDI) / ${fdiToUniversal(b.fdi)}: ${b.name} [${b.referenceCode}], lot ${b.lot ?? 'not recorded'}${b.marked ? ', marked in the scan file' : ''}`,
        {
          indent: 12,
        },
      );
    if (impression.files.length === 0) doc.text('Scan files: none uploaded yet', { indent: 12 });
    for (const f of impression.files)
      doc.text(`Scan file: ${f.name} (${f.fileType.toUpperCase()}, ${fileSize(f.sizeBytes)})`, { indent: 12 });
  }
  doc.moveDown();
}

const torque = (p: PrescriptionPart) =>
  p.torqueSpecNcm === null ? 'hand-tight' : `${p.torqueSpecNcm} N·cm ±${p.tolerancePct} %`;

export async function renderLabPrescription(input: PrescriptionInput): Promise<Buffer> {
  const doc = await notoPdfDocument({
    size: 'A4',
    margin: 50,
    info: { Title: `Lab prescription ${input.number} ${input.chartNumber}`, Author: input.practice.name },
  });
  const done = pdfBytes(doc);
  const dates = datePrinter(input.practice.dateFormat);

  doc.font(FONT.bold).fontSize(16).text('Implant restoration: lab prescription');
  doc.font(FONT.bold).fontSize(11).text(`Prescription no. ${input.number}`);
  doc.font(FONT.regular).fontSize(10);
  for (const line of practiceContactLines(input.practice)) doc.text(line);
  doc.moveDown(0.5);
  doc.text(`Patient: ${input.chartNumber} (${input.initials})`);
  doc.text(
    `Issued: ${dates.date(input.issuedOn)}${input.dueOn ? `    Due: ${dates.date(input.dueOn)}` : ''}${input.labName ? `    Laboratory: ${input.labName}` : ''}`,
  );
  doc.moveDown(0.5);
  doc.font(FONT.bold).text(`${label(input.kind)}: ${label(input.retention)}`);
  doc.font(FONT.regular).text(`Material: ${label(input.material)}${input.shade ? `    Shade: ${input.shade}` : ''}`);
  doc.text(
    `Impression: ${input.impressionTakenOn ? `taken ${dates.date(input.impressionTakenOn)}, ` : ''}copings ${input.copingsSplinted ? 'splinted together before the impression' : 'not splinted'}`,
  );
  doc.moveDown();

  for (const site of input.sites) {
    doc
      .font(FONT.bold)
      .fontSize(11)
      .text(`Site ${site.fdi} (FDI) / ${fdiToUniversal(site.fdi)} (Universal)`);
    doc.font(FONT.regular).fontSize(10);
    const implant = site.systemName
      ? `${site.systemName} (${site.manufacturer}), platform ${site.platformName}, ${site.diameterMm} × ${site.lengthMm} mm (diameter × length), ${label(site.connection ?? '')} connection`
      : 'no placement recorded';
    doc.text(`Implant: ${implant}`, { indent: 12 });
    doc.text(
      `Interface: ${site.interface}${site.multiUnitAngleDeg !== null ? `; multi-unit angle ${site.multiUnitAngleDeg}°` : ''}${site.restorativeSpaceMm !== null ? `; restorative space ${site.restorativeSpaceMm} mm` : ''}`,
      { indent: 12 },
    );
    const chain = site.parts
      .filter((p) => p.kind !== 'impression-coping')
      .sort((a, b) => STACK_ORDER.indexOf(a.kind as ComponentKind) - STACK_ORDER.indexOf(b.kind as ComponentKind));
    for (const p of chain) doc.text(`> ${p.name} [${p.referenceCode}]: ${torque(p)}`, { indent: 24 });
    if (chain.length === 0) doc.text('> no parts chosen', { indent: 24 });
    const copings = site.parts.filter((p) => p.kind === 'impression-coping');
    const copingText =
      copings.length > 0
        ? copings.map((c) => `${c.name} [${c.referenceCode}]`).join(', ')
        : 'none chosen from the catalogue';
    doc.text(`Impression technique: ${site.impressionCoping} coping; ${copingText}`, { indent: 12 });
    doc.moveDown(0.6);
  }
  if (input.impression) impressionSection(doc, input.impression, dates);

  if (input.notes) {
    doc.font(FONT.bold).text('Notes');
    doc.font(FONT.regular).text(input.notes);
    doc.moveDown();
  }
  doc.fontSize(8).fillColor('#444444').text(MANUFACTURER_CAUTION);
  doc.fillColor('#000000').fontSize(10).moveDown(2);
  doc.text('Signature: ________________________________');
  doc.text(input.dentistName);
  doc.end();
  return done;
}
