// Pure helpers around the domain's clinical functions: which earlier exam is the baseline, how an
// exam is handed to classifyPeriImplant, and CSV quoting. No clinical thresholds live here — the
// classification itself is `classifyPeriImplant` (Berglundh et al. 2018 consensus report, via
// packages/domain) and the interval is `nextRecallDate` (Herrera et al. 2023 EFP S3 guideline).
import { PROBING_POSITIONS, type ProbingPosition } from '@torquetrail/contracts';
import type { PeriImplantBaseline, PeriImplantExam } from '@torquetrail/domain';

export interface ProbedSite {
  position: ProbingPosition;
  probingDepthMm: number;
  bleeding: boolean;
  suppuration: boolean;
}

export interface ExamLike {
  id: string;
  examinedOn: string;
  recordedAt: Date | string;
  isBaseline: boolean;
  boneLevelMm: number | null;
  sites: ProbedSite[];
}

/** Sites in chart order (mesiobuccal … distolingual), so baseline and exam compare one to one. */
export function inChartOrder<T extends { position: ProbingPosition }>(sites: readonly T[]): T[] {
  return [...sites].sort((a, b) => PROBING_POSITIONS.indexOf(a.position) - PROBING_POSITIONS.indexOf(b.position));
}

const byTime = (a: ExamLike, b: ExamLike) => a.examinedOn.localeCompare(b.examinedOn) || new Date(a.recordedAt).getTime() - new Date(b.recordedAt).getTime();

/**
 * The baseline of a new exam among the site's earlier (current, not superseded) exams:
 * the latest one marked as baseline; otherwise the first exam on or after the restoration's
 * delivery (the baseline the 2017 World Workshop asks for, "after the prosthesis is completed",
 * Berglundh et al. 2018). Only exams dated on or before `examinedOn` count.
 * Decision: a baseline needs a radiographic bone level (classifyPeriImplant compares bone loss);
 * a candidate without one is not used, and the no-baseline definition applies (flagged).
 */
export function chooseBaseline<E extends ExamLike>(earlier: readonly E[], examinedOn: string, deliveredOn: string | null): E | null {
  const candidates = earlier.filter((e) => e.examinedOn <= examinedOn).sort(byTime);
  const marked = candidates.filter((e) => e.isBaseline);
  const pick = marked.length > 0 ? marked[marked.length - 1]! : deliveredOn ? candidates.find((e) => e.examinedOn >= deliveredOn) ?? null : null;
  return pick && pick.boneLevelMm !== null ? pick : null;
}

/** The latest earlier exam (for "previous" beside the form). */
export function latestOf<E extends ExamLike>(exams: readonly E[]): E | null {
  const sorted = [...exams].sort(byTime);
  return sorted[sorted.length - 1] ?? null;
}

export function toDomainExam(exam: { sites: readonly ProbedSite[]; boneLevelMm: number | null }): PeriImplantExam {
  return {
    sites: inChartOrder(exam.sites).map((s) => ({ probingDepthMm: s.probingDepthMm, bleeding: s.bleeding, suppuration: s.suppuration })),
    ...(exam.boneLevelMm === null ? {} : { boneLevelMm: exam.boneLevelMm }),
  };
}

export function toDomainBaseline(baseline: { sites: readonly ProbedSite[]; boneLevelMm: number | null } | null): PeriImplantBaseline | undefined {
  if (!baseline || baseline.boneLevelMm === null) return undefined;
  return { sites: inChartOrder(baseline.sites).map((s) => ({ probingDepthMm: s.probingDepthMm })), boneLevelMm: baseline.boneLevelMm };
}

/** Whole days from `from` to `to` (both YYYY-MM-DD, UTC calendar). */
export function daysFrom(from: string, to: string): number {
  return Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / 86_400_000);
}

export function addDaysIso(iso: string, days: number): string {
  const d = new Date(`${iso}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

/** RFC 4180 field quoting; a leading = + - @ is prefixed with ' so spreadsheets do not run it as a formula. */
export function csvField(value: string | number | null | undefined): string {
  if (value === null || value === undefined) return '';
  let text = String(value);
  if (/^[=+\-@\t\r]/.test(text) && typeof value === 'string') text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function csvLine(fields: (string | number | null | undefined)[]): string {
  return `${fields.map(csvField).join(',')}\r\n`;
}

/** Reminder kinds due on `today` for a recall due on `dueOn`, under the practice policy. */
export function remindersDue(dueOn: string, today: string, policy: { reminderDaysBefore: number; overdueReminderDaysAfter: number }): ('upcoming' | 'overdue')[] {
  const until = daysFrom(today, dueOn);
  const kinds: ('upcoming' | 'overdue')[] = [];
  if (until >= 0 && until <= policy.reminderDaysBefore) kinds.push('upcoming');
  if (-until >= policy.overdueReminderDaysAfter && until < 0) kinds.push('overdue');
  return kinds;
}

export const reminderKey = (patientId: string, dueOn: string, kind: 'upcoming' | 'overdue') => `recall-reminder:${patientId}:${dueOn}:${kind}`;
