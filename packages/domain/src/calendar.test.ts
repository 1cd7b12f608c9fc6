import { describe, it, expect } from 'vitest';
import * as fc from 'fast-check';
import {
  addCalendarDays,
  addCalendarMonths,
  dayNumber,
  daysBetween,
  fromDayNumber,
  isLeapYear,
  isValidIsoDate,
  parseIsoDate,
} from './calendar.js';
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
      fc.property(
        fc.integer({ min: 1970, max: 2199 }),
        fc.integer({ min: 1, max: 12 }),
        fc.integer({ min: 1, max: 28 }),
        (year, month, day) => {
          return dayNumber({ year, month, day }) === Date.UTC(year, month - 1, day) / 86_400_000;
        },
      ),
    );
  });
  it('daysBetween', () => {
    expect(daysBetween('2024-01-01', '2025-01-01')).toBe(366);
    expect(daysBetween('2025-01-01', '2024-01-01')).toBe(-366);
    expect(daysBetween('1969-12-31', '1970-01-01')).toBe(1);
  });
  it('addCalendarDays across month, year and leap-day ends', () => {
    expect(addCalendarDays('2024-02-28', 1)).toBe('2024-02-29');
    expect(addCalendarDays('2023-02-28', 1)).toBe('2023-03-01');
    expect(addCalendarDays('2026-12-31', 1)).toBe('2027-01-01');
    expect(addCalendarDays('2026-06-15', -14)).toBe('2026-06-01');
    expect(addCalendarDays('2026-06-15', 0)).toBe('2026-06-15');
    expect(() => addCalendarDays('2026-06-15', 1.5)).toThrow(ValidationError);
    expect(() => addCalendarDays('0001-01-01', -1)).toThrow(ValidationError);
  });
  it('addCalendarDays agrees with UTC Date arithmetic and inverts daysBetween (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1600, max: 2400 }),
        fc.integer({ min: 1, max: 12 }),
        fc.integer({ min: 1, max: 28 }),
        fc.integer({ min: -100_000, max: 100_000 }),
        (year, month, day, days) => {
          const from = `${year}-${String(month).padStart(2, '0')}-${String(day).padStart(2, '0')}`;
          const viaDate = new Date(Date.UTC(year, month - 1, day) + days * 86_400_000).toISOString().slice(0, 10);
          const to = addCalendarDays(from, days);
          return to === viaDate && daysBetween(from, to) === days;
        },
      ),
    );
  });
  it('fromDayNumber inverts dayNumber', () => {
    expect(fromDayNumber(0)).toEqual({ year: 1970, month: 1, day: 1 });
    expect(fromDayNumber(dayNumber({ year: 2000, month: 2, day: 29 }))).toEqual({ year: 2000, month: 2, day: 29 });
  });
});
