/**
 * Which earlier exam is the baseline of a peri-implant exam, and how both reach {@link classifyPeriImplant}.
 *
 * The 2017 World Workshop compares probing depth and bone level with a baseline taken "after the
 * prosthesis is completed" (Berglundh T et al. 2018, consensus report of workgroup 4,
 * J Clin Periodontol 45(S20):S286–S291) [pub]. The API chooses the baseline when it saves an exam;
 * the exam form shows the same status live from the baseline the API sent: both call these functions.
 *
 * Decisions where the source is silent (also in docs/clinical-rules.md):
 * - The latest earlier exam marked as baseline wins; otherwise the first exam on or after the
 *   restoration's delivery. Only exams dated on or before the exam being classified count.
 * - A baseline needs a radiographic bone level (bone loss is compared); a chosen exam without one is
 *   not used, and the no-baseline definition applies (flagged by classifyPeriImplant).
 * - An exam that is itself marked as baseline is classified without a baseline.
 * - Probing sites are compared one to one in chart order ({@link PROBING_POSITIONS}).
 */
import { PROBING_POSITIONS, type ProbingPosition } from './choices.js';
import type { PeriImplantBaseline, PeriImplantExam } from './peri-implant-status.js';

/** One probed site of a recorded exam. */
export interface ProbedSite {
  position: ProbingPosition;
  probingDepthMm: number;
  bleeding: boolean;
  suppuration: boolean;
}

/** A recorded exam, as far as the baseline choice needs it. */
export interface RecordedExam {
  /** YYYY-MM-DD. */
  examinedOn: string;
  /** When it was saved: orders exams of one day. */
  recordedAt: Date | string;
  isBaseline: boolean;
  boneLevelMm: number | null;
  sites: readonly ProbedSite[];
}

/** Sites in chart order (mesiobuccal … distolingual), so baseline and exam compare one to one. */
export function inChartOrder<T extends { position: ProbingPosition }>(sites: readonly T[]): T[] {
  return [...sites].sort((a, b) => PROBING_POSITIONS.indexOf(a.position) - PROBING_POSITIONS.indexOf(b.position));
}

const byTime = (a: RecordedExam, b: RecordedExam) =>
  a.examinedOn.localeCompare(b.examinedOn) || new Date(a.recordedAt).getTime() - new Date(b.recordedAt).getTime();

/**
 * The baseline exam of an exam dated `exam.examinedOn`, among the site's earlier current exams:
 * none when the exam is itself marked as baseline; otherwise the latest earlier exam marked as
 * baseline, else the first exam on or after `deliveredOn`; and only when it has a bone level.
 */
export function choosePeriImplantBaseline<E extends RecordedExam>(
  earlier: readonly E[],
  exam: { examinedOn: string; isBaseline: boolean },
  deliveredOn: string | null,
): E | null {
  if (exam.isBaseline) return null;
  const candidates = earlier.filter((e) => e.examinedOn <= exam.examinedOn).sort(byTime);
  const marked = candidates.filter((e) => e.isBaseline);
  const pick =
    marked.length > 0
      ? marked[marked.length - 1]
      : deliveredOn
        ? (candidates.find((e) => e.examinedOn >= deliveredOn) ?? null)
        : null;
  return pick && pick.boneLevelMm !== null ? pick : null;
}

/** The latest of the exams (the "previous exam" shown beside the form), or null. */
export function latestExam<E extends RecordedExam>(exams: readonly E[]): E | null {
  const sorted = [...exams].sort(byTime);
  return sorted[sorted.length - 1] ?? null;
}

/** A recorded (or typed) exam as {@link classifyPeriImplant} takes it: sites in chart order. */
export function toPeriImplantExam(exam: { sites: readonly ProbedSite[]; boneLevelMm: number | null }): PeriImplantExam {
  return {
    sites: inChartOrder(exam.sites).map((s) => ({
      probingDepthMm: s.probingDepthMm,
      bleeding: s.bleeding,
      suppuration: s.suppuration,
    })),
    ...(exam.boneLevelMm === null ? {} : { boneLevelMm: exam.boneLevelMm }),
  };
}

/**
 * The baseline {@link classifyPeriImplant} compares `exam` with: undefined (the no-baseline
 * definition) when the exam is itself marked as baseline, when there is no baseline exam, or when
 * the baseline exam has no bone level.
 */
export function toPeriImplantBaseline(
  exam: { isBaseline: boolean },
  baseline: { sites: readonly Pick<ProbedSite, 'position' | 'probingDepthMm'>[]; boneLevelMm: number | null } | null,
): PeriImplantBaseline | undefined {
  if (exam.isBaseline || !baseline || baseline.boneLevelMm === null) return undefined;
  return {
    sites: inChartOrder(baseline.sites).map((s) => ({ probingDepthMm: s.probingDepthMm })),
    boneLevelMm: baseline.boneLevelMm,
  };
}
