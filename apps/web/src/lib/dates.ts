// The one module that writes and reads dates for people (issue 15 §7): every date shown or typed
// in the app goes through these functions, in the practice's locale. A unit test fails on date
// formatting anywhere else in apps/web/src.

/**
 * The practice's locale for dates: day, month in words, year ("12 Mar 2026"), which no reader
 * can take for another day. One practice locale for now; a per-practice setting would change it here.
 */
const PRACTICE_LOCALE = 'en-GB';

/** Calendar dates arrive as YYYY-MM-DD; they are shown without any time-zone shift. */
function parseIsoDate(iso: string): Date {
  const [year, month, day] = iso.slice(0, 10).split('-').map(Number);
  return new Date(Date.UTC(year, month - 1, day));
}

const longDate = new Intl.DateTimeFormat(PRACTICE_LOCALE, {
  day: 'numeric',
  month: 'long',
  year: 'numeric',
  timeZone: 'UTC',
});
const shortDate = new Intl.DateTimeFormat(PRACTICE_LOCALE, {
  day: 'numeric',
  month: 'short',
  year: 'numeric',
  timeZone: 'UTC',
});
const dateTime = new Intl.DateTimeFormat(PRACTICE_LOCALE, {
  day: 'numeric',
  month: 'short',
  year: 'numeric',
  hour: '2-digit',
  minute: '2-digit',
});

/** "12 March 2026": for accessible names and prose. */
export function formatLongDate(iso: string): string {
  return longDate.format(parseIsoDate(iso));
}

/** "12 Mar 2026": for tables. */
export function formatDate(iso: string): string {
  return shortDate.format(parseIsoDate(iso));
}

/** An instant (ISO 8601 with offset) in the viewer's time zone. */
export function formatDateTime(iso: string): string {
  return dateTime.format(new Date(iso));
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

const MONTHS = Array.from({ length: 12 }, (_, m) =>
  [
    new Intl.DateTimeFormat(PRACTICE_LOCALE, { month: 'long', timeZone: 'UTC' }),
    new Intl.DateTimeFormat(PRACTICE_LOCALE, { month: 'short', timeZone: 'UTC' }),
  ].map((f) =>
    f
      .format(new Date(Date.UTC(2026, m, 1)))
      .toLocaleLowerCase()
      .replace(/\.$/, ''),
  ),
);

/** YYYY-MM-DD when year, month and day make a real calendar date, else null. */
function isoOf(year: number, month: number, day: number): string | null {
  const d = new Date(Date.UTC(year, month - 1, day));
  if (year < 1000 || d.getUTCFullYear() !== year || d.getUTCMonth() !== month - 1 || d.getUTCDate() !== day)
    return null;
  return `${String(year).padStart(4, '0')}-${String(month).padStart(2, '0')}-${String(day).padStart(2, '0')}`;
}

/**
 * A date as typed, in the practice's order (day, month, year): "12 Mar 2026", "12 March 2026",
 * "12/3/2026", "12.03.2026", or YYYY-MM-DD. Returns YYYY-MM-DD, or null when the text is not a
 * real date (31 Feb is not). Two-digit years are refused: a date of birth could be either century.
 */
export function parseDate(text: string): string | null {
  const t = text.trim().toLocaleLowerCase();
  let m = /^(\d{4})-(\d{1,2})-(\d{1,2})$/.exec(t);
  if (m) return isoOf(Number(m[1]), Number(m[2]), Number(m[3]));
  m = /^(\d{1,2})[/. -](\d{1,2})[/. -](\d{4})$/.exec(t);
  if (m) return isoOf(Number(m[3]), Number(m[2]), Number(m[1]));
  m = /^(\d{1,2})[ -]([a-z]+)\.?,?[ -](\d{4})$/.exec(t);
  if (m) {
    const word = m[2];
    // The long name or any start of it of 3 letters or more ("Sep", "Sept", "September").
    const month = MONTHS.findIndex((names) => names.includes(word) || (word.length >= 3 && names[0].startsWith(word)));
    return month < 0 ? null : isoOf(Number(m[3]), month + 1, Number(m[1]));
  }
  return null;
}
