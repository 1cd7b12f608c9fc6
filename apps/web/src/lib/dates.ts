// The one module that writes and reads dates for people (issue 15 §7): every date shown or typed
// in the app goes through these functions, in the practice's order (its setting: day-month-year,
// month-day-year or year-month-day). The writing and reading themselves live in
// @torquetrail/contracts (dates.ts), which the API prints its documents with too. A unit test
// fails on date formatting anywhere else in apps/web/src.
import {
  DATE_TYPING_EXAMPLE,
  type DateFormat,
  DEFAULT_DATE_FORMAT,
  FIRST_DAY_OF_WEEK,
  readTypedDate,
  writeCalendarDate,
  writeInstant,
} from '@torquetrail/contracts';

/**
 * The practice's order for dates (its setting, sent with the session: RequireAuth sets it before
 * any page renders, and remounts the pages when it changes). Day-month-year until a session says.
 */
let practiceFormat: DateFormat = DEFAULT_DATE_FORMAT;

export function setDateFormat(format: DateFormat): void {
  practiceFormat = format;
}

/** What to type, for placeholders: "12/03/2026 or 12 Mar 2026". */
export function dateTypingExample(): string {
  return DATE_TYPING_EXAMPLE[practiceFormat];
}

/** The calendar's first day of the week in the practice's order (0 Sunday, 1 Monday). */
export function firstDayOfWeek(): 0 | 1 {
  return FIRST_DAY_OF_WEEK[practiceFormat];
}

/** Calendar dates arrive as YYYY-MM-DD; they are shown without any time-zone shift. */
function parseIsoDate(iso: string): Date {
  const [year, month, day] = iso.slice(0, 10).split('-').map(Number);
  return new Date(Date.UTC(year, month - 1, day));
}

/** "12 March 2026" (or the practice's order): for accessible names and prose. */
export function formatLongDate(iso: string): string {
  return writeCalendarDate(iso, practiceFormat, 'long');
}

/** "12 Mar 2026" (or the practice's order): for tables. */
export function formatDate(iso: string): string {
  return writeCalendarDate(iso, practiceFormat);
}

/** A calendar date in a given order, for showing the choices of the practice's setting. */
export function formatDateAs(iso: string, format: DateFormat): string {
  return writeCalendarDate(iso, format);
}

/** An instant (ISO 8601 with offset) in the viewer's time zone. */
export function formatDateTime(iso: string): string {
  return writeInstant(iso, practiceFormat);
}

/** The viewer's calendar day of an instant (ms or ISO), in the practice's format: "12 Mar 2026". */
export function formatDayOf(instant: number | string): string {
  return formatDate(localToday(new Date(instant)));
}

/** The viewer's calendar year of an instant (ms), for chart axes. */
export function formatYear(instant: number): string {
  return localToday(new Date(instant)).slice(0, 4);
}

/** A calendar date held as its UTC midnight in ms (charts of dated readings), in the practice's format. */
export function formatCalendarMs(ms: number): string {
  return formatDate(new Date(ms).toISOString());
}

/** The year of a calendar date held as its UTC midnight in ms, for chart axes. */
export function calendarYearOfMs(ms: number): string {
  return new Date(ms).toISOString().slice(0, 4);
}

/** Age in whole years on `today` (local calendar date). */
export function ageInYears(birthIso: string, today: Date = new Date()): number {
  const birth = parseIsoDate(birthIso);
  let age = today.getFullYear() - birth.getUTCFullYear();
  const beforeBirthday =
    today.getMonth() < birth.getUTCMonth() ||
    (today.getMonth() === birth.getUTCMonth() && today.getDate() < birth.getUTCDate());
  if (beforeBirthday) age -= 1;
  return age;
}

/** The viewer's local date and time as `<input type="datetime-local">` wants it: YYYY-MM-DDTHH:MM. */
export function localNow(now: Date = new Date()): string {
  const local = new Date(now.getTime() - now.getTimezoneOffset() * 60_000);
  return local.toISOString().slice(0, 16);
}

/**
 * Today's date on the viewer's calendar (YYYY-MM-DD), for date fields and their `max`. Not the
 * UTC date: around midnight the two differ, and a form would default to yesterday or tomorrow.
 */
export function localToday(now: Date = new Date()): string {
  return localNow(now).slice(0, 10);
}

/**
 * A date as typed, in the practice's order (lib: readTypedDate in @torquetrail/contracts): YYYY-MM-DD
 * when the text is a real date, else null.
 */
export function parseDate(text: string): string | null {
  return readTypedDate(text, practiceFormat).iso ?? null;
}

/** Why the text is not a date, in plain words for beside the field; null when it is one. */
export function dateProblem(text: string): string | null {
  return readTypedDate(text, practiceFormat).problem ?? null;
}

/** A calendar date (YYYY-MM-DD) as the picker's local midnight, and back. */
export function calendarDateToLocal(iso: string): Date {
  const [year, month, day] = iso.slice(0, 10).split('-').map(Number);
  return new Date(year, month - 1, day);
}

export function localToCalendarDate(date: Date): string {
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${String(date.getFullYear()).padStart(4, '0')}-${pad(date.getMonth() + 1)}-${pad(date.getDate())}`;
}
