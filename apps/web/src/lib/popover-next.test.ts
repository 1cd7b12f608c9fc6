// Blueprint's classic Popover (and Tooltip, built on it) warns under React 19 that it positions its
// content wrongly; the app uses PopoverNext. The browser test e2e/popover-react19.e2e.ts watches
// the console; this scan keeps the classic ones from coming back on pages it does not open.
import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const src = path.resolve(import.meta.dirname, '..');
const files = (dir: string): string[] =>
  fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const full = path.join(dir, e.name);
    if (e.isDirectory()) return files(full);
    return /\.tsx?$/.test(e.name) && !/\.test\.tsx?$/.test(e.name) ? [full] : [];
  });

describe('no classic Blueprint popover', () => {
  it('finds the PopoverNext import (the scan itself works)', () => {
    const users = files(src).filter((f) => /\bPopoverNext\b/.test(fs.readFileSync(f, 'utf8')));
    expect(users.length).toBeGreaterThan(0);
  });
  it('imports neither Popover nor Tooltip from @blueprintjs/core', () => {
    const offenders = files(src).filter((f) =>
      /import\s*\{[^}]*\b(Popover|Tooltip)\b[^}]*\}\s*from\s*'@blueprintjs\/core'/s.test(fs.readFileSync(f, 'utf8')),
    );
    expect(offenders.map((f) => path.relative(src, f))).toEqual([]);
  });
});
