// Builds the Timeline of a site from its rows: every event in time order, amended entries kept
// and marked, with one torque series per part for the chart. The dates its words quote (expiry,
// installed and removed, the radiograph's day) are written in the reader's practice's order
// (issue 15 §7); each event's own `at` stays ISO 8601, for the web to write.
import {
  DEFAULT_DATE_FORMAT,
  TIMELINE_KINDS,
  type TimelineEvent,
  type TimelineKind,
  type SeatingAnswer,
  type TimelineReply,
  type TorqueSeries,
  type ReminderStatus,
} from '@torquetrail/contracts';
import { isRetrievable } from '@torquetrail/domain';
import { type DatePrinter, datePrinter } from '../common/printed-dates.js';
import { udiFacts } from '../common/udi-facts.js';
import type * as repo from './timeline.repository.js';

type Rows<K extends keyof typeof repo> = Awaited<ReturnType<(typeof repo)[K]>>;

export interface TimelineRows {
  placements: Rows<'placementsOfSite'>;
  restorations: Rows<'restorationsOfSite'>;
  parts: Rows<'partsOfSite'>;
  torque: Rows<'torqueEventsOfSite'>;
  complications: Rows<'complicationsOfSite'>;
  recallExams: Rows<'recallExamsOfSite'>;
  radiographs: Rows<'radiographsOfSite'>;
  measurements: Rows<'measurementsOfSite'>;
  seatingChecks: Rows<'seatingChecksOfSite'>;
  /** Recorded impressions (analog, or digital with scan bodies): only where the reader may see impressions. */
  impressions: Rows<'impressionsOfSite'>;
  referralSummaries: Rows<'referralSummariesOfSite'>;
  passportMails: Rows<'passportMailsOfSite'>;
  freeTextParts: Rows<'freeTextPartsOfSite'>;
  /** Retentive-insert changes of an overdenture (InsertChangesService), amended ones too. */
  insertChanges: InsertChangeRow[];
  /** Which of the entries a legacy import wrote, from which file and row (docs/import.md). */
  importMarks: Rows<'importMarksOf'>;
}

/** An insert change as the Timeline reads it. */
interface InsertChangeRow {
  id: string;
  changedOn: string;
  reason: string;
  notes: string | null;
  supersedesId: string | null;
  amendmentReason: string | null;
  recordedByName: string | null;
  recordedAt: Date;
  amended: boolean;
  oldPart: { name: string; retentionLabel: string | null; retentionN: number | null } | null;
  newPart: { name: string; retentionLabel: string | null; retentionN: number | null };
}

/** An insert's strength as the catalogue states it: its label, and its force when stated. */
const strength = (p: InsertChangeRow['newPart']) =>
  [p.retentionLabel ?? p.name, p.retentionN !== null ? `${p.retentionN} N` : null].filter(Boolean).join(', ');

/** What a seating check found, in the words of the Timeline's titles. */
const SEATED_WORDS: Record<SeatingAnswer, string> = { yes: 'seated', no: 'not seated', unsure: 'unclear' };
/** What became of a passport e-mail, in the words of the Timeline's titles. */
const PASSPORT_MAIL_TITLE: Record<ReminderStatus, string> = {
  pending: 'Implant passport e-mail requested (waiting for the mail server)',
  sent: 'Implant passport e-mailed to the patient',
  failed: 'Implant passport e-mail failed',
  withheld: 'Implant passport e-mail withheld',
};
const mm = (v: number) => `${v.toFixed(1)} mm`;

const day = (date: string) => `${date}T00:00:00.000Z`;
const text = (v: string) => v.replace(/-/g, ' ');
const span = (fdis: number[]) => (fdis.length > 1 ? `sites ${fdis.join(', ')}` : `site ${fdis[0]}`);

