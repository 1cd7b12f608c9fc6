/**
 * Pure calendar arithmetic on ISO dates (`YYYY-MM-DD`), proleptic Gregorian calendar.
 * No `Date` objects and no time zones are involved, so results never shift by a day.
 */
import { ValidationError } from './errors.js';

/** A calendar date as numbers (month 1–12, day 1–31). */
export interface CalendarDate {
  year: number;
  month: number;
  day: number;
}

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

/** True for Gregorian leap years. */
export function isLeapYear(year: number): boolean {
  return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
}

/** Number of days in `month` (1–12) of `year`. */
export function daysInMonth(year: number, month: number): number {
  if (month === 2) return isLeapYear(year) ? 29 : 28;
  return [4, 6, 9, 11].includes(month) ? 30 : 31;
}

/** True when `value` is a real calendar date written `YYYY-MM-DD` (years 0001–9999). */
export function isValidIsoDate(value: unknown): boolean {
  if (typeof value !== 'string') return false;
  const m = ISO_DATE.exec(value);
  if (!m) return false;
  const year = Number(m[1]);
  const month = Number(m[2]);
  const day = Number(m[3]);
  return year >= 1 && month >= 1 && month <= 12 && day >= 1 && day <= daysInMonth(year, month);
}

/** Parses a strict `YYYY-MM-DD` date; throws {@link ValidationError} `bad-date` otherwise. */
export function parseIsoDate(value: unknown, field = 'date'): CalendarDate {
  if (!isValidIsoDate(value)) {
    throw new ValidationError('bad-date', 'Enter a real date as YYYY-MM-DD', field);
  }
  const [y, m, d] = (value as string).split('-').map(Number);
  return { year: y, month: m, day: d };
}

/** Formats a calendar date as `YYYY-MM-DD`. */
export function formatIsoDate(date: CalendarDate): string {
  return `${String(date.year).padStart(4, '0')}-${String(date.month).padStart(2, '0')}-${String(date.day).padStart(2, '0')}`;
}

/**
 * Adds whole calendar months; a day that does not exist in the target month is clamped
 * to that month's last day (31 Aug + 6 months → 28 or 29 Feb). Negative `months` go back.
 */
export function addCalendarMonths(date: string, months: number, field = 'date'): string {
  const d = parseIsoDate(date, field);
  if (!Number.isInteger(months)) {
    throw new ValidationError('not-a-number', 'Enter a whole number of months', 'months');
  }
  const index = d.year * 12 + (d.month - 1) + months;
  const year = Math.floor(index / 12);
  const month = index - year * 12 + 1;
  if (year < 1 || year > 9999) {
    throw new ValidationError('out-of-range', 'The resulting date is outside the years 0001–9999', 'months');
  }
  return formatIsoDate({ year, month, day: Math.min(d.day, daysInMonth(year, month)) });
}

/** Days since 1970-01-01 (negative before), after H. Hinnant's days_from_civil. */
export function dayNumber(date: CalendarDate): number {
  const y = date.month <= 2 ? date.year - 1 : date.year;
  const era = Math.floor(y / 400);
  const yoe = y - era * 400;
  const mp = (date.month + 9) % 12;
  const doy = Math.floor((153 * mp + 2) / 5) + date.day - 1;
  const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
  return era * 146097 + doe - 719468;
}

/** Whole days from `from` to `to` (positive when `to` is later). */
export function daysBetween(from: string, to: string): number {
  return dayNumber(parseIsoDate(to, 'to')) - dayNumber(parseIsoDate(from, 'from'));
}

/** The calendar date of a day number (inverse of {@link dayNumber}), after H. Hinnant's civil_from_days. */
export function fromDayNumber(days: number): CalendarDate {
  const z = days + 719468;
  const era = Math.floor(z / 146097);
  const doe = z - era * 146097;
  const yoe = Math.floor((doe - Math.floor(doe / 1460) + Math.floor(doe / 36524) - Math.floor(doe / 146096)) / 365);
  const doy = doe - (365 * yoe + Math.floor(yoe / 4) - Math.floor(yoe / 100));
  const mp = Math.floor((5 * doy + 2) / 153);
  const month = mp < 10 ? mp + 3 : mp - 9;
  return { year: yoe + era * 400 + (month <= 2 ? 1 : 0), month, day: doy - Math.floor((153 * mp + 2) / 5) + 1 };
}

/** Adds whole days to a `YYYY-MM-DD` date (negative `days` go back). */
export function addCalendarDays(date: string, days: number, field = 'date'): string {
  const d = parseIsoDate(date, field);
  if (!Number.isInteger(days)) {
    throw new ValidationError('not-a-number', 'Enter a whole number of days', 'days');
  }
  const result = fromDayNumber(dayNumber(d) + days);
  if (result.year < 1 || result.year > 9999) {
    throw new ValidationError('out-of-range', 'The resulting date is outside the years 0001–9999', 'days');
  }
  return formatIsoDate(result);
}
