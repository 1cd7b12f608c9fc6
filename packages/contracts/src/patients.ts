import { PATIENT_CONTACT_FIELDS } from '@torquetrail/authz';
import { z } from 'zod';
import type { RouteContract } from './route-contract.js';
import { FdiPosition, Id, IsoDate, IsoDateTime, NoteText, PlainText } from './common.js';
import {
  ArchiveFilter,
  MaintenanceStatus,
  PatientSex,
  PatientVersionKind,
  PreferredLanguage,
  ShareScope,
  SiteStatus,
} from './enums.js';

export { PATIENT_CONTACT_FIELDS };

export const PatientListQuery = z.object({
  search: PlainText(100).optional(),
  /** Archived patients are left out unless asked for. */
  archived: ArchiveFilter.default('active'),
});
export type PatientListQuery = z.infer<typeof PatientListQuery>;

export const PatientListItem = z.object({
  id: Id,
  chartNumber: z.string(),
  givenName: z.string(),
  familyName: z.string(),
  birthDate: IsoDate,
  implantSiteCount: z.number().int(),
  practiceName: z.string(),
  /** For a patient of another practice shared with the user: what the share opens. */
  shareScopes: z.array(ShareScope).nullable(),
  /** When the patient was archived; null for an active patient. */
  archivedAt: IsoDateTime.nullable(),
});
export type PatientListItem = z.infer<typeof PatientListItem>;
export const PatientListReply = z.object({ items: z.array(PatientListItem) });
export type PatientListReply = z.infer<typeof PatientListReply>;

/** One implant site as drawn on the Arch. */
export const ArchSite = z.object({
  id: Id,
  fdi: FdiPosition,
  status: SiteStatus,
  maintenanceStatus: MaintenanceStatus,
  lastExamDate: IsoDate.nullable(),
  systemName: z.string().nullable(),
  /** Parts in place whose seating torque is missing (see StackPart); absent where the role may not read torque. */
  partsMissingSeatingTorque: z.number().int().optional(),
});
export type ArchSite = z.infer<typeof ArchSite>;

// ---- the patient's record, as the forms edit it -------------------------------------------------
const name = (what: string) => PlainText(100).min(1, { error: `Enter the ${what}` });
export const Email = z.email({ error: 'Enter a valid e-mail address, e.g. name@example.com' }).max(254);
export const Phone = PlainText(30).regex(/^\+?[0-9][0-9 ()./-]{3,28}[0-9]$/, {
  error: 'Enter a phone number: digits, spaces and + ( ) - . / only',
});
/** A chart number as typed: letters, digits and . / - (no spaces), at most 20 characters. */
export const ChartNumber = PlainText(20)
  .min(1, { error: 'Enter a chart number' })
  .regex(/^[A-Za-z0-9][A-Za-z0-9./-]*$/, { error: 'Use letters, digits and . / - only (no spaces)' });

/** Every field of a patient's record a form sends; optional ones are null when not known. */
const patientFields = {
  givenName: name('given name'),
  familyName: name('family name'),
  birthDate: IsoDate,
  sex: PatientSex,
  email: Email.nullable(),
  phone: Phone.nullable(),
  preferredLanguage: PreferredLanguage,
  emailReminderConsent: z.boolean(),
  /** The day the patient agreed to e-mail reminders; required with the consent. */
  emailReminderConsentOn: IsoDate.nullable(),
  smoker: z.boolean(),
  diabetesPoorlyControlled: z.boolean(),
  periodontitisHistory: z.boolean(),
  /** The day the risk factors were last asked about. */
  riskFactorsRecordedOn: IsoDate.nullable(),
};
export type PatientFieldName = keyof typeof patientFields | 'chartNumber';

/** The fields of a patient's record that versions compare, in the order the history lists them. */
export const PATIENT_RECORD_FIELDS = [
  'chartNumber',
  'givenName',
  'familyName',
  'birthDate',
  'sex',
  'email',
  'phone',
  'preferredLanguage',
  'emailReminderConsent',
  'emailReminderConsentOn',
  'smoker',
  'diabetesPoorlyControlled',
  'periodontitisHistory',
  'riskFactorsRecordedOn',
] as const satisfies readonly PatientFieldName[];
/** A version's change names one of these; 'archived' is the archive switch. */
export type PatientVersionField = (typeof PATIENT_RECORD_FIELDS)[number] | 'archived';