function base(
  kind: TimelineKind,
  id: string,
  at: string,
  dateOnly: boolean,
  title: string,
  { keySuffix = '', ...rest }: Partial<TimelineEvent> & { keySuffix?: string } = {},
): TimelineEvent {
  return {
    key: `${kind}:${id}${keySuffix}`,
    id,
    kind,
    at,
    dateOnly,
    title,
    detail: null,
    amended: false,
    supersedesId: null,
    amendmentReason: null,
    componentInstanceId: null,
    verdict: null,
    code: null,
    appliedNcm: null,
    byName: null,
    radiographId: null,
    enteredInErrorReason: null,
    importedFrom: null,
    ...rest,
  };
}

/** What the surgeon recorded at placement, as the Timeline's detail line. */
function placementDetail(p: TimelineRows['placements'][number], dates: DatePrinter): string | null {
  const { serial, expiry } = udiFacts(p.udi);
  const said = [
    p.insertionTorqueNcm !== null ? `insertion torque ${p.insertionTorqueNcm} N·cm` : null,
    p.stabilityIsq !== null ? `ISQ ${p.stabilityIsq}` : null,
    p.lot ? `lot ${p.lot}` : null,
    p.gtin ? `GTIN ${p.gtin}` : null,
    serial ? `serial ${serial}` : null,
    expiry ? `expiry ${dates.date(expiry)}` : null,
    p.gtinOtherSystem ? `the catalogue knows this GTIN as ${p.gtinOtherSystem}, not the system chosen` : null,
    p.grafting ? `grafting: ${p.grafting}` : null,
    p.notes ? `notes: ${p.notes}` : null,
  ].filter(Boolean);
  return said.length > 0 ? said.join('; ') : null;
}

