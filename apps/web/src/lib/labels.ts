// Labels of the non-clinical enums (roles, statuses, the Recall desk, the Timeline); clinical ones
// are in clinical-labels.ts. labels.test.ts checks that every enum has one label per value.
import type { Role } from '@torquetrail/authz';
import {
  type ArchiveFilter,
  type AuditAction,
  type AuditOutcome,
  type DateFormat,
  DESK_DUE_SOON_DAYS,
  type DeskFilter,
  type DeskSort,
  type ImportEvent,
  type ImportIssueLevel,
  type ImportProgress,
  type InvitationStatus,
  type MaintenanceStatus,
  type PatientSex,
  type PatientVersionField,
  type PatientVersionKind,
  type PreferredLanguage,
  type RadiographFileType,
  type RadiographKind,
  type RadiographPreviewStatus,
  type ReminderKind,
  type ReminderStatus,
  type ShareScope,
  type ShareStatus,
  type SiteStatus,
  type TimelineKind,
  type LotLookupKind,
  type LotItemKind,
  type OutcomeGrouping,
  type ImplantOutcome,
} from '@torquetrail/contracts';

export const ROLE_LABEL: Record<Role, string> = {
  dentist: 'Restorative dentist',
  hygienist: 'Dental hygienist',
  surgeon: 'Referring surgeon',
  practice_admin: 'Practice administrator',
};

export const SITE_STATUS_LABEL: Record<SiteStatus, string> = {
  planned: 'Planned',
  placed: 'Placed',
  restored: 'Restored',
  failed: 'Failed',
  removed: 'Removed',
};

/** How the Arch's accessible name words a site ("36, implant placed, …"): a restored site is just "implant". */
export const SITE_STATUS_PHRASE: Record<SiteStatus, string> = {
  restored: 'implant',
  placed: 'implant placed',
  planned: 'implant planned',
  failed: 'implant failed',
  removed: 'implant removed',
};

export const MAINTENANCE_STATUS_LABEL: Record<MaintenanceStatus, string> = {
  health: 'peri-implant health',
  mucositis: 'peri-implant mucositis',
  'peri-implantitis': 'peri-implantitis',
  'not-examined': 'not yet examined',
};

/** Shown wherever a computed maintenance status is shown. */
export const MAINTENANCE_NOTE =
  "Computed from the 2017 World Workshop case definitions; supports, never replaces, the clinician's diagnosis.";

export const TIMELINE_KIND_LABEL: Record<TimelineKind, string> = {
  placement: 'Placement',
  plan: 'Plan',
  impression: 'Impression',
  'lab-prescription': 'Lab prescription',
  part: 'Parts',
  delivery: 'Delivery',
  torque: 'Torque',
  complication: 'Complication',
  'recall-exam': 'Recall exam',
  radiograph: 'Radiograph',
  'bone-level': 'Bone level',
  'seating-check': 'Seating check',
  'referral-summary': 'Referral summary',
  'passport-mail': 'Passport e-mailed',
  'imported-part': 'Imported part',
  'insert-change': 'Insert change',
};

export const DESK_FILTER_LABEL: Record<DeskFilter, string> = {
  all: 'All patients with implants',
  'due-this-week': `Due in the next ${DESK_DUE_SOON_DAYS} days`,
  overdue: 'Overdue',
  'peri-implantitis-last': 'Peri-implantitis last time',
  'provisional-overdue': 'Provisional past its planned replacement',
  'insert-review-overdue': 'Overdenture insert review overdue',
};

/** Column heads of the Recall desk's sortable columns. */
export const DESK_SORT_LABEL: Record<DeskSort, string> = {
  name: 'Patient',
  dueOn: 'Next recall',
  overdueDays: 'Overdue',
  lastExamOn: 'Last exam',
};

export const REMINDER_KIND_LABEL: Record<ReminderKind, string> = {
  upcoming: 'Upcoming',
  overdue: 'Overdue',
};

export const INVITATION_STATUS_LABEL: Record<InvitationStatus, string> = {
  pending: 'Waiting for the invitee',
  expired: 'Link expired',
  accepted: 'Accepted',
  revoked: 'Withdrawn',
};

export const REMINDER_STATUS_LABEL: Record<ReminderStatus, string> = {
  pending: 'Pending',
  sent: 'Sent',
  failed: 'Failed',
  withheld: 'Withheld',
};

export const PATIENT_SEX_LABEL: Record<PatientSex, string> = {
  'not-recorded': 'Not recorded',
  female: 'Female',
  male: 'Male',
  other: 'Other',
};

/** English name first, then the language's own name, so the person it concerns can check it too. */
export const PREFERRED_LANGUAGE_LABEL: Record<PreferredLanguage, string> = {
  en: 'English',
  fr: 'French (français)',
  de: 'German (Deutsch)',
  es: 'Spanish (español)',
  it: 'Italian (italiano)',
  nl: 'Dutch (Nederlands)',
  pt: 'Portuguese (português)',
  pl: 'Polish (polski)',
  sv: 'Swedish (svenska)',
  tr: 'Turkish (Türkçe)',
  ar: 'Arabic (العربية)',
  zh: 'Chinese (中文)',
};

export const ARCHIVE_FILTER_LABEL: Record<ArchiveFilter, string> = {
  active: 'Current patients',
  archived: 'Archived patients',
  all: 'Current and archived',
};

