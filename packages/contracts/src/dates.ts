// How a practice's dates are written and read (issue 15 §7): one source for the web (through
// apps/web/src/lib/dates.ts, the only web module that uses it) and for the documents the API
// prints. Calendar dates travel as YYYY-MM-DD and are written without any time-zone shift.
import type { DateFormat } from './enums.js';

/**
 * The Intl locale behind each order, where one writes the order with the month in words:
 * en-GB "12 Mar 2026", en-US "Mar 12, 2026". Year-month-day is ISO 8601's numeric form.
 */
const LOCALE: Record<DateFormat, 'en-GB' | 'en-US' | null> = {
  'day-month-year': 'en-GB',
  'month-day-year': 'en-US',
  'year-month-day': null,
};

/**
 * The first day of the calendar's week in each order: Monday where the day comes first (en-GB)
 * and in ISO 8601 (year first), Sunday where the month comes first (en-US) [common practice].
 */
export const FIRST_DAY_OF_WEEK: Record<DateFormat, 0 | 1> = {
  'day-month-year': 1,
  'month-day-year': 0,
  'year-month-day': 1,
};

/** What a person types in each order, for placeholders and messages. */
export const DATE_TYPING_EXAMPLE: Record<DateFormat, string> = {
  'day-month-year': '12/03/2026 or 12 Mar 2026',
  'month-day-year': '03/12/2026 or Mar 12, 2026',
  'year-month-day': '2026-03-12',
};

/** The order's name in plain words. */
export const DATE_ORDER_WORDS: Record<DateFormat, string> = {
  'day-month-year': 'day/month/year',
  'month-day-year': 'month/day/year',
  'year-month-day': 'year-month-day',
};

function isoParts(iso: string): [number, number, number] {
  const [year, month, day] = iso.slice(0, 10).split('-').map(Number);
  return [year, month, day];
}

const pad = (n: number, width = 2) => String(n).padStart(width, '0');

const formatters = new Map<string, Intl.DateTimeFormat>();
/** Intl formatters are costly to build and used in long tables: one per locale and style. */
function formatter(locale: string, options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
  const key = `${locale}|${JSON.stringify(options)}`;
  let found = formatters.get(key);
  if (!found) {
    found = new Intl.DateTimeFormat(locale, options);
    formatters.set(key, found);
  }
  return found;
}

/**
 * The months' names as CLDR writes them for the two orders in words (the data Intl uses): the same
 * full names in en-GB and en-US; short names of three letters but for en-GB's "Sept". Calendar
 * dates are written from this table, without Intl: the first Intl formatter a page builds costs
 * ~35 ms of ICU start-up on the main thread, and the Arch's first view shows dates (issue 13, goal
 * 3). The tests compare every day written here with Intl's own writing.
 */
const MONTHS = [
  ['January', 'Jan'],
  ['February', 'Feb'],
  ['March', 'Mar'],
  ['April', 'Apr'],
  ['May', 'May'],
  ['June', 'Jun'],
  ['July', 'Jul'],
  ['August', 'Aug'],
  ['September', 'Sep'],
  ['October', 'Oct'],
  ['November', 'Nov'],
  ['December', 'Dec'],
] as const;

/** A month's name in an order written in words (1–12). */
function monthName(month: number, locale: 'en-GB' | 'en-US', style: 'short' | 'long'): string {
  const [long, short] = MONTHS[month - 1];
  if (style === 'long') return long;
  return locale === 'en-GB' && month === 9 ? 'Sept' : short;
}

const daysIn = (year: number, month: number) => new Date(Date.UTC(year, month, 0)).getUTCDate();

/** Whether the table writes this date as Intl would: a real day of a four-digit year. */
const isPlainDate = (year: number, month: number, day: number) =>
  Number.isInteger(year) &&
  Number.isInteger(month) &&
  Number.isInteger(day) &&
  year >= 1000 &&
  year <= 9999 &&
  month >= 1 &&
  month <= 12 &&
  day >= 1 &&
  day <= daysIn(year, month);

/**
 * A calendar date (YYYY-MM-DD) as the practice writes it: `short` for tables ("12 Mar 2026",
 * "Mar 12, 2026", "2026-03-12"), `long` for prose and accessible names ("12 March 2026").
 */
export function writeCalendarDate(iso: string, format: DateFormat, style: 'short' | 'long' = 'short'): string {
  const [year, month, day] = isoParts(iso);
  const locale = LOCALE[format];
  if (!locale) return `${pad(year, 4)}-${pad(month)}-${pad(day)}`;
  if (isPlainDate(year, month, day)) {
    const name = monthName(month, locale, style);
    return locale === 'en-GB' ? `${day} ${name} ${year}` : `${name} ${day}, ${year}`;
  }
  // Anything else (an overflowing day, a year outside 1000–9999) as Intl has always written it.
  return formatter(locale, {
    day: 'numeric',
    month: style === 'long' ? 'long' : 'short',
    year: 'numeric',
    timeZone: 'UTC',
  }).format(new Date(Date.UTC(year, month - 1, day)));
}

