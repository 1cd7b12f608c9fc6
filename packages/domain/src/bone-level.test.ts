import { describe, it, expect } from 'vitest';
import { albrektssonAllowanceMm, icoiGrade, meetsAlbrektsson, type IcoiInput } from './bone-level.js';
import { ValidationError } from './errors.js';

// Albrektsson T, Zarb G, Worthington P, Eriksson AR 1986, Int J Oral Maxillofac Implants 1:11–25 [pub]
// (< 0.2 mm/year after year 1); < 1.5 mm in year 1 also attributed to Smith & Zarb 1989, J Prosthet Dent 62:567 [memory].
// Cumulative allowance 1.5 + 0.2 (n − 1) [derived]. ICOI: Misch CE et al. 2008, Implant Dent 17(1):5–15 [pub].

describe('albrektssonAllowanceMm — 1.5 + 0.2 × (n − 1) mm [derived]', () => {
  it.each([
    [1, 1.5],
    [2, 1.7],
    [5, 2.3],
    [10, 3.3],
    [1.5, 1.6],
  ])('%s years → %s mm', (n, mm) => expect(albrektssonAllowanceMm(n)).toBeCloseTo(mm, 10));
  it('within the first year the first-year allowance applies [decision]', () => {
    expect(albrektssonAllowanceMm(0)).toBe(1.5);
    expect(albrektssonAllowanceMm(0.5)).toBe(1.5);
  });
  it('negative or NaN years → ValidationError', () => {
    expect(() => albrektssonAllowanceMm(-1)).toThrow(ValidationError);
    expect(() => albrektssonAllowanceMm(Number.NaN)).toThrow(ValidationError);
  });
});

describe('meetsAlbrektsson — reference §2 check cases (Albrektsson 1986 [pub]; 1.5 mm [memory])', () => {
  it('1.2 mm in year 1 then 0.1 mm/yr → meets', () => {
    const r = meetsAlbrektsson(
      [
        { date: '2020-03-01', boneLevelMm: 0.3 },
        { date: '2021-03-01', boneLevelMm: 1.5 },
        { date: '2022-03-01', boneLevelMm: 1.6 },
        { date: '2023-03-01', boneLevelMm: 1.7 },
        { date: '2024-03-01', boneLevelMm: 1.8 },
      ],
      '2020-03-01',
    );
    expect(r.meets).toBe(true);
    expect(r.firstYearLossMm).toBeCloseTo(1.2, 4);
    expect(r.annualLossAfterFirstYearMm).toBeCloseTo(0.1, 3);
  });
  it('1.6 mm in year 1 → does not meet', () => {
    const r = meetsAlbrektsson(
      [
        { date: '2020-03-01', boneLevelMm: 0 },
        { date: '2021-03-01', boneLevelMm: 1.6 },
        { date: '2022-03-01', boneLevelMm: 1.6 },
        { date: '2023-03-01', boneLevelMm: 1.6 },
      ],
      '2020-03-01',
    );
    expect(r.meets).toBe(false);
    expect(r.firstYearLossMm).toBeCloseTo(1.6, 4);
  });
});

