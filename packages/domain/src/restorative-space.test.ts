import { describe, it, expect } from 'vitest';
import {
  RESTORATIVE_DESIGNS,
  minImplantCentreDistanceMm,
  minRestorativeSpaceMm,
  minSingleToothGapMm,
  type RestorativeDesign,
} from './restorative-space.js';
import { ValidationError } from './errors.js';

describe('minRestorativeSpaceMm — Carpentieri J, Greenstein G, Cavallaro J 2019, JADA 150(8):695–706 [pub], strictest end', () => {
  it.each<[RestorativeDesign, number]>([
    ['screw-implant-level', 5], // 4–5 mm
    ['screw-abutment-level', 7.5],
    ['cement', 8], // 7–8 mm
    ['bar-overdenture', 11],
    ['full-arch-hybrid', 15],
  ])('%s → %s mm', (design, mm) => expect(minRestorativeSpaceMm(design)).toBe(mm));
  it('covers every design', () => expect(RESTORATIVE_DESIGNS).toHaveLength(5));
  it('unknown design → ValidationError', () =>
    expect(() => minRestorativeSpaceMm('denture' as RestorativeDesign)).toThrow(ValidationError));
});

describe('spacing — implant to tooth ≥ 1.5 mm [common practice]; implant to implant ≥ 3 mm (Tarnow 2000, J Periodontol 71:546–549) [pub]', () => {
  it('reference §7: implant diameter 4.0 mm → single gap between teeth ≥ 7.0 mm [derived]', () => {
    expect(minSingleToothGapMm(4.0)).toBe(7.0);
  });
  it('two 4 mm implants → centres ≥ 7 mm apart [derived]', () => expect(minImplantCentreDistanceMm(4, 4)).toBe(7));
  it('invalid diameter → ValidationError', () => {
    expect(() => minSingleToothGapMm(0)).toThrow(ValidationError);
    expect(() => minImplantCentreDistanceMm(4, Number.NaN)).toThrow(ValidationError);
  });
});