/** An instant as the practice writes it, with the time (24-hour, or AM/PM where the month comes first), in `timeZone`. */
export function writeInstant(instant: string | number | Date, format: DateFormat, timeZone?: string): string {
  const at = new Date(instant);
  const locale = LOCALE[format];
  if (locale)
    return formatter(locale, {
      day: 'numeric',
      month: 'short',
      year: 'numeric',
      hour: '2-digit',
      minute: '2-digit',
      timeZone,
    }).format(at);
  const parts = Object.fromEntries(
    formatter('en-GB', {
      day: '2-digit',
      month: '2-digit',
      year: 'numeric',
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
      timeZone,
    })
      .formatToParts(at)
      .map((p) => [p.type, p.value]),
  );
  return `${parts.year}-${parts.month}-${parts.day} ${parts.hour}:${parts.minute}`;
}

/** Each month's full and en-GB short name in lower case, as typed dates are read. */
const MONTH_WORDS = MONTHS.map((_, m) => [
  monthName(m + 1, 'en-GB', 'long').toLocaleLowerCase(),
  monthName(m + 1, 'en-GB', 'short').toLocaleLowerCase(),
]);

/** The month (1–12) a word names: its full name or any start of it of 3 letters or more ("Sep", "Sept"). */
function monthOfWord(word: string): number | null {
  const w = word.replace(/\.$/, '');
  const index = MONTH_WORDS.findIndex((names) => names.includes(w) || (w.length >= 3 && names[0].startsWith(w)));
  return index < 0 ? null : index + 1;
}

/** A typed date read in the practice's order: the date, or the reason it is not one, in plain words. */
export type TypedDate = { iso: string; problem?: undefined } | { iso?: undefined; problem: string };

function checked(year: number, month: number, day: number): TypedDate {
  if (year < 1000) return { problem: 'Type the year in full, with 4 digits' };
  if (month < 1 || month > 12) return { problem: `There is no month ${month}: months go from 1 to 12` };
  const last = daysIn(year, month);
  if (day < 1 || day > last) {
    return { problem: `There is no such day: ${monthName(month, 'en-GB', 'long')} ${year} has ${last} days` };
  }
  return { iso: `${pad(year, 4)}-${pad(month)}-${pad(day)}` };
}

/**
 * A date as typed, read in the practice's order. Always read: a year first (2026-03-12,
 * 2026/3/12: ISO 8601's order) and a month in words ("12 Mar 2026", "March 12, 2026", which no
 * order can mistake). Numbers only (01/02/2026) are read in the practice's order, day/month/year
 * or month/day/year; where the year comes first such input is refused, since either reading is
 * possible. Two-digit years are refused: a date of birth could be either century.
 */
export function readTypedDate(text: string, format: DateFormat): TypedDate {
  const t = text.trim().toLocaleLowerCase();
  const example = `Type a date as ${DATE_TYPING_EXAMPLE[format]}`;
  if (t === '') return { problem: example };
  let m = /^(\d{4})[-/. ](\d{1,2})[-/. ](\d{1,2})$/.exec(t);
  if (m) return checked(Number(m[1]), Number(m[2]), Number(m[3]));
  m = /^(\d{1,2})[/. -](\d{1,2})[/. -](\d{2}|\d{4})$/.exec(t);
  if (m) {
    if (m[3].length === 2) return { problem: 'Type the year in full, with 4 digits' };
    const [a, b, year] = [Number(m[1]), Number(m[2]), Number(m[3])];
    if (format === 'day-month-year') return checked(year, b, a);
    if (format === 'month-day-year') return checked(year, a, b);
    return {
      problem: `Not read: in ${text.trim()} either number could be the day. This practice types the year first, as ${pad(year, 4)}-03-12, or the month in words`,
    };
  }
  // A month in words: 12 Mar 2026, Mar 12 2026, March 12, 2026, 2026 Mar 12.
  m = /^(\d{1,2})[ -]([a-z]+\.?),?[ -](\d{2,4})$/.exec(t);
  const words = m
    ? { day: m[1], month: m[2], year: m[3] }
    : (() => {
        const md = /^([a-z]+\.?)[ -](\d{1,2}),?[ -](\d{2,4})$/.exec(t);
        if (md) return { month: md[1], day: md[2], year: md[3] };
        const ymd = /^(\d{4})[ -]([a-z]+\.?)[ -](\d{1,2})$/.exec(t);
        return ymd ? { year: ymd[1], month: ymd[2], day: ymd[3] } : null;
      })();
  if (words) {
    const month = monthOfWord(words.month);
    if (month === null) return { problem: `“${words.month}” is not a month: ${example}` };
    if (words.year.length !== 4) return { problem: 'Type the year in full, with 4 digits' };
    return checked(Number(words.year), month, Number(words.day));
  }
  return { problem: example };
}
