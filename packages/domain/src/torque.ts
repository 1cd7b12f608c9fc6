/**
 * Torque checks.
 *
 * ISO 6789-1:2017 [pub]: setting torque tools, Type II Class A, ±6 % up to 10 N·m; dental drivers work
 * at 0.1–0.35 N·m, so ±6 % applies [derived]. Friction-style devices drift with age and are judged against
 * ±10 % (Vallee et al. 2008, J Prosthet Dent 100:86–92) [pub]. Re-tighten about 10 minutes after the first
 * tightening (Siamos G, Winkler S, Boberick KG 2002, J Oral Implantol 28:67–73) [pub].
 * Torque values themselves are manufacturer-specific: the instructions for use rule.
 */
import { ValidationError } from './errors.js';
import { requireNonNegative, requirePositive } from './validate.js';
import type { TorqueVerdict } from './choices.js';

/**
 * Plausible range of a recorded prosthetic torque or torque specification, N·cm, inclusive
 * [decision]: dental drivers work at 10–35 N·cm (ISO 6789 note above); 1–100 catches typing
 * errors (a missing or extra digit) without refusing any system's specification.
 */
export const TORQUE_NCM_RANGE = Object.freeze({ min: 1, max: 100 } as const);

/** Input of {@link torqueVerdict}. */
export interface TorqueCheck {
  /** Torque applied or read on the reference, N·cm (≥ 0). */
  appliedNcm: number;
  /** Specified (set) torque, N·cm (> 0). */
  specNcm: number;
  /** Tolerance as a percentage of the specification, 0 ≤ tolerance < 100. */
  tolerancePct: number;
}

/** ISO 6789-1:2017 Type II Class A tolerance, % [pub]. */
export const ISO_6789_TOLERANCE_PCT = 6;
/** Window used for friction-style torque-limiting devices, % (Vallee 2008) [pub]. */
export const FRICTION_DEVICE_TOLERANCE_PCT = 10;
/** Re-tighten screws about this many minutes after the first tightening (Siamos 2002) [pub]. */
export const RETIGHTEN_AFTER_MINUTES = 10;

/**
 * Typical torques for the demo catalogue, N·cm [common practice, manufacturer-specific — the
 * instructions for use rule; never treat as truths]. Healing abutments and cover screws are hand-tight.
 */
export const DEMO_TORQUE_DEFAULTS_NCM = Object.freeze({
  straightMultiUnitAbutment: 35,
  angledMultiUnitAbutment: 15,
  prostheticScrewOnMultiUnit: 15,
  abutmentScrewMin: 20,
  abutmentScrewMax: 35,
} as const);

/** Relative tolerance for the inclusive window boundary (floating point: 35 × 0.94 ≠ 32.9 exactly). */
const REL_EPS = 1e-9;

/** Signed deviation of the applied torque from the specification, % of the specification. */
export function torqueDeviationPct(appliedNcm: number, specNcm: number): number {
  const a = requireNonNegative(appliedNcm, 'appliedNcm');
  const s = requirePositive(specNcm, 'specNcm');
  return ((a - s) / s) * 100;
}

function requireTolerance(tolerancePct: number): number {
  const tol = requireNonNegative(tolerancePct, 'tolerancePct');
  if (tol >= 100) throw new ValidationError('out-of-range', 'Enter a tolerance below 100 %', 'tolerancePct');
  return tol;
}

/** The allowed deviation either side of the specification, N·cm: spec × tol ÷ 100 (one formula for verdict and band). */
function allowedDeviationNcm(spec: number, tol: number): number {
  return (spec * tol) / 100;
}

/**
 * The tolerance window of a specification, N·cm: specNcm ∓ specNcm × tolerancePct ÷ 100, the window
 * {@link torqueVerdict} judges against (its boundaries count as within).
 * @throws ValidationError for NaN, a non-positive specification, tolerance outside [0, 100)
 */
export function torqueToleranceBand(specNcm: number, tolerancePct: number): { lowNcm: number; highNcm: number } {
  const spec = requirePositive(specNcm, 'specNcm');
  const allowed = allowedDeviationNcm(spec, requireTolerance(tolerancePct));
  return { lowNcm: spec - allowed, highNcm: spec + allowed };
}

/**
 * 'within' when specNcm × (1 − tol) ≤ appliedNcm ≤ specNcm × (1 + tol), both ends inclusive
 * (a relative epsilon of 1e-9 absorbs floating-point error at the exact boundary); otherwise 'under' or 'over'.
 * @throws ValidationError for NaN, negative applied torque, non-positive specification, tolerance outside [0, 100)
 */
export function torqueVerdict({ appliedNcm, specNcm, tolerancePct }: TorqueCheck): TorqueVerdict {
  const applied = requireNonNegative(appliedNcm, 'appliedNcm');
  const spec = requirePositive(specNcm, 'specNcm');
  const allowed = allowedDeviationNcm(spec, requireTolerance(tolerancePct));
  const deviation = applied - spec;
  const eps = REL_EPS * spec;
  if (deviation > allowed + eps) return 'over';
  if (deviation < -allowed - eps) return 'under';
  return 'within';
}