export const PATIENT_VERSION_KIND_LABEL: Record<PatientVersionKind, string> = {
  created: 'Registered',
  edited: 'Edited',
  archived: 'Archived',
  unarchived: 'Brought back',
};

/** The fields of a patient's record, as the form and the History name them. */
export const PATIENT_FIELD_LABEL: Record<PatientVersionField, string> = {
  chartNumber: 'Chart number',
  givenName: 'Given name',
  familyName: 'Family name',
  birthDate: 'Date of birth',
  sex: 'Sex (as recorded)',
  email: 'E-mail',
  phone: 'Phone',
  preferredLanguage: 'Preferred language',
  emailReminderConsent: 'Consent to e-mail reminders',
  emailReminderConsentOn: 'Consent given on',
  smoker: 'Smoker',
  diabetesPoorlyControlled: 'Diabetes, poorly controlled',
  periodontitisHistory: 'History of periodontitis',
  riskFactorsRecordedOn: 'Risk factors recorded on',
  archived: 'Archived',
};

export const RADIOGRAPH_KIND_LABEL: Record<RadiographKind, string> = {
  periapical: 'Periapical',
  bitewing: 'Bitewing',
  panoramic: 'Panoramic',
  'cbct-export': 'CBCT export',
  other: 'Other',
};

export const RADIOGRAPH_PREVIEW_STATUS_LABEL: Record<RadiographPreviewStatus, string> = {
  pending: 'Preview being prepared',
  ready: 'Preview ready',
  unavailable: 'No preview',
};

export const RADIOGRAPH_FILE_TYPE_LABEL: Record<RadiographFileType, string> = {
  png: 'PNG image',
  jpeg: 'JPEG image',
  dicom: 'DICOM file',
};

/** The audit trail (Practice → Audit, and a patient's "Who accessed this record"). */
export const AUDIT_ACTION_LABEL: Record<AuditAction, string> = {
  read: 'Opened',
  create: 'Added',
  amend: 'Amended',
  archive: 'Archived',
  export: 'Downloaded',
  print: 'Printed',
  'sign-in': 'Signed in',
  'sign-in-failed': 'Sign-in refused',
  'sign-out': 'Signed out',
  invite: 'Invited a user',
  'role-change': 'Changed a role',
  'share-change': 'Changed a share',
  'catalogue-change': 'Changed the catalogue',
  'policy-change': 'Changed a setting',
};

export const AUDIT_OUTCOME_LABEL: Record<AuditOutcome, string> = {
  allowed: 'Done',
  refused: 'Refused',
  failed: 'Failed',
};

export const LOT_LOOKUP_KIND_LABEL: Record<LotLookupKind, string> = {
  lot: 'Lot number',
  gtin: 'GTIN',
  part: 'Catalogue reference',
  udi: 'Pasted UDI',
};

/** What to type for each kind of look-up (the hint under the field). */
export const LOT_LOOKUP_KIND_HELP: Record<LotLookupKind, string> = {
  lot: 'The lot (batch) number printed on the notice, exactly as on the label',
  gtin: 'The 8 to 14 digits of the GTIN',
  part: "The catalogue reference of a part, as in this practice's catalogue",
  udi: 'Scan or paste the whole UDI from the label, e.g. (01)…(10)…',
};

export const LOT_ITEM_KIND_LABEL: Record<LotItemKind, string> = {
  implant: 'Implant',
  part: 'Part',
};

export const OUTCOME_GROUPING_LABEL: Record<OutcomeGrouping, string> = {
  system: 'Implant system',
  retention: 'Restoration retention',
};

export const IMPLANT_OUTCOME_LABEL: Record<ImplantOutcome, string> = {
  'in-function': 'In function',
  failed: 'Failed',
  removed: 'Removed',
};

export const SHARE_SCOPE_LABEL: Record<ShareScope, string> = {
  placement: 'Placement',
  outcomes: 'Outcomes',
};

/** What each scope lets the surgeon do, beside its checkbox. */
export const SHARE_SCOPE_HINT: Record<ShareScope, string> = {
  placement: 'Record and amend the placement of the shared sites, and file their radiographs',
  outcomes: 'Read the shared sites’ restorations, recall findings, bone levels and radiographs',
};

export const SHARE_STATUS_LABEL: Record<ShareStatus, string> = {
  invited: 'Invited',
  active: 'Active',
  ended: 'Ended',
  revoked: 'Revoked',
};

export const IMPORT_EVENT_LABEL: Record<ImportEvent, string> = {
  placement: 'Placements',
  delivery: 'Deliveries',
  part: 'Parts installed',
  torque: 'Torque entries',
  exam: 'Recall exams',
};

export const IMPORT_ISSUE_LEVEL_LABEL: Record<ImportIssueLevel, string> = {
  error: 'Error',
  warning: 'Warning',
};

export const IMPORT_PHASE_LABEL: Record<ImportProgress['phase'], string> = {
  reading: 'Reading the file',
  checking: 'Checking rows',
  writing: 'Writing records',
  done: 'Done',
  failed: 'Stopped',
};

/** The practice's date orders, as the administrator chooses one (the example is added beside). */
export const DATE_FORMAT_LABEL: Record<DateFormat, string> = {
  'day-month-year': 'Day, month, year',
  'month-day-year': 'Month, day, year',
  'year-month-day': 'Year, month, day (ISO 8601)',
};
