// Reading and writing a practice's dates in each order (issue 15 §7). Sources: ISO 8601-1:2019
// §5.2.2 (calendar date, year-month-day, YYYY-MM-DD); the Gregorian leap-year rule (a year divisible
// by 4, except centuries not divisible by 400; ISO 8601-1 §3.2.1 [memory for the clause number]);
// day/month/year as written in the UK and month/day/year in the US, with the week starting on
// Monday and Sunday respectively [common practice]; the written forms are the Unicode CLDR data
// for en-GB and en-US that Intl uses.
import { describe, expect, it } from 'vitest';
import { DATE_FORMATS, type DateFormat } from './enums.js';
import { FIRST_DAY_OF_WEEK, readTypedDate, writeCalendarDate, writeInstant } from './dates.js';

describe('01/02/2026 in each order', () => {
  it('is 1 February where the day comes first', () => {
    expect(readTypedDate('01/02/2026', 'day-month-year')).toEqual({ iso: '2026-02-01' });
  });
  it('is 2 January where the month comes first', () => {
    expect(readTypedDate('01/02/2026', 'month-day-year')).toEqual({ iso: '2026-01-02' });
  });
  it('is refused where the year comes first: either number could be the day', () => {
    const read = readTypedDate('01/02/2026', 'year-month-day');
    expect(read.iso).toBeUndefined();
    expect(read.problem).toMatch(/either number could be the day/);
    expect(read.problem).toMatch(/year first/);
  });
});

describe.each(DATE_FORMATS)('reading in %s', (format: DateFormat) => {
  it('always reads a year first (ISO 8601) and a month in words', () => {
    for (const text of [
      '2026-03-12',
      '2026/3/12',
      '12 Mar 2026',
      '12 March 2026',
      'Mar 12, 2026',
      'march 12 2026',
      '2026 Mar 12',
    ])
      expect(readTypedDate(text, format)).toEqual({ iso: '2026-03-12' });
    expect(readTypedDate('12 Sept 2026', format)).toEqual({ iso: '2026-09-12' });
  });

  it('refuses impossible dates, saying why', () => {
    expect(readTypedDate('2026-02-29', format).problem).toBe('There is no such day: February 2026 has 28 days');
    expect(readTypedDate('2026-04-31', format).problem).toBe('There is no such day: April 2026 has 30 days');
    expect(readTypedDate('2026-13-01', format).problem).toMatch(/There is no month 13/);
    expect(readTypedDate('31 Feb 2026', format).problem).toMatch(/February 2026 has 28 days/);
    expect(readTypedDate('1900-02-29', format).problem).toMatch(/February 1900 has 28 days/);
  });

  it('accepts leap days of leap years (2024, 2000)', () => {
    expect(readTypedDate('2024-02-29', format)).toEqual({ iso: '2024-02-29' });
    expect(readTypedDate('29 Feb 2000', format)).toEqual({ iso: '2000-02-29' });
  });

  it('refuses two-digit years and text that is not a date', () => {
    expect(readTypedDate('12 Mar 26', format).problem).toMatch(/year in full/);
    expect(readTypedDate('12/03/26', format).problem).toMatch(/year in full/);
    expect(readTypedDate('12 Marz 2026', format).problem).toMatch(/is not a month/);
    expect(readTypedDate('soon', format).problem).toMatch(/^Type a date as /);
    expect(readTypedDate('', format).problem).toMatch(/^Type a date as /);
  });

  it('reads back what it writes', () => {
    for (const iso of ['2026-03-12', '1961-04-17', '2024-02-29', '2026-12-01'])
      for (const style of ['short', 'long'] as const)
        expect(readTypedDate(writeCalendarDate(iso, format, style), format)).toEqual({ iso });
  });
});

