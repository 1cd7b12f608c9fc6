/**
 * GS1 check digits and GS1 UDI element strings (AIs 01, 10, 11, 17, 21).
 *
 * Sources: GS1 General Specifications (check digit, dates) [memory for section numbers];
 * GS1 Barcode Syntax Dictionary [pub].
 * - (01) GTIN, 14 digits incl. check digit, fixed length; (10) batch/lot ≤ 20 chars, variable;
 *   (11) production date YYMMDD; (17) expiry date YYMMDD; (21) serial ≤ 20 chars, variable.
 * - DD = 00 means the last day of that month. Century: d = YY − current two-digit year;
 *   d ≥ 51 → previous century, −50 < d < 51 → current century, d ≤ −50 → next century.
 * - A variable-length element ends with FNC1 (sent as GS, 0x1D) unless it is last.
 *   Parentheses appear only in the human-readable text. Optional symbology identifier
 *   `]d2` (Data Matrix), `]C1` (GS1-128), `]Q3` (QR).
 * - Check digit: weights 3, 1, 3, … from the rightmost data digit; check = (10 − sum mod 10) mod 10.
 *
 * Decisions where the sources are silent:
 * - A GS after a fixed-length element, a GS before the first element and a trailing GS are tolerated.
 * - In the human-readable form a value runs to the next "(nn)"–"(nnnn)" token; spaces around
 *   tokens are ignored (spaces are not in character set 82, so they cannot belong to a value).
 * - Any AI other than 01, 10, 11, 17, 21 is rejected (`unknown-ai`): in the raw form its length is
 *   unknown, so the rest of the data could not be split safely.
 * - "Current year" for the century rule is the UTC year of `today`.
 * - A lot that is not terminated by GS although more elements follow cannot be detected when the run
 *   stays ≤ 20 characters: the following characters are read as part of the lot (the GS1 rule gives no
 *   way to split it). Above 20 characters it is rejected as `too-long`.
 */
import { daysInMonth, formatIsoDate } from './calendar.js';
import { UdiError } from './errors.js';

/** GS (group separator, 0x1D): FNC1 as transmitted by scanners. */
export const GS = '\u001d';

/** Symbology identifiers accepted (and removed) at the start of scanned data. */
export const SYMBOLOGY_IDENTIFIERS: readonly string[] = Object.freeze([']d2', ']C1', ']Q3']);

/** A parsed GS1 UDI. Dates are `YYYY-MM-DD`. */
export interface ParsedUdi {
  /** (01) GTIN-14, check digit verified. */
  gtin: string;
  /** (10) batch/lot number. */
  lot?: string;
  /** (21) serial number. */
  serial?: string;
  /** (17) expiry date, YYYY-MM-DD (DD = 00 → last day of the month). */
  expiry?: string;
  /** (11) production date, YYYY-MM-DD. */
  productionDate?: string;
}

type AiKey = keyof ParsedUdi;

interface AiDef {
  key: AiKey;
  label: string;
  fixed?: number;
  max?: number;
}

const AIS: Record<string, AiDef> = {
  '01': { key: 'gtin', label: 'GTIN', fixed: 14 },
  '10': { key: 'lot', label: 'batch/lot', max: 20 },
  '11': { key: 'productionDate', label: 'production date', fixed: 6 },
  '17': { key: 'expiry', label: 'expiry date', fixed: 6 },
  '21': { key: 'serial', label: 'serial number', max: 20 },
};

