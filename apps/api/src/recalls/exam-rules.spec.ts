// Pure helpers of the recall module. The clinical classification itself is tested in
// packages/domain (Berglundh et al. 2018 consensus report); here: which exam is the baseline,
// in which order sites reach classifyPeriImplant, CSV quoting and reminder windows.
import { classifyPeriImplant } from '@torquetrail/domain';
import { describe, expect, it } from 'vitest';
import { chooseBaseline, csvField, csvLine, inChartOrder, remindersDue, toDomainBaseline, toDomainExam, type ExamLike } from './exam-rules.js';

const site = (position: ExamLike['sites'][number]['position'], pd: number, bleeding = false) => ({ position, probingDepthMm: pd, bleeding, suppuration: false });
const six = (pd: number) => (['mesiobuccal', 'buccal', 'distobuccal', 'mesiolingual', 'lingual', 'distolingual'] as const).map((p) => site(p, pd));
const exam = (id: string, examinedOn: string, extra: Partial<ExamLike> = {}): ExamLike & { id: string } => ({ id, examinedOn, recordedAt: new Date(`${examinedOn}T10:00:00Z`), isBaseline: false, boneLevelMm: 1, sites: six(3), ...extra });

describe('chooseBaseline (2017 World Workshop: baseline after the prosthesis is completed, Berglundh et al. 2018)', () => {
  it('takes the first exam on or after delivery', () => {
    const earlier = [exam('a', '2012-05-01'), exam('b', '2012-10-01'), exam('c', '2013-04-01')];
    expect(chooseBaseline(earlier, '2020-01-01', '2012-09-20')?.id).toBe('b');
  });
  it('prefers the latest exam marked as baseline', () => {
    const earlier = [exam('b', '2012-10-01'), exam('m1', '2015-01-01', { isBaseline: true }), exam('m2', '2018-01-01', { isBaseline: true })];
    expect(chooseBaseline(earlier, '2020-01-01', '2012-09-20')?.id).toBe('m2');
  });
  it('ignores exams after the exam being classified', () => {
    expect(chooseBaseline([exam('late', '2021-01-01', { isBaseline: true })], '2020-01-01', null)).toBeNull();
  });
  it('has no baseline without a delivery date or a marked exam', () => {
    expect(chooseBaseline([exam('a', '2019-01-01')], '2020-01-01', null)).toBeNull();
  });
  it('does not use a baseline without a radiographic bone level [decision]', () => {
    expect(chooseBaseline([exam('a', '2019-01-01', { isBaseline: true, boneLevelMm: null })], '2020-01-01', null)).toBeNull();
  });
});

describe('handing an exam to classifyPeriImplant', () => {
  it('puts the six sites in chart order whatever order they came in', () => {
    const shuffled = [site('lingual', 5), site('mesiobuccal', 1), site('distolingual', 6), site('buccal', 2), site('mesiolingual', 4), site('distobuccal', 3)];
    expect(inChartOrder(shuffled).map((s) => s.probingDepthMm)).toEqual([1, 2, 3, 4, 5, 6]);
    expect(toDomainExam({ sites: shuffled, boneLevelMm: null })).toEqual({ sites: [1, 2, 3, 4, 5, 6].map((pd) => ({ probingDepthMm: pd, bleeding: false, suppuration: false })) });
  });
  it('no baseline, BOP and PD 6 mm without a bone level: mucositis, peri-implantitis not excluded (Berglundh et al. 2018 no-baseline definition)', () => {
    const sites = six(3);
    sites[1] = site('buccal', 6, true);
    const result = classifyPeriImplant(toDomainExam({ sites, boneLevelMm: null }), toDomainBaseline(null));
    expect(result.status).toBe('mucositis');
    expect(result.flags).toEqual(expect.arrayContaining(['no-baseline', 'bone-level-missing', 'peri-implantitis-not-excluded-without-baseline']));
  });
  it('with a baseline: BOP, PD +2 mm and 1 mm bone loss is peri-implantitis (Berglundh et al. 2018)', () => {
    const sites = six(3);
    sites[0] = site('mesiobuccal', 5, true);
    const result = classifyPeriImplant(toDomainExam({ sites, boneLevelMm: 2 }), toDomainBaseline({ sites: six(3), boneLevelMm: 1 }));
    expect(result.status).toBe('peri-implantitis');
  });
});

describe('CSV (RFC 4180)', () => {
  it('quotes commas, quotes and line breaks, and defuses formulas', () => {
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField('=HYPERLINK("x")')).toBe(`"'=HYPERLINK(""x"")"`);
    expect(csvField(-3)).toBe('-3');
    expect(csvField(null)).toBe('');
    expect(csvLine(['x', 1, null])).toBe('x,1,\r\n');
  });
});

describe('reminder windows (practice policy)', () => {
  const policy = { reminderDaysBefore: 14, overdueReminderDaysAfter: 7 };
  it('sends the upcoming reminder from 14 days before until the day itself', () => {
    expect(remindersDue('2026-06-15', '2026-05-31', policy)).toEqual([]);
    expect(remindersDue('2026-06-15', '2026-06-01', policy)).toEqual(['upcoming']);
    expect(remindersDue('2026-06-15', '2026-06-15', policy)).toEqual(['upcoming']);
  });
  it('sends the overdue reminder from 7 days after', () => {
    expect(remindersDue('2026-06-15', '2026-06-21', policy)).toEqual([]);
    expect(remindersDue('2026-06-15', '2026-06-22', policy)).toEqual(['overdue']);
    expect(remindersDue('2026-06-15', '2027-01-01', policy)).toEqual(['overdue']);
  });
});
