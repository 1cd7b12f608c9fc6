import { AbilityBuilder, createMongoAbility, type MongoAbility, type MongoQuery } from '@casl/ability';
import {
  SHARED_DETAIL_FIELDS,
  SHARED_READ_FIELDS,
  SHARED_SIGNER_FIELDS,
  type SharedSubject,
  TIMELINE_COMPUTED_DETAIL_KINDS,
} from './shared-fields.js';

/** The roles of Torquetrail, in the order of the database enum. */
export const ROLES = ['practice_admin', 'dentist', 'hygienist', 'surgeon'] as const;
export type Role = (typeof ROLES)[number];

/**
 * What a share opens to a surgeon of another practice: `placement` records and amends the placement
 * of the shared sites; `outcomes` reads their restorations, recalls, bone levels and radiographs.
 */
export const SHARE_SCOPES = ['placement', 'outcomes'] as const;
export type ShareScope = (typeof SHARE_SCOPES)[number];

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
  /**
   * A restoration's impression and its scan files (the patient's intraoral scans): the practice's
   * own team only; no share opens them to a surgeon.
   */
  | 'Impression'
  /**
   * A retentive-insert change of an overdenture (maintenance): recorded by the dentist, and by the
   * hygienist at recall; the practice's own follow-up, which no share opens to a surgeon.
   */
  | 'InsertChange'
  | 'Share'
  | 'AuditEntry'
  /** One patient's audit rows ("who accessed this record"): the dentist's and the admin's. */
  | 'PatientAudit'
  /** The lot look-up across the practice's patients (a field safety notice): dentist and admin. */
  | 'LotTrace'
  /** How the implants do (a practice audit): the practice's, or the surgeon's shared patients. */
  | 'Outcomes'
  /** A patient's referral summary for the surgeon of a share: drawn, downloaded, e-mailed. */
  | 'ReferralSummary'
  /** One patient's record exported as FHIR R4: the dentist's and the admin's. */
  | 'PatientExport'
  /** One patient's implant passport and retrieval card (print, e-mail to the patient): the dentist's. */
  | 'ImplantPassport'
  /** A legacy CSV import of the practice (its dry run, progress and writing). */
  | 'LegacyImport'
  | 'all';

/** A loaded row checked with `subject(type, row)`; only these fields take part in conditions. */
export interface ScopedRow {
  id?: string;
  practiceId?: string;
  patientId?: string;
  /** The implant site a row belongs to: how a share limited to chosen sites opens only those. */
  siteId?: string | null;
  /** A Timeline entry's kind: some of its fields are opened to a share for some kinds only. */
  kind?: string;
}

export type AppAbility = MongoAbility<[Action, Subject | (ScopedRow & { __caslSubjectType__?: string })]>;

/** What the ability needs to know about the signed-in user. */
export interface AbilityUser {
  id: string;
  role: Role;
  practiceId: string;
  /** Patients of other practices shared with this user (surgeons). */
  sharedPatientIds: readonly string[];
  /**
   * The live shares behind `sharedPatientIds` (neither revoked nor ended), with their scope and
   * sites (`siteIds` null: every implant site of the patient).
   */
  shares: readonly ActiveShare[];
}

