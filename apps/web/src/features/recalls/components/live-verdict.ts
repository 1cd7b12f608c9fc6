// The live status beside the exam form: the same classifyPeriImplant the API runs on save
// (2017 World Workshop case definitions, Berglundh et al. 2018 consensus report), fed the same
// baseline the API would choose (sent by the API in the exam context). The server recomputes it.
import { ProbingDepthMm, PROBING_POSITIONS, type RecallExam } from '@torquetrail/contracts';
import { classifyPeriImplant, PERI_IMPLANT_FLAGS, type PeriImplantResult } from '@torquetrail/domain';

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
  isBaseline: false,
  notes: '',
});

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

export type LiveVerdict = { state: 'incomplete'; message: string } | { state: 'ready'; result: PeriImplantResult; usedBaseline: boolean };

export function liveVerdict(draft: SiteDraft, baseline: RecallExam | null): LiveVerdict {
  const depths = draft.depths.map(parseMm);
  const missing = depths.filter((d) => d === undefined).length;
  if (missing > 0) return { state: 'incomplete', message: missing === 6 ? 'Enter the six probing depths' : `Enter ${missing} more probing ${missing === 1 ? 'depth' : 'depths'}` };
  if (draft.depths.some((d) => depthProblem(d) !== null)) return { state: 'incomplete', message: 'Correct the probing depths' };
  const bone = parseMm(draft.boneLevelMm);
  const useBaseline = !draft.isBaseline && baseline !== null && baseline.boneLevelMm !== null;
  const result = classifyPeriImplant(
    {
      sites: PROBING_POSITIONS.map((_, i) => ({ probingDepthMm: depths[i]!, bleeding: draft.bop[i]!, suppuration: draft.sup[i]! })),
      ...(bone === undefined ? {} : { boneLevelMm: bone }),
    },
    useBaseline ? { sites: baseline.sites.map((s) => ({ probingDepthMm: s.probingDepthMm })), boneLevelMm: baseline.boneLevelMm! } : undefined,
  );
  return { state: 'ready', result, usedBaseline: useBaseline };
}

export const FLAG_TEXT: Record<string, string> = {
  [PERI_IMPLANT_FLAGS.NO_BASELINE]: 'No baseline: the no-baseline definition was used',
  [PERI_IMPLANT_FLAGS.PERI_IMPLANTITIS_NOT_EXCLUDED_WITHOUT_BASELINE]: 'Peri-implantitis not excluded without a baseline',
  [PERI_IMPLANT_FLAGS.BONE_LEVEL_MISSING]: 'No bone level: bone loss cannot be judged',
  [PERI_IMPLANT_FLAGS.BONE_LOSS_WITHOUT_INFLAMMATION]: 'Bone loss without inflammation: review the radiograph',
};

/** A draft filled from a saved exam, for an amendment. */
export function draftFromExam(exam: RecallExam): SiteDraft {
  const byPosition = new Map(exam.sites.map((s) => [s.position, s]));
  const at = (i: number) => byPosition.get(PROBING_POSITIONS[i]!)!;
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
    isBaseline: exam.isBaseline,
    notes: exam.notes ?? '',
  };
}