export function buildTimeline(
  siteId: string,
  rows: TimelineRows,
  kinds?: TimelineKind[],
  dates: DatePrinter = datePrinter(DEFAULT_DATE_FORMAT),
): TimelineReply {
  const events: TimelineEvent[] = [];
  /** Tie-break for entries of one kind on one day: when they were recorded (an amendment after its original). */
  const recorded = new Map<TimelineEvent, string>();
  for (const p of rows.placements) {
    events.push(
      base(
        'placement',
        p.id,
        day(p.placedOn),
        true,
        `${p.supersedesId ? 'Placement (amended record)' : 'Implant placed'}: ${p.systemName}, ${p.platformName} × ${p.lengthMm} mm`,
        {
          detail: placementDetail(p, dates),
          byName: p.surgeonName,
          amended: p.amended,
          supersedesId: p.supersedesId,
          amendmentReason: p.amendmentReason,
        },
      ),
    );
  }
  for (const r of rows.restorations) {
    const what = `${text(r.kind)}, ${text(r.retention)}, ${text(r.material)}${r.shade ? ` ${r.shade}` : ''} (${span(r.spansFdi)})`;
    const warnings = (r.findings as { severity: string }[]).filter((f) => f.severity === 'warning').length;
    events.push(
      base(
        'plan',
        r.id,
        r.createdAt.toISOString(),
        false,
        `${r.supersedesId ? 'Plan amended' : 'Restoration planned'}: ${what}`,
        {
          detail: `${r.interface} interface, ${r.impressionCoping} impression coping${r.copingsSplinted ? 's splinted' : ''}${warnings ? `; ${warnings} warning Finding(s) acknowledged` : ''}`,
          byName: r.plannedByName,
          amended: r.amended,
          supersedesId: r.supersedesId,
          amendmentReason: r.amendmentReason,
        },
      ),
    );
    if (r.impressionTakenOn)
      events.push(
        base(
          'impression',
          r.id,
          day(r.impressionTakenOn),
          true,
          `Impression taken: ${r.impressionCoping} coping${r.copingsSplinted ? 's, splinted' : ''}`,
          { amended: r.amended },
        ),
      );
    if (r.deliveredOn) {
      // A provisional stays in the Timeline, marked replaced once its definitive is delivered.
      const retrievable = isRetrievable(r.retention)
        ? 'Retrievable'
        : 'Cement-retained: not retrievable without cutting';
      const replacement = r.provisional
        ? r.replacedById
          ? '; replaced by the definitive restoration'
          : '; awaiting the definitive restoration'
        : r.replacesProvisional
          ? '; replaces the provisional'
          : '';
      events.push(
        base(
          'delivery',
          r.id,
          day(r.deliveredOn),
          true,
          `${r.provisional ? 'Provisional restoration delivered' : 'Restoration delivered'}: ${what}`,
          { detail: `${retrievable}${replacement}`, amended: r.amended },
        ),
      );
    }
    for (const l of r.labs)
      events.push(
        base('lab-prescription', l.id, l.createdAt.toISOString(), false, 'Lab prescription issued', {
          detail: l.emailedTo ? `e-mailed to ${l.emailedTo}` : null,
          byName: l.byName,
        }),
      );
  }
  for (const i of rows.impressions) {
    const digital = i.method === 'digital';
    const files = digital ? `; ${i.scanFileCount} scan file${i.scanFileCount === 1 ? '' : 's'}` : '';
    events.push(
      base(
        'impression',
        i.id,
        day(i.takenOn),
        true,
        `${i.supersedesId ? 'Impression amended' : 'Impression recorded'}: ${digital ? 'digital (intraoral scan)' : 'analog (copings and tray)'}`,
        {
          keySuffix: ':recorded',
          detail:
            [i.scanBodies.length > 0 ? `scan bodies ${i.scanBodies.join('; ')}` : null, files.slice(2) || null, i.note]
              .filter(Boolean)
              .join('; ') || null,
          byName: i.byName,
          amended: i.amended,
          supersedesId: i.supersedesId,
          amendmentReason: i.amendmentReason,
        },
      ),
    );
  }
  const folded = foldedIntoInsertChanges(rows.parts);
  for (const p of rows.parts) {
    // An insert change's own entry says what it took out and put in (insertChangeDetail).
    if (p.insertChangeId) continue;
    events.push(
      base(
        'part',
        p.id,
        day(p.installedOn),
        true,
        `${p.replacesId ? 'Replacement installed' : 'Installed'}: ${p.name}`,
        {
          keySuffix: ':in',
          detail: [p.referenceCode, p.lot ? `lot ${p.lot}` : null].filter(Boolean).join(', '),
          componentInstanceId: p.id,
          byName: p.byName,
        },
      ),
    );
    if (p.removedOn && !folded.has(p.id))
      events.push(
        base('part', p.id, day(p.removedOn), true, `Removed: ${p.name}`, {
          keySuffix: ':out',
          componentInstanceId: p.id,
        }),
      );
  }
  for (const t of rows.torque) {
    const event = base(
      'torque',
      t.id,
      t.performedAt.toISOString(),
      false,
      `${t.appliedNcm} N·cm on ${t.partName} (${text(t.reason)}): ${t.verdict}`,
      {
        detail: [
          `spec ${t.specNcm} N·cm ±${t.tolerancePct} %${t.wrenchLabel ? `, ${t.wrenchLabel}` : ''}`,
          t.wrenchCalibrationOverdue ? 'wrench calibration overdue' : null,
          t.earlySettlingConfirmed ? 'early re-torque confirmed by the clinician' : null,
        ]
          .filter(Boolean)
          .join('; '),
        wrenchCalibrationOverdue: t.wrenchCalibrationOverdue,
        earlySettlingConfirmed: t.earlySettlingConfirmed,
        componentInstanceId: t.componentInstanceId,
        verdict: t.verdict,
        code: t.reason,
        appliedNcm: t.appliedNcm,
        byName: t.byName,
        amended: t.amended,
        supersedesId: t.supersedesId,
        amendmentReason: t.amendmentReason,
      },
    );
    events.push(event);
    recorded.set(event, t.recordedAt.toISOString());
  }
  for (const c of rows.complications) {
    const event = base(
      'complication',
      c.id,
      day(c.occurredOn),
      true,
      `Complication: ${text(c.kind)}${c.partName ? ` (${c.partName})` : ''}`,
      {
        detail: c.notes,
        code: c.kind,
        componentInstanceId: c.componentInstanceId,
        byName: c.byName,
        amended: c.amended,
        supersedesId: c.supersedesId,
        amendmentReason: c.amendmentReason,
      },
    );
    events.push(event);
    recorded.set(event, c.recordedAt.toISOString());
  }
  for (const c of rows.insertChanges) {
    const event = base(
      'insert-change',
      c.id,
      day(c.changedOn),
      true,
      `${c.supersedesId ? 'Insert change (amended record)' : 'Retentive insert changed'}: ${c.oldPart ? `${strength(c.oldPart)} → ` : ''}${strength(c.newPart)} (${text(c.reason)})`,
      {
        detail: [c.notes, insertChangeDetail(c.id, rows.parts)].filter(Boolean).join('; ') || null,
        code: c.reason,
        byName: c.recordedByName,
        amended: c.amended,
        supersedesId: c.supersedesId,
        amendmentReason: c.amendmentReason,
      },
    );
    events.push(event);
    recorded.set(event, c.recordedAt.toISOString());
  }
  for (const m of rows.passportMails) {
    events.push(
      base('passport-mail', m.id, (m.sentAt ?? m.requestedAt).toISOString(), false, PASSPORT_MAIL_TITLE[m.status], {
        detail: `to ${m.sentTo}`,
        byName: m.byName,
      }),
    );
  }
  for (const e of rows.recallExams) {
    events.push(
      base('recall-exam', e.id, day(e.examinedOn), true, `Recall exam: ${text(e.status)}`, {
        detail: e.boneLevelMm !== null ? `bone level ${e.boneLevelMm} mm` : null,
        byName: e.byName,
        amended: e.amended,
        supersedesId: e.supersedesId,
        amendmentReason: e.amendmentReason,
      }),
    );
  }
  addRadiographEvents(rows, events, recorded, dates);
  for (const m of rows.referralSummaries) {
    const at = (m.sentAt ?? m.requestedAt).toISOString();
    const state = m.status === 'sent' ? 'e-mailed' : m.status === 'pending' ? 'waiting to be e-mailed' : 'not sent';
    events.push(
      base('referral-summary', m.id, at, false, `Referral summary ${state}`, {
        detail: `to ${m.sentTo}`,
        byName: m.byName,
      }),
    );
    recorded.set(events[events.length - 1], m.requestedAt.toISOString());
  }
  for (const f of rows.freeTextParts)
    events.push(
      base('imported-part', f.id, day(f.installedOn), true, `Part not in the catalogue: ${f.partName ?? f.partRef}`, {
        detail: [f.partRef, f.lot ? `lot ${f.lot}` : null].filter(Boolean).join(', '),
      }),
    );
  const marks = new Map(rows.importMarks.map((m) => [m.recordId, `${m.fileName}, row ${m.rowNumber}`]));
  for (const e of events) e.importedFrom = marks.get(e.id) ?? null;
  const kept = kinds ? events.filter((e) => kinds.includes(e.kind)) : events;
  // Day first; within a day, the order of a sitting (date-only entries have no time of their own),
  // then the time, then when the entry was recorded.
  kept.sort(
    (a, b) =>
      a.at.slice(0, 10).localeCompare(b.at.slice(0, 10)) ||
      TIMELINE_KINDS.indexOf(a.kind) - TIMELINE_KINDS.indexOf(b.kind) ||
      a.at.localeCompare(b.at) ||
      (recorded.get(a) ?? '').localeCompare(recorded.get(b) ?? ''),
  );

  const torqueSeries: TorqueSeries[] = rows.parts
    .filter((p) => rows.torque.some((t) => t.componentInstanceId === p.id))
    .map((p) => ({
      componentInstanceId: p.id,
      label: `${p.name} (installed ${dates.date(p.installedOn)}${p.removedOn ? `, removed ${dates.date(p.removedOn)}` : ''})`,
      specNcm: p.torqueSpecNcm,
      tolerancePct: p.tolerancePct,
      removedOn: p.removedOn,
      points: rows.torque
        .filter((t) => t.componentInstanceId === p.id && !t.amended)
        .map((t) => ({
          id: t.id,
          at: t.performedAt.toISOString(),
          appliedNcm: t.appliedNcm,
          specNcm: t.specNcm,
          tolerancePct: t.tolerancePct,
          verdict: t.verdict,
          reason: t.reason,
        })),
    }));
  return { siteId, events: kept, torqueSeries };
}

