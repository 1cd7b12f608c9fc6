// Labels of the non-clinical enums (roles, statuses, the Recall desk, the Timeline); clinical ones
// are in clinical-labels.ts. labels.test.ts checks that every enum has one label per value.
import type { Role } from '@torquetrail/authz';
import {
  type ArchiveFilter,
  type AuditAction,
  type AuditOutcome,
  DESK_DUE_SOON_DAYS,
  type DeskFilter,
  type DeskSort,
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
  type SiteStatus,
  type TimelineKind,
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
};

export const DESK_FILTER_LABEL: Record<DeskFilter, string> = {
  all: 'All patients with implants',
  'due-this-week': `Due in the next ${DESK_DUE_SOON_DAYS} days`,
  overdue: 'Overdue',
  'peri-implantitis-last': 'Peri-implantitis last time',
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

/**
 * What each field of the API's requests is called on the forms, by its name in the contracts: the
 * one mapping that turns a 400's machine paths (`parts.0.lot`) into words (see lib/forms/field-labels).
 * A test fails when a contract gains a field without a label here.
 */
export const FIELD_LABELS: Record<string, string> = {
  abutmentComponentId: 'Abutment',
  acknowledgements: 'Acknowledged warnings',
  action: 'Action',
  amendmentReason: 'Reason for the amendment',
  angleDeg: 'Angle (\u00b0)',
  apex: 'Apex point',
  appliedNcm: 'Applied torque (Ncm)',
  archived: 'Archived',
  axis: 'Implant axis',
  baseMonths: 'Usual recall interval (months)',
  before: 'Before',
  birthDate: 'Date of birth',
  bleeding: 'Bleeding on probing',
  bleedingIndex: 'Bleeding index',
  boneLevelMeasurementId: 'Measured bone level',
  boneLevelMm: 'Bone level (mm)',
  calibratedOn: 'Calibration date',
  chartNumber: 'Chart number',
  chartPrefix: 'Chart number prefix',
  closureComponentId: 'Closure part',
  closureLot: 'Lot of the closure part',
  code: 'Code',
  col: 'Column',
  collarHeightMm: 'Collar height (mm)',
  componentId: 'Part',
  componentInstanceId: 'Installed part',
  connection: 'Connection',
  copingsSplinted: 'Copings splinted',
  currentPassword: 'Current password',
  deliveredOn: 'Delivery date',
  diabetesPoorlyControlled: 'Poorly controlled diabetes',
  diameterMm: 'Diameter (mm)',
  dir: 'Order',
  displayName: 'Name shown',
  distal: 'Distal',
  dueOn: 'Due date',
  email: 'E-mail',
  emailReminderConsent: 'Consent to e-mail reminders',
  emailReminderConsentOn: 'Consent date',
  emailToLab: 'E-mail to the lab',
  engaging: 'Engaging',
  event: 'Event',
  examinedOn: 'Exam date',
  exams: 'Exams',
  excludeId: 'Record to leave out',
  familyName: 'Family name',
  fdi: 'Site (FDI)',
  fileName: 'File name',
  filter: 'Filter',
  from: 'From',
  givenName: 'Given name',
  grafting: 'Grafting',
  idleSignOutMinutes: 'Sign out after inactivity (minutes)',
  implantTrueMm: 'True implant length (mm)',
  impressionCoping: 'Impression coping',
  impressionCopingComponentId: 'Impression coping part',
  impressionTakenOn: 'Impression date',
  includeEnteredInError: 'Include entries made in error',
  insertionTorqueNcm: 'Insertion torque (Ncm)',
  interface: 'Interface',
  isBaseline: 'Baseline exam',
  keratinizedMucosaMm: 'Keratinized mucosa (mm)',
  kind: 'Kind',
  kinds: 'Kinds',
  labEmail: 'Lab e-mail',
  labName: 'Lab',
  label: 'Label',
  lastCalibratedOn: 'Last calibration date',
  lengthMm: 'Length (mm)',
  loadingProtocol: 'Loading protocol',
  lot: 'Lot',
  manufacturer: 'Manufacturer',
  material: 'Material',
  mesial: 'Mesial',
  mobility: 'Mobility',
  multiUnitAngleDeg: 'Multi-unit abutment angle',
  multiUnitComponentId: 'Multi-unit abutment',
  name: 'Name',
  newPassword: 'New password',
  note: 'Note',
  notes: 'Notes',
  occurredOn: 'Date',
  overdueReminderDaysAfter: 'Overdue reminder (days after)',
  page: 'Page',
  pageSize: 'Rows per page',
  parts: 'Parts',
  password: 'Password',
  patientId: 'Patient',
  performedAt: 'Time',
  periodontitisHistory: 'History of periodontitis',
  phone: 'Phone',
  placedOn: 'Placement date',
  plaqueIndex: 'Plaque index',
  platform: 'Platform',
  platformId: 'Platform',
  platformShift: 'Platform shift',
  points: 'Marked points',
  position: 'Position',
  preferredLanguage: 'Preferred language',
  probingDepthMm: 'Probing depth (mm)',
  radiographId: 'Radiograph',
  reason: 'Reason',
  referenceCode: 'Reference code',
  reminderDaysBefore: 'Reminder (days before)',
  replacementLot: 'Lot of the new part',
  requiresLot: 'Lot required',
  residualCement: 'Residual cement',
  restorativeSpaceMm: 'Restorative space (mm)',
  retention: 'Retention',
  revise: 'Revise',
  riskFactorsRecordedOn: 'Risk factors recorded on',
  riskMonths: 'Recall interval with risk factors (months)',
  role: 'Role',
  row: 'Row',
  screwComponentIds: 'Screws',
  search: 'Search',
  seated: 'Seated',
  sex: 'Sex',
  shade: 'Shade',
  siteId: 'Site',
  siteIds: 'Sites',
  sites: 'Sites',
  smoker: 'Smoker',
  sort: 'Sort',
  stabilityIsq: 'Stability (ISQ)',
  suppuration: 'Suppuration',
  systemId: 'Implant system',
  takenOn: 'Date taken',
  to: 'To',
  today: 'Today',
  token: 'Link',
  tolerancePct: 'Tolerance (%)',
  torqueSpecNcm: 'Specified torque (Ncm)',
  tray: 'Tray',
  type: 'Type',
  udi: 'UDI',
  userId: 'User',
  wrenchId: 'Wrench',
  x: 'x',
  y: 'y',
  z: 'z',
};

/** What one item of a list field is called, for "Lot, part 2". */
export const FIELD_ITEM_NOUNS: Record<string, string> = {
  acknowledgements: 'warning',
  exams: 'exam',
  kinds: 'kind',
  parts: 'part',
  points: 'point',
  screwComponentIds: 'screw',
  siteIds: 'site',
  sites: 'site',
};
