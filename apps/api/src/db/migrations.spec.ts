// Schema and migrations must stay in step: generating again from the schema must produce nothing.
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const root = path.resolve(import.meta.dirname, '../../../..');

describe('drizzle migrations', () => {
  it('are what drizzle-kit generates from the current schema (no pending change)', () => {
    // drizzle-kit wants a path relative to the working folder for --out.
    const scratch = path.join('.local', 'tmp', `drift-${process.pid}-${Date.now()}`);
    fs.mkdirSync(path.join(root, scratch), { recursive: true });
    fs.cpSync(path.join(root, 'drizzle'), path.join(root, scratch), { recursive: true });
    try {
      const before = fs.readdirSync(path.join(root, scratch)).sort();
      const out = execFileSync(
        process.execPath,
        [
          path.join(root, 'node_modules/drizzle-kit/bin.cjs'),
          'generate',
          '--dialect=postgresql',
          '--schema=./apps/api/src/db/schema/index.ts',
          `--out=./${scratch}`,
        ],
        { cwd: root, encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] },
      );
      expect(out).toContain('No schema changes');
      expect(fs.readdirSync(path.join(root, scratch)).sort()).toEqual(before);
    } finally {
      fs.rmSync(path.join(root, scratch), { recursive: true, force: true });
    }
  }, 60_000);

  it('are numbered in sequence with a journal entry for each SQL file', () => {
    const journal = JSON.parse(fs.readFileSync(path.join(root, 'drizzle/meta/_journal.json'), 'utf8')) as {
      entries: { idx: number; tag: string }[];
    };
    const sqlFiles = fs
      .readdirSync(path.join(root, 'drizzle'))
      .filter((f) => f.endsWith('.sql'))
      .sort();
    expect(journal.entries.map((e) => `${e.tag}.sql`)).toEqual(sqlFiles);
    expect(journal.entries.map((e) => e.idx)).toEqual(sqlFiles.map((_, i) => i));
  });
});