describe('meetsAlbrektsson — boundaries and decisions where the sources are silent', () => {
  it('exactly 1.5 mm in year 1 does not meet ("< 1.5 mm"), even when float subtraction gives 1.4999999999999998', () => {
    const r = meetsAlbrektsson(
      [
        { date: '2020-01-10', boneLevelMm: 0.2 },
        { date: '2021-01-10', boneLevelMm: 1.7 },
      ],
      '2020-01-10',
    );
    expect(r.firstYearLossMm).toBe(1.5);
    expect(r.meets).toBe(false);
  });
  it('annual loss ≥ 0.2 mm/yr after year 1 does not meet', () => {
    const r = meetsAlbrektsson(
      [
        { date: '2020-01-10', boneLevelMm: 0 },
        { date: '2021-01-10', boneLevelMm: 1.0 },
        { date: '2022-01-10', boneLevelMm: 1.3 },
        { date: '2023-01-10', boneLevelMm: 1.6 },
      ],
      '2020-01-10',
    );
    expect(r.annualLossAfterFirstYearMm).toBeCloseTo(0.3, 2);
    expect(r.meets).toBe(false);
  });
  it('reference is the reading closest to loading (within 90 days), year-1 reading the one nearest the anniversary', () => {
    const r = meetsAlbrektsson(
      [
        { date: '2019-09-01', boneLevelMm: -0.5 }, // at surgery, > 90 days before loading: ignored
        { date: '2020-01-20', boneLevelMm: 0.1 }, // 19 days after loading: reference
        { date: '2020-07-01', boneLevelMm: 0.8 }, // 6 months: not used
        { date: '2020-12-20', boneLevelMm: 1.1 }, // 12 days before the anniversary: year-1 reading
        { date: '2021-03-01', boneLevelMm: 1.15 },
      ],
      '2020-01-01',
    );
    expect(r.firstYearLossMm).toBeCloseTo(1.0, 4);
    expect(r.reasons[0]).toContain('2020-01-20');
    expect(r.annualLossAfterFirstYearMm).toBeNull(); // 71 days after year 1: too short for a rate (default ≥ 1 year)
    expect(r.meets).toBe(true);
  });
  it('writes the dates of its reasons with the writer it is given (the practice order; issue 15 §7)', () => {
    const series = [
      { date: '2020-01-20', boneLevelMm: 0.1 },
      { date: '2020-12-20', boneLevelMm: 1.1 },
    ];
    const monthFirst = (iso: string) => `${iso.slice(5, 7)}/${iso.slice(8, 10)}/${iso.slice(0, 4)}`;
    const r = meetsAlbrektsson(series, '2020-01-01', { writeDate: monthFirst });
    expect(r.reasons[0]).toBe('reference: 01/20/2020, bone level 0.1 mm');
    expect(r.reasons.join(' ')).toContain('(reading 12/20/2020)');
    expect(r.reasons.join(' ')).not.toMatch(/\d{4}-\d{2}-\d{2}/);
    const none = meetsAlbrektsson([{ date: '2021-06-01', boneLevelMm: 1 }], '2020-01-01', { writeDate: monthFirst });
    expect(none.reasons.join(' ')).toContain('of loading (01/01/2020)');
  });
  it('minRateSpanYears 0 computes a rate from a short span (0.05 mm in 71 days ≈ 0.26 mm/yr): why the default is 1 year', () => {
    const r = meetsAlbrektsson(
      [
        { date: '2020-01-01', boneLevelMm: 0.1 },
        { date: '2020-12-20', boneLevelMm: 1.1 },
        { date: '2021-03-01', boneLevelMm: 1.15 },
      ],
      '2020-01-01',
      { minRateSpanYears: 0 },
    );
    expect(r.annualLossAfterFirstYearMm).toBeCloseTo(0.257, 2);
    expect(r.meets).toBe(false);
  });
  it('only a first year of follow-up: meets on the first year, annual rate null with a reason [decision]', () => {
    const r = meetsAlbrektsson(
      [
        { date: '2020-01-01', boneLevelMm: 0 },
        { date: '2021-01-05', boneLevelMm: 0.9 },
      ],
      '2020-01-01',
    );
    expect(r.meets).toBe(true);
    expect(r.annualLossAfterFirstYearMm).toBeNull();
    expect(r.reasons.join(' ')).toMatch(/not yet assessable/);
  });
  it('later readings spanning < 1 year after year 1: annual rate null [decision]', () => {
    const r = meetsAlbrektsson(
      [
        { date: '2020-01-01', boneLevelMm: 0 },
        { date: '2021-01-01', boneLevelMm: 0.9 },
        { date: '2021-07-01', boneLevelMm: 1.3 },
      ],
      '2020-01-01',
    );
    expect(r.annualLossAfterFirstYearMm).toBeNull();
    expect(r.meets).toBe(true);
  });
  it('no reading near loading → meets false, nulls, reason [decision]', () => {
    const r = meetsAlbrektsson(
      [
        { date: '2021-01-01', boneLevelMm: 1 },
        { date: '2022-01-01', boneLevelMm: 1.1 },
      ],
      '2020-01-01',
    );
    expect(r).toMatchObject({ meets: false, firstYearLossMm: null, annualLossAfterFirstYearMm: null });
    expect(r.reasons.join(' ')).toMatch(/reference/);
  });
  it('no reading near the first anniversary → meets false, nulls [decision]', () => {
    const r = meetsAlbrektsson(
      [
        { date: '2020-01-01', boneLevelMm: 0 },
        { date: '2022-01-01', boneLevelMm: 1.1 },
      ],
      '2020-01-01',
    );
    expect(r).toMatchObject({ meets: false, firstYearLossMm: null, annualLossAfterFirstYearMm: null });
  });
  it('empty series → meets false with a reason', () => {
    const r = meetsAlbrektsson([], '2020-01-01');
    expect(r.meets).toBe(false);
    expect(r.reasons).toHaveLength(1);
  });
  it('unsorted input is sorted by date', () => {
    const r = meetsAlbrektsson(
      [
        { date: '2022-03-01', boneLevelMm: 1.6 },
        { date: '2020-03-01', boneLevelMm: 0.3 },
        { date: '2021-03-01', boneLevelMm: 1.5 },
        { date: '2023-03-01', boneLevelMm: 1.7 },
      ],
      '2020-03-01',
    );
    expect(r.meets).toBe(true);
  });
  it.each<[string, () => unknown]>([
    ['bad loading date', () => meetsAlbrektsson([], '2020-02-30')],
    ['bad reading date', () => meetsAlbrektsson([{ date: '2020/01/01', boneLevelMm: 0 }], '2020-01-01')],
    ['NaN bone level', () => meetsAlbrektsson([{ date: '2020-01-01', boneLevelMm: Number.NaN }], '2020-01-01')],
    ['series not a list', () => meetsAlbrektsson(null as unknown as [], '2020-01-01')],
  ])('%s → ValidationError', (_n, fn) => expect(fn).toThrow(ValidationError));
});

