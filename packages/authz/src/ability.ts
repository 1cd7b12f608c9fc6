import { AbilityBuilder, createMongoAbility, type MongoAbility } from '@casl/ability';

/** The roles of Torquetrail, in the order of the database enum. */
export const ROLES = ['practice_admin', 'dentist', 'hygienist', 'surgeon'] as const;
export type Role = (typeof ROLES)[number];

export type Action = 'manage' | 'read' | 'create' | 'update' | 'amend' | 'archive';

/**
 * The fields of a patient's record that are contact details: the hygienist may update these and
 * no other (CASL field rules; the patients service names any other field it is sent).
 */
export const PATIENT_CONTACT_FIELDS = [
  'email',
  'phone',
  'preferredLanguage',
  'emailReminderConsent',
  'emailReminderConsentOn',
] as const;
export type PatientContactField = (typeof PATIENT_CONTACT_FIELDS)[number];

/**
 * Subjects of the ledger. Each row carries `practiceId`; rows that belong to a patient also
 * carry `patientId`, which is how a share opens another practice's patient to a surgeon.
 */
export type Subject =
  | 'Practice'
  | 'User'
  | 'Patient'
  | 'PatientVersion'
  | 'ImplantSite'
  | 'Placement'
  | 'Catalogue'
  | 'Wrench'
  | 'Restoration'
  | 'ComponentInstance'
  | 'TorqueEvent'
  | 'Complication'
  | 'RecallExam'
  | 'RecallPolicy'
  | 'Radiograph'
  | 'Share'
  | 'AuditEntry'
  /** One patient's audit rows ("who accessed this record"): the dentist's and the admin's. */
  | 'PatientAudit'
  /** A legacy CSV import of the practice (its dry run, progress and writing). */
  | 'LegacyImport'
  | 'all';

/** A loaded row checked with `subject(type, row)`; only these fields take part in conditions. */
export interface ScopedRow {
  id?: string;
  practiceId?: string;
  patientId?: string;
}

export type AppAbility = MongoAbility<[Action, Subject | (ScopedRow & { __caslSubjectType__?: string })]>;

/** What the ability needs to know about the signed-in user. */
export interface AbilityUser {
  id: string;
  role: Role;
  practiceId: string;
  /** Patients of other practices shared with this user (surgeons). */
  sharedPatientIds: readonly string[];
}

/** Clinical record subjects that hang off a patient. */
const PATIENT_RECORD: Subject[] = [
  'ImplantSite',
  'Placement',
  'Restoration',
  'ComponentInstance',
  'TorqueEvent',
  'Complication',
  'RecallExam',
  'Radiograph',
];

/**
 * The role table of the product brief, as CASL rules. `manage` is never granted on 'all':
 * every permission names its subject, and every condition pins the practice (or the share).
 */
export function defineAbilityFor(user: AbilityUser): AppAbility {
  const { can, build } = new AbilityBuilder<AppAbility>(createMongoAbility);
  const own = { practiceId: user.practiceId };

  switch (user.role) {
    case 'dentist':
      can('read', 'Practice', { id: user.practiceId });
      can(['read', 'create', 'update', 'archive'], 'Patient', own);
      can('read', 'PatientVersion', own);
      can(
        ['read', 'create', 'amend'],
        ['ImplantSite', 'Restoration', 'ComponentInstance', 'TorqueEvent', 'Complication'],
        own,
      );
      can(['read', 'create', 'amend'], 'Placement', own);
      can('read', ['RecallExam', 'Catalogue', 'Wrench', 'RecallPolicy'], own);
      can(['read', 'create', 'amend'], 'Radiograph', own);
      can(['read', 'create', 'update'], 'Share', own);
      can('read', 'PatientAudit', own);
      can(['read', 'create'], 'LegacyImport', own);
      break;
    case 'hygienist':
      can('read', 'Practice', { id: user.practiceId });
      can('read', 'Patient', own);
      can('update', 'Patient', [...PATIENT_CONTACT_FIELDS], own);
      can('read', ['ImplantSite', 'Placement', 'Restoration', 'ComponentInstance', 'TorqueEvent', 'Complication'], own);
      can(['read', 'create', 'amend'], ['RecallExam', 'Radiograph'], own);
      can('read', ['Catalogue', 'Wrench', 'RecallPolicy'], own);
      break;
    case 'surgeon': {
      can('read', 'Practice', { id: user.practiceId });
      // Own practice: a surgeon keeps the records of their own surgical practice.
      can('read', 'Patient', own);
      can('read', PATIENT_RECORD, own);
      can(['create', 'amend'], ['ImplantSite', 'Placement', 'Radiograph'], own);
      can('read', 'Catalogue', own);
      // Another practice's patient only through a share, and never the rest of the chart.
      const shared = [...user.sharedPatientIds];
      if (shared.length > 0) {
        can('read', 'Patient', { id: { $in: shared } });
        can('read', PATIENT_RECORD, { patientId: { $in: shared } });
        can(['create', 'amend'], ['Placement', 'Radiograph'], { patientId: { $in: shared } });
      }
      break;
    }
    case 'practice_admin':
      can(['read', 'update'], 'Practice', { id: user.practiceId });
      can(['read', 'create', 'update'], 'User', own);
      can(['read', 'create', 'update', 'archive'], 'Patient', own);
      can('read', 'PatientVersion', own);
      can('read', PATIENT_RECORD, own);
      can(['read', 'create', 'update'], ['Catalogue', 'Wrench', 'RecallPolicy'], own);
      can('read', ['AuditEntry', 'PatientAudit', 'Share'], own);
      // A practice bringing its history in: the administrator runs it (docs/import.md).
      can(['read', 'create'], 'LegacyImport', own);
      break;
  }
  return build();
}
