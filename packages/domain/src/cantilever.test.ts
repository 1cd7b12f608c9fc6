// Distal cantilever against the A-P spread. Source of the default ratio: English CE 1990, "Critical
// A-P spread", Implant Society 1(1):2–3 [memory] (cantilever ≤ 1.5 × A-P spread, mandible, five
// anterior implants), repeated in Misch CE, Dental Implant Prosthetics 2005 [memory]; the ratio as a
// default is [common practice]. Worked cases are computed by hand: limit = ratio × spread.
import { describe, expect, it } from 'vitest';
import {
  CANTILEVER_FINDING_CODES,
  CANTILEVER_KINDS,
  DEFAULT_CANTILEVER_RATIO,
  cantileverFindings,
  cantileverLimitMm,
} from './cantilever.js';
import { ValidationError } from './errors.js';

describe('cantileverLimitMm', () => {
  it('is 1.5 × the spread by default (English 1990 [memory]; [common practice])', () => {
    expect(DEFAULT_CANTILEVER_RATIO).toBe(1.5);
    expect(cantileverLimitMm(10)).toBe(15);
    // A practice that sets 1.0 (e.g. for the maxilla, softer bone [memory]): 14 mm spread → 14 mm.
    expect(cantileverLimitMm(14, 1)).toBe(14);
  });
  it('refuses a spread of 0 and a ratio outside the practice range', () => {
    expect(() => cantileverLimitMm(0)).toThrow(ValidationError);
    expect(() => cantileverLimitMm(10, 0.4)).toThrow(/ratio from 0.5 to 3/);
    expect(() => cantileverLimitMm(10, 3.1)).toThrow(/ratio from 0.5 to 3/);
  });
});

describe('cantileverFindings (full arch)', () => {
  it('passes a cantilever just inside the limit and exactly at it', () => {
    // Spread 10 mm × 1.5 = 15 mm: 14.9 mm and 15 mm pass.
    expect(cantileverFindings({ kind: 'full-arch', leftMm: 14.9, rightMm: 15, apSpreadMm: 10 })).toEqual([]);
  });
  it('warns per side just outside the limit, as a caution', () => {
    // Spread 10 mm × 1.5 = 15 mm: 15.1 mm on the left is over; 12 mm on the right is not.
    const out = cantileverFindings({ kind: 'full-arch', leftMm: 15.1, rightMm: 12, apSpreadMm: 10 });
    expect(out).toHaveLength(1);
    expect(out[0]).toMatchObject({ severity: 'warning', code: CANTILEVER_FINDING_CODES.LEFT_OVER_LIMIT });
    expect(out[0].message).toMatch(/^Caution: the left distal cantilever \(15.1 mm\).*\(15 mm\).*not a diagnosis/);
    expect(out[0].source).toMatch(/English CE 1990/);
  });
  it("uses the practice's own ratio: 1.0 × 12 mm spread = 12 mm", () => {
    // 12.5 mm on the right is over a 12 mm limit; the same 12.5 mm passes the default (18 mm).
    const strict = cantileverFindings({ kind: 'full-arch', rightMm: 12.5, apSpreadMm: 12 }, 1);
    expect(strict.map((f) => f.code)).toEqual([CANTILEVER_FINDING_CODES.RIGHT_OVER_LIMIT]);
    expect(cantileverFindings({ kind: 'full-arch', rightMm: 12.5, apSpreadMm: 12 })).toEqual([]);
    // A bar overdenture's distal bar extensions are judged the same way.
    expect(
      cantileverFindings({ kind: 'overdenture-bar', rightMm: 12.5, apSpreadMm: 12 }, 1).map((f) => f.code),
    ).toEqual(strict.map((f) => f.code));
  });
  it('warns on both sides when both are over', () => {
    const out = cantileverFindings({ kind: 'full-arch', leftMm: 20, rightMm: 19, apSpreadMm: 12 });
    expect(out.map((f) => f.code)).toEqual([
      CANTILEVER_FINDING_CODES.LEFT_OVER_LIMIT,
      CANTILEVER_FINDING_CODES.RIGHT_OVER_LIMIT,
    ]);
  });
  it('asks for the spread when a cantilever is given without it (info, nothing to acknowledge)', () => {
    const out = cantileverFindings({ kind: 'full-arch', leftMm: 10 });
    expect(out).toMatchObject([{ severity: 'info', code: CANTILEVER_FINDING_CODES.SPREAD_MISSING }]);
    expect(cantileverFindings({ kind: 'full-arch', leftMm: 0, rightMm: 0 })).toEqual([]);
    expect(cantileverFindings({ kind: 'full-arch', apSpreadMm: 10 })).toEqual([]);
  });
});

describe('kinds that record cantilevers', () => {
  it('applies to every kind listed in CANTILEVER_KINDS and refuses the values elsewhere', () => {
    for (const kind of CANTILEVER_KINDS)
      expect(cantileverFindings({ kind, leftMm: 16, apSpreadMm: 10 })).toHaveLength(1);
    expect(cantileverFindings({ kind: 'splinted-bridge' })).toEqual([]);
    expect(() => cantileverFindings({ kind: 'splinted-bridge', rightMm: 8 })).toThrow(
      expect.objectContaining({ field: 'plan.cantileverRightMm' }),
    );
  });
  it('refuses negative, too long or non-finite lengths', () => {
    expect(() => cantileverFindings({ kind: 'full-arch', leftMm: -1 })).toThrow(/0 mm or more/);
    expect(() => cantileverFindings({ kind: 'full-arch', leftMm: 31, apSpreadMm: 10 })).toThrow(/At most 30 mm/);
    expect(() => cantileverFindings({ kind: 'full-arch', apSpreadMm: Number.NaN })).toThrow(ValidationError);
  });
});
