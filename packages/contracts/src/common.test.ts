// The shared text and date primitives every contract uses: control characters and dates beyond
// the accepted range are refused with a plain message (a 400 naming the field in the API).
import { describe, expect, it } from 'vitest';
import { IsoDate, IsoDateTime, NoteText, PlainText, TextAllowing } from './common.js';
import { PatientListQuery } from './patients.js';
import { PlacementBody } from './placements.js';
import { RecallDeskQuery } from './recalls.js';

const message = (r: { success: boolean; error?: { issues: { message: string }[] } }) => r.error?.issues[0]?.message;

describe('PlainText', () => {
  it('accepts ordinary text in any script and trims it', () => {
    expect(PlainText(40).parse('  Łukasz Øvergård — 김민준  ')).toBe('Łukasz Øvergård — 김민준');
  });

  it.each([
    ['NUL', 'a\u0000b'],
    ['tab', 'a\tb'],
    ['line feed', 'a\nb'],
    ['escape', 'a\u001bb'],
    ['DEL', 'a\u007fb'],
  ])('refuses a %s inside one line', (_, text) => {
    const r = PlainText(40).safeParse(text);
    expect(r.success).toBe(false);
    expect(message(r)).toBe('Remove the invisible control characters from this text');
  });

  it('refuses text over its length with the length in words', () => {
    expect(message(PlainText(5).safeParse('x'.repeat(6)))).toBe('At most 5 characters');
  });
});

describe('NoteText', () => {
  it('keeps tabs and line breaks inside a note', () => {
    expect(NoteText(100).parse('Line one\r\n\tLine two')).toBe('Line one\r\n\tLine two');
  });

  it.each(['\u0000', '\u0007', '\u000b', '\u001f', '\u007f'])('refuses the control character %j', (c) => {
    expect(NoteText(100).safeParse(`before${c}after`).success).toBe(false);
  });
});

describe('TextAllowing', () => {
  it('keeps the allowed control characters and refuses every other', () => {
    const udi = TextAllowing(['\u001d', '\r', '\n'], 100);
    expect(udi.parse('0109506000134352\u001d10LOT\r\n')).toBe('0109506000134352\u001d10LOT\r\n');
    expect(udi.safeParse('0109506000134352\u000010LOT').success).toBe(false);
  });
});

describe('IsoDate', () => {
  it.each(['1900-01-01', '2024-02-29', '2100-12-31'])('accepts %s', (d) => {
    expect(IsoDate.parse(d)).toBe(d);
  });

  it.each(['0000-01-01', '1899-12-31', '2101-01-01', '9999-12-31'])('refuses %s as out of range', (d) => {
    expect(message(IsoDate.safeParse(d))).toBe('Enter a date between 1900-01-01 and 2100-12-31');
  });

  it.each(['2023-02-29', '2024-13-01', '24-01-01', '2024-01-01T00:00:00Z', ''])('refuses %j as not a date', (d) => {
    expect(message(IsoDate.safeParse(d))).toBe('Enter a date as YYYY-MM-DD');
  });
});

describe('IsoDateTime', () => {
  it('accepts an instant with an offset inside the range', () => {
    expect(IsoDateTime.parse('2025-01-10T10:00:00+01:00')).toBe('2025-01-10T10:00:00+01:00');
  });

  it.each(['0000-01-01T00:00:00Z', '1899-12-31T23:59:59Z', '2100-12-31T23:00:00-05:00', '9999-01-01T00:00:00Z'])(
    'refuses %s as out of range',
    (t) => {
      expect(message(IsoDateTime.safeParse(t))).toBe('Enter a date between 1900-01-01 and 2100-12-31');
    },
  );

  it('refuses an instant without an offset', () => {
    expect(IsoDateTime.safeParse('2025-01-10T10:00:00').success).toBe(false);
  });
});

describe('the contracts use them', () => {
  it('the patient search and the desk search refuse a NUL', () => {
    expect(PatientListQuery.safeParse({ search: 'Whit\u0000' }).success).toBe(false);
    expect(RecallDeskQuery.safeParse({ search: '\u0000' }).success).toBe(false);
  });

  it('a placement refuses a NUL in its notes and a year-0000 date, naming the fields', () => {
    const r = PlacementBody.safeParse({
      platformId: '00000000-0000-4000-8000-000000000000',
      placedOn: '0000-01-01',
      lengthMm: 10,
      notes: 'ok\u0000',
    });
    expect(r.success).toBe(false);
    expect(r.error?.issues.map((i) => i.path.join('.')).sort()).toEqual(['notes', 'placedOn']);
  });
});
