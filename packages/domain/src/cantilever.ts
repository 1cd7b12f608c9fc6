/**
 * Distal cantilevers of full-arch work against the antero-posterior (A-P) spread of the implants.
 *
 * The A-P spread is the distance, along the arch's midline, from the centre of the most anterior
 * implant to the line joining the distal surfaces of the two most distal implants. The rule of thumb
 * limits each distal cantilever to 1.5 × the A-P spread for the mandible with five anterior implants:
 * English CE 1990, "Critical A-P spread", Implant Society 1(1):2–3 [memory], repeated by Misch CE,
 * Dental Implant Prosthetics (Mosby 2005) [memory]; later work found no single ratio safe for every
 * arch (McAlarney ME, Stavropoulos DN 1996, Int J Oral Maxillofac Implants 11(3):331–339 [memory]).
 * We could not check these texts here, so the 1.5 default is marked [common practice] and each practice
 * sets its own limit (CANTILEVER_RATIO_RANGE).
 *
 * Decisions (also in docs/clinical-rules.md, section 8b):
 * - The A-P spread is entered, not computed: the ledger holds each implant's tooth position and axis
 *   direction but not its place in the arch, and positions taken from average tooth widths would give
 *   a spread that looks measured but is not. It is measured on a panoramic radiograph, cast or scan.
 * - A cantilever exactly at the limit passes; over it is a warning per side (to acknowledge), a
 *   caution and never a diagnosis.
 * - A cantilever without a spread cannot be compared: an `info` Finding asks for the spread.
 * - Cantilevers are recorded only for the kinds in CANTILEVER_KINDS; any other kind with a cantilever
 *   or spread is refused (ValidationError naming the field).
 */
import { ValidationError } from './errors.js';
import type { Finding } from './plan-findings.js';
import type { RestorationKind } from './restoration-plan.js';
import { EPS, fmt, requireFinite } from './validate.js';

/**
 * Restoration kinds whose distal cantilevers are recorded and checked against the A-P spread.
 * A bar overdenture's distal extensions are cantilevers of the bar [common practice].
 */
export const CANTILEVER_KINDS: readonly RestorationKind[] = Object.freeze(['full-arch', 'overdenture-bar']);

/** True when the kind records distal cantilevers (see CANTILEVER_KINDS). */
export function recordsCantilevers(kind: RestorationKind): boolean {
  return CANTILEVER_KINDS.includes(kind);
}

/** The default limit: cantilever ≤ 1.5 × A-P spread (English 1990 [memory]; [common practice]). */
export const DEFAULT_CANTILEVER_RATIO = 1.5;
/** The ratios a practice may set [decision: 0.5 to 3, in steps of 0.1]. */
export const CANTILEVER_RATIO_RANGE = Object.freeze({ min: 0.5, max: 3 });
/** The lengths that can be entered, mm [decision: a cantilever up to 30 mm, a spread up to 40 mm]. */
export const CANTILEVER_MAX_MM = 30;
export const AP_SPREAD_MAX_MM = 40;

const CANTILEVER_SOURCE = 'English CE 1990, Implant Society 1(1):2–3 [memory]; the 1.5 ratio [common practice]';

/** Stable codes of the cantilever Findings. */
export const CANTILEVER_FINDING_CODES = Object.freeze({
  LEFT_OVER_LIMIT: 'cantilever-left-over-limit',
  RIGHT_OVER_LIMIT: 'cantilever-right-over-limit',
  SPREAD_MISSING: 'cantilever-spread-missing',
} as const);

/** The cantilevers of a plan (patient's left and right), mm. */
export interface CantileverInput {
  kind: RestorationKind;
  leftMm?: number;
  rightMm?: number;
  apSpreadMm?: number;
}

