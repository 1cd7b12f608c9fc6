// Every enumeration of the API, defined once: an `as const` list, its zod schema and its type.
// Clinical ones the domain computes with (verdicts, reasons, statuses, plan choices) are owned by
// @torquetrail/domain and roles by @torquetrail/authz; they are wrapped here, never retyped. The
// database enums (apps/api/src/db/schema/enums.ts) are built from the same lists, in the same order.
import { ROLES, SHARE_SCOPES } from '@torquetrail/authz';
import {
  ACTIONABLE_SEVERITIES,
  COPING_LEVELS,
  FINDING_SEVERITIES,
  IMPLANT_INTERFACES,
  IMPRESSION_COPINGS,
  IMPRESSION_METHODS,
  PART_ANGLE_RANGE_DEG,
  PERI_IMPLANT_STATUSES,
  PROBING_POSITIONS,
  REMINDER_KINDS,
  RESTORATION_KINDS,
  RETENTIONS,
  TORQUE_REASONS,
  TORQUE_VERDICTS,
} from '@torquetrail/domain';
import { z } from 'zod';

export {
  ROLES,
  SHARE_SCOPES,
  ACTIONABLE_SEVERITIES,
  COPING_LEVELS,
  FINDING_SEVERITIES,
  IMPLANT_INTERFACES,
  IMPRESSION_COPINGS,
  IMPRESSION_METHODS,
  PERI_IMPLANT_STATUSES,
  PROBING_POSITIONS,
  REMINDER_KINDS,
  RESTORATION_KINDS,
  RETENTIONS,
  TORQUE_REASONS,
  TORQUE_VERDICTS,
};

// ---- people and services ---------------------------------------------------------------------
export const Role = z.enum(ROLES);
export type Role = z.infer<typeof Role>;

/** What a share opens to a surgeon of another practice (the list is authz's: the ability computes with it). */
export const ShareScope = z.enum(SHARE_SCOPES, { error: 'Choose placement, outcomes or both' });
export type ShareScope = z.infer<typeof ShareScope>;

/** A share is active until revoked or until its end date has passed. */
/** invited: waiting for a surgeon new to Torquetrail to accept the invitation mailed with the share. */
export const SHARE_STATUSES = ['invited', 'active', 'ended', 'revoked'] as const;
export const ShareStatus = z.enum(SHARE_STATUSES);
export type ShareStatus = z.infer<typeof ShareStatus>;

/** Which change a share's e-mail to the surgeon tells of. */
export const SHARE_NOTICE_KINDS = ['shared', 'revoked'] as const;
export type ShareNoticeKind = (typeof SHARE_NOTICE_KINDS)[number];

export const SERVICE_STATES = ['up', 'down'] as const;
export const ServiceState = z.enum(SERVICE_STATES);
export type ServiceState = z.infer<typeof ServiceState>;

// ---- patients ----------------------------------------------------------------------------------
/** Sex as recorded in the patient's file (optional: 'not-recorded' when the practice has none). */
export const PATIENT_SEXES = ['not-recorded', 'female', 'male', 'other'] as const;
export const PatientSex = z.enum(PATIENT_SEXES);
export type PatientSex = z.infer<typeof PatientSex>;

/** Languages offered for a patient's letters and reminders, as BCP 47 tags (a short list, appended to as needed). */
export const PREFERRED_LANGUAGES = ['en', 'fr', 'de', 'es', 'it', 'nl', 'pt', 'pl', 'sv', 'tr', 'ar', 'zh'] as const;
export const PreferredLanguage = z.enum(PREFERRED_LANGUAGES, { error: 'Choose a language from the list' });
export type PreferredLanguage = z.infer<typeof PreferredLanguage>;

/** Which patients a list shows: archived patients are hidden unless asked for. */
export const ARCHIVE_FILTERS = ['active', 'archived', 'all'] as const;
export const ArchiveFilter = z.enum(ARCHIVE_FILTERS);
export type ArchiveFilter = z.infer<typeof ArchiveFilter>;

