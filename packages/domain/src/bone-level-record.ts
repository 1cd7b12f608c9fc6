/**
 * Measured bone levels (radiograph measurements, mesial and distal, mm along the implant axis from the
 * platform) turned into what the clinical record uses: the exam's bone level, the Albrektsson view of the
 * series and the ICOI grade of the latest value. Supporting information, never a diagnosis.
 *
 * Decisions where the sources are silent (also in docs/clinical-rules.md §3a):
 * - One value per radiograph: the worse (larger, more apical) of mesial and distal, as the 2017 case
 *   definitions take the worse side [common practice].
 * - The exam's bone level is that value rounded to 0.1 mm (the exam stores tenths); bone coronal of the
 *   platform (a negative value) is entered as 0 mm, because the exam's bone level cannot be negative.
 * - ICOI (Misch 2008) wants bone loss "from the level at surgery": the platform stands for the crest at
 *   surgery (an implant placed at crest level), so the loss is the latest worse value itself; a sub-crestal
 *   placement therefore reads as a gain. Clinical findings come from the latest recall exam: mobility, the
 *   deepest probing depth, suppuration at that exam = uncontrolled exudate, suppuration only at earlier
 *   exams = exudate history. Pain on function is not recorded and is taken as absent. Each assumption is
 *   returned as a reason.
 * - Albrektsson allowance: drawn from the {@link albrektssonReference} reading at loading as reference level
 *   + {@link albrektssonAllowanceMm}(years since loading), a straight line per segment (constant in year 1).
 */
import {
  albrektssonAllowanceMm,
  albrektssonReference,
  icoiGrade,
  meetsAlbrektsson,
  type AlbrektssonResult,
  type IcoiGrade,
} from './bone-level.js';
import { addCalendarMonths, daysBetween } from './calendar.js';
import { fmt, requireFinite } from './validate.js';

/** One measured bone level (one radiograph, one site). */
export interface MeasuredBoneLevel {
  /** Date the radiograph was taken, YYYY-MM-DD. */
  date: string;
  mesialMm: number;
  distalMm: number;
}

/** The worse side and its value. */
export function worseBoneLevel(m: Pick<MeasuredBoneLevel, 'mesialMm' | 'distalMm'>): {
  mm: number;
  side: 'mesial' | 'distal';
} {
  const mesial = requireFinite(m.mesialMm, 'mesialMm');
  const distal = requireFinite(m.distalMm, 'distalMm');
  return mesial >= distal ? { mm: mesial, side: 'mesial' } : { mm: distal, side: 'distal' };
}

/** The bone level offered to the exam: the worse side, to 0.1 mm, never below 0 (see the module comment). */
export function examBoneLevelMm(m: Pick<MeasuredBoneLevel, 'mesialMm' | 'distalMm'>): number {
  const tenths = Math.round(worseBoneLevel(m).mm * 10) / 10;
  return tenths <= 0 ? 0 : tenths;
}

/** A measurement as the recall exam is offered it. */
export interface OfferableBoneLevel {
  /** Date the radiograph was taken, YYYY-MM-DD; null when not known. */
  takenOn: string | null;
  /** When it was measured (ISO date-time, UTC). */
  measuredAt: string;
}

/** The day a measurement describes: the radiograph's date, else (undated) the day it was measured. */
function describedOn(m: OfferableBoneLevel): string {
  return m.takenOn ?? m.measuredAt.slice(0, 10);
}

/**
 * The measurement offered to an exam of `examinedOn` (YYYY-MM-DD): the latest whose radiograph was
 * taken on or before that day, so a back-dated exam is offered what was known of the bone then and
 * never a later film. An undated radiograph counts from the day it was measured, the last day it
 * can have been taken by. Of two on one day, the later measured. null when none qualifies.
 */
export function boneLevelOfferFor<T extends OfferableBoneLevel>(levels: readonly T[], examinedOn: string): T | null {
  let best: T | null = null;
  for (const m of levels) {
    const day = describedOn(m);
    if (day > examinedOn) continue;
    const bestDay = best ? describedOn(best) : '';
    if (!best || day > bestDay || (day === bestDay && m.measuredAt > best.measuredAt)) best = m;
  }
  return best;
}

