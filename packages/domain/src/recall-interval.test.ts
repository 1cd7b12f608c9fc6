import { describe, it, expect } from 'vitest';
import * as fc from 'fast-check';
import { addMonths } from 'date-fns';
import { nextRecallDate, recallIntervalMonths } from './recall-interval.js';
import { ValidationError } from './errors.js';

// Bidra AS et al. 2016, J Prosthodont 25(S1):S32–S40 (≥ every 6 months) [memory for the implant guideline];
// Herrera D et al. 2023, EFP S3 guideline, J Clin Periodontol 50(S26):4–76 (risk-based) [pub];
// 6 / 3 months: practice policy [common practice]. Month arithmetic cross-checked against date-fns `addMonths`.

describe('nextRecallDate — practice policy 6 months, 3 with any risk factor [common practice]', () => {
  it('no risk → 6 months', () => expect(nextRecallDate('2026-03-15', {})).toBe('2026-09-15'));
  it.each(['smoker', 'diabetesPoorlyControlled', 'periodontitisHistory', 'priorPeriImplantitis'])(
    '%s → 3 months',
    (k) => {
      expect(nextRecallDate('2026-03-15', { [k]: true })).toBe('2026-06-15');
    },
  );
  it('false risk factors count as absent', () => {
    expect(nextRecallDate('2026-03-15', { smoker: false, priorPeriImplantitis: false })).toBe('2026-09-15');
  });
  it('month-end clamps: 31 Aug + 6 months → 28 Feb (29 Feb in a leap year)', () => {
    expect(nextRecallDate('2026-08-31', {})).toBe('2027-02-28');
    expect(nextRecallDate('2027-08-31', {})).toBe('2028-02-29');
    expect(nextRecallDate('2026-11-30', { smoker: true })).toBe('2027-02-28');
    expect(nextRecallDate('2027-05-31', { smoker: true })).toBe('2027-08-31');
  });
  it('crosses the year', () => expect(nextRecallDate('2026-12-01', {})).toBe('2027-06-01'));
  it('policy overrides', () => {
    expect(nextRecallDate('2026-01-31', {}, { baseMonths: 12 })).toBe('2027-01-31');
    expect(nextRecallDate('2026-01-31', { smoker: true }, { riskMonths: 1 })).toBe('2026-02-28');
  });
  it.each<[string, () => unknown]>([
    ['impossible date', () => nextRecallDate('2026-02-30', {})],
    ['not ISO', () => nextRecallDate('15/03/2026', {})],
    ['timestamp', () => nextRecallDate('2026-03-15T10:00:00Z', {})],
    ['fractional months', () => nextRecallDate('2026-03-15', {}, { baseMonths: 6.5 })],
    ['zero months', () => nextRecallDate('2026-03-15', {}, { riskMonths: 0 })],
    ['risk interval longer than base', () => nextRecallDate('2026-03-15', {}, { baseMonths: 3, riskMonths: 6 })],
    ['non-boolean risk', () => nextRecallDate('2026-03-15', { smoker: 'yes' as unknown as boolean })],
  ])('%s → ValidationError', (_n, fn) => expect(fn).toThrow(ValidationError));
});

describe('recallIntervalMonths — the interval nextRecallDate adds [common practice]', () => {
  it("6 without risk, 3 with any risk factor, or the policy's own intervals", () => {
    expect(recallIntervalMonths({})).toBe(6);
    expect(recallIntervalMonths({ smoker: false, priorPeriImplantitis: true })).toBe(3);
    expect(recallIntervalMonths({ smoker: true }, { baseMonths: 12, riskMonths: 4 })).toBe(4);
    expect(recallIntervalMonths({}, { baseMonths: 12, riskMonths: 4 })).toBe(12);
  });
  it('refuses a risk interval longer than the base interval', () => {
    expect(() => recallIntervalMonths({}, { baseMonths: 3, riskMonths: 6 })).toThrow(ValidationError);
  });
});

describe('cross-check: calendar month arithmetic against date-fns addMonths (reference library)', () => {
  const pad = (n: number, w = 2) => String(n).padStart(w, '0');
  it('property: for any date 1900–2199 and the 3- or 6-month interval, same result as date-fns', () => {
    fc.assert(
      fc.property(
        fc.date({ min: new Date(1900, 0, 1), max: new Date(2199, 11, 31), noInvalidDate: true }),
        fc.boolean(),
        (d, risky) => {
          const iso = `${pad(d.getFullYear(), 4)}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}`;
          const local = new Date(d.getFullYear(), d.getMonth(), d.getDate(), 12);
          const ref = addMonths(local, risky ? 3 : 6);
          const expected = `${pad(ref.getFullYear(), 4)}-${pad(ref.getMonth() + 1)}-${pad(ref.getDate())}`;
          return nextRecallDate(iso, { smoker: risky }) === expected;
        },
      ),
      { numRuns: 500 },
    );
  });
  it('every month end of 2023–2028 matches date-fns for 1–12 months', () => {
    for (let y = 2023; y <= 2028; y++) {
      for (let m = 1; m <= 12; m++) {
        for (const day of [28, 29, 30, 31]) {
          const local = new Date(y, m - 1, day, 12);
          if (local.getMonth() !== m - 1) continue; // day does not exist
          for (let n = 1; n <= 12; n++) {
            const ref = addMonths(local, n);
            const expected = `${ref.getFullYear()}-${pad(ref.getMonth() + 1)}-${pad(ref.getDate())}`;
            expect(nextRecallDate(`${y}-${pad(m)}-${pad(day)}`, {}, { baseMonths: n, riskMonths: 1 })).toBe(expected);
          }
        }
      }
    }
  });
});
