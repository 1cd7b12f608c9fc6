// A part entered in error (an amended insert change) was never fitted, yet its row stays. Every read
// of component_instances must therefore say which parts it means (parts-in-place.ts): in place,
// fitted at some time, or — only where an entry is shown marked — all of them. Session 9 found
// three reads (lot look-up, referral summary, records out) that listed such a part as fitted; this
// keeps the next query from doing the same. A file that reads the table must use one of the
// definitions, or be listed below with the reason it reads every row.
import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const src = path.resolve(import.meta.dirname, '..');

/** Files that read every row on purpose, with why. */
const READS_EVERY_ROW: Record<string, string> = {
  'sites/timeline.repository.ts': 'the Timeline shows every entry, an entered-in-error part marked with its reason',
  'catalogue/catalogue.repository.ts': 'a catalogue version any row refers to is "in use" and cannot change in place',
};

/** The ways a query may say which parts it means. */
const SAYS_WHICH =
  /\b(partInPlace|partWasFitted|partInPlaceSql|partWasFittedSql)\(|enteredInErrorAt|entered_in_error_at/;
/** A read of the table: Drizzle's from/join, or hand-written SQL. */
const READS =
  /\.(from|innerJoin|leftJoin)\(componentInstances\b|\b(from|join)\s+(component_instances\b|\$\{componentInstances\})/;

function sourceFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return entry.name === 'schema' || entry.name === 'seed' ? [] : sourceFiles(full);
    return entry.name.endsWith('.ts') && !entry.name.endsWith('.spec.ts') ? [full] : [];
  });
}

describe('every read of component_instances says which parts it means', () => {
  const files = sourceFiles(src).map((file) => ({
    name: path.relative(src, file).split(path.sep).join('/'),
    text: fs.readFileSync(file, 'utf8'),
  }));
  const readers = files.filter((f) => READS.test(f.text));

  it('finds the readers (the scan itself works)', () => {
    expect(readers.map((f) => f.name)).toEqual(
      expect.arrayContaining([
        'outcomes/lot-lookup.repository.ts',
        'sites/sites.repository.ts',
        ...Object.keys(READS_EVERY_ROW),
      ]),
    );
    expect(READS.test('from component_instances ci join components co')).toBe(true);
    expect(READS.test('exists (select 1 from ${componentInstances} ci')).toBe(true);
    expect(SAYS_WHICH.test('where ci.removed_on is null')).toBe(false);
  });

  it('uses partInPlace / partWasFitted, or is listed as reading every row', () => {
    const unsaid = readers.filter((f) => !(f.name in READS_EVERY_ROW) && !SAYS_WHICH.test(f.text)).map((f) => f.name);
    expect(unsaid).toEqual([]);
  });
});