/** What the latest recall exam found, for the ICOI grade. */
export interface ExamFindings {
  mobility: boolean;
  maxProbingDepthMm: number;
  suppurationNow: boolean;
  /** Suppuration at any earlier exam of the site. */
  suppurationBefore: boolean;
}

/** Input of {@link boneLevelSummary}. */
export interface BoneLevelSummaryInput {
  /** Any order. */
  readings: MeasuredBoneLevel[];
  /** When the restoration was delivered (loading), or null. */
  loadedOn: string | null;
  /** The implant's length, mm: from the placement record or the length the latest measurement used. */
  implantLengthMm: number;
  latestExam: ExamFindings | null;
  /** How the reasons write a date for their reader (the practice's order); YYYY-MM-DD when absent. */
  writeDate?: (iso: string) => string;
}

export interface AllowancePoint {
  date: string;
  /** The deepest bone level the Albrektsson allowance permits on that date, mm from the platform. */
  maxBoneLevelMm: number;
}

export interface BoneLevelSummary {
  latest: { date: string; mm: number; side: 'mesial' | 'distal' } | null;
  /** null without a loading date. */
  albrektsson: (AlbrektssonResult & { allowance: AllowancePoint[] }) | null;
  /** null without readings. */
  icoi: { grade: IcoiGrade; boneLossMm: number; reasons: string[] } | null;
}

const round2 = (n: number) => Math.round(n * 100) / 100;

/**
 * The series judged as a whole: the latest worse value, the Albrektsson criteria and allowance line
 * (from the loading date) and the ICOI grade of the latest value with its assumptions.
 * @throws ValidationError for malformed dates or non-finite values
 */
export function boneLevelSummary(input: BoneLevelSummaryInput): BoneLevelSummary {
  const series = input.readings
    .map((r) => ({ date: r.date, boneLevelMm: worseBoneLevel(r).mm, side: worseBoneLevel(r).side }))
    .sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : 0));
  const last = series.at(-1);
  if (!last) return { latest: null, albrektsson: null, icoi: null };

  let albrektsson: BoneLevelSummary['albrektsson'] = null;
  if (input.loadedOn) {
    const result = meetsAlbrektsson(series, input.loadedOn, { writeDate: input.writeDate });
    const ref = albrektssonReference(series, input.loadedOn);
    const allowance: AllowancePoint[] = [];
    if (ref) {
      const at = (date: string) => ({
        date,
        maxBoneLevelMm: round2(
          ref.boneLevelMm + albrektssonAllowanceMm(Math.max(0, daysBetween(input.loadedOn!, date)) / 365.25),
        ),
      });
      const anniversary = addCalendarMonths(input.loadedOn, 12, 'loadedOn');
      allowance.push(at(input.loadedOn), at(anniversary));
      if (last.date > anniversary) allowance.push(at(last.date));
    }
    albrektsson = { ...result, allowance };
  }

  const writeDate = input.writeDate ?? ((iso: string) => iso);
  const findings = input.latestExam;
  const exudate = findings?.suppurationNow ? 'uncontrolled' : findings?.suppurationBefore ? 'history' : 'none';
  const reasons = [
    `bone loss ${fmt(round2(last.boneLevelMm))} mm (${last.side}, ${writeDate(last.date)}), measured from the platform taken as the crest at surgery`,
    'pain on function is not recorded: taken as absent',
    findings
      ? `latest recall exam: mobility ${findings.mobility ? 'yes' : 'no'}, deepest probing depth ${fmt(findings.maxProbingDepthMm)} mm, exudate ${exudate === 'uncontrolled' ? 'now (counted as uncontrolled)' : exudate === 'history' ? 'at an earlier exam (history)' : 'none'}`
      : 'no recall exam yet: mobility, probing depth and exudate are not known and taken as absent',
  ];
  const grade = icoiGrade({
    boneLossMm: last.boneLevelMm,
    implantLengthMm: input.implantLengthMm,
    mobility: findings?.mobility ?? false,
    painOnFunction: false,
    exudate,
    maxProbingDepthMm: findings?.maxProbingDepthMm,
  });
  return {
    latest: { date: last.date, mm: last.boneLevelMm, side: last.side },
    albrektsson,
    icoi: { grade, boneLossMm: last.boneLevelMm, reasons },
  };
}
