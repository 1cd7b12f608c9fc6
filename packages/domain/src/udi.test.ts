import { describe, it, expect } from 'vitest';
import * as fc from 'fast-check';
import { isValid as gtinLibIsValid } from 'gtin';
import { GS, gtinCheckDigit, isValidGtin, parseUdi } from './udi.js';
import { UdiError, type UdiErrorCode } from './errors.js';

// Sources: GS1 General Specifications (check digit, dates) [memory for section numbers];
// GS1 Barcode Syntax Dictionary (AI formats) [pub]. Cross-check reference library: npm `gtin` 1.0.2.

const TODAY = new Date(Date.UTC(2026, 11, 1)); // 2026-12-01
const GTIN = '05012345678900'; // GS1 UK example 501234567890 + check 0, padded to 14 [pub]
const GTIN2 = '06291041500213'; // GS1 example 629104150021 + check 3 [pub]

function udiCode(fn: () => unknown): UdiErrorCode | undefined {
  try {
    fn();
  } catch (e) {
    return e instanceof UdiError ? e.code : (`not a UdiError: ${String(e)}` as UdiErrorCode);
  }
  return undefined;
}

describe('gtinCheckDigit — GS1 General Specifications check digit (weights 3,1,3… from the right) [memory for §]', () => {
  it('629104150021 → 3 (GS1 example) [pub]', () => expect(gtinCheckDigit('629104150021')).toBe(3));
  it('501234567890 → 0 (GS1 UK) [pub]', () => expect(gtinCheckDigit('501234567890')).toBe(0));
  it('leading zeros do not change the check digit (GTIN-13 padded to 14)', () => {
    expect(gtinCheckDigit('0629104150021')).toBe(3);
  });
  it.each(['', '12a', '123456789012345678', ' 123', '12.3'])('rejects %j with UdiError bad-format', (d) => {
    expect(udiCode(() => gtinCheckDigit(d))).toBe('bad-format');
  });
});

describe('isValidGtin', () => {
  it('accepts GTIN-8/12/13/14 with the right check digit', () => {
    expect(isValidGtin('6291041500213')).toBe(true);
    expect(isValidGtin(GTIN)).toBe(true);
    expect(isValidGtin(GTIN2)).toBe(true);
    expect(isValidGtin('96385074')).toBe(true); // GTIN-8 GS1 example [memory]
  });
  it('a GTIN-14 whose last digit is wrong is rejected (reference §4)', () => {
    expect(isValidGtin('05012345678901')).toBe(false);
  });
  it.each(['', '1234567', '123456789', '123456789012345', 'abcdefghijklm', '0501234567890 '])(
    'rejects malformed %j without throwing',
    (g) => {
      expect(isValidGtin(g)).toBe(false);
    },
  );
});

describe('cross-check against the npm `gtin` package (reference implementation)', () => {
  it('property: a GTIN with its computed check digit always validates, here and in `gtin`', () => {
    fc.assert(
      fc.property(fc.constantFrom(7, 11, 12, 13), fc.stringMatching(/^\d{13}$/), (len, digits) => {
        const data = digits.slice(0, len);
        const full = data + String(gtinCheckDigit(data));
        return isValidGtin(full) && gtinLibIsValid(full);
      }),
    );
  });
  it('property: any other last digit fails, here and in `gtin`', () => {
    fc.assert(
      fc.property(fc.stringMatching(/^\d{13}$/), fc.integer({ min: 1, max: 9 }), (data, shift) => {
        const wrong = data + String((gtinCheckDigit(data) + shift) % 10);
        return !isValidGtin(wrong) && !gtinLibIsValid(wrong);
      }),
    );
  });
  it('property: agrees with `gtin` on arbitrary 8/12/13/14-digit strings', () => {
    fc.assert(
      fc.property(
        fc.oneof(fc.stringMatching(/^\d{8}$/), fc.stringMatching(/^\d{12,14}$/)),
        (s) => isValidGtin(s) === gtinLibIsValid(s),
      ),
    );
  });
});

