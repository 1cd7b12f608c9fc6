/**
 * The domain's lists of choices (restoration kinds, retentions, connections, copings, peri-implant
 * statuses, finding severities, impression methods), in a module of their own: the contracts wrap
 * each in a zod enum, so every screen needs them, and here they come without the rules that use
 * them (restoration-plan.ts, peri-implant-status.ts, plan-findings.ts, scan-bodies.ts).
 */

/**
 * Kinds of restoration. `splinted-bridge`, `full-arch` and `overdenture-bar` are splinted; an overdenture
 * on stud attachments is not (each implant carries its own attachment; overdenture-plan.ts).
 */
export const RESTORATION_KINDS = [
  'single-crown',
  'splinted-bridge',
  'full-arch',
  'overdenture-studs',
  'overdenture-bar',
] as const;
/** Kind of restoration. */
export type RestorationKind = (typeof RESTORATION_KINDS)[number];
/** How a restoration is retained. */
export const RETENTIONS = [
  'screw-to-implant',
  'screw-to-multi-unit',
  'cement-on-abutment',
  'lingual-set-screw',
] as const;
/** How the restoration is retained. */
export type Retention = (typeof RETENTIONS)[number];
/** Connections of the restoration (or abutment) to the implant: indexed to the hex or not. */
export const IMPLANT_INTERFACES = ['engaging', 'non-engaging'] as const;
/** Connection of the restoration (or abutment) to the implant. */
export type ImplantInterface = (typeof IMPLANT_INTERFACES)[number];
/** Impression copings a site can be recorded with. */
export const IMPRESSION_COPINGS = ['engaging', 'non-engaging', 'multi-unit'] as const;
/** Impression coping used at a site. */
export type ImpressionCoping = (typeof IMPRESSION_COPINGS)[number];
/**
 * The angles a catalogue may state for a part, degrees, inclusive. The plan's rules take whatever angle
 * the practice's catalogue states within it (catalogue-values.ts); no list of angles is kept in the code.
 */
export const PART_ANGLE_RANGE_DEG = Object.freeze({ min: 0, max: 45 } as const);
/** Angle of a multi-unit abutment, degrees: the one its catalogue entry states. */
export type MultiUnitAngleDeg = number;

/** The three statuses of the 2017 case definitions, from best to worst (the database enum follows this order). */
export const PERI_IMPLANT_STATUSES = ['health', 'mucositis', 'peri-implantitis'] as const;
/** Peri-implant status of one implant. */
export type PeriImplantStatus = (typeof PERI_IMPLANT_STATUSES)[number];

/** Severities that ask something of the clinician: an error blocks the plan, a warning needs acknowledging. */
export const ACTIONABLE_SEVERITIES = ['error', 'warning'] as const;
/** Severities of a Finding: the actionable ones, and `info`, worth knowing but asking nothing. */
export const FINDING_SEVERITIES = [...ACTIONABLE_SEVERITIES, 'info'] as const;
/** Severity of a Finding. */
export type FindingSeverity = (typeof FINDING_SEVERITIES)[number];

/** How an impression was taken: with copings and a tray (analog) or with an intraoral scanner (digital). */
export const IMPRESSION_METHODS = ['analog', 'digital'] as const;
export type ImpressionMethod = (typeof IMPRESSION_METHODS)[number];