/** The longest cantilever the practice's ratio allows on an A-P spread, mm. */
export function cantileverLimitMm(apSpreadMm: number, ratio: number = DEFAULT_CANTILEVER_RATIO): number {
  requireFinite(apSpreadMm, 'apSpreadMm');
  requireFinite(ratio, 'ratio');
  if (apSpreadMm <= 0) throw new ValidationError('out-of-range', 'Enter a spread greater than 0 mm', 'apSpreadMm');
  if (ratio < CANTILEVER_RATIO_RANGE.min - EPS || ratio > CANTILEVER_RATIO_RANGE.max + EPS)
    throw new ValidationError(
      'out-of-range',
      `Enter a ratio from ${CANTILEVER_RATIO_RANGE.min} to ${CANTILEVER_RATIO_RANGE.max}`,
      'ratio',
    );
  return apSpreadMm * ratio;
}

function checkLength(value: number | undefined, max: number, field: string, positive: boolean) {
  if (value === undefined) return;
  requireFinite(value, field);
  if (positive ? value <= 0 : value < 0)
    throw new ValidationError('out-of-range', positive ? 'Enter more than 0 mm' : 'Enter 0 mm or more', field);
  if (value > max) throw new ValidationError('out-of-range', `At most ${max} mm`, field);
}

/**
 * The cantilever Findings of a plan: a warning per side over `ratio` × the A-P spread, an `info`
 * when a cantilever is given without a spread, nothing otherwise.
 * @throws ValidationError for a negative or non-finite length, or cantilevers on a kind not in CANTILEVER_KINDS
 */
export function cantileverFindings(input: CantileverInput, ratio: number = DEFAULT_CANTILEVER_RATIO): Finding[] {
  const { kind, leftMm, rightMm, apSpreadMm } = input;
  checkLength(leftMm, CANTILEVER_MAX_MM, 'plan.cantileverLeftMm', false);
  checkLength(rightMm, CANTILEVER_MAX_MM, 'plan.cantileverRightMm', false);
  checkLength(apSpreadMm, AP_SPREAD_MAX_MM, 'plan.apSpreadMm', true);
  const given = leftMm !== undefined || rightMm !== undefined || apSpreadMm !== undefined;
  if (!recordsCantilevers(kind)) {
    if (given) {
      const field =
        leftMm !== undefined
          ? 'plan.cantileverLeftMm'
          : rightMm !== undefined
            ? 'plan.cantileverRightMm'
            : 'plan.apSpreadMm';
      throw new ValidationError(
        'bad-value',
        'Cantilevers and the A-P spread are recorded for full-arch work only',
        field,
      );
    }
    return [];
  }
  type Side = { mm: number; side: 'left' | 'right'; code: string };
  const sides: Side[] = [];
  if (leftMm !== undefined && leftMm > 0)
    sides.push({ mm: leftMm, side: 'left', code: CANTILEVER_FINDING_CODES.LEFT_OVER_LIMIT });
  if (rightMm !== undefined && rightMm > 0)
    sides.push({ mm: rightMm, side: 'right', code: CANTILEVER_FINDING_CODES.RIGHT_OVER_LIMIT });
  if (sides.length === 0) return [];
  if (apSpreadMm === undefined)
    return [
      {
        severity: 'info',
        code: CANTILEVER_FINDING_CODES.SPREAD_MISSING,
        message:
          'A distal cantilever is recorded without the A-P spread of the implants; enter the spread to compare the cantilever with the practice limit.',
        source: CANTILEVER_SOURCE,
      },
    ];
  const limit = cantileverLimitMm(apSpreadMm, ratio);
  return sides
    .filter((s) => s.mm > limit + EPS)
    .map((s) => ({
      severity: 'warning' as const,
      code: s.code,
      message: `Caution: the ${s.side} distal cantilever (${fmt(s.mm)} mm) is longer than the practice limit of ${fmt(ratio)} × the A-P spread of ${fmt(apSpreadMm)} mm (${fmt(limit)} mm). A longer cantilever loads the distal implants and screws more; weigh the design, this is not a diagnosis.`,
      source: CANTILEVER_SOURCE,
    }));
}
