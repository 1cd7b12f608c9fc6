import { describe, it, expect } from 'vitest';
import * as fc from 'fast-check';
import { ISO_6789_TOLERANCE_PCT, torqueDeviationPct, torqueToleranceBand, torqueVerdict } from './torque.js';
import { ValidationError } from './errors.js';

// ISO 6789-1:2017 Type II Class A ±6 % [pub], applied to dental drivers [derived];
// friction-style devices ±10 % (Vallee et al. 2008, J Prosthet Dent 100:86–92) [pub].

describe('torqueVerdict — reference §6 check case (ISO 6789-1:2017 [pub], ±6 % [derived])', () => {
  it('setting 35 N·cm, reference reads 33.5 → −4.3 % → within ±6 %', () => {
    expect(torqueDeviationPct(33.5, 35)).toBeCloseTo(-4.2857, 3);
    expect(torqueVerdict({ appliedNcm: 33.5, specNcm: 35, tolerancePct: ISO_6789_TOLERANCE_PCT })).toBe('within');
  });
});

describe('torqueVerdict — inclusive window, floating point at the exact boundary', () => {
  it('35 ± 6 % → 32.9 and 37.1 are within (35 × 0.94 is not exactly 32.9 in binary)', () => {
    expect(torqueVerdict({ appliedNcm: 32.9, specNcm: 35, tolerancePct: 6 })).toBe('within');
    expect(torqueVerdict({ appliedNcm: 37.1, specNcm: 35, tolerancePct: 6 })).toBe('within');
  });
  it('just outside: 32.89 under, 37.11 over, and 1e-6 N·cm beyond the limit is outside', () => {
    expect(torqueVerdict({ appliedNcm: 32.89, specNcm: 35, tolerancePct: 6 })).toBe('under');
    expect(torqueVerdict({ appliedNcm: 37.11, specNcm: 35, tolerancePct: 6 })).toBe('over');
    expect(torqueVerdict({ appliedNcm: 32.9 - 1e-6, specNcm: 35, tolerancePct: 6 })).toBe('under');
    expect(torqueVerdict({ appliedNcm: 37.1 + 1e-6, specNcm: 35, tolerancePct: 6 })).toBe('over');
  });
  it('15 ± 10 % (friction-style device window, Vallee 2008 [pub]) → 13.5 and 16.5 within', () => {
    expect(torqueVerdict({ appliedNcm: 13.5, specNcm: 15, tolerancePct: 10 })).toBe('within');
    expect(torqueVerdict({ appliedNcm: 16.5, specNcm: 15, tolerancePct: 10 })).toBe('within');
    expect(torqueVerdict({ appliedNcm: 16.6, specNcm: 15, tolerancePct: 10 })).toBe('over');
  });
  it('boundaries for many specifications and tolerances are within (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 100 }), fc.integer({ min: 0, max: 20 }), (spec, tol) => {
        const lo = Number(((spec * (100 - tol)) / 100).toFixed(10));
        const hi = Number(((spec * (100 + tol)) / 100).toFixed(10));
        return (
          torqueVerdict({ appliedNcm: lo, specNcm: spec, tolerancePct: tol }) === 'within' &&
          torqueVerdict({ appliedNcm: hi, specNcm: spec, tolerancePct: tol }) === 'within'
        );
      }),
    );
  });
  it('0 % tolerance: only the exact value is within', () => {
    expect(torqueVerdict({ appliedNcm: 35, specNcm: 35, tolerancePct: 0 })).toBe('within');
    expect(torqueVerdict({ appliedNcm: 35.01, specNcm: 35, tolerancePct: 0 })).toBe('over');
  });
});

describe('torqueToleranceBand — the window torqueVerdict judges against (ISO 6789-1:2017 [pub], ±6 % [derived])', () => {
  it('35 N·cm ± 6 % → 32.9 to 37.1 N·cm', () => {
    const band = torqueToleranceBand(35, ISO_6789_TOLERANCE_PCT);
    expect(band.lowNcm).toBeCloseTo(32.9, 10);
    expect(band.highNcm).toBeCloseTo(37.1, 10);
  });
  it('its ends are within and 1e-6 N·cm beyond them is outside (property, same formula as the verdict)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 100 }), fc.integer({ min: 0, max: 50 }), (spec, tol) => {
        const { lowNcm, highNcm } = torqueToleranceBand(spec, tol);
        const verdict = (appliedNcm: number) => torqueVerdict({ appliedNcm, specNcm: spec, tolerancePct: tol });
        return (
          verdict(lowNcm) === 'within' &&
          verdict(highNcm) === 'within' &&
          verdict(highNcm + 1e-6) === 'over' &&
          verdict(lowNcm - 1e-6) === 'under'
        );
      }),
    );
  });
  it('refuses what the verdict refuses', () => {
    expect(() => torqueToleranceBand(0, 6)).toThrow(ValidationError);
    expect(() => torqueToleranceBand(35, 100)).toThrow(ValidationError);
    expect(() => torqueToleranceBand(35, Number.NaN)).toThrow(ValidationError);
  });
});

describe('property (fast-check): torqueVerdict is within at the specification', () => {
  it('any spec, any tolerance', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.01, max: 1000, noNaN: true }),
        fc.double({ min: 0, max: 99, noNaN: true }),
        (spec, tol) => torqueVerdict({ appliedNcm: spec, specNcm: spec, tolerancePct: tol }) === 'within',
      ),
    );
  });
});

describe('torqueVerdict — invalid input → ValidationError', () => {
  it.each([
    { appliedNcm: Number.NaN, specNcm: 35, tolerancePct: 6 },
    { appliedNcm: -1, specNcm: 35, tolerancePct: 6 },
    { appliedNcm: 35, specNcm: 0, tolerancePct: 6 },
    { appliedNcm: 35, specNcm: 35, tolerancePct: -6 },
    { appliedNcm: 35, specNcm: 35, tolerancePct: 100 },
    { appliedNcm: 35, specNcm: Number.POSITIVE_INFINITY, tolerancePct: 6 },
  ])('%o', (input) => expect(() => torqueVerdict(input)).toThrow(ValidationError));
});
