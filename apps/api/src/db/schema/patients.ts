import { boolean, date, index, pgTable, smallint, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';
import { practices, users } from './practices.js';

export const patients = pgTable(
  'patients',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    practiceId: uuid('practice_id')
      .notNull()
      .references(() => practices.id),
    chartNumber: text('chart_number').notNull(),
    givenName: text('given_name').notNull(),
    familyName: text('family_name').notNull(),
    birthDate: date('birth_date', { mode: 'string' }).notNull(),
    email: text('email'),
    smoker: boolean('smoker').notNull().default(false),
    diabetesPoorlyControlled: boolean('diabetes_poorly_controlled').notNull().default(false),
    periodontitisHistory: boolean('periodontitis_history').notNull().default(false),
    /** FDI positions of teeth that are missing and are not implant sites. */
    missingTeeth: smallint('missing_teeth').array().notNull().default([]),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique('patients_practice_chart_unique').on(t.practiceId, t.chartNumber),
    index('patients_practice_family_idx').on(t.practiceId, t.familyName),
  ],
);

/** A patient of one practice opened to a user (a referring surgeon) of another. */
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
    sharedWithUserId: uuid('shared_with_user_id')
      .notNull()
      .references(() => users.id),
    sharedByUserId: uuid('shared_by_user_id')
      .notNull()
      .references(() => users.id),
    scope: text('scope').notNull().default('implant-record'),
    since: timestamp('since', { withTimezone: true }).notNull().defaultNow(),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
  },
  (t) => [index('patient_shares_user_idx').on(t.sharedWithUserId), index('patient_shares_patient_idx').on(t.patientId)],
);