/** What one version of a patient's record did. */
export const PATIENT_VERSION_KINDS = ['created', 'edited', 'archived', 'unarchived'] as const;
export const PatientVersionKind = z.enum(PATIENT_VERSION_KINDS);
export type PatientVersionKind = z.infer<typeof PatientVersionKind>;

// ---- sites and placements ----------------------------------------------------------------------
export const SITE_STATUSES = ['planned', 'placed', 'restored', 'failed', 'removed'] as const;
export const SiteStatus = z.enum(SITE_STATUSES);
export type SiteStatus = z.infer<typeof SiteStatus>;

export const PeriImplantStatus = z.enum(PERI_IMPLANT_STATUSES);
export type PeriImplantStatus = z.infer<typeof PeriImplantStatus>;

/** Latest computed maintenance status of a site; 'not-examined' until a recall exam exists. */
export const MAINTENANCE_STATUSES = [...PERI_IMPLANT_STATUSES, 'not-examined'] as const;
export const MaintenanceStatus = z.enum(MAINTENANCE_STATUSES);
export type MaintenanceStatus = z.infer<typeof MaintenanceStatus>;

export const CONNECTIONS = ['internal-conical', 'internal-hex', 'external-hex'] as const;
export const Connection = z.enum(CONNECTIONS);
export type Connection = z.infer<typeof Connection>;

export const LOADING_PROTOCOLS = ['immediate', 'early', 'conventional'] as const;
export const LoadingProtocol = z.enum(LOADING_PROTOCOLS);
export type LoadingProtocol = z.infer<typeof LoadingProtocol>;

// ---- catalogue ---------------------------------------------------------------------------------
export const COMPONENT_KINDS = [
  'abutment-stock',
  'abutment-custom',
  'abutment-angled',
  'multi-unit-abutment',
  'abutment-screw',
  'prosthetic-screw',
  'set-screw',
  'impression-coping',
  'healing-abutment',
  'cover-screw',
  /** Screwed on the implant for an intraoral scan; of one platform, removed after the scan. */
  'scan-body',
  /** A stud attachment screwed into the implant; carries an overdenture's retentive insert. */
  'attachment-abutment',
  /** The replaceable insert in the denture's housing that grips a stud attachment. */
  'retentive-insert',
  /** A clip or rider in the denture that grips a bar. */
  'bar-clip',
] as const;
export const ComponentKind = z.enum(COMPONENT_KINDS);
export type ComponentKind = z.infer<typeof ComponentKind>;

/** Abutments a crown or bridge sits on (multi-unit abutments are their own slot). */
export const ABUTMENT_KINDS = [
  'abutment-stock',
  'abutment-custom',
  'abutment-angled',
] as const satisfies readonly ComponentKind[];
/** Screws that hold an abutment or a restoration. */
export const SCREW_KINDS = [
  'abutment-screw',
  'prosthetic-screw',
  'set-screw',
] as const satisfies readonly ComponentKind[];
/** Parts that close the implant at surgery: hand-tight, no torque is logged. */
export const CLOSURE_KINDS = ['healing-abutment', 'cover-screw'] as const satisfies readonly ComponentKind[];
export type ClosureKind = (typeof CLOSURE_KINDS)[number];
/** Parts an overdenture holds on with, in the denture: an insert on a stud, a clip on a bar. */
export const DENTURE_RETAINER_KINDS = ['retentive-insert', 'bar-clip'] as const satisfies readonly ComponentKind[];
/** The Stack from the implant outward: multi-unit or abutment, then its screws, then the rest. */
export const STACK_ORDER: readonly ComponentKind[] = [
  'multi-unit-abutment',
  ...ABUTMENT_KINDS,
  'attachment-abutment',
  ...SCREW_KINDS,
  ...DENTURE_RETAINER_KINDS,
  ...CLOSURE_KINDS,
  'impression-coping',
  'scan-body',
];

/** Impression copings and scan bodies: on the implant, or on a multi-unit abutment (the domain's list). */
export const CopingLevel = z.enum(COPING_LEVELS, { error: 'Choose implant level or multi-unit' });
export type CopingLevel = z.infer<typeof CopingLevel>;

