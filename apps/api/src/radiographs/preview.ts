import { createWriteStream } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type Sharp from 'sharp';
import type { RadiographFileType } from '@torquetrail/contracts';
import { decodeDicomStream, tooLargeProblem } from './dicom-pixels.js';

let loaded: Promise<typeof Sharp> | undefined;
/**
 * sharp, loaded on the first image it handles: libvips maps about 6 MB and sharp's module more,
 * in every API process from its start, while only an upload or a preview job needs them.
 */
function sharpLib(): Promise<typeof Sharp> {
  loaded ??= import('sharp').then(({ default: sharp }) => {
    // libvips keeps recently decoded images (up to 50 MB) in an operation cache and decodes one image
    // with a thread per core: neither helps a job that makes one preview at a time, both add to RSS.
    sharp.cache(false);
    sharp.concurrency(1);
    return sharp;
  });
  return loaded;
}

/** Longest side of the preview and of the thumbnail, px. */
const PREVIEW_MAX_PX = 2048;
const THUMBNAIL_MAX_PX = 192;

export type Previews =
  | { ok: true; preview: Buffer; thumbnail: Buffer; width?: number; height?: number }
  | { ok: false; problem: string };

const inside = (px: number) => ({ width: px, height: px, fit: 'inside', withoutEnlargement: true }) as const;

/**
 * A PNG preview every browser can show and a small thumbnail, made from the stored object as it is
 * read: PNG and JPEG are decoded by sharp from the stream (and re-encoded, so a hostile file is never
 * served back as-is inline); DICOM pixels are decoded row by row, windowed and reduced on the way.
 * A decoding problem is an answer ({ ok: false }); an error of the source (storage) is thrown, so
 * the job retries it.
 */
export async function makePreviews(
  type: RadiographFileType,
  source: AsyncIterable<Uint8Array>,
  limits: { maxPixels: number },
): Promise<Previews> {
  const sharp = await sharpLib();
  let preview: Buffer;
  let size: { width: number; height: number } | undefined;
  if (type === 'dicom') {
    const decoded = await decodeDicomStream(source, { maxPixels: limits.maxPixels, maxSide: PREVIEW_MAX_PX });
    if (!decoded.ok) return decoded;
    preview = await sharp(decoded.grey, { raw: { width: decoded.width, height: decoded.height, channels: 1 } })
      .png()
      .toBuffer();
    size = { width: decoded.sourceWidth, height: decoded.sourceHeight };
  } else {
    const made = await imagePreview(source, limits.maxPixels);
    if (!made.ok) return made;
    preview = made.preview;
  }
  const thumbnail = await sharp(preview).resize(inside(THUMBNAIL_MAX_PX)).png().toBuffer();
  return { ok: true, preview, thumbnail, ...size };
}

/**
 * PNG and JPEG through sharp from a temporary file: sharp would gather a stream input into one
 * buffer (the whole file), while from a file libvips reads only what it decodes, line by line
 * (sequentialRead), and a JPEG shrinks on load. One job at a time, so one file at a time.
 */
async function imagePreview(
  source: AsyncIterable<Uint8Array>,
  maxPixels: number,
): Promise<{ ok: true; preview: Buffer } | { ok: false; problem: string }> {
  const dir = await mkdtemp(path.join(tmpdir(), 'tt-preview-'));
  const file = path.join(dir, 'original');
  try {
    // A failure of the source (storage) is thrown from here, for the job to retry.
    await pipeline(Readable.from(source, { objectMode: false }), createWriteStream(file));
    const sharp = await sharpLib();
    try {
      const preview = await sharp(file, { failOn: 'error', limitInputPixels: maxPixels, sequentialRead: true })
        .resize(inside(PREVIEW_MAX_PX))
        .png()
        .toBuffer();
      return { ok: true, preview };
    } catch (e) {
      const message = e instanceof Error ? e.message : String(e);
      if (/pixel limit/i.test(message)) return { ok: false, problem: tooLargeProblem(maxPixels) };
      return { ok: false, problem: 'preview not available: the image data cannot be decoded' };
    }
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

/** Width and height from a PNG's or JPEG's header (the first bytes of the upload), when they can be read. */
export async function imageSizeFromHead(head: Buffer): Promise<{ rows: number | null; columns: number | null }> {
  try {
    const sharp = await sharpLib();
    const meta = await sharp(head).metadata();
    return { rows: meta.height ?? null, columns: meta.width ?? null };
  } catch {
    return { rows: null, columns: null };
  }
}
