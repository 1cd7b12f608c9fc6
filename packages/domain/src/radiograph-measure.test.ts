import { describe, it, expect } from 'vitest';
import { correctByKnownLength, pixelDistanceMm } from './radiograph-measure.js';
import { ValidationError } from './errors.js';

describe('pixelDistanceMm — DICOM PS3.3 Pixel Spacing (0028,0030): row spacing first [pub]', () => {
  it('row spacing applies to the row (vertical) difference, column spacing to the column difference', () => {
    // anisotropic pixels: 0.1 mm between rows, 0.2 mm between columns
    expect(pixelDistanceMm({ row: 0, col: 0 }, { row: 10, col: 0 }, [0.1, 0.2])).toBeCloseTo(1.0, 12);
    expect(pixelDistanceMm({ row: 0, col: 0 }, { row: 0, col: 10 }, [0.1, 0.2])).toBeCloseTo(2.0, 12);
  });
  it('diagonal: 3-4-5 triangle', () => {
    expect(pixelDistanceMm({ row: 10, col: 20 }, { row: 40, col: 60 }, [0.1, 0.1])).toBeCloseTo(5.0, 12);
  });
  it('symmetric, sub-pixel points allowed', () => {
    const p = { row: 1.5, col: 2.25 };
    const q = { row: 7.75, col: 0.5 };
    expect(pixelDistanceMm(p, q, [0.08, 0.12])).toBe(pixelDistanceMm(q, p, [0.08, 0.12]));
  });
  it.each<[string, () => unknown]>([
    ['zero spacing', () => pixelDistanceMm({ row: 0, col: 0 }, { row: 1, col: 1 }, [0, 0.1])],
    ['negative spacing', () => pixelDistanceMm({ row: 0, col: 0 }, { row: 1, col: 1 }, [0.1, -0.1])],
    ['NaN coordinate', () => pixelDistanceMm({ row: Number.NaN, col: 0 }, { row: 1, col: 1 }, [0.1, 0.1])],
    [
      'one spacing value',
      () => pixelDistanceMm({ row: 0, col: 0 }, { row: 1, col: 1 }, [0.1] as unknown as [number, number]),
    ],
  ])('%s → ValidationError', (_n, fn) => expect(fn).toThrow(ValidationError));
});

describe('correctByKnownLength — Vazquez L et al. 2011, Clin Oral Implants Res, PMID 21435009 [pub]', () => {
  it('reference §5: a 10.0 mm implant measures 10.6 mm; a 2.12 mm reading → 2.00 mm', () => {
    expect(correctByKnownLength({ measuredMm: 2.12, implantMeasuredMm: 10.6, implantTrueMm: 10.0 })).toBeCloseTo(
      2.0,
      10,
    );
  });
  it('panoramic magnification about 1.27 on 10 mm implants [pub]: 12.7 mm measured → 10 mm', () => {
    expect(correctByKnownLength({ measuredMm: 12.7, implantMeasuredMm: 12.7, implantTrueMm: 10 })).toBeCloseTo(10, 10);
  });
  it('zero measurement stays zero', () => {
    expect(correctByKnownLength({ measuredMm: 0, implantMeasuredMm: 10.6, implantTrueMm: 10 })).toBe(0);
  });
  it.each([
    { measuredMm: -1, implantMeasuredMm: 10, implantTrueMm: 10 },
    { measuredMm: 1, implantMeasuredMm: 0, implantTrueMm: 10 },
    { measuredMm: 1, implantMeasuredMm: 10, implantTrueMm: Number.NaN },
  ])('invalid %o → ValidationError', (input) => expect(() => correctByKnownLength(input)).toThrow(ValidationError));
});