export const TRAYS = ['open', 'closed'] as const;
export const Tray = z.enum(TRAYS);
export type Tray = z.infer<typeof Tray>;

export const WRENCH_TYPES = ['spring', 'friction'] as const;
export const WrenchType = z.enum(WRENCH_TYPES);
export type WrenchType = z.infer<typeof WrenchType>;

// ---- restorations ------------------------------------------------------------------------------
export const RestorationKind = z.enum(RESTORATION_KINDS);
export type RestorationKind = z.infer<typeof RestorationKind>;
export const Retention = z.enum(RETENTIONS);
export type Retention = z.infer<typeof Retention>;
export const InterfaceKind = z.enum(IMPLANT_INTERFACES);
export type InterfaceKind = z.infer<typeof InterfaceKind>;
export const ImpressionCopingKind = z.enum(IMPRESSION_COPINGS);
export type ImpressionCopingKind = z.infer<typeof ImpressionCopingKind>;
export const ImpressionMethod = z.enum(IMPRESSION_METHODS, { error: 'Choose analog or digital' });
export type ImpressionMethod = z.infer<typeof ImpressionMethod>;
/** A digital impression's mesh files, detected by their content: STL (ASCII or binary), PLY, OBJ. */
export const SCAN_FILE_TYPES = ['stl', 'ply', 'obj'] as const;
export const ScanFileType = z.enum(SCAN_FILE_TYPES);
export type ScanFileType = z.infer<typeof ScanFileType>;
export const FindingSeverity = z.enum(FINDING_SEVERITIES);
export type FindingSeverity = z.infer<typeof FindingSeverity>;
/** The multi-unit abutment's angle as its catalogue entry states it, degrees (no list of angles in code). */
export const MultiUnitAngleDeg = z
  .number({ error: 'Enter the angle in degrees' })
  .min(PART_ANGLE_RANGE_DEG.min, { error: `At least ${PART_ANGLE_RANGE_DEG.min}°` })
  .max(PART_ANGLE_RANGE_DEG.max, { error: `At most ${PART_ANGLE_RANGE_DEG.max}°` });
export type MultiUnitAngleDeg = z.infer<typeof MultiUnitAngleDeg>;

export const MATERIALS = [
  'zirconia',
  'titanium-porcelain',
  'titanium-composite',
  'full-gold',
  'porcelain-fused-to-metal',
  'other',
] as const;
export const Material = z.enum(MATERIALS);
export type Material = z.infer<typeof Material>;

export const RESTORATION_STATUSES = ['planned', 'delivered', 'removed'] as const;
export const RestorationStatus = z.enum(RESTORATION_STATUSES);
export type RestorationStatus = z.infer<typeof RestorationStatus>;

// ---- torque, complications, Timeline -------------------------------------------------------------
export const TorqueVerdict = z.enum(TORQUE_VERDICTS);
export type TorqueVerdict = z.infer<typeof TorqueVerdict>;
export const TorqueReason = z.enum(TORQUE_REASONS);
export type TorqueReason = z.infer<typeof TorqueReason>;

export const COMPLICATION_KINDS = [
  'screw-loosening',
  'screw-fracture',
  'abutment-fracture',
  'veneer-chipping',
  'framework-fracture',
  'other',
] as const;
export const ComplicationKind = z.enum(COMPLICATION_KINDS);
export type ComplicationKind = z.infer<typeof ComplicationKind>;

/** Why a retentive insert (or a bar clip) of an overdenture was changed. */
export const INSERT_CHANGE_REASONS = ['retention-loss', 'wear', 'fracture'] as const;
export const InsertChangeReason = z.enum(INSERT_CHANGE_REASONS);
export type InsertChangeReason = z.infer<typeof InsertChangeReason>;

