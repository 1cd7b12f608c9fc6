import { describe, expect, it } from 'vitest';
import {
  boneLevelOfferFor,
  boneLevelSummary,
  examBoneLevelMm,
  worseBoneLevel,
  type ExamFindings,
} from './bone-level-record.js';
import { ValidationError } from './errors.js';

// Worse of mesial/distal as in the 2017 case definitions (Berglundh et al. 2018) [common practice];
// Albrektsson T et al. 1986, Int J Oral Maxillofac Implants 1:11–25 [pub] (1.5 mm in year 1 [memory]);
// ICOI Pisa scale, Misch CE et al. 2008, Implant Dent 17(1):5–15 [pub]. Tenths and the platform as the
// crest at surgery are decisions (docs/clinical-rules.md §3a).

describe('worseBoneLevel and examBoneLevelMm — the worse side [common practice]', () => {
  it('takes the larger (more apical) side, mesial on a tie', () => {
    expect(worseBoneLevel({ mesialMm: 1.2, distalMm: 2.26 })).toEqual({ mm: 2.26, side: 'distal' });
    expect(worseBoneLevel({ mesialMm: 1.5, distalMm: 1.5 })).toEqual({ mm: 1.5, side: 'mesial' });
    expect(worseBoneLevel({ mesialMm: -0.4, distalMm: -0.9 })).toEqual({ mm: -0.4, side: 'mesial' });
  });
  it.each([
    [1.2, 2.26, 2.3],
    [1.25, 0, 1.3],
    [3.04, 0.2, 3],
    [0.04, 0.02, 0],
    [-0.3, -0.1, 0],
  ])('mesial %s, distal %s → exam value %s mm [decision: tenths, never below 0]', (m, d, expected) =>
    expect(examBoneLevelMm({ mesialMm: m, distalMm: d })).toBe(expected),
  );
  it('swapping mesial and distal leaves the exam value unchanged', () => {
    expect(examBoneLevelMm({ mesialMm: 0.7, distalMm: 2.44 })).toBe(examBoneLevelMm({ mesialMm: 2.44, distalMm: 0.7 }));
  });
  it('refuses non-finite values', () => {
    expect(() => worseBoneLevel({ mesialMm: Number.NaN, distalMm: 1 })).toThrow(ValidationError);
  });
});

const steady = [
  { date: '2023-03-01', mesialMm: 1.3, distalMm: 1.2 },
  { date: '2020-03-01', mesialMm: 0.2, distalMm: 0.4 },
  { date: '2021-03-01', mesialMm: 1.0, distalMm: 0.9 },
];
const quiet: ExamFindings = { mobility: false, maxProbingDepthMm: 4, suppurationNow: false, suppurationBefore: false };

