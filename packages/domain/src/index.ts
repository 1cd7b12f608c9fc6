/**
 * @torquetrail/domain — the clinical computation core of Torquetrail.
 *
 * Pure functions, no I/O. Computed results support, never replace, the clinician's judgement.
 * Every rule, its source and the decisions taken where the sources are silent are listed in
 * docs/clinical-rules.md. Invalid input throws a typed error ({@link DomainError} subclasses, or
 * `RangeError` for tooth positions), never a silent wrong answer.
 */

// ---- version -------------------------------------------------------------------------------
/** Version of the rule set; store it beside every computed verdict. */
export { RULES_VERSION } from './version.js';

// ---- errors --------------------------------------------------------------------------------
/** Base class of all domain errors; branch on its stable `code`. */
export { DomainError } from './errors.js';
/** Invalid input (NaN, negative depth, empty list, impossible date, unknown choice). */
export { ValidationError } from './errors.js';
/** Unreadable GS1 UDI or GTIN; `code` tells why (e.g. `bad-check-digit`). */
export { UdiError } from './errors.js';
/** Non-existent tooth position; a `RangeError` with `code` 'invalid-position'. */
export { ToothPositionError } from './errors.js';
/** Error-code unions. */
export type { ValidationErrorCode, UdiErrorCode } from './errors.js';

// ---- calendar ------------------------------------------------------------------------------
/** Adds calendar months to a YYYY-MM-DD date, clamping to the month's last day. */
export { addCalendarMonths } from './calendar.js';
/** True for a real calendar date written YYYY-MM-DD. */
export { isValidIsoDate } from './calendar.js';
/** Whole days between two YYYY-MM-DD dates. */
export { daysBetween } from './calendar.js';
/** Adds whole days to a YYYY-MM-DD date. */
export { addCalendarDays } from './calendar.js';

// ---- tooth numbering (ISO 3950 / Universal) ------------------------------------------------
/** FDI → Universal ('1'–'32', 'A'–'T'); `RangeError` for a non-existent position. */
export { fdiToUniversal } from './tooth-numbering.js';
/** Universal → FDI; `RangeError` for a non-existent designation. */
export { universalToFdi } from './tooth-numbering.js';
/** Writes a tooth in FDI or Universal notation. */
export { formatTooth } from './tooth-numbering.js';
/** 'molar' | 'premolar' | 'canine' | 'incisor' for an FDI position. */
export { toothKind } from './tooth-numbering.js';
/** Upper or lower arch of an FDI position. */
export { toothArch } from './tooth-numbering.js';
/** True for an existing FDI position (permanent or primary). */
export { isValidFdi } from './tooth-numbering.js';
/** True for a primary-dentition FDI position. */
export { isPrimaryTooth } from './tooth-numbering.js';
/** The 32 permanent FDI positions in drawing order (18…11, 21…28, 38…31, 41…48). */
export { TOOTH_POSITIONS_PERMANENT } from './tooth-numbering.js';
/** The 20 primary FDI positions in drawing order (55…51, 61…65, 75…71, 81…85). */
export { TOOTH_POSITIONS_PRIMARY } from './tooth-numbering.js';
/** Tooth-numbering types. */
export type { ToothKind, ToothNumberingSystem, ToothArch } from './tooth-numbering.js';

// ---- peri-implant status (2017 World Workshop) ---------------------------------------------
/** Health / mucositis / peri-implantitis from the worst site, with reasons and flags. */
export { classifyPeriImplant } from './peri-implant-status.js';
/** Stable flag strings of {@link classifyPeriImplant}. */
export { PERI_IMPLANT_FLAGS } from './choices.js';
export type { PeriImplantFlag } from './choices.js';
/** Default and published thresholds of the peri-implant case definitions. */
export {
  DEFAULT_PD_INCREASE_MM,
  DEFAULT_BONE_LOSS_MM,
  NO_BASELINE_PD_MM,
  NO_BASELINE_BONE_LEVEL_MM,
} from './peri-implant-status.js';
/** The three statuses, best to worst. */
export { PERI_IMPLANT_STATUSES } from './choices.js';
/** Peri-implant types. */
export type {
  PeriImplantStatus,
  PeriImplantSite,
  PeriImplantExam,
  PeriImplantBaseline,
  PeriImplantOptions,
  PeriImplantResult,
} from './peri-implant-status.js';
/** The baseline exam of an exam (latest marked, else first after delivery; needs a bone level). */
export { choosePeriImplantBaseline } from './peri-implant-baseline.js';
/** Exam and baseline as classifyPeriImplant takes them (chart order; no baseline for a baseline exam). */
export { toPeriImplantExam, toPeriImplantBaseline } from './peri-implant-baseline.js';
/** The latest exam, and probing sites in chart order. */
export { latestExam, inChartOrder } from './peri-implant-baseline.js';
/** The six probing sites, in chart order. */
export { PROBING_POSITIONS } from './choices.js';
export type { ProbingPosition } from './choices.js';
export type { ProbedSite, RecordedExam } from './peri-implant-baseline.js';

