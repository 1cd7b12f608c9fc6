import { z } from 'zod';
import { ISO_DATE_MESSAGE, plainMessage } from './plain-messages.js';

// Installed here, in a module every contract imports, so no entry point can forget it (a
// side-effect-only module could be dropped by the bundler: the package declares no side effects).
z.config({ customError: plainMessage });

/** Every id in the API is a UUID. */
export const Id = z.uuid();

/**
 * The dates the ledger accepts, inclusive: every record, birth date and planned recall of a
 * living patient falls inside; beyond them a typo (year 0000, 20255) would reach the database
 * (PostgreSQL refuses some such years with an error, others it stores and sorts wrongly).
 */
export const DATE_RANGE = Object.freeze({ min: '1900-01-01', max: '2100-12-31' } as const);
const dateRangeMessage = `Enter a date between ${DATE_RANGE.min} and ${DATE_RANGE.max}`;

/** A calendar date as YYYY-MM-DD (no time zone), within DATE_RANGE. */
export const IsoDate = z.iso
  .date({ error: ISO_DATE_MESSAGE })
  .refine((s) => s >= DATE_RANGE.min && s <= DATE_RANGE.max, { error: dateRangeMessage });

const MIN_INSTANT = Date.parse(`${DATE_RANGE.min}T00:00:00Z`);
const MAX_INSTANT = Date.parse(`${DATE_RANGE.max}T23:59:59.999Z`);
/** An instant as an ISO 8601 string with offset, within DATE_RANGE (in UTC). */
export const IsoDateTime = z.iso
  .datetime({ offset: true, error: 'Enter a date and time in ISO 8601 with a time zone offset' })
  .refine(
    (s) => {
      const t = Date.parse(s);
      return t >= MIN_INSTANT && t <= MAX_INSTANT;
    },
    { error: dateRangeMessage },
  );

/**
 * C0 control characters and DEL. PostgreSQL cannot store NUL in text at all (the request would
 * fail as a 500), and the others have no business in a clinical record: they hide text, break
 * CSV and PDF output and mail headers. Tab, line feed and carriage return are allowed in notes.
 */
// oxlint-disable-next-line no-control-regex -- matching control characters is the point
const CONTROL_IN_LINE = /[\u0000-\u001f\u007f]/;
// oxlint-disable-next-line no-control-regex -- matching control characters is the point
const CONTROL_IN_NOTE = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/;
const noControlMessage = 'Remove the invisible control characters from this text';
const atMost = (max: number) => `At most ${max} characters`;

/** One line of text typed by a user (a name, a code, a search), trimmed, at most `max` characters. */
export const PlainText = (max: number) =>
  z
    .string({ error: 'Enter text' })
    .trim()
    .max(max, { error: atMost(max) })
    .refine((s) => !CONTROL_IN_LINE.test(s), { error: noControlMessage });

/** Free text that may span lines (notes, reasons), trimmed, at most `max` characters. */
export const NoteText = (max: number) =>
  z
    .string({ error: 'Enter text' })
    .trim()
    .max(max, { error: atMost(max) })
    .refine((s) => !CONTROL_IN_NOTE.test(s), { error: noControlMessage });

/**
 * Text in which some control characters are data, e.g. a scanned UDI: GS (0x1D) between its
 * elements and the CR LF a scanner ends a scan with; every other control character is refused.
 */
export const TextAllowing = (allowed: readonly string[], max: number) =>
  z
    .string({ error: 'Enter text' })
    .max(max, { error: atMost(max) })
    .refine((s) => !CONTROL_IN_LINE.test(allowed.reduce((rest, c) => rest.replaceAll(c, ''), s)), {
      error: noControlMessage,
    });

/** FDI (ISO 3950) two-digit tooth position, permanent or primary. */
export const FdiPosition = z.number().int().min(11).max(85);

/** The error body every failing route answers with. */
export const ErrorReply = z.object({
  statusCode: z.number().int(),
  error: z.string(),
  message: z.string(),
  /** Field-level problems for 400 replies: path (dot-joined) → message. */
  fields: z.record(z.string(), z.string()).optional(),
  /** The request's id, also in the X-Request-Id header and in every log line of the request. */
  requestId: z.string().optional(),
});
export type ErrorReply = z.infer<typeof ErrorReply>;

/** A component of an implant axis (direction vector): any scale gives the same angle, so a sane bound keeps out overflow. */
export const AxisComponent = z
  .number()
  .min(-1000, { error: 'Axis components lie between −1000 and 1000' })
  .max(1000, { error: 'Axis components lie between −1000 and 1000' });

/**
 * An e-mail address as typed; stored and compared in lower case. Here, not in people.ts, so a
 * screen that only needs an address (a share's surgeon) does not load the password rules.
 */
export const EmailAddress = z
  .email({ error: 'Enter a valid e-mail address' })
  .max(254, { error: 'Use at most 254 characters' })
  .transform((s) => s.toLowerCase());
