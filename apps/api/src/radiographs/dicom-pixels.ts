import type { DataSet } from 'dicom-parser';
import {
  DECODABLE,
  dicomAttributes,
  DicomUnreadable,
  parseDicom,
  transferSyntaxName,
  withPreamble,
  type DicomAttributes,
} from './dicom.js';
import { HEADER_BYTES } from '../storage/upload-stream.js';

/** An 8-bit greyscale image no larger than the preview, and the size of the full image it shows. */
export type GreyImage =
  | { ok: true; width: number; height: number; grey: Buffer; sourceWidth: number; sourceHeight: number }
  | { ok: false; problem: string };

interface Limits {
  /** Rows × Columns above which nothing is decoded. */
  maxPixels: number;
  /** Longest side of the image handed back; larger images are box-averaged down while they are read. */
  maxSide: number;
}

const unavailable = (why: string): GreyImage => ({ ok: false, problem: `preview not available: ${why}` });

/** The problem of an image over the pixel limit, with its size when known. */
export function tooLargeProblem(maxPixels: number, size?: { width: number; height: number }): string {
  const limit = maxPixels >= 1e6 ? `${Number((maxPixels / 1e6).toFixed(1))} million` : String(maxPixels);
  const dims = size ? `${size.width} × ${size.height} pixels; ` : '';
  return `preview not available: image too large (${dims}the limit is ${limit} pixels)`;
}

/**
 * Decodes the first frame of native (uncompressed, little endian) greyscale DICOM pixel data from a
 * stream, row by row, without ever holding the full-size image: each row is added to a histogram
 * of the stored values and box-averaged into an image at most `maxSide` on its longest side. Then
 * the Modality LUT (Rescale Slope/Intercept) and the VOI window are applied to the small image (its
 * cell means rounded to stored values) —
 * Window Center/Width from the file with the linear function of PS3.3 C.11.2.1.2, else an automatic
 * window over the 0.5–99.5 % range of the full-resolution histogram — and MONOCHROME1 is inverted
 * so that bone is always light. Memory: the header (1 MB), one row, the histogram (≤ 256 KB) and
 * 2 bytes per pixel of the reduced image (≤ 8 MB at 2048 × 2048). An image small enough not to be
 * reduced gets exactly the values a whole-image decoder gives.
 */
export async function decodeDicomStream(source: AsyncIterable<Uint8Array>, limits: Limits): Promise<GreyImage> {
  const it = source[Symbol.asyncIterator]();
  try {
    return await decode(it, limits);
  } finally {
    // Stops the download when the pixels end early or a problem was found in the header.
    await it.return?.();
  }
}

async function decode(it: AsyncIterator<Uint8Array>, limits: Limits): Promise<GreyImage> {
  const chunks: Buffer[] = [];
  let headLength = 0;
  let ended = false;
  while (headLength < HEADER_BYTES) {
    const next = await it.next();
    if (next.done) {
      ended = true;
      break;
    }
    chunks.push(Buffer.from(next.value.buffer, next.value.byteOffset, next.value.length));
    headLength += next.value.length;
  }
  const head = Buffer.concat(chunks);
  const hasPreamble = head.length >= 132 && head.toString('latin1', 128, 132) === 'DICM';
  if (!hasPreamble && head.toString('latin1', 0, 4) !== 'DICM') return unavailable('the file is not DICOM');
  let ds: DataSet;
  let a: DicomAttributes;
  try {
    ds = parseDicom(withPreamble(head, hasPreamble), true);
    a = dicomAttributes(ds);
  } catch (e) {
    if (e instanceof DicomUnreadable) return unavailable(e.message);
    throw e;
  }
  if (!DECODABLE.has(a.transferSyntaxUid)) {
    return unavailable(`transfer syntax ${transferSyntaxName(a.transferSyntaxUid)} is not supported`);
  }
  const pi = a.photometricInterpretation;
  if (pi !== 'MONOCHROME1' && pi !== 'MONOCHROME2') {
    return unavailable(`photometric interpretation ${pi ?? 'missing'} is not supported`);
  }
  const el = ds.elements.x7fe00010;
  const rows = a.rows ?? 0;
  const cols = a.columns ?? 0;
  const allocated = ds.uint16('x00280100') ?? 0;
  const stored = a.bitsStored ?? allocated;
  if (!el || rows * cols === 0 || (allocated !== 8 && allocated !== 16) || stored < 1 || stored > allocated) {
    return unavailable('the pixel data is missing or of an unsupported layout');
  }
  if (rows * cols > limits.maxPixels) {
    return { ok: false, problem: tooLargeProblem(limits.maxPixels, { width: cols, height: rows }) };
  }
  const bytesPerPixel = allocated / 8;
  if (el.length < rows * cols * bytesPerPixel) {
    return unavailable('the pixel data is shorter than Rows × Columns');
  }

  const image = new StripReducer(rows, cols, stored, ds.uint16('x00280103') === 1, limits.maxSide);
  const rowBytes = cols * bytesPerPixel;
  // Rows are read straight from each chunk; only a row cut by a chunk's end is copied, into one
  // reused row buffer, so reading makes no garbage beyond the chunks themselves.
  const cut = Buffer.allocUnsafe(rowBytes);
  let cutLength = 0;
  let row = 0;
  /** Adds the rows of `buf`; true once every row has been read. */
  const feed = (buf: Buffer): boolean => {
    let at = 0;
    if (cutLength > 0) {
      at = Math.min(rowBytes - cutLength, buf.length);
      buf.copy(cut, cutLength, 0, at);
      cutLength += at;
      if (cutLength < rowBytes) return false;
      image.addRow(cut, 0, bytesPerPixel, row++);
      cutLength = 0;
    }
    for (; row < rows && buf.length - at >= rowBytes; row++, at += rowBytes) image.addRow(buf, at, bytesPerPixel, row);
    if (row < rows && at < buf.length) cutLength = buf.copy(cut, 0, at);
    return row === rows;
  };
  // Byte offsets are in the stream; dataOffset counts the 128-byte preamble a stripped file lacks.
  let complete = feed(head.subarray(el.dataOffset - (hasPreamble ? 0 : 128)));
  while (!complete && !ended) {
    const next = await it.next();
    if (next.done) ended = true;
    else complete = feed(Buffer.from(next.value.buffer, next.value.byteOffset, next.value.length));
  }
  if (!complete) return unavailable('the pixel data is shorter than Rows × Columns');

  const slope = ds.floatString('x00281053') ?? 1;
  const intercept = ds.floatString('x00281052') ?? 0;
  let center = ds.floatString('x00281050', 0);
  let width = ds.floatString('x00281051', 0);
  if (center === undefined || width === undefined || !(width >= 1)) {
    const n = rows * cols;
    const lo = image.rankedValue(Math.floor((n - 1) * 0.005), slope) * slope + intercept;
    const hi = image.rankedValue(Math.ceil((n - 1) * 0.995), slope) * slope + intercept;
    width = Math.max(hi - lo, 1) + 1;
    center = lo + (width - 1) / 2 + 0.5;
  }
  const grey = image.windowed(slope, intercept, center, width, pi === 'MONOCHROME1');
  return { ok: true, width: image.outWidth, height: image.outHeight, grey, sourceWidth: cols, sourceHeight: rows };
}

