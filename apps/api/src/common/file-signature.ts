// What a file is, from its first bytes, for the plain sentence of a 415: an upload route that
// refuses a file names what it received (a PDF, an image …), never trusting its name.
const startsWith = (b: Buffer, sig: readonly number[], at = 0) => sig.every((v, i) => b[at + i] === v);
const ascii = (b: Buffer, at: number, len: number) => b.subarray(at, at + len).toString('latin1');

/** The common file kinds by their signatures; null when none matches. */
export function describeFile(head: Buffer): string | null {
  if (head.length === 0) return 'an empty file';
  if (startsWith(head, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return 'a PNG image';
  if (startsWith(head, [0xff, 0xd8, 0xff])) return 'a JPEG image';
  if ((head.length >= 132 && ascii(head, 128, 4) === 'DICM') || ascii(head, 0, 4) === 'DICM') return 'a DICOM file';
  if (ascii(head, 0, 5) === '%PDF-') return 'a PDF document';
  if (ascii(head, 0, 4) === 'GIF8') return 'a GIF image';
  if (startsWith(head, [0x50, 0x4b, 0x03, 0x04])) return 'a ZIP archive';
  if (ascii(head, 0, 4) === 'RIFF') return 'a RIFF file (e.g. WebP)';
  if (startsWith(head, [0x49, 0x49, 0x2a, 0x00]) || startsWith(head, [0x4d, 0x4d, 0x00, 0x2a])) return 'a TIFF image';
  const text = head.subarray(0, 64).toString('utf8').trimStart().toLowerCase();
  if (text.startsWith('<!doctype html') || text.startsWith('<html')) return 'an HTML page';
  if (text.startsWith('<')) return 'an XML or HTML document';
  return null;
}
