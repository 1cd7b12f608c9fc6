// Issue 15 §7: words for people (error messages, e-mail bodies, the Timeline's titles, PDFs, the
// domain's reasons) write a date in the practice's order, through a DatePrinter (printed-dates.ts)
// or the writer a domain function is handed, never as the stored YYYY-MM-DD. The web's own scan is
// apps/web/src/lib/dates-single-source.test.ts; this one reads the API's and the domain's sources
// and fails on a sentence that puts a raw date into its text. An e-mail test
// (test/practice-dates-in-words.e2e-spec.ts) renders the bodies for a month-day-year practice.
import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const root = path.resolve(import.meta.dirname, '../../../..');
// The seed writes the invented history (its notes are data, not messages).
const dirs = ['apps/api/src', 'packages/domain/src'];

function sourceFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return ['node_modules', 'dist', 'seed'].includes(entry.name) ? [] : sourceFiles(full);
    return entry.name.endsWith('.ts') && !/\.(test|spec)\.ts$/.test(entry.name) ? [full] : [];
  });
}

/**
 * An interpolation of a date as stored: a name ending in On (placedOn, dueOn, removedOn), an
 * expiry, a `.date`, or toISOString(), not passed through a writer of the practice's order.
 */
const RAW_DATE =
  /\$\{(?![^}]*\b(dates|datePrinter|writeCalendarDate|writeInstant|writeDate)\b)[^}]*(\b\w+On\b|\bexpiry\b|\.date\b|toISOString\(\))[^}]*\}/;
/** Words around it: the template is a sentence for people, not a key, a URL or an instant for a machine. */
const PROSE = /[A-Za-z]{3,} |\s[A-Za-z]{3,}/;

/** The lines whose template text is a sentence holding a raw date. */
function rawDatesInWords(text: string): string[] {
  return text.split('\n').flatMap((line, i) => {
    if (!line.includes('`') || /\bsql[`<]/.test(line)) return [];
    const template = line.slice(line.indexOf('`'), line.lastIndexOf('`') + 1);
    const words = template.replace(/\$\{[^}]*\}/g, '');
    return RAW_DATE.test(template) && PROSE.test(words) ? [`${i + 1}: ${line.trim()}`] : [];
  });
}

describe('dates in the API’s words are written in the practice’s order', () => {
  it('the scan catches what it is for, and leaves machine dates alone', () => {
    const caught = [
      'throw new ConflictException(`This part was removed on ${part.removedOn}; log the torque`);',
      "text: `Please find it attached.${row.dueOn ? ` Due ${row.dueOn}.` : ''}`,",
      "`Download them until ${expiresAt.toISOString().slice(0, 16).replace('T', ' ')} UTC`",
      '`reference: ${ref.date}, bone level ${fmt(ref.level)} mm`',
    ];
    for (const line of caught) expect(rawDatesInWords(line), line).toHaveLength(1);
    const left = [
      '`This part was removed on ${dates.date(part.removedOn)}; log the torque on the part in place`',
      '`reference: ${writeDate(ref.date)}, bone level ${fmt(ref.level)} mm`',
      '`recall-reminder:${patientId}:${dueOn}:${kind}`;',
      'createdAt: new Date(`${row.date}T00:00:00.000Z`),',
      'sql`(select 1 from x where x.due_on < ${today}::date and y = ${row.endsOn})`',
    ];
    for (const line of left) expect(rawDatesInWords(line), line).toEqual([]);
  });

  it.each(dirs)('no sentence in %s prints a stored date', (dir) => {
    const files = sourceFiles(path.join(root, dir));
    expect(files.length).toBeGreaterThan(20);
    const offenders = files.flatMap((file) =>
      rawDatesInWords(fs.readFileSync(file, 'utf8')).map((line) => `${path.relative(root, file)}:${line}`),
    );
    expect(offenders).toEqual([]);
  });
});
