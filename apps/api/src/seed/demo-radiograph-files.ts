// The demo's radiograph files, drawn by the seed: a grey implant on a noisy background with the
// bone crest at the seeded bone levels, written as DICOM Part 10 (a minimal writer, below) or PNG.
import { createHash } from 'node:crypto';
import sharp from 'sharp';

/** Image scale of every demo radiograph: mm per pixel, also written as DICOM Pixel Spacing. */
export const DEMO_MM_PER_PX = 0.1;
const SITE_WIDTH_PX = 100;
const MARGIN_PX = 40;
const IMPLANT_HALF_WIDTH_PX = 20;
const STORED_MAX = 4095; // 12 bits stored

/** One implant drawn upright: platform at the top, apex below; bone crest rows measured from the platform. */
export interface DrawnImplant {
  lengthMm: number;
  mesialMm: number | null;
  distalMm: number | null;
}

/** Where the implant of site k lies in the image, in pixels (rows down, columns right). */
export function implantGeometry(k: number, lengthMm: number) {
  const centre = SITE_WIDTH_PX * k + SITE_WIDTH_PX / 2;
  const lengthPx = Math.round(lengthMm / DEMO_MM_PER_PX);
  return {
    platformRow: MARGIN_PX,
    apexRow: MARGIN_PX + lengthPx,
    centre,
    left: centre - IMPLANT_HALF_WIDTH_PX,
    right: centre + IMPLANT_HALF_WIDTH_PX,
  };
}

