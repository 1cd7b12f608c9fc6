import { describe, expect, it } from 'vitest';
import { csvField, csvLine } from './csv.js';

describe('CSV (RFC 4180)', () => {
  it('quotes commas, quotes and line breaks, and defuses formulas', () => {
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField('=HYPERLINK("x")')).toBe(`"'=HYPERLINK(""x"")"`);
    expect(csvField(-3)).toBe('-3');
    expect(csvField(null)).toBe('');
    expect(csvLine(['x', 1, null])).toBe('x,1,\r\n');
  });
});
