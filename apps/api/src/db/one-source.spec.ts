// Each enumeration is written once: as an exported `as const` list in packages/contracts,
// packages/domain or packages/authz. Anywhere else in the code a literal union or array with
// exactly the values of such a list is a second copy that can drift (it did: the torque verdict
// was written four times). The database enums are built from the same lists (enums.ts) and the
// migration check (migrations.spec.ts) fails if they differ from the SQL.
import fs from 'node:fs';
import path from 'node:path';
import * as authz from '@torquetrail/authz';
import * as contracts from '@torquetrail/contracts';
import * as domain from '@torquetrail/domain';
import { describe, expect, it } from 'vitest';

const root = path.resolve(import.meta.dirname, '../../../..');
const dirs = ['apps/api/src', 'apps/web/src', 'packages/domain/src', 'packages/contracts/src', 'packages/authz/src'];

function sourceFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return entry.name === 'node_modules' || entry.name === 'dist' ? [] : sourceFiles(full);
    return /\.tsx?$/.test(entry.name) && !/\.(test|spec)\.tsx?$/.test(entry.name) ? [full] : [];
  });
}

/** Every exported list of two or more strings, by name. */
const lists = new Map<string, readonly string[]>();
for (const exports of [authz, contracts, domain] as Record<string, unknown>[]) {
  for (const [name, value] of Object.entries(exports)) {
    if (Array.isArray(value) && value.length >= 2 && value.every((v) => typeof v === 'string')) lists.set(name, value);
  }
}

const sameSet = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((v) => b.includes(v));
// 'a' | 'b' | …, and ['a', 'b', …] (across lines).
const literalUnion = /'[^'\n]+'(?:\s*\|\s*'[^'\n]+')+/g;
const literalArray = /\[\s*'[^'\n]+'(?:\s*,\s*'[^'\n]+')+\s*,?\s*\]/g;
const literals = (text: string) => [...text.matchAll(/'([^'\n]+)'/g)].map((m) => m[1]);

function copies(file: string): string[] {
  const text = fs.readFileSync(file, 'utf8');
  return [...text.matchAll(literalUnion), ...text.matchAll(literalArray)].flatMap((match) => {
    const values = [...new Set(literals(match[0]))];
    // Several exported names may hold the same list (an alias such as `A = B`): any one of them
    // being defined here makes this its definition.
    const names = [...lists].filter(([, listValues]) => sameSet(values, listValues)).map(([name]) => name);
    if (names.length === 0) return [];
    // The list's own definition: `export const NAME = [` (or `= Object.freeze([`) on the line of the match.
    const lineStart = text.lastIndexOf('\n', match.index) + 1;
    const before = text.slice(lineStart, match.index);
    if (names.some((name) => new RegExp(`export const ${name}\\b[^=]*=`).test(before))) return [];
    return [`${path.relative(root, file)}: ${match[0].replace(/\s+/g, ' ')} repeats ${names.join(' / ')}`];
  });
}

describe('one source per enumeration', () => {
  it('finds the shared lists and their definitions (the scan itself works)', () => {
    expect([...lists.keys()]).toEqual(
      expect.arrayContaining(['ROLES', 'TORQUE_VERDICTS', 'TORQUE_REASONS', 'CONNECTIONS', 'PROBING_POSITIONS']),
    );
    // The torque verdicts and most other domain lists are defined in choices.ts.
    const domainChoices = path.join(root, 'packages/domain/src/choices.ts');
    expect(fs.readFileSync(domainChoices, 'utf8').match(literalArray)?.length).toBeGreaterThan(0);
    expect(copies(domainChoices)).toEqual([]);
  });

  it('no literal union or array elsewhere repeats a shared list', () => {
    const offenders = dirs.flatMap((dir) => sourceFiles(path.join(root, dir))).flatMap(copies);
    expect(offenders).toEqual([]);
  });
});