/** The fields of a record that depend on each other, for the checks below. */
interface ConsentState {
  email: string | null;
  emailReminderConsent: boolean;
  emailReminderConsentOn: string | null;
}

/**
 * The rules across fields, on a whole record (a new one, or an edited one merged with what is
 * stored): field path → message. Used by the create contract and by the API on an edit.
 */
export function patientRecordProblems(record: ConsentState): Partial<Record<PatientFieldName, string>> {
  const problems: Partial<Record<PatientFieldName, string>> = {};
  if (record.emailReminderConsent && !record.email)
    problems.email = 'E-mail reminders need an e-mail address: enter one, or record no consent';
  if (record.emailReminderConsent && !record.emailReminderConsentOn)
    problems.emailReminderConsentOn = 'Enter the date the patient gave consent';
  if (!record.emailReminderConsent && record.emailReminderConsentOn)
    problems.emailReminderConsentOn = 'Leave the date empty when there is no consent';
  return problems;
}

export const CreatePatientBody = z
  .object({
    ...patientFields,
    sex: PatientSex.default('not-recorded'),
    email: Email.nullable().default(null),
    phone: Phone.nullable().default(null),
    preferredLanguage: PreferredLanguage.default('en'),
    emailReminderConsent: z.boolean().default(false),
    emailReminderConsentOn: IsoDate.nullable().default(null),
    smoker: z.boolean().default(false),
    diabetesPoorlyControlled: z.boolean().default(false),
    periodontitisHistory: z.boolean().default(false),
    riskFactorsRecordedOn: IsoDate.nullable().default(null),
  })
  .strict()
  .superRefine((body, ctx) => {
    for (const [path, message] of Object.entries(patientRecordProblems(body)))
      ctx.addIssue({ code: 'custom', message, path: [path] });
  });
export type CreatePatientBody = z.input<typeof CreatePatientBody>;
/** The body as the contract parsed it (defaults filled in). */
export type NewPatientRecord = z.output<typeof CreatePatientBody>;

/**
 * An edit sends the fields it changes (a form may send all of them: unchanged values make no
 * change). The hygienist may send only PATIENT_CONTACT_FIELDS; the chart number changes once.
 */
export const UpdatePatientBody = z
  .object({ ...patientFields, chartNumber: ChartNumber })
  .partial()
  .strict()
  .refine((body) => Object.keys(body).length > 0, { error: 'Send at least one field to change' });
export type UpdatePatientBody = z.input<typeof UpdatePatientBody>;

export const ArchivePatientBody = z.object({
  reason: NoteText(500).min(3, { error: 'Say why (at least 3 characters)' }),
});
export type ArchivePatientBody = z.input<typeof ArchivePatientBody>;

/**
 * One patient with the sites for the Arch. A surgeon of another practice reads only the fields a
 * share opens (`SHARED_PATIENT_FIELDS`, CASL field rules applied to the reply): the others are absent.
 */
export const PatientDetail = PatientListItem.omit({ shareScopes: true }).extend({
  /** The patient's practice: row-level checks in the web (e.g. a shared surgeon may not plan sites). */
  practiceId: Id,
  sex: PatientSex.optional(),
  riskFactors: z
    .object({
      smoker: z.boolean(),
      diabetesPoorlyControlled: z.boolean(),
      periodontitisHistory: z.boolean(),
    })
    .optional(),
  riskFactorsRecordedOn: IsoDate.nullable().optional(),
  /** Contact details and consent: for the patient's own practice only. */
  contact: z
    .object({
      email: z.string().nullable(),
      phone: z.string().nullable(),
      preferredLanguage: PreferredLanguage,
      emailReminderConsent: z.boolean(),
      emailReminderConsentOn: IsoDate.nullable(),
    })
    .nullable()
    .optional(),
  /** Whether the chart number may still be changed (once). */
  chartNumberChangeable: z.boolean().optional(),
  archive: z.object({ at: IsoDateTime, byName: z.string(), reason: z.string() }).nullable().optional(),
  /** Teeth recorded as missing (not implant sites), drawn as faint outlines. */
  missingTeeth: z.array(FdiPosition).optional(),
  sites: z.array(ArchSite),
});
export type PatientDetail = z.infer<typeof PatientDetail>;

