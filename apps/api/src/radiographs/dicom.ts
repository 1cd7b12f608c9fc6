import * as dicomParserNs from 'dicom-parser';
import type { DataSet } from 'dicom-parser';

// dicom-parser ships a UMD bundle: under Node's ESM loader its API is the CommonJS default export.
const dicomParser: typeof dicomParserNs =
  (dicomParserNs as unknown as { default?: typeof dicomParserNs }).default ?? dicomParserNs;

/** Transfer syntaxes whose pixel data the preview decodes (PS3.5 §10: native, little endian). */
const EXPLICIT_VR_LITTLE_ENDIAN = '1.2.840.10008.1.2.1';
const IMPLICIT_VR_LITTLE_ENDIAN = '1.2.840.10008.1.2';
export const DECODABLE = new Set([EXPLICIT_VR_LITTLE_ENDIAN, IMPLICIT_VR_LITTLE_ENDIAN]);

/** Names of the transfer syntaxes (PS3.6 Table A-1) a clinic is likely to send, for messages. */
const TRANSFER_SYNTAX_NAMES: Record<string, string> = {
  [IMPLICIT_VR_LITTLE_ENDIAN]: 'Implicit VR Little Endian',
  [EXPLICIT_VR_LITTLE_ENDIAN]: 'Explicit VR Little Endian',
  '1.2.840.10008.1.2.1.99': 'Deflated Explicit VR Little Endian',
  '1.2.840.10008.1.2.2': 'Explicit VR Big Endian',
  '1.2.840.10008.1.2.4.50': 'JPEG Baseline (Process 1)',
  '1.2.840.10008.1.2.4.51': 'JPEG Extended (Process 2 & 4)',
  '1.2.840.10008.1.2.4.57': 'JPEG Lossless, Non-Hierarchical (Process 14)',
  '1.2.840.10008.1.2.4.70': 'JPEG Lossless, First-Order Prediction',
  '1.2.840.10008.1.2.4.80': 'JPEG-LS Lossless',
  '1.2.840.10008.1.2.4.81': 'JPEG-LS Near-Lossless',
  '1.2.840.10008.1.2.4.90': 'JPEG 2000 (Lossless Only)',
  '1.2.840.10008.1.2.4.91': 'JPEG 2000',
  '1.2.840.10008.1.2.5': 'RLE Lossless',
};
export const transferSyntaxName = (uid: string) => TRANSFER_SYNTAX_NAMES[uid] ?? uid;

/** The attributes measurement and the preview need (PS3.3; tags in the comments). */
export interface DicomAttributes {
  transferSyntaxUid: string;
  rows: number | null;
  columns: number | null;
  pixelSpacing: [number, number] | null;
  imagerPixelSpacing: [number, number] | null;
  magnificationFactor: number | null;
  /** Study Date (0008,0020), else Acquisition Date (0008,0022), as YYYY-MM-DD. */
  studyDate: string | null;
  modality: string | null;
  bitsStored: number | null;
  photometricInterpretation: string | null;
}

export class DicomUnreadable extends Error {}

/** A Part 10 byte array always starts with the 128-byte preamble; a stripped file gets a blank one back. */
export const withPreamble = (bytes: Uint8Array, hasPreamble: boolean): Uint8Array =>
  hasPreamble ? bytes : Buffer.concat([Buffer.alloc(128), bytes]);

export function parseDicom(bytes: Uint8Array, untilPixelData: boolean): DataSet {
  try {
    return dicomParser.parseDicom(bytes, untilPixelData ? { untilTag: 'x7fe00010' } : {});
  } catch (e) {
    // dicom-parser throws strings as well as Errors.
    const reason = e instanceof Error ? e.message : String(e);
    throw new DicomUnreadable(`The DICOM file cannot be read: ${reason.replace(/^dicomParser\.\w+: /, '')}`);
  }
}

const pair = (ds: DataSet, tag: string): [number, number] | null => {
  const a = ds.floatString(tag, 0);
  const b = ds.floatString(tag, 1);
  return a !== undefined && b !== undefined && a > 0 && b > 0 ? [a, b] : null;
};
const isoDate = (da: string | undefined): string | null => {
  const m = da?.trim().match(/^(\d{4})(\d{2})(\d{2})$/);
  return m ? `${m[1]}-${m[2]}-${m[3]}` : null;
};
const text = (ds: DataSet, tag: string): string | null => ds.string(tag)?.trim() || null;

export function dicomAttributes(ds: DataSet): DicomAttributes {
  const transferSyntaxUid = text(ds, 'x00020010');
  if (!transferSyntaxUid) throw new DicomUnreadable('The DICOM file has no Transfer Syntax UID (0002,0010)');
  const magnification = ds.floatString('x00181114');
  return {
    transferSyntaxUid,
    rows: ds.uint16('x00280010') ?? null,
    columns: ds.uint16('x00280011') ?? null,
    pixelSpacing: pair(ds, 'x00280030'),
    imagerPixelSpacing: pair(ds, 'x00181164'),
    magnificationFactor: magnification !== undefined && Number.isFinite(magnification) ? magnification : null,
    studyDate: isoDate(ds.string('x00080020')) ?? isoDate(ds.string('x00080022')),
    modality: text(ds, 'x00080060'),
    bitsStored: ds.uint16('x00280101') ?? null,
    photometricInterpretation: text(ds, 'x00280004'),
  };
}