// ---- UDI (GS1) -----------------------------------------------------------------------------
/** GS1 check digit of the data digits. */
export { gtinCheckDigit } from './udi.js';
/** True for a GTIN-8/12/13/14 with a correct check digit. */
export { isValidGtin } from './udi.js';
/** Parses a GS1 UDI element string (human-readable or raw with GS). */
export { parseUdi } from './udi.js';
/** The GS (0x1D) separator and accepted symbology identifiers. */
export { GS, SYMBOLOGY_IDENTIFIERS } from './udi.js';
/** Parsed UDI type. */
export type { ParsedUdi } from './udi.js';
/** A parsed UDI against its placement: typed lot vs scanned lot, expiry before the placement date. */
export { checkUdiForPlacement } from './udi-placement.js';
export type { UdiPlacementFinding, UdiPlacementCode } from './udi-placement.js';

// ---- geometry ------------------------------------------------------------------------------
/** Angle between two implant axes, degrees, in [0, 180]. */
export { divergenceDeg } from './geometry.js';
/** 15°, the divergence limit for accurate impressions (Jang 2011). */
export { DIVERGENCE_LIMIT_DEG } from './geometry.js';
/** 3-D vector type. */
export type { Vec3 } from './geometry.js';

// ---- radiograph measurement ----------------------------------------------------------------
/** Distance between two image points using DICOM Pixel Spacing (row spacing first). */
export { pixelDistanceMm } from './radiograph-measure.js';
/** Magnification correction by an implant of known length. */
export { correctByKnownLength } from './radiograph-measure.js';
/** Bone levels along the implant axis from the platform, calibrated by known length, with the Pixel Spacing estimate. */
export { measureBoneLevels, projectOnImplantAxis, SPACING_DISAGREEMENT_LIMIT } from './radiograph-measure.js';
/** Radiograph measurement types. */
export type {
  PixelPoint,
  PixelSpacing,
  KnownLengthCalibration,
  AxisProjection,
  ImplantMarks,
  BoneLevelMeasurementInput,
  BoneLevelMeasurement,
  SpacingEstimate,
} from './radiograph-measure.js';

// ---- torque --------------------------------------------------------------------------------
/** One of TORQUE_VERDICTS against an inclusive percentage window. */
export { torqueVerdict } from './torque.js';
/** Signed deviation from the specification, %. */
export { torqueDeviationPct } from './torque.js';
/** The window torqueVerdict judges against: spec ∓ spec × tolerance ÷ 100. */
export { torqueToleranceBand } from './torque.js';
/** Published tolerances, re-tightening delay and demo-catalogue torques (manufacturer-specific). */
export {
  ISO_6789_TOLERANCE_PCT,
  FRICTION_DEVICE_TOLERANCE_PCT,
  RETIGHTEN_AFTER_MINUTES,
  DEMO_TORQUE_DEFAULTS_NCM,
} from './torque.js';
/** Verdicts, reasons and the accepted torque range (1–100 N·cm). */
export { TORQUE_VERDICTS, TORQUE_REASONS } from './choices.js';
export { TORQUE_NCM_RANGE } from './torque.js';
/** Torque types. */
export type { TorqueVerdict, TorqueReason } from './choices.js';
export type { TorqueCheck } from './torque.js';
/** When the re-torque after a seating is due (Siamos 2002), and the reasons that seat and re-tighten. */
export { retorqueDueAt, SEATING_REASONS, RETORQUE_REASONS } from './retorque.js';
/** A part never seated by a logged torque; a settling re-torque logged before the settling time. */
export { seatingTorqueMissing, earlySettlingRetorque } from './retorque.js';
export type { TorqueLogEntry, EarlySettlingRetorque } from './retorque.js';
/** Torque wrench calibration: the practice's interval (default 12 months [common practice]) and when it runs out. */
export {
  calibrationDueOn,
  calibrationOverdue,
  DEFAULT_CALIBRATION_INTERVAL_MONTHS,
  CALIBRATION_INTERVAL_RANGE,
} from './wrench-calibration.js';

