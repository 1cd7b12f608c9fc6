// Issue 15 §7: dates are typed and shown in one format, the practice's, everywhere. lib/dates.ts
// is the one module that formats and reads dates for people, and lib/components/date-input.tsx the
// one date field; this scan fails on any other date formatting or native date input in apps/web/src.
import { describe, expect, it } from 'vitest';

// Vite reads the sources as text (the web's type-check has no Node types).
const sources: Record<string, string> = import.meta.glob(['../**/*.{ts,tsx}', '!../**/*.test.{ts,tsx}'], {
  query: '?raw',
  import: 'default',
  eager: true,
});
// Vite names files beside this one from here ('./dates.ts'), the rest from the glob's root.
const OWNERS = new Set(['./dates.ts', './components/date-input.tsx']);

/** Ways of writing or typing a date other than through lib/dates.ts. */
const OTHER_DATE_FORMATTING: [string, RegExp][] = [
  ['Intl.DateTimeFormat', /Intl\.DateTimeFormat/],
  ['toLocaleDateString / toLocaleTimeString / toLocaleString', /\.toLocale(Date|Time)?String\(/],
  ['a native date input (shows the browser’s format)', /type=["'](date|datetime-local|month|week)["']/],
  ['a date put together from its parts', /\.get(UTC)?(FullYear|Month|Date)\(\)/],
  // JSX text of an ISO date not passed through a formatter ("saved {v.at.slice(0, 10)}").
  ['an ISO date shown as stored', /[^=]>[^<>{}]*\{(?![^}]*format)[^}]*\.(slice\(0, 10\)|toISOString\(\))[^}]*\}/],
  // A text field asking for YYYY-MM-DD (the patient form's date of birth did): the date field
  // shows the practice's own example and reads the practice's order.
  ['a field that asks for YYYY-MM-DD', /(placeholder|help)\s*[:=]\s*\{?\s*['"`][^'"`\n]*YYYY-MM-DD/],
];

describe('one date format, from lib/dates.ts', () => {
  it('scans the web sources (the scan itself works)', () => {
    expect(Object.keys(sources)).toEqual(expect.arrayContaining([...OWNERS]));
    expect(Object.keys(sources).length).toBeGreaterThan(100);
    // The patterns catch what they are for.
    expect(OTHER_DATE_FORMATTING.filter(([, re]) => re.test('<InputGroup type="date" />'))).toHaveLength(1);
    expect(OTHER_DATE_FORMATTING.filter(([, re]) => re.test('{new Date(x).toLocaleString()}'))).toHaveLength(1);
    expect(OTHER_DATE_FORMATTING.filter(([, re]) => re.test('<em>saved {v.at.slice(0, 10)}</em>'))).toHaveLength(1);
    expect(OTHER_DATE_FORMATTING.filter(([, re]) => re.test("placeholder: 'YYYY-MM-DD',"))).toHaveLength(1);
    expect(OTHER_DATE_FORMATTING.filter(([, re]) => re.test('/** YYYY-MM-DD, or null */'))).toHaveLength(0);
  });

  it.each(OTHER_DATE_FORMATTING)('no %s outside lib/dates.ts', (_name, pattern) => {
    const offenders = Object.entries(sources)
      .filter(([file, text]) => !OWNERS.has(file) && pattern.test(text))
      .map(([file]) => file);
    expect(offenders).toEqual([]);
  });
});
