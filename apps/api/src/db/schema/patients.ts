import {
  boolean,
  check,
  date,
  index,
  integer,
  jsonb,
  pgTable,
  smallint,
  text,
  timestamp,
  unique,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';
import { sql } from 'drizzle-orm';
import {
  patientSexEnum,
  patientVersionKindEnum,
  preferredLanguageEnum,
  reminderStatusEnum,
  shareNoticeKindEnum,
  shareScopeEnum,
} from './enums.js';
import { invitations } from './people.js';
import { practices, users } from './practices.js';

export const patients = pgTable(
  'patients',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    chartNumber: text('chart_number').notNull(),
    /** Set when the generated chart number was changed by hand: it may be changed once. */
    chartNumberChangedAt: timestamp('chart_number_changed_at', { withTimezone: true }),
    givenName: text('given_name').notNull(),
    familyName: text('family_name').notNull(),
    birthDate: date('birth_date', { mode: 'string' }).notNull(),
    sex: patientSexEnum('sex').notNull().default('not-recorded'),
    email: text('email'),
    phone: text('phone'),
    preferredLanguage: preferredLanguageEnum('preferred_language').notNull().default('en'),
    /** Recall reminders are e-mailed only with this consent; the date it was given. */
    emailReminderConsent: boolean('email_reminder_consent').notNull().default(false),
    emailReminderConsentOn: date('email_reminder_consent_on', { mode: 'string' }),
    // The recall rules read these three (RECALL_RISK_FACTORS in the domain); their meaning is unchanged.
    smoker: boolean('smoker').notNull().default(false),
    diabetesPoorlyControlled: boolean('diabetes_poorly_controlled').notNull().default(false),
    periodontitisHistory: boolean('periodontitis_history').notNull().default(false),
    riskFactorsRecordedOn: date('risk_factors_recorded_on', { mode: 'string' }),
    /** FDI positions of teeth that are missing and are not implant sites. */
    missingTeeth: smallint('missing_teeth').array().notNull().default([]),
    /** A patient is archived, never deleted: off the lists by default, and no reminders. */
    archivedAt: timestamp('archived_at', { withTimezone: true }),
    archivedBy: uuid('archived_by').references(() => users.id),
    archiveReason: text('archive_reason'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique('patients_practice_chart_unique').on(t.practiceId, t.chartNumber),
    index('patients_practice_family_idx').on(t.practiceId, t.familyName),
    // The duplicate check looks patients up by birth date within the practice.
    index('patients_practice_birth_idx').on(t.practiceId, t.birthDate),
    // Searches by any part of a name or chart number (`ilike '%word%'`, the patient list and the
    // Recall desk): trigram indexes (pg_trgm, created by the migration), one per column, which
    // PostgreSQL combines for the `or` of the three, so a search reads the matching patients only.
    index('patients_given_name_trgm_idx').using('gin', t.givenName.op('gin_trgm_ops')),
    index('patients_family_name_trgm_idx').using('gin', t.familyName.op('gin_trgm_ops')),
    index('patients_chart_number_trgm_idx').using('gin', t.chartNumber.op('gin_trgm_ops')),
  ],
);

/** One field's change in a patient version: the value before and after, as stored. */
export interface PatientFieldChange {
  field: string;
  before: unknown;
  after: unknown;
}

/**
 * Every change of a patient's record, in order: who, when and what changed. The record is only
 * ever written together with its version (patients.repository.ts), archiving included.
 */
export const patientVersions = pgTable(
  'patient_versions',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    patientId: uuid('patient_id')
      .notNull()
      .references(() => patients.id),
    /** 1 for the creation, then one more per change. */
    version: integer('version').notNull(),
    kind: patientVersionKindEnum('kind').notNull(),
    changes: jsonb('changes').$type<PatientFieldChange[]>().notNull(),
    reason: text('reason'),
    changedBy: uuid('changed_by')
      .notNull()
      .references(() => users.id),
    changedAt: timestamp('changed_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique('patient_versions_patient_version_unique').on(t.patientId, t.version)],
);

/**
 * The practice's chart-number prefix (set by the practice admin) and the next number to hand
 * out. Taking a number is one `insert … on conflict do update … returning` on this row, so two
 * patients created at the same moment wait for each other and never get the same number.
 */
export const chartNumberSequences = pgTable('chart_number_sequences', {
  practiceId: uuid('practice_id')
    .primaryKey()
    .references(() => practices.id),
  prefix: text('prefix').notNull(),
  nextNumber: integer('next_number').notNull(),
  updatedBy: uuid('updated_by').references(() => users.id),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/**
 * A patient of one practice opened to a referring surgeon of another: what it opens (`scopes`),
 * which implant sites (`site_ids`; null: all of them, also those added later), until when
 * (`ends_on`, inclusive; null: until revoked) and why. Revoked, never deleted.
 */
export const patientShares = pgTable(
  'patient_shares',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    patientId: uuid('patient_id')
      .notNull()
      .references(() => patients.id),
    /** The surgeon; null while the share waits for an invited surgeon to sign up (`invitationId`). */
    sharedWithUserId: uuid('shared_with_user_id').references(() => users.id),
    /** The invitation of a surgeon new to Torquetrail: the share opens when they accept it. */
    invitationId: uuid('invitation_id').references(() => invitations.id),
    sharedByUserId: uuid('shared_by_user_id')
      .notNull()
      .references(() => users.id),
    scopes: shareScopeEnum('scopes')
      .array()
      .notNull()
      .default(sql`'{placement,outcomes}'::share_scope[]`),
    siteIds: uuid('site_ids').array(),
    endsOn: date('ends_on', { mode: 'string' }),
    reason: text('reason').notNull().default(''),
    since: timestamp('since', { withTimezone: true }).notNull().defaultNow(),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
    revokedBy: uuid('revoked_by').references(() => users.id),
    revokeReason: text('revoke_reason'),
  },
  (t) => [
    index('patient_shares_user_idx').on(t.sharedWithUserId),
    index('patient_shares_patient_idx').on(t.patientId),
    index('patient_shares_invitation_idx')
      .on(t.invitationId)
      .where(sql`${t.invitationId} is not null`),
    check('patient_shares_has_surgeon', sql`${t.sharedWithUserId} is not null or ${t.invitationId} is not null`),
  ],
);

/**
 * The e-mail telling the surgeon of a share or its revocation: a row written with the change (in its
 * transaction), sent by the job queue, retried while SMTP is away and sent once (one per share and kind).
 */
export const shareNotices = pgTable(
  'share_notices',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    shareId: uuid('share_id')
      .notNull()
      .references(() => patientShares.id),
    kind: shareNoticeKindEnum('kind').notNull(),
    status: reminderStatusEnum('status').notNull().default('pending'),
    attempts: integer('attempts').notNull().default(0),
    lastError: text('last_error'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    sentAt: timestamp('sent_at', { withTimezone: true }),
  },
  (t) => [
    uniqueIndex('share_notices_one_per_kind').on(t.shareId, t.kind),
    index('share_notices_pending_idx')
      .on(t.status)
      .where(sql`${t.status} = 'pending'`),
  ],
);
