// An exam row judged as the recall exam form judges one: its six probes, the baseline it is
// compared with (an earlier exam of the site, from the database or the file) and the domain's verdict.
import type { ImportRow } from '@torquetrail/contracts';
import {
  DEFAULT_BONE_LOSS_MM,
  DEFAULT_PD_INCREASE_MM,
  DomainError,
  PROBING_POSITIONS,
  choosePeriImplantBaseline,
  classifyPeriImplant,
  toPeriImplantBaseline,
  toPeriImplantExam,
  type ProbedSite,
} from '@torquetrail/domain';
import { RowError } from './import-row.js';

/** The thresholds handed to classifyPeriImplant, as the recall exams store them. */
export const RULE_OPTIONS = { pdIncreaseMm: DEFAULT_PD_INCREASE_MM, boneLossMm: DEFAULT_BONE_LOSS_MM };

/** An exam of a site the plan knows: in the database, or on an earlier row of the file. */
export interface ExamState {
  id: string;
  examinedOn: string;
  recordedAt: Date;
  isBaseline: boolean;
  boneLevelMm: number | null;
  sites: ProbedSite[];
}

/** The row's probes and verdict against the site's earlier exams; a rule's refusal fails the row. */
export function judgeExamRow(
  row: Extract<ImportRow, { event: 'exam' }>,
  earlier: ExamState[],
  deliveredOn: string | null,
) {
  const probes: ProbedSite[] = PROBING_POSITIONS.map((position, i) => ({
    position,
    probingDepthMm: row.depths[i],
    bleeding: row.bleeding[i],
    suppuration: row.suppuration[i],
  }));
  const exam = { examinedOn: row.date, isBaseline: false };
  const baseline = choosePeriImplantBaseline(earlier, exam, deliveredOn);
  try {
    const verdict = classifyPeriImplant(
      toPeriImplantExam({ sites: probes, boneLevelMm: row.boneLevelMm }),
      toPeriImplantBaseline(exam, baseline),
      RULE_OPTIONS,
    );
    return { exam, probes, baseline, verdict };
  } catch (e) {
    if (e instanceof DomainError) throw new RowError(null, e.message);
    throw e;
  }
}
