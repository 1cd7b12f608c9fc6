import sharp, { type Sharp } from 'sharp';
import type { RadiographFileType } from '@torquetrail/contracts';
import { decodeDicomPixels, dicomAttributes, parseDicom } from './dicom.js';

/** Longest side of the preview and of the thumbnail, px. */
const PREVIEW_MAX_PX = 2048;
const THUMBNAIL_MAX_PX = 192;

export type Previews =
  | { ok: true; width: number; height: number; preview: Buffer; thumbnail: Buffer }
  | { ok: false; problem: string };

/**
 * A PNG preview every browser can show and a small thumbnail. PNG and JPEG are re-encoded by sharp
 * (so a hostile file is never served back as-is inline); DICOM pixels are decoded and windowed first.
 */
export async function makePreviews(type: RadiographFileType, bytes: Uint8Array): Promise<Previews> {
  let image: Sharp;
  if (type === 'dicom') {
    const ds = parseDicom(bytes, false);
    const decoded = decodeDicomPixels(ds, dicomAttributes(ds));
    if (!decoded.ok) return decoded;
    image = sharp(decoded.grey, { raw: { width: decoded.width, height: decoded.height, channels: 1 } });
  } else {
    image = sharp(bytes, { failOn: 'error' });
  }
  try {
    const meta = await image.metadata();
    const resize = { width: PREVIEW_MAX_PX, height: PREVIEW_MAX_PX, fit: 'inside', withoutEnlargement: true } as const;
    const preview = await image.clone().resize(resize).png().toBuffer();
    const thumbnail = await image
      .clone()
      .resize({ ...resize, width: THUMBNAIL_MAX_PX, height: THUMBNAIL_MAX_PX })
      .png()
      .toBuffer();
    return { ok: true, width: meta.width, height: meta.height, preview, thumbnail };
  } catch {
    return { ok: false, problem: 'preview not available: the image data cannot be decoded' };
  }
}
