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
import { EPS, requireFinite, requireNonNegative, requirePositive } from './validate.js';
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
    throw new ValidationError('bad-value', 'Mark this point on the image', field);
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
    throw new ValidationError('bad-value', 'The pixel spacing needs a row and a column value in mm', 'pixelSpacing');
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

/** Disagreement between the two scale estimates above which the projection is flagged (10 %) [common practice]. */
export const SPACING_DISAGREEMENT_LIMIT = 0.1;

/** Where an image point lies relative to the implant axis, in the units of the points given. */
export interface AxisProjection {
  /** Signed distance along the axis from the platform centre; positive towards the apex. */
  along: number;
  /** Unsigned distance of the point from the axis line. */
  across: number;
}

/** Points marked on one implant of one image. */
export interface ImplantMarks {
  /** Two points across the implant shoulder; their midpoint is the platform centre. */
  platform: [PixelPoint, PixelPoint];
  apex: PixelPoint;
  /** First bone-to-implant contact, mesial side. */
  mesial: PixelPoint;
  /** First bone-to-implant contact, distal side. */
  distal: PixelPoint;
}

/** Input of {@link measureBoneLevels}. */
export interface BoneLevelMeasurementInput {
  marks: ImplantMarks;
  /** The implant's true length from the placement record, mm (> 0). */
  implantTrueMm: number;
  /** DICOM Pixel Spacing (0028,0030) when the image has it; gives the second estimate. */
  pixelSpacing?: PixelSpacing | null;
}

/** The second estimate, straight from DICOM Pixel Spacing. */
export interface SpacingEstimate {
  implantLengthMm: number;
  mesialMm: number;
  distalMm: number;
  /** (implant length by Pixel Spacing ÷ true length) − 1, signed. */
  disagreement: number;
  /** True when |disagreement| is over {@link SPACING_DISAGREEMENT_LIMIT}: a foreshortened or elongated projection. */
  flagged: boolean;
}

/** Result of {@link measureBoneLevels}; bone levels are mm along the axis from the platform (positive = apical). */
export interface BoneLevelMeasurement {
  /** Implant length on the image, in pixels (pixel units when no spacing, else spacing-scaled units). */
  implantImageLength: number;
  /** mm per image unit from the known length. */
  mmPerUnit: number;
  mesialMm: number;
  distalMm: number;
  spacing: SpacingEstimate | null;
}

function midpoint(a: PixelPoint, b: PixelPoint): PixelPoint {
  return { row: (a.row + b.row) / 2, col: (a.col + b.col) / 2 };
}

/**
 * Projects a point on the platform→apex line: the signed distance along the axis (positive towards the
 * apex) and the distance from it, both in the points' own units (plain vector projection).
 * @throws ValidationError ('zero-vector') when platform and apex coincide
 */
export function projectOnImplantAxis(point: PixelPoint, platform: PixelPoint, apex: PixelPoint): AxisProjection {
  checkPoint(point, 'point');
  checkPoint(platform, 'platform');
  checkPoint(apex, 'apex');
  const ar = apex.row - platform.row;
  const ac = apex.col - platform.col;
  const len = Math.hypot(ar, ac);
  if (len === 0)
    throw new ValidationError('zero-vector', 'Mark the apex at a different point from the platform', 'apex');
  const pr = point.row - platform.row;
  const pc = point.col - platform.col;
  return { along: (pr * ar + pc * ac) / len, across: Math.abs(pr * ac - pc * ar) / len };
}

function scaled(p: PixelPoint, [rowMm, colMm]: PixelSpacing): PixelPoint {
  return { row: p.row * rowMm, col: p.col * colMm };
}

function checkSpacing(pixelSpacing: PixelSpacing): PixelSpacing {
  if (!Array.isArray(pixelSpacing) || pixelSpacing.length !== 2) {
    throw new ValidationError('bad-value', 'The pixel spacing needs a row and a column value in mm', 'pixelSpacing');
  }
  return [requirePositive(pixelSpacing[0], 'pixelSpacing[0]'), requirePositive(pixelSpacing[1], 'pixelSpacing[1]')];
}

/**
 * Bone levels mesial and distal, mm along the implant axis from the platform, calibrated by the implant's
 * known length (correctByKnownLength); with Pixel Spacing, the spacing-only estimate beside it and a flag
 * when the two scales disagree by more than 10 %. Pixels are taken as square unless Pixel Spacing says
 * otherwise (then both estimates work in the spacing-scaled plane, so anisotropic pixels stay correct).
 * @throws ValidationError for non-finite points, a zero-length axis or a non-positive length or spacing
 */
export function measureBoneLevels({
  marks,
  implantTrueMm,
  pixelSpacing,
}: BoneLevelMeasurementInput): BoneLevelMeasurement {
  if (marks === null || typeof marks !== 'object' || !Array.isArray(marks.platform) || marks.platform.length !== 2) {
    throw new ValidationError('bad-value', 'Mark the platform with two points', 'marks.platform');
  }
  const trueMm = requirePositive(implantTrueMm, 'implantTrueMm');
  const spacing = pixelSpacing == null ? null : checkSpacing(pixelSpacing);
  const plane = spacing ?? ([1, 1] as PixelSpacing);
  const [s0, s1] = marks.platform;
  checkPoint(s0, 'marks.platform[0]');
  checkPoint(s1, 'marks.platform[1]');
  const platform = scaled(midpoint(s0, s1), plane);
  const apex = scaled(marks.apex, plane);
  const implantImageLength = projectOnImplantAxis(apex, platform, apex).along;
  const mesial = projectOnImplantAxis(scaled(marks.mesial, plane), platform, apex).along;
  const distal = projectOnImplantAxis(scaled(marks.distal, plane), platform, apex).along;
  // correctByKnownLength takes magnitudes; the sign (coronal of the platform) is kept apart.
  const calibrate = (v: number): number =>
    Math.sign(v) *
    correctByKnownLength({ measuredMm: Math.abs(v), implantMeasuredMm: implantImageLength, implantTrueMm: trueMm });
  const result: BoneLevelMeasurement = {
    implantImageLength,
    mmPerUnit: trueMm / implantImageLength,
    mesialMm: calibrate(mesial),
    distalMm: calibrate(distal),
    spacing: null,
  };
  if (spacing !== null) {
    const disagreement = implantImageLength / trueMm - 1;
    result.spacing = {
      implantLengthMm: implantImageLength,
      mesialMm: mesial,
      distalMm: distal,
      disagreement,
      flagged: Math.abs(disagreement) > SPACING_DISAGREEMENT_LIMIT + EPS,
    };
  }
  return result;
}
