// Tooth numbering in the Arch comes from @torquetrail/domain, never from a second copy.
import fs from 'node:fs';
import path from 'node:path';
import { fdiToUniversal, TOOTH_POSITIONS_PERMANENT, TOOTH_POSITIONS_PRIMARY } from '@torquetrail/domain';
import { describe, expect, it } from 'vitest';
import { describeCell } from './cell-description';

const repoRoot = path.resolve(import.meta.dirname, '../../../../../..');

function sourceFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return entry.name === 'node_modules' || entry.name === 'dist' ? [] : sourceFiles(full);
    return /\.(ts|tsx)$/.test(entry.name) && !/\.test\.tsx?$|\.spec\.ts$/.test(entry.name) ? [full] : [];
  });
}

describe('Arch numbering', () => {
  it('names every permanent and primary position with the domain’s Universal code (ISO 3950 → HL7 Universal)', () => {
    for (const fdi of [...TOOTH_POSITIONS_PERMANENT, ...TOOTH_POSITIONS_PRIMARY]) {
      expect(describeCell(fdi, 'universal', { type: 'natural' })).toBe(`${fdiToUniversal(fdi)}, natural tooth`);
      expect(describeCell(fdi, 'fdi', { type: 'natural' })).toBe(`${fdi}, natural tooth`);
    }
  });

  it('has no second implementation of the FDI ↔ Universal conversion in the web or the API', () => {
    const offenders = ['apps/web/src', 'apps/api/src']
      .flatMap((dir) => sourceFiles(path.join(repoRoot, dir)))
      .filter((file) => /function\s+(fdiToUniversal|universalToFdi)\b|(fdiToUniversal|universalToFdi)\s*=\s*\(/.test(fs.readFileSync(file, 'utf8')))
      .map((file) => path.relative(repoRoot, file));
    expect(offenders).toEqual([]);
  });
});