describe('parseUdi — human-readable form (GS1 Barcode Syntax Dictionary [pub])', () => {
  it('parses GTIN, expiry, lot, serial, production date', () => {
    expect(parseUdi(`(01)${GTIN}(17)270228(10)ABC123(21)SN-0001(11)250115`, TODAY)).toEqual({
      gtin: GTIN,
      expiry: '2027-02-28',
      lot: 'ABC123',
      serial: 'SN-0001',
      productionDate: '2025-01-15',
    });
  });
  it('tolerates spaces around the AI tokens [decision]', () => {
    expect(parseUdi(` (01) ${GTIN} (10) L1 `, TODAY)).toEqual({ gtin: GTIN, lot: 'L1' });
  });
  it('lot may be 20 characters; 21 is too-long', () => {
    expect(parseUdi(`(01)${GTIN}(10)${'A'.repeat(20)}`, TODAY).lot).toBe('A'.repeat(20));
    expect(udiCode(() => parseUdi(`(01)${GTIN}(10)${'A'.repeat(21)}`, TODAY))).toBe('too-long');
  });
  it('GTIN only', () => expect(parseUdi(`(01)${GTIN2}`, TODAY)).toEqual({ gtin: GTIN2 }));
});

describe('parseUdi — raw form with GS separators and symbology identifiers', () => {
  // AI 01 GTIN, AI 17 expiry 270228, AI 10 lot (GS-terminated), AI 21 serial.
  const raw = `01${GTIN}1727022810ABC123${GS}21SN1`;
  it.each(['', ']d2', ']C1', ']Q3'])('prefix %j', (prefix) => {
    expect(parseUdi(prefix + raw, TODAY)).toEqual({ gtin: GTIN, expiry: '2027-02-28', lot: 'ABC123', serial: 'SN1' });
  });
  it('a variable-length element that is last needs no GS; a trailing GS, a leading GS and CR/LF are tolerated', () => {
    expect(parseUdi(`${GS}01${GTIN}21SN1${GS}\r\n`, TODAY)).toEqual({ gtin: GTIN, serial: 'SN1' });
  });
  it('a GS after a fixed-length element is tolerated [decision]', () => {
    expect(parseUdi(`01${GTIN}${GS}17270200${GS}10L`, TODAY)).toEqual({ gtin: GTIN, expiry: '2027-02-28', lot: 'L' });
  });
  it('a lot not followed by GS when more elements follow cannot be split: the rest is read as lot (reference §4)', () => {
    // Nothing in the data marks the end of the lot: the following "17270228" is part of it.
    const r = parseUdi(`01${GTIN}10ABC17270228`, TODAY);
    expect(r.lot).toBe('ABC17270228');
    expect(r.expiry).toBeUndefined();
  });
  it('…and is rejected as too-long when the run exceeds 20 characters', () => {
    expect(udiCode(() => parseUdi(`01${GTIN}10ABCDEFGHIJ1727022821SERIAL123`, TODAY))).toBe('too-long');
  });
  it('unknown symbology identifier → bad-format', () => {
    expect(udiCode(() => parseUdi(`]E0${raw}`, TODAY))).toBe('bad-format');
  });
});