/** GS1 AI encodable character set 82. */
const CSET82 = /^[!"%&'()*+,\-./0-9:;<=>?A-Z_a-z]+$/;

/**
 * GS1 check digit of `digits` (the data digits without the check digit; 1–17 digits, e.g. 7 for GTIN-8,
 * 11 / 12 / 13 for GTIN-12 / -13 / -14, 17 for SSCC). Throws {@link UdiError} `bad-format` otherwise.
 */
export function gtinCheckDigit(digits: string): number {
  if (typeof digits !== 'string' || !/^\d{1,17}$/.test(digits)) {
    throw new UdiError(
      'bad-format',
      `check digits are computed on 1–17 decimal digits (got ${JSON.stringify(digits)})`,
    );
  }
  let sum = 0;
  for (let i = 0; i < digits.length; i++) {
    const fromRight = digits.length - 1 - i;
    sum += Number(digits[i]) * (fromRight % 2 === 0 ? 3 : 1);
  }
  return (10 - (sum % 10)) % 10;
}

/** True when `gtin` is 8, 12, 13 or 14 digits whose last digit is the correct GS1 check digit. Never throws. */
export function isValidGtin(gtin: string): boolean {
  if (typeof gtin !== 'string' || !/^(\d{8}|\d{12,14})$/.test(gtin)) return false;
  return gtinCheckDigit(gtin.slice(0, -1)) === Number(gtin[gtin.length - 1]);
}

function parseYymmdd(value: string, ai: string, label: string, today: Date): string {
  if (!/^\d{6}$/.test(value))
    throw new UdiError('bad-date', `(${ai}) ${label} must be 6 digits YYMMDD (got ${JSON.stringify(value)})`, ai);
  const yy = Number(value.slice(0, 2));
  const month = Number(value.slice(2, 4));
  const dd = Number(value.slice(4, 6));
  const currentYear = today.getUTCFullYear();
  const century = Math.floor(currentYear / 100) * 100;
  const d = yy - (currentYear % 100);
  const year = d >= 51 ? century - 100 + yy : d > -50 ? century + yy : century + 100 + yy;
  if (month < 1 || month > 12)
    throw new UdiError('bad-date', `(${ai}) ${label} ${value}: month ${value.slice(2, 4)} does not exist`, ai);
  const last = daysInMonth(year, month);
  if (dd > last)
    throw new UdiError(
      'bad-date',
      `(${ai}) ${label} ${value}: day ${value.slice(4, 6)} does not exist in ${year}-${value.slice(2, 4)}`,
      ai,
    );
  return formatIsoDate({ year, month, day: dd === 0 ? last : dd });
}

function stripPrefix(data: string): string {
  if (data.startsWith(']')) {
    const id = data.slice(0, 3);
    if (!SYMBOLOGY_IDENTIFIERS.includes(id)) {
      throw new UdiError(
        'bad-format',
        `symbology identifier ${JSON.stringify(id)} is not a GS1 Data Matrix (]d2), GS1-128 (]C1) or GS1 QR (]Q3) identifier`,
      );
    }
    return data.slice(3);
  }
  return data;
}

interface Element {
  ai: string;
  value: string;
}

function splitRaw(s: string): Element[] {
  const out: Element[] = [];
  let pos = s.startsWith(GS) ? 1 : 0;
  while (pos < s.length) {
    if (s[pos] === GS) {
      // Tolerated after a fixed-length element or at the end; anything else is an empty element.
      if (out.length > 0 && AIS[out[out.length - 1].ai].fixed !== undefined) {
        pos++;
        continue;
      }
      throw new UdiError('truncated', `unexpected separator (GS) at position ${pos}`);
    }
    const ai = s.slice(pos, pos + 2);
    if (ai.length < 2) throw new UdiError('truncated', `data ends inside an application identifier at position ${pos}`);
    if (!/^\d\d$/.test(ai))
      throw new UdiError(
        'bad-format',
        `expected an application identifier (digits) at position ${pos}, found ${JSON.stringify(ai)}`,
      );
    const def = AIS[ai];
    if (!def)
      throw new UdiError(
        'unknown-ai',
        `application identifier starting "${ai}" is not supported (only 01, 10, 11, 17, 21)`,
        ai,
      );
    pos += 2;
    if (def.fixed !== undefined) {
      const value = s.slice(pos, pos + def.fixed);
      const gsAt = value.indexOf(GS);
      if (value.length < def.fixed || gsAt >= 0) {
        throw new UdiError(
          'truncated',
          `(${ai}) ${def.label} needs ${def.fixed} characters, found ${gsAt >= 0 ? gsAt : value.length}`,
          ai,
        );
      }
      out.push({ ai, value });
      pos += def.fixed;
    } else {
      let end = s.indexOf(GS, pos);
      if (end < 0) end = s.length;
      out.push({ ai, value: s.slice(pos, end) });
      pos = end < s.length ? end + 1 : end;
    }
  }
  return out;
}

function splitHri(s: string): Element[] {
  const token = /\s*\(\s*(\d{2,4})\s*\)\s*/y;
  const anyToken = /\(\s*\d{2,4}\s*\)/g;
  const out: Element[] = [];
  let pos = 0;
  while (pos < s.length) {
    token.lastIndex = pos;
    const m = token.exec(s);
    if (!m) throw new UdiError('bad-format', `expected "(AI)" at position ${pos} of the human-readable text`);
    const ai = m[1];
    if (!AIS[ai])
      throw new UdiError('unknown-ai', `application identifier (${ai}) is not supported (only 01, 10, 11, 17, 21)`, ai);
    const start = token.lastIndex;
    anyToken.lastIndex = start;
    const next = anyToken.exec(s);
    const end = next ? next.index : s.length;
    out.push({ ai, value: s.slice(start, end).trim() });
    pos = end;
  }
  return out;
}

/**
 * Parses a GS1 UDI: human-readable form `(01)…(17)…(10)…` or raw scanned form with GS (0x1D)
 * separators and an optional symbology identifier (`]d2`, `]C1`, `]Q3`).
 *
 * @param data the element string
 * @param today reference date for the YY century rule (default: now)
 * @throws UdiError with `code` `empty`, `bad-check-digit`, `bad-date`, `unknown-ai`, `truncated`,
 *   `missing-gtin`, `too-long`, `bad-format`, `bad-character` or `duplicate-ai`
 */
export function parseUdi(data: string, today: Date = new Date()): ParsedUdi {
  if (typeof data !== 'string') throw new UdiError('bad-format', 'UDI data must be a string');
  if (!(today instanceof Date) || Number.isNaN(today.getTime()))
    throw new UdiError('bad-format', 'today must be a valid Date');
  // Scanners often append CR/LF; String.prototype.trim does not remove GS.
  const s = stripPrefix(data.trim());
  if (s.length === 0 || s === GS) throw new UdiError('empty', 'no UDI data');
  const elements = s.startsWith('(') ? splitHri(s) : splitRaw(s);

  const result: Partial<Record<AiKey, string>> = {};
  const seen = new Set<string>();
  for (const { ai, value } of elements) {
    const def = AIS[ai];
    if (seen.has(ai)) throw new UdiError('duplicate-ai', `(${ai}) ${def.label} appears more than once`, ai);
    seen.add(ai);
    if (value.length === 0) throw new UdiError('truncated', `(${ai}) ${def.label} has no value`, ai);
    if (def.fixed !== undefined && value.length < def.fixed) {
      throw new UdiError('truncated', `(${ai}) ${def.label} needs ${def.fixed} characters, found ${value.length}`, ai);
    }
    if (def.fixed !== undefined && value.length > def.fixed) {
      throw new UdiError('too-long', `(${ai}) ${def.label} has ${value.length} characters, expected ${def.fixed}`, ai);
    }
    if (def.max !== undefined && value.length > def.max) {
      throw new UdiError(
        'too-long',
        `(${ai}) ${def.label} has ${value.length} characters (maximum ${def.max}); if more elements follow, the separator (GS) may be missing`,
        ai,
      );
    }
    switch (def.key) {
      case 'gtin':
        if (!/^\d{14}$/.test(value))
          throw new UdiError('bad-format', `(01) GTIN must be 14 digits (got ${JSON.stringify(value)})`, ai);
        if (!isValidGtin(value)) {
          throw new UdiError(
            'bad-check-digit',
            `(01) GTIN ${value}: check digit should be ${gtinCheckDigit(value.slice(0, 13))}, not ${value[13]}`,
            ai,
          );
        }
        result.gtin = value;
        break;
      case 'expiry':
      case 'productionDate':
        result[def.key] = parseYymmdd(value, ai, def.label, today);
        break;
      default:
        if (!CSET82.test(value)) {
          throw new UdiError(
            'bad-character',
            `(${ai}) ${def.label} ${JSON.stringify(value)} contains a character outside GS1 character set 82`,
            ai,
          );
        }
        result[def.key] = value;
    }
  }
  if (result.gtin === undefined) throw new UdiError('missing-gtin', 'the UDI has no (01) GTIN');
  const out: ParsedUdi = { gtin: result.gtin };
  if (result.lot !== undefined) out.lot = result.lot;
  if (result.serial !== undefined) out.serial = result.serial;
  if (result.expiry !== undefined) out.expiry = result.expiry;
  if (result.productionDate !== undefined) out.productionDate = result.productionDate;
  return out;
}
