/**
 * Distances on radiographs.
 *
 * DICOM PS3.3 [pub]: Pixel Spacing (0028,0030) holds two values, mm between pixel centres in the patient,
 * row spacing first (the vertical distance between adjacent rows), then column spacing. It therefore
 * scales the row difference by the first value and the column difference by the second.
 * Imager Pixel Spacing (0018,1164) is at the detector and not corrected for magnification.
 *
 * Known-length calibration [pub: Vazquez L et al. 2011, Clin Oral Implants Res, PMID 21435009]:
 * true distance = measured distance × (true implant length ÷ measured implant length). Accuracy is limited
 * when the projection is not orthogonal to the implant (about 0.4 mm residual error reported).
 */
import { requireFinite, requireNonNegative, requirePositive } from './validate.js';
import { ValidationError } from './errors.js';

/** A point on an image, in pixels (row = vertical index, col = horizontal index; sub-pixel allowed). */
export interface PixelPoint {
  row: number;
  col: number;
}

/** DICOM Pixel Spacing (0028,0030): [row spacing (vertical) mm, column spacing (horizontal) mm]. */
export type PixelSpacing = [rowMm: number, colMm: number];

/** Input of {@link correctByKnownLength}. */
export interface KnownLengthCalibration {
  /** Distance measured on the image, mm (≥ 0). */
  measuredMm: number;
  /** Implant length measured on the same image, mm (> 0). */
  implantMeasuredMm: number;
  /** True implant length from the manufacturer, mm (> 0). */
  implantTrueMm: number;
}

function checkPoint(p: PixelPoint, field: string): void {
  if (p === null || typeof p !== 'object')
    throw new ValidationError('bad-value', `${field} must be a {row, col} point`, field);
  requireFinite(p.row, `${field}.row`);
  requireFinite(p.col, `${field}.col`);
}

/**
 * Distance in mm between two image points using DICOM Pixel Spacing (row spacing applied to the row
 * difference, column spacing to the column difference).
 * @throws ValidationError for non-finite coordinates or a spacing that is not > 0
 */
export function pixelDistanceMm(p: PixelPoint, q: PixelPoint, pixelSpacing: PixelSpacing): number {
  checkPoint(p, 'p');
  checkPoint(q, 'q');
  if (!Array.isArray(pixelSpacing) || pixelSpacing.length !== 2) {
    throw new ValidationError('bad-value', 'pixelSpacing must be [rowMm, colMm]', 'pixelSpacing');
  }
  const rowMm = requirePositive(pixelSpacing[0], 'pixelSpacing[0]');
  const colMm = requirePositive(pixelSpacing[1], 'pixelSpacing[1]');
  return Math.hypot((p.row - q.row) * rowMm, (p.col - q.col) * colMm);
}

/**
 * Corrects an image measurement for magnification using an implant of known length:
 * measuredMm × implantTrueMm ÷ implantMeasuredMm.
 * @throws ValidationError for NaN, a negative measurement or a non-positive implant length
 */
export function correctByKnownLength({ measuredMm, implantMeasuredMm, implantTrueMm }: KnownLengthCalibration): number {
  const m = requireNonNegative(measuredMm, 'measuredMm');
  const im = requirePositive(implantMeasuredMm, 'implantMeasuredMm');
  const it = requirePositive(implantTrueMm, 'implantTrueMm');
  return (m * it) / im;
}
