/**
 * Tooth numbering: FDI two-digit notation (ISO 3950) ↔ Universal (ADA) numbering.
 *
 * Sources: ISO 3950 [memory for the standard's text]; HL7 terminology
 * `http://terminology.hl7.org/CodeSystem/ADAUniversalToothDesignationSystem`, whose entries
 * pair each Universal number with its ISO designation [pub].
 * Formulas [derived, match the HL7 table]: permanent q1 → 9 − p, q2 → 8 + p, q3 → 25 − p,
 * q4 → 24 + p; primary (A = 1) q5 → 6 − p, q6 → 5 + p, q7 → 16 − p, q8 → 15 + p.
 */
import { ToothPositionError, ValidationError } from './errors.js';

/** Anatomical kind of a tooth, as drawn by the web's arch chart. Primary molars are 'molar'. */
export type ToothKind = 'molar' | 'premolar' | 'canine' | 'incisor';

/** Numbering systems {@link formatTooth} can write. */
export type ToothNumberingSystem = 'fdi' | 'universal';

/** Arch of a tooth. */
export type ToothArch = 'upper' | 'lower';

interface FdiParts {
  quadrant: number;
  position: number;
  primary: boolean;
}

function fdiParts(fdi: unknown): FdiParts | null {
  if (typeof fdi !== 'number' || !Number.isInteger(fdi)) return null;
  const quadrant = Math.floor(fdi / 10);
  const position = fdi % 10;
  if (quadrant >= 1 && quadrant <= 4 && position >= 1 && position <= 8) return { quadrant, position, primary: false };
  if (quadrant >= 5 && quadrant <= 8 && position >= 1 && position <= 5) return { quadrant, position, primary: true };
  return null;
}

function requireFdi(fdi: unknown): FdiParts {
  const parts = fdiParts(fdi);
  if (!parts) {
    throw new ToothPositionError(
      `${String(fdi)} is not an FDI tooth position (permanent 11–18, 21–28, 31–38, 41–48; primary 51–55, 61–65, 71–75, 81–85)`,
    );
  }
  return parts;
}

/** True when `fdi` is an existing permanent or primary FDI tooth position. */
export function isValidFdi(fdi: unknown): fdi is number {
  return fdiParts(fdi) !== null;
}

/** True for a primary-dentition FDI position (quadrants 5–8). Throws `RangeError` for a non-existent position. */
export function isPrimaryTooth(fdi: number): boolean {
  return requireFdi(fdi).primary;
}

/** Upper or lower arch of an FDI position. Throws `RangeError` for a non-existent position. */
export function toothArch(fdi: number): ToothArch {
  const { quadrant } = requireFdi(fdi);
  return quadrant === 1 || quadrant === 2 || quadrant === 5 || quadrant === 6 ? 'upper' : 'lower';
}

function positions(quadrants: readonly number[], count: number): number[] {
  const out: number[] = [];
  quadrants.forEach((q, i) => {
    // Quadrants drawn right-to-left on the patient's right side (q1, q3 / q5, q7 start at the back).
    const order =
      i % 2 === 0 ? Array.from({ length: count }, (_, k) => count - k) : Array.from({ length: count }, (_, k) => k + 1);
    for (const p of order) out.push(q * 10 + p);
  });
  return out;
}

/**
 * The 32 permanent FDI positions in drawing order: upper right → upper left (18…11, 21…28),
 * then lower left → lower right (38…31, 41…48).
 */
export const TOOTH_POSITIONS_PERMANENT: readonly number[] = Object.freeze(positions([1, 2, 3, 4], 8));

/**
 * The 20 primary FDI positions in drawing order: 55…51, 61…65, then 75…71, 81…85.
 */
export const TOOTH_POSITIONS_PRIMARY: readonly number[] = Object.freeze(positions([5, 6, 7, 8], 5));

/**
 * Converts an FDI position to its Universal designation: '1'–'32' for permanent teeth,
 * 'A'–'T' for primary teeth. Throws `RangeError` ({@link ToothPositionError}) for a position that does not exist.
 */
export function fdiToUniversal(fdi: number): string {
  const { quadrant: q, position: p, primary } = requireFdi(fdi);
  if (!primary) {
    const n = q === 1 ? 9 - p : q === 2 ? 8 + p : q === 3 ? 25 - p : 24 + p;
    return String(n);
  }
  const n = q === 5 ? 6 - p : q === 6 ? 5 + p : q === 7 ? 16 - p : 15 + p;
  return String.fromCharCode(64 + n);
}

/**
 * Converts a Universal designation ('1'–'32' permanent, 'A'–'T' primary; letters are accepted
 * in either case, numbers without leading zeros or spaces) to its FDI position.
 * Throws `RangeError` ({@link ToothPositionError}) for a designation that does not exist.
 */
export function universalToFdi(code: string): number {
  if (typeof code === 'string' && /^[1-9][0-9]?$/.test(code)) {
    const n = Number(code);
    if (n <= 8) return 10 + (9 - n);
    if (n <= 16) return 20 + (n - 8);
    if (n <= 24) return 30 + (25 - n);
    if (n <= 32) return 40 + (n - 24);
  }
  if (typeof code === 'string' && /^[A-Ta-t]$/.test(code)) {
    const n = code.toUpperCase().charCodeAt(0) - 64;
    if (n <= 5) return 50 + (6 - n);
    if (n <= 10) return 60 + (n - 5);
    if (n <= 15) return 70 + (16 - n);
    return 80 + (n - 15);
  }
  throw new ToothPositionError(
    `${JSON.stringify(code)} is not a Universal tooth designation (1–32 permanent, A–T primary)`,
  );
}

/**
 * Kind of tooth at an FDI position: positions 1–2 incisor, 3 canine, 4–5 premolar, 6–8 molar
 * (permanent); primary 1–2 incisor, 3 canine, 4–5 molar. Throws `RangeError` for a non-existent position.
 */
export function toothKind(fdi: number): ToothKind {
  const { position: p, primary } = requireFdi(fdi);
  if (p <= 2) return 'incisor';
  if (p === 3) return 'canine';
  if (primary) return 'molar';
  return p <= 5 ? 'premolar' : 'molar';
}

/**
 * Writes a tooth position for display: `'fdi'` → the two-digit FDI number (e.g. '36'),
 * `'universal'` → the Universal designation (e.g. '19', 'A'). Throws `RangeError` for a non-existent position.
 */
export function formatTooth(fdi: number, system: ToothNumberingSystem): string {
  requireFdi(fdi);
  if (system === 'fdi') return String(fdi);
  if (system === 'universal') return fdiToUniversal(fdi);
  throw new ValidationError('bad-value', 'Choose FDI or Universal numbering', 'system');
}
