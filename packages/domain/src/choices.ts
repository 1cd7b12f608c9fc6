/**
 * The domain's lists of choices (restoration kinds, retentions, connections, copings, peri-implant
 * statuses, finding severities, impression methods, torque verdicts and reasons, coping levels,
 * probing positions, reminder kinds, the peri-implant flags), in a module of their own: the contracts wrap each in a zod
 * enum, so every screen needs them, and here they come without the rules that use them
 * (restoration-plan.ts, peri-implant-status.ts, plan-findings.ts, scan-bodies.ts, torque.ts,
 * part-fit.ts, peri-implant-baseline.ts, recall-reminders.ts). The web's first load takes them from
 * here: the bundler splits by module, so a list kept beside its rule brings the rule along.
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

/** Verdicts of `torqueVerdict` (torque.ts), in the order they are stored (the database enum follows it). */
export const TORQUE_VERDICTS = ['within', 'under', 'over'] as const;
/** Verdict of `torqueVerdict` (torque.ts). */
export type TorqueVerdict = (typeof TORQUE_VERDICTS)[number];

/**
 * Why a torque was applied. Seating and re-torque reasons drive the re-torque reminder
 * (`retorqueDueAt` in retorque.ts).
 */
export const TORQUE_REASONS = [
  'initial-seating',
  're-torque-after-settling',
  're-torque-at-recall',
  'loosening-found',
  'screw-replaced',
] as const;
/** One of {@link TORQUE_REASONS}. */
export type TorqueReason = (typeof TORQUE_REASONS)[number];

/** Where an impression coping or scan body sits: on the implant, or on a multi-unit abutment. */
export const COPING_LEVELS = ['implant', 'multi-unit'] as const;
/** Where an impression coping or scan body sits. */
export type CopingLevel = (typeof COPING_LEVELS)[number];

/** The six probing sites around an implant, in periodontal-chart order (buccal row, then lingual row). */
export const PROBING_POSITIONS = [
  'mesiobuccal',
  'buccal',
  'distobuccal',
  'mesiolingual',
  'lingual',
  'distolingual',
] as const;
/** One of {@link PROBING_POSITIONS}. */
export type ProbingPosition = (typeof PROBING_POSITIONS)[number];

/** Kinds of recall reminder: before the recall, and after a missed one. */
export const REMINDER_KINDS = ['upcoming', 'overdue'] as const;
/** One of {@link REMINDER_KINDS}. */
export type ReminderKind = (typeof REMINDER_KINDS)[number];

/** Stable flag strings returned in `PeriImplantResult.flags` (peri-implant-status.ts). */
export const PERI_IMPLANT_FLAGS = Object.freeze({
  /** No baseline given: the no-baseline case definition (PD ≥ 6 mm and bone level ≥ 3 mm) was used. */
  NO_BASELINE: 'no-baseline',
  /** BOP/SUP with only one of the no-baseline limits reached (or the other unknown): peri-implantitis cannot be excluded without a baseline. */
  PERI_IMPLANTITIS_NOT_EXCLUDED_WITHOUT_BASELINE: 'peri-implantitis-not-excluded-without-baseline',
  /** No current radiographic bone level: bone loss cannot be judged, so peri-implantitis cannot be excluded. */
  BONE_LEVEL_MISSING: 'bone-level-missing',
  /** Bone loss beyond the limit without bleeding or suppuration: status 'health', but review the radiograph. */
  BONE_LOSS_WITHOUT_INFLAMMATION: 'bone-loss-without-inflammation',
} as const);

/** One of the {@link PERI_IMPLANT_FLAGS} strings. */
export type PeriImplantFlag = (typeof PERI_IMPLANT_FLAGS)[keyof typeof PERI_IMPLANT_FLAGS];