/** A share as the ability needs it. */
export interface ActiveShare {
  patientId: string;
  scopes: readonly ShareScope[];
  siteIds: readonly string[] | null;
  /** The share's last day (inclusive, a UTC calendar day), or null: nothing dated later is served. */
  endsOn?: string | null;
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
      can(['read', 'create', 'amend'], 'Impression', own);
      can(['read', 'create', 'amend'], 'InsertChange', own);
      // Dentists examine implants at their own reviews too, not only the hygienist at recalls.
      can(['read', 'create', 'amend'], 'RecallExam', own);
      can('read', ['Catalogue', 'Wrench', 'RecallPolicy'], own);
      can(['read', 'create', 'amend'], 'Radiograph', own);
      can(['read', 'create', 'update'], 'Share', own);
      can('read', 'PatientAudit', own);
      can('read', ['LotTrace', 'Outcomes'], own);
      can(['read', 'create'], 'ReferralSummary', own);
      can('read', 'PatientExport', own);
      can(['read', 'create'], 'ImplantPassport', own);
      can(['read', 'create'], 'LegacyImport', own);
      break;
    case 'hygienist':
      can('read', 'Practice', { id: user.practiceId });
      can('read', 'Patient', own);
      can('update', 'Patient', [...PATIENT_CONTACT_FIELDS], own);
      can(
        'read',
        ['ImplantSite', 'Placement', 'Restoration', 'ComponentInstance', 'TorqueEvent', 'Complication', 'Impression'],
        own,
      );
      can(['read', 'create', 'amend'], ['RecallExam', 'Radiograph'], own);
      // Changing a worn insert is maintenance the hygienist does at recall [decision].
      can(['read', 'create', 'amend'], 'InsertChange', own);
      can('read', ['Catalogue', 'Wrench', 'RecallPolicy'], own);
      break;
    case 'surgeon': {
      can('read', 'Practice', { id: user.practiceId });
      // Own practice: a surgeon keeps the records of their own surgical practice.
      can('read', 'Patient', own);
      can('read', [...PATIENT_RECORD, 'InsertChange'], own);
      can(['create', 'amend'], ['ImplantSite', 'Placement', 'Radiograph'], own);
      can('read', 'Catalogue', own);
      can('read', 'Outcomes', own);
      // Another practice's patient only through a share, limited to its scope and its sites.
      for (const share of user.shares) shareRules(can, share);
      break;
    }
    case 'practice_admin':
      can(['read', 'update'], 'Practice', { id: user.practiceId });
      can(['read', 'create', 'update'], 'User', own);
      can(['read', 'create', 'update', 'archive'], 'Patient', own);
      can('read', 'PatientVersion', own);
      can('read', [...PATIENT_RECORD, 'Impression', 'InsertChange'], own);
      can(['read', 'create', 'update'], ['Catalogue', 'Wrench', 'RecallPolicy'], own);
      // A practice bringing its history in: the administrator runs it (docs/import.md).
      can(['read', 'create'], 'LegacyImport', own);
      can('read', ['AuditEntry', 'PatientAudit', 'Share', 'LotTrace', 'Outcomes', 'PatientExport'], own);
      can(['read', 'create'], 'ReferralSummary', own);
      break;
  }
  return build();
}

type Can = AbilityBuilder<AppAbility>['can'];
type ScopedCondition = MongoQuery<ScopedRow>;

/**
 * The rules one share adds: the patient's name and date of birth with either scope; with
 * `placement`, reading, recording and amending the placement of the shared sites and filing their
 * radiographs; with `outcomes`, reading the rest of those sites' record. Never the patient's other
 * sites, nor anything of another patient.
 */
function shareRules(can: Can, share: ActiveShare): void {
  const patientId = share.patientId;
  const sites = share.siteIds ? { $in: [...share.siteIds] } : undefined;
  const onSite: ScopedCondition = sites ? { patientId, siteId: sites } : { patientId };
  const site: ScopedCondition = sites ? { patientId, id: sites } : { patientId };
  // Every read rule names its fields (shared-fields.ts): the replies keep only those.
  const read = (type: SharedSubject, condition: ScopedCondition) =>
    can('read', type, [...SHARED_READ_FIELDS[type]], condition);
  read('Patient', { id: patientId });
  read('ImplantSite', site);
  if (share.scopes.includes('placement')) {
    can(['create', 'amend'], ['Placement', 'Radiograph'], onSite);
    read('Placement', onSite);
    read('Radiograph', onSite);
  }
  if (share.scopes.includes('outcomes')) {
    // The referral summary is the outcome of the shared implants, for the surgeon to read.
    read('ReferralSummary', { patientId });
    read('Outcomes', onSite);
    for (const type of ['Placement', 'Restoration', 'ComponentInstance', 'TorqueEvent', 'Complication'] as const)
      read(type, onSite);
    read('RecallExam', onSite);
    read('Radiograph', onSite);
  }
  // A Timeline entry's computed detail, and the placement's signing clinician, on the site's replies.
  const entry = (kinds: readonly string[]) => ({ ...site, kind: { $in: [...kinds] } }) as ScopedCondition;
  can('read', 'ImplantSite', [...SHARED_DETAIL_FIELDS], entry(TIMELINE_COMPUTED_DETAIL_KINDS));
  can('read', 'ImplantSite', [...SHARED_SIGNER_FIELDS], entry(['placement']));
}