describe('icoiGrade — ICOI Pisa health scale (Misch 2008 [pub]), 10 mm implant', () => {
  const ok: IcoiInput = { boneLossMm: 0, implantLengthMm: 10, mobility: false, painOnFunction: false, exudate: 'none' };
  it('reference §2: 1.9 mm → I', () => expect(icoiGrade({ ...ok, boneLossMm: 1.9 })).toBe('I'));
  it('reference §2: any mobility → IV', () => expect(icoiGrade({ ...ok, boneLossMm: 0.5, mobility: true })).toBe('IV'));
  it.each([
    [2.0, 'II'], // I is "< 2 mm"
    [3.0, 'II'],
    [4.0, 'II'], // III is "> 4 mm"
    [4.1, 'III'],
    [5.0, 'III'], // exactly ½ of 10 mm: IV needs "> ½" [decision]
    [5.1, 'IV'],
    [-0.3, 'I'], // bone gain
  ] as const)('bone loss %s mm → %s', (loss, grade) => expect(icoiGrade({ ...ok, boneLossMm: loss })).toBe(grade));
  it('PD > 7 mm → III; PD 7 mm exactly does not', () => {
    expect(icoiGrade({ ...ok, boneLossMm: 1, maxProbingDepthMm: 7.5 })).toBe('III');
    expect(icoiGrade({ ...ok, boneLossMm: 1, maxProbingDepthMm: 7 })).toBe('I');
  });
  it('exudate history → III; uncontrolled exudate → IV', () => {
    expect(icoiGrade({ ...ok, exudate: 'history' })).toBe('III');
    expect(icoiGrade({ ...ok, exudate: 'uncontrolled' })).toBe('IV');
  });
  it('pain on function → IV; no longer in the mouth → IV', () => {
    expect(icoiGrade({ ...ok, painOnFunction: true })).toBe('IV');
    expect(icoiGrade({ ...ok, inMouth: false })).toBe('IV');
  });
  it('short implant: half of 6 mm is 3 mm, so 3.5 mm loss is IV before the 4 mm rule', () => {
    expect(icoiGrade({ ...ok, implantLengthMm: 6, boneLossMm: 3.5 })).toBe('IV');
  });
  it.each<[string, Partial<IcoiInput>]>([
    ['NaN loss', { boneLossMm: Number.NaN }],
    ['zero length', { implantLengthMm: 0 }],
    ['negative PD', { maxProbingDepthMm: -1 }],
    ['unknown exudate', { exudate: 'some' as 'none' }],
    ['mobility not boolean', { mobility: 1 as unknown as boolean }],
  ])('%s → ValidationError', (_n, patch) => expect(() => icoiGrade({ ...ok, ...patch })).toThrow(ValidationError));
});
