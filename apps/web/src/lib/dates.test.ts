import { describe, expect, it } from 'vitest';
import { ageInYears, formatDate, formatLongDate } from './dates';

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
