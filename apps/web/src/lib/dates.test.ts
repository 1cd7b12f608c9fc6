import { describe, expect, it } from 'vitest';
import { ageInYears, formatDate, formatLongDate, localNow, localToday, parseDate } from './dates';

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
