import { describe, expect, it } from 'vitest';
import { ValidationError } from './errors.js';
import {
  eventsPer100ImplantYears,
  followUpYears,
  kaplanMeier,
  numberAtRisk,
  survivalAt,
  type SurvivalObservation,
} from './survival.js';

// Kaplan EL, Meier P 1958, J Am Stat Assoc 53:457–481 [pub]; Greenwood M 1926 [pub, via the reference §11].
// The issue suggests Bland JM, Altman DG 1998, BMJ 317:1572; its table could not be read in full here
// (only the abstract page was reachable), so its figures are NOT used. The published worked table used
// instead: Bewick V, Cheek L, Ball J 2004, "Statistics review 12: Survival analysis", Crit Care 8:389–394,
// Table 2 (Kaplan–Meier calculation for the treatment 2 data: 1, 1, 4, 5, 6+, 9, 9+, 22 days) [pub].
const bewickTreatment2: SurvivalObservation[] = [
  { time: 1, event: true },
  { time: 1, event: true },
  { time: 4, event: true },
  { time: 5, event: true },
  { time: 6, event: false },
  { time: 9, event: true },
  { time: 9, event: false },
  { time: 22, event: true },
];

describe('kaplanMeier — Bewick, Cheek & Ball 2004, Crit Care 8:389, Table 2 [pub]', () => {
  const km = kaplanMeier(bewickTreatment2);
  it.each([
    // time, number known alive (rᵢ), deaths (dᵢ), cumulative proportion surviving as printed (3 decimals)
    [1, 8, 2, 0.75],
    [4, 6, 1, 0.625],
    [5, 5, 1, 0.5],
    [9, 3, 1, 0.333],
    [22, 1, 1, 0],
  ])('day %s: %s at risk, %s deaths → S = %s', (time, atRisk, deaths, survival) => {
    const step = km.steps.find((s) => s.time === time)!;
    expect(step.atRisk).toBe(atRisk);
    expect(step.events).toBe(deaths);
    expect(step.survival).toBeCloseTo(survival, 3);
  });
  it('the censored 9+ counts as at risk at the death on day 9 (reference §11)', () => {
    const day9 = km.steps.find((s) => s.time === 9)!;
    expect(day9.censored).toBe(1);
    expect(day9.atRisk).toBe(3);
  });
  it('the censoring on day 6 does not move the curve', () => {
    expect(km.steps.find((s) => s.time === 6)!.survival).toBe(0.5);
    expect(survivalAt(km, 8.9)).toBe(0.5);
    expect(survivalAt(km, 0.5)).toBe(1);
  });
  it('Greenwood SE is null once S reaches 0 (the formula divides by nᵢ − dᵢ = 0)', () => {
    expect(km.steps.at(-1)!.standardError).toBeNull();
    expect(km.events).toBe(6);
    expect(km.subjects).toBe(8);
  });
  it('number at risk under the axis: those followed to at least t', () => {
    expect(numberAtRisk(bewickTreatment2, 0)).toBe(8);
    expect(numberAtRisk(bewickTreatment2, 6)).toBe(4);
    expect(numberAtRisk(bewickTreatment2, 10)).toBe(1);
  });
});

// Greenwood's SE, with no censoring, equals the binomial √(S(1 − S) ÷ n). Control arm of the leukaemia
// remission data (Gehan 1965, printed as Table 1.1 of Cox DR, Oakes D 1984, Analysis of Survival Data
// [memory for the book's table number]): 21 patients, weeks 1,1,2,2,3,4,4,5,5,8,8,8,8,11,11,12,12,15,17,22,23;
// S(10) = 8 ÷ 21 = 0.381 with SE 0.106, as worked in a survival-analysis lecture note [pub figures, secondary].
describe('Greenwood standard error — leukaemia control arm, S(10) = 0.381, SE 0.106', () => {
  const weeks = [1, 1, 2, 2, 3, 4, 4, 5, 5, 8, 8, 8, 8, 11, 11, 12, 12, 15, 17, 22, 23];
  const km = kaplanMeier(weeks.map((time) => ({ time, event: true })));
  it('S(10) and its SE', () => {
    expect(survivalAt(km, 10)).toBeCloseTo(0.381, 3);
    const week8 = km.steps.find((s) => s.time === 8)!;
    expect(week8.standardError).toBeCloseTo(0.106, 3);
  });
});

describe('kaplanMeier — bad input', () => {
  it('an empty list, a negative or a non-finite time → ValidationError', () => {
    expect(() => kaplanMeier([])).toThrow(ValidationError);
    expect(() => kaplanMeier([{ time: -1, event: true }])).toThrow(ValidationError);
    expect(() => kaplanMeier([{ time: Number.NaN, event: false }])).toThrow(ValidationError);
  });
  it('no events: S stays 1 with SE 0', () => {
    const km = kaplanMeier([
      { time: 2, event: false },
      { time: 3, event: false },
    ]);
    expect(km.steps.map((s) => [s.survival, s.standardError])).toEqual([
      [1, 0],
      [1, 0],
    ]);
  });
});

describe('eventsPer100ImplantYears — events ÷ implant-years × 100 [derived]', () => {
  it('reference §11: 6 screw loosenings over 480 implant-years → 1.25', () => {
    expect(eventsPer100ImplantYears(6, 480)).toBeCloseTo(1.25, 10);
  });
  it('[hand-worked] 3 implants followed 2.0, 4.5 and 3.5 years = 10 implant-years; 2 complications → 20', () => {
    const implantYears = 2.0 + 4.5 + 3.5;
    expect(eventsPer100ImplantYears(2, implantYears)).toBeCloseTo(20, 10);
  });
  it('[hand-worked] follow-up 2012-03-01 → 2026-03-01 is 5113 days = 13.9986 years (÷ 365.25)', () => {
    expect(followUpYears('2012-03-01', '2026-03-01')).toBeCloseTo(5113 / 365.25, 10);
    expect(followUpYears('2012-03-01', '2026-03-01')).toBeCloseTo(13.9986, 4);
  });
  it('no follow-up, a negative or fractional count, or an end before the start → ValidationError', () => {
    expect(() => eventsPer100ImplantYears(1, 0)).toThrow(ValidationError);
    expect(() => eventsPer100ImplantYears(-1, 10)).toThrow(ValidationError);
    expect(() => eventsPer100ImplantYears(1.5, 10)).toThrow(ValidationError);
    expect(() => eventsPer100ImplantYears(1, Number.NaN)).toThrow(ValidationError);
    expect(() => followUpYears('2026-03-01', '2025-03-01')).toThrow(ValidationError);
  });
});
