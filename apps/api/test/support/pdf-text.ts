// The text of a PDF the API wrote, read back with pdf-parse (a reader independent of pdfkit, which
// writes them), whitespace runs collapsed to one space so checks do not depend on line breaks.
import { PDFParse } from 'pdf-parse';

const collapsed = (text: string) => text.replace(/\s+/g, ' ');

async function parsed<T>(pdf: Buffer, read: (parser: PDFParse) => Promise<T>): Promise<T> {
  const parser = new PDFParse({ data: pdf });
  try {
    return await read(parser);
  } finally {
    await parser.destroy();
  }
}

/** The whole document's text. */
export const pdfText = (pdf: Buffer): Promise<string> =>
  parsed(pdf, async (parser) => collapsed((await parser.getText()).text));

/** Each page's text, in order. */
export const pdfPageTexts = (pdf: Buffer): Promise<string[]> =>
  parsed(pdf, async (parser) => (await parser.getText()).pages.map((page) => collapsed(page.text)));
