// Baseline choice and hand-over to classifyPeriImplant. Source: Berglundh T et al. 2018, consensus
// report of workgroup 4 (2017 World Workshop), J Clin Periodontol 45(S20):S286–S291 [pub] — the
// baseline is taken after the prosthesis is completed; the rest is [decision] (docs/clinical-rules.md §2a).
// Moved from the API's recall tests with the rule.
import { describe, expect, it } from 'vitest';
import {
  choosePeriImplantBaseline,
  inChartOrder,
  latestExam,
  type ProbedSite,
  type RecordedExam,
  toPeriImplantBaseline,
  toPeriImplantExam,
} from './peri-implant-baseline.js';
import { classifyPeriImplant } from './peri-implant-status.js';

const site = (position: ProbedSite['position'], pd: number, bleeding = false): ProbedSite => ({
  position,
  probingDepthMm: pd,
  bleeding,
  suppuration: false,
});
const six = (pd: number) =>
  (['mesiobuccal', 'buccal', 'distobuccal', 'mesiolingual', 'lingual', 'distolingual'] as const).map((p) =>
    site(p, pd),
  );
const exam = (id: string, examinedOn: string, extra: Partial<RecordedExam> = {}): RecordedExam & { id: string } => ({
  id,
  examinedOn,
  recordedAt: new Date(`${examinedOn}T10:00:00Z`),
  isBaseline: false,
  boneLevelMm: 1,
  sites: six(3),
  ...extra,
});
const on = (examinedOn: string) => ({ examinedOn, isBaseline: false });

describe('choosePeriImplantBaseline (2017 World Workshop: baseline after the prosthesis is completed, Berglundh et al. 2018)', () => {
  it('takes the first exam on or after delivery', () => {
    const earlier = [exam('a', '2012-05-01'), exam('b', '2012-10-01'), exam('c', '2013-04-01')];
    expect(choosePeriImplantBaseline(earlier, on('2020-01-01'), '2012-09-20')?.id).toBe('b');
  });
  it('prefers the latest exam marked as baseline', () => {
    const earlier = [
      exam('b', '2012-10-01'),
      exam('m1', '2015-01-01', { isBaseline: true }),
      exam('m2', '2018-01-01', { isBaseline: true }),
    ];
    expect(choosePeriImplantBaseline(earlier, on('2020-01-01'), '2012-09-20')?.id).toBe('m2');
  });
  it('ignores exams after the exam being classified', () => {
    expect(
      choosePeriImplantBaseline([exam('late', '2021-01-01', { isBaseline: true })], on('2020-01-01'), null),
    ).toBeNull();
  });
  it('has no baseline without a delivery date or a marked exam', () => {
    expect(choosePeriImplantBaseline([exam('a', '2019-01-01')], on('2020-01-01'), null)).toBeNull();
  });
  it('does not use a baseline without a radiographic bone level [decision]', () => {
    expect(
      choosePeriImplantBaseline(
        [exam('a', '2019-01-01', { isBaseline: true, boneLevelMm: null })],
        on('2020-01-01'),
        null,
      ),
    ).toBeNull();
  });
  it('gives an exam that is itself marked as baseline no baseline [decision]', () => {
    expect(
      choosePeriImplantBaseline(
        [exam('a', '2019-01-01', { isBaseline: true })],
        { examinedOn: '2020-01-01', isBaseline: true },
        null,
      ),
    ).toBeNull();
  });
  it('orders exams of one day by when they were recorded', () => {
    const first = exam('first', '2019-01-01', { isBaseline: true, recordedAt: '2019-01-01T09:00:00Z' });
    const second = exam('second', '2019-01-01', { isBaseline: true, recordedAt: '2019-01-01T11:00:00Z' });
    expect(choosePeriImplantBaseline([second, first], on('2020-01-01'), null)?.id).toBe('second');
    expect(latestExam([second, first])?.id).toBe('second');
    expect(latestExam([])).toBeNull();
  });
});

describe('handing an exam to classifyPeriImplant', () => {
  it('puts the six sites in chart order whatever order they came in', () => {
    const shuffled = [
      site('lingual', 5),
      site('mesiobuccal', 1),
      site('distolingual', 6),
      site('buccal', 2),
      site('mesiolingual', 4),
      site('distobuccal', 3),
    ];
    expect(inChartOrder(shuffled).map((s) => s.probingDepthMm)).toEqual([1, 2, 3, 4, 5, 6]);
    expect(toPeriImplantExam({ sites: shuffled, boneLevelMm: null })).toEqual({
      sites: [1, 2, 3, 4, 5, 6].map((pd) => ({ probingDepthMm: pd, bleeding: false, suppuration: false })),
    });
    expect(toPeriImplantBaseline(on('2020-01-01'), { sites: shuffled, boneLevelMm: 1 })).toEqual({
      sites: [1, 2, 3, 4, 5, 6].map((pd) => ({ probingDepthMm: pd })),
      boneLevelMm: 1,
    });
  });
  it('no baseline, BOP and PD 6 mm without a bone level: mucositis, peri-implantitis not excluded (Berglundh et al. 2018 no-baseline definition)', () => {
    const sites = six(3);
    sites[1] = site('buccal', 6, true);
    const result = classifyPeriImplant(
      toPeriImplantExam({ sites, boneLevelMm: null }),
      toPeriImplantBaseline(on('2020-01-01'), null),
    );
    expect(result.status).toBe('mucositis');
    expect(result.flags).toEqual(
      expect.arrayContaining(['no-baseline', 'bone-level-missing', 'peri-implantitis-not-excluded-without-baseline']),
    );
  });
  it('with a baseline: BOP, PD +2 mm and 1 mm bone loss is peri-implantitis (Berglundh et al. 2018)', () => {
    const sites = six(3);
    sites[0] = site('mesiobuccal', 5, true);
    const result = classifyPeriImplant(
      toPeriImplantExam({ sites, boneLevelMm: 2 }),
      toPeriImplantBaseline(on('2020-01-01'), { sites: six(3), boneLevelMm: 1 }),
    );
    expect(result.status).toBe('peri-implantitis');
  });
  it('no baseline for an exam marked as baseline, nor from a baseline without a bone level [decision]', () => {
    expect(toPeriImplantBaseline({ isBaseline: true }, { sites: six(3), boneLevelMm: 1 })).toBeUndefined();
    expect(toPeriImplantBaseline({ isBaseline: false }, { sites: six(3), boneLevelMm: null })).toBeUndefined();
  });
});
