import { describe, it, expect } from 'vitest';
import * as fc from 'fast-check';
import {
  TOOTH_POSITIONS_PERMANENT,
  TOOTH_POSITIONS_PRIMARY,
  fdiToUniversal,
  formatTooth,
  isPrimaryTooth,
  isValidFdi,
  toothArch,
  toothKind,
  universalToFdi,
} from './tooth-numbering.js';
import { ToothPositionError, ValidationError } from './errors.js';

// Sources: ISO 3950 FDI two-digit notation [memory for the standard's text];
// HL7 ADAUniversalToothDesignationSystem, entries pair Universal with ISO designation [pub];
// conversion formulas [derived, match the HL7 table].
describe('fdiToUniversal — reference §3 check cases (HL7 ADA Universal table [pub], formulas [derived])', () => {
  it.each([
    [11, '8'],
    [18, '1'],
    [28, '16'],
    [36, '19'],
    [41, '25'],
    [55, 'A'],
    [85, 'T'],
  ])('FDI %i → Universal %s', (fdi, universal) => {
    expect(fdiToUniversal(fdi)).toBe(universal);
    expect(universalToFdi(universal)).toBe(fdi);
  });

  it('quadrant corners follow the same path: 21 → 9, 38 → 17, 31 → 24, 48 → 32; 51 → E, 61 → F, 65 → J, 75 → K, 71 → O, 81 → P', () => {
    expect([21, 38, 31, 48].map(fdiToUniversal)).toEqual(['9', '17', '24', '32']);
    expect([51, 61, 65, 75, 71, 81].map(fdiToUniversal)).toEqual(['E', 'F', 'J', 'K', 'O', 'P']);
  });

  it.each([19, 9, 56, 0, 10, 20, 49, 50, 86, 91, 111, -11, 11.5, Number.NaN, Number.POSITIVE_INFINITY])(
    'rejects non-existent position %s with a RangeError (ISO 3950 [memory]: reference §3 "Reject 19, 09, 56, 0")',
    (fdi) => {
      expect(() => fdiToUniversal(fdi)).toThrow(RangeError);
      expect(() => fdiToUniversal(fdi)).toThrow(ToothPositionError);
      expect(() => fdiToUniversal(fdi)).toThrow(expect.objectContaining({ code: 'invalid-position' }));
    },
  );
});

describe('universalToFdi', () => {
  it('accepts lower-case primary letters [decision]', () => {
    expect(universalToFdi('a')).toBe(55);
    expect(universalToFdi('t')).toBe(85);
  });

  it.each(['0', '33', '01', ' 8', '8 ', 'U', 'Z', '', 'AA', '1.0', '-1'])('rejects %j with a RangeError', (code) => {
    expect(() => universalToFdi(code)).toThrow(RangeError);
  });

  it('rejects a non-string with a RangeError', () => {
    expect(() => universalToFdi(8 as unknown as string)).toThrow(RangeError);
  });
});

describe('position lists (drawing order upper right → upper left, lower left → lower right)', () => {
  it('permanent: 18..11, 21..28, 38..31, 41..48', () => {
    expect(TOOTH_POSITIONS_PERMANENT).toEqual([
      18, 17, 16, 15, 14, 13, 12, 11, 21, 22, 23, 24, 25, 26, 27, 28, 38, 37, 36, 35, 34, 33, 32, 31, 41, 42, 43, 44,
      45, 46, 47, 48,
    ]);
  });
  it('primary: 55..51, 61..65, 75..71, 81..85', () => {
    expect(TOOTH_POSITIONS_PRIMARY).toEqual([
      55, 54, 53, 52, 51, 61, 62, 63, 64, 65, 75, 74, 73, 72, 71, 81, 82, 83, 84, 85,
    ]);
  });
  it('Universal numbers run 1..32 and A..T along the drawing order (same path, reference §3)', () => {
    expect(TOOTH_POSITIONS_PERMANENT.map(fdiToUniversal)).toEqual(Array.from({ length: 32 }, (_, i) => String(i + 1)));
    expect(TOOTH_POSITIONS_PRIMARY.map(fdiToUniversal).join('')).toBe('ABCDEFGHIJKLMNOPQRST');
  });
  it('lists are frozen', () => {
    expect(Object.isFrozen(TOOTH_POSITIONS_PERMANENT)).toBe(true);
    expect(Object.isFrozen(TOOTH_POSITIONS_PRIMARY)).toBe(true);
  });
});

describe('property: FDI → Universal → FDI is the identity on all 52 positions (fast-check)', () => {
  const all = [...TOOTH_POSITIONS_PERMANENT, ...TOOTH_POSITIONS_PRIMARY];
  it('has 52 distinct positions and 52 distinct Universal codes', () => {
    expect(new Set(all).size).toBe(52);
    expect(new Set(all.map(fdiToUniversal)).size).toBe(52);
  });
  it('round-trips', () => {
    fc.assert(fc.property(fc.constantFrom(...all), (fdi) => universalToFdi(fdiToUniversal(fdi)) === fdi));
  });
  it('every integer 0..99 is either one of the 52 or rejected', () => {
    fc.assert(
      fc.property(fc.integer({ min: -20, max: 120 }), (n) => {
        if (all.includes(n)) return isValidFdi(n) && universalToFdi(fdiToUniversal(n)) === n;
        return (
          !isValidFdi(n) &&
          (() => {
            try {
              fdiToUniversal(n);
              return false;
            } catch (e) {
              return e instanceof RangeError;
            }
          })()
        );
      }),
    );
  });
});

describe('toothKind, toothArch, isPrimaryTooth, formatTooth [common practice anatomy]', () => {
  it.each([
    [11, 'incisor'],
    [12, 'incisor'],
    [13, 'canine'],
    [14, 'premolar'],
    [15, 'premolar'],
    [16, 'molar'],
    [18, 'molar'],
    [33, 'canine'],
    [46, 'molar'],
    [51, 'incisor'],
    [53, 'canine'],
    [54, 'molar'],
    [85, 'molar'],
  ] as const)('%i is a %s', (fdi, kind) => {
    expect(toothKind(fdi)).toBe(kind);
  });
  it('arches', () => {
    expect([11, 28, 55, 65].map(toothArch)).toEqual(['upper', 'upper', 'upper', 'upper']);
    expect([31, 48, 71, 85].map(toothArch)).toEqual(['lower', 'lower', 'lower', 'lower']);
  });
  it('primary', () => {
    expect(isPrimaryTooth(51)).toBe(true);
    expect(isPrimaryTooth(48)).toBe(false);
    expect(() => isPrimaryTooth(19)).toThrow(RangeError);
    expect(() => toothKind(19)).toThrow(RangeError);
  });
  it('formatTooth', () => {
    expect(formatTooth(36, 'fdi')).toBe('36');
    expect(formatTooth(36, 'universal')).toBe('19');
    expect(formatTooth(55, 'universal')).toBe('A');
    expect(() => formatTooth(19, 'fdi')).toThrow(RangeError);
    expect(() => formatTooth(11, 'palmer' as 'fdi')).toThrow(ValidationError);
  });
});
