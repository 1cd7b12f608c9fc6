// Tooth numbering in the Arch comes from @torquetrail/domain (the scan for a second copy of the
// conversion lives in packages/domain/src/single-source.test.ts).
import { fdiToUniversal, TOOTH_POSITIONS_PERMANENT, TOOTH_POSITIONS_PRIMARY } from '@torquetrail/domain';
import { describe, expect, it } from 'vitest';
import { describeCell } from './cell-description';

describe('Arch numbering', () => {
  it('names every permanent and primary position with the domain’s Universal code (ISO 3950 → HL7 Universal)', () => {
    for (const fdi of [...TOOTH_POSITIONS_PERMANENT, ...TOOTH_POSITIONS_PRIMARY]) {
      expect(describeCell(fdi, 'universal', { type: 'natural' })).toBe(`${fdiToUniversal(fdi)}, natural tooth`);
      expect(describeCell(fdi, 'fdi', { type: 'natural' })).toBe(`${fdi}, natural tooth`);
    }
  });
});
