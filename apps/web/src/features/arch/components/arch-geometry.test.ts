import { TOOTH_POSITIONS_PERMANENT, TOOTH_POSITIONS_PRIMARY } from '@torquetrail/domain';
import { describe, expect, it } from 'vitest';
import { type ArchCell, layoutArches } from './arch-geometry';

const layout = layoutArches(TOOTH_POSITIONS_PERMANENT);
const cell = (fdi: number): ArchCell => {
  const found = layout.cells.find((c) => c.fdi === fdi);
  if (!found) throw new Error(`no cell ${fdi}`);
  return found;
};

describe('layoutArches (permanent)', () => {
  it('lays out 32 cells, 16 per arch, each position once', () => {
    expect(layout.cells).toHaveLength(32);
    expect(layout.cells.filter((c) => c.arch === 'upper')).toHaveLength(16);
    expect(new Set(layout.cells.map((c) => c.fdi)).size).toBe(32);
  });

  it('draws the upper arch above the lower', () => {
    const upperLowest = Math.max(...layout.cells.filter((c) => c.arch === 'upper').map((c) => c.y));
    const lowerHighest = Math.min(...layout.cells.filter((c) => c.arch === 'lower').map((c) => c.y));
    expect(upperLowest).toBeLessThan(lowerHighest);
  });

  it("puts the patient's right on the viewer's left", () => {
    expect(cell(18).x).toBeLessThan(cell(11).x);
    expect(cell(11).x).toBeLessThan(cell(21).x);
    expect(cell(21).x).toBeLessThan(cell(28).x);
    expect(cell(48).x).toBeLessThan(cell(41).x);
    expect(cell(41).x).toBeLessThan(cell(31).x);
    expect(cell(31).x).toBeLessThan(cell(38).x);
  });

  it('numbers columns left to right in drawing order', () => {
    const upper = layout.cells.filter((c) => c.arch === 'upper').sort((a, b) => a.column - b.column);
    expect(upper.map((c) => c.fdi)).toEqual([18, 17, 16, 15, 14, 13, 12, 11, 21, 22, 23, 24, 25, 26, 27, 28]);
    const lower = layout.cells.filter((c) => c.arch === 'lower').sort((a, b) => a.column - b.column);
    expect(lower.map((c) => c.fdi)).toEqual([48, 47, 46, 45, 44, 43, 42, 41, 31, 32, 33, 34, 35, 36, 37, 38]);
  });

  it('makes molar cells wider than premolars, and premolars wider than canines and incisors', () => {
    expect(cell(16).width).toBeGreaterThan(cell(14).width);
    expect(cell(14).width).toBeGreaterThan(cell(13).width);
    expect(cell(13).width).toBeGreaterThan(cell(11).width);
    expect(cell(36).width).toBeGreaterThan(cell(31).width);
  });

  it('keeps every pair of cells apart by at least their half widths (no overlap)', () => {
    for (const a of layout.cells) {
      for (const b of layout.cells) {
        if (a === b) continue;
        const distance = Math.hypot(a.x - b.x, a.y - b.y);
        expect(distance, `${a.fdi}–${b.fdi}`).toBeGreaterThan((a.width + b.width) / 2);
      }
    }
  });

  it('turns cells with the curve, mirror-symmetric about the midline', () => {
    expect(Math.abs(cell(11).rotation)).toBeLessThan(10);
    expect(cell(18).rotation).toBeLessThan(-30);
    expect(cell(28).rotation).toBeCloseTo(-cell(18).rotation, 6);
    expect(cell(28).x - layout.width / 2).toBeCloseTo(layout.width / 2 - cell(18).x, 6);
    expect(cell(38).rotation).toBeCloseTo(-cell(48).rotation, 6);
  });

  it('places each number outside its curve and everything inside the view box', () => {
    expect(cell(11).label.y).toBeLessThan(cell(11).y);
    expect(cell(41).label.y).toBeGreaterThan(cell(41).y);
    expect(cell(18).label.x).toBeLessThan(cell(18).x);
    expect(cell(28).label.x).toBeGreaterThan(cell(28).x);
    for (const c of layout.cells) {
      const reach = Math.max(c.width, c.height) / 2;
      for (const [x, y] of [
        [c.x - reach, c.y - reach],
        [c.x + reach, c.y + reach],
        [c.label.x, c.label.y],
      ]) {
        expect(x).toBeGreaterThan(0);
        expect(x).toBeLessThan(layout.width);
        expect(y).toBeGreaterThan(0);
        expect(y).toBeLessThan(layout.height);
      }
    }
  });

  it('is pure: the same positions give the same layout', () => {
    expect(layoutArches(TOOTH_POSITIONS_PERMANENT)).toEqual(layout);
  });
});

describe('layoutArches (primary)', () => {
  it('lays out 20 cells with the same orientation rules', () => {
    const primary = layoutArches(TOOTH_POSITIONS_PRIMARY);
    expect(primary.cells).toHaveLength(20);
    const at = (fdi: number) => primary.cells.find((c) => c.fdi === fdi)!;
    expect(at(55).x).toBeLessThan(at(51).x);
    expect(at(51).x).toBeLessThan(at(61).x);
    expect(at(85).x).toBeLessThan(at(75).x);
    expect(at(51).y).toBeLessThan(at(81).y);
  });
});
