/** Calendar dates arrive as YYYY-MM-DD; they are shown without any time-zone shift. */
function parseIsoDate(iso: string): Date {
  const [year, month, day] = iso.slice(0, 10).split('-').map(Number);
  return new Date(Date.UTC(year, month - 1, day));
}

const longDate = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });
const shortDate = new Intl.DateTimeFormat('en-GB', {
  day: 'numeric',
  month: 'short',
  year: 'numeric',
  timeZone: 'UTC',
});
const dateTime = new Intl.DateTimeFormat('en-GB', {
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
