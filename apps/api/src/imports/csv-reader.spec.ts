import iconv from 'iconv-lite';
import { describe, expect, it } from 'vitest';
import { decode, detectDelimiter, looksLikeFormula, readBody, records, TooLarge } from './csv-reader.js';

describe('legacy import file reading (docs/import.md)', () => {
  it('decodes UTF-8 with and without a BOM, and Windows-1252 when the bytes are not UTF-8', () => {
    expect(decode(Buffer.from('name\r\nZoë\r\n', 'utf8'))).toEqual({ text: 'name\r\nZoë\r\n', encoding: 'utf-8' });
    const bom = Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from('Zoë', 'utf8')]);
    expect(decode(bom)).toEqual({ text: 'Zoë', encoding: 'utf-8-bom' });
    // 0xEB is "ë" in Windows-1252 and never valid UTF-8 on its own; 0x80 is the euro sign there.
    expect(decode(iconv.encode('Zoë Müller €', 'win1252'))).toEqual({ text: 'Zoë Müller €', encoding: 'windows-1252' });
  });

  it('takes ; as the separator only when the header line has more of them outside quotes', () => {
    expect(detectDelimiter('a;b;c\r\n1,2')).toBe(';');
    expect(detectDelimiter('a,b,c\r\n1;2;3;4')).toBe(',');
    expect(detectDelimiter('"x;y;z",b,c\r\n')).toBe(',');
  });

  it('numbers records as a spreadsheet numbers rows, a quoted line break inside one record', async () => {
    const rows = [];
    for await (const r of records('h1,h2\r\n"a\r\nb",c\r\nd,e\r\n', ',')) rows.push(r);
    expect(rows).toEqual([
      { row: 1, cells: ['h1', 'h2'] },
      { row: 2, cells: ['a\r\nb', 'c'] },
      { row: 3, cells: ['d', 'e'] },
    ]);
  });

  it('sees formula-looking cells (OWASP CSV injection) and nothing else', () => {
    for (const cell of ['=1+1', '+SUM(A1)', '-2', '@cmd', ' =x']) expect(looksLikeFormula(cell)).toBe(true);
    for (const cell of ['Okonkwo-Reyes', '2014-03-11', 'a=b', '']) expect(looksLikeFormula(cell)).toBe(false);
  });

  it('stops reading a body as soon as it crosses the limit', async () => {
    async function* chunks() {
      yield Buffer.alloc(600);
      yield Buffer.alloc(600);
      throw new Error('read past the limit');
    }
    await expect(readBody(chunks(), 1000)).rejects.toBeInstanceOf(TooLarge);
  });
});