describe('numbers read in the practice order', () => {
  it('day/month/year: 13/02/2026 is 13 February; 02/13/2026 has no month 13', () => {
    expect(readTypedDate('13/02/2026', 'day-month-year')).toEqual({ iso: '2026-02-13' });
    expect(readTypedDate('13.2.2026', 'day-month-year')).toEqual({ iso: '2026-02-13' });
    expect(readTypedDate('02/13/2026', 'day-month-year').problem).toMatch(/no month 13/);
  });
  it('month/day/year: 02/13/2026 is 13 February; 13/02/2026 has no month 13', () => {
    expect(readTypedDate('02/13/2026', 'month-day-year')).toEqual({ iso: '2026-02-13' });
    expect(readTypedDate('13/02/2026', 'month-day-year').problem).toMatch(/no month 13/);
  });
  it('31/04/2026 is refused day first (April has 30 days)', () => {
    expect(readTypedDate('31/04/2026', 'day-month-year').problem).toMatch(/April 2026 has 30 days/);
  });
});

describe('writing in each order', () => {
  it('writes a calendar date without a time-zone shift', () => {
    expect(writeCalendarDate('2026-03-01', 'day-month-year')).toBe('1 Mar 2026');
    expect(writeCalendarDate('2026-03-01', 'day-month-year', 'long')).toBe('1 March 2026');
    expect(writeCalendarDate('2026-03-01', 'month-day-year')).toBe('Mar 1, 2026');
    expect(writeCalendarDate('2026-03-01', 'month-day-year', 'long')).toBe('March 1, 2026');
    expect(writeCalendarDate('2026-03-01', 'year-month-day')).toBe('2026-03-01');
    expect(writeCalendarDate('2026-03-01', 'year-month-day', 'long')).toBe('2026-03-01');
  });
  it('writes every day of a leap and a common year as Intl writes it (CLDR en-GB, en-US)', () => {
    // The table in dates.ts stands in for Intl on calendar dates; Intl is the reference it must match.
    const intl = (locale: string, month: 'short' | 'long') =>
      new Intl.DateTimeFormat(locale, { day: 'numeric', month, year: 'numeric', timeZone: 'UTC' });
    const expected = {
      'day-month-year': { short: intl('en-GB', 'short'), long: intl('en-GB', 'long') },
      'month-day-year': { short: intl('en-US', 'short'), long: intl('en-US', 'long') },
    } as const;
    const days = [2024, 2026].flatMap((year) =>
      Array.from({ length: year === 2024 ? 366 : 365 }, (_, d) => new Date(Date.UTC(year, 0, 1 + d))),
    );
    for (const at of [...days, new Date(Date.UTC(1000, 0, 1)), new Date(Date.UTC(9999, 11, 31))])
      for (const [format, styles] of Object.entries(expected) as [DateFormat, (typeof expected)['day-month-year']][])
        for (const style of ['short', 'long'] as const)
          expect(writeCalendarDate(at.toISOString().slice(0, 10), format, style)).toBe(styles[style].format(at));
    expect(writeCalendarDate('2026-09-03', 'day-month-year')).toBe('3 Sept 2026');
    expect(writeCalendarDate('2026-09-03', 'month-day-year')).toBe('Sep 3, 2026');
  });
  it('writes a day past the end of its month as Intl always has (rolled over)', () => {
    expect(writeCalendarDate('2026-02-30', 'day-month-year')).toBe('2 Mar 2026');
    expect(writeCalendarDate('0999-12-31', 'month-day-year', 'long')).toBe(
      new Intl.DateTimeFormat('en-US', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' }).format(
        new Date(Date.UTC(999, 11, 31)),
      ),
    );
  });
  it('writes an instant with its time in the given zone', () => {
    const at = '2026-03-01T13:05:00Z';
    expect(writeInstant(at, 'year-month-day', 'UTC')).toBe('2026-03-01 13:05');
    expect(writeInstant(at, 'year-month-day', 'Asia/Tokyo')).toBe('2026-03-01 22:05');
    expect(writeInstant(at, 'day-month-year', 'UTC')).toMatch(/^1 Mar 2026,? 13:05$/);
    expect(writeInstant(at, 'month-day-year', 'UTC')).toMatch(/^Mar 1, 2026,? 01:05\s?PM$/);
  });
  it('starts the week on Monday except where the month comes first', () => {
    expect(FIRST_DAY_OF_WEEK).toEqual({ 'day-month-year': 1, 'month-day-year': 0, 'year-month-day': 1 });
  });
});