type PartRow = TimelineRows['parts'][number];

/** The parts whose removal an insert change made (the part it fitted replaced them): told in its entry. */
function foldedIntoInsertChanges(parts: PartRow[]): Set<string> {
  return new Set(
    parts.filter((q) => q.insertChangeId && q.replacesId && !q.enteredInErrorReason).map((q) => q.replacesId as string),
  );
}

/**
 * What an insert change did to the Stack, for its Timeline entry: the part it fitted (in place of
 * the one it replaced), or, when an amendment corrected it, that the part was entered in error.
 */
function insertChangeDetail(changeId: string, parts: PartRow[]): string | null {
  const fitted = parts.filter((p) => p.insertChangeId === changeId);
  const said = fitted.map((p) => {
    if (p.enteredInErrorReason)
      return `${p.name} entered in error in the Stack, corrected by the amendment (${p.enteredInErrorReason})`;
    const replaced = parts.find((r) => r.id === p.replacesId);
    return `Stack: ${p.name} fitted${replaced ? ` in place of ${replaced.name}` : ''}${p.lot ? `, lot ${p.lot}` : ''}`;
  });
  return said.length > 0 ? said.join('; ') : null;
}

/** Radiographs (entered-in-error ones marked), the bone levels read from them, and seating checks. */
function addRadiographEvents(
  rows: TimelineRows,
  events: TimelineEvent[],
  recorded: Map<TimelineEvent, string>,
  dates: DatePrinter,
) {
  for (const x of rows.radiographs) {
    const event = base(
      'radiograph',
      x.id,
      x.takenOn ? day(x.takenOn) : x.uploadedAt.toISOString(),
      x.takenOn !== null,
      `${x.enteredInErrorReason ? 'Radiograph (entered in error)' : 'Radiograph'}: ${text(x.kind)}`,
      {
        detail: x.note,
        code: x.kind,
        byName: x.byName,
        radiographId: x.id,
        enteredInErrorReason: x.enteredInErrorReason,
      },
    );
    events.push(event);
    recorded.set(event, x.uploadedAt.toISOString());
  }
  for (const m of rows.measurements) {
    const event = base(
      'bone-level',
      m.id,
      m.takenOn ? day(m.takenOn) : m.measuredAt.toISOString(),
      m.takenOn !== null,
      `${m.supersedesId ? 'Bone level (amended measurement)' : 'Bone level measured'}: mesial ${mm(m.mesialMm)}, distal ${mm(m.distalMm)}`,
      {
        detail: 'From the implant platform along its axis, on the radiograph',
        byName: m.byName,
        radiographId: m.radiographId,
        enteredInErrorReason: m.enteredInErrorReason,
        amended: m.amended,
        supersedesId: m.supersedesId,
        amendmentReason: m.amendmentReason,
      },
    );
    events.push(event);
    recorded.set(event, m.measuredAt.toISOString());
  }
  for (const c of rows.seatingChecks) {
    const event = base(
      'seating-check',
      c.id,
      c.recordedAt.toISOString(),
      false,
      `Seating at the ${c.event} checked on a radiograph${c.radiographTakenOn ? ` of ${dates.date(c.radiographTakenOn)}` : ''}: ${SEATED_WORDS[c.seated]}`,
      {
        detail: c.note,
        code: c.seated,
        byName: c.byName,
        radiographId: c.radiographId,
        enteredInErrorReason: c.enteredInErrorReason,
        amended: c.amended,
        supersedesId: c.supersedesId,
        amendmentReason: c.amendmentReason,
      },
    );
    events.push(event);
    recorded.set(event, c.recordedAt.toISOString());
  }
}
