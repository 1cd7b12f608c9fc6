/**
 * Retentive-insert changes of an overdenture (issue 16 item 2): the interval since the last change,
 * the count per year, and when the practice's insert review falls due.
 *
 * Replacing a worn retentive insert is the most frequent prosthetic maintenance of an implant
 * overdenture; systematic reviews report such maintenance as events per patient-year (Cehreli MC,
 * Karasoy D, Kokat AM, Akca K, Eckert S 2010, "Systematic review of prosthetic maintenance
 * requirements for implant-supported overdentures", Int J Oral Maxillofac Implants 25(1):163–180
 * [memory: citation recalled, not in /work/shared/reference]). No source fixes a review interval:
 * the default of 12 months is [common practice], and each practice sets its own.
 *
 * Decisions where the sources are silent (also in docs/clinical-rules.md):
 * - The review is due the interval (calendar months) after the last change, or after the delivery
 *   when no change is recorded; it is overdue from the day after that date (the due day is on time).
 * - "The last 12 months" are the days after the same calendar day twelve months earlier, up to today.
 * - A change dated after today is refused (ValidationError, 400 beside the field).
 */
import { addCalendarMonths, isValidIsoDate, daysBetween } from './calendar.js';
import { ValidationError } from './errors.js';

/** The insert review interval a practice starts with, months [common practice]. */
export const DEFAULT_INSERT_REVIEW_MONTHS = 12;
/** The interval a practice may set, whole months. */
export const INSERT_REVIEW_MONTHS_RANGE = { min: 1, max: 60 } as const;

/** What the Site file shows of a site's insert changes. */
export interface InsertChangeSummary {
  /** Date of the latest change, or null when none is recorded. */
  lastChangeOn: string | null;
  /** Whole days from the latest change to today, or null. */
  daysSinceLast: number | null;
  /** Whole calendar months from the latest change to today, or null. */
  monthsSinceLast: number | null;
  /** Changes in the last 12 months (the days after the same day a year ago, up to today). */
  last12Months: number;
  /** Changes per calendar year, oldest year first; years without a change are left out. */
  perYear: { year: number; count: number }[];
}

function checkDate(value: string, field: string): void {
  if (!isValidIsoDate(value)) throw new ValidationError('bad-date', 'Enter a real date', field);
}

/** Whole calendar months from `from` to `to` (`to` not before `from`): the largest m with from + m months ≤ to. */
export function wholeMonthsBetween(from: string, to: string): number {
  checkDate(from, 'from');
  checkDate(to, 'to');
  if (to < from) throw new ValidationError('out-of-range', 'The end is before the start', 'to');
  const [fy, fm] = from.split('-').map(Number);
  const [ty, tm] = to.split('-').map(Number);
  let months = (ty - fy) * 12 + (tm - fm);
  while (months > 0 && addCalendarMonths(from, months) > to) months -= 1;
  return months;
}

/** The interval since the last change and the counts, from the dates of a site's current changes. */
export function insertChangeSummary(changedOn: readonly string[], today: string): InsertChangeSummary {
  checkDate(today, 'today');
  for (const d of changedOn) {
    checkDate(d, 'changedOn');
    if (d > today) throw new ValidationError('out-of-range', 'Cannot be in the future', 'changedOn');
  }
  const sorted = [...changedOn].sort();
  const last = sorted.at(-1) ?? null;
  const yearAgo = addCalendarMonths(today, -12);
  const perYear = new Map<number, number>();
  for (const d of sorted) {
    const year = Number(d.slice(0, 4));
    perYear.set(year, (perYear.get(year) ?? 0) + 1);
  }
  return {
    lastChangeOn: last,
    daysSinceLast: last === null ? null : daysBetween(last, today),
    monthsSinceLast: last === null ? null : wholeMonthsBetween(last, today),
    last12Months: sorted.filter((d) => d > yearAgo).length,
    perYear: [...perYear].map(([year, count]) => ({ year, count })),
  };
}

/** The day the insert review falls due: `months` after the last change (or the delivery when none). */
export function insertReviewDueOn(lastChangeOrDeliveryOn: string, months: number): string {
  checkDate(lastChangeOrDeliveryOn, 'lastChangeOn');
  if (!Number.isInteger(months) || months < INSERT_REVIEW_MONTHS_RANGE.min || months > INSERT_REVIEW_MONTHS_RANGE.max)
    throw new ValidationError(
      'out-of-range',
      `Enter whole months from ${INSERT_REVIEW_MONTHS_RANGE.min} to ${INSERT_REVIEW_MONTHS_RANGE.max}`,
      'insertReviewIntervalMonths',
    );
  return addCalendarMonths(lastChangeOrDeliveryOn, months);
}

/** True when the insert review is overdue on `today`: from the day after the due day. */
export function insertReviewOverdue(lastChangeOrDeliveryOn: string, months: number, today: string): boolean {
  checkDate(today, 'today');
  return insertReviewDueOn(lastChangeOrDeliveryOn, months) < today;
}

/** One calendar year of the Timeline's insert-change chart: the changes by reason, and their total. */
export interface InsertChangeYear<R extends string> {
  year: number;
  total: number;
  byReason: Record<R, number>;
}

/**
 * The insert changes of a site per calendar year, for the Timeline's chart: every year from the
 * first change to today's year (years without a change are zeros, so a quiet year shows as one),
 * each split by reason in the order of `reasons`. Empty when no change is recorded. Amended
 * versions are the caller's to leave out, as for `insertChangeSummary`; a change after today or
 * with a reason outside `reasons` is refused.
 */
export function insertChangeHistory<R extends string>(
  changes: readonly { changedOn: string; reason: R }[],
  today: string,
  reasons: readonly R[],
): InsertChangeYear<R>[] {
  checkDate(today, 'today');
  for (const c of changes) {
    checkDate(c.changedOn, 'changedOn');
    if (c.changedOn > today) throw new ValidationError('out-of-range', 'Cannot be in the future', 'changedOn');
    if (!reasons.includes(c.reason)) throw new ValidationError('out-of-range', 'Not a reason of the list', 'reason');
  }
  if (changes.length === 0) return [];
  const first = Math.min(...changes.map((c) => Number(c.changedOn.slice(0, 4))));
  const last = Number(today.slice(0, 4));
  const zeros = () => Object.fromEntries(reasons.map((r) => [r, 0])) as Record<R, number>;
  const years = Array.from({ length: last - first + 1 }, (_, i) => ({ year: first + i, total: 0, byReason: zeros() }));
  for (const c of changes) {
    const y = years[Number(c.changedOn.slice(0, 4)) - first];
    y.total += 1;
    y.byReason[c.reason] += 1;
  }
  return years;
}
