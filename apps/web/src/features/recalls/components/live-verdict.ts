// The live status beside the exam form: the same classifyPeriImplant the API runs on save
// (2017 World Workshop case definitions, Berglundh et al. 2018 consensus report), fed the baseline
// the API chose (sent in the exam context) through the same domain hand-over. The server recomputes it.
import { ProbingDepthMm, PROBING_POSITIONS, type RecallExam } from '@torquetrail/contracts';
import {
  classifyPeriImplant,
  type PeriImplantResult,
  toPeriImplantBaseline,
  toPeriImplantExam,
} from '@torquetrail/domain';

export interface SiteDraft {
  include: boolean;
  depths: string[];
  bop: boolean[];
  sup: boolean[];
  mobility: boolean;
  plaqueIndex: string;
  bleedingIndex: string;
  keratinizedMucosaMm: string;
  residualCement: boolean;
  boneLevelMm: string;
  /** The measurement the bone level was accepted from, while the typed value is still its value. */
  boneLevelSource: { measurementId: string; boneLevelMm: number } | null;
  isBaseline: boolean;
  notes: string;
}

export const emptyDraft = (): SiteDraft => ({
  include: true,
  depths: PROBING_POSITIONS.map(() => ''),
  bop: PROBING_POSITIONS.map(() => false),
  sup: PROBING_POSITIONS.map(() => false),
  mobility: false,
  plaqueIndex: '',
  bleedingIndex: '',
  keratinizedMucosaMm: '',
  residualCement: false,
  boneLevelMm: '',
  boneLevelSource: null,
  isBaseline: false,
  notes: '',
});

/**
 * The measurement a bone level came from: only while the field still holds the accepted value (a
 * value typed over is the hygienist's own, sent without a source).
 */
export function boneLevelSourceId(draft: Pick<SiteDraft, 'boneLevelMm' | 'boneLevelSource'>): string | null {
  const source = draft.boneLevelSource;
  return source && parseMm(draft.boneLevelMm) === source.boneLevelMm ? source.measurementId : null;
}

/** A typed number ("3", "3.5", "3,5"), or undefined when empty or not a number. */
export function parseMm(text: string): number | undefined {
  const t = text.trim().replace(',', '.');
  if (t === '' || !/^\d+(\.\d+)?$/.test(t)) return undefined;
  return Number(t);
}

/** Message for a depth as typed, or null when it is a valid 0–15 mm depth in 0.5 mm steps. */
export function depthProblem(text: string): string | null {
  if (text.trim() === '') return null;
  const mm = parseMm(text);
  if (mm === undefined) return 'a number of mm';
  const parsed = ProbingDepthMm.safeParse(mm);
  return parsed.success ? null : (parsed.error.issues[0]?.message ?? 'not valid');
}

export type LiveVerdict =
  | { state: 'incomplete'; message: string }
  | { state: 'ready'; result: PeriImplantResult; usedBaseline: boolean };

export function liveVerdict(draft: SiteDraft, baseline: RecallExam | null): LiveVerdict {
  const depths = draft.depths.map(parseMm);
  const missing = depths.filter((d) => d === undefined).length;
  if (missing > 0)
    return {
      state: 'incomplete',
      message:
        missing === 6
          ? 'Enter the six probing depths'
          : `Enter ${missing} more probing ${missing === 1 ? 'depth' : 'depths'}`,
    };
  if (draft.depths.some((d) => depthProblem(d) !== null))
    return { state: 'incomplete', message: 'Correct the probing depths' };
  const bone = parseMm(draft.boneLevelMm);
  const periImplantBaseline = toPeriImplantBaseline(draft, baseline);
  const result = classifyPeriImplant(
    toPeriImplantExam({
      sites: PROBING_POSITIONS.map((position, i) => ({
        position,
        probingDepthMm: depths[i]!,
        bleeding: draft.bop[i],
        suppuration: draft.sup[i],
      })),
      boneLevelMm: bone ?? null,
    }),
    periImplantBaseline,
  );
  return { state: 'ready', result, usedBaseline: periImplantBaseline !== undefined };
}

/** A draft filled from a saved exam, for an amendment. */
export function draftFromExam(exam: RecallExam): SiteDraft {
  const byPosition = new Map(exam.sites.map((s) => [s.position, s]));
  const at = (i: number) => byPosition.get(PROBING_POSITIONS[i])!;
  const text = (n: number | null) => (n === null ? '' : String(n));
  return {
    include: true,
    depths: PROBING_POSITIONS.map((_, i) => String(at(i).probingDepthMm)),
    bop: PROBING_POSITIONS.map((_, i) => at(i).bleeding),
    sup: PROBING_POSITIONS.map((_, i) => at(i).suppuration),
    mobility: exam.mobility,
    plaqueIndex: text(exam.plaqueIndex),
    bleedingIndex: text(exam.bleedingIndex),
    keratinizedMucosaMm: text(exam.keratinizedMucosaMm),
    residualCement: exam.residualCement,
    boneLevelMm: text(exam.boneLevelMm),
    boneLevelSource:
      exam.boneLevelMeasurementId !== null && exam.boneLevelMm !== null
        ? { measurementId: exam.boneLevelMeasurementId, boneLevelMm: exam.boneLevelMm }
        : null,
    isBaseline: exam.isBaseline,
    notes: exam.notes ?? '',
  };
}
