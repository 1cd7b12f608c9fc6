import type { ScanFileType } from '@torquetrail/contracts';
import { describeFile } from '../common/file-signature.js';

/** What the first bytes say; a binary STL's triangle count also fixes its whole length (84 + 50 n). */
export type DetectedMesh = { type: ScanFileType; stlBinaryBytes?: number } | { type: null; described: string };

// Printable ASCII, tab, line feed and carriage return: what a text mesh (ASCII STL, OBJ) is made of.
const isText = (b: Buffer) => b.every((c) => c === 9 || c === 10 || c === 13 || (c >= 32 && c < 127));
/** The complete lines of the head (the last one may be cut). */
const headLines = (text: string) => text.split(/\r?\n/).slice(0, -1);
const OBJ_LINE = /^\s*($|#|(v|vt|vn|vp|f|l|p|o|g|s|mtllib|usemtl)\s)/;

/**
 * A scan file's type from its bytes only, never its name: PLY starts with the line `ply` and a
 * `format` line (ascii, binary_little_endian, binary_big_endian); an ASCII STL is text starting
 * `solid` with `facet` lines; an OBJ is text whose lines are all OBJ statements with at least one
 * vertex (`v`); a binary STL is an 80-byte header and a triangle count whose 50-byte records give
 * the file's exact length (checked once the whole body has passed). Anything else is named as well
 * as we can for the 415.
 */
export function detectMesh(head: Buffer): DetectedMesh {
  const start = head.subarray(0, 4096).toString('latin1');
  if (/^ply\r?\nformat (ascii|binary_little_endian|binary_big_endian) 1\.0\r?\n/.test(start)) return { type: 'ply' };
  const text = isText(head.subarray(0, 64 * 1024));
  if (text && /^\s*solid\b/.test(start) && /\bfacet\s+normal\b/.test(start)) return { type: 'stl' };
  if (text) {
    const lines = headLines(head.subarray(0, 64 * 1024).toString('latin1'));
    if (lines.length > 0 && lines.every((l) => OBJ_LINE.test(l)) && lines.some((l) => /^\s*v\s/.test(l)))
      return { type: 'obj' };
  }
  const other = describeFile(head);
  if (other) return { type: null, described: other };
  if (!text && head.length >= 84) {
    const triangles = head.readUInt32LE(80);
    if (triangles > 0) return { type: 'stl', stlBinaryBytes: 84 + 50 * triangles };
  }
  return { type: null, described: 'not a mesh we can read' };
}

export const MESH_CONTENT_TYPES: Record<ScanFileType, string> = {
  stl: 'model/stl',
  ply: 'application/ply',
  obj: 'model/obj',
};
