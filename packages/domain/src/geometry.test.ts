import { describe, it, expect } from 'vitest';
import * as fc from 'fast-check';
import { divergenceDeg, type Vec3 } from './geometry.js';
import { ValidationError } from './errors.js';

// θ = arccos(u·v / (|u||v|)) [derived]; limit 15° from Jang HK et al. 2011, Int J Oral Maxillofac Implants 26:1011–1015 [pub].

describe('divergenceDeg — reference §9 check cases [derived]', () => {
  it('(0,0,1) vs (0,0,1) → 0°', () => expect(divergenceDeg([0, 0, 1], [0, 0, 1])).toBe(0));
  it('(0,0,1) vs (1,0,1) → 45.0°', () => expect(divergenceDeg([0, 0, 1], [1, 0, 1])).toBeCloseTo(45, 10));
});

describe('divergenceDeg — edge cases', () => {
  it('length does not matter', () => expect(divergenceDeg([0, 0, 5], [0, 3, 3])).toBeCloseTo(45, 10));
  it('perpendicular → 90°, opposite → 180°', () => {
    expect(divergenceDeg([1, 0, 0], [0, 1, 0])).toBeCloseTo(90, 10);
    expect(divergenceDeg([0, 0, 1], [0, 0, -2])).toBe(180);
  });
  it('parallel vectors of awkward length give exactly 0 (cosine clamped, never NaN)', () => {
    const a: Vec3 = [0.1, 0.2, 0.3];
    const b: Vec3 = [0.30000000000000004, 0.6000000000000001, 0.8999999999999999];
    const d = divergenceDeg(a, b);
    expect(Number.isNaN(d)).toBe(false);
    expect(d).toBeLessThan(1e-6);
  });
  it('huge and tiny components neither overflow nor underflow', () => {
    expect(divergenceDeg([1e300, 0, 1e300], [0, 0, 1e-300])).toBeCloseTo(45, 10);
  });
  it('15° tilt computed from tan', () => {
    const t = (15 * Math.PI) / 180;
    expect(divergenceDeg([0, 0, 1], [Math.sin(t), 0, Math.cos(t)])).toBeCloseTo(15, 10);
  });
  it.each<[string, unknown, unknown, string]>([
    ['zero vector a', [0, 0, 0], [0, 0, 1], 'zero-vector'],
    ['zero vector b', [0, 0, 1], [0, 0, 0], 'zero-vector'],
    ['NaN', [Number.NaN, 0, 1], [0, 0, 1], 'not-a-number'],
    ['Infinity', [0, 0, 1], [Number.POSITIVE_INFINITY, 0, 1], 'not-a-number'],
    ['2 components', [0, 1], [0, 0, 1], 'bad-value'],
    ['not an array', 'up', [0, 0, 1], 'bad-value'],
  ])('%s → ValidationError %s', (_n, a, b, code) => {
    expect(() => divergenceDeg(a as Vec3, b as Vec3)).toThrow(ValidationError);
    expect(() => divergenceDeg(a as Vec3, b as Vec3)).toThrow(expect.objectContaining({ code }));
  });
});

describe('property (fast-check): divergence is symmetric and in [0°, 180°]', () => {
  const comp = fc.double({ min: -1e6, max: 1e6, noNaN: true, noDefaultInfinity: true });
  const vec = fc.tuple(comp, comp, comp).filter(([x, y, z]) => x !== 0 || y !== 0 || z !== 0) as fc.Arbitrary<Vec3>;
  it('symmetric', () => {
    fc.assert(fc.property(vec, vec, (a, b) => divergenceDeg(a, b) === divergenceDeg(b, a)));
  });
  it('in range', () => {
    fc.assert(
      fc.property(vec, vec, (a, b) => {
        const d = divergenceDeg(a, b);
        return d >= 0 && d <= 180;
      }),
    );
  });
  it('a vector with itself is ~0°, with its negation ~180°', () => {
    fc.assert(
      fc.property(vec, (a) => divergenceDeg(a, a) < 1e-5 && divergenceDeg(a, [-a[0], -a[1], -a[2]]) > 180 - 1e-5),
    );
  });
});
