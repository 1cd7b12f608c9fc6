import type { RadiographFileType } from '@torquetrail/contracts';
import { describeFile } from '../common/file-signature.js';

const PNG = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
const JPEG = [0xff, 0xd8, 0xff];
const startsWith = (b: Buffer, sig: readonly number[], at = 0) => sig.every((v, i) => b[at + i] === v);
const ascii = (b: Buffer, at: number, len: number) => b.subarray(at, at + len).toString('latin1');

/** Where the DICOM data set's File Meta Information starts: after 'DICM' at 128 (PS3.10 §7.1), or at 4 without preamble. */
export type Detected = { type: RadiographFileType; dicomPreamble?: boolean } | { type: null; described: string };

/**
 * The file's type from its first bytes only, never from its name or the client's content type:
 * PNG signature (ISO/IEC 15948 §5.2), JPEG SOI marker followed by a marker (ISO/IEC 10918-1),
 * DICOM Part 10: 128-byte preamble then 'DICM' (PS3.10 §7.1). A file whose preamble was stripped
 * (starting with 'DICM') is accepted as DICOM too. Anything else is named as well as we can for the 415.
 */
export function detectFileType(head: Buffer): Detected {
  if (startsWith(head, PNG)) return { type: 'png' };
  if (startsWith(head, JPEG)) return { type: 'jpeg' };
  if (head.length >= 132 && ascii(head, 128, 4) === 'DICM') return { type: 'dicom', dicomPreamble: true };
  if (ascii(head, 0, 4) === 'DICM') return { type: 'dicom', dicomPreamble: false };
  return { type: null, described: describe(head) };
}

function describe(head: Buffer): string {
  return describeFile(head) ?? 'not a recognised image';
}

/** The content type an original is served with. */
export const CONTENT_TYPES: Record<RadiographFileType, string> = {
  png: 'image/png',
  jpeg: 'image/jpeg',
  dicom: 'application/dicom',
};
