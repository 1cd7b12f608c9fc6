// The streaming DICOM decoder, fed files written by dcmjs (an independent PS3.10 writer) in small
// chunks that cut rows apart, checked against values worked out by hand.
import { describe, expect, it } from 'vitest';
import { dicomFile } from '../../test/support/radiograph-fixtures.js';
import { decodeDicomStream } from './dicom-pixels.js';

async function* chunked(bytes: Buffer, size: number): AsyncGenerator<Buffer> {
  for (let at = 0; at < bytes.length; at += size) yield bytes.subarray(at, at + size);
}

// 800 × 800 16-bit (1.28 MB, more than the 1 MB header read, so most rows come from later chunks):
// four 400 × 400 quadrants of 100, 400, 700 and 1000, each pixel ±1 or ±3 around its quadrant's
// value along the row so that every 4 × 4 cell averages exactly to it.
const quadrants = () =>
  dicomFile({
    rows: 800,
    columns: 800,
    bits: 16,
    photometric: 'MONOCHROME2',
    pixel: (r, c) => 100 + 300 * (2 * Math.floor(r / 400) + Math.floor(c / 400)) + [-3, -1, 1, 3][c % 4],
    // window 750.5 / 1501 (PS3.3 C.11.2.1.2): y = ((x − 750) ÷ 1500 + 0.5) × 255 = x × 255 ÷ 1500
    window: { center: 750.5, width: 1501 },
  });

describe('decodeDicomStream', () => {
  it('reduces a large image by 4 × 4 box means while reading 1000-byte chunks, then windows it', async () => {
    const out = await decodeDicomStream(chunked(quadrants(), 1000), { maxPixels: 1e6, maxSide: 200 });
    expect(out.ok).toBe(true);
    if (!out.ok) return;
    expect([out.width, out.height, out.sourceWidth, out.sourceHeight]).toEqual([200, 200, 800, 800]);
    const at = (row: number, col: number) => out.grey[row * out.width + col];
    // 100 × 255 ÷ 1500 = 17; 400 → 68; 700 → 119; 1000 → 170
    expect([at(0, 0), at(0, 199), at(199, 0), at(199, 199), at(99, 100)]).toEqual([17, 68, 119, 170, 68]);
  });

  it('gives the same image for a file without its preamble and fed in one piece', async () => {
    const whole = await decodeDicomStream(chunked(quadrants(), 1 << 30), { maxPixels: 1e6, maxSide: 200 });
    const stripped = await decodeDicomStream(chunked(quadrants().subarray(128), 777), {
      maxPixels: 1e6,
      maxSide: 200,
    });
    expect(whole.ok && stripped.ok && Buffer.compare(whole.grey, stripped.grey)).toBe(0);
  });

  it('keeps full resolution below the preview size: each pixel windowed as a whole-image decoder does', async () => {
    const file = dicomFile({
      rows: 3,
      columns: 5,
      bits: 16,
      photometric: 'MONOCHROME1',
      pixel: (_r, c) => c * 1000,
      // automatic window over 0.5–99.5 % of the values 0…4000: lo 0, hi 4000, width 4001, centre 2000.5
    });
    const out = await decodeDicomStream(chunked(file, 64), { maxPixels: 1e6, maxSide: 2048 });
    expect(out.ok).toBe(true);
    if (!out.ok) return;
    // MONOCHROME2 values ((x − 2000) ÷ 4000 + 0.5) × 255 = 0, 63.75, 127.5, 191.25, 255 → rounded, then inverted
    expect([...out.grey.subarray(0, 5)]).toEqual([255, 191, 127, 64, 0]);
  });

  it('refuses an image over the pixel limit before reading its pixels', async () => {
    const out = await decodeDicomStream(chunked(quadrants(), 65536), { maxPixels: 640_000 - 1, maxSide: 2048 });
    expect(out).toEqual({
      ok: false,
      problem: 'preview not available: image too large (800 × 800 pixels; the limit is 639999 pixels)',
    });
  });

  it('says so when the stream ends before the last row', async () => {
    const file = quadrants();
    const out = await decodeDicomStream(chunked(file.subarray(0, file.length - 5000), 4096), {
      maxPixels: 1e6,
      maxSide: 200,
    });
    expect(out).toEqual({ ok: false, problem: 'preview not available: the pixel data is shorter than Rows × Columns' });
  });
});
