// Blueprint's classic Popover (and Tooltip, built on it) warns under React 19 that it positions its
// content wrongly; the app uses PopoverNext. The browser test e2e/popover-react19.e2e.ts watches
// the console; this scan keeps the classic ones from coming back on pages it does not open.
import { describe, expect, it } from 'vitest';

// Vite reads the sources as text (the web's type-check has no Node types).
const sources: Record<string, string> = import.meta.glob(['../**/*.{ts,tsx}', '!../**/*.test.{ts,tsx}'], {
  query: '?raw',
  import: 'default',
  eager: true,
});

describe('no classic Blueprint popover', () => {
  it('finds the PopoverNext import (the scan itself works)', () => {
    expect(Object.values(sources).filter((text) => /\bPopoverNext\b/.test(text)).length).toBeGreaterThan(0);
  });
  it('imports neither Popover nor Tooltip from @blueprintjs/core', () => {
    const offenders = Object.entries(sources)
      .filter(([, text]) => /import\s*\{[^}]*\b(Popover|Tooltip)\b[^}]*\}\s*from\s*'@blueprintjs\/core'/s.test(text))
      .map(([file]) => file);
    expect(offenders).toEqual([]);
  });
});