/** In the order of a sitting: the Timeline orders the entries of one day by it. */
export const TIMELINE_KINDS = [
  'placement',
  'plan',
  'impression',
  'lab-prescription',
  'part',
  'delivery',
  'complication',
  'torque',
  'recall-exam',
  // A sitting ends with its radiograph, then what was read from it (bone levels, a seating check).
  'radiograph',
  'bone-level',
  'seating-check',
  // The patient's referral summary e-mailed to a share's surgeon: on the Timeline of each site.
  'referral-summary',
  // The patient's implant passport e-mailed to them (a patient-wide entry, shown on each site).
  'passport-mail',
  // A part brought in by a legacy import that is not in the catalogue, kept as its free text.
  'imported-part',
  // A retentive insert (or bar clip) of an overdenture changed at this site.
  'insert-change',
] as const;
export const TimelineKind = z.enum(TIMELINE_KINDS);
export type TimelineKind = z.infer<typeof TimelineKind>;

// ---- recalls -----------------------------------------------------------------------------------
export const ProbingPosition = z.enum(PROBING_POSITIONS);
export type ProbingPosition = z.infer<typeof ProbingPosition>;

/** A scheduled recall; the Recall desk shows the next 'scheduled' one. */
export const RECALL_STATUSES = ['scheduled', 'done', 'cancelled'] as const;
export const RecallStatus = z.enum(RECALL_STATUSES);
export type RecallStatus = z.infer<typeof RecallStatus>;

export const ReminderKind = z.enum(REMINDER_KINDS);
export type ReminderKind = z.infer<typeof ReminderKind>;
/** 'withheld': not sent because the patient was archived or withdrew consent after it was logged. */
export const REMINDER_STATUSES = ['pending', 'sent', 'failed', 'withheld'] as const;
export const ReminderStatus = z.enum(REMINDER_STATUSES);
export type ReminderStatus = z.infer<typeof ReminderStatus>;

/**
 * 'provisional-overdue': a delivered provisional still in place after its planned replacement day.
 * 'insert-review-overdue': a delivered overdenture whose last insert change (or its delivery when
 * none is recorded) is older than the practice's insert review interval.
 */
export const DESK_FILTERS = [
  'all',
  'due-this-week',
  'overdue',
  'peri-implantitis-last',
  'provisional-overdue',
  'insert-review-overdue',
] as const;
/** The 'due-this-week' filter: recalls due from today to this many days ahead, inclusive. */
export const DESK_DUE_SOON_DAYS = 7;
export const DeskFilter = z.enum(DESK_FILTERS);
export type DeskFilter = z.infer<typeof DeskFilter>;
export const DESK_SORTS = ['dueOn', 'overdueDays', 'name', 'lastExamOn'] as const;
export const DeskSort = z.enum(DESK_SORTS);
export type DeskSort = z.infer<typeof DeskSort>;
export const SORT_DIRECTIONS = ['asc', 'desc'] as const;
export const SortDirection = z.enum(SORT_DIRECTIONS);
export type SortDirection = z.infer<typeof SortDirection>;

// ---- radiographs -------------------------------------------------------------------------------
/** What the bytes of an uploaded radiograph are (decided by their signature, never by name). */
export const RADIOGRAPH_FILE_TYPES = ['png', 'jpeg', 'dicom'] as const;
export const RadiographFileType = z.enum(RADIOGRAPH_FILE_TYPES);
export type RadiographFileType = z.infer<typeof RadiographFileType>;
export const RADIOGRAPH_KINDS = ['periapical', 'bitewing', 'panoramic', 'cbct-export', 'other'] as const;
export const RadiographKind = z.enum(RADIOGRAPH_KINDS);
export type RadiographKind = z.infer<typeof RadiographKind>;

