import { describe, it, expect } from 'vitest';
import * as fc from 'fast-check';
import {
  correctByKnownLength,
  measureBoneLevels,
  pixelDistanceMm,
  projectOnImplantAxis,
} from './radiograph-measure.js';
import type { ImplantMarks, PixelPoint } from './radiograph-measure.js';
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

describe('projectOnImplantAxis — vector projection on the platform→apex line [pub: elementary geometry]', () => {
  it('3-4-5 axis: (11, 2) lies 10 along and 5 across', () => {
    const r = projectOnImplantAxis({ row: 11, col: 2 }, { row: 0, col: 0 }, { row: 80, col: 60 });
    expect(r.along).toBeCloseTo(10, 12);
    expect(r.across).toBeCloseTo(5, 12);
  });
  it('a point coronal of the platform is negative', () => {
    expect(projectOnImplantAxis({ row: 90, col: 45 }, { row: 100, col: 50 }, { row: 300, col: 50 }).along).toBe(-10);
  });
  it('platform equal to apex → zero-vector', () => {
    expect(() => projectOnImplantAxis({ row: 1, col: 1 }, { row: 2, col: 2 }, { row: 2, col: 2 })).toThrow(
      expect.objectContaining({ code: 'zero-vector' }),
    );
  });
});

describe('measureBoneLevels — along the axis from the platform, calibrated by known length (Vazquez 2011) [pub]', () => {
  const upright: ImplantMarks = {
    // shoulder (100,40)–(100,60): platform centre (100,50); apex (300,50): 200 px long
    platform: [
      { row: 100, col: 40 },
      { row: 100, col: 60 },
    ],
    apex: { row: 300, col: 50 },
    mesial: { row: 130, col: 42 }, // 30 px apical of the platform
    distal: { row: 120, col: 58 }, // 20 px apical
  };

  it('hand-worked: 10 mm implant over 200 px = 0.05 mm/px; mesial 30 px → 1.5 mm, distal 20 px → 1.0 mm', () => {
    const r = measureBoneLevels({ marks: upright, implantTrueMm: 10 });
    expect(r.implantImageLength).toBe(200);
    expect(r.mmPerUnit).toBeCloseTo(0.05, 12);
    expect(r.mesialMm).toBeCloseTo(1.5, 12);
    expect(r.distalMm).toBeCloseTo(1.0, 12);
    expect(r.spacing).toBeNull();
  });

  it('hand-worked tilted 3-4-5 axis: 12 mm implant over 100 units; contacts 10 and 20 along → 1.2 and 2.4 mm', () => {
    const r = measureBoneLevels({
      marks: {
        platform: [
          { row: -4, col: 3 },
          { row: 4, col: -3 },
        ],
        apex: { row: 80, col: 60 },
        mesial: { row: 11, col: 2 },
        distal: { row: 13, col: 16 },
      },
      implantTrueMm: 12,
    });
    expect(r.mesialMm).toBeCloseTo(1.2, 12);
    expect(r.distalMm).toBeCloseTo(2.4, 12);
  });

  it('bone coronal of the platform is a negative level', () => {
    const r = measureBoneLevels({ marks: { ...upright, mesial: { row: 90, col: 45 } }, implantTrueMm: 10 });
    expect(r.mesialMm).toBeCloseTo(-0.5, 12);
  });

  it('agrees with correctByKnownLength on the spacing-scaled readings', () => {
    const r = measureBoneLevels({ marks: upright, implantTrueMm: 10, pixelSpacing: [0.053, 0.053] });
    const spacing = r.spacing!;
    expect(spacing.implantLengthMm).toBeCloseTo(10.6, 12);
    expect(spacing.mesialMm).toBeCloseTo(1.59, 12);
    expect(r.mesialMm).toBeCloseTo(
      correctByKnownLength({ measuredMm: 1.59, implantMeasuredMm: 10.6, implantTrueMm: 10 }),
      12,
    );
    expect(spacing.disagreement).toBeCloseTo(0.06, 12);
    expect(spacing.flagged).toBe(false);
  });

  it('Pixel Spacing 0.055 mm: 11.0 mm vs 10 mm is exactly 10 % — not over, not flagged; 0.056 mm (12 %) is', () => {
    expect(
      measureBoneLevels({ marks: upright, implantTrueMm: 10, pixelSpacing: [0.055, 0.055] }).spacing!.flagged,
    ).toBe(false);
    const elongated = measureBoneLevels({ marks: upright, implantTrueMm: 10, pixelSpacing: [0.056, 0.056] }).spacing!;
    expect(elongated.flagged).toBe(true);
    expect(elongated.disagreement).toBeCloseTo(0.12, 12);
    const foreshortened = measureBoneLevels({
      marks: upright,
      implantTrueMm: 10,
      pixelSpacing: [0.044, 0.044],
    }).spacing!;
    expect(foreshortened.flagged).toBe(true);
    expect(foreshortened.disagreement).toBeCloseTo(-0.12, 12);
  });

  it('anisotropic Pixel Spacing [0.1, 0.2]: the axis and the projection work in mm, not pixels', () => {
    const r = measureBoneLevels({
      marks: {
        platform: [
          { row: 0, col: -5 },
          { row: 0, col: 5 },
        ],
        apex: { row: 100, col: 0 }, // 10 mm by spacing
        mesial: { row: 20, col: 10 }, // (2 mm, 2 mm) in the plane: 2 mm along
        distal: { row: 30, col: -10 }, // 3 mm along
      },
      implantTrueMm: 10,
      pixelSpacing: [0.1, 0.2],
    });
    expect(r.mesialMm).toBeCloseTo(2, 12);
    expect(r.distalMm).toBeCloseTo(3, 12);
    expect(r.spacing!.disagreement).toBeCloseTo(0, 12);
  });

  it.each<[string, () => unknown]>([
    ['zero true length', () => measureBoneLevels({ marks: upright, implantTrueMm: 0 })],
    [
      'apex on the platform',
      () => measureBoneLevels({ marks: { ...upright, apex: { row: 100, col: 50 } }, implantTrueMm: 10 }),
    ],
    [
      'NaN point',
      () => measureBoneLevels({ marks: { ...upright, distal: { row: Number.NaN, col: 0 } }, implantTrueMm: 10 }),
    ],
    ['zero spacing', () => measureBoneLevels({ marks: upright, implantTrueMm: 10, pixelSpacing: [0, 0.1] })],
  ])('%s → ValidationError', (_n, fn) => expect(fn).toThrow(ValidationError));

  const coord = fc.double({ min: -500, max: 500, noNaN: true });
  const point = fc.record({ row: coord, col: coord });
  const marks = fc
    .record({ platform: fc.tuple(point, point), apex: point, mesial: point, distal: point })
    .filter(
      (m) =>
        Math.hypot(
          m.apex.row - (m.platform[0].row + m.platform[1].row) / 2,
          m.apex.col - (m.platform[0].col + m.platform[1].col) / 2,
        ) > 1,
    );

  it('property: scaling the image leaves the calibrated mm unchanged', () => {
    fc.assert(
      fc.property(
        marks,
        fc.double({ min: 0.1, max: 10, noNaN: true }),
        fc.double({ min: 4, max: 20, noNaN: true }),
        (m, k, len) => {
          const s = (p: PixelPoint): PixelPoint => ({ row: p.row * k, col: p.col * k });
          const a = measureBoneLevels({ marks: m, implantTrueMm: len });
          const b = measureBoneLevels({
            marks: {
              platform: [s(m.platform[0]), s(m.platform[1])],
              apex: s(m.apex),
              mesial: s(m.mesial),
              distal: s(m.distal),
            },
            implantTrueMm: len,
          });
          expect(b.mesialMm).toBeCloseTo(a.mesialMm, 6);
          expect(b.distalMm).toBeCloseTo(a.distalMm, 6);
        },
      ),
    );
  });

  it('property: swapping mesial and distal swaps the outputs', () => {
    fc.assert(
      fc.property(marks, fc.double({ min: 4, max: 20, noNaN: true }), (m, len) => {
        const a = measureBoneLevels({ marks: m, implantTrueMm: len, pixelSpacing: [0.1, 0.1] });
        const b = measureBoneLevels({
          marks: { ...m, mesial: m.distal, distal: m.mesial },
          implantTrueMm: len,
          pixelSpacing: [0.1, 0.1],
        });
        expect(b.mesialMm).toBe(a.distalMm);
        expect(b.distalMm).toBe(a.mesialMm);
        expect(b.spacing!.mesialMm).toBe(a.spacing!.distalMm);
      }),
    );
  });
});