describe('parseUdi — dates: DD = 00 and the century rule (GS1 General Specifications [memory for §])', () => {
  it('DD = 00 means the last day of the month', () => {
    expect(parseUdi(`01${GTIN}17270200`, TODAY).expiry).toBe('2027-02-28');
    expect(parseUdi(`01${GTIN}17280200`, TODAY).expiry).toBe('2028-02-29'); // leap year
    expect(parseUdi(`01${GTIN}17261200`, TODAY).expiry).toBe('2026-12-31');
    expect(parseUdi(`01${GTIN}17260400`, TODAY).expiry).toBe('2026-04-30');
  });
  it('expiry 270230 is an invalid date (reference §4)', () => {
    expect(udiCode(() => parseUdi(`01${GTIN}17270230`, TODAY))).toBe('bad-date');
  });
  it.each(['271301', '270001', '270431', '2702AB', '27-2-1'])('bad date %s', (d) => {
    expect(udiCode(() => parseUdi(`(01)${GTIN}(17)${d}`, TODAY))).toBe('bad-date');
  });
  it('a 5-digit date is truncated', () => {
    expect(udiCode(() => parseUdi(`(01)${GTIN}(17)27023`, TODAY))).toBe('truncated');
  });
  it('29 Feb only in leap years', () => {
    expect(parseUdi(`01${GTIN}17280229`, TODAY).expiry).toBe('2028-02-29');
    expect(udiCode(() => parseUdi(`01${GTIN}17270229`, TODAY))).toBe('bad-date');
  });
  // today 2026: d = YY − 26. d ≥ 51 → 19YY; −50 < d < 51 → 20YY; d ≤ −50 → 21YY.
  it.each([
    ['760101', '2076-01-01'], // d = 50 → current century
    ['770101', '1977-01-01'], // d = 51 → previous century
    ['990101', '1999-01-01'],
    ['000101', '2000-01-01'], // d = −26
    ['260101', '2026-01-01'],
  ])('today 2026: YYMMDD %s → %s', (d, iso) => {
    expect(parseUdi(`01${GTIN}11${d}`, TODAY).productionDate).toBe(iso);
  });
  it('d ≤ −50 → next century: today 2090, YY 40 (d = −50) → 2140; YY 41 (d = −49) → 2041', () => {
    const t = new Date(Date.UTC(2090, 5, 1));
    expect(parseUdi(`01${GTIN}17400101`, t).expiry).toBe('2140-01-01');
    expect(parseUdi(`01${GTIN}17410101`, t).expiry).toBe('2041-01-01');
  });
});

describe('parseUdi — errors are typed UdiErrors with a code', () => {
  it.each<[string, string, UdiErrorCode]>([
    ['empty', '', 'empty'],
    ['only a symbology identifier', ']d2', 'empty'],
    ['bad check digit', `01${GTIN.slice(0, 13)}1`, 'bad-check-digit'],
    ['bad check digit (HRI)', `(01)05012345678901`, 'bad-check-digit'],
    ['GTIN with a letter', `(01)0501234567890A`, 'bad-format'],
    ['GTIN too short (raw)', `01050123456789`, 'truncated'],
    ['GTIN too short (HRI)', `(01)0501234567890(10)A`, 'truncated'],
    ['GTIN too long (HRI)', `(01)050123456789000`, 'too-long'],
    ['unknown AI (raw)', `01${GTIN}240ABC`, 'unknown-ai'],
    ['unknown AI (HRI)', `(01)${GTIN}(240)ABC`, 'unknown-ai'],
    ['missing GTIN', `10ABC${GS}17270228`, 'missing-gtin'],
    ['missing GTIN (HRI)', `(10)ABC`, 'missing-gtin'],
    ['AI without value at the end', `01${GTIN}10`, 'truncated'],
    ['AI cut in half', `01${GTIN}1`, 'truncated'],
    ['date cut short', `01${GTIN}172702`, 'truncated'],
    ['empty lot before GS', `01${GTIN}10${GS}21X`, 'truncated'],
    ['double GS after a variable element', `01${GTIN}10A${GS}${GS}21X`, 'truncated'],
    ['serial over 20 characters', `01${GTIN}21${'9'.repeat(21)}`, 'too-long'],
    ['space in a lot', `(01)${GTIN}(10)AB C`, 'bad-character'],
    ['non-CSET-82 character in a serial', `01${GTIN}21AB#`, 'bad-character'],
    ['duplicate AI', `01${GTIN}10A${GS}10B`, 'duplicate-ai'],
    ['garbage', `hello`, 'bad-format'],
    ['HRI text after the GTIN makes it too long', `(01)${GTIN}x(10)A`, 'too-long'],
    ['HRI text before the first AI', `(01${GTIN}`, 'bad-format'],
  ])('%s → %s', (_name, data, code) => {
    expect(udiCode(() => parseUdi(data, TODAY))).toBe(code);
  });
  it('bad today → bad-format', () => {
    expect(udiCode(() => parseUdi(`01${GTIN}`, new Date(Number.NaN)))).toBe('bad-format');
  });
  it('the error names the AI', () => {
    expect(() => parseUdi(`01${GTIN}17270230`, TODAY)).toThrow(expect.objectContaining({ ai: '17' }));
  });
});
