import { csvLine } from '@torquetrail/contracts';
import { describe, expect, it } from 'vitest';
import { crlfRecords } from './csv-record-ends.js';

async function collect(chunks: string[]): Promise<string> {
  async function* source() {
    for (const chunk of chunks) yield Buffer.from(chunk);
  }
  const out: Buffer[] = [];
  for await (const chunk of crlfRecords(source())) out.push(chunk);
  return Buffer.concat(out).toString();
}

/** Every way of cutting `text` into two chunks, and one byte a chunk. */
const cuts = (text: string) => [
  ...Array.from({ length: text.length + 1 }, (_, i) => [text.slice(0, i), text.slice(i)]),
  text.split(''),
];

describe('crlfRecords', () => {
  it('ends each record with CRLF as csvLine does, and keeps a line break inside a quoted cell', async () => {
    const rows = [
      ['chart number', 'patient', 'notes'],
      ['LL-1', 'Ada "Al" Quill', 'two\nlines'],
      ['LL-2', 'comma, inside', 'cr\r\nand lf'],
      ['LL-3', '', 'plain'],
    ];
    // What COPY writes: the same cells and quotes, each record ended by LF alone.
    const fromCopy = rows.map((r) => csvLine(r).replace(/\r\n$/, '\n')).join('');
    const expected = rows.map((r) => csvLine(r)).join('');
    expect(expected).toContain('"two\nlines"');
    for (const chunks of cuts(fromCopy)) expect(await collect(chunks)).toBe(expected);
  });

  it('leaves text without a record end as it is, and a multi-byte character cut between chunks', async () => {
    const text = 'Zoë Ångström,"ø ""x""",é\n';
    const bytes = Buffer.from(text);
    async function* halves() {
      yield bytes.subarray(0, 2);
      yield bytes.subarray(2);
    }
    const out: Buffer[] = [];
    for await (const chunk of crlfRecords(halves())) out.push(chunk);
    expect(Buffer.concat(out).toString()).toBe('Zoë Ångström,"ø ""x""",é\r\n');
    expect(await collect(['no end'])).toBe('no end');
  });
});
