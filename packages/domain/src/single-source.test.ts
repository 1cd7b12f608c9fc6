// The domain is the one place clinical numbering is computed: the web and the API call it, and
// no second implementation of the FDI ↔ Universal conversion may appear beside it.
import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const repoRoot = path.resolve(import.meta.dirname, '../../..');

function sourceFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return entry.name === 'node_modules' || entry.name === 'dist' ? [] : sourceFiles(full);
    return /\.(ts|tsx)$/.test(entry.name) && !/\.test\.tsx?$|\.spec\.ts$/.test(entry.name) ? [full] : [];
  });
}

describe('single source of tooth numbering', () => {
  it('finds the conversion defined in packages/domain (the scan itself works)', () => {
    const here = sourceFiles(path.join(repoRoot, 'packages/domain/src')).filter((f) =>
      /function\s+fdiToUniversal\b/.test(fs.readFileSync(f, 'utf8')),
    );
    expect(here.map((f) => path.basename(f))).toEqual(['tooth-numbering.ts']);
  });

  it('has no second implementation of the FDI ↔ Universal conversion in the web or the API', () => {
    const offenders = ['apps/web/src', 'apps/api/src']
      .flatMap((dir) => sourceFiles(path.join(repoRoot, dir)))
      .filter((file) =>
        /function\s+(fdiToUniversal|universalToFdi)\b|(fdiToUniversal|universalToFdi)\s*=\s*\(/.test(
          fs.readFileSync(file, 'utf8'),
        ),
      )
      .map((file) => path.relative(repoRoot, file));
    expect(offenders).toEqual([]);
  });
});
