// Reads a legacy import file (docs/import.md): the bytes are decoded (UTF-8 with or without a
// BOM, else Windows-1252), the separator is taken from the header line, and the records are
// streamed through csv-parse one at a time. Cells stay text: nothing here interprets them.
import { createHash } from 'node:crypto';
import { Readable } from 'node:stream';
import { parse } from 'csv-parse';
import iconv from 'iconv-lite';
import type { ImportReport } from '@torquetrail/contracts';

export class TooLarge extends Error {}

/** Reads a request body into one buffer, failing as soon as it crosses `maxBytes`. */
export async function readBody(body: AsyncIterable<Buffer>, maxBytes: number): Promise<Buffer> {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of body) {
    size += chunk.length;
    if (size > maxBytes) throw new TooLarge();
    chunks.push(chunk);
  }
  return Buffer.concat(chunks);
}

export const sha256Of = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex');

type Encoding = ImportReport['encoding'];

/**
 * UTF-8 is tried strictly: a Windows-1252 file (what older spreadsheets save) has bytes such as
 * 0xE9 "é" that are never valid UTF-8 on their own, so failing to decode is the detection.
 */
export function decode(bytes: Buffer): { text: string; encoding: Encoding } {
  const bom = bytes.length >= 3 && bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf;
  const body = bom ? bytes.subarray(3) : bytes;
  try {
    const text = new TextDecoder('utf-8', { fatal: true }).decode(body);
    return { text, encoding: bom ? 'utf-8-bom' : 'utf-8' };
  } catch {
    return { text: iconv.decode(body, 'win1252'), encoding: 'windows-1252' };
  }
}

/** `;` when the header line has more of them than commas outside quotes, else `,`. */
export function detectDelimiter(text: string): ',' | ';' {
  let commas = 0;
  let semicolons = 0;
  let quoted = false;
  for (const ch of text) {
    if (ch === '"') quoted = !quoted;
    else if (!quoted && (ch === '\n' || ch === '\r')) break;
    else if (!quoted && ch === ',') commas++;
    else if (!quoted && ch === ';') semicolons++;
  }
  return semicolons > commas ? ';' : ',';
}

export interface CsvRecord {
  /** As a spreadsheet numbers it: the header is row 1. */
  row: number;
  cells: string[];
}

/** The records after the header, streamed through csv-parse. */
export async function* records(text: string, delimiter: ',' | ';'): AsyncGenerator<CsvRecord> {
  const parser = Readable.from([text]).pipe(
    parse({ delimiter, relax_column_count: true, skip_empty_lines: true, trim: false, bom: false }),
  );
  let row = 0;
  for await (const cells of parser as AsyncIterable<string[]>) {
    row++;
    yield { row, cells };
  }
}

/** A header cell as a column name: case and surrounding spaces ignored. */
export const columnName = (cell: string) => cell.trim().toLowerCase();

/** A spreadsheet would evaluate a cell starting like this (OWASP "CSV injection"). */
export const looksLikeFormula = (cell: string) => /^[=+\-@\t\r]/.test(cell.trimStart());
