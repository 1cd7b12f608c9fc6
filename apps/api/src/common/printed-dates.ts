// The one way the API writes dates for people (issue 15 §7): documents and e-mails in the order of
// the practice whose document it is, error messages in the signed-in user's practice's order, from
// the same functions the web shows dates with (@torquetrail/contracts). Calendar dates are written
// as stored; an instant is written as its day in UTC, or with its time and "UTC". The API's
// `fields` keys and stored values stay machine dates (YYYY-MM-DD); only words for people use this.
import { type DateFormat, writeCalendarDate, writeInstant } from '@torquetrail/contracts';

export interface DatePrinter {
  /** A calendar date (YYYY-MM-DD): "12 Mar 2026", "Mar 12, 2026" or "2026-03-12". */
  date(iso: string): string;
  /** The same, in words for prose and letters: "12 March 2026". */
  longDate(iso: string): string;
  /** The day (UTC) of an instant (ISO 8601 date-time). */
  dayOf(instant: string): string;
  /** An instant with its time, in UTC and saying so: "12 Mar 2026, 14:05 UTC". */
  instantUtc(instant: Date): string;
}

export function datePrinter(format: DateFormat): DatePrinter {
  return {
    date: (iso) => writeCalendarDate(iso, format),
    longDate: (iso) => writeCalendarDate(iso, format, 'long'),
    dayOf: (instant) => writeCalendarDate(new Date(instant).toISOString(), format),
    instantUtc: (instant) => `${writeInstant(instant, format, 'UTC')} UTC`,
  };
}
