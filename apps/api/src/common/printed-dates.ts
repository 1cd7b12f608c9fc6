// The one way the API writes dates for people (issue 15 §7): in the order of the practice whose
// document it is, from the same functions the web shows dates with (@torquetrail/contracts).
// Calendar dates are written as stored; an instant is written as its day in UTC.
import { type DateFormat, writeCalendarDate } from '@torquetrail/contracts';

export interface DatePrinter {
  /** A calendar date (YYYY-MM-DD): "12 Mar 2026", "Mar 12, 2026" or "2026-03-12". */
  date(iso: string): string;
  /** The same, in words for prose and letters: "12 March 2026". */
  longDate(iso: string): string;
  /** The day (UTC) of an instant (ISO 8601 date-time). */
  dayOf(instant: string): string;
}

export function datePrinter(format: DateFormat): DatePrinter {
  return {
    date: (iso) => writeCalendarDate(iso, format),
    longDate: (iso) => writeCalendarDate(iso, format, 'long'),
    dayOf: (instant) => writeCalendarDate(new Date(instant).toISOString(), format),
  };
}