// ---- audit trail -------------------------------------------------------------------------------
/** What an audit event records (issue 11): reads and exports of patient data, every change, sign-ins. */
export const AUDIT_ACTIONS = [
  'read',
  'create',
  'amend',
  'archive',
  'export',
  'print',
  'sign-in',
  'sign-in-failed',
  'sign-out',
  'invite',
  'role-change',
  'share-change',
  'catalogue-change',
  'policy-change',
] as const;
export const AuditAction = z.enum(AUDIT_ACTIONS);
export type AuditAction = z.infer<typeof AuditAction>;
/** allowed: the request succeeded; refused: the app said no (4xx); failed: it could not answer (5xx). */
export const AUDIT_OUTCOMES = ['allowed', 'refused', 'failed'] as const;
export const AuditOutcome = z.enum(AUDIT_OUTCOMES);
export type AuditOutcome = z.infer<typeof AuditOutcome>;
/** The two Timeline events whose seating a radiograph can confirm (a delivery, an impression). */
export const SEATING_EVENTS = ['impression', 'delivery'] as const;
export const SeatingEvent = z.enum(SEATING_EVENTS);
export type SeatingEvent = z.infer<typeof SeatingEvent>;
/** What the radiograph showed: seated, not seated, or cannot tell. */
export const SEATING_ANSWERS = ['yes', 'no', 'unsure'] as const;
export const SeatingAnswer = z.enum(SEATING_ANSWERS);
export type SeatingAnswer = z.infer<typeof SeatingAnswer>;
/** Where a radiograph's server-made preview stands: made after the upload, off the request path. */
export const RADIOGRAPH_PREVIEW_STATUSES = ['pending', 'ready', 'unavailable'] as const;
export const RadiographPreviewStatus = z.enum(RADIOGRAPH_PREVIEW_STATUSES);
export type RadiographPreviewStatus = z.infer<typeof RadiographPreviewStatus>;
/** Where an invitation stands (derived from its row: accepted, revoked, expired or still pending). */
export const INVITATION_STATUSES = ['pending', 'expired', 'accepted', 'revoked'] as const;
export const InvitationStatus = z.enum(INVITATION_STATUSES);
export type InvitationStatus = z.infer<typeof InvitationStatus>;

// ---- lot look-up and outcomes (the referring surgeon's views) ----------------------------------
/** What the look-up text is: a lot, a GTIN, a catalogue part (reference code) or a whole UDI. */
export const LOT_LOOKUP_KINDS = ['lot', 'gtin', 'part', 'udi'] as const;
export const LotLookupKind = z.enum(LOT_LOOKUP_KINDS);
export type LotLookupKind = z.infer<typeof LotLookupKind>;

/** Where a part is: an implant, or a part of the restoration stack. */
export const LOT_ITEM_KINDS = ['implant', 'part'] as const;
export const LotItemKind = z.enum(LOT_ITEM_KINDS);
export type LotItemKind = z.infer<typeof LotItemKind>;

export const OUTCOME_GROUPINGS = ['system', 'retention'] as const;
export const OutcomeGrouping = z.enum(OUTCOME_GROUPINGS);
export type OutcomeGrouping = z.infer<typeof OutcomeGrouping>;

/** In function while in the mouth, whatever its condition (reference §11); failed or removed when out. */
export const IMPLANT_OUTCOMES = ['in-function', 'failed', 'removed'] as const;
export const ImplantOutcome = z.enum(IMPLANT_OUTCOMES);
export type ImplantOutcome = z.infer<typeof ImplantOutcome>;
// ---- legacy import -------------------------------------------------------------------------------
/** What one row of a legacy import file records (docs/import.md). */
export const IMPORT_EVENTS = ['placement', 'delivery', 'part', 'torque', 'exam'] as const;
export const ImportEvent = z.enum(IMPORT_EVENTS);
export type ImportEvent = z.infer<typeof ImportEvent>;
/**
 * An error stops the import; a warning is shown and does not: the same two severities, with the
 * same meaning, as a plan's actionable Findings.
 */
export const IMPORT_ISSUE_LEVELS = ACTIONABLE_SEVERITIES;
export const ImportIssueLevel = z.enum(IMPORT_ISSUE_LEVELS);
export type ImportIssueLevel = z.infer<typeof ImportIssueLevel>;
// ---- practice settings ---------------------------------------------------------------------------
/**
 * The order in which a practice writes and types dates (issue 15 §7). An order, not a locale: the
 * order is what decides how 01/02/2026 is read, and a clinic can see it at a glance; the month is
 * written in words where the order allows, so a shown date is never ambiguous.
 */
export const DATE_FORMATS = ['day-month-year', 'month-day-year', 'year-month-day'] as const;
export const DateFormat = z.enum(DATE_FORMATS);
export type DateFormat = z.infer<typeof DateFormat>;
export const DEFAULT_DATE_FORMAT: DateFormat = 'day-month-year';