// ---- bone level ----------------------------------------------------------------------------
/** Cumulative Albrektsson allowance after n years: 1.5 + 0.2 × (n − 1) mm. */
export { albrektssonAllowanceMm } from './bone-level.js';
/** Judges a bone-level series against Albrektsson 1986. */
export { meetsAlbrektsson } from './bone-level.js';
/** ICOI Pisa health-scale group I–IV (Misch 2008). */
export { icoiGrade } from './bone-level.js';
/** Albrektsson limits. */
export { ALBREKTSSON_FIRST_YEAR_MM, ALBREKTSSON_ANNUAL_MM, ICOI_GRADES } from './bone-level.js';
/** The reading meetsAlbrektsson takes as its reference (closest to loading, ±90 days). */
export { albrektssonReference } from './bone-level.js';
/** Measured bone levels into the record: the worse side, the exam's value, the series summary. */
export { worseBoneLevel, examBoneLevelMm, boneLevelSummary, boneLevelOfferFor } from './bone-level-record.js';
export type {
  MeasuredBoneLevel,
  OfferableBoneLevel,
  ExamFindings,
  BoneLevelSummaryInput,
  BoneLevelSummary,
  AllowancePoint,
} from './bone-level-record.js';
/** Bone-level types. */
export type { BoneLevelReading, AlbrektssonOptions, AlbrektssonResult, IcoiGrade, IcoiInput } from './bone-level.js';

// ---- restorative space ---------------------------------------------------------------------
/** Minimum vertical restorative space for a design (Carpentieri 2019, strictest end). */
export { minRestorativeSpaceMm } from './restorative-space.js';
/** Minimum gap for a single implant between teeth: diameter + 3 mm. */
export { minSingleToothGapMm } from './restorative-space.js';
/** Minimum centre distance of two implants: radii + 3 mm (Tarnow 2000). */
export { minImplantCentreDistanceMm } from './restorative-space.js';
/** Designs, labels and spacing constants. */
export {
  RESTORATIVE_DESIGNS,
  RESTORATIVE_DESIGN_LABELS,
  MIN_IMPLANT_TO_TOOTH_MM,
  MIN_IMPLANT_TO_IMPLANT_MM,
} from './restorative-space.js';
/** Restorative design type. */
export type { RestorativeDesign } from './restorative-space.js';

// ---- restoration plan ----------------------------------------------------------------------
/** Validates a restoration plan; `[]` when valid. */
export { validateRestorationPlan } from './restoration-plan.js';
/** The restorative design a plan implies. */
export { restorativeDesignForPlan } from './restoration-plan.js';
/** Stable finding codes and source strings. */
export { PLAN_FINDING_CODES, PLAN_SOURCES } from './plan-findings.js';
/** Kinds, retentions, interfaces, impression copings, multi-unit angles and finding severities. */
export {
  RESTORATION_KINDS,
  RETENTIONS,
  IMPLANT_INTERFACES,
  IMPRESSION_COPINGS,
  PART_ANGLE_RANGE_DEG,
} from './choices.js';
export { ABUTMENT_LEVEL_RETENTIONS } from './restoration-plan.js';
/** Findings for chosen parts whose catalogue entry lacks a value a plan rule reads. */
export { CATALOGUE_VALUE_FINDING_CODES, catalogueValueFindings, catalogueValuesRead } from './catalogue-values.js';
export type { CatalogueValue, PartValues, SiteParts } from './catalogue-values.js';
/** Coping level of impression parts and engaging of abutments against what the restoration needs. */
export { COPING_LEVELS } from './choices.js';
export { PART_FIT_FINDING_CODES, engagingFindings, impressionLevelFindings, impressionLevelFor } from './part-fit.js';
export type { CopingLevel } from './choices.js';
export type { EngagingPart, FitSite, LevelledPart } from './part-fit.js';
export { ACTIONABLE_SEVERITIES, FINDING_SEVERITIES } from './choices.js';
/** Overdenture kinds (on stud attachments, on a bar) and the catalogue facts their rules read. */
export { OVERDENTURE_KINDS, isOverdentureKind } from './overdenture-plan.js';
export type { AttachmentFacts, OverdentureKind } from './overdenture-plan.js';
/** False only for cement-retained restorations (cut off, not undone). */
export { isRetrievable } from './restoration-plan.js';
/** Restoration-plan types. */
export type { Finding, FindingSeverity } from './plan-findings.js';
export type {
  RestorationPlan,
  RestorationPlanSite,
  RestorationKind,
  Retention,
  ImplantInterface,
  ImpressionCoping,
  MultiUnitAngleDeg,
} from './restoration-plan.js';

