/**
 * Minimum vertical restorative space and implant spacing.
 *
 * Carpentieri J, Greenstein G, Cavallaro J 2019, JADA 150(8):695–706 [pub]: screw-retained at implant
 * level 4–5 mm; screw-retained at abutment level 7.5 mm; cement-retained 7–8 mm; bar overdenture 11 mm;
 * screw-retained full-arch hybrid 15 mm. Torquetrail uses the strictest end of each range.
 * Implant to tooth ≥ 1.5 mm [common practice]; implant to implant ≥ 3 mm
 * (Tarnow DP, Cho SC, Wallace SS 2000, J Periodontol 71:546–549) [pub].
 */
import { requireOneOf, requirePositive } from './validate.js';

/** Restoration designs with a published minimum restorative space. */
export const RESTORATIVE_DESIGNS = Object.freeze([
  'screw-implant-level',
  'screw-abutment-level',
  'cement',
  'bar-overdenture',
  'full-arch-hybrid',
] as const);
/** One of {@link RESTORATIVE_DESIGNS}. */
export type RestorativeDesign = (typeof RESTORATIVE_DESIGNS)[number];

const MIN_SPACE_MM: Record<RestorativeDesign, number> = {
  'screw-implant-level': 5,
  'screw-abutment-level': 7.5,
  cement: 8,
  'bar-overdenture': 11,
  'full-arch-hybrid': 15,
};

/** Plain-English name of a design, for messages. */
export const RESTORATIVE_DESIGN_LABELS: Readonly<Record<RestorativeDesign, string>> = Object.freeze({
  'screw-implant-level': 'screw-retained restoration at implant level',
  'screw-abutment-level': 'screw-retained restoration at abutment level',
  cement: 'cement-retained restoration',
  'bar-overdenture': 'bar overdenture',
  'full-arch-hybrid': 'screw-retained full-arch hybrid',
});

/** Minimum implant-to-tooth distance, mm [common practice]. */
export const MIN_IMPLANT_TO_TOOTH_MM = 1.5;
/** Minimum implant-to-implant distance, mm (Tarnow 2000) [pub]. */
export const MIN_IMPLANT_TO_IMPLANT_MM = 3;

/**
 * Minimum vertical restorative space, mm, for a design — the strictest end of each published range
 * (Carpentieri 2019): 5, 7.5, 8, 11, 15.
 * @throws ValidationError for an unknown design
 */
export function minRestorativeSpaceMm(design: RestorativeDesign): number {
  return MIN_SPACE_MM[requireOneOf(design, RESTORATIVE_DESIGNS, 'design')];
}

/**
 * Minimum mesio-distal gap between two teeth for a single implant of the given diameter:
 * diameter + 2 × 1.5 mm [derived from the implant-to-tooth rule].
 * @throws ValidationError for a diameter that is not > 0
 */
export function minSingleToothGapMm(implantDiameterMm: number): number {
  return requirePositive(implantDiameterMm, 'implantDiameterMm') + 2 * MIN_IMPLANT_TO_TOOTH_MM;
}

/**
 * Minimum centre-to-centre distance between two adjacent implants: half of each diameter + 3 mm
 * [derived from Tarnow 2000].
 * @throws ValidationError for a diameter that is not > 0
 */
export function minImplantCentreDistanceMm(diameterAMm: number, diameterBMm: number): number {
  return (
    requirePositive(diameterAMm, 'diameterAMm') / 2 +
    requirePositive(diameterBMm, 'diameterBMm') / 2 +
    MIN_IMPLANT_TO_IMPLANT_MM
  );
}