/** The full-resolution histogram and the box-averaged reduced image, built one row at a time. */
class StripReducer {
  readonly factor: number;
  readonly outWidth: number;
  readonly outHeight: number;
  private readonly histogram: Uint32Array;
  /** Cell means rounded to stored values, offset by half the range when signed (2 bytes a cell). */
  private readonly means: Uint16Array;
  private readonly offset: number;
  /** Sums of the output row being filled, in double precision (up to factor² values each). */
  private readonly strip: Float64Array;
  private readonly mask: number;
  private readonly signBit: number;

  constructor(
    private readonly rows: number,
    private readonly cols: number,
    private readonly stored: number,
    private readonly signed: boolean,
    maxSide: number,
  ) {
    this.factor = Math.max(1, Math.ceil(Math.max(rows, cols) / maxSide));
    this.outWidth = Math.ceil(cols / this.factor);
    this.outHeight = Math.ceil(rows / this.factor);
    this.histogram = new Uint32Array(1 << stored);
    this.means = new Uint16Array(this.outWidth * this.outHeight);
    this.offset = signed ? 1 << (stored - 1) : 0;
    this.strip = new Float64Array(this.outWidth);
    this.mask = (1 << stored) - 1;
    this.signBit = 1 << (stored - 1);
  }

  addRow(buf: Buffer, at: number, bytesPerPixel: number, row: number): void {
    const { factor, strip, histogram, mask, signBit, signed } = this;
    const range = 1 << this.stored;
    for (let c = 0; c < this.cols; c++) {
      const raw = (bytesPerPixel === 1 ? buf[at + c] : buf[at + 2 * c] | (buf[at + 2 * c + 1] << 8)) & mask;
      histogram[raw]++;
      strip[(c / factor) | 0] += signed && raw & signBit ? raw - range : raw;
    }
    const last = row === this.rows - 1;
    if ((row + 1) % factor !== 0 && !last) return;
    // The output row is complete: its cells' means, then a fresh strip.
    const oy = Math.floor(row / factor);
    const cellRows = row - oy * factor + 1;
    for (let ox = 0; ox < this.outWidth; ox++) {
      const cellCols = Math.min(factor, this.cols - ox * factor);
      this.means[oy * this.outWidth + ox] = Math.round(strip[ox] / (cellRows * cellCols)) + this.offset;
    }
    strip.fill(0);
  }

  /** The stored value (sign applied) at rank `k` in ascending order of the rescaled value. */
  rankedValue(k: number, slope: number): number {
    const range = 1 << this.stored;
    // Stored values in ascending numeric order: negatives (sign bit set) first when signed.
    const order = this.signed
      ? [...binRange(this.signBit, range), ...binRange(0, this.signBit)]
      : [...binRange(0, range)];
    if (slope < 0) order.reverse();
    let seen = 0;
    for (const bin of order) {
      seen += this.histogram[bin];
      if (seen > k) return this.signed && bin & this.signBit ? bin - range : bin;
    }
    return 0;
  }

  windowed(slope: number, intercept: number, center: number, width: number, invert: boolean): Buffer {
    const grey = Buffer.alloc(this.means.length);
    const low = center - 0.5 - (width - 1) / 2;
    const high = center - 0.5 + (width - 1) / 2;
    for (let i = 0; i < this.means.length; i++) {
      const x = (this.means[i] - this.offset) * slope + intercept;
      const y = x <= low ? 0 : x > high ? 255 : ((x - (center - 0.5)) / (width - 1) + 0.5) * 255;
      const v = Math.round(Math.min(255, Math.max(0, y)));
      grey[i] = invert ? 255 - v : v;
    }
    return grey;
  }
}

function* binRange(from: number, to: number): Generator<number> {
  for (let b = from; b < to; b++) yield b;
}
