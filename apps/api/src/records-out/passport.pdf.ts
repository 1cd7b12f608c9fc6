// The implant passport: the patient's own record of what is in their mouth, in plain language,
// to show any dentist who treats them (abroad, in an emergency, after a move).
import { MANUFACTURER_CAUTION } from '@torquetrail/contracts';
import { fdiToUniversal, isRetrievable } from '@torquetrail/domain';
import { patientPdf, practiceContactLines } from '../common/patient-pdf.js';
import { FONT } from '../common/pdf-document.js';
import type { DatePrinter } from '../common/printed-dates.js';
import type { RecordSnapshot, SnapshotImplant, SnapshotImpression, SnapshotPart } from './record-snapshot.js';
import { connectionWords, materialWords, partKindWords, restorationKindWords, retentionWords } from './plain-words.js';

export interface PrintedBy {
  name: string;
  /** ISO date-time of the print. */
  at: string;
}

const PASSPORT_CAUTIONS = [
  'Show this passport to any dentist or doctor who treats you, and tell them you have dental implants.',
  'Implant parts are made for one implant system: only parts made for the system named here should be fitted.',
  'If a crown or bridge feels loose, or the gum around an implant bleeds, swells or hurts, contact the practice.',
  'Keep your check-ups: implants need regular professional checks and cleaning, as teeth do.',
  MANUFACTURER_CAUTION,
] as const;

const ncm = (v: number) => `${v} N·cm`;

function partLine(p: SnapshotPart, dates: DatePrinter): string {
  const lot = p.lot ? `, lot ${p.lot}` : '';
  const spec = p.torqueSpecNcm === null ? 'hand-tight' : `specified ${ncm(p.torqueSpecNcm)}`;
  const seated = p.seatingTorque
    ? `; tightened to ${ncm(p.seatingTorque.appliedNcm)} on ${dates.dayOf(p.seatingTorque.performedAt)}`
    : '';
  return `${partKindWords(p.kind)}: ${p.name} [${p.referenceCode}]${lot} (${spec}${seated})`;
}

export const udiLine = (i: SnapshotImplant) =>
  [i.placement.lot ? `lot ${i.placement.lot}` : '', i.placement.udi ? `UDI ${i.placement.udi}` : '']
    .filter(Boolean)
    .join(', ') || 'lot not recorded';

const kilobytes = (bytes: number) => `${Math.max(1, Math.round(bytes / 1024))} kB`;

/** One impression in plain words: how it was taken, the parts used and removed, the scan files kept. */
function impressionLines(i: SnapshotImpression, dates: DatePrinter): string[] {
  const teeth = i.fdis.map((f) => `${f}`).join(', ');
  const how =
    i.method === 'digital'
      ? 'a digital impression (an intraoral scan, with a scan body screwed on each implant)'
      : 'an impression with impression copings on the implants';
  const lines = [
    `On ${dates.date(i.takenOn)}, ${how}, at site ${teeth} (FDI), for the crown, bridge or denture made on them.`,
  ];
  for (const p of i.parts)
    lines.push(
      `- ${partKindWords(p.kind)} at site ${p.fdi}, used and removed: ${p.name} [${p.referenceCode}]${p.lot ? `, lot ${p.lot}` : ''}`,
    );
  for (const f of i.files)
    lines.push(
      `- Scan file kept by the practice: ${f.originalName ?? `scan ${f.id.slice(0, 8)}`} (${f.fileType.toUpperCase()}, ${kilobytes(f.sizeBytes)})`,
    );
  return lines;
}

export async function renderPassport(s: RecordSnapshot, printed: PrintedBy): Promise<Buffer> {
  const { patient, practice } = s;
  const { doc, dates, finish } = await patientPdf({
    title: 'Implant passport',
    patientName: `${patient.givenName} ${patient.familyName}`,
    chartNumber: patient.chartNumber,
    birthDate: patient.birthDate,
    practiceName: practice.name,
    dateFormat: practice.dateFormat,
    printedBy: printed.name,
    printedAt: printed.at,
  });
  doc.font(FONT.bold).fontSize(18).text('Your implant passport');
  doc.font(FONT.regular).fontSize(10).moveDown(0.3);
  doc.text(
    `This passport lists the dental implants in your mouth and what is fixed to them. Keep it with your papers and show it to any dentist who treats you.`,
  );
  doc.moveDown(0.6);
  doc.font(FONT.bold).text('Your practice');
  doc.font(FONT.regular);
  for (const line of practiceContactLines(practice)) doc.text(line);
  doc.moveDown(0.4);
  doc.text(
    s.nextRecallOn
      ? `Your next check-up is due on ${dates.longDate(s.nextRecallOn)}.`
      : 'No check-up is booked yet: please ask the practice for one.',
  );
  doc.moveDown(0.8);

  if (s.implants.length === 0) doc.text('No implant is recorded for you at this practice.');
  for (const i of s.implants) {
    const pl = i.placement;
    doc
      .font(FONT.bold)
      .fontSize(12)
      .text(`Implant at site ${i.fdi} (FDI) / ${fdiToUniversal(i.fdi)} (Universal)`);
    doc.font(FONT.regular).fontSize(10);
    doc.text(`Placed on ${dates.date(pl.placedOn)} by ${pl.surgeonName}.`, { indent: 12 });
    doc.text(
      `System: ${pl.systemName} by ${pl.manufacturer}; platform ${pl.platformName}, ${connectionWords(pl.connection)} connection.`,
      { indent: 12 },
    );
    doc.text(`Size: ${pl.diameterMm} mm wide × ${pl.lengthMm} mm long. Identification: ${udiLine(i)}.`, {
      indent: 12,
    });
    const r = i.restoration;
    if (r) {
      const how = isRetrievable(r.retention)
        ? 'It is screwed, so a dentist can unscrew and remove it (retrievable).'
        : 'It is cemented, so it cannot be removed without cutting it (not retrievable).';
      doc.text(
        `On it: ${restorationKindWords(r.kind)} in ${materialWords(r.material)}, ${retentionWords(r.retention)}, fitted on ${dates.date(r.deliveredOn)}. ${how}`,
        { indent: 12 },
      );
    } else {
      doc.text('No crown or bridge is recorded on it yet.', { indent: 12 });
    }
    const parts = i.parts.filter((p) => p.kind !== 'impression-coping');
    if (parts.length > 0) {
      doc.text('Parts fixed to the implant, from the implant outward:', { indent: 12 });
      for (const p of parts) doc.text(`- ${partLine(p, dates)}`, { indent: 24 });
    }
    doc.moveDown(0.6);
  }

  if (s.impressions.length > 0) {
    doc.font(FONT.bold).fontSize(12).text('Impressions taken for your restorations');
    doc.font(FONT.regular).fontSize(10);
    for (const i of s.impressions) {
      const [first, ...rest] = impressionLines(i, dates);
      doc.text(first, { indent: 12 });
      for (const line of rest) doc.text(line, { indent: 24 });
      doc.moveDown(0.3);
    }
  }

  doc.moveDown(0.4);
  doc.font(FONT.bold).text('Please note');
  doc.font(FONT.regular);
  for (const c of PASSPORT_CAUTIONS) doc.text(`- ${c}`, { indent: 12 });
  return finish();
}
