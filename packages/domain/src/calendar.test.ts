import { describe, it, expect } from 'vitest';
import * as fc from 'fast-check';
import { addCalendarMonths, dayNumber, daysBetween, isLeapYear, isValidIsoDate, parseIsoDate } from './calendar.js';
import { ValidationError } from './errors.js';

describe('calendar helpers (proleptic Gregorian, no time zones)', () => {
  it('leap years: 2000 yes, 1900 no, 2024 yes, 2026 no', () => {
    expect([2000, 1900, 2024, 2026].map(isLeapYear)).toEqual([true, false, true, false]);
  });
  it('isValidIsoDate', () => {
    expect(isValidIsoDate('2024-02-29')).toBe(true);
    expect(isValidIsoDate('2023-02-29')).toBe(false);
    expect(isValidIsoDate('2023-04-31')).toBe(false);
    expect(isValidIsoDate('2023-13-01')).toBe(false);
    expect(isValidIsoDate('0000-01-01')).toBe(false);
    expect(isValidIsoDate('2023-1-01')).toBe(false);
    expect(isValidIsoDate(20230101)).toBe(false);
  });
  it('parseIsoDate throws ValidationError bad-date', () => {
    expect(() => parseIsoDate('2023-02-29')).toThrow(ValidationError);
  });
  it('addCalendarMonths forwards and backwards, clamped', () => {
    expect(addCalendarMonths('2024-01-31', 1)).toBe('2024-02-29');
    expect(addCalendarMonths('2024-03-31', -1)).toBe('2024-02-29');
    expect(addCalendarMonths('2024-01-15', -13)).toBe('2022-12-15');
    expect(() => addCalendarMonths('9999-12-01', 1)).toThrow(ValidationError);
  });
  it('dayNumber agrees with Date.UTC (property, 1970–2199)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1970, max: 2199 }), fc.integer({ min: 1, max: 12 }), fc.integer({ min: 1, max: 28 }), (year, month, day) => {
        return dayNumber({ year, month, day }) === Date.UTC(year, month - 1, day) / 86_400_000;
      }),
    );
  });
  it('daysBetween', () => {
    expect(daysBetween('2024-01-01', '2025-01-01')).toBe(366);
    expect(daysBetween('2025-01-01', '2024-01-01')).toBe(-366);
    expect(daysBetween('1969-12-31', '1970-01-01')).toBe(1);
  });
});
