import { afterEach, describe, expect, it } from 'vitest';
import {
  ageInYears,
  calendarDateToLocal,
  dateProblem,
  dateTypingExample,
  firstDayOfWeek,
  formatDate,
  formatDateTime,
  formatLongDate,
  localNow,
  localToCalendarDate,
  localToday,
  parseDate,
  setDateFormat,
} from './dates';

afterEach(() => setDateFormat('day-month-year'));

describe('dates', () => {
  it('writes calendar dates without a time-zone shift', () => {
    expect(formatLongDate('2026-03-12')).toBe('12 March 2026');
    expect(formatDate('2026-03-01')).toBe('1 Mar 2026');
  });
  it('counts whole years, turning on the birthday', () => {
    expect(ageInYears('1961-02-03', new Date(2026, 1, 2))).toBe(64);
    expect(ageInYears('1961-02-03', new Date(2026, 1, 3))).toBe(65);
  });
});

describe('localToday and localNow (the viewer’s calendar, not UTC)', () => {
  it('take the local date, which differs from the UTC date around midnight', () => {
    // 23:30 local on 1 December is the same instant as some UTC time; the local fields are what count.
    const lateEvening = new Date(2026, 11, 1, 23, 30);
    expect(localToday(lateEvening)).toBe('2026-12-01');
    expect(localNow(lateEvening)).toBe('2026-12-01T23:30');
    const justAfterMidnight = new Date(2026, 11, 2, 0, 5);
    expect(localToday(justAfterMidnight)).toBe('2026-12-02');
  });
});

describe('parseDate: dates typed in the practice’s order (day, month, year)', () => {
  it('reads the shown format, the month in words, day-first numbers and ISO', () => {
    for (const text of ['12 Mar 2026', '12 March 2026', ' 12 mar 2026 ', '12/3/2026', '12.03.2026', '2026-03-12']) {
      expect(parseDate(text), text).toBe('2026-03-12');
    }
  });
  it('refuses what is not a real date, month-first American order included when impossible', () => {
    for (const text of ['31 Feb 2026', '3/13/2026', '12 Smarch 2026', '12/03/26', '', 'yesterday']) {
      expect(parseDate(text), text).toBeNull();
    }
  });
  it('round-trips with formatDate', () => {
    expect(parseDate(formatDate('2026-11-05'))).toBe('2026-11-05');
  });
});

// Sources for the orders: ISO 8601-1:2019 §5.2.2 (year-month-day); day/month/year in the UK and
// month/day/year in the US [common practice]. The same rules are tested in each order in
// packages/contracts/src/dates.test.ts; here, that the app follows the practice's setting.
describe('the practice’s date format, set from the session', () => {
  it('shows and reads 01/02/2026 per format', () => {
    setDateFormat('day-month-year');
    expect(parseDate('01/02/2026')).toBe('2026-02-01');
    expect(formatDate('2026-02-01')).toBe('1 Feb 2026');
    setDateFormat('month-day-year');
    expect(parseDate('01/02/2026')).toBe('2026-01-02');
    expect(formatDate('2026-01-02')).toBe('Jan 2, 2026');
    expect(formatLongDate('2026-01-02')).toBe('January 2, 2026');
    setDateFormat('year-month-day');
    expect(parseDate('01/02/2026')).toBeNull();
    expect(dateProblem('01/02/2026')).toMatch(/either number could be the day/);
    expect(formatDate('2026-01-02')).toBe('2026-01-02');
    expect(formatDateTime('2026-01-02T10:00:00Z')).toMatch(/^2026-01-0[12] \d\d:\d\d$/);
  });
  it('refuses impossible dates in every format, saying why', () => {
    for (const format of ['day-month-year', 'month-day-year', 'year-month-day'] as const) {
      setDateFormat(format);
      expect(parseDate('2026-02-30')).toBeNull();
      expect(dateProblem('2026-02-30')).toBe('There is no such day: February 2026 has 28 days');
      expect(dateProblem('2026-02-28')).toBeNull();
    }
  });
  it('tells what to type and where the week starts', () => {
    setDateFormat('month-day-year');
    expect(dateTypingExample()).toMatch(/03\/12\/2026/);
    expect(firstDayOfWeek()).toBe(0);
    setDateFormat('day-month-year');
    expect(firstDayOfWeek()).toBe(1);
  });
  it('gives the picker local midnights and reads its days back', () => {
    const d = calendarDateToLocal('2026-03-12');
    expect([d.getFullYear(), d.getMonth(), d.getDate(), d.getHours()]).toEqual([2026, 2, 12, 0]);
    expect(localToCalendarDate(new Date(2026, 2, 12, 23, 59))).toBe('2026-03-12');
  });
});