// ---- cantilevers and provisionals ---------------------------------------------------------
/** Distal cantilevers against the A-P spread (English 1990 [memory]; ratio 1.5 [common practice]). */
export {
  cantileverFindings,
  cantileverLimitMm,
  recordsCantilevers,
  CANTILEVER_KINDS,
  CANTILEVER_FINDING_CODES,
  CANTILEVER_RATIO_RANGE,
  CANTILEVER_MAX_MM,
  AP_SPREAD_MAX_MM,
  DEFAULT_CANTILEVER_RATIO,
} from './cantilever.js';
export type { CantileverInput } from './cantilever.js';
/** A provisional past its planned replacement date. */
export { provisionalOverdue } from './provisional.js';

// ---- retentive-insert changes --------------------------------------------------------------
/** Interval since the last insert change, counts per year, the review's due day (12 months [common practice]). */
export {
  insertChangeSummary,
  insertChangeHistory,
  insertReviewDueOn,
  insertReviewOverdue,
  wholeMonthsBetween,
  DEFAULT_INSERT_REVIEW_MONTHS,
  INSERT_REVIEW_MONTHS_RANGE,
} from './insert-changes.js';
export type { InsertChangeSummary, InsertChangeYear } from './insert-changes.js';

// ---- recall --------------------------------------------------------------------------------
/** Next recall date: 6 months, or 3 with any risk factor (practice policy). */
export { nextRecallDate } from './recall-interval.js';
/** True when any recall risk factor is present. */
export { hasRecallRisk } from './recall-interval.js';
/** The interval itself, months: the risk interval with any risk factor, else the base interval. */
export { recallIntervalMonths } from './recall-interval.js';
/** Default recall intervals, the range a policy may set, and the risk factors. */
export {
  DEFAULT_RECALL_MONTHS,
  DEFAULT_RISK_RECALL_MONTHS,
  RECALL_MONTHS_RANGE,
  RECALL_RISK_FACTORS,
} from './recall-interval.js';
/** Recall types. */
export type { RecallRisk, RecallRiskFactor, RecallPolicy } from './recall-interval.js';
/** Reminder kinds due on a day for a recall date, under the reminder policy. */
export { remindersDue } from './recall-reminders.js';
/** Reminder kinds and default reminder timing. */
export { REMINDER_KINDS } from './choices.js';
export { DEFAULT_REMINDER_DAYS_BEFORE, DEFAULT_OVERDUE_REMINDER_DAYS_AFTER } from './recall-reminders.js';
export type { ReminderKind } from './choices.js';
export type { ReminderPolicy } from './recall-reminders.js';

// ---- survival and rates (outcomes view) ----------------------------------------------------
/** Kaplan–Meier product-limit estimate with number at risk and Greenwood SE. */
export { kaplanMeier, survivalAt, numberAtRisk } from './survival.js';
/** Follow-up years between dates (÷ 365.25) and events per 100 implant-years. */
export { followUpYears, eventsPer100ImplantYears, DAYS_PER_YEAR } from './survival.js';
export type { SurvivalObservation, KaplanMeierStep, KaplanMeierResult } from './survival.js';

// ---- impressions -----------------------------------------------------------------------------
/** Scan bodies of a digital impression: one per site, a scan body, of the site's platform, with its lot. */
export { checkScanBodies, SCAN_BODY_FINDING_CODES, seatingRadiographFindings } from './scan-bodies.js';
export { IMPRESSION_METHODS } from './choices.js';
export type { ImpressionMethod, ImpressionSite, ScanBodyEntry } from './scan-bodies.js';