describe('boneLevelSummary — the series judged as a whole', () => {
  it('hand-worked: loaded 2020-03-01, worse sides 0.4 → 1.0 → 1.3 mm', () => {
    const s = boneLevelSummary({ readings: steady, loadedOn: '2020-03-01', implantLengthMm: 10, latestExam: quiet });
    expect(s.latest).toEqual({ date: '2023-03-01', mm: 1.3, side: 'mesial' });
    // first year 1.0 − 0.4 = 0.6 mm (< 1.5); after year 1: 0.3 mm over 730 days = 0.150 mm/year (< 0.2)
    expect(s.albrektsson?.meets).toBe(true);
    expect(s.albrektsson?.firstYearLossMm).toBeCloseTo(0.6, 4);
    expect(s.albrektsson?.annualLossAfterFirstYearMm).toBeCloseTo(0.3 / (730 / 365.25), 4);
    // reference 0.4 + 1.5 through year 1; then 0.4 + 1.5 + 0.2 × (1095/365.25 − 1) = 2.2996 → 2.30
    expect(s.albrektsson?.allowance).toEqual([
      { date: '2020-03-01', maxBoneLevelMm: 1.9 },
      { date: '2021-03-01', maxBoneLevelMm: 1.9 },
      { date: '2023-03-01', maxBoneLevelMm: 2.3 },
    ]);
    // 1.3 mm from the platform, < 2 mm → I
    expect(s.icoi?.grade).toBe('I');
    expect(s.icoi?.boneLossMm).toBe(1.3);
    expect(s.icoi?.reasons.join(' ')).toContain('pain on function is not recorded');
  });

  it('first-year loss of 1.6 mm fails Albrektsson; 2.0 mm makes ICOI II (2 mm → II as published)', () => {
    const s = boneLevelSummary({
      readings: [
        { date: '2020-03-01', mesialMm: 0.4, distalMm: 0.1 },
        { date: '2021-03-01', mesialMm: 2.0, distalMm: 1.1 },
      ],
      loadedOn: '2020-03-01',
      implantLengthMm: 10,
      latestExam: quiet,
    });
    expect(s.albrektsson?.meets).toBe(false);
    expect(s.albrektsson?.firstYearLossMm).toBeCloseTo(1.6, 4);
    expect(s.albrektsson?.allowance).toHaveLength(2);
    expect(s.icoi?.grade).toBe('II');
  });

  it.each<[string, Partial<ExamFindings>, number, string]>([
    ['PD 8 mm → III', { maxProbingDepthMm: 8 }, 1, 'III'],
    ['PD exactly 7 mm does not make III', { maxProbingDepthMm: 7 }, 1, 'I'],
    ['suppuration at an earlier exam (history) → III', { suppurationBefore: true }, 1, 'III'],
    ['suppuration at the latest exam (uncontrolled) → IV', { suppurationNow: true }, 1, 'IV'],
    ['mobility → IV', { mobility: true }, 1, 'IV'],
    ['4.5 mm loss → III', {}, 4.5, 'III'],
    ['6 mm loss on a 10 mm implant (more than half) → IV', {}, 6, 'IV'],
  ])('ICOI with the latest exam: %s', (_name, findings, level, grade) => {
    const s = boneLevelSummary({
      readings: [{ date: '2024-05-01', mesialMm: level, distalMm: 0 }],
      loadedOn: null,
      implantLengthMm: 10,
      latestExam: { ...quiet, ...findings },
    });
    expect(s.icoi?.grade).toBe(grade);
  });

  it('without a loading date there is no Albrektsson view; without an exam the findings are taken as absent', () => {
    const s = boneLevelSummary({ readings: steady, loadedOn: null, implantLengthMm: 10, latestExam: null });
    expect(s.albrektsson).toBeNull();
    expect(s.icoi?.grade).toBe('I');
    expect(s.icoi?.reasons.join(' ')).toContain('no recall exam yet');
  });

  it('no reading near loading: criteria not assessable and no allowance line', () => {
    const s = boneLevelSummary({ readings: steady, loadedOn: '2015-01-01', implantLengthMm: 10, latestExam: null });
    expect(s.albrektsson?.meets).toBe(false);
    expect(s.albrektsson?.allowance).toEqual([]);
  });

  it('no readings: nothing to summarise', () => {
    expect(boneLevelSummary({ readings: [], loadedOn: '2020-01-01', implantLengthMm: 10, latestExam: null })).toEqual({
      latest: null,
      albrektsson: null,
      icoi: null,
    });
  });
});

describe('boneLevelOfferFor — the measurement an exam of a given day is offered [decision]', () => {
  const film = (id: string, takenOn: string | null, measuredAt: string) => ({ id, takenOn, measuredAt });
  const levels = [
    film('2024', '2024-05-10', '2024-05-10T09:00:00.000Z'),
    film('2022', '2022-03-01', '2024-05-11T08:00:00.000Z'), // an old film measured later
    film('2022-again', '2022-03-01', '2024-06-01T08:00:00.000Z'), // the same day, measured later still
    film('undated', null, '2023-01-15T10:00:00.000Z'),
  ];
  it.each([
    ['2025-01-01', '2024'],
    ['2024-05-10', '2024'], // on the day the film was taken
    ['2024-05-09', 'undated'], // measured 2023-01-15, so taken by then
    ['2023-01-14', '2022-again'], // of two films of one day, the later measured
    ['2022-03-01', '2022-again'],
  ])('an exam of %s is offered the film "%s"', (examinedOn, expected) =>
    expect(boneLevelOfferFor(levels, examinedOn)?.id).toBe(expected),
  );
  it('offers nothing before the first film, and nothing from an empty list', () => {
    expect(boneLevelOfferFor(levels, '2022-02-28')).toBeNull();
    expect(boneLevelOfferFor([], '2030-01-01')).toBeNull();
  });
  it('does not depend on the order of the list', () => {
    expect(boneLevelOfferFor([...levels].reverse(), '2024-05-09')?.id).toBe('undated');
  });
});
