// The retrieval card: one page per restored site, for a clinician who has never seen the patient
// and must take the restoration off (a loose screw, a fracture): the exact parts chain, the
// screws and their specified torques, whether it can be unscrewed at all, the last torque.
import { MANUFACTURER_CAUTION, SCREW_KINDS } from '@torquetrail/contracts';
import { fdiToUniversal, isRetrievable } from '@torquetrail/domain';
import { patientPdf, type PracticeContactLines, practiceContactLines } from '../common/patient-pdf.js';
import { FONT } from '../common/pdf-document.js';
import type { DatePrinter } from '../common/printed-dates.js';
import { type PrintedBy, udiLine } from './passport.pdf.js';
import type { RecordSnapshot, SnapshotImplant, SnapshotPart } from './record-snapshot.js';
import { connectionWords, partKindWords, retentionWords, torqueReasonWords } from './plain-words.js';

const RETRIEVAL_CAUTION = `Check every part against the manufacturer's instructions for this system before loosening or tightening anything: ${MANUFACTURER_CAUTION}`;

const isScrew = (p: SnapshotPart) => (SCREW_KINDS as readonly string[]).includes(p.kind);

/** The latest torque logged on any part of the site, if any. */
function lastTorqueOf(i: SnapshotImplant): { at: string; part: SnapshotPart } | null {
  let last: { at: string; part: SnapshotPart } | null = null;
  for (const p of i.parts) {
    if (p.lastTorque && (!last || p.lastTorque.performedAt > last.at)) last = { at: p.lastTorque.performedAt, part: p };
  }
  return last;
}

function sitePage(doc: PDFKit.PDFDocument, i: SnapshotImplant, practice: PracticeContactLines, dates: DatePrinter) {
  const pl = i.placement;
  const r = i.restoration!;
  doc
    .font(FONT.bold)
    .fontSize(16)
    .text(`Retrieval card: site ${i.fdi} (FDI) / ${fdiToUniversal(i.fdi)} (Universal)`);
  doc.font(FONT.regular).fontSize(10).moveDown(0.4);
  doc.text(
    `Implant: ${pl.systemName} (${pl.manufacturer}), platform ${pl.platformName}, ${connectionWords(pl.connection)} connection, ${pl.diameterMm} × ${pl.lengthMm} mm, placed ${dates.date(pl.placedOn)}; ${udiLine(i)}.`,
  );
  doc.moveDown(0.4);
  const retrievable = isRetrievable(r.retention);
  doc.font(FONT.bold).text(`Retention: ${retentionWords(r.retention)}.`);
  doc.text(
    retrievable
      ? 'Can be unscrewed: yes. The restoration comes off by undoing the screws below.'
      : 'Can be unscrewed: no. It is cemented; removing it means cutting it off (the abutment screw is under it).',
  );
  doc
    .font(FONT.regular)
    .text(`Delivered ${dates.date(r.deliveredOn)}${r.fdis.length > 1 ? `, spanning sites ${r.fdis.join(', ')}` : ''}.`);
  doc.moveDown(0.6);

  doc.font(FONT.bold).text('Parts chain, from the implant outward');
  doc.font(FONT.regular);
  const chain = i.parts.filter((p) => p.kind !== 'impression-coping');
  if (chain.length === 0) doc.text('No parts recorded.', { indent: 12 });
  chain.forEach((p, n) => {
    const spec =
      p.torqueSpecNcm === null ? 'hand-tight' : `specified torque ${p.torqueSpecNcm} N·cm ±${p.tolerancePct} %`;
    doc.text(
      `${n + 1}. ${partKindWords(p.kind)}${isScrew(p) ? ' (screw)' : ''}: ${p.name} [${p.referenceCode}], ${p.manufacturer}${p.lot ? `, lot ${p.lot}` : ''}; ${spec}.`,
      { indent: 12 },
    );
    if (p.lastTorque)
      doc.text(
        `Last torque ${p.lastTorque.appliedNcm} N·cm on ${dates.dayOf(p.lastTorque.performedAt)} (${torqueReasonWords(p.lastTorque.reason)}).`,
        { indent: 24 },
      );
  });
  doc.moveDown(0.6);
  const last = lastTorqueOf(i);
  doc.text(
    last
      ? `Date of the last torque on this site: ${dates.dayOf(last.at)} (${partKindWords(last.part.kind)}).`
      : 'No torque is recorded on this site.',
  );
  doc.moveDown(0.8);
  doc.font(FONT.bold).text('Caution');
  doc.font(FONT.regular).text(RETRIEVAL_CAUTION);
  doc.moveDown(0.8);
  doc.font(FONT.bold).text('The practice that placed and restored it');
  doc.font(FONT.regular);
  for (const line of practiceContactLines(practice)) doc.text(line);
}

export async function renderRetrievalCard(s: RecordSnapshot, printed: PrintedBy): Promise<Buffer> {
  const { patient, practice } = s;
  const { doc, dates, finish } = await patientPdf({
    title: 'Retrieval card',
    patientName: `${patient.givenName} ${patient.familyName}`,
    chartNumber: patient.chartNumber,
    birthDate: patient.birthDate,
    practiceName: practice.name,
    dateFormat: practice.dateFormat,
    printedBy: printed.name,
    printedAt: printed.at,
  });
  const restored = s.implants.filter((i) => i.restoration !== null);
  if (restored.length === 0) {
    doc.font(FONT.bold).fontSize(16).text('Retrieval card');
    doc.font(FONT.regular).fontSize(10).moveDown().text('No restored implant site is recorded for this patient.');
  }
  restored.forEach((i, n) => {
    if (n > 0) doc.addPage();
    sitePage(doc, i, practice, dates);
  });
  return finish();
}
