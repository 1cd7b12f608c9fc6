// Every PDF the product writes starts here: an A4 pdfkit document set in Noto Sans, embedded.
// The standard-14 Helvetica of PDF readers knows Windows-1252 only, so names such as "Łucja
// Ødegård-Nguyễn" came out as wrong letters. Noto Sans is the web app's own font
// (@fontsource/noto-sans), shipped as one file per script (latin, latin-ext, vietnamese, greek,
// cyrillic …) with the unicode range each covers: a text is drawn in runs, each in the file that
// holds its letters, so every name keeps its letters in the PDF and in text copied out of it.
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type PDFDocument from 'pdfkit';

/** The two weights the documents use; pass them to `doc.font`. */
export const FONT = { regular: 'NotoSans', bold: 'NotoSans-Bold' } as const;
type Family = (typeof FONT)[keyof typeof FONT];

interface Face {
  /** The name the file is registered under in each document. */
  name: string;
  file: Buffer;
  ranges: [number, number][];
}

// A require of our own to find the font package's files (knip sees the dependency through it).
const require = createRequire(import.meta.url);

/** "U+0000-00FF,U+0131" → [[0x0, 0xff], [0x131, 0x131]] */
function parseRanges(unicodeRange: string): [number, number][] {
  return unicodeRange.split(',').map((part) => {
    const [from, to] = part.trim().replace(/^U\+/i, '').split('-');
    const start = Number.parseInt(from, 16);
    return [start, to === undefined ? start : Number.parseInt(to, 16)];
  });
}

function loadFaces(family: Family, weight: 400 | 700): Face[] {
  const ranges = JSON.parse(readFileSync(require.resolve('@fontsource/noto-sans/unicode.json'), 'utf8')) as Record<
    string,
    string
  >;
  // Latin first: it holds the digits, spaces and punctuation every line starts with.
  const subsets = Object.keys(ranges).sort((a, b) => Number(b === 'latin') - Number(a === 'latin'));
  return subsets.map((subset) => ({
    name: subset === 'latin' ? family : `${family}/${subset}`,
    file: readFileSync(require.resolve(`@fontsource/noto-sans/files/noto-sans-${subset}-${weight}-normal.woff`)),
    ranges: parseRanges(ranges[subset]),
  }));
}

let faces: Record<Family, Face[]> | null = null;
/** Read once per process, on the first document. */
function allFaces(): Record<Family, Face[]> {
  faces ??= { [FONT.regular]: loadFaces(FONT.regular, 400), [FONT.bold]: loadFaces(FONT.bold, 700) };
  return faces;
}

const covers = (face: Face, cp: number) => face.ranges.some(([a, b]) => cp >= a && cp <= b);

/** The text cut into runs of one face each (a letter no file holds stays with the latin face). */
function fontRuns(family: Family, text: string): { face: string; text: string }[] {
  const list = allFaces()[family];
  const runs: { face: string; text: string }[] = [];
  for (const ch of text) {
    const cp = ch.codePointAt(0)!;
    const face = (list.find((f) => covers(f, cp)) ?? list[0]).name;
    const last = runs.at(-1);
    if (last && last.face === face) last.text += ch;
    else runs.push({ face, text: ch });
  }
  return runs;
}

type TextOptions = PDFKit.Mixins.TextOptions;

let loaded: Promise<typeof PDFDocument> | undefined;
/**
 * pdfkit and what it brings (fontkit, its tables), loaded with the first document: several MB of
 * heap in every API process from its start, for a few printouts a day.
 */
function pdfkit(): Promise<typeof PDFDocument> {
  loaded ??= import('pdfkit').then((m) => m.default);
  return loaded;
}

/**
 * A new document in Noto Sans. `doc.text` draws each run in its face, continuing the line
 * between runs, so callers write text as usual after `doc.font(FONT.regular | FONT.bold)`.
 */
export async function notoPdfDocument(options: PDFKit.PDFDocumentOptions): Promise<PDFKit.PDFDocument> {
  const Document = await pdfkit();
  // An empty default font: pdfkit would otherwise load Helvetica and write it into the file.
  const doc = new Document({ ...options, font: '' });
  for (const list of Object.values(allFaces())) for (const f of list) doc.registerFont(f.name, f.file);

  let family: Family = FONT.regular;
  const setFont = doc.font.bind(doc);
  const drawText = doc.text.bind(doc);
  doc.font = (src: PDFKit.Mixins.PDFFontSource, familyOrSize?: string | number, size?: number) => {
    if (src === FONT.regular || src === FONT.bold) family = src;
    return typeof familyOrSize === 'string' ? setFont(src, familyOrSize, size) : setFont(src, familyOrSize);
  };

  doc.text = (text: string, ...rest: (number | TextOptions | undefined)[]) => {
    const runs = fontRuns(family, text);
    if (runs.length <= 1) return drawText(text, ...(rest as [number, number, TextOptions]));
    const at = rest.filter((r): r is number => typeof r === 'number');
    const opts = rest.find((r): r is TextOptions => typeof r === 'object' && r !== null) ?? {};
    runs.forEach((run, n) => {
      setFont(run.face);
      const last = n === runs.length - 1;
      const runOpts = { ...opts, continued: last ? (opts.continued ?? false) : true };
      if (n === 0 && at.length === 2) drawText(run.text, at[0], at[1], runOpts);
      else drawText(run.text, runOpts);
    });
    setFont(family);
    return doc;
  };
  doc.font(FONT.regular);
  return doc;
}

/** The document's bytes, once `doc.end()` is called. */
export function pdfBytes(doc: PDFKit.PDFDocument): Promise<Buffer> {
  const chunks: Buffer[] = [];
  return new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
}