// ---- duplicates and history ---------------------------------------------------------------------
export const DuplicateCheckQuery = z.object({
  familyName: name('family name'),
  birthDate: IsoDate,
  /** The patient being edited, left out of the matches. */
  excludeId: Id.optional(),
});
export type DuplicateCheckQuery = z.infer<typeof DuplicateCheckQuery>;
export const DuplicateCheckReply = z.object({
  matches: z.array(PatientListItem.omit({ implantSiteCount: true, practiceName: true, shareScopes: true })),
});
export type DuplicateCheckReply = z.infer<typeof DuplicateCheckReply>;

const StoredValue = z.union([z.string(), z.number(), z.boolean(), z.null()]);
export const PatientVersion = z.object({
  version: z.number().int(),
  kind: PatientVersionKind,
  changedAt: IsoDateTime,
  changedByName: z.string(),
  reason: z.string().nullable(),
  changes: z.array(z.object({ field: z.string(), before: StoredValue, after: StoredValue })),
});
export type PatientVersion = z.infer<typeof PatientVersion>;
export const PatientVersionsReply = z.object({ items: z.array(PatientVersion) });
export type PatientVersionsReply = z.infer<typeof PatientVersionsReply>;

// ---- practice setting: chart numbers ------------------------------------------------------------
export const PatientSettingsBody = z.object({
  chartPrefix: PlainText(8)
    .min(1, { error: 'Enter a prefix' })
    .regex(/^[A-Za-z0-9][A-Za-z0-9./-]*$/, { error: 'Use letters, digits and . / - only (no spaces)' }),
});
export type PatientSettingsBody = z.input<typeof PatientSettingsBody>;
export const PatientSettingsReply = z.object({
  chartPrefix: z.string(),
  /** The chart number the next new patient will get. */
  nextChartNumber: z.string(),
});
export type PatientSettingsReply = z.infer<typeof PatientSettingsReply>;

/** The routes of patient records (the list and the detail are in routes.ts). */
export const patientRoutes: RouteContract[] = [
  {
    method: 'post',
    path: '/patients',
    summary: 'A new patient of the practice, with a generated chart number (dentist, practice admin)',
    signedIn: true,
    body: CreatePatientBody,
    reply: PatientDetail,
  },
  {
    method: 'patch',
    path: '/patients/:id',
    summary:
      "Change a patient's record; every change is kept as a version (dentist, practice admin; the hygienist contact details only)",
    signedIn: true,
    body: UpdatePatientBody,
    reply: PatientDetail,
  },
  {
    method: 'post',
    path: '/patients/:id/archive',
    summary: 'Archive a patient with a reason: off the lists by default, reminders stop; never deleted',
    signedIn: true,
    status: 200,
    body: ArchivePatientBody,
    reply: PatientDetail,
  },
  {
    method: 'post',
    path: '/patients/:id/unarchive',
    summary: 'Bring an archived patient back, with a reason',
    signedIn: true,
    status: 200,
    body: ArchivePatientBody,
    reply: PatientDetail,
  },
  {
    method: 'get',
    path: '/patients/:id/versions',
    summary: "Every version of a patient's record: who, when and what changed (dentist, practice admin)",
    signedIn: true,
    reply: PatientVersionsReply,
  },
  {
    method: 'get',
    path: '/patients/duplicates',
    summary: 'Patients of the practice with the same family name (case and accents aside) and birth date',
    signedIn: true,
    query: DuplicateCheckQuery,
    reply: DuplicateCheckReply,
  },
  {
    method: 'get',
    path: '/practice/patient-settings',
    summary: "The practice's chart-number prefix and the next chart number",
    signedIn: true,
    reply: PatientSettingsReply,
  },
  {
    method: 'put',
    path: '/practice/patient-settings',
    summary: "Set the practice's chart-number prefix (practice admin); existing chart numbers stay",
    signedIn: true,
    body: PatientSettingsBody,
    reply: PatientSettingsReply,
  },
];
