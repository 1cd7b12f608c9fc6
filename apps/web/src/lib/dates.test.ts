import { describe, expect, it } from 'vitest';
import { ageInYears, formatDate, formatLongDate, localNow, localToday } from './dates';

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