/** A small, fast pseudo-random sequence (mulberry32): the same picture for the same seed. */
function random(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Noise in [-0.5, 0.5), made once: each picture reads it from its own offset (the seed stays fast). */
const NOISE_SIZE = 1 << 16;
const NOISE = (() => {
  const next = random(0x5eed);
  return Float32Array.from({ length: NOISE_SIZE }, () => next() - 0.5);
})();

/** 12-bit grey values, row by row: soft tissue, bone below each crest, the implant with its threads. */
export function drawRadiograph(implants: readonly DrawnImplant[], seed: number) {
  const longest = Math.max(...implants.map((i) => i.lengthMm));
  const height = implantGeometry(0, longest).apexRow + MARGIN_PX;
  const width = SITE_WIDTH_PX * implants.length;
  let n = Math.imul(seed, 7919) & (NOISE_SIZE - 1);
  const next = () => NOISE[(n = (n + 1) & (NOISE_SIZE - 1))];
  const pixels = new Uint16Array(width * height);
  implants.forEach((implant, k) => {
    const g = implantGeometry(k, implant.lengthMm);
    const crest = (mm: number | null) => g.platformRow + (mm ?? 0) / DEMO_MM_PER_PX;
    for (let r = 0; r < height; r++) {
      for (let c = SITE_WIDTH_PX * k; c < SITE_WIDTH_PX * (k + 1); c++) {
        const mesialSide = c < g.centre;
        const inBone = r >= crest(mesialSide ? implant.mesialMm : implant.distalMm);
        let v = (inBone ? 1700 : 650) + next() * 360;
        // The implant narrows over its last fifth towards the apex; threads every 8 px are brighter.
        const fromApex = g.apexRow - r;
        const taper = fromApex < (g.apexRow - g.platformRow) / 5 ? fromApex / ((g.apexRow - g.platformRow) / 5) : 1;
        const half = IMPLANT_HALF_WIDTH_PX * (0.6 + 0.4 * taper) + (r % 8 < 3 && r > g.platformRow + 8 ? 2 : 0);
        if (r >= g.platformRow && r <= g.apexRow && Math.abs(c - g.centre) <= half) v = 3500 + next() * 120;
        pixels[r * width + c] = Math.round(Math.min(STORED_MAX, Math.max(0, v)));
      }
    }
  });
  return { width, height, pixels };
}

/** The picture as an 8-bit greyscale PNG. */
export function pngOf(image: ReturnType<typeof drawRadiograph>): Promise<Buffer> {
  const grey = Buffer.alloc(image.pixels.length);
  for (let i = 0; i < grey.length; i++) grey[i] = image.pixels[i] >> 4;
  return sharp(grey, { raw: { width: image.width, height: image.height, channels: 1 } })
    .png()
    .toBuffer();
}

// ---- DICOM Part 10, Explicit VR Little Endian (PS3.10 §7, PS3.5 §7.1.2) ---------------------------
const EXPLICIT_VR_LITTLE_ENDIAN = '1.2.840.10008.1.2.1';
/** Digital Intra-Oral X-Ray Image Storage – For Presentation (PS3.4 Annex B). */
const INTRA_ORAL_STORAGE = '1.2.840.10008.5.1.4.1.1.1.3';
/** VRs with a reserved 2 bytes and a 4-byte length (PS3.5 Table 7.1-1). */
const LONG_VRS = new Set(['OB', 'OW', 'OF', 'SQ', 'UT', 'UN']);

/**
 * A UID under the 2.25 root (PS3.5 Annex B.2) from a UUID-sized hash of `name`: the same demo
 * radiograph gets the same UID, so its file is the same on every seed.
 */
const uid = (name: string) =>
  `2.25.${BigInt(`0x${createHash('sha256').update(name).digest('hex').slice(0, 32)}`).toString()}`;

function element(group: number, elementNo: number, vr: string, value: Buffer): Buffer {
  // Values have even length: UI pads with NUL, text with a space, binary with NUL (PS3.5 §6.2).
  const padded =
    value.length % 2 === 0 ? value : Buffer.concat([value, Buffer.from([vr === 'UI' || vr === 'OB' ? 0 : 0x20])]);
  const long = LONG_VRS.has(vr);
  const head = Buffer.alloc(long ? 12 : 8);
  head.writeUInt16LE(group, 0);
  head.writeUInt16LE(elementNo, 2);
  head.write(vr, 4, 'latin1');
  if (long) head.writeUInt32LE(padded.length, 8);
  else head.writeUInt16LE(padded.length, 6);
  return Buffer.concat([head, padded]);
}
const str = (s: string) => Buffer.from(s, 'latin1');
const us = (n: number) => {
  const b = Buffer.alloc(2);
  b.writeUInt16LE(n, 0);
  return b;
};

export interface DicomDetails {
  studyDate: string; // YYYY-MM-DD
  seriesNumber: number;
  /** Names the instance: its SOP Instance UID is derived from it. */
  name: string;
}

/** A Part 10 file: 128-byte preamble, 'DICM', the File Meta Information group, then the data set in tag order. */
export function dicomOf(image: ReturnType<typeof drawRadiograph>, details: DicomDetails): Buffer {
  const instance = uid(details.name);
  const metaBody = Buffer.concat([
    element(0x0002, 0x0001, 'OB', Buffer.from([0, 1])),
    element(0x0002, 0x0002, 'UI', str(INTRA_ORAL_STORAGE)),
    element(0x0002, 0x0003, 'UI', str(instance)),
    element(0x0002, 0x0010, 'UI', str(EXPLICIT_VR_LITTLE_ENDIAN)),
    element(0x0002, 0x0012, 'UI', str('2.25.90417726152034418217765128904337441181')),
  ]);
  const groupLength = Buffer.alloc(4);
  groupLength.writeUInt32LE(metaBody.length, 0);
  const pixelData = Buffer.alloc(image.pixels.length * 2);
  image.pixels.forEach((v, i) => pixelData.writeUInt16LE(v, i * 2));
  const spacing = `${DEMO_MM_PER_PX}\\${DEMO_MM_PER_PX}`;
  const dataset = Buffer.concat([
    element(0x0008, 0x0016, 'UI', str(INTRA_ORAL_STORAGE)),
    element(0x0008, 0x0018, 'UI', str(instance)),
    element(0x0008, 0x0020, 'DA', str(details.studyDate.replace(/-/g, ''))),
    element(0x0008, 0x0060, 'CS', str('IO')),
    element(0x0020, 0x0011, 'IS', str(String(details.seriesNumber))),
    element(0x0028, 0x0002, 'US', us(1)),
    element(0x0028, 0x0004, 'CS', str('MONOCHROME2')),
    element(0x0028, 0x0010, 'US', us(image.height)),
    element(0x0028, 0x0011, 'US', us(image.width)),
    element(0x0028, 0x0030, 'DS', str(spacing)),
    element(0x0028, 0x0100, 'US', us(16)),
    element(0x0028, 0x0101, 'US', us(12)),
    element(0x0028, 0x0102, 'US', us(11)),
    element(0x0028, 0x0103, 'US', us(0)),
    element(0x0028, 0x1050, 'DS', str('2000')),
    element(0x0028, 0x1051, 'DS', str('4000')),
    element(0x7fe0, 0x0010, 'OW', pixelData),
  ]);
  return Buffer.concat([Buffer.alloc(128), str('DICM'), element(0x0002, 0x0000, 'UL', groupLength), metaBody, dataset]);
}
